//! A hot or cold day in hydrostatic balance: the 1976 standard's temperature profile
//! shifted by a constant at every geopotential altitude, and the pressure integrated
//! from a sea-level pressure through the shifted layers, in closed form per layer as the
//! standard itself does (its Part 1, equations 33a and 33b, with T_M,b + dT for the
//! standard's T_M,b). What a trajectory flown against geometric altitude needs; the
//! other convention, [`TemperatureOffset`](super::TemperatureOffset), keeps the
//! standard's pressure at each altitude (pressure altitude unchanged), as aircraft
//! performance work does.

use crate::altitude::{Altitude, AltitudeRange};
use crate::constants::SEA_LEVEL_MOLAR_MASS_KG_KMOL;
use crate::error::{within, Result};
use crate::gas::Air;

use super::atmosphere::Atmosphere;
use super::layered::{Layer, Layered};
use super::standard::{molar_mass_ratio, LAYERS, LAYERS_TOP_GEOPOTENTIAL_M, LOWER_RANGE};

/// Largest offset either way, K: keeps the coldest layer (186.87 K at 86 km in the
/// standard) well above 0 K and every temperature within [`Air`]'s band.
const MAX_OFFSET_K: f64 = 100.0;

/// The band of sea-level pressures the model accepts, Pa: far beyond any sea-level
/// pressure on Earth (about 870 to 1084 hPa) either way, so that test atmospheres fit.
const SEA_LEVEL_PRESSURE_RANGE_PA: (f64, f64) = (10_000.0, 200_000.0);

/// The 1976 standard from -5 km to 86 km geometric with every molecular-scale
/// temperature shifted by `offset_k` and the pressure in hydrostatic balance from
/// `sea_level_pressure_pa` at geopotential altitude 0.
///
/// ```text
/// T_M(H) = T_M,std(H) + dT          (the kinetic T = T_M M/M0; M = M0 below 80 km)
/// p(H)   = p_b [T_M,b / (T_M,b + L_b (H - H_b))]^(g0 M0 / (R* L_b))    L_b != 0
/// p(H)   = p_b exp(-g0 M0 (H - H_b) / (R* T_M,b))                        L_b  = 0
/// ```
///
/// with T_M,b the shifted base temperature of the layer holding H, and the base pressures
/// p_b chained upward from p(0) = `sea_level_pressure_pa` (below 0 the first layer is
/// extended, as in the standard). Between 80 and 86 km the kinetic temperature is
/// (T_M,std + dT) M/M0, which differs from T_std + dT by dT (1 - M/M0), under 0.007 K for
/// dT = 15 K.
///
/// ```
/// use aerostrata::{Altitude, Atmosphere, HydrostaticOffset, US1976};
/// let hot = HydrostaticOffset::new(15.0, 101_325.0)?;
/// let z = Altitude::geometric_m(10_000.0)?;
/// // Warmer air is less dense at a level, but the warm column also holds more mass
/// // above any height: at 10 km the balanced hot day is denser than the standard.
/// assert!(hot.density_kg_m3(z)? > US1976.density_kg_m3(z)?);
/// assert_eq!(hot.state(Altitude::geopotential_m(0.0)?)?.temperature_k, 303.15);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct HydrostaticOffset {
    offset_k: f64,
    sea_level_pressure_pa: f64,
    lower: Layered<[Layer; 7]>,
}

impl HydrostaticOffset {
    /// The standard shifted by `offset_k` kelvin (positive for a hot day) with
    /// `sea_level_pressure_pa` at geopotential altitude 0 (101 325 Pa for the standard's).
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) or
    /// [`Error::OutOfRange`](crate::Error::OutOfRange) for an offset outside -100 to
    /// 100 K (the coldest layer stays well above 0 K) or a pressure outside 10 000 to
    /// 200 000 Pa (far beyond any sea-level pressure on Earth, about 870 to 1084 hPa).
    pub fn new(offset_k: f64, sea_level_pressure_pa: f64) -> Result<Self> {
        let offset_k = within("temperature offset", "K", offset_k, -MAX_OFFSET_K, MAX_OFFSET_K)?;
        let (min, max) = SEA_LEVEL_PRESSURE_RANGE_PA;
        let sea_level_pressure_pa = within("sea-level pressure", "Pa", sea_level_pressure_pa, min, max)?;
        // The standard's layers with every base temperature shifted, and the base
        // pressures chained upward from p(0), each from the layer below's own formula.
        let mut layers = LAYERS;
        let mut below: Option<Layer> = None;
        for layer in &mut layers {
            layer.base_temperature_k += offset_k;
            layer.base_pressure_pa = match below {
                None => sea_level_pressure_pa,
                Some(previous) => previous.temperature_pressure(layer.base_geopotential_m).1,
            };
            below = Some(*layer);
        }
        // The consistency check every user model gets (continuous temperature and
        // pressure at each base, positive temperatures).
        Layered::from_layers(layers, LAYERS_TOP_GEOPOTENTIAL_M)?;
        // The same range as the standard's lower part: the first layer extended down to
        // -5 km, the last up to 86 km geometric.
        let lower = Layered::from_trusted(layers, LOWER_RANGE);
        Ok(Self { offset_k, sea_level_pressure_pa, lower })
    }

    /// The offset, K.
    pub fn offset_k(&self) -> f64 {
        self.offset_k
    }

    /// The pressure at geopotential altitude 0, Pa.
    pub fn sea_level_pressure_pa(&self) -> f64 {
        self.sea_level_pressure_pa
    }

    /// The shifted layers, lowest first (their base pressures are the hydrostatic chain).
    pub fn layers(&self) -> &[Layer] {
        self.lower.layers()
    }
}

impl Atmosphere for HydrostaticOffset {
    fn range(&self) -> AltitudeRange {
        LOWER_RANGE
    }

    fn air(&self, altitude: Altitude) -> Result<Air> {
        let altitude = LOWER_RANGE.check(altitude)?;
        let (molecular_temperature_k, pressure_pa) =
            self.lower.temperature_pressure(altitude.geopotential().meters());
        let ratio = molar_mass_ratio(altitude.geometric().meters());
        Air::new(molecular_temperature_k * ratio, pressure_pa, SEA_LEVEL_MOLAR_MASS_KG_KMOL * ratio)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::US1976;

    /// With no offset and the standard's sea-level pressure, the model is the standard:
    /// the same temperatures, the pressures to a few ulps (its base pressures are the
    /// chain in f64, the standard's typed from a 40-digit evaluation).
    #[test]
    fn no_offset_is_the_standard() {
        let same = HydrostaticOffset::new(0.0, 101_325.0).unwrap();
        for i in 0..=91 {
            let z = Altitude::geometric_m(-5_000.0 + 1_000.0 * f64::from(i)).unwrap();
            let (a, b) = (same.state(z).unwrap(), US1976.state(z).unwrap());
            assert_eq!(a.temperature_k, b.temperature_k, "{z:?}");
            assert!((a.pressure_pa / b.pressure_pa - 1.0).abs() < 1e-14, "{z:?}");
        }
    }

    #[test]
    fn out_of_band_parameters_are_refused() {
        assert!(HydrostaticOffset::new(f64::NAN, 101_325.0).is_err());
        assert!(HydrostaticOffset::new(150.0, 101_325.0).is_err());
        assert!(HydrostaticOffset::new(15.0, 1020.0).is_err());
        assert!(HydrostaticOffset::new(15.0, f64::INFINITY).is_err());
    }
}
