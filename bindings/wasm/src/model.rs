//! Atmosphere models behind one JS class, the full state as a plain object, and the batch
//! evaluation over a `Float64Array` of altitudes.

use alloc::string::String;
use alloc::vec::Vec;

use aerostrata::inverse::{altitude_of, Property};
use aerostrata::model::upper::Species;
use aerostrata::{
    AltitudeKind, AltitudeRange, Atmosphere, Exponential, Isothermal, LayerSpec, Layered, OutsideTable,
    SoundingRow, State, Tabulated, US1976,
};
use wasm_bindgen::prelude::*;

use aerostrata::quantity::Group;
use aerostrata::Quantity;

use crate::aero::DragSpec;
use crate::args::{self, altitude};
use crate::error::{Failure, Js};
use crate::js;
use crate::quantity;
use crate::text::Text;

/// The models a handle can hold: any of the core's, owned.
pub(crate) type Model = aerostrata::AnyModel;

/// The standard with a temperature offset; the standard itself for 0.
pub(crate) fn standard(offset_k: f64) -> Result<Model, Failure> {
    Ok(Model::standard(offset_k)?)
}

/// The state as a plain object: every quantity of the catalogue's state group by its JS
/// key, `null` where the model does not define it (the continuum properties above 86 km).
pub(crate) fn state_object(state: &State) -> JsValue {
    let values: Vec<f64> =
        Quantity::of_group(Group::State).map(|q| state.get(q).unwrap_or(f64::NAN)).collect();
    js::record(&quantity::keys(Quantity::of_group(Group::State)), &values)
}

fn range_object(range: &AltitudeRange) -> JsValue {
    js::record(
        "geometricMinM,geometricMaxM,geopotentialMinM,geopotentialMaxM",
        &[range.geometric_min_m, range.geometric_max_m, range.geopotential_min_m, range.geopotential_max_m],
    )
}

fn species_object(n: &Species) -> JsValue {
    // The catalogue's species group is the standard's order N2, O, O2, Ar, He, H, the
    // order of `Species::as_array` (a test checks it).
    js::record(&quantity::keys(Quantity::of_group(Group::Species)), &n.as_array())
}

/// An atmosphere model: the 1976 standard with a temperature offset, an exponential or
/// isothermal profile, user lapse-rate layers, or a table (a sounding). Made by one of
/// the static methods; call `free()` when done with it (or let the garbage collector's
/// finaliser release it).
#[wasm_bindgen]
pub struct AtmosphereModel {
    pub(crate) model: Model,
    kind: &'static str,
    /// `batchInto`'s chunk buffer in the module's memory, kept between calls.
    pub(crate) scratch: crate::batch::Scratch,
}

impl AtmosphereModel {
    fn new(model: Model, kind: &'static str) -> Self {
        Self { model, kind, scratch: crate::batch::Scratch::default() }
    }

    /// A handle for `model`, its kind read from the model itself.
    pub(crate) fn from_model(model: Model) -> Self {
        let kind = match &model {
            Model::Exponential(_) => "exponential",
            Model::Isothermal(_) => "isothermal",
            Model::Layers(_) => "layered",
            Model::Sounding(_) => "tabulated",
            Model::HydrostaticOffset(_) => "hydrostaticOffset",
            _ => "standard",
        };
        Self::new(model, kind)
    }
}

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

#[wasm_bindgen]
impl AtmosphereModel {
    /// The U.S. Standard Atmosphere 1976, -5 km to 1000 km geometric, with every
    /// temperature shifted by `offsetK` kelvin at the standard's pressure (0, the default,
    /// for the standard itself; +15 for ISA+15). Above 86 km the continuum properties
    /// (speed of sound, viscosities, conductivity) are not defined.
    ///
    /// Throws a `RangeError` for an offset that is not a finite number.
    #[wasm_bindgen(js_name = standard)]
    pub fn standard(
        #[wasm_bindgen(js_name = offsetK, unchecked_optional_param_type = "number")] offset_k: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let offset_k = js::number_or("offsetK", &offset_k, 0.0)?;
        Ok(Self::new(standard(offset_k)?, "standard"))
    }

    /// The 1976 standard with every temperature shifted by `offsetK` kelvin at every
    /// geopotential altitude and the pressure in hydrostatic balance from
    /// `seaLevelPressurePa` (Pa, default 101 325) at altitude 0: the balanced hot or cold
    /// day a trajectory against geometric altitude needs (`standard(offsetK)` keeps the
    /// standard's pressure instead). Defined from -5 km to 86 km geometric.
    ///
    /// Throws a `RangeError` for an offset outside -100 to 100 K or a pressure outside
    /// 10 000 to 200 000 Pa.
    #[wasm_bindgen(js_name = hydrostaticOffset)]
    pub fn hydrostatic_offset(
        #[wasm_bindgen(js_name = offsetK, unchecked_param_type = "number")] offset_k: JsValue,
        #[wasm_bindgen(js_name = seaLevelPressurePa, unchecked_optional_param_type = "number")]
        pressure: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let model = aerostrata::HydrostaticOffset::new(
            js::number("offsetK", &offset_k)?,
            js::number_or("seaLevelPressurePa", &pressure, aerostrata::constants::SEA_LEVEL_PRESSURE_PA)?,
        )
        .js()?;
        Ok(Self::new(Model::HydrostaticOffset(model), "hydrostaticOffset"))
    }

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

    /// Which kind of model this is: `"standard"`, `"exponential"`, `"isothermal"`,
    /// `"layered"` or `"tabulated"`.
    #[wasm_bindgen(getter, js_name = kind, unchecked_return_type = "ModelKind")]
    pub fn kind(&self) -> String {
        String::from(self.kind)
    }

    /// The altitudes the model accepts, geometric and geopotential metres.
    #[wasm_bindgen(js_name = range, unchecked_return_type = "AltitudeRange")]
    pub fn range(&self) -> JsValue {
        range_object(&self.model.range())
    }

    /// The full state at `altitudeM` metres of `altitudeKind` (`"geometric"`, the
    /// default, or `"geopotential"`): every property the 1976 standard tabulates, in SI
    /// units named in each field; the continuum properties are `null` where the model
    /// does not define them (above 86 km).
    ///
    /// Throws a `RangeError` naming the model's range for an altitude outside it.
    #[wasm_bindgen(js_name = state, unchecked_return_type = "AtmosphereState")]
    pub fn state(
        &self,
        #[wasm_bindgen(js_name = altitudeM, unchecked_param_type = "number")] altitude_m: JsValue,
        #[wasm_bindgen(js_name = altitudeKind, unchecked_optional_param_type = "AltitudeKind")] kind: JsValue,
    ) -> Result<JsValue, JsValue> {
        let state = self.model.state(altitude("altitudeM", &altitude_m, &kind)?).js()?;
        Ok(state_object(&state))
    }

    /// The geometric altitude (m) where `property` (`"pressure"` in Pa, `"density"` in
    /// kg/m^3 or `"numberDensity"` in 1/m^3) of this model equals `value`, searched over
    /// the model's whole range.
    ///
    /// Throws a `RangeError` naming the values at the ends of the range when `value` lies
    /// outside them.
    #[wasm_bindgen(js_name = altitudeOf)]
    pub fn altitude_of(
        &self,
        #[wasm_bindgen(js_name = property, unchecked_param_type = "\"pressure\" | \"density\" | \"numberDensity\"")]
        property: JsValue,
        #[wasm_bindgen(js_name = value, unchecked_param_type = "number")] value: JsValue,
    ) -> Result<f64, JsValue> {
        let property = args::choice(
            "property",
            &property,
            "pressure,density,numberDensity",
            &[Property::Pressure, Property::Density, Property::NumberDensity],
            None,
        )?;
        let value = js::number("value", &value)?;
        Ok(altitude_of(&self.model, property, value).js()?.meters())
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

/// The full state of the 1976 standard with temperature offset `offsetK` (K, default 0)
/// at `altitudeM` metres of `altitudeKind`, without making a model.
///
/// Throws a `RangeError` outside -5 km to 1000 km geometric or for an offset that is not
/// finite.
#[wasm_bindgen(js_name = standardState, unchecked_return_type = "AtmosphereState")]
pub fn standard_state(
    #[wasm_bindgen(js_name = altitudeM, unchecked_param_type = "number")] altitude_m: JsValue,
    #[wasm_bindgen(js_name = altitudeKind, unchecked_optional_param_type = "AltitudeKind")] kind: JsValue,
    #[wasm_bindgen(js_name = offsetK, unchecked_optional_param_type = "number")] offset_k: JsValue,
) -> Result<JsValue, JsValue> {
    let altitude = altitude("altitudeM", &altitude_m, &kind)?;
    let model = standard(js::number_or("offsetK", &offset_k, 0.0)?)?;
    Ok(state_object(&model.state(altitude).js()?))
}

/// The number densities (1/m^3) of the six species of the 1976 standard above 86 km:
/// N2, O, O2, Ar, He and H (below 150 km, where the standard lists none, H continues its
/// equation), at `altitudeM` metres of `altitudeKind`, from 86 km to 1000 km geometric.
///
/// Throws a `RangeError` outside 86 km to 1000 km geometric.
#[wasm_bindgen(js_name = standardSpecies, unchecked_return_type = "SpeciesNumberDensities")]
pub fn standard_species(
    #[wasm_bindgen(js_name = altitudeM, unchecked_param_type = "number")] altitude_m: JsValue,
    #[wasm_bindgen(js_name = altitudeKind, unchecked_optional_param_type = "AltitudeKind")] kind: JsValue,
) -> Result<JsValue, JsValue> {
    let altitude = altitude("altitudeM", &altitude_m, &kind)?;
    Ok(species_object(&US1976.species(altitude).js()?))
}

#[cfg(test)]
mod tests {
    extern crate std;
    use std::vec::Vec;

    use super::*;

    /// The state object and the species object carry every quantity of their catalogue
    /// groups, in the order of the core's fields.
    #[test]
    fn species_follow_the_catalogue_order() {
        let names: Vec<&str> = Quantity::of_group(Group::Species).map(|q| q.name()).collect();
        assert_eq!(names, ["n_N2", "n_O", "n_O2", "n_Ar", "n_He", "n_H"], "the order of Species::as_array");
    }

    #[test]
    fn an_offset_of_zero_is_the_standard_itself() {
        assert!(matches!(standard(0.0).unwrap(), Model::Us1976));
        assert!(matches!(standard(-0.0).unwrap(), Model::Us1976));
        assert!(matches!(standard(15.0).unwrap(), Model::Standard(_)));
        assert_eq!(standard(f64::NAN).unwrap_err().class, crate::error::Class::Range);
    }
}
