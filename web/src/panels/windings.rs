//! Windings: the stack-up editor and what it gives.
//!
//! * The table of windings: turns, conductor and conductors in hand, RMS
//!   current, DC resistance, the AC factor Fr and the loss of each, at the
//!   operating temperature and loss corner (the report's
//!   `operating.copper`); the loss of every layer on demand; why each
//!   conductor was chosen ([`super::conductor_choice`]).
//! * The editor: interleaving, a conductor fixed per winding ("automatic"
//!   hands it back to the solver), insulation and window use. Every edit
//!   goes into the form and the design is recomputed at once; when the
//!   engine refuses it (a section that no longer fits the window, say) its
//!   message is shown here, beside the controls that caused it, and the
//!   controls stay so the edit can be undone.
//! * The sections as wound, bobbin outward, and the stack-up export in the
//!   engine's JSON schema.
//! * The winding window to scale: each winding in its own colour (the same
//!   colour in the table, the list and the drawing), turns drawn as the
//!   conductors they are, tapes and flange margins.
//!
//! The drawing is done here with plotters rather than with
//! `plot::cross_section`, whose rectangle kinds have one colour for all
//! primaries and one for all secondaries: a reset winding or a second
//! output could not be told apart there.

use super::results::gap_text;
use crate::form::{self, Form, Group, Outcome, Problem, Report};
use super::order_editor::{order_of, order_suits, OrderEditor};
use super::wire_editor::WireRow;
use crate::ui::PlotCanvas;
use leptos::prelude::*;
use magwright_engine::design::file::{Construction, Interleave, SectionTurns};
use magwright_engine::notation;
use magwright_engine::winding::conductor::Conductor;
use magwright_engine::winding::stackup::{Direction, Item, Section, Side};
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};

const CSS: &str = r#"
.windings .swatch { display:inline-block; width:.8em; height:.8em; border-radius:2px; margin-right:.35em; vertical-align:-1px; border:1px solid rgba(0,0,0,.35); }
.windings table.windings-table td.cond { text-align:left; white-space:normal; font-size:.92em; }
.windings table.windings-table tfoot th, .windings table.windings-table tfoot td { font-weight:600; color:var(--ink); border-top:1px solid var(--line); }
.windings table.windings-table tbody th { white-space:nowrap; }
.windings .auto { color:var(--muted); font-size:.85em; }
.windings details { margin:.1rem 0 .5rem; font-size:.88em; }
.windings details summary { cursor:pointer; color:var(--accent); }
.windings .wind-error { border-left:4px solid var(--bad); background:#fff6f5; color:#8a1c14; padding:.35rem .6rem; margin:.3rem 0 .5rem; border-radius:3px; }
.windings .wind-error strong { display:block; }
.windings fieldset { border:1px solid var(--line); border-radius:4px; margin:.4rem 0; padding:.3rem .6rem .2rem; }
.windings legend { font-weight:600; font-size:.88em; padding:0 .3rem; }
.windings .wire-row { display:grid; grid-template-columns: minmax(9rem, 1.3fr) 1fr 1fr; gap:0 .6rem; align-items:end; }
.windings .wire-row .field label .swatch { margin-right:.3em; }
.windings ol.order { margin:.2rem 0 .5rem; padding-left:1.6rem; font-size:.88em; }
.windings ol.order li { margin:.12rem 0; }
.windings ol.order li.tape { color:var(--muted); }
.windings ol.order .what { font-weight:600; }
.windings h3 { font-size:.9rem; margin:.6rem 0 .15rem; }
.windings .stale { opacity:.45; }
.windings ol.order-edit { margin:.2rem 0 .4rem; padding-left:.4rem; font-size:.9em; list-style:none; }
.windings ol.order-edit .pos { color:var(--muted); min-width:1.3rem; text-align:right; }
.windings ol.order-edit li { margin:.15rem 0; display:flex; flex-wrap:wrap; align-items:center; gap:.3rem; }
.windings ol.order-edit li.bad { outline:2px solid var(--bad); outline-offset:1px; border-radius:3px; }
.windings ol.order-edit .sec { flex:1 1 8rem; }
.windings ol.order-edit .share { color:var(--muted); flex:0 0 7.5rem; }
.windings ol.order-edit button { min-width:2rem; margin:0; }
.windings .order-add { display:flex; gap:.4rem; align-items:end; flex-wrap:wrap; }
"#;

/// Winding colours, by position in the stack-up's list of windings:
/// copper-orange for the primary, then hues told apart also by people
/// with the common colour-vision deficiencies.
pub const PALETTE: [(u8, u8, u8); 8] = [
    (204, 102, 0),
    (0, 114, 178),
    (0, 158, 115),
    (204, 121, 167),
    (86, 180, 233),
    (213, 94, 0),
    (120, 60, 160),
    (150, 130, 20),
];

/// The colour of winding `i`.
pub fn colour(i: usize) -> (u8, u8, u8) {
    PALETTE[i % PALETTE.len()]
}

/// The colour of winding `i` for CSS.
pub fn css_colour(i: usize) -> String {
    let (r, g, b) = colour(i);
    format!("background:rgb({r},{g},{b})")
}

/// A name as it goes into a test id or element id: "secondary 1" → "secondary-1".
pub fn slug(name: &str) -> String {
    name.chars()
        .map(|c| {
            if c.is_ascii_alphanumeric() {
                c.to_ascii_lowercase()
            } else {
                '-'
            }
        })
        .collect()
}

/// Millimetres, two decimals.
pub fn mm(x: f64) -> String {
    format!("{:.2} mm", x * 1e3)
}

pub fn side_name(s: Side) -> &'static str {
    match s {
        Side::Left => "left",
        Side::Right => "right",
    }
}

pub fn direction_name(d: Direction) -> &'static str {
    match d {
        Direction::Clockwise => "clockwise",
        Direction::CounterClockwise => "counter-clockwise",
    }
}

/// Margins of a section as a builder reads them.
pub fn margins_text(s: &Section) -> String {
    if s.margin_left <= 0.0 && s.margin_right <= 0.0 {
        "none".into()
    } else if (s.margin_left - s.margin_right).abs() < 1e-9 {
        format!("{:.1} mm each flange", s.margin_left * 1e3)
    } else {
        format!(
            "{:.1} mm left, {:.1} mm right",
            s.margin_left * 1e3,
            s.margin_right * 1e3
        )
    }
}

/// "3 × litz 60 × 0.100 mm" or the conductor alone.
pub fn conductor_text(c: &Conductor, parallel: u32) -> String {
    if parallel > 1 {
        format!("{parallel} × {}", c.describe())
    } else {
        c.describe()
    }
}

/// Layers, turns per layer and radial build of the section at item `i`,
/// as the engine's fit laid it out (zeros if the fit has no such section).
pub fn section_layout(r: &Report, i: usize) -> (u32, u32, f64) {
    r.fit.sections.iter().find(|f| f.item == i).map_or((0, 0, 0.0), |f| (f.layers, f.turns_per_layer, f.build))
}

/// The sections and tapes as wound, bobbin outward, one line each.
fn order_list(r: &Report) -> impl IntoView {
    let last = r.stackup.items.len().saturating_sub(1);
    let items = r
        .stackup
        .items
        .iter()
        .enumerate()
        .map(|(i, it)| match it {
            Item::Section(s) => {
                let w = r.stackup.winding_index(&s.winding).unwrap_or(0);
                let (layers, tpl, build) = section_layout(r, i);
                let between = s
                    .interlayer
                    .as_ref()
                    .map(|t| format!(" · {} × {:.3} mm {} between layers", t.wraps, t.thickness * 1e3, t.material))
                    .unwrap_or_default();
                let text = format!(
                    " — {} turns of {} · {} layer{} of {} · start {}, finish {} · {} · margins {} · build {}{}",
                    s.turns,
                    conductor_text(&s.conductor, s.parallel),
                    layers,
                    if layers == 1 { "" } else { "s" },
                    tpl,
                    side_name(s.start),
                    side_name(s.finish),
                    direction_name(s.direction),
                    margins_text(s),
                    mm(build),
                    between
                );
                view! {
                    <li class="section" data-testid=format!("order-{i}")>
                        <span class="swatch" style=css_colour(w)></span>
                        <span class="what">{s.winding.clone()}</span>{text}
                    </li>
                }
                .into_any()
            }
            Item::Tape(t) => {
                let place = if i == last { " over the top" } else { "" };
                view! {
                    <li class="tape" data-testid=format!("order-{i}")>
                        <span class="what">"Tape"</span>
                        {format!(" — {} wrap{} × {:.3} mm {}{place} ({})", t.wraps, if t.wraps == 1 { "" } else { "s" }, t.thickness * 1e3, t.material, mm(t.build()))}
                    </li>
                }
                .into_any()
            }
            Item::Screen(sc) => view! {
                <li class="tape" data-testid=format!("order-{i}")>
                    <span class="what">"Screen"</span>
                    {format!(" — {} {:.3} mm, connected to {}", sc.material, sc.thickness * 1e3, sc.connection)}
                </li>
            }
            .into_any(),
        })
        .collect_view();
    view! { <ol class="order" data-testid="stackup-order">{items}</ol> }
}

/// The windings table, with totals and the per-layer losses on demand.
fn table(r: &Report) -> impl IntoView {
    let copper = &r.operating.copper;
    let rows = r
        .wires
        .iter()
        .map(|w| {
            let loss = copper.windings.iter().find(|x| x.name == w.winding);
            let (rdc, fr, p) = loss.map_or((0.0, 1.0, 0.0), |l| (l.rdc, l.fr, l.total_loss));
            let s = slug(&w.winding);
            let ci = r.stackup.winding_index(&w.winding).unwrap_or(0);
            view! {
                <tr data-testid=format!("winding-{s}")>
                    <th scope="row"><span class="swatch" style=css_colour(ci)></span>{w.winding.clone()}</th>
                    <td data-testid=format!("turns-{s}") data-si=w.turns.to_string()>{w.turns}</td>
                    <td class="cond" data-testid=format!("wire-of-{s}") title=w.conductor.clone()>
                        {w.conductor.split(" (").next().unwrap_or_default().to_string()}
                        {(!w.automatic).then(|| view! { <span class="auto">" (fixed)"</span> })}
                    </td>
                    <td data-testid=format!("parallel-{s}") data-si=w.parallel.to_string()>{w.parallel}</td>
                    <td data-testid=format!("rms-{s}") data-si=format!("{:e}", w.rms_current)>{notation::format(w.rms_current, "A", 3)}</td>
                    <td data-testid=format!("rdc-{s}") data-si=format!("{rdc:e}")>{notation::format(rdc, "Ω", 3)}</td>
                    <td data-testid=format!("fr-{s}") data-si=format!("{fr:e}")>{format!("{fr:.2}")}</td>
                    <td data-testid=format!("loss-{s}") data-si=format!("{p:e}")>{notation::format(p, "W", 3)}</td>
                </tr>
            }
        })
        .collect_view();
    let mut layers: Vec<(f64, String, usize, u32, f64)> = copper
        .windings
        .iter()
        .flat_map(|w| {
            w.layers
                .iter()
                .map(move |l| (l.h_bottom, w.name.clone(), l.item, l.layer, l.loss))
        })
        .collect();
    layers.sort_by(|a, b| a.0.total_cmp(&b.0));
    let layer_rows = layers
        .into_iter()
        .map(|(h, name, item, layer, loss)| {
            let ci = r.stackup.winding_index(&name).unwrap_or(0);
            view! {
                <tr>
                    <th scope="row"><span class="swatch" style=css_colour(ci)></span>{name}</th>
                    <td>{item + 1}</td>
                    <td>{layer + 1}</td>
                    <td>{mm(h)}</td>
                    <td data-si=format!("{loss:e}")>{notation::format(loss, "W", 3)}</td>
                </tr>
            }
        })
        .collect_view();
    view! {
        <table class="figures windings-table" data-testid="windings-table">
            <thead><tr>
                <th scope="col">"Winding"</th><th scope="col">"Turns"</th><th scope="col">"Conductor"</th>
                <th scope="col" title="Conductors in hand">"×"</th><th scope="col">"RMS"</th><th scope="col">"Rdc"</th>
                <th scope="col" title="AC resistance factor over the waveform: loss / DC loss">"Fr"</th><th scope="col">"Loss"</th>
            </tr></thead>
            <tbody>{rows}</tbody>
            <tfoot><tr>
                <th scope="row" colspan="7">{format!("Copper at {:.0} °C, {}", copper.temperature, super::results::corner_name(Some(r.operating.corner)))}</th>
                <td data-testid="copper-total" data-si=format!("{:e}", copper.total)>{notation::format(copper.total, "W", 3)}</td>
            </tr></tfoot>
        </table>
        <details data-testid="layer-losses">
            <summary>"Loss of each layer, bobbin outward"</summary>
            <table class="figures windings-table">
                <thead><tr><th scope="col">"Winding"</th><th scope="col">"Item"</th><th scope="col">"Layer"</th><th scope="col">"From bobbin"</th><th scope="col">"Loss"</th></tr></thead>
                <tbody>{layer_rows}</tbody>
            </table>
        </details>
    }
}

/// The windings table, the editor, the sections as wound, the export and
/// the window to scale.
#[component]
pub fn Windings(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    // The windings of the last good design (so the editor stays while the
    // engine refuses an edit), plus any winding an override still names.
    let names = Memo::new(move |prev: Option<&Vec<String>>| {
        let mut v: Vec<String> = outcome.with(|o| match o {
            Ok(r) => r.stackup.windings.iter().map(|w| w.name.clone()).collect(),
            Err(_) => prev.cloned().unwrap_or_default(),
        });
        form.wires.with(|ws| {
            for o in ws {
                if !v.contains(&o.winding) {
                    v.push(o.winding.clone());
                }
            }
        });
        v
    });
    let refused = move || {
        outcome.with(|o| match o {
            Err(p @ Problem::Engine(_)) => Some(view! {
                <div class="wind-error" role="alert" data-testid="windings-error">
                    <strong>"The engine refused this design:"</strong>
                    {p.lines().join("; ")}
                </div>
            }),
            _ => None,
        })
    };
    let report_part = move || {
        outcome.get().ok().map(|r| {
            view! {
                {table(&r)}
                {super::conductor_choice::conductor_choice(&r)}
                <h3>"As wound, bobbin outward"</h3>
                {order_list(&r)}
                <p class="core-note">{format!("Core {} in {}; gap {}.", r.core.designation, r.material.name, gap_text(&r))}</p>
            }
        })
    };
    let draw = move |c: &web_sys::HtmlCanvasElement| match outcome.get() {
        Ok(r) => draw_window(c, &r),
        Err(_) => Ok(()),
    };
    let export = move |_| {
        if let Ok(r) = outcome.get_untracked() {
            if let Err(e) = crate::browser::download("magwright-stackup.json", "application/json", &r.stackup_json) {
                leptos::logging::warn!("stack-up export: {e}");
            }
        }
    };
    let interleave = [
        (Interleave::Auto, "Automatic"),
        (Interleave::Sequential, "Sequential (P-S)"),
        (Interleave::SplitPrimary, "Split primary (P-S-P)"),
        (Interleave::SplitSecondaries, "Split others (S-P-S)"),
        (Interleave::MirroredHalves, "Mirrored halves (SA-P-SB)"),
        (Interleave::Custom, "Custom order"),
    ];
    // The sections as last wound (kept while the engine refuses an edit):
    // what a custom order starts from, so choosing Custom changes nothing.
    let last_order = Memo::new(move |prev: Option<&Vec<SectionTurns>>| {
        outcome.with(|o| match o {
            Ok(r) => order_of(r),
            Err(_) => prev.cloned().unwrap_or_default(),
        })
    });
    // What the engine built, where it builds reinforced insulation.
    let built = move || {
        outcome.with(|o| match o {
            Ok(r) => match r.winding_choice.construction {
                Some(Construction::TripleInsulated) => "Reinforced insulation as built: triple-insulated secondaries, no margins.",
                Some(Construction::MarginWound) => "Reinforced insulation as built: margins at both flanges, 3 wraps between sections.",
                Some(Construction::Auto) => "Reinforced insulation as built: chosen by loss.",
                None => "No reinforced insulation with hazardous voltage is asked, so no construction is built for it.",
            },
            Err(_) => "",
        })
    };
    let pick_interleave = move |ev: leptos::ev::Event| {
        let Some((v, _)) = event_target_value(&ev).parse::<usize>().ok().and_then(|i| interleave.get(i).copied()) else {
            return;
        };
        if v == Interleave::Custom {
            let seed = last_order.get_untracked();
            let fits = names.with_untracked(|n| form.section_order.with_untracked(|o| order_suits(o, n)));
            if !fits && !seed.is_empty() {
                form.section_order.set(seed);
            }
        }
        form.interleave.set(v);
    };
    let caption = move || {
        outcome.with(|o| {
            o.as_ref()
                .map(|r| {
                    format!(
                        "One side of the winding window to scale, bobbin at the bottom, flanges at the sides. Build {} of {} ({:.0} %); copper fills {:.0} % of the window.",
                        mm(r.fit.total_build),
                        mm(r.fit.available_build),
                        r.fit.build_fraction * 100.0,
                        r.fit.fill_factor * 100.0
                    )
                })
                .unwrap_or_default()
        })
    };
    let each = move || names.get().into_iter().enumerate().collect::<Vec<_>>();
    view! {
        <style>{CSS}</style>
        {refused}
        {report_part}
        <div class="actions">
            <button type="button" class="small" data-testid="export-stackup" disabled=move || outcome.with(|o| o.is_err()) on:click=export>
                "Download stack-up (JSON)"
            </button>
        </div>
        <figure class="plot" class:hidden=move || outcome.with(|o| o.is_err())>
            <PlotCanvas testid="window-plot" label="Winding window cross-section, to scale" width=560 height=250 draw=draw />
            <figcaption>{caption}</figcaption>
        </figure>
        <h3>"Edit the stack-up"</h3>
        <div class="fields">
            <div class="field">
                <label for="f-interleave" title="Order of the sections from the bobbin outward; splitting a winding around the others lowers proximity loss and leakage">"Interleaving"</label>
                <select id="f-interleave" on:change=pick_interleave>
                    {interleave.iter().enumerate().map(|(i, (v, l))| {
                        let v = *v;
                        view! { <option value=i.to_string() prop:selected=move || form.interleave.get() == v>{*l}</option> }
                    }).collect_view()}
                </select>
                <div class="msg"></div>
            </div>
        </div>
        <OrderEditor form=form outcome=outcome names=names />
        <fieldset data-testid="conductors">
            <legend>"Conductor of each winding"</legend>
            <For each=each key=|(i, n): &(usize, String)| (*i, n.clone()) children=move |(i, n)| view! { <WireRow form=form name=n index=i /> } />
        </fieldset>
        <fieldset>
            <legend>"Insulation and window"</legend>
            <div class="fields">
                <form::Pick key="construction" label="Reinforced insulation" value=form.construction
                    options=vec![
                        (Construction::Auto, "Automatic (least loss)"),
                        (Construction::TripleInsulated, "Triple-insulated secondaries"),
                        (Construction::MarginWound, "Margin-wound, 3 wraps"),
                    ]
                    help="How reinforced insulation between primary and secondaries is built on a design with hazardous voltage (ignored otherwise); the safety standard and the wire's and tape's approvals decide" />
                {form::num_fields(form, outcome, Group::Winding)}
            </div>
            <p class="core-note" data-testid="construction-built">{built}</p>
        </fieldset>
    }
}

fn err<E: std::fmt::Display>(e: E) -> String {
    e.to_string()
}

/// The winding window to scale: x along the bobbin from flange to flange,
/// y the build from the bobbin outward, both in mm at the same scale;
/// tapes, flange margins and every turn.
fn draw_window(canvas: &web_sys::HtmlCanvasElement, r: &Report) -> Result<(), String> {
    let root = crate::hidpi::area(canvas)?;
    let (w, h) = root.dim_in_pixel();
    let legend_w = 130u32;
    let (left, bottom, margin) = (40u32, 36u32, 8u32);
    let c = &r.core;
    let (ax, bx) = (c.winding_breadth * 1e3, c.winding_height * 1e3);
    if !(ax > 0.0 && bx > 0.0 && ax.is_finite() && bx.is_finite()) {
        return Ok(());
    }
    let pw = w.saturating_sub(legend_w + left + 2 * margin).max(20) as f64;
    let ph = h.saturating_sub(bottom + 2 * margin).max(20) as f64;
    let pad = 0.03 * ax.max(bx);
    let mm_per_px = ((ax + 2.0 * pad) / pw).max((bx + 2.0 * pad) / ph);
    let (x_lo, y_lo) = (-pad, -pad);
    let (x_hi, y_hi) = (x_lo + pw * mm_per_px, y_lo + ph * mm_per_px);
    let (plot_area, legend_area) = root.split_horizontally(w.saturating_sub(legend_w));
    let ink = RGBColor(29, 37, 48);
    let mut chart = ChartBuilder::on(&plot_area)
        .margin(margin)
        .margin_right(4)
        .x_label_area_size(bottom)
        .y_label_area_size(left)
        .build_cartesian_2d(x_lo..x_hi, y_lo..y_hi)
        .map_err(err)?;
    chart
        .configure_mesh()
        .x_desc("along the bobbin, flange to flange (mm)")
        .y_desc("build (mm)")
        .bold_line_style(RGBColor(236, 238, 242))
        .light_line_style(RGBColor(248, 249, 250))
        .axis_style(RGBColor(150, 158, 170))
        .label_style(("sans-serif", 12).into_font().color(&ink))
        .axis_desc_style(("sans-serif", 12).into_font().color(&ink))
        .draw()
        .map_err(err)?;
    // (build from, along from, build to, along to), metres → chart mm.
    let rect = |b0: f64, a0: f64, b1: f64, a1: f64| [(a0 * 1e3, b0 * 1e3), (a1 * 1e3, b1 * 1e3)];
    let bobbin = RGBColor(232, 236, 242);
    let tape_fill = RGBColor(244, 214, 96);
    let tape_edge = RGBColor(160, 130, 20);
    let margin_fill = RGBColor(176, 182, 192);
    chart
        .draw_series([
            Rectangle::new(rect(0.0, 0.0, c.winding_height, c.winding_breadth), bobbin.filled()),
            Rectangle::new(
                rect(0.0, 0.0, c.winding_height, c.winding_breadth),
                RGBColor(120, 130, 145).stroke_width(1),
            ),
        ])
        .map_err(err)?;
    // The bobbin's core and flanges, drawn as heavier lines.
    let wall = RGBColor(70, 78, 90).stroke_width(3);
    chart
        .draw_series([PathElement::new(vec![(0.0, 0.0), (ax, 0.0)], wall)])
        .map_err(err)?;
    chart
        .draw_series([PathElement::new(vec![(0.0, 0.0), (0.0, bx)], wall)])
        .map_err(err)?;
    chart
        .draw_series([PathElement::new(vec![(ax, 0.0), (ax, bx)], wall)])
        .map_err(err)?;
    let fit = &r.fit;
    let items = &r.stackup.items;
    let breadth = c.winding_breadth;
    let mut has_margin = false;
    let mut has_tape = false;
    // Tapes between sections and over the top span flange to flange.
    for (i, it) in items.iter().enumerate() {
        let y0 = fit.item_bottoms.get(i).copied().unwrap_or(0.0);
        let (t, fill, edge) = match it {
            Item::Tape(t) => (t.build(), tape_fill, tape_edge),
            Item::Screen(s) => (s.thickness, RGBColor(150, 110, 60), RGBColor(90, 60, 30)),
            Item::Section(s) => {
                let build = fit.sections.iter().find(|f| f.item == i).map_or(0.0, |f| f.build);
                for (a, b) in [(0.0, s.margin_left), (breadth - s.margin_right, breadth)] {
                    if b - a > 0.0 && build > 0.0 {
                        has_margin = true;
                        chart
                            .draw_series([
                                Rectangle::new(rect(y0, a, y0 + build, b), margin_fill.filled()),
                                Rectangle::new(rect(y0, a, y0 + build, b), RGBColor(110, 118, 130).stroke_width(1)),
                            ])
                            .map_err(err)?;
                    }
                }
                continue;
            }
        };
        if t > 0.0 {
            has_tape = true;
            chart
                .draw_series([
                    Rectangle::new(rect(y0, 0.0, y0 + t, breadth), fill.filled()),
                    Rectangle::new(rect(y0, 0.0, y0 + t, breadth), edge.stroke_width(1)),
                ])
                .map_err(err)?;
        }
    }
    // Layers: turns drawn as conductors when large enough, else as a band;
    // tape between the layers of a section where it has one.
    let px_per_mm = 1.0 / mm_per_px;
    let mut drawn = 0usize;
    for (k, l) in fit.layers.iter().enumerate() {
        let Some(Item::Section(s)) = items.get(l.item) else {
            continue;
        };
        let (cr, cg, cb) = colour(l.winding);
        let fill = RGBColor(cr, cg, cb);
        let edge = RGBColor(
            (cr as u16 * 3 / 5) as u8,
            (cg as u16 * 3 / 5) as u8,
            (cb as u16 * 3 / 5) as u8,
        );
        let a0 = s.margin_left;
        let x0 = l.h_bottom;
        if let Some(next) = fit.layers.get(k + 1).filter(|n| n.item == l.item) {
            if s.interlayer.is_some() && next.h_bottom > x0 + l.height {
                has_tape = true;
                chart
                    .draw_series([Rectangle::new(
                        rect(x0 + l.height, a0, next.h_bottom, a0 + l.breadth),
                        tape_fill.filled(),
                    )])
                    .map_err(err)?;
            }
        }
        if s.conductor.is_foil() {
            let wid = s.conductor.outer_width().min(l.breadth);
            chart
                .draw_series([
                    Rectangle::new(rect(x0, a0, x0 + l.height, a0 + wid), fill.filled()),
                    Rectangle::new(rect(x0, a0, x0 + l.height, a0 + wid), edge.stroke_width(1)),
                ])
                .map_err(err)?;
            continue;
        }
        let d = s.conductor.outer_width();
        let n = (l.turns as usize).saturating_mul(s.parallel as usize);
        let radius = 0.5 * d * 1e3 * px_per_mm;
        if radius >= 2.0 && drawn + n <= 6000 {
            drawn += n;
            let yc = (x0 + 0.5 * l.height) * 1e3;
            let r_px = radius.floor().max(1.0) as u32;
            let at = |j: usize| ((a0 + d * (j as f64 + 0.5)) * 1e3, yc);
            chart
                .draw_series((0..n).map(|j| Circle::new(at(j), r_px, fill.filled())))
                .map_err(err)?;
            chart
                .draw_series((0..n).map(|j| Circle::new(at(j), r_px, edge.stroke_width(1))))
                .map_err(err)?;
        } else {
            let len = (d * n as f64).min(l.breadth);
            chart
                .draw_series([
                    Rectangle::new(rect(x0, a0, x0 + l.height, a0 + len), fill.filled()),
                    Rectangle::new(rect(x0, a0, x0 + l.height, a0 + len), edge.stroke_width(1)),
                ])
                .map_err(err)?;
        }
    }
    // Legend: every winding by name in its colour, then tape and margins.
    let lf = ("sans-serif", 12)
        .into_font()
        .color(&ink)
        .pos(Pos::new(HPos::Left, VPos::Center));
    let mut entries: Vec<(String, RGBColor)> = r
        .stackup
        .windings
        .iter()
        .enumerate()
        .map(|(i, wd)| {
            let (a, b, c) = colour(i);
            (wd.name.clone(), RGBColor(a, b, c))
        })
        .collect();
    if has_tape {
        entries.push(("insulating tape".into(), tape_fill));
    }
    if has_margin {
        entries.push(("flange margin".into(), margin_fill));
    }
    entries.push(("bobbin space".into(), bobbin));
    for (i, (label, col)) in entries.iter().enumerate() {
        let y = margin as i32 + 12 + 21 * i as i32;
        legend_area
            .draw(&Rectangle::new([(8, y - 7), (26, y + 7)], col.filled()))
            .map_err(err)?;
        legend_area
            .draw(&Rectangle::new(
                [(8, y - 7), (26, y + 7)],
                RGBColor(90, 98, 110).stroke_width(1),
            ))
            .map_err(err)?;
        legend_area
            .draw(&Text::new(label.clone(), (32, y), lf.clone()))
            .map_err(err)?;
    }
    let sf = ("sans-serif", 11)
        .into_font()
        .color(&RGBColor(91, 102, 117))
        .pos(Pos::new(HPos::Left, VPos::Center));
    let y = margin as i32 + 12 + 21 * entries.len() as i32 + 4;
    legend_area
        .draw(&Text::new("drawn to scale", (8, y), sf))
        .map_err(err)?;
    root.present().map_err(err)
}
