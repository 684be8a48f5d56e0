//! Core loss density from the Steinmetz family of equations.

use crate::error::{positive, Result};
use crate::material::Steinmetz;

/// Steinmetz equation for a sinusoidal flux of peak `b_pk` (T) at `f` (Hz):
/// Pv = k·f^α·B^β, W/m³ (Steinmetz 1892, in the usual fitted form).
pub fn steinmetz(s: &Steinmetz, f: f64, b_pk: f64) -> Result<f64> {
    positive("frequency", f, "Hz")?;
    crate::error::non_negative("flux_density", b_pk, "T")?;
    Ok(s.k * f.powf(s.alpha) * b_pk.powf(s.beta))
}

#[cfg(test)]
mod tests {
    use super::*;

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
}
