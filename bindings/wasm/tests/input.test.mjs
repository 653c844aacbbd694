// The module's readers: a typed value, a model spec, a sounding and a flight file mean in
// the browser what they mean on the command line (the core's own readers behind them).

import { test } from "node:test";
import assert from "node:assert/strict";

import { loadNode } from "./load.mjs";

const a = loadNode();
await a.loadFull();
const { AtmosphereModel } = a;

test("a value with its unit reads in SI; a bare one in the unit given", () => {
  // 0 degC = 273.15 K, 1 ft = 0.3048 m, 1 inHg = 3386.389 Pa (common practice, no source).
  assert.deepEqual(a.parseValue("15C", "temperature"), { si: 288.15, value: 15, unit: "degC", explicit: true });
  assert.equal(a.parseValue(" 288.15 ", "temperatureK").si, 288.15);
  assert.equal(a.parseValue("35000ft", "geometric_altitude").si, 35000 * 0.3048);
  assert.equal(a.parseValue("1020", "altimeter_setting", "hPa").si, 102000);
  assert.equal(a.parseValue("29.92inHg", "altimeter_setting").si, 29.92 * 3386.389);
  // A temperature offset is a difference: 27 degF of difference is 15 K.
  assert.equal(a.parseValue("+27F", "temperature_offset").si, 15);
  const explicit = a.parseValue("20", "temperature", "degC");
  assert.equal(explicit.explicit, false);
  assert.equal(explicit.unit, "degC");
});

test("an ordinary number in the wrong unit is refused with the fix, never misread", () => {
  // 15 taken as kelvin, 1020 as pascals: the mix-ups this reader exists to stop.
  assert.throws(() => a.parseValue("15", "temperature"), (e) => e instanceof RangeError && /15/.test(e.message) && /degC/.test(e.message));
  assert.throws(() => a.parseValue("1020", "altimeter_setting"), (e) => e instanceof RangeError && /1020/.test(e.message) && /hPa/.test(e.message));
  assert.throws(() => a.parseValue("1013,25hPa", "altimeter_setting"), /decimals with a point/);
  assert.throws(() => a.parseValue("15 m", "temperature"), /unit of length, not of temperature/);
  assert.throws(() => a.parseValue("15", "temperature", "furlong"), /'furlong' is not a unit of temperature; one of K/);
  assert.throws(() => a.parseValue("15", "no_such_quantity"), RangeError);
  assert.throws(() => a.parseValue(15, "temperature"), TypeError);
  // A control character in the text is shown escaped, not written into the message.
  assert.throws(() => a.parseValue("1\u0007", "temperature"), (e) => e.message.includes("\\u{7}"));
});

test("model specs read as the command line reads them", () => {
  assert.match(a.modelGrammar(), /hydrostatic-offset/);
  const hot = AtmosphereModel.fromSpec("hydrostatic-offset=+15K");
  assert.equal(hot.kind, "hydrostaticOffset");
  // At sea level the offset day has the given pressure and the shifted temperature.
  assert.equal(hot.state(0, "geopotential").pressurePa, 101325);
  assert.equal(hot.state(0, "geopotential").temperatureK, 303.15);
  const same = AtmosphereModel.hydrostaticOffset(15);
  assert.equal(hot.state(5000).pressurePa, same.state(5000).pressurePa);
  // The plain offset day keeps the standard's pressure; the hydrostatic one does not.
  const plain = AtmosphereModel.fromSpec("offset=+27F");
  assert.equal(plain.state(5000).pressurePa, AtmosphereModel.standard().state(5000).pressurePa);
  assert.ok(hot.state(5000).pressurePa > plain.state(5000).pressurePa);
  // 15 is a plausible offset in kelvins; 150 is not, in any unit.
  assert.equal(AtmosphereModel.fromSpec("offset=15").state(0).temperatureK, 303.15);
  assert.throws(() => AtmosphereModel.fromSpec("offset=150"), /offset/);
  assert.throws(() => AtmosphereModel.fromSpec("tropical"), /unknown model 'tropical'; a model is one of/);
  assert.throws(() => AtmosphereModel.fromSpec("sounding=site.csv"), /fromSoundingCsv/);
});

const SOUNDING = `# an invented morning sounding over a desert range
geometric_altitude_ft,temperature (degC),Pressure [hPa],wind_speed_kt
0,15,1013.25,5
3000,9,,12
10000,-5,,20
`;

test("a sounding's text reads with its headings' units, unknown columns kept out", () => {
  const model = AtmosphereModel.fromSoundingCsv(SOUNDING);
  assert.equal(model.kind, "tabulated");
  const ground = model.state(0);
  assert.equal(ground.temperatureK, 288.15);
  assert.equal(ground.pressurePa, 101325);
  assert.equal(model.state(3000 * 0.3048).temperatureK, 282.15);
  // The same table with bare headings, read in US units.
  const us = AtmosphereModel.fromSoundingCsv("geometric_altitude,temperature,pressure\n0,59,2116.2167\n3000,48.2,\n", "us");
  assert.ok(Math.abs(us.state(0).temperatureK - 288.15) < 1e-12);
});

test("a sounding with a unit mix-up is refused at its line and column, with the fix", () => {
  const kelvinInCelsius = "geometric_altitude_m,temperature_degC,pressure_hPa\n0,288.15,1013.25\n1000,281.65,\n";
  assert.throws(
    () => AtmosphereModel.fromSoundingCsv(kelvinInCelsius),
    (e) => /line 2, column 2 \(temperature_degC\), value '288.15'/.test(e.message) && /head it/.test(e.message),
  );
  const pascalsInHecto = "geometric_altitude_m,temperature_degC,pressure_hPa\n0,15,101325\n1000,8.5,\n";
  assert.throws(() => AtmosphereModel.fromSoundingCsv(pascalsInHecto), /line 2, column 3/);
  assert.throws(() => AtmosphereModel.fromSoundingCsv("geometric_altitude_m,temperature_degC\n"), Error);
  assert.throws(() => AtmosphereModel.fromSoundingCsv(""), Error);
});

test("a flight file reads in SI whatever its headings' units, other columns listed", () => {
  const text = "time (s),altitude_ft,velocity [ft/s],note\n0,0,0,pad\n1,100,200,\n2,400,400,burnout\n";
  const samples = a.readFlightCsv(text);
  assert.deepEqual([...samples.timeS], [0, 1, 2]);
  assert.deepEqual([...samples.altitudeM], [0, 100 * 0.3048, 400 * 0.3048]);
  assert.deepEqual([...samples.velocityMS], [0, 200 * 0.3048, 400 * 0.3048]);
  assert.deepEqual(samples.ignored, ["note"]);
  const us = a.readFlightCsv("time,altitude,velocity\n0,0,0\n1,100,200\n", "us");
  assert.deepEqual([...us.altitudeM], [0, 100 * 0.3048]);
  // And the samples scan as the command line scans them.
  const flight = AtmosphereModel.standard().scanFlight(samples.timeS, samples.altitudeM, samples.velocityMS);
  assert.equal(flight.points.timeS.length, 3);
});

test("a flight file that cannot be read is refused at its line", () => {
  assert.throws(() => a.readFlightCsv("time,altitude\n0,0\n"), /line 1: the header needs the velocity/);
  assert.throws(() => a.readFlightCsv("time,altitude,velocity\n0,0,0\n1,x,2\n"), /line 3: column 2/);
  assert.throws(() => a.readFlightCsv("time,altitude,velocity\n0,0\n"), /line 2: 2 cells, but the header has 3 columns/);
  assert.throws(() => a.readFlightCsv("time,altitude,velocity\n0,,0\n"), /line 2, column 2 \(altitude\): an empty cell; every sample needs a value/);
  // Without a header: time, altitude and velocity in order, in the default units, as the
  // command line reads such a file; a `speed` heading is the velocity.
  const bare = a.readFlightCsv("# t, h, v\n0,0,0\n1,100,200\n", "us");
  assert.deepEqual([...bare.altitudeM], [0, 100 * 0.3048]);
  assert.deepEqual([...bare.velocityMS], [0, 200 * 0.3048]);
  assert.deepEqual([...a.readFlightCsv("time,altitude,Speed (kt)\n0,0,100\n").velocityMS], [100 * (1852 / 3600)]);
  assert.throws(() => a.readFlightCsv("time,altitude,velocity\n" + ",".repeat(70000) + "\n"), /line 2: longer than 65536 bytes/);
  assert.throws(() => a.readFlightCsv("# nothing\n"), /empty/);
  assert.throws(() => a.readFlightCsv("time,altitude,velocity\n0,0,0\n", "metric"), RangeError);
});
