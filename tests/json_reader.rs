//! The sheet's JSON parser (`sheet::json`) and its hand-written record
//! readers (`sheet::records`) against serde_json and serde's derived
//! readers.
//!
//! References: serde_json 1.x (crates.io), the general-purpose reader the
//! page used before, and RFC 8259 (The JavaScript Object Notation Data
//! Interchange Format) for what is JSON and what is not; serde 1.x's
//! derived `Deserialize` for each record (serde's own code: its field
//! checks and its words for a refusal). Each check reads the same text
//! both ways and asks for the same answer: the same value, or a refusal
//! from both — and, against the derived readers over the same tree, the
//! same refusal word for word.
#![cfg(not(target_arch = "wasm32"))]

mod serde_tree;

use headroom::sheet::file::SheetFile;
use headroom::sheet::json::{self, Node};
use serde_json::Value;

const EXAMPLES: [&str; 4] = [
    include_str!("../examples/clinic-chilled-water.json"),
    include_str!("../examples/clinic-domestic-water.json"),
    include_str!("../examples/boiler-house-steam-and-air.json"),
    include_str!("fixtures/link-v1-demo.json"),
];

/// The parser's tree as serde_json's value (a repeated key: the last, as
/// serde_json keeps it).
fn value(node: &Node) -> Value {
    match node {
        Node::Null => Value::Null,
        Node::Bool(b) => Value::Bool(*b),
        Node::Unsigned(n) => Value::from(*n),
        Node::Signed(n) => Value::from(*n),
        Node::Float(x) => Value::from(*x),
        Node::Text(s) => Value::String(s.clone()),
        Node::List(items) => Value::Array(items.iter().map(value).collect()),
        Node::Object(members) => Value::Object(members.iter().map(|(k, v)| (k.clone(), value(v))).collect()),
    }
}

/// Any JSON value: the same value, or both refuse the text.
fn same_value(text: &str) {
    let ours = json::parse(text).map(|n| value(&n));
    let theirs = serde_json::from_str::<Value>(text);
    match (&ours, &theirs) {
        (Ok(a), Ok(b)) => assert_eq!(a, b, "{text:?}"),
        (Err(_), Err(_)) => {}
        _ => panic!("{text:?}: ours {ours:?}, serde_json {theirs:?}"),
    }
}

/// The hand-written readers' sheet or refusal.
fn read_sheet(text: &str) -> Result<SheetFile, json::Error> {
    SheetFile::read(&json::parse(text)?)
}

/// A sheet's shape: the hand-written readers give the same sheet as
/// serde_json, or both refuse; and over the same tree the same sheet or
/// the same refusal as serde's derived readers, word for word and at the
/// same place. A sheet read is written back by the hand-written writer
/// byte for byte as serde_json writes it, in both layouts. Whether read.
fn same_sheet(text: &str) -> bool {
    let ours = read_sheet(text);
    assert_eq!(ours, serde_tree::from_str::<SheetFile>(text), "{text:?}");
    let theirs = serde_json::from_str::<SheetFile>(text);
    match (&ours, &theirs) {
        (Ok(a), Ok(b)) => {
            assert_eq!(a, b, "{text:?}");
            // And written back by hand as serde_json writes it.
            assert_eq!(a.to_compact_json(), serde_json::to_string(a).unwrap(), "{text:?}");
            assert_eq!(a.to_json(), serde_json::to_string_pretty(a).unwrap(), "{text:?}");
        }
        (Err(_), Err(_)) => {}
        // Where the two part on purpose: a record written as a list
        // (`a_record_written_as_a_list_is_refused_though_serde_json_takes_it`).
        (Err(e), Ok(_)) if e.to_string().starts_with("invalid type: sequence, expected struct") => {}
        _ => panic!("{text:?}: ours {ours:?}, serde_json {theirs:?}"),
    }
    ours.is_ok()
}

#[test]
fn the_example_sheets_read_the_same() {
    for text in EXAMPLES {
        assert!(same_sheet(text));
        same_value(text);
        // And through the whole of the sheet's reading, with its checks.
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
    let ours = json::parse(text).unwrap_err().to_string();
    let theirs = serde_json::from_str::<Value>(text).unwrap_err().to_string();
    assert!(ours.ends_with("at line 3 column 16"), "{ours}");
    assert!(theirs.ends_with("at line 3 column 16"), "{theirs}");
    // JSON of the wrong shape: serde's own words, and the path to the value.
    // (the first line's flow: the first "flow" after "lines")
    let at = EXAMPLES[0].find("\"lines\"").unwrap();
    let text = format!("{}{}", &EXAMPLES[0][..at], EXAMPLES[0][at..].replacen("\"flow\"", "\"flw\"", 1));
    let ours = read_sheet(&text).unwrap_err().to_string();
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
    let ours = read_sheet(&text).unwrap_err().to_string();
    assert!(serde_json::from_str::<SheetFile>(&text).is_err());
    assert!(ours.starts_with("invalid type: boolean `true`"), "{ours}");
    assert!(ours.ends_with(&format!("(at line {}, fittings item 1, count)", line + 1)), "{ours}");
    // A repeated field is refused, as serde_json refuses it.
    let text = EXAMPLES[0].replacen("\"project\":", "\"project\": \"x\", \"project\":", 1);
    assert!(read_sheet(&text).unwrap_err().to_string().starts_with("duplicate field `project`"));
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
    // Where the readers part on purpose: serde_json reads a record (a
    // struct, or an enum's struct variant) from a list of its fields in
    // order. A sheet file never writes one, so ours refuses it as the wrong
    // shape rather than read values by their position.
    let mut sheet = serde_json::from_str::<Value>(EXAMPLES[0]).unwrap();
    sheet["lines"][0]["pipe"] = serde_json::json!({"bore": {"diameter": "52.5", "material": "pe"}});
    let object = sheet.to_string();
    assert!(same_sheet(&object));
    sheet["lines"][0]["pipe"] = serde_json::json!({"bore": ["52.5", "pe"]});
    let list = sheet.to_string();
    assert_eq!(serde_json::from_str::<SheetFile>(&list).unwrap(), read_sheet(&object).unwrap());
    let refusal = read_sheet(&list).unwrap_err();
    assert_eq!(Err(refusal.clone()), serde_tree::from_str::<SheetFile>(&list));
    assert_eq!(
        refusal.to_string(),
        "invalid type: sequence, expected struct variant PipeFile::Bore (at line 1, pipe, bore)"
    );
}

#[test]
fn every_member_of_every_record_left_out_or_of_each_kind_is_read_alike() {
    // Each example's tree, one change at a time at every object member and
    // list item: the member left out, its value replaced by each kind of
    // JSON value (a text also as an object of one key naming it), a member
    // no record has put beside it. The damaged-byte
    // sweep rarely reaches a missing field or a value of another kind
    // deep in a record; this reaches every one.
    fn places(v: &Value, at: &mut Vec<String>, out: &mut Vec<String>) {
        match v {
            Value::Object(m) => {
                for (k, x) in m {
                    at.push(k.replace('~', "~0").replace('/', "~1"));
                    out.push(format!("/{}", at.join("/")));
                    places(x, at, out);
                    at.pop();
                }
            }
            Value::Array(items) => {
                for (i, x) in items.iter().enumerate() {
                    at.push(i.to_string());
                    out.push(format!("/{}", at.join("/")));
                    places(x, at, out);
                    at.pop();
                }
            }
            _ => {}
        }
    }
    let kinds = [
        serde_json::json!(null),
        serde_json::json!(true),
        serde_json::json!(5),
        serde_json::json!(-1),
        serde_json::json!(255),
        serde_json::json!(256),
        serde_json::json!(4294967295u64),
        serde_json::json!(4294967296u64),
        serde_json::json!(1.5),
        serde_json::json!("x"),
        serde_json::json!("kv"),
        serde_json::json!([]),
        serde_json::json!([{}]),
        serde_json::json!({}),
        serde_json::json!({"x": null}),
        serde_json::json!({"series": null}),
        serde_json::json!({"kv": 1}),
    ];
    let (mut read, mut refused) = (0, 0);
    let mut tally = |ok: bool| if ok { read += 1 } else { refused += 1 };
    for text in EXAMPLES {
        let sheet: Value = serde_json::from_str(text).unwrap();
        let mut all = Vec::new();
        places(&sheet, &mut Vec::new(), &mut all);
        for place in &all {
            let (parent, last) = place.rsplit_once('/').unwrap();
            // A text also as an object of one key naming it (how an enum's
            // variant may be written), with nothing and with something in it.
            let named = match sheet.pointer(place).unwrap() {
                Value::String(id) => vec![serde_json::json!({ id: null }), serde_json::json!({ id: 1 })],
                _ => Vec::new(),
            };
            for kind in kinds.iter().chain(&named) {
                let mut s = sheet.clone();
                *s.pointer_mut(place).unwrap() = kind.clone();
                tally(same_sheet(&s.to_string()));
            }
            let key = last.replace("~1", "/").replace("~0", "~");
            let mut s = sheet.clone();
            match s.pointer_mut(parent).unwrap() {
                Value::Object(m) => {
                    m.remove(&key);
                }
                Value::Array(items) => {
                    items.remove(key.parse::<usize>().unwrap());
                }
                _ => unreachable!(),
            }
            tally(same_sheet(&s.to_string()));
            if let Value::Object(m) = sheet.pointer(parent).unwrap() {
                let mut s = sheet.clone();
                let mut m = m.clone();
                m.insert("zz".to_owned(), Value::Null);
                *s.pointer_mut(parent).unwrap() = Value::Object(m);
                tally(same_sheet(&s.to_string()));
            }
        }
    }
    println!("changed sheets: {read} read alike, {refused} refused alike");
    assert!(read > 500 && refused > 5000, "read {read}, refused {refused}");
}

#[test]
fn the_device_stores_index_is_read_as_serde_json_reads_it() {
    // The list of stored worksheets, read by hand (members it does not
    // know passed over, as the derived reader does): an index serde_json
    // reads is read the same; one it refuses is rebuilt from the stored
    // sheets instead.
    use headroom::sheet::library::{Entry, Kv, Library, MemoryKv, Problem, INDEX_KEY};
    let texts = [
        r#"[]"#,
        r#"[{"id":"a","name":"Plant","updated":"2026-12-05"}]"#,
        r#"[{"id":"a","name":"Plant","updated":"2026-12-05","colour":"red"}]"#,
        r#"[{"updated":"2026-12-05","name":"P","id":"a"},{"id":"b","name":"","updated":""}]"#,
        r#"[{"id":"a","name":"Plant"}]"#,
        r#"[{"id":"a","name":null,"updated":""}]"#,
        r#"[{"id":"a","id":"b","name":"","updated":""}]"#,
        r#"[{"id":1,"name":"","updated":""}]"#,
        r#"{"id":"a","name":"","updated":""}"#,
        r#"[["a","Plant","2026-12-05"]]"#,
        r#"null"#,
        r#"[{"id":"a","name":"","updated":""},]"#,
    ];
    for text in texts {
        let lib = Library::new(MemoryKv::default());
        lib.kv().set(INDEX_KEY, text).unwrap();
        let (ours, problem) = lib.entries();
        match serde_json::from_str::<Vec<Entry>>(text) {
            // A record written as a list: serde_json takes it, ours
            // refuses it (as `a_record_written_as_a_list_…`).
            Ok(_) if text.starts_with("[[") => assert_eq!(problem, Some(Problem::IndexRebuilt), "{text}"),
            Ok(theirs) => assert_eq!((ours, problem), (theirs, None), "{text}"),
            Err(_) => assert_eq!(problem, Some(Problem::IndexRebuilt), "{text}"),
        }
    }
}
