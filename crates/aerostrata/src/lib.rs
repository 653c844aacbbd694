//! # aerostrata
//!
//! The air's properties along a flight, and the aerodynamic loads built on them, from one
//! validated, deterministic, `no_std` core: the U.S. Standard Atmosphere 1976, user
//! layers, exponential and isothermal profiles and temperature offsets, each yielding the
//! full state the standard tabulates.
//!
//! ```
//! use aerostrata::{Altitude, Atmosphere, US1976};
//!
//! // Sea level of the standard: 288.15 K, 101 325 Pa, 1.2250 kg/m^3, 340.29 m/s
//! // (U.S. Standard Atmosphere 1976, Table I; from memory of the printed table).
//! let s = US1976.state(Altitude::geometric_m(0.0)?)?;
//! assert_eq!(s.temperature_k, 288.15);
//! assert_eq!(s.pressure_pa, 101_325.0);
//! assert!((s.density_kg_m3 - 1.2250).abs() < 0.5e-4);
//! assert!((s.speed_of_sound()? - 340.29).abs() < 0.005);
//! # Ok::<(), aerostrata::Error>(())
//! ```
//!
//! Everything is SI; names carry their unit (`pressure_pa`, `density_kg_m3`). Every
//! transcendental function goes through the pure-Rust `libm` crate, so results are
//! bit-identical on x86-64, wasm32 and Cortex-M. No function panics on any input: bad
//! input is an [`Error`] that names the value and the allowed range.
//!
//! Not certified flight software: verify results independently before they carry loads,
//! lives or launches.

#![cfg_attr(not(feature = "std"), no_std)]
#![forbid(unsafe_code)]
#![warn(missing_docs)]

#[cfg(feature = "alloc")]
extern crate alloc;

// First: its macro serves the modules below.
#[macro_use]
mod deserialize;

pub mod aero;
pub mod airspeed;
pub mod altitude;
pub mod batch;
pub mod constants;
mod error;
pub mod flight;
pub mod flow;
pub mod gas;
pub mod humidity;
pub mod inverse;
mod math;
pub mod model;
pub mod quantity;
mod ratio;
pub mod solve;
mod state;
pub mod table;
pub mod units;
pub mod wind;

pub use altitude::{Altitude, AltitudeRange, GeometricAltitude, GeopotentialAltitude};
pub use error::{Error, MessagePart, Result};
pub use gas::Air;
#[cfg(feature = "alloc")]
pub use model::AnyModel;
pub use model::{AltitudeKind, MoistState, OutsideTable, SoundingLevel, SoundingRow, Tabulated};
pub use model::{
    Atmosphere, Exponential, HydrostaticOffset, Isothermal, Layer, LayerSpec, Layered, TemperatureOffset,
    Us1976, US1976,
};
pub use quantity::Quantity;
pub use state::State;

pub use aero::{DragCurve, Interpolation, RarefactionRegime};
pub use airspeed::{AirData, Airspeed, Airspeeds};
pub use flight::{FlightPoint, FlightScan, FlightSummary, Sample, Vehicle};
pub use flow::{MachBranch, NormalShock, PerfectGas};
pub use inverse::{BarometricReference, SolverSettings};

/// The README's Rust example, compiled and run as a doctest. Found through the manifest's
/// `readme`, which `cargo package` rewrites, so that the .crate's own copy is tested too.
#[cfg(doctest)]
#[doc = include_str!(concat!(env!("CARGO_MANIFEST_DIR"), "/", env!("CARGO_PKG_README")))]
struct ReadmeExample;
