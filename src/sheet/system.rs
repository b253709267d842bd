//! Lines joined into a system: each line may name the line it is fed from,
//! the lines then form a tree (or several, one per source); heat loads on
//! the branches add up to every line upstream; and the drop along each path
//! from a source to an end line gives the index circuit — the worst path,
//! whose drop is the pump head.
//!
//! - A line fed from a missing line, from itself, from a name two lines
//!   share, or in a circle of lines feeding each other, is reported by name
//!   and treated as a source; nothing typed is changed.
//! - Loads accumulate only through lines whose flow comes from a heat load:
//!   Φ = own Φ + diversity × Σ branches' Φ (a line's diversity is the
//!   user's choice, 1 when blank; it reduces what its branches bring, not its
//!   own load). A line with a typed flow keeps that flow; its load-less
//!   flow does not reach the lines above it, and they say so.
//! - Fixtures accumulate the same way through lines whose flow comes from
//!   fixtures: the counts of each kind add up, each line reads them in its
//!   own supply's column (cold, hot or total) and takes its flow from its
//!   total units by the sheet's demand method — never by adding the
//!   branches' flows. No diversity applies: the method is already a
//!   probability. A continuous flow (circulation, irrigation) adds to its
//!   own line only: each line is given the continuous flow that passes
//!   through it (a circulation flow returns to the heater, so it must not
//!   be carried up the cold tree).
//!   A fixture is listed once on each supply it draws from: a basin in the
//!   cold branch and again in the hot one. A line on the combined supply
//!   (the main before the heater is fed) counts it once, the more of its
//!   cold and hot listings; a cold line counts only the cold listings, a
//!   hot line (the heater's feed, the hot tree) only the hot ones.
//! - Closed loop: the pump head is friction, fittings and components along
//!   the index circuit, on the flow run and — unless the sheet says the
//!   return is entered as lines of its own — once more for a return that
//!   mirrors it (common practice for a two-pipe system drawn flow-only);
//!   the static part is left out. Open system: the drops include the rise.

use super::file::SystemFile;
use super::file::{Circuit, FixturesFile, LineFile, LoadFile, ReturnRun, Units};
use crate::hydraulics::demand::{self, Method};
use crate::hydraulics::field::Field;
use crate::hydraulics::fluid::{water, Fluid};
use crate::hydraulics::pump::{self, PumpCurve, SystemCurve};

/// What joining lines reads of a line: its name, what it is fed from, its
/// load and diversity. The page keeps one per line in a memo, so an edit
/// to anything else does not re-join the sheet.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Joint {
    /// The line's name.
    pub name: String,
    /// The name of the line it is fed from.
    pub fed_from: Option<String>,
    /// Its heat load, when its flow comes from one.
    pub load: Option<LoadFile>,
    /// Diversity on its branches' loads, as typed.
    pub diversity: Option<String>,
    /// Its fixtures, when its flow comes from them.
    pub fixtures: Option<FixturesFile>,
}

impl Joint {
    /// The joint of a stored line.
    pub fn of(l: &LineFile) -> Joint {
        Joint {
            name: l.name.clone(),
            fed_from: l.fed_from.clone(),
            load: l.load.clone(),
            diversity: l.diversity.clone(),
            fixtures: l.fixtures.clone(),
        }
    }
}
use super::number::parse_decimal;
use super::order::{order_by, sorted_by};
use super::report::LineReport;
use super::units::{self, Dimension};

/// How the lines join.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Tree {
    /// Each line's parent (index), `None` for a source.
    pub parent: Vec<Option<usize>>,
    /// Each line's depth below its source (0 for a source).
    pub depth: Vec<usize>,
    /// Problems with `fed_from`, by line index.
    pub problems: Vec<(usize, String)>,
}

impl Tree {
    /// True when any line names the line it is fed from.
    pub fn is_system(&self) -> bool {
        self.parent.iter().any(Option::is_some)
    }

    /// The lines nothing is fed from.
    pub fn ends(&self) -> Vec<usize> {
        let mut has_child = vec![false; self.parent.len()];
        for p in self.parent.iter().flatten() {
            has_child[*p] = true;
        }
        (0..self.parent.len()).filter(|&i| !has_child[i]).collect()
    }

    /// The path from line `end` up to its source, end first.
    pub fn path(&self, end: usize) -> Vec<usize> {
        let mut out = vec![end];
        let mut at = end;
        while let Some(p) = self.parent[at] {
            out.push(p);
            at = p;
            if out.len() > self.parent.len() {
                break; // cannot happen once cycles are cut; a guard all the same
            }
        }
        out
    }
}

fn display(name: &str, i: usize) -> String {
    if name.trim().is_empty() {
        format!("line {}", i + 1)
    } else {
        format!("“{}”", name.trim())
    }
}

/// Joins the lines by their `fed_from` names.
pub fn tree(lines: &[LineFile]) -> Tree {
    tree_of(&lines.iter().map(Joint::of).collect::<Vec<_>>())
}

/// As [`tree`], from the lines' joints.
pub fn tree_of(lines: &[Joint]) -> Tree {
    let n = lines.len();
    let mut parent = vec![None; n];
    let mut problems = Vec::new();
    // The lines in the order of their names, so the lines of one name sit
    // together and are found by halving (not a hash map: std's would bring
    // its hasher into the page's module for this one use).
    let names: Vec<&str> = lines.iter().map(|l| l.name.trim()).collect();
    let by_name = order_by(n, &|a, b| names[a].cmp(names[b]));
    let named = |from: &str| {
        let first = by_name.partition_point(|&i| names[i] < from);
        let past = by_name.partition_point(|&i| names[i] <= from);
        &by_name[first..past]
    };
    for (i, l) in lines.iter().enumerate() {
        let Some(from) = l.fed_from.as_deref().map(str::trim).filter(|t| !t.is_empty()) else { continue };
        match named(from) {
            [] => problems.push((i, format!("no line is named “{from}” to feed this one"))),
            [j] if *j == i => problems.push((i, "a line cannot be fed from itself".to_owned())),
            [j] => parent[i] = Some(*j),
            _ => problems.push((i, format!("more than one line is named “{from}”: rename one so it is clear"))),
        }
    }
    // Cut circles: walk up from each line; a line met twice is in a circle.
    for start in 0..n {
        let mut seen = vec![start];
        let mut at = start;
        while let Some(p) = parent[at] {
            if let Some(k) = seen.iter().position(|&s| s == p) {
                let circle: Vec<usize> = seen[k..].to_vec();
                let names: Vec<String> = circle.iter().map(|&c| display(&lines[c].name, c)).collect();
                for &c in &circle {
                    problems.push((
                        c,
                        format!("lines feed each other in a circle: {} → back to the first", names.join(" → ")),
                    ));
                    parent[c] = None;
                }
                break;
            }
            seen.push(p);
            at = p;
        }
    }
    let depth = (0..n)
        .map(|i| {
            let mut d = 0;
            let mut at = i;
            while let Some(p) = parent[at] {
                d += 1;
                at = p;
                if d > n {
                    break;
                }
            }
            d
        })
        .collect();
    Tree { parent, depth, problems }
}

/// A line's own heat load in W (0 when left blank or wrong: the line's own
/// evaluation reports a wrong one), or `None` for a line with a typed flow.
fn own_load(l: &Joint, u: &Units) -> Option<f64> {
    let load = l.load.as_ref()?;
    let t = load.power.trim();
    if t.is_empty() {
        return Some(0.0);
    }
    Some(
        units::parse(Dimension::Power, t, u.power)
            .ok()
            .and_then(|m| m.to_si(None).ok())
            .filter(|p| p.is_finite() && *p >= 0.0)
            .unwrap_or(0.0),
    )
}

/// A line's diversity factor, 1 when blank or out of (0, 1].
pub fn diversity(l: &LineFile) -> f64 {
    diversity_of(l.diversity.as_deref())
}

fn diversity_of(text: Option<&str>) -> f64 {
    text.map(str::trim)
        .filter(|t| !t.is_empty())
        .and_then(|t| parse_decimal(t).ok())
        .filter(|d| d.is_finite() && *d > 0.0 && *d <= 1.0)
        .unwrap_or(1.0)
}

/// What a line carries for the lines below it.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Carried {
    /// Φ the line's flow is derived from, W (own + diversity × branches).
    pub load_w: f64,
    /// How much of it its branches bring (before diversity), W.
    pub from_branches_w: f64,
    /// Branches whose flow is typed (so not in the load above).
    pub typed_branches: usize,
    /// Fixture units the flow is derived from (own + branches), in the
    /// line's own supply column; 0 for a load-driven line.
    pub fixture_units: f64,
    /// How many of them its branches bring.
    pub units_from_branches: f64,
    /// The largest single fixture's units among them.
    pub largest_unit: f64,
    /// Continuous flow added to the probable demand, m³/s (the line's own:
    /// continuous flows are not carried up the tree).
    pub continuous_m3_s: f64,
}

impl Carried {
    /// True when the line has branches that bring something.
    pub fn has_branches(&self) -> bool {
        self.from_branches_w > 0.0 || self.typed_branches > 0 || self.units_from_branches > 0.0
    }
}

fn count_of(t: &str) -> f64 {
    parse_decimal(t.trim()).ok().filter(|c| c.is_finite() && *c >= 0.0 && c.fract() == 0.0).unwrap_or(0.0)
}

/// Counts of each kind of the method a line lists (0 for a wrong count or
/// kind: the line's own evaluation reports it), and its continuous flow.
fn own_fixtures(l: &Joint, u: &Units) -> Option<(Vec<f64>, f64)> {
    let fx = l.fixtures.as_ref()?;
    let kinds = u.basis.demand.kinds();
    let mut counts = vec![0.0; kinds.len()];
    for item in &fx.items {
        if let Some(k) = kinds.iter().position(|k| k.id == item.kind) {
            counts[k] += count_of(&item.count);
        }
    }
    let continuous = continuous_flow(fx, u).unwrap_or(0.0);
    Some((counts, continuous))
}

/// A line's continuous flow, m³/s, when typed and right.
pub fn continuous_flow(fx: &FixturesFile, u: &Units) -> Option<f64> {
    let t = fx.continuous.trim();
    if t.is_empty() {
        return Some(0.0);
    }
    units::parse(Dimension::Flow, t, u.flow)
        .ok()
        .and_then(|m| m.to_si(None).ok())
        .filter(|q| q.is_finite() && *q >= 0.0)
}

/// What a fixture line's flow comes from: its units (own and its
/// branches'), how many its branches bring, and its continuous flow, m³/s.
pub fn fixture_totals(l: &LineFile, u: &Units, carried: Option<&Carried>) -> Option<(f64, f64, f64)> {
    let fx = l.fixtures.as_ref().filter(|_| l.load.is_none())?;
    match carried.filter(|c| c.has_branches()) {
        Some(c) => Some((c.fixture_units, c.units_from_branches, c.continuous_m3_s)),
        None => {
            let (counts, q) = own_fixtures(&Joint::of(l), u)?;
            Some((units_of(&counts, u.basis.demand, fx.supply).0, 0.0, q))
        }
    }
}

/// Fixture counts by kind, kept apart by the supply of the line that
/// lists them: combined, cold, hot.
pub type Listed = [Vec<f64>; 3];

fn slot(s: demand::Supply) -> usize {
    match s {
        demand::Supply::Total => 0,
        demand::Supply::Cold => 1,
        demand::Supply::Hot => 2,
    }
}

/// The counts a line on `supply` carries. On the combined supply each
/// fixture counts once — the more of its cold and its hot listings (a
/// basin listed in the cold tree and again in the hot one is one basin) —
/// plus those listed on the combined supply; on one supply, its own
/// listings plus the combined ones.
pub fn effective(listed: &Listed, supply: demand::Supply) -> Vec<f64> {
    let [total, cold, hot] = listed;
    match supply {
        demand::Supply::Total => total.iter().zip(cold.iter().zip(hot)).map(|(t, (c, h))| t + c.max(*h)).collect(),
        demand::Supply::Cold => total.iter().zip(cold).map(|(t, c)| t + c).collect(),
        demand::Supply::Hot => total.iter().zip(hot).map(|(t, h)| t + h).collect(),
    }
}

/// Units and largest single unit of so many fixtures of each kind, read in
/// a supply's column.
pub fn units_of(counts: &[f64], method: Method, supply: demand::Supply) -> (f64, f64) {
    method.kinds().iter().zip(counts).fold((0.0, 0.0), |(sum, big), (k, &n)| {
        let each = k.units(supply);
        (sum + n * each, if n > 0.0 { big.max(each) } else { big })
    })
}

/// The heat load each load-driven line's flow comes from; `None` for lines
/// with a typed flow. Lines with no branches carry their own load.
pub fn carried(lines: &[LineFile], tree: &Tree, u: &Units) -> Vec<Option<Carried>> {
    carried_of(&lines.iter().map(Joint::of).collect::<Vec<_>>(), tree, u)
}

/// As [`carried`], from the lines' joints.
pub fn carried_of(lines: &[Joint], tree: &Tree, u: &Units) -> Vec<Option<Carried>> {
    let n = lines.len();
    // Deepest first, so every branch is done before its parent.
    let order = order_by(n, &|a, b| tree.depth[b].cmp(&tree.depth[a]));
    let method = u.basis.demand;
    let fixtures: Vec<Option<(Vec<f64>, f64)>> = lines.iter().map(|l| own_fixtures(l, u)).collect();
    let mut out: Vec<Option<Carried>> = lines
        .iter()
        .zip(&fixtures)
        .map(|(l, f)| match (own_load(l, u), f) {
            (Some(w), _) => Some(Carried { load_w: w, ..Carried::default() }),
            (None, Some(_)) => Some(Carried::default()),
            (None, None) => None,
        })
        .collect();
    let kinds = method.kinds().len();
    let mut branches_w = vec![0.0; n];
    let mut branch_counts: Vec<Listed> = vec![Default::default(); n];
    for b in &mut branch_counts {
        *b = [vec![0.0; kinds], vec![0.0; kinds], vec![0.0; kinds]];
    }
    let mut typed = vec![0usize; n];
    // What each fixture line passes up: its counts and continuous flow.
    let mut passed: Vec<Option<(Listed, f64)>> = vec![None; n];
    for &i in &order {
        let is_fixture = lines[i].load.is_none() && fixtures[i].is_some();
        if let Some(c) = out[i].as_mut() {
            c.from_branches_w = branches_w[i];
            c.typed_branches = typed[i];
            c.load_w += diversity_of(lines[i].diversity.as_deref()) * branches_w[i];
            if let (true, Some((own, own_q))) = (is_fixture, &fixtures[i]) {
                let supply = lines[i].fixtures.as_ref().map(|f| f.supply).unwrap_or_default();
                let mut all = branch_counts[i].clone();
                for (a, b) in all[slot(supply)].iter_mut().zip(own) {
                    *a += b;
                }
                let (total, largest) = units_of(&effective(&all, supply), method, supply);
                let (from_branches, _) = units_of(&effective(&branch_counts[i], supply), method, supply);
                c.fixture_units = total;
                c.units_from_branches = from_branches;
                c.largest_unit = largest;
                c.continuous_m3_s = *own_q;
                passed[i] = Some((all, c.continuous_m3_s));
            }
        }
        if let Some(p) = tree.parent[i] {
            // Loads go up to load lines, fixtures to fixture lines; any
            // other branch is counted as not included.
            let parent_fixture = lines[p].load.is_none() && fixtures[p].is_some();
            match (&passed[i], out[i]) {
                (Some((counts, _)), _) if parent_fixture => {
                    for (to, from) in branch_counts[p].iter_mut().zip(counts) {
                        for (a, b) in to.iter_mut().zip(from) {
                            *a += b;
                        }
                    }
                }
                (None, Some(c)) if !parent_fixture && lines[i].load.is_some() => branches_w[p] += c.load_w,
                _ => typed[p] += 1,
            }
        }
    }
    out
}

/// One path from a source to an end line.
#[derive(Debug, Clone, PartialEq)]
pub struct Path {
    /// The lines, end first, source last.
    pub lines: Vec<usize>,
    /// Drop along it (flow run), Pa: friction, fittings, components, and
    /// the static part in an open system.
    pub drop_pa: f64,
    /// Static part along it, Pa (shown apart in a closed loop).
    pub static_pa: f64,
    /// False when a line on it has no result (an error): the drop is then
    /// not a pump head.
    pub complete: bool,
}

/// The system's answer.
#[derive(Debug, Clone, PartialEq)]
pub struct Summary {
    /// Every path, worst first.
    pub paths: Vec<Path>,
    /// The pump head, Pa: the index circuit's drop, twice in a closed loop
    /// whose return mirrors the flow run.
    pub head_pa: Option<f64>,
    /// Flow at the index circuit's source, m³/s.
    pub flow_m3_s: Option<f64>,
    /// Whether the head counts a mirrored return run.
    pub mirrored: bool,
    /// H = static + k·Q² through the duty point (static: the index
    /// circuit's rise in an open system, nil in a closed loop).
    pub curve: Option<SystemCurve>,
    /// Open system with a source pressure: the pressure left at each end
    /// line, worst first.
    pub residuals: Vec<Residual>,
    /// Open system: pressure at the source, Pa gauge.
    pub source_pa: Option<f64>,
    /// Open system: least pressure an outlet needs, Pa gauge.
    pub outlet_min_pa: Option<f64>,
    /// The pump curve, from three points.
    pub pump: Option<PumpCurve>,
    /// The points it was drawn through, (m³/s, Pa).
    pub pump_points: Vec<(f64, f64)>,
    /// Where the pump meets the system, (m³/s, Pa).
    pub operating: Option<(f64, f64)>,
    /// NPSH available at the pump inlet, m, and the vapour pressure used.
    pub npsh: Option<(f64, f64)>,
    /// What could not be read of the system settings, or does not add up.
    pub problems: Vec<(Field, String)>,
    /// Density of the fluid at the index circuit's source, kg/m³ (to show
    /// its flows in mass units).
    pub source_density: Option<f64>,
    /// The index circuit's source carries a gas or steam: its inlet
    /// pressure, Pa absolute (no pump duty, system curve or NPSH then).
    pub gas_inlet_pa: Option<f64>,
}

/// The pressure left at an end line.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Residual {
    /// The end line.
    pub end: usize,
    /// Source pressure less the drop along its path (rise included), Pa.
    pub pressure_pa: f64,
    /// False when a line on its path has no result.
    pub complete: bool,
}

impl Residual {
    /// True when it is below the least outlet pressure.
    pub fn short(&self, minimum_pa: Option<f64>) -> bool {
        self.pressure_pa < minimum_pa.unwrap_or(0.0)
    }
}

/// How a pressure typed in a system setting is read.
#[derive(Clone, Copy, PartialEq)]
enum Reading {
    /// As typed (a length, a flow, a drop, a head).
    AsTyped,
    /// Gauge: a unit marked gauge or absolute is turned to gauge.
    Gauge,
}

/// A system setting in SI, `None` when blank; a wrong one is added to
/// `problems`.
fn measure(
    field: Field,
    dim: Dimension,
    text: &str,
    unit: &'static units::Unit,
    rho: Option<f64>,
    reading: Reading,
    problems: &mut Vec<(Field, String)>,
) -> Option<f64> {
    let t = text.trim();
    if t.is_empty() {
        return None;
    }
    let read = units::parse(dim, t, unit).and_then(|m| {
        let si = m.to_si(rho)?;
        Ok(if reading == Reading::Gauge && m.unit.reference().is_some() { si - units::ATMOSPHERE_PA } else { si })
    });
    match read {
        Ok(v) if v.is_finite() => Some(v),
        Ok(_) => {
            problems.push((field, format!("{}: not a finite number", field.label())));
            None
        }
        Err(e) => {
            problems.push((field, format!("{}: {e}", field.label())));
            None
        }
    }
}

/// The paths from every end line to its source, worst first, and the pump
/// duty from the worst one (the index circuit).
pub fn summarise(tree: &Tree, reports: &[impl AsRef<LineReport>], u: &Units, sys: &SystemFile) -> Summary {
    let shown = |i: usize| {
        reports[i]
            .as_ref()
            .outcome
            .as_ref()
            .ok()
            // A quick check with no length has no total drop: its path is
            // incomplete rather than short.
            .filter(|o| o.length_given)
            .and_then(|o| o.shown.map(|k| (o.sizing.candidates[k].point, o.line.flow.value)))
    };
    let paths: Vec<Path> = tree
        .ends()
        .into_iter()
        .filter(|&e| tree.parent[e].is_some())
        .map(|e| {
            let lines = tree.path(e);
            let (mut drop_pa, mut static_pa, mut complete) = (0.0, 0.0, true);
            for &i in &lines {
                match shown(i) {
                    Some((p, _)) => {
                        drop_pa += p.total_drop.value;
                        static_pa += p.static_drop.value;
                    }
                    None => complete = false,
                }
            }
            Path { lines, drop_pa, static_pa, complete }
        })
        .collect();
    let paths = sorted_by(paths, &|a, b| b.drop_pa.total_cmp(&a.drop_pa));
    let mirrored = u.basis.circuit == Circuit::Closed && u.basis.return_run == ReturnRun::Mirrored;
    let index = paths.first().filter(|p| p.complete);
    let head_pa = index.map(|p| if mirrored { 2.0 * p.drop_pa } else { p.drop_pa });
    let flow_m3_s = index.and_then(|p| p.lines.last().and_then(|&s| shown(s)).map(|(_, q)| q));
    let open = u.basis.circuit == Circuit::Open;
    let mut problems = Vec::new();
    // The fluid at the source of the index circuit (or of any tree).
    let source = paths.first().and_then(|p| p.lines.last().copied());
    let at_source = source.and_then(|s| reports[s].as_ref().outcome.as_ref().ok());
    let rho = at_source.map(|o| o.sizing.properties.density_kg_m3());
    let gas_inlet_pa = at_source.filter(|o| o.line.fluid.is_compressible()).map(|o| o.line.pressure.value);
    let static_pa = if open { index.map_or(0.0, |p| p.static_pa) } else { 0.0 };
    let curve = match (flow_m3_s, head_pa, gas_inlet_pa) {
        (Some(q), Some(h), None) => SystemCurve::through(static_pa, q, h),
        _ => None,
    };
    let (source_pa, outlet_min_pa) = if open {
        (
            measure(
                Field::SourcePressure,
                Dimension::Pressure,
                &sys.source_pressure,
                u.pressure,
                rho,
                Reading::Gauge,
                &mut problems,
            ),
            measure(
                Field::OutletMinimum,
                Dimension::Pressure,
                &sys.outlet_minimum,
                u.pressure,
                rho,
                Reading::Gauge,
                &mut problems,
            ),
        )
    } else {
        (None, None)
    };
    let residuals: Vec<Residual> = match source_pa {
        Some(p0) => paths
            .iter()
            .map(|p| Residual { end: p.lines[0], pressure_pa: p0 - p.drop_pa, complete: p.complete })
            .collect(),
        None => Vec::new(),
    };
    let residuals = sorted_by(residuals, &|a, b| a.pressure_pa.total_cmp(&b.pressure_pa));
    let mut pump_points = Vec::new();
    for (i, pt) in sys.pump.iter().enumerate() {
        let q = measure(Field::PumpPoint, Dimension::Flow, &pt.flow, u.flow, rho, Reading::AsTyped, &mut problems);
        let h =
            measure(Field::PumpPoint, Dimension::Pressure, &pt.head, u.pressure, rho, Reading::AsTyped, &mut problems);
        match (q, h) {
            (Some(q), Some(h)) if q >= 0.0 && h > 0.0 => pump_points.push((q, h)),
            (Some(_), Some(_)) => problems
                .push((Field::PumpPoint, format!("pump curve point {}: flow from 0 and head above 0, please", i + 1))),
            _ => {}
        }
    }
    let pump = match pump_points.as_slice() {
        [a, b, c] => match PumpCurve::through([*a, *b, *c]) {
            Ok(c) => Some(c),
            Err(e) => {
                problems.push((Field::PumpPoint, e.to_string()));
                None
            }
        },
        [] => None,
        _ if sys.pump.iter().all(|p| !p.flow.trim().is_empty() && !p.head.trim().is_empty()) => {
            problems.push((Field::PumpPoint, "give three points of the pump curve to find where it runs".into()));
            None
        }
        _ => None,
    };
    let operating = match (pump, curve) {
        (Some(p), Some(c)) => {
            let q_max = 1.5 * pump_points.iter().map(|x| x.0).fold(0.0, f64::max);
            let found = pump::operating_point(&p, &c, q_max);
            if found.is_none() {
                problems.push((
                    Field::PumpPoint,
                    "the pump curve does not meet the system curve within its points: this pump cannot give the \
                     duty"
                        .into(),
                ));
            }
            found
        }
        _ => None,
    };
    let npsh = if gas_inlet_pa.is_some() { None } else { npsh_of(sys, u, at_source, &mut problems) };
    Summary {
        paths,
        head_pa,
        flow_m3_s,
        mirrored,
        curve,
        residuals,
        source_pa,
        outlet_min_pa,
        pump,
        pump_points,
        operating,
        npsh,
        problems,
        source_density: rho,
        gas_inlet_pa,
    }
}

/// NPSH available at the pump inlet, m, with the vapour pressure used:
/// water's saturation pressure at the source line's temperature
/// (IAPWS-IF97), also for glycol mixtures, whose vapour pressure is lower
/// (so the figure errs low, the safe side).
fn npsh_of(
    sys: &SystemFile,
    u: &Units,
    at_source: Option<&super::report::Outcome>,
    problems: &mut Vec<(Field, String)>,
) -> Option<(f64, f64)> {
    let s = &sys.suction;
    if s.pressure.trim().is_empty() {
        return None;
    }
    let o = at_source?;
    let rho = o.sizing.properties.density_kg_m3();
    // A plain unit is read as absolute here: the surface pressure is.
    let surface = measure(
        Field::SuctionPressure,
        Dimension::Pressure,
        &s.pressure,
        u.pressure,
        Some(rho),
        Reading::AsTyped,
        problems,
    )?;
    if surface <= 0.0 {
        problems.push((Field::SuctionPressure, "the suction surface pressure is absolute: above 0".into()));
        return None;
    }
    let height =
        measure(Field::SuctionHeight, Dimension::Length, &s.height, u.length, None, Reading::AsTyped, problems)
            .unwrap_or(0.0);
    let loss =
        measure(Field::SuctionLoss, Dimension::Pressure, &s.loss, u.pressure, Some(rho), Reading::AsTyped, problems)
            .unwrap_or(0.0);
    if !matches!(o.line.fluid, Fluid::Water | Fluid::GlycolMix(..)) {
        problems.push((
            Field::SuctionPressure,
            "NPSH needs a liquid's vapour pressure: known here for water and glycols only".into(),
        ));
        return None;
    }
    let pv = water::if97_saturation_pressure(o.line.temperature.value);
    Some((pump::npsh_available_m(surface, pv, rho, height, loss), pv))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sheet::file::SheetFile;

    fn lines(spec: &[(&str, Option<&str>)]) -> Vec<LineFile> {
        let json = format!(
            r#"{{"format":"headroom-sheet","version":2,"lines":[{}]}}"#,
            spec.iter()
                .map(|(n, f)| match f {
                    Some(f) => format!(r#"{{"name":"{n}","fed_from":"{f}","flow":"1","fluid":{{"kind":"water","temperature":"10"}},"pipe":{{"series":"steel-sch40"}}}}"#),
                    None => format!(r#"{{"name":"{n}","flow":"1","fluid":{{"kind":"water","temperature":"10"}},"pipe":{{"series":"steel-sch40"}}}}"#),
                })
                .collect::<Vec<_>>()
                .join(",")
        );
        SheetFile::from_json(&json).unwrap().lines
    }

    #[test]
    fn a_tree_joins_by_name_and_bad_references_are_named() {
        let l = lines(&[("main", None), ("riser", Some("main")), ("coil", Some("riser")), ("stray", Some("nowhere"))]);
        let t = tree(&l);
        assert_eq!(t.parent, vec![None, Some(0), Some(1), None]);
        assert_eq!(t.depth, vec![0, 1, 2, 0]);
        assert_eq!(t.path(2), vec![2, 1, 0]);
        assert_eq!(t.problems, vec![(3, "no line is named “nowhere” to feed this one".to_owned())]);
        let l = lines(&[("a", Some("b")), ("b", Some("c")), ("c", Some("a")), ("d", Some("d"))]);
        let t = tree(&l);
        assert_eq!(t.parent, vec![None; 4]);
        assert!(t.problems.iter().any(|(i, m)| *i == 0 && m.contains("circle") && m.contains("“a” → “b” → “c”")));
        assert!(t.problems.iter().any(|(i, m)| *i == 3 && m.contains("itself")));
        let l = lines(&[("a", None), ("a", None), ("b", Some("a"))]);
        assert!(tree(&l).problems[0].1.contains("more than one line is named “a”"));
    }
}
