//! A hot or cold day: any model with its temperature shifted by a constant.

use crate::altitude::{Altitude, AltitudeRange};
use crate::error::{finite, Result};
use crate::gas::Air;

use super::atmosphere::Atmosphere;

/// `base` with its temperature shifted by `offset_k` (ISA + dT).
///
/// Convention (the usual one for hot- and cold-day performance work, common practice,
/// no source): the pressure at a given geopotential altitude stays the base model's,
/// the kinetic temperature shifts by dT, and the density follows from the gas law,
/// rho = p M / (R* (T + dT)). Pressure altitude is therefore unchanged by the offset; the
/// shifted profile is not in hydrostatic balance, by the factor T / (T + dT).
///
/// ```
/// use aerostrata::{Altitude, Atmosphere, TemperatureOffset, US1976};
/// let hot = TemperatureOffset::new(US1976, 15.0)?;
/// let s = hot.state(Altitude::geopotential_m(0.0)?)?;
/// assert_eq!(s.temperature_k, 303.15);
/// assert_eq!(s.pressure_pa, 101_325.0);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct TemperatureOffset<A> {
    base: A,
    offset_k: f64,
}

impl<A: Atmosphere> TemperatureOffset<A> {
    /// `base` shifted by `offset_k` kelvin (positive for a hot day).
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) for a NaN or infinite offset.
    pub fn new(base: A, offset_k: f64) -> Result<Self> {
        Ok(Self { base, offset_k: finite("temperature offset", offset_k)? })
    }

    /// The offset, K.
    pub fn offset_k(&self) -> f64 {
        self.offset_k
    }

    /// The model underneath.
    pub fn base(&self) -> &A {
        &self.base
    }
}

impl<A: Atmosphere> Atmosphere for TemperatureOffset<A> {
    fn range(&self) -> AltitudeRange {
        self.base.range()
    }

    /// # Errors
    /// As the base model's, and [`Error::NotPositive`](crate::Error::NotPositive) when the
    /// offset takes the temperature to or below 0 K.
    fn air(&self, altitude: Altitude) -> Result<Air> {
        let base = self.base.air(altitude)?;
        base.at_temperature(base.temperature_k() + self.offset_k)
    }
}

deserialize_through! {
    /// What deserialisation reads before [`TemperatureOffset::new`] validates it.
    OffsetParameters<A: Atmosphere> { base: A, offset_k: f64 } => TemperatureOffset<A>,
    TemperatureOffset::new(base, offset_k)
}
