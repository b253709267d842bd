//! The printed review sheet as markup: every line's inputs, the
//! assumptions behind its numbers, the proposed size and its results, the
//! system, the sources and the cautions. Pure text from the worksheet, so
//! it is tested natively; the page writes it only when the browser is
//! about to print.

use super::duty_plot::Plot;
use super::file::{ComponentKind, FluidFile, LineFile, PipeFile};
use super::markup::Markup;
use super::panes::{duty_figure, TRANSITION};
use super::report::{designation, LineReport, CAUTION};
use super::units::format_number;
use crate::hydraulics::digits::Short;
use crate::hydraulics::line::{Method, Pipe};
use crate::hydraulics::losses::Fitting;

/// What the review sheet is written from.
pub struct Review<'a> {
    /// The project's name as shown.
    pub project: &'a str,
    /// The sheet's date.
    pub date: &'a str,
    /// The design basis's circuit in one sentence.
    pub circuit: &'a str,
    /// Every line's text, in order.
    pub lines: &'a [LineFile],
    /// Every line's result, in the same order.
    pub reports: &'a [LineReport],
    /// The system's tree drawn in text (empty for lines on their own).
    pub tree: &'a [String],
    /// The system's lines of text (empty for lines on their own).
    pub system: &'a [String],
    /// The pump-and-system plot, when there is one.
    pub plot: Option<&'a Plot>,
}

/// The sources every printed sheet lists.
pub const SOURCES: &[&str] = &[
    "Water density: IAPWS-IF97 (2007 revision), region 1; saturation: region 4.",
    "Water viscosity: IAPWS 2008 formulation, without the critical enhancement.",
    "Glycol solutions: Melinder (2010), Properties of Secondary Working Fluids, IIR — via CoolProp 8.0.0 tables, interpolated.",
    "Friction factor: laminar 64/Re; Colebrook (1939), J. ICE 11, solved exactly; transition zone 2000–4000 taken at the turbulent value and flagged.",
    "Pressure drop: Darcy–Weisbach; Hazen–Williams (Williams & Hazen, Hydraulic Tables) where chosen, for water near room temperature only.",
    "Fittings: Darby (2001) 3-K method, Chem. Eng. 108(4); entrance 0.5 and exit 1.0 (Crane TP-410, common practice).",
    "Pipe dimensions: ASME B36.10M, B36.19M; ASTM B88, D1785; EN 10255; EN 1057; ISO 4065 / EN 12201-2. Plastic bores on the mean wall (minimum plus half the tolerance: ASTM D1785; ISO 11922-1 grade V).",
    "Valves and equipment: Kv/Cv by IEC 60534-2-1 (Cv = 1.156 Kv, ρ₀ = 1000 kg/m³); rated drops scaled by (Q/Q_r)²; butterfly valves and reducers by Crane TP-410.",
    "Roughness: Moody (1944); Idelchik, Handbook of Hydraulic Resistance; common practice where marked.",
    "Gases: gas law with Z by the Pitzer–Abbott virial correlation (critical constants, Poling et al. 2001); viscosity by Sutherland's law (White, Viscous Fluid Flow); natural gas by Sutton (1985) and Lee, Gonzalez & Eakin (1966).",
    "Steam: IAPWS-IF97 region 2 (density) and region 4 (saturation); IAPWS 2008 viscosity. Gas and steam lines: isothermal compressible flow (Crane TP-410); standard volumes at their stated reference conditions.",
    "Units: NIST SP 811 (2008); g = 9.80665 m/s².",
];

fn fluid_text(f: &LineFile) -> String {
    match &f.fluid {
        FluidFile::Water { temperature, pressure } => {
            let p = pressure.clone().unwrap_or_else(|| "101.325 kPa".into());
            let marked = ["barg", "psig", "bara", "psia"].iter().any(|u| p.trim().to_ascii_lowercase().ends_with(u));
            if marked {
                format!("water at {temperature}, {p} (gauge taken against 101.325 kPa)")
            } else {
                format!("water at {temperature}, {p} absolute")
            }
        }
        FluidFile::Glycol { glycol, percent, temperature } => {
            let glycol = format!("{glycol:?}").to_ascii_lowercase();
            format!("{percent} % {glycol} glycol in water at {temperature}")
        }
        FluidFile::Custom { density_kg_m3, viscosity_mpa_s, kinematic_viscosity_mm2_s } => format!(
            "entered: ρ {density_kg_m3} kg/m³, {}",
            viscosity_mpa_s
                .as_ref()
                .map(|m| format!("μ {m} mPa·s"))
                .or_else(|| kinematic_viscosity_mm2_s.as_ref().map(|n| format!("ν {n} mm²/s")))
                .unwrap_or_default()
        ),
        FluidFile::Gas { gas, temperature, pressure, relative_density, molar_mass, viscosity_mpa_s, z } => {
            let what = match gas.as_str() {
                "natural-gas" => {
                    format!("natural gas, relative density {}", relative_density.as_deref().unwrap_or("?"))
                }
                "custom" => format!(
                    "gas entered: M {} g/mol, μ {} mPa·s, Z {}",
                    molar_mass.as_deref().unwrap_or("?"),
                    viscosity_mpa_s.as_deref().unwrap_or("?"),
                    z.as_deref().unwrap_or("1")
                ),
                id => id.replace('-', " "),
            };
            format!("{what} at {temperature}, {pressure} at the inlet (gauge taken against 101.325 kPa)")
        }
        FluidFile::Steam { pressure, temperature } => match temperature.as_deref().filter(|t| !t.trim().is_empty()) {
            Some(t) => format!("superheated steam at {t}, {pressure} at the inlet (gauge taken against 101.325 kPa)"),
            None => format!("dry saturated steam, {pressure} at the inlet (gauge taken against 101.325 kPa)"),
        },
    }
}

// Over 60 lines on purpose: the table of one line's inputs, one entry per row as printed.
fn inputs(f: &LineFile, r: &LineReport) -> Vec<(&'static str, String)> {
    vec![
        (
            "Flow",
            match (&f.load, r.outcome.as_ref().ok().and_then(|o| o.flow_text.clone())) {
                (Some(l), Some(q)) => {
                    format!("from a heat load of {} at ΔT {}: Φ / (ρ c_p ΔT) = {q}", l.power, l.delta_t)
                }
                (Some(l), None) => format!("from a heat load of {} at ΔT {}", l.power, l.delta_t),
                (None, _) => f.flow.clone(),
            },
        ),
        ("Fluid", fluid_text(f)),
        (
            "Pipe",
            match &f.pipe {
                PipeFile::Series(id) => crate::hydraulics::pipes::series(id)
                    .map(|s| format!("{} ({})", s.label, s.standard))
                    .unwrap_or_else(|| id.clone()),
                PipeFile::Bore { diameter, material } => format!("custom bore {diameter}, {material}"),
            },
        ),
        ("Length", f.length.clone()),
        ("Rise", f.rise.clone().unwrap_or_else(|| "0".into())),
        (
            "Fittings",
            if f.fittings.is_empty() {
                "none".into()
            } else {
                f.fittings
                    .iter()
                    .map(|fc| {
                        format!("{} × {}", fc.count, Fitting::from_id(&fc.fitting).map(|x| x.label()).unwrap_or("?"))
                    })
                    .collect::<Vec<_>>()
                    .join("; ")
            },
        ),
        (
            "Valves and equipment",
            if f.components.is_empty() {
                "none".into()
            } else {
                f.components
                    .iter()
                    .map(|c| {
                        let what = match c.kind {
                            ComponentKind::Kv => format!("Kv {}", c.value),
                            ComponentKind::Cv => format!("Cv {}", c.value),
                            ComponentKind::Rated => format!("{} at {}", c.drop, c.at_flow),
                            ComponentKind::Butterfly => "butterfly valve (Crane)".to_owned(),
                            ComponentKind::Reducer => format!(
                                "to bore {}, {}°",
                                c.to_bore,
                                if c.angle.trim().is_empty() { "180" } else { c.angle.as_str() }
                            ),
                        };
                        if c.name.is_empty() {
                            what
                        } else {
                            format!("{}: {what}", c.name)
                        }
                    })
                    .collect::<Vec<_>>()
                    .join("; ")
            },
        ),
        (
            "Extra ΣK / equivalent length",
            format!(
                "{} / {}",
                f.extra_k.clone().unwrap_or_else(|| "0".into()),
                f.equivalent_length.clone().unwrap_or_else(|| "0".into())
            ),
        ),
        (
            "Limits",
            [
                f.limits.max_drop_per_length.as_ref().map(|v| format!("drop per length ≤ {v}")),
                f.limits.max_total_drop.as_ref().map(|v| format!("total drop ≤ {v}")),
                f.limits.max_velocity.as_ref().map(|v| format!("velocity ≤ {v}")),
                f.limits.min_velocity.as_ref().map(|v| format!("velocity ≥ {v}")),
                f.limits.max_drop_percent.as_ref().map(|v| format!("drop ≤ {v} % of inlet pressure")),
            ]
            .into_iter()
            .flatten()
            .collect::<Vec<_>>()
            .join("; "),
        ),
    ]
}

// Over 60 lines on purpose: one line's printed record, kept whole so it reads as printed.
/// One line's printed record: inputs, assumptions, answer.
fn line_record(m: &mut Markup, number: usize, f: &LineFile, r: &LineReport) {
    m.open("section", &[("class", "print-line")]);
    let name = if f.name.is_empty() { "(unnamed line)" } else { f.name.as_str() };
    m.el("h3", &[], &format!("{number}. {name}"));
    m.open("table", &[("class", "print-inputs")]).open("tbody", &[]);
    for (k, v) in inputs(f, r) {
        m.open("tr", &[]).el("th", &[("scope", "row")], k).el("td", &[], &v).close("tr");
    }
    m.close("tbody").close("table");
    match &r.outcome {
        Err(errs) => {
            let errs = errs.iter().map(|e| e.to_string()).collect::<Vec<_>>().join("; ");
            m.el("p", &[("class", "bad")], &format!("Not sized — inputs to fix: {errs}"));
        }
        Ok(o) => {
            let rho = o.sizing.properties.density_kg_m3();
            let mu = o.sizing.properties.viscosity_pa_s();
            let method = match o.line.method {
                Method::DarcyWeisbach => "Darcy–Weisbach, Colebrook".to_owned(),
                Method::HazenWilliams { c } => format!("Hazen–Williams, C = {}", Short(c)),
            };
            let bores = match o.line.pipe {
                Pipe::Series(_) => "standard inside diameters",
                Pipe::Custom(_) => "the bore entered",
            };
            let assumptions = format!(
                "ρ = {} kg/m³, μ = {} mPa·s ({}); ε = {} mm; {method}; {bores}",
                format_number(rho, 5),
                format_number(mu * 1e3, 4),
                o.line.fluid.sources(),
                format_number(o.line.roughness.value * 1e3, 3)
            );
            let answer = match (o.shown, o.figures.as_ref()) {
                (Some(i), Some(f)) => {
                    let c = &o.sizing.candidates[i];
                    format!(
                        "{} {}: velocity {}, drop per length {}, total drop {} (friction {} + fittings {}{}{}), Re {}, f {}{}",
                        if o.checked { "Checked size" } else { "Proposed size" },
                        designation(&o.line, f.size),
                        f.velocity,
                        f.drop_per_length,
                        f.total_drop,
                        f.friction_drop,
                        f.fittings_drop,
                        if f.components_drop.is_empty() {
                            String::new()
                        } else {
                            format!(" + valves and equipment {}", f.components_drop)
                        },
                        if f.static_in_total {
                            format!(" + static {}", f.static_drop)
                        } else {
                            format!("; static {} apart, closed loop", f.static_drop)
                        },
                        f.reynolds,
                        f.friction,
                        if c.passes() { "" } else { " — FAILS a limit" },
                    )
                }
                _ => "No size meets the limits.".to_owned(),
            };
            let mut warnings = o.sizing.warnings.clone();
            if o.shown.is_some_and(|i| o.sizing.candidates[i].uncertain()) {
                warnings.insert(0, TRANSITION.to_owned());
            }
            m.open("p", &[("class", "print-answer")]).el("strong", &[], &answer).close("p");
            m.el("p", &[("data-testid", "print-verdict")], &o.verdict);
            if let Some(f) = o.figures.as_ref().filter(|f| !f.ends.is_empty()) {
                m.el("p", &[("data-testid", "print-ends")], &f.ends);
            }
            m.open("p", &[]).el("em", &[], "Assumptions: ").text(&assumptions).close("p");
            if !warnings.is_empty() {
                m.el("p", &[("class", "bad")], &warnings.join(" "));
            }
        }
    }
    m.close("section");
}

/// The whole review sheet.
pub fn review_sheet(r: &Review) -> String {
    let mut m = Markup::new();
    m.open("header", &[]).el("h1", &[], r.project);
    let stamp = format!("Pipe sizing review sheet · {} · Headroom {}", r.date, env!("CARGO_PKG_VERSION"));
    m.el("p", &[], &stamp);
    m.open("p", &[("class", "print-caution")]).el("strong", &[], "Caution: ").text(CAUTION).close("p");
    m.el("p", &[("data-testid", "print-circuit")], r.circuit).close("header");
    for (i, (f, rep)) in r.lines.iter().zip(r.reports).enumerate() {
        line_record(&mut m, i + 1, f, rep);
    }
    if !r.system.is_empty() {
        m.open("section", &[("class", "print-system"), ("data-testid", "print-system")]).el("h2", &[], "System");
        m.el("pre", &[("class", "print-tree"), ("data-testid", "print-tree")], &r.tree.join("\n"));
        for l in r.system {
            m.el("p", &[], l);
        }
        if let Some(p) = r.plot {
            duty_figure(&mut m, p);
        }
        m.close("section");
    }
    m.open("footer", &[]).el("h2", &[], "Sources").open("ul", &[]);
    for s in SOURCES {
        m.el("li", &[], s);
    }
    m.close("ul").open("p", &[("class", "print-caution")]).el("strong", &[], "Caution: ").text(CAUTION);
    m.text(
        " Velocity limits guard against noise and erosion but not against water hammer; check pressure \
         ratings, surge and local code requirements separately.",
    );
    m.close("p").close("footer");
    m.finish()
}
