//! What the person sees of keeping work: whether the page works offline
//! and whether the browser keeps its storage, why this tab stopped saving
//! (with the choices), and the question before a shared link is opened.

use leptos::prelude::*;

use super::keep::{Halt, Keeper};
use crate::sheet::library::display_name;

/// One line under the masthead: offline readiness and storage safety.
#[component]
pub fn Status(
    /// The keeper.
    keeper: Keeper,
) -> impl IntoView {
    let offline = move || {
        if keeper.offline_ready.get() {
            "Ready to work offline."
        } else {
            "Not yet ready offline: keep this page open once while online."
        }
    };
    let storage = move || {
        match keeper.persisted.get() {
        Some(true) => "This browser keeps Headroom's storage.",
        Some(false) => "This browser may clear Headroom's storage when space runs low: export worksheets you need as files (Files & print).",
        None => "",
    }
    };
    view! {
        <p class="status screen-only" data-testid="status">
            <span data-testid="offline-status">{offline}</span>" "
            <span data-testid="storage-status">{storage}</span>
        </p>
    }
}

/// Shown while this tab has stopped saving.
#[component]
pub fn HaltBanner(
    /// The keeper.
    keeper: Keeper,
) -> impl IntoView {
    move || {
        keeper.halted.get().map(|h| match h {
            Halt::OtherTab => view! {
                <div class="halt screen-only" role="alert" data-testid="halt">
                    <p>"This worksheet was changed in another tab or window while this tab had changes of its own. This tab has stopped saving it, so neither copy overwrites the other."</p>
                    <button type="button" data-testid="keep-mine" on:click=move |_| keeper.keep_mine()>"Keep this tab's copy as a new worksheet"</button>
                    <button type="button" class="quiet" data-testid="take-theirs" on:click=move |_| keeper.take_theirs()>"Show the other copy (drops this tab's changes)"</button>
                </div>
            }
            .into_any(),
            Halt::NewerBuild => view! {
                <div class="halt screen-only" role="alert" data-testid="halt">
                    <p>"A newer version of Headroom started in another tab. This tab runs the old version and has stopped saving; everything up to now is saved. Reload to go on."</p>
                    <button type="button" data-testid="reload" on:click=move |_| {
                        if let Some(w) = web_sys::window() {
                            let _ = w.location().reload();
                        }
                    }>"Reload"</button>
                </div>
            }
            .into_any(),
        })
    }
}

/// Asks before a shared link's worksheet is stored and opened.
#[component]
pub fn LinkQuestion(
    /// The keeper.
    keeper: Keeper,
) -> impl IntoView {
    move || {
        keeper.pending.get().map(|p| {
            let name = display_name(&p.file.project);
            let n = p.file.lines.len();
            let names: Vec<String> = p
                .file
                .lines
                .iter()
                .take(8)
                .map(|l| if l.name.trim().is_empty() { format!("Unnamed line, flow {}", l.flow) } else { l.name.clone() })
                .collect();
            let more = n.saturating_sub(names.len());
            view! {
                <section class="ask screen-only" role="alertdialog" aria-labelledby="ask-title" data-testid="link-question">
                    <h2 id="ask-title">{format!("Open the shared worksheet “{name}” with {n} line{}?", if n == 1 { "" } else { "s" })}</h2>
                    <p class="hint">"It opens as a new worksheet beside yours; nothing of yours changes. Only open links from people you trust."</p>
                    {(!p.file.date.is_empty()).then(|| view! { <p>"Dated "{p.file.date.clone()}</p> })}
                    <ul data-testid="link-lines">
                        {names.into_iter().map(|l| view! { <li>{l}</li> }).collect_view()}
                        {(more > 0).then(|| view! { <li>{format!("and {more} more")}</li> })}
                    </ul>
                    <button type="button" data-testid="open-link" on:click=move |_| keeper.accept_link()>"Open it"</button>
                    <button type="button" class="quiet" data-testid="decline-link" on:click=move |_| keeper.decline_link()>"Not now"</button>
                </section>
            }
        })
    }
}
