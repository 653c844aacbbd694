//! The subcommands, one file each: its own arguments and its `run`, which `main` calls.

pub mod airspeed;
pub mod altitude;
pub mod completions;
pub mod eval;
pub mod flight;
pub mod flight_report;
pub mod flight_watch;
pub mod man;
pub mod plot;
pub mod quantities;
pub mod table;
