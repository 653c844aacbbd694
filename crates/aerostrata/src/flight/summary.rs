//! The summary of a flight: the maximum dynamic pressure refined between samples, with
//! its uncertainty (see [`super::peak`]), the largest Mach number, drag and q-alpha, the
//! Mach 1 crossings, and the samples where the Mach number or the wind is not known.

use super::point::FlightPoint;

/// The maximum of the dynamic pressure, refined between samples.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Peak {
    /// Time of the maximum, s.
    pub time_s: f64,
    /// Geometric altitude at that time, m.
    pub altitude_m: f64,
    /// Airspeed (speed relative to the air; |velocity| without winds) at that time, m/s.
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
    /// The largest sampled q, Pa.
    pub sample_max_pa: f64,
    /// How far the maximum of the sampled flight can be from `dynamic_pressure_pa`, Pa:
    /// where q(t) is concave over the five samples around the largest (a smooth peak or a
    /// corner), the maximum lies in `dynamic_pressure_pa` +- this. `None` where the
    /// largest sample is the first or the last (the maximum may lie outside the record).
    pub uncertainty_pa: Option<f64>,
    /// Whether the sampling resolves the peak: the uncertainty is known and at most
    /// [`RESOLVED_FRACTION`](super::RESOLVED_FRACTION) of the maximum.
    pub resolved: bool,
    /// Where the peak is not resolved but bounded, a sample spacing that would resolve
    /// it, s: the spacing around the peak scaled by how far the uncertainty is over its
    /// limit (the bound shrinks at least in proportion to the spacing: linearly at a
    /// corner, quadratically on a smooth peak).
    pub suggested_spacing_s: Option<f64>,
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
    /// Airspeed of the sample (|velocity| without winds), m/s.
    pub velocity_m_s: f64,
    /// Index (from 0) of the sample.
    pub sample_index: usize,
    /// Mach number of the sample, where defined.
    pub mach: Option<f64>,
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
    /// Largest q-alpha of any sample (samples that give their velocity's direction),
    /// Pa deg.
    pub max_q_alpha: Option<Extreme>,
    /// Samples where the Mach number is undefined (above 86 km, where the continuum
    /// quantities are not): a Mach 1 crossing among them cannot be seen.
    pub mach_undefined_samples: usize,
    /// Samples beyond the wind profile's lowest or highest level, where its nearest
    /// level's wind was held.
    pub wind_held_samples: usize,
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

impl Kept {
    /// A placeholder for slots not yet written.
    pub(super) const EMPTY: Kept =
        Kept { time_s: 0.0, altitude_m: 0.0, velocity_m_s: 0.0, mach: None, dynamic_pressure_pa: 0.0 };
}

impl From<&FlightPoint> for Kept {
    fn from(point: &FlightPoint) -> Self {
        Self {
            time_s: point.time_s,
            altitude_m: point.altitude_m,
            velocity_m_s: point.airspeed_m_s,
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
        velocity_m_s: point.airspeed_m_s,
        sample_index,
        mach: point.mach,
    }
}
