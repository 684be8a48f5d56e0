//! Ideal-transformer relations on the forward design.

use magwright_engine::design::forward::{design, ForwardSpec};

/// Power in equals power out for an ideal transformer: 230 V × 0.4 A is
/// 92 W, which at 24 V out is 3.83 A (common practice, no source).
#[test]
fn ideal_power_balance_worked_numbers() {
    let p_in = 230.0 * 0.4;
    let i_out = p_in / 24.0;
    assert!((p_in - 92.0_f64).abs() < 1e-12);
    assert!((i_out - 3.8333).abs() < 1e-4);
}

/// Volts per turn are equal on every winding (Faraday's law, common
/// practice, no source): during the on-time the secondary sees
/// Vin·Ns/Np, which after the rectifier drop averages to Vout over D.
#[test]
fn volts_per_turn_equal_on_both_windings() {
    for vin_min in [18.0, 36.0, 90.0] {
        let spec = ForwardSpec { vin_min, vin_max: vin_min * 1.6, ..ForwardSpec::demo() };
        let r = design(&spec).unwrap();
        let v_pri_per_turn = spec.vin_min / r.primary_turns as f64;
        let v_sec = spec.vin_min * r.secondary_turns as f64 / r.primary_turns as f64;
        let v_sec_per_turn = v_sec / r.secondary_turns as f64;
        assert!((v_pri_per_turn - v_sec_per_turn).abs() < 1e-12);
        // Average of the rectified secondary over the period equals Vout + Vf.
        assert!((v_sec * r.duty_at_vin_min - (spec.vout + spec.rectifier_drop)).abs() < 1e-9);
        // Ampere-turns balance (magnetising current neglected): Ip·Np = Is·Ns.
        let lhs = r.primary_rms * r.primary_turns as f64;
        let rhs = r.secondary_rms * r.secondary_turns as f64;
        assert!((lhs - rhs).abs() < 1e-9 * rhs);
        // Power balance: input = output + rectifier + magnetic's losses.
        let p = spec.vout * spec.iout + spec.iout * spec.rectifier_drop + r.total_loss;
        assert!((r.input_power - p).abs() < 1e-9 * p);
    }
}
