//! The list of lines: each with its answer at a glance, selection, order,
//! copy and delete with undo; and the sum of drops along a chosen path.

use crate::hydraulics::digits::Fixed;
use leptos::prelude::*;

use crate::hydraulics::line::Circuit;

use super::state::{a_frame_behind, Sheet, Slot};
use crate::sheet::order::sorted_by;
use crate::sheet::presets::SERVICES;
use crate::sheet::units;

/// The worksheet's lines.
// Over 60 lines on purpose: the markup of one panel, kept whole so its layout reads in one place.
#[component]
pub fn Roster() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let add_service = RwSignal::new(SERVICES[0].id);
    let fold = Fold::new(sheet);
    provide_context(fold);
    let list = NodeRef::<leptos::html::Div>::new();
    // A long sheet's list is drawn as a window of rows (even with most of
    // it folded away, so folding never draws every row).
    let long = sheet.long;
    // The first row drawn (a long list draws only the rows near its scroll
    // position) and the measured distance from one row to the next.
    let first = RwSignal::new(0usize);
    let pitch = RwSignal::new(DEFAULT_PITCH_PX);
    // The height of the list's box: until it is measured, the stylesheet's
    // most (60 % of the window's height).
    let seen_px = RwSignal::new(window().inner_height().ok().and_then(|h| h.as_f64()).map_or(900.0, |h| 0.6 * h));
    // Where the box was last seen scrolled to (read when it scrolls, so
    // choosing a line never makes the browser lay the page out early).
    let seen_top = StoredValue::new(0.0f64);
    let window = Memo::new(move |_| {
        let shown = sheet.lines.with(|v| v.len()) - fold.hidden.with(Vec::len);
        let rows = Window::rows_for(seen_px.get(), pitch.get());
        Window::of(long.get(), shown, first.get(), rows, pitch.get())
    });
    // `try_`: also run from a timer, which may come after this list was
    // replaced by another worksheet's.
    let scrolled = move || {
        let Some(el) = list.try_get_untracked().flatten() else { return };
        let Some(old) = pitch.try_get_untracked() else { return };
        if let Some(p) = measured_pitch(&el) {
            if (p - old).abs() > 0.5 {
                pitch.try_set(p);
            }
        }
        let h = f64::from(el.client_height());
        if h > 0.0 && seen_px.try_get_untracked().is_some_and(|old| (h - old).abs() > 0.5) {
            seen_px.try_set(h);
        }
        let Some(p) = pitch.try_get_untracked() else { return };
        let top = f64::from(el.scroll_top());
        seen_top.try_set_value(top);
        let k = Window::first_for(top, p);
        if first.try_get_untracked().is_some_and(|f| f != k) {
            first.try_set(k);
        }
    };
    // A window made taller (a tablet turned) shows more of the box: the
    // rows drawn follow its height.
    let on_resize = window_event_listener_untyped("resize", move |_| {
        if long.try_get_untracked() == Some(true) {
            scrolled();
        }
    });
    on_cleanup(move || on_resize.remove());
    // The box and the list follow the window: one effect writing the DOM
    // (each reactive attribute would cost a kilobyte of module).
    Effect::new(move |_| {
        let w = window.get();
        let n = sheet.lines.with(Vec::len);
        if !w.windowed && first.get_untracked() != 0 {
            // A short list does not scroll in its box: a list that grows
            // long again starts from its top, where its box is.
            first.set(0);
        }
        let Some(el) = list.get() else { return };
        let _ = el.class_list().toggle_with_force("windowed", w.windowed);
        let label = w
            .windowed
            .then(|| format!("{} lines; rows {}–{} drawn, the rest as you scroll", w.shown, w.start + 1, w.end));
        for (name, value) in [
            ("tabindex", w.windowed.then(|| "0".to_owned())),
            ("role", w.windowed.then(|| "region".to_owned())),
            ("aria-label", label),
        ] {
            let _ = match value {
                Some(v) => el.set_attribute(name, &v),
                None => el.remove_attribute(name),
            };
        }
        let Some(ol) =
            el.first_element_child().and_then(|e| wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlElement>(e).ok())
        else {
            return;
        };
        let _ = ol.set_attribute("data-lines", &n.to_string());
        let style = ol.style();
        for (name, rows) in [("padding-top", w.start), ("padding-bottom", w.shown - w.end)] {
            let _ = match w.pad(rows) {
                Some(v) => style.set_property(name, &v),
                None => style.remove_property(name).map(drop),
            };
        }
        if w.windowed {
            // The box may have been scrolled without a scroll event (the
            // browser keeps a position across the list growing long
            // again): draw the rows where it is.
            super::state::after_redraw(scrolled);
        }
    });
    // A line selected from elsewhere (added, copied, opened) is scrolled to
    // when the box does not show it.
    Effect::new(move |_| {
        let Some(id) = sheet.selected.get() else { return };
        let w = window.get_untracked();
        if !w.windowed {
            return;
        }
        let Some(k) = shown_lines(sheet, fold).iter().position(|s| s.id == id) else { return };
        let Some(el) = list.get_untracked() else { return };
        // A row chosen where the box shows it (its top, and all but a tenth
        // of its pitch, the gap below it included) stays put: a tap on a
        // row never moves the list. Any other is scrolled to. The box's
        // place and height are those last seen: reading them here would
        // make the browser lay out the page in the middle of the change.
        let (top, seen) = (seen_top.get_value(), seen_px.get_untracked());
        let row_top = k as f64 * w.pitch;
        let in_view =
            (w.start..w.end).contains(&k) && row_top >= top - 1.0 && row_top + 0.9 * w.pitch <= top + seen + 1.0;
        if !in_view {
            let to = k.saturating_sub(1) as f64 * w.pitch;
            el.set_scroll_top(to as i32);
            seen_top.set_value(to);
            first.set(k.saturating_sub(1 + OVERSCAN));
            // Once drawn, the row itself is brought into view (above the
            // answer bar: the page's scroll padding).
            super::state::after_redraw(move || {
                if let Some(row) =
                    list.get_untracked().and_then(|el| el.query_selector(".roster-row.selected").ok().flatten())
                {
                    row.scroll_into_view_with_bool(false);
                }
            });
        }
    });
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
            // A long list scrolls in this box; the rows not drawn are
            // stood for by the list's padding (set by the effect above).
            <div class="roster-box" node_ref=list on:scroll=move |_| scrolled()>
            <ol class="roster-list" data-testid="roster">
                <For each=move || {
                    let w = window.get();
                    if w.windowed { shown_lines(sheet, fold)[w.start..w.end].to_vec() } else { sheet.lines.get() }
                } key=|s| s.id children=move |slot| view! { <RosterRow line=slot/> }/>
            </ol>
            </div>
            {move || long.get().then(|| view! {
                <datalist id="line-names">
                    {move || sheet.lines.with(|v| v.iter().map(|s| s.joint.with(|j| j.name.trim().to_owned())).filter(|n| !n.is_empty())
                        .map(|n| view! { <option value=n/> }).collect_view())}
                </datalist>
            })}
            <p class="path-total" data-testid="path-total" aria-live="polite">{path_total}</p>
            <super::system::SystemPanel/>
        </section>
    }
}

/// From this many rows the list scrolls in a box of its own and draws only
/// the rows near its scroll position, so a sheet of thousands of lines
/// opens and answers a click as fast as a short one.
pub const WINDOW_FROM: usize = 80;
/// Rows drawn at most at once in a long list (a box taller than a tall
/// screen's would show some of its room blank).
const WINDOW_ROWS: usize = 36;
/// Rows drawn above the first in view and below the last, so a short
/// scroll draws nothing.
const OVERSCAN: usize = 6;
/// A row's height and gap before one has been measured (the stylesheet's
/// 10.5rem + 0.4rem at 16 px; 8rem at 640-999 px wide, until measured).
const DEFAULT_PITCH_PX: f64 = 174.4;

/// Which rows of a long list are drawn.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Window {
    windowed: bool,
    /// Rows not folded away.
    shown: usize,
    start: usize,
    end: usize,
    pitch: f64,
}

impl Window {
    fn of(long: bool, shown: usize, first: usize, rows: usize, pitch: f64) -> Window {
        if !long {
            return Window { windowed: false, shown, start: 0, end: shown, pitch };
        }
        let start = first.min(shown.saturating_sub(rows));
        Window { windowed: true, shown, start, end: (start + rows).min(shown), pitch }
    }

    /// How many rows to draw for a box `seen` px tall: the rows it shows
    /// (one more for a row cut at each edge), the overscan above — up to
    /// `OVERSCAN` + a step more, as `first_for` steps — and the overscan
    /// below; never more than `WINDOW_ROWS`.
    fn rows_for(seen: f64, pitch: f64) -> usize {
        let in_view = (seen / pitch.max(1.0)).ceil().max(1.0) as usize + 1;
        (in_view + 2 * OVERSCAN + OVERSCAN / 2).min(WINDOW_ROWS)
    }

    /// The first row to draw for a box scrolled `top` px: a few rows above
    /// the first in view, on a step of half the overscan so scrolling
    /// redraws a few rows at a time rather than one.
    fn first_for(top: f64, pitch: f64) -> usize {
        let k = (top / pitch.max(1.0)).floor() as usize;
        let step = OVERSCAN / 2;
        (k.saturating_sub(OVERSCAN) / step) * step
    }

    /// The room that stands for `rows` rows not drawn.
    fn pad(&self, rows: usize) -> Option<String> {
        self.windowed.then(|| format!("{}px", Fixed(rows as f64 * self.pitch, 1)))
    }
}

/// The lines the list shows (those not folded away under a collapsed line), in order.
fn shown_lines(sheet: Sheet, fold: Fold) -> Vec<Slot> {
    fold.hidden.with(|h| {
        // Sorted through `sheet::order`, the page's one copy of a sort.
        let hidden = sorted_by(h.clone(), &|a, b| a.cmp(b));
        sheet.lines.with(|v| v.iter().filter(|s| hidden.binary_search(&s.id).is_err()).cloned().collect())
    })
}

/// The distance from one drawn row to the next, if two are drawn (`scroller`
/// holds the list): from the first drawn row to the last, in the layout's
/// fractions of a pixel. (Whole pixels, as `offsetTop` gives, made it
/// 174 or 175 px for rows 174.4 px apart, and the padding standing for a
/// thousand rows above jumped by a thousand pixels between the two.)
fn measured_pitch(scroller: &web_sys::HtmlElement) -> Option<f64> {
    let list = scroller.first_element_child()?;
    let n = list.child_element_count();
    let (a, b) = (list.first_element_child()?, list.last_element_child()?);
    let p = (b.get_bounding_client_rect().top() - a.get_bounding_client_rect().top()) / f64::from(n.checked_sub(1)?);
    (p > 0.0).then_some(p)
}

/// The tree in the list: which lines are folded away under a collapsed
/// line, which have branches, and which lie on the selected line's path to
/// its source.
#[derive(Clone, Copy)]
struct Fold {
    collapsed: RwSignal<Vec<u32>>,
    parents: Memo<Vec<u32>>,
    hidden: Memo<Vec<u32>>,
    on_path: Memo<Vec<u32>>,
}

impl Fold {
    fn new(sheet: Sheet) -> Fold {
        let collapsed = RwSignal::new(Vec::<u32>::new());
        let parents = Memo::new(move |_| {
            sheet.joined.with(|j| {
                let mut p = sorted_by(j.tree.parent.iter().flatten().map(|&p| j.ids[p]).collect(), &|a, b| a.cmp(b));
                p.dedup();
                p
            })
        });
        let hidden = Memo::new(move |_| {
            let c = collapsed.get();
            if c.is_empty() {
                return Vec::new();
            }
            sheet.joined.with(|j| {
                (0..j.ids.len())
                    .filter(|&i| {
                        let (mut at, mut steps) = (i, 0);
                        while let Some(p) = j.tree.parent[at] {
                            if c.contains(&j.ids[p]) {
                                return true;
                            }
                            at = p;
                            steps += 1;
                            if steps > j.ids.len() {
                                break;
                            }
                        }
                        false
                    })
                    .map(|i| j.ids[i])
                    .collect()
            })
        });
        let on_path = Memo::new(move |_| {
            let Some(sel) = sheet.selected.get() else { return Vec::new() };
            sheet.joined.with(|j| match j.ids.iter().position(|&x| x == sel) {
                Some(i) if j.tree.is_system() => j.tree.path(i).into_iter().map(|k| j.ids[k]).collect(),
                _ => Vec::new(),
            })
        });
        Fold { collapsed, parents, hidden, on_path }
    }
}

#[component]
fn RosterRow(line: Slot) -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let fold = expect_context::<Fold>();
    let id = line.id;
    let file = line.file;
    let is_parent = move || fold.parents.with(|p| p.binary_search(&id).is_ok());
    let is_collapsed = move || fold.collapsed.with(|c| c.contains(&id));
    let report = line.report;
    let place = line.place;
    let carried = move || {
        let u = sheet.resolved.get();
        let method = u.basis.demand;
        report.with(|r| {
            let o = r.outcome.as_ref().ok()?;
            let q = units::show_flow(
                o.line.flow.value,
                u.flow,
                Some(o.sizing.properties.density_kg_m3()),
                Some(&o.line.fluid),
                3,
            );
            place.with(|p| {
                let c = p.carried?;
                Some(if file.with(|f| f.fixtures.is_some() && f.load.is_none()) {
                    format!("{} {} → {q}", units::format_number(c.fixture_units, 4), method.unit())
                } else {
                    format!("{} → {q}", units::show(c.load_w, u.power, None, 3))
                })
            })
        })
    };
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
                    (crate::sheet::report::designation(&o.line, c.nominal), detail, state)
                }
            },
        })
    };
    // What the row shows of its line's result (size, figures, state, the
    // load it carries) follows a frame behind, as the system box does: a
    // keystroke's own frame lays out and paints the answer, not the list
    // (measured on a 200-line sheet with the CPU slowed 4×: the row's
    // texts were about a fifth of an edit's time to the painted frame).
    let shown = RwSignal::new(untrack(move || (answer(), carried())));
    a_frame_behind(
        move || {
            report.track();
            place.track();
            sheet.resolved.track();
            file.track();
        },
        move || {
            let now = untrack(move || (answer(), carried()));
            if shown.try_with_untracked(|s| *s != now) == Some(true) {
                shown.try_set(now);
            }
        },
    );
    let depth = move || line.place.with(|p| p.depth.min(6));
    view! {
        // Indented by a stylesheet rule per depth: the CSP allows no inline style.
        <li class="roster-row" class:selected=selected data-testid="roster-row" data-depth=move || depth().to_string()
            class:on-path=move || fold.on_path.with(|p| p.len() > 1 && p.contains(&id)) hidden=move || fold.hidden.with(|h| h.contains(&id))>
            <button type="button" class="pick" aria-current=move || if selected() { "true" } else { "false" }
                on:click=move |_| sheet.selected.set(Some(id))>
                <span class="row-name" data-testid="row-name">{name}</span>
                <span class=move || shown.with(|s| format!("row-size state-{}", s.0 .2)) data-testid="row-size">{move || shown.with(|s| s.0 .0.clone())}</span>
                <span class="row-detail">{move || shown.with(|s| s.0 .1.clone())}</span>
                <span class="row-carried" data-testid="row-carried">{move || shown.with(|s| s.1.clone())}</span>
            </button>
            <div class="row-tools">
                {move || is_parent().then(|| view! {
                    <button type="button" class="quiet fold" data-testid="row-fold" aria-expanded=move || (!is_collapsed()).to_string()
                        aria-label=move || if is_collapsed() { "show the lines fed from this one" } else { "hide the lines fed from this one" }
                        on:click=move |_| fold.collapsed.update(|c| if let Some(k) = c.iter().position(|x| *x == id) { c.remove(k); } else { c.push(id); })>
                        {move || if is_collapsed() { "▸" } else { "▾" }}
                    </button>
                })}
                <label class="check" title="include in the path total">
                    <input type="checkbox" data-testid="row-path" prop:checked=move || line.in_path.get()
                        on:change=move |ev| line.in_path.set(event_target_checked(&ev))/>
                    <span class="sr">"include in path"</span>"Σ"
                </label>
                <button type="button" class="quiet" aria-label="move up" on:click=move |_| sheet.shift(id, -1)>"▲"</button>
                <button type="button" class="quiet" aria-label="move down" on:click=move |_| sheet.shift(id, 1)>"▼"</button>
                <button type="button" class="quiet" aria-label="Copy line" data-testid="row-duplicate" on:click=move |_| sheet.duplicate(id)>"Copy"</button>
                <button type="button" class="quiet" aria-label="delete" data-testid="row-delete" on:click=move |_| sheet.delete(id)>"✕"</button>
            </div>
        </li>
    }
}
