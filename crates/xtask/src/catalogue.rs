//! `cargo xtask catalogue`: every door exposes every quantity of the core's catalogue with
//! the same id, machine name, units and CSV columns. The core's list is the reference; the
//! command-line tool's (`aerostrata quantities --format json`), the WebAssembly module's
//! (`quantities()` under Node), the C library's (`aerostrata_quantity_info` for every id,
//! from a small C program) and the C header's `AEROSTRATA_QUANTITY_*` ids (static
//! assertions compiled against the header) are compared with it field by field, and the
//! spreadsheet add-in must have a cell function for every state quantity. Adding a
//! quantity to the core is then the only edit: a door that lags fails here.

use std::fmt::Write as _;
use std::path::Path;

use aerostrata::quantity::Info;
use aerostrata::Quantity;
use serde_json::Value;

use crate::io_error;
use crate::process::Cmd;
use crate::target_dir;

/// What every door must agree on for one quantity.
#[derive(Debug, Clone, PartialEq, Eq)]
struct Entry {
    id: u64,
    name: String,
    si_unit: String,
    us_unit: String,
    si_column: String,
    us_column: String,
}

fn column(info: &Info, suffix: &str) -> String {
    if suffix.is_empty() {
        info.name.to_owned()
    } else {
        format!("{}_{suffix}", info.name)
    }
}

/// The core's catalogue, the reference.
fn core_entries() -> Vec<Entry> {
    Quantity::ALL
        .iter()
        .map(|q| {
            let info = q.info();
            Entry {
                id: u64::from(info.id),
                name: info.name.to_owned(),
                si_unit: info.si.symbol().to_owned(),
                us_unit: info.us.symbol().to_owned(),
                si_column: column(&info, info.si.suffix()),
                us_column: column(&info, info.us.suffix()),
            }
        })
        .collect()
}

/// Entries from a JSON array of objects whose keys are `keys` (id, name, SI unit, US
/// unit, SI column, US column, in that order).
fn json_entries(door: &str, text: &str, keys: [&str; 6]) -> Result<Vec<Entry>, String> {
    let value: Value = serde_json::from_str(text).map_err(|e| format!("{door}: not a JSON list: {e}"))?;
    let list = value.as_array().ok_or(format!("{door}: not a JSON list"))?;
    list.iter()
        .map(|item| {
            let text = |key: &str| {
                item.get(key)
                    .and_then(Value::as_str)
                    .map(str::to_owned)
                    .ok_or(format!("{door}: no \"{key}\" in {item}"))
            };
            Ok(Entry {
                id: item
                    .get(keys[0])
                    .and_then(Value::as_u64)
                    .ok_or(format!("{door}: no \"{}\" in {item}", keys[0]))?,
                name: text(keys[1])?,
                si_unit: text(keys[2])?,
                us_unit: text(keys[3])?,
                si_column: text(keys[4])?,
                us_column: text(keys[5])?,
            })
        })
        .collect()
}

/// The first difference between the core's list and a door's, in words.
fn compare(door: &str, core: &[Entry], theirs: &[Entry]) -> Result<(), String> {
    for (expected, got) in core.iter().zip(theirs) {
        if expected != got {
            return Err(format!(
                "{door} differs from the core at id {}: {got:?}, expected {expected:?}",
                expected.id
            ));
        }
    }
    if core.len() != theirs.len() {
        return Err(format!("{door} lists {} quantities, the core {}", theirs.len(), core.len()));
    }
    Ok(())
}

/// The command-line tool's list.
fn cli(root: &Path) -> Result<Vec<Entry>, String> {
    Cmd::new("cargo").args(["build", "--quiet", "-p", "aerostrata-cli"]).dir(root).run()?;
    let exe = target_dir(root).join("debug").join("aerostrata");
    let text = Cmd::new(exe).args(["quantities", "--format", "json"]).dir(root).quiet().stdout()?;
    json_entries(
        "the command-line tool",
        &text,
        ["id", "name", "si_unit", "us_unit", "si_column", "us_column"],
    )
}

/// The WebAssembly module's list, from the Node build in `package_dir`.
fn wasm(root: &Path, package_dir: &Path) -> Result<Vec<Entry>, String> {
    let script = "const a = require(process.argv[1]); process.stdout.write(JSON.stringify(a.quantities()));";
    let text = Cmd::new("node").args(["-e", script]).arg(package_dir).dir(root).quiet().stdout()?;
    json_entries("the wasm module", &text, ["id", "name", "siUnit", "usUnit", "siColumn", "usColumn"])
}

/// The C library's list: a C program that prints every id's info as tab-separated
/// fields, and whose compilation asserts the header's enum values.
fn c(root: &Path) -> Result<Vec<Entry>, String> {
    let package = crate::c::package::host(root)?;
    let work = target_dir(root).join("c-tests");
    std::fs::create_dir_all(&work).map_err(|e| io_error("create", &work, e))?;
    let mut source = String::from(
        "/* Written by `cargo xtask catalogue` from the core's catalogue. */\n\
         #include \"aerostrata.h\"\n#include <stdio.h>\n\n",
    );
    for q in Quantity::ALL {
        let info = q.info();
        let _ = writeln!(
            source,
            "_Static_assert(AEROSTRATA_QUANTITY_{} == {}, \"{} keeps its id\");",
            info.name.to_ascii_uppercase(),
            info.id,
            info.name
        );
    }
    source.push_str(
        "\nint main(void) {\n    uint32_t id;\n    AerostrataQuantityInfo q;\n\
         \x20   for (id = 0; id < aerostrata_quantity_count(); id++) {\n\
         \x20       if (aerostrata_quantity_info(id, &q) != AEROSTRATA_STATUS_OK) return 1;\n\
         \x20       printf(\"%u\\t%s\\t%s\\t%s\\t%s\\t%s\\n\", (unsigned)q.id, q.name, q.si_unit, q.us_unit, \
         q.si_column, q.us_column);\n    }\n    return 0;\n}\n",
    );
    let file = work.join("catalogue.c");
    std::fs::write(&file, source).map_err(|e| io_error("write", &file, e))?;
    let exe = work.join("catalogue");
    let include = format!("-I{}", package.prefix.join("include").display());
    Cmd::new("gcc")
        .args(["-std=c11", "-Wall", "-Wextra", "-Werror", "-pedantic"])
        .arg(&include)
        .arg(&file)
        .arg(&package.static_lib)
        .args(&package.native_static_libs)
        .arg("-o")
        .arg(&exe)
        .dir(root)
        .run()?;
    let text = Cmd::new(&exe).dir(root).quiet().stdout()?;
    text.lines()
        .map(|line| {
            let f: Vec<&str> = line.split('\t').collect();
            match f[..] {
                [id, name, si, us, si_column, us_column] => Ok(Entry {
                    id: id.parse().map_err(|_| format!("the C library: bad id in {line}"))?,
                    name: name.to_owned(),
                    si_unit: si.to_owned(),
                    us_unit: us.to_owned(),
                    si_column: si_column.to_owned(),
                    us_column: us_column.to_owned(),
                }),
                _ => Err(format!("the C library: bad line {line:?}")),
            }
        })
        .collect()
}

/// Compares every door's list with the core's; `package_dir` is the wasm package
/// (target/wasm/pkg), built before.
pub fn check(root: &Path, package_dir: &Path) -> Result<String, String> {
    let core = core_entries();
    compare("the command-line tool", &core, &cli(root)?)?;
    compare("the wasm module", &core, &wasm(root, package_dir)?)?;
    compare("the C library", &core, &c(root)?)?;
    let cells = crate::addin::catalogue_check()?;
    Ok(format!(
        "{} quantities with the same ids, names, units and columns in the core, the command-line tool, the \
         wasm module, the C library and the C header; the spreadsheet add-in has a function for each of the \
         {cells} state quantities",
        core.len()
    ))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_door_that_lags_is_named_with_the_first_difference() {
        let core = core_entries();
        assert!(compare("a door", &core, &core).is_ok());
        let mut renamed = core.clone();
        renamed[2].us_unit = "degR".to_owned();
        let message = compare("a door", &core, &renamed).unwrap_err();
        assert!(message.starts_with("a door differs from the core at id 2"), "{message}");
        let short = &core[..core.len() - 1];
        let expected = format!("lists {} quantities, the core {}", core.len() - 1, core.len());
        assert!(compare("a door", &core, short).unwrap_err().contains(&expected));
        let text = r#"[{"id": 0, "name": "geometric_altitude", "siUnit": "m", "usUnit": "ft",
            "siColumn": "geometric_altitude_m", "usColumn": "geometric_altitude_ft"}]"#;
        let keys = ["id", "name", "siUnit", "usUnit", "siColumn", "usColumn"];
        assert_eq!(json_entries("js", text, keys).unwrap()[0], core[0]);
        assert!(json_entries("js", "[{}]", keys).unwrap_err().contains("no \"id\""));
    }
}
