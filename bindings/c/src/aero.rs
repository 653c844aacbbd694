//! Aerodynamic, compressible-flow, airspeed and inverse-altitude helpers: each a thin
//! call of the core function of the same name. All are thread-safe and allocate nothing.

use aerostrata_core::airspeed::{AirData, Airspeed, Airspeeds};
use aerostrata_core::flow::{Isentropic, NormalShock};
use aerostrata_core::inverse::{self, BarometricReference};
use aerostrata_core::{aero, PerfectGas};

use crate::error::{AerostrataStatus, Failure};
use crate::output;

/// The ratio of specific heats of air, for the `gamma` arguments (1.4).
pub const AEROSTRATA_GAMMA_AIR: f64 = 1.4;

fn gas(gamma: f64) -> Result<PerfectGas, Failure> {
    Ok(PerfectGas::new(gamma)?)
}

/// Dynamic pressure q = rho V^2 / 2, Pa, of air of density `density_kg_m3` at
/// `velocity_m_s` (sign ignored), written to `*out`.
///
/// Errors: NOT_FINITE or OUT_OF_RANGE (density 0 to 1e6 kg/m^3, |velocity| up to
/// 1e8 m/s); NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_dynamic_pressure_pa(
    density_kg_m3: f64,
    velocity_m_s: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(aero::dynamic_pressure_pa(density_kg_m3, velocity_m_s)?))
}

/// Dynamic pressure (gamma / 2) p M^2, Pa, from static pressure `static_pressure_pa` and
/// Mach number `mach` in a perfect gas of ratio of specific heats `gamma`.
///
/// Errors: NOT_FINITE, OUT_OF_RANGE (pressure), RATIO_OUT_OF_RANGE (Mach 0 to 1000, gamma
/// 1.01 to 1.7); NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_dynamic_pressure_from_mach_pa(
    static_pressure_pa: f64,
    mach: f64,
    gamma: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(aero::dynamic_pressure_from_mach_pa(static_pressure_pa, mach, gas(gamma)?)?))
}

/// Drag force q Cd A, N.
///
/// Errors: NOT_FINITE, OUT_OF_RANGE (q 0 to 1e22 Pa, area 0 to 1e6 m^2),
/// RATIO_OUT_OF_RANGE (Cd 0 to 100); NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_drag_n(
    dynamic_pressure_pa: f64,
    drag_coefficient: f64,
    reference_area_m2: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(aero::drag_n(dynamic_pressure_pa, drag_coefficient, reference_area_m2)?))
}

/// Mach number |V| / a.
///
/// Errors: NOT_FINITE, OUT_OF_RANGE (velocity), NOT_POSITIVE (speed of sound),
/// RATIO_OUT_OF_RANGE (above Mach 1000); NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_mach_number(
    velocity_m_s: f64,
    speed_of_sound_m_s: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(aero::mach_number(velocity_m_s, speed_of_sound_m_s)?))
}

/// True speed V = M a, m/s, of Mach number `mach` in air of speed of sound
/// `speed_of_sound_m_s`: the inverse of `aerostrata_mach_number`.
///
/// Errors: NOT_FINITE, RATIO_OUT_OF_RANGE (Mach 0 to 1000), NOT_POSITIVE or OUT_OF_RANGE
/// (speed of sound, or a speed above 1e8 m/s); NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_velocity_from_mach_m_s(
    mach: f64,
    speed_of_sound_m_s: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(aero::velocity_from_mach_m_s(mach, speed_of_sound_m_s)?))
}

/// Reynolds number rho |V| L / mu for reference length `length_m`.
///
/// Errors: NOT_FINITE, OUT_OF_RANGE, NOT_POSITIVE (viscosity); NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_reynolds_number(
    density_kg_m3: f64,
    velocity_m_s: f64,
    length_m: f64,
    dynamic_viscosity_pa_s: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(aero::reynolds_number(density_kg_m3, velocity_m_s, length_m, dynamic_viscosity_pa_s)?))
}

/// Knudsen number lambda / L.
///
/// Errors: NOT_FINITE, NOT_POSITIVE, OUT_OF_RANGE (length 1e-12 to 1e6 m); NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_knudsen_number(
    mean_free_path_m: f64,
    length_m: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(aero::knudsen_number(mean_free_path_m, length_m)?))
}

/// Ballistic coefficient m / (Cd A), kg/m^2.
///
/// Errors: NOT_FINITE, NOT_POSITIVE, RATIO_NOT_POSITIVE (Cd), RATIO_OUT_OF_RANGE,
/// OUT_OF_RANGE; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_ballistic_coefficient_kg_m2(
    mass_kg: f64,
    drag_coefficient: f64,
    reference_area_m2: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(aero::ballistic_coefficient_kg_m2(mass_kg, drag_coefficient, reference_area_m2)?))
}

/// The isentropic static-to-total ratios at one Mach number.
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataIsentropic {
    /// Mach number.
    pub mach: f64,
    /// p / p0.
    pub pressure_ratio: f64,
    /// T / T0.
    pub temperature_ratio: f64,
    /// rho / rho0.
    pub density_ratio: f64,
}

/// The isentropic static-to-total pressure, temperature and density ratios at Mach
/// `mach` in a perfect gas of ratio of specific heats `gamma`, written to `*out`.
///
/// Errors: NOT_FINITE, RATIO_OUT_OF_RANGE (Mach 0 to 1000, gamma 1.01 to 1.7);
/// NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_isentropic(
    gamma: f64,
    mach: f64,
    out: *mut AerostrataIsentropic,
) -> AerostrataStatus {
    output(out, || Ok(gas(gamma)?.isentropic(mach)?.into()))
}

impl From<Isentropic> for AerostrataIsentropic {
    fn from(r: Isentropic) -> Self {
        let Isentropic { mach, pressure_ratio, temperature_ratio, density_ratio } = r;
        Self { mach, pressure_ratio, temperature_ratio, density_ratio }
    }
}

/// Mach number from the isentropic static-to-total pressure ratio p / p0 (0 to 1].
///
/// Errors: NOT_FINITE, RATIO_OUT_OF_RANGE; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_mach_from_pressure_ratio(
    gamma: f64,
    pressure_ratio: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(gas(gamma)?.mach_from_pressure_ratio(pressure_ratio)?))
}

/// The state behind a normal shock relative to the state ahead of it.
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataNormalShock {
    /// Upstream Mach number M1.
    pub upstream_mach: f64,
    /// Downstream Mach number M2.
    pub downstream_mach: f64,
    /// p2 / p1.
    pub pressure_ratio: f64,
    /// rho2 / rho1.
    pub density_ratio: f64,
    /// T2 / T1.
    pub temperature_ratio: f64,
    /// p02 / p01.
    pub total_pressure_ratio: f64,
    /// Pitot pressure over upstream static pressure, p02 / p1.
    pub pitot_pressure_ratio: f64,
}

/// The normal-shock relations at upstream Mach `mach` (1 to 1000), written to `*out`.
///
/// Errors: NOT_FINITE, RATIO_OUT_OF_RANGE; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_normal_shock(
    gamma: f64,
    mach: f64,
    out: *mut AerostrataNormalShock,
) -> AerostrataStatus {
    output(out, || Ok(gas(gamma)?.normal_shock(mach)?.into()))
}

impl From<NormalShock> for AerostrataNormalShock {
    fn from(s: NormalShock) -> Self {
        Self {
            upstream_mach: s.upstream_mach,
            downstream_mach: s.downstream_mach,
            pressure_ratio: s.pressure_ratio,
            density_ratio: s.density_ratio,
            temperature_ratio: s.temperature_ratio,
            total_pressure_ratio: s.total_pressure_ratio,
            pitot_pressure_ratio: s.pitot_pressure_ratio,
        }
    }
}

/// Impact pressure qc (pitot minus static), Pa, at static pressure `static_pressure_pa`
/// and Mach `mach` (isentropic below Mach 1, Rayleigh pitot formula above).
///
/// Errors: NOT_FINITE, OUT_OF_RANGE, RATIO_OUT_OF_RANGE; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_impact_pressure_pa(
    gamma: f64,
    static_pressure_pa: f64,
    mach: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(gas(gamma)?.impact_pressure_pa(static_pressure_pa, mach)?))
}

/// Mach number from the impact-pressure ratio qc / p (the inverse of the pitot
/// relations).
///
/// Errors: NOT_FINITE, RATIO_OUT_OF_RANGE, NO_CONVERGENCE; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_mach_from_impact_pressure_ratio(
    gamma: f64,
    impact_pressure_ratio: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(gas(gamma)?.mach_from_impact_pressure_ratio(impact_pressure_ratio)?))
}

/// Every airspeed of one flight condition.
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataAirspeeds {
    /// Calibrated airspeed, m/s.
    pub calibrated_m_s: f64,
    /// Equivalent airspeed, m/s.
    pub equivalent_m_s: f64,
    /// True airspeed, m/s.
    pub true_m_s: f64,
    /// Mach number.
    pub mach: f64,
    /// Impact pressure (pitot minus static), Pa.
    pub impact_pressure_pa: f64,
    /// Dynamic pressure, Pa.
    pub dynamic_pressure_pa: f64,
}

impl From<Airspeeds> for AerostrataAirspeeds {
    fn from(s: Airspeeds) -> Self {
        Self {
            calibrated_m_s: s.calibrated_m_s,
            equivalent_m_s: s.equivalent_m_s,
            true_m_s: s.true_m_s,
            mach: s.mach,
            impact_pressure_pa: s.impact_pressure_pa,
            dynamic_pressure_pa: s.dynamic_pressure_pa,
        }
    }
}

/// `given_kind` value: the given airspeed is calibrated airspeed (CAS), m/s.
pub const AEROSTRATA_CALIBRATED: u32 = 0;
/// `given_kind` value: equivalent airspeed (EAS), m/s.
pub const AEROSTRATA_EQUIVALENT: u32 = 1;
/// `given_kind` value: true airspeed (TAS), m/s.
pub const AEROSTRATA_TRUE: u32 = 2;
/// `given_kind` value: Mach number.
pub const AEROSTRATA_MACH: u32 = 3;

/// Every airspeed in `air` from `given` of `given_kind`.
fn airspeeds(air: AirData, given_kind: u32, given: f64) -> Result<AerostrataAirspeeds, Failure> {
    let given = match given_kind {
        AEROSTRATA_CALIBRATED => Airspeed::Calibrated(given),
        AEROSTRATA_EQUIVALENT => Airspeed::Equivalent(given),
        AEROSTRATA_TRUE => Airspeed::True(given),
        AEROSTRATA_MACH => Airspeed::Mach(given),
        other => {
            return Err(Failure::invalid_argument(
                "given_kind",
                "must be AEROSTRATA_CALIBRATED (0), _EQUIVALENT (1), _TRUE (2) or _MACH (3)",
                f64::from(other),
            ))
        }
    };
    Ok(air.airspeeds(given)?.into())
}

/// Every airspeed (CAS, EAS, TAS, Mach) from one of them, `given` of `given_kind`
/// (`AEROSTRATA_CALIBRATED`, `_EQUIVALENT`, `_TRUE` or `_MACH`), in dry air at static
/// pressure `static_pressure_pa` and outside air temperature `temperature_k`.
///
/// Errors: NOT_FINITE, OUT_OF_RANGE, NOT_POSITIVE, RATIO_OUT_OF_RANGE; INVALID_ARGUMENT
/// for an unknown kind; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_airspeeds(
    static_pressure_pa: f64,
    temperature_k: f64,
    given_kind: u32,
    given: f64,
    out: *mut AerostrataAirspeeds,
) -> AerostrataStatus {
    output(out, || airspeeds(AirData::new(static_pressure_pa, temperature_k)?, given_kind, given))
}

/// As `aerostrata_airspeeds`, with the static pressure given as a pressure altitude
/// `pressure_altitude_m` (geopotential metres of the 1976 standard).
#[no_mangle]
pub unsafe extern "C" fn aerostrata_airspeeds_at_pressure_altitude(
    pressure_altitude_m: f64,
    temperature_k: f64,
    given_kind: u32,
    given: f64,
    out: *mut AerostrataAirspeeds,
) -> AerostrataStatus {
    output(out, || {
        airspeeds(AirData::from_pressure_altitude(pressure_altitude_m, temperature_k)?, given_kind, given)
    })
}

/// Pressure altitude, geopotential m: where the 1976 standard has pressure `pressure_pa`.
///
/// Errors: NOT_FINITE, NOT_POSITIVE, OUT_OF_RANGE (beyond the standard's pressures);
/// NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_pressure_altitude_m(pressure_pa: f64, out: *mut f64) -> AerostrataStatus {
    output(out, || Ok(inverse::pressure_altitude(pressure_pa)?.meters()))
}

/// Density altitude, geopotential m: where the 1976 standard has density
/// `density_kg_m3`.
///
/// Errors: as `aerostrata_pressure_altitude_m`.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_density_altitude_m(
    density_kg_m3: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(inverse::density_altitude(density_kg_m3)?.meters()))
}

/// Density altitude, geopotential m, of dry air at pressure `pressure_pa` and
/// temperature `temperature_k`.
///
/// Errors: as `aerostrata_pressure_altitude_m`, and for the temperature.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_density_altitude_from_m(
    pressure_pa: f64,
    temperature_k: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(inverse::density_altitude_from(pressure_pa, temperature_k)?.meters()))
}

/// `reference_kind` value: the standard's sea level, 101 325 Pa (`reference_pa` ignored).
pub const AEROSTRATA_REFERENCE_STANDARD: u32 = 0;
/// `reference_kind` value: `reference_pa` is an altimeter setting (QNH), Pa.
pub const AEROSTRATA_REFERENCE_QNH: u32 = 1;
/// `reference_kind` value: `reference_pa` is the pad's own pressure at launch, Pa.
pub const AEROSTRATA_REFERENCE_PAD: u32 = 2;

/// Barometric altitude, m: the pressure altitude of `pressure_pa` less that of the
/// reference (`AEROSTRATA_REFERENCE_STANDARD`, `_QNH` or `_PAD` with `reference_pa`).
///
/// Errors: as `aerostrata_pressure_altitude_m`; OUT_OF_RANGE for a reference outside the
/// lower standard's pressures; INVALID_ARGUMENT for an unknown kind; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_barometric_altitude_m(
    pressure_pa: f64,
    reference_kind: u32,
    reference_pa: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || {
        let reference = match reference_kind {
            AEROSTRATA_REFERENCE_STANDARD => BarometricReference::StandardSeaLevel,
            AEROSTRATA_REFERENCE_QNH => BarometricReference::Qnh { setting_pa: reference_pa },
            AEROSTRATA_REFERENCE_PAD => BarometricReference::Pad { pressure_pa: reference_pa },
            other => {
                return Err(Failure::invalid_argument(
                    "reference_kind",
                    "must be AEROSTRATA_REFERENCE_STANDARD (0), _QNH (1) or _PAD (2)",
                    f64::from(other),
                ))
            }
        };
        Ok(inverse::barometric_altitude_m(pressure_pa, reference)?)
    })
}
