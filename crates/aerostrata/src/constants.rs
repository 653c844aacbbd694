//! The defining constants of the U.S. Standard Atmosphere, 1976.
//!
//! Source for every physical constant below: *U.S. Standard Atmosphere, 1976*,
//! NOAA-S/T 76-1562 (NOAA, NASA, USAF, Washington D.C., October 1976), Part 1,
//! Part 1 and its tables of adopted constants. The standard fixes these values by
//! definition; they are not the latest CODATA values and must not be "updated", or the
//! tables stop matching. Molar quantities use the standard's kilomole.

/// Standard acceleration of gravity g0, m/s^2 (also the geopotential metre's g0).
pub const G0_M_S2: f64 = 9.80665;

/// Effective Earth radius r0 used for the geopotential altitude, m.
pub const EARTH_RADIUS_M: f64 = 6_356_766.0;

/// Universal gas constant R*, J/(kmol K) (8.31432 J/(mol K)).
pub const GAS_CONSTANT_J_KMOL_K: f64 = 8_314.32;

/// Sea-level mean molecular weight M0, kg/kmol.
pub const SEA_LEVEL_MOLAR_MASS_KG_KMOL: f64 = 28.9644;

/// Avogadro constant N_A, 1/kmol.
pub const AVOGADRO_PER_KMOL: f64 = 6.022169e26;

/// Boltzmann constant k, J/K. The standard's value, equal to R*/N_A to its digits.
pub const BOLTZMANN_J_K: f64 = 1.380622e-23;

/// Mean effective collision diameter of air molecules sigma, m.
pub const COLLISION_DIAMETER_M: f64 = 3.65e-10;

/// Ratio of specific heats gamma of air, dimensionless.
pub const GAMMA: f64 = 1.4;

/// Sutherland's constant beta for the viscosity of air, kg/(s m K^1/2).
pub const SUTHERLAND_BETA: f64 = 1.458e-6;

/// Sutherland's temperature S for the viscosity of air, K.
pub const SUTHERLAND_S_K: f64 = 110.4;

/// Sea-level pressure P0, Pa.
pub const SEA_LEVEL_PRESSURE_PA: f64 = 101_325.0;

/// Sea-level temperature T0, K.
pub const SEA_LEVEL_TEMPERATURE_K: f64 = 288.15;

/// Sea-level density rho0 = P0 M0 / (R* T0), kg/m^3 (1.2250 in the standard's table).
///
/// Derived rather than typed, so that the density ratio sigma is exactly 1 at sea level.
pub const SEA_LEVEL_DENSITY_KG_M3: f64 =
    SEA_LEVEL_PRESSURE_PA * SEA_LEVEL_MOLAR_MASS_KG_KMOL / (GAS_CONSTANT_J_KMOL_K * SEA_LEVEL_TEMPERATURE_K);

/// Coefficients of the standard's thermal-conductivity formula
/// k = 2.64638e-3 T^1.5 / (T + 245.4 * 10^(-12/T)), W/(m K).
pub const CONDUCTIVITY_COEFFICIENT: f64 = 2.64638e-3;
/// See [`CONDUCTIVITY_COEFFICIENT`], K.
pub const CONDUCTIVITY_TEMPERATURE_K: f64 = 245.4;
/// See [`CONDUCTIVITY_COEFFICIENT`], K.
pub const CONDUCTIVITY_EXPONENT_K: f64 = 12.0;

/// g0 M0 / R*, the hydrostatic constant of the lower atmosphere, K/m.
pub(crate) const GMR_K_M: f64 = G0_M_S2 * SEA_LEVEL_MOLAR_MASS_KG_KMOL / GAS_CONSTANT_J_KMOL_K;

/// Exact conversion factors to SI: kept at this path for compatibility; they live in
/// [`crate::units`] now, with every other unit and the parser of values with units.
pub mod units {
    pub use crate::units::{
        fahrenheit_to_kelvin, kelvin_to_fahrenheit, CELSIUS_ZERO_K, CUBIC_FOOT_M3, FOOT_M,
        FOOT_PER_SECOND_M_S, FOOT_PER_SECOND_SQUARED_M_S2, HPA_PA, INHG_PA, KNOT_M_S, POUND_FORCE_N,
        POUND_FORCE_PER_SECOND_RANKINE_W_M_K, POUND_FORCE_SECOND_PER_SQUARE_FOOT_PA_S, PSF_PA, PSI_PA,
        RANKINE_K, SLUG_FT3_KG_M3, SLUG_KG, SQUARE_FOOT_M2, SQUARE_FOOT_PER_SECOND_M2_S,
    };
}
