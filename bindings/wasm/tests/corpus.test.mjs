// Every input of the fuzzing corpus (fuzz/corpus) and the same fourteen deterministic
// mutations the command line's replay makes (crates/aerostrata-cli/tests/corpus_replay.rs),
// through the module's readers: soundings in CSV and JSON, wind files, flight files then
// their scan, tables as flight files, model specs, values with units. What every call must show
// (docs/robustness.md): a result, or a thrown Error, RangeError or TypeError with a short
// message, never a trap (WebAssembly.RuntimeError) or another exception; and every
// number a result carries finite.

import { test } from "node:test";
import assert from "node:assert/strict";
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";

import { loadNode, repoRoot } from "./load.mjs";

const a = loadNode();
await a.loadFull();
const { AtmosphereModel, WindProfile } = a;
const corpus = join(repoRoot, "fuzz", "corpus");

function inputs(dir) {
  const names = readdirSync(join(corpus, dir)).sort();
  assert.ok(names.length > 0, `fuzz/corpus/${dir} is empty`);
  return names.map((name) => [name, readFileSync(join(corpus, dir, name))]);
}

// Bytes as a page would have them: decoded as UTF-8, a bad sequence replaced.
const decode = (bytes) => new TextDecoder("utf-8").decode(bytes);

function firstNumber(text) {
  const from = text.indexOf("\n") + 1;
  const match = /[0-9][0-9.]*/.exec(text.slice(from));
  return match ? [from + match.index, from + match.index + match[0].length] : null;
}

function replaceFirstNumber(text, by) {
  const at = firstNumber(text);
  return at ? text.slice(0, at[0]) + by + text.slice(at[1]) : text;
}

function mutations(bytes) {
  const text = decode(bytes);
  const lines = text.split("\n");
  const header = lines[0] ?? "";
  const middle = Math.floor(bytes.length / 2);
  const lastDigit = text.search(/[0-9][^0-9]*$/);
  return [
    ["as it is", text],
    ["cut in half", decode(bytes.subarray(0, middle))],
    ["BOM and CRLF", "\u{feff}" + lines.join("\r\n")],
    ["a digit made a letter", lastDigit < 0 ? text : text.slice(0, lastDigit) + "x" + text.slice(lastDigit + 1)],
    ["1e308", replaceFirstNumber(text, "1e308")],
    ["-1e308", replaceFirstNumber(text, "-1e308")],
    ["NaN", replaceFirstNumber(text, "NaN")],
    ["the header twice", header + "\n" + text],
    ["a NUL byte", decode(bytes.subarray(0, middle)) + "\0" + decode(bytes.subarray(middle))],
    ["a long line", text + "\n" + "9".repeat(70000) + "\n"],
    ["lines reversed", [...lines].reverse().join("\n")],
    ["semicolons", text.replaceAll(",", ";")],
    ["nothing", ""],
    ["the header alone", header + "\n"],
  ];
}

// Every number reachable from `value` (typed arrays, arrays, plain objects) is finite or
// null where the module says a quantity is undefined.
function assertFinite(value, where) {
  if (typeof value === "number") {
    assert.ok(Number.isFinite(value), `${where}: ${value}`);
  } else if (ArrayBuffer.isView(value) || Array.isArray(value)) {
    for (const v of value) assertFinite(v, where);
  } else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) assertFinite(v, `${where}.${k}`);
  }
}

let calls = 0;
// Runs `f`; a throw must be one of the module's own error classes with a short message.
function attempt(where, f) {
  calls += 1;
  try {
    return f();
  } catch (e) {
    assert.ok(!(e instanceof WebAssembly.RuntimeError), `${where}: a trap: ${e}`);
    assert.ok([Error, RangeError, TypeError].includes(e.constructor), `${where}: ${e?.constructor?.name}: ${e}`);
    assert.ok(e.message.length > 0 && e.message.length < 2000, `${where}: ${e.message.length} characters`);
    assert.ok(!e.message.includes("\0"), `${where}: a raw NUL in the message`);
    return undefined;
  }
}

function each(dir, f) {
  for (const [name, bytes] of inputs(dir)) {
    for (const [mutation, text] of mutations(bytes)) f(text, `${dir}/${name} (${mutation})`);
  }
}

function probe(model, where) {
  for (const altitude of [0, 500, 3000, 20000]) {
    const state = attempt(`${where} at ${altitude} m`, () => model.state(altitude));
    if (state) assertFinite(state, `${where} at ${altitude} m`);
  }
  model.free();
}

test("soundings in CSV and JSON, and wind files", () => {
  const before = calls;
  each("sounding_csv", (text, where) => {
    for (const units of ["si", "us"]) {
      const model = attempt(where, () => AtmosphereModel.fromSoundingCsv(text, units));
      if (model) probe(model, where);
    }
  });
  each("sounding_json", (text, where) => {
    const model = attempt(where, () => AtmosphereModel.fromSoundingJson(text));
    if (model) probe(model, where);
  });
  each("winds_csv", (text, where) => {
    const winds = attempt(where, () => WindProfile.fromCsv(text));
    if (!winds) return;
    for (const altitude of [-100, 0, 5000, 50000]) assertFinite(winds.at(altitude), `${where} at ${altitude} m`);
    winds.free();
  });
  assert.ok(calls - before >= 300, `${calls - before} calls`);
});

test("flight files, and tables read as flight files, then scanned", () => {
  const before = calls;
  const standard = AtmosphereModel.standard();
  for (const dir of ["flight_table", "table", "winds_csv"]) {
    each(dir, (text, where) => {
      const samples = attempt(where, () => a.readFlightCsv(text));
      if (!samples) return;
      const { ignored, ...options } = samples;
      assert.ok(Array.isArray(ignored), where);
      assertFinite(options, where);
      const scan = attempt(`${where}: scanFlight`, () => standard.scanFlight({ ...options, vehicle: { dragCoefficient: 0.4, referenceAreaM2: 0.02 } }));
      if (scan) assertFinite(scan.summary, `${where}: summary`);
    });
  }
  standard.free();
  assert.ok(calls - before >= 200, `${calls - before} calls`);
});

test("model specs and values with units", () => {
  const before = calls;
  each("model_spec", (text, where) => {
    const model = attempt(where, () => AtmosphereModel.fromSpec(text.trim()));
    if (model) probe(model, where);
  });
  each("units", (text, where) => {
    for (const quantity of ["temperature", "static_pressure", "geometric_altitude", "velocity", "temperature_offset"]) {
      const value = attempt(`${where} as ${quantity}`, () => a.parseValue(text, quantity));
      if (value) assertFinite(value.si, `${where} as ${quantity}`);
    }
  });
  assert.ok(calls - before >= 300, `${calls - before} calls`);
});
