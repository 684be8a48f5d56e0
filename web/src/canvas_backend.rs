//! plotters' drawing backend for the page's canvases: draws in CSS pixels on
//! a context [`crate::hidpi`] has scaled to the device pixel ratio, and sets
//! a 2-D context property only when it changes.
//!
//! A chart draws hundreds of grid lines, labels and dots in a handful of
//! styles. Setting `strokeStyle`, `fillStyle` or `font` means building a
//! CSS string, passing it to JavaScript and having the browser parse it;
//! doing that once per style change instead of once per primitive is most
//! of the drawing time saved. Everything else follows plotters-canvas's
//! backend (same paths, same half-pixel shift of horizontal and vertical
//! lines, same text anchors), which draws the rare primitives (single
//! pixels) and after which the kept state is forgotten.
//!
//! Straight lines in one style, one after another (a chart's grid, its
//! ticks, a window picture's layer lines), are gathered into one path and
//! stroked once, when the style changes or anything else is drawn: one
//! `stroke` for a grid instead of one per line. The lines are opaque or
//! drawn once each, so the pixels are those of separate strokes but where
//! two lines of a translucent colour cross.
//!
//! Text is measured on the canvas (`measureText`), never in the document:
//! plotters' own web measurement appends a span to the page and reads its
//! size, which forces a layout of the whole page for every label drawn.

use plotters_backend::text_anchor::{HPos, VPos};
use plotters_backend::{
    BackendColor, BackendCoord, BackendStyle, BackendTextStyle, DrawingBackend, DrawingErrorKind, FontTransform,
};
use plotters_canvas::CanvasBackend;
use std::cell::RefCell;
use web_sys::CanvasRenderingContext2d;

/// A drawing call the canvas refused (the message JavaScript gave).
#[derive(Debug, Clone)]
pub struct CanvasRefused(String);

impl std::fmt::Display for CanvasRefused {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "the canvas refused a drawing call: {}", self.0)
    }
}

impl std::error::Error for CanvasRefused {}

type Res = Result<(), DrawingErrorKind<CanvasRefused>>;

fn refused(e: wasm_bindgen::JsValue) -> DrawingErrorKind<CanvasRefused> {
    DrawingErrorKind::DrawingError(CanvasRefused(e.as_string().unwrap_or_else(|| format!("{e:?}"))))
}

/// A colour as the context state compares it: RGB and the alpha's bits.
type ColorKey = (u8, u8, u8, u64);

fn key(c: BackendColor) -> ColorKey {
    (c.rgb.0, c.rgb.1, c.rgb.2, c.alpha.to_bits())
}

/// The CSS colour string plotters-canvas sets.
fn css(c: BackendColor) -> String {
    let (r, g, b) = c.rgb;
    format!("rgba({r},{g},{b},{})", c.alpha)
}

/// The context properties last set through this backend (`None`: unknown).
#[derive(Default)]
struct Kept {
    stroke: Option<(ColorKey, u32)>,
    fill: Option<ColorKey>,
    /// Style, size (bits) and family: compared without building the string.
    font: Option<(String, u64, String)>,
    anchor: Option<(&'static str, &'static str)>,
    /// Lines in the kept stroke style traced and not yet stroked.
    lines: bool,
}

/// plotters' backend on a scaled 2-D context, `size` in CSS pixels.
pub struct Canvas2d {
    inner: CanvasBackend,
    ctx: CanvasRenderingContext2d,
    size: (u32, u32),
    kept: RefCell<Kept>,
}

impl Canvas2d {
    pub fn new(inner: CanvasBackend, ctx: CanvasRenderingContext2d, size: (u32, u32)) -> Canvas2d {
        Canvas2d { inner, ctx, size, kept: RefCell::new(Kept::default()) }
    }

    fn stroke_style(&self, style: &impl BackendStyle) {
        self.flush();
        let want = (key(style.color()), style.stroke_width());
        let mut k = self.kept.borrow_mut();
        if k.stroke != Some(want) {
            self.ctx.set_stroke_style_str(&css(style.color()));
            self.ctx.set_line_width(f64::from(want.1));
            k.stroke = Some(want);
        }
    }

    fn fill_style(&self, color: BackendColor) {
        self.flush();
        let want = key(color);
        let mut k = self.kept.borrow_mut();
        if k.fill != Some(want) {
            self.ctx.set_fill_style_str(&css(color));
            k.fill = Some(want);
        }
    }

    /// The font string plotters-canvas draws with.
    fn font(&self, style: &impl BackendTextStyle) {
        self.flush();
        let (st, size, family) = (style.style(), style.size(), style.family());
        let mut k = self.kept.borrow_mut();
        let same = k.font.as_ref().is_some_and(|(s, z, f)| s == st.as_str() && *z == size.to_bits() && f == family.as_str());
        if !same {
            self.ctx.set_font(&format!("{} {}px {}", st.as_str(), size, family.as_str()));
            k.font = Some((st.as_str().to_string(), size.to_bits(), family.as_str().to_string()));
        }
    }

    /// Strokes the lines gathered so far (see the module docs); every
    /// primitive but a line in the same style calls it first.
    fn flush(&self) {
        let mut k = self.kept.borrow_mut();
        if k.lines {
            self.ctx.stroke();
            k.lines = false;
        }
    }

    fn forget(&self) {
        self.flush();
        *self.kept.borrow_mut() = Kept::default();
    }

    fn delegated<E: std::error::Error + Send + Sync>(&self, r: Result<(), DrawingErrorKind<E>>) -> Res {
        self.forget();
        r.map_err(|e| match e {
            DrawingErrorKind::DrawingError(e) => DrawingErrorKind::DrawingError(CanvasRefused(e.to_string())),
            DrawingErrorKind::FontError(e) => DrawingErrorKind::FontError(e),
        })
    }

    fn trace(&self, mut path: impl Iterator<Item = BackendCoord>) -> bool {
        self.flush();
        self.ctx.begin_path();
        let Some(start) = path.next() else { return false };
        self.ctx.move_to(f64::from(start.0), f64::from(start.1));
        for p in path {
            self.ctx.line_to(f64::from(p.0), f64::from(p.1));
        }
        true
    }
}

/// The last lines gathered are stroked when the drawing ends, whether or
/// not plotters presents it.
impl Drop for Canvas2d {
    fn drop(&mut self) {
        self.flush();
    }
}

/// Moves a horizontal or vertical line half a pixel, as plotters-canvas
/// does, so a 1 px line covers one pixel row or column instead of blurring
/// across two.
fn crisp(from: BackendCoord, to: BackendCoord) -> ((f64, f64), (f64, f64)) {
    let (mut a, mut b) = ((f64::from(from.0), f64::from(from.1)), (f64::from(to.0), f64::from(to.1)));
    if from.0 == to.0 {
        a.0 -= 0.5;
        b.0 -= 0.5;
    }
    if from.1 == to.1 {
        a.1 -= 0.5;
        b.1 -= 0.5;
    }
    (a, b)
}

impl DrawingBackend for Canvas2d {
    type ErrorType = CanvasRefused;

    fn get_size(&self) -> (u32, u32) {
        self.size
    }
    fn ensure_prepared(&mut self) -> Res {
        Ok(())
    }
    fn present(&mut self) -> Res {
        self.flush();
        Ok(())
    }
    fn draw_pixel(&mut self, point: BackendCoord, color: BackendColor) -> Res {
        self.flush();
        let r = self.inner.draw_pixel(point, color);
        self.delegated(r)
    }
    fn draw_line<S: BackendStyle>(&mut self, from: BackendCoord, to: BackendCoord, style: &S) -> Res {
        if style.color().alpha == 0.0 {
            return Ok(());
        }
        let (a, b) = crisp(from, to);
        let want = (key(style.color()), style.stroke_width());
        let more = {
            let k = self.kept.borrow();
            k.lines && k.stroke == Some(want)
        };
        if !more {
            self.stroke_style(style);
            self.ctx.begin_path();
            self.kept.borrow_mut().lines = true;
        }
        self.ctx.move_to(a.0, a.1);
        self.ctx.line_to(b.0, b.1);
        Ok(())
    }
    fn draw_rect<S: BackendStyle>(&mut self, ul: BackendCoord, br: BackendCoord, style: &S, fill: bool) -> Res {
        if style.color().alpha == 0.0 {
            return Ok(());
        }
        let (x, y) = (f64::from(ul.0), f64::from(ul.1));
        let (w, h) = (f64::from(br.0 - ul.0), f64::from(br.1 - ul.1));
        if fill {
            self.fill_style(style.color());
            self.ctx.fill_rect(x, y, w, h);
        } else {
            self.stroke_style(style);
            self.ctx.stroke_rect(x, y, w, h);
        }
        Ok(())
    }
    fn draw_path<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(&mut self, path: I, style: &S) -> Res {
        if style.color().alpha == 0.0 {
            return Ok(());
        }
        self.stroke_style(style);
        self.trace(path.into_iter());
        self.ctx.stroke();
        Ok(())
    }
    fn draw_circle<S: BackendStyle>(&mut self, c: BackendCoord, r: u32, style: &S, fill: bool) -> Res {
        if style.color().alpha == 0.0 {
            return Ok(());
        }
        if fill {
            self.fill_style(style.color());
        } else {
            self.stroke_style(style);
        }
        self.ctx.begin_path();
        self.ctx.arc(f64::from(c.0), f64::from(c.1), f64::from(r), 0.0, std::f64::consts::TAU).map_err(refused)?;
        if fill {
            self.ctx.fill();
        } else {
            self.ctx.stroke();
        }
        Ok(())
    }
    fn fill_polygon<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(&mut self, vert: I, style: &S) -> Res {
        if style.color().alpha == 0.0 {
            return Ok(());
        }
        self.fill_style(style.color());
        if self.trace(vert.into_iter()) {
            self.ctx.close_path();
        }
        self.ctx.fill();
        Ok(())
    }
    fn draw_text<S: BackendTextStyle>(&mut self, text: &str, style: &S, pos: BackendCoord) -> Res {
        let color = style.color();
        if color.alpha == 0.0 {
            return Ok(());
        }
        let degree = match style.transform() {
            FontTransform::None => 0.0,
            FontTransform::Rotate90 => 90.0,
            FontTransform::Rotate180 => 180.0,
            FontTransform::Rotate270 => 270.0,
        };
        let (mut x, mut y) = (f64::from(pos.0), f64::from(pos.1));
        if degree != 0.0 {
            // save/restore would undo what is set in between: forget it all.
            self.forget();
            self.ctx.save();
            self.ctx.translate(x, y).map_err(refused)?;
            self.ctx.rotate(f64::to_radians(degree)).map_err(refused)?;
            (x, y) = (0.0, 0.0);
        }
        let anchor = (
            match style.anchor().v_pos {
                VPos::Top => "top",
                VPos::Center => "middle",
                VPos::Bottom => "bottom",
            },
            match style.anchor().h_pos {
                HPos::Left => "start",
                HPos::Right => "end",
                HPos::Center => "center",
            },
        );
        if self.kept.borrow().anchor != Some(anchor) {
            self.ctx.set_text_baseline(anchor.0);
            self.ctx.set_text_align(anchor.1);
            self.kept.borrow_mut().anchor = Some(anchor);
        }
        self.fill_style(color);
        self.font(style);
        let drawn = self.ctx.fill_text(text, x, y).map_err(refused);
        if degree != 0.0 {
            self.ctx.restore();
            self.forget();
        }
        drawn
    }
    fn estimate_text_size<S: BackendTextStyle>(
        &self,
        text: &str,
        style: &S,
    ) -> Result<(u32, u32), DrawingErrorKind<Self::ErrorType>> {
        // The height is the font's ascent + descent: the line box a span of
        // that font would have.
        self.font(style);
        let m = self.ctx.measure_text(text).map_err(refused)?;
        let h = m.font_bounding_box_ascent() + m.font_bounding_box_descent();
        let h = if h.is_finite() && h > 0.0 { h } else { style.size() * 1.2 };
        let w = m.width();
        let w = if w.is_finite() && w > 0.0 { w } else { 0.0 };
        Ok((w.ceil() as u32, h.ceil() as u32))
    }
}
