//! A progress line on stderr while a large input streams through: the share of a file
//! read (or, from a pipe, the bytes read so far), redrawn at most five times a second and
//! erased at the end, so that it never mixes with the output or the one-line errors.
//! Shown by default only when stderr is a terminal.

use std::io::{self, BufRead, IsTerminal, Read, Write};
use std::time::{Duration, Instant};

use clap::ValueEnum;

use crate::format::fixed;

/// When to show the progress line.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum When {
    /// When stderr is a terminal.
    Auto,
    /// Always (even into a file or pipe).
    Always,
    /// Never.
    Never,
}

/// Nothing is drawn before the input has taken this long: small inputs stay silent.
const FIRST_DRAW: Duration = Duration::from_millis(300);
const REDRAW: Duration = Duration::from_millis(200);

/// A reader that counts what passes through and redraws the progress line.
pub struct Progress<R> {
    inner: R,
    enabled: bool,
    total: Option<u64>,
    read: u64,
    started: Instant,
    next_draw: Instant,
    drawn: bool,
    since_check: u64,
}

impl<R: BufRead> Progress<R> {
    /// Wraps `inner`, of `total` bytes if known.
    pub fn new(inner: R, total: Option<u64>, when: When) -> Self {
        let enabled = match when {
            When::Auto => io::stderr().is_terminal(),
            When::Always => true,
            When::Never => false,
        };
        let started = Instant::now();
        let first = if when == When::Always { Duration::ZERO } else { FIRST_DRAW };
        Progress {
            inner,
            enabled,
            total,
            read: 0,
            started,
            next_draw: started + first,
            drawn: false,
            since_check: 0,
        }
    }

    fn count(&mut self, bytes: usize) {
        if !self.enabled {
            return;
        }
        self.read += bytes as u64;
        self.since_check += bytes as u64;
        // Look at the clock only every 64 KiB.
        if self.since_check < 1 << 16 && self.drawn {
            return;
        }
        self.since_check = 0;
        let now = Instant::now();
        if now >= self.next_draw {
            self.next_draw = now + REDRAW;
            self.drawn = true;
            let line = describe(self.read, self.total, now - self.started);
            let mut err = io::stderr().lock();
            let _ = write!(err, "\r\x1b[K{line}");
            let _ = err.flush();
        }
    }

    /// Erases the line (call before writing a summary or an error to stderr).
    pub fn clear(&mut self) {
        if self.drawn {
            self.drawn = false;
            let mut err = io::stderr().lock();
            let _ = write!(err, "\r\x1b[K");
            let _ = err.flush();
        }
    }
}

impl<R> Drop for Progress<R> {
    fn drop(&mut self) {
        if self.drawn {
            let _ = write!(io::stderr().lock(), "\r\x1b[K");
        }
    }
}

/// The text of the progress line.
pub fn describe(read: u64, total: Option<u64>, elapsed: Duration) -> String {
    let mib = |bytes: u64| bytes as f64 / (1024.0 * 1024.0);
    let rate = mib(read) / elapsed.as_secs_f64().max(1e-3);
    match total {
        Some(total) if total > 0 => format!(
            "aerostrata: {:>5} % of {} MiB read ({} MiB/s)",
            fixed(100.0 * read.min(total) as f64 / total as f64, 1),
            fixed(mib(total), 1),
            fixed(rate, 1)
        ),
        _ => format!("aerostrata: {} MiB read ({} MiB/s)", fixed(mib(read), 1), fixed(rate, 1)),
    }
}

impl<R: BufRead> Read for Progress<R> {
    fn read(&mut self, buf: &mut [u8]) -> io::Result<usize> {
        let n = self.inner.read(buf)?;
        self.count(n);
        Ok(n)
    }
}

impl<R: BufRead> BufRead for Progress<R> {
    fn fill_buf(&mut self) -> io::Result<&[u8]> {
        self.inner.fill_buf()
    }

    fn consume(&mut self, amount: usize) {
        self.inner.consume(amount);
        self.count(amount);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_line_reads_well() {
        let second = Duration::from_secs(1);
        assert_eq!(
            describe(512 * 1024, Some(1024 * 1024), second),
            "aerostrata:  50.0 % of 1.0 MiB read (0.5 MiB/s)"
        );
        assert_eq!(describe(3 * 1024 * 1024, None, 2 * second), "aerostrata: 3.0 MiB read (1.5 MiB/s)");
    }

    #[test]
    fn reading_through_it_changes_nothing() {
        let text = "a\nb\nc\n".repeat(100_000);
        let mut progress = Progress::new(text.as_bytes(), Some(text.len() as u64), When::Never);
        let lines: Vec<String> = (&mut progress).lines().map(Result::unwrap).collect();
        assert_eq!(lines.len(), 300_000);
    }
}
