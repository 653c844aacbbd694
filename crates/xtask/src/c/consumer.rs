//! `cargo xtask c-package --check`: the C package used as a C project uses it, from a copy
//! in a fresh folder outside the checkout. A small consumer (bindings/c/tests/consumer)
//! is built through pkg-config against the shared library, with `--static` into a fully
//! static program and into one with the archive named (aerostrata static, the C library
//! shared), and through CMake's `find_package` against both imported targets; each
//! program must print the 1976 standard's sea level and pass its checks.

use std::path::{Path, PathBuf};

use super::package::{self, Package};
use crate::process::Cmd;
use crate::scratch::{copy_tree, Scratch};

const CONSUMER_DIR: &str = "bindings/c/tests/consumer";
const SOURCE: &str = "sea_level.c";
const C_FLAGS: [&str; 5] = ["-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic"];
/// What the builds need besides a C compiler.
const BUILD_PACKAGES: [&str; 2] = ["pkg-config", "cmake"];
/// The shared library's SONAME, as a program records it.
const SONAME: &str = "libaerostrata.so.0.1";

/// The test command's step: the host's package (release), then [`check`].
pub fn run(root: &Path) -> Result<(), String> {
    crate::setup::apt_install(root, &BUILD_PACKAGES)?;
    let package = package::host(root)?;
    check(root, &package)
}

/// Copies `package` and the consumer's sources to a fresh temporary folder and builds
/// and runs the consumer there five ways; PKG_CONFIG_PATH and CMAKE_PREFIX_PATH name
/// the copy only. The folder is removed afterwards.
pub fn check(root: &Path, package: &Package) -> Result<(), String> {
    crate::setup::apt_install(root, &BUILD_PACKAGES)?;
    let scratch = Scratch::new(root, "c-consumer")?;
    let prefix = scratch.path().join("prefix");
    let src = scratch.path().join("consumer");
    copy_tree(&package.prefix, &prefix)?;
    copy_tree(&root.join(CONSUMER_DIR), &src)?;
    let lib = prefix.join("lib");
    let s = |p: &Path| p.to_string_lossy().into_owned();
    let envs = [("PKG_CONFIG_PATH", s(&lib.join("pkgconfig"))), ("CMAKE_PREFIX_PATH", s(&prefix))];
    let pkg_config = |flags: &[&str]| -> Result<Vec<String>, String> {
        let text =
            Cmd::new("pkg-config").args(flags).arg("aerostrata").envs(envs.clone()).dir(&src).stdout()?;
        Ok(text.split_whitespace().map(str::to_owned).collect())
    };
    // The .pc finds its prefix relative to itself: it must name the copy.
    let reported = pkg_config(&["--variable=prefix"])?.join(" ");
    let in_copy =
        Path::new(&reported).canonicalize().is_ok_and(|p| p == prefix.canonicalize().unwrap_or_default());
    if !in_copy {
        return Err(format!("pkg-config gives the prefix {reported}, not the copy {}", prefix.display()));
    }
    let mut lines = Vec::new();

    // Shared, through pkg-config, found at run time through LD_LIBRARY_PATH.
    let shared = src.join("sea_level_pkgconfig");
    let mut args: Vec<String> = C_FLAGS.iter().map(|f| f.to_string()).collect();
    args.push(SOURCE.to_owned());
    args.extend(pkg_config(&["--cflags", "--libs"])?);
    args.extend(["-lm".to_owned(), "-o".to_owned(), s(&shared)]);
    Cmd::new("cc").args(&args).envs(envs.clone()).dir(&src).run()?;
    let run_env = [("LD_LIBRARY_PATH", s(&lib))];
    let printed = Cmd::new(&shared).envs(run_env.clone()).dir(&src).quiet().capture()?.stdout_text();
    let value = read_sea_level(&printed).map_err(|e| format!("{}: {e}", shared.display()))?;
    loads_from(&shared, &run_env, &lib)?;
    lines.push(format!("pkg-config, shared library from the copy: {value}"));

    // Fully static, through `pkg-config --static` (Libs.private).
    let fully_static = src.join("sea_level_pkgconfig_static");
    let mut args: Vec<String> = C_FLAGS.iter().map(|f| f.to_string()).collect();
    args.extend(["-static".to_owned(), SOURCE.to_owned()]);
    args.extend(pkg_config(&["--static", "--cflags", "--libs"])?);
    args.extend(["-lm".to_owned(), "-o".to_owned(), s(&fully_static)]);
    Cmd::new("cc").args(&args).envs(envs.clone()).dir(&src).run()?;
    let printed = Cmd::new(&fully_static).dir(&src).quiet().capture()?.stdout_text();
    let value = read_sea_level(&printed).map_err(|e| format!("{}: {e}", fully_static.display()))?;
    let needed = needed_libraries(&fully_static)?;
    if !needed.is_empty() {
        return Err(format!(
            "{} is not fully static: it needs {}",
            fully_static.display(),
            needed.join(", ")
        ));
    }
    lines.push(format!("pkg-config --static, a fully static program: {value}"));

    // Only aerostrata static, the C library shared: the archive named, as docs/c-guide.md
    // shows (`-laerostrata` would find the shared library beside it first).
    let mixed = src.join("sea_level_pkgconfig_archive");
    let libdir = pkg_config(&["--variable=libdir"])?.join(" ");
    let mut args: Vec<String> = C_FLAGS.iter().map(|f| f.to_string()).collect();
    args.extend(pkg_config(&["--cflags"])?);
    args.extend([SOURCE.to_owned(), format!("{libdir}/libaerostrata.a")]);
    args.extend(pkg_config(&["--static", "--libs-only-l"])?.into_iter().filter(|l| l != "-laerostrata"));
    args.extend(["-lm".to_owned(), "-o".to_owned(), s(&mixed)]);
    Cmd::new("cc").args(&args).envs(envs.clone()).dir(&src).run()?;
    let printed = Cmd::new(&mixed).dir(&src).quiet().capture()?.stdout_text();
    let value = read_sea_level(&printed).map_err(|e| format!("{}: {e}", mixed.display()))?;
    let needed = needed_libraries(&mixed)?;
    if needed.iter().any(|n| n.starts_with("libaerostrata")) {
        return Err(format!("{} needs the shared library: {}", mixed.display(), needed.join(", ")));
    }
    lines.push(format!("pkg-config --static with the archive named (needs {}): {value}", needed.join(", ")));

    // CMake's find_package, both imported targets.
    let build = src.join("build");
    Cmd::new("cmake")
        .args(["-S", &s(&src), "-B", &s(&build), "-DCMAKE_BUILD_TYPE=Release"])
        .arg(format!("-DCMAKE_PREFIX_PATH={}", s(&prefix)))
        .envs(envs.clone())
        .dir(&src)
        .run()?;
    Cmd::new("cmake").args(["--build", &s(&build)]).envs(envs.clone()).dir(&src).run()?;
    for (exe, shared) in [("sea_level_shared", true), ("sea_level_static", false)] {
        let exe = build.join(exe);
        let printed = Cmd::new(&exe).dir(&src).quiet().capture()?.stdout_text();
        let value = read_sea_level(&printed).map_err(|e| format!("{}: {e}", exe.display()))?;
        if shared {
            // Found through the build tree's rpath that CMake writes for an imported target.
            loads_from(&exe, &[], &lib)?;
            lines.push(format!("CMake aerostrata::aerostrata (shared, rpath into the copy): {value}"));
        } else {
            let needed = needed_libraries(&exe)?;
            if needed.iter().any(|n| n.starts_with("libaerostrata")) {
                return Err(format!("{} needs the shared library: {}", exe.display(), needed.join(", ")));
            }
            lines.push(format!("CMake aerostrata::aerostrata_static (needs {}): {value}", needed.join(", ")));
        }
    }
    for line in &lines {
        eprintln!("  C package consumer, {line}");
    }
    Ok(())
}

/// The shared libraries `exe` names (readelf's NEEDED entries); none for a static program.
fn needed_libraries(exe: &Path) -> Result<Vec<String>, String> {
    let dynamic = Cmd::new("readelf").arg("-d").arg(exe).quiet().capture()?.stdout_text();
    Ok(dynamic
        .lines()
        .filter(|l| l.contains("(NEEDED)"))
        .filter_map(|l| {
            l.split_once('[').and_then(|(_, rest)| rest.split_once(']')).map(|(n, _)| n.to_owned())
        })
        .collect())
}

/// Ok when the loader, with `envs`, resolves the SONAME of `exe`'s aerostrata to a file
/// in `lib` (ldd: `libaerostrata.so.0.1 => /path/libaerostrata.so.0.1 (0x...)`).
fn loads_from(exe: &Path, envs: &[(&str, String)], lib: &Path) -> Result<(), String> {
    let listing = Cmd::new("ldd").arg(exe).envs(envs.iter().cloned()).quiet().capture()?.stdout_text();
    let resolved: Option<PathBuf> = listing.lines().find_map(|l| {
        let (name, rest) = l.trim().split_once(" => ")?;
        (name == SONAME).then(|| PathBuf::from(rest.split(" (").next().unwrap_or(rest)))
    });
    let lib = lib.canonicalize().unwrap_or_else(|_| lib.to_path_buf());
    match resolved {
        Some(path) if path.canonicalize().is_ok_and(|p| p.starts_with(&lib)) => Ok(()),
        _ => Err(format!("{} does not load {SONAME} from {}:\n{listing}", exe.display(), lib.display())),
    }
}

/// Reads the consumer's output: its `sea level: T K, p Pa, rho kg/m3` line must give the
/// U.S. Standard Atmosphere 1976's sea level (Table I: 288.150 K, 1.01325E+05 Pa,
/// 1.2250 kg/m^3) to the digits printed, and its last line must be `ok: 0 failed`.
fn read_sea_level(printed: &str) -> Result<String, String> {
    let line = printed.lines().find(|l| l.starts_with("sea level: ")).ok_or("no 'sea level:' line")?;
    let numbers: Vec<f64> = line.split([' ', ',']).filter_map(|w| w.parse().ok()).collect();
    let published = matches!(numbers[..], [t, p, rho]
        if (t - 288.15).abs() <= 0.0005 && (p - 101_325.0).abs() <= 0.05 && (rho - 1.225).abs() <= 0.00005);
    if !published {
        return Err(format!("'{line}' is not the standard's 288.150 K, 101325.0 Pa, 1.2250 kg/m3"));
    }
    match printed.lines().last() {
        Some("ok: 0 failed") => Ok(line.trim_start_matches("sea level: ").to_owned()),
        last => Err(format!("the consumer's checks ended with {last:?}:\n{printed}")),
    }
}

#[cfg(test)]
mod tests {
    use super::read_sea_level;

    #[test]
    fn the_consumer_output_must_carry_the_published_sea_level() {
        // U.S. Standard Atmosphere 1976, Table I at 0 m.
        let good = "sea level: 288.150 K, 101325.0 Pa, 1.2250 kg/m3\nok: 0 failed\n";
        assert_eq!(read_sea_level(good).unwrap(), "288.150 K, 101325.0 Pa, 1.2250 kg/m3");
        let wrong = "sea level: 288.150 K, 101320.0 Pa, 1.2250 kg/m3\nok: 0 failed\n";
        assert!(read_sea_level(wrong).unwrap_err().contains("101320.0 Pa"));
        let failed = "sea level: 288.150 K, 101325.0 Pa, 1.2250 kg/m3\nFAILED: x\nFAILED: 1 failed\n";
        assert!(read_sea_level(failed).unwrap_err().contains("FAILED: 1 failed"));
        assert!(read_sea_level("").is_err());
        assert!(read_sea_level("sea level: 288.150 K\nok: 0 failed").is_err());
    }
}
