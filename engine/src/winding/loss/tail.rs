//! The tail of the harmonic sum (step 7 of [`super`]'s model): the
//! harmonics above the last explicit one, closed by an integral of the same
//! per-layer Dowell loss over the averaged step spectrum, by 16-point
//! Gauss–Legendre quadrature after x = X/u².

use super::{LossModel, Spectrum};
use crate::winding::dowell::dpsi;
use std::f64::consts::PI;

impl LossModel {
    /// Per layer, the step statistics (Σ_τ |ΔF₀|², Σ_τ ΔF₀·ΔD, Σ_τ |ΔD|²) of
    /// the steps of all currents, grouped by step time (steps at the same
    /// instant add), turned into the layer's coefficients (A, B) of the
    /// tail's Δψ₁ and Δψ₂ ([`LayerModel::loss`]). They do not depend on the
    /// harmonic, so the tail at each checkpoint costs one set of Dowell
    /// functions per class and quadrature node, not per layer.
    pub(super) fn tail_coefficients(&self, specs: &[Spectrum], period: f64) -> Vec<(f64, f64)> {
        let nw = specs.len();
        let tol = 1e-9 * period;
        let mut times: Vec<f64> = Vec::new();
        // `nw` steps per distinct time.
        let mut steps: Vec<f64> = Vec::new();
        for (w, s) in specs.iter().enumerate() {
            for (t, dy) in s.steps() {
                if dy == 0.0 {
                    continue;
                }
                let row = match times.iter().position(|&x| (x - t).abs() <= tol) {
                    Some(i) => i,
                    None => {
                        times.push(t);
                        steps.resize(steps.len() + nw, 0.0);
                        times.len() - 1
                    }
                };
                if let Some(v) = steps.get_mut(row * nw + w) {
                    *v += dy;
                }
            }
        }
        let mut stats = vec![[0.0; 3]; self.layers.len()];
        for row in steps.chunks_exact(nw.max(1)) {
            let mut f = 0.0;
            for (l, s) in self.layers.iter().zip(stats.iter_mut()) {
                let dy = row.get(l.winding).copied().unwrap_or(0.0);
                let d = dy * l.step;
                s[0] += f * f;
                s[1] += f * d;
                s[2] += d * d;
                f += dy * l.mmf_per_amp;
            }
        }
        self.layers
            .iter()
            .zip(&stats)
            .map(|(l, s)| {
                let a = l.qa[0] * s[0] + l.qa[1] * s[1] + l.qa[2] * s[2];
                let b = l.qb[0] * s[0] + l.qb[1] * s[1] + l.qb[2] * s[2];
                (a, b)
            })
            .collect()
    }

    /// The analytic tail Σ_{n > X−½} (module docs, item 7); per layer into
    /// `out`; returns the sum. `coef` from [`Self::tail_coefficients`];
    /// `quad` is scratch of one entry per class: the quadrature sums
    /// Σ_i w_i·u_i·g_i·(Δψ₁, Δψ₂)(Δ₁·√x_i)/(π²X) of the class, the
    /// per-layer coefficients factor out of the integral.
    #[allow(clippy::too_many_arguments)]
    pub(super) fn tail(
        &self,
        coef: &[(f64, f64)],
        x0: f64,
        f1: f64,
        edge: f64,
        base: &[f64],
        quad: &mut [(f64, f64)],
        out: &mut [f64],
    ) -> f64 {
        out.iter_mut().for_each(|v| *v = 0.0);
        if coef.iter().all(|c| c.0 == 0.0 && c.1 == 0.0) {
            return 0.0;
        }
        let w1 = 2.0 * PI * f1;
        let scale = 1.0 / (PI * PI * x0);
        quad.iter_mut().for_each(|q| *q = (0.0, 0.0));
        // ∫_X^∞ h(x)/(2π² x²) dx = (1/(π² X))·∫₀¹ u·h(X/u²) du.
        for &(u, wt) in GL16.iter() {
            let x = x0 / (u * u);
            let z = 0.5 * x * w1 * edge;
            let g = 1.0 / (1.0 + 2.0 * z * z);
            let sx = x.sqrt();
            let c = wt * u * g * scale;
            for (q, b) in quad.iter_mut().zip(base) {
                let (p1, p2) = dpsi(b * sx);
                q.0 += c * p1;
                q.1 += c * p2;
            }
        }
        let mut total = 0.0;
        for ((l, t), o) in self.layers.iter().zip(coef).zip(out.iter_mut()) {
            let (q1, q2) = quad.get(l.class).copied().unwrap_or((0.0, 0.0));
            let v = t.0 * q1 - t.1 * q2;
            *o = v;
            total += v;
        }
        total
    }
}

/// 16-point Gauss–Legendre nodes and weights on [0, 1] (Abramowitz &
/// Stegun Table 25.4, mapped from [−1, 1]).
pub(super) const GL16: [(f64, f64); 16] = {
    const X: [f64; 8] = [
        0.095_012_509_837_637_44,
        0.281_603_550_779_258_9,
        0.458_016_777_657_227_4,
        0.617_876_244_402_643_8,
        0.755_404_408_355_003,
        0.865_631_202_387_831_7,
        0.944_575_023_073_232_6,
        0.989_400_934_991_649_9,
    ];
    const W: [f64; 8] = [
        0.189_450_610_455_068_5,
        0.182_603_415_044_923_6,
        0.169_156_519_395_002_5,
        0.149_595_988_816_576_7,
        0.124_628_971_255_533_9,
        0.095_158_511_682_492_78,
        0.062_253_523_938_647_89,
        0.027_152_459_411_754_1,
    ];
    let mut out = [(0.0, 0.0); 16];
    let mut i = 0;
    while i < 8 {
        out[2 * i] = (0.5 * (1.0 + X[i]), 0.5 * W[i]);
        out[2 * i + 1] = (0.5 * (1.0 - X[i]), 0.5 * W[i]);
        i += 1;
    }
    out
};
