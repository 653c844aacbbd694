// Loads the built package for the Node tests and scripts: the directory comes from the
// AEROSTRATA_PKG environment variable (set by `cargo xtask wasm-test`) or defaults to
// target/wasm/pkg of this checkout (built by `cargo xtask wasm`).

import { createRequire } from "node:module";
import { existsSync, readFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

const here = dirname(fileURLToPath(import.meta.url));
export const repoRoot = resolve(here, "..", "..", "..");

export function packageDir(given) {
  const dir = resolve(given ?? process.env.AEROSTRATA_PKG ?? join(repoRoot, "target", "wasm", "pkg"));
  if (!existsSync(join(dir, "package.json"))) {
    throw new Error(`no built package at ${dir}: run \`cargo xtask wasm\` first`);
  }
  return dir;
}

export const vectorsDir = join(repoRoot, "tests", "vectors");

/** The Node build (CommonJS), loaded as a user would: through the package's exports. */
export function loadNode(dir = packageDir()) {
  const require = createRequire(join(dir, "package.json"));
  return require(dir);
}

/** The web build (ES module), initialised synchronously from the .wasm bytes. */
export async function loadWeb(dir = packageDir()) {
  const web = await import(join(dir, "web", "aerostrata.js"));
  web.initSync({ module: readFileSync(join(dir, "web", "aerostrata_bg.wasm")) });
  return web;
}
