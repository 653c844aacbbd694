//! SVG figures, for `aerostrata plot` and for the worked examples alike: the chart
//! drawing every figure goes through, and the two figures the tool draws, the profile
//! (state quantities against altitude) and the flight (q and Mach number against time).

pub mod chart;
pub mod flight;
pub mod profile;

pub use chart::{Figure, Layout, LegendPosition, Marker, Panel, Series};
pub use flight::{flight_figure, trace_flight, FlightTrace, FLIGHT_PLOT_POINTS};
