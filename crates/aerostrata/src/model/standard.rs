//! The U.S. Standard Atmosphere, 1976, from -5 km to 1000 km geometric altitude (to
//! 86 km without the `upper` or `upper-loadable` feature).
//!
//! Up to 86 km: seven layers of molecular-scale temperature linear in geopotential altitude up to
//! 84.852 km (the standard's Table 4), evaluated by the same [`Layered`] machinery users
//! get, plus the standard's ratio M/M0 of mean molecular weight between 80 and 86 km
//! (its Table 8), which makes the kinetic temperature T = T_M M/M0 and the mean
//! molecular weight match its tables there. Above 86 km: [`super::upper`]. Source: U.S.
//! Standard Atmosphere, 1976, NOAA-S/T 76-1562, Part 1.

use crate::altitude::{Altitude, AltitudeRange};
use crate::constants::{SEA_LEVEL_MOLAR_MASS_KG_KMOL, SEA_LEVEL_PRESSURE_PA, SEA_LEVEL_TEMPERATURE_K};
use crate::error::Result;
use crate::gas::Air;

use super::atmosphere::Atmosphere;
use super::layered::{Layer, Layered};

/// The U.S. Standard Atmosphere, 1976, -5 km to 1000 km geometric (86 km without the
/// `upper` or `upper-loadable` feature; with `upper-loadable` alone, altitudes above
/// 86 km are [`Error::UpperNotLoaded`](crate::Error::UpperNotLoaded) until
/// `model::upper::load_tables` has run).
///
/// At and below 86 km the layered lower part answers, above it the upper part; the two
/// meet at 86 km within the standard's own small discontinuity (pressure 1.05e-5 and
/// density 1.0e-5 relative; see docs/models.md). Above 86 km the continuum properties
/// (speed of sound, viscosity, conductivity) are not defined by the standard and come
/// out as `None`.
///
/// ```
/// use aerostrata::{Altitude, Atmosphere, US1976};
/// // The standard's Table I at 11 km geometric: 216.774 K, 2.2700E+04 Pa,
/// // 3.6480E-01 kg/m^3 (from memory of the printed table).
/// let s = US1976.state(Altitude::geometric_m(11_000.0)?)?;
/// assert!((s.temperature_k - 216.774).abs() <= 0.0005);
/// assert!((s.pressure_pa - 2.2700e4).abs() <= 0.5);
/// assert!((s.density_kg_m3 - 0.36480).abs() <= 0.5e-5);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Us1976;

/// The standard atmosphere, ready to use.
pub const US1976: Us1976 = Us1976;

/// Geometric range of the lower standard, m.
pub(crate) const LOWER_RANGE: AltitudeRange = AltitudeRange::from_geometric(-5_000.0, 86_000.0);

/// Geometric range of the whole model, m.
#[cfg(any(feature = "upper", feature = "upper-loadable"))]
const RANGE: AltitudeRange = AltitudeRange::from_geometric(-5_000.0, super::upper::TOP_M);
#[cfg(not(any(feature = "upper", feature = "upper-loadable")))]
const RANGE: AltitudeRange = LOWER_RANGE;

/// The standard's layers (Table 4 of the standard: base geopotential altitude, base
/// molecular-scale temperature, lapse rate). The base pressures are the standard's
/// hydrostatic chain from 101 325 Pa evaluated at 40 significant digits (mpmath) and
/// rounded to f64; a unit test rebuilds them with [`Layered::from_lapse_rates`] and
/// checks agreement. (The standard prints them as 101325.0, 22632.06, 5474.889,
/// 868.0187, 110.9063, 66.93887, 3.956420 Pa.)
pub(super) const LAYERS: [Layer; 7] = [
    layer(0.0, SEA_LEVEL_TEMPERATURE_K, SEA_LEVEL_PRESSURE_PA, -6.5e-3),
    layer(11_000.0, 216.65, 22_632.063_973_462_93, 0.0),
    layer(20_000.0, 216.65, 5_474.888_669_677_78, 1.0e-3),
    layer(32_000.0, 228.65, 868.018_684_755_227_4, 2.8e-3),
    layer(47_000.0, 270.65, 110.906_305_554_965_88, 0.0),
    layer(51_000.0, 270.65, 66.938_873_118_687_27, -2.8e-3),
    layer(71_000.0, 214.65, 3.956_420_428_040_728_7, -2.0e-3),
];

/// Top of the last layer, geopotential m (86 km geometric, rounded as the standard does);
/// the range itself runs to 86 km geometric (84 852.05 m), extending the last layer.
pub(super) const LAYERS_TOP_GEOPOTENTIAL_M: f64 = 84_852.0;

const fn layer(
    base_geopotential_m: f64,
    base_temperature_k: f64,
    base_pressure_pa: f64,
    lapse_rate_k_m: f64,
) -> Layer {
    Layer { base_geopotential_m, base_temperature_k, base_pressure_pa, lapse_rate_k_m }
}

static LOWER: Layered<[Layer; 7]> = Layered::from_trusted(LAYERS, LOWER_RANGE);

/// M/M0 from 80 km to 86 km geometric at 0.5 km steps (the standard's Table 8), linearly
/// interpolated in geometric altitude.
const MOLAR_MASS_RATIO_START_M: f64 = 80_000.0;
const MOLAR_MASS_RATIO_STEP_M: f64 = 500.0;
const MOLAR_MASS_RATIO: [f64; 13] = [
    1.000000, 0.999996, 0.999989, 0.999971, 0.999941, 0.999909, 0.999870, 0.999829, 0.999786, 0.999741,
    0.999694, 0.999641, 0.999579,
];

/// The geopotential altitude of 80 km geometric, below which M = M0 exactly.
const MOLAR_MASS_RATIO_START_GEOPOTENTIAL_M: f64 = RANGE_80KM.geopotential_min_m;
const RANGE_80KM: AltitudeRange =
    AltitudeRange::from_geometric(MOLAR_MASS_RATIO_START_M, MOLAR_MASS_RATIO_START_M);

/// M/M0 at geometric altitude `z_m` (1 below 80 km).
pub(super) fn molar_mass_ratio(z_m: f64) -> f64 {
    if z_m <= MOLAR_MASS_RATIO_START_M {
        return 1.0;
    }
    let position = (z_m - MOLAR_MASS_RATIO_START_M) / MOLAR_MASS_RATIO_STEP_M;
    // `position` is in [0, 12] for z up to 86 km; the clamp keeps the index in bounds
    // for the last few millimetres that rounding may add.
    let index = (position as usize).min(MOLAR_MASS_RATIO.len() - 2);
    let fraction = position - index as f64;
    let (lo, hi) = (MOLAR_MASS_RATIO[index], MOLAR_MASS_RATIO[index + 1]);
    lo + (hi - lo) * fraction
}

impl Us1976 {
    /// The layers of the lower standard (for inspection or to build variants).
    pub fn layers(&self) -> &'static [Layer] {
        &LAYERS
    }

    /// Number densities of N2, O, O2, Ar, He and H, 1/m^3, from 86 km to 1000 km
    /// geometric (below 150 km, where the standard lists no hydrogen, n_H is the
    /// continuation of its equation: see `model::upper::HYDROGEN_BASE_M`). The standard
    /// gives no species below 86 km.
    ///
    /// ```
    /// use aerostrata::{Altitude, US1976};
    /// # #[cfg(feature = "upper")] {
    /// // The standard's boundary values at 86 km (from memory of the printed table).
    /// let n = US1976.species(Altitude::geometric_m(86_000.0)?)?;
    /// assert!((n.n2_m3 / 1.129794e20 - 1.0).abs() < 1e-12);
    /// assert!((n.o_m3 / 8.6e16 - 1.0).abs() < 1e-12);
    /// # }
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`Error::OutOfRange`](crate::Error::OutOfRange) outside 86 km to 1000 km;
    /// [`Error::UpperNotLoaded`](crate::Error::UpperNotLoaded) with `upper-loadable` alone
    /// before the tables are loaded.
    #[cfg(any(feature = "upper", feature = "upper-loadable"))]
    pub fn species(&self, altitude: Altitude) -> Result<super::upper::Species> {
        super::upper::species_checked(altitude.geometric().meters())
    }
}

/// Whether the upper part answers for `altitude` (strictly above 86 km geometric),
/// decided in the kind of altitude the caller gave.
#[cfg(any(feature = "upper", feature = "upper-loadable"))]
fn is_upper(altitude: Altitude) -> bool {
    match altitude {
        Altitude::Geometric(z) => z.meters() > LOWER_RANGE.geometric_max_m,
        Altitude::Geopotential(h) => h.meters() > LOWER_RANGE.geopotential_max_m,
    }
}

impl Atmosphere for Us1976 {
    fn range(&self) -> AltitudeRange {
        RANGE
    }

    fn air(&self, altitude: Altitude) -> Result<Air> {
        let altitude = RANGE.check(altitude)?;
        #[cfg(any(feature = "upper", feature = "upper-loadable"))]
        if is_upper(altitude) {
            return super::upper::air(altitude.geometric().meters());
        }
        let h = altitude.geopotential().meters();
        let (molecular_temperature_k, pressure_pa) = LOWER.temperature_pressure(h);
        Ok(lower_air(altitude, h, molecular_temperature_k, pressure_pa))
    }
}

/// The lower standard's air at `altitude` (within [`LOWER_RANGE`]; `h_m` its geopotential
/// altitude) from its layers' molecular-scale temperature and pressure there.
#[inline]
fn lower_air(altitude: Altitude, h_m: f64, molecular_temperature_k: f64, pressure_pa: f64) -> Air {
    lower_air_by_ratio(molecular_temperature_k, pressure_pa, lower_molar_mass_ratio(altitude, h_m))
}

/// M/M0 of the lower standard at `altitude` (`h_m` its geopotential altitude): 1 up to
/// 80 km, then the standard's table.
#[inline]
pub(crate) fn lower_molar_mass_ratio(altitude: Altitude, h_m: f64) -> f64 {
    if h_m <= MOLAR_MASS_RATIO_START_GEOPOTENTIAL_M {
        1.0
    } else {
        molar_mass_ratio(altitude.geometric().meters())
    }
}

/// The lower standard's air from T_M, p and M/M0: T = T_M M/M0 and M = M0 M/M0 (exactly
/// T_M and M0 where the ratio is 1). Shared by [`lower_air`] and the batch path, which
/// computes the ratios of a block first.
#[inline(always)]
pub(crate) fn lower_air_by_ratio(molecular_temperature_k: f64, pressure_pa: f64, ratio: f64) -> Air {
    // The lower standard's (T, p) lie well inside Air's bands everywhere in its range
    // (a property test checks every state is finite), so they need no checks here.
    Air::trusted(molecular_temperature_k * ratio, pressure_pa, SEA_LEVEL_MOLAR_MASS_KG_KMOL * ratio)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::layered::LayerSpec;

    #[test]
    fn base_pressures_match_the_chain_rebuilt_at_run_time() {
        let specs: [LayerSpec; 7] = core::array::from_fn(|i| LayerSpec {
            top_geopotential_m: LAYERS
                .get(i + 1)
                .map_or(LAYERS_TOP_GEOPOTENTIAL_M, |l| l.base_geopotential_m),
            lapse_rate_k_m: LAYERS[i].lapse_rate_k_m,
        });
        let rebuilt = Layered::from_lapse_rates(0.0, 288.15, 101_325.0, &specs).unwrap();
        for (given, built) in LAYERS.iter().zip(rebuilt.layers()) {
            assert_eq!(given.base_geopotential_m, built.base_geopotential_m);
            // Temperatures come out of 288.15 - 0.0065 * 11000 etc. in f64: a few ulps.
            assert!(
                (given.base_temperature_k - built.base_temperature_k).abs()
                    < 1e-12 * given.base_temperature_k
            );
            // The f64 chain accumulates rounding over seven pow/exp calls (each within
            // 1 ulp): a few parts in 1e15.
            assert!((given.base_pressure_pa - built.base_pressure_pa).abs() < 1e-14 * given.base_pressure_pa);
        }
        // And the trusted layers pass the consistency check users' layers get.
        Layered::from_layers(LAYERS, LAYERS_TOP_GEOPOTENTIAL_M).unwrap();
    }

    #[test]
    fn molar_mass_ratio_hits_the_table_and_interpolates() {
        assert_eq!(molar_mass_ratio(79_999.0), 1.0);
        assert_eq!(molar_mass_ratio(86_000.0), 0.999579);
        assert_eq!(molar_mass_ratio(83_000.0), 0.999870);
        let mid = molar_mass_ratio(85_750.0);
        assert!((mid - (0.999641 + 0.999579) / 2.0).abs() < 1e-15);
    }
}
