//! The maximum dynamic pressure between samples, and an estimate of how far it can be
//! from the maximum of the sampled flight.
//!
//! The value is the vertex of the parabola through the largest sample and its two
//! neighbours (quadratic Lagrange interpolation), exact for a smooth peak to O(dt^3). A
//! corner between samples (burnout: q rising, then falling at once) is what the parabola
//! cuts off, by an amount of order the slopes times dt. The estimate of the error compares
//! local fits (see [`estimate`]): the parabolas through the largest sample's other
//! neighbouring triples, and the corner where a fit of the samples before it meets a fit
//! of the samples after it. Where they agree the peak is smooth and resolved; where they
//! do not, the spread, with a safety factor, is the uncertainty.

use super::summary::Kept;

/// The fraction of the maximum the uncertainty may reach for the peak to count as
/// resolved by the sampling: 0.1 %.
pub const RESOLVED_FRACTION: f64 = 1.0e-3;

/// The factor on the spread of the fits: the corner estimate's own error is of higher
/// order in the spacing than the spread itself, and 1.25 times the spread covers it on
/// the cornered peaks of the tests (crates/aerostrata/tests/flight_loads.rs) with room.
pub const SAFETY_FACTOR: f64 = 1.25;

/// The vertex of the parabola through three samples, and the quadratic Lagrange weights
/// of the three samples there (to carry altitude, velocity and Mach to the same time).
pub(super) struct Vertex {
    pub(super) time_s: f64,
    pub(super) dynamic_pressure_pa: f64,
    pub(super) weights: [f64; 3],
}

impl Vertex {
    /// The quadratic through the three samples' `values` at the vertex's time, held
    /// within the smallest and largest of them: maximum q often falls on a kink of the
    /// velocity (burnout), where the quadratic would overshoot and report, say, a Mach
    /// number at maximum q above the largest Mach number sampled.
    pub(super) fn interpolate(&self, values: [f64; 3]) -> f64 {
        let [a, b, c] = values;
        let value = self.weights[0] * a + self.weights[1] * b + self.weights[2] * c;
        value.max(a.min(b).min(c)).min(a.max(b).max(c))
    }
}

/// The parabola through (t0, q0), (t1, q1), (t2, q2) with q0 < q1 >= q2, in the scaled
/// time s = (t - t1) / (t2 - t0):
///
/// ```text
/// q(s) = q1 + B s + C s^2,   C = (d2 - d0) / (s2 - s0),  B = d0 - C s0,
/// d0 = (q0 - q1) / s0,  d2 = (q2 - q1) / s2,   vertex s* = -B / (2 C)
/// ```
///
/// C < 0 whenever q0 < q1 >= q2, and the vertex lies between the midpoints of the two
/// sample intervals, where q(s*) >= q1. Both facts are enforced against rounding (the
/// vertex clamped to that interval, the peak to at least q1); `None` when the times are
/// so close that the parabola is not finite in f64.
pub(super) fn refine(before: &Kept, peak: &Kept, after: &Kept) -> Option<Vertex> {
    let h = after.time_s - before.time_s;
    let s0 = (before.time_s - peak.time_s) / h;
    let s2 = (after.time_s - peak.time_s) / h;
    let q1 = peak.dynamic_pressure_pa;
    let d0 = (before.dynamic_pressure_pa - q1) / s0;
    let d2 = (after.dynamic_pressure_pa - q1) / s2;
    let c = (d2 - d0) / (s2 - s0);
    let b = d0 - c * s0;
    if !(c < 0.0 && b.is_finite() && s0 < 0.0 && s2 > 0.0) {
        return None;
    }
    // max/min, not f64::clamp: the same for these ordered, finite bounds, without clamp's
    // panic branch and the float formatting its message would link in.
    let s = (-b / (2.0 * c)).max(0.5 * s0).min(0.5 * s2);
    let q = (q1 + b * s + c * s * s).max(q1);
    let weights =
        [s * (s - s2) / (s0 * (s0 - s2)), (s - s0) * (s - s2) / (s0 * s2), s * (s - s0) / (s2 * (s2 - s0))];
    let time_s = (peak.time_s + s * h).max(before.time_s).min(after.time_s);
    (q.is_finite() && weights.iter().all(|w| w.is_finite())).then_some(Vertex {
        time_s,
        dynamic_pressure_pa: q,
        weights,
    })
}

/// A polynomial fit of degree at most 2 through samples: q(t) = a + b (t - t0) + c (t - t0)^2.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Fit {
    t0: f64,
    a: f64,
    b: f64,
    c: f64,
}

impl Fit {
    /// The line through two samples.
    fn line(p: &Kept, q: &Kept) -> Self {
        let b = (q.dynamic_pressure_pa - p.dynamic_pressure_pa) / (q.time_s - p.time_s);
        Self { t0: p.time_s, a: p.dynamic_pressure_pa, b, c: 0.0 }
    }

    /// The parabola through three samples (Newton's divided differences).
    fn parabola(p: &Kept, q: &Kept, r: &Kept) -> Self {
        let d01 = (q.dynamic_pressure_pa - p.dynamic_pressure_pa) / (q.time_s - p.time_s);
        let d12 = (r.dynamic_pressure_pa - q.dynamic_pressure_pa) / (r.time_s - q.time_s);
        let c = (d12 - d01) / (r.time_s - p.time_s);
        Self { t0: p.time_s, a: p.dynamic_pressure_pa, b: d01 - c * (q.time_s - p.time_s), c }
    }

    /// The best fit of a run of samples in time order: the parabola through the three
    /// nearest the corner (the last three), or the line through two.
    fn of(run: [Option<&Kept>; 3], nearest_last: bool) -> Option<Self> {
        let [x, y, z] = if nearest_last { run } else { [run[2], run[1], run[0]] };
        match (x, y, z) {
            (Some(x), Some(y), Some(z)) => Some(Self::parabola(x, y, z)),
            (_, Some(y), Some(z)) => Some(Self::line(y, z)),
            _ => None,
        }
    }

    fn at(&self, t: f64) -> f64 {
        let s = t - self.t0;
        self.a + s * (self.b + s * self.c)
    }

    /// The same polynomial about `t0`.
    fn about(&self, t0: f64) -> Self {
        let d = t0 - self.t0;
        Self { t0, a: self.at(t0), b: self.b + 2.0 * self.c * d, c: self.c }
    }

    /// Where the fit has its maximum within [lo, hi]: its vertex if concave there.
    fn vertex_in(&self, lo: f64, hi: f64) -> Option<f64> {
        let t = self.t0 - self.b / (2.0 * self.c);
        (self.c < 0.0 && t.is_finite() && lo <= t && t <= hi).then_some(t)
    }
}

/// The largest value over [lo, hi] of the lower of two fits where it lies inside the
/// interval (at a fit's vertex or where the two meet), `None` where the largest is at an
/// end (the corner is not in this interval).
fn max_of_lower(f: &Fit, g: &Fit, lo: f64, hi: f64) -> Option<f64> {
    let lower = |t: f64| f.at(t).min(g.at(t));
    let ends = lower(lo).max(lower(hi));
    let mut best = f64::NEG_INFINITY;
    for t in [f.vertex_in(lo, hi), g.vertex_in(lo, hi)].into_iter().flatten() {
        best = best.max(lower(t));
    }
    // f - g = 0 about lo: da + db s + dc s^2.
    let (f, g) = (f.about(lo), g.about(lo));
    let (da, db, dc) = (f.a - g.a, f.b - g.b, f.c - g.c);
    let mut roots = [None, None];
    if dc == 0.0 {
        roots[0] = (db != 0.0).then(|| -da / db);
    } else {
        let disc = db * db - 4.0 * dc * da;
        if disc >= 0.0 {
            // The stable pair: q = -(db + sign(db) sqrt(disc)) / 2, roots q / dc and da / q.
            let q = -0.5 * (db + libm::copysign(crate::math::sqrt(disc), db));
            roots = [Some(q / dc), (q != 0.0).then(|| da / q)];
        }
    }
    for s in roots.into_iter().flatten() {
        if s.is_finite() && (0.0..=hi - lo).contains(&s) {
            best = best.max(lower(lo + s));
        }
    }
    (best > ends).then_some(best)
}

/// The estimates of the peak other than the central parabola's, from the samples around
/// the largest: `around` holds the three before it (nearest first), the largest, and the
/// three after it (nearest first), `None` where the flight has none.
///
/// - The vertices of the parabolas through the two other triples that hold the largest
///   sample (it and the two before; it and the two after), where concave with their
///   vertex between the largest sample's neighbours.
/// - The corner between the largest sample and each neighbour: the fit of the samples on
///   the far side of the corner (the parabola through three, else the line through two)
///   meets the fit of those on the near side, and the highest point of the lower of the
///   two over the interval is the corner's estimate. A side's fit counts only where the
///   other side's fit, carried back to the largest sample, is not below it (else the
///   corner is not in that interval).
///
/// Returns the lowest and highest of them (infinite where there are none), `None` where
/// the largest sample is the first or the last (the maximum may lie outside the record).
pub(super) fn estimate(
    before: [Option<&Kept>; 3],
    peak: &Kept,
    after: [Option<&Kept>; 3],
) -> Option<(f64, f64)> {
    let (b1, a1) = (before[0]?, after[0]?);
    let (lo, hi) = (b1.time_s, a1.time_s);
    let mut low = f64::INFINITY;
    let mut high = f64::NEG_INFINITY;
    let mut take = |value: f64| {
        if value.is_finite() {
            low = low.min(value);
            high = high.max(value);
        }
    };
    for triple in [[before[1], Some(b1), Some(peak)], [Some(peak), Some(a1), after[1]]] {
        if let [Some(x), Some(y), Some(z)] = triple {
            let fit = Fit::parabola(x, y, z);
            if let Some(t) = fit.vertex_in(lo, hi) {
                take(fit.at(t));
            }
        }
    }
    let q = peak.dynamic_pressure_pa;
    // The corner between the largest sample's predecessor and it: before it, the samples
    // before[2], before[1], before[0]; after it, the largest and the two after.
    let rising = Fit::of([before[2], before[1], Some(b1)], true);
    let falling = Fit::of([after[1], Some(a1), Some(peak)], false);
    if let (Some(rising), Some(falling)) = (rising, falling) {
        if rising.at(peak.time_s) >= q {
            if let Some(corner) = max_of_lower(&rising, &falling, lo, peak.time_s) {
                take(corner);
            }
        }
    }
    // The corner between it and its successor.
    let rising = Fit::of([before[1], Some(b1), Some(peak)], true);
    let falling = Fit::of([after[2], after[1], Some(a1)], false);
    if let (Some(rising), Some(falling)) = (rising, falling) {
        if falling.at(peak.time_s) >= q {
            if let Some(corner) = max_of_lower(&rising, &falling, peak.time_s, hi) {
                take(corner);
            }
        }
    }
    Some((low, high))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn kept(t: f64, q: f64) -> Kept {
        Kept { time_s: t, altitude_m: 0.0, velocity_m_s: 0.0, mach: None, dynamic_pressure_pa: q }
    }

    fn around(s: &[Kept; 7]) -> ([Option<&Kept>; 3], &Kept, [Option<&Kept>; 3]) {
        ([Some(&s[2]), Some(&s[1]), Some(&s[0])], &s[3], [Some(&s[4]), Some(&s[5]), Some(&s[6])])
    }

    /// A corner between samples of two parabolic branches: the fits of the branches meet
    /// at the corner exactly (each branch is a parabola), which the central parabola cuts
    /// off.
    #[test]
    fn a_corner_of_two_parabolas_is_found_exactly() {
        let q = |t: f64| {
            if t < 0.4 {
                100.0 + 10.0 * (t - 0.4) + 2.0 * (t - 0.4) * (t - 0.4)
            } else {
                100.0 - 20.0 * (t - 0.4) - 1.0 * (t - 0.4) * (t - 0.4)
            }
        };
        let s: [Kept; 7] = [-3.0, -2.0, -1.0, 0.0, 1.0, 2.0, 3.0].map(|t| kept(t, q(t)));
        let (before, peak, after) = around(&s);
        let (_, high) = estimate(before, peak, after).unwrap();
        assert!((high - 100.0).abs() < 1e-11, "{high}");
        let vertex = refine(before[0].unwrap(), peak, after[0].unwrap()).unwrap();
        assert!(vertex.dynamic_pressure_pa < 99.0, "the parabola cuts the corner off");
    }

    /// On a parabola every fit is the parabola: the estimates agree with its vertex.
    #[test]
    fn a_smooth_peak_gives_agreeing_estimates() {
        let q = |t: f64| 100.0 - 3.0 * (t - 0.3) * (t - 0.3);
        let s: [Kept; 7] = [-3.0, -2.0, -1.0, 0.0, 1.0, 2.0, 3.0].map(|t| kept(t, q(t)));
        let (before, peak, after) = around(&s);
        let (low, high) = estimate(before, peak, after).unwrap();
        assert!((low - 100.0).abs() < 1e-12 && (high - 100.0).abs() < 1e-12, "{low} {high}");
        assert!(estimate([None; 3], peak, after).is_none());
    }
}
