//! Benchmark (not a test): the 200-point frequency study, 20 kHz to 1 MHz,
//! for each demo design: the redesign sweep, the as-wound curve and the
//! best-material envelope (one redesign sweep per library material). A
//! quick look while working on the sweep and a target for `perf record`
//! (the full report is `scripts/bench`).
//!
//! Run with `cargo bench -p magwright-engine --bench sweep [-- DEMO] [--seconds S] [--only KIND]`
//! (KIND: redesign, as-wound or envelope; all three when not given).

use magwright_engine::design::{sweep, Design};
use std::hint::black_box;
use std::time::Instant;

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let seconds = args
        .iter()
        .position(|a| a == "--seconds")
        .and_then(|i| args.get(i + 1))
        .and_then(|v| v.parse::<f64>().ok())
        .filter(|v| v.is_finite() && *v > 0.0)
        .unwrap_or(1.0);
    let kind = args.iter().position(|a| a == "--only").and_then(|i| args.get(i + 1)).cloned();
    let only: Vec<&String> = args
        .iter()
        .filter(|a| !a.starts_with("--") && a.parse::<f64>().is_err() && Some(*a) != kind.as_ref())
        .collect();
    for (name, d) in [
        ("forward", Design::demo_forward()),
        ("flyback", Design::demo_flyback()),
        ("push-pull", Design::demo_push_pull()),
    ] {
        if !only.is_empty() && !only.iter().any(|o| o.as_str() == name) {
            continue;
        }
        type Run = fn(&Design) -> Option<f64>;
        let runs: [(&str, Run); 3] = [
            ("redesign", |d| sweep::frequency(d, 20e3, 1e6, 200).ok().map(|s| s.points.len() as f64)),
            ("as-wound", |d| sweep::as_wound(d, 20e3, 1e6, 200).ok().map(|s| s.points.len() as f64)),
            ("envelope", |d| sweep::envelope(d, 20e3, 1e6, 200, false).ok().map(|s| s.points.len() as f64)),
        ];
        for (what, run) in runs {
            if kind.as_deref().is_some_and(|k| k != what) {
                continue;
            }
            let t0 = Instant::now();
            let mut calls = 0u32;
            let mut best = f64::INFINITY;
            while calls < 3 || t0.elapsed().as_secs_f64() < seconds {
                let t = Instant::now();
                black_box(run(black_box(&d)));
                best = best.min(t.elapsed().as_secs_f64());
                calls += 1;
            }
            println!(
                "sweep {name:<10} {what:<9} best {:>9.3} ms  mean {:>9.3} ms  ({calls} calls)",
                best * 1e3,
                t0.elapsed().as_secs_f64() * 1e3 / calls as f64
            );
        }
    }
}
