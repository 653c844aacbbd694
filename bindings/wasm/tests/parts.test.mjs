// The package's two modules behind one API (js/parts.js): before `loadFull` every member
// only the full module has throws an Error that says to call it, and every member of the
// default module works; after it, models the default module made are made again in the
// full module for its methods, with the bits of models the full module makes itself. This
// file must load nothing before its first test: node --test runs each file in a process
// of its own.

import { test } from "node:test";
import assert from "node:assert/strict";
import { createRequire } from "node:module";
import { readFileSync } from "node:fs";
import { join } from "node:path";

import { throwsWith } from "./expect.mjs";
import { loadNode, loadWeb, packageDir } from "./load.mjs";

const dir = packageDir();
const a = loadNode();
const { AtmosphereModel, WindProfile } = a;
const NOT_LOADED = /^(.*) is in the full part of the module, which is not loaded: call `await loadFull\(\)` first/;

// What each module's glue exports (the modules themselves, as the entry reaches them).
const modules = Object.fromEntries(
  ["lite", "full"].map((part) => [part, createRequire(import.meta.url)(join(dir, "node", part, "aerostrata.js"))]),
);
const publicNames = (object) => Object.getOwnPropertyNames(object).filter((k) => !k.startsWith("__") && !["length", "name", "prototype", "constructor", "free"].includes(k));

/** Calls `f` and returns what it threw (or undefined). */
function thrown(f) {
  try {
    f();
  } catch (e) {
    return e;
  }
  return undefined;
}

test("the default module is the smaller one and lacks only what the full module adds", () => {
  const { lite, full } = modules;
  const functions = (m) => Object.keys(m).filter((k) => typeof m[k] === "function" && !k.startsWith("__") && !["AtmosphereModel", "WindProfile"].includes(k));
  // Every export of the default module is the full module's too.
  assert.deepEqual(functions(lite).filter((f) => !functions(full).includes(f)), []);
  assert.deepEqual(publicNames(lite.AtmosphereModel).filter((k) => !publicNames(full.AtmosphereModel).includes(k)), []);
  assert.equal(lite.WindProfile, undefined);
  // The default module has the standard, the batch, the catalogue and point loads.
  for (const f of ["standardState", "standardSpecies", "quantities", "toUs", "fromUs", "unitFactors", "dynamicPressurePa", "dragN", "machNumber", "reynoldsNumber", "version", "upperLoaded"]) {
    assert.ok(functions(lite).includes(f), f);
  }
  const size = (part) => readFileSync(join(dir, "node", part === "lite" ? "" : part, "aerostrata_bg.wasm")).length;
  assert.ok(size("lite") < size("full") / 2, `${size("lite")} and ${size("full")} bytes`);
});

test("before loadFull: the full module's members throw an Error that says to call it; the default module's work", () => {
  assert.equal(a.fullLoaded(), false);
  const { lite, full } = modules;
  const liteFunctions = Object.keys(lite);
  let refused = 0;
  for (const name of Object.keys(full).filter((k) => typeof full[k] === "function" && !k.startsWith("__") && !["AtmosphereModel", "WindProfile", "loadUpper"].includes(k))) {
    const e = thrown(() => a[name]());
    if (liteFunctions.includes(name)) {
      assert.ok(e === undefined || !NOT_LOADED.test(e.message), `${name}: ${e?.message}`);
    } else {
      assert.ok(e instanceof Error && !(e instanceof TypeError) && NOT_LOADED.exec(e.message)[1] === `${name}()`, `${name}: ${e?.message}`);
      refused++;
    }
  }
  const standard = AtmosphereModel.standard(15);
  for (const key of publicNames(full.AtmosphereModel)) {
    const e = thrown(() => AtmosphereModel[key]());
    if (key in lite.AtmosphereModel) {
      assert.ok(e === undefined || !NOT_LOADED.test(e.message), `${key}: ${e?.message}`);
    } else {
      assert.equal(NOT_LOADED.exec(e?.message)?.[1], `AtmosphereModel.${key}()`, key);
      refused++;
    }
  }
  for (const key of publicNames(full.AtmosphereModel.prototype)) {
    const e = thrown(() => standard[key]());
    if (key in lite.AtmosphereModel.prototype) {
      assert.ok(e === undefined || !NOT_LOADED.test(e.message), `${key}: ${e?.message}`);
    } else {
      assert.equal(NOT_LOADED.exec(e?.message)?.[1], `AtmosphereModel.${key}()`, key);
      refused++;
    }
  }
  throwsWith(() => new WindProfile([0, 1000], [1, 2], [3, 4]), Error, /^new WindProfile\(\) is in the full part/);
  throwsWith(() => WindProfile.fromCsv(""), Error, /^WindProfile\.fromCsv\(\) is in the full part/);
  // The full module's own, each named: 20 functions (compressible flow, airspeeds,
  // altimetry, drag tables, the readers), AtmosphereModel's 7 other models and its
  // scanFlight and terminalVelocityMS. A member moved between the modules changes it.
  assert.equal(refused, 29);
  // The default module's own members, with their values: U.S. Standard Atmosphere 1976,
  // Table I, 11 km geopotential: 216.65 K (from memory).
  assert.equal(a.standardState(11000, "geopotential").temperatureK, 216.65);
  assert.equal(AtmosphereModel.standard().batch([0], ["pressurePa"]).pressurePa[0], 101325);
  assert.equal(a.dynamicPressurePa(1.25, 100), 6250); // q = rho V^2 / 2, exact in binary
  assert.equal(standard.kind, "standard");
  assert.equal(AtmosphereModel.hydrostaticOffset(15).kind, "hydrostaticOffset");
});

test("a Node loadFull takes no source; a web loadFull that fails can be tried again", async () => {
  await assert.rejects(a.loadFull("full.wasm"), (e) => e instanceof TypeError && /loadFull takes no source in Node/.test(e.message));
  assert.equal(a.fullLoaded(), false);
  const web = await loadWeb();
  await assert.rejects(web.loadFull(join(dir, "web", "no_such_file.wasm")), (e) => e.constructor === Error && /^loadFull: cannot read .*no_such_file\.wasm/.test(e.message));
  await assert.rejects(web.loadFull(42), (e) => e instanceof TypeError && /loadFull's source must be/.test(e.message));
  await assert.rejects(web.loadFull(new TextEncoder().encode("<html>not found</html>")), WebAssembly.CompileError);
  assert.equal(web.fullLoaded(), false);
  throwsWith(() => web.parseValue("15 C", "temperature"), Error, NOT_LOADED);
  // The file beside the entry, found from its URL (read from disk under Node).
  await Promise.all([web.loadFull(), web.loadFull()]);
  assert.equal(web.fullLoaded(), true);
  assert.equal(web.parseValue("15 C", "temperature").si, 288.15);
});

test("after loadFull: models the default module made give the full module's bits in its methods", async () => {
  // Made before loading, used after.
  const hot = AtmosphereModel.standard(15);
  const balanced = AtmosphereModel.hydrostaticOffset(-10, 100000);
  await Promise.all([a.loadFull(), a.loadFull()]);
  assert.equal(a.fullLoaded(), true);
  // The same models as the full module makes them (specs go only to the full module).
  const fullHot = AtmosphereModel.fromSpec("offset=15");
  const fullBalanced = AtmosphereModel.fromSpec("hydrostatic-offset=-10,p0=100000");
  // An invented climb: 0 to 20 km in 60 s, accelerating to 900 m/s.
  const time = Float64Array.from({ length: 61 }, (_, i) => i);
  const altitude = time.map((t) => (20000 * t * t) / 3600);
  const velocity = time.map((t) => 15 * t);
  const vehicle = { drag: { mach: [0, 0.8, 1.2, 3], cd: [0.3, 0.35, 0.6, 0.4] }, referenceAreaM2: 0.0123, referenceLengthM: 2.4 };
  for (const [mine, theirs] of [[hot, fullHot], [balanced, fullBalanced]]) {
    const scan = mine.scanFlight(time, altitude, velocity, vehicle);
    const expected = theirs.scanFlight(time, altitude, velocity, vehicle);
    assert.deepEqual(scan, expected);
    assert.ok(Object.is(scan.summary.maxDynamicPressure.dynamicPressurePa, expected.summary.maxDynamicPressure.dynamicPressurePa));
    assert.ok(Object.is(mine.terminalVelocityMS(3000, 20, 0.3, 1.5), theirs.terminalVelocityMS(3000, 20, 0.3, 1.5)));
    // And the default module's own methods still give the same bits as the full module's.
    assert.ok(Object.is(mine.state(12345).densityKgM3, theirs.state(12345).densityKgM3));
  }
  // A lite model made after loading is still the default module's (made again when needed).
  const later = AtmosphereModel.standard(15);
  assert.deepEqual(later.scanFlight(time, altitude, velocity), fullHot.scanFlight(time, altitude, velocity));
  // Freed: both of its objects, and every method says so.
  hot.free();
  hot.free();
  throwsWith(() => hot.scanFlight(time, altitude, velocity), Error, /^AtmosphereModel\.scanFlight\(\): this model was freed/);
  throwsWith(() => hot.state(0), Error, /^AtmosphereModel\.state\(\): this model was freed/);
  throwsWith(() => AtmosphereModel.prototype.state.call({}, 0), TypeError, /^AtmosphereModel\.state\(\): called on something that is not an AtmosphereModel$/);
  assert.ok(fullHot instanceof AtmosphereModel && hot instanceof AtmosphereModel);
  throwsWith(() => new AtmosphereModel(), TypeError, /^AtmosphereModel has no constructor: make one with its static methods/);
  // WindProfile, the full module's alone, once loaded.
  const winds = new WindProfile([0, 1000], [3, 6], [0, -2]);
  assert.equal(winds.levelCount, 2);
  assert.ok(winds instanceof WindProfile);
});
