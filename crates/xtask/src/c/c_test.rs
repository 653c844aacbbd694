//! `cargo xtask c-test`: the C tests against the static and the shared library of the
//! host's C package, plain, under AddressSanitizer with UBSan and under Valgrind; the
//! header as C++17; the Python ctypes test; the README's C example; the altimeter example.

use std::path::Path;

use super::altimeter;
use super::package;
use crate::io_error;
use crate::process::Cmd;
use crate::target_dir;

/// The C tests, by subject, linked into one program (main() is in test_aerostrata.c; the
/// helpers they share are in check.h beside them).
const C_TESTS: [&str; 10] = [
    "bindings/c/tests/test_aerostrata.c",
    "bindings/c/tests/test_vectors.c",
    "bindings/c/tests/test_status.c",
    "bindings/c/tests/test_models.c",
    "bindings/c/tests/test_handles.c",
    "bindings/c/tests/test_aero.c",
    "bindings/c/tests/test_loads.c",
    "bindings/c/tests/test_catalogue.c",
    "bindings/c/tests/test_spreadsheet_addin.c",
    "bindings/c/tests/test_corpus.c",
];
const CTYPES_TEST: &str = "bindings/c/tests/test_ctypes.py";
const C_FLAGS: [&str; 5] = ["-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic"];

/// What the C tests and the example's two builds need besides gcc.
const BUILD_PACKAGES: [&str; 3] = ["make", "pkg-config", "cmake"];

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

/// Builds the C package (release), compiles the C tests against its static and shared
/// library with gcc as strict C99 and the header as C++17, runs them plain, under
/// ASan+UBSan and under Valgrind, runs the ctypes test and builds and checks the
/// altimeter example. Every step must pass with zero errors and leaks.
pub fn run(root: &Path) -> Result<(), String> {
    crate::setup::apt_install(root, &BUILD_PACKAGES)?;
    let package = package::host(root)?;
    let lib_dir = package.prefix.join("lib");
    let work = target_dir(root).join("c-tests");
    std::fs::create_dir_all(&work).map_err(|e| io_error("create", &work, e))?;
    let s = |p: &Path| p.to_string_lossy().into_owned();
    let include = format!("-I{}", s(&package.prefix.join("include")));
    let sources: Vec<String> = C_TESTS.iter().map(|file| s(&root.join(file))).collect();
    let vectors = s(&root.join("tests/vectors"));
    let static_lib = s(&package.static_lib);
    let lib_dir_arg = format!("-L{}", s(&lib_dir));
    // DT_RPATH, not RUNPATH: `cargo run` (and so `cargo xtask`) puts target/debug/deps on
    // LD_LIBRARY_PATH, which a RUNPATH yields to; the package's library must be the one
    // loaded.
    let rpath = format!("-Wl,--disable-new-dtags,-rpath,{}", s(&lib_dir));
    let system_libs: Vec<&str> = package.native_static_libs.iter().map(String::as_str).collect();
    let mut results = Vec::new();

    let header = package.prefix.join("include/aerostrata.h");
    let text = std::fs::read_to_string(&header).map_err(|e| io_error("read", &header, e))?;
    foreign_declarations(&text)?;
    results.push("the header declares no function of the C library".to_owned());

    // The header alone, as C++17 (its C++ guards and types must compile there too).
    let cpp = work.join("header_cpp.cpp");
    std::fs::write(
        &cpp,
        "#include \"aerostrata.h\"\nint main() { return aerostrata_status_message(0) ? 0 : 1; }\n",
    )
    .map_err(|e| io_error("write", &cpp, e))?;
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
        args.push(&include);
        args.extend(sources.iter().map(String::as_str));
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
    results.push(altimeter::check(root, &package, &work)?);
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
    std::fs::write(&path, source).map_err(|e| io_error("write", &path, e))?;
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

/// The C library's functions must not be declared by the header (it once declared
/// `malloc` and `free` from the bare-metal allocator): a call of `malloc(` or `free(`
/// (not part of a longer name) outside a comment is refused.
fn foreign_declarations(header: &str) -> Result<(), String> {
    let ident = |c: char| c.is_ascii_alphanumeric() || c == '_';
    for (number, line) in header.lines().enumerate() {
        let code = line.trim_start();
        if code.starts_with('*') || code.starts_with("/*") || code.starts_with("//") {
            continue;
        }
        for name in ["malloc(", "free("] {
            let found = line.match_indices(name).any(|(at, _)| !line[..at].ends_with(ident));
            if found {
                return Err(format!(
                    "bindings/c/include/aerostrata.h line {}: declares the C library's {}); \
                     exclude it in bindings/c/cbindgen.toml",
                    number + 1,
                    name
                ));
            }
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::foreign_declarations;

    #[test]
    fn the_c_librarys_allocator_is_not_declared() {
        let old = "enum AerostrataStatus f(double x);\n\nextern void *malloc(size_t size);\n";
        assert!(foreign_declarations(old).unwrap_err().contains("line 3"));
        assert!(foreign_declarations("extern void free(void *pointer);").is_err());
        let fine = "/**\n * never free( it\n */\nenum AerostrataStatus aerostrata_model_free(struct AerostrataModel *model);\n";
        foreign_declarations(fine).unwrap();
    }
}
