//! Water vapour in air: saturation vapour pressure, dew point, virtual temperature and
//! the density of moist air, for the tabulated (sounding) models.
//!
//! Saturation vapour pressure over liquid water with its enhancement factor in moist
//! air: A. L. Buck, "New equations for computing vapor pressure and enhancement factor",
//! J. Appl. Meteor. 20 (1981) 1527-1532, the three-coefficient form of its equations (3)
//! and (5) (coefficients from memory of the paper, checked in the tests against a
//! handbook table of the vapour pressure of water). Moist air is treated as an ideal
//! mixture of the standard's dry air (M0 = 28.9644 kg/kmol) and water vapour, which is
//! what makes the virtual temperature the temperature at which dry air would have the
//! moist air's density at the same pressure.
//!
//! Relative humidity is with respect to liquid water at every temperature, the
//! meteorological convention for soundings (WMO), also below 0 degC.

use crate::constants::SEA_LEVEL_MOLAR_MASS_KG_KMOL;
use crate::error::{positive, within, Error, Result};
use crate::gas::Air;
use crate::math::{exp, ln};
use crate::units::CELSIUS_ZERO_K;

/// Molar mass of water M_w, kg/kmol: 2 x 1.00794 + 15.9994, the IUPAC atomic weights of
/// hydrogen and oxygen (from memory).
pub const WATER_MOLAR_MASS_KG_KMOL: f64 = 18.01528;

/// epsilon = M_w / M0, the ratio of the molar masses of water and of the standard's dry
/// air (0.621 98).
pub const MOLAR_MASS_RATIO: f64 = WATER_MOLAR_MASS_KG_KMOL / SEA_LEVEL_MOLAR_MASS_KG_KMOL;

/// Lowest temperature (and dew point) at which the saturation formula is used, K
/// (-100 degC). Buck fitted it from -40 to +50 degC; below -40 degC its error grows, but
/// the vapour there is so thin that its effect on density stays below 1e-5.
/// (Written as a decimal: 273.15 - 100 in f64 is 173.14999999999998, which messages
/// would print.)
pub const MIN_TEMPERATURE_K: f64 = 173.15;

/// Highest temperature (and dew point) at which the saturation formula is used, K
/// (+60 degC, where it reads 0.4 % above the handbook value; see the tests).
pub const MAX_TEMPERATURE_K: f64 = CELSIUS_ZERO_K + 60.0;

/// Buck's coefficients: e_w = A exp(B t / (C + t)), t in degC.
const BUCK_A_PA: f64 = 611.21;
const BUCK_B: f64 = 17.502;
const BUCK_C_DEGC: f64 = 240.97;
/// Buck's enhancement factor f = F0 + F1 P with P in hPa, here per Pa.
const ENHANCEMENT_F0: f64 = 1.0007;
const ENHANCEMENT_F1_PER_PA: f64 = 3.46e-6 / 100.0;

/// Saturation vapour pressure of pure liquid water (no enhancement), Pa, at a temperature
/// the caller has checked.
#[inline]
pub(crate) fn pure_water_pa(temperature_k: f64) -> f64 {
    let t = temperature_k - CELSIUS_ZERO_K;
    BUCK_A_PA * exp(BUCK_B * t / (BUCK_C_DEGC + t))
}

/// The enhancement factor f(p) of water vapour in air, dimensionless.
#[inline]
pub(crate) fn enhancement(pressure_pa: f64) -> f64 {
    ENHANCEMENT_F0 + ENHANCEMENT_F1_PER_PA * pressure_pa
}

/// The enhancement factor as (F0, F1): f(p) = F0 + F1 p, p in Pa. The tabulated model
/// solves for pressure with the vapour pressure linear in it.
#[inline]
pub(crate) const fn enhancement_coefficients() -> (f64, f64) {
    (ENHANCEMENT_F0, ENHANCEMENT_F1_PER_PA)
}

/// Whether `temperature_k` lies in the band where the saturation formula is used.
#[inline]
pub(crate) fn in_band(temperature_k: f64) -> bool {
    (MIN_TEMPERATURE_K..=MAX_TEMPERATURE_K).contains(&temperature_k)
}

fn check_temperature(quantity: &'static str, temperature_k: f64) -> Result<f64> {
    within(quantity, "K", temperature_k, MIN_TEMPERATURE_K, MAX_TEMPERATURE_K)
}

/// A temperature within the gas's band (so that every result derived from it is finite).
fn gas_temperature(temperature_k: f64) -> Result<f64> {
    within(
        "temperature",
        "K",
        positive("temperature", "K", temperature_k)?,
        crate::gas::MIN_TEMPERATURE_K,
        crate::gas::MAX_TEMPERATURE_K,
    )
}

fn check_pressure(pressure_pa: f64) -> Result<f64> {
    within(
        "pressure",
        "Pa",
        positive("pressure", "Pa", pressure_pa)?,
        crate::gas::MIN_PRESSURE_PA,
        crate::gas::MAX_PRESSURE_PA,
    )
}

/// Saturation vapour pressure of pure liquid water at `temperature_k`, Pa (Buck 1981,
/// without the enhancement factor).
///
/// ```text
/// e_w = 611.21 Pa exp(17.502 t / (240.97 + t)),   t = T - 273.15 K in degC
/// ```
///
/// ```
/// # use aerostrata::humidity::pure_water_saturation_vapour_pressure_pa;
/// // 0 degC: 611.21 Pa, the formula's own leading coefficient.
/// assert_eq!(pure_water_saturation_vapour_pressure_pa(273.15)?, 611.21);
/// // 30 degC: 4246.9 Pa in handbook tables of the vapour pressure of water (from memory);
/// // Buck's fit is 0.08 % below it.
/// let e = pure_water_saturation_vapour_pressure_pa(303.15)?;
/// assert!((e - 4246.9).abs() < 0.002 * 4246.9);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] for NaN or infinity, [`Error::OutOfRange`] outside
/// [`MIN_TEMPERATURE_K`]..=[`MAX_TEMPERATURE_K`].
pub fn pure_water_saturation_vapour_pressure_pa(temperature_k: f64) -> Result<f64> {
    Ok(pure_water_pa(check_temperature("temperature", temperature_k)?))
}

/// Saturation vapour pressure of water vapour in moist air at `temperature_k` and total
/// pressure `pressure_pa`, Pa: Buck's saturation pressure over liquid water times his
/// enhancement factor, which accounts for the air around the vapour.
///
/// ```text
/// e_s = f(p) e_w(T),   f(p) = 1.0007 + 3.46e-6 P,   P = p / 100 Pa in hPa
/// ```
/// Source: Buck (1981), equations for e_w and f_w (from memory of the paper).
///
/// # Errors
/// As [`pure_water_saturation_vapour_pressure_pa`] for the temperature;
/// [`Error::NotFinite`], [`Error::NotPositive`] or [`Error::OutOfRange`] for a pressure
/// outside [`crate::gas::MIN_PRESSURE_PA`]..=[`crate::gas::MAX_PRESSURE_PA`].
pub fn saturation_vapour_pressure_pa(temperature_k: f64, pressure_pa: f64) -> Result<f64> {
    let t = check_temperature("temperature", temperature_k)?;
    let p = check_pressure(pressure_pa)?;
    Ok(enhancement(p) * pure_water_pa(t))
}

/// Vapour pressure of air with dew point `dew_point_k` at total pressure `pressure_pa`,
/// Pa: the saturation vapour pressure at the dew point.
///
/// ```text
/// e = f(p) e_w(T_d)
/// ```
///
/// # Errors
/// As [`saturation_vapour_pressure_pa`], for the dew point.
pub fn vapour_pressure_from_dew_point_pa(dew_point_k: f64, pressure_pa: f64) -> Result<f64> {
    let td = check_temperature("dew point", dew_point_k)?;
    let p = check_pressure(pressure_pa)?;
    Ok(enhancement(p) * pure_water_pa(td))
}

/// Dew point of air with vapour pressure `vapour_pressure_pa` at total pressure
/// `pressure_pa`, K: the exact inverse of [`vapour_pressure_from_dew_point_pa`].
///
/// ```text
/// y = ln(e / (611.21 Pa f(p))),   t_d = 240.97 y / (17.502 - y) degC
/// ```
///
/// ```
/// # use aerostrata::humidity::{dew_point_k, vapour_pressure_from_dew_point_pa};
/// let e = vapour_pressure_from_dew_point_pa(296.15, 100_000.0)?;
/// assert!((dew_point_k(e, 100_000.0)? - 296.15).abs() < 1e-9);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::NotPositive`] for a vapour pressure that is not a
/// finite positive number (dry air has no dew point); pressure errors as
/// [`saturation_vapour_pressure_pa`]; [`Error::OutOfRange`] when the dew point falls
/// outside [`MIN_TEMPERATURE_K`]..=[`MAX_TEMPERATURE_K`].
pub fn dew_point_k(vapour_pressure_pa: f64, pressure_pa: f64) -> Result<f64> {
    let e = positive("vapour pressure", "Pa", vapour_pressure_pa)?;
    let p = check_pressure(pressure_pa)?;
    check_temperature("dew point", dew_point_unchecked(e, p))
}

/// The dew point by the inverse formula, for e > 0 and p in band; may be outside the
/// formula's band (or NaN for absurd inputs), which callers check.
#[inline]
pub(crate) fn dew_point_unchecked(vapour_pressure_pa: f64, pressure_pa: f64) -> f64 {
    let y = ln(vapour_pressure_pa / (BUCK_A_PA * enhancement(pressure_pa)));
    CELSIUS_ZERO_K + BUCK_C_DEGC * y / (BUCK_B - y)
}

/// Virtual temperature of moist air at `temperature_k` with vapour pressure
/// `vapour_pressure_pa` in total pressure `pressure_pa`, K: the temperature at which dry
/// air (M0) would have the same density at the same pressure.
///
/// ```text
/// T_v = T / (1 - (e / p) (1 - epsilon)),   epsilon = M_w / M0
/// ```
/// Source: the ideal-gas law for a mixture of dry air and water vapour (the usual
/// definition, e.g. WMO Guide to Meteorological Instruments and Methods of Observation,
/// WMO-No. 8; from memory).
///
/// ```
/// # use aerostrata::humidity::virtual_temperature_k;
/// assert_eq!(virtual_temperature_k(300.0, 0.0, 100_000.0)?, 300.0);
/// let tv = virtual_temperature_k(303.15, 3_000.0, 100_000.0)?;
/// assert!((tv - 303.15 / (1.0 - 0.03 * (1.0 - 18.01528 / 28.9644))).abs() < 1e-12);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::NotPositive`] for a temperature or pressure that is
/// not finite and positive; [`Error::OutOfRange`] for a vapour pressure outside 0 to p.
pub fn virtual_temperature_k(temperature_k: f64, vapour_pressure_pa: f64, pressure_pa: f64) -> Result<f64> {
    let t = gas_temperature(temperature_k)?;
    let p = check_pressure(pressure_pa)?;
    let e = vapour_pressure(vapour_pressure_pa, p)?;
    Ok(t / (1.0 - e / p * (1.0 - MOLAR_MASS_RATIO)))
}

/// `e` if finite and within 0 <= e < p.
fn vapour_pressure(vapour_pressure_pa: f64, pressure_pa: f64) -> Result<f64> {
    let e = within("vapour pressure", "Pa", vapour_pressure_pa, 0.0, pressure_pa)?;
    if e < pressure_pa {
        Ok(e)
    } else {
        Err(Error::OutOfRange {
            quantity: "vapour pressure",
            unit: "Pa",
            value: e,
            min: 0.0,
            max: pressure_pa,
        })
    }
}

/// Mean molar mass of moist air, kg/kmol: dry air of the standard's composition mixed
/// with vapour of mole fraction x = e / p (caller-checked 0 <= x < 1).
#[inline]
pub(crate) fn moist_molar_mass(vapour_mole_fraction: f64) -> f64 {
    SEA_LEVEL_MOLAR_MASS_KG_KMOL * (1.0 - vapour_mole_fraction * (1.0 - MOLAR_MASS_RATIO))
}

/// Moist air at kinetic temperature `temperature_k`, total pressure `pressure_pa` and
/// vapour pressure `vapour_pressure_pa`, as an [`Air`] whose mean molecular weight is the
/// mixture's, so that its density is the moist density.
///
/// ```text
/// M   = M0 (1 - (e / p) (1 - epsilon))
/// rho = p M / (R* T) = p M0 / (R* T_v)
/// ```
///
/// ```
/// # use aerostrata::humidity::{moist_air, saturation_vapour_pressure_pa};
/// // Saturated air at 30 degC and 1013.25 hPa is about 1.6 % lighter than dry air.
/// let e = saturation_vapour_pressure_pa(303.15, 101_325.0)?;
/// let moist = moist_air(303.15, 101_325.0, e)?.density_kg_m3();
/// let dry = moist_air(303.15, 101_325.0, 0.0)?.density_kg_m3();
/// assert!((moist / dry - 0.984).abs() < 0.001);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// As [`virtual_temperature_k`], and as [`Air::new`].
pub fn moist_air(temperature_k: f64, pressure_pa: f64, vapour_pressure_pa: f64) -> Result<Air> {
    let p = positive("pressure", "Pa", pressure_pa)?;
    let e = vapour_pressure(vapour_pressure_pa, p)?;
    Air::new(temperature_k, p, moist_molar_mass(e / p))
}

/// The humidity quantities of air at one point, all derived from its temperature,
/// pressure and vapour pressure.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Humidity {
    /// Partial pressure of water vapour e, Pa.
    pub vapour_pressure_pa: f64,
    /// Virtual temperature T_v = T / (1 - (e / p) (1 - epsilon)), K.
    pub virtual_temperature_k: f64,
    /// Mixing ratio r = epsilon e / (p - e), kg of vapour per kg of dry air.
    pub mixing_ratio_kg_kg: f64,
    /// Specific humidity q = epsilon e / (p - (1 - epsilon) e), kg of vapour per kg of
    /// moist air.
    pub specific_humidity_kg_kg: f64,
    /// Saturation vapour pressure f(p) e_w(T), Pa; `None` where the temperature is
    /// outside the formula's band.
    pub saturation_vapour_pressure_pa: Option<f64>,
    /// Relative humidity 100 e / e_s with respect to water, %; `None` where e_s is.
    pub relative_humidity_percent: Option<f64>,
    /// Dew point, K; `None` for dry air or where the dew point falls outside the
    /// formula's band.
    pub dew_point_k: Option<f64>,
}

impl Humidity {
    /// The humidity quantities of air at `temperature_k` and `pressure_pa` holding
    /// vapour at `vapour_pressure_pa`.
    ///
    /// # Errors
    /// As [`virtual_temperature_k`], and pressure outside the band of
    /// [`saturation_vapour_pressure_pa`].
    pub fn new(temperature_k: f64, pressure_pa: f64, vapour_pressure_pa: f64) -> Result<Self> {
        let t = gas_temperature(temperature_k)?;
        let p = check_pressure(pressure_pa)?;
        let e = vapour_pressure(vapour_pressure_pa, p)?;
        Ok(Self::from_checked(t, p, e, t / (1.0 - e / p * (1.0 - MOLAR_MASS_RATIO))))
    }

    /// From values the caller guarantees: T > 0, p in the gas band, 0 <= e < p, and the
    /// virtual temperature that goes with them.
    pub(crate) fn from_checked(t: f64, p: f64, e: f64, virtual_temperature_k: f64) -> Self {
        let saturation = in_band(t).then(|| enhancement(p) * pure_water_pa(t));
        let dew_point =
            if e > 0.0 { Some(dew_point_unchecked(e, p)).filter(|td| in_band(*td)) } else { None };
        Self {
            vapour_pressure_pa: e,
            virtual_temperature_k,
            mixing_ratio_kg_kg: MOLAR_MASS_RATIO * e / (p - e),
            specific_humidity_kg_kg: MOLAR_MASS_RATIO * e / (p - (1.0 - MOLAR_MASS_RATIO) * e),
            saturation_vapour_pressure_pa: saturation,
            relative_humidity_percent: saturation.map(|es| 100.0 * e / es),
            dew_point_k: dew_point,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn dew_point_inverts_the_saturation_formula_across_the_band() {
        let mut t = MIN_TEMPERATURE_K;
        while t <= MAX_TEMPERATURE_K {
            for p in [5_000.0, 50_000.0, 101_325.0] {
                let e = vapour_pressure_from_dew_point_pa(t, p).unwrap();
                let back = dew_point_k(e, p).unwrap();
                // ln and exp each within 1 ulp; the quotient amplifies that by at most
                // (C + t)^2 / (B C), a few units: 1e-10 K is far above it.
                assert!((back - t).abs() < 1e-10, "{t} K at {p} Pa came back as {back} K");
            }
            t += 0.5;
        }
    }

    #[test]
    fn humidity_of_dry_air_has_no_dew_point_and_zero_ratios() {
        let h = Humidity::new(288.15, 101_325.0, 0.0).unwrap();
        assert_eq!(h.virtual_temperature_k, 288.15);
        assert_eq!(h.mixing_ratio_kg_kg, 0.0);
        assert_eq!(h.relative_humidity_percent, Some(0.0));
        assert_eq!(h.dew_point_k, None);
    }

    #[test]
    fn saturated_air_reports_100_percent_and_its_own_temperature_as_dew_point() {
        let p = 95_000.0;
        let e = saturation_vapour_pressure_pa(300.0, p).unwrap();
        let h = Humidity::new(300.0, p, e).unwrap();
        assert!((h.relative_humidity_percent.unwrap() - 100.0).abs() < 1e-12);
        assert!((h.dew_point_k.unwrap() - 300.0).abs() < 1e-10);
    }

    #[test]
    fn bad_inputs_are_errors() {
        assert!(pure_water_saturation_vapour_pressure_pa(f64::NAN).is_err());
        assert!(pure_water_saturation_vapour_pressure_pa(400.0).is_err());
        assert!(saturation_vapour_pressure_pa(300.0, 0.0).is_err());
        assert!(dew_point_k(0.0, 1e5).is_err());
        assert!(dew_point_k(1e9, 1e9).is_err());
        assert!(virtual_temperature_k(300.0, 2e5, 1e5).is_err());
        assert!(virtual_temperature_k(300.0, 1e5, 1e5).is_err());
        assert!(moist_air(300.0, 1e5, -1.0).is_err());
    }
}
