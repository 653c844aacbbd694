//! Atmosphere models. A model yields the air (T, p, M) at an altitude; the full state is
//! derived from that air once, in [`State::new`](crate::State::new), for every model
//! alike. The interface is in atmosphere.rs, each model in a file of its own, the
//! standard above 86 km in upper/ and soundings in sounding/.

#[cfg(feature = "alloc")]
mod any;
mod atmosphere;
mod exponential;
mod hydrostatic_offset;
mod isothermal;
mod layered;
mod offset;
mod sounding;
pub mod spec;
mod standard;
#[cfg(any(feature = "upper", feature = "upper-loadable"))]
pub mod upper;

#[cfg(feature = "alloc")]
pub use any::AnyModel;
pub use atmosphere::Atmosphere;
pub use exponential::Exponential;
pub use hydrostatic_offset::HydrostaticOffset;
pub use isothermal::Isothermal;
pub(crate) use layered::LayerLanes;
pub use layered::{Layer, LayerSpec, Layered, MAX_LAPSE_RATE_K_M, MIN_LAYER_THICKNESS_M};
pub use offset::TemperatureOffset;
pub use spec::{ModelSpec, SpecError};
pub(crate) use standard::{lower_air_by_ratio, lower_molar_mass_ratio, LOWER_RANGE};
pub use standard::{Us1976, US1976};
// `AltitudeKind` lives in `crate::altitude`; `aerostrata::model::AltitudeKind` stays a
// public path.
pub use crate::altitude::AltitudeKind;
pub use sounding::{
    MoistState, OutsideTable, SoundingLevel, SoundingRow, Tabulated, MAX_HYDROSTATIC_RATIO,
    MIN_HYDROSTATIC_RATIO, MIN_ROW_SPACING_M,
};
// The CSV loader and writer of soundings (`alloc`); its home is model/sounding/csv.rs.
#[cfg(feature = "alloc")]
pub use sounding::csv as sounding_io;
