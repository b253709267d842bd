//! The sheet's JSON reader (`sheet::json`) against serde_json.
//!
//! Reference: serde_json 1.x (crates.io), the general-purpose reader the
//! page used before, and RFC 8259 (The JavaScript Object Notation Data
//! Interchange Format) for what is JSON and what is not. Each check reads
//! the same text with both and asks for the same answer: the same value,
//! or a refusal from both.
#![cfg(not(target_arch = "wasm32"))]

use headroom::sheet::file::SheetFile;
use headroom::sheet::json;
use serde_json::Value;

const EXAMPLES: [&str; 4] = [
    include_str!("../examples/clinic-chilled-water.json"),
    include_str!("../examples/clinic-domestic-water.json"),
    include_str!("../examples/boiler-house-steam-and-air.json"),
    include_str!("fixtures/link-v1-demo.json"),
];

/// Both readers give the same `T`, or both refuse the text; whether read.
fn same<T: serde::de::DeserializeOwned + PartialEq + std::fmt::Debug>(text: &str) -> bool {
    let ours = json::from_str::<T>(text);
    let theirs = serde_json::from_str::<T>(text);
    match (&ours, &theirs) {
        (Ok(a), Ok(b)) => assert_eq!(a, b, "{text:?}"),
        (Err(_), Err(_)) => {}
        _ => panic!("{text:?}: ours {ours:?}, serde_json {theirs:?}"),
    }
    ours.is_ok()
}

/// Any JSON value.
fn same_value(text: &str) {
    same::<Value>(text);
}

/// A sheet.
fn same_sheet(text: &str) -> bool {
    same::<SheetFile>(text)
}

#[test]
fn the_example_sheets_read_the_same() {
    for text in EXAMPLES {
        assert!(same_sheet(text));
        same_value(text);
        // And through the sheet's own reader, which reads the text once.
        assert_eq!(SheetFile::from_json(text).unwrap(), serde_json::from_str::<SheetFile>(text).unwrap());
    }
}

#[test]
fn json_values_read_the_same() {
    // RFC 8259's grammar, case by case (the cases written for this test).
    let cases = [
        "null",
        "true",
        "false",
        "0",
        "-1",
        "-0",
        "-0.0",
        "7",
        "18446744073709551615",
        "18446744073709551616",
        "-9223372036854775808",
        "-9223372036854775809",
        "1.5",
        "-0.25",
        "1e3",
        "1E-3",
        "2.5e+2",
        "123456789012345678901234567890",
        "\"\"",
        "\"a\\\"b\\\\c\\/d\\b\\f\\n\\r\\t\"",
        "\"\\u00e9\\u20AC\"",
        "\"\\ud83d\\ude00\"",
        "\"é €😀\"",
        "[]",
        "{}",
        "[1,[2,[3,{}]]]",
        " \t\r\n[ 1 , 2 ] \n",
        "{\"a\":1,\"b\":[true,null],\"c\":{\"d\":\"e\"}}",
        "{\"a\":1,\"a\":2}",
        // Not JSON: each must be refused by both.
        "",
        " ",
        "nul",
        "True",
        "NaN",
        "Infinity",
        "-",
        "01",
        "-01",
        "1.",
        ".5",
        "1e",
        "1e+",
        "+1",
        "0x10",
        "1e400",
        "-1e400",
        "\"abc",
        "\"a\nb\"",
        "\"\\x41\"",
        "\"\\u12\"",
        "\"\\ud83d\"",
        "\"\\ude00\"",
        "\"\\ud83d\\u0041\"",
        "[1,]",
        "[,1]",
        "[1 2]",
        "{\"a\":1,}",
        "{\"a\" 1}",
        "{a:1}",
        "{\"a\":}",
        "{1:2}",
        "[1]]",
        "{} {}",
        "[",
        "{",
        "[\"a\"",
        "// c\n1",
        "/* c */ 1",
        "'a'",
    ];
    for text in cases {
        same_value(text);
    }
    // Nesting: within serde_json's limit of 128, and past it.
    for depth in [1, 100, 127, 128, 129, 200, 5000] {
        same_value(&format!("{}{}", "[".repeat(depth), "]".repeat(depth)));
    }
}

#[test]
fn a_refusal_says_where() {
    // Text that is not JSON: the line and column, as serde_json gives them.
    let text = "{\n  \"format\": \"headroom-sheet\",\n  \"version\": 1,,\n}";
    let ours = json::from_str::<Value>(text).unwrap_err().to_string();
    let theirs = serde_json::from_str::<Value>(text).unwrap_err().to_string();
    assert!(ours.ends_with("at line 3 column 16"), "{ours}");
    assert!(theirs.ends_with("at line 3 column 16"), "{theirs}");
    // JSON of the wrong shape: serde's own words, and the path to the value.
    // (the first line's flow: the first "flow" after "lines")
    let at = EXAMPLES[0].find("\"lines\"").unwrap();
    let text = format!("{}{}", &EXAMPLES[0][..at], EXAMPLES[0][at..].replacen("\"flow\"", "\"flw\"", 1));
    let ours = json::from_str::<SheetFile>(&text).unwrap_err().to_string();
    let theirs = serde_json::from_str::<SheetFile>(&text).unwrap_err().to_string();
    assert!(ours.starts_with("unknown field `flw`, expected one of"), "{ours}");
    assert!(theirs.starts_with("unknown field `flw`, expected one of"), "{theirs}");
    let lines = serde_json::from_str::<Value>(EXAMPLES[0]).unwrap()["lines"].as_array().unwrap().clone();
    let first = lines.iter().position(|l| l.get("flow").is_some()).unwrap();
    // Counted from 1, as the page numbers its lines.
    assert!(ours.ends_with(&format!("(at line {})", first + 1)), "{ours}");
    // Deeper: a fitting row's count of the wrong kind, in the first line
    // that has fittings.
    let mut sheet = serde_json::from_str::<Value>(EXAMPLES[0]).unwrap();
    let line = sheet["lines"].as_array().unwrap().iter().position(|l| l["fittings"][0].is_object()).unwrap();
    sheet["lines"][line]["fittings"][0]["count"] = Value::Bool(true);
    let text = sheet.to_string();
    let ours = json::from_str::<SheetFile>(&text).unwrap_err().to_string();
    assert!(serde_json::from_str::<SheetFile>(&text).is_err());
    assert!(ours.starts_with("invalid type: boolean `true`"), "{ours}");
    assert!(ours.ends_with(&format!("(at line {}, fittings item 1, count)", line + 1)), "{ours}");
    // A repeated field is refused, as serde_json refuses it.
    let text = EXAMPLES[0].replacen("\"project\":", "\"project\": \"x\", \"project\":", 1);
    assert!(json::from_str::<SheetFile>(&text).unwrap_err().to_string().starts_with("duplicate field `project`"));
    assert!(serde_json::from_str::<SheetFile>(&text).is_err());
}

#[test]
fn damaged_sheets_are_refused_or_read_alike() {
    // Every example damaged at every 7th byte, three ways: the byte taken
    // out, a stray one put in, the byte changed. Both readers must agree on
    // each (a deterministic sweep, not random).
    let mut read = 0;
    let mut refused = 0;
    for text in EXAMPLES {
        let bytes = text.as_bytes();
        for at in (0..bytes.len()).step_by(7) {
            for kind in 0..3 {
                let mut b = bytes.to_vec();
                match kind {
                    0 => {
                        b.remove(at);
                    }
                    1 => b.insert(at, b"\",}]1 e"[at % 7]),
                    _ => b[at] = b"x\"0:{[,"[at % 7],
                }
                let Ok(damaged) = String::from_utf8(b) else { continue };
                same_value(&damaged);
                if same_sheet(&damaged) {
                    read += 1;
                } else {
                    refused += 1;
                }
            }
        }
    }
    // The sweep reaches both answers many times (a check that it tests).
    println!("damaged sheets: {read} read alike, {refused} refused by both");
    assert!(read > 100 && refused > 1000, "read {read}, refused {refused}");
}

#[test]
fn a_record_written_as_a_list_is_refused_though_serde_json_takes_it() {
    use headroom::sheet::file::PipeFile;
    // Where the readers part on purpose: serde_json reads a record (a
    // struct, or an enum's struct variant) from a list of its fields in
    // order. A sheet file never writes one, so ours refuses it as the wrong
    // shape rather than read values by their position.
    let object = r#"{"bore": {"diameter": "52.5", "material": "pe"}}"#;
    assert!(same::<PipeFile>(object));
    let list = r#"{"bore": ["52.5", "pe"]}"#;
    assert_eq!(serde_json::from_str::<PipeFile>(list).unwrap(), json::from_str::<PipeFile>(object).unwrap());
    let ours = json::from_str::<PipeFile>(list).unwrap_err().to_string();
    assert!(ours.starts_with("invalid type: sequence, expected struct variant PipeFile::Bore"), "{ours}");
}
