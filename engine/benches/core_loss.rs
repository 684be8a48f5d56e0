//! Benchmark (not a test): core_loss. Prints the time per call.
//! Run with `cargo bench -p magwright-engine --bench core_loss`.
//!
//! Workloads: the iGSE coefficient ki (numerical integral, once per
//! material), one iGSE evaluation of a piecewise-linear B(t), the full
//! `core_loss_with` entry point, a 200-point frequency sweep through the
//! shape factor, and a loss fit of 75 points at five temperatures.

use magwright_engine::loss::{self, IgseCoefficients};
use magwright_engine::material::fit::{fit, LossPoint};
use magwright_engine::material::library;
use magwright_engine::waveform::Pwl;
use std::hint::black_box;
use std::time::Instant;

/// Runs `f` repeatedly for about 0.3 s and prints the mean time per call.
fn time<R>(name: &str, mut f: impl FnMut() -> R) {
    // Warm up and calibrate.
    let mut n = 1u64;
    loop {
        let t = Instant::now();
        for _ in 0..n {
            black_box(f());
        }
        if t.elapsed().as_secs_f64() > 0.05 || n > 1 << 30 {
            break;
        }
        n *= 2;
    }
    let reps = n * 6;
    let t = Instant::now();
    for _ in 0..reps {
        black_box(f());
    }
    let per = t.elapsed().as_secs_f64() / reps as f64;
    let (v, unit) = if per < 1e-6 {
        (per * 1e9, "ns")
    } else if per < 1e-3 {
        (per * 1e6, "µs")
    } else {
        (per * 1e3, "ms")
    };
    println!("{name:<48} {v:>9.2} {unit} per call ({reps} calls)");
}

fn main() {
    let m = library::find("MnZn-200k").unwrap();
    let c = IgseCoefficients::from_material(&m).unwrap();
    let f = 100e3;
    let t = 1.0 / f;
    // Forward-converter-like trapezoid (rise, flat, reset, flat) and a
    // 64-segment sinusoid.
    let trap = Pwl::from_segments(0.0, &[(0.4 * t, 0.2), (0.05 * t, 0.2), (0.3 * t, 0.0), (0.25 * t, 0.0)]).unwrap();
    let n = 64;
    let sine = Pwl::new(
        t,
        (0..=n)
            .map(|i| (i as f64 / n as f64 * t, 0.1 * (2.0 * std::f64::consts::PI * i as f64 / n as f64).sin()))
            .collect(),
    )
    .unwrap();

    time("ki: IgseCoefficients::from_material", || IgseCoefficients::from_material(black_box(&m)));
    time("iGSE pv, 4-segment trapezoid", || c.pv(black_box(&trap)));
    time("iGSE pv, 64-segment sinusoid", || c.pv(black_box(&sine)));
    time("core_loss_with (warnings, temperature)", || loss::core_loss_with(&c, &m, black_box(&trap), 90.0, 5e-6));
    time("core_loss (validates, builds ki)", || loss::core_loss(&m, black_box(&trap), 90.0, 5e-6));
    let shape = c.shape_factor(&trap).unwrap();
    time("200-point sweep via shape factor", || {
        let mut s = 0.0;
        for i in 0..200 {
            let fi = 20e3 * (1.0 + i as f64 * 0.05);
            s += c.pv_from_shape(black_box(shape), fi, 0.2 * 100e3 / fi);
        }
        s
    });

    let mut pts = Vec::new();
    for &temp in &[25.0, 50.0, 80.0, 100.0, 120.0] {
        for &fi in &[50e3, 100e3, 200e3] {
            for &b in &[0.05, 0.08, 0.1, 0.15, 0.2] {
                let pv = 10.0 * f64::powf(fi, 1.3) * f64::powf(b, 2.6) * m.temp_factor.at(temp);
                pts.push(LossPoint { f: fi, b, temp_c: temp, pv });
            }
        }
    }
    time("fit: 75 points, 5 temperatures", || fit(black_box(&pts)));
}
