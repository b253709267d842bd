//! The worksheets kept on this device: open, rename, copy, delete (to a
//! trash), start a new one; the trash; entries kept aside as unreadable.

use crate::hydraulics::digits::Short;
use leptos::prelude::*;

use super::keep::{blank, download, Keeper, TRASH_DAYS};
use crate::sheet::library::ASIDE_PREFIX;

/// The list of stored worksheets.
// Over 60 lines on purpose: the markup of one panel, kept whole so its layout reads in one place.
#[component]
pub fn ShelfPanel() -> impl IntoView {
    let keeper = expect_context::<Keeper>();
    let last_deleted = keeper.last_deleted;
    view! {
        <section class="panel shelf" aria-label="Worksheets on this device" data-testid="shelf-panel">
            <h2>"Worksheets on this device"</h2>
            <p class="hint">"Every change is saved here as you type."</p>
            <button type="button" data-testid="new-sheet" on:click=move |_| { let _ = keeper.create(blank()); }>"+ New worksheet"</button>
            {move || last_deleted.get().map(|e| {
                let id = e.id.clone();
                view! {
                    <p class="toast" role="status">{format!("Moved “{}” to the trash. ", e.name)}
                        <button type="button" class="quiet" data-testid="undo-sheet-delete" on:click=move |_| keeper.restore(&id)>"Restore"</button>
                    </p>
                }
            })}
            <ul class="shelf-list" data-testid="shelf-list">
                <For each=move || keeper.entries.get() key=|e| (e.id.clone(), e.name.clone()) children=move |e| {
                    let id = StoredValue::new(e.id.clone());
                    let current = keeper.current;
                    let is_current = move || current.with(|c| *c == id.get_value());
                    view! {
                        <li class:current=is_current data-testid="shelf-row">
                            <input type="text" aria-label="worksheet name" data-testid="shelf-name" prop:value=e.name.clone()
                                on:change=move |ev| keeper.rename(&id.get_value(), event_target_value(&ev))/>
                            <button type="button" data-testid="shelf-open" on:click=move |_| keeper.open(&id.get_value())>"Open"</button>
                            <button type="button" class="quiet" data-testid="shelf-copy" on:click=move |_| keeper.duplicate(&id.get_value())>"Copy"</button>
                            <button type="button" class="quiet" data-testid="shelf-delete" on:click=move |_| keeper.delete(&id.get_value())>"Delete"</button>
                        </li>
                    }
                }/>
            </ul>
            {move || (!keeper.trash.with(Vec::is_empty)).then(|| view! {
                <h3>"Trash"</h3>
                <p class="hint">{format!("Deleted worksheets are kept here for {} days, then emptied.", Short(TRASH_DAYS))}</p>
                <ul class="shelf-list" data-testid="trash-list">
                    {keeper.trash.get().into_iter().map(|t| {
                        let (a, b) = (t.entry.id.clone(), t.entry.id.clone());
                        view! {
                            <li data-testid="trash-row">
                                <span>{t.entry.name.clone()}</span>
                                <span class="hint">{format!(" deleted {}", t.deleted.get(..10).unwrap_or_default())}</span>
                                <button type="button" data-testid="trash-restore" on:click=move |_| keeper.restore(&a)>"Restore"</button>
                                <button type="button" class="quiet" data-testid="trash-purge" on:click=move |_| keeper.purge(&b)>"Delete for good"</button>
                            </li>
                        }
                    }).collect_view()}
                </ul>
            })}
            {move || (!keeper.aside.with(Vec::is_empty)).then(|| view! {
                <h3>"Kept aside (could not be read)"</h3>
                <p class="hint">"These stored entries were damaged. They are kept exactly as found: download the text to recover what you can."</p>
                <ul class="shelf-list" data-testid="aside-list">
                    {keeper.aside.get().into_iter().map(|(key, text)| {
                        let label = key.strip_prefix(ASIDE_PREFIX).unwrap_or(&key).to_owned();
                        let name = format!("headroom-kept-aside-{}.txt", label.replace(|c: char| !c.is_ascii_alphanumeric(), "-"));
                        let k = key.clone();
                        view! {
                            <li data-testid="aside-row">
                                <span>{format!("{label} ({} characters)", text.chars().count())}</span>
                                <button type="button" data-testid="aside-download" on:click=move |_| download(&name, "text/plain", &text)>"Download the text"</button>
                                <button type="button" class="quiet" data-testid="aside-discard" on:click=move |_| keeper.discard_aside(&k)>"Discard"</button>
                            </li>
                        }
                    }).collect_view()}
                </ul>
            })}
        </section>
    }
}
