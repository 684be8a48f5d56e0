//! Built-in generic ferrite grades. Names are our own; every value is
//! typical, from memory; use your supplier's data.
//!
//! Naming: the family (MnZn, NiZn), then a letter for the use (P power,
//! H high permeability, B high saturation, N NiZn) and the upper end of the
//! frequency range ("200" for 200 kHz, "1M" for 1 MHz), a trailing "W" for
//! a flat (wide-temperature) loss curve.
//!
//! Loss model of every grade: Pv = k·f^α·B^β (sinusoid, W/m³, Hz, T peak)
//! at the reference temperature T_ref, times the temperature factor
//! 1 + c·(T − T_ref)² (its minimum 1 at T_ref, the temperature of least
//! loss; see [`TempFactor`]). Each k below was chosen so that the
//! loss at one anchor point (named beside it) matches a typical value for
//! such a grade, from memory.

use super::{Material, Steinmetz, TempFactor};
use crate::error::{Error, Result};

const PROVENANCE: &str = "typical, from memory; use your supplier's data";

/// Every built-in material.
pub fn materials() -> Vec<Material> {
    vec![
        Material {
            name: "MnZn-200k".into(),
            description: "MnZn power ferrite for 25–200 kHz, loss minimum near 100 °C".into(),
            mu_i: 2300.0,
            bsat_25: 0.49,
            bsat_100: 0.39,
            curie_c: 215.0,
            // Anchor: about 79 kW/m³ at 100 kHz, 100 mT, 100 °C.
            steinmetz: Steinmetz { k: 10.0, alpha: 1.3, beta: 2.6, f_min: 20e3, f_max: 300e3, b_min: 0.02, b_max: 0.3 },
            temp_factor: TempFactor::with_minimum(100.0, 1.0e-4),
            resistivity: 5.0,
            density: 4800.0,
            provenance: PROVENANCE.into(),
            bsat_rise_intended: false,
        },
        Material {
            name: "MnZn-200k-flat".into(),
            description: "MnZn power ferrite for 25–200 kHz with a flat loss curve from about 25 to 120 °C".into(),
            mu_i: 2400.0,
            bsat_25: 0.50,
            bsat_100: 0.40,
            curie_c: 220.0,
            // Anchor: about 100 kW/m³ at 100 kHz, 100 mT, 70 °C.
            steinmetz: Steinmetz { k: 12.6, alpha: 1.3, beta: 2.6, f_min: 20e3, f_max: 300e3, b_min: 0.02, b_max: 0.3 },
            temp_factor: TempFactor::with_minimum(70.0, 4.0e-5),
            resistivity: 5.0,
            density: 4800.0,
            provenance: PROVENANCE.into(),
            bsat_rise_intended: false,
        },
        Material {
            name: "MnZn-500k".into(),
            description: "MnZn power ferrite for 200–500 kHz, loss minimum near 90 °C".into(),
            mu_i: 1500.0,
            bsat_25: 0.48,
            bsat_100: 0.38,
            curie_c: 220.0,
            // Anchor: about 100 kW/m³ at 300 kHz, 50 mT, 90 °C.
            steinmetz: Steinmetz { k: 0.118, alpha: 1.7, beta: 2.6, f_min: 150e3, f_max: 600e3, b_min: 0.01, b_max: 0.2 },
            temp_factor: TempFactor::with_minimum(90.0, 1.2e-4),
            resistivity: 8.0,
            density: 4800.0,
            provenance: PROVENANCE.into(),
            bsat_rise_intended: false,
        },
        Material {
            name: "MnZn-1M".into(),
            description: "MnZn power ferrite for 0.5–1 MHz, low flux swings, loss minimum near 80 °C".into(),
            mu_i: 900.0,
            bsat_25: 0.45,
            bsat_100: 0.36,
            curie_c: 240.0,
            // Anchor: about 250 kW/m³ at 1 MHz, 30 mT, 80 °C.
            steinmetz: Steinmetz { k: 1.6e-3, alpha: 2.0, beta: 2.5, f_min: 400e3, f_max: 1.5e6, b_min: 0.005, b_max: 0.1 },
            temp_factor: TempFactor::with_minimum(80.0, 1.5e-4),
            resistivity: 10.0,
            density: 4800.0,
            provenance: PROVENANCE.into(),
            bsat_rise_intended: false,
        },
        Material {
            name: "MnZn-hiperm".into(),
            description: "High-permeability MnZn ferrite (μi ≈ 10 000) for common-mode chokes and signal transformers, 10–100 kHz; low Curie point".into(),
            mu_i: 10000.0,
            bsat_25: 0.43,
            bsat_100: 0.26,
            curie_c: 125.0,
            // Anchor: about 150 kW/m³ at 25 kHz, 100 mT, 50 °C.
            steinmetz: Steinmetz { k: 33.0, alpha: 1.4, beta: 2.5, f_min: 10e3, f_max: 100e3, b_min: 0.02, b_max: 0.2 },
            temp_factor: TempFactor::with_minimum(50.0, 1.5e-4),
            resistivity: 0.5,
            density: 4900.0,
            provenance: PROVENANCE.into(),
            bsat_rise_intended: false,
        },
        Material {
            name: "MnZn-hiBsat".into(),
            description: "High-saturation MnZn power ferrite for chokes and hot transformers, 25–200 kHz, loss minimum near 100 °C".into(),
            mu_i: 2000.0,
            bsat_25: 0.53,
            bsat_100: 0.45,
            curie_c: 260.0,
            // Anchor: about 100 kW/m³ at 100 kHz, 100 mT, 100 °C.
            steinmetz: Steinmetz { k: 15.8, alpha: 1.3, beta: 2.7, f_min: 20e3, f_max: 200e3, b_min: 0.02, b_max: 0.35 },
            temp_factor: TempFactor::with_minimum(100.0, 1.0e-4),
            resistivity: 4.0,
            density: 4850.0,
            provenance: PROVENANCE.into(),
            bsat_rise_intended: false,
        },
        Material {
            name: "NiZn-5M".into(),
            description: "NiZn ferrite for 1–10 MHz (μi ≈ 125), very high resistivity, small flux swings".into(),
            mu_i: 125.0,
            bsat_25: 0.35,
            bsat_100: 0.30,
            curie_c: 350.0,
            // Anchor: about 300 kW/m³ at 5 MHz, 10 mT, 60 °C.
            steinmetz: Steinmetz { k: 0.228, alpha: 1.6, beta: 2.3, f_min: 1e6, f_max: 10e6, b_min: 0.002, b_max: 0.05 },
            temp_factor: TempFactor::with_minimum(60.0, 5.0e-5),
            resistivity: 1.0e5,
            density: 5000.0,
            provenance: PROVENANCE.into(),
            bsat_rise_intended: false,
        },
    ]
}

/// Looks a material up by name (case ignored).
pub fn find(name: &str) -> Result<Material> {
    materials().into_iter().find(|m| m.name.eq_ignore_ascii_case(name.trim())).ok_or_else(|| {
        let known: Vec<String> = materials().into_iter().map(|m| m.name).collect();
        Error::unknown("material", format!("no material \"{name}\" in the library (known: {})", known.join(", ")))
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn temperature_factor_is_one_at_its_minimum() {
        for m in materials() {
            let f = &m.temp_factor;
            let t_min = f.least_loss_c;
            assert!((f.at(t_min) - 1.0).abs() < 1e-9, "{}", m.name);
            assert!(f.at(t_min - 1.0) > 1.0 && f.at(t_min + 1.0) > 1.0, "{}", m.name);
        }
    }

    #[test]
    fn every_grade_is_valid_generic_and_unique() {
        let all = materials();
        assert!(all.len() >= 6);
        for (i, m) in all.iter().enumerate() {
            m.validate().unwrap_or_else(|e| panic!("{}: {e}", m.name));
            assert_eq!(m.provenance, PROVENANCE);
            assert!(m.name.starts_with("MnZn-") || m.name.starts_with("NiZn-"), "{}", m.name);
            assert!(m.bsat_100 < m.bsat_25, "{}: ferrite Bsat falls with temperature", m.name);
            for other in &all[i + 1..] {
                assert!(!m.name.eq_ignore_ascii_case(&other.name));
            }
            assert_eq!(find(&m.name.to_lowercase()).unwrap(), *m);
        }
        let e = find("no-such").unwrap_err();
        assert_eq!(e.field(), Some("material"));
        assert!(e.message().contains("MnZn-200k"));
    }

    /// The anchor losses in the comments above (the k values were derived
    /// from them with Pv = k·f^α·B^β; this guards against typos in k).
    #[test]
    fn anchor_losses_match_the_comments() {
        let anchors = [
            ("MnZn-200k", 100e3, 0.1, 79e3),
            ("MnZn-200k-flat", 100e3, 0.1, 100e3),
            ("MnZn-500k", 300e3, 0.05, 100e3),
            ("MnZn-1M", 1e6, 0.03, 250e3),
            ("MnZn-hiperm", 25e3, 0.1, 150e3),
            ("MnZn-hiBsat", 100e3, 0.1, 100e3),
            ("NiZn-5M", 5e6, 0.01, 300e3),
        ];
        for (name, f, b, pv) in anchors {
            let s = find(name).unwrap().steinmetz;
            let got = s.k * f64::powf(f, s.alpha) * f64::powf(b, s.beta);
            assert!((got / pv - 1.0).abs() < 0.01, "{name}: {got}");
            assert!(f >= s.f_min && f <= s.f_max && b >= s.b_min && b <= s.b_max);
        }
    }
}
