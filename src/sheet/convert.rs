//! Changing a field's unit without changing what was meant: bare numbers
//! typed in the old unit are rewritten in the new one; text that names its
//! own unit is left exactly as typed.

use super::file::{FluidFile, LineFile, SystemFile, Units};
use super::units::{self, format_number, from_si, Dimension, Unit};

/// Rewrites one field's text from `old` to `new`, if it is a bare number.
/// Falls back to appending the old unit's symbol when a density is needed
/// and not known, so the meaning is kept either way.
pub fn rewrite(text: &str, dim: Dimension, old: &'static Unit, new: &'static Unit, density: Option<f64>) -> String {
    let Ok(m) = units::parse(dim, text, old) else {
        return text.to_owned();
    };
    let bare = units::parse(dim, text, new).map(|n| n.unit.symbol != m.unit.symbol).unwrap_or(false);
    if !bare || old.symbol == new.symbol {
        return text.to_owned();
    }
    match m.to_si(density).and_then(|si| from_si(si, new, density)) {
        Ok(v) => tidy(&format_number(v, 6)),
        Err(_) => format!("{} {}", text.trim(), old.symbol),
    }
}

/// "100.000" → "100", "1.50000" → "1.5"; leaves integers and exponents alone.
fn tidy(s: &str) -> String {
    if s.contains('.') && !s.contains('e') {
        s.trim_end_matches('0').trim_end_matches('.').to_owned()
    } else {
        s.to_owned()
    }
}

fn field(slot: &mut String, dim: Dimension, old: &'static Unit, new: &'static Unit, rho: Option<f64>) {
    *slot = rewrite(slot, dim, old, new, rho);
}

fn opt(slot: &mut Option<String>, dim: Dimension, old: &'static Unit, new: &'static Unit, rho: Option<f64>) {
    if let Some(s) = slot {
        *s = rewrite(s, dim, old, new, rho);
    }
}

/// Rewrites every bare number of a line from units `old` to `new`.
/// `density` (kg/m³) is the line's, when it is known.
pub fn line(l: &mut LineFile, old: &Units, new: &Units, density: Option<f64>) {
    field(&mut l.flow, Dimension::Flow, old.flow, new.flow, density);
    if let Some(load) = &mut l.load {
        field(&mut load.power, Dimension::Power, old.power, new.power, None);
        field(
            &mut load.delta_t,
            Dimension::TemperatureDifference,
            old.temperature_difference,
            new.temperature_difference,
            None,
        );
    }
    if let Some(fx) = &mut l.fixtures {
        field(&mut fx.continuous, Dimension::Flow, old.flow, new.flow, density);
    }
    match &mut l.fluid {
        FluidFile::Water { temperature, pressure } => {
            field(temperature, Dimension::Temperature, old.temperature, new.temperature, None);
            opt(pressure, Dimension::Pressure, old.pressure, new.pressure, density);
        }
        FluidFile::Glycol { temperature, .. } => {
            field(temperature, Dimension::Temperature, old.temperature, new.temperature, None)
        }
        FluidFile::Custom { .. } => {}
        FluidFile::Gas { temperature, pressure, .. } => {
            field(temperature, Dimension::Temperature, old.temperature, new.temperature, None);
            field(pressure, Dimension::Pressure, old.pressure, new.pressure, None);
        }
        FluidFile::Steam { temperature, pressure } => {
            opt(temperature, Dimension::Temperature, old.temperature, new.temperature, None);
            field(pressure, Dimension::Pressure, old.pressure, new.pressure, None);
        }
    }
    // A custom bore's diameter is read in mm when bare, whatever the
    // sheet's units, so it needs no rewriting.
    opt(&mut l.roughness, Dimension::Roughness, old.roughness, new.roughness, None);
    field(&mut l.length, Dimension::Length, old.length, new.length, None);
    opt(&mut l.equivalent_length, Dimension::Length, old.length, new.length, None);
    opt(&mut l.rise, Dimension::Length, old.length, new.length, None);
    let lim = &mut l.limits;
    opt(&mut lim.max_drop_per_length, Dimension::DropPerLength, old.drop_per_length, new.drop_per_length, density);
    opt(&mut lim.max_total_drop, Dimension::Pressure, old.pressure, new.pressure, density);
    opt(&mut lim.max_velocity, Dimension::Velocity, old.velocity, new.velocity, None);
    opt(&mut lim.min_velocity, Dimension::Velocity, old.velocity, new.velocity, None);
    // A component's rated drop and flow are read in the sheet's units when
    // bare; its other bore is read in mm whatever the units.
    for c in &mut l.components {
        field(&mut c.drop, Dimension::Pressure, old.pressure, new.pressure, density);
        field(&mut c.at_flow, Dimension::Flow, old.flow, new.flow, density);
    }
}

/// Rewrites every bare number of the sheet's system settings. No density
/// is known here: a unit that needs one (a mass flow, a head of the fluid)
/// is written into the text instead, so the meaning is kept.
pub fn system(s: &mut SystemFile, old: &Units, new: &Units) {
    field(&mut s.source_pressure, Dimension::Pressure, old.pressure, new.pressure, None);
    field(&mut s.outlet_minimum, Dimension::Pressure, old.pressure, new.pressure, None);
    for p in &mut s.pump {
        field(&mut p.flow, Dimension::Flow, old.flow, new.flow, None);
        field(&mut p.head, Dimension::Pressure, old.pressure, new.pressure, None);
    }
    field(&mut s.suction.pressure, Dimension::Pressure, old.pressure, new.pressure, None);
    field(&mut s.suction.height, Dimension::Length, old.length, new.length, None);
    field(&mut s.suction.loss, Dimension::Pressure, old.pressure, new.pressure, None);
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sheet::file::System;

    #[test]
    fn bare_numbers_convert_and_explicit_units_stay() {
        let (si, us) = (Units::defaults(System::Si), Units::defaults(System::Us));
        // 6.309 L/s is 100.0 US gpm.
        assert_eq!(rewrite("6.30902", Dimension::Flow, si.flow, us.flow, None), "100");
        assert_eq!(rewrite("12 m³/h", Dimension::Flow, si.flow, us.flow, None), "12 m³/h");
        assert_eq!(rewrite("20", Dimension::Temperature, si.temperature, us.temperature, None), "68");
        // A head needs a density; without one the old unit is written in.
        assert_eq!(rewrite("10", Dimension::Pressure, si.pressure, us.pressure, None), "1.45038");
        let head = units::find(Dimension::Pressure, "m head").unwrap();
        assert_eq!(rewrite("3", Dimension::Pressure, head, us.pressure, None), "3 m head");
        // A component's bare rated drop and flow keep their meaning too.
        let mut l: LineFile = serde_json::from_str(
            r#"{"flow":"1","fluid":{"kind":"water","temperature":"10"},"pipe":{"series":"copper-l"},
            "components":[{"kind":"rated","drop":"6.894757","at_flow":"6.30902"}]}"#,
        )
        .unwrap();
        l.load = Some(crate::sheet::file::LoadFile { power: "0.29307107".into(), delta_t: "5".into() });
        line(&mut l, &si, &us, Some(1000.0));
        assert_eq!((l.components[0].drop.as_str(), l.components[0].at_flow.as_str()), ("1", "100"));
        // A heat load's bare numbers too: 0.29307107 kW is 1000 Btu/h (NIST
        // SP 811, Btu_IT), a 5 K difference is 9 °F.
        let load = l.load.unwrap();
        assert_eq!((load.power.as_str(), load.delta_t.as_str()), ("1000", "9"));
        // The system settings' bare numbers keep their meaning: 6.894757 kPa
        // is 1 psi, 6.30902 L/s is 100 gpm; "2 m" names its unit and stays.
        let mut sys = SystemFile {
            source_pressure: "6.894757".into(),
            pump: vec![crate::sheet::file::PumpPointFile { flow: "6.30902".into(), head: "3 m head".into() }],
            ..SystemFile::default()
        };
        sys.suction.height = "2 m".into();
        system(&mut sys, &si, &us);
        assert_eq!((sys.source_pressure.as_str(), sys.pump[0].flow.as_str()), ("1", "100"));
        assert_eq!((sys.pump[0].head.as_str(), sys.suction.height.as_str()), ("3 m head", "2 m"));
        // Text that is not a number is left alone: nothing typed is lost.
        assert_eq!(rewrite("lots", Dimension::Flow, si.flow, us.flow, None), "lots");
    }
}
