//! Aerodynamic loads from the air's state and a speed: dynamic pressure (incompressible
//! and compressible forms), drag, Mach, Reynolds and Knudsen numbers, drag-coefficient
//! curves from a user table, ballistic coefficient and terminal velocity.
//!
//! The definitions are those of every aerodynamics text (q = rho V^2 / 2, D = q Cd A,
//! Re = rho V L / mu, Kn = lambda / L); the Knudsen regime boundaries and the monotone
//! interpolation are cited where they are used. Drag curves are in drag_curve.rs, the
//! input bounds in limits.rs.

mod drag_curve;
mod limits;

use crate::error::{finite, positive, within, Error, Result};
use crate::flow::{PerfectGas, MAX_MACH};
use crate::math::sqrt;
use crate::ratio::{positive_ratio, ratio_within};
use crate::solve::{solve_bracketed, SolverSettings};
use crate::state::State;

pub(crate) use drag_curve::CdSegment;
pub use drag_curve::{DragCurve, Interpolation};
pub(crate) use limits::speed;
pub use limits::{
    MAX_AREA_M2, MAX_DENSITY_KG_M3, MAX_DRAG_COEFFICIENT, MAX_DYNAMIC_PRESSURE_PA, MAX_LENGTH_M,
    MAX_PRESSURE_PA, MAX_SPEED_M_S,
};

/// Dynamic pressure q, Pa, of air of density `density_kg_m3` moving at `velocity_m_s`
/// relative to the body (the sign of the velocity is ignored).
///
/// ```text
/// q = rho V^2 / 2
/// ```
///
/// ```
/// use aerostrata::aero::dynamic_pressure_pa;
/// // Standard sea level at 100 m/s: 1.2250 * 100^2 / 2 = 6125 Pa.
/// // (1.225 is not exact in binary: a few ulps.)
/// assert!((dynamic_pressure_pa(1.225, 100.0)? - 6125.0).abs() < 1e-11);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::OutOfRange`] for a density outside
/// 0..=[`MAX_DENSITY_KG_M3`] or a velocity outside +-[`MAX_SPEED_M_S`].
pub fn dynamic_pressure_pa(density_kg_m3: f64, velocity_m_s: f64) -> Result<f64> {
    let rho = within("density", "kg/m^3", density_kg_m3, 0.0, MAX_DENSITY_KG_M3)?;
    let v = speed("velocity", velocity_m_s)?;
    Ok(0.5 * rho * v * v)
}

/// Dynamic pressure q, Pa, in its compressible form, from the static pressure and the
/// Mach number: the same quantity as rho V^2 / 2, since a^2 = gamma p / rho.
///
/// ```text
/// q = (gamma / 2) p M^2
/// ```
///
/// ```
/// use aerostrata::aero::{dynamic_pressure_from_mach_pa, dynamic_pressure_pa};
/// use aerostrata::flow::PerfectGas;
/// use aerostrata::{Altitude, Atmosphere, US1976};
/// let s = US1976.state(Altitude::geometric_m(10_000.0)?)?;
/// let v = 250.0;
/// let from_mach = dynamic_pressure_from_mach_pa(s.pressure_pa, v / s.speed_of_sound()?, PerfectGas::AIR)?;
/// let from_density = dynamic_pressure_pa(s.density_kg_m3, v)?;
/// assert!((from_mach / from_density - 1.0).abs() < 1e-14);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::OutOfRange`] for a pressure outside
/// 0..=[`MAX_PRESSURE_PA`]; [`Error::RatioOutOfRange`] for a Mach number outside
/// 0..=[`MAX_MACH`].
pub fn dynamic_pressure_from_mach_pa(static_pressure_pa: f64, mach: f64, gas: PerfectGas) -> Result<f64> {
    let p = within("static pressure", "Pa", static_pressure_pa, 0.0, MAX_PRESSURE_PA)?;
    let m = ratio_within("Mach number", mach, 0.0, MAX_MACH)?;
    Ok(0.5 * gas.gamma() * p * m * m)
}

/// Drag force, N, at dynamic pressure `dynamic_pressure_pa` on a body of drag coefficient
/// `drag_coefficient` referred to the area `reference_area_m2`.
///
/// ```text
/// D = q Cd A
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::OutOfRange`] for a dynamic pressure outside
/// 0..=[`MAX_DYNAMIC_PRESSURE_PA`] or an area outside 0..=[`MAX_AREA_M2`];
/// [`Error::RatioOutOfRange`] for a drag coefficient outside 0..=[`MAX_DRAG_COEFFICIENT`].
pub fn drag_n(dynamic_pressure_pa: f64, drag_coefficient: f64, reference_area_m2: f64) -> Result<f64> {
    let q = within("dynamic pressure", "Pa", dynamic_pressure_pa, 0.0, MAX_DYNAMIC_PRESSURE_PA)?;
    let cd = ratio_within("drag coefficient", drag_coefficient, 0.0, MAX_DRAG_COEFFICIENT)?;
    let area = within("reference area", "m^2", reference_area_m2, 0.0, MAX_AREA_M2)?;
    Ok(q * cd * area)
}

/// Mach number of a speed `velocity_m_s` (sign ignored) in air whose speed of sound is
/// `speed_of_sound_m_s`.
///
/// ```text
/// M = |V| / a
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::OutOfRange`] for a velocity outside
/// +-[`MAX_SPEED_M_S`]; [`Error::NotPositive`] for a speed of sound that is not positive;
/// [`Error::RatioOutOfRange`] when the Mach number would exceed [`MAX_MACH`].
pub fn mach_number(velocity_m_s: f64, speed_of_sound_m_s: f64) -> Result<f64> {
    let v = speed("velocity", velocity_m_s)?;
    let a = positive("speed of sound", "m/s", speed_of_sound_m_s)?;
    ratio_within("Mach number", v / a, 0.0, MAX_MACH)
}

/// True speed, m/s, of a Mach number `mach` in air whose speed of sound is
/// `speed_of_sound_m_s`: the inverse of [`mach_number`].
///
/// ```text
/// V = M a
/// ```
///
/// ```
/// use aerostrata::aero::{mach_number, velocity_from_mach_m_s};
/// let v = velocity_from_mach_m_s(0.85, 295.0)?;
/// assert!((mach_number(v, 295.0)? - 0.85).abs() < 1e-15);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a Mach number outside 0 to
/// [`MAX_MACH`]; [`Error::NotFinite`], [`Error::NotPositive`] or [`Error::OutOfRange`]
/// for a speed of sound that is not positive or above [`MAX_SPEED_M_S`], or when the
/// speed would exceed it.
pub fn velocity_from_mach_m_s(mach: f64, speed_of_sound_m_s: f64) -> Result<f64> {
    let m = ratio_within("Mach number", mach, 0.0, MAX_MACH)?;
    let a = positive("speed of sound", "m/s", speed_of_sound_m_s)?;
    let a = within("speed of sound", "m/s", a, 0.0, MAX_SPEED_M_S)?;
    speed("velocity", m * a)
}

/// Reynolds number for a reference length `length_m`.
///
/// ```text
/// Re = rho |V| L / mu
/// ```
///
/// ```
/// use aerostrata::aero::reynolds_number;
/// use aerostrata::{Altitude, Atmosphere, US1976};
/// // A 0.1 m body at 50 m/s at standard sea level: Re = 50 * 0.1 / 1.4607e-5 = 342 300
/// // (the standard's kinematic viscosity, Table III; from memory of the printed table).
/// let s = US1976.state(Altitude::geometric_m(0.0)?)?;
/// let re = reynolds_number(s.density_kg_m3, 50.0, 0.1, s.dynamic_viscosity()?)?;
/// assert!((re / (5.0 / 1.4607e-5) - 1.0).abs() < 5e-5);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::OutOfRange`] for a density outside
/// 0..=[`MAX_DENSITY_KG_M3`], a velocity outside +-[`MAX_SPEED_M_S`] or a length
/// outside 0..=[`MAX_LENGTH_M`]; [`Error::NotPositive`] or [`Error::OutOfRange`] for a
/// viscosity that is not positive or is below 1e-12 Pa s (no gas is that inviscid).
pub fn reynolds_number(
    density_kg_m3: f64,
    velocity_m_s: f64,
    length_m: f64,
    dynamic_viscosity_pa_s: f64,
) -> Result<f64> {
    let rho = within("density", "kg/m^3", density_kg_m3, 0.0, MAX_DENSITY_KG_M3)?;
    let v = speed("velocity", velocity_m_s)?;
    let length = within("reference length", "m", length_m, 0.0, MAX_LENGTH_M)?;
    let mu = positive("dynamic viscosity", "Pa s", dynamic_viscosity_pa_s)?;
    let mu = within("dynamic viscosity", "Pa s", mu, 1e-12, 1e3)?;
    Ok(rho * v * length / mu)
}

/// The flow regimes of rarefied-gas dynamics, by Knudsen number.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum RarefactionRegime {
    /// Kn < 0.01: the Navier-Stokes equations with no-slip walls hold.
    Continuum,
    /// 0.01 <= Kn < 0.1: continuum with velocity slip and temperature jump at walls.
    Slip,
    /// 0.1 <= Kn < 10: neither continuum nor free-molecular methods hold.
    Transitional,
    /// Kn >= 10: molecules reach the body without colliding with each other.
    FreeMolecular,
}

impl RarefactionRegime {
    /// Lower Knudsen number of the slip regime.
    pub const SLIP_FROM: f64 = 0.01;
    /// Lower Knudsen number of the transitional regime.
    pub const TRANSITIONAL_FROM: f64 = 0.1;
    /// Lower Knudsen number of the free-molecular regime.
    pub const FREE_MOLECULAR_FROM: f64 = 10.0;

    /// The regime of Knudsen number `knudsen`. Boundaries 0.01, 0.1 and 10 (each one
    /// belongs to the regime above it): the usual division of rarefied-gas dynamics
    /// (common practice, no source; authors differ by factors of a few).
    ///
    /// ```
    /// use aerostrata::aero::RarefactionRegime;
    /// assert_eq!(RarefactionRegime::of(0.001)?, RarefactionRegime::Continuum);
    /// assert_eq!(RarefactionRegime::of(0.1)?, RarefactionRegime::Transitional);
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] for NaN or infinity; [`Error::RatioOutOfRange`] for a negative
    /// Knudsen number.
    pub fn of(knudsen: f64) -> Result<Self> {
        let kn = ratio_within("Knudsen number", knudsen, 0.0, f64::MAX)?;
        Ok(if kn < Self::SLIP_FROM {
            Self::Continuum
        } else if kn < Self::TRANSITIONAL_FROM {
            Self::Slip
        } else if kn < Self::FREE_MOLECULAR_FROM {
            Self::Transitional
        } else {
            Self::FreeMolecular
        })
    }
}

/// Knudsen number of a body of size `length_m` in gas of mean free path
/// `mean_free_path_m`.
///
/// ```text
/// Kn = lambda / L
/// ```
///
/// ```
/// use aerostrata::aero::{knudsen_number, RarefactionRegime};
/// use aerostrata::{Altitude, Atmosphere, US1976};
/// // A 1 m body at 86 km (mean free path 1.2 cm: L = 1 / (sqrt(2) pi sigma^2 n)) is in the slip regime.
/// let s = US1976.state(Altitude::geometric_m(86_000.0)?)?;
/// let kn = knudsen_number(s.mean_free_path_m, 1.0)?;
/// assert_eq!(RarefactionRegime::of(kn)?, RarefactionRegime::Slip);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::NotPositive`] for a mean free path that is not
/// finite and positive; [`Error::OutOfRange`] for a length outside 1e-12..=[`MAX_LENGTH_M`]
/// m; [`Error::NotFinite`] if the quotient overflows.
pub fn knudsen_number(mean_free_path_m: f64, length_m: f64) -> Result<f64> {
    let lambda = positive("mean free path", "m", mean_free_path_m)?;
    let length = within("reference length", "m", length_m, 1e-12, MAX_LENGTH_M)?;
    ratio_within("Knudsen number", lambda / length, 0.0, f64::MAX)
}

/// Ballistic coefficient m / (Cd A), kg/m^2: what sets how a body decelerates in air.
///
/// ```text
/// beta = m / (Cd A)
/// ```
///
/// ```
/// use aerostrata::aero::ballistic_coefficient_kg_m2;
/// // An invented 4 kg rocket, Cd 0.5 on a 78.5 cm^2 frontal area.
/// let beta = ballistic_coefficient_kg_m2(4.0, 0.5, 7.85e-3)?;
/// assert!((beta - 1019.1).abs() < 0.1);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`], [`Error::NotPositive`] or [`Error::RatioNotPositive`] for any
/// input that is not finite and positive; [`Error::RatioOutOfRange`] or
/// [`Error::OutOfRange`] for a drag coefficient above [`MAX_DRAG_COEFFICIENT`] or an area
/// above [`MAX_AREA_M2`]; [`Error::NotFinite`] when the quotient overflows.
pub fn ballistic_coefficient_kg_m2(
    mass_kg: f64,
    drag_coefficient: f64,
    reference_area_m2: f64,
) -> Result<f64> {
    let m = positive("mass", "kg", mass_kg)?;
    let cd = positive_ratio("drag coefficient", drag_coefficient, MAX_DRAG_COEFFICIENT)?;
    let area = positive("reference area", "m^2", reference_area_m2)?;
    let area = within("reference area", "m^2", area, 0.0, MAX_AREA_M2)?;
    within("ballistic coefficient", "kg/m^2", m / (cd * area), 0.0, f64::MAX)
}

/// Terminal velocity, m/s: the speed of steady fall at which drag balances weight, for a
/// body of mass `mass_kg` and reference area `reference_area_m2` with drag curve `curve`,
/// in the air of `state` (whose gravity is used), with the default solver settings
/// ([`SolverSettings::SPEED`]).
///
/// ```text
/// m g = (1/2) rho V^2 Cd(V / a) A
/// V   = sqrt(2 m g / (rho Cd A))                      (constant Cd: closed form)
/// ```
///
/// With a Mach-dependent Cd the balance is solved with the bracketed solver of
/// [`crate::solve`]. The root is bracketed before the first step:
/// V_lo = sqrt(2 m g / (rho A Cd_max)) and V_hi = sqrt(2 m g / (rho A Cd_min)), with Cd_min
/// and Cd_max the table's extreme values, give drag at most and at least the weight,
/// since the curve never leaves [Cd_min, Cd_max]. The solver then converges within the
/// bound of [`crate::solve`]. The table's points between V_lo and V_hi are walked first,
/// so the answer is the slowest balance in the first interval where drag reaches the
/// weight: where drag grows with speed (d(Cd M^2)/dM > 0, true of real drag curves) it is
/// the only one.
///
/// ```
/// use aerostrata::aero::{terminal_velocity_m_s, DragCurve};
/// use aerostrata::{Altitude, Atmosphere, US1976};
/// // An invented 0.5 kg payload under a 0.8 m^2 canopy with Cd 1.5 at sea level:
/// // V = sqrt(2 * 0.5 * 9.80665 / (1.2250 * 1.5 * 0.8)) = 2.583 m/s.
/// let s = US1976.state(Altitude::geometric_m(0.0)?)?;
/// let v = terminal_velocity_m_s(&s, 0.5, 0.8, &DragCurve::constant(1.5)?)?;
/// assert!((v - 2.583).abs() < 5e-4);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::NotPositive`] for a mass or area that is not finite
/// and positive; [`Error::OutOfRange`] for an area above [`MAX_AREA_M2`] or when the
/// terminal velocity would exceed [`MAX_SPEED_M_S`]; [`Error::Undefined`] for a
/// Mach-dependent curve where the state has no speed of sound; [`Error::NoConvergence`]
/// only with [`terminal_velocity_with`] and settings below the solver's bound.
pub fn terminal_velocity_m_s(
    state: &State,
    mass_kg: f64,
    reference_area_m2: f64,
    curve: &DragCurve<'_>,
) -> Result<f64> {
    terminal_velocity_with(state, mass_kg, reference_area_m2, curve, &SolverSettings::SPEED)
}

/// As [`terminal_velocity_m_s`] with explicit solver settings.
///
/// # Errors
/// As [`terminal_velocity_m_s`], and [`Error::NoConvergence`] when `settings` allow too
/// few iterations for their tolerance.
pub fn terminal_velocity_with(
    state: &State,
    mass_kg: f64,
    reference_area_m2: f64,
    curve: &DragCurve<'_>,
    settings: &SolverSettings,
) -> Result<f64> {
    let settings = settings.checked()?;
    let mass = positive("mass", "kg", mass_kg)?;
    let area = positive("reference area", "m^2", reference_area_m2)?;
    let area = within("reference area", "m^2", area, 0.0, MAX_AREA_M2)?;
    // A State from any model is finite and positive; still, it is a public struct.
    let rho = positive("density", "kg/m^3", state.density_kg_m3)?;
    let g = positive("gravity", "m/s^2", state.gravity_m_s2)?;
    let weight = mass * g;
    let speed_for = |cd: f64| sqrt(2.0 * weight / (rho * cd * area));
    let too_fast = |v: f64| Error::OutOfRange {
        quantity: "terminal velocity",
        unit: "m/s",
        value: v,
        min: 0.0,
        max: MAX_SPEED_M_S,
    };
    let v_lo = speed_for(curve.max_cd());
    if !(v_lo.is_finite() && v_lo <= MAX_SPEED_M_S) {
        return Err(too_fast(v_lo));
    }
    if curve.is_constant() || curve.min_cd() == curve.max_cd() {
        return Ok(v_lo);
    }
    let a = positive("speed of sound", "m/s", state.speed_of_sound()?)?;
    // Drag over weight, minus 1: dimensionless, of order 1 near the root.
    let residual = |v: f64| -> Result<f64> {
        let cd = curve.cd_unchecked((v / a).min(MAX_MACH));
        Ok(0.5 * rho * v * v * cd * area / weight - 1.0)
    };
    let mut v_hi = speed_for(curve.min_cd());
    if !(v_hi.is_finite() && v_hi <= MAX_SPEED_M_S) {
        v_hi = MAX_SPEED_M_S;
        if residual(v_hi)? < 0.0 {
            return Err(too_fast(speed_for(curve.min_cd())));
        }
    }
    // Walk the table's points inside (v_lo, v_hi) to the first where drag reaches weight.
    let (mut lo, mut f_lo) = (v_lo, residual(v_lo)?);
    let mut hi = v_hi;
    for &m in curve.mach_points() {
        let v = m * a;
        if v <= lo {
            continue;
        }
        if v >= v_hi {
            break;
        }
        let f = residual(v)?;
        if f >= 0.0 {
            hi = v;
            break;
        }
        lo = v;
        f_lo = f;
    }
    let f_hi = residual(hi)?;
    let v = solve_bracketed("terminal-velocity solver", residual, lo, hi, f_lo, f_hi, &settings)?;
    finite("terminal velocity", v)
}
