//! Canvases drawn at the device pixel ratio, so pictures are sharp on a
//! high-DPI screen.
//!
//! The canvas's backing store is sized to its CSS (layout) size ×
//! `devicePixelRatio`, and the 2-D context is scaled by the same ratio, so
//! plotters keeps drawing in CSS pixels: [`HiDpi`] is plotters' canvas
//! backend reporting the CSS size. Fonts and line widths stay the CSS sizes
//! they were, drawn with `devicePixelRatio` device pixels each.

use plotters::coord::Shift;
use plotters::prelude::*;
use plotters_backend::{BackendColor, BackendCoord, BackendStyle, BackendTextStyle, DrawingErrorKind};
use plotters_canvas::CanvasBackend;
use wasm_bindgen::JsCast;
use web_sys::{CanvasRenderingContext2d, HtmlCanvasElement};

/// plotters' canvas backend drawing in CSS pixels on a scaled context.
pub struct HiDpi {
    inner: CanvasBackend,
    size: (u32, u32),
}

/// A drawing area on a [`HiDpi`] canvas.
pub type Area = DrawingArea<HiDpi, Shift>;

/// The device pixel ratio, within 1…4 (1 when unknown).
pub fn device_pixel_ratio() -> f64 {
    let r = web_sys::window().map_or(1.0, |w| w.device_pixel_ratio());
    if r.is_finite() { r.clamp(1.0, 4.0) } else { 1.0 }
}

/// The CSS size a canvas is drawn at: its layout width (the page's CSS may
/// narrow it) and the height keeping the nominal aspect; the nominal size
/// (`data-w`, `data-h`, set by `ui::PlotCanvas`) while it is not laid out.
fn css_size(canvas: &HtmlCanvasElement) -> (u32, u32) {
    let attr = |k: &str, d: u32| canvas.get_attribute(k).and_then(|v| v.parse::<u32>().ok()).filter(|v| *v > 0).unwrap_or(d);
    let (w, h) = (attr("data-w", canvas.width().max(1)), attr("data-h", canvas.height().max(1)));
    let laid = canvas.client_width();
    if laid > 0 {
        let lw = laid as u32;
        (lw, ((f64::from(lw) * f64::from(h) / f64::from(w)).round() as u32).max(1))
    } else {
        (w, h)
    }
}

/// Sizes the canvas's backing store to CSS size × device pixel ratio,
/// scales its context, and returns the drawing area (in CSS pixels),
/// filled white.
pub fn area(canvas: &HtmlCanvasElement) -> Result<Area, String> {
    let (w, h) = css_size(canvas);
    let dpr = device_pixel_ratio();
    let (bw, bh) = ((f64::from(w) * dpr).round() as u32, (f64::from(h) * dpr).round() as u32);
    if canvas.width() != bw {
        canvas.set_width(bw);
    }
    if canvas.height() != bh {
        canvas.set_height(bh);
    }
    let ctx: CanvasRenderingContext2d = canvas
        .get_context("2d")
        .ok()
        .flatten()
        .and_then(|c| c.dyn_into().ok())
        .ok_or("no 2-D canvas context")?;
    ctx.set_transform(f64::from(bw) / f64::from(w), 0.0, 0.0, f64::from(bh) / f64::from(h), 0.0, 0.0)
        .map_err(|_| "the canvas refuses a transform".to_string())?;
    let inner = CanvasBackend::with_canvas_object(canvas.clone()).ok_or("no 2-D canvas context")?;
    let root = HiDpi { inner, size: (w, h) }.into_drawing_area();
    root.fill(&WHITE).map_err(|e| e.to_string())?;
    Ok(root)
}

type Res = Result<(), DrawingErrorKind<<CanvasBackend as DrawingBackend>::ErrorType>>;

impl DrawingBackend for HiDpi {
    type ErrorType = <CanvasBackend as DrawingBackend>::ErrorType;

    fn get_size(&self) -> (u32, u32) {
        self.size
    }
    fn ensure_prepared(&mut self) -> Res {
        self.inner.ensure_prepared()
    }
    fn present(&mut self) -> Res {
        self.inner.present()
    }
    fn draw_pixel(&mut self, point: BackendCoord, color: BackendColor) -> Res {
        self.inner.draw_pixel(point, color)
    }
    fn draw_line<S: BackendStyle>(&mut self, from: BackendCoord, to: BackendCoord, style: &S) -> Res {
        self.inner.draw_line(from, to, style)
    }
    fn draw_rect<S: BackendStyle>(&mut self, ul: BackendCoord, br: BackendCoord, style: &S, fill: bool) -> Res {
        self.inner.draw_rect(ul, br, style, fill)
    }
    fn draw_path<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(&mut self, path: I, style: &S) -> Res {
        self.inner.draw_path(path, style)
    }
    fn draw_circle<S: BackendStyle>(&mut self, c: BackendCoord, r: u32, style: &S, fill: bool) -> Res {
        self.inner.draw_circle(c, r, style, fill)
    }
    fn fill_polygon<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(&mut self, vert: I, style: &S) -> Res {
        self.inner.fill_polygon(vert, style)
    }
    fn draw_text<S: BackendTextStyle>(&mut self, text: &str, style: &S, pos: BackendCoord) -> Res {
        self.inner.draw_text(text, style, pos)
    }
    fn estimate_text_size<S: BackendTextStyle>(
        &self,
        text: &str,
        style: &S,
    ) -> Result<(u32, u32), DrawingErrorKind<Self::ErrorType>> {
        self.inner.estimate_text_size(text, style)
    }
}
