//! Benchmark (not a test): windings. Prints the time per call.
//! Run with `cargo bench -p magwright-engine --bench windings`.
//!
//! Workload: copper loss of a three-winding P-S-P forward transformer on an
//! ETD 34 (split primary, a two-in-hand secondary, an auxiliary winding),
//! trapezoidal currents with ideal steps:
//! * 50 harmonics exactly (tolerance 0, max 50), prepared model;
//! * default options (0.1 % convergence with the analytic tail);
//! * the one-call `copper_losses` (fit + prepare + evaluate);
//! * a 200-point frequency sweep with the prepared model;
//! * the copper-loss model of each demo design alone (its stack-up, its
//!   worst-corner currents, its edge time and also a 50 ns edge):
//!   `LossModel::new` and `LossModel::evaluate`, the calls the design
//!   solver makes about six times per design evaluation.

use magwright_engine::core::library;
use magwright_engine::design::{evaluate, Design};
use magwright_engine::waveform::Pwl;
use magwright_engine::winding::loss::{copper_losses, LossModel, LossOptions, WindingCurrent};
use magwright_engine::winding::stackup::{default_stackup, DefaultOptions, Pattern, WindingSpec};
use magwright_engine::winding::{Conductor, Grade};
use std::hint::black_box;
use std::time::Instant;

/// Prints the time per call of `f`: the best of ten batches of `iters / 10`
/// calls (the machine is shared; the best batch is the least disturbed).
fn time<F: FnMut()>(label: &str, iters: u32, mut f: F) {
    let batch = iters.div_ceil(10).max(1);
    for _ in 0..batch {
        f();
    }
    let mut best = f64::INFINITY;
    for _ in 0..10 {
        let t0 = Instant::now();
        for _ in 0..batch {
            f();
        }
        best = best.min(t0.elapsed().as_secs_f64() / batch as f64);
    }
    println!("{label}: {:.2} µs per call", best * 1e6);
}

fn currents(period: f64) -> Vec<WindingCurrent> {
    let d = 0.4;
    let ip = Pwl::new(
        period,
        vec![
            (0.0, 0.0),
            (0.0, 1.0),
            (d * period, 1.5),
            (d * period, 0.0),
            (period, 0.0),
        ],
    )
    .unwrap();
    let is = ip.scaled(-3.6);
    let ia = ip.scaled(-0.2);
    vec![
        WindingCurrent::new("primary", ip),
        WindingCurrent::new("secondary", is),
        WindingCurrent::new("aux", ia),
    ]
}

fn main() {
    let core = library::find("ETD 34").unwrap();
    let ws = [
        WindingSpec {
            name: "primary".into(),
            turns: 40,
            conductor: Conductor::awg(26, Grade::G2).unwrap(),
            parallel: 1,
        },
        WindingSpec {
            name: "secondary".into(),
            turns: 10,
            conductor: Conductor::awg(20, Grade::G2).unwrap(),
            parallel: 2,
        },
        WindingSpec {
            name: "aux".into(),
            turns: 6,
            conductor: Conductor::awg(30, Grade::G2).unwrap(),
            parallel: 1,
        },
    ];
    let st = default_stackup(&core, &ws, &Pattern::SplitPrimary, &DefaultOptions::default()).unwrap();
    let model = LossModel::new(&core, &st, 100.0).unwrap();
    let cur = currents(1e-5);
    let fifty = LossOptions {
        tolerance: 1e-9,
        max_harmonics: 50,
        ..LossOptions::default()
    };
    let r = model.evaluate(&cur, &fifty).unwrap();
    println!(
        "P-S-P, 50 harmonics: {:.4} W, {} harmonics, tail {:.1} %",
        r.total,
        r.harmonics,
        100.0 * r.tail_share
    );
    time("evaluate, 50 harmonics", 20_000, || {
        black_box(model.evaluate(black_box(&cur), &fifty).unwrap());
    });
    let r = model.evaluate(&cur, &LossOptions::default()).unwrap();
    println!(
        "default options: {:.4} W, {} harmonics, tail {:.1} %",
        r.total,
        r.harmonics,
        100.0 * r.tail_share
    );
    time("evaluate, default (0.1 %)", 20_000, || {
        black_box(model.evaluate(black_box(&cur), &LossOptions::default()).unwrap());
    });
    time("copper_losses (fit + prepare + evaluate)", 10_000, || {
        black_box(copper_losses(&core, &st, black_box(&cur), 100.0).unwrap());
    });
    let sweep: Vec<Vec<WindingCurrent>> = (0..200)
        .map(|i| currents(1.0 / (20e3 * 50f64.powf(i as f64 / 199.0))))
        .collect();
    time("200-point sweep 20 kHz..1 MHz, default options", 100, || {
        for c in &sweep {
            black_box(model.evaluate(black_box(c), &LossOptions::default()).unwrap());
        }
    });
    demos();
}


fn demos() {
    let demos = [
        ("forward", Design::demo_forward()),
        ("flyback", Design::demo_flyback()),
        ("push-pull", Design::demo_push_pull()),
    ];
    for (name, d) in &demos {
        let r = evaluate(d).unwrap();
        let temp = r.operating.copper.temperature;
        let op = &r.waveforms.at_vin_min;
        let cur: Vec<WindingCurrent> = op
            .windings
            .iter()
            .map(|w| WindingCurrent::new(&w.name, w.current.scaled(magwright_engine::design::solve::core_sense(r.topology, &w.name))))
            .collect();
        time(&format!("demo {name}: LossModel::new"), 5_000, || {
            black_box(LossModel::new(&r.core, &r.stackup, black_box(temp)).unwrap());
        });
        let model = LossModel::new(&r.core, &r.stackup, temp).unwrap();
        for edge in [d.choices.edge_time, 50e-9] {
            let opts = LossOptions {
                edge_time: edge,
                ..LossOptions::default()
            };
            let l = model.evaluate(&cur, &opts).unwrap();
            let label = format!(
                "demo {name}: evaluate, edge {:.0} ns ({} layers, {} harmonics, {:.4} W)",
                edge * 1e9,
                l.windings.iter().map(|w| w.layers.len()).sum::<usize>(),
                l.harmonics,
                l.total
            );
            time(&label, 5_000, || {
                black_box(model.evaluate(black_box(&cur), &opts).unwrap());
            });
        }
    }
}
