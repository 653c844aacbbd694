// The built package as npm would ship it: its manifest, the two builds behind its
// exports, and TypeScript types that carry the camelCase names and their units.

import { test } from "node:test";
import assert from "node:assert/strict";
import { createRequire } from "node:module";
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";

import { loadNode, loadWeb, packageDir, repoRoot } from "./load.mjs";

const dir = packageDir();
const manifest = JSON.parse(readFileSync(join(dir, "package.json"), "utf8"));

test("package.json names the package and points at both builds", () => {
  assert.equal(manifest.name, "aerostrata");
  assert.match(manifest.version, /^\d+\.\d+\.\d+$/);
  assert.equal(manifest.license, "MIT OR Apache-2.0");
  for (const file of [
    "README.md",
    "LICENSE-MIT",
    "LICENSE-APACHE",
    "web/aerostrata.js",
    "web/aerostrata.d.ts",
    "web/parts.js",
    "web/lite/aerostrata.js",
    "web/aerostrata_bg.wasm",
    "web/full/aerostrata.js",
    "web/full/aerostrata_bg.wasm",
    "node/aerostrata.js",
    "node/aerostrata.d.ts",
    "node/parts.js",
    "node/lite/aerostrata.js",
    "node/aerostrata_bg.wasm",
    "node/full/aerostrata.js",
    "node/full/aerostrata_bg.wasm",
    "web/aerostrata_upper.bin",
    "node/aerostrata_upper.bin",
  ]) {
    assert.ok(existsSync(join(dir, file)), file);
  }
  // The upper part: one file, the same in both builds, and an export of its own for
  // bundlers and pages that serve it themselves.
  assert.deepEqual(readFileSync(join(dir, "web/aerostrata_upper.bin")), readFileSync(join(dir, "node/aerostrata_upper.bin")));
  assert.equal(manifest.exports["./aerostrata_upper.bin"], "./web/aerostrata_upper.bin");
  // Each module: the same file in both builds, and an export of its own.
  // The default module keeps the place of the package's one module before the split.
  for (const file of ["aerostrata_bg.wasm", "full/aerostrata_bg.wasm"]) {
    assert.deepEqual(readFileSync(join(dir, "web", file)), readFileSync(join(dir, "node", file)), file);
  }
  assert.ok(!existsSync(join(dir, "web", "lite", "aerostrata_bg.wasm")));
  assert.equal(manifest.exports["./aerostrata_bg.wasm"], "./web/aerostrata_bg.wasm");
  assert.equal(manifest.exports["./aerostrata_full_bg.wasm"], "./web/full/aerostrata_bg.wasm");
  assert.equal(manifest.exports["."].node.default, "./node/aerostrata.js");
  assert.equal(manifest.exports["."].default.default, "./web/aerostrata.js");
});

test("require() and import() in Node resolve to the Node build", async () => {
  const require = createRequire(join(dir, "package.json"));
  const viaRequire = require(dir);
  assert.equal(viaRequire.version(), manifest.version);
  const viaImport = await import(join(dir, "node", "aerostrata.js"));
  assert.equal(typeof viaImport.AtmosphereModel.standard, "function");
  assert.equal(viaImport.standardState(0).pressurePa, 101325);
});

test("the web build is an ES module that runs once initialised", async () => {
  const source = readFileSync(join(dir, "web", "aerostrata.js"), "utf8");
  assert.match(source, /^export default function init\(input\)/m);
  assert.match(readFileSync(join(dir, "web", "lite", "aerostrata.js"), "utf8"), /__wbg_init as default/);
  const web = await loadWeb();
  assert.deepEqual(web.standardState(20000), loadNode().standardState(20000));
});

test("the types name every export in camelCase with units in the names and docs", () => {
  const dts = readFileSync(join(dir, "web", "aerostrata.d.ts"), "utf8");
  for (const declaration of [
    "export function dynamicPressurePa(densityKgM3: number, velocityMS: number): number;",
    "export function standardState(altitudeM: number, altitudeKind?: AltitudeKind, offsetK?: number): AtmosphereState;",
    "batch(altitudesM: Float64Array | number[], quantities: StateQuantity[], altitudeKind?: AltitudeKind): Record<StateQuantity, Float64Array>;",
    "scanFlight(timeS: Float64Array | number[] | FlightScanOptions, altitudeM?: Float64Array | number[], velocityMS?: Float64Array | number[], vehicle?: VehicleSpec): FlightScanResult;",
    "constructor(altitudeM: Float64Array | number[], windEastMS: Float64Array | number[], windNorthMS: Float64Array | number[]);",
    "export interface FlightScanOptions {",
    "  velocityEastMS?: Float64Array;",
    "static fromSoundingJson(json: string | SoundingJson): AtmosphereModel;",
    "export interface AtmosphereState {",
    "  /** Pressure p, Pa: static pressure of the air. */",
    "export function quantities(): QuantityInfo[];",
    "export function loadUpper(source?: string | URL | Response | Uint8Array | ArrayBuffer): Promise<void>;",
    "export function upperLoaded(): boolean;",
    "export function loadFull(source?: string | URL | Response | Uint8Array | ArrayBuffer | WebAssembly.Module): Promise<void>;",
    "export function fullLoaded(): boolean;",
    "  speedOfSoundMS: number | null;",
  ]) {
    assert.ok(dts.includes(declaration), `missing: ${declaration}`);
  }
  // The full module's declarations say so in their docs, the default module's do not.
  const docOf = (declaration) => {
    const at = dts.indexOf(declaration);
    assert.ok(at > 0, declaration);
    return dts.slice(dts.lastIndexOf("/**", at), at);
  };
  const needsFull = "Needs the full module: call `await loadFull()` first";
  for (const declaration of ["export function parseValue(", "    scanFlight(", "    static fromSpec(", "export class WindProfile {"]) {
    assert.ok(docOf(declaration).includes(needsFull), declaration);
  }
  for (const declaration of ["export function standardState(", "    batch(", "    static standard(", "export function loadFull("]) {
    assert.ok(!docOf(declaration).includes(needsFull), declaration);
  }
  // Every function's doc names its units: "Dynamic pressure q = rho V^2 / 2, Pa, ...".
  assert.match(dts, /Dynamic pressure q = rho V\^2 \/ 2, Pa, of air of density `densityKgM3` \(kg\/m\^3\)/);
  // No snake_case parameter leaked into the API (the Node types: the web ones add
  // wasm-bindgen's own `init(module_or_path)`).
  const nodeDts = readFileSync(join(dir, "node", "aerostrata.d.ts"), "utf8");
  const params = [...nodeDts.matchAll(/\(([^()]*)\)\s*:/g)].flatMap((m) => m[1].split(",").map((p) => p.trim().split(/[?:]/)[0]));
  assert.deepEqual(params.filter((p) => p.includes("_")), []);
});

test("the Node build's entry, parts.js and glue snippets are CommonJS", () => {
  const texts = { "parts.js": readFileSync(join(dir, "node", "parts.js"), "utf8") };
  for (const part of ["lite", "full"]) {
    const glue = readFileSync(join(dir, "node", part, "aerostrata.js"), "utf8");
    const snippets = [...new Set([...glue.matchAll(/require\((?:String\.raw`|")(\.\/snippets\/[^`"]+)(?:`|")\)/g)].map((m) => m[1]))];
    assert.deepEqual(snippets.map((s) => s.split("/").pop()), ["glue.js"], part);
    texts[`${part}/glue.js`] = readFileSync(join(dir, "node", part, snippets[0]), "utf8");
  }
  for (const [name, text] of Object.entries(texts)) {
    assert.doesNotMatch(text, /^export /m, name);
    assert.match(text, /^module\.exports = \{ .* \};$/m, name);
    // `import.meta` is a syntax error in CommonJS: the file's URL comes from its path.
    const code = text.split("\n").filter((line) => !line.trim().startsWith("//")).join("\n");
    assert.doesNotMatch(code, /import\.meta/, name);
  }
  assert.match(texts["lite/glue.js"], /^module\.exports = \{ .*record.* \};$/m);
  assert.match(texts["parts.js"], /^module\.exports = \{ parts \};$/m);
  const entry = readFileSync(join(dir, "node", "aerostrata.js"), "utf8");
  assert.match(entry, /^"use strict";$/m);
  assert.doesNotMatch(entry, /^(export|import) /m);
});

test("the README's JavaScript example runs against the package and prints the standard's numbers", () => {
  const readme = readFileSync(join(repoRoot, "README.md"), "utf8");
  const block = readme.match(/```js\n([\s\S]*?)```/);
  assert.ok(block, "the README has a ```js block");
  const printed = [];
  const require = (name) => {
    assert.equal(name, "aerostrata");
    return loadNode(dir);
  };
  const console = { log: (...values) => printed.push(values) };
  new Function("require", "console", block[1])(require, console);
  assert.equal(printed.length, 1);
  const [temperature, pressure, q] = printed[0];
  // ISA + 15 K at 11 km geometric: the standard's 216.774 K plus 15 K, at its 2.2700E+04 Pa
  // (tests/vectors/usa76_lower.csv, from memory of the printed table; the offset keeps the
  // standard's pressure), and q = rho V^2 / 2 at 250 m/s with rho = p / (R T).
  assert.ok(Math.abs(temperature - 231.774) <= 0.0005, `${temperature}`);
  assert.ok(Math.abs(pressure - 22_700) <= 0.5, `${pressure}`);
  const rho = (pressure * 28.9644) / (8314.32 * temperature);
  assert.ok(Math.abs(q / (0.5 * rho * 250 * 250) - 1) < 1e-12, `${q}`);
});
