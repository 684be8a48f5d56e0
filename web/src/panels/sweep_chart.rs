//! The sweep plot's chart (see [`super::pictures`], picture 4): the
//! redesigned curve with its parts, the as-wound curve, the best-material
//! envelope, the material's data shaded and the failing ranges grouped by
//! reason. Pure arrangement of the engine's sweeps; no physics.

use crate::form::Report;
use crate::plot::{self, Axis, LineChart, Marker, Rgb, Series, Shade, Side};
use magwright_engine::design::sweep;
use magwright_engine::notation;

/// A failing run of sweep points: its frequency range and why.
#[derive(Debug, Clone, PartialEq)]
pub(super) struct FailRun {
    pub(super) from: f64,
    pub(super) to: f64,
    /// Legend key: the failed checks, or "no design can be built".
    pub(super) key: String,
    /// The run's reasons, each once.
    pub(super) detail: String,
}

/// Most distinct reasons listed for one failing range.
const MAX_REASONS: usize = 4;

/// The band a failing point belongs to: "no design can be built", or the
/// first check it fails (the engine lists saturation, temperature, window,
/// duty, switch voltage, Curie in that order); the other reasons are in
/// the list under the picture.
fn key_of(p: &sweep::SweepPoint) -> String {
    if p.values.is_none() {
        "no design can be built".into()
    } else if !p.in_data {
        "outside the material's data".into()
    } else {
        match p.reason.split("; ").next().filter(|r| !r.is_empty()) {
            Some(first) => format!("fails: {first}"),
            None => "fails a check".into(),
        }
    }
}

/// The reasons of a failing point, each short: a check's label, or an
/// engine message cut before its details (the part after the first ": ",
/// which carries numbers that differ from point to point).
fn reasons_of(p: &sweep::SweepPoint) -> Vec<&str> {
    if p.values.is_none() {
        vec![p.reason.split(": ").next().unwrap_or(&p.reason)]
    } else {
        p.reason.split("; ").filter(|r| !r.is_empty()).collect()
    }
}

/// Consecutive failing points with the same key (`by_key`), or all
/// consecutive failing points (`!by_key`, the reasons of the run collected,
/// each once, at most [`MAX_REASONS`]), their edges halfway (geometrically)
/// to the neighbouring points.
pub(super) fn fail_runs(s: &sweep::Sweep, by_key: bool) -> Vec<FailRun> {
    let pts = &s.points;
    let edge = |i: usize, j: usize| -> f64 {
        match (pts.get(i), pts.get(j)) {
            (Some(a), Some(b)) if a.x > 0.0 && b.x > 0.0 => (a.x * b.x).sqrt(),
            (Some(a), _) => a.x,
            (_, Some(b)) => b.x,
            _ => 0.0,
        }
    };
    let mut runs: Vec<FailRun> = Vec::new();
    let mut i = 0;
    while i < pts.len() {
        if pts[i].feasible {
            i += 1;
            continue;
        }
        let key = key_of(&pts[i]);
        let start = i;
        while i + 1 < pts.len() && !pts[i + 1].feasible && (!by_key || key_of(&pts[i + 1]) == key) {
            i += 1;
        }
        let from = if start == 0 { pts[0].x } else { edge(start - 1, start) };
        let to = if i + 1 >= pts.len() { pts[i].x } else { edge(i, i + 1) };
        let mut reasons: Vec<&str> = Vec::new();
        let mut more = false;
        for p in pts.get(start..=i).unwrap_or(&[]) {
            for part in reasons_of(p) {
                if !reasons.contains(&part) {
                    if reasons.len() < MAX_REASONS {
                        reasons.push(part);
                    } else {
                        more = true;
                    }
                }
            }
        }
        let mut detail = reasons.join("; ");
        if more {
            detail.push_str("; and other reasons (see the CSV)");
        }
        runs.push(FailRun { from, to, key, detail });
        i += 1;
    }
    runs
}

/// The legend's names of the three totals (also in `data-legend`).
const LEGEND_REDESIGNED: &str = "total, redesigned at each frequency";
const LEGEND_AS_WOUND: &str = "total, this transformer as wound";
const LEGEND_ENVELOPE: &str = "total, best library material";

/// Colours of the envelope's materials, in order of first appearance
/// (apart from the curves' own: green, blue, orange, purple, red, brown).
const ENVELOPE_COLOURS: [Rgb; 6] =
    [plot::MAGENTA, plot::TEAL, plot::OLIVE, Rgb(0, 150, 210), Rgb(230, 120, 170), Rgb(60, 60, 60)];

/// The shades of the material's data on the frequency axis: the fitted
/// range, and either side of it the band the engine's rule still accepts
/// (extrapolated, warns), clipped to the sweep's span. Empty for a sweep
/// without a band (the flux sweep).
fn data_shades(s: &sweep::Sweep) -> Vec<Shade> {
    let (Some(b), Some(first), Some(last)) = (s.band, s.points.first(), s.points.last()) else {
        return Vec::new();
    };
    let clip = |from: f64, to: f64| (from.max(first.x), to.min(last.x));
    let fitted = format!(
        "{} data: {} to {}",
        s.material,
        notation::format(b.fitted_min, "Hz", 3),
        notation::format(b.fitted_max, "Hz", 3)
    );
    let margin = format!("extrapolated, within ×{} of the data (warns)", b.band);
    [
        (b.fitted_min, b.fitted_max, fitted, plot::TEAL),
        (b.min, b.fitted_min, margin.clone(), plot::OLIVE),
        (b.fitted_max, b.max, margin, plot::OLIVE),
    ]
    .into_iter()
    .map(|(from, to, label, color)| {
        let (from, to) = clip(from, to);
        Shade { from, to, label, color }
    })
    .filter(|sh| sh.to > sh.from)
    .collect()
}

/// The legend's entries of a chart, in order (series, then markers and
/// shades, each name once), joined by " | ": `data-legend`.
pub(super) fn legend_of(c: &LineChart) -> String {
    let mut v: Vec<&str> = Vec::new();
    let names = c.series.iter().filter(|s| !s.unlisted).map(|s| s.label.as_str());
    for n in names.chain(c.markers.iter().map(|m| m.label.as_str())).chain(c.shades.iter().map(|s| s.label.as_str())) {
        if !v.contains(&n) {
            v.push(n);
        }
    }
    v.join(" | ")
}

pub(super) fn sweep_chart(s: &sweep::Sweep, wound: Option<&sweep::Sweep>, env: Option<&sweep::Envelope>, r: &Report) -> LineChart {
    // Feasible points only, with a gap (NaN) where a design fails.
    let line = |f: fn(&sweep::PointValues) -> f64| -> Vec<(f64, f64)> {
        s.points
            .iter()
            .map(|p| (p.x, p.values.filter(|_| p.feasible).map_or(f64::NAN, |v| f(&v))))
            .collect()
    };
    let failing: Vec<(f64, f64)> = s
        .points
        .iter()
        .filter(|p| !p.feasible)
        .filter_map(|p| p.values.map(|v| (p.x, v.total)))
        .collect();
    let runs = fail_runs(s, true);
    let mut keys: Vec<String> = Vec::new();
    // The material's data first, under the failing ranges.
    let shades = data_shades(s)
        .into_iter()
        .chain(runs
        .iter()
        .map(|run| {
            let k = match keys.iter().position(|k| k == &run.key) {
                Some(k) => k,
                None => {
                    keys.push(run.key.clone());
                    keys.len() - 1
                }
            };
            Shade {
                from: run.from,
                to: run.to,
                label: run.key.clone(),
                color: plot::BANDS[k % plot::BANDS.len()],
            }
        }))
        .collect();
    let mut markers = vec![Marker {
        x: r.frequency,
        y: r.losses.total,
        side: Side::Left,
        label: format!("this design: {}", notation::format(r.losses.total, "W", 3)),
        color: plot::GREY,
    }];
    if let Some((x, v)) = s
        .minimum
        .and_then(|i| s.points.get(i))
        .and_then(|p| p.values.map(|v| (p.x, v)))
    {
        markers.push(Marker {
            x,
            y: v.total,
            side: Side::Left,
            label: format!(
                "least loss: {} at {}",
                notation::format(v.total, "W", 3),
                notation::format(x, "Hz", 3)
            ),
            color: plot::GREEN,
        });
    }
    let mut series = vec![
        Series::new(LEGEND_REDESIGNED, line(|v| v.total), plot::GREEN).dots(2),
        Series::new("core", line(|v| v.core), plot::BLUE).thin().dots(2),
        Series::new("copper DC", line(|v| v.copper_dc), plot::ORANGE)
            .thin()
            .dots(2),
        Series::new("copper AC (above DC)", line(|v| v.copper_ac_extra), plot::PURPLE)
            .thin()
            .dots(2),
        Series::new("core temperature", line(|v| v.temperature), plot::RED)
            .right()
            .thin()
            .dots(1),
    ];
    if !failing.is_empty() {
        series.push(Series::new("total of a failing design", failing, Rgb(150, 156, 166)).scatter(2));
    }
    if let Some(w) = wound {
        let pts = w
            .points
            .iter()
            .map(|p| (p.x, p.values.filter(|_| p.feasible).map_or(f64::NAN, |v| v.total)))
            .collect();
        series.push(Series::new(LEGEND_AS_WOUND, pts, plot::BROWN));
    }
    if let Some(e) = env {
        // One thin line through the envelope, then each material's stretch
        // in its own colour (named in the legend), and a ring where the
        // winner changes.
        let pts = e
            .points
            .iter()
            .map(|p| (p.x, p.values.filter(|_| p.feasible).map_or(f64::NAN, |v| v.total)))
            .collect();
        series.push(Series::new(LEGEND_ENVELOPE, pts, plot::MAGENTA).thin());
        let mut named: Vec<&str> = Vec::new();
        for m in e.points.iter().filter_map(|p| p.material.as_deref()) {
            if !named.contains(&m) {
                named.push(m);
            }
        }
        // Under the materials' dots: a dark ring where the winner changes.
        let changes: Vec<(f64, f64)> =
            e.changes.iter().filter_map(|&i| e.points.get(i)).filter_map(|p| p.values.map(|v| (p.x, v.total))).collect();
        if !changes.is_empty() {
            series.push(Series::new("best material changes", changes, plot::INK_RGB).scatter(5));
        }
        for (k, m) in named.iter().enumerate() {
            let pts = e
                .points
                .iter()
                .map(|p| match (p.material.as_deref(), p.values) {
                    (Some(w), Some(v)) if p.feasible && w == *m => (p.x, v.total),
                    _ => (p.x, f64::NAN),
                })
                .collect();
            let c = ENVELOPE_COLOURS[k % ENVELOPE_COLOURS.len()];
            series.push(Series::new(&format!("best: {m}"), pts, c).scatter(3));
        }
    }
    LineChart {
        x: Axis::new("Switching frequency", "Hz").log(),
        y: Axis::new("Loss", "W").from_zero(),
        y2: Some(Axis::new("Core temperature", "°C")),
        series,
        markers,
        shades,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use magwright_engine::design::sweep::{PointValues, Sweep, SweepPoint};

    fn pt(x: f64, ok: bool, reason: &str, values: bool) -> SweepPoint {
        let v = PointValues {
            core: 1.0,
            copper_dc: 1.0,
            copper_ac_extra: 0.1,
            copper: 1.1,
            total: 2.1,
            temperature: 60.0,
            b_peak: 0.1,
            primary_turns: 10,
        };
        SweepPoint {
            x,
            feasible: ok,
            in_data: values,
            values: values.then_some(v),
            reason: reason.into(),
        }
    }

    #[test]
    fn failing_runs_group_by_reason_with_edges_between_points() {
        let s = Sweep {
            curve: sweep::Curve::Redesigned,
            x_axis: sweep::FREQUENCY_AXIS,
            material: "m".into(),
            band: None,
            points: vec![
                pt(1e3, false, "window too small", false),
                pt(4e3, false, "other words", false),
                pt(16e3, true, "", true),
                pt(64e3, false, "Core temperature (mean surface)", true),
                pt(256e3, false, "Core temperature (mean surface)", true),
            ],
            minimum: Some(2),
            minimum_limits: Vec::new(),
            ratio_at_minimum: None,
            two_over_beta: 1.0,
        };
        let runs = fail_runs(&s, true);
        assert_eq!(runs.len(), 2);
        assert_eq!(runs[0].key, "no design can be built");
        assert_eq!((runs[0].from, runs[0].to), (1e3, 8e3)); // √(4k·16k) = 8k
        assert_eq!(runs[0].detail, "window too small; other words");
        let mut cut = pt(
            1e3,
            false,
            "the windings do not fit this core's window: 0.45 mm × 21",
            false,
        );
        assert_eq!(reasons_of(&cut), vec!["the windings do not fit this core's window"]);
        cut.values = s.points[2].values;
        cut.in_data = true;
        cut.reason = "Duty; Core temperature (mean surface)".into();
        assert_eq!(key_of(&cut), "fails: Duty");
        // Outside the material's data is its own band.
        cut.in_data = false;
        assert_eq!(key_of(&cut), "outside the material's data");
        cut.in_data = true;
        assert_eq!(runs[1].key, "fails: Core temperature (mean surface)");
        assert_eq!((runs[1].from, runs[1].to), (32e3, 256e3));
        // Listed: one range per stretch of failing points, reasons each once.
        let mut s2 = s.clone();
        s2.points[4].reason = "Duty; Core temperature (mean surface)".into();
        let list = fail_runs(&s2, false);
        assert_eq!(list.len(), 2);
        assert_eq!(list[1].detail, "Core temperature (mean surface); Duty");
        let bands = fail_runs(&s2, true);
        assert_eq!(bands.len(), 3);
    }

    #[test]
    fn data_band_shades_and_legend() {
        // The fitted range and the rule's margins, clipped to the sweep.
        let band = sweep::Band { min: 16e3, max: 375e3, fitted_min: 20e3, fitted_max: 300e3, band: 1.25 };
        let s = Sweep {
            curve: sweep::Curve::Redesigned,
            x_axis: sweep::FREQUENCY_AXIS,
            material: "m".into(),
            band: Some(band),
            points: vec![pt(18e3, true, "", true), pt(1e6, false, "x", true)],
            minimum: None,
            minimum_limits: Vec::new(),
            ratio_at_minimum: None,
            two_over_beta: 1.0,
        };
        let sh = data_shades(&s);
        assert_eq!(sh.len(), 3);
        assert_eq!((sh[0].from, sh[0].to), (20e3, 300e3));
        assert_eq!((sh[1].from, sh[1].to), (18e3, 20e3));
        assert_eq!((sh[2].from, sh[2].to), (300e3, 375e3));
        assert_eq!(sh[1].label, sh[2].label);
        let mut none = s.clone();
        none.band = None;
        assert!(data_shades(&none).is_empty());
        let chart = LineChart {
            x: Axis::new("f", "Hz"),
            y: Axis::new("P", "W"),
            y2: None,
            series: vec![
                Series::new(LEGEND_REDESIGNED, vec![], plot::GREEN),
                Series::new("hidden", vec![], plot::GREEN).unlisted(),
                Series::new(LEGEND_AS_WOUND, vec![], plot::BROWN),
            ],
            markers: vec![],
            shades: sh,
        };
        let l = legend_of(&chart);
        assert!(l.starts_with("total, redesigned at each frequency | total, this transformer as wound | m data"), "{l}");
        assert!(!l.contains("hidden") && l.matches("extrapolated").count() == 1, "{l}");
    }
}
