//! `cargo xtask cli-bench`: the command line against reading alone and against the core.
//!
//! One million rows each of altitudes (for `aerostrata eval`) and of flight samples (for
//! `aerostrata flight`, speed only, no vehicle) are written to `target/cli-bench`; the
//! release CLI runs on them with its output to /dev/null, beside `cat` of the same file
//! (the floor: reading it) and the core's own batch (the same states or scan in one
//! loop, no text, in a child `cargo xtask cli-bench-core` built with the core optimised).
//! Each is run three times, interleaved, and the best wall time kept. The section of
//! docs/performance.md between its markers gives rows per second and the ratios; no
//! figure is asserted (the machine is shared), as the project's benchmarks do.

use std::fmt::Write as _;
use std::fs::{self, File};
use std::io::{BufWriter, Write};
use std::path::Path;
use std::process::{Command, Stdio};
use std::time::Instant;

use aerostrata_core::flight::{FlightScan, Sample};
use aerostrata_core::{Altitude, Atmosphere, US1976};

use crate::machine::{load_average, load_text};
use crate::process::Cmd;
use crate::report::CLI;
use crate::{io_error, target_dir};

const ROWS: usize = 1_000_000;
const RUNS: usize = 3;
const REPORT: &str = "docs/performance.md";

/// The invented samples of the streaming test: one a millisecond, 0 to 80 km again and
/// again at 100 to 1100 m/s.
fn sample(i: usize) -> (f64, f64, f64) {
    (i as f64 * 1e-3, (i % 80_000) as f64, 100.0 + (i % 1000) as f64)
}

/// Runs the benchmark and writes its section of [`REPORT`].
///
/// # Errors
/// A message when a build, a run or a file operation fails.
pub fn run(root: &Path) -> Result<(), String> {
    Cmd::new("cargo").args(["build", "--release", "--quiet", "-p", "aerostrata-cli"]).dir(root).run()?;
    let exe = target_dir(root).join("release").join("aerostrata");
    let dir = target_dir(root).join("cli-bench");
    fs::create_dir_all(&dir).map_err(|e| io_error("create", &dir, e))?;
    let altitudes = dir.join("altitudes.txt");
    let flight = dir.join("flight.csv");
    write_rows(&altitudes, |i, out| writeln!(out, "{}", sample(i).1))?;
    write_rows(&flight, |i, out| {
        let (t, h, v) = sample(i);
        writeln!(out, "{t},{h},{v}")
    })?;
    let core = Command::new("cargo")
        .args([
            "run",
            "--quiet",
            "-p",
            "xtask",
            "--config",
            "profile.dev.package.aerostrata.opt-level=3",
            "--",
        ])
        .arg("cli-bench-core")
        .args([&altitudes, &flight])
        .current_dir(root)
        .output()
        .map_err(|e| format!("cargo run xtask cli-bench-core: {e}"))?;
    if !core.status.success() {
        return Err(format!("cli-bench-core: {}", String::from_utf8_lossy(&core.stderr)));
    }
    let core_text = String::from_utf8_lossy(&core.stdout).to_string();
    let mut core_times = core_text.split_whitespace().map(|w| w.parse::<f64>().unwrap_or(f64::NAN));
    let (core_eval, core_flight) =
        (core_times.next().unwrap_or(f64::NAN), core_times.next().unwrap_or(f64::NAN));
    let load_before = load_average();
    let mut best = [f64::INFINITY; 4];
    for _ in 0..RUNS {
        let runs: [(&Path, Vec<&std::ffi::OsStr>); 4] = [
            (Path::new("cat"), vec![altitudes.as_os_str()]),
            (&exe, vec!["eval".as_ref(), altitudes.as_os_str()]),
            (Path::new("cat"), vec![flight.as_os_str()]),
            (&exe, vec!["flight".as_ref(), flight.as_os_str(), "--summary".as_ref(), "none".as_ref()]),
        ];
        for (k, (program, args)) in runs.iter().enumerate() {
            best[k] = best[k].min(timed(program, args)?);
        }
    }
    let [cat_eval, cli_eval, cat_flight, cli_flight] = best;
    let mut text = String::new();
    let _ = writeln!(text, "{}\n\n## The command line at I/O speed\n", CLI.begin);
    let _ = writeln!(
        text,
        "One million rows through the release CLI (output to /dev/null, CSV), best of {RUNS} interleaved \
         runs, beside `cat` of the same file and the core's own loop over the same rows (no text). \
         Machine load {}. Figures are of one run on a shared machine: compare the ratios.\n",
        load_text(load_before)
    );
    let _ = writeln!(text, "| run | wall s | rows/s | x cat | x core |\n| --- | ---: | ---: | ---: | ---: |");
    let rate = |s: f64| format!("{:.0}", ROWS as f64 / s);
    for (name, seconds, cat, core) in [
        ("`cat` altitudes (1 M lines)", cat_eval, cat_eval, core_eval),
        ("`aerostrata eval` (20 columns a row)", cli_eval, cat_eval, core_eval),
        ("core: `US1976.state` a row", core_eval, cat_eval, core_eval),
        ("`cat` flight (1 M samples)", cat_flight, cat_flight, core_flight),
        ("`aerostrata flight --summary none`", cli_flight, cat_flight, core_flight),
        ("core: `FlightScan::push` a sample", core_flight, cat_flight, core_flight),
    ] {
        let _ = writeln!(
            text,
            "| {name} | {seconds:.3} | {} | {:.1} | {:.1} |",
            rate(seconds),
            seconds / cat,
            seconds / core
        );
    }
    let _ = write!(text, "\n{}", CLI.end);
    let path = root.join(REPORT);
    let old = fs::read_to_string(&path).map_err(|e| io_error("read", &path, e))?;
    fs::write(&path, CLI.splice(&old, &text)).map_err(|e| io_error("write", &path, e))?;
    println!("{text}");
    Ok(())
}

/// The core's own loops over the two files: prints the seconds of each (states, scan).
///
/// # Errors
/// A message when a file cannot be read or the core refuses a row.
pub fn core(args: &[String]) -> Result<(), String> {
    let [altitudes, flight] = args else {
        return Err("usage: cargo xtask cli-bench-core ALTITUDES FLIGHT".into());
    };
    let read = |p: &str| fs::read_to_string(p).map_err(|e| io_error("read", Path::new(p), e));
    let heights: Vec<f64> = read(altitudes)?.lines().filter_map(|l| l.parse().ok()).collect();
    let samples: Vec<Sample> = read(flight)?
        .lines()
        .filter_map(|l| {
            let mut cells = l.split(',').map(|c| c.parse::<f64>());
            match (cells.next(), cells.next(), cells.next()) {
                (Some(Ok(time_s)), Some(Ok(altitude_m)), Some(Ok(velocity_m_s))) => {
                    Some(Sample { time_s, altitude_m, velocity_m_s })
                }
                _ => None,
            }
        })
        .collect();
    let started = Instant::now();
    let mut sum = 0.0;
    for h in &heights {
        let altitude = Altitude::geometric_m(*h).map_err(|e| e.to_string())?;
        sum += US1976.state(altitude).map_err(|e| e.to_string())?.density_kg_m3;
    }
    let states = started.elapsed().as_secs_f64();
    let started = Instant::now();
    let mut scan = FlightScan::new(&US1976, None);
    for s in &samples {
        sum += scan.push(*s).map_err(|e| e.to_string())?.dynamic_pressure_pa;
    }
    let scanned = started.elapsed().as_secs_f64();
    println!("{states} {scanned}");
    eprintln!("checksum {sum}");
    Ok(())
}

/// `ROWS` lines written by `line` into `path`.
fn write_rows(
    path: &Path,
    line: impl Fn(usize, &mut BufWriter<File>) -> std::io::Result<()>,
) -> Result<(), String> {
    let file = File::create(path).map_err(|e| io_error("create", path, e))?;
    let mut out = BufWriter::with_capacity(1 << 16, file);
    (0..ROWS)
        .try_for_each(|i| line(i, &mut out))
        .and_then(|()| out.flush())
        .map_err(|e| io_error("write", path, e))
}

/// Wall seconds of `program args` with its output to /dev/null.
fn timed(program: &Path, args: &[&std::ffi::OsStr]) -> Result<f64, String> {
    let null = File::create("/dev/null").map_err(|e| io_error("open", Path::new("/dev/null"), e))?;
    let started = Instant::now();
    let status = Command::new(program)
        .args(args)
        .stdout(Stdio::from(null))
        .status()
        .map_err(|e| format!("{}: {e}", program.display()))?;
    let seconds = started.elapsed().as_secs_f64();
    if !status.success() {
        return Err(format!("{} {args:?}: {status}", program.display()));
    }
    Ok(seconds)
}
