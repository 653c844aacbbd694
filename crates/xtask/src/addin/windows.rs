//! `cargo xtask addin --windows`: the C library's spreadsheet functions in Windows DLLs
//! (x86-64 and 32-bit x86, whose `extern "system"` functions are stdcall), cross-built
//! with mingw-w64, with the macro module generated from the add-in's function list; the
//! DLLs' exports and values tested under Wine by addin/windows/test_dll.c, whose output
//! must match the same program's against the Linux library bit for bit.

use std::path::Path;

use super::functions::Function;
use crate::io_error;
use crate::process::Cmd;
use crate::target_dir;

const PACKAGES: [&str; 4] = ["gcc-mingw-w64-x86-64", "gcc-mingw-w64-i686", "wine", "wine64"];
const TEST_SOURCE: &str = "addin/windows/test_dll.c";
const SHIM_SOURCE: &str = "addin/windows/bcryptprimitives_shim.c";

/// A Windows architecture: its Rust target, mingw's prefix and the output folder.
struct Arch {
    target: &'static str,
    gcc_prefix: &'static str,
    folder: &'static str,
}

const ARCHES: [Arch; 2] = [
    Arch { target: "x86_64-pc-windows-gnu", gcc_prefix: "x86_64-w64-mingw32", folder: "x86_64" },
    Arch { target: "i686-pc-windows-gnu", gcc_prefix: "i686-w64-mingw32", folder: "x86" },
];

pub fn run(root: &Path, functions: &[Function]) -> Result<(), String> {
    if let Err(message) = crate::setup::apt_install(root, &PACKAGES) {
        eprintln!(
            "SKIPPED: the Windows DLLs need mingw-w64 and Wine, which cannot be installed here: {message}"
        );
        return Ok(());
    }
    let installed =
        Cmd::new("rustup").args(["target", "list", "--installed"]).quiet().stdout().unwrap_or_default();
    let missing: Vec<&str> =
        ARCHES.iter().map(|a| a.target).filter(|t| !installed.lines().any(|l| l == *t)).collect();
    if !missing.is_empty()
        && Cmd::new("rustup").args(["target", "add"]).args(&missing).dir(root).run().is_err()
    {
        eprintln!(
            "SKIPPED: the Windows DLLs need the Rust targets {} (rustup could not add them)",
            missing.join(", ")
        );
        return Ok(());
    }
    let out = target_dir(root).join("addin").join("windows");
    std::fs::create_dir_all(&out).map_err(|e| io_error("create", &out, e))?;
    let bas = out.join("StrataFunctions.bas");
    let module = super::generate::basic_module(functions);
    std::fs::write(&bas, &module).map_err(|e| io_error("write", &bas, e))?;
    // Every function the macro module declares, and every one the header declares.
    let header_path = root.join("bindings/c/include/aerostrata.h");
    let header = std::fs::read_to_string(&header_path).map_err(|e| io_error("read", &header_path, e))?;
    let mut exports: Vec<String> = header
        .split("AEROSTRATA_XL_CALL ")
        .skip(1)
        .filter_map(|rest| rest.split('(').next())
        .filter(|name| name.starts_with("aerostrata_xl_"))
        .map(str::to_owned)
        .collect();
    for line in module.lines().filter(|l| l.contains("Declare PtrSafe Function ")) {
        let name = line.split("Function ").nth(1).and_then(|r| r.split(' ').next()).unwrap_or("");
        if !exports.iter().any(|e| e == name) {
            return Err(format!("the macro module declares {name}, which the header does not"));
        }
    }
    exports.sort();
    exports.dedup();
    let exports_file = out.join("exports.txt");
    std::fs::write(&exports_file, exports.join("\n") + "\n")
        .map_err(|e| io_error("write", &exports_file, e))?;
    let s = |p: &Path| p.to_string_lossy().into_owned();

    // The same test against the Linux library: its "bits" lines are the reference.
    let native_exe = out.join("test_native");
    Cmd::new("gcc")
        .args([
            "-std=c99",
            "-O2",
            "-Wall",
            "-Wextra",
            "-Werror",
            &s(&root.join(TEST_SOURCE)),
            "-o",
            &s(&native_exe),
        ])
        .args(["-ldl", "-lm"])
        .dir(root)
        .run()?;
    let so = crate::c::package::host(root)?.prefix.join("lib").join("libaerostrata.so");
    let native = Cmd::new(&native_exe).args([s(&so), s(&exports_file)]).dir(root).capture()?.stdout_text();
    let reference = bit_lines(&native);

    let wine_prefix = out.join("wineprefix");
    // Wine's 32-bit part runs the stdcall DLL: it needs the i386 architecture (on a fresh
    // machine this also brings the amd64 libraries it shares up to the same versions).
    if crate::setup::is_root() && !crate::setup::dpkg_installed("wine32:i386") {
        Cmd::new("dpkg").args(["--add-architecture", "i386"]).dir(root).run()?;
        crate::setup::apt_install(root, &["wine32:i386"])?;
        // A prefix made by 64-bit Wine alone does not start once the 32-bit part is there
        // ("could not load kernel32.dll"): begin a new one.
        let stale = out.join("wineprefix");
        if stale.exists() {
            std::fs::remove_dir_all(&stale).map_err(|e| io_error("remove", &stale, e))?;
        }
    }
    let wine32 = Cmd::new("dpkg-query")
        .args(["-W", "-f=${Status}", "wine32:i386"])
        .quiet()
        .stdout()
        .unwrap_or_default();
    let mut report = Vec::new();
    for arch in &ARCHES {
        let dir = out.join(arch.folder);
        std::fs::create_dir_all(&dir).map_err(|e| io_error("create", &dir, e))?;
        Cmd::new("cargo")
            .args([
                "rustc",
                "--release",
                "-p",
                "aerostrata-c",
                "--target",
                arch.target,
                "--crate-type",
                "cdylib",
            ])
            .dir(root)
            .run()?;
        let built = target_dir(root).join(arch.target).join("release").join("aerostrata_c.dll");
        let dll = dir.join("aerostrata.dll");
        std::fs::copy(&built, &dll).map_err(|e| io_error("copy", &built, e))?;
        // The export table: every spreadsheet function, undecorated (GetProcAddress and
        // Declare look them up by the plain name on both architectures).
        let table =
            Cmd::new(format!("{}-objdump", arch.gcc_prefix)).args(["-p", &s(&dll)]).quiet().stdout()?;
        let missing: Vec<&String> = exports.iter().filter(|e| !table.contains(&format!("] {e}\n"))).collect();
        if !missing.is_empty() {
            return Err(format!("{}: the DLL does not export {missing:?}", arch.folder));
        }
        let gcc = format!("{}-gcc", arch.gcc_prefix);
        let exe = dir.join("test_dll.exe");
        Cmd::new(&gcc)
            .args(["-std=c99", "-O2", "-Wall", "-Wextra", "-Werror", "-static", &s(&root.join(TEST_SOURCE))])
            .args(["-o", &s(&exe)])
            .dir(root)
            .run()?;
        let mut shim = vec!["-shared", "-O2"];
        if arch.folder == "x86" {
            shim.push("-Wl,--kill-at");
        }
        Cmd::new(&gcc)
            .args(shim)
            .args([&s(&root.join(SHIM_SOURCE)), "-o", &s(&dir.join("bcryptprimitives.dll")), "-lbcrypt"])
            .dir(root)
            .run()?;
        if arch.folder == "x86" {
            let popped = stdcall_checked(&header, &table, &dll, arch.gcc_prefix)?;
            report.push(format!("x86: {popped} functions pop their arguments (stdcall)"));
        }
        if arch.folder == "x86" && !wine32.contains("install ok installed") {
            eprintln!(
                "SKIPPED: running the 32-bit DLL needs Wine's 32-bit part, which only root can install: \
                 dpkg --add-architecture i386 && apt-get update && apt-get install wine32:i386. Built and \
                 export-checked: {}",
                dll.display()
            );
            report.push(format!("{}: built, exports checked, not run (no wine32)", arch.folder));
            continue;
        }
        let run = Cmd::new("wine")
            .args(["test_dll.exe", "aerostrata.dll", &s(&exports_file)])
            .envs([("WINEPREFIX", s(&wine_prefix)), ("WINEDEBUG", "-all".to_owned())])
            .timeout(300)
            .dir(&dir)
            .capture()?;
        let text = run.stdout_text().replace('\r', "");
        let tally = text.lines().rev().find(|l| l.ends_with(" failed")).unwrap_or("no tally line").to_owned();
        if !tally.ends_with(" 0 failed") {
            return Err(format!("{} DLL under Wine: {tally}\n{text}", arch.folder));
        }
        if bit_lines(&text) != reference {
            return Err(format!(
                "{} DLL under Wine: its values differ from the Linux library's:\n{text}",
                arch.folder
            ));
        }
        report.push(format!("{}: {tally}, {} values bit-identical to Linux", arch.folder, reference.len()));
    }
    // Wait for this prefix's wineserver to finish, so the step leaves nothing running.
    let _ =
        Cmd::new("wineserver").arg("-w").envs([("WINEPREFIX", s(&wine_prefix))]).timeout(60).quiet().output();
    for line in &report {
        eprintln!("  Windows DLL {line}");
    }
    eprintln!("  macro module: {}", bas.display());
    Ok(())
}

/// The bytes of arguments a stdcall function pops on 32-bit x86: 8 for a double, 4 for a
/// `uint32_t` or a pointer.
fn argument_bytes(declaration: &str) -> u32 {
    let params = declaration.split('(').nth(1).and_then(|p| p.split(')').next()).unwrap_or("");
    params.split(',').map(|p| if p.trim_start().starts_with("double") { 8 } else { 4 }).sum()
}

/// Every spreadsheet function of the 32-bit DLL returns with `ret $N`, N the bytes of its
/// arguments: the callee pops them, which is the stdcall convention a 32-bit `Declare`
/// expects (a cdecl function would end with a plain `ret`). Read from the disassembly at
/// each export's address; returns how many were checked.
fn stdcall_checked(header: &str, table: &str, dll: &Path, gcc_prefix: &str) -> Result<usize, String> {
    let image_base = table
        .lines()
        .find_map(|l| l.strip_prefix("ImageBase"))
        .and_then(|v| u64::from_str_radix(v.trim(), 16).ok())
        .ok_or("no ImageBase in the DLL's headers")?;
    // "[  72] +base[  73] 7660 Export RVA" and "[  73] aerostrata_xl_state".
    let mut rvas = std::collections::HashMap::new();
    let mut names = std::collections::HashMap::new();
    for line in table.lines() {
        let line = line.trim();
        let Some(rest) = line.strip_prefix('[') else { continue };
        let Some((index, tail)) = rest.split_once(']') else { continue };
        let Ok(index) = index.trim().parse::<u32>() else { continue };
        let tail = tail.trim();
        if let Some(after) = tail.strip_prefix("+base[") {
            let rva = after.split(']').nth(1).and_then(|r| r.split_whitespace().next());
            if let Some(rva) = rva.and_then(|r| u64::from_str_radix(r, 16).ok()) {
                rvas.insert(index, rva);
            }
        } else if tail.starts_with("aerostrata_xl_") {
            names.insert(tail.to_owned(), index);
        }
    }
    let mut checked = 0;
    for declaration in header.split("AEROSTRATA_XL_CALL ").skip(1) {
        let name = declaration.split('(').next().unwrap_or("");
        if !name.starts_with("aerostrata_xl_") {
            continue;
        }
        let address = names.get(name).and_then(|i| rvas.get(i)).map(|rva| image_base + rva);
        let Some(address) = address else { return Err(format!("x86 DLL: no export address for {name}")) };
        let code = Cmd::new(format!("{gcc_prefix}-objdump"))
            .args(["-d", "--no-show-raw-insn", &format!("--start-address={address}")])
            .args([format!("--stop-address={}", address + 0x800), dll.to_string_lossy().into_owned()])
            .quiet()
            .stdout()?;
        let first_ret = code
            .lines()
            .filter_map(|l| l.split('\t').nth(1))
            .find(|instruction| instruction.starts_with("ret"))
            .map(|instruction| instruction.split_whitespace().collect::<Vec<_>>().join(" "));
        let want = format!("ret ${:#x}", argument_bytes(declaration));
        if first_ret.as_deref() != Some(want.as_str()) {
            return Err(format!("x86 DLL: {name} returns with {first_ret:?}, not `{want}` (stdcall)"));
        }
        checked += 1;
    }
    Ok(checked)
}

fn bit_lines(text: &str) -> Vec<String> {
    text.lines().filter(|l| l.starts_with("bits ")).map(|l| l.trim().to_owned()).collect()
}
