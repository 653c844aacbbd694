//! The C door's build script: the catalogue's part of the crate's source, and the shared
//! library's SONAME.
//!
//! `src/catalogue.rs` includes what [`catalogue::generate`] writes into OUT_DIR from the
//! core's quantity catalogue (the quantity ids and the records of a state and of a flight
//! sample), so the source holds no list of quantities of its own.
//!
//! Until 1.0 the ABI may change between minor versions, so the SONAME carries major and
//! minor: libaerostrata.so.0.1 (docs/c-guide.md, "ABI stability"). Only ELF targets have
//! one.

mod catalogue;

use std::path::PathBuf;

fn main() -> Result<(), String> {
    let out_dir = std::env::var_os("OUT_DIR").ok_or("cargo did not set OUT_DIR")?;
    let generated = PathBuf::from(out_dir).join("catalogue.rs");
    std::fs::write(&generated, catalogue::generate())
        .map_err(|e| format!("cannot write {}: {e}", generated.display()))?;

    let os = std::env::var("CARGO_CFG_TARGET_OS").unwrap_or_default();
    let family = std::env::var("CARGO_CFG_TARGET_FAMILY").unwrap_or_default();
    if family == "unix" && os != "macos" && os != "ios" {
        let major = env!("CARGO_PKG_VERSION_MAJOR");
        let minor = env!("CARGO_PKG_VERSION_MINOR");
        println!("cargo:rustc-cdylib-link-arg=-Wl,-soname,libaerostrata.so.{major}.{minor}");
    }
    println!("cargo:rerun-if-changed=build");
    Ok(())
}
