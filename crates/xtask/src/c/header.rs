//! `cargo xtask header [--check]`: bindings/c/include/aerostrata.h regenerated with the
//! pinned cbindgen (installed under target/tools when missing), or compared with a fresh
//! generation.
//!
//! The crate's `src/catalogue.rs` includes what its build script writes into OUT_DIR, and
//! cbindgen does not follow `include!`: it reads a copy of the crate's source under
//! target/c-header in which the generated text is `src/catalogue.rs` itself. cbindgen is
//! given the copy's `lib.rs` (it follows the `mod` lines from there) rather than a crate
//! directory, because `cargo metadata` refuses a workspace member's manifest outside the
//! workspace.

use std::path::{Path, PathBuf};

use crate::io_error;
use crate::process::Cmd;
use crate::target_dir;

/// The cbindgen the header is generated with. Pinned exactly: another version may write
/// a different header, and the check below would then fail for no change of ours.
pub const CBINDGEN_VERSION: &str = "0.29.2";

const HEADER: &str = "bindings/c/include/aerostrata.h";

/// target/tools/bin/cbindgen at the pinned version, installed there when missing.
fn cbindgen(root: &Path) -> Result<PathBuf, String> {
    crate::setup::cargo_tool(root, "cbindgen", "cbindgen", CBINDGEN_VERSION)
}

/// A copy of bindings/c/src under target/c-header with the generated catalogue in place
/// of `src/catalogue.rs`; returns the copy's `lib.rs`.
fn source_copy(root: &Path) -> Result<PathBuf, String> {
    let from = root.join("bindings/c/src");
    let to = target_dir(root).join("c-header").join("src");
    if to.exists() {
        std::fs::remove_dir_all(&to).map_err(|e| io_error("remove", &to, e))?;
    }
    copy_dir(&from, &to)?;
    let catalogue = to.join("catalogue.rs");
    std::fs::write(&catalogue, super::catalogue::generate()).map_err(|e| io_error("write", &catalogue, e))?;
    Ok(to.join("lib.rs"))
}

fn copy_dir(from: &Path, to: &Path) -> Result<(), String> {
    std::fs::create_dir_all(to).map_err(|e| io_error("create", to, e))?;
    for entry in std::fs::read_dir(from).map_err(|e| io_error("read", from, e))? {
        let path = entry.map_err(|e| io_error("read", from, e))?.path();
        let target = to.join(path.file_name().unwrap_or_default());
        if path.is_dir() {
            copy_dir(&path, &target)?;
        } else {
            std::fs::copy(&path, &target).map_err(|e| io_error("copy", &path, e))?;
        }
    }
    Ok(())
}

/// Regenerates bindings/c/include/aerostrata.h; with `check_only`, writes it to a
/// temporary file instead and fails if it differs from the committed one.
pub fn run(root: &Path, check_only: bool) -> Result<(), String> {
    let cbindgen = cbindgen(root)?;
    let lib = source_copy(root)?;
    let committed = root.join(HEADER);
    let output = if check_only { target_dir(root).join("aerostrata.h.check") } else { committed.clone() };
    if let Some(dir) = output.parent() {
        std::fs::create_dir_all(dir).map_err(|e| io_error("create", dir, e))?;
    }
    let output_arg = output.to_string_lossy().into_owned();
    Cmd::new(cbindgen)
        .args(["--quiet", "--config", "bindings/c/cbindgen.toml", "--output", &output_arg])
        .arg(&lib)
        .dir(root)
        .run()?;
    if check_only {
        let fresh = std::fs::read_to_string(&output).map_err(|e| format!("cannot read {output_arg}: {e}"))?;
        let old = std::fs::read_to_string(&committed).map_err(|e| format!("cannot read {HEADER}: {e}"))?;
        if fresh != old {
            let line = fresh.lines().zip(old.lines()).position(|(a, b)| a != b).map_or_else(
                || "the lengths differ".to_owned(),
                |i| format!("first difference at line {}", i + 1),
            );
            return Err(format!("{HEADER} is stale ({line}): run `cargo xtask header` and commit it"));
        }
    }
    Ok(())
}
