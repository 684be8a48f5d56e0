//! Benchmark (not a test): whole designs. Prints the time per run of one
//! full evaluation (all windings, both line corners, thermal loop), a
//! 200-point frequency sweep, and the optimiser over the whole library,
//! for each of the three demo designs.
//!
//! Run with `cargo bench -p magwright-engine --bench design`; add
//! `-- --json` for one line of JSON (what `scripts/bench` reads), and
//! `--scale X` to multiply every time budget (0.25 for a quick look).
//!
//! The workloads and the timing loop are in `shared/workloads.rs`, which
//! `tools/bench-wasm` compiles to wasm too, so `scripts/bench` can put the
//! native and browser times side by side.

#[path = "shared/workloads.rs"]
mod workloads;

use std::time::Instant;

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let json = args.iter().any(|a| a == "--json");
    let scale = args
        .iter()
        .position(|a| a == "--scale")
        .and_then(|i| args.get(i + 1))
        .and_then(|v| v.parse::<f64>().ok())
        .filter(|v| v.is_finite() && *v > 0.0)
        .unwrap_or(1.0);
    let origin = Instant::now();
    let now = move || origin.elapsed().as_secs_f64();
    let mut progress = |w: &str, d: &str| {
        if json {
            eprintln!("native: {w} {d}");
        }
    };
    let samples = workloads::run_all(&now, scale, &mut progress);
    if json {
        println!("{}", workloads::to_json(&format!("native {}", std::env::consts::ARCH), &samples));
        return;
    }
    println!("{:<24} {:>12} {:>12}  calls; note", "workload", "best", "mean");
    for s in &samples {
        println!(
            "{:<24} {:>12} {:>12}  {}; {}",
            format!("{} {}", s.workload, s.demo),
            workloads::human(s.best),
            workloads::human(s.mean),
            s.calls,
            s.note
        );
    }
}
