//! Exact numbers for data that other programs read back (CSV, JSON): the shortest decimal
//! that reads back to the same f64, in std's text (`{}` from 1e-3 to 1e7, `{:e}` outside),
//! written fast: the digits by the Schubfach method (the `zmij` crate), whole numbers by
//! the `itoa` crate, and std's rule for a tie between two shortest candidates kept.

/// The shortest decimal that reads back to `value` exactly; exponent form for very large
/// or small magnitudes. The text is std's (`{value}` or `{value:e}`), found several times
/// faster than std finds it.
pub fn exact(value: f64) -> String {
    let mut out = Vec::with_capacity(24);
    write_exact(&mut out, value);
    String::from_utf8(out).unwrap_or_default()
}

/// Appends [`exact`]'s text of `value` to `out`, allocating nothing once `out` has room.
pub fn write_exact(out: &mut Vec<u8>, value: f64) {
    let magnitude = value.abs();
    if !(1e-3..1e7).contains(&magnitude) {
        return write_outside(out, value);
    }
    if value < 0.0 {
        out.push(b'-');
    }
    let twos = Twos::of(magnitude);
    if twos.v >= 0 {
        // A whole number is its integer's digits in std's text (no `.0`).
        out.extend_from_slice(itoa::Buffer::new().format(magnitude as u64).as_bytes());
        return;
    }
    let mut buffer = zmij::Buffer::new();
    let text = buffer.format_finite(magnitude).as_bytes();
    if twos.may_tie(text) {
        return write_digits(out, magnitude, text, true);
    }
    // zmij writes 1e-5 to 1e16 plainly, as std does, and a fraction never ends in `.0`.
    out.extend_from_slice(text);
}

/// [`write_exact`] outside 1e-3 to 1e7: std's `{:e}`, and `NaN`, `inf`, `0` and `-0`.
fn write_outside(out: &mut Vec<u8>, value: f64) {
    let magnitude = value.abs();
    if !value.is_finite() || magnitude == 0.0 {
        // As std writes them (rare: std's own code is fine).
        use std::io::Write as _;
        let _ = write!(out, "{value}");
        return;
    }
    if value < 0.0 {
        out.push(b'-');
    }
    let mut buffer = zmij::Buffer::new();
    let text = buffer.format_finite(magnitude).as_bytes();
    if Twos::of(magnitude).may_tie(text) {
        return write_digits(out, magnitude, text, false);
    }
    exponent_form(out, text);
}

/// A positive, finite value as odd x 2^v, read from its bits, with the q of its
/// significand m x 2^q (m of 53 bits); `normal` is false for a subnormal.
struct Twos {
    v: i32,
    q: i32,
    normal: bool,
}

impl Twos {
    fn of(value: f64) -> Self {
        let bits = value.to_bits();
        let exponent_bits = ((bits >> 52) & 0x7ff) as i32;
        let significand = (bits & ((1 << 52) - 1)) | 1 << 52;
        let q = exponent_bits - 1075;
        Twos { v: q + significand.trailing_zeros() as i32, q, normal: exponent_bits != 0 }
    }

    /// Whether zmij's `text` of the value may be a tie between two shortest candidates
    /// (see [`is_midpoint`]); most values cannot be, which their bits show. A tie needs 16
    /// or 17 digits (shorter candidates are too far apart to both read back), and the
    /// midpoint DIGITS5 x 10^j is an odd number times 10^j, so that value = odd x 2^j: j
    /// is v, and j = E - digits with E the decimal exponent. E lies within the decimal
    /// exponents of 2^(q+52) and 2^(q+53) that bound the value; one more each way for
    /// safety. A subnormal is far below any tie (j >= -25).
    fn may_tie(&self, text: &[u8]) -> bool {
        // floor(n log10 2) as (n 78913) >> 18, exact for |n| < 1650 (from memory of Ryu's
        // log10Pow2).
        let (e_low, e_high) = (((self.q + 52) * 78_913) >> 18, ((self.q + 53) * 78_913) >> 18);
        text.len() > 16 && self.normal && (e_low - 18..=e_high - 15).contains(&self.v)
    }
}

/// zmij's text of a magnitude below 1e-3 or from 1e7 (`0.0000123`, `12345678.9`,
/// `1.5e-6`, `2.5e+25`) in std's `{:e}` form (`1.23e-5`, `1.23456789e7`, `1.5e-6`,
/// `2.5e25`), the digits as they are.
fn exponent_form(out: &mut Vec<u8>, text: &[u8]) {
    // An exponent (zmij's form below 1e-5 and from 1e16) ends the text: `e-5` to `e+308`.
    let tail = text.len().saturating_sub(5);
    if let Some(at) = text[tail..].iter().position(|b| *b == b'e') {
        // std's form but for the `+`.
        let (mantissa, exponent) = text.split_at(tail + at);
        out.extend_from_slice(mantissa);
        match exponent {
            [b'e', b'+', digits @ ..] => {
                out.push(b'e');
                out.extend_from_slice(digits);
            }
            exponent => out.extend_from_slice(exponent),
        }
        return;
    }
    let Some(point) = text.iter().position(|b| *b == b'.') else {
        return out.extend_from_slice(text);
    };
    let (whole, fraction) = (&text[..point], &text[point + 1..]);
    let exponent = if whole == b"0" {
        // 0.000DDD: D.DDe-N, N one more than the zeros after the point.
        let zeros = fraction.iter().take_while(|b| **b == b'0').count();
        let (first, rest) = fraction[zeros..].split_first().unwrap_or((&b'0', &[]));
        write_mantissa(out, *first, &[], rest);
        out.extend_from_slice(b"e-");
        zeros + 1
    } else {
        // DDDD.FF: D.DDDFFe(whole digits less one), trailing zeros dropped.
        let fraction = if fraction == b"0" { &[][..] } else { fraction };
        let (first, middle) = whole.split_first().unwrap_or((&b'0', &[]));
        write_mantissa(out, *first, middle, fraction);
        out.push(b'e');
        whole.len() - 1
    };
    out.extend_from_slice(itoa::Buffer::new().format(exponent).as_bytes());
}

/// `first`, then a point and `middle` followed by `last`, the trailing zeros of the two
/// dropped (and the point when nothing is left).
fn write_mantissa(out: &mut Vec<u8>, first: u8, middle: &[u8], last: &[u8]) {
    out.push(first);
    let trim = |digits: &[u8]| digits.len() - digits.iter().rev().take_while(|b| **b == b'0').count();
    let last = &last[..trim(last)];
    let middle = if last.is_empty() { &middle[..trim(middle)] } else { middle };
    if !middle.is_empty() || !last.is_empty() {
        out.push(b'.');
        out.extend_from_slice(middle);
        out.extend_from_slice(last);
    }
}

/// The slow way, for a value that [`may_tie`]: zmij's digits, rounded up where they are
/// the lower of two tied candidates, laid out as std does (`plain` within 1e-3 to 1e7).
fn write_digits(out: &mut Vec<u8>, magnitude: f64, text: &[u8], plain: bool) {
    let (mut digits, mut count, mut point) = shortest(text);
    // Schubfach (as Ryu) breaks a tie between two shortest candidates to the even one,
    // std upwards (233115890514796.125 is ...612 to them, ...613 to std): std's text is
    // kept. Whichever candidate was picked, only the lower one is a midpoint's. Ties
    // happen at any magnitude (2734526.49267578125 is ...812, std's ...813).
    if count >= 16 && is_midpoint(magnitude, &digits[..count], point) {
        (count, point) = round_up(&mut digits, count, point);
    }
    let digits = &digits[..count];
    if plain {
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
        let (first, rest) = digits.split_first().unwrap_or((&b'0', &[]));
        write_mantissa(out, *first, &[], rest);
        out.push(b'e');
        let exponent = point - 1;
        if exponent < 0 {
            out.push(b'-');
        }
        out.extend_from_slice(itoa::Buffer::new().format(exponent.unsigned_abs()).as_bytes());
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

/// The significant digits of a positive number's shortest text (`1.25e-7`, `1.5e+25`,
/// `123.0`, `0.001`, as `zmij` writes it), leading and trailing zeros dropped, with their
/// count and the decimal point's place: the number is 0.DIGITS x 10^point.
fn shortest(text: &[u8]) -> ([u8; 32], usize, i32) {
    let mut digits = [0u8; 32];
    let mut count = 0;
    let mut point = 0i32;
    let mut after_point = false;
    for (i, &byte) in text.iter().enumerate() {
        match byte {
            b'.' => after_point = true,
            b'e' | b'E' => {
                let (negative, exponent) = match text.get(i + 1..).unwrap_or_default() {
                    [b'-', rest @ ..] => (true, rest),
                    [b'+', rest @ ..] => (false, rest),
                    rest => (false, rest),
                };
                let magnitude = exponent.iter().fold(0i32, |e, d| e * 10 + i32::from(d.wrapping_sub(b'0')));
                point += if negative { -magnitude } else { magnitude };
                break;
            }
            // A leading zero: after the point it moves the point.
            b'0' if count == 0 => point -= i32::from(after_point),
            digit => {
                if let Some(slot) = digits.get_mut(count) {
                    *slot = digit;
                    count += 1;
                }
                point += i32::from(!after_point);
            }
        }
    }
    while count > 1 && digits[count - 1] == b'0' {
        count -= 1;
    }
    (digits, count, point)
}

#[cfg(test)]
mod tests {
    use super::*;

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
            // Where zmij's own text changes form (plain from 1e-5 to 1e16), and the
            // integers and zeros around a point that its text gives and std's does not.
            1e-5,
            9.999_999_999_999_999e-6,
            1e16,
            9_999_999_999_999_998.0,
            10_000_000.5,
            12_345_678.0,
            100_000_000_000_000.0,
            0.000_100_000_000_000_000_1,
            -2.5e-4,
            -5.0,
            9_999_999.0,
            -0.001,
            4_503_599_627_370_497.0,
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
            // A whole number, either side of 1e7 and of either sign (written by itoa within
            // the plain band).
            let whole = (next() % 20_000_000) as f64 * if next() % 2 == 0 { 1.0 } else { -1.0 };
            for value in [from_bits, scaled, -scaled, short, dyadic, whole] {
                assert_eq!(exact(value), reference(value), "{value:?} (bits {:#x})", value.to_bits());
                checked += 1;
            }
        }
        assert_eq!(checked, 600_000);
    }

    #[test]
    fn exact_round_trips() {
        for value in [101_325.0, 1.0 / 3.0, 6.6e-8, 2.547e25, -5000.0, 0.0, 1e-3, 9_999_999.5] {
            assert_eq!(exact(value).parse::<f64>().unwrap(), value);
        }
    }
}
