//! Untrusted input: links and files past the reader's limits, counts that
//! are not counts, numbers past double precision, spreadsheet formulas in
//! exported text. Each is refused or defused with a message naming what
//! is wrong, never a panic, a freeze or a silent value.
#![cfg(not(target_arch = "wasm32"))]

use headroom::sheet::file::{Limit, SheetError, SheetFile, MAX_FITTING_ROWS, MAX_LINES, MAX_TEXT_CHARS};
use headroom::sheet::link::{decode, encode, LinkError, MAX_LINK_CHARS};
use headroom::sheet::report::{csv, evaluate};

const DEMO: &str = include_str!("../examples/clinic-chilled-water.json");

fn demo() -> SheetFile {
    SheetFile::from_json(DEMO).unwrap()
}

/// A short line repeated `n` times, written the way a link carries it (no
/// reader check on the way out).
fn many_lines(n: usize) -> SheetFile {
    let line = r#"{"flow":"1","fluid":{"kind":"water","temperature":"7"},"pipe":{"series":"steel-sch40"},"length":"1","limits":{"max_velocity":"2"}}"#;
    let mut s =
        SheetFile::from_json(&format!(r#"{{"format":"headroom-sheet","version":1,"lines":[{line}]}}"#)).unwrap();
    s.lines = vec![s.lines[0].clone(); n];
    s
}

#[test]
fn a_small_link_of_six_thousand_lines_is_refused_by_count() {
    // Repetition deflates well: ~6,000 lines fit in a link of a few kB.
    let link = encode(&many_lines(6000));
    assert!(link.len() < MAX_LINK_CHARS / 4, "{} chars", link.len());
    let err = decode(&link).unwrap_err();
    assert_eq!(err, LinkError::Sheet(SheetError::Limit(Limit::Lines(6000))));
    assert_eq!(
        err.to_string(),
        "the worksheet in this link cannot be read: too large to open safely: it has 6000 lines; a worksheet may have at most 2000"
    );
    // At the limit it opens.
    assert_eq!(decode(&encode(&many_lines(MAX_LINES))).unwrap().lines.len(), MAX_LINES);
}

#[test]
fn too_many_fitting_rows_and_too_long_text_are_refused_naming_the_line() {
    let mut s = demo();
    let row = s.lines[1].fittings[0].clone();
    s.lines[1].fittings = vec![row; MAX_FITTING_ROWS + 1];
    let err = SheetFile::from_json(&s.to_json()).unwrap_err();
    assert!(err.to_string().contains("line 2 has 41 fitting or component rows; a line may have at most 40"), "{err}");
    // Components have the same limit.
    let mut s = demo();
    s.lines[2].components = vec![s.lines[2].components[0].clone(); MAX_FITTING_ROWS + 1];
    let err = SheetFile::from_json(&s.to_json()).unwrap_err();
    assert!(err.to_string().contains("line 3 has 41 fitting or component rows"), "{err}");
    let mut s = demo();
    s.lines[2].components[0].name = "n".repeat(MAX_TEXT_CHARS + 1);
    let err = SheetFile::from_json(&s.to_json()).unwrap_err();
    assert!(err.to_string().contains("line 3's components.name is 201 characters long"), "{err}");

    let mut s = demo();
    s.lines[2].flow = "9".repeat(MAX_TEXT_CHARS + 1);
    let err = SheetFile::from_json(&s.to_json()).unwrap_err();
    assert!(err.to_string().contains("line 3's flow is 201 characters long"), "{err}");

    let mut s = demo();
    s.project = "p".repeat(5000);
    let err = SheetFile::from_json(&s.to_json()).unwrap_err();
    assert!(err.to_string().contains("the project is 5000 characters long"), "{err}");
}

#[test]
fn a_count_that_is_not_a_whole_number_in_range_is_a_field_error_not_zero() {
    for bad in ["2.5", "-1", "1e2", "99999999999", ""] {
        let mut s = demo();
        s.lines[1].fittings[0].count = bad.into();
        let r = evaluate(&s).remove(1);
        let errs = r.outcome.expect_err(bad);
        assert_eq!(errs.len(), 1, "{bad}: {errs:?}");
        assert_eq!(errs[0].field, "fittings.count");
        assert_eq!(errs[0].message, format!("row 1: '{bad}' is not a whole number from 0 to 999"));
        // The slip survives a save and a reload exactly as typed.
        let again = SheetFile::from_json(&s.to_json()).unwrap();
        assert_eq!(again.lines[1].fittings[0].count, bad);
    }
    // A valid count is still written as a JSON number (format version 1).
    let json = demo().to_json();
    assert!(json.contains("\"count\": 6"), "{json}");
    // Numbers written by hand as non-integers are kept and reported too.
    let text = DEMO.replacen("\"count\": 2", "\"count\": 2.5", 1);
    assert_ne!(text, DEMO);
    let s = SheetFile::from_json(&text).unwrap();
    assert!(evaluate(&s).iter().any(|r| r.outcome.as_ref().is_err_and(|e| e[0].message.contains("'2.5'"))));
}

#[test]
fn numbers_past_double_precision_are_messages_not_infinity_or_zero() {
    let mut s = demo();
    s.lines[0].fluid =
        headroom::sheet::file::FluidFile::Water { temperature: "7".into(), pressure: Some("1e308 kPa".into()) };
    s.lines[0].length = "1e-400".into();
    let errs = evaluate(&s).remove(0).outcome.unwrap_err();
    let text: Vec<String> = errs.iter().map(|e| e.to_string()).collect();
    assert!(
        text.contains(&"fluid.pressure: '1e308 kPa' is too far from any real value to compute with".to_owned()),
        "{text:?}"
    );
    assert!(text.contains(&"length: '1e-400' is too small a number to tell from zero".to_owned()), "{text:?}");
}

#[test]
fn csv_cells_cannot_start_a_formula() {
    // OWASP "CSV Injection": cells beginning =, +, -, @, tab or carriage
    // return are prefixed with an apostrophe.
    let mut s = demo();
    let names = ["=1+1", "+cmd", "-2+3", "@SUM(A1)", "\tlead tab", "\rlead cr"];
    for (l, n) in s.lines.iter_mut().zip(names) {
        l.name = n.into();
    }
    let out = csv(&s, &evaluate(&s));
    for row in out.lines().skip(1).take(4) {
        let name = row.split(',').nth(1).unwrap().trim_start_matches('"');
        assert!(name.starts_with('\''), "{row}");
    }
    let mut s = demo();
    s.lines[0].name = "\tlead tab".into();
    s.lines[1].name = "\rlead cr".into();
    let out = csv(&s, &evaluate(&s));
    assert!(out.contains("\"'\tlead tab\""), "{out}");
    assert!(out.contains("\"'\rlead cr\""), "{out}");
}

#[test]
fn typed_text_in_the_answer_and_the_review_sheet_stays_text() {
    // OWASP "Cross Site Scripting Prevention": text placed in HTML is
    // encoded (& < > " '), so a name or a value from someone's link cannot
    // add an element or an attribute to the page.
    use headroom::sheet::library::display_name;
    use headroom::sheet::panes::{answer, size_rows};
    use headroom::sheet::report::{detail, tree_lines};
    use headroom::sheet::review::{review_sheet, Review};
    let attack = r#"<img src=x onerror="alert(1)">"#;
    let mut s = demo();
    s.project = attack.into();
    s.lines[0].name = attack.into();
    s.lines[5].flow = format!("{attack} L/s");
    let reports = evaluate(&s);
    assert!(reports[5].outcome.is_err(), "the flow that is not a number is a field error");
    let tree = tree_lines(&s, &reports);
    let sheet = review_sheet(&Review {
        project: &display_name(&s.project),
        date: "2026-12-03",
        circuit: "",
        lines: &s.lines,
        reports: &reports,
        tree: &tree,
        system: &[],
        plot: None,
    });
    let units = s.units();
    let mut answers = String::new();
    for r in &reports {
        let o = r.outcome.as_ref().ok();
        answers.push_str(&answer(o).1);
        if let Some(o) = o {
            answers.push_str(&size_rows(o, &detail(o, &units)));
        }
    }
    for out in [&sheet, &answers] {
        assert!(!out.contains("<img") && !out.contains("onerror=\""), "{out}");
    }
    let escaped = "&lt;img src=x onerror=&quot;alert(1)&quot;&gt;";
    assert!(sheet.contains(&format!("<h1>{escaped}</h1>")), "the project's name, as text");
    assert!(sheet.contains(&format!("<h3>1. {escaped}</h3>")), "the first line's name, as text");
    let echoed = format!("Not sized — inputs to fix: flow: &#39;{escaped} L/s&#39; is not a number");
    assert!(sheet.contains(&echoed), "the error echoes the flow as text: {sheet}");
}
