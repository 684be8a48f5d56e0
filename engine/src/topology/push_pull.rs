//! Push-pull: centre-tapped primary and secondaries, bipolar flux.
//!
//! Equations (Erickson & Maksimovic, 2nd ed., §6.3.3, the push-pull
//! isolated buck; their D is over half the transformer period, ours is one
//! switch's on-time over the full period, so theirs is 2·D):
//!
//! * Each half of the primary (Np turns) drives the core in turn: switch A
//!   on for D·T from t = 0, switch B for D·T from t = T/2, D ≤ 0.5.
//! * Output: Vk + Vfk = 2·D·Vin·Nk/Np (Nk turns per secondary half).
//! * Flux swings symmetrically: ΔB = Vin·D·T/(Np·Ae) peak to peak,
//!   Bpk = ΔB/2, rising during A's on-time, falling during B's.
//! * Magnetising current ±Im, Im = Vin·D·T/(2·Lm), Lm of one half.
//! * Output choke at 2·f: ΔIk = r·Ik·(1 − 2D)/(1 − 2D(Vin max)).
//! * Secondary half conducting with A carries the choke current during A's
//!   on-time, nothing during B's, and half of it in both dead times (both
//!   rectifiers share the freewheeling current; the magnetising current's
//!   unequal split between them is neglected).
//! * Each primary half carries (Pin/Psec)·Σ(Nk/Np)·iLk(t) plus the
//!   magnetising ramp −Im → +Im during its on-time. Switch voltage 2·Vin.
//!
//! Unequal on-times or switch drops leave a net volt-second per period
//! that walks the flux to saturation (common practice, no source): a
//! warning is always given.

use super::{duty_error, output_voltages, Ctx, Mode, OperatingPoint, WindingWave};
use crate::error::Result;
use crate::waveform::Pwl;

pub(crate) fn operating_point(ctx: &Ctx, vin: f64) -> Result<OperatingPoint> {
    let spec = ctx.spec;
    let t = 1.0 / spec.frequency;
    let h = 0.5 * t;
    let np = ctx.turns.primary as f64;
    let o1 = spec.outputs[0];
    let n1 = ctx.turns.secondaries[0] as f64;
    let v1 = o1.voltage + o1.rectifier_drop;
    let d = v1 * np / (2.0 * n1 * vin);
    if d > spec.duty_max * (1.0 + 1e-12) {
        return Err(duty_error(ctx, vin, d));
    }
    let t_on = d * t;
    let delta_b = vin * t_on / (np * ctx.ae);
    let mut warnings = vec![
        "push-pull flux walking: any volt-second imbalance between the two halves (unequal on-times or \
         switch drops) accumulates and saturates the core; use peak-current-mode control or another \
         balancing measure (common practice, no source)"
            .to_string(),
        "switch voltage is the flat top 2·Vin; the leakage-inductance spike is not modelled".to_string(),
    ];
    let im = match ctx.lp {
        Some(lm) => vin * t_on / (2.0 * lm),
        None => {
            warnings.push(
                "no magnetising inductance given: the magnetising current is neglected".to_string(),
            );
            0.0
        }
    };
    let d_at_max = v1 * np / (2.0 * n1 * ctx.dc.max);
    let off_max = 1.0 - 2.0 * d_at_max;
    let scale = if off_max > 1e-9 {
        (1.0 - 2.0 * d) / off_max
    } else {
        1.0
    };
    let v_rect: Vec<f64> = ctx
        .turns
        .secondaries
        .iter()
        .map(|&n| 2.0 * d * vin * n as f64 / np)
        .collect();
    let output_v = output_voltages(ctx, &v_rect, &mut warnings);
    let p_sec: f64 = spec
        .outputs
        .iter()
        .zip(&v_rect)
        .map(|(o, v)| v * o.current)
        .sum();
    let k_p = ctx.p_in / p_sec;

    let v = Pwl::new(
        t,
        vec![
            (0.0, vin),
            (t_on, vin),
            (t_on, 0.0),
            (h, 0.0),
            (h, -vin),
            (h + t_on, -vin),
            (h + t_on, 0.0),
            (t, 0.0),
        ],
    )?;
    let (mut ip0, mut ip1) = (-im, im);
    let mut secs = Vec::with_capacity(2 * spec.outputs.len());
    for (k, (o, &nk)) in spec.outputs.iter().zip(&ctx.turns.secondaries).enumerate() {
        let di = (spec.choke_ripple_ratio * o.current * scale).min(2.0 * o.current);
        let (a, b) = (o.current - 0.5 * di, o.current + 0.5 * di);
        ip0 += k_p * nk as f64 / np * a;
        ip1 += k_p * nk as f64 / np * b;
        let va = v.scaled(nk as f64 / np);
        let ia = Pwl::new(
            t,
            vec![
                (0.0, a),
                (t_on, b),
                (t_on, 0.5 * b),
                (h, 0.5 * a),
                (h, 0.0),
                (h + t_on, 0.0),
                (h + t_on, 0.5 * b),
                (t, 0.5 * a),
            ],
        )?;
        let ib = Pwl::new(
            t,
            vec![
                (0.0, 0.0),
                (t_on, 0.0),
                (t_on, 0.5 * b),
                (h, 0.5 * a),
                (h, a),
                (h + t_on, b),
                (h + t_on, 0.5 * b),
                (t, 0.5 * a),
            ],
        )?;
        secs.push(WindingWave::new(
            format!("secondary {} A", k + 1),
            nk,
            ia,
            va.clone(),
        ));
        secs.push(WindingWave::new(
            format!("secondary {} B", k + 1),
            nk,
            ib,
            va,
        ));
    }
    let pa = Pwl::new(t, vec![(0.0, ip0), (t_on, ip1), (t_on, 0.0), (t, 0.0)])?;
    let pb = Pwl::new(
        t,
        vec![
            (0.0, 0.0),
            (h, 0.0),
            (h, ip0),
            (h + t_on, ip1),
            (h + t_on, 0.0),
            (t, 0.0),
        ],
    )?;
    let input = Pwl::new(
        t,
        vec![
            (0.0, ip0),
            (t_on, ip1),
            (t_on, 0.0),
            (h, 0.0),
            (h, ip0),
            (h + t_on, ip1),
            (h + t_on, 0.0),
            (t, 0.0),
        ],
    )?;
    let flux = Pwl::new(
        t,
        vec![
            (0.0, -0.5 * delta_b),
            (t_on, 0.5 * delta_b),
            (h, 0.5 * delta_b),
            (h + t_on, -0.5 * delta_b),
            (t, -0.5 * delta_b),
        ],
    )?;
    let switch_rms = pa.rms();
    let switch_peak = pa.peak_abs();
    let mut windings = Vec::with_capacity(2 + secs.len());
    windings.push(WindingWave::new(
        "primary A".into(),
        ctx.turns.primary,
        pa,
        v.clone(),
    ));
    windings.push(WindingWave::new(
        "primary B".into(),
        ctx.turns.primary,
        pb,
        v,
    ));
    windings.extend(secs);
    Ok(OperatingPoint {
        topology: spec.topology,
        vin,
        period: t,
        duty: d,
        mode: Mode::Ccm,
        windings,
        input_current: input,
        delta_b,
        b_peak: 0.5 * delta_b,
        flux,
        volt_seconds: vin * t_on,
        switch_voltage: 2.0 * vin,
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
