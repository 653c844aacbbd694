//! Building for wasm32 with the toolchain at hand (rustup's target, or Debian's rustc
//! building `core` and `alloc` and linking with Debian's wasm-ld), and the pinned
//! wasm-bindgen CLI and Debian's wasm-opt that turn the module into the package.

use std::path::{Path, PathBuf};

use crate::process::Cmd;
use crate::setup::{self, TargetToolchain, WASM_TARGET};
use crate::target_dir;

/// The wasm-bindgen the module is built with. Pinned exactly, equal to the `=` version
/// in bindings/wasm/Cargo.toml: the generated JS glue must match the crate's macros.
pub const WASM_BINDGEN_VERSION: &str = "0.2.130";

/// target/tools/bin/wasm-bindgen at the pinned version, installed there when missing
/// (without `--locked` if the registry no longer has a crate of the CLI's own lock file:
/// the CLI pins its wasm-bindgen crates with `=`, so the glue it writes is the same).
pub(super) fn wasm_bindgen_cli(root: &Path) -> Result<PathBuf, String> {
    setup::cargo_tool(root, "wasm-bindgen-cli", "wasm-bindgen", WASM_BINDGEN_VERSION)
}

pub(super) fn wasm_opt(root: &Path) -> Result<(), String> {
    if Cmd::new("wasm-opt").arg("--version").succeeds() {
        Ok(())
    } else {
        setup::apt_install(root, &["binaryen"])
    }
}

/// Debian's rustc has no rust-lld of its own: wasm32 links with Debian's wasm-ld.
const DEBIAN_WASM_LINKER: (&str, &str) = ("CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_LINKER", "wasm-ld-16");

/// The module is built with wasm's SIMD instructions (every browser since 2021, Node 16.4
/// and later), for the core's square root: the `f64x2.sqrt` instruction instead of libm's
/// software one (crates/aerostrata/src/math.rs), the same bits, a quarter of the time.
pub(super) const WASM_RUSTFLAGS: (&str, &str) =
    ("CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUSTFLAGS", "-C target-feature=+simd128");

/// `cargo ARGS` for wasm32 with the toolchain at hand; returns the target directory.
pub(super) fn cargo_wasm(
    root: &Path,
    toolchain: TargetToolchain,
    args: &[&str],
    build_std: &str,
    envs: &[(&str, &str)],
) -> Result<PathBuf, String> {
    let cargo = Cmd::new("cargo").args(args).args(["--target", WASM_TARGET]).dir(root);
    match toolchain {
        TargetToolchain::Rustup => {
            cargo.envs(envs.iter().copied()).run()?;
            Ok(target_dir(root))
        }
        TargetToolchain::DebianBuildStd => {
            cargo
                .args([build_std, "--target-dir", "target/debian-rustc"])
                .envs(setup::DEBIAN_ENVS.into_iter().chain([DEBIAN_WASM_LINKER]).chain(envs.iter().copied()))
                .run()?;
            Ok(root.join("target").join("debian-rustc"))
        }
    }
}
