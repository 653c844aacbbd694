// Every bad input throws a JS error of the right class, with a message that names the
// value and what is allowed, and nothing reaches a Rust panic (which in wasm is a trap,
// a `WebAssembly.RuntimeError` that leaves the module unusable): first the error paths
// one by one, then garbage thrown at every export.

import { test } from "node:test";
import assert from "node:assert/strict";
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join } from "node:path";

import { throwsWith } from "./expect.mjs";
import { loadNode, packageDir } from "./load.mjs";

const a = loadNode();
// Some checks go above 86 km: the upper atmosphere's tables first (upper.test.mjs shows
// the error without them).
await a.loadUpper();
await a.loadFull();
const { AtmosphereModel } = a;
const standard = AtmosphereModel.standard();


test("numbers must be JS numbers: a TypeError naming the argument and what it got", () => {
  throwsWith(() => standard.state("1000"), TypeError, /^altitudeM must be a number, got the string "1000"$/);
  throwsWith(() => standard.state(null), TypeError, /^altitudeM must be a number, got null$/);
  throwsWith(() => standard.state(), TypeError, /^altitudeM must be a number, got undefined$/);
  throwsWith(() => a.dynamicPressurePa(1.2, true), TypeError, /^velocityMS must be a number, got the boolean true$/);
  throwsWith(() => a.dynamicPressurePa(1.2, 10n), TypeError, /^velocityMS must be a number, got a bigint$/);
  throwsWith(() => AtmosphereModel.standard({}), TypeError, /^offsetK must be a number, got an object$/);
  throwsWith(() => a.isentropic(2, "1.4"), TypeError, /^gamma must be a number/);
});

test("arrays must be Float64Array or arrays of numbers; the element is named", () => {
  throwsWith(() => standard.batch(null, ["temperatureK"]), TypeError, /^altitudesM must be a Float64Array or an array of numbers, got null$/);
  throwsWith(() => standard.batch([0, "1"], ["temperatureK"]), TypeError, /^altitudesM\[1\] must be a number, got the string "1"$/);
  throwsWith(() => standard.batch(new Float32Array(2), ["temperatureK"]), TypeError, /^altitudesM must be a Float64Array/);
  throwsWith(() => standard.batch(new Array(2 ** 24 + 1), ["temperatureK"]), RangeError, /^altitudesM has 16777217 elements; the allowed range is 0 to 16777216$/);
  throwsWith(() => standard.batch([0], "temperatureK"), TypeError, /^quantities must be an array of names/);
  // Tables and layers: at most 262 144 rows.
  const many = new Float64Array(2 ** 18 + 1);
  throwsWith(() => AtmosphereModel.tabulated("geometric", many, many), RangeError, /^altitudesM has 262145 rows; the allowed range is 0 to 262144$/);
  throwsWith(() => AtmosphereModel.layered(0, 288, 1e5, many, many), RangeError, /^topsGeopotentialM has 262145 rows/);
  throwsWith(() => AtmosphereModel.fromSoundingJson({ altitude: "geometric", rows: new Array(2 ** 18 + 1) }), RangeError, /^sounding\.rows has 262145 rows/);
  // A batch too large for the module's memory is a RangeError, not a trap.
  throwsWith(() => standard.batch(new Float64Array(2 ** 24), Object.keys(standard.state(0))), RangeError, /^the result needs 335544320 numbers, more than the module's memory can hold$/);
});

test("values outside the allowed range are RangeErrors naming the value and the range", () => {
  // The standard's range, -5 km to 1000 km geometric (U.S. Standard Atmosphere 1976).
  throwsWith(() => standard.state(1.5e6), RangeError, /^geometric altitude 1500000 m is outside the allowed range -5000 to 1000000 m$/);
  throwsWith(() => standard.state(-6000), RangeError, /-6000 m is outside the allowed range -5000 to 1000000 m/);
  throwsWith(() => standard.state(NaN), RangeError, /^geometric altitude must be a finite number, got NaN$/);
  throwsWith(() => standard.state(Infinity, "geopotential"), RangeError, /^geopotential altitude must be a finite number, got Infinity$/);
  throwsWith(() => AtmosphereModel.standard(NaN), RangeError, /^temperature offset must be a finite number, got NaN$/);
  throwsWith(() => AtmosphereModel.exponential(-1, 8000, 288), RangeError, /^sea-level density must be greater than 0 kg\/m\^3, got -1 kg\/m\^3$/);
  throwsWith(() => a.normalShock(0.5), RangeError, /^upstream Mach number 0\.5 is outside the allowed range 1 to 1000$/);
  throwsWith(() => a.isentropic(2, 3), RangeError, /ratio of specific heats 3 is outside the allowed range 1\.01 to 1\.7/);
  throwsWith(() => a.dragN(1000, 200, 1), RangeError, /^drag coefficient 200 is outside the allowed range 0 to 100$/);
  throwsWith(() => a.ballisticCoefficientKgM2(4, 0, 0.01), RangeError, /^drag coefficient must be greater than 0, got 0$/);
  throwsWith(() => a.dynamicPressurePa(-1, 10), RangeError, /density -1 kg\/m\^3 is outside the allowed range 0 to 1000000 kg\/m\^3/);
  throwsWith(() => a.standardSpecies(50000), RangeError, /50000 m is outside the allowed range 86000 to 1000000 m/);
  throwsWith(() => a.pressureAltitudeM(2e5), RangeError, /pressure 200000 Pa is outside the allowed range/);
  throwsWith(() => a.airspeeds(101325, 288.15, "mach", -1), RangeError, /Mach number -1 is outside the allowed range 0 to 1000/);
  throwsWith(() => standard.terminalVelocityMS(0, -1, 1, 1.5), RangeError, /mass must be greater than 0 kg, got -1 kg/);
});

test("an unknown option name is a RangeError listing the allowed names", () => {
  throwsWith(() => standard.state(0, "sideways"), RangeError, /^altitudeKind must be one of "geometric", "geopotential", got the string "sideways"$/);
  throwsWith(() => standard.batch([0], ["temperature"]), RangeError, /^quantities\[0\] must be one of "geometricAltitudeM", .*"densityRatio", got the string "temperature"$/);
  throwsWith(() => a.machFromAreaRatio(2, "sideways"), RangeError, /^branch must be one of "subsonic", "supersonic"/);
  throwsWith(() => a.airspeeds(101325, 288.15, "indicated", 100), RangeError, /^givenKind must be one of "calibrated", "equivalent", "true", "mach"/);
  throwsWith(() => standard.altitudeOf("height", 1), RangeError, /^property must be one of "pressure", "density", "numberDensity"/);
  throwsWith(() => a.dragCoefficient({ mach: [0, 1], cd: [0.3, 0.5], interpolation: "cubic" }, 0.5), RangeError, /^drag\.interpolation must be one of "monotoneCubic", "linear"/);
  throwsWith(() => standard.state(0, 1), TypeError, /^altitudeKind must be one of .*, got the number 1$/);
});

test("misspelt options are TypeErrors naming the property", () => {
  throwsWith(() => AtmosphereModel.tabulated("geometric", [0, 1000], [288, 281], { presurePa: [1e5, null] }), TypeError, /^columns has an unknown property "presurePa"; allowed: "pressurePa", /);
  throwsWith(() => standard.scanFlight([0, 1], [0, 10], [0, 10], { drag: 0.5, area: 1 }), TypeError, /^vehicle has an unknown property "area"/);
  throwsWith(() => a.dragCoefficient({ mach: [0, 1], cd: [0.3, 0.5], kind: 1 }, 0.5), TypeError, /^drag has an unknown property "kind"/);
  throwsWith(() => a.dragCoefficient("0.5", 0.5), TypeError, /^drag must be a drag coefficient \(a number\) or a table/);
  throwsWith(() => a.barometricAltitudeM(90000, { qnh: 101325 }), TypeError, /^reference must be "standard", \{qnhPa: number\} or \{padPressurePa: number\}/);
});

test("inconsistent models and tables are Errors naming the layer, row or point", () => {
  throwsWith(() => AtmosphereModel.layered(0, 288.15, 101325, [11000, 20000], [-0.0065]), Error, /^topsGeopotentialM has 2 elements and lapseRatesKPerM 1; they must have the same length$/);
  throwsWith(() => AtmosphereModel.layered(0, 288.15, 101325, [], []), Error, /^layer 0: at least one layer is needed/);
  throwsWith(() => AtmosphereModel.layered(0, 288.15, 101325, [50000], [-0.01]), Error, /^layer 0: temperature must stay above 0 K/);
  throwsWith(() => AtmosphereModel.tabulated("geometric", [0], [288], { pressurePa: [1e5] }), Error, /^a table needs at least 2 rows, got 1$/);
  throwsWith(() => AtmosphereModel.tabulated("geometric", [0, 0], [288, 280], { pressurePa: [1e5, null] }), Error, /^row 1: altitude 0 m must be at least/);
  throwsWith(() => AtmosphereModel.tabulated("geometric", [0, 1000], [288, -4], { pressurePa: [1e5, null] }), RangeError, /^row 1: temperature must be above 0 K, got -4 K$/);
  throwsWith(() => AtmosphereModel.tabulated("geometric", [0, 1000], [288], {}), Error, /^temperaturesK has 1 elements and altitudesM 2/);
  throwsWith(() => a.dragCoefficient({ mach: [0, 1, 1], cd: [0.3, 0.5, 0.6] }, 0.5), Error, /^drag table point 2: Mach number must be above the previous point's, got 1$/);
  throwsWith(() => standard.scanFlight([0, 1, 1], [0, 10, 20], [0, 10, 20]), RangeError, /^flight sample point 2: time \(s\) must be after the previous sample's/);
  throwsWith(() => standard.scanFlight([0, 1], [0, 10, 20], [0, 10]), RangeError, /same length/);
  throwsWith(() => standard.scanFlight([0, 1], [0, 2e6], [0, 10]), RangeError, /^flight sample 1: geometric altitude 2000000 m is outside the allowed range/);
  throwsWith(() => standard.batch([0, 1], ["temperatureK", "temperatureK"]), Error, /^quantities\[1\]: temperatureK is listed twice$/);
});

test("a quantity the model does not define there is an Error naming the altitude", () => {
  // The standard defines no speed of sound in the free-molecular air above 86 km.
  throwsWith(() => standard.batch([0, 100000], ["speedOfSoundMS"]), Error, /^altitudesM\[1\]: speed of sound is not defined by the model at geometric altitude 100000 m$/);
  throwsWith(() => standard.batch([0, 2e6], ["temperatureK"]), RangeError, /^altitudesM\[1\]: geometric altitude 2000000 m is outside/);
});

test("the sounding's JSON form: syntax, shape and row errors", () => {
  throwsWith(() => AtmosphereModel.fromSoundingJson("{"), Error, /^sounding: not valid JSON: /);
  throwsWith(() => AtmosphereModel.fromSoundingJson(42), TypeError, /^sounding must be an object, got the number 42$/);
  throwsWith(() => AtmosphereModel.fromSoundingJson({ altitude: "geometric", rows: {} }), TypeError, /^sounding\.rows must be an array of objects/);
  throwsWith(() => AtmosphereModel.fromSoundingJson({ altitude: "geometric", rows: [{ altitude_m: 0 }] }), TypeError, /^sounding\.rows\[0\]\.temperature_k must be a number, got undefined$/);
  throwsWith(() => AtmosphereModel.fromSoundingJson({ altitude: "geometric", rows: [{ altitude_m: 0, temperature_k: 288, wind: 3 }] }), TypeError, /^sounding\.rows\[0\] has an unknown property "wind"/);
  throwsWith(() => AtmosphereModel.fromSoundingJson({ altitude: "metres", rows: [] }), RangeError, /^sounding\.altitude must be one of "geometric", "geopotential"/);
  throwsWith(() => AtmosphereModel.fromSoundingJson({ altitude: "geometric", rows: [], extra: 1 }), TypeError, /^sounding has an unknown property "extra"/);
  const rows = [{ altitude_m: 0, temperature_k: 288, pressure_pa: 1e5 }, { altitude_m: 1000, temperature_k: 281 }];
  throwsWith(() => AtmosphereModel.fromSoundingJson({ altitude: "geometric", rows, above: "blend" }), TypeError, /^sounding\.above must be "error" or \{"blend_into_us1976"/);
  throwsWith(() => AtmosphereModel.fromSoundingJson({ altitude: "geometric", rows, below: { blend_into_us1976: { depth_m: -5 } } }), RangeError, /^blend depth must be greater than 0 m, got -5 m$/);
});

test("freed models and foreign `this` throw Errors, not traps", () => {
  const m = AtmosphereModel.standard(5);
  m.free();
  assert.throws(() => m.state(0), (e) => e instanceof Error && !(e instanceof WebAssembly.RuntimeError));
  assert.throws(() => AtmosphereModel.prototype.state.call({}, 0), (e) => e instanceof Error && !(e instanceof WebAssembly.RuntimeError));
  // A second free is harmless.
  try {
    m.free();
  } catch (e) {
    assert.ok(!(e instanceof WebAssembly.RuntimeError));
  }
});

// --- garbage at every export ---

/** A small deterministic generator (xorshift32), so that a failure can be replayed. */
function generator(seed) {
  let x = seed >>> 0 || 1;
  return () => {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    return x / 4294967296;
  };
}

const throwingGetter = {
  get drag() {
    throw new Error("getter");
  },
};
const GARBAGE = [
  undefined,
  null,
  NaN,
  Infinity,
  -Infinity,
  -0,
  0,
  1,
  -1,
  1e308,
  -1e308,
  5e-324,
  86000,
  "",
  "12",
  "abc",
  "geometric",
  "pressure",
  true,
  false,
  {},
  [],
  [1, 2],
  [NaN],
  ["temperatureK"],
  { valueOf: () => 1 },
  Symbol("s"),
  10n,
  () => 1,
  new Float64Array(3),
  new Float64Array([0, 1, 2]),
  new Float32Array(2),
  { mach: [0, 1], cd: [0.3, 0.5] },
  { drag: 0.5, referenceAreaM2: 1 },
  { altitude: "geometric", rows: [] },
  { qnhPa: 101325 },
  throwingGetter,
  new Array(2 ** 24 + 1),
];

/** Plausible arguments for each export, so that one garbage argument reaches deep. */
const VALID = {
  dynamicPressurePa: [1.2, 100],
  dynamicPressureFromMachPa: [1e5, 0.8],
  dragN: [1e4, 0.5, 0.01],
  machNumber: [300, 340],
  velocityFromMachMS: [0.85, 295],
  reynoldsNumber: [1.2, 100, 1, 1.8e-5],
  knudsenNumber: [1e-7, 1],
  ballisticCoefficientKgM2: [4, 0.5, 0.01],
  rarefactionRegime: [0.5],
  dragCoefficient: [{ mach: [0, 1, 2], cd: [0.3, 0.6, 0.4] }, 1.5],
  isentropic: [2],
  areaRatio: [2],
  machFromPressureRatio: [0.5],
  machFromTemperatureRatio: [0.8],
  machFromDensityRatio: [0.6],
  machFromAreaRatio: [2, "supersonic"],
  normalShock: [2],
  impactPressureRatio: [0.5],
  impactPressurePa: [1e5, 0.5],
  machFromImpactPressureRatio: [0.3],
  airspeeds: [1e5, 288, "calibrated", 100],
  airspeedsAtPressureAltitude: [3000, 270, "mach", 0.5],
  pressureAltitudeM: [9e4],
  densityAltitudeM: [1.1],
  densityAltitudeFromM: [9e4, 290],
  barometricAltitudeM: [9e4, { padPressurePa: 98000 }],
  standardState: [1000, "geometric", 5],
  standardSpecies: [2e5],
  unitFactors: [],
  quantities: [],
  toUs: ["temperature", 288.15],
  fromUs: ["density", 0.002],
  version: [],
  parseValue: ["15C", "temperature"],
  modelGrammar: [],
  // Loaded above (so any source resolves at once: garbage must still not trap).
  loadUpper: [],
  upperLoaded: [],
  loadFull: [],
  fullLoaded: [],
  readFlightCsv: ["time,altitude_ft,velocity_ft_s\n0,0,0\n1,50,100\n"],
};
const STATIC = {
  standard: [5],
  exponential: [1.2, 8000, 280],
  isothermal: [250, 1e5],
  layered: [0, 288, 1e5, [11000, 20000], [-0.0065, 0]],
  tabulated: ["geometric", [0, 1000], [288, 281], { pressurePa: [1e5, null], blendAboveM: 1000 }],
  fromSpec: ["hydrostatic-offset=+15K"],
  hydrostaticOffset: [15, 101325],
  fromSoundingCsv: ["geometric_altitude_m,temperature_degC,pressure_hPa\n0,15,1013\n1000,8.5,\n"],
  fromSoundingJson: [{ altitude: "geometric", rows: [{ altitude_m: 0, temperature_k: 288, pressure_pa: 1e5 }, { altitude_m: 1000, temperature_k: 281 }] }],
};
const METHODS = {
  state: [1000, "geometric"],
  batch: [[0, 1000], ["temperatureK", "densityKgM3"], "geometric"],
  batchInto: [[0, 1000], { temperatureK: new Float64Array(2), densityKgM3: new Float64Array(2) }, "geometric"],
  altitudeOf: ["pressure", 5e4],
  terminalVelocityMS: [1000, 1, 1, 1.5, "geometric"],
  scanFlight: [[0, 1, 2], [0, 100, 300], [0, 150, 250], { drag: 0.5, referenceAreaM2: 0.01, referenceLengthM: 1 }],
  range: [],
};

function call(fn, args) {
  try {
    fn(...args);
    return "returned";
  } catch (e) {
    if (e instanceof WebAssembly.RuntimeError) {
      throw new Error(`trap: ${e.message}`);
    }
    if (!(e instanceof Error) || e.message === "") {
      throw new Error(`threw a non-Error or an empty message: ${String(e)}`);
    }
    return e.constructor.name;
  }
}

test("every export is covered by the garbage test", () => {
  const functions = Object.keys(a).filter(
    (k) => typeof a[k] === "function" && !["AtmosphereModel", "WindProfile"].includes(k) && !k.startsWith("init"),
  );
  assert.deepEqual(functions.filter((k) => !(k in VALID)), []);
  const statics = Object.getOwnPropertyNames(AtmosphereModel).filter((k) => typeof AtmosphereModel[k] === "function");
  assert.deepEqual(statics.filter((k) => !(k in STATIC) && !["__wrap"].includes(k)), []);
  const methods = Object.getOwnPropertyNames(AtmosphereModel.prototype).filter(
    (k) => typeof Object.getOwnPropertyDescriptor(AtmosphereModel.prototype, k).value === "function" && !["constructor", "free", "__destroy_into_raw"].includes(k) && typeof k === "string",
  );
  assert.deepEqual(methods.filter((k) => !(k in METHODS)), []);
});

test("the valid arguments of the garbage test are valid", () => {
  for (const [name, args] of Object.entries(VALID)) assert.equal(call(a[name], args), "returned", name);
  for (const [name, args] of Object.entries(STATIC)) assert.equal(call((...x) => AtmosphereModel[name](...x), args), "returned", name);
  for (const [name, args] of Object.entries(METHODS)) assert.equal(call((...x) => standard[name](...x), args), "returned", name);
});

test("garbage at every export throws Errors and never traps", () => {
  const random = generator(19761976);
  const pick = () => GARBAGE[Math.floor(random() * GARBAGE.length)];
  const models = Object.entries(STATIC)
    .map(([name, args]) => AtmosphereModel[name](...args))
    .filter((m) => m instanceof AtmosphereModel);
  const targets = [
    ...Object.entries(VALID).map(([name, args]) => [name, a[name], args]),
    ...Object.entries(STATIC).map(([name, args]) => [name, (...x) => AtmosphereModel[name](...x), args]),
    ...models.flatMap((m) => Object.entries(METHODS).map(([name, args]) => [`${m.kind}.${name}`, (...x) => m[name](...x), args])),
  ];
  let calls = 0;
  const outcomes = new Set();
  for (const [name, fn, valid] of targets) {
    const arity = Math.max(valid.length, 1) + 1;
    // Each position alone, with every garbage value, the others valid.
    for (let i = 0; i < arity; i++) {
      for (const g of GARBAGE) {
        const args = [...valid];
        args[i] = g;
        try {
          outcomes.add(call(fn, args));
        } catch (e) {
          assert.fail(`${name}(${i}: ${String(g)}): ${e.message}`);
        }
        calls++;
      }
    }
    // Then random combinations.
    for (let n = 0; n < 60; n++) {
      const args = Array.from({ length: arity }, () => (random() < 0.3 ? valid[Math.floor(random() * valid.length)] : pick()));
      try {
        outcomes.add(call(fn, args));
      } catch (e) {
        assert.fail(`${name}(${args.map(String).join(", ")}): ${e.message}`);
      }
      calls++;
    }
  }
  assert.ok(calls > 5000, `only ${calls} calls`);
  for (const expected of ["returned", "TypeError", "RangeError", "Error"]) assert.ok(outcomes.has(expected), expected);
  // And the module still works, with the same bits as before.
  assert.equal(AtmosphereModel.standard().state(0).pressurePa, 101325);
  assert.equal(a.standardState(11000, "geopotential").temperatureK, 216.65);
});

// The modules' own steps, which the package's entry does not export but either module's
// glue can call: loadUpper's step into the module (upper.rs), batchInto's two (batch.rs)
// and the start function (glue.js's guardFreed; called again it changes nothing).
test("garbage at each module's hidden steps throws Errors and never traps", () => {
  const tables = readFileSync(join(packageDir(), "node", "aerostrata_upper.bin"));
  for (const part of ["lite", "full"]) {
    const m = createRequire(import.meta.url)(join(packageDir(), "node", part, "aerostrata.js"));
    const model = m.AtmosphereModel.standard();
    const steps = {
      start: [() => m.__aerostrataStart(), []],
      __loadUpper: [(...x) => m.AtmosphereModel.__loadUpper(...x), [tables]],
      __batchPrepare: [(...x) => model.__batchPrepare(...x), [["temperatureK"], "geometric", 2]],
      __batchRun: [(...x) => model.__batchRun(...x), [0, 0]],
    };
    for (const [name, [fn, valid]] of Object.entries(steps)) {
      assert.equal(call(fn, valid), "returned", `${part} ${name}`);
      for (let i = 0; i <= valid.length; i++) {
        for (const g of GARBAGE) {
          const args = [...valid];
          args[i] = g;
          try {
            call(fn, args);
          } catch (e) {
            assert.fail(`${part} ${name}(${i}: ${String(g)}): ${e.message}`);
          }
        }
      }
    }
    assert.equal(model.state(0).pressurePa, 101325, part);
  }
});

test("garbage at WindProfile and in every option of scanFlight throws Errors and never traps", () => {
  const { WindProfile } = a;
  const statics = Object.getOwnPropertyNames(WindProfile).filter((k) => typeof WindProfile[k] === "function");
  assert.deepEqual(statics.filter((k) => !["fromSpeedDirection", "fromCsv", "__wrap"].includes(k)), []);
  const methods = Object.getOwnPropertyNames(WindProfile.prototype).filter(
    (k) => typeof Object.getOwnPropertyDescriptor(WindProfile.prototype, k).value === "function" && !["constructor", "free", "__destroy_into_raw"].includes(k),
  );
  assert.deepEqual(methods.sort(), ["at", "levels"]);
  const valid = [[0, 1000], [3, 6], [0, -2]];
  const winds = new WindProfile(...valid);
  const options = {
    timeS: [0, 1, 2],
    altitudeM: [0, 100, 300],
    velocityEastMS: [0, 1, 2],
    velocityNorthMS: [0, 1, 2],
    velocityUpMS: [10, 150, 250],
    axisElevationDeg: [89, 88, 87],
    axisAzimuthDeg: [0, 10, 20],
    vehicle: { drag: 0.5, referenceAreaM2: 0.01 },
    winds,
    boundaryLayer: "laminar",
    qLimitPa: 1000,
    qAlphaLimitPaDeg: 1000,
    plateauFraction: 0.1,
  };
  assert.equal(call(() => standard.scanFlight(options), []), "returned");
  const outcomes = new Set();
  for (const g of GARBAGE) {
    for (let i = 0; i < 3; i++) {
      const args = [...valid];
      args[i] = g;
      outcomes.add(call(() => new WindProfile(...args), []));
      outcomes.add(call(() => WindProfile.fromSpeedDirection(...args), []));
    }
    outcomes.add(call(() => WindProfile.fromCsv(g), []));
    outcomes.add(call(() => WindProfile.fromCsv("altitude_m,wind_east_m_s,wind_north_m_s\n0,1,2\n", g), []));
    outcomes.add(call(() => winds.at(g), []));
    for (const key of Object.keys(options)) {
      outcomes.add(call(() => standard.scanFlight({ ...options, [key]: g }), []));
    }
    const levels = { altitudeM: [0, 1000], windSpeedMS: [3, 6], windDirectionDeg: [0, 270] };
    for (const key of Object.keys(levels)) {
      outcomes.add(call(() => standard.scanFlight({ ...options, winds: { ...levels, [key]: g } }), []));
    }
    outcomes.add(call(() => standard.scanFlight({ ...options, extra: g }), []));
  }
  for (const expected of ["returned", "TypeError", "RangeError"]) assert.ok(outcomes.has(expected), expected);
  assert.equal(winds.levelCount, 2);
  winds.free();
});
