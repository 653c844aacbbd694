//! `cargo xtask firmware`: the core on emulated Cortex-M (tests/firmware in QEMU), bit for
//! bit against the native build, within its flash, stack and heap budgets; then the C
//! library in a bare-metal C program, and the wasm module's bits against the same lines.
//!
//! `cargo` builds and lints the firmware crate for the thumb targets, `qemu` runs an
//! image, `harness` is the Rust vector harness and its budgets, `c` the C firmware.

mod c;
mod cargo;
mod harness;
mod qemu;

use std::path::Path;

use crate::rust::vectors;
use crate::setup::{self, FIRMWARE_TARGETS};

/// `cargo xtask firmware`.
pub fn run(root: &Path) -> Result<(), String> {
    let toolchain = setup::firmware_targets(root)?;
    setup::apt_install(root, &["qemu-system-arm"])?;
    let firmware = root.join("tests/firmware");
    let native = vectors::bit_lines(&vectors::read_all(root)?)?;

    let mut reports = Vec::new();
    let mut failures = Vec::new();
    if let Err(message) = cargo::lint(&firmware, toolchain) {
        failures.push(format!("lints: {message}"));
    }
    for target in FIRMWARE_TARGETS {
        match harness::run_target(root, toolchain, target, &native) {
            Ok(report) => reports.push(report),
            Err(message) => failures.push(format!("{target}: {message}")),
        }
    }
    for report in &reports {
        failures.extend(harness::budget_failures(report));
    }
    eprintln!("{}", harness::summary(&reports));
    match c::run(root, toolchain) {
        Ok(report) => eprintln!(
            "C firmware on Cortex-M4F (QEMU {:.2} s): {} values bit-identical to native; its checks: {}",
            report.seconds, report.identical, report.tally
        ),
        Err(message) => failures.push(format!("C firmware: {message}")),
    }
    // The wasm module's bit lines against the same native ones: with the two firmware
    // targets and the C firmware, every host then agrees with every other.
    match crate::wasm::build(root).and_then(|package| crate::wasm::bits(root, &package)) {
        Ok(identical) => eprintln!("wasm module in Node: {identical} values bit-identical to native"),
        Err(message) => failures.push(format!("wasm: {message}")),
    }
    if failures.is_empty() {
        Ok(())
    } else {
        Err(failures.join("\n"))
    }
}
