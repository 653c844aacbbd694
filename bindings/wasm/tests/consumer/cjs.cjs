// A Node CommonJS project using the installed package: `require` by the package's name.
// Run by `cargo xtask npm-check` inside a fresh project that installed the packed
// tarball. Prints one line, "cjs: ...", and exits 1 on any failed check.
//
// Sources: U.S. Standard Atmosphere 1976, Table I at 0 m (288.150 K, 1.01325E+05 Pa);
// q = rho V^2 / 2 at 1.225 kg/m^3 and 100 m/s is 6125 Pa (hand-worked); Table I at
// 120 km, 360.00 K; 15 degC is 288.15 K (the definition of the Celsius scale).

"use strict";
const assert = require("node:assert/strict");
const path = require("node:path");

const { AtmosphereModel, dynamicPressurePa, fullLoaded, loadFull, loadUpper, parseValue, standardState, upperLoaded, version } = require("aerostrata");

const entry = require.resolve("aerostrata");
assert.ok(entry.startsWith(path.join(process.cwd(), "node_modules", "aerostrata") + path.sep), entry);

const sea = standardState(0);
assert.ok(Math.abs(sea.temperatureK - 288.15) <= 0.0005, `${sea.temperatureK}`);
assert.ok(Math.abs(sea.pressurePa - 101325) <= 0.5, `${sea.pressurePa}`);
const hot = AtmosphereModel.standard(15);
// A temperature offset keeps the standard's pressure (docs/models.md).
const hotSea = hot.state(0);
hot.free();
assert.ok(Math.abs(hotSea.temperatureK - 303.15) <= 0.0005, `${hotSea.temperatureK}`);
assert.ok(Math.abs(hotSea.pressurePa - 101325) <= 0.5, `${hotSea.pressurePa}`);
// 1.225 has no exact binary form: within 1e-12 relative.
assert.ok(Math.abs(dynamicPressurePa(1.225, 100) / 6125 - 1) < 1e-12);
// The upper atmosphere: an Error that says what to call, then read from the installed
// package's aerostrata_upper.bin beside the module.
assert.throws(() => standardState(120000), /call `await loadUpper\(\)` first/);
// The full module likewise (parseValue is the full module's).
assert.throws(() => parseValue("15 C", "temperature"), /call `await loadFull\(\)` first/);
Promise.all([loadUpper(), loadFull()]).then(
  () => {
    assert.ok(upperLoaded() && fullLoaded());
    assert.ok(Math.abs(standardState(120000).temperatureK - 360) <= 0.005);
    assert.equal(parseValue("15 C", "temperature").si, 288.15);
    console.log(`cjs: aerostrata ${version()} from ${entry}: sea level ${sea.temperatureK} K, ${sea.pressurePa} Pa; upper and full parts loaded`);
  },
  (error) => {
    console.error(`cjs: ${error}`);
    process.exit(1);
  },
);
