//! The native batch command, run as a user would: files in, text out, exit
//! codes checked.
#![cfg(not(target_arch = "wasm32"))]

use std::path::Path;
use std::process::Command;

fn batch(args: &[&str]) -> (i32, String, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_headroom-batch"))
        .args(args)
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .output()
        .expect("run headroom-batch");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn temp_file(name: &str, text: &str) -> String {
    let dir = Path::new(env!("CARGO_TARGET_TMPDIR"));
    let path = dir.join(name);
    std::fs::write(&path, text).unwrap();
    path.display().to_string()
}

#[test]
fn the_demo_sheet_sizes_every_line_in_all_three_forms() {
    let (code, table, _) = batch(&["examples/clinic-chilled-water.json"]);
    assert_eq!(code, 0);
    assert!(table.contains("CHW riser B2"), "{table}");
    assert!(table.contains("Caution: Design guidance only"), "{table}");
    let (code, csv, _) = batch(&["examples/clinic-chilled-water.json", "--format", "csv"]);
    assert_eq!(code, 0);
    assert_eq!(csv.lines().filter(|l| l.contains(",proposed,")).count(), 6, "{csv}");
    let (code, json, _) = batch(&["examples/clinic-chilled-water.json", "--format", "json"]);
    assert_eq!(code, 0);
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    assert_eq!(v["lines"].as_array().unwrap().len(), 6);
    // The demo is a system: the tree, the index circuit and the pump.
    assert!(table.contains("Tree:") && table.contains("Index circuit:") && table.contains("Pump runs at"), "{table}");
    assert_eq!(v["index_circuit"], serde_json::json!([1, 2, 3]));
    assert!(v["pump_operating_flow_m3_s"].as_f64().unwrap() > v["pump_flow_m3_s"].as_f64().unwrap());
    assert!(v["npsh_available_m"].as_f64().unwrap() > 10.0);
    assert!(v["caution"].as_str().unwrap().contains("licensed professional"));
    // The JSON and table agree on the proposal of line 2.
    let size = v["lines"][1]["proposed_size"].as_str().unwrap();
    let row = table.lines().find(|l| l.starts_with("2 ")).unwrap();
    assert!(row.contains(&format!("  NPS {size}  ")), "{row} vs {size}");
    // A closed loop: the riser's static part is shown apart in every form,
    // and its total is friction + fittings only.
    assert!(table.contains("Closed loop"), "{table}");
    assert!(row.contains(", apart)"), "{row}");
    assert!(csv.contains("static in total") && csv.lines().nth(2).unwrap().contains(",no,"), "{csv}");
    assert_eq!(v["circuit"], "closed");
    let c = v["lines"][1]["candidates"].as_array().unwrap().iter().find(|c| c["size"] == size).unwrap();
    let parts = c["friction_drop_pa"].as_f64().unwrap() + c["fittings_drop_pa"].as_f64().unwrap();
    assert!(c["static_drop_pa"].as_f64().unwrap() > 100e3, "the riser rises about 18 m");
    assert!((c["total_drop_pa"].as_f64().unwrap() - parts).abs() < 1e-9 * parts);
    // Every form says what set the size.
    assert!(table.contains("line 2: governed by drop per length"), "{table}");
    assert!(csv.lines().nth(2).unwrap().contains("governed by"), "{csv}");
    assert_eq!(v["lines"][1]["governed_by"], "drop_per_length");
}

#[test]
fn a_bad_value_names_the_line_and_field_and_exits_non_zero() {
    let path = temp_file(
        "bad-value.json",
        r#"{"format":"headroom-sheet","version":1,"lines":[
            {"name":"good","flow":"2 L/s","fluid":{"kind":"water","temperature":"10"},"pipe":{"series":"copper-l"},"length":"10","limits":{"max_velocity":"1.5"}},
            {"name":"Boiler feed","flow":"-3 L/s","fluid":{"kind":"water","temperature":"10"},"pipe":{"series":"copper-l"},"length":"10","limits":{"max_velocity":"1.5"}}
        ]}"#,
    );
    let (code, out, err) = batch(&[&path]);
    assert_eq!(code, 1);
    assert!(err.contains("line 2 (Boiler feed), flow: flow must be greater than zero"), "{err}");
    // The good line is still reported.
    assert!(out.lines().any(|l| l.starts_with("1 ") && l.contains("good")), "{out}");
}

#[test]
fn broken_and_foreign_files_are_refused_clearly() {
    for (name, text, expect) in [
        ("trunc.json", r#"{"format":"headroom-sheet","version":1,"lines":[{"#, "not a readable sheet file"),
        ("other.json", r#"{"format":"spreadsheet","version":1,"lines":[]}"#, "format is 'spreadsheet'"),
        ("future.json", r#"{"format":"headroom-sheet","version":9,"lines":[]}"#, "version 9 is newer"),
        (
            "typo.json",
            r#"{"format":"headroom-sheet","version":1,"lines":[{"flow":"1","fluid":{"kind":"water","temperature":"5"},"pipe":{"series":"copper-l"},"lenght":"3"}]}"#,
            "unknown field `lenght`",
        ),
    ] {
        let (code, _, err) = batch(&[&temp_file(name, text)]);
        assert_eq!(code, 1, "{name}");
        assert!(err.contains(expect), "{name}: {err}");
        assert!(!err.contains("panicked"), "{name}: {err}");
    }
    let (code, _, err) = batch(&["no/such/file.json"]);
    assert_eq!(code, 2);
    assert!(err.contains("cannot read"));
    let (code, _, _) = batch(&[]);
    assert_eq!(code, 2);
}

#[test]
fn a_reader_that_stops_early_ends_the_output_quietly() {
    // Regression: `headroom-batch big.json | head` panicked on the closed pipe.
    // 1,500 lines print well over the 64 KiB a pipe buffers, so the write
    // meets the closed pipe whatever the timing.
    let demo =
        std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/clinic-chilled-water.json"))
            .unwrap();
    let mut sheet: serde_json::Value = serde_json::from_str(&demo).unwrap();
    // The last line has a typed flow and feeds nothing.
    let line = sheet["lines"][5].clone();
    sheet["lines"] = serde_json::Value::Array(vec![line; 1500]);
    let path = temp_file("many-lines.json", &sheet.to_string());
    let mut child = Command::new(env!("CARGO_BIN_EXE_headroom-batch"))
        .arg(&path)
        .stdout(std::process::Stdio::piped())
        .stderr(std::process::Stdio::piped())
        .spawn()
        .expect("run headroom-batch");
    // Read one chunk, as `head` does, then close the pipe.
    let mut first = [0u8; 512];
    let mut out = child.stdout.take().unwrap();
    std::io::Read::read(&mut out, &mut first).unwrap();
    drop(out);
    let done = child.wait_with_output().unwrap();
    let stderr = String::from_utf8_lossy(&done.stderr);
    assert!(!stderr.contains("panicked"), "{stderr}");
    assert_eq!(done.status.code(), Some(0), "{stderr}");
}
