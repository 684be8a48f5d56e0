//! The page's panels, one module each. Every panel takes the form (the
//! design being edited) and/or the engine's outcome and draws; none holds
//! physics. A panel that needs its own CSS renders it in a `<style>` of its
//! own (the CSP allows inline styles), so panels never share a stylesheet
//! region.
//!
//! * [`library`]: choose the core and material, browse the libraries,
//!   define a custom core or material.
//! * [`material_curves`]: the material's Pv–B chart (log axes).
//! * [`results`]: the deciding figures with pass/fail and margins, cautions.
//! * [`pictures`]: waveforms, flux against the saturation limit, the
//!   frequency sweep; its chart (both curves, the envelope, the data band)
//!   in `sweep_chart`.
//! * [`windings`]: the stack-up table and editor, the window to scale, the MMF;
//!   [`conductor_choice`] why each conductor (the search's trials);
//!   `wire_editor` a winding's fixed conductor; `order_editor` the custom
//!   winding order.
//! * [`optimiser`]: the optimiser over the library, ranked, with its Pareto plot.
//! * [`sheet`]: the printable build sheet.

pub mod conductor_choice;
pub mod library;
pub mod material_curves;
pub mod pictures;
pub mod results;
pub mod sheet;
pub mod sweep_run;
pub mod optimiser;
mod order_editor;
mod sweep_chart;
mod wire_editor;
pub mod windings;

use leptos::prelude::*;
use magwright_engine::notation;

/// One result line: label, formatted value, and the SI value for checks.
pub fn row(id: &'static str, label: &'static str, v: f64, unit: &'static str, digits: usize) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=format!("{v:e}")>{notation::format(v, unit, digits)}</td>
        </tr>
    }
}

/// A count (turns) with its `data-si`.
pub fn count(id: &'static str, label: &'static str, n: u32) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=n.to_string()>{n.to_string()}</td>
        </tr>
    }
}

/// Why there are no results, one line per problem.
#[component]
pub fn Missing(lines: Vec<String>) -> impl IntoView {
    view! {
        <div class="missing" data-testid="missing" role="status">
            <p><strong>"No design yet."</strong>" Fix these entries:"</p>
            <ul>{lines.into_iter().map(|l| view! { <li>{l}</li> }).collect_view()}</ul>
        </div>
    }
}
