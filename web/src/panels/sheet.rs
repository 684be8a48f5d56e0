//! The printed build sheet: hidden on screen, the only thing printed.
//!
//! What a winder and the engineer signing the part off need on one page:
//! the design and its specification, core, material and gap, the
//! inductance to measure, every section and tape in winding order from
//! the bobbin outward (turns, conductor, layers, start and finish side,
//! direction, margins), the losses and temperature to expect, the checks,
//! the cautions, and lines to sign. Every figure is a report field.

use super::results::{corner_name, gap_text};
use super::windings::{conductor_text, css_colour, direction_name, margins_text, mm, section_layout, side_name};
use crate::form::{Outcome, Report};
use leptos::prelude::*;
use magwright_engine::notation;
use magwright_engine::topology::Topology;
use magwright_engine::winding::stackup::Item;

/// Print rules for the sheet. index.html hides the page's header and main
/// grid; this also hides every other top-level part (the suggestion panel,
/// overlays), so the sheet is all that prints.
const CSS: &str = r#"
@media print {
  @page { margin:11mm 12mm; }
  body > *:not(.sheet) { display:none !important; }
  .sheet { display:block !important; font-size:9pt; line-height:1.25; }
  .sheet * { print-color-adjust:exact; -webkit-print-color-adjust:exact; }
  .sheet .sheet-head { display:flex; justify-content:space-between; align-items:baseline; border-bottom:2px solid #000; margin-bottom:.2rem; }
  .sheet .sheet-head h1 { margin:0; }
  .sheet .sheet-head .meta { color:#333; font-size:9pt; }
  .sheet h2 { font-size:10.5pt !important; margin:.55rem 0 .15rem !important; }
  .sheet .two { display:grid; grid-template-columns:1fr 1fr; gap:0 1.4rem; }
  .sheet .two .sheet-table { width:100%; }
  .sheet .sheet-table tbody th { width:auto !important; white-space:nowrap; padding-right:.8rem; }
  .sheet table.stack { width:100%; border-collapse:collapse; font-size:8.8pt; }
  .sheet table.stack th, .sheet table.stack td { border-bottom:1px solid #bbb; padding:.08rem .3rem .08rem 0; text-align:left; vertical-align:top; font-weight:normal; }
  .sheet table.stack thead th { font-weight:600; border-bottom:1px solid #000; }
  .sheet table.stack td.n { text-align:right; font-variant-numeric:tabular-nums; white-space:nowrap; }
  .sheet table.stack tr.tape td { color:#444; font-style:italic; }
  .sheet .swatch { display:inline-block; width:.7em; height:.7em; margin-right:.3em; border:1px solid #000; vertical-align:-1px; }
  .sheet .turns { margin:.25rem 0 0; font-weight:600; }
  .sheet .verdict { font-weight:600; margin:.1rem 0; }
  .sheet .verdict.fail { color:#a00; }
  .sheet ul { margin:.1rem 0; padding-left:1rem; }
  .sheet .cautions { font-size:8.3pt; }
  .sheet .cautions li { margin:.03rem 0; }
  .sheet .cautions li.caution { font-weight:600; }
  .sheet .sign { display:grid; grid-template-columns:1fr 1fr 1fr; gap:.2rem 1.2rem; margin-top:.4rem; break-inside:avoid; }
  .sheet .sign div { border-top:1px solid #000; margin-top:1.3rem; padding-top:.05rem; font-size:8pt; color:#333; }
}
"#;

fn spec_rows(r: &Report) -> impl IntoView {
    let op = &r.waveforms.at_vin_min;
    let outs: Vec<String> = op.output_voltages.iter().map(|v| format!("{v:.2} V")).collect();
    let duty = r
        .waveforms
        .get("duty")
        .map(|d| format!("{:.1} % {}", d.value * 100.0, corner_name(Some(d.corner))));
    view! {
        <table class="sheet-table"><tbody>
            <tr><th scope="row">"Topology"</th><td data-testid="sheet-topology">{r.topology.name()}</td></tr>
            <tr><th scope="row">"DC input (worst case)"</th><td>{format!("{:.1} to {:.1} V, nominal {:.1} V", r.dc.min, r.dc.max, r.dc.nominal)}</td></tr>
            <tr><th scope="row">"Switching frequency"</th><td>{notation::format(r.frequency, "Hz", 3)}</td></tr>
            <tr><th scope="row">"Output power"</th><td>{notation::format(r.power.output, "W", 3)}</td></tr>
            <tr><th scope="row">"Outputs as wound"</th><td>{format!("{} at Vin min", outs.join(", "))}</td></tr>
            <tr><th scope="row">"Duty"</th><td>{duty.unwrap_or_default()}</td></tr>
        </tbody></table>
    }
}

fn core_rows(r: &Report) -> impl IntoView {
    let flyback = r.topology == Topology::Flyback;
    let al = r
        .gap
        .as_ref()
        .map(|g| format!("{} /turn²", notation::format(g.al, "H", 3)));
    view! {
        <table class="sheet-table"><tbody>
            <tr><th scope="row">"Core"</th><td data-testid="sheet-core">{r.core.designation.clone()}</td></tr>
            <tr><th scope="row">"Material"</th><td data-testid="sheet-material">{r.material.name.clone()}</td></tr>
            <tr><th scope="row">"Gap"</th><td data-testid="sheet-gap">{gap_text(r)}</td></tr>
            {al.map(|a| view! { <tr><th scope="row">"AL"</th><td>{a}</td></tr> })}
            <tr>
                <th scope="row">{if flyback { "Primary inductance" } else { "Magnetising inductance" }}</th>
                <td data-testid="sheet-inductance" data-si=format!("{:e}", r.inductance)>{format!("{} (primary, others open)", notation::format(r.inductance, "H", 3))}</td>
            </tr>
            {r.leakage.map(|l| view! { <tr><th scope="row">"Leakage (expected)"</th><td>{format!("{} (primary, others shorted)", notation::format(l, "H", 3))}</td></tr> })}
        </tbody></table>
    }
}

/// Every item bobbin outward: sections with their winding instructions,
/// tapes as their own rows.
fn stack_rows(r: &Report) -> impl IntoView {
    let last = r.stackup.items.len().saturating_sub(1);
    r.stackup
        .items
        .iter()
        .enumerate()
        .map(|(i, it)| match it {
            Item::Section(s) => {
                let w = r.stackup.winding_index(&s.winding).unwrap_or(0);
                let (layers, tpl, build) = section_layout(r, i);
                let between =
                    s.interlayer.as_ref().map(|t| format!("; {} × {:.3} mm between layers", t.wraps, t.thickness * 1e3)).unwrap_or_default();
                view! {
                    <tr class="section" data-testid=format!("sheet-item-{i}")>
                        <td class="n">{i + 1}</td>
                        <td><span class="swatch" style=css_colour(w)></span>{s.winding.clone()}</td>
                        <td class="n" data-testid=format!("sheet-turns-{i}")>{s.turns}</td>
                        <td>{conductor_text(&s.conductor, s.parallel)}</td>
                        <td class="n">{format!("{layers} × {tpl}")}</td>
                        <td>{format!("{} → {}", side_name(s.start), side_name(s.finish))}</td>
                        <td>{direction_name(s.direction)}</td>
                        <td>{format!("{}{between}", margins_text(s))}</td>
                        <td class="n">{mm(build)}</td>
                    </tr>
                }
                .into_any()
            }
            Item::Tape(t) => view! {
                <tr class="tape" data-testid=format!("sheet-item-{i}")>
                    <td class="n">{i + 1}</td>
                    <td colspan="7">{format!("Tape: {} wrap{} × {:.3} mm {}{}", t.wraps, if t.wraps == 1 { "" } else { "s" }, t.thickness * 1e3, t.material, if i == last { ", over the top" } else { "" })}</td>
                    <td class="n">{mm(t.build())}</td>
                </tr>
            }
            .into_any(),
            Item::Screen(sc) => view! {
                <tr class="tape" data-testid=format!("sheet-item-{i}")>
                    <td class="n">{i + 1}</td>
                    <td colspan="7">{format!("Screen: {} {:.3} mm, connected to {}", sc.material, sc.thickness * 1e3, sc.connection)}</td>
                    <td class="n">{mm(sc.thickness)}</td>
                </tr>
            }
            .into_any(),
        })
        .collect_view()
}

fn body(r: &Report) -> impl IntoView {
    let mut turns = vec![("sheet-np".to_string(), "Np", r.turns.primary)];
    for (i, n) in r.turns.secondaries.iter().enumerate() {
        turns.push((
            if i == 0 {
                "sheet-ns".to_string()
            } else {
                format!("sheet-ns-{}", i + 1)
            },
            "Ns",
            *n,
        ));
    }
    if let Some(nr) = r.turns.reset {
        turns.push(("sheet-nreset".to_string(), "Nreset", nr));
    }
    let n_sec = r.turns.secondaries.len();
    let failing: Vec<String> = r
        .checks
        .iter()
        .filter(|c| !c.pass)
        .map(|c| format!("{} ({:+.0} %)", c.label, c.margin * 100.0))
        .collect();
    let verdict = if failing.is_empty() {
        "Passes every check Magwright makes.".to_string()
    } else {
        format!("FAILS: {}.", failing.join(", "))
    };
    let b_pk = r
        .waveforms
        .get("b_peak")
        .map(|b| format!("{:.0} mT {}", b.value * 1e3, corner_name(Some(b.corner))));
    let name = if r.name.trim().is_empty() {
        "unnamed design".to_string()
    } else {
        r.name.clone()
    };
    view! {
        <div class="sheet-head">
            <h1 data-testid="sheet-name">{format!("Build sheet: {name}")}</h1>
            <span class="meta">{format!("Magwright · {} · {}", r.topology.name(), r.core.designation)}</span>
        </div>
        <div class="two">
            <div><h2>"Specification"</h2>{spec_rows(r)}</div>
            <div><h2>"Core and material"</h2>{core_rows(r)}</div>
        </div>
        <h2>"Windings, bobbin outward"</h2>
        <table class="stack" data-testid="sheet-stack">
            <thead><tr>
                <th>"#"</th><th>"Winding"</th><th>"Turns"</th><th>"Conductor"</th><th>"Layers × turns"</th>
                <th>"Start → finish"</th><th>"Direction"</th><th>"Margins, tape"</th><th>"Build"</th>
            </tr></thead>
            <tbody>{stack_rows(r)}</tbody>
        </table>
        <p class="turns">
            {turns.into_iter().enumerate().map(|(i, (id, what, n))| {
                let label = if what == "Ns" && n_sec > 1 { format!("Ns{i}") } else { what.to_string() };
                view! { {if i > 0 { " · " } else { "" }}<span data-testid=id data-si=n.to_string()>{format!("{label} = {n}")}</span> }
            }).collect_view()}
            {format!(" · build {} of {} · copper fill {:.0} %", mm(r.fit.total_build), mm(r.fit.available_build), r.fit.fill_factor * 100.0)}
        </p>
        <div class="two">
            <div>
                <h2>"Expected losses"</h2>
                <table class="sheet-table"><tbody>
                    <tr><th scope="row">"Core"</th><td>{notation::format(r.losses.core, "W", 3)}</td></tr>
                    <tr><th scope="row">"Copper"</th><td>{format!("{} (DC {})", notation::format(r.losses.copper, "W", 3), notation::format(r.losses.copper_dc, "W", 2))}</td></tr>
                    <tr><th scope="row">"Total"</th><td data-testid="sheet-total" data-si=format!("{:e}", r.losses.total)>{notation::format(r.losses.total, "W", 3)}</td></tr>
                    <tr><th scope="row">"Efficiency of the magnetic"</th><td>{format!("{:.2} %", r.power.magnetic_efficiency * 100.0)}</td></tr>
                </tbody></table>
            </div>
            <div>
                <h2>"Expected temperature and flux"</h2>
                <table class="sheet-table"><tbody>
                    <tr><th scope="row">"Core temperature (mean surface)"</th><td data-testid="sheet-temperature">{format!("{:.1} °C ({:.1} K rise)", r.thermal.temperature, r.thermal.rise)}</td></tr>
                    <tr><th scope="row">"Losses taken"</th><td>{corner_name(Some(r.loss_corner))}</td></tr>
                    <tr><th scope="row">"Peak flux density"</th><td>{b_pk.unwrap_or_default()}</td></tr>
                    <tr><th scope="row">"Checks"</th><td class="verdict" class:fail=!r.pass>{verdict}</td></tr>
                </tbody></table>
            </div>
        </div>
        <h2>"Cautions"</h2>
        <ul class="cautions" data-testid="sheet-cautions">
            {r.cautions.iter().map(|w| view! { <li class="caution">{w.clone()}</li> }).collect_view()}
            {r.warnings.iter().map(|w| view! { <li>{w.clone()}</li> }).collect_view()}
            <li data-testid="sheet-standing-caution">{magwright_engine::topology::spec::STANDING_CAUTION}</li>
            <li>"Core and material data are typical values: check them against your supplier's data, and measure the first part."</li>
        </ul>
        <div class="sign" data-testid="sheet-sign">
            <div>"Designed by / date"</div>
            <div>"Checked by / date"</div>
            <div>"Wound by / date"</div>
            <div>{format!("Inductance measured (expected {})", notation::format(r.inductance, "H", 3))}</div>
            <div>"Dielectric test per the applicable standard: result / by"</div>
            <div>"Approved for use by / date"</div>
        </div>
    }
}

/// The build sheet.
#[component]
pub fn BuildSheet(outcome: Memo<Outcome>) -> impl IntoView {
    let content = move || match outcome.get() {
        Ok(r) => body(&r).into_any(),
        Err(_) => view! {
            <h1>"Magwright build sheet"</h1>
            <p>"No design to print: fix the marked entries first."</p>
        }
        .into_any(),
    };
    view! {
        <section class="sheet" data-testid="build-sheet">
            <style>{CSS}</style>
            {content}
        </section>
    }
}
