//! The gas: properties of air that follow from its temperature, pressure and mean
//! molecular weight alone.
//!
//! Every model hands its (T, p, M) to [`Air::new`], and every state is derived from an
//! [`Air`] in one place ([`State::new`](crate::State::new)), so the formulas below exist
//! once. Formulas and constants: U.S. Standard Atmosphere 1976, Part 1 (the equations for
//! the derived properties of the lower atmosphere).

use core::f64::consts::{LN_10, PI, SQRT_2};

use crate::constants::{
    AVOGADRO_PER_KMOL, BOLTZMANN_J_K, COLLISION_DIAMETER_M, CONDUCTIVITY_COEFFICIENT,
    CONDUCTIVITY_EXPONENT_K, CONDUCTIVITY_TEMPERATURE_K, GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_MOLAR_MASS_KG_KMOL,
    SUTHERLAND_BETA, SUTHERLAND_S_K,
};
use crate::error::{positive, within, Result};

/// Lowest temperature an [`Air`] accepts, K.
pub const MIN_TEMPERATURE_K: f64 = 1.0;
/// Highest temperature an [`Air`] accepts, K.
pub const MAX_TEMPERATURE_K: f64 = 1.0e5;
/// Lowest pressure an [`Air`] accepts, Pa (far below any real atmosphere; it keeps the
/// mean free path finite).
pub const MIN_PRESSURE_PA: f64 = 1.0e-200;
/// Highest pressure an [`Air`] accepts, Pa.
pub const MAX_PRESSURE_PA: f64 = 1.0e9;
/// Lowest mean molecular weight an [`Air`] accepts, kg/kmol (atomic hydrogen is 1.008).
pub const MIN_MOLAR_MASS_KG_KMOL: f64 = 0.5;
/// Highest mean molecular weight an [`Air`] accepts, kg/kmol.
pub const MAX_MOLAR_MASS_KG_KMOL: f64 = 1.0e3;
use crate::math::{exp, sqrt};

/// A parcel of air: kinetic temperature, pressure, mean molecular weight, density and
/// number density, all finite and positive (checked on construction).
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Air {
    temperature_k: f64,
    pressure_pa: f64,
    molar_mass_kg_kmol: f64,
    density_kg_m3: f64,
    number_density_m3: f64,
    continuum: bool,
}

impl Air {
    /// Air at kinetic temperature `temperature_k` (K), pressure `pressure_pa` (Pa) and mean
    /// molecular weight `molar_mass_kg_kmol` (kg/kmol), treated as a continuum (speed of
    /// sound, viscosity and conductivity defined).
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) or
    /// [`Error::NotPositive`](crate::Error::NotPositive) for any input that is not a
    /// finite positive number (a zero pressure, for instance, from an underflowed model);
    /// [`Error::OutOfRange`](crate::Error::OutOfRange) outside the physical bands
    /// [`MIN_TEMPERATURE_K`]..=[`MAX_TEMPERATURE_K`],
    /// [`MIN_PRESSURE_PA`]..=[`MAX_PRESSURE_PA`] and
    /// [`MIN_MOLAR_MASS_KG_KMOL`]..=[`MAX_MOLAR_MASS_KG_KMOL`], which keep every derived
    /// property finite.
    pub fn new(temperature_k: f64, pressure_pa: f64, molar_mass_kg_kmol: f64) -> Result<Self> {
        let temperature_k = positive("temperature", "K", temperature_k)?;
        let pressure_pa = positive("pressure", "Pa", pressure_pa)?;
        let molar_mass_kg_kmol = positive("mean molecular weight", "kg/kmol", molar_mass_kg_kmol)?;
        let temperature_k = within("temperature", "K", temperature_k, MIN_TEMPERATURE_K, MAX_TEMPERATURE_K)?;
        let pressure_pa = within("pressure", "Pa", pressure_pa, MIN_PRESSURE_PA, MAX_PRESSURE_PA)?;
        let molar_mass_kg_kmol = within(
            "mean molecular weight",
            "kg/kmol",
            molar_mass_kg_kmol,
            MIN_MOLAR_MASS_KG_KMOL,
            MAX_MOLAR_MASS_KG_KMOL,
        )?;
        Ok(Self::trusted(temperature_k, pressure_pa, molar_mass_kg_kmol))
    }

    /// Air whose values the caller guarantees finite and inside the bands of [`Air::new`]:
    /// the standard's own lower part, whose temperatures (165 K to 330 K) and pressures
    /// (0.37 Pa to 1.8e5 Pa) over -5 km to 86 km are fixed by its constants. Skipping the
    /// checks there keeps the hot path of every evaluation short.
    #[inline]
    pub(crate) fn trusted(temperature_k: f64, pressure_pa: f64, molar_mass_kg_kmol: f64) -> Self {
        let per_rt = 1.0 / (GAS_CONSTANT_J_KMOL_K * temperature_k);
        Self {
            temperature_k,
            pressure_pa,
            molar_mass_kg_kmol,
            density_kg_m3: pressure_pa * molar_mass_kg_kmol * per_rt,
            number_density_m3: AVOGADRO_PER_KMOL * pressure_pa * per_rt,
            continuum: true,
        }
    }

    /// Rarefied air given by its particles, as the standard defines the atmosphere above
    /// 86 km: kinetic temperature `temperature_k` (K), total number density
    /// `number_density_m3` (1/m^3) and density `density_kg_m3` (kg/m^3). The continuum
    /// properties (speed of sound, viscosity, conductivity) are reported as not defined.
    ///
    /// ```text
    /// p = n k T,   M = rho N_A / n
    /// ```
    ///
    /// # Errors
    /// As [`Air::new`] for the inputs and for the resulting pressure and mean molecular
    /// weight.
    pub fn from_number_density(
        temperature_k: f64,
        number_density_m3: f64,
        density_kg_m3: f64,
    ) -> Result<Self> {
        let temperature_k = positive("temperature", "K", temperature_k)?;
        let temperature_k = within("temperature", "K", temperature_k, MIN_TEMPERATURE_K, MAX_TEMPERATURE_K)?;
        let number_density_m3 = positive("number density", "1/m^3", number_density_m3)?;
        let density_kg_m3 = positive("density", "kg/m^3", density_kg_m3)?;
        let pressure_pa = within(
            "pressure",
            "Pa",
            number_density_m3 * BOLTZMANN_J_K * temperature_k,
            MIN_PRESSURE_PA,
            MAX_PRESSURE_PA,
        )?;
        let molar_mass_kg_kmol = within(
            "mean molecular weight",
            "kg/kmol",
            density_kg_m3 * AVOGADRO_PER_KMOL / number_density_m3,
            MIN_MOLAR_MASS_KG_KMOL,
            MAX_MOLAR_MASS_KG_KMOL,
        )?;
        Ok(Self {
            temperature_k,
            pressure_pa,
            molar_mass_kg_kmol,
            density_kg_m3,
            number_density_m3,
            continuum: false,
        })
    }

    /// Dry air of the standard's sea-level composition (M0 = 28.9644 kg/kmol).
    ///
    /// # Errors
    /// As [`Air::new`].
    pub fn standard_composition(temperature_k: f64, pressure_pa: f64) -> Result<Self> {
        Self::new(temperature_k, pressure_pa, SEA_LEVEL_MOLAR_MASS_KG_KMOL)
    }

    /// The same parcel at another temperature and the same pressure: density and number
    /// density scale by T / T_new (the gas law), composition and continuum flag are kept.
    /// With `temperature_k` equal to the current temperature the result is bit-identical.
    ///
    /// # Errors
    /// As [`Air::new`] for the new temperature.
    pub fn at_temperature(self, temperature_k: f64) -> Result<Self> {
        let temperature_k = positive("temperature", "K", temperature_k)?;
        let temperature_k = within("temperature", "K", temperature_k, MIN_TEMPERATURE_K, MAX_TEMPERATURE_K)?;
        let scale = self.temperature_k / temperature_k;
        Ok(Self {
            temperature_k,
            density_kg_m3: self.density_kg_m3 * scale,
            number_density_m3: self.number_density_m3 * scale,
            ..self
        })
    }

    /// The same air, marked as rarefied: the continuum properties (speed of sound,
    /// viscosity, conductivity) are then reported as not defined.
    #[must_use]
    pub fn rarefied(self) -> Self {
        Self { continuum: false, ..self }
    }

    /// Kinetic temperature, K.
    #[inline]
    pub fn temperature_k(&self) -> f64 {
        self.temperature_k
    }

    /// Pressure, Pa.
    #[inline]
    pub fn pressure_pa(&self) -> f64 {
        self.pressure_pa
    }

    /// Mean molecular weight, kg/kmol.
    #[inline]
    pub fn molar_mass_kg_kmol(&self) -> f64 {
        self.molar_mass_kg_kmol
    }

    /// Whether continuum properties are defined for this air.
    #[inline]
    pub fn is_continuum(&self) -> bool {
        self.continuum
    }

    /// Molecular-scale temperature T_M = T M0 / M, K.
    #[inline]
    pub fn molecular_temperature_k(&self) -> f64 {
        // M0 / M first, so that T_M is exactly T where M = M0.
        self.temperature_k * (SEA_LEVEL_MOLAR_MASS_KG_KMOL / self.molar_mass_kg_kmol)
    }

    /// 1 / M: one division shared (after inlining) by every property that needs it.
    #[inline]
    fn per_molar_mass(&self) -> f64 {
        1.0 / self.molar_mass_kg_kmol
    }

    /// sqrt(T / M), shared by the speed of sound and the mean particle speed.
    #[inline]
    fn root_t_over_m(&self) -> f64 {
        sqrt(self.temperature_k * self.per_molar_mass())
    }

    /// Density, kg/m^3: rho = p M / (R* T) for [`Air::new`], as given for
    /// [`Air::from_number_density`].
    ///
    /// ```text
    /// rho = p M / (R* T)
    /// ```
    ///
    /// ```
    /// # use aerostrata::Air;
    /// // Standard sea level: 1.2250 kg/m^3 (U.S. Standard Atmosphere 1976, Table I).
    /// let rho = Air::standard_composition(288.15, 101_325.0)?.density_kg_m3();
    /// assert!((rho - 1.2250).abs() < 0.5e-4);
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    #[inline]
    pub fn density_kg_m3(&self) -> f64 {
        self.density_kg_m3
    }

    /// Number density of particles, 1/m^3: from the gas law for [`Air::new`], as given for
    /// [`Air::from_number_density`].
    ///
    /// ```text
    /// n = N_A p / (R* T)
    /// ```
    #[inline]
    pub fn number_density_m3(&self) -> f64 {
        self.number_density_m3
    }

    /// Speed of sound, m/s, or `None` for rarefied air.
    ///
    /// ```text
    /// a = sqrt(gamma R* T / M) = sqrt(gamma R* T_M / M0)
    /// ```
    #[inline]
    pub fn speed_of_sound_m_s(&self) -> Option<f64> {
        self.continuum.then(|| self.continuum_speed_of_sound_m_s())
    }

    /// The speed of sound's formula, for callers that know the air is a continuum (the
    /// batch path, whose loops run lane-wise without the `Option`).
    #[inline]
    pub(crate) fn continuum_speed_of_sound_m_s(&self) -> f64 {
        SQRT_GAMMA_R * self.root_t_over_m()
    }

    /// Dynamic viscosity by Sutherland's law, Pa s, or `None` for rarefied air.
    ///
    /// ```text
    /// mu = beta T^(3/2) / (T + S)
    /// ```
    #[inline]
    pub fn dynamic_viscosity_pa_s(&self) -> Option<f64> {
        self.continuum.then(|| sutherland(self.temperature_k))
    }

    /// Thermal conductivity, W/(m K), or `None` for rarefied air.
    ///
    /// ```text
    /// k = 2.64638e-3 T^(3/2) / (T + 245.4 10^(-12/T))
    /// ```
    #[inline]
    pub fn thermal_conductivity_w_m_k(&self) -> Option<f64> {
        self.continuum.then(|| conductivity(self.temperature_k))
    }

    /// Mean particle speed, m/s.
    ///
    /// ```text
    /// V = sqrt(8 R* T / (pi M))
    /// ```
    #[inline]
    pub fn mean_particle_speed_m_s(&self) -> f64 {
        SQRT_8R_OVER_PI * self.root_t_over_m()
    }

    /// Mean free path, m.
    ///
    /// ```text
    /// L = 1 / (sqrt(2) pi sigma^2 n)
    /// ```
    #[inline]
    pub fn mean_free_path_m(&self) -> f64 {
        mean_free_path(self.number_density_m3())
    }

    /// Pressure scale height for gravity `gravity_m_s2` (positive: the model's own, which
    /// is why this is not public; [`crate::State`] carries the result), m.
    ///
    /// ```text
    /// H_p = R* T / (M g)
    /// ```
    #[inline]
    pub(crate) fn pressure_scale_height_m(&self, gravity_m_s2: f64) -> f64 {
        GAS_CONSTANT_J_KMOL_K * self.temperature_k * self.per_molar_mass() / gravity_m_s2
    }
}

/// sqrt(gamma R*), (J/(kmol K))^1/2: the speed of sound over sqrt(T / M). The value is
/// `sqrt(1.4 * 8314.32)` rounded to f64 (a unit test holds it to libm's square root).
const SQRT_GAMMA_R: f64 = 107.889_054_125_059_42;
/// sqrt(8 R* / pi): the mean particle speed over sqrt(T / M); `sqrt(8 * 8314.32 / pi)`.
const SQRT_8R_OVER_PI: f64 = 145.506_845_279_405_72;

/// 1 / (sqrt(2) pi sigma^2), 1/m^2: the mean free path times number density.
const FREE_PATH_NUMERATOR_M2: f64 = 1.0 / (SQRT_2 * PI * COLLISION_DIAMETER_M * COLLISION_DIAMETER_M);

/// sqrt(2) pi sigma^2, m^2: the collision frequency over speed and number density.
pub(crate) const COLLISION_CROSS_SECTION_M2: f64 = SQRT_2 * PI * COLLISION_DIAMETER_M * COLLISION_DIAMETER_M;

#[inline]
pub(crate) fn mean_free_path(number_density_m3: f64) -> f64 {
    FREE_PATH_NUMERATOR_M2 / number_density_m3
}

#[inline]
pub(crate) fn sutherland(temperature_k: f64) -> f64 {
    SUTHERLAND_BETA * temperature_k * sqrt(temperature_k) / (temperature_k + SUTHERLAND_S_K)
}

#[inline]
pub(crate) fn conductivity(temperature_k: f64) -> f64 {
    // 10^(-12/T) as exp(-12 ln10 / T): one libm call instead of pow.
    let damping = exp(-CONDUCTIVITY_EXPONENT_K * LN_10 / temperature_k);
    CONDUCTIVITY_COEFFICIENT * temperature_k * sqrt(temperature_k)
        / (temperature_k + CONDUCTIVITY_TEMPERATURE_K * damping)
}

deserialize_through! {
    /// What deserialisation reads before [`Air::new`] (or, for the free-molecular air,
    /// [`Air::from_number_density`]) validates it.
    AirParameters {
        temperature_k: f64, pressure_pa: f64, molar_mass_kg_kmol: f64,
        density_kg_m3: f64, number_density_m3: f64, continuum: bool,
    } => Air,
    if continuum {
        Air::new(temperature_k, pressure_pa, molar_mass_kg_kmol)
    } else {
        Air::from_number_density(temperature_k, number_density_m3, density_kg_m3)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::constants::GAMMA;

    #[test]
    fn square_root_constants_are_the_rounded_roots() {
        assert_eq!(SQRT_GAMMA_R, libm::sqrt(GAMMA * GAS_CONSTANT_J_KMOL_K));
        assert_eq!(SQRT_8R_OVER_PI, libm::sqrt(8.0 * GAS_CONSTANT_J_KMOL_K / PI));
    }
}
