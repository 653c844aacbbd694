//! Drag coefficient as a function of Mach number: a constant, or a user table read
//! linearly or by a monotone piecewise cubic (Fritsch and Carlson's conditions with
//! Hyman's node-wise limiter; the references are on [`DragCurve`]), and the piece of the
//! curve the flight scan keeps between nearby Mach numbers.

use crate::error::{Error, Result};
use crate::flow::MAX_MACH;
use crate::ratio::{positive_ratio, ratio_within};

use super::limits::MAX_DRAG_COEFFICIENT;

/// How a drag-coefficient table is read between its points.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Interpolation {
    /// Straight lines between points.
    Linear,
    /// A piecewise cubic Hermite curve with slopes limited so that it is monotone
    /// wherever the data are, never overshoots a point's neighbours and has a continuous
    /// slope (Fritsch and Carlson's conditions; see [`DragCurve`]).
    #[default]
    MonotoneCubic,
}

#[derive(Debug, Clone, Copy, PartialEq)]
enum Curve<'a> {
    Constant(f64),
    Table { mach: &'a [f64], cd: &'a [f64], interpolation: Interpolation, min_cd: f64, max_cd: f64 },
}

/// A drag coefficient as a function of Mach number: a constant, or a user table of
/// (Mach, Cd) points held as borrowed slices (no allocation).
///
/// Between points the table is read linearly or by a monotone cubic
/// ([`Interpolation`]). The cubic is the piecewise cubic Hermite interpolant whose slope
/// at each interior point starts as the three-point (parabolic) estimate and is then
/// limited node by node: set to 0 where the data have a local extremum (the secants on
/// either side differ in sign or one is 0), otherwise capped at 3 times the smaller
/// adjacent secant. That keeps both slope ratios alpha = m_i / delta and
/// beta = m_(i+1) / delta of every interval in [0, 3], inside the region where Fritsch
/// and Carlson proved the cubic monotone (F. N. Fritsch and R. E. Carlson, "Monotone
/// Piecewise Cubic Interpolation", SIAM J. Numer. Anal. 17 (1980) 238-246); the node-wise
/// form of the cap, which makes each evaluation local and order-independent, is
/// J. M. Hyman's ("Accurate monotonicity-preserving cubic interpolation", SIAM J. Sci.
/// Stat. Comput. 4 (1983) 645-654). End slopes are the end secants. So on every interval
/// Cd stays between the interval's end values, and is positive.
///
/// Outside the table the end values are held: Cd(M) = Cd(first) below the first Mach
/// number and Cd(last) above the last. Extrapolating a drag curve is never reliable, and
/// holding keeps Cd positive and bounded; [`DragCurve::cd_in_table`] reports an error
/// instead, for callers who want to know.
///
/// ```
/// use aerostrata::aero::{DragCurve, Interpolation};
/// // An invented small rocket's drag rise.
/// let mach = [0.0, 0.8, 1.05, 1.5, 3.0];
/// let cd = [0.45, 0.43, 0.68, 0.55, 0.40];
/// let curve = DragCurve::table(&mach, &cd, Interpolation::MonotoneCubic)?;
/// assert_eq!(curve.cd(1.05)?, 0.68);
/// let between = curve.cd(0.9)?;
/// assert!(between > 0.43 && between < 0.68); // monotone between points
/// assert_eq!(curve.cd(5.0)?, 0.40); // held beyond the table
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DragCurve<'a> {
    curve: Curve<'a>,
}

impl DragCurve<'static> {
    /// A Mach-independent drag coefficient.
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioNotPositive`] for a coefficient that is not
    /// finite and positive; [`Error::RatioOutOfRange`] above [`MAX_DRAG_COEFFICIENT`].
    pub fn constant(drag_coefficient: f64) -> Result<Self> {
        let cd = positive_ratio("drag coefficient", drag_coefficient, MAX_DRAG_COEFFICIENT)?;
        Ok(Self { curve: Curve::Constant(cd) })
    }
}

fn invalid(index: usize, problem: &'static str, value: f64) -> Error {
    Error::InvalidPoint { table: "drag table", index, problem, value }
}

impl<'a> DragCurve<'a> {
    /// A table of drag coefficients `cd` at Mach numbers `mach`, read by
    /// `interpolation`.
    ///
    /// # Errors
    /// [`Error::InvalidPoint`] (naming the point, counted from 0) when the two slices
    /// differ in length or hold fewer than 2 points, a Mach number is not finite, is
    /// negative, exceeds [`MAX_MACH`] or does not increase strictly, or a drag coefficient
    /// is not finite, not positive or above [`MAX_DRAG_COEFFICIENT`].
    pub fn table(mach: &'a [f64], cd: &'a [f64], interpolation: Interpolation) -> Result<Self> {
        if mach.len() != cd.len() {
            return Err(invalid(
                mach.len().min(cd.len()),
                "the Mach and Cd columns must have the same length; Cd count",
                cd.len() as f64,
            ));
        }
        if mach.len() < 2 {
            return Err(invalid(0, "a table needs at least 2 points; point count", mach.len() as f64));
        }
        let mut min_cd = f64::MAX;
        let mut max_cd = 0.0f64;
        for (index, (&m, &c)) in mach.iter().zip(cd).enumerate() {
            if !(m.is_finite() && (0.0..=MAX_MACH).contains(&m)) {
                return Err(invalid(index, "Mach number must be finite and within 0 to 1000", m));
            }
            if index > 0 && m <= mach[index - 1] {
                return Err(invalid(index, "Mach number must be above the previous point's", m));
            }
            if !(c.is_finite() && c > 0.0 && c <= MAX_DRAG_COEFFICIENT) {
                return Err(invalid(index, "drag coefficient must be finite, above 0 and at most 100", c));
            }
            min_cd = min_cd.min(c);
            max_cd = max_cd.max(c);
        }
        Ok(Self { curve: Curve::Table { mach, cd, interpolation, min_cd, max_cd } })
    }

    /// Whether Cd is the same at every Mach number.
    pub fn is_constant(&self) -> bool {
        matches!(self.curve, Curve::Constant(_))
    }

    /// The table's Mach numbers (empty for a constant).
    pub fn mach_points(&self) -> &[f64] {
        match self.curve {
            Curve::Constant(_) => &[],
            Curve::Table { mach, .. } => mach,
        }
    }

    /// The smallest Cd the curve takes anywhere (the smallest table value: neither
    /// interpolation nor holding the ends goes below it).
    pub fn min_cd(&self) -> f64 {
        match self.curve {
            Curve::Constant(cd) => cd,
            Curve::Table { min_cd, .. } => min_cd,
        }
    }

    /// The largest Cd the curve takes anywhere.
    pub fn max_cd(&self) -> f64 {
        match self.curve {
            Curve::Constant(cd) => cd,
            Curve::Table { max_cd, .. } => max_cd,
        }
    }

    /// The drag coefficient at Mach `mach`, holding the end values outside the table.
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a Mach number outside
    /// 0..=[`MAX_MACH`].
    pub fn cd(&self, mach: f64) -> Result<f64> {
        let mach = ratio_within("Mach number", mach, 0.0, MAX_MACH)?;
        Ok(self.cd_unchecked(mach))
    }

    /// The drag coefficient at Mach `mach`, which must lie inside the table.
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::RatioOutOfRange`] for a Mach number outside the
    /// table's first to last Mach number (0..=[`MAX_MACH`] for a constant).
    pub fn cd_in_table(&self, mach: f64) -> Result<f64> {
        let (lo, hi) = match self.curve {
            Curve::Constant(_) => (0.0, MAX_MACH),
            Curve::Table { mach, .. } => (mach[0], mach[mach.len() - 1]),
        };
        let mach = ratio_within("Mach number", mach, lo, hi)?;
        Ok(self.cd_unchecked(mach))
    }

    /// Cd at a finite, non-negative Mach number.
    #[inline]
    pub(crate) fn cd_unchecked(&self, m: f64) -> f64 {
        self.segment(m).cd(m)
    }

    /// The piece of the curve that holds Mach `m` (finite, non-negative): what
    /// [`DragCurve::cd`] evaluates, and what a caller evaluating many nearby Mach numbers
    /// (the flight scan) can keep and reuse while [`CdSegment::holds`] says so.
    pub(crate) fn segment(&self, m: f64) -> CdSegment {
        let held = |from: f64, to: f64, cd: f64| CdSegment {
            from,
            to,
            x0: 0.0,
            h: 1.0,
            c: [cd, 0.0, 0.0, 0.0],
            lo: cd,
            hi: cd,
        };
        let (mach, cd, interpolation) = match self.curve {
            Curve::Constant(cd) => return held(f64::NEG_INFINITY, f64::INFINITY, cd),
            Curve::Table { mach, cd, interpolation, .. } => (mach, cd, interpolation),
        };
        let last = mach.len() - 1;
        if m < mach[0] {
            return held(f64::NEG_INFINITY, mach[0], cd[0]);
        }
        if m >= mach[last] {
            return held(mach[last], f64::INFINITY, cd[last]);
        }
        // The interval [mach[i], mach[i + 1]) holding m; 0 <= i < last.
        let i = mach.partition_point(|&x| x <= m) - 1;
        let (x0, h) = (mach[i], mach[i + 1] - mach[i]);
        let (y0, y1) = (cd[i], cd[i + 1]);
        let c = match interpolation {
            Interpolation::Linear => [y0, y1 - y0, 0.0, 0.0],
            Interpolation::MonotoneCubic => {
                // The cubic Hermite form y0 h00 + h m0 h10 + y1 h01 + h m1 h11 on t in [0, 1],
                // collected in powers of t.
                let (d0, d1) = (h * slope(mach, cd, i), h * slope(mach, cd, i + 1));
                [y0, d0, 3.0 * (y1 - y0) - 2.0 * d0 - d1, 2.0 * (y0 - y1) + d0 + d1]
            }
        };
        CdSegment { from: x0, to: mach[i + 1], x0, h, c, lo: y0.min(y1), hi: y0.max(y1) }
    }
}

/// One piece of a drag curve: a cubic in t = (M - x0) / h on [from, to), kept between the
/// piece's end values.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct CdSegment {
    from: f64,
    to: f64,
    x0: f64,
    h: f64,
    c: [f64; 4],
    lo: f64,
    hi: f64,
}

impl CdSegment {
    /// Whether Mach `m` lies in this piece.
    #[inline]
    pub(crate) fn holds(&self, m: f64) -> bool {
        self.from <= m && m < self.to
    }

    /// Cd at Mach `m` in this piece.
    #[inline]
    pub(crate) fn cd(&self, m: f64) -> f64 {
        let t = (m - self.x0) / self.h;
        let [c0, c1, c2, c3] = self.c;
        // Mathematically inside [lo, hi] (see `DragCurve`); keep rounding there too.
        // max/min, not f64::clamp: the same result for lo <= hi, without clamp's panic
        // branch (whose message formatting would link float formatting into every
        // firmware and wasm binary).
        (c0 + t * (c1 + t * (c2 + t * c3))).max(self.lo).min(self.hi)
    }
}

/// The limited slope dCd/dM at table point `k` (see [`DragCurve`]).
fn slope(mach: &[f64], cd: &[f64], k: usize) -> f64 {
    let last = mach.len() - 1;
    let secant = |j: usize| (cd[j + 1] - cd[j]) / (mach[j + 1] - mach[j]);
    if k == 0 {
        return secant(0);
    }
    if k == last {
        return secant(last - 1);
    }
    let (left, right) = (secant(k - 1), secant(k));
    if left == 0.0 || right == 0.0 || (left > 0.0) != (right > 0.0) {
        return 0.0;
    }
    let (h_left, h_right) = (mach[k] - mach[k - 1], mach[k + 1] - mach[k]);
    let parabolic = (h_right * left + h_left * right) / (h_left + h_right);
    let cap = 3.0 * left.abs().min(right.abs());
    // max/min rather than f64::clamp, as in `CdSegment::cd`.
    parabolic.max(-cap).min(cap)
}
