//! `aerostrata eval`: the full state at altitudes read one per line (or from a column of
//! a table), streaming: each row is written as its line arrives, so any number of lines
//! runs in bounded memory.

use std::path::PathBuf;

use aerostrata::model::upper::Species;
use aerostrata::{Altitude, Atmosphere, Quantity, State, US1976};
use clap::Args;

use crate::args::model::{altitude_in, ModelArgs};
use crate::args::output::OutputArgs;
use crate::failure::Failure;
use crate::input::lines::{open_input, source_name};
use crate::input::progress::When;
use crate::input::table::{needs, Columns, TableReader};
use crate::output::rows::{Format, RowWriter};
use crate::output::state::{state_columns, StateUnits};

#[derive(Args)]
#[command(after_help = "Examples:\n  printf '0\\n11000\\n' | aerostrata eval --offset -10K\n  \
                       printf 'geopotential_altitude (ft)\\n0\\n36089\\n' | aerostrata eval\n  \
                       printf '120000\\n400000\\n' | aerostrata eval --species")]
pub struct EvalArgs {
    /// File of altitudes, one per line (in m, or ft with --units us; a value may carry
    /// its unit, 35000ft); `-` or nothing reads stdin. A first line may name the column
    /// (`geometric_altitude (ft)`, `geopotential_altitude_m`, `altitude [km]`): its unit
    /// wins over --units, and of a table only that column is read. Blank lines and lines
    /// starting with `#` are skipped.
    file: Option<PathBuf>,
    /// Read the altitudes as geopotential instead of geometric (a heading may say so too).
    #[arg(long)]
    geopotential: bool,
    /// Add the standard's number densities of N2, O, O2, Ar, He and H (defined above
    /// 86 km, empty cells below).
    #[arg(long)]
    species: bool,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Csv)]
    format: Format,
    /// A progress line on stderr while a large input is read.
    #[arg(long, value_enum, default_value_t = When::Auto)]
    progress: When,
    #[command(flatten)]
    model: ModelArgs,
    #[command(flatten)]
    out: OutputArgs,
}

const ALTITUDES: [Quantity; 3] =
    [Quantity::GeometricAltitude, Quantity::GeopotentialAltitude, Quantity::Altitude];

/// Runs `aerostrata eval`.
///
/// # Errors
/// [`Failure::Input`] naming the option, or the file, line and column at fault;
/// [`Failure::Io`] when writing fails.
pub fn run(args: &EvalArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let model = args.model.load(units)?;
    if args.species && !model.standard {
        return Err(Failure::Input(format!(
            "--species gives the standard's own number densities and cannot be combined with {}",
            args.model.option()
        )));
    }
    let geopotential = args.geopotential;
    let columns = Columns {
        accepts: &ALTITUDES,
        implicit: if geopotential { &ALTITUDES[1..2] } else { &ALTITUDES[..1] },
        check: Box::new(move |header| {
            needs(header, &[&ALTITUDES])?;
            if geopotential && header.position(Quantity::GeopotentialAltitude).is_none() {
                return Err(
                    "the heading names a geometric altitude, but --geopotential was given (name the \
                            column geopotential_altitude, or leave --geopotential out)"
                        .to_owned(),
                );
            }
            Ok(())
        }),
    };
    let input = open_input(args.file.as_deref(), args.progress)?;
    let mut reader = TableReader::new(input, source_name(args.file.as_deref()), columns, Some(units));
    let destination = args.out.destination()?;
    let mut writer = RowWriter::new(destination, args.format, state_columns(units, args.species))?;
    let range = model.atmosphere.range();
    let mut values = Vec::new();
    let state_units = StateUnits::new(units);
    let mut write_rows = || -> Result<(), Failure> {
        while let Some(row) = reader.next_row()? {
            let (quantity, value) = ALTITUDES
                .iter()
                .find_map(|q| row.get(*q).map(|v| (*q, v)))
                .ok_or_else(|| reader.at_line("an empty cell; give an altitude"))?;
            let is_geopotential = quantity == Quantity::GeopotentialAltitude;
            let unit = reader.unit_of(quantity);
            let state = altitude_in(unit, value, is_geopotential, range)
                .and_then(|a| model.atmosphere.state(a).map_err(|e| e.to_string()))
                .map_err(|m| reader.at_cell(quantity, m))?;
            let species = if args.species { species_at(&state) } else { None };
            state_units.values_into(&mut values, &state, args.species.then_some(species.as_ref()));
            writer.row(&values)?;
        }
        Ok(())
    };
    let result = write_rows();
    // The progress line goes before an error or the end, so that it never mixes with them.
    reader.input_mut().clear();
    result?;
    writer.finish()?.commit()
}

/// The standard's species where it defines them (above 86 km).
fn species_at(state: &State) -> Option<Species> {
    if state.geometric_altitude_m <= aerostrata::model::upper::BASE_M {
        return None;
    }
    Altitude::geometric_m(state.geometric_altitude_m).and_then(|a| US1976.species(a)).ok()
}
