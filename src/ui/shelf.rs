//! The worksheets kept on this device: open, rename, copy, delete (with
//! undo), start a new one.

use leptos::prelude::*;

use super::keep::{blank, Keeper, Notices};
use super::state::Sheet;

/// The list of stored worksheets.
#[component]
pub fn ShelfPanel() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let notices = expect_context::<Notices>();
    let keeper = expect_context::<Keeper>();
    let removed = keeper.removed;
    view! {
        <section class="panel shelf" aria-label="Worksheets on this device" data-testid="shelf-panel">
            <h2>"Worksheets on this device"</h2>
            <p class="hint">"Every change is saved here as you type."</p>
            <button type="button" data-testid="new-sheet" on:click=move |_| keeper.create(blank(), sheet)>"+ New worksheet"</button>
            {move || removed.get().map(|(e, _)| {
                view! {
                    <p class="toast" role="status">{format!("Deleted “{}”. ", e.name)}
                        <button type="button" class="quiet" data-testid="undo-sheet-delete" on:click=move |_| keeper.undo_delete(notices)>"Undo"</button>
                    </p>
                }
            })}
            <ul class="shelf-list" data-testid="shelf-list">
                <For each=move || keeper.entries.get() key=|e| (e.id.clone(), e.name.clone()) children=move |e| {
                    let (id1, id2, id3, id4) = (e.id.clone(), e.id.clone(), e.id.clone(), e.id.clone());
                    let current = keeper.current;
                    let is_current = move || current.get() == id4;
                    view! {
                        <li class:current=is_current data-testid="shelf-row">
                            <input type="text" aria-label="worksheet name" data-testid="shelf-name" prop:value=e.name.clone()
                                on:change=move |ev| keeper.rename(&id1, event_target_value(&ev), sheet, notices)/>
                            <button type="button" data-testid="shelf-open" on:click=move |_| keeper.open(&id2, sheet, notices)>"Open"</button>
                            <button type="button" class="quiet" data-testid="shelf-copy" on:click=move |_| keeper.duplicate(&id3, sheet, notices)>"Copy"</button>
                            <button type="button" class="quiet" data-testid="shelf-delete" on:click={ let id = e.id.clone(); move |_| keeper.delete(&id, sheet, notices) }>"Delete"</button>
                        </li>
                    }
                }/>
            </ul>
        </section>
    }
}
