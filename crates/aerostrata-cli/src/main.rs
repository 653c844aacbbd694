//! `aerostrata`: standard-atmosphere tables, full-state evaluation, flight scans,
//! airspeeds, altimetry and plots from the command line.
//!
//! Exit status: 0 on success, 2 for bad input or usage (one line on stderr naming the
//! value and the allowed range), 1 for an internal or I/O failure.
//!
//! This file holds the top-level arguments, the dispatch and the exit status; each
//! subcommand, with its arguments and the examples its help ends with, lives in
//! `aerostrata_cli::commands`.

use std::io;
use std::process::ExitCode;

use aerostrata_cli::commands::{airspeed, altitude, completions, eval, flight, man, plot, quantities, table};
use aerostrata_cli::Failure;
use clap::{CommandFactory, FromArgMatches, Parser, Subcommand};

/// Air properties of the U.S. Standard Atmosphere 1976 (-5 km to 1000 km) on a
/// standard, hot or cold day, a sounding or any --model, and the aerodynamics of a flight
/// through it. Values take units (15C, 1020hPa, 35000ft); a bare number is SI.
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
    Table(table::TableArgs),
    /// Evaluate the full state at altitudes read one per line, streaming (CSV by default).
    Eval(eval::EvalArgs),
    /// Scan a flight (CSV of time_s,altitude_m,velocity_m_s), streaming: per-sample q,
    /// Mach, Reynolds number and drag on stdout, the summary (max q, max Mach, Mach 1
    /// crossings, max drag) on stderr.
    Flight(flight::FlightArgs),
    /// Convert between calibrated, equivalent and true airspeed and Mach number.
    Airspeed(airspeed::AirspeedArgs),
    /// Pressure altitude from static pressure; density altitude, QNH or pad-relative
    /// altitude, or where a model's air has the pressure, on request.
    Altitude(altitude::AltitudeArgs),
    /// Draw an SVG plot: state quantities against altitude for several models, or a
    /// flight's q, Mach number and drag against time with the maxima marked.
    #[command(subcommand)]
    Plot(plot::PlotCommand),
    /// List the quantities of the core's catalogue: names, symbols, labels, SI and US
    /// units, and the CSV column of each in either system.
    Quantities(quantities::QuantitiesArgs),
    /// Print a shell completion script.
    Completions(completions::CompletionsArgs),
    /// Print the manual page (roff), of the tool or of one subcommand.
    Man(man::ManArgs),
}

/// The command line with one rule for every option's value: any option that takes a
/// number, a text or a path (not one of a fixed list) takes one that starts with `-`
/// (`--step -1`, `--label -x`), which the option's own check then judges, so that clap
/// never refuses a negative number as an unknown option for some options and not others.
fn command() -> clap::Command {
    fn hyphen_values(command: clap::Command) -> clap::Command {
        command
            .mut_args(|arg| {
                let takes_text = !arg.is_positional()
                    && arg.get_num_args().is_none_or(|n| n.takes_values())
                    && arg.get_action().takes_values()
                    && arg.get_possible_values().is_empty();
                if takes_text {
                    arg.allow_hyphen_values(true)
                } else {
                    arg
                }
            })
            .mut_subcommands(hyphen_values)
    }
    hyphen_values(Cli::command())
}

fn main() -> ExitCode {
    let parsed = command().try_get_matches().and_then(|mut matches| Cli::from_arg_matches_mut(&mut matches));
    let cli = match parsed {
        Ok(cli) => cli,
        Err(error) => return usage_error(&error),
    };
    let result = match cli.command {
        Command::Table(args) => table::run(&args),
        Command::Eval(args) => eval::run(&args),
        Command::Flight(args) => flight::run(&args),
        Command::Airspeed(args) => airspeed::run(&args),
        Command::Altitude(args) => altitude::run(&args),
        Command::Plot(command) => plot::run(&command),
        Command::Quantities(args) => quantities::run(&args),
        Command::Completions(args) => completions::run(&args, command()),
        Command::Man(args) => man::run(&args, command()),
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
        command().debug_assert();
    }

    /// Common practice, no source: a negative number is a value wherever an option takes
    /// one; each option's own check then refuses it with the option's name (before, `--step
    /// -1`, `--plateau-fraction -1` and `--width -5` were refused as unknown arguments).
    #[test]
    fn every_option_with_a_value_takes_a_leading_hyphen() {
        let mut stack = vec![command()];
        let mut checked = 0;
        while let Some(mut sub) = stack.pop() {
            sub.build();
            for arg in sub.get_arguments() {
                let free = !arg.is_positional()
                    && arg.get_action().takes_values()
                    && arg.get_possible_values().is_empty();
                if free {
                    assert!(arg.is_allow_hyphen_values_set(), "{} --{:?}", sub.get_name(), arg.get_long());
                    checked += 1;
                }
            }
            stack.extend(sub.get_subcommands().cloned());
        }
        assert!(checked > 30, "{checked}");
        for (args, option) in [
            (&["table", "--from", "0", "--to", "1", "--step", "-1"][..], "--step"),
            (&["flight", "f.csv", "--plateau-fraction", "-1"][..], "--plateau-fraction"),
            (&["plot", "flight", "f.csv", "--width", "-5"][..], "--width"),
            (&["plot", "profile", "--label", "-x"][..], ""),
        ] {
            let argv = std::iter::once("aerostrata").chain(args.iter().copied());
            match command().try_get_matches_from(argv) {
                Ok(_) => assert!(option != "--width"),
                Err(e) => {
                    let text = e.to_string();
                    assert!(!text.contains("unexpected argument"), "{args:?}: {text}");
                    assert!(text.contains(option), "{args:?}: {text}");
                }
            }
        }
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
