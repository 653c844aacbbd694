//! The one interface of every model: the air (T, p, M) at an altitude of the model's
//! range. Everything else a model offers (the full state, density, pressure, temperature)
//! is derived from that air here, in one place, for every model alike.

use crate::altitude::{Altitude, AltitudeRange};
use crate::error::Result;
use crate::gas::Air;
use crate::state::State;

/// A model of the atmosphere: the air at any altitude of its range.
///
/// Implementors provide [`Atmosphere::range`] and [`Atmosphere::air`]; the rest are
/// derived. The trait is object safe (`&dyn Atmosphere` works).
pub trait Atmosphere {
    /// The closed band of altitudes where the model is defined.
    fn range(&self) -> AltitudeRange;

    /// Kinetic temperature, pressure and mean molecular weight at `altitude`.
    ///
    /// # Errors
    /// [`Error::OutOfRange`](crate::Error::OutOfRange) outside [`Atmosphere::range`];
    /// model-specific errors (for example a temperature offset that drives the
    /// temperature to or below 0 K).
    fn air(&self, altitude: Altitude) -> Result<Air>;

    /// The full state at `altitude`.
    ///
    /// # Errors
    /// As [`Atmosphere::air`].
    fn state(&self, altitude: Altitude) -> Result<State> {
        // `map`, not `Ok(..?)`: the state is built in place instead of copied (measured).
        self.air(altitude).map(|air| State::new(altitude, air))
    }

    /// Density at `altitude`, kg/m^3, without the rest of the state.
    ///
    /// # Errors
    /// As [`Atmosphere::air`].
    fn density_kg_m3(&self, altitude: Altitude) -> Result<f64> {
        self.air(altitude).map(|air| air.density_kg_m3())
    }

    /// Pressure at `altitude`, Pa.
    ///
    /// # Errors
    /// As [`Atmosphere::air`].
    fn pressure_pa(&self, altitude: Altitude) -> Result<f64> {
        self.air(altitude).map(|air| air.pressure_pa())
    }

    /// Kinetic temperature at `altitude`, K.
    ///
    /// # Errors
    /// As [`Atmosphere::air`].
    fn temperature_k(&self, altitude: Altitude) -> Result<f64> {
        self.air(altitude).map(|air| air.temperature_k())
    }
}

impl<A: Atmosphere + ?Sized> Atmosphere for &A {
    fn range(&self) -> AltitudeRange {
        (**self).range()
    }

    fn air(&self, altitude: Altitude) -> Result<Air> {
        (**self).air(altitude)
    }
}
