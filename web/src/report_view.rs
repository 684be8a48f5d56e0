//! Showing a [`Report`]: the result table, the pictures, the windings and
//! the printable build sheet. Design-type specific, like [`crate::form`];
//! the drawing itself is generic ([`crate::plot`]).
//!
//! Every number shown is a field of the engine's report (or of the engine's
//! designs at other frequencies, for the sweep), formatted with
//! `engine::notation`. Each value carries its plain SI value in `data-si`
//! so the browser tests compare the page with the command line exactly.

use crate::form::{self, Outcome, Report, Spec, SweepPoint, NUMS};
use crate::plot::{self, Axis, LineChart, Marker, Rect, Series, Shade, Side};
use crate::ui::PlotCanvas;
use leptos::prelude::*;
use magwright_engine::notation;

/// One result line: label, formatted value, and the SI value for checks.
fn row(id: &'static str, label: &'static str, v: f64, unit: &'static str, digits: usize) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=format!("{v:e}")>{notation::format(v, unit, digits)}</td>
        </tr>
    }
}

/// A ratio shown in per cent; `data-si` keeps the plain ratio.
fn pct(id: &'static str, label: &'static str, v: f64) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=format!("{v:e}")>{format!("{:.1} %", v * 100.0)}</td>
        </tr>
    }
}

fn count(id: &'static str, label: &'static str, n: u32) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=n.to_string()>{n.to_string()}</td>
        </tr>
    }
}

/// Why there are no results, one line per problem.
#[component]
fn Missing(lines: Vec<String>) -> impl IntoView {
    view! {
        <div class="missing" data-testid="missing" role="status">
            <p><strong>"No design yet."</strong>" Fix these entries:"</p>
            <ul>{lines.into_iter().map(|l| view! { <li>{l}</li> }).collect_view()}</ul>
        </div>
    }
}

/// The figures of the design, or why there are none.
#[component]
pub fn Results(outcome: Memo<Outcome>) -> impl IntoView {
    move || match outcome.get() {
        Err(p) => view! { <Missing lines=p.lines() /> }.into_any(),
        Ok(r) => view! {
            <table class="figures">
                <tbody>
                    {count("np", "Np (primary turns)", r.primary_turns)}
                    {count("ns", "Ns (secondary turns)", r.secondary_turns)}
                    {row("ratio", "Turns ratio Np/Ns", r.turns_ratio, "", 4)}
                    {pct("duty-min", "Duty at Vin min", r.duty_at_vin_min)}
                    {pct("duty-max", "Duty at Vin max", r.duty_at_vin_max)}
                    {row("delta-b", "ΔB (= Bpk, unipolar)", r.delta_b, "T", 3)}
                    {row("bsat", "Bsat at temperature", r.b_sat, "T", 3)}
                    {row("pv", "Core loss density", r.core_loss_density, "W/m³", 3)}
                    {row("core-loss", "Core loss", r.core_loss, "W", 3)}
                    {row("cu-loss", "Copper loss (DC)", r.copper_loss, "W", 3)}
                    {row("total-loss", "Total loss", r.total_loss, "W", 3)}
                    {pct("fill", "Window fill (copper)", r.window_fill)}
                </tbody>
            </table>
            <p class="core-note" data-testid="core-params">
                {format!(
                    "{}: Ae {}, le {}, Ve {}, Wa {}",
                    r.core.designation,
                    notation::format(r.core.ae * 1e6, "mm²", 3),
                    notation::format(r.core.le * 1e3, "mm", 3),
                    notation::format(r.core.ve * 1e9, "mm³", 3),
                    notation::format(r.core.window_area * 1e6, "mm²", 3),
                )}
            </p>
            <Cautions warnings=r.warnings.clone() />
        }
        .into_any(),
    }
}

/// The engine's warnings, or a line saying there are none.
#[component]
fn Cautions(warnings: Vec<String>) -> impl IntoView {
    if warnings.is_empty() {
        view! { <p class="no-warnings" data-testid="warnings">"No warnings from the engine."</p> }.into_any()
    } else {
        view! {
            <ul class="warnings" data-testid="warnings">
                {warnings.into_iter().map(|w| view! { <li>{w}</li> }).collect_view()}
            </ul>
        }
        .into_any()
    }
}

/// Flux density over one period, at both line extremes, against Bsat.
fn flux_chart(r: &Report) -> LineChart {
    let pts =
        |w: &magwright_engine::waveform::Pwl| w.points.iter().map(|&(t, b)| (t * 1e6, b * 1e3)).collect::<Vec<_>>();
    let t_end = r.flux_at_vin_min.period * 1e6;
    let mut series = vec![
        Series::new("Vin min", pts(&r.flux_at_vin_min), plot::BLUE),
        Series::new("Vin max", pts(&r.flux_at_vin_max), plot::ORANGE),
    ];
    // Bsat is shown when it is within reach of the swing (else it flattens the plot).
    if r.b_sat < 2.0 * r.b_peak {
        series.push(Series::new("Bsat", vec![(0.0, r.b_sat * 1e3), (t_end, r.b_sat * 1e3)], plot::RED).dashed());
    }
    LineChart {
        x: Axis::new("Time", "µs").from_zero(),
        y: Axis::new("Flux density", "mT").from_zero(),
        y2: None,
        series,
        markers: vec![],
        shades: vec![],
    }
}

/// Losses against switching frequency (log), Bpk on the right axis, the
/// lowest-loss point and this design marked, no-design ranges shaded.
fn sweep_chart(points: &[SweepPoint], spec_f: f64, r: &Report) -> LineChart {
    let ok: Vec<&SweepPoint> = points.iter().filter(|p| p.ok).collect();
    let line = |f: fn(&SweepPoint) -> f64| ok.iter().map(|p| (p.frequency, f(p))).collect::<Vec<_>>();
    let mut shades = Vec::new();
    let mut start: Option<f64> = None;
    for (i, p) in points.iter().enumerate() {
        match (p.ok, start) {
            (false, None) => start = Some(points.get(i.wrapping_sub(1)).map_or(p.frequency, |q| q.frequency)),
            (true, Some(a)) => {
                shades.push(Shade { from: a, to: p.frequency, label: "no design".into() });
                start = None;
            }
            _ => {}
        }
    }
    if let (Some(a), Some(last)) = (start, points.last()) {
        shades.push(Shade { from: a, to: last.frequency, label: "no design".into() });
    }
    let mut markers = vec![Marker {
        x: spec_f,
        y: r.total_loss,
        side: Side::Left,
        label: format!("this design: {}", notation::format(r.total_loss, "W", 3)),
        color: plot::GREY,
    }];
    if let Some(best) = ok.iter().min_by(|a, b| a.total_loss.total_cmp(&b.total_loss)) {
        markers.push(Marker {
            x: best.frequency,
            y: best.total_loss,
            side: Side::Left,
            label: format!(
                "lowest: {} at {}",
                notation::format(best.total_loss, "W", 3),
                notation::format(best.frequency, "Hz", 3)
            ),
            color: plot::GREEN,
        });
    }
    LineChart {
        x: Axis::new("Switching frequency", "Hz").log(),
        y: Axis::new("Loss", "W").from_zero(),
        y2: Some(Axis::new("Bpk", "mT").from_zero()),
        series: vec![
            Series::new("total", line(|p| p.total_loss), plot::GREEN),
            Series::new("core", line(|p| p.core_loss), plot::BLUE),
            Series::new("copper", line(|p| p.copper_loss), plot::ORANGE),
            Series::new("Bpk", line(|p| p.b_peak * 1e3), plot::PURPLE).right().thin(),
        ],
        markers,
        shades,
    }
}

/// The sweep as CSV, one row per frequency, SI units; rows without a
/// design say so and leave the numbers empty.
pub fn sweep_csv(points: &[SweepPoint]) -> String {
    let mut out = String::from("frequency_hz,design,total_loss_w,core_loss_w,copper_loss_w,secondary_turns,b_peak_t\n");
    for p in points {
        if p.ok {
            out.push_str(&format!(
                "{},yes,{},{},{},{},{}\n",
                p.frequency, p.total_loss, p.core_loss, p.copper_loss, p.secondary_turns, p.b_peak
            ));
        } else {
            out.push_str(&format!("{},none,,,,,\n", p.frequency));
        }
    }
    out
}

/// The flux waveform and the frequency sweep.
#[component]
pub fn Pictures(outcome: Memo<Outcome>, spec: Memo<Result<Spec, form::FieldErrors>>) -> impl IntoView {
    let sweep = Memo::new(move |_| spec.with(|s| s.as_ref().map(|s| form::sweep(s, 200)).unwrap_or_default()));
    let draw_flux = move |c: &web_sys::HtmlCanvasElement| match outcome.get() {
        Ok(r) => plot::line_chart(c, &flux_chart(&r)),
        Err(_) => Ok(()),
    };
    let draw_sweep = move |c: &web_sys::HtmlCanvasElement| match (outcome.get(), spec.get()) {
        (Ok(r), Ok(s)) => sweep.with(|pts| plot::line_chart(c, &sweep_chart(pts, s.frequency, &r))),
        _ => Ok(()),
    };
    let hidden = move || outcome.with(|o| o.is_err());
    let save_csv = move |_| {
        if let Err(e) =
            sweep.with_untracked(|pts| crate::browser::download("magwright-sweep.csv", "text/csv", &sweep_csv(pts)))
        {
            leptos::logging::warn!("sweep CSV: {e}");
        }
    };
    view! {
        <p class="missing-note" class:hidden=move || !hidden()>"The pictures appear once the design computes."</p>
        <figure class="plot" class:hidden=hidden>
            <PlotCanvas testid="flux-plot" label="Flux density over one switching period" width=520 height=240 draw=draw_flux />
            <figcaption>"Flux density over one switching period, at Vin min and Vin max."</figcaption>
        </figure>
        <figure class="plot" class:hidden=hidden>
            <PlotCanvas testid="sweep-plot" label="Losses against switching frequency" width=520 height=300 draw=draw_sweep />
            <figcaption>"The same design at other switching frequencies (the engine's design at each of 200 points). "
                <button type="button" class="small" data-testid="sweep-csv" on:click=save_csv>"Download as CSV"</button>
            </figcaption>
        </figure>
    }
}

/// The winding window to scale. The forward slice reports only the
/// bobbin's winding space (breadth along the leg × height across), drawn
/// from the centre leg's face. When the engine reports a layer stack-up,
/// its layers go here as `Kind::Primary`, `Kind::Secondary` and
/// `Kind::Insulation` rectangles (and the core window as `Kind::CoreWindow`
/// once the core data give its width).
fn window_rects(r: &Report) -> Vec<Rect> {
    let c = &r.core;
    let (b, h) = (c.winding_breadth, c.winding_height);
    vec![Rect {
        x: 0.0,
        y: 0.0,
        w: h,
        h: b,
        kind: plot::Kind::Bobbin,
        label: format!("{} × {}", notation::format(h, "m", 3), notation::format(b, "m", 3)),
    }]
}

/// The windings: what to wind, and the window they go into.
#[component]
pub fn Windings(outcome: Memo<Outcome>, spec: Memo<Result<Spec, form::FieldErrors>>) -> impl IntoView {
    let draw = move |c: &web_sys::HtmlCanvasElement| match outcome.get() {
        Ok(r) => plot::cross_section(c, &window_rects(&r)),
        Err(_) => Ok(()),
    };
    let table = move || match (outcome.get(), spec.get()) {
        (Ok(r), Ok(s)) => Some(view! {
            <table class="figures windings-table">
                <thead>
                    <tr><th scope="col">"Winding"</th><th scope="col">"Turns"</th><th scope="col">"Wire"</th><th scope="col">"RMS current"</th><th scope="col">"Rdc"</th><th scope="col">"Loss"</th></tr>
                </thead>
                <tbody>
                    <tr>
                        <th scope="row">"Primary"</th>
                        <td>{r.primary_turns}</td>
                        <td>{format!("AWG {}", s.awg_primary)}</td>
                        <td data-testid="ip" data-si=format!("{:e}", r.primary_rms)>{notation::format(r.primary_rms, "A", 3)}</td>
                        <td data-testid="rp" data-si=format!("{:e}", r.primary_rdc)>{notation::format(r.primary_rdc, "Ω", 3)}</td>
                        <td>{notation::format(r.primary_copper_loss, "W", 3)}</td>
                    </tr>
                    <tr>
                        <th scope="row">"Secondary"</th>
                        <td>{r.secondary_turns}</td>
                        <td>{format!("AWG {}", s.awg_secondary)}</td>
                        <td data-testid="is" data-si=format!("{:e}", r.secondary_rms)>{notation::format(r.secondary_rms, "A", 3)}</td>
                        <td data-testid="rs" data-si=format!("{:e}", r.secondary_rdc)>{notation::format(r.secondary_rdc, "Ω", 3)}</td>
                        <td>{notation::format(r.secondary_copper_loss, "W", 3)}</td>
                    </tr>
                </tbody>
            </table>
        }),
        _ => None,
    };
    view! {
        {table}
        <figure class="plot" class:hidden=move || outcome.with(|o| o.is_err())>
            <PlotCanvas testid="window-plot" label="Winding window cross-section, to scale" width=520 height=250 draw=draw />
            <figcaption>"One side of the winding window, to scale. The layer stack-up is drawn here once the engine reports it."</figcaption>
        </figure>
    }
}

/// The printed build sheet: hidden on screen, the only thing printed.
#[component]
pub fn BuildSheet(outcome: Memo<Outcome>, spec: Memo<Result<Spec, form::FieldErrors>>) -> impl IntoView {
    let body = move || match (outcome.get(), spec.get()) {
        (Ok(r), Ok(s)) => {
            let vals = form::values(&s);
            let spec_rows = NUMS
                .iter()
                .zip(vals)
                .filter(|(d, _)| !d.whole)
                .map(|(d, v)| {
                    let text = if d.unit.is_empty() { format!("{v}") } else { notation::format(v, d.unit, 3) };
                    view! { <tr><th scope="row">{d.label}</th><td>{text}</td></tr> }
                })
                .collect_view();
            view! {
                <h2>"Specification"</h2>
                <table class="sheet-table"><tbody>{spec_rows}</tbody></table>
                <h2>"Core and material"</h2>
                <table class="sheet-table"><tbody>
                    <tr><th scope="row">"Core"</th><td data-testid="sheet-core">{r.core.designation.clone()}</td></tr>
                    <tr><th scope="row">"Material"</th><td>{r.material.clone()}</td></tr>
                    <tr><th scope="row">"ΔB = Bpk"</th><td>{notation::format(r.b_peak, "T", 3)}" (Bsat "{notation::format(r.b_sat, "T", 3)}")"</td></tr>
                </tbody></table>
                <h2>"Windings"</h2>
                <table class="sheet-table"><thead><tr><th>"Winding"</th><th>"Turns"</th><th>"Wire"</th><th>"RMS current"</th><th>"Rdc"</th></tr></thead><tbody>
                    <tr><th scope="row">"Primary"</th><td data-testid="sheet-np">{r.primary_turns}</td><td>{format!("AWG {}", s.awg_primary)}</td><td>{notation::format(r.primary_rms, "A", 3)}</td><td>{notation::format(r.primary_rdc, "Ω", 3)}</td></tr>
                    <tr><th scope="row">"Reset (1:1)"</th><td>{r.primary_turns}" (= Np)"</td><td>"not sized by this slice"</td><td>"—"</td><td>"—"</td></tr>
                    <tr><th scope="row">"Secondary"</th><td data-testid="sheet-ns">{r.secondary_turns}</td><td>{format!("AWG {}", s.awg_secondary)}</td><td>{notation::format(r.secondary_rms, "A", 3)}</td><td>{notation::format(r.secondary_rdc, "Ω", 3)}</td></tr>
                </tbody></table>
                <p>"Window fill (copper): "{format!("{:.1} %", r.window_fill * 100.0)}</p>
                <h2>"Expected losses"</h2>
                <table class="sheet-table"><tbody>
                    <tr><th scope="row">"Core"</th><td>{notation::format(r.core_loss, "W", 3)}</td></tr>
                    <tr><th scope="row">"Copper (DC)"</th><td>{notation::format(r.copper_loss, "W", 3)}</td></tr>
                    <tr><th scope="row">"Total"</th><td data-testid="sheet-total">{notation::format(r.total_loss, "W", 3)}</td></tr>
                </tbody></table>
                <h2>"Cautions"</h2>
                <ul>
                    {r.warnings.iter().map(|w| view! { <li>{w.clone()}</li> }).collect_view()}
                    <li>"Magwright computes; it does not certify. Above safety extra-low voltage, creepage, clearance and insulation must follow IEC 62368-1 or IEC 61558 and local codes."</li>
                    <li>"Material and core data are typical values: check them against your supplier's data."</li>
                </ul>
                <h2>"Built and checked"</h2>
                <p class="sign">"Built by: ____________________   Date: __________   Checked by: ____________________"</p>
            }
            .into_any()
        }
        _ => view! { <p>"No design to print: fix the marked entries first."</p> }.into_any(),
    };
    view! {
        <section class="sheet" data-testid="build-sheet">
            <h1>"Magwright build sheet — forward transformer (single switch, 1:1 reset)"</h1>
            {body}
        </section>
    }
}
