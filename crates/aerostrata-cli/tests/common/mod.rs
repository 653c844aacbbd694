//! Helpers shared by the CLI's integration tests: running the `aerostrata` binary,
//! checking its failures, reading its CSV.

// Each test file uses a part of these.
#![allow(dead_code)]

use std::path::{Path, PathBuf};

use assert_cmd::Command;

pub fn aerostrata() -> Command {
    Command::cargo_bin("aerostrata").unwrap()
}

/// stdout and stderr of a successful run.
pub fn run(args: &[&str], stdin: &str) -> (String, String) {
    let output = aerostrata().args(args).write_stdin(stdin).output().unwrap();
    let stderr = String::from_utf8(output.stderr).unwrap();
    assert!(output.status.success(), "{args:?}: {stderr}");
    (String::from_utf8(output.stdout).unwrap(), stderr)
}

/// stdout of a successful run.
pub fn stdout_of(args: &[&str], stdin: &str) -> String {
    run(args, stdin).0
}

/// Exit status `code` and exactly one line on stderr, containing every one of `words`.
pub fn fails_with_all(code: i32, args: &[&str], stdin: &str, words: &[&str]) {
    let output = aerostrata().args(args).write_stdin(stdin).output().unwrap();
    let stderr = String::from_utf8(output.stderr).unwrap();
    assert_eq!(output.status.code(), Some(code), "{args:?}: {stderr}");
    assert_eq!(stderr.lines().count(), 1, "{args:?}: {stderr}");
    for word in words {
        assert!(stderr.contains(word), "{args:?}: {stderr:?} should contain {word:?}");
    }
}

/// Exit status `code` and exactly one line on stderr, containing `words`.
pub fn fails(code: i32, args: &[&str], stdin: &str, words: &str) {
    fails_with_all(code, args, stdin, &[words]);
}

/// Exit status 2 (bad input) and exactly one line on stderr, containing `words`.
pub fn fails_with(args: &[&str], stdin: &str, words: &str) {
    fails(2, args, stdin, words);
}

/// `fails_with` for each case: (arguments, stdin, words of the one line on stderr).
pub fn each_fails_with(cases: &[(&[&str], &str, &str)]) {
    for (args, stdin, words) in cases {
        fails_with(args, stdin, words);
    }
}

/// The cells of column `name` of a CSV text; `None` for an empty cell.
pub fn column(csv: &str, name: &str) -> Vec<Option<f64>> {
    let mut lines = csv.lines();
    let index = lines.next().unwrap().split(',').position(|c| c == name).unwrap_or_else(|| panic!("{name}"));
    lines.map(|line| line.split(',').nth(index).unwrap().parse().ok()).collect()
}

/// The values of column `name` of a CSV text, every cell filled.
pub fn values(csv: &str, name: &str) -> Vec<f64> {
    column(csv, name).into_iter().map(|v| v.unwrap_or_else(|| panic!("an empty cell in {name}"))).collect()
}

/// A scratch directory for this test process.
pub fn scratch(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("aerostrata-cli-tests-{}-{name}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// A file in the temporary directory, named for this process and `name`, removed when
/// dropped (also when a check fails).
pub struct TempFile(PathBuf);

impl TempFile {
    /// The path, nothing written yet.
    pub fn at(name: &str) -> Self {
        TempFile(std::env::temp_dir().join(format!("aerostrata-test-{}-{name}", std::process::id())))
    }

    /// A file holding `bytes`.
    pub fn new(name: &str, bytes: &[u8]) -> Self {
        let file = Self::at(name);
        std::fs::write(&file.0, bytes).unwrap();
        file
    }

    pub fn path(&self) -> &Path {
        &self.0
    }

    /// The path as text, for an argument.
    pub fn arg(&self) -> &str {
        self.0.to_str().unwrap()
    }
}

impl Drop for TempFile {
    fn drop(&mut self) {
        let _ = std::fs::remove_file(&self.0);
    }
}
