//! Reading a value a person typed for one purpose: the one parser ([`parse`]) and then a
//! check that the value is one the purpose can have. A bare number is taken in the
//! purpose's default unit; where it is implausible there but plausible in another common
//! unit of the same dimension (`--qnh 1020`: 1020 Pa is no sea-level pressure, 1020 hPa
//! is), the error says so and names the fix (`write 1020hPa or 102000Pa`), instead of
//! the number being silently misread.
//!
//! The bands are wide on purpose: they catch a unit mix-up (a factor of 100, or degrees
//! Celsius read as kelvin), not an unusual day. Each names where its limits come from.

use core::fmt;

use super::{parse, Reading, Unit, UnitError};

/// What a value typed for one purpose can plausibly be: a closed band in SI, and the
/// words for the purpose (`"air temperature"`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Plausible {
    /// The lowest plausible value, in the SI unit of the dimension.
    pub min_si: f64,
    /// The highest plausible value, in the SI unit of the dimension.
    pub max_si: f64,
    /// What the value is, for the message ("air temperature").
    pub what: &'static str,
}

impl Plausible {
    /// An air temperature anywhere from the coldest mesopause (about 130 K) to the hottest
    /// surface air (330 K, 56.7 degC), with room either side: 120 to 350 K (common
    /// practice, no source; the extremes from memory).
    pub const AIR_TEMPERATURE: Plausible =
        Plausible { min_si: 120.0, max_si: 350.0, what: "air temperature" };
    /// A dew point: as an air temperature.
    pub const DEW_POINT: Plausible = Plausible { min_si: 120.0, max_si: 350.0, what: "dew point" };
    /// A hot or cold day's offset from a standard temperature: within 100 K either way
    /// (the hottest and coldest surface air differ from the standard's 288.15 K by about
    /// 45 K and 100 K; common practice, no source).
    pub const TEMPERATURE_OFFSET: Plausible =
        Plausible { min_si: -100.0, max_si: 100.0, what: "day's offset from the standard temperature" };
    /// A sea-level pressure or altimeter setting (QNH): 850 to 1100 hPa, around the
    /// records of about 870 hPa (a typhoon's eye) and 1084 hPa (a Siberian high), from
    /// memory.
    pub const SEA_LEVEL_PRESSURE: Plausible =
        Plausible { min_si: 85_000.0, max_si: 110_000.0, what: "sea-level pressure" };
    /// The pressure at a launch site or any surface station: from about 300 hPa (the
    /// highest summits) to the sea-level records (common practice, no source).
    pub const SURFACE_PRESSURE: Plausible =
        Plausible { min_si: 30_000.0, max_si: 110_000.0, what: "surface pressure" };
}

/// Why a typed value was refused.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum ReadError<'a> {
    /// The text is not a value with a unit of the right dimension.
    Unit(UnitError<'a>),
    /// The value lies outside what the purpose can plausibly be. For a bare number,
    /// `alternatives` are the units in which it would be plausible.
    Implausible {
        /// The number as written.
        value: f64,
        /// The unit it was read in (the default, for a bare number).
        unit: &'static Unit,
        /// Whether the text spelled the unit.
        explicit: bool,
        /// The band it missed.
        plausible: Plausible,
        /// The purpose's default unit, in which the band and the fix are written.
        default: &'static Unit,
        /// Up to two units in which the number would be plausible.
        alternatives: [Option<&'static Unit>; 2],
    },
}

impl<'a> From<UnitError<'a>> for ReadError<'a> {
    fn from(error: UnitError<'a>) -> Self {
        ReadError::Unit(error)
    }
}

/// Reads `text` as a value of the dimension of `default` (a bare number is in `default`)
/// and checks it against `plausible`.
///
/// # Errors
/// [`ReadError::Unit`] as [`parse`]; [`ReadError::Implausible`] for a value outside the
/// band, with the units that would make a bare number plausible.
///
/// ```
/// use aerostrata::units::{read, Plausible, KELVIN, PASCAL};
/// assert_eq!(read("15C", &KELVIN, &Plausible::AIR_TEMPERATURE)?.si(), 288.15);
/// let e = read("15", &KELVIN, &Plausible::AIR_TEMPERATURE).unwrap_err();
/// assert_eq!(e.to_string(), "15 K is below any air temperature (120 to 350 K); write 15degC or 288.15K, or 15degF (263.706 K)");
/// let e = read("1020", &PASCAL, &Plausible::SEA_LEVEL_PRESSURE).unwrap_err();
/// assert!(e.to_string().ends_with("write 1020hPa or 102000Pa, or 1020mbar (102000 Pa)"));
/// # Ok::<(), aerostrata::units::ReadError>(())
/// ```
pub fn read<'a>(
    text: &'a str,
    default: &'static Unit,
    plausible: &Plausible,
) -> Result<Reading, ReadError<'a>> {
    let reading = parse(text, default.dimension(), default)?;
    let si = reading.si();
    if (plausible.min_si..=plausible.max_si).contains(&si) {
        return Ok(reading);
    }
    let mut alternatives = [None; 2];
    if !reading.explicit {
        let fits = |u: &&'static Unit| {
            *u != reading.unit && (plausible.min_si..=plausible.max_si).contains(&u.to_si(reading.value))
        };
        for (slot, unit) in alternatives.iter_mut().zip(default.dimension().units().filter(fits)) {
            *slot = Some(unit);
        }
    }
    Err(ReadError::Implausible {
        value: reading.value,
        unit: reading.unit,
        explicit: reading.explicit,
        plausible: *plausible,
        default,
        alternatives,
    })
}

/// One piece of a [`ReadError`] message, for doors that write numbers their own way (the
/// size-budgeted WebAssembly module); [`fmt::Display`] joins them.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Part<'a> {
    /// Words, units and punctuation.
    Text(&'a str),
    /// A value, written with about six significant digits.
    Number(f64),
}

impl ReadError<'_> {
    /// The message, piece by piece (for [`ReadError::Implausible`]; a [`ReadError::Unit`]
    /// gives its own message through `Display` as one text part is not possible without
    /// formatting, so doors render it with `Display`).
    pub fn message_parts(&self, mut part: impl FnMut(Part<'_>)) {
        let ReadError::Implausible { value, unit, plausible, default, alternatives, .. } = *self else {
            return;
        };
        let below = unit.to_si(value) < plausible.min_si;
        part(Part::Number(value));
        part(Part::Text(" "));
        part(Part::Text(unit.symbol()));
        part(Part::Text(if below { " is below any " } else { " is above any " }));
        part(Part::Text(plausible.what));
        part(Part::Text(" ("));
        part(Part::Number(default.from_si(plausible.min_si)));
        part(Part::Text(" to "));
        part(Part::Number(default.from_si(plausible.max_si)));
        part(Part::Text(" "));
        part(Part::Text(default.symbol()));
        part(Part::Text(")"));
        for (i, alternative) in alternatives.iter().flatten().enumerate() {
            part(Part::Text(if i == 0 { "; write " } else { ", or " }));
            part(Part::Number(value));
            part(Part::Text(alternative.symbol()));
            let converted = default.from_si(alternative.to_si(value));
            if i == 0 {
                part(Part::Text(" or "));
                part(Part::Number(converted));
                part(Part::Text(default.symbol()));
            } else {
                part(Part::Text(" ("));
                part(Part::Number(converted));
                part(Part::Text(" "));
                part(Part::Text(default.symbol()));
                part(Part::Text(")"));
            }
        }
    }
}

/// A number with about six significant digits, no trailing zeros, plain between 1e-4 and
/// 1e9 and in exponent form outside (`263.706`, `102000`, `1.5e-7`).
pub struct Tidy(pub f64);

impl fmt::Display for Tidy {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let x = self.0;
        let magnitude = x.abs();
        if x == 0.0 || !x.is_finite() {
            return write!(f, "{x}");
        }
        if !(1e-4..1e9).contains(&magnitude) {
            return write!(f, "{x:.5e}");
        }
        // Decimals for six significant digits: 5 minus the power of ten of the magnitude.
        let mut power = 0i32;
        let mut m = magnitude;
        while m >= 10.0 {
            m /= 10.0;
            power += 1;
        }
        while m < 1.0 {
            m *= 10.0;
            power -= 1;
        }
        let decimals = usize::try_from((5 - power).max(0)).unwrap_or(0);
        let mut buffer = Buffer::default();
        let _ = fmt::write(&mut buffer, format_args!("{x:.decimals$}"));
        let text = buffer.as_str();
        let text = if text.contains('.') { text.trim_end_matches('0').trim_end_matches('.') } else { text };
        f.write_str(text)
    }
}

/// A small stack buffer for [`Tidy`] (no allocation in the core).
struct Buffer {
    bytes: [u8; 48],
    len: usize,
}

impl Default for Buffer {
    fn default() -> Self {
        Self { bytes: [0; 48], len: 0 }
    }
}

impl Buffer {
    fn as_str(&self) -> &str {
        core::str::from_utf8(self.bytes.get(..self.len).unwrap_or(&[])).unwrap_or("")
    }
}

impl fmt::Write for Buffer {
    fn write_str(&mut self, s: &str) -> fmt::Result {
        let end = self.len + s.len();
        let slot = self.bytes.get_mut(self.len..end).ok_or(fmt::Error)?;
        slot.copy_from_slice(s.as_bytes());
        self.len = end;
        Ok(())
    }
}

impl fmt::Display for ReadError<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if let ReadError::Unit(error) = self {
            return write!(f, "{error}");
        }
        let mut result = Ok(());
        self.message_parts(|part| {
            if result.is_ok() {
                result = match part {
                    Part::Text(text) => f.write_str(text),
                    Part::Number(value) => write!(f, "{}", Tidy(value)),
                };
            }
        });
        result
    }
}

impl core::error::Error for ReadError<'_> {}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::*;

    #[test]
    fn plausible_values_pass_whatever_their_unit() {
        for text in ["288.15", "15C", "59F", "518.67R", "-56.5C"] {
            assert!(read(text, &KELVIN, &Plausible::AIR_TEMPERATURE).is_ok(), "{text}");
        }
        for text in ["101325", "1013.25hPa", "29.92inHg", "101.3kPa", "760mmHg", "1013mbar"] {
            assert!(read(text, &PASCAL, &Plausible::SEA_LEVEL_PRESSURE).is_ok(), "{text}");
        }
        assert!(
            (read("+27F", &KELVIN_DIFFERENCE, &Plausible::TEMPERATURE_OFFSET).unwrap().si() - 15.0).abs()
                < 1e-13
        );
    }

    #[test]
    fn implausible_bare_numbers_name_the_fix() {
        let message =
            |text: &str, unit: &'static Unit, p: &Plausible| read(text, unit, p).unwrap_err().to_string();
        assert_eq!(
            message("15", &KELVIN, &Plausible::AIR_TEMPERATURE),
            "15 K is below any air temperature (120 to 350 K); write 15degC or 288.15K, or 15degF (263.706 K)"
        );
        assert_eq!(
            message("1020", &PASCAL, &Plausible::SEA_LEVEL_PRESSURE),
            "1020 Pa is below any sea-level pressure (85000 to 110000 Pa); write 1020hPa or 102000Pa, or 1020mbar (102000 Pa)"
        );
        assert_eq!(
            message("29.92", &PASCAL, &Plausible::SEA_LEVEL_PRESSURE),
            "29.92 Pa is below any sea-level pressure (85000 to 110000 Pa); write 29.92inHg or 101321Pa"
        );
        // An explicit unit is the person's word: refused, with no guess at another unit.
        assert_eq!(
            message("15K", &KELVIN, &Plausible::AIR_TEMPERATURE),
            "15 K is below any air temperature (120 to 350 K)"
        );
        assert_eq!(
            message("288", &KELVIN_DIFFERENCE, &Plausible::TEMPERATURE_OFFSET),
            "288 K is above any day's offset from the standard temperature (-100 to 100 K)"
        );
        assert!(matches!(read("abc", &KELVIN, &Plausible::AIR_TEMPERATURE), Err(ReadError::Unit(_))));
    }

    #[test]
    fn tidy_numbers() {
        let tidy = |x: f64| std::format!("{}", Tidy(x));
        assert_eq!(tidy(263.705_555_555_6), "263.706");
        assert_eq!(tidy(102_000.0), "102000");
        assert_eq!(tidy(288.15), "288.15");
        assert_eq!(tidy(-100.0), "-100");
        assert_eq!(tidy(1.5e-7), "1.50000e-7");
        assert_eq!(tidy(0.0), "0");
    }
}
