//! Core and material: choose from the built-in libraries.

use crate::form::{field_error, Form, Outcome};
use leptos::prelude::*;
use magwright_engine::core::library as cores;
use magwright_engine::design::{CoreChoice, MaterialChoice};
use magwright_engine::material::library as materials;

/// The core and material drop-downs.
#[component]
pub fn Library(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    let core_names: Vec<String> = cores::cores().into_iter().map(|c| c.designation).collect();
    let material_names: Vec<String> = materials::materials().into_iter().map(|m| m.name).collect();
    let core_err = field_error(outcome, "core");
    let mat_err = field_error(outcome, "material");
    let core_now = move || match form.core.get() {
        CoreChoice::Library { designation } => designation,
        CoreChoice::Shape { designation, .. } | CoreChoice::Effective { designation, .. } => designation,
    };
    let mat_now = move || match form.material.get() {
        MaterialChoice::Library { name } => name,
        MaterialChoice::Custom { material } => material.name,
    };
    view! {
        <div class="fields">
            <div class="field" class:invalid=move || core_err.get().is_some()>
                <label for="f-core">"Core"</label>
                <select id="f-core" on:change:target=move |ev| form.core.set(CoreChoice::Library { designation: ev.target().value() })>
                    {core_names.into_iter().map(|n| { let m = n.clone(); let v = n.clone(); view! { <option value=v prop:selected=move || core_now() == m>{n}</option> } }).collect_view()}
                </select>
                <div class="msg" id="e-core" role="alert">{move || core_err.get().unwrap_or_default()}</div>
            </div>
            <div class="field" class:invalid=move || mat_err.get().is_some()>
                <label for="f-material">"Material"</label>
                <select id="f-material" on:change:target=move |ev| form.material.set(MaterialChoice::Library { name: ev.target().value() })>
                    {material_names.into_iter().map(|n| { let m = n.clone(); let v = n.clone(); view! { <option value=v prop:selected=move || mat_now() == m>{n}</option> } }).collect_view()}
                </select>
                <div class="msg" id="e-material" role="alert">{move || mat_err.get().unwrap_or_default()}</div>
            </div>
        </div>
    }
}
