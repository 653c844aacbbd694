// A Node ES-module project using the installed package: `import` by the package's name.
// Run by `cargo xtask npm-check` inside a fresh project that installed the packed
// tarball. Prints one line, "esm: ...", and exits 1 on any failed check.
//
// Sources: U.S. Standard Atmosphere 1976, Table I at 0 m (288.150 K, 1.01325E+05 Pa,
// 1.2250 kg/m^3) and at 11 000 m geopotential (216.650 K, 2.2632E+04 Pa); q = rho V^2 / 2
// at 1.225 kg/m^3 and 100 m/s is 6125 Pa (hand-worked); Table I at 120 km, 360.00 K;
// 15 degC is 288.15 K (the definition of the Celsius scale).

import assert from "node:assert/strict";
import { fileURLToPath } from "node:url";

import { AtmosphereModel, dynamicPressurePa, fullLoaded, loadFull, loadUpper, parseValue, standardState, upperLoaded, version } from "aerostrata";

// The package is the installed one, not a checkout's build.
const entry = fileURLToPath(import.meta.resolve("aerostrata"));
assert.ok(entry.startsWith(`${process.cwd()}/node_modules/aerostrata/`), entry);

const sea = standardState(0);
assert.ok(Math.abs(sea.temperatureK - 288.15) <= 0.0005, `${sea.temperatureK}`);
assert.ok(Math.abs(sea.pressurePa - 101325) <= 0.5, `${sea.pressurePa}`);
assert.ok(Math.abs(sea.densityKgM3 - 1.225) <= 0.00005, `${sea.densityKgM3}`);
const model = AtmosphereModel.standard();
const tropopause = model.state(11000, "geopotential");
model.free();
assert.ok(Math.abs(tropopause.temperatureK - 216.65) <= 0.0005, `${tropopause.temperatureK}`);
assert.ok(Math.abs(tropopause.pressurePa - 22632) <= 0.5, `${tropopause.pressurePa}`);
// 1.225 has no exact binary form: within 1e-12 relative.
assert.ok(Math.abs(dynamicPressurePa(1.225, 100) / 6125 - 1) < 1e-12);
assert.throws(() => standardState(2e6), RangeError);
// The upper atmosphere: an Error that says what to call, then read from the installed
// package's aerostrata_upper.bin beside the module. Table I at 120 km: 360.00 K.
assert.throws(() => standardState(120000), /call `await loadUpper\(\)` first/);
await loadUpper();
assert.ok(upperLoaded());
assert.ok(Math.abs(standardState(120000).temperatureK - 360) <= 0.005);
// The full module: an Error that says what to call, then read from the installed
// package's full/aerostrata_bg.wasm; a model the default module made scans a flight.
assert.throws(() => parseValue("15 C", "temperature"), /call `await loadFull\(\)` first/);
const early = AtmosphereModel.standard();
await loadFull();
assert.ok(fullLoaded());
assert.equal(parseValue("15 C", "temperature").si, 288.15);
assert.equal(early.scanFlight([0, 1], [0, 100], [0, 100]).summary.samples, 2);
console.log(`esm: aerostrata ${version()} from ${entry}: sea level ${sea.temperatureK} K, ${sea.pressurePa} Pa; upper and full parts loaded`);
