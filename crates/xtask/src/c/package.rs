//! `cargo xtask c-package`: the C library laid out the way a C project expects to find
//! it, under a prefix:
//!
//! ```text
//! PREFIX/include/aerostrata.h
//! PREFIX/lib/libaerostrata.a
//! PREFIX/lib/libaerostrata.so.0.1.0, .so.0.1 -> .so.0.1.0, .so -> .so.0.1   (hosts only)
//! PREFIX/lib/pkgconfig/aerostrata.pc
//! PREFIX/lib/cmake/aerostrata/aerostrata-config.cmake, aerostrata-config-version.cmake
//! ```
//!
//! cargo names the crate's outputs libaerostrata_c.* (see bindings/c/Cargo.toml); this is
//! where they become libaerostrata. The pkg-config and CMake files find the prefix
//! relative to themselves, so the tree can be copied anywhere. For a bare-metal target
//! only the static library is built (no std, C `malloc` for the handles, a panic handler).

use std::fs;
use std::path::{Path, PathBuf};

use crate::io_error;
use crate::process::Cmd;
use crate::setup::TargetToolchain;
use crate::target_dir;

/// The SONAME's version: major and minor until 1.0, when it becomes the major alone
/// (docs/c-guide.md, "ABI stability"). Must match bindings/c/build.rs.
fn soname_version() -> String {
    let version = env!("CARGO_PKG_VERSION");
    let mut parts = version.split('.');
    format!("{}.{}", parts.next().unwrap_or("0"), parts.next().unwrap_or("0"))
}

/// The features of the bare-metal static library.
pub const BARE_METAL_FEATURES: &str = "upper,malloc,panic-handler";

/// What `package` made.
pub struct Package {
    pub prefix: PathBuf,
    pub static_lib: PathBuf,
    /// The versioned shared library (None for a bare-metal target).
    pub shared_lib: Option<PathBuf>,
    /// What a static link needs besides the library (rustc's native-static-libs).
    pub native_static_libs: Vec<String>,
}

/// The default prefix: target/c-package/host, or target/c-package/TRIPLE.
pub fn default_prefix(root: &Path, target: Option<&str>) -> PathBuf {
    target_dir(root).join("c-package").join(target.unwrap_or("host"))
}

/// Builds the library (release) for the host or `target` and lays it out under
/// `prefix`, replacing what was there. `envs` and `extra_args` select another toolchain
/// (Debian's rustc with -Zbuild-std; `--target-dir DIR` among the args is honoured).
pub fn package(
    root: &Path,
    target: Option<&str>,
    prefix: &Path,
    envs: &[(&str, &str)],
    extra_args: &[&str],
) -> Result<Package, String> {
    let mut args = vec!["rustc", "--release", "-p", "aerostrata-c"];
    if let Some(triple) = target {
        args.extend(["--target", triple, "--no-default-features", "--features", BARE_METAL_FEATURES]);
    }
    args.extend(extra_args);
    let crate_types = if target.is_some() { "staticlib" } else { "staticlib,cdylib" };
    args.extend(["--crate-type", crate_types, "--", "--print", "native-static-libs"]);
    // rustc prints the native-static-libs note on stderr.
    let stderr = Cmd::new("cargo").args(&args).envs(envs.iter().copied()).dir(root).capture()?.stderr_text();
    let native_static_libs: Vec<String> = stderr
        .lines()
        .find_map(|l| l.split_once("native-static-libs:").map(|(_, libs)| libs))
        .unwrap_or_default()
        .split_whitespace()
        .map(str::to_owned)
        .collect();

    let build_root = extra_args
        .iter()
        .position(|a| *a == "--target-dir")
        .and_then(|i| extra_args.get(i + 1))
        .map_or_else(|| target_dir(root), |dir| root.join(dir));
    let built = match target {
        Some(triple) => build_root.join(triple).join("release"),
        None => build_root.join("release"),
    };
    if prefix.exists() {
        fs::remove_dir_all(prefix).map_err(|e| io_error("remove", prefix, e))?;
    }
    let include = prefix.join("include");
    let lib = prefix.join("lib");
    let pkgconfig = lib.join("pkgconfig");
    let cmake = lib.join("cmake").join("aerostrata");
    for dir in [&include, &pkgconfig, &cmake] {
        fs::create_dir_all(dir).map_err(|e| io_error("create", dir, e))?;
    }
    let copy = |from: &Path, to: &Path| fs::copy(from, to).map(|_| ()).map_err(|e| io_error("copy", from, e));
    copy(&root.join("bindings/c/include/aerostrata.h"), &include.join("aerostrata.h"))?;
    let static_lib = lib.join("libaerostrata.a");
    copy(&built.join("libaerostrata_c.a"), &static_lib)?;

    let version = env!("CARGO_PKG_VERSION");
    let soname = format!("libaerostrata.so.{}", soname_version());
    let shared_lib = if target.is_none() {
        let real = lib.join(format!("libaerostrata.so.{version}"));
        copy(&built.join("libaerostrata_c.so"), &real)?;
        symlink(&format!("libaerostrata.so.{version}"), &lib.join(&soname))?;
        symlink(&soname, &lib.join("libaerostrata.so"))?;
        Some(real)
    } else {
        None
    };

    let private = static_link_libs(&native_static_libs).join(" ");
    let pc = format!(
        "# aerostrata {version}: pkg-config file written by `cargo xtask c-package`.\n\
         prefix=${{pcfiledir}}/../..\n\
         libdir=${{prefix}}/lib\n\
         includedir=${{prefix}}/include\n\
         \n\
         Name: aerostrata\n\
         Description: Standard and user atmospheres and aerodynamic helpers (C interface)\n\
         Version: {version}\n\
         Cflags: -I${{includedir}}\n\
         Libs: -L${{libdir}} -laerostrata\n\
         Libs.private: {private}\n"
    );
    let pc_path = pkgconfig.join("aerostrata.pc");
    fs::write(&pc_path, pc).map_err(|e| io_error("write", &pc_path, e))?;

    let link_libraries: Vec<&str> = static_link_libs(&native_static_libs)
        .into_iter()
        .filter_map(|l| l.strip_prefix("-l"))
        .filter(|l| *l != "c")
        .collect();
    let shared_target = if shared_lib.is_some() {
        format!(
            "  add_library(aerostrata::aerostrata SHARED IMPORTED)\n  \
             set_target_properties(aerostrata::aerostrata PROPERTIES\n    \
             IMPORTED_LOCATION \"${{_aerostrata_prefix}}/lib/libaerostrata.so.{version}\"\n    \
             IMPORTED_SONAME \"{soname}\"\n    \
             INTERFACE_INCLUDE_DIRECTORIES \"${{_aerostrata_prefix}}/include\")\n"
        )
    } else {
        String::new()
    };
    let config = format!(
        "# aerostrata {version}: CMake package written by `cargo xtask c-package`.\n\
         # Targets: aerostrata::aerostrata (shared library; hosts only) and\n\
         # aerostrata::aerostrata_static (static library with what it needs to link).\n\
         get_filename_component(_aerostrata_prefix \"${{CMAKE_CURRENT_LIST_DIR}}/../../..\" ABSOLUTE)\n\
         if(NOT TARGET aerostrata::aerostrata_static)\n\
         {shared_target}  \
         add_library(aerostrata::aerostrata_static STATIC IMPORTED)\n  \
         set_target_properties(aerostrata::aerostrata_static PROPERTIES\n    \
         IMPORTED_LOCATION \"${{_aerostrata_prefix}}/lib/libaerostrata.a\"\n    \
         INTERFACE_INCLUDE_DIRECTORIES \"${{_aerostrata_prefix}}/include\"\n    \
         INTERFACE_LINK_LIBRARIES \"{}\")\n\
         endif()\n\
         unset(_aerostrata_prefix)\n",
        link_libraries.join(";")
    );
    let config_path = cmake.join("aerostrata-config.cmake");
    fs::write(&config_path, config).map_err(|e| io_error("write", &config_path, e))?;
    // Before 1.0 only the same minor version is compatible (the ABI policy); a request
    // for a higher patch than this one is not met either.
    let (major, minor) = soname_version().split_once('.').map(|(a, b)| (a.to_owned(), b.to_owned())).unwrap();
    let config_version = format!(
        "set(PACKAGE_VERSION \"{version}\")\n\
         set(PACKAGE_VERSION_COMPATIBLE FALSE)\n\
         if(PACKAGE_FIND_VERSION_MAJOR EQUAL {major} AND PACKAGE_FIND_VERSION_MINOR EQUAL {minor}\n   \
         AND NOT PACKAGE_FIND_VERSION VERSION_GREATER PACKAGE_VERSION)\n  \
         set(PACKAGE_VERSION_COMPATIBLE TRUE)\n\
         endif()\n\
         if(PACKAGE_FIND_VERSION VERSION_EQUAL PACKAGE_VERSION)\n  \
         set(PACKAGE_VERSION_EXACT TRUE)\n\
         endif()\n"
    );
    let version_path = cmake.join("aerostrata-config-version.cmake");
    fs::write(&version_path, config_version).map_err(|e| io_error("write", &version_path, e))?;
    eprintln!("C package in {}", prefix.display());
    Ok(Package { prefix: prefix.to_path_buf(), static_lib, shared_lib, native_static_libs })
}

/// What a program linking the static library must name besides it (the .pc's
/// `Libs.private`, the CMake static target's link libraries): rustc's native-static-libs
/// without `-lgcc_s`. libgcc_s is shared only (Debian ships no libgcc_s.a), so naming it
/// breaks `cc -static $(pkg-config --static --libs aerostrata)`; the compiler driver
/// links the unwinder the Rust standard library needs by itself, libgcc_s "as needed"
/// in a dynamic program and libgcc_eh in a static one (gcc's and clang's `libgcc` specs).
fn static_link_libs(native_static_libs: &[String]) -> Vec<&str> {
    native_static_libs.iter().map(String::as_str).filter(|l| *l != "-lgcc_s").collect()
}

/// Builds the host's C package (release) at its default prefix.
pub fn host(root: &Path) -> Result<Package, String> {
    let prefix = default_prefix(root, None);
    package(root, None, &prefix, &[], &[])
}

/// The bare-metal package for `target` at its default prefix, built by rustup's target
/// or, where rustup could not add it, by Debian's rustc building `core` and `alloc`.
pub fn bare_metal(root: &Path, target: &str, toolchain: TargetToolchain) -> Result<Package, String> {
    let prefix = default_prefix(root, Some(target));
    match toolchain {
        TargetToolchain::Rustup => package(root, Some(target), &prefix, &[], &[]),
        TargetToolchain::DebianBuildStd => package(
            root,
            Some(target),
            &prefix,
            &crate::setup::DEBIAN_ENVS,
            &["-Zbuild-std=core,alloc", "--target-dir", "target/debian-rustc"],
        ),
    }
}

fn symlink(original: &str, link: &Path) -> Result<(), String> {
    std::os::unix::fs::symlink(original, link)
        .map_err(|e| format!("cannot link {} -> {original}: {e}", link.display()))
}

/// `cargo xtask c-package [--prefix DIR] [--target TRIPLE] [--check]`; `--check` (hosts
/// only) then builds a consumer against a copy of the package (`super::consumer`).
pub fn run(root: &Path, args: &[String]) -> Result<(), String> {
    let value = |flag: &str| args.iter().position(|a| a == flag).and_then(|i| args.get(i + 1)).cloned();
    let target = value("--target");
    let prefix = value("--prefix").map_or_else(
        || default_prefix(root, target.as_deref()),
        |p| std::env::current_dir().unwrap_or_default().join(p),
    );
    let check = args.iter().any(|a| a == "--check");
    if check && target.is_some() {
        return Err("c-package --check: the consumer is built for the host only; drop --target".to_owned());
    }
    let package = package(root, target.as_deref(), &prefix, &[], &[])?;
    if check {
        super::consumer::check(root, &package)
    } else {
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::static_link_libs;

    #[test]
    fn a_static_link_does_not_name_the_shared_only_unwinder() {
        // rustc 1.95's native-static-libs for x86_64-unknown-linux-gnu.
        let native: Vec<String> =
            "-lgcc_s -lutil -lrt -lpthread -lm -ldl -lc".split(' ').map(str::to_owned).collect();
        assert_eq!(static_link_libs(&native), ["-lutil", "-lrt", "-lpthread", "-lm", "-ldl", "-lc"]);
        assert!(static_link_libs(&[]).is_empty());
    }
}
