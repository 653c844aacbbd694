//! `aerostrata man [SUBCOMMAND...]`: the manual page (roff) of the tool or of one
//! subcommand, generated from the same argument definitions as `--help`.

use std::path::PathBuf;

use clap::Args;

use crate::failure::Failure;
use crate::output::destination::Destination;

#[derive(Args)]
#[command(after_help = "Example:\n  aerostrata man | man -l -")]
pub struct ManArgs {
    /// A subcommand (e.g. `plot profile`) whose page to print instead of the tool's.
    subcommand: Vec<String>,
    /// Write to FILE instead of stdout.
    #[arg(long, short = 'o', value_name = "FILE")]
    output: Option<PathBuf>,
}

/// Writes the page of `command` (the whole tool's definition) or of the subcommand the
/// arguments name.
///
/// # Errors
/// [`Failure::Input`] for an unknown subcommand or a bad `--output`; [`Failure::Io`] when
/// writing fails.
pub fn run(args: &ManArgs, mut command: clap::Command) -> Result<(), Failure> {
    command.build();
    let mut page = command;
    let mut name = "aerostrata".to_owned();
    for word in &args.subcommand {
        let found = page.find_subcommand(word).cloned().ok_or_else(|| {
            let known: Vec<&str> = page.get_subcommands().map(|s| s.get_name()).collect();
            Failure::Input(format!(
                "man: no subcommand '{word}' under '{name}' (known: {})",
                known.join(", ")
            ))
        })?;
        name = format!("{name}-{word}");
        page = found;
    }
    let page = page.display_name(name).version(env!("CARGO_PKG_VERSION"));
    let mut destination = Destination::open(args.output.as_deref())?;
    clap_mangen::Man::new(page).render(&mut destination)?;
    destination.commit()
}
