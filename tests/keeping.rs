//! Keeping work, in a real browser: autosave and restore, damaged and full
//! storage, shared links opening beside local work, the worksheet list.
#![cfg(target_arch = "wasm32")]

use headroom::sheet::file::SheetFile;
use headroom::sheet::library::{CURRENT_KEY, INDEX_KEY, SHEET_PREFIX, ASIDE_PREFIX};
use headroom::sheet::link;
use headroom::ui::state::DEMO;
use headroom::ui::App;
use wasm_bindgen::JsCast;
use wasm_bindgen_test::*;
use web_sys::{HtmlElement, HtmlInputElement};

mod web;

use web::{all_text, click, find, type_into};

wasm_bindgen_test_configure!(run_in_browser);

fn storage() -> web_sys::Storage {
    web_sys::window().unwrap().local_storage().unwrap().unwrap()
}

fn keys() -> Vec<String> {
    let s = storage();
    (0..s.length().unwrap()).filter_map(|i| s.key(i).unwrap()).collect()
}

/// A fresh page: empty storage, no fragment, no earlier mounts visible.
fn fresh() {
    storage().clear().unwrap();
    let w = web_sys::window().unwrap();
    w.history().unwrap().replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&w.location().pathname().unwrap())).unwrap();
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
    let document = web_sys::window().unwrap().document().unwrap();
    let host: HtmlElement = document.create_element("div").unwrap().unchecked_into();
    host.set_class_name("test-host");
    document.body().unwrap().append_child(&host).unwrap();
    leptos::mount::mount_to(host.clone(), App).forget();
    host
}





/// Lets the page finish reacting, including the save that runs in a task of
/// its own right after a change.
async fn settle() {
    for _ in 0..3 {
        leptos::task::tick().await;
        let p = js_sys::Promise::new(&mut |resolve, _| {
            web_sys::window().unwrap().set_timeout_with_callback_and_timeout_and_arguments_0(&resolve, 0).unwrap();
        });
        wasm_bindgen_futures::JsFuture::from(p).await.unwrap();
    }
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
    s.set_item(&format!("{SHEET_PREFIX}bad"), "{\"format\":\"headroom-sheet\",\"version\":1,\"lines\":[{\"flo").unwrap();
    s.set_item(CURRENT_KEY, "bad").unwrap();
    let page = mount_app();
    settle().await;
    let notices = all_text(&page, "notice").join(" ");
    assert!(notices.contains("could not be read") && notices.contains("kept, untouched"), "{notices}");
    let aside: Vec<String> = keys().into_iter().filter(|k| k.starts_with(ASIDE_PREFIX)).collect();
    assert_eq!(aside.len(), 1);
    assert!(s.get_item(&aside[0]).unwrap().unwrap().ends_with("\"flo"), "kept exactly as it was");
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
    // Fill the origin's storage to the brim with other data.
    let s = storage();
    let chunk = "x".repeat(256 * 1024);
    let mut n = 0;
    while s.set_item(&format!("filler.{n}"), &chunk).is_ok() {
        n += 1;
        assert!(n < 200, "storage never filled");
    }
    // Then in ever smaller pieces, until not even a few bytes fit.
    for (size, tag) in [(4096, "a"), (256, "b"), (16, "c"), (1, "d")] {
        let piece = "y".repeat(size);
        let mut m = 0;
        while s.set_item(&format!("f{tag}{m}"), &piece).is_ok() {
            m += 1;
        }
    }
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
    w.history().unwrap().replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&format!("{path}#{}", link::encode(&demo)))).unwrap();
    clear_pages();
    let page = mount_app();
    settle().await;
    assert_eq!(all_text(&page, "row-name").len(), demo.lines.len());
    assert!(all_text(&page, "notice").join(" ").contains("as a new worksheet"));
    assert_eq!(w.location().hash().unwrap(), "", "the link is cleared from the address");
    let after: Vec<String> = keys().into_iter().filter(|k| k.starts_with(SHEET_PREFIX)).collect();
    assert_eq!(after.len(), 2);
    assert_eq!(storage().get_item(&before[0]).unwrap().unwrap(), mine, "local work untouched");
}

#[wasm_bindgen_test]
async fn a_broken_link_is_a_message_not_a_crash() {
    fresh();
    let w = web_sys::window().unwrap();
    let path = w.location().pathname().unwrap();
    w.history().unwrap().replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&format!("{path}#h1.q1w2e3r4t5"))).unwrap();
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
    page.query_selector_all("[data-testid=shelf-delete]").unwrap().item(0).unwrap().unchecked_ref::<HtmlElement>().click();
    settle().await;
    assert_eq!(rows(), start);
    click(&page, "undo-sheet-delete");
    settle().await;
    assert_eq!(rows(), start + 1);
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
