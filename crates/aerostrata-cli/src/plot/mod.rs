//! SVG figures, for `aerostrata plot` and for the worked examples alike: the chart
//! drawing every figure goes through (its axes, palette and SVG writer), and the two
//! figures the tool draws, the profile (state quantities against altitude) and the flight
//! (q, Mach number and drag against time). Their labels are the catalogue's.

pub mod axis;
pub mod chart;
pub mod flight;
pub mod palette;
pub mod profile;
mod svg;

pub use chart::{Figure, Layout, Marker, Panel, Series};
pub use flight::{flight_figure, flight_title, trace_flight, FlightTrace, FLIGHT_PLOT_POINTS};

use aerostrata::units::Unit;
use aerostrata::Quantity;

/// An axis's title: the quantity's label and, in brackets, `unit`'s symbol
/// (`temperature (K)`); the label alone for a pure number (`Mach number`).
pub fn axis_label(quantity: Quantity, unit: &Unit) -> String {
    let label = quantity.info().label;
    match unit.symbol() {
        "" => label.to_owned(),
        symbol => format!("{label} ({symbol})"),
    }
}

/// `text` with its first letter capitalised, as a title starts (the catalogue's labels
/// are lower case but for proper names).
pub(crate) fn capitalised(mut text: String) -> String {
    if let Some(first) = text.get_mut(0..1) {
        first.make_ascii_uppercase();
    }
    text
}
