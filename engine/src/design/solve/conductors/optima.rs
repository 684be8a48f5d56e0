//! Published optima the conductor search starts from.
//!
//! * **Layer or foil thickness for non-sinusoidal currents** (Hurley, Gath &
//!   Breslin, "Optimizing the AC resistance of multilayer transformer
//!   windings with arbitrary current waveforms", IEEE Trans. Power
//!   Electronics 15(2), 2000). At low Δ Dowell's factor for harmonic n of
//!   a portion of p layers is Fr,n ≈ 1 + ψ·n²·Δ⁴/3 with ψ = (5p² − 1)/15;
//!   summed over the spectrum, Σ n²·In² = I′rms²/ω² (Parseval for the
//!   derivative), so Rac/Rdc ≈ 1 + (ψ/3)·Δ⁴·(I′rms/(ω·Irms))². With
//!   Rdc ∝ 1/Δ the loss is least at Δopt = ψ^(−1/4)·√(ω·Irms/I′rms), where
//!   Rac/Rdc = 4/3 (their eq. for the optimum, and its value at the
//!   optimum).
//! * **Litz strand count** (Sullivan, "Optimal choice for number of strands
//!   in a litz-wire transformer winding", IEEE Trans. Power Electronics
//!   14(2), 1999). Sullivan's analysis uses the same low-frequency
//!   proximity loss with the strands as layers: for a fixed strand
//!   diameter across a fixed breadth, more strands lower the DC resistance
//!   (∝ 1/n) but add strand layers, and the loss has a minimum in n. We
//!   evaluate that low-frequency loss over the table's counts
//!   ([`litz_low_frequency_loss`]) and start from its least: the search
//!   then refines with the harmonic model. The cost side of Sullivan's
//!   paper (strand price) is not modelled.
//!
//! An ideal step has an unbounded derivative: for the starting point only,
//! each step is taken as a ramp of the edge time or 1 % of the period,
//! whichever is longer (our choice; the harmonic model that decides takes
//! the steps as they are).

use crate::waveform::Pwl;

/// RMS of dI/dt of a piecewise-linear current, steps taken as ramps of
/// `edge` seconds (module docs), A/s: √((1/T)·(Σ sⱼ²·Δtⱼ + Σ ΔIₖ²/edge)).
pub fn derivative_rms(i: &Pwl, edge: f64) -> f64 {
    let t = i.period;
    let edge = edge.max(0.01 * t);
    let mut s2 = 0.0;
    for (t0, y0, t1, y1) in i.segments() {
        let s = (y1 - y0) / (t1 - t0);
        s2 += s * s * (t1 - t0);
    }
    for e in i.events() {
        s2 += e.dy * e.dy / edge;
    }
    (s2 / t).max(0.0).sqrt()
}

/// Hurley, Gath & Breslin (2000): the waveform factor I′rms/(ω·Irms)
/// (1 for a sinusoid), with ω the fundamental's angular frequency.
pub fn waveform_factor(i: &Pwl, edge: f64) -> f64 {
    let irms = i.rms();
    if irms <= 0.0 {
        return 1.0;
    }
    let w = 2.0 * std::f64::consts::PI / i.period;
    (derivative_rms(i, edge) / (w * irms)).max(1e-3)
}

/// Hurley, Gath & Breslin (2000): the optimum Δ = h/δ₁ (δ₁ the skin depth
/// at the fundamental) of a portion of `p` layers for waveform factor `k`
/// ([`waveform_factor`]): Δopt = ψ^(−1/4)·k^(−1/2), ψ = (5p² − 1)/15.
pub fn optimum_delta(p: f64, k: f64) -> f64 {
    let p = p.max(1.0);
    let psi = (5.0 * p * p - 1.0) / 15.0;
    psi.powf(-0.25) / k.max(1e-3).sqrt()
}

/// The low-frequency loss of litz (module docs), relative: Rdc ∝ 1/(n·ds²)
/// times 1 + (ψ/3)·Δs⁴·k² with the strands as `m` layers of Δs each.
pub fn litz_low_frequency_loss(n: u32, ds: f64, m: f64, delta_s: f64, k: f64) -> f64 {
    let psi = (5.0 * m * m - 1.0).max(0.0) / 15.0;
    (1.0 + psi / 3.0 * delta_s.powi(4) * k * k) / (n as f64 * ds * ds)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn hurley_optimum_minimises_the_low_frequency_loss() {
        // Hurley, Gath & Breslin 2000: at Δopt the loss (1/Δ)(1 + ψΔ⁴k²/3)
        // is least and Rac/Rdc = 4/3. Checked by a plain scan.
        for (p, k) in [(1.0, 1.0), (3.0, 1.0), (6.0, 2.5), (10.0, 7.0)] {
            let psi: f64 = (5.0 * p * p - 1.0) / 15.0;
            let loss = |d: f64| (1.0 + psi * d.powi(4) * k * k / 3.0) / d;
            let opt = optimum_delta(p, k);
            let fr = 1.0 + psi * opt.powi(4) * k * k / 3.0;
            assert!((fr - 4.0 / 3.0).abs() < 1e-12, "{fr}");
            for j in 1..400 {
                let d = j as f64 * 0.01;
                assert!(loss(d) >= loss(opt) * (1.0 - 1e-12), "p {p} k {k} Δ {d}");
            }
        }
    }

    #[test]
    fn waveform_factor_of_a_triangle() {
        // Symmetric triangle, peak-to-peak A over period T: slope ±2A/T, so
        // I′rms = 2A/T; Irms = A/(2√3) (zero mean). k = (2A/T)/(ω·A/(2√3))
        // = 2√3/π (direct integration, our own arithmetic).
        let t = 10e-6;
        let tri = Pwl::new(t, vec![(0.0, -0.5), (t / 2.0, 0.5), (t, -0.5)]).unwrap();
        let k = waveform_factor(&tri, 0.0);
        assert!((k - 2.0 * 3f64.sqrt() / std::f64::consts::PI).abs() < 1e-9, "{k}");
        // A step of 1 A taken as a 1 % ramp: ΔI²/edge over T.
        let sq = Pwl::new(t, vec![(0.0, 1.0), (t / 2.0, 1.0), (t / 2.0, -1.0), (t, -1.0)]).unwrap();
        let want = (2.0 * 4.0 / (0.01 * t) / t).sqrt();
        assert!((derivative_rms(&sq, 0.0) - want).abs() < 1e-9 * want);
    }

    #[test]
    fn litz_loss_has_an_interior_minimum_when_layers_grow_with_strands() {
        // Sullivan 1999's trade: DC ∝ 1/n, proximity ∝ m² with m ∝ n.
        let ds = 0.1e-3;
        let f = |n: u32| litz_low_frequency_loss(n, ds, n as f64 / 10.0, 0.5, 3.0);
        let best = (1..2000).min_by(|a, b| f(*a).total_cmp(&f(*b))).unwrap();
        assert!(best > 1 && best < 1999, "{best}");
    }
}
