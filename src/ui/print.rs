//! The printed review sheet: every line's inputs, the assumptions behind
//! its numbers, the proposed size and its results, the sources and the
//! cautions. Hidden on screen; the only thing printed.

use leptos::prelude::*;

use super::state::{listen, Sheet, Slot};
use crate::hydraulics::line::{Method, Pipe};
use crate::hydraulics::losses::Fitting;
use crate::sheet::file::{ComponentKind, FluidFile, LineFile, PipeFile};
use crate::sheet::library::display_name;
use crate::sheet::report::{circuit_note, designation, CAUTION};
use crate::sheet::units::format_number;

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
            let marked = ["barg", "psig", "bara", "psia"].iter().any(|u| p.trim().to_lowercase().ends_with(u));
            if marked {
                format!("water at {temperature}, {p} (gauge taken against 101.325 kPa)")
            } else {
                format!("water at {temperature}, {p} absolute")
            }
        }
        FluidFile::Glycol { glycol, percent, temperature } => {
            format!("{percent} % {glycol:?} glycol in water at {temperature}").to_lowercase()
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

// Over 60 lines on purpose: one line's printed record (inputs, assumptions, answer), kept whole so it reads as printed.
#[component]
fn PrintLine(line: Slot, number: usize) -> impl IntoView {
    let body = {
        // Read once, as the browser is about to print: nothing here follows
        // an edit.
        let f = line.file.get_untracked();
        let r = line.report.get_untracked();
        let inputs = vec![
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
            ("Fluid", fluid_text(&f)),
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
                            format!(
                                "{} × {}",
                                fc.count,
                                Fitting::from_id(&fc.fitting).map(|x| x.label()).unwrap_or("?")
                            )
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
        ];
        let result = match &r.outcome {
            Err(errs) => view! {
                <p class="bad">"Not sized — inputs to fix: "{errs.iter().map(|e| e.to_string()).collect::<Vec<_>>().join("; ")}</p>
            }.into_any(),
            Ok(o) => {
                let rho = o.sizing.properties.density_kg_m3();
                let mu = o.sizing.properties.viscosity_pa_s();
                let method = match o.line.method { Method::DarcyWeisbach => "Darcy–Weisbach, Colebrook".to_owned(), Method::HazenWilliams { c } => format!("Hazen–Williams, C = {c}") };
                let bores = match o.line.pipe { Pipe::Series(_) => "standard inside diameters", Pipe::Custom(_) => "the bore entered" };
                let assumptions = format!(
                    "ρ = {} kg/m³, μ = {} mPa·s ({}); ε = {} mm; {method}; {bores}",
                    format_number(rho, 5), format_number(mu * 1e3, 4), o.line.fluid.sources(), format_number(o.line.roughness.value * 1e3, 3)
                );
                let answer = match o.shown {
                    None => "No size meets the limits.".to_owned(),
                    Some(i) => {
                        let c = &o.sizing.candidates[i];
                        let f = o.figures.clone().expect("a shown size has its figures");
                        format!(
                            "{} {}: velocity {}, drop per length {}, total drop {} (friction {} + fittings {}{}{}), Re {}, f {}{}",
                            if o.checked { "Checked size" } else { "Proposed size" },
                            designation(&o.line, f.size),
                            f.velocity,
                            f.drop_per_length,
                            f.total_drop,
                            f.friction_drop,
                            f.fittings_drop,
                            if f.components_drop.is_empty() { String::new() } else { format!(" + valves and equipment {}", f.components_drop) },
                            if f.static_in_total { format!(" + static {}", f.static_drop) } else { format!("; static {} apart, closed loop", f.static_drop) },
                            f.reynolds,
                            f.friction,
                            if c.passes() { String::new() } else { " — FAILS a limit".into() },
                        )
                    }
                };
                let transition = o.shown.is_some_and(|i| o.sizing.candidates[i].uncertain());
                let mut warnings = o.sizing.warnings.clone();
                if transition {
                    warnings.insert(0, "Re is in the transition zone (2000–4000): the friction factor is uncertain; the safe-side turbulent value is used.".to_owned());
                }
                let warnings = warnings.join(" ");
                let verdict = o.verdict.clone();
                view! {
                    <p class="print-answer"><strong>{answer}</strong></p>
                    <p data-testid="print-verdict">{verdict}</p>
                    {o.figures.as_ref().filter(|f| !f.ends.is_empty()).map(|f| view! { <p data-testid="print-ends">{f.ends.clone()}</p> })}
                    <p><em>"Assumptions: "</em>{assumptions}</p>
                    {(!warnings.is_empty()).then(|| view! { <p class="bad">{warnings}</p> })}
                }.into_any()
            }
        };
        view! {
            <h3>{format!("{number}. {}", if f.name.is_empty() { "(unnamed line)".to_owned() } else { f.name.clone() })}</h3>
            <table class="print-inputs"><tbody>
                {inputs.into_iter().map(|(k, v)| view! { <tr><th scope="row">{k}</th><td>{v}</td></tr> }).collect_view()}
            </tbody></table>
            {result}
        }
    };
    view! { <section class="print-line">{body}</section> }
}

/// The review sheet, shown only when printing. Nothing of it is drawn
/// until the browser is about to print (`beforeprint`, which printing to
/// PDF fires too); it is drawn then from the worksheet as it stands and
/// dropped after (`afterprint`). So it costs nothing when the page starts
/// and nothing on a keystroke.
#[component]
pub fn PrintSheet() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let armed = RwSignal::new(false);
    if let Some(w) = web_sys::window() {
        // `try_`: a print event may arrive after this desk was replaced by
        // another worksheet's, when this signal is gone.
        listen(&w, "beforeprint", move |_| {
            armed.try_set(true);
        });
        listen(&w, "afterprint", move |_| {
            armed.try_set(false);
        });
    }
    view! {
        <article class="print-sheet" data-testid="print-sheet" aria-hidden="true">
            {move || armed.get().then(|| untrack(|| printed(sheet)))}
        </article>
    }
}

/// The review sheet's content, read untracked from the worksheet as it is.
fn printed(sheet: Sheet) -> impl IntoView {
    let lines = sheet.lines.get_untracked();
    let is_system = sheet.joined.with_untracked(|j| j.tree.is_system());
    // The same lines and plot as the page's system panel.
    let (system, plot) = super::system::system_answer(sheet, is_system);
    let tree = if is_system {
        let reports: Vec<_> = lines.iter().map(|s| s.report.get_untracked()).collect();
        crate::sheet::report::tree_lines(&sheet.to_file(), &reports)
    } else {
        Vec::new()
    };
    view! {
        <header>
            <h1>{sheet.project.with_untracked(|p| display_name(p))}</h1>
            <p>{format!("Pipe sizing review sheet · {} · Headroom {}", sheet.date.get_untracked(), env!("CARGO_PKG_VERSION"))}</p>
            <p class="print-caution"><strong>"Caution: "</strong>{CAUTION}</p>
            <p data-testid="print-circuit">{circuit_note(&sheet.resolved.get_untracked())}</p>
        </header>
        {lines.into_iter().enumerate().map(|(i, s)| view! { <PrintLine line=s number=i + 1/> }).collect_view()}
        {(!system.is_empty()).then(|| view! {
            <section class="print-system" data-testid="print-system">
                <h2>"System"</h2>
                <pre class="print-tree" data-testid="print-tree">{tree.join("\n")}</pre>
                {system.into_iter().map(|l| view! { <p>{l}</p> }).collect_view()}
                {plot.map(|p| view! { <super::system::DutyPlot plot=p/> })}
            </section>
        })}
        <footer>
            <h2>"Sources"</h2>
            <ul>{SOURCES.iter().map(|s| view! { <li>{*s}</li> }).collect_view()}</ul>
            <p class="print-caution"><strong>"Caution: "</strong>{CAUTION}" Velocity limits guard against noise and erosion but not against water hammer; check pressure ratings, surge and local code requirements separately."</p>
        </footer>
    }
}
