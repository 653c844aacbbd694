//! The native side of `cargo xtask wasm-bench`: the same batch the wasm module's
//! `AtmosphereModel.batchInto` computes (five quantities of the 1976 standard at every
//! altitude, column after column), through the core's own batch (`US1976.batch`) into
//! columns made once, on the same altitudes, timed the same way, so that the ratio of
//! the two is the cost of running in wasm.
//!
//! Usage: native_batch ALTITUDES_FILE RUNS
//! ALTITUDES_FILE holds little-endian f64 geometric altitudes (m); prints one JSON line:
//! the milliseconds of each timed run and an FNV-1a checksum of the outputs' bytes.

use std::time::Instant;

use aerostrata::batch::BatchError;
use aerostrata::{AltitudeKind, Quantity, US1976};

/// The quantities of the benchmark, in the order of bench.mjs's `QUANTITIES`.
const QUANTITIES: [Quantity; 5] = [
    Quantity::Temperature,
    Quantity::Pressure,
    Quantity::Density,
    Quantity::SpeedOfSound,
    Quantity::DynamicViscosity,
];

/// The batch into `out` (the five columns one after the other).
fn batch(altitudes: &[f64], out: &mut [f64]) -> Result<(), BatchError> {
    let mut columns: Vec<&mut [f64]> = out.chunks_mut(altitudes.len().max(1)).collect();
    US1976.batch(AltitudeKind::Geometric, altitudes, &QUANTITIES, &mut columns)
}

/// FNV-1a (32 bits) over the little-endian bytes of `values`, as bench.mjs computes it.
fn checksum(values: &[f64]) -> u32 {
    let mut hash: u32 = 0x811c_9dc5;
    for v in values {
        for byte in v.to_le_bytes() {
            hash ^= u32::from(byte);
            hash = hash.wrapping_mul(0x0100_0193);
        }
    }
    hash
}

fn main() -> Result<(), String> {
    let args: Vec<String> = std::env::args().collect();
    let (Some(path), Some(runs)) = (args.get(1), args.get(2).and_then(|r| r.parse::<usize>().ok())) else {
        return Err("usage: native_batch ALTITUDES_FILE RUNS".to_owned());
    };
    let bytes = std::fs::read(path).map_err(|e| format!("cannot read {path}: {e}"))?;
    let altitudes: Vec<f64> =
        bytes.chunks_exact(8).map(|c| f64::from_le_bytes(c.try_into().unwrap_or([0; 8]))).collect();
    // Warm-up as criterion's (and bench.mjs's): batches until 3 s have passed; the first
    // batch's time is reported on its own.
    let mut out = vec![0.0; QUANTITIES.len() * altitudes.len()];
    let cold_start = Instant::now();
    batch(&altitudes, &mut out).map_err(|e| e.to_string())?;
    let first_ms = cold_start.elapsed().as_secs_f64() * 1e3;
    let warm = out.clone();
    while cold_start.elapsed().as_secs_f64() < 3.0 {
        batch(std::hint::black_box(&altitudes), std::hint::black_box(&mut out)).map_err(|e| e.to_string())?;
    }
    let mut times = Vec::with_capacity(runs);
    for _ in 0..runs {
        let started = Instant::now();
        batch(std::hint::black_box(&altitudes), std::hint::black_box(&mut out)).map_err(|e| e.to_string())?;
        times.push(started.elapsed().as_secs_f64() * 1e3);
    }
    if out.iter().zip(&warm).any(|(a, b)| a.to_bits() != b.to_bits()) {
        return Err("a later batch differs from the first".to_owned());
    }
    let runs_ms: Vec<String> = times.iter().map(|t| format!("{t:.3}")).collect();
    println!(
        "{{\"runs_ms\": [{}], \"first_ms\": {first_ms:.3}, \"checksum\": \"{:08x}\"}}",
        runs_ms.join(", "),
        checksum(&warm)
    );
    Ok(())
}
