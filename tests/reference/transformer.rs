//! Ideal-transformer relations on whole designs.

use magwright_engine::design::{evaluate, Design};
use magwright_engine::topology::{Input, Output, Topology};

/// Mean of a piecewise-linear waveform over its period, from its points
/// (trapezoid rule, exact for straight segments; elementary calculus).
fn mean_of(w: &magwright_engine::waveform::Pwl) -> f64 {
    w.points
        .windows(2)
        .map(|p| 0.5 * (p[0].1 + p[1].1) * (p[1].0 - p[0].0))
        .sum::<f64>()
        / w.period
}

/// An ideal transformer (η = 1, no rectifier drop), through the engine's
/// turns and currents:
/// * ampere-turn balance during the on-time, Np·(ip − im) = Σ Ns·is, with
///   the magnetising current from the flux, im = Np·Ae·B/Lm (N·Φ = L·i,
///   the definition of inductance);
/// * instantaneous power through the ideal transformer, vp·(ip − im) =
///   Σ vs·is (the two relations above with Faraday's equal volts per turn);
/// * the input delivers exactly the output on average, Vin·mean(i_in) =
///   Pout: the magnetising energy stored in each on-time is returned to the
///   input in the reset (conservation of energy; common practice, no source).
#[test]
fn ideal_transformer_balances_ampere_turns_and_power() {
    for topo in [Topology::Forward, Topology::TwoSwitchForward, Topology::PushPull] {
        let mut d = if topo == Topology::PushPull { Design::demo_push_pull() } else { Design::demo_forward() };
        d.spec.topology = topo;
        d.spec.efficiency = 1.0;
        d.spec.outputs = vec![Output { voltage: 12.0, current: 5.0, rectifier_drop: 0.0 }];
        let r = evaluate(&d).unwrap();
        for op in [&r.waveforms.at_vin_min, &r.waveforms.at_vin_max] {
            // Pout = Vin·mean(i_in).
            let p_in = op.vin * mean_of(&op.input_current);
            assert!((p_in - 60.0).abs() < 1e-9 * 60.0, "{topo:?}: Vin·Iin {p_in} W vs Pout 60 W");
            if topo == Topology::PushPull {
                continue;
            }
            let t = 0.5 * op.duty * op.period;
            let pri = &op.windings[0];
            let im = pri.turns as f64 * r.core.ae * at(&op.flux, t) / r.inductance;
            let load = at(&pri.current, t) - im;
            let secs: Vec<_> = op.windings.iter().filter(|w| w.name.starts_with("secondary")).collect();
            let at_sec: f64 = secs.iter().map(|w| w.turns as f64 * at(&w.current, t)).sum();
            assert!(
                (pri.turns as f64 * load - at_sec).abs() < 1e-9 * at_sec,
                "{topo:?}: Np·(ip − im) {} vs Σ Ns·is {at_sec}",
                pri.turns as f64 * load
            );
            let p_sec: f64 = secs.iter().map(|w| at(&w.voltage, t) * at(&w.current, t)).sum();
            let p_pri = at(&pri.voltage, t) * load;
            assert!((p_pri - p_sec).abs() < 1e-9 * p_sec, "{topo:?}: {p_pri} W in, {p_sec} W out");
            // The engine's turns ratio is the one wound.
            assert!((r.turns_ratio - pri.turns as f64 / secs[0].turns as f64).abs() < 1e-12);
        }
    }
}

/// Value of a waveform at time `t` (linear between breakpoints).
fn at(w: &magwright_engine::waveform::Pwl, t: f64) -> f64 {
    for p in w.points.windows(2) {
        if t >= p[0].0 && t <= p[1].0 && p[1].0 > p[0].0 {
            return p[0].1 + (p[1].1 - p[0].1) * (t - p[0].0) / (p[1].0 - p[0].0);
        }
    }
    f64::NAN
}

/// Volts per turn are equal on every winding (Faraday's law: every turn
/// links the same flux; common practice, no source), and the rectified
/// secondary averages to Vout + Vf over the period (the forward converter's
/// conversion ratio, Erickson & Maksimovic 2nd ed. §6.3.2).
#[test]
fn volts_per_turn_equal_and_conversion_ratio() {
    for (lo, hi) in [(18.0, 30.0), (36.0, 60.0), (90.0, 140.0)] {
        let mut d = Design::demo_forward();
        d.spec.input = Input::Dc { min: lo, nominal: lo, max: hi };
        let r = evaluate(&d).unwrap();
        for op in [&r.waveforms.at_vin_min, &r.waveforms.at_vin_max] {
            let t_on = 0.5 * op.duty * op.period;
            let per_turn: Vec<f64> = op.windings.iter().map(|w| at(&w.voltage, t_on).abs() / w.turns as f64).collect();
            for v in &per_turn {
                assert!((v - per_turn[0]).abs() < 1e-9 * per_turn[0], "{per_turn:?}");
            }
            // Primary volts per turn during the on-time is Vin/Np.
            assert!((per_turn[0] - op.vin / r.turns.primary as f64).abs() < 1e-9 * per_turn[0]);
            let o = &d.spec.outputs[0];
            let v_sec = per_turn[0] * r.turns.secondaries[0] as f64;
            assert!((v_sec * op.duty - (o.voltage + o.rectifier_drop)).abs() < 1e-9 * o.voltage);
        }
        // Power: Pin = Pout/η as the spec estimates, and the magnetic's loss
        // is its core plus copper loss.
        assert!((r.power.input - d.spec.output_power() / d.spec.efficiency).abs() < 1e-9 * r.power.input);
        assert!((r.power.magnetic_loss - (r.losses.core + r.losses.copper)).abs() < 1e-12);
    }
}
