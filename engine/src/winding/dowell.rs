//! Dowell's one-dimensional model of eddy-current loss in layered windings.
//!
//! Dowell (1966, "Effects of eddy currents in transformer windings", Proc.
//! IEE 113(8)) solves the diffusion equation across a conducting layer of
//! thickness h in a field parallel to its faces. With Δ = h/δ, a layer whose
//! faces see the magnetomotive forces F₀ and F₁ (ampere-turns, RMS phasors)
//! dissipates, per unit of its DC resistance-to-ampere-turns ratio,
//!
//! P = (ρ·l/A)·Δ·[(|F₀|² + |F₁|²)·ψ₁(Δ) − 4·Re(F₀·F₁*)·ψ₂(Δ)]
//!
//! with l the turn length, A the copper cross-section of the whole layer,
//! ψ₁ = (sinh 2Δ + sin 2Δ)/(cosh 2Δ − cos 2Δ) and
//! ψ₂ = (sinh Δ·cos Δ + cosh Δ·sin Δ)/(cosh 2Δ − cos 2Δ).
//! For in-phase fields, F₀ = (m − 1)·ΔF and F₁ = m·ΔF, this is the per-layer
//! factor Fr = Δ·[(m² + (m − 1)²)·ψ₁ − 4m(m − 1)·ψ₂], and averaged over
//! layers m = 1..M it is Dowell's Fr = Δ·[ψ₁ + (2(M² − 1)/3)·ψ₃] with
//! ψ₃ = (sinh Δ − sin Δ)/(cosh Δ + cos Δ). The complex form lets windings
//! carry currents of different phase (each harmonic of each winding), and
//! a layer with no current of its own (F₀ = F₁) still shows its proximity
//! loss. Interleaving and partial layers need nothing special: only the
//! MMF at each layer's faces matters.
//!
//! Numerics: below Δ = 0.5 we use the Taylor series (the direct form
//! cancels), above Δ = 20 the exponential asymptote (cosh overflows near
//! 355): ψ₁ → 1, ψ₂ → e^(−Δ)(cos Δ + sin Δ).

use crate::error::{positive, Result};

/// Permeability of free space, H/m (CODATA 2018 value 1.25663706212e−6;
/// within 1e−9 of 4π·10⁻⁷).
pub const MU0: f64 = 1.256_637_062_12e-6;

/// Skin depth δ = √(ρ/(π·f·μ0)), m, for resistivity `rho` (Ω·m) at
/// frequency `f` (Hz). (E.g. Ramo, Whinnery & Van Duzer, Fields and Waves
/// in Communication Electronics, skin effect section.)
pub fn skin_depth(rho: f64, f: f64) -> Result<f64> {
    positive("resistivity", rho, "Ω·m")?;
    positive("frequency", f, "Hz")?;
    Ok((rho / (std::f64::consts::PI * f * MU0)).sqrt())
}

/// Δ·ψ₁(Δ) and Δ·ψ₂(Δ) (see the module docs), the two functions that the
/// per-layer loss needs. Both tend to 1 and 1/2 as Δ → 0. `Δ ≥ 0`; a
/// negative or non-finite Δ is treated as 0 (no loss beyond DC).
pub fn dpsi(delta: f64) -> (f64, f64) {
    let d = if delta.is_finite() && delta > 0.0 { delta } else { 0.0 };
    if d < 0.5 {
        // Taylor series (computed symbolically from the closed forms).
        let d4 = d * d * d * d;
        let p1 = 1.0 + d4 * (4.0 / 45.0 + d4 * (-16.0 / 4725.0 + d4 * (88448.0 / 638_512_875.0)));
        let p2 = 0.5 + d4 * (-7.0 / 180.0 + d4 * (127.0 / 75600.0 + d4 * (-1_414_477.0 / 20_432_412_000.0)));
        return (p1, p2);
    }
    if d > 40.0 {
        // Δψ₂ ≈ Δ·e^(−Δ)·√2 < 2e−16 and ψ₁ = 1 to rounding: no
        // transcendental call (most of the analytic tail's nodes).
        return (d, 0.0);
    }
    if d > 20.0 {
        let (s, c) = d.sin_cos();
        return (d, d * (-d).exp() * (c + s));
    }
    // One exp and one sin_cos; the double angles by identities.
    let (s1, c1) = d.sin_cos();
    let (s2, c2) = (2.0 * s1 * c1, 1.0 - 2.0 * s1 * s1);
    let e = d.exp();
    let ei = 1.0 / e;
    let (sh1, ch1) = (0.5 * (e - ei), 0.5 * (e + ei));
    let (sh2, ch2) = (2.0 * sh1 * ch1, 2.0 * ch1 * ch1 - 1.0);
    let den = ch2 - c2;
    (d * (sh2 + s2) / den, d * (sh1 * c1 + ch1 * s1) / den)
}

/// ψ₃(Δ) = (sinh Δ − sin Δ)/(cosh Δ + cos Δ), Dowell's proximity term.
pub fn psi3(delta: f64) -> f64 {
    let d = if delta.is_finite() && delta > 0.0 { delta } else { 0.0 };
    if d > 20.0 {
        return 1.0;
    }
    (d.sinh() - d.sin()) / (d.cosh() + d.cos())
}

/// Dowell's (1966) AC resistance factor of a portion of `m` layers whose
/// MMF rises from zero (Fr = Rac/Rdc): Fr = Δ·[ψ₁ + (2(m² − 1)/3)·ψ₃].
/// `m` may be fractional (Dowell's m is the ratio of the MMF at the
/// portion's outer face to the MMF of one layer).
pub fn fr_dowell(delta: f64, m: f64) -> f64 {
    let (p1, _) = dpsi(delta);
    p1 + delta.max(0.0) * 2.0 * (m * m - 1.0) / 3.0 * psi3(delta)
}

/// Per-layer factor for in-phase fields, layer MMF ratio m = F₁/(F₁ − F₀):
/// Fr,layer = Δ·[(m² + (m − 1)²)·ψ₁ − 4m(m − 1)·ψ₂].
pub fn fr_layer(delta: f64, m: f64) -> f64 {
    let (p1, p2) = dpsi(delta);
    (m * m + (m - 1.0) * (m - 1.0)) * p1 - 4.0 * m * (m - 1.0) * p2
}

/// Equivalent-foil Δ of round wire of bare diameter `d` at skin depth
/// `delta_skin`, porosity `eta`: Δ = (√π/2)·(d/δ)·√η. The round conductor
/// becomes a square of the same area, side (√π/2)·d (Dowell 1966, section
/// on round conductors).
pub fn round_equivalent_delta(d: f64, delta_skin: f64, eta: f64) -> f64 {
    0.5 * std::f64::consts::PI.sqrt() * d / delta_skin * eta.max(0.0).sqrt()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The series and asymptote agree with the direct form where they meet.
    #[test]
    fn branches_join() {
        let direct = |d: f64| {
            let den = (2.0 * d).cosh() - (2.0 * d).cos();
            (
                d * ((2.0 * d).sinh() + (2.0 * d).sin()) / den,
                d * (d.sinh() * d.cos() + d.cosh() * d.sin()) / den,
            )
        };
        for d in [0.499_999, 0.5, 19.99, 20.0, 20.01] {
            let (a1, a2) = dpsi(d);
            let (b1, b2) = direct(d);
            assert!(
                (a1 - b1).abs() < 1e-9 * b1 && (a2 - b2).abs() < 1e-9,
                "{d}: {a1} {b1} / {a2} {b2}"
            );
        }
        assert_eq!(dpsi(0.0), (1.0, 0.5));
        let (p1, _) = dpsi(1e6);
        assert!(p1.is_finite());
    }

    /// Averaging the per-layer factor over m = 1..M gives Dowell's formula
    /// (Dowell 1966; this checks the identity ψ₃ = ψ₁ − 2ψ₂).
    #[test]
    fn per_layer_average_is_dowell() {
        for delta in [0.3, 1.0, 2.5, 7.0] {
            for big_m in 1..=6 {
                let avg: f64 = (1..=big_m).map(|m| fr_layer(delta, m as f64)).sum::<f64>() / big_m as f64;
                let d = fr_dowell(delta, big_m as f64);
                assert!((avg - d).abs() < 1e-9 * d, "Δ={delta} M={big_m}: {avg} vs {d}");
            }
        }
    }

    #[test]
    fn skin_depth_of_copper_at_100k() {
        // ρ = 1.7241e-8 Ω·m at 100 kHz: δ = √(ρ/(π f μ0)) = 0.2090 mm
        // (computed by hand from the formula).
        let d = skin_depth(1.0 / 58.0e6, 100e3).unwrap();
        assert!((d - 0.2090e-3).abs() < 0.0005e-3, "{d}");
        assert!(skin_depth(1e-8, 0.0).is_err());
    }
}
