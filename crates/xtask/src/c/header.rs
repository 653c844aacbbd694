//! `cargo xtask header [--check]`: bindings/c/src/catalogue.rs regenerated from the core's
//! quantity catalogue, then bindings/c/include/aerostrata.h with the
//! pinned cbindgen (installed under target/tools when missing), or compared with a fresh
//! generation.

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

/// Regenerates bindings/c/include/aerostrata.h; with `check_only`, writes it to a
/// temporary file instead and fails if it differs from the committed one.
pub fn run(root: &Path, check_only: bool) -> Result<(), String> {
    let cbindgen = cbindgen(root)?;
    // The C door's catalogue source first: cbindgen reads it with the rest of the crate.
    let generated = root.join(super::catalogue::GENERATED);
    let fresh = super::catalogue::generate();
    if check_only {
        let committed = std::fs::read_to_string(&generated).unwrap_or_default();
        if committed != fresh {
            return Err(format!(
                "{} is stale: run `cargo xtask header` and commit it",
                super::catalogue::GENERATED
            ));
        }
    } else {
        std::fs::write(&generated, fresh).map_err(|e| io_error("write", &generated, e))?;
    }
    let committed = root.join(HEADER);
    let output = if check_only { target_dir(root).join("aerostrata.h.check") } else { committed.clone() };
    if let Some(dir) = output.parent() {
        std::fs::create_dir_all(dir).map_err(|e| io_error("create", dir, e))?;
    }
    let output_arg = output.to_string_lossy().into_owned();
    Cmd::new(cbindgen)
        .args(["--quiet", "--config", "bindings/c/cbindgen.toml", "--crate", "aerostrata-c", "--output"])
        .args([&output_arg, "bindings/c"])
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
