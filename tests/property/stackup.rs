//! Random stack-up documents at `winding::stackup::from_json`, and every
//! accepted one at `winding::fit::fit` (on a random library core) and
//! `winding::loss::copper_losses` (with random trapezoidal currents).
//!
//! Numbers are written as JSON text tokens, so the documents also carry
//! what serde types cannot: 1e999 (overflows to infinity), -0, subnormals,
//! strings and nulls where numbers belong.

use crate::finite::non_finite;
use crate::{check_error, config};
use magwright_engine::core::library as cores;
use magwright_engine::waveform::Pwl;
use magwright_engine::winding::fit::fit;
use magwright_engine::winding::loss::{copper_losses, WindingCurrent};
use magwright_engine::winding::stackup::from_json;
use proptest::prelude::*;

/// A JSON number token: mostly `lo..hi`, sometimes hostile.
fn num(lo: f64, hi: f64) -> BoxedStrategy<String> {
    prop_oneof![
        400 => (lo..hi).prop_map(|x| format!("{x:e}")),
        1 => Just("0".to_string()),
        1 => Just("-1e-3".to_string()),
        1 => Just("1e999".to_string()),
        1 => Just("-1e999".to_string()),
        1 => Just("5e-324".to_string()),
        1 => Just("\"1\"".to_string()),
        1 => Just("null".to_string()),
        1 => Just("1e300".to_string()),
    ]
    .boxed()
}

fn count(lo: u32, hi: u32) -> BoxedStrategy<String> {
    prop_oneof![
        200 => (lo..hi).prop_map(|x| x.to_string()),
        1 => Just("0".to_string()),
        1 => Just("-3".to_string()),
        1 => Just("2.5".to_string()),
        1 => Just("4294967296".to_string()),
        1 => Just("1e9".to_string()),
    ]
    .boxed()
}

const NAMES: [&str; 4] = ["primary", "secondary 1", "secondary 2", "aux"];

fn conductor() -> BoxedStrategy<String> {
    prop_oneof![
        (num(0.05e-3, 1.5e-3), 1.0..1.3f64).prop_map(|(d, k)| {
            let od = d.parse::<f64>().map_or("1e-3".to_string(), |x| format!("{:e}", x * k));
            format!(r#"{{"kind":"round","bare_diameter":{d},"overall_diameter":{od}}}"#)
        }),
        (num(0.1e-3, 1e-3),).prop_map(|(d,)| format!(
            r#"{{"kind":"triple_insulated","bare_diameter":{d},"overall_diameter":{d}}}"#
        )),
        (count(1, 400), num(0.04e-3, 0.2e-3), num(0.3, 0.9), num(0.0, 0.1e-3)).prop_map(|(n, d, p, s)| format!(
            r#"{{"kind":"litz","strands":{n},"strand_diameter":{d},"strand_overall_diameter":{d},"packing":{p},"serving":{s}}}"#
        )),
        (num(0.02e-3, 0.5e-3), num(3e-3, 30e-3)).prop_map(|(t, w)| format!(r#"{{"kind":"foil","thickness":{t},"width":{w}}}"#)),
    ]
    .boxed()
}

fn section(w: BoxedStrategy<usize>) -> BoxedStrategy<String> {
    (w, count(1, 80), count(1, 4), conductor(), prop::option::of(count(1, 6)), num(0.0, 4e-3), num(0.0, 4e-3))
        .prop_map(|(w, turns, par, cond, layers, ml, mr)| {
            let name = NAMES.get(w).copied().unwrap_or("ghost");
            let layers = layers.unwrap_or_else(|| "null".into());
            format!(
                r#"{{"item":"section","winding":"{name}","turns":{turns},"parallel":{par},"conductor":{cond},"layers":{layers},"turns_per_layer":null,"direction":"cw","start_side":"left","finish_side":"right","margin_left":{ml},"margin_right":{mr},"interlayer_tape":null}}"#
            )
        })
        .boxed()
}

fn item() -> BoxedStrategy<String> {
    let section = section((0..5usize).boxed());
    let tape = (num(10e-6, 100e-6), count(0, 5)).prop_map(|(t, n)| {
        format!(r#"{{"item":"tape","material":"polyester film","thickness":{t},"wraps":{n}}}"#)
    });
    let screen = num(10e-6, 100e-6)
        .prop_map(|t| format!(r#"{{"item":"screen","material":"copper","thickness":{t},"connection":"primary return"}}"#));
    prop_oneof![6 => section, 2 => tape, 1 => screen].boxed()
}

fn stackup_text() -> impl Strategy<Value = (String, usize)> {
    let own: Vec<BoxedStrategy<String>> = (0..4).map(|i| section(Just(i).boxed())).collect();
    (
        1..=4usize,
        own,
        prop::collection::vec(item(), 0..4),
        0..8usize,
    )
        .prop_map(|(nw, own, extra, at)| {
            // One section per declared winding (usually), then extra items.
            let mut items: Vec<String> = own.into_iter().take(nw).collect();
            let at = at.min(items.len());
            for (k, x) in extra.into_iter().enumerate() {
                items.insert((at + k).min(items.len()), x);
            }
            let windings: Vec<String> = NAMES[..nw]
                .iter()
                .map(|n| format!(r#"{{"name":"{n}"}}"#))
                .collect();
            (
                format!(
                    r#"{{"schema":"magwright.stackup/2","windings":[{}],"items":[{}]}}"#,
                    windings.join(","),
                    items.join(",")
                ),
                nw,
            )
        })
}

#[test]
fn stackup_import_fit_and_copper_loss_never_panic() {
    let mut runner = proptest::test_runner::TestRunner::new(config(512));
    let ncores = cores::all().len();
    let strat = (
        stackup_text(),
        0..ncores,
        prop::collection::vec((-20.0..20.0f64, 0.05..0.95f64), 4),
        1e3..1e6f64,
        -40.0..200.0f64,
    );
    let accepted = std::cell::Cell::new(0u32);
    let t0 = std::time::Instant::now();
    runner
        .run(&strat, |((text, _nw), ci, amps, f, temp)| {
            let st = match from_json(&text) {
                Ok(st) => st,
                Err(e) => {
                    if std::env::var_os("MAGWRIGHT_PROPERTY_VERBOSE").is_some() {
                        eprintln!("rejected: {e}");
                    }
                    return check_error(&e).map_err(TestCaseError::fail);
                }
            };
            let core = &cores::all()[ci];
            let report = match fit(core, &st) {
                Ok(r) => r,
                Err(e) => return check_error(&e).map_err(TestCaseError::fail),
            };
            let (bad, _) = non_finite(&report);
            prop_assert!(bad.is_empty(), "fit: {:?}", bad);
            let period = 1.0 / f;
            let currents: Vec<WindingCurrent> = st
                .windings
                .iter()
                .zip(&amps)
                .map(|(w, &(a, d))| {
                    // A trapezoid pulse: a, then a/2 at d·T, then zero.
                    let p = Pwl::new(
                        period,
                        vec![
                            (0.0, a),
                            (d * period, 0.5 * a),
                            (d * period, 0.0),
                            (period, 0.0),
                        ],
                    )
                    .unwrap();
                    WindingCurrent::new(&w.name, p)
                })
                .collect();
            match copper_losses(core, &st, &currents, temp) {
                Ok(r) => {
                    accepted.set(accepted.get() + 1);
                    let (bad, _) = non_finite(&r);
                    prop_assert!(bad.is_empty(), "copper loss: {:?}", bad);
                    prop_assert!(r.total >= 0.0);
                    for w in &r.windings {
                        prop_assert!(w.fr >= 1.0 - 1e-9, "{}: Fr {}", w.name, w.fr);
                        prop_assert!(w.dc_loss >= 0.0 && w.total_loss >= 0.0);
                    }
                }
                Err(e) => check_error(&e).map_err(TestCaseError::fail)?,
            }
            Ok(())
        })
        .unwrap();
    eprintln!(
        "stack-ups: 512 random documents, {} through copper loss, {:.2} s",
        accepted.get(),
        t0.elapsed().as_secs_f64()
    );
    assert!(accepted.get() >= 10, "{}", accepted.get());
}
