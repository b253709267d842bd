//! The system box under the list: the settings of the whole system (source
//! and outlet pressures of an open system, three points of the pump curve,
//! the pump's suction), the index circuit and the pump duty in words, and
//! the pump-and-system plot.

use leptos::prelude::*;

use super::fields::TextField;
use super::state::{a_frame_behind, Sheet};
use crate::hydraulics::line::Circuit;
use crate::sheet::duty_plot::{self, Plot};
use crate::sheet::file::{LineFile, SystemFile};
use crate::sheet::report::LineReport;
use crate::sheet::units::Dimension;

/// One text of the system settings: how to read and write it.
fn setting(
    sheet: Sheet,
    get: fn(&SystemFile) -> String,
    set: fn(&mut SystemFile, String),
) -> (Signal<String>, Callback<String>) {
    let system = sheet.system;
    (Signal::derive(move || system.with(get)), Callback::new(move |v| system.update(|s| set(s, v))))
}

fn pump_text(s: &SystemFile, i: usize, head: bool) -> String {
    s.pump.get(i).map(|p| if head { p.head.clone() } else { p.flow.clone() }).unwrap_or_default()
}

fn set_pump(s: &mut SystemFile, i: usize, head: bool, v: String) {
    while s.pump.len() <= i {
        s.pump.push(Default::default());
    }
    if head {
        s.pump[i].head = v;
    } else {
        s.pump[i].flow = v;
    }
    while s.pump.last().is_some_and(|p| p.flow.trim().is_empty() && p.head.trim().is_empty()) {
        s.pump.pop();
    }
}

/// The flow and head of one pump-curve point.
fn pump_point(sheet: Sheet, i: usize) -> impl IntoView {
    let system = sheet.system;
    let fv = Signal::derive(move || system.with(|s| pump_text(s, i, false)));
    let hv = Signal::derive(move || system.with(|s| pump_text(s, i, true)));
    let fs = Callback::new(move |v| system.update(|s| set_pump(s, i, false, v)));
    let hs = Callback::new(move |v| system.update(|s| set_pump(s, i, true, v)));
    let (fid, hid) = [("pump-q1", "pump-h1"), ("pump-q2", "pump-h2"), ("pump-q3", "pump-h3")][i];
    let (fl, hl) =
        [("Point 1 flow", "Point 1 head"), ("Point 2 flow", "Point 2 head"), ("Point 3 flow", "Point 3 head")][i];
    view! {
        <div class="pump-point">
            <TextField label=fl id=fid value=fv on_input=fs error=Signal::derive(String::new) unit=Some(Dimension::Flow) suffix=None/>
            <TextField label=hl id=hid value=hv on_input=hs error=Signal::derive(String::new) unit=Some(Dimension::Pressure) suffix=None/>
        </div>
    }
}

/// The system, when lines name what they are fed from.
#[component]
pub fn SystemPanel() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let is_system = Memo::new(move |_| sheet.joined.with(|j| j.tree.is_system()));
    // The system follows the lines one frame later: a keystroke paints the
    // line's own answer first, then the system (left out altogether, the
    // panel took about a quarter off a keystroke on a 200-line sheet with
    // the CPU slowed 4×). One catch-up for however many changes came
    // before that frame.
    let caught_up = RwSignal::new(0u32);
    a_frame_behind(
        move || {
            // A line's result changes only with its text, the units, the
            // system settings or where it sits in the tree.
            sheet.lines.track();
            sheet.edited.track();
            sheet.joined.track();
            sheet.system.track();
            sheet.resolved.track();
        },
        move || {
            caught_up.try_update(|n| *n = n.wrapping_add(1));
        },
    );
    let answer = Memo::new(move |_| {
        let shown = is_system.get();
        caught_up.track();
        untrack(|| system_answer(sheet, shown))
    });
    let open = move || sheet.basis.with(|b| b.circuit == Circuit::Open);
    let (src_v, src_s) = setting(sheet, |s| s.source_pressure.clone(), |s, v| s.source_pressure = v);
    let (min_v, min_s) = setting(sheet, |s| s.outlet_minimum.clone(), |s, v| s.outlet_minimum = v);
    let (sp_v, sp_s) = setting(sheet, |s| s.suction.pressure.clone(), |s, v| s.suction.pressure = v);
    let (sh_v, sh_s) = setting(sheet, |s| s.suction.height.clone(), |s, v| s.suction.height = v);
    let (sl_v, sl_s) = setting(sheet, |s| s.suction.loss.clone(), |s, v| s.suction.loss = v);
    view! {
        <Show when=move || is_system.get()>
            <div class="system-panel" data-testid="system" aria-live="polite">
                <h3>"System"</h3>
                <div data-testid="system-lines" inner_html=move || answer.with(|(lines, _)| paragraphs(lines))></div>
                <div inner_html=move || answer.with(|(_, plot)| plot_markup(plot.as_ref()))></div>
                <details class="system-settings" data-testid="system-settings">
                    <summary>"Source, outlets and pump"</summary>
                    <Show when=open>
                        <TextField label="Pressure at the source (gauge)" id="sys-source" value=src_v on_input=src_s error=Signal::derive(String::new) unit=Some(Dimension::Pressure) suffix=None placeholder="e.g. 350 kPa mains"/>
                        <TextField label="Least pressure at each outlet, flowing (gauge)" id="sys-outlet-min" value=min_v on_input=min_s error=Signal::derive(String::new) unit=Some(Dimension::Pressure) suffix=None placeholder="e.g. 55 kPa (8 psi)"/>
                    </Show>
                    <p class="hint">"Pump curve: three points read off the maker's curve (head as a pressure or m head)."</p>
                    {(0..3).map(|i| pump_point(sheet, i)).collect_view()}
                    <p class="hint">"Pump suction, for the NPSH available: absolute pressure on the surface it draws from, that surface's height above the pump inlet (negative below), and the suction pipe's loss."</p>
                    <TextField label="Suction surface pressure (absolute)" id="sys-suction-p" value=sp_v on_input=sp_s error=Signal::derive(String::new) unit=Some(Dimension::Pressure) suffix=None placeholder="e.g. 101.325 kPa, an open tank"/>
                    <TextField label="Surface above the pump inlet" id="sys-suction-z" value=sh_v on_input=sh_s error=Signal::derive(String::new) unit=Some(Dimension::Length) suffix=None placeholder="e.g. 2 m"/>
                    <TextField label="Suction pipe loss" id="sys-suction-loss" value=sl_v on_input=sl_s error=Signal::derive(String::new) unit=Some(Dimension::Pressure) suffix=None placeholder="0 if blank"/>
                </details>
            </div>
        </Show>
    }
}

/// The system's lines of text and its plot, read from the sheet as it is
/// (the panel and the print sheet).
pub(crate) fn system_answer(sheet: Sheet, is_system: bool) -> (Vec<String>, Option<Plot>) {
    if !is_system {
        return (Vec::new(), None);
    }
    let u = sheet.resolved.get_untracked();
    let system = sheet.system.get_untracked();
    // Read in place: cloning every line's text or report on each edit cost
    // milliseconds on a long sheet.
    sheet.lines.with_untracked(|v| {
        let guards: Vec<_> = v.iter().map(|s| s.report.read()).collect();
        let reports: Vec<&LineReport> = guards.iter().map(|g| &**g).collect();
        let files: Vec<_> = v.iter().map(|s| s.file.read_untracked()).collect();
        let lines: Vec<&LineFile> = files.iter().map(|f| &**f).collect();
        let sum = sheet.joined.with_untracked(|j| crate::sheet::system::summarise(&j.tree, &reports, &u, &system));
        (crate::sheet::report::system_lines_of(&lines, &u, &system, &sum), duty_plot::plot(&sum, &u))
    })
}

/// Each text as a paragraph.
fn paragraphs(texts: &[String]) -> String {
    let mut m = crate::sheet::markup::Markup::new();
    for t in texts {
        m.el("p", &[], t);
    }
    m.finish()
}

/// The pump-and-system plot's markup ("" without a plot).
fn plot_markup(plot: Option<&Plot>) -> String {
    let mut m = crate::sheet::markup::Markup::new();
    if let Some(p) = plot {
        crate::sheet::panes::duty_figure(&mut m, p);
    }
    m.finish()
}
