//! `cargo xtask wasm-bench`: one million altitudes through the wasm module's batch
//! evaluation in Node, and the same altitudes through the native core's batch, in one
//! run; the states per second of each and their ratio go into docs/performance.md, in a
//! section of its own between markers (`cargo xtask bench` keeps it when it rewrites the
//! file).
//!
//! Both sides compute the same thing: five quantities of the 1976 standard at every
//! altitude, column after column, into arrays made once (`batchInto` in Node,
//! bindings/wasm/tests/bench.mjs; `US1976.batch` natively,
//! bindings/wasm/examples/native_batch.rs). Node writes the altitudes to a file so the
//! native side reads the very same inputs; both print a checksum of their outputs'
//! bytes, which must agree (a bit-identity check on five million values). The module is
//! measured as the package ships it and built the other ways of wasm/variant.rs
//! (optimisation levels, wasm-opt's level, SIMD), every build against the same native
//! runs: the core with its default features (the goal's side) and, like for like, with
//! the module's. The sides alternate, round after round, so that a change in the machine's load
//! falls on all. A benchmark, not a test: nothing fails on a slow machine.

use std::fs;
use std::path::Path;

use super::package::{build_variant, Package};
use super::variant::{Variant, OTHERS, SHIPPED};
use crate::machine::{load_average, load_text, version, Machine};
use crate::process::Cmd;
use crate::{io_error, target_dir};

/// Altitudes in the batch.
const COUNT: usize = 1_000_000;
/// Rounds of the alternation, and timed runs per side in each round.
const ROUNDS: usize = 3;
const RUNS: usize = 5;
/// The goal: the wasm module within this factor of the native core (the median batch).
const GOAL_RATIO: f64 = 1.5;
/// The goal: the default module at most this many KiB after `gzip -9` (its budget,
/// package.rs's `MAX_GZIP_BYTES`).
const GOAL_GZIP_KIB: f64 = (super::package::MAX_GZIP_BYTES / 1024) as f64;

const REPORT: &str = "docs/performance.md";

/// The runs of one side.
#[derive(Default)]
struct Runs {
    ms: Vec<f64>,
    first: Vec<f64>,
}

/// The milliseconds of the timed runs, of the first (cold) batch, and the checksum one
/// side printed.
fn parse(side: &str, json: &str) -> Result<(Vec<f64>, f64, String), String> {
    let value: serde_json::Value =
        serde_json::from_str(json.trim()).map_err(|e| format!("{side}: not JSON ({e}): {json}"))?;
    let runs = value["runs_ms"]
        .as_array()
        .ok_or(format!("{side}: no runs_ms"))?
        .iter()
        .filter_map(serde_json::Value::as_f64)
        .collect::<Vec<_>>();
    let checksum = value["checksum"].as_str().ok_or(format!("{side}: no checksum"))?.to_owned();
    if runs.is_empty() {
        return Err(format!("{side}: no timed runs"));
    }
    let first = value["first_ms"].as_f64().ok_or(format!("{side}: no first_ms"))?;
    Ok((runs, first, checksum))
}

fn median(values: &[f64]) -> f64 {
    let mut sorted = values.to_vec();
    sorted.sort_by(f64::total_cmp);
    let n = sorted.len();
    if n % 2 == 1 {
        sorted[n / 2]
    } else {
        0.5 * (sorted[n / 2 - 1] + sorted[n / 2])
    }
}

fn min(values: &[f64]) -> f64 {
    values.iter().copied().fold(f64::INFINITY, f64::min)
}

pub fn run(root: &Path) -> Result<(), String> {
    let machine = Machine::probe(root);
    let wasm_dir = target_dir(root).join("wasm");
    let mut builds: Vec<(&Variant, Package)> = vec![(&SHIPPED, build_variant(root, &SHIPPED, &wasm_dir)?)];
    for variant in &OTHERS {
        eprintln!("building the module as {}: {}", variant.name, variant.description);
        let package = build_variant(root, variant, &wasm_dir.join("variants").join(variant.name))?;
        builds.push((variant, package));
    }
    // The native side twice: the core as a native program gets it by default (`std`, whose
    // square root the compiler vectorises; libm's is inline assembly), against which the
    // goal is judged, and with the module's own features (no `std`), like for like.
    let cargo = std::env::var("CARGO").unwrap_or_else(|_| "cargo".to_owned());
    let built = target_dir(root).join("release").join("examples").join("native_batch");
    let mut natives = Vec::new();
    for (name, extra) in [("native_std", Some("aerostrata/std")), ("native_module_features", None)] {
        let mut args =
            vec!["build", "--quiet", "--release", "-p", "aerostrata-wasm", "--example", "native_batch"];
        args.extend(extra.iter().flat_map(|feature| ["--features", *feature]));
        Cmd::new(&cargo).args(args).dir(root).run()?;
        let copy = wasm_dir.join(name);
        fs::copy(&built, &copy).map_err(|e| io_error("copy", &built, e))?;
        natives.push(copy);
    }
    let altitudes = wasm_dir.join("bench-altitudes.f64");
    let script = root.join("bindings/wasm/tests/bench.mjs").to_string_lossy().into_owned();
    let a = altitudes.to_string_lossy().into_owned();
    let (count, runs) = (COUNT.to_string(), RUNS.to_string());
    let mut wasm: Vec<Runs> = builds.iter().map(|_| Runs::default()).collect();
    let mut native_runs = [Runs::default(), Runs::default()];
    let mut checksums = Vec::new();
    for round in 1..=ROUNDS {
        eprintln!("round {round} of {ROUNDS}: the {} builds in Node, then native", builds.len());
        for ((variant, package), side) in builds.iter().zip(wasm.iter_mut()) {
            let p = package.dir.to_string_lossy().into_owned();
            let json = Cmd::new("node").args([&script, &p, &a, &count, &runs]).dir(root).quiet().stdout()?;
            let (ms, first, sum) = parse(variant.name, &json)?;
            side.ms.extend(ms);
            side.first.push(first);
            checksums.push((variant.name, sum));
        }
        for (native, side) in natives.iter().zip(native_runs.iter_mut()) {
            let (ms, first, sum) =
                parse("native", &Cmd::new(native).args([&a, &runs]).dir(root).quiet().stdout()?)?;
            side.ms.extend(ms);
            side.first.push(first);
            checksums.push(("native", sum));
        }
    }
    let load_after = load_text(load_average());
    let first = checksums[0].1.clone();
    if let Some((side, sum)) = checksums.iter().find(|(_, sum)| *sum != first) {
        return Err(format!("the outputs differ: checksum {sum} ({side}) against {first}"));
    }
    let native_median = median(&native_runs[0].ms);
    let native_fastest = min(&native_runs[0].ms);
    let (like_median, like_fastest) = (median(&native_runs[1].ms), min(&native_runs[1].ms));
    let per_second = |ms: f64| COUNT as f64 / (ms / 1e3);
    let list = |v: &[f64]| v.iter().map(|x| format!("{x:.1}")).collect::<Vec<_>>().join(", ");
    let kib = |bytes: u64| bytes as f64 / 1024.0;
    let mut table = String::from(
        "| build | default module, raw KiB | gzip KiB | full module, gzip KiB | median ms | fastest ms | states per second (median) | wasm/native, medians | wasm/native, fastest |\n|---|---:|---:|---:|---:|---:|---:|---:|---:|\n",
    );
    let mut runs_text = String::new();
    for ((variant, package), side) in builds.iter().zip(&wasm) {
        let (m, f) = (median(&side.ms), min(&side.ms));
        table.push_str(&format!(
            "| `{}`: {} | {:.1} | {:.1} | {:.1} | {m:.1} | {f:.1} | {:.3e} | {:.2}x | {:.2}x |\n",
            variant.name,
            variant.description,
            kib(package.wasm_bytes),
            kib(package.gzip_bytes),
            kib(package.full_gzip_bytes),
            per_second(m),
            m / native_median,
            f / native_fastest,
        ));
        runs_text.push_str(&format!(
            "`{}`: {} (first batches {}); ",
            variant.name,
            list(&side.ms),
            list(&side.first)
        ));
    }
    table.push_str(&format!(
        "| native core, `US1976.batch`, default features (`std`) | | | | {native_median:.1} | {native_fastest:.1} | {:.3e} | 1x | 1x |\n",
        per_second(native_median)
    ));
    table.push_str(&format!(
        "| native core, `US1976.batch`, the module's features (no `std`: libm's square root) | | | | {like_median:.1} | {like_fastest:.1} | {:.3e} | {:.2}x | {:.2}x |\n",
        per_second(like_median),
        like_median / native_median,
        like_fastest / native_fastest,
    ));
    runs_text.push_str(&format!(
        "native, default features: {} (first batches {}); native, the module's features: {} (first batches {})",
        list(&native_runs[0].ms),
        list(&native_runs[0].first),
        list(&native_runs[1].ms),
        list(&native_runs[1].first)
    ));
    let shipped_ratio = median(&wasm[0].ms) / native_median;
    let shipped_fastest = min(&wasm[0].ms) / native_fastest;
    let verdict = if shipped_ratio <= GOAL_RATIO { "met" } else { "not met" };
    let default_gzip = builds[0].1.gzip_bytes as f64 / 1024.0;
    let size_verdict = if default_gzip <= GOAL_GZIP_KIB { "met" } else { "not met" };
    let (like_ratio, like_ratio_fastest) =
        (median(&wasm[0].ms) / like_median, min(&wasm[0].ms) / like_fastest);
    // More than one CPU's worth of other work means the sides did not have the machine
    // to themselves (batch_bench.rs's rule).
    let cpus = machine.cpus.parse::<f64>().unwrap_or(1.0);
    let busiest = [machine.load_before, load_average()].iter().flatten().map(|l| l[0]).fold(0.0, f64::max);
    let caution = if busiest > 1.0 + 0.25 * cpus {
        format!(
            "\n\n**Caution:** the one-minute load average reached {busiest:.2} on {cpus} CPUs during this run: other \
             work shared the cores, so the milliseconds are inflated unevenly (a round can be twice as slow as the \
             next); the rounds alternate so that every build and the native side share the load, but rerun on a \
             quiet machine before reading differences of a few tens of per cent."
        )
    } else {
        String::new()
    };
    let (begin, end) = (crate::report::WASM.begin, crate::report::WASM.end);
    let section = format!(
        "{begin}
## WebAssembly: batch evaluation in Node against the native core

Measured by `cargo xtask wasm-bench` (crates/xtask/src/wasm/bench.rs): one batch of {COUNT} pseudo-random geometric altitudes, uniform in [0, 86 000) m (fixed seed), five quantities of the 1976 standard (temperatureK, pressurePa, densityKgM3, speedOfSoundMS, dynamicViscosityPaS) written into five `Float64Array`s made once, through `AtmosphereModel.standard().batchInto` of the Node build of the npm package (bindings/wasm/tests/bench.mjs: the altitudes are copied into the module's memory and the columns out of it a chunk of 16 384 at a time, through typed-array views of one buffer the model keeps), and the same altitudes, read from the file Node wrote, through the core's own batch, `US1976.batch`, into five columns made once, built `--release` (bindings/wasm/examples/native_batch.rs) twice: with the core's default features, as a native program gets it (`std`: the compiler's square root, which it vectorises), the side the goal is judged against, and with the module's own features (no `std`: libm's square root, inline assembly the compiler cannot vectorise), like for like. Each side warms up for 3 s (criterion's default; V8 first runs the module in its baseline tier and moves the hot functions to its optimising tier over the first batches), then times {RUNS} runs; the module is built {builds} ways (crates/xtask/src/wasm/variant.rs), and all of them and the native side take turns for {ROUNDS} rounds in one run of the command, so all see the same machine.

- Machine: {cpu}, {cpus} logical CPUs; Node {node}, {rustc}; load average (1, 5, 15 min) {load_before} before, {load_after} after.
- The package's module measured in the same run: {size}.

{table}
| ratio (the shipped build) | medians | fastest runs | goal | verdict |
|---|---:|---:|---|---|
| wasm / native, time per batch | {shipped_ratio:.2}x | {shipped_fastest:.2}x | at most {GOAL_RATIO}x | {verdict} |
| wasm / native with the module's features (like for like, not the goal) | {like_ratio:.2}x | {like_ratio_fastest:.2}x | | |
| the default module after `gzip -9` | {default_gzip:.1} KiB | | at most {GOAL_GZIP_KIB} KiB | {size_verdict} |

Every run's milliseconds: {runs_text}. The outputs of every build and of the native side have the same FNV-1a checksum, `{first}`: the {values} values are bit-identical in every build (the SIMD builds included); `cargo xtask wasm-test` checks the shipped build over every vector.

What the builds show (on a shared machine both the medians and the fastest runs move from one run of the command to the next, and a build's median can double when the load falls on its turns: compare builds within one run, by both columns, and read differences below a quarter as noise): the core crate's optimisation level decides the speed, the rest of the module's does not (`all-3` against the package); at opt-level 2 or 3 LLVM unrolls the core's batch loops and vectorises their per-column arithmetic with simd128 (`f64x2` multiplications and divisions, IEEE operations lane by lane, so the same bits, as the checksum shows), which \"s\" and \"z\" do not; wasm-opt's `-O2` and above (`-O2`, `-Os` and `-Oz` measured alike when the choice was made) leave V8's code about a tenth slower than `-O1` or no optimisation at all (`core-2-Oz`, `core-2-O0` against the package), and `-O1` compresses best, so the package takes `-O1`; without simd128 the module loses wasm's square-root instruction (crates/aerostrata/src/math.rs takes it only under simd128) and the vectorised loops (`no-simd`), so simd128 stays. The package has two modules built from the one crate (bindings/wasm/js/parts.js joins them behind one API): the default module, measured here, with the standard atmosphere, the batch, the catalogue and point loads, and the full module, which a page loads with `loadFull()` for the rest (user models and soundings, flight scans and winds, compressible flow, airspeeds, altimetry, the readers of values and files); the upper atmosphere's tables (16.8 KiB, 15 KiB compressed) are a file `loadUpper` fetches when a page first asks above 86 km.{caution}

Rerun `cargo xtask wasm-bench` to refresh this section; the rest of this file is `cargo xtask bench`'s.
{end}",
        builds = builds.len(),
        cpu = machine.cpu_model,
        cpus = machine.cpus,
        node = version(root, "node"),
        rustc = machine.rustc,
        load_before = load_text(machine.load_before),
        size = builds[0].1.size_line(),
        values = 5 * COUNT,
    );
    let path = root.join(REPORT);
    let report = fs::read_to_string(&path).unwrap_or_default();
    fs::write(&path, crate::report::WASM.splice(&report, &section))
        .map_err(|e| format!("cannot write {REPORT}: {e}"))?;
    eprintln!(
        "shipped build: wasm {:.1} ms, native {native_median:.1} ms per batch of {COUNT}: {shipped_ratio:.2}x (goal at most {GOAL_RATIO}x, {verdict}); wrote {REPORT}",
        median(&wasm[0].ms)
    );
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn medians() {
        assert_eq!(median(&[3.0, 1.0, 2.0]), 2.0);
        assert_eq!(median(&[4.0, 1.0, 2.0, 3.0]), 2.5);
        assert_eq!(min(&[4.0, 1.5]), 1.5);
    }
}
