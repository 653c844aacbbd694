//! Everything the tool reads: files or stdin with a progress line, the data lines in
//! them, the samples of a flight and soundings.

pub mod lines;
pub mod progress;
pub mod samples;
pub mod sounding;
