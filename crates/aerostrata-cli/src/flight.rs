//! `aerostrata flight FILE`: the flight scan of a CSV of samples (time, geometric
//! altitude, velocity) through the standard atmosphere, one sample at a time (any
//! number of samples in bounded memory); per-sample rows on stdout or `--output`, the
//! summary (maximum q refined between samples, maximum Mach, Mach 1 crossings, maximum
//! drag) on stderr, as text or JSON.

use std::io::{self, BufRead, Write};
use std::path::PathBuf;

use aerostrata::aero::{DragCurve, Interpolation};
use aerostrata::flight::{FlightPoint, FlightScan, FlightSummary, Sample, Vehicle};
use aerostrata_cli::format::{fixed, Style};
use aerostrata_cli::units::{Quantity, Unit, UnitSystem};
use clap::{Args, ValueEnum};
use serde_json::{json, Value};

use crate::output::{Column, Destination, Format, RowWriter};
use crate::progress::{self, Progress};
use crate::{Failure, OutputArgs};

/// The drag model of a vehicle, as the options give it.
#[derive(Args, Clone)]
pub struct VehicleArgs {
    /// A constant drag coefficient (with --area).
    #[arg(long, value_name = "CD", conflicts_with = "cd_table", allow_negative_numbers = true)]
    cd: Option<f64>,
    /// A drag table MACH:CD,MACH:CD,... with Mach increasing (with --area); the end values
    /// are held outside it.
    #[arg(long, value_name = "TABLE")]
    cd_table: Option<String>,
    /// How the drag table is read between its points.
    #[arg(long, value_enum, default_value_t = TableInterpolation::Cubic)]
    interpolation: TableInterpolation,
    /// Reference area for the drag coefficient, m^2 (ft^2 with --units us).
    #[arg(long, value_name = "AREA", allow_negative_numbers = true)]
    area: Option<f64>,
    /// Reference length for the Reynolds number, m or ft (with a drag coefficient and area).
    #[arg(long, value_name = "LENGTH", allow_negative_numbers = true)]
    length: Option<f64>,
    /// Temperature offset dT (a hot day is positive) at the standard's pressure; K, or
    /// degF with --units us.
    #[arg(long, value_name = "DT", default_value_t = 0.0, allow_negative_numbers = true)]
    offset: f64,
}

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
    #[arg(long, value_enum, default_value_t = progress::When::Auto)]
    progress: progress::When,
    #[command(flatten)]
    out: OutputArgs,
}

#[derive(Clone, Copy, ValueEnum)]
pub enum TableInterpolation {
    /// Straight lines between points.
    Linear,
    /// Monotone cubic (Fritsch-Carlson): no overshoot between points.
    Cubic,
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

/// Mach and Cd columns of a `--cd-table` value.
fn parse_table(text: &str) -> Result<(Vec<f64>, Vec<f64>), Failure> {
    let mut mach = Vec::new();
    let mut cd = Vec::new();
    for pair in text.split(',') {
        let parsed =
            pair.split_once(':').and_then(|(m, c)| Some((m.trim().parse().ok()?, c.trim().parse().ok()?)));
        let Some((m, c)) = parsed else {
            return Err(Failure::Input(format!("--cd-table: '{pair}' is not MACH:CD (two numbers)")));
        };
        mach.push(m);
        cd.push(c);
    }
    Ok((mach, cd))
}

/// The drag table's columns, owned, for [`VehicleArgs::vehicle`] to borrow.
pub struct DragTable(Option<(Vec<f64>, Vec<f64>)>);

impl VehicleArgs {
    /// The drag table's columns, parsed.
    ///
    /// # Errors
    /// [`Failure::Input`] for a malformed table.
    pub fn table(&self) -> Result<DragTable, Failure> {
        Ok(DragTable(self.cd_table.as_deref().map(parse_table).transpose()?))
    }

    /// The vehicle the options describe, if any.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the option at fault.
    pub fn vehicle<'t>(
        &self,
        table: &'t DragTable,
        units: UnitSystem,
    ) -> Result<Option<Vehicle<'t>>, Failure> {
        let interpolation = match self.interpolation {
            TableInterpolation::Linear => Interpolation::Linear,
            TableInterpolation::Cubic => Interpolation::MonotoneCubic,
        };
        let drag = match (&table.0, self.cd) {
            (Some((mach, cd)), _) => Some(
                DragCurve::table(mach, cd, interpolation)
                    .map_err(|e| Failure::Input(format!("--cd-table: {e}")))?,
            ),
            (None, Some(cd)) => {
                Some(DragCurve::constant(cd).map_err(|e| Failure::Input(format!("--cd: {e}")))?)
            }
            (None, None) => None,
        };
        match (drag, self.area) {
            (Some(drag), Some(area)) => {
                let area = units.to_si(Quantity::Area, area);
                let vehicle = Vehicle::new(drag, area).map_err(|e| Failure::Input(format!("--area: {e}")))?;
                Ok(Some(match self.length {
                    Some(length) => vehicle
                        .with_reference_length(units.to_si(Quantity::Length, length))
                        .map_err(|e| Failure::Input(format!("--length: {e}")))?,
                    None => vehicle,
                }))
            }
            (Some(_), None) => Err(Failure::Input("--cd and --cd-table need --area".to_owned())),
            (None, Some(_)) => Err(Failure::Input("--area needs --cd or --cd-table".to_owned())),
            (None, None) if self.length.is_some() => {
                Err(Failure::Input("--length needs --cd or --cd-table and --area".to_owned()))
            }
            (None, None) => Ok(None),
        }
    }

    /// The temperature offset, K.
    pub fn offset(&self) -> f64 {
        self.offset
    }
}

/// Where the samples' values sit in a row, and their units.
#[derive(Clone, Copy)]
struct Layout {
    time: usize,
    altitude: usize,
    velocity: usize,
    cells: usize,
    altitude_unit: Unit,
    velocity_unit: Unit,
}

/// Reads samples one line at a time from CSV text.
pub struct SampleReader<R> {
    input: R,
    units: UnitSystem,
    line: String,
    line_number: usize,
    layout: Option<Layout>,
}

impl<R: BufRead> SampleReader<R> {
    /// A reader of `input`, whose values are in `units` unless a header names others.
    pub fn new(input: R, units: UnitSystem) -> Self {
        SampleReader { input, units, line: String::new(), line_number: 0, layout: None }
    }

    /// The line number of the last line read (from 1).
    pub fn line_number(&self) -> usize {
        self.line_number
    }

    /// The underlying input.
    pub fn input_mut(&mut self) -> &mut R {
        &mut self.input
    }

    /// The next sample, in SI, or `None` at the end.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the line and the value at fault.
    pub fn next_sample(&mut self) -> Result<Option<Sample>, Failure> {
        loop {
            self.line.clear();
            self.line_number += 1;
            let number = self.line_number;
            let read = self
                .input
                .read_line(&mut self.line)
                .map_err(|e| Failure::Input(format!("line {number}: cannot read: {e}")))?;
            if read == 0 {
                return Ok(None);
            }
            let text = self.line.trim();
            if text.is_empty() || text.starts_with('#') {
                continue;
            }
            let layout = match self.layout {
                Some(layout) => layout,
                None => {
                    let (layout, header) = layout_of(text, self.units)
                        .map_err(|m| Failure::Input(format!("line {number}: {m}")))?;
                    self.layout = Some(layout);
                    if header {
                        continue;
                    }
                    layout
                }
            };
            return parse_sample(text, layout)
                .map(Some)
                .map_err(|m| Failure::Input(format!("line {number}: {m}")));
        }
    }
}

/// The layout a first line gives, and whether it is a header (it has a cell `time_s`).
fn layout_of(text: &str, units: UnitSystem) -> Result<(Layout, bool), String> {
    let cells: Vec<&str> = text.split(',').map(str::trim).collect();
    if !cells.contains(&"time_s") {
        let layout = Layout {
            time: 0,
            altitude: 1,
            velocity: 2,
            cells: 3,
            altitude_unit: units.unit(Quantity::Length),
            velocity_unit: units.unit(Quantity::Speed),
        };
        return Ok((layout, false));
    }
    let find = |quantity: Quantity| {
        [UnitSystem::Si, UnitSystem::Us].into_iter().find_map(|system| {
            let unit = system.unit(quantity);
            let base = if quantity == Quantity::Length { "altitude" } else { "velocity" };
            cells.iter().position(|c| *c == unit.key(base)).map(|i| (i, unit))
        })
    };
    let time = cells.iter().position(|c| *c == "time_s");
    match (time, find(Quantity::Length), find(Quantity::Speed)) {
        (Some(time), Some((altitude, altitude_unit)), Some((velocity, velocity_unit))) => Ok((
            Layout { time, altitude, velocity, cells: cells.len(), altitude_unit, velocity_unit },
            true,
        )),
        _ => Err(format!(
            "header '{text}' needs the columns time_s, altitude_m or altitude_ft, and velocity_m_s or velocity_ft_s"
        )),
    }
}

fn parse_sample(text: &str, layout: Layout) -> Result<Sample, String> {
    let cells: Vec<&str> = text.split(',').map(str::trim).collect();
    if cells.len() != layout.cells {
        let names = format!(
            "time_s,altitude_{},velocity_{}",
            layout.altitude_unit.suffix, layout.velocity_unit.suffix
        );
        return Err(if layout.cells == 3 {
            format!("expected 3 values ({names}), got {} in '{text}'", cells.len())
        } else {
            format!("expected {} values as in the header, got {} in '{text}'", layout.cells, cells.len())
        });
    }
    let number = |cell: &str, what: &str| -> Result<f64, String> {
        cell.parse().map_err(|_| format!("'{cell}' is not a {what}"))
    };
    let unit_name = |unit: Unit, metric: &str, us: &str| {
        if unit.suffix.starts_with('m') {
            metric.to_owned()
        } else {
            us.to_owned()
        }
    };
    let time_s = number(cells[layout.time], "time (a number of seconds)")?;
    let altitude = number(
        cells[layout.altitude],
        &format!("geometric altitude (a number of {})", unit_name(layout.altitude_unit, "metres", "feet")),
    )?;
    let velocity =
        number(cells[layout.velocity], &format!("velocity (a number of {})", layout.velocity_unit.symbol))?;
    Ok(Sample {
        time_s,
        altitude_m: layout.altitude_unit.to_si(altitude),
        velocity_m_s: layout.velocity_unit.to_si(velocity),
    })
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

pub fn run(args: &FlightArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let atmosphere = crate::offset_model(args.vehicle.offset, units)?;
    let range = aerostrata::Atmosphere::range(&atmosphere);
    let table = args.vehicle.table()?;
    let vehicle = args.vehicle.vehicle(&table, units)?;
    let input = crate::open_input(Some(&args.file), args.progress)?;
    let mut reader = SampleReader::new(input, units);
    let mut scan = FlightScan::new(atmosphere, vehicle);
    let destination = Destination::open(args.out.output.as_deref())?;
    let mut writer = RowWriter::new(destination, args.format, columns(units))?;
    let result = stream(&mut reader, &mut scan, &mut writer, range);
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

fn stream<R: BufRead, A: aerostrata::Atmosphere, W: Write>(
    reader: &mut SampleReader<Progress<R>>,
    scan: &mut FlightScan<'_, A>,
    writer: &mut RowWriter<W>,
    range: aerostrata::AltitudeRange,
) -> Result<(), Failure> {
    let units = reader.units;
    while let Some(sample) = reader.next_sample()? {
        let line = reader.line_number();
        if units == UnitSystem::Us {
            // Name an altitude out of range in the user's feet.
            crate::altitude_in(units, units.from_si(Quantity::Length, sample.altitude_m), false, range)
                .map_err(|m| Failure::Input(format!("line {line}: {m}")))?;
        }
        let point = scan.push(sample).map_err(|e| Failure::Input(format!("line {line}: {e}")))?;
        writer.row(&values(&point, units))?;
    }
    Ok(())
}

/// The summary as JSON: the core's own fields in SI; in US units the same structure
/// with lengths, speeds, pressures and the drag converted and their keys renamed.
pub fn json_summary(summary: &FlightSummary, units: UnitSystem) -> Value {
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
