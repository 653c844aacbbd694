//! Inputs that are no table at all: 200 MB in one line (commas into `flight`, NUL bytes
//! into `eval`, digits into `eval`, a sounding whose header is wrong before 200 MB of
//! rows). Each is refused after at most one bounded line (64 KiB) with one short line
//! on stderr, in a few MiB, however large the file.
//!
//! How it is measured: the input is generated into a temporary file by streaming writes
//! (nothing held), the tool reads it (as its FILE, or on stdin), and the child is
//! collected with `wait4(2)`, whose `rusage.ru_maxrss` is that child's peak resident set
//! (KiB on Linux). The bound, 64 MiB, is the streaming test's; before lines were bounded,
//! 200 MB of commas into `flight` took 3.5 GB and wrote 200 MB to stderr. Run with
//! `cargo test --release -p aerostrata-cli --test long_input` for the release binary;
//! the debug one refuses these inputs as quickly (both read 64 KiB, not 200 MB).

#![cfg(target_os = "linux")]

mod common;

use std::fs::File;
use std::io::{BufWriter, Read, Write};
use std::process::{Command, Stdio};

use common::TempFile;

const SIZE: usize = 200_000_000;
const BOUND_KIB: i64 = 64 * 1024;

/// `head` then `SIZE` bytes of `fill`, then `tail`, written in 1 MiB blocks.
fn write_file(name: &str, head: &[u8], fill: u8, tail: &[u8]) -> TempFile {
    let file = TempFile::at(&format!("long-{name}"));
    let mut out = BufWriter::new(File::create(file.path()).unwrap());
    out.write_all(head).unwrap();
    let block = vec![fill; 1 << 20];
    let mut left = SIZE;
    while left > 0 {
        let n = left.min(block.len());
        out.write_all(&block[..n]).unwrap();
        left -= n;
    }
    out.write_all(tail).unwrap();
    out.flush().unwrap();
    file
}

/// Exit status, stderr and peak RSS (KiB) of `aerostrata ARGS`, stdin from `stdin`.
// The child is reaped by wait4, which std's Child cannot do (it has no rusage).
#[allow(clippy::zombie_processes)]
fn run(args: &[&str], stdin: Option<&TempFile>) -> (i32, String, i64) {
    let input = match stdin {
        Some(file) => Stdio::from(File::open(file.path()).unwrap()),
        None => Stdio::null(),
    };
    let mut child = Command::new(env!("CARGO_BIN_EXE_aerostrata"))
        .args(args)
        .stdin(input)
        .stdout(Stdio::null())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    let mut stderr = String::new();
    child.stderr.take().unwrap().read_to_string(&mut stderr).unwrap();
    let mut status = 0;
    // SAFETY: an all-zero rusage is a valid value; wait4 fills it for our own child, not
    // yet reaped (std's Child is never waited on here).
    let mut usage: libc::rusage = unsafe { std::mem::zeroed() };
    let pid = child.id() as libc::pid_t;
    let reaped = unsafe { libc::wait4(pid, &mut status, 0, &mut usage) };
    assert_eq!(reaped, pid, "wait4");
    assert!(libc::WIFEXITED(status), "{args:?}: {stderr}");
    (libc::WEXITSTATUS(status), stderr, usage.ru_maxrss)
}

/// One line on stderr, short, naming `what`, status 2, in bounded memory.
fn refused(args: &[&str], stdin: Option<&TempFile>, what: &str) {
    let (status, stderr, peak) = run(args, stdin);
    eprintln!("{args:?}: peak RSS {peak} KiB: {stderr}");
    assert_eq!(status, 2, "{stderr}");
    assert_eq!(stderr.lines().count(), 1, "{stderr}");
    assert!(stderr.len() < 600, "{} bytes on stderr", stderr.len());
    assert!(stderr.contains(what), "{stderr}");
    assert!(peak < BOUND_KIB, "peak RSS {peak} KiB");
}

#[test]
fn two_hundred_megabytes_of_commas_into_flight() {
    let file = write_file("commas.csv", b"", b',', b"\n");
    let path = file.arg();
    refused(&["flight", path], None, "line 1: longer than 65536 bytes");
}

#[test]
fn two_hundred_megabytes_of_nul_bytes_into_eval() {
    let file = write_file("nul.txt", b"", 0, b"");
    refused(&["eval"], Some(&file), "stdin: line 1: longer than 65536 bytes");
    // The echoed start is escaped, not raw control bytes.
    let (_, stderr, _) = run(&["eval"], Some(&file));
    assert!(stderr.contains("'\\u{0}\\u{0}") && !stderr.contains('\0'), "{stderr}");
}

#[test]
fn a_two_hundred_megabyte_number_into_eval() {
    let file = write_file("digits.csv", b"geometric_altitude_m\n0\n", b'1', b"\n");
    let path = file.arg();
    refused(&["eval", path], None, "line 3: longer than 65536 bytes");
}

#[test]
fn a_sounding_with_a_wrong_header_is_refused_before_its_rows_are_read() {
    let file = write_file("sounding.csv", b"geometric_altitude_m,temperature_K,pressure_P\n", b'\n', b"");
    let spec = format!("--sounding={}", file.arg());
    refused(&["table", "--from", "0", "--to", "1", "--step", "1", &spec], None, "unit 'P'");
}
