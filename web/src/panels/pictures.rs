//! Pictures: flux density over one period at both line corners, and the
//! losses against switching frequency (the engine's own sweep).

use crate::form::Outcome;
use crate::plot::{self, Axis, LineChart, Marker, Series, Shade, Side};
use crate::ui::PlotCanvas;
use leptos::prelude::*;
use magwright_engine::design::{sweep, Design};
use magwright_engine::notation;
use magwright_engine::waveform::Pwl;

/// Points of the page's frequency sweep (the engine asks at least 100).
pub const SWEEP_POINTS: usize = 100;

fn flux_chart(r: &crate::form::Report) -> LineChart {
    let pts = |w: &Pwl| w.points.iter().map(|&(t, b)| (t * 1e6, b * 1e3)).collect::<Vec<_>>();
    let w = &r.waveforms;
    let t_end = w.at_vin_min.flux.period * 1e6;
    let b_sat = r.material.bsat_at(r.thermal.temperature);
    let mut series = vec![
        Series::new("Vin min", pts(&w.at_vin_min.flux), plot::BLUE),
        Series::new("Vin max", pts(&w.at_vin_max.flux), plot::ORANGE),
    ];
    let b_pk = w.get("b_peak").map_or(0.0, |x| x.value);
    if b_sat < 2.0 * b_pk {
        series.push(Series::new("Bsat at hot spot", vec![(0.0, b_sat * 1e3), (t_end, b_sat * 1e3)], plot::RED).dashed());
    }
    LineChart { x: Axis::new("Time", "µs").from_zero(), y: Axis::new("Flux density", "mT"), y2: None, series, markers: vec![], shades: vec![] }
}

/// The sweep range: a decade each side of the design's frequency, within 1 kHz–10 MHz.
pub fn sweep_range(f: f64) -> (f64, f64) {
    ((f / 10.0).max(1e3), (f * 10.0).min(10e6))
}

fn sweep_chart(s: &sweep::Sweep, f0: f64, r: &crate::form::Report) -> LineChart {
    let ok: Vec<(f64, sweep::PointValues)> = s.points.iter().filter(|p| p.feasible).filter_map(|p| p.values.map(|v| (p.x, v))).collect();
    let line = |f: fn(&sweep::PointValues) -> f64| ok.iter().map(|(x, v)| (*x, f(v))).collect::<Vec<_>>();
    let mut shades = Vec::new();
    let mut start: Option<f64> = None;
    for (i, p) in s.points.iter().enumerate() {
        match (p.feasible, start) {
            (false, None) => start = Some(s.points.get(i.wrapping_sub(1)).map_or(p.x, |q| q.x)),
            (true, Some(a)) => {
                shades.push(Shade { from: a, to: p.x, label: "fails a check".into() });
                start = None;
            }
            _ => {}
        }
    }
    if let (Some(a), Some(last)) = (start, s.points.last()) {
        shades.push(Shade { from: a, to: last.x, label: "fails a check".into() });
    }
    let mut markers = vec![Marker {
        x: f0,
        y: r.losses.total,
        side: Side::Left,
        label: format!("this design: {}", notation::format(r.losses.total, "W", 3)),
        color: plot::GREY,
    }];
    if let Some((x, v)) = s.minimum.and_then(|i| s.points.get(i)).and_then(|p| p.values.map(|v| (p.x, v))) {
        markers.push(Marker {
            x,
            y: v.total,
            side: Side::Left,
            label: format!("lowest: {} at {}", notation::format(v.total, "W", 3), notation::format(x, "Hz", 3)),
            color: plot::GREEN,
        });
    }
    LineChart {
        x: Axis::new("Switching frequency", "Hz").log(),
        y: Axis::new("Loss", "W").from_zero(),
        y2: Some(Axis::new("Hot spot", "°C")),
        series: vec![
            Series::new("total", line(|v| v.total), plot::GREEN),
            Series::new("core", line(|v| v.core), plot::BLUE),
            Series::new("copper DC", line(|v| v.copper_dc), plot::ORANGE),
            Series::new("copper AC", line(|v| v.copper_ac_extra), plot::PURPLE),
            Series::new("temperature", line(|v| v.temperature), plot::RED).right().thin(),
        ],
        markers,
        shades,
    }
}

/// The flux waveform and the frequency sweep.
#[component]
pub fn Pictures(outcome: Memo<Outcome>, design: Memo<Option<Design>>) -> impl IntoView {
    let sweep = Memo::new(move |_| {
        design.with(|d| {
            d.as_ref().and_then(|d| {
                let (lo, hi) = sweep_range(d.spec.frequency);
                sweep::frequency(d, lo, hi, SWEEP_POINTS).ok()
            })
        })
    });
    let draw_flux = move |c: &web_sys::HtmlCanvasElement| match outcome.get() {
        Ok(r) => plot::line_chart(c, &flux_chart(&r)),
        Err(_) => Ok(()),
    };
    let draw_sweep = move |c: &web_sys::HtmlCanvasElement| match (outcome.get(), sweep.get()) {
        (Ok(r), Some(s)) => plot::line_chart(c, &sweep_chart(&s, r.frequency, &r)),
        _ => Ok(()),
    };
    let hidden = move || outcome.with(|o| o.is_err());
    let save_csv = move |_| {
        if let Some(s) = sweep.get_untracked() {
            if let Err(e) = crate::browser::download("magwright-sweep.csv", "text/csv", &sweep::to_csv(&s, "frequency_Hz")) {
                leptos::logging::warn!("sweep CSV: {e}");
            }
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
            <figcaption>"The design redone at each of 100 frequencies: turns, gap, wire and temperature each time. "
                <button type="button" class="small" data-testid="sweep-csv" on:click=save_csv>"Download as CSV"</button>
            </figcaption>
        </figure>
    }
}
