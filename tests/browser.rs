//! Component tests in a real browser (wasm-bindgen-test in headless Chromium).
//!
//! Run with `cargo test --target wasm32-unknown-unknown --test browser`;
//! scripts/test does this with CHROMEDRIVER set.
#![cfg(target_arch = "wasm32")]

use headroom::sheet::quick::velocity_m_per_s;
use headroom::ui::{fatal, App, QuickCheck, CAUTION};
use leptos::prelude::*;
use wasm_bindgen::JsCast;
use wasm_bindgen_test::*;
use web_sys::{Event, EventInit, HtmlElement, HtmlInputElement};

wasm_bindgen_test_configure!(run_in_browser);

/// Mounts a component into a fresh element of its own and returns that element.
fn mount<F, N>(component: F) -> HtmlElement
where
    F: FnOnce() -> N + 'static,
    N: IntoView,
{
    let document = web_sys::window().unwrap().document().unwrap();
    let host: HtmlElement = document.create_element("div").unwrap().unchecked_into();
    document.body().unwrap().append_child(&host).unwrap();
    leptos::mount::mount_to(host.clone(), component).forget();
    host
}

fn find(root: &HtmlElement, testid: &str) -> web_sys::Element {
    root.query_selector(&format!("[data-testid={testid}]"))
        .unwrap()
        .unwrap_or_else(|| panic!("no element with data-testid={testid}"))
}

fn text(root: &HtmlElement, testid: &str) -> String {
    find(root, testid).text_content().unwrap_or_default()
}

/// Types into an input the way a person does: set the value, fire `input`.
fn type_into(root: &HtmlElement, testid: &str, value: &str) {
    let input: HtmlInputElement = find(root, testid).unchecked_into();
    input.set_value(value);
    let init = EventInit::new();
    init.set_bubbles(true);
    let event = Event::new_with_event_init_dict("input", &init).unwrap();
    input.dispatch_event(&event).unwrap();
}

#[wasm_bindgen_test]
async fn typing_a_flow_updates_the_velocity() {
    let root = mount(QuickCheck);
    type_into(&root, "quick-flow", "6,3");
    leptos::task::tick().await;
    // The expected value comes from the core, so the page must show the core's answer.
    let expected = velocity_m_per_s("6.3", "52.5").unwrap();
    assert_eq!(text(&root, "quick-velocity"), format!("{expected:.3} m/s"));
}

#[wasm_bindgen_test]
async fn a_bad_flow_shows_its_message_beside_the_field() {
    let root = mount(QuickCheck);
    type_into(&root, "quick-flow", "lots");
    leptos::task::tick().await;
    assert_eq!(text(&root, "quick-flow-error"), "flow: 'lots' is not a number");
    assert_eq!(text(&root, "quick-bore-error"), "");
    assert_eq!(text(&root, "quick-velocity"), "—");
}

#[wasm_bindgen_test]
async fn the_page_always_shows_the_caution() {
    let root = mount(App);
    leptos::task::tick().await;
    assert_eq!(text(&root, "caution"), CAUTION);
}

#[wasm_bindgen_test]
fn the_panic_overlay_shows_the_message_as_text_with_a_reload_button() {
    fatal::show_fatal("bad <b>thing</b> happened");
    let document = web_sys::window().unwrap().document().unwrap();
    let overlay = document.get_element_by_id("fatal").expect("overlay shown");
    let detail = overlay
        .query_selector("[data-testid=fatal-detail]")
        .unwrap()
        .unwrap();
    // Text, not markup: the angle brackets survive and no <b> element appears.
    assert_eq!(detail.text_content().unwrap(), "bad <b>thing</b> happened");
    assert!(detail.query_selector("b").unwrap().is_none());
    let reload = overlay
        .query_selector("[data-testid=fatal-reload]")
        .unwrap()
        .expect("reload button");
    assert_eq!(reload.text_content().unwrap(), "Reload");
    // A second failure updates the one overlay rather than stacking another.
    fatal::show_fatal("second");
    assert_eq!(document.query_selector_all("#fatal").unwrap().length(), 1);
    assert_eq!(detail.text_content().unwrap(), "second");
}
