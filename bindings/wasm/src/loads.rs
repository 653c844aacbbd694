//! The loads of a flight through winds aloft, in JS: the `WindProfile` class, and
//! `scanFlight`'s options object (the velocity as components or as speed, flight-path
//! angle and heading, the vehicle's axis, winds, the boundary layer of the recovery
//! temperature, limits on q and q-alpha, the plateau of q). The physics is the core's
//! (`wind`, `flight`); this file reads the options and lays out the results.

use alloc::vec::Vec;

use aerostrata::flight::{exceedances, plateau, BoundaryLayer, Exceedance, PLATEAU_FRACTION};
use aerostrata::wind::{WindLevel, WindProfile as Profile};
use aerostrata::{Atmosphere, Quantity};
use wasm_bindgen::prelude::*;

use crate::error::{Failure, Js};
use crate::flight::{Samples, Scanned, Setting, VehicleSpec, Velocity};
use crate::js;
use crate::text::Text;

/// Winds aloft: the horizontal wind against geometric altitude, its east and north
/// components interpolated linearly between levels and held beyond the lowest and highest
/// levels. Call `free()` when done with it.
#[wasm_bindgen]
pub struct WindProfile {
    profile: Profile<Vec<WindLevel>>,
}

impl WindProfile {
    /// One calm level: the throwaway object through which the module start reaches the
    /// class (see `start` in lib.rs).
    pub(crate) fn calm() -> Option<Self> {
        let level = WindLevel::new(0.0, 0.0, 0.0).ok()?;
        Profile::new(alloc::vec![level]).ok().map(|profile| Self { profile })
    }
}

/// A wind failure as a `RangeError`, naming level `index` where the core did not.
fn level_failure(e: aerostrata::Error, index: usize) -> Failure {
    let failure = Failure::from(e);
    let failure = if matches!(e, aerostrata::Error::InvalidPoint { .. }) {
        failure
    } else {
        failure.at(&Text::new("winds level ").u(index).done())
    };
    Failure::range(failure.message)
}

/// The profile of levels at altitudes `z` with `a` and `b`: east and north components, or
/// (`speed_direction`) the speed and the direction the wind blows from.
fn profile_from(
    speed_direction: bool,
    z: &[f64],
    a: &[f64],
    b: &[f64],
) -> Result<Profile<Vec<WindLevel>>, Failure> {
    if a.len() != z.len() || b.len() != z.len() {
        return Err(Failure::range(
            Text::new("winds: the altitudes and the two wind arrays must have the same length (one element per level), got ")
                .u(z.len())
                .s(", ")
                .u(a.len())
                .s(" and ")
                .u(b.len())
                .done(),
        ));
    }
    let mut levels = Vec::with_capacity(z.len());
    for (i, ((&z, &a), &b)) in z.iter().zip(a).zip(b).enumerate() {
        let level =
            if speed_direction { WindLevel::from_speed_direction(z, a, b) } else { WindLevel::new(z, a, b) };
        levels.push(level.map_err(|e| level_failure(e, i))?);
    }
    // The profile's own errors name the level (or say there is none).
    Profile::new(levels).map_err(|e| Failure::range(Failure::from(e).message))
}

/// The profile of the flat levels `glue.js`'s `winds` gives: `[kind, n, altitudes, a,
/// b]`, kind 0 for east and north components, 1 for speed and the direction it blows from.
fn profile_of(flat: &[f64]) -> Result<Profile<Vec<WindLevel>>, Failure> {
    let kind = flat.first().copied().unwrap_or(0.0);
    let n = flat.get(1).copied().unwrap_or(0.0) as usize;
    let column = |k: usize| flat.get(2 + k * n..2 + (k + 1) * n).unwrap_or(&[]);
    profile_from(kind == 1.0, column(0), column(1), column(2))
}

#[wasm_bindgen]
impl WindProfile {
    /// A profile of levels at geometric altitudes `altitudeM` (m, strictly increasing),
    /// with the wind's east and north components `windEastMS` and `windNorthMS` (m/s,
    /// toward the east and the north are positive; each within +-250 m/s).
    ///
    /// Throws a `RangeError` naming the level for a value out of range or out of order.
    #[wasm_bindgen(constructor)]
    pub fn new(
        #[wasm_bindgen(js_name = altitudeM, unchecked_param_type = "Float64Array | number[]")]
        altitude_m: JsValue,
        #[wasm_bindgen(js_name = windEastMS, unchecked_param_type = "Float64Array | number[]")] east: JsValue,
        #[wasm_bindgen(js_name = windNorthMS, unchecked_param_type = "Float64Array | number[]")]
        north: JsValue,
    ) -> Result<WindProfile, JsValue> {
        let z = js::numbers("altitudeM", &altitude_m)?;
        let east = js::numbers("windEastMS", &east)?;
        let north = js::numbers("windNorthMS", &north)?;
        Ok(Self { profile: profile_from(false, &z, &east, &north).js()? })
    }

    /// A profile from the wind's speed `windSpeedMS` (m/s, 0 to 250) and the direction it
    /// blows FROM `windDirectionDeg` (degrees clockwise from true north; 270 is a west
    /// wind, blowing toward the east) at geometric altitudes `altitudeM`.
    ///
    /// Throws a `RangeError` naming the level for a value out of range or out of order.
    #[wasm_bindgen(js_name = fromSpeedDirection)]
    pub fn from_speed_direction(
        #[wasm_bindgen(js_name = altitudeM, unchecked_param_type = "Float64Array | number[]")]
        altitude_m: JsValue,
        #[wasm_bindgen(js_name = windSpeedMS, unchecked_param_type = "Float64Array | number[]")]
        speed: JsValue,
        #[wasm_bindgen(js_name = windDirectionDeg, unchecked_param_type = "Float64Array | number[]")]
        direction: JsValue,
    ) -> Result<WindProfile, JsValue> {
        let z = js::numbers("altitudeM", &altitude_m)?;
        let speed = js::numbers("windSpeedMS", &speed)?;
        let direction = js::numbers("windDirectionDeg", &direction)?;
        Ok(Self { profile: profile_from(true, &z, &speed, &direction).js()? })
    }

    /// A profile from a wind file's CSV text, read as the command line reads `--winds`:
    /// a header naming the altitude (`altitude` is geometric, or `geometric_altitude`,
    /// `geopotential_altitude`) and `wind_speed` with `wind_direction` (the direction it
    /// blows from) or `wind_east` with `wind_north`, each with or without its unit
    /// (`altitude_ft,wind_speed_kt,wind_direction_deg`); columns without a unit read in
    /// SI, or in US units when `defaultUnits` is `"us"`; other columns are kept out.
    ///
    /// Throws an `Error` naming the line, column and cell for a file it cannot read.
    #[wasm_bindgen(js_name = fromCsv)]
    pub fn from_csv(
        #[wasm_bindgen(js_name = text, unchecked_param_type = "string")] text: JsValue,
        #[wasm_bindgen(js_name = defaultUnits, unchecked_optional_param_type = "\"si\" | \"us\"")]
        units: JsValue,
    ) -> Result<WindProfile, JsValue> {
        let text = js::long_text("text", &text)?;
        let options = crate::input::table_options(&units)?;
        let file = aerostrata::model::sounding_io::read_winds_csv(&text, &options)
            .map_err(|e| JsValue::from(Failure::plain(crate::input::load_error(&e))))?;
        Ok(Self { profile: file.winds })
    }

    /// The wind at geometric altitude `altitudeM`: `{windEastMS, windNorthMS, windSpeedMS,
    /// windDirectionDeg, held}` (`held` where the altitude lies beyond the profile's
    /// levels and the nearest level's wind is held).
    #[wasm_bindgen(unchecked_return_type = "WindAt")]
    pub fn at(
        &self,
        #[wasm_bindgen(js_name = altitudeM, unchecked_param_type = "number")] altitude_m: JsValue,
    ) -> Result<JsValue, JsValue> {
        let z = js::number("altitudeM", &altitude_m)?;
        let at = self.profile.at(z).js()?;
        // The level type knows the wind's speed and direction.
        let level = WindLevel::new(z, at.east_m_s, at.north_m_s).js()?;
        Ok(js::wind_at(at.east_m_s, at.north_m_s, level.speed_m_s(), level.direction_deg(), at.held))
    }

    /// The levels: `{altitudeM, windEastMS, windNorthMS}` (three `Float64Array`s).
    #[wasm_bindgen(unchecked_return_type = "WindLevels")]
    pub fn levels(&self) -> Result<JsValue, JsValue> {
        let levels = self.profile.levels();
        let mut flat = Vec::with_capacity(3 * levels.len());
        flat.extend(levels.iter().map(|l| l.altitude_m));
        flat.extend(levels.iter().map(|l| l.east_m_s));
        flat.extend(levels.iter().map(|l| l.north_m_s));
        js::columns("altitudeM,windEastMS,windNorthMS", &flat, levels.len())
    }

    /// How many levels the profile has.
    #[wasm_bindgen(getter, js_name = levelCount)]
    pub fn level_count(&self) -> usize {
        self.profile.levels().len()
    }
}

/// The keys `scanFlight` takes in its options object.
pub(crate) const OPTION_KEYS: &str =
    "timeS,altitudeM,velocityMS,velocityEastMS,velocityNorthMS,velocityUpMS,\
flightPathAngleDeg,headingDeg,axisElevationDeg,axisAzimuthDeg,vehicle,winds,boundaryLayer,qLimitPa,\
qAlphaLimitPaDeg,plateauFraction";

/// What the options ask beyond the scan.
pub(crate) struct Asked {
    q_limit_pa: Option<f64>,
    q_alpha_limit: Option<f64>,
    plateau_fraction: f64,
}

impl Default for Asked {
    fn default() -> Self {
        Self { q_limit_pa: None, q_alpha_limit: None, plateau_fraction: PLATEAU_FRACTION }
    }
}

/// An array option, `None` when not given.
fn array(object: &JsValue, key: &str) -> Result<Option<Vec<f64>>, JsValue> {
    let value = js::get(object, key)?;
    if value.is_undefined() {
        Ok(None)
    } else {
        Ok(Some(js::numbers(key, &value)?))
    }
}

fn range(message: &str) -> JsValue {
    Failure::range(message).into()
}

/// The velocity in one of its three forms, refusing a mix.
fn velocity(object: &JsValue) -> Result<Velocity, JsValue> {
    let speed = array(object, "velocityMS")?;
    let east = array(object, "velocityEastMS")?;
    let north = array(object, "velocityNorthMS")?;
    let up = array(object, "velocityUpMS")?;
    let gamma = array(object, "flightPathAngleDeg")?;
    let psi = array(object, "headingDeg")?;
    let components = east.is_some() || north.is_some() || up.is_some();
    let mixed = components && (gamma.is_some() || psi.is_some() || speed.is_some());
    const FORMS: &str = "give velocityMS (the speed relative to the air), velocityEastMS, velocityNorthMS \
                         and velocityUpMS (the ground-relative velocity), or velocityMS, flightPathAngleDeg \
                         and headingDeg (the ground-relative speed and its direction)";
    match (speed, east, north, up, gamma, psi) {
        (None, Some(e), Some(n), Some(u), None, None) => Ok(Velocity::Components([e, n, u])),
        (Some(v), None, None, None, Some(g), Some(p)) => Ok(Velocity::Path([v, g, p])),
        (Some(v), None, None, None, None, None) => Ok(Velocity::Speed(v)),
        (None, None, None, None, None, None) => {
            Err(range(&Text::new("scanFlight options: no velocity; ").s(FORMS).done()))
        }
        _ => Err(range(
            &Text::new(if mixed {
                "scanFlight options: the velocity is given in more than one form; "
            } else {
                "scanFlight options: the velocity is incomplete; "
            })
            .s(FORMS)
            .done(),
        )),
    }
}

/// Reads `scanFlight`'s options object.
pub(crate) fn read_options(value: &JsValue) -> Result<(Samples, Setting, Asked), JsValue> {
    let object = js::options("options", value, OPTION_KEYS)?;
    let time_s = js::numbers("timeS", &js::get(&object, "timeS")?)?;
    let altitude_m = js::numbers("altitudeM", &js::get(&object, "altitudeM")?)?;
    let velocity = velocity(&object)?;
    let direction = !matches!(velocity, Velocity::Speed(_));
    let axis = match (array(&object, "axisElevationDeg")?, array(&object, "axisAzimuthDeg")?) {
        (None, None) => None,
        (Some(elevation), Some(azimuth)) => Some([elevation, azimuth]),
        _ => {
            return Err(range(
                "scanFlight options: give both axisElevationDeg and axisAzimuthDeg, or neither",
            ))
        }
    };
    let needs_direction = |what: &str| {
        range(
            &Text::new("scanFlight options: ")
                .s(what)
                .s(" needs the velocity's direction: give velocityEastMS, velocityNorthMS and velocityUpMS, \
                    or flightPathAngleDeg and headingDeg with velocityMS")
                .done(),
        )
    };
    if axis.is_some() && !direction {
        return Err(needs_direction("the vehicle's axis"));
    }
    let winds_value = js::get(&object, "winds")?;
    let winds = if winds_value.is_undefined() {
        None
    } else {
        if !direction {
            return Err(needs_direction("winds"));
        }
        Some(profile_of(&js::winds("winds", &winds_value)?).js()?)
    };
    let layer_value = js::get(&object, "boundaryLayer")?;
    let layer = if layer_value.is_undefined() {
        None
    } else {
        Some(crate::args::choice(
            "boundaryLayer",
            &layer_value,
            "laminar,turbulent",
            &[BoundaryLayer::Laminar, BoundaryLayer::Turbulent],
            None,
        )?)
    };
    let limit = |key: &str| -> Result<Option<f64>, JsValue> {
        let limit = js::optional_number(key, &js::get(&object, key)?)?;
        if let Some(l) = limit {
            aerostrata::flight::LimitWatch::new(l)
                .map_err(|e| JsValue::from(Failure::range(Failure::from(e).at(key).message)))?;
        }
        Ok(limit)
    };
    let q_limit_pa = limit("qLimitPa")?;
    let q_alpha_limit = limit("qAlphaLimitPaDeg")?;
    if q_alpha_limit.is_some() && !direction {
        return Err(needs_direction("qAlphaLimitPaDeg"));
    }
    let plateau_fraction =
        js::number_or("plateauFraction", &js::get(&object, "plateauFraction")?, PLATEAU_FRACTION)?;
    // The core checks the fraction (an empty series has no plateau).
    plateau(&[], &[], None, plateau_fraction).js()?;
    let vehicle = VehicleSpec::read(&js::get(&object, "vehicle")?)?;
    Ok((
        Samples { time_s, altitude_m, velocity, axis },
        Setting { vehicle, winds, layer },
        Asked { q_limit_pa, q_alpha_limit, plateau_fraction },
    ))
}

/// Pushes `e` as six numbers.
fn push_interval(out: &mut Vec<f64>, e: &Exceedance) {
    let flag = |b: bool| if b { 1.0 } else { 0.0 };
    out.extend([e.start_time_s, e.end_time_s, e.peak, e.peak_time_s, flag(e.open_start), flag(e.open_end)]);
}

/// The intervals where `values` exceeds `limit`: their count, then six numbers each.
fn intervals(out: &mut Vec<f64>, times: &[f64], values: &[f64], limit: f64) -> Result<(), Failure> {
    let count_at = out.len();
    out.push(0.0);
    let mut count = 0.0;
    for e in exceedances(times, values, limit)? {
        push_interval(out, &e?);
        count += 1.0;
    }
    if let Some(slot) = out.get_mut(count_at) {
        *slot = count;
    }
    Ok(())
}

/// What `glue.js`'s `flightResult` reads after the summary: the q exceedances and the
/// q-alpha exceedances (a count, -1 when not asked, then six numbers each) and the q
/// plateau (present, startTimeS, endTimeS, maximum, fraction, open).
pub(crate) fn extras(scanned: &Scanned, asked: &Asked) -> Result<Vec<f64>, Failure> {
    let mut out = Vec::new();
    let times = scanned.column(Quantity::Time).unwrap_or(&[]);
    let q = scanned.column(Quantity::DynamicPressure).unwrap_or(&[]);
    match asked.q_limit_pa {
        Some(limit) => intervals(&mut out, times, q, limit)?,
        None => out.push(-1.0),
    }
    match (asked.q_alpha_limit, scanned.column(Quantity::QAlpha)) {
        (Some(limit), Some(q_alpha)) => {
            // q-alpha is undefined where the vehicle does not move through the air (q = 0,
            // so q alpha = 0 whatever alpha) or sits in a wind with no axis given (q > 0,
            // alpha unknown: an error naming the sample).
            let mut values = Vec::with_capacity(q_alpha.len());
            for (i, (&qa, &qi)) in q_alpha.iter().zip(q).enumerate() {
                values.push(match (qa.is_nan(), qi == 0.0) {
                    (false, _) => qa,
                    (true, true) => 0.0,
                    (true, false) => {
                        return Err(Failure::range(
                            Text::new("flight sample ")
                                .u(i)
                                .s(": q-alpha is undefined (the vehicle is at rest relative to the ground in a \
                                    wind, so its axis is not known); give axisElevationDeg and axisAzimuthDeg")
                                .done(),
                        ))
                    }
                });
            }
            intervals(&mut out, times, &values, limit)?;
        }
        _ => out.push(-1.0),
    }
    let maximum = scanned.summary.max_dynamic_pressure.map(|p| p.dynamic_pressure_pa);
    match plateau(times, q, maximum, asked.plateau_fraction)? {
        Some(p) => out.extend([
            1.0,
            p.start_time_s,
            p.end_time_s,
            p.maximum,
            p.fraction,
            if p.open { 1.0 } else { 0.0 },
        ]),
        None => out.extend([0.0; 6]),
    }
    Ok(out)
}

/// `scanFlight(options)`: the scan through `atmosphere` and its result object.
pub(crate) fn scan_with_options<A: Atmosphere>(atmosphere: A, options: &JsValue) -> Result<JsValue, JsValue> {
    let (samples, setting, asked) = read_options(options)?;
    let scanned = crate::flight::scan(atmosphere, &setting, &samples).js()?;
    crate::flight::result(&scanned, &extras(&scanned, &asked).js()?)
}

#[cfg(test)]
mod tests {
    extern crate std;
    use std::string::String;
    use std::vec::Vec;
    use std::{format, fs};

    use super::*;
    use crate::flight::{scan, summary_layout};
    use aerostrata::US1976;

    /// The small vector flight of `tests/flight_loads_bits.txt`: its inputs, and every
    /// value the module gives, bit for bit. The Node test (tests/flight-loads.test.mjs)
    /// reads the same file and checks the wasm module's bits against it; this test checks
    /// the native build's. Regenerate the values with `AEROSTRATA_BLESS=1`.
    const CASE: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/flight_loads_bits.txt");

    fn inputs(text: &str, name: &str) -> Vec<f64> {
        let line = text.lines().find(|l| l.starts_with(&format!("input {name} "))).unwrap();
        line.split(' ').skip(2).map(|v| v.parse().unwrap()).collect()
    }

    fn bits(values: impl IntoIterator<Item = f64>) -> String {
        values.into_iter().map(|v| format!("{:016x}", v.to_bits())).collect::<Vec<_>>().join(" ")
    }

    /// The options name the samples' columns by the catalogue's keys, as `readFlightCsv`
    /// returns them.
    #[test]
    fn the_options_are_the_catalogues_keys() {
        use Quantity as Q;
        let keys: Vec<&str> = OPTION_KEYS.split(',').collect();
        for q in aerostrata::flight::FILE_COLUMNS.into_iter().filter(|q| *q != Q::GeometricAltitude) {
            assert!(keys.contains(&crate::quantity::key(q).as_str()), "{q:?}");
        }
        for (q, key) in [
            (Q::WindEast, "windEastMS"),
            (Q::WindSpeed, "windSpeedMS"),
            (Q::WindDirection, "windDirectionDeg"),
        ] {
            assert_eq!(crate::quantity::key(q), key);
        }
    }

    #[test]
    fn the_small_vector_flight_gives_the_bits_of_its_file() {
        let text = fs::read_to_string(CASE).unwrap();
        let get = |name: &str| inputs(&text, name);
        let samples = Samples {
            time_s: get("timeS"),
            altitude_m: get("altitudeM"),
            velocity: Velocity::Components([
                get("velocityEastMS"),
                get("velocityNorthMS"),
                get("velocityUpMS"),
            ]),
            axis: None,
        };
        let winds =
            profile_from(false, &get("winds.altitudeM"), &get("winds.windEastMS"), &get("winds.windNorthMS"));
        let [cd, area, length] = get("vehicle")[..] else { panic!("vehicle: cd, area, length") };
        let vehicle = VehicleSpec::read_native(cd, area, length);
        let setting = Setting {
            vehicle: Some(vehicle),
            winds: Some(winds.unwrap()),
            layer: Some(BoundaryLayer::Turbulent),
        };
        let [q_limit, q_alpha_limit] = get("limits")[..] else { panic!("limits: q, q-alpha") };
        let asked =
            Asked { q_limit_pa: Some(q_limit), q_alpha_limit: Some(q_alpha_limit), plateau_fraction: 0.05 };
        let scanned = scan(US1976, &setting, &samples).unwrap();
        let mut out = String::new();
        for q in &scanned.quantities {
            let key = crate::quantity::key(*q);
            out.push_str(&format!("column {key} {}\n", bits(scanned.column(*q).unwrap().iter().copied())));
        }
        out.push_str(&format!(
            "defined {}\n",
            scanned.defined.iter().map(|b| format!("{b}")).collect::<Vec<_>>().join(" ")
        ));
        out.push_str(&format!("summary {}\n", bits(summary_layout(&scanned.summary))));
        out.push_str(&format!("extras {}\n", bits(extras(&scanned, &asked).unwrap())));
        let inputs: String = text
            .lines()
            .filter(|l| {
                !l.starts_with("column ")
                    && !["defined ", "summary ", "extras "].iter().any(|p| l.starts_with(p))
            })
            .map(|l| format!("{l}\n"))
            .collect();
        let expected = format!("{inputs}{out}");
        if std::env::var_os("AEROSTRATA_BLESS").is_some() {
            fs::write(CASE, &expected).unwrap();
            return;
        }
        assert_eq!(text, expected, "the native values differ from {CASE} (AEROSTRATA_BLESS=1 rewrites it)");
        // The file's flight is one worth checking: winds held above the top level, q-alpha
        // above its limit somewhere, a peak of q between samples.
        assert!(scanned.summary.wind_held_samples > 0);
        assert!(scanned.summary.max_q_alpha.unwrap().value > q_alpha_limit);
        assert!(scanned.summary.max_dynamic_pressure.unwrap().refined);
    }
}
