//! The inductor kind: a DC-biased inductor with a triangular ripple, on a
//! gapped core with one winding. It covers the inductor of a buck or a
//! boost converter and the output choke of a forward-type converter (a
//! buck whose input is the rectified secondary voltage).
//!
//! # Model (Erickson & Maksimovic, Fundamentals of Power Electronics, 2nd
//! ed., §2.2–2.3: inductor volt-second balance and current ripple)
//!
//! Steady state, CCM, ideal switch; the output's `rectifier_drop` Vf is in
//! series with the inductor while it freewheels (off-time).
//!
//! * **Buck**: on-time L sees Vin − Vo, off-time −(Vo + Vf). Volt-second
//!   balance gives D = (Vo + Vf)/(Vin + Vf). IL = Io.
//! * **Boost**: on-time L sees Vin, off-time −(Vo + Vf − Vin), so
//!   D = 1 − Vin/(Vo + Vf). IL = Pin/Vin with Pin = Pout/η (the input
//!   power balance; conservative against the ideal Io/(1 − D)).
//! * Ripple ΔI = V_on·D·T/L (both); the current rises from IL − ΔI/2 to
//!   IL + ΔI/2 during D·T and falls back during the rest.
//! * Flux: B(t) = L·i(t)/(N·Ae) (Faraday, N·Φ = L·i), so the peak
//!   Bpk = L·Ipk/(N·Ae) carries the DC bias and the swing is
//!   ΔB = L·ΔI/(N·Ae). The iGSE core loss sees only the swing; the loss
//!   module warns that DC bias raises real ferrite loss.
//! * Target: `inductor.inductance`, or L from the ripple ratio r =
//!   `choke_ripple_ratio`: the smallest L with ΔI ≤ r·IL everywhere in the
//!   input range. Buck: ΔI/IL grows with Vin, worst at Vin max. Boost:
//!   ΔI/IL = Vin²·(1 − Vin/V′)·T/(L·Pin) (V′ = Vo + Vf), largest at
//!   Vin = 2V′/3 inside the range, else at an end.
//! * CCM only: an inductance that lets the current reach zero
//!   (ΔI > 2·IL) is refused with the field to change.
//!
//! The output choke of a forward converter is this buck with
//! Vin = Vs − Vf (Vs the rectified secondary voltage, whose rectifier
//! diode has the same drop Vf): then D = (Vo + Vf)/Vs and the on-time
//! voltage Vs − Vf − Vo, as in the forward model.

use super::spec::{output_field, Spec};
use super::{Ctx, Mode, OperatingPoint, WindingWave};
use crate::error::{in_range, positive, Error, Result};
use crate::waveform::Pwl;
use serde::{Deserialize, Serialize};

/// The converter around the inductor.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Circuit {
    /// Step-down: the inductor in series with the output (also the output
    /// choke of forward, push-pull and bridge converters).
    Buck,
    /// Step-up: the inductor in series with the input.
    Boost,
}

/// What the inductor kind asks, beside the spec's input, first output and
/// frequency.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct InductorOptions {
    pub circuit: Circuit,
    /// Target inductance, H (`None`: from `choke_ripple_ratio`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub inductance: Option<f64>,
}

impl Default for InductorOptions {
    fn default() -> Self {
        InductorOptions {
            circuit: Circuit::Buck,
            inductance: None,
        }
    }
}

impl Spec {
    /// 24 V bus (18–32 V) buck to 5 V 6 A at 150 kHz, diode freewheel
    /// (0.5 V), L from a ripple ratio of 0.3 at Vin max. A scenario of our own.
    pub fn demo_inductor() -> Spec {
        Spec {
            topology: super::Topology::Inductor,
            input: super::Input::Dc {
                min: 18.0,
                nominal: 24.0,
                max: 32.0,
            },
            outputs: vec![super::Output {
                voltage: 5.0,
                current: 6.0,
                rectifier_drop: 0.5,
            }],
            frequency: 150e3,
            duty_max: 0.9,
            efficiency: 0.9,
            ambient: 40.0,
            temperature_max: 100.0,
            isolation: super::Isolation::Functional,
            flyback: Default::default(),
            choke_ripple_ratio: 0.3,
            inductor: Some(InductorOptions::default()),
        }
    }
}

/// The inductor's options of `spec` (defaults when absent).
pub fn options(spec: &Spec) -> InductorOptions {
    spec.inductor.unwrap_or_default()
}

/// One line voltage: duty, the inductor's on- and off-time voltages
/// (magnitudes) and its DC current.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct State {
    pub duty: f64,
    /// |v_L| during the on-time, V.
    pub v_on: f64,
    /// |v_L| during the off-time, V.
    pub v_off: f64,
    /// Mean inductor current, A.
    pub i_dc: f64,
}

fn v_out(spec: &Spec) -> f64 {
    spec.outputs
        .first()
        .map_or(0.0, |o| o.voltage + o.rectifier_drop)
}

/// The state at input `vin` (module docs).
pub fn state(spec: &Spec, vin: f64) -> State {
    let o = spec.outputs.first().copied();
    let (vo, vf, io) = o.map_or((0.0, 0.0, 0.0), |o| (o.voltage, o.rectifier_drop, o.current));
    match options(spec).circuit {
        Circuit::Buck => State {
            duty: (vo + vf) / (vin + vf),
            v_on: vin - vo,
            v_off: vo + vf,
            i_dc: io,
        },
        Circuit::Boost => State {
            duty: 1.0 - vin / (vo + vf),
            v_on: vin,
            v_off: vo + vf - vin,
            i_dc: spec.input_power() / vin,
        },
    }
}

/// Peak-to-peak ripple at `vin` with inductance `l`, A.
pub fn ripple(spec: &Spec, vin: f64, l: f64) -> f64 {
    let s = state(spec, vin);
    s.v_on * s.duty / (spec.frequency * l)
}

/// Input voltages the worst cases are taken over: both ends and a scan
/// between them (the boost's ripple and peak have interior maxima).
fn scan(spec: &Spec) -> Result<Vec<f64>> {
    let dc = spec.dc_range()?;
    let mut v: Vec<f64> = (0..=32)
        .map(|k| dc.min + (dc.max - dc.min) * k as f64 / 32.0)
        .collect();
    let v_int = 2.0 * v_out(spec) / 3.0;
    if v_int > dc.min && v_int < dc.max {
        v.push(v_int);
    }
    Ok(v)
}

/// The target inductance, H: the one given, else the smallest L with
/// ΔI ≤ r·IL over the whole input range (module docs).
pub fn target_inductance(spec: &Spec) -> Result<f64> {
    if let Some(l) = options(spec).inductance {
        return Ok(l);
    }
    let r = spec.choke_ripple_ratio;
    let mut l: f64 = 0.0;
    for vin in scan(spec)? {
        let s = state(spec, vin);
        l = l.max(s.v_on * s.duty / (spec.frequency * r * s.i_dc));
    }
    positive("choke_ripple_ratio", l, "H")?;
    in_range("inductor.inductance", l, 1e-9, 10.0, "H")
}

/// Largest peak current over the input range with inductance `l`, A.
pub fn peak_current(spec: &Spec, l: f64) -> Result<f64> {
    let mut ipk: f64 = 0.0;
    for vin in scan(spec)? {
        let s = state(spec, vin);
        ipk = ipk.max(s.i_dc + 0.5 * ripple(spec, vin, l));
    }
    Ok(ipk)
}

/// The inductor kind's own checks (called by `Spec::validate`).
pub(crate) fn validate(spec: &Spec) -> Result<()> {
    if spec.outputs.len() != 1 {
        return Err(Error::input(
            "outputs",
            "the inductor kind has exactly one output: the load its current feeds",
        ));
    }
    let o = &spec.outputs[0];
    let dc = spec.dc_range()?;
    let vo = o.voltage + o.rectifier_drop;
    match options(spec).circuit {
        Circuit::Buck if vo >= dc.min + o.rectifier_drop => {
            return Err(Error::input(
                &output_field(0, "voltage"),
                format!(
                    "a buck's output plus its rectifier drop ({vo:.2} V) must stay below the lowest input ({:.2} V)",
                    dc.min + o.rectifier_drop
                ),
            ));
        }
        Circuit::Boost if vo <= dc.max => {
            return Err(Error::input(
                &output_field(0, "voltage"),
                format!(
                    "a boost's output plus its rectifier drop ({vo:.2} V) must be above the highest input ({:.2} V)",
                    dc.max
                ),
            ));
        }
        _ => {}
    }
    if let Some(l) = options(spec).inductance {
        positive("inductor.inductance", l, "H")?;
        in_range("inductor.inductance", l, 1e-9, 10.0, "H")?;
    } else if spec.choke_ripple_ratio < 0.01 {
        return Err(Error::input(
            "choke_ripple_ratio",
            "give a ripple ratio of at least 0.01, or the inductance (inductor.inductance)",
        ));
    }
    Ok(())
}

/// One period at `vin`: the winding's DC + triangle current, its voltage
/// L·di/dt and B(t) = L·i/(N·Ae) (module docs). `ctx.lp` is the inductance
/// as wound.
pub(crate) fn operating_point(ctx: &Ctx, vin: f64) -> Result<OperatingPoint> {
    let spec = ctx.spec;
    let l = ctx
        .lp
        .ok_or_else(|| Error::input("lp", "the inductor needs its inductance"))?;
    let t = 1.0 / spec.frequency;
    let n = ctx.turns.primary as f64;
    let s = state(spec, vin);
    let circuit = options(spec).circuit;
    if !(s.duty > 0.0 && s.duty < 1.0 && s.v_on > 0.0 && s.i_dc > 0.0) {
        return Err(Error::infeasible(
            Some(&output_field(0, "voltage")),
            format!(
                "at Vin {vin:.2} V the {} cannot reach {:.2} V",
                match circuit {
                    Circuit::Buck => "buck",
                    Circuit::Boost => "boost",
                },
                spec.outputs[0].voltage
            ),
        ));
    }
    if s.duty > spec.duty_max * (1.0 + 1e-12) {
        return Err(Error::infeasible(
            Some("duty_max"),
            format!(
                "{:.2} V needs D = {:.3} at Vin {vin:.2} V, above duty_max {}; raise duty_max",
                spec.outputs[0].voltage, s.duty, spec.duty_max
            ),
        ));
    }
    let t_on = s.duty * t;
    let di = s.v_on * t_on / l;
    let mode = if di > 2.0 * s.i_dc * (1.0 + 1e-9) {
        let field = if options(spec).inductance.is_some() {
            "inductor.inductance"
        } else {
            "choke_ripple_ratio"
        };
        return Err(Error::infeasible(
            Some(field),
            format!(
                "the ripple {di:.2} A exceeds twice the DC current {:.2} A at Vin {vin:.2} V: \
                 the inductor would run discontinuous; raise the inductance",
                s.i_dc
            ),
        ));
    } else if di >= 2.0 * s.i_dc * (1.0 - 1e-9) {
        Mode::Boundary
    } else {
        Mode::Ccm
    };
    let (i_lo, i_hi) = (s.i_dc - 0.5 * di, s.i_dc + 0.5 * di);
    let current = Pwl::new(t, vec![(0.0, i_lo), (t_on, i_hi), (t, i_lo)])?;
    let voltage = Pwl::new(
        t,
        vec![(0.0, s.v_on), (t_on, s.v_on), (t_on, -s.v_off), (t, -s.v_off)],
    )?;
    let on_only = Pwl::new(t, vec![(0.0, i_lo), (t_on, i_hi), (t_on, 0.0), (t, 0.0)])?;
    let flux = current.scaled(l / (n * ctx.ae));
    let delta_b = l * di / (n * ctx.ae);
    let b_peak = l * i_hi / (n * ctx.ae);
    let (input_current, switch_voltage) = match circuit {
        Circuit::Buck => (on_only.clone(), vin),
        Circuit::Boost => (current.clone(), v_out(spec)),
    };
    let o = spec.outputs[0];
    let warnings = vec![
        "the core loss is that of the ripple flux swing only (iGSE); the DC bias raises the real \
         ferrite loss by an amount the loss data cannot tell"
            .to_string(),
    ];
    Ok(OperatingPoint {
        topology: spec.topology,
        vin,
        period: t,
        duty: s.duty,
        mode,
        windings: vec![WindingWave::new(
            "winding".into(),
            ctx.turns.primary,
            current,
            voltage,
        )],
        input_current,
        flux,
        delta_b,
        b_peak,
        volt_seconds: s.v_on * t_on,
        switch_voltage,
        switch_peak_current: i_hi,
        switch_rms_current: on_only.rms(),
        magnetising_peak: i_hi,
        input_power: ctx.p_in,
        output_power: ctx.p_out,
        secondary_power: (o.voltage + o.rectifier_drop) * o.current,
        output_voltages: vec![o.voltage],
        warnings,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::topology::{worst_case, Input, Output, Topology, Turns};

    pub(crate) fn buck() -> Spec {
        Spec {
            topology: Topology::Inductor,
            input: Input::Dc {
                min: 18.0,
                nominal: 24.0,
                max: 32.0,
            },
            outputs: vec![Output {
                voltage: 5.0,
                current: 6.0,
                rectifier_drop: 0.5,
            }],
            frequency: 150e3,
            duty_max: 0.9,
            ..Spec::demo_forward()
        }
    }

    fn turns(n: u32) -> Turns {
        Turns {
            primary: n,
            secondaries: vec![],
            reset: None,
        }
    }

    /// Volt-second balance (E&M §2.2): ⟨v_L⟩ = 0 at both corners, the
    /// mean current is IL, and the ripple is V_on·D·T/L.
    #[test]
    fn buck_balances_volt_seconds_and_meets_the_ripple() {
        let s = buck();
        s.validate().unwrap();
        let l = target_inductance(&s).unwrap();
        // r at Vin max: ΔI = (Vin − Vo)·D/(f·L) = 0.2·6 A.
        let d = 5.5 / 32.5;
        assert!(((32.0 - 5.0) * d / (150e3 * l) - 0.2 * 6.0).abs() < 1e-9);
        let wc = worst_case(&s, &turns(20), Some(l), 50e-6).unwrap();
        for op in [&wc.at_vin_min, &wc.at_vin_max] {
            let w = &op.windings[0];
            assert!(w.voltage.mean().abs() < 1e-9 * 30.0, "{}", w.voltage.mean());
            assert!((w.mean - 6.0).abs() < 1e-9);
            // B = L·i/(N·Ae): Bpk from the peak current.
            assert!((op.b_peak - l * w.peak / (20.0 * 50e-6)).abs() < 1e-12);
            assert_eq!(op.mode, Mode::Ccm);
        }
        assert!(wc.at_vin_max.delta_b > wc.at_vin_min.delta_b);
        let ipk = peak_current(&s, l).unwrap();
        assert!((ipk - 6.6).abs() < 1e-9);
    }

    /// Boost: D = 1 − Vin/(Vo + Vf), IL = Pin/Vin, ⟨v_L⟩ = 0; the ripple
    /// ratio bound holds at every input of the range and binds inside it.
    #[test]
    fn boost_ripple_bound_holds_over_the_range() {
        let mut s = buck();
        s.inductor = Some(InductorOptions {
            circuit: Circuit::Boost,
            inductance: None,
        });
        s.outputs[0].voltage = 48.0;
        s.efficiency = 0.95;
        s.validate().unwrap();
        let l = target_inductance(&s).unwrap();
        let mut worst: f64 = 0.0;
        for k in 0..=200 {
            let vin = 18.0 + 14.0 * k as f64 / 200.0;
            let st = state(&s, vin);
            worst = worst.max(ripple(&s, vin, l) / st.i_dc);
        }
        assert!(worst <= 0.2 * (1.0 + 1e-9) && worst > 0.2 * 0.999, "{worst}");
        let wc = worst_case(&s, &turns(20), Some(l), 50e-6).unwrap();
        let op = &wc.at_vin_min;
        assert!(op.windings[0].voltage.mean().abs() < 1e-9);
        assert!((op.input_current.mean() * 18.0 - s.input_power()).abs() < 1e-9);
        assert!((op.duty - (1.0 - 18.0 / 48.5)).abs() < 1e-12);
    }

    #[test]
    fn bad_inductor_fields_are_named() {
        let mut s = buck();
        s.outputs[0].voltage = 20.0;
        assert_eq!(s.validate().unwrap_err().field(), Some("outputs[0].voltage"));
        let mut s = buck();
        s.inductor = Some(InductorOptions {
            circuit: Circuit::Buck,
            inductance: Some(-1.0),
        });
        assert_eq!(s.validate().unwrap_err().field(), Some("inductor.inductance"));
        let mut s = buck();
        s.choke_ripple_ratio = 0.0;
        assert_eq!(s.validate().unwrap_err().field(), Some("choke_ripple_ratio"));
        // A small given L runs discontinuous: refused, naming it.
        let mut s = buck();
        s.inductor = Some(InductorOptions {
            circuit: Circuit::Buck,
            inductance: Some(1e-6),
        });
        let e = worst_case(&s, &turns(5), Some(1e-6), 50e-6).unwrap_err();
        assert_eq!(e.field(), Some("inductor.inductance"));
        let mut s = buck();
        s.outputs.push(s.outputs[0]);
        assert_eq!(s.validate().unwrap_err().field(), Some("outputs"));
    }
}
