//! A text field for a clinical value: visible label, decimal keypad, ±
//! control, steppers, and its message tied to it.

use super::Message;
use lensplane_core::{step_text, toggle_sign, StepKind};
use leptos::prelude::*;

#[component]
pub fn TextField(
    /// Unique id of the input.
    #[prop(into)]
    id: String,
    /// The visible label.
    #[prop(into)]
    label: String,
    /// Hide the visible label (the group's legend says it already); it stays the accessible name.
    #[prop(optional)]
    label_hidden: bool,
    /// The accessible name when it must say more than the label (e.g. "Right sphere").
    #[prop(optional, into)]
    name: Option<String>,
    /// The raw text, kept exactly as typed.
    value: RwSignal<String>,
    /// Errors and notices for this field.
    #[prop(into)]
    messages: Signal<Vec<Message>>,
    /// Offer the ± control.
    #[prop(optional)]
    signed: bool,
    /// Offer steppers.
    #[prop(optional)]
    step: Option<StepKind>,
    #[prop(optional)] placeholder: &'static str,
    /// A unit shown after the input.
    #[prop(optional)]
    unit: &'static str,
    #[prop(default = "decimal")] inputmode: &'static str,
    /// Called after every edit (typing, ±, steps).
    #[prop(optional, into)]
    on_edit: Option<Callback<()>>,
    /// Controls shown after the input in the same row (a unit choice).
    #[prop(optional)]
    children: Option<Children>,
) -> impl IntoView {
    let name = name.unwrap_or_else(|| label.clone());
    let msg_id = format!("{id}-msg");
    let has_error = move || messages.with(|m| m.iter().any(Message::is_error));
    let edited = move || {
        if let Some(cb) = on_edit {
            cb.run(());
        }
    };
    let sign_button = signed.then(|| {
        let aria = format!("Change the sign of {}", name.to_ascii_lowercase());
        view! {
            <button type="button" class="field-button sign" aria-label=aria
                on:click=move |_| { value.update(|v| *v = toggle_sign(v)); edited(); }>
                "±"
            </button>
        }
    });
    let steppers = step.map(|kind| {
        let (down_label, up_label) = match kind {
            StepKind::Axis(deg) => (format!("{name}: {deg}° less"), format!("{name}: {deg}° more")),
            _ => (format!("{name}: 0.25 D less plus"), format!("{name}: 0.25 D more plus")),
        };
        let stepper = move |up: bool| {
            move |_| {
                if let Some(next) = step_text(&value.get_untracked(), kind, up) {
                    value.set(next);
                    edited();
                }
            }
        };
        view! {
            <button type="button" class="field-button step" aria-label=down_label on:click=stepper(false)>"−"</button>
            <button type="button" class="field-button step" aria-label=up_label on:click=stepper(true)>"+"</button>
        }
    });
    let described = msg_id.clone();
    view! {
        <div class="field" class:has-error=has_error>
            <label for=id.clone() class:visually-hidden=label_hidden>{label.clone()}</label>
            <div class="field-row">
                {sign_button}
                <input
                    id=id.clone()
                    type="text"
                    inputmode=inputmode
                    autocomplete="off"
                    autocapitalize="off"
                    spellcheck="false"
                    enterkeyhint="done"
                    placeholder=placeholder
                    aria-label=(name != label).then(|| name.clone())
                    aria-invalid=move || if has_error() { "true" } else { "false" }
                    aria-describedby=described
                    prop:value=move || value.get()
                    on:input=move |ev| { value.set(event_target_value(&ev)); edited(); }
                />
                {(!unit.is_empty()).then(|| view! { <span class="unit" aria-hidden="true">{unit}</span> })}
                {steppers}
                {children.map(|c| c())}
            </div>
            <p id=msg_id class="field-msg" aria-live="polite">
                {move || messages.get().into_iter().map(|m| {
                    view! { <span class=m.class()>{m.text().to_string()}</span> }
                }).collect_view()}
            </p>
        </div>
    }
}
