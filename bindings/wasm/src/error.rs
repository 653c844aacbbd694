//! The one failure type of the wasm door and how it becomes a thrown JS error.
//!
//! Three JS classes, chosen as JS itself chooses them: a `TypeError` when an argument is
//! not of the JS type asked for (a string where a number belongs, a missing array); a
//! `RangeError` when a value lies outside what is allowed (the core's out-of-range,
//! not-positive and not-finite errors, an unknown option name, an array too long); a plain
//! `Error` for the rest (inconsistent layers or tables, a quantity the model does not
//! define there, a solver that did not converge). The message is the core's own, which
//! names the value and the allowed range, with the argument and element in front when the
//! value came from an array.

use alloc::string::String;

use aerostrata::Error;
use wasm_bindgen::JsValue;

use crate::text::{render, Text};

/// Which JS error class a failure is thrown as.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Class {
    /// `TypeError`: an argument of the wrong JS type.
    Type,
    /// `RangeError`: a value outside its allowed range or set.
    Range,
    /// `Error`: anything else.
    Plain,
}

/// A failure on its way to JS: the class and the message.
#[derive(Debug, Clone, PartialEq)]
pub struct Failure {
    /// The JS error class.
    pub class: Class,
    /// The message, naming the value and what is allowed.
    pub message: String,
}

impl Failure {
    /// A `TypeError` with `message`.
    pub fn type_error(message: impl Into<String>) -> Self {
        Self { class: Class::Type, message: message.into() }
    }

    /// A `RangeError` with `message`.
    pub fn range(message: impl Into<String>) -> Self {
        Self { class: Class::Range, message: message.into() }
    }

    /// A plain `Error` with `message`.
    pub fn plain(message: impl Into<String>) -> Self {
        Self { class: Class::Plain, message: message.into() }
    }

    /// The same failure with `place` (an argument and element, "altitudesM[3]") in front.
    #[must_use]
    pub fn at(self, place: &str) -> Self {
        Self { class: self.class, message: Text::new(place).s(": ").s(&self.message).done() }
    }
}

/// The JS class of each core error. Out-of-range and non-positive values (including NaN
/// and infinities, which lie outside every allowed range) are range errors; inconsistent
/// tables, undefined quantities and solver failures are plain errors.
pub fn class_of(error: &Error) -> Class {
    match error {
        Error::NotFinite { .. }
        | Error::OutOfRange { .. }
        | Error::NotPositive { .. }
        | Error::RatioOutOfRange { .. }
        | Error::RatioNotPositive { .. }
        | Error::RowNotFinite { .. }
        | Error::RowTemperatureNotPositive { .. }
        | Error::RowNotPositive { .. }
        | Error::RelativeHumidityOutOfRange { .. }
        | Error::RowOutOfRange { .. } => Class::Range,
        _ => Class::Plain,
    }
}

impl From<Error> for Failure {
    fn from(error: Error) -> Self {
        // The core's message names its Rust function; a page needs to know what to call.
        if let Error::UpperNotLoaded { altitude_m } = error {
            return Self::plain(
                Text::new("altitude ")
                    .n(altitude_m / 1000.0)
                    .s(" km is above 86 km, whose upper-atmosphere tables are not loaded: call `await loadUpper()` first")
                    .done(),
            );
        }
        Self { class: class_of(&error), message: render(&error) }
    }
}

impl From<Failure> for JsValue {
    fn from(failure: Failure) -> Self {
        let kind = match failure.class {
            Class::Type => 0,
            Class::Range => 1,
            Class::Plain => 2,
        };
        crate::js::error(kind, &failure.message)
    }
}

/// The core's results as the exports' results: `.js()?` turns a core error into the
/// thrown JS error.
pub trait Js<T> {
    /// The result with a core error made a JS error.
    fn js(self) -> Result<T, JsValue>;
}

impl<T> Js<T> for aerostrata::Result<T> {
    fn js(self) -> Result<T, JsValue> {
        self.map_err(|e| Failure::from(e).into())
    }
}

impl<T> Js<T> for Result<T, Failure> {
    fn js(self) -> Result<T, JsValue> {
        self.map_err(JsValue::from)
    }
}

#[cfg(test)]
mod tests {
    extern crate std;
    use std::string::ToString;

    use super::*;

    #[test]
    fn out_of_range_values_are_range_errors_and_keep_the_core_message() {
        let e = aerostrata::Altitude::geometric_m(2.0e7).unwrap_err();
        let f = Failure::from(e);
        assert_eq!(f.class, Class::Range);
        assert_eq!(f.message, e.to_string());
        assert!(f.message.contains("20000000") && f.message.contains("allowed range"), "{}", f.message);
        let nan = aerostrata::Altitude::geometric_m(f64::NAN).unwrap_err();
        assert_eq!(class_of(&nan), Class::Range);
    }

    #[test]
    fn inconsistent_tables_are_plain_errors() {
        use aerostrata::{AltitudeKind, SoundingRow, Tabulated};
        let rows = [SoundingRow::new(0.0, 288.0).with_pressure_pa(1.0e5), SoundingRow::new(0.0, 280.0)];
        let e = Tabulated::from_rows(AltitudeKind::Geometric, &rows).unwrap_err();
        assert_eq!(class_of(&e), Class::Plain, "{e}");
        let e = Tabulated::from_rows_vec(AltitudeKind::Geometric, &rows[..1]).unwrap_err();
        assert_eq!(Failure::from(e).class, Class::Plain, "{e}");
    }

    /// The upper atmosphere's tables not loaded: a plain `Error` that says what to call, in
    /// kilometres, in front of which a batch or a scan puts its element.
    #[test]
    fn tables_not_loaded_say_to_call_load_upper() {
        let f = Failure::from(Error::UpperNotLoaded { altitude_m: 120_000.0 });
        assert_eq!(f.class, Class::Plain);
        assert_eq!(
            f.message,
            "altitude 120 km is above 86 km, whose upper-atmosphere tables are not loaded: call `await loadUpper()` first"
        );
        assert!(Failure::from(Error::UpperNotLoaded { altitude_m: 86_000.5 })
            .message
            .starts_with("altitude 86.0005 km"));
    }

    #[test]
    fn a_place_goes_in_front() {
        let f = Failure::range("too high").at("altitudesM[3]");
        assert_eq!(f.message, "altitudesM[3]: too high");
        assert_eq!(f.class, Class::Range);
    }
}
