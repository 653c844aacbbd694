//! Airspeeds: calibrated (CAS), equivalent (EAS) and true airspeed (TAS) and Mach number,
//! each from any other, given the static pressure and outside air temperature (or
//! pressure altitude and temperature, or a [`State`]).
//!
//! Definitions (common practice, no source; the pitot relations are NACA Report 1135's):
//! - TAS V is the speed relative to the air; Mach M = V / a with a = sqrt(gamma R* T / M).
//! - EAS = V sqrt(rho / rho0): the speed at sea-level standard density giving the same
//!   dynamic pressure rho V^2 / 2.
//! - CAS is the speed that gives the measured impact pressure qc (pitot minus static) in
//!   air at sea-level standard pressure p0 = 101 325 Pa and speed of sound
//!   a0 = sqrt(gamma R* T0 / M0) = 340.294 m/s: qc = p0 f(CAS / a0), where f is the
//!   subsonic isentropic pitot relation up to CAS = a0 and the Rayleigh pitot formula
//!   above it, as airspeed indicators are calibrated.
//! - gamma = 1.4 throughout ([`PerfectGas::AIR`]).

use crate::altitude::Altitude;
use crate::constants::{
    GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_DENSITY_KG_M3, SEA_LEVEL_MOLAR_MASS_KG_KMOL, SEA_LEVEL_PRESSURE_PA,
    SEA_LEVEL_TEMPERATURE_K,
};
use crate::error::{within, Result};
use crate::flow::{PerfectGas, MAX_MACH};
use crate::gas::Air;
use crate::math::sqrt;
use crate::model::{Atmosphere, US1976};
use crate::quantity::Quantity;
use crate::state::State;

/// Sea-level standard speed of sound a0 = sqrt(gamma R* T0 / M0), m/s (340.294 m/s).
pub fn sea_level_speed_of_sound_m_s() -> f64 {
    sqrt(
        PerfectGas::AIR.gamma() * GAS_CONSTANT_J_KMOL_K * SEA_LEVEL_TEMPERATURE_K
            / SEA_LEVEL_MOLAR_MASS_KG_KMOL,
    )
}

/// One airspeed, of the kind it is.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Airspeed {
    /// Calibrated airspeed, m/s.
    Calibrated(f64),
    /// Equivalent airspeed, m/s.
    Equivalent(f64),
    /// True airspeed, m/s.
    True(f64),
    /// Mach number.
    Mach(f64),
}

/// Every airspeed of one flight condition, and the pressures behind them.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Airspeeds {
    /// Calibrated airspeed, m/s.
    pub calibrated_m_s: f64,
    /// Equivalent airspeed, m/s.
    pub equivalent_m_s: f64,
    /// True airspeed, m/s.
    pub true_m_s: f64,
    /// Mach number.
    pub mach: f64,
    /// Impact pressure qc (pitot minus static), Pa.
    pub impact_pressure_pa: f64,
    /// Dynamic pressure rho V^2 / 2, Pa.
    pub dynamic_pressure_pa: f64,
}

impl Airspeeds {
    /// The quantities the airspeeds carry, in the order of their fields.
    pub const QUANTITIES: [Quantity; 6] = [
        Quantity::CalibratedAirspeed,
        Quantity::EquivalentAirspeed,
        Quantity::TrueAirspeed,
        Quantity::Mach,
        Quantity::ImpactPressure,
        Quantity::DynamicPressure,
    ];

    /// The value of `quantity`, in its SI unit ([`Quantity::info`]).
    ///
    /// # Errors
    /// [`crate::Error::NotCarried`] for a quantity that is not one of
    /// [`Airspeeds::QUANTITIES`].
    pub fn get(&self, quantity: Quantity) -> Result<f64> {
        match quantity {
            Quantity::CalibratedAirspeed => Ok(self.calibrated_m_s),
            Quantity::EquivalentAirspeed => Ok(self.equivalent_m_s),
            Quantity::TrueAirspeed => Ok(self.true_m_s),
            Quantity::Mach => Ok(self.mach),
            Quantity::ImpactPressure => Ok(self.impact_pressure_pa),
            Quantity::DynamicPressure => Ok(self.dynamic_pressure_pa),
            other => Err(crate::Error::NotCarried { quantity: other.name(), result: "a set of airspeeds" }),
        }
    }
}

/// The static air an aircraft flies in: what the conversions need.
///
/// ```
/// use aerostrata::airspeed::{AirData, Airspeed};
/// // At standard sea level the three airspeeds coincide (by their definitions).
/// let sea_level = AirData::new(101_325.0, 288.15)?;
/// let s = sea_level.airspeeds(Airspeed::Calibrated(100.0))?;
/// assert!((s.true_m_s - 100.0).abs() < 1e-10 && (s.equivalent_m_s - 100.0).abs() < 1e-10);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct AirData {
    pressure_pa: f64,
    density_kg_m3: f64,
    speed_of_sound_m_s: f64,
}

impl AirData {
    /// Dry air of standard composition at static pressure `static_pressure_pa` and
    /// outside air (static) temperature `temperature_k`.
    ///
    /// # Errors
    /// As [`Air::standard_composition`].
    pub fn new(static_pressure_pa: f64, temperature_k: f64) -> Result<Self> {
        Self::from_air(&Air::standard_composition(temperature_k, static_pressure_pa)?)
    }

    /// Air at pressure altitude `pressure_altitude_m` (geopotential metres of the 1976
    /// standard, as an altimeter set to 1013.25 hPa reads) and outside air temperature
    /// `temperature_k`.
    ///
    /// # Errors
    /// As [`Altitude::geopotential_m`] and the standard's range for the altitude; as
    /// [`AirData::new`] for the temperature.
    pub fn from_pressure_altitude(pressure_altitude_m: f64, temperature_k: f64) -> Result<Self> {
        let p = US1976.pressure_pa(Altitude::geopotential_m(pressure_altitude_m)?)?;
        Self::new(p, temperature_k)
    }

    /// The air of a model's state (its pressure, density and speed of sound).
    ///
    /// # Errors
    /// [`crate::Error::Undefined`] where the state has no speed of sound;
    /// [`crate::Error::NotPositive`] or [`crate::Error::NotFinite`] for a hand-made state
    /// whose pressure, density or speed of sound is not finite and positive.
    pub fn from_state(state: &State) -> Result<Self> {
        let speed_of_sound_m_s = state.speed_of_sound()?;
        Ok(Self {
            pressure_pa: crate::error::positive("pressure", "Pa", state.pressure_pa)?,
            density_kg_m3: crate::error::positive("density", "kg/m^3", state.density_kg_m3)?,
            speed_of_sound_m_s: crate::error::positive("speed of sound", "m/s", speed_of_sound_m_s)?,
        })
    }

    fn from_air(air: &Air) -> Result<Self> {
        Ok(Self {
            pressure_pa: air.pressure_pa(),
            density_kg_m3: air.density_kg_m3(),
            // `Air::standard_composition` is always a continuum, so this is always Some.
            speed_of_sound_m_s: air
                .speed_of_sound_m_s()
                .ok_or(crate::Error::Undefined { quantity: "speed of sound", altitude_m: 0.0 })?,
        })
    }

    /// Static pressure, Pa.
    pub fn pressure_pa(&self) -> f64 {
        self.pressure_pa
    }

    /// Density, kg/m^3.
    pub fn density_kg_m3(&self) -> f64 {
        self.density_kg_m3
    }

    /// Speed of sound, m/s.
    pub fn speed_of_sound_m_s(&self) -> f64 {
        self.speed_of_sound_m_s
    }

    /// Every airspeed of the flight condition given by `given`.
    ///
    /// ```text
    /// TAS -> M:  M = V / a
    /// EAS -> M:  M = EAS sqrt(rho0 / rho) / a
    /// CAS -> M:  qc = p0 f(CAS / a0);  M = f^-1(qc / p)
    /// M -> all:  V = M a;  EAS = V sqrt(rho / rho0);  qc = p f(M);  CAS = a0 f^-1(qc / p0)
    /// f(M) = (1 + 0.2 M^2)^3.5 - 1                                  M <= 1
    /// f(M) = (1.2 M^2)^3.5 (6 / (7 M^2 - 1))^2.5 - 1 ... (Rayleigh)  M >= 1
    /// ```
    /// (f written for gamma = 1.4; see [`PerfectGas::impact_pressure_ratio`].)
    ///
    /// ```
    /// use aerostrata::airspeed::{AirData, Airspeed};
    /// // ISA at 10 000 m pressure altitude, Mach 0.8: TAS 239.5706 m/s, EAS 139.0549 m/s,
    /// // CAS 146.9851 m/s (computed with mpmath from the definitions above:
    /// // tests/reference/airspeed_mpmath.py).
    /// let air = AirData::from_pressure_altitude(10_000.0, 223.15)?;
    /// let s = air.airspeeds(Airspeed::Mach(0.8))?;
    /// assert!((s.true_m_s - 239.5706).abs() < 1e-4);
    /// assert!((s.equivalent_m_s - 139.0549).abs() < 1e-4);
    /// assert!((s.calibrated_m_s - 146.9851).abs() < 1e-4);
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`crate::Error::NotFinite`] or [`crate::Error::OutOfRange`] for a speed that is
    /// negative or whose Mach number (or, for CAS, CAS / a0) exceeds [`MAX_MACH`];
    /// [`crate::Error::RatioOutOfRange`] for a negative or excessive Mach number, or when a
    /// calibrated airspeed in very thin air needs a Mach number beyond [`MAX_MACH`].
    pub fn airspeeds(&self, given: Airspeed) -> Result<Airspeeds> {
        let gas = PerfectGas::AIR;
        let a0 = sea_level_speed_of_sound_m_s();
        let a = self.speed_of_sound_m_s;
        let sqrt_sigma = sqrt(self.density_kg_m3 / SEA_LEVEL_DENSITY_KG_M3);
        let mach = match given {
            Airspeed::Mach(m) => crate::ratio::ratio_within("Mach number", m, 0.0, MAX_MACH)?,
            Airspeed::True(v) => within("true airspeed", "m/s", v, 0.0, MAX_MACH * a)? / a,
            Airspeed::Equivalent(v) => {
                within("equivalent airspeed", "m/s", v, 0.0, MAX_MACH * a * sqrt_sigma)? / sqrt_sigma / a
            }
            Airspeed::Calibrated(v) => {
                let v = within("calibrated airspeed", "m/s", v, 0.0, MAX_MACH * a0)?;
                let qc = SEA_LEVEL_PRESSURE_PA * gas.impact_pressure_ratio((v / a0).min(MAX_MACH))?;
                gas.mach_from_impact_pressure_ratio(qc / self.pressure_pa)?
            }
        };
        let mach = mach.min(MAX_MACH);
        let true_m_s = mach * a;
        let impact_pressure_pa = self.pressure_pa * gas.impact_pressure_ratio(mach)?;
        let calibrated_m_s = match given {
            // Given: keep it exactly rather than round-trip it through two inverses.
            Airspeed::Calibrated(v) => v,
            _ => a0 * gas.mach_from_impact_pressure_ratio(impact_pressure_pa / SEA_LEVEL_PRESSURE_PA)?,
        };
        Ok(Airspeeds {
            calibrated_m_s,
            equivalent_m_s: match given {
                Airspeed::Equivalent(v) => v,
                _ => true_m_s * sqrt_sigma,
            },
            true_m_s: match given {
                Airspeed::True(v) => v,
                _ => true_m_s,
            },
            mach: match given {
                Airspeed::Mach(m) => m,
                _ => mach,
            },
            impact_pressure_pa,
            dynamic_pressure_pa: 0.5 * self.density_kg_m3 * true_m_s * true_m_s,
        })
    }
}
