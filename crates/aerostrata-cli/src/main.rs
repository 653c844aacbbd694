//! `aerostrata`: standard-atmosphere tables and full-state evaluation from the command line.
//!
//! Exit status: 0 on success, 2 for bad input or usage (one line on stderr naming the
//! value and the allowed range), 1 for an internal or I/O failure.

mod airspeed;
mod altitude;
mod flight;
mod output;
mod sounding;

use std::fs::File;
use std::io::{self, BufRead, BufReader, BufWriter, Write};
use std::path::PathBuf;
use std::process::ExitCode;

use aerostrata::{Altitude, Atmosphere, State, TemperatureOffset, US1976};
use clap::{Args, Parser, Subcommand, ValueEnum};

use output::{write_csv_header, write_csv_row, write_json, write_table};

/// Air properties of the U.S. Standard Atmosphere 1976 (-5 km to 1000 km), on a
/// standard, hot or cold day.
///
/// Not certified flight software: verify results independently before relying on them.
#[derive(Parser)]
#[command(name = "aerostrata", version, about, long_about = None)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Tabulate the standard atmosphere over a range of altitudes.
    #[command(
        after_help = "Example:\n  aerostrata table --from 0 --to 20000 --step 500 --offset 15 --format csv"
    )]
    Table(TableArgs),
    /// Evaluate the full state at altitudes read one per line (CSV out).
    #[command(after_help = "Examples:\n  printf '0\\n11000\\n' | aerostrata eval --offset -10\n  \
                            printf '120000\\n400000\\n' | aerostrata eval --species")]
    Eval(EvalArgs),
    /// Scan a flight (CSV of time_s,altitude_m,velocity_m_s): per-sample q, Mach,
    /// Reynolds number and drag on stdout, the summary (max q, max Mach, Mach 1
    /// crossings, max drag) on stderr.
    #[command(
        after_help = "Example:\n  aerostrata flight ascent.csv --cd-table 0:0.45,0.9:0.5,1.1:0.75,2:0.55 \
                            --area 0.0182 --summary json"
    )]
    Flight(flight::FlightArgs),
    /// Convert between calibrated, equivalent and true airspeed and Mach number.
    #[command(
        after_help = "Example:\n  aerostrata airspeed --cas 250 --unit kt --pressure-altitude 3048 --oat 268.15"
    )]
    Airspeed(airspeed::AirspeedArgs),
    /// Pressure altitude from static pressure; density altitude, QNH or pad-relative
    /// altitude on request.
    #[command(
        after_help = "Example:\n  aerostrata altitude --pressure 84300 --pad 98100 --temperature 281.2"
    )]
    Altitude(altitude::AltitudeArgs),
}

#[derive(Args)]
struct ModelArgs {
    /// Temperature offset dT in kelvin (a hot day is positive): T = T_std + dT at the
    /// standard's pressure.
    #[arg(long, value_name = "K", default_value_t = 0.0, allow_negative_numbers = true)]
    offset: f64,
    /// Read altitudes as geopotential instead of geometric metres.
    #[arg(long)]
    geopotential: bool,
    /// Use a sounding instead of the standard: CSV with a header of quantities and units,
    /// or JSON if the name ends in .json (docs/soundings.md). Outside its rows: an error,
    /// unless --blend is given.
    #[arg(long, value_name = "FILE")]
    sounding: Option<PathBuf>,
    /// With --sounding: beyond the first and last rows, blend into the standard over this
    /// many geopotential metres.
    #[arg(long, value_name = "M", requires = "sounding")]
    blend: Option<f64>,
}

#[derive(Args)]
struct TableArgs {
    /// Lowest altitude, m [default: 0, or the model's bottom if higher].
    #[arg(long, value_name = "M", allow_negative_numbers = true)]
    from: Option<f64>,
    /// Highest altitude, m [default: 86000, or the model's top if lower].
    #[arg(long, value_name = "M", allow_negative_numbers = true)]
    to: Option<f64>,
    /// Altitude step, m.
    #[arg(long, value_name = "M", default_value_t = 1_000.0)]
    step: f64,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    format: Format,
    #[command(flatten)]
    model: ModelArgs,
}

#[derive(Args)]
struct EvalArgs {
    /// File of altitudes in metres, one per line; `-` or nothing reads stdin. Blank lines
    /// and lines starting with `#` are skipped.
    file: Option<PathBuf>,
    /// Add the standard's number densities of N2, O, O2, Ar, He and H (1/m^3; defined
    /// above 86 km, empty cells below).
    #[arg(long)]
    species: bool,
    #[command(flatten)]
    model: ModelArgs,
}

#[derive(Clone, Copy, ValueEnum)]
enum Format {
    /// Aligned columns for a terminal.
    Table,
    /// Comma-separated values with a header of quantities and units.
    Csv,
    /// An array of objects keyed like the CSV header.
    Json,
}

/// The most rows `table` will produce; a guard against a mistyped step.
const MAX_TABLE_ROWS: f64 = 1.0e6;

enum Failure {
    /// Bad input or usage: exit status 2.
    Input(String),
    /// I/O failure: exit status 1.
    Io(io::Error),
}

impl From<io::Error> for Failure {
    fn from(error: io::Error) -> Self {
        Failure::Io(error)
    }
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    let result = match cli.command {
        Command::Table(args) => table(&args),
        Command::Eval(args) => eval(&args),
        Command::Flight(args) => flight::run(&args),
        Command::Airspeed(args) => airspeed::run(&args),
        Command::Altitude(args) => altitude::run(&args),
    };
    match result {
        Ok(()) => ExitCode::SUCCESS,
        Err(Failure::Io(error)) if error.kind() == io::ErrorKind::BrokenPipe => ExitCode::SUCCESS,
        Err(Failure::Input(message)) => {
            eprintln!("aerostrata: {message}");
            ExitCode::from(2)
        }
        Err(Failure::Io(error)) => {
            eprintln!("aerostrata: {error}");
            ExitCode::from(1)
        }
    }
}

fn model(args: &ModelArgs) -> Result<Box<dyn Atmosphere>, Failure> {
    if let Some(path) = &args.sounding {
        if args.offset != 0.0 {
            return Err(Failure::Input(
                "--offset applies to the standard and cannot be combined with --sounding".to_owned(),
            ));
        }
        return Ok(Box::new(sounding::load(path, args.blend).map_err(Failure::Input)?));
    }
    let offset =
        TemperatureOffset::new(US1976, args.offset).map_err(|e| Failure::Input(format!("--offset: {e}")))?;
    Ok(Box::new(offset))
}

fn altitude(meters: f64, geopotential: bool) -> aerostrata::Result<Altitude> {
    if geopotential {
        Altitude::geopotential_m(meters)
    } else {
        Altitude::geometric_m(meters)
    }
}

fn table(args: &TableArgs) -> Result<(), Failure> {
    let atmosphere = model(&args.model)?;
    let range = atmosphere.range();
    let (bottom, top) = if args.model.geopotential {
        (range.geopotential_min_m, range.geopotential_max_m)
    } else {
        (range.geometric_min_m, range.geometric_max_m)
    };
    let from = args.from.unwrap_or(bottom.max(0.0));
    let to = args.to.unwrap_or(top.min(86_000.0));
    for (name, value) in [("--from", from), ("--to", to), ("--step", args.step)] {
        if !value.is_finite() {
            return Err(Failure::Input(format!("{name} must be a finite number of metres, got {value}")));
        }
    }
    if args.step <= 0.0 {
        return Err(Failure::Input(format!("--step must be greater than 0 m, got {} m", args.step)));
    }
    if to < from {
        return Err(Failure::Input(format!("--to {to} m must not be below --from {from} m")));
    }
    for (name, meters) in [("--from", from), ("--to", to)] {
        altitude(meters, args.model.geopotential)
            .and_then(|a| atmosphere.range().check(a))
            .map_err(|e| Failure::Input(format!("{name}: {e}")))?;
    }
    let intervals = ((to - from) / args.step * (1.0 + 1e-12)).floor();
    if intervals + 1.0 > MAX_TABLE_ROWS {
        return Err(Failure::Input(format!(
            "--step {} m gives {} rows, more than the {MAX_TABLE_ROWS} allowed",
            args.step,
            intervals + 1.0
        )));
    }
    let mut states = Vec::with_capacity(intervals as usize + 1);
    for i in 0..=(intervals as u64) {
        let meters = (from + i as f64 * args.step).min(to);
        let state = altitude(meters, args.model.geopotential)
            .and_then(|a| atmosphere.state(a))
            .map_err(|e| Failure::Input(e.to_string()))?;
        states.push(state);
    }
    let mut out = BufWriter::new(io::stdout().lock());
    match args.format {
        Format::Table => write_table(&mut out, &states)?,
        Format::Csv => {
            write_csv_header(&mut out, false)?;
            for state in &states {
                write_csv_row(&mut out, state, None)?;
            }
        }
        Format::Json => write_json(&mut out, &states)?,
    }
    out.flush()?;
    Ok(())
}

fn eval(args: &EvalArgs) -> Result<(), Failure> {
    let atmosphere = model(&args.model)?;
    if args.species && (args.model.offset != 0.0 || args.model.sounding.is_some()) {
        return Err(Failure::Input(
            "--species gives the standard's own number densities and cannot be combined with --offset or --sounding"
                .to_owned(),
        ));
    }
    let input: Box<dyn BufRead> = match &args.file {
        None => Box::new(io::stdin().lock()),
        Some(path) if path.as_os_str() == "-" => Box::new(io::stdin().lock()),
        Some(path) => Box::new(BufReader::new(
            File::open(path).map_err(|e| Failure::Input(format!("cannot open {}: {e}", path.display())))?,
        )),
    };
    let mut out = BufWriter::new(io::stdout().lock());
    write_csv_header(&mut out, args.species)?;
    for (index, line) in input.lines().enumerate() {
        let line_number = index + 1;
        let line = line.map_err(|e| Failure::Input(format!("line {line_number}: cannot read: {e}")))?;
        let text = line.trim();
        if text.is_empty() || text.starts_with('#') {
            continue;
        }
        let state = evaluate_line(atmosphere.as_ref(), text, args.model.geopotential)
            .map_err(|message| Failure::Input(format!("line {line_number}: {message}")))?;
        let species = if args.species { species_at(&state) } else { None };
        write_csv_row(&mut out, &state, args.species.then_some(species))?;
    }
    out.flush()?;
    Ok(())
}

/// The standard's species where it defines them (above 86 km).
fn species_at(state: &State) -> Option<[f64; 6]> {
    if state.geometric_altitude_m <= aerostrata::model::upper::BASE_M {
        return None;
    }
    Altitude::geometric_m(state.geometric_altitude_m)
        .and_then(|a| US1976.species(a))
        .ok()
        .map(|n| n.as_array())
}

fn evaluate_line(atmosphere: &dyn Atmosphere, text: &str, geopotential: bool) -> Result<State, String> {
    let meters: f64 =
        text.parse().map_err(|_| format!("'{text}' is not an altitude (a number of metres)"))?;
    altitude(meters, geopotential).and_then(|a| atmosphere.state(a)).map_err(|e| e.to_string())
}
