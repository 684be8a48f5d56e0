//! Benchmark (not a test): whole designs. Prints the time per run of one
//! full evaluation (all windings, both line corners, thermal loop), a
//! 200-point frequency sweep, and the optimiser over the whole library.
//! Run with `cargo bench -p magwright-engine --bench design`.

use magwright_engine::design::{evaluate, optimise::Optimiser, sweep, Design};
use std::hint::black_box;
use std::time::{Duration, Instant};

/// Runs `f` repeatedly for about `budget` and returns the mean time per call.
fn time<T>(budget: Duration, mut f: impl FnMut() -> T) -> Duration {
    black_box(f());
    let start = Instant::now();
    let mut n = 0u32;
    while start.elapsed() < budget || n < 3 {
        black_box(f());
        n += 1;
    }
    start.elapsed() / n
}

fn main() {
    let demos = [("forward", Design::demo_forward()), ("flyback", Design::demo_flyback()), ("push-pull", Design::demo_push_pull())];
    println!("{:<28} {:>14}", "workload", "time per run");
    for (name, d) in &demos {
        let t = time(Duration::from_millis(400), || evaluate(black_box(d)).map(|r| r.losses.total));
        println!("{:<28} {:>11.1} µs", format!("evaluate {name}"), t.as_secs_f64() * 1e6);
    }
    for (name, d) in &demos {
        let t = time(Duration::from_millis(800), || sweep::frequency(black_box(d), 20e3, 1e6, 200).map(|s| s.minimum));
        println!("{:<28} {:>11.2} ms", format!("200-point sweep {name}"), t.as_secs_f64() * 1e3);
    }
    for (name, d) in &demos {
        let t = time(Duration::from_millis(1500), || {
            let mut o = Optimiser::over_library(black_box(d)).expect("demo spec is valid");
            o.step(usize::MAX);
            o.ranking().passed
        });
        let o = Optimiser::over_library(d).expect("demo spec is valid");
        println!("{:<28} {:>11.1} ms  ({} candidates)", format!("optimiser {name}"), t.as_secs_f64() * 1e3, o.total());
    }
}
