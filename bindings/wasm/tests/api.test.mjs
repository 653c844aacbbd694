// The JS API against published values and against the laws that tie its parts
// together. Each published value names its source; invented inputs are marked so.

import { test } from "node:test";
import assert from "node:assert/strict";

import { loadNode } from "./load.mjs";

const a = loadNode();
// Some checks go above 86 km: the upper atmosphere's tables first (upper.test.mjs shows
// the error without them).
await a.loadUpper();
await a.loadFull();
const { AtmosphereModel } = a;
const standard = AtmosphereModel.standard();

const close = (x, y, rel) => Math.abs(x - y) <= rel * Math.abs(y);

test("the standard's defining values come out exactly", () => {
  // U.S. Standard Atmosphere 1976: sea level 288.15 K and 101 325 Pa by definition; the
  // tropopause layer is isothermal at 216.65 K from 11 000 geopotential m.
  const sea = standard.state(0);
  assert.equal(sea.temperatureK, 288.15);
  assert.equal(sea.pressurePa, 101325);
  assert.equal(sea.temperatureRatio, 1);
  assert.equal(sea.pressureRatio, 1);
  // 1.2250 kg/m^3 and 340.29 m/s at sea level (the standard's Table I and III, from
  // memory of the printed table, half a unit of the last digit).
  assert.ok(Math.abs(sea.densityKgM3 - 1.225) <= 0.5e-4);
  assert.ok(Math.abs(sea.speedOfSoundMS - 340.29) <= 0.005);
  assert.equal(standard.state(11000, "geopotential").temperatureK, 216.65);
  assert.equal(standard.state(15000, "geopotential").temperatureK, 216.65);
});

test("the state is a plain object with every quantity, null where undefined", () => {
  const s = standard.state(5000);
  assert.equal(Object.getPrototypeOf(s), Object.prototype);
  assert.equal(Object.keys(s).length, 20);
  for (const [k, v] of Object.entries(s)) assert.ok(Number.isFinite(v), `${k} = ${v}`);
  assert.deepEqual(JSON.parse(JSON.stringify(s)), s);
  // Above 86 km the standard gives no continuum properties.
  const high = standard.state(200000);
  for (const k of ["speedOfSoundMS", "dynamicViscosityPaS", "kinematicViscosityM2S", "thermalConductivityWMK"]) {
    assert.equal(high[k], null, k);
  }
  assert.ok(high.densityKgM3 > 0 && high.numberDensityM3 > 0);
  // The gas law p = n k T ties them (k = 1.380622e-23 J/K, the standard's Boltzmann
  // constant); the core computes n from p, so to rounding.
  assert.ok(close(high.pressurePa, high.numberDensityM3 * 1.380622e-23 * high.temperatureK, 1e-12));
});

test("batch evaluation gives the single states' bits, per quantity", () => {
  const altitudes = new Float64Array(257);
  for (let i = 0; i < altitudes.length; i++) altitudes[i] = -5000 + i * 355.25; // up to 85 944 m
  const quantities = Object.keys(standard.state(0));
  const columns = standard.batch(altitudes, quantities);
  assert.deepEqual(Object.keys(columns), quantities);
  altitudes.forEach((z, i) => {
    const s = standard.state(z);
    for (const q of quantities) assert.ok(Object.is(columns[q][i], s[q]), `${q} at ${z} m`);
  });
  // Geopotential altitudes, a plain array, one quantity.
  const geo = standard.batch([0, 11000, 20000], ["temperatureK"], "geopotential");
  assert.deepEqual([...geo.temperatureK], [288.15, 216.65, 216.65]);
  assert.ok(geo.temperatureK instanceof Float64Array);
  // An empty batch is empty.
  assert.equal(standard.batch([], ["pressurePa"]).pressurePa.length, 0);
});

test("a temperature offset shifts the temperature at the standard's pressure", () => {
  const hot = AtmosphereModel.standard(15);
  for (const z of [0, 3000, 11000]) {
    const s = hot.state(z);
    const base = standard.state(z);
    assert.equal(s.temperatureK, base.temperatureK + 15);
    assert.equal(s.pressurePa, base.pressurePa);
    assert.ok(close(s.densityKgM3 * s.temperatureK, base.densityKgM3 * base.temperatureK, 1e-14));
  }
  assert.deepEqual(a.standardState(3000, "geometric", 15), hot.state(3000));
  assert.deepEqual(a.standardState(3000), standard.state(3000));
});

test("the user models follow their defining formulas", () => {
  // Exponential (invented parameters): rho = rho0 exp(-z / H).
  const exp = AtmosphereModel.exponential(1.2, 8500, 260);
  assert.equal(exp.kind, "exponential");
  assert.ok(close(exp.state(8500).densityKgM3, 1.2 / Math.E, 1e-14));
  // Isothermal (invented): p = p0 exp(-g0 M0 H / (R* T)) with the standard's constants.
  const iso = AtmosphereModel.isothermal(250, 95000);
  const gmr = (9.80665 * 28.9644) / 8314.32;
  assert.ok(close(iso.state(5000, "geopotential").pressurePa, 95000 * Math.exp((-gmr * 5000) / 250), 1e-13));
  // The standard's own first three layers as user layers (U.S. Standard Atmosphere 1976,
  // Part 1: -6.5 K/km to 11 km, isothermal to 20 km, +1 K/km to 32 km).
  const layers = AtmosphereModel.layered(0, 288.15, 101325, [11000, 20000, 32000], [-0.0065, 0, 0.001]);
  assert.equal(layers.kind, "layered");
  assert.deepEqual(layers.range(), { ...layers.range(), geopotentialMinM: 0, geopotentialMaxM: 32000 });
  for (const h of [0, 5000, 11000, 15000, 25000, 31999]) {
    const s = layers.state(h, "geopotential");
    const ref = standard.state(h, "geopotential");
    assert.ok(close(s.temperatureK, ref.temperatureK, 1e-13), `T at ${h}`);
    assert.ok(close(s.pressurePa, ref.pressurePa, 1e-12), `p at ${h}`);
  }
});

test("a table from arrays and from its JSON form is the same model, exact at its rows", () => {
  // An invented hot, humid afternoon at an invented coastal range.
  const z = [4, 500, 1000, 2000];
  const t = [306.55, 302.9, 298.45, 291.2];
  const p = [100860, 95300, 90235, null];
  const dew = [299.25, 297.1, null, 283.0];
  const fromArrays = AtmosphereModel.tabulated("geometric", z, t, { pressurePa: [p[0], null, null, null], dewPointK: dew, blendAboveM: 5000 });
  const rows = z.map((zi, i) => ({ altitude_m: zi, temperature_k: t[i], pressure_pa: i === 0 ? p[0] : null, dew_point_k: dew[i] }));
  const fromJson = AtmosphereModel.fromSoundingJson(JSON.stringify({ altitude: "geometric", rows, above: { blend_into_us1976: { depth_m: 5000 } } }));
  assert.equal(fromArrays.kind, "tabulated");
  for (const zi of [4, 250, 1000, 1999, 2000, 4000, 9000]) assert.deepEqual(fromArrays.state(zi), fromJson.state(zi), `at ${zi}`);
  assert.equal(fromArrays.state(4).pressurePa, 100860);
  assert.equal(fromArrays.state(500).temperatureK, 302.9);
  // Beyond the blend the table is the standard itself.
  assert.deepEqual(fromArrays.state(12000), standard.state(12000));
  // Below the first row: no blend, so an error naming the table's band.
  assert.throws(() => fromArrays.state(0), RangeError);
  // Humid air is lighter than dry air at the same T and p (virtual temperature).
  const dry = AtmosphereModel.tabulated("geometric", [4, 1000], [306.55, 298.45], { pressurePa: [100860, null] });
  assert.ok(fromArrays.state(4).densityKgM3 < dry.state(4).densityKgM3);
});

test("inverse altitudes undo the model", () => {
  // The standard's tropopause pressure, 22 632.06 Pa at 11 000 geopotential m (U.S.
  // Standard Atmosphere 1976, from memory of the printed table, 7 digits).
  assert.ok(Math.abs(a.pressureAltitudeM(22632.06) - 11000) < 0.01);
  assert.ok(Math.abs(a.densityAltitudeM(1.225)) < 0.5);
  // Round trips through the model (solver tolerance 1e-7 m plus 4 ulps), 150 km included:
  // hydrogen is continued below 150 km, so pressure and density fall across it too.
  for (const z of [-2000, 0, 8000, 40000, 120000, 150000, 300000]) {
    const s = standard.state(z);
    assert.ok(Math.abs(standard.altitudeOf("pressure", s.pressurePa) - z) < 1e-5, `pressure at ${z}`);
    assert.ok(Math.abs(standard.altitudeOf("density", s.densityKgM3) - z) < 1e-5, `density at ${z}`);
  }
  // A pad's own pressure reads 0 above the pad; QNH 1013.25 hPa reads the pressure altitude.
  assert.equal(a.barometricAltitudeM(98000, { padPressurePa: 98000 }), 0);
  assert.equal(a.barometricAltitudeM(90000, { qnhPa: 101325 }), a.barometricAltitudeM(90000));
  assert.equal(a.barometricAltitudeM(90000, "standard"), a.pressureAltitudeM(90000));
  assert.ok(Math.abs(a.densityAltitudeFromM(101325, 308.15) - 693.5136) < 1e-4); // mpmath, as the core's doctest
});

test("aerodynamics: q, drag, Mach and Reynolds numbers, terminal velocity", () => {
  // q = rho V^2 / 2 (definition): 1.225 * 100^2 / 2 = 6125 Pa.
  assert.ok(Math.abs(a.dynamicPressurePa(1.225, 100) - 6125) < 1e-11);
  assert.equal(a.dynamicPressurePa(1.2, -50), a.dynamicPressurePa(1.2, 50));
  // q = gamma p M^2 / 2 equals rho V^2 / 2 for a perfect gas (a^2 = gamma p / rho).
  const s = standard.state(3000);
  const v = 0.7 * s.speedOfSoundMS;
  assert.ok(close(a.dynamicPressureFromMachPa(s.pressurePa, 0.7), a.dynamicPressurePa(s.densityKgM3, v), 1e-13));
  assert.equal(a.dragN(1000, 0.5, 0.02), 10);
  assert.equal(a.machNumber(170.145, 340.29), 0.5);
  // V = M a, the definition of the Mach number (common practice, no source).
  assert.equal(a.velocityFromMachMS(0.5, 340.29), 170.145);
  assert.throws(() => a.velocityFromMachMS(-0.5, 340.29), RangeError);
  assert.ok(close(a.reynoldsNumber(1.2, 50, 0.1, 1.8e-5), (1.2 * 50 * 0.1) / 1.8e-5, 1e-15));
  assert.equal(a.knudsenNumber(0.012, 1), 0.012);
  assert.equal(a.rarefactionRegime(0.012), "slip");
  assert.equal(a.rarefactionRegime(20), "freeMolecular");
  assert.ok(close(a.ballisticCoefficientKgM2(4, 0.5, 7.85e-3), 4 / (0.5 * 7.85e-3), 1e-15));
  // An invented 0.5 kg payload under a 0.8 m^2 canopy, Cd 1.5, at sea level:
  // V = sqrt(2 m g / (rho Cd A)) = 2.583 m/s (as the core's doctest).
  assert.ok(Math.abs(standard.terminalVelocityMS(0, 0.5, 0.8, 1.5) - 2.583) < 5e-4);
  // A Mach-dependent Cd table (invented) between its points and beyond them.
  const table = { mach: [0, 1, 2], cd: [0.3, 0.6, 0.4], interpolation: "linear" };
  assert.ok(Math.abs(a.dragCoefficient(table, 0.5) - 0.45) < 1e-15);
  assert.equal(a.dragCoefficient(table, 5), 0.4);
  assert.equal(a.dragCoefficient(0.75, 3), 0.75);
  assert.ok(standard.terminalVelocityMS(3000, 20, 0.05, table) > 0);
});

test("compressible flow and airspeeds", () => {
  // NACA Report 1135, Table I, Mach 2: p/pt .12780, T/Tt .55556, A/A* 1.6875 (from
  // memory of the printed table; half a unit of the last digit).
  const i = a.isentropic(2);
  assert.ok(Math.abs(i.pressureRatio - 0.1278) <= 0.5e-5);
  assert.ok(Math.abs(i.temperatureRatio - 0.55556) <= 0.5e-5);
  assert.ok(Math.abs(a.areaRatio(2) - 1.6875) <= 0.5e-4);
  assert.ok(Math.abs(a.machFromPressureRatio(i.pressureRatio) - 2) < 1e-12);
  assert.ok(Math.abs(a.machFromTemperatureRatio(i.temperatureRatio) - 2) < 1e-12);
  assert.ok(Math.abs(a.machFromDensityRatio(i.densityRatio) - 2) < 1e-12);
  assert.ok(Math.abs(a.machFromAreaRatio(a.areaRatio(2), "supersonic") - 2) < 1e-10);
  assert.ok(Math.abs(a.machFromAreaRatio(a.areaRatio(0.4), "subsonic") - 0.4) < 1e-10);
  // Normal shock at Mach 2, gamma 1.4: p2/p1 = (2 gamma M^2 - (gamma - 1)) / (gamma + 1)
  // = 4.5 (NACA Report 1135, equation of Table II).
  const n = a.normalShock(2);
  assert.ok(Math.abs(n.pressureRatio - 4.5) < 1e-14);
  assert.ok(Math.abs(n.downstreamMach - Math.sqrt(1 / 3)) < 1e-15);
  assert.ok(close(a.impactPressurePa(1e5, 0.5), 1e5 * a.impactPressureRatio(0.5), 1e-15));
  assert.ok(Math.abs(a.machFromImpactPressureRatio(a.impactPressureRatio(1.7)) - 1.7) < 1e-12);
  // At standard sea level CAS, EAS and TAS coincide (by their definitions).
  const sea = a.airspeeds(101325, 288.15, "calibrated", 100);
  assert.ok(Math.abs(sea.trueAirspeedMS - 100) < 1e-10 && Math.abs(sea.equivalentAirspeedMS - 100) < 1e-10);
  // ISA at 10 000 m pressure altitude, Mach 0.8: TAS 239.5706, EAS 139.0549, CAS
  // 146.9851 m/s (tests/reference/airspeed_mpmath.py, as the core's doctest).
  const cruise = a.airspeedsAtPressureAltitude(10000, 223.15, "mach", 0.8);
  assert.ok(Math.abs(cruise.trueAirspeedMS - 239.5706) < 1e-4);
  assert.ok(Math.abs(cruise.equivalentAirspeedMS - 139.0549) < 1e-4);
  assert.ok(Math.abs(cruise.calibratedAirspeedMS - 146.9851) < 1e-4);
});

test("the flight scan: per-sample columns, the refined maximum q and the Mach 1 crossing", () => {
  // An invented sounding rocket: speed peaks at t = 2.3 s, at constant (sea-level) height,
  // so q = rho V^2 / 2 peaks there too.
  const t = Float64Array.from({ length: 11 }, (_, i) => i * 0.5);
  const z = new Float64Array(11);
  const v = t.map((ti) => 400 - 20 * (ti - 2.3) ** 2);
  const { points, summary } = standard.scanFlight(t, z, v, { drag: 0.45, referenceAreaM2: 0.0182, referenceLengthM: 2.4 });
  assert.equal(summary.samples, 11);
  const rho = standard.state(0).densityKgM3;
  points.dynamicPressurePa.forEach((q, i) => assert.ok(Object.is(q, a.dynamicPressurePa(rho, v[i])), `q at ${t[i]}`));
  points.dragN.forEach((d, i) => assert.ok(close(d, points.dynamicPressurePa[i] * 0.45 * 0.0182, 1e-15)));
  assert.ok([...points.defined].every((b) => b === 15));
  const peak = summary.maxDynamicPressure;
  assert.ok(peak.refined);
  assert.ok(Math.abs(peak.timeS - 2.3) < 0.05, `peak at ${peak.timeS}`);
  assert.ok(peak.dynamicPressurePa >= Math.max(...points.dynamicPressurePa));
  assert.equal(summary.machOneUp.count, 1);
  assert.equal(summary.machOneDown.count, 1);
  assert.ok(summary.maxDrag.value > 0);
  // Without a vehicle: no drag (NaN, bit 8 clear) and no Reynolds number.
  const bare = standard.scanFlight(t, z, v);
  assert.ok([...bare.points.dragN].every(Number.isNaN));
  assert.ok([...bare.points.defined].every((b) => b === 3));
  assert.equal(bare.summary.maxDrag, null);
  // Above 86 km the standard has no speed of sound: no Mach number there.
  const high = standard.scanFlight([0, 1], [90000, 91000], [1000, 1000]);
  assert.deepEqual([...high.points.defined], [0, 0]);
  assert.equal(high.summary.maxMach, null);
});

test("the range, the kind, the unit factors and the version", () => {
  assert.deepEqual(
    { min: standard.range().geometricMinM, max: standard.range().geometricMaxM },
    { min: -5000, max: 1e6 },
  );
  assert.equal(standard.kind, "standard");
  const u = a.unitFactors();
  // The international foot and nautical mile (1959), exact.
  assert.equal(u.footM, 0.3048);
  assert.equal(u.knotMS, 1852 / 3600);
  assert.match(a.version(), /^\d+\.\d+\.\d+$/);
});
