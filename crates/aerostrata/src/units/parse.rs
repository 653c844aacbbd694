//! The one parser of "value + unit" text (`15C`, `1020hPa`, `35000 ft`), and its errors.

use core::fmt::{self, Write as _};

use super::{Dimension, Unit};

/// A number read from text, with the unit it was written in.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Reading {
    /// The number as written.
    pub value: f64,
    /// The unit it was written in: the one spelled after it, or the default.
    pub unit: &'static Unit,
    /// Whether the text spelled the unit (`false`: the default unit was assumed).
    pub explicit: bool,
}

impl Reading {
    /// The value in SI.
    pub fn si(&self) -> f64 {
        self.unit.to_si(self.value)
    }
}

/// Why a text is not a value with a unit. Messages quote the text (cut to 40
/// characters) and say what would be read.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum UnitError<'a> {
    /// Nothing but white space.
    Empty,
    /// The text does not start with a decimal number.
    NotANumber {
        /// The text.
        text: &'a str,
    },
    /// The number overflows or is not finite.
    NotFinite {
        /// The text.
        text: &'a str,
    },
    /// A comma follows the number: a decimal comma or a thousands separator.
    Separator {
        /// The text.
        text: &'a str,
    },
    /// The unit after the number is not one of the dimension's.
    UnknownUnit {
        /// The unit as written.
        unit: &'a str,
        /// What was expected.
        dimension: Dimension,
    },
    /// The unit after the number measures something else.
    WrongDimension {
        /// The unit as written.
        unit: &'a str,
        /// What it measures.
        actual: Dimension,
        /// What was expected.
        expected: Dimension,
    },
}

/// At most `max` characters of `text`, and whether it was cut.
pub fn shorten(text: &str, max: usize) -> (&str, bool) {
    match text.char_indices().nth(max) {
        // `get`, not indexing: no panic path (and no formatting machinery) is linked in.
        Some((end, _)) => (text.get(..end).unwrap_or(text), true),
        None => (text, false),
    }
}

/// Text as a person typed it, for a message: cut to 40 characters (`...` after a cut) and
/// with control characters written as escapes (`\t`, `\n`, `\r`, `\u{1}`), so that an
/// echoed cell or heading can neither flood nor garble a terminal.
pub struct Escaped<'a>(pub &'a str);

impl fmt::Display for Escaped<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        // Control characters written as escapes, the rest as typed (no `escape_debug`: its
        // Unicode tables would cost the size-budgeted WebAssembly module 4 KiB). The cut
        // counts what is written, escapes included, so that a run of control characters
        // cannot make the echo seven times longer.
        const SHOWN: usize = 40;
        let mut written = 0;
        let mut buffer = [0u8; 12];
        for c in self.0.chars() {
            let piece: &str = match c {
                '\t' => "\\t",
                '\n' => "\\n",
                '\r' => "\\r",
                c if c.is_control() => {
                    let mut out = Cursor { buffer: &mut buffer, len: 0 };
                    write!(out, "\\u{{{:x}}}", u32::from(c))?;
                    let len = out.len;
                    core::str::from_utf8(&buffer[..len]).unwrap_or("?")
                }
                c => c.encode_utf8(&mut buffer),
            };
            let width = piece.chars().count();
            if written + width > SHOWN {
                return f.write_str("...");
            }
            f.write_str(piece)?;
            written += width;
        }
        Ok(())
    }
}

/// A small buffer to format an escape into.
struct Cursor<'a> {
    buffer: &'a mut [u8],
    len: usize,
}

impl fmt::Write for Cursor<'_> {
    fn write_str(&mut self, text: &str) -> fmt::Result {
        let end = self.len + text.len();
        let slot = self.buffer.get_mut(self.len..end).ok_or(fmt::Error)?;
        slot.copy_from_slice(text.as_bytes());
        self.len = end;
        Ok(())
    }
}

/// [`Escaped`] text in single quotes.
pub struct Quoted<'a>(pub &'a str);

impl fmt::Display for Quoted<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "'{}'", Escaped(self.0))
    }
}

/// The symbols of a dimension's units, for "write one of ..." hints.
pub struct UnitList(pub Dimension);

impl fmt::Display for UnitList {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let mut units = self.0.units().peekable();
        let mut first = true;
        while let Some(unit) = units.next() {
            let separator = match (first, units.peek().is_some()) {
                (true, _) => "",
                (false, true) => ", ",
                (false, false) => " or ",
            };
            write!(f, "{separator}{}", unit.symbol)?;
            first = false;
        }
        Ok(())
    }
}

impl fmt::Display for UnitError<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match *self {
            UnitError::Empty => f.write_str("no value given"),
            UnitError::NotANumber { text } => write!(f, "{} is not a number", Quoted(text)),
            UnitError::NotFinite { text } => write!(f, "{} is not a finite number", Quoted(text)),
            UnitError::Separator { text } => write!(
                f,
                "{}: write decimals with a point and no thousands separators (1013.25, not 1013,25 or 1,013)",
                Quoted(text)
            ),
            UnitError::UnknownUnit { unit, dimension } => write!(
                f,
                "unknown unit {} for a {}; write {}",
                Quoted(unit),
                dimension.name(),
                UnitList(dimension)
            ),
            UnitError::WrongDimension { unit, actual, expected } => write!(
                f,
                "{} is a unit of {}, not of {}; write {}",
                Quoted(unit),
                actual.name(),
                expected.name(),
                UnitList(expected)
            ),
        }
    }
}

/// The length of the decimal number that starts `text`: an optional sign, digits with at
/// most one point, and an optional exponent (`e` or `E`, an optional sign, digits; an
/// `e` not followed by digits is not part of the number).
fn number_length(text: &str) -> usize {
    let bytes = text.as_bytes();
    let mut i = 0;
    if matches!(bytes.first(), Some(b'+' | b'-')) {
        i += 1;
    }
    let mut digits = 0;
    let mut point = false;
    while let Some(&b) = bytes.get(i) {
        match b {
            b'0'..=b'9' => digits += 1,
            b'.' if !point => point = true,
            _ => break,
        }
        i += 1;
    }
    if digits == 0 {
        return 0;
    }
    if matches!(bytes.get(i), Some(b'e' | b'E')) {
        let mut j = i + 1;
        if matches!(bytes.get(j), Some(b'+' | b'-')) {
            j += 1;
        }
        let start = j;
        while matches!(bytes.get(j), Some(b'0'..=b'9')) {
            j += 1;
        }
        if j > start {
            i = j;
        }
    }
    i
}

/// Reads `text` as a number of `dimension`, followed by an optional unit (`15C`,
/// `15 degC`, `288.15K`, `1020hPa`, `29.92inHg`, `35000ft`); a bare number is in
/// `default`. Surrounding white space is ignored, and so is white space between the
/// number and the unit. The one parser every door uses.
///
/// # Errors
/// [`UnitError`]: no number, a number that is not finite, a comma after the number, a unit
/// that is unknown or of another dimension.
///
/// ```
/// use aerostrata::units::{parse, Dimension, KELVIN, HECTOPASCAL, PASCAL};
/// let t = parse("15C", Dimension::Temperature, &KELVIN)?;
/// assert_eq!(t.si(), 288.15);
/// assert!(t.explicit);
/// assert_eq!(parse("1020hPa", Dimension::Pressure, &PASCAL)?.si(), 102_000.0);
/// assert_eq!(parse(" 1020 ", Dimension::Pressure, &HECTOPASCAL)?.si(), 102_000.0);
/// # Ok::<(), aerostrata::units::UnitError>(())
/// ```
pub fn parse<'a>(
    text: &'a str,
    dimension: Dimension,
    default: &'static Unit,
) -> Result<Reading, UnitError<'a>> {
    match plain_number(text) {
        Some(value) => Ok(Reading { value, unit: default, explicit: false }),
        None => parse_in_full(text, dimension, default),
    }
}

/// The value of `text` when it is nothing but a finite decimal number (`-12.5`, `3e4`,
/// `.5`, `7.`): the cell of a table in its column's unit, read for every row, so without
/// the trimming and the search for a unit that [`parse_in_full`] does. The same value:
/// `str::parse` accepts exactly [`number_length`]'s numbers plus `inf`, `infinity` and
/// `nan` (Rust's `f64::from_str` grammar), which end in a letter and are left out here,
/// and a number not finite goes the full way to its error.
fn plain_number(text: &str) -> Option<f64> {
    let bytes = text.as_bytes();
    let starts = matches!(bytes.first(), Some(b'0'..=b'9' | b'.' | b'+' | b'-'));
    let ends = matches!(bytes.last(), Some(b'0'..=b'9' | b'.'));
    if !(starts && ends) {
        return None;
    }
    text.parse::<f64>().ok().filter(|value| value.is_finite())
}

/// [`parse`] the full way: trimmed, the number's extent found, a unit after it looked up.
fn parse_in_full<'a>(
    text: &'a str,
    dimension: Dimension,
    default: &'static Unit,
) -> Result<Reading, UnitError<'a>> {
    let text = text.trim();
    if text.is_empty() {
        return Err(UnitError::Empty);
    }
    let length = number_length(text);
    if length == 0 {
        return Err(UnitError::NotANumber { text });
    }
    let (number, rest) = text.split_at_checked(length).ok_or(UnitError::NotANumber { text })?;
    let value: f64 = number.parse().map_err(|_| UnitError::NotANumber { text })?;
    if !value.is_finite() {
        return Err(UnitError::NotFinite { text });
    }
    let rest = rest.trim_start();
    if rest.starts_with(',') {
        return Err(UnitError::Separator { text });
    }
    if rest.is_empty() {
        return Ok(Reading { value, unit: default, explicit: false });
    }
    match Unit::find(rest, dimension) {
        Some(unit) => Ok(Reading { value, unit, explicit: true }),
        None => Err(match Unit::find_any(rest) {
            Some(other) => {
                UnitError::WrongDimension { unit: rest, actual: other.dimension, expected: dimension }
            }
            None => UnitError::UnknownUnit { unit: rest, dimension },
        }),
    }
}

impl core::error::Error for UnitError<'_> {}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::{FOOT, METRE};
    use proptest::prelude::*;

    /// The fast path and the full way agree on every text, value and error alike; and
    /// where `str::parse` reads a finite number from a text of digits, signs, points and
    /// exponents, `parse` reads the same bits (common practice, no source: Rust's float
    /// parser is correctly rounded, and the fast path must not change a result).
    fn agrees(text: &str) {
        let fast = parse(text, Dimension::Length, &FOOT);
        let full = parse_in_full(text, Dimension::Length, &FOOT);
        match (fast, full) {
            (Ok(a), Ok(b)) => {
                assert_eq!(a.value.to_bits(), b.value.to_bits(), "{text:?}");
                assert_eq!((a.unit, a.explicit), (b.unit, b.explicit), "{text:?}");
            }
            (a, b) => assert_eq!(a, b, "{text:?}"),
        }
        if let Ok(value) = text.parse::<f64>() {
            if value.is_finite() && text.bytes().all(|b| b"0123456789+-.eE".contains(&b)) {
                let read = parse(text, Dimension::Length, &METRE).unwrap();
                assert_eq!(read.value.to_bits(), value.to_bits(), "{text:?}");
            }
        }
    }

    #[test]
    fn the_fast_path_reads_what_the_full_way_reads() {
        for text in [
            "0",
            "-0",
            "+0",
            "12",
            "-12.5",
            "3e4",
            "3E-4",
            ".5",
            "7.",
            "+.5",
            "-.5e+3",
            "1e308",
            "1e309",
            "-1e309",
            "1e-400",
            "4.9e-324",
            "2.2250738585072011e-308",
            "9007199254740993",
            "0.1000000000000000055511151231257827",
            "1.7976931348623157e308",
            "inf",
            "-inf",
            "NaN",
            "infinity",
            "+nan",
            ".",
            "-",
            "+",
            "e5",
            "1e",
            "1e+",
            "1.2.3",
            "1..2",
            "--1",
            "1-",
            " 12",
            "12 ",
            "12ft",
            "12 ft",
            "1,5",
            "1_000",
            "0x10",
            "١٢",
            "",
        ] {
            agrees(text);
        }
    }

    proptest! {
        #[test]
        fn the_fast_path_agrees_on_number_like_text(text in "[-+]?[0-9]{0,20}[.]?[0-9]{0,20}([eE][-+]?[0-9]{1,4})?") {
            agrees(&text);
        }

        #[test]
        fn the_fast_path_agrees_on_any_short_text(text in "[-+.eE0-9 a-z,]{0,12}") {
            agrees(&text);
        }

        #[test]
        fn every_finite_f64_written_by_std_reads_back(bits in any::<u64>()) {
            let value = f64::from_bits(bits);
            prop_assume!(value.is_finite());
            for text in [format!("{value}"), format!("{value:e}"), format!("{value:E}")] {
                agrees(&text);
                prop_assert_eq!(parse(&text, Dimension::Length, &METRE).unwrap().value.to_bits(), bits);
            }
        }
    }
}
