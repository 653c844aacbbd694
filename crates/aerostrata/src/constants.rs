//! The defining constants of the U.S. Standard Atmosphere, 1976, and exact unit factors.
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

/// Exact conversion factors to SI, for the edges of a program (the core computes in SI).
///
/// Sources: the international foot, pound and nautical mile of 1959 (exact by definition);
/// the conventional inch of mercury, 3386.389 Pa, from NIST SP 811 (2008), appendix B.
pub mod units {
    /// One international foot, m (exact).
    pub const FOOT_M: f64 = 0.3048;
    /// One knot (international nautical mile per hour), m/s (exact: 1852/3600).
    pub const KNOT_M_S: f64 = 1852.0 / 3600.0;
    /// One pound-force, N (exact: 0.45359237 kg times g0).
    pub const POUND_FORCE_N: f64 = 4.448_221_615_260_5;
    /// One pound-force per square foot, Pa (exact ratio of the two definitions).
    pub const PSF_PA: f64 = POUND_FORCE_N / (FOOT_M * FOOT_M);
    /// One pound-force per square inch, Pa (exact ratio of the two definitions).
    pub const PSI_PA: f64 = POUND_FORCE_N / (0.0254 * 0.0254);
    /// One conventional inch of mercury, Pa (NIST SP 811).
    pub const INHG_PA: f64 = 3_386.389;
    /// One hectopascal (millibar), Pa.
    pub const HPA_PA: f64 = 100.0;
    /// One slug, kg (exact: one pound-force per foot per second squared).
    pub const SLUG_KG: f64 = POUND_FORCE_N / FOOT_M;
    /// One slug per cubic foot, kg/m^3.
    pub const SLUG_FT3_KG_M3: f64 = SLUG_KG / (FOOT_M * FOOT_M * FOOT_M);
    /// One foot per second, m/s (exact: one international foot per second).
    pub const FOOT_PER_SECOND_M_S: f64 = FOOT_M;
    /// One foot per second squared, m/s^2 (exact: one international foot per second squared).
    pub const FOOT_PER_SECOND_SQUARED_M_S2: f64 = FOOT_M;
    /// One square foot, m^2 (exact: the square of the international foot).
    pub const SQUARE_FOOT_M2: f64 = FOOT_M * FOOT_M;
    /// One cubic foot, m^3 (exact: the cube of the international foot).
    pub const CUBIC_FOOT_M3: f64 = FOOT_M * FOOT_M * FOOT_M;
    /// One square foot per second (kinematic viscosity), m^2/s (exact, as [`SQUARE_FOOT_M2`]).
    pub const SQUARE_FOOT_PER_SECOND_M2_S: f64 = SQUARE_FOOT_M2;
    /// One pound-force second per square foot (dynamic viscosity, slug/(ft s)), Pa s
    /// (exact ratio of the definitions, as [`PSF_PA`]).
    pub const POUND_FORCE_SECOND_PER_SQUARE_FOOT_PA_S: f64 = PSF_PA;
    /// One foot pound-force per second, per foot, per degree Rankine (thermal
    /// conductivity, lbf/(s degR)), W/(m K) (exact ratio of the definitions:
    /// N m / (s m K) = N / (s K)).
    pub const POUND_FORCE_PER_SECOND_RANKINE_W_M_K: f64 = POUND_FORCE_N / RANKINE_K;
    /// One degree Rankine (or Fahrenheit interval), K (exact: 5/9).
    pub const RANKINE_K: f64 = 5.0 / 9.0;
    /// Kelvin at 0 degC (exact).
    pub const CELSIUS_ZERO_K: f64 = 273.15;

    /// Fahrenheit temperature to kelvin (exact formula), through degrees Celsius so that
    /// round Fahrenheit values of the trade (59 degF) give their round kelvin (288.15 K).
    #[inline]
    pub fn fahrenheit_to_kelvin(degrees_f: f64) -> f64 {
        (degrees_f - 32.0) / 1.8 + CELSIUS_ZERO_K
    }

    /// Kelvin to Fahrenheit temperature (exact formula), through degrees Celsius so that
    /// 288.15 K prints as 59 degF, not 58.99999999999994.
    #[inline]
    pub fn kelvin_to_fahrenheit(kelvin: f64) -> f64 {
        (kelvin - CELSIUS_ZERO_K) * 1.8 + 32.0
    }
}

#[cfg(test)]
mod tests {
    use super::units::*;

    /// The fixed points of the two scales (common practice, no source): water freezes at
    /// 32 degF = 273.15 K; the standard's sea level is 59 degF = 288.15 K.
    #[test]
    fn fahrenheit_round_values_stay_round() {
        for (f, k) in [(32.0, 273.15), (59.0, 288.15), (212.0, 373.15)] {
            assert_eq!(kelvin_to_fahrenheit(k), f, "{k} K");
            assert!((fahrenheit_to_kelvin(f) - k).abs() <= 1e-13 * k, "{f} degF");
        }
        assert!((kelvin_to_fahrenheit(0.0) + 459.67).abs() < 1e-12);
        // The tropopause's 216.65 K (-56.5 degC) is -69.7 degF to the last bits.
        assert!((kelvin_to_fahrenheit(216.65) + 69.7).abs() < 1e-13);
    }

    /// The factors against NIST SP 811 (2008), appendix B.8, which prints them to 7
    /// significant digits (an asterisk there marks the exact ones).
    #[test]
    fn unit_factors_match_nist_sp_811() {
        let close = |value: f64, printed: f64| (value / printed - 1.0).abs() < 1e-6;
        assert_eq!(SQUARE_FOOT_M2, 9.290_304e-2); // exact in SP 811
        assert!(close(CUBIC_FOOT_M3, 2.831_685e-2));
        assert_eq!(SQUARE_FOOT_PER_SECOND_M2_S, 9.290_304e-2); // exact in SP 811
        assert!(close(POUND_FORCE_SECOND_PER_SQUARE_FOOT_PA_S, 4.788_026e1));
        assert!(close(SLUG_FT3_KG_M3, 5.153_788e2));
        assert!(close(PSF_PA, 4.788_026e1));
        assert_eq!(FOOT_PER_SECOND_M_S, 3.048e-1); // exact in SP 811
        assert_eq!(FOOT_PER_SECOND_SQUARED_M_S2, 3.048e-1); // exact in SP 811
                                                            // lbf/(s degR) is not printed there: it is lbf (4.448222 N) over 5/9 K per second.
        assert!(close(POUND_FORCE_PER_SECOND_RANKINE_W_M_K, 4.448_222 * 1.8));
    }
}
