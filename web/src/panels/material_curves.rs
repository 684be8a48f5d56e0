//! The Pv–B chart of the material on the form: loss density against peak
//! flux density at several frequencies, both axes logarithmic, with the
//! fitted B range shaded and the curves dashed outside it. Every number is
//! the engine's ([`pv_b_curves`]); this module only draws.

use crate::form::Form;
use crate::plot::{self, Axis, LineChart, Series, Shade};
use crate::plot_log;
use crate::ui::PlotCanvas;
use leptos::prelude::*;
use magwright_engine::design::material_view::{pv_b_curves, PvChart};
use magwright_engine::design::MaterialChoice;
use magwright_engine::material::library as materials;
use magwright_engine::notation;

/// Curves drawn, and points on each.
const CURVES: usize = 4;
const POINTS: usize = 48;

/// The chart for a set of curves: per frequency the fitted part solid and
/// the parts outside the fitted B range dashed (same colour, unlisted).
pub fn chart(v: &PvChart) -> LineChart {
    let mut series = Vec::new();
    for (i, c) in v.curves.iter().enumerate() {
        let color = plot::PALETTE[i % plot::PALETTE.len()];
        let label = format!("{}Hz", notation::format(c.frequency, "", 3));
        let part = |keep: &dyn Fn(usize) -> bool| -> Vec<(f64, f64)> {
            c.points.iter().enumerate().filter(|(j, _)| keep(*j)).map(|(_, p)| (p.b * 1e3, p.pv * 1e-3)).collect()
        };
        let first = c.points.iter().position(|p| p.fitted).unwrap_or(0);
        let last = c.points.iter().rposition(|p| p.fitted).unwrap_or(c.points.len().saturating_sub(1));
        series.push(Series::new(&label, part(&|j| j >= first && j <= last), color));
        series.push(Series::new(&label, part(&|j| j <= first), color).dashed().unlisted());
        series.push(Series::new(&label, part(&|j| j >= last), color).dashed().unlisted());
    }
    LineChart {
        x: Axis::new("Bpk", "mT").log(),
        y: Axis::new("Pv", "kW/m³").log(),
        y2: None,
        series,
        markers: Vec::new(),
        shades: vec![Shade { from: v.b_min * 1e3, to: v.b_max * 1e3, label: "fitted B range".into(), color: plot::BANDS[3] }],
    }
}

/// The Pv–B chart of the form's material, with a caption saying at which
/// temperature and over which ranges the curves hold.
#[component]
pub fn MaterialCurves(form: Form) -> impl IntoView {
    let curves = Memo::new(move |_| {
        let m = match form.material.get() {
            MaterialChoice::Library { name } => materials::find(&name).ok(),
            MaterialChoice::Custom { material } => Some(material),
        }?;
        pv_b_curves(&m, CURVES, POINTS).ok().map(|v| (m.name.clone(), v))
    });
    let draw = move |c: &web_sys::HtmlCanvasElement| {
        curves.with(|v| match v {
            Some((_, v)) => plot_log::log_log_chart(c, &chart(v)),
            None => Ok(()),
        })
    };
    let caption = move || {
        curves.with(|v| match v {
            None => "The material's data cannot be drawn (see its entries).".to_string(),
            Some((name, v)) => {
                let at = match v.temperature_c {
                    Some(t) => format!("at its temperature of least loss, {t:.0} °C"),
                    None => "at any temperature (flat temperature factor)".to_string(),
                };
                format!(
                    "{name}: core loss density of a sinusoidal flux, {at}. Fitted over {} – {} and {} – {} (shaded); dashed: extrapolated outside the fitted B range.",
                    notation::format(v.f_min, "Hz", 3),
                    notation::format(v.f_max, "Hz", 3),
                    notation::format(v.b_min, "T", 3),
                    notation::format(v.b_max, "T", 3)
                )
            }
        })
    };
    let freqs = move || {
        curves.with(|v| v.as_ref().map_or(String::new(), |(_, v)| {
            v.curves.iter().map(|c| format!("{:e}", c.frequency)).collect::<Vec<_>>().join(" ")
        }))
    };
    view! {
        <figure class="plot" data-testid="pv-b-figure">
            <PlotCanvas testid="pv-b-plot" label="Core loss density against peak flux density at several frequencies, log axes" width=520 height=460 draw=draw />
            <figcaption data-testid="pv-b-caption" data-frequencies=freqs>{caption}</figcaption>
        </figure>
    }
}
