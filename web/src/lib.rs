//! Magwright's page: gathers the specification, calls the engine on every
//! edit and draws the result. No physics lives here: every number shown
//! comes from `magwright_engine`.
//!
//! * [`app`]: the top-level component and its state (signals and memos).
//! * [`field`]: a labelled text field holding exactly what the user typed.
//! * [`plot`]: drawing on canvas with plotters.

pub mod app;
pub mod field;
pub mod plot;

use wasm_bindgen::prelude::wasm_bindgen;

/// Entry point, called once the wasm is instantiated.
#[wasm_bindgen(start)]
pub fn start() {
    leptos::mount::mount_to_body(app::App);
}
