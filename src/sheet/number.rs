//! Reading numbers the way engineers type them.

use std::fmt;

/// Why a piece of text is not a number.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum NumberError {
    /// Nothing but white space was typed.
    Empty,
    /// The text is not a decimal number.
    NotANumber(String),
}

impl fmt::Display for NumberError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            NumberError::Empty => write!(f, "enter a number"),
            NumberError::NotANumber(t) => write!(f, "'{t}' is not a number"),
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
/// which Rust's float parser would otherwise accept).
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
    let allowed = normalised
        .chars()
        .all(|c| c.is_ascii_digit() || matches!(c, '.' | '-' | '+' | 'e' | 'E'));
    match normalised.parse::<f64>() {
        Ok(v) if allowed && v.is_finite() => Ok(v),
        _ => Err(NumberError::NotANumber(trimmed.to_owned())),
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
    fn unicode_minus_is_a_minus() {
        assert_eq!(parse_decimal("\u{2212}3"), Ok(-3.0));
    }
}
