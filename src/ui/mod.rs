//! The page: Leptos components only. They read and write the worksheet's
//! text through [`state::Sheet`] and show what [`crate::sheet`] computes.
//! No formula lives here.

pub mod editor;
pub mod fatal;
pub mod fields;
pub mod results;
pub mod roster;
pub mod state;

use leptos::prelude::*;

use crate::sheet::file::{SheetFile, System};
pub use crate::sheet::report::CAUTION;
use state::Sheet;

/// The root of the page. Provides the worksheet to everything below.
#[component]
pub fn App() -> impl IntoView {
    let sheet = Sheet::new();
    provide_context(sheet);
    view! { <Desk sheet=sheet/> }
}

/// The page laid out around a given worksheet (tests mount it with their own).
#[component]
pub fn Desk(
    /// The worksheet shown.
    sheet: Sheet,
) -> impl IntoView {
    provide_context(sheet);
    let open_demo = move |_| {
        if let Ok(demo) = SheetFile::from_json(state::DEMO) {
            sheet.load(demo);
        }
    };
    let system = move || sheet.units.get().system;
    view! {
        <header class="masthead">
            <div class="brand">
                <h1>"Headroom"</h1>
                <p class="tagline">"Pipe sizing worksheet · works offline"</p>
            </div>
            <div class="sheet-meta">
                <label>"Project"<input type="text" data-testid="project" prop:value=move || sheet.project.get()
                    on:input=move |ev| sheet.project.set(event_target_value(&ev))/></label>
                <label>"Date"<input type="date" data-testid="date" prop:value=move || sheet.date.get()
                    on:input=move |ev| sheet.date.set(event_target_value(&ev))/></label>
                <div class="system" role="group" aria-label="Unit system">
                    <button type="button" data-testid="units-si" aria-pressed=move || if system() == System::Si { "true" } else { "false" }
                        on:click=move |_| sheet.set_system(System::Si)>"SI"</button>
                    <button type="button" data-testid="units-us" aria-pressed=move || if system() == System::Us { "true" } else { "false" }
                        on:click=move |_| sheet.set_system(System::Us)>"US"</button>
                </div>
                <button type="button" class="demo" data-testid="open-demo" on:click=open_demo>"Open the demo sheet"</button>
            </div>
        </header>
        <main class="desk">
            <roster::Roster/>
            <section class="bench" aria-label="Selected line">
                {move || match sheet.current() {
                    Some(slot) => view! {
                        <editor::LineEditor line=slot.clone()/>
                        <results::LineResults line=slot/>
                    }.into_any(),
                    None => view! {
                        <div class="empty" data-testid="empty">
                            <h2>"Start a worksheet"</h2>
                            <p>"Add a line with “+ New line”, or open the demo sheet: an invented clinic's chilled-water plant."</p>
                        </div>
                    }.into_any(),
                }}
            </section>
        </main>
        <footer class="caution" role="note" data-testid="caution">{CAUTION}</footer>
    }
}
