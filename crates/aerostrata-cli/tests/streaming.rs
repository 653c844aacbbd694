//! Streaming: a generated flight of one million rows goes through `aerostrata flight` in
//! bounded memory.
//!
//! How the memory is measured: the test writes the rows into the child's stdin from a
//! thread as they are generated (no file, nothing held), reads and counts its stdout,
//! and collects the child with `wait4(2)`, whose `rusage.ru_maxrss` is the peak resident
//! set size of exactly that child (kilobytes on Linux). The peak must stay under 64 MiB,
//! and growing the input tenfold (1e5 to 1e6 rows) must not grow it by more than 4 MiB:
//! a program that kept its rows would need tens of MiB more for the larger run. The debug
//! binary needs about 6 s of CPU for the million rows (measured on the project's 2-core
//! machine); the release binary about a tenth of that.

#![cfg(target_os = "linux")]

use std::io::{BufRead, BufReader, BufWriter, Write};
use std::process::{Command, Stdio};

/// Peak RSS (KiB) and stdout line count of `aerostrata ARGS` fed `rows` generated rows.
// The child is reaped by wait4, which std's Child cannot do (it has no rusage).
#[allow(clippy::zombie_processes)]
fn peak_rss_kib(args: &[&str], rows: usize, row: fn(usize) -> String) -> (i64, usize) {
    let mut child = Command::new(env!("CARGO_BIN_EXE_aerostrata"))
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    let stdin = child.stdin.take().unwrap();
    let writer = std::thread::spawn(move || {
        let mut stdin = BufWriter::with_capacity(1 << 16, stdin);
        // A child that stops early closes the pipe; its status and stderr tell why.
        for i in 0..rows {
            if stdin.write_all(row(i).as_bytes()).is_err() {
                break;
            }
        }
    });
    let stderr = child.stderr.take().unwrap();
    let errors = std::thread::spawn(move || std::io::read_to_string(stderr).unwrap());
    let mut stdout = BufReader::with_capacity(1 << 16, child.stdout.take().unwrap());
    let mut lines = 0;
    loop {
        let buffer = stdout.fill_buf().unwrap();
        if buffer.is_empty() {
            break;
        }
        lines += buffer.iter().filter(|b| **b == b'\n').count();
        let length = buffer.len();
        stdout.consume(length);
    }
    writer.join().unwrap();
    let errors = errors.join().unwrap();
    let mut status = 0;
    // SAFETY: an all-zero rusage is a valid value, wait4 fills it for our own child, whose
    // pid it has not yet reaped (std's Child is never waited on here).
    let mut usage: libc::rusage = unsafe { std::mem::zeroed() };
    let pid = child.id() as libc::pid_t;
    let reaped = unsafe { libc::wait4(pid, &mut status, 0, &mut usage) };
    assert_eq!(reaped, pid, "wait4");
    assert!(libc::WIFEXITED(status) && libc::WEXITSTATUS(status) == 0, "{args:?}: {errors}");
    (usage.ru_maxrss, lines)
}

/// Invented samples, one a millisecond: climbing through 0 to 80 km again and again at
/// speeds from 100 to 1100 m/s (through Mach 1 and back).
fn flight_row(i: usize) -> String {
    let t = i as f64 * 1e-3;
    format!("{t},{},{}\n", (i % 80_000) as f64, 100.0 + (i % 1000) as f64)
}

#[test]
fn a_million_row_flight_streams_in_bounded_memory() {
    let args = [
        "flight",
        "-",
        "--cd-table",
        "0:0.45,0.9:0.5,1.1:0.75,2:0.55",
        "--area",
        "0.0182",
        "--summary",
        "none",
    ];
    let (small, small_lines) = peak_rss_kib(&args, 100_000, flight_row);
    let (large, large_lines) = peak_rss_kib(&args, 1_000_000, flight_row);
    assert_eq!((small_lines, large_lines), (100_001, 1_000_001), "a header and a row per sample");
    eprintln!("peak RSS of `aerostrata flight`: {small} KiB for 1e5 rows, {large} KiB for 1e6 rows");
    assert!(large < 64 * 1024, "peak RSS {large} KiB for a million rows");
    assert!(large - small < 4 * 1024, "peak RSS grew from {small} to {large} KiB with the rows");
}

#[test]
fn eval_streams_too() {
    fn row(i: usize) -> String {
        format!("{}\n", (i % 80_000) as f64)
    }
    let (small, _) = peak_rss_kib(&["eval", "--format", "json"], 10_000, row);
    let (large, lines) = peak_rss_kib(&["eval", "--format", "json"], 100_000, row);
    assert_eq!(lines, 100_000 + 2, "brackets and a row per altitude");
    eprintln!("peak RSS of `aerostrata eval`: {small} KiB for 1e4 rows, {large} KiB for 1e5 rows");
    assert!(large < 64 * 1024 && large - small < 4 * 1024, "{small} -> {large} KiB");
}
