//! One owned value for any of the crate's models, for programs that choose a model at run
//! time and keep it (the C and WebAssembly doors' handles, for instance), without a
//! `Box<dyn Atmosphere>`. Needs `alloc` for the user layers and soundings it owns.

use alloc::vec::Vec;

use super::atmosphere::Atmosphere;
use super::exponential::Exponential;
use super::hydrostatic_offset::HydrostaticOffset;
use super::isothermal::Isothermal;
use super::layered::{Layer, Layered};
use super::offset::TemperatureOffset;
use super::sounding::{SoundingLevel, Tabulated};
use super::spec::ModelSpec;
use super::standard::{Us1976, US1976};
use crate::altitude::{Altitude, AltitudeRange};
use crate::error::Result;
use crate::gas::Air;

/// Any model of the crate, owned.
#[derive(Debug, Clone)]
#[non_exhaustive]
pub enum AnyModel {
    /// The 1976 standard itself.
    Us1976,
    /// The 1976 standard with a temperature offset.
    Standard(TemperatureOffset<Us1976>),
    /// The 1976 standard with a temperature offset, in hydrostatic balance.
    HydrostaticOffset(HydrostaticOffset),
    /// An exponential density profile.
    Exponential(Exponential),
    /// An isothermal atmosphere.
    Isothermal(Isothermal),
    /// User layers of constant lapse rate.
    Layers(Layered<Vec<Layer>>),
    /// A sounding or other tabulated profile.
    Sounding(Tabulated<Vec<SoundingLevel>>),
}

impl AnyModel {
    /// The 1976 standard with every temperature shifted by `offset_k`, K, at the
    /// standard's pressure: [`AnyModel::Us1976`] itself for an offset of exactly 0, which
    /// skips the offset's work (the bits are the plain standard's either way:
    /// [`Air::at_temperature`] at the same temperature changes nothing).
    ///
    /// # Errors
    /// As [`TemperatureOffset::new`]: [`Error::NotFinite`](crate::Error::NotFinite) for a
    /// NaN or infinite offset.
    pub fn standard(offset_k: f64) -> Result<Self> {
        let offset = TemperatureOffset::new(US1976, offset_k)?;
        Ok(if offset_k == 0.0 { Self::Us1976 } else { Self::Standard(offset) })
    }
}

impl AnyModel {
    /// The model a spec names, for the specs that need no file (`standard`, `offset`,
    /// `hydrostatic-offset`, `isothermal`, `exponential`); `None` for `sounding` and `layers`, whose files the
    /// door reads.
    ///
    /// # Errors
    /// The model's constructor's, for parameters it refuses.
    pub fn from_spec(spec: &ModelSpec<'_>) -> Option<Result<Self>> {
        Some(match *spec {
            ModelSpec::Standard => Ok(Self::Us1976),
            ModelSpec::Offset { offset_k } => Self::standard(offset_k),
            ModelSpec::HydrostaticOffset { offset_k, sea_level_pressure_pa } => {
                HydrostaticOffset::new(offset_k, sea_level_pressure_pa).map(Self::HydrostaticOffset)
            }
            ModelSpec::Isothermal { temperature_k, pressure_pa } => {
                Isothermal::new(temperature_k, pressure_pa).map(Self::Isothermal)
            }
            ModelSpec::Exponential { density_kg_m3, scale_height_m, temperature_k } => {
                Exponential::new(density_kg_m3, scale_height_m, temperature_k).map(Self::Exponential)
            }
            _ => return None,
        })
    }
}

impl Atmosphere for AnyModel {
    fn range(&self) -> AltitudeRange {
        match self {
            Self::Us1976 => US1976.range(),
            Self::Standard(m) => m.range(),
            Self::HydrostaticOffset(m) => m.range(),
            Self::Exponential(m) => m.range(),
            Self::Isothermal(m) => m.range(),
            Self::Layers(m) => m.range(),
            Self::Sounding(m) => m.range(),
        }
    }

    fn air(&self, altitude: Altitude) -> Result<Air> {
        match self {
            Self::Us1976 => US1976.air(altitude),
            Self::Standard(m) => m.air(altitude),
            Self::HydrostaticOffset(m) => m.air(altitude),
            Self::Exponential(m) => m.air(altitude),
            Self::Isothermal(m) => m.air(altitude),
            Self::Layers(m) => m.air(altitude),
            Self::Sounding(m) => m.air(altitude),
        }
    }
}

impl From<Exponential> for AnyModel {
    fn from(model: Exponential) -> Self {
        Self::Exponential(model)
    }
}

impl From<Isothermal> for AnyModel {
    fn from(model: Isothermal) -> Self {
        Self::Isothermal(model)
    }
}

impl From<Layered<Vec<Layer>>> for AnyModel {
    fn from(model: Layered<Vec<Layer>>) -> Self {
        Self::Layers(model)
    }
}

impl From<Tabulated<Vec<SoundingLevel>>> for AnyModel {
    fn from(model: Tabulated<Vec<SoundingLevel>>) -> Self {
        Self::Sounding(model)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_zero_offset_is_the_standard_itself_and_others_delegate() {
        let h = Altitude::geometric_m(11_000.0).unwrap();
        let plain = US1976.state(h).unwrap();
        assert!(matches!(AnyModel::standard(0.0).unwrap(), AnyModel::Us1976));
        assert_eq!(AnyModel::standard(0.0).unwrap().state(h).unwrap(), plain);
        let hot = AnyModel::standard(15.0).unwrap();
        assert_eq!(hot.state(h).unwrap(), TemperatureOffset::new(US1976, 15.0).unwrap().state(h).unwrap());
        assert!(AnyModel::standard(f64::NAN).is_err());
        // A zero offset is the plain standard to the bit, at every altitude, through either path.
        let zero = TemperatureOffset::new(US1976, 0.0).unwrap();
        for i in 0..=1005 {
            let h = Altitude::geometric_m(-5_000.0 + 1_000.0 * f64::from(i)).unwrap();
            // Results, not states: the same error where the upper tables are not compiled in.
            assert_eq!(zero.state(h), US1976.state(h), "{h:?}");
        }
        let iso = AnyModel::from(Isothermal::new(250.0, 101_325.0).unwrap());
        assert_eq!(iso.range(), Isothermal::new(250.0, 101_325.0).unwrap().range());
        assert_eq!(iso.state(h).unwrap().temperature_k, 250.0);
    }
}
