//! A tabulated atmosphere: the rows of a weather-balloon sounding or of a site's
//! design-day profile, interpolated so that the result is exact at the rows, continuous,
//! and in hydrostatic balance between them.
//!
//! Between two rows the kinetic temperature and the virtual temperature are linear in
//! geopotential altitude and the pressure follows the layered model's hydrostatic
//! formula ([`Layer::temperature_pressure`](crate::Layer::temperature_pressure), U.S.
//! Standard Atmosphere 1976, Part 1) with the virtual temperature in place of the
//! molecular-scale one, which is the exact integral of dp/dH = -rho g0 for moist air.
//! Given pressures at both ends of a pair are met by a per-pair effective gravity (see
//! [`Tabulated`]). Humidity: Buck (1981), in [`crate::humidity`].
//!
//! The files follow the data: rows.rs (the rows as given and as kept, and their checks),
//! moist.rs (what humidity changes), hydrostatics.rs (levels from rows), interpolate.rs
//! (between and beyond the rows), table.rs (the model), and the doors for text: csv.rs
//! (`alloc`) and serde_support.rs (`serde`).

#[cfg(feature = "alloc")]
pub mod csv;
mod hydrostatics;
mod interpolate;
mod moist;
mod rows;
#[cfg(feature = "serde")]
mod serde_support;
mod table;
#[cfg(feature = "alloc")]
mod winds;

pub use hydrostatics::{MAX_HYDROSTATIC_RATIO, MIN_HYDROSTATIC_RATIO};
pub use interpolate::OutsideTable;
pub use moist::MoistState;
pub use rows::{SoundingLevel, SoundingRow, MIN_ROW_SPACING_M};
pub use table::Tabulated;
