//! Inverse altitudes: pressure altitude, density altitude, the barometric altitude a
//! flight computer reports, and the altitude where any monotone property of any
//! [`Atmosphere`] takes a given value.
//!
//! In the lower 1976 standard (-5 km to 86 km) pressure and density altitude are closed
//! forms, one per layer: the layer equations of U.S. Standard Atmosphere 1976, Part 1,
//! solved for the altitude. Everywhere else (above 86 km, or any other model) the
//! bracketed solver of [`crate::solve`] answers, within the bound given there.

use crate::altitude::{Altitude, AltitudeRange, GeometricAltitude, GeopotentialAltitude};
use crate::constants::{GAS_CONSTANT_J_KMOL_K, GMR_K_M, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
#[cfg(doc)]
use crate::error::Error;
use crate::error::{finite, positive, within, Result};
use crate::gas::Air;
use crate::humidity;
use crate::math::{exp_m1, ln};
use crate::model::{Atmosphere, Layer, US1976};
use crate::solve::solve_bracketed;
// The settings' home is `crate::solve`; `aerostrata::inverse::SolverSettings` stays a
// public path.
pub use crate::solve::SolverSettings;

/// A property of the air that falls strictly with altitude in every hydrostatic model,
/// for [`altitude_of`].
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Property {
    /// Pressure, Pa.
    Pressure,
    /// Density, kg/m^3.
    Density,
    /// Number density, 1/m^3.
    NumberDensity,
}

impl Property {
    /// The property's value for `air`.
    pub fn of(self, air: &Air) -> f64 {
        match self {
            Property::Pressure => air.pressure_pa(),
            Property::Density => air.density_kg_m3(),
            Property::NumberDensity => air.number_density_m3(),
        }
    }

    /// The property's name, as error messages give it.
    pub fn name(self) -> &'static str {
        match self {
            Property::Pressure => "pressure",
            Property::Density => "density",
            Property::NumberDensity => "number density",
        }
    }

    /// The property's SI unit.
    pub fn unit(self) -> &'static str {
        match self {
            Property::Pressure => "Pa",
            Property::Density => "kg/m^3",
            Property::NumberDensity => "1/m^3",
        }
    }
}

/// The geometric altitude where `property` of `atmosphere` equals `value`, with the
/// default settings ([`SolverSettings::ALTITUDE`]).
///
/// Solved for ln(property) (nearly linear in altitude, so the solver converges in a few
/// steps) over the model's whole [`Atmosphere::range`], so it serves any model, including
/// parts added later (such as the standard above 86 km).
///
/// ```
/// use aerostrata::inverse::{altitude_of, Property};
/// use aerostrata::{Altitude, Atmosphere, Isothermal};
/// // An invented isothermal planet-side profile; its density at 12 km, found again.
/// let air = Isothermal::new(250.0, 95_000.0)?;
/// let rho = air.density_kg_m3(Altitude::geometric_m(12_000.0)?)?;
/// let z = altitude_of(&air, Property::Density, rho)?;
/// assert!((z.meters() - 12_000.0).abs() < 1e-6);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::NotPositive`] for a value that is not finite and
/// positive; [`Error::OutOfRange`] naming the property and the values it takes at the
/// ends of the model's range when `value` lies outside them; the model's own errors.
pub fn altitude_of<A: Atmosphere + ?Sized>(
    atmosphere: &A,
    property: Property,
    value: f64,
) -> Result<GeometricAltitude> {
    altitude_of_with(atmosphere, property, value, &SolverSettings::ALTITUDE)
}

/// As [`altitude_of`] with explicit solver settings.
///
/// # Errors
/// As [`altitude_of`], and [`Error::NoConvergence`] when `settings` allow too few
/// iterations for their tolerance.
pub fn altitude_of_with<A: Atmosphere + ?Sized>(
    atmosphere: &A,
    property: Property,
    value: f64,
    settings: &SolverSettings,
) -> Result<GeometricAltitude> {
    let range = atmosphere.range();
    altitude_of_between(atmosphere, property, value, range.geometric_min_m, range.geometric_max_m, settings)
}

/// As [`altitude_of_with`] between two geometric altitudes inside the model's range.
fn altitude_of_between<A: Atmosphere + ?Sized>(
    atmosphere: &A,
    property: Property,
    value: f64,
    lo_m: f64,
    hi_m: f64,
    settings: &SolverSettings,
) -> Result<GeometricAltitude> {
    let settings = settings.checked()?;
    let value = positive(property.name(), property.unit(), value)?;
    let at = |z: f64| -> Result<f64> { Ok(property.of(&atmosphere.air(Altitude::geometric_m(z)?)?)) };
    let (v_lo, v_hi) = (at(lo_m)?, at(hi_m)?);
    let (min, max) = (v_lo.min(v_hi), v_lo.max(v_hi));
    within(property.name(), property.unit(), value, min, max)?;
    let target = ln(value);
    let residual = |z: f64| -> Result<f64> { Ok(ln(at(z)?) - target) };
    let z = solve_bracketed(
        "altitude solver",
        residual,
        lo_m,
        hi_m,
        ln(v_lo) - target,
        ln(v_hi) - target,
        &settings,
    )?;
    GeometricAltitude::new(z)
}

/// The geometric altitude where an arbitrary property of the air, `property`, equals
/// `value`, searched over the model's whole range with the bracketed solver.
///
/// `quantity` and `unit` name the property in errors. For a property that is monotone
/// in altitude the answer is unique; for any other, the solver returns one altitude where
/// the property takes the value, provided the values at the two ends of the range bracket
/// it (not necessarily the lowest such altitude).
///
/// # Errors
/// [`Error::NotFinite`] for a value or a property value that is not finite;
/// [`Error::OutOfRange`] naming `quantity` and the values at the ends of the range when
/// they do not bracket `value`; [`Error::NoConvergence`] as for [`altitude_of_with`]; the
/// model's own errors.
pub fn altitude_where<A, F>(
    atmosphere: &A,
    quantity: &'static str,
    unit: &'static str,
    property: F,
    value: f64,
    settings: &SolverSettings,
) -> Result<GeometricAltitude>
where
    A: Atmosphere + ?Sized,
    F: Fn(&Air) -> f64,
{
    let settings = settings.checked()?;
    let value = finite(quantity, value)?;
    let range = atmosphere.range();
    let at =
        |z: f64| -> Result<f64> { finite(quantity, property(&atmosphere.air(Altitude::geometric_m(z)?)?)) };
    let (lo, hi) = (range.geometric_min_m, range.geometric_max_m);
    let (v_lo, v_hi) = (at(lo)?, at(hi)?);
    within(quantity, unit, value, v_lo.min(v_hi), v_lo.max(v_hi))?;
    let residual = |z: f64| -> Result<f64> { Ok(at(z)? - value) };
    let z = solve_bracketed("altitude solver", residual, lo, hi, v_lo - value, v_hi - value, &settings)?;
    GeometricAltitude::new(z)
}

/// The band of the closed forms: the lower 1976 standard, -5 km to 86 km geometric.
const LOWER: AltitudeRange = AltitudeRange::from_geometric(-5_000.0, 86_000.0);

/// The standard's layer that holds `value` of a property falling with altitude, given the
/// property's value at each layer base (`base_value`); the first layer also serves below
/// its base (the range below sea level).
fn layer_holding(value: f64, base_value: impl Fn(&Layer) -> f64) -> &'static Layer {
    let layers = US1976.layers();
    let index = layers.partition_point(|layer| base_value(layer) >= value);
    &layers[index.saturating_sub(1)]
}

/// Geopotential altitude in `layer` where the pressure is `pressure_pa`.
///
/// ```text
/// H = Hb + (Tb / L) ((p / pb)^(-L R* / (g0 M0)) - 1)     L != 0
/// H = Hb - (R* Tb / (g0 M0)) ln(p / pb)                  L == 0
/// ```
fn layer_altitude_from_pressure(layer: &Layer, pressure_pa: f64) -> f64 {
    let log_ratio = ln(pressure_pa / layer.base_pressure_pa);
    if layer.lapse_rate_k_m == 0.0 {
        layer.base_geopotential_m - layer.base_temperature_k / GMR_K_M * log_ratio
    } else {
        let lapse = layer.lapse_rate_k_m;
        layer.base_geopotential_m + layer.base_temperature_k / lapse * exp_m1(-lapse / GMR_K_M * log_ratio)
    }
}

/// Density at a layer's base, kg/m^3 (dry air of sea-level composition, T = T_M).
fn base_density(layer: &Layer) -> f64 {
    layer.base_pressure_pa * SEA_LEVEL_MOLAR_MASS_KG_KMOL / (GAS_CONSTANT_J_KMOL_K * layer.base_temperature_k)
}

/// Geopotential altitude in `layer` where the density is `density_kg_m3`.
///
/// ```text
/// H = Hb + (Tb / L) ((rho / rhob)^(-1 / (1 + g0 M0 / (R* L))) - 1)   L != 0
/// H = Hb - (R* Tb / (g0 M0)) ln(rho / rhob)                          L == 0
/// ```
fn layer_altitude_from_density(layer: &Layer, density_kg_m3: f64) -> f64 {
    let log_ratio = ln(density_kg_m3 / base_density(layer));
    if layer.lapse_rate_k_m == 0.0 {
        layer.base_geopotential_m - layer.base_temperature_k / GMR_K_M * log_ratio
    } else {
        let lapse = layer.lapse_rate_k_m;
        let exponent = -1.0 / (1.0 + GMR_K_M / lapse);
        layer.base_geopotential_m + layer.base_temperature_k / lapse * exp_m1(exponent * log_ratio)
    }
}

/// A property of the standard at a geometric altitude (the band ends, for errors).
fn standard_property_at(property: Property, z_m: f64) -> Result<f64> {
    Ok(property.of(&US1976.air(Altitude::geometric_m(z_m)?)?))
}

/// The closed form of the lower standard for `property`, or the solver above 86 km.
fn standard_inverse(
    property: Property,
    value: f64,
    base_value: impl Fn(&Layer) -> f64,
    in_layer: impl Fn(&Layer, f64) -> f64,
) -> Result<GeopotentialAltitude> {
    let value = positive(property.name(), property.unit(), value)?;
    let h = in_layer(layer_holding(value, base_value), value);
    let range = US1976.range();
    let out_of_range = || -> Result<GeopotentialAltitude> {
        let min = standard_property_at(property, range.geometric_max_m)?;
        let max = standard_property_at(property, range.geometric_min_m)?;
        within(property.name(), property.unit(), value, min, max)?;
        // Inside by a rounding hair: the nearer end of the band.
        GeopotentialAltitude::new(if value >= max {
            LOWER.geopotential_min_m
        } else {
            LOWER.geopotential_max_m
        })
    };
    if h < LOWER.geopotential_min_m {
        return out_of_range();
    }
    if h <= LOWER.geopotential_max_m {
        return GeopotentialAltitude::new(h);
    }
    if range.geometric_max_m <= LOWER.geometric_max_m {
        return out_of_range();
    }
    // Above the lower standard: the model's upper part, solved.
    let top = standard_property_at(property, range.geometric_max_m)?;
    if value < top {
        return out_of_range();
    }
    let z = altitude_of_between(
        &US1976,
        property,
        value,
        LOWER.geometric_max_m,
        range.geometric_max_m,
        &SolverSettings::ALTITUDE,
    )?;
    Ok(z.to_geopotential())
}

/// Pressure altitude: the geopotential altitude at which the U.S. Standard Atmosphere
/// 1976 has the pressure `pressure_pa`.
///
/// This is what an altimeter set to 1013.25 hPa indicates: the standard's altitude for
/// the measured static pressure, in geopotential metres (the altitude the standard's
/// tables, and flight levels, are given in). Closed form per layer from -5 km to 86 km
/// geometric, including below sea level (the first layer carried down); above 86 km, where
/// the model provides it, the bracketed solver.
///
/// ```text
/// H = Hb + (Tb / L) ((p / pb)^(-L R* / (g0 M0)) - 1)     L != 0
/// H = Hb - (R* Tb / (g0 M0)) ln(p / pb)                  L == 0
/// ```
/// Source: the layer equations of U.S. Standard Atmosphere 1976, Part 1, solved for H.
///
/// ```
/// use aerostrata::inverse::pressure_altitude;
/// // The standard's tropopause: 22 632.06 Pa at 11 000 m' (U.S. Standard Atmosphere
/// // 1976, Table 4; from memory of the printed table, 7 digits).
/// let h = pressure_altitude(22_632.06)?;
/// assert!((h.meters() - 11_000.0).abs() < 0.01);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::NotPositive`] for a pressure that is not finite and
/// positive; [`Error::OutOfRange`] naming the pressures at the top and the bottom of the
/// standard's range when the pressure lies outside them.
pub fn pressure_altitude(pressure_pa: f64) -> Result<GeopotentialAltitude> {
    standard_inverse(Property::Pressure, pressure_pa, |l| l.base_pressure_pa, layer_altitude_from_pressure)
}

/// Density altitude: the geopotential altitude at which the U.S. Standard Atmosphere
/// 1976 has the density `density_kg_m3`.
///
/// Closed form per layer from -5 km to 86 km geometric (the density of a layer is a power
/// of its temperature, rho = rhob (T/Tb)^(-(1 + g0 M0/(R* L)))), the solver above.
///
/// ```text
/// H = Hb + (Tb / L) ((rho / rhob)^(-1 / (1 + g0 M0 / (R* L))) - 1)   L != 0
/// H = Hb - (R* Tb / (g0 M0)) ln(rho / rhob)                          L == 0
/// ```
/// Source: the layer equations of U.S. Standard Atmosphere 1976, Part 1, with the gas
/// law, solved for H.
///
/// ```
/// use aerostrata::inverse::density_altitude;
/// // 1.2250 kg/m^3 is standard sea level (the standard's Table I, 5 digits).
/// let h = density_altitude(1.2250)?;
/// assert!(h.meters().abs() < 0.5);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// As [`pressure_altitude`], for density.
pub fn density_altitude(density_kg_m3: f64) -> Result<GeopotentialAltitude> {
    standard_inverse(Property::Density, density_kg_m3, base_density, layer_altitude_from_density)
}

/// Density altitude from a measured static pressure `pressure_pa` and outside air
/// temperature `temperature_k`: the standard's altitude of the dry-air density
/// rho = p M0 / (R* T). Humidity, which lowers the density a little, is not included.
///
/// ```
/// use aerostrata::inverse::{density_altitude_from, pressure_altitude};
/// // A hot day at a field at standard sea-level pressure (invented): ISA + 20 K puts the
/// // density altitude 693.5136 m above the pressure altitude (computed with mpmath from
/// // the layer equation: H = (T0/L) ((T0/T)^(-1/(1 + g0 M0/(R* L))) - 1)).
/// let h = density_altitude_from(101_325.0, 308.15)?;
/// assert!((h.meters() - 693.5136).abs() < 1e-4);
/// assert_eq!(pressure_altitude(101_325.0)?.meters(), 0.0);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// As [`crate::Air::standard_composition`] for the pressure and temperature, and as
/// [`density_altitude`].
pub fn density_altitude_from(pressure_pa: f64, temperature_k: f64) -> Result<GeopotentialAltitude> {
    density_altitude(Air::standard_composition(temperature_k, pressure_pa)?.density_kg_m3())
}

/// How moist the air of [`density_altitude_humid`] is.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Moisture {
    /// The dew point, K (at most the air's temperature).
    DewPoint {
        /// Dew point, K.
        dew_point_k: f64,
    },
    /// The relative humidity with respect to liquid water, % (0 to 100).
    RelativeHumidity {
        /// Relative humidity, %.
        percent: f64,
    },
}

/// Density altitude of moist air: the standard's altitude of the density of air at
/// static pressure `pressure_pa` and temperature `temperature_k` holding water vapour as
/// `moisture` says. The vapour pressure is Buck's ([`crate::humidity`]), the density that
/// of the mixture of dry air and vapour ([`crate::humidity::moist_air`]), lighter than
/// dry air at the same pressure and temperature, so the density altitude is higher than
/// [`density_altitude_from`]'s: the difference a take-off or a launch on a humid summer
/// day feels.
///
/// ```
/// use aerostrata::inverse::{density_altitude_from, density_altitude_humid, Moisture};
/// // An invented humid afternoon at a coastal pad: 1008 hPa, 32 degC, dew point 26 degC.
/// let dry = density_altitude_from(100_800.0, 305.15)?.meters();
/// let humid = density_altitude_humid(100_800.0, 305.15, Moisture::DewPoint { dew_point_k: 299.15 })?.meters();
/// // The vapour (e = 3.37 kPa) lightens the air by 1.3 %, about 130 m of density altitude.
/// assert!((humid - dry - 130.0).abs() < 10.0);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::OutOfRange`] for a dew point above the temperature or a relative humidity
/// outside 0 to 100 %; as [`crate::humidity::saturation_vapour_pressure_pa`] for a
/// temperature or dew point outside Buck's band; as [`crate::humidity::moist_air`] and
/// [`density_altitude`].
pub fn density_altitude_humid(
    pressure_pa: f64,
    temperature_k: f64,
    moisture: Moisture,
) -> Result<GeopotentialAltitude> {
    let t = positive("temperature", "K", temperature_k)?;
    let e = match moisture {
        Moisture::DewPoint { dew_point_k } => {
            let td = within("dew point", "K", dew_point_k, humidity::MIN_TEMPERATURE_K, t)?;
            humidity::vapour_pressure_from_dew_point_pa(td, pressure_pa)?
        }
        Moisture::RelativeHumidity { percent } => {
            let rh = within("relative humidity", "%", percent, 0.0, 100.0)?;
            rh / 100.0 * humidity::saturation_vapour_pressure_pa(t, pressure_pa)?
        }
    };
    density_altitude(humidity::moist_air(t, pressure_pa, e)?.density_kg_m3())
}

/// What a barometric altitude is measured from.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum BarometricReference {
    /// The standard's sea level, 101 325 Pa: the result is the pressure altitude (an
    /// altimeter set to 1013.25 hPa; flight levels).
    StandardSeaLevel,
    /// An altimeter setting (QNH), Pa: the result is the altitude above mean sea level
    /// an altimeter set to it indicates (field elevation on the ground at that field).
    Qnh {
        /// The setting, Pa (1013.25 hPa is 101 325 Pa).
        setting_pa: f64,
    },
    /// The pad's own static pressure at launch, Pa: the result is the height above the
    /// pad, the way rocketry flight computers zero themselves on the pad.
    Pad {
        /// The pressure measured on the pad before launch, Pa.
        pressure_pa: f64,
    },
}

/// Barometric altitude, m: the pressure altitude of `pressure_pa` minus the pressure
/// altitude of the reference pressure.
///
/// ```text
/// h = Hp(p) - Hp(p_ref)      Hp = pressure_altitude, p_ref = 101 325 Pa, QNH or pad
/// ```
/// Convention (common practice, no source): the altimeter's scale is the standard
/// atmosphere's pressure-altitude curve, and the reference setting shifts that curve so
/// that the reference pressure reads zero (pad) or the field's elevation (QNH). The
/// result is in the standard's geopotential metres; on a day that is not standard it
/// differs from the true height by the usual altimeter temperature error (about 4 % per
/// 10 K of deviation), which this function does not correct.
///
/// ```
/// use aerostrata::inverse::{barometric_altitude_m, BarometricReference};
/// // A pad at 98 000 Pa (invented): the pad itself reads 0 above the pad.
/// let pad = BarometricReference::Pad { pressure_pa: 98_000.0 };
/// assert_eq!(barometric_altitude_m(98_000.0, pad)?, 0.0);
/// // With QNH 1013.25 hPa the altimeter reads the pressure altitude.
/// let qnh = BarometricReference::Qnh { setting_pa: 101_325.0 };
/// let standard = barometric_altitude_m(90_000.0, BarometricReference::StandardSeaLevel)?;
/// assert_eq!(barometric_altitude_m(90_000.0, qnh)?, standard);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// As [`pressure_altitude`] for `pressure_pa`; [`Error::NotFinite`] or
/// [`Error::OutOfRange`] for a QNH setting or pad pressure outside the pressures of the
/// lower standard (its values at 86 km and at -5 km).
pub fn barometric_altitude_m(pressure_pa: f64, reference: BarometricReference) -> Result<f64> {
    let reference_m = match reference {
        BarometricReference::StandardSeaLevel => 0.0,
        BarometricReference::Qnh { setting_pa } => reference_altitude("QNH setting", setting_pa)?,
        BarometricReference::Pad { pressure_pa } => reference_altitude("pad pressure", pressure_pa)?,
    };
    Ok(pressure_altitude(pressure_pa)?.meters() - reference_m)
}

/// The pressure altitude of a reference pressure, which must lie in the lower standard.
fn reference_altitude(quantity: &'static str, pressure_pa: f64) -> Result<f64> {
    let pressure_pa = finite(quantity, pressure_pa)?;
    let min = standard_property_at(Property::Pressure, LOWER.geometric_max_m)?;
    let max = standard_property_at(Property::Pressure, LOWER.geometric_min_m)?;
    within(quantity, "Pa", pressure_pa, min, max)?;
    Ok(pressure_altitude(pressure_pa)?.meters())
}
