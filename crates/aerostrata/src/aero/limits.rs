//! The bounds every input of [`crate::aero`] is checked against: far beyond any flight
//! through an atmosphere, and low enough that every product the formulas form stays
//! finite. They are the crate's own choices, not values from a source.

use crate::error::{within, Result};

/// Highest speed any function of [`crate::aero`] accepts, m/s: far beyond any flight through an
/// atmosphere, low enough that every product below stays finite.
pub const MAX_SPEED_M_S: f64 = 1.0e8;
/// Highest density accepted, kg/m^3 (far above any gas; the densest [`crate::Air`] is
/// below 1.3e5 kg/m^3).
pub const MAX_DENSITY_KG_M3: f64 = 1.0e6;
/// Highest static pressure accepted by the compressible dynamic pressure, Pa (the
/// ceiling of [`crate::Air`]).
pub const MAX_PRESSURE_PA: f64 = crate::gas::MAX_PRESSURE_PA;
/// Highest drag coefficient accepted (real bodies, parachutes included, stay below 3).
pub const MAX_DRAG_COEFFICIENT: f64 = 100.0;
/// Highest reference area accepted, m^2 (a square kilometre).
pub const MAX_AREA_M2: f64 = 1.0e6;
/// Highest reference length accepted, m.
pub const MAX_LENGTH_M: f64 = 1.0e6;
/// Highest dynamic pressure [`drag_n`](super::drag_n) accepts, Pa (what [`MAX_DENSITY_KG_M3`] at
/// [`MAX_SPEED_M_S`] gives, rounded up).
pub const MAX_DYNAMIC_PRESSURE_PA: f64 = 1.0e22;

/// Speed magnitude |V| if V is finite and |V| <= [`MAX_SPEED_M_S`].
#[inline]
pub(crate) fn speed(quantity: &'static str, velocity_m_s: f64) -> Result<f64> {
    within(quantity, "m/s", velocity_m_s, -MAX_SPEED_M_S, MAX_SPEED_M_S).map(f64::abs)
}
