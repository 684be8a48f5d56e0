//! Converter topologies: waveforms and stresses of the flyback, the
//! single- and two-switch forward, the push-pull and the half and full
//! bridge.
//!
//! This module answers one question: *given a spec, the turns, the
//! primary (magnetising) inductance and the core's Ae, what does every
//! winding carry and what does the core see, at a given input voltage?*
//! The design solver (which chooses core, turns and gap), the loss and the
//! thermal models all start from its [`OperatingPoint`]: one switching
//! period of each winding's current and voltage and of the flux density
//! B(t), as exact piecewise-linear waveforms ([`Pwl`]), plus the switch
//! stresses. [`worst_case`] evaluates both line corners (Vin min, Vin max)
//! and says which corner is worst for each quantity. [`sizing`] has the
//! closed-form helpers a solver uses to pick a turns ratio, Lp and Np.
//!
//! # Models and conventions
//!
//! * Steady state, ideal switches and rectifiers (the rectifier drop of
//!   each output is added to its voltage), lossless magnetic with perfect
//!   coupling here: the switch voltages are the flat-top values; the
//!   leakage spike on top and the clamp that holds it are computed from
//!   the wound stack-up's leakage in `design::clamp`; ringing is not
//!   modelled.
//! * The first output is the regulated one. The others follow the volts
//!   per turn of their own windings (cross-regulation is ideal); when the
//!   integer turns put an output more than 3 % off its target, a warning
//!   says so.
//! * Power: the magnetic carries the rectified power Psec = Σ(Vk + Vfk)·Ik
//!   (each output at its voltage as wound), not Pout/η: η is the whole
//!   converter's, and its switch, clamp and capacitor losses do not flow in
//!   the windings. Forward-type primaries carry Σ(Nk/Np)·ik + i_m, the
//!   reflected load plus the magnetising current (ampere-turn balance,
//!   Erickson & Maksimovic 2nd ed. §6.2.3, the ideal transformer with its
//!   magnetising inductance); the flyback's Lp ramps with Psec and the
//!   secondaries carry all of its ampere-turns in the off-time. At every
//!   instant Σ ± Nk·ik(t) = Np·i_m(t) = Np²·Ae·B(t)/Lp. The magnetic's own
//!   loss is left out of the currents (see `sizing::rectified_power`);
//!   `input_power` keeps the spec's Pout/η for the report.
//! * Winding voltage convention: v_k(t) = N_k·Ae·dB/dt, the voltage induced
//!   in winding k, positive while the flux rises (all windings referred to
//!   the same sense). Its mean over a period is zero, which is the
//!   volt-second balance B(T) = B(0). Currents are positive in the
//!   direction the winding conducts (a flyback secondary conducts while its
//!   induced voltage is negative in this convention).
//! * Flux: forward converters start each period from B = 0 (unipolar,
//!   remanence neglected, so Bpk = ΔB); the flyback's B follows its
//!   magnetising current, B = Lp·i_m/(Np·Ae); the push-pull's is
//!   symmetric, ±ΔB/2. ΔB is always peak to peak.
//! * Conversion ratios (Erickson & Maksimovic, Fundamentals of Power
//!   Electronics, 2nd ed., §6.3): forward V = (Ns/Np)·D·Vg, with a reset
//!   winding D ≤ 1/(1 + Nr/Np); push-pull V = (Ns/Np)·2D·Vg, where D is
//!   one switch's on-time over the full period (the book's D is our 2D);
//!   half bridge V = (Ns/Np)·D·Vg (§6.3.1, Vg/2 on the primary), full bridge
//!   V = (Ns/Np)·2D·Vg; flyback CCM V = (Ns/Np)·Vg·D/(1 − D).
//! * Output chokes (forward, push-pull, bridges): each output has one, sized for a
//!   ripple ΔI = r·Iout at Vin max ([`Spec::choke_ripple_ratio`]); at
//!   another Vin, ΔI scales with the off-time fraction (fixed L): forward
//!   (1 − D), push-pull (1 − 2D). So secondary currents are trapezoids.
//!
//! Module layout: [`spec`] (what is asked), [`sizing`] (helpers),
//! `flyback`, `forward` (single and two switch), `push_pull` (push-pull,
//! half and full bridge: the symmetric, bipolar-flux family), [`inductor`]
//! (the inductor kind: one DC-biased winding, buck or boost).

pub mod cautions;
mod flyback;
mod forward;
pub mod inductor;
mod push_pull;
pub mod sizing;
pub mod spec;

pub use spec::{
    Bulk, DcRange, FlybackOptions, FlybackRatio, Input, Isolation, Output, Spec, Topology,
};

use crate::error::{in_range, positive, Error, Result};
use crate::waveform::Pwl;
use serde::{Deserialize, Serialize};

/// Turn counts. Push-pull: `primary` counts the turns of *one half* of the
/// centre-tapped primary. Push-pull and bridges: each secondary count is
/// one half of its centre-tapped winding.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct Turns {
    pub primary: u32,
    /// One per output, same order as `Spec::outputs`.
    pub secondaries: Vec<u32>,
    /// Reset winding (single-switch forward only).
    pub reset: Option<u32>,
}

/// Largest turn count accepted for one winding.
pub const MAX_TURNS: u32 = 10_000;

/// Conduction mode of the energy-storing inductance (flyback: Lp; forward
/// and push-pull: always CCM, the output chokes are kept out of DCM).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Mode {
    Ccm,
    /// Critical conduction: the current just reaches zero.
    Boundary,
    Dcm,
}

/// One winding over one period.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct WindingWave {
    /// "primary", "secondary 1", "reset", "primary A", "secondary 2 B"...
    pub name: String,
    pub turns: u32,
    /// Current, A (positive in the direction the winding conducts).
    pub current: Pwl,
    /// Induced voltage N·Ae·dB/dt, V (module docs for the sign).
    pub voltage: Pwl,
    pub rms: f64,
    /// Largest |i|, A.
    pub peak: f64,
    pub mean: f64,
}

impl WindingWave {
    fn new(name: String, turns: u32, current: Pwl, voltage: Pwl) -> Self {
        let rms = current.rms();
        let peak = current.peak_abs();
        let mean = current.mean();
        WindingWave {
            name,
            turns,
            current,
            voltage,
            rms,
            peak,
            mean,
        }
    }
}

/// Everything at one input voltage.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct OperatingPoint {
    pub topology: Topology,
    /// DC input voltage, V.
    pub vin: f64,
    /// Switching period, s.
    pub period: f64,
    /// On-time of one switch over the period.
    pub duty: f64,
    pub mode: Mode,
    pub windings: Vec<WindingWave>,
    /// Current drawn from the DC input (negative while energy returns), A.
    pub input_current: Pwl,
    /// Flux density B(t), T.
    pub flux: Pwl,
    /// Peak-to-peak flux swing, T.
    pub delta_b: f64,
    /// Largest |B|, T.
    pub b_peak: f64,
    /// Volt-seconds on the primary (one half for push-pull; Vin/2 for the
    /// half bridge) per on-time,
    /// V·s: Np = this/(ΔB·Ae).
    pub volt_seconds: f64,
    /// Off-state voltage of each switch, V (flat top; the leakage spike
    /// and its clamp are in `design::clamp`).
    pub switch_voltage: f64,
    pub switch_peak_current: f64,
    pub switch_rms_current: f64,
    /// Peak magnetising current referred to the primary, A (0 when
    /// `lp_h` is not given for a forward or push-pull).
    pub magnetising_peak: f64,
    /// Pout/η, W: the spec's estimate of the converter's input (not the
    /// power through the magnetic, which is `secondary_power`).
    pub input_power: f64,
    pub output_power: f64,
    /// Rectified power Σ(Vk_actual + Vfk)·Ik, W.
    pub secondary_power: f64,
    /// Each output's voltage with these turns, V.
    pub output_voltages: Vec<f64>,
    pub warnings: Vec<String>,
}

/// A line corner.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Corner {
    VinMin,
    VinMax,
}

/// The worst of one quantity over the two corners.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Worst {
    /// "duty", "b_peak", "delta_b", "volt_seconds", "switch_voltage",
    /// "switch_peak_current", "switch_rms_current", "magnetising_peak",
    /// `"<winding name>.rms"`, `"<winding name>.peak"` (e.g. `"primary.rms"`).
    pub quantity: String,
    /// Its larger value, and where.
    pub value: f64,
    pub corner: Corner,
    /// The value at the other corner.
    pub other: f64,
}

/// Both line corners and the worst of each quantity.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct WorstCase {
    pub dc: DcRange,
    pub at_vin_min: OperatingPoint,
    pub at_vin_max: OperatingPoint,
    pub worst: Vec<Worst>,
}

impl WorstCase {
    /// The worst entry for `quantity`, if it exists.
    pub fn get(&self, quantity: &str) -> Option<&Worst> {
        self.worst.iter().find(|w| w.quantity == quantity)
    }
}

/// Validated inputs shared by the topology models.
pub(crate) struct Ctx<'a> {
    pub spec: &'a Spec,
    pub dc: DcRange,
    pub turns: &'a Turns,
    pub lp: Option<f64>,
    pub ae: f64,
    pub p_in: f64,
    pub p_out: f64,
}

fn check_turns(spec: &Spec, turns: &Turns) -> Result<()> {
    if turns.primary == 0 || turns.primary > MAX_TURNS {
        return Err(Error::input(
            "turns.primary",
            format!("must be 1 to {MAX_TURNS} turns"),
        ));
    }
    let expected = if spec.topology == Topology::Inductor {
        0
    } else {
        spec.outputs.len()
    };
    if turns.secondaries.len() != expected {
        return Err(Error::input(
            "turns.secondaries",
            format!(
                "give one turn count per output ({} outputs, {} counts; none for an inductor)",
                expected,
                turns.secondaries.len()
            ),
        ));
    }
    for (i, &n) in turns.secondaries.iter().enumerate() {
        if n == 0 || n > MAX_TURNS {
            return Err(Error::input(
                &format!("turns.secondaries[{i}]"),
                format!("must be 1 to {MAX_TURNS} turns"),
            ));
        }
    }
    match (spec.topology, turns.reset) {
        (Topology::Forward, None) => {
            return Err(Error::input(
                "turns.reset",
                "the single-switch forward needs a reset winding",
            ))
        }
        (Topology::Forward, Some(n)) if n == 0 || n > MAX_TURNS => {
            return Err(Error::input(
                "turns.reset",
                format!("must be 1 to {MAX_TURNS} turns"),
            ))
        }
        _ => {}
    }
    Ok(())
}

fn context<'a>(spec: &'a Spec, turns: &'a Turns, lp_h: Option<f64>, ae_m2: f64) -> Result<Ctx<'a>> {
    spec.validate()?;
    check_turns(spec, turns)?;
    let ae = positive("ae", ae_m2, "m²")?;
    in_range("ae", ae, 1e-9, 0.1, "m²")?;
    let lp = match lp_h {
        Some(l) => {
            positive("lp", l, "H")?;
            Some(in_range("lp", l, 1e-9, 100.0, "H")?)
        }
        None if spec.topology == Topology::Flyback => {
            return Err(Error::input(
                "lp",
                "the flyback needs its primary inductance Lp",
            ))
        }
        None if spec.topology == Topology::Inductor => {
            return Err(Error::input("lp", "the inductor needs its inductance"))
        }
        None => None,
    };
    let dc = spec.dc_range()?;
    let p_out = spec.output_power();
    Ok(Ctx {
        spec,
        dc,
        turns,
        lp,
        ae,
        p_in: p_out / spec.efficiency,
        p_out,
    })
}

/// How a corner's warning that its switch node is above ES1 begins.
pub const SWITCH_NODE_WARNING: &str = "the switch node reaches";

fn at(ctx: &Ctx, vin: f64) -> Result<OperatingPoint> {
    positive("vin", vin, "V")?;
    in_range("vin", vin, 0.0, 5000.0, "V")?;
    let mut op = match ctx.spec.topology {
        Topology::Flyback => flyback::operating_point(ctx, vin)?,
        Topology::Forward | Topology::TwoSwitchForward => forward::operating_point(ctx, vin)?,
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge => {
            push_pull::operating_point(ctx, vin)?
        }
        Topology::Inductor => inductor::operating_point(ctx, vin)?,
    };
    if op.switch_voltage > spec::ES1_DC_LIMIT {
        op.warnings.push(format!(
            "{SWITCH_NODE_WARNING} {:.0} V (plus the leakage spike), above the ES1 limit of 60 V DC of \
             IEC 62368-1 (from memory): treat the primary side as hazardous",
            op.switch_voltage
        ));
    }
    // Nothing non-finite may leave the engine.
    let finite = [
        op.duty,
        op.delta_b,
        op.b_peak,
        op.switch_voltage,
        op.switch_peak_current,
        op.switch_rms_current,
    ]
    .iter()
    .all(|v| v.is_finite())
        && op
            .windings
            .iter()
            .all(|w| w.rms.is_finite() && w.peak.is_finite());
    if !finite {
        return Err(Error::infeasible(
            None,
            "the operating point is degenerate for these inputs",
        ));
    }
    Ok(op)
}

/// The operating point at DC input `vin` (V), for `turns`, primary
/// inductance `lp_h` (H; required for the flyback, the magnetising
/// inductance of one primary half for the others, where `None` neglects
/// the magnetising current) and effective core area `ae_m2` (m²).
///
/// Errors: any bad spec field; `turns.*`; `lp`; `ae`; `vin`;
/// `outputs[0].voltage` when these turns cannot reach the output within
/// `duty_max` at this `vin`; `turns.reset` when the core cannot reset.
pub fn operating_point(
    spec: &Spec,
    turns: &Turns,
    lp_h: Option<f64>,
    ae_m2: f64,
    vin: f64,
) -> Result<OperatingPoint> {
    let ctx = context(spec, turns, lp_h, ae_m2)?;
    at(&ctx, vin)
}

/// Both line corners of the spec's DC range and the worst of each
/// quantity (see [`Worst`]).
pub fn worst_case(spec: &Spec, turns: &Turns, lp_h: Option<f64>, ae_m2: f64) -> Result<WorstCase> {
    let ctx = context(spec, turns, lp_h, ae_m2)?;
    let lo = at(&ctx, ctx.dc.min)?;
    let hi = at(&ctx, ctx.dc.max)?;
    let mut worst = Vec::with_capacity(8 + 2 * lo.windings.len());
    let mut push = |q: String, a: f64, b: f64| {
        let (value, corner, other) = if a >= b {
            (a, Corner::VinMin, b)
        } else {
            (b, Corner::VinMax, a)
        };
        worst.push(Worst {
            quantity: q,
            value,
            corner,
            other,
        });
    };
    push("duty".into(), lo.duty, hi.duty);
    push("b_peak".into(), lo.b_peak, hi.b_peak);
    push("delta_b".into(), lo.delta_b, hi.delta_b);
    push("volt_seconds".into(), lo.volt_seconds, hi.volt_seconds);
    push(
        "switch_voltage".into(),
        lo.switch_voltage,
        hi.switch_voltage,
    );
    push(
        "switch_peak_current".into(),
        lo.switch_peak_current,
        hi.switch_peak_current,
    );
    push(
        "switch_rms_current".into(),
        lo.switch_rms_current,
        hi.switch_rms_current,
    );
    push(
        "magnetising_peak".into(),
        lo.magnetising_peak,
        hi.magnetising_peak,
    );
    for (a, b) in lo.windings.iter().zip(&hi.windings) {
        push(format!("{}.rms", a.name), a.rms, b.rms);
        push(format!("{}.peak", a.name), a.peak, b.peak);
    }
    Ok(WorstCase {
        dc: ctx.dc,
        at_vin_min: lo,
        at_vin_max: hi,
        worst,
    })
}

/// Per-output bookkeeping shared by the models: the actual output voltage
/// from the winding's volts, and a cross-regulation warning.
pub(crate) fn output_voltages(ctx: &Ctx, v_rect: &[f64], warnings: &mut Vec<String>) -> Vec<f64> {
    ctx.spec
        .outputs
        .iter()
        .zip(v_rect)
        .enumerate()
        .map(|(i, (o, &vr))| {
            let v = vr - o.rectifier_drop;
            if i > 0 && (v - o.voltage).abs() > 0.03 * o.voltage {
                warnings.push(format!(
                    "output {} comes to {:.2} V with {} turns instead of {} V; adjust its turns",
                    i + 1,
                    v,
                    ctx.turns.secondaries.get(i).copied().unwrap_or(0),
                    o.voltage
                ));
            }
            v
        })
        .collect()
}

/// Error for an output the duty limit cannot reach.
pub(crate) fn duty_error(ctx: &Ctx, vin: f64, d: f64) -> Error {
    Error::infeasible(
        Some("outputs[0].voltage"),
        format!(
            "{} V needs D = {:.3} at Vin {:.1} V with these turns, above duty_max {}; \
             lower the output, add secondary turns or raise duty_max",
            ctx.spec.outputs[0].voltage, d, vin, ctx.spec.duty_max
        ),
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    fn fwd_turns() -> Turns {
        Turns {
            primary: 12,
            secondaries: vec![10],
            reset: Some(12),
        }
    }

    #[test]
    fn worst_case_picks_the_right_corner() {
        let s = Spec::demo_forward();
        let wc = worst_case(&s, &fwd_turns(), Some(500e-6), 76e-6).unwrap();
        // Forward: duty and primary RMS are worst at Vin min; switch voltage at Vin max.
        assert_eq!(wc.get("duty").unwrap().corner, Corner::VinMin);
        assert_eq!(wc.get("primary.rms").unwrap().corner, Corner::VinMin);
        assert_eq!(wc.get("switch_voltage").unwrap().corner, Corner::VinMax);
        assert_eq!(
            wc.get("switch_voltage").unwrap().value,
            wc.at_vin_max.switch_voltage
        );
        assert!(wc.get("nope").is_none());
    }

    #[test]
    fn bad_arguments_named() {
        let s = Spec::demo_forward();
        let t = fwd_turns();
        assert_eq!(
            operating_point(&s, &t, None, 0.0, 48.0)
                .unwrap_err()
                .field(),
            Some("ae")
        );
        assert_eq!(
            operating_point(&s, &t, None, f64::NAN, 48.0)
                .unwrap_err()
                .field(),
            Some("ae")
        );
        assert_eq!(
            operating_point(&s, &t, Some(-1.0), 76e-6, 48.0)
                .unwrap_err()
                .field(),
            Some("lp")
        );
        assert_eq!(
            operating_point(&s, &t, None, 76e-6, f64::NAN)
                .unwrap_err()
                .field(),
            Some("vin")
        );
        let t0 = Turns {
            primary: 0,
            ..fwd_turns()
        };
        assert_eq!(
            operating_point(&s, &t0, None, 76e-6, 48.0)
                .unwrap_err()
                .field(),
            Some("turns.primary")
        );
        let t1 = Turns {
            secondaries: vec![10, 3],
            ..fwd_turns()
        };
        assert_eq!(
            operating_point(&s, &t1, None, 76e-6, 48.0)
                .unwrap_err()
                .field(),
            Some("turns.secondaries")
        );
        let t2 = Turns {
            reset: None,
            ..fwd_turns()
        };
        assert_eq!(
            operating_point(&s, &t2, None, 76e-6, 48.0)
                .unwrap_err()
                .field(),
            Some("turns.reset")
        );
        let f = Spec::demo_flyback();
        let tf = Turns {
            primary: 40,
            secondaries: vec![5],
            reset: None,
        };
        assert_eq!(
            operating_point(&f, &tf, None, 76e-6, 150.0)
                .unwrap_err()
                .field(),
            Some("lp")
        );
    }
}
