//! Results of a whole sheet, and their three written forms: a readable
//! table, CSV and JSON. Units are the sheet's own.

use crate::hydraulics::digits::{Fixed, Short, Signed};
use serde::Serialize;

use super::file::{FieldError, LineFile, SheetFile, SystemFile, Units};
use super::system::Carried;
use super::units::{format_number, from_si, show, show_flow, Unit};
use crate::hydraulics::field::Field;
use crate::hydraulics::friction::Regime;
use crate::hydraulics::line::{Circuit, Limit, Pipe, Valid};
use crate::hydraulics::sizing::{self, Candidate, Capacity, Sizing, Step, Verdict};

/// Shown on every result, export and printout.
pub const CAUTION: &str = "Design guidance only. Check every result against the governing \
     code, manufacturer data and the judgement of a licensed professional before anything is \
     built.";

/// A line's result.
#[derive(Debug, Clone, PartialEq)]
pub struct Outcome {
    /// The core's line, validated.
    pub line: Valid,
    /// Every candidate size and the proposal.
    pub sizing: Sizing,
    /// The candidate reported: the checked size in check mode, else the
    /// proposal; `None` when no size meets the limits.
    pub shown: Option<usize>,
    /// Whether `shown` is a pinned size (check mode).
    pub checked: bool,
    /// Capacity of the shown size.
    pub capacity: Option<Capacity>,
    /// The shown size's figures in the sheet's units.
    pub figures: Option<Figures>,
    /// The verdict in words: what set the size, or why none fits.
    pub verdict: String,
    /// The flow derived from a heat load, in the sheet's unit (`None` when
    /// the flow was typed).
    pub flow_text: Option<String>,
    /// True when the flow comes from fixtures (not a heat load).
    pub from_fixtures: bool,
    /// False for a quick check with no length: the total drop (and the
    /// friction over the run) is then not shown, nor counted on a path.
    pub length_given: bool,
}

/// What the open results panel shows beyond the [`Outcome`]: the sizes
/// around the answer with their capacities, and the worked steps. Made by
/// [`detail`] once per line result (the page keeps it in a memo of its
/// own, computed only for a line whose panel is drawn); views only draw it.
#[derive(Debug, Clone, PartialEq)]
pub struct Detail {
    /// The sizes around the answer (up to two either side of it, or the
    /// largest sizes when none meets the limits), with their capacity.
    pub nearby: Vec<Nearby>,
    /// The worked steps for the shown size (empty when there is none).
    pub trace: Vec<Step>,
}

/// A size near the answer, with the largest flow it carries within the
/// limits: computed once with the line's result, only drawn by views.
#[derive(Debug, Clone, PartialEq)]
pub struct Nearby {
    /// Index into the candidates.
    pub index: usize,
    /// Its capacity, when one can be found.
    pub capacity: Option<Capacity>,
    /// The capacity as shown ("—" when there is none).
    pub capacity_text: String,
    /// Its figures as shown.
    pub figures: Figures,
}

/// The detail of a line's result: capacities and figures of the sizes
/// around the answer (the shown size's capacity is reused, not solved
/// again) and the worked steps.
pub fn detail(o: &Outcome, units: &Units) -> Detail {
    let rho = o.sizing.properties.density_kg_m3();
    let nearby = window(o.shown, o.sizing.candidates.len())
        .map(|index| {
            let c = &o.sizing.candidates[index];
            let capacity =
                if o.shown == Some(index) { o.capacity } else { sizing::capacity(&o.line, c.point.bore).ok() };
            let capacity_text = capacity
                .and_then(|k| k.max_flow)
                .map(|q| {
                    if o.line.fluid.is_compressible() {
                        // Mass: an actual volume at the inlet would read as
                        // a different flow at every pressure.
                        kg_h(q.value, rho, 3)
                    } else {
                        show_flow(q.value, units.flow, Some(rho), Some(&o.line.fluid), 3)
                    }
                })
                .unwrap_or_else(|| "—".into());
            Nearby { index, capacity, capacity_text, figures: Figures::of(c, units, rho).with_length(o.length_given) }
        })
        .collect();
    let trace = o.shown.map(|i| sizing::trace(&o.line, &o.sizing.candidates[i])).unwrap_or_default();
    Detail { nearby, trace }
}

/// The candidates around the answer: two either side of `shown`, or the
/// last five when no size meets the limits.
pub fn window(shown: Option<usize>, n: usize) -> std::ops::Range<usize> {
    let centre = shown.unwrap_or(n.saturating_sub(1));
    centre.saturating_sub(2)..(centre + 3).min(n)
}

/// One line of the sheet, evaluated.
#[derive(Debug, Clone, PartialEq)]
pub struct LineReport {
    /// 1-based position in the sheet.
    pub number: usize,
    /// The line's name.
    pub name: String,
    /// The result, or every bad field.
    pub outcome: Result<Outcome, Vec<FieldError>>,
}

impl AsRef<LineReport> for LineReport {
    fn as_ref(&self) -> &LineReport {
        self
    }
}

/// Evaluates one stored line on its own.
pub fn evaluate_line(number: usize, lf: &LineFile, units: &Units) -> LineReport {
    evaluate_line_in(number, lf, units, None)
}

/// Evaluates one stored line in its system: `carried` is the heat load it
/// carries for its branches as well as its own (`sheet::system::carried`),
/// when it has branches.
pub fn evaluate_line_in(number: usize, lf: &LineFile, units: &Units, carried: Option<Carried>) -> LineReport {
    let carried = carried.filter(Carried::has_branches);
    let outcome = lf.to_line_carrying(units, carried.as_ref()).and_then(|line| {
        let sizing =
            sizing::size(&line).map_err(|e| vec![FieldError { field: Field::Line, message: e.to_string() }])?;
        let (shown, checked) = match lf.check_size.as_deref().map(str::trim).filter(|s| !s.is_empty()) {
            Some(n) => match sizing.candidates.iter().position(|c| c.nominal == n) {
                Some(i) => (Some(i), true),
                None => {
                    return Err(vec![FieldError {
                        field: Field::CheckSize,
                        message: format!("'{n}' is not a size of this pipe series"),
                    }])
                }
            },
            None => (sizing.proposed, false),
        };
        let rho = sizing.properties.density_kg_m3();
        let capacity = shown.and_then(|i| sizing::capacity(&line, sizing.candidates[i].point.bore).ok());
        let length_given = !lf.length.trim().is_empty();
        let figures = shown.map(|i| Figures::of(&sizing.candidates[i], units, rho).with_length(length_given));
        let verdict = verdict_text(&line, &sizing, units);
        let flow_text = lf.load.as_ref().map(|_| {
            let q = show(line.flow.value, units.flow, Some(rho), 4);
            match carried {
                Some(c) => {
                    let w = |v: f64| show(v, units.power, None, 3);
                    let d = super::system::diversity(lf);
                    let mut t = format!(
                        "{q} for {} ({} own + {}{} from its branches)",
                        w(c.load_w),
                        w(c.load_w - d * c.from_branches_w),
                        if d < 1.0 { format!("{} × ", Short(d)) } else { String::new() },
                        w(c.from_branches_w)
                    );
                    if c.typed_branches > 0 {
                        t.push_str(&format!(
                            "; {} branch{} not included (flow typed, or from fixtures)",
                            c.typed_branches,
                            if c.typed_branches == 1 { "" } else { "es" }
                        ));
                    }
                    t
                }
                None => {
                    // A load on its own: say which, as the branches' lines do.
                    let own = lf.load.as_ref().and_then(|l| {
                        super::units::parse(super::units::Dimension::Power, l.power.trim(), units.power)
                            .ok()
                            .and_then(|m| m.to_si(None).ok())
                    });
                    match own {
                        Some(w) => format!("{q} for {}", show(w, units.power, None, 3)),
                        None => q,
                    }
                }
            }
        });
        let flow_text = flow_text.or_else(|| {
            let (total, from_branches, continuous) = super::system::fixture_totals(lf, units, carried.as_ref())?;
            let method = units.basis.demand;
            let n = |v: f64| format_number(v, 4);
            let mut t = format!(
                "{} probable for {} {}",
                show(line.flow.value - continuous, units.flow, Some(rho), 4),
                n(total),
                method.unit()
            );
            if from_branches > 0.0 {
                t.push_str(&format!(" ({} own + {} from its branches)", n(total - from_branches), n(from_branches)));
            }
            if continuous > 0.0 {
                t.push_str(&format!(
                    " + {} continuous = {}",
                    show(continuous, units.flow, Some(rho), 3),
                    show(line.flow.value, units.flow, Some(rho), 4)
                ));
            }
            if let Some(c) = carried.filter(|c| c.typed_branches > 0) {
                t.push_str(&format!(
                    "; {} branch{} not included (flow typed, or from a heat load)",
                    c.typed_branches,
                    if c.typed_branches == 1 { "" } else { "es" }
                ));
            }
            Some(t)
        });
        let from_fixtures = lf.load.is_none() && lf.fixtures.is_some();
        Ok(Outcome { line, sizing, shown, checked, capacity, figures, verdict, flow_text, from_fixtures, length_given })
    });
    LineReport { number, name: lf.name.clone(), outcome }
}

/// Evaluates every line of a sheet, in its system: loads carried up the
/// tree, and each line's problems with what it is fed from reported with it.
pub fn evaluate(sheet: &SheetFile) -> Vec<LineReport> {
    let units = sheet.units();
    let tree = super::system::tree(&sheet.lines);
    let carried = super::system::carried(&sheet.lines, &tree, &units);
    sheet
        .lines
        .iter()
        .enumerate()
        .map(|(i, lf)| {
            let mut r = evaluate_line_in(i + 1, lf, &units, carried[i]);
            with_tree_problems(&mut r, tree.problems.iter().filter(|(k, _)| *k == i).map(|(_, m)| m));
            r
        })
        .collect()
}

/// Adds a line's problems with what it is fed from to its report (the
/// line still sizes on its own).
pub fn with_tree_problems<'a>(r: &mut LineReport, problems: impl IntoIterator<Item = &'a String>) {
    let problems: Vec<&String> = problems.into_iter().collect();
    if problems.is_empty() {
        return;
    }
    match &mut r.outcome {
        Ok(o) => o.sizing.warnings.extend(problems.into_iter().map(|m| format!("fed from: {m}"))),
        Err(errs) => {
            errs.extend(problems.into_iter().map(|m| FieldError { field: Field::FedFrom, message: m.clone() }))
        }
    }
}

fn conv(si: f64, unit: &'static Unit, rho: f64, sig: usize) -> String {
    from_si(si, unit, Some(rho)).map(|v| format_number(v, sig)).unwrap_or_else(|_| "—".into())
}

fn headroom_pct(c: &Candidate) -> String {
    c.binding
        .and_then(|b| c.checks.iter().find(|k| k.limit == b))
        .map(|k| format!("{} %", Signed(k.headroom * 100.0, 0)))
        .unwrap_or_default()
}

/// A limit's value (SI) in the sheet's unit for that limit.
pub fn limit_value(limit: Limit, si: f64, u: &Units, rho: f64) -> String {
    match limit {
        Limit::DropPerLength => show(si, u.drop_per_length, Some(rho), 3),
        Limit::TotalDrop => show(si, u.pressure, Some(rho), 3),
        Limit::MaxVelocity | Limit::MinVelocity => show(si, u.velocity, Some(rho), 3),
        Limit::DropFraction | Limit::Choking => format!("{} %", format_number(si * 100.0, 3)),
    }
}

/// A size as people write it ("NPS 2", "DN50", "110 mm").
pub fn designation(line: &Valid, nominal: &str) -> String {
    match line.pipe {
        Pipe::Series(s) => s.designation(nominal),
        Pipe::Custom(_) => nominal.to_owned(),
    }
}

/// The verdict in one sentence: what the next size down fails (why the
/// answer is not smaller), that the limits conflict, that the rise alone
/// breaks the total-drop limit, or what even the largest size fails.
pub fn verdict_text(line: &Valid, s: &Sizing, u: &Units) -> String {
    let rho = s.properties.density_kg_m3();
    let name = |i: usize| designation(line, s.candidates[i].nominal);
    let names = |ls: &[Limit]| ls.iter().map(|l| l.name()).collect::<Vec<_>>().join(", ");
    match &s.verdict {
        Verdict::Proposed { index, below: Some(b) } => {
            let passed_over: Vec<String> = (b.index + 1..*index)
                .filter_map(|i| s.candidates[i].skipped.map(|k| format!("{} {}", name(i), k.reason())))
                .collect();
            let mut t = format!(
                "governed by {}: {} runs at {} (limit {})",
                b.check.limit.name(),
                name(b.index),
                limit_value(b.check.limit, b.check.value, u, rho),
                limit_value(b.check.limit, b.check.allowed, u, rho)
            );
            if !passed_over.is_empty() {
                t.push_str(&format!("; {}", passed_over.join("; ")));
            }
            t
        }
        Verdict::Proposed { index, below: None } => {
            format!("{} is the smallest size searched, and it meets every limit", name(*index))
        }
        Verdict::Conflict { max_up_to, max_limits, min_from } => format!(
            "the limits conflict: up to {} fail {}; from {} fail minimum velocity",
            name(*max_up_to),
            names(max_limits),
            name(*min_from)
        ),
        Verdict::RiseExceedsTotal { static_drop, allowed } => format!(
            "the rise alone takes {}, more than the total-drop limit of {}: no size can meet it",
            show(*static_drop, u.pressure, Some(rho), 3),
            show(*allowed, u.pressure, Some(rho), 3)
        ),
        Verdict::TooSmall { failing } => {
            format!("no size meets the limits: even the largest size searched fails {}", names(failing))
        }
    }
}

/// The regime as words, with the transition zone marked uncertain.
pub fn regime_name(r: Regime) -> &'static str {
    match r {
        Regime::Laminar => "laminar",
        Regime::Transition => "transition (uncertain)",
        Regime::Turbulent => "turbulent",
    }
}

/// What is shown of one size, in the sheet's units: every view, the
/// printed sheet and the batch table take their text from here, so a
/// velocity or a drop is formatted in one place.
#[derive(Debug, Clone, PartialEq)]
pub struct Figures {
    /// Nominal size.
    pub size: &'static str,
    /// Inside diameter with its unit.
    pub bore: String,
    /// Mean velocity with its unit.
    pub velocity: String,
    /// Friction drop per length with its unit.
    pub drop_per_length: String,
    /// Total drop with its unit.
    pub total_drop: String,
    /// Friction over length and equivalent length, with its unit.
    pub friction_drop: String,
    /// Fittings and other K losses, with its unit.
    pub fittings_drop: String,
    /// Valves and equipment by Kv, rated drop, butterfly or reducer, with
    /// its unit ("" when the line has none).
    pub components_drop: String,
    /// The static part ρ g Δz, with its unit.
    pub static_drop: String,
    /// Whether the static part is in the total (an open system).
    pub static_in_total: bool,
    /// Reynolds number.
    pub reynolds: String,
    /// Darcy friction factor.
    pub friction: String,
    /// Flow regime in words.
    pub regime: &'static str,
    /// The limit with the least headroom ("" when none).
    pub binding: &'static str,
    /// Headroom to that limit, e.g. "+12 %".
    pub headroom: String,
    /// Each limit: what it is at this size against what is allowed.
    pub checks: Vec<CheckFigures>,
    /// A gas or steam line's two ends in one sentence: the equation,
    /// pressures, densities and velocities at inlet and outlet, the mass
    /// flow ("" for a liquid).
    pub ends: String,
    /// The size chokes: it cannot pass the flow at all.
    pub choked: bool,
}

/// One limit at one size, as shown.
#[derive(Debug, Clone, PartialEq)]
pub struct CheckFigures {
    /// The limit's stable id.
    pub id: &'static str,
    /// "velocity 1.2 m/s of 2.4 m/s".
    pub text: String,
    /// "+50 %".
    pub headroom: String,
    /// Whether it is met.
    pub met: bool,
}

impl Figures {
    /// The figures of one candidate, with the fluid's density `rho` (kg/m³)
    /// for heads.
    pub fn of(c: &Candidate, u: &Units, rho: f64) -> Figures {
        let p = &c.point;
        let limit_text = |limit: Limit, si: f64| limit_value(limit, si, u, rho);
        let velocity = match p.gas {
            Some(g) => format!(
                "{} → {}",
                format_number(from_si(p.velocity.value, u.velocity, None).unwrap_or(f64::NAN), 3),
                show(g.outlet_velocity, u.velocity, None, 3)
            ),
            None => show(p.velocity.value, u.velocity, Some(rho), 3),
        };
        Figures {
            size: c.nominal,
            bore: show(p.bore.value, u.bore(), Some(rho), 4),
            velocity,
            drop_per_length: show(p.drop_per_length.value, u.drop_per_length, Some(rho), 3),
            total_drop: show(p.total_drop.value, u.pressure, Some(rho), 3),
            friction_drop: show(p.friction_drop.value, u.pressure, Some(rho), 3),
            fittings_drop: show(p.fittings_drop.value, u.pressure, Some(rho), 3),
            components_drop: if c.point.components_drop.value == 0.0 {
                String::new()
            } else {
                show(p.components_drop.value, u.pressure, Some(rho), 3)
            },
            static_drop: show(p.static_drop.value, u.pressure, Some(rho), 3),
            static_in_total: u.basis.circuit == Circuit::Open,
            reynolds: format_number(p.reynolds, 3),
            friction: format_number(p.friction_factor, 4),
            regime: regime_name(p.regime),
            binding: c.binding.map(|b| b.name()).unwrap_or(""),
            headroom: headroom_pct(c),
            checks: c
                .checks
                .iter()
                .map(|k| CheckFigures {
                    id: k.limit.id(),
                    text: format!(
                        "{} {} of {}",
                        k.limit.name(),
                        limit_text(k.limit, k.value),
                        limit_text(k.limit, k.allowed)
                    ),
                    headroom: format!("{} %", Signed(k.headroom * 100.0, 0)),
                    met: k.met(),
                })
                .collect(),
            ends: p.gas.map(|g| gas_ends(&g, p, u)).unwrap_or_default(),
            choked: p.gas.is_some_and(|g| g.choked),
        }
    }
}

impl Figures {
    /// Without a length (a quick check) the run's friction and the total
    /// are unknown: they are left blank rather than shown as if the line
    /// had none.
    pub fn with_length(mut self, given: bool) -> Figures {
        if !given {
            self.total_drop.clear();
            self.friction_drop.clear();
        }
        self
    }
}

/// A gas or steam line's flow as mass, "543.1 kg/h", from its actual
/// volume at the inlet (m³/s) and the inlet density: an actual volume
/// would read differently at every pressure.
fn kg_h(q_m3_s: f64, rho: f64, significant: usize) -> String {
    format!("{} kg/h", format_number(q_m3_s * rho * 3600.0, significant))
}

/// A gas or steam line's ends in words.
fn gas_ends(g: &crate::hydraulics::line::GasEnds, p: &crate::hydraulics::line::Point, u: &Units) -> String {
    let abs = |pa: f64| format!("{} abs", show(pa, u.pressure, None, 4));
    let kg = |v: f64| format_number(v, 3);
    let area = std::f64::consts::FRAC_PI_4 * p.bore.value * p.bore.value;
    let mass = kg_h(p.velocity.value * area, g.inlet_density, 4);
    if g.choked {
        return format!(
            "CHOKED: this size cannot pass {} from {} — the flow would reach the isothermal sonic limit \
             before the outlet ({} % of the choking flow)",
            mass,
            abs(g.inlet_pressure),
            format_number(g.choke_ratio * 100.0, 3)
        );
    }
    format!(
        "Isothermal compressible flow (Crane TP-410): p {} → {} ({} % of inlet); ρ {} → {} kg/m³; V {} → {}; \
         {}; {} % of the choking flow",
        abs(g.inlet_pressure),
        abs(g.outlet_pressure),
        format_number(g.fraction() * 100.0, 3),
        kg(g.inlet_density),
        kg(g.outlet_density),
        show(p.velocity.value, u.velocity, None, 3),
        show(g.outlet_velocity, u.velocity, None, 3),
        mass,
        format_number(g.choke_ratio * 100.0, 2)
    )
}

const COLUMNS: usize = 16;

/// A table row with only a status and a note (no size to report).
fn status_row(r: &LineReport, status: &str, note: String) -> [String; COLUMNS] {
    let mut row: [String; COLUMNS] = Default::default();
    row[0] = r.number.to_string();
    row[1] = r.name.clone();
    row[2] = status.to_owned();
    row[15] = note;
    row
}

/// The name of the limit that set the size (what the next size down fails).
pub fn governed_by(s: &Sizing) -> &'static str {
    match &s.verdict {
        Verdict::Proposed { below: Some(b), .. } => b.check.limit.name(),
        _ => "",
    }
}

/// The shown size's status words.
fn status_words(o: &Outcome, c: &Candidate) -> &'static str {
    match (o.checked, c.passes()) {
        (false, _) => "proposed",
        (true, true) => "checked: meets limits",
        (true, false) => "checked: FAILS limits",
    }
}

/// One line's table row; its notes (verdict, transition zone, warnings,
/// errors) are added to `notes`.
fn table_row(r: &LineReport, u: &Units, notes: &mut Vec<String>) -> [String; COLUMNS] {
    let o = match &r.outcome {
        Err(errs) => {
            notes.extend(errs.iter().map(|e| format!("line {} ({}): {e}", r.number, r.name)));
            return status_row(r, "ERROR", "see below".into());
        }
        Ok(o) => o,
    };
    if let Some(q) = &o.flow_text {
        if !o.from_fixtures {
            notes.push(format!("line {}: flow from its heat load, Φ / (ρ c_p ΔT) = {q}", r.number));
        } else {
            notes.push(format!("line {}: flow from its fixtures, {q}", r.number));
        }
    }
    notes.push(format!("line {}: {}", r.number, o.verdict));
    let row = match o.shown {
        None => status_row(r, "NO SIZE", "see below".into()),
        Some(i) => {
            let c = &o.sizing.candidates[i];
            if c.uncertain() {
                notes.push(format!(
                    "line {}: flow is in the transition zone; the friction factor is uncertain",
                    r.number
                ));
            }
            let f = o.figures.clone().unwrap_or_else(|| Figures::of(c, u, o.sizing.properties.density_kg_m3()));
            let size = match (o.checked, c.passes()) {
                (true, true) => format!("{} (checked)", designation(&o.line, f.size)),
                (true, false) => format!("{} (checked: FAILS)", designation(&o.line, f.size)),
                _ => designation(&o.line, f.size),
            };
            if !f.ends.is_empty() {
                notes.push(format!("line {}: {}", r.number, f.ends));
            }
            let static_drop =
                if f.static_in_total { f.static_drop.clone() } else { format!("({}, apart)", f.static_drop) };
            [
                r.number.to_string(),
                r.name.clone(),
                size,
                f.bore,
                f.velocity,
                f.drop_per_length,
                f.friction_drop,
                f.fittings_drop,
                f.components_drop,
                static_drop,
                f.total_drop,
                f.reynolds,
                f.friction,
                f.binding.to_owned(),
                f.headroom,
                governed_by(&o.sizing).to_owned(),
            ]
        }
    };
    notes.extend(o.sizing.warnings.iter().map(|w| format!("line {}: {w}", r.number)));
    row
}

/// The sheet's circuit in words, for every output's heading.
pub fn circuit_note(u: &Units) -> &'static str {
    match u.basis.circuit {
        Circuit::Open => "Open system: the static rise counts in each total drop.",
        Circuit::Closed => {
            "Closed loop: the static rise is returned by the down-leg; it is shown apart and not counted in \
             any total drop or pump head."
        }
    }
}

/// The system in words, when lines are joined: the pump duty from the
/// index circuit, and every path's drop, worst first. Empty when no line
/// names the line it is fed from.
pub fn system_lines(sheet: &SheetFile, reports: &[impl AsRef<LineReport>]) -> Vec<String> {
    let tree = super::system::tree(&sheet.lines);
    if !tree.is_system() {
        return Vec::new();
    }
    let u = sheet.units();
    let sum = super::system::summarise(&tree, reports, &u, &sheet.system);
    let lines: Vec<&LineFile> = sheet.lines.iter().collect();
    system_lines_of(&lines, &u, &sheet.system, &sum)
}

/// As [`system_lines`], from a summary the caller already has, the sheet's
/// lines in order, its units and its system settings.
pub fn system_lines_of(
    lines: &[&LineFile],
    u: &Units,
    system: &SystemFile,
    sum: &super::system::Summary,
) -> Vec<String> {
    let water = super::units::find(super::units::Dimension::Pressure, "m H₂O").expect("m H₂O");
    let name = |i: usize| {
        let n = lines[i].name.trim();
        if n.is_empty() {
            format!("line {}", i + 1)
        } else {
            n.to_owned()
        }
    };
    let route = |p: &super::system::Path| p.lines.iter().rev().map(|&i| name(i)).collect::<Vec<_>>().join(" → ");
    let mut out = Vec::new();
    match (sum.paths.first(), sum.head_pa, sum.flow_m3_s) {
        (Some(p), Some(h), Some(_)) if sum.gas_inlet_pa.is_some() => {
            let p1 = sum.gas_inlet_pa.unwrap_or(f64::NAN);
            out.push(format!(
                "Index path: {} — {} from the source's inlet to its end ({} % of the source's {} abs); a gas or \
                 steam system has no pump duty. Each line is worked at the inlet pressure entered on it: give a \
                 branch the pressure its feed leaves.",
                route(p),
                show(h, u.pressure, None, 3),
                format_number(h / p1 * 100.0, 3),
                show(p1, u.pressure, None, 4)
            ));
        }
        (Some(p), Some(h), Some(q)) => {
            let rho = sum.source_density;
            let supplied = u.basis.circuit == super::file::Circuit::Open && !system.source_pressure.trim().is_empty();
            out.push(if supplied {
                format!(
                    "Index circuit: {} — {} ({}) from the source to its end, {} at the source",
                    route(p),
                    show(h, u.pressure, None, 3),
                    show(h, water, None, 3),
                    show(q, u.flow, rho, 4),
                )
            } else {
                format!(
                    "Index circuit: {} — pump duty {} at {} ({}){}",
                    route(p),
                    show(q, u.flow, rho, 4),
                    show(h, u.pressure, None, 3),
                    show(h, water, None, 3),
                    if sum.mirrored { ", flow and a mirrored return" } else { "" }
                )
            });
            if u.basis.circuit == super::file::Circuit::Closed {
                out.push(format!(
                    "  static along it {} (closed loop: not pump head)",
                    show(p.static_pa, u.pressure, None, 3)
                ));
            }
        }
        (Some(p), _, _) => {
            out.push(format!("Index circuit: {} — a line on it has no result, so no pump duty", route(p)))
        }
        _ => {}
    }
    for p in &sum.paths {
        out.push(format!(
            "  path {}: {}{}",
            route(p),
            show(p.drop_pa, u.pressure, None, 3),
            if p.complete { "" } else { " (incomplete: a line has no result)" }
        ));
    }
    let rho = sum.source_density;
    let pa = |v: f64| format!("{} ({})", show(v, u.pressure, None, 3), show(v, water, None, 3));
    if u.basis.circuit == super::file::Circuit::Open {
        match sum.source_pa {
            Some(p0) => {
                out.push(format!(
                    "Pressure left at each end line, worst first (source {}{}):",
                    pa(p0),
                    sum.outlet_min_pa.map(|m| format!(", outlets need {}", pa(m))).unwrap_or_default()
                ));
                for r in &sum.residuals {
                    let short = sum.outlet_min_pa.filter(|&m| r.pressure_pa < m);
                    out.push(format!(
                        "  {}: {}{}{}",
                        name(r.end),
                        pa(r.pressure_pa),
                        match short {
                            Some(m) => format!(" — SHORT by {}", show(m - r.pressure_pa, u.pressure, None, 3)),
                            None if r.pressure_pa < 0.0 => " — SHORT: no pressure left".to_owned(),
                            None => String::new(),
                        },
                        if r.complete { "" } else { " (incomplete: a line has no result)" }
                    ));
                }
            }
            None => {
                if let (Some(p), Some(m)) = (sum.paths.first().filter(|p| p.complete), sum.outlet_min_pa) {
                    out.push(format!(
                        "Needed at the source: {} (worst path {} + outlet minimum {})",
                        pa(p.drop_pa + m),
                        show(p.drop_pa, u.pressure, None, 3),
                        show(m, u.pressure, None, 3)
                    ));
                }
            }
        }
    }
    if let Some(c) = sum.curve {
        out.push(format!(
            "System curve: H = {} + {} × (Q / {})²",
            show(c.static_pa, u.pressure, None, 3),
            show(c.k * sum.flow_m3_s.map_or(0.0, |q| q * q), u.pressure, None, 3),
            show(sum.flow_m3_s.unwrap_or(0.0), u.flow, rho, 4),
        ));
    }
    if let (Some((q, h)), Some(duty_q)) = (sum.operating, sum.flow_m3_s) {
        let pct = (q / duty_q - 1.0) * 100.0;
        out.push(format!(
            "Pump runs at {} and {} on the system curve: {} the duty flow{}",
            show(q, u.flow, rho, 4),
            pa(h),
            if pct >= 0.0 { format!("{} % above", Fixed(pct, 0)) } else { format!("{} % BELOW", Fixed(-pct, 0)) },
            if pct < 0.0 { " — this pump does not meet the duty" } else { "" }
        ));
    }
    if let Some((n, pv)) = sum.npsh {
        out.push(format!(
            "NPSH available at the pump inlet: {} m (vapour pressure {}, water's, IAPWS-IF97) — the pump's NPSH \
             required must stay below it with the margin its maker and your practice ask",
            format_number(n, 3),
            show(pv, u.pressure, None, 3)
        ));
    }
    if lines.iter().any(|l| l.load.is_none() && l.fixtures.is_some()) {
        out.push(format!("Fixtures to flow: {}", u.basis.demand.label()));
    }
    for (_, m) in &sum.problems {
        out.push(format!("System setting: {m}"));
    }
    out
}

/// The tree, one line per line, indented under what it is fed from, with
/// the load or fixture units it carries and its derived flow.
pub fn tree_lines(sheet: &SheetFile, reports: &[impl AsRef<LineReport>]) -> Vec<String> {
    let tree = super::system::tree(&sheet.lines);
    if !tree.is_system() {
        return Vec::new();
    }
    let mut order: Vec<usize> = Vec::with_capacity(sheet.lines.len());
    fn walk(i: usize, tree: &super::system::Tree, order: &mut Vec<usize>) {
        order.push(i);
        for c in (0..tree.parent.len()).filter(|&c| tree.parent[c] == Some(i)) {
            walk(c, tree, order);
        }
    }
    for root in (0..sheet.lines.len()).filter(|&i| tree.parent[i].is_none()) {
        walk(root, &tree, &mut order);
    }
    order
        .into_iter()
        .map(|i| {
            let name = sheet.lines[i].name.trim();
            let what = match &reports[i].as_ref().outcome {
                Ok(o) if o.line.fluid.is_compressible() => {
                    kg_h(o.line.flow.value, o.sizing.properties.density_kg_m3(), 4)
                }
                Ok(o) => o.flow_text.clone().unwrap_or_else(|| {
                    show_flow(
                        o.line.flow.value,
                        sheet.units().flow,
                        Some(o.sizing.properties.density_kg_m3()),
                        Some(&o.line.fluid),
                        4,
                    )
                }),
                Err(_) => "no result (see the line)".to_owned(),
            };
            format!("{}{}: {}", "  ".repeat(tree.depth[i] + 1), if name.is_empty() { "(unnamed)" } else { name }, what)
        })
        .collect()
}

/// A fixed-width table for a terminal.
pub fn table(sheet: &SheetFile, reports: &[LineReport]) -> String {
    let u = sheet.units();
    let head = [
        "#",
        "line",
        "size",
        "bore",
        "velocity",
        "drop/length",
        "friction",
        "fittings",
        "components",
        "static",
        "total drop",
        "Re",
        "f",
        "least headroom",
        "headroom",
        "governed by",
    ];
    let mut rows: Vec<[String; COLUMNS]> = vec![head.map(String::from)];
    let mut notes = Vec::new();
    rows.extend(reports.iter().map(|r| table_row(r, &u, &mut notes)));
    let widths: Vec<usize> =
        (0..COLUMNS).map(|k| rows.iter().map(|r| r[k].chars().count()).max().unwrap_or(0)).collect();
    let mut out = String::new();
    if !sheet.project.is_empty() || !sheet.date.is_empty() {
        out.push_str(&format!("{}  {}\n\n", sheet.project, sheet.date));
    }
    out.push_str(circuit_note(&u));
    out.push_str("\n\n");
    for row in &rows {
        let cells: Vec<String> = row.iter().zip(&widths).map(|(c, w)| format!("{c:<w$}")).collect();
        out.push_str(cells.join("  ").trim_end());
        out.push('\n');
    }
    for n in notes {
        out.push_str(&format!("\n{n}"));
    }
    let system = system_lines(sheet, reports);
    if !system.is_empty() {
        out.push_str("\n\nSystem\nTree:\n");
        out.push_str(&tree_lines(sheet, reports).join("\n"));
        out.push('\n');
        out.push_str(&system.join("\n"));
    }
    out.push_str(&format!("\n\nCaution: {CAUTION}\n"));
    out
}

fn csv_field(s: &str) -> String {
    // Quote everything that could split a field, and defuse leading
    // characters that spreadsheets would run as a formula (OWASP, "CSV
    // Injection": =, +, -, @, tab and carriage return).
    let s = if s.starts_with(['=', '+', '-', '@', '\t', '\r']) && crate::sheet::number::float(s).is_none() {
        format!("'{s}")
    } else {
        s.to_owned()
    };
    if s.contains([',', '"', '\n', '\r', '\t']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s
    }
}

/// CSV: one row per line, the shown size.
pub fn csv(sheet: &SheetFile, reports: &[LineReport]) -> String {
    let u = sheet.units();
    let mut out = String::new();
    let p = u.pressure.symbol;
    out.push_str(&format!(
        "line,name,status,size,bore,velocity ({}),drop per length ({}),friction ({p}),fittings ({p}),components ({p}),\
         static ({p}),static in total,total drop ({p}),Re,f,regime,least headroom,headroom %,verdict,message\n",
        u.velocity.symbol, u.drop_per_length.symbol
    ));
    for r in reports {
        let name = csv_field(&r.name);
        match &r.outcome {
            Ok(o) => match o.shown {
                Some(i) => {
                    let c = &o.sizing.candidates[i];
                    let rho = o.sizing.properties.density_kg_m3();
                    let pt = &c.point;
                    let bore_mm = pt.bore.value * 1e3;
                    let headroom = c
                        .binding
                        .and_then(|b| c.checks.iter().find(|k| k.limit == b))
                        .map(|k| Fixed(k.headroom * 100.0, 1).to_string())
                        .unwrap_or_default();
                    out.push_str(&format!(
                        "{},{name},{},{},{} mm,{},{},{},{},{},{},{},{},{},{},{},{},{headroom},{},{}\n",
                        r.number,
                        status_words(o, c),
                        csv_field(&designation(&o.line, c.nominal)),
                        format_number(bore_mm, 5),
                        conv(pt.velocity.value, u.velocity, rho, 4),
                        conv(pt.drop_per_length.value, u.drop_per_length, rho, 4),
                        conv(pt.friction_drop.value, u.pressure, rho, 4),
                        conv(pt.fittings_drop.value, u.pressure, rho, 4),
                        conv(pt.components_drop.value, u.pressure, rho, 4),
                        conv(pt.static_drop.value, u.pressure, rho, 4),
                        if u.basis.circuit == Circuit::Open { "yes" } else { "no" },
                        conv(pt.total_drop.value, u.pressure, rho, 4),
                        format_number(pt.reynolds, 5),
                        format_number(pt.friction_factor, 5),
                        regime_name(pt.regime),
                        c.binding.map(|b| b.name()).unwrap_or(""),
                        csv_field(&o.verdict),
                        csv_field(
                            &o.figures
                                .iter()
                                .map(|f| f.ends.clone())
                                .filter(|e| !e.is_empty())
                                .chain(o.sizing.warnings.iter().cloned())
                                .collect::<Vec<_>>()
                                .join("; ")
                        ),
                    ));
                }
                None => {
                    out.push_str(&format!(
                        "{},{name},no size meets the limits,,,,,,,,,,,,,,,,{},{}\n",
                        r.number,
                        csv_field(&o.verdict),
                        csv_field(&o.sizing.warnings.join("; "))
                    ));
                }
            },
            Err(errs) => {
                let msg: Vec<String> = errs.iter().map(|e| e.to_string()).collect();
                out.push_str(&format!("{},{name},error,,,,,,,,,,,,,,,,,{}\n", r.number, csv_field(&msg.join("; "))));
            }
        }
    }
    for l in system_lines(sheet, reports) {
        out.push_str(&format!("# {}\n", l.trim()));
    }
    out.push_str(&format!("# {}\n# {CAUTION}\n", circuit_note(&u)));
    out
}

#[derive(Serialize)]
struct JsonCandidate<'a> {
    size: &'a str,
    bore_m: f64,
    velocity_m_s: f64,
    reynolds: f64,
    relative_roughness: f64,
    regime: &'static str,
    friction_factor: f64,
    drop_per_length_pa_m: f64,
    friction_drop_pa: f64,
    fittings_drop_pa: f64,
    components_drop_pa: f64,
    static_drop_pa: f64,
    total_drop_pa: f64,
    meets_limits: bool,
    skipped: Option<&'static str>,
    binding_limit: Option<&'static str>,
    headroom: Vec<(&'static str, f64)>,
    /// Gas and steam lines: the outlet by the isothermal equation.
    #[serde(skip_serializing_if = "Option::is_none")]
    outlet: Option<JsonOutlet>,
}

#[derive(Serialize)]
struct JsonOutlet {
    equation: &'static str,
    inlet_pressure_pa: f64,
    outlet_pressure_pa: f64,
    outlet_density_kg_m3: f64,
    outlet_velocity_m_s: f64,
    share_of_choking_flow: f64,
    choked: bool,
}

#[derive(Serialize)]
struct JsonLine<'a> {
    line: usize,
    name: &'a str,
    errors: Vec<String>,
    flow_m3_s: Option<f64>,
    flow_from_load: bool,
    density_kg_m3: Option<f64>,
    viscosity_pa_s: Option<f64>,
    proposed_size: Option<&'a str>,
    checked_size: Option<&'a str>,
    failing_at_largest: Vec<&'static str>,
    capacity_m3_s: Option<f64>,
    verdict: Option<String>,
    governed_by: Option<&'static str>,
    warnings: Vec<String>,
    candidates: Vec<JsonCandidate<'a>>,
}

#[derive(Serialize)]
struct JsonReport<'a> {
    format: &'static str,
    version: u32,
    project: &'a str,
    date: &'a str,
    caution: &'static str,
    circuit: &'static str,
    static_in_total: bool,
    system: Vec<String>,
    pump_head_pa: Option<f64>,
    pump_flow_m3_s: Option<f64>,
    index_circuit: Vec<usize>,
    system_curve_static_pa: Option<f64>,
    system_curve_k_pa_s2_m6: Option<f64>,
    residual_pressures: Vec<JsonResidual>,
    pump_operating_flow_m3_s: Option<f64>,
    pump_operating_head_pa: Option<f64>,
    npsh_available_m: Option<f64>,
    lines: Vec<JsonLine<'a>>,
}

#[derive(Serialize)]
struct JsonResidual {
    line: usize,
    pressure_pa: f64,
    below_outlet_minimum: bool,
    complete: bool,
}

/// JSON: every candidate of every line, in SI units.
pub fn json(sheet: &SheetFile, reports: &[LineReport]) -> String {
    let lines = reports
        .iter()
        .map(|r| match &r.outcome {
            Ok(o) => JsonLine {
                line: r.number,
                name: &r.name,
                errors: Vec::new(),
                flow_m3_s: Some(o.line.flow.value),
                flow_from_load: o.flow_text.is_some(),
                density_kg_m3: Some(o.sizing.properties.density_kg_m3()),
                viscosity_pa_s: Some(o.sizing.properties.viscosity_pa_s()),
                proposed_size: o.sizing.proposal().map(|c| c.nominal),
                checked_size: if o.checked { o.shown.map(|i| o.sizing.candidates[i].nominal) } else { None },
                failing_at_largest: o.sizing.failing_at_largest.iter().map(|l| l.id()).collect(),
                capacity_m3_s: o.capacity.and_then(|c| c.max_flow).map(|q| q.value),
                verdict: Some(o.verdict.clone()),
                governed_by: match &o.sizing.verdict {
                    Verdict::Proposed { below: Some(b), .. } => Some(b.check.limit.id()),
                    _ => None,
                },
                warnings: o.sizing.warnings.clone(),
                candidates: o
                    .sizing
                    .candidates
                    .iter()
                    .map(|c| JsonCandidate {
                        size: c.nominal,
                        bore_m: c.point.bore.value,
                        velocity_m_s: c.point.velocity.value,
                        reynolds: c.point.reynolds,
                        relative_roughness: c.point.relative_roughness,
                        regime: regime_name(c.point.regime),
                        friction_factor: c.point.friction_factor,
                        drop_per_length_pa_m: c.point.drop_per_length.value,
                        friction_drop_pa: c.point.friction_drop.value,
                        fittings_drop_pa: c.point.fittings_drop.value,
                        components_drop_pa: c.point.components_drop.value,
                        static_drop_pa: c.point.static_drop.value,
                        total_drop_pa: c.point.total_drop.value,
                        meets_limits: c.passes(),
                        skipped: c.skipped.map(|k| k.reason()),
                        binding_limit: c.binding.map(|b| b.id()),
                        headroom: c.checks.iter().map(|k| (k.limit.id(), k.headroom)).collect(),
                        outlet: c.point.gas.map(|g| JsonOutlet {
                            equation: "isothermal compressible flow (Crane TP-410)",
                            inlet_pressure_pa: g.inlet_pressure,
                            outlet_pressure_pa: g.outlet_pressure,
                            outlet_density_kg_m3: g.outlet_density,
                            outlet_velocity_m_s: g.outlet_velocity,
                            share_of_choking_flow: g.choke_ratio,
                            choked: g.choked,
                        }),
                    })
                    .collect(),
            },
            Err(errs) => JsonLine {
                line: r.number,
                name: &r.name,
                errors: errs.iter().map(|e| e.to_string()).collect(),
                flow_m3_s: None,
                flow_from_load: false,
                density_kg_m3: None,
                viscosity_pa_s: None,
                proposed_size: None,
                checked_size: None,
                failing_at_largest: Vec::new(),
                capacity_m3_s: None,
                verdict: None,
                governed_by: None,
                warnings: Vec::new(),
                candidates: Vec::new(),
            },
        })
        .collect();
    let tree = super::system::tree(&sheet.lines);
    let summary = tree.is_system().then(|| super::system::summarise(&tree, reports, &sheet.units(), &sheet.system));
    let report = JsonReport {
        format: "headroom-results",
        version: 1,
        project: &sheet.project,
        date: &sheet.date,
        caution: CAUTION,
        circuit: sheet.basis.circuit.id(),
        static_in_total: sheet.basis.circuit == Circuit::Open,
        system: system_lines(sheet, reports),
        pump_head_pa: summary.as_ref().and_then(|s| s.head_pa),
        pump_flow_m3_s: summary.as_ref().and_then(|s| s.flow_m3_s),
        index_circuit: summary
            .as_ref()
            .and_then(|s| s.paths.first())
            .map(|p| p.lines.iter().rev().map(|i| i + 1).collect())
            .unwrap_or_default(),
        system_curve_static_pa: summary.as_ref().and_then(|s| s.curve).map(|c| c.static_pa),
        system_curve_k_pa_s2_m6: summary.as_ref().and_then(|s| s.curve).map(|c| c.k),
        residual_pressures: summary
            .as_ref()
            .map(|s| {
                s.residuals
                    .iter()
                    .map(|r| JsonResidual {
                        line: r.end + 1,
                        pressure_pa: r.pressure_pa,
                        below_outlet_minimum: r.short(s.outlet_min_pa),
                        complete: r.complete,
                    })
                    .collect()
            })
            .unwrap_or_default(),
        pump_operating_flow_m3_s: summary.as_ref().and_then(|s| s.operating).map(|o| o.0),
        pump_operating_head_pa: summary.as_ref().and_then(|s| s.operating).map(|o| o.1),
        npsh_available_m: summary.as_ref().and_then(|s| s.npsh).map(|n| n.0),
        lines,
    };
    super::file::pretty_json(&report)
}
