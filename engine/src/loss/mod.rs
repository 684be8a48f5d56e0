//! Core loss: from a material's Steinmetz coefficients and the flux
//! density waveform B(t) to watts in the core.
//!
//! # The model
//!
//! * Sinusoidal flux: the Steinmetz equation Pv = k·f^α·B̂^β ([`steinmetz`]).
//! * Any piecewise-linear B(t) over one period: the iGSE of Venkatachalam,
//!   Sullivan, Abdallah and Tacca (2002), module [`igse`]. It uses only k,
//!   α, β and equals Steinmetz for a sinusoid.
//! * Temperature: Pv(T) = Pv(T_ref)·factor(T), the material's normalised
//!   quadratic [`crate::material::TempFactor`] (1 at T_ref, its minimum).
//! * Watts: P = Pv(T)·Ve (uniform flux density over the effective volume,
//!   the premise of the IEC 60205 effective parameters).
//!
//! # What is not modelled (and is flagged)
//!
//! * DC bias. The Steinmetz coefficients are measured without bias; a
//!   premagnetised core (a choke, a flyback in continuous conduction) loses
//!   more, by an amount the coefficients cannot tell. [`dc_bias_warning`]
//!   flags waveforms that stay well away from zero.
//! * Minor loops: the whole period is one loop (see [`igse`]).
//! * Relaxation after flat parts of B(t), and the loss rise at the edges of
//!   the fitted ranges: points outside the fitted f or B ranges are
//!   extrapolated, with a warning; [`range`] holds the rule that fails a
//!   design whose point lies beyond a modest band.
//!
//! # Entry points
//!
//! [`core_loss`] does everything for one waveform. For repeated
//! evaluations (a frequency sweep), build [`IgseCoefficients`] once and call
//! [`core_loss_with`], or for one shape at many frequencies and swings use
//! [`IgseCoefficients::shape_factor`] and [`IgseCoefficients::pv_from_shape`].

pub mod igse;
pub mod range;

pub use igse::{cos_power_integral, ki, FluxScan, IgseCoefficients};
pub use range::{data_range, data_range_of, DataRange, RangeVerdict, DATA_RANGE_BAND};

use crate::error::{in_range, positive, Error, Result};
use crate::material::{Material, Steinmetz};
use crate::waveform::Pwl;
use serde::{Deserialize, Serialize};

/// Steinmetz equation for a sinusoidal flux of peak `b_pk` (T) at `f` (Hz):
/// Pv = k·f^α·B^β, W/m³ (Steinmetz 1892, in the usual fitted form).
pub fn steinmetz(s: &Steinmetz, f: f64, b_pk: f64) -> Result<f64> {
    positive("frequency", f, "Hz")?;
    crate::error::non_negative("flux_density", b_pk, "T")?;
    Ok(s.k * f.powf(s.alpha) * b_pk.powf(s.beta))
}

/// A DC bias larger than this (beyond the AC amplitude, i.e. B(t) stays at
/// least this far from zero) is flagged. Our choice, common practice, no
/// source: ferrite loss rises noticeably with a bias of some tens of mT.
pub const DC_BIAS_WARN_T: f64 = 0.025;

/// A remark on a loss result: the number is given, but with a caveat.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum LossWarning {
    /// The period's frequency 1/T lies outside the fitted range.
    FrequencyOutsideFit { f: f64, f_min: f64, f_max: f64 },
    /// The fastest edge is as steep as a sinusoid of the same swing at
    /// `f_equivalent` = max|dB/dt|/(π·ΔB), above the fitted range.
    FastEdges { f_equivalent: f64, f_max: f64 },
    /// The swing's amplitude ΔB/2 lies outside the fitted range.
    FluxOutsideFit { b_pk: f64, b_min: f64, b_max: f64 },
    /// The swing's amplitude ΔB/2 lies below the fitted range: the loss is
    /// the bound of [`low_flux_bound`] (the fit raised by `factor`).
    FluxBelowFit { b_pk: f64, b_min: f64, factor: f64 },
    /// B(t) is biased: mean level `b_dc`, AC amplitude `b_ac` (T).
    DcBias { b_dc: f64, b_ac: f64 },
    /// More than one maximum per period; treated as one major loop.
    MinorLoops { loops: usize },
    /// |B| reaches `b_peak`, above Bsat at the temperature.
    Saturation { b_peak: f64, b_sat: f64 },
}

impl LossWarning {
    /// A sentence for the user.
    pub fn message(&self) -> String {
        match *self {
            LossWarning::FrequencyOutsideFit { f, f_min, f_max } => format!(
                "{:.1} kHz is outside the material's fitted range ({:.1}–{:.1} kHz): core loss is extrapolated",
                f / 1e3, f_min / 1e3, f_max / 1e3
            ),
            LossWarning::FastEdges { f_equivalent, f_max } => format!(
                "the fastest flux edge is as steep as a {:.0} kHz sinusoid, above the fitted range (up to {:.0} kHz): core loss is extrapolated",
                f_equivalent / 1e3, f_max / 1e3
            ),
            LossWarning::FluxOutsideFit { b_pk, b_min, b_max } => format!(
                "the flux amplitude ΔB/2 = {:.1} mT is outside the material's fitted range ({:.1}–{:.1} mT): core loss is extrapolated",
                b_pk * 1e3, b_min * 1e3, b_max * 1e3
            ),
            LossWarning::FluxBelowFit { b_pk, b_min, factor } => format!(
                "the flux amplitude ΔB/2 = {:.1} mT is below the material's fitted range (from {:.1} mT): core loss is \
                 taken as the upper bound that falls as B² below the fit (×{:.2} on the fit's extrapolation)",
                b_pk * 1e3, b_min * 1e3, factor
            ),
            LossWarning::DcBias { b_dc, b_ac } => format!(
                "the flux has a DC bias of {:.0} mT (AC amplitude {:.0} mT); DC bias is not modelled and raises the real core loss",
                b_dc * 1e3, b_ac * 1e3
            ),
            LossWarning::MinorLoops { loops } => format!(
                "B(t) has {loops} maxima per period; the whole period is treated as one major loop, which overestimates the minor loops' loss"
            ),
            LossWarning::Saturation { b_peak, b_sat } => format!(
                "the flux reaches {:.0} mT, above Bsat {:.0} mT at this temperature: the core saturates and the loss model does not apply",
                b_peak * 1e3, b_sat * 1e3
            ),
        }
    }
}

impl std::fmt::Display for LossWarning {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.message())
    }
}

/// DC level and AC amplitude of B(t): ((max + min)/2, (max − min)/2), T.
pub fn dc_bias(b_t: &Pwl) -> (f64, f64) {
    let (hi, lo) = (b_t.max(), b_t.min());
    (0.5 * (hi + lo), 0.5 * (hi - lo))
}

/// Flags a DC bias large enough to matter: |B_dc| − B_ac > [`DC_BIAS_WARN_T`],
/// i.e. B(t) never comes within 25 mT of zero. A unipolar forward-converter
/// flux starting from zero is not flagged; a choke or a flyback in
/// continuous conduction is. DC bias is not modelled by the loss equations.
pub fn dc_bias_warning(b_t: &Pwl) -> Option<LossWarning> {
    let (b_dc, b_ac) = dc_bias(b_t);
    dc_bias_check(b_dc, b_ac)
}

fn dc_bias_check(b_dc: f64, b_ac: f64) -> Option<LossWarning> {
    (b_dc.abs() - b_ac > DC_BIAS_WARN_T).then_some(LossWarning::DcBias { b_dc, b_ac })
}

/// Core loss of one waveform.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CoreLoss {
    /// Loss density at the temperature, W/m³.
    pub pv: f64,
    /// Loss density at the material's reference temperature, W/m³.
    pub pv_reference: f64,
    /// The temperature factor applied (pv = pv_reference·temp_factor).
    pub temp_factor: f64,
    /// Core loss Pv·Ve, W.
    pub watts: f64,
    /// 1/T, Hz.
    pub frequency: f64,
    /// Peak-to-peak swing ΔB, T.
    pub delta_b: f64,
    /// DC level (max + min)/2 of B(t), T.
    pub b_dc: f64,
    /// Caveats, in a fixed order; empty when the result is inside the fit.
    pub warnings: Vec<LossWarning>,
}

/// Core loss of the flux density `b_t` (T, one period) in a core of
/// effective volume `ve` (m³) at `temp_c` °C: iGSE density times the
/// temperature factor times Ve. Checks the material; builds the iGSE
/// coefficients (a few microseconds): for sweeps use [`core_loss_with`].
pub fn core_loss(material: &Material, b_t: &Pwl, temp_c: f64, ve: f64) -> Result<CoreLoss> {
    material.validate()?;
    let c = IgseCoefficients::from_material(material)?;
    core_loss_with(&c, material, b_t, temp_c, ve)
}

/// The factor that turns the fit's extrapolation below its flux range
/// into an upper bound of the loss: (b_min/B)^(β − 2) for β > 2 and a
/// flux amplitude B below the fit's `b_min`, else 1.
///
/// Below the fitted range a ferrite is in its low-field (Rayleigh) region:
/// hysteresis loss per cycle goes as B³ (Rayleigh 1887) and eddy-current
/// and residual losses as B² (classical eddy-current loss; e.g. Bertotti,
/// Hysteresis in Magnetism, 1998, ch. 12), so from the fitted point at
/// b_min the loss falls at least as fast as B². Continuing the fit with
/// β > 2 would fall faster and understate it; continuing with the exponent
/// 2 bounds it from above. With β ≤ 2 the fit itself is that bound.
pub fn low_flux_bound(s: &crate::material::Steinmetz, b_amplitude: f64) -> f64 {
    if b_amplitude > 0.0 && b_amplitude < s.b_min && s.beta > 2.0 {
        (s.b_min / b_amplitude).powf(s.beta - 2.0)
    } else {
        1.0
    }
}

/// [`core_loss`] with coefficients built once ([`IgseCoefficients::from_material`]
/// of the same material). Does not re-check the material.
/// Below the fit's flux range the loss is the bound of [`low_flux_bound`].
pub fn core_loss_with(
    coeffs: &IgseCoefficients,
    material: &Material,
    b_t: &Pwl,
    temp_c: f64,
    ve: f64,
) -> Result<CoreLoss> {
    let temp = in_range("temperature", temp_c, -60.0, 250.0, "°C")?;
    positive("ve", ve, "m³")?;
    if temp >= material.curie_c {
        return Err(Error::infeasible(
            Some("temperature"),
            format!(
                "{temp:.0} °C is at or above the Curie temperature of {} ({:.0} °C): the ferrite is no longer magnetic",
                material.name, material.curie_c
            ),
        ));
    }
    let scan = coeffs.scan(b_t)?;
    let frequency = 1.0 / b_t.period;
    let s = &material.steinmetz;
    let low_flux = low_flux_bound(s, 0.5 * scan.delta_b);
    let pv_reference = coeffs.pv_of_scan(&scan, b_t.period) * low_flux;
    let temp_factor = material.temp_factor.at(temp);
    let pv = pv_reference * temp_factor;
    let watts = pv * ve;
    if !(pv.is_finite() && watts.is_finite()) {
        return Err(Error::input("b_t.points", "the core loss is too large to evaluate: check the units (T, s)"));
    }

    let mut warnings = Vec::new();
    if frequency < s.f_min || frequency > s.f_max {
        warnings.push(LossWarning::FrequencyOutsideFit { f: frequency, f_min: s.f_min, f_max: s.f_max });
    } else if scan.delta_b > 0.0 {
        let f_equivalent = scan.max_slope / (std::f64::consts::PI * scan.delta_b);
        if f_equivalent > s.f_max {
            warnings.push(LossWarning::FastEdges { f_equivalent, f_max: s.f_max });
        }
    }
    let b_ac = 0.5 * scan.delta_b;
    let b_dc = 0.5 * (scan.b_max + scan.b_min);
    if scan.delta_b > 0.0 && b_ac < s.b_min {
        warnings.push(LossWarning::FluxBelowFit { b_pk: b_ac, b_min: s.b_min, factor: low_flux });
    } else if scan.delta_b > 0.0 && b_ac > s.b_max {
        warnings.push(LossWarning::FluxOutsideFit { b_pk: b_ac, b_min: s.b_min, b_max: s.b_max });
    }
    if let Some(w) = dc_bias_check(b_dc, b_ac) {
        warnings.push(w);
    }
    if scan.loops > 1 {
        warnings.push(LossWarning::MinorLoops { loops: scan.loops });
    }
    let b_peak = scan.b_max.abs().max(scan.b_min.abs());
    let b_sat = material.bsat_at(temp);
    if b_peak > b_sat {
        warnings.push(LossWarning::Saturation { b_peak, b_sat });
    }
    Ok(CoreLoss { pv, pv_reference, temp_factor, watts, frequency, delta_b: scan.delta_b, b_dc, warnings })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::material::library;

    #[test]
    fn steinmetz_scales_with_exponents() {
        let s = Steinmetz { k: 2.0, alpha: 1.5, beta: 2.5, f_min: 1.0, f_max: 1e9, b_min: 0.0, b_max: 1.0 };
        let p1 = steinmetz(&s, 1e5, 0.1).unwrap();
        let p2 = steinmetz(&s, 2e5, 0.1).unwrap();
        let p3 = steinmetz(&s, 1e5, 0.2).unwrap();
        assert!((p2 / p1 - 2f64.powf(1.5)).abs() < 1e-12);
        assert!((p3 / p1 - 2f64.powf(2.5)).abs() < 1e-12);
        assert!((p1 - 2.0 * 1e5f64.powf(1.5) * 0.1f64.powf(2.5)).abs() < 1e-9 * p1);
    }

    fn triangle(f: f64, lo: f64, hi: f64, d: f64) -> Pwl {
        let t = 1.0 / f;
        Pwl::new(t, vec![(0.0, lo), (d * t, hi), (t, lo)]).unwrap()
    }

    #[test]
    fn watts_and_temperature_factor() {
        let m = library::find("MnZn-200k").unwrap();
        let w = triangle(100e3, -0.1, 0.1, 0.5);
        let ve = 5.0e-6;
        let c = IgseCoefficients::from_material(&m).unwrap();
        let base = c.pv_triangle(100e3, 0.2, 0.5).unwrap();
        for t in [25.0, 60.0, 100.0, 120.0] {
            let r = core_loss(&m, &w, t, ve).unwrap();
            // Factor = 1 + c·(T − Tm)² (the material's definition).
            let d = t - m.temp_factor.least_loss_c;
            let factor = 1.0 + m.temp_factor.curvature * d * d;
            assert!((r.temp_factor - factor).abs() < 1e-12);
            assert!((r.pv / (base * factor) - 1.0).abs() < 1e-12);
            assert!((r.watts - r.pv * ve).abs() < 1e-12 * r.watts);
            assert!(r.warnings.is_empty(), "{:?}", r.warnings);
        }
        assert!(core_loss(&m, &w, 230.0, ve).unwrap_err().message().contains("Curie"));
        assert_eq!(core_loss(&m, &w, 25.0, 0.0).unwrap_err().field(), Some("ve"));
    }

    #[test]
    fn below_the_fit_the_loss_falls_as_b_squared() {
        // Low-field region (Rayleigh 1887: hysteresis ∝ B³; classical eddy
        // loss ∝ B²): from the fitted point at b_min the bound falls as B²,
        // so halving the swing below b_min quarters the loss, and the bound
        // is continuous at b_min.
        let m = library::find("MnZn-200k").unwrap();
        let s = &m.steinmetz;
        assert!(s.beta > 2.0);
        let at = |b: f64| core_loss(&m, &triangle(100e3, -b, b, 0.5), 100.0, 1e-6).unwrap().pv;
        let edge = at(s.b_min);
        assert!((at(s.b_min * (1.0 - 1e-9)) / edge - 1.0).abs() < 1e-6, "continuous at b_min");
        assert!((at(0.5 * s.b_min) / edge - 0.25).abs() < 1e-9);
        assert!((at(0.1 * s.b_min) / edge - 0.01).abs() < 1e-9);
        // Above the fit's floor nothing changes: the fit's own exponent β.
        assert!((at(2.0 * s.b_min) / edge - 2f64.powf(s.beta)).abs() < 1e-9);
        let mut flat = s.clone();
        flat.beta = 1.8;
        assert_eq!(low_flux_bound(&flat, 0.5 * flat.b_min), 1.0, "β ≤ 2: the fit is the bound");
    }

    #[test]
    fn warnings_are_returned() {
        let m = library::find("MnZn-200k").unwrap();
        let has = |r: &CoreLoss, pred: fn(&LossWarning) -> bool| r.warnings.iter().any(pred);
        // 1 MHz: outside 20–300 kHz.
        let r = core_loss(&m, &triangle(1e6, -0.05, 0.05, 0.5), 100.0, 1e-6).unwrap();
        assert!(has(&r, |w| matches!(w, LossWarning::FrequencyOutsideFit { .. })));
        // 100 kHz but a 1 % edge: acts like ≈ 3.2 MHz.
        let r = core_loss(&m, &triangle(100e3, -0.05, 0.05, 0.01), 100.0, 1e-6).unwrap();
        assert!(has(&r, |w| matches!(w, LossWarning::FastEdges { .. })));
        // 5 mT amplitude: below b_min = 20 mT.
        let r = core_loss(&m, &triangle(100e3, -0.005, 0.005, 0.5), 100.0, 1e-6).unwrap();
        assert!(has(&r, |w| matches!(w, LossWarning::FluxBelowFit { .. })));
        // 400 mT amplitude: above b_max.
        let r = core_loss(&m, &triangle(100e3, -0.4, 0.4, 0.5), 100.0, 1e-6).unwrap();
        assert!(has(&r, |w| matches!(w, LossWarning::FluxOutsideFit { .. })));
        // Choke: 200 ± 20 mT → DC bias.
        let r = core_loss(&m, &triangle(100e3, 0.18, 0.22, 0.5), 100.0, 1e-6).unwrap();
        assert!(has(&r, |w| matches!(w, LossWarning::DcBias { .. })));
        assert!(dc_bias_warning(&triangle(100e3, 0.18, 0.22, 0.5)).is_some());
        // Forward-converter flux 0 → ΔB: not flagged.
        assert!(dc_bias_warning(&triangle(100e3, 0.0, 0.2, 0.4)).is_none());
        // 450 mT at 100 °C: above 390 mT.
        let r = core_loss(&m, &triangle(100e3, -0.45, 0.45, 0.5), 100.0, 1e-6).unwrap();
        assert!(has(&r, |w| matches!(w, LossWarning::Saturation { .. })));
        let minor = Pwl::new(1e-5, vec![(0.0, -0.1), (3e-6, 0.1), (4e-6, 0.05), (5e-6, 0.08), (1e-5, -0.1)]).unwrap();
        let r = core_loss(&m, &minor, 100.0, 1e-6).unwrap();
        assert!(has(&r, |w| matches!(w, LossWarning::MinorLoops { loops: 2 })));
        for w in &r.warnings {
            assert!(!w.message().is_empty());
        }
    }
}
