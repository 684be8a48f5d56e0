//! Closed-form helpers a design solver uses before it has turns: the
//! turns ratio a duty limit allows, the flyback's Lp from a ripple ratio,
//! and the primary volt-seconds at each line corner, from which
//! Np = V·t_on/(ΔB·Ae) (Faraday's law; methods note "turns from the flux
//! limit").
//!
//! Ratios are always n = Np/Ns1 (primary over the first secondary; for
//! the push-pull, turns of one half over turns of one half). Equations:
//! Erickson & Maksimovic, Fundamentals of Power Electronics, 2nd ed., §6.3.

use super::flyback;
use super::spec::{DcRange, FlybackRatio, Output, Spec, Topology};
use super::{Corner, MAX_TURNS};
use crate::error::{in_range, positive, Error, Result};
use serde::{Deserialize, Serialize};

/// V + Vf of an output: the voltage its winding must deliver, V.
pub fn rectified(o: &Output) -> f64 {
    o.voltage + o.rectifier_drop
}

/// The power the secondaries must deliver at the outputs' target voltages,
/// Σ(Vk + Vfk)·Ik, W: the load's power plus the rectifiers' conduction
/// loss. This, not Pout/η, is what flows through the magnetic (ampere-turn
/// balance, Erickson & Maksimovic 2nd ed. §6.2.3, the ideal transformer
/// model: the converter's other losses, in switches, snubbers and
/// capacitors, do not flow in its windings). The magnetic's own loss (a few
/// per cent at most) is left out of its currents: it is an output of the
/// loss model, computed from these currents (a choice we state; common
/// practice, no source).
pub fn rectified_power(spec: &Spec) -> f64 {
    spec.outputs.iter().map(|o| rectified(o) * o.current).sum()
}

/// Power through the secondaries as wound, W: Σ Vk·Ik with Vk the voltage
/// each secondary delivers to its rectifier (`v_rect`, one per output) and
/// Ik its output current (the ampere-turns follow from it; power balance).
pub fn secondary_power(spec: &Spec, v_rect: &[f64]) -> f64 {
    spec.outputs.iter().zip(v_rect).map(|(o, v)| v * o.current).sum()
}

/// Flyback reflected voltage and rectified power as wound:
/// Vor = (Np/Ns1)·(V1 + Vf1) and Psec = Σ Vor·(Nk/Np)·Ik (each output at the
/// volts per turn of the regulated one), W.
pub fn flyback_as_wound(spec: &Spec, turns: &super::Turns) -> Result<(f64, f64)> {
    let o1 = spec
        .outputs
        .first()
        .ok_or_else(|| Error::input("outputs", "give at least one output"))?;
    let np = turns.primary as f64;
    let n1 = turns.secondaries.first().copied().unwrap_or(0) as f64;
    if np < 1.0 || n1 < 1.0 || turns.secondaries.len() != spec.outputs.len() {
        return Err(Error::input("turns.secondaries", "give one turn count per output"));
    }
    let vor = np / n1 * rectified(o1);
    let p_sec = spec
        .outputs
        .iter()
        .zip(&turns.secondaries)
        .map(|(o, &nk)| vor * nk as f64 / np * o.current)
        .sum();
    Ok((vor, p_sec))
}

/// The flyback's ripple ratio in the sense of `spec.flyback.ripple_ratio`
/// at `vin`: r = Vin²·D²/(Lp·f·P) with the CCM duty D = Vor/(Vin + Vor)
/// (the inverse of [`flyback_lp_from_ripple`]). In CCM this is ΔIp/Ic; at
/// the boundary 2; in DCM it is 2·Lb/Lp (Lb the boundary inductance), above 2.
pub fn flyback_ripple_ratio(vin: f64, vor: f64, lp: f64, p: f64, frequency: f64) -> f64 {
    let d = flyback_duty_ccm(vin, vor);
    vin * vin * d * d / (lp * frequency * p)
}

/// The conduction mode a ripple ratio asks for: r < 2 CCM, r = 2 the
/// boundary (within 1e-9), r > 2 DCM (see `FlybackOptions::ripple_ratio`).
pub fn mode_of_ripple(r: f64) -> super::Mode {
    if (r - 2.0).abs() <= 2e-9 {
        super::Mode::Boundary
    } else if r < 2.0 {
        super::Mode::Ccm
    } else {
        super::Mode::Dcm
    }
}

/// Flyback Lp as wound: the spec's ripple ratio at Vin min and full load
/// with the reflected voltage and rectified power of these turns
/// ([`flyback_as_wound`]), so that the mode asked for holds after the turns
/// are rounded to integers.
pub fn flyback_lp_as_wound(spec: &Spec, turns: &super::Turns) -> Result<f64> {
    let dc = spec.dc_range()?;
    let (vor, p_sec) = flyback_as_wound(spec, turns)?;
    let d = flyback_duty_ccm(dc.min, vor);
    flyback_lp_from_ripple(dc.min, d, p_sec, spec.frequency, spec.flyback.ripple_ratio)
}

fn check_d(d: f64, hi: f64) -> Result<f64> {
    in_range("duty_max", d, 1e-3, hi, "")
}

/// Flyback ratio giving duty `d_max` at `vin_min` in CCM, from
/// Vin·D = Vor·(1 − D) (volt-second balance of Lp):
/// n = Vin_min·Dmax/((1 − Dmax)·(V + Vf)).
pub fn flyback_turns_ratio_for_duty(vin_min: f64, v_rect: f64, d_max: f64) -> Result<f64> {
    positive("vin", vin_min, "V")?;
    positive("outputs[0].voltage", v_rect, "V")?;
    let d = check_d(d_max, 0.95)?;
    Ok(vin_min * d / ((1.0 - d) * v_rect))
}

/// Flyback CCM duty D = Vor/(Vin + Vor).
pub fn flyback_duty_ccm(vin: f64, vor: f64) -> f64 {
    vor / (vin + vor)
}

/// Flyback primary inductance for ripple ratio r = ΔIp/Ic at `vin`, duty
/// `duty` (CCM formula) and input power `p_in`:
/// Ic = Pin/(Vin·D), ΔIp = Vin·D/(Lp·f), so Lp = Vin²·D²/(r·f·Pin).
/// r = 2 is the CCM/DCM boundary (Lp = Vin²D²/(2·f·Pin), which is
/// ½·Lp·Ipk²·f = Pin at Ipk = ΔIp); r > 2 gives a DCM design.
pub fn flyback_lp_from_ripple(
    vin: f64,
    duty: f64,
    p_in: f64,
    frequency: f64,
    ripple_ratio: f64,
) -> Result<f64> {
    positive("vin", vin, "V")?;
    check_d(duty, 0.999)?;
    positive("input_power", p_in, "W")?;
    positive("frequency", frequency, "Hz")?;
    positive("flyback.ripple_ratio", ripple_ratio, "")?;
    Ok(vin * vin * duty * duty / (ripple_ratio * frequency * p_in))
}

/// Forward ratio giving `d_max` at `vin_min`: V + Vf = D·Vin/n, so
/// n = Vin_min·Dmax/(V + Vf) (E&M §6.3.2).
pub fn forward_turns_ratio(vin_min: f64, v_rect: f64, d_max: f64) -> Result<f64> {
    positive("vin", vin_min, "V")?;
    positive("outputs[0].voltage", v_rect, "V")?;
    Ok(vin_min * check_d(d_max, 0.95)? / v_rect)
}

/// Push-pull ratio (per half) giving per-switch duty `d_max` at `vin_min`:
/// V + Vf = 2·D·Vin/n, so n = 2·Vin_min·Dmax/(V + Vf) (E&M §6.3.3). The
/// same for the full bridge; for the half bridge pass Vin_min/2 (§6.3.1).
pub fn push_pull_turns_ratio(vin_min: f64, v_rect: f64, d_max: f64) -> Result<f64> {
    positive("vin", vin_min, "V")?;
    positive("outputs[0].voltage", v_rect, "V")?;
    Ok(2.0 * vin_min * check_d(d_max, 0.5)? / v_rect)
}

/// Largest duty at which a reset winding of `nr` turns still resets the
/// core: D ≤ Np/(Np + Nr) (E&M §6.3.2: D ≤ 1/(1 + n2/n1)).
pub fn forward_duty_limit(np: u32, nr: u32) -> f64 {
    let (np, nr) = (np as f64, nr.max(1) as f64);
    np / (np + nr)
}

/// Most reset turns that allow duty `d_max`: Nr ≤ Np·(1 − Dmax)/Dmax.
pub fn max_reset_turns(np: u32, d_max: f64) -> Result<u32> {
    let d = check_d(d_max, 0.95)?;
    let nr = (np as f64 * (1.0 - d) / d * (1.0 + 1e-12)).floor();
    if nr < 1.0 {
        return Err(Error::infeasible(
            Some("duty_max"),
            format!("no reset winding of at least one turn allows D = {d} with {np} primary turns"),
        ));
    }
    Ok(nr.min(MAX_TURNS as f64) as u32)
}

/// The design ratio n = Np/Ns1 for the spec: flyback per
/// `spec.flyback.ratio`; forward, two-switch forward and push-pull the
/// largest ratio that reaches the first output at Vin min within
/// `duty_max` (a larger n lowers the primary current and the reset or
/// switch stress; the solver may choose less).
pub fn turns_ratio(spec: &Spec) -> Result<f64> {
    spec.validate()?;
    let dc = spec.dc_range()?;
    let v1 = rectified(&spec.outputs[0]);
    match spec.topology {
        Topology::Flyback => match spec.flyback.ratio {
            FlybackRatio::FromDutyMax => flyback_turns_ratio_for_duty(dc.min, v1, spec.duty_max),
            FlybackRatio::ReflectedVoltage(vor) => Ok(vor / v1),
            FlybackRatio::TurnsRatio(n) => Ok(n),
        },
        Topology::Forward | Topology::TwoSwitchForward => {
            forward_turns_ratio(dc.min, v1, spec.duty_max)
        }
        Topology::PushPull | Topology::FullBridge => {
            push_pull_turns_ratio(dc.min, v1, spec.duty_max)
        }
        Topology::HalfBridge => push_pull_turns_ratio(0.5 * dc.min, v1, spec.duty_max),
        // One winding: no ratio (1 by convention).
        Topology::Inductor => Ok(1.0),
    }
}

/// Flyback Lp for the spec's ripple ratio at Vin min, full load, ratio `n`
/// and the rectified power [`rectified_power`] (see
/// [`flyback_lp_from_ripple`]). The solver's first estimate; the design
/// uses [`flyback_lp_as_wound`] once the turns are integers.
pub fn flyback_lp(spec: &Spec, n: f64) -> Result<f64> {
    spec.validate()?;
    positive("turns_ratio", n, "")?;
    let dc = spec.dc_range()?;
    let vor = n * rectified(&spec.outputs[0]);
    let d = flyback_duty_ccm(dc.min, vor);
    flyback_lp_from_ripple(
        dc.min,
        d,
        rectified_power(spec),
        spec.frequency,
        spec.flyback.ripple_ratio,
    )
}

/// Secondary turns for `np` primary turns and ratio `n` = Np/Ns1: the
/// first rounded up (so the duty stays within its limit), the others
/// nearest to equal volts per turn with it, at least one turn each.
pub fn secondary_turns(spec: &Spec, np: u32, n: f64) -> Result<Vec<u32>> {
    spec.validate()?;
    positive("turns_ratio", n, "")?;
    if np == 0 {
        return Err(Error::input("turns.primary", "must be at least one turn"));
    }
    if spec.topology == Topology::Inductor {
        return Ok(Vec::new());
    }
    let n1 = (np as f64 / n * (1.0 - 1e-12)).ceil().max(1.0);
    if n1 > MAX_TURNS as f64 {
        return Err(Error::infeasible(
            Some("turns.secondaries[0]"),
            format!("{n1:.0} turns is too many"),
        ));
    }
    let v1 = rectified(&spec.outputs[0]);
    Ok(spec
        .outputs
        .iter()
        .map(|o| {
            (n1 * rectified(o) / v1)
                .round()
                .clamp(1.0, MAX_TURNS as f64) as u32
        })
        .collect())
}

/// Volt-seconds on the primary (one half for the push-pull) during one
/// on-time at DC input `vin`, V·s, for ratio `n` = Np/Ns1 (and the
/// flyback's `lp`, which decides CCM or DCM). Forward and push-pull in CCM:
/// Vin·D·T = (V1 + Vf1)·n·T (×½ for push-pull and bridges), the same at every line
/// voltage. Flyback CCM: Vin·Vor/(Vin + Vor)·T, largest at Vin max; DCM:
/// Lp·Ipk, fixed by the power. Then Np = λ/(ΔB·Ae), ΔB peak to peak
/// (push-pull: ΔB = 2·Bpk; flyback: mind the DC bias, see
/// [`flyback_primary_turns`]).
pub fn primary_volt_seconds(spec: &Spec, n: f64, lp: Option<f64>, vin: f64) -> Result<f64> {
    positive("turns_ratio", n, "")?;
    positive("vin", vin, "V")?;
    let t = 1.0 / positive("frequency", spec.frequency, "Hz")?;
    let v1 = rectified(
        spec.outputs
            .first()
            .ok_or_else(|| Error::input("outputs", "give at least one output"))?,
    );
    Ok(match spec.topology {
        Topology::Flyback => {
            let lp = positive(
                "lp",
                lp.ok_or_else(|| Error::input("lp", "the flyback needs Lp"))?,
                "H",
            )?;
            let s = flyback::state(vin, n * v1, lp, rectified_power(spec), spec.frequency);
            vin * s.d * t
        }
        Topology::Forward | Topology::TwoSwitchForward => v1 * n * t,
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge => 0.5 * v1 * n * t,
        // The inductor's on-time volt-seconds V_on·D·T.
        Topology::Inductor => {
            let s = super::inductor::state(spec, vin);
            s.v_on * s.duty * t
        }
    })
}

/// Primary volt-seconds at both line corners.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct VoltSeconds {
    pub dc: DcRange,
    pub at_vin_min: f64,
    pub at_vin_max: f64,
    /// The larger, and where.
    pub worst: f64,
    pub corner: Corner,
}

/// [`primary_volt_seconds`] at Vin min and Vin max of the spec.
pub fn volt_seconds(spec: &Spec, n: f64, lp: Option<f64>) -> Result<VoltSeconds> {
    spec.validate()?;
    let dc = spec.dc_range()?;
    let a = primary_volt_seconds(spec, n, lp, dc.min)?;
    let b = primary_volt_seconds(spec, n, lp, dc.max)?;
    let (worst, corner) = if a >= b {
        (a, Corner::VinMin)
    } else {
        (b, Corner::VinMax)
    };
    Ok(VoltSeconds {
        dc,
        at_vin_min: a,
        at_vin_max: b,
        worst,
        corner,
    })
}

/// Fewest primary turns keeping the swing within `delta_b` (T, peak to
/// peak): Np = ⌈λ/(ΔB·Ae)⌉ (Faraday's law).
pub fn primary_turns_for_flux(volt_seconds: f64, delta_b: f64, ae: f64) -> Result<u32> {
    positive("volt_seconds", volt_seconds, "V·s")?;
    positive("delta_b", delta_b, "T")?;
    positive("ae", ae, "m²")?;
    turns_up(volt_seconds / (delta_b * ae), "turns.primary")
}

/// Flyback primary turns keeping the *peak* flux (DC bias included) within
/// `bpk_limit`: Np = ⌈Lp·Ipk/(Bmax·Ae)⌉ (from B = Lp·i/(Np·Ae)).
pub fn flyback_primary_turns(lp: f64, i_pk: f64, bpk_limit: f64, ae: f64) -> Result<u32> {
    positive("lp", lp, "H")?;
    positive("i_pk", i_pk, "A")?;
    positive("bpk_limit", bpk_limit, "T")?;
    positive("ae", ae, "m²")?;
    turns_up(lp * i_pk / (bpk_limit * ae), "turns.primary")
}

/// Flyback peak primary current at `vin` for ratio `n` and `lp`, A.
pub fn flyback_peak_current(spec: &Spec, n: f64, lp: f64, vin: f64) -> Result<f64> {
    positive("turns_ratio", n, "")?;
    positive("lp", lp, "H")?;
    positive("vin", vin, "V")?;
    let v1 = rectified(
        spec.outputs
            .first()
            .ok_or_else(|| Error::input("outputs", "give at least one output"))?,
    );
    let f = positive("frequency", spec.frequency, "Hz")?;
    Ok(flyback::state(vin, n * v1, lp, rectified_power(spec), f).i_pk)
}

fn turns_up(x: f64, field: &str) -> Result<u32> {
    let n = (x * (1.0 - 1e-12)).ceil().max(1.0);
    if !n.is_finite() || n > MAX_TURNS as f64 {
        return Err(Error::infeasible(
            Some(field),
            format!("{x:.0} turns is too many; use a larger core"),
        ));
    }
    Ok(n as u32)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Each ratio helper, substituted back into its conversion ratio
    /// (E&M §6.3), gives the duty limit at Vin min.
    #[test]
    fn ratios_reach_the_duty_limit() {
        let (vin, v, d) = (36.0, 12.5, 0.45);
        let n = flyback_turns_ratio_for_duty(vin, v, d).unwrap();
        assert!((flyback_duty_ccm(vin, n * v) - d).abs() < 1e-12);
        let n = forward_turns_ratio(vin, v, d).unwrap();
        assert!((v * n / vin - d).abs() < 1e-12);
        let n = push_pull_turns_ratio(vin, v, d).unwrap();
        assert!((v * n / (2.0 * vin) - d).abs() < 1e-12);
        assert!(push_pull_turns_ratio(vin, v, 0.6).is_err());
        assert_eq!(
            forward_turns_ratio(vin, v, f64::NAN).unwrap_err().field(),
            Some("duty_max")
        );
    }

    /// Lp from the ripple ratio gives back r = ΔI/Ic with ΔI = Vin·D/(Lp·f)
    /// and Ic = Pin/(Vin·D); the flyback state at that Lp agrees.
    #[test]
    fn flyback_lp_recovers_ripple() {
        let (vin, vor, p, f, r) = (120.0, 100.0, 28.0, 100e3, 0.6);
        let d = flyback_duty_ccm(vin, vor);
        let lp = flyback_lp_from_ripple(vin, d, p, f, r).unwrap();
        let di = vin * d / (lp * f);
        let ic = p / (vin * d);
        assert!((di / ic - r).abs() < 1e-12);
        let s = flyback::state(vin, vor, lp, p, f);
        assert!(((s.i_pk - s.i_min) / ic - r).abs() < 1e-9);
        // Turns for the peak flux: B = Lp·Ipk/(Np·Ae) ≤ Bmax with the fewest turns.
        let np = flyback_primary_turns(lp, s.i_pk, 0.3, 50e-6).unwrap();
        assert!(lp * s.i_pk / (np as f64 * 50e-6) <= 0.3);
        assert!(lp * s.i_pk / ((np - 1) as f64 * 50e-6) > 0.3);
        let spec = Spec {
            input: super::super::Input::Dc {
                min: vin,
                nominal: vin,
                max: 2.0 * vin,
            },
            ..Spec::demo_flyback()
        };
        let ipk = flyback_peak_current(&spec, vor / 12.5, lp, vin).unwrap();
        let s2 = flyback::state(vin, vor, lp, rectified_power(&spec), f);
        assert_eq!(ipk, s2.i_pk);
        assert!(primary_turns_for_flux(1.0, 0.1, 1e-12).is_err());
    }
}
