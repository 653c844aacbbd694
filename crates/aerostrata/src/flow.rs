//! Compressible flow of a perfect gas: the isentropic total-to-static ratios and their
//! inverses, the normal shock, and the impact pressure a pitot tube measures (subsonic
//! from the isentropic relation, supersonic from the Rayleigh pitot formula).
//!
//! Every relation is the classical one for a calorically perfect gas with constant ratio
//! of specific heats gamma, as collected in NACA Report 1135, *Equations, Tables and
//! Charts for Compressible Flow* (Ames Research Staff, 1953): its equations for
//! isentropic flow, for the normal shock, and Rayleigh's pitot formula. gamma is a
//! parameter ([`PerfectGas`]); [`PerfectGas::AIR`] (gamma = 1.4) is the default.

use crate::error::{Error, Result};
use crate::math::{exp, exp_m1, ln, ln_1p, sqrt};
use crate::ratio::ratio_within;
use crate::solve::{solve_bracketed, SolverSettings};

/// Highest Mach number any relation here accepts. The perfect-gas model stops describing
/// air long before (vibrational excitation and dissociation set in above Mach 5 to 8),
/// but the formulas stay finite and monotone to here, which keeps every inverse bracketed.
pub const MAX_MACH: f64 = 1.0e3;

/// Lowest Mach number [`PerfectGas::area_ratio`] accepts (A/A* is 5.8e8 there for
/// gamma = 1.4; at Mach 0 it is infinite).
pub const MIN_AREA_RATIO_MACH: f64 = 1.0e-9;

/// ln of the largest finite f64.
const LN_F64_MAX: f64 = 709.782_712_893_384;

#[inline]
fn mach_within(quantity: &'static str, mach: f64, min: f64) -> Result<f64> {
    ratio_within(quantity, mach, min, MAX_MACH)
}

/// Which of the two Mach numbers that share an area ratio is meant.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum MachBranch {
    /// Mach at most 1.
    Subsonic,
    /// Mach at least 1.
    Supersonic,
}

/// A calorically perfect gas, described for compressible flow by its ratio of specific
/// heats gamma alone.
///
/// ```
/// use aerostrata::flow::PerfectGas;
/// // NACA Report 1135, Table I, Mach 2: p/pt = .12780, T/Tt = .55556, A/A* = 1.6875
/// // (from memory of the printed table; half a unit of the last digit).
/// let air = PerfectGas::default();
/// assert!((air.pressure_ratio(2.0)? - 0.12780).abs() <= 0.5e-5);
/// assert!((air.temperature_ratio(2.0)? - 0.55556).abs() <= 0.5e-5);
/// assert!((air.area_ratio(2.0)? - 1.6875).abs() <= 0.5e-4);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct PerfectGas {
    gamma: f64,
}

impl Default for PerfectGas {
    /// Air: gamma = 1.4.
    fn default() -> Self {
        Self::AIR
    }
}

/// The isentropic total-to-static ratios at one Mach number (static over total, as
/// NACA Report 1135 tabulates them).
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Isentropic {
    /// Mach number.
    pub mach: f64,
    /// Static over total pressure p/p0.
    pub pressure_ratio: f64,
    /// Static over total temperature T/T0.
    pub temperature_ratio: f64,
    /// Static over total density rho/rho0.
    pub density_ratio: f64,
}

/// The state behind a normal shock relative to the state ahead of it.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct NormalShock {
    /// Upstream Mach number M1 (at least 1).
    pub upstream_mach: f64,
    /// Downstream Mach number M2 (at most 1).
    pub downstream_mach: f64,
    /// Static pressure ratio p2/p1.
    pub pressure_ratio: f64,
    /// Density ratio rho2/rho1.
    pub density_ratio: f64,
    /// Static temperature ratio T2/T1.
    pub temperature_ratio: f64,
    /// Total-pressure ratio p02/p01 (at most 1: the shock's loss).
    pub total_pressure_ratio: f64,
    /// Pitot pressure over upstream static pressure p02/p1 (the Rayleigh pitot formula).
    pub pitot_pressure_ratio: f64,
}

impl PerfectGas {
    /// Air, gamma = 1.4 (diatomic perfect gas; the value of NACA Report 1135's tables and
    /// of the 1976 standard's speed of sound).
    pub const AIR: PerfectGas = PerfectGas { gamma: 1.4 };

    /// Lowest gamma accepted (heavy hydrocarbon vapours come down to about 1.05).
    pub const MIN_GAMMA: f64 = 1.01;
    /// Highest gamma accepted (a monatomic gas is 5/3).
    pub const MAX_GAMMA: f64 = 1.7;

    /// A perfect gas with ratio of specific heats `gamma`.
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] outside
    /// [`Self::MIN_GAMMA`]..=[`Self::MAX_GAMMA`].
    pub fn new(gamma: f64) -> Result<Self> {
        ratio_within("ratio of specific heats", gamma, Self::MIN_GAMMA, Self::MAX_GAMMA)
            .map(|gamma| Self { gamma })
    }

    /// The ratio of specific heats.
    #[inline]
    pub fn gamma(&self) -> f64 {
        self.gamma
    }

    /// (gamma - 1) / 2, the coefficient of M^2 in the stagnation temperature.
    #[inline]
    fn half_gm1(&self) -> f64 {
        0.5 * (self.gamma - 1.0)
    }

    /// gamma / (gamma - 1), the isentropic exponent of pressure.
    #[inline]
    fn pressure_exponent(&self) -> f64 {
        self.gamma / (self.gamma - 1.0)
    }

    /// ln(1 + (gamma - 1)/2 M^2), computed without losing the small term at low Mach.
    #[inline]
    fn ln_stagnation(&self, mach: f64) -> f64 {
        ln_1p(self.half_gm1() * mach * mach)
    }

    /// Static over total pressure at Mach `mach`.
    ///
    /// ```text
    /// p/p0 = (1 + (gamma-1)/2 M^2)^(-gamma/(gamma-1))
    /// ```
    /// Source: NACA Report 1135, isentropic-flow equations.
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a Mach number outside
    /// 0..=[`MAX_MACH`].
    pub fn pressure_ratio(&self, mach: f64) -> Result<f64> {
        let mach = mach_within("Mach number", mach, 0.0)?;
        Ok(exp(-self.pressure_exponent() * self.ln_stagnation(mach)))
    }

    /// Static over total temperature at Mach `mach`.
    ///
    /// ```text
    /// T/T0 = 1 / (1 + (gamma-1)/2 M^2)
    /// ```
    /// Source: NACA Report 1135, isentropic-flow equations.
    ///
    /// # Errors
    /// As [`Self::pressure_ratio`].
    pub fn temperature_ratio(&self, mach: f64) -> Result<f64> {
        let mach = mach_within("Mach number", mach, 0.0)?;
        Ok(1.0 / (1.0 + self.half_gm1() * mach * mach))
    }

    /// Static over total density at Mach `mach`.
    ///
    /// ```text
    /// rho/rho0 = (1 + (gamma-1)/2 M^2)^(-1/(gamma-1))
    /// ```
    /// Source: NACA Report 1135, isentropic-flow equations.
    ///
    /// # Errors
    /// As [`Self::pressure_ratio`].
    pub fn density_ratio(&self, mach: f64) -> Result<f64> {
        let mach = mach_within("Mach number", mach, 0.0)?;
        Ok(exp(-self.ln_stagnation(mach) / (self.gamma - 1.0)))
    }

    /// All three isentropic ratios at once.
    ///
    /// # Errors
    /// As [`Self::pressure_ratio`].
    pub fn isentropic(&self, mach: f64) -> Result<Isentropic> {
        Ok(Isentropic {
            mach,
            pressure_ratio: self.pressure_ratio(mach)?,
            temperature_ratio: self.temperature_ratio(mach)?,
            density_ratio: self.density_ratio(mach)?,
        })
    }

    /// Ratio of the stream-tube area at Mach `mach` to the sonic (throat) area A*.
    ///
    /// ```text
    /// A/A* = (1/M) [ (2/(gamma+1)) (1 + (gamma-1)/2 M^2) ]^((gamma+1)/(2(gamma-1)))
    /// ```
    /// Source: NACA Report 1135, isentropic-flow equations.
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a Mach number outside
    /// [`MIN_AREA_RATIO_MACH`]..=[`MAX_MACH`], or (gamma near 1) above the Mach number
    /// where A/A* passes the largest f64, which the error names as its maximum.
    pub fn area_ratio(&self, mach: f64) -> Result<f64> {
        let mach = mach_within("Mach number", mach, MIN_AREA_RATIO_MACH)?;
        let ratio = self.area_ratio_unchecked(mach);
        if ratio.is_finite() {
            return Ok(ratio);
        }
        // Near gamma = 1 the exponent (gamma + 1) / (2 (gamma - 1)) is large enough for A/A*
        // to pass the largest f64 below MAX_MACH: name the Mach number where it does.
        let overflow = |m: f64| self.ln_area_ratio(m) >= LN_F64_MAX;
        let (mut lo, mut hi) = (1.0, mach);
        for _ in 0..200 {
            let mid = 0.5 * (lo + hi);
            if mid <= lo || mid >= hi {
                break;
            }
            if overflow(mid) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        Err(Error::RatioOutOfRange {
            quantity: "Mach number",
            value: mach,
            min: MIN_AREA_RATIO_MACH,
            max: lo,
        })
    }

    fn area_ratio_unchecked(&self, mach: f64) -> f64 {
        exp(self.ln_area_ratio(mach))
    }

    /// ln(A/A*), the form the inverse solves in (smooth and of moderate size everywhere).
    fn ln_area_ratio(&self, mach: f64) -> f64 {
        let g = self.gamma;
        let exponent = (g + 1.0) / (2.0 * (g - 1.0));
        exponent * (ln(2.0 / (g + 1.0)) + self.ln_stagnation(mach)) - ln(mach)
    }

    /// The Mach number at which the static-to-total pressure ratio is `ratio`.
    ///
    /// ```text
    /// M = sqrt( (2/(gamma-1)) ((p/p0)^(-(gamma-1)/gamma) - 1) )
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a ratio outside
    /// p/p0([`MAX_MACH`])..=1.
    pub fn mach_from_pressure_ratio(&self, ratio: f64) -> Result<f64> {
        let floor = self.pressure_ratio(MAX_MACH)?;
        let ratio = ratio_within("static-to-total pressure ratio", ratio, floor, 1.0)?;
        let x = exp_m1(-ln(ratio) / self.pressure_exponent());
        Ok(sqrt(x / self.half_gm1()).min(MAX_MACH))
    }

    /// The Mach number at which the static-to-total temperature ratio is `ratio`.
    ///
    /// ```text
    /// M = sqrt( (2/(gamma-1)) (T0/T - 1) )
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a ratio outside
    /// T/T0([`MAX_MACH`])..=1.
    pub fn mach_from_temperature_ratio(&self, ratio: f64) -> Result<f64> {
        let floor = self.temperature_ratio(MAX_MACH)?;
        let ratio = ratio_within("static-to-total temperature ratio", ratio, floor, 1.0)?;
        Ok(sqrt((1.0 / ratio - 1.0) / self.half_gm1()).min(MAX_MACH))
    }

    /// The Mach number at which the static-to-total density ratio is `ratio`.
    ///
    /// ```text
    /// M = sqrt( (2/(gamma-1)) ((rho/rho0)^(-(gamma-1)) - 1) )
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a ratio outside
    /// rho/rho0([`MAX_MACH`])..=1.
    pub fn mach_from_density_ratio(&self, ratio: f64) -> Result<f64> {
        let floor = self.density_ratio(MAX_MACH)?;
        let ratio = ratio_within("static-to-total density ratio", ratio, floor, 1.0)?;
        let x = exp_m1(-(self.gamma - 1.0) * ln(ratio));
        Ok(sqrt(x / self.half_gm1()).min(MAX_MACH))
    }

    /// The Mach number on `branch` at which the area ratio A/A* is `ratio`, with the
    /// default solver settings ([`SolverSettings::MACH`]).
    ///
    /// Solved for ln(A/A*) with the bracketed solver of [`crate::solve`] on
    /// [`MIN_AREA_RATIO_MACH`]..=1 (subsonic) or 1..=[`MAX_MACH`] (supersonic), where
    /// A/A* is strictly monotone, so the root is unique and always bracketed.
    ///
    /// ```
    /// use aerostrata::flow::{MachBranch, PerfectGas};
    /// let air = PerfectGas::AIR;
    /// let m = air.mach_from_area_ratio(1.6875, MachBranch::Supersonic)?;
    /// assert!((m - 2.0).abs() < 1e-4); // A/A* is printed to 5 digits
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a ratio below 1 or above
    /// the branch's A/A* at its far end; [`Error::NoConvergence`] is not reachable with
    /// the default settings (see [`crate::solve`] for the bound).
    pub fn mach_from_area_ratio(&self, ratio: f64, branch: MachBranch) -> Result<f64> {
        self.mach_from_area_ratio_with(ratio, branch, &SolverSettings::MACH)
    }

    /// As [`Self::mach_from_area_ratio`] with explicit solver settings.
    ///
    /// # Errors
    /// As [`Self::mach_from_area_ratio`], and [`Error::NoConvergence`] when `settings`
    /// allow too few iterations for their tolerance.
    pub fn mach_from_area_ratio_with(
        &self,
        ratio: f64,
        branch: MachBranch,
        settings: &SolverSettings,
    ) -> Result<f64> {
        let settings = settings.checked()?;
        let (lo, hi) = match branch {
            MachBranch::Subsonic => (MIN_AREA_RATIO_MACH, 1.0),
            MachBranch::Supersonic => (1.0, MAX_MACH),
        };
        let far = match branch {
            MachBranch::Subsonic => self.area_ratio_unchecked(lo),
            MachBranch::Supersonic => self.area_ratio_unchecked(hi),
        };
        let ratio = ratio_within("area ratio A/A*", ratio, 1.0, far)?;
        if ratio == 1.0 {
            return Ok(1.0);
        }
        let target = ln(ratio);
        let f = |m: f64| Ok(self.ln_area_ratio(m) - target);
        let (f_lo, f_hi) = (f(lo)?, f(hi)?);
        solve_bracketed("Mach-from-area-ratio solver", f, lo, hi, f_lo, f_hi, &settings)
    }

    /// The state behind a normal shock standing in a flow of upstream Mach number `mach`.
    ///
    /// ```text
    /// M2^2    = (1 + (gamma-1)/2 M1^2) / (gamma M1^2 - (gamma-1)/2)
    /// p2/p1   = 1 + 2 gamma/(gamma+1) (M1^2 - 1)
    /// rho2/rho1 = (gamma+1) M1^2 / ((gamma-1) M1^2 + 2)
    /// T2/T1   = (p2/p1) / (rho2/rho1)
    /// p02/p01 = (rho2/rho1)^(gamma/(gamma-1)) ((gamma+1)/(2 gamma M1^2 - (gamma-1)))^(1/(gamma-1))
    /// p02/p1  = ((gamma+1)^2 M1^2 / (4 gamma M1^2 - 2(gamma-1)))^(gamma/(gamma-1))
    ///           (1 - gamma + 2 gamma M1^2) / (gamma+1)                (Rayleigh)
    /// ```
    /// Source: NACA Report 1135, the normal-shock equations and Rayleigh's pitot formula.
    ///
    /// ```
    /// use aerostrata::flow::PerfectGas;
    /// // NACA Report 1135, Table II, M1 = 2: M2 = .5774, p2/p1 = 4.5000,
    /// // pt2/pt1 = .7209 (from memory of the printed table).
    /// let shock = PerfectGas::AIR.normal_shock(2.0)?;
    /// assert!((shock.downstream_mach - 0.5774).abs() <= 0.5e-4);
    /// assert!((shock.pressure_ratio - 4.5).abs() <= 0.5e-4);
    /// assert!((shock.total_pressure_ratio - 0.7209).abs() <= 0.5e-4);
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for an upstream Mach number
    /// outside 1..=[`MAX_MACH`] (no normal shock stands in subsonic flow).
    pub fn normal_shock(&self, mach: f64) -> Result<NormalShock> {
        let m1 = mach_within("upstream Mach number", mach, 1.0)?;
        let g = self.gamma;
        let m1sq = m1 * m1;
        let m2sq = (1.0 + self.half_gm1() * m1sq) / (g * m1sq - self.half_gm1());
        let pressure_ratio = 1.0 + 2.0 * g / (g + 1.0) * (m1sq - 1.0);
        let density_ratio = (g + 1.0) * m1sq / ((g - 1.0) * m1sq + 2.0);
        let temperature_ratio = pressure_ratio / density_ratio;
        let ln_total = self.pressure_exponent() * ln(density_ratio)
            - ln((2.0 * g * m1sq - (g - 1.0)) / (g + 1.0)) / (g - 1.0);
        Ok(NormalShock {
            upstream_mach: m1,
            downstream_mach: sqrt(m2sq).min(1.0),
            pressure_ratio,
            density_ratio,
            temperature_ratio,
            // The shock only loses total pressure; rounding near M1 = 1 must not say otherwise.
            total_pressure_ratio: exp(ln_total).min(1.0),
            pitot_pressure_ratio: exp(self.ln_rayleigh(m1)),
        })
    }

    /// ln of the Rayleigh pitot formula p02/p1, for M >= 1.
    fn ln_rayleigh(&self, mach: f64) -> f64 {
        let g = self.gamma;
        let msq = mach * mach;
        self.pressure_exponent() * ln((g + 1.0) * (g + 1.0) * msq / (4.0 * g * msq - 2.0 * (g - 1.0)))
            + ln((1.0 - g + 2.0 * g * msq) / (g + 1.0))
    }

    /// qc/p at the sonic point, where the two pitot formulas meet:
    /// ((gamma+1)/2)^(gamma/(gamma-1)) - 1 (0.892929... for gamma = 1.4).
    pub fn sonic_impact_pressure_ratio(&self) -> f64 {
        exp_m1(self.pressure_exponent() * ln(0.5 * (self.gamma + 1.0)))
    }

    /// Impact pressure over static pressure, qc/p, at flight Mach number `mach`: what a
    /// pitot-static system measures, (pitot pressure - static pressure) / static pressure.
    ///
    /// ```text
    /// qc/p = (1 + (gamma-1)/2 M^2)^(gamma/(gamma-1)) - 1        M <= 1 (isentropic)
    /// qc/p = p02/p1 (Rayleigh pitot formula) - 1                M >= 1
    /// ```
    /// Above Mach 1 a normal shock stands ahead of the probe and the probe reads the total
    /// pressure behind it. The two forms meet at Mach 1. Source: NACA Report 1135 (the
    /// isentropic pressure ratio and Rayleigh's pitot formula).
    ///
    /// ```
    /// use aerostrata::flow::PerfectGas;
    /// // NACA Report 1135, Table II, M1 = 2: p1/pt2 = .1773 (from memory of the printed
    /// // table), so qc/p = 1/.1773 - 1 within the table's half unit.
    /// let qc_p = PerfectGas::AIR.impact_pressure_ratio(2.0)?;
    /// assert!((1.0 / (qc_p + 1.0) - 0.1773).abs() <= 0.5e-4);
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a Mach number outside
    /// 0..=[`MAX_MACH`].
    pub fn impact_pressure_ratio(&self, mach: f64) -> Result<f64> {
        let mach = mach_within("Mach number", mach, 0.0)?;
        Ok(self.impact_pressure_ratio_unchecked(mach))
    }

    fn impact_pressure_ratio_unchecked(&self, mach: f64) -> f64 {
        if mach <= 1.0 {
            exp_m1(self.pressure_exponent() * self.ln_stagnation(mach))
        } else {
            exp_m1(self.ln_rayleigh(mach))
        }
    }

    /// Impact pressure qc, Pa, at static pressure `static_pressure_pa` and Mach `mach`.
    ///
    /// ```text
    /// qc = p (qc/p)(M)
    /// ```
    ///
    /// # Errors
    /// As [`Self::impact_pressure_ratio`], and [`Error::NotFinite`],
    /// [`Error::NotPositive`] or [`Error::OutOfRange`] for a static pressure that is not
    /// finite, positive and at most [`crate::gas::MAX_PRESSURE_PA`].
    pub fn impact_pressure_pa(&self, static_pressure_pa: f64, mach: f64) -> Result<f64> {
        let p = crate::error::positive("static pressure", "Pa", static_pressure_pa)?;
        let p = crate::error::within("static pressure", "Pa", p, 0.0, crate::gas::MAX_PRESSURE_PA)?;
        Ok(p * self.impact_pressure_ratio(mach)?)
    }

    /// The flight Mach number at which the impact-to-static pressure ratio qc/p is
    /// `ratio`, with the default solver settings ([`SolverSettings::MACH`]).
    ///
    /// Up to the sonic value ([`Self::sonic_impact_pressure_ratio`]) the isentropic
    /// relation is inverted in closed form; above it the Rayleigh formula, strictly
    /// increasing in M for M >= 1, is solved on 1..=[`MAX_MACH`] by the bracketed solver
    /// of [`crate::solve`] (unique root, always bracketed).
    ///
    /// ```text
    /// M = sqrt( (2/(gamma-1)) ((qc/p + 1)^((gamma-1)/gamma) - 1) )     qc/p <= sonic
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a ratio outside
    /// 0..=qc/p([`MAX_MACH`]).
    pub fn mach_from_impact_pressure_ratio(&self, ratio: f64) -> Result<f64> {
        self.mach_from_impact_pressure_ratio_with(ratio, &SolverSettings::MACH)
    }

    /// As [`Self::mach_from_impact_pressure_ratio`] with explicit solver settings.
    ///
    /// # Errors
    /// As [`Self::mach_from_impact_pressure_ratio`], and [`Error::NoConvergence`] when
    /// `settings` allow too few iterations for their tolerance.
    pub fn mach_from_impact_pressure_ratio_with(&self, ratio: f64, settings: &SolverSettings) -> Result<f64> {
        let settings = settings.checked()?;
        let ceiling = self.impact_pressure_ratio_unchecked(MAX_MACH);
        let ratio = ratio_within("impact-to-static pressure ratio", ratio, 0.0, ceiling)?;
        let sonic = self.sonic_impact_pressure_ratio();
        if ratio <= sonic {
            let x = exp_m1(ln_1p(ratio) / self.pressure_exponent());
            return Ok(sqrt(x / self.half_gm1()).min(1.0));
        }
        let target = ln_1p(ratio);
        let f = |m: f64| Ok(self.ln_rayleigh(m) - target);
        let (f_lo, f_hi) = (f(1.0)?, f(MAX_MACH)?);
        solve_bracketed("Mach-from-impact-pressure solver", f, 1.0, MAX_MACH, f_lo, f_hi, &settings)
    }
}
