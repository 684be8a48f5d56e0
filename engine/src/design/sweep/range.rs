//! Where the material's loss data hold, for the sweeps: the engine's one
//! rule, [`crate::loss::range`], applied to each swept point and to the
//! frequency axis the plot shades.
//!
//! A Steinmetz fit is a statement about the frequencies and flux swings it
//! was fitted over (Steinmetz 1892; the iGSE inherits the fit's range,
//! Venkatachalam et al. 2002 §II): outside them the loss is extrapolated
//! and can be wrong by any amount. The rule of `loss::range` (common
//! practice, no source; our choice of band): within ×[`DATA_RANGE_BAND`] of
//! the fitted range the figure is a modest extrapolation and warns; beyond
//! it the design fails the `material_range` check. A sweep point is "in the
//! data" exactly when that check passes, so it is never feasible, and never
//! the minimum, where the data do not hold. Nothing here decides anew: a
//! built point takes the report's `material_range` check; a point where no
//! design could be built takes [`data_range`] of its frequency alone (no
//! flux swing is known there).

use crate::design::solve::Report;
use crate::loss::{data_range, RangeVerdict, DATA_RANGE_BAND};
use crate::material::Material;
use serde::Serialize;

/// The frequency band of the material's loss data, Hz (what the sweep
/// plot shades): the fitted range, and the band the rule still accepts
/// (the fitted range widened by [`DATA_RANGE_BAND`] each way).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Band {
    /// Lowest and highest frequency at which the data hold by the rule
    /// (f_min/band, f_max·band), Hz.
    pub min: f64,
    pub max: f64,
    /// The fitted range itself (`Steinmetz::f_min`, `f_max`), Hz.
    pub fitted_min: f64,
    pub fitted_max: f64,
    /// The band factor, [`DATA_RANGE_BAND`].
    pub band: f64,
}

/// The material's frequency band (see [`Band`]).
pub fn frequency_band(material: &Material) -> Band {
    let s = &material.steinmetz;
    Band {
        min: s.f_min / DATA_RANGE_BAND,
        max: s.f_max * DATA_RANGE_BAND,
        fitted_min: s.f_min,
        fitted_max: s.f_max,
        band: DATA_RANGE_BAND,
    }
}

/// Whether the material's data hold at a built point: the report's
/// `material_range` check (both line corners, frequency and ΔB/2, by
/// [`crate::loss::range`]). A report without the check (none is made
/// without it) counts as outside.
pub fn report_in_data(r: &Report) -> bool {
    r.checks.iter().find(|c| c.key == "material_range").is_some_and(|c| c.pass)
}

/// Whether the data hold at `frequency` (Hz) alone, for a point where no
/// design could be built: [`data_range`] with no flux swing.
pub fn frequency_in_data(material: &Material, frequency: f64) -> bool {
    data_range(&material.steinmetz, frequency, 0.0).verdict != RangeVerdict::Beyond
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::material::library;

    #[test]
    fn the_band_is_the_rule_of_loss_range() {
        // Inside the band by frequency alone: in the data; just past it: not.
        let m = library::find("MnZn-200k").unwrap();
        let (lo, hi) = (m.steinmetz.f_min, m.steinmetz.f_max);
        let b = frequency_band(&m);
        assert_eq!((b.fitted_min, b.fitted_max), (lo, hi));
        assert!((b.max - 1.25 * hi).abs() <= 1e-9 * hi && (b.min - lo / 1.25).abs() <= 1e-9 * lo);
        assert!(frequency_in_data(&m, (lo * hi).sqrt()));
        assert!(frequency_in_data(&m, 1.2 * hi));
        assert!(!frequency_in_data(&m, 1.3 * hi));
        assert!(!frequency_in_data(&m, lo / 1.3));
    }
}
