//! `cargo xtask spreadsheet`: the spreadsheet door in a real spreadsheet, headless
//! LibreOffice Calc filling a sheet through the C package's shared library from a Python
//! macro (examples/spreadsheet), its saved values checked against the vectors.

use std::path::Path;

use crate::io_error;
use crate::process::Cmd;
use crate::target_dir;

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
pub fn run(root: &Path) -> Result<(), String> {
    crate::setup::apt_install(root, &SPREADSHEET_PACKAGES)?;
    let lib = crate::c::package::host(root)?.prefix.join("lib").join("libaerostrata.so");
    let work = target_dir(root).join("spreadsheet");
    if work.exists() {
        std::fs::remove_dir_all(&work).map_err(|e| io_error("remove", &work, e))?;
    }
    let profile = work.join("profile");
    let scripts = profile.join("user").join("Scripts").join("python");
    std::fs::create_dir_all(&scripts).map_err(|e| io_error("create", &scripts, e))?;
    for name in SPREADSHEET_MACROS {
        let from = root.join(SPREADSHEET_DIR).join(name);
        std::fs::copy(&from, scripts.join(name)).map_err(|e| io_error("copy", &from, e))?;
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
        std::fs::read(&path).map_err(|e| io_error("read", &path, e))
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
    let vectors = crate::rust::vectors::read(&root.join("tests/vectors/usa76_lower.csv"))?;
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
                    crate::rust::vectors::half_unit_of_last_digit(&row[i]).filter(|_| !row[i].is_empty())
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
