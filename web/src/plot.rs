//! Plots drawn with plotters on a canvas element.

use magwright_engine::waveform::Pwl;
use plotters::prelude::*;
use plotters_canvas::CanvasBackend;
use web_sys::HtmlCanvasElement;

/// Flux density over one period at both line extremes, in mT against µs.
pub fn flux(canvas: &HtmlCanvasElement, at_min: &Pwl, at_max: &Pwl, b_sat: f64) -> Result<(), String> {
    let backend = CanvasBackend::with_canvas_object(canvas.clone()).ok_or("no 2-D canvas context")?;
    let root = backend.into_drawing_area();
    root.fill(&WHITE).map_err(|e| e.to_string())?;
    let t_us = at_min.period * 1e6;
    let b_top = (at_min.max().max(at_max.max()) * 1e3 * 1.25).max(1.0);
    let mut chart = ChartBuilder::on(&root)
        .margin(10)
        .x_label_area_size(34)
        .y_label_area_size(56)
        .build_cartesian_2d(0.0..t_us, 0.0..b_top)
        .map_err(|e| e.to_string())?;
    chart
        .configure_mesh()
        .x_desc("t (µs)")
        .y_desc("B (mT)")
        .light_line_style(RGBColor(240, 240, 240))
        .x_label_formatter(&|v| format!("{v:.1}"))
        .y_label_formatter(&|v| format!("{v:.0}"))
        .label_style(("sans-serif", 13))
        .draw()
        .map_err(|e| e.to_string())?;
    let pts = |w: &Pwl| w.points.iter().map(|&(t, b)| (t * 1e6, b * 1e3)).collect::<Vec<_>>();
    let blue = RGBColor(32, 96, 176);
    let orange = RGBColor(208, 112, 24);
    chart
        .draw_series(LineSeries::new(pts(at_min), blue.stroke_width(2)))
        .map_err(|e| e.to_string())?
        .label("Vin min")
        .legend(move |(x, y)| PathElement::new(vec![(x, y), (x + 18, y)], blue.stroke_width(2)));
    chart
        .draw_series(LineSeries::new(pts(at_max), orange.stroke_width(2)))
        .map_err(|e| e.to_string())?
        .label("Vin max")
        .legend(move |(x, y)| PathElement::new(vec![(x, y), (x + 18, y)], orange.stroke_width(2)));
    let bs = b_sat * 1e3;
    if bs < b_top {
        let red = RGBColor(190, 30, 30);
        chart
            .draw_series(LineSeries::new(vec![(0.0, bs), (t_us, bs)], red.stroke_width(1)))
            .map_err(|e| e.to_string())?
            .label("Bsat")
            .legend(move |(x, y)| PathElement::new(vec![(x, y), (x + 18, y)], red));
    }
    chart
        .configure_series_labels()
        .background_style(WHITE.mix(0.85))
        .border_style(RGBColor(180, 180, 180))
        .label_font(("sans-serif", 13))
        .position(SeriesLabelPosition::UpperRight)
        .draw()
        .map_err(|e| e.to_string())?;
    root.present().map_err(|e| e.to_string())?;
    Ok(())
}
