// The upper atmosphere (86 to 1000 km) as a separately loaded part: before `loadUpper`
// every call that needs its tables throws an Error that says what to call, and calls at
// or below 86 km are unaffected; a wrong file is refused with a message; after loading,
// the same calls give the standard's values (and the native core's bits: bits.mjs,
// through `cargo xtask wasm-test`, compares every upper vector). This file must load
// nothing before its first test: node --test runs each file in a process of its own.

import { test } from "node:test";
import assert from "node:assert/strict";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { pathToFileURL } from "node:url";

import { throwsWith } from "./expect.mjs";
import { loadNode, loadWeb, packageDir } from "./load.mjs";

const a = loadNode();
const { AtmosphereModel } = a;
const dir = packageDir();
const file = readFileSync(join(dir, "node", "aerostrata_upper.bin"));
const NOT_LOADED = /is above 86 km, whose upper-atmosphere tables are not loaded: call `await loadUpper\(\)` first/;

/** The calls that reach the tables: a state, species, an offset model, a flight scan and
 * a batch crossing 86 km, an inverse solved up there, a sounding's blend above its top;
 * the last two only with the full module loaded (`loadFull`). */
function callsAbove86Km(m = a) {
  const standard = m.AtmosphereModel.standard();
  const hot = m.AtmosphereModel.standard(15);
  const lite = {
    standardState: () => m.standardState(120000).pressurePa,
    state: () => standard.state(150000).densityKgM3,
    geopotential: () => standard.state(100000, "geopotential").temperatureK,
    species: () => m.standardSpecies(200000).nOM3,
    offsetModel: () => hot.state(100000).temperatureK,
    batch: () => standard.batch([80000, 90000], ["temperatureK"]).temperatureK[1],
    // 1e-6 Pa lies far above 86 km (0.37 Pa there; U.S. Standard Atmosphere 1976, Table I).
    altitudeOf: () => standard.altitudeOf("pressure", 1e-6),
  };
  if (!m.fullLoaded()) return lite;
  const sounding = m.AtmosphereModel.tabulated("geometric", [0, 30000], [288.15, 226.51], {
    // U.S. Standard Atmosphere 1976, Table I: 101 325 Pa at 0 m, 1197.0 Pa at 30 km (from memory).
    pressurePa: [101325, 1197],
    blendAboveM: 5000,
  });
  return {
    ...lite,
    sounding: () => sounding.state(100000).pressurePa,
    // A climb from 80 to 120 km at 1.5 km/s (invented); the standard model made by the
    // default module, made again in the full one for the scan.
    scanFlight: () => standard.scanFlight([0, 1, 2], [80000, 100000, 120000], [1500, 1500, 1500]).summary.samples,
  };
}

test("before loading: an Error that says to call loadUpper, at every path above 86 km", async () => {
  assert.equal(a.upperLoaded(), false);
  const lite = callsAbove86Km();
  // The default module's paths, then, with the full module loaded, every path of both.
  await a.loadFull();
  const all = callsAbove86Km();
  assert.ok(Object.keys(all).length > Object.keys(lite).length);
  for (const [name, call] of [...Object.entries(lite), ...Object.entries(all)]) {
    const e = throwsWith(call, Error, NOT_LOADED);
    assert.ok(!(e instanceof RangeError), name);
  }
  throwsWith(() => a.standardState(120000), Error, /^altitude 120 km is above 86 km/);
  throwsWith(() => AtmosphereModel.standard().batch([80000, 90000], ["temperatureK"]), Error, /^altitudesM\[1\]: altitude 90 km/);
  // At and below 86 km nothing changes; above 1000 km it is still the range's error.
  assert.ok(a.standardState(86000).pressurePa > 0);
  throwsWith(() => a.standardState(1.5e6), RangeError, /1500000 m is outside the allowed range -5000 to 1000000 m/);
});

test("a wrong file is refused with a message, and nothing is loaded", async () => {
  const cut = file.subarray(0, file.length - 8);
  const changed = Uint8Array.from(file);
  changed[4000] ^= 1;
  const cases = [
    [cut, /refused .*: its length is wrong/],
    [changed, /refused .*: its digest is not this build's/],
    [new TextEncoder().encode("<html>not found</html>"), /refused .*: it does not start as an aerostrata upper-atmosphere tables file does/],
    [join(dir, "node", "no_such_file.bin"), /^loadUpper: cannot read .*no_such_file\.bin/],
  ];
  for (const [source, pattern] of cases) {
    await assert.rejects(a.loadUpper(source), (e) => e.constructor === Error && pattern.test(e.message));
  }
  await assert.rejects(a.loadUpper(42), (e) => e instanceof TypeError && /loadUpper's source must be/.test(e.message));
  assert.equal(a.upperLoaded(), false);
  throwsWith(() => a.standardState(120000), Error, NOT_LOADED);
});

test("after loading: the same calls succeed with the standard's values", async () => {
  // Two calls at once share one load; a third after it costs nothing.
  await Promise.all([a.loadUpper(), a.loadUpper()]);
  await a.loadUpper();
  assert.equal(a.upperLoaded(), true);
  for (const [name, call] of Object.entries(callsAbove86Km())) {
    const value = call();
    assert.ok(Number.isFinite(value) && value > 0, `${name}: ${value}`);
  }
  // U.S. Standard Atmosphere 1976, Table I (tests/vectors/usa76_upper.csv): 120 km
  // 360.00 K and 2.5382E-03 Pa; 200 km n_O 4.050E+15 1/m^3; within half a unit of the
  // last printed digit.
  const s = a.standardState(120000);
  assert.ok(Math.abs(s.temperatureK - 360) <= 0.005, `${s.temperatureK}`);
  assert.ok(Math.abs(s.pressurePa - 2.5382e-3) <= 0.00005e-3, `${s.pressurePa}`);
  assert.ok(Math.abs(a.standardSpecies(200000).nOM3 - 4.05e15) <= 0.0005e15);
});

test("the web build loads from a URL, a path or bytes, with the Node build's bits", async () => {
  const web = await loadWeb();
  assert.equal(web.upperLoaded(), false);
  await web.loadUpper(pathToFileURL(join(dir, "web", "aerostrata_upper.bin")));
  assert.equal(web.upperLoaded(), true);
  await web.loadUpper(file.buffer.slice(file.byteOffset, file.byteOffset + file.length));
  for (const z of [86000.5, 91000, 110000, 150000, 500000, 1e6]) {
    assert.ok(Object.is(web.standardState(z).densityKgM3, a.standardState(z).densityKgM3), `${z}`);
  }
  // The full module loaded after the tables gets them too: every path, the Node build's bits.
  await web.loadFull(readFileSync(join(dir, "web", "full", "aerostrata_bg.wasm")));
  const node = callsAbove86Km();
  for (const [name, call] of Object.entries(callsAbove86Km(web))) {
    assert.ok(Object.is(call(), node[name]()), name);
  }
});
