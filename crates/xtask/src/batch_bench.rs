//! `cargo xtask batch-bench`: a million altitudes through the core's batch path
//! (`US1976.batch`, one thread, and `US1976.batch_parallel`, rayon's threads) and through
//! the hand-written numpy evaluation a user would write instead
//! (crates/aerostrata/benches/numpy_baseline.py), in one run on one machine; medians,
//! fastest runs, the two ratios and their goals go into docs/performance.md, in a section
//! of its own between markers.
//!
//! Both sides read the same altitudes (the Rust benchmark writes them, the script reads
//! them) and compute the same five quantities (T, p, rho, a, mu); they take turns, round
//! after round, the order rotating, so that a change in the machine's load falls on all.
//! A benchmark, not a test: nothing fails on a slow machine.

use std::fs;
use std::path::Path;

use crate::machine::{load_average, load_text, Machine};
use crate::process::Cmd;
use crate::report::BATCH;
use crate::target_dir;

/// Altitudes in the batch (fixed by crates/aerostrata/benches/batch.rs).
const COUNT: usize = 1_000_000;
/// Rounds of the alternation, and timed runs per side in each round.
const ROUNDS: usize = 3;
const RUNS: usize = 5;
/// Goals: one thread at least this many times faster than numpy; two threads at least
/// this many times faster than one.
const GOAL_SERIAL: f64 = 2.0;
const GOAL_PARALLEL: f64 = 1.8;

const REPORT: &str = "docs/performance.md";
const SCRIPT: &str = "crates/aerostrata/benches/numpy_baseline.py";

/// One side's figures over all rounds.
#[derive(Default)]
struct Side {
    runs: Vec<f64>,
    first: Vec<f64>,
    sums: Vec<f64>,
}

impl Side {
    fn add(&mut self, name: &str, json: &str) -> Result<(), String> {
        let value: serde_json::Value =
            serde_json::from_str(json.trim()).map_err(|e| format!("{name}: not JSON ({e}): {json}"))?;
        let numbers = |key: &str| -> Result<Vec<f64>, String> {
            Ok(value[key]
                .as_array()
                .ok_or(format!("{name}: no {key}"))?
                .iter()
                .filter_map(serde_json::Value::as_f64)
                .collect())
        };
        let runs = numbers("runs_ms")?;
        if runs.is_empty() {
            return Err(format!("{name}: no timed runs"));
        }
        self.runs.extend(runs);
        self.first.push(value["first_ms"].as_f64().ok_or(format!("{name}: no first_ms"))?);
        self.sums = numbers("sums")?;
        Ok(())
    }

    fn median(&self) -> f64 {
        median(&self.runs)
    }

    fn fastest(&self) -> f64 {
        self.runs.iter().copied().fold(f64::INFINITY, f64::min)
    }
}

fn median(values: &[f64]) -> f64 {
    let mut sorted = values.to_vec();
    sorted.sort_by(f64::total_cmp);
    let n = sorted.len();
    if n == 0 {
        return f64::NAN;
    }
    if n % 2 == 1 {
        sorted[n / 2]
    } else {
        0.5 * (sorted[n / 2 - 1] + sorted[n / 2])
    }
}

fn verdict(measured: f64, fastest: f64, goal: f64) -> &'static str {
    match (measured >= goal, fastest >= goal) {
        (true, true) => "met",
        (true, false) => "met at the medians, not by the fastest runs",
        (false, true) => "not met at the medians (met by the fastest runs)",
        (false, false) => "not met",
    }
}

pub fn run(root: &Path) -> Result<(), String> {
    crate::setup::python_modules(root)?;
    let machine = Machine::probe(root);
    let cargo = std::env::var("CARGO").unwrap_or_else(|_| "cargo".to_owned());
    let altitudes = target_dir(root).join("batch-bench-altitudes.f64");
    let altitudes_text = altitudes.to_string_lossy().into_owned();
    let bench = |args: &[&str]| {
        let mut all =
            vec!["bench", "--quiet", "-p", "aerostrata", "--features", "rayon", "--bench", "batch", "--"];
        all.extend_from_slice(args);
        Cmd::new(&cargo).args(all).dir(root).quiet().stdout()
    };
    bench(&["write", &altitudes_text])?;
    let runs = RUNS.to_string();
    let script = root.join(SCRIPT).to_string_lossy().into_owned();
    let (mut numpy, mut serial, mut parallel) = (Side::default(), Side::default(), Side::default());
    for round in 0..ROUNDS {
        eprintln!("round {} of {ROUNDS}", round + 1);
        // The order rotates, so that no side always follows the same one.
        for turn in 0..3 {
            match (round + turn) % 3 {
                0 => numpy.add(
                    "numpy",
                    &Cmd::new("python3")
                        .args([&script, &altitudes_text, &runs])
                        .dir(root)
                        .quiet()
                        .stdout()?,
                )?,
                1 => serial.add("serial", &bench(&["time", "serial", &altitudes_text, &runs])?)?,
                _ => parallel.add("parallel", &bench(&["time", "parallel", &altitudes_text, &runs])?)?,
            }
        }
    }
    let load_after = load_text(load_average());
    // The threads' batch is the one thread's, bit for bit; its column sums must match.
    if serial.sums.iter().zip(&parallel.sums).any(|(a, b)| a.to_bits() != b.to_bits()) {
        return Err(format!(
            "the parallel batch's sums {:?} differ from the serial {:?}",
            parallel.sums, serial.sums
        ));
    }
    let agreement = numpy.sums.iter().zip(&serial.sums).map(|(n, s)| ((n - s) / s).abs()).fold(0.0, f64::max);
    let serial_ratio = numpy.median() / serial.median();
    let serial_fastest = numpy.fastest() / serial.fastest();
    let parallel_ratio = serial.median() / parallel.median();
    let parallel_fastest = serial.fastest() / parallel.fastest();
    let numpy_version = Cmd::new("python3")
        .args(["-c", "import numpy; print(numpy.__version__)"])
        .quiet()
        .stdout()
        .map(|v| v.trim().to_owned())
        .unwrap_or_else(|_| "unknown".to_owned());
    // More than one CPU's worth of other work means the sides did not have the machine
    // to themselves, and the threads could not each hold a core.
    let cpus = machine.cpus.parse::<f64>().unwrap_or(1.0);
    let busiest = [machine.load_before, load_average()].iter().flatten().map(|l| l[0]).fold(0.0, f64::max);
    let caution = if busiest > 1.0 + 0.25 * cpus {
        format!(
            "\n\n**Caution:** the one-minute load average reached {busiest:.2} on {cpus} CPUs during this run: other \
             work shared the cores, so the milliseconds are inflated unevenly and the threaded ratio above all \
             measures the machine's load, not the code; rerun on a quiet machine to judge the goals."
        )
    } else {
        String::new()
    };
    let list = |v: &[f64]| v.iter().map(|x| format!("{x:.1}")).collect::<Vec<_>>().join(", ");
    let per_second = |ms: f64| COUNT as f64 / (ms / 1e3);
    let (begin, end) = (BATCH.begin, BATCH.end);
    let section = format!(
        "{begin}
## Batches: the core's batch path against numpy

Measured by `cargo xtask batch-bench` (crates/xtask/src/batch_bench.rs) on {date}: one batch of {COUNT} pseudo-random geometric altitudes, uniform in [0, 86 000) m (fixed seed, in random order), five quantities (temperature, pressure, density, speed of sound, dynamic viscosity) into five caller-provided columns, through `US1976.batch` (one thread), `US1976.batch_parallel` (rayon, {cpus} threads) and the hand-written vectorized numpy evaluation a user would write instead ({SCRIPT}: no validation, no M/M0 table from 80 to 86 km). The altitudes are written once by crates/aerostrata/benches/batch.rs and read by all three. Each side warms up for 0.5 s and times {RUNS} batches; the three take turns for {ROUNDS} rounds in one run of the command, the order rotating, so all see the same machine.

- Machine: {cpu}, {cpus} logical CPUs; {rustc}; Python numpy {numpy_version}; load average (1, 5, 15 min) {load_before} before, {load_after} after.

| side | median ms per batch | fastest ms | states per second (median) |
|---|---:|---:|---:|
| numpy baseline | {nm:.1} | {nf:.1} | {ns:.3e} |
| `US1976.batch`, one thread | {sm:.1} | {sf:.1} | {ss:.3e} |
| `US1976.batch_parallel`, {cpus} threads | {pm:.1} | {pf:.1} | {ps:.3e} |

| ratio | medians | fastest runs | goal | verdict |
|---|---:|---:|---|---|
| numpy / one thread | {serial_ratio:.2}x | {serial_fastest:.2}x | at least {GOAL_SERIAL}x | {v1} |
| one thread / {cpus} threads | {parallel_ratio:.2}x | {parallel_fastest:.2}x | at least {GOAL_PARALLEL}x | {v2} |

Every run's milliseconds, numpy: {nl}; one thread: {sl}; {cpus} threads: {pl}. First (cold) batches: numpy {nfl}; one thread {sfl}; {cpus} threads {pfl} ms. The column sums of the one-thread and the threaded batch are identical to the bit; numpy's agree with them to {agreement:.1e} relative (numpy's `pow` and `exp` are not libm's, and it omits the M/M0 table above 80 km). On a machine shared with other work the milliseconds move by tens of per cent between runs; the medians of interleaved rounds are the figures to read. Rerun `cargo xtask batch-bench` to refresh this section.{caution}
{end}",
        date = machine.date,
        cpu = machine.cpu_model,
        cpus = machine.cpus,
        rustc = machine.rustc,
        load_before = load_text(machine.load_before),
        nm = numpy.median(),
        nf = numpy.fastest(),
        ns = per_second(numpy.median()),
        sm = serial.median(),
        sf = serial.fastest(),
        ss = per_second(serial.median()),
        pm = parallel.median(),
        pf = parallel.fastest(),
        ps = per_second(parallel.median()),
        v1 = verdict(serial_ratio, serial_fastest, GOAL_SERIAL),
        v2 = verdict(parallel_ratio, parallel_fastest, GOAL_PARALLEL),
        nl = list(&numpy.runs),
        sl = list(&serial.runs),
        pl = list(&parallel.runs),
        nfl = list(&numpy.first),
        sfl = list(&serial.first),
        pfl = list(&parallel.first),
    );
    let path = root.join(REPORT);
    let report = fs::read_to_string(&path).unwrap_or_default();
    fs::write(&path, BATCH.splice(&report, &section)).map_err(|e| format!("cannot write {REPORT}: {e}"))?;
    eprintln!(
        "numpy {:.1} ms, one thread {:.1} ms, {} threads {:.1} ms: numpy / one thread {serial_ratio:.2}x (goal {GOAL_SERIAL}x), \
         one / {} threads {parallel_ratio:.2}x (goal {GOAL_PARALLEL}x); wrote {REPORT}",
        numpy.median(),
        serial.median(),
        machine.cpus,
        parallel.median(),
        machine.cpus
    );
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn medians_and_verdicts() {
        assert_eq!(median(&[3.0, 1.0, 2.0]), 2.0);
        assert_eq!(median(&[4.0, 1.0, 2.0, 3.0]), 2.5);
        assert_eq!(verdict(2.1, 2.3, 2.0), "met");
        assert_eq!(verdict(1.9, 2.3, 2.0), "not met at the medians (met by the fastest runs)");
        assert_eq!(verdict(1.5, 1.6, 2.0), "not met");
    }
}
