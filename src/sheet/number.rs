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
    match normalised.parse::<f64>() {
        Ok(v) if allowed && v.is_infinite() => Err(NumberError::TooLarge(trimmed.to_owned())),
        Ok(v) if allowed && v == 0.0 && mantissa_has_nonzero_digit(&normalised) => {
            Err(NumberError::TooSmall(trimmed.to_owned()))
        }
        Ok(v) if allowed && v.is_finite() => Ok(v),
        _ => Err(NumberError::NotANumber(trimmed.to_owned())),
    }
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
