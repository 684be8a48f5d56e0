//! Temperature rise and thermal equilibrium.
//!
//! Model: McLyman's natural-convection relation for a transformer in still
//! air (C. Wm. T. McLyman, *Transformer and Inductor Design Handbook*,
//! "Temperature rise" chapter; the relation as given there, from memory):
//!
//! ΔT = 450 · ψ^0.826  [°C],   ψ = P_total / A_t  [W/cm²]
//!
//! with A_t the exposed surface. We use the core set's outer surface
//! (`Core::surface_area`) as A_t; the winding's exposed surface is ignored,
//! which overstates the rise slightly for cores with open windows (a
//! conservative choice, stated here).
//!
//! Losses depend on temperature (copper resistivity rises, ferrite loss has
//! its quadratic temperature factor), so the operating temperature is the
//! fixed point T = Ta + ΔT(P(T)), found by iteration. Where no fixed point
//! exists below the search ceiling, the design is in thermal runaway.

use crate::error::{non_negative, positive, Error, Result};
use serde::{Deserialize, Serialize};

/// McLyman's coefficient and exponent (see the module docs).
pub const MCLYMAN_K: f64 = 450.0;
pub const MCLYMAN_EXP: f64 = 0.826;

/// Temperature rise (K) of `loss` watts over `surface` m² by McLyman's
/// relation ΔT = 450·(P/A, A in cm²)^0.826.
pub fn rise(loss: f64, surface: f64) -> Result<f64> {
    non_negative("loss", loss, "W")?;
    positive("surface_area", surface, "m²")?;
    let psi = loss / (surface * 1e4);
    Ok(MCLYMAN_K * psi.powf(MCLYMAN_EXP))
}

/// Result of the equilibrium iteration.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Equilibrium {
    /// Operating (mean surface) temperature, °C.
    pub temperature: f64,
    /// Rise over ambient, K.
    pub rise: f64,
    /// Total loss at that temperature, W.
    pub loss: f64,
    /// Iterations used, and each iterate's temperature (°C).
    pub iterations: u32,
    pub history: Vec<f64>,
    /// True when no equilibrium exists below the ceiling.
    pub runaway: bool,
}

/// Finds T = Ta + ΔT(P(T)). `loss_at(T)` returns the total loss at T °C.
/// The search stops at `ceiling` °C (e.g. the material's Curie temperature
/// or a hard limit): reaching it is reported as runaway, not as an error.
///
/// Iteration: plain fixed-point steps, damped by ½ once they oscillate;
/// converged when successive temperatures differ by less than 0.01 K.
pub fn equilibrium(
    ambient: f64,
    surface: f64,
    ceiling: f64,
    mut loss_at: impl FnMut(f64) -> Result<f64>,
) -> Result<Equilibrium> {
    if !ambient.is_finite() || !(-60.0..=150.0).contains(&ambient) {
        return Err(Error::input("ambient", "ambient temperature must lie between −60 and 150 °C"));
    }
    positive("surface_area", surface, "m²")?;
    if !(ceiling.is_finite() && ceiling > ambient) {
        return Err(Error::input("max_temperature", "the temperature limit must be above ambient"));
    }
    let mut t = ambient;
    let mut history = Vec::with_capacity(16);
    let mut damp = 1.0;
    let mut last_step = 0.0_f64;
    for i in 1..=200u32 {
        let p = loss_at(t)?;
        if !p.is_finite() || p < 0.0 {
            return Err(Error::infeasible(None, "the loss model gave a non-finite loss"));
        }
        let target = ambient + rise(p, surface)?;
        let step = target - t;
        if step * last_step < 0.0 {
            damp = 0.5;
        }
        last_step = step;
        let next = t + damp * step;
        history.push(next.min(ceiling));
        if next >= ceiling {
            let p = loss_at(ceiling)?;
            return Ok(Equilibrium {
                temperature: ceiling,
                rise: ceiling - ambient,
                loss: p,
                iterations: i,
                history,
                runaway: true,
            });
        }
        if (next - t).abs() < 0.01 {
            let p = loss_at(next)?;
            return Ok(Equilibrium { temperature: next, rise: next - ambient, loss: p, iterations: i, history, runaway: false });
        }
        t = next;
    }
    Err(Error::infeasible(None, "the thermal iteration did not settle; check the loss model's temperature dependence"))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn mclyman_relation_values() {
        // ΔT = 450·ψ^0.826: ψ = 0.03 W/cm² gives ≈ 24.9 K (computed from
        // McLyman's relation; the handbook's rule of thumb of about 25 °C
        // rise at 0.03 W/cm² is from memory).
        let r = rise(3.0, 100e-4).unwrap();
        assert!((r - 450.0 * 0.03f64.powf(0.826)).abs() < 1e-9);
        assert!((r - 24.85).abs() < 0.05, "{r}");
        assert_eq!(rise(0.0, 1e-3).unwrap(), 0.0);
        assert!(rise(1.0, 0.0).is_err());
    }

    #[test]
    fn constant_loss_settles_in_one_step() {
        let e = equilibrium(40.0, 50e-4, 200.0, |_| Ok(2.0)).unwrap();
        let want = 40.0 + rise(2.0, 50e-4).unwrap();
        assert!((e.temperature - want).abs() < 1e-9);
        assert!(!e.runaway);
        assert!(e.iterations <= 2);
    }

    #[test]
    fn temperature_dependent_loss_reaches_the_fixed_point() {
        // Copper-like loss rising 0.393 %/K: the result must satisfy T = Ta + ΔT(P(T)).
        let p = |t: f64| 2.0 * (1.0 + 0.00393 * (t - 20.0));
        let e = equilibrium(25.0, 40e-4, 300.0, |t| Ok(p(t))).unwrap();
        let residual = 25.0 + rise(p(e.temperature), 40e-4).unwrap() - e.temperature;
        assert!(residual.abs() < 0.02, "{residual}");
        assert_eq!(e.history.len() as u32, e.iterations);
    }

    #[test]
    fn runaway_is_flagged() {
        let e = equilibrium(25.0, 10e-4, 180.0, |t| Ok(1.0 * (0.05 * t).exp())).unwrap();
        assert!(e.runaway);
        assert_eq!(e.temperature, 180.0);
    }

    #[test]
    fn bad_inputs_named() {
        assert_eq!(equilibrium(f64::NAN, 1e-3, 100.0, |_| Ok(1.0)).unwrap_err().field(), Some("ambient"));
        assert_eq!(equilibrium(25.0, 1e-3, 20.0, |_| Ok(1.0)).unwrap_err().field(), Some("max_temperature"));
    }
}
