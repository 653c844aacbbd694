//! `cargo xtask fuzz [--seconds N]`: the fuzz targets of `fuzz/` (a workspace of its
//! own) replayed over their committed corpus on stable, always; then, where a nightly
//! toolchain and cargo-fuzz can be had, each target under libFuzzer for N seconds,
//! else a clear message that the fuzzing run was skipped (docs/robustness.md).

use std::path::{Path, PathBuf};

use crate::process::Cmd;
use crate::setup;

/// The targets, as `fuzz/Cargo.toml` names its binaries and `fuzz/corpus` its folders.
pub const TARGETS: [&str; 8] =
    ["units", "model_spec", "table", "flight_table", "sounding_csv", "winds_csv", "sounding_json", "c_abi"];

/// cargo-fuzz, pinned like the other tools under target/tools.
const CARGO_FUZZ_VERSION: &str = "0.13.2";

/// Seconds per target in `cargo xtask test` (with [`TEST_RUNS`], four times this is the
/// cap): eight targets stay within about two minutes after the first build. `cargo xtask
/// fuzz` alone defaults to a minute each.
pub const TEST_SECONDS: u32 = 15;

/// In `cargo xtask test` each target runs at most this many inputs from a fixed seed, so
/// that the test command explores the same inputs on every machine (a time bound alone
/// would explore more on a faster one, and a finding would come and go with the load);
/// exploring further is `cargo xtask fuzz`'s job.
pub const TEST_RUNS: u32 = 20_000;
pub const DEFAULT_SECONDS: u32 = 60;

/// Reads `--seconds N` from the arguments after `fuzz`.
pub fn seconds(args: &[String]) -> Result<u32, String> {
    match args.iter().position(|a| a == "--seconds") {
        None => Ok(DEFAULT_SECONDS),
        Some(i) => args
            .get(i + 1)
            .and_then(|n| n.parse().ok())
            .ok_or_else(|| "usage: cargo xtask fuzz [--seconds N] (N a whole number of seconds)".to_owned()),
    }
}

/// The replay, then the fuzzing run (or the message saying why there is none).
pub fn run(root: &Path, seconds: u32) -> Result<(), String> {
    replay(root)?;
    if seconds == 0 {
        return Ok(());
    }
    let cargo_fuzz = match fuzzer(root) {
        Ok(path) => path,
        Err(why) => {
            eprintln!(
                "fuzz: SKIPPED the {seconds} s libFuzzer run per target: {why}. The corpus replay above \
                 ran on stable; see docs/robustness.md for running the fuzzer by hand."
            );
            return Ok(());
        }
    };
    fuzz_all(root, &cargo_fuzz, seconds, (seconds == TEST_SECONDS).then_some(TEST_RUNS))
}

/// fuzz/ linted (rustfmt, clippy: the main workspace's checks do not reach it), then
/// `cargo test` there: every target's body over its corpus, on the stable toolchain.
pub fn replay(root: &Path) -> Result<(), String> {
    let manifest = root.join("fuzz").join("Cargo.toml");
    let manifest = manifest.to_string_lossy();
    let cargo = |args: &[&str]| {
        Cmd::new("cargo")
            .args(&args[..1])
            .args(["--manifest-path", &manifest])
            .args(&args[1..])
            .place("fuzz")
            .dir(root)
    };
    cargo(&["fmt", "--all", "--", "--check"]).run()?;
    cargo(&["clippy", "-p", "aerostrata-fuzz-bodies", "--all-targets", "--", "-D", "warnings"]).run()?;
    cargo(&["test", "-p", "aerostrata-fuzz-bodies"]).run()
}

/// A nightly toolchain (installed with rustup when missing, within five minutes) and
/// cargo-fuzz under target/tools; Err says which could not be had.
fn fuzzer(root: &Path) -> Result<PathBuf, String> {
    let nightly = || Cmd::new("rustup").args(["run", "nightly", "rustc", "--version"]).succeeds();
    if !nightly() {
        let install = Cmd::new("rustup")
            .args(["toolchain", "install", "nightly", "--profile", "minimal"])
            .timeout(300)
            .dir(root)
            .run();
        if let Err(e) = install {
            return Err(format!("no nightly toolchain (`rustup toolchain install nightly` failed: {e})"));
        }
        if !nightly() {
            return Err("no nightly toolchain after `rustup toolchain install nightly`".to_owned());
        }
    }
    setup::cargo_tool(root, "cargo-fuzz", "cargo-fuzz", CARGO_FUZZ_VERSION)
        .map_err(|e| format!("cargo-fuzz {CARGO_FUZZ_VERSION} could not be installed ({e})"))
}

/// Each target for `seconds` under libFuzzer with AddressSanitizer, growing a working
/// corpus under target/fuzz (the committed one is only read); a crash's input is kept
/// under target/fuzz/artifacts and named in the error.
fn fuzz_all(root: &Path, cargo_fuzz: &Path, seconds: u32, runs: Option<u32>) -> Result<(), String> {
    let work = crate::target_dir(root).join("fuzz");
    let tools = cargo_fuzz.parent().map(Path::to_path_buf).unwrap_or_default();
    let path = std::env::var_os("PATH").unwrap_or_default();
    let path = std::env::join_paths(std::iter::once(tools).chain(std::env::split_paths(&path)))
        .map_err(|e| format!("cannot extend PATH: {e}"))?;
    let cargo = |args: &[&str]| {
        Cmd::new("cargo").arg("+nightly").arg("fuzz").args(args).envs([("PATH", &path)]).dir(root)
    };
    cargo(&["build", "--fuzz-dir", "fuzz"]).run()?;
    let open = open_findings(root)?;
    if !open.is_empty() {
        eprintln!("  fuzz: tolerating the open findings of fuzz/crashes-open/known.txt: {open}");
    }
    let mut failed = Vec::new();
    for target in TARGETS {
        let corpus = work.join("corpus").join(target);
        let artifacts = work.join("artifacts").join(target);
        for dir in [&corpus, &artifacts] {
            std::fs::create_dir_all(dir).map_err(|e| crate::io_error("create", dir, e))?;
        }
        let listing = |dir: &Path| -> Vec<String> {
            std::fs::read_dir(dir)
                .map(|d| d.flatten().map(|e| e.path().display().to_string()).collect())
                .unwrap_or_default()
        };
        let before = listing(&artifacts);
        let seeds = root.join("fuzz").join("corpus").join(target);
        let (corpus, seeds) = (corpus.to_string_lossy(), seeds.to_string_lossy());
        // With a count of runs, the time is only a cap (a slow machine still stops).
        let time = format!("-max_total_time={}", if runs.is_some() { 4 * seconds } else { seconds });
        let prefix = format!("-artifact_prefix={}/", artifacts.to_string_lossy());
        let repeatable = runs.map(|n| [format!("-runs={n}"), "-seed=1".to_owned()]);
        let args = [
            "run",
            target,
            &corpus,
            &seeds,
            "--fuzz-dir",
            "fuzz",
            "--",
            &time,
            &prefix,
            // A single input that takes 10 s, or a process over 2 GiB, is a failure too.
            "-timeout=10",
            "-rss_limit_mb=2048",
            "-print_final_stats=1",
        ];
        let output = cargo(&args)
            .args(repeatable.iter().flatten())
            .envs([("AEROSTRATA_FUZZ_OPEN", &open)])
            .output()?;
        let stderr = output.stderr_text();
        let done = stderr.lines().rev().find(|l| l.starts_with("Done ")).unwrap_or("no final line");
        let executions = stderr
            .lines()
            .find_map(|l| l.strip_prefix("stat::number_of_executed_units:"))
            .map_or_else(|| "?".to_owned(), |n| n.trim().to_owned());
        eprintln!("  fuzz {target}: {executions} inputs ({done})");
        if !output.success {
            // Only this run's inputs: the folder keeps earlier runs' too.
            let found: Vec<String> =
                listing(&artifacts).into_iter().filter(|f| !before.contains(f)).collect();
            eprintln!("{}", output.last_lines());
            failed.push(format!("{target} (inputs kept: {})", found.join(", ")));
        }
    }
    if failed.is_empty() {
        Ok(())
    } else {
        Err(format!("the fuzzer found failing inputs in {}", failed.join("; ")))
    }
}

/// The ids of fuzz/crashes-open/known.txt (`id: what fails` lines), comma-separated.
fn open_findings(root: &Path) -> Result<String, String> {
    let path = root.join("fuzz").join("crashes-open").join("known.txt");
    let text = std::fs::read_to_string(&path).map_err(|e| crate::io_error("read", &path, e))?;
    let ids: Vec<&str> = text
        .lines()
        .filter(|l| !l.starts_with('#'))
        .filter_map(|l| l.split_once(':'))
        .map(|(id, _)| id.trim())
        .collect();
    Ok(ids.join(","))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The list here, fuzz/Cargo.toml's binaries and the corpus folders name the same
    /// targets, so that none is left out of the run or of the replay (common practice,
    /// no source).
    #[test]
    fn every_target_has_a_binary_and_a_corpus() {
        let root = crate::workspace_root();
        let manifest = std::fs::read_to_string(root.join("fuzz/Cargo.toml")).expect("fuzz/Cargo.toml");
        let bins: Vec<&str> = manifest
            .lines()
            .filter_map(|l| l.strip_prefix("name = \""))
            .filter_map(|l| l.strip_suffix('"'))
            .filter(|name| !name.starts_with("aerostrata"))
            .collect();
        assert_eq!(bins, TARGETS, "fuzz/Cargo.toml's [[bin]] names");
        let mut folders: Vec<String> = std::fs::read_dir(root.join("fuzz/corpus"))
            .expect("fuzz/corpus")
            .flatten()
            .map(|e| e.file_name().to_string_lossy().into_owned())
            .collect();
        folders.sort();
        let mut targets = TARGETS.map(str::to_owned).to_vec();
        targets.sort();
        assert_eq!(folders, targets, "the folders of fuzz/corpus");
    }

    #[test]
    fn seconds_are_read_or_refused() {
        let args = |a: &[&str]| a.iter().map(|s| s.to_string()).collect::<Vec<_>>();
        assert_eq!(seconds(&args(&[])), Ok(DEFAULT_SECONDS));
        assert_eq!(seconds(&args(&["--seconds", "5"])), Ok(5));
        assert!(seconds(&args(&["--seconds"])).is_err());
        assert!(seconds(&args(&["--seconds", "-3"])).is_err());
    }
}
