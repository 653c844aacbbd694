//! Groups of options that several subcommands share (flattened into each one's own
//! arguments), with what they build: the output's units and destination, the atmosphere,
//! the vehicle's drag; and the reading of every option that carries a dimension.

pub mod model;
pub mod output;
pub mod value;
pub mod vehicle;
