//! Lines joined into a system: loads carried up the tree, bad trees named,
//! the index circuit and the pump duty. A scenario of our own (an invented
//! clinic's chilled water), checked by hand step by step.
#![cfg(not(target_arch = "wasm32"))]

use headroom::hydraulics::field::Field;
use headroom::sheet::file::SheetFile;
use headroom::sheet::report::{evaluate, json, system_lines, table};
use headroom::sheet::system;

const CLINIC: &str = r#"{"format":"headroom-sheet","version":2,"basis":{"circuit":"closed"},"lines":[
  {"name":"CHW main","load":{"power":"","delta_t":"6 K"},"diversity":"0.9",
   "fluid":{"kind":"water","temperature":"7 °C","pressure":"300 kPa"},"pipe":{"series":"steel-sch40"},"length":"30 m",
   "fittings":[{"fitting":"elbow90-welded","count":4}],"limits":{"max_drop_per_length":"300 Pa/m","max_velocity":"2.4 m/s"}},
  {"name":"Riser A","fed_from":"CHW main","load":{"power":"","delta_t":"6 K"},
   "fluid":{"kind":"water","temperature":"7 °C","pressure":"300 kPa"},"pipe":{"series":"steel-sch40"},"length":"18 m","rise":"12 m",
   "limits":{"max_drop_per_length":"300 Pa/m","max_velocity":"2.4 m/s"}},
  {"name":"AHU-1 coil branch","fed_from":"Riser A","load":{"power":"40 kW","delta_t":"6 K"},
   "fluid":{"kind":"water","temperature":"7 °C","pressure":"300 kPa"},"pipe":{"series":"copper-l"},"length":"9 m",
   "components":[{"name":"AHU-1 coil","kind":"rated","drop":"30 kPa","at_flow":"1.6 L/s"}],
   "limits":{"max_drop_per_length":"400 Pa/m","max_velocity":"1.5 m/s"}},
  {"name":"AHU-2 coil branch","fed_from":"Riser A","load":{"power":"25 kW","delta_t":"6 K"},
   "fluid":{"kind":"water","temperature":"7 °C","pressure":"300 kPa"},"pipe":{"series":"copper-l"},"length":"6 m",
   "limits":{"max_drop_per_length":"400 Pa/m","max_velocity":"1.5 m/s"}},
  {"name":"Fan-coil branch","fed_from":"CHW main","load":{"power":"12 kW","delta_t":"6 K"},
   "fluid":{"kind":"water","temperature":"7 °C","pressure":"300 kPa"},"pipe":{"series":"copper-l"},"length":"25 m",
   "limits":{"max_drop_per_length":"400 Pa/m","max_velocity":"1.5 m/s"}}
]}"#;

#[test]
fn loads_add_up_the_tree_and_the_worst_path_sets_the_pump() {
    let sheet = SheetFile::from_json(CLINIC).unwrap();
    let reports = evaluate(&sheet);
    let o: Vec<_> = reports.iter().map(|r| r.outcome.as_ref().unwrap_or_else(|e| panic!("{e:?}"))).collect();
    let q = |i: usize| o[i].line.flow.value;
    // Step 1, loads by hand: Riser A carries 40 + 25 = 65 kW; the main
    // carries its own 0 + 0.9 × (65 + 12) = 69.3 kW.
    // Step 2, flows: every line is water at 7 °C and 300 kPa with a 6 K
    // difference, so Q = Φ / (ρ c_p ΔT) is proportional to Φ: the riser
    // carries 65/40 of AHU-1's flow and the main 69.3/40 of it.
    assert!((q(1) / q(2) - 65.0 / 40.0).abs() < 1e-12);
    assert!((q(0) / q(2) - 69.3 / 40.0).abs() < 1e-12);
    assert!((q(4) / q(2) - 12.0 / 40.0).abs() < 1e-12);
    // Step 3, AHU-1's own flow: 40 kW / (999.9 kg/m³ × 4200 J/(kg·K) × 6 K)
    // = 1.587e-3 m³/s with ρ and c_p of water at 7 °C rounded from CRC
    // (from memory); within 0.2 %.
    assert!((q(2) - 1.5874e-3).abs() < 0.002 * 1.5874e-3, "{}", q(2));
    assert!(o[0].flow_text.as_deref().unwrap().contains("for 69.3 kW (0 kW own + 0.9 × 77.0 kW from its branches)"));
    // Step 4, paths: each end line's drop is the sum of the shown sizes'
    // total drops from it to the main (closed loop: no static).
    let d = |i: usize| o[i].sizing.candidates[o[i].shown.unwrap()].point.total_drop.value;
    let tree = system::tree(&sheet.lines);
    let sum = system::summarise(&tree, &reports, &sheet.units(), &sheet.system);
    let by_end = |end: usize| sum.paths.iter().find(|p| p.lines[0] == end).unwrap().drop_pa;
    assert!((by_end(2) - (d(2) + d(1) + d(0))).abs() < 1e-6);
    assert!((by_end(3) - (d(3) + d(1) + d(0))).abs() < 1e-6);
    assert!((by_end(4) - (d(4) + d(0))).abs() < 1e-6);
    // Step 5, the index circuit is the worst path (AHU-1, with its 30 kPa
    // coil rated at 1.6 L/s), and the pump head counts it on the flow run and
    // on a mirrored return: twice its drop; the duty flow is the main's.
    assert_eq!(sum.paths[0].lines, vec![2, 1, 0]);
    assert!((sum.head_pa.unwrap() - 2.0 * by_end(2)).abs() < 1e-6);
    assert_eq!(sum.flow_m3_s, Some(q(0)));
    assert!(sum.paths[0].static_pa > 100e3, "the riser rises 12 m, shown apart");
    // Every form says it.
    let text = table(&sheet, &reports);
    assert!(text.contains("Index circuit: CHW main → Riser A → AHU-1 coil branch — pump duty"), "{text}");
    assert!(text.contains("flow and a mirrored return"), "{text}");
    assert_eq!(system_lines(&sheet, &reports)[0].lines().count(), 1);
    let v: serde_json::Value = serde_json::from_str(&json(&sheet, &reports)).unwrap();
    assert_eq!(v["index_circuit"], serde_json::json!([1, 2, 3]));
    assert!((v["pump_head_pa"].as_f64().unwrap() - sum.head_pa.unwrap()).abs() < 1e-6);
}

#[test]
fn bad_trees_are_named_and_nothing_is_lost() {
    // A line fed from a missing line, one from itself, and two feeding each
    // other: each is reported beside "fed from", still sizes on its own, and
    // its text is kept as typed.
    let text = CLINIC
        .replace(
            r#""fed_from":"CHW main","load":{"power":"","delta_t":"6 K"}"#,
            r#""fed_from":"AHU-1 coil branch","load":{"power":"","delta_t":"6 K"}"#,
        )
        .replace(r#""name":"Fan-coil branch","fed_from":"CHW main""#, r#""name":"Fan-coil branch","fed_from":"Boiler""#)
        .replace(
            r#""name":"AHU-2 coil branch","fed_from":"Riser A""#,
            r#""name":"AHU-2 coil branch","fed_from":"AHU-2 coil branch""#,
        );
    let sheet = SheetFile::from_json(&text).unwrap();
    let tree = system::tree(&sheet.lines);
    let about = |i: usize| tree.problems.iter().filter(|(k, _)| *k == i).map(|(_, m)| m.as_str()).collect::<Vec<_>>();
    assert!(
        about(1).iter().any(|m| m.contains("circle") && m.contains("“Riser A” → “AHU-1 coil branch”")),
        "{:?}",
        about(1)
    );
    assert!(about(2).iter().any(|m| m.contains("circle")));
    assert_eq!(about(3), vec!["a line cannot be fed from itself"]);
    assert_eq!(about(4), vec!["no line is named “Boiler” to feed this one"]);
    let reports = evaluate(&sheet);
    for (i, r) in reports.iter().enumerate().skip(1) {
        match &r.outcome {
            Ok(o) => assert!(o.sizing.warnings.iter().any(|w| w.starts_with("fed from: ")), "line {i}"),
            Err(errs) => assert!(errs.iter().any(|e| e.field == Field::FedFrom), "line {i}: {errs:?}"),
        }
    }
    let again = SheetFile::from_json(&sheet.to_json()).unwrap();
    assert_eq!(again.lines[4].fed_from.as_deref(), Some("Boiler"));
}

#[test]
fn a_typed_flow_below_a_load_is_said_not_hidden() {
    let text = CLINIC.replace(r#""load":{"power":"12 kW","delta_t":"6 K"}"#, r#""flow":"0.5 L/s""#);
    let sheet = SheetFile::from_json(&text).unwrap();
    let reports = evaluate(&sheet);
    let main = reports[0].outcome.as_ref().unwrap();
    let t = main.flow_text.as_deref().unwrap();
    assert!(t.contains("for 58.5 kW") && t.contains("1 branch not included (flow typed, or from fixtures)"), "{t}");
}

/// The clinic's domestic cold water (our own scenario), sized by Hunter's
/// method with flush tanks, in an open system fed at 350 kPa.
const CLINIC_DCW: &str = r#"{"format":"headroom-sheet","version":3,
 "system":{"source_pressure":"350 kPa","outlet_minimum":"55 kPa"},
 "lines":[
  {"name":"DCW main","fixtures":{"supply":"cold","continuous":"0.1 L/s"},
   "fluid":{"kind":"water","temperature":"12 °C"},"pipe":{"series":"copper-l"},"length":"20 m",
   "limits":{"max_drop_per_length":"600 Pa/m","max_velocity":"2 m/s"}},
  {"name":"DCW ground floor","fed_from":"DCW main","fixtures":{"supply":"cold","items":[
     {"kind":"lavatory-public","count":"4"},{"kind":"wc-public-tank","count":"3"}]},
   "fluid":{"kind":"water","temperature":"12 °C"},"pipe":{"series":"copper-l"},"length":"15 m",
   "limits":{"max_drop_per_length":"600 Pa/m","max_velocity":"2 m/s"}},
  {"name":"DCW first floor","fed_from":"DCW main","fixtures":{"supply":"cold","items":[
     {"kind":"lavatory-public","count":"2"},{"kind":"wc-public-tank","count":"2"},{"kind":"service-sink","count":"1"}]},
   "fluid":{"kind":"water","temperature":"12 °C"},"pipe":{"series":"copper-l"},"length":"12 m","rise":"4 m",
   "limits":{"max_drop_per_length":"600 Pa/m","max_velocity":"2 m/s"}}
 ]}"#;

#[test]
fn fixture_units_add_up_the_tree_and_the_flow_comes_from_the_total() {
    let sheet = SheetFile::from_json(CLINIC_DCW).unwrap();
    let reports = evaluate(&sheet);
    let o: Vec<_> = reports.iter().map(|r| r.outcome.as_ref().unwrap_or_else(|e| panic!("{e:?}"))).collect();
    let gpm = 3.785_411_784e-3 / 60.0;
    let q = |i: usize| o[i].line.flow.value / gpm;
    // Step 1, units on the cold supply (IPC 2018 Table E103.3(2), cold
    // column): ground floor 4 × 1.5 + 3 × 5 = 21 WSFU; first floor
    // 2 × 1.5 + 2 × 5 + 1 × 2.25 = 15.25 WSFU; the main 36.25 WSFU.
    // Step 2, flows from the flush-tank curve, straight between rows:
    // 21 WSFU lies 1/5 of the way from 20 (14 gpm) to 25 (17 gpm): 14.6 gpm;
    // 15.25 WSFU, 1/4 from 15 (11) to 16 (12): 11.25 gpm;
    // 36.25 WSFU, 1.25/5 from 35 (22.5) to 40 (25): 23.125 gpm.
    assert!((q(1) - 14.6).abs() < 1e-9, "{}", q(1));
    assert!((q(2) - 11.25).abs() < 1e-9, "{}", q(2));
    // Step 3, the main: 23.125 gpm of fixtures — not 14.6 + 11.25 = 25.85,
    // the sum of its branches' flows — plus its 0.1 L/s continuous flow.
    assert!((o[0].line.flow.value - (23.125 * gpm + 1e-4)).abs() < 1e-12, "{}", q(0));
    assert!(q(0) < q(1) + q(2) + 1e-4 / gpm);
    let t = o[0].flow_text.as_deref().unwrap();
    assert!(t.contains("for 36.25 WSFU (0 own + 36.25 from its branches)") && t.contains("continuous"), "{t}");
    // Step 4, open system: the pressure left at each end line is 350 kPa
    // less the drops (friction, fittings and the 4 m rise) along its path.
    let d = |i: usize| o[i].sizing.candidates[o[i].shown.unwrap()].point.total_drop.value;
    let tree = system::tree(&sheet.lines);
    let sum = system::summarise(&tree, &reports, &sheet.units(), &sheet.system);
    assert_eq!(sum.source_pa, Some(350e3));
    let left = |end: usize| sum.residuals.iter().find(|r| r.end == end).unwrap().pressure_pa;
    assert!((left(1) - (350e3 - d(1) - d(0))).abs() < 1e-6);
    assert!((left(2) - (350e3 - d(2) - d(0))).abs() < 1e-6);
    // The 4 m rise alone takes ρ g h = 999.5 × 9.807 × 4 ≈ 39.2 kPa.
    assert!(o[2].sizing.candidates[o[2].shown.unwrap()].point.static_drop.value > 39e3);
    // Worst first: the first floor, up the rise.
    assert_eq!(sum.residuals[0].end, 2);
    let text = system_lines(&sheet, &reports).join("\n");
    assert!(text.contains("Pressure left at each end line, worst first (source 350 kPa"), "{text}");
}

#[test]
fn a_fixture_of_another_method_or_a_bad_count_is_named() {
    let bad = CLINIC_DCW
        .replace(r#""kind":"service-sink","count":"1""#, r#""kind":"bath-domestic","count":"1""#)
        .replace(r#""kind":"wc-public-tank","count":"3""#, r#""kind":"wc-public-tank","count":"2.5""#);
    let sheet = SheetFile::from_json(&bad).unwrap();
    let reports = evaluate(&sheet);
    let e1 = reports[1].outcome.as_ref().unwrap_err();
    assert!(e1.iter().any(|e| e.field == Field::FixtureCount && e.message.contains("whole number")), "{e1:?}");
    let e2 = reports[2].outcome.as_ref().unwrap_err();
    assert!(e2.iter().any(|e| e.field == Field::Fixtures && e.message.contains("counted in LU")), "{e2:?}");
}

#[test]
fn a_pump_curve_meets_the_system_curve_and_npsh_is_found() {
    // The chilled-water sheet above with a pump of our own invention: its
    // curve through 3 points, an open expansion tank 2 m above the inlet.
    let mut sheet = SheetFile::from_json(CLINIC).unwrap();
    let reports = evaluate(&sheet);
    let tree = system::tree(&sheet.lines);
    let duty = system::summarise(&tree, &reports, &sheet.units(), &sheet.system);
    let (q, h) = (duty.flow_m3_s.unwrap(), duty.head_pa.unwrap());
    sheet.system.pump = vec![
        headroom::sheet::file::PumpPointFile { flow: "0 L/s".into(), head: format!("{} Pa", 1.6 * h) },
        headroom::sheet::file::PumpPointFile { flow: format!("{} m³/s", q), head: format!("{} Pa", 1.2 * h) },
        headroom::sheet::file::PumpPointFile { flow: format!("{} m³/s", 2.0 * q), head: format!("{} Pa", 0.2 * h) },
    ];
    sheet.system.suction.pressure = "101.325 kPa".into();
    sheet.system.suction.height = "2 m".into();
    let sum = system::summarise(&tree, &reports, &sheet.units(), &sheet.system);
    assert!(sum.problems.is_empty(), "{:?}", sum.problems);
    // Closed loop: system curve H = k·Q² through the duty point; the pump
    // gives 1.2 h at the duty flow, so it runs beyond it, where both curves
    // meet: k·Q² = pump(Q).
    let (qo, ho) = sum.operating.unwrap();
    let c = sum.curve.unwrap();
    assert_eq!(c.static_pa, 0.0);
    assert!(qo > q && (ho - c.head(qo)).abs() < 1e-6 * h && (sum.pump.unwrap().head(qo) - ho).abs() < 1e-6 * h);
    // NPSH available: (101 325 − p_v(7 °C) = 1002 Pa, IAPWS-IF97) /
    // (999.9 × 9.80665) + 2 m = 10.23 + 2 = 12.23 m.
    let (n, pv) = sum.npsh.unwrap();
    assert!((pv - 1002.0).abs() < 2.0, "{pv}");
    assert!((n - 12.23).abs() < 0.01, "{n}");
}

#[test]
fn the_combined_supply_counts_a_fixture_once_though_both_supplies_list_it() {
    // A main on the combined supply feeds a cold branch and the heater's
    // hot branch; the four public basins are listed in both.
    let json = r#"{"format":"headroom-sheet","version":3,"lines":[
      {"name":"main","fixtures":{"supply":"total"},"fluid":{"kind":"water","temperature":"12 °C"},
       "pipe":{"series":"copper-l"},"length":"10 m","limits":{"max_velocity":"2 m/s"}},
      {"name":"cold","fed_from":"main","fixtures":{"supply":"cold","items":[
         {"kind":"lavatory-public","count":"4"},{"kind":"wc-public-tank","count":"3"}]},
       "fluid":{"kind":"water","temperature":"12 °C"},"pipe":{"series":"copper-l"},"length":"10 m","limits":{"max_velocity":"2 m/s"}},
      {"name":"hot","fed_from":"main","fixtures":{"supply":"hot","items":[{"kind":"lavatory-public","count":"4"}]},
       "fluid":{"kind":"water","temperature":"60 °C"},"pipe":{"series":"copper-l"},"length":"10 m","limits":{"max_velocity":"1.5 m/s"}}
    ]}"#;
    let sheet = SheetFile::from_json(json).unwrap();
    let tree = system::tree(&sheet.lines);
    let c = system::carried(&sheet.lines, &tree, &sheet.units());
    // IPC 2018 Table E103.3(2): public lavatory 1.5 cold, 1.5 hot, 2.0
    // total; public flush-tank WC 5 cold, 5 total.
    // Cold: 4 × 1.5 + 3 × 5 = 21; hot: 4 × 1.5 = 6; the main, each basin
    // once on the total column: 4 × 2.0 + 3 × 5.0 = 23 (not 21 + 6 = 27).
    assert_eq!(c[1].unwrap().fixture_units, 21.0);
    assert_eq!(c[2].unwrap().fixture_units, 6.0);
    assert_eq!(c[0].unwrap().fixture_units, 23.0);
    assert_eq!(c[0].unwrap().largest_unit, 5.0);
}
