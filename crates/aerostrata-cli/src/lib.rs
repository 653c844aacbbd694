//! The library half of the `aerostrata` command-line tool: the unit systems it reads and
//! writes and the SVG figures it draws, shared with the worked examples so that their
//! plots and units match the tool's. No physics lives here: every number comes from the
//! `aerostrata` core.

pub mod format;
pub mod plot;
pub mod units;
