//! The inputs of the selected line.

use leptos::prelude::*;

use super::fields::{errors_except, errors_for, TextField};
use super::state::{Sheet, Slot};
use crate::hydraulics::field::Field;
use crate::hydraulics::losses::Fitting;
use crate::hydraulics::pipes::{self, Material, SERIES};
use crate::sheet::file::{FittingCount, FluidFile, GlycolName, LineFile, MethodName, PipeFile};
use crate::sheet::number::parse_count;
use crate::sheet::presets::{Service, SERVICES};
use crate::sheet::units::{self, Dimension};

fn material_of(f: &LineFile) -> Option<Material> {
    match &f.pipe {
        PipeFile::Series(id) => pipes::series(id).map(|s| s.material),
        PipeFile::Bore { material, .. } => Material::from_id(material),
    }
}

/// The fields whose errors the editor shows beside an input (each fitting
/// row checks its own count); the others are listed at the top.
pub const BESIDE_INPUTS: [Field; 21] = [
    Field::FittingCount,
    Field::Flow,
    Field::Fluid,
    Field::FluidTemperature,
    Field::FluidPressure,
    Field::FluidPercent,
    Field::FluidDensity,
    Field::FluidViscosity,
    Field::PipeSeries,
    Field::PipeDiameter,
    Field::Roughness,
    Field::Length,
    Field::ExtraK,
    Field::EquivalentLength,
    Field::Rise,
    Field::HazenWilliamsC,
    Field::Limits,
    Field::MaxDropPerLength,
    Field::MaxTotalDrop,
    Field::MaxVelocity,
    Field::MinVelocity,
];

/// The editor for one line.
#[component]
pub fn LineEditor(
    /// The line.
    line: Slot,
) -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let file = line.file;
    let report = line.report;
    let get = move |f: fn(&LineFile) -> String| Signal::derive(move || file.with(f));
    let err = move |field: Field| errors_for(report, field);
    let opt = |o: &Option<String>| o.clone().unwrap_or_default();
    let some = |s: String| if s.trim().is_empty() { None } else { Some(s) };

    let fluid_kind = move || {
        file.with(|f| match f.fluid {
            FluidFile::Water { .. } => "water",
            FluidFile::Glycol { .. } => "glycol",
            FluidFile::Custom { .. } => "custom",
        })
    };
    let set_fluid_kind = move |kind: String| {
        file.update(|f| {
            let t = match &f.fluid {
                FluidFile::Water { temperature, .. } | FluidFile::Glycol { temperature, .. } => temperature.clone(),
                FluidFile::Custom { .. } => "20 °C".to_owned(),
            };
            f.fluid = match kind.as_str() {
                "glycol" => FluidFile::Glycol { glycol: GlycolName::Propylene, percent: "30".into(), temperature: t },
                "custom" => FluidFile::Custom {
                    density_kg_m3: "1000".into(),
                    viscosity_mpa_s: Some("1.0".into()),
                    kinematic_viscosity_mm2_s: None,
                },
                _ => FluidFile::Water { temperature: t, pressure: Some("300 kPa".into()) },
            };
        })
    };
    let series_value = move || {
        file.with(|f| match &f.pipe {
            PipeFile::Series(id) => id.clone(),
            PipeFile::Bore { .. } => "custom".to_owned(),
        })
    };
    let set_series = move |v: String| {
        file.update(|f| {
            f.check_size = None;
            f.pipe = if v == "custom" {
                let m = material_of(f).unwrap_or(Material::CarbonSteel);
                PipeFile::Bore { diameter: "50 mm".into(), material: m.id().into() }
            } else {
                PipeFile::Series(v)
            };
        })
    };
    let roughness_hint = Signal::derive(move || {
        file.with(|f| {
            material_of(f)
                .map(|m| {
                    let r = m.roughness();
                    let mm = if f.aged { r.aged_mm.unwrap_or(r.new_mm) } else { r.new_mm };
                    let unit = sheet.resolved.get().roughness;
                    format!("default {} ({})", units::show(mm * 1e-3, unit, None, 3), m.name())
                })
                .unwrap_or_default()
        })
    });
    let has_aged = move || file.with(|f| material_of(f).and_then(|m| m.roughness().aged_mm).is_some());
    let is_hw = move || file.with(|f| f.method == MethodName::HazenWilliams);
    let hw_hint = Signal::derive(move || {
        file.with(|f| {
            material_of(f).map(|m| format!("default {} for {}", m.hazen_williams_c().0, m.name())).unwrap_or_default()
        })
    });
    let apply_service = move |id: String| {
        if let Some(s) = Service::by_id(&id) {
            file.update(|f| {
                let fresh = s.new_line(&f.name);
                f.fluid = fresh.fluid;
                f.pipe = fresh.pipe;
                f.limits = fresh.limits;
                f.roughness = None;
                f.check_size = None;
            });
        }
    };

    view! {
        <form class="editor" data-testid="editor" on:submit=|ev| ev.prevent_default() aria-label="Line inputs">
            <p class="field-error" data-testid="line-errors" aria-live="polite">{move || errors_except(report, &BESIDE_INPUTS).get()}</p>
            <div class="editor-head">
                <TextField label="Line name" id="line-name" inputmode="text"
                    value=get(|f| f.name.clone()) error=Signal::derive(String::new)
                    on_input=move |v| file.update(|f| f.name = v)/>
                <div class="field">
                    <label for="line-service">"Start from a service"</label>
                    <select id="line-service" data-testid="line-service"
                        on:change=move |ev| { apply_service(event_target_value(&ev)); }>
                        <option value="" selected>"Choose to fill fluid, pipe and limits…"</option>
                        {SERVICES.iter().map(|s| view! { <option value=s.id>{s.label}</option> }).collect_view()}
                    </select>
                    <span class="hint">"Service defaults are common practice, not a code: check your project's standard."</span>
                </div>
            </div>

            <fieldset>
                <legend>"Flow and fluid"</legend>
                <TextField label="Design flow" id="flow" unit=Dimension::Flow
                    value=get(|f| f.flow.clone()) error=err(Field::Flow)
                    placeholder="e.g. 12.5 or 95 gpm"
                    on_input=move |v| file.update(|f| f.flow = v)/>
                <div class="field">
                    <label for="fluid-kind">"Fluid"</label>
                    <select id="fluid-kind" data-testid="fluid-kind" prop:value=fluid_kind
                        on:change=move |ev| set_fluid_kind(event_target_value(&ev))>
                        <option value="water" selected=move || fluid_kind() == "water">"Water"</option>
                        <option value="glycol" selected=move || fluid_kind() == "glycol">"Glycol in water"</option>
                        <option value="custom" selected=move || fluid_kind() == "custom">"Other (enter ρ and μ)"</option>
                    </select>
                    <span class="field-error" data-testid="fluid-error" aria-live="polite">{move || err(Field::Fluid).get()}</span>
                </div>
                {move || match fluid_kind() {
                    "water" => view! {
                        <TextField label="Temperature" id="fluid-temperature" unit=Dimension::Temperature
                            value=Signal::derive(move || file.with(|f| match &f.fluid { FluidFile::Water { temperature, .. } => temperature.clone(), _ => String::new() }))
                            error=err(Field::FluidTemperature)
                            on_input=move |v| file.update(|f| if let FluidFile::Water { temperature, .. } = &mut f.fluid { *temperature = v })/>
                        <TextField label="System pressure (absolute)" id="fluid-pressure" unit=Dimension::Pressure
                            value=Signal::derive(move || file.with(|f| match &f.fluid { FluidFile::Water { pressure, .. } => opt(pressure), _ => String::new() }))
                            error=err(Field::FluidPressure) placeholder="101.325 kPa if empty"
                            on_input=move |v| file.update(|f| if let FluidFile::Water { pressure, .. } = &mut f.fluid { *pressure = some(v) })/>
                    }.into_any(),
                    "glycol" => view! {
                        <div class="field">
                            <label for="glycol-kind">"Glycol"</label>
                            <select id="glycol-kind" data-testid="glycol-kind"
                                on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| if let FluidFile::Glycol { glycol, .. } = &mut f.fluid { *glycol = if v == "ethylene" { GlycolName::Ethylene } else { GlycolName::Propylene } }) }>
                                <option value="propylene" selected=move || file.with(|f| matches!(f.fluid, FluidFile::Glycol { glycol: GlycolName::Propylene, .. }))>"Propylene glycol"</option>
                                <option value="ethylene" selected=move || file.with(|f| matches!(f.fluid, FluidFile::Glycol { glycol: GlycolName::Ethylene, .. }))>"Ethylene glycol"</option>
                            </select>
                        </div>
                        <TextField label="Strength" id="glycol-percent" suffix="% by mass"
                            value=Signal::derive(move || file.with(|f| match &f.fluid { FluidFile::Glycol { percent, .. } => percent.clone(), _ => String::new() }))
                            error=err(Field::FluidPercent)
                            on_input=move |v| file.update(|f| if let FluidFile::Glycol { percent, .. } = &mut f.fluid { *percent = v })/>
                        <TextField label="Temperature" id="fluid-temperature" unit=Dimension::Temperature
                            value=Signal::derive(move || file.with(|f| match &f.fluid { FluidFile::Glycol { temperature, .. } => temperature.clone(), _ => String::new() }))
                            error=err(Field::FluidTemperature)
                            on_input=move |v| file.update(|f| if let FluidFile::Glycol { temperature, .. } = &mut f.fluid { *temperature = v })/>
                    }.into_any(),
                    _ => view! {
                        <TextField label="Density" id="fluid-density" suffix="kg/m³"
                            value=Signal::derive(move || file.with(|f| match &f.fluid { FluidFile::Custom { density_kg_m3, .. } => density_kg_m3.clone(), _ => String::new() }))
                            error=err(Field::FluidDensity)
                            on_input=move |v| file.update(|f| if let FluidFile::Custom { density_kg_m3, .. } = &mut f.fluid { *density_kg_m3 = v })/>
                        <TextField label="Dynamic viscosity" id="fluid-viscosity" suffix="mPa·s"
                            value=Signal::derive(move || file.with(|f| match &f.fluid { FluidFile::Custom { viscosity_mpa_s, .. } => opt(viscosity_mpa_s), _ => String::new() }))
                            error=err(Field::FluidViscosity)
                            on_input=move |v| file.update(|f| if let FluidFile::Custom { viscosity_mpa_s, .. } = &mut f.fluid { *viscosity_mpa_s = some(v) })/>
                    }.into_any(),
                }}
            </fieldset>

            <fieldset>
                <legend>"Pipe"</legend>
                <div class="field">
                    <label for="pipe-series">"Material and standard"</label>
                    <select id="pipe-series" data-testid="pipe-series" prop:value=series_value
                        on:change=move |ev| set_series(event_target_value(&ev))>
                        {SERIES.iter().map(|s| {
                            let id = s.id;
                            view! { <option value=id selected=move || series_value() == id>{s.label}" — "{s.standard.split(',').next().unwrap_or(s.standard)}</option> }
                        }).collect_view()}
                        <option value="custom" selected=move || series_value() == "custom">"Custom bore (enter the inside diameter)"</option>
                    </select>
                    <span class="field-error" aria-live="polite">{move || err(Field::PipeSeries).get()}</span>
                </div>
                {move || (series_value() == "custom").then(|| view! {
                    <TextField label="Inside diameter" id="pipe-diameter" suffix="mm unless typed"
                        value=Signal::derive(move || file.with(|f| match &f.pipe { PipeFile::Bore { diameter, .. } => diameter.clone(), _ => String::new() }))
                        error=err(Field::PipeDiameter)
                        on_input=move |v| file.update(|f| if let PipeFile::Bore { diameter, .. } = &mut f.pipe { *diameter = v })/>
                    <div class="field">
                        <label for="pipe-material">"Material (for roughness)"</label>
                        <select id="pipe-material" data-testid="pipe-material"
                            on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| if let PipeFile::Bore { material, .. } = &mut f.pipe { *material = v }) }>
                            {Material::ALL.into_iter().map(|m| {
                                let id = m.id();
                                view! { <option value=id selected=move || file.with(|f| matches!(&f.pipe, PipeFile::Bore { material, .. } if material == id))>{m.name()}</option> }
                            }).collect_view()}
                        </select>
                    </div>
                })}
                <TextField label="Roughness ε" id="roughness" unit=Dimension::Roughness
                    value=get(|f| f.roughness.clone().unwrap_or_default()) error=err(Field::Roughness)
                    placeholder=roughness_hint
                    on_input=move |v| file.update(|f| f.roughness = some(v))/>
                {move || has_aged().then(|| view! {
                    <label class="check">
                        <input type="checkbox" data-testid="aged" prop:checked=move || file.with(|f| f.aged)
                            on:change=move |ev| { let on = event_target_checked(&ev); file.update(|f| f.aged = on) }/>
                        "Aged pipe (published aged roughness)"
                    </label>
                })}
            </fieldset>

            <fieldset>
                <legend>"Run"</legend>
                <TextField label="Length of straight pipe" id="length" unit=Dimension::Length
                    value=get(|f| f.length.clone()) error=err(Field::Length)
                    on_input=move |v| file.update(|f| f.length = v)/>
                <TextField label="Rise, end above start (negative for a fall)" id="rise" unit=Dimension::Length
                    value=get(|f| f.rise.clone().unwrap_or_default()) error=err(Field::Rise) placeholder="0"
                    on_input=move |v| file.update(|f| f.rise = some(v))/>
                <FittingList line=line.clone()/>
                <TextField label="Extra ΣK" id="extra-k" value=get(|f| f.extra_k.clone().unwrap_or_default())
                    error=err(Field::ExtraK) placeholder="0"
                    on_input=move |v| file.update(|f| f.extra_k = some(v))/>
                <TextField label="Equivalent length for other losses" id="equivalent-length" unit=Dimension::Length
                    value=get(|f| f.equivalent_length.clone().unwrap_or_default()) error=err(Field::EquivalentLength) placeholder="0"
                    on_input=move |v| file.update(|f| f.equivalent_length = some(v))/>
            </fieldset>

            <fieldset>
                <legend>"Limits"</legend>
                <span class="field-error" data-testid="limits-error" aria-live="polite">{move || err(Field::Limits).get()}</span>
                <TextField label="Largest friction drop per length" id="max-drop-per-length" unit=Dimension::DropPerLength
                    value=get(|f| f.limits.max_drop_per_length.clone().unwrap_or_default()) error=err(Field::MaxDropPerLength)
                    on_input=move |v| file.update(|f| f.limits.max_drop_per_length = some(v))/>
                <TextField label="Largest total drop" id="max-total-drop" unit=Dimension::Pressure
                    value=get(|f| f.limits.max_total_drop.clone().unwrap_or_default()) error=err(Field::MaxTotalDrop) placeholder="none"
                    on_input=move |v| file.update(|f| f.limits.max_total_drop = some(v))/>
                <TextField label="Largest velocity" id="max-velocity" unit=Dimension::Velocity
                    value=get(|f| f.limits.max_velocity.clone().unwrap_or_default()) error=err(Field::MaxVelocity) placeholder="none"
                    on_input=move |v| file.update(|f| f.limits.max_velocity = some(v))/>
                <TextField label="Smallest velocity (optional)" id="min-velocity" unit=Dimension::Velocity
                    value=get(|f| f.limits.min_velocity.clone().unwrap_or_default()) error=err(Field::MinVelocity) placeholder="none"
                    on_input=move |v| file.update(|f| f.limits.min_velocity = some(v))/>
            </fieldset>

            <fieldset>
                <legend>"Method"</legend>
                <div class="field">
                    <label for="method">"Friction method"</label>
                    <select id="method" data-testid="method"
                        on:change=move |ev| { let hw = event_target_value(&ev) == "hazen-williams"; file.update(|f| f.method = if hw { MethodName::HazenWilliams } else { MethodName::DarcyWeisbach }) }>
                        <option value="darcy-weisbach" selected=move || !is_hw()>"Darcy–Weisbach with Colebrook (any fluid)"</option>
                        <option value="hazen-williams" selected=is_hw>"Hazen–Williams (water near room temperature only)"</option>
                    </select>
                </div>
                {move || is_hw().then(|| view! {
                    <TextField label="Hazen–Williams C" id="hw-c" value=get(|f| f.hazen_williams_c.clone().unwrap_or_default())
                        error=err(Field::HazenWilliamsC) placeholder=hw_hint
                        on_input=move |v| file.update(|f| f.hazen_williams_c = some(v))/>
                })}
            </fieldset>
        </form>
    }
}

/// Counted fittings: a kind and a count per row.
#[component]
fn FittingList(
    /// The line.
    line: Slot,
) -> impl IntoView {
    let file = line.file;
    // Keyed by list length, position and kind (not count), so typing a
    // count keeps focus and removing a row re-draws the rows after it.
    let rows = move || {
        file.with(|f| {
            let n = f.fittings.len();
            f.fittings.iter().cloned().enumerate().map(|(i, fc)| (n, i, fc)).collect::<Vec<_>>()
        })
    };
    view! {
        <div class="fittings" data-testid="fittings">
            <span class="label">"Fittings and valves (3-K method, Darby 2001)"</span>
            <For each=rows key=|(n, i, fc)| (*n, *i, fc.fitting.clone()) children=move |(_, i, fc)| {
                let current = fc.fitting.clone();
                view! {
                    <div class="fitting-row">
                        <select aria-label="fitting" data-testid=format!("fitting-{i}")
                            on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| if let Some(r) = f.fittings.get_mut(i) { r.fitting = v }) }>
                            {Fitting::ALL.into_iter().map(|f| {
                                let sel = f.id() == current;
                                view! { <option value=f.id() selected=sel>{f.label()}</option> }
                            }).collect_view()}
                        </select>
                        <input type="text" inputmode="numeric" aria-label="how many" class="count"
                            data-testid=format!("fitting-{i}-count") prop:value=fc.count.clone()
                            on:input=move |ev| {
                                let n = event_target_value(&ev);
                                file.update(|f| if let Some(r) = f.fittings.get_mut(i) { r.count = n });
                            }/>
                        <span class="field-error" data-testid=format!("fitting-{i}-count-error") aria-live="polite">
                            {move || file.with(|f| f.fittings.get(i).and_then(|r| parse_count(&r.count).err()).map(|e| e.to_string()).unwrap_or_default())}
                        </span>
                        <button type="button" class="quiet" aria-label="remove this fitting"
                            on:click=move |_| file.update(|f| { if i < f.fittings.len() { f.fittings.remove(i); } })>"✕"</button>
                    </div>
                }
            }/>
            <button type="button" class="quiet" data-testid="add-fitting"
                on:click=move |_| file.update(|f| f.fittings.push(FittingCount::new(Fitting::Elbow90Welded.id(), 1)))>
                "+ Add a fitting"
            </button>
        </div>
    }
}
