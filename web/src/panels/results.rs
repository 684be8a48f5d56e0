//! Results at a glance: the checks that decide the design (pass/fail with
//! margin and worst line corner), the key figures, and the cautions.

use super::{count, row, Missing};
use crate::form::Outcome;
use leptos::prelude::*;
use magwright_engine::notation;
use magwright_engine::topology::Corner;

fn corner_name(c: Option<Corner>) -> &'static str {
    match c {
        Some(Corner::VinMin) => "at Vin min",
        Some(Corner::VinMax) => "at Vin max",
        None => "",
    }
}

/// The deciding figures, or why there are none.
#[component]
pub fn Results(outcome: Memo<Outcome>) -> impl IntoView {
    move || match outcome.get() {
        Err(p) => view! { <Missing lines=p.lines() /> }.into_any(),
        Ok(r) => {
            let verdict = if r.pass { "Passes every check" } else { "Fails a check" };
            let checks = r
                .checks
                .iter()
                .map(|c| {
                    let (v, l) = match c.unit.as_str() {
                        "m" => (notation::format(c.value, "m", 3), notation::format(c.limit, "m", 3)),
                        "" => (format!("{:.1} %", c.value * 100.0), format!("{:.1} %", c.limit * 100.0)),
                        "°C" => (format!("{:.1} °C", c.value), format!("{:.0} °C", c.limit)),
                        u => (notation::format(c.value, u, 3), notation::format(c.limit, u, 3)),
                    };
                    view! {
                        <tr class:fail=!c.pass class:binding=c.binding data-testid=format!("check-{}", c.key)>
                            <th scope="row">{c.label.clone()}</th>
                            <td data-si=format!("{:e}", c.value)>{v}</td>
                            <td>{l}</td>
                            <td>{format!("{:+.0} %", c.margin * 100.0)}</td>
                            <td class="verdict">{if c.pass { "pass" } else { "FAIL" }}</td>
                            <td class="corner">{corner_name(c.corner)}</td>
                        </tr>
                    }
                })
                .collect_view();
            let primary = r.turns.primary;
            let sec = r.turns.secondaries.first().copied().unwrap_or(0);
            view! {
                <p class="verdict-line" class:fail=!r.pass data-testid="verdict">{verdict}</p>
                <table class="figures checks">
                    <thead><tr><th scope="col">"Check"</th><th scope="col">"Value"</th><th scope="col">"Limit"</th><th scope="col">"Margin"</th><th scope="col"></th><th scope="col">"Worst"</th></tr></thead>
                    <tbody>{checks}</tbody>
                </table>
                <table class="figures">
                    <tbody>
                        {count("np", "Np (primary turns)", primary)}
                        {count("ns", "Ns (first secondary)", sec)}
                        {row("ratio", "Turns ratio Np/Ns1", r.turns_ratio, "", 4)}
                        {row("inductance", "Primary / magnetising inductance", r.inductance, "H", 3)}
                        {row("core-loss", "Core loss", r.losses.core, "W", 3)}
                        {row("cu-loss", "Copper loss", r.losses.copper, "W", 3)}
                        {row("total-loss", "Total loss", r.losses.total, "W", 3)}
                        {row("temperature", "Hot spot", r.thermal.temperature, "°C", 3)}
                        {row("efficiency", "Efficiency of the magnetic", r.power.magnetic_efficiency * 100.0, "%", 4)}
                    </tbody>
                </table>
                <p class="core-note" data-testid="turns-reason">{r.turns_reason.clone()}</p>
                <Notes cautions=r.cautions.clone() warnings=r.warnings.clone() />
            }
            .into_any()
        }
    }
}

/// Safety cautions first, then the engine's warnings.
#[component]
fn Notes(cautions: Vec<String>, warnings: Vec<String>) -> impl IntoView {
    let none = cautions.is_empty();
    view! {
        <div class="cautions" class:hidden=none data-testid="cautions" role="note">
            <strong>"Safety"</strong>
            <ul>{cautions.into_iter().map(|w| view! { <li>{w}</li> }).collect_view()}</ul>
        </div>
        <ul class="warnings" data-testid="warnings">
            {warnings.into_iter().map(|w| view! { <li>{w}</li> }).collect_view()}
        </ul>
    }
}
