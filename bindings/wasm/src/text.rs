//! Messages without `core::fmt`.
//!
//! Why: Rust's float formatting (Grisu and Dragon4 with their tables) and the `fmt`
//! machinery around it are a quarter of the module's size budget, and the module only
//! ever formats numbers for error messages. So messages are built here by appending
//! text, numbers go through JS's own `String(number)` (shortest round-trip digits, as
//! Rust's `Display` gives them, in JS's notation: `1e+21` where Rust writes `1e21`), and
//! the core's errors are written from the core's own message parts, so the wording is
//! the core's. A native test checks every variant against the core's `Display`.

use alloc::string::String;

use aerostrata::{Error, MessagePart};

/// A message being built.
pub struct Text(String);

impl Text {
    /// A message starting with `text`.
    pub fn new(text: &str) -> Self {
        Self(String::from(text))
    }

    /// Appends `text`.
    #[must_use]
    pub fn s(mut self, text: &str) -> Self {
        self.0.push_str(text);
        self
    }

    /// Appends a count or an index.
    #[must_use]
    pub fn u(mut self, value: usize) -> Self {
        push_count(&mut self.0, value);
        self
    }

    /// Appends a number as JS writes it.
    #[must_use]
    pub fn n(mut self, value: f64) -> Self {
        push_number(&mut self.0, value);
        self
    }

    /// The message.
    pub fn done(self) -> String {
        self.0
    }
}

/// Appends the decimal digits of `value`.
pub fn push_count(out: &mut String, value: usize) {
    let mut digits = [0u8; 20];
    let mut rest = value;
    let mut start = digits.len();
    loop {
        start -= 1;
        digits[start] = b'0' + (rest % 10) as u8;
        rest /= 10;
        if rest == 0 || start == 0 {
            break;
        }
    }
    for &d in &digits[start..] {
        out.push(char::from(d));
    }
}

/// Appends `value` as JS's `String(value)` gives it.
#[cfg(target_arch = "wasm32")]
pub fn push_number(out: &mut String, value: f64) {
    out.push_str(&crate::js::number_text(value));
}

/// Appends `value` as Rust's `Display` gives it (the native builds, which only test).
#[cfg(not(target_arch = "wasm32"))]
pub fn push_number(out: &mut String, value: f64) {
    extern crate std;
    use std::string::ToString;
    out.push_str(&value.to_string());
}

/// The core's message for `error`: the core's own parts ([`Error::message_parts`]), its
/// numbers written as JS writes them (see the module docs).
pub fn render(error: &Error) -> String {
    let mut out = String::new();
    error.message_parts(|part| match part {
        MessagePart::Text(text) => out.push_str(text),
        MessagePart::Number(value) => push_number(&mut out, value),
        MessagePart::Count(count) => push_count(&mut out, count),
    });
    out
}

#[cfg(test)]
mod tests {
    extern crate std;
    use std::string::ToString;
    use std::vec;

    use super::*;

    #[test]
    fn counts_are_their_digits() {
        for value in [0usize, 7, 10, 99, 1_000_001, usize::MAX] {
            let mut out = String::new();
            push_count(&mut out, value);
            assert_eq!(out, value.to_string());
        }
    }

    /// Every variant of the core's error, rendered here, reads exactly as the core's own
    /// `Display` (natively numbers are Rust's `Display` on both sides).
    #[test]
    fn every_core_error_reads_as_the_core_writes_it() {
        let errors = vec![
            Error::NotFinite { quantity: "geometric altitude", value: f64::NAN },
            Error::OutOfRange {
                quantity: "geometric altitude",
                unit: "m",
                value: 2.5e7,
                min: -5000.0,
                max: 1.0e6,
            },
            Error::NotPositive { quantity: "temperature", unit: "K", value: -3.25 },
            Error::InvalidLayer {
                index: 2,
                problem: "lapse rate (K/m) must be finite",
                value: f64::INFINITY,
            },
            Error::Undefined { quantity: "speed of sound", altitude_m: 100_000.0 },
            Error::RatioOutOfRange { quantity: "Mach number", value: -0.5, min: 0.0, max: 1000.0 },
            Error::RatioNotPositive { quantity: "drag coefficient", value: 0.0 },
            Error::InvalidPoint {
                table: "flight sample",
                index: 4,
                problem: "time (s) must grow",
                value: 1.5,
            },
            Error::NoConvergence { solver: "altitude solver", iterations: 200 },
            Error::TooFewRows { count: 1 },
            Error::RowNotFinite { row: 3, quantity: "dew point", value: f64::NEG_INFINITY },
            Error::AltitudeNotIncreasing { row: 1, altitude_m: 10.0, previous_m: 10.0, min_spacing_m: 1e-3 },
            Error::RowTemperatureNotPositive { row: 0, temperature_k: -4.0 },
            Error::RowNotPositive { row: 5, quantity: "density", unit: "kg/m^3", value: 0.0 },
            Error::PressureNotDecreasing { row: 2, pressure_pa: 90_000.0, previous_pa: 89_000.5 },
            Error::RelativeHumidityOutOfRange { row: 1, percent: 101.5 },
            Error::DewPointAboveTemperature { row: 1, dew_point_k: 300.0, temperature_k: 299.5 },
            Error::RowOutOfRange {
                row: 0,
                quantity: "temperature",
                unit: "K",
                value: 2.0e5,
                min: 1.0,
                max: 1.0e5,
            },
            Error::RowColumns { row: 2, problem: "gives both a pressure and a density" },
            Error::NotHydrostatic { row: 3, ratio: 3.3, min: 0.5, max: 2.0 },
            Error::VapourPressureTooHigh { row: 0, vapour_pressure_pa: 5000.0, pressure_pa: 4000.0 },
            Error::StorageTooSmall { needed: 9, len: 4 },
            Error::UpperNotLoaded { altitude_m: 120_000.5 },
            Error::UpperTablesRefused { problem: "its digest is not this build's", len: 17, expected: 17220 },
        ];
        for error in &errors {
            assert_eq!(render(error), error.to_string(), "{error:?}");
        }
    }
}
