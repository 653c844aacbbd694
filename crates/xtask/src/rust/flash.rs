//! What the upper-atmosphere table costs in flash on a Cortex-M4F: the core is built for
//! `thumbv7em-none-eabihf` (release, no LTO so that the rlib holds machine code), and the
//! sizes of the table's statics are read from the symbol table of the object in the rlib.
//! The symbol and section readers here also serve the firmware budgets (firmware/harness.rs).

use std::fs;
use std::path::Path;

use object::read::archive::ArchiveFile;
use object::{Object, ObjectSection, ObjectSymbol};

use crate::io_error;
use crate::process::Cmd;

/// The budget for the table, bytes.
pub const TABLE_BUDGET_BYTES: u64 = 24 * 1024;

/// Bytes of every static in `model::upper_table`, as (name, size).
pub fn table_sizes(
    root: &Path,
    envs: &[(&str, &str)],
    extra_args: &[&str],
) -> Result<Vec<(String, u64)>, String> {
    let target_dir = "target/flash";
    let mut args = vec![
        "build",
        "--quiet",
        "--release",
        "-p",
        "aerostrata",
        "--no-default-features",
        "--features",
        "upper",
        "--target",
        "thumbv7em-none-eabihf",
        "--target-dir",
        target_dir,
    ];
    args.extend(extra_args);
    let mut all_envs = vec![("CARGO_PROFILE_RELEASE_LTO", "false")];
    all_envs.extend(envs);
    Cmd::new("cargo").args(args).envs(all_envs).dir(root).run()?;
    let rlib = root.join(target_dir).join("thumbv7em-none-eabihf/release/libaerostrata.rlib");
    let data = fs::read(&rlib).map_err(|e| io_error("read", &rlib, e))?;
    let archive = ArchiveFile::parse(&*data).map_err(|e| format!("{}: {e}", rlib.display()))?;
    let mut sizes = Vec::new();
    for member in archive.members() {
        let member = member.map_err(|e| e.to_string())?;
        if !member.name().ends_with(b".o") {
            continue;
        }
        // A copy: ar aligns members to 2 bytes only, and the ELF reader needs its headers
        // aligned (a fresh allocation is, with the system allocator's 16 bytes).
        let bytes = member.data(&*data).map_err(|e| e.to_string())?.to_vec();
        let file = object::File::parse(&*bytes).map_err(|e| format!("object in {}: {e}", rlib.display()))?;
        sizes.extend(upper_table_symbols(&symbols(&file)));
    }
    if sizes.is_empty() {
        return Err(format!("no upper_table symbols found in {}", rlib.display()));
    }
    sizes.sort();
    Ok(sizes)
}

/// Every defined symbol of an object or ELF file with a size, as (name, size in bytes).
pub fn symbols(file: &object::File) -> Vec<(String, u64)> {
    file.symbols()
        .filter(|s| s.is_definition() && s.size() > 0)
        .map(|s| (s.name().unwrap_or_default().to_owned(), s.size()))
        .collect()
}

/// The statics of `model::upper_table` among `symbols`, named by their short name.
pub fn upper_table_symbols(symbols: &[(String, u64)]) -> Vec<(String, u64)> {
    symbols
        .iter()
        .filter(|(name, _)| name.contains("upper_table"))
        .map(|(name, size)| {
            let short =
                ["LN_DENSITY", "SLOPE", "SEGMENTS"].iter().find(|s| name.contains(*s)).unwrap_or(&"other");
            ((*short).to_owned(), *size)
        })
        .collect()
}

/// Bytes of flash an ELF firmware image gives its code and constants: .text + .rodata
/// (the vector table, .data's load image and the other sections are reported apart).
pub fn code_and_constants_bytes(file: &object::File) -> Result<u64, String> {
    let size = |name: &str| {
        file.section_by_name(name).map(|s| s.size()).ok_or_else(|| format!("the ELF has no {name} section"))
    };
    Ok(size(".text")? + size(".rodata")?)
}

/// Fails when the table exceeds its budget; prints the figures.
pub fn check(root: &Path, envs: &[(&str, &str)], extra_args: &[&str]) -> Result<(), String> {
    let sizes = table_sizes(root, envs, extra_args)?;
    let total: u64 = sizes.iter().map(|(_, s)| s).sum();
    let parts: Vec<String> = sizes.iter().map(|(n, s)| format!("{n} {s} B")).collect();
    eprintln!("upper-atmosphere table on thumbv7em-none-eabihf: {total} B ({})", parts.join(", "));
    if total <= TABLE_BUDGET_BYTES {
        Ok(())
    } else {
        Err(format!(
            "the upper-atmosphere table takes {total} B of flash, over the {TABLE_BUDGET_BYTES} B budget"
        ))
    }
}
