//! The sweeps' own consistency: the as-wound curve keeps the design's turns
//! and conductors at every frequency (and at the design's own frequency is
//! the design); the envelope is never above any material's redesign curve
//! it was taken over, names the material it takes, and marks each change.

use magwright_engine::design::file::{Design, MaterialChoice};
use magwright_engine::design::{evaluate, solve, sweep};
use magwright_engine::material::library as materials;
use proptest::prelude::*;

fn demos() -> [Design; 3] {
    [Design::demo_forward(), Design::demo_flyback(), Design::demo_push_pull()]
}

#[test]
fn as_wound_at_the_design_frequency_is_the_design() {
    for d in demos() {
        let f0 = d.spec.frequency;
        // log_space(f0/2, 2·f0, 3) puts f0 in the middle (to rounding).
        let s = sweep::as_wound(&d, f0 / 2.0, f0 * 2.0, 3).unwrap();
        let r = evaluate(&d).unwrap();
        let v = s.points[1].values.unwrap_or_else(|| panic!("{}: {}", d.name, s.points[1].reason));
        assert_eq!(v.primary_turns, r.turns.primary, "{}", d.name);
        for (a, b, what) in [(v.total, r.losses.total, "total"), (v.core, r.losses.core, "core"), (v.copper, r.losses.copper, "copper")] {
            assert!((a - b).abs() <= 1e-9 * b.abs(), "{} {what}: {a} against {b}", d.name);
        }
        assert_eq!(s.curve, sweep::Curve::AsWound);
    }
}

/// The as-wound build at frequency `f`: every winding's turns and
/// conductor (name and parallel count), and a flyback's or an inductor's
/// inductance, as in the design at its own frequency. `Ok(false)` where nothing was compared (the design, or its
/// as-wound build at `f`, cannot be built).
fn keeps_the_build(d: &Design, scale: f64) -> Result<bool, String> {
    let Ok(r0) = evaluate(d) else { return Ok(false) };
    let Ok(mut w) = sweep::as_wound_design(d, &r0) else { return Ok(false) };
    w.spec.frequency = d.spec.frequency * scale;
    if d.spec.topology == magwright_engine::topology::Topology::Flyback {
        w.spec.flyback.ripple_ratio /= scale; // Lp ∝ 1/(r·f) held
    }
    let Ok(r) = evaluate(&w) else { return Ok(false) };
    if r.turns != r0.turns {
        return Err(format!("{}: turns {:?} against {:?}", d.name, r.turns, r0.turns));
    }
    let key = |r: &magwright_engine::design::solve::Report| -> Vec<(String, u32, String, u32)> {
        r.wires.iter().map(|w| (w.winding.clone(), w.turns, w.conductor.clone(), w.parallel)).collect()
    };
    if key(&r) != key(&r0) {
        return Err(format!("{}: wires {:?} against {:?}", d.name, key(&r), key(&r0)));
    }
    use magwright_engine::topology::Topology;
    if let Some(lp0) = matches!(d.spec.topology, Topology::Flyback | Topology::Inductor).then_some(r0.inductance) {
        if (r.inductance - lp0).abs() > 1e-9 * lp0 {
            return Err(format!("{}: Lp {} against {lp0}", d.name, r.inductance));
        }
    }
    Ok(true)
}

#[test]
fn as_wound_keeps_the_demos_build() {
    // The property below, where it is known to compare: each demo at 0.6
    // and 1.6 times its frequency is built, and built the same.
    for d in demos().into_iter().chain([Design::demo_inductor()]) {
        for scale in [0.6, 1.6] {
            assert_eq!(keeps_the_build(&d, scale), Ok(true), "{} ×{scale}", d.name);
        }
    }
}

proptest! {
    #![proptest_config(crate::config(48))]
    /// As wound, the turns, the conductors (and a flyback's Lp) stay those
    /// of the design, at any frequency from a third to three times its own.
    #[test]
    fn as_wound_keeps_turns_and_conductors(k in 0..3usize, scale in (1.0f64 / 3.0).ln()..3f64.ln(), load in 0.5..1.5f64) {
        let mut d = demos()[k].clone();
        for o in &mut d.spec.outputs {
            o.current *= load;
        }
        prop_assert!(keeps_the_build(&d, scale.exp()).is_ok(), "{:?}", keeps_the_build(&d, scale.exp()));
    }
}

#[test]
fn as_wound_keeps_the_turns_at_every_point() {
    // Every point of the curve carries the design's primary turns; the
    // redesign curve changes them (the two questions differ).
    for d in demos() {
        let np = evaluate(&d).unwrap().turns.primary;
        let s = sweep::as_wound(&d, 30e3, 600e3, 15).unwrap();
        let built: Vec<u32> = s.points.iter().filter_map(|p| p.values.map(|v| v.primary_turns)).collect();
        assert!(built.len() >= 5 && built.iter().all(|&n| n == np), "{}: {built:?}", d.name);
        let r = sweep::frequency(&d, 30e3, 600e3, 15).unwrap();
        let turns: Vec<u32> = r.points.iter().filter_map(|p| p.values.map(|v| v.primary_turns)).collect();
        assert!(turns.iter().any(|&n| n != np), "{}: the redesign keeps {np} turns everywhere", d.name);
    }
}

#[test]
fn envelope_is_the_least_of_the_materials() {
    for d in demos() {
        let e = sweep::envelope(&d, 50e3, 800e3, 12, false).unwrap();
        let names: Vec<String> = materials::materials().into_iter().map(|m| m.name).collect();
        assert!(e.points.iter().any(|p| p.feasible), "{}", d.name);
        let mut compared = 0;
        for m in &names {
            let mut dm = d.clone();
            dm.material = MaterialChoice::Library { name: m.clone() };
            let Ok(s) = sweep::frequency(&dm, 50e3, 800e3, 12) else { continue };
            for (p, q) in e.points.iter().zip(&s.points) {
                assert_eq!(p.x, q.x);
                if let (true, Some(v)) = (q.feasible, q.values) {
                    let w = p.values.expect("a feasible material makes the envelope feasible");
                    assert!(w.total <= v.total, "{} Hz: envelope {} above {m}'s {}", p.x, w.total, v.total);
                    compared += 1;
                }
            }
        }
        assert!(compared > 12, "{}: {compared}", d.name);
        for p in e.points.iter().filter(|p| p.feasible) {
            assert!(names.contains(p.material.as_ref().unwrap()), "{:?}", p.material);
            assert!(p.in_data);
        }
        for &i in &e.changes {
            let prev = e.points[..i].iter().rev().find(|p| p.feasible).unwrap();
            assert!((&prev.material, &prev.core) != (&e.points[i].material, &e.points[i].core));
        }
        let csv = sweep::envelope_csv(&e);
        assert_eq!(csv.lines().count(), 13);
        assert!(csv.starts_with("frequency_Hz,feasible,in_data,material,core,"));
    }
}

#[test]
fn every_core_envelope_is_no_higher_than_the_design_core_one() {
    // More candidates at each point: the least can only fall or stay.
    let d = Design::demo_forward();
    let one = sweep::envelope(&d, 60e3, 600e3, 6, false).unwrap();
    let all = sweep::envelope(&d, 60e3, 600e3, 6, true).unwrap();
    assert!(all.cores.len() > 1, "{:?}", all.cores);
    for (a, b) in all.points.iter().zip(&one.points) {
        if let Some(v) = b.values.filter(|_| b.feasible) {
            assert!(a.values.unwrap().total <= v.total, "{} Hz", a.x);
        }
    }
}

/// Redesigned points compared with `solve::evaluate_with` by the property below.
static BUILT: std::sync::atomic::AtomicUsize = std::sync::atomic::AtomicUsize::new(0);

/// Serialised, for exact comparison.
fn json<T: serde::Serialize>(v: &T) -> String {
    serde_json::to_string(v).unwrap()
}

proptest! {
    #![proptest_config(crate::config(40))]
    /// A frequency sweep computed in slices of any sizes is the sweep
    /// computed at once, to the bit (serialised), both curves; and each
    /// redesigned point is the design solved on its own at that frequency
    /// (`solve::evaluate_with`, the one-design solver `evaluate` calls; the
    /// sweep leaves out the forward choke `evaluate` attaches), to the bit.
    #[test]
    fn sliced_sweeps_are_the_whole_sweep(
        k in 0..4usize,
        core in 0..magwright_engine::core::library::all().len(),
        load in 0.3..2.0f64,
        f0 in 5e3..300e3f64,
        span in 1.5..30.0f64,
        n in 2..10usize,
        slices in proptest::collection::vec(1..4usize, 1..6),
    ) {
        // Random designs near the demos (each topology), on any library
        // core: most can be built at some of the frequencies.
        let mut d = demos().into_iter().chain([Design::demo_inductor()]).nth(k).unwrap();
        d.core = magwright_engine::design::file::CoreChoice::Library {
            designation: magwright_engine::core::library::all()[core].designation.clone(),
        };
        for o in &mut d.spec.outputs {
            o.current *= load;
        }
        for curve in [sweep::Curve::Redesigned, sweep::Curve::AsWound] {
            let whole = match curve {
                sweep::Curve::Redesigned => sweep::frequency(&d, f0, f0 * span, n),
                _ => sweep::as_wound(&d, f0, f0 * span, n),
            };
            let run = sweep::FrequencySweep::new(&d, f0, f0 * span, n, curve);
            let (whole, mut run) = match (whole, run) {
                (Ok(w), Ok(r)) => (w, r),
                (Err(a), Err(b)) => {
                    prop_assert_eq!((a.field(), a.message()), (b.field(), b.message()));
                    continue;
                }
                (a, b) => return Err(TestCaseError::fail(format!("{curve:?}: {:?} against {:?}", a.err(), b.err()))),
            };
            let mut k = 0;
            while !run.step(slices[k % slices.len()]) {
                k += 1;
            }
            prop_assert_eq!(json(&run.finish()), json(&whole), "{:?} in slices {:?}", curve, slices);
            if curve == sweep::Curve::Redesigned {
                let (core, material) = (d.resolve_core().unwrap(), d.resolve_material().unwrap());
                let prep = solve::Prepared::new(&material).unwrap();
                for p in &whole.points {
                    let mut one = d.clone();
                    one.spec.frequency = p.x;
                    match (solve::evaluate_with(&one, &core, &material, &prep), p.values) {
                        (Ok(r), Some(v)) => {
                            prop_assert_eq!(v.total.to_bits(), r.losses.total.to_bits(), "{} Hz", p.x);
                            BUILT.fetch_add(1, std::sync::atomic::Ordering::Relaxed);
                            prop_assert_eq!(v.primary_turns, r.turns.primary);
                            prop_assert_eq!(p.feasible, r.pass && p.in_data);
                        }
                        (Err(e), None) => prop_assert_eq!(e.message(), p.reason.as_str()),
                        (r, v) => return Err(TestCaseError::fail(format!("{} Hz: {:?} against {v:?}", p.x, r.err()))),
                    }
                }
            }
        }
    }
}

#[test]
fn sliced_sweeps_compare_built_points() {
    // The property compares something: run it here and count the built
    // points it checked against `solve::evaluate_with` (only ever counted up, so a
    // parallel run of the property can only add to it).
    sliced_sweeps_are_the_whole_sweep();
    let n = BUILT.load(std::sync::atomic::Ordering::Relaxed);
    assert!(n >= 40, "only {n} built points compared");
}
