//! Keeping work, in a real browser: autosave and restore, damaged and full
//! storage, shared links opening beside local work, the worksheet list.
#![cfg(target_arch = "wasm32")]

use headroom::sheet::file::SheetFile;
use headroom::sheet::library::{
    ASIDE_PREFIX, BUILD_KEY, CURRENT_KEY, INDEX_KEY, REV_PREFIX, SHEET_PREFIX, TRASH_PREFIX,
};
use headroom::sheet::link::{self, LinkError, MAX_INFLATED_BYTES, MAX_LINK_CHARS};
use headroom::ui::share::{deflated, fragment_of, read_fragment};
use headroom::ui::state::DEMO;
use headroom::ui::App;
use wasm_bindgen::JsCast;
use wasm_bindgen_test::*;
use web_sys::{HtmlElement, HtmlInputElement};

mod deflate;
mod web;

use deflate::stored_blocks;
use web::{all_text, click, find, next_frame, observe_as_near, type_into};

wasm_bindgen_test_configure!(run_in_browser);

fn storage() -> web_sys::Storage {
    web_sys::window().unwrap().local_storage().unwrap().unwrap()
}

fn keys() -> Vec<String> {
    let s = storage();
    (0..s.length().unwrap()).filter_map(|i| s.key(i).unwrap()).collect()
}

/// Fills the origin's storage to the brim with other data, then in ever
/// smaller pieces until not even a byte fits.
fn fill_storage() {
    let s = storage();
    let chunk = "x".repeat(256 * 1024);
    let mut n = 0;
    while s.set_item(&format!("filler.{n}"), &chunk).is_ok() {
        n += 1;
        assert!(n < 200, "storage never filled");
    }
    for (size, tag) in [(4096, "a"), (256, "b"), (16, "c"), (1, "d")] {
        let piece = "y".repeat(size);
        let mut m = 0;
        while s.set_item(&format!("f{tag}{m}"), &piece).is_ok() {
            m += 1;
        }
    }
}

/// A fresh page: empty storage, no fragment, no earlier mounts visible.
fn fresh() {
    storage().clear().unwrap();
    let w = web_sys::window().unwrap();
    w.history()
        .unwrap()
        .replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&w.location().pathname().unwrap()))
        .unwrap();
    clear_pages();
}

/// Removes the pages earlier tests mounted (not the test runner's own output).
fn clear_pages() {
    let document = web_sys::window().unwrap().document().unwrap();
    let old = document.query_selector_all(".test-host").unwrap();
    for i in 0..old.length() {
        if let Some(n) = old.item(i) {
            n.unchecked_into::<web_sys::Element>().remove();
        }
    }
}

fn mount_app() -> HtmlElement {
    observe_as_near();
    let document = web_sys::window().unwrap().document().unwrap();
    let host: HtmlElement = document.create_element("div").unwrap().unchecked_into();
    host.set_class_name("test-host");
    document.body().unwrap().append_child(&host).unwrap();
    leptos::mount::mount_to(host.clone(), App).forget();
    host
}

/// Lets the page finish reacting, including the save and the answer, which
/// follow a change after the next frame has painted (`state::after_paint`):
/// tasks alone may all run before that frame.
async fn settle() {
    for _ in 0..3 {
        leptos::task::tick().await;
        let p = js_sys::Promise::new(&mut |resolve, _| {
            web_sys::window().unwrap().set_timeout_with_callback_and_timeout_and_arguments_0(&resolve, 0).unwrap();
        });
        wasm_bindgen_futures::JsFuture::from(p).await.unwrap();
    }
    next_frame().await;
    next_frame().await;
}

#[wasm_bindgen_test]
async fn every_change_is_saved_and_restored_on_reload() {
    fresh();
    let page = mount_app();
    settle().await;
    click(&page, "add-line");
    settle().await;
    type_into(&page, "line-name", "Boiler feed");
    type_into(&page, "flow", "3.3");
    settle().await;
    let current = storage().get_item(CURRENT_KEY).unwrap().expect("a current worksheet");
    let stored = storage().get_item(&format!("{SHEET_PREFIX}{current}")).unwrap().unwrap();
    let sheet = SheetFile::from_json(&stored).unwrap();
    assert_eq!(sheet.lines[0].name, "Boiler feed");
    assert_eq!(sheet.lines[0].flow, "3.3", "the last keystroke is saved");
    // A "reload": a second page from the same storage shows the same work.
    clear_pages();
    let again = mount_app();
    settle().await;
    assert_eq!(all_text(&again, "row-name"), ["Boiler feed"]);
    let input: HtmlInputElement = find(&again, "flow").unchecked_into();
    assert_eq!(input.value(), "3.3");
}

#[wasm_bindgen_test]
async fn a_damaged_entry_is_kept_aside_and_the_app_keeps_working() {
    fresh();
    let s = storage();
    s.set_item(INDEX_KEY, r#"[{"id":"bad","name":"Old job","updated":""}]"#).unwrap();
    s.set_item(&format!("{SHEET_PREFIX}bad"), "{\"format\":\"headroom-sheet\",\"version\":1,\"lines\":[{\"flo")
        .unwrap();
    s.set_item(CURRENT_KEY, "bad").unwrap();
    let page = mount_app();
    settle().await;
    let notices = all_text(&page, "notice").join(" ");
    assert!(notices.contains("could not be read") && notices.contains("kept, untouched"), "{notices}");
    let aside: Vec<String> = keys().into_iter().filter(|k| k.starts_with(ASIDE_PREFIX)).collect();
    assert_eq!(aside.len(), 1);
    assert!(s.get_item(&aside[0]).unwrap().unwrap().ends_with("\"flo"), "kept exactly as it was");
    // Listed with a way to get the text out; no blank "Old job" lingers.
    click(&page, "show-shelf");
    settle().await;
    assert_eq!(all_text(&page, "aside-row").len(), 1);
    assert!(find(&page, "aside-download").text_content().unwrap().contains("Download"));
    let names: Vec<String> = {
        let list = page.query_selector_all("[data-testid=shelf-name]").unwrap();
        (0..list.length()).map(|i| list.item(i).unwrap().unchecked_into::<HtmlInputElement>().value()).collect()
    };
    assert!(!names.contains(&"Old job".to_owned()), "{names:?}");
    click(&page, "show-shelf");
    settle().await;
    // And the app works: a line can be added and sized.
    click(&page, "add-line");
    settle().await;
    type_into(&page, "flow", "5");
    type_into(&page, "length", "20");
    settle().await;
    assert_ne!(find(&page, "proposed-size").text_content().unwrap(), "—");
}

#[wasm_bindgen_test]
async fn full_storage_says_so_and_work_goes_on() {
    fresh();
    let page = mount_app();
    settle().await;
    let s = storage();
    fill_storage();
    click(&page, "add-line");
    settle().await;
    type_into(&page, "flow", "2");
    type_into(&page, "length", "10");
    settle().await;
    let notices = all_text(&page, "notice").join(" ");
    assert!(notices.contains("storage for Headroom is full"), "{notices}");
    assert_ne!(find(&page, "proposed-size").text_content().unwrap(), "—", "sizing goes on");
    s.clear().unwrap();
}

#[wasm_bindgen_test]
async fn a_link_opens_as_a_new_worksheet_beside_local_work() {
    fresh();
    // Local work exists.
    let page = mount_app();
    settle().await;
    click(&page, "add-line");
    settle().await;
    type_into(&page, "line-name", "Mine");
    settle().await;
    let before: Vec<String> = keys().into_iter().filter(|k| k.starts_with(SHEET_PREFIX)).collect();
    let mine = storage().get_item(&before[0]).unwrap().unwrap();
    // A colleague's link arrives (set without a hashchange, then a fresh page).
    let demo = SheetFile::from_json(DEMO).unwrap();
    let w = web_sys::window().unwrap();
    let path = w.location().pathname().unwrap();
    w.history()
        .unwrap()
        .replace_state_with_url(
            &wasm_bindgen::JsValue::NULL,
            "",
            Some(&format!("{path}#{}", fragment_of(&demo).await.unwrap())),
        )
        .unwrap();
    clear_pages();
    let page = mount_app();
    settle().await;
    // Asked first: nothing stored yet, the local work still shown.
    let question = find(&page, "link-question").text_content().unwrap();
    assert!(
        question.contains(&format!("Open the shared worksheet “{}” with {} lines?", demo.project, demo.lines.len())),
        "{question}"
    );
    assert_eq!(keys().into_iter().filter(|k| k.starts_with(SHEET_PREFIX)).count(), 1);
    assert_eq!(all_text(&page, "row-name"), ["Mine"]);
    click(&page, "open-link");
    settle().await;
    assert_eq!(all_text(&page, "row-name").len(), demo.lines.len());
    assert!(all_text(&page, "notice").join(" ").contains("as a new worksheet"));
    assert_eq!(w.location().hash().unwrap(), "", "the link is cleared from the address");
    let after: Vec<String> = keys().into_iter().filter(|k| k.starts_with(SHEET_PREFIX)).collect();
    assert_eq!(after.len(), 2);
    assert_eq!(storage().get_item(&before[0]).unwrap().unwrap(), mine, "local work untouched");
}

/// The page deflates and inflates links with the browser's Compression
/// Streams, the batch command and the tests with miniz_oxide. Checked
/// against: the version-1 link fixtures made by miniz_oxide (Headroom
/// 0.1.0, 2026-12-01, never regenerated), and raw DEFLATE built by hand
/// from RFC 1951's stored blocks; the same limits as `link::decode`
/// (tests/links.rs checks those natively with the same hand-made blocks).
#[wasm_bindgen_test]
async fn the_browsers_deflate_reads_and_writes_the_links_miniz_oxide_does() {
    let expected = SheetFile::from_json(include_str!("fixtures/link-v1-demo.json")).unwrap();
    let read = |f: &str| read_fragment(f.trim().to_owned());
    assert_eq!(read(include_str!("fixtures/link-v1-demo.txt")).await.unwrap(), expected);
    let hostile = read(include_str!("fixtures/link-v1-hostile.txt")).await.unwrap();
    assert_eq!(hostile.lines[0].name, "<script>alert('x')</script><img src=x onerror=alert(1)>");
    // Hand-made DEFLATE of the sheet's JSON opens as the sheet.
    let by_hand = link::wrap(&stored_blocks(expected.to_compact_json().as_bytes()));
    assert_eq!(read(&by_hand).await.unwrap(), expected);
    // The browser's own link opens, and is smaller than the JSON it holds.
    let made = fragment_of(&expected).await.unwrap();
    assert!(made.starts_with("h1.") && made.len() < expected.to_compact_json().len(), "{made}");
    assert_eq!(read(&made).await.unwrap(), expected);
    // Cut short or altered: an error, never a sheet.
    for cut in [4, made.len() / 2, made.len() - 1] {
        assert!(read(&made[..cut]).await.is_err(), "cut at {cut}");
    }
    assert_eq!(read(&link::wrap(&[0xFF; 8])).await, Err(LinkError::BadData));
    // The inflate limit: exactly MAX_INFLATED_BYTES is inflated (and is
    // then not a sheet), one byte more is refused before it is all read.
    // (tests/links.rs: the same natively.)
    let at_limit = link::wrap(&deflated(&vec![b' '; MAX_INFLATED_BYTES]).await.unwrap());
    assert!(matches!(read(&at_limit).await, Err(LinkError::Sheet(_))));
    let over = link::wrap(&deflated(&vec![b' '; MAX_INFLATED_BYTES + 1]).await.unwrap());
    assert_eq!(read(&over).await, Err(LinkError::TooBig));
    // A bomb: 4 MiB of spaces deflated to a short link.
    let bomb = link::wrap(&deflated(&vec![b' '; 4 << 20]).await.unwrap());
    assert!(bomb.len() < MAX_LINK_CHARS, "{}", bomb.len());
    assert_eq!(read(&bomb).await, Err(LinkError::TooBig));
}

#[wasm_bindgen_test]
async fn a_broken_link_is_a_message_not_a_crash() {
    fresh();
    let w = web_sys::window().unwrap();
    let path = w.location().pathname().unwrap();
    w.history()
        .unwrap()
        .replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&format!("{path}#h1.q1w2e3r4t5")))
        .unwrap();
    let page = mount_app();
    settle().await;
    let notices = all_text(&page, "notice").join(" ");
    assert!(notices.contains("The link could not be opened"), "{notices}");
    assert!(find(&page, "open-demo").text_content().is_some());
}

#[wasm_bindgen_test]
async fn worksheets_can_be_copied_deleted_and_brought_back() {
    fresh();
    let page = mount_app();
    settle().await;
    click(&page, "open-demo");
    settle().await;
    click(&page, "show-shelf");
    settle().await;
    let rows = || page.query_selector_all("[data-testid=shelf-row]").unwrap().length();
    let start = rows();
    // Copy the demo.
    let copies = page.query_selector_all("[data-testid=shelf-copy]").unwrap();
    copies.item(copies.length() - 1).unwrap().unchecked_ref::<HtmlElement>().click();
    settle().await;
    assert_eq!(rows(), start + 1);
    // Delete one, then undo.
    page.query_selector_all("[data-testid=shelf-delete]")
        .unwrap()
        .item(0)
        .unwrap()
        .unchecked_ref::<HtmlElement>()
        .click();
    settle().await;
    assert_eq!(rows(), start);
    click(&page, "undo-sheet-delete");
    settle().await;
    assert_eq!(rows(), start + 1);
    // Deleted again, it waits in the trash (not only in memory): a fresh
    // page lists it and can restore it.
    page.query_selector_all("[data-testid=shelf-delete]")
        .unwrap()
        .item(0)
        .unwrap()
        .unchecked_ref::<HtmlElement>()
        .click();
    settle().await;
    assert!(keys().iter().any(|k| k.starts_with(TRASH_PREFIX)));
    clear_pages();
    let page = mount_app();
    settle().await;
    click(&page, "show-shelf");
    settle().await;
    assert_eq!(all_text(&page, "trash-row").len(), 1);
    click(&page, "trash-restore");
    settle().await;
    assert_eq!(page.query_selector_all("[data-testid=shelf-row]").unwrap().length(), start + 1);
    assert!(all_text(&page, "trash-row").is_empty());
}

#[wasm_bindgen_test]
async fn disabled_storage_says_work_will_be_lost_and_sizing_goes_on() {
    fresh();
    // Make the page's local storage refuse access, as a locked-down browser
    // does (reading `localStorage` throws), then put it back afterwards.
    // An own property on `window` shadows the real one.
    let w = web_sys::window().unwrap();
    let original = w.local_storage().unwrap().unwrap();
    let throwing = js_sys::Function::new_no_args("throw new DOMException('storage is off', 'SecurityError')");
    let blocked = js_sys::Object::new();
    js_sys::Reflect::set(&blocked, &"get".into(), &throwing).unwrap();
    js_sys::Reflect::set(&blocked, &"configurable".into(), &true.into()).unwrap();
    js_sys::Object::define_property(&w, &"localStorage".into(), &blocked);
    let page = mount_app();
    settle().await;
    click(&page, "add-line");
    settle().await;
    type_into(&page, "flow", "4");
    type_into(&page, "length", "25");
    settle().await;
    // Restore before asserting, so a failure cannot leave storage broken.
    let restored = js_sys::Object::new();
    js_sys::Reflect::set(&restored, &"value".into(), &original).unwrap();
    js_sys::Reflect::set(&restored, &"configurable".into(), &true.into()).unwrap();
    js_sys::Object::define_property(&w, &"localStorage".into(), &restored);
    let notices = all_text(&page, "notice").join(" ");
    assert!(notices.contains("not letting Headroom store anything"), "{notices}");
    assert_ne!(find(&page, "proposed-size").text_content().unwrap(), "—", "sizing goes on");
    assert!(w.local_storage().unwrap().is_some(), "storage is back for the next test");
}

/// Records a panic anywhere in the module (reading a disposed value
/// panics), so a test can assert that none happened.
static PANICKED: std::sync::atomic::AtomicBool = std::sync::atomic::AtomicBool::new(false);

fn watch_for_panics() {
    std::panic::set_hook(Box::new(|info| {
        PANICKED.store(true, std::sync::atomic::Ordering::SeqCst);
        web_sys::console::error_1(&format!("panic: {info}").into());
    }));
}

fn set_fragment(fragment: &str) {
    let w = web_sys::window().unwrap();
    let path = w.location().pathname().unwrap();
    w.history()
        .unwrap()
        .replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&format!("{path}#{fragment}")))
        .unwrap();
}

fn hashchange() {
    let w = web_sys::window().unwrap();
    w.dispatch_event(&web_sys::Event::new("hashchange").unwrap()).unwrap();
}

/// A line, a US switch and a typed flow: a sheet whose unit system differs
/// from a new one's, with live lines.
async fn us_sheet_with_a_line(page: &HtmlElement) {
    click(page, "add-line");
    settle().await;
    type_into(page, "flow", "40");
    type_into(page, "length", "60");
    click(page, "units-us");
    settle().await;
    assert!(find(page, "answer-velocity").text_content().unwrap().ends_with("ft/s"));
}

/// Opens the worksheets panel unless it is open already.
async fn shelf(page: &HtmlElement) {
    if page.query_selector("[data-testid=shelf-panel]").unwrap().is_none() {
        click(page, "show-shelf");
        settle().await;
    }
}

fn stored_sheets() -> Vec<String> {
    keys().into_iter().filter(|k| k.starts_with(SHEET_PREFIX)).collect()
}

#[wasm_bindgen_test]
async fn closing_the_share_panel_while_its_link_is_made_is_harmless() {
    // The browser deflates the panel's link a moment after the panel asks:
    // the answer may come after the panel (and its values) are gone.
    fresh();
    watch_for_panics();
    let page = mount_app();
    settle().await;
    click(&page, "open-demo");
    settle().await;
    click(&page, "show-share");
    leptos::task::tick().await; // the panel asks for its link
    click(&page, "show-share"); // and is closed before the answer
    settle().await;
    assert!(!PANICKED.load(std::sync::atomic::Ordering::SeqCst), "panicked");
    assert!(page.query_selector("[data-testid=share-panel]").unwrap().is_none());
    click(&page, "show-share");
    settle().await;
    let link: HtmlInputElement = find(&page, "share-link").unchecked_into();
    assert!(link.value().contains("#h1."), "{}", link.value());
    assert!(!PANICKED.load(std::sync::atomic::Ordering::SeqCst), "panicked");
}

#[wasm_bindgen_test]
async fn switching_between_sheets_of_different_unit_systems_never_stops_the_page() {
    // Regression: switching from a US sheet with lines to another sheet
    // read values of the old lines after they were disposed, which with
    // panic = "abort" ended the app.
    fresh();
    watch_for_panics();
    let page = mount_app();
    settle().await;
    let alive = |page: &HtmlElement, how: &str| {
        assert!(!PANICKED.load(std::sync::atomic::Ordering::SeqCst), "panicked after {how}");
        assert!(find(page, "add-line").text_content().is_some(), "page gone after {how}");
    };
    // 1. "+ New worksheet".
    us_sheet_with_a_line(&page).await;
    shelf(&page).await;
    click(&page, "new-sheet");
    settle().await;
    alive(&page, "new worksheet");
    assert!(find(&page, "empty").text_content().unwrap().contains("Start a worksheet"));
    // 2. The demo (SI) over a US sheet.
    us_sheet_with_a_line(&page).await;
    click(&page, "open-demo");
    settle().await;
    alive(&page, "demo");
    assert!(find(&page, "answer-velocity").text_content().unwrap().ends_with("m/s"));
    // 3. A link (SI) over a US sheet.
    shelf(&page).await;
    click(&page, "new-sheet");
    settle().await;
    us_sheet_with_a_line(&page).await;
    set_fragment(&fragment_of(&SheetFile::from_json(DEMO).unwrap()).await.unwrap());
    hashchange();
    settle().await;
    click(&page, "open-link");
    settle().await;
    alive(&page, "link");
    // 4. Opening a stored US sheet from the list while an SI one is open,
    //    and back.
    let us_id = {
        let list = page.query_selector_all("[data-testid=shelf-open]").unwrap();
        assert!(list.length() >= 3);
        list.item(list.length() - 2).unwrap().unchecked_into::<HtmlElement>().click();
        settle().await;
        alive(&page, "open from the list");
        storage().get_item(CURRENT_KEY).unwrap().unwrap()
    };
    assert!(storage().get_item(&format!("{SHEET_PREFIX}{us_id}")).unwrap().unwrap().contains("\"us\""));
    // 5. Deleting the open (US) sheet opens another.
    let rows_before = page.query_selector_all("[data-testid=shelf-row]").unwrap().length();
    let current = page.query_selector("[data-testid=shelf-row].current [data-testid=shelf-delete]").unwrap().unwrap();
    current.unchecked_into::<HtmlElement>().click();
    settle().await;
    alive(&page, "deleting the open sheet");
    assert_eq!(page.query_selector_all("[data-testid=shelf-row]").unwrap().length(), rows_before - 1);
    // 6. Sheets without lines, both systems.
    click(&page, "new-sheet");
    settle().await;
    click(&page, "units-us");
    settle().await;
    click(&page, "new-sheet");
    settle().await;
    alive(&page, "empty US sheet to a new one");
    // 7. Copying a stored US sheet with lines opens the copy.
    let copies = page.query_selector_all("[data-testid=shelf-copy]").unwrap();
    copies.item(0).unwrap().unchecked_into::<HtmlElement>().click();
    settle().await;
    alive(&page, "copying a US sheet");
    assert!(find(&page, "answer-velocity").text_content().unwrap().ends_with("ft/s"));
    // Every sheet kept what it had.
    for k in stored_sheets() {
        SheetFile::from_json(&storage().get_item(&k).unwrap().unwrap()).expect("stored sheets stay readable");
    }
}

#[wasm_bindgen_test]
async fn a_deleted_line_cannot_be_undone_into_another_worksheet() {
    fresh();
    let page = mount_app();
    settle().await;
    click(&page, "add-line");
    settle().await;
    type_into(&page, "line-name", "Belongs to sheet one");
    settle().await;
    click(&page, "row-delete");
    settle().await;
    assert!(find(&page, "undo-delete").text_content().is_some());
    shelf(&page).await;
    click(&page, "new-sheet");
    settle().await;
    assert!(
        page.query_selector("[data-testid=undo-delete]").unwrap().is_none(),
        "no undo offered in the other worksheet"
    );
    assert!(all_text(&page, "row-name").is_empty());
}

#[wasm_bindgen_test]
async fn a_flood_of_links_stores_nothing_until_one_is_accepted() {
    fresh();
    let page = mount_app();
    settle().await;
    let before = stored_sheets().len();
    let mut demo = SheetFile::from_json(DEMO).unwrap();
    for n in 0..40 {
        demo.project = format!("Flood {n}");
        set_fragment(&fragment_of(&demo).await.unwrap());
        hashchange();
    }
    settle().await;
    assert_eq!(stored_sheets().len(), before, "nothing stored before the person agrees");
    assert_eq!(all_text(&page, "link-question").len(), 1);
    assert!(find(&page, "link-question").text_content().unwrap().contains("Flood 39"));
    click(&page, "decline-link");
    settle().await;
    assert!(all_text(&page, "link-question").is_empty());
    assert_eq!(stored_sheets().len(), before);
}

#[wasm_bindgen_test]
async fn a_link_that_cannot_be_stored_stays_in_the_address() {
    fresh();
    let page = mount_app();
    settle().await;
    let fragment = fragment_of(&SheetFile::from_json(DEMO).unwrap()).await.unwrap();
    set_fragment(&fragment);
    hashchange();
    settle().await;
    let s = storage();
    fill_storage();
    click(&page, "open-link");
    settle().await;
    let notices = all_text(&page, "notice").join(" ");
    s.clear().unwrap();
    assert!(notices.contains("could not be stored") && notices.contains("stays in the address bar"), "{notices}");
    assert_eq!(web_sys::window().unwrap().location().hash().unwrap(), format!("#{fragment}"));
}

/// What another tab's write looks like to this one.
fn storage_event(key: &str, value: &str) {
    let init = web_sys::StorageEventInit::new();
    init.set_key(Some(key));
    init.set_new_value(Some(value));
    let ev = web_sys::StorageEvent::new_with_event_init_dict("storage", &init).unwrap();
    web_sys::window().unwrap().dispatch_event(&ev).unwrap();
}

/// Writes a sheet and its next revision as another tab's save would;
/// returns that revision.
fn other_tab_saves(id: &str, sheet: &SheetFile) -> u64 {
    let rev: u64 = storage().get_item(&format!("{REV_PREFIX}{id}")).unwrap().unwrap().parse().unwrap();
    storage().set_item(&format!("{SHEET_PREFIX}{id}"), &sheet.to_json()).unwrap();
    storage().set_item(&format!("{REV_PREFIX}{id}"), &(rev + 1).to_string()).unwrap();
    rev + 1
}

fn current_sheet() -> (String, SheetFile) {
    let id = storage().get_item(CURRENT_KEY).unwrap().unwrap();
    let text = storage().get_item(&format!("{SHEET_PREFIX}{id}")).unwrap().unwrap();
    (id, SheetFile::from_json(&text).unwrap())
}

#[wasm_bindgen_test]
async fn another_tabs_save_is_followed_when_this_tab_has_nothing_unsaved() {
    fresh();
    let page = mount_app();
    settle().await;
    click(&page, "add-line");
    settle().await;
    // The other tab renames the line and saves a newer revision.
    let (id, mut theirs) = current_sheet();
    theirs.lines[0].name = "Renamed in the other tab".into();
    let rev = other_tab_saves(&id, &theirs);
    storage_event(&format!("{REV_PREFIX}{id}"), &rev.to_string());
    settle().await;
    assert_eq!(all_text(&page, "row-name"), ["Renamed in the other tab"]);
    assert!(page.query_selector("[data-testid=halt]").unwrap().is_none());
    // And this tab's next edit saves on top of it.
    type_into(&page, "line-name", "Then renamed here");
    settle().await;
    assert_eq!(current_sheet().1.lines[0].name, "Then renamed here");
}

#[wasm_bindgen_test]
async fn a_tab_that_would_overwrite_a_newer_revision_stops_and_offers_both_copies() {
    fresh();
    let page = mount_app();
    settle().await;
    click(&page, "add-line");
    settle().await;
    let (id, mut theirs) = current_sheet();
    // This tab types; before its save runs, the other tab saves.
    type_into(&page, "line-name", "This tab's name");
    theirs.lines[0].name = "The other tab's name".into();
    other_tab_saves(&id, &theirs);
    settle().await;
    // Nothing overwritten, the person told, saving stopped.
    assert!(find(&page, "halt").text_content().unwrap().contains("stopped saving"));
    assert_eq!(current_sheet().1.lines[0].name, "The other tab's name");
    type_into(&page, "line-name", "Still typing here");
    settle().await;
    assert_eq!(current_sheet().1.lines[0].name, "The other tab's name");
    // Keep both: this tab's copy becomes a new worksheet.
    click(&page, "keep-mine");
    settle().await;
    assert!(page.query_selector("[data-testid=halt]").unwrap().is_none());
    let (new_id, mine) = current_sheet();
    assert_ne!(new_id, id);
    assert_eq!(mine.lines[0].name, "Still typing here");
    let other = SheetFile::from_json(&storage().get_item(&format!("{SHEET_PREFIX}{id}")).unwrap().unwrap()).unwrap();
    assert_eq!(other.lines[0].name, "The other tab's name");
}

#[wasm_bindgen_test]
async fn an_old_tab_stops_saving_when_a_newer_build_starts_elsewhere() {
    fresh();
    let w = web_sys::window().unwrap();
    js_sys::Reflect::set(&w, &"headroomBuild".into(), &"20261201000000-headroom-old.js".into()).unwrap();
    let page = mount_app();
    settle().await;
    assert_eq!(storage().get_item(BUILD_KEY).unwrap().unwrap(), "20261201000000-headroom-old.js");
    click(&page, "add-line");
    settle().await;
    type_into(&page, "line-name", "Saved by the old tab");
    settle().await;
    // An older build starting elsewhere changes nothing here.
    storage_event(BUILD_KEY, "20261101000000-headroom-older.js");
    settle().await;
    assert!(page.query_selector("[data-testid=halt]").unwrap().is_none());
    storage_event(BUILD_KEY, "20261215000000-headroom-new.js");
    settle().await;
    js_sys::Reflect::delete_property(&w, &"headroomBuild".into()).unwrap();
    assert!(find(&page, "halt").text_content().unwrap().contains("newer version of Headroom"));
    assert!(find(&page, "reload").text_content().is_some());
    type_into(&page, "line-name", "Typed after the update");
    settle().await;
    assert_eq!(current_sheet().1.lines[0].name, "Saved by the old tab");
}

#[wasm_bindgen_test]
async fn a_sheet_saved_by_a_newer_headroom_is_left_untouched() {
    fresh();
    let s = storage();
    let text =
        r#"{"format":"headroom-sheet","version":9,"project":"From a later Headroom","lines":[{"anything":"new"}]}"#;
    s.set_item(&format!("{SHEET_PREFIX}later"), text).unwrap();
    s.set_item(CURRENT_KEY, "later").unwrap();
    let page = mount_app();
    settle().await;
    let notices = all_text(&page, "notice").join(" ");
    assert!(notices.contains("saved by a newer Headroom") && notices.contains("left untouched"), "{notices}");
    assert_eq!(s.get_item(&format!("{SHEET_PREFIX}later")).unwrap().unwrap(), text);
    assert!(!keys().iter().any(|k| k.starts_with(ASIDE_PREFIX)), "not moved aside as damaged");
    click(&page, "add-line");
    settle().await;
    assert_eq!(
        s.get_item(&format!("{SHEET_PREFIX}later")).unwrap().unwrap(),
        text,
        "still untouched after work elsewhere"
    );
}

#[wasm_bindgen_test]
async fn a_count_that_is_not_a_whole_number_is_shown_beside_the_count() {
    fresh();
    let page = mount_app();
    settle().await;
    click(&page, "add-line");
    settle().await;
    type_into(&page, "flow", "5");
    type_into(&page, "length", "20");
    click(&page, "add-fitting");
    settle().await;
    for bad in ["2.5", "-1", "1e2", "99999999999"] {
        type_into(&page, "fitting-0-count", bad);
        settle().await;
        assert_eq!(
            find(&page, "fitting-0-count-error").text_content().unwrap(),
            format!("'{bad}' is not a whole number from 0 to 999")
        );
        assert_eq!(find(&page, "proposed-size").text_content().unwrap(), "—", "no answer from a bad count");
        let input: HtmlInputElement = find(&page, "fitting-0-count").unchecked_into();
        assert_eq!(input.value(), bad, "what was typed is kept");
    }
    type_into(&page, "fitting-0-count", "3");
    settle().await;
    assert_eq!(find(&page, "fitting-0-count-error").text_content().unwrap(), "");
    assert_ne!(find(&page, "proposed-size").text_content().unwrap(), "—");
}

#[wasm_bindgen_test]
async fn without_a_clipboard_the_share_panel_says_how_to_send_the_link() {
    fresh();
    // A browser (or an insecure page) without navigator.clipboard.
    let nav = web_sys::window().unwrap().navigator();
    let hidden = js_sys::Object::new();
    js_sys::Reflect::set(&hidden, &"value".into(), &wasm_bindgen::JsValue::UNDEFINED).unwrap();
    js_sys::Reflect::set(&hidden, &"configurable".into(), &true.into()).unwrap();
    js_sys::Object::define_property(&nav, &"clipboard".into(), &hidden);
    let page = mount_app();
    settle().await;
    click(&page, "show-share");
    settle().await;
    // Put the real one back before asserting.
    js_sys::Reflect::delete_property(&nav, &"clipboard".into()).unwrap();
    assert!(page.query_selector("[data-testid=copy-link]").unwrap().is_none(), "no button that cannot work");
    assert!(find(&page, "share-fallback").text_content().unwrap().contains("copy it by hand"));
}
