//! Every input of the fuzzing corpus (fuzz/corpus: soundings in CSV and JSON, flight
//! files, wind files, tables, model specs, values with units), as it is and in fourteen
//! deterministic mutations (cut in half, a BOM and CRLF ends, a digit made a letter, the
//! first number made 1e308, -1e308 or NaN, the header twice, a NUL byte, a line of
//! 70 000 digits, the lines reversed, semicolons for commas, nothing, the header alone),
//! through the command that reads it. What every run must show (docs/robustness.md):
//! exit status 0 or 2, never a panic (101), a signal or an internal failure (1); on
//! failure, stderr a few short lines, each from the tool, the last naming the file, the
//! option or stdin; on success, no NaN or infinity in the output (stdout, and the flight
//! summary on stderr).
//!
//! The same corpus and mutations go through the WebAssembly module in
//! bindings/wasm/tests/corpus.test.mjs, and the core's parsers under libFuzzer (fuzz/).

use std::fs;
use std::path::{Path, PathBuf};

mod common;

use common::TempFile;

/// The corpus, from this crate's directory.
fn corpus() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../../fuzz/corpus")
}

/// The inputs of one corpus directory, sorted by name.
fn inputs(dir: &str) -> Vec<(String, Vec<u8>)> {
    let mut files: Vec<(String, Vec<u8>)> = fs::read_dir(corpus().join(dir))
        .unwrap_or_else(|e| panic!("fuzz/corpus/{dir}: {e}"))
        .flatten()
        .map(|entry| (entry.file_name().to_string_lossy().into_owned(), fs::read(entry.path()).unwrap()))
        .collect();
    files.sort();
    assert!(!files.is_empty(), "fuzz/corpus/{dir} is empty");
    files
}

/// Where the first number after the first line lies (or in the first line if only one).
fn first_number(text: &[u8]) -> Option<(usize, usize)> {
    let from = text.iter().position(|b| *b == b'\n').map_or(0, |i| i + 1);
    let start = from + text[from..].iter().position(u8::is_ascii_digit)?;
    let end = start
        + text[start..]
            .iter()
            .position(|b| !(b.is_ascii_digit() || *b == b'.'))
            .unwrap_or(text.len() - start);
    Some((start, end))
}

fn replace_first_number(text: &[u8], with: &str) -> Vec<u8> {
    match first_number(text) {
        Some((start, end)) => [&text[..start], with.as_bytes(), &text[end..]].concat(),
        None => text.to_vec(),
    }
}

/// The input as it is and its mutations, named.
fn mutations(text: &[u8]) -> Vec<(&'static str, Vec<u8>)> {
    let lines: Vec<&[u8]> = text.split(|b| *b == b'\n').collect();
    let header = lines.first().copied().unwrap_or_default();
    let mut reversed = lines.clone();
    reversed.reverse();
    let middle = text.len() / 2;
    vec![
        ("as it is", text.to_vec()),
        ("cut in half", text[..middle].to_vec()),
        ("BOM and CRLF", [&b"\xef\xbb\xbf"[..], &lines.join(&b"\r\n"[..])].concat()),
        ("a digit made a letter", {
            let mut t = text.to_vec();
            if let Some(d) = t.iter().rposition(u8::is_ascii_digit) {
                t[d] = b'x';
            }
            t
        }),
        ("1e308", replace_first_number(text, "1e308")),
        ("-1e308", replace_first_number(text, "-1e308")),
        ("NaN", replace_first_number(text, "NaN")),
        ("the header twice", [header, b"\n", text].concat()),
        ("a NUL byte", [&text[..middle], b"\0", &text[middle..]].concat()),
        ("a long line", [text, b"\n", &vec![b'9'; 70_000][..], b"\n"].concat()),
        ("lines reversed", reversed.join(&b'\n')),
        ("semicolons", text.iter().map(|&b| if b == b',' { b';' } else { b }).collect()),
        ("nothing", Vec::new()),
        ("the header alone", [header, b"\n"].concat()),
    ]
}

/// Words that stand for a value that is no number.
fn not_finite(token: &str) -> bool {
    matches!(token.to_ascii_lowercase().as_str(), "nan" | "inf" | "-inf" | "+inf" | "infinity" | "-infinity")
}

/// Runs the tool and checks what every run must show; `names` are the words one of which
/// a failure's last line must contain (the file's path, the option).
fn check(args: &[&str], stdin: &[u8], names: &[&str], case: &str) {
    // From the repository's root, where the specs' file names are.
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("../..");
    let output = common::aerostrata().current_dir(root).args(args).write_stdin(stdin).output().unwrap();
    let stderr = String::from_utf8_lossy(&output.stderr);
    let code = output.status.code();
    assert!(matches!(code, Some(0 | 2)), "{case}: {args:?}: status {:?}: {stderr}", output.status);
    assert!(stderr.len() < 20_000, "{case}: {args:?}: {} bytes on stderr", stderr.len());
    if code == Some(2) {
        assert!(stderr.len() < 2_000 && stderr.lines().count() <= 3, "{case}: {args:?}: {stderr}");
        assert!(stderr.lines().all(|l| l.starts_with("aerostrata: ")), "{case}: {args:?}: {stderr}");
        let last = stderr.lines().last().unwrap_or_default();
        assert!(
            names.iter().chain(&["stdin", "cannot read"]).any(|name| last.contains(name)),
            "{case}: {args:?}: {last} names none of {names:?}"
        );
    } else {
        let stdout = String::from_utf8_lossy(&output.stdout);
        let bad = [&stdout, &stderr]
            .into_iter()
            .flat_map(|text| text.split(|c: char| ",;\n\t {}[]:\"()".contains(c)))
            .find(|t| not_finite(t));
        assert!(bad.is_none(), "{case}: {args:?}: {bad:?} in the output");
    }
}

/// Each input of `dir` and its mutations, written to a file named with `extension`, run
/// through each of `commands` (`FILE` stands for the file's path).
fn replay_files(dir: &str, extension: &str, commands: &[&[&str]], stdin: &[u8]) -> usize {
    let mut runs = 0;
    for (name, text) in inputs(dir) {
        for (mutation, bytes) in mutations(&text) {
            let file = TempFile::new(&format!("{dir}{extension}"), &bytes);
            for command in commands {
                let args: Vec<&str> =
                    command.iter().map(|a| if *a == "FILE" { file.arg() } else { a }).collect();
                let option = args.iter().copied().filter(|a| a.starts_with("--")).collect::<Vec<_>>();
                let mut names = vec![file.arg()];
                names.extend(option);
                check(&args, stdin, &names, &format!("{dir}/{name} ({mutation})"));
                runs += 1;
            }
        }
    }
    runs
}

/// Each input of `dir` and its mutations as the value of `option` (inputs with a NUL
/// byte or a line end cannot be one argument, and are left to the fuzz targets).
fn replay_values(dir: &str, commands: &[(&[&str], &str)]) -> usize {
    let mut runs = 0;
    for (name, text) in inputs(dir) {
        for (mutation, bytes) in mutations(&text) {
            let Ok(value) = String::from_utf8(bytes) else { continue };
            let value = value.trim_end_matches(['\n', '\r']);
            if value.contains(['\0', '\n']) {
                continue;
            }
            for (command, option) in commands {
                let mut args: Vec<&str> = command.to_vec();
                args.extend([*option, value]);
                check(&args, b"0\n1000\n", &[option], &format!("{dir}/{name} ({mutation})"));
                runs += 1;
            }
        }
    }
    runs
}

#[test]
fn soundings_in_csv_and_json() {
    let altitudes = b"0\n500\n3000\n20000\n";
    let runs = replay_files("sounding_csv", ".csv", &[&["eval", "--sounding", "FILE", "-"]], altitudes)
        + replay_files("sounding_json", ".json", &[&["eval", "--sounding", "FILE", "-"]], altitudes);
    assert!(runs >= 150, "{runs}");
}

#[test]
fn flight_files_and_wind_files() {
    // An invented climb with a ground velocity, for the wind files to blow over.
    let flight = TempFile::new(
        "climb.csv",
        b"time_s,altitude_m,velocity_east_m_s,velocity_north_m_s,velocity_up_m_s\n0,0,0,0,10\n1,15,2,1,20\n2,40,4,2,30\n",
    );
    let runs = replay_files(
        "flight_table",
        ".csv",
        &[&["flight", "FILE"], &["flight", "FILE", "--units", "us"]],
        b"",
    ) + replay_files("winds_csv", ".csv", &[&["flight", flight.arg(), "--winds", "FILE"]], b"");
    assert!(runs >= 150, "{runs}");
}

#[test]
fn tables_of_altitudes_and_pressures() {
    let runs = replay_files("table", ".csv", &[&["eval", "FILE"], &["altitude", "FILE"]], b"");
    assert!(runs >= 150, "{runs}");
}

#[test]
fn model_specs_and_values_with_units() {
    let runs = replay_values("model_spec", &[(&["eval", "-"], "--model")])
        + replay_values(
            "units",
            &[
                (&["altitude"], "--pressure"),
                (&["airspeed", "--altitude", "0m"], "--cas"),
                (&["airspeed", "--cas", "100kt", "--pressure-altitude", "0m"], "--temperature"),
                (&["table", "--to", "2000m"], "--from"),
            ],
        );
    assert!(runs >= 150, "{runs}");
}
