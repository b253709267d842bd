//! The page: Leptos components only. They read typed text, hand it to
//! [`crate::sheet`], and show what comes back. No formula lives here.

pub mod fatal;

use leptos::prelude::*;

use crate::sheet::quick::{velocity_m_per_s, Field};

pub use crate::sheet::report::CAUTION;

/// The root of the page: header, the quick bore check and the caution.
#[component]
pub fn App() -> impl IntoView {
    view! {
        <header class="masthead">
            <h1>"Headroom"</h1>
            <p class="tagline">"Pipe sizing worksheet — works offline"</p>
        </header>
        <main>
            <QuickCheck/>
        </main>
        <footer class="caution" role="note" data-testid="caution">{CAUTION}</footer>
    }
}

/// Flow and inside diameter in, mean velocity out, recomputed on every keystroke.
#[component]
pub fn QuickCheck() -> impl IntoView {
    let (flow, set_flow) = signal(String::from("2.5"));
    let (bore, set_bore) = signal(String::from("52.5"));
    // Read in three places (two error slots and the output), so memoise.
    let result = Memo::new(move |_| velocity_m_per_s(&flow.get(), &bore.get()));
    let error_for = move |field: Field| {
        move || match result.get() {
            Err(e) if e.field() == field => e.to_string(),
            _ => String::new(),
        }
    };

    view! {
        <section class="card" aria-labelledby="quick-title">
            <h2 id="quick-title">"Quick bore check"</h2>
            <div class="field">
                <label for="quick-flow">"Flow (L/s)"</label>
                <input
                    id="quick-flow"
                    data-testid="quick-flow"
                    type="text"
                    inputmode="decimal"
                    autocomplete="off"
                    prop:value=flow
                    on:input=move |ev| set_flow.set(event_target_value(&ev))
                />
                <span class="field-error" data-testid="quick-flow-error" aria-live="polite">
                    {error_for(Field::Flow)}
                </span>
            </div>
            <div class="field">
                <label for="quick-bore">"Inside diameter (mm)"</label>
                <input
                    id="quick-bore"
                    data-testid="quick-bore"
                    type="text"
                    inputmode="decimal"
                    autocomplete="off"
                    prop:value=bore
                    on:input=move |ev| set_bore.set(event_target_value(&ev))
                />
                <span class="field-error" data-testid="quick-bore-error" aria-live="polite">
                    {error_for(Field::Bore)}
                </span>
            </div>
            <p class="readout">
                "Mean velocity "
                <output data-testid="quick-velocity" for="quick-flow quick-bore">
                    {move || match result.get() {
                        Ok(v) => format!("{v:.3} m/s"),
                        Err(_) => "—".to_owned(),
                    }}
                </output>
            </p>
        </section>
    }
}
