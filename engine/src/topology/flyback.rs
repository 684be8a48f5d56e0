//! Flyback: CCM, boundary and DCM waveforms of the coupled inductor.
//!
//! Equations (Erickson & Maksimovic, 2nd ed., §6.3.4 for the CCM ratio;
//! energy balance of Lp for DCM, common practice, no source):
//!
//! * Reflected voltage Vor = (Np/Ns1)·(V1 + Vf1): the primary voltage while
//!   the secondaries conduct.
//! * CCM, volt-second balance of Lp: Vin·D = Vor·(1 − D), so
//!   D = Vor/(Vin + Vor) whatever the load.
//! * The power through the magnetic is the rectified power as wound,
//!   Psec = Σ(Vk + Vfk)·Ik with each output at the volts per turn of these
//!   turns: the energy the secondaries deliver. Not Pout/η: η covers the
//!   whole converter, whose switch, clamp and capacitor losses do not pass
//!   through Lp (the magnetic's own loss is left out, see
//!   `sizing::rectified_power`).
//! * Primary ramp centre Ic from that power: Vin·D·Ic = Psec; ramp
//!   ΔI = Vin·D/(Lp·f). CCM while Ic ≥ ΔI/2 (Imin = Ic − ΔI/2 ≥ 0).
//! * DCM: all stored energy is delivered each period: ½·Lp·Ipk²·f = Psec, so
//!   Ipk = √(2·Psec/(Lp·f)), D = Lp·Ipk·f/Vin, and the demagnetising time is
//!   t2 = Lp·Ipk/Vor. Then the current is zero until the next period
//!   (ringing of the drain node is not modelled).
//! * Switch off-state voltage Vin + Vor (flat top; the leakage spike and
//!   its clamp are in `design::clamp`).
//! * Flux B = Lp·i_m/(Np·Ae), i_m the magnetising current referred to the
//!   primary.
//! * Secondaries share the magnetising ampere-turns during the off-time:
//!   i_k(t) = a_k·i_m(t), a_k = Ik/⟨i_m⟩_off where ⟨i_m⟩_off is the period
//!   mean of i_m over the off-time only, so ⟨i_k⟩ = Ik exactly. Since
//!   Vor·⟨i_m⟩_off = Psec = Vor·Σ(Nk/Np)·Ik, their ampere-turns sum to
//!   Np·i_m: ampere-turn balance (Erickson & Maksimovic 2nd ed. §6.3.4, the
//!   flyback as a coupled inductor).

use super::{duty_error, output_voltages, Ctx, Mode, OperatingPoint, WindingWave};
use crate::error::Result;
use crate::waveform::Pwl;

/// Primary current state of the flyback at one input voltage.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct State {
    pub mode: Mode,
    /// Duty.
    pub d: f64,
    /// Demagnetising time over the period (1 − d in CCM).
    pub d2: f64,
    pub i_min: f64,
    pub i_pk: f64,
}

/// Mode, duty and primary currents from Vin, Vor, Lp, the power through
/// the magnetic P (the rectified power, module docs) and f.
pub(crate) fn state(vin: f64, vor: f64, lp: f64, p_in: f64, f: f64) -> State {
    let d_ccm = vor / (vin + vor);
    let di = vin * d_ccm / (lp * f);
    let ic = p_in / (vin * d_ccm);
    let half = 0.5 * di;
    if ic >= half * (1.0 - 1e-9) {
        let mode = if (ic - half).abs() <= 1e-9 * ic {
            Mode::Boundary
        } else {
            Mode::Ccm
        };
        let i_min = (ic - half).max(0.0);
        return State {
            mode,
            d: d_ccm,
            d2: 1.0 - d_ccm,
            i_min,
            i_pk: ic + half,
        };
    }
    let i_pk = (2.0 * p_in / (lp * f)).sqrt();
    let d = lp * i_pk * f / vin;
    let d2 = (lp * i_pk * f / vor).min(1.0 - d);
    State {
        mode: Mode::Dcm,
        d,
        d2,
        i_min: 0.0,
        i_pk,
    }
}

pub(crate) fn operating_point(ctx: &Ctx, vin: f64) -> Result<OperatingPoint> {
    let spec = ctx.spec;
    let t = 1.0 / spec.frequency;
    let np = ctx.turns.primary as f64;
    let o1 = spec.outputs[0];
    let n1 = ctx.turns.secondaries[0] as f64;
    let vor = np / n1 * (o1.voltage + o1.rectifier_drop);
    // `context` guarantees Lp for the flyback; fall back defensively.
    let lp = ctx.lp.unwrap_or(1e-3);
    let v_rect: Vec<f64> = ctx
        .turns
        .secondaries
        .iter()
        .map(|&n| vor * n as f64 / np)
        .collect();
    let p_sec = super::sizing::secondary_power(spec, &v_rect);
    let s = state(vin, vor, lp, p_sec, spec.frequency);
    if s.d > spec.duty_max * (1.0 + 1e-12) {
        return Err(duty_error(ctx, vin, s.d));
    }
    // The leakage spike on the flat top Vin + Vor is the clamp's (design::clamp).
    let mut warnings = Vec::new();

    let t_on = s.d * t;
    let t_off = s.d2 * t;
    // Magnetising current i_m(t), referred to the primary.
    let im_pts: Vec<(f64, f64)> = match s.mode {
        Mode::Ccm | Mode::Boundary => vec![(0.0, s.i_min), (t_on, s.i_pk), (t, s.i_min)],
        Mode::Dcm => vec![(0.0, 0.0), (t_on, s.i_pk), (t_on + t_off, 0.0), (t, 0.0)],
    };
    let mean_off = 0.5 * (s.i_pk + s.i_min) * s.d2;
    let flux_k = lp / (np * ctx.ae);
    let flux = Pwl::new(t, im_pts.iter().map(|&(x, i)| (x, i * flux_k)).collect())?;

    let primary_i = Pwl::new(
        t,
        vec![(0.0, s.i_min), (t_on, s.i_pk), (t_on, 0.0), (t, 0.0)],
    )?;
    // Primary induced voltage: +Vin on, −Vor demagnetising, 0 idle (DCM).
    let vp = match s.mode {
        Mode::Dcm => vec![
            (0.0, vin),
            (t_on, vin),
            (t_on, -vor),
            (t_on + t_off, -vor),
            (t_on + t_off, 0.0),
            (t, 0.0),
        ],
        Mode::Ccm | Mode::Boundary => vec![(0.0, vin), (t_on, vin), (t_on, -vor), (t, -vor)],
    };
    let vp = Pwl::new(t, vp)?;

    let output_v = output_voltages(ctx, &v_rect, &mut warnings);

    let mut windings = Vec::with_capacity(1 + spec.outputs.len());
    windings.push(WindingWave::new(
        "primary".into(),
        ctx.turns.primary,
        primary_i.clone(),
        vp.clone(),
    ));
    for (k, (o, &nk)) in spec.outputs.iter().zip(&ctx.turns.secondaries).enumerate() {
        let a = if mean_off > 0.0 {
            o.current / mean_off
        } else {
            0.0
        };
        // CCM ends at t with a·Imin (a step to zero at the period
        // boundary); DCM falls to zero at t_on + t2 and idles.
        let mut pts = vec![(0.0, 0.0), (t_on, 0.0), (t_on, a * s.i_pk)];
        match s.mode {
            Mode::Dcm => pts.extend([(t_on + t_off, 0.0), (t, 0.0)]),
            Mode::Ccm | Mode::Boundary => pts.push((t, a * s.i_min)),
        }
        let cur = Pwl::new(t, pts)?;
        windings.push(WindingWave::new(
            format!("secondary {}", k + 1),
            nk,
            cur,
            vp.scaled(nk as f64 / np),
        ));
    }

    if p_sec > ctx.p_in {
        warnings.push(format!(
            "with these turns the outputs take {p_sec:.1} W, more than the {:.1} W input; check the efficiency",
            ctx.p_in
        ));
    }
    let switch_rms = primary_i.rms();
    Ok(OperatingPoint {
        topology: spec.topology,
        vin,
        period: t,
        duty: s.d,
        mode: s.mode,
        windings,
        input_current: primary_i,
        delta_b: flux.peak_to_peak(),
        b_peak: flux.peak_abs(),
        flux,
        volt_seconds: vin * t_on,
        switch_voltage: vin + vor,
        switch_peak_current: s.i_pk,
        switch_rms_current: switch_rms,
        magnetising_peak: s.i_pk,
        input_power: ctx.p_in,
        output_power: ctx.p_out,
        secondary_power: p_sec,
        output_voltages: output_v,
        warnings,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Boundary condition: at r = 2 the CCM ramp just touches zero, so the
    /// CCM and DCM formulas agree (Lp at the boundary
    /// Lp = Vin²·D²/(2·f·Pin), from ½·Lp·Ipk²·f = Pin with Ipk = Vin·D/(Lp·f)).
    #[test]
    fn ccm_dcm_boundary_continuous() {
        let (vin, vor, p, f) = (100.0, 100.0, 30.0, 100e3);
        let d = 0.5;
        let lb = vin * vin * d * d / (2.0 * f * p);
        let above = state(vin, vor, lb * 1.001, p, f);
        let below = state(vin, vor, lb * 0.999, p, f);
        let at = state(vin, vor, lb, p, f);
        assert_eq!(above.mode, Mode::Ccm);
        assert_eq!(below.mode, Mode::Dcm);
        assert_eq!(at.mode, Mode::Boundary);
        assert!((above.i_pk - below.i_pk).abs() < 2e-3 * above.i_pk);
        assert!((above.d - below.d).abs() < 1e-3);
        assert!(above.d2 + above.d <= 1.0 + 1e-12 && below.d + below.d2 <= 1.0 + 1e-12);
        assert!((at.i_pk - vin * d / (lb * f)).abs() < 1e-9 * at.i_pk);
    }
}
