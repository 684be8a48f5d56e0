//! Why these conductors: for each winding the engine's reason
//! (`report.wires[i].reason`) and the conductors its least-loss search
//! weighed (`report.wires[i].trials`: kind, conductor, in hand, copper loss,
//! radial build, whether the harmonic model or the quick estimate gave the
//! loss, whether it fits), the chosen one first; and the interleaving with
//! the ones tried (`report.winding_choice`). Shown in the windings panel.
//!
//! Every number is a report field; nothing is computed here beyond unit
//! changes for display.

use super::windings::{css_colour, mm, slug};
use crate::form::Report;
use leptos::prelude::*;
use magwright_engine::design::solve::{ConductorTrial, REWEIGH_BAND};
use magwright_engine::notation;

const CSS: &str = r#"
.choice p.why { margin:.25rem 0 .15rem; font-size:.88em; }
.choice table.trials { font-size:.85em; margin:0 0 .5rem; border-spacing:0; }
.choice table.trials th, .choice table.trials td { padding:.1rem .45rem; }
.choice table.trials td.cond { text-align:left; white-space:normal; }
.choice table.trials tr.chosen td, .choice table.trials tr.chosen th { font-weight:600; }
.choice .muted { color:var(--muted); }
"#;

/// The interleaving line: the one used and, when chosen by loss, the
/// copper loss of each one the harmonic model evaluated, with the primary
/// turns it was weighed at where they are not the design's (weighed at the
/// flux limit's turns, then the close ones again at the design's: solver
/// step 3, `REWEIGH_BAND`).
fn interleave_line(r: &Report) -> String {
    let c = &r.winding_choice;
    let name = |s: &str| s.replace('_', " ");
    if !c.automatic || c.tried.is_empty() {
        return format!("Interleaving: {} (as set).", name(&c.interleave));
    }
    let np = r.turns.primary;
    let tried: Vec<String> = c
        .tried
        .iter()
        .map(|t| {
            let at = if t.primary_turns == np { String::new() } else { format!(" at Np = {}", t.primary_turns) };
            format!("{} {}{at}", name(&t.interleave), notation::format(t.copper_loss, "W", 3))
        })
        .collect();
    let kept = if c.tried.iter().any(|t| t.primary_turns != np) {
        let band = (REWEIGH_BAND - 1.0) * 100.0;
        format!("; weighed at the flux limit's turns, then those within {band:.0} % of the least again at Np = {np}")
    } else {
        String::new()
    };
    format!(
        "Interleaving: {}, least copper loss of those the harmonic model evaluated ({}){kept}.",
        name(&c.interleave),
        tried.join(", ")
    )
}

fn trial_row(t: &ConductorTrial) -> impl IntoView {
    let how = if t.evaluated { "harmonic model" } else { "estimate" };
    let fits = if t.fits { "yes" } else { "no" };
    view! {
        <tr class:chosen=t.chosen>
            <th scope="row">{if t.chosen { "chosen" } else { "" }}</th>
            <td>{t.kind.name()}</td>
            <td class="cond">{t.conductor.clone()}</td>
            <td data-si=t.parallel.to_string()>{t.parallel}</td>
            <td data-si=format!("{:e}", t.loss)>{notation::format(t.loss, "W", 3)}</td>
            <td class="muted">{how}</td>
            <td data-si=format!("{:e}", t.build)>{mm(t.build)}</td>
            <td>{fits}</td>
        </tr>
    }
}

/// The explanation of every winding's conductor (module docs).
pub fn conductor_choice(r: &Report) -> impl IntoView {
    let windings = r
        .wires
        .iter()
        .map(|w| {
            let s = slug(&w.winding);
            let ci = r.stackup.winding_index(&w.winding).unwrap_or(0);
            let trials = (!w.trials.is_empty()).then(|| {
                view! {
                    <table class="figures trials" data-testid=format!("trials-{s}")>
                        <thead><tr>
                            <th scope="col"></th><th scope="col">"Kind"</th><th scope="col">"Conductor"</th>
                            <th scope="col" title="Conductors in hand">"×"</th><th scope="col">"Copper loss"</th>
                            <th scope="col">"From"</th><th scope="col">"Build"</th><th scope="col">"Fits"</th>
                        </tr></thead>
                        <tbody>{w.trials.iter().map(trial_row).collect_view()}</tbody>
                    </table>
                }
            });
            view! {
                <p class="why">
                    <span class="swatch" style=css_colour(ci)></span>
                    <strong>{format!("{}: ", w.winding)}</strong>
                    <span data-testid=format!("choice-reason-{s}")>{w.reason.clone()}</span>
                </p>
                {trials}
            }
        })
        .collect_view();
    view! {
        <style>{CSS}</style>
        <details class="choice" data-testid="conductor-choice" open>
            <summary>"Why these conductors"</summary>
            <p class="why" data-testid="interleave-choice">{interleave_line(r)}</p>
            {windings}
            <p class="why muted">"Losses at the core temperature limit and the line corner with the larger primary current, where the search weighs them; the table above gives them at the operating point."</p>
        </details>
    }
}
