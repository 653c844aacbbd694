#!/usr/bin/env node
// Prints, through the wasm module, one line per value of every row of every reference
// vector: `FILE INPUT COLUMN BITS`, the format of `cargo xtask bits` (the native core), so
// that a plain line comparison proves or refutes bit identity. Any host with the same
// format can be compared the same way.
//
// Usage: node bindings/wasm/tests/bits.mjs [PKGDIR] [VECTORSDIR] > wasm-bits.txt
//   PKGDIR     the built npm package (default target/wasm/pkg; `cargo xtask wasm`)
//   VECTORSDIR the vector files (default tests/vectors)

import { loadNode, packageDir, vectorsDir } from "./load.mjs";
import { bitLines, readVectorFiles } from "./vectors.mjs";

const aerostrata = loadNode(packageDir(process.argv[2]));
// The upper vector files go to 1000 km: the upper atmosphere's tables, as a page loads them.
await aerostrata.loadUpper();
await aerostrata.loadFull();
const lines = bitLines(aerostrata, readVectorFiles(process.argv[3] ?? vectorsDir));
process.stdout.write(lines.join("\n") + "\n");
