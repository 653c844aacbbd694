//! The minimum supported Rust version: the workspace's `rust-version`, proved by building
//! the core (default features and the `no_std` sets firmware uses), the command-line tool
//! and the C binding with that toolchain, from the committed Cargo.lock, as a user or contributor on
//! that Rust would. The toolchain comes from rustup; where it cannot be downloaded the
//! check says SKIPPED and passes.

use std::path::Path;

use crate::io_error;
use crate::package::versions::toml_string;
use crate::process::Cmd;

/// The builds, each a `cargo build` argument list after `-p`.
const BUILDS: [&[&str]; 7] = [
    &["aerostrata"],
    &["aerostrata", "--no-default-features"],
    &["aerostrata", "--no-default-features", "--features", "upper"],
    // The web module's set: the upper atmosphere's tables loaded at run time.
    &["aerostrata", "--no-default-features", "--features", "upper-loadable"],
    &["aerostrata", "--no-default-features", "--features", "alloc,serde"],
    &["aerostrata-cli"],
    &["aerostrata-c"],
];

/// The workspace's `rust-version` (`[workspace.package]` of the root Cargo.toml).
pub fn rust_version(root: &Path) -> Result<String, String> {
    let path = root.join("Cargo.toml");
    let manifest = std::fs::read_to_string(&path).map_err(|e| io_error("read", &path, e))?;
    toml_string(&manifest, "workspace.package", "rust-version")
        .ok_or_else(|| "Cargo.toml has no rust-version in [workspace.package]".to_owned())
}

/// `cargo xtask msrv`: Ok after the builds, or after a SKIPPED line when rustup cannot
/// provide the toolchain.
pub fn run(root: &Path) -> Result<(), String> {
    let version = rust_version(root)?;
    let toolchain = format!("+{version}");
    let have = || Cmd::new("rustup").args(["run", &version, "rustc", "--version"]).dir(root).succeeds();
    if !have() {
        if !Cmd::new("rustup").arg("--version").succeeds() {
            eprintln!(
                "SKIPPED: MSRV {version} build: rustup is not installed, so Rust {version} cannot be had"
            );
            return Ok(());
        }
        let install = Cmd::new("rustup")
            .args(["toolchain", "install", &version, "--profile", "minimal"])
            .dir(root)
            .quiet()
            .output()?;
        if !install.success || !have() {
            // rustup's first error line says why (the rest is its cause chain and backtrace).
            let stderr = install.stderr_text();
            let why = stderr.lines().find(|l| l.starts_with("error")).unwrap_or("no error message");
            eprintln!(
                "SKIPPED: MSRV {version} build: `rustup toolchain install {version} --profile minimal` failed \
                 (no network?): {why}"
            );
            return Ok(());
        }
    }
    let target_dir = crate::target_dir(root).join("msrv");
    let target_dir = target_dir.to_string_lossy();
    for build in BUILDS {
        Cmd::new("cargo")
            .arg(&toolchain)
            .args(["build", "--quiet", "--locked", "--target-dir", &target_dir, "-p"])
            .args(build)
            .dir(root)
            .run()
            .map_err(|e| {
                format!(
                    "{e}\n  Rust {version} is the declared rust-version. If a dependency now needs a newer \
                     Rust, pin the last version that builds (cargo {toolchain} update -p DEPENDENCY --precise \
                     VERSION); if the code does, use the older form or raise rust-version (README, \
                     \"Minimum supported Rust version\", and CHANGELOG.md)"
                )
            })?;
    }
    eprintln!(
        "  Rust {version}: the core ({} feature sets), the CLI and the C binding build",
        BUILDS.len() - 2
    );
    Ok(())
}
