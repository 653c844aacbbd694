//! Everything the tool reads: files or stdin with a progress line, the data lines in
//! them, the tables among them (the samples of a flight, lists of altitudes or
//! pressures, layers), and soundings.

pub mod layers;
pub mod lines;
pub mod progress;
pub mod samples;
pub mod sounding;
pub mod table;
pub mod winds;
