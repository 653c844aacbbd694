//! `aerostrata flight FILE`: the flight scan of a CSV of samples (time, geometric
//! altitude, velocity) through the standard atmosphere, one sample at a time (any
//! number of samples in bounded memory); per-sample rows on stdout or `--output`, the
//! summary (maximum q refined between samples, maximum Mach, Mach 1 crossings, maximum
//! drag) on stderr, as text or JSON.

use std::io::{self, BufRead, Write};
use std::path::PathBuf;

use aerostrata::flight::{FlightPoint, FlightScan, FlightSummary};
use aerostrata::{AltitudeRange, Atmosphere};
use clap::{Args, ValueEnum};
use serde_json::{json, Value};

use crate::args::model::{altitude_in, offset_model};
use crate::args::output::OutputArgs;
use crate::args::vehicle::VehicleArgs;
use crate::failure::Failure;
use crate::format::{fixed, Style};
use crate::input::lines::open_input;
use crate::input::progress::{Progress, When};
use crate::input::samples::SampleReader;
use crate::output::rows::{Column, Format, RowWriter};
use crate::units::{Quantity, UnitSystem};

#[derive(Args)]
pub struct FlightArgs {
    /// CSV of samples, one per line: time_s,altitude_m,velocity_m_s (time in s,
    /// geometric altitude, velocity relative to the air, its sign ignored; ft and ft/s
    /// with --units us). A first line naming its columns (time_s and altitude_m or
    /// altitude_ft and velocity_m_s or velocity_ft_s, in any order, among others) picks
    /// them and their units; blank lines and lines starting with `#` are skipped; `-`
    /// reads stdin.
    pub file: PathBuf,
    #[command(flatten)]
    pub vehicle: VehicleArgs,
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

/// The per-sample columns.
fn columns(units: UnitSystem) -> Vec<Column> {
    vec![
        Column::new(units, "time", "t", Quantity::Time, Style::Fixed(3)),
        Column::new(units, "altitude", "Z", Quantity::Length, Style::Fixed(1)),
        Column::new(units, "velocity", "V", Quantity::Speed, Style::Fixed(2)),
        Column::new(units, "density", "rho", Quantity::Density, Style::Scientific),
        Column::new(units, "speed_of_sound", "a", Quantity::Speed, Style::Fixed(2)),
        Column::new(units, "mach", "M", Quantity::Dimensionless, Style::Fixed(4)),
        Column::new(units, "dynamic_pressure", "q", Quantity::Pressure, Style::Significant),
        Column::new(units, "reynolds", "Re/l", Quantity::PerLength, Style::Scientific),
        Column::new(units, "reynolds_number", "Re", Quantity::Dimensionless, Style::Scientific),
        Column::new(units, "drag_coefficient", "Cd", Quantity::Dimensionless, Style::Fixed(4)),
        Column::new(units, "drag", "D", Quantity::Force, Style::Significant),
    ]
}

fn values(p: &FlightPoint, units: UnitSystem) -> [Option<f64>; 11] {
    let u = |q: Quantity, v: f64| units.from_si(q, v);
    [
        Some(p.time_s),
        Some(u(Quantity::Length, p.altitude_m)),
        Some(u(Quantity::Speed, p.velocity_m_s)),
        Some(u(Quantity::Density, p.density_kg_m3)),
        p.speed_of_sound_m_s.map(|a| u(Quantity::Speed, a)),
        p.mach,
        Some(u(Quantity::Pressure, p.dynamic_pressure_pa)),
        p.reynolds_per_m.map(|r| u(Quantity::PerLength, r)),
        p.reynolds_number,
        p.drag_coefficient,
        p.drag_n.map(|d| u(Quantity::Force, d)),
    ]
}

/// Runs `aerostrata flight`.
///
/// # Errors
/// [`Failure::Input`] naming the option or the input line at fault; [`Failure::Io`] when
/// writing fails.
pub fn run(args: &FlightArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let atmosphere = offset_model(args.vehicle.offset(), units)?;
    let range = atmosphere.range();
    let table = args.vehicle.table()?;
    let vehicle = args.vehicle.vehicle(&table, units)?;
    let input = open_input(Some(&args.file), args.progress)?;
    let mut reader = SampleReader::new(input, units);
    let mut scan = FlightScan::new(atmosphere, vehicle);
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
        let line = reader.line_number();
        if units == UnitSystem::Us {
            // Name an altitude out of range in the user's feet.
            altitude_in(units, units.from_si(Quantity::Length, sample.altitude_m), false, range)
                .map_err(|m| Failure::Input(format!("line {line}: {m}")))?;
        }
        let point = scan.push(sample).map_err(|e| Failure::Input(format!("line {line}: {e}")))?;
        writer.row(&values(&point, units))?;
    }
    Ok(())
}

/// The summary as JSON: the core's own fields in SI; in US units the same structure
/// with lengths, speeds, pressures and the drag converted and their keys renamed.
fn json_summary(summary: &FlightSummary, units: UnitSystem) -> Value {
    let mut value = serde_json::to_value(summary).unwrap_or(Value::Null);
    if units == UnitSystem::Si {
        return value;
    }
    fn convert(value: &mut Value, units: UnitSystem, drag: bool) {
        if let Value::Object(map) = value {
            let renames = [
                ("altitude_m", Quantity::Length, "altitude"),
                ("velocity_m_s", Quantity::Speed, "velocity"),
                ("dynamic_pressure_pa", Quantity::Pressure, "dynamic_pressure"),
            ];
            for (key, quantity, base) in renames {
                if let Some(v) = map.remove(key) {
                    let converted = v.as_f64().map_or(Value::Null, |v| json!(units.from_si(quantity, v)));
                    map.insert(units.unit(quantity).key(base), converted);
                }
            }
            if drag {
                if let Some(v) = map.remove("value") {
                    let converted =
                        v.as_f64().map_or(Value::Null, |v| json!(units.from_si(Quantity::Force, v)));
                    map.insert(units.unit(Quantity::Force).key("drag"), converted);
                }
            }
        }
    }
    if let Value::Object(map) = &mut value {
        for (key, item) in map.iter_mut() {
            convert(item, units, key == "max_drag");
        }
        map.insert("units".to_owned(), json!("us"));
    }
    value
}

fn text_summary(s: &FlightSummary, units: UnitSystem) -> String {
    let length = units.unit(Quantity::Length);
    let speed = units.unit(Quantity::Speed);
    let pressure = units.unit(Quantity::Pressure);
    let force = units.unit(Quantity::Force);
    let at = |time_s: f64, altitude_m: f64| {
        let altitude = fixed(length.from_si(altitude_m), 1);
        format!("at t = {} s, altitude {altitude} {}", fixed(time_s, 4), length.symbol)
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
                "max q: {} {} {}, velocity {} {}, {mach} ({how})\n",
                fixed(pressure.from_si(p.dynamic_pressure_pa), 1),
                pressure.symbol,
                at(p.time_s, p.altitude_m),
                fixed(speed.from_si(p.velocity_m_s), 2),
                speed.symbol
            )
        }
        None => "max q: no samples\n".to_owned(),
    };
    text += &match &s.max_mach {
        Some(m) => format!("max Mach: {} {}\n", fixed(m.value, 4), at(m.time_s, m.altitude_m)),
        None => "max Mach: none (no speed of sound at any sample)\n".to_owned(),
    };
    for (name, crossings) in [("up", &s.mach_one_up), ("down", &s.mach_one_down)] {
        text += &match (crossings.first_time_s, crossings.last_time_s) {
            (Some(first), Some(last)) => format!(
                "Mach 1 {name}: {} crossing(s), first at t = {} s, last at t = {} s\n",
                crossings.count,
                fixed(first, 4),
                fixed(last, 4)
            ),
            _ => format!("Mach 1 {name}: none\n"),
        };
    }
    text += &match &s.max_drag {
        Some(d) => {
            let drag = fixed(force.from_si(d.value), 2);
            format!("max drag: {drag} {} {}\n", force.symbol, at(d.time_s, d.altitude_m))
        }
        None => "max drag: none (give --cd or --cd-table and --area)\n".to_owned(),
    };
    text
}
