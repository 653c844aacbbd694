//! Scanning a flight: from samples of time, altitude and velocity, each sample's dynamic
//! pressure, Mach number, Reynolds number and drag, and a summary of the flight (maximum
//! dynamic pressure refined between samples, maximum Mach number, the Mach 1 crossings,
//! maximum drag). Streaming, one sample at a time: no allocation, any number of samples.
//!
//! The refinement of the maximum is the classical three-point parabolic (quadratic
//! Lagrange) interpolation of the sampled q(t) around its largest sample.

mod point;
mod scan;
mod summary;

pub use point::{FlightPoint, Sample, Vehicle};
pub use scan::{samples_from_slices, scan, FlightScan};
pub use summary::{Crossings, Extreme, FlightSummary, Peak};

/// Largest |time| a sample may carry, s (about 31 700 years): keeps every difference of
/// two times finite.
pub const MAX_TIME_S: f64 = 1.0e12;
