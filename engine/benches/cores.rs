//! Benchmark (not a test): cores. Prints the time per call.
//! Run with `cargo bench -p magwright-engine --bench cores`.
//!
//! Workloads:
//! * per library core: `Shape::constants` (IEC 60205 C1, C2, Amin) and
//!   `Core::from_shape` (everything, including the `Core`'s strings);
//! * the whole library: `from_shape` over every shape, and `library::find`.

use magwright_engine::core::{library, Core};
use std::hint::black_box;
use std::time::Instant;

fn time_per_call<F: FnMut()>(mut f: F) -> f64 {
    // Warm up, then run for at least ~20 ms.
    for _ in 0..100 {
        f();
    }
    let mut n = 1_000u64;
    loop {
        let t = Instant::now();
        for _ in 0..n {
            f();
        }
        let dt = t.elapsed().as_secs_f64();
        if dt > 0.02 {
            return dt / n as f64;
        }
        n *= 4;
    }
}

fn main() {
    let lib = library::all();
    println!(
        "{:28} {:>9} {:>9} {:>8} {:>8} {:>10} {:>12}",
        "core", "Ae mm²", "le mm", "Amin", "Ve mm³", "constants", "from_shape"
    );
    let mut sum_k = 0.0;
    let mut sum_c = 0.0;
    for c in lib {
        let Some(shape) = c.shape else { continue };
        let tk = time_per_call(|| {
            black_box(black_box(&shape).constants().ok());
        });
        let tc = time_per_call(|| {
            black_box(Core::from_shape(black_box(&c.designation), black_box(shape)).ok());
        });
        sum_k += tk;
        sum_c += tc;
        println!(
            "{:28} {:9.1} {:9.2} {:8.1} {:8.0} {:8.0} ns {:10.0} ns",
            c.designation,
            c.ae * 1e6,
            c.le * 1e3,
            c.amin * 1e6,
            c.ve * 1e9,
            tk * 1e9,
            tc * 1e9
        );
    }
    let shapes: Vec<_> = lib
        .iter()
        .filter_map(|c| c.shape.map(|s| (c.designation.as_str(), s)))
        .collect();
    let t_all = time_per_call(|| {
        for (d, s) in &shapes {
            black_box(Core::from_shape(black_box(d), black_box(*s)).ok());
        }
    });
    let t_find = time_per_call(|| {
        black_box(library::find(black_box("PQ 26/25")).ok());
    });
    println!("---");
    println!(
        "{} cores: mean constants {:.0} ns, mean from_shape {:.0} ns",
        shapes.len(),
        sum_k / shapes.len() as f64 * 1e9,
        sum_c / shapes.len() as f64 * 1e9
    );
    println!("whole library through from_shape: {:.1} µs", t_all * 1e6);
    println!("library::find(\"PQ 26/25\"): {:.0} ns", t_find * 1e9);
}
