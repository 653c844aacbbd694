//! Drag-coefficient curves as opaque handles, and the flight scan over arrays.

use aerostrata_core::aero::terminal_velocity_m_s;
use aerostrata_core::flight::{FlightPoint, FlightScan, FlightSummary, Sample};
use aerostrata_core::{Atmosphere, DragCurve, Interpolation, Vehicle};
use alloc::vec::Vec;

use crate::catalogue::AerostrataFlightPoint;
use crate::error::{guard, require, AerostrataStatus, Failure};
use crate::model::{altitude, model_ref};
use crate::{free_handle, handle_ref, into_handle, output, slice, slice_mut, write, AerostrataModel};

/// `interpolation` value: straight lines between the table's points.
pub const AEROSTRATA_LINEAR: u32 = 0;
/// `interpolation` value: a monotone cubic that never overshoots the points.
pub const AEROSTRATA_MONOTONE_CUBIC: u32 = 1;

enum Curve {
    Constant(f64),
    Table { mach: Vec<f64>, cd: Vec<f64>, interpolation: Interpolation },
}

/// A drag coefficient as a function of Mach number: a constant or a table. Opaque; made
/// by `aerostrata_drag_curve_new_constant` or `aerostrata_drag_curve_new_table`,
/// released with `aerostrata_drag_curve_free`.
///
/// A curve never changes after it is made, so it may be used from any number of threads
/// at once; it must not be used during or after `aerostrata_drag_curve_free`.
pub struct AerostrataDragCurve {
    curve: Curve,
}

/// The tag word of a drag curve handle ("drag").
pub(crate) const DRAG_CURVE_TAG: u32 = u32::from_le_bytes(*b"drag");

impl crate::Handle for AerostrataDragCurve {
    const TAG: u32 = DRAG_CURVE_TAG;
    const WHAT: &'static str = "drag curve";
    const FREE: &'static str = "aerostrata_drag_curve_free";
}

impl AerostrataDragCurve {
    fn get(&self) -> Result<DragCurve<'_>, Failure> {
        Ok(match &self.curve {
            Curve::Constant(cd) => DragCurve::constant(*cd)?,
            Curve::Table { mach, cd, interpolation } => DragCurve::table(mach, cd, *interpolation)?,
        })
    }
}

/// A new handle to `curve`, once it is checked.
fn publish(curve: Curve) -> Result<*mut AerostrataDragCurve, Failure> {
    let handle = AerostrataDragCurve { curve };
    handle.get()?;
    Ok(into_handle(handle))
}

/// Makes a Mach-independent drag coefficient `drag_coefficient` (above 0, at most 100).
///
/// On success writes a new curve to `*out`; the caller owns it and releases it with
/// `aerostrata_drag_curve_free`. On failure `*out` is unchanged.
///
/// Errors: NOT_FINITE, RATIO_NOT_POSITIVE, RATIO_OUT_OF_RANGE; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_drag_curve_new_constant(
    drag_coefficient: f64,
    out: *mut *mut AerostrataDragCurve,
) -> AerostrataStatus {
    output(out, || publish(Curve::Constant(drag_coefficient)))
}

/// Makes a table of `count` drag coefficients `cd` at Mach numbers `mach` (strictly
/// increasing, 0 to 1000), read by `interpolation` (`AEROSTRATA_LINEAR` or
/// `AEROSTRATA_MONOTONE_CUBIC`); the end values are held outside the table.
///
/// Both arrays are copied: the caller may free or change them as soon as this returns.
/// Ownership of the curve as `aerostrata_drag_curve_new_constant`.
///
/// Errors: INVALID_POINT (the detail's `index` names the point) for fewer than 2
/// points, a NaN, a Mach number out of order or range, or a Cd not in (0, 100];
/// INVALID_ARGUMENT for an unknown interpolation; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_drag_curve_new_table(
    mach: *const f64,
    cd: *const f64,
    count: usize,
    interpolation: u32,
    out: *mut *mut AerostrataDragCurve,
) -> AerostrataStatus {
    output(out, || {
        let interpolation = match interpolation {
            AEROSTRATA_LINEAR => Interpolation::Linear,
            AEROSTRATA_MONOTONE_CUBIC => Interpolation::MonotoneCubic,
            other => {
                return Err(Failure::invalid_argument(
                    "interpolation",
                    "must be AEROSTRATA_LINEAR (0) or AEROSTRATA_MONOTONE_CUBIC (1)",
                    f64::from(other),
                ))
            }
        };
        let mach = slice("mach", mach, count)?.to_vec();
        let cd = slice("cd", cd, count)?.to_vec();
        publish(Curve::Table { mach, cd, interpolation })
    })
}

/// Releases a curve. NULL is accepted and does nothing (OK). The curve must not be used
/// afterwards, nor freed twice, nor be in use by another thread.
///
/// Errors: INVALID_HANDLE, releasing nothing, as `aerostrata_model_free`.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_drag_curve_free(curve: *mut AerostrataDragCurve) -> AerostrataStatus {
    free_handle("curve", curve)
}

fn curve_ref<'a>(curve: *const AerostrataDragCurve) -> Result<&'a AerostrataDragCurve, Failure> {
    handle_ref("curve", curve)
}

/// The drag coefficient of `curve` at Mach `mach`, written to `*out`.
///
/// Errors: NOT_FINITE, RATIO_OUT_OF_RANGE (Mach 0 to 1000); NULL_POINTER. Thread-safe
/// for a shared curve.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_drag_curve_cd(
    curve: *const AerostrataDragCurve,
    mach: f64,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || Ok(curve_ref(curve)?.get()?.cd(mach)?))
}

/// The terminal velocity, m/s, of a body of `mass_kg` with drag curve `curve` referred to
/// `reference_area_m2`, falling through `model` at `altitude_m` metres of `altitude_kind`:
/// the speed at which drag equals weight (the local gravity of the state), written to
/// `*out`. For a Mach-dependent curve the speed is solved for, bracketed between the
/// curve's extreme coefficients.
///
/// Formula: 1/2 rho V^2 Cd(V / a) A = m g.
///
/// Errors: NOT_FINITE, NOT_POSITIVE or OUT_OF_RANGE for the mass, area or an altitude
/// outside the model; UNDEFINED for a Mach-dependent curve above 86 km (no speed of
/// sound); OUT_OF_RANGE when the speed would exceed 1e8 m/s; INVALID_ARGUMENT for an
/// unknown kind; NULL_POINTER. Thread-safe for a shared model and curve.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_terminal_velocity_m_s(
    model: *const AerostrataModel,
    altitude_m: f64,
    altitude_kind: u32,
    mass_kg: f64,
    reference_area_m2: f64,
    curve: *const AerostrataDragCurve,
    out: *mut f64,
) -> AerostrataStatus {
    output(out, || {
        let m = model_ref(model)?;
        let c = curve_ref(curve)?;
        let state = m.state(altitude(altitude_m, altitude_kind)?)?;
        Ok(terminal_velocity_m_s(&state, mass_kg, reference_area_m2, &c.get()?)?)
    })
}

/// `AerostrataFlightPoint::defined` bit: `speed_of_sound_m_s` and `mach` are set.
pub const AEROSTRATA_POINT_MACH: u32 = 1;
/// `AerostrataFlightPoint::defined` bit: `reynolds_per_m` is set.
pub const AEROSTRATA_POINT_REYNOLDS_PER_M: u32 = 2;
/// `AerostrataFlightPoint::defined` bit: `reynolds_number` is set.
pub const AEROSTRATA_POINT_REYNOLDS_NUMBER: u32 = 4;
/// `AerostrataFlightPoint::defined` bit: `drag_coefficient` and `drag_n` are set.
pub const AEROSTRATA_POINT_DRAG: u32 = 8;
/// `AerostrataFlightPoint::defined` bit: `velocity_east_m_s`, `velocity_north_m_s` and
/// `velocity_up_m_s` are set (a sample of `aerostrata_flight_scan_vector`).
pub const AEROSTRATA_POINT_VELOCITY_COMPONENTS: u32 = 16;
/// `AerostrataFlightPoint::defined` bit: `wind_east_m_s` and `wind_north_m_s` are set (a
/// scan with winds).
pub const AEROSTRATA_POINT_WIND: u32 = 32;
/// `AerostrataFlightPoint::defined` bit: `alpha_deg` and `q_alpha_pa_deg` are set (a
/// vector sample moving through the air, or with an axis).
pub const AEROSTRATA_POINT_ALPHA: u32 = 64;
/// `AerostrataFlightPoint::defined` bit: `recovery_temperature_k` is set (a scan with a
/// boundary layer, in the continuum). `total_temperature_k` goes with `AEROSTRATA_POINT_MACH`.
pub const AEROSTRATA_POINT_RECOVERY_TEMPERATURE: u32 = 128;

// The bits are the core's (`FlightPoint::defined`) under their C names; written out above
// because cbindgen reads only literal values.
const _: () = assert!(
    AEROSTRATA_POINT_MACH == FlightPoint::DEFINED_MACH as u32
        && AEROSTRATA_POINT_REYNOLDS_PER_M == FlightPoint::DEFINED_REYNOLDS_PER_M as u32
        && AEROSTRATA_POINT_REYNOLDS_NUMBER == FlightPoint::DEFINED_REYNOLDS_NUMBER as u32
        && AEROSTRATA_POINT_DRAG == FlightPoint::DEFINED_DRAG as u32
        && AEROSTRATA_POINT_VELOCITY_COMPONENTS == FlightPoint::DEFINED_VELOCITY_COMPONENTS as u32
        && AEROSTRATA_POINT_WIND == FlightPoint::DEFINED_WIND as u32
        && AEROSTRATA_POINT_ALPHA == FlightPoint::DEFINED_ALPHA as u32
        && AEROSTRATA_POINT_RECOVERY_TEMPERATURE == FlightPoint::DEFINED_RECOVERY_TEMPERATURE as u32
);

impl From<&FlightPoint> for AerostrataFlightPoint {
    fn from(p: &FlightPoint) -> Self {
        Self::from_values(|q| p.get(q).unwrap_or(f64::NAN), u32::from(p.defined()))
    }
}

/// The summary of a flight. Each `has_*` flag is 1 when its group of fields is set; the
/// fields of an unset group are NaN (and their `*_sample_index` 0). Times of Mach 1
/// crossings are interpolated between samples; NaN when `count` is 0.
///
/// The record only grows at its end, and its size is `AEROSTRATA_FLIGHT_SUMMARY_SIZE`:
/// fields from `has_max_q_alpha` on came with the winds and q-alpha (the record grew from
/// 176 to 288 bytes; a program compiled against an older header must be recompiled, since
/// the library writes the whole record).
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataFlightSummary {
    /// Samples scanned.
    pub samples: u64,
    /// 1 when the `max_q_*` fields are set (at least one sample).
    pub has_max_q: u32,
    /// 1 when the maximum was refined between samples (a parabola through three
    /// samples), 0 when it is a sample's own value.
    pub max_q_refined: u32,
    /// Maximum dynamic pressure, Pa.
    pub max_q_pa: f64,
    /// Its time, s.
    pub max_q_time_s: f64,
    /// Its geometric altitude, m.
    pub max_q_altitude_m: f64,
    /// Its airspeed (speed relative to the air; |velocity| without winds), m/s.
    pub max_q_velocity_m_s: f64,
    /// Its Mach number (NaN where undefined).
    pub max_q_mach: f64,
    /// The index of the largest sample.
    pub max_q_sample_index: u64,
    /// 1 when the `max_mach*` fields are set.
    pub has_max_mach: u32,
    /// 1 when the `max_drag*` fields are set (a drag curve was given).
    pub has_max_drag: u32,
    /// Maximum Mach number.
    pub max_mach: f64,
    /// Its time, s.
    pub max_mach_time_s: f64,
    /// Its geometric altitude, m.
    pub max_mach_altitude_m: f64,
    /// Its sample index.
    pub max_mach_sample_index: u64,
    /// Maximum drag, N.
    pub max_drag_n: f64,
    /// Its time, s.
    pub max_drag_time_s: f64,
    /// Its geometric altitude, m.
    pub max_drag_altitude_m: f64,
    /// Its sample index.
    pub max_drag_sample_index: u64,
    /// Crossings from below Mach 1 to Mach 1 or above.
    pub mach_one_up_count: u32,
    /// Crossings from Mach 1 or above to below Mach 1.
    pub mach_one_down_count: u32,
    /// Time of the first upward crossing, s.
    pub mach_one_up_first_time_s: f64,
    /// Time of the last upward crossing, s.
    pub mach_one_up_last_time_s: f64,
    /// Time of the first downward crossing, s.
    pub mach_one_down_first_time_s: f64,
    /// Time of the last downward crossing, s.
    pub mach_one_down_last_time_s: f64,
    /// 1 when the `max_q_alpha*` fields are set (a sample of
    /// `aerostrata_flight_scan_vector` moving through the air).
    pub has_max_q_alpha: u32,
    /// 1 when the sampling resolves the maximum q: its uncertainty is known and at most
    /// 0.1 % of it.
    pub max_q_resolved: u32,
    /// 1 when `max_q_uncertainty_pa` is set: 0 where the largest sample is the first or
    /// the last (the maximum may lie outside the record).
    pub has_max_q_uncertainty: u32,
    /// 1 when `max_q_suggested_spacing_s` is set: the peak is bounded but not resolved.
    pub has_max_q_suggested_spacing: u32,
    /// The largest sampled dynamic pressure, Pa (`max_q_pa` is never below it).
    pub max_q_sample_max_pa: f64,
    /// How far the maximum of the sampled flight can be from `max_q_pa`, Pa (a bound from
    /// local fits either side of the peak, with a safety factor; docs/aerodynamics.md).
    pub max_q_uncertainty_pa: f64,
    /// A sample spacing around the peak that would resolve it, s.
    pub max_q_suggested_spacing_s: f64,
    /// Maximum q-alpha of any sample, Pa deg.
    pub max_q_alpha_pa_deg: f64,
    /// Its time, s.
    pub max_q_alpha_time_s: f64,
    /// Its geometric altitude, m.
    pub max_q_alpha_altitude_m: f64,
    /// Its airspeed, m/s.
    pub max_q_alpha_airspeed_m_s: f64,
    /// Its Mach number (NaN where undefined).
    pub max_q_alpha_mach: f64,
    /// Its sample index.
    pub max_q_alpha_sample_index: u64,
    /// The Mach number at the maximum drag (NaN where undefined or no drag).
    pub max_drag_mach: f64,
    /// Samples whose Mach number is undefined (above 86 km): a Mach 1 crossing among them
    /// cannot be seen.
    pub mach_undefined_samples: u64,
    /// Samples beyond the wind profile's lowest or highest level, where its nearest
    /// level's wind was held.
    pub wind_held_samples: u64,
}

/// `sizeof(AerostrataFlightSummary)`, bytes: a program can compare it with the size of
/// the record it was compiled with (see the record's documentation).
pub const AEROSTRATA_FLIGHT_SUMMARY_SIZE: usize = 288;

const _: () = assert!(core::mem::size_of::<AerostrataFlightSummary>() == AEROSTRATA_FLIGHT_SUMMARY_SIZE);

/// The size of the `AerostrataFlightSummary` this library writes, bytes: a program checks
/// it against `sizeof(AerostrataFlightSummary)` of the header it was compiled with (the
/// two differ when it runs against a library whose record grew). Thread-safe.
#[no_mangle]
pub extern "C" fn aerostrata_flight_summary_size() -> usize {
    AEROSTRATA_FLIGHT_SUMMARY_SIZE
}

impl From<&FlightSummary> for AerostrataFlightSummary {
    fn from(s: &FlightSummary) -> Self {
        let nan = f64::NAN;
        let index = |i: usize| u64::try_from(i).unwrap_or(u64::MAX);
        let q = s.max_dynamic_pressure;
        let m = s.max_mach;
        let d = s.max_drag;
        let qa = s.max_q_alpha;
        let uncertainty = q.and_then(|q| q.uncertainty_pa);
        let spacing = q.and_then(|q| q.suggested_spacing_s);
        Self {
            samples: index(s.samples),
            has_max_q: u32::from(q.is_some()),
            max_q_refined: u32::from(q.is_some_and(|q| q.refined)),
            max_q_pa: q.map_or(nan, |q| q.dynamic_pressure_pa),
            max_q_time_s: q.map_or(nan, |q| q.time_s),
            max_q_altitude_m: q.map_or(nan, |q| q.altitude_m),
            max_q_velocity_m_s: q.map_or(nan, |q| q.velocity_m_s),
            max_q_mach: q.and_then(|q| q.mach).unwrap_or(nan),
            max_q_sample_index: q.map_or(0, |q| index(q.sample_index)),
            has_max_mach: u32::from(m.is_some()),
            has_max_drag: u32::from(d.is_some()),
            max_mach: m.map_or(nan, |e| e.value),
            max_mach_time_s: m.map_or(nan, |e| e.time_s),
            max_mach_altitude_m: m.map_or(nan, |e| e.altitude_m),
            max_mach_sample_index: m.map_or(0, |e| index(e.sample_index)),
            max_drag_n: d.map_or(nan, |e| e.value),
            max_drag_time_s: d.map_or(nan, |e| e.time_s),
            max_drag_altitude_m: d.map_or(nan, |e| e.altitude_m),
            max_drag_sample_index: d.map_or(0, |e| index(e.sample_index)),
            mach_one_up_count: s.mach_one_up.count,
            mach_one_down_count: s.mach_one_down.count,
            mach_one_up_first_time_s: s.mach_one_up.first_time_s.unwrap_or(nan),
            mach_one_up_last_time_s: s.mach_one_up.last_time_s.unwrap_or(nan),
            mach_one_down_first_time_s: s.mach_one_down.first_time_s.unwrap_or(nan),
            mach_one_down_last_time_s: s.mach_one_down.last_time_s.unwrap_or(nan),
            has_max_q_alpha: u32::from(qa.is_some()),
            max_q_resolved: u32::from(q.is_some_and(|q| q.resolved)),
            has_max_q_uncertainty: u32::from(uncertainty.is_some()),
            has_max_q_suggested_spacing: u32::from(spacing.is_some()),
            max_q_sample_max_pa: q.map_or(nan, |q| q.sample_max_pa),
            max_q_uncertainty_pa: uncertainty.unwrap_or(nan),
            max_q_suggested_spacing_s: spacing.unwrap_or(nan),
            max_q_alpha_pa_deg: qa.map_or(nan, |e| e.value),
            max_q_alpha_time_s: qa.map_or(nan, |e| e.time_s),
            max_q_alpha_altitude_m: qa.map_or(nan, |e| e.altitude_m),
            max_q_alpha_airspeed_m_s: qa.map_or(nan, |e| e.velocity_m_s),
            max_q_alpha_mach: qa.and_then(|e| e.mach).unwrap_or(nan),
            max_q_alpha_sample_index: qa.map_or(0, |e| index(e.sample_index)),
            max_drag_mach: d.and_then(|e| e.mach).unwrap_or(nan),
            mach_undefined_samples: index(s.mach_undefined_samples),
            wind_held_samples: index(s.wind_held_samples),
        }
    }
}

/// The vehicle of a scan: none without a curve; with one, its reference area and, above
/// 0, its reference length.
/// The points of `count` samples, `next(i)` recording sample i in a scan: copied to
/// `points` (of `count` elements) when it is not NULL, only once every sample has been
/// recorded, so that a failure writes nothing.
pub(crate) fn scan_points(
    count: usize,
    points: *mut AerostrataFlightPoint,
    mut next: impl FnMut(usize) -> Result<FlightPoint, Failure>,
) -> Result<(), Failure> {
    let mut computed = Vec::new();
    if !points.is_null() {
        slice_mut("points", points, count)?;
        computed.try_reserve_exact(count).map_err(|_| {
            Failure::invalid_argument("count", "the element count is too large for memory", count as f64)
        })?;
    }
    for i in 0..count {
        let point = next(i)?;
        if !points.is_null() {
            computed.push(AerostrataFlightPoint::from(&point));
        }
    }
    if !points.is_null() {
        slice_mut("points", points, count)?.copy_from_slice(&computed);
    }
    Ok(())
}

pub(crate) fn vehicle<'a>(
    drag: *const AerostrataDragCurve,
    reference_area_m2: f64,
    reference_length_m: f64,
) -> Result<Option<Vehicle<'a>>, Failure> {
    if drag.is_null() {
        return Ok(None);
    }
    let vehicle = Vehicle::new(curve_ref(drag)?.get()?, reference_area_m2)?;
    Ok(Some(if reference_length_m == 0.0 {
        vehicle
    } else {
        vehicle.with_reference_length(reference_length_m)?
    }))
}

/// Scans a flight of `count` samples (`time_s[i]` strictly increasing, geometric
/// `altitude_m[i]`, `velocity_m_s[i]` relative to the air, sign ignored) through
/// `model`, writing each sample's values to `points[i]` (or nothing, if `points` is
/// NULL) and the summary to `*summary`.
///
/// With a `drag` curve (NULL for none) drag is computed on the reference area
/// `reference_area_m2`, and with a `reference_length_m` above 0 the Reynolds number too
/// (0 for none); without a curve both numbers are ignored.
///
/// All or nothing: on failure neither `points` nor `*summary` is written and the
/// detail's `index` names the first failing sample. The arrays are only read during the
/// call. Errors: INVALID_POINT for a time not after the previous one; NOT_FINITE,
/// OUT_OF_RANGE for a velocity or altitude; NOT_POSITIVE for a bad area or length; the
/// model's errors; NULL_POINTER for a NULL model, summary, or a NULL array with `count`
/// above 0. Thread-safe for shared model and curve.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_flight_scan(
    model: *const AerostrataModel,
    drag: *const AerostrataDragCurve,
    reference_area_m2: f64,
    reference_length_m: f64,
    time_s: *const f64,
    altitude_m: *const f64,
    velocity_m_s: *const f64,
    count: usize,
    points: *mut AerostrataFlightPoint,
    summary: *mut AerostrataFlightSummary,
) -> AerostrataStatus {
    guard(|| {
        let m = model_ref(model)?;
        require("summary", summary)?;
        let t = slice("time_s", time_s, count)?;
        let z = slice("altitude_m", altitude_m, count)?;
        let v = slice("velocity_m_s", velocity_m_s, count)?;
        let vehicle = vehicle(drag, reference_area_m2, reference_length_m)?;
        let mut scan = FlightScan::new(m, vehicle);
        scan_points(count, points, |i| {
            let sample = Sample { time_s: t[i], altitude_m: z[i], velocity_m_s: v[i] };
            scan.push(sample).map_err(|e| Failure::from(e).at_element(i))
        })?;
        write(summary, AerostrataFlightSummary::from(&scan.summary()));
        Ok(())
    })
}
