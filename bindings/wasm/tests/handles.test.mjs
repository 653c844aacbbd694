// Misuse of the module's objects and its memory: a freed AtmosphereModel or WindProfile
// says it was freed (wasm-bindgen alone says "null pointer passed to rust"), a method
// called on a foreign `this` is a TypeError, a NaN time in the flight scan is a
// RangeError naming the sample in every form of the scan, and `batchInto` writes into
// the caller's arrays with the module's memory bounded by one chunk. The expected
// behaviour is the package's own contract (docs/js-guide.md; common practice, no source).

import { test } from "node:test";
import assert from "node:assert/strict";
import { createRequire } from "node:module";
import { readFileSync } from "node:fs";
import { join } from "node:path";

import { throwsWith } from "./expect.mjs";
import { loadNode, packageDir } from "./load.mjs";

const a = loadNode();
// Some checks go above 86 km: the upper atmosphere's tables first (upper.test.mjs shows
// the error without them).
await a.loadUpper();
await a.loadFull();
const { AtmosphereModel, WindProfile } = a;


/** The methods and getters of a class's prototype, but free and the constructor. */
function members(Class) {
  return Object.getOwnPropertyNames(Class.prototype).filter(
    (k) => k !== "constructor" && k !== "free" && !k.startsWith("__") && typeof k === "string",
  );
}

test("every method and getter of a freed model throws an Error saying it was freed", () => {
  const m = AtmosphereModel.standard(5);
  assert.equal(m.state(0).temperatureK, 293.15);
  m.free();
  const names = members(AtmosphereModel);
  for (const name of ["state", "batch", "batchInto", "range", "kind", "scanFlight", "altitudeOf", "terminalVelocityMS"]) {
    assert.ok(names.includes(name), `${name} is a member`);
  }
  for (const name of names) {
    const getter = Object.getOwnPropertyDescriptor(AtmosphereModel.prototype, name).get;
    const call = getter ? () => m[name] : () => m[name](0);
    throwsWith(call, Error, new RegExp(`^AtmosphereModel\\.${name}${getter ? "" : "\\(\\)"}: this model was freed \\(its free\\(\\) was called\\); make a new one$`));
  }
  // A second free does nothing; the model stays freed.
  m.free();
  throwsWith(() => m.state(0), Error, /was freed/);
  // Other models are untouched.
  assert.equal(AtmosphereModel.standard().state(0).pressurePa, 101325);
});

test("a freed wind profile says so, also when given to a scan", () => {
  const winds = new WindProfile([0, 1000], [5, 10], [0, 0]);
  assert.equal(winds.at(500).windEastMS, 7.5);
  winds.free();
  for (const name of members(WindProfile)) {
    const getter = Object.getOwnPropertyDescriptor(WindProfile.prototype, name).get;
    throwsWith(getter ? () => winds[name] : () => winds[name](0), Error, /: this wind profile was freed \(its free\(\) was called\); make a new one$/);
  }
  const climb = { timeS: [0, 1], altitudeM: [0, 100], velocityEastMS: [0, 0], velocityNorthMS: [0, 0], velocityUpMS: [100, 100] };
  throwsWith(() => AtmosphereModel.standard().scanFlight({ ...climb, winds }), Error, /^winds: this wind profile was freed/);
  winds.free();
});

test("a method called on a foreign `this` is a TypeError, not another object's memory", () => {
  const winds = new WindProfile([0, 1000], [5, 10], [0, 0]);
  throwsWith(() => AtmosphereModel.prototype.state.call({}, 0), TypeError, /^AtmosphereModel\.state\(\): called on something that is not an AtmosphereModel$/);
  throwsWith(() => AtmosphereModel.prototype.state.call(winds, 0), TypeError, /not an AtmosphereModel/);
  throwsWith(() => WindProfile.prototype.at.call(AtmosphereModel.standard(), 0), TypeError, /not a WindProfile/);
  assert.equal(winds.at(0).windEastMS, 5, "the profile survives");
  winds.free();
});

test("a NaN time is a RangeError naming the sample, in every form of the scan", () => {
  const m = AtmosphereModel.standard();
  const z = [0, 100, 200];
  const forms = {
    positional: (t) => m.scanFlight(t, z, [10, 20, 30]),
    speeds: (t) => m.scanFlight({ timeS: t, altitudeM: z, velocityMS: [10, 20, 30] }),
    components: (t) => m.scanFlight({ timeS: t, altitudeM: z, velocityEastMS: [0, 0, 0], velocityNorthMS: [0, 0, 0], velocityUpMS: [10, 20, 30] }),
    path: (t) => m.scanFlight({ timeS: t, altitudeM: z, velocityMS: [10, 20, 30], flightPathAngleDeg: [80, 80, 80], headingDeg: [0, 0, 0] }),
    limits: (t) => m.scanFlight({ timeS: t, altitudeM: z, velocityMS: [10, 20, 30], qLimitPa: 100 }),
  };
  for (const [form, scan] of Object.entries(forms)) {
    for (const [i, t] of [[0, [NaN, 1, 2]], [1, [0, NaN, 2]], [2, [0, 1, NaN]], [1, new Float64Array([0, NaN, 2])]]) {
      const e = throwsWith(() => scan(t), RangeError, new RegExp(`^flight sample point ${i}: time \\(s\\) .*got NaN$`));
      assert.ok(e.message.length > 0, form);
    }
    throwsWith(() => scan([0, Infinity, 2]), RangeError, /^flight sample point 1: time/);
  }
});

const STATE = ["temperatureK", "pressurePa", "densityKgM3", "speedOfSoundMS", "dynamicViscosityPaS"];

test("batchInto writes the bits of batch into the caller's arrays, across chunks", () => {
  const m = AtmosphereModel.standard();
  // 40 000 altitudes: three chunks of 16 384 (the last one short).
  const n = 40_000;
  const altitudes = Float64Array.from({ length: n }, (_, i) => -5000 + i * 2.0);
  const outputs = Object.fromEntries(STATE.map((k) => [k, new Float64Array(n).fill(-1)]));
  assert.equal(m.batchInto(altitudes, outputs), outputs, "returns the outputs object");
  const expected = m.batch(altitudes, STATE);
  for (const k of STATE) {
    assert.deepEqual(new Uint8Array(outputs[k].buffer), new Uint8Array(expected[k].buffer), k);
  }
  // An array of numbers, geopotential altitudes, a subarray view of a larger buffer.
  const big = new Float64Array(10).fill(-1);
  const view = big.subarray(4, 7);
  m.batchInto([0, 11000, 20000], { temperatureK: view }, "geopotential");
  assert.deepEqual(Array.from(big), [-1, -1, -1, -1, 288.15, 216.65, 216.65, -1, -1, -1]);
  // No altitudes: nothing to write.
  assert.deepEqual(m.batchInto([], { pressurePa: new Float64Array(0) }).pressurePa.length, 0);
});

// The Float64Array path of batchInto (batch.rs's buffer in the module's memory) in the
// cases the tests above give as arrays of numbers; the layer temperatures are the 1976
// standard's (Table 4: 288.15 K at sea level, 216.65 K from 11 km geopotential).
test("batchInto through the module's buffer: views, kinds, models side by side, reuse after an error", () => {
  const m = AtmosphereModel.standard();
  const hot = AtmosphereModel.standard(15);
  // Altitudes and outputs that are views into larger buffers (byteOffset not 0).
  const store = new Float64Array([-1, 0, 11000, 20000, -1]);
  const big = new Float64Array(10).fill(-1);
  m.batchInto(store.subarray(1, 4), { temperatureK: big.subarray(4, 7) }, "geopotential");
  assert.deepEqual(Array.from(big), [-1, -1, -1, -1, 288.15, 216.65, 216.65, -1, -1, -1]);
  // Two models with their own buffers and quantities, called in turn.
  const z = Float64Array.from({ length: 20_000 }, (_, i) => i * 4.0);
  const a = { pressurePa: new Float64Array(z.length) };
  const b = { densityKgM3: new Float64Array(z.length), temperatureK: new Float64Array(z.length) };
  m.batchInto(z, a);
  hot.batchInto(z, b);
  m.batchInto(z.subarray(0, 3), { pressurePa: a.pressurePa.subarray(0, 3) });
  for (const i of [0, 16_383, 16_384, 19_999]) {
    assert.ok(Object.is(a.pressurePa[i], m.state(z[i]).pressurePa), `standard p at ${z[i]}`);
    assert.ok(Object.is(b.densityKgM3[i], hot.state(z[i]).densityKgM3), `ISA+15 rho at ${z[i]}`);
    assert.ok(Object.is(b.temperatureK[i], hot.state(z[i]).temperatureK), `ISA+15 T at ${z[i]}`);
  }
  // The errors of the arrays-of-numbers path, and the buffer still usable after each.
  throwsWith(() => m.batchInto(new Float64Array([0, 90000]), { speedOfSoundMS: new Float64Array(2) }), Error, /^altitudesM\[1\]: speed of sound is not defined/);
  throwsWith(() => m.batchInto(new Float64Array([0, NaN]), { pressurePa: new Float64Array(2) }), RangeError, /^altitudesM\[1\]: geometric altitude must be a finite number/);
  throwsWith(() => m.batchInto(new Float64Array(1), { pressurePa: new Float64Array(1) }, "sideways"), RangeError, /altitudeKind must be one of/);
  throwsWith(() => m.batchInto(new Float64Array(0), { pressurePa: new Float64Array(0) }, "sideways"), RangeError, /altitudeKind must be one of/);
  const after = { speedOfSoundMS: new Float64Array(1) };
  m.batchInto(new Float64Array([0]), after);
  assert.equal(after.speedOfSoundMS[0], m.state(0).speedOfSoundMS);
  assert.equal(m.batchInto(new Float64Array(0), { pressurePa: new Float64Array(0) }).pressurePa.length, 0);
  // A step called out of turn is an Error, not a trap (the default module's own model:
  // the package's entry does not give the step).
  const liteModule = createRequire(import.meta.url)(join(packageDir(), "node", "lite", "aerostrata.js"));
  throwsWith(() => liteModule.AtmosphereModel.standard().__batchRun(5, 0), Error, /^batchInto: a chunk larger than its buffer/);
  m.free();
  hot.free();
});

test("batchInto's errors name the argument and the global index", () => {
  const m = AtmosphereModel.standard();
  const n = 20_000;
  const altitudes = new Float64Array(n).fill(1000);
  altitudes[17_000] = 2e7; // in the second chunk
  const out = new Float64Array(n);
  throwsWith(() => m.batchInto(altitudes, { temperatureK: out }), RangeError, /^altitudesM\[17000\]: geometric altitude 20000000 m is outside/);
  assert.equal(out[0], m.state(1000).temperatureK, "the first chunk was written (not all or nothing)");
  assert.equal(out[19_999], 0, "nothing after the failing chunk");
  throwsWith(() => m.batchInto([0, 90000], { speedOfSoundMS: new Float64Array(2) }), Error, /^altitudesM\[1\]: speed of sound is not defined/);
  throwsWith(() => m.batchInto([0, "1"], { pressurePa: new Float64Array(2) }), TypeError, /^altitudesM\[1\] must be a number, got the string "1"$/);
  throwsWith(() => m.batchInto("0", { pressurePa: new Float64Array(1) }), TypeError, /^altitudesM must be a Float64Array or an array of numbers/);
  throwsWith(() => m.batchInto([0, 1], { pressurePa: new Float64Array(3) }), RangeError, /^outputs\.pressurePa has 3 elements and altitudesM 2; they must have the same length$/);
  throwsWith(() => m.batchInto([0], { pressurePa: [0] }), TypeError, /^outputs\.pressurePa must be a Float64Array, got an array$/);
  throwsWith(() => m.batchInto([0], { pressure: new Float64Array(1) }), TypeError, /^outputs has an unknown property "pressure"/);
  throwsWith(() => m.batchInto([0], {}), RangeError, /^outputs lists 0 names; the allowed range is 1 to 20$/);
  throwsWith(() => m.batchInto([0], null), TypeError, /^outputs must be an object of Float64Arrays, got null$/);
  throwsWith(() => m.batchInto([0], { pressurePa: new Float64Array(1) }, "sideways"), RangeError, /altitudeKind must be one of/);
});

test("batchInto holds one chunk in the module's memory; batch holds the whole result", async () => {
  // The web build, instantiated here, so that its memory can be measured.
  const dir = packageDir();
  const web = await import(join(dir, "web", "aerostrata.js"));
  const wasm = web.initSync({ module: readFileSync(join(dir, "web", "aerostrata_bg.wasm")) });
  const memory = () => wasm.memory.buffer.byteLength;
  const m = web.AtmosphereModel.standard();
  const n = 300_000;
  const keys = web.quantities().filter((q) => q.group === "state").map((q) => q.key);
  assert.equal(keys.length, 20);
  const altitudes = Float64Array.from({ length: n }, (_, i) => (i % 80_000) + 0.5);
  const outputs = Object.fromEntries(keys.map((k) => [k, new Float64Array(n)]));
  // The continuum quantities are defined below 86 km, so all 20 can be asked.
  const before = memory();
  m.batchInto(altitudes, outputs);
  const grewInto = memory() - before;
  const values = n * keys.length * 8; // 48 MB
  assert.ok(grewInto < 16 * 2 ** 20, `batchInto grew the module's memory by ${grewInto} bytes`);
  const start = memory();
  const result = m.batch(altitudes, keys);
  const grewBatch = memory() - start;
  // The control: the same measure sees batch hold the whole result.
  assert.ok(grewBatch > values / 2, `batch grew it by ${grewBatch} bytes for ${values} bytes of values`);
  assert.deepEqual(new Uint8Array(result.densityKgM3.buffer), new Uint8Array(outputs.densityKgM3.buffer));
  console.log(`# module memory growth for ${n} x 20 values: batchInto ${grewInto} bytes, batch ${grewBatch} bytes`);
});
