//! The smallest interactive Leptos page: a heading, a button and a count.
//! Built like Headroom (same toolchain, same release profile, same
//! wasm-opt level) so the end-to-end test can time Headroom's start beside
//! it (`tests/e2e.rs`, `start_time_beside_a_bare_leptos_page`).

#[cfg(target_arch = "wasm32")]
fn main() {
    use leptos::prelude::*;
    leptos::mount::mount_to_body(|| {
        let count = RwSignal::new(0u32);
        view! {
            <main>
                <h1>"A bare Leptos page"</h1>
                <button type="button" data-testid="ready" on:click=move |_| count.update(|n| *n += 1)>
                    {move || format!("pressed {} times", count.get())}
                </button>
            </main>
        }
    });
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("headroom-bare is a web page: build it with trunk (scripts/test build)");
}
