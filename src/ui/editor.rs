//! The inputs of the selected line: one small component per fieldset, every
//! text input drawn by [`LineText`] from its [`Field`]. The edits themselves
//! are plain methods on `LineFile` (`sheet::edit`), tested natively.

use crate::hydraulics::digits::Short;
use leptos::prelude::*;

use super::fields::{errors_except, TextField};
use super::state::{Sheet, Slot};
use crate::hydraulics::demand::{self, Supply};
use crate::hydraulics::field::Field;
use crate::hydraulics::fluid::Glycol;
use crate::hydraulics::losses::Fitting;
use crate::hydraulics::pipes::{Material, SERIES};
use crate::sheet::edit::{gas_choices, FlowFrom, FluidKind, CUSTOM_BORE};
use crate::sheet::file::{FluidFile, LineFile, MethodName};
use crate::sheet::number::parse_count;
use crate::sheet::presets::{Service, SERVICES};
use crate::sheet::report::LineReport;
use crate::sheet::units::{self, Dimension};

/// The fields whose errors the editor shows beside an input (each fitting
/// row checks its own count); the others are listed at the top.
pub const BESIDE_INPUTS: [Field; 35] = [
    Field::FedFrom,
    Field::Fixtures,
    Field::FixtureCount,
    Field::ContinuousFlow,
    Field::Diversity,
    Field::LoadPower,
    Field::LoadDeltaT,
    Field::VelocityBySize,
    Field::SmallestSize,
    Field::Components,
    Field::FittingCount,
    Field::Flow,
    Field::Fluid,
    Field::FluidTemperature,
    Field::FluidPressure,
    Field::FluidPercent,
    Field::FluidDensity,
    Field::FluidViscosity,
    Field::FluidRelativeDensity,
    Field::FluidMolarMass,
    Field::FluidZ,
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
    Field::MaxDropPercent,
];

/// The typed inputs of a line: what [`Mirror`] leaves out of the line's
/// shape, and keeps a signal of text and of error for.
const TYPED: [Field; 26] = [
    Field::Name,
    Field::Flow,
    Field::LoadPower,
    Field::LoadDeltaT,
    Field::Diversity,
    Field::ContinuousFlow,
    Field::FluidTemperature,
    Field::FluidPressure,
    Field::FluidPercent,
    Field::FluidDensity,
    Field::FluidViscosity,
    Field::FluidRelativeDensity,
    Field::FluidMolarMass,
    Field::FluidZ,
    Field::PipeDiameter,
    Field::Roughness,
    Field::Length,
    Field::Rise,
    Field::ExtraK,
    Field::EquivalentLength,
    Field::MaxDropPerLength,
    Field::MaxTotalDrop,
    Field::MaxVelocity,
    Field::MinVelocity,
    Field::MaxDropPercent,
    Field::HazenWilliamsC,
];

/// What the editor is drawn from, kept apart from the line's file so that
/// a keystroke reaches only what it changes. Reading the file itself, every
/// menu, row, branch and input of the editor (some forty readers) was
/// marked and re-read on every keystroke in any input.
///
/// - `shape` is the file without the texts of its typed inputs ([`TYPED`]):
///   the menus, rows and branches read it. It is set only when it changes,
///   so typing into an input leaves them all alone.
/// - Each typed input, and each field whose error the editor shows beside
///   an input, has a signal of its text and one of its error, set only when
///   that text or error changes.
#[derive(Clone, Copy)]
struct Mirror {
    shape: RwSignal<LineFile>,
    /// (field, text, error), one per field asked for, made in the editor's
    /// own scope so that they outlive the input that first asked.
    fields: StoredValue<Vec<Shown>>,
    owner: StoredValue<Owner>,
    file: RwSignal<LineFile>,
    report: Memo<LineReport>,
}

/// A field of the editor: its text and its error.
type Shown = (Field, RwSignal<String>, RwSignal<String>);

/// The file without the texts of its typed inputs.
fn shape_of(f: &LineFile) -> LineFile {
    let mut s = f.clone();
    for field in TYPED {
        s.set_text(field, String::new());
    }
    s
}

/// The messages for one field of a result.
fn message_for(r: &LineReport, field: Field) -> String {
    match &r.outcome {
        Err(errs) => {
            errs.iter().filter(|e| e.field == field).map(|e| e.message.as_str()).collect::<Vec<_>>().join("; ")
        }
        Ok(_) => String::new(),
    }
}

impl Mirror {
    /// Made in the line editor's scope: follows the line's file and result.
    fn new(line: &Slot) -> Mirror {
        let (file, report) = (line.file, line.report);
        let shape = RwSignal::new(file.with_untracked(shape_of));
        let fields: StoredValue<Vec<Shown>> = StoredValue::new(Vec::new());
        // One effect for both: a keystroke changes the file and the result
        // together, and this runs once for the two.
        Effect::new(move |_| {
            file.with(|f| {
                let s = shape_of(f);
                if shape.with_untracked(|x| *x != s) {
                    shape.set(s);
                }
                report.with(|r| {
                    fields.with_value(|v| {
                        for (field, text, error) in v {
                            let t = f.text(*field);
                            if text.with_untracked(|x| *x != t) {
                                text.set(t);
                            }
                            let e = message_for(r, *field);
                            if error.with_untracked(|x| *x != e) {
                                error.set(e);
                            }
                        }
                    })
                })
            })
        });
        let owner = StoredValue::new(Owner::current().unwrap_or_default());
        Mirror { shape, fields, owner, file, report }
    }

    /// The text and error signals of `field`, made on first asking.
    fn field(self, field: Field) -> (RwSignal<String>, RwSignal<String>) {
        if let Some((_, t, e)) = self.fields.with_value(|v| v.iter().find(|(f, ..)| *f == field).copied()) {
            return (t, e);
        }
        let text = self.file.with_untracked(|f| f.text(field));
        let error = self.report.with_untracked(|r| message_for(r, field));
        let made = self.owner.with_value(|o| o.with(|| (RwSignal::new(text), RwSignal::new(error))));
        self.fields.update_value(|v| v.push((field, made.0, made.1)));
        made
    }

    /// The error shown for `field`, as a signal.
    fn error(self, field: Field) -> Signal<String> {
        self.field(field).1.into()
    }
}

/// One text input of the selected line, with its error beside it.
#[component]
fn LineText(
    /// Which input.
    field: Field,
    /// Visible label.
    label: &'static str,
    /// Element id and `data-testid`.
    id: &'static str,
    /// A unit picker for this dimension.
    #[prop(optional, into)]
    unit: Option<Dimension>,
    /// A fixed unit shown after the input.
    #[prop(optional, into)]
    suffix: Option<&'static str>,
    /// Greyed hint shown when empty.
    #[prop(optional, into)]
    placeholder: Signal<String>,
    /// `inputmode` for the on-screen keyboard.
    #[prop(default = "decimal")]
    inputmode: &'static str,
) -> impl IntoView {
    let file = expect_context::<Slot>().file;
    let (text, error) = expect_context::<Mirror>().field(field);
    view! {
        <TextField label=label id=id unit=unit suffix=suffix placeholder=placeholder inputmode=inputmode
            value=text error=error
            on_input=move |v| file.update(|f| f.set_text(field, v))/>
    }
}

/// The editor for one line.
#[component]
pub fn LineEditor(
    /// The line.
    line: Slot,
) -> impl IntoView {
    let file = line.file;
    let report = line.report;
    provide_context(Mirror::new(&line));
    provide_context(line);
    let apply_service = move |id: String| {
        if let Some(s) = Service::by_id(&id) {
            file.update(|f| f.apply_service(s));
        }
    };
    view! {
        <form class="editor" data-testid="editor" on:submit=|ev| ev.prevent_default() aria-label="Line inputs">
            <p class="field-error" data-testid="line-errors" aria-live="polite">{move || errors_except(report, &BESIDE_INPUTS).get()}</p>
            <div class="editor-head">
                <LineText field=Field::Name label="Line name" id="line-name" inputmode="text"/>
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
            <FlowAndFluid/>
            <PipeFields/>
            <RunFields/>
            <LimitFields/>
            <MethodFields/>
        </form>
    }
}

/// Flow, and the fluid with its state.
#[component]
fn FlowAndFluid() -> impl IntoView {
    let mirror = expect_context::<Mirror>();
    let shape = mirror.shape;
    let line = expect_context::<Slot>();
    let file = line.file;
    // Memos, not closures: a keystroke in the flow must not redraw the
    // fluid's fields (it did, every one of them, on every keystroke).
    let kind = Memo::new(move |_| shape.with(|f| f.fluid_kind()));
    let kind = move || kind.get();
    let from = Memo::new(move |_| shape.with(|f| f.flow_from()));
    let sheet = expect_context::<Sheet>();
    // Every line's name, as a memo: a keystroke that changes no name leaves
    // the "fed from" list as it is (on a 200-line sheet, 200 options).
    let all_names = Memo::new(move |_| {
        sheet.lines.with(|v| v.iter().map(|s| s.joint.with(|j| j.name.trim().to_owned())).collect::<Vec<_>>())
    });
    let name = mirror.field(Field::Name).0;
    let own_name = Memo::new(move |_| name.with(|n| n.trim().to_owned()));
    let long = sheet.long;
    let fed_from = Memo::new(move |_| shape.with(|f| f.fed_from.clone()));
    let is_glycol =
        move |g: Glycol| shape.with(|f| matches!(&f.fluid, FluidFile::Glycol { glycol, .. } if *glycol == g));
    view! {
        <fieldset>
            <legend>"Flow and fluid"</legend>
            <div class="field">
                <label for="fed-from">"Fed from"</label>
                {move || if long.get() {
                    // A long sheet: a name typed with the list's suggestions
                    // (`line-names`, drawn once in the list of lines), not a
                    // menu of every line redrawn each time a line is chosen.
                    view! {
                        <input id="fed-from" data-testid="fed-from" list="line-names" autocomplete="off"
                            placeholder="empty: a source" prop:value=move || fed_from.get().unwrap_or_default()
                            on:change=move |ev| {
                                let v = event_target_value(&ev).trim().to_owned();
                                file.update(|f| f.fed_from = (!v.is_empty()).then_some(v))
                            }/>
                    }.into_any()
                } else { view! {
                <select id="fed-from" data-testid="fed-from"
                    on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| f.fed_from = (!v.is_empty()).then_some(v)) }>
                    <option value="" selected=move || fed_from.with(Option::is_none)>"— a source (fed from no line)"</option>
                    {move || {
                        let own = own_name.get();
                        let current = fed_from.get();
                        let mut names: Vec<String> = all_names.get();
                        names.retain(|n| !n.is_empty() && *n != own);
                        names.dedup();
                        if let Some(c) = current.as_ref().filter(|c| !names.contains(c)) {
                            names.push(c.clone());
                        }
                        names.into_iter().map(|n| {
                            let sel = current.as_deref() == Some(n.as_str());
                            view! { <option value=n.clone() selected=sel>{n.clone()}</option> }
                        }).collect_view()
                    }}
                </select>
                }.into_any() }}
                <span class="field-error" data-testid="fed-from-error" aria-live="polite">{move || mirror.error(Field::FedFrom).get()}{move || line.report.with(|r| r.outcome.as_ref().ok().map(|o| o.sizing.warnings.iter().filter_map(|w| w.strip_prefix("fed from: ")).collect::<Vec<_>>().join("; ")).unwrap_or_default())}</span>
            </div>
            <div class="field">
                <label for="flow-from">"Flow from"</label>
                <select id="flow-from" data-testid="flow-from"
                    on:change=move |ev| { if let Some(v) = FlowFrom::from_id(&event_target_value(&ev)) { file.update(|f| f.set_flow_from(v)) } }>
                    {FlowFrom::ALL.map(|k| view! { <option value=k.id() selected=move || from.get() == k>{k.label()}</option> }).collect_view()}
                </select>
            </div>
            {move || match from.get() {
                FlowFrom::Load => view! {
                    <LineText field=Field::LoadPower label="Heat load" id="load-power" unit=Dimension::Power placeholder="e.g. 45 kW"/>
                    <LineText field=Field::LoadDeltaT label="Temperature difference" id="load-delta-t" unit=Dimension::TemperatureDifference placeholder="e.g. 6 K"/>
                    <LineText field=Field::Diversity label="Diversity on branch loads" id="diversity" inputmode="decimal" placeholder="1 (none)"/>
                    <p class="derived" data-testid="derived-flow" aria-live="polite">{move || line.report.with(|r| match &r.outcome {
                        Ok(o) => o.flow_text.clone().map(|q| format!("Flow = Φ / (ρ c_p ΔT) = {q}")).unwrap_or_default(),
                        Err(_) => String::new(),
                    })}</p>
                }.into_any(),
                FlowFrom::Fixtures => view! { <FixtureFields/> }.into_any(),
                FlowFrom::Flow => view! { <LineText field=Field::Flow label="Design flow" id="flow" unit=Dimension::Flow placeholder="e.g. 12.5 or 95 gpm"/> }.into_any(),
            }}
            <div class="field">
                <label for="fluid-kind">"Fluid"</label>
                <select id="fluid-kind" data-testid="fluid-kind" prop:value=move || kind().id()
                    on:change=move |ev| { if let Some(k) = FluidKind::from_id(&event_target_value(&ev)) { file.update(|f| f.set_fluid_kind(k)) } }>
                    {FluidKind::ALL.into_iter().map(|k| view! { <option value=k.id() selected=move || kind() == k>{k.label()}</option> }).collect_view()}
                </select>
                <span class="field-error" data-testid="fluid-error" aria-live="polite">{move || mirror.error(Field::Fluid).get()}</span>
            </div>
            {move || match kind() {
                FluidKind::Water => view! {
                    <LineText field=Field::FluidTemperature label="Temperature" id="fluid-temperature" unit=Dimension::Temperature/>
                    <LineText field=Field::FluidPressure label="System pressure (absolute; barg or psig = gauge + 101.325 kPa)" id="fluid-pressure" unit=Dimension::Pressure placeholder="101.325 kPa absolute if empty"/>
                }.into_any(),
                FluidKind::Glycol => view! {
                    <div class="field">
                        <label for="glycol-kind">"Glycol"</label>
                        <select id="glycol-kind" data-testid="glycol-kind"
                            on:change=move |ev| { if let Some(g) = Glycol::from_id(&event_target_value(&ev)) { file.update(|f| f.set_glycol(g)) } }>
                            {Glycol::ALL.into_iter().map(|g| view! { <option value=g.id() selected=move || is_glycol(g)>{g.label()}</option> }).collect_view()}
                        </select>
                    </div>
                    <LineText field=Field::FluidPercent label="Strength" id="glycol-percent" suffix="% by mass"/>
                    <LineText field=Field::FluidTemperature label="Temperature" id="fluid-temperature" unit=Dimension::Temperature/>
                }.into_any(),
                FluidKind::Custom => view! {
                    <LineText field=Field::FluidDensity label="Density" id="fluid-density" suffix="kg/m³"/>
                    <LineText field=Field::FluidViscosity label="Dynamic viscosity" id="fluid-viscosity" suffix="mPa·s"/>
                }.into_any(),
                FluidKind::Gas => view! { <GasFields/> }.into_any(),
                FluidKind::Steam => view! {
                    <LineText field=Field::FluidPressure label="Pressure at the inlet (absolute; barg or psig = gauge + 101.325 kPa)" id="fluid-pressure" unit=Dimension::Pressure placeholder="e.g. 8 barg"/>
                    <LineText field=Field::FluidTemperature label="Temperature, if superheated" id="fluid-temperature" unit=Dimension::Temperature placeholder="dry saturated if empty"/>
                    <p class="hint">"Wet steam is refused: a temperature below saturation at this pressure is an error."</p>
                }.into_any(),
            }}
        </fieldset>
    }
}

/// A gas line's fluid: which gas, its state at the inlet, and what a
/// natural or custom gas needs.
#[component]
fn GasFields() -> impl IntoView {
    let mirror = expect_context::<Mirror>();
    let shape = mirror.shape;
    let line = expect_context::<Slot>();
    let file = line.file;
    let gas = Memo::new(move |_| shape.with(|f| f.gas_choice().unwrap_or("air").to_owned()));
    view! {
        <div class="field">
            <label for="gas-kind">"Gas"</label>
            <select id="gas-kind" data-testid="gas-kind"
                on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| f.set_gas(&v)) }>
                {gas_choices().map(|(id, label)| view! { <option value=id selected=move || gas.with(|g| g == id)>{label}</option> }).collect_view()}
            </select>
        </div>
        <LineText field=Field::FluidPressure label="Pressure at the inlet (absolute; barg or psig = gauge + 101.325 kPa)" id="fluid-pressure" unit=Dimension::Pressure placeholder="e.g. 7 barg"/>
        <LineText field=Field::FluidTemperature label="Temperature" id="fluid-temperature" unit=Dimension::Temperature/>
        {move || match gas.get().as_str() {
            "natural-gas" => view! {
                <LineText field=Field::FluidRelativeDensity label="Relative density (air = 1)" id="gas-relative-density" inputmode="decimal" placeholder="e.g. 0.6"/>
            }.into_any(),
            "custom" => view! {
                <LineText field=Field::FluidMolarMass label="Molar mass" id="gas-molar-mass" suffix="g/mol" inputmode="decimal"/>
                <LineText field=Field::FluidViscosity label="Dynamic viscosity" id="fluid-viscosity" suffix="mPa·s" inputmode="decimal"/>
                <LineText field=Field::FluidZ label="Compressibility factor Z" id="gas-z" inputmode="decimal" placeholder="1 (ideal gas)"/>
            }.into_any(),
            _ => ().into_any(),
        }}
    }
}

/// The pipe: a standard series or a custom bore, and its roughness.
#[component]
fn PipeFields() -> impl IntoView {
    let mirror = expect_context::<Mirror>();
    let shape = mirror.shape;
    let sheet = expect_context::<Sheet>();
    let line = expect_context::<Slot>();
    let file = line.file;
    let choice = Memo::new(move |_| shape.with(|f| f.series_choice().to_owned()));
    let choice = move || choice.get();
    let smallest = Memo::new(move |_| shape.with(|f| f.smallest_size.clone()));
    let can_age = Memo::new(move |_| shape.with(|f| f.can_age()));
    let roughness_hint = Signal::derive(move || {
        shape.with(|f| {
            f.default_roughness_mm()
                .map(|(mm, m)| {
                    let unit = sheet.resolved.get().roughness;
                    format!("default {} ({})", units::show(mm * 1e-3, unit, None, 3), m.name())
                })
                .unwrap_or_default()
        })
    });
    view! {
        <fieldset>
            <legend>"Pipe"</legend>
            <div class="field">
                <label for="pipe-series">"Material and standard"</label>
                <select id="pipe-series" data-testid="pipe-series" prop:value=choice
                    on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| f.set_series(&v)) }>
                    {SERIES.iter().map(|s| {
                        let id = s.id;
                        view! { <option value=id selected=move || choice() == id>{s.label}" — "{s.standard.split(',').next().unwrap_or(s.standard)}</option> }
                    }).collect_view()}
                    <option value=CUSTOM_BORE selected=move || choice() == CUSTOM_BORE>"Custom bore (enter the inside diameter)"</option>
                </select>
                <span class="field-error" aria-live="polite">{move || mirror.error(Field::PipeSeries).get()}</span>
            </div>
            {move || crate::hydraulics::pipes::series(&choice()).map(|s| view! {
                <div class="field">
                    <label for="pipe-smallest">"Smallest size to propose"</label>
                    <select id="pipe-smallest" data-testid="pipe-smallest"
                        on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| f.smallest_size = (!v.is_empty()).then_some(v)) }>
                        <option value="" selected=move || smallest.with(Option::is_none)>"Any"</option>
                        {s.sizes.iter().map(|z| {
                            let n = z.nominal;
                            view! { <option value=n selected=move || smallest.with(|m| m.as_deref() == Some(n))>{s.designation(n)}</option> }
                        }).collect_view()}
                    </select>
                    <span class="field-error" aria-live="polite">{move || mirror.error(Field::SmallestSize).get()}</span>
                </div>
            })}
            {move || (choice() == CUSTOM_BORE).then(|| view! {
                <LineText field=Field::PipeDiameter label="Inside diameter" id="pipe-diameter" suffix="mm unless typed"/>
                <div class="field">
                    <label for="pipe-material">"Material (for roughness)"</label>
                    <select id="pipe-material" data-testid="pipe-material"
                        on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| f.set_material(&v)) }>
                        {Material::ALL.into_iter().map(|m| {
                            view! { <option value=m.id() selected=move || shape.with(|f| f.material() == Some(m))>{m.name()}</option> }
                        }).collect_view()}
                    </select>
                </div>
            })}
            <LineText field=Field::Roughness label="Roughness ε" id="roughness" unit=Dimension::Roughness placeholder=roughness_hint/>
            {move || can_age.get().then(|| view! {
                <label class="check">
                    <input type="checkbox" data-testid="aged" prop:checked=move || shape.with(|f| f.aged)
                        on:change=move |ev| { let on = event_target_checked(&ev); file.update(|f| f.aged = on) }/>
                    "Aged pipe (published aged roughness)"
                </label>
            })}
        </fieldset>
    }
}

/// The run: length, rise, fittings and other losses.
#[component]
fn RunFields() -> impl IntoView {
    view! {
        <fieldset>
            <legend>"Run"</legend>
            <LineText field=Field::Length label="Length of straight pipe" id="length" unit=Dimension::Length placeholder="optional for a quick check"/>
            <LineText field=Field::Rise label="Rise, end above start (negative for a fall)" id="rise" unit=Dimension::Length placeholder="0"/>
            <FittingList/>
            <ComponentList/>
            <LineText field=Field::ExtraK label="Extra ΣK" id="extra-k" placeholder="0"/>
            <LineText field=Field::EquivalentLength label="Equivalent length for other losses" id="equivalent-length" unit=Dimension::Length placeholder="0"/>
        </fieldset>
    }
}

/// The design limits.
#[component]
fn LimitFields() -> impl IntoView {
    let mirror = expect_context::<Mirror>();
    let shape = mirror.shape;
    let line = expect_context::<Slot>();
    let compressible = Memo::new(move |_| shape.with(|f| f.fluid.is_compressible()));
    view! {
        <fieldset>
            <legend>"Limits"</legend>
            <span class="field-error" data-testid="limits-error" aria-live="polite">{move || mirror.error(Field::Limits).get()}</span>
            <LineText field=Field::MaxDropPerLength label="Largest friction drop per length" id="max-drop-per-length" unit=Dimension::DropPerLength/>
            <LineText field=Field::MaxTotalDrop label="Largest total drop" id="max-total-drop" unit=Dimension::Pressure placeholder="none"/>
            <LineText field=Field::MaxVelocity label="Largest velocity" id="max-velocity" unit=Dimension::Velocity placeholder="none"/>
            <LineText field=Field::MinVelocity label="Smallest velocity (optional)" id="min-velocity" unit=Dimension::Velocity placeholder="none"/>
            {move || compressible.get().then(|| view! {
                <LineText field=Field::MaxDropPercent label="Largest drop, % of inlet pressure (absolute)" id="max-drop-percent" suffix="%" inputmode="decimal" placeholder="none"/>
            })}
            <div class="field">
                <label for="velocity-by-size">"Largest velocity by size"</label>
                <select id="velocity-by-size" data-testid="velocity-by-size"
                    on:change=move |ev| { let v = event_target_value(&ev); line.file.update(|f| f.limits.velocity_by_size = (!v.is_empty()).then_some(v)) }>
                    <option value="" selected=move || shape.with(|f| f.limits.velocity_by_size.is_none())>"None"</option>
                    {crate::hydraulics::velocity::RULES.iter().map(|r| {
                        let id = r.id;
                        view! { <option value=id title=r.source selected=move || shape.with(|f| f.limits.velocity_by_size.as_deref() == Some(id))>{r.label}" (common practice)"</option> }
                    }).collect_view()}
                </select>
                <span class="hint">{move || shape.with(|f| f.limits.velocity_by_size.as_deref().and_then(crate::hydraulics::velocity::rule).map(|r| r.source).unwrap_or(""))}</span>
                <span class="field-error" aria-live="polite">{move || mirror.error(Field::VelocityBySize).get()}</span>
            </div>
        </fieldset>
    }
}

/// The friction method.
#[component]
fn MethodFields() -> impl IntoView {
    let mirror = expect_context::<Mirror>();
    let shape = mirror.shape;
    let file = expect_context::<Slot>().file;
    let method = move || shape.with(|f| f.method);
    let is_hw = move || method() == MethodName::HazenWilliams;
    let hw_hint = Signal::derive(move || {
        shape.with(|f| {
            f.material()
                .map(|m| format!("default {} for {}", Short(m.hazen_williams_c().0), m.name()))
                .unwrap_or_default()
        })
    });
    view! {
        <fieldset>
            <legend>"Method"</legend>
            <div class="field">
                <label for="method">"Friction method"</label>
                <select id="method" data-testid="method"
                    on:change=move |ev| { if let Some(m) = MethodName::from_id(&event_target_value(&ev)) { file.update(|f| f.set_method(m)) } }>
                    {MethodName::ALL.into_iter().map(|m| view! { <option value=m.id() selected=move || method() == m>{m.label()}</option> }).collect_view()}
                </select>
            </div>
            {move || is_hw().then(|| view! {
                <LineText field=Field::HazenWilliamsC label="Hazen–Williams C" id="hw-c" placeholder=hw_hint/>
            })}
        </fieldset>
    }
}

/// The rows of one of the editor's lists (valves and equipment, fixtures,
/// fittings), from each row's kind id, keyed by the list's length, the
/// row's place and its kind (not what is typed into it): typing into a row
/// keeps the row and its focus; a new kind redraws that row; a row added or
/// removed redraws them all. One keyed loop for the three lists, so it is
/// compiled once, not once per list.
fn keyed_rows(kinds: Signal<Vec<String>>, row: Callback<(usize, String), AnyView>) -> impl IntoView {
    let each =
        move || kinds.with(|k| k.iter().enumerate().map(|(i, kind)| (k.len(), i, kind.clone())).collect::<Vec<_>>());
    view! { <For each=each key=|r| r.clone() children=move |(_, i, kind)| row.run((i, kind))/> }
}

/// Valves and equipment given as the trade gives them: Kv or Cv, a drop at
/// a rated flow, a butterfly valve, a reducer.
#[component]
fn ComponentList() -> impl IntoView {
    let mirror = expect_context::<Mirror>();
    let shape = mirror.shape;
    use crate::sheet::file::ComponentKind;
    let line = expect_context::<Slot>();
    let file = line.file;
    let kinds = Signal::derive(move || shape.with(|f| f.components.iter().map(|c| c.kind.id().to_owned()).collect()));
    let text = move |i: usize, which: &'static str, label: &'static str, hint: &'static str| {
        let value = move || {
            shape.with(|f| {
                f.components
                    .get(i)
                    .map(|c| match which {
                        "name" => c.name.clone(),
                        "value" => c.value.clone(),
                        "drop" => c.drop.clone(),
                        "at_flow" => c.at_flow.clone(),
                        "to_bore" => c.to_bore.clone(),
                        _ => c.angle.clone(),
                    })
                    .unwrap_or_default()
            })
        };
        view! {
            <label class="component-field">{label}
                <input type="text" data-testid=format!("component-{i}-{which}") placeholder=hint prop:value=value
                    on:input=move |ev| { let t = event_target_value(&ev); file.update(|f| f.set_component_text(i, which, t)) }/>
            </label>
        }
    };
    view! {
        <div class="fittings components" data-testid="components">
            <span class="label">"Valves and equipment (Kv/Cv, rated drop, butterfly, reducer)"</span>
            {keyed_rows(kinds, Callback::new(move |(i, kind): (usize, String)| {
                let kind = ComponentKind::from_id(&kind).unwrap_or_default();
                view! {
                <div class="component-row">
                    <select aria-label="component kind" data-testid=format!("component-{i}-kind")
                        on:change=move |ev| { if let Some(k) = ComponentKind::from_id(&event_target_value(&ev)) { file.update(|f| f.set_component_kind(i, k)) } }>
                        {ComponentKind::ALL.map(|k| view! { <option value=k.id() selected=k == kind>{k.label()}</option> }).collect_view()}
                    </select>
                    {text(i, "name", "Name", "e.g. CV-3")}
                    {match kind {
                        ComponentKind::Kv => text(i, "value", "Kv", "m³/h at 1 bar").into_any(),
                        ComponentKind::Cv => text(i, "value", "Cv", "US gpm at 1 psi").into_any(),
                        ComponentKind::Rated => view! { {text(i, "drop", "Drop", "e.g. 30 kPa")}{text(i, "at_flow", "At flow", "e.g. 2 L/s")} }.into_any(),
                        ComponentKind::Butterfly => view! { <span class="hint">"K = c·fT by size (Crane TP-410)"</span> }.into_any(),
                        ComponentKind::Reducer => view! { {text(i, "to_bore", "To bore", "mm unless typed")}{text(i, "angle", "Angle °", "180 if sudden")} }.into_any(),
                    }}
                    <button type="button" class="quiet" aria-label="remove this component"
                        on:click=move |_| file.update(|f| f.remove_component(i))>"✕"</button>
                </div>
                }.into_any()
            }))}
            <span class="field-error" data-testid="components-error" aria-live="polite">{move || mirror.error(Field::Components).get()}</span>
            <button type="button" class="quiet" data-testid="add-component" on:click=move |_| file.update(|f| f.add_component())>
                "+ Add a valve or equipment"
            </button>
        </div>
    }
}

/// The fixtures a line serves, counted in the sheet's demand method, the
/// supply they are read on, and a continuous flow.
#[component]
fn FixtureFields() -> impl IntoView {
    let mirror = expect_context::<Mirror>();
    let shape = mirror.shape;
    let sheet = expect_context::<Sheet>();
    let line = expect_context::<Slot>();
    let file = line.file;
    let method = Memo::new(move |_| sheet.basis.with(|b| b.demand));
    // Memos, so a keystroke in a count does not redraw every row's options.
    let supply = Memo::new(move |_| shape.with(|f| f.fixtures.as_ref().map(|x| x.supply).unwrap_or_default()));
    let supply = move || supply.get();
    let kinds = Signal::derive(move || {
        shape
            .with(|f| f.fixtures.as_ref().map(|x| x.items.iter().map(|r| r.kind.clone()).collect()).unwrap_or_default())
    });
    view! {
        <div class="field">
            <label for="fixture-supply">"Supply"</label>
            <select id="fixture-supply" data-testid="fixture-supply"
                on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| f.set_supply(match v.as_str() { "cold" => Supply::Cold, "hot" => Supply::Hot, _ => Supply::Total })) }>
                <option value="total" selected=move || supply() == Supply::Total>"cold and hot together"</option>
                <option value="cold" selected=move || supply() == Supply::Cold>"cold only"</option>
                <option value="hot" selected=move || supply() == Supply::Hot>"hot only"</option>
            </select>
            <span class="hint">{move || format!("Method (set under Basis): {}", method.get().label())}</span>
        </div>
        <div class="fittings" data-testid="fixtures">
            <span class="label">{move || format!("Fixtures served ({} each)", method.get().unit())}</span>
            {keyed_rows(kinds, Callback::new(move |(i, current): (usize, String)| {
                let count = shape.with_untracked(|f| f.fixtures.as_ref().and_then(|x| x.items.get(i)).map(|r| r.count.clone()));
                view! {
                    <div class="fitting-row">
                        <select aria-label="fixture" data-testid=format!("fixture-{i}")
                            on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| f.set_fixture_kind(i, v)) }>
                            {
                                let current = current.clone();
                                move || {
                                    let m = method.get();
                                    let s = supply();
                                    let mut opts: Vec<_> = m.kinds().iter().map(|k| {
                                        let sel = k.id == current;
                                        view! { <option value=k.id selected=sel>{format!("{} — {} {}", k.label, Short(k.units(s)), m.unit())}</option> }.into_any()
                                    }).collect();
                                    if demand::kind(m, &current).is_none() {
                                        opts.push(view! { <option value=current.clone() selected=true>{format!("{current} (not a {} fixture)", m.unit())}</option> }.into_any());
                                    }
                                    opts
                                }
                            }
                        </select>
                        <input type="text" inputmode="numeric" aria-label="how many" class="count"
                            data-testid=format!("fixture-{i}-count") prop:value=count.unwrap_or_default()
                            on:input=move |ev| { let n = event_target_value(&ev); file.update(|f| f.set_fixture_count(i, n)) }/>
                        <button type="button" class="quiet" aria-label="remove this fixture"
                            on:click=move |_| file.update(|f| f.remove_fixture(i))>"✕"</button>
                    </div>
                }.into_any()
            }))}
            <button type="button" class="quiet" data-testid="add-fixture"
                on:click=move |_| { let k = method.get_untracked().kinds()[0].id; file.update(|f| f.add_fixture(k)) }>
                "+ Add a fixture"
            </button>
            <span class="field-error" data-testid="fixtures-error" aria-live="polite">{move || mirror.error(Field::Fixtures).get()}{move || mirror.error(Field::FixtureCount).get()}</span>
        </div>
        <LineText field=Field::ContinuousFlow label="Continuous flow added (circulation, irrigation)" id="fixture-continuous" unit=Dimension::Flow placeholder="none"/>
        <p class="derived" data-testid="derived-flow" aria-live="polite">{move || line.report.with(|r| match &r.outcome {
            Ok(o) => o.flow_text.clone().map(|q| format!("Flow = {q}")).unwrap_or_default(),
            Err(_) => String::new(),
        })}</p>
    }
}

/// Counted fittings: a kind and a count per row.
#[component]
fn FittingList() -> impl IntoView {
    let mirror = expect_context::<Mirror>();
    let shape = mirror.shape;
    let file = expect_context::<Slot>().file;
    let kinds = Signal::derive(move || shape.with(|f| f.fittings.iter().map(|fc| fc.fitting.clone()).collect()));
    view! {
        <div class="fittings" data-testid="fittings">
            <span class="label">"Fittings and valves (3-K method, Darby 2001)"</span>
            {keyed_rows(kinds, Callback::new(move |(i, current): (usize, String)| {
                let count = shape.with_untracked(|f| f.fittings.get(i).map(|fc| fc.count.clone()));
                view! {
                    <div class="fitting-row">
                        <select aria-label="fitting" data-testid=format!("fitting-{i}")
                            on:change=move |ev| { let v = event_target_value(&ev); file.update(|f| f.set_fitting_kind(i, v)) }>
                            {Fitting::ALL.into_iter().map(|f| {
                                let sel = f.id() == current;
                                view! { <option value=f.id() selected=sel>{f.label()}</option> }
                            }).collect_view()}
                        </select>
                        <input type="text" inputmode="numeric" aria-label="how many" class="count"
                            data-testid=format!("fitting-{i}-count") prop:value=count.unwrap_or_default()
                            on:input=move |ev| { let n = event_target_value(&ev); file.update(|f| f.set_fitting_count(i, n)) }/>
                        <span class="field-error" data-testid=format!("fitting-{i}-count-error") aria-live="polite">
                            {move || shape.with(|f| f.fittings.get(i).and_then(|r| parse_count(&r.count).err()).map(|e| e.to_string()).unwrap_or_default())}
                        </span>
                        <button type="button" class="quiet" aria-label="remove this fitting"
                            on:click=move |_| file.update(|f| f.remove_fitting(i))>"✕"</button>
                    </div>
                }.into_any()
            }))}
            <button type="button" class="quiet" data-testid="add-fitting" on:click=move |_| file.update(|f| f.add_fitting())>
                "+ Add a fitting"
            </button>
        </div>
    }
}
