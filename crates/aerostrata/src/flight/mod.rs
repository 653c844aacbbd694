//! Scanning a flight: from samples of time, altitude and velocity (a speed, or a
//! ground-relative velocity with its direction, through winds aloft), each sample's
//! airspeed, dynamic pressure, Mach and Reynolds numbers, drag, total angle of attack and
//! q-alpha, total and recovery temperatures, and a summary of the flight (maximum dynamic
//! pressure refined between samples with its uncertainty, maximum Mach number, q-alpha
//! and drag, the Mach 1 crossings). Streaming, one sample at a time: no allocation, any
//! number of samples. Limits and plateaus of q(t) or any other series: [`LimitWatch`],
//! [`exceedances`], [`plateau`].
//!
//! The refinement of the maximum is the classical three-point parabolic (quadratic
//! Lagrange) interpolation of the sampled q(t) around its largest sample; its
//! uncertainty, the spread of other local fits, corners included (docs/aerodynamics.md).

mod file;
mod limits;
mod motion;
mod peak;
mod point;
mod scan;
mod summary;

use crate::quantity::Quantity;

pub use file::{
    FileLayout, FileSample, LayoutError, SampleError, VelocityGiven, EMPTY_CELL, FILE_COLUMNS,
    IMPLICIT_COLUMNS,
};
pub use limits::{exceedances, plateau, Exceedance, LimitWatch, Plateau, PLATEAU_FRACTION};
pub use motion::{Axis, BoundaryLayer, VectorSample};
pub use peak::{RESOLVED_FRACTION, SAFETY_FACTOR};
pub use point::{FlightPoint, Sample, Vehicle};
pub use scan::{samples_from_slices, scan, FlightScan};
pub use summary::{Crossings, Extreme, FlightSummary, Peak};

/// Largest |time| a sample may carry, s (about 31 700 years): keeps every difference of
/// two times finite.
pub const MAX_TIME_S: f64 = 1.0e12;

/// The ground-relative velocity's components ([`VectorSample`]), all or none.
pub const VELOCITY_COMPONENTS: [Quantity; 3] =
    [Quantity::VelocityEast, Quantity::VelocityNorth, Quantity::VelocityUp];
/// The path angles that go with a speed ([`VectorSample::from_path`]), both or none.
pub const PATH_ANGLES: [Quantity; 2] = [Quantity::FlightPathAngle, Quantity::Heading];
/// The vehicle's axis ([`Axis`]), both or none.
pub const AXIS_ANGLES: [Quantity; 2] = [Quantity::AxisElevation, Quantity::AxisAzimuth];
