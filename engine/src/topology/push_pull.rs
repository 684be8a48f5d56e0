//! Symmetric (bipolar-flux) converters: push-pull, half bridge and full
//! bridge, all with centre-tapped secondaries.
//!
//! Equations (Erickson & Maksimovic, 2nd ed., §6.3.1 full and half bridge,
//! §6.3.3 push-pull; their D is over half the transformer period, ours is
//! one switch's on-time over the full period, so theirs is 2·D):
//!
//! * The primary sees +Vp for D·T from t = 0 and −Vp for D·T from t = T/2,
//!   D ≤ 0.5. Push-pull: each half of the centre-tapped primary (Np turns
//!   each) in turn, Vp = Vin. Full bridge: one winding, Vp = Vin. Half
//!   bridge: one winding between the switch node and the midpoint of two
//!   large, equal split capacitors, Vp = Vin/2.
//! * Output: Vk + Vfk = 2·D·Vp·Nk/Np (Nk turns per secondary half).
//! * Flux swings symmetrically: ΔB = Vp·D·T/(Np·Ae) peak to peak,
//!   Bpk = ΔB/2, rising during the first on-time, falling during the second.
//! * Magnetising current ±Im, Im = Vp·D·T/(2·Lm) (Lm of one push-pull half).
//! * Output choke at 2·f: ΔIk = r·Ik·(1 − 2D)/(1 − 2D(Vin max)).
//! * The secondary half conducting in the first interval carries the choke
//!   current then, nothing in the second. In the dead times both rectifiers
//!   share the freewheeling current, and the magnetising current (held at
//!   ±Im, the flux being flat) flows in the secondaries as the difference
//!   of the two halves: iB − iA = ±mk, mk = sk·Np·Im/Nk, with output k
//!   taking the share sk = Nk·Ik/Σ Nj·Ij of the magnetising ampere-turns
//!   (the split between outputs is our choice; ampere-turn balance,
//!   Erickson & Maksimovic 2nd ed. §6.2.3). A half cannot go negative: if
//!   mk exceeds the freewheeling current it is clamped and a warning given.
//! * Primary load current Σ(Nk/Np)·iLk(t), the reflected load, plus the
//!   magnetising ramp (ampere-turn balance, §6.2.3). Push-pull: each half carries it in its own on-time; bridges: the
//!   one winding carries it with alternating sign.
//! * Switch off-state voltage: push-pull 2·Vin, bridges Vin.
//! * Input current: push-pull and full bridge, the switch current in each
//!   on-time; half bridge, half of it (with large equal split capacitors
//!   the source supplies half of each pulse: common practice, no source).
//!
//! Unequal on-times or switch drops leave a net volt-second per period
//! that walks the flux to saturation (common practice, no source): a
//! warning is always given for push-pull and full bridge; the half
//! bridge's split capacitors absorb a DC imbalance.

use super::{duty_error, output_voltages, Ctx, Mode, OperatingPoint, Topology, WindingWave};
use crate::error::Result;
use crate::waveform::Pwl;

pub(crate) fn operating_point(ctx: &Ctx, vin: f64) -> Result<OperatingPoint> {
    let spec = ctx.spec;
    let topo = spec.topology;
    let t = 1.0 / spec.frequency;
    let h = 0.5 * t;
    let vp = if topo == Topology::HalfBridge {
        0.5 * vin
    } else {
        vin
    };
    let vp_at_max = if topo == Topology::HalfBridge {
        0.5 * ctx.dc.max
    } else {
        ctx.dc.max
    };
    let np = ctx.turns.primary as f64;
    let o1 = spec.outputs[0];
    let n1 = ctx.turns.secondaries[0] as f64;
    let v1 = o1.voltage + o1.rectifier_drop;
    let d = v1 * np / (2.0 * n1 * vp);
    if d > spec.duty_max * (1.0 + 1e-12) {
        return Err(duty_error(ctx, vin, d));
    }
    let t_on = d * t;
    let delta_b = vp * t_on / (np * ctx.ae);
    let mut warnings = Vec::with_capacity(3);
    match topo {
        Topology::PushPull => warnings.push(
            "push-pull flux walking: any volt-second imbalance between the two halves (unequal on-times \
             or switch drops) accumulates and saturates the core; use peak-current-mode control or \
             another balancing measure (common practice, no source)"
                .to_string(),
        ),
        Topology::FullBridge => warnings.push(
            "full-bridge flux walking: unequal volt-seconds of the two half cycles accumulate and \
             saturate the core; a DC-blocking capacitor in series with the primary or peak-current-mode \
             control is usual (common practice, no source)"
                .to_string(),
        ),
        _ => {}
    }
    // The leakage spike on the flat top is the clamp's (design::clamp).
    let im = match ctx.lp {
        Some(lm) => vp * t_on / (2.0 * lm),
        None => {
            warnings.push(
                "no magnetising inductance given: the magnetising current is neglected".to_string(),
            );
            0.0
        }
    };
    let d_at_max = v1 * np / (2.0 * n1 * vp_at_max);
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
        .map(|&n| 2.0 * d * vp * n as f64 / np)
        .collect();
    let output_v = output_voltages(ctx, &v_rect, &mut warnings);
    let p_sec = super::sizing::secondary_power(spec, &v_rect);

    let v = Pwl::new(
        t,
        vec![
            (0.0, vp),
            (t_on, vp),
            (t_on, 0.0),
            (h, 0.0),
            (h, -vp),
            (h + t_on, -vp),
            (h + t_on, 0.0),
            (t, 0.0),
        ],
    )?;
    // Load current referred to the primary at the start and end of an on-time.
    let (mut l0, mut l1) = (0.0, 0.0);
    let mut secs = Vec::with_capacity(2 * spec.outputs.len());
    let nt_total: f64 = spec
        .outputs
        .iter()
        .zip(&ctx.turns.secondaries)
        .map(|(o, &nk)| nk as f64 * o.current)
        .sum();
    let mut clamped = false;
    for (k, (o, &nk)) in spec.outputs.iter().zip(&ctx.turns.secondaries).enumerate() {
        let di = (spec.choke_ripple_ratio * o.current * scale).min(2.0 * o.current);
        let (a, b) = (o.current - 0.5 * di, o.current + 0.5 * di);
        l0 += nk as f64 / np * a;
        l1 += nk as f64 / np * b;
        // Magnetising ampere-turns carried by this output in the dead times.
        let share = if nt_total > 0.0 {
            nk as f64 * o.current / nt_total
        } else {
            0.0
        };
        let mut m = share * np * im / nk as f64;
        if m > a {
            clamped = true;
            m = a;
        }
        let (lo_a, lo_b) = (0.5 * (a - m), 0.5 * (a + m));
        let (hi_a, hi_b) = (0.5 * (b - m), 0.5 * (b + m));
        let va = v.scaled(nk as f64 / np);
        // First dead time: flux at +ΔB/2, i_m = +Im, so iB − iA = m;
        // second dead time: i_m = −Im, iA − iB = m.
        let ia = Pwl::new(
            t,
            vec![
                (0.0, a),
                (t_on, b),
                (t_on, hi_a),
                (h, lo_a),
                (h, 0.0),
                (h + t_on, 0.0),
                (h + t_on, hi_b),
                (t, lo_b),
            ],
        )?;
        let ib = Pwl::new(
            t,
            vec![
                (0.0, 0.0),
                (t_on, 0.0),
                (t_on, hi_b),
                (h, lo_b),
                (h, a),
                (h + t_on, b),
                (h + t_on, hi_a),
                (t, lo_a),
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
    if clamped {
        warnings.push(
            "the magnetising current exceeds the outputs' freewheeling current in the dead times: \
             the rectifiers cannot carry it all, so the flux there is not held as modelled; \
             raise the magnetising inductance or the load"
                .to_string(),
        );
    }
    // Switch current in its own on-time: load ramp plus magnetising −Im → +Im.
    let (s0, s1) = (l0 - im, l1 + im);
    let switch_i = Pwl::new(t, vec![(0.0, s0), (t_on, s1), (t_on, 0.0), (t, 0.0)])?;
    let k_in = if topo == Topology::HalfBridge {
        0.5
    } else {
        1.0
    };
    let input = Pwl::new(
        t,
        vec![
            (0.0, k_in * s0),
            (t_on, k_in * s1),
            (t_on, 0.0),
            (h, 0.0),
            (h, k_in * s0),
            (h + t_on, k_in * s1),
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
    let switch_rms = switch_i.rms();
    let switch_peak = switch_i.peak_abs();
    let mut windings = Vec::with_capacity(2 + secs.len());
    if topo == Topology::PushPull {
        let pb = Pwl::new(
            t,
            vec![
                (0.0, 0.0),
                (h, 0.0),
                (h, s0),
                (h + t_on, s1),
                (h + t_on, 0.0),
                (t, 0.0),
            ],
        )?;
        windings.push(WindingWave::new(
            "primary A".into(),
            ctx.turns.primary,
            switch_i,
            v.clone(),
        ));
        windings.push(WindingWave::new(
            "primary B".into(),
            ctx.turns.primary,
            pb,
            v,
        ));
    } else {
        // One winding: +load in the first on-time, −load in the second;
        // the magnetising ramp rises in the first and falls in the second.
        let p = Pwl::new(
            t,
            vec![
                (0.0, s0),
                (t_on, s1),
                (t_on, 0.0),
                (h, 0.0),
                (h, -l0 + im),
                (h + t_on, -l1 - im),
                (h + t_on, 0.0),
                (t, 0.0),
            ],
        )?;
        windings.push(WindingWave::new("primary".into(), ctx.turns.primary, p, v));
    }
    windings.extend(secs);
    Ok(OperatingPoint {
        topology: topo,
        vin,
        period: t,
        duty: d,
        mode: Mode::Ccm,
        windings,
        input_current: input,
        delta_b,
        b_peak: 0.5 * delta_b,
        flux,
        volt_seconds: vp * t_on,
        switch_voltage: if topo == Topology::PushPull {
            2.0 * vin
        } else {
            vin
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
