//! The one error of every subcommand: bad input or usage, which the user can fix (exit
//! status 2), or a failure to read or write (exit status 1). `main` turns it into the one
//! line on stderr.

use std::io;

/// Why a subcommand stopped.
#[derive(Debug)]
pub enum Failure {
    /// Bad input or usage: exit status 2, the message names the option or line at fault.
    Input(String),
    /// I/O failure: exit status 1.
    Io(io::Error),
}

impl From<io::Error> for Failure {
    fn from(error: io::Error) -> Self {
        Failure::Io(error)
    }
}

impl Failure {
    /// The same failure, a bad input's message after `prefix: ` (the file or option it
    /// came from).
    pub fn within(self, prefix: &str) -> Self {
        match self {
            Failure::Input(message) => Failure::Input(format!("{prefix}: {message}")),
            other => other,
        }
    }
}
