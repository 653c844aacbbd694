//! Scanning a flight: from samples of time, altitude and velocity, each sample's dynamic
//! pressure, Mach number, Reynolds number and drag, and a summary of the flight (maximum
//! dynamic pressure refined between samples, maximum Mach number, the Mach 1 crossings,
//! maximum drag). Streaming, one sample at a time: no allocation, any number of samples.
//!
//! The refinement of the maximum is the classical three-point parabolic (quadratic
//! Lagrange) interpolation of the sampled q(t) around its largest sample.

use crate::aero::{speed, CdSegment, DragCurve, MAX_AREA_M2, MAX_LENGTH_M};
use crate::altitude::Altitude;
use crate::error::{positive, within, Error, Result};
use crate::flow::MAX_MACH;
use crate::model::Atmosphere;

/// Largest |time| a sample may carry, s (about 31 700 years): keeps every difference of
/// two times finite.
pub const MAX_TIME_S: f64 = 1.0e12;

/// One sample of a flight.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Sample {
    /// Time, s (any origin; strictly increasing along a flight).
    pub time_s: f64,
    /// Geometric altitude above mean sea level, m.
    pub altitude_m: f64,
    /// Velocity relative to the air, m/s. Its sign is ignored (a log of vertical velocity
    /// that turns negative on descent can be used as it is): the speed is |V|.
    pub velocity_m_s: f64,
}

/// What the scan needs of a vehicle to give drag and Reynolds number.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Vehicle<'a> {
    drag: DragCurve<'a>,
    reference_area_m2: f64,
    reference_length_m: Option<f64>,
}

impl<'a> Vehicle<'a> {
    /// A vehicle with drag curve `drag` referred to the area `reference_area_m2`.
    ///
    /// # Errors
    /// [`Error::NotFinite`], [`Error::NotPositive`] or [`Error::OutOfRange`] for an area
    /// that is not finite and within (0, [`MAX_AREA_M2`]].
    pub fn new(drag: DragCurve<'a>, reference_area_m2: f64) -> Result<Self> {
        let area = positive("reference area", "m^2", reference_area_m2)?;
        let area = within("reference area", "m^2", area, 0.0, MAX_AREA_M2)?;
        Ok(Self { drag, reference_area_m2: area, reference_length_m: None })
    }

    /// The same vehicle with a reference length (for the Reynolds number), m.
    ///
    /// # Errors
    /// [`Error::NotFinite`], [`Error::NotPositive`] or [`Error::OutOfRange`] for a
    /// length that is not finite and within (0, [`MAX_LENGTH_M`]].
    pub fn with_reference_length(self, reference_length_m: f64) -> Result<Self> {
        let length = positive("reference length", "m", reference_length_m)?;
        let length = within("reference length", "m", length, 0.0, MAX_LENGTH_M)?;
        Ok(Self { reference_length_m: Some(length), ..self })
    }

    /// The drag curve.
    pub fn drag(&self) -> &DragCurve<'a> {
        &self.drag
    }

    /// The reference area, m^2.
    pub fn reference_area_m2(&self) -> f64 {
        self.reference_area_m2
    }

    /// The reference length, m, if one was given.
    pub fn reference_length_m(&self) -> Option<f64> {
        self.reference_length_m
    }
}

/// What the scan gives for one sample. Continuum quantities are `None` where the model
/// does not define a speed of sound or a viscosity (the rarefied upper atmosphere); drag
/// needs a vehicle, and a Mach number unless the vehicle's Cd is constant.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct FlightPoint {
    /// Time, s.
    pub time_s: f64,
    /// Geometric altitude, m.
    pub altitude_m: f64,
    /// Velocity as given, m/s.
    pub velocity_m_s: f64,
    /// Density, kg/m^3.
    pub density_kg_m3: f64,
    /// Static pressure, Pa.
    pub pressure_pa: f64,
    /// Kinetic temperature, K.
    pub temperature_k: f64,
    /// Speed of sound, m/s.
    pub speed_of_sound_m_s: Option<f64>,
    /// Mach number |V| / a.
    pub mach: Option<f64>,
    /// Dynamic pressure rho V^2 / 2, Pa.
    pub dynamic_pressure_pa: f64,
    /// Unit Reynolds number rho |V| / mu, 1/m.
    pub reynolds_per_m: Option<f64>,
    /// Reynolds number for the vehicle's reference length.
    pub reynolds_number: Option<f64>,
    /// The vehicle's drag coefficient at this Mach number.
    pub drag_coefficient: Option<f64>,
    /// Drag q Cd A, N.
    pub drag_n: Option<f64>,
}

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
    fn record(&mut self, time_s: f64) {
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

/// What the scan keeps of a sample: enough for the crossings and the parabola.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Kept {
    time_s: f64,
    altitude_m: f64,
    velocity_m_s: f64,
    mach: Option<f64>,
    dynamic_pressure_pa: f64,
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

fn extreme(value: f64, point: &FlightPoint, sample_index: usize) -> Extreme {
    Extreme {
        value,
        time_s: point.time_s,
        altitude_m: point.altitude_m,
        velocity_m_s: point.velocity_m_s,
        sample_index,
    }
}

fn bad_sample(index: usize, problem: &'static str, value: f64) -> Error {
    Error::InvalidPoint { table: "flight sample", index, problem, value }
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

/// The values at `sample` (the `index`-th), reading the vehicle's drag curve through
/// `cd_segment`, which is refreshed when the Mach number has left it.
fn compute<A: Atmosphere>(
    atmosphere: &A,
    vehicle: Option<&Vehicle<'_>>,
    index: usize,
    sample: Sample,
    cd_segment: &mut Option<CdSegment>,
) -> Result<FlightPoint> {
    let time_s = sample.time_s;
    if !(time_s.is_finite() && (-MAX_TIME_S..=MAX_TIME_S).contains(&time_s)) {
        return Err(bad_sample(index, "time (s) must be finite and within -1e12 to 1e12 s", time_s));
    }
    let v = speed("velocity", sample.velocity_m_s)?;
    let air = atmosphere.air(Altitude::geometric_m(sample.altitude_m)?)?;
    let rho = air.density_kg_m3();
    let speed_of_sound_m_s = air.speed_of_sound_m_s();
    let mach = speed_of_sound_m_s.map(|a| v / a);
    let dynamic_pressure_pa = 0.5 * rho * v * v;
    let reynolds_per_m = air.dynamic_viscosity_pa_s().map(|mu| rho * v / mu);
    let (mut reynolds_number, mut drag_coefficient, mut drag_n) = (None, None, None);
    if let Some(vehicle) = vehicle {
        reynolds_number = reynolds_per_m.zip(vehicle.reference_length_m).map(|(re, l)| re * l);
        drag_coefficient = if vehicle.drag.is_constant() {
            Some(vehicle.drag.min_cd())
        } else {
            mach.map(|m| {
                let m = m.min(MAX_MACH);
                match cd_segment {
                    Some(segment) if segment.holds(m) => segment.cd(m),
                    _ => cd_segment.insert(vehicle.drag.segment(m)).cd(m),
                }
            })
        };
        drag_n = drag_coefficient.map(|cd| dynamic_pressure_pa * cd * vehicle.reference_area_m2);
    }
    Ok(FlightPoint {
        time_s,
        altitude_m: sample.altitude_m,
        velocity_m_s: sample.velocity_m_s,
        density_kg_m3: rho,
        pressure_pa: air.pressure_pa(),
        temperature_k: air.temperature_k(),
        speed_of_sound_m_s,
        mach,
        dynamic_pressure_pa,
        reynolds_per_m,
        reynolds_number,
        drag_coefficient,
        drag_n,
    })
}

/// The vertex of the parabola through three samples, and the quadratic Lagrange weights
/// of the three samples there (to carry altitude, velocity and Mach to the same time).
struct Vertex {
    time_s: f64,
    dynamic_pressure_pa: f64,
    weights: [f64; 3],
}

impl Vertex {
    /// The quadratic through the three samples' `values` at the vertex's time, held
    /// within the smallest and largest of them: maximum q often falls on a kink of the
    /// velocity (burnout), where the quadratic would overshoot and report, say, a Mach
    /// number at maximum q above the largest Mach number sampled.
    fn interpolate(&self, values: [f64; 3]) -> f64 {
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
fn refine(before: &Kept, peak: &Kept, after: &Kept) -> Option<Vertex> {
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
