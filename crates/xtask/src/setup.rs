//! Installing what the tests need on a fresh Debian machine, skipping what is there.
//!
//! Rust targets come from rustup; where rustup cannot download, Debian's rustc with its
//! std source builds `core` per target instead (../shared/notes/toolchains.md). Python's
//! mpmath, scipy and numpy come from pip, or from Debian's packages.

use std::path::Path;

use crate::process::Cmd;

/// The bare-metal targets the core must keep building for.
pub const FIRMWARE_TARGETS: [&str; 2] = ["thumbv7em-none-eabihf", "thumbv7m-none-eabi"];

/// How to build for the firmware targets on this machine.
#[derive(Clone, Copy, PartialEq, Eq)]
pub enum TargetToolchain {
    /// rustup has the targets' standard libraries.
    Rustup,
    /// Debian's rustc builds `core` from source (`-Zbuild-std`).
    DebianBuildStd,
}

fn quiet_success(program: &str, args: &[&str]) -> bool {
    Cmd::new(program).args(args).succeeds()
}

pub(crate) fn is_root() -> bool {
    Cmd::new("id").arg("-u").quiet().output().is_ok_and(|o| o.stdout.starts_with(b"0\n"))
}

/// Installs Debian packages when missing (as root), or says what to install.
pub fn apt_install(root: &Path, packages: &[&str]) -> Result<(), String> {
    let missing: Vec<&str> = packages.iter().copied().filter(|p| !dpkg_installed(p)).collect();
    if missing.is_empty() {
        return Ok(());
    }
    if !is_root() {
        return Err(format!(
            "please install these Debian packages: sudo apt-get install {}",
            missing.join(" ")
        ));
    }
    Cmd::new("apt-get").args(["update", "-q"]).dir(root).run()?;
    Cmd::new("apt-get")
        .args(["install", "-y", "-q", "--no-install-recommends"])
        .args(&missing)
        .envs([("DEBIAN_FRONTEND", "noninteractive")])
        .dir(root)
        .run()
}

pub(crate) fn dpkg_installed(package: &str) -> bool {
    Cmd::new("dpkg-query")
        .args(["-W", "-f=${Status}", package])
        .quiet()
        .output()
        .is_ok_and(|o| o.stdout_text().contains("install ok installed"))
}

/// Debian's rustc building the standard library from source (the fallback of
/// ../shared/notes/toolchains.md), for every target.
pub const DEBIAN_ENVS: [(&str, &str); 3] =
    [("RUSTC", "/usr/bin/rustc"), ("RUSTDOC", "/usr/bin/rustdoc"), ("RUSTC_BOOTSTRAP", "1")];

/// Makes `targets` buildable and says how: rustup's standard libraries, or, where rustup
/// cannot download them, Debian's rustc with -Zbuild-std.
fn rust_targets(root: &Path, targets: &[&str]) -> Result<TargetToolchain, String> {
    let installed = Cmd::new("rustup")
        .args(["target", "list", "--installed"])
        .quiet()
        .output()
        .map(|o| o.stdout_text())
        .unwrap_or_default();
    let missing: Vec<&str> =
        targets.iter().copied().filter(|t| !installed.lines().any(|l| l == *t)).collect();
    if missing.is_empty() {
        return Ok(TargetToolchain::Rustup);
    }
    if Cmd::new("rustup").args(["target", "add"]).args(&missing).dir(root).run().is_ok() {
        return Ok(TargetToolchain::Rustup);
    }
    eprintln!("rustup could not add {missing:?}; falling back to Debian's rustc with -Zbuild-std");
    apt_install(root, &["rustc-web", "rust-web-src", "lld-16"])?;
    Ok(TargetToolchain::DebianBuildStd)
}

/// Makes the firmware targets buildable and says how.
pub fn firmware_targets(root: &Path) -> Result<TargetToolchain, String> {
    rust_targets(root, &FIRMWARE_TARGETS)
}

/// The Python modules of the independent checks, pinned: the scipy integration's last
/// digits differ between scipy releases, and docs/validation.md quotes them, so a fresh
/// machine must get the very versions the committed report was written with.
const PYTHON_MODULES: [(&str, &str, &str); 3] = [
    ("mpmath", "1.3.0", "python3-mpmath"),
    ("scipy", "1.17.1", "python3-scipy"),
    ("numpy", "2.4.6", "python3-numpy"),
];

/// Makes `python3 -c "import mpmath, scipy, numpy"` work at the pinned versions: pip
/// first, then (when pip cannot reach its registry) Debian's python3-mpmath,
/// python3-scipy and python3-numpy, whose other versions may change the last digits of
/// the scipy section of docs/validation.md.
pub fn python_modules(root: &Path) -> Result<(), String> {
    let pinned = |module: &str, version: &str| {
        quiet_success(
            "python3",
            &["-c", &format!("import sys, {module}; sys.exit({module}.__version__ != '{version}')")],
        )
    };
    if !quiet_success("python3", &["--version"]) {
        apt_install(root, &["python3"])?;
    }
    let missing: Vec<(&str, &str, &str)> =
        PYTHON_MODULES.iter().copied().filter(|(m, v, _)| !pinned(m, v)).collect();
    if missing.is_empty() {
        return Ok(());
    }
    let specs: Vec<String> = missing.iter().map(|(m, v, _)| format!("{m}=={v}")).collect();
    let pip = Cmd::new("python3").args(["-m", "pip", "install", "--quiet"]).args(&specs);
    if pip.dir(root).run().is_err() {
        eprintln!("pip could not install {specs:?}; falling back to Debian's packages");
        let packages: Vec<&str> = missing.iter().map(|(_, _, p)| *p).collect();
        apt_install(root, &packages)?;
    }
    let importable = |module: &str| quiet_success("python3", &["-c", &format!("import {module}")]);
    match PYTHON_MODULES.iter().find(|(m, _, _)| !importable(m)) {
        None => Ok(()),
        Some((module, _, _)) => Err(format!("python3 still cannot import {module}")),
    }
}

/// The WebAssembly target of the wasm module.
pub const WASM_TARGET: &str = "wasm32-unknown-unknown";

/// Makes `wasm32-unknown-unknown` buildable and says how: rustup first, then (when rustup
/// cannot download) Debian's rustc building `core` and `alloc` per target, linking with
/// `wasm-ld-16` (../shared/notes/toolchains.md).
pub fn wasm_target(root: &Path) -> Result<TargetToolchain, String> {
    rust_targets(root, &[WASM_TARGET])
}

/// Makes `node` and `npm` available (Debian's `nodejs` and `npm` when missing).
pub fn node(root: &Path) -> Result<(), String> {
    if !quiet_success("node", &["--version"]) {
        apt_install(root, &["nodejs"])?;
    }
    if !quiet_success("npm", &["--version"]) {
        apt_install(root, &["npm"])?;
    }
    Ok(())
}

/// target/tools/bin/BINARY of the crates.io package `package` at exactly `version`,
/// installed there with `cargo install` when missing or of another version (its
/// `--version` output must read "BINARY VERSION"). `--locked` first, for the tool's own
/// tested dependencies; if the registry no longer has one of them, without it.
pub fn cargo_tool(
    root: &Path,
    package: &str,
    binary: &str,
    version: &str,
) -> Result<std::path::PathBuf, String> {
    let tools = crate::target_dir(root).join("tools");
    let path = tools.join("bin").join(binary);
    let wanted = format!("{binary} {version}");
    let installed = Cmd::new(&path)
        .arg("--version")
        .quiet()
        .output()
        .is_ok_and(|o| o.success && o.stdout_text().trim() == wanted);
    if !installed {
        let root_arg = tools.to_string_lossy().into_owned();
        let args = ["install", package, "--version", version, "--root", &root_arg];
        let install = || Cmd::new("cargo").args(args).dir(root);
        if install().arg("--locked").run().is_err() {
            eprintln!("`cargo install --locked {package}` failed; installing it without --locked");
            install().run()?;
        }
    }
    Ok(path)
}
