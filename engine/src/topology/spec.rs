//! What the user asks of a converter: the specification every topology
//! model and the design solver start from.
//!
//! A [`Spec`] is plain data (serde, SI units, °C for temperatures). It says
//! *what* is wanted (input range, outputs, frequency, limits) and a few
//! design *choices* that the topology helpers need (the flyback's reflected
//! voltage or turns ratio and its ripple ratio, the output chokes' ripple
//! ratio). It never holds turns or a core: those are the solver's answer.
//!
//! # Input: DC range or rectified AC line
//!
//! The converter sees a DC bus. [`Input::Dc`] gives it directly.
//! [`Input::Ac`] describes a mains line rectified by a full-wave bridge onto
//! a bulk capacitor; [`Spec::dc_range`] turns it into the DC range with
//! this model (common practice, no source; the constant-power energy balance
//! is the usual hand method for sizing the bulk capacitor):
//!
//! * Peak of the rectified line: Vpk = √2·Vac − V_bridge (two diodes of the
//!   bridge conduct in series).
//! * Between charging pulses the capacitor alone feeds the converter at
//!   constant input power Pin = Pout/η. Energy balance over the discharge
//!   time t_d: ½·C·(Vpk² − Vv²) = Pin·t_d, so the valley is
//!   Vv = √(Vpk² − 2·Pin·t_d/C).
//! * The discharge lasts half a line period less the conduction time:
//!   t_d = 1/(2·f_line) − t_c, and the bridge conducts while the rectified
//!   sine climbs from the valley to its crest:
//!   t_c = arccos(Vv/Vpk)/(2π·f_line). The two equations are solved
//!   together by fixed-point iteration. (The capacitor actually follows the
//!   sine slightly past its crest; neglecting that makes Vv a little low,
//!   which is the conservative side for the design.)
//! * Alternatively a ripple figure: Vv = Vpk·(1 − ripple_ratio).
//!
//! The DC range is then: min = valley at Vac min and full load (the
//! converter must still regulate there, so every Vin-min stress is taken at
//! the valley, which is conservative); max = Vpk at Vac max (no-load crest);
//! nominal = (Vpk + Vv)/2 at Vac nominal.
//!
//! # Safety
//!
//! [`Spec::safety_cautions`] returns caution text when the input is mains
//! or any specified voltage exceeds the ES1 limits of IEC 62368-1
//! (60 V DC, 42.4 V peak / 30 V RMS AC; IEC 62368-1:2018 Table 4, from
//! memory). Magwright never judges a design safe: insulation, creepage,
//! clearance and tests are for IEC 62368-1 / IEC 61558, local codes and a
//! licensed, qualified engineer.

use crate::error::{in_range, non_negative, positive, Error, Result};
use serde::{Deserialize, Serialize};

/// Largest number of outputs a spec may have.
pub const MAX_OUTPUTS: usize = 4;

pub use super::cautions::{ES1_AC_PEAK_LIMIT, ES1_DC_LIMIT, STANDING_CAUTION};

/// The converter circuit around the magnetic.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Topology {
    /// Flyback: a coupled inductor stores energy while the switch is on
    /// and releases it to the outputs while it is off.
    Flyback,
    /// Single-switch forward with a reset winding (turns `Turns::reset`)
    /// that returns the magnetising energy to the input.
    Forward,
    /// Two-switch forward: the core resets through two clamp diodes into
    /// the input, so D ≤ 0.5 and each switch sees only Vin.
    TwoSwitchForward,
    /// Push-pull: centre-tapped primary and secondary, bipolar flux.
    PushPull,
    /// Half bridge: one primary across the midpoint of split input
    /// capacitors (±Vin/2), centre-tapped secondaries.
    HalfBridge,
    /// Full bridge: one primary driven ±Vin, centre-tapped secondaries.
    FullBridge,
    /// A DC-biased inductor with ripple (a buck's or boost's inductor, or
    /// the output choke of a forward-type converter): one winding on a
    /// gapped core. Its circuit and target are `Spec::inductor`
    /// (`topology::inductor`).
    Inductor,
}

impl Topology {
    pub fn name(self) -> &'static str {
        match self {
            Topology::Flyback => "flyback",
            Topology::Forward => "single-switch forward",
            Topology::TwoSwitchForward => "two-switch forward",
            Topology::PushPull => "push-pull",
            Topology::HalfBridge => "half bridge",
            Topology::FullBridge => "full bridge",
            Topology::Inductor => "inductor",
        }
    }
}

/// Capacitor on the rectified line: its value, or a ripple figure.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case", deny_unknown_fields)]
pub enum Bulk {
    /// Bulk capacitance, F.
    Capacitance { farads: f64 },
    /// Valley-to-crest ripple as a fraction of the crest Vpk (0 to 0.8):
    /// Vv = Vpk·(1 − ratio).
    RippleRatio { ratio: f64 },
}

/// The converter's input.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case", deny_unknown_fields)]
pub enum Input {
    /// A DC bus, V.
    Dc { min: f64, nominal: f64, max: f64 },
    /// An AC line (RMS volts, Hz) rectified by a full-wave bridge onto a
    /// bulk capacitor.
    Ac {
        vac_min: f64,
        vac_nominal: f64,
        vac_max: f64,
        /// Line frequency, Hz (use the lowest the product must accept).
        line_frequency: f64,
        bulk: Bulk,
        /// Drop of the two bridge diodes in series, V (typical 1.6 V,
        /// common practice, no source).
        bridge_drop: f64,
    },
}

/// The DC bus the switch sees, V.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct DcRange {
    pub min: f64,
    pub nominal: f64,
    pub max: f64,
}

/// One output.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Output {
    /// Output voltage, V.
    pub voltage: f64,
    /// Full-load output current, A.
    pub current: f64,
    /// Forward drop of its rectifier (and, for forward/push-pull, of the
    /// freewheeling diode), V.
    pub rectifier_drop: f64,
}

/// What the insulation between input and outputs must provide.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Isolation {
    /// Needed for the circuit to work; no protection against shock.
    Functional,
    /// One level of protection against shock.
    Basic,
    /// A single insulation system equivalent to double insulation.
    Reinforced,
}

/// How the flyback's turns ratio is chosen.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", content = "value", rename_all = "snake_case", deny_unknown_fields)]
pub enum FlybackRatio {
    /// The ratio that gives `duty_max` at Vin min in CCM.
    FromDutyMax,
    /// Reflected voltage Vor = (Np/Ns1)·(V1 + Vf1), V.
    ReflectedVoltage(f64),
    /// Turns ratio Np/Ns1.
    TurnsRatio(f64),
}

/// Flyback design choices.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FlybackOptions {
    pub ratio: FlybackRatio,
    /// Primary ripple ratio at Vin min and full load: r = ΔIp/Ic with Ic
    /// the centre of the primary current ramp. r < 2 is CCM, r = 2 the
    /// boundary, r > 2 DCM. Sets Lp (see `sizing::flyback_lp_from_ripple`).
    pub ripple_ratio: f64,
}

impl Default for FlybackOptions {
    /// From duty max, r = 0.6 (common practice, no source).
    fn default() -> Self {
        FlybackOptions {
            ratio: FlybackRatio::FromDutyMax,
            ripple_ratio: 0.6,
        }
    }
}

fn default_choke_ripple() -> f64 {
    0.2
}

/// A converter specification (SI units, °C).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Spec {
    pub topology: Topology,
    pub input: Input,
    /// One to four outputs; the first is the regulated one.
    pub outputs: Vec<Output>,
    /// Switching frequency of each switch, Hz. For the push-pull this is
    /// also the transformer's flux frequency; its output chokes see 2·f.
    pub frequency: f64,
    /// Largest duty the controller may command: on-time of one switch over
    /// its period. Push-pull and two-switch forward: at most 0.5.
    pub duty_max: f64,
    /// Estimated efficiency, Pout/Pin (0.3 to 1).
    pub efficiency: f64,
    /// Ambient temperature, °C.
    pub ambient: f64,
    /// Highest allowed core temperature of the magnetic, °C.
    pub temperature_max: f64,
    pub isolation: Isolation,
    /// Flyback only: turns-ratio choice and ripple ratio.
    #[serde(default)]
    pub flyback: FlybackOptions,
    /// Forward and push-pull: output choke ripple ΔIL/Iout at Vin max
    /// (its largest), default 0.2 (common practice, no source). Each output
    /// has its own choke with the same ratio. 0 ≤ r ≤ 2.
    /// Inductor kind: ΔIL/IL at its largest over the input range, which
    /// sets L when `inductor.inductance` is not given.
    #[serde(default = "default_choke_ripple")]
    pub choke_ripple_ratio: f64,
    /// Inductor kind only: the circuit around the inductor and its target
    /// inductance (`None`: a buck, L from `choke_ripple_ratio`). Left out
    /// of the file when absent.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub inductor: Option<super::inductor::InductorOptions>,
}

/// Field name of output `i`'s member, e.g. "outputs[1].voltage".
pub(crate) fn output_field(i: usize, member: &str) -> String {
    format!("outputs[{i}].{member}")
}

impl Spec {
    /// Offline 24 W flyback, universal AC input (85–265 V, 50 Hz,
    /// 68 µF bulk), 12 V 2 A, 100 kHz, reflected voltage 100 V, reinforced
    /// isolation. A scenario of our own.
    pub fn demo_flyback() -> Self {
        Spec {
            topology: Topology::Flyback,
            input: Input::Ac {
                vac_min: 85.0,
                vac_nominal: 230.0,
                vac_max: 265.0,
                line_frequency: 50.0,
                bulk: Bulk::Capacitance { farads: 68e-6 },
                bridge_drop: 1.6,
            },
            outputs: vec![Output {
                voltage: 12.0,
                current: 2.0,
                rectifier_drop: 0.5,
            }],
            frequency: 100e3,
            duty_max: 0.6,
            efficiency: 0.85,
            ambient: 40.0,
            temperature_max: 110.0,
            isolation: Isolation::Reinforced,
            flyback: FlybackOptions {
                ratio: FlybackRatio::ReflectedVoltage(100.0),
                ripple_ratio: 0.6,
            },
            choke_ripple_ratio: default_choke_ripple(),
            inductor: None,
        }
    }

    /// 48 V bus (36–60 V) single-switch forward, 12 V 10 A, 200 kHz,
    /// basic isolation. A scenario of our own.
    pub fn demo_forward() -> Self {
        Spec {
            topology: Topology::Forward,
            input: Input::Dc {
                min: 36.0,
                nominal: 48.0,
                max: 60.0,
            },
            outputs: vec![Output {
                voltage: 12.0,
                current: 10.0,
                rectifier_drop: 0.5,
            }],
            frequency: 200e3,
            duty_max: 0.45,
            efficiency: 0.9,
            ambient: 40.0,
            temperature_max: 100.0,
            isolation: Isolation::Basic,
            flyback: FlybackOptions::default(),
            choke_ripple_ratio: default_choke_ripple(),
            inductor: None,
        }
    }

    /// 24 V input (18–32 V) push-pull, 12 V 8 A, 100 kHz per switch,
    /// functional isolation. A scenario of our own.
    pub fn demo_push_pull() -> Self {
        Spec {
            topology: Topology::PushPull,
            input: Input::Dc {
                min: 18.0,
                nominal: 24.0,
                max: 32.0,
            },
            outputs: vec![Output {
                voltage: 12.0,
                current: 8.0,
                rectifier_drop: 0.5,
            }],
            frequency: 100e3,
            duty_max: 0.45,
            efficiency: 0.9,
            ambient: 40.0,
            temperature_max: 100.0,
            isolation: Isolation::Functional,
            flyback: FlybackOptions::default(),
            choke_ripple_ratio: default_choke_ripple(),
            inductor: None,
        }
    }

    /// Total output power Σ V·I, W.
    pub fn output_power(&self) -> f64 {
        self.outputs.iter().map(|o| o.voltage * o.current).sum()
    }

    /// Input power Pout/η, W.
    pub fn input_power(&self) -> f64 {
        self.output_power() / self.efficiency
    }

    /// Checks every field; the error names the first bad one.
    pub fn validate(&self) -> Result<()> {
        let f = positive("frequency", self.frequency, "Hz")?;
        in_range("frequency", f, 1e3, 10e6, "Hz")?;
        let d_hi = match self.topology {
            Topology::Flyback | Topology::Forward => 0.95,
            // A buck's or an output choke's on-time may approach the whole period.
            Topology::Inductor => 1.0,
            Topology::TwoSwitchForward
            | Topology::PushPull
            | Topology::HalfBridge
            | Topology::FullBridge => 0.5,
        };
        if self.duty_max.is_finite() && self.duty_max > d_hi && d_hi == 0.5 {
            return Err(Error::input(
                "duty_max",
                format!(
                    "the {} allows at most 0.5 per switch (got {}); lower the duty limit",
                    self.topology.name(),
                    self.duty_max
                ),
            ));
        }
        in_range("duty_max", self.duty_max, 0.01, d_hi, "")?;
        in_range("efficiency", self.efficiency, 0.3, 1.0, "")?;
        in_range("ambient", self.ambient, -55.0, 150.0, "°C")?;
        in_range("temperature_max", self.temperature_max, -55.0, 250.0, "°C")?;
        if self.temperature_max <= self.ambient {
            return Err(Error::input(
                "temperature_max",
                format!("must be above the ambient ({} °C)", self.ambient),
            ));
        }
        if self.outputs.is_empty() {
            return Err(Error::input("outputs", "give at least one output"));
        }
        if self.outputs.len() > MAX_OUTPUTS {
            return Err(Error::input(
                "outputs",
                format!(
                    "at most {MAX_OUTPUTS} outputs (got {}); combine or drop some",
                    self.outputs.len()
                ),
            ));
        }
        for (i, o) in self.outputs.iter().enumerate() {
            let fv = output_field(i, "voltage");
            positive(&fv, o.voltage, "V")?;
            in_range(&fv, o.voltage, 0.0, 2000.0, "V")?;
            let fi = output_field(i, "current");
            positive(&fi, o.current, "A")?;
            in_range(&fi, o.current, 0.0, 500.0, "A")?;
            let fd = output_field(i, "rectifier_drop");
            non_negative(&fd, o.rectifier_drop, "V")?;
            in_range(&fd, o.rectifier_drop, 0.0, 10.0, "V")?;
        }
        // Rectifier drops alone bound the efficiency: η ≤ Pout/(Pout + ΣVf·I).
        let p_out = self.output_power();
        let p_rect: f64 = self
            .outputs
            .iter()
            .map(|o| o.rectifier_drop * o.current)
            .sum();
        let eta_lim = p_out / (p_out + p_rect);
        if self.efficiency > eta_lim * (1.0 + 1e-12) {
            return Err(Error::input(
                "efficiency",
                format!(
                    "the rectifier drops alone limit the efficiency to {eta_lim:.3}; lower the estimate"
                ),
            ));
        }
        self.validate_input()?;
        match self.flyback.ratio {
            FlybackRatio::FromDutyMax => {}
            FlybackRatio::ReflectedVoltage(v) => {
                positive("flyback.ratio", v, "V")?;
                in_range("flyback.ratio", v, 0.0, 5000.0, "V")?;
            }
            FlybackRatio::TurnsRatio(n) => {
                positive("flyback.ratio", n, "")?;
                in_range("flyback.ratio", n, 1e-3, 1e3, "")?;
            }
        }
        positive("flyback.ripple_ratio", self.flyback.ripple_ratio, "")?;
        in_range(
            "flyback.ripple_ratio",
            self.flyback.ripple_ratio,
            0.01,
            20.0,
            "",
        )?;
        in_range("choke_ripple_ratio", self.choke_ripple_ratio, 0.0, 2.0, "")?;
        if self.topology == Topology::Inductor {
            super::inductor::validate(self)?;
        }
        if self.topology == Topology::Flyback {
            let dc = self.dc_range()?;
            let vo = self.outputs[0].voltage + self.outputs[0].rectifier_drop;
            let vor = match self.flyback.ratio {
                FlybackRatio::FromDutyMax => None,
                FlybackRatio::ReflectedVoltage(v) => Some(v),
                FlybackRatio::TurnsRatio(n) => Some(n * vo),
            };
            if let Some(vor) = vor {
                // CCM: D = Vor/(Vin + Vor) (volt-second balance of Lp).
                let d = vor / (dc.min + vor);
                if d > self.duty_max {
                    return Err(Error::infeasible(
                        Some("flyback.ratio"),
                        format!(
                            "a reflected voltage of {vor:.1} V needs D = {d:.3} at Vin min {:.1} V, above duty_max {}; lower the ratio or raise duty_max",
                            dc.min, self.duty_max
                        ),
                    ));
                }
            }
        }
        Ok(())
    }

    fn validate_input(&self) -> Result<()> {
        match self.input {
            Input::Dc { min, nominal, max } => {
                positive("input.min", min, "V")?;
                in_range("input.max", max, 0.0, 2000.0, "V")?;
                // The order of the range first: a swapped pair is reported
                // as such, not as a nominal value outside it.
                if max < min {
                    return Err(Error::input(
                        "input.max",
                        format!("Vin min ({min} V) is above Vin max ({max} V): swap them or correct one"),
                    ));
                }
                in_range("input.nominal", nominal, min, max, "V")?;
            }
            Input::Ac {
                vac_min,
                vac_nominal,
                vac_max,
                line_frequency,
                bulk,
                bridge_drop,
            } => {
                positive("input.vac_min", vac_min, "V")?;
                in_range("input.vac_max", vac_max, 0.0, 1000.0, "V")?;
                if vac_max < vac_min {
                    return Err(Error::input(
                        "input.vac_max",
                        format!("Vac min ({vac_min} V) is above Vac max ({vac_max} V): swap them or correct one"),
                    ));
                }
                in_range("input.vac_nominal", vac_nominal, vac_min, vac_max, "V")?;
                in_range("input.line_frequency", line_frequency, 10.0, 1000.0, "Hz")?;
                in_range("input.bridge_drop", bridge_drop, 0.0, 10.0, "V")?;
                if std::f64::consts::SQRT_2 * vac_min <= bridge_drop {
                    return Err(Error::input(
                        "input.vac_min",
                        "the line crest must exceed the bridge drop",
                    ));
                }
                match bulk {
                    Bulk::Capacitance { farads } => {
                        positive("input.bulk.farads", farads, "F")?;
                        in_range("input.bulk.farads", farads, 0.0, 1.0, "F")?;
                    }
                    Bulk::RippleRatio { ratio } => {
                        in_range("input.bulk.ratio", ratio, 0.0, 0.8, "")?;
                    }
                }
            }
        }
        Ok(())
    }

    /// The DC bus range (see the module docs for the AC model). Checks the
    /// input fields it uses.
    pub fn dc_range(&self) -> Result<DcRange> {
        self.validate_input()?;
        match self.input {
            Input::Dc { min, nominal, max } => Ok(DcRange { min, nominal, max }),
            Input::Ac {
                vac_min,
                vac_nominal,
                vac_max,
                line_frequency,
                bulk,
                bridge_drop,
            } => {
                let p_in = self.input_power();
                if !(p_in.is_finite() && p_in > 0.0) {
                    return Err(Error::input(
                        "outputs",
                        "the output power must be positive to size the bulk valley",
                    ));
                }
                let crest = |vac: f64| std::f64::consts::SQRT_2 * vac - bridge_drop;
                let v_lo = crest(vac_min);
                let v_nom = crest(vac_nominal);
                let valley_min = bulk_valley(v_lo, p_in, line_frequency, bulk)?;
                let valley_nom = bulk_valley(v_nom, p_in, line_frequency, bulk)?;
                Ok(DcRange {
                    min: valley_min,
                    nominal: 0.5 * (v_nom + valley_nom),
                    max: crest(vac_max),
                })
            }
        }
    }
}

/// Bulk-capacitor valley voltage for a rectified crest `v_pk` and input
/// power `p_in` (module docs: constant-power discharge over the conduction
/// gap of a full-wave bridge; common practice, no source).
pub fn bulk_valley(v_pk: f64, p_in: f64, line_frequency: f64, bulk: Bulk) -> Result<f64> {
    match bulk {
        Bulk::RippleRatio { ratio } => Ok(v_pk * (1.0 - ratio)),
        Bulk::Capacitance { farads } => {
            let half = 0.5 / line_frequency;
            let w = 2.0 * std::f64::consts::PI * line_frequency;
            // Fixed point on Vv: t_c = acos(Vv/Vpk)/ω, t_d = T/2 − t_c,
            // Vv² = Vpk² − 2·Pin·t_d/C. Start from no conduction time
            // (the lowest valley) and iterate; the map is monotone.
            let mut vv = 0.0_f64;
            for _ in 0..200 {
                let tc = (vv / v_pk).clamp(0.0, 1.0).acos() / w;
                let td = (half - tc).max(0.0);
                let v2 = v_pk * v_pk - 2.0 * p_in * td / farads;
                if v2 <= 0.0 {
                    if vv == 0.0 {
                        // Even the full half period would empty it: too small.
                        let c_need = 2.0 * p_in * half / (v_pk * v_pk);
                        return Err(Error::infeasible(
                            Some("input.bulk.farads"),
                            format!(
                                "{:.1} µF cannot hold the bus up at {p_in:.1} W; use well above {:.1} µF",
                                farads * 1e6,
                                c_need * 1e6
                            ),
                        ));
                    }
                    break;
                }
                let next = v2.sqrt();
                if (next - vv).abs() <= 1e-9 * v_pk {
                    vv = next;
                    break;
                }
                vv = next;
            }
            if vv < 0.3 * v_pk {
                return Err(Error::infeasible(
                    Some("input.bulk.farads"),
                    format!(
                        "the bus would sag to {:.0} V ({:.0} % of the {:.0} V crest); use a larger bulk capacitor",
                        vv,
                        100.0 * vv / v_pk,
                        v_pk
                    ),
                ));
            }
            Ok(vv)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn demos_validate() {
        for s in [
            Spec::demo_flyback(),
            Spec::demo_forward(),
            Spec::demo_push_pull(),
        ] {
            s.validate().unwrap();
            let dc = s.dc_range().unwrap();
            assert!(
                dc.min > 0.0 && dc.min <= dc.nominal && dc.nominal <= dc.max,
                "{dc:?}"
            );
        }
    }

    /// The valley satisfies its two defining equations (energy balance
    /// ½C(Vpk² − Vv²) = Pin·t_d and t_d = T/2 − acos(Vv/Vpk)/ω), checked
    /// by substituting the result back.
    #[test]
    fn valley_satisfies_energy_balance() {
        let (vpk, p, fl, c) = (118.6, 28.2, 50.0, 68e-6);
        let vv = bulk_valley(vpk, p, fl, Bulk::Capacitance { farads: c }).unwrap();
        let tc = (vv / vpk).acos() / (2.0 * std::f64::consts::PI * fl);
        let td = 0.5 / fl - tc;
        let lhs = 0.5 * c * (vpk * vpk - vv * vv);
        assert!((lhs - p * td).abs() < 1e-6 * p * td, "{lhs} vs {}", p * td);
        assert!(vv < vpk && vv > 0.5 * vpk);
        // More capacitance, higher valley (monotone).
        let vv2 = bulk_valley(vpk, p, fl, Bulk::Capacitance { farads: 2.0 * c }).unwrap();
        assert!(vv2 > vv);
        assert_eq!(
            bulk_valley(100.0, p, fl, Bulk::RippleRatio { ratio: 0.25 }).unwrap(),
            75.0
        );
        assert_eq!(
            bulk_valley(vpk, 500.0, fl, Bulk::Capacitance { farads: 1e-6 })
                .unwrap_err()
                .field(),
            Some("input.bulk.farads")
        );
    }

    #[test]
    fn bad_fields_are_named() {
        type Case = (Box<dyn Fn(&mut Spec)>, &'static str);
        let cases: Vec<Case> = vec![
            (Box::new(|s| s.outputs.clear()), "outputs"),
            (Box::new(|s| s.outputs = vec![s.outputs[0]; 5]), "outputs"),
            (
                Box::new(|s| {
                    s.outputs.push(Output {
                        voltage: f64::NAN,
                        current: 1.0,
                        rectifier_drop: 0.5,
                    })
                }),
                "outputs[1].voltage",
            ),
            (
                Box::new(|s| s.outputs[0].current = -1.0),
                "outputs[0].current",
            ),
            (
                Box::new(|s| s.outputs[0].rectifier_drop = -0.1),
                "outputs[0].rectifier_drop",
            ),
            (Box::new(|s| s.frequency = 0.0), "frequency"),
            (Box::new(|s| s.duty_max = f64::NAN), "duty_max"),
            (Box::new(|s| s.efficiency = 1.5), "efficiency"),
            (Box::new(|s| s.efficiency = 0.99), "efficiency"),
            (Box::new(|s| s.temperature_max = 30.0), "temperature_max"),
            (
                Box::new(|s| {
                    s.input = Input::Dc {
                        min: 40.0,
                        nominal: 30.0,
                        max: 60.0,
                    }
                }),
                "input.nominal",
            ),
            (
                Box::new(|s| {
                    s.input = Input::Dc {
                        min: -1.0,
                        nominal: 30.0,
                        max: 60.0,
                    }
                }),
                "input.min",
            ),
            (
                Box::new(|s| s.choke_ripple_ratio = 3.0),
                "choke_ripple_ratio",
            ),
        ];
        for (m, field) in cases {
            let mut s = Spec::demo_forward();
            m(&mut s);
            assert_eq!(s.validate().unwrap_err().field(), Some(field), "{field}");
        }
        let mut s = Spec::demo_push_pull();
        s.duty_max = 0.6;
        assert_eq!(s.validate().unwrap_err().field(), Some("duty_max"));
        let mut s = Spec::demo_flyback();
        s.flyback.ratio = FlybackRatio::ReflectedVoltage(1000.0);
        assert_eq!(s.validate().unwrap_err().field(), Some("flyback.ratio"));
    }

    #[test]
    fn switch_node_above_es1_raises_the_cautions() {
        // ES1 = 60 V DC (IEC 62368-1 Table 4, from memory): a 48 V input
        // whose switch node reaches 120 V is hazardous on the primary side.
        let s = Spec::demo_forward();
        assert!(s.safety_cautions().is_empty());
        let c = s.cautions_with_switch(Some(120.0));
        assert!(c.iter().any(|t| t.contains("switch node reaches 120 V")), "{c:?}");
        assert!(c.iter().any(|t| t.contains("IEC 61558")), "{c:?}");
        assert!(s.cautions_with_switch(Some(59.0)).is_empty());
        assert!(s.cautions_with_switch(Some(f64::NAN)).iter().any(|t| t.contains("IEC 62368-1")));
        // Mains: no second switch-node caution (the mains one names it).
        let f = Spec::demo_flyback();
        assert_eq!(f.cautions_with_switch(Some(600.0)).len(), f.safety_cautions().len());
    }

    #[test]
    fn cautions_only_above_es1() {
        assert!(!Spec::demo_flyback().safety_cautions().is_empty());
        assert!(Spec::demo_push_pull().safety_cautions().is_empty());
        let mut s = Spec::demo_forward();
        s.input = Input::Dc {
            min: 36.0,
            nominal: 48.0,
            max: 75.0,
        };
        let c = s.safety_cautions();
        assert!(c.iter().any(|t| t.contains("60 V DC")), "{c:?}");
        assert!(c.iter().all(|t| !t.to_lowercase().contains("is safe")));
    }
}
