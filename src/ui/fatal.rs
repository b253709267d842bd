//! What the page does when the module panics: never a silent blank page.
//!
//! - The overlay is built with plain `web_sys` calls, not Leptos, because
//!   after a panic the reactive runtime may be the thing that broke.
//! - The message goes in as text (`set_text_content`), never as markup, since
//!   a panic message can quote user input.

use wasm_bindgen::closure::Closure;
use wasm_bindgen::JsCast;

/// Installs a panic hook that logs the panic to the console and shows
/// [`show_fatal`]'s overlay.
pub fn install_panic_hook() {
    std::panic::set_hook(Box::new(|info| {
        let message = info.to_string();
        web_sys::console::error_1(&format!("Headroom stopped: {message}").into());
        show_fatal(&message);
    }));
}

/// Puts a full-page notice with the message and a reload button in front of
/// everything. Safe to call more than once: later calls replace the text.
pub fn show_fatal(message: &str) {
    let Some(document) = web_sys::window().and_then(|w| w.document()) else {
        return;
    };
    let Some(body) = document.body() else {
        return;
    };
    let overlay = match document.get_element_by_id("fatal") {
        Some(existing) => existing,
        None => {
            let Ok(el) = build_overlay(&document) else {
                return;
            };
            let _ = body.append_child(&el);
            el
        }
    };
    if let Ok(Some(detail)) = overlay.query_selector("[data-testid=fatal-detail]") {
        detail.set_text_content(Some(message));
    }
}

fn build_overlay(document: &web_sys::Document) -> Result<web_sys::Element, wasm_bindgen::JsValue> {
    let overlay = document.create_element("div")?;
    overlay.set_id("fatal");
    overlay.set_attribute("role", "alertdialog")?;
    overlay.set_attribute("aria-labelledby", "fatal-title")?;
    overlay.set_attribute("data-testid", "fatal")?;

    let title = document.create_element("h2")?;
    title.set_id("fatal-title");
    title.set_text_content(Some("Headroom has stopped"));
    overlay.append_child(&title)?;

    let advice = document.create_element("p")?;
    advice.set_text_content(Some(
        "Something inside the calculator failed. Your saved worksheets are not affected. \
         Reload to start again; the details below help us fix it.",
    ));
    overlay.append_child(&advice)?;

    let detail = document.create_element("pre")?;
    detail.set_attribute("data-testid", "fatal-detail")?;
    overlay.append_child(&detail)?;

    let button = document.create_element("button")?;
    button.set_attribute("type", "button")?;
    button.set_attribute("data-testid", "fatal-reload")?;
    button.set_text_content(Some("Reload"));
    let reload = Closure::<dyn FnMut()>::new(|| {
        if let Some(w) = web_sys::window() {
            let _ = w.location().reload();
        }
    });
    button.add_event_listener_with_callback("click", reload.as_ref().unchecked_ref())?;
    // The button lives as long as the page; so must its handler.
    reload.forget();
    overlay.append_child(&button)?;
    Ok(overlay)
}
