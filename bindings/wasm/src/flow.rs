//! The full module's compressible flow, airspeeds, altimetry and drag tables (the `full`
//! feature): each a thin call of the core function of the same name, its arguments read
//! as JS numbers, as in aero.rs (the lite module's point loads).

use alloc::vec::Vec;

use aerostrata::airspeed::{AirData, Airspeed, Airspeeds};
use aerostrata::flow::{MachBranch, NormalShock};
use aerostrata::inverse::{self, BarometricReference};
use aerostrata::{DragCurve, Interpolation};
use wasm_bindgen::prelude::*;

use crate::aero::gas;
use crate::args;
use crate::error::Js;
use crate::js::{self, record};

/// A drag coefficient as JS gives it: a number, or a table `{mach, cd, interpolation}`.
/// The table is owned here and lent to the core's [`DragCurve`] for each use.
pub(crate) enum DragSpec {
    Constant(f64),
    Table { mach: Vec<f64>, cd: Vec<f64>, interpolation: Interpolation },
}

impl DragSpec {
    /// Reads `value` (argument `name`): a number, or an object with `mach` and `cd`
    /// arrays and an optional `interpolation` (`"monotoneCubic"`, the default, or
    /// `"linear"`). The curve is checked at once.
    pub(crate) fn read(name: &str, value: &JsValue) -> Result<Self, JsValue> {
        let table = js::drag(name, value)?;
        let spec = match table.as_f64() {
            Some(cd) => Self::Constant(cd),
            None => {
                let member = |key: &str| crate::text::Text::new(name).s(".").s(key).done();
                Self::Table {
                    mach: js::numbers(&member("mach"), &js::get(&table, "mach")?)?,
                    cd: js::numbers(&member("cd"), &js::get(&table, "cd")?)?,
                    interpolation: args::choice(
                        &member("interpolation"),
                        &js::get(&table, "interpolation")?,
                        "monotoneCubic,linear",
                        &[Interpolation::MonotoneCubic, Interpolation::Linear],
                        Some(0),
                    )?,
                }
            }
        };
        spec.curve().js()?;
        Ok(spec)
    }

    /// The core's curve over this spec.
    pub(crate) fn curve(&self) -> aerostrata::Result<DragCurve<'_>> {
        match self {
            Self::Constant(cd) => DragCurve::constant(*cd),
            Self::Table { mach, cd, interpolation } => DragCurve::table(mach, cd, *interpolation),
        }
    }
}

/// The drag coefficient that `drag` (a number, or a table of Mach and Cd) gives at Mach
/// number `mach`; beyond a table's ends its first or last Cd.
///
/// Throws a `TypeError` for a malformed spec, an `Error` naming the point for a bad table
/// (Mach not increasing, Cd not above 0), a `RangeError` for a Mach number outside 0 to
/// 1000.
#[wasm_bindgen(js_name = dragCoefficient)]
pub fn drag_coefficient(
    #[wasm_bindgen(js_name = drag, unchecked_param_type = "DragSpec")] drag: JsValue,
    #[wasm_bindgen(js_name = mach, unchecked_param_type = "number")] mach: JsValue,
) -> Result<f64, JsValue> {
    let spec = DragSpec::read("drag", &drag)?;
    let mach = js::number("mach", &mach)?;
    spec.curve().js()?.cd(mach).js()
}

/// The isentropic static-to-total ratios at Mach number `mach` (NACA Report 1135's
/// p/pt, T/Tt and rho/rhot), for ratio of specific heats `gamma` (default 1.4).
///
/// Throws a `RangeError` for a Mach number outside 0 to 1000 or gamma outside 1.01 to 1.7.
#[wasm_bindgen(js_name = isentropic, unchecked_return_type = "IsentropicRatios")]
pub fn isentropic(
    #[wasm_bindgen(js_name = mach, unchecked_param_type = "number")] mach: JsValue,
    #[wasm_bindgen(js_name = gamma, unchecked_optional_param_type = "number")] gamma: JsValue,
) -> Result<JsValue, JsValue> {
    let mach = js::number("mach", &mach)?;
    let r = gas(&gamma)?.isentropic(mach).js()?;
    Ok(record(
        "mach,pressureRatio,temperatureRatio,densityRatio",
        &[r.mach, r.pressure_ratio, r.temperature_ratio, r.density_ratio],
    ))
}

number_function! {
    #[doc = " The isentropic area ratio A/A* at Mach number `mach`."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a Mach number outside 1e-9 to 1000."]
    areaRatio => fn area_ratio(mach as mach; gas) {
        gas.area_ratio(mach)
    }
}

number_function! {
    #[doc = " The Mach number whose isentropic static-to-total pressure ratio p/pt is `ratio`."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a ratio outside the values Mach 0 to 1000 give."]
    machFromPressureRatio => fn mach_from_pressure_ratio(ratio as ratio; gas) {
        gas.mach_from_pressure_ratio(ratio)
    }
}

number_function! {
    #[doc = " The Mach number whose isentropic static-to-total temperature ratio T/Tt is `ratio`."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a ratio outside the values Mach 0 to 1000 give."]
    machFromTemperatureRatio => fn mach_from_temperature_ratio(ratio as ratio; gas) {
        gas.mach_from_temperature_ratio(ratio)
    }
}

number_function! {
    #[doc = " The Mach number whose isentropic static-to-total density ratio rho/rhot is `ratio`."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a ratio outside the values Mach 0 to 1000 give."]
    machFromDensityRatio => fn mach_from_density_ratio(ratio as ratio; gas) {
        gas.mach_from_density_ratio(ratio)
    }
}

/// The Mach number on `branch` (`"subsonic"` or `"supersonic"`) whose isentropic area
/// ratio A/A* is `ratio`, for ratio of specific heats `gamma` (default 1.4).
///
/// Throws a `RangeError` for a ratio below 1 or beyond the branch's end, or an unknown
/// branch.
#[wasm_bindgen(js_name = machFromAreaRatio)]
pub fn mach_from_area_ratio(
    #[wasm_bindgen(js_name = ratio, unchecked_param_type = "number")] ratio: JsValue,
    #[wasm_bindgen(js_name = branch, unchecked_param_type = "\"subsonic\" | \"supersonic\"")] branch: JsValue,
    #[wasm_bindgen(js_name = gamma, unchecked_optional_param_type = "number")] gamma: JsValue,
) -> Result<f64, JsValue> {
    let ratio = js::number("ratio", &ratio)?;
    let branch = args::choice(
        "branch",
        &branch,
        "subsonic,supersonic",
        &[MachBranch::Subsonic, MachBranch::Supersonic],
        None,
    )?;
    gas(&gamma)?.mach_from_area_ratio(ratio, branch).js()
}

fn shock_object(s: &NormalShock) -> JsValue {
    record(
        "upstreamMach,downstreamMach,pressureRatio,densityRatio,temperatureRatio,totalPressureRatio,pitotPressureRatio",
        &[
            s.upstream_mach,
            s.downstream_mach,
            s.pressure_ratio,
            s.density_ratio,
            s.temperature_ratio,
            s.total_pressure_ratio,
            s.pitot_pressure_ratio,
        ],
    )
}

/// The normal-shock relations at upstream Mach number `mach` (at least 1): downstream
/// Mach number, the static ratios p2/p1, rho2/rho1 and T2/T1, the total-pressure ratio
/// pt2/pt1 and the Rayleigh pitot ratio pt2/p1, for ratio of specific heats `gamma`
/// (default 1.4).
///
/// Throws a `RangeError` for a Mach number outside 1 to 1000.
#[wasm_bindgen(js_name = normalShock, unchecked_return_type = "NormalShockRatios")]
pub fn normal_shock(
    #[wasm_bindgen(js_name = mach, unchecked_param_type = "number")] mach: JsValue,
    #[wasm_bindgen(js_name = gamma, unchecked_optional_param_type = "number")] gamma: JsValue,
) -> Result<JsValue, JsValue> {
    let mach = js::number("mach", &mach)?;
    Ok(shock_object(&gas(&gamma)?.normal_shock(mach).js()?))
}

number_function! {
    #[doc = " Impact pressure over static pressure, (pt - p) / p, at Mach number `mach`: the"]
    #[doc = " isentropic pitot relation up to Mach 1, the Rayleigh pitot formula above."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a Mach number outside 0 to 1000."]
    impactPressureRatio => fn impact_pressure_ratio(mach as mach; gas) {
        gas.impact_pressure_ratio(mach)
    }
}

number_function! {
    #[doc = " Impact pressure qc = pt - p, Pa, at static pressure `staticPressurePa` (Pa) and"]
    #[doc = " Mach number `mach`."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a value out of range."]
    impactPressurePa => fn impact_pressure_pa(pressure as staticPressurePa, mach as mach; gas) {
        gas.impact_pressure_pa(pressure, mach)
    }
}

number_function! {
    #[doc = " The Mach number whose impact-to-static pressure ratio qc / p is `ratio`."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a ratio outside the values Mach 0 to 1000 give."]
    machFromImpactPressureRatio => fn mach_from_impact_pressure_ratio(ratio as ratio; gas) {
        gas.mach_from_impact_pressure_ratio(ratio)
    }
}

const AIRSPEED_KINDS: [fn(f64) -> Airspeed; 4] =
    [Airspeed::Calibrated, Airspeed::Equivalent, Airspeed::True, Airspeed::Mach];

fn airspeeds_object(s: &Airspeeds) -> JsValue {
    let values = Airspeeds::QUANTITIES.map(|q| s.get(q).unwrap_or(f64::NAN));
    record(&crate::quantity::keys(Airspeeds::QUANTITIES), &values)
}

fn airspeeds_from(air: AirData, kind: &JsValue, value: &JsValue) -> Result<JsValue, JsValue> {
    let make = args::choice("givenKind", kind, "calibrated,equivalent,true,mach", &AIRSPEED_KINDS, None)?;
    let given = make(js::number("given", value)?);
    Ok(airspeeds_object(&air.airspeeds(given).js()?))
}

/// Every airspeed of one flight condition (calibrated, equivalent and true airspeed in
/// m/s, Mach number, impact and dynamic pressure in Pa) from one of them: `givenKind`
/// `"calibrated"`, `"equivalent"` or `"true"` (m/s) or `"mach"`, with value `given`, in
/// dry air at static pressure `staticPressurePa` (Pa) and outside air temperature
/// `temperatureK` (K). gamma = 1.4.
///
/// Throws a `RangeError` for a value out of range or an unknown kind.
#[wasm_bindgen(js_name = airspeeds, unchecked_return_type = "AirspeedSet")]
pub fn airspeeds(
    #[wasm_bindgen(js_name = staticPressurePa, unchecked_param_type = "number")] pressure: JsValue,
    #[wasm_bindgen(js_name = temperatureK, unchecked_param_type = "number")] temperature: JsValue,
    #[wasm_bindgen(js_name = givenKind, unchecked_param_type = "AirspeedKind")] kind: JsValue,
    #[wasm_bindgen(js_name = given, unchecked_param_type = "number")] given: JsValue,
) -> Result<JsValue, JsValue> {
    let [pressure, temperature] =
        args::numbers([("staticPressurePa", &pressure), ("temperatureK", &temperature)])?;
    airspeeds_from(AirData::new(pressure, temperature).js()?, &kind, &given)
}

/// As `airspeeds`, with the static pressure given as a pressure altitude
/// `pressureAltitudeM` (geopotential metres of the 1976 standard, as an altimeter set to
/// 1013.25 hPa reads).
///
/// Throws a `RangeError` for a value out of range or an unknown kind.
#[wasm_bindgen(js_name = airspeedsAtPressureAltitude, unchecked_return_type = "AirspeedSet")]
pub fn airspeeds_at_pressure_altitude(
    #[wasm_bindgen(js_name = pressureAltitudeM, unchecked_param_type = "number")] altitude: JsValue,
    #[wasm_bindgen(js_name = temperatureK, unchecked_param_type = "number")] temperature: JsValue,
    #[wasm_bindgen(js_name = givenKind, unchecked_param_type = "AirspeedKind")] kind: JsValue,
    #[wasm_bindgen(js_name = given, unchecked_param_type = "number")] given: JsValue,
) -> Result<JsValue, JsValue> {
    let [altitude, temperature] =
        args::numbers([("pressureAltitudeM", &altitude), ("temperatureK", &temperature)])?;
    airspeeds_from(AirData::from_pressure_altitude(altitude, temperature).js()?, &kind, &given)
}

number_function! {
    #[doc = " Pressure altitude, geopotential m: where the 1976 standard has pressure"]
    #[doc = " `pressurePa` (Pa)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a pressure outside the standard's (its values at"]
    #[doc = " 1000 km and at -5 km)."]
    pressureAltitudeM => fn pressure_altitude_m(pressure as pressurePa) {
        inverse::pressure_altitude(pressure).map(|h| h.meters())
    }
}

number_function! {
    #[doc = " Density altitude, geopotential m: where the 1976 standard has density"]
    #[doc = " `densityKgM3` (kg/m^3)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a density outside the standard's."]
    densityAltitudeM => fn density_altitude_m(density as densityKgM3) {
        inverse::density_altitude(density).map(|h| h.meters())
    }
}

number_function! {
    #[doc = " Density altitude, geopotential m, of dry air at static pressure `pressurePa` (Pa)"]
    #[doc = " and outside air temperature `temperatureK` (K)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a value out of range."]
    densityAltitudeFromM => fn density_altitude_from_m(pressure as pressurePa, temperature as temperatureK) {
        inverse::density_altitude_from(pressure, temperature).map(|h| h.meters())
    }
}

/// Barometric altitude, m: the pressure altitude of `pressurePa` (Pa) minus that of the
/// reference: `"standard"` (the default: 101 325 Pa, giving the pressure altitude),
/// `{qnhPa}` (an altimeter setting, Pa: the altitude above sea level the altimeter shows)
/// or `{padPressurePa}` (the pad's pressure at launch, Pa: the height above the pad).
/// Uncorrected for the day's temperature (about 4 % per 10 K off standard).
///
/// Throws a `RangeError` for a pressure or reference outside the lower standard's, a
/// `TypeError` for a malformed reference.
#[wasm_bindgen(js_name = barometricAltitudeM)]
pub fn barometric_altitude_m(
    #[wasm_bindgen(js_name = pressurePa, unchecked_param_type = "number")] pressure: JsValue,
    #[wasm_bindgen(js_name = reference, unchecked_optional_param_type = "BarometricReferenceSpec")] reference: JsValue,
) -> Result<f64, JsValue> {
    let pressure = js::number("pressurePa", &pressure)?;
    let reference = barometric_reference(&reference)?;
    inverse::barometric_altitude_m(pressure, reference).js()
}

fn barometric_reference(value: &JsValue) -> Result<BarometricReference, JsValue> {
    let reference = js::reference(value)?;
    let pressure_pa = reference.get(1).copied().unwrap_or(f64::NAN);
    Ok(match reference.first().map_or(0, |&kind| kind as u32) {
        1 => BarometricReference::Qnh { setting_pa: pressure_pa },
        2 => BarometricReference::Pad { pressure_pa },
        _ => BarometricReference::StandardSeaLevel,
    })
}
