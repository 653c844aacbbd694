// Loads through winds aloft in the wasm module: WindProfile, scanFlight's options object
// (velocity components or speed, flight-path angle and heading; the axis; winds; the
// boundary layer; limits on q and q-alpha; the plateau), readFlightCsv's vector columns,
// bit identity with the native build, and every misuse refused with a message.
//
// Not certified flight software; verify independently; local codes, range-safety rules
// and licensed engineering practice govern.

import { test } from "node:test";
import assert from "node:assert/strict";
import { readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

import { throwsWith } from "./expect.mjs";
import { loadNode } from "./load.mjs";

const a = loadNode();
// Some checks go above 86 km: the upper atmosphere's tables first (upper.test.mjs shows
// the error without them).
await a.loadUpper();
await a.loadFull();
const { AtmosphereModel, WindProfile } = a;
const standard = AtmosphereModel.standard();
const here = dirname(fileURLToPath(import.meta.url));

const close = (x, y, rel) => Math.abs(x - y) <= rel * Math.abs(y);
const degrees = (radians) => (radians * 180) / Math.PI;

// The hand case. A vehicle climbs straight up at V = 100 m/s through a steady wind of
// w = 10 m/s from the west (270 deg): the wind blows toward the east at +10 m/s. The axis
// lies along the ground velocity, (0, 0, 1). Relative to the air the vehicle moves at
// (-10, 0, 100) m/s (east, north, up), so the airspeed is sqrt(100^2 + 10^2) = sqrt(10100)
// and the angle between the axis and the air-relative velocity has tan(alpha) = w / V:
// alpha = atan(0.1) = 5.7106 deg. q = rho Va^2 / 2 = 5050 rho; q-alpha = q alpha.
// Worked by hand; common practice, no source.
const climb = {
  timeS: [0, 1, 2],
  altitudeM: [1000, 1100, 1200],
  velocityEastMS: [0, 0, 0],
  velocityNorthMS: [0, 0, 0],
  velocityUpMS: [100, 100, 100],
};

test("the crosswind climb by hand: alpha = atan(w / V), airspeed sqrt(V^2 + w^2), q = 5050 rho", () => {
  const winds = WindProfile.fromSpeedDirection([0, 5000], [10, 10], [270, 270]);
  const { points, summary } = standard.scanFlight({ ...climb, winds, boundaryLayer: "turbulent" });
  const alpha = degrees(Math.atan(0.1));
  for (let i = 0; i < 3; i++) {
    assert.ok(close(points.alphaDeg[i], alpha, 1e-14), `alpha ${points.alphaDeg[i]}`);
    assert.ok(close(points.airspeedMS[i], Math.sqrt(10100), 1e-15));
    assert.ok(close(points.dynamicPressurePa[i], 5050 * points.densityKgM3[i], 1e-14));
    assert.ok(close(points.qAlphaPaDeg[i], points.dynamicPressurePa[i] * alpha, 1e-14));
    assert.equal(points.windEastMS[i], 10);
    assert.ok(Math.abs(points.windNorthMS[i]) < 1e-14);
    assert.equal(points.velocityMS[i], 100);
    // Pr < 1: the recovery factor is below 1, so T < Tr < Tt (common practice, no source).
    assert.ok(points.temperatureK[i] < points.recoveryTemperatureK[i] && points.recoveryTemperatureK[i] < points.totalTemperatureK[i]);
  }
  // 1 Mach, 2 unit Reynolds number, 16 components, 32 wind, 64 alpha, 128 recovery.
  assert.deepEqual([...points.defined], [243, 243, 243]);
  // q falls as the vehicle climbs at a steady airspeed: q-alpha peaks at the first sample.
  assert.equal(summary.maxQAlpha.sampleIndex, 0);
  assert.equal(summary.maxQAlpha.value, points.qAlphaPaDeg[0]);
  assert.equal(summary.maxQAlpha.mach, points.mach[0]);
  assert.equal(summary.maxDynamicPressure.velocityMS, points.airspeedMS[0]);
  assert.equal(summary.windHeldSamples, 0);
  assert.equal(summary.machUndefinedSamples, 0);
  // The same winds as arrays, of either form, give the same bits.
  const byArrays = standard.scanFlight({ ...climb, winds: { altitudeM: [0, 5000], windSpeedMS: [10, 10], windDirectionDeg: [270, 270] }, boundaryLayer: "turbulent" });
  assert.deepEqual(byArrays.points, points);
  const byComponents = standard.scanFlight({ ...climb, winds: { altitudeM: [0, 5000], windEastMS: [10, 10], windNorthMS: [0, 0] } });
  assert.ok(close(byComponents.points.alphaDeg[1], alpha, 1e-14));
  // Without a boundary layer there is no recovery-temperature column.
  assert.equal(byComponents.points.recoveryTemperatureK, undefined);
  winds.free();
});

test("head and tail winds change the airspeed, not the angle; a given axis sets it", () => {
  const level = { timeS: [0, 1], altitudeM: [500, 500], velocityEastMS: [200, 200], velocityNorthMS: [0, 0], velocityUpMS: [0, 0] };
  // 20 m/s from the east (90 deg) meets an eastbound vehicle head on: 220 m/s of air.
  const head = standard.scanFlight({ ...level, winds: { altitudeM: [0], windSpeedMS: [20], windDirectionDeg: [90] } });
  assert.ok(Math.abs(head.points.airspeedMS[0] - 220) < 1e-12 && Math.abs(head.points.alphaDeg[0]) < 1e-12);
  // The one level is at 0 m: both samples above it hold its wind.
  assert.equal(head.summary.windHeldSamples, 2);
  const tail = standard.scanFlight({ ...level, winds: { altitudeM: [0], windSpeedMS: [20], windDirectionDeg: [270] } });
  assert.ok(Math.abs(tail.points.airspeedMS[0] - 180) < 1e-12);
  // An axis 10 deg off the vertical toward the east on a vertical climb in still air:
  // alpha = 10 deg (by hand).
  const tilted = standard.scanFlight({ ...climb, axisElevationDeg: [80, 80, 80], axisAzimuthDeg: [90, 90, 90] });
  assert.ok(Math.abs(tilted.points.alphaDeg[2] - 10) < 1e-12);
  assert.equal(tilted.points.windEastMS, undefined);
  // Speed, flight-path angle and heading: straight up at 100 m/s is the climb's velocity.
  const path = standard.scanFlight({ timeS: climb.timeS, altitudeM: climb.altitudeM, velocityMS: [100, 100, 100], flightPathAngleDeg: [90, 90, 90], headingDeg: [0, 0, 0] });
  assert.deepEqual([...path.points.velocityUpMS], [100, 100, 100]);
  assert.deepEqual(path.points.dynamicPressurePa, standard.scanFlight(climb).points.dynamicPressurePa);
});

test("the positional call works as before and equals the options' speed form", () => {
  const t = [0, 1, 2, 3, 4];
  const z = [0, 150, 600, 1200, 1700];
  const v = [0, 300, 450, 420, 380];
  const vehicle = { drag: 0.5, referenceAreaM2: 0.01, referenceLengthM: 2 };
  const old = standard.scanFlight(t, z, v, vehicle);
  const options = standard.scanFlight({ timeS: t, altitudeM: z, velocityMS: v, vehicle });
  assert.deepEqual(old, options);
  // The scalar scan's columns stay; nothing that needs a direction, winds or a boundary layer.
  for (const key of ["timeS", "dragN", "reynoldsNumber", "airspeedMS", "totalTemperatureK"]) assert.ok(key in old.points, key);
  for (const key of ["velocityEastMS", "windEastMS", "alphaDeg", "qAlphaPaDeg", "recoveryTemperatureK"]) assert.ok(!(key in old.points), key);
  assert.equal(old.summary.maxQAlpha, null);
  assert.equal(old.summary.qExceedances, undefined);
  const peak = old.summary.maxDynamicPressure;
  assert.ok(peak.dynamicPressurePa >= peak.sampleMaxPa && peak.sampleMaxPa === Math.max(...old.points.dynamicPressurePa));
  assert.ok(peak.uncertaintyPa >= 0);
  assert.equal(typeof peak.resolved, "boolean");
  assert.equal(peak.suggestedSpacingS === null, peak.resolved);
});

test("limits: the intervals above q and q-alpha, crossings interpolated linearly", () => {
  const t = [0, 1, 2, 3, 4];
  const flight = { timeS: t, altitudeM: [0, 0, 0, 0, 0], velocityEastMS: [0, 0, 0, 0, 0], velocityNorthMS: [0, 0, 0, 0, 0], velocityUpMS: [50, 150, 250, 150, 50] };
  const first = standard.scanFlight(flight).points.dynamicPressurePa;
  const limit = (first[1] + first[2]) / 2;
  const winds = new WindProfile([0, 100], [5, 5], [0, 0]);
  const { points, summary } = standard.scanFlight({ ...flight, winds, qLimitPa: limit, qAlphaLimitPaDeg: 1e9 });
  const q = points.dynamicPressurePa;
  assert.equal(summary.qExceedances.length, 1);
  const [e] = summary.qExceedances;
  // The straight line between two samples meets the limit (common practice, no source).
  const cross = (i, j) => t[i] + ((limit - q[i]) / (q[j] - q[i])) * (t[j] - t[i]);
  assert.ok(Math.abs(e.startTimeS - cross(1, 2)) < 1e-12 && Math.abs(e.endTimeS - cross(2, 3)) < 1e-12);
  assert.equal(e.peak, q[2]);
  assert.deepEqual([e.peakTimeS, e.openStart, e.openEnd], [2, false, false]);
  assert.deepEqual(summary.qAlphaExceedances, []);
  // Every sample above a low limit: one interval, open at both ends.
  const low = standard.scanFlight({ ...flight, winds, qAlphaLimitPaDeg: 1 }).summary.qAlphaExceedances;
  assert.deepEqual(low.map((x) => [x.startTimeS, x.endTimeS, x.openStart, x.openEnd]), [[0, 4, true, true]]);
  // The plateau: q within 5 % of its maximum.
  const p = standard.scanFlight({ ...flight, plateauFraction: 0.05 }).summary.qPlateau;
  assert.ok(p.startTimeS > 1 && p.startTimeS < 2 && p.endTimeS > 2 && p.endTimeS < 3 && p.fraction === 0.05 && !p.open);
  winds.free();
});

test("WindProfile: components interpolated linearly, held beyond its levels", () => {
  const winds = new WindProfile([100, 1100, 2100], [10, -10, -10], [0, 4, 4]);
  assert.equal(winds.levelCount, 3);
  // Halfway, a wind reversing through calm is calm east-west (components, not speed and
  // direction, are interpolated; common practice, no source).
  assert.deepEqual(winds.at(600), { windEastMS: 0, windNorthMS: 2, windSpeedMS: 2, windDirectionDeg: 180, held: false });
  assert.equal(winds.at(9000).held, true);
  assert.equal(winds.at(-50).windEastMS, 10);
  const levels = winds.levels();
  assert.deepEqual([...levels.altitudeM], [100, 1100, 2100]);
  assert.deepEqual([...levels.windNorthMS], [0, 4, 4]);
  // A west wind blows toward the east: east = -W sin(270 deg) = W.
  const west = WindProfile.fromSpeedDirection([0], [12], [270]);
  assert.equal(west.at(0).windEastMS, 12);
  assert.ok(Math.abs(west.at(0).windDirectionDeg - 270) < 1e-12);
  winds.free();
  west.free();
});

test("readFlightCsv returns the vector columns a file has", () => {
  const text = "time (s),geometric_altitude (m),velocity_east (m/s),velocity_north (m/s),velocity_up (m/s),note\n0,100,0,0,20,pad\n1,130,1,0,40,\n";
  const samples = a.readFlightCsv(text);
  assert.deepEqual(Object.keys(samples).sort(), ["altitudeM", "ignored", "timeS", "velocityEastMS", "velocityNorthMS", "velocityUpMS"]);
  assert.deepEqual(samples.ignored, ["note"]);
  const { ignored, ...options } = samples;
  assert.equal(ignored.length, 1);
  // A speed beside the components gives the velocity twice: refused, as the command line
  // refuses it (one set of rules in the core), rather than one of them dropped.
  assert.throws(() => a.readFlightCsv("time,altitude,velocity_east,velocity_north,velocity_up,velocity\n0,0,0,0,1,1\n"), /line 1: the header gives the velocity twice/);
  assert.deepEqual([...standard.scanFlight(options).points.velocityUpMS], [20, 40]);
  // Speed, flight-path angle, heading and the axis; US units by default.
  const path = a.readFlightCsv("time,altitude,velocity,flight_path_angle,heading,axis_elevation,axis_azimuth\n0,0,100,90,0,90,0\n1,328.084,100,85,45,84,40\n", "us");
  assert.deepEqual(Object.keys(path).sort(), ["altitudeM", "axisAzimuthDeg", "axisElevationDeg", "flightPathAngleDeg", "headingDeg", "ignored", "timeS", "velocityMS"]);
  // The international foot, 0.3048 m exactly (1959); angles are degrees in both systems.
  assert.ok(close(path.altitudeM[1], 328.084 * 0.3048, 1e-15) && close(path.velocityMS[0], 30.48, 1e-15));
  assert.equal(path.flightPathAngleDeg[1], 85);
  // Incomplete or mixed forms are refused at the header.
  assert.throws(() => a.readFlightCsv("time,altitude,velocity_east,velocity_up\n0,0,0,0\n"), /line 1: the velocity's components need all three columns/);
  assert.throws(() => a.readFlightCsv("time,altitude,velocity,heading\n0,0,0,0\n"), /line 1: a velocity by its direction needs velocity/);
  assert.throws(() => a.readFlightCsv("time,altitude,velocity,axis_elevation,axis_azimuth\n0,0,0,0,0\n"), /line 1: axis_elevation, axis_azimuth need the velocity's direction/);
  assert.throws(() => a.readFlightCsv("time,altitude,velocity_east,velocity_north,velocity_up,axis_elevation\n0,0,0,0,0,0\n"), /line 1: the vehicle's axis needs both/);
  // An angle out of its range names its column, a RangeError.
  assert.throws(() => a.readFlightCsv("time,altitude,velocity,flight_path_angle,heading\n0,0,1,95,0\n"), (e) => e instanceof RangeError && /^line 2, column 4 \(flight_path_angle\): /.test(e.message));
  assert.throws(() => a.readFlightCsv("time,altitude,velocity_east,velocity_north,velocity_up\n0,0,0,,0\n"), /line 2, column 4 \(velocity_north\): an empty cell; every sample needs a value/);
});

// The file's lines: `input NAME values...`, `column KEY bits...`, `defined bits...`,
// `summary bits...`, `extras bits...` (bindings/wasm/src/loads.rs writes them natively).
function readCase() {
  const lines = readFileSync(join(here, "flight_loads_bits.txt"), "utf8").split("\n").filter((l) => l && !l.startsWith("#"));
  const input = {};
  const columns = {};
  let defined, summary, extras;
  for (const line of lines) {
    const [kind, name, ...rest] = line.split(" ");
    if (kind === "input") input[name] = rest.map(Number);
    if (kind === "column") columns[name] = rest;
    if (kind === "defined") defined = [name, ...rest].map(Number);
    if (kind === "summary") summary = [name, ...rest];
    if (kind === "extras") extras = [name, ...rest];
  }
  return { input, columns, defined, summary, extras };
}

function bits(x) {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x === null ? NaN : x === true ? 1 : x === false ? 0 : x);
  return view.getBigUint64(0).toString(16).padStart(16, "0");
}

test("a small vector flight gives the native build's bits, every value", () => {
  const c = readCase();
  const [cd, area, length] = c.input.vehicle;
  const [qLimitPa, qAlphaLimitPaDeg] = c.input.limits;
  const { points, summary: s } = standard.scanFlight({
    timeS: c.input.timeS,
    altitudeM: c.input.altitudeM,
    velocityEastMS: c.input.velocityEastMS,
    velocityNorthMS: c.input.velocityNorthMS,
    velocityUpMS: c.input.velocityUpMS,
    winds: { altitudeM: c.input["winds.altitudeM"], windEastMS: c.input["winds.windEastMS"], windNorthMS: c.input["winds.windNorthMS"] },
    vehicle: { drag: cd, referenceAreaM2: area, referenceLengthM: length },
    boundaryLayer: "turbulent",
    qLimitPa,
    qAlphaLimitPaDeg,
    plateauFraction: 0.05,
  });
  const keys = Object.keys(points).filter((k) => k !== "defined");
  assert.deepEqual(keys, Object.keys(c.columns));
  for (const key of keys) assert.deepEqual([...points[key]].map(bits), c.columns[key], key);
  assert.deepEqual([...points.defined], c.defined);
  // The summary in the native layout (bindings/wasm/src/flight.rs, summary_layout).
  const p = s.maxDynamicPressure;
  const extreme = (e) => [1, e.value, e.timeS, e.altitudeM, e.velocityMS, e.sampleIndex, e.mach];
  const crossings = (x) => [x.count, x.firstTimeS, x.lastTimeS];
  const layout = [
    s.samples,
    1, p.timeS, p.altitudeM, p.velocityMS, p.mach, p.dynamicPressurePa, p.sampleIndex, p.refined,
    ...extreme(s.maxMach), ...extreme(s.maxDrag), ...extreme(s.maxQAlpha),
    ...crossings(s.machOneUp), ...crossings(s.machOneDown),
    p.sampleMaxPa, p.uncertaintyPa, p.resolved, p.suggestedSpacingS,
    s.machUndefinedSamples, s.windHeldSamples,
  ];
  assert.deepEqual(layout.map(bits), c.summary);
  const interval = (e) => [e.startTimeS, e.endTimeS, e.peak, e.peakTimeS, e.openStart, e.openEnd];
  const q = s.qPlateau;
  const extras = [
    s.qExceedances.length, ...s.qExceedances.flatMap(interval),
    s.qAlphaExceedances.length, ...s.qAlphaExceedances.flatMap(interval),
    1, q.startTimeS, q.endTimeS, q.maximum, q.fraction, q.open,
  ];
  assert.deepEqual(extras.map(bits), c.extras);
});


test("every misuse is a RangeError that names the value and the fix", () => {
  const winds = { altitudeM: [0, 5000], windEastMS: [10, 10], windNorthMS: [0, 0] };
  // Samples: a NaN, a short array, a time going back, an altitude out of range.
  throwsWith(() => standard.scanFlight({ ...climb, velocityNorthMS: [0, NaN, 0] }), RangeError, /^flight sample 1: .*velocity north/);
  throwsWith(() => standard.scanFlight({ ...climb, velocityUpMS: [100, 100] }), RangeError, /^velocityUpMS has 2 elements and timeS 3: every sample array must have the same length/);
  throwsWith(() => standard.scanFlight({ ...climb, timeS: [0, 1, 1] }), RangeError, /^flight sample point 2: time \(s\) must be after the previous sample's/);
  throwsWith(() => standard.scanFlight({ ...climb, altitudeM: [0, 2e6, 0] }), RangeError, /^flight sample 1: geometric altitude 2000000 m is outside the allowed range/);
  // The velocity's forms: none, mixed, incomplete.
  throwsWith(() => standard.scanFlight({ timeS: [0], altitudeM: [0] }), RangeError, /no velocity; give velocityMS/);
  throwsWith(() => standard.scanFlight({ ...climb, velocityMS: [1, 2, 3] }), RangeError, /more than one form/);
  throwsWith(() => standard.scanFlight({ ...climb, flightPathAngleDeg: [1, 2, 3] }), RangeError, /more than one form/);
  throwsWith(() => standard.scanFlight({ timeS: [0], altitudeM: [0], velocityMS: [1], headingDeg: [0] }), RangeError, /incomplete/);
  throwsWith(() => standard.scanFlight({ timeS: [0], altitudeM: [0], velocityMS: [1], flightPathAngleDeg: [95], headingDeg: [0] }), RangeError, /^flight sample 0: flight-path angle 95 deg is outside the allowed range/);
  // What needs the velocity's direction.
  const speeds = { timeS: [0, 1], altitudeM: [0, 10], velocityMS: [0, 20] };
  throwsWith(() => standard.scanFlight({ ...speeds, winds }), RangeError, /winds needs the velocity's direction/);
  throwsWith(() => standard.scanFlight({ ...speeds, qAlphaLimitPaDeg: 100 }), RangeError, /qAlphaLimitPaDeg needs the velocity's direction/);
  throwsWith(() => standard.scanFlight({ ...speeds, axisElevationDeg: [0, 0], axisAzimuthDeg: [0, 0] }), RangeError, /axis needs the velocity's direction/);
  // The axis: one array alone, an angle out of range.
  throwsWith(() => standard.scanFlight({ ...climb, axisElevationDeg: [90, 90, 90] }), RangeError, /give both axisElevationDeg and axisAzimuthDeg/);
  throwsWith(() => standard.scanFlight({ ...climb, axisElevationDeg: [90, 90, 95], axisAzimuthDeg: [0, 0, 0] }), RangeError, /^flight sample 2: axis elevation 95 deg is outside the allowed range -90 to 90/);
  // Options: an unknown boundary layer, limits and fractions out of range, extra arguments.
  throwsWith(() => standard.scanFlight({ ...climb, boundaryLayer: "wavy" }), RangeError, /boundaryLayer must be one of "laminar", "turbulent"/);
  throwsWith(() => standard.scanFlight({ ...climb, qLimitPa: NaN }), RangeError, /qLimitPa/);
  throwsWith(() => standard.scanFlight({ ...climb, plateauFraction: 1.5 }), RangeError, /plateau fraction 1.5/);
  throwsWith(() => standard.scanFlight({ ...climb }, [0]), RangeError, /takes one argument/);
  // At rest in a wind with no axis, q-alpha is unknown: a limit on it names the sample.
  throwsWith(() => standard.scanFlight({ ...climb, velocityUpMS: [0, 100, 100], winds, qAlphaLimitPaDeg: 10 }), RangeError, /^flight sample 0: q-alpha is undefined .* give axisElevationDeg and axisAzimuthDeg/);
  // Winds: a NaN, out of order, too strong, too short, of different lengths, no levels.
  throwsWith(() => new WindProfile([0, NaN], [1, 1], [0, 0]), RangeError, /^winds level 1: /);
  throwsWith(() => new WindProfile([0, 0], [1, 1], [0, 0]), RangeError, /altitudes \(m\) must increase/);
  throwsWith(() => new WindProfile([0, 10], [1, 300], [0, 0]), RangeError, /^winds level 1: eastward wind 300 m\/s is outside the allowed range/);
  throwsWith(() => WindProfile.fromSpeedDirection([0], [10], [400]), RangeError, /^winds level 0: wind direction 400 deg/);
  throwsWith(() => new WindProfile([0, 10], [1], [0, 0]), RangeError, /same length/);
  throwsWith(() => new WindProfile([], [], []), RangeError, /.+/);
  throwsWith(() => standard.scanFlight({ ...climb, winds: { altitudeM: [0, 10], windEastMS: [1], windNorthMS: [0, 0] } }), RangeError, /same length/);
  throwsWith(() => new WindProfile([0], [1], [0]).at(NaN), RangeError, /altitude/);
});

test("wrong JS types are TypeErrors naming the option", () => {
  assert.throws(() => standard.scanFlight({ ...climb, velocityUpMS: "fast" }), { name: "TypeError", message: /^velocityUpMS must be a Float64Array or an array of numbers/ });
  assert.throws(() => standard.scanFlight({ ...climb, gusts: 1 }), { name: "TypeError", message: /unknown property "gusts"/ });
  assert.throws(() => standard.scanFlight({ ...climb, winds: 12 }), { name: "TypeError", message: /^winds must be a WindProfile or/ });
  assert.throws(() => new WindProfile("0", [1], [0]), TypeError);
});

test("WindProfile.fromCsv reads a wind file as the command line's --winds does", () => {
  // A west wind (from 270 deg) blows toward the east (common practice, no source):
  // 10 kt at 0 m and 20 kt at 1000 m, linear in components between (hand-worked).
  const kt = 1852 / 3600;
  const text = "# invented\naltitude (m),wind_speed (kt),wind_direction (deg),remark\n0,10,270,calm\n1000,20,270,\n";
  const winds = WindProfile.fromCsv(text);
  const mid = winds.at(500);
  assert.ok(close(mid.windEastMS, 15 * kt, 1e-12) && Math.abs(mid.windNorthMS) < 1e-12, JSON.stringify(mid));
  assert.equal(mid.held, false);
  assert.equal(winds.at(2000).held, true);
  // The example wind file loads, and scans a flight as the options' wind.
  const file = readFileSync(join(here, "..", "..", "..", "examples", "data", "vessaro_key_winds.csv"), "utf8");
  const example = WindProfile.fromCsv(file);
  assert.ok(Number.isFinite(example.at(12000).windSpeedMS));
  example.free();
  // Refusals name the line and column, as the command line's do.
  assert.throws(() => WindProfile.fromCsv("altitude_m,wind_speed_kt\n0,10\n"), /line 1/);
  assert.throws(() => WindProfile.fromCsv("altitude_m,wind_speed_kt,wind_direction_deg\n0,10,270\n1000,x,270\n"), /line 3/);
  assert.throws(() => WindProfile.fromCsv("altitude_m,wind_speed_kt,wind_direction_deg\n" + "9".repeat(70000) + "\n"), /line 2: longer than 65536 bytes/);
  assert.throws(() => WindProfile.fromCsv("altitude_m,wind_speed_kt,wind_direction_deg\n0,10,270\n", "metric"), RangeError);
  winds.free();
});
