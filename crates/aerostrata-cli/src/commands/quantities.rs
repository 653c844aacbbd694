//! `aerostrata quantities`: the core's catalogue, every quantity a door of aerostrata
//! shows or reads, with its names, both units and its CSV column in each. It is the list
//! the other doors (the C library, the WebAssembly module) are compared with.

use std::path::PathBuf;

use aerostrata::quantity::Rounding;
use aerostrata::Quantity;
use clap::Args;

use crate::failure::Failure;
use crate::output::destination::Destination;
use crate::output::rows::{Cell, Column, Format, RowWriter};
use crate::units::column;

#[derive(Args)]
#[command(
    after_help = "Examples:\n  aerostrata quantities\n  aerostrata quantities --format json -o quantities.json"
)]
pub struct QuantitiesArgs {
    /// Output format (the tables leave out the descriptions; CSV and JSON carry them).
    #[arg(long, value_enum, default_value_t = Format::Table)]
    format: Format,
    /// Write to FILE instead of stdout; a regular file appears only if the command
    /// succeeds.
    #[arg(long, short = 'o', value_name = "FILE")]
    output: Option<PathBuf>,
}

/// The listing's columns: an id, then text, then whether the quantity can be undefined.
fn columns() -> Vec<Column> {
    let id = Column { rounding: Rounding::Decimals(0), text: false, ..Column::text("id") };
    let description = Column { shown: false, ..Column::text("description") };
    let mut columns =
        vec![id, Column::text("name"), Column::text("symbol"), Column::text("label"), description];
    for key in ["si_unit", "us_unit", "si_column", "us_column", "group", "may_be_undefined"] {
        columns.push(Column::text(key));
    }
    columns
}

/// Runs `aerostrata quantities`.
///
/// # Errors
/// [`Failure::Input`] naming `--output` when it cannot be written; [`Failure::Io`] when
/// writing fails.
pub fn run(args: &QuantitiesArgs) -> Result<(), Failure> {
    let mut writer = RowWriter::new(Destination::open(args.output.as_deref())?, args.format, columns())?;
    for quantity in Quantity::ALL.iter().copied() {
        let info = quantity.info();
        let (si_column, us_column) = (column(quantity, info.si), column(quantity, info.us));
        // The core's groups have no names of their own: their Rust names, in lower case.
        let group = format!("{:?}", info.group).to_lowercase();
        writer.cells(&[
            Cell::Number(Some(f64::from(info.id))),
            Cell::Text(info.name),
            Cell::Text(info.symbol),
            Cell::Text(info.label),
            Cell::Text(info.description),
            Cell::Text(info.si.symbol()),
            Cell::Text(info.us.symbol()),
            Cell::Text(&si_column),
            Cell::Text(&us_column),
            Cell::Text(&group),
            Cell::Flag(info.may_be_undefined),
        ])?;
    }
    writer.finish()?.commit()
}
