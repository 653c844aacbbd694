// Files the browser test uploads, written by the test itself: the demo flight in feet,
// a flight with the velocity's direction (as components, and as a path with the axis),
// a coarsely sampled flight with a corner,
// a long synthetic flight, bytes that are no text at all, and a file above the page's
// upload limit. Invented data throughout.

/** The international foot, m (exact by definition; common practice, no source). */
const FOOT_M = 0.3048;

/** Rows [time s, altitude m, velocity m/s] of a flight CSV in SI (its lines starting with a digit). */
export function rowsOf(csv) {
  return csv
    .split("\n")
    .filter((l) => /^[\d.]/.test(l))
    .map((l) => l.split(",").map(Number));
}

/** The same flight with its altitudes and velocities in feet, under a header that says so. */
export function inFeet(rows) {
  const lines = rows.map(([t, z, v]) => `${t},${z / FOOT_M},${v / FOOT_M}`);
  return ["time (s),altitude (ft),velocity (ft/s)", ...lines, ""].join("\n");
}

/**
 * A synthetic flight of `n` samples a millisecond apart, up to 150 km and back over
 * T = n ms: altitude 150 km sin^2(pi t / T) and its rate of change as the velocity (the
 * scan ignores the sign), written in whole metres and m/s so that a million samples stay
 * below the page's 20 MB limit. Above 86 km Mach is not defined: a gap in the Mach line.
 */
export function longFlight(n) {
  const span = n / 1000;
  const top = 150_000;
  const lines = ["time_s,altitude_m,velocity_m_s"];
  for (let i = 0; i < n; i++) {
    const t = i / 1000;
    const z = top * Math.sin((Math.PI * t) / span) ** 2;
    const v = ((top * Math.PI) / span) * Math.sin((2 * Math.PI * t) / span);
    lines.push(`${t},${Math.round(z)},${Math.round(v)}`);
  }
  lines.push("");
  return lines.join("\n");
}

/** `n` bytes from a fixed xorshift32 sequence: the same "random" file on every run. */
export function noise(n, seed = 0x2545f491) {
  const bytes = Buffer.alloc(n);
  let x = seed >>> 0;
  for (let i = 0; i < n; i++) {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    bytes[i] = x & 0xff;
  }
  return bytes;
}

/** A file of `bytes` bytes of valid-looking rows (its size is what matters). */
export function oversized(bytes) {
  return Buffer.alloc(bytes, "0,0,0\n");
}

/**
 * An invented boost and coast with the velocity's direction: a climb tilted 5 degrees
 * from the vertical toward the east, 60 m/s^2 for 8 s then slowing by 12 m/s^2, sampled
 * every 0.05 s for 40 s, written as ground-velocity components (east, north, up) with the
 * altitude their trapezoidal integral. A wind from the north (typed on the page) crosses
 * it at right angles: the source of its q-alpha.
 */
export function vectorFlight() {
  const dt = 0.05;
  const elevation = (85 * Math.PI) / 180;
  const lines = ["time (s),altitude (m),velocity_east (m/s),velocity_north (m/s),velocity_up (m/s)"];
  let z = 0;
  let previousUp = 0;
  for (let i = 0; i <= 800; i++) {
    const t = i * dt;
    const speed = t <= 8 ? 60 * t : 480 - 12 * (t - 8);
    const up = speed * Math.sin(elevation);
    const east = speed * Math.cos(elevation);
    if (i > 0) z += ((up + previousUp) / 2) * dt;
    previousUp = up;
    lines.push(`${t.toFixed(2)},${z.toFixed(3)},${east.toFixed(4)},0,${up.toFixed(4)}`);
  }
  lines.push("");
  return lines.join("\n");
}

/**
 * An invented flight with a corner in its speed (up at 40 m/s^2 to 600 m/s at 15 s, then
 * down at 30 m/s^2), sampled only every 2 s: too coarse to pin its maximum q down, so the
 * page must advise resampling. Altitudes are the trapezoidal integral of a climb at 80
 * degrees.
 */
export function coarseCorner() {
  const lines = ["time_s,altitude_m,velocity_m_s"];
  const climb = Math.sin((80 * Math.PI) / 180);
  const speed = (t) => (t <= 15 ? 40 * t : 600 - 30 * (t - 15));
  let z = 0;
  for (let t = 0; t <= 30; t += 2) {
    if (t > 0) {
      // The exact integral of the piecewise-linear speed over the step (the corner inside it).
      const a = t - 2;
      const mid = a < 15 && t > 15 ? [a, 15, t] : [a, t];
      for (let k = 1; k < mid.length; k++) z += ((speed(mid[k - 1]) + speed(mid[k])) / 2) * (mid[k] - mid[k - 1]) * climb;
    }
    lines.push(`${t},${z.toFixed(3)},${speed(t)}`);
  }
  lines.push("");
  return lines.join("\n");
}

/**
 * The same invented boost as `vectorFlight`, written as speed, flight-path angle (85
 * degrees) and heading (90, east), with the vehicle's axis a degree steeper than the
 * path (86 degrees, toward the east): a q-alpha without any wind.
 */
export function pathFlight() {
  const lines = ["time (s),altitude (m),velocity (m/s),flight_path_angle (deg),heading (deg),axis_elevation (deg),axis_azimuth (deg)"];
  for (const line of vectorFlight().split("\n").slice(1)) {
    if (line === "") continue;
    const [t, z, east, , up] = line.split(",").map(Number);
    lines.push(`${t},${z},${Math.hypot(east, up).toFixed(4)},85,90,86,90`);
  }
  lines.push("");
  return lines.join("\n");
}
