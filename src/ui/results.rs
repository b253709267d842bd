//! What the selected line's numbers say: the proposal, every size around
//! it, the Moody chart and the worked steps.

use leptos::prelude::*;

use super::state::Slot;
use crate::hydraulics::sizing::Candidate;
use crate::hydraulics::sizing::Step;
use crate::sheet::chart;
use crate::sheet::report::{designation, Detail, Outcome};
use crate::sheet::units::format_number;

/// The answer for the selected line.
#[component]
pub fn LineResults(
    /// The line.
    line: Slot,
) -> impl IntoView {
    let file = line.file;
    let shown = line.detail;
    // Whether the worked steps are open: their table is drawn only then.
    let steps_open = RwSignal::new(false);
    // Whether there is no result: the table, steps and chart are hidden.
    // One memo, so their classes change only when this does.
    let none = Memo::new(move |_| shown.with(Option::is_none));
    view! {
        <section class="results" id="answer-panel" aria-label="Answer" data-testid="results">
            {move || { match shown.with(|s| s.as_ref().map(|(o, _)| o.clone())) {
                None => view! {
                    <div class="answer answer-wait" data-testid="answer">
                        <p class="answer-size" data-testid="proposed-size">"—"</p>
                        <p>"Fix the fields marked in red to see sizes."</p>
                    </div>
                }.into_any(),
                Some(o) => view! { <Answer o=o/> }.into_any(),
            }}}
            <SizeTable shown=shown none=none file=file/>
            <Explain shown=shown none=none open=steps_open/>
            <Moody shown=shown none=none/>
        </section>
    }
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
        <aside class=move || format!("answer-bar state-{}", summary.with(|s| s.2)) aria-label="Answer for this line" data-testid="answer-bar">
            <strong data-testid="bar-size">{move || summary.with(|s| s.0.clone())}</strong>
            <span class="bar-figures" data-testid="bar-figures">{move || summary.with(|s| s.1.clone())}</span>
            <a class="bar-jump" href="#answer-panel" data-testid="bar-jump">"Full answer ↓"</a>
        </aside>
    }
}

/// The text with its first letter capitalised, to stand as a sentence.
fn sentence(t: &str) -> String {
    let mut c = t.chars();
    c.next().map(|f| f.to_uppercase().chain(c).collect()).unwrap_or_default()
}

#[component]
fn Answer(o: Outcome) -> impl IntoView {
    let shown = o.shown.map(|i| o.sizing.candidates[i].clone());
    let warnings = o.sizing.warnings.clone();
    let verdict = sentence(&o.verdict);
    match shown {
        None => view! {
            <div class="answer answer-none" data-testid="answer" role="status">
                <p class="answer-size" data-testid="proposed-size">"No size"</p>
                <p data-testid="answer-why">{verdict}</p>
                {warnings.into_iter().map(|w| view! { <p class="warn">{w}</p> }).collect_view()}
            </div>
        }
        .into_any(),
        Some(c) => {
            let pass = c.passes();
            let fig = o.figures.clone().expect("a shown size has its figures");
            let head = if o.checked {
                if pass {
                    "Checked size — meets every limit"
                } else {
                    "Checked size — FAILS a limit"
                }
            } else {
                "Smallest size that meets every limit"
            };
            let rows = fig
                .checks
                .iter()
                .map(|k| {
                    let cls = if k.met { "ok" } else { "bad" };
                    let id = format!("headroom-{}", k.id);
                    view! { <li class=cls data-testid=id><span>{k.text.clone()}</span><strong>{k.headroom.clone()}</strong></li> }
                })
                .collect_view();
            view! {
                <div class="answer" class:answer-bad=!pass data-testid="answer" role="status">
                    <p class="answer-head">{head}</p>
                    <p class="answer-size" data-testid="proposed-size">{designation(&o.line, c.nominal)}</p>
                    <p class="answer-designation" data-testid="answer-designation">{match o.line.pipe {
                        crate::hydraulics::line::Pipe::Series(s) => s.label.to_owned(),
                        crate::hydraulics::line::Pipe::Custom(_) => "the bore entered".to_owned(),
                    }}</p>
                    <dl class="answer-figures">
                        <div><dt>"Velocity"</dt><dd data-testid="answer-velocity">{fig.velocity.clone()}</dd></div>
                        <div><dt>"Drop per length"</dt><dd data-testid="answer-drop-per-length">{fig.drop_per_length.clone()}</dd></div>
                        {(!fig.total_drop.is_empty()).then(|| view! { <div><dt>"Total drop"</dt><dd data-testid="answer-total-drop">{fig.total_drop.clone()}</dd></div> })}
                        <div><dt>"Inside diameter"</dt><dd>{fig.bore.clone()}</dd></div>
                    </dl>
                    {fig.total_drop.is_empty().then(|| view! { <p class="hint" data-testid="answer-no-length">"No length entered: a quick check by velocity and drop per length. Enter the length for the total drop."</p> })}
                    <p class="breakdown" data-testid="answer-breakdown" class:hidden=fig.total_drop.is_empty()>
                        {format!("Friction {} + fittings {}", fig.friction_drop, fig.fittings_drop)}
                        {(!fig.components_drop.is_empty()).then(|| format!(" + valves and equipment {}", fig.components_drop))}
                        {if fig.static_in_total { format!(" + static {}", fig.static_drop) } else { format!("; static {} shown apart (closed loop)", fig.static_drop) }}
                    </p>
                    {(!fig.ends.is_empty()).then(|| view! { <p class="ends" class:warn=fig.choked data-testid="answer-ends">{fig.ends.clone()}</p> })}
                    {(!o.checked).then(|| view! { <p class="verdict-line" data-testid="answer-verdict">{verdict}</p> })}
                    <p class="headroom-title">"Headroom to each limit"</p>
                    <ul class="headroom">{rows}</ul>
                    {c.uncertain().then(|| view! { <p class="warn" data-testid="warn-transition">"Re is in the transition zone (2000–4000): the friction factor is uncertain; the safe-side turbulent value is used."</p> })}
                    {warnings.into_iter().map(|w| view! { <p class="warn">{w}</p> }).collect_view()}
                </div>
            }.into_any()
        }
    }
}

/// The sizes around the answer. The table, its caption and headings are
/// drawn once; only the rows follow the result (a rebuilt element has
/// every attribute taken off and put back).
#[component]
fn SizeTable(
    shown: Memo<Option<(Outcome, Detail)>>,
    none: Memo<bool>,
    file: RwSignal<crate::sheet::file::LineFile>,
) -> impl IntoView {
    let rows = move || shown.with(|s| s.as_ref().map(|(o, d)| size_rows(o, d, file)));
    view! {
        <div class="table-wrap" class:hidden=none>
            <table class="sizes" data-testid="size-table">
                <caption>"Sizes around the answer (Check pins a size; capacity is the largest flow within the limits)"</caption>
                <thead><tr>
                    <th scope="col">"Size"</th><th scope="col">"ID"</th><th scope="col">"V"</th><th scope="col">"Re"</th>
                    <th scope="col">"f"</th><th scope="col">"Regime"</th><th scope="col">"Δp/L"</th><th scope="col">"Δp total"</th>
                    <th scope="col">"Capacity"</th><th scope="col">"Verdict"</th><th scope="col">"Binding limit"</th><th scope="col"><span class="sr">"Check mode"</span></th>
                </tr></thead>
                <tbody>{rows}</tbody>
            </table>
        </div>
    }
}

fn size_rows(o: &Outcome, d: &Detail, file: RwSignal<crate::sheet::file::LineFile>) -> impl IntoView {
    let pinned = o.checked;
    d.nearby
        .iter()
        .map(|near| {
            let i = near.index;
            let c: &Candidate = &o.sizing.candidates[i];
            let f = near.figures.clone();
            let verdict = match (c.passes(), c.skipped) {
                _ if f.choked => "chokes",
                (_, Some(k)) => k.reason(),
                (true, None) => "meets",
                (false, None) => "fails",
            };
            let nominal = c.nominal;
            let is_shown = o.shown == Some(i);
            view! {
                <tr class:shown=is_shown class:fails=!c.passes() data-testid="size-row">
                    <th scope="row">{designation(&o.line, nominal)}</th>
                    <td>{f.bore}</td>
                    <td>{f.velocity}</td>
                    <td>{f.reynolds}</td>
                    <td>{f.friction}</td>
                    <td>{f.regime}</td>
                    <td>{f.drop_per_length}</td>
                    <td>{f.total_drop}</td>
                    <td>{near.capacity_text.clone()}</td>
                    <td class="verdict">{verdict}</td>
                    <td>{f.binding}</td>
                    <td>
                        <button type="button" class="quiet" data-testid=format!("pin-{nominal}")
                            aria-pressed=if is_shown && pinned { "true" } else { "false" }
                            on:click=move |_| file.update(|f| f.toggle_check(nominal))>
                            {if is_shown && pinned { "Unpin" } else { "Check" }}
                        </button>
                    </td>
                </tr>
            }
        })
        .collect_view()
}

/// The Moody chart with every candidate's operating point. The grid and
/// curves do not depend on the line, so they are drawn once; only the
/// points follow the line's result.
#[component]
pub fn Moody(
    /// The line's result, if it has one.
    shown: Memo<Option<(Outcome, Detail)>>,
    /// Whether there is no result (the chart is hidden).
    none: Memo<bool>,
) -> impl IntoView {
    let c = chart::background();
    let (px, py, pw, ph) = chart::plot_area();
    let view_box = format!("0 0 {} {}", chart::WIDTH, chart::HEIGHT);
    let points = move || {
        shown.with(|o| {
            o.as_ref()
                .map(|(o, _)| {
                    chart::points(&o.sizing).into_iter().map(|p| (designation(&o.line, p.nominal), p)).collect()
                })
                .unwrap_or_else(Vec::new)
        })
    };
    view! {
        <figure class="moody" class:hidden=none>
            <svg viewBox=view_box role="img" aria-labelledby="moody-title" data-testid="moody">
                <title id="moody-title">"Moody chart: friction factor against Reynolds number, with each size's operating point"</title>
                <rect class="plot" x=px y=py width=pw height=ph/>
                <rect class="transition" x=c.transition.0 y=py width=c.transition.1 - c.transition.0 height=ph/>
                {c.x_ticks.iter().map(|(x, l)| view! {
                    <line class="grid" x1=*x x2=*x y1=py y2=py + ph/>
                    <text class="tick" x=*x y=py + ph + 16.0 text-anchor="middle">{l.clone()}</text>
                }).collect_view()}
                {c.y_ticks.iter().map(|(y, l)| view! {
                    <line class="grid" x1=px x2=px + pw y1=*y y2=*y/>
                    <text class="tick" x=px - 6.0 y=*y + 4.0 text-anchor="end">{l.clone()}</text>
                }).collect_view()}
                <path class="laminar" d=c.laminar.clone()/>
                {c.curves.iter().map(|cv| view! {
                    <path class="curve" d=cv.d.clone()/>
                    <text class="curve-label" x=cv.label_at.0 - 4.0 y=cv.label_at.1 - 4.0 text-anchor="end">{cv.label.clone()}</text>
                }).collect_view()}
                <g class="points">
                    {move || points().into_iter().map(|(name, p)| {
                        let cls = if p.proposed { "pt pt-proposed" } else if p.passes { "pt pt-pass" } else { "pt pt-fail" };
                        let r = if p.proposed { 7.0 } else { 4.5 };
                        view! { <circle class=cls cx=p.x cy=p.y r=r data-testid="moody-point"><title>{name}</title></circle> }
                    }).collect_view()}
                </g>
                <text class="axis" x=px + pw / 2.0 y=chart::HEIGHT - 4.0 text-anchor="middle">"Reynolds number Re"</text>
                <text class="axis" x=14.0 y=py + ph / 2.0 text-anchor="middle" transform=format!("rotate(-90 14 {})", py + ph / 2.0)>"f"</text>
            </svg>
            <figcaption>"Laminar f = 64/Re; curves are Colebrook (1939) for the ε/D shown; the shaded band is the transition zone. Large dot: the proposed size; hollow: sizes that fail."</figcaption>
        </figure>
    }
}

/// The worked steps, folded. Their rows are drawn only while they are
/// open (redrawn on every keystroke, they cost more than the answer); the
/// rest is drawn once.
#[component]
fn Explain(shown: Memo<Option<(Outcome, Detail)>>, none: Memo<bool>, open: RwSignal<bool>) -> impl IntoView {
    let details = NodeRef::<leptos::html::Details>::new();
    let steps = move || {
        if !open.get() {
            return Vec::new();
        }
        shown.with(|s| s.as_ref().map(|(_, d)| d.trace.clone()).unwrap_or_default())
    };
    view! {
        <details class="explain" class:hidden=none data-testid="explain" node_ref=details prop:open=move || open.get()
            on:toggle=move |_| { if let Some(d) = details.get_untracked() { if d.open() != open.get_untracked() { open.set(d.open()) } } }>
            <summary>"How this was worked out"</summary>
            <p>"The friction factor depends only on the Reynolds number and the relative roughness, f = φ(Re, ε/D); every other number here follows from the fluid, the pipe and the line."</p>
            <table>
                <thead><tr><th scope="col">"Quantity"</th><th scope="col">"Formula"</th><th scope="col">"Value (SI)"</th><th scope="col">"Source"</th></tr></thead>
                <tbody>
                    {move || steps().into_iter().map(|s: Step| view! {
                        <tr><th scope="row">{s.symbol}" "<span class="muted">{s.name}</span></th><td><code>{s.formula}</code></td>
                        <td>{format!("{} {}", format_number(s.value, 5), s.unit)}</td><td class="muted">{s.source}</td></tr>
                    }).collect_view()}
                </tbody>
            </table>
        </details>
    }
}
