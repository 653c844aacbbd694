//! The package's tests under Node: `node --test` over bindings/wasm/tests/*.test.mjs, the
//! wasm-bindgen tests of the Rust side, and bit identity with the native core.

use std::fs;
use std::path::Path;

use super::package::{Package, CRATE_DIR};
use super::toolchain::{cargo_wasm, wasm_bindgen_cli, WASM_RUSTFLAGS};
use crate::process::Cmd;
use crate::rust::vectors;
use crate::setup;

/// `node --test` over bindings/wasm/tests/*.test.mjs against the built Node package.
pub fn node_tests(root: &Path, package: &Package) -> Result<(), String> {
    setup::node(root)?;
    let mut tests: Vec<String> = fs::read_dir(root.join(CRATE_DIR).join("tests"))
        .map_err(|e| format!("cannot read bindings/wasm/tests: {e}"))?
        .flatten()
        .map(|e| e.path())
        .filter(|p| p.to_string_lossy().ends_with(".test.mjs"))
        .map(|p| p.to_string_lossy().into_owned())
        .collect();
    tests.sort();
    if tests.is_empty() {
        return Err("no bindings/wasm/tests/*.test.mjs".to_owned());
    }
    Cmd::new("node").arg("--test").args(tests).envs([("AEROSTRATA_PKG", &package.dir)]).dir(root).run()
}

/// The wasm-bindgen tests of the Rust side (bindings/wasm/tests/*.rs), under Node.
pub fn rust_tests(root: &Path) -> Result<(), String> {
    setup::node(root)?;
    let toolchain = setup::wasm_target(root)?;
    let bindgen = wasm_bindgen_cli(root)?;
    let runner = bindgen.with_file_name("wasm-bindgen-test-runner").to_string_lossy().into_owned();
    cargo_wasm(
        root,
        toolchain,
        &["test", "-p", "aerostrata-wasm"],
        "-Zbuild-std=std,panic_abort",
        &[("CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUNNER", &runner), WASM_RUSTFLAGS],
    )
    .map(|_| ())
}

/// The bit-identity check: the wasm module's outputs for every vector, through
/// bindings/wasm/tests/bits.mjs, against the native core's (`cargo xtask bits`), line by
/// line. Returns the number of identical values.
pub fn bits(root: &Path, package: &Package) -> Result<usize, String> {
    let files = vectors::read_all(root)?;
    let native = vectors::bit_lines(&files)?;
    let script = root.join(CRATE_DIR).join("tests").join("bits.mjs");
    let output = Cmd::new("node")
        .arg(&script)
        .arg(&package.dir)
        .arg(root.join("tests").join("vectors"))
        .dir(root)
        .quiet()
        .output()?;
    if !output.success {
        return Err(format!("{} failed:\n{}", script.display(), output.stderr_text()));
    }
    let wasm: Vec<String> = output.stdout_text().lines().map(str::to_owned).collect();
    let identical = vectors::compare_bits("the wasm module", &native, &wasm)?;
    eprintln!("  {identical} values bit-identical between the native core and the wasm module");
    Ok(identical)
}
