//! `aerostrata completions SHELL`: a completion script generated from the same argument
//! definitions as `--help`.

use std::io::Write;
use std::path::PathBuf;

use clap::Args;

use crate::failure::Failure;
use crate::output::destination::Destination;

#[derive(Args)]
#[command(
    after_help = "Example:\n  aerostrata completions bash > ~/.local/share/bash-completion/completions/aerostrata"
)]
pub struct CompletionsArgs {
    /// The shell.
    #[arg(value_enum)]
    shell: clap_complete::Shell,
    /// Write to FILE instead of stdout.
    #[arg(long, short = 'o', value_name = "FILE")]
    output: Option<PathBuf>,
}

/// Writes the completion script of `command`, the whole tool's definition.
///
/// # Errors
/// [`Failure::Input`] for a bad `--output`; [`Failure::Io`] when writing fails.
pub fn run(args: &CompletionsArgs, mut command: clap::Command) -> Result<(), Failure> {
    let mut script = Vec::new();
    clap_complete::generate(args.shell, &mut command, "aerostrata", &mut script);
    let mut destination = Destination::open(args.output.as_deref())?;
    destination.write_all(&script)?;
    destination.commit()
}
