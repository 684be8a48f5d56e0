//! Forward converters: single switch with a reset winding, and two switch
//! with clamp diodes.
//!
//! Equations (Erickson & Maksimovic, 2nd ed., §6.3.2, the forward
//! converter, windings n1 (primary), n2 (reset), n3 (secondary)):
//!
//! * CCM output choke: Vk + Vfk = D·Vin·Nk/Np; the first output sets D.
//! * On-time: primary voltage +Vin, flux rises by ΔB = Vin·D·T/(Np·Ae)
//!   from zero (remanence neglected), magnetising current rises from 0 to
//!   Im = Vin·D·T/Lm.
//! * Single switch, reset winding Nr: after turn-off the reset winding
//!   clamps to the input, primary voltage −Vin·Np/Nr, for
//!   t_r = D·T·Nr/Np; the reset current falls from Im·Np/Nr to zero and
//!   returns the magnetising energy to the input. The core resets within
//!   the period only if D + D·Nr/Np ≤ 1, i.e. D ≤ Np/(Np + Nr) (the book's
//!   D ≤ 1/(1 + n2/n1)). Switch voltage Vin·(1 + Np/Nr).
//! * Two switch: both switches open together and the primary itself is
//!   clamped to −Vin through the two diodes, so t_r = D·T, D ≤ 0.5; the
//!   magnetising current keeps flowing in the primary (falling to zero)
//!   but back into the input. Each switch sees Vin.
//! * Secondary k conducts its choke current during the on-time only: a
//!   trapezoid from Ik − ΔIk/2 to Ik + ΔIk/2 (the freewheeling diode
//!   carries the off-time). ΔIk = r·Ik·(1 − D)/(1 − D(Vin max)) (module
//!   docs: fixed L sized for r at Vin max), capped at 2·Ik.
//! * Primary during the on-time: Σ(Nk/Np)·ik(t) + i_m(t), the reflected
//!   load plus the magnetising current (ampere-turn balance of the
//!   transformer model, Erickson & Maksimovic 2nd ed. §6.2.3 and §6.3.2:
//!   Np·ip − Σ Nk·ik = Np·i_m). So Vin·⟨i_in⟩ = Psec, the rectified power;
//!   the converter's losses outside the magnetic do not flow in it.

use super::{duty_error, output_voltages, Ctx, Mode, OperatingPoint, Topology, WindingWave};
use crate::error::{Error, Result};
use crate::waveform::Pwl;

/// Off-time fraction factor of the choke ripple: ΔI(Vin)/ΔI(Vin max).
fn ripple_scale(off_now: f64, off_at_max: f64) -> f64 {
    if off_at_max > 1e-9 {
        off_now / off_at_max
    } else {
        1.0
    }
}

pub(crate) fn operating_point(ctx: &Ctx, vin: f64) -> Result<OperatingPoint> {
    let spec = ctx.spec;
    let two_switch = spec.topology == Topology::TwoSwitchForward;
    let t = 1.0 / spec.frequency;
    let np = ctx.turns.primary as f64;
    let o1 = spec.outputs[0];
    let n1 = ctx.turns.secondaries[0] as f64;
    let v1 = o1.voltage + o1.rectifier_drop;
    // D = (V1 + Vf1)·(Np/N1)/Vin (E&M §6.3.2).
    let d = v1 * np / (n1 * vin);
    if d > spec.duty_max * (1.0 + 1e-12) {
        return Err(duty_error(ctx, vin, d));
    }
    // Reset: turns ratio of the clamp path, Nr/Np (1 for two-switch).
    let (nr, reset_ratio) = if two_switch {
        (ctx.turns.primary, 1.0)
    } else {
        let nr = ctx.turns.reset.unwrap_or(ctx.turns.primary);
        (nr, nr as f64 / np)
    };
    let d_lim = 1.0 / (1.0 + reset_ratio);
    if d > d_lim * (1.0 + 1e-12) {
        return Err(Error::infeasible(
            Some("turns.reset"),
            format!(
                "D = {d:.3} at Vin {vin:.1} V but the reset winding allows at most Np/(Np + Nr) = {d_lim:.3}; \
                 use fewer reset turns or more secondary turns"
            ),
        ));
    }
    // The leakage spike on the flat top is the clamp's (design::clamp).
    let mut warnings = Vec::new();
    if spec.duty_max > d_lim + 1e-12 {
        warnings.push(format!(
            "duty_max {} exceeds the reset limit {d_lim:.3}: a transient at full duty would not reset the core",
            spec.duty_max
        ));
    }
    let mut warnings_tail = Vec::new();
    if two_switch && ctx.turns.reset.is_some() {
        warnings_tail.push(
            "the two-switch forward resets through its clamp diodes; turns.reset is ignored"
                .to_string(),
        );
    }

    let t_on = d * t;
    let t_r = t_on * reset_ratio;
    let delta_b = vin * t_on / (np * ctx.ae);
    let im = match ctx.lp {
        Some(lm) => vin * t_on / lm,
        None => {
            warnings.push(
                "no magnetising inductance given: the magnetising current is neglected".to_string(),
            );
            0.0
        }
    };

    // Choke ripple, sized at Vin max.
    let d_at_max = v1 * np / (n1 * ctx.dc.max);
    let scale = ripple_scale(1.0 - d, 1.0 - d_at_max);
    let v_rect: Vec<f64> = ctx
        .turns
        .secondaries
        .iter()
        .map(|&n| d * vin * n as f64 / np)
        .collect();
    let output_v = output_voltages(ctx, &v_rect, &mut warnings);
    let p_sec = super::sizing::secondary_power(spec, &v_rect);

    let mut windings = Vec::with_capacity(2 + spec.outputs.len());
    // Primary voltage: +Vin on, −Vin·Np/Nr reset, 0 after.
    let v_reset = -vin / reset_ratio;
    let vp = Pwl::new(
        t,
        vec![
            (0.0, vin),
            (t_on, vin),
            (t_on, v_reset),
            (t_on + t_r, v_reset),
            (t_on + t_r, 0.0),
            (t, 0.0),
        ],
    )?;
    // Load current referred to the primary, at the start and end of the on-time.
    let (mut ip0, mut ip1) = (0.0, 0.0);
    let mut secs = Vec::with_capacity(spec.outputs.len());
    for (k, (o, &nk)) in spec.outputs.iter().zip(&ctx.turns.secondaries).enumerate() {
        let di = (spec.choke_ripple_ratio * o.current * scale).min(2.0 * o.current);
        let (a, b) = (o.current - 0.5 * di, o.current + 0.5 * di);
        ip0 += nk as f64 / np * a;
        ip1 += nk as f64 / np * b;
        let cur = Pwl::new(t, vec![(0.0, a), (t_on, b), (t_on, 0.0), (t, 0.0)])?;
        secs.push(WindingWave::new(
            format!("secondary {}", k + 1),
            nk,
            cur,
            vp.scaled(nk as f64 / np),
        ));
    }
    if scale > 1.0 + 1e-9 {
        warnings_tail.push(format!(
            "Vin {vin:.1} V is above the spec's Vin max: the choke ripple is {:.0} % larger than specified",
            (scale - 1.0) * 100.0
        ));
    }
    let ip1m = ip1 + im;
    let (primary_i, input_i) = if two_switch {
        let p = Pwl::new(
            t,
            vec![
                (0.0, ip0),
                (t_on, ip1m),
                (t_on, im),
                (t_on + t_r, 0.0),
                (t, 0.0),
            ],
        )?;
        let i = Pwl::new(
            t,
            vec![
                (0.0, ip0),
                (t_on, ip1m),
                (t_on, -im),
                (t_on + t_r, 0.0),
                (t, 0.0),
            ],
        )?;
        (p, i)
    } else {
        let p = Pwl::new(t, vec![(0.0, ip0), (t_on, ip1m), (t_on, 0.0), (t, 0.0)])?;
        let ir = im / reset_ratio;
        let i = Pwl::new(
            t,
            vec![
                (0.0, ip0),
                (t_on, ip1m),
                (t_on, -ir),
                (t_on + t_r, 0.0),
                (t, 0.0),
            ],
        )?;
        (p, i)
    };
    // Each switch carries the primary during the on-time only (the
    // two-switch's clamp diodes carry the reset current).
    let switch_i = Pwl::new(t, vec![(0.0, ip0), (t_on, ip1m), (t_on, 0.0), (t, 0.0)])?;
    let switch_rms = switch_i.rms();
    let switch_peak = switch_i.peak_abs();
    windings.push(WindingWave::new(
        "primary".into(),
        ctx.turns.primary,
        primary_i,
        vp.clone(),
    ));
    windings.extend(secs);
    if !two_switch {
        let ir = im / reset_ratio;
        let cur = Pwl::new(
            t,
            vec![
                (0.0, 0.0),
                (t_on, 0.0),
                (t_on, ir),
                (t_on + t_r, 0.0),
                (t, 0.0),
            ],
        )?;
        windings.push(WindingWave::new(
            "reset".into(),
            nr,
            cur,
            vp.scaled(reset_ratio),
        ));
    }
    let flux = Pwl::new(
        t,
        vec![(0.0, 0.0), (t_on, delta_b), (t_on + t_r, 0.0), (t, 0.0)],
    )?;
    warnings.extend(warnings_tail);
    Ok(OperatingPoint {
        topology: spec.topology,
        vin,
        period: t,
        duty: d,
        mode: Mode::Ccm,
        windings,
        input_current: input_i,
        delta_b,
        b_peak: delta_b,
        flux,
        volt_seconds: vin * t_on,
        switch_voltage: if two_switch {
            vin
        } else {
            vin * (1.0 + 1.0 / reset_ratio)
        },
        switch_peak_current: switch_peak,
        switch_rms_current: switch_rms,
        magnetising_peak: im,
        input_power: ctx.p_in,
        output_power: ctx.p_out,
        secondary_power: p_sec,
        output_voltages: output_v,
        warnings,
    })
}
