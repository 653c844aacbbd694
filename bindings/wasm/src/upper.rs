//! The upper atmosphere (86 to 1000 km) as a separately loaded part: the module carries
//! its code, and its tables (about 17 KiB, most of what it weighs) come from
//! `aerostrata_upper.bin` beside the module, which the package's `loadUpper` reads once
//! (js/parts.js) and hands to each loaded module's `__loadUpper`, thence the core's
//! `load_tables`. Same code, same table bytes: the same bits as the
//! native core. Until it is loaded, every call that needs the tables throws an `Error`
//! that says to call `await loadUpper()` (error.rs).

use aerostrata::model::upper::{load_tables, tables_loaded};
use wasm_bindgen::prelude::*;

use crate::error::Js;
use crate::js;
use crate::model::AtmosphereModel;

/// Whether the upper atmosphere's tables (86 to 1000 km) are loaded (`loadUpper`).
#[wasm_bindgen(js_name = upperLoaded)]
pub fn upper_loaded() -> bool {
    tables_loaded()
}

#[wasm_bindgen(js_class = AtmosphereModel)]
impl AtmosphereModel {
    /// The tables' file, as bytes, into the core (the package's `loadUpper` calls it, in
    /// js/parts.js; hidden from the types).
    #[wasm_bindgen(js_name = __loadUpper, skip_typescript)]
    pub fn load_upper_bytes(bytes: JsValue) -> Result<(), JsValue> {
        let bytes = js::bytes("loadUpper's source", &bytes)?;
        load_tables(&bytes).js()
    }
}
