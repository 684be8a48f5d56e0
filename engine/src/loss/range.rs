//! The material's data range: the one rule that says whether a core-loss
//! figure is read from the material's data, extrapolated a little, or
//! extrapolated too far to be trusted.
//!
//! A Steinmetz fit (k, α, β) holds over the frequencies and flux amplitudes
//! it was fitted to ([`Steinmetz`]'s `f_min`…`f_max`, `b_min`…`b_max`);
//! outside them the exponents drift (eddy-current and resonance losses
//! raise α at high frequency, β changes near saturation and in the low-flux
//! region), so the figure is an extrapolation of unknown error.
//!
//! The rule (common practice, no source; our choice of band): how far a
//! point lies outside is the factor by which it exceeds the range, in f
//! and in the flux amplitude ΔB/2 separately, and the larger of the two
//! counts. Inside the range the factor is at most 1. Within ×1.25 of the
//! range ([`DATA_RANGE_BAND`]) the loss is a modest extrapolation: the
//! report warns. Beyond it the design fails the `material_range` check.
//! ×1.25 is one step of the R10 preferred numbers (ISO 3: 100, 125, 160,
//! 200 ...), the usual spacing of measured frequencies and flux levels: an
//! extrapolation no further than the next point that could have been
//! measured.
//!
//! Below the fitted flux range the rule is different: there the loss is
//! not extrapolated but bounded from above ([`super::low_flux_bound`]: it
//! falls at least as fast as B² in the low-field region), so a swing below
//! the range warns and never fails on that account alone. Small ripple
//! flux, the normal state of an output choke, is the common case.
//!
//! The solver's check, and through the report's pass/fail the sweeps and
//! the optimiser, all use [`data_range`]; nothing else decides it.

use crate::material::Steinmetz;
use crate::waveform::Pwl;
use serde::{Deserialize, Serialize};

/// The band around the fitted range in which extrapolation warns but
/// passes: ×1.25 in frequency and in flux amplitude (common practice, no
/// source; see the module docs).
pub const DATA_RANGE_BAND: f64 = 1.25;

/// Where a point lies against the material's data.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum RangeVerdict {
    /// Inside the fitted ranges.
    Inside,
    /// Outside, but within [`DATA_RANGE_BAND`]: warn.
    Extrapolated,
    /// Beyond the band: the design fails.
    Beyond,
}

/// One point (frequency, flux amplitude) against the fitted ranges.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct DataRange {
    /// The period's frequency, Hz.
    pub frequency: f64,
    /// The flux amplitude ΔB/2, T.
    pub b_amplitude: f64,
    /// max(f/f_max, f_min/f): at most 1 inside the frequency range.
    pub f_factor: f64,
    /// B/b_max: at most 1 at or below the top of the flux range (0
    /// without a swing: no core loss to extrapolate).
    pub b_factor: f64,
    /// b_min/B where the swing lies below the fitted range (else 0): the
    /// loss there is a bound, not an extrapolation; it warns only.
    pub b_below: f64,
    /// The larger of the two.
    pub factor: f64,
    pub verdict: RangeVerdict,
}

/// How far `frequency` (Hz) and the flux amplitude `b_amplitude` (ΔB/2, T)
/// lie from the fit's ranges, and the verdict of the rule in the module
/// docs. Non-finite or non-positive inputs give the factor of the other
/// quantity alone (such inputs are refused before any loss is computed).
pub fn data_range(s: &Steinmetz, frequency: f64, b_amplitude: f64) -> DataRange {
    let outside = |x: f64, lo: f64, hi: f64| -> f64 {
        if !(x.is_finite() && x > 0.0) {
            return 0.0;
        }
        let above = x / hi;
        let below = if lo > 0.0 { lo / x } else { 0.0 };
        above.max(below)
    };
    let f_factor = outside(frequency, s.f_min, s.f_max);
    let b_factor = outside(b_amplitude, 0.0, s.b_max);
    let b_below = if b_amplitude > 0.0 && b_amplitude < s.b_min { s.b_min / b_amplitude } else { 0.0 };
    let factor = f_factor.max(b_factor);
    let verdict = if factor <= 1.0 && b_below == 0.0 {
        RangeVerdict::Inside
    } else if factor <= 1.0 {
        RangeVerdict::Extrapolated
    } else if factor <= DATA_RANGE_BAND {
        RangeVerdict::Extrapolated
    } else {
        RangeVerdict::Beyond
    };
    DataRange { frequency, b_amplitude, f_factor, b_factor, b_below, factor, verdict }
}

/// [`data_range`] of one period of B(t): frequency 1/T, amplitude
/// (max − min)/2 (the swing the iGSE uses).
pub fn data_range_of(s: &Steinmetz, b_t: &Pwl) -> DataRange {
    data_range(s, 1.0 / b_t.period, 0.5 * (b_t.max() - b_t.min()))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn fit() -> Steinmetz {
        Steinmetz { k: 10.0, alpha: 1.3, beta: 2.6, f_min: 20e3, f_max: 300e3, b_min: 0.02, b_max: 0.3 }
    }

    #[test]
    fn band_edges() {
        // The rule of the module docs, at and across each edge.
        let s = fit();
        assert_eq!(data_range(&s, 100e3, 0.1).verdict, RangeVerdict::Inside);
        assert_eq!(data_range(&s, 300e3, 0.3).verdict, RangeVerdict::Inside);
        assert_eq!(data_range(&s, 370e3, 0.1).verdict, RangeVerdict::Extrapolated);
        assert_eq!(data_range(&s, 380e3, 0.1).verdict, RangeVerdict::Beyond);
        assert_eq!(data_range(&s, 16.5e3, 0.1).verdict, RangeVerdict::Extrapolated);
        assert_eq!(data_range(&s, 15.5e3, 0.1).verdict, RangeVerdict::Beyond);
        assert_eq!(data_range(&s, 100e3, 0.37).verdict, RangeVerdict::Extrapolated);
        assert_eq!(data_range(&s, 100e3, 0.38).verdict, RangeVerdict::Beyond);
        // Below the flux range: a bound, not an extrapolation; warns only,
        // however far below.
        assert_eq!(data_range(&s, 100e3, 0.015).verdict, RangeVerdict::Extrapolated);
        assert_eq!(data_range(&s, 100e3, 0.001).verdict, RangeVerdict::Extrapolated);
        assert!((data_range(&s, 100e3, 0.01).b_below - 2.0).abs() < 1e-12);
        assert_eq!(data_range(&s, 15.5e3, 0.001).verdict, RangeVerdict::Beyond);
        let r = data_range(&s, 17.0 * 300e3, 0.1);
        assert!((r.f_factor - 17.0).abs() < 1e-12 && r.verdict == RangeVerdict::Beyond);
        // No swing: nothing to extrapolate in B.
        assert_eq!(data_range(&s, 100e3, 0.0).b_factor, 0.0);
        let mut open = s.clone();
        open.b_min = 0.0;
        assert_eq!(data_range(&open, 100e3, 1e-6).verdict, RangeVerdict::Inside);
    }
}
