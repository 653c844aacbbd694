// Every reference vector of tests/vectors within its file's tolerance, through the wasm
// module (the same files and rules as the Rust reference test in
// crates/xtask/src/rust/vectors.rs). Sources: the files' own headers (U.S. Standard
// Atmosphere 1976 and NACA Report 1135, from memory of the printed tables, each cell
// checked against 30-digit computations; see tests/vectors/README.md).

import { test } from "node:test";
import assert from "node:assert/strict";

import { loadNode, loadWeb, vectorsDir } from "./load.mjs";
import { bitLines, evaluator, halfUnitOfLastDigit, readVectorFiles } from "./vectors.mjs";

const aerostrata = loadNode();
// The upper vector files go to 1000 km: the upper atmosphere's tables first.
await aerostrata.loadUpper();
await aerostrata.loadFull();
const files = readVectorFiles(vectorsDir);

test("the vector files are there", () => {
  assert.ok(files.length >= 5, `only ${files.length} vector files`);
});

for (const file of files) {
  test(`${file.stem}: every value within its tolerance`, () => {
    const rowOf = evaluator(aerostrata, file);
    let checked = 0;
    const misses = [];
    for (const { line, cells } of file.rows) {
      const value = rowOf(Number(cells[0]));
      file.columns.forEach((column, i) => {
        const written = cells[i + 1];
        if (written === "") return;
        const reference = Number(written);
        const ours = value(column);
        const rule = file.rules[column];
        const tolerance =
          rule.kind === "printed"
            ? halfUnitOfLastDigit(written)
            : rule.kind === "rel"
              ? rule.value * Math.abs(reference)
              : rule.value;
        checked++;
        if (ours === undefined || !(Math.abs(ours - reference) <= tolerance)) {
          misses.push(`${file.stem}:${line} ${column} at ${cells[0]}: ${ours} vs ${written} (tolerance ${tolerance})`);
        }
      });
    }
    assert.ok(checked > 0, "no value checked");
    assert.deepEqual(misses, []);
  });
}

test("the half unit of the last digit is read as the Rust reader reads it", () => {
  assert.equal(halfUnitOfLastDigit("1.01325E+05"), 0.5);
  assert.equal(halfUnitOfLastDigit("288.150"), 0.0005);
  assert.equal(halfUnitOfLastDigit("86000"), 0.5);
  assert.ok(Math.abs(halfUnitOfLastDigit(".99303") - 0.5e-5) < 1e-20);
});

test("the web build gives the Node build's bits for every vector", async () => {
  const web = await loadWeb();
  await web.loadUpper();
  await web.loadFull();
  assert.deepEqual(bitLines(web, files), bitLines(aerostrata, files));
});

// The batch path (the core's `US1976.batch` and `batch::evaluate`, batch.rs) against the
// scalar path, bit for bit, at every altitude of the state vector files, in every
// quantity the state defines there: the vector bits check (bits.mjs) goes through
// `state`, so this carries it over to `batch` and `batchInto`. Common practice, no source.
test("batch and batchInto give state's bits at every altitude of the state vectors", () => {
  const models = [
    aerostrata.AtmosphereModel.standard(),
    aerostrata.AtmosphereModel.standard(15),
    aerostrata.AtmosphereModel.hydrostaticOffset(-25, 98000),
  ];
  let compared = 0;
  for (const file of files.filter((f) => f.input === "geometric_altitude_m" && /^(us1976|hydrostatic_offset)/.test(f.model))) {
    const all = file.rows.map(({ cells }) => Number(cells[0]));
    for (const model of models) {
      const { geometricMinM, geometricMaxM } = model.range();
      const altitudes = new Float64Array(all.filter((z) => z >= geometricMinM && z <= geometricMaxM));
      if (altitudes.length === 0) continue;
      const states = Array.from(altitudes, (z) => model.state(z));
      const keys = Object.keys(states[0]).filter((k) => states.every((s) => s[k] !== null));
      const outputs = Object.fromEntries(keys.map((k) => [k, new Float64Array(altitudes.length)]));
      model.batchInto(altitudes, outputs);
      const columns = model.batch(altitudes, keys);
      for (const k of keys) {
        states.forEach((s, i) => {
          assert.ok(Object.is(outputs[k][i], s[k]), `${file.stem} ${model.kind} ${k} at ${altitudes[i]}: batchInto ${outputs[k][i]}, state ${s[k]}`);
          assert.ok(Object.is(columns[k][i], s[k]), `${file.stem} ${model.kind} ${k} at ${altitudes[i]}: batch ${columns[k][i]}, state ${s[k]}`);
          compared++;
        });
      }
    }
  }
  assert.ok(compared > 1000, `only ${compared} values compared`);
});
