//! Reading numbers the way engineers type them.

use std::fmt;

/// Why a piece of text is not a number.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum NumberError {
    /// Nothing but white space was typed.
    Empty,
    /// The text is not a decimal number.
    NotANumber(String),
    /// A number too large in magnitude to compute with (it would be
    /// infinity in double precision).
    TooLarge(String),
    /// A non-zero number too small in magnitude to tell from zero in
    /// double precision.
    TooSmall(String),
}

impl fmt::Display for NumberError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            NumberError::Empty => write!(f, "enter a number"),
            NumberError::NotANumber(t) => write!(f, "'{t}' is not a number"),
            NumberError::TooLarge(t) => write!(f, "'{t}' is too large a number to work with"),
            NumberError::TooSmall(t) => write!(f, "'{t}' is too small a number to tell from zero"),
        }
    }
}

impl std::error::Error for NumberError {}

/// Parses a finite decimal number, accepting a decimal comma ("2,5") as well
/// as a point, and a leading minus sign typed as U+2212.
///
/// # Errors
/// [`NumberError::Empty`] for blank text; [`NumberError::NotANumber`] for
/// anything else that is not a finite decimal (including "inf" and "NaN",
/// which Rust's float parser would otherwise accept);
/// [`NumberError::TooLarge`] where the value would overflow to infinity
/// ("1e309") and [`NumberError::TooSmall`] where a non-zero value would
/// underflow to zero ("1e-400"), never a silent infinity or zero.
///
/// # Examples
/// ```
/// assert_eq!(headroom::sheet::number::parse_decimal(" 2,5 "), Ok(2.5));
/// assert!(headroom::sheet::number::parse_decimal("2.5.1").is_err());
/// ```
pub fn parse_decimal(text: &str) -> Result<f64, NumberError> {
    let trimmed = text.trim();
    if trimmed.is_empty() {
        return Err(NumberError::Empty);
    }
    let normalised: String = trimmed
        .chars()
        .map(|c| match c {
            ',' => '.',
            '\u{2212}' => '-',
            other => other,
        })
        .collect();
    // Only digits, one point, a sign and an exponent: this refuses "inf",
    // "nan" and hex-looking input that `f64::from_str` would take.
    let allowed = normalised.chars().all(|c| c.is_ascii_digit() || matches!(c, '.' | '-' | '+' | 'e' | 'E'));
    match float(&normalised) {
        Some(v) if allowed && v.is_infinite() => Err(NumberError::TooLarge(trimmed.to_owned())),
        Some(v) if allowed && v == 0.0 && mantissa_has_nonzero_digit(&normalised) => {
            Err(NumberError::TooSmall(trimmed.to_owned()))
        }
        Some(v) if allowed && v.is_finite() => Ok(v),
        _ => Err(NumberError::NotANumber(trimmed.to_owned())),
    }
}

/// `text.parse::<f64>().ok()`, bit for bit: the same grammar (an optional
/// sign, then `inf`, `infinity` or `nan` in any case, or digits with at most
/// one point and an optional exponent; no spaces), the same correctly
/// rounded value, infinity past the largest double and zero below the
/// smallest. Every number a sheet holds is read here.
///
/// In the browser the conversion is not `core`'s: its decimal-to-float
/// code and tables were 13.7 KB of the page's gzipped module (8 KB of
/// tables that gzip cannot shrink).
/// A number whose significant digits, read as a whole number, are at most
/// 2⁵³ (so exact in a double), scaled by a power of ten up to 10²², is one
/// correctly rounded multiplication or division (Clinger's fast path, as
/// in `core`): nearly every number a person types, done here. Any other
/// is handed, after the same grammar check, to the browser's `parseFloat`,
/// whose grammar for such text is the same. V8 rounds every such text
/// correctly (`tests/browser.rs` holds it to
/// `core`'s parser); ECMA-262 allows an engine to round after the 20th
/// significant digit, which only a text of more digits than a double holds
/// could notice. Natively this is `core`'s parser itself.
pub fn float(text: &str) -> Option<f64> {
    #[cfg(target_arch = "wasm32")]
    return float_with(text, js_sys::parse_float);
    #[cfg(not(target_arch = "wasm32"))]
    text.parse().ok()
}

/// [`float`]'s grammar check and fast path, handing any other number (a
/// text the grammar takes) to `slow`. Public so that the tests can run it
/// natively with `core`'s parser as `slow`.
pub fn float_with(text: &str, slow: fn(&str) -> f64) -> Option<f64> {
    const POW10: [f64; 23] = [
        1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19,
        1e20, 1e21, 1e22,
    ];
    let b = text.as_bytes();
    let (negative, rest) = match b.first() {
        Some(b'-') => (true, &b[1..]),
        Some(b'+') => (false, &b[1..]),
        _ => (false, b),
    };
    let signed = |v: f64| Some(if negative { -v } else { v });
    if rest.eq_ignore_ascii_case(b"inf") || rest.eq_ignore_ascii_case(b"infinity") {
        return signed(f64::INFINITY);
    }
    if rest.eq_ignore_ascii_case(b"nan") {
        return signed(f64::NAN);
    }
    // The first 19 significant digits as a whole number and the power of
    // ten they are scaled by. A 19-digit whole is above 2^53, so the fast
    // path never takes a number whose later digits were left out.
    let (mut whole, mut kept, mut scale) = (0u64, 0u32, 0i64);
    let (mut i, mut digits, mut point) = (0, 0, false);
    while let Some(&c) = rest.get(i) {
        match c {
            b'0'..=b'9' => {
                let d = u64::from(c - b'0');
                digits += 1;
                if whole == 0 && d == 0 {
                    scale -= i64::from(point);
                } else if kept < 19 {
                    whole = whole * 10 + d;
                    kept += 1;
                    scale -= i64::from(point);
                } else {
                    scale += i64::from(!point);
                }
            }
            b'.' if !point => point = true,
            _ => break,
        }
        i += 1;
    }
    if digits == 0 {
        return None;
    }
    if let Some(b'e' | b'E') = rest.get(i) {
        i += 1;
        let minus = rest.get(i) == Some(&b'-');
        if let Some(b'+' | b'-') = rest.get(i) {
            i += 1;
        }
        let from = i;
        let mut e = 0i64;
        while let Some(&c @ b'0'..=b'9') = rest.get(i) {
            e = (e * 10 + i64::from(c - b'0')).min(1 << 40);
            i += 1;
        }
        if i == from {
            return None;
        }
        scale += if minus { -e } else { e };
    }
    if i != rest.len() {
        return None;
    }
    if whole == 0 {
        return signed(0.0);
    }
    if whole <= 1 << 53 && scale.unsigned_abs() <= 22 {
        let w = whole as f64;
        let p = POW10[scale.unsigned_abs() as usize];
        return signed(if scale < 0 { w / p } else { w * p });
    }
    Some(slow(text))
}

/// Whether the digits before any exponent include one that is not zero.
fn mantissa_has_nonzero_digit(number: &str) -> bool {
    number.split(['e', 'E']).next().is_some_and(|m| m.chars().any(|c| matches!(c, '1'..='9')))
}

/// Largest count of one kind of fitting on one line. Far above any real
/// run (common practice: a few tens at most); low enough that a typing slip
/// of extra digits is caught.
pub const MAX_COUNT: u32 = 999;

/// Why a typed count is not a count.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct CountError(pub String);

impl fmt::Display for CountError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "'{}' is not a whole number from 0 to {MAX_COUNT}", self.0)
    }
}

impl std::error::Error for CountError {}

/// Parses how many of something: digits only, 0 to [`MAX_COUNT`].
///
/// # Errors
/// [`CountError`] for blank text, a sign, a decimal point, an exponent, or
/// a value above the maximum; never a silent 0.
///
/// # Examples
/// ```
/// use headroom::sheet::number::parse_count;
/// assert_eq!(parse_count(" 12 "), Ok(12));
/// for bad in ["2.5", "-1", "1e2", "99999999999", ""] {
///     assert!(parse_count(bad).is_err(), "{bad}");
/// }
/// ```
pub fn parse_count(text: &str) -> Result<u32, CountError> {
    let t = text.trim();
    let bad = || CountError(t.to_owned());
    if t.is_empty() || t.len() > 4 || !t.chars().all(|c| c.is_ascii_digit()) {
        return Err(bad());
    }
    match t.parse::<u32>() {
        Ok(n) if n <= MAX_COUNT => Ok(n),
        _ => Err(bad()),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// `float_with` natively, with core's parser behind it: any difference
    /// from `f64::from_str` is the grammar check's or the fast path's.
    fn ours(t: &str) -> Option<u64> {
        float_with(t, |s| s.parse().unwrap()).map(f64::to_bits)
    }

    fn core(t: &str) -> Option<u64> {
        t.parse::<f64>().ok().map(f64::to_bits)
    }

    #[test]
    fn floats_are_read_as_core_reads_them() {
        // The reference: core's f64::from_str (Rust's standard library),
        // bit for bit, refusals included.
        let texts = [
            "",
            "+",
            "-",
            ".",
            "+.",
            "-.",
            "e",
            "e5",
            ".e5",
            "1e",
            "1e+",
            "1e-",
            "1E5",
            "1e+5",
            "1e-5",
            "1.",
            "1.e5",
            ".5",
            "+.5",
            "-.5e-3",
            "0",
            "-0",
            "+0",
            "0.0",
            "-0.0e99999",
            "00012.500",
            "1..2",
            "1.2.3",
            "1e5.5",
            "1e5e5",
            " 1",
            "1 ",
            "1,5",
            "0x10",
            "1_000",
            "inf",
            "-inf",
            "+inf",
            "INF",
            "Infinity",
            "-infinity",
            "infinit",
            "infinityy",
            "nan",
            "NaN",
            "-nan",
            "+NAN",
            "nanx",
            "in",
            "\u{661}",
            "١",
            "18.5",
            "42",
            "0.045",
            "3.14159",
            "1e22",
            "1e23",
            "9007199254740992",
            "9007199254740993",
            "9007199254740991.5",
            "123456789012345678",
            "1234567890123456789",
            "12345678901234567890",
            "0.1",
            "0.3",
            "2.5e-3",
            "1.7976931348623157e308",
            "1.7976931348623158e308",
            "1.7976931348623159e308",
            "1e309",
            "-1e400",
            "2.2250738585072011e-308",
            "2.2250738585072012e-308",
            "4.9406564584124654e-324",
            "2.4703282292062327e-324",
            "2.4703282292062328e-324",
            "1e-400",
            "0e-400",
            "1e99999999999999999999",
            "1e-99999999999999999999",
            "0.000000000000000000000000000001",
            "100000000000000000000000",
            "10000000000000000000000",
            "4e22",
            "4.0000000000000000000000000001e22",
            "1.00000000000000000001",
            "0.30000000000000004",
            "8.98846567431158e307",
            "1e-22",
            "1e-23",
            "12345678901234567e-22",
        ];
        for t in texts {
            assert_eq!(ours(t), core(t), "{t:?}");
        }
        // Every text of up to four characters from a number's alphabet.
        let alphabet = ["0", "1", "9", ".", "e", "E", "-", "+", "n", "i"];
        let mut stack = vec![String::new()];
        let mut checked = 0;
        while let Some(t) = stack.pop() {
            assert_eq!(ours(&t), core(&t), "{t:?}");
            checked += 1;
            if t.len() < 4 {
                stack.extend(alphabet.iter().map(|c| format!("{t}{c}")));
            }
        }
        assert_eq!(checked, 11_111);
    }

    #[test]
    fn floats_of_every_length_and_scale_are_read_as_core_reads_them() {
        // Decimal texts of 1-40 digits, the point anywhere, exponents -340 to
        // 330, from a fixed-seed generator (xorshift): the fast path and
        // its limits (19 digits, 2^53, 10^22) against core's parser.
        let mut x: u64 = 0x2545_f491_4f6c_dd1d;
        let mut next = move || {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            x
        };
        thread_local!(static SLOW: std::cell::Cell<bool> = const { std::cell::Cell::new(false) });
        let mut fast = 0;
        for _ in 0..200_000 {
            let n = 1 + (next() % 40) as usize;
            let mut t: String = (0..n).map(|_| char::from(b'0' + (next() % 10) as u8)).collect();
            if next() % 2 == 0 {
                t.insert(((next() as usize) % (n + 1)).min(n), '.');
            }
            if t == "." {
                continue;
            }
            match next() % 3 {
                0 => t += &format!("e{}", (next() % 671) as i64 - 340),
                1 => t += &format!("e{}", (next() % 45) as i64 - 22),
                _ => {}
            }
            if next() % 4 == 0 {
                t.insert(0, '-');
            }
            SLOW.with(|s| s.set(false));
            let got = float_with(&t, |s| {
                SLOW.with(|c| c.set(true));
                s.parse().unwrap()
            });
            assert_eq!(got.map(f64::to_bits), core(&t), "{t:?}");
            fast += usize::from(!SLOW.with(std::cell::Cell::get));
        }
        // About a quarter (53,775 when written) are short enough and scaled
        // little enough for the fast path.
        assert!(fast > 40_000, "{fast}");
    }

    #[test]
    fn typed_numbers_take_the_fast_path() {
        thread_local!(static SLOW: std::cell::Cell<u32> = const { std::cell::Cell::new(0) });
        let count = |s: &str| {
            SLOW.with(|c| c.set(c.get() + 1));
            s.parse().unwrap()
        };
        for t in ["18.5", "42", "0.045", "2.5e-3", "-12", "1200000", "0.0000015", "6.35", "1e22", "123456789.123456"] {
            assert_eq!(float_with(t, count), t.parse().ok(), "{t}");
        }
        assert_eq!(SLOW.with(std::cell::Cell::get), 0);
        assert_eq!(float_with("0.30000000000000004", count), Some(0.30000000000000004));
        assert_eq!(SLOW.with(std::cell::Cell::get), 1);
    }

    #[test]
    fn decimal_comma_and_point_agree() {
        assert_eq!(parse_decimal("2,5"), parse_decimal("2.5"));
    }

    #[test]
    fn refuses_words_that_rust_floats_accept() {
        // f64::from_str takes these; a person typing them made a mistake.
        for t in ["inf", "NaN", "infinity", "-inf"] {
            assert!(parse_decimal(t).is_err(), "{t}");
        }
    }

    #[test]
    fn blank_is_empty_not_zero() {
        assert_eq!(parse_decimal("   "), Err(NumberError::Empty));
    }

    #[test]
    fn overflow_and_underflow_are_messages_not_infinity_or_zero() {
        // IEEE 754 double: largest finite ~1.8e308, smallest subnormal ~4.9e-324.
        assert_eq!(parse_decimal("1e309"), Err(NumberError::TooLarge("1e309".into())));
        assert_eq!(parse_decimal("-1e400"), Err(NumberError::TooLarge("-1e400".into())));
        assert_eq!(parse_decimal("1e-400"), Err(NumberError::TooSmall("1e-400".into())));
        assert!(parse_decimal("1e-400").unwrap_err().to_string().contains("too small"));
        // A real zero is still zero.
        assert_eq!(parse_decimal("0e-400"), Ok(0.0));
        assert_eq!(parse_decimal("0,000"), Ok(0.0));
        assert_eq!(parse_decimal("1e308"), Ok(1e308));
    }

    #[test]
    fn counts_are_whole_numbers_in_range() {
        assert_eq!(parse_count("0"), Ok(0));
        assert_eq!(parse_count("999"), Ok(999));
        for bad in ["2.5", "2,5", "-1", "+1", "1e2", "1000", "99999999999", " ", "x"] {
            let e = parse_count(bad).unwrap_err();
            assert!(e.to_string().contains("whole number from 0 to 999"), "{bad}: {e}");
        }
    }

    #[test]
    fn unicode_minus_is_a_minus() {
        assert_eq!(parse_decimal("\u{2212}3"), Ok(-3.0));
    }
}
