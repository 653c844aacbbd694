//! Project automation: every CI step is one of these commands, runnable by hand.
//!
//! ```text
//! cargo xtask test              everything CI runs (installs what is missing first)
//! cargo xtask validate [--check] write docs/validation.md (or fail if it is stale)
//! cargo xtask upper-table [--check] regenerate the 86-1000 km table (or fail if stale)
//! cargo xtask flash             the upper-atmosphere table's flash cost on Cortex-M4F
//! cargo xtask header [--check]  regenerate bindings/c/include/aerostrata.h (or fail if stale)
//! cargo xtask c-package [--prefix DIR] [--target TRIPLE] [--check]  the C library, header, pkg-config and
//!                               CMake files; --check builds a consumer from a copy of them
//! cargo xtask c-test            the C library's tests: static, shared, C++17, sanitizers, Valgrind
//! cargo xtask spreadsheet       headless LibreOffice Calc through the shared library
//! cargo xtask addin [--check] [--windows]  the Calc extension target/addin/aerostrata.oxt (cell
//!                               functions over the C library); --check installs it into a fresh
//!                               profile and checks its formulas; --windows the DLLs under Wine
//! cargo xtask bench             run the criterion benchmarks, write docs/performance.md
//! cargo xtask batch-bench       a million states: the core's batch (one thread, rayon) vs numpy
//! cargo xtask cli-bench         the CLI's eval and flight on a million rows against `cat` and
//!                               the core's own loop; writes docs/performance.md
//! cargo xtask bits              every vector quantity's f64 bit pattern, natively (stdout)
//! cargo xtask bits --compare FILE  another host's bit lines in FILE against the native ones
//! cargo xtask firmware          the vectors in QEMU on Cortex-M4F and M3, bit for bit against
//!                               native; flash, stack and heap budgets (docs/firmware.md)
//! cargo xtask wasm              build the npm package (target/wasm/pkg), check its size budget
//! cargo xtask wasm-test         the package's Node tests, wasm-bindgen tests and bit identity
//! cargo xtask browser-test      the web calculator in headless Chromium (after `wasm`)
//! cargo xtask npm-check         `npm pack` installed into a fresh project: Node ESM and CommonJS,
//!                               tsc --strict, a page through an import map in Chromium
//! cargo xtask wasm-bench        one million states in Node vs natively; writes docs/performance.md
//! cargo xtask icount [--against REV]  instructions per evaluation under callgrind (and
//!                               against another revision's core); writes docs/performance.md
//! cargo xtask catalogue         every door lists every quantity as the core's catalogue does
//!                               (after `wasm` and with the C package)
//! cargo xtask fuzz [--seconds N] the fuzz targets over their corpus on stable; then N s each
//!                               under libFuzzer where nightly and cargo-fuzz can be had
//! cargo xtask package [--check] the core, the CLI and the C binding as .crate files; --check
//!                               builds, tests and documents each from its unpacked form
//! cargo xtask msrv              the core, the CLI and the C binding built with the declared
//!                               rust-version (SKIPPED when rustup cannot download it)
//! cargo xtask versions          one version in the crates, C header, npm package, add-in and
//!                               docs; CHANGELOG.md in the Keep a Changelog shape
//! ```
//!
//! The source is laid out by door: `rust/` (the core's vectors, validation report, upper
//! table and its flash cost; `upper.rs` and `vector_file.rs` here belong to it), `c/` and
//! `spreadsheet.rs`, `wasm/`, `firmware/`, `bench.rs`, and `catalogue.rs` across them all. Shared by all: `process.rs` (the
//! one way to run a program), `setup.rs` (what gets installed), `scratch.rs` (fresh folders
//! outside the checkout for the packaging checks) and `test.rs` (the CI run).

// The C door's catalogue generator (c/mod.rs includes bindings/c/build/catalogue.rs) names
// the core as the C crate does.
extern crate aerostrata as aerostrata_core;

mod addin;
mod batch_bench;
mod bench;
mod c;
mod catalogue;
mod cli_bench;
mod firmware;
mod fuzz;
mod icount;
mod machine;
mod package;
mod process;
mod report;
mod rust;
mod scratch;
mod setup;
mod spreadsheet;
mod test;
mod wasm;

use std::path::{Path, PathBuf};
use std::process::ExitCode;

const USAGE: &str = "usage: cargo xtask test | validate [--check] | upper-table [--check] | flash \
                     | header [--check] | c-package [--prefix DIR] [--target T] [--check] | c-test | spreadsheet \
                     | addin [--check] [--windows] \
                     | bench | batch-bench | bits [--compare FILE] | firmware | wasm | wasm-test | browser-test | npm-check | wasm-bench \
                     | icount [--against REV] | catalogue | cli-bench | fuzz [--seconds N] \
                     | package [--check] | msrv | versions";

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let root = workspace_root();
    let result = match args.first().map(String::as_str) {
        Some("test") => test::run(&root),
        Some("validate") => rust::validate::run(&root, args.iter().any(|a| a == "--check")),
        Some("bench") => bench::run(&root),
        Some("batch-bench") => batch_bench::run(&root),
        Some("cli-bench") => cli_bench::run(&root),
        Some("cli-bench-core") => cli_bench::core(&args[1..]),
        Some("upper-table") => rust::upper::run(&root, args.iter().any(|a| a == "--check")),
        Some("flash") => rust::flash::check(&root, &[], &[]),
        Some("header") => c::header::run(&root, args.iter().any(|a| a == "--check")),
        Some("c-package") => c::package::run(&root, &args[1..]),
        Some("c-test") => c::c_test::run(&root),
        Some("spreadsheet") => spreadsheet::run(&root),
        Some("addin") => addin::run(&root, &args[1..]),
        Some("bits") if args.get(1).is_some_and(|a| a == "--compare") => match args.get(2) {
            Some(file) => rust::vectors::compare_file(&root, file, Path::new(file)),
            None => Err("usage: cargo xtask bits --compare FILE".to_owned()),
        },
        Some("firmware") => firmware::run(&root),
        Some("bits") => {
            rust::vectors::read_all(&root).and_then(|files| rust::vectors::bit_lines(&files)).map(|lines| {
                for line in lines {
                    println!("{line}");
                }
            })
        }
        Some("wasm") => wasm::run(&root),
        Some("wasm-test") => wasm::build(&root).and_then(|package| {
            wasm::node_tests(&root, &package)?;
            wasm::rust_tests(&root)?;
            wasm::bits(&root, &package).map(|_| ())
        }),
        Some("browser-test") => wasm::browser(&root),
        Some("npm-check") => wasm::build(&root).and_then(|package| wasm::npm_check(&root, &package)),
        Some("wasm-bench") => wasm::bench::run(&root),
        Some("icount") => {
            let against = args.iter().position(|a| a == "--against").and_then(|i| args.get(i + 1));
            icount::run(&root, against.map(String::as_str))
        }
        Some("catalogue") => catalogue::check(&root, &target_dir(&root).join("wasm").join("pkg"))
            .map(|line| eprintln!("{line}")),
        Some("fuzz") => fuzz::seconds(&args[1..]).and_then(|seconds| fuzz::run(&root, seconds)),
        Some("package") => package::run(&root, &args[1..]),
        Some("msrv") => package::msrv::run(&root),
        Some("versions") => package::versions::run(&root),
        _ => Err(USAGE.to_owned()),
    };
    match result {
        Ok(()) => ExitCode::SUCCESS,
        Err(message) => {
            eprintln!("xtask: {message}");
            ExitCode::FAILURE
        }
    }
}

fn workspace_root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .ancestors()
        .nth(2)
        .expect("xtask lives in crates/xtask")
        .to_path_buf()
}

/// Where cargo puts build output: `CARGO_TARGET_DIR` if set, else `target/` at the root.
pub(crate) fn target_dir(root: &Path) -> PathBuf {
    std::env::var_os("CARGO_TARGET_DIR")
        .map_or_else(|| root.join("target"), |dir| root.join(PathBuf::from(dir)))
}

/// The message of a failed file operation: `cannot WHAT PATH: ERROR`.
pub(crate) fn io_error(what: &str, path: &Path, e: std::io::Error) -> String {
    format!("cannot {what} {}: {e}", path.display())
}
