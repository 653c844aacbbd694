//! The shared library's SONAME. Until 1.0 the ABI may change between minor versions, so
//! the SONAME carries major and minor: libaerostrata.so.0.1 (docs/c-guide.md, "ABI
//! stability"). Only ELF targets have one.

fn main() {
    let os = std::env::var("CARGO_CFG_TARGET_OS").unwrap_or_default();
    let family = std::env::var("CARGO_CFG_TARGET_FAMILY").unwrap_or_default();
    if family == "unix" && os != "macos" && os != "ios" {
        let major = env!("CARGO_PKG_VERSION_MAJOR");
        let minor = env!("CARGO_PKG_VERSION_MINOR");
        println!("cargo:rustc-cdylib-link-arg=-Wl,-soname,libaerostrata.so.{major}.{minor}");
    }
    println!("cargo:rerun-if-changed=build.rs");
}
