//! The loss curves of a material: Pv against peak flux density B at several
//! frequencies, for the page's Pv–B chart on log axes. A pure view of the
//! material's own loss model, nothing else.
//!
//! Each point is the Steinmetz equation for a sinusoid, Pv = k·f^α·B^β
//! (Steinmetz 1892, in the usual fitted form; [`crate::loss::steinmetz`]),
//! times the temperature factor at the temperature of least loss, where it
//! is 1 ([`crate::material::TempFactor`]): so the curves are the loss at
//! the material's best temperature. On log axes each curve is a straight
//! line of slope β. The frequencies lie inside the fitted range; the B span
//! reaches a little beyond the fitted B range, and every point says whether
//! it lies inside (`fitted`), so the chart can show the data's valid range.

use crate::error::{Error, Result};
use crate::loss::steinmetz;
use crate::material::Material;
use serde::Serialize;

/// One point of a loss curve.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PvPoint {
    /// Peak flux density, T.
    pub b: f64,
    /// Loss density, W/m³.
    pub pv: f64,
    /// Inside the fitted f and B ranges of the Steinmetz coefficients.
    pub fitted: bool,
}

/// Pv against B at one frequency.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PvCurve {
    /// Hz.
    pub frequency: f64,
    pub points: Vec<PvPoint>,
}

/// The loss curves of one material.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PvChart {
    /// The temperature the curves hold at, °C (the temperature of least
    /// loss); `None` for a flat temperature factor (any temperature).
    pub temperature_c: Option<f64>,
    /// The fitted ranges, Hz and T.
    pub f_min: f64,
    pub f_max: f64,
    pub b_min: f64,
    pub b_max: f64,
    /// Ascending frequency.
    pub curves: Vec<PvCurve>,
}

/// Rounds to two significant figures (tidy frequencies: 20k, 63k, 200k).
fn two_figures(x: f64) -> f64 {
    let p = 10f64.powf(x.log10().floor() - 1.0);
    (x / p).round() * p
}

/// `n_freq` curves (2…8) of `n_points` points (2…400) each: frequencies
/// log-spaced across the fitted range (ends included, rounded to two
/// figures and kept inside), B log-spaced from half the lower end of the
/// fitted range (at least 0.5 mT) to 1.25 × its upper end.
pub fn pv_b_curves(material: &Material, n_freq: usize, n_points: usize) -> Result<PvChart> {
    if !(2..=8).contains(&n_freq) {
        return Err(Error::input("n_freq", "between 2 and 8 curves"));
    }
    if !(2..=400).contains(&n_points) {
        return Err(Error::input("n_points", "between 2 and 400 points per curve"));
    }
    material.validate()?;
    let s = &material.steinmetz;
    let ratio = s.f_max / s.f_min;
    let mut freqs: Vec<f64> = (0..n_freq)
        .map(|i| two_figures(s.f_min * ratio.powf(i as f64 / (n_freq - 1) as f64)).clamp(s.f_min, s.f_max))
        .collect();
    freqs.dedup();
    let b_lo = (0.5 * s.b_min).max(0.5e-3).min(0.5 * s.b_max);
    let b_hi = 1.25 * s.b_max;
    let mut curves = Vec::with_capacity(freqs.len());
    for f in freqs {
        let mut points = Vec::with_capacity(n_points);
        for j in 0..n_points {
            let b = b_lo * (b_hi / b_lo).powf(j as f64 / (n_points - 1) as f64);
            let pv = steinmetz(s, f, b)?;
            if !pv.is_finite() {
                return Err(Error::input("material.steinmetz.k", "the loss curves overflow: check k, α and β"));
            }
            let fitted = b >= s.b_min * (1.0 - 1e-12) && b <= s.b_max * (1.0 + 1e-12);
            points.push(PvPoint { b, pv, fitted });
        }
        curves.push(PvCurve { frequency: f, points });
    }
    Ok(PvChart {
        temperature_c: material.reference_temperature(),
        f_min: s.f_min,
        f_max: s.f_max,
        b_min: s.b_min,
        b_max: s.b_max,
        curves,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::material::library;

    #[test]
    fn curves_are_steinmetz_lines_of_slope_beta() {
        // Pv = k·f^α·B^β (Steinmetz 1892): on log axes a line of slope β,
        // and α sets the spacing between frequencies.
        let m = library::find("MnZn-200k").unwrap();
        let s = &m.steinmetz;
        let v = pv_b_curves(&m, 4, 40).unwrap();
        assert_eq!(v.curves.len(), 4);
        assert_eq!(v.temperature_c, m.reference_temperature());
        assert_eq!((v.curves[0].frequency, v.curves[3].frequency), (s.f_min, s.f_max));
        for c in &v.curves {
            assert!(c.frequency >= s.f_min && c.frequency <= s.f_max);
            for p in &c.points {
                let want = s.k * c.frequency.powf(s.alpha) * p.b.powf(s.beta);
                assert!((p.pv / want - 1.0).abs() < 1e-12);
                assert_eq!(p.fitted, p.b >= s.b_min && p.b <= s.b_max * (1.0 + 1e-12));
            }
            let (a, b) = (c.points[0], c.points[39]);
            let slope = (b.pv / a.pv).ln() / (b.b / a.b).ln();
            assert!((slope - s.beta).abs() < 1e-9);
            assert!(c.points.iter().any(|p| p.fitted) && c.points.iter().any(|p| !p.fitted));
        }
        let (p0, p1) = (v.curves[0].points[10], v.curves[1].points[10]);
        let alpha = (p1.pv / p0.pv).ln() / (v.curves[1].frequency / v.curves[0].frequency).ln();
        assert!((alpha - s.alpha).abs() < 1e-9);
    }

    #[test]
    fn bad_requests_and_materials_are_refused() {
        let m = library::find("MnZn-200k").unwrap();
        assert_eq!(pv_b_curves(&m, 1, 40).unwrap_err().field(), Some("n_freq"));
        assert_eq!(pv_b_curves(&m, 3, 1).unwrap_err().field(), Some("n_points"));
        let mut bad = m.clone();
        bad.steinmetz.alpha = 9.0;
        assert_eq!(pv_b_curves(&bad, 3, 10).unwrap_err().field(), Some("material.steinmetz.alpha"));
        assert_eq!(two_figures(63_245.0), 63_000.0);
    }
}
