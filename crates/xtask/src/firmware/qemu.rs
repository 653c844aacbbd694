//! Running a firmware image in QEMU: the emulated board and CPU of each thumb target, and
//! one run under `timeout` with the semihosting output kept.

use std::path::Path;

use crate::process::{Cmd, Output};

/// Seconds a QEMU run may take before `timeout` ends it (the runs take well under one).
const QEMU_TIMEOUT_S: u32 = 120;

/// The emulated board and CPU of each firmware target.
fn machine(target: &str) -> Result<(&'static str, &'static str), String> {
    match target {
        "thumbv7em-none-eabihf" => Ok(("mps2-an386", "cortex-m4")),
        "thumbv7m-none-eabi" => Ok(("lm3s6965evb", "cortex-m3")),
        other => Err(format!("no QEMU machine for {other}")),
    }
}

/// QEMU's arguments before the ELF path; tests/firmware/.cargo/config.toml's runners use
/// the same (a unit test keeps them in step).
fn qemu_args(target: &str) -> Result<Vec<String>, String> {
    let (machine, cpu) = machine(target)?;
    let args = [
        "-machine",
        machine,
        "-cpu",
        cpu,
        "-nographic",
        "-monitor",
        "none",
        "-serial",
        "none",
        "-semihosting-config",
        "enable=on,target=native",
        "-kernel",
    ];
    Ok(args.iter().map(|a| (*a).to_owned()).collect())
}

/// One run of `elf` in QEMU under `timeout`; its status and output, whatever they are.
pub(super) fn run(target: &str, elf: &Path) -> Result<Output, String> {
    Cmd::new("qemu-system-arm").args(qemu_args(target)?).arg(elf).timeout(QEMU_TIMEOUT_S).output()
}

#[cfg(test)]
mod tests {
    use std::fs;

    use super::*;
    use crate::setup::FIRMWARE_TARGETS;

    /// The runners a person uses (`cargo run` in tests/firmware) start QEMU as this does.
    #[test]
    fn cargo_runners_match_the_qemu_arguments() {
        let config =
            fs::read_to_string(crate::workspace_root().join("tests/firmware/.cargo/config.toml")).unwrap();
        for target in FIRMWARE_TARGETS {
            let section = config.split(&format!("[target.{target}]")).nth(1).unwrap();
            let runner = section.lines().find(|l| l.starts_with("runner")).unwrap();
            let expected = format!("qemu-system-arm {}\"", qemu_args(target).unwrap().join(" "));
            assert!(runner.starts_with("runner = \"timeout "), "{runner}");
            assert!(runner.ends_with(&expected), "{runner} should end with {expected}");
        }
    }
}
