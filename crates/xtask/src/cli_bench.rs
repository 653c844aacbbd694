//! `cargo xtask cli-bench`: the command line against reading alone and against the core.
//!
//! One million rows each of altitudes (for `aerostrata eval`) and of flight samples (for
//! `aerostrata flight`, speed only, no vehicle) are written to `target/cli-bench`; the
//! release CLI runs on them with its output to /dev/null, beside `cat` of the same file
//! (the floor: reading it) and the core on the same rows without text (in a child
//! `cargo xtask cli-bench-core` built with the core optimised): `US1976.batch` of every
//! state quantity, `US1976.state` a row, and `FlightScan::push` a sample. The five take
//! turns for [`RUNS`] rounds in one run of the command, so that all see the same machine;
//! the section of docs/performance.md between its markers gives the median and the
//! fastest round of each, rows per second and the ratios, with the load before and
//! after; and, where valgrind is installed, the instructions a row of each command over
//! the first [`COUNTED_ROWS`] rows (callgrind), a figure that a loaded machine does not
//! change. No figure is asserted (the machine is shared), as the project's benchmarks do.

use std::fmt::Write as _;
use std::fs::{self, File};
use std::io::{BufWriter, Write};
use std::path::Path;
use std::process::{Command, Stdio};
use std::time::Instant;

use aerostrata_core::flight::{FlightScan, Sample};
use aerostrata_core::quantity::Group;
use aerostrata_core::{Altitude, AltitudeKind, Atmosphere, Quantity, US1976};

use crate::machine::{load_average, load_text};
use crate::process::Cmd;
use crate::report::CLI;
use crate::{io_error, target_dir};

const ROWS: usize = 1_000_000;
const RUNS: usize = 5;
/// Rows of the instruction count (callgrind runs some fifty times slower).
const COUNTED_ROWS: usize = 100_000;
const REPORT: &str = "docs/performance.md";

/// The invented samples of the streaming test: one a millisecond, 0 to 80 km again and
/// again at 100 to 1100 m/s.
fn sample(i: usize) -> (f64, f64, f64) {
    (i as f64 * 1e-3, (i % 80_000) as f64, 100.0 + (i % 1000) as f64)
}

/// The wall seconds of every round of one side, and their median and least.
#[derive(Default)]
struct Times(Vec<f64>);

impl Times {
    fn sorted(&self) -> Vec<f64> {
        let mut sorted = self.0.clone();
        sorted.sort_by(f64::total_cmp);
        sorted
    }

    fn median(&self) -> f64 {
        let sorted = self.sorted();
        match sorted.len() {
            0 => f64::NAN,
            n if n % 2 == 1 => sorted[n / 2],
            n => (sorted[n / 2 - 1] + sorted[n / 2]) / 2.0,
        }
    }

    fn fastest(&self) -> f64 {
        self.sorted().first().copied().unwrap_or(f64::NAN)
    }

    fn listed(&self) -> String {
        self.0.iter().map(|s| format!("{s:.3}")).collect::<Vec<_>>().join(", ")
    }
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
    let core_args =
        ["run", "--quiet", "-p", "xtask", "--config", "profile.dev.package.aerostrata.opt-level=3", "--"];
    // Built once before the rounds, so that no round waits for a build.
    Cmd::new("cargo")
        .args(["build", "--quiet", "-p", "xtask", "--config", "profile.dev.package.aerostrata.opt-level=3"])
        .dir(root)
        .run()?;
    let counted = [(&altitudes, "altitudes-100k.txt"), (&flight, "flight-100k.csv")].map(|(whole, name)| {
        let path = dir.join(name);
        (whole.clone(), path)
    });
    for (whole, part) in &counted {
        let text = fs::read_to_string(whole).map_err(|e| io_error("read", whole, e))?;
        let lines: String = text.split_inclusive('\n').take(COUNTED_ROWS).collect();
        fs::write(part, lines).map_err(|e| io_error("write", part, e))?;
    }
    let instructions = [
        instructions_per_row(&exe, &["eval".as_ref(), counted[0].1.as_os_str()]),
        instructions_per_row(
            &exe,
            &["flight".as_ref(), counted[1].1.as_os_str(), "--summary".as_ref(), "none".as_ref()],
        ),
    ];
    let load_before = load_average();
    // cat altitudes, eval, core batch, core states, cat flight, flight, core scan.
    let mut times: [Times; 7] = Default::default();
    for _ in 0..RUNS {
        times[0].0.push(timed(Path::new("cat"), &[altitudes.as_os_str()])?);
        times[1].0.push(timed(&exe, &["eval".as_ref(), altitudes.as_os_str()])?);
        let core = Command::new("cargo")
            .args(core_args)
            .arg("cli-bench-core")
            .args([&altitudes, &flight])
            .current_dir(root)
            .output()
            .map_err(|e| format!("cargo run xtask cli-bench-core: {e}"))?;
        if !core.status.success() {
            return Err(format!("cli-bench-core: {}", String::from_utf8_lossy(&core.stderr)));
        }
        let text = String::from_utf8_lossy(&core.stdout).to_string();
        let seconds: Vec<f64> = text.split_whitespace().map(|w| w.parse().unwrap_or(f64::NAN)).collect();
        let [batch, states, scan] = seconds[..] else {
            return Err(format!("cli-bench-core printed {text:?}, not three times"));
        };
        times[2].0.push(batch);
        times[3].0.push(states);
        times[4].0.push(timed(Path::new("cat"), &[flight.as_os_str()])?);
        let args = ["flight".as_ref(), flight.as_os_str(), "--summary".as_ref(), "none".as_ref()];
        times[5].0.push(timed(&exe, &args)?);
        times[6].0.push(scan);
    }
    let load_after = load_average();
    let mut text = String::new();
    let _ = writeln!(text, "{}\n\n## The command line at I/O speed\n", CLI.begin);
    let _ = writeln!(
        text,
        "Measured by `cargo xtask cli-bench` (crates/xtask/src/cli_bench.rs): one million rows through the \
         release CLI (CSV to /dev/null; `eval` writes 20 numbers a row, `flight --summary none` 13), beside \
         `cat` of the same file and the core on the same rows without text (`US1976.batch` of the 20 state \
         quantities into 20 columns, `US1976.state` a row, `FlightScan::push` a sample; in a child built with \
         the core optimised, files read before timing). The seven take turns for {RUNS} rounds in one run, so \
         all see the same machine; the median and the fastest round of each. Load average (1, 5, 15 min) {} \
         before, {} after, on 2 shared CPUs: compare the ratios.\n",
        load_text(load_before),
        load_text(load_after)
    );
    let _ = writeln!(
        text,
        "| run | median s | fastest s | rows/s (median) | rows/s (fastest) | x cat (median) | x core (median) |\n\
         | --- | ---: | ---: | ---: | ---: | ---: | ---: |"
    );
    let rate = |s: f64| format!("{:.0}", ROWS as f64 / s);
    let (cat_eval, cat_flight) = (times[0].median(), times[4].median());
    let (batch, scan) = (times[2].median(), times[6].median());
    let names = [
        ("`cat` altitudes (1 M lines)", cat_eval, batch),
        ("`aerostrata eval`", cat_eval, batch),
        ("core: `US1976.batch`, 20 columns", cat_eval, batch),
        ("core: `US1976.state` a row", cat_eval, batch),
        ("`cat` flight (1 M samples)", cat_flight, scan),
        ("`aerostrata flight --summary none`", cat_flight, scan),
        ("core: `FlightScan::push` a sample", cat_flight, scan),
    ];
    for ((name, cat, core), side) in names.iter().zip(&times) {
        let (median, fastest) = (side.median(), side.fastest());
        let _ = writeln!(
            text,
            "| {name} | {median:.3} | {fastest:.3} | {} | {} | {} | {} |",
            rate(median),
            rate(fastest),
            ratio(median / cat),
            ratio(median / core)
        );
    }
    let counted_text = |count: &Option<u64>| {
        count.map_or_else(|| "not counted (no valgrind)".to_owned(), |n| format!("{n} instructions a row"))
    };
    let _ = writeln!(
        text,
        "\nInstructions (valgrind's callgrind, the first {COUNTED_ROWS} rows, the whole run divided by the \
         rows; a count that other work on the machine does not change): `aerostrata eval` {}, `aerostrata \
         flight --summary none` {}.",
        counted_text(&instructions[0]),
        counted_text(&instructions[1])
    );
    let _ = writeln!(
        text,
        "\nThe core column divides by the core's batch for `eval` (by the scan for `flight`); `cat` reads the \
         file (its writes to /dev/null cost nothing), the floor of any reader. Every round's seconds: {}.\n",
        names
            .iter()
            .zip(&times)
            .map(|((name, ..), t)| format!("{name}: {}", t.listed()))
            .collect::<Vec<_>>()
            .join("; ")
    );
    let _ = write!(text, "{}", CLI.end);
    let path = root.join(REPORT);
    let old = fs::read_to_string(&path).map_err(|e| io_error("read", &path, e))?;
    fs::write(&path, CLI.splice(&old, &text)).map_err(|e| io_error("write", &path, e))?;
    println!("{text}");
    Ok(())
}

/// The core on the two files: prints the seconds of the batch of every state quantity,
/// of the states a row, and of the flight scan.
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
    let quantities: Vec<Quantity> = Quantity::of_group(Group::State).collect();
    let mut columns = vec![vec![0.0; heights.len()]; quantities.len()];
    let started = Instant::now();
    {
        let mut outputs: Vec<&mut [f64]> = columns.iter_mut().map(Vec::as_mut_slice).collect();
        US1976
            .batch(AltitudeKind::Geometric, &heights, &quantities, &mut outputs)
            .map_err(|e| e.to_string())?;
    }
    let batch = started.elapsed().as_secs_f64();
    let mut sum: f64 = columns.iter().map(|c| c.iter().sum::<f64>()).sum();
    let started = Instant::now();
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
    println!("{batch} {states} {scanned}");
    eprintln!("checksum {sum}");
    Ok(())
}

/// A ratio with two significant digits at least (a small one is not written as 0.0).
fn ratio(x: f64) -> String {
    if x >= 10.0 {
        format!("{x:.0}")
    } else if x >= 0.1 {
        format!("{x:.2}")
    } else {
        format!("{x:.4}")
    }
}

/// Instructions a row of `exe args` under callgrind (the whole run over [`COUNTED_ROWS`]),
/// or `None` when valgrind is missing or fails.
fn instructions_per_row(exe: &Path, args: &[&std::ffi::OsStr]) -> Option<u64> {
    let output = Command::new("valgrind")
        .args(["--tool=callgrind", "--callgrind-out-file=/dev/null"])
        .arg(exe)
        .args(args)
        .stdout(Stdio::null())
        .output()
        .ok()?;
    if !output.status.success() {
        return None;
    }
    // `==PID== Collected : 815878373`
    let text = String::from_utf8_lossy(&output.stderr);
    let line = text.lines().find(|l| l.contains("Collected :"))?;
    let total: u64 = line.rsplit(':').next()?.trim().parse().ok()?;
    Some(total / COUNTED_ROWS as u64)
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
