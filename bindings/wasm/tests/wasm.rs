//! The Rust side of the wasm door, run in wasm under Node (`cargo xtask wasm-test`:
//! wasm-bindgen-test): the exports called from Rust with JS values, the JS error classes
//! and messages they throw, and the numbers as JS prints them.

#![cfg(target_arch = "wasm32")]

use aerostrata::{Altitude, Atmosphere, US1976};
use aerostrata_wasm::{dynamic_pressure_pa, normal_shock, standard_state, AtmosphereModel, Class, Failure};
use js_sys::{Float64Array, Reflect};
use wasm_bindgen::{JsCast, JsValue};
use wasm_bindgen_test::wasm_bindgen_test;

fn number(value: f64) -> JsValue {
    JsValue::from_f64(value)
}

fn get(object: &JsValue, key: &str) -> JsValue {
    Reflect::get(object, &JsValue::from_str(key)).unwrap()
}

fn message(error: &JsValue) -> String {
    error.dyn_ref::<js_sys::Error>().map(|e| String::from(e.message())).unwrap_or_default()
}

#[wasm_bindgen_test]
fn failures_become_the_js_error_classes() {
    let range: JsValue = Failure::range("altitude 2e7 m is outside").into();
    assert!(range.is_instance_of::<js_sys::RangeError>());
    let type_error: JsValue = Failure::type_error("not a number").into();
    assert!(type_error.is_instance_of::<js_sys::TypeError>());
    let plain: JsValue = Failure { class: Class::Plain, message: "layer 1".into() }.into();
    assert!(plain.is_instance_of::<js_sys::Error>());
    assert!(!plain.is_instance_of::<js_sys::RangeError>() && !plain.is_instance_of::<js_sys::TypeError>());
    assert_eq!(message(&plain), "layer 1");
}

#[wasm_bindgen_test]
fn core_errors_read_with_js_numbers() {
    // An out-of-range altitude: the core's words, the numbers as JS prints them.
    let error = standard_state(number(2.0e21), JsValue::UNDEFINED, JsValue::UNDEFINED).unwrap_err();
    assert!(error.is_instance_of::<js_sys::RangeError>());
    assert_eq!(
        message(&error),
        "geometric altitude 2e+21 m is outside the allowed range -1000000 to 10000000 m"
    );
    let error = normal_shock(number(0.5), JsValue::UNDEFINED).unwrap_err();
    assert_eq!(message(&error), "upstream Mach number 0.5 is outside the allowed range 1 to 1000");
}

#[wasm_bindgen_test]
fn scalar_exports_read_js_numbers_only() {
    assert_eq!(dynamic_pressure_pa(number(2.0), number(10.0)).unwrap(), 100.0);
    let error = dynamic_pressure_pa(JsValue::from_str("2"), number(10.0)).unwrap_err();
    assert!(error.is_instance_of::<js_sys::TypeError>());
    assert_eq!(message(&error), "densityKgM3 must be a number, got the string \"2\"");
    let error = dynamic_pressure_pa(JsValue::NULL, number(10.0)).unwrap_err();
    assert_eq!(message(&error), "densityKgM3 must be a number, got null");
}

/// The upper atmosphere's tables, as `loadUpper` hands them to the module (build.rs writes
/// the file from the native core's compiled-in table).
fn load_upper() {
    let file: &[u8] = include_bytes!(concat!(env!("OUT_DIR"), "/aerostrata_upper.bin"));
    AtmosphereModel::load_upper_bytes(js_sys::Uint8Array::from(file).into()).unwrap();
    assert!(aerostrata_wasm::upper_loaded());
}

#[wasm_bindgen_test]
fn the_state_and_the_batch_carry_the_cores_bits() {
    load_upper();
    let model = AtmosphereModel::standard(JsValue::UNDEFINED).unwrap();
    for z in [-5000.0, 0.0, 11_000.0, 47_350.5, 85_999.0, 86_000.0, 150_000.0, 999_999.0] {
        let native = US1976.state(Altitude::geometric_m(z).unwrap()).unwrap();
        let state = model.state(number(z), JsValue::UNDEFINED).unwrap();
        assert_eq!(get(&state, "pressurePa").as_f64().unwrap().to_bits(), native.pressure_pa.to_bits());
        assert_eq!(get(&state, "densityKgM3").as_f64().unwrap().to_bits(), native.density_kg_m3.to_bits());
        match native.speed_of_sound_m_s {
            Some(a) => assert_eq!(get(&state, "speedOfSoundMS").as_f64().unwrap().to_bits(), a.to_bits()),
            None => assert!(get(&state, "speedOfSoundMS").is_null()),
        }
    }
    let altitudes = Float64Array::from(&[0.0, 20_000.0, 40_000.0][..]);
    let quantities = js_sys::Array::of2(&"temperatureK".into(), &"meanFreePathM".into());
    let columns = model.batch(altitudes.into(), quantities.into(), JsValue::UNDEFINED).unwrap();
    let temperatures = get(&columns, "temperatureK").dyn_into::<Float64Array>().unwrap().to_vec();
    let paths = get(&columns, "meanFreePathM").dyn_into::<Float64Array>().unwrap().to_vec();
    for (i, z) in [0.0, 20_000.0, 40_000.0].into_iter().enumerate() {
        let native = US1976.state(Altitude::geometric_m(z).unwrap()).unwrap();
        assert_eq!(temperatures[i].to_bits(), native.temperature_k.to_bits());
        assert_eq!(paths[i].to_bits(), native.mean_free_path_m.to_bits());
    }
}

#[wasm_bindgen_test]
fn the_flight_scan_summary_crosses_the_boundary_intact() {
    let model = AtmosphereModel::standard(JsValue::UNDEFINED).unwrap();
    let t = Float64Array::from(&[0.0, 1.0, 2.0, 3.0, 4.0][..]);
    let z = Float64Array::from(&[0.0, 150.0, 600.0, 1200.0, 1700.0][..]);
    let v = Float64Array::from(&[0.0, 300.0, 450.0, 420.0, 380.0][..]);
    let result = model.scan_flight(t.into(), z.into(), v.into(), JsValue::UNDEFINED).unwrap();
    let summary = get(&result, "summary");
    let peak = get(&summary, "maxDynamicPressure");
    assert_eq!(get(&peak, "sampleIndex").as_f64(), Some(2.0));
    assert_eq!(get(&peak, "refined").as_bool(), Some(true));
    assert_eq!(get(&get(&summary, "machOneUp"), "count").as_f64(), Some(1.0));
    assert!(get(&get(&summary, "machOneDown"), "firstTimeS").is_null());
    assert!(get(&summary, "maxDrag").is_null());
}
