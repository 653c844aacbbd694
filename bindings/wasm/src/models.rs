//! The full module's other models (the `full` feature): exponential, isothermal, user
//! layers and tables, and the terminal velocity with its drag tables. The lite module's
//! `AtmosphereModel` has the standard alone (model.rs).

use alloc::vec::Vec;

use aerostrata::{
    AltitudeKind, Atmosphere, Exponential, Isothermal, LayerSpec, Layered, OutsideTable, SoundingRow,
    Tabulated,
};
use wasm_bindgen::prelude::*;

use crate::args::{self, altitude};
use crate::error::{Failure, Js};
use crate::flow::DragSpec;
use crate::js;
use crate::model::{AtmosphereModel, Model};
use crate::text::Text;

/// What a table does beyond its edge: an error, or a blend into the standard over
/// `depth_m` geopotential metres.
fn outside(depth_m: Option<f64>) -> OutsideTable {
    depth_m.map_or(OutsideTable::Error, |depth_m| OutsideTable::BlendIntoUs1976 { depth_m })
}

fn table(
    kind: AltitudeKind,
    rows: &[SoundingRow],
    below: OutsideTable,
    above: OutsideTable,
) -> Result<AtmosphereModel, Failure> {
    let table = Tabulated::from_rows_vec(kind, rows)?.with_below(below)?.with_above(above)?;
    Ok(AtmosphereModel::new(Model::Sounding(table), "tabulated"))
}

/// The fields of a row of the sounding's JSON form (the core's `SoundingRow` names); the
/// first two are required.
const ROW_KEYS: &str =
    "altitude_m,temperature_k,pressure_pa,density_kg_m3,dew_point_k,relative_humidity_percent";

/// The optional columns of `tabulated`, in the order of the `SoundingRow` setters below.
const TABLE_COLUMNS: [&str; 4] = ["pressurePa", "densityKgM3", "dewPointK", "relativeHumidityPercent"];

/// The full part's models and loads (the `full` feature): every other model, and the
/// terminal velocity with its drag tables.
#[wasm_bindgen]
impl AtmosphereModel {
    /// An exponential atmosphere: density `seaLevelDensityKgM3` (kg/m^3) at 0 m falling by
    /// e every `scaleHeightM` metres, at the constant temperature `temperatureK` (K).
    /// Defined from -5 km to 1000 km geometric.
    ///
    /// Throws a `RangeError` for a parameter that is not finite and above 0.
    #[wasm_bindgen(js_name = exponential)]
    pub fn exponential(
        #[wasm_bindgen(js_name = seaLevelDensityKgM3, unchecked_param_type = "number")] density: JsValue,
        #[wasm_bindgen(js_name = scaleHeightM, unchecked_param_type = "number")] scale_height: JsValue,
        #[wasm_bindgen(js_name = temperatureK, unchecked_param_type = "number")] temperature: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let [density, scale_height, temperature] = args::numbers([
            ("seaLevelDensityKgM3", &density),
            ("scaleHeightM", &scale_height),
            ("temperatureK", &temperature),
        ])?;
        let model = Exponential::new(density, scale_height, temperature).js()?;
        Ok(Self::new(Model::Exponential(model), "exponential"))
    }

    /// An isothermal atmosphere at `temperatureK` (K) with pressure `seaLevelPressurePa`
    /// (Pa) at geopotential altitude 0. Defined from -5 km to 1000 km geometric.
    ///
    /// Throws a `RangeError` for a parameter that is not finite and above 0.
    #[wasm_bindgen(js_name = isothermal)]
    pub fn isothermal(
        #[wasm_bindgen(js_name = temperatureK, unchecked_param_type = "number")] temperature: JsValue,
        #[wasm_bindgen(js_name = seaLevelPressurePa, unchecked_param_type = "number")] pressure: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let [temperature, pressure] =
            args::numbers([("temperatureK", &temperature), ("seaLevelPressurePa", &pressure)])?;
        Ok(Self::new(Model::Isothermal(Isothermal::new(temperature, pressure).js()?), "isothermal"))
    }

    /// User layers of constant lapse rate, stacked from a base at geopotential altitude
    /// `baseGeopotentialM` (m) with temperature `baseTemperatureK` (K) and pressure
    /// `basePressurePa` (Pa). Layer i ends at `topsGeopotentialM[i]` (geopotential m)
    /// and has lapse rate `lapseRatesKPerM[i]` (dT/dH, K per geopotential metre; negative
    /// when the temperature falls with height). The model runs from the base to the last
    /// top.
    ///
    /// Throws a `TypeError` for arrays that are not arrays of numbers, an `Error` naming
    /// the layer for arrays of different lengths, no layers, a top not above its base, a
    /// temperature reaching 0 K or a pressure underflowing.
    #[wasm_bindgen(js_name = layered)]
    pub fn layered(
        #[wasm_bindgen(js_name = baseGeopotentialM, unchecked_param_type = "number")] base: JsValue,
        #[wasm_bindgen(js_name = baseTemperatureK, unchecked_param_type = "number")] temperature: JsValue,
        #[wasm_bindgen(js_name = basePressurePa, unchecked_param_type = "number")] pressure: JsValue,
        #[wasm_bindgen(js_name = topsGeopotentialM, unchecked_param_type = "Float64Array | number[]")]
        tops: JsValue,
        #[wasm_bindgen(js_name = lapseRatesKPerM, unchecked_param_type = "Float64Array | number[]")]
        lapse_rates: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let [base, temperature, pressure] = args::numbers([
            ("baseGeopotentialM", &base),
            ("baseTemperatureK", &temperature),
            ("basePressurePa", &pressure),
        ])?;
        let tops = js::numbers("topsGeopotentialM", &tops)?;
        let lapse_rates = js::numbers("lapseRatesKPerM", &lapse_rates)?;
        args::table_rows("topsGeopotentialM", tops.len())?;
        if tops.len() != lapse_rates.len() {
            return Err(Failure::plain(
                Text::new("topsGeopotentialM has ")
                    .u(tops.len())
                    .s(" elements and lapseRatesKPerM ")
                    .u(lapse_rates.len())
                    .s("; they must have the same length")
                    .done(),
            )
            .into());
        }
        let specs: Vec<LayerSpec> = tops
            .iter()
            .zip(&lapse_rates)
            .map(|(&top_geopotential_m, &lapse_rate_k_m)| LayerSpec { top_geopotential_m, lapse_rate_k_m })
            .collect();
        let model = Layered::from_lapse_rates_vec(base, temperature, pressure, &specs).js()?;
        Ok(Self::new(Model::Layers(model), "layered"))
    }

    /// A table of rows (a sounding, or a site's design day), interpolated
    /// hydrostatically. `altitudeKind` says what `altitudesM` are (`"geometric"` or
    /// `"geopotential"` metres); `temperaturesK` are the rows' kinetic temperatures (K).
    /// `columns` gives the rest, each an array with one entry per row, `null` where a row
    /// does not give the value: `pressurePa` (Pa) or `densityKgM3` (kg/m^3) on every row,
    /// or a pressure on the first row only (the rest then follows from hydrostatic
    /// balance); optionally `dewPointK` (K) or `relativeHumidityPercent` (%, over water);
    /// and `blendBelowM` / `blendAboveM`: beyond the first / last row, blend into the 1976
    /// standard over that many geopotential metres (without them, altitudes beyond the
    /// rows are a `RangeError`).
    ///
    /// Throws a `TypeError` for arguments of the wrong type or an unknown column, and the
    /// core's errors naming the row (counted from 0) for a bad row.
    #[wasm_bindgen(js_name = tabulated)]
    pub fn tabulated(
        #[wasm_bindgen(js_name = altitudeKind, unchecked_param_type = "AltitudeKind")] kind: JsValue,
        #[wasm_bindgen(js_name = altitudesM, unchecked_param_type = "Float64Array | number[]")]
        altitudes: JsValue,
        #[wasm_bindgen(js_name = temperaturesK, unchecked_param_type = "Float64Array | number[]")]
        temperatures: JsValue,
        #[wasm_bindgen(js_name = columns, unchecked_optional_param_type = "TableColumns")] columns: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let kind = args::altitude_kind("altitudeKind", &kind, false)?;
        let altitudes = js::numbers("altitudesM", &altitudes)?;
        let temperatures = js::numbers("temperaturesK", &temperatures)?;
        let columns = js::options(
            "columns",
            &columns,
            "pressurePa,densityKgM3,dewPointK,relativeHumidityPercent,blendBelowM,blendAboveM",
        )?;
        let count = altitudes.len();
        args::table_rows("altitudesM", count)?;
        let length_error = |name: &str, len: usize| -> JsValue {
            Failure::plain(
                Text::new(name)
                    .s(" has ")
                    .u(len)
                    .s(" elements and altitudesM ")
                    .u(count)
                    .s("; they must have the same length")
                    .done(),
            )
            .into()
        };
        if temperatures.len() != count {
            return Err(length_error("temperaturesK", temperatures.len()));
        }
        let mut rows: Vec<SoundingRow> =
            altitudes.iter().zip(&temperatures).map(|(&z, &t)| SoundingRow::new(z, t)).collect();
        for (c, key) in TABLE_COLUMNS.iter().enumerate() {
            let value = js::get(&columns, key)?;
            if value.is_undefined() {
                continue;
            }
            let name = Text::new("columns.").s(key).done();
            let values = args::optional_numbers(&name, &value)?;
            if values.len() != count {
                return Err(length_error(&name, values.len()));
            }
            for (row, v) in rows.iter_mut().zip(values) {
                match c {
                    0 => row.pressure_pa = v,
                    1 => row.density_kg_m3 = v,
                    2 => row.dew_point_k = v,
                    _ => row.relative_humidity_percent = v,
                }
            }
        }
        let below = outside(js::optional_number("columns.blendBelowM", &js::get(&columns, "blendBelowM")?)?);
        let above = outside(js::optional_number("columns.blendAboveM", &js::get(&columns, "blendAboveM")?)?);
        table(kind, &rows, below, above).js()
    }

    /// A table from its JSON form, the one the command-line tool reads
    /// (docs/soundings.md): `{"altitude": "geometric", "rows": [{"altitude_m": 4,
    /// "temperature_k": 306.55, "pressure_pa": 100860, "dew_point_k": 299.25}, ...],
    /// "below": "error", "above": {"blend_into_us1976": {"depth_m": 5000}}}`, as a JSON
    /// string or as the object `JSON.parse` gives. SI units; `null` or an absent field
    /// is "not given"; unknown fields are errors.
    ///
    /// Throws an `Error` for text that is not JSON, a `TypeError` for an object of the
    /// wrong shape (naming the row and field), and the core's errors naming the row for
    /// a bad row.
    #[wasm_bindgen(js_name = fromSoundingJson)]
    pub fn from_sounding_json(
        #[wasm_bindgen(js_name = json, unchecked_param_type = "string | SoundingJson")] json: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let object = js::json("sounding", &json)?;
        let kind = args::altitude_kind("sounding.altitude", &js::get(&object, "altitude")?, false)?;
        let flat = js::rows("sounding.rows", &js::get(&object, "rows")?, ROW_KEYS, 2, args::MAX_TABLE_ROWS)?;
        // Six values per row, then six given-flags per row.
        let (values, given) = flat.split_at(flat.len() / 2);
        let field = |row: &[f64], flags: &[f64], j: usize| (flags.get(j) == Some(&1.0)).then(|| row[j]);
        let rows: Vec<SoundingRow> = values
            .chunks_exact(6)
            .zip(given.chunks_exact(6))
            .map(|(v, g)| SoundingRow {
                altitude_m: v[0],
                temperature_k: v[1],
                pressure_pa: field(v, g, 2),
                density_kg_m3: field(v, g, 3),
                dew_point_k: field(v, g, 4),
                relative_humidity_percent: field(v, g, 5),
            })
            .collect();
        let below = outside(js::outside("sounding.below", &js::get(&object, "below")?)?);
        let above = outside(js::outside("sounding.above", &js::get(&object, "above")?)?);
        table(kind, &rows, below, above).js()
    }

    /// Terminal velocity (m/s) of a body of mass `massKg` (kg) and reference area
    /// `referenceAreaM2` (m^2) with drag coefficient `drag` (a number, or a table of
    /// Mach and Cd) at `altitudeM` metres of `altitudeKind`, where drag equals weight.
    ///
    /// Throws a `RangeError` for a mass, area or altitude out of range, an `Error` for a
    /// Mach-dependent drag where the model defines no speed of sound.
    #[wasm_bindgen(js_name = terminalVelocityMS)]
    pub fn terminal_velocity_m_s(
        &self,
        #[wasm_bindgen(js_name = altitudeM, unchecked_param_type = "number")] altitude_m: JsValue,
        #[wasm_bindgen(js_name = massKg, unchecked_param_type = "number")] mass: JsValue,
        #[wasm_bindgen(js_name = referenceAreaM2, unchecked_param_type = "number")] area: JsValue,
        #[wasm_bindgen(js_name = drag, unchecked_param_type = "DragSpec")] drag: JsValue,
        #[wasm_bindgen(js_name = altitudeKind, unchecked_optional_param_type = "AltitudeKind")] kind: JsValue,
    ) -> Result<f64, JsValue> {
        let altitude = altitude("altitudeM", &altitude_m, &kind)?;
        let [mass, area] = args::numbers([("massKg", &mass), ("referenceAreaM2", &area)])?;
        let drag = DragSpec::read("drag", &drag)?;
        let state = self.model.state(altitude).js()?;
        let curve = drag.curve().js()?;
        aerostrata::aero::terminal_velocity_m_s(&state, mass, area, &curve).js()
    }
}
