//! The printed build sheet: hidden on screen, the only thing printed.

use crate::form::Outcome;
use leptos::prelude::*;
use magwright_engine::notation;

/// The build sheet.
#[component]
pub fn BuildSheet(outcome: Memo<Outcome>) -> impl IntoView {
    let body = move || match outcome.get() {
        Ok(r) => {
            let rows = r
                .wires
                .iter()
                .map(|w| {
                    let wire = if w.parallel > 1 { format!("{} × {}", w.parallel, w.conductor) } else { w.conductor.clone() };
                    view! { <tr><th scope="row">{w.winding.clone()}</th><td>{w.turns}</td><td>{wire}</td><td>{notation::format(w.rms_current, "A", 3)}</td></tr> }
                })
                .collect_view();
            let gap = r.gap.as_ref().map(|g| notation::format(g.gap, "m", 3)).unwrap_or_else(|| "none (ungapped)".into());
            view! {
                <h2>"Core and material"</h2>
                <table class="sheet-table"><tbody>
                    <tr><th scope="row">"Core"</th><td data-testid="sheet-core">{r.core.designation.clone()}</td></tr>
                    <tr><th scope="row">"Material"</th><td>{r.material.name.clone()}</td></tr>
                    <tr><th scope="row">"Gap"</th><td>{gap}</td></tr>
                    <tr><th scope="row">"Inductance"</th><td>{notation::format(r.inductance, "H", 3)}</td></tr>
                </tbody></table>
                <h2>"Windings"</h2>
                <table class="sheet-table"><thead><tr><th>"Winding"</th><th>"Turns"</th><th>"Wire"</th><th>"RMS current"</th></tr></thead><tbody>{rows}</tbody></table>
                <p data-testid="sheet-np" data-si=r.turns.primary.to_string()>{format!("Np = {}", r.turns.primary)}</p>
                <h2>"Expected losses"</h2>
                <table class="sheet-table"><tbody>
                    <tr><th scope="row">"Core"</th><td>{notation::format(r.losses.core, "W", 3)}</td></tr>
                    <tr><th scope="row">"Copper"</th><td>{notation::format(r.losses.copper, "W", 3)}</td></tr>
                    <tr><th scope="row">"Total"</th><td data-testid="sheet-total">{notation::format(r.losses.total, "W", 3)}</td></tr>
                </tbody></table>
                <h2>"Cautions"</h2>
                <ul>
                    {r.cautions.iter().chain(r.warnings.iter()).map(|w| view! { <li>{w.clone()}</li> }).collect_view()}
                    <li>"Magwright computes; it does not certify. Material and core data are typical values: check them against your supplier's data."</li>
                </ul>
            }
            .into_any()
        }
        Err(_) => view! { <p>"No design to print: fix the marked entries first."</p> }.into_any(),
    };
    view! {
        <section class="sheet" data-testid="build-sheet">
            <h1>"Magwright build sheet"</h1>
            {body}
        </section>
    }
}
