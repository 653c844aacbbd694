//! Reading JS arguments. Every export takes its arguments as `JsValue` and reads them
//! through `glue.js` (module `js`), because wasm-bindgen's own `f64` parameters coerce
//! silently (`null` becomes 0, `"12"` becomes 12, `undefined` becomes NaN): a number must
//! be a JS number, an array a `Float64Array` or an array of numbers, an option one of its
//! names. NaN and infinities pass through to the core, which names them in its range
//! errors.

use alloc::string::String;
use alloc::vec::Vec;

use aerostrata::{Altitude, AltitudeKind};
use wasm_bindgen::JsValue;

use crate::error::{Failure, Js};
use crate::js;
use crate::text::Text;

/// The numbers of several arguments, each given with its JS name, read in order: the
/// first that is not a JS number is the `TypeError` of [`js::number`] naming it.
#[cfg(feature = "full")]
pub fn numbers<const N: usize>(named: [(&str, &JsValue); N]) -> Result<[f64; N], JsValue> {
    let mut out = [0.0; N];
    for (slot, (name, value)) in out.iter_mut().zip(named) {
        *slot = js::number(name, value)?;
    }
    Ok(out)
}

/// `len` zeros, or a `RangeError` when the module's memory cannot hold them (rather
/// than the trap an infallible allocation would be).
pub fn zeroed(len: usize) -> Result<Vec<f64>, Failure> {
    let mut out = Vec::new();
    if out.try_reserve_exact(len).is_err() {
        return Err(Failure::range(
            Text::new("the result needs ")
                .u(len)
                .s(" numbers, more than the module's memory can hold")
                .done(),
        ));
    }
    out.resize(len, 0.0);
    Ok(out)
}

/// Most elements any array argument or result may have (16 777 216), as glue.js's
/// MAX_ELEMENTS.
#[cfg(feature = "full")]
pub const MAX_ELEMENTS: usize = 1 << 24;

/// Most rows a table (a sounding) and most layers a layered model may have (262 144):
/// each row costs a few hundred bytes of the module's memory, and no sounding comes near.
#[cfg(feature = "full")]
pub const MAX_TABLE_ROWS: usize = 1 << 18;

/// A `RangeError` unless `count` rows of `name` are within [`MAX_TABLE_ROWS`].
#[cfg(feature = "full")]
pub fn table_rows(name: &str, count: usize) -> Result<(), JsValue> {
    if count <= MAX_TABLE_ROWS {
        return Ok(());
    }
    Err(Failure::range(
        Text::new(name).s(" has ").u(count).s(" rows; the allowed range is 0 to ").u(MAX_TABLE_ROWS).done(),
    )
    .into())
}

/// `name[index]`, for messages.
pub fn place(name: &str, index: usize) -> String {
    Text::new(name).s("[").u(index).s("]").done()
}

/// The altitude kinds in the order of [`KIND_NAMES`].
const KINDS: [AltitudeKind; 2] = [AltitudeKind::Geometric, AltitudeKind::Geopotential];
const KIND_NAMES: &str = "geometric,geopotential";

/// An altitude kind named `name`: `"geometric"` or `"geopotential"`; `"geometric"` for
/// `undefined` when `optional`.
pub fn altitude_kind(name: &str, value: &JsValue, optional: bool) -> Result<AltitudeKind, JsValue> {
    let index = js::choice(name, value, KIND_NAMES, if optional { 0 } else { -1 })?;
    Ok(KINDS[index as usize & 1])
}

/// An altitude of `kind` metres (`altitudeKind`, geometric when omitted).
pub fn altitude(name: &str, meters: &JsValue, kind: &JsValue) -> Result<Altitude, JsValue> {
    let kind = altitude_kind("altitudeKind", kind, true)?;
    kind.altitude(js::number(name, meters)?).js()
}

/// One of `options` (comma-separated names, in the order of `values`).
pub fn choice<T: Copy>(
    name: &str,
    value: &JsValue,
    options: &str,
    values: &[T],
    fallback: Option<usize>,
) -> Result<T, JsValue> {
    let fallback = fallback.map_or(-1, |i| i as i32);
    let index = js::choice(name, value, options, fallback)? as usize;
    values
        .get(index)
        .copied()
        .ok_or_else(|| Failure::plain(Text::new(name).s(": no such option").done()).into())
}

/// Optional numbers as [`js::optional_numbers`] gives them: `None` where not given.
#[cfg(feature = "full")]
pub fn optional_numbers(name: &str, value: &JsValue) -> Result<Vec<Option<f64>>, JsValue> {
    let flat = js::optional_numbers(name, value)?;
    let (values, given) = flat.split_at(flat.len() / 2);
    Ok(values.iter().zip(given).map(|(&v, &g)| (g == 1.0).then_some(v)).collect())
}
