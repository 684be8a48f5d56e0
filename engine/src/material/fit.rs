//! Fitting the loss model to measured points.
//!
//! Input: measured loss densities Pv at (f, B peak, T), sinusoidal flux
//! (the Steinmetz coefficients describe a sinusoid; the iGSE extends them
//! to other shapes). Output: k, α, β, the temperature factor, and how well
//! the model reproduces the points.
//!
//! # Method
//!
//! The model is Pv = k·f^α·B^β·(1 + c·(T − T_ref)²) (see [`TempFactor`]).
//!
//! 1. Points are grouped by temperature (points within 0.5 °C of the
//!    group's first point share it). In log space the model is
//!    ln Pv = ln K(T) + α·ln f + β·ln B with K(T) = k·factor(T). One linear
//!    least-squares problem gives α, β shared by all groups and one
//!    intercept ln K(T_g) per group: this is the fit of k, α, β "normalised
//!    to a common temperature", each group being scaled by its own factor
//!    (Steinmetz 1892 form; linear regression in log space is the usual
//!    method of fitting it). It is solved by Householder QR.
//! 2. With three or more temperatures, the per-group K(T_g) are fitted by a
//!    parabola a·(T − T̄)² + b·(T − T̄) + c in linear space, weighted by
//!    1/K(T_g) (so the relative error is minimised). Its minimum is
//!    T_ref = T̄ − b/(2a), its value there is k, and c_T = a/k is the
//!    curvature of the normalised factor. One temperature gives a flat
//!    factor (T_ref = that temperature); two temperatures cannot fix a
//!    parabola and are refused.
//! 3. Residuals: the final model against every point, in % of the
//!    measured value (maximum of the absolute value, and RMS).
//!
//! Ill-posed inputs are refused with a message: non-positive or non-finite
//! values, fewer points than parameters, one frequency only, one flux
//! density only, a singular system (e.g. f and B varied together), two
//! temperatures, a temperature dependence without a minimum.

use super::lsq::{self, Lsq};
use super::{Material, Steinmetz, TempFactor};
use crate::error::{Error, Result};
use serde::{Deserialize, Serialize};

/// Points within this many °C of a group's first point share its temperature.
pub const TEMPERATURE_TOLERANCE_C: f64 = 0.5;

/// One measured point: sinusoidal flux of peak `b` (T) at `f` (Hz) and
/// `temp_c` (°C) gives the loss density `pv` (W/m³).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct LossPoint {
    pub f: f64,
    pub b: f64,
    pub temp_c: f64,
    pub pv: f64,
}

/// The fitted loss model and its quality.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LossFit {
    /// k (at the reference temperature), α, β, and the measured f and B ranges.
    pub steinmetz: Steinmetz,
    /// Normalised: 1 at `reference_temperature`.
    pub temp_factor: TempFactor,
    /// Where the factor is 1 (its minimum, or the only temperature), °C.
    pub reference_temperature: f64,
    /// The distinct temperatures found in the points, °C.
    pub temperatures: Vec<f64>,
    /// (model − measured)/measured in %, one per point, in input order.
    pub errors_pct: Vec<f64>,
    /// Largest |error|, %.
    pub max_error_pct: f64,
    /// RMS of the errors, %.
    pub rms_error_pct: f64,
    /// Remarks on the fit (flat factor, extrapolated minimum, values a
    /// material would not accept).
    pub notes: Vec<String>,
}

impl LossFit {
    /// `base` with the fitted loss model; checked with [`Material::validate`].
    pub fn apply_to(&self, base: &Material) -> Result<Material> {
        let m = Material { steinmetz: self.steinmetz.clone(), temp_factor: self.temp_factor.clone(), ..base.clone() };
        m.validate()?;
        Ok(m)
    }
}

/// Fits k, α, β and the temperature factor to `points` (see the module
/// documentation for the method).
pub fn fit(points: &[LossPoint]) -> Result<LossFit> {
    for (i, p) in points.iter().enumerate() {
        let field = |name: &str| format!("points[{i}].{name}");
        crate::error::positive(&field("f"), p.f, "Hz")?;
        crate::error::positive(&field("b"), p.b, "T")?;
        crate::error::positive(&field("pv"), p.pv, "W/m³")?;
        crate::error::in_range(&field("temp_c"), p.temp_c, -60.0, 250.0, "°C")?;
    }
    // Temperature groups.
    let mut temps: Vec<f64> = Vec::new();
    let mut group = Vec::with_capacity(points.len());
    for p in points {
        let g = match temps.iter().position(|&t| (t - p.temp_c).abs() <= TEMPERATURE_TOLERANCE_C) {
            Some(g) => g,
            None => {
                temps.push(p.temp_c);
                temps.len() - 1
            }
        };
        group.push(g);
    }
    let ng = temps.len();
    let n_params = ng + 2;
    if points.len() < n_params.max(3) {
        return Err(Error::input(
            "points",
            format!(
                "{} points cannot fix {} parameters (α, β and one loss level per temperature, {} temperature(s)); measure more points",
                points.len(),
                n_params.max(3),
                ng
            ),
        ));
    }
    if count_distinct(points.iter().map(|p| p.f)) < 2 {
        return Err(Error::input(
            "points",
            "all points are at one frequency: α cannot be fitted; measure at two or more frequencies",
        ));
    }
    if count_distinct(points.iter().map(|p| p.b)) < 2 {
        return Err(Error::input(
            "points",
            "all points are at one flux density: β cannot be fitted; measure at two or more flux densities",
        ));
    }
    if ng == 2 {
        return Err(Error::input(
            "points",
            "two temperatures cannot fix a quadratic temperature factor: add points at a third temperature, or fit each temperature on its own",
        ));
    }

    // Step 1: ln Pv = c_g + α·(ln f − m_f) + β·(ln B − m_b), centred for conditioning.
    let n = points.len();
    let m_f = points.iter().map(|p| p.f.ln()).sum::<f64>() / n as f64;
    let m_b = points.iter().map(|p| p.b.ln()).sum::<f64>() / n as f64;
    let mut a = vec![0.0; n * n_params];
    let mut rhs = Vec::with_capacity(n);
    for (i, p) in points.iter().enumerate() {
        let row = &mut a[i * n_params..(i + 1) * n_params];
        row[group[i]] = 1.0;
        row[ng] = p.f.ln() - m_f;
        row[ng + 1] = p.b.ln() - m_b;
        rhs.push(p.pv.ln());
    }
    let x = match lsq::solve(a, rhs, n, n_params) {
        Lsq::Solved(x) => x,
        Lsq::Singular => {
            return Err(Error::input(
                "points",
                "the points cannot separate the effects of frequency, flux density and temperature (singular system, e.g. f and B changed together in every measurement); vary f at a fixed B and B at a fixed f",
            ))
        }
    };
    let alpha = x[ng];
    let beta = x[ng + 1];
    // K(T_g) = k·factor(T_g): the loss level of each temperature group.
    let levels: Vec<f64> = (0..ng).map(|g| (x[g] - alpha * m_f - beta * m_b).exp()).collect();
    if levels.iter().any(|v| !(v.is_finite() && *v > 0.0)) {
        return Err(Error::input("points", "the fitted loss level overflows: check the units (Hz, T, W/m³)"));
    }

    let mut notes = Vec::new();
    let (k, temp_factor, t_ref) = if ng == 1 {
        notes.push(format!(
            "all points at {:.1} °C: no temperature dependence fitted (flat factor); k holds at that temperature",
            temps[0]
        ));
        (levels[0], TempFactor::with_minimum(temps[0], 0.0), temps[0])
    } else {
        // Step 2: weighted parabola through the levels, in u = T − T̄.
        let t_bar = temps.iter().sum::<f64>() / ng as f64;
        let mut q = Vec::with_capacity(ng * 3);
        for (g, &t) in temps.iter().enumerate() {
            let u = t - t_bar;
            let w = 1.0 / levels[g];
            q.extend_from_slice(&[w * u * u, w * u, w]);
        }
        let coef = match lsq::solve(q, vec![1.0; ng], ng, 3) {
            Lsq::Solved(c) => c,
            Lsq::Singular => {
                return Err(Error::input(
                    "points",
                    "the temperatures are too close together to fit a temperature factor",
                ))
            }
        };
        let (qa, qb, qc) = (coef[0], coef[1], coef[2]);
        if qa.is_nan() || qa <= 0.0 {
            return Err(Error::input(
                "points",
                "the loss does not have a minimum over temperature (the fitted parabola opens downwards); the quadratic temperature factor does not describe these points",
            ));
        }
        let t_ref = t_bar - qb / (2.0 * qa);
        let k = qc - qb * qb / (4.0 * qa);
        if !(k > 0.0 && k.is_finite()) {
            return Err(Error::input(
                "points",
                "the fitted temperature parabola reaches zero loss at its minimum; measure nearer the loss minimum",
            ));
        }
        let lo = temps.iter().cloned().fold(f64::INFINITY, f64::min);
        let hi = temps.iter().cloned().fold(f64::NEG_INFINITY, f64::max);
        if t_ref < lo || t_ref > hi {
            notes.push(format!(
                "the loss minimum ({t_ref:.0} °C) lies outside the measured temperatures ({lo:.0}–{hi:.0} °C): it is extrapolated"
            ));
        }
        (k, TempFactor::with_minimum(t_ref, qa / k), t_ref)
    };

    let fold = |init: f64, pick: fn(&LossPoint) -> f64, op: fn(f64, f64) -> f64| points.iter().map(pick).fold(init, op);
    let steinmetz = Steinmetz {
        k,
        alpha,
        beta,
        f_min: fold(f64::INFINITY, |p| p.f, f64::min),
        f_max: fold(0.0, |p| p.f, f64::max),
        b_min: fold(f64::INFINITY, |p| p.b, f64::min),
        b_max: fold(0.0, |p| p.b, f64::max),
    };

    // Step 3: residuals of the final model.
    let errors_pct: Vec<f64> = points
        .iter()
        .map(|p| {
            let model = k * p.f.powf(alpha) * p.b.powf(beta) * temp_factor.at(p.temp_c);
            (model / p.pv - 1.0) * 100.0
        })
        .collect();
    if errors_pct.iter().any(|e| !e.is_finite()) {
        return Err(Error::input("points", "the fitted model overflows at some point: check the units (Hz, T, W/m³)"));
    }
    let max_error_pct = errors_pct.iter().fold(0.0_f64, |m, e| m.max(e.abs()));
    let rms_error_pct = (errors_pct.iter().map(|e| e * e).sum::<f64>() / n as f64).sqrt();
    if !(0.9..=3.5).contains(&alpha) || !(1.0..=4.0).contains(&beta) {
        notes.push(format!(
            "α = {alpha:.3}, β = {beta:.3} lie outside the usual ranges (α 0.9–3.5, β 1–4): a material will refuse them; check the points"
        ));
    }
    Ok(LossFit {
        steinmetz,
        temp_factor,
        reference_temperature: t_ref,
        temperatures: temps,
        errors_pct,
        max_error_pct,
        rms_error_pct,
        notes,
    })
}

/// Number of distinct values (relative tolerance 1e-9).
fn count_distinct(values: impl Iterator<Item = f64>) -> usize {
    let mut seen: Vec<f64> = Vec::new();
    for v in values {
        if !seen.iter().any(|&s| (s - v).abs() <= 1e-9 * s.abs().max(v.abs())) {
            seen.push(v);
        }
    }
    seen.len()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Points generated from a known model (the model's own equation, not
    /// the code under test): Pv = k·f^α·B^β·(1 + c·(T − T0)²).
    fn synthetic(k: f64, alpha: f64, beta: f64, t0: f64, c: f64, temps: &[f64]) -> Vec<LossPoint> {
        let mut pts = Vec::new();
        for &t in temps {
            for &f in &[50e3, 100e3, 200e3] {
                for &b in &[0.05, 0.1, 0.2] {
                    let pv = k * f64::powf(f, alpha) * f64::powf(b, beta) * (1.0 + c * (t - t0) * (t - t0));
                    pts.push(LossPoint { f, b, temp_c: t, pv });
                }
            }
        }
        pts
    }

    #[test]
    fn recovers_known_coefficients() {
        let pts = synthetic(7.5, 1.35, 2.65, 95.0, 1.2e-4, &[25.0, 60.0, 100.0, 120.0]);
        let r = fit(&pts).unwrap();
        let s = &r.steinmetz;
        assert!((s.k / 7.5 - 1.0).abs() < 1e-6, "k {}", s.k);
        assert!((s.alpha - 1.35).abs() < 1e-6);
        assert!((s.beta - 2.65).abs() < 1e-6);
        assert!((r.reference_temperature - 95.0).abs() < 1e-6);
        assert!((r.temp_factor.least_loss_c - 95.0).abs() < 1e-6);
        assert!((r.temp_factor.curvature / 1.2e-4 - 1.0).abs() < 1e-6);
        assert!(r.max_error_pct < 1e-6 && r.rms_error_pct <= r.max_error_pct);
        assert_eq!((s.f_min, s.f_max, s.b_min, s.b_max), (50e3, 200e3, 0.05, 0.2));
        let m = r.apply_to(&super::super::library::find("MnZn-200k").unwrap()).unwrap();
        assert_eq!(m.steinmetz.alpha, s.alpha);
    }

    #[test]
    fn single_temperature_gives_flat_factor() {
        let pts = synthetic(3.0, 1.5, 2.4, 100.0, 0.0, &[100.0]);
        let r = fit(&pts).unwrap();
        assert!((r.steinmetz.k / 3.0 - 1.0).abs() < 1e-6);
        assert!(r.temp_factor.is_flat());
        assert_eq!(r.temp_factor.least_loss_c, 100.0);
        assert_eq!(r.reference_temperature, 100.0);
        assert!(!r.notes.is_empty());
    }

    #[test]
    fn residuals_report_noise() {
        // Perturb one point by +10 %: the fit can no longer pass through it.
        let mut pts = synthetic(7.5, 1.35, 2.65, 95.0, 1.2e-4, &[25.0, 60.0, 100.0]);
        pts[4].pv *= 1.1;
        let r = fit(&pts).unwrap();
        assert!(r.max_error_pct > 1.0 && r.max_error_pct < 10.0, "{}", r.max_error_pct);
        assert!(r.rms_error_pct > 0.0 && r.rms_error_pct < r.max_error_pct);
        assert_eq!(r.errors_pct.len(), pts.len());
    }

    #[test]
    fn refuses_ill_posed_fits() {
        let base = synthetic(7.5, 1.35, 2.65, 95.0, 1.2e-4, &[100.0]);
        let msg = |pts: &[LossPoint]| fit(pts).unwrap_err().to_string();
        assert!(msg(&base[..2]).contains("cannot fix"));
        let one_f: Vec<_> = base.iter().filter(|p| p.f == 100e3).cloned().collect();
        assert!(msg(&one_f).contains("one frequency"));
        let one_b: Vec<_> = base.iter().filter(|p| p.b == 0.1).cloned().collect();
        assert!(msg(&one_b).contains("one flux density"));
        // f and B doubled together: ln f and ln B collinear → singular.
        let together: Vec<_> = [(50e3, 0.05), (100e3, 0.1), (200e3, 0.2), (400e3, 0.4)]
            .iter()
            .map(|&(f, b)| LossPoint { f, b, temp_c: 25.0, pv: 1e3 * f / 50e3 })
            .collect();
        assert!(msg(&together).contains("singular"));
        let mut bad = base.clone();
        bad[3].pv = 0.0;
        assert_eq!(fit(&bad).unwrap_err().field(), Some("points[3].pv"));
        bad[3].pv = f64::NAN;
        assert_eq!(fit(&bad).unwrap_err().field(), Some("points[3].pv"));
        let mut bad = base.clone();
        bad[1].f = -1.0;
        assert_eq!(fit(&bad).unwrap_err().field(), Some("points[1].f"));
        let two_t = synthetic(7.5, 1.35, 2.65, 95.0, 1.2e-4, &[25.0, 100.0]);
        assert!(msg(&two_t).contains("third temperature"));
        // Loss falling then rising the wrong way: a maximum, not a minimum.
        let inverted = synthetic(7.5, 1.35, 2.65, 60.0, -1.0e-4, &[25.0, 60.0, 100.0]);
        assert!(msg(&inverted).contains("minimum"));
        assert!(fit(&[]).is_err());
    }
}
