//! The sizing search: every nominal size of the line's series, smallest
//! first, each judged against every limit; the answer is the smallest that
//! meets them all. Also check mode (one named size), capacity (the largest
//! flow each size can carry within the limits) and the explain trace.

use crate::hydraulics::digits::Fixed;
use uom::si::f64::{Length, Velocity, VolumeRate};
use uom::si::volume_rate::cubic_meter_per_second;

use super::fluid::Properties;
use super::friction::Regime;
use super::line::{Limit, Line, LineError, Method, Point, Valid};

/// One limit checked at one size.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Check {
    /// Which limit.
    pub limit: Limit,
    /// The line's value, SI (Pa/m, Pa or m/s).
    pub value: f64,
    /// The limit, SI.
    pub allowed: f64,
    /// Headroom as a fraction of the limit: positive inside, negative
    /// outside. For maxima (allowed − value)/allowed; for the minimum
    /// velocity (value − allowed)/allowed.
    pub headroom: f64,
}

impl Check {
    /// Whether the limit is met.
    pub fn met(&self) -> bool {
        self.headroom >= 0.0
    }
}

/// One nominal size evaluated.
#[derive(Debug, Clone, PartialEq)]
pub struct Candidate {
    /// Trade designation of the size.
    pub nominal: &'static str,
    /// Hydraulic state at the design flow.
    pub point: Point,
    /// Every limit the line has, checked.
    pub checks: Vec<Check>,
    /// The limit closest to failing (when all are met) or furthest broken.
    pub binding: Option<Limit>,
    /// Why the search passes over this size, if it does (it is still
    /// evaluated and shown, and check mode can pin it).
    pub skipped: Option<Skip>,
}

/// Why the search passes over a size.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Skip {
    /// Rarely stocked, and the sheet searches preferred sizes only.
    Rare,
    /// Below the line's smallest allowed size.
    BelowSmallest,
}

impl Skip {
    /// In words.
    pub fn reason(self) -> &'static str {
        match self {
            Skip::Rare => "rarely stocked (left out of the search)",
            Skip::BelowSmallest => "below the line's smallest size",
        }
    }
}

impl Candidate {
    /// True when every limit is met.
    pub fn passes(&self) -> bool {
        self.checks.iter().all(Check::met)
    }

    /// True when the friction factor is uncertain (transition zone).
    pub fn uncertain(&self) -> bool {
        self.point.regime == Regime::Transition
    }

    /// The limit it fails worst, with how far.
    pub fn worst_failure(&self) -> Option<&Check> {
        self.checks.iter().filter(|k| !k.met()).min_by(|a, b| a.headroom.total_cmp(&b.headroom))
    }
}

/// What the next size down fails: why the proposal is not smaller.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Shortfall {
    /// Index of that size in the candidates.
    pub index: usize,
    /// The limit it fails worst.
    pub check: Check,
}

/// The verdict on a line, in the words every output uses.
#[derive(Debug, Clone, PartialEq)]
pub enum Verdict {
    /// A size meets every limit.
    Proposed {
        /// Index of the proposed size.
        index: usize,
        /// What the next size searched below it fails; `None` when it is
        /// the smallest size searched.
        below: Option<Shortfall>,
    },
    /// Smaller sizes fail a maximum and larger ones the minimum velocity:
    /// no size meets both.
    Conflict {
        /// The largest size failing a maximum.
        max_up_to: usize,
        /// The maxima failed there.
        max_limits: Vec<Limit>,
        /// The smallest size failing the minimum velocity.
        min_from: usize,
    },
    /// The static rise alone takes more than the total-drop limit (an open
    /// system): no size can meet it.
    RiseExceedsTotal {
        /// ρ g Δz, Pa.
        static_drop: f64,
        /// The limit, Pa.
        allowed: f64,
    },
    /// Even the largest size searched fails these.
    TooSmall {
        /// The limits the largest searched size fails.
        failing: Vec<Limit>,
    },
}

/// The answer for one line.
#[derive(Debug, Clone, PartialEq)]
pub struct Sizing {
    /// Fluid properties used.
    pub properties: Properties,
    /// Every size, smallest first.
    pub candidates: Vec<Candidate>,
    /// Index into `candidates` of the proposed size, if any meets every limit.
    pub proposed: Option<usize>,
    /// When none does: the limits the largest size searched still fails.
    pub failing_at_largest: Vec<Limit>,
    /// The verdict with its reasons.
    pub verdict: Verdict,
    /// Cautions about the method and the answer for this line.
    pub warnings: Vec<String>,
}

impl Sizing {
    /// The proposed candidate.
    pub fn proposal(&self) -> Option<&Candidate> {
        self.proposed.map(|i| &self.candidates[i])
    }
}

/// Checks a point against the line's limits.
pub fn judge(line: &Line, p: &Point) -> (Vec<Check>, Option<Limit>) {
    let l = &line.limits;
    let mut checks = Vec::with_capacity(4);
    let max = |limit, value: f64, allowed: f64| Check { limit, value, allowed, headroom: (allowed - value) / allowed };
    if let Some(g) = l.max_drop_per_length {
        checks.push(max(Limit::DropPerLength, p.drop_per_length.value, g.value));
    }
    if let Some(dp) = l.max_total_drop {
        checks.push(max(Limit::TotalDrop, p.total_drop.value, dp.value));
    }
    let v_max = if l.velocity_by_size.is_some() {
        l.max_velocity_at(line.pipe.darby_diameter_in(p.bore), line.temperature.value - 273.15)
    } else {
        l.max_velocity.map(|v| v.value)
    };
    // A gas speeds up along the line: its largest velocity is the outlet's.
    let v_top = p.gas.map_or(p.velocity.value, |g| g.outlet_velocity);
    if let Some(v) = v_max {
        checks.push(max(Limit::MaxVelocity, v_top, v));
    }
    if let (Some(x), Some(g)) = (l.max_drop_fraction, p.gas) {
        checks.push(max(Limit::DropFraction, p.total_drop.value / g.inlet_pressure, x));
    }
    if let Some(v) = l.min_velocity {
        checks.push(Check {
            limit: Limit::MinVelocity,
            value: p.velocity.value,
            allowed: v.value,
            headroom: (p.velocity.value - v.value) / v.value,
        });
    }
    if let Some(g) = p.gas {
        checks.push(max(Limit::Choking, g.choke_ratio, 1.0));
    }
    let binding = checks.iter().min_by(|a, b| a.headroom.total_cmp(&b.headroom)).map(|c| c.limit);
    (checks, binding)
}

fn candidate(line: &Line, props: &Properties, nominal: &'static str, bore: Length) -> Candidate {
    let point = line.point(props, bore, line.flow);
    let (checks, binding) = judge(line, &point);
    Candidate { nominal, point, checks, binding, skipped: None }
}

/// Marks the sizes the search passes over.
fn mark_skipped(line: &Line, candidates: &mut [Candidate]) {
    let floor = line.smallest.and_then(|n| candidates.iter().position(|c| c.nominal == n)).unwrap_or(0);
    for (i, c) in candidates.iter_mut().enumerate() {
        c.skipped = if i < floor {
            Some(Skip::BelowSmallest)
        } else if !line.every_size && line.pipe.is_rare(c.nominal) {
            Some(Skip::Rare)
        } else {
            None
        };
    }
}

/// The verdict over evaluated candidates (those skipped left out).
fn verdict(line: &Line, candidates: &[Candidate]) -> Verdict {
    let searched: Vec<usize> = (0..candidates.len()).filter(|&i| candidates[i].skipped.is_none()).collect();
    if let Some(pos) = searched.iter().position(|&i| candidates[i].passes()) {
        let index = searched[pos];
        let below = pos
            .checked_sub(1)
            .map(|p| searched[p])
            .and_then(|i| candidates[i].worst_failure().map(|k| Shortfall { index: i, check: *k }));
        return Verdict::Proposed { index, below };
    }
    if let (Some(dp), Line { circuit: super::line::Circuit::Open, .. }) = (line.limits.max_total_drop, line) {
        if let Some(c) = candidates.first() {
            if c.point.static_drop.value > dp.value {
                return Verdict::RiseExceedsTotal { static_drop: c.point.static_drop.value, allowed: dp.value };
            }
        }
    }
    let fails_max = |i: usize| {
        candidates[i].checks.iter().filter(|k| !k.met() && k.limit != Limit::MinVelocity).map(|k| k.limit).collect()
    };
    let fails_min = |i: usize| candidates[i].checks.iter().any(|k| !k.met() && k.limit == Limit::MinVelocity);
    let max_up_to = searched.iter().rev().copied().find(|&i| !Vec::<Limit>::is_empty(&fails_max(i)));
    let min_from = searched.iter().copied().find(|&i| fails_min(i));
    match (max_up_to, min_from) {
        (Some(hi), Some(lo)) => Verdict::Conflict { max_up_to: hi, max_limits: fails_max(hi), min_from: lo },
        _ => Verdict::TooSmall {
            failing: searched
                .last()
                .map(|&i| candidates[i].checks.iter().filter(|k| !k.met()).map(|k| k.limit).collect())
                .unwrap_or_default(),
        },
    }
}

/// How many sizing solves (searches, checks, capacity solves, traces) have
/// run in this process: instrumentation, so tests can show that drawing a
/// result runs none.
pub static SOLVES: std::sync::atomic::AtomicUsize = std::sync::atomic::AtomicUsize::new(0);

fn count_solve() {
    SOLVES.fetch_add(1, std::sync::atomic::Ordering::Relaxed);
}

/// Past this share of the inlet pressure the isothermal equation is
/// outside its use (Crane TP-410's guidance, as the issue of record puts
/// it: about 40 %).
pub const OUTSIDE_METHOD: f64 = 0.4;

/// Evaluates every size and proposes the smallest that meets every limit.
///
/// # Errors
/// A [`LineError`] for input the core cannot work with.
pub fn size(line: &Valid) -> Result<Sizing, LineError> {
    count_solve();
    let props = line.properties();
    let mut candidates: Vec<Candidate> =
        line.pipe.bores().into_iter().map(|(n, d)| candidate(line, &props, n, d)).collect();
    mark_skipped(line, &mut candidates);
    let finite = candidates.iter().all(|c| {
        let p = &c.point;
        [p.velocity.value, p.reynolds, p.friction_factor, p.drop_per_length.value, p.total_drop.value, p.sum_k]
            .iter()
            .all(|v| v.is_finite())
            && c.checks.iter().all(|k| k.headroom.is_finite())
    });
    if !finite {
        return Err(LineError::NotComputable);
    }
    let verdict = verdict(line, &candidates);
    let proposed = match verdict {
        Verdict::Proposed { index, .. } => Some(index),
        _ => None,
    };
    let failing_at_largest = match &verdict {
        Verdict::Proposed { .. } => Vec::new(),
        _ => candidates
            .iter()
            .rev()
            .find(|c| c.skipped.is_none())
            .map(|c| c.checks.iter().filter(|k| !k.met()).map(|k| k.limit).collect())
            .unwrap_or_default(),
    };
    let mut warnings: Vec<String> = line.method_warnings().into_iter().map(String::from).collect();
    if let Some(c) = proposed.map(|i| &candidates[i]) {
        let p = &c.point;
        if let Some(g) = p.gas.filter(|g| g.fraction() > OUTSIDE_METHOD) {
            warnings.push(format!(
                "the drop is {} % of the inlet pressure: past about 40 % the isothermal equation is outside its \
                 use (the gas cools and may approach sonic speed); treat this answer as indicative only",
                Fixed(g.fraction() * 100.0, 0)
            ));
        }
        if p.static_drop.value < 0.0
            && line.circuit == super::line::Circuit::Open
            && line.limits.max_total_drop.is_some()
        {
            warnings.push(format!(
                "the line falls {} m: the fall gives back {} Pa, which the total drop counts; friction and \
                 fittings alone take {} Pa",
                Fixed(-line.rise.value, 3),
                Fixed(-p.static_drop.value, 0),
                Fixed(p.friction_drop.value + p.fittings_drop.value, 0)
            ));
        }
    }
    if let Some(freezing_c) = line.fluid.freezing_point_c() {
        warnings.push(format!(
            "{} K above the mixture's freezing point ({} °C)",
            Fixed(line.temperature.get::<uom::si::thermodynamic_temperature::degree_celsius>() - freezing_c, 1),
            Fixed(freezing_c, 1)
        ));
    }
    Ok(Sizing { properties: props, candidates, proposed, failing_at_largest, verdict, warnings })
}

/// Check mode: the results at one named size.
///
/// # Errors
/// A [`LineError`] for bad input; `Ok(None)` when the series has no such size.
pub fn check(line: &Valid, nominal: &str) -> Result<Option<Candidate>, LineError> {
    count_solve();
    let props = line.properties();
    Ok(line.pipe.bores().into_iter().find(|(n, _)| *n == nominal).map(|(n, d)| candidate(line, &props, n, d)))
}

/// The largest flow a bore can carry within the line's maximum limits.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Capacity {
    /// The flow; `None` when the line sets no maximum limit at all.
    pub max_flow: Option<VolumeRate>,
    /// The limit reached at that flow.
    pub limited_by: Option<Limit>,
}

/// Largest `q` in [0, ∞) with `g(q) ≤ 0`, for `g` non-decreasing with
/// `g(0) ≤ 0`: expands a bracket by doubling, then bisects (with a secant
/// guess when it falls inside the bracket) to a relative width of 1e-12.
/// Returns the low end, which always satisfies the limit; `g` may jump (the
/// laminar–turbulent switch), which bisection handles where secant alone
/// would not.
fn largest_within(mut g: impl FnMut(f64) -> f64, start: f64) -> Option<f64> {
    let (mut lo, mut glo) = (0.0, g(0.0));
    if glo > 0.0 {
        return Some(0.0);
    }
    let mut hi = start.max(1e-12);
    let mut ghi = g(hi);
    let mut expansions = 0;
    while ghi <= 0.0 {
        lo = hi;
        glo = ghi;
        hi *= 2.0;
        ghi = g(hi);
        expansions += 1;
        if expansions > 200 || !ghi.is_finite() {
            return None;
        }
    }
    for _ in 0..200 {
        if hi - lo <= 1e-12 * hi {
            break;
        }
        let secant = lo - glo * (hi - lo) / (ghi - glo);
        let mid = 0.5 * (lo + hi);
        // Alternate: take the secant guess only if it lands well inside.
        let x = if secant.is_finite() && secant > lo + 0.05 * (hi - lo) && secant < hi - 0.05 * (hi - lo) {
            secant
        } else {
            mid
        };
        let gx = g(x);
        if gx <= 0.0 {
            lo = x;
            glo = gx;
        } else {
            hi = x;
            ghi = gx;
        }
    }
    Some(lo)
}

/// Capacity of one bore for this line's fluid, fittings and limits.
///
/// # Errors
/// A [`LineError`] for bad input.
pub fn capacity(line: &Valid, bore: Length) -> Result<Capacity, LineError> {
    count_solve();
    let props = line.properties();
    let area = super::geometry::flow_area(bore);
    let l = &line.limits;
    let mut best: Option<(f64, Limit)> = None;
    let mut consider = |q: f64, limit: Limit| {
        if best.is_none_or(|(b, _)| q < b) {
            best = Some((q, limit));
        }
    };
    let flow = |q: f64| VolumeRate::new::<cubic_meter_per_second>(q);
    let start = (area * Velocity::new::<uom::si::velocity::meter_per_second>(1.0)).value;
    let gas = line.fluid.is_compressible();
    let at = |q: f64| line.point(&props, bore, flow(q));
    if let Some(v) = l.max_velocity_at(line.pipe.darby_diameter_in(bore), line.temperature.value - 273.15) {
        if gas {
            let top = |q: f64| at(q).gas.map_or(0.0, |g| g.outlet_velocity);
            if let Some(q) = largest_within(|q| top(q) - v, start) {
                consider(q, Limit::MaxVelocity);
            }
        } else {
            consider(area.value * v, Limit::MaxVelocity);
        }
    }
    if gas {
        if let Some(q) = largest_within(|q| at(q).gas.map_or(0.0, |g| g.choke_ratio) - 1.0, start) {
            consider(q, Limit::Choking);
        }
        if let Some(x) = l.max_drop_fraction {
            let p1 = line.pressure.value;
            if let Some(q) = largest_within(|q| at(q).total_drop.value / p1 - x, start) {
                consider(q, Limit::DropFraction);
            }
        }
    }
    if let Some(g) = l.max_drop_per_length {
        if let Some(q) = largest_within(|q| line.point(&props, bore, flow(q)).drop_per_length.value - g.value, start) {
            consider(q, Limit::DropPerLength);
        }
    }
    if let Some(dp) = l.max_total_drop {
        if let Some(q) = largest_within(|q| line.point(&props, bore, flow(q)).total_drop.value - dp.value, start) {
            consider(q, Limit::TotalDrop);
        }
    }
    Ok(Capacity { max_flow: best.map(|(q, _)| flow(q)), limited_by: best.map(|(_, l)| l) })
}

/// One step of the explain trace: what was computed, how, from where.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Step {
    /// Symbol, e.g. "Re".
    pub symbol: &'static str,
    /// What it is.
    pub name: &'static str,
    /// The formula used.
    pub formula: &'static str,
    /// The value in SI units.
    pub value: f64,
    /// The SI unit of `value` ("" when dimensionless).
    pub unit: &'static str,
    /// The source of the formula or data.
    pub source: &'static str,
}

/// The explain trace for one candidate of a line.
///
/// Long on purpose: one step per quantity, in the order a reviewer checks
/// them; split up, the list would no longer read top to bottom.
pub fn trace(line: &Valid, c: &Candidate) -> Vec<Step> {
    let steps = liquid_trace(line, c);
    match c.point.gas {
        Some(g) => gas_trace(steps, &g),
        None => steps,
    }
}

/// A gas or steam line's trace: the liquid steps reworded where the
/// isothermal equation replaces them, then both ends.
fn gas_trace(steps: Vec<Step>, g: &super::line::GasEnds) -> Vec<Step> {
    const CRANE: &str = "isothermal compressible flow: Crane TP-410, ch. 1 (p/ρ constant along the line)";
    let mut out: Vec<Step> = steps
        .into_iter()
        .filter(|s| s.symbol != "Δp_c")
        .map(|mut s| {
            match s.symbol {
                "ρ" => s.name = "density at the inlet (ρ₁)",
                "V" => s.name = "mean velocity at the inlet (V₁)",
                "Δp/L" => {
                    s.name = "friction drop per length (mean over the run)";
                    s.formula = "f (p₁ − p₂) / (D K)";
                    s.source = CRANE;
                }
                "Δp_f" => {
                    s.formula = "(p₁ − p₂) · f (L + L_eq)/D ÷ K";
                    s.source = CRANE;
                }
                "Δp_K" => {
                    s.formula = "(p₁ − p₂) · ΣK ÷ K";
                    s.source = CRANE;
                }
                "Δp_z" => s.formula = "ρ̄ g Δz, ρ̄ = (ρ₁ + ρ₂)/2, g = 9.80665 m/s²",
                "Δp" => s.formula = "(p₁ − p₂) + Δp_z (open system)",
                _ => {}
            }
            s
        })
        .collect();
    let at = out.iter().position(|s| s.symbol == "Δp/L").unwrap_or(out.len());
    let ends = [
        Step {
            symbol: "K",
            name: "line resistance",
            formula: "K = f (L + L_eq)/D + ΣK",
            value: g.resistance,
            unit: "",
            source: "Darcy–Weisbach and the fittings' K",
        },
        Step {
            symbol: "p₁",
            name: "inlet pressure (absolute)",
            formula: "as entered",
            value: g.inlet_pressure,
            unit: "Pa",
            source: "the line's fluid",
        },
        Step {
            symbol: "G/G_max",
            name: "share of the choking flow",
            formula: "G_max = √(x* p₁ ρ₁), 1 − x*(1 + K) + x* ln x* = 0",
            value: g.choke_ratio,
            unit: "",
            source: "isothermal limiting velocity V₂ = √(p₂/ρ₂) (Shapiro 1953, ch. 6)",
        },
        Step {
            symbol: "p₂",
            name: if g.choked {
                "outlet pressure — CHOKED: the line cannot pass this flow"
            } else {
                "outlet pressure (absolute)"
            },
            formula: "p₁² − p₂² = G² (p₁/ρ₁) [K + 2 ln(p₁/p₂)], G = ρ₁ V₁",
            value: g.outlet_pressure,
            unit: "Pa",
            source: CRANE,
        },
        Step {
            symbol: "ρ₂",
            name: "density at the outlet",
            formula: "ρ₂ = ρ₁ p₂ / p₁",
            value: g.outlet_density,
            unit: "kg/m³",
            source: "isothermal gas (Z constant)",
        },
        Step {
            symbol: "V₂",
            name: "mean velocity at the outlet",
            formula: "V₂ = G / ρ₂",
            value: g.outlet_velocity,
            unit: "m/s",
            source: "continuity",
        },
        Step {
            symbol: "Δp_inc",
            name: if g.incompressible_drop < 0.1 * g.inlet_pressure {
                "incompressible form, for comparison (under 10 % of p₁: would also do)"
            } else {
                "incompressible form, for comparison (10 % of p₁ or more: not valid here)"
            },
            formula: "K ρ₁ V₁² / 2",
            value: g.incompressible_drop,
            unit: "Pa",
            source: "Crane TP-410: Darcy at one density only under about 10 % of p₁",
        },
    ];
    out.splice(at..at, ends);
    out
}

fn liquid_trace(line: &Valid, c: &Candidate) -> Vec<Step> {
    count_solve();
    let props = &line.properties();
    let p = &c.point;
    let fluid_source = line.fluid.sources();
    let (f_formula, f_source) = match (line.method, p.regime) {
        (Method::HazenWilliams { .. }, _) => (
            "f = 2 g D S / V², S from V = 0.849 C (D/4)^0.63 S^0.54",
            "Williams & Hazen (1905), Hydraulic Tables (equivalent f shown for comparison)",
        ),
        (_, Regime::Laminar) => ("f = 64 / Re", "Hagen–Poiseuille laminar flow"),
        (_, Regime::Transition) => (
            "1/√f = −2 log10(ε/(3.7 D) + 2.51/(Re √f)) — transition zone: uncertain",
            "Colebrook (1939), taken through the transition zone as the safe-side value",
        ),
        (_, Regime::Turbulent) => (
            "1/√f = −2 log10(ε/(3.7 D) + 2.51/(Re √f))",
            "Colebrook (1939), J. ICE 11, solved by Newton's method to 1e-12",
        ),
    };
    vec![
        Step {
            symbol: "ρ",
            name: "density",
            formula: "fluid property at T, p",
            value: props.density.value,
            unit: "kg/m³",
            source: fluid_source,
        },
        Step {
            symbol: "μ",
            name: "dynamic viscosity",
            formula: "fluid property at T, p",
            value: props.viscosity.value,
            unit: "Pa·s",
            source: fluid_source,
        },
        Step {
            symbol: "D",
            name: "inside diameter",
            formula: "D = OD − 2t",
            value: p.bore.value,
            unit: "m",
            source: "the pipe standard's table",
        },
        Step {
            symbol: "V",
            name: "mean velocity",
            formula: "V = Q / (π D² / 4)",
            value: p.velocity.value,
            unit: "m/s",
            source: "continuity",
        },
        Step {
            symbol: "Re",
            name: "Reynolds number",
            formula: "Re = ρ V D / μ",
            value: p.reynolds,
            unit: "",
            source: "Reynolds (1883)",
        },
        Step {
            symbol: "ε/D",
            name: "relative roughness",
            formula: "ε / D",
            value: p.relative_roughness,
            unit: "",
            source: "roughness of the material",
        },
        Step {
            symbol: "f",
            name: "Darcy friction factor",
            formula: f_formula,
            value: p.friction_factor,
            unit: "",
            source: f_source,
        },
        Step {
            symbol: "Δp/L",
            name: "friction drop per length",
            formula: "Δp/L = f ρ V² / (2 D)",
            value: p.drop_per_length.value,
            unit: "Pa/m",
            source: "Darcy–Weisbach",
        },
        Step {
            symbol: "Δp_f",
            name: "friction drop",
            formula: "(Δp/L) · (L + L_eq)",
            value: p.friction_drop.value,
            unit: "Pa",
            source: "Darcy–Weisbach",
        },
        Step {
            symbol: "ΣK",
            name: "fittings",
            formula: "Σ n (K1/Re + Ki (1 + Kd/Dn^0.3)) + K_extra, Dn nominal diameter in inches",
            value: p.sum_k,
            unit: "",
            source: "Darby (2001) 3-K method",
        },
        Step {
            symbol: "Δp_K",
            name: "fittings drop",
            formula: "ΣK ρ V² / 2",
            value: p.fittings_drop.value,
            unit: "Pa",
            source: "velocity-head method",
        },
        Step {
            symbol: "Δp_c",
            name: "valves and equipment",
            formula: "Kv: 10⁵ (ρ/1000) (3600 Q/Kv)²; rated: Δp_r (Q/Q_r)²; butterfly, reducer: K ρ V²/2",
            value: p.components_drop.value,
            unit: "Pa",
            source: "IEC 60534-2-1 (Kv, Cv = 1.156 Kv); square law (rated); Crane TP-410 (butterfly, reducers)",
        },
        Step {
            symbol: "Δp_z",
            name: if line.circuit == super::line::Circuit::Closed {
                "static (rise) — closed loop: shown apart, not in the total"
            } else {
                "static (rise)"
            },
            formula: "ρ g Δz, g = 9.80665 m/s²",
            value: p.static_drop.value,
            unit: "Pa",
            source: "hydrostatics",
        },
        Step {
            symbol: "Δp",
            name: "total drop",
            formula: if line.circuit == super::line::Circuit::Closed {
                "Δp_f + Δp_K + Δp_c (closed loop)"
            } else {
                "Δp_f + Δp_K + Δp_c + Δp_z"
            },
            value: p.total_drop.value,
            unit: "Pa",
            source: "sum",
        },
    ]
}
