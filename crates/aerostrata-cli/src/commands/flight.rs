//! `aerostrata flight FILE`: the flight scan of a CSV of samples (time, geometric
//! altitude, velocity) through the standard atmosphere or any `--model`, one sample at a
//! time (any number of samples in bounded memory); per-sample rows on stdout or
//! `--output`, the summary (maximum q refined between samples, maximum Mach, Mach 1
//! crossings, maximum drag) on stderr, as text or JSON, ending with the caution that
//! stands wherever loads are shown.

use std::io::{self, BufRead, Write};
use std::path::PathBuf;

use aerostrata::flight::{FlightPoint, FlightScan, FlightSummary};
use aerostrata::{AltitudeRange, Atmosphere, Quantity};
use clap::{Args, ValueEnum};
use serde_json::{json, Map, Value};

use crate::args::model::{altitude_in, ModelArgs};
use crate::args::output::OutputArgs;
use crate::args::vehicle::VehicleArgs;
use crate::failure::Failure;
use crate::format::fixed;
use crate::input::lines::{open_input, source_name};
use crate::input::progress::{Progress, When};
use crate::input::samples::SampleReader;
use crate::output::rows::{Column, Format, RowWriter};
use crate::units::{column, UnitSystem};

/// The caution's text, as a literal for `concat!`.
macro_rules! caution {
    () => {
        "Not certified flight software; verify independently; local codes, range-safety rules and licensed \
         engineering practice govern."
    };
}

/// The caution that ends `flight --help`, its manual page and every flight summary.
pub const CAUTION: &str = caution!();

#[derive(Args)]
#[command(after_help = concat!(
    "Example:\n  aerostrata flight ascent.csv --cd-table 0:0.45,0.9:0.5,1.1:0.75,2:0.55 \
     --area 0.0182m2 --summary json\n\n",
    caution!()
))]
pub struct FlightArgs {
    /// CSV of samples, one per line: time, geometric altitude and velocity relative to
    /// the air (its sign ignored), in s, m and m/s (ft and ft/s with --units us). A first
    /// line naming the columns in any spelling (time_s, `altitude (ft)`, `Velocity [m/s]`;
    /// geometric_altitude too) picks them and their units, which win over --units; other
    /// columns are left out with a warning; a cell may carry its unit (35000ft). Blank
    /// lines and lines starting with `#` are skipped; `-` reads stdin.
    pub file: PathBuf,
    #[command(flatten)]
    pub vehicle: VehicleArgs,
    #[command(flatten)]
    pub model: ModelArgs,
    /// How the summary is written to stderr.
    #[arg(long, value_enum, default_value_t = SummaryFormat::Text)]
    summary: SummaryFormat,
    /// Output format of the per-sample rows.
    #[arg(long, value_enum, default_value_t = Format::Csv)]
    format: Format,
    /// A progress line on stderr while a large input is read.
    #[arg(long, value_enum, default_value_t = When::Auto)]
    progress: When,
    #[command(flatten)]
    out: OutputArgs,
}

#[derive(Clone, Copy, ValueEnum)]
pub enum SummaryFormat {
    /// A few lines for a person.
    Text,
    /// One JSON object.
    Json,
    /// No summary.
    None,
}

/// The quantities of a flight of speeds without direction: the flight point's first
/// thirteen (the velocity's components, the wind, alpha and the temperatures follow).
const SPEED_ONLY: usize = 13;

/// The per-sample columns.
fn columns(units: UnitSystem) -> Vec<Column> {
    FlightPoint::QUANTITIES[..SPEED_ONLY].iter().map(|q| Column::of(units, *q)).collect()
}

/// A sample's values in `units`; an empty cell where the point has none (the drag of a
/// scan without a vehicle, the Mach number above 86 km).
fn values(p: &FlightPoint, units: UnitSystem) -> Vec<Option<f64>> {
    FlightPoint::QUANTITIES[..SPEED_ONLY]
        .iter()
        .map(|q| p.get(*q).ok().map(|v| units.from_si(*q, v)))
        .collect()
}

/// Runs `aerostrata flight`.
///
/// # Errors
/// [`Failure::Input`] naming the option or the input line at fault; [`Failure::Io`] when
/// writing fails.
pub fn run(args: &FlightArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let model = args.model.load(units)?;
    let range = model.atmosphere.range();
    let table = args.vehicle.table()?;
    let vehicle = args.vehicle.vehicle(&table, units)?;
    let input = open_input(Some(&args.file), args.progress)?;
    let mut reader = SampleReader::new(input, source_name(Some(&args.file)), units);
    let mut scan = FlightScan::new(&model.atmosphere, vehicle);
    let mut writer = RowWriter::new(args.out.destination()?, args.format, columns(units))?;
    let result = stream(&mut reader, &mut scan, &mut writer, range, units);
    reader.input_mut().clear();
    result?;
    writer.finish()?.commit()?;
    let summary = scan.summary();
    match args.summary {
        SummaryFormat::Text => eprint!("{}", text_summary(&summary, units)),
        SummaryFormat::Json => eprintln!(
            "{}",
            serde_json::to_string_pretty(&json_summary(&summary, units))
                .map_err(|e| Failure::Io(io::Error::other(e)))?
        ),
        SummaryFormat::None => {}
    }
    Ok(())
}

fn stream<R: BufRead, A: Atmosphere, W: Write>(
    reader: &mut SampleReader<Progress<R>>,
    scan: &mut FlightScan<'_, A>,
    writer: &mut RowWriter<W>,
    range: AltitudeRange,
    units: UnitSystem,
) -> Result<(), Failure> {
    while let Some(sample) = reader.next_sample()? {
        // An altitude out of the model's range, named in its column's unit.
        let altitude = reader.altitude_quantity();
        let table = reader.table();
        altitude_in(table.unit_of(altitude), sample.altitude_m, false, range)
            .map_err(|m| table.at_cell(altitude, m))?;
        let point = scan.push(sample).map_err(|e| table.at_line(e))?;
        writer.row(&values(&point, units))?;
    }
    Ok(())
}

/// The summary as JSON: the core's own fields in SI, and the caution. In US units the same
/// structure, each value of a catalogue quantity converted and its key renamed to the
/// quantity's US column; the `value` of an extreme (`max_drag`) is the quantity its key
/// names.
fn json_summary(summary: &FlightSummary, units: UnitSystem) -> Value {
    let mut value = serde_json::to_value(summary).unwrap_or(Value::Null);
    if let Value::Object(map) = &mut value {
        if units == UnitSystem::Us {
            for (key, item) in map.iter_mut() {
                if let Value::Object(fields) = item {
                    let extreme = key.strip_prefix("max_").and_then(Quantity::from_name);
                    *fields = convert(std::mem::take(fields), extreme, units);
                }
            }
            map.insert("units".to_owned(), json!("us"));
        }
        map.insert("caution".to_owned(), json!(CAUTION));
    }
    value
}

/// The quantity whose SI column a field of the core's summary is (`altitude_m`,
/// `dynamic_pressure_pa`): the core spells its fields in lower case.
fn si_quantity(key: &str) -> Option<Quantity> {
    Quantity::ALL.iter().copied().find(|q| key.eq_ignore_ascii_case(&column(*q, q.si())))
}

/// `fields` (in SI) in `units`, in their order: a field of a quantity under its column in
/// `units`, an extreme's `value` under its quantity's column when it has a unit.
fn convert(fields: Map<String, Value>, extreme: Option<Quantity>, units: UnitSystem) -> Map<String, Value> {
    fields
        .into_iter()
        .map(|(key, value)| {
            let quantity = match extreme {
                Some(q) if key == "value" && !units.unit(q).symbol().is_empty() => Some(q),
                _ => si_quantity(&key),
            };
            match quantity {
                Some(q) => {
                    let converted = value.as_f64().map_or(Value::Null, |v| json!(units.from_si(q, v)));
                    (units.column(q), converted)
                }
                None => (key, value),
            }
        })
        .collect()
}

/// The summary for a person: the catalogue's symbols, labels and units, with a fixed
/// number of decimals for each (more than the tables show: the summary is read once).
fn text_summary(s: &FlightSummary, units: UnitSystem) -> String {
    let value = |q: Quantity, si: f64, decimals: usize| {
        format!("{} {}", fixed(units.from_si(q, si), decimals), units.unit(q).symbol())
    };
    let [t, q, altitude, velocity, drag] =
        [Quantity::Time, Quantity::DynamicPressure, Quantity::Altitude, Quantity::Velocity, Quantity::Drag]
            .map(Quantity::info);
    let time = |time_s: f64| format!("{} = {}", t.symbol, value(Quantity::Time, time_s, 4));
    let at = |time_s: f64, altitude_m: f64| {
        format!("at {}, {} {}", time(time_s), altitude.label, value(Quantity::Altitude, altitude_m, 1))
    };
    let mut text = format!("samples: {}\n", s.samples);
    text += &match &s.max_dynamic_pressure {
        Some(p) => {
            let mach =
                p.mach.map_or_else(|| "Mach undefined".to_owned(), |m| format!("Mach {}", fixed(m, 4)));
            let how = if p.refined {
                format!("parabola through samples {} to {}", p.sample_index - 1, p.sample_index + 1)
            } else {
                format!("sample {}, not refined", p.sample_index)
            };
            format!(
                "max {}: {} {}, {} {}, {mach} ({how})\n",
                q.symbol,
                value(Quantity::DynamicPressure, p.dynamic_pressure_pa, 1),
                at(p.time_s, p.altitude_m),
                velocity.label,
                value(Quantity::Velocity, p.velocity_m_s, 2)
            )
        }
        None => format!("max {}: no samples\n", q.symbol),
    };
    text += &match &s.max_mach {
        Some(m) => format!("max Mach: {} {}\n", fixed(m.value, 4), at(m.time_s, m.altitude_m)),
        None => "max Mach: none (no speed of sound at any sample)\n".to_owned(),
    };
    for (name, crossings) in [("up", &s.mach_one_up), ("down", &s.mach_one_down)] {
        text += &match (crossings.first_time_s, crossings.last_time_s) {
            (Some(first), Some(last)) => format!(
                "Mach 1 {name}: {} crossing(s), first at {}, last at {}\n",
                crossings.count,
                time(first),
                time(last)
            ),
            _ => format!("Mach 1 {name}: none\n"),
        };
    }
    text += &match &s.max_drag {
        Some(d) => {
            let at = at(d.time_s, d.altitude_m);
            format!("max {}: {} {at}\n", drag.label, value(Quantity::Drag, d.value, 2))
        }
        None => format!("max {}: none (give --cd or --cd-table and --area)\n", drag.label),
    };
    text + CAUTION + "\n"
}
