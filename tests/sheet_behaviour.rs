//! Behaviour of a line read from sheet text: methods, units that need the
//! fluid's density, fluid errors, the explain trace.
#![cfg(not(target_arch = "wasm32"))]

use headroom::hydraulics::sizing;
use headroom::sheet::file::{FieldError, SheetFile};
use headroom::sheet::report::{evaluate, Outcome};

fn sheet(line: &str) -> String {
    format!(r#"{{"format":"headroom-sheet","version":1,"lines":[{line}]}}"#)
}

fn outcome(line: &str) -> Result<Outcome, Vec<FieldError>> {
    let s = SheetFile::from_json(&sheet(line)).unwrap();
    evaluate(&s).remove(0).outcome
}

#[test]
fn hazen_williams_matches_the_printed_si_form_and_warns_out_of_range() {
    // hf/L = 10.67 Q^1.852 / (C^1.852 D^4.8704) (SI form, common practice).
    let o = outcome(
        r#"{"flow":"1.5 L/s","fluid":{"kind":"water","temperature":"12 °C"},
        "pipe":{"series":"copper-l"},"length":"30 m","method":"hazen-williams",
        "limits":{"max_velocity":"1.5 m/s"}}"#,
    )
    .unwrap();
    assert!(o.sizing.warnings.is_empty());
    let c = o.sizing.proposal().unwrap();
    let (q, d, cf) = (1.5e-3f64, c.point.bore.value, 150.0f64);
    let printed = 10.67 * q.powf(1.852) / (cf.powf(1.852) * d.powf(4.8704));
    let rho = o.sizing.properties.density_kg_m3();
    let ours = c.point.drop_per_length.value / (rho * 9.80665);
    assert!(((ours - printed) / printed).abs() < 0.01, "{ours} vs {printed}");
    // Hot water: the method is flagged.
    let hot = outcome(
        r#"{"flow":"1.5 L/s","fluid":{"kind":"water","temperature":"70 °C"},
        "pipe":{"series":"copper-l"},"length":"30 m","method":"hazen-williams",
        "limits":{"max_velocity":"1.5 m/s"}}"#,
    )
    .unwrap();
    assert_eq!(hot.sizing.warnings.len(), 1);
    assert!(hot.sizing.warnings[0].contains("water near room temperature"));
}

#[test]
fn mass_flow_and_head_limits_use_the_fluids_density() {
    // 5 kg/s of water at 20 °C (ρ 998.2) is 5.009 L/s; a limit of 4 m per
    // 100 m of water is 0.04 · 998.2 · 9.80665 = 391.6 Pa/m.
    let by_mass = outcome(
        r#"{"flow":"5 kg/s","fluid":{"kind":"water","temperature":"20"},
        "pipe":{"series":"steel-sch40"},"length":"10","limits":{"max_drop_per_length":"4 m/100 m"}}"#,
    )
    .unwrap();
    assert!((by_mass.line.flow.value - 5.0 / 998.2).abs() < 5e-7);
    let lim = by_mass.line.limits.max_drop_per_length.unwrap().value;
    assert!((lim - 0.04 * 998.2 * 9.80665).abs() < 0.05);
}

#[test]
fn fluid_errors_land_on_the_fluid_field() {
    let e = outcome(
        r#"{"flow":"1","fluid":{"kind":"glycol","glycol":"ethylene","percent":"20","temperature":"-15"},
        "pipe":{"series":"steel-sch40"},"length":"10","limits":{"max_velocity":"2"}}"#,
    )
    .unwrap_err();
    assert_eq!(e[0].field, "fluid");
    assert!(e[0].message.contains("freezes at -7.9"), "{}", e[0].message);
    let e = outcome(
        r#"{"flow":"1","fluid":{"kind":"water","temperature":"130"},
        "pipe":{"series":"steel-sch40"},"length":"10","limits":{"max_velocity":"2"}}"#,
    )
    .unwrap_err();
    assert!(e[0].message.contains("boils below"), "{}", e[0].message);
}

#[test]
fn every_bad_field_is_reported_at_once() {
    let e = outcome(
        r#"{"flow":"lots","fluid":{"kind":"water","temperature":"hot"},
        "pipe":{"series":"steel-sch99"},"length":"long","limits":{}}"#,
    )
    .unwrap_err();
    let fields: Vec<&str> = e.iter().map(|f| f.field.path()).collect();
    for want in ["fluid.temperature", "pipe.series", "length", "limits"] {
        assert!(fields.contains(&want), "{fields:?}");
    }
}

#[test]
fn a_quick_check_needs_only_a_flow_and_one_limit() {
    // No length: the line sizes by velocity and drop per length, and its
    // total drop is not shown (not shown as zero).
    let o = outcome(
        r#"{"flow":"6","fluid":{"kind":"water","temperature":"10"},
        "pipe":{"series":"steel-sch40"},"length":"","limits":{"max_velocity":"2"}}"#,
    )
    .unwrap();
    assert!(o.sizing.proposed.is_some());
    assert!(!o.length_given);
    let f = o.figures.as_ref().unwrap();
    assert_eq!((f.total_drop.as_str(), f.friction_drop.as_str()), ("", ""));
    assert!(!f.drop_per_length.is_empty());
    // A total-drop limit needs the length, and says so beside it.
    let e = outcome(
        r#"{"flow":"6","fluid":{"kind":"water","temperature":"10"},
        "pipe":{"series":"steel-sch40"},"length":"","limits":{"max_total_drop":"20 kPa"}}"#,
    )
    .unwrap_err();
    assert_eq!(e[0].field.path(), "length");
    assert!(e[0].message.contains("enter the length"), "{}", e[0].message);
}

#[test]
fn the_explain_trace_names_formula_and_source_for_each_step() {
    let o = outcome(
        r#"{"flow":"6 L/s","fluid":{"kind":"water","temperature":"10"},
        "pipe":{"series":"steel-sch40"},"length":"20","rise":"3",
        "fittings":[{"fitting":"valve-globe","count":1}],
        "components":[{"kind":"cv","value":"60"},{"kind":"rated","drop":"20 kPa","at_flow":"5 L/s"}],
        "limits":{"max_drop_per_length":"300"}}"#,
    )
    .unwrap();
    let c = o.sizing.proposal().unwrap();
    let steps = sizing::trace(&o.line, c);
    let symbols: Vec<&str> = steps.iter().map(|s| s.symbol).collect();
    assert_eq!(symbols, ["ρ", "μ", "D", "V", "Re", "ε/D", "f", "Δp/L", "Δp_f", "ΣK", "Δp_K", "Δp_c", "Δp_z", "Δp"]);
    assert!(steps.iter().all(|s| !s.formula.is_empty() && !s.source.is_empty() && s.value.is_finite()));
    // The steps add up: Δp = Δp_f + Δp_K + Δp_c + Δp_z.
    let v = |sym: &str| steps.iter().find(|s| s.symbol == sym).unwrap().value;
    assert!((v("Δp") - (v("Δp_f") + v("Δp_K") + v("Δp_c") + v("Δp_z"))).abs() < 1e-9 * v("Δp"));
    // Components by hand: Cv 60 is Kv 60/1.156 = 51.903; at 6 L/s = 21.6 m³/h
    // of water at 10 °C (ρ 999.70 kg/m³, IAPWS-IF97): (21.6/51.903)² × 0.99970 bar
    // = 17 314 Pa; the rated 20 kPa at 5 L/s becomes 20 × 1.2² = 28.8 kPa.
    let want = 1e5 * 0.999_70 * (21.6f64 / (60.0 / 1.156)).powi(2) + 28_800.0;
    assert!((v("Δp_c") - want).abs() < 1e-4 * want, "{} vs {want}", v("Δp_c"));
    // And Re is recomputable from the steps before it.
    assert!((v("Re") - v("ρ") * v("V") * v("D") / v("μ")).abs() < 1e-9 * v("Re"));
}

#[test]
fn a_sheet_round_trips_through_its_json() {
    let text =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/examples/clinic-chilled-water.json")).unwrap();
    let s = SheetFile::from_json(&text).unwrap();
    let again = SheetFile::from_json(&s.to_json()).unwrap();
    assert_eq!(s, again);
}

#[test]
fn the_view_model_holds_what_every_view_shows() {
    use headroom::sheet::file::{System, Units};
    use headroom::sheet::units::show;
    let o = outcome(
        r#"{"flow":"6 L/s","fluid":{"kind":"water","temperature":"10"},
        "pipe":{"series":"steel-sch40"},"length":"20",
        "limits":{"max_drop_per_length":"300","max_velocity":"2"}}"#,
    )
    .unwrap();
    let shown = o.shown.unwrap();
    let u = Units::defaults(System::Si);
    let d = headroom::sheet::report::detail(&o, &u);
    // The sizes around the answer: two either side of it, in order.
    let idx: Vec<usize> = d.nearby.iter().map(|n| n.index).collect();
    assert_eq!(idx, (shown - 2..=shown + 2).collect::<Vec<_>>());
    // Each one's figures are the point's values in the sheet's units, and
    // its capacity is the capacity solve's answer.
    let rho = o.sizing.properties.density_kg_m3();
    for n in &d.nearby {
        let c = &o.sizing.candidates[n.index];
        assert_eq!(n.figures.size, c.nominal);
        assert_eq!(n.figures.velocity, show(c.point.velocity.value, u.velocity, Some(rho), 3));
        assert_eq!(n.figures.total_drop, show(c.point.total_drop.value, u.pressure, Some(rho), 3));
        let cap = sizing::capacity(&o.line, c.point.bore).unwrap().max_flow.unwrap();
        assert_eq!(n.capacity_text, show(cap.value, u.flow, Some(rho), 3));
        assert_eq!(n.figures.checks.len(), 2, "one per limit set");
    }
    assert_eq!(o.capacity, d.nearby[2].capacity, "the shown size's capacity");
    assert_eq!(o.figures.as_ref(), Some(&d.nearby[2].figures));
    assert_eq!(d.trace, sizing::trace(&o.line, &o.sizing.candidates[shown]));
    assert!(o.figures.unwrap().checks.iter().all(|k| k.met));
}

#[test]
fn compact_and_pretty_json_are_what_serde_json_writes() {
    // The reference is serde_json's own writers (`to_string`,
    // `to_string_pretty`): the sheet writes both layouts by hand
    // (`sheet::records`), and must come out byte for byte the same. Text
    // with quotes, backslashes, spaces, line breaks and non-ASCII inside
    // strings must pass through untouched.
    for path in ["examples/clinic-chilled-water.json", "examples/clinic-domestic-water.json"] {
        let text = std::fs::read_to_string(format!("{}/{path}", env!("CARGO_MANIFEST_DIR"))).unwrap();
        let mut file = SheetFile::from_json(&text).unwrap();
        file.project = "Bay \"A\" \\ west :  { [\n\t] } , ÷ 5 °C".to_owned();
        assert_eq!(file.to_compact_json(), serde_json::to_string(&file).unwrap(), "{path}");
        assert_eq!(file.to_json(), serde_json::to_string_pretty(&file).unwrap(), "{path}");
        assert_eq!(SheetFile::from_json(&file.to_compact_json()).unwrap(), file);
    }
}

#[test]
fn a_sheet_with_every_field_set_is_written_as_serde_json_writes_it() {
    // Every optional member given, every kind of fluid, both kinds of
    // pipe, every kind of component, and a text holding every ASCII
    // character (each control character has its own escape) and some
    // beyond: both layouts byte for byte as serde_json writes them.
    let every_char: String = (0u8..=0x7f).map(char::from).chain("é €😀".chars()).collect();
    let line = |name: &str, fluid: serde_json::Value, pipe: serde_json::Value| {
        serde_json::json!({
            "name": name, "flow": "2 L/s",
            "load": {"power": "40 kW", "delta_t": "6 K"},
            "fed_from": "main", "diversity": "0.9",
            "fixtures": {"supply": "hot", "items": [{"kind": "basin", "count": "3"}], "continuous": "0.1 L/s"},
            "fluid": fluid, "pipe": pipe, "roughness": "0.05 mm", "aged": true, "length": "12 m",
            "fittings": [{"fitting": "elbow90-long", "count": 2}, {"fitting": "tee-run", "count": "2.5"}],
            "components": [
                {"name": "V-1", "kind": "kv", "value": "16"},
                {"name": "V-2", "kind": "cv", "value": "20"},
                {"name": "coil", "kind": "rated", "drop": "30 kPa", "at_flow": "2 L/s"},
                {"name": "BFV", "kind": "butterfly"},
                {"name": "R", "kind": "reducer", "to_bore": "40 mm", "angle": "30"}
            ],
            "extra_k": "1.5", "equivalent_length": "3 m", "rise": "-2 m",
            "method": "hazen-williams", "hazen_williams_c": "130",
            "limits": {"max_drop_per_length": "300 Pa/m", "max_total_drop": "50 kPa", "max_velocity": "2 m/s",
                       "min_velocity": "0.5 m/s", "velocity_by_size": "ashrae", "max_drop_percent": "10"},
            "check_size": "DN 50", "smallest_size": "DN 20"
        })
    };
    let sheet = serde_json::json!({
        "format": "headroom-sheet", "version": 4, "project": every_char, "date": "2026-12-05",
        "units": {"system": "us", "flow": "gpm", "pressure": "psi", "drop_per_length": "ft/100 ft", "length": "ft",
                  "velocity": "ft/s", "temperature": "°F", "roughness": "in", "power": "Btu/h",
                  "temperature_difference": "°F"},
        "basis": {"circuit": "closed", "freeze_margin_k": 5, "every_size": true, "return_run": "entered",
                  "demand": "en806-3"},
        "system": {"source_pressure": "4 bar", "outlet_minimum": "1 bar",
                   "pump": [{"flow": "1 L/s", "head": "10 m"}, {"flow": "2 L/s", "head": "8 m"}],
                   "suction": {"pressure": "101 kPa", "height": "2 m", "loss": "1 kPa"}},
        "lines": [
            line("w", serde_json::json!({"kind": "water", "temperature": "7 °C", "pressure": "3 bar"}),
                 serde_json::json!({"series": "steel-sch40"})),
            line("g", serde_json::json!({"kind": "glycol", "glycol": "propylene", "percent": "30", "temperature": "-5 °C"}),
                 serde_json::json!({"bore": {"diameter": "52.5", "material": "pe"}})),
            line("c", serde_json::json!({"kind": "custom", "density_kg_m3": "870", "viscosity_mpa_s": "12",
                                         "kinematic_viscosity_mm2_s": "14"}), serde_json::json!({"series": "copper-l"})),
            line("a", serde_json::json!({"kind": "gas", "gas": "custom", "temperature": "20 °C", "pressure": "7 barg",
                                         "relative_density": "0.6", "molar_mass": "18", "viscosity_mpa_s": "0.011",
                                         "z": "0.98"}), serde_json::json!({"series": "steel-sch80"})),
            line("s", serde_json::json!({"kind": "steam", "pressure": "8 barg", "temperature": "200 °C"}),
                 serde_json::json!({"series": "steel-sch40"}))
        ]
    });
    let file: SheetFile = serde_json::from_value(sheet).unwrap();
    assert_eq!(file.to_compact_json(), serde_json::to_string(&file).unwrap());
    assert_eq!(file.to_json(), serde_json::to_string_pretty(&file).unwrap());
    assert_eq!(SheetFile::from_json(&file.to_compact_json()).unwrap(), file);
    // Each member left out in turn where it may be.
    let mut bare = file.clone();
    bare.lines.truncate(1);
    bare.units = Default::default();
    bare.basis = Default::default();
    bare.system = Default::default();
    let l = &mut bare.lines[0];
    (l.load, l.fed_from, l.diversity, l.fixtures, l.roughness) = (None, None, None, None, None);
    (l.extra_k, l.equivalent_length, l.rise, l.hazen_williams_c) = (None, None, None, None);
    (l.check_size, l.smallest_size, l.aged) = (None, None, false);
    (l.fittings, l.components, l.limits) = (Vec::new(), Vec::new(), Default::default());
    assert_eq!(bare.to_compact_json(), serde_json::to_string(&bare).unwrap());
    assert_eq!(bare.to_json(), serde_json::to_string_pretty(&bare).unwrap());
}

#[test]
fn the_device_store_writes_its_lists_as_serde_json_writes_them() {
    // The index of stored worksheets and a deleted worksheet in the trash
    // are written by hand; the reference is serde_json's `to_string` of
    // the same records read back with their derived readers.
    use headroom::sheet::library::{Entry, Kv, Library, MemoryKv, Trashed, INDEX_KEY, TRASH_PREFIX};
    let text =
        std::fs::read_to_string(format!("{}/examples/clinic-chilled-water.json", env!("CARGO_MANIFEST_DIR"))).unwrap();
    let mut sheet = SheetFile::from_json(&text).unwrap();
    let lib = Library::new(MemoryKv::default());
    for (id, name) in [("a1", "Bay \"A\" \\ west\n\t÷ 5 °C"), ("b2", ""), ("c3", "\u{1}\u{1f} plain")] {
        sheet.project = name.to_owned();
        lib.save(id, &sheet, "2026-12-05T01:00:00Z", lib.revision(id)).unwrap();
    }
    lib.remove("b2", "2026-12-05T02:00:00Z").unwrap();
    let index = lib.kv().get(INDEX_KEY).unwrap();
    let entries: Vec<Entry> = serde_json::from_str(&index).unwrap();
    assert_eq!(entries.len(), 2);
    assert_eq!(index, serde_json::to_string(&entries).unwrap());
    let trashed = lib.kv().get(&format!("{TRASH_PREFIX}b2")).unwrap();
    let t: Trashed = serde_json::from_str(&trashed).unwrap();
    assert_eq!(t.entry.id, "b2");
    assert_eq!(trashed, serde_json::to_string(&t).unwrap());
    // And read back by hand as written.
    assert_eq!(lib.entries().0, entries);
    assert_eq!(lib.trash(), vec![t]);
}

/// The fluid as serde's own reader for a tagged enum reads it: the shape
/// the file's fluid had before it was read through one flat record. The
/// reference for `fluids_are_read_as_serdes_tagged_enum_reads_them`.
#[derive(Debug, serde::Serialize, serde::Deserialize)]
#[serde(tag = "kind", rename_all = "lowercase", deny_unknown_fields)]
enum TaggedFluid {
    Water {
        temperature: String,
        #[serde(default, skip_serializing_if = "Option::is_none")]
        pressure: Option<String>,
    },
    Glycol {
        glycol: headroom::hydraulics::fluid::Glycol,
        percent: String,
        temperature: String,
    },
    Custom {
        density_kg_m3: String,
        #[serde(default, skip_serializing_if = "Option::is_none")]
        viscosity_mpa_s: Option<String>,
        #[serde(default, skip_serializing_if = "Option::is_none")]
        kinematic_viscosity_mm2_s: Option<String>,
    },
    Gas {
        gas: String,
        temperature: String,
        pressure: String,
        #[serde(default, skip_serializing_if = "Option::is_none")]
        relative_density: Option<String>,
        #[serde(default, skip_serializing_if = "Option::is_none")]
        molar_mass: Option<String>,
        #[serde(default, skip_serializing_if = "Option::is_none")]
        viscosity_mpa_s: Option<String>,
        #[serde(default, skip_serializing_if = "Option::is_none")]
        z: Option<String>,
    },
    Steam {
        pressure: String,
        #[serde(default, skip_serializing_if = "Option::is_none")]
        temperature: Option<String>,
    },
}

#[test]
fn fluids_are_read_as_serdes_tagged_enum_reads_them() {
    // Reference: serde's derived reader for an internally tagged enum with
    // unknown fields denied (above). Every fluid it accepts is read the
    // same; every one it refuses is refused, in the same words.
    use headroom::sheet::file::FluidFile;
    let cases = [
        r#"{"kind":"water","temperature":"7 °C"}"#,
        r#"{"temperature":"7 °C","pressure":"3 bar","kind":"water"}"#,
        r#"{"kind":"glycol","glycol":"ethylene","percent":"30","temperature":"-5 °C"}"#,
        r#"{"kind":"glycol","glycol":"propylene","percent":"40","temperature":"0"}"#,
        r#"{"kind":"custom","density_kg_m3":"870","viscosity_mpa_s":"12"}"#,
        r#"{"kind":"custom","density_kg_m3":"870","kinematic_viscosity_mm2_s":"14"}"#,
        r#"{"kind":"gas","gas":"air","temperature":"20","pressure":"7 barg"}"#,
        r#"{"kind":"gas","gas":"custom","temperature":"20","pressure":"7 barg","molar_mass":"30","viscosity_mpa_s":"0.02","z":"0.98"}"#,
        r#"{"kind":"gas","gas":"natural-gas","temperature":"20","pressure":"2 bar","relative_density":"0.6"}"#,
        r#"{"kind":"steam","pressure":"8 barg"}"#,
        r#"{"kind":"steam","pressure":"8 barg","temperature":"200 °C"}"#,
        // Refused: a field of another kind, an unknown field, a missing
        // field, an unknown kind, no kind, a glycol not in the list, a
        // number for text, a field given twice.
        r#"{"kind":"water","temperature":"7","percent":"30"}"#,
        r#"{"kind":"steam","pressure":"8","gas":"air"}"#,
        r#"{"kind":"water","temperature":"7","colour":"blue"}"#,
        r#"{"kind":"glycol","glycol":"ethylene","temperature":"7"}"#,
        r#"{"kind":"gas","gas":"air","temperature":"20"}"#,
        r#"{"kind":"custom"}"#,
        r#"{"kind":"oil","temperature":"7"}"#,
        r#"{"temperature":"7"}"#,
        r#"{"kind":"glycol","glycol":"brine","percent":"30","temperature":"7"}"#,
        r#"{"kind":"water","temperature":7}"#,
        r#"{"kind":"water","temperature":"7","temperature":"8"}"#,
        r#"{"kind":"glycol","glycol":"ethylene","glycol":"ethylene","percent":"30","temperature":"7"}"#,
    ];
    let (mut accepted, mut refused) = (0, 0);
    for text in cases {
        let ours = serde_json::from_str::<FluidFile>(text);
        let reference = serde_json::from_str::<TaggedFluid>(text);
        match (ours, reference) {
            (Ok(a), Ok(b)) => {
                assert_eq!(serde_json::to_value(&a).unwrap(), serde_json::to_value(&b).unwrap(), "{text}");
                accepted += 1;
            }
            (Err(a), Err(b)) => {
                // serde_json adds where it stopped reading; the words before that are compared.
                let words =
                    |e: serde_json::Error| e.to_string().split(" at line").next().unwrap_or_default().to_owned();
                let (a, b) = (words(a), words(b));
                let same = a == b || (b.starts_with("invalid type") && a.starts_with("invalid type"));
                assert!(same, "{text}: ours «{a}», serde's «{b}»");
                refused += 1;
            }
            (a, b) => panic!("{text}: ours {a:?}, serde's {b:?}"),
        }
    }
    assert_eq!((accepted, refused), (11, 12));
}
