//! The quantity catalogue in JS: every quantity's names and units (`quantities`), the US
//! conversions (`toUs`, `fromUs`), and the comma-separated key lists the result objects
//! are built with. Nothing here lists quantities: they come from the core's catalogue.

use alloc::string::{String, ToString};

use aerostrata::quantity::{Group, Rounding};
use aerostrata::Quantity;
use wasm_bindgen::prelude::*;

use crate::error::Failure;
use crate::js;
use crate::naming::js_key;
use crate::text::{push_count, Text};

/// The JS key of `q` (`speedOfSoundMS`).
pub(crate) fn key(q: Quantity) -> String {
    js_key(q.name(), q.si().suffix())
}

/// The JS keys of `quantities`, comma-separated, as `js::record` and `js::columns` take
/// them.
pub(crate) fn keys(quantities: impl IntoIterator<Item = Quantity>) -> String {
    let mut out = String::new();
    for (i, q) in quantities.into_iter().enumerate() {
        if i > 0 {
            out.push(',');
        }
        out.push_str(&key(q));
    }
    out
}

/// The quantity a JS argument names: its machine name (`"temperature"`) or its JS key
/// (`"temperatureK"`); a `RangeError` naming the argument otherwise.
pub(crate) fn named(argument: &str, value: &JsValue) -> Result<Quantity, JsValue> {
    let text = js::text(argument, value)?;
    Quantity::ALL.iter().copied().find(|q| q.name() == text || key(*q) == text).ok_or_else(|| {
        Failure::range(
            Text::new(argument)
                .s(": no quantity is named ")
                .s(&aerostrata::units::Quoted(&text).to_string())
                .s(" (quantities() lists them)")
                .done(),
        )
        .into()
    })
}

fn group_name(group: Group) -> &'static str {
    match group {
        Group::State => "state",
        Group::Species => "species",
        Group::Flight => "flight",
        Group::Airspeed => "airspeed",
        Group::Altimetry => "altimetry",
        Group::Wind => "wind",
        _ => "parameter",
    }
}

/// `text` as a JSON string literal.
fn json_string(out: &mut String, text: &str) {
    out.push('"');
    for c in text.chars() {
        match c {
            '"' => out.push_str("\\\""),
            '\\' => out.push_str("\\\\"),
            c if (c as u32) < 0x20 => out.push(' '),
            c => out.push(c),
        }
    }
    out.push('"');
}

/// Every quantity of the catalogue, in id order: `{id, name, key, symbol, label,
/// description, siUnit, usUnit, siColumn, usColumn, group, mayBeUndefined, decimals,
/// primary}`. `name` is the machine name every door shares (`speed_of_sound`), `key` the
/// property name of this module's result objects (`speedOfSoundMS`), `siColumn` and
/// `usColumn` the CSV columns the command-line tool writes, `decimals` the decimals for
/// people (`null`: six significant digits). A page builds its tables and selectors from
/// this list.
#[wasm_bindgen(js_name = quantities, unchecked_return_type = "QuantityInfo[]")]
pub fn quantities() -> Result<JsValue, JsValue> {
    let mut out = String::from("[");
    for (i, q) in Quantity::ALL.iter().copied().enumerate() {
        let info = q.info();
        let column = |suffix: &str| {
            if suffix.is_empty() {
                String::from(info.name)
            } else {
                Text::new(info.name).s("_").s(suffix).done()
            }
        };
        if i > 0 {
            out.push(',');
        }
        out.push_str("{\"id\":");
        push_count(&mut out, info.id as usize);
        for (field, value) in [
            ("name", String::from(info.name)),
            ("key", key(q)),
            ("symbol", String::from(info.symbol)),
            ("label", String::from(info.label)),
            ("description", String::from(info.description)),
            ("siUnit", String::from(info.si.symbol())),
            ("usUnit", String::from(info.us.symbol())),
            ("siColumn", column(info.si.suffix())),
            ("usColumn", column(info.us.suffix())),
            ("group", String::from(group_name(info.group))),
        ] {
            out.push_str(",\"");
            out.push_str(field);
            out.push_str("\":");
            json_string(&mut out, &value);
        }
        out.push_str(",\"mayBeUndefined\":");
        out.push_str(if info.may_be_undefined { "true" } else { "false" });
        out.push_str(",\"decimals\":");
        match info.rounding {
            Rounding::Decimals(d) => push_count(&mut out, usize::from(d)),
            _ => out.push_str("null"),
        }
        out.push_str(",\"primary\":");
        out.push_str(if info.primary { "true" } else { "false" });
        out.push('}');
    }
    out.push(']');
    js::parse_json(&out)
}

/// `valueSi`, a value of quantity `quantity` (its machine name or JS key) in its SI unit,
/// in the quantity's US customary unit (`usUnit` of `quantities()`).
///
/// Throws a `TypeError` for a value that is not a number, a `RangeError` for an unknown
/// quantity or a value that is not finite.
#[wasm_bindgen(js_name = toUs)]
pub fn to_us(
    #[wasm_bindgen(js_name = quantity, unchecked_param_type = "QuantityName | StateQuantity")]
    quantity: JsValue,
    #[wasm_bindgen(js_name = valueSi, unchecked_param_type = "number")] value: JsValue,
) -> Result<f64, JsValue> {
    let q = named("quantity", &quantity)?;
    Ok(q.us().from_si(finite("valueSi", &value)?))
}

/// `valueUs`, a value of quantity `quantity` in its US customary unit, in its SI unit.
///
/// Throws as `toUs`.
#[wasm_bindgen(js_name = fromUs)]
pub fn from_us(
    #[wasm_bindgen(js_name = quantity, unchecked_param_type = "QuantityName | StateQuantity")]
    quantity: JsValue,
    #[wasm_bindgen(js_name = valueUs, unchecked_param_type = "number")] value: JsValue,
) -> Result<f64, JsValue> {
    let q = named("quantity", &quantity)?;
    Ok(q.us().to_si(finite("valueUs", &value)?))
}

fn finite(name: &str, value: &JsValue) -> Result<f64, JsValue> {
    let v = js::number(name, value)?;
    if v.is_finite() {
        Ok(v)
    } else {
        Err(Failure::range(Text::new(name).s(" must be a finite number, got ").n(v).done()).into())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The keys the JS objects had before the catalogue, for the state, are the
    /// catalogue's keys (no state key changed).
    #[test]
    fn state_keys_are_the_core_field_names_in_camel_case() {
        assert_eq!(
            keys(Quantity::of_group(Group::State)),
            "geometricAltitudeM,geopotentialAltitudeM,temperatureK,molecularTemperatureK,pressurePa,\
densityKgM3,speedOfSoundMS,dynamicViscosityPaS,kinematicViscosityM2S,thermalConductivityWMK,gravityMS2,\
pressureScaleHeightM,numberDensityM3,meanParticleSpeedMS,meanFreePathM,collisionFrequencyHz,\
meanMolarMassKgKmol,temperatureRatio,pressureRatio,densityRatio"
        );
        assert_eq!(keys(aerostrata::FlightPoint::QUANTITIES), "timeS,altitudeM,velocityMS,densityKgM3,pressurePa,temperatureK,speedOfSoundMS,mach,dynamicPressurePa,reynoldsPerM,reynoldsNumber,dragCoefficient,dragN,\
velocityEastMS,velocityNorthMS,velocityUpMS,windEastMS,windNorthMS,airspeedMS,alphaDeg,qAlphaPaDeg,\
totalTemperatureK,recoveryTemperatureK");
    }
}
