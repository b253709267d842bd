//! The quick bore check: flow and inside diameter in, mean velocity out.
//!
//! This is the smallest whole path through the rooms (text → quantities →
//! core → text) and the first thing the page computes.

use std::fmt;

use uom::si::f64::{Length, VolumeRate};
use uom::si::length::millimeter;
use uom::si::velocity::meter_per_second;
use uom::si::volume_rate::liter_per_second;

use super::number::{parse_decimal, NumberError};
use crate::hydraulics::geometry::mean_velocity;

/// Which input of the quick check is wrong.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Field {
    /// Volume flow, litres per second.
    Flow,
    /// Inside diameter, millimetres.
    Bore,
}

impl fmt::Display for Field {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Field::Flow => "flow",
            Field::Bore => "bore",
        })
    }
}

/// What went wrong with one input.
#[derive(Debug, Clone, PartialEq)]
pub enum QuickError {
    /// The text is not a number.
    Number(Field, NumberError),
    /// The number is zero or negative.
    NotPositive(Field, String),
}

impl QuickError {
    /// The field the message belongs next to.
    pub fn field(&self) -> Field {
        match self {
            QuickError::Number(f, _) | QuickError::NotPositive(f, _) => *f,
        }
    }
}

impl fmt::Display for QuickError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            QuickError::Number(field, e) => write!(f, "{field}: {e}"),
            QuickError::NotPositive(field, t) => write!(f, "{field} '{t}' must be positive"),
        }
    }
}

impl std::error::Error for QuickError {}

fn positive(field: Field, text: &str) -> Result<f64, QuickError> {
    let v = parse_decimal(text).map_err(|e| QuickError::Number(field, e))?;
    if v > 0.0 {
        Ok(v)
    } else {
        Err(QuickError::NotPositive(field, text.trim().to_owned()))
    }
}

/// Mean velocity in m/s for a flow typed in L/s through a bore typed in mm.
///
/// # Errors
/// A [`QuickError`] naming the first bad field.
///
/// # Examples
/// ```
/// let v = headroom::sheet::quick::velocity_m_per_s("2,5", "52.5").unwrap();
/// assert!((v - 1.154_866).abs() < 1e-6);
/// ```
pub fn velocity_m_per_s(flow_l_per_s: &str, bore_mm: &str) -> Result<f64, QuickError> {
    let q = VolumeRate::new::<liter_per_second>(positive(Field::Flow, flow_l_per_s)?);
    let d = Length::new::<millimeter>(positive(Field::Bore, bore_mm)?);
    Ok(mean_velocity(q, d).get::<meter_per_second>())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn negative_flow_names_the_field_and_the_text() {
        let e = velocity_m_per_s("-3", "50").unwrap_err();
        assert_eq!(e.field(), Field::Flow);
        assert_eq!(e.to_string(), "flow '-3' must be positive");
    }

    #[test]
    fn zero_bore_is_refused_not_infinite() {
        let e = velocity_m_per_s("1", "0").unwrap_err();
        assert_eq!(e.field(), Field::Bore);
    }
}
