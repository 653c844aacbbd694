//! A work-around for the wasm-opt of Debian 12 (binaryen 108), which exports the wrong
//! table under the name wasm-bindgen's glue looks up: the module's sections read just far
//! enough to find its tables and that export, and the export's index mended in place.

use std::fs;
use std::path::Path;

use crate::io_error;

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
pub(super) fn fix_table_export(path: &Path) -> Result<(), String> {
    let mut bytes = fs::read(path).map_err(|e| io_error("read", path, e))?;
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
    fs::write(path, bytes).map_err(|e| io_error("write", path, e))
}
