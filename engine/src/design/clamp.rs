//! The leakage spike and its clamp: what the leakage inductance does to the
//! switch at turn-off, and what the clamp dissipates.
//!
//! At turn-off the switch current Ipk still flows in the leakage inductance
//! Llk (referred to the primary, `winding::leakage`), which the magnetising
//! side cannot take over: the switch node rises until a clamp conducts.
//!
//! * **RCD clamp** (flyback; single-switch forward with a reset winding;
//!   push-pull): the clamp holds the primary at Vc while the magnetising
//!   inductance holds it at the reflected voltage Vr, so the leakage current
//!   falls linearly at (Vc − Vr)/Llk, for t = Llk·Ipk/(Vc − Vr), and the
//!   clamp takes Vc·Ipk·t/2 each turn-off:
//!   Pclamp = ½·Llk·Ipk²·fsw·Vc/(Vc − Vr). The switch sees Vin + Vc.
//!   Source: C. Basso, *Switch-Mode Power Supplies: SPICE Simulations and
//!   Practical Designs*, McGraw-Hill 2008, ch. 7 (flyback converters), the
//!   design of the RCD clamp (chapter and form from memory of that text,
//!   not checked against a copy; the derivation above is our own and the
//!   test integrates the clamp current numerically against it).
//!   Vr is the flyback's reflected voltage (Np/Ns1)·(V1 + Vf1), the
//!   forward's reset voltage Vin·Np/Nr, the push-pull's Vin (the other half
//!   of the primary). Default Vc = 1.5·Vr (common practice, no source): the
//!   clamp then dissipates three times the leakage energy, a usual trade of
//!   clamp loss against switch voltage.
//! * **Clamp to the rail** (two-switch forward: its diodes; half and full
//!   bridge: the body diodes): the switch sees Vin, and the leakage energy
//!   ½·Llk·Ipk² per turn-off is returned to the input, not dissipated
//!   (Erickson & Maksimovic 2nd ed. §6.3.2 for the two-switch forward's
//!   diodes).
//!
//! Assumptions, stated on the report: ideal clamp diode (no forward drop,
//! no reverse recovery), no ringing of the switch node's capacitance, the
//! clamp voltage constant over the period (large clamp capacitor), the
//! whole switch current Ipk in the leakage at turn-off. Push-pull and the
//! bridges turn off twice per period. The clamp loss is a converter loss,
//! not a loss of the magnetic: the report keeps it apart from `losses`.

use crate::error::{Error, Result};
use crate::topology::{Corner, Topology, Turns, WorstCase};
use serde::Serialize;

/// How the leakage energy leaves.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum ClampKind {
    /// An RCD clamp at Vc dissipates it.
    Dissipative,
    /// Diodes to the input rail return it.
    Rail,
}

/// The clamp at one line corner.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ClampPoint {
    pub corner: Corner,
    pub vin: f64,
    /// Switch current at turn-off, A.
    pub peak_current: f64,
    /// Reflected (or reset) voltage Vr, V.
    pub reflected_voltage: f64,
    /// Voltage across the clamp, V.
    pub clamp_voltage: f64,
    /// Vin + Vc (dissipative) or Vin (rail), V.
    pub switch_peak_voltage: f64,
    /// Leakage energy per turn-off, ½·Llk·Ipk², J.
    pub energy: f64,
    /// Power dissipated in the clamp, W (0 for a rail clamp).
    pub dissipation: f64,
    /// Power returned to the input, W (0 for a dissipative clamp).
    pub returned: f64,
}

/// The leakage spike and its clamp (module docs).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Clamp {
    pub kind: ClampKind,
    /// Leakage inductance referred to the primary, H.
    pub leakage: f64,
    /// The clamp voltage was the default 1.5·Vr (false: `choices.clamp_voltage`).
    pub default_voltage: bool,
    /// Both corners.
    pub corners: Vec<ClampPoint>,
    /// The highest switch voltage and its corner.
    pub switch_peak_voltage: f64,
    pub voltage_corner: Corner,
    /// The largest clamp dissipation and its corner, W.
    pub dissipation: f64,
    pub dissipation_corner: Corner,
    pub assumptions: String,
}

/// Default clamp voltage over the reflected voltage (common practice, no source).
pub const DEFAULT_CLAMP_RATIO: f64 = 1.5;

/// The clamp of a design with `leakage` (H, referred to the primary), its
/// turns and both operating points; `clamp_voltage` is the user's Vc.
pub fn clamp(
    topology: Topology,
    _turns: &Turns,
    waves: &WorstCase,
    leakage: f64,
    clamp_voltage: Option<f64>,
) -> Result<Clamp> {
    if !(leakage.is_finite() && leakage >= 0.0) {
        return Err(Error::infeasible(Some("leakage"), "the leakage inductance is not a finite positive value"));
    }
    let (kind, per_period) = match topology {
        Topology::Flyback | Topology::Forward => (ClampKind::Dissipative, 1.0),
        Topology::PushPull => (ClampKind::Dissipative, 2.0),
        Topology::TwoSwitchForward => (ClampKind::Rail, 1.0),
        Topology::HalfBridge | Topology::FullBridge => (ClampKind::Rail, 2.0),
        Topology::Inductor => {
            return Err(Error::input("spec.topology", "an inductor has one winding and no leakage clamp"))
        }
    };
    let mut corners = Vec::with_capacity(2);
    for (corner, op) in [(Corner::VinMin, &waves.at_vin_min), (Corner::VinMax, &waves.at_vin_max)] {
        let vin = op.vin;
        let ipk = op.switch_peak_current;
        let f = 1.0 / op.period;
        let energy = 0.5 * leakage * ipk * ipk;
        let vr = match topology {
            // Vr = Vsw,flat − Vin: Vor for the flyback, Vin·Np/Nr for the forward, Vin for push-pull.
            Topology::Flyback | Topology::Forward | Topology::PushPull => (op.switch_voltage - vin).max(0.0),
            _ => 0.0,
        };
        let point = match kind {
            ClampKind::Dissipative => {
                let vc = clamp_voltage.unwrap_or(DEFAULT_CLAMP_RATIO * vr);
                if vc <= vr * (1.0 + 1e-9) {
                    return Err(Error::infeasible(
                        Some("choices.clamp_voltage"),
                        format!(
                            "the clamp voltage {vc:.1} V must exceed the reflected voltage {vr:.1} V at Vin {vin:.1} V, \
                             or the clamp conducts the output's energy; leave it empty for 1.5 × Vr"
                        ),
                    ));
                }
                ClampPoint {
                    corner,
                    vin,
                    peak_current: ipk,
                    reflected_voltage: vr,
                    clamp_voltage: vc,
                    switch_peak_voltage: vin + vc,
                    energy,
                    dissipation: energy * per_period * f * vc / (vc - vr),
                    returned: 0.0,
                }
            }
            ClampKind::Rail => ClampPoint {
                corner,
                vin,
                peak_current: ipk,
                reflected_voltage: vr,
                clamp_voltage: vin,
                switch_peak_voltage: op.switch_voltage.max(vin),
                energy,
                dissipation: 0.0,
                returned: energy * per_period * f,
            },
        };
        corners.push(point);
    }
    let worst_v = corners
        .iter()
        .max_by(|a, b| a.switch_peak_voltage.total_cmp(&b.switch_peak_voltage))
        .map(|c| (c.switch_peak_voltage, c.corner))
        .unwrap_or((0.0, Corner::VinMax));
    let worst_p = corners
        .iter()
        .max_by(|a, b| (a.dissipation + a.returned).total_cmp(&(b.dissipation + b.returned)))
        .map(|c| (c.dissipation, c.corner))
        .unwrap_or((0.0, Corner::VinMin));
    let assumptions = match kind {
        ClampKind::Dissipative => "RCD clamp at Vc: ideal clamp diode, no ringing, Vc constant, the whole switch \
             current in the leakage at turn-off; Pclamp = ½·Llk·Ipk²·fsw·Vc/(Vc − Vr) per turn-off (Basso 2008)",
        ClampKind::Rail => "diodes to the input rail: ideal diodes, no ringing; the leakage energy ½·Llk·Ipk² per \
             turn-off returns to the input",
    };
    Ok(Clamp {
        kind,
        leakage,
        default_voltage: clamp_voltage.is_none(),
        corners,
        switch_peak_voltage: worst_v.0,
        voltage_corner: worst_v.1,
        dissipation: worst_p.0,
        dissipation_corner: worst_p.1,
        assumptions: assumptions.to_string(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::{evaluate, Design};

    #[test]
    fn flyback_clamp_energy_is_the_integral_of_the_clamp_current() {
        // The leakage current falls linearly from Ipk at (Vc − Vr)/Llk; the
        // clamp takes ∫Vc·i dt. Integrated numerically here (midpoint rule),
        // against Basso's closed form in the engine.
        let r = evaluate(&Design::demo_flyback()).unwrap();
        let c = r.clamp.as_ref().expect("a two-winding flyback has a clamp");
        for p in &c.corners {
            let slope = (p.clamp_voltage - p.reflected_voltage) / c.leakage;
            let t = p.peak_current / slope;
            let n = 10_000;
            let dt = t / n as f64;
            let e: f64 = (0..n).map(|k| p.clamp_voltage * (p.peak_current - slope * (k as f64 + 0.5) * dt) * dt).sum();
            let want = e * r.frequency;
            assert!((p.dissipation - want).abs() < 1e-6 * want, "{} vs {want}", p.dissipation);
            // Default Vc = 1.5·Vr: Vc/(Vc − Vr) = 3 (common practice, no source).
            assert!((p.dissipation - 3.0 * p.energy * r.frequency).abs() < 1e-9 * p.dissipation);
            // The switch sees Vin + Vc.
            assert!((p.switch_peak_voltage - p.vin - p.clamp_voltage).abs() < 1e-9);
        }
        assert!(c.dissipation > 0.0 && c.switch_peak_voltage > r.waveforms.get("switch_voltage").unwrap().value);
    }

    #[test]
    fn clamp_voltage_at_or_below_vr_is_refused_with_its_field() {
        let mut d = Design::demo_flyback();
        d.choices.clamp_voltage = Some(10.0);
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("choices.clamp_voltage"));
        // A user Vc above Vr is used as given.
        let r = evaluate(&Design::demo_flyback()).unwrap();
        let vr = r.clamp.as_ref().unwrap().corners[0].reflected_voltage;
        d.choices.clamp_voltage = Some(2.0 * vr);
        let c = evaluate(&d).unwrap().clamp.unwrap();
        assert!(!c.default_voltage);
        assert!(c.corners.iter().all(|p| p.clamp_voltage == 2.0 * vr));
    }

    #[test]
    fn forward_reset_voltage_and_two_switch_rail() {
        // Single switch: Vr = Vin·Np/Nr (E&M §6.3.2, the reset winding's
        // clamp of the primary), the switch at Vin + Vc.
        let r = evaluate(&Design::demo_forward()).unwrap();
        let c = r.clamp.as_ref().unwrap();
        let nr = r.turns.reset.unwrap() as f64;
        for p in &c.corners {
            let want = p.vin * r.turns.primary as f64 / nr;
            assert!((p.reflected_voltage - want).abs() < 1e-9 * want);
            assert_eq!(c.kind, ClampKind::Dissipative);
        }
        // Two switch: the diodes clamp each switch to Vin; energy returned.
        let mut d = Design::demo_forward();
        d.spec.topology = Topology::TwoSwitchForward;
        d.spec.duty_max = 0.45;
        let r = evaluate(&d).unwrap();
        let c = r.clamp.as_ref().unwrap();
        assert_eq!(c.kind, ClampKind::Rail);
        for p in &c.corners {
            assert_eq!(p.dissipation, 0.0);
            assert!((p.returned - p.energy * r.frequency).abs() < 1e-12);
            assert!((p.switch_peak_voltage - p.vin).abs() < 1e-9);
        }
    }
}
