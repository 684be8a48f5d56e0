//! The design workloads every benchmark of Magwright times, and the timing
//! loop they share.
//!
//! This one file is compiled twice: into the native benchmark
//! (`engine/benches/design.rs`, `cargo bench`) and into the wasm one
//! (`tools/bench-wasm`, run in headless Chromium by `scripts/bench`). Both
//! pass their own clock (`std::time::Instant` natively, `performance.now()`
//! in the browser), so the two sides time exactly the same code in exactly
//! the same way and their ratio says what compiling to wasm costs.
//!
//! It lives in a subdirectory of `benches/` so that cargo does not take it
//! for a benchmark of its own.
//!
//! The workloads, for each demo design (`Design::demo_forward`,
//! `demo_flyback`, `demo_push_pull`):
//! * `evaluate`: one full design evaluation (`design::evaluate`: turns, gap,
//!   wire, stack-up, losses at both line corners, thermal equilibrium);
//! * `sweep`: a 200-point frequency sweep, 20 kHz to 1 MHz
//!   (`design::sweep::frequency`), each point a full redesign;
//! * `optimise`: the optimiser over the whole core × material library
//!   (`Optimiser::over_library`, then `step(usize::MAX)`).
//!
//! Timing: every workload first runs for a tenth of its budget (warm-up,
//! see [`run_all`]). Then, per workload: one more call; calls counted for
//! a tenth of the budget size a batch; batches run until the budget is
//! spent (at least three batches). The result is the best batch's mean time
//! per call, which is robust against other processes on a shared machine
//! (the mean over all batches is kept too). A batch lasts about a tenth of
//! the budget (tens of milliseconds or more), far above the browser's
//! coarsened `performance.now()` resolution (100 µs without cross-origin
//! isolation), so that resolution costs well under 1 %.

#![allow(dead_code)]

use magwright_engine::design::{evaluate, optimise::Optimiser, sweep, Design};
use std::hint::black_box;

/// One timed workload.
#[derive(Debug, Clone)]
pub struct Sample {
    /// `evaluate`, `sweep` or `optimise`.
    pub workload: &'static str,
    /// `forward`, `flyback` or `push-pull`.
    pub demo: &'static str,
    /// Best batch mean, seconds per call.
    pub best: f64,
    /// Mean over every timed call, seconds per call.
    pub mean: f64,
    /// Timed calls (warm-up and calibration not counted).
    pub calls: u64,
    /// Extra facts about the workload (e.g. the optimiser's candidates).
    pub note: String,
}

/// Best and mean time per call of `f`; `now` returns seconds.
pub fn time<T>(now: &dyn Fn() -> f64, budget: f64, mut f: impl FnMut() -> T) -> (f64, f64, u64) {
    black_box(f());
    let t0 = now();
    let mut batch = 0u64;
    while batch == 0 || now() - t0 < budget / 10.0 {
        black_box(f());
        batch += 1;
    }
    let (mut best, mut total, mut calls, mut batches) = (f64::INFINITY, 0.0, 0u64, 0u32);
    while batches < 3 || total < budget {
        let tb = now();
        for _ in 0..batch {
            black_box(f());
        }
        let dt = now() - tb;
        best = best.min(dt / batch as f64);
        total += dt;
        calls += batch;
        batches += 1;
    }
    (best, total / calls as f64, calls)
}

/// The three demo designs, named.
pub fn demos() -> [(&'static str, Design); 3] {
    [("forward", Design::demo_forward()), ("flyback", Design::demo_flyback()), ("push-pull", Design::demo_push_pull())]
}

/// Runs every workload. `scale` multiplies each time budget (1.0: about
/// 0.4 s per evaluation, 0.8 s per sweep, 1.5 s per optimiser run, each at
/// least three batches); `progress` is told each workload before it runs.
pub fn run_all(now: &dyn Fn() -> f64, scale: f64, progress: &mut dyn FnMut(&str, &str)) -> Vec<Sample> {
    let demos = demos();
    // Warm-up: every workload runs for a tenth of its budget before any is
    // timed, so that a JIT (the browser compiles wasm with a fast baseline
    // tier first and optimises hot functions later, in the background) has
    // seen all the code. Natively this only warms the caches.
    for (_, d) in &demos {
        for (budget, w) in [(0.04, 0), (0.08, 1), (0.15, 2)] {
            let t0 = now();
            while now() - t0 < budget * scale {
                match w {
                    0 => drop(black_box(evaluate(black_box(d)))),
                    1 => drop(black_box(sweep::frequency(black_box(d), 20e3, 1e6, 200))),
                    _ => drop(black_box(Optimiser::over_library(black_box(d)).map(|mut o| o.step(usize::MAX)))),
                }
            }
        }
    }
    let mut out = Vec::new();
    for (name, d) in &demos {
        progress("evaluate", name);
        let (best, mean, calls) = time(now, 0.4 * scale, || evaluate(black_box(d)).map(|r| r.losses.total));
        let note = match evaluate(d) {
            Ok(r) => format!("design {}", if r.pass { "passes" } else { "fails a check" }),
            Err(e) => format!("error: {}", e.message()),
        };
        out.push(Sample { workload: "evaluate", demo: name, best, mean, calls, note });
    }
    for (name, d) in &demos {
        progress("sweep", name);
        let (best, mean, calls) =
            time(now, 0.8 * scale, || sweep::frequency(black_box(d), 20e3, 1e6, 200).map(|s| s.minimum));
        let note = match sweep::frequency(d, 20e3, 1e6, 200) {
            Ok(s) => format!("{} of 200 points feasible", s.points.iter().filter(|p| p.feasible).count()),
            Err(e) => format!("error: {}", e.message()),
        };
        out.push(Sample { workload: "sweep", demo: name, best, mean, calls, note });
    }
    for (name, d) in &demos {
        progress("optimise", name);
        let (best, mean, calls) = time(now, 1.5 * scale, || {
            Optimiser::over_library(black_box(d)).map(|mut o| {
                o.step(usize::MAX);
                o.ranking().passed
            })
        });
        let note = match Optimiser::over_library(d) {
            Ok(mut o) => {
                o.step(usize::MAX);
                format!("{} candidates, {} pass", o.total(), o.ranking().passed)
            }
            Err(e) => format!("error: {}", e.message()),
        };
        out.push(Sample { workload: "optimise", demo: name, best, mean, calls, note });
    }
    out
}

/// The samples as JSON: `{"platform": ..., "samples": [{"workload", "demo",
/// "best_s", "mean_s", "calls", "note"}, ...]}`.
pub fn to_json(platform: &str, samples: &[Sample]) -> String {
    let mut s = format!("{{\"platform\":{},\"samples\":[", quote(platform));
    for (i, x) in samples.iter().enumerate() {
        if i > 0 {
            s.push(',');
        }
        s.push_str(&format!(
            "{{\"workload\":{},\"demo\":{},\"best_s\":{:e},\"mean_s\":{:e},\"calls\":{},\"note\":{}}}",
            quote(x.workload),
            quote(x.demo),
            finite(x.best),
            finite(x.mean),
            x.calls,
            quote(&x.note)
        ));
    }
    s.push_str("]}");
    s
}

fn finite(v: f64) -> f64 {
    if v.is_finite() {
        v
    } else {
        -1.0
    }
}

/// A JSON string literal (RFC 8259 §7 escapes).
fn quote(t: &str) -> String {
    let mut s = String::with_capacity(t.len() + 2);
    s.push('"');
    for c in t.chars() {
        match c {
            '"' => s.push_str("\\\""),
            '\\' => s.push_str("\\\\"),
            c if (c as u32) < 0x20 => s.push_str(&format!("\\u{:04x}", c as u32)),
            c => s.push(c),
        }
    }
    s.push('"');
    s
}

/// Seconds with a readable unit.
pub fn human(t: f64) -> String {
    if t < 1e-3 {
        format!("{:.1} µs", t * 1e6)
    } else if t < 1.0 {
        format!("{:.2} ms", t * 1e3)
    } else {
        format!("{:.2} s", t)
    }
}
