//! Helpers for the in-browser tests: find by `data-testid`, read text,
//! type and click as a person would.
#![allow(dead_code)]

use wasm_bindgen::JsCast;
use web_sys::{Event, EventInit, HtmlElement, HtmlInputElement};

/// The element with a `data-testid`, or a panic naming it.
pub fn find(root: &HtmlElement, testid: &str) -> web_sys::Element {
    root.query_selector(&format!("[data-testid=\"{testid}\"]"))
        .unwrap()
        .unwrap_or_else(|| panic!("no element with data-testid={testid}"))
}

/// Its text.
pub fn text(root: &HtmlElement, testid: &str) -> String {
    find(root, testid).text_content().unwrap_or_default()
}

/// The text of every element with a `data-testid`.
pub fn all_text(root: &HtmlElement, testid: &str) -> Vec<String> {
    let list = root.query_selector_all(&format!("[data-testid=\"{testid}\"]")).unwrap();
    (0..list.length()).map(|i| list.item(i).unwrap().text_content().unwrap_or_default()).collect()
}

/// Clicks it.
pub fn click(root: &HtmlElement, testid: &str) {
    find(root, testid).unchecked_ref::<HtmlElement>().click();
}

/// Types into an input the way a person does: set the value, fire `input`.
pub fn type_into(root: &HtmlElement, testid: &str, value: &str) {
    let input: HtmlInputElement = find(root, testid).unchecked_into();
    input.set_value(value);
    let init = EventInit::new();
    init.set_bubbles(true);
    input.dispatch_event(&Event::new_with_event_init_dict("input", &init).unwrap()).unwrap();
}

/// Chooses an option of a select the way a person does: set the value,
/// fire `change`.
pub fn choose(root: &HtmlElement, testid: &str, value: &str) {
    let select: web_sys::HtmlSelectElement = find(root, testid).unchecked_into();
    select.set_value(value);
    let init = EventInit::new();
    init.set_bubbles(true);
    select.dispatch_event(&Event::new_with_event_init_dict("change", &init).unwrap()).unwrap();
}

/// Waits until the next frame has been painted and the tasks it queued
/// have run (the system panel follows the lines one frame later).
pub async fn next_frame() {
    leptos::task::tick().await;
    let p = js_sys::Promise::new(&mut |resolve, _| {
        let w = web_sys::window().unwrap();
        let later = wasm_bindgen::closure::Closure::once_into_js(move || {
            web_sys::window().unwrap().set_timeout_with_callback_and_timeout_and_arguments_0(&resolve, 0).unwrap();
        });
        w.request_animation_frame(later.unchecked_ref()).unwrap();
    });
    wasm_bindgen_futures::JsFuture::from(p).await.unwrap();
    leptos::task::tick().await;
}

/// Puts a stand-in `IntersectionObserver` in the page: it says every
/// element it watches is on the screen, and a test can say otherwise with
/// [`tell_near`]. The answer panel is written only while near the screen
/// (`src/ui/results.rs`), and these tests mount page after page below each
/// other, most far below the test runner's screen; the real observer is
/// exercised by the end-to-end tests, which scroll.
pub fn observe_as_near() {
    let install = js_sys::Function::new_no_args(
        r#"if (window.headroomObservers) return;
           window.headroomObservers = [];
           window.IntersectionObserver = class {
             constructor(callback) { this.callback = callback; this.targets = []; window.headroomObservers.push(this); }
             observe(target) { this.targets.push(target); queueMicrotask(() => this.tell(true)); }
             unobserve() {}
             disconnect() { this.targets = []; }
             tell(near) { if (this.targets.length) this.callback(this.targets.map(target => ({ target, isIntersecting: near })), this); }
           };"#,
    );
    install.call0(&wasm_bindgen::JsValue::NULL).unwrap();
}

/// Tells every stand-in observer still watching that its elements are
/// (`true`) or are not near the screen.
pub fn tell_near(near: bool) {
    let tell = js_sys::Function::new_with_args("near", "for (const o of window.headroomObservers) o.tell(near);");
    tell.call1(&wasm_bindgen::JsValue::NULL, &near.into()).unwrap();
}
