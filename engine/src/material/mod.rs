//! Ferrite materials: permeability, saturation, Steinmetz coefficients and
//! the temperature factor of loss.

pub mod library;

use serde::{Deserialize, Serialize};

/// Steinmetz coefficients for Pv = k·f^α·B^β (Pv in W/m³, f in Hz, B peak
/// in T), with the ranges they were fitted over (Steinmetz 1892 form).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Steinmetz {
    pub k: f64,
    pub alpha: f64,
    pub beta: f64,
    pub f_min: f64,
    pub f_max: f64,
    pub b_min: f64,
    pub b_max: f64,
}

/// Normalised quadratic temperature factor of loss:
/// Pv(T) = Pv(T_ref)·(ct2·T² − ct1·T + ct0), T in °C, equal to 1 at T_ref.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TempFactor {
    pub ct2: f64,
    pub ct1: f64,
    pub ct0: f64,
}

impl TempFactor {
    /// The factor at `t_c` °C. Never below a small positive floor, so a
    /// fitted parabola far outside its range cannot give negative loss.
    pub fn at(&self, t_c: f64) -> f64 {
        (self.ct2 * t_c * t_c - self.ct1 * t_c + self.ct0).max(0.05)
    }
}

/// One ferrite grade.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Material {
    pub name: String,
    pub description: String,
    /// Initial relative permeability μi.
    pub mu_i: f64,
    /// Saturation flux density at 25 °C and 100 °C, T.
    pub bsat_25: f64,
    pub bsat_100: f64,
    /// Curie temperature, °C.
    pub curie_c: f64,
    pub steinmetz: Steinmetz,
    pub temp_factor: TempFactor,
    /// Where the numbers come from.
    pub provenance: String,
}

impl Material {
    /// Saturation flux density at `t_c` °C: linear between the 25 °C and
    /// 100 °C values, extrapolated linearly beyond (common practice, no
    /// source), never below zero.
    pub fn bsat_at(&self, t_c: f64) -> f64 {
        let s = (t_c - 25.0) / 75.0;
        (self.bsat_25 + s * (self.bsat_100 - self.bsat_25)).max(0.0)
    }
}
