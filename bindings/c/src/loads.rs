//! The loads of a flight through winds aloft: wind profiles as opaque handles, the scan of
//! samples that give their velocity's direction (airspeed, total angle of attack, q-alpha,
//! recovery temperature), and the intervals where a scanned quantity exceeds a limit. The
//! physics is the core's (`wind`, `flight::motion`, `flight::limits`); this file only
//! moves arrays across the boundary.

use aerostrata_core::flight::{Axis, BoundaryLayer, Exceedance, FlightScan, LimitWatch, VectorSample};
use aerostrata_core::wind::{WindLevel, WindProfile};
use aerostrata_core::Error;
use alloc::vec::Vec;

use crate::catalogue::AerostrataFlightPoint;
use crate::error::{guard, require, AerostrataStatus, Failure};
use crate::flight::{scan_points, vehicle, AerostrataDragCurve, AerostrataFlightSummary};
use crate::model::model_ref;
use crate::quantity::quantity;
use crate::{free_handle, handle_ref, into_handle, output, slice, slice_mut, write, AerostrataModel};

/// A wind profile: horizontal wind against geometric altitude, interpolated linearly in
/// its east and north components between levels and held beyond its lowest and highest
/// levels. Opaque; made by `aerostrata_wind_profile_new` or
/// `aerostrata_wind_profile_new_speed_direction`, released with
/// `aerostrata_wind_profile_free`. It never changes after it is made, so it may be used
/// from any number of threads at once.
pub struct AerostrataWindProfile {
    profile: WindProfile<Vec<WindLevel>>,
}

/// The tag word of a wind profile handle ("wind").
pub(crate) const WIND_PROFILE_TAG: u32 = u32::from_le_bytes(*b"wind");

impl crate::Handle for AerostrataWindProfile {
    const TAG: u32 = WIND_PROFILE_TAG;
    const WHAT: &'static str = "wind profile";
    const FREE: &'static str = "aerostrata_wind_profile_free";
}

/// The wind at one altitude (`aerostrata_wind_profile_at`).
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataWind {
    /// East component of the wind's velocity (toward the east is positive), m/s.
    pub east_m_s: f64,
    /// North component (toward the north is positive), m/s.
    pub north_m_s: f64,
    /// Speed, m/s.
    pub speed_m_s: f64,
    /// The direction the wind blows FROM, degrees clockwise from true north in [0, 360);
    /// 0 for a calm.
    pub direction_deg: f64,
    /// 1 when the altitude lies below the lowest level or above the highest, where the
    /// nearest level's wind is held rather than interpolated.
    pub held: u32,
}

/// `boundary_layer` value of `aerostrata_flight_scan_vector`: no recovery temperature.
pub const AEROSTRATA_RECOVERY_NONE: u32 = 0;
/// `boundary_layer` value: recovery temperature for a laminar boundary layer (recovery
/// factor Pr^(1/2)).
pub const AEROSTRATA_RECOVERY_LAMINAR: u32 = 1;
/// `boundary_layer` value: recovery temperature for a turbulent boundary layer (recovery
/// factor Pr^(1/3)).
pub const AEROSTRATA_RECOVERY_TURBULENT: u32 = 2;

/// One interval where a quantity of a scanned flight exceeds a limit
/// (`aerostrata_flight_exceedances`).
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataExceedance {
    /// When the quantity rose above the limit, s: interpolated linearly between the last
    /// sample at or below it and the first above; the first sample's time when the flight
    /// starts above it.
    pub start_time_s: f64,
    /// When it fell back to the limit, s, interpolated likewise; the last sample's time
    /// when the flight ends above it.
    pub end_time_s: f64,
    /// The largest sampled value in the interval, in the quantity's SI unit.
    pub peak: f64,
    /// Time of that sample, s.
    pub peak_time_s: f64,
    /// 1 when the quantity was already above the limit at the first sample.
    pub open_start: u32,
    /// 1 when it was still above the limit at the last sample.
    pub open_end: u32,
}

impl From<&Exceedance> for AerostrataExceedance {
    fn from(e: &Exceedance) -> Self {
        Self {
            start_time_s: e.start_time_s,
            end_time_s: e.end_time_s,
            peak: e.peak,
            peak_time_s: e.peak_time_s,
            open_start: u32::from(e.open_start),
            open_end: u32::from(e.open_end),
        }
    }
}

/// A new handle to the profile of `count` levels made by `level`, once checked.
fn publish(
    count: usize,
    level: impl Fn(usize) -> Result<WindLevel, Error>,
) -> Result<*mut AerostrataWindProfile, Failure> {
    let mut levels = Vec::new();
    levels.try_reserve_exact(count).map_err(|_| {
        Failure::invalid_argument("count", "the element count is too large for memory", count as f64)
    })?;
    for i in 0..count {
        levels.push(level(i).map_err(|e| Failure::from(e).at_element(i))?);
    }
    let profile = WindProfile::new(levels)?;
    Ok(into_handle(AerostrataWindProfile { profile }))
}

/// Makes a wind profile of `count` levels: at geometric `altitude_m[i]` (strictly
/// increasing), the wind's east component `east_m_s[i]` and north component
/// `north_m_s[i]` (the direction the air moves TOWARD; each within +-250 m/s).
///
/// The arrays are copied. On success writes a new profile to `*out`, which the caller
/// releases with `aerostrata_wind_profile_free`; on failure `*out` is unchanged.
///
/// Errors: TOO_FEW_ROWS for no level; INVALID_POINT (the detail's `index` names the
/// level) for a NaN, an altitude not above the previous one or a component out of range;
/// NOT_FINITE or OUT_OF_RANGE (index named) for a component; NULL_POINTER for a NULL
/// array with `count` above 0 or a NULL `out`.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_wind_profile_new(
    altitude_m: *const f64,
    east_m_s: *const f64,
    north_m_s: *const f64,
    count: usize,
    out: *mut *mut AerostrataWindProfile,
) -> AerostrataStatus {
    output(out, || {
        let z = slice("altitude_m", altitude_m, count)?;
        let east = slice("east_m_s", east_m_s, count)?;
        let north = slice("north_m_s", north_m_s, count)?;
        publish(count, |i| WindLevel::new(z[i], east[i], north[i]))
    })
}

/// Makes a wind profile of `count` levels from speeds and directions: at geometric
/// `altitude_m[i]` (strictly increasing), a wind of `speed_m_s[i]` (0 to 250) blowing
/// FROM `direction_deg[i]` degrees clockwise from true north (-360 to 360; 270 is a west
/// wind, blowing toward the east): east = -W sin(dir), north = -W cos(dir).
///
/// Ownership and errors as `aerostrata_wind_profile_new`.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_wind_profile_new_speed_direction(
    altitude_m: *const f64,
    speed_m_s: *const f64,
    direction_deg: *const f64,
    count: usize,
    out: *mut *mut AerostrataWindProfile,
) -> AerostrataStatus {
    output(out, || {
        let z = slice("altitude_m", altitude_m, count)?;
        let speed = slice("speed_m_s", speed_m_s, count)?;
        let direction = slice("direction_deg", direction_deg, count)?;
        publish(count, |i| WindLevel::from_speed_direction(z[i], speed[i], direction[i]))
    })
}

/// Releases a wind profile. NULL is accepted and does nothing (OK). The profile must not
/// be used afterwards, nor freed twice, nor be in use by another thread.
///
/// Errors: INVALID_HANDLE, releasing nothing, as `aerostrata_model_free`.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_wind_profile_free(
    profile: *mut AerostrataWindProfile,
) -> AerostrataStatus {
    free_handle("profile", profile)
}

/// The wind of `profile` at geometric `altitude_m`, written to `*out`.
///
/// Errors: NOT_FINITE for an altitude that is NaN or infinite; NULL_POINTER.
/// Thread-safe for a shared profile.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_wind_profile_at(
    profile: *const AerostrataWindProfile,
    altitude_m: f64,
    out: *mut AerostrataWind,
) -> AerostrataStatus {
    output(out, || {
        let p = handle_ref("profile", profile)?;
        let at = p.profile.at(altitude_m)?;
        // The level type knows the wind's speed and direction.
        let level = WindLevel::new(altitude_m, at.east_m_s, at.north_m_s)?;
        Ok(AerostrataWind {
            east_m_s: at.east_m_s,
            north_m_s: at.north_m_s,
            speed_m_s: level.speed_m_s(),
            direction_deg: level.direction_deg(),
            held: u32::from(at.held),
        })
    })
}

/// Scans a flight of `count` samples whose ground-relative velocity is given by its
/// components: `time_s[i]` strictly increasing, geometric `altitude_m[i]`, and the
/// velocity relative to the ground `velocity_east_m_s[i]`, `velocity_north_m_s[i]`,
/// `velocity_up_m_s[i]` (m/s). Writes each sample's values to `points[i]` (or nothing if
/// `points` is NULL) and the summary to `*summary`.
///
/// With `winds` (NULL for still air) the air-relative velocity is the ground velocity
/// less the wind at the sample's altitude; airspeed, q, Mach, drag and Reynolds numbers
/// come from it. The vehicle's axis is `axis_elevation_deg[i]` above the horizontal
/// (-90 to 90) and `axis_azimuth_deg[i]` clockwise from true north (-360 to 360), or,
/// with both arrays NULL, along the ground-relative velocity (a vehicle flying its
/// trajectory: the wind alone makes its angle of attack). `alpha_deg` is the angle between
/// the axis and the air-relative velocity, `q_alpha_pa_deg` its product with q.
/// `boundary_layer` is `AEROSTRATA_RECOVERY_NONE`, `_LAMINAR` or `_TURBULENT` (the
/// recovery temperature's factor). `drag`, `reference_area_m2` and `reference_length_m`
/// as `aerostrata_flight_scan`.
///
/// Not certified flight software; verify independently; local codes, range-safety rules
/// and licensed engineering practice govern.
///
/// All or nothing: on failure neither `points` nor `*summary` is written and the
/// detail's `index` names the first failing sample. Errors: INVALID_POINT for a time not
/// after the previous one; NOT_FINITE or OUT_OF_RANGE for a velocity component, an
/// airspeed, an axis angle or an altitude (index named); INVALID_ARGUMENT for an unknown
/// `boundary_layer`; NULL_POINTER for a NULL model, summary, sample array with `count`
/// above 0, or one axis array NULL without the other. Thread-safe for shared model,
/// curve and winds.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_flight_scan_vector(
    model: *const AerostrataModel,
    drag: *const AerostrataDragCurve,
    reference_area_m2: f64,
    reference_length_m: f64,
    winds: *const AerostrataWindProfile,
    boundary_layer: u32,
    time_s: *const f64,
    altitude_m: *const f64,
    velocity_east_m_s: *const f64,
    velocity_north_m_s: *const f64,
    velocity_up_m_s: *const f64,
    axis_elevation_deg: *const f64,
    axis_azimuth_deg: *const f64,
    count: usize,
    points: *mut AerostrataFlightPoint,
    summary: *mut AerostrataFlightSummary,
) -> AerostrataStatus {
    guard(|| {
        let m = model_ref(model)?;
        require("summary", summary)?;
        let t = slice("time_s", time_s, count)?;
        let z = slice("altitude_m", altitude_m, count)?;
        let east = slice("velocity_east_m_s", velocity_east_m_s, count)?;
        let north = slice("velocity_north_m_s", velocity_north_m_s, count)?;
        let up = slice("velocity_up_m_s", velocity_up_m_s, count)?;
        let axes = match (axis_elevation_deg.is_null(), axis_azimuth_deg.is_null()) {
            (true, true) => None,
            _ => Some((
                slice("axis_elevation_deg", axis_elevation_deg, count)?,
                slice("axis_azimuth_deg", axis_azimuth_deg, count)?,
            )),
        };
        let layer = match boundary_layer {
            AEROSTRATA_RECOVERY_NONE => None,
            AEROSTRATA_RECOVERY_LAMINAR => Some(BoundaryLayer::Laminar),
            AEROSTRATA_RECOVERY_TURBULENT => Some(BoundaryLayer::Turbulent),
            other => {
                return Err(Failure::invalid_argument(
                    "boundary_layer",
                    "must be AEROSTRATA_RECOVERY_NONE (0), _LAMINAR (1) or _TURBULENT (2)",
                    f64::from(other),
                ))
            }
        };
        let mut scan = FlightScan::new(m, vehicle(drag, reference_area_m2, reference_length_m)?);
        if !winds.is_null() {
            scan = scan.with_winds(&handle_ref("winds", winds)?.profile);
        }
        if let Some(layer) = layer {
            scan = scan.with_recovery(layer);
        }
        scan_points(count, points, |i| {
            let at = |e: Error| Failure::from(e).at_element(i);
            let axis = match axes {
                Some((elevation, azimuth)) => Some(Axis::new(elevation[i], azimuth[i]).map_err(at)?),
                None => None,
            };
            let sample = VectorSample {
                time_s: t[i],
                altitude_m: z[i],
                velocity_east_m_s: east[i],
                velocity_north_m_s: north[i],
                velocity_up_m_s: up[i],
                axis,
            };
            scan.push_vector(sample).map_err(at)
        })?;
        write(summary, AerostrataFlightSummary::from(&scan.summary()));
        Ok(())
    })
}

/// The intervals where quantity `quantity_id` (an `AEROSTRATA_QUANTITY_*` id of a flight
/// point, such as `AEROSTRATA_QUANTITY_DYNAMIC_PRESSURE` or `AEROSTRATA_QUANTITY_Q_ALPHA`)
/// of the `count` scanned `points` exceeds `limit` (in the quantity's SI unit), in order:
/// the crossings are interpolated linearly between samples. Writes the first `capacity`
/// intervals to `out` (NULL is fine with `capacity` 0) and the number found to `*found`;
/// a `*found` above `capacity` says `out` was too short for them all.
///
/// All or nothing: on failure neither `out` nor `*found` is written. Errors: NOT_FINITE
/// for a NaN or infinite limit; INVALID_POINT (index named) for a sample whose value is
/// undefined (NaN: a Mach number above 86 km, q-alpha of a sample without its velocity's
/// direction) or whose time is not after the previous one; NOT_CARRIED for a quantity a
/// flight point does not carry; INVALID_ARGUMENT for an unknown id; NULL_POINTER.
/// Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_flight_exceedances(
    points: *const AerostrataFlightPoint,
    count: usize,
    quantity_id: u32,
    limit: f64,
    out: *mut AerostrataExceedance,
    capacity: usize,
    found: *mut usize,
) -> AerostrataStatus {
    guard(|| {
        require("found", found)?;
        let q = quantity(quantity_id)?;
        let points = slice("points", points, count)?;
        let out = if capacity == 0 { &mut [][..] } else { slice_mut("out", out, capacity)? };
        let mut watch = LimitWatch::new(limit)?;
        let mut intervals: Vec<Exceedance> = Vec::new();
        let mut total = 0usize;
        let mut keep = |e: Exceedance| {
            if total < out.len() {
                intervals.push(e);
            }
            total += 1;
        };
        for (i, p) in points.iter().enumerate() {
            let Some(value) = p.get(q) else {
                return Err(Error::NotCarried { quantity: q.name(), result: "a flight point" }.into());
            };
            match watch.push(p.time_s, value) {
                Ok(closed) => closed.into_iter().for_each(&mut keep),
                Err(Error::InvalidPoint { table, problem, value, .. }) => {
                    return Err(Error::InvalidPoint { table, index: i, problem, value }.into());
                }
                Err(other) => return Err(other.into()),
            }
        }
        watch.finish().into_iter().for_each(&mut keep);
        for (slot, e) in out.iter_mut().zip(&intervals) {
            *slot = AerostrataExceedance::from(e);
        }
        write(found, total);
        Ok(())
    })
}

/// The span around the maximum of a scanned quantity where it stays within a fraction of
/// that maximum (`aerostrata_flight_plateau`).
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataPlateau {
    /// When the quantity rose to within the fraction of its maximum, s (interpolated
    /// linearly between samples).
    pub start_time_s: f64,
    /// When it fell below it again, s (interpolated likewise).
    pub end_time_s: f64,
    /// The maximum it is measured from, in the quantity's SI unit.
    pub maximum: f64,
    /// The fraction: the plateau is where the quantity is at least (1 - fraction) times
    /// the maximum.
    pub fraction: f64,
    /// 1 when the plateau reaches the first or the last sample (it may go on beyond).
    pub open: u32,
}

/// The plateau of quantity `quantity_id` (an `AEROSTRATA_QUANTITY_*` id of a flight
/// point, such as `AEROSTRATA_QUANTITY_DYNAMIC_PRESSURE`) of the `count` scanned
/// `points`: the contiguous span around its largest sample where it is at least
/// (1 - `fraction`) times `maximum` (in the quantity's SI unit: the summary's refined
/// maximum, or NaN for the largest sample), the crossings interpolated linearly between
/// samples. `fraction` lies strictly between 0 and 1 (0.02 is the command line's
/// default). Writes the plateau to `*out` and 1 to `*found`, or only 0 to `*found` when
/// there is none (no points, or a maximum not above 0).
///
/// All or nothing: on failure neither `*out` nor `*found` is written. Errors:
/// RATIO_OUT_OF_RANGE or NOT_FINITE for the fraction; OUT_OF_RANGE for a maximum below the
/// largest sample; INVALID_POINT (index named) for a sample whose value is undefined
/// (NaN: a Mach number above 86 km, q-alpha of a sample without its velocity's direction)
/// or whose times do not increase; NOT_CARRIED for a quantity a flight point does not
/// carry; INVALID_ARGUMENT for an unknown id; NULL_POINTER. Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_flight_plateau(
    points: *const AerostrataFlightPoint,
    count: usize,
    quantity_id: u32,
    maximum: f64,
    fraction: f64,
    out: *mut AerostrataPlateau,
    found: *mut u32,
) -> AerostrataStatus {
    guard(|| {
        require("out", out)?;
        require("found", found)?;
        let q = quantity(quantity_id)?;
        let points = slice("points", points, count)?;
        let mut times = Vec::new();
        let mut values = Vec::new();
        for series in [&mut times, &mut values] {
            series.try_reserve_exact(count).map_err(|_| {
                Failure::invalid_argument("count", "the element count is too large for memory", count as f64)
            })?;
        }
        for p in points {
            let Some(value) = p.get(q) else {
                return Err(Error::NotCarried { quantity: q.name(), result: "a flight point" }.into());
            };
            times.push(p.time_s);
            values.push(value);
        }
        let maximum = if maximum.is_nan() { None } else { Some(maximum) };
        match aerostrata_core::flight::plateau(&times, &values, maximum, fraction)? {
            Some(p) => {
                write(
                    out,
                    AerostrataPlateau {
                        start_time_s: p.start_time_s,
                        end_time_s: p.end_time_s,
                        maximum: p.maximum,
                        fraction: p.fraction,
                        open: u32::from(p.open),
                    },
                );
                write(found, 1);
            }
            None => write(found, 0),
        }
        Ok(())
    })
}
