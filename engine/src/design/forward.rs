//! Single-switch forward converter transformer with a 1:1 reset winding.
//!
//! Relations (Erickson & Maksimovic, *Fundamentals of Power Electronics*,
//! 2nd ed., §6.3.2, the forward converter, and ch. 15, transformer design):
//!
//! * CCM conversion ratio: Vout + Vf = Vin·D·Ns/Np.
//! * A 1:1 reset winding needs D ≤ 1/2 so the core resets each period.
//! * Flux swing (Faraday): ΔB = Vin·D / (f·Np·Ae). With the conversion
//!   ratio this is ΔB = (Vout + Vf)/(f·Ns·Ae), the same at every line
//!   voltage in CCM, so the secondary turns alone set the flux.
//! * Unipolar flux from zero: Bpk = ΔB (remanence neglected).
//! * Ideal transformer (common practice, no source): equal volts per turn
//!   on every winding; input power equals output power (losses aside).
//! * RMS currents, magnetising current and output ripple neglected: the
//!   secondary carries Iout for the on-time, I_s,rms = Iout·√D; the
//!   primary carries Iout·Ns/Np, I_p,rms = Iout·(Ns/Np)·√D. Worst copper
//!   loss is at Vin min (largest D).
//! * Core loss: iGSE (Venkatachalam et al. 2002) on the B(t) above, at the
//!   worse of the two line corners, times the material's temperature factor.

use crate::core::{library as cores, Core};
use crate::error::{in_range, positive, Error, Result};
use crate::loss;
use crate::material::library as materials;
use crate::waveform::Pwl;
use crate::winding::wire;
use serde::{Deserialize, Serialize};

/// What the user asks for.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ForwardSpec {
    /// Lowest DC input voltage, V.
    pub vin_min: f64,
    /// Highest DC input voltage, V.
    pub vin_max: f64,
    /// Output voltage, V.
    pub vout: f64,
    /// Output current, A.
    pub iout: f64,
    /// Forward drop of the output rectifier, V.
    pub rectifier_drop: f64,
    /// Switching frequency, Hz.
    pub frequency: f64,
    /// Largest duty the controller may use (≤ 0.5 with 1:1 reset).
    pub duty_max: f64,
    /// Peak flux density the design may reach, T.
    pub b_max: f64,
    /// Core designation from the library.
    pub core: String,
    /// Material name from the library.
    pub material: String,
    /// Primary and secondary wire, AWG.
    pub awg_primary: i32,
    pub awg_secondary: i32,
    /// Temperature of core and winding for the loss figures, °C.
    pub temperature: f64,
}

impl ForwardSpec {
    /// The demo: a 48 V bus to 12 V, 10 A (120 W) converter at 200 kHz,
    /// a scenario of our own.
    pub fn demo() -> Self {
        ForwardSpec {
            vin_min: 36.0,
            vin_max: 60.0,
            vout: 12.0,
            iout: 10.0,
            rectifier_drop: 0.5,
            frequency: 200e3,
            duty_max: 0.45,
            b_max: 0.15,
            core: "ETD 29".into(),
            material: "MnZn-200k".into(),
            awg_primary: 22,
            awg_secondary: 18,
            temperature: 100.0,
        }
    }
}

/// The result, every quantity in SI units.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ForwardReport {
    pub core: Core,
    pub material: String,
    pub primary_turns: u32,
    pub secondary_turns: u32,
    /// Np/Ns.
    pub turns_ratio: f64,
    pub duty_at_vin_min: f64,
    pub duty_at_vin_max: f64,
    /// Volts per turn while the switch is on, at Vin min and Vin max.
    pub volts_per_turn_at_vin_min: f64,
    pub volts_per_turn_at_vin_max: f64,
    /// Flux swing ΔB and peak Bpk, T.
    pub delta_b: f64,
    pub b_peak: f64,
    /// Saturation flux density at the spec temperature, T.
    pub b_sat: f64,
    /// Core loss density and core loss.
    pub core_loss_density: f64,
    pub core_loss: f64,
    pub primary_rms: f64,
    pub secondary_rms: f64,
    pub primary_rdc: f64,
    pub secondary_rdc: f64,
    pub primary_copper_loss: f64,
    pub secondary_copper_loss: f64,
    pub copper_loss: f64,
    pub total_loss: f64,
    /// Copper area of both windings over the window area.
    pub window_fill: f64,
    /// Output power and input power at full load.
    pub output_power: f64,
    pub input_power: f64,
    /// Flux density over one period at Vin min and at Vin max, T: a rise
    /// of ΔB over the on-time, the 1:1 reset's fall over an equal time,
    /// then zero until the next period.
    pub flux_at_vin_min: Pwl,
    pub flux_at_vin_max: Pwl,
    pub warnings: Vec<String>,
}

/// Largest turn count the designer will propose for one winding.
const MAX_TURNS: f64 = 2000.0;

/// Designs the transformer.
pub fn design(spec: &ForwardSpec) -> Result<ForwardReport> {
    let vin_min = positive("vin_min", spec.vin_min, "V")?;
    let vin_max = positive("vin_max", spec.vin_max, "V")?;
    if vin_max < vin_min {
        return Err(Error::input("vin_max", format!("must be at least Vin min ({vin_min} V)")));
    }
    in_range("vin_max", vin_max, 0.0, 2000.0, "V")?;
    let vout = positive("vout", spec.vout, "V")?;
    in_range("vout", vout, 0.0, 2000.0, "V")?;
    let iout = positive("iout", spec.iout, "A")?;
    in_range("iout", iout, 0.0, 1000.0, "A")?;
    let vf = in_range("rectifier_drop", spec.rectifier_drop, 0.0, 10.0, "V")?;
    let f = positive("frequency", spec.frequency, "Hz")?;
    in_range("frequency", f, 1e3, 10e6, "Hz")?;
    let d_max = positive("duty_max", spec.duty_max, "")?;
    if d_max > 0.5 {
        return Err(Error::input(
            "duty_max",
            format!("a 1:1 reset winding allows at most 0.5 (got {d_max}); lower the duty limit"),
        ));
    }
    let b_max = positive("b_max", spec.b_max, "T")?;
    in_range("b_max", b_max, 0.0, 1.0, "T")?;
    let temp = in_range("temperature", spec.temperature, -40.0, 200.0, "°C")?;
    let core = cores::find(&spec.core)?;
    let material = materials::find(&spec.material)?;
    let d_p = wire::awg_diameter(spec.awg_primary).map_err(|e| rename(e, "awg_primary"))?;
    let d_s = wire::awg_diameter(spec.awg_secondary).map_err(|e| rename(e, "awg_secondary"))?;

    let v_sec = vout + vf;
    // Flux limit sets Ns: ΔB = (Vout + Vf)/(f·Ns·Ae) ≤ Bmax.
    let ns_flux = v_sec / (f * b_max * core.ae);
    // Np must be at least one turn: Np = ⌊Ns·Vin_min·Dmax/(Vout+Vf)⌋ ≥ 1.
    let ns_ratio = v_sec / (vin_min * d_max);
    let ns_real = ns_flux.max(ns_ratio).ceil().max(1.0);
    if ns_real > MAX_TURNS {
        return Err(Error::infeasible(
            Some("core"),
            format!("the secondary would need {ns_real:.0} turns; choose a larger core, a higher frequency or a higher Bmax"),
        ));
    }
    let ns = ns_real as u32;
    // The largest Np that still reaches Vout at Vin min within Dmax.
    let np_real = (ns as f64 * vin_min * d_max / v_sec * (1.0 + 1e-12)).floor();
    if np_real < 1.0 {
        return Err(Error::infeasible(Some("vout"), "the output cannot be reached within the duty limit"));
    }
    if np_real > MAX_TURNS {
        return Err(Error::infeasible(
            Some("core"),
            format!("the primary would need {np_real:.0} turns; choose a larger core or a higher frequency"),
        ));
    }
    let np = np_real as u32;
    let n = np as f64 / ns as f64;

    let duty = |vin: f64| n * v_sec / vin;
    let d_lo = duty(vin_max);
    let d_hi = duty(vin_min);
    let delta_b = v_sec / (f * ns as f64 * core.ae);
    let b_peak = delta_b;
    let b_sat = material.bsat_at(temp);

    let mut warnings: Vec<String> = Vec::new();
    let flux = |d: f64| -> Result<Pwl> {
        let t = 1.0 / f;
        Pwl::from_segments(0.0, &[(d * t, delta_b), (d * t, 0.0), ((1.0 - 2.0 * d) * t, 0.0)])
    };
    let flux_at_vin_min = flux(d_hi)?;
    let flux_at_vin_max = flux(d_lo)?;

    // iGSE on the real B(t) (Venkatachalam et al. 2002); the larger of the
    // two line corners (Vin max has the faster edges).
    let loss_min = loss::core_loss(&material, &flux_at_vin_min, temp, core.ve)?;
    let loss_max = loss::core_loss(&material, &flux_at_vin_max, temp, core.ve)?;
    let worst_loss = if loss_max.watts >= loss_min.watts { loss_max } else { loss_min };
    let pv = worst_loss.pv;
    let core_loss = worst_loss.watts;
    for w in &worst_loss.warnings {
        warnings.push(w.message());
    }

    let i_s = iout * d_hi.sqrt();
    let i_p = iout / n * d_hi.sqrt();
    let mlt = core.mlt_mid();
    let a_p = wire::round_area(d_p);
    let a_s = wire::round_area(d_s);
    let r_p = wire::dc_resistance(np as f64 * mlt, a_p, temp)?;
    let r_s = wire::dc_resistance(ns as f64 * mlt, a_s, temp)?;
    let p_cu_p = i_p * i_p * r_p;
    let p_cu_s = i_s * i_s * r_s;
    let copper = p_cu_p + p_cu_s;
    let fill = (np as f64 * a_p + ns as f64 * a_s) / core.window_area;

    if b_peak > b_sat {
        warnings.push(format!(
            "Bpk {:.0} mT exceeds Bsat {:.0} mT at {temp} °C: the core saturates",
            b_peak * 1e3,
            b_sat * 1e3
        ));
    }
    if fill > 0.4 {
        warnings.push(format!("copper fills {:.0} % of the window; above about 40 % a bobbin winding rarely fits", fill * 100.0));
    }

    let output_power = vout * iout;
    Ok(ForwardReport {
        core,
        material: material.name,
        primary_turns: np,
        secondary_turns: ns,
        turns_ratio: n,
        duty_at_vin_min: d_hi,
        duty_at_vin_max: d_lo,
        volts_per_turn_at_vin_min: vin_min / np as f64,
        volts_per_turn_at_vin_max: vin_max / np as f64,
        delta_b,
        b_peak,
        b_sat,
        core_loss_density: pv,
        core_loss,
        primary_rms: i_p,
        secondary_rms: i_s,
        primary_rdc: r_p,
        secondary_rdc: r_s,
        primary_copper_loss: p_cu_p,
        secondary_copper_loss: p_cu_s,
        copper_loss: copper,
        total_loss: core_loss + copper,
        window_fill: fill,
        output_power,
        input_power: output_power + iout * vf + core_loss + copper,
        flux_at_vin_min,
        flux_at_vin_max,
        warnings,
    })
}

fn rename(e: Error, field: &str) -> Error {
    Error::input(field, e.message().to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn demo_design_is_consistent() {
        let spec = ForwardSpec::demo();
        let r = design(&spec).unwrap();
        // Duty at Vin min within the limit, and the output reached:
        // Vin·D·Ns/Np = Vout + Vf (Erickson & Maksimovic §6.3.2).
        assert!(r.duty_at_vin_min <= spec.duty_max + 1e-12);
        let v = spec.vin_min * r.duty_at_vin_min / r.turns_ratio;
        assert!((v - (spec.vout + spec.rectifier_drop)).abs() < 1e-9);
        // Volt-second balance: same ΔB at both line extremes.
        let db_lo = spec.vin_min * r.duty_at_vin_min / (spec.frequency * r.primary_turns as f64 * r.core.ae);
        let db_hi = spec.vin_max * r.duty_at_vin_max / (spec.frequency * r.primary_turns as f64 * r.core.ae);
        assert!((db_lo - db_hi).abs() < 1e-12 && (db_lo - r.delta_b).abs() < 1e-12);
        assert!(r.b_peak <= spec.b_max);
        assert!(r.core_loss > 0.0 && r.copper_loss > 0.0);
    }

    #[test]
    fn one_fewer_secondary_turn_would_exceed_bmax() {
        let spec = ForwardSpec::demo();
        let r = design(&spec).unwrap();
        let ns1 = r.secondary_turns as f64 - 1.0;
        if ns1 >= 1.0 {
            let db = (spec.vout + spec.rectifier_drop) / (spec.frequency * ns1 * r.core.ae);
            let ratio_ok = ns1 * spec.vin_min * spec.duty_max / (spec.vout + spec.rectifier_drop) >= 1.0;
            assert!(db > spec.b_max || !ratio_ok);
        }
    }

    #[test]
    fn invalid_inputs_name_their_field() {
        let mut s = ForwardSpec::demo();
        s.frequency = 0.0;
        assert_eq!(design(&s).unwrap_err().field(), Some("frequency"));
        let mut s = ForwardSpec::demo();
        s.duty_max = 0.6;
        assert_eq!(design(&s).unwrap_err().field(), Some("duty_max"));
        let mut s = ForwardSpec::demo();
        s.vin_max = 10.0;
        assert_eq!(design(&s).unwrap_err().field(), Some("vin_max"));
        let mut s = ForwardSpec::demo();
        s.core = "nope".into();
        assert_eq!(design(&s).unwrap_err().field(), Some("core"));
        let mut s = ForwardSpec::demo();
        s.awg_primary = 99;
        assert_eq!(design(&s).unwrap_err().field(), Some("awg_primary"));
        let mut s = ForwardSpec::demo();
        s.vout = f64::NAN;
        assert_eq!(design(&s).unwrap_err().field(), Some("vout"));
    }
}
