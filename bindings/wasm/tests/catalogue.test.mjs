// The quantity catalogue as the module gives it: every result object's keys are the
// catalogue's, the US conversions invert each other, and bad names are refused.

import { test } from "node:test";
import assert from "node:assert/strict";

import { loadNode } from "./load.mjs";

const a = loadNode();
// Some checks go above 86 km: the upper atmosphere's tables first (upper.test.mjs shows
// the error without them).
await a.loadUpper();
await a.loadFull();
const list = a.quantities();
const group = (name) => list.filter((q) => q.group === name).map((q) => q.key);

test("the list is the catalogue: ids in order, names and keys unique, units given", () => {
  assert.ok(list.length >= 51);
  list.forEach((q, i) => {
    assert.equal(q.id, i);
    assert.match(q.name, /^[a-z][A-Za-z0-9_]*$/);
    assert.ok(q.label.length > 0 && q.description.length > 0 && q.symbol.length > 0, q.name);
    assert.ok(q.siColumn.startsWith(q.name) && q.usColumn.startsWith(q.name), q.name);
    assert.equal(typeof q.mayBeUndefined, "boolean");
  });
  assert.equal(new Set(list.map((q) => q.name)).size, list.length);
  assert.equal(new Set(list.map((q) => q.key)).size, list.length);
  const temperature = list.find((q) => q.name === "temperature");
  assert.deepEqual(
    [temperature.key, temperature.siUnit, temperature.usUnit, temperature.siColumn, temperature.usColumn],
    ["temperatureK", "K", "degF", "temperature_K", "temperature_degF"],
  );
});

test("every result object carries exactly its group's keys, in catalogue order", () => {
  const standard = a.AtmosphereModel.standard();
  assert.deepEqual(Object.keys(standard.state(1000)), group("state"));
  assert.deepEqual(Object.keys(a.standardSpecies(300000)), group("species"));
  assert.deepEqual(Object.keys(a.airspeeds(101325, 288.15, "mach", 0.5)), [...group("airspeed").slice(0, 3), "mach", "impactPressurePa", "dynamicPressurePa"]);
  // A scan with every column: the velocity's direction, winds and a boundary layer.
  const flight = standard.scanFlight({
    timeS: [0, 1],
    altitudeM: [0, 10],
    velocityEastMS: [0, 1],
    velocityNorthMS: [0, 1],
    velocityUpMS: [5, 20],
    winds: { altitudeM: [0], windEastMS: [2], windNorthMS: [0] },
    boundaryLayer: "laminar",
  });
  const keys = Object.keys(flight.points).filter((k) => k !== "defined");
  for (const key of keys) assert.ok(list.some((q) => q.key === key), key);
  for (const key of group("flight")) assert.ok(keys.includes(key), key);
  // Beyond the flight group and the air's state, the scan carries the wind's components
  // and nothing else.
  assert.deepEqual(keys.filter((k) => !group("flight").includes(k) && !group("state").includes(k)), ["windEastMS", "windNorthMS"]);
  // The quantities that can be undefined are null above 86 km, the others numbers.
  const high = standard.state(150000);
  for (const q of list.filter((q) => q.group === "state")) {
    assert.equal(high[q.key] === null, q.mayBeUndefined, q.name);
  }
});

test("US units: 288.15 K is 59 degF, 1 ft is 0.3048 m, and back", () => {
  // Exact by definition (the Fahrenheit scale; the international foot of 1959).
  assert.equal(a.toUs("temperature", 288.15), 59);
  assert.equal(a.toUs("temperatureK", 288.15), 59);
  assert.equal(a.fromUs("geometric_altitude", 1), 0.3048);
  for (const q of list) {
    const back = a.fromUs(q.name, a.toUs(q.name, 288.15));
    assert.ok(Math.abs(back / 288.15 - 1) < 1e-14, q.name);
  }
});

test("bad names and values are refused with the argument named", () => {
  assert.throws(() => a.toUs("Temperature", 1), RangeError);
  assert.throws(() => a.toUs("x".repeat(5000), 1), RangeError);
  assert.throws(() => a.toUs(7, 1), TypeError);
  assert.throws(() => a.toUs("temperature", Number.NaN), /valueSi must be a finite number/);
  assert.throws(() => a.fromUs("temperature", "59"), TypeError);
  assert.throws(() => a.toUs("colour", 1), /no quantity is named 'colour'/);
});
