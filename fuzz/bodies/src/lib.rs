//! The bodies of aerostrata's fuzz targets: one plain function per parser and one for the
//! C library, so that libFuzzer (through `../fuzz_targets`, on nightly) and a stable
//! `cargo test` (replaying `../corpus`) run the same code. Each body asserts the
//! robustness promises of docs/robustness.md: no panic, every value read or computed
//! finite, every error message short and free of control characters.

use core::fmt::Display;

pub mod c_abi;
pub mod flight_table;
pub mod model_spec;
pub mod sounding_csv;
pub mod sounding_json;
pub mod table;
pub mod units;
pub mod winds_csv;

/// A target's body.
pub type Body = fn(&[u8]);

/// Every target by name (the corpus folder's and the fuzz binary's), for the replay test.
pub const TARGETS: &[(&str, Body)] = &[
    ("units", units::run),
    ("model_spec", model_spec::run),
    ("table", table::run),
    ("flight_table", flight_table::run),
    ("sounding_csv", sounding_csv::run),
    ("winds_csv", winds_csv::run),
    ("sounding_json", sounding_json::run),
    ("c_abi", c_abi::run),
];

/// The longest error message any door may print, in characters: a message quotes at
/// most a few cells of 40 characters each (the core shortens them), so anything longer
/// echoes input it should have cut (common practice, no source).
pub const MAX_MESSAGE_CHARS: usize = 600;

/// Asserts that `value`, read or computed as `what`, is finite.
#[track_caller]
pub fn finite(what: &str, value: f64) {
    assert!(value.is_finite(), "{what} = {value} is not finite");
}

/// Asserts that an error's message is not empty, at most [`MAX_MESSAGE_CHARS`] long, and
/// free of control characters (a terminal or a log shows it as it is).
#[track_caller]
pub fn message(error: &impl Display) {
    checked_text(&error.to_string());
}

/// As [`message`], for a message already written out.
#[track_caller]
pub fn checked_text(text: &str) {
    assert!(!text.trim().is_empty(), "an empty error message");
    let count = text.chars().count();
    if !open_finding("long-messages") {
        assert!(count <= MAX_MESSAGE_CHARS, "an error message of {count} characters: {text:?}");
    }
    if !open_finding("control-characters") {
        assert!(!text.chars().any(char::is_control), "a control character in the error message {text:?}");
    }
}

/// Whether the open finding `id` (of `fuzz/crashes-open/known.txt`) is tolerated in this
/// run: `cargo xtask fuzz` lists them in `AEROSTRATA_FUZZ_OPEN` for its libFuzzer runs,
/// so that a known failure does not stop a target in its first second and hide what lies
/// behind it. The corpus replay sets nothing and stays strict.
pub fn open_finding(id: &str) -> bool {
    static OPEN: std::sync::OnceLock<String> = std::sync::OnceLock::new();
    OPEN.get_or_init(|| std::env::var("AEROSTRATA_FUZZ_OPEN").unwrap_or_default())
        .split(',')
        .any(|open| open.trim() == id)
}

/// The input as text: a fuzz input that is not UTF-8 is cut at its first bad byte (the
/// doors read `&str`; decoding is their reader's business, not the parser's).
pub fn text(data: &[u8]) -> &str {
    match core::str::from_utf8(data) {
        Ok(text) => text,
        Err(e) => core::str::from_utf8(&data[..e.valid_up_to()]).unwrap_or_default(),
    }
}

/// Altitudes at which a model that was read is evaluated: across the standard's range and
/// past both ends, so that a table's edges and what it does beyond them are exercised.
pub const PROBE_ALTITUDES_M: [f64; 10] =
    [-6_000.0, -5_000.0, 0.0, 500.0, 1_500.0, 11_000.0, 20_000.0, 47_000.0, 86_000.0, 500_000.0];

/// Evaluates `model` at every probe altitude (geometric and geopotential) and at `extra`:
/// an error is fine (with a good message), a state must have every property it carries
/// finite.
pub fn probe(model: &impl aerostrata::Atmosphere, extra: &[f64]) {
    use aerostrata::{Altitude, Quantity};
    for &meters in PROBE_ALTITUDES_M.iter().chain(extra) {
        for altitude in [Altitude::geometric_m(meters), Altitude::geopotential_m(meters)] {
            let altitude = match altitude {
                Ok(altitude) => altitude,
                Err(e) => {
                    message(&e);
                    continue;
                }
            };
            match model.state(altitude) {
                Ok(state) => {
                    for &quantity in Quantity::ALL {
                        match state.get(quantity) {
                            Ok(value) => finite(quantity.info().label, value),
                            Err(e) => message(&e),
                        }
                    }
                }
                Err(e) => message(&e),
            }
        }
    }
}

/// Reads a fuzz input as a sequence of choices: bytes, small numbers, doubles that are
/// often ones a parser or a model treats specially, and strings.
pub struct Bytes<'a> {
    data: &'a [u8],
}

/// Doubles that sit on an edge somewhere: zero of both signs, the non-finite ones, the
/// extremes, and the standard's sea level and layer bases (common practice, no source).
const SPECIAL: [f64; 24] = [
    0.0,
    -0.0,
    1.0,
    -1.0,
    f64::NAN,
    f64::INFINITY,
    f64::NEG_INFINITY,
    f64::MIN_POSITIVE,
    f64::MAX,
    f64::MIN,
    1e-300,
    5e-324,
    288.15,
    101_325.0,
    1.225,
    8_500.0,
    11_000.0,
    20_000.0,
    86_000.0,
    -5_000.0,
    1_000_000.0,
    0.5,
    340.0,
    1.4,
];

impl<'a> Bytes<'a> {
    /// A reader over `data`.
    pub fn new(data: &'a [u8]) -> Self {
        Self { data }
    }

    /// Whether the input is used up.
    pub fn is_empty(&self) -> bool {
        self.data.is_empty()
    }

    /// The next byte (0 once the input is used up).
    pub fn byte(&mut self) -> u8 {
        match self.data.split_first() {
            Some((&first, rest)) => {
                self.data = rest;
                first
            }
            None => 0,
        }
    }

    /// A number below `bound` (at least 1).
    pub fn below(&mut self, bound: usize) -> usize {
        usize::from(self.byte()) % bound.max(1)
    }

    /// A double: a special value, a special value scaled by a small factor, or raw bits.
    pub fn f64(&mut self) -> f64 {
        let tag = self.byte();
        let special = SPECIAL[usize::from(tag >> 2) % SPECIAL.len()];
        match tag & 3 {
            0 | 1 => special,
            2 => special * (f64::from(self.byte()) - 128.0) / 16.0,
            _ => {
                let mut bits = [0u8; 8];
                for b in &mut bits {
                    *b = self.byte();
                }
                f64::from_le_bytes(bits)
            }
        }
    }

    /// A string of up to 255 bytes, cut at its first byte that is not UTF-8.
    pub fn str(&mut self) -> &'a str {
        let length = usize::from(self.byte()).min(self.data.len());
        let (head, rest) = self.data.split_at(length);
        self.data = rest;
        text(head)
    }

    /// What is left, as text.
    pub fn rest(&mut self) -> &'a str {
        let rest = self.data;
        self.data = &[];
        text(rest)
    }
}

/// Asserts that no number in `record`'s `Debug` text is NaN or infinite: a check of every
/// field of a record of numbers (a flight summary) without naming each.
#[track_caller]
pub fn all_finite(what: &str, record: &impl core::fmt::Debug) {
    let shown = format!("{record:?}");
    let bad = shown
        .split(|c: char| !(c.is_ascii_alphanumeric() || c == '_'))
        .any(|word| word == "NaN" || word == "inf");
    assert!(!bad, "{what} has a number that is not finite: {shown}");
}
