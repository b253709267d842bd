//! Entry point: mounts the worksheet page in the browser.

#[cfg(target_arch = "wasm32")]
fn main() {
    headroom::ui::fatal::install_panic_hook();
    // The page's stand-in (www/index.html) goes in the same task as the
    // worksheet is drawn, so no frame shows both or neither.
    if let Some(stand_in) = web_sys::window().and_then(|w| w.document()).and_then(|d| d.get_element_by_id("loading")) {
        stand_in.remove();
    }
    leptos::mount::mount_to_body(headroom::ui::App);
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("headroom: the worksheet runs in a browser; start it with `scripts/serve`.");
    std::process::exit(2);
}
