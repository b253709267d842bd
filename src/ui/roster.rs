//! The list of lines: each with its answer at a glance, selection, order,
//! copy and delete with undo; and the sum of drops along a chosen path.

use leptos::prelude::*;

use crate::hydraulics::line::Circuit;

use super::state::{Sheet, Slot};
use crate::sheet::presets::SERVICES;
use crate::sheet::units;

/// The worksheet's lines.
// Over 60 lines on purpose: the markup of one panel, kept whole so its layout reads in one place.
#[component]
pub fn Roster() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let add_service = RwSignal::new(SERVICES[0].id);
    let path_total = move || {
        let u = sheet.resolved.get();
        let (mut sum, mut rise, mut n, mut bad) = (0.0, 0.0, 0, 0);
        sheet.lines.with(|v| {
            for s in v.iter().filter(|s| s.in_path.get()) {
                n += 1;
                s.report.with(|r| {
                    match r.outcome.as_ref().ok().and_then(|o| o.shown.map(|i| o.sizing.candidates[i].point)) {
                        Some(p) => {
                            sum += p.total_drop.value;
                            rise += p.static_drop.value;
                        }
                        None => bad += 1,
                    }
                });
            }
        });
        if n == 0 {
            "Tick lines to add up their drops along a path (for a pump-head estimate).".to_owned()
        } else {
            let water = units::find(units::Dimension::Pressure, "m H₂O").expect("m H₂O");
            let plural = if n == 1 { "" } else { "s" };
            let show = |v: f64| units::show(v, u.pressure, None, 3);
            let mut t = match u.basis.circuit {
                Circuit::Closed => format!(
                    "Path of {n} line{plural}: {} friction and fittings ({}); static {} shown apart — a closed loop returns it, so it is not pump head",
                    show(sum),
                    units::show(sum, water, None, 3),
                    show(rise)
                ),
                Circuit::Open => format!(
                    "Path of {n} line{plural}: {} total drop ({}), of which static {}",
                    show(sum),
                    units::show(sum, water, None, 3),
                    show(rise)
                ),
            };
            if bad > 0 {
                t.push_str(&format!("; {bad} ticked line(s) have no result and are left out"));
            }
            t
        }
    };
    view! {
        <section class="roster" aria-labelledby="roster-title">
            <div class="roster-head">
                <h2 id="roster-title">"Lines"</h2>
                <div class="add">
                    <label for="add-service" class="sr">"Service for the new line"</label>
                    <select id="add-service" data-testid="add-service" on:change=move |ev| {
                        let v = event_target_value(&ev);
                        if let Some(s) = SERVICES.iter().find(|s| s.id == v) { add_service.set(s.id) }
                    }>
                        {SERVICES.iter().map(|s| view! { <option value=s.id>{s.label}</option> }).collect_view()}
                    </select>
                    <button type="button" data-testid="add-line" on:click=move |_| {
                        let id = add_service.get_untracked();
                        if let Some(s) = SERVICES.iter().find(|s| s.id == id) { sheet.add(s); }
                    }>"+ New line"</button>
                </div>
            </div>
            {move || sheet.deleted.get().map(|(_, s)| {
                let name = s.file.with_untracked(|f| f.name.clone());
                view! {
                    <p class="toast" role="status" data-testid="undo-bar">
                        {format!("Deleted “{name}”. ")}
                        <button type="button" class="quiet" data-testid="undo-delete" on:click=move |_| sheet.undo_delete()>"Undo"</button>
                    </p>
                }
            })}
            <ol class="roster-list" data-testid="roster">
                <For each=move || sheet.lines.get() key=|s| s.id children=move |slot| view! { <RosterRow line=slot/> }/>
            </ol>
            <p class="path-total" data-testid="path-total" aria-live="polite">{path_total}</p>
            <SystemPanel/>
        </section>
    }
}

#[component]
fn RosterRow(line: Slot) -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let id = line.id;
    let file = line.file;
    let report = line.report;
    let selected = move || sheet.selected.get() == Some(id);
    let name =
        move || file.with(|f| if f.name.trim().is_empty() { "(unnamed line)".to_owned() } else { f.name.clone() });
    let answer = move || {
        report.with(|r| match &r.outcome {
            Err(e) => ("check inputs".to_owned(), format!("{} field(s) to fix", e.len()), "bad"),
            Ok(o) => match o.shown {
                None => ("no size".to_owned(), "limits cannot all be met".to_owned(), "bad"),
                Some(i) => {
                    let c = &o.sizing.candidates[i];
                    let detail = o
                        .figures
                        .as_ref()
                        .map(|f| format!("{} · {}", f.velocity, f.drop_per_length))
                        .unwrap_or_default();
                    let state = if !c.passes() {
                        "bad"
                    } else if o.checked {
                        "pinned"
                    } else {
                        "ok"
                    };
                    (c.nominal.to_owned(), detail, state)
                }
            },
        })
    };
    let depth = move || line.place.with(|p| p.depth.min(6));
    view! {
        // Indented by a stylesheet rule per depth: the CSP allows no inline style.
        <li class="roster-row" class:selected=selected data-testid="roster-row" data-depth=move || depth().to_string()>
            <button type="button" class="pick" aria-current=move || if selected() { "true" } else { "false" }
                on:click=move |_| sheet.selected.set(Some(id))>
                <span class="row-name" data-testid="row-name">{name}</span>
                <span class=move || format!("row-size state-{}", answer().2) data-testid="row-size">{move || answer().0}</span>
                <span class="row-detail">{move || answer().1}</span>
            </button>
            <div class="row-tools">
                <label class="check" title="include in the path total">
                    <input type="checkbox" data-testid="row-path" prop:checked=move || line.in_path.get()
                        on:change=move |ev| line.in_path.set(event_target_checked(&ev))/>
                    <span class="sr">"include in path"</span>"Σ"
                </label>
                <button type="button" class="quiet" aria-label="move up" on:click=move |_| sheet.shift(id, -1)>"▲"</button>
                <button type="button" class="quiet" aria-label="move down" on:click=move |_| sheet.shift(id, 1)>"▼"</button>
                <button type="button" class="quiet" aria-label="duplicate" data-testid="row-duplicate" on:click=move |_| sheet.duplicate(id)>"Copy"</button>
                <button type="button" class="quiet" aria-label="delete" data-testid="row-delete" on:click=move |_| sheet.delete(id)>"✕"</button>
            </div>
        </li>
    }
}

/// The system, when lines name what they are fed from: the pump duty from
/// the index circuit and every path's drop, worst first.
#[component]
fn SystemPanel() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let text = move || {
        if !sheet.joined.with(|j| j.tree.is_system()) {
            return Vec::new();
        }
        let reports: Vec<_> = sheet.lines.with(|v| v.iter().map(|s| s.report.get()).collect());
        sheet.resolved.track();
        crate::sheet::report::system_lines(&sheet.to_file(), &reports)
    };
    view! {
        {move || {
            let lines = text();
            (!lines.is_empty()).then(|| view! {
                <div class="system-panel" data-testid="system" aria-live="polite">
                    <h3>"System"</h3>
                    {lines.into_iter().map(|l| view! { <p>{l}</p> }).collect_view()}
                </div>
            })
        }}
    }
}
