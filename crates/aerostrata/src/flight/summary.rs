//! The summary of a flight: the maximum dynamic pressure refined between samples by the
//! parabola through the largest sample and its two neighbours (quadratic Lagrange
//! interpolation), the largest Mach number and drag, the Mach 1 crossings.

use super::point::FlightPoint;

/// The maximum of the dynamic pressure, refined between samples.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Peak {
    /// Time of the maximum, s.
    pub time_s: f64,
    /// Geometric altitude at that time, m.
    pub altitude_m: f64,
    /// Velocity at that time, m/s.
    pub velocity_m_s: f64,
    /// Mach number at that time (where all three samples have one).
    pub mach: Option<f64>,
    /// The maximum dynamic pressure, Pa: never below any sample's.
    pub dynamic_pressure_pa: f64,
    /// Index (from 0) of the largest sample.
    pub sample_index: usize,
    /// Whether the parabola refined it; `false` when the largest sample is the first or
    /// last so far, or the three samples are too close in time to form a parabola in
    /// f64, and the sample itself is reported.
    pub refined: bool,
}

/// The largest value of a quantity over the samples (not refined).
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Extreme {
    /// The value.
    pub value: f64,
    /// Time of the sample, s.
    pub time_s: f64,
    /// Geometric altitude of the sample, m.
    pub altitude_m: f64,
    /// Velocity of the sample, m/s.
    pub velocity_m_s: f64,
    /// Index (from 0) of the sample.
    pub sample_index: usize,
}

/// The crossings of Mach 1 in one direction.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Crossings {
    /// How many (saturating at u32::MAX).
    pub count: u32,
    /// Time of the first, s, interpolated linearly in Mach between the two samples.
    pub first_time_s: Option<f64>,
    /// Time of the last, s.
    pub last_time_s: Option<f64>,
}

impl Crossings {
    pub(super) fn record(&mut self, time_s: f64) {
        self.count = self.count.saturating_add(1);
        self.first_time_s.get_or_insert(time_s);
        self.last_time_s = Some(time_s);
    }
}

/// The summary of a scanned flight.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct FlightSummary {
    /// Samples accepted.
    pub samples: usize,
    /// Maximum dynamic pressure (`None` before the first sample).
    pub max_dynamic_pressure: Option<Peak>,
    /// Largest Mach number of any sample.
    pub max_mach: Option<Extreme>,
    /// Crossings from below Mach 1 to Mach 1 or above (M_prev < 1 <= M).
    pub mach_one_up: Crossings,
    /// Crossings from Mach 1 or above to below Mach 1 (M_prev >= 1 > M).
    pub mach_one_down: Crossings,
    /// Largest drag of any sample (with a vehicle), N.
    pub max_drag: Option<Extreme>,
}

/// What the scan keeps of a sample: enough for the crossings and the parabola.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) struct Kept {
    pub(super) time_s: f64,
    pub(super) altitude_m: f64,
    pub(super) velocity_m_s: f64,
    pub(super) mach: Option<f64>,
    pub(super) dynamic_pressure_pa: f64,
}

impl From<&FlightPoint> for Kept {
    fn from(point: &FlightPoint) -> Self {
        Self {
            time_s: point.time_s,
            altitude_m: point.altitude_m,
            velocity_m_s: point.velocity_m_s,
            mach: point.mach,
            dynamic_pressure_pa: point.dynamic_pressure_pa,
        }
    }
}

pub(super) fn extreme(value: f64, point: &FlightPoint, sample_index: usize) -> Extreme {
    Extreme {
        value,
        time_s: point.time_s,
        altitude_m: point.altitude_m,
        velocity_m_s: point.velocity_m_s,
        sample_index,
    }
}

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
