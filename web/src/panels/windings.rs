//! Windings: what to wind with which wire, each winding's losses, the
//! stack-up export, and the winding window to scale.

use crate::form::Outcome;
use crate::plot::{self, Kind, Rect};
use crate::ui::PlotCanvas;
use leptos::prelude::*;
use magwright_engine::notation;

/// The layers of the fit, to scale: x across the build (from the bobbin),
/// y along the breadth. Primary windings blue, others orange, tapes grey.
fn window_rects(r: &crate::form::Report) -> Vec<Rect> {
    let c = &r.core;
    let mut v = vec![Rect {
        x: 0.0,
        y: 0.0,
        w: c.winding_height,
        h: c.winding_breadth,
        kind: Kind::Bobbin,
        label: format!("{} × {}", notation::format(c.winding_height, "m", 3), notation::format(c.winding_breadth, "m", 3)),
    }];
    let first = r.stackup.windings.first().map(|w| w.name.clone()).unwrap_or_default();
    for l in &r.fit.layers {
        let name = r.stackup.windings.get(l.winding).map(|w| w.name.clone()).unwrap_or_default();
        let kind = if name.starts_with("primary") || name == first { Kind::Primary } else { Kind::Secondary };
        let margin = (c.winding_breadth - l.breadth).max(0.0) / 2.0;
        v.push(Rect { x: l.h_bottom, y: margin, w: l.height, h: l.breadth, kind, label: name });
    }
    v
}

/// The windings table and the window drawing.
#[component]
pub fn Windings(form: crate::form::Form, outcome: Memo<Outcome>) -> impl IntoView {
    let _ = form;
    let draw = move |c: &web_sys::HtmlCanvasElement| match outcome.get() {
        Ok(r) => plot::cross_section(c, &window_rects(&r)),
        Err(_) => Ok(()),
    };
    let table = move || {
        outcome.get().ok().map(|r| {
            let rows = r
                .wires
                .iter()
                .map(|w| {
                    let loss = r.operating.copper.windings.iter().find(|x| x.name == w.winding);
                    let (rdc, fr, p) = loss.map_or((0.0, 1.0, 0.0), |l| (l.rdc, l.fr, l.ac_loss));
                    let wire = if w.parallel > 1 { format!("{} × {}", w.parallel, w.conductor) } else { w.conductor.clone() };
                    view! {
                        <tr data-testid=format!("winding-{}", w.winding.replace(' ', "-"))>
                            <th scope="row">{w.winding.clone()}</th>
                            <td data-si=w.turns.to_string()>{w.turns}</td>
                            <td>{wire}</td>
                            <td data-si=format!("{:e}", w.rms_current)>{notation::format(w.rms_current, "A", 3)}</td>
                            <td data-si=format!("{rdc:e}")>{notation::format(rdc, "Ω", 3)}</td>
                            <td data-si=format!("{fr:e}")>{format!("{fr:.2}")}</td>
                            <td data-si=format!("{p:e}")>{notation::format(p, "W", 3)}</td>
                        </tr>
                    }
                })
                .collect_view();
            view! {
                <table class="figures windings-table">
                    <thead><tr><th scope="col">"Winding"</th><th scope="col">"Turns"</th><th scope="col">"Wire"</th><th scope="col">"RMS"</th><th scope="col">"Rdc"</th><th scope="col">"Fr"</th><th scope="col">"Loss"</th></tr></thead>
                    <tbody>{rows}</tbody>
                </table>
            }
        })
    };
    let export = move |_| {
        if let Ok(r) = outcome.get_untracked() {
            if let Err(e) = crate::browser::download("magwright-stackup.json", "application/json", &r.stackup_json) {
                leptos::logging::warn!("stack-up export: {e}");
            }
        }
    };
    view! {
        {table}
        <button type="button" class="small" data-testid="export-stackup" on:click=export>"Download stack-up (JSON)"</button>
        <figure class="plot" class:hidden=move || outcome.with(|o| o.is_err())>
            <PlotCanvas testid="window-plot" label="Winding window cross-section, to scale" width=520 height=250 draw=draw />
            <figcaption>"One side of the winding window, to scale: bobbin outward, each layer coloured by winding."</figcaption>
        </figure>
    }
}
