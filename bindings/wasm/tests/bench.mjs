#!/usr/bin/env node
// The wasm side of `cargo xtask wasm-bench`: one batch of many altitudes through
// `AtmosphereModel.batchInto` of the Node build into five Float64Arrays made once (as a
// page redrawing a chart keeps its arrays), timed. Not a test: it prints figures, and
// `cargo xtask wasm-bench` compares them with the native core's in the same run.
//
// Usage: node bench.mjs PKGDIR ALTITUDES_FILE COUNT RUNS
// Writes COUNT pseudo-random geometric altitudes, uniform in [0, 86 000) m (fixed seed),
// to ALTITUDES_FILE as little-endian f64 (so that the native side reads the very same
// inputs) and prints one JSON line: the milliseconds of each timed run (after 3 s of
// warm-up), of the first batch, and an FNV-1a checksum of the outputs' bytes, column after column.

import { writeFileSync } from "node:fs";
import { performance } from "node:perf_hooks";

import { loadNode, packageDir } from "./load.mjs";

// The quantities of the benchmark, in the order of native_batch.rs's `QUANTITIES`.
const QUANTITIES = ["temperatureK", "pressurePa", "densityKgM3", "speedOfSoundMS", "dynamicViscosityPaS"];

const [dir, file, count, runs] = process.argv.slice(2);
const aerostrata = loadNode(packageDir(dir));
const n = Number(count);

// A 32-bit linear congruential generator (Numerical Recipes' constants), fixed seed.
const altitudes = new Float64Array(n);
let x = 19761976;
for (let i = 0; i < n; i++) {
  x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
  altitudes[i] = (x / 4294967296) * 86000;
}
writeFileSync(file, new Uint8Array(altitudes.buffer));

// Warm-up as criterion's: batches until 3 s have passed (V8 first runs the module in its
// baseline tier and moves hot functions to its optimising tier over the first batches).
// The first batch's time is reported on its own.
const WARM_UP_MS = 3000;
const model = aerostrata.AtmosphereModel.standard();
const outputs = Object.fromEntries(QUANTITIES.map((q) => [q, new Float64Array(n)]));
const coldStart = performance.now();
model.batchInto(altitudes, outputs);
const firstMs = performance.now() - coldStart;
const warm = Object.fromEntries(QUANTITIES.map((q) => [q, outputs[q].slice()]));
while (performance.now() - coldStart < WARM_UP_MS) model.batchInto(altitudes, outputs);
const times = [];
for (let r = 0; r < Number(runs); r++) {
  const started = performance.now();
  model.batchInto(altitudes, outputs);
  times.push(performance.now() - started);
}
// Every timed batch wrote what the first did.
for (const q of QUANTITIES) {
  if (!outputs[q].every((v, i) => Object.is(v, warm[q][i]))) throw new Error(q + ": a later batch differs");
}

let hash = 0x811c9dc5;
for (const q of QUANTITIES) {
  const bytes = new Uint8Array(warm[q].buffer, warm[q].byteOffset, warm[q].byteLength);
  for (let i = 0; i < bytes.length; i++) hash = Math.imul(hash ^ bytes[i], 0x01000193) >>> 0;
}
console.log(
  JSON.stringify({
    runs_ms: times.map((t) => Number(t.toFixed(3))),
    first_ms: Number(firstMs.toFixed(3)),
    checksum: hash.toString(16).padStart(8, "0"),
  }),
);
