//! A million altitudes through the batch path, timed as whole batches: the serial batch
//! (`US1976.batch`), with the `rayon` feature the parallel one (`batch_parallel`), and
//! for reference the scalar path a user would loop over (`state(alt)` then `get(q)`).
//! Five columns are asked (temperature, pressure, density, speed of sound, dynamic
//! viscosity), the numpy baseline's five (benches/numpy_baseline.py).
//!
//! Not criterion: `cargo xtask batch-bench` runs this binary and the numpy script in
//! turn, round after round, and needs each side's milliseconds per batch on stdout as
//! one JSON line. By hand:
//!
//! ```text
//! cargo bench -p aerostrata --features rayon --bench batch                 # a summary
//! cargo bench -p aerostrata --features rayon --bench batch -- write FILE   # the altitudes
//! cargo bench -p aerostrata --features rayon --bench batch -- time serial|parallel|scalar FILE RUNS
//! ```
//!
//! The altitudes: 1 000 000 pseudo-random geometric altitudes uniform in [0, 86 000) m
//! (xorshift64, fixed seed), in random order (no two neighbours need share a layer);
//! `write` stores them as little-endian f64 for the numpy side to read the same ones.

use std::hint::black_box;
use std::time::{Duration, Instant};

use aerostrata::{Altitude, AltitudeKind, Atmosphere, Quantity, US1976};

// Not criterion: the shared `main` macro goes unused here.
#[allow(unused_macros, unused_imports)]
mod common;
use common::XorShift64;

const COUNT: usize = 1_000_000;
const SEED: u64 = 0x9e37_79b9_7f4a_7c15;
const TOP_M: f64 = 86_000.0;
/// Batches run untimed before the timed ones, at least this long.
const WARM_UP: Duration = Duration::from_millis(500);

const QUANTITIES: [Quantity; 5] = [
    Quantity::Temperature,
    Quantity::Pressure,
    Quantity::Density,
    Quantity::SpeedOfSound,
    Quantity::DynamicViscosity,
];

#[derive(Clone, Copy, PartialEq)]
enum Side {
    Serial,
    #[cfg(feature = "rayon")]
    Parallel,
    Scalar,
}

impl Side {
    fn parse(text: &str) -> Option<Self> {
        match text {
            "serial" => Some(Self::Serial),
            #[cfg(feature = "rayon")]
            "parallel" => Some(Self::Parallel),
            "scalar" => Some(Self::Scalar),
            _ => None,
        }
    }

    fn all() -> Vec<(&'static str, Self)> {
        let mut sides = vec![("serial", Self::Serial)];
        #[cfg(feature = "rayon")]
        sides.push(("parallel", Self::Parallel));
        sides.push(("scalar", Self::Scalar));
        sides
    }
}

fn altitudes() -> Vec<f64> {
    let mut rng = XorShift64(SEED);
    (0..COUNT).map(|_| rng.next_unit() * TOP_M).collect()
}

/// One batch of `side` into `columns`.
fn batch(side: Side, altitudes: &[f64], columns: &mut [Vec<f64>]) {
    let mut outputs: Vec<&mut [f64]> = columns.iter_mut().map(Vec::as_mut_slice).collect();
    let kind = AltitudeKind::Geometric;
    let outcome = match side {
        Side::Serial => US1976.batch(kind, altitudes, &QUANTITIES, &mut outputs).map_err(|e| e.to_string()),
        #[cfg(feature = "rayon")]
        Side::Parallel => {
            US1976.batch_parallel(kind, altitudes, &QUANTITIES, &mut outputs).map_err(|e| e.to_string())
        }
        Side::Scalar => scalar(altitudes, &mut outputs).map_err(|e| e.to_string()),
    };
    if let Err(message) = outcome {
        eprintln!("batch bench: {message}");
        std::process::exit(2);
    }
}

/// The loop a user writes without the batch path.
fn scalar(altitudes: &[f64], outputs: &mut [&mut [f64]]) -> aerostrata::Result<()> {
    for (i, &meters) in altitudes.iter().enumerate() {
        let state = US1976.state(Altitude::geometric_m(meters)?)?;
        for (quantity, column) in QUANTITIES.iter().zip(outputs.iter_mut()) {
            column[i] = state.get(*quantity)?;
        }
    }
    Ok(())
}

/// Milliseconds of `runs` batches after the warm-up, and of the first (cold) batch.
fn time(side: Side, altitudes: &[f64], runs: usize) -> (Vec<f64>, f64, [f64; 5]) {
    let mut columns = vec![vec![0.0; altitudes.len()]; QUANTITIES.len()];
    let start = Instant::now();
    batch(side, black_box(altitudes), &mut columns);
    let first = start.elapsed().as_secs_f64() * 1e3;
    // `BATCH_WARM_UP_MS` shortens the warm-up (0 under an instruction counter).
    let warm_up = std::env::var("BATCH_WARM_UP_MS")
        .ok()
        .and_then(|ms| ms.parse().ok())
        .map_or(WARM_UP, Duration::from_millis);
    let warm = Instant::now();
    while warm.elapsed() < warm_up {
        batch(side, black_box(altitudes), &mut columns);
    }
    let mut ms = Vec::with_capacity(runs);
    for _ in 0..runs {
        let start = Instant::now();
        batch(side, black_box(altitudes), &mut columns);
        ms.push(start.elapsed().as_secs_f64() * 1e3);
        black_box(&columns);
    }
    let sums = std::array::from_fn(|c| columns[c].iter().sum());
    (ms, first, sums)
}

fn list(values: &[f64]) -> String {
    values.iter().map(|v| format!("{v:.3}")).collect::<Vec<_>>().join(", ")
}

fn read(path: &str) -> Vec<f64> {
    let bytes = std::fs::read(path).unwrap_or_else(|e| {
        eprintln!("batch bench: cannot read {path}: {e}");
        std::process::exit(2);
    });
    bytes.chunks_exact(8).map(|b| f64::from_le_bytes(b.try_into().unwrap_or([0; 8]))).collect()
}

fn main() {
    // `cargo bench` adds `--bench`; the words that follow `--` come after it.
    let args: Vec<String> = std::env::args().skip(1).filter(|a| a != "--bench").collect();
    match args.iter().map(String::as_str).collect::<Vec<_>>().as_slice() {
        ["write", path] => {
            let bytes: Vec<u8> = altitudes().iter().flat_map(|z| z.to_le_bytes()).collect();
            if let Err(e) = std::fs::write(path, bytes) {
                eprintln!("batch bench: cannot write {path}: {e}");
                std::process::exit(2);
            }
        }
        ["time", side, path, runs] => {
            let (Some(side), Ok(runs)) = (Side::parse(side), runs.parse::<usize>()) else {
                eprintln!("batch bench: usage: time serial|parallel|scalar FILE RUNS");
                std::process::exit(2);
            };
            let (ms, first, sums) = time(side, &read(path), runs.max(1));
            println!(
                "{{\"runs_ms\": [{}], \"first_ms\": {first:.3}, \"sums\": [{}]}}",
                list(&ms),
                list(&sums)
            );
        }
        _ => {
            let altitudes = altitudes();
            for (name, side) in Side::all() {
                let (ms, _, _) = time(side, &altitudes, 5);
                let best = ms.iter().copied().fold(f64::INFINITY, f64::min);
                println!("{name:>8}: {best:.1} ms for {COUNT} altitudes, five quantities (fastest of 5)");
            }
        }
    }
}
