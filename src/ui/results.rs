//! What the selected line's numbers say: the proposal, every size around
//! it, the Moody chart and the worked steps.

use crate::hydraulics::digits::Short;
use leptos::prelude::*;

use super::state::Slot;
use crate::sheet::chart;
use crate::sheet::panes::{self, sentence};
use crate::sheet::report::{designation, Detail, LineReport, Outcome};

/// The answer for the selected line. Its views only show results, so
/// each is markup text set in one step ([`crate::sheet::panes`]); the
/// elements around them are drawn once.
// Over 60 lines on purpose: the markup of one panel, kept whole so its layout reads in one place.
#[component]
pub fn LineResults(
    /// The line.
    line: Slot,
) -> impl IntoView {
    let file = line.file;
    let shown = line.detail;
    // Whether the panel is on the screen or near it. Off it, the panel is
    // left as it was: a keystroke in the fields above does not work out,
    // lay out and paint a panel nobody sees (the answer bar shows the
    // answer meanwhile). An answer that changes while it is off the screen
    // marks the panel stale, hidden until it is written again on the way
    // back, so it never shows an old answer.
    let near = RwSignal::new(true);
    let section = NodeRef::<leptos::html::Section>::new();
    Effect::new(move |_| {
        if let Some(el) = section.get() {
            super::state::watch_near(&el, NEAR_MARGIN, near);
        }
    });
    let stale = RwSignal::new(false);
    Effect::new(move |was_near: Option<bool>| {
        line.report.track();
        let now = near.get();
        // Away, and not just gone: the answer has changed since.
        let old = !now && was_near == Some(false);
        if stale.get_untracked() != old {
            stale.set(old);
        }
        now
    });
    // Whether the worked steps are open: their rows are written only then.
    let steps_open = RwSignal::new(false);
    // The answer bar follows every edit in the frame that paints it; the
    // panel follows a frame behind it (after that frame has painted), as
    // the list's rows do: on a tablet the panel's card, table and chart
    // are laid out and painted in a frame of their own. Where the bar is
    // not shown (wide screens) the card still follows every edit.
    let sheet = expect_context::<super::state::Sheet>();
    let caught_up = RwSignal::new(0u32);
    super::state::a_frame_behind(
        move || {
            // Away, nothing is scheduled (coming back writes the panel).
            if near.get() {
                line.report.track();
                sheet.resolved.track();
            }
        },
        move || {
            caught_up.try_update(|n| *n = n.wrapping_add(1));
        },
    );
    // Whether there is no result: the table, steps and chart are hidden.
    // One memo, so their classes change only when this does.
    let none = while_near(near, behind(caught_up, shown, Option::is_none));
    let answer = while_near(near, move || {
        let card = |r: &LineReport| panes::answer(r.outcome.as_ref().ok());
        if bar_shown() {
            caught_up.track();
            line.report.with_untracked(card)
        } else {
            line.report.with(card)
        }
    });
    let rows = while_near(
        near,
        behind(caught_up, shown, |s| s.as_ref().map(|(o, d)| panes::size_rows(o, d)).unwrap_or_default()),
    );
    let points = while_near(
        near,
        behind(caught_up, shown, |s| s.as_ref().map(|(o, _)| panes::moody_points(o)).unwrap_or_default()),
    );
    let step_rows =
        behind(caught_up, shown, |s| s.as_ref().map(|(_, d)| panes::step_rows(&d.trace)).unwrap_or_default());
    let steps = while_near(near, move || match steps_open.get() {
        true => step_rows(),
        false => String::new(),
    });
    // One handler for the table's Check buttons: the row's size is in
    // `data-pin`. The rows are written afresh after a pin (a frame later),
    // so the button pressed takes the focus back once they are.
    let rows_body = NodeRef::<leptos::html::Tbody>::new();
    let refocus = StoredValue::new(None::<String>);
    Effect::new(move |_| {
        let html = rows.get();
        let Some(body) = rows_body.get() else { return };
        body.set_inner_html(&html);
        let Some(size) = refocus.try_update_value(Option::take).flatten() else { return };
        // Only if the focus went down with the old button (not elsewhere since).
        let body_has_focus = document().active_element().is_none_or(|a| a.tag_name() == "BODY");
        if !body_has_focus {
            return;
        }
        let buttons = body.query_selector_all("button[data-pin]").ok();
        let again = buttons.into_iter().flat_map(|l| (0..l.length()).filter_map(move |i| l.item(i)));
        let mut again = again.filter_map(|n| wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlElement>(n).ok());
        if let Some(b) = again.find(|b| b.get_attribute("data-pin").as_deref() == Some(size.as_str())) {
            let _ = b.focus();
        }
    });
    let pin = move |ev: leptos::ev::MouseEvent| {
        use wasm_bindgen::JsCast;
        let pressed = ev.target().and_then(|t| t.dyn_into::<web_sys::Element>().ok());
        let Some(size) = pressed
            .and_then(|e| e.closest("button[data-pin]").ok().flatten())
            .and_then(|b| b.get_attribute("data-pin"))
        else {
            return;
        };
        refocus.set_value(Some(size.clone()));
        file.update(|f| f.toggle_check(&size));
    };
    let details = NodeRef::<leptos::html::Details>::new();
    view! {
        <section class="results" class:stale=stale id="answer-panel" aria-label="Answer" data-testid="results" node_ref=section>
            <div class=move || answer.with(|a| a.0) data-testid="answer" role="status" inner_html=move || answer.with(|a| a.1.clone())></div>
            <div class="table-wrap" class:hidden=none>
                <table class="sizes" data-testid="size-table">
                    <caption>"Sizes around the answer (Check pins a size; capacity is the largest flow within the limits)"</caption>
                    <thead><tr>
                        <th scope="col">"Size"</th><th scope="col">"ID"</th><th scope="col">"V"</th><th scope="col">"Re"</th>
                        <th scope="col">"f"</th><th scope="col">"Regime"</th><th scope="col">"Δp/L"</th><th scope="col">"Δp total"</th>
                        <th scope="col">"Capacity"</th><th scope="col">"Verdict"</th><th scope="col">"Binding limit"</th><th scope="col"><span class="sr">"Check mode"</span></th>
                    </tr></thead>
                    <tbody node_ref=rows_body on:click=pin></tbody>
                </table>
            </div>
            <details class="explain" class:hidden=none data-testid="explain" node_ref=details prop:open=move || steps_open.get()
                on:toggle=move |_| { if let Some(d) = details.get_untracked() { if d.open() != steps_open.get_untracked() { steps_open.set(d.open()) } } }>
                <summary>"How this was worked out"</summary>
                <p>"The friction factor depends only on the Reynolds number and the relative roughness, f = φ(Re, ε/D); every other number here follows from the fluid, the pipe and the line."</p>
                <table>
                    <thead><tr><th scope="col">"Quantity"</th><th scope="col">"Formula"</th><th scope="col">"Value (SI)"</th><th scope="col">"Source"</th></tr></thead>
                    <tbody inner_html=move || steps.get()></tbody>
                </table>
            </details>
            <figure class="moody" class:hidden=none>
                <svg viewBox=format!("0 0 {} {}", Short(chart::WIDTH), Short(chart::HEIGHT)) role="img" aria-labelledby="moody-title" data-testid="moody">
                    <title id="moody-title">"Moody chart: friction factor against Reynolds number, with each size's operating point"</title>
                    <g inner_html=panes::moody_background()></g>
                    <g class="points" inner_html=move || points.get()></g>
                </svg>
                <figcaption>"Laminar f = 64/Re; curves are Colebrook (1939) for the ε/D shown; the shaded band is the transition zone. Large dot: the proposed size; hollow: sizes that fail."</figcaption>
            </figure>
        </section>
    }
}

/// How near the screen the answer panel is written: 150 px, so a panel
/// scrolled into view at an ordinary pace is written before it shows (a
/// jump to it may show it hidden for one frame, never with an old answer).
const NEAR_MARGIN: &str = "150px 0px";

/// Whether the answer bar is on the screen: below the style sheet's
/// 1500 px breakpoint (`.answer-bar`), read from the window's width, which
/// needs no layout.
fn bar_shown() -> bool {
    web_sys::window().and_then(|w| w.inner_width().ok()).and_then(|w| w.as_f64()).is_none_or(|w| w < 1500.0)
}

/// `f` of the line's result and detail as of the last frame behind the
/// answer: it reruns when `caught_up` moves, not when the result changes.
fn behind<T: 'static>(
    caught_up: RwSignal<u32>,
    shown: Memo<Option<(Outcome, Detail)>>,
    f: fn(&Option<(Outcome, Detail)>) -> T,
) -> impl Fn() -> T + Copy + Send + Sync + 'static {
    move || {
        caught_up.track();
        shown.with_untracked(f)
    }
}

/// A memo of `f` that follows it while `near` is true and keeps its last
/// value otherwise (reading nothing but `near`, so nothing reruns it).
fn while_near<T: Clone + PartialEq + Send + Sync + 'static>(
    near: RwSignal<bool>,
    f: impl Fn() -> T + Send + Sync + 'static,
) -> Memo<T> {
    Memo::new(move |last: Option<&T>| match (near.get(), last) {
        (false, Some(last)) => last.clone(),
        _ => f(),
    })
}

/// The answer in one line that stays on screen while the inputs above the
/// results are edited (a tablet shows the editor and the results one
/// above the other): size, velocity, drops and what set the size, with a
/// jump to the full answer.
#[component]
pub fn AnswerBar(
    /// The line.
    line: Slot,
) -> impl IntoView {
    let summary = Memo::new(move |_| {
        line.report.with(|r| match &r.outcome {
            Err(_) => ("—".to_owned(), "fix the fields marked in red".to_owned(), "wait"),
            Ok(o) => match (o.shown, o.figures.as_ref()) {
                (Some(i), Some(f)) => {
                    let c = &o.sizing.candidates[i];
                    let mut parts = vec![f.velocity.clone(), f.drop_per_length.clone()];
                    if !f.total_drop.is_empty() {
                        parts.push(format!("total {}", f.total_drop));
                    }
                    let why = match crate::sheet::report::governed_by(&o.sizing) {
                        "" => f.binding,
                        g => g,
                    };
                    if !why.is_empty() {
                        parts.push(format!("set by {why}"));
                    }
                    (designation(&o.line, c.nominal), parts.join(" · "), if c.passes() { "ok" } else { "bad" })
                }
                _ => ("No size".to_owned(), sentence(&o.verdict), "bad"),
            },
        })
    });
    view! {
        <aside class=move || format!("answer-bar state-{}", summary.with(|s| s.2)) aria-label="Answer for this line" aria-live="polite" data-testid="answer-bar">
            <strong data-testid="bar-size">{move || summary.with(|s| s.0.clone())}</strong>
            <span class="bar-figures" data-testid="bar-figures">{move || summary.with(|s| s.1.clone())}</span>
            <a class="bar-jump" href="#answer-panel" data-testid="bar-jump">"Full answer ↓"</a>
        </aside>
    }
}
