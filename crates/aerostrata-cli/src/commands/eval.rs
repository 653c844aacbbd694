//! `aerostrata eval`: the full state at altitudes read one per line, streaming: each row
//! is written as its line arrives, so any number of lines runs in bounded memory.

use std::path::PathBuf;

use aerostrata::model::upper::Species;
use aerostrata::{Altitude, AltitudeRange, Atmosphere, State, US1976};
use clap::Args;

use crate::args::model::{altitude_in, altitude_quantity, ModelArgs};
use crate::args::output::OutputArgs;
use crate::failure::Failure;
use crate::input::lines::{number, open_input, DataLines};
use crate::input::progress::When;
use crate::output::rows::{Format, RowWriter};
use crate::output::state::{state_columns, state_values};
use crate::units::UnitSystem;

#[derive(Args)]
#[command(after_help = "Examples:\n  printf '0\\n11000\\n' | aerostrata eval --offset -10\n  \
                       printf '120000\\n400000\\n' | aerostrata eval --species")]
pub struct EvalArgs {
    /// File of altitudes (m, or ft with --units us), one per line; `-` or nothing reads
    /// stdin. Blank lines and lines starting with `#` are skipped.
    file: Option<PathBuf>,
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

/// Runs `aerostrata eval`.
///
/// # Errors
/// [`Failure::Input`] naming the option or the input line at fault; [`Failure::Io`] when
/// writing fails.
pub fn run(args: &EvalArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let atmosphere = args.model.model(units)?;
    if args.species && !args.model.is_plain_standard() {
        return Err(Failure::Input(
            "--species gives the standard's own number densities and cannot be combined with --offset or --sounding"
                .to_owned(),
        ));
    }
    let mut lines = DataLines::new(open_input(args.file.as_deref(), args.progress)?);
    let destination = args.out.destination()?;
    let mut writer = RowWriter::new(destination, args.format, state_columns(units, args.species))?;
    let range = atmosphere.range();
    let mut write_rows = || -> Result<(), Failure> {
        while let Some((number, text)) = lines.next_line()? {
            let state = evaluate_line(atmosphere.as_ref(), range, text, args.model.geopotential, units)
                .map_err(|m| Failure::Input(format!("line {number}: {m}")))?;
            let species = if args.species { species_at(&state) } else { None };
            writer.row(&state_values(&state, units, args.species.then_some(species.as_ref())))?;
        }
        Ok(())
    };
    let result = write_rows();
    // The progress line goes before an error or the end, so that it never mixes with them.
    lines.input_mut().clear();
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

fn evaluate_line(
    atmosphere: &dyn Atmosphere,
    range: AltitudeRange,
    text: &str,
    geopotential: bool,
    units: UnitSystem,
) -> Result<State, String> {
    let altitude = altitude_quantity(geopotential);
    let value = number(text, altitude, units.unit(altitude))?;
    altitude_in(units, value, geopotential, range)
        .and_then(|a| atmosphere.state(a).map_err(|e| e.to_string()))
}
