//! The WebAssembly door's automation: `cargo xtask wasm` builds the npm package
//! `aerostrata` under target/wasm/pkg (an ES module for browsers and bundlers in `web/`,
//! a CommonJS build for Node in `node/`, the `.d.ts` types, package.json and README) and
//! checks the optimised module against its size budget; the test steps run the Node
//! tests, the wasm-bindgen tests, the bit-identity check against the native core and the
//! headless-browser test of the web calculator.
//!
//! Tools, installed when missing: the `wasm32-unknown-unknown` target (rustup, or
//! Debian's rustc), wasm-bindgen-cli at the pinned version under target/tools,
//! `wasm-opt` from Debian's `binaryen`, Node from Debian's `nodejs`, Chromium from
//! Debian's `chromium`, playwright-core from npm under tests/browser, and TypeScript (for
//! the package's declarations) through an npm cache under target/npm-cache.
//!
//! `toolchain` builds for wasm32 with the pinned tools, `package` makes the npm package
//! and the calculator's site (its two modules, the entry that `facade` writes over them,
//! and `table` mends a wasm-opt bug on the way), `node` runs the
//! Node-side tests, `browser` the calculator in Chromium, `bench` the batch benchmark
//! over the builds of `variant`, `pack` the `npm pack` tarball installed and used in a
//! fresh project (`npm-check`).

pub mod bench;
mod browser;
mod facade;
mod node;
mod pack;
mod package;
mod table;
mod toolchain;
mod variant;

pub use browser::run as browser;
pub use node::{bits, node_tests, rust_tests};
pub use pack::check as npm_check;
pub use package::{build, run};
