//! The scan itself: samples pushed one at a time, their values returned, the summary kept
//! up to date without holding the samples.

use super::point::{bad_sample, compute, FlightPoint, Sample, Vehicle};
use super::summary::{extreme, refine, Crossings, Extreme, FlightSummary, Kept, Peak};
#[cfg(doc)]
use super::MAX_TIME_S;
use crate::aero::CdSegment;
#[cfg(doc)]
use crate::error::Error;
use crate::error::Result;
use crate::model::Atmosphere;

/// A flight being scanned, one [`Sample`] at a time.
///
/// ```
/// use aerostrata::flight::{FlightScan, Sample};
/// use aerostrata::US1976;
/// // An invented boost at 40 m/s^2 for 8 s, then a coast, sampled every 0.5 s.
/// let mut scan = FlightScan::new(US1976, None);
/// for i in 0..40 {
///     let t = 0.5 * i as f64;
///     let (z, v) = if t < 8.0 {
///         (20.0 * t * t, 40.0 * t)
///     } else {
///         let c = t - 8.0;
///         (1280.0 + 320.0 * c - 4.9 * c * c, 320.0 - 9.8 * c)
///     };
///     scan.push(Sample { time_s: t, altitude_m: z, velocity_m_s: v })?;
/// }
/// let peak = scan.summary().max_dynamic_pressure.unwrap();
/// // Low and slow enough that q peaks at burnout, where the speed stops growing.
/// assert!(peak.time_s > 7.0 && peak.time_s < 8.5);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone)]
pub struct FlightScan<'v, A> {
    atmosphere: A,
    vehicle: Option<Vehicle<'v>>,
    samples: usize,
    last: Option<Kept>,
    peak_index: usize,
    peak: Option<Kept>,
    before_peak: Option<Kept>,
    after_peak: Option<Kept>,
    max_mach: Option<Extreme>,
    max_drag: Option<Extreme>,
    up: Crossings,
    down: Crossings,
    /// The piece of the drag curve the last sample fell in: consecutive samples nearly
    /// always share it, so the table is searched only when the Mach number leaves it.
    cd_segment: Option<CdSegment>,
}

impl<'v, A: Atmosphere> FlightScan<'v, A> {
    /// A scan through `atmosphere`, with drag and Reynolds number for `vehicle` if given.
    pub fn new(atmosphere: A, vehicle: Option<Vehicle<'v>>) -> Self {
        Self {
            atmosphere,
            vehicle,
            samples: 0,
            last: None,
            peak_index: 0,
            peak: None,
            before_peak: None,
            after_peak: None,
            max_mach: None,
            max_drag: None,
            up: Crossings::default(),
            down: Crossings::default(),
            cd_segment: None,
        }
    }

    /// Samples accepted so far (the index the next sample will have).
    pub fn samples(&self) -> usize {
        self.samples
    }

    /// The values at `sample`, without recording it.
    ///
    /// # Errors
    /// As [`FlightScan::push`], except for the order of times.
    pub fn evaluate(&self, sample: Sample) -> Result<FlightPoint> {
        compute(&self.atmosphere, self.vehicle.as_ref(), self.samples, sample, &mut None)
    }

    /// Records `sample` and returns its values. A rejected sample leaves the scan as it
    /// was; its index is [`FlightScan::samples`].
    ///
    /// # Errors
    /// [`Error::InvalidPoint`] (naming the sample's index) for a time that is not finite,
    /// beyond +-[`MAX_TIME_S`] or not after the previous sample's; [`Error::NotFinite`] or
    /// [`Error::OutOfRange`] for a velocity outside +-[`crate::aero::MAX_SPEED_M_S`] or an
    /// altitude outside the model's range; the model's own errors.
    #[inline]
    pub fn push(&mut self, sample: Sample) -> Result<FlightPoint> {
        let index = self.samples;
        if let Some(last) = &self.last {
            if sample.time_s.partial_cmp(&last.time_s) != Some(core::cmp::Ordering::Greater) {
                return Err(bad_sample(index, "time (s) must be after the previous sample's", sample.time_s));
            }
        }
        let point = compute(&self.atmosphere, self.vehicle.as_ref(), index, sample, &mut self.cd_segment)?;
        let kept = Kept::from(&point);
        let q = point.dynamic_pressure_pa;
        match &self.peak {
            Some(peak) if q <= peak.dynamic_pressure_pa => {
                if self.after_peak.is_none() && self.peak_index + 1 == index {
                    self.after_peak = Some(kept);
                }
            }
            _ => {
                self.before_peak = self.last;
                self.peak = Some(kept);
                self.after_peak = None;
                self.peak_index = index;
            }
        }
        if let Some(m) = point.mach {
            if self.max_mach.is_none_or(|e| m > e.value) {
                self.max_mach = Some(extreme(m, &point, index));
            }
            if let Some((m0, t0)) = self.last.and_then(|l| l.mach.map(|m0| (m0, l.time_s))) {
                let dt = point.time_s - t0;
                if m0 < 1.0 && m >= 1.0 {
                    self.up.record(t0 + (1.0 - m0) / (m - m0) * dt);
                } else if m0 >= 1.0 && m < 1.0 {
                    self.down.record(t0 + (m0 - 1.0) / (m0 - m) * dt);
                }
            }
        }
        if let Some(d) = point.drag_n {
            if self.max_drag.is_none_or(|e| d > e.value) {
                self.max_drag = Some(extreme(d, &point, index));
            }
        }
        self.last = Some(kept);
        self.samples += 1;
        Ok(point)
    }

    /// The summary of the samples so far.
    pub fn summary(&self) -> FlightSummary {
        FlightSummary {
            samples: self.samples,
            max_dynamic_pressure: self.peak.map(|peak| self.refined_peak(&peak)),
            max_mach: self.max_mach,
            mach_one_up: self.up,
            mach_one_down: self.down,
            max_drag: self.max_drag,
        }
    }

    fn refined_peak(&self, peak: &Kept) -> Peak {
        let unrefined = Peak {
            time_s: peak.time_s,
            altitude_m: peak.altitude_m,
            velocity_m_s: peak.velocity_m_s,
            mach: peak.mach,
            dynamic_pressure_pa: peak.dynamic_pressure_pa,
            sample_index: self.peak_index,
            refined: false,
        };
        match (&self.before_peak, &self.after_peak) {
            (Some(before), Some(after)) => refine(before, peak, after).map_or(unrefined, |r| Peak {
                time_s: r.time_s,
                altitude_m: r.interpolate([before.altitude_m, peak.altitude_m, after.altitude_m]),
                velocity_m_s: r.interpolate([before.velocity_m_s, peak.velocity_m_s, after.velocity_m_s]),
                mach: match (before.mach, peak.mach, after.mach) {
                    (Some(a), Some(b), Some(c)) => Some(r.interpolate([a, b, c])),
                    _ => None,
                },
                dynamic_pressure_pa: r.dynamic_pressure_pa,
                sample_index: self.peak_index,
                refined: true,
            }),
            _ => unrefined,
        }
    }
}

/// Scans `samples` through `atmosphere` (with `vehicle` if given), calling `each` with
/// every sample's values, and returns the summary.
///
/// ```
/// use aerostrata::flight::{samples_from_slices, scan};
/// use aerostrata::US1976;
/// let t = [0.0, 1.0, 2.0, 3.0];
/// let z = [0.0, 100.0, 400.0, 900.0];
/// let v = [0.0, 200.0, 400.0, 300.0];
/// let mut machs = [0.0; 4];
/// let mut i = 0;
/// let summary = scan(US1976, None, samples_from_slices(&t, &z, &v)?, |p| {
///     machs[i] = p.mach.unwrap_or(0.0);
///     i += 1;
/// })?;
/// assert_eq!(summary.mach_one_up.count, 1);
/// assert_eq!(summary.max_dynamic_pressure.unwrap().sample_index, 2);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// The first error of [`FlightScan::push`]; the samples before it were passed to `each`.
pub fn scan<A, I, F>(
    atmosphere: A,
    vehicle: Option<Vehicle<'_>>,
    samples: I,
    mut each: F,
) -> Result<FlightSummary>
where
    A: Atmosphere,
    I: IntoIterator<Item = Sample>,
    F: FnMut(&FlightPoint),
{
    let mut flight = FlightScan::new(atmosphere, vehicle);
    for sample in samples {
        each(&flight.push(sample)?);
    }
    Ok(flight.summary())
}

/// The samples of three parallel slices (times in s, geometric altitudes in m,
/// velocities in m/s), without copying them.
///
/// # Errors
/// [`Error::InvalidPoint`] when the three slices differ in length (the index is the
/// shortest length).
pub fn samples_from_slices<'s>(
    time_s: &'s [f64],
    altitude_m: &'s [f64],
    velocity_m_s: &'s [f64],
) -> Result<impl Iterator<Item = Sample> + 's> {
    let shortest = time_s.len().min(altitude_m.len()).min(velocity_m_s.len());
    let longest = time_s.len().max(altitude_m.len()).max(velocity_m_s.len());
    if shortest != longest {
        return Err(bad_sample(
            shortest,
            "time, altitude and velocity must have the same length; longest length",
            longest as f64,
        ));
    }
    Ok(time_s
        .iter()
        .zip(altitude_m)
        .zip(velocity_m_s)
        .map(|((&time_s, &altitude_m), &velocity_m_s)| Sample { time_s, altitude_m, velocity_m_s }))
}
