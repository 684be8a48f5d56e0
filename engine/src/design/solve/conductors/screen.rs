//! A quick loss estimate of one winding with one conductor, to rank the
//! candidates before the full harmonic model decides.
//!
//! The same 1-D model as `winding::loss` (its module docs, items 4–6): the
//! MMF is zero at the bobbin and steps by turns × current across each
//! layer; a layer whose faces see the phasors F₀, F₁ at harmonic n loses
//! (ρ·MLT/A)·Δₙ·[(|F₀|² + |F₁|²)·ψ₁ − 4·Re(F₀F₁*)·ψ₂] (Dowell 1966, per
//! layer), round wire as its equivalent foil with porosity η = n·a/b, litz
//! as √k strand layers per bundle layer. What makes it quick: the MMF at
//! the inner face of each of the winding's sections does not depend on any
//! conductor (only on the order, the turns and the currents), so it is
//! computed once per interleaving; every turn has the bobbin's middle turn
//! length; the sum stops at [`HARMONICS`] and its tail is closed by the
//! n^(−1.5) law of ideal steps (winding::loss module docs, item 7).

use super::FOIL_FILM;
use crate::waveform::Pwl;
use crate::winding::conductor::Conductor;
use crate::winding::dowell::dpsi;
use crate::winding::fit::free_layout;
use crate::winding::stackup::Tape;

/// Harmonics summed explicitly by the estimate.
pub const HARMONICS: u32 = 11;

type C = (f64, f64);

/// One section of a winding: its turns and the MMF phasors at its inner
/// face, harmonics 1..=HARMONICS, ampere-turns (RMS).
#[derive(Debug, Clone)]
pub struct SectionField {
    pub turns: u32,
    pub f0: Vec<C>,
}

/// What the estimate needs of one winding.
#[derive(Debug, Clone)]
pub struct Portion {
    pub turns: u32,
    pub sections: Vec<SectionField>,
    /// The winding's own current: mean, and RMS phasors of harmonics 1..=HARMONICS.
    pub dc: f64,
    pub own: Vec<C>,
}

/// RMS phasors √2·cₙ of harmonics 1..=HARMONICS of a current.
pub fn phasors(i: &Pwl) -> Vec<C> {
    (1..=HARMONICS)
        .map(|n| {
            let (re, im) = i.fourier_coefficient(n);
            (std::f64::consts::SQRT_2 * re, std::f64::consts::SQRT_2 * im)
        })
        .collect()
}

/// The portions of every winding for a section order `(winding, turns)`
/// bobbin outward, from each winding's phasors and mean.
pub fn portions(order: &[(usize, u32)], names: &[&str], turns: &[u32], own: &[(f64, Vec<C>)]) -> Vec<Portion> {
    let mut out: Vec<Portion> = names
        .iter()
        .zip(turns)
        .zip(own)
        .map(|((_, &t), (dc, ph))| Portion {
            turns: t,
            sections: Vec::new(),
            dc: *dc,
            own: ph.clone(),
        })
        .collect();
    let mut f: Vec<C> = vec![(0.0, 0.0); HARMONICS as usize];
    for &(w, t) in order {
        if t == 0 || w >= out.len() {
            continue;
        }
        out[w].sections.push(SectionField { turns: t, f0: f.clone() });
        for (k, x) in f.iter_mut().enumerate() {
            let i = own[w].1[k];
            x.0 += t as f64 * i.0;
            x.1 += t as f64 * i.1;
        }
    }
    out
}

/// The window the estimate works in.
#[derive(Debug, Clone)]
pub struct Window {
    /// Breadth between the margins, m.
    pub breadth: f64,
    /// Skin depth at the fundamental and resistivity at the selection temperature.
    pub delta1: f64,
    pub rho: f64,
    /// Mean turn length used for every winding (the bobbin's middle), m.
    pub mlt: f64,
    /// Tape between layers inside a section, if any.
    pub interlayer: Option<Tape>,
}

/// The Dowell functions Δψ₁, Δψ₂ at harmonics 1..=HARMONICS for each Δ at
/// the fundamental met so far: candidates that share a wire and a layer
/// width share them, across windings and interleavings. A value found
/// here is the one [`dpsi`] returns for it (the same call, made once).
#[derive(Debug, Default)]
pub struct DowellMemo {
    seen: Vec<(u64, [C; HARMONICS as usize])>,
}

impl DowellMemo {
    fn get(&mut self, delta1: f64) -> &[C; HARMONICS as usize] {
        let key = delta1.to_bits();
        let i = match self.seen.iter().position(|e| e.0 == key) {
            Some(i) => i,
            None => {
                let mut dp = [(0.0, 0.0); HARMONICS as usize];
                for (n, x) in dp.iter_mut().enumerate() {
                    *x = dpsi(delta1 * ((n + 1) as f64).sqrt());
                }
                self.seen.push((key, dp));
                self.seen.len() - 1
            }
        };
        &self.seen[i].1
    }
}

/// Estimated loss (W) and radial build of the winding's sections (m), or
/// `None` if the conductor cannot be laid out across the breadth.
///
/// A layer of m sub-layers (m = 1; litz √k strand layers) whose MMF rises
/// linearly from F₀ by D per sub-layer has Σ(|Fₖ|² + |Fₖ₊₁|²) and
/// ΣRe(FₖFₖ₊₁*) in closed form (sums of k and k²), as in `winding::loss`.
pub fn estimate(p: &Portion, c: &Conductor, parallel: u32, win: &Window, memo: &mut DowellMemo) -> Option<(f64, f64)> {
    let par = parallel.max(1);
    let a1 = c.copper_area();
    if !(a1 > 0.0) || p.turns == 0 {
        return None;
    }
    let sqrt_pi_2 = 0.5 * std::f64::consts::PI.sqrt();
    let h = c.outer_height();
    let film = match (&win.interlayer, c.is_foil()) {
        (Some(t), _) => t.build(),
        (None, true) => FOIL_FILM,
        (None, false) => 0.0,
    };
    let rdc = win.rho * p.turns as f64 * win.mlt / (a1 * par as f64);
    let mut build = 0.0;
    let mut loss = rdc * p.dc * p.dc;
    const H: usize = HARMONICS as usize;
    let nh = p.own.len().min(H);
    let mut dp = [(0.0, 0.0); H];
    let mut dp_done = false;
    // The tail's factor N^1.5·2/√(N + ½) (below).
    let nn = nh as f64;
    let tail = nn * nn.sqrt() * 2.0 / (nn + 0.5).sqrt();
    for sf in &p.sections {
        let (tpl, nl) = free_layout(c, sf.turns, par, win.breadth)?;
        build += nl as f64 * h + nl.saturating_sub(1) as f64 * film;
        // Sub-layers per layer and Δ at the fundamental (Dowell 1966: round
        // wire as its equivalent foil with porosity η = n·a/b).
        let (m, delta1) = match c {
            Conductor::Round(w) | Conductor::TripleInsulated(w) => {
                let eta = (tpl as f64 * par as f64 * sqrt_pi_2 * w.bare_diameter / win.breadth).min(1.0);
                (1.0, sqrt_pi_2 * w.bare_diameter / win.delta1 * eta.sqrt())
            }
            Conductor::Foil(f) => (1.0, f.thickness / win.delta1),
            Conductor::Litz(l) => {
                let sk = (l.strands as f64).sqrt();
                let eta = (tpl as f64 * sk * sqrt_pi_2 * l.strand_diameter / win.breadth).min(1.0);
                (sk, sqrt_pi_2 * l.strand_diameter / win.delta1 * eta.sqrt())
            }
        };
        if !dp_done {
            dp[..nh].copy_from_slice(&memo.get(delta1)[..nh]);
            dp_done = true;
        }
        // Identical layers are one block of sub-layers: the closed-form
        // sums hold for any count of sub-layers with the same resistance
        // and MMF step, so a section costs at most two blocks (its full
        // layers and a last, partial one) whatever its layer count. Each
        // block: (sub-layers, copper area of one, ampere-turn step of one
        // per ampere of the winding's current).
        let blocks: [(f64, f64, f64); 2] = if c.is_foil() {
            // One turn per layer, `par` foils in hand share the current.
            [(nl as f64, a1, 1.0 / par as f64), (0.0, 0.0, 0.0)]
        } else {
            let full = (sf.turns / tpl.max(1)).min(nl);
            let rest = sf.turns.saturating_sub(full * tpl);
            let block = |layers: u32, turns_l: u32| {
                (layers as f64 * m, turns_l as f64 * par as f64 * a1 / m, turns_l as f64 / m)
            };
            [block(full, tpl), if rest > 0 { block(1, rest) } else { (0.0, 0.0, 0.0) }]
        };
        let mut f0 = [(0.0, 0.0); H];
        f0[..nh].copy_from_slice(&sf.f0[..nh]);
        let mut terms = [0.0; H];
        for &(mm, area_sub, step) in blocks.iter().filter(|b| b.0 > 0.0) {
            let s1 = mm * (mm - 1.0) / 2.0;
            let s2 = (mm - 1.0) * mm * (2.0 * mm - 1.0) / 6.0;
            let s1p = mm * (mm + 1.0) / 2.0;
            let s2p = mm * (mm + 1.0) * (2.0 * mm + 1.0) / 6.0;
            let (ka, kx, kd) = (2.0 * mm, 2.0 * (s1 + s1p), s2 + s2p);
            let (ja, jx, jd) = (mm, 2.0 * s1 + mm, s2 + s1);
            let g = win.rho * win.mlt / area_sub;
            for (n, x) in f0.iter_mut().enumerate().take(nh) {
                let i = p.own[n];
                let d = (i.0 * step, i.1 * step);
                let a2 = x.0 * x.0 + x.1 * x.1;
                let xr = x.0 * d.0 + x.1 * d.1;
                let d2 = d.0 * d.0 + d.1 * d.1;
                let sa = ka * a2 + kx * xr + kd * d2;
                let sb = ja * a2 + jx * xr + jd * d2;
                terms[n] += g * (sa * dp[n].0 - 4.0 * sb * dp[n].1);
                x.0 += mm * d.0;
                x.1 += mm * d.1;
            }
        }
        loss += terms.iter().sum::<f64>();
        // Tail: Pn ∝ n^(−1.5) beyond N, Σ_{n>N} ≈ P̄N·N^1.5·2/√(N + ½), P̄N the
        // mean of the last two terms (odd-only spectra alternate with zero).
        if nh >= 2 {
            loss += 0.5 * (terms[nh - 1] + terms[nh - 2]) * tail;
        }
    }
    (loss.is_finite() && build.is_finite()).then_some((loss, build))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::winding::dowell::{fr_dowell, skin_depth};
    use crate::winding::wire::copper_resistivity;

    /// One period of a 100 kHz, 1 A-peak sinusoid sampled at 400 points, the
    /// copper's resistivity and skin depth at 20 °C, a 20 mm window with a
    /// 50 mm turn, and the current's own phasors.
    fn sinusoid() -> (f64, f64, Window, Vec<(f64, Vec<(f64, f64)>)>) {
        let t = 10e-6;
        let pts: Vec<(f64, f64)> = (0..=400)
            .map(|k| {
                let x = k as f64 / 400.0;
                (x * t, (2.0 * std::f64::consts::PI * x).sin())
            })
            .collect();
        let i = Pwl::new(t, pts).unwrap();
        let rho = copper_resistivity(20.0).unwrap();
        let d1 = skin_depth(rho, 1.0 / t).unwrap();
        let win = Window { breadth: 20e-3, delta1: d1, rho, mlt: 0.05, interlayer: None };
        let own = vec![(i.mean(), phasors(&i))];
        (rho, d1, win, own)
    }

    #[test]
    fn the_memo_returns_dowells_functions_exactly() {
        // The memo is a cache, not an approximation: every entry equals
        // `dpsi` at Δ₁·√n bit for bit, first call or repeated, in any order.
        let mut memo = DowellMemo::default();
        for &d1 in [0.3, 2.0, 0.3, 7.5, 2.0, 0.0, 41.0].iter() {
            let got = *memo.get(d1);
            for (k, g) in got.iter().enumerate() {
                let want = dpsi(d1 * ((k + 1) as f64).sqrt());
                assert_eq!(g.0.to_bits(), want.0.to_bits(), "Δ₁ {d1}, n {}", k + 1);
                assert_eq!(g.1.to_bits(), want.1.to_bits(), "Δ₁ {d1}, n {}", k + 1);
            }
        }
        assert_eq!(memo.seen.len(), 5);
    }

    #[test]
    fn sinusoid_in_one_foil_layer_is_dowell() {
        // One foil turn, sinusoidal current: the estimate is Rdc·I²·Fr with
        // Dowell's m = 1 factor (Dowell 1966), the tail of a sinusoid being 0.
        let (rho, d1, win, own) = sinusoid();
        let p = portions(&[(0, 1)], &["w"], &[1], &own).remove(0);
        let c = Conductor::foil(0.2e-3, 20e-3).unwrap();
        let (loss, build) = estimate(&p, &c, 1, &win, &mut DowellMemo::default()).unwrap();
        let rdc = rho * 0.05 / (0.2e-3 * 20e-3);
        let want = rdc * 0.5 * fr_dowell(0.2e-3 / d1, 1.0);
        assert!((loss - want).abs() < 2e-3 * want, "{loss} {want}");
        assert!((build - 0.2e-3).abs() < 1e-12);
    }

    #[test]
    fn sinusoid_in_a_foil_portion_of_many_layers_is_dowell() {
        // Seven foil turns in one section (seven layers, each carrying the
        // whole current), sinusoidal current: the estimate (its layers summed
        // as one block) is Rdc·I²·Fr with Dowell's factor for a portion of
        // m = 7 layers (Dowell 1966), at Δ from well below to above 1.
        let (rho, d1, win, own) = sinusoid();
        let p = portions(&[(0, 7)], &["w"], &[7], &own).remove(0);
        for h in [0.03e-3, 0.1e-3, 0.3e-3] {
            let c = Conductor::foil(h, 20e-3).unwrap();
            let (loss, _) = estimate(&p, &c, 1, &win, &mut DowellMemo::default()).unwrap();
            let rdc = rho * 7.0 * 0.05 / (h * 20e-3);
            let want = rdc * 0.5 * fr_dowell(h / d1, 7.0);
            assert!((loss - want).abs() < 2e-3 * want, "h {h}: {loss} {want}");
        }
    }
}
