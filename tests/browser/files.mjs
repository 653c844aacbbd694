// Files the browser test uploads, written by the test itself: the demo flight in feet,
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
