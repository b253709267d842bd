//! Small input pieces shared by the editor: a labelled text field with its
//! error beside it, and a unit picker that changes the sheet's unit.

use leptos::prelude::*;

use super::state::Sheet;
use crate::hydraulics::field::Field;
use crate::sheet::report::LineReport;
use crate::sheet::units::{self, Dimension};

/// The messages of the fields not in `shown` (errors that belong to no
/// input the editor has: a fitting kind not known, the line as a whole),
/// each led by the field's name.
pub fn errors_except(report: Memo<LineReport>, shown: &'static [Field]) -> Signal<String> {
    Signal::derive(move || {
        report.with(|r| match &r.outcome {
            Err(errs) => errs
                .iter()
                .filter(|e| !shown.contains(&e.field))
                .map(|e| format!("{}: {}", e.field.label(), e.message))
                .collect::<Vec<_>>()
                .join("; "),
            Ok(_) => String::new(),
        })
    })
}

/// A labelled text input that keeps exactly what is typed and shows the
/// field's error next to it.
#[component]
pub fn TextField(
    /// Visible label.
    label: &'static str,
    /// Element id and `data-testid`.
    id: &'static str,
    /// The text.
    #[prop(into)]
    value: Signal<String>,
    /// Called on every keystroke with the whole text. A `Callback`, not a
    /// generic closure, so the component is compiled once, not per field.
    #[prop(into)]
    on_input: Callback<String>,
    /// The error to show; empty for none.
    #[prop(into)]
    error: Signal<String>,
    /// A unit picker for this field's dimension.
    #[prop(optional_no_strip)]
    unit: Option<Dimension>,
    /// A fixed unit shown after the input.
    #[prop(optional_no_strip)]
    suffix: Option<&'static str>,
    /// Greyed hint shown when empty.
    #[prop(optional, into)]
    placeholder: Signal<String>,
    /// `inputmode` for the on-screen keyboard.
    #[prop(default = "decimal")]
    inputmode: &'static str,
) -> impl IntoView {
    let error_id = format!("{id}-error");
    let error_id2 = error_id.clone();
    // Held as memos: a keystroke in another field of the line recomputes
    // them, but what is drawn from them (the value put back into the
    // input, the error's text and flags) runs only when they change.
    let value = Memo::new(move |_| value.get());
    let error = Memo::new(move |_| error.get());
    view! {
        <div class="field" class:has-error=move || !error.get().is_empty()>
            <label for=id>{label}</label>
            <div class="field-row">
                <input
                    id=id
                    data-testid=id
                    type="text"
                    inputmode=inputmode
                    autocomplete="off"
                    spellcheck="false"
                    aria-describedby=error_id
                    aria-invalid=move || if error.get().is_empty() { "false" } else { "true" }
                    placeholder=move || placeholder.get()
                    prop:value=move || value.get()
                    on:input=move |ev| on_input.run(event_target_value(&ev))
                />
                {unit.map(|d| view! { <UnitPicker dim=d id=id/> })}
                {suffix.map(|s| view! { <span class="suffix">{s}</span> })}
            </div>
            <span class="field-error" id=error_id2 data-testid=format!("{id}-error") aria-live="polite">
                {move || error.get()}
            </span>
        </div>
    }
}

/// Chooses the sheet's unit for one kind of field; every line follows.
#[component]
pub fn UnitPicker(
    /// The dimension whose unit this picks.
    dim: Dimension,
    /// The field it sits beside (names the picker for screen readers).
    id: &'static str,
) -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let current = move || sheet.resolved.get().of(dim).symbol;
    view! {
        <select
            class="unit"
            data-testid=format!("{id}-unit")
            aria-label=format!("unit for {id}")
            prop:value=current
            on:change=move |ev| sheet.set_unit(dim, &event_target_value(&ev))
        >
            {units::of(dim)
                .map(|u| view! {
                    <option value=u.symbol selected=move || current() == u.symbol title=u.meaning()>
                        {if u.meaning().is_empty() { u.symbol.to_owned() } else { format!("{} (line fluid)", u.symbol) }}
                    </option>
                })
                .collect_view()}
        </select>
    }
}
