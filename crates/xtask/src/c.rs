//! The C door's automation: regenerate (or check) the committed header with a pinned
//! cbindgen, and run the C tests against the static and the shared library, plain, under
//! AddressSanitizer with UBSan and under Valgrind, plus the Python ctypes test.

use std::path::{Path, PathBuf};
use std::process::Command;

use crate::{run_command, target_dir};

/// The cbindgen the header is generated with. Pinned exactly: another version may write
/// a different header, and the check below would then fail for no change of ours.
pub const CBINDGEN_VERSION: &str = "0.29.2";

const HEADER: &str = "bindings/c/include/aerostrata.h";
const C_TEST: &str = "bindings/c/tests/test_aerostrata.c";
const CTYPES_TEST: &str = "bindings/c/tests/test_ctypes.py";
const C_FLAGS: [&str; 5] = ["-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic"];

/// target/tools/bin/cbindgen at the pinned version, installed there when missing.
fn cbindgen(root: &Path) -> Result<PathBuf, String> {
    let tools = root.join("target").join("tools");
    let binary = tools.join("bin").join("cbindgen");
    let wanted = format!("cbindgen {CBINDGEN_VERSION}");
    let installed = Command::new(&binary)
        .arg("--version")
        .output()
        .is_ok_and(|o| o.status.success() && String::from_utf8_lossy(&o.stdout).trim() == wanted);
    if !installed {
        let root_arg = tools.to_string_lossy().into_owned();
        run_command(
            root,
            "cargo",
            &["install", "cbindgen", "--version", CBINDGEN_VERSION, "--locked", "--root", &root_arg],
            &[],
        )?;
    }
    Ok(binary)
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
    run_command(
        root,
        &cbindgen.to_string_lossy(),
        &[
            "--quiet",
            "--config",
            "bindings/c/cbindgen.toml",
            "--crate",
            "aerostrata-c",
            "--output",
            &output_arg,
            "bindings/c",
        ],
        &[],
    )?;
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

/// Runs `program args` in `dir` and returns its stdout; Err with stdout and stderr when
/// it fails. Unlike `run_command` it captures the output, to find the closing tally.
fn run_captured(dir: &Path, program: &str, args: &[&str], envs: &[(&str, &str)]) -> Result<String, String> {
    eprintln!("+ {program} {}", args.join(" "));
    let output = Command::new(program)
        .args(args)
        .envs(envs.iter().copied())
        .current_dir(dir)
        .output()
        .map_err(|e| format!("cannot start {program}: {e}"))?;
    let stdout = String::from_utf8_lossy(&output.stdout).into_owned();
    let stderr = String::from_utf8_lossy(&output.stderr).into_owned();
    if output.status.success() {
        Ok(stdout)
    } else {
        Err(format!("`{program} {}` failed ({}):\n{stdout}{stderr}", args.join(" "), output.status))
    }
}

/// The "N passed, N failed" line a test printed, as Ok only with 0 failed and N > 0.
fn tally(label: &str, stdout: &str) -> Result<String, String> {
    let line =
        stdout.lines().rev().find(|l| l.ends_with(" failed")).ok_or(format!("{label}: no tally line"))?;
    let numbers: Vec<usize> = line.split(' ').filter_map(|w| w.parse().ok()).collect();
    match numbers[..] {
        [passed, 0] if passed > 0 => Ok(format!("{label}: {line}")),
        _ => Err(format!("{label}: {line}\n{stdout}")),
    }
}

/// Builds both libraries (release), compiles the C tests against each with gcc as
/// strict C99 and the header as C++17, runs them plain, under ASan+UBSan and under
/// Valgrind, and runs the ctypes test. Every step must pass with zero errors and leaks.
pub fn test(root: &Path) -> Result<(), String> {
    run_command(root, "cargo", &["build", "--release", "-p", "aerostrata-c"], &[])?;
    let lib_dir = target_dir(root).join("release");
    let work = target_dir(root).join("c-tests");
    std::fs::create_dir_all(&work).map_err(|e| format!("cannot create {}: {e}", work.display()))?;
    let s = |p: &Path| p.to_string_lossy().into_owned();
    let include = format!("-I{}", s(&root.join("bindings/c/include")));
    let source = s(&root.join(C_TEST));
    let vectors = s(&root.join("tests/vectors"));
    let static_lib = s(&lib_dir.join("libaerostrata.a"));
    let lib_dir_arg = format!("-L{}", s(&lib_dir));
    let rpath = format!("-Wl,-rpath,{}", s(&lib_dir));
    let mut results = Vec::new();

    // The header alone, as C++17 (its C++ guards and types must compile there too).
    let cpp = work.join("header_cpp.cpp");
    std::fs::write(
        &cpp,
        "#include \"aerostrata.h\"\nint main() { return aerostrata_status_message(0) ? 0 : 1; }\n",
    )
    .map_err(|e| format!("cannot write {}: {e}", cpp.display()))?;
    let cpp_exe = s(&work.join("header_cpp"));
    run_command(
        root,
        "g++",
        &[
            "-std=c++17",
            "-Wall",
            "-Wextra",
            "-Werror",
            "-pedantic",
            &include,
            &s(&cpp),
            &static_lib,
            "-lpthread",
            "-ldl",
            "-lm",
            "-o",
            &cpp_exe,
        ],
        &[],
    )?;
    run_command(root, &cpp_exe, &[], &[])?;
    results.push("header compiles and links as C++17".to_owned());

    let system_libs = ["-lm", "-lpthread", "-ldl"];
    let compile = |exe: &str, extra: &[&str], link: &[&str]| -> Result<String, String> {
        let out = s(&work.join(exe));
        let mut args: Vec<&str> = C_FLAGS.to_vec();
        args.extend_from_slice(extra);
        args.extend_from_slice(&[&include, &source]);
        args.extend_from_slice(link);
        args.extend_from_slice(&system_libs);
        args.extend_from_slice(&["-o", &out]);
        run_command(root, "gcc", &args, &[])?;
        Ok(out)
    };
    let static_exe = compile("test_static", &["-g"], &[&static_lib])?;
    let shared_exe = compile("test_shared", &["-g"], &[&lib_dir_arg, &rpath, "-l:libaerostrata.so"])?;
    let asan_exe = compile(
        "test_asan",
        &["-g", "-fsanitize=address,undefined", "-fno-sanitize-recover=all"],
        &[&static_lib],
    )?;

    results.push(tally("C tests, static library", &run_captured(root, &static_exe, &[&vectors], &[])?)?);
    results.push(tally("C tests, shared library", &run_captured(root, &shared_exe, &[&vectors], &[])?)?);
    results.push(tally(
        "C tests under AddressSanitizer + UBSan",
        &run_captured(
            root,
            &asan_exe,
            &[&vectors],
            &[
                ("ASAN_OPTIONS", "detect_leaks=1:abort_on_error=0:halt_on_error=1"),
                ("UBSAN_OPTIONS", "print_stacktrace=1:halt_on_error=1"),
            ],
        )?,
    )?);
    for exe in [&static_exe, &shared_exe] {
        let out = run_captured(
            root,
            "valgrind",
            &[
                "--error-exitcode=1",
                "--leak-check=full",
                "--errors-for-leak-kinds=definite,indirect,possible",
                "--quiet",
                exe,
                &vectors,
            ],
            &[],
        )?;
        results.push(tally(&format!("C tests under Valgrind ({exe})"), &out)?);
    }
    let so = s(&lib_dir.join("libaerostrata.so"));
    results.push(tally(
        "Python ctypes test",
        &run_captured(root, "python3", &[&s(&root.join(CTYPES_TEST)), &so, &vectors], &[])?,
    )?);
    for line in &results {
        eprintln!("  {line}");
    }
    Ok(())
}
