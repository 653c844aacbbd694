//! The `aerostrata` command-line tool as a library: the subcommands behind the binary
//! (`main.rs` holds only the top-level arguments, the dispatch and the exit status), and
//! the unit systems, number formats and SVG figures that the worked examples share so
//! that their plots and units match the tool's. No physics lives here: every number comes
//! from the `aerostrata` core, and every quantity's name, symbol, label, units and
//! conversions from its catalogue (`aerostrata::quantity`, `aerostrata::units`).

mod args;
pub mod commands;
mod failure;
pub mod format;
mod input;
mod output;
pub mod plot;
pub mod units;

pub use failure::Failure;
