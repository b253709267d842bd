//! Units at the boundary: what engineers type, read into SI; SI written
//! back in the unit a sheet asks for.
//!
//! Conversion factors are exact by definition unless noted, from NIST
//! SP 811 (2008), appendix B.8 and B.9: 1 in = 0.0254 m, 1 ft = 0.3048 m,
//! 1 lb = 0.45359237 kg, US gallon = 231 in³ = 3.785411784 L, UK
//! (imperial) gallon = 4.54609 L, 1 bar = 1e5 Pa, 1 lbf = 4.4482216152605 N
//! (so 1 psi = 6894.757293168 Pa), °F: T/K = (t/°F + 459.67)·5/9.
//!
//! Heads ("m", "ft" of the line's fluid) and mass flows need the fluid's
//! density, so a parsed value stays a [`Measure`] until [`Measure::to_si`]
//! is given one.

use crate::hydraulics::digits::{Fixed, Sci, ShortExp};
use std::fmt;

use super::number::{parse_decimal, NumberError};
use crate::hydraulics::fluid::Fluid;

/// What a field measures.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Dimension {
    /// Flow (volume or mass); SI m³/s.
    Flow,
    /// Pressure or head; SI Pa.
    Pressure,
    /// Pressure drop per length; SI Pa/m.
    DropPerLength,
    /// Length; SI m.
    Length,
    /// Velocity; SI m/s.
    Velocity,
    /// Temperature; SI K.
    Temperature,
    /// Absolute roughness; SI m.
    Roughness,
    /// A heat load (power); SI W.
    Power,
    /// A temperature difference; SI K.
    TemperatureDifference,
}

impl Dimension {
    /// Every dimension, in the order of the sheet file's `units`.
    pub const ALL: [Dimension; 9] = [
        Dimension::Flow,
        Dimension::Pressure,
        Dimension::DropPerLength,
        Dimension::Length,
        Dimension::Velocity,
        Dimension::Temperature,
        Dimension::Roughness,
        Dimension::Power,
        Dimension::TemperatureDifference,
    ];

    /// Its key in the sheet file's `units` ("drop_per_length").
    pub fn key(self) -> &'static str {
        match self {
            Dimension::Flow => "flow",
            Dimension::Pressure => "pressure",
            Dimension::DropPerLength => "drop_per_length",
            Dimension::Length => "length",
            Dimension::Velocity => "velocity",
            Dimension::Temperature => "temperature",
            Dimension::Roughness => "roughness",
            Dimension::Power => "power",
            Dimension::TemperatureDifference => "temperature_difference",
        }
    }

    fn name(self) -> &'static str {
        match self {
            Dimension::Flow => "flow",
            Dimension::Pressure => "pressure",
            Dimension::DropPerLength => "drop per length",
            Dimension::Length => "length",
            Dimension::Velocity => "velocity",
            Dimension::Temperature => "temperature",
            Dimension::Roughness => "roughness",
            Dimension::Power => "heat load",
            Dimension::TemperatureDifference => "temperature difference",
        }
    }
}

/// How a unit maps to SI.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Scale {
    /// SI = value × factor.
    Linear(f64),
    /// K = (value + offset) × factor.
    Affine(f64, f64),
    /// Mass flow: kg/s = value × factor; m³/s = kg/s ÷ ρ.
    Mass(f64),
    /// Head of the line's fluid: Pa = value × factor (m) × ρ g.
    Head(f64),
    /// A pressure marked gauge: Pa absolute = value × factor + one
    /// standard atmosphere ([`ATMOSPHERE_PA`]).
    Gauge(f64),
    /// A pressure marked absolute: Pa = value × factor.
    Absolute(f64),
    /// Head per length: Pa/m = value × factor (m/m) × ρ g.
    HeadPerLength(f64),
    /// A gas's volume flow at reference conditions: m³/s at the line =
    /// value × factor × ρ_ref / ρ, with ρ_ref the gas's density at the
    /// reference temperature (K) and pressure (Pa absolute), described by
    /// the text.
    Standard(f64, f64, f64, &'static str),
}

/// A unit a person can type.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Unit {
    /// How it is written on the page.
    pub symbol: &'static str,
    /// What it measures.
    pub dimension: Dimension,
    scale: Scale,
    /// Other spellings accepted (compared after [`normalise`]).
    aliases: &'static [&'static str],
}

const IN: f64 = 0.0254;
const FT: f64 = 0.3048;
const LB: f64 = 0.453_592_37;
const US_GAL: f64 = 3.785_411_784e-3;
const UK_GAL: f64 = 4.546_09e-3;
const PSI: f64 = 6_894.757_293_168;
/// 1 Btu_IT/h in W: 1055.05585262 J / 3600 s (NIST SP 811, B.8, the
/// International Table Btu).
const BTU_H: f64 = 1_055.055_852_62 / 3_600.0;
const G_N: f64 = crate::hydraulics::losses::G_N;
/// Conventional water column: 1 m H₂O = g_n × 1000 kg/m³ = 9806.65 Pa
/// (NIST SP 811, appendix B.8: "meter of water, conventional").
const M_H2O: f64 = 9_806.65;

/// 60 °F in kelvin: (60 + 459.67) × 5/9.
const F60: f64 = (60.0 + 459.67) * 5.0 / 9.0;
const NORMAL: &str = "gas at 0 °C, 101.325 kPa (DIN 1343)";
const STANDARD_ISO: &str = "gas at 15 °C, 101.325 kPa (ISO 13443)";
const STANDARD_US: &str = "gas at 60 °F, 14.696 psia";

/// The atmospheric pressure a gauge reading is taken against: one standard
/// atmosphere, 101 325 Pa (NIST SP 811, appendix B.8). Stated beside every
/// pressure field that takes gauge units.
pub const ATMOSPHERE_PA: f64 = 101_325.0;

macro_rules! unit {
    ($sym:literal, $dim:ident, $scale:expr, [$($alias:literal),*]) => {
        Unit { symbol: $sym, dimension: Dimension::$dim, scale: $scale, aliases: &[$($alias),*] }
    };
}

/// Every unit Headroom reads and writes.
pub const UNITS: &[Unit] = &[
    unit!("L/s", Flow, Scale::Linear(1e-3), ["l/s", "lps"]),
    unit!("L/min", Flow, Scale::Linear(1e-3 / 60.0), ["l/min", "lpm"]),
    unit!("m³/h", Flow, Scale::Linear(1.0 / 3600.0), ["m3/h", "m3/hr", "cmh"]),
    unit!("m³/s", Flow, Scale::Linear(1.0), ["m3/s"]),
    unit!("US gpm", Flow, Scale::Linear(US_GAL / 60.0), ["gpm", "usgpm", "gal/min"]),
    unit!("UK gpm", Flow, Scale::Linear(UK_GAL / 60.0), ["ukgpm", "igpm"]),
    unit!("ft³/min", Flow, Scale::Linear(FT * FT * FT / 60.0), ["ft3/min", "cfm"]),
    unit!("kg/s", Flow, Scale::Mass(1.0), []),
    unit!("kg/h", Flow, Scale::Mass(1.0 / 3600.0), ["kg/hr"]),
    unit!("lb/h", Flow, Scale::Mass(LB / 3600.0), ["lb/hr", "lbm/h", "pph"]),
    // Reference conditions: "normal" 0 °C and 101.325 kPa (DIN 1343);
    // "standard" 15 °C and 101.325 kPa (ISO 13443); US standard cubic feet
    // at 60 °F and 14.696 psia (one atmosphere; common US gas practice —
    // compressed-air makers often use other references, so say which).
    unit!("Nm³/h", Flow, Scale::Standard(1.0 / 3600.0, 273.15, ATMOSPHERE_PA, NORMAL), ["nm3/h", "nm3/hr", "nmh"]),
    unit!("Nm³/min", Flow, Scale::Standard(1.0 / 60.0, 273.15, ATMOSPHERE_PA, NORMAL), ["nm3/min"]),
    unit!("Sm³/h", Flow, Scale::Standard(1.0 / 3600.0, 288.15, ATMOSPHERE_PA, STANDARD_ISO), ["sm3/h", "sm3/hr"]),
    unit!("SCFM", Flow, Scale::Standard(FT * FT * FT / 60.0, F60, ATMOSPHERE_PA, STANDARD_US), ["scfm", "sft3/min"]),
    unit!("SCFH", Flow, Scale::Standard(FT * FT * FT / 3600.0, F60, ATMOSPHERE_PA, STANDARD_US), ["scfh", "sft3/h"]),
    unit!("Pa", Pressure, Scale::Linear(1.0), []),
    unit!("kPa", Pressure, Scale::Linear(1e3), []),
    unit!("MPa", Pressure, Scale::Linear(1e6), []),
    unit!("bar", Pressure, Scale::Linear(1e5), []),
    unit!("psi", Pressure, Scale::Linear(PSI), ["lbf/in2"]),
    unit!("m H₂O", Pressure, Scale::Linear(M_H2O), ["mh2o", "mwc", "mwg", "mofwater"]),
    unit!("ft H₂O", Pressure, Scale::Linear(FT * M_H2O), ["fth2o", "ftwc", "ftofwater"]),
    unit!("in H₂O", Pressure, Scale::Linear(IN * M_H2O), ["inh2o", "inwc", "inwg", "\"wc", "\"wg"]),
    unit!("m head", Pressure, Scale::Head(1.0), ["m", "mhead", "mhd", "mfluid", "mhead(linefluid)"]),
    unit!("ft head", Pressure, Scale::Head(FT), ["ft", "fthead", "fthd", "ftfluid", "fthead(linefluid)"]),
    unit!("barg", Pressure, Scale::Gauge(1e5), ["bar(g)", "bargauge"]),
    unit!("bara", Pressure, Scale::Absolute(1e5), ["bar(a)", "barabs"]),
    unit!("psig", Pressure, Scale::Gauge(PSI), ["psi(g)"]),
    unit!("psia", Pressure, Scale::Absolute(PSI), ["psi(a)"]),
    unit!("Pa/m", DropPerLength, Scale::Linear(1.0), []),
    unit!("kPa/100 m", DropPerLength, Scale::Linear(10.0), ["kpa/100m"]),
    unit!("psi/100 ft", DropPerLength, Scale::Linear(PSI / (100.0 * FT)), ["psi/100ft"]),
    unit!("ft/100 ft", DropPerLength, Scale::HeadPerLength(0.01), ["ft/100ft", "ftper100ft", "ft/100'"]),
    unit!("m/100 m", DropPerLength, Scale::HeadPerLength(0.01), ["m/100m", "mper100m"]),
    unit!("m", Length, Scale::Linear(1.0), []),
    unit!("mm", Length, Scale::Linear(1e-3), []),
    unit!("km", Length, Scale::Linear(1e3), []),
    unit!("ft", Length, Scale::Linear(FT), ["'", "feet"]),
    unit!("in", Length, Scale::Linear(IN), ["\"", "inch"]),
    unit!("m/s", Velocity, Scale::Linear(1.0), []),
    unit!("ft/s", Velocity, Scale::Linear(FT), ["fps"]),
    unit!("°C", Temperature, Scale::Affine(273.15, 1.0), ["c", "degc"]),
    unit!("°F", Temperature, Scale::Affine(459.67, 5.0 / 9.0), ["f", "degf"]),
    unit!("K", Temperature, Scale::Affine(0.0, 1.0), ["k"]),
    unit!("W", Power, Scale::Linear(1.0), []),
    unit!("kW", Power, Scale::Linear(1e3), []),
    unit!("MW", Power, Scale::Linear(1e6), []),
    unit!("Btu/h", Power, Scale::Linear(BTU_H), ["btu/hr", "btuh"]),
    unit!("MBH", Power, Scale::Linear(1e3 * BTU_H), ["mbtu/h", "kbtu/h"]),
    // NIST SP 811, B.8: ton of refrigeration (12 000 Btu_IT/h).
    unit!("ton", Power, Scale::Linear(12e3 * BTU_H), ["tons", "tr", "tonr"]),
    unit!("K", TemperatureDifference, Scale::Linear(1.0), ["k", "°c", "c", "degc"]),
    unit!("°F", TemperatureDifference, Scale::Linear(5.0 / 9.0), ["f", "degf", "°r"]),
    unit!("mm", Roughness, Scale::Linear(1e-3), []),
    unit!("µm", Roughness, Scale::Linear(1e-6), ["um", "micron"]),
    unit!("in", Roughness, Scale::Linear(IN), ["\"", "inch"]),
];

/// Lower-cases and strips what people vary: spaces, superscripts, "per".
/// Units are Latin letters and a few signs, so the lower-casing is ASCII's
/// (plus the Greek capital mu): the full Unicode case tables cost the
/// page 15 KB gzip (measured) for nothing a unit uses.
pub fn normalise(s: &str) -> String {
    let s = s.trim().chars().map(|c| if c == 'Μ' { 'μ' } else { c.to_ascii_lowercase() }).collect::<String>();
    per_as_slash(&s)
        .chars()
        .filter(|c| !c.is_whitespace() && *c != '°' && *c != '·')
        .map(|c| match c {
            '³' => '3',
            '²' => '2',
            'µ' | 'μ' => 'u',
            other => other,
        })
        .collect()
}

/// `s.replace(" per ", "/")`, written out: `str::replace` with a text to
/// find brings core's substring searcher (the Two-Way algorithm) into the
/// page's module; with the page's three other text searches written as
/// prefix tests it was 1.5 KB gzip (measured).
fn per_as_slash(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    let mut rest = s;
    // " per " is ASCII, so where it starts is a character boundary.
    while let Some(i) = rest.as_bytes().windows(5).position(|w| w == b" per ") {
        out.push_str(&rest[..i]);
        out.push('/');
        rest = &rest[i + 5..];
    }
    out.push_str(rest);
    out
}

/// Finds a unit of a dimension by any of its spellings.
pub fn find(dimension: Dimension, text: &str) -> Option<&'static Unit> {
    let key = normalise(text);
    UNITS
        .iter()
        .filter(|u| u.dimension == dimension)
        .find(|u| normalise(u.symbol) == key || u.aliases.iter().any(|a| normalise(a) == key))
}

/// The units of one dimension, in listing order: the ones a sheet may
/// choose for the dimension (units marked gauge or absolute are typed into
/// a pressure field, never chosen for all of them).
pub fn of(dimension: Dimension) -> impl Iterator<Item = &'static Unit> {
    UNITS.iter().filter(move |u| u.dimension == dimension && u.reference().is_none())
}

impl Unit {
    /// "gauge" or "absolute" for a pressure unit marked so (barg, psia …).
    pub fn reference(&self) -> Option<&'static str> {
        match self.scale {
            Scale::Gauge(_) => Some("gauge"),
            Scale::Absolute(_) => Some("absolute"),
            _ => None,
        }
    }

    /// What the unit means, for the unit menus: heads say whose, a
    /// standard volume its reference conditions.
    pub fn meaning(&self) -> &'static str {
        match self.scale {
            Scale::Head(_) | Scale::HeadPerLength(_) => "head of the line's own fluid",
            Scale::Standard(.., text) => text,
            _ => "",
        }
    }

    /// A standard or normal volume unit's reference temperature (K) and
    /// pressure (Pa absolute).
    pub fn standard(&self) -> Option<(f64, f64)> {
        match self.scale {
            Scale::Standard(_, t, p, _) => Some((t, p)),
            _ => None,
        }
    }
}

/// Why text is not a value of the field's dimension.
#[derive(Debug, Clone, PartialEq)]
pub enum UnitError {
    /// The number part is wrong.
    Number(NumberError),
    /// A comma followed by exactly three digits: 1,000 could be a thousand
    /// or one, so we ask.
    AmbiguousComma(String),
    /// The unit is not one of this dimension's.
    UnknownUnit {
        /// The field's dimension.
        dimension: Dimension,
        /// The unit text typed.
        unit: String,
    },
    /// A head or mass flow needs a density that is not known.
    NeedsDensity(&'static str),
    /// A standard or normal volume is a gas's: not for a liquid or steam.
    NeedsGas(&'static str),
    /// The value is a number, but in SI units it overflows to infinity or
    /// underflows to zero in double precision.
    OutOfReach {
        /// The number typed.
        value: f64,
        /// Its unit.
        unit: &'static str,
    },
}

impl fmt::Display for UnitError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            UnitError::Number(e) => write!(f, "{e}"),
            UnitError::AmbiguousComma(t) => {
                write!(f, "'{t}' is ambiguous: write it without the comma for thousands, or with a point for decimals")
            }
            UnitError::UnknownUnit { dimension, unit } => {
                let list: Vec<&str> = of(*dimension).map(|u| u.symbol).collect();
                write!(f, "'{unit}' is not a unit of {}; use one of {}", dimension.name(), list.join(", "))
            }
            UnitError::NeedsDensity(u) => write!(f, "{u} needs the fluid's density, which is not known yet"),
            UnitError::NeedsGas(u) => write!(
                f,
                "{u} is a volume of gas at reference conditions: for a liquid or steam give a volume or mass flow \
                 (L/s, m³/h, kg/h …)"
            ),
            UnitError::OutOfReach { value, unit } => {
                write!(f, "'{} {unit}' is too far from any real value to compute with", ShortExp(*value))
            }
        }
    }
}

impl std::error::Error for UnitError {}

/// A number with its unit, as typed.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Measure {
    /// The number in `unit`.
    pub value: f64,
    /// The unit.
    pub unit: &'static Unit,
}

impl Measure {
    /// The value in SI units of the unit's dimension. `density` (kg/m³) is
    /// needed for heads and mass flows.
    ///
    /// # Errors
    /// [`UnitError::NeedsDensity`] when it is needed and `None` or not
    /// positive; [`UnitError::OutOfReach`] when the SI value would be
    /// infinite, or zero from a non-zero number ("1e308 kPa").
    pub fn to_si(&self, density: Option<f64>) -> Result<f64, UnitError> {
        let rho = || density.filter(|d| d.is_finite() && *d > 0.0).ok_or(UnitError::NeedsDensity(self.unit.symbol));
        let si = match self.unit.scale {
            Scale::Linear(k) => self.value * k,
            Scale::Affine(offset, k) => (self.value + offset) * k,
            Scale::Mass(k) => self.value * k / rho()?,
            Scale::Head(k) => self.value * k * rho()? * G_N,
            Scale::HeadPerLength(k) => self.value * k * rho()? * G_N,
            Scale::Gauge(k) => self.value * k + ATMOSPHERE_PA,
            Scale::Absolute(k) => self.value * k,
            Scale::Standard(..) => return Err(UnitError::NeedsGas(self.unit.symbol)),
        };
        let underflow =
            si == 0.0 && self.value != 0.0 && !matches!(self.unit.scale, Scale::Affine(..) | Scale::Gauge(_));
        if !si.is_finite() || underflow {
            return Err(UnitError::OutOfReach { value: self.value, unit: self.unit.symbol });
        }
        Ok(si)
    }

    /// Whether converting needs a density.
    pub fn needs_density(&self) -> bool {
        matches!(self.unit.scale, Scale::Mass(_) | Scale::Head(_) | Scale::HeadPerLength(_) | Scale::Standard(..))
    }

    /// A flow in SI (actual m³/s at the line), given the line's density
    /// and fluid: as [`Measure::to_si`], and a standard or normal volume by
    /// the gas's density at the unit's reference conditions.
    ///
    /// # Errors
    /// As [`Measure::to_si`]; [`UnitError::NeedsGas`] for a standard
    /// volume of anything but a gas.
    pub fn flow_si(&self, density: Option<f64>, fluid: Option<&Fluid>) -> Result<f64, UnitError> {
        match self.unit.scale {
            Scale::Standard(k, t, p, _) => {
                let rho_ref =
                    fluid.and_then(|f| f.reference_density(t, p)).ok_or(UnitError::NeedsGas(self.unit.symbol))?;
                self.scaled_mass(k, density.map(|r| r / rho_ref))
            }
            _ => self.to_si(density),
        }
    }

    fn scaled_mass(&self, k: f64, ratio: Option<f64>) -> Result<f64, UnitError> {
        let r = ratio.filter(|d| d.is_finite() && *d > 0.0).ok_or(UnitError::NeedsDensity(self.unit.symbol))?;
        let si = self.value * k / r;
        if !si.is_finite() || (si == 0.0 && self.value != 0.0) {
            return Err(UnitError::OutOfReach { value: self.value, unit: self.unit.symbol });
        }
        Ok(si)
    }
}

/// A flow (actual m³/s at the line) in `unit`, with the line's density and
/// fluid: standard and normal volumes through the gas's reference density.
///
/// # Errors
/// As [`from_si`]; [`UnitError::NeedsGas`] for a standard volume of
/// anything but a gas.
pub fn flow_from_si(
    si: f64,
    unit: &'static Unit,
    density: Option<f64>,
    fluid: Option<&Fluid>,
) -> Result<f64, UnitError> {
    match unit.scale {
        Scale::Standard(k, t, p, _) => {
            let rho_ref = fluid.and_then(|f| f.reference_density(t, p)).ok_or(UnitError::NeedsGas(unit.symbol))?;
            let rho = density.filter(|d| d.is_finite() && *d > 0.0).ok_or(UnitError::NeedsDensity(unit.symbol))?;
            Ok(si * rho / rho_ref / k)
        }
        _ => from_si(si, unit, density),
    }
}

/// A flow shown in `unit` (see [`flow_from_si`]); "—" when it cannot be.
pub fn show_flow(
    si: f64,
    unit: &'static Unit,
    density: Option<f64>,
    fluid: Option<&Fluid>,
    significant: usize,
) -> String {
    match flow_from_si(si, unit, density, fluid) {
        Ok(v) if v.is_finite() => format(v, unit, significant),
        _ => "—".to_owned(),
    }
}

/// Converts an SI value into `unit`.
///
/// # Errors
/// [`UnitError::NeedsDensity`] as for [`Measure::to_si`].
pub fn from_si(si: f64, unit: &'static Unit, density: Option<f64>) -> Result<f64, UnitError> {
    let rho = || density.filter(|d| d.is_finite() && *d > 0.0).ok_or(UnitError::NeedsDensity(unit.symbol));
    Ok(match unit.scale {
        Scale::Linear(k) | Scale::Absolute(k) => si / k,
        Scale::Gauge(k) => (si - ATMOSPHERE_PA) / k,
        Scale::Affine(offset, k) => si / k - offset,
        Scale::Mass(k) => si * rho()? / k,
        Scale::Head(k) | Scale::HeadPerLength(k) => si / (k * rho()? * G_N),
        Scale::Standard(..) => return Err(UnitError::NeedsGas(unit.symbol)),
    })
}

/// Splits "95 gpm" or "2,5L/s" into its number and unit text.
fn split(text: &str) -> (&str, &str) {
    let t = text.trim();
    let bytes: Vec<(usize, char)> = t.char_indices().collect();
    let mut end = t.len();
    for (k, &(i, c)) in bytes.iter().enumerate() {
        let numeric = c.is_ascii_digit() || matches!(c, '.' | ',' | '-' | '+' | '\u{2212}');
        // An exponent: e or E followed by a digit or a signed digit.
        let exponent = (c == 'e' || c == 'E')
            && k > 0
            && bytes[k - 1].1.is_ascii_digit()
            && match bytes.get(k + 1).map(|x| x.1) {
                Some(d) if d.is_ascii_digit() => true,
                Some('-' | '+') => bytes.get(k + 2).is_some_and(|x| x.1.is_ascii_digit()),
                _ => false,
            };
        if !(numeric || exponent) {
            end = i;
            break;
        }
    }
    (t[..end].trim(), t[end..].trim())
}

/// Reads "95 gpm", "2,5 L/s" or a bare number (taken in `default`).
///
/// # Errors
/// A [`UnitError`] saying what was expected.
///
/// # Examples
/// ```
/// use headroom::sheet::units::{parse, find, Dimension};
/// let lps = find(Dimension::Flow, "L/s").unwrap();
/// let m = parse(Dimension::Flow, "95 gpm", lps).unwrap();
/// // 95 × 3.785411784 L / 60 s = 5.993568658 L/s
/// assert!((m.to_si(None).unwrap() - 5.993_568_658e-3).abs() < 1e-12);
/// assert_eq!(parse(Dimension::Flow, "2,5", lps).unwrap().value, 2.5);
/// ```
pub fn parse(dimension: Dimension, text: &str, default: &'static Unit) -> Result<Measure, UnitError> {
    let (number, unit_text) = split(text);
    if number.is_empty() && !unit_text.is_empty() {
        return Err(UnitError::Number(NumberError::NotANumber(text.trim().to_owned())));
    }
    if let Some((_, after)) = number.split_once(',') {
        if !number.contains('.') && after.len() == 3 && after.chars().all(|c| c.is_ascii_digit()) {
            return Err(UnitError::AmbiguousComma(number.to_owned()));
        }
    }
    let value = parse_decimal(number).map_err(UnitError::Number)?;
    let unit = if unit_text.is_empty() {
        default
    } else {
        find(dimension, unit_text).ok_or_else(|| UnitError::UnknownUnit { dimension, unit: unit_text.to_owned() })?
    };
    Ok(Measure { value, unit })
}

/// Writes a value with a given number of significant figures and its unit
/// symbol. Never prints NaN or infinity: those come out as "—".
pub fn format(value: f64, unit: &Unit, significant: usize) -> String {
    format!("{} {}", format_number(value, significant), unit.symbol)
}

/// A number to `significant` figures, plain decimal notation for everyday
/// magnitudes, scientific outside them. "—" for NaN and infinities.
pub fn format_number(value: f64, significant: usize) -> String {
    if !value.is_finite() {
        return "—".to_owned();
    }
    if value == 0.0 {
        return "0".to_owned();
    }
    let significant = significant.clamp(1, 17);
    let magnitude = value.abs().log10().floor() as i32;
    if !(-4..9).contains(&magnitude) {
        return Sci(value, significant - 1).to_string();
    }
    let decimals = (significant as i32 - 1 - magnitude).max(0) as usize;
    Fixed(value, decimals).to_string()
}

/// An SI value shown in `unit` to `significant` figures with its symbol;
/// "—" when it cannot be shown (no density for a head, or not finite).
pub fn show(si: f64, unit: &'static Unit, density: Option<f64>, significant: usize) -> String {
    match from_si(si, unit, density) {
        Ok(v) if v.is_finite() => format(v, unit, significant),
        _ => "—".to_owned(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn per_becomes_a_slash_as_str_replace_would_make_it() {
        // Reference: the standard library's `str::replace(" per ", "/")`:
        // every text of up to 7 characters out of " ", "p", "e", "r", "é"
        // (overlaps such as " per per ", a multi-byte character beside the
        // match), and a few spellings people type.
        let alphabet = [' ', 'p', 'e', 'r', 'é'];
        let mut texts =
            vec!["m3 per h".to_owned(), "kg per m per s".to_owned(), "L  per  s".to_owned(), "per h".to_owned()];
        for len in 0..=7u32 {
            for code in 0..5usize.pow(len) {
                texts.push((0..len).map(|k| alphabet[code / 5usize.pow(k) % 5]).collect());
            }
        }
        for t in &texts {
            assert_eq!(per_as_slash(t), t.replace(" per ", "/"), "{t:?}");
        }
        assert_eq!(texts.len(), 4 + (5usize.pow(8) - 1) / 4);
        assert_eq!(per_as_slash("a per per b"), "a/per b");
    }

    #[test]
    fn every_spelling_is_found_in_capitals_too() {
        // Reference: the standard library's full Unicode upper case, which
        // turns the micro sign into a Greek capital mu; `normalise` lowers
        // only ASCII and that letter.
        for u in UNITS {
            for spelling in std::iter::once(u.symbol).chain(u.aliases.iter().copied()) {
                let found = find(u.dimension, spelling).map(|f| f.symbol);
                assert_eq!(find(u.dimension, &spelling.to_uppercase()).map(|f| f.symbol), found, "{spelling}");
                assert_eq!(find(u.dimension, &format!("  {spelling} ")).map(|f| f.symbol), found, "{spelling}");
            }
        }
        assert_eq!(find(Dimension::Roughness, "ΜM").map(|u| u.symbol), Some("µm"));
    }

    fn si(dim: Dimension, text: &str, rho: Option<f64>) -> f64 {
        let d = of(dim).next().unwrap();
        parse(dim, text, d).unwrap().to_si(rho).unwrap()
    }

    fn close(a: f64, b: f64) -> bool {
        ((a - b) / b).abs() < 1e-12
    }

    #[test]
    fn nist_sp811_factors() {
        // NIST SP 811 (2008) appendix B.8: US gallon per minute = 6.309020e-5 m³/s,
        // ft³/min = 4.719474e-4 m³/s, psi = 6.894757e3 Pa, ft = 0.3048 m, lb/h = 1.259979e-4 kg/s.
        assert!((si(Dimension::Flow, "1 gpm", None) - 6.309_020e-5).abs() < 5e-11);
        assert!((si(Dimension::Flow, "1 cfm", None) - 4.719_474e-4).abs() < 5e-10);
        assert!((si(Dimension::Pressure, "1 psi", None) - 6.894_757e3).abs() < 5e-4);
        assert!(close(si(Dimension::Length, "1 ft", None), 0.3048));
        assert!((si(Dimension::Flow, "1 lb/h", Some(1.0)) - 1.259_979e-4).abs() < 5e-10);
        // UK gallon: exactly 4.54609 L (Weights and Measures Act 1985).
        assert!(close(si(Dimension::Flow, "60 UK gpm", None), 4.546_09e-3));
    }

    #[test]
    fn temperatures() {
        assert!(close(si(Dimension::Temperature, "32 °F", None), 273.15));
        assert!(close(si(Dimension::Temperature, "212 F", None), 373.15));
        assert!(close(si(Dimension::Temperature, "-40 degC", None), 233.15));
        assert!(close(si(Dimension::Temperature, "300 K", None), 300.0));
    }

    #[test]
    fn heads_need_and_use_density() {
        let m = parse(Dimension::Pressure, "10 m", of(Dimension::Pressure).next().unwrap()).unwrap();
        assert!(matches!(m.to_si(None), Err(UnitError::NeedsDensity(_))));
        // 1e308 kPa is 1e311 Pa: past the largest double (~1.8e308).
        let kpa = find(Dimension::Pressure, "kPa").unwrap();
        let e = parse(Dimension::Pressure, "1e308 kPa", kpa).unwrap().to_si(None).unwrap_err();
        assert_eq!(e.to_string(), "'1e308 kPa' is too far from any real value to compute with");
        let mm = find(Dimension::Length, "mm").unwrap();
        assert!(parse(Dimension::Length, "1e-400", mm).is_err(), "underflow is refused while parsing");
        assert!(close(m.to_si(Some(1000.0)).unwrap(), 98_066.5));
        // 4 ft per 100 ft of water at 1000 kg/m³ = 0.04 · 9806.65 Pa/m.
        assert!(close(si(Dimension::DropPerLength, "4 ft/100 ft", Some(1000.0)), 392.266));
    }

    #[test]
    fn forms_people_type() {
        assert!(close(si(Dimension::Flow, "2,5 L/s", None), 2.5e-3));
        assert!(close(si(Dimension::Flow, "2.5l/s", None), 2.5e-3));
        assert!(close(si(Dimension::Flow, "12 m3/h", None), 12.0 / 3600.0));
        assert!(close(si(Dimension::Flow, "1.2e1 m³/h", None), 12.0 / 3600.0));
        assert!(close(si(Dimension::DropPerLength, "40 kPa / 100 m", None), 400.0));
        assert!(close(si(Dimension::Roughness, "45 µm", None), 45e-6));
        assert!(close(si(Dimension::Roughness, "45 um", None), 45e-6));
    }

    #[test]
    fn errors_say_what_was_expected() {
        let d = of(Dimension::Flow).next().unwrap();
        let e = parse(Dimension::Flow, "12 furlongs", d).unwrap_err().to_string();
        assert!(e.starts_with("'furlongs' is not a unit of flow; use one of L/s, L/min"), "{e}");
        assert!(matches!(parse(Dimension::Flow, "1,000 gpm", d), Err(UnitError::AmbiguousComma(_))));
        assert!(parse(Dimension::Flow, "gpm", d).is_err());
        assert!(parse(Dimension::Flow, "", d).is_err());
        // The same symbol means different things in different fields.
        assert!(parse(Dimension::Velocity, "3 psi", of(Dimension::Velocity).next().unwrap()).is_err());
    }

    #[test]
    fn format_never_shows_nan() {
        assert_eq!(format_number(f64::NAN, 3), "—");
        assert_eq!(format_number(f64::INFINITY, 3), "—");
        assert_eq!(format_number(1234.5678, 4), "1235");
        assert_eq!(format_number(0.012345, 3), "0.0123");
    }
}
