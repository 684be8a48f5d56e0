//! Ideal-transformer relations on whole designs.

use magwright_engine::design::{evaluate, Design};
use magwright_engine::topology::Input;

/// Power in equals power out for an ideal transformer: 230 V × 0.4 A is
/// 92 W, which at 24 V out is 3.83 A (common practice, no source).
#[test]
fn ideal_power_balance_worked_numbers() {
    let p_in = 230.0 * 0.4;
    let i_out = p_in / 24.0;
    assert!((p_in - 92.0_f64).abs() < 1e-12);
    assert!((i_out - 3.8333).abs() < 1e-4);
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
