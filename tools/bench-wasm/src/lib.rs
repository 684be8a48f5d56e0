//! Benchmark only (not a test, not shipped): the engine's design workloads
//! compiled to wasm and timed inside the browser.
//!
//! `scripts/bench` builds this crate with the `wasm` profile (the one the
//! page ships with), bundles it into a throwaway page from
//! `tests/browser/bench/template.html` with `magwright-bundle`, and opens
//! that page in headless Chromium. The start function runs every workload
//! of `engine/benches/shared/workloads.rs` (the very file the native
//! benchmark compiles) with `performance.now()` as the clock and hands the
//! results, as JSON, to `window.magwrightBenchDone`, which the template
//! defines. The template also supplies `window.magwrightBenchScale()` (the
//! time-budget multiplier) and `window.magwrightBenchProgress(workload, demo)`.

#[path = "../../../engine/benches/shared/workloads.rs"]
mod workloads;

use wasm_bindgen::prelude::wasm_bindgen;

#[wasm_bindgen]
extern "C" {
    /// `performance.now()`: milliseconds since the page's time origin.
    #[wasm_bindgen(js_namespace = performance, js_name = now)]
    fn performance_now() -> f64;
    #[wasm_bindgen(js_namespace = window, js_name = magwrightBenchScale)]
    fn bench_scale() -> f64;
    #[wasm_bindgen(js_namespace = window, js_name = magwrightBenchProgress)]
    fn bench_progress(workload: &str, demo: &str);
    #[wasm_bindgen(js_namespace = window, js_name = magwrightBenchDone)]
    fn bench_done(json: &str);
}

/// Runs every workload once the wasm is instantiated, then reports.
#[wasm_bindgen(start)]
pub fn start() {
    let scale = bench_scale();
    let scale = if scale.is_finite() && scale > 0.0 { scale } else { 1.0 };
    let now = || performance_now() / 1e3;
    let samples = workloads::run_all(&now, scale, &mut |w, d| bench_progress(w, d));
    bench_done(&workloads::to_json("wasm32 (Chromium)", &samples));
}
