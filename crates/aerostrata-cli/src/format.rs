//! Every number the tool writes as text, in one place: exact digits for data that other
//! programs read back (CSV, JSON), rounded styles for people (tables, summaries), and tidy
//! short forms for messages and plots. The rounded and tidy forms are one rule with
//! different settings: so many significant digits written plainly within a band of
//! decimal magnitudes, an exponent form outside it.

use std::ops::Range;

use aerostrata::quantity::Rounding;

mod exact;

pub use exact::{exact, write_exact};

/// `value` rounded as the catalogue says for people (CSV and JSON are always exact).
pub fn readable(rounding: Rounding, value: f64) -> String {
    match rounding {
        Rounding::Decimals(decimals) => fixed(value, usize::from(decimals)),
        Rounding::Scientific => scientific(value),
        Rounding::Significant => SIGNIFICANT.write(value),
    }
}

/// `value` with exactly `decimals` decimals.
pub fn fixed(value: f64, decimals: usize) -> String {
    format!("{value:.decimals$}")
}

/// Six significant digits as `1.22500E+00`.
pub fn scientific(value: f64) -> String {
    Exponent::Printed(5).write(value)
}

/// A number for a message: up to 7 significant digits, no trailing zeros.
pub fn tidy(value: f64) -> String {
    if !value.is_finite() || value == 0.0 {
        return format!("{value}");
    }
    MESSAGE.write(value)
}

/// Four significant digits for a note on a plot.
pub fn tidy_short(value: f64) -> String {
    if value == 0.0 || !value.is_finite() {
        return tidy(value);
    }
    NOTE.write(value)
}

/// A tick label: short, with an exponent for very large or small magnitudes.
pub fn tick(value: f64) -> String {
    if value == 0.0 || !value.is_finite() {
        return "0".to_owned();
    }
    TICK.write(value)
}

/// Significant digits, plain within a band of decimal magnitudes.
struct Digits {
    significant: i32,
    most_decimals: usize,
    /// Trailing zeros (and a bare point) dropped.
    trim: bool,
    /// The magnitudes written plainly and the form outside them; `None`: always plain.
    plain: Option<(Range<i32>, Exponent)>,
}

/// Table cells: 6 digits, `1.22500E+00` beyond 1e-3 to 1e7.
const SIGNIFICANT: Digits = Digits {
    significant: 6,
    most_decimals: usize::MAX,
    trim: false,
    plain: Some((-3..7, Exponent::Printed(5))),
};

/// Messages: 7 digits, `1.000000e-9` beyond 1e-4 to 1e9.
const MESSAGE: Digits = Digits {
    significant: 7,
    most_decimals: usize::MAX,
    trim: true,
    plain: Some((-4..9, Exponent::Plain(6))),
};

/// Axis ticks: 4 digits, `2.5e-7` beyond 1e-3 to 1e6.
const TICK: Digits =
    Digits { significant: 4, most_decimals: 6, trim: true, plain: Some((-3..6, Exponent::Short(2))) };

/// Notes on a plot: 4 digits, at most 6 decimals, never an exponent.
const NOTE: Digits = Digits { significant: 4, most_decimals: 6, trim: false, plain: None };

impl Digits {
    fn write(&self, value: f64) -> String {
        let magnitude = if value == 0.0 { 0 } else { value.abs().log10().floor() as i32 };
        if let Some((band, exponent)) = &self.plain {
            if !band.contains(&magnitude) {
                return exponent.write(value);
            }
        }
        let decimals = ((self.significant - 1 - magnitude).max(0) as usize).min(self.most_decimals);
        let text = fixed(value, decimals);
        if self.trim {
            trim_zeros(&text).to_owned()
        } else {
            text
        }
    }
}

/// The forms of a number with an exponent.
#[derive(Clone, Copy)]
enum Exponent {
    /// Rust's own, with this many decimals: `1.000000e-9`.
    Plain(usize),
    /// This many decimals at most, trailing zeros dropped: `2.5e-7`, `1e6`.
    Short(usize),
    /// A printed table's, with this many decimals: `1.22500E+00`.
    Printed(usize),
}

impl Exponent {
    fn write(self, value: f64) -> String {
        let (Exponent::Plain(decimals) | Exponent::Short(decimals) | Exponent::Printed(decimals)) = self;
        let text = format!("{value:.decimals$e}");
        // inf and NaN have no exponent.
        let Some((mantissa, exponent)) = text.split_once('e') else {
            return text;
        };
        let power: i32 = exponent.parse().unwrap_or(0);
        match self {
            Exponent::Plain(_) => text,
            Exponent::Short(_) => format!("{}e{power}", trim_zeros(mantissa)),
            Exponent::Printed(_) => {
                let sign = if power < 0 { '-' } else { '+' };
                format!("{mantissa}E{sign}{:02}", power.abs())
            }
        }
    }
}

/// `text` without the trailing zeros of its decimals, nor a point left bare.
fn trim_zeros(text: &str) -> &str {
    if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.')
    } else {
        text
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A form's name, the form, a value and the text it must give.
    type Case = (&'static str, fn(f64) -> String, f64, &'static str);

    #[test]
    fn each_form_writes_its_text() {
        let significant: fn(f64) -> String = |v| readable(Rounding::Significant, v);
        let four_decimals: fn(f64) -> String = |v| fixed(v, 4);
        let cases: [Case; 26] = [
            // A printed table's six digits and exponent.
            ("scientific", scientific, 1.2249991558877122, "1.22500E+00"),
            ("scientific", scientific, 6.633232327863704e-8, "6.63323E-08"),
            ("scientific", scientific, 101_325.0, "1.01325E+05"),
            ("significant", significant, 34_512.345_6, "34512.3"),
            ("significant", significant, 1.234_567_89, "1.23457"),
            ("significant", significant, 0.0, "0.00000"),
            ("fixed", four_decimals, 2.0 / 3.0, "0.6667"),
            // Messages: seven digits without trailing zeros.
            ("tidy", tidy, -16_404.199_475_065_617, "-16404.2"),
            ("tidy", tidy, 3_280_839.895_013_123, "3280840"),
            ("tidy", tidy, 0.5, "0.5"),
            ("tidy", tidy, 1.0e-9, "1.000000e-9"),
            // Axis ticks: short, an exponent for very large or small magnitudes.
            ("tick", tick, 0.0, "0"),
            ("tick", tick, 20_000.0, "20000"),
            ("tick", tick, 1.5, "1.5"),
            ("tick", tick, 1.0e-5, "1e-5"),
            ("tick", tick, 1.0e6, "1e6"),
            ("tick", tick, 2.5e-7, "2.5e-7"),
            // Notes on a plot: four digits, never an exponent.
            ("tidy_short", tidy_short, 48.123_45, "48.12"),
            ("tidy_short", tidy_short, 12_345.6, "12346"),
            ("tidy_short", tidy_short, 2.0e-5, "0.000020"),
            ("tidy_short", tidy_short, 0.0, "0"),
            // Values that are not finite (a tick at 0, out of the way).
            ("tidy", tidy, f64::NAN, "NaN"),
            ("tidy_short", tidy_short, f64::INFINITY, "inf"),
            ("tick", tick, f64::NEG_INFINITY, "0"),
            ("scientific", scientific, f64::INFINITY, "inf"),
            ("significant", significant, f64::NEG_INFINITY, "-inf"),
        ];
        for (name, form, value, text) in cases {
            assert_eq!(form(value), text, "{name}({value})");
        }
    }
}
