//! The C door's automation: regenerate (or check) the committed header with a pinned
//! cbindgen, and run the C tests against the static and the shared library, plain, under
//! AddressSanitizer with UBSan and under Valgrind, plus the Python ctypes test.

use std::path::{Path, PathBuf};

use crate::process::Cmd;
use crate::target_dir;

/// The cbindgen the header is generated with. Pinned exactly: another version may write
/// a different header, and the check below would then fail for no change of ours.
pub const CBINDGEN_VERSION: &str = "0.29.2";

const HEADER: &str = "bindings/c/include/aerostrata.h";
const C_TEST: &str = "bindings/c/tests/test_aerostrata.c";
const CTYPES_TEST: &str = "bindings/c/tests/test_ctypes.py";
const C_FLAGS: [&str; 5] = ["-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic"];

/// target/tools/bin/cbindgen at the pinned version, installed there when missing.
fn cbindgen(root: &Path) -> Result<PathBuf, String> {
    crate::setup::cargo_tool(root, "cbindgen", "cbindgen", CBINDGEN_VERSION)
}

/// Regenerates bindings/c/include/aerostrata.h; with `check_only`, writes it to a
/// temporary file instead and fails if it differs from the committed one.
pub fn header(root: &Path, check_only: bool) -> Result<(), String> {
    let cbindgen = cbindgen(root)?;
    let committed = root.join(HEADER);
    let output = if check_only { target_dir(root).join("aerostrata.h.check") } else { committed.clone() };
    if let Some(dir) = output.parent() {
        std::fs::create_dir_all(dir).map_err(|e| format!("cannot create {}: {e}", dir.display()))?;
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

/// Runs a test program and reads the "N passed, N failed" line it printed last, as Ok
/// only with 0 failed and N > 0.
fn tally(label: &str, test: Cmd) -> Result<String, String> {
    let stdout = test.capture()?.stdout_text();
    let line =
        stdout.lines().rev().find(|l| l.ends_with(" failed")).ok_or(format!("{label}: no tally line"))?;
    let numbers: Vec<usize> = line.split(' ').filter_map(|w| w.parse().ok()).collect();
    match numbers[..] {
        [passed, 0] if passed > 0 => Ok(format!("{label}: {line}")),
        _ => Err(format!("{label}: {line}\n{stdout}")),
    }
}

/// Builds the host's C package (release) at its default prefix.
fn build_package(root: &Path) -> Result<crate::c_package::Package, String> {
    let prefix = crate::c_package::default_prefix(root, None);
    crate::c_package::package(root, None, &prefix, &[], &[])
}

/// Builds the C package (release), compiles the C tests against its static and shared
/// library with gcc as strict C99 and the header as C++17, runs them plain, under
/// ASan+UBSan and under Valgrind, runs the ctypes test and builds and checks the
/// altimeter example. Every step must pass with zero errors and leaks.
pub fn test(root: &Path) -> Result<(), String> {
    crate::setup::apt_install(root, &BUILD_PACKAGES)?;
    let package = build_package(root)?;
    let lib_dir = package.prefix.join("lib");
    let work = target_dir(root).join("c-tests");
    std::fs::create_dir_all(&work).map_err(|e| format!("cannot create {}: {e}", work.display()))?;
    let s = |p: &Path| p.to_string_lossy().into_owned();
    let include = format!("-I{}", s(&package.prefix.join("include")));
    let source = s(&root.join(C_TEST));
    let vectors = s(&root.join("tests/vectors"));
    let static_lib = s(&package.static_lib);
    let lib_dir_arg = format!("-L{}", s(&lib_dir));
    // DT_RPATH, not RUNPATH: `cargo run` (and so `cargo xtask`) puts target/debug/deps on
    // LD_LIBRARY_PATH, which a RUNPATH yields to; the package's library must be the one
    // loaded.
    let rpath = format!("-Wl,--disable-new-dtags,-rpath,{}", s(&lib_dir));
    let system_libs: Vec<&str> = package.native_static_libs.iter().map(String::as_str).collect();
    let mut results = Vec::new();

    // The header alone, as C++17 (its C++ guards and types must compile there too).
    let cpp = work.join("header_cpp.cpp");
    std::fs::write(
        &cpp,
        "#include \"aerostrata.h\"\nint main() { return aerostrata_status_message(0) ? 0 : 1; }\n",
    )
    .map_err(|e| format!("cannot write {}: {e}", cpp.display()))?;
    let cpp_exe = s(&work.join("header_cpp"));
    let cpp_source = s(&cpp);
    let mut cpp_args = vec!["-std=c++17", "-Wall", "-Wextra", "-Werror", "-pedantic", &include, &cpp_source];
    cpp_args.push(&static_lib);
    cpp_args.extend_from_slice(&system_libs);
    cpp_args.extend_from_slice(&["-o", &cpp_exe]);
    Cmd::new("g++").args(cpp_args).dir(root).run()?;
    Cmd::new(&cpp_exe).dir(root).run()?;
    results.push("header compiles and links as C++17".to_owned());

    let compile = |exe: &str, extra: &[&str], link: &[&str]| -> Result<String, String> {
        let out = s(&work.join(exe));
        let mut args: Vec<&str> = C_FLAGS.to_vec();
        args.extend_from_slice(extra);
        args.extend_from_slice(&[&include, &source]);
        args.extend_from_slice(link);
        args.extend_from_slice(&system_libs);
        args.extend_from_slice(&["-o", &out]);
        Cmd::new("gcc").args(args).dir(root).run()?;
        Ok(out)
    };
    let static_exe = compile("test_static", &["-g"], &[&static_lib])?;
    let shared_exe = compile("test_shared", &["-g"], &[&lib_dir_arg, &rpath, "-l:libaerostrata.so"])?;
    let asan_exe = compile(
        "test_asan",
        &["-g", "-fsanitize=address,undefined", "-fno-sanitize-recover=all"],
        &[&static_lib],
    )?;

    let c_test = |program: &str| Cmd::new(program).dir(root);
    results.push(tally("C tests, static library", c_test(&static_exe).arg(&vectors))?);
    results.push(tally("C tests, shared library", c_test(&shared_exe).arg(&vectors))?);
    let sanitizers = [
        ("ASAN_OPTIONS", "detect_leaks=1:abort_on_error=0:halt_on_error=1"),
        ("UBSAN_OPTIONS", "print_stacktrace=1:halt_on_error=1"),
    ];
    results.push(tally(
        "C tests under AddressSanitizer + UBSan",
        c_test(&asan_exe).arg(&vectors).envs(sanitizers),
    )?);
    for exe in [&static_exe, &shared_exe] {
        let valgrind = c_test("valgrind").args([
            "--error-exitcode=1",
            "--leak-check=full",
            "--errors-for-leak-kinds=definite,indirect,possible",
            "--quiet",
            exe,
            &vectors,
        ]);
        results.push(tally(&format!("C tests under Valgrind ({exe})"), valgrind)?);
    }
    let so = s(package.shared_lib.as_deref().ok_or("the host package has no shared library")?);
    results.push(tally(
        "Python ctypes test",
        c_test("python3").args([&s(&root.join(CTYPES_TEST)), &so, &vectors]),
    )?);
    results.push(readme_example(root, &work, &include, &static_lib, &system_libs)?);
    results.push(altimeter_example(root, &package, &work)?);
    for line in &results {
        eprintln!("  {line}");
    }
    Ok(())
}

/// The README's C example, as a reader would use it: its `#include` lines at the top and
/// the rest as the body of `main`, compiled as strict C99 against the static library. It
/// must print the standard+15 K day at 11 km: 216.774 + 15 K (U.S. Standard Atmosphere
/// 1976 at 11 000 m geometric, from memory of the printed table: tests/vectors) at the
/// standard's 2.2700E+04 Pa (the offset keeps the standard's pressure).
fn readme_example(
    root: &Path,
    work: &Path,
    include: &str,
    static_lib: &str,
    system_libs: &[&str],
) -> Result<String, String> {
    let readme =
        std::fs::read_to_string(root.join("README.md")).map_err(|e| format!("cannot read README.md: {e}"))?;
    let block = readme
        .split("```c\n")
        .nth(1)
        .and_then(|rest| rest.split("```").next())
        .ok_or("README.md has no ```c block")?;
    let (includes, body): (Vec<&str>, Vec<&str>) = block.lines().partition(|l| l.starts_with("#include"));
    let source = format!(
        "#include <stdio.h>\n{}\nint main(void) {{\n{}\n    return 0;\n}}\n",
        includes.join("\n"),
        body.join("\n")
    );
    let path = work.join("readme_example.c");
    std::fs::write(&path, source).map_err(|e| format!("cannot write {}: {e}", path.display()))?;
    let exe = work.join("readme_example");
    let (path_arg, exe_arg) = (path.to_string_lossy().into_owned(), exe.to_string_lossy().into_owned());
    let mut args: Vec<&str> = C_FLAGS.to_vec();
    args.extend([include, &path_arg, static_lib]);
    args.extend_from_slice(system_libs);
    args.extend(["-o", &exe_arg]);
    Cmd::new("gcc").args(args).dir(root).run()?;
    let printed = Cmd::new(&exe_arg).dir(root).capture()?.stdout_text();
    let numbers: Vec<f64> = printed.split([' ', ',']).filter_map(|w| w.parse().ok()).collect();
    // To the digits printed: 0.01 K and 0.1 Pa, with the table's own half unit of 0.5 Pa.
    let expected =
        matches!(numbers[..], [t, p] if (t - 231.774).abs() <= 0.0105 && (p - 22_700.0).abs() <= 0.55);
    if !expected {
        return Err(format!(
            "the README's C example printed '{}', not about 231.77 K and 22700 Pa",
            printed.trim()
        ));
    }
    Ok(format!("the README's C example compiles as C99 and prints {}", printed.trim()))
}

/// What the C tests and the example's two builds need besides gcc.
const BUILD_PACKAGES: [&str; 3] = ["make", "pkg-config", "cmake"];

const ALTIMETER_DIR: &str = "examples/c-altimeter";

/// examples/c-altimeter built as a C project would build it, from the installed package:
/// with its Makefile through pkg-config (shared library) and with its CMakeLists.txt
/// through the CMake package (shared and static). The three programs must print the
/// same CSV, find the invented log's true apogee and maximum dynamic pressure (its
/// comment lines, written by make_log.py) within the tolerances below, and reject a bad
/// line with exit status 2.
fn altimeter_example(
    root: &Path,
    package: &crate::c_package::Package,
    work: &Path,
) -> Result<String, String> {
    // The log is sampled at 20 Hz: apogee time within 4 samples; its altitude within
    // 2 m (the 3 Pa noise is about 0.25 m, and the fit's window straddles the top). The
    // 11-sample window rounds the speed's peak at burnout off, so the maximum dynamic
    // pressure comes out low: within 6 %, and within 0.3 s of the true time.
    const APOGEE_M: f64 = 2.0;
    const APOGEE_S: f64 = 0.2;
    const MAX_Q_REL: f64 = 0.06;
    const MAX_Q_S: f64 = 0.3;
    let s = |p: &Path| p.to_string_lossy().into_owned();
    let dir = root.join(ALTIMETER_DIR);
    let log = dir.join("flight_log.csv");
    let out = work.join("altimeter");
    if out.exists() {
        std::fs::remove_dir_all(&out).map_err(|e| format!("cannot remove {}: {e}", out.display()))?;
    }
    std::fs::create_dir_all(&out).map_err(|e| format!("cannot create {}: {e}", out.display()))?;
    let pkg_config_path = format!("PKG_CONFIG_PATH={}", s(&package.prefix.join("lib/pkgconfig")));
    Cmd::new("make")
        .args(["-s", "-C", &s(&dir), &pkg_config_path, &format!("OUT={}", s(&out))])
        .dir(root)
        .run()?;
    let cmake_build = out.join("cmake");
    Cmd::new("cmake")
        .args(["-S", &s(&dir), "-B", &s(&cmake_build)])
        .args([&format!("-DCMAKE_PREFIX_PATH={}", s(&package.prefix)), "-DCMAKE_BUILD_TYPE=Release"])
        .dir(root)
        .run()?;
    Cmd::new("cmake").args(["--build", &s(&cmake_build)]).dir(root).run()?;
    let mut runs = Vec::new();
    for exe in [out.join("altimeter"), cmake_build.join("altimeter"), cmake_build.join("altimeter_static")] {
        let output = Cmd::new(&exe).arg(&log).quiet().capture()?;
        runs.push((exe, output.stdout_text(), output.stderr_text()));
    }
    if runs.iter().any(|(_, stdout, _)| *stdout != runs[0].1) {
        return Err("the pkg-config and CMake builds of the altimeter print different CSV".to_owned());
    }
    // "... : 1549.59 m above the pad at t = 17.651 s" -> (1549.59, 17.651)
    let numbers = |text: &str, key: &str| -> Result<(f64, f64), String> {
        let line = text.lines().find(|l| l.contains(key)).ok_or(format!("no line with '{key}'"))?;
        let values: Vec<f64> =
            line.split([' ', ':']).filter_map(|w| w.parse().ok()).filter(|v: &f64| v.is_finite()).collect();
        match values[..] {
            [value, time] => Ok((value, time)),
            _ => Err(format!("cannot read '{line}'")),
        }
    };
    let truth = std::fs::read_to_string(&log).map_err(|e| format!("cannot read {}: {e}", log.display()))?;
    let summary = &runs[0].2;
    let (true_apogee, true_apogee_t) = numbers(&truth, "# true apogee")?;
    let (true_q, true_q_t) = numbers(&truth, "# true maximum dynamic pressure")?;
    let (apogee, apogee_t) = numbers(summary, "apogee")?;
    let (q, q_t) = numbers(summary, "maximum dynamic pressure")?;
    let checks = [
        ("apogee altitude, m", apogee, true_apogee, APOGEE_M),
        ("apogee time, s", apogee_t, true_apogee_t, APOGEE_S),
        ("maximum q, Pa", q, true_q, MAX_Q_REL * true_q),
        ("time of maximum q, s", q_t, true_q_t, MAX_Q_S),
    ];
    for (what, got, want, tolerance) in checks {
        if (got - want).abs() > tolerance {
            return Err(format!(
                "altimeter example: {what} {got} vs the log's true {want} (tolerance {tolerance})"
            ));
        }
    }
    let bad = Cmd::new(&runs[0].0).stdin(b"-1,96000\n0,not-a-pressure\n").quiet().output()?;
    let message = bad.stderr_text();
    if bad.code != Some(2) || !message.contains("line 2") {
        return Err(format!("altimeter example: a bad line gave {} and '{message}'", bad.status));
    }
    Ok(format!(
        "altimeter example (pkg-config and CMake, shared and static): apogee {apogee} m at {apogee_t} s \
         (true {true_apogee} m at {true_apogee_t} s), max q {q} Pa at {q_t} s (true {true_q} Pa at {true_q_t} s)"
    ))
}

/// The Debian packages of a headless LibreOffice Calc that runs Python macros.
const SPREADSHEET_PACKAGES: [&str; 3] =
    ["libreoffice-calc-nogui", "python3-uno", "libreoffice-script-provider-python"];
const SPREADSHEET_DIR: &str = "examples/spreadsheet";
const SPREADSHEET_MACROS: [&str; 2] = ["aerostrata_cells.py", "runner.py"];
const SPREADSHEET_HEADER: &str = "geometric_altitude_m,temperature_K,pressure_Pa,density_kg_m3,velocity_m_s,\
                                  dynamic_pressure_Pa,dynamic_pressure_formula_Pa";
/// The altitudes runner.py tabulates, every one a row of usa76_lower.csv.
const SPREADSHEET_ROWS: usize = 27;

/// The real spreadsheet host: installs headless LibreOffice Calc when missing (as root),
/// builds the shared library, runs examples/spreadsheet/runner.py in a fresh profile
/// (soffice --headless under `timeout 180`), which fills a sheet through the library
/// and saves .ods and .csv, then reads the CSV back and checks it against the published
/// vectors (half a unit of the last printed digit), the library called directly (1e-13
/// relative: the file carries 15 significant digits) and rho V^2 / 2 (1e-12 relative).
pub fn spreadsheet(root: &Path) -> Result<(), String> {
    crate::setup::apt_install(root, &SPREADSHEET_PACKAGES)?;
    let lib = build_package(root)?.prefix.join("lib").join("libaerostrata.so");
    let work = target_dir(root).join("spreadsheet");
    let err = |what: &str, p: &Path, e: std::io::Error| format!("cannot {what} {}: {e}", p.display());
    if work.exists() {
        std::fs::remove_dir_all(&work).map_err(|e| err("remove", &work, e))?;
    }
    let profile = work.join("profile");
    let scripts = profile.join("user").join("Scripts").join("python");
    std::fs::create_dir_all(&scripts).map_err(|e| err("create", &scripts, e))?;
    for name in SPREADSHEET_MACROS {
        let from = root.join(SPREADSHEET_DIR).join(name);
        std::fs::copy(&from, scripts.join(name)).map_err(|e| err("copy", &from, e))?;
    }
    let out = work.join("standard_atmosphere");
    let s = |p: &Path| p.to_string_lossy().into_owned();
    let started = std::time::Instant::now();
    Cmd::new("soffice")
        .args(["--headless", "--norestore", &format!("-env:UserInstallation=file://{}", s(&profile))])
        .arg("vnd.sun.star.script:runner.py$main?language=Python&location=user")
        .envs([("AEROSTRATA_LIB", &s(&lib)), ("AEROSTRATA_OUT", &s(&out))])
        .timeout(180)
        .dir(root)
        .capture()?;
    eprintln!("  soffice run: {:.1} s", started.elapsed().as_secs_f64());
    let read = |ext: &str| {
        let path = out.with_extension(ext);
        std::fs::read(&path).map_err(|e| err("read", &path, e))
    };
    let log = String::from_utf8_lossy(&read("log")?).into_owned();
    if log.trim() != "ok" {
        return Err(format!("the spreadsheet macro failed:\n{log}"));
    }
    let ods = read("ods")?;
    let csv = String::from_utf8_lossy(&read("csv")?).into_owned();
    let (passed, failures) = check_sheet(root, &ods, &csv)?;
    for failure in &failures {
        eprintln!("FAIL: {failure}");
    }
    println!("{passed} passed, {} failed", failures.len());
    if failures.is_empty() {
        Ok(())
    } else {
        Err(format!("the saved spreadsheet has {} wrong values", failures.len()))
    }
}

/// Checks the saved sheet; returns the number of passed checks and the failures.
fn check_sheet(root: &Path, ods: &[u8], csv: &str) -> Result<(usize, Vec<String>), String> {
    use aerostrata::{Altitude, Atmosphere, US1976};
    let vectors = crate::vectors::read(&root.join("tests/vectors/usa76_lower.csv"))?;
    let mut passed = 0usize;
    let mut failures = Vec::new();
    let mut check = |ok: bool, what: String| {
        if ok {
            passed += 1;
        } else {
            failures.push(what);
        }
    };
    let close = |a: f64, b: f64, rel: f64| (a - b).abs() <= rel * b.abs();
    check(ods.starts_with(b"PK"), "the .ods is a zip package".to_owned());
    let mut lines = csv.lines();
    check(lines.next() == Some(SPREADSHEET_HEADER), "the CSV header".to_owned());
    let mut rows = 0usize;
    let mut against_vectors = 0usize;
    for line in lines.filter(|l| !l.trim().is_empty()) {
        rows += 1;
        let cells: Vec<f64> = line.split(',').map(|c| c.trim().parse().unwrap_or(f64::NAN)).collect();
        let &[h, t, p, rho, v, q, q_formula] = cells.as_slice() else {
            check(false, format!("row '{line}': expected 7 numbers"));
            continue;
        };
        let direct =
            US1976.state(Altitude::geometric_m(h).map_err(|e| e.to_string())?).map_err(|e| e.to_string())?;
        for (name, got, want) in [
            ("temperature_K", t, direct.temperature_k),
            ("pressure_Pa", p, direct.pressure_pa),
            ("density_kg_m3", rho, direct.density_kg_m3),
        ] {
            check(close(got, want, 1e-13), format!("{name} at {h} m: sheet {got} vs library {want}"));
            let column = vectors.columns.iter().position(|c| c == name).map(|i| i + 1);
            let row = vectors.rows.iter().find(|(_, r)| r[0].parse::<f64>().ok() == Some(h));
            if let (Some(i), Some((_, row))) = (column, row) {
                if let Some(tol) =
                    crate::vectors::half_unit_of_last_digit(&row[i]).filter(|_| !row[i].is_empty())
                {
                    let printed: f64 = row[i].parse().map_err(|_| format!("bad vector cell '{}'", row[i]))?;
                    check(
                        (got - printed).abs() <= tol,
                        format!("{name} at {h} m: sheet {got} vs printed {printed} (tol {tol})"),
                    );
                    against_vectors += 1;
                }
            }
        }
        check(close(v, 120.0 + 0.025 * h, 1e-13), format!("velocity at {h} m: {v}"));
        let expected_q = 0.5 * rho * v * v;
        check(close(q, expected_q, 1e-12), format!("q at {h} m: library {q} vs rho V^2/2 {expected_q}"));
        check(close(q_formula, q, 1e-13), format!("q at {h} m: Calc formula {q_formula} vs library {q}"));
    }
    check(rows == SPREADSHEET_ROWS, format!("{rows} rows in the CSV, expected {SPREADSHEET_ROWS}"));
    check(against_vectors >= 60, format!("only {against_vectors} cells compared with the printed vectors"));
    Ok((passed, failures))
}
