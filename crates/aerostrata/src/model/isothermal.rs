//! An isothermal atmosphere: the hydrostatic law at one temperature.

use crate::altitude::{Altitude, AltitudeRange};
use crate::constants::{G0_M_S2, GAS_CONSTANT_J_KMOL_K, GMR_K_M, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use crate::error::{positive, Result};
use crate::gas::Air;
use crate::math::exp;

use super::atmosphere::Atmosphere;

/// Dry air at one temperature in hydrostatic equilibrium, in geopotential altitude.
///
/// ```text
/// p(H) = p0 exp(-H / Hs),   Hs = R* T / (M0 g0)
/// ```
/// Defined from -5 km to 1000 km geometric (common practice, no source).
///
/// ```
/// use aerostrata::{Altitude, Atmosphere, Isothermal};
/// let air = Isothermal::new(250.0, 101_325.0)?;
/// let h = air.scale_height_m();
/// let p = air.pressure_pa(Altitude::geopotential_m(h)?)?;
/// assert!((p - 101_325.0 / core::f64::consts::E).abs() < 1e-9);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Isothermal {
    temperature_k: f64,
    sea_level_pressure_pa: f64,
}

impl Isothermal {
    /// Where the model is defined: -5 km to 1000 km geometric.
    pub const RANGE: AltitudeRange = AltitudeRange::from_geometric(-5_000.0, 1_000_000.0);

    /// Air at `temperature_k` everywhere, with pressure `sea_level_pressure_pa` at H = 0.
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) or
    /// [`Error::NotPositive`](crate::Error::NotPositive) for a parameter that is not
    /// finite and positive.
    pub fn new(temperature_k: f64, sea_level_pressure_pa: f64) -> Result<Self> {
        Ok(Self {
            temperature_k: positive("temperature", "K", temperature_k)?,
            sea_level_pressure_pa: positive("sea-level pressure", "Pa", sea_level_pressure_pa)?,
        })
    }

    /// Pressure scale height R* T / (M0 g0), geopotential m.
    pub fn scale_height_m(&self) -> f64 {
        GAS_CONSTANT_J_KMOL_K * self.temperature_k / (SEA_LEVEL_MOLAR_MASS_KG_KMOL * G0_M_S2)
    }
}

impl Atmosphere for Isothermal {
    fn range(&self) -> AltitudeRange {
        Self::RANGE
    }

    /// # Errors
    /// Out of range, or a pressure that underflows to zero (very cold and very high).
    fn air(&self, altitude: Altitude) -> Result<Air> {
        let h = Self::RANGE.check(altitude)?.geopotential().meters();
        let pressure = self.sea_level_pressure_pa * exp(-GMR_K_M * h / self.temperature_k);
        Air::new(self.temperature_k, pressure, SEA_LEVEL_MOLAR_MASS_KG_KMOL)
    }
}

deserialize_through! {
    /// What deserialisation reads before [`Isothermal::new`] validates it.
    IsothermalParameters { temperature_k: f64, sea_level_pressure_pa: f64 } => Isothermal,
    Isothermal::new(temperature_k, sea_level_pressure_pa)
}
