//! Canvases drawn at the device pixel ratio, so pictures are sharp on a
//! high-DPI screen.
//!
//! The canvas's backing store is sized to its CSS (layout) size ×
//! `devicePixelRatio`, and the 2-D context is scaled by the same ratio, so
//! plotters keeps drawing in CSS pixels: [`Canvas2d`] is the backend
//! reporting the CSS size. Fonts and line widths stay the CSS sizes
//! they were, drawn with `devicePixelRatio` device pixels each.
//!
//! The CSS width is read from the layout once (the first drawing) and then
//! kept up to date by a `ResizeObserver` ([`WidthWatch`]), which runs after
//! the browser's own layout: drawing never forces a synchronous layout of
//! the page in the middle of a keystroke's updates.

use crate::canvas_backend::Canvas2d;
use plotters::coord::Shift;
use plotters::prelude::*;
use plotters_canvas::CanvasBackend;
use wasm_bindgen::JsCast;
use web_sys::{CanvasRenderingContext2d, HtmlCanvasElement};

/// A drawing area on a scaled canvas, in CSS pixels.
pub type Area = DrawingArea<Canvas2d, Shift>;

/// The device pixel ratio, within 1…4 (1 when unknown).
pub fn device_pixel_ratio() -> f64 {
    let r = web_sys::window().map_or(1.0, |w| w.device_pixel_ratio());
    if r.is_finite() { r.clamp(1.0, 4.0) } else { 1.0 }
}

/// The attribute holding a canvas's laid-out CSS width, in whole pixels.
const LAID_WIDTH: &str = "data-laid-w";

/// A positive whole-pixel attribute of `el`.
fn px_attr(el: &web_sys::Element, k: &str) -> Option<u32> {
    el.get_attribute(k).and_then(|v| v.parse::<u32>().ok()).filter(|v| *v > 0)
}

/// The CSS size a canvas is drawn at: its layout width (the page's CSS may
/// narrow it) and the height keeping the nominal aspect; the nominal size
/// (`data-w`, `data-h`, set by `ui::PlotCanvas`) while it is not laid out.
/// The width is the one [`WidthWatch`] last saw; only before that is the
/// layout read here (and the value kept).
fn css_size(canvas: &HtmlCanvasElement) -> (u32, u32) {
    let attr = |k: &str, d: u32| px_attr(canvas, k).unwrap_or(d);
    let (w, h) = (attr("data-w", canvas.width().max(1)), attr("data-h", canvas.height().max(1)));
    let laid = px_attr(canvas, LAID_WIDTH).or_else(|| {
        let lw = u32::try_from(canvas.client_width()).ok().filter(|v| *v > 0)?;
        let _ = canvas.set_attribute(LAID_WIDTH, &lw.to_string());
        Some(lw)
    });
    if let Some(lw) = laid {
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
    let root = Canvas2d::new(inner, ctx, (w, h)).into_drawing_area();
    root.fill(&WHITE).map_err(|e| e.to_string())?;
    Ok(root)
}

/// Watches a canvas's laid-out width: when it changes to a new positive
/// value (a resize, a hidden panel shown), the width is kept for
/// [`area`] and `changed` is called (to redraw). Stops when dropped.
pub struct WidthWatch {
    observer: web_sys::ResizeObserver,
    _callback: wasm_bindgen::closure::Closure<dyn FnMut(js_sys::Array)>,
}

impl WidthWatch {
    pub fn new(canvas: &HtmlCanvasElement, changed: impl Fn() + 'static) -> Option<WidthWatch> {
        let el = canvas.clone();
        let callback = wasm_bindgen::closure::Closure::<dyn FnMut(js_sys::Array)>::new(move |entries: js_sys::Array| {
            let Some(entry) = entries.iter().last().and_then(|e| e.dyn_into::<web_sys::ResizeObserverEntry>().ok()) else {
                return;
            };
            // clientWidth's rounding, as the first reading in `css_size`.
            let w = entry.content_rect().width().round();
            if !(w.is_finite() && w >= 1.0) {
                return; // hidden: keep the last width
            }
            let w = w as u32;
            if px_attr(&el, LAID_WIDTH) != Some(w) {
                let _ = el.set_attribute(LAID_WIDTH, &w.to_string());
                changed();
            }
        });
        let observer = web_sys::ResizeObserver::new(callback.as_ref().unchecked_ref()).ok()?;
        observer.observe(canvas);
        Some(WidthWatch { observer, _callback: callback })
    }
}

impl Drop for WidthWatch {
    fn drop(&mut self) {
        self.observer.disconnect();
    }
}
