//! The use of humidity in a sounding: a row's vapour pressure from its dew point or
//! relative humidity (Buck 1981, through [`crate::humidity`]), its virtual temperature,
//! its pressure from a density, the hydrostatic pressure of a humid row (a fixed point,
//! with a bisection that always converges behind it), and the humidity at any point.

use crate::altitude::Altitude;
use crate::constants::{GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use crate::error::{Error, Result};
use crate::humidity::{self, Humidity, MOLAR_MASS_RATIO};
use crate::state::State;

use super::interpolate::Point;
use super::rows::SoundingRow;

/// Fixed-point iterations for a humid row's hydrostatic pressure before the bisection
/// that always converges takes over; real rows converge in three or four.
const FIXED_POINT_ITERATIONS: usize = 32;
/// Bisection steps: more than the 2 x 1075 halvings that can separate two positive f64.
const BISECTION_ITERATIONS: usize = 2200;

/// Air and humidity at one point of a tabulated model.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct MoistState {
    /// The full state, as [`Atmosphere::state`](crate::Atmosphere::state) gives it. Its
    /// mean molar mass is the moist air's, so its molecular-scale temperature T M0 / M is
    /// the virtual temperature and its density the moist density.
    pub state: State,
    /// The humidity quantities used.
    pub humidity: Humidity,
}

/// The state and the humidity quantities at `altitude`, from the model's values there.
///
/// Where the point does not carry its vapour pressure (between rows), it follows from the
/// virtual temperature: e / p = (1 - T / T_v) / (1 - epsilon).
pub(super) fn moist_state(altitude: Altitude, point: &Point) -> Result<MoistState> {
    let air = point.air()?;
    let vapour_pressure_pa = point.vapour_pressure_pa.unwrap_or_else(|| {
        let fraction = (1.0 - point.temperature_k / point.virtual_temperature_k) / (1.0 - MOLAR_MASS_RATIO);
        fraction.max(0.0) * point.pressure_pa
    });
    let humidity = Humidity::from_checked(
        air.temperature_k(),
        air.pressure_pa(),
        vapour_pressure_pa,
        point.virtual_temperature_k,
    );
    Ok(MoistState { state: State::new(altitude, air), humidity })
}

/// The row's vapour pressure before the enhancement factor (which depends on the
/// pressure): e_w(T_d), or RH/100 e_w(T), or 0. Rows are checked: humid ones are in band.
pub(super) fn dry_vapour_pressure_pa(row: &SoundingRow) -> f64 {
    match (row.dew_point_k, row.relative_humidity_percent) {
        (Some(td), _) => humidity::pure_water_pa(td),
        (None, Some(rh)) => rh / 100.0 * humidity::pure_water_pa(row.temperature_k),
        (None, None) => 0.0,
    }
}

/// p from rho, T and a vapour pressure e = e0 (F0 + F1 p):
/// p = rho R* T / M0 + (1 - epsilon) e, solved for p (linear in it).
pub(super) fn pressure_from_density(density_kg_m3: f64, temperature_k: f64, dry_vapour_pa: f64) -> f64 {
    let (f0, f1) = humidity::enhancement_coefficients();
    let dry = density_kg_m3 * GAS_CONSTANT_J_KMOL_K * temperature_k / SEA_LEVEL_MOLAR_MASS_KG_KMOL;
    let vapour = (1.0 - MOLAR_MASS_RATIO) * dry_vapour_pa;
    (dry + vapour * f0) / (1.0 - vapour * f1)
}

/// T_v of a row at pressure `p`, or [`Error::VapourPressureTooHigh`].
pub(super) fn virtual_temperature(
    index: usize,
    temperature_k: f64,
    dry_vapour_pa: f64,
    pressure_pa: f64,
) -> Result<f64> {
    virtual_temperature_at(temperature_k, dry_vapour_pa, pressure_pa).ok_or(Error::VapourPressureTooHigh {
        row: index,
        vapour_pressure_pa: dry_vapour_pa * humidity::enhancement(pressure_pa),
        pressure_pa,
    })
}

pub(super) fn virtual_temperature_at(
    temperature_k: f64,
    dry_vapour_pa: f64,
    pressure_pa: f64,
) -> Option<f64> {
    let fraction = dry_vapour_pa * humidity::enhancement(pressure_pa) / pressure_pa;
    (fraction < 1.0 && pressure_pa > 0.0).then(|| temperature_k / (1.0 - fraction * (1.0 - MOLAR_MASS_RATIO)))
}

/// The fixed point p = top(T_v(p)), where it converges (it does in three or four steps
/// for real rows: d ln p / d ln T_v is about half the pair's depth in scale heights, and
/// d ln T_v / d ln p about 0.4 e / p).
pub(super) fn fixed_point_row(
    temperature_k: f64,
    dry_vapour_pa: f64,
    top: impl Fn(f64) -> f64,
) -> Option<(f64, f64)> {
    let mut p = top(temperature_k);
    for _ in 0..FIXED_POINT_ITERATIONS {
        let next = top(virtual_temperature_at(temperature_k, dry_vapour_pa, p)?);
        if (next - p).abs() <= 4.0 * f64::EPSILON * p {
            return Some((next, virtual_temperature_at(temperature_k, dry_vapour_pa, next)?));
        }
        p = next;
    }
    None
}

/// The same root by bisection of g(p) = p - top(T_v(p)), which increases with p: it is
/// positive at the lower row's pressure `p_a` (the layer falls below its base) and, if
/// the row has a solution at all, negative just above the pressure at which the vapour
/// would fill the whole pressure.
pub(super) fn bisect_row(
    index: usize,
    p_a: f64,
    temperature_k: f64,
    dry_vapour_pa: f64,
    top: impl Fn(f64) -> f64,
) -> Result<(f64, f64)> {
    let (f0, f1) = humidity::enhancement_coefficients();
    let too_high = Error::VapourPressureTooHigh {
        row: index,
        vapour_pressure_pa: dry_vapour_pa * humidity::enhancement(p_a),
        pressure_pa: p_a,
    };
    let lowest = dry_vapour_pa * f0 / (1.0 - dry_vapour_pa * f1);
    if !(lowest > 0.0 && lowest < p_a) {
        return Err(too_high);
    }
    let g = |p: f64| virtual_temperature_at(temperature_k, dry_vapour_pa, p).map(|tv| p - top(tv));
    let (mut lo, mut hi) = (lowest, p_a);
    for _ in 0..BISECTION_ITERATIONS {
        let mid = 0.5 * (lo + hi);
        if mid <= lo || mid >= hi {
            break;
        }
        match g(mid) {
            Some(value) if value > 0.0 => hi = mid,
            _ => lo = mid,
        }
    }
    match (virtual_temperature_at(temperature_k, dry_vapour_pa, hi), g(hi)) {
        (Some(tv), Some(value)) if value.abs() <= 1e-9 * hi => Ok((hi, tv)),
        _ => Err(too_high),
    }
}
