//! The frequency study against the physics and the rule it rests on.
//!
//! * A Steinmetz fit holds only inside the frequencies and flux swings it
//!   was fitted over (Steinmetz 1892; Venkatachalam et al. 2002 §II, the
//!   iGSE takes the fit's coefficients and with them its range). The
//!   engine's rule (`loss::range`, common practice, no source): up to ×1.25
//!   beyond the fitted range the figure is a modest extrapolation and
//!   warns, beyond that it fails. The numbers below are written from that
//!   rule and the material's published fitted range, not taken from the
//!   sweep: points past 1.25·f_max are never feasible, never the minimum.
//! * As wound, the turns are fixed, so the flux swing follows Faraday's law
//!   ΔB = V·t_on/(N·Ae) (Erickson & Maksimovic 2nd ed. §15.1, flux from
//!   the applied volt-seconds): with the duty set by the turns ratio, ΔB·f
//!   is the same at every frequency.

use magwright_engine::design::{sweep, Design};
use magwright_engine::material::library as materials;

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / a.abs().max(b.abs())
}

/// The rule's band, ×1.25 each side of the fitted range (loss::range).
const BAND: f64 = 1.25;

#[test]
fn forward_minimum_lies_inside_the_material_data() {
    // The forward demo's material, MnZn-200k: fitted 20 kHz to 300 kHz
    // (the library's stored range, read here from the library itself).
    let d = Design::demo_forward();
    let m = materials::find("MnZn-200k").unwrap();
    assert_eq!(d.resolve_material().unwrap().name, m.name);
    let (f_lo, f_hi) = (m.steinmetz.f_min, m.steinmetz.f_max);
    let s = sweep::frequency(&d, 20e3, 2e6, 120).unwrap();
    assert_eq!((s.x_axis.quantity, s.x_axis.unit), ("switching frequency", "Hz"));
    let band = s.band.expect("a frequency sweep carries the band");
    assert!(rel(band.max, BAND * f_hi) < 1e-12 && rel(band.min, f_lo / BAND) < 1e-12, "{band:?}");
    assert_eq!((band.fitted_min, band.fitted_max), (f_lo, f_hi));
    // Before the rule, the least loss sat near 1.4 MHz: the sweep reaches
    // well past the data, and the marked minimum must not.
    let i = s.minimum.expect("a feasible minimum");
    let fmin = s.points[i].x;
    assert!(fmin >= f_lo / BAND && fmin <= BAND * f_hi, "minimum at {fmin} Hz");
    assert!(s.points[i].in_data && s.points[i].feasible);
    let mut beyond = 0;
    for p in &s.points {
        if p.x > BAND * f_hi * (1.0 + 1e-9) {
            beyond += 1;
            assert!(!p.in_data && !p.feasible, "{} Hz is beyond the fit's band", p.x);
            if p.values.is_some() {
                assert!(p.reason.contains("material's data"), "{}", p.reason);
            }
        }
        // Nothing outside the data is feasible, anywhere.
        assert!(p.in_data || !p.feasible, "{} Hz", p.x);
    }
    assert!(beyond > 40, "the sweep reaches past the fit ({beyond} points)");
    // The least total loss beyond the band is lower than the marked
    // minimum (extrapolated Steinmetz loss keeps falling): exactly the
    // point the rule keeps from being chosen.
    let best_beyond = s
        .points
        .iter()
        .filter(|p| p.x > BAND * f_hi)
        .filter_map(|p| p.values.map(|v| v.total))
        .fold(f64::INFINITY, f64::min);
    assert!(best_beyond < s.points[i].values.unwrap().total, "{best_beyond}");
    // And the sweep says so: the minimum is where the data end, not an
    // optimum, when the next point up has less loss outside the band.
    let next = &s.points[i + 1];
    if next.values.is_some_and(|v| v.total < s.points[i].values.unwrap().total) {
        let l = s.minimum_limits.iter().find(|l| l.side == sweep::Side::Above).expect("a limit above");
        assert_eq!(l.by, sweep::LimitKind::Data, "{l:?}");
        assert!(l.x > BAND * f_hi * (1.0 - 1e-9) || !next.in_data, "{l:?}");
        assert!(l.note.contains("data do not hold"), "{}", l.note);
    }
}

#[test]
fn as_wound_flux_swing_times_frequency_is_constant() {
    // Erickson & Maksimovic §15.1: ΔB = V·t_on/(N·Ae), N and D fixed.
    for d in [Design::demo_forward(), Design::demo_push_pull()] {
        let s = sweep::as_wound(&d, 50e3, 400e3, 9).unwrap();
        assert_eq!(s.curve, sweep::Curve::AsWound);
        let bf: Vec<f64> = s.points.iter().filter_map(|p| p.values.map(|v| v.b_peak * p.x)).collect();
        assert!(bf.len() >= 5, "{}", d.name);
        for x in &bf {
            assert!(rel(*x, bf[0]) < 1e-6, "{}: {x} against {}", d.name, bf[0]);
        }
        // The turns are those of the design as wound.
        let np = magwright_engine::design::evaluate(&d).unwrap().turns.primary;
        assert!(s.points.iter().filter_map(|p| p.values).all(|v| v.primary_turns == np));
    }
}
