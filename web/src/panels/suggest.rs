//! Suggest: the optimiser over the library (to be built out).

use crate::form::Form;
use leptos::prelude::*;

/// The optimiser panel.
#[component]
pub fn Suggest(form: Form) -> impl IntoView {
    let _ = form;
    view! { <p class="help">"Ranks every library core and material for this specification."</p> }
}
