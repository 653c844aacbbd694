//! Messages without `core::fmt`.
//!
//! Why: Rust's float formatting (Grisu and Dragon4 with their tables) and the `fmt`
//! machinery around it are a quarter of the module's size budget, and the module only
//! ever formats numbers for error messages. So messages are built here by appending
//! text, numbers go through JS's own `String(number)` (shortest round-trip digits, as
//! Rust's `Display` gives them, in JS's notation: `1e+21` where Rust writes the digits
//! out), and the core's errors are rendered from their fields with the core's own
//! wording. A native test renders every variant with Rust's number formatting and
//! checks it against the core's `Display`, so the wording cannot drift.

use alloc::string::String;

use aerostrata::Error;

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

    /// Appends a number as JS prints it.
    #[must_use]
    pub fn n(mut self, value: f64) -> Self {
        push_number(&mut self.0, value);
        self
    }

    /// Appends a count or an index.
    #[must_use]
    pub fn u(mut self, value: usize) -> Self {
        push_count(&mut self.0, value);
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

/// The core's message for `error`, in the core's words (see the module docs).
pub fn render(error: &Error) -> String {
    let t = Text::new;
    match *error {
        Error::NotFinite { quantity, value } => t(quantity).s(" must be a finite number, got ").n(value),
        Error::OutOfRange { quantity, unit, value, min, max } => t(quantity)
            .s(" ")
            .n(value)
            .s(" ")
            .s(unit)
            .s(" is outside the allowed range ")
            .n(min)
            .s(" to ")
            .n(max)
            .s(" ")
            .s(unit),
        Error::NotPositive { quantity, unit, value } => {
            t(quantity).s(" must be greater than 0 ").s(unit).s(", got ").n(value).s(" ").s(unit)
        }
        Error::InvalidLayer { index, problem, value } => t("layer ").u(index).s(": ").s(problem).s(", got ").n(value),
        Error::Undefined { quantity, altitude_m } => {
            t(quantity).s(" is not defined by the model at geometric altitude ").n(altitude_m).s(" m")
        }
        Error::RatioOutOfRange { quantity, value, min, max } => {
            t(quantity).s(" ").n(value).s(" is outside the allowed range ").n(min).s(" to ").n(max)
        }
        Error::RatioNotPositive { quantity, value } => t(quantity).s(" must be greater than 0, got ").n(value),
        Error::InvalidPoint { table, index, problem, value } => {
            t(table).s(" point ").u(index).s(": ").s(problem).s(", got ").n(value)
        }
        Error::NoConvergence { solver, iterations } => {
            t(solver).s(" did not converge within ").u(iterations as usize).s(" iterations")
        }
        Error::TooFewRows { count } => t("a table needs at least 2 rows, got ").u(count),
        Error::RowNotFinite { row, quantity, value } => {
            t("row ").u(row).s(": ").s(quantity).s(" must be a finite number, got ").n(value)
        }
        Error::AltitudeNotIncreasing { row, altitude_m, previous_m, min_spacing_m } => t("row ")
            .u(row)
            .s(": altitude ")
            .n(altitude_m)
            .s(" m must be at least ")
            .n(min_spacing_m)
            .s(" m above the previous row's ")
            .n(previous_m)
            .s(" m"),
        Error::RowTemperatureNotPositive { row, temperature_k } => {
            t("row ").u(row).s(": temperature must be above 0 K, got ").n(temperature_k).s(" K")
        }
        Error::RowNotPositive { row, quantity, unit, value } => t("row ")
            .u(row)
            .s(": ")
            .s(quantity)
            .s(" must be greater than 0 ")
            .s(unit)
            .s(", got ")
            .n(value)
            .s(" ")
            .s(unit),
        Error::PressureNotDecreasing { row, pressure_pa, previous_pa } => t("row ")
            .u(row)
            .s(": pressure ")
            .n(pressure_pa)
            .s(" Pa must be below the previous row's ")
            .n(previous_pa)
            .s(" Pa"),
        Error::RelativeHumidityOutOfRange { row, percent } => t("row ")
            .u(row)
            .s(": relative humidity ")
            .n(percent)
            .s(" % is outside the allowed range 0 to 100 %"),
        Error::DewPointAboveTemperature { row, dew_point_k, temperature_k } => t("row ")
            .u(row)
            .s(": dew point ")
            .n(dew_point_k)
            .s(" K must not be above the temperature ")
            .n(temperature_k)
            .s(" K"),
        Error::RowOutOfRange { row, quantity, unit, value, min, max } => t("row ")
            .u(row)
            .s(": ")
            .s(quantity)
            .s(" ")
            .n(value)
            .s(" ")
            .s(unit)
            .s(" is outside the allowed range ")
            .n(min)
            .s(" to ")
            .n(max)
            .s(" ")
            .s(unit),
        Error::RowColumns { row, problem } => t("row ").u(row).s(": ").s(problem),
        Error::NotHydrostatic { row, ratio, min, max } => t("rows ")
            .u(row)
            .s(" and ")
            .u(row.saturating_add(1))
            .s(": the pressure falls ")
            .n(ratio)
            .s(" times as fast as hydrostatic balance at the rows' temperatures implies; the allowed range is ")
            .n(min)
            .s(" to ")
            .n(max),
        Error::VapourPressureTooHigh { row, vapour_pressure_pa, pressure_pa } => t("row ")
            .u(row)
            .s(": vapour pressure ")
            .n(vapour_pressure_pa)
            .s(" Pa must be below the pressure ")
            .n(pressure_pa)
            .s(" Pa"),
        Error::StorageTooSmall { needed, len } => {
            t("storage holds ").u(len).s(" levels, the table has ").u(needed).s(" rows")
        }
        // A variant added to the core after this module reads generically until it is
        // added here and to the test below.
        _ => t("the aerostrata core reported an error this module does not know"),
    }
    .done()
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
        ];
        for error in &errors {
            assert_eq!(render(error), error.to_string(), "{error:?}");
        }
    }
}
