//! Pictures: what a magnetics engineer looks at after the numbers.
//!
//! 1. **Currents and flux density over one period** at the chosen line
//!    corner: every winding's current (left axis) and B(t) (right axis).
//! 2. **The operating point against saturation**: Bsat of the material
//!    against temperature, the limit Bsat·(1 − margin) the check uses, the
//!    design's Bpk at its equilibrium core temperature and its flux swing
//!    as a bar. Chosen over a B–H plane because the question is "how far
//!    from saturation, at the temperature it will run at": the material
//!    model has Bsat at two temperatures and μi, not a measured B–H loop, so
//!    a B–H picture would have to invent the curve.
//! 3. **The MMF across the winding window** at the primary's current peak
//!    of the chosen corner (engine: `design::views::mmf_profile`), with each
//!    winding's layers shaded: the interleaving read at a glance.
//! 4. **Loss against switching frequency**: the design redone at each of
//!    [`SWEEP_POINTS`] frequencies (engine: `design::sweep::frequency`), core,
//!    DC and AC copper and total loss, core temperature on the right
//!    axis, the least-loss point marked, the failing ranges shaded by
//!    reason (and listed below the picture).
//!
//!    Beside it, the same transformer as wound (turns, conductors and
//!    stack-up fixed: `design::sweep::as_wound`) and, on request, the best
//!    library material at each frequency (`design::sweep::envelope`, the
//!    material named where it changes); the material's fitted range and
//!    the band the engine's data-range rule still accepts shaded, points
//!    outside it never shown as passing (`design::sweep::range`). The
//!    legend's entries are also on the figure as `data-legend`.
//!
//! Speed: the sweep is the slow part (it redesigns at every point, 200
//! designs for both curves), more than one frame's worth, so it is run in
//! slices that yield to the browser ([`super::sweep_run`]): every edit
//! starts a new run at once and drops the one in progress; the results and
//! the other pictures update on the keystroke, the sweep (both curves) when
//! its run ends, a few frames later. Until then the figure shows the last
//! sweep dimmed, with `data-sweep-ready="false"`: the sweep drawn is always
//! the one for the design shown, or marked as being recomputed
//! (`data-swept-hz` is the frequency of the design it is for). The
//! envelope is one sweep per library material, so it runs only when asked,
//! for the design of the last finished run.
//!
//! Every number comes from the engine; this module only arranges them.

use crate::form::{Outcome, Report};
use crate::plot::{self, Axis, LineChart, Marker, Rgb, Series, Shade, Side};
use crate::ui::PlotCanvas;
use super::sweep_chart::{fail_runs, legend_of, sweep_chart};
use super::sweep_run::{Best, Curves, SweepRun};
use leptos::prelude::*;
use magwright_engine::design::{sweep, views, Design};
use magwright_engine::notation;
use magwright_engine::topology::Corner;
use magwright_engine::waveform::Pwl;

/// Points of the page's frequency sweep (the engine asks at least 2).
pub const SWEEP_POINTS: usize = 100;

/// Points of the best-material envelope (each a sweep per library material).
pub const ENVELOPE_POINTS: usize = 50;

/// Samples of the Bsat curve.
const BSAT_POINTS: usize = 12;

const CSS: &str = "
.pictures .corner-pick { display:flex; gap:.4rem; align-items:center; margin:.1rem 0 .4rem; }
.pictures .corner-pick select { font:inherit; padding:.15rem .3rem; border:1px solid #9aa4b1; border-radius:4px; background:#fff; }
.pictures figure.stale canvas { opacity:.55; }
.pictures ul.sweep-fails { margin:.15rem 0 0 1.1rem; padding:0; font-size:.82em; color:#5b6675; }
.pictures ul.sweep-limits { margin:.3rem 0 0 1.1rem; padding:0; font-size:.86em; color:#3d4654; }
";

/// The sweep range: a decade each side of the design's frequency, within 1 kHz–10 MHz.
pub fn sweep_range(f: f64) -> (f64, f64) {
    ((f / 10.0).max(1e3), (f * 10.0).min(10e6))
}

fn corner_key(c: Corner) -> &'static str {
    match c {
        Corner::VinMin => "vin_min",
        Corner::VinMax => "vin_max",
    }
}

fn corner_name(c: Corner) -> &'static str {
    match c {
        Corner::VinMin => "Vin min",
        Corner::VinMax => "Vin max",
    }
}

fn op(r: &Report, c: Corner) -> &magwright_engine::topology::OperatingPoint {
    match c {
        Corner::VinMin => &r.waveforms.at_vin_min,
        Corner::VinMax => &r.waveforms.at_vin_max,
    }
}

/// One colour per winding, by its place in the corner's winding list.
fn winding_color(r: &Report, name: &str) -> Rgb {
    let i = r
        .waveforms
        .at_vin_min
        .windings
        .iter()
        .position(|w| w.name == name)
        .unwrap_or(0);
    plot::PALETTE[i % plot::PALETTE.len()]
}

fn micro(w: &Pwl, scale: f64) -> Vec<(f64, f64)> {
    w.points.iter().map(|&(t, y)| (t * 1e6, y * scale)).collect()
}

/// Currents of every winding and B(t), one corner.
fn wave_chart(r: &Report, c: Corner) -> LineChart {
    let p = op(r, c);
    let mut series: Vec<Series> = p
        .windings
        .iter()
        .map(|w| Series::new(&w.name, micro(&w.current, 1.0), winding_color(r, &w.name)))
        .collect();
    series.push(Series::new("B", micro(&p.flux, 1e3), plot::GREY).right().width(3));
    LineChart {
        x: Axis::new("Time", "µs").from_zero(),
        y: Axis::new("Current", "A").from_zero(),
        y2: Some(Axis::new("Flux density B", "mT")),
        series,
        markers: vec![],
        shades: vec![],
    }
}

/// Temperature range of the saturation picture: from the lower of the
/// ambient and 25 °C to 30 K above the hotter of the limit and the
/// operating point, not beyond the Curie temperature.
fn saturation_range(r: &Report) -> (f64, f64) {
    let hot = r
        .checks
        .iter()
        .find(|c| c.key == "temperature")
        .map_or(r.thermal.temperature, |c| c.limit);
    let ambient = r.thermal.temperature - r.thermal.rise;
    let lo = ambient.min(25.0).clamp(-55.0, 300.0);
    let hi = (hot.max(r.thermal.temperature) + 30.0)
        .min(r.material.curie_c)
        .clamp(lo + 10.0, 390.0);
    (lo, hi)
}

fn saturation_chart(v: &views::SaturationView) -> LineChart {
    let mt = |pts: &[(f64, f64)]| pts.iter().map(|&(t, b)| (t, b * 1e3)).collect::<Vec<_>>();
    let pct = (v.margin * 100.0).round();
    let b_top = v.bsat.iter().map(|p| p.1).fold(0.0, f64::max) * 1e3;
    let mut series = vec![
        Series::new("Bsat of the material", mt(&v.bsat), plot::RED),
        Series::new(&format!("limit: Bsat less {pct:.0} % margin"), mt(&v.limit), plot::RED).dashed(),
        Series::new(
            &format!("core temperature limit {}", notation::format(v.temperature_max, "°C", 3)),
            vec![(v.temperature_max, 0.0), (v.temperature_max, b_top)],
            plot::GREY,
        )
        .dashed(),
        Series::new(
            &format!(
                "flux swing at {} (ΔB {})",
                corner_name(v.corner),
                notation::format(v.b_max - v.b_min, "T", 3)
            ),
            vec![(v.temperature, v.b_min * 1e3), (v.temperature, v.b_max * 1e3)],
            plot::BLUE,
        )
        .width(7),
    ];
    if v.b_min < 0.0 {
        // Bipolar flux: the limit holds for −B too.
        let neg = |pts: &[(f64, f64)]| pts.iter().map(|&(t, b)| (t, -b * 1e3)).collect::<Vec<_>>();
        series.push(Series::new("Bsat", neg(&v.bsat), plot::RED).unlisted());
        series.push(Series::new("limit", neg(&v.limit), plot::RED).dashed().unlisted());
    }
    LineChart {
        x: Axis::new("Temperature", "°C"),
        y: Axis::new("Flux density", "mT").from_zero(),
        y2: None,
        series,
        markers: vec![Marker {
            x: v.temperature,
            y: v.b_peak * 1e3,
            side: Side::Left,
            label: format!(
                "Bpk {} at {}",
                notation::format(v.b_peak, "T", 3),
                notation::format(v.temperature, "°C", 3)
            ),
            color: plot::GREEN,
        }],
        shades: vec![],
    }
}

fn mmf_chart(r: &Report, m: &views::MmfProfile) -> LineChart {
    let shades = m
        .layers
        .iter()
        .map(|l| Shade {
            from: l.h_bottom * 1e3,
            to: (l.h_bottom + l.height) * 1e3,
            label: l.winding.clone(),
            color: winding_color(r, &l.winding),
        })
        .collect();
    let pts: Vec<(f64, f64)> = m.points.iter().map(|&(h, f)| (h * 1e3, f)).collect();
    LineChart {
        x: Axis::new("Position across the window, from the bobbin", "mm").from_zero(),
        y: Axis::new("MMF", "A·turns").from_zero(),
        y2: None,
        series: vec![Series::new("MMF", pts, plot::INK_RGB)],
        markers: vec![],
        shades,
    }
}

/// A sweep's total loss at each point, W, space-separated ("-" where no
/// design could be built): what the tests compare with the CLI's sweep.
fn totals(s: &sweep::Sweep) -> String {
    let v: Vec<String> = s.points.iter().map(|p| p.values.map_or("-".into(), |v| v.total.to_string())).collect();
    v.join(" ")
}

/// The four pictures, a line-corner selector and the sweep's CSV.
#[component]
pub fn Pictures(outcome: Memo<Outcome>, design: Memo<Option<Design>>) -> impl IntoView {
    let corner = RwSignal::new(Corner::VinMin);

    // The sweep is run in slices that yield to the browser, started at once
    // by every change of the design (module docs, `sweep_run`).
    let run = SweepRun::<Curves>::new();
    Effect::new(move |_| run.start(design.get()));
    let shown = run.shown;
    let swept = Memo::new(move |_| shown.with(|s| s.as_ref().map(|s| s.design.clone())));
    let sweep = Memo::new(move |_| shown.with(|s| s.as_ref().and_then(|s| s.out.0.clone())));
    let wound = Memo::new(move |_| shown.with(|s| s.as_ref().and_then(|s| s.out.1.clone())));
    let sweep_ms = move || shown.with(|s| s.as_ref().map(|s| s.ms));
    // The best material at each frequency: every library material is a
    // sweep of its own, so it runs only when asked for, after the curves,
    // for the design they are for (a run of its own, in slices too).
    let env_on = RwSignal::new(false);
    let env_run = SweepRun::<Best>::new();
    Effect::new(move |_| env_run.start(if env_on.get() { swept.get() } else { None }));
    let env_for = Memo::new(move |_| env_run.shown.with(|s| s.as_ref().map(|s| s.design.clone())));
    let envelope = Memo::new(move |_| env_run.shown.with(|s| s.as_ref().and_then(|s| s.out.clone())));
    // The sweep shown is for the design shown (and so is the envelope,
    // when asked for); else it is being recomputed.
    let swept_is_shown = move || swept.with(|s| design.with(|d| s == d));
    let ready = move || swept_is_shown() && (!env_on.get() || env_for.with(|e| swept.with(|s| e == s)));

    let mmf = Memo::new(move |_| {
        let c = corner.get();
        outcome.with(|o| o.as_ref().ok().and_then(|r| views::mmf_profile(r, c).ok()))
    });
    let saturation = Memo::new(move |_| {
        outcome.with(|o| {
            o.as_ref().ok().and_then(|r| {
                let (lo, hi) = saturation_range(r);
                views::saturation(r, lo, hi, BSAT_POINTS).ok()
            })
        })
    });

    let draw_waves = move |c: &web_sys::HtmlCanvasElement| {
        let k = corner.get();
        outcome.with(|o| match o {
            Ok(r) => plot::line_chart(c, &wave_chart(r, k)),
            Err(_) => Ok(()),
        })
    };
    let draw_sat = move |c: &web_sys::HtmlCanvasElement| match saturation.get() {
        Some(v) => plot::line_chart(c, &saturation_chart(&v)),
        None => Ok(()),
    };
    let draw_mmf = move |c: &web_sys::HtmlCanvasElement| {
        mmf.with(|m| {
            outcome.with(|o| match (o, m) {
                (Ok(r), Some(m)) => plot::line_chart(c, &mmf_chart(r, m)),
                _ => Ok(()),
            })
        })
    };
    // The sweep's chart: drawn, and its legend shown as `data-legend`.
    // The sweep figure is one picture of one design: while its curves are
    // for an earlier design (a run in progress), "this design" stays that
    // design's point too, and the figure is not redrawn on the keystroke;
    // the curves and the point change together when the run ends.
    // (The flag says "changed": the chart's gaps are NaN, so it is never
    // equal to itself.)
    let chart = Memo::new_owning(move |prev: Option<Option<LineChart>>| {
        if let Some(prev) = prev {
            if !swept_is_shown() {
                return (prev, false);
            }
        }
        let chart = sweep.with(|s| {
            wound.with(|w| {
                envelope.with(|e| {
                    outcome.with(|o| match (o, s) {
                        (Ok(r), Some(s)) => Some(sweep_chart(s, w.as_ref(), e.as_ref(), r)),
                        _ => None,
                    })
                })
            })
        });
        (chart, true)
    });
    let draw_sweep = move |c: &web_sys::HtmlCanvasElement| {
        chart.with(|ch| match ch {
            Some(ch) => plot::line_chart(c, ch),
            None => Ok(()),
        })
    };
    let legend = move || chart.with(|c| c.as_ref().map(legend_of));
    let band_of = move |f: fn(&sweep::Band) -> f64| move || sweep.with(|s| s.as_ref().and_then(|s| s.band.as_ref().map(f)));
    let env_changes = move || {
        envelope.with(|e| e.as_ref().map(|e| e.changes.iter().map(|&i| e.points[i].x.to_string()).collect::<Vec<_>>().join(" ")))
    };
    let save_env_csv = move |_| {
        if let Some(e) = envelope.get_untracked() {
            if let Err(e) = crate::browser::download("magwright-best-material.csv", "text/csv", &sweep::envelope_csv(&e)) {
                leptos::logging::warn!("envelope CSV: {e}");
            }
        }
    };
    let save_wound_csv = move |_| {
        if let Some(w) = wound.get_untracked() {
            if let Err(e) = crate::browser::download("magwright-as-wound.csv", "text/csv", &sweep::to_csv(&w, "frequency_Hz")) {
                leptos::logging::warn!("as-wound CSV: {e}");
            }
        }
    };
    let env_materials = move || {
        envelope.with(|e| {
            e.as_ref().map(|e| {
                let mut v: Vec<String> = Vec::new();
                for m in e.points.iter().filter_map(|p| p.material.clone()) {
                    if !v.contains(&m) {
                        v.push(m);
                    }
                }
                v.join(", ")
            })
        })
    };
    // What holds each curve's least loss where it is (the engine's notes).
    let limits = move || {
        let line = |what: &str, ls: &[sweep::MinimumLimit]| -> Vec<String> {
            ls.iter().map(|l| format!("{what}: {}.", l.note)).collect()
        };
        let mut v = sweep.with(|s| s.as_ref().map(|s| line("Least loss, redesigned", &s.minimum_limits)).unwrap_or_default());
        v.extend(wound.with(|s| s.as_ref().map(|s| line("Least loss, as wound", &s.minimum_limits)).unwrap_or_default()));
        v.extend(envelope.with(|e| e.as_ref().map(|e| line("Least loss, best material", &e.minimum_limits)).unwrap_or_default()));
        v
    };
    let wound_min = move || wound.with(|w| w.as_ref().and_then(|w| w.minimum.and_then(|i| w.points.get(i)).map(|p| p.x)));

    let hidden = move || outcome.with(|o| o.is_err());
    let save_csv = move |_| {
        if let Some(s) = sweep.get_untracked() {
            if let Err(e) =
                crate::browser::download("magwright-sweep.csv", "text/csv", &sweep::to_csv(&s, "frequency_Hz"))
            {
                leptos::logging::warn!("sweep CSV: {e}");
            }
        }
    };
    let vin = move |c: Corner| {
        outcome.with(|o| {
            o.as_ref().map_or(String::new(), |r| {
                format!(" ({})", notation::format(op(r, c).vin, "V", 3))
            })
        })
    };
    let on_corner = move |ev: leptos::ev::Event| {
        corner.set(if event_target_value(&ev) == "vin_max" {
            Corner::VinMax
        } else {
            Corner::VinMin
        });
    };

    // Figures' data attributes: what the tests compare with the engine.
    let mmf_json = move || mmf.with(|m| m.as_ref().map(|m| serde_json::to_string(&m.points).unwrap_or_default()));
    let mmf_peak = move || mmf.with(|m| m.as_ref().map(|m| m.peak));
    let mmf_residual = move || mmf.with(|m| m.as_ref().map(|m| m.residual));
    let mmf_caption = move || {
        mmf.with(|m| {
            m.as_ref().map_or(String::new(), |m| {
                let ip = m.currents.iter().find(|c| c.0 == m.reference).map_or(0.0, |c| c.1);
                format!(
                    "MMF across the window at {}, t = {} (the {} current's peak, {}). Peak {}; left after the last layer {} \
                     (the net ampere-turns: magnetising current and, for a transformer, the loss share the model adds to \
                     the primary current; a flyback at its primary peak keeps all of Np·Ipk). One-dimensional field, \
                     zero at the bobbin.",
                    corner_name(m.corner),
                    notation::format(m.time, "s", 3),
                    m.reference,
                    notation::format(ip.abs(), "A", 3),
                    notation::format(m.peak, "A", 3),
                    notation::format(m.residual, "A", 3),
                )
            })
        })
    };
    let sweep_min = move || {
        sweep.with(|s| {
            s.as_ref()
                .and_then(|s| s.minimum.and_then(|i| s.points.get(i)).map(|p| p.x))
        })
    };
    let sweep_lo = move || swept.with(|d| d.as_ref().map(|d| sweep_range(d.spec.frequency).0));
    let sweep_hi = move || swept.with(|d| d.as_ref().map(|d| sweep_range(d.spec.frequency).1));
    let fails = move || sweep.with(|s| s.as_ref().map(|s| fail_runs(s, false)).unwrap_or_default());
    let fails_text = move || {
        fails()
            .iter()
            .map(|f| {
                format!(
                    "{} – {}: {}",
                    notation::format(f.from, "Hz", 3),
                    notation::format(f.to, "Hz", 3),
                    f.detail
                )
            })
            .collect::<Vec<_>>()
            .join("\n")
    };
    let sat_caption = move || {
        saturation.with(|v| {
            v.as_ref().map_or(String::new(), |v| {
                format!(
                    "Bpk {} at the core temperature {} against a limit of {} there (Bsat {} less {:.0} %). Bsat is the \
                     material's 25 °C and 100 °C values joined by a line, extrapolated beyond. Read as: the dot must sit \
                     under the dashed line at the temperature the core runs at.",
                    notation::format(v.b_peak, "T", 3),
                    notation::format(v.temperature, "°C", 3),
                    notation::format(v.limit_at_operating, "T", 3),
                    notation::format(v.bsat_at_operating, "T", 3),
                    v.margin * 100.0
                )
            })
        })
    };

    view! {
        <style>{CSS}</style>
        <p class="missing-note" class:hidden=move || !hidden()>"The pictures appear once the design computes."</p>
        <div class="corner-pick" class:hidden=hidden>
            <label for="pic-corner">"Line corner for the waveforms and the MMF"</label>
            <select id="pic-corner" data-testid="corner-select" on:change=on_corner prop:value=move || corner_key(corner.get())>
                <option value="vin_min">{move || format!("Vin min{}", vin(Corner::VinMin))}</option>
                <option value="vin_max">{move || format!("Vin max{}", vin(Corner::VinMax))}</option>
            </select>
        </div>
        <figure class="plot" class:hidden=hidden data-testid="waves-figure" data-corner=move || corner_key(corner.get())>
            <PlotCanvas testid="flux-plot" label="Winding currents and flux density over one switching period" width=520 height=280 draw=draw_waves />
            <figcaption>{move || format!(
                "Every winding's current (left axis, positive as the winding conducts) and the flux density B (right axis) over one switching period at {}.",
                corner_name(corner.get())
            )}</figcaption>
        </figure>
        <figure class="plot" class:hidden=hidden data-testid="saturation-figure"
            data-b-peak=move || saturation.with(|v| v.as_ref().map(|v| v.b_peak))
            data-temperature=move || saturation.with(|v| v.as_ref().map(|v| v.temperature))
            data-limit=move || saturation.with(|v| v.as_ref().map(|v| v.limit_at_operating))>
            <PlotCanvas testid="saturation-plot" label="Operating flux density against the saturation limit over temperature" width=520 height=280 draw=draw_sat />
            <figcaption>{sat_caption}" A B–H plane is not drawn: the material is described by Bsat at two temperatures and μi, not by a measured loop."</figcaption>
        </figure>
        <figure class="plot" class:hidden=hidden data-testid="mmf-figure" data-corner=move || corner_key(corner.get())
            data-mmf=mmf_json data-si-peak=mmf_peak data-si-residual=mmf_residual>
            <PlotCanvas testid="mmf-plot" label="Magnetomotive force across the winding window" width=520 height=280 draw=draw_mmf />
            <figcaption>{mmf_caption}</figcaption>
        </figure>
        <figure class="plot" class:hidden=hidden class:stale=move || !ready() data-testid="sweep-figure"
            data-sweep-ready=move || if ready() { "true" } else { "false" }
            data-min-hz=sweep_min data-wound-min-hz=wound_min data-sweep-ms=sweep_ms
            data-swept-hz=move || swept.with(|d| d.as_ref().map(|d| d.spec.frequency))
            data-design-hz=move || design.with(|d| d.as_ref().map(|d| d.spec.frequency))
            data-sweep-totals=move || sweep.with(|s| s.as_ref().map(totals))
            data-wound-totals=move || wound.with(|s| s.as_ref().map(totals))
            data-sweep-dropped=move || run.dropped.get()
            data-band-min-hz=band_of(|b| b.min) data-band-max-hz=band_of(|b| b.max)
            data-legend=legend data-envelope-changes-hz=env_changes data-from-hz=sweep_lo data-to-hz=sweep_hi data-points=SWEEP_POINTS
            title=fails_text>
            <PlotCanvas testid="sweep-plot" label="Losses against switching frequency" width=520 height=500 draw=draw_sweep />
            <figcaption>
                {format!("The design redone at each of {SWEEP_POINTS} frequencies, a decade either side of this one: turns, gap, wire and temperature each time, so the curves step where an integer turn count or a wire size changes. Dots are the designs computed; lines only join passing ones. ")}
                "The brown line is this transformer as wound (turns, wire and stack-up fixed) at other frequencies: what a bench measurement would show. The teal band is the material's fitted loss data, the olive bands either side the ×1.25 the data-range check still accepts (with a warning); points beyond are never counted as passing. The best material at each frequency redesigns with every library material (magenta, each material named where it takes over). "
                <button type="button" class="small" data-testid="sweep-csv" on:click=save_csv>"Download as CSV"</button>
                " "
                <button type="button" class="small" data-testid="wound-csv" on:click=save_wound_csv>"As wound, as CSV"</button>
                " "
                <button type="button" class="small" data-testid="envelope-toggle" aria-pressed=move || if env_on.get() { "true" } else { "false" }
                    on:click=move |_| env_on.update(|on| *on = !*on)>{move || if env_on.get() { "Hide the best material" } else { "Best material at each frequency" }}</button>
                " "
                <button type="button" class="small" data-testid="envelope-csv" class:hidden=move || envelope.with(|e| e.is_none()) on:click=save_env_csv>"Best material, as CSV"</button>
                <span data-testid="envelope-materials" data-materials=env_materials>{move || env_materials().map(|m| format!(" Best material by frequency: {m}.")).unwrap_or_default()}</span>
                <ul class="sweep-limits" data-testid="sweep-limits">
                    {move || limits().into_iter().map(|t| view! { <li>{t}</li> }).collect_view()}
                </ul>
                <ul class="sweep-fails" data-testid="sweep-fails">
                    {move || fails().into_iter().map(|f| view! {
                        <li data-from-hz=f.from data-to-hz=f.to>
                            {format!("{} to {}: {}", notation::format(f.from, "Hz", 3), notation::format(f.to, "Hz", 3), f.detail)}
                        </li>
                    }).collect_view()}
                </ul>
            </figcaption>
        </figure>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sweep_range_stays_inside_the_engine_limits() {
        assert_eq!(sweep_range(100e3), (10e3, 1e6));
        assert_eq!(sweep_range(5e3), (1e3, 50e3));
        assert_eq!(sweep_range(2e6), (200e3, 10e6));
    }
}
