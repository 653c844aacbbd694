//! The full state of the atmosphere at a point, derived from an [`Air`] in one place.

use crate::altitude::Altitude;
use crate::constants::{SEA_LEVEL_DENSITY_KG_M3, SEA_LEVEL_PRESSURE_PA, SEA_LEVEL_TEMPERATURE_K};
use crate::error::{Error, Result};
use crate::gas::{Air, COLLISION_CROSS_SECTION_M2};
use crate::quantity::Quantity;

/// Every property the U.S. Standard Atmosphere 1976 tabulates, at one altitude, in SI.
///
/// The continuum properties (speed of sound, viscosities, conductivity) are `None` where
/// the model does not define them (the rarefied upper atmosphere); the accessor methods
/// such as [`State::speed_of_sound`] turn that into an [`Error::Undefined`].
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct State {
    /// Geometric altitude Z, m.
    pub geometric_altitude_m: f64,
    /// Geopotential altitude H, m.
    pub geopotential_altitude_m: f64,
    /// Kinetic temperature T, K.
    pub temperature_k: f64,
    /// Molecular-scale temperature T_M = T M0 / M, K.
    pub molecular_temperature_k: f64,
    /// Pressure p, Pa.
    pub pressure_pa: f64,
    /// Density rho, kg/m^3.
    pub density_kg_m3: f64,
    /// Speed of sound a, m/s.
    pub speed_of_sound_m_s: Option<f64>,
    /// Dynamic viscosity mu, Pa s.
    pub dynamic_viscosity_pa_s: Option<f64>,
    /// Kinematic viscosity nu = mu / rho, m^2/s.
    pub kinematic_viscosity_m2_s: Option<f64>,
    /// Thermal conductivity k, W/(m K).
    pub thermal_conductivity_w_m_k: Option<f64>,
    /// Acceleration of gravity g, m/s^2.
    pub gravity_m_s2: f64,
    /// Pressure scale height H_p = R* T / (M g), m.
    pub pressure_scale_height_m: f64,
    /// Number density n, 1/m^3.
    pub number_density_m3: f64,
    /// Mean particle speed V, m/s.
    pub mean_particle_speed_m_s: f64,
    /// Mean free path L, m.
    pub mean_free_path_m: f64,
    /// Mean collision frequency V / L, 1/s.
    pub collision_frequency_hz: f64,
    /// Mean molecular weight M, kg/kmol.
    pub mean_molar_mass_kg_kmol: f64,
    /// Temperature ratio theta = T / T0.
    pub temperature_ratio: f64,
    /// Pressure ratio delta = p / P0.
    pub pressure_ratio: f64,
    /// Density ratio sigma = rho / rho0.
    pub density_ratio: f64,
}

impl State {
    /// The full state of `air` found at `altitude`.
    ///
    /// Infallible: [`Air`] is finite and positive by construction, and an [`Altitude`]
    /// is finite and within its band, so every derived quantity is finite.
    pub fn new(altitude: Altitude, air: Air) -> Self {
        let z = altitude.geometric();
        let gravity_m_s2 = z.gravity_m_s2();
        let density_kg_m3 = air.density_kg_m3();
        let dynamic_viscosity_pa_s = air.dynamic_viscosity_pa_s();
        let number_density_m3 = air.number_density_m3();
        let mean_particle_speed_m_s = air.mean_particle_speed_m_s();
        let mean_free_path_m = crate::gas::mean_free_path(number_density_m3);
        Self {
            geometric_altitude_m: z.meters(),
            geopotential_altitude_m: altitude.geopotential().meters(),
            temperature_k: air.temperature_k(),
            molecular_temperature_k: air.molecular_temperature_k(),
            pressure_pa: air.pressure_pa(),
            density_kg_m3,
            speed_of_sound_m_s: air.speed_of_sound_m_s(),
            dynamic_viscosity_pa_s,
            kinematic_viscosity_m2_s: dynamic_viscosity_pa_s.map(|mu| mu / density_kg_m3),
            thermal_conductivity_w_m_k: air.thermal_conductivity_w_m_k(),
            gravity_m_s2,
            pressure_scale_height_m: air.pressure_scale_height_m(gravity_m_s2),
            number_density_m3,
            mean_particle_speed_m_s,
            mean_free_path_m,
            // V / L with L = 1 / (sqrt(2) pi sigma^2 n), without dividing by L.
            collision_frequency_hz: mean_particle_speed_m_s * number_density_m3 * COLLISION_CROSS_SECTION_M2,
            mean_molar_mass_kg_kmol: air.molar_mass_kg_kmol(),
            // Divisions, not reciprocal multiplications, so that sea level gives exactly 1.
            temperature_ratio: air.temperature_k() / SEA_LEVEL_TEMPERATURE_K,
            pressure_ratio: air.pressure_pa() / SEA_LEVEL_PRESSURE_PA,
            density_ratio: density_kg_m3 / SEA_LEVEL_DENSITY_KG_M3,
        }
    }

    /// Speed of sound, m/s.
    ///
    /// # Errors
    /// [`Error::Undefined`] where the model does not define it.
    pub fn speed_of_sound(&self) -> Result<f64> {
        self.get(Quantity::SpeedOfSound)
    }

    /// Dynamic viscosity, Pa s.
    ///
    /// # Errors
    /// [`Error::Undefined`] where the model does not define it.
    pub fn dynamic_viscosity(&self) -> Result<f64> {
        self.get(Quantity::DynamicViscosity)
    }

    /// Kinematic viscosity, m^2/s.
    ///
    /// # Errors
    /// [`Error::Undefined`] where the model does not define it.
    pub fn kinematic_viscosity(&self) -> Result<f64> {
        self.get(Quantity::KinematicViscosity)
    }

    /// Thermal conductivity, W/(m K).
    ///
    /// # Errors
    /// [`Error::Undefined`] where the model does not define it.
    pub fn thermal_conductivity(&self) -> Result<f64> {
        self.get(Quantity::ThermalConductivity)
    }

    /// The value of `quantity`, in its SI unit ([`Quantity::info`]).
    ///
    /// # Errors
    /// [`Error::Undefined`] for a continuum property where the model does not define it;
    /// [`Error::NotCarried`] for a quantity that is not a property of the state (a Mach
    /// number, an airspeed).
    ///
    /// ```
    /// use aerostrata::{Altitude, Atmosphere, Quantity, US1976};
    /// let s = US1976.state(Altitude::geometric_m(11_000.0)?)?;
    /// assert_eq!(s.get(Quantity::Temperature)?, s.temperature_k);
    /// assert!(s.get(Quantity::Mach).is_err());
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    pub fn get(&self, quantity: Quantity) -> Result<f64> {
        use Quantity as Q;
        match quantity {
            Q::GeometricAltitude => Ok(self.geometric_altitude_m),
            Q::GeopotentialAltitude => Ok(self.geopotential_altitude_m),
            Q::Temperature => Ok(self.temperature_k),
            Q::MolecularTemperature => Ok(self.molecular_temperature_k),
            Q::Pressure => Ok(self.pressure_pa),
            Q::Density => Ok(self.density_kg_m3),
            Q::Gravity => Ok(self.gravity_m_s2),
            Q::PressureScaleHeight => Ok(self.pressure_scale_height_m),
            Q::NumberDensity => Ok(self.number_density_m3),
            Q::MeanParticleSpeed => Ok(self.mean_particle_speed_m_s),
            Q::MeanFreePath => Ok(self.mean_free_path_m),
            Q::CollisionFrequency => Ok(self.collision_frequency_hz),
            Q::MeanMolarMass => Ok(self.mean_molar_mass_kg_kmol),
            Q::TemperatureRatio => Ok(self.temperature_ratio),
            Q::PressureRatio => Ok(self.pressure_ratio),
            Q::DensityRatio => Ok(self.density_ratio),
            // The continuum properties, undefined in the free-molecular air.
            Q::SpeedOfSound => self.defined(quantity, self.speed_of_sound_m_s),
            Q::DynamicViscosity => self.defined(quantity, self.dynamic_viscosity_pa_s),
            Q::KinematicViscosity => self.defined(quantity, self.kinematic_viscosity_m2_s),
            Q::ThermalConductivity => self.defined(quantity, self.thermal_conductivity_w_m_k),
            other => Err(Error::NotCarried { quantity: other.name(), result: "an atmosphere state" }),
        }
    }

    fn defined(&self, quantity: Quantity, value: Option<f64>) -> Result<f64> {
        value.ok_or(Error::Undefined { quantity: quantity.label(), altitude_m: self.geometric_altitude_m })
    }

    /// Every field as (name, value), `None` for the undefined ones, in declaration order
    /// (the catalogue's order of the state's quantities, whose values [`State::get`]
    /// gives); what comparisons and tabulations iterate over.
    pub fn fields(&self) -> [(&'static str, Option<f64>); 20] {
        use Quantity as Q;
        let field = |name, quantity| (name, self.get(quantity).ok());
        [
            field("geometric_altitude_m", Q::GeometricAltitude),
            field("geopotential_altitude_m", Q::GeopotentialAltitude),
            field("temperature_k", Q::Temperature),
            field("molecular_temperature_k", Q::MolecularTemperature),
            field("pressure_pa", Q::Pressure),
            field("density_kg_m3", Q::Density),
            field("speed_of_sound_m_s", Q::SpeedOfSound),
            field("dynamic_viscosity_pa_s", Q::DynamicViscosity),
            field("kinematic_viscosity_m2_s", Q::KinematicViscosity),
            field("thermal_conductivity_w_m_k", Q::ThermalConductivity),
            field("gravity_m_s2", Q::Gravity),
            field("pressure_scale_height_m", Q::PressureScaleHeight),
            field("number_density_m3", Q::NumberDensity),
            field("mean_particle_speed_m_s", Q::MeanParticleSpeed),
            field("mean_free_path_m", Q::MeanFreePath),
            field("collision_frequency_hz", Q::CollisionFrequency),
            field("mean_molar_mass_kg_kmol", Q::MeanMolarMass),
            field("temperature_ratio", Q::TemperatureRatio),
            field("pressure_ratio", Q::PressureRatio),
            field("density_ratio", Q::DensityRatio),
        ]
    }
}

impl approx::AbsDiffEq for State {
    type Epsilon = f64;

    fn default_epsilon() -> f64 {
        f64::EPSILON
    }

    /// Every field within `epsilon` absolutely; undefined fields must be undefined in both.
    fn abs_diff_eq(&self, other: &Self, epsilon: f64) -> bool {
        self.fields().iter().zip(other.fields().iter()).all(|((_, a), (_, b))| match (a, b) {
            (Some(a), Some(b)) => a.abs_diff_eq(b, epsilon),
            (None, None) => true,
            _ => false,
        })
    }
}

impl approx::RelativeEq for State {
    fn default_max_relative() -> f64 {
        f64::EPSILON
    }

    /// Every field within `max_relative` relatively (or `epsilon` absolutely).
    fn relative_eq(&self, other: &Self, epsilon: f64, max_relative: f64) -> bool {
        self.fields().iter().zip(other.fields().iter()).all(|((_, a), (_, b))| match (a, b) {
            (Some(a), Some(b)) => a.relative_eq(b, epsilon, max_relative),
            (None, None) => true,
            _ => false,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::quantity::Group;
    use crate::{Altitude, Atmosphere, US1976};

    /// The catalogue's state quantities are the state's fields, in order, and `get` gives
    /// each field's value (or the undefined error where the field is `None`).
    #[test]
    fn get_walks_the_catalogue_in_field_order() {
        // Above 86 km only where the upper tables are compiled in.
        for z in
            [0.0, 11_000.0, 90_000.0, 500_000.0].into_iter().filter(|&z| z <= 86e3 || cfg!(feature = "upper"))
        {
            let state = US1976.state(Altitude::geometric_m(z).unwrap()).unwrap();
            let fields = state.fields();
            let quantities: Vec<Quantity> = Quantity::of_group(Group::State).collect();
            assert_eq!(quantities.len(), fields.len());
            for (quantity, (field, value)) in quantities.iter().zip(fields) {
                let info = quantity.info();
                let lower = |s: &str| s.to_ascii_lowercase();
                let expected = if info.si.suffix().is_empty() {
                    info.name.to_owned()
                } else {
                    format!("{}_{}", info.name, lower(info.si.suffix()))
                };
                assert_eq!(field, expected, "the field name is the name and the SI unit");
                match value {
                    Some(v) => assert_eq!(state.get(*quantity).unwrap(), v),
                    None => {
                        assert!(info.may_be_undefined, "{field}");
                        assert!(matches!(state.get(*quantity), Err(Error::Undefined { .. })));
                    }
                }
            }
            for quantity in Quantity::ALL.iter().filter(|q| q.info().group != Group::State) {
                assert!(matches!(state.get(*quantity), Err(Error::NotCarried { .. })), "{quantity:?}");
            }
        }
    }
}
