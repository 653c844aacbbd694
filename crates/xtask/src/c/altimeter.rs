//! examples/c-altimeter as a C project would build it from the installed package, checked
//! against the true apogee and maximum dynamic pressure its invented flight log records.

use std::path::Path;

use super::package::Package;
use crate::io_error;
use crate::process::Cmd;

const ALTIMETER_DIR: &str = "examples/c-altimeter";

/// examples/c-altimeter built as a C project would build it, from the installed package:
/// with its Makefile through pkg-config (shared library) and with its CMakeLists.txt
/// through the CMake package (shared and static). The three programs must print the
/// same CSV, find the invented log's true apogee and maximum dynamic pressure (its
/// comment lines, written by make_log.py) within the tolerances below, and reject a bad
/// line with exit status 2.
pub(super) fn check(root: &Path, package: &Package, work: &Path) -> Result<String, String> {
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
        std::fs::remove_dir_all(&out).map_err(|e| io_error("remove", &out, e))?;
    }
    std::fs::create_dir_all(&out).map_err(|e| io_error("create", &out, e))?;
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
    let truth = std::fs::read_to_string(&log).map_err(|e| io_error("read", &log, e))?;
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
