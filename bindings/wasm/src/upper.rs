//! The upper atmosphere (86 to 1000 km) as a separately loaded part: the module carries
//! its code, and its tables (about 17 KiB, most of what it weighs) come from
//! `aerostrata_upper.bin` beside the module, which `loadUpper` reads once (upper.js) and
//! hands to the core's `load_tables`. Same code, same table bytes: the same bits as the
//! native core. Until it is loaded, every call that needs the tables throws an `Error`
//! that says to call `await loadUpper()` (error.rs).

use aerostrata::model::upper::{load_tables, tables_loaded};
use wasm_bindgen::prelude::*;

use crate::error::Js;
use crate::js;
use crate::model::AtmosphereModel;

#[wasm_bindgen(module = "/src/upper.js")]
extern "C" {
    /// Hands upper.js an object of the class whose static `__loadUpper` takes the tables.
    #[wasm_bindgen(js_name = useUpperLoader)]
    pub(crate) fn use_upper_loader(instance: &JsValue);

    /// A promise of the tables loaded from `source` (or the file beside the module);
    /// resolved at once when `loaded`.
    #[wasm_bindgen(js_name = loadUpper)]
    fn load_upper_from(source: &JsValue, loaded: bool) -> JsValue;
}

/// Whether the upper atmosphere's tables (86 to 1000 km) are loaded (`loadUpper`).
#[wasm_bindgen(js_name = upperLoaded)]
pub fn upper_loaded() -> bool {
    tables_loaded()
}

/// `loadUpper(source?)`: a promise of the tables loaded (upper.js fetches or reads the file;
/// the `.d.ts` declares it, see lib.rs).
#[wasm_bindgen(js_name = loadUpper, skip_typescript)]
pub fn load_upper(source: JsValue) -> JsValue {
    load_upper_from(&source, tables_loaded())
}

#[wasm_bindgen(js_class = AtmosphereModel)]
impl AtmosphereModel {
    /// The tables' file, as bytes, into the core (upper.js's `loadUpper` calls it; a static
    /// of the class because upper.js reaches the module's exports only through objects it
    /// is handed).
    #[wasm_bindgen(js_name = __loadUpper, skip_typescript)]
    pub fn load_upper_bytes(bytes: JsValue) -> Result<(), JsValue> {
        let bytes = js::bytes("loadUpper's source", &bytes)?;
        load_tables(&bytes).js()
    }
}
