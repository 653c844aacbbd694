//! The flight scan over arrays of time, altitude and velocity: each sample's q, Mach,
//! Reynolds number and drag as columns, and the summary (maximum q refined between
//! samples, maximum Mach, the Mach 1 crossings, maximum drag).

use alloc::vec::Vec;

use aerostrata::flight::{
    samples_from_slices, Crossings, Extreme, FlightPoint, FlightScan, FlightSummary, Peak,
};
use aerostrata::{Atmosphere, Vehicle};
use wasm_bindgen::prelude::*;

use crate::aero::DragSpec;
use crate::args::zeroed;
use crate::error::{Failure, Js};
use crate::js;
use crate::model::AtmosphereModel;
use crate::text::Text;

/// How many per-sample columns: the catalogue's quantities of a flight point.
const COLUMNS: usize = FlightPoint::QUANTITIES.len();

/// A point's values in the order of [`FlightPoint::QUANTITIES`] (NaN where not defined)
/// and its bits ([`FlightPoint::defined`]: 1 Mach, 2 unit Reynolds number, 4 Reynolds
/// number, 8 drag, as `scanFlight` documents them).
fn point_row(p: &FlightPoint) -> ([f64; COLUMNS], u8) {
    (FlightPoint::QUANTITIES.map(|q| p.get(q).unwrap_or(f64::NAN)), p.defined())
}

/// How many numbers the summary's flat layout has (see `glue.js`, `flightResult`).
pub const SUMMARY_LAYOUT: usize = 27;

/// The summary in the flat layout `glue.js` reads: samples; the maximum dynamic pressure
/// (present, timeS, altitudeM, velocityMS, mach, dynamicPressurePa, sampleIndex,
/// refined); the maximum Mach number and the maximum drag (present, value, timeS,
/// altitudeM, velocityMS, sampleIndex); the Mach 1 crossings up and down (count,
/// firstTimeS, lastTimeS). NaN for "none".
pub(crate) fn summary_layout(s: &FlightSummary) -> [f64; SUMMARY_LAYOUT] {
    let nan = f64::NAN;
    let flag = |b: bool| if b { 1.0 } else { 0.0 };
    let extreme = |e: Option<Extreme>| match e {
        Some(e) => [1.0, e.value, e.time_s, e.altitude_m, e.velocity_m_s, e.sample_index as f64],
        None => [0.0, nan, nan, nan, nan, nan],
    };
    let crossings =
        |c: &Crossings| [f64::from(c.count), c.first_time_s.unwrap_or(nan), c.last_time_s.unwrap_or(nan)];
    let peak: [f64; 8] = match s.max_dynamic_pressure {
        Some(Peak {
            time_s,
            altitude_m,
            velocity_m_s,
            mach,
            dynamic_pressure_pa,
            sample_index,
            refined,
            ..
        }) => [
            1.0,
            time_s,
            altitude_m,
            velocity_m_s,
            mach.unwrap_or(nan),
            dynamic_pressure_pa,
            sample_index as f64,
            flag(refined),
        ],
        None => [0.0, nan, nan, nan, nan, nan, nan, 0.0],
    };
    let mut out = [nan; SUMMARY_LAYOUT];
    out[0] = s.samples as f64;
    out[1..9].copy_from_slice(&peak);
    out[9..15].copy_from_slice(&extreme(s.max_mach));
    out[15..21].copy_from_slice(&extreme(s.max_drag));
    out[21..24].copy_from_slice(&crossings(&s.mach_one_up));
    out[24..27].copy_from_slice(&crossings(&s.mach_one_down));
    out
}

/// The vehicle options: `{drag, referenceAreaM2, referenceLengthM?}`.
struct VehicleSpec {
    drag: DragSpec,
    area_m2: f64,
    length_m: Option<f64>,
}

impl VehicleSpec {
    fn read(value: &JsValue) -> Result<Option<Self>, JsValue> {
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

/// The scan without JS: the columns, the defined bits and the summary.
#[derive(Debug)]
pub(crate) struct Scanned {
    /// Column after column, [`COLUMNS`] times the sample count.
    pub columns: Vec<f64>,
    pub defined: Vec<u8>,
    pub summary: FlightSummary,
}

fn scan<A: Atmosphere>(
    atmosphere: A,
    vehicle: Option<&VehicleSpec>,
    time_s: &[f64],
    altitude_m: &[f64],
    velocity_m_s: &[f64],
) -> Result<Scanned, Failure> {
    let vehicle = match vehicle {
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
    let count = time_s.len();
    let mut columns = zeroed(COLUMNS * count)?;
    let mut defined = Vec::with_capacity(count);
    for (i, sample) in samples_from_slices(time_s, altitude_m, velocity_m_s)?.enumerate() {
        let point = flight.push(sample).map_err(|e| {
            let failure = Failure::from(e);
            // The core's point errors already name the sample; the others get it here.
            if matches!(e, aerostrata::Error::InvalidPoint { .. }) {
                failure
            } else {
                failure.at(&Text::new("flight sample ").u(i).done())
            }
        })?;
        let (row, bits) = point_row(&point);
        for (c, value) in row.into_iter().enumerate() {
            if let Some(slot) = columns.get_mut(c * count + i) {
                *slot = value;
            }
        }
        defined.push(bits);
    }
    Ok(Scanned { columns, defined, summary: flight.summary() })
}

#[wasm_bindgen(js_class = AtmosphereModel)]
impl AtmosphereModel {
    /// Scans a flight through this model: samples of time `timeS` (s, strictly
    /// increasing), geometric altitude `altitudeM` (m) and velocity relative to the air
    /// `velocityMS` (m/s; its sign is ignored), three arrays of one length (at most
    /// 16 777 216). With `vehicle` (`{drag, referenceAreaM2, referenceLengthM?}`: a drag
    /// coefficient or a table of Mach and Cd, the reference area in m^2, the reference
    /// length in m for the Reynolds number) it adds drag.
    ///
    /// Returns `points`, one `Float64Array` per quantity (NaN where a quantity is not
    /// defined; `points.defined` holds each sample's bits: 1 Mach, 2 unit Reynolds number,
    /// 4 Reynolds number, 8 drag), and `summary` (maximum dynamic pressure refined between
    /// samples, maximum Mach number, the Mach 1 crossings, maximum drag).
    ///
    /// Throws naming the sample for a bad sample (time not increasing, altitude outside
    /// the model), an `Error` for arrays of different lengths.
    #[wasm_bindgen(js_name = scanFlight, unchecked_return_type = "FlightScanResult")]
    pub fn scan_flight(
        &self,
        #[wasm_bindgen(js_name = timeS, unchecked_param_type = "Float64Array | number[]")] time_s: JsValue,
        #[wasm_bindgen(js_name = altitudeM, unchecked_param_type = "Float64Array | number[]")]
        altitude_m: JsValue,
        #[wasm_bindgen(js_name = velocityMS, unchecked_param_type = "Float64Array | number[]")] velocity_m_s: JsValue,
        #[wasm_bindgen(js_name = vehicle, unchecked_optional_param_type = "VehicleSpec")] vehicle: JsValue,
    ) -> Result<JsValue, JsValue> {
        let time_s = js::numbers("timeS", &time_s)?;
        let altitude_m = js::numbers("altitudeM", &altitude_m)?;
        let velocity_m_s = js::numbers("velocityMS", &velocity_m_s)?;
        let vehicle = VehicleSpec::read(&vehicle)?;
        let scanned = scan(&self.model, vehicle.as_ref(), &time_s, &altitude_m, &velocity_m_s).js()?;
        let keys = crate::quantity::keys(FlightPoint::QUANTITIES);
        let points = js::columns(&keys, &scanned.columns, time_s.len())?;
        js::flight_result(&points, &scanned.defined, &summary_layout(&scanned.summary))
    }
}

#[cfg(test)]
mod tests {
    extern crate std;
    use std::vec;

    use super::*;
    use aerostrata::US1976;

    #[test]
    fn a_short_boost_peaks_between_samples_and_sets_the_bits() {
        let t = [0.0, 1.0, 2.0, 3.0, 4.0];
        let z = [0.0, 150.0, 600.0, 1_200.0, 1_700.0];
        let v = [0.0, 300.0, 450.0, 420.0, 380.0];
        let drag = DragSpec::Constant(0.5);
        let spec = VehicleSpec { drag, area_m2: 0.01, length_m: Some(2.0) };
        let scanned = scan(US1976, Some(&spec), &t, &z, &v).unwrap();
        assert_eq!(scanned.defined, vec![15; 5]);
        let peak = scanned.summary.max_dynamic_pressure.unwrap();
        assert_eq!(peak.sample_index, 2);
        assert!(peak.refined && peak.time_s > 1.0 && peak.time_s < 3.0);
        assert_eq!(scanned.summary.mach_one_up.count, 1);
        // Without a vehicle no drag and no Reynolds number.
        let bare = scan(US1976, None, &t, &z, &v).unwrap();
        assert_eq!(bare.defined, vec![FlightPoint::DEFINED_MACH | FlightPoint::DEFINED_REYNOLDS_PER_M; 5]);
        assert!(bare.columns[12 * 5..13 * 5].iter().all(|d| d.is_nan()), "no drag without a vehicle");
        assert_eq!(bare.columns.len(), COLUMNS * 5);
        let summary = summary_layout(&scanned.summary);
        assert_eq!(summary[0], 5.0);
        assert_eq!((summary[1], summary[7], summary[8]), (1.0, 2.0, 1.0));
        assert_eq!(summary[21], 1.0);
    }

    #[test]
    fn bad_samples_are_named() {
        let e = scan(US1976, None, &[0.0, 1.0], &[0.0, 2.0e6], &[0.0, 1.0]).unwrap_err();
        assert!(e.message.starts_with("flight sample 1: geometric altitude"), "{}", e.message);
        let e = scan(US1976, None, &[0.0, 0.0], &[0.0, 1.0], &[0.0, 1.0]).unwrap_err();
        assert!(e.message.starts_with("flight sample point 1"), "{}", e.message);
        let e = scan(US1976, None, &[0.0], &[0.0, 1.0], &[0.0, 1.0]).unwrap_err();
        assert!(e.message.contains("same length"), "{}", e.message);
    }
}
