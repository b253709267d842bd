//! Property tests over the core and the sheet boundary, for a bounded
//! number of cases each (proptest; no timing involved).
#![cfg(not(target_arch = "wasm32"))]

use headroom::hydraulics::fluid::{Fluid, Glycol};
use headroom::hydraulics::friction::{colebrook, darcy};
use headroom::hydraulics::line::{pa_per_m, Circuit, Limits, Line, Method, Pipe};
use headroom::hydraulics::losses::{Component, Fitting, Fittings};
use headroom::hydraulics::pipes::{self, SERIES};
use headroom::hydraulics::sizing;
use headroom::hydraulics::velocity;
use headroom::sheet::file::SheetFile;
use headroom::sheet::units::{self, format_number, Dimension, UNITS};
use proptest::prelude::*;
use uom::si::f64::{Length, Pressure, ThermodynamicTemperature, Velocity, VolumeRate};
use uom::si::length::{meter, millimeter};
use uom::si::pressure::pascal;
use uom::si::thermodynamic_temperature::degree_celsius;
use uom::si::velocity::meter_per_second;
use uom::si::volume_rate::liter_per_second;

fn water_line(flow_lps: f64, t_c: f64, rough_mm: f64, series: &'static pipes::Series) -> Line {
    Line {
        flow: VolumeRate::new::<liter_per_second>(flow_lps),
        fluid: Fluid::Water,
        temperature: ThermodynamicTemperature::new::<degree_celsius>(t_c),
        pressure: Pressure::new::<pascal>(500e3),
        pipe: Pipe::Series(series),
        roughness: Length::new::<millimeter>(rough_mm),
        length: Length::new::<meter>(50.0),
        fittings: Fittings {
            counts: vec![(Fitting::Elbow90Welded, 4)],
            components: Vec::new(),
            extra_k: 1.0,
            equivalent_length: None,
        },
        rise: Length::new::<meter>(3.0),
        method: Method::DarcyWeisbach,
        limits: Limits { max_drop_per_length: Some(pa_per_m(400.0)), ..Limits::default() },
        circuit: Circuit::Open,
        freeze_margin: 3.0,
        every_size: true,
        smallest: None,
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    /// Drop per length falls as the bore grows, for any flow, temperature,
    /// roughness and series: the property the whole search relies on.
    #[test]
    fn drop_per_length_falls_as_the_bore_grows(
        flow in 0.001f64..500.0, t in 1.0f64..95.0, rough in 0.0f64..0.5, s in 0..SERIES.len(),
    ) {
        let sizing = sizing::size(&water_line(flow, t, rough, &SERIES[s]).validate().unwrap()).unwrap();
        for pair in sizing.candidates.windows(2) {
            prop_assert!(pair[1].point.drop_per_length < pair[0].point.drop_per_length,
                "{} then {}", pair[0].nominal, pair[1].nominal);
            prop_assert!(pair[1].point.velocity < pair[0].point.velocity);
        }
    }

    /// f is continuous in the turbulent range: a relative nudge of 1e-9 in
    /// Re or ε/D moves f by far less than 1e-6.
    #[test]
    fn friction_factor_is_continuous_in_the_turbulent_range(
        log_re in 3.61f64..8.0, rr in 0.0f64..0.05,
    ) {
        let re = 10f64.powf(log_re);
        let f = colebrook(re, rr).unwrap();
        let df_re = (colebrook(re * (1.0 + 1e-9), rr).unwrap() - f).abs() / f;
        let df_rr = (colebrook(re, rr * (1.0 + 1e-9) + 1e-15).unwrap() - f).abs() / f;
        prop_assert!(df_re < 1e-6 && df_rr < 1e-6, "{df_re} {df_rr}");
        // And it lies on the Moody chart's envelope: between the fully rough
        // limit and the laminar line's extension.
        prop_assert!(f > 0.005 && f < 0.1);
    }

    /// Writing a value in a unit and reading it back gives the value again.
    #[test]
    fn parse_of_format_round_trips(mantissa in 1.0f64..10.0, exp in -4i32..8, unit in 0..UNITS.len(), rho in 500.0f64..2000.0) {
        let u = &UNITS[unit];
        let shown = mantissa * 10f64.powi(exp);
        let text = units::format(shown, u, 17);
        let back = units::parse(u.dimension, &text, u).unwrap();
        prop_assert_eq!(back.unit.symbol, u.symbol);
        prop_assert!(((back.value - shown) / shown).abs() < 1e-15, "{} → {}", text, back.value);
        // Through SI and back, with a density for heads and mass flows, and
        // for standard volumes a gas (air) to give the reference density.
        let air = headroom::hydraulics::fluid::Fluid::Gas(headroom::hydraulics::fluid::Gas::Named(
            &headroom::hydraulics::fluid::gas::AIR,
        ));
        let si = back.flow_si(Some(rho), Some(&air)).unwrap();
        let again = units::flow_from_si(si, u, Some(rho), Some(&air)).unwrap();
        // Temperatures go through an offset (273.15 K, 459.67 °R), so their
        // error is relative to the kelvin value, not to a reading near zero.
        // Gauge pressures likewise go through one atmosphere (1.01 bar, 14.7 psi).
        let scale = if u.dimension == Dimension::Temperature {
            shown.abs().max(500.0)
        } else if u.reference() == Some("gauge") {
            shown.abs().max(20.0)
        } else {
            shown.abs()
        };
        prop_assert!((again - shown).abs() < 1e-12 * scale, "{} {}", again, shown);
        prop_assert_ne!(format_number(si, 4), "—");
    }

    /// No input makes the core panic, and a result it gives is never NaN.
    #[test]
    fn no_input_makes_the_core_panic(
        flow in prop::num::f64::ANY, t in prop::num::f64::ANY, p in prop::num::f64::ANY,
        rough in prop::num::f64::ANY, len in prop::num::f64::ANY, rise in prop::num::f64::ANY,
        k in prop::num::f64::ANY, lim in prop::num::f64::ANY, c in prop::num::f64::ANY,
        bore in prop::num::f64::ANY, glycol_x in prop::num::f64::ANY, which in 0u8..4, hw in any::<bool>(),
    ) {
        let fluid = match which {
            0 => Fluid::Water,
            1 => Fluid::GlycolMix(Glycol::Ethylene, glycol_x),
            2 => Fluid::GlycolMix(Glycol::Propylene, glycol_x),
            _ => Fluid::Custom(headroom::hydraulics::fluid::Properties {
                density: uom::si::f64::MassDensity::new::<uom::si::mass_density::kilogram_per_cubic_meter>(p),
                viscosity: uom::si::f64::DynamicViscosity::new::<uom::si::dynamic_viscosity::pascal_second>(k),
            }),
        };
        let line = Line {
            flow: VolumeRate::new::<liter_per_second>(flow),
            fluid,
            temperature: ThermodynamicTemperature::new::<degree_celsius>(t),
            pressure: Pressure::new::<pascal>(p),
            pipe: if bore.is_sign_negative() { Pipe::Series(&SERIES[0]) } else { Pipe::Custom(Length::new::<millimeter>(bore)) },
            roughness: Length::new::<millimeter>(rough),
            length: Length::new::<meter>(len),
            fittings: Fittings {
                counts: vec![(Fitting::GlobeValve, 2)],
                components: vec![
                    Component::Kv(lim),
                    Component::Butterfly,
                    Component::Reducer { to_bore_m: 0.05, angle_deg: 30.0 },
                    Component::Rated { drop_pa: lim * 100.0, flow_m3_s: flow * 1e-3 },
                ],
                extra_k: k,
                equivalent_length: Some(Length::new::<meter>(len)),
            },
            rise: Length::new::<meter>(rise),
            method: if hw { Method::HazenWilliams { c } } else { Method::DarcyWeisbach },
            limits: Limits {
                max_drop_per_length: Some(pa_per_m(lim)),
                max_total_drop: Some(Pressure::new::<pascal>(lim * 100.0)),
                max_velocity: Some(Velocity::new::<meter_per_second>(lim)),
                min_velocity: None,
                velocity_by_size: if hw { velocity::rule("hydronic") } else { None },
                max_drop_fraction: None,
            },
            circuit: if rise > 0.0 { Circuit::Closed } else { Circuit::Open },
            freeze_margin: 3.0,
            every_size: hw,
            smallest: None,
        };
        // Invalid input is refused by validate(); everything it lets through
        // sizes to finite numbers.
        let Ok(line) = line.validate() else { return Ok(()) };
        if let Ok(s) = sizing::size(&line) {
            for cand in &s.candidates {
                let pt = &cand.point;
                for v in [pt.velocity.value, pt.reynolds, pt.friction_factor, pt.drop_per_length.value, pt.total_drop.value] {
                    prop_assert!(v.is_finite(), "{:?}", pt);
                }
                let cap = sizing::capacity(&line, pt.bore).unwrap();
                if let Some(q) = cap.max_flow {
                    prop_assert!(q.value.is_finite() && q.value >= 0.0);
                }
            }
        }
        let _ = darcy(flow, rough);
    }

    /// Any text at all given to the sheet reader is a sheet or a clear error.
    #[test]
    fn the_sheet_reader_never_panics(text in ".{0,400}") {
        let _ = SheetFile::from_json(&text);
    }

    /// Sheets of the right shape with any values inside: results or field
    /// errors, never a panic.
    #[test]
    fn sheet_values_never_panic(
        flow in ".{0,12}", t in ".{0,8}", len in ".{0,8}", lim in ".{0,10}", series in 0..SERIES.len(),
    ) {
        let doc = serde_json::json!({
            "format": "headroom-sheet", "version": 1,
            "lines": [{
                "flow": flow, "fluid": {"kind": "water", "temperature": t},
                "pipe": {"series": SERIES[series].id}, "length": len,
                "limits": {"max_drop_per_length": lim, "max_velocity": lim}
            }]
        });
        if let Ok(sheet) = SheetFile::from_json(&doc.to_string()) {
            let reports = headroom::sheet::report::evaluate(&sheet);
            let _ = headroom::sheet::report::table(&sheet, &reports);
            let _ = headroom::sheet::report::csv(&sheet, &reports);
            let _ = headroom::sheet::report::json(&sheet, &reports);
        }
    }
}

#[test]
fn dimensions_of_all_units_are_covered() {
    // Every field kind has a default unit in both systems (a guard for the
    // page's unit pickers).
    for d in Dimension::ALL {
        assert!(units::of(d).count() >= 2, "{d:?}");
    }
}
