//! `--units` and `--output`: the unit system of the output (and of a file's bare
//! values), and where the rows go.

use std::path::PathBuf;

use clap::Args;

use crate::failure::Failure;
use crate::output::destination::Destination;
use crate::units::UnitSystem;

/// Units and destination, common to the commands that write data.
#[derive(Args)]
pub struct OutputArgs {
    /// Units of the output, and of a file's values where neither a heading nor the value
    /// names one: each quantity's SI or US customary unit, as `aerostrata quantities`
    /// lists them. An option's value is in the unit written after it, or SI; with
    /// --units us a bare number in an option is refused as ambiguous.
    #[arg(long, value_enum, default_value_t = UnitSystem::Si)]
    pub units: UnitSystem,
    /// Write to FILE instead of stdout; a regular file appears only if the command
    /// succeeds (symbolic links are followed; a device or FIFO is written into directly).
    #[arg(long, short = 'o', value_name = "FILE")]
    pub output: Option<PathBuf>,
}

impl OutputArgs {
    /// Stdout, or the `--output` file.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the path when it cannot be written.
    pub fn destination(&self) -> Result<Destination, Failure> {
        Destination::open(self.output.as_deref())
    }
}
