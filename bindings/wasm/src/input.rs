//! What a page reads from a person or a file, through the core's own readers, so that a
//! typed value, a model spec, a sounding or a flight file means in the browser what it
//! means on the command line: `parseValue` (a value with its unit, checked for
//! plausibility), `AtmosphereModel.fromSpec` and `modelGrammar` (the model language),
//! `AtmosphereModel.fromSoundingCsv` and `readFlightCsv` (the one table reader).

use alloc::string::{String, ToString};
use alloc::vec::Vec;

use aerostrata::flight::{FileLayout, SampleError, EMPTY_CELL, FILE_COLUMNS, IMPLICIT_COLUMNS};
use aerostrata::model::{spec, ModelSpec, SpecError};
use aerostrata::table::{self, CellError, Header};
use aerostrata::units::{self, Part, ReadError, Unit};
use aerostrata::{AnyModel, Quantity};
use wasm_bindgen::prelude::*;

use crate::error::{Failure, Js};
use crate::js;
use crate::model::AtmosphereModel;
use crate::quantity::named;
use crate::text::{push_count, Text};

/// A typed value's refusal as the core words it, numbers as a person reads them (six
/// significant digits, written by JS), without Rust's float formatting (the module's
/// size budget).
fn read_error(error: &ReadError<'_>) -> String {
    match error {
        ReadError::Unit(unit) => unit.to_string(),
        _ => {
            let mut out = String::new();
            error.message_parts(|part| match part {
                Part::Text(text) => out.push_str(text),
                Part::Number(value) => out.push_str(&js::tidy(value)),
            });
            out
        }
    }
}

/// A sounding's refusal: its place (line, column, cell) and why, numbers as in
/// [`read_error`].
pub(crate) fn load_error(error: &aerostrata::model::sounding_io::LoadError) -> String {
    let mut out = String::from("line ");
    push_count(&mut out, error.line());
    if let Some((index, name)) = error.column() {
        out.push_str(", column ");
        push_count(&mut out, index);
        out.push_str(" (");
        out.push_str(name);
        out.push(')');
    }
    if let Some(value) = error.value() {
        out.push_str(", value '");
        out.push_str(value);
        out.push('\'');
    }
    out.push_str(": ");
    error.message_parts(|part| match part {
        Part::Text(text) => out.push_str(text),
        Part::Number(value) => out.push_str(&js::tidy(value)),
    });
    out
}

/// The reader's options of a table whose headings without a unit read in SI, or in US
/// units when `defaultUnits` is `"us"`.
pub(crate) fn table_options(units: &JsValue) -> Result<aerostrata::model::sounding_io::Options, JsValue> {
    let us = crate::args::choice("defaultUnits", units, "si,us", &[false, true], Some(0))?;
    Ok(aerostrata::model::sounding_io::Options {
        default_unit: if us { Quantity::us } else { Quantity::si },
        ..Default::default()
    })
}

/// A spec's refusal, worded as the core's `Display` words it.
fn spec_error(error: &SpecError<'_>) -> String {
    // What a person typed, escaped and cut, as the core writes it.
    let cut = |text: &str| units::Escaped(text).to_string();
    let grammar = |text: Text| text.s("; a model is one of: ").s(spec::GRAMMAR).done();
    match error {
        SpecError::UnknownModel { name } => grammar(Text::new("unknown model '").s(&cut(name)).s("'")),
        SpecError::Missing { model, what } => grammar(Text::new(model).s(" needs ").s(what)),
        SpecError::Unexpected { model, text } => {
            grammar(Text::new(model).s(" does not take '").s(&cut(text)).s("'"))
        }
        SpecError::Value { model, what, error } => {
            Text::new(model).s(": ").s(what).s(": ").s(&read_error(error)).done()
        }
        _ => String::from("the model spec is not valid"),
    }
}

/// The unit named `spelling` among the units of `quantity`'s dimension, or a `RangeError`.
fn unit_of(argument: &str, quantity: Quantity, spelling: &str) -> Result<&'static Unit, JsValue> {
    let dimension = quantity.si().dimension();
    Unit::find(spelling, dimension).ok_or_else(|| {
        let mut message =
            Text::new(argument).s(": ").s(&units::Quoted(spelling).to_string()).s(" is not a unit of ");
        message = message.s(dimension.name()).s("; one of ");
        for (i, unit) in dimension.units().enumerate() {
            message = message.s(if i == 0 { "" } else { ", " }).s(unit.symbol());
        }
        Failure::range(message.done()).into()
    })
}

/// A value a person typed for quantity `quantity` (its machine name or JS key): a number
/// with an optional unit (`15C`, `35000ft`, `1020hPa`, `+27F` for a temperature offset),
/// a bare number taken in `unit` (a spelling of one of the quantity's units; its SI unit
/// when omitted). Temperatures, temperature offsets and altimeter settings are checked
/// for plausibility: a bare number that is implausible in `unit` but plausible in another
/// is refused with the fix spelled out.
///
/// Returns `{si, value, unit, explicit}`: the value in the quantity's SI unit, the number
/// as written, the symbol of the unit it was read in, and whether the text named it.
/// Throws a `TypeError` for a non-string, a `RangeError` for anything it cannot read.
#[wasm_bindgen(js_name = parseValue, unchecked_return_type = "ParsedValue")]
pub fn parse_value(
    #[wasm_bindgen(js_name = text, unchecked_param_type = "string")] text: JsValue,
    #[wasm_bindgen(js_name = quantity, unchecked_param_type = "QuantityName | StateQuantity")]
    quantity: JsValue,
    #[wasm_bindgen(js_name = unit, unchecked_optional_param_type = "string")] unit: JsValue,
) -> Result<JsValue, JsValue> {
    let text = js::text("text", &text)?;
    let q = named("quantity", &quantity)?;
    let default = if unit.is_undefined() { q.si() } else { unit_of("unit", q, &js::text("unit", &unit)?)? };
    let read = match q.plausible() {
        Some(plausible) => units::read(&text, default, &plausible),
        None => units::parse(&text, default.dimension(), default).map_err(ReadError::Unit),
    };
    let reading = read.map_err(|e| JsValue::from(Failure::range(read_error(&e))))?;
    js::parsed_value(reading.si(), reading.value, reading.unit.symbol(), reading.explicit)
}

/// The grammar of model specs, for a page's help text.
#[wasm_bindgen(js_name = modelGrammar)]
pub fn model_grammar() -> String {
    String::from(spec::GRAMMAR)
}

#[wasm_bindgen(js_class = AtmosphereModel)]
impl AtmosphereModel {
    /// The model a spec names, in the language every door shares: `standard`,
    /// `offset=+15K` (the standard's pressure, temperatures shifted), `hydrostatic-offset=
    /// +15K[,p0=1013hPa]` (shifted and in hydrostatic balance), `isothermal=250K[,p0=P]`,
    /// `exponential=1.225,8500m[,T]` (see `modelGrammar()`). A `sounding=` or `layers=`
    /// spec names a file: load a sounding's text with `fromSoundingCsv` instead.
    ///
    /// Throws a `RangeError` naming the model and the value for a spec it cannot read.
    #[wasm_bindgen(js_name = fromSpec)]
    pub fn from_spec(
        #[wasm_bindgen(js_name = spec, unchecked_param_type = "string")] spec: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let text = js::text("spec", &spec)?;
        let parsed = ModelSpec::parse(&text).map_err(|e| JsValue::from(Failure::range(spec_error(&e))))?;
        match AnyModel::from_spec(&parsed) {
            Some(model) => Ok(AtmosphereModel::from_model(model.js()?)),
            None => Err(Failure::range(
                Text::new("spec: ")
                    .s(&units::Quoted(&text).to_string())
                    .s(" names a file; give a sounding's text to AtmosphereModel.fromSoundingCsv")
                    .done(),
            )
            .into()),
        }
    }

    /// A sounding from its CSV text, read as the command line reads it (headings with or
    /// without units in any spelling, a cell's own unit, unknown columns such as wind kept
    /// out, every value checked against what the atmosphere can have at its row). Columns
    /// without a unit in their heading read in SI, or in US units when `defaultUnits` is
    /// `"us"`.
    ///
    /// Throws an `Error` naming the line, column and cell for a sounding it cannot read.
    #[wasm_bindgen(js_name = fromSoundingCsv)]
    pub fn from_sounding_csv(
        #[wasm_bindgen(js_name = text, unchecked_param_type = "string")] text: JsValue,
        #[wasm_bindgen(js_name = defaultUnits, unchecked_optional_param_type = "\"si\" | \"us\"")]
        units: JsValue,
    ) -> Result<AtmosphereModel, JsValue> {
        let text = js::long_text("text", &text)?;
        let options = table_options(&units)?;
        let sounding = aerostrata::model::sounding_io::read_csv(&text, &options)
            .map_err(|e| JsValue::from(Failure::plain(load_error(&e))))?;
        Ok(AtmosphereModel::from_model(AnyModel::Sounding(sounding.table)))
    }
}

/// The samples of a flight file, read by the rules the command line reads it by (the
/// core's [`FileLayout`]): a header naming `time` and `altitude` (geometric; or
/// `geometric_altitude`) and the velocity, in any spelling, with or without units
/// (`time (s),altitude (ft),speed (kt)`); columns without a unit read in SI, or in US units
/// when `defaultUnits` is `"us"`; a cell's own unit wins; other columns are kept out and
/// listed in `ignored`. Without a header the columns are time, altitude and velocity, in
/// order. At most 16 777 216 samples.
///
/// The velocity is a `velocity` (or `speed`) column, or `velocity_east`, `velocity_north`
/// and `velocity_up` (the ground-relative velocity), or `velocity` with
/// `flight_path_angle` and `heading`; `axis_elevation` and `axis_azimuth` give the
/// vehicle's axis. A velocity given two ways is refused. The result has the columns the
/// file gives, so that `{ignored, ...samples}` is what `scanFlight(options)` takes.
///
/// Returns `{timeS, altitudeM, velocityMS?, velocityEastMS?, velocityNorthMS?,
/// velocityUpMS?, flightPathAngleDeg?, headingDeg?, axisElevationDeg?, axisAzimuthDeg?,
/// ignored}` (`Float64Array`s in SI, and the headings kept out). Throws an `Error` naming
/// the line and column for a file it cannot read (a `RangeError` for an angle out of its
/// range).
#[wasm_bindgen(js_name = readFlightCsv, unchecked_return_type = "FlightSamples")]
pub fn read_flight_csv(
    #[wasm_bindgen(js_name = text, unchecked_param_type = "string")] text: JsValue,
    #[wasm_bindgen(js_name = defaultUnits, unchecked_optional_param_type = "\"si\" | \"us\"")] units: JsValue,
) -> Result<JsValue, JsValue> {
    let text = js::long_text("text", &text)?;
    let default_unit = table_options(&units)?.default_unit;
    let at =
        |line: usize, message: &str| Failure::plain(Text::new("line ").u(line).s(": ").s(message).done());
    let mut lines =
        table::data_lines(&text).map(|line| line.map_err(|e| JsValue::from(at(e.line, &e.to_string()))));
    let Some((header_line, header_text)) = lines.next().transpose()? else {
        return Err(Failure::plain("the flight file is empty: it needs a header line and samples").into());
    };
    let mut names: Vec<&str> = table::cells(header_text, table::delimiter_of(header_text)).collect();
    let (header, first_row) = if table::is_header(header_text) {
        let header = Header::read(header_text, |q| FILE_COLUMNS.contains(&q), default_unit)
            .map_err(|e| JsValue::from(at(header_line, &e.to_string())))?;
        (header, None)
    } else {
        names = IMPLICIT_COLUMNS.iter().map(|q| q.name()).collect();
        (Header::implicit(&IMPLICIT_COLUMNS, header_text, default_unit), Some((header_line, header_text)))
    };
    let layout = FileLayout::of(&header).map_err(|e| JsValue::from(at(header_line, &e.to_string())))?;
    let given: Vec<(Quantity, usize)> = layout.columns().collect();
    let mut columns: Vec<Vec<f64>> = given.iter().map(|_| Vec::new()).collect();
    let mut values = [None; table::MAX_COLUMNS];
    for next in first_row.map(Ok).into_iter().chain(lines) {
        let (line, row) = next?;
        header.read_row(row, &mut values).map_err(|e| {
            JsValue::from(match e {
                CellError::Value { .. } | CellError::Count { .. } => at(line, &e.to_string()),
                _ => at(line, "not a row of the table"),
            })
        })?;
        layout.sample(&values).map_err(|e| {
            let index = e.index();
            let mut message = Text::new("line ").u(line).s(", column ");
            let mut number = String::new();
            push_count(&mut number, index + 1);
            message = message.s(&number).s(" (").s(names.get(index).copied().unwrap_or("")).s("): ");
            // The core's words, its numbers without Rust's float formatting (the size budget).
            JsValue::from(match e {
                SampleError::Value { error, .. } => {
                    let failure = Failure::from(error);
                    Failure { message: message.s(&failure.message).done(), ..failure }
                }
                _ => Failure::plain(message.s(EMPTY_CELL).done()),
            })
        })?;
        for (column, &(_, index)) in columns.iter_mut().zip(&given) {
            if column.len() >= crate::args::MAX_ELEMENTS {
                return Err(Failure::range("the flight file has more than 16777216 samples").into());
            }
            column.push(values.get(index).copied().flatten().unwrap_or(0.0));
        }
    }
    let mut ignored = String::new();
    for name in header.ignored().filter_map(|i| names.get(i)) {
        ignored.push_str(if ignored.is_empty() { "" } else { "\u{1f}" });
        ignored.push_str(name);
    }
    let count = columns.first().map_or(0, Vec::len);
    // A flight's altitude is geometric: `geometric_altitude` gives `altitudeM`.
    let keys = crate::quantity::keys(given.iter().map(|&(q, _)| match q {
        Quantity::GeometricAltitude => Quantity::Altitude,
        q => q,
    }));
    let flat: Vec<f64> = columns.into_iter().flatten().collect();
    js::flight_samples(&keys, &flat, count, &ignored)
}
