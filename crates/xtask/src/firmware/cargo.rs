//! Cargo in tests/firmware (a workspace of its own, whose .cargo/config.toml sets the
//! QEMU runners): the thumb targets built with rustup's standard libraries, or with
//! Debian's rustc building `core` (../shared/notes/toolchains.md); and the crate's lints.

use std::path::{Path, PathBuf};

use crate::process::Cmd;
use crate::setup::{TargetToolchain, DEBIAN_ENVS, FIRMWARE_TARGETS};

/// How cargo builds for the thumb targets on this machine: (extra environment, extra
/// arguments, target directory).
pub(super) fn build_settings(
    root: &Path,
    toolchain: TargetToolchain,
) -> (Vec<(String, String)>, Vec<String>, PathBuf) {
    let target_dir = crate::target_dir(root);
    match toolchain {
        TargetToolchain::Rustup => (Vec::new(), Vec::new(), target_dir.join("firmware")),
        TargetToolchain::DebianBuildStd => {
            let mut envs: Vec<(String, String)> =
                DEBIAN_ENVS.iter().map(|(k, v)| ((*k).to_owned(), (*v).to_owned())).collect();
            // Debian's rustc has no rust-lld of its own.
            for target in FIRMWARE_TARGETS {
                let key = format!("CARGO_TARGET_{}_LINKER", target.to_uppercase().replace('-', "_"));
                envs.push((key, "ld.lld-16".to_owned()));
            }
            (envs, vec!["-Zbuild-std=core".to_owned()], target_dir.join("firmware-debian"))
        }
    }
}

/// Runs cargo in tests/firmware (so that its .cargo/config.toml applies).
pub(super) fn cargo(firmware: &Path, toolchain: TargetToolchain, args: &[&str]) -> Result<(), String> {
    let root = firmware.ancestors().nth(2).ok_or("tests/firmware has no root")?;
    let (envs, extra, target_dir) = build_settings(root, toolchain);
    let mut all: Vec<String> = args.iter().map(|a| (*a).to_owned()).collect();
    if args.first().is_some_and(|a| *a != "fmt") {
        // Cargo's own options go before a `--` that hands the rest to the compiler.
        let at = all.iter().position(|a| a == "--").unwrap_or(all.len());
        let mut own = vec!["--target-dir".to_owned(), target_dir.display().to_string()];
        own.extend(extra);
        all.splice(at..at, own);
    }
    Cmd::new("cargo").args(all).envs(envs).dir(firmware).place("tests/firmware").run()
}

/// rustfmt and clippy (`-D warnings`) on the firmware crate, for both thumb targets and
/// both feature sets. Clippy needs rustup's standard library for the targets, so with
/// Debian's rustc (the fallback) only the format is checked.
pub(super) fn lint(firmware: &Path, toolchain: TargetToolchain) -> Result<(), String> {
    cargo(firmware, toolchain, &["fmt", "--", "--check"])?;
    if toolchain == TargetToolchain::DebianBuildStd {
        eprintln!("clippy for the thumb targets needs rustup's targets; skipped with Debian's rustc");
        return Ok(());
    }
    for target in FIRMWARE_TARGETS {
        for features in [&[][..], &["--features", "upper"][..]] {
            let mut args = vec!["clippy", "--quiet", "--release", "--target", target, "--bins", "--lib"];
            args.extend(features);
            args.extend(["--", "-D", "warnings"]);
            cargo(firmware, toolchain, &args)?;
        }
    }
    Ok(())
}
