//! Ferrite materials: permeability, saturation, Steinmetz coefficients and
//! the temperature factor of loss.
//!
//! A [`Material`] is what the engine needs to know about a ferrite grade:
//!
//! * the initial relative permeability μi (gapped-inductance model, [`crate::gap`]);
//! * the saturation flux density at 25 °C and 100 °C, linearly interpolated
//!   by [`Material::bsat_at`], and the Curie temperature;
//! * the loss model: Steinmetz coefficients k, α, β for a sinusoid at the
//!   reference temperature (with the f and B ranges they hold over), and a
//!   quadratic temperature factor given by its temperature of least loss
//!   and its curvature (see [`TempFactor`]). [`crate::loss`] turns
//!   these into the loss of any piecewise-linear B(t) with the iGSE;
//! * resistivity and density (information for the report: core mass,
//!   whether a bare core may touch a winding).
//!
//! The built-in grades ([`library`]) are generic, with names of our own;
//! every value is typical, from memory; use your supplier's data. A user
//! may define a material (e.g. in a design file) and check it with
//! [`Material::validate`], or fit the loss coefficients from measured
//! points with [`fit`].

pub mod fit;
pub mod library;
mod lsq;

use crate::error::{Error, Result};
use serde::{Deserialize, Serialize};

/// Steinmetz coefficients for Pv = k·f^α·B^β (Pv in W/m³, f in Hz, B peak
/// in T, sinusoidal flux, at the reference temperature of the material's
/// [`TempFactor`]), with the ranges they were fitted over (Steinmetz 1892
/// form, generalised to a frequency exponent as is usual for ferrites).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Steinmetz {
    pub k: f64,
    pub alpha: f64,
    pub beta: f64,
    pub f_min: f64,
    pub f_max: f64,
    pub b_min: f64,
    pub b_max: f64,
}

/// Normalised quadratic temperature factor of loss, in its own form: the
/// temperature of least loss Tm and the curvature c around it,
///
/// Pv(T) = Pv(Tm)·(1 + c·(T − Tm)²), T and Tm in °C, c in 1/K².
///
/// The form (a parabola with its minimum at the temperature the grade is
/// designed to run at, common practice for ferrite loss fits, no single
/// source) is normalised: the factor is exactly 1 at Tm, so the Steinmetz
/// k is the loss coefficient at the loss minimum (for power grades near
/// 80–100 °C). c = 1e-4 /K² means +25 % at 50 K from the minimum. A flat
/// factor (c = 0) means no temperature dependence; Tm then only records
/// where k was measured.
///
/// Files of design-file version 1 held the expanded quadratic
/// a·T² − b·T + d; [`crate::design::upgrade`] converts it exactly
/// (Tm = b/(2a), the minimum value folds into k).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TempFactor {
    /// Temperature of least loss Tm, °C (where the factor is 1).
    pub least_loss_c: f64,
    /// Curvature c of the factor around Tm, 1/K² (0: flat).
    pub curvature: f64,
}

impl TempFactor {
    /// The factor at `t_c` °C: 1 + c·(T − Tm)². Never below a small
    /// positive floor, so an unvalidated negative curvature cannot give
    /// negative loss.
    pub fn at(&self, t_c: f64) -> f64 {
        let d = t_c - self.least_loss_c;
        (1.0 + self.curvature * d * d).max(0.05)
    }

    /// The factor 1 + c·(T − t_ref)²: minimum 1 at `t_ref` °C, curvature
    /// `c` per K².
    pub fn with_minimum(t_ref: f64, c: f64) -> TempFactor {
        TempFactor { least_loss_c: t_ref, curvature: c }
    }

    /// No temperature dependence: factor 1 everywhere (recorded at 25 °C).
    pub fn flat() -> TempFactor {
        TempFactor { least_loss_c: 25.0, curvature: 0.0 }
    }

    /// Whether the factor is 1 at every temperature.
    pub fn is_flat(&self) -> bool {
        self.curvature == 0.0
    }

    /// The reference temperature, °C: where the loss is least (Tm);
    /// `None` for a flat factor (any temperature is the reference).
    pub fn reference_temperature(&self) -> Option<f64> {
        if self.curvature > 0.0 && self.curvature.is_finite() && self.least_loss_c.is_finite() {
            Some(self.least_loss_c)
        } else {
            None
        }
    }

    /// Checks the factor: finite, Tm within −60…250 °C, a parabola opening
    /// upwards (or flat) and not steeper than 0.01 /K² (the factor would
    /// reach 26 at 50 K from the minimum: wide plausibility limits, common
    /// practice, no source). `field` prefixes the keys.
    pub fn validate(&self, field: &str) -> Result<()> {
        for (name, v) in [("least_loss_c", self.least_loss_c), ("curvature", self.curvature)] {
            if !v.is_finite() {
                return Err(Error::input(&format!("{field}.{name}"), "must be a finite number"));
            }
        }
        if !(-60.0..=250.0).contains(&self.least_loss_c) {
            return Err(Error::input(
                &format!("{field}.least_loss_c"),
                format!("the temperature of least loss ({:.0} °C) must lie within −60…250 °C", self.least_loss_c),
            ));
        }
        if self.curvature < 0.0 {
            return Err(Error::input(
                &format!("{field}.curvature"),
                "must not be negative: the loss is least at least_loss_c and rises either side (1 + c·(T − Tm)²); 0 is flat",
            ));
        }
        if self.curvature > 0.01 {
            return Err(Error::input(
                &format!("{field}.curvature"),
                format!("{:.3e} /K² is implausibly steep (at most 0.01 /K²; typical 3e-5 … 2e-4)", self.curvature),
            ));
        }
        Ok(())
    }
}

/// One ferrite grade.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
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
    /// Bulk DC resistivity, Ω·m (information: the Steinmetz fit already
    /// contains the eddy-current loss).
    pub resistivity: f64,
    /// Density, kg/m³ (core mass ≈ density·Ve).
    pub density: f64,
    /// Where the numbers come from.
    pub provenance: String,
    /// Set true to confirm that Bsat is meant to rise from 25 °C to 100 °C
    /// (`bsat_100 > bsat_25`). Ferrite's saturation falls as it warms
    /// towards its Curie point, so a rising Bsat is almost always the two
    /// values swapped, and [`Material::validate`] refuses it unless this
    /// flag says it is deliberate (e.g. a measured grade with an unusual
    /// curve). Left out of files when false.
    #[serde(default, skip_serializing_if = "is_false")]
    pub bsat_rise_intended: bool,
}

fn is_false(b: &bool) -> bool {
    !*b
}

impl Material {
    /// Saturation flux density at `t_c` °C: linear between the 25 °C and
    /// 100 °C values, extrapolated linearly beyond (common practice, no
    /// source), never below zero.
    pub fn bsat_at(&self, t_c: f64) -> f64 {
        let s = (t_c - 25.0) / 75.0;
        (self.bsat_25 + s * (self.bsat_100 - self.bsat_25)).max(0.0)
    }

    /// The temperature where the loss is least (the reference temperature
    /// of k), °C; `None` for a flat temperature factor.
    pub fn reference_temperature(&self) -> Option<f64> {
        self.temp_factor.reference_temperature()
    }

    /// Checks a (user-defined) material. Each error names the field as
    /// `material.<field>` (`material.steinmetz.alpha`, ...). The bounds are
    /// wide plausibility limits for soft magnetic materials, not a claim
    /// about any grade (common practice, no source).
    pub fn validate(&self) -> Result<()> {
        let f = |name: &str| format!("material.{name}");
        if self.name.trim().is_empty() {
            return Err(Error::input("material.name", "give the material a name"));
        }
        check_range(&f("mu_i"), self.mu_i, 1.0, 1.0e6, "(relative permeability)")?;
        check_range(&f("bsat_25"), self.bsat_25, 0.01, 2.5, "T")?;
        check_range(&f("bsat_100"), self.bsat_100, 0.0, 2.5, "T")?;
        if self.bsat_100 > self.bsat_25 && !self.bsat_rise_intended {
            return Err(Error::input(
                "material.bsat_100",
                format!(
                    "Bsat rises from {:.0} mT at 25 °C to {:.0} mT at 100 °C, but a ferrite's saturation falls as it warms: \
                     check that the two values are not swapped, or set bsat_rise_intended to true if the rise is deliberate",
                    self.bsat_25 * 1e3,
                    self.bsat_100 * 1e3
                ),
            ));
        }
        if self.bsat_100 > 0.0 {
            check_range(
                &f("curie_c"),
                self.curie_c,
                100.0,
                1000.0,
                "°C (a material with Bsat > 0 at 100 °C has its Curie point above 100 °C)",
            )?;
        } else {
            check_range(&f("curie_c"), self.curie_c, 25.0, 1000.0, "°C")?;
        }
        let s = &self.steinmetz;
        let p = |name: &str| format!("material.steinmetz.{name}");
        crate::error::positive(&p("k"), s.k, "W/m³ at 1 Hz and 1 T")?;
        check_range(&p("alpha"), s.alpha, 0.9, 3.5, "(frequency exponent; 1 is pure hysteresis)")?;
        check_range(&p("beta"), s.beta, 1.0, 4.0, "(flux exponent)")?;
        crate::error::positive(&p("f_min"), s.f_min, "Hz")?;
        crate::error::positive(&p("f_max"), s.f_max, "Hz")?;
        if s.f_max <= s.f_min {
            return Err(Error::input(&p("f_max"), "must be above f_min"));
        }
        crate::error::non_negative(&p("b_min"), s.b_min, "T")?;
        check_range(&p("b_max"), s.b_max, 1e-4, 2.5, "T")?;
        if s.b_max <= s.b_min {
            return Err(Error::input(&p("b_max"), "must be above b_min"));
        }
        self.temp_factor.validate("material.temp_factor")?;
        crate::error::positive(&f("resistivity"), self.resistivity, "Ω·m")?;
        check_range(&f("density"), self.density, 1000.0, 20000.0, "kg/m³")?;
        Ok(())
    }
}

fn check_range(field: &str, v: f64, lo: f64, hi: f64, unit: &str) -> Result<f64> {
    crate::error::in_range(field, v, lo, hi, unit)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn factor_is_the_parabola_about_its_minimum() {
        // 1 + c(T − Tm)²: the definition (common practice, no source).
        let t = TempFactor::with_minimum(90.0, 1.5e-4);
        for temp in [-20.0, 25.0, 90.0, 140.0] {
            let direct = 1.0 + 1.5e-4 * (temp - 90.0) * (temp - 90.0);
            assert!((t.at(temp) - direct).abs() < 1e-12);
        }
        assert!((t.at(40.0) - 1.375).abs() < 1e-12);
        assert!((t.reference_temperature().unwrap() - 90.0).abs() < 1e-12);
        assert!(t.validate("tf").is_ok());
        assert!(TempFactor::flat().validate("tf").is_ok());
        assert!(TempFactor::flat().is_flat());
        assert_eq!(TempFactor::flat().reference_temperature(), None);
        assert_eq!(TempFactor::flat().at(-40.0), 1.0);
    }

    #[test]
    fn temp_factor_rejects_inverted_and_implausible() {
        let e = TempFactor { least_loss_c: 90.0, curvature: -1e-4 }.validate("m.tf").unwrap_err();
        assert_eq!(e.field(), Some("m.tf.curvature"));
        let e = TempFactor { least_loss_c: 90.0, curvature: 0.5 }.validate("m.tf").unwrap_err();
        assert_eq!(e.field(), Some("m.tf.curvature"));
        let e = TempFactor { least_loss_c: 400.0, curvature: 1e-4 }.validate("m.tf").unwrap_err();
        assert_eq!(e.field(), Some("m.tf.least_loss_c"));
        let e = TempFactor { least_loss_c: f64::NAN, curvature: 1e-4 }.validate("m.tf").unwrap_err();
        assert_eq!(e.field(), Some("m.tf.least_loss_c"));
        // The old expanded keys are refused by the new form.
        let old = r#"{"ct2": 1e-4, "ct1": 0.02, "ct0": 2.0}"#;
        assert!(serde_json::from_str::<TempFactor>(old).is_err());
    }

    #[test]
    fn validate_names_the_field() {
        let good = library::find("MnZn-200k").unwrap();
        assert!(good.validate().is_ok());
        type Edit = Box<dyn Fn(&mut Material)>;
        let cases: Vec<(&str, Edit)> = vec![
            ("material.name", Box::new(|m| m.name = " ".into())),
            ("material.mu_i", Box::new(|m| m.mu_i = 0.5)),
            ("material.bsat_25", Box::new(|m| m.bsat_25 = f64::NAN)),
            ("material.curie_c", Box::new(|m| m.curie_c = 90.0)),
            ("material.bsat_100", Box::new(|m| m.bsat_100 = m.bsat_25 + 0.01)),
            ("material.steinmetz.k", Box::new(|m| m.steinmetz.k = 0.0)),
            ("material.steinmetz.alpha", Box::new(|m| m.steinmetz.alpha = 5.0)),
            ("material.steinmetz.beta", Box::new(|m| m.steinmetz.beta = 0.2)),
            ("material.steinmetz.f_max", Box::new(|m| m.steinmetz.f_max = m.steinmetz.f_min)),
            ("material.steinmetz.b_max", Box::new(|m| m.steinmetz.b_max = 0.0)),
            ("material.temp_factor.curvature", Box::new(|m| m.temp_factor.curvature = -1.0)),
            ("material.resistivity", Box::new(|m| m.resistivity = -1.0)),
            ("material.density", Box::new(|m| m.density = 10.0)),
        ];
        for (field, edit) in cases {
            let mut m = good.clone();
            edit(&mut m);
            let e = m.validate().unwrap_err();
            assert_eq!(e.field(), Some(field), "{e}");
            assert!(!e.message().is_empty());
        }
    }

    /// Ferrite's saturation falls with temperature towards zero at the Curie
    /// point (common practice, no source): a rising Bsat is refused at
    /// entry unless marked deliberate, and the flag survives a file.
    #[test]
    fn rising_bsat_is_refused_unless_intended() {
        let mut m = library::find("MnZn-200k").unwrap();
        std::mem::swap(&mut m.bsat_25, &mut m.bsat_100);
        let e = m.validate().unwrap_err();
        assert_eq!(e.field(), Some("material.bsat_100"));
        assert!(e.message().contains("bsat_rise_intended"), "{e}");
        m.bsat_rise_intended = true;
        assert!(m.validate().is_ok());
        let text = serde_json::to_string(&m).unwrap();
        assert!(text.contains("\"bsat_rise_intended\":true"));
        let back: Material = serde_json::from_str(&text).unwrap();
        assert_eq!(back, m);
        // Absent from the file when false, and false when absent.
        let plain = library::find("MnZn-200k").unwrap();
        let text = serde_json::to_string(&plain).unwrap();
        assert!(!text.contains("bsat_rise_intended"));
        assert!(!serde_json::from_str::<Material>(&text).unwrap().bsat_rise_intended);
    }

    #[test]
    fn bsat_interpolates_linearly() {
        let m = library::find("MnZn-200k").unwrap();
        assert!((m.bsat_at(25.0) - m.bsat_25).abs() < 1e-12);
        assert!((m.bsat_at(100.0) - m.bsat_100).abs() < 1e-12);
        assert!((m.bsat_at(62.5) - 0.5 * (m.bsat_25 + m.bsat_100)).abs() < 1e-12);
    }
}
