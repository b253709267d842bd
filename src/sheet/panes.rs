//! The result views as markup: the answer, the sizes around it, the worked
//! steps, the Moody chart and the pump-and-system plot. Pure text from the
//! line's result, so they are tested natively; the page sets each as an
//! element's inner HTML (see [`super::markup`] for why, and for the
//! escaping every text goes through).

use super::chart;
use super::duty_plot::{self, Plot};
use super::markup::Markup;
use super::report::{designation, Detail, Outcome};
use super::units::format_number;
use crate::hydraulics::digits::{Fixed, Short};
use crate::hydraulics::line::Pipe;
use crate::hydraulics::sizing::Step;

/// Said in the answer and the print sheet when the Reynolds number of the
/// shown size lies between laminar and turbulent flow.
pub const TRANSITION: &str = "Re is in the transition zone (2000–4000): the friction factor is uncertain; \
                              the safe-side turbulent value is used.";

/// The text with its first letter capitalised, to stand as a sentence.
pub fn sentence(t: &str) -> String {
    let mut c = t.chars();
    // ASCII's upper case: our sentences start with a Latin letter (the
    // Unicode case tables cost the page 15 KB gzip, measured).
    c.next().map(|f| std::iter::once(f.to_ascii_uppercase()).chain(c).collect()).unwrap_or_default()
}

// Over 60 lines on purpose: the answer box in reading order, kept whole so it reads as shown.
/// The answer box: its class and its content. `None` is a line whose
/// fields do not read.
pub fn answer(o: Option<&Outcome>) -> (&'static str, String) {
    let mut m = Markup::new();
    let Some(o) = o else {
        m.el("p", &[("class", "answer-size"), ("data-testid", "proposed-size")], "—");
        m.el("p", &[], "Fix the fields marked in red to see sizes.");
        return ("answer answer-wait", m.finish());
    };
    let warnings = |m: &mut Markup| {
        for w in &o.sizing.warnings {
            m.el("p", &[("class", "warn")], w);
        }
    };
    let verdict = sentence(&o.verdict);
    let (Some(i), Some(fig)) = (o.shown, o.figures.as_ref()) else {
        m.el("p", &[("class", "answer-size"), ("data-testid", "proposed-size")], "No size");
        m.el("p", &[("data-testid", "answer-why")], &verdict);
        warnings(&mut m);
        return ("answer answer-none", m.finish());
    };
    let c = &o.sizing.candidates[i];
    let pass = c.passes();
    let head = match (o.checked, pass) {
        (true, true) => "Checked size — meets every limit",
        (true, false) => "Checked size — FAILS a limit",
        (false, _) => "Smallest size that meets every limit",
    };
    m.el("p", &[("class", "answer-head")], head);
    m.el("p", &[("class", "answer-size"), ("data-testid", "proposed-size")], &designation(&o.line, c.nominal));
    let series = match o.line.pipe {
        Pipe::Series(s) => s.label,
        Pipe::Custom(_) => "the bore entered",
    };
    m.el("p", &[("class", "answer-designation"), ("data-testid", "answer-designation")], series);
    m.open("dl", &[("class", "answer-figures")]);
    let figure = |m: &mut Markup, term: &str, id: &'static str, value: &str| {
        m.open("div", &[]).el("dt", &[], term);
        if id.is_empty() {
            m.el("dd", &[], value);
        } else {
            m.el("dd", &[("data-testid", id)], value);
        }
        m.close("div");
    };
    figure(&mut m, "Velocity", "answer-velocity", &fig.velocity);
    figure(&mut m, "Drop per length", "answer-drop-per-length", &fig.drop_per_length);
    if !fig.total_drop.is_empty() {
        figure(&mut m, "Total drop", "answer-total-drop", &fig.total_drop);
    }
    figure(&mut m, "Inside diameter", "", &fig.bore);
    m.close("dl");
    let no_length = fig.total_drop.is_empty();
    if no_length {
        m.el(
            "p",
            &[("class", "hint"), ("data-testid", "answer-no-length")],
            "No length entered: a quick check by velocity and drop per length. Enter the length for the total drop.",
        );
    }
    let mut breakdown = format!("Friction {} + fittings {}", fig.friction_drop, fig.fittings_drop);
    if !fig.components_drop.is_empty() {
        breakdown.push_str(&format!(" + valves and equipment {}", fig.components_drop));
    }
    breakdown.push_str(&if fig.static_in_total {
        format!(" + static {}", fig.static_drop)
    } else {
        format!("; static {} shown apart (closed loop)", fig.static_drop)
    });
    let class = if no_length { "breakdown hidden" } else { "breakdown" };
    m.el("p", &[("class", class), ("data-testid", "answer-breakdown")], &breakdown);
    if !fig.ends.is_empty() {
        let class = if fig.choked { "ends warn" } else { "ends" };
        m.el("p", &[("class", class), ("data-testid", "answer-ends")], &fig.ends);
    }
    if !o.checked {
        m.el("p", &[("class", "verdict-line"), ("data-testid", "answer-verdict")], &verdict);
    }
    m.el("p", &[("class", "headroom-title")], "Headroom to each limit");
    m.open("ul", &[("class", "headroom")]);
    for k in &fig.checks {
        let id = format!("headroom-{}", k.id);
        m.open("li", &[("class", if k.met { "ok" } else { "bad" }), ("data-testid", &id)]);
        m.el("span", &[], &k.text).el("strong", &[], &k.headroom).close("li");
    }
    m.close("ul");
    if c.uncertain() {
        m.el("p", &[("class", "warn"), ("data-testid", "warn-transition")], TRANSITION);
    }
    warnings(&mut m);
    (if pass { "answer" } else { "answer answer-bad" }, m.finish())
}

/// The rows of the table of sizes around the answer. Each row's button
/// carries its size in `data-pin` for the page's one click handler.
pub fn size_rows(o: &Outcome, d: &Detail) -> String {
    let mut m = Markup::new();
    for near in &d.nearby {
        let i = near.index;
        let c = &o.sizing.candidates[i];
        let f = &near.figures;
        let verdict = match (c.passes(), c.skipped) {
            _ if f.choked => "chokes",
            (_, Some(k)) => k.reason(),
            (true, None) => "meets",
            (false, None) => "fails",
        };
        let shown = o.shown == Some(i);
        let class = match (shown, c.passes()) {
            (true, true) => "shown",
            (true, false) => "shown fails",
            (false, true) => "",
            (false, false) => "fails",
        };
        m.open("tr", &[("class", class), ("data-testid", "size-row")]);
        m.el("th", &[("scope", "row")], &designation(&o.line, c.nominal));
        for cell in [&f.bore, &f.velocity, &f.reynolds, &f.friction] {
            m.el("td", &[], cell);
        }
        m.el("td", &[], f.regime);
        for cell in [&f.drop_per_length, &f.total_drop, &near.capacity_text] {
            m.el("td", &[], cell);
        }
        m.el("td", &[("class", "verdict")], verdict);
        m.el("td", &[], f.binding);
        let pinned = shown && o.checked;
        let id = format!("pin-{}", c.nominal);
        m.open("td", &[]);
        m.el(
            "button",
            &[
                ("type", "button"),
                ("class", "quiet"),
                ("data-testid", &id),
                ("data-pin", c.nominal),
                ("aria-pressed", if pinned { "true" } else { "false" }),
            ],
            if pinned { "Unpin" } else { "Check" },
        );
        m.close("td").close("tr");
    }
    m.finish()
}

/// The rows of the worked steps.
pub fn step_rows(steps: &[Step]) -> String {
    let mut m = Markup::new();
    for s in steps {
        m.open("tr", &[]).open("th", &[("scope", "row")]).text(s.symbol).text(" ");
        m.el("span", &[("class", "muted")], s.name).close("th");
        m.open("td", &[]).el("code", &[], s.formula).close("td");
        m.el("td", &[], &format!("{} {}", format_number(s.value, 5), s.unit));
        m.el("td", &[("class", "muted")], s.source).close("tr");
    }
    m.finish()
}

fn num(v: f64) -> String {
    Fixed(v, 1).to_string()
}

/// The Moody chart's grid, axes, laminar line and Colebrook curves: the
/// same for every line.
pub fn moody_background() -> String {
    let c = chart::background();
    let (px, py, pw, ph) = chart::plot_area();
    let mut m = Markup::new();
    m.empty("rect", &[("class", "plot"), ("x", &num(px)), ("y", &num(py)), ("width", &num(pw)), ("height", &num(ph))]);
    let band = [
        ("class", "transition"),
        ("x", &*num(c.transition.0)),
        ("y", &*num(py)),
        ("width", &*num(c.transition.1 - c.transition.0)),
        ("height", &*num(ph)),
    ];
    m.empty("rect", &band);
    for (x, l) in &c.x_ticks {
        let (x, y0, y1) = (num(*x), num(py), num(py + ph));
        m.empty("line", &[("class", "grid"), ("x1", &x), ("x2", &x), ("y1", &y0), ("y2", &y1)]);
        let at = [("class", "tick"), ("x", &*x), ("y", &*num(py + ph + 16.0)), ("text-anchor", "middle")];
        m.el("text", &at, l);
    }
    for (y, l) in &c.y_ticks {
        let (ys, x0, x1) = (num(*y), num(px), num(px + pw));
        m.empty("line", &[("class", "grid"), ("x1", &x0), ("x2", &x1), ("y1", &ys), ("y2", &ys)]);
        let at = [("class", "tick"), ("x", &*num(px - 6.0)), ("y", &*num(y + 4.0)), ("text-anchor", "end")];
        m.el("text", &at, l);
    }
    m.empty("path", &[("class", "laminar"), ("d", &c.laminar)]);
    for cv in &c.curves {
        m.empty("path", &[("class", "curve"), ("d", &cv.d)]);
        let at = [
            ("class", "curve-label"),
            ("x", &*num(cv.label_at.0 - 4.0)),
            ("y", &*num(cv.label_at.1 - 4.0)),
            ("text-anchor", "end"),
        ];
        m.el("text", &at, &cv.label);
    }
    let mid = py + ph / 2.0;
    let at =
        [("class", "axis"), ("x", &*num(px + pw / 2.0)), ("y", &*num(chart::HEIGHT - 4.0)), ("text-anchor", "middle")];
    m.el("text", &at, "Reynolds number Re");
    let turn = format!("rotate(-90 14 {})", Fixed(mid, 1));
    let at = [("class", "axis"), ("x", "14"), ("y", &*num(mid)), ("text-anchor", "middle"), ("transform", &*turn)];
    m.el("text", &at, "f");
    m.finish()
}

/// Every candidate's operating point on the Moody chart, named by its size.
pub fn moody_points(o: &Outcome) -> String {
    let mut m = Markup::new();
    for p in chart::points(&o.sizing) {
        let class = match (p.proposed, p.passes) {
            (true, _) => "pt pt-proposed",
            (false, true) => "pt pt-pass",
            (false, false) => "pt pt-fail",
        };
        let r = if p.proposed { "7" } else { "4.5" };
        let at = [("class", class), ("cx", &*num(p.x)), ("cy", &*num(p.y)), ("r", r), ("data-testid", "moody-point")];
        m.open("circle", &at).el("title", &[], &designation(&o.line, p.nominal)).close("circle");
    }
    m.finish()
}

/// The pump-and-system plot, a whole figure.
pub fn duty_figure(m: &mut Markup, plot: &Plot) {
    let (l, t, r, b) = duty_plot::frame();
    m.open("figure", &[("class", "duty-plot"), ("data-testid", "duty-plot")]);
    let view_box = format!("0 0 {} {}", Short(duty_plot::WIDTH), Short(duty_plot::HEIGHT));
    m.open("svg", &[("viewBox", &view_box), ("role", "img"), ("aria-label", &plot.description)]);
    m.empty(
        "polyline",
        &[("class", "axis"), ("points", &format!("{0},{1} {0},{2} {3},{2}", Short(l), Short(t), Short(b), Short(r)))],
    );
    for (x, s) in &plot.x_ticks {
        m.el("text", &[("class", "tick"), ("x", &num(*x)), ("y", &num(b + 14.0)), ("text-anchor", "middle")], s);
    }
    for (y, s) in &plot.y_ticks {
        m.el("text", &[("class", "tick"), ("x", &num(l - 4.0)), ("y", &num(y + 3.0)), ("text-anchor", "end")], s);
    }
    m.empty("polyline", &[("class", "system-curve"), ("points", &plot.system)]);
    if let Some(p) = &plot.pump {
        m.empty("polyline", &[("class", "pump-curve"), ("points", p)]);
    }
    let (dx, dy) = plot.duty;
    m.empty("circle", &[("class", "duty-point"), ("cx", &num(dx)), ("cy", &num(dy)), ("r", "4")]);
    if let Some((x, y)) = plot.operating {
        m.empty("circle", &[("class", "operating-point"), ("cx", &num(x)), ("cy", &num(y)), ("r", "5")]);
    }
    m.close("svg");
    m.el(
        "figcaption",
        &[],
        "Head against flow: system curve (solid), pump curve (dashed), duty point (dot), where the pump runs (ring).",
    );
    m.close("figure");
}
