//! Entry point: mounts the worksheet page in the browser.

#[cfg(target_arch = "wasm32")]
fn main() {
    headroom::ui::fatal::install_panic_hook();
    leptos::mount::mount_to_body(headroom::ui::App);
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("headroom: the worksheet runs in a browser; start it with `scripts/serve`.");
    std::process::exit(2);
}
