//! Reference checks: converter topologies (see each test for its source).
//!
//! No published worked example is recalled exactly enough to quote, so
//! each topology is checked against the same design computed by hand here,
//! each step's equation named:
//! * conversion ratios: Erickson & Maksimovic, Fundamentals of Power
//!   Electronics, 2nd ed. (E&M), §6.3.2 forward, §6.3.3 push-pull, §6.3.4
//!   flyback; DCM of the buck-boost (the flyback's parent): E&M ch. 5,
//!   M = D/√K with K = 2L/(R·Ts) and the boundary Kcrit = (1 − D)² (the
//!   table of CCM/DCM characteristics, from memory);
//! * Faraday's law ΔB = V·t/(N·Ae);
//! * RMS of a linear ramp a → b lasting a fraction δ of the period:
//!   I² = δ·(a² + a·b + b²)/3 (the integral of a squared line, elementary
//!   calculus);
//! * an output choke of fixed L: L·ΔI = (V + Vf)·t_off (E&M §2, inductor
//!   volt-second balance);
//! * bulk-capacitor valley: a time-stepped simulation of an ideal bridge
//!   charging a capacitor that feeds a constant-power load (written here,
//!   independent of the engine's closed form).

use magwright_engine::topology::{
    operating_point, sizing, worst_case, Bulk, Corner, FlybackOptions, FlybackRatio, Input,
    Isolation, Mode, OperatingPoint, Output, Spec, Topology, Turns,
};
use magwright_engine::waveform::Pwl;

/// Mean square of a ramp a → b over the fraction `frac` of the period.
fn ramp_ms(a: f64, b: f64, frac: f64) -> f64 {
    frac * (a * a + a * b + b * b) / 3.0
}

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs().max(1e-300)
}

/// Volt-second balance of every winding (mean induced voltage zero) and
/// of the core (B(T) = B(0)), and Faraday's law on the primary: the flux
/// rise equals ∫v dt/(N·Ae) over the on-time. Also the flux waveform's
/// rise over the on-time against the primary voltage's integral.
fn check_balance(op: &OperatingPoint, ae: f64) {
    for w in &op.windings {
        let vmax = w.voltage.peak_abs();
        assert!(
            w.voltage.mean().abs() < 1e-9 * vmax,
            "{}: mean voltage {}",
            w.name,
            w.voltage.mean()
        );
        assert_eq!(w.voltage.period, op.period);
        assert_eq!(w.current.period, op.period);
        // Mean, RMS and peak of the current, recomputed here from its
        // breakpoints: per straight segment a → b of length Δt the mean
        // square is (a² + a·b + b²)/3 (the ramp formula of the module docs)
        // and the mean (a + b)/2; the peak is the largest |breakpoint|.
        let (mut ms, mut mean, mut peak) = (0.0, 0.0, 0.0f64);
        for p in w.current.points.windows(2) {
            let (dt, a, b) = (p[1].0 - p[0].0, p[0].1, p[1].1);
            ms += ramp_ms(a, b, dt / w.current.period);
            mean += 0.5 * (a + b) * dt / w.current.period;
            peak = peak.max(a.abs()).max(b.abs());
        }
        let scale = peak.max(1e-12);
        assert!(
            (w.rms - ms.sqrt()).abs() < 1e-9 * scale
                && (w.peak - peak).abs() < 1e-12 * scale
                && (w.mean - mean).abs() < 1e-9 * scale,
            "{}: rms {} vs {}, peak {} vs {peak}, mean {} vs {mean}",
            w.name,
            w.rms,
            ms.sqrt(),
            w.peak,
            w.mean
        );
    }
    let first = op.flux.points.first().unwrap().1;
    let last = op.flux.points.last().unwrap().1;
    assert!(
        (first - last).abs() < 1e-9 * op.delta_b,
        "B(0) = {first}, B(T) = {last}"
    );
    let p = &op.windings[0];
    let t_on = op.duty * op.period;
    // Faraday on the primary's on-time voltage (Vin, or Vin/2 for the half bridge).
    let vp = p.voltage.max();
    let db = vp * t_on / (p.turns as f64 * ae);
    assert!(
        rel(op.delta_b, db) < 1e-9,
        "ΔB {} vs Faraday {}",
        op.delta_b,
        db
    );
    assert!((op.volt_seconds - vp * t_on).abs() < 1e-12 * op.volt_seconds);
    let rise = value_at(&op.flux, t_on) - first;
    assert!(
        rel(rise, db) < 1e-9,
        "flux rise {rise} vs ∫v dt/(N·Ae) {db}"
    );
    assert!((op.flux.peak_to_peak() - op.delta_b).abs() < 1e-9 * op.delta_b);
}

/// Power through the magnetic: Vin·⟨i_in⟩ equals the rectified power the
/// secondaries deliver, Σ(Vk + Vfk)·Ik with each output at its voltage as
/// wound (ampere-turn balance of the ideal transformer, E&M §6.2.3; the
/// magnetising energy returns to the input). Not Pout/η: the converter's
/// other losses do not flow in the windings. `input_power` stays the
/// spec's Pout/η.
fn check_power(op: &OperatingPoint, spec: &Spec) {
    let p_sec: f64 = spec
        .outputs
        .iter()
        .zip(&op.output_voltages)
        .map(|(o, v)| (v + o.rectifier_drop) * o.current)
        .sum();
    assert!(
        rel(op.vin * op.input_current.mean(), p_sec) < 1e-9,
        "{} vs {p_sec}",
        op.vin * op.input_current.mean()
    );
    assert!(rel(op.secondary_power, p_sec) < 1e-12);
    assert!(rel(op.input_power, spec.output_power() / spec.efficiency) < 1e-12);
}

fn value_at(w: &Pwl, t: f64) -> f64 {
    // Value just after t (right limit) on the piecewise-linear waveform.
    let mut best = w.points[0].1;
    for s in w.points.windows(2) {
        let ((t0, y0), (t1, y1)) = (s[0], s[1]);
        if t >= t0 && t < t1 {
            return y0 + (y1 - y0) * (t - t0) / (t1 - t0);
        }
        if t >= t1 {
            best = y1;
        }
    }
    best
}

// ---------------------------------------------------------------- forward

fn fwd_spec() -> Spec {
    Spec::demo_forward() // 36–60 V, 12 V 10 A, Vf 0.5 V, 200 kHz, η 0.9, r 0.2
}
const FWD_AE: f64 = 76e-6;
const FWD_LM: f64 = 500e-6;
fn fwd_turns() -> Turns {
    Turns {
        primary: 12,
        secondaries: vec![10],
        reset: Some(12),
    }
}

/// Single-switch forward at Vin min, computed by hand.
#[test]
fn forward_hand_design_at_vin_min() {
    let s = fwd_spec();
    let t = fwd_turns();
    let op = operating_point(&s, &t, Some(FWD_LM), FWD_AE, 36.0).unwrap();
    let (vin, f, np, ns) = (36.0, 200e3, 12.0, 10.0);
    let period = 1.0 / f;
    // E&M §6.3.2: V + Vf = (Ns/Np)·D·Vin.
    let d = 12.5 * np / (ns * vin);
    assert!(rel(op.duty, d) < 1e-12);
    assert!(rel((ns / np) * op.duty * vin, 12.5) < 1e-12);
    // Faraday: ΔB = Vin·D·T/(Np·Ae).
    let db = vin * d * period / (np * FWD_AE);
    assert!(rel(op.delta_b, db) < 1e-12 && rel(op.b_peak, db) < 1e-12);
    assert!((db - 0.0822368).abs() < 1e-6, "{db}"); // 15 V·5 µs /(12·76 mm²)
                                                    // Choke: L from r = 0.2 at Vin max (D = 12.5·1.2/60 = 0.25), then
                                                    // ΔI at Vin min from L·ΔI = (V + Vf)·(1 − D)·T.
    let l = 12.5 * (1.0 - 0.25) * period / (0.2 * 10.0);
    let di = 12.5 * (1.0 - d) * period / l;
    let (a, b) = (10.0 - di / 2.0, 10.0 + di / 2.0);
    let sec = op
        .windings
        .iter()
        .find(|w| w.name == "secondary 1")
        .unwrap();
    assert!(rel(sec.rms, ramp_ms(a, b, d).sqrt()) < 1e-9);
    assert!(rel(sec.peak, b) < 1e-12);
    assert!(rel(sec.mean, 10.0 * d) < 1e-9);
    // Primary: the reflected load (Ns/Np)·is plus magnetising Vin·D·T/Lm
    // (E&M §6.2.3: ideal transformer plus magnetising inductance).
    let im = vin * d * period / FWD_LM;
    let (pa, pb) = (ns / np * a, ns / np * b + im);
    // By hand: D = 0.41667, ΔIL = 1.5556 A, is 9.2222 → 10.7778 A, Im 0.15 A:
    // primary 7.6852 → 9.1315 A (Pin/Psec scaling would give 7 % more).
    assert!((pa - 7.6852).abs() < 1e-4 && (pb - 9.1315).abs() < 1e-4, "{pa} {pb}");
    let pri = &op.windings[0];
    assert_eq!(pri.name, "primary");
    assert!(rel(pri.rms, ramp_ms(pa, pb, d).sqrt()) < 1e-9);
    assert!(rel(op.switch_peak_current, pb) < 1e-12);
    assert!(rel(op.magnetising_peak, im) < 1e-12);
    // Reset: primary at −Vin·Np/Nr for t_r = D·T·Nr/Np, current Im·Np/Nr → 0.
    let rst = op.windings.iter().find(|w| w.name == "reset").unwrap();
    assert!(rel(rst.peak, im * np / 12.0) < 1e-12);
    assert!(rel(rst.rms, ramp_ms(im * np / 12.0, 0.0, d * 12.0 / np).sqrt()) < 1e-9);
    assert!(
        value_at(&op.flux, (2.0 * d + 1e-6) * period).abs() < 1e-12,
        "flux reset by 2·D·T"
    );
    // Switch: Vin·(1 + Np/Nr).
    assert!(rel(op.switch_voltage, vin * 2.0) < 1e-12);
    // Ampere-turn balance at the end of the on-time (E&M §6.2.3):
    // Np·(i_p − i_m) = Ns·i_s, with the engine's own waveforms.
    let t_end = d * period * (1.0 - 1e-9);
    let at = np * value_at(&pri.current, t_end) - ns * value_at(&sec.current, t_end);
    assert!(rel(at, np * im) < 1e-6, "{at} vs {}", np * im);
    assert!(rel(np * (pb - im), ns * b) < 1e-12);
    check_balance(&op, FWD_AE);
    check_power(&op, &s);
    assert_eq!(op.mode, Mode::Ccm);
}

/// Forward worst case: flux swing the same at both corners (CCM volt-
/// seconds set by the output, E&M §6.3.2), RMS worst at Vin min, switch
/// voltage at Vin max.
#[test]
fn forward_worst_case_corners() {
    let s = fwd_spec();
    let wc = worst_case(&s, &fwd_turns(), Some(FWD_LM), FWD_AE).unwrap();
    assert!(rel(wc.at_vin_min.delta_b, wc.at_vin_max.delta_b) < 1e-12);
    assert_eq!(wc.get("primary.rms").unwrap().corner, Corner::VinMin);
    assert_eq!(wc.get("secondary 1.rms").unwrap().corner, Corner::VinMin);
    assert_eq!(wc.get("switch_voltage").unwrap().corner, Corner::VinMax);
    assert!(rel(wc.get("switch_voltage").unwrap().value, 120.0) < 1e-12);
    // Magnetising peak Vin·D·T/Lm is line independent too.
    assert!(
        rel(
            wc.at_vin_min.magnetising_peak,
            wc.at_vin_max.magnetising_peak
        ) < 1e-12
    );
    // Choke ripple is the specified 20 % at Vin max: peak − trough = 2 A.
    let sec = &wc.at_vin_max.windings[1];
    assert!(rel(sec.current.max() - value_at(&sec.current, 0.0), 2.0) < 1e-9);
    for op in [&wc.at_vin_min, &wc.at_vin_max] {
        check_balance(op, FWD_AE);
        check_power(op, &s);
    }
}

/// Reset-winding duty limit D ≤ Np/(Np + Nr) (E&M §6.3.2) and the duty
/// limit of the controller.
#[test]
fn forward_duty_limits_rejected_with_field() {
    let s = fwd_spec();
    // 20 reset turns: limit 12/32 = 0.375 < D = 0.4167 at 36 V.
    assert!((sizing::forward_duty_limit(12, 20) - 0.375).abs() < 1e-15);
    let t = Turns {
        reset: Some(20),
        ..fwd_turns()
    };
    let e = operating_point(&s, &t, Some(FWD_LM), FWD_AE, 36.0).unwrap_err();
    assert_eq!(e.field(), Some("turns.reset"));
    // ...but fine at 60 V (D = 0.25).
    assert!(operating_point(&s, &t, Some(FWD_LM), FWD_AE, 60.0).is_ok());
    // 8 secondary turns need D = 12.5·12/(8·36) = 0.52 > duty_max 0.45.
    let t = Turns {
        secondaries: vec![8],
        ..fwd_turns()
    };
    let e = operating_point(&s, &t, Some(FWD_LM), FWD_AE, 36.0).unwrap_err();
    assert_eq!(e.field(), Some("outputs[0].voltage"));
    // Most reset turns for Dmax 0.45 with Np = 12: ⌊12·0.55/0.45⌋ = 14.
    assert_eq!(sizing::max_reset_turns(12, 0.45).unwrap(), 14);
}

/// Two-switch forward: reset through the clamp diodes into the input:
/// primary at −Vin for D·T, each switch sees Vin, D ≤ 0.5.
#[test]
fn two_switch_forward_hand_check() {
    let mut s = fwd_spec();
    s.topology = Topology::TwoSwitchForward;
    let t = Turns {
        reset: None,
        ..fwd_turns()
    };
    let op = operating_point(&s, &t, Some(FWD_LM), FWD_AE, 60.0).unwrap();
    let d = 12.5 * 12.0 / (10.0 * 60.0);
    assert!(rel(op.duty, d) < 1e-12);
    assert!(rel(op.switch_voltage, 60.0) < 1e-12);
    assert_eq!(op.windings.len(), 2, "no reset winding");
    let im = 60.0 * d / 200e3 / FWD_LM;
    // Primary keeps its magnetising current during reset: ramp Im → 0 over D·T.
    let period = 5e-6;
    let pri = &op.windings[0];
    assert!(rel(value_at(&pri.current, d * period * 1.5), im * 0.5) < 1e-9);
    // ...returned to the input: input current −Im/2 there.
    assert!(rel(value_at(&op.input_current, d * period * 1.5), -im * 0.5) < 1e-9);
    check_balance(&op, FWD_AE);
    check_power(&op, &s);
    // Duty max above 0.5 is refused.
    s.duty_max = 0.55;
    assert_eq!(s.validate().unwrap_err().field(), Some("duty_max"));
}

// ---------------------------------------------------------------- flyback

/// A DC-input flyback for hand computation: 120–375 V, 12 V 2 A
/// (Vf 0.5 V), 100 kHz, η 0.85, Vor 100 V, r 0.6.
fn fly_spec() -> Spec {
    Spec {
        topology: Topology::Flyback,
        input: Input::Dc {
            min: 120.0,
            nominal: 300.0,
            max: 375.0,
        },
        outputs: vec![Output {
            voltage: 12.0,
            current: 2.0,
            rectifier_drop: 0.5,
        }],
        frequency: 100e3,
        duty_max: 0.6,
        efficiency: 0.85,
        ambient: 40.0,
        temperature_max: 110.0,
        isolation: Isolation::Reinforced,
        flyback: FlybackOptions {
            ratio: FlybackRatio::ReflectedVoltage(100.0),
            ripple_ratio: 0.6,
        },
        choke_ripple_ratio: 0.2,
        inductor: None,
    }
}
const FLY_AE: f64 = 52e-6;

#[test]
fn flyback_ccm_hand_design() {
    let s = fly_spec();
    // Power through Lp: the rectified power (12 + 0.5) V × 2 A = 25 W, not
    // Pout/η (the converter's other losses are not in the magnetic).
    let (vin, f, p_in) = (120.0, 100e3, 25.0);
    // Ratio from the reflected voltage: n = Vor/(V + Vf) = 8.
    let n = sizing::turns_ratio(&s).unwrap();
    assert!(rel(n, 8.0) < 1e-12);
    let turns = Turns {
        primary: 40,
        secondaries: sizing::secondary_turns(&s, 40, n).unwrap(),
        reset: None,
    };
    assert_eq!(turns.secondaries, vec![5]);
    // CCM duty from Lp volt-second balance (E&M §6.3.4): D = Vor/(Vin + Vor).
    let d = 100.0 / 220.0;
    // E&M §6.3.4: V = (Ns/Np)·Vg·D/(1 − D).
    assert!(rel((5.0 / 40.0) * vin * d / (1.0 - d), 12.5) < 1e-12);
    // Lp for r = ΔI/Ic = 0.6: Ic = Pin/(Vin·D), ΔI = Vin·D/(Lp·f).
    let ic = p_in / (vin * d);
    let lp = vin * d / (f * 0.6 * ic);
    assert!(rel(sizing::flyback_lp(&s, n).unwrap(), lp) < 1e-12);
    let op = operating_point(&s, &turns, Some(lp), FLY_AE, vin).unwrap();
    assert_eq!(op.mode, Mode::Ccm);
    assert!(rel(op.duty, d) < 1e-12);
    let (imin, ipk) = (ic * 0.7, ic * 1.3);
    assert!(rel(op.switch_peak_current, ipk) < 1e-12);
    let pri = &op.windings[0];
    assert!(rel(pri.rms, ramp_ms(imin, ipk, d).sqrt()) < 1e-9);
    // Secondary: Is = (Np/Ns)·i_m over the off-time (ampere-turn balance
    // of the coupled inductor, E&M §6.3.4), mean = Io.
    let k = 8.0;
    let sec = &op.windings[1];
    assert!(rel(sec.peak, k * ipk) < 1e-9);
    assert!(rel(sec.rms, ramp_ms(k * ipk, k * imin, 1.0 - d).sqrt()) < 1e-9);
    assert!(rel(sec.mean, 2.0) < 1e-9);
    // Flux from the magnetising current: Bpk = Lp·Ipk/(Np·Ae).
    assert!(rel(op.b_peak, lp * ipk / (40.0 * FLY_AE)) < 1e-12);
    // Switch: the flat top Vin + Vor (the leakage spike is design::clamp's).
    assert!(rel(op.switch_voltage, 220.0) < 1e-12);
    check_balance(&op, FLY_AE);
    check_power(&op, &s);
}

/// DCM: ½·Lp·Ipk²·f = P (P = 25 W, the rectified power); against E&M's DCM
/// buck-boost ratio M = D/√K, K = 2L/(R·T) with L = Lp and R the load
/// referred to the primary, R = Vor²/P (E&M ch. 5, from memory).
#[test]
fn flyback_dcm_hand_design() {
    let s = fly_spec();
    let turns = Turns {
        primary: 40,
        secondaries: vec![5],
        reset: None,
    };
    let (vin, f, p_in, vor) = (375.0, 100e3, 25.0, 100.0);
    let lp = 200e-6;
    let op = operating_point(&s, &turns, Some(lp), FLY_AE, vin).unwrap();
    assert_eq!(op.mode, Mode::Dcm);
    let ipk = (2.0 * p_in / (lp * f)).sqrt();
    let d = lp * ipk * f / vin;
    assert!(rel(op.switch_peak_current, ipk) < 1e-12);
    assert!(rel(op.duty, d) < 1e-12);
    let k_em = 2.0 * lp * f / (vor * vor / p_in);
    assert!(rel(d / k_em.sqrt(), vor / vin) < 1e-9, "M = D/√K");
    assert!(k_em < (1.0 - d) * (1.0 - d), "DCM: K < Kcrit = (1 − D)²");
    // Triangle RMS: Ipk·√(D/3).
    assert!(rel(op.windings[0].rms, ipk * (d / 3.0).sqrt()) < 1e-9);
    // Demagnetising time t2 = Lp·Ipk/Vor: the secondary is zero after it.
    let t2 = lp * ipk / vor;
    let t = 1.0 / f;
    assert!(value_at(&op.windings[1].current, d * t + t2 * 1.01).abs() < 1e-12);
    assert!(value_at(&op.windings[1].current, d * t + t2 * 0.99) > 0.0);
    check_balance(&op, FLY_AE);
    check_power(&op, &s);
}

/// CCM/DCM boundary: ripple ratio r = 2 makes K equal E&M's
/// Kcrit = (1 − D)², and the engine reports the boundary there.
#[test]
fn flyback_boundary_consistent() {
    let mut s = fly_spec();
    s.flyback.ripple_ratio = 2.0;
    let n = sizing::turns_ratio(&s).unwrap();
    let lp = sizing::flyback_lp(&s, n).unwrap();
    let (vin, vor, p_in, f) = (120.0, 100.0, 25.0, 100e3);
    let d = vor / (vin + vor);
    let k = 2.0 * lp * f / (vor * vor / p_in);
    assert!(rel(k, (1.0 - d) * (1.0 - d)) < 1e-9);
    let turns = Turns {
        primary: 40,
        secondaries: vec![5],
        reset: None,
    };
    let op = operating_point(&s, &turns, Some(lp), FLY_AE, vin).unwrap();
    assert_eq!(op.mode, Mode::Boundary);
    assert!(op.windings[0].current.min().abs() < 1e-9);
    // A little more Lp: CCM; a little less: DCM, with nearly the same peak.
    let a = operating_point(&s, &turns, Some(lp * 1.01), FLY_AE, vin).unwrap();
    let b = operating_point(&s, &turns, Some(lp * 0.99), FLY_AE, vin).unwrap();
    assert_eq!((a.mode, b.mode), (Mode::Ccm, Mode::Dcm));
    assert!(rel(a.switch_peak_current, b.switch_peak_current) < 0.02);
}

/// Two outputs, each on its own turns: each secondary's mean is its
/// output current, and the ampere-turns of the secondaries equal
/// Np·i_m at every instant of the off-time (coupled-inductor ampere-turn
/// balance, E&M §6.3.4).
#[test]
fn flyback_two_outputs() {
    let mut s = fly_spec();
    s.outputs = vec![
        Output {
            voltage: 12.0,
            current: 1.5,
            rectifier_drop: 0.5,
        },
        Output {
            voltage: 18.0,
            current: 0.2,
            rectifier_drop: 0.75,
        },
    ];
    s.efficiency = 0.8;
    let n = sizing::turns_ratio(&s).unwrap();
    let np = 80;
    let sec = sizing::secondary_turns(&s, np, n).unwrap();
    assert_eq!(sec, vec![10, 15]); // 1.25 V per turn: 12.5 V and 18.75 V
    let turns = Turns {
        primary: np,
        secondaries: sec,
        reset: None,
    };
    let lp = 4.0 * sizing::flyback_lp(&s, n).unwrap(); // Lp ∝ Np² at fixed core: 80 vs 40 turns
    let op = operating_point(&s, &turns, Some(lp), FLY_AE, 150.0).unwrap();
    assert!(
        op.warnings.iter().all(|w| !w.contains("comes to")),
        "{:?}",
        op.warnings
    );
    assert!(rel(op.windings[1].mean, 1.5) < 1e-9 && rel(op.windings[2].mean, 0.2) < 1e-9);
    let t_on = op.duty * op.period;
    let flux_to_im = np as f64 * FLY_AE / lp; // i_m = Np·Ae·B/Lp
    for frac in [0.1, 0.5, 0.9] {
        let tt = t_on + frac * (op.period - t_on);
        let at: f64 = op.windings[1..]
            .iter()
            .map(|w| w.turns as f64 * value_at(&w.current, tt))
            .sum();
        let im = value_at(&op.flux, tt) * flux_to_im;
        assert!(rel(at, np as f64 * im) < 1e-9);
    }
    assert!(rel(op.output_voltages[1], 18.0) < 1e-9);
    check_balance(&op, FLY_AE);
    check_power(&op, &s);
    // A mismatched second winding is flagged.
    let turns = Turns {
        primary: np,
        secondaries: vec![10, 12],
        reset: None,
    };
    let op = operating_point(&s, &turns, Some(lp), FLY_AE, 150.0).unwrap();
    assert!(op.warnings.iter().any(|w| w.contains("output 2")));
}

/// Flyback corners: CCM volt-seconds Vin·Vor/(Vin + Vor)·T grow with Vin,
/// the peak current falls with Vin.
#[test]
fn flyback_worst_case_corners() {
    let s = fly_spec();
    let n = 8.0;
    let lp = sizing::flyback_lp(&s, n).unwrap();
    let turns = Turns {
        primary: 40,
        secondaries: vec![5],
        reset: None,
    };
    let wc = worst_case(&s, &turns, Some(lp), FLY_AE).unwrap();
    let vs = |v: f64| v * 100.0 / (v + 100.0) / 100e3;
    let w = wc.get("volt_seconds").unwrap();
    assert_eq!(w.corner, Corner::VinMax);
    assert!(rel(w.value, vs(375.0)) < 1e-12 && rel(w.other, vs(120.0)) < 1e-12);
    let by_sizing = sizing::volt_seconds(&s, n, Some(lp)).unwrap();
    assert!(rel(by_sizing.worst, vs(375.0)) < 1e-12 && by_sizing.corner == Corner::VinMax);
    assert_eq!(
        wc.get("switch_peak_current").unwrap().corner,
        Corner::VinMin
    );
    assert_eq!(wc.get("b_peak").unwrap().corner, Corner::VinMin);
    assert_eq!(wc.get("switch_voltage").unwrap().corner, Corner::VinMax);
    assert_eq!(wc.get("primary.rms").unwrap().corner, Corner::VinMin);
    // Np from the volt-seconds: ΔB stays within the target at both corners.
    let np = sizing::primary_turns_for_flux(by_sizing.worst, 0.1, FLY_AE).unwrap();
    assert_eq!(np, (vs(375.0) / (0.1 * FLY_AE)).ceil() as u32);
}

/// The AC front end: the engine's closed-form valley against a
/// time-stepped simulation of an ideal bridge and capacitor feeding a
/// constant-power load (energy stepped exactly: v² falls by 2·P·dt/C).
/// The closed form starts the discharge at the crest, so it may be a
/// little lower (conservative) but not higher.
#[test]
fn ac_valley_against_simulation() {
    let s = Spec::demo_flyback();
    let dc = s.dc_range().unwrap();
    let (vpk, p, c, fl) = (2f64.sqrt() * 85.0 - 1.6, 24.0 / 0.85, 68e-6, 50.0);
    let w = 2.0 * std::f64::consts::PI * fl;
    let dt = 1e-6;
    let mut v = vpk;
    let mut vmin = f64::INFINITY;
    let steps = (0.4 / dt) as usize;
    for i in 0..steps {
        let t = i as f64 * dt;
        v = (v * v - 2.0 * p * dt / c).max(0.0).sqrt();
        let line = vpk * (w * t).sin().abs();
        if line > v {
            v = line;
        }
        if t > 0.3 {
            vmin = vmin.min(v);
        }
    }
    assert!(
        dc.min <= vmin + 1e-3,
        "closed form {} above simulation {vmin}",
        dc.min
    );
    assert!(
        rel(dc.min, vmin) < 0.02,
        "closed form {} vs simulation {vmin}",
        dc.min
    );
    assert!(rel(dc.max, 2f64.sqrt() * 265.0 - 1.6) < 1e-12);
    // A ripple figure instead: Vv = Vpk·(1 − ratio).
    let mut s2 = s.clone();
    if let Input::Ac { ref mut bulk, .. } = s2.input {
        *bulk = Bulk::RippleRatio { ratio: 0.3 };
    }
    assert!(rel(s2.dc_range().unwrap().min, 0.7 * vpk) < 1e-12);
}

/// The offline demo designs end to end with the helpers and stays in
/// its duty limit at the valley.
#[test]
fn demo_flyback_through_helpers() {
    let s = Spec::demo_flyback();
    let n = sizing::turns_ratio(&s).unwrap();
    let lp = sizing::flyback_lp(&s, n).unwrap();
    let np = 60;
    let turns = Turns {
        primary: np,
        secondaries: sizing::secondary_turns(&s, np, n).unwrap(),
        reset: None,
    };
    let wc = worst_case(&s, &turns, Some(lp), 52e-6).unwrap();
    assert!(wc.at_vin_min.duty <= s.duty_max);
    assert!(wc.at_vin_max.warnings.iter().any(|w| w.contains("ES1")));
    assert!(!s.safety_cautions().is_empty());
}

// ---------------------------------------------------------------- push-pull

const PP_AE: f64 = 100e-6;
fn pp_turns() -> Turns {
    Turns {
        primary: 5,
        secondaries: vec![4],
        reset: None,
    }
}

#[test]
fn push_pull_hand_design() {
    let s = Spec::demo_push_pull(); // 18–32 V, 12 V 8 A, Vf 0.5, 100 kHz, η 0.9
    let (vin, np, ns, t) = (18.0, 5.0, 4.0, 1e-5);
    let lm = 200e-6;
    let op = operating_point(&s, &pp_turns(), Some(lm), PP_AE, vin).unwrap();
    // E&M §6.3.3: V = (Ns/Np)·D_EM·Vg, D_EM = 2·D (one switch over the full period).
    let d = 12.5 * np / (2.0 * ns * vin);
    assert!(rel(op.duty, d) < 1e-12);
    assert!(rel(ns / np * 2.0 * d * vin, 12.5) < 1e-12);
    // Bipolar flux: ΔB = Vin·D·T/(Np·Ae), Bpk = ΔB/2, symmetric about zero.
    let db = vin * d * t / (np * PP_AE);
    assert!(rel(op.delta_b, db) < 1e-12 && rel(op.b_peak, db / 2.0) < 1e-12);
    assert!(rel(op.flux.max(), -op.flux.min()) < 1e-12);
    // Choke at 2f sized at Vin max (D = 12.5·5/(8·32)): L·ΔI = (V + Vf)·(1/2 − D)·T.
    let dmax_line = 12.5 * np / (2.0 * ns * 32.0);
    let l = 12.5 * (0.5 - dmax_line) * t / (0.2 * 8.0);
    let di = 12.5 * (0.5 - d) * t / l;
    let (a, b) = (8.0 - di / 2.0, 8.0 + di / 2.0);
    // Magnetising current Im = Vin·D·T/(2·Lm), held in the dead times by
    // the secondaries: iB − iA = ±m, m = Np·Im/Ns (ampere-turn balance,
    // E&M §6.2.3), around half the choke current each.
    let im = vin * d * t / (2.0 * lm);
    let m = np * im / ns;
    // Secondary half: choke current during its on-time, (iL ∓ m)/2 in the
    // dead times.
    let ms = ramp_ms(a, b, d)
        + ramp_ms((b - m) / 2.0, (a - m) / 2.0, 0.5 - d)
        + ramp_ms((b + m) / 2.0, (a + m) / 2.0, 0.5 - d);
    let sa = op
        .windings
        .iter()
        .find(|w| w.name == "secondary 1 A")
        .unwrap();
    let sb = op
        .windings
        .iter()
        .find(|w| w.name == "secondary 1 B")
        .unwrap();
    assert!(rel(sa.rms, ms.sqrt()) < 1e-9 && rel(sb.rms, ms.sqrt()) < 1e-9);
    // Sum of both halves is the choke current: mean 8 A.
    assert!(rel(sa.mean + sb.mean, 8.0) < 1e-9);
    // Ampere-turns in the first dead time: −Ns·iA + Ns·iB = Np·Im.
    let tt = (d + 0.5 * (0.5 - d)) * t;
    let mmf = ns * (value_at(&sb.current, tt) - value_at(&sa.current, tt));
    assert!(rel(mmf, np * im) < 1e-9, "{mmf} vs {}", np * im);
    // Primary half: (Ns/Np)·iL plus magnetising −Im → +Im.
    let (p0, p1) = (ns / np * a - im, ns / np * b + im);
    for name in ["primary A", "primary B"] {
        let w = op.windings.iter().find(|w| w.name == name).unwrap();
        assert!(rel(w.rms, ramp_ms(p0, p1, d).sqrt()) < 1e-9, "{name}");
        assert!(rel(w.peak, p1) < 1e-12);
    }
    assert!(rel(op.switch_voltage, 36.0) < 1e-12);
    assert!(op.warnings.iter().any(|w| w.contains("flux walking")));
    check_balance(&op, PP_AE);
    check_power(&op, &s);
    // Volt-seconds through the sizing helper: (V + Vf)·n·T/2, line independent.
    let vs = sizing::volt_seconds(&s, np / ns, Some(lm)).unwrap();
    assert!(
        rel(vs.at_vin_min, op.volt_seconds) < 1e-12 && rel(vs.at_vin_max, vs.at_vin_min) < 1e-12
    );
}

#[test]
fn push_pull_rejections() {
    let s = Spec::demo_push_pull();
    // 3 secondary turns per half: D = 12.5·5/(6·18) = 0.58 > 0.45.
    let t = Turns {
        secondaries: vec![3],
        ..pp_turns()
    };
    assert_eq!(
        operating_point(&s, &t, None, PP_AE, 18.0)
            .unwrap_err()
            .field(),
        Some("outputs[0].voltage")
    );
    let wc = worst_case(&s, &pp_turns(), None, PP_AE).unwrap();
    assert!(wc.at_vin_min.magnetising_peak == 0.0);
    assert!(wc
        .at_vin_min
        .warnings
        .iter()
        .any(|w| w.contains("magnetising current is neglected")));
    assert_eq!(wc.get("primary A.rms").unwrap().corner, Corner::VinMin);
    assert_eq!(wc.get("switch_voltage").unwrap().corner, Corner::VinMax);
    // 32 V gives 64 V on the switch: above ES1, flagged.
    assert!(wc.at_vin_max.warnings.iter().any(|w| w.contains("ES1")));
}

// ---------------------------------------------------------------- bad specs

#[test]
fn bad_specs_name_their_field() {
    let t = fwd_turns();
    let run = |s: &Spec| operating_point(s, &t, Some(FWD_LM), FWD_AE, 48.0).unwrap_err();
    let mut s = fwd_spec();
    s.outputs.clear();
    assert_eq!(run(&s).field(), Some("outputs"));
    let mut s = fwd_spec();
    s.outputs = vec![s.outputs[0]; 5];
    assert_eq!(run(&s).field(), Some("outputs"));
    let mut s = fwd_spec();
    s.outputs.push(Output {
        voltage: 5.0,
        current: f64::NAN,
        rectifier_drop: 0.4,
    });
    assert_eq!(run(&s).field(), Some("outputs[1].current"));
    let mut s = fwd_spec();
    s.outputs[0].voltage = -12.0;
    assert_eq!(run(&s).field(), Some("outputs[0].voltage"));
    let mut s = fwd_spec();
    s.frequency = f64::INFINITY;
    assert_eq!(run(&s).field(), Some("frequency"));
    let mut s = fwd_spec();
    s.efficiency = -0.5;
    assert_eq!(run(&s).field(), Some("efficiency"));
    let mut s = fwd_spec();
    s.input = Input::Dc {
        min: 36.0,
        nominal: 48.0,
        max: 30.0,
    };
    // The swapped range is reported as such, before the nominal value
    // (which lies outside any range with min > max).
    let e = run(&s);
    assert_eq!(e.field(), Some("input.max"), "{e}");
    assert!(e.message().contains("above Vin max"), "{e}");
    // Output beyond what the duty allows at Vin min.
    let mut s = fwd_spec();
    s.outputs[0].voltage = 20.0;
    let e = operating_point(&s, &t, Some(FWD_LM), FWD_AE, 36.0).unwrap_err();
    assert_eq!(e.field(), Some("outputs[0].voltage"));
    // Serde round trip of a spec keeps it equal.
    let j = serde_json::to_string(&Spec::demo_flyback()).unwrap();
    let back: Spec = serde_json::from_str(&j).unwrap();
    assert_eq!(back, Spec::demo_flyback());
}

// ---------------------------------------------------------------- bridges

/// Half and full bridge by hand: E&M §6.3.1, V = (Ns/Np)·D_EM·Vg/2 for
/// the half bridge and (Ns/Np)·D_EM·Vg for the full bridge, D_EM = 2·D;
/// Faraday on ±Vp; each switch blocks Vin.
#[test]
fn bridges_hand_design() {
    for (topo, vp_of) in [(Topology::HalfBridge, 0.5), (Topology::FullBridge, 1.0)] {
        let mut s = fwd_spec(); // 36–60 V, 12 V 10 A, 200 kHz, η 0.9
        s.topology = topo;
        let (np, ns, vin, t, lm) = (12.0, 10.0, 36.0, 5e-6, 400e-6);
        let turns = Turns {
            primary: 12,
            secondaries: vec![10],
            reset: None,
        };
        let op = operating_point(&s, &turns, Some(lm), FWD_AE, vin).unwrap();
        let vp = vp_of * vin;
        let d = 12.5 * np / (2.0 * ns * vp);
        assert!(rel(op.duty, d) < 1e-12, "{topo:?}");
        assert!(rel(ns / np * 2.0 * d * vp, 12.5) < 1e-12);
        assert!(rel(op.delta_b, vp * d * t / (np * FWD_AE)) < 1e-12);
        assert!(rel(op.switch_voltage, vin) < 1e-12);
        // Choke sized at Vin max, L·ΔI = (V + Vf)·(1/2 − D)·T.
        let dmax_line = 12.5 * np / (2.0 * ns * vp_of * 60.0);
        let l = 12.5 * (0.5 - dmax_line) * t / (0.2 * 10.0);
        let di = 12.5 * (0.5 - d) * t / l;
        let (a, b) = (10.0 - di / 2.0, 10.0 + di / 2.0);
        // Reflected load plus magnetising ramp (E&M §6.2.3).
        let im = vp * d * t / (2.0 * lm);
        let (s0, s1) = (ns / np * a - im, ns / np * b + im);
        // One primary, current of both signs: RMS² = 2 × one ramp.
        let pri = &op.windings[0];
        assert_eq!(pri.name, "primary");
        assert!(rel(pri.rms, (2.0 * ramp_ms(s0, s1, d)).sqrt()) < 1e-9);
        assert!(pri.mean.abs() < 1e-9 * pri.rms, "no DC in a bridge primary");
        assert!(rel(op.switch_rms_current, ramp_ms(s0, s1, d).sqrt()) < 1e-9);
        let walk = op.warnings.iter().any(|w| w.contains("flux walking"));
        assert_eq!(walk, topo == Topology::FullBridge);
        check_balance(&op, FWD_AE);
        check_power(&op, &s);
        assert!(sizing::turns_ratio(&s).unwrap() > 0.0);
    }
}
