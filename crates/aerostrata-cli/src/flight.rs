//! `aerostrata flight FILE`: the flight scan of a CSV of samples (time, geometric
//! altitude, velocity) through the standard atmosphere; per-sample CSV on stdout, the
//! summary (maximum q refined between samples, maximum Mach, Mach 1 crossings, maximum
//! drag) on stderr, as text or JSON.

use std::fs::File;
use std::io::{self, BufRead, BufReader, BufWriter, Write};
use std::path::PathBuf;

use aerostrata::aero::{DragCurve, Interpolation};
use aerostrata::flight::{FlightPoint, FlightScan, FlightSummary, Sample, Vehicle};
use aerostrata::{TemperatureOffset, US1976};
use clap::{Args, ValueEnum};

use crate::output::exact;
use crate::Failure;

/// The header an input file may start with.
const INPUT_HEADER: &str = "time_s,altitude_m,velocity_m_s";

/// The per-sample output columns.
const COLUMNS: [&str; 11] = [
    "time_s",
    "altitude_m",
    "velocity_m_s",
    "density_kg_m3",
    "speed_of_sound_m_s",
    "mach",
    "dynamic_pressure_Pa",
    "reynolds_per_m",
    "reynolds_number",
    "drag_coefficient",
    "drag_N",
];

#[derive(Args)]
pub struct FlightArgs {
    /// CSV of samples, one per line: time_s,altitude_m,velocity_m_s (time in s,
    /// geometric altitude in m, velocity relative to the air in m/s, its sign ignored).
    /// An optional first line may be that header; blank lines and lines starting with
    /// `#` are skipped; `-` reads stdin.
    file: PathBuf,
    /// Temperature offset dT in kelvin (a hot day is positive) at the standard's pressure.
    #[arg(long, value_name = "K", default_value_t = 0.0, allow_negative_numbers = true)]
    offset: f64,
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
    /// Reference area for the drag coefficient, m^2.
    #[arg(long, value_name = "M2", allow_negative_numbers = true)]
    area: Option<f64>,
    /// Reference length for the Reynolds number, m (with a drag coefficient and area).
    #[arg(long, value_name = "M", allow_negative_numbers = true)]
    length: Option<f64>,
    /// How the summary is written to stderr.
    #[arg(long, value_enum, default_value_t = SummaryFormat::Text)]
    summary: SummaryFormat,
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

pub fn run(args: &FlightArgs) -> Result<(), Failure> {
    let atmosphere =
        TemperatureOffset::new(US1976, args.offset).map_err(|e| Failure::Input(format!("--offset: {e}")))?;
    let table = args.cd_table.as_deref().map(parse_table).transpose()?;
    let interpolation = match args.interpolation {
        TableInterpolation::Linear => Interpolation::Linear,
        TableInterpolation::Cubic => Interpolation::MonotoneCubic,
    };
    let drag = match (&table, args.cd) {
        (Some((mach, cd)), _) => Some(
            DragCurve::table(mach, cd, interpolation)
                .map_err(|e| Failure::Input(format!("--cd-table: {e}")))?,
        ),
        (None, Some(cd)) => Some(DragCurve::constant(cd).map_err(|e| Failure::Input(format!("--cd: {e}")))?),
        (None, None) => None,
    };
    let vehicle = match (drag, args.area) {
        (Some(drag), Some(area)) => {
            let vehicle = Vehicle::new(drag, area).map_err(|e| Failure::Input(format!("--area: {e}")))?;
            Some(match args.length {
                Some(length) => vehicle
                    .with_reference_length(length)
                    .map_err(|e| Failure::Input(format!("--length: {e}")))?,
                None => vehicle,
            })
        }
        (Some(_), None) => return Err(Failure::Input("--cd and --cd-table need --area (m^2)".to_owned())),
        (None, Some(_)) => return Err(Failure::Input("--area needs --cd or --cd-table".to_owned())),
        (None, None) if args.length.is_some() => {
            return Err(Failure::Input("--length needs --cd or --cd-table and --area".to_owned()))
        }
        (None, None) => None,
    };
    let input: Box<dyn BufRead> = if args.file.as_os_str() == "-" {
        Box::new(io::stdin().lock())
    } else {
        Box::new(BufReader::new(
            File::open(&args.file)
                .map_err(|e| Failure::Input(format!("cannot open {}: {e}", args.file.display())))?,
        ))
    };
    let mut scan = FlightScan::new(atmosphere, vehicle);
    let mut out = BufWriter::new(io::stdout().lock());
    writeln!(out, "{}", COLUMNS.join(","))?;
    let mut first = true;
    for (index, line) in input.lines().enumerate() {
        let line_number = index + 1;
        let line = line.map_err(|e| Failure::Input(format!("line {line_number}: cannot read: {e}")))?;
        let text = line.trim();
        if text.is_empty() || text.starts_with('#') {
            continue;
        }
        if std::mem::take(&mut first) && text.replace(' ', "") == INPUT_HEADER {
            continue;
        }
        let sample = parse_sample(text).map_err(|m| Failure::Input(format!("line {line_number}: {m}")))?;
        let point = scan.push(sample).map_err(|e| Failure::Input(format!("line {line_number}: {e}")))?;
        write_point(&mut out, &point)?;
    }
    out.flush()?;
    drop(out);
    let summary = scan.summary();
    match args.summary {
        SummaryFormat::Text => eprint!("{}", text_summary(&summary)),
        SummaryFormat::Json => eprintln!(
            "{}",
            serde_json::to_string_pretty(&summary).map_err(|e| Failure::Io(io::Error::other(e)))?
        ),
        SummaryFormat::None => {}
    }
    Ok(())
}

fn parse_sample(text: &str) -> Result<Sample, String> {
    let cells: Vec<&str> = text.split(',').map(str::trim).collect();
    if cells.len() != 3 {
        return Err(format!(
            "expected 3 values (time_s,altitude_m,velocity_m_s), got {} in '{text}'",
            cells.len()
        ));
    }
    let number = |cell: &str, what: &str| -> Result<f64, String> {
        cell.parse().map_err(|_| format!("'{cell}' is not a {what}"))
    };
    Ok(Sample {
        time_s: number(cells[0], "time (a number of seconds)")?,
        altitude_m: number(cells[1], "geometric altitude (a number of metres)")?,
        velocity_m_s: number(cells[2], "velocity (a number of m/s)")?,
    })
}

fn write_point(out: &mut impl Write, p: &FlightPoint) -> io::Result<()> {
    let optional = |v: Option<f64>| v.map(exact).unwrap_or_default();
    writeln!(
        out,
        "{},{},{},{},{},{},{},{},{},{},{}",
        exact(p.time_s),
        exact(p.altitude_m),
        exact(p.velocity_m_s),
        exact(p.density_kg_m3),
        optional(p.speed_of_sound_m_s),
        optional(p.mach),
        exact(p.dynamic_pressure_pa),
        optional(p.reynolds_per_m),
        optional(p.reynolds_number),
        optional(p.drag_coefficient),
        optional(p.drag_n),
    )
}

fn text_summary(s: &FlightSummary) -> String {
    let mut text = format!("samples: {}\n", s.samples);
    match &s.max_dynamic_pressure {
        Some(p) => {
            let mach = p.mach.map_or_else(|| "Mach undefined".to_owned(), |m| format!("Mach {m:.4}"));
            let how = if p.refined {
                format!("parabola through samples {} to {}", p.sample_index - 1, p.sample_index + 1)
            } else {
                format!("sample {}, not refined", p.sample_index)
            };
            text += &format!(
                "max q: {:.1} Pa at t = {:.4} s, altitude {:.1} m, velocity {:.2} m/s, {mach} ({how})\n",
                p.dynamic_pressure_pa, p.time_s, p.altitude_m, p.velocity_m_s
            );
        }
        None => text += "max q: no samples\n",
    }
    match &s.max_mach {
        Some(m) => {
            text += &format!(
                "max Mach: {:.4} at t = {:.4} s, altitude {:.1} m\n",
                m.value, m.time_s, m.altitude_m
            )
        }
        None => text += "max Mach: none (no speed of sound at any sample)\n",
    }
    for (name, crossings) in [("up", &s.mach_one_up), ("down", &s.mach_one_down)] {
        match (crossings.first_time_s, crossings.last_time_s) {
            (Some(first), Some(last)) => {
                text += &format!(
                    "Mach 1 {name}: {} crossing(s), first at t = {first:.4} s, last at t = {last:.4} s\n",
                    crossings.count
                )
            }
            _ => text += &format!("Mach 1 {name}: none\n"),
        }
    }
    match &s.max_drag {
        Some(d) => {
            text += &format!(
                "max drag: {:.2} N at t = {:.4} s, altitude {:.1} m\n",
                d.value, d.time_s, d.altitude_m
            )
        }
        None => text += "max drag: none (give --cd or --cd-table and --area)\n",
    }
    text
}
