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
//! with l the mean turn length (MLT), A the copper cross-section of the whole layer,
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
//! cancels); up to Δ = 40 the closed forms multiplied through by e^(−2Δ)
//! (cosh alone would overflow near 355), which tend to the exponential
//! asymptote ψ₁ → 1, ψ₂ → e^(−Δ)(cos Δ + sin Δ); above Δ = 40 ψ₂ = 0
//! (its share of any layer's loss, at most 2√2·e^(−Δ) since
//! |Re(F₀F₁*)| ≤ (|F₀|² + |F₁|²)/2, is then below 1e−17).
//!
//! Speed: [`dpsi`] is the inner function of the copper-loss sum (once per
//! conductor class and harmonic, and per class and quadrature node of the
//! analytic tail). Between Δ = 0.5 and 20 it costs one `exp`, one sin/cos
//! pair (a short Cody–Waite reduction and Taylor polynomials, see
//! `sin_cos`, several times cheaper than the general library routine)
//! and one division; the hyperbolic and double-angle values come from
//! identities written in e^(−2Δ) so that nothing overflows. Above Δ = 40
//! it calls no transcendental function at all.

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
#[inline]
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
    // One exp, one sin/cos pair and one division, for Δ from 0.5 to 40.
    // With E = e^(−2Δ), numerators and denominator times 2E:
    // 2E·(sinh 2Δ + sin 2Δ) = 1 − E² + 2E·sin 2Δ,
    // 2E·(cosh 2Δ − cos 2Δ) = 1 + E² − 2E·cos 2Δ,
    // 2E·(sinh Δ·cos Δ + cosh Δ·sin Δ) = e^(−Δ)·[(cos Δ + sin Δ) + E·(sin Δ − cos Δ)];
    // nothing overflows, and above Δ ≈ 18 it is the asymptote to rounding.
    let (s1, c1) = sin_cos(d);
    let (s2, c2) = (2.0 * s1 * c1, 1.0 - 2.0 * s1 * s1);
    let e1 = (-d).exp();
    let e = e1 * e1;
    let q = d / (1.0 + e * e - 2.0 * e * c2);
    (q * (1.0 - e * e + 2.0 * e * s2), q * e1 * ((c1 + s1) + e * (s1 - c1)))
}

/// π/2 in three parts for the Cody–Waite reduction (Cody & Waite 1980,
/// Software Manual for the Elementary Functions): the f64 nearest
/// π/2 with its low 20 mantissa bits cleared (so k·HI is exact for
/// k < 2²⁰), the rest of that f64 (exact, at most 20 bits), and π/2 minus
/// the f64 nearest it (6.123 233 995 736 766e−17; checked in the tests
/// against cos(π/2) evaluated by the standard library, which equals it).
const PIO2_HI: f64 = f64::from_bits(std::f64::consts::FRAC_PI_2.to_bits() & !0xF_FFFF);
const PIO2_MID: f64 = std::f64::consts::FRAC_PI_2 - PIO2_HI;
const PIO2_LO: f64 = 6.123_233_995_736_766e-17;

/// sin x and cos x for 0 ≤ x ≤ 64 (the range [`dpsi`] needs), within about
/// 2e−16 absolute of the exact values. Reduction x = k·π/2 + r, |r| ≤ π/4,
/// by Cody–Waite with [`PIO2_HI`], [`PIO2_MID`], [`PIO2_LO`], then the
/// Taylor series of sin r to r¹⁷ and of cos r to r¹⁶ (truncation below
/// 1e−19 at |r| = π/4; the Maclaurin series, coefficients ±1/k!) in
/// Horner form, and
/// the quadrant from k mod 4. Several times faster than the general
/// library routine (which also handles huge arguments and, natively, saves
/// and restores the rounding mode), with no branch on the value but the
/// quadrant. Outside the range it falls back to `f64::sin_cos`.
#[inline]
fn sin_cos(x: f64) -> (f64, f64) {
    if !(0.0..=64.0).contains(&x) {
        return x.sin_cos();
    }
    // Round to nearest by truncation of a non-negative value (a cast, no
    // call to `floor` on targets without a rounding instruction).
    let k = ((x * std::f64::consts::FRAC_2_PI + 0.5) as u32) as f64;
    let r = ((x - k * PIO2_HI) - k * PIO2_MID) - k * PIO2_LO;
    let z = r * r;
    const S: [f64; 8] = [
        -1.0 / 6.0,
        1.0 / 120.0,
        -1.0 / 5040.0,
        1.0 / 362_880.0,
        -1.0 / 39_916_800.0,
        1.0 / 6_227_020_800.0,
        -1.0 / 1_307_674_368_000.0,
        1.0 / 355_687_428_096_000.0,
    ];
    const C: [f64; 8] = [
        -1.0 / 2.0,
        1.0 / 24.0,
        -1.0 / 720.0,
        1.0 / 40_320.0,
        -1.0 / 3_628_800.0,
        1.0 / 479_001_600.0,
        -1.0 / 87_178_291_200.0,
        1.0 / 20_922_789_888_000.0,
    ];
    let ps = S[0] + z * (S[1] + z * (S[2] + z * (S[3] + z * (S[4] + z * (S[5] + z * (S[6] + z * S[7]))))));
    let pc = C[0] + z * (C[1] + z * (C[2] + z * (C[3] + z * (C[4] + z * (C[5] + z * (C[6] + z * C[7]))))));
    let s = r + r * z * ps;
    let c = 1.0 + z * pc;
    match k as u32 & 3 {
        0 => (s, c),
        1 => (c, -s),
        2 => (-s, -c),
        _ => (-c, s),
    }
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

    /// The rescaled closed forms and the fast sin/cos against Dowell's
    /// closed forms evaluated directly with the standard library's
    /// functions, on a grid of Δ from 0.5 to 60.
    #[test]
    fn dpsi_matches_the_direct_closed_forms() {
        let mut worst = (0.0_f64, 0.0_f64);
        for i in 0..=11_900 {
            let d = 0.5 + i as f64 * 0.005;
            let (a1, a2) = dpsi(d);
            let den = (2.0 * d).cosh() - (2.0 * d).cos();
            let b1 = d * ((2.0 * d).sinh() + (2.0 * d).sin()) / den;
            let b2 = d * (d.sinh() * d.cos() + d.cosh() * d.sin()) / den;
            worst.0 = worst.0.max((a1 - b1).abs() / b1);
            // Δψ₂ relative to Δψ₁ (how it enters the loss).
            worst.1 = worst.1.max((a2 - b2).abs() / b1);
        }
        assert!(worst.0 < 1e-14 && worst.1 < 1e-14, "{worst:?}");
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

    /// The fast sin_cos against the standard library's on a dense grid
    /// of [0, 64] and at the quadrant edges; the third part of π/2 is the
    /// rounding error of FRAC_PI_2, which is what cos(FRAC_PI_2) returns.
    #[test]
    fn fast_sin_cos_matches_std() {
        assert!((PIO2_LO - std::f64::consts::FRAC_PI_2.cos()).abs() < 1e-31);
        assert_eq!(PIO2_HI + PIO2_MID, std::f64::consts::FRAC_PI_2);
        let mut worst = 0.0_f64;
        let mut check = |x: f64| {
            let (s, c) = sin_cos(x);
            let (s0, c0) = x.sin_cos();
            worst = worst.max((s - s0).abs()).max((c - c0).abs());
        };
        for i in 0..=640_000 {
            check(i as f64 * 1e-4);
        }
        for k in 0..=40 {
            let edge = (k as f64 + 0.5) * std::f64::consts::FRAC_PI_2;
            for x in [edge.next_down(), edge, edge.next_up()] {
                check(x);
            }
        }
        assert!(worst < 2.5e-16, "{worst}");
        assert_eq!(sin_cos(100.0), 100.0_f64.sin_cos());
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
