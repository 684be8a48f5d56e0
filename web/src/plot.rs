//! Drawings on canvas with plotters: two generic pictures that know nothing
//! about transformers.
//!
//! * [`line_chart`]: several series against one x axis (linear or log),
//!   an optional second y axis on the right, markers at chosen points (e.g.
//!   a sweep's minimum) and shaded x ranges (e.g. where no design exists).
//!   A series may show its points as dots (for data that is honestly
//!   discrete, like a sweep whose turns and wire are integers), and a
//!   non-finite y breaks its line (a gap, not a bridge over missing data).
//! * [`cross_section`]: rectangles given in metres drawn to scale (the same
//!   millimetres per pixel across and up), e.g. a winding window with its
//!   bobbin, layers and insulation.
//!
//! Callers hand over plain numbers in the units the axis names (the chart
//! does no unit conversion besides SI-prefixed tick labels when asked), so
//! every number drawn is one the caller got from the engine.

use magwright_engine::notation;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};
use web_sys::HtmlCanvasElement;

/// A colour, so that callers need not depend on plotters.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rgb(pub u8, pub u8, pub u8);

impl Rgb {
    pub(crate) fn c(self) -> RGBColor {
        RGBColor(self.0, self.1, self.2)
    }
}

/// Series colours with enough contrast on white, told apart also in grey.
pub const BLUE: Rgb = Rgb(32, 96, 176);
pub const ORANGE: Rgb = Rgb(204, 102, 0);
pub const GREEN: Rgb = Rgb(30, 128, 60);
pub const RED: Rgb = Rgb(180, 30, 30);
pub const GREY: Rgb = Rgb(90, 98, 110);
pub const PURPLE: Rgb = Rgb(120, 60, 160);
pub const TEAL: Rgb = Rgb(0, 120, 120);
pub const BROWN: Rgb = Rgb(130, 80, 40);
pub const MAGENTA: Rgb = Rgb(170, 40, 120);
pub const OLIVE: Rgb = Rgb(100, 110, 20);
/// The text colour, for a single main line.
pub const INK_RGB: Rgb = Rgb(29, 37, 48);

/// Line colours in order, for a variable number of series (e.g. windings).
pub const PALETTE: [Rgb; 8] = [ORANGE, BLUE, GREEN, PURPLE, TEAL, BROWN, MAGENTA, OLIVE];

/// Light band colours, for shaded ranges with different meanings.
pub const BANDS: [Rgb; 4] = [Rgb(200, 60, 60), Rgb(215, 150, 20), Rgb(120, 70, 190), Rgb(90, 98, 110)];

pub(crate) const FONT: &str = "sans-serif";
pub(crate) const INK: RGBColor = RGBColor(29, 37, 48);
pub(crate) const GRID: RGBColor = RGBColor(236, 238, 242);

/// Which y axis a series or marker belongs to.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Side {
    Left,
    Right,
}

/// One axis: its title and unit (shown as "title (unit)"), and how ticks read.
#[derive(Debug, Clone, PartialEq)]
pub struct Axis {
    pub title: String,
    pub unit: String,
    /// Logarithmic scale (x axis only); ticks at 1-2-5 steps.
    pub log: bool,
    /// Start the range at zero (for quantities that cannot be negative).
    pub from_zero: bool,
    /// Tick labels with SI prefixes ("200k") instead of plain numbers.
    pub prefixed: bool,
}

impl Axis {
    pub fn new(title: &str, unit: &str) -> Self {
        Axis {
            title: title.into(),
            unit: unit.into(),
            log: false,
            from_zero: false,
            prefixed: false,
        }
    }
    pub fn log(mut self) -> Self {
        self.log = true;
        self.prefixed = true;
        self
    }
    pub fn from_zero(mut self) -> Self {
        self.from_zero = true;
        self
    }
    /// SI-prefixed tick labels on a linear axis.
    pub fn prefixed(mut self) -> Self {
        self.prefixed = true;
        self
    }
    fn desc(&self) -> String {
        if self.unit.is_empty() {
            self.title.clone()
        } else {
            format!("{} ({})", self.title, self.unit)
        }
    }
    fn tick(&self, v: f64) -> String {
        if self.prefixed {
            compact(v)
        } else {
            plain(v)
        }
    }
}

/// One line.
#[derive(Debug, Clone, PartialEq)]
pub struct Series {
    pub label: String,
    pub points: Vec<(f64, f64)>,
    pub color: Rgb,
    pub side: Side,
    /// Dashed, for limits and references rather than results. Dashes are
    /// laid per segment, so use it for lines of few points.
    pub dashed: bool,
    /// Line width in pixels (2 unless `thin`).
    pub width: u32,
    /// Draw a dot at every point (radius in pixels; 0: none).
    pub dots: u32,
    /// Draw no line, dots only.
    pub no_line: bool,
    /// Leave the series out of the legend.
    pub unlisted: bool,
}

impl Series {
    pub fn new(label: &str, points: Vec<(f64, f64)>, color: Rgb) -> Self {
        Series {
            label: label.into(),
            points,
            color,
            side: Side::Left,
            dashed: false,
            width: 2,
            dots: 0,
            no_line: false,
            unlisted: false,
        }
    }
    /// A line of `px` pixels (e.g. a thick vertical bar of two points).
    pub fn width(mut self, px: u32) -> Self {
        self.width = px.max(1);
        self
    }
    /// A dot of radius `r` pixels at every point.
    pub fn dots(mut self, r: u32) -> Self {
        self.dots = r;
        self
    }
    /// Dots only, no line between them.
    pub fn scatter(mut self, r: u32) -> Self {
        self.dots = r.max(1);
        self.no_line = true;
        self
    }
    /// Not named in the legend (a second part of a listed series).
    pub fn unlisted(mut self) -> Self {
        self.unlisted = true;
        self
    }
    /// A 1-pixel line, for a secondary quantity.
    pub fn thin(mut self) -> Self {
        self.width = 1;
        self
    }
    pub fn right(mut self) -> Self {
        self.side = Side::Right;
        self
    }
    pub fn dashed(mut self) -> Self {
        self.dashed = true;
        self.width = 1;
        self
    }
}

/// A dot at a point, named in the legend, e.g. "lowest loss: 1.2 W at 150 kHz".
#[derive(Debug, Clone, PartialEq)]
pub struct Marker {
    pub x: f64,
    pub y: f64,
    pub side: Side,
    pub label: String,
    pub color: Rgb,
}

/// A shaded band over an x range, e.g. where no design exists.
#[derive(Debug, Clone, PartialEq)]
pub struct Shade {
    pub from: f64,
    pub to: f64,
    /// Legend text; bands with the same label share one legend entry.
    pub label: String,
    /// Band colour (drawn as a light tint of it).
    pub color: Rgb,
}

/// Everything a line chart shows.
#[derive(Debug, Clone, PartialEq)]
pub struct LineChart {
    pub x: Axis,
    pub y: Axis,
    /// The right-hand axis, for series with `Side::Right`.
    pub y2: Option<Axis>,
    pub series: Vec<Series>,
    pub markers: Vec<Marker>,
    pub shades: Vec<Shade>,
}

use crate::hidpi::Area;

pub(crate) fn err<E: std::fmt::Display>(e: E) -> String {
    e.to_string()
}

/// The canvas at the device pixel ratio ([`crate::hidpi`]), filled white.
fn area(canvas: &HtmlCanvasElement) -> Result<Area, String> {
    crate::hidpi::area(canvas)
}

/// Smallest and largest finite value, or None.
fn extent(values: impl Iterator<Item = f64>) -> Option<(f64, f64)> {
    values.filter(|v| v.is_finite()).fold(None, |acc, v| match acc {
        None => Some((v, v)),
        Some((lo, hi)) => Some((lo.min(v), hi.max(v))),
    })
}

/// A y range with some headroom, never empty.
fn padded(lo: f64, hi: f64, from_zero: bool) -> (f64, f64) {
    let (mut lo, mut hi) = if from_zero {
        (lo.min(0.0), hi.max(0.0))
    } else {
        (lo, hi)
    };
    if hi - lo <= f64::EPSILON * hi.abs().max(1.0) {
        let d = if hi == 0.0 { 1.0 } else { hi.abs() * 0.1 };
        lo -= d;
        hi += d;
    }
    let pad = (hi - lo) * 0.08;
    let lo = if from_zero && lo >= 0.0 { lo } else { lo - pad };
    (lo, hi + pad)
}

/// Draws a line chart on the canvas. An empty chart (no finite points)
/// shows a short note instead of axes.
pub fn line_chart(canvas: &HtmlCanvasElement, spec: &LineChart) -> Result<(), String> {
    let root = area(canvas)?;
    let log = spec.x.log;
    let fx = move |x: f64| if log { x.log10() } else { x };
    let usable = |x: f64| x.is_finite() && (!log || x > 0.0);
    let xs = spec
        .series
        .iter()
        .flat_map(|s| s.points.iter().map(|p| p.0))
        .chain(spec.shades.iter().flat_map(|s| [s.from, s.to]))
        .filter(|&x| usable(x));
    let Some((x_lo, x_hi)) = extent(xs) else {
        return note(&root, "nothing to draw");
    };
    let (x_lo, x_hi) = if x_hi > x_lo {
        (x_lo, x_hi)
    } else {
        (x_lo - 1.0, x_hi + 1.0)
    };
    let ys = |side: Side| {
        let pts = spec
            .series
            .iter()
            .filter(move |s| s.side == side)
            .flat_map(|s| s.points.iter().copied());
        let marks = spec.markers.iter().filter(move |m| m.side == side).map(|m| (m.x, m.y));
        extent(pts.chain(marks).filter(|p| usable(p.0)).map(|p| p.1))
    };
    let (y_lo, y_hi) = ys(Side::Left).unwrap_or((0.0, 1.0));
    let (y_lo, y_hi) = padded(y_lo, y_hi, spec.y.from_zero);
    let y2_axis = spec.y2.as_ref();
    let (y2_lo, y2_hi) = match y2_axis {
        Some(a) => {
            let (lo, hi) = ys(Side::Right).unwrap_or((0.0, 1.0));
            padded(lo, hi, a.from_zero)
        }
        None => (y_lo, y_hi),
    };
    let (u_lo, u_hi) = (fx(x_lo), fx(x_hi));

    // The legend is a row (or rows) above the plot, so it never hides a line.
    let mut entries: Vec<(String, Swatch)> = Vec::new();
    for sh in &spec.shades {
        if !entries.iter().any(|e| e.0 == sh.label) {
            entries.push((sh.label.clone(), Swatch::Band(sh.color.c())));
        }
    }
    for se in spec.series.iter().filter(|s| !s.unlisted) {
        let label = if se.side == Side::Right && y2_axis.is_some() {
            format!("{} (right)", se.label)
        } else {
            se.label.clone()
        };
        let swatch = if se.no_line {
            Swatch::Dot(se.color.c(), se.dots.max(2))
        } else {
            Swatch::Line(se.color.c(), se.width.max(1), se.dashed, se.dots)
        };
        entries.push((label, swatch));
    }
    for m in &spec.markers {
        entries.push((m.label.clone(), Swatch::Dot(m.color.c(), 5)));
    }
    let (w, _) = root.dim_in_pixel();
    let placed = legend_layout(&entries, 58, w as i32 - 10);
    let rows = placed.iter().map(|p| p.1).max().map_or(0, |r| r + 1);

    let mut chart = ChartBuilder::on(&root)
        .margin(10)
        .margin_top(10 + 18 * rows as u32)
        .margin_right(if y2_axis.is_some() { 4 } else { 16 })
        .x_label_area_size(40)
        .y_label_area_size(58)
        .right_y_label_area_size(if y2_axis.is_some() { 58 } else { 0 })
        .build_cartesian_2d(u_lo..u_hi, y_lo..y_hi)
        .map_err(err)?
        .set_secondary_coord(u_lo..u_hi, y2_lo..y2_hi);

    let x_axis = &spec.x;
    let y_axis = &spec.y;
    let x_fmt = |u: &f64| x_axis.tick(*u);
    let y_fmt = |v: &f64| y_axis.tick(*v);
    let blank = |_: &f64| String::new();
    {
        let mut mesh = chart.configure_mesh();
        mesh.x_desc(x_axis.desc())
            .y_desc(y_axis.desc())
            .bold_line_style(GRID)
            .light_line_style(RGBColor(246, 247, 249))
            .axis_style(RGBColor(150, 158, 170))
            .label_style((FONT, 13).into_font().color(&INK))
            .axis_desc_style((FONT, 13).into_font().color(&INK))
            .y_label_formatter(&y_fmt)
            .y_labels(6);
        if log {
            mesh.disable_x_mesh()
                .x_label_formatter(&blank)
                .set_tick_mark_size(LabelAreaPosition::Bottom, 0);
        } else {
            mesh.x_labels(8).x_label_formatter(&x_fmt);
        }
        mesh.draw().map_err(err)?;
    }
    if let Some(a) = y2_axis {
        let f2 = |v: &f64| a.tick(*v);
        chart
            .configure_secondary_axes()
            .y_desc(a.desc())
            .label_style((FONT, 13).into_font().color(&INK))
            .axis_desc_style((FONT, 13).into_font().color(&INK))
            .y_label_formatter(&f2)
            .y_labels(6)
            .draw()
            .map_err(err)?;
    }
    if log {
        // Our own log ticks: light lines at every 1…9 of a decade, labels at 1-2-5.
        let decades = (x_hi / x_lo).log10();
        let steps: &[f64] = if decades > 3.5 {
            &[1.0]
        } else if decades > 1.2 {
            &[1.0, 2.0, 5.0]
        } else {
            &[1.0, 1.5, 2.0, 3.0, 5.0, 7.0]
        };
        let d0 = x_lo.log10().floor() as i32;
        let d1 = x_hi.log10().ceil() as i32;
        let mut grid = Vec::new();
        let mut labels = Vec::new();
        for d in d0..=d1.min(d0 + 12) {
            for m in 1..10 {
                let v = m as f64 * 10f64.powi(d);
                if v >= x_lo * (1.0 - 1e-9) && v <= x_hi * (1.0 + 1e-9) {
                    grid.push(v);
                }
            }
            for &m in steps {
                let v = m * 10f64.powi(d);
                if v >= x_lo * (1.0 - 1e-9) && v <= x_hi * (1.0 + 1e-9) {
                    labels.push(v);
                }
            }
        }
        for v in &grid {
            let style = if labels.contains(v) {
                GRID
            } else {
                RGBColor(246, 247, 249)
            };
            chart
                .draw_series(LineSeries::new([(v.log10(), y_lo), (v.log10(), y_hi)], style))
                .map_err(err)?;
        }
        let font = (FONT, 13)
            .into_font()
            .color(&INK)
            .pos(Pos::new(HPos::Center, VPos::Top));
        for v in labels {
            let (px, py) = chart.backend_coord(&(v.log10(), y_lo));
            root.draw(&PathElement::new(vec![(px, py), (px, py + 5)], RGBColor(150, 158, 170)))
                .map_err(err)?;
            root.draw(&Text::new(x_axis.tick(v), (px, py + 7), font.clone()))
                .map_err(err)?;
        }
    }

    // Shaded bands first, under the lines.
    for s in &spec.shades {
        let shade = s.color.c().mix(0.13);
        let (a, b) = (s.from.max(x_lo), s.to.min(x_hi));
        if !(usable(a) && usable(b)) || b < a {
            continue;
        }
        let (a, b) = (fx(a), fx(b));
        chart
            .draw_series(std::iter::once(Rectangle::new([(a, y_lo), (b, y_hi)], shade.filled())))
            .map_err(err)?;
    }

    for s in &spec.series {
        let color = s.color.c();
        let style = color.stroke_width(s.width.max(1));
        // A non-finite y ends one run of the line and a finite one starts the next.
        let runs = s.points.split(|p| !p.1.is_finite());
        for run in runs {
            let pts: Vec<(f64, f64)> = run.iter().filter(|p| usable(p.0)).map(|&(x, y)| (fx(x), y)).collect();
            if pts.is_empty() {
                continue;
            }
            if !s.no_line && pts.len() >= 2 {
                match (s.side, s.dashed) {
                    (Side::Left, false) => chart.draw_series(LineSeries::new(pts.iter().copied(), style)),
                    (Side::Left, true) => chart.draw_series(DashedLineSeries::new(pts.iter().copied(), 6, 4, style)),
                    (Side::Right, false) => chart.draw_secondary_series(LineSeries::new(pts.iter().copied(), style)),
                    (Side::Right, true) => {
                        chart.draw_secondary_series(DashedLineSeries::new(pts.iter().copied(), 6, 4, style))
                    }
                }
                .map_err(err)?;
            }
            if s.dots > 0 {
                let r = s.dots as i32;
                let dots = pts.iter().map(|&p| Circle::new(p, r, color.filled()));
                match s.side {
                    Side::Left => chart.draw_series(dots),
                    Side::Right => chart.draw_secondary_series(dots),
                }
                .map_err(err)?;
            }
        }
    }

    for m in &spec.markers {
        if !usable(m.x) || !m.y.is_finite() {
            continue;
        }
        let c = m.color.c();
        let el = EmptyElement::at((fx(m.x), m.y))
            + Circle::new((0, 0), 5, c.filled())
            + Circle::new((0, 0), 8, c.stroke_width(1));
        match m.side {
            Side::Left => chart.draw_series(std::iter::once(el)),
            Side::Right => chart.draw_secondary_series(std::iter::once(el)),
        }
        .map_err(err)?;
    }

    let font = (FONT, 12)
        .into_font()
        .color(&INK)
        .pos(Pos::new(HPos::Left, VPos::Center));
    for ((label, swatch), (x, row)) in entries.iter().zip(&placed) {
        let y = 12 + 18 * *row as i32;
        match *swatch {
            Swatch::Line(c, width, dashed, dots) => {
                if dots > 0 {
                    root.draw(&Circle::new((x + 9, y), dots as i32 + 1, c.filled()))
                        .map_err(err)?;
                }
                if dashed {
                    for k in 0..3 {
                        root.draw(&PathElement::new(
                            vec![(x + 7 * k, y), (x + 7 * k + 4, y)],
                            c.stroke_width(width),
                        ))
                        .map_err(err)?;
                    }
                } else {
                    root.draw(&PathElement::new(vec![(*x, y), (x + 18, y)], c.stroke_width(width)))
                        .map_err(err)?;
                }
            }
            Swatch::Band(c) => root
                .draw(&Rectangle::new([(*x, y - 6), (x + 18, y + 6)], c.mix(0.3).filled()))
                .map_err(err)?,
            Swatch::Dot(c, r) => root
                .draw(&Circle::new((x + 9, y), r.min(6) as i32, c.filled()))
                .map_err(err)?,
        }
        root.draw(&Text::new(label.clone(), (x + 24, y), font.clone()))
            .map_err(err)?;
    }
    root.present().map_err(err)
}

/// The sample drawn before a legend label.
#[derive(Debug, Clone, Copy)]
enum Swatch {
    /// Colour, width, dashed, dot radius.
    Line(RGBColor, u32, bool, u32),
    Band(RGBColor),
    /// Colour, radius.
    Dot(RGBColor, u32),
}

/// Rough width of a label at 12 px sans-serif (no text metrics here).
fn text_px(s: &str) -> i32 {
    (s.chars().count() as i32 * 27) / 4
}

/// Places legend entries left to right from `left`, wrapping at `right`:
/// (x, row) of each entry.
fn legend_layout(entries: &[(String, Swatch)], left: i32, right: i32) -> Vec<(i32, usize)> {
    let mut out = Vec::with_capacity(entries.len());
    let (mut x, mut row) = (left, 0);
    for (label, _) in entries {
        let w = 24 + text_px(label) + 16;
        if x + w > right && x > left {
            x = left;
            row += 1;
        }
        out.push((x, row));
        x += w;
    }
    out
}

/// What a rectangle of a cross-section is; sets its colour and legend.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    /// The core's window outline (drawn as an outline, not filled).
    CoreWindow,
    /// The bobbin's winding space.
    Bobbin,
    Primary,
    Secondary,
    /// Tape or other insulation between layers.
    Insulation,
    /// Margin tape, creepage spacers, anything else.
    Other,
}

impl Kind {
    pub fn name(self) -> &'static str {
        match self {
            Kind::CoreWindow => "core window",
            Kind::Bobbin => "bobbin winding space",
            Kind::Primary => "primary",
            Kind::Secondary => "secondary",
            Kind::Insulation => "insulation",
            Kind::Other => "margin / other",
        }
    }
    fn fill(self) -> RGBAColor {
        match self {
            Kind::CoreWindow => RGBColor(255, 255, 255).mix(0.0),
            Kind::Bobbin => RGBColor(226, 232, 240).mix(1.0),
            Kind::Primary => RGBColor(205, 120, 45).mix(0.85),
            Kind::Secondary => RGBColor(40, 100, 170).mix(0.85),
            Kind::Insulation => RGBColor(240, 210, 90).mix(0.9),
            Kind::Other => RGBColor(150, 160, 170).mix(0.6),
        }
    }
    fn edge(self) -> RGBColor {
        match self {
            Kind::CoreWindow => RGBColor(60, 66, 76),
            Kind::Bobbin => RGBColor(130, 140, 155),
            Kind::Primary => RGBColor(140, 70, 10),
            Kind::Secondary => RGBColor(20, 60, 120),
            Kind::Insulation => RGBColor(160, 130, 20),
            Kind::Other => RGBColor(90, 98, 110),
        }
    }
}

/// One rectangle of a cross-section, in metres: `x` across the window
/// (away from the centre leg), `y` along the centre leg.
#[derive(Debug, Clone, PartialEq)]
pub struct Rect {
    pub x: f64,
    pub y: f64,
    pub w: f64,
    pub h: f64,
    pub kind: Kind,
    /// Written inside the rectangle when it fits.
    pub label: String,
}

/// Draws rectangles to scale (equal millimetres per pixel in x and y),
/// axes in millimetres, a legend of the kinds present.
pub fn cross_section(canvas: &HtmlCanvasElement, rects: &[Rect]) -> Result<(), String> {
    let root = area(canvas)?;
    let ok = |r: &&Rect| [r.x, r.y, r.w, r.h].iter().all(|v| v.is_finite()) && r.w > 0.0 && r.h > 0.0;
    let rects: Vec<&Rect> = rects.iter().filter(ok).collect();
    let (Some((x0, x1)), Some((y0, y1))) = (
        extent(rects.iter().flat_map(|r| [r.x, r.x + r.w])),
        extent(rects.iter().flat_map(|r| [r.y, r.y + r.h])),
    ) else {
        return note(&root, "nothing to draw");
    };
    let (w, h) = root.dim_in_pixel();
    let (margin, left, bottom, legend_w) = (10u32, 50u32, 38u32, 170u32);
    let pw = w.saturating_sub(2 * margin + left + legend_w).max(20) as f64;
    let ph = h.saturating_sub(2 * margin + bottom).max(20) as f64;
    let (bw, bh) = ((x1 - x0) * 1e3, (y1 - y0) * 1e3);
    let pad = 0.06 * bw.max(bh);
    let mm_per_px = ((bw + 2.0 * pad) / pw).max((bh + 2.0 * pad) / ph);
    let (cx, cy) = ((x0 + x1) * 0.5e3, (y0 + y1) * 0.5e3);
    let (hx, hy) = (0.5 * pw * mm_per_px, 0.5 * ph * mm_per_px);
    let (plot_area, legend_area) = root.split_horizontally(w.saturating_sub(legend_w));
    let mut chart = ChartBuilder::on(&plot_area)
        .margin(margin)
        .margin_right(0)
        .x_label_area_size(bottom)
        .y_label_area_size(left)
        .build_cartesian_2d(cx - hx..cx + hx, cy - hy..cy + hy)
        .map_err(err)?;
    chart
        .configure_mesh()
        .x_desc("across the window (mm)")
        .y_desc("along the leg (mm)")
        .bold_line_style(GRID)
        .light_line_style(RGBColor(248, 249, 250))
        .axis_style(RGBColor(150, 158, 170))
        .label_style((FONT, 12).into_font().color(&INK))
        .axis_desc_style((FONT, 12).into_font().color(&INK))
        .x_label_formatter(&|v| plain(*v))
        .y_label_formatter(&|v| plain(*v))
        .draw()
        .map_err(err)?;
    let mut kinds: Vec<Kind> = Vec::new();
    let font = (FONT, 11)
        .into_font()
        .color(&INK)
        .pos(Pos::new(HPos::Center, VPos::Center));
    for r in &rects {
        let a = (r.x * 1e3, r.y * 1e3);
        let b = ((r.x + r.w) * 1e3, (r.y + r.h) * 1e3);
        chart
            .draw_series([
                Rectangle::new([a, b], r.kind.fill().filled()),
                Rectangle::new([a, b], r.kind.edge().stroke_width(1)),
            ])
            .map_err(err)?;
        if !kinds.contains(&r.kind) {
            kinds.push(r.kind);
        }
        let (pa, pb) = (chart.backend_coord(&a), chart.backend_coord(&b));
        let (pw, ph) = ((pb.0 - pa.0).abs(), (pb.1 - pa.1).abs());
        if !r.label.is_empty() && (r.label.chars().count() as i32) * 6 + 6 < pw && ph >= 14 {
            let c = ((pa.0 + pb.0) / 2, (pa.1 + pb.1) / 2);
            plot_area
                .draw(&Text::new(r.label.clone(), c, font.clone()))
                .map_err(err)?;
        }
    }
    // Legend at the right, one swatch per kind present.
    let lf = (FONT, 12)
        .into_font()
        .color(&INK)
        .pos(Pos::new(HPos::Left, VPos::Center));
    for (i, k) in kinds.iter().enumerate() {
        let y = margin as i32 + 12 + 22 * i as i32;
        legend_area
            .draw(&Rectangle::new([(8, y - 7), (26, y + 7)], k.fill().filled()))
            .map_err(err)?;
        legend_area
            .draw(&Rectangle::new([(8, y - 7), (26, y + 7)], k.edge().stroke_width(1)))
            .map_err(err)?;
        legend_area
            .draw(&Text::new(k.name(), (32, y), lf.clone()))
            .map_err(err)?;
    }
    let sf = (FONT, 11)
        .into_font()
        .color(&RGBColor(91, 102, 117))
        .pos(Pos::new(HPos::Left, VPos::Center));
    let y = margin as i32 + 12 + 22 * kinds.len() as i32 + 6;
    legend_area
        .draw(&Text::new("drawn to scale", (8, y), sf))
        .map_err(err)?;
    root.present().map_err(err)
}

pub(crate) fn note(root: &Area, text: &str) -> Result<(), String> {
    let (w, h) = root.dim_in_pixel();
    let f = (FONT, 14)
        .into_font()
        .color(&RGBColor(91, 102, 117))
        .pos(Pos::new(HPos::Center, VPos::Center));
    root.draw(&Text::new(text.to_string(), (w as i32 / 2, h as i32 / 2), f))
        .map_err(err)?;
    root.present().map_err(err)
}

/// A tick label without needless digits: 0.5, 12, 1.25, 1e-5.
fn plain(v: f64) -> String {
    if v == 0.0 || !v.is_finite() {
        return "0".into();
    }
    let a = v.abs();
    if !(1e-3..1e6).contains(&a) {
        return format!("{v:.1e}");
    }
    let s = format!("{v:.4}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    s.to_string()
}

/// A tick label with an SI prefix and no trailing zeros: 20k, 1.5M, 500m.
pub(crate) fn compact(v: f64) -> String {
    let s = notation::format(v, "", 3);
    let (num, prefix) = s.split_once(' ').unwrap_or((s.as_str(), ""));
    let num = if num.contains('.') {
        num.trim_end_matches('0').trim_end_matches('.')
    } else {
        num
    };
    format!("{num}{prefix}")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tick_labels_are_short() {
        assert_eq!(compact(200e3), "200k");
        assert_eq!(compact(20e3), "20k");
        assert_eq!(compact(1.5e6), "1.5M");
        assert_eq!(compact(2e6), "2M");
        assert_eq!(plain(0.5), "0.5");
        assert_eq!(plain(12.0), "12");
        assert_eq!(plain(0.0), "0");
    }

    #[test]
    fn ranges_are_never_empty() {
        let (lo, hi) = padded(3.0, 3.0, false);
        assert!(hi > lo);
        let (lo, _) = padded(1.0, 2.0, true);
        assert_eq!(lo, 0.0);
        assert_eq!(extent([f64::NAN, 2.0, -1.0].into_iter()), Some((-1.0, 2.0)));
    }
}
