//! `aerostrata table`: the full state at evenly spaced altitudes, every row computed
//! before the first is written so that an error leaves no output.

use clap::Args;

use crate::args::model::{altitude_in, altitude_quantity, band, ModelArgs};
use crate::args::output::OutputArgs;
use crate::failure::Failure;
use crate::output::rows::{Format, RowWriter};
use crate::output::state::{state_columns, state_values};
use crate::units::{in_words, UnitSystem};

#[derive(Args)]
#[command(
    after_help = "Examples:\n  aerostrata table --from 0 --to 20000 --step 500 --offset 15 --format csv\n  \
                 aerostrata table --units us --from 0 --to 40000 --step 5000 --format markdown"
)]
pub struct TableArgs {
    /// Lowest altitude, m or ft [default: 0, or the model's bottom if higher].
    #[arg(long, value_name = "Z", allow_negative_numbers = true)]
    from: Option<f64>,
    /// Highest altitude, m or ft [default: 86 km, or the model's top if lower].
    #[arg(long, value_name = "Z", allow_negative_numbers = true)]
    to: Option<f64>,
    /// Altitude step, m or ft [default: 1000 m, or 5000 ft with --units us].
    #[arg(long, value_name = "DZ")]
    step: Option<f64>,
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
    let atmosphere = args.model.model(units)?;
    let range = atmosphere.range();
    let (bottom, top) = band(range, args.model.geopotential);
    let altitude = altitude_quantity(args.model.geopotential);
    let length = units.unit(altitude);
    let from = args.from.unwrap_or_else(|| length.from_si(bottom.max(0.0)));
    let to = args.to.unwrap_or_else(|| length.from_si(top.min(86_000.0)));
    // Round steps in either system: 1 km, or 5000 ft.
    let step = args.step.unwrap_or(match units {
        UnitSystem::Si => 1_000.0,
        UnitSystem::Us => 5_000.0,
    });
    let unit = length.symbol();
    for (option, value) in [("--from", from), ("--to", to), ("--step", step)] {
        if !value.is_finite() {
            let what = in_words(altitude, length);
            return Err(Failure::Input(format!("{option} must be a finite number ({what}), got {value}")));
        }
    }
    if step <= 0.0 {
        return Err(Failure::Input(format!("--step must be greater than 0 {unit}, got {step} {unit}")));
    }
    if to < from {
        return Err(Failure::Input(format!("--to {to} {unit} must not be below --from {from} {unit}")));
    }
    for (option, value) in [("--from", from), ("--to", to)] {
        altitude_in(units, value, args.model.geopotential, range)
            .map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    }
    let intervals = ((to - from) / step * (1.0 + 1e-12)).floor();
    if intervals + 1.0 > MAX_TABLE_ROWS {
        return Err(Failure::Input(format!(
            "--step {step} {unit} gives {} rows, more than the {MAX_TABLE_ROWS} allowed",
            intervals + 1.0
        )));
    }
    // Every row is computed before anything is written, so an error leaves no output.
    let mut states = Vec::with_capacity(intervals as usize + 1);
    for i in 0..=(intervals as u64) {
        let value = (from + i as f64 * step).min(to);
        let state = altitude_in(units, value, args.model.geopotential, range)
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
