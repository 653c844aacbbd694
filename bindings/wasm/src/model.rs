//! Atmosphere models behind one JS class, the full state as a plain object, and the batch
//! evaluation over a `Float64Array` of altitudes.

use alloc::string::String;
use alloc::vec::Vec;

use aerostrata::inverse::{altitude_of, Property};
use aerostrata::model::upper::Species;
use aerostrata::{AltitudeRange, Atmosphere, State, US1976};
use wasm_bindgen::prelude::*;

use aerostrata::quantity::Group;
use aerostrata::Quantity;

use crate::args::{self, altitude};
use crate::error::{Failure, Js};
use crate::js;
use crate::quantity;

/// The models a handle can hold: any of the core's, owned.
#[cfg(feature = "full")]
pub(crate) type Model = aerostrata::AnyModel;

/// The models the lite module's handles can hold: the standard, with an offset or in
/// hydrostatic balance. Not the core's `AnyModel`, whose every method reaches the user
/// models, tables and their messages (1.5 KiB gzipped the lite module never uses).
/// The variants are `AnyModel`'s own, so the rest of the door reads either alike.
#[cfg(not(feature = "full"))]
#[derive(Debug)]
// One per handle, as `AnyModel`'s are: a box would save nothing worth an allocation.
#[allow(clippy::large_enum_variant)]
pub(crate) enum Model {
    /// The 1976 standard itself.
    Us1976,
    /// The 1976 standard with a temperature offset.
    Standard(aerostrata::TemperatureOffset<aerostrata::model::Us1976>),
    /// The 1976 standard with a temperature offset, in hydrostatic balance.
    HydrostaticOffset(aerostrata::HydrostaticOffset),
}

#[cfg(not(feature = "full"))]
impl Model {
    /// As `AnyModel::standard`: the standard itself for an offset of exactly 0.
    fn standard(offset_k: f64) -> aerostrata::Result<Self> {
        let offset = aerostrata::TemperatureOffset::new(US1976, offset_k)?;
        Ok(if offset_k == 0.0 { Self::Us1976 } else { Self::Standard(offset) })
    }
}

#[cfg(not(feature = "full"))]
impl Atmosphere for Model {
    fn range(&self) -> AltitudeRange {
        match self {
            Self::Us1976 => US1976.range(),
            Self::Standard(m) => m.range(),
            Self::HydrostaticOffset(m) => m.range(),
        }
    }

    fn air(&self, altitude: aerostrata::Altitude) -> aerostrata::Result<aerostrata::Air> {
        match self {
            Self::Us1976 => US1976.air(altitude),
            Self::Standard(m) => m.air(altitude),
            Self::HydrostaticOffset(m) => m.air(altitude),
        }
    }
}

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
    pub(crate) fn new(model: Model, kind: &'static str) -> Self {
        Self { model, kind, scratch: crate::batch::Scratch::default() }
    }

    /// A handle for `model`, its kind read from the model itself.
    pub(crate) fn from_model(model: Model) -> Self {
        let kind = match &model {
            #[cfg(feature = "full")]
            Model::Exponential(_) => "exponential",
            #[cfg(feature = "full")]
            Model::Isothermal(_) => "isothermal",
            #[cfg(feature = "full")]
            Model::Layers(_) => "layered",
            #[cfg(feature = "full")]
            Model::Sounding(_) => "tabulated",
            Model::HydrostaticOffset(_) => "hydrostaticOffset",
            _ => "standard",
        };
        Self::new(model, kind)
    }
}

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
