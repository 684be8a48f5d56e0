//! A labelled input field. Its state is the text as typed; the parsed
//! value is derived from it elsewhere, so typing is never fought.

use leptos::prelude::*;

/// One numeric (or text) entry with its label, unit and message.
#[component]
pub fn Field(
    /// Key of the spec field (also the element id: `f-<key>`).
    key: &'static str,
    label: &'static str,
    /// Unit shown after the box (may follow another entry, e.g. V for a
    /// reflected voltage, none for a turns ratio).
    #[prop(into)]
    unit: Signal<&'static str>,
    text: RwSignal<String>,
    /// Message to show under the field, if any.
    #[prop(into)]
    error: Signal<Option<String>>,
    /// Short help for the title tooltip.
    #[prop(optional)]
    help: &'static str,
) -> impl IntoView {
    let id = format!("f-{key}");
    let err_id = format!("e-{key}");
    let invalid = move || error.get().is_some();
    view! {
        <div class="field" class:invalid=invalid>
            <label for=id.clone() title=help>{label}</label>
            <div class="entry">
                <input
                    id=id
                    type="text"
                    inputmode="decimal"
                    autocomplete="off"
                    spellcheck="false"
                    aria-invalid=move || if invalid() { "true" } else { "false" }
                    aria-describedby=err_id.clone()
                    prop:value=move || text.get()
                    on:input:target=move |ev| text.set(ev.target().value())
                />
                <span class="unit">{move || unit.get()}</span>
            </div>
            <div class="msg" id=err_id role="alert">{move || error.get().unwrap_or_default()}</div>
        </div>
    }
}
