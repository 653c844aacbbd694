//! `aerostrata`: standard-atmosphere tables, full-state evaluation, flight scans,
//! airspeeds, altimetry and plots from the command line.
//!
//! Exit status: 0 on success, 2 for bad input or usage (one line on stderr naming the
//! value and the allowed range), 1 for an internal or I/O failure.

mod airspeed;
mod altitude;
mod flight;
mod output;
mod plotting;
mod progress;
mod sounding;

use std::fs::File;
use std::io::{self, BufRead, BufReader, Write};
use std::path::{Path, PathBuf};
use std::process::ExitCode;

use aerostrata::{Altitude, AltitudeRange, Atmosphere, State, TemperatureOffset, US1976};
use aerostrata_cli::format::tidy;
use aerostrata_cli::units::{Quantity, UnitSystem};
use clap::{Args, CommandFactory, Parser, Subcommand};

use output::{state_columns, state_values, Destination, Format, RowWriter};

/// Air properties of the U.S. Standard Atmosphere 1976 (-5 km to 1000 km) on a
/// standard, hot or cold day or a sounding, and the aerodynamics of a flight through it.
///
/// Not certified flight software: verify results independently before relying on them.
#[derive(Parser)]
#[command(
    name = "aerostrata",
    version,
    about,
    long_about = None,
    after_help = "Exit status: 0 success, 2 bad input or usage (one line on stderr), 1 internal failure.\n\
                  More: docs/cli.md, `aerostrata man`, `aerostrata completions bash`."
)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Tabulate the atmosphere over a range of altitudes.
    #[command(
        after_help = "Examples:\n  aerostrata table --from 0 --to 20000 --step 500 --offset 15 --format csv\n  \
                            aerostrata table --units us --from 0 --to 40000 --step 5000 --format markdown"
    )]
    Table(TableArgs),
    /// Evaluate the full state at altitudes read one per line, streaming (CSV by default).
    #[command(after_help = "Examples:\n  printf '0\\n11000\\n' | aerostrata eval --offset -10\n  \
                            printf '120000\\n400000\\n' | aerostrata eval --species")]
    Eval(EvalArgs),
    /// Scan a flight (CSV of time_s,altitude_m,velocity_m_s), streaming: per-sample q,
    /// Mach, Reynolds number and drag on stdout, the summary (max q, max Mach, Mach 1
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
    /// Draw an SVG plot: state quantities against altitude for several models, or a
    /// flight's q and Mach number against time with the maximum q marked.
    #[command(subcommand)]
    Plot(plotting::PlotCommand),
    /// Print a shell completion script.
    #[command(
        after_help = "Example:\n  aerostrata completions bash > ~/.local/share/bash-completion/completions/aerostrata"
    )]
    Completions(CompletionsArgs),
    /// Print the manual page (roff), of the tool or of one subcommand.
    #[command(after_help = "Example:\n  aerostrata man | man -l -")]
    Man(ManArgs),
}

/// Units and destination, common to the commands that write data.
#[derive(Args)]
pub struct OutputArgs {
    /// Units of every input and output: si (m, m/s, K, Pa, kg/m3) or us (ft, ft/s,
    /// airspeeds in kt, degF, psf, altimetry in inHg, slug/ft3, lbf).
    #[arg(long, value_enum, default_value_t = UnitSystem::Si)]
    pub units: UnitSystem,
    /// Write to FILE instead of stdout; a regular file appears only if the command
    /// succeeds (symbolic links are followed; a device or FIFO is written into directly).
    #[arg(long, short = 'o', value_name = "FILE")]
    pub output: Option<PathBuf>,
}

#[derive(Args)]
pub struct ModelArgs {
    /// Temperature offset dT (a hot day is positive): T = T_std + dT at the standard's
    /// pressure; K, or degF with --units us.
    #[arg(long, value_name = "DT", default_value_t = 0.0, allow_negative_numbers = true)]
    offset: f64,
    /// Read altitudes as geopotential instead of geometric.
    #[arg(long)]
    geopotential: bool,
    /// Use a sounding instead of the standard: CSV with a header of quantities and units,
    /// or JSON if the name ends in .json (docs/soundings.md). Outside its rows: an error,
    /// unless --blend is given.
    #[arg(long, value_name = "FILE")]
    sounding: Option<PathBuf>,
    /// With --sounding: beyond the first and last rows, blend into the standard over this
    /// many geopotential metres (feet with --units us).
    #[arg(long, value_name = "DEPTH", requires = "sounding")]
    blend: Option<f64>,
}

#[derive(Args)]
struct TableArgs {
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

#[derive(Args)]
struct EvalArgs {
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
    #[arg(long, value_enum, default_value_t = progress::When::Auto)]
    progress: progress::When,
    #[command(flatten)]
    model: ModelArgs,
    #[command(flatten)]
    out: OutputArgs,
}

#[derive(Args)]
struct CompletionsArgs {
    /// The shell.
    #[arg(value_enum)]
    shell: clap_complete::Shell,
    /// Write to FILE instead of stdout.
    #[arg(long, short = 'o', value_name = "FILE")]
    output: Option<PathBuf>,
}

#[derive(Args)]
struct ManArgs {
    /// A subcommand (e.g. `plot profile`) whose page to print instead of the tool's.
    subcommand: Vec<String>,
    /// Write to FILE instead of stdout.
    #[arg(long, short = 'o', value_name = "FILE")]
    output: Option<PathBuf>,
}

/// The most rows `table` will produce; a guard against a mistyped step.
const MAX_TABLE_ROWS: f64 = 1.0e6;

pub enum Failure {
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
    let cli = match Cli::try_parse() {
        Ok(cli) => cli,
        Err(error) => return usage_error(&error),
    };
    let result = match cli.command {
        Command::Table(args) => table(&args),
        Command::Eval(args) => eval(&args),
        Command::Flight(args) => flight::run(&args),
        Command::Airspeed(args) => airspeed::run(&args),
        Command::Altitude(args) => altitude::run(&args),
        Command::Plot(command) => plotting::run(&command),
        Command::Completions(args) => completions(&args),
        Command::Man(args) => man(&args),
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

/// Help and version go to stdout with status 0 (and help for a bare command to stderr
/// with status 2), as clap does; any other usage error becomes one line on stderr with
/// status 2, like every other error of the tool.
fn usage_error(error: &clap::Error) -> ExitCode {
    use clap::error::ErrorKind;
    match error.kind() {
        ErrorKind::DisplayHelp
        | ErrorKind::DisplayVersion
        | ErrorKind::DisplayHelpOnMissingArgumentOrSubcommand => {
            let _ = error.print();
            ExitCode::from(if error.use_stderr() { 2 } else { 0 })
        }
        _ => {
            eprintln!("aerostrata: {}", one_line(&error.render().to_string()));
            ExitCode::from(2)
        }
    }
}

/// clap's message on one line: without its `error:` prefix, usage and help hints.
fn one_line(message: &str) -> String {
    let parts: Vec<&str> = message
        .lines()
        .map(str::trim)
        .filter(|l| !l.is_empty() && !l.starts_with("Usage:") && !l.starts_with("For more information"))
        .map(|l| l.strip_prefix("error: ").unwrap_or(l))
        .collect();
    format!("{} (see --help)", parts.join("; "))
}

/// The model the options describe.
pub fn model(args: &ModelArgs, units: UnitSystem) -> Result<Box<dyn Atmosphere>, Failure> {
    if let Some(path) = &args.sounding {
        if args.offset != 0.0 {
            return Err(Failure::Input(
                "--offset applies to the standard and cannot be combined with --sounding".to_owned(),
            ));
        }
        let blend = args.blend.map(|depth| units.to_si(Quantity::Length, depth));
        return Ok(Box::new(sounding::load(path, blend).map_err(Failure::Input)?));
    }
    Ok(Box::new(offset_model(args.offset, units)?))
}

/// The standard with a temperature offset given in `units`.
pub fn offset_model(
    offset: f64,
    units: UnitSystem,
) -> Result<TemperatureOffset<aerostrata::Us1976>, Failure> {
    TemperatureOffset::new(US1976, units.to_si(Quantity::TemperatureDifference, offset))
        .map_err(|e| Failure::Input(format!("--offset: {e}")))
}

/// An altitude given in `units`, checked against `range`; in US units the message names
/// the value and the range in feet.
pub fn altitude_in(
    units: UnitSystem,
    value: f64,
    geopotential: bool,
    range: AltitudeRange,
) -> Result<Altitude, String> {
    let kind = if geopotential { "geopotential" } else { "geometric" };
    let meters = units.to_si(Quantity::Length, value);
    let altitude =
        if geopotential { Altitude::geopotential_m(meters) } else { Altitude::geometric_m(meters) };
    match units {
        UnitSystem::Si => altitude.and_then(|a| range.check(a)).map_err(|e| e.to_string()),
        UnitSystem::Us => {
            if !value.is_finite() {
                return Err(format!("{kind} altitude must be a finite number, got {value}"));
            }
            let (lo, hi) = if geopotential {
                (range.geopotential_min_m, range.geopotential_max_m)
            } else {
                (range.geometric_min_m, range.geometric_max_m)
            };
            let checked = altitude.and_then(|a| range.check(a));
            checked.map_err(|_| {
                let feet = |m: f64| tidy(units.from_si(Quantity::Length, m));
                format!(
                    "{kind} altitude {} ft is outside the allowed range {} to {} ft",
                    tidy(value),
                    feet(lo),
                    feet(hi)
                )
            })
        }
    }
}

/// A file, or stdin for `-` or no file, with a progress line when asked.
pub fn open_input(
    path: Option<&Path>,
    when: progress::When,
) -> Result<progress::Progress<Box<dyn BufRead>>, Failure> {
    match path {
        None => Ok(progress::Progress::new(Box::new(io::stdin().lock()), None, when)),
        Some(path) if path.as_os_str() == "-" => {
            Ok(progress::Progress::new(Box::new(io::stdin().lock()), None, when))
        }
        Some(path) => {
            let file = File::open(path)
                .map_err(|e| Failure::Input(format!("cannot open {}: {e}", path.display())))?;
            let size = file.metadata().ok().map(|m| m.len());
            Ok(progress::Progress::new(Box::new(BufReader::with_capacity(1 << 16, file)), size, when))
        }
    }
}

fn table(args: &TableArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let atmosphere = model(&args.model, units)?;
    let range = atmosphere.range();
    let (bottom, top) = if args.model.geopotential {
        (range.geopotential_min_m, range.geopotential_max_m)
    } else {
        (range.geometric_min_m, range.geometric_max_m)
    };
    let length = units.unit(Quantity::Length);
    let from = args.from.unwrap_or_else(|| length.from_si(bottom.max(0.0)));
    let to = args.to.unwrap_or_else(|| length.from_si(top.min(86_000.0)));
    let step = args.step.unwrap_or(match units {
        UnitSystem::Si => 1_000.0,
        UnitSystem::Us => 5_000.0,
    });
    let unit = length.symbol;
    let name = if unit == "m" { "metres" } else { "feet" };
    for (option, value) in [("--from", from), ("--to", to), ("--step", step)] {
        if !value.is_finite() {
            return Err(Failure::Input(format!("{option} must be a finite number of {name}, got {value}")));
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
    let destination = Destination::open(args.out.output.as_deref())?;
    let mut writer = RowWriter::new(destination, args.format, state_columns(units, false))?;
    for state in &states {
        writer.row(&state_values(state, units, None))?;
    }
    writer.finish()?.commit()
}

fn eval(args: &EvalArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let atmosphere = model(&args.model, units)?;
    if args.species && (args.model.offset != 0.0 || args.model.sounding.is_some()) {
        return Err(Failure::Input(
            "--species gives the standard's own number densities and cannot be combined with --offset or --sounding"
                .to_owned(),
        ));
    }
    let mut input = open_input(args.file.as_deref(), args.progress)?;
    let destination = Destination::open(args.out.output.as_deref())?;
    let mut writer = RowWriter::new(destination, args.format, state_columns(units, args.species))?;
    let range = atmosphere.range();
    let mut line = String::new();
    let mut line_number = 0;
    loop {
        line.clear();
        line_number += 1;
        let read = input.read_line(&mut line).map_err(|e| {
            input.clear();
            Failure::Input(format!("line {line_number}: cannot read: {e}"))
        })?;
        if read == 0 {
            break;
        }
        let text = line.trim();
        if text.is_empty() || text.starts_with('#') {
            continue;
        }
        let state =
            evaluate_line(atmosphere.as_ref(), range, text, args.model.geopotential, units).map_err(|m| {
                input.clear();
                Failure::Input(format!("line {line_number}: {m}"))
            })?;
        let species = if args.species { species_at(&state) } else { None };
        writer.row(&state_values(&state, units, args.species.then_some(species)))?;
    }
    input.clear();
    writer.finish()?.commit()
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

fn evaluate_line(
    atmosphere: &dyn Atmosphere,
    range: AltitudeRange,
    text: &str,
    geopotential: bool,
    units: UnitSystem,
) -> Result<State, String> {
    let unit = if units == UnitSystem::Si { "metres" } else { "feet" };
    let value: f64 = text.parse().map_err(|_| format!("'{text}' is not an altitude (a number of {unit})"))?;
    altitude_in(units, value, geopotential, range)
        .and_then(|a| atmosphere.state(a).map_err(|e| e.to_string()))
}

fn completions(args: &CompletionsArgs) -> Result<(), Failure> {
    let mut script = Vec::new();
    clap_complete::generate(args.shell, &mut Cli::command(), "aerostrata", &mut script);
    let mut destination = Destination::open(args.output.as_deref())?;
    destination.write_all(&script)?;
    destination.commit()
}

fn man(args: &ManArgs) -> Result<(), Failure> {
    let mut command = Cli::command();
    command.build();
    let mut page = command.clone();
    let mut name = "aerostrata".to_owned();
    for word in &args.subcommand {
        let found = page.find_subcommand(word).cloned().ok_or_else(|| {
            let known: Vec<&str> = page.get_subcommands().map(|s| s.get_name()).collect();
            Failure::Input(format!(
                "man: no subcommand '{word}' under '{name}' (known: {})",
                known.join(", ")
            ))
        })?;
        name = format!("{name}-{word}");
        page = found;
    }
    let page = page.display_name(name).version(env!("CARGO_PKG_VERSION"));
    let mut destination = Destination::open(args.output.as_deref())?;
    clap_mangen::Man::new(page).render(&mut destination)?;
    destination.commit()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn usage_errors_fit_on_one_line() {
        let error = Cli::try_parse_from(["aerostrata", "eval", "--units", "metric"]).err().unwrap();
        let line = one_line(&error.render().to_string());
        assert_eq!(
            line,
            "invalid value 'metric' for '--units <UNITS>'; [possible values: si, us] (see --help)"
        );
    }

    #[test]
    fn the_command_line_is_consistent() {
        Cli::command().debug_assert();
    }

    #[test]
    fn every_subcommand_has_an_example() {
        let command = Cli::command();
        let mut stack: Vec<&clap::Command> = command.get_subcommands().collect();
        while let Some(sub) = stack.pop() {
            if sub.has_subcommands() {
                stack.extend(sub.get_subcommands());
                continue;
            }
            let help = sub.get_after_help().map(|h| h.to_string()).unwrap_or_default();
            assert!(help.contains("Example"), "{} has no example", sub.get_name());
        }
    }
}
