//! Everything the tool writes: rows in one of four formats, the columns of a state, and
//! the `--output` destination they go to.

pub mod destination;
pub mod rows;
pub mod state;
