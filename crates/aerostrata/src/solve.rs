//! The bracketed root finder every iterative inverse of the core uses (an altitude from a
//! property of the air, a Mach number from an area or impact-pressure ratio, a terminal
//! velocity), with its tolerances: regula falsi with the Illinois modification (M. Dowell
//! and P. Jarratt, BIT 11 (1971) 168-174; from memory), safeguarded by bisection.
//!
//! # The bracketed solver and its guarantee
//!
//! The solver keeps an interval [a, b] on which the residual changes sign. Each step
//! tries a regula-falsi point with the Illinois modification (the retained end's residual
//! is halved when the same end is kept twice, which makes the method superlinear), and
//! falls back to bisection whenever the interpolated point is not strictly inside the
//! interval. Every third step is a bisection unless the two steps before it have already
//! halved the interval, so the interval at least halves every three residual
//! evaluations: from width W to the tolerance t it takes at most 3 ceil(log2(W / t))
//! evaluations besides the two at the ends, whatever the function (the method never
//! leaves the bracket, so it converges to a sign change even of a discontinuous
//! function, such as the standard's own small step at 86 km, where it returns the
//! altitude of the step). The default settings allow 200 evaluations, above that bound
//! for every bracket the core solves: an altitude (W <= 1.1e7 m, t >= 1e-7 m) needs at
//! most 141, a Mach number (W < 1000, t >= 1e-14) at most 171, a terminal velocity
//! (W < 1e8 m/s, t >= 1e-9 m/s) at most 171. [`Error::NoConvergence`] therefore only
//! appears with settings that allow fewer iterations than the bound.

use crate::error::{finite, Error, Result};
use crate::ratio::ratio_within;

/// Tolerance and iteration budget of the bracketed solver.
///
/// The solver stops when the bracket is narrower than
/// `absolute_tolerance + relative_tolerance * max(|a|, |b|)` (in the unit of the
/// unknown), or when it cannot be split further in f64. The budget of the constants below
/// is above the solver's bound for every bracket the core solves (see the
/// [module docs](self)), so with them [`Error::NoConvergence`] cannot occur.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct SolverSettings {
    /// Absolute tolerance on the unknown, in its unit; at least 0.
    pub absolute_tolerance: f64,
    /// Relative tolerance on the unknown; at least 0.
    pub relative_tolerance: f64,
    /// Most residual evaluations allowed; at least 1.
    pub max_iterations: u32,
}

/// Four units in the last place: the relative resolution the solvers aim for.
const FOUR_ULPS: f64 = 4.0 * f64::EPSILON;

impl SolverSettings {
    /// For altitudes, m: 1e-7 m (a pressure error below 2e-11 relative) plus 4 ulps.
    pub const ALTITUDE: SolverSettings =
        SolverSettings { absolute_tolerance: 1e-7, relative_tolerance: FOUR_ULPS, max_iterations: 200 };
    /// For Mach numbers: 1e-14 plus 4 ulps.
    pub const MACH: SolverSettings =
        SolverSettings { absolute_tolerance: 1e-14, relative_tolerance: FOUR_ULPS, max_iterations: 200 };
    /// For speeds, m/s: 1e-9 m/s plus 4 ulps.
    pub const SPEED: SolverSettings =
        SolverSettings { absolute_tolerance: 1e-9, relative_tolerance: FOUR_ULPS, max_iterations: 200 };

    /// Settings with the given tolerances and iteration budget, checked.
    ///
    /// # Errors
    /// [`Error::NotFinite`] for a NaN or infinite tolerance; [`Error::RatioOutOfRange`]
    /// for a negative tolerance, or an iteration budget of 0 (it must be 1 to
    /// 4294967295).
    pub fn new(absolute_tolerance: f64, relative_tolerance: f64, max_iterations: u32) -> Result<Self> {
        SolverSettings { absolute_tolerance, relative_tolerance, max_iterations }.checked()
    }

    /// These settings if they are valid (the fields are public, so every solver checks).
    pub(crate) fn checked(&self) -> Result<Self> {
        ratio_within("solver absolute tolerance", self.absolute_tolerance, 0.0, f64::MAX)?;
        ratio_within("solver relative tolerance", self.relative_tolerance, 0.0, f64::MAX)?;
        if self.max_iterations == 0 {
            return Err(Error::RatioOutOfRange {
                quantity: "solver iteration budget",
                value: 0.0,
                min: 1.0,
                max: f64::from(u32::MAX),
            });
        }
        Ok(*self)
    }
}

/// A root of `f` in the bracket [`lo`, `hi`], where `f(lo) = f_lo` and `f(hi) = f_hi`
/// differ in sign (see the module docs for the method and its bound).
///
/// Callers check that the target lies between the end values before they call; if the
/// two ends still agree in sign, that can only be rounding at one end, and the end whose
/// residual is smaller is returned. A residual that is not finite is an error.
pub(crate) fn solve_bracketed<F>(
    solver: &'static str,
    mut f: F,
    lo: f64,
    hi: f64,
    f_lo: f64,
    f_hi: f64,
    settings: &SolverSettings,
) -> Result<f64>
where
    F: FnMut(f64) -> Result<f64>,
{
    let (mut a, mut b, mut fa, mut fb) = if lo <= hi { (lo, hi, f_lo, f_hi) } else { (hi, lo, f_hi, f_lo) };
    finite(solver, fa)?;
    finite(solver, fb)?;
    if fa == 0.0 {
        return Ok(a);
    }
    if fb == 0.0 {
        return Ok(b);
    }
    if (fa > 0.0) == (fb > 0.0) {
        return Ok(if fa.abs() <= fb.abs() { a } else { b });
    }
    // The true residuals at the ends (the Illinois step scales the working copies).
    let (mut true_fa, mut true_fb) = (fa, fb);
    // Which end the last step replaced: -1 for a, +1 for b, 0 for none yet.
    let mut replaced = 0i8;
    let mut checkpoint_width = b - a;
    for iteration in 1..=settings.max_iterations {
        let width = b - a;
        let scale = a.abs().max(b.abs());
        let middle = a + 0.5 * width;
        if width <= settings.absolute_tolerance + settings.relative_tolerance * scale
            || middle <= a
            || middle >= b
        {
            return Ok(if true_fa.abs() <= true_fb.abs() { a } else { b });
        }
        if iteration % 3 == 1 {
            checkpoint_width = width;
        }
        let force_bisection = iteration % 3 == 0 && width > 0.5 * checkpoint_width;
        let interpolated = b - fb * (b - a) / (fb - fa);
        let x =
            if force_bisection || !(interpolated > a && interpolated < b) { middle } else { interpolated };
        let fx = f(x)?;
        finite(solver, fx)?;
        if fx == 0.0 {
            return Ok(x);
        }
        if (fx > 0.0) == (fa > 0.0) {
            a = x;
            fa = fx;
            true_fa = fx;
            if replaced == -1 {
                fb *= 0.5;
            }
            replaced = -1;
        } else {
            b = x;
            fb = fx;
            true_fb = fx;
            if replaced == 1 {
                fa *= 0.5;
            }
            replaced = 1;
        }
    }
    Err(Error::NoConvergence { solver, iterations: settings.max_iterations })
}
