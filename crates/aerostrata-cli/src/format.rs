//! Every number the tool writes as text, in one place: exact digits for data that other
//! programs read back (CSV, JSON), rounded styles for people (tables, summaries), and tidy
//! short forms for messages and plots. The rounded and tidy forms are one rule with
//! different settings: so many significant digits written plainly within a band of
//! decimal magnitudes, an exponent form outside it.

use std::ops::Range;

use aerostrata::quantity::Rounding;

/// The shortest decimal that reads back to `value` exactly; exponent form for very large
/// or small magnitudes. The text is std's (`{value}` or `{value:e}`), its digits found by
/// the Ryu method (the `ryu` crate) several times faster than std's.
pub fn exact(value: f64) -> String {
    let mut out = Vec::with_capacity(24);
    write_exact(&mut out, value);
    String::from_utf8(out).unwrap_or_default()
}

/// Appends [`exact`]'s text of `value` to `out`, allocating nothing once `out` has room.
pub fn write_exact(out: &mut Vec<u8>, value: f64) {
    let magnitude = value.abs();
    if !value.is_finite() || magnitude == 0.0 {
        // `NaN`, `inf`, `0` and `-0` as std writes them (rare: std's own code is fine).
        use std::io::Write as _;
        let _ = write!(out, "{value}");
        return;
    }
    let mut buffer = ryu::Buffer::new();
    let text = buffer.format_finite(magnitude);
    // A tie (see `is_midpoint`) is a multiple of 2^-25: most values are not, and for them
    // Ryu's text is written as it is where it is std's.
    let maybe_tie = (magnitude * 33_554_432.0).fract() == 0.0;
    if (1e-3..1e7).contains(&magnitude) && !maybe_tie {
        // Here Ryu's text is std's but for an integer's `.0`.
        if value < 0.0 {
            out.push(b'-');
        }
        let text = text.strip_suffix(".0").unwrap_or(text);
        out.extend_from_slice(text.as_bytes());
        return;
    }
    if magnitude < 1e-3 && !maybe_tie && text.contains('e') {
        // Ryu's exponent form (below 1e-5) is std's `{:e}`.
        if value < 0.0 {
            out.push(b'-');
        }
        out.extend_from_slice(text.as_bytes());
        return;
    }
    let (mut digits, mut count, mut point) = shortest(text);
    // Ryu breaks a tie between two shortest candidates to the even one, std upwards
    // (233115890514796.125 is ...612 to Ryu, ...613 to std): std's text is kept.
    // A tie needs 16 or 17 digits (shorter candidates are too far apart to both read
    // back) and an even last digit (Ryu's pick). Found by the random test: ties happen
    // at any magnitude (2734526.49267578125 is ...812 to Ryu, ...813 to std).
    if count >= 16 && digits[count - 1] % 2 == 0 && is_midpoint(magnitude, &digits[..count], point) {
        (count, point) = round_up(&mut digits, count, point);
    }
    let digits = &digits[..count];
    if value < 0.0 {
        out.push(b'-');
    }
    if (1e-3..1e7).contains(&magnitude) {
        // Plain: value = 0.DIGITS x 10^point, written without exponent or trailing `.0`.
        match usize::try_from(point) {
            Err(_) | Ok(0) => {
                out.extend_from_slice(b"0.");
                out.extend(std::iter::repeat_n(b'0', point.unsigned_abs() as usize));
                out.extend_from_slice(digits);
            }
            Ok(p) if p >= count => {
                out.extend_from_slice(digits);
                out.extend(std::iter::repeat_n(b'0', p - count));
            }
            Ok(p) => {
                out.extend_from_slice(&digits[..p]);
                out.push(b'.');
                out.extend_from_slice(&digits[p..]);
            }
        }
    } else {
        // D[.DDD]eX as std's `{:e}` writes it.
        out.push(digits[0]);
        if count > 1 {
            out.push(b'.');
            out.extend_from_slice(&digits[1..]);
        }
        out.push(b'e');
        let exponent = point - 1;
        if exponent < 0 {
            out.push(b'-');
        }
        let mut text = [0u8; 4];
        let mut n = exponent.unsigned_abs();
        let mut at = text.len();
        loop {
            at -= 1;
            text[at] = b'0' + (n % 10) as u8;
            n /= 10;
            if n == 0 {
                break;
            }
        }
        out.extend_from_slice(&text[at..]);
    }
}

/// Whether positive `value` is exactly halfway between 0.DIGITS x 10^point and the
/// next decimal of as many digits (the decimal DIGITS5 at one place further), compared
/// in integers: value = m 2^q against N 10^j.
fn is_midpoint(value: f64, digits: &[u8], point: i32) -> bool {
    let bits = value.to_bits();
    let exponent_bits = ((bits >> 52) & 0x7ff) as i32;
    let fraction = bits & ((1 << 52) - 1);
    let (m, q) =
        if exponent_bits == 0 { (fraction, -1074) } else { (fraction | 1 << 52, exponent_bits - 1075) };
    let j = point - digits.len() as i32 - 1;
    // m 2^q = N 10^j needs 5^-j dividing N < 10^18 (j >= -25) or 5^j dividing m < 2^53
    // (j <= 22); in that band neither side below overflows for a true tie.
    if !(-25..=22).contains(&j) {
        return false;
    }
    let mut n: u128 = 0;
    for d in digits.iter().chain(b"5") {
        n = n * 10 + u128::from(d - b'0');
    }
    let scaled = |base: u128, twos: i32, fives: i32| -> Option<u128> {
        let mut x = base.checked_mul(5u128.checked_pow(fives.max(0).try_into().ok()?)?)?;
        let twos: u32 = twos.max(0).try_into().ok()?;
        if twos >= 128 || x.leading_zeros() < twos {
            return None;
        }
        x <<= twos;
        Some(x)
    };
    // m 2^q = N 2^j 5^j, each side's negative powers moved to the other.
    match (scaled(u128::from(m), q - j, -j), scaled(n, j - q, j)) {
        (Some(left), Some(right)) => left == right,
        _ => false,
    }
}

/// DIGITS plus one in the last place (a carry may add a digit, moving the point).
fn round_up(digits: &mut [u8; 32], count: usize, point: i32) -> (usize, i32) {
    for i in (0..count).rev() {
        if digits[i] == b'9' {
            digits[i] = b'0';
        } else {
            digits[i] += 1;
            let mut count = count;
            while count > 1 && digits[count - 1] == b'0' {
                count -= 1;
            }
            return (count, point);
        }
    }
    digits[0] = b'1';
    (1, point + 1)
}

/// The significant digits of a positive number's shortest text (`1.25e-7`, `123.0`,
/// `0.001`, as `ryu` writes it), leading and trailing zeros dropped, with their count
/// and the decimal point's place: the number is 0.DIGITS x 10^point.
fn shortest(text: &str) -> ([u8; 32], usize, i32) {
    let bytes = text.as_bytes();
    let (mantissa, exponent) = match bytes.iter().position(|b| *b == b'e' || *b == b'E') {
        Some(at) => {
            let (negative, digits) = match &bytes[at + 1..] {
                [b'-', rest @ ..] => (true, rest),
                [b'+', rest @ ..] => (false, rest),
                rest => (false, rest),
            };
            let magnitude = digits.iter().fold(0i32, |e, d| e * 10 + i32::from(d.wrapping_sub(b'0')));
            (&bytes[..at], if negative { -magnitude } else { magnitude })
        }
        None => (bytes, 0),
    };
    let (whole, fraction): (&[u8], &[u8]) = match mantissa.iter().position(|b| *b == b'.') {
        Some(at) => (&mantissa[..at], &mantissa[at + 1..]),
        None => (mantissa, &[]),
    };
    let mut digits = [0u8; 32];
    let count = (whole.len() + fraction.len()).min(digits.len());
    let split = whole.len().min(count);
    digits[..split].copy_from_slice(&whole[..split]);
    digits[split..count].copy_from_slice(&fraction[..count - split]);
    let lead = digits[..count].iter().take_while(|d| **d == b'0').count().min(count.saturating_sub(1));
    digits.copy_within(lead..count, 0);
    let mut count = count - lead;
    while count > 1 && digits[count - 1] == b'0' {
        count -= 1;
    }
    (digits, count, whole.len() as i32 + exponent - lead as i32)
}

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

    /// std's text (`{}` within 1e-3..1e7, `{:e}` outside), which is the shortest that
    /// reads back (from memory of std's float formatting), is the reference: the fast
    /// formatter must give it byte for byte, over random bit patterns (every exponent)
    /// and random values of the magnitudes the tool prints.
    #[test]
    fn the_fast_formatter_writes_std_text() {
        let reference = |value: f64| {
            let magnitude = value.abs();
            if magnitude != 0.0 && !(1e-3..1e7).contains(&magnitude) {
                format!("{value:e}")
            } else {
                format!("{value}")
            }
        };
        let mut state = 0x9e37_79b9_7f4a_7c15_u64;
        let mut next = move || {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            state
        };
        let mut checked = 0;
        let edges = [
            0.0,
            -0.0,
            1e-3,
            1e7,
            9_999_999.999_999_998,
            0.000_999_999_999_999_999_9,
            5e-324,
            f64::MAX,
            f64::MIN_POSITIVE,
            1.0,
            0.1,
            100.0,
            1e22,
            1e23,
            123_456.789,
            f64::NAN,
            f64::INFINITY,
            -f64::INFINITY,
        ];
        for value in edges {
            assert_eq!(exact(value), reference(value), "{value:?}");
        }
        for _ in 0..100_000 {
            let bits = next();
            let from_bits = f64::from_bits(bits);
            // A value of a typical size: 1e-9 to 1e9 with a random mantissa.
            let scaled = (next() >> 11) as f64 / (1u64 << 53) as f64 * 10f64.powi((next() % 19) as i32 - 9);
            // A short decimal, as input files hold them (altitudes in steps of 0.1 m).
            let short = (next() % 10_000_000) as f64 / 10.0;
            // An odd integer over a power of two: an exact binary fraction with many decimal
            // digits, where two shortest candidates can tie (11718750.0009765625).
            let dyadic = ((next() >> (11 + next() % 30)) | 1) as f64 / (1u64 << (next() % 60)) as f64;
            for value in [from_bits, scaled, -scaled, short, dyadic] {
                assert_eq!(exact(value), reference(value), "{value:?} (bits {:#x})", value.to_bits());
                checked += 1;
            }
        }
        assert_eq!(checked, 500_000);
    }

    #[test]
    fn exact_round_trips() {
        for value in [101_325.0, 1.0 / 3.0, 6.6e-8, 2.547e25, -5000.0, 0.0, 1e-3, 9_999_999.5] {
            assert_eq!(exact(value).parse::<f64>().unwrap(), value);
        }
    }
}
