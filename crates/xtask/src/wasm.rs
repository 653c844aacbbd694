//! The WebAssembly door's automation: `cargo xtask wasm` builds the npm package
//! `aerostrata` under target/wasm/pkg (an ES module for browsers and bundlers in `web/`,
//! a CommonJS build for Node in `node/`, the `.d.ts` types, package.json and README) and
//! checks the optimised module against its size budget; the test steps run the Node
//! tests, the wasm-bindgen tests, the bit-identity check against the native core and the
//! headless-browser test of the web calculator.
//!
//! Tools, installed when missing: the `wasm32-unknown-unknown` target (rustup, or
//! Debian's rustc), wasm-bindgen-cli at the pinned version under target/tools,
//! `wasm-opt` from Debian's `binaryen`, Node from Debian's `nodejs`, Chromium from
//! Debian's `chromium`, and playwright-core from npm under tests/browser.

use std::fs;
use std::path::{Path, PathBuf};

use crate::process::Cmd;
use crate::setup::{self, TargetToolchain, WASM_TARGET};
use crate::target_dir;

/// The wasm-bindgen the module is built with. Pinned exactly, equal to the `=` version
/// in bindings/wasm/Cargo.toml: the generated JS glue must match the crate's macros.
pub const WASM_BINDGEN_VERSION: &str = "0.2.130";

/// The size budget of the optimised `.wasm`, bytes (150 KiB) ...
pub const MAX_WASM_BYTES: u64 = 150 * 1024;
/// ... and of the same file compressed with `gzip -9`, bytes (60 KiB).
pub const MAX_GZIP_BYTES: u64 = 60 * 1024;

const CRATE_DIR: &str = "bindings/wasm";
const CALCULATOR_DIR: &str = "examples/web-calculator";
const BROWSER_DIR: &str = "tests/browser";
/// The name of the package's files (`aerostrata.js`, `aerostrata_bg.wasm`, ...).
const OUT_NAME: &str = "aerostrata";
/// The release profile of the module (root Cargo.toml): optimised for size.
const PROFILE: &str = "wasm-release";

/// What `build` made.
pub struct Package {
    /// target/wasm/pkg
    pub dir: PathBuf,
    /// The optimised module's size, bytes.
    pub wasm_bytes: u64,
    /// Its size after `gzip -9`, bytes.
    pub gzip_bytes: u64,
}

impl Package {
    /// The sizes against the budget, as one line.
    pub fn size_line(&self) -> String {
        format!(
            "aerostrata_bg.wasm: {} bytes ({:.1} KiB, budget {} KiB), gzip -9: {} bytes ({:.1} KiB, budget {} KiB)",
            self.wasm_bytes,
            self.wasm_bytes as f64 / 1024.0,
            MAX_WASM_BYTES / 1024,
            self.gzip_bytes,
            self.gzip_bytes as f64 / 1024.0,
            MAX_GZIP_BYTES / 1024
        )
    }

    /// Ok when both sizes are within the budget.
    pub fn check_budget(&self) -> Result<(), String> {
        if self.wasm_bytes <= MAX_WASM_BYTES && self.gzip_bytes <= MAX_GZIP_BYTES {
            Ok(())
        } else {
            Err(format!("over the size budget: {}", self.size_line()))
        }
    }
}

fn io_err(what: &str, path: &Path, e: std::io::Error) -> String {
    format!("cannot {what} {}: {e}", path.display())
}

/// target/tools/bin/wasm-bindgen at the pinned version, installed there when missing
/// (without `--locked` if the registry no longer has a crate of the CLI's own lock file:
/// the CLI pins its wasm-bindgen crates with `=`, so the glue it writes is the same).
fn wasm_bindgen_cli(root: &Path) -> Result<PathBuf, String> {
    setup::cargo_tool(root, "wasm-bindgen-cli", "wasm-bindgen", WASM_BINDGEN_VERSION)
}

fn wasm_opt(root: &Path) -> Result<(), String> {
    if Cmd::new("wasm-opt").arg("--version").succeeds() {
        Ok(())
    } else {
        setup::apt_install(root, &["binaryen"])
    }
}

/// Debian's rustc has no rust-lld of its own: wasm32 links with Debian's wasm-ld.
const DEBIAN_WASM_LINKER: (&str, &str) = ("CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_LINKER", "wasm-ld-16");

/// The module is built with wasm's SIMD instructions (every browser since 2021, Node 16.4
/// and later), for the core's square root: the `f64x2.sqrt` instruction instead of libm's
/// software one (crates/aerostrata/src/math.rs), the same bits, a quarter of the time.
const WASM_RUSTFLAGS: (&str, &str) =
    ("CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUSTFLAGS", "-C target-feature=+simd128");

/// `cargo ARGS` for wasm32 with the toolchain at hand; returns the target directory.
fn cargo_wasm(
    root: &Path,
    toolchain: TargetToolchain,
    args: &[&str],
    build_std: &str,
    envs: &[(&str, &str)],
) -> Result<PathBuf, String> {
    let cargo = Cmd::new("cargo").args(args).args(["--target", WASM_TARGET]).dir(root);
    match toolchain {
        TargetToolchain::Rustup => {
            cargo.envs(envs.iter().copied()).run()?;
            Ok(target_dir(root))
        }
        TargetToolchain::DebianBuildStd => {
            cargo
                .args([build_std, "--target-dir", "target/debian-rustc"])
                .envs(setup::DEBIAN_ENVS.into_iter().chain([DEBIAN_WASM_LINKER]).chain(envs.iter().copied()))
                .run()?;
            Ok(root.join("target").join("debian-rustc"))
        }
    }
}

fn copy_dir(from: &Path, to: &Path) -> Result<(), String> {
    fs::create_dir_all(to).map_err(|e| io_err("create", to, e))?;
    for entry in fs::read_dir(from).map_err(|e| io_err("read", from, e))? {
        let entry = entry.map_err(|e| io_err("read", from, e))?;
        let path = entry.path();
        let dest = to.join(entry.file_name());
        if path.is_dir() {
            copy_dir(&path, &dest)?;
        } else {
            fs::copy(&path, &dest).map_err(|e| io_err("copy", &path, e))?;
        }
    }
    Ok(())
}

/// Every file under `dir` whose name ends in `.js`.
fn js_files(dir: &Path, out: &mut Vec<PathBuf>) {
    if let Ok(entries) = fs::read_dir(dir) {
        for entry in entries.flatten() {
            let path = entry.path();
            if path.is_dir() {
                js_files(&path, out);
            } else if path.extension().is_some_and(|x| x == "js") {
                out.push(path);
            }
        }
    }
}

/// glue.js as CommonJS for the Node build: its `export function NAME` declarations
/// become plain functions listed in `module.exports` (the file's header promises that
/// this is all it exports).
fn snippets_to_commonjs(node_dir: &Path) -> Result<(), String> {
    let mut files = Vec::new();
    js_files(&node_dir.join("snippets"), &mut files);
    for path in files {
        let text = fs::read_to_string(&path).map_err(|e| io_err("read", &path, e))?;
        let mut names = Vec::new();
        let mut out = String::new();
        for line in text.lines() {
            if let Some(rest) = line.strip_prefix("export function ") {
                let name: String = rest.chars().take_while(|c| c.is_alphanumeric() || *c == '_').collect();
                names.push(name);
                out.push_str("function ");
                out.push_str(rest);
            } else if line.trim_start().starts_with("export ") || line.trim_start().starts_with("import ") {
                return Err(format!(
                    "{}: only `export function` declarations can be converted",
                    path.display()
                ));
            } else {
                out.push_str(line);
            }
            out.push('\n');
        }
        out.push_str(&format!("module.exports = {{ {} }};\n", names.join(", ")));
        fs::write(&path, out).map_err(|e| io_err("write", &path, e))?;
    }
    Ok(())
}

/// The name under which wasm-bindgen's glue finds the module's table of JS values.
const EXTERNREF_TABLE_EXPORT: &str = "__wbindgen_externrefs";

/// Reads an unsigned LEB128 at `*at`, moving past it.
fn leb(bytes: &[u8], at: &mut usize) -> Result<u32, String> {
    let mut value: u32 = 0;
    for shift in (0..35).step_by(7) {
        let byte = *bytes.get(*at).ok_or("truncated module")?;
        *at += 1;
        value |= u32::from(byte & 0x7f) << shift;
        if byte & 0x80 == 0 {
            return Ok(value);
        }
    }
    Err("LEB128 too long".to_owned())
}

/// Skips a table type or a limits record's flags-and-bounds (`limits` only).
fn skip_limits(bytes: &[u8], at: &mut usize) -> Result<(), String> {
    let flags = *bytes.get(*at).ok_or("truncated module")?;
    *at += 1;
    leb(bytes, at)?;
    if flags & 1 != 0 {
        leb(bytes, at)?;
    }
    Ok(())
}

/// Works around a bug of the wasm-opt in Debian 12 (binaryen 108): writing a module
/// with two tables (the function table and wasm-bindgen's `externref` table), it exports
/// table 0 under the externref table's name, and the glue's first `table.set` throws.
/// Finds the module's externref table (imported tables count first) and points the
/// export at it; a module that is already right is left alone.
fn fix_table_export(path: &Path) -> Result<(), String> {
    let mut bytes = fs::read(path).map_err(|e| io_err("read", path, e))?;
    let mut at = 8;
    let mut table_types: Vec<u8> = Vec::new();
    let mut export_index_at = None;
    while at < bytes.len() {
        let id = bytes[at];
        at += 1;
        let size = leb(&bytes, &mut at)? as usize;
        let end = at + size;
        let mut p = at;
        match id {
            2 => {
                for _ in 0..leb(&bytes, &mut p)? {
                    for _ in 0..2 {
                        let len = leb(&bytes, &mut p)? as usize;
                        p += len;
                    }
                    let kind = *bytes.get(p).ok_or("truncated module")?;
                    p += 1;
                    match kind {
                        0 => {
                            leb(&bytes, &mut p)?;
                        }
                        1 => {
                            table_types.push(*bytes.get(p).ok_or("truncated module")?);
                            p += 1;
                            skip_limits(&bytes, &mut p)?;
                        }
                        2 => skip_limits(&bytes, &mut p)?,
                        3 => p += 2,
                        _ => return Err(format!("{}: unknown import kind {kind}", path.display())),
                    }
                }
            }
            4 => {
                for _ in 0..leb(&bytes, &mut p)? {
                    table_types.push(*bytes.get(p).ok_or("truncated module")?);
                    p += 1;
                    skip_limits(&bytes, &mut p)?;
                }
            }
            7 => {
                for _ in 0..leb(&bytes, &mut p)? {
                    let len = leb(&bytes, &mut p)? as usize;
                    let name = bytes.get(p..p + len).ok_or("truncated module")?.to_vec();
                    p += len;
                    let kind = *bytes.get(p).ok_or("truncated module")?;
                    p += 1;
                    if kind == 1 && name == EXTERNREF_TABLE_EXPORT.as_bytes() {
                        export_index_at = Some(p);
                    }
                    leb(&bytes, &mut p)?;
                }
            }
            _ => {}
        }
        at = end;
    }
    const EXTERNREF: u8 = 0x6f;
    let Some(index_at) = export_index_at else {
        return Err(format!("{}: no table exported as {EXTERNREF_TABLE_EXPORT}", path.display()));
    };
    let mut p = index_at;
    let exported = leb(&bytes, &mut p)? as usize;
    if table_types.get(exported) == Some(&EXTERNREF) {
        return Ok(());
    }
    let wanted = table_types
        .iter()
        .position(|&t| t == EXTERNREF)
        .ok_or(format!("{}: no externref table", path.display()))?;
    if p - index_at != 1 || wanted > 0x7f {
        return Err(format!("{}: cannot patch the export of table {wanted} in place", path.display()));
    }
    eprintln!(
        "  wasm-opt exported table {exported} as {EXTERNREF_TABLE_EXPORT}; pointing it at table {wanted}"
    );
    bytes[index_at] = wanted as u8;
    fs::write(path, bytes).map_err(|e| io_err("write", path, e))
}

/// The `"version"` of bindings/wasm/package.json.
fn package_version(manifest: &str) -> Option<String> {
    let value: serde_json::Value = serde_json::from_str(manifest).ok()?;
    value.get("version")?.as_str().map(str::to_owned)
}

fn gzip_size(path: &Path) -> Result<u64, String> {
    let output = Cmd::new("gzip").args(["-9", "-c", "-n"]).arg(path).quiet().capture()?;
    Ok(output.stdout.len() as u64)
}

/// Builds the package into target/wasm/pkg and the calculator's site into
/// target/wasm/site; returns the sizes.
pub fn build(root: &Path) -> Result<Package, String> {
    let toolchain = setup::wasm_target(root)?;
    let bindgen = wasm_bindgen_cli(root)?;
    wasm_opt(root)?;
    let target = cargo_wasm(
        root,
        toolchain,
        &["build", "--quiet", "-p", "aerostrata-wasm", "--profile", PROFILE, "--features", "standalone"],
        "-Zbuild-std=core,alloc",
        &[WASM_RUSTFLAGS],
    )?;
    let module = target.join(WASM_TARGET).join(PROFILE).join("aerostrata_wasm.wasm");
    let out = target_dir(root).join("wasm");
    let pkg = out.join("pkg");
    if pkg.exists() {
        fs::remove_dir_all(&pkg).map_err(|e| io_err("remove", &pkg, e))?;
    }
    let module_arg = module.to_string_lossy().into_owned();
    let bindgen_arg = bindgen.to_string_lossy().into_owned();
    for (target, dir) in [("web", "web"), ("nodejs", "node")] {
        let dir_arg = pkg.join(dir).to_string_lossy().into_owned();
        Cmd::new(&bindgen_arg)
            .args(["--target", target, "--out-dir", &dir_arg, "--out-name", OUT_NAME, &module_arg])
            .dir(root)
            .run()?;
    }
    snippets_to_commonjs(&pkg.join("node"))?;
    // The two builds' modules are the same file; optimise one and copy it over the other.
    let web_wasm = pkg.join("web").join(format!("{OUT_NAME}_bg.wasm"));
    let node_wasm = pkg.join("node").join(format!("{OUT_NAME}_bg.wasm"));
    let web_arg = web_wasm.to_string_lossy().into_owned();
    Cmd::new("wasm-opt")
        .args([
            "-Oz",
            "--converge",
            "--strip-debug",
            "--strip-producers",
            "--strip-target-features",
            // The features rustc enables for wasm32 by default.
            "--enable-bulk-memory",
            "--enable-nontrapping-float-to-int",
            "--enable-sign-ext",
            "--enable-reference-types",
            "--enable-multivalue",
            "--enable-mutable-globals",
            "--enable-simd",
            &web_arg,
            "-o",
            &web_arg,
        ])
        .dir(root)
        .run()?;
    fix_table_export(&web_wasm)?;
    fs::copy(&web_wasm, &node_wasm).map_err(|e| io_err("copy", &web_wasm, e))?;

    let crate_dir = root.join(CRATE_DIR);
    let manifest_path = crate_dir.join("package.json");
    let manifest = fs::read_to_string(&manifest_path).map_err(|e| io_err("read", &manifest_path, e))?;
    let version = package_version(&manifest).ok_or(format!("{}: no \"version\"", manifest_path.display()))?;
    if version != env!("CARGO_PKG_VERSION") {
        return Err(format!(
            "{} has version {version}, the crates {}: make them equal",
            manifest_path.display(),
            env!("CARGO_PKG_VERSION")
        ));
    }
    fs::write(pkg.join("package.json"), &manifest).map_err(|e| io_err("write", &pkg, e))?;
    // The root package is "type": "module" (the web build); the Node build is CommonJS.
    fs::write(pkg.join("node").join("package.json"), "{ \"type\": \"commonjs\" }\n")
        .map_err(|e| io_err("write", &pkg, e))?;
    for (from, to) in [
        (crate_dir.join("README.md"), pkg.join("README.md")),
        (root.join("LICENSE-MIT"), pkg.join("LICENSE-MIT")),
        (root.join("LICENSE-APACHE"), pkg.join("LICENSE-APACHE")),
    ] {
        fs::copy(&from, &to).map_err(|e| io_err("copy", &from, e))?;
    }

    // The calculator's static site: the page and the web build beside it.
    let site = out.join("site");
    if site.exists() {
        fs::remove_dir_all(&site).map_err(|e| io_err("remove", &site, e))?;
    }
    copy_dir(&root.join(CALCULATOR_DIR), &site)?;
    copy_dir(&pkg.join("web"), &site.join(OUT_NAME))?;

    let wasm_bytes = fs::metadata(&web_wasm).map_err(|e| io_err("read", &web_wasm, e))?.len();
    let gzip_bytes = gzip_size(&web_wasm)?;
    let package = Package { dir: pkg, wasm_bytes, gzip_bytes };
    let sizes = out.join("size.txt");
    fs::write(&sizes, format!("{}\n", package.size_line())).map_err(|e| io_err("write", &sizes, e))?;
    Ok(package)
}

/// `cargo xtask wasm`: builds the package and fails if it is over the size budget.
pub fn run(root: &Path) -> Result<(), String> {
    let package = build(root)?;
    eprintln!("built {}", package.dir.display());
    eprintln!("{}", package.size_line());
    package.check_budget()
}

/// `node --test` over bindings/wasm/tests/*.test.mjs against the built Node package.
pub fn node_tests(root: &Path, package: &Package) -> Result<(), String> {
    setup::node(root)?;
    let mut tests: Vec<String> = fs::read_dir(root.join(CRATE_DIR).join("tests"))
        .map_err(|e| format!("cannot read bindings/wasm/tests: {e}"))?
        .flatten()
        .map(|e| e.path())
        .filter(|p| p.to_string_lossy().ends_with(".test.mjs"))
        .map(|p| p.to_string_lossy().into_owned())
        .collect();
    tests.sort();
    if tests.is_empty() {
        return Err("no bindings/wasm/tests/*.test.mjs".to_owned());
    }
    Cmd::new("node").arg("--test").args(tests).envs([("AEROSTRATA_PKG", &package.dir)]).dir(root).run()
}

/// The wasm-bindgen tests of the Rust side (bindings/wasm/tests/*.rs), under Node.
pub fn rust_tests(root: &Path) -> Result<(), String> {
    setup::node(root)?;
    let toolchain = setup::wasm_target(root)?;
    let bindgen = wasm_bindgen_cli(root)?;
    let runner = bindgen.with_file_name("wasm-bindgen-test-runner").to_string_lossy().into_owned();
    cargo_wasm(
        root,
        toolchain,
        &["test", "-p", "aerostrata-wasm"],
        "-Zbuild-std=std,panic_abort",
        &[("CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUNNER", &runner), WASM_RUSTFLAGS],
    )
    .map(|_| ())
}

/// The bit-identity check: the wasm module's outputs for every vector, through
/// bindings/wasm/tests/bits.mjs, against the native core's (`cargo xtask bits`), line by
/// line. Returns the number of identical values.
pub fn bits(root: &Path, package: &Package) -> Result<usize, String> {
    let files = crate::vectors::read_all(root)?;
    let native = crate::vectors::bit_lines(&files)?;
    let script = root.join(CRATE_DIR).join("tests").join("bits.mjs");
    let output = Cmd::new("node")
        .arg(&script)
        .arg(&package.dir)
        .arg(root.join("tests").join("vectors"))
        .dir(root)
        .quiet()
        .output()?;
    if !output.success {
        return Err(format!("{} failed:\n{}", script.display(), output.stderr_text()));
    }
    let wasm: Vec<String> = output.stdout_text().lines().map(str::to_owned).collect();
    let identical = crate::vectors::compare_bits("the wasm module", &native, &wasm)?;
    eprintln!("  {identical} values bit-identical between the native core and the wasm module");
    Ok(identical)
}

/// The headless-browser test of the web calculator (tests/browser): serves
/// target/wasm/site on 127.0.0.1 with `python3 -m http.server`, drives Debian's Chromium
/// through playwright-core, and stops the server by its PID. Screenshots go to
/// target/wasm/screenshots.
pub fn browser(root: &Path) -> Result<(), String> {
    setup::node(root)?;
    setup::apt_install(root, &["chromium"])?;
    let dir = root.join(BROWSER_DIR);
    if !dir.join("node_modules").join("playwright-core").exists() {
        Cmd::new("npm").args(["ci", "--no-audit", "--no-fund"]).dir(&dir).run()?;
    }
    let site = target_dir(root).join("wasm").join("site");
    if !site.join("index.html").exists() {
        return Err(format!("{} is missing: run `cargo xtask wasm` first", site.display()));
    }
    let port = {
        let listener =
            std::net::TcpListener::bind("127.0.0.1:0").map_err(|e| format!("no free port: {e}"))?;
        listener.local_addr().map_err(|e| format!("no free port: {e}"))?.port()
    };
    let mut server = Cmd::new("python3")
        .args(["-m", "http.server", &port.to_string(), "--bind", "127.0.0.1", "--directory"])
        .arg(&site)
        .spawn()?;
    let ready = (0..100).any(|_| {
        std::thread::sleep(std::time::Duration::from_millis(100));
        std::net::TcpStream::connect(("127.0.0.1", port)).is_ok()
    });
    let result = if ready {
        let shots = target_dir(root).join("wasm").join("screenshots");
        let url = format!("http://127.0.0.1:{port}/index.html");
        Cmd::new("node")
            .arg(dir.join("calculator.test.mjs"))
            .arg(&url)
            .arg(shots)
            .arg(root.join("tests").join("vectors"))
            .dir(root)
            .run()
    } else {
        Err(format!("the static server on 127.0.0.1:{port} did not start"))
    };
    // Stopped by its own PID, whatever the test did.
    let _ = server.kill();
    let _ = server.wait();
    result
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_package_version_is_read_from_package_json() {
        assert_eq!(
            package_version(r#"{"name": "aerostrata", "version": "1.2.3"}"#).as_deref(),
            Some("1.2.3")
        );
        assert_eq!(package_version("{}"), None);
    }
}
