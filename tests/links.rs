//! Worksheet links: fixtures of every link format version (a link made
//! today must open in every later Headroom), and bounded property tests of
//! the decoder against any input.
#![cfg(not(target_arch = "wasm32"))]

use headroom::sheet::file::SheetFile;
use headroom::sheet::link::{decode, encode, wrap, LinkError, MAX_INFLATED_BYTES};
use proptest::prelude::*;

mod deflate;

use deflate::stored_blocks;

/// Made by Headroom 0.1.0 from examples/clinic-chilled-water.json, 2026-12-01.
/// Never regenerate: add a fixture for a new version instead.
const V1_DEMO: &str = include_str!("fixtures/link-v1-demo.txt");
/// The same version, with hostile text in a line name.
const V1_HOSTILE: &str = include_str!("fixtures/link-v1-hostile.txt");

#[test]
fn version_1_fixtures_still_open() {
    let sheet = decode(V1_DEMO.trim()).expect("the v1 demo link opens");
    let expected = SheetFile::from_json(include_str!("fixtures/link-v1-demo.json")).unwrap();
    assert_eq!(sheet, expected);
    let hostile = decode(V1_HOSTILE.trim()).expect("the v1 hostile link opens");
    assert_eq!(hostile.lines[0].name, "<script>alert('x')</script><img src=x onerror=alert(1)>");
}

#[test]
fn todays_links_are_version_1() {
    let expected = SheetFile::from_json(include_str!("fixtures/link-v1-demo.json")).unwrap();
    assert!(encode(&expected).starts_with("h1."));
    assert_eq!(decode(&encode(&expected)).unwrap(), expected);
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(2000))]

    #[test]
    fn any_text_is_a_sheet_or_a_clear_error(text in ".{0,300}") {
        let _ = decode(&text);
    }

    #[test]
    fn any_base64_payload_is_a_sheet_or_a_clear_error(body in "[A-Za-z0-9_-]{0,400}") {
        let r = decode(&format!("#h1.{body}"));
        prop_assert!(r.is_err() || r.is_ok());
    }

    #[test]
    fn any_deflated_bytes_are_a_sheet_or_a_clear_error(bytes in prop::collection::vec(any::<u8>(), 0..600)) {
        use base64::Engine as _;
        let packed = miniz_oxide::deflate::compress_to_vec(&bytes, 6);
        let link = format!("h1.{}", base64::engine::general_purpose::URL_SAFE_NO_PAD.encode(packed));
        match decode(&link) {
            Ok(_) => {}
            Err(LinkError::BadData | LinkError::TooBig | LinkError::Sheet(_)) => {}
            Err(e) => prop_assert!(false, "unexpected {e:?}"),
        }
    }

    #[test]
    fn cut_links_never_open_as_something_else(cut in 3usize..400) {
        let expected = SheetFile::from_json(include_str!("fixtures/link-v1-demo.json")).unwrap();
        let link = encode(&expected);
        let cut = cut.min(link.len() - 1);
        prop_assert!(decode(&link[..cut]).is_err());
    }
}

#[test]
fn hand_made_deflate_and_the_inflate_limit() {
    let expected = SheetFile::from_json(include_str!("fixtures/link-v1-demo.json")).unwrap();
    assert_eq!(decode(&wrap(&stored_blocks(expected.to_compact_json().as_bytes()))).unwrap(), expected);
    // Exactly MAX_INFLATED_BYTES is inflated (and is then not a sheet);
    // one byte more is refused (tests/keeping.rs: the same in the page).
    let packed = |n: usize| wrap(&miniz_oxide::deflate::compress_to_vec(&vec![b' '; n], 9));
    assert!(matches!(decode(&packed(MAX_INFLATED_BYTES)), Err(LinkError::Sheet(_))));
    assert_eq!(decode(&packed(MAX_INFLATED_BYTES + 1)), Err(LinkError::TooBig));
    assert_eq!(decode(&wrap(&[0xFF; 8])), Err(LinkError::BadData));
}

#[test]
fn inflate_limit_is_a_mebibyte() {
    assert_eq!(MAX_INFLATED_BYTES, 1 << 20);
}
