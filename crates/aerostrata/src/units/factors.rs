//! The conversion factors to SI, each exact by definition or taken from a named source
//! (NIST Special Publication 811, 2008 edition, appendix B.8).

/// One international foot, m (exact: the international yard and pound agreement of 1959;
/// NIST SP 811 B.8 marks it exact).
pub const FOOT_M: f64 = 0.3048;
/// One inch, m (exact, as [`FOOT_M`]).
pub const INCH_M: f64 = 0.0254;
/// One statute mile, m (exact: 5280 international feet).
pub const MILE_M: f64 = 1609.344;
/// One international nautical mile, m (exact by definition, 1929).
pub const NAUTICAL_MILE_M: f64 = 1852.0;
/// One knot (international nautical mile per hour), m/s (exact: 1852/3600).
pub const KNOT_M_S: f64 = NAUTICAL_MILE_M / 3600.0;
/// One kilometre per hour, m/s (exact: 1000/3600).
pub const KILOMETRE_PER_HOUR_M_S: f64 = 1000.0 / 3600.0;
/// One mile per hour, m/s (exact: 0.44704).
pub const MILE_PER_HOUR_M_S: f64 = MILE_M / 3600.0;
/// One avoirdupois pound (mass), kg (exact, 1959).
pub const POUND_KG: f64 = 0.453_592_37;
/// Standard acceleration of gravity g_n, m/s^2 (exact by definition, CGPM 1901; the same
/// number as the 1976 standard's g0).
pub const STANDARD_GRAVITY_M_S2: f64 = 9.80665;
/// One pound-force, N (exact: 0.45359237 kg times g_n).
pub const POUND_FORCE_N: f64 = 4.448_221_615_260_5;
/// One pound-force per square foot, Pa (exact ratio of the two definitions).
pub const PSF_PA: f64 = POUND_FORCE_N / (FOOT_M * FOOT_M);
/// One pound-force per square inch, Pa (exact ratio of the two definitions).
pub const PSI_PA: f64 = POUND_FORCE_N / (INCH_M * INCH_M);
/// One conventional inch of mercury, Pa: NIST SP 811 (2008) B.8 prints 3.386 389 E+03,
/// taken here as exact (the conventional definition, 13 595.1 kg/m^3 x g_n x 1 in, gives
/// 3386.38864 Pa, 1.0e-7 relative below).
pub const INHG_PA: f64 = 3_386.389;
/// One conventional millimetre of mercury, Pa: 13 595.1 kg/m^3 x g_n x 1 mm, the
/// conventional definition (NIST SP 811 (2008) B.8 prints 1.333 224 E+02).
pub const MMHG_PA: f64 = 133.322_387_415;
/// One hectopascal, Pa (exact).
pub const HPA_PA: f64 = 100.0;
/// One millibar, Pa (exact: the same as a hectopascal).
pub const MBAR_PA: f64 = 100.0;
/// One kilopascal, Pa (exact).
pub const KPA_PA: f64 = 1000.0;
/// One slug, kg (exact: one pound-force per foot per second squared).
pub const SLUG_KG: f64 = POUND_FORCE_N / FOOT_M;
/// One square foot, m^2 (exact: the square of the international foot).
pub const SQUARE_FOOT_M2: f64 = FOOT_M * FOOT_M;
/// One cubic foot, m^3 (exact: the cube of the international foot).
pub const CUBIC_FOOT_M3: f64 = FOOT_M * FOOT_M * FOOT_M;
/// One slug per cubic foot, kg/m^3 (exact ratio of the definitions).
pub const SLUG_FT3_KG_M3: f64 = SLUG_KG / CUBIC_FOOT_M3;
/// One pound (mass) per cubic foot, kg/m^3 (exact ratio of the definitions).
pub const POUND_FT3_KG_M3: f64 = POUND_KG / CUBIC_FOOT_M3;
/// One foot per second, m/s (exact: one international foot per second).
pub const FOOT_PER_SECOND_M_S: f64 = FOOT_M;
/// One foot per second squared, m/s^2 (exact: one international foot per second squared).
pub const FOOT_PER_SECOND_SQUARED_M_S2: f64 = FOOT_M;
/// One square foot per second (kinematic viscosity), m^2/s (exact, as [`SQUARE_FOOT_M2`]).
pub const SQUARE_FOOT_PER_SECOND_M2_S: f64 = SQUARE_FOOT_M2;
/// One pound-force second per square foot (dynamic viscosity, slug/(ft s)), Pa s
/// (exact ratio of the definitions, as [`PSF_PA`]).
pub const POUND_FORCE_SECOND_PER_SQUARE_FOOT_PA_S: f64 = PSF_PA;
/// One degree Rankine (or Fahrenheit interval), K (exact: 5/9).
pub const RANKINE_K: f64 = 5.0 / 9.0;
/// One foot pound-force per second, per foot, per degree Rankine (thermal conductivity,
/// lbf/(s degR)), W/(m K) (exact ratio of the definitions: N m / (s m K) = N / (s K)).
pub const POUND_FORCE_PER_SECOND_RANKINE_W_M_K: f64 = POUND_FORCE_N / RANKINE_K;
/// Kelvin at 0 degC (exact, by the definition of the Celsius scale).
pub const CELSIUS_ZERO_K: f64 = 273.15;
/// One radian, degrees (exact: 180/pi). Angles are computed and stated in degrees, as the
/// trade states them (an angle of attack, a wind direction, q-alpha in Pa deg): the
/// degree is the angle's base unit here, and the radian converts to it.
pub const RADIAN_DEG: f64 = 180.0 / core::f64::consts::PI;

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
