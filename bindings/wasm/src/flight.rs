//! The flight scan over arrays of time, altitude and velocity: each sample's q, Mach,
//! Reynolds number and drag as columns, and the summary (maximum q refined between
//! samples, maximum Mach, the Mach 1 crossings, maximum drag).

use alloc::vec::Vec;

use aerostrata::flight::{
    Axis, BoundaryLayer, Crossings, Extreme, FlightPoint, FlightScan, FlightSummary, Peak, Sample,
    VectorSample,
};
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::{Atmosphere, Quantity, Vehicle};
use wasm_bindgen::prelude::*;

use crate::args::zeroed;
use crate::error::{Failure, Js};
use crate::flow::DragSpec;
use crate::js;
use crate::model::AtmosphereModel;
use crate::text::Text;

/// The summary's flat layout, as `glue.js` (`flightResult`) reads it: samples; the
/// maximum dynamic pressure (present, timeS, altitudeM, velocityMS, mach,
/// dynamicPressurePa, sampleIndex, refined); the maximum Mach number, drag and q-alpha
/// (present, value, timeS, altitudeM, velocityMS, sampleIndex, mach); the Mach 1
/// crossings up and down (count, firstTimeS, lastTimeS); the maximum q's sampleMaxPa,
/// uncertaintyPa, resolved and suggestedSpacingS; the Mach-undefined and wind-held sample
/// counts. NaN for "none".
pub const SUMMARY_LAYOUT: usize = 42;

/// The summary in the flat layout (see [`SUMMARY_LAYOUT`]).
pub(crate) fn summary_layout(s: &FlightSummary) -> [f64; SUMMARY_LAYOUT] {
    let nan = f64::NAN;
    let flag = |b: bool| if b { 1.0 } else { 0.0 };
    let extreme = |e: Option<Extreme>| match e {
        Some(e) => [
            1.0,
            e.value,
            e.time_s,
            e.altitude_m,
            e.velocity_m_s,
            e.sample_index as f64,
            e.mach.unwrap_or(nan),
        ],
        None => [0.0, nan, nan, nan, nan, nan, nan],
    };
    let crossings =
        |c: &Crossings| [f64::from(c.count), c.first_time_s.unwrap_or(nan), c.last_time_s.unwrap_or(nan)];
    let (peak, bound): ([f64; 8], [f64; 4]) = match s.max_dynamic_pressure {
        Some(Peak {
            time_s,
            altitude_m,
            velocity_m_s,
            mach,
            dynamic_pressure_pa,
            sample_index,
            refined,
            sample_max_pa,
            uncertainty_pa,
            resolved,
            suggested_spacing_s,
        }) => (
            [
                1.0,
                time_s,
                altitude_m,
                velocity_m_s,
                mach.unwrap_or(nan),
                dynamic_pressure_pa,
                sample_index as f64,
                flag(refined),
            ],
            [
                sample_max_pa,
                uncertainty_pa.unwrap_or(nan),
                flag(resolved),
                suggested_spacing_s.unwrap_or(nan),
            ],
        ),
        None => ([0.0, nan, nan, nan, nan, nan, nan, 0.0], [nan, nan, 0.0, nan]),
    };
    let mut out = [nan; SUMMARY_LAYOUT];
    let parts: [&[f64]; 10] = [
        &[s.samples as f64],
        &peak,
        &extreme(s.max_mach),
        &extreme(s.max_drag),
        &extreme(s.max_q_alpha),
        &crossings(&s.mach_one_up),
        &crossings(&s.mach_one_down),
        &bound,
        &[s.mach_undefined_samples as f64],
        &[s.wind_held_samples as f64],
    ];
    let mut slots = out.iter_mut();
    for value in parts.into_iter().flatten() {
        if let Some(slot) = slots.next() {
            *slot = *value;
        }
    }
    out
}

/// The vehicle options: `{drag, referenceAreaM2, referenceLengthM?}`.
pub(crate) struct VehicleSpec {
    drag: DragSpec,
    area_m2: f64,
    length_m: Option<f64>,
}

impl VehicleSpec {
    /// A constant drag coefficient `cd` on `area_m2`, with a reference length (tests).
    #[cfg(test)]
    pub(crate) fn read_native(cd: f64, area_m2: f64, length_m: f64) -> Self {
        Self { drag: DragSpec::Constant(cd), area_m2, length_m: Some(length_m) }
    }

    pub(crate) fn read(value: &JsValue) -> Result<Option<Self>, JsValue> {
        let object = js::options("vehicle", value, "drag,referenceAreaM2,referenceLengthM")?;
        if object.is_undefined() {
            return Ok(None);
        }
        let drag = DragSpec::read("vehicle.drag", &js::get(&object, "drag")?)?;
        let area_m2 = js::number("vehicle.referenceAreaM2", &js::get(&object, "referenceAreaM2")?)?;
        let length_m =
            js::optional_number("vehicle.referenceLengthM", &js::get(&object, "referenceLengthM")?)?;
        Ok(Some(Self { drag, area_m2, length_m }))
    }
}

/// What the samples say of the motion, one array per column.
#[derive(Debug)]
pub(crate) enum Velocity {
    /// Speeds relative to the air (sign ignored), m/s: no direction.
    Speed(Vec<f64>),
    /// The ground-relative velocity's east, north and up components, m/s.
    Components([Vec<f64>; 3]),
    /// The ground-relative speed (m/s), flight-path angle and heading (deg).
    Path([Vec<f64>; 3]),
}

/// The samples of a flight: times, geometric altitudes, the motion and, where given, the
/// vehicle's axis (elevation and azimuth, deg).
#[derive(Debug)]
pub(crate) struct Samples {
    pub time_s: Vec<f64>,
    pub altitude_m: Vec<f64>,
    pub velocity: Velocity,
    pub axis: Option<[Vec<f64>; 2]>,
}

/// What a scan adds to the samples: the vehicle, the winds, the recovery temperature's
/// boundary layer.
#[derive(Default)]
pub(crate) struct Setting {
    pub vehicle: Option<VehicleSpec>,
    pub winds: Option<WindProfile<Vec<WindLevel>>>,
    pub layer: Option<BoundaryLayer>,
}

/// The scan without JS: the columns given (those the setting can define), their values
/// column after column, the defined bits and the summary.
#[derive(Debug)]
pub(crate) struct Scanned {
    pub quantities: Vec<Quantity>,
    pub columns: Vec<f64>,
    pub defined: Vec<u8>,
    pub summary: FlightSummary,
}

impl Scanned {
    /// The column of `quantity`, if the scan gives it.
    pub(crate) fn column(&self, quantity: Quantity) -> Option<&[f64]> {
        let count = self.defined.len();
        let index = self.quantities.iter().position(|q| *q == quantity)?;
        self.columns.get(index * count..(index + 1) * count)
    }
}

/// A sample's failure as a `RangeError` naming it (the core's point errors name it
/// already): every failure of a sample is a value outside what a flight allows, but for
/// the upper atmosphere's tables not loaded yet, a plain `Error` as everywhere else.
fn sample_failure(e: aerostrata::Error, i: usize) -> Failure {
    let failure = Failure::from(e);
    let failure = if matches!(e, aerostrata::Error::InvalidPoint { .. }) {
        failure
    } else {
        failure.at(&Text::new("flight sample ").u(i).done())
    };
    if matches!(e, aerostrata::Error::UpperNotLoaded { .. }) {
        failure
    } else {
        Failure::range(failure.message)
    }
}

/// `name` must have one element per sample.
fn same_length(name: &str, values: &[f64], count: usize) -> Result<(), Failure> {
    if values.len() == count {
        return Ok(());
    }
    Err(Failure::range(
        Text::new(name)
            .s(" has ")
            .u(values.len())
            .s(" elements and timeS ")
            .u(count)
            .s(": every sample array must have the same length, one element per sample")
            .done(),
    ))
}

/// The `DEFINED_*` bits of the columns `samples` and `setting` can fill: those of the
/// scalar scan always (its columns stay as they were, NaN where undefined), the
/// velocity's components and the angle of attack for samples with a direction, the wind
/// with winds, the recovery temperature with a boundary layer.
fn column_bits(samples: &Samples, setting: &Setting) -> u8 {
    let bit = |given: bool, bit: u8| if given { bit } else { 0 };
    FlightPoint::DEFINED_MACH
        | FlightPoint::DEFINED_REYNOLDS_PER_M
        | FlightPoint::DEFINED_REYNOLDS_NUMBER
        | FlightPoint::DEFINED_DRAG
        | bit(
            !matches!(samples.velocity, Velocity::Speed(_)),
            FlightPoint::DEFINED_VELOCITY_COMPONENTS | FlightPoint::DEFINED_ALPHA,
        )
        | bit(setting.winds.is_some(), FlightPoint::DEFINED_WIND)
        | bit(setting.layer.is_some(), FlightPoint::DEFINED_RECOVERY_TEMPERATURE)
}

pub(crate) fn scan<A: Atmosphere>(
    atmosphere: A,
    setting: &Setting,
    samples: &Samples,
) -> Result<Scanned, Failure> {
    let count = samples.time_s.len();
    same_length("altitudeM", &samples.altitude_m, count)?;
    match &samples.velocity {
        Velocity::Speed(v) => same_length("velocityMS", v, count)?,
        Velocity::Components([e, n, u]) => {
            same_length("velocityEastMS", e, count)?;
            same_length("velocityNorthMS", n, count)?;
            same_length("velocityUpMS", u, count)?;
        }
        Velocity::Path([v, gamma, psi]) => {
            same_length("velocityMS", v, count)?;
            same_length("flightPathAngleDeg", gamma, count)?;
            same_length("headingDeg", psi, count)?;
        }
    }
    if let Some([elevation, azimuth]) = &samples.axis {
        same_length("axisElevationDeg", elevation, count)?;
        same_length("axisAzimuthDeg", azimuth, count)?;
    }
    let vehicle = match &setting.vehicle {
        None => None,
        Some(spec) => {
            let v = Vehicle::new(spec.drag.curve()?, spec.area_m2)?;
            Some(match spec.length_m {
                Some(length) => v.with_reference_length(length)?,
                None => v,
            })
        }
    };
    let mut flight = FlightScan::new(atmosphere, vehicle);
    if let Some(winds) = &setting.winds {
        flight = flight.with_winds(winds);
    }
    if let Some(layer) = setting.layer {
        flight = flight.with_recovery(layer);
    }
    let bits = column_bits(samples, setting);
    let quantities: Vec<Quantity> = FlightPoint::QUANTITIES
        .into_iter()
        .filter(|q| FlightPoint::defined_bit(*q) == 0 || FlightPoint::defined_bit(*q) & bits != 0)
        .collect();
    let mut columns = zeroed(quantities.len() * count)?;
    let mut defined = Vec::with_capacity(count);
    let at = |values: &[f64], i: usize| values.get(i).copied().unwrap_or(f64::NAN);
    for i in 0..count {
        let (t, z) = (at(&samples.time_s, i), at(&samples.altitude_m, i));
        let axis = match &samples.axis {
            Some([elevation, azimuth]) => {
                Some(Axis::new(at(elevation, i), at(azimuth, i)).map_err(|e| sample_failure(e, i))?)
            }
            None => None,
        };
        let point = match &samples.velocity {
            Velocity::Speed(v) => flight.push(Sample { time_s: t, altitude_m: z, velocity_m_s: at(v, i) }),
            Velocity::Components([e, n, u]) => flight.push_vector(VectorSample {
                time_s: t,
                altitude_m: z,
                velocity_east_m_s: at(e, i),
                velocity_north_m_s: at(n, i),
                velocity_up_m_s: at(u, i),
                axis,
            }),
            Velocity::Path([v, gamma, psi]) => {
                VectorSample::from_path(t, z, at(v, i), at(gamma, i), at(psi, i), axis)
                    .and_then(|sample| flight.push_vector(sample))
            }
        }
        .map_err(|e| sample_failure(e, i))?;
        for (c, q) in quantities.iter().enumerate() {
            if let Some(slot) = columns.get_mut(c * count + i) {
                *slot = point.get(*q).unwrap_or(f64::NAN);
            }
        }
        defined.push(point.defined());
    }
    Ok(Scanned { quantities, columns, defined, summary: flight.summary() })
}

/// The result object of a scan: `points` (the columns the scan gives, `defined`) and
/// `summary`, with `extra` (see `loads::extras`).
pub(crate) fn result(scanned: &Scanned, extra: &[f64]) -> Result<JsValue, JsValue> {
    let keys = crate::quantity::keys(scanned.quantities.iter().copied());
    let points = js::columns(&keys, &scanned.columns, scanned.defined.len())?;
    js::flight_result(&points, &scanned.defined, &summary_layout(&scanned.summary), extra)
}

#[wasm_bindgen(js_class = AtmosphereModel)]
impl AtmosphereModel {
    /// Scans a flight through this model.
    ///
    /// `scanFlight(options)`: samples of time `timeS` (s, strictly increasing) and
    /// geometric altitude `altitudeM` (m), with the velocity in one of three forms:
    /// `velocityMS` alone (the speed relative to the air, sign ignored), `velocityEastMS`,
    /// `velocityNorthMS` and `velocityUpMS` (the ground-relative velocity), or
    /// `velocityMS`, `flightPathAngleDeg` and `headingDeg` (the ground-relative speed, its
    /// angle above the horizontal and its direction clockwise from true north); arrays
    /// of one length (at most 16 777 216). With a direction: `axisElevationDeg` and
    /// `axisAzimuthDeg` (the vehicle's axis; along the ground velocity when omitted),
    /// `winds` (a `WindProfile`, or `{altitudeM, windEastMS, windNorthMS}` or `{altitudeM,
    /// windSpeedMS, windDirectionDeg}`), `qAlphaLimitPaDeg`. Always: `vehicle`,
    /// `boundaryLayer` (`"laminar"` or `"turbulent"`: the recovery temperature),
    /// `qLimitPa` (the intervals above it), `plateauFraction` (of the q plateau, 0.02 by
    /// default).
    ///
    /// `scanFlight(timeS, altitudeM, velocityMS, vehicle?)`: the speed form, as before.
    ///
    /// Returns `points`, one `Float64Array` per quantity the scan can give (NaN where a
    /// sample does not define it; `points.defined` holds each sample's bits: 1 Mach, 2
    /// unit Reynolds number, 4 Reynolds number, 8 drag, 16 velocity components, 32 wind,
    /// 64 angle of attack and q-alpha, 128 recovery temperature), and `summary` (maximum
    /// dynamic pressure with its uncertainty, maximum Mach number, drag and q-alpha, the
    /// Mach 1 crossings, the samples without a Mach number or beyond the winds, the q
    /// plateau and the exceedances asked for).
    ///
    /// Not certified flight software; verify independently; local codes, range-safety
    /// rules and licensed engineering practice govern.
    ///
    /// Throws a `RangeError` naming the sample for a bad sample (time not increasing,
    /// altitude outside the model), arrays of different lengths or options that do not
    /// fit together; a `TypeError` for an argument of the wrong type.
    #[wasm_bindgen(js_name = scanFlight, unchecked_return_type = "FlightScanResult")]
    pub fn scan_flight(
        &self,
        #[wasm_bindgen(js_name = timeS, unchecked_param_type = "Float64Array | number[] | FlightScanOptions")]
        time_s: JsValue,
        #[wasm_bindgen(js_name = altitudeM, unchecked_optional_param_type = "Float64Array | number[]")]
        altitude_m: JsValue,
        #[wasm_bindgen(js_name = velocityMS, unchecked_optional_param_type = "Float64Array | number[]")]
        velocity_m_s: JsValue,
        #[wasm_bindgen(js_name = vehicle, unchecked_optional_param_type = "VehicleSpec")] vehicle: JsValue,
    ) -> Result<JsValue, JsValue> {
        if js::is_options(&time_s) {
            if !(altitude_m.is_undefined() && velocity_m_s.is_undefined() && vehicle.is_undefined()) {
                return Err(Failure::range(
                    "scanFlight(options) takes one argument: put the samples and the vehicle in the options object",
                )
                .into());
            }
            return crate::loads::scan_with_options(&self.model, &time_s);
        }
        let samples = Samples {
            time_s: js::numbers("timeS", &time_s)?,
            altitude_m: js::numbers("altitudeM", &altitude_m)?,
            velocity: Velocity::Speed(js::numbers("velocityMS", &velocity_m_s)?),
            axis: None,
        };
        let setting = Setting { vehicle: VehicleSpec::read(&vehicle)?, ..Setting::default() };
        let scanned = scan(&self.model, &setting, &samples).js()?;
        result(&scanned, &crate::loads::extras(&scanned, &Default::default()).js()?)
    }
}

#[cfg(test)]
mod tests {
    extern crate std;
    use std::vec;

    use super::*;
    use aerostrata::US1976;

    fn speeds(t: &[f64], z: &[f64], v: &[f64]) -> Samples {
        Samples {
            time_s: t.to_vec(),
            altitude_m: z.to_vec(),
            velocity: Velocity::Speed(v.to_vec()),
            axis: None,
        }
    }

    #[test]
    fn a_short_boost_peaks_between_samples_and_sets_the_bits() {
        let t = [0.0, 1.0, 2.0, 3.0, 4.0];
        let z = [0.0, 150.0, 600.0, 1_200.0, 1_700.0];
        let v = [0.0, 300.0, 450.0, 420.0, 380.0];
        let drag = DragSpec::Constant(0.5);
        let vehicle = VehicleSpec { drag, area_m2: 0.01, length_m: Some(2.0) };
        let setting = Setting { vehicle: Some(vehicle), ..Setting::default() };
        let scanned = scan(US1976, &setting, &speeds(&t, &z, &v)).unwrap();
        assert_eq!(scanned.defined, vec![15; 5]);
        let peak = scanned.summary.max_dynamic_pressure.unwrap();
        assert_eq!(peak.sample_index, 2);
        assert!(peak.refined && peak.time_s > 1.0 && peak.time_s < 3.0);
        assert_eq!(scanned.summary.mach_one_up.count, 1);
        // Without a vehicle no drag and no Reynolds number; the scalar scan's columns
        // stay (NaN where undefined), the airspeed and total temperature join them, and
        // nothing that needs a direction, winds or a boundary layer is given.
        let bare = scan(US1976, &Setting::default(), &speeds(&t, &z, &v)).unwrap();
        assert_eq!(bare.defined, vec![FlightPoint::DEFINED_MACH | FlightPoint::DEFINED_REYNOLDS_PER_M; 5]);
        assert!(bare.column(Quantity::Drag).unwrap().iter().all(|d| d.is_nan()), "no drag without a vehicle");
        assert_eq!(bare.column(Quantity::Airspeed).unwrap(), &v[..]);
        for q in [Quantity::VelocityEast, Quantity::WindEast, Quantity::QAlpha, Quantity::RecoveryTemperature]
        {
            assert!(bare.column(q).is_none(), "{q:?}");
        }
        assert_eq!(bare.quantities.len(), 15);
        assert_eq!(bare.columns.len(), 15 * 5);
        let summary = summary_layout(&scanned.summary);
        assert_eq!(summary[0], 5.0);
        assert_eq!((summary[1], summary[7], summary[8]), (1.0, 2.0, 1.0));
        // Up crossings, then the bound of the maximum: the largest sample in the middle
        // has one.
        assert_eq!(summary[30], 1.0);
        assert_eq!(summary[36], peak.sample_max_pa);
        assert!(summary[37] >= 0.0);
        assert_eq!((summary[40], summary[41]), (0.0, 0.0));
    }

    #[test]
    fn bad_samples_are_named_range_errors() {
        let e =
            scan(US1976, &Setting::default(), &speeds(&[0.0, 1.0], &[0.0, 2.0e6], &[0.0, 1.0])).unwrap_err();
        assert!(e.message.starts_with("flight sample 1: geometric altitude"), "{}", e.message);
        assert_eq!(e.class, crate::error::Class::Range);
        let e =
            scan(US1976, &Setting::default(), &speeds(&[0.0, 0.0], &[0.0, 1.0], &[0.0, 1.0])).unwrap_err();
        assert!(e.message.starts_with("flight sample point 1"), "{}", e.message);
        assert_eq!(e.class, crate::error::Class::Range);
        let e = scan(US1976, &Setting::default(), &speeds(&[0.0], &[0.0, 1.0], &[0.0, 1.0])).unwrap_err();
        assert!(e.message.contains("same length"), "{}", e.message);
        assert_eq!(e.class, crate::error::Class::Range);
    }
}
