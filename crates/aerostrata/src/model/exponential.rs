//! An exponential density profile: the quick model of hand calculations and orbital
//! decay estimates.

use crate::altitude::{Altitude, AltitudeRange};
use crate::constants::{GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use crate::error::{positive, Result};
use crate::gas::Air;
use crate::math::exp;

use super::atmosphere::Atmosphere;

/// Density falling exponentially with geometric altitude at a fixed temperature.
///
/// ```text
/// rho(Z) = rho0 exp(-Z / H)
/// p(Z)   = rho(Z) R* T / M0       (gas law at the fixed temperature T)
/// ```
/// A density fit, not a hydrostatic model: dp/dZ = -rho g holds only when
/// H = R* T / (M0 g). Defined from -5 km to 1000 km geometric (common practice, no source).
///
/// ```
/// use aerostrata::{Altitude, Atmosphere, Exponential};
/// let air = Exponential::new(1.225, 8_500.0, 288.15)?;
/// let rho = air.density_kg_m3(Altitude::geometric_m(8_500.0)?)?;
/// assert!((rho - 1.225 / core::f64::consts::E).abs() < 1e-12);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Exponential {
    sea_level_density_kg_m3: f64,
    scale_height_m: f64,
    temperature_k: f64,
}

impl Exponential {
    /// Where the model is defined: -5 km to 1000 km geometric.
    pub const RANGE: AltitudeRange = AltitudeRange::from_geometric(-5_000.0, 1_000_000.0);

    /// A profile with density `sea_level_density_kg_m3` at Z = 0, density scale height
    /// `scale_height_m` and constant temperature `temperature_k`.
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) or
    /// [`Error::NotPositive`](crate::Error::NotPositive) for any parameter that is not
    /// finite and positive.
    pub fn new(sea_level_density_kg_m3: f64, scale_height_m: f64, temperature_k: f64) -> Result<Self> {
        Ok(Self {
            sea_level_density_kg_m3: positive("sea-level density", "kg/m^3", sea_level_density_kg_m3)?,
            scale_height_m: positive("scale height", "m", scale_height_m)?,
            temperature_k: positive("temperature", "K", temperature_k)?,
        })
    }

    /// Density scale height, m.
    pub fn scale_height_m(&self) -> f64 {
        self.scale_height_m
    }
}

impl Atmosphere for Exponential {
    fn range(&self) -> AltitudeRange {
        Self::RANGE
    }

    /// # Errors
    /// Out of range, or a density that underflows to zero (tiny scale heights).
    fn air(&self, altitude: Altitude) -> Result<Air> {
        let z = Self::RANGE.check(altitude)?.geometric().meters();
        let density = self.sea_level_density_kg_m3 * exp(-z / self.scale_height_m);
        let pressure = density * GAS_CONSTANT_J_KMOL_K * self.temperature_k / SEA_LEVEL_MOLAR_MASS_KG_KMOL;
        Air::new(self.temperature_k, pressure, SEA_LEVEL_MOLAR_MASS_KG_KMOL)
    }
}

deserialize_through! {
    /// What deserialisation reads before [`Exponential::new`] validates it.
    ExponentialParameters { sea_level_density_kg_m3: f64, scale_height_m: f64, temperature_k: f64 }
        => Exponential,
    Exponential::new(sea_level_density_kg_m3, scale_height_m, temperature_k)
}
