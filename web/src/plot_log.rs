//! A chart with both axes logarithmic (e.g. loss density against flux
//! density at several frequencies), drawn like [`crate::plot::line_chart`]:
//! legend above the plot, decade grid with 1-2-5 labels, shaded x ranges.
//! It reads a [`LineChart`]; `x.log`/`y.log` are implied, markers ignored.

use crate::hidpi::Area;
use crate::plot::{compact, err, note, LineChart, FONT, GRID, INK};
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};
use web_sys::HtmlCanvasElement;

/// Grid lines (every 1…9 of a decade) and labelled values (1-2-5, or
/// decades only over many decades) between `lo` and `hi` (> 0).
fn log_ticks(lo: f64, hi: f64) -> (Vec<f64>, Vec<f64>) {
    let decades = (hi / lo).log10();
    let steps: &[f64] = if decades > 3.5 { &[1.0] } else if decades > 1.2 { &[1.0, 2.0, 5.0] } else { &[1.0, 1.5, 2.0, 3.0, 5.0, 7.0] };
    let inside = |v: f64| v >= lo * (1.0 - 1e-9) && v <= hi * (1.0 + 1e-9);
    let (d0, d1) = (lo.log10().floor() as i32, hi.log10().ceil() as i32);
    let (mut grid, mut labels) = (Vec::new(), Vec::new());
    for d in d0..=d1.min(d0 + 14) {
        let p = 10f64.powi(d);
        grid.extend((1..10).map(|m| m as f64 * p).filter(|&v| inside(v)));
        labels.extend(steps.iter().map(|m| m * p).filter(|&v| inside(v)));
    }
    (grid, labels)
}

fn extent(values: impl Iterator<Item = f64>) -> Option<(f64, f64)> {
    values.filter(|v| v.is_finite() && *v > 0.0).fold(None, |a, v| Some(a.map_or((v, v), |(l, h): (f64, f64)| (l.min(v), h.max(v)))))
}

/// Draws the chart; a chart without positive finite points shows a note.
pub fn log_log_chart(canvas: &HtmlCanvasElement, spec: &LineChart) -> Result<(), String> {
    let root: Area = crate::hidpi::area(canvas)?;
    let pts = || spec.series.iter().flat_map(|s| s.points.iter().copied()).filter(|p| p.0 > 0.0 && p.1 > 0.0);
    let (Some((x_lo, x_hi)), Some((y_lo, y_hi))) = (extent(pts().map(|p| p.0)), extent(pts().map(|p| p.1))) else {
        return note(&root, "nothing to draw");
    };
    let (x_hi, y_hi) = (x_hi.max(x_lo * 1.01), y_hi.max(y_lo * 1.01));
    let pad = 0.04 * (y_hi / y_lo).log10();
    let (y_lo, y_hi) = (y_lo / 10f64.powf(pad), y_hi * 10f64.powf(pad));
    let (lx, ly) = ((x_lo.log10(), x_hi.log10()), (y_lo.log10(), y_hi.log10()));

    // Legend: one row (or more) above the plot.
    let (w, _) = root.dim_in_pixel();
    let mut placed = Vec::new();
    let (mut x, mut row) = (58, 0);
    let entries: Vec<(String, RGBColor, bool)> = spec
        .shades
        .iter()
        .map(|s| (s.label.clone(), s.color.c(), true))
        .chain(spec.series.iter().filter(|s| !s.unlisted).map(|s| (s.label.clone(), s.color.c(), false)))
        .collect();
    for (label, _, _) in &entries {
        let width = 24 + (label.chars().count() as i32 * 27) / 4 + 16;
        if x + width > w as i32 - 10 && x > 58 {
            x = 58;
            row += 1;
        }
        placed.push((x, row));
        x += width;
    }
    let rows = placed.iter().map(|p| p.1).max().map_or(0, |r| r + 1);

    let mut chart = ChartBuilder::on(&root)
        .margin(10)
        .margin_top(10 + 18 * rows as u32)
        .margin_right(16)
        .x_label_area_size(40)
        .y_label_area_size(58)
        .build_cartesian_2d(lx.0..lx.1, ly.0..ly.1)
        .map_err(err)?;
    let blank = |_: &f64| String::new();
    chart
        .configure_mesh()
        .disable_mesh()
        .x_desc(desc(&spec.x.title, &spec.x.unit))
        .y_desc(desc(&spec.y.title, &spec.y.unit))
        .axis_style(RGBColor(150, 158, 170))
        .axis_desc_style((FONT, 13).into_font().color(&INK))
        .x_label_formatter(&blank)
        .y_label_formatter(&blank)
        .set_all_tick_mark_size(0)
        .draw()
        .map_err(err)?;
    let light = RGBColor(246, 247, 249);
    let (gx, labels_x) = log_ticks(x_lo, x_hi);
    let (gy, labels_y) = log_ticks(y_lo, y_hi);
    for v in &gx {
        let style = if labels_x.contains(v) { GRID } else { light };
        chart.draw_series(LineSeries::new([(v.log10(), ly.0), (v.log10(), ly.1)], style)).map_err(err)?;
    }
    for v in &gy {
        let style = if labels_y.contains(v) { GRID } else { light };
        chart.draw_series(LineSeries::new([(lx.0, v.log10()), (lx.1, v.log10())], style)).map_err(err)?;
    }
    let tick = RGBColor(150, 158, 170);
    let fx = (FONT, 13).into_font().color(&INK).pos(Pos::new(HPos::Center, VPos::Top));
    // Labels no closer than a label's size: thin to decades, then to every
    // other decade, when the axis is short.
    let spaced = |labels: Vec<f64>, px_per_decade: f64, min_px: f64| -> Vec<f64> {
        let decades: Vec<f64> = labels.iter().copied().filter(|v| (v.log10() - v.log10().round()).abs() < 1e-9).collect();
        let step = |a: f64, b: f64| (b / a).log10() * px_per_decade;
        let fine_ok = labels.windows(2).all(|w| step(w[0], w[1]) >= min_px);
        if fine_ok {
            labels
        } else if px_per_decade >= min_px {
            decades
        } else {
            let k = (min_px / px_per_decade.max(1.0)).ceil() as usize;
            decades.into_iter().step_by(k.max(1)).collect()
        }
    };
    let (a, b) = (chart.backend_coord(&(lx.0, ly.0)), chart.backend_coord(&(lx.1, ly.1)));
    let px_x = f64::from((b.0 - a.0).abs()) / (lx.1 - lx.0).max(1e-9);
    let px_y = f64::from((a.1 - b.1).abs()) / (ly.1 - ly.0).max(1e-9);
    let labels_x = spaced(labels_x, px_x, 34.0);
    let labels_y = spaced(labels_y, px_y, 18.0);
    for v in labels_x {
        let (px, py) = chart.backend_coord(&(v.log10(), ly.0));
        root.draw(&PathElement::new(vec![(px, py), (px, py + 5)], tick)).map_err(err)?;
        root.draw(&Text::new(compact(v), (px, py + 7), fx.clone())).map_err(err)?;
    }
    let fy = (FONT, 13).into_font().color(&INK).pos(Pos::new(HPos::Right, VPos::Center));
    for v in labels_y {
        let (px, py) = chart.backend_coord(&(lx.0, v.log10()));
        root.draw(&PathElement::new(vec![(px - 5, py), (px, py)], tick)).map_err(err)?;
        root.draw(&Text::new(compact(v), (px - 7, py), fy.clone())).map_err(err)?;
    }
    for s in &spec.shades {
        let (a, b) = (s.from.max(x_lo), s.to.min(x_hi));
        if a > 0.0 && b > a {
            let band = Rectangle::new([(a.log10(), ly.0), (b.log10(), ly.1)], s.color.c().mix(0.13).filled());
            chart.draw_series(std::iter::once(band)).map_err(err)?;
        }
    }
    for s in &spec.series {
        let style = s.color.c().stroke_width(s.width.max(1));
        let p: Vec<(f64, f64)> =
            s.points.iter().filter(|p| p.0 > 0.0 && p.1 > 0.0).map(|p| (p.0.log10(), p.1.log10())).collect();
        if p.len() < 2 {
            continue;
        }
        if s.dashed {
            chart.draw_series(DashedLineSeries::new(p, 6, 4, style)).map_err(err)?;
        } else {
            chart.draw_series(LineSeries::new(p, style)).map_err(err)?;
        }
    }
    let font = (FONT, 12).into_font().color(&INK).pos(Pos::new(HPos::Left, VPos::Center));
    for ((label, c, band), (x, row)) in entries.iter().zip(&placed) {
        let y = 12 + 18 * *row as i32;
        if *band {
            root.draw(&Rectangle::new([(*x, y - 6), (x + 18, y + 6)], c.mix(0.3).filled())).map_err(err)?;
        } else {
            root.draw(&PathElement::new(vec![(*x, y), (x + 18, y)], c.stroke_width(2))).map_err(err)?;
        }
        root.draw(&Text::new(label.clone(), (x + 24, y), font.clone())).map_err(err)?;
    }
    root.present().map_err(err)
}

fn desc(title: &str, unit: &str) -> String {
    if unit.is_empty() { title.to_string() } else { format!("{title} ({unit})") }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn log_ticks_label_one_two_five() {
        let (grid, labels) = log_ticks(1e-3, 0.4);
        assert_eq!(labels.first().copied(), Some(1e-3));
        assert!(labels.iter().any(|&v| (v - 0.2).abs() < 1e-12));
        assert!(grid.len() > labels.len());
        let (_, many) = log_ticks(1.0, 1e8);
        assert_eq!(many.len(), 9);
    }
}
