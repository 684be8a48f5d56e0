//! Magwright's page: gathers the specification, calls the engine on every
//! edit and draws the result. No physics lives here: every number shown
//! comes from `magwright_engine`.
//!
//! Design-type specific (the two modules to rewrite for a new design type):
//! * [`form`]: the `Spec`/`Report` types, the input fields and the engine calls.
//! * [`panels`]: one module per panel (library, results, pictures, windings,
//!   suggest, build sheet).
//!
//! Generic:
//! * [`app`]: layout, where the design comes from, the Files actions.
//! * [`files`]: the versioned design file (`{"schema":"magwright-design",...}`).
//! * [`persist`]: localStorage and `#design=` share links (base64url).
//! * [`browser`]: downloads, reading files, clipboard, print, the URL.
//! * [`panic`]: the panic hook and its message over the page.
//! * [`plot`]: line charts and to-scale cross-sections on canvas.
//! * [`hidpi`]: canvases drawn at the device pixel ratio.
//! * [`plot_log`]: charts with both axes logarithmic.
//! * [`field`], [`ui`]: a text field holding what was typed; panels, canvases.

pub mod app;
pub mod browser;
pub mod canvas_backend;
pub mod field;
pub mod files;
pub mod form;
pub mod hidpi;
pub mod panels;
pub mod panic;
pub mod persist;
pub mod plot;
pub mod plot_log;
pub mod tasks;
pub mod ui;

use wasm_bindgen::prelude::wasm_bindgen;

/// Entry point, called once the wasm is instantiated.
#[wasm_bindgen(start)]
pub fn start() {
    panic::install();
    leptos::mount::mount_to_body(app::App);
}
