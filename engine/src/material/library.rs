//! Built-in generic ferrite grades. Names are our own; every value is
//! typical, from memory; use your supplier's data.

use super::{Material, Steinmetz, TempFactor};
use crate::error::{Error, Result};

const PROVENANCE: &str = "typical, from memory; use your supplier's data";

/// Every built-in material.
pub fn materials() -> Vec<Material> {
    vec![Material {
        name: "MnZn-P200".into(),
        description: "MnZn power ferrite for 25–200 kHz, loss minimum near 100 °C".into(),
        mu_i: 2300.0,
        bsat_25: 0.49,
        bsat_100: 0.39,
        curie_c: 215.0,
        steinmetz: Steinmetz { k: 10.0, alpha: 1.3, beta: 2.6, f_min: 20e3, f_max: 300e3, b_min: 0.02, b_max: 0.3 },
        temp_factor: TempFactor { ct2: 1.0e-4, ct1: 2.0e-2, ct0: 2.0 },
        provenance: PROVENANCE.into(),
    }]
}

/// Looks a material up by name (case ignored).
pub fn find(name: &str) -> Result<Material> {
    materials()
        .into_iter()
        .find(|m| m.name.eq_ignore_ascii_case(name.trim()))
        .ok_or_else(|| Error::unknown("material", format!("no material \"{name}\" in the library")))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn temperature_factor_is_one_at_its_minimum() {
        for m in materials() {
            let f = &m.temp_factor;
            let t_min = f.ct1 / (2.0 * f.ct2);
            assert!((f.at(t_min) - 1.0).abs() < 1e-9, "{}", m.name);
            assert!(f.at(25.0) > 1.0);
        }
    }
}
