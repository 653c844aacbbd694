//! The scan itself: samples pushed one at a time, their values returned, the summary kept
//! up to date without holding the samples.

use super::motion::{BoundaryLayer, VectorSample};
use super::peak::{estimate, refine, RESOLVED_FRACTION, SAFETY_FACTOR};
use super::point::{bad_sample, compute, Cursor, FlightPoint, Motion, Sample, Setting, Vehicle};
use super::summary::{extreme, Crossings, Extreme, FlightSummary, Kept, Peak};
#[cfg(doc)]
use super::MAX_TIME_S;
#[cfg(doc)]
use crate::error::Error;
use crate::error::Result;
use crate::model::Atmosphere;
use crate::wind::{WindLevel, WindProfile};

/// Samples the scan keeps: the peak, its three neighbours either side, and one more so
/// that the window is complete when it is copied out.
const RING: usize = 8;

/// The three samples either side of the peak, nearest first.
#[derive(Debug, Clone, Copy)]
struct Window {
    before: [Option<Kept>; 3],
    after: [Option<Kept>; 3],
}

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
    setting: Setting<'v>,
    samples: usize,
    /// The last [`RING`] samples, sample i at `i % RING`: written once each, never shifted.
    ring: [Kept; RING],
    peak_index: usize,
    /// The largest sample.
    peak: Option<Kept>,
    /// The three samples before and the three after the peak, copied out of the ring
    /// just before the first of them would be overwritten (once per peak that lasts).
    frozen: Option<Window>,
    max_mach: Option<Extreme>,
    max_drag: Option<Extreme>,
    max_q_alpha: Option<Extreme>,
    up: Crossings,
    down: Crossings,
    mach_undefined: usize,
    wind_held: usize,
    cursor: Cursor,
}

impl<'v, A: Atmosphere> FlightScan<'v, A> {
    /// A scan through `atmosphere`, with drag and Reynolds number for `vehicle` if given.
    pub fn new(atmosphere: A, vehicle: Option<Vehicle<'v>>) -> Self {
        Self {
            atmosphere,
            setting: Setting { vehicle, winds: None, recovery: None },
            samples: 0,
            ring: [Kept::EMPTY; RING],
            peak_index: 0,
            peak: None,
            frozen: None,
            max_mach: None,
            max_drag: None,
            max_q_alpha: None,
            up: Crossings::default(),
            down: Crossings::default(),
            mach_undefined: 0,
            wind_held: 0,
            cursor: Cursor::default(),
        }
    }

    /// The same scan through `winds`: each sample's airspeed, q, Mach number, angle of
    /// attack and q-alpha are those of its ground-relative velocity less the wind at its
    /// altitude. Samples must then give their velocity's direction
    /// ([`FlightScan::push_vector`]).
    pub fn with_winds<S: AsRef<[WindLevel]>>(self, winds: &'v WindProfile<S>) -> Self {
        let winds = WindProfile::borrowed(winds);
        Self { setting: Setting { winds: Some(winds), ..self.setting }, ..self }
    }

    /// The same scan with recovery temperatures for a `layer` boundary layer.
    pub fn with_recovery(self, layer: BoundaryLayer) -> Self {
        Self { setting: Setting { recovery: Some(layer), ..self.setting }, ..self }
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
        let motion = (sample.time_s, sample.altitude_m, Motion::Speed(sample.velocity_m_s));
        compute(&self.atmosphere, &self.setting, self.samples, motion, &mut Cursor::default())
    }

    /// The values at `sample`, without recording it.
    ///
    /// # Errors
    /// As [`FlightScan::push_vector`], except for the order of times.
    pub fn evaluate_vector(&self, sample: VectorSample) -> Result<FlightPoint> {
        let motion = (sample.time_s, sample.altitude_m, Motion::Vector(sample.velocity(), sample.axis));
        compute(&self.atmosphere, &self.setting, self.samples, motion, &mut Cursor::default())
    }

    /// Records `sample` (a speed without direction) and returns its values. A rejected
    /// sample leaves the scan as it was; its index is [`FlightScan::samples`].
    ///
    /// # Errors
    /// [`Error::InvalidPoint`] (naming the sample's index) for a time that is not finite,
    /// beyond +-[`MAX_TIME_S`] or not after the previous sample's, and in a scan with
    /// winds (which need the velocity's direction); [`Error::NotFinite`] or
    /// [`Error::OutOfRange`] for a velocity outside +-[`crate::aero::MAX_SPEED_M_S`] or an
    /// altitude outside the model's range; the model's own errors.
    #[inline]
    pub fn push(&mut self, sample: Sample) -> Result<FlightPoint> {
        self.record((sample.time_s, sample.altitude_m, Motion::Speed(sample.velocity_m_s)))
    }

    /// Records `sample` (a ground-relative velocity with its direction) and returns its
    /// values, with the wind's angle of attack and q-alpha.
    ///
    /// # Errors
    /// As [`FlightScan::push`], for each component of the velocity and for the airspeed.
    #[inline]
    pub fn push_vector(&mut self, sample: VectorSample) -> Result<FlightPoint> {
        self.record((sample.time_s, sample.altitude_m, Motion::Vector(sample.velocity(), sample.axis)))
    }

    #[inline(always)]
    fn record(&mut self, sample: (f64, f64, Motion)) -> Result<FlightPoint> {
        let index = self.samples;
        let previous = self.kept_at(index.wrapping_sub(1)).copied();
        if let Some(last) = previous.as_ref().filter(|_| sample.0.is_finite()) {
            // (A time that is not finite is refused as such by `compute`.)
            if sample.0.partial_cmp(&last.time_s) != Some(core::cmp::Ordering::Greater) {
                return Err(bad_sample(index, "time (s) must be after the previous sample's", sample.0));
            }
        }
        // Returned as computed, so that the large point is written once, in the caller's
        // slot (binding it and returning `Ok(point)` cost a copy of it per sample).
        let result = compute(&self.atmosphere, &self.setting, index, sample, &mut self.cursor);
        if let Ok(point) = &result {
            self.keep(index, previous, point);
        }
        result
    }

    /// The summary's bookkeeping of sample `index`, after `previous`.
    #[inline]
    fn keep(&mut self, index: usize, previous: Option<Kept>, point: &FlightPoint) {
        let kept = Kept::from(point);
        let q = point.dynamic_pressure_pa;
        if self.peak.is_none_or(|peak| q > peak.dynamic_pressure_pa) {
            self.peak = Some(kept);
            self.peak_index = index;
            self.frozen = None;
        }
        match point.mach {
            Some(m) => {
                if self.max_mach.is_none_or(|e| m > e.value) {
                    self.max_mach = Some(extreme(m, point, index));
                }
                if let Some((m0, t0)) = previous.and_then(|l| l.mach.map(|m0| (m0, l.time_s))) {
                    let dt = point.time_s - t0;
                    if m0 < 1.0 && m >= 1.0 {
                        self.up.record(t0 + (1.0 - m0) / (m - m0) * dt);
                    } else if m0 >= 1.0 && m < 1.0 {
                        self.down.record(t0 + (m0 - 1.0) / (m0 - m) * dt);
                    }
                }
            }
            None => self.mach_undefined += 1,
        }
        if let Some(d) = point.drag_n {
            if self.max_drag.is_none_or(|e| d > e.value) {
                self.max_drag = Some(extreme(d, point, index));
            }
        }
        if let Some(qa) = point.q_alpha_pa_deg {
            if self.max_q_alpha.is_none_or(|e| qa > e.value) {
                self.max_q_alpha = Some(extreme(qa, point, index));
            }
        }
        // The cursor holds the piece of the wind profile the sample fell in.
        if self.setting.winds.is_some() && self.cursor.wind_held(point.altitude_m) {
            self.wind_held += 1;
        }
        self.ring[index % RING] = kept;
        self.samples += 1;
        // The next sample overwrites the peak's third neighbour before it: keep them.
        if self.frozen.is_none() && self.peak.is_some() && index == self.peak_index + 4 {
            self.frozen = Some(self.window());
        }
    }

    /// Sample `index` if the ring still holds it.
    fn kept_at(&self, index: usize) -> Option<&Kept> {
        (index < self.samples && self.samples - index <= RING).then(|| &self.ring[index % RING])
    }

    /// The peak's neighbours, from the ring (which holds them until four samples after it).
    fn window(&self) -> Window {
        let p = self.peak_index;
        Window {
            before: [1, 2, 3].map(|k| p.checked_sub(k).and_then(|i| self.kept_at(i)).copied()),
            after: [1, 2, 3].map(|k| self.kept_at(p + k).copied()),
        }
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
            max_q_alpha: self.max_q_alpha,
            mach_undefined_samples: self.mach_undefined,
            wind_held_samples: self.wind_held,
        }
    }

    fn refined_peak(&self, peak: &Kept) -> Peak {
        let sampled = peak.dynamic_pressure_pa;
        let mut out = Peak {
            time_s: peak.time_s,
            altitude_m: peak.altitude_m,
            velocity_m_s: peak.velocity_m_s,
            mach: peak.mach,
            dynamic_pressure_pa: sampled,
            sample_index: self.peak_index,
            refined: false,
            sample_max_pa: sampled,
            uncertainty_pa: None,
            resolved: false,
            suggested_spacing_s: None,
        };
        let window = self.frozen.unwrap_or_else(|| self.window());
        let (Some(before), Some(after)) = (&window.before[0], &window.after[0]) else { return out };
        if let Some(r) = refine(before, peak, after) {
            out.time_s = r.time_s;
            out.altitude_m = r.interpolate([before.altitude_m, peak.altitude_m, after.altitude_m]);
            out.velocity_m_s = r.interpolate([before.velocity_m_s, peak.velocity_m_s, after.velocity_m_s]);
            out.mach = match (before.mach, peak.mach, after.mach) {
                (Some(a), Some(b), Some(c)) => Some(r.interpolate([a, b, c])),
                _ => None,
            };
            out.dynamic_pressure_pa = r.dynamic_pressure_pa;
            out.refined = true;
        }
        let q = out.dynamic_pressure_pa;
        let (low, high) = estimate(
            window.before.each_ref().map(Option::as_ref),
            peak,
            window.after.each_ref().map(Option::as_ref),
        )
        .unwrap_or((q, q));
        // The maximum is never below the largest sample: a low estimate under it only
        // says the fits disagree.
        let spread = (high - q).max(q - low.max(sampled)).max(0.0);
        let uncertainty = SAFETY_FACTOR * spread;
        out.uncertainty_pa = Some(uncertainty);
        out.resolved = out.refined && uncertainty <= RESOLVED_FRACTION * q;
        if !out.resolved {
            let spacing = 0.5 * (after.time_s - before.time_s);
            let scale = if uncertainty > 0.0 { (RESOLVED_FRACTION * q / uncertainty).min(0.5) } else { 0.5 };
            out.suggested_spacing_s = Some(spacing * scale);
        }
        out
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
