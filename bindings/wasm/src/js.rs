//! The imports from `glue.js`: reading JS arguments and building result objects on the
//! JS side (see the comment at the top of that file for why). Those that can throw are
//! declared `catch`, so that a JS exception comes back as an `Err` and the Rust frames
//! return normally (an exception unwinding through them would skip their destructors).

use alloc::string::String;
use alloc::vec::Vec;

use wasm_bindgen::prelude::*;

#[wasm_bindgen(module = "/src/glue.js")]
extern "C" {
    /// A JS error: kind 0 `TypeError`, 1 `RangeError`, 2 `Error`.
    pub fn error(kind: u32, message: &str) -> JsValue;

    /// `String(value)`.
    #[wasm_bindgen(js_name = numberText)]
    pub fn number_text(value: f64) -> String;

    /// `value` if it is a JS number, else a `TypeError` naming `name`.
    #[wasm_bindgen(catch)]
    pub fn number(name: &str, value: &JsValue) -> Result<f64, JsValue>;

    /// As [`number`], `fallback` for `undefined`.
    #[wasm_bindgen(catch, js_name = numberOr)]
    pub fn number_or(name: &str, value: &JsValue, fallback: f64) -> Result<f64, JsValue>;

    /// As [`number`], `None` for `undefined` and `null`.
    #[wasm_bindgen(catch, js_name = optionalNumber)]
    pub fn optional_number(name: &str, value: &JsValue) -> Result<Option<f64>, JsValue>;

    /// A `Float64Array` or an array of numbers, copied; a `TypeError` or `RangeError`
    /// naming `name` (and the element) otherwise.
    #[wasm_bindgen(catch)]
    pub fn numbers(name: &str, value: &JsValue) -> Result<Vec<f64>, JsValue>;

    /// Optional numbers, one per row: the values, then 1 or 0 for given or not.
    #[wasm_bindgen(catch, js_name = optionalNumbers)]
    pub fn optional_numbers(name: &str, value: &JsValue) -> Result<Vec<f64>, JsValue>;

    /// The index of `value` among the comma-separated `options` (`fallback` for
    /// `undefined` if it is not -1).
    #[wasm_bindgen(catch)]
    pub fn choice(name: &str, value: &JsValue, options: &str, fallback: i32) -> Result<u32, JsValue>;

    /// For an array of strings, the index of each among the comma-separated `options`.
    #[wasm_bindgen(catch)]
    pub fn choices(name: &str, value: &JsValue, options: &str) -> Result<Vec<u32>, JsValue>;

    /// An options object with only the comma-separated `allowed` keys, or `undefined`.
    #[wasm_bindgen(catch)]
    pub fn options(name: &str, value: &JsValue, allowed: &str) -> Result<JsValue, JsValue>;

    /// Property `key` of an options object.
    #[wasm_bindgen(catch)]
    pub fn get(object: &JsValue, key: &str) -> Result<JsValue, JsValue>;

    /// At most `max` rows of objects with the comma-separated `keys`, the first `required`
    /// of them required: the values row by row, then 1 or 0 for given or not.
    #[wasm_bindgen(catch)]
    pub fn rows(
        name: &str,
        value: &JsValue,
        keys: &str,
        required: u32,
        max: usize,
    ) -> Result<Vec<f64>, JsValue>;

    /// The sounding's JSON form: JSON text parsed, or the object itself.
    #[wasm_bindgen(catch)]
    pub fn json(name: &str, value: &JsValue) -> Result<JsValue, JsValue>;

    /// A sounding's `below` or `above`: the blend depth, or `None` for "error".
    #[wasm_bindgen(catch)]
    pub fn outside(name: &str, value: &JsValue) -> Result<Option<f64>, JsValue>;

    /// A barometric reference as [kind, pressure]: 0 standard, 1 QNH, 2 pad.
    #[wasm_bindgen(catch)]
    pub fn reference(value: &JsValue) -> Result<Vec<f64>, JsValue>;

    /// A drag coefficient (a number) or a checked drag-table object.
    #[wasm_bindgen(catch)]
    pub fn drag(name: &str, value: &JsValue) -> Result<JsValue, JsValue>;

    /// A JS string of at most 4096 characters, else a `TypeError` or `RangeError` naming
    /// `name`.
    #[wasm_bindgen(catch)]
    pub fn text(name: &str, value: &JsValue) -> Result<String, JsValue>;

    /// A JS string of at most 64 MiB of text (a file's content), else a `TypeError` or
    /// `RangeError` naming `name`.
    #[wasm_bindgen(catch, js_name = longText)]
    pub fn long_text(name: &str, value: &JsValue) -> Result<String, JsValue>;

    /// `value` with six significant digits as JS writes it (`263.706`).
    pub fn tidy(value: f64) -> String;

    /// `{si, value, unit, explicit}`: what `parseValue` returns.
    #[wasm_bindgen(catch, js_name = parsedValue)]
    pub fn parsed_value(si: f64, value: f64, unit: &str, explicit: bool) -> Result<JsValue, JsValue>;

    /// `{<keys>: Float64Array, ..., ignored: [headings]}` of a flight file's samples, the
    /// columns one after another in `values`; the ignored headings separated by U+001F.
    #[wasm_bindgen(catch, js_name = flightSamples)]
    pub fn flight_samples(
        keys: &str,
        values: &[f64],
        count: usize,
        ignored: &str,
    ) -> Result<JsValue, JsValue>;

    /// `{windEastMS, windNorthMS, windSpeedMS, windDirectionDeg, held}`.
    #[wasm_bindgen(js_name = windAt)]
    pub fn wind_at(east: f64, north: f64, speed: f64, direction: f64, held: bool) -> JsValue;

    /// Whether a first argument is an options object (not an array or typed array).
    #[wasm_bindgen(js_name = isOptions)]
    pub fn is_options(value: &JsValue) -> bool;

    /// Winds aloft as `[kind, n, altitudes, a, b]`: kind 0 for east and north components,
    /// 1 for speed and direction; a `TypeError` or `RangeError` naming `name` otherwise.
    #[wasm_bindgen(catch)]
    pub fn winds(name: &str, value: &JsValue) -> Result<Vec<f64>, JsValue>;

    /// Makes every method and getter of `instance`'s class throw an `Error` naming the
    /// class and the method when called on a freed object (`what` names it: "model"),
    /// a `TypeError` on an object of another class, and a second `free()` do nothing;
    /// then frees `instance`. For `AtmosphereModel` it also adds `batchInto`, whose
    /// outputs may be named by the comma-separated `state_keys`.
    #[wasm_bindgen(js_name = guardFreed)]
    pub fn guard_freed(instance: JsValue, class_name: &str, what: &str, state_keys: &str);

    /// A `Uint8Array` or an `ArrayBuffer`, copied; a `TypeError` naming `name` otherwise.
    #[wasm_bindgen(catch)]
    pub fn bytes(name: &str, value: &JsValue) -> Result<Vec<u8>, JsValue>;

    /// Hands glue.js the module's `WebAssembly.Memory`, for `batchInto`'s views into the
    /// buffer of batch.rs.
    #[wasm_bindgen(js_name = useMemory)]
    pub fn use_memory(memory: JsValue);

    /// `JSON.parse(text)` of text this module wrote.
    #[wasm_bindgen(catch, js_name = parseJson)]
    pub fn parse_json(text: &str) -> Result<JsValue, JsValue>;

    /// A short description of a JS value for messages.
    #[wasm_bindgen(js_name = describeValue)]
    pub fn describe(value: &JsValue) -> String;

    /// `{keys[i]: values[i]}` for the comma-separated `keys`, NaN read as `null`.
    pub fn record(keys: &str, values: &[f64]) -> JsValue;

    /// `{keys[i]: Float64Array of values[i * count .. (i + 1) * count]}`.
    #[wasm_bindgen(catch)]
    pub fn columns(keys: &str, values: &[f64], count: usize) -> Result<JsValue, JsValue>;

    /// The flight scan's result object (see `flight::summary_layout` and
    /// `loads::extras`).
    #[wasm_bindgen(catch, js_name = flightResult)]
    pub fn flight_result(
        points: &JsValue,
        defined: &[u8],
        summary: &[f64],
        extra: &[f64],
    ) -> Result<JsValue, JsValue>;
}
