//! Every fuzz target over its committed corpus (`fuzz/corpus/<target>/`: seeds from the
//! example files, the test vectors and the documentation, and every input the fuzzer
//! kept), on stable, as `cargo xtask fuzz` and `cargo test` in `fuzz/` run it. The
//! inputs of `fuzz/crashes-open/` still fail and are left out until the code is fixed.

use std::panic::{catch_unwind, AssertUnwindSafe};
use std::path::{Path, PathBuf};

use aerostrata_fuzz_bodies::{checked_text, finite, TARGETS};

fn corpus(target: &str) -> Vec<PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("../corpus").join(target);
    let mut files: Vec<PathBuf> = std::fs::read_dir(&dir)
        .unwrap_or_else(|e| panic!("cannot read {}: {e}", dir.display()))
        .map(|entry| entry.expect("a directory entry").path())
        .filter(|path| path.is_file())
        .collect();
    files.sort();
    files
}

#[test]
fn every_target_passes_over_its_corpus() {
    let mut failures = Vec::new();
    let mut total = 0;
    for (name, body) in TARGETS {
        let files = corpus(name);
        assert!(!files.is_empty(), "the corpus of {name} is empty");
        for file in files {
            let data = std::fs::read(&file).expect("a corpus file");
            total += 1;
            if let Err(payload) = catch_unwind(AssertUnwindSafe(|| body(&data))) {
                let why = payload
                    .downcast_ref::<String>()
                    .cloned()
                    .or_else(|| payload.downcast_ref::<&str>().map(|s| s.to_string()))
                    .unwrap_or_default();
                failures.push(format!("{}: {why}", file.display()));
            }
        }
    }
    assert!(
        failures.is_empty(),
        "{} of {total} corpus inputs fail:\n{}",
        failures.len(),
        failures.join("\n")
    );
    eprintln!("{total} corpus inputs replayed over {} targets", TARGETS.len());
}

/// The seeds must reach the readers' success paths, or the fuzzer starts from nothing
/// but errors: every example sounding and model spec of the corpus reads (hand-worked:
/// they are the documented examples).
#[test]
fn the_seeds_reach_the_success_paths() {
    use aerostrata::model::sounding_io::{read_csv, read_winds_csv, Options};
    use aerostrata::model::ModelSpec;
    // Findings (`found_*`) are inputs that failed once and must now fail cleanly: they
    // are replayed with the invariants, not expected to load.
    let corpus = |target: &str| {
        corpus(target)
            .into_iter()
            .filter(|f| !f.file_name().is_some_and(|n| n.to_string_lossy().starts_with("found_")))
    };
    for file in corpus("sounding_csv") {
        let text = std::fs::read_to_string(&file).expect("a seed");
        read_csv(&text, &Options::default()).unwrap_or_else(|e| panic!("{}: {e}", file.display()));
    }
    for file in corpus("winds_csv") {
        let text = std::fs::read_to_string(&file).expect("a seed");
        read_winds_csv(&text, &Options::default()).unwrap_or_else(|e| panic!("{}: {e}", file.display()));
    }
    for file in corpus("model_spec")
        .filter(|f| f.file_name().is_some_and(|n| n.to_string_lossy().starts_with("spec")))
    {
        let text = std::fs::read_to_string(&file).expect("a seed");
        ModelSpec::parse(&text).unwrap_or_else(|e| panic!("{}: {e}", file.display()));
    }
    for file in corpus("sounding_json").filter(|f| f.extension().is_some_and(|e| e == "json")) {
        let text = std::fs::read_to_string(&file).expect("a seed");
        serde_json::from_str::<aerostrata::Tabulated<Vec<aerostrata::SoundingLevel>>>(&text)
            .unwrap_or_else(|e| panic!("{}: {e}", file.display()));
    }
}

/// The invariants themselves can fail (common practice, no source): a message with a
/// control character, an overlong one, an empty one, and a value that is not finite.
#[test]
fn the_invariants_reject_what_they_should() {
    for bad in ["column 1: 'a\u{1b}[2J' is not a number", "", &"x".repeat(601)] {
        assert!(catch_unwind(|| checked_text(bad)).is_err(), "{bad:?} passed");
    }
    checked_text("column 2: 'abc' is not a number");
    for bad in [f64::NAN, f64::INFINITY, f64::NEG_INFINITY] {
        assert!(catch_unwind(|| finite("x", bad)).is_err(), "{bad} passed");
    }
    finite("x", 0.0);
}

/// The inputs of `fuzz/crashes-open/<target>/` still fail under the strict invariants:
/// once one passes, its fix has landed, and it belongs in `fuzz/corpus` (and its line in
/// known.txt goes).
#[test]
fn the_open_findings_still_fail() {
    let open = Path::new(env!("CARGO_MANIFEST_DIR")).join("../crashes-open");
    for (name, body) in TARGETS {
        let Ok(dir) = std::fs::read_dir(open.join(name)) else { continue };
        for file in dir.flatten().map(|e| e.path()) {
            let data = std::fs::read(&file).expect("an open finding's input");
            assert!(
                catch_unwind(AssertUnwindSafe(|| body(&data))).is_err(),
                "{} passes now: move it into fuzz/corpus/{name} and drop its line of known.txt",
                file.display()
            );
        }
    }
}
