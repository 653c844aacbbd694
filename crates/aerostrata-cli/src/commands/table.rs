//! `aerostrata table`: the full state at evenly spaced altitudes, every row computed
//! before the first is written so that an error leaves no output.

use aerostrata::units::{Reading, Tidy};
use aerostrata::Atmosphere;
use clap::Args;

use crate::args::model::{altitude_in, altitude_quantity, band, ModelArgs};
use crate::args::output::OutputArgs;
use crate::args::value::{FROM, STEP_Z, TO};
use crate::failure::Failure;
use crate::output::rows::{Format, RowWriter};
use crate::output::state::{state_columns, state_values};
use crate::units::UnitSystem;

#[derive(Args)]
#[command(
    after_help = "Examples:\n  aerostrata table --from 0 --to 20km --step 500m --offset +15K --format csv\n  \
                 aerostrata table --units us --from 0 --to 40000ft --step 5000ft --format markdown\n  \
                 aerostrata table --model isothermal=250K --to 30km --step 5km"
)]
pub struct TableArgs {
    #[arg(long, value_name = "Z", allow_hyphen_values = true,
          help = FROM.help("Lowest altitude [default: 0, or the model's bottom if higher]"))]
    from: Option<String>,
    #[arg(long, value_name = "Z", allow_hyphen_values = true,
          help = TO.help("Highest altitude [default: 86 km, or the model's top if lower]"))]
    to: Option<String>,
    #[arg(long, value_name = "DZ", allow_hyphen_values = true,
          help = STEP_Z.help("Altitude step [default: 1000 m, or 5000 ft with --units us]"))]
    step: Option<String>,
    /// Altitudes (--from, --to, --step and the rows) as geopotential instead of geometric.
    #[arg(long)]
    geopotential: bool,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    format: Format,
    #[command(flatten)]
    model: ModelArgs,
    #[command(flatten)]
    out: OutputArgs,
}

/// The most rows `table` will produce; a guard against a mistyped step.
const MAX_TABLE_ROWS: f64 = 1.0e6;

/// Runs `aerostrata table`.
///
/// # Errors
/// [`Failure::Input`] naming the option at fault; [`Failure::Io`] when writing fails.
pub fn run(args: &TableArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let atmosphere = args.model.load(units)?.atmosphere;
    let range = atmosphere.range();
    let geopotential = args.geopotential;
    let (bottom, top) = band(range, geopotential);
    let altitude = altitude_quantity(geopotential);
    // The rows step in the output's unit of length, so that round steps stay round.
    let length = units.unit(altitude);
    let in_output =
        |reading: Reading| if reading.unit == length { reading.value } else { length.from_si(reading.si()) };
    let read = |option: &crate::args::value::Dimensional, text: &Option<String>| {
        text.as_deref().map(|t| option.of(altitude).read(t, units).map(in_output)).transpose()
    };
    let from = read(&FROM, &args.from)?.unwrap_or_else(|| length.from_si(bottom.max(0.0)));
    let to = read(&TO, &args.to)?.unwrap_or_else(|| length.from_si(top.min(86_000.0)));
    // Round steps in either system: 1 km, or 5000 ft.
    let step = read(&STEP_Z, &args.step)?.unwrap_or(match units {
        UnitSystem::Si => 1_000.0,
        UnitSystem::Us => 5_000.0,
    });
    let unit = length.symbol();
    if to < from {
        return Err(Failure::Input(format!(
            "--to {} {unit} must not be below --from {} {unit}",
            Tidy(to),
            Tidy(from)
        )));
    }
    for (option, value) in [("--from", from), ("--to", to)] {
        altitude_in(length, length.to_si(value), geopotential, range)
            .map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    }
    let intervals = ((to - from) / step * (1.0 + 1e-12)).floor();
    if intervals + 1.0 > MAX_TABLE_ROWS {
        return Err(Failure::Input(format!(
            "--step {} {unit} gives {} rows, more than the {MAX_TABLE_ROWS} allowed",
            Tidy(step),
            intervals + 1.0
        )));
    }
    // Every row is computed before anything is written, so an error leaves no output.
    let mut states = Vec::with_capacity(intervals as usize + 1);
    for i in 0..=(intervals as u64) {
        let value = (from + i as f64 * step).min(to);
        let state = altitude_in(length, length.to_si(value), geopotential, range)
            .and_then(|a| atmosphere.state(a).map_err(|e| e.to_string()))
            .map_err(Failure::Input)?;
        states.push(state);
    }
    let mut writer = RowWriter::new(args.out.destination()?, args.format, state_columns(units, false))?;
    for state in &states {
        writer.row(&state_values(state, units, None))?;
    }
    writer.finish()?.commit()
}
