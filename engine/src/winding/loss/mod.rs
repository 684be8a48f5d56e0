//! Copper loss of real (non-sinusoidal) winding currents.
//!
//! ## The model
//!
//! 1. **Geometry** comes from [`super::fit::fit`]: every physical layer with
//!    its turns, height, mean turn length and copper area.
//! 2. **Currents** are periodic piecewise-linear waveforms ([`Pwl`]), one per
//!    winding, all with the same period, in the **dot convention**: positive
//!    current flows into the winding's dotted (start) terminal. A secondary
//!    that delivers power therefore carries negative current while it
//!    conducts; [`WindingCurrent::delivered`] negates a waveform given as a
//!    positive load current.
//! 3. Each current is expanded in its **exact Fourier series**
//!    ([`Pwl::spectrum`]: analytic coefficients from the steps and slope
//!    changes, no FFT, no sampling). For harmonic n every winding has a
//!    complex RMS phasor Iₙ.
//! 4. The **MMF** is zero at the bobbin and steps by (turns × I) across each
//!    layer, outward. Each layer then sees the phasors F₀, F₁ at its faces,
//!    and dissipates Dowell's per-layer loss (see [`super::dowell`]):
//!    P = (ρ·MLT/A)·Δₙ·[(|F₀|² + |F₁|²)·ψ₁ − 4·Re(F₀F₁*)·ψ₂], Δₙ = Δ₁·√n.
//!    This covers interleaving (P-S-P halves the MMF each layer sees),
//!    partial layers, idle windings in another's field and windings whose
//!    currents are out of phase, harmonic by harmonic.
//!    For a winding with net ampere-turns (an inductor, a flyback while
//!    only one side conducts) "zero at the bobbin" is Dowell's 1-D
//!    assumption and ignores the 2-D field near an air gap.
//! 5. **Round wire** is Dowell's equivalent foil: the wire becomes a square
//!    conductor of the same area, side a = (√π/2)·d, and the layer's
//!    porosity is η = n·a / b (n conductors across the usable breadth b;
//!    Dowell 1966, round conductors), so Δ = (√π/2)·(d/δ)·√η. We use this
//!    definition of η (the square conductors' copper breadth over the
//!    breadth), not the alternative d/pitch. **Foil**: Δ = t/δ, with the
//!    field taken across the foil's width (no porosity, edge effects
//!    ignored).
//! 6. **Litz**: Dowell's model with the strands as layers (the approach of
//!    treating a litz layer as √k layers of strands, each a round-wire
//!    layer): a bundle of k strands is √k strand layers of √k strands, its
//!    MMF rises linearly across them, strands are perfectly transposed so
//!    each carries 1/k of the turn's current; the strand layers have their
//!    own porosity. It counts both the field of the bundle's own current
//!    and the field of the other layers. Approximate: real bundles are
//!    round and their twist is not perfect; the lay length's extra
//!    resistance (a few %) is not counted.
//! 7. **Harmonic sum and tail.** The loss is P = Σₙ Pₙ with P₀ the DC term.
//!    Ideal current steps make |Iₙ| ∝ 1/n while Fr ∝ √n at large Δ, so
//!    Pₙ ∝ n^(−1.5) and the sum converges far too slowly to add up. We
//!    close it analytically: for large n the coefficients are dominated by
//!    the steps, |Iₙ|² → (1/(2π²n²))·Σ_τ ΔI(τ)² averaged over n (cross terms
//!    between step times average out), and the tail Σ_{n>N} is replaced by
//!    the integral from N + ½ (Euler–Maclaurin midpoint rule; from N when
//!    the spectrum has odd harmonics only and N is even) of the same
//!    per-layer Dowell loss with that averaged step spectrum, evaluated by
//!    16-point Gauss–Legendre quadrature after the change of variable
//!    x = X/u². At large Δ this is Dowell's asymptote ψ₁ → 1, ψ₂ → 0, i.e.
//!    the n^(−1.5) law summed in closed form ∝ 2/√X; the quadrature also
//!    covers the region where Δ is not yet large. Slope changes contribute
//!    only ∝ n^(−2) to the coefficients and are left to the explicit sum.
//!    With a finite `edge_time` t_r every step becomes a ramp, its
//!    coefficients gain the factor sinc(nωt_r/2), and the tail uses the
//!    smooth average 1/(1 + 2z²) of sinc² z (exact at both ends, an
//!    approximation between). The sum stops at the first checkpoint
//!    (N = 8, 12, 16, 24, 32, …) where the estimate explicit + tail changes
//!    by less than the tolerance (0.1 % by default) from the previous one.
//!    The report gives N and the tail's share of the loss.
//!
//! Per winding: RMS current (exact, from the waveform), DC resistance at
//! the temperature, DC loss Rdc·I²rms, AC loss (all harmonics, its layers'
//! proximity loss included), Fr = AC/DC, and each layer's loss.
//!
//! ## Speed
//!
//! The page recomputes a design and a 200-point frequency sweep per
//! keystroke, and a design evaluation calls [`LossModel::evaluate`] about
//! six times, so this is the engine's hot loop. What it does to be fast:
//!
//! * **Prepare once.** [`LossModel::new`] (or [`LossModel::from_fit`] when
//!   the caller already has the fit) does the fit and every per-layer
//!   constant: Δ per √Hz of each distinct conductor class, the MMF step
//!   per ampere, and the strand sums as two precomputed linear forms
//!   (`qa`, `qb`, with ρ·MLT/A and the factor 4 folded in), so a layer's
//!   loss at a harmonic is two 3-term dot products and two multiplications,
//!   no division.
//! * **Dowell functions per class, not per layer.** Layers of the same
//!   conductor (same Δ) share Δψ₁, Δψ₂: one [`super::dowell::dpsi`] per
//!   class and harmonic. `dpsi` itself costs one `exp`, one fast sin/cos
//!   and one division, and none above Δ = 40 (see [`super::dowell`]).
//! * **The tail factors.** The step statistics of each layer do not depend
//!   on the harmonic, so they become per-layer coefficients (A, B) once per
//!   evaluation, and the tail at a checkpoint is Σ over quadrature nodes
//!   of the *class's* Dowell functions (16 per class), then one
//!   A·Q₁ − B·Q₂ per layer. (The first version evaluated them per layer
//!   and node at every checkpoint: with 16 layers and 9 checkpoints that
//!   was most of the time.) The tail is computed only at the checkpoints,
//!   once each.
//! * **Phasors by recurrence.** [`Pwl::spectrum`] advances e^(−jnω₁t) of
//!   every step by one complex multiplication per harmonic, and the edge
//!   time's sin(nθ) the same way: no sine or cosine inside the loop.
//! * **Skipped noise.** A harmonic whose phasors are all rounding noise
//!   (power below 1e−24 of the largest seen: the even harmonics of a
//!   half-wave symmetric drive) adds nothing measurable and is skipped.
//! * **Few allocations.** An evaluation allocates a handful of small
//!   vectors (per class, per layer, per winding, one spectrum per winding,
//!   the report), none inside the harmonic loop.
//!
//! The results equal the straightforward evaluation to rounding (about
//! 1e−14 relative on the demo designs); the convergence test, checkpoints
//! and tail are unchanged.

use super::dowell::{dpsi, MU0};

mod tail;
use super::fit::{conductor_of, fit};
use super::stackup::StackUp;
use super::wire::copper_resistivity;
use super::Conductor;
use crate::core::Core;
use crate::error::{in_range, Error, Result};
use crate::waveform::{Pwl, Spectrum};
use serde::Serialize;
use std::f64::consts::PI;

/// The current of one winding (dot convention, see the module docs).
#[derive(Debug, Clone, PartialEq)]
pub struct WindingCurrent {
    pub name: String,
    pub current: Pwl,
}

impl WindingCurrent {
    pub fn new(name: &str, current: Pwl) -> Self {
        WindingCurrent {
            name: name.to_string(),
            current,
        }
    }
    /// A winding that delivers `current` (given positive while it
    /// conducts, as rectifier currents usually are): stored negated.
    pub fn delivered(name: &str, current: &Pwl) -> Self {
        WindingCurrent {
            name: name.to_string(),
            current: current.scaled(-1.0),
        }
    }
}

/// Options of the harmonic sum.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LossOptions {
    /// Rise/fall time that replaces every ideal step, s (0: ideal steps,
    /// closed by the analytic tail).
    pub edge_time: f64,
    /// Relative convergence of the loss (default 1e−3 = 0.1 %).
    pub tolerance: f64,
    /// Most harmonics summed explicitly (default 4096).
    pub max_harmonics: u32,
}

impl Default for LossOptions {
    fn default() -> Self {
        LossOptions {
            edge_time: 0.0,
            tolerance: 1e-3,
            max_harmonics: 4096,
        }
    }
}

/// Loss of one layer.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LayerLoss {
    /// Item index of the layer's section in the stack-up.
    pub item: usize,
    /// Layer number inside its section, 0 = innermost.
    pub layer: u32,
    /// Height of the layer's inner face, m.
    pub h_bottom: f64,
    /// Loss, W.
    pub loss: f64,
}

/// Loss of one winding.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct WindingLoss {
    pub name: String,
    /// RMS current, A.
    pub rms_current: f64,
    /// DC resistance at the temperature, Ω.
    pub rdc: f64,
    /// Rdc·I²rms, W.
    pub dc_loss: f64,
    /// The winding's whole copper loss, DC and every harmonic, W (was
    /// `ac_loss`, a name that said less than it holds).
    pub total_loss: f64,
    /// Effective AC resistance factor over the waveform: total_loss / dc_loss
    /// (1 when the winding carries no current).
    pub fr: f64,
    pub layers: Vec<LayerLoss>,
}

/// The copper-loss report.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LossReport {
    pub windings: Vec<WindingLoss>,
    /// Total copper loss, W.
    pub total: f64,
    /// Harmonics summed explicitly.
    pub harmonics: u32,
    /// Share of the total loss given by the analytic tail (0..1).
    pub tail_share: f64,
    /// False if `max_harmonics` was reached before the tolerance.
    pub converged: bool,
    /// Copper temperature, °C.
    pub temperature: f64,
}

#[derive(Debug, Clone)]
struct LayerModel {
    winding: usize,
    item: usize,
    index: u32,
    h_bottom: f64,
    mmf_per_amp: f64,
    /// MMF step per strand layer per ampere, mmf_per_amp / ms.
    step: f64,
    /// k·(coefficients of |Fa|², Re(Fa·D*), |D|² in Σ(|F_k|² + |F_k+1|²))
    /// with k = ρ·MLT/A_cu·ms (see [`strand_coefficients`]): the layer's
    /// loss is (qa·v)·Δψ₁ − (qb·v)·Δψ₂ for v = (|Fa|², Re(Fa·D*), |D|²).
    qa: [f64; 3],
    /// 4k·(coefficients of the same in Σ Re(F_k·F*_k+1)).
    qb: [f64; 3],
    class: usize,
}

impl LayerModel {
    /// The layer's loss for the quadratic statistics `v` and the Dowell
    /// functions `(p1, p2)` = (Δψ₁, Δψ₂).
    #[inline(always)]
    fn loss(&self, v: [f64; 3], (p1, p2): (f64, f64)) -> f64 {
        let sa = self.qa[0] * v[0] + self.qa[1] * v[1] + self.qa[2] * v[2];
        let sb = self.qb[0] * v[0] + self.qb[1] * v[1] + self.qb[2] * v[2];
        sa * p1 - sb * p2
    }
}

/// The prepared loss model of one stack-up on one core at one temperature.
#[derive(Debug, Clone)]
pub struct LossModel {
    names: Vec<String>,
    layers: Vec<LayerModel>,
    /// Δ per √Hz of each conductor class.
    classes: Vec<f64>,
    rdc: Vec<f64>,
    temperature: f64,
}

/// Σ over strand layers of (|F_k|² + |F_k+1|²) and Re(F_k·F*_k+1) for an MMF
/// rising linearly from Fa over m strand layers by D each, as linear forms
/// in the quadratic statistics a2 = |Fa|², x = Re(Fa·D*), d2 = |D|² (closed
/// forms of the sums of k and k²): returns the coefficients of
/// (a2, x, d2) of both sums. Computed once per layer in [`LossModel::new`].
fn strand_coefficients(m: f64) -> ([f64; 3], [f64; 3]) {
    let s1 = m * (m - 1.0) / 2.0;
    let s2 = (m - 1.0) * m * (2.0 * m - 1.0) / 6.0;
    let s1p = m * (m + 1.0) / 2.0;
    let s2p = m * (m + 1.0) * (2.0 * m + 1.0) / 6.0;
    ([2.0 * m, 2.0 * (s1 + s1p), s2 + s2p], [m, 2.0 * s1 + m, s2 + s1])
}

impl LossModel {
    /// Fits the stack-up and prepares the per-layer constants.
    pub fn new(core: &Core, st: &StackUp, temp_c: f64) -> Result<LossModel> {
        copper_resistivity(temp_c)?;
        let fr = fit(core, st)?;
        Self::from_fit(st, &fr, temp_c)
    }

    /// As [`LossModel::new`] from a fit the caller already has: `fr` must be
    /// [`fit`]`(core, st)` of this stack-up (the design solver computes it
    /// for its report; fitting again is about half the cost of `new`). A
    /// fit that does not belong to `st` is an input error where it shows
    /// (a layer naming a winding or section `st` does not have).
    pub fn from_fit(st: &StackUp, fr: &super::fit::FitReport, temp_c: f64) -> Result<LossModel> {
        let rho = copper_resistivity(temp_c)?;
        // Δ per √Hz = h_eff·√(π·μ0/ρ).
        let per_sqrt_hz = (PI * MU0 / rho).sqrt();
        let sqrt_pi_2 = 0.5 * PI.sqrt();
        let mut classes: Vec<f64> = Vec::new();
        let mut layers = Vec::with_capacity(fr.layers.len());
        let mut rdc = vec![0.0; st.windings.len()];
        let mut counter: Vec<(usize, u32)> = Vec::new();
        for l in &fr.layers {
            let (cond, p) = conductor_of(st, l).ok_or_else(|| Error::input("items", "layer without section"))?;
            let (h_eff, ms) = match cond {
                Conductor::Foil(f) => (f.thickness, 1.0),
                Conductor::Round(w) | Conductor::TripleInsulated(w) => {
                    let a = sqrt_pi_2 * w.bare_diameter;
                    let eta = (l.turns as f64 * p as f64 * a / l.breadth).min(1.0);
                    (a * eta.sqrt(), 1.0)
                }
                Conductor::Litz(z) => {
                    let ms = (z.strands as f64).sqrt().round().max(1.0);
                    let a = sqrt_pi_2 * z.strand_diameter;
                    let across = l.turns as f64 * p as f64 * z.strands as f64 / ms;
                    let eta = (across * a / l.breadth).min(1.0);
                    (a * eta.sqrt(), ms)
                }
            };
            let c = h_eff * per_sqrt_hz;
            let class = match classes.iter().position(|&x| x == c) {
                Some(i) => i,
                None => {
                    classes.push(c);
                    classes.len() - 1
                }
            };
            let k0 = rho * l.turn_length / l.copper_area;
            *rdc.get_mut(l.winding)
                .ok_or_else(|| Error::input("fit", "the fit is not of this stack-up (unknown winding)"))? +=
                k0 * l.mmf_per_amp * l.mmf_per_amp;
            let index = match counter.iter_mut().find(|(it, _)| *it == l.item) {
                Some(e) => {
                    e.1 += 1;
                    e.1
                }
                None => {
                    counter.push((l.item, 0));
                    0
                }
            };
            let k = k0 * ms;
            let (ca, cb) = strand_coefficients(ms);
            layers.push(LayerModel {
                winding: l.winding,
                item: l.item,
                index,
                h_bottom: l.h_bottom,
                mmf_per_amp: l.mmf_per_amp,
                step: l.mmf_per_amp / ms,
                qa: ca.map(|c| k * c),
                qb: cb.map(|c| 4.0 * k * c),
                class,
            });
        }
        Ok(LossModel {
            names: st.windings.iter().map(|w| w.name.clone()).collect(),
            layers,
            classes,
            rdc,
            temperature: temp_c,
        })
    }

    /// DC resistance of each winding at the model's temperature, Ω, in the
    /// order of [`StackUp::windings`].
    pub fn rdc(&self) -> &[f64] {
        &self.rdc
    }

    /// Copper loss of the given currents (one per winding, same period).
    pub fn evaluate(&self, currents: &[WindingCurrent], opts: &LossOptions) -> Result<LossReport> {
        let nw = self.names.len();
        // Match currents to windings.
        let mut by_w: Vec<Option<&Pwl>> = vec![None; nw];
        for (i, c) in currents.iter().enumerate() {
            let w = self.names.iter().position(|n| *n == c.name).ok_or_else(|| {
                Error::input(
                    &format!("currents[{i}].name"),
                    format!("no winding \"{}\" in the stack-up", c.name),
                )
            })?;
            if by_w[w].is_some() {
                return Err(Error::input(
                    &format!("currents[{i}].name"),
                    format!("two currents for \"{}\"", c.name),
                ));
            }
            c.current
                .validate()
                .map_err(|e| Error::input(&format!("currents[{i}].current"), e.message().to_string()))?;
            by_w[w] = Some(&c.current);
        }
        let mut pwls: Vec<&Pwl> = Vec::with_capacity(nw);
        for (w, p) in by_w.iter().enumerate() {
            match p {
                Some(p) => pwls.push(p),
                None => {
                    return Err(Error::input(
                        "currents",
                        format!(
                            "no current for the winding \"{}\" (give a zero waveform if it is idle)",
                            self.names[w]
                        ),
                    ))
                }
            }
        }
        let period = pwls
            .first()
            .map(|p| p.period)
            .ok_or_else(|| Error::input("currents", "no windings"))?;
        for (w, p) in pwls.iter().enumerate() {
            if (p.period - period).abs() > 1e-9 * period {
                return Err(Error::input(
                    "currents",
                    format!(
                        "the current of \"{}\" has a period of {} s, the first one {} s",
                        self.names[w], p.period, period
                    ),
                ));
            }
        }
        in_range("edge_time", opts.edge_time, 0.0, 0.5 * period, "s")?;
        in_range("tolerance", opts.tolerance, 1e-9, 0.5, "")?;
        in_range("max_harmonics", opts.max_harmonics as f64, 1.0, 1e6, "")?;
        let f1 = 1.0 / period;
        let nl = self.layers.len();
        let nc = self.classes.len();
        let sqrt_f1 = f1.sqrt();
        // Per class: Δ at the fundamental; scratch for the Dowell functions
        // of the current harmonic and for the tail's quadrature sums.
        let base: Vec<f64> = self.classes.iter().map(|c| c * sqrt_f1).collect();
        let mut psi = vec![(1.0, 0.5); 2 * nc];
        let (psi, quad) = psi.split_at_mut(nc);
        // Per layer: the explicit sum and the tail.
        let mut layer_loss = vec![0.0; nl];
        let mut tail_layers = vec![0.0; nl];
        let mut ph = vec![(0.0, 0.0); nw];

        // DC term (Δ = 0: Δψ1 = 1, Δψ2 = 1/2; `psi` starts so).
        for (p, w) in ph.iter_mut().zip(&pwls) {
            *p = (w.mean(), 0.0);
        }
        let mut explicit = self.accumulate(&ph, psi, &mut layer_loss);

        let mut specs: Vec<Spectrum> = pwls.iter().map(|p| p.spectrum(opts.edge_time)).collect();
        // Step statistics for the tail, as per-layer coefficients.
        let tail_coef = self.tail_coefficients(&specs, period);

        let mut odd_loss = 0.0;
        let mut even_loss = 0.0;
        let mut prev_est: Option<f64> = None;
        let mut next_check = 8u32;
        let mut n = 0u32;
        let mut converged = false;
        let mut tail = 0.0;
        let max_n = opts.max_harmonics;
        let mut max_power = 0.0_f64;
        while n < max_n {
            n += 1;
            let mut power = 0.0;
            for (p, s) in ph.iter_mut().zip(specs.iter_mut()) {
                let (re, im) = s.next().unwrap_or((0.0, 0.0));
                *p = (std::f64::consts::SQRT_2 * re, std::f64::consts::SQRT_2 * im);
                power += p.0 * p.0 + p.1 * p.1;
            }
            max_power = max_power.max(power);
            // A harmonic whose phasors are rounding noise (the even ones of
            // a half-wave symmetric drive) adds far below 1e−9 of the loss:
            // skip its Dowell functions and layer sums.
            let pn = if power <= NEGLIGIBLE * max_power {
                0.0
            } else {
                let sn = (n as f64).sqrt();
                for (p, b) in psi.iter_mut().zip(&base) {
                    *p = dpsi(b * sn);
                }
                self.accumulate(&ph, psi, &mut layer_loss)
            };
            explicit += pn;
            if n % 2 == 1 {
                odd_loss += pn;
            } else {
                even_loss += pn;
            }
            if n == next_check || n == max_n {
                let odd_only = even_loss <= 1e-12 * odd_loss;
                let x0 = if odd_only && n.is_multiple_of(2) {
                    n as f64
                } else {
                    n as f64 + 0.5
                };
                tail = self.tail(&tail_coef, x0, f1, opts.edge_time, &base, quad, &mut tail_layers);
                let est = explicit + tail;
                if let Some(prev) = prev_est {
                    if (est - prev).abs() <= opts.tolerance * est.abs() || est == 0.0 {
                        converged = true;
                        break;
                    }
                }
                prev_est = Some(est);
                next_check = if next_check.is_power_of_two() {
                    next_check / 2 * 3
                } else {
                    next_check / 3 * 4
                };
            }
        }
        let total = explicit + tail;
        let mut out: Vec<WindingLoss> = (0..nw)
            .map(|w| WindingLoss {
                name: self.names[w].clone(),
                rms_current: edged_rms(pwls[w], opts.edge_time),
                rdc: self.rdc[w],
                dc_loss: 0.0,
                total_loss: 0.0,
                fr: 1.0,
                layers: Vec::new(),
            })
            .collect();
        for (i, l) in self.layers.iter().enumerate() {
            let loss = clean(layer_loss[i] + tail_layers[i]);
            if let Some(w) = out.get_mut(l.winding) {
                w.total_loss += loss;
                w.layers.push(LayerLoss {
                    item: l.item,
                    layer: l.index,
                    h_bottom: l.h_bottom,
                    loss,
                });
            }
        }
        for w in &mut out {
            w.dc_loss = w.rdc * w.rms_current * w.rms_current;
            w.fr = if w.dc_loss > 0.0 {
                clean(w.total_loss / w.dc_loss)
            } else {
                1.0
            };
        }
        Ok(LossReport {
            windings: out,
            total: clean(total),
            harmonics: n,
            tail_share: if total > 0.0 { clean(tail / total) } else { 0.0 },
            converged,
            temperature: self.temperature,
        })
    }

    /// Adds one harmonic's layer losses for winding phasors `ph` (RMS,
    /// complex) and Dowell functions `psi` = (Δψ₁, Δψ₂) per class; returns
    /// their sum.
    #[inline]
    fn accumulate(&self, ph: &[(f64, f64)], psi: &[(f64, f64)], layer_loss: &mut [f64]) -> f64 {
        let (mut fr, mut fi) = (0.0_f64, 0.0_f64);
        let mut sum = 0.0;
        for (l, acc) in self.layers.iter().zip(layer_loss.iter_mut()) {
            let (ir, ii) = ph.get(l.winding).copied().unwrap_or((0.0, 0.0));
            let (dr, di) = (ir * l.step, ii * l.step);
            let v = [fr * fr + fi * fi, fr * dr + fi * di, dr * dr + di * di];
            let p = l.loss(v, psi.get(l.class).copied().unwrap_or((1.0, 0.5)));
            *acc += p;
            sum += p;
            fr += ir * l.mmf_per_amp;
            fi += ii * l.mmf_per_amp;
        }
        sum
    }

}

/// Harmonic power Σ_w |Iₙ|² below this share of the largest one seen is
/// treated as zero (its loss share is below 1e−24 times the ratio of the
/// largest to the smallest per-layer resistance factor, far below 1e−9).
const NEGLIGIBLE: f64 = 1e-24;

fn clean(x: f64) -> f64 {
    if x.is_finite() {
        x
    } else {
        0.0
    }
}

/// One-call form: fit, prepare and evaluate with default options.
pub fn copper_losses(core: &Core, st: &StackUp, currents: &[WindingCurrent], temp_c: f64) -> Result<LossReport> {
    LossModel::new(core, st, temp_c)?.evaluate(currents, &LossOptions::default())
}


/// RMS of `p` with every ideal step replaced by a centred linear ramp of
/// `tr` seconds (the waveform the finite-edge spectrum describes): a step
/// from a to b contributes a²·tr/2 + b²·tr/2 ideally and tr·(a² + ab + b²)/3
/// as a ramp, so I²rms drops by Σ (b − a)²·tr/(6T). With this the DC loss
/// and the harmonic sum describe the same current, and Fr ≥ 1.
fn edged_rms(p: &Pwl, tr: f64) -> f64 {
    let ideal = p.rms();
    if tr <= 0.0 {
        return ideal;
    }
    let steps: f64 = p.events().iter().map(|e| e.dy * e.dy).sum();
    (ideal * ideal - steps * tr / (6.0 * p.period)).max(0.0).sqrt()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn gauss_legendre_integrates_polynomials() {
        // ∫₀¹ x^k dx = 1/(k+1), exact up to degree 31.
        for k in [0, 1, 5, 17, 31] {
            let s: f64 = tail::GL16.iter().map(|&(x, w)| w * x.powi(k)).sum();
            assert!((s - 1.0 / (k as f64 + 1.0)).abs() < 1e-13, "{k}: {s}");
        }
    }

    #[test]
    fn strand_coefficients_match_a_loop() {
        let (fa, d) = ((0.3, -1.2), (0.7, 0.25));
        for m in 1..6 {
            let (mut sa, mut sb) = (0.0, 0.0);
            for k in 0..m {
                let f0 = (fa.0 + k as f64 * d.0, fa.1 + k as f64 * d.1);
                let f1 = (f0.0 + d.0, f0.1 + d.1);
                sa += f0.0 * f0.0 + f0.1 * f0.1 + f1.0 * f1.0 + f1.1 * f1.1;
                sb += f0.0 * f1.0 + f0.1 * f1.1;
            }
            let a2 = fa.0 * fa.0 + fa.1 * fa.1;
            let x = fa.0 * d.0 + fa.1 * d.1;
            let d2 = d.0 * d.0 + d.1 * d.1;
            let (qa, qb) = strand_coefficients(m as f64);
            let ca = qa[0] * a2 + qa[1] * x + qa[2] * d2;
            let cb = qb[0] * a2 + qb[1] * x + qb[2] * d2;
            assert!((ca - sa).abs() < 1e-12 && (cb - sb).abs() < 1e-12, "{m}");
        }
    }

    fn two_winding() -> (Core, StackUp) {
        use crate::winding::stackup::{default_stackup, DefaultOptions, Pattern, WindingSpec};
        use crate::winding::Grade;
        let core = crate::core::library::find("ETD 29").unwrap();
        let ws = [
            WindingSpec {
                name: "p".into(),
                turns: 30,
                conductor: Conductor::awg(26, Grade::G2).unwrap(),
                parallel: 1,
            },
            WindingSpec {
                name: "s".into(),
                turns: 5,
                conductor: Conductor::foil(0.1e-3, 15e-3).unwrap(),
                parallel: 2,
            },
        ];
        let st = default_stackup(&core, &ws, &Pattern::SplitPrimary, &DefaultOptions::default()).unwrap();
        (core, st)
    }

    #[test]
    fn bad_currents_are_named_errors() {
        let (core, st) = two_winding();
        let m = LossModel::new(&core, &st, 25.0).unwrap();
        let w = Pwl::new(1e-5, vec![(0.0, 1.0), (1e-5, 1.0)]).unwrap();
        let w2 = Pwl::new(2e-5, vec![(0.0, 1.0), (2e-5, 1.0)]).unwrap();
        let opts = LossOptions::default();
        let e = m.evaluate(&[WindingCurrent::new("p", w.clone())], &opts).unwrap_err();
        assert_eq!(e.field(), Some("currents"));
        let e = m
            .evaluate(
                &[WindingCurrent::new("p", w.clone()), WindingCurrent::new("x", w.clone())],
                &opts,
            )
            .unwrap_err();
        assert_eq!(e.field(), Some("currents[1].name"));
        let e = m
            .evaluate(
                &[WindingCurrent::new("p", w.clone()), WindingCurrent::new("s", w2)],
                &opts,
            )
            .unwrap_err();
        assert_eq!(e.field(), Some("currents"));
        let bad = Pwl {
            period: 1e-5,
            points: vec![(0.0, f64::NAN), (1e-5, 0.0)],
        };
        let e = m
            .evaluate(
                &[WindingCurrent::new("p", w.clone()), WindingCurrent::new("s", bad)],
                &opts,
            )
            .unwrap_err();
        assert_eq!(e.field(), Some("currents[1].current"));
        let e = m
            .evaluate(
                &[WindingCurrent::new("p", w.clone()), WindingCurrent::new("s", w.clone())],
                &LossOptions {
                    edge_time: -1.0,
                    ..opts
                },
            )
            .unwrap_err();
        assert_eq!(e.field(), Some("edge_time"));
        assert!(LossModel::new(&core, &st, f64::NAN).is_err());
    }

    /// `from_fit` with the stack-up's own fit is `new`; a fit of another
    /// stack-up is refused, not a panic.
    #[test]
    fn from_fit_is_new() {
        use crate::winding::stackup::{default_stackup, DefaultOptions, Pattern, WindingSpec};
        use crate::winding::Grade;
        let (core, st) = two_winding();
        let sq = Pwl::new(1e-5, vec![(0.0, 1.0), (5e-6, 1.0), (5e-6, -1.0), (1e-5, -1.0)]).unwrap();
        let cur = [
            WindingCurrent::new("p", sq.clone()),
            WindingCurrent::delivered("s", &sq.scaled(6.0)),
        ];
        let opts = LossOptions::default();
        let a = LossModel::new(&core, &st, 80.0).unwrap().evaluate(&cur, &opts).unwrap();
        let fr = fit(&core, &st).unwrap();
        let b = LossModel::from_fit(&st, &fr, 80.0)
            .unwrap()
            .evaluate(&cur, &opts)
            .unwrap();
        assert_eq!(a, b);
        let ws: Vec<WindingSpec> = ["a", "b", "c"]
            .iter()
            .map(|n| WindingSpec {
                name: n.to_string(),
                turns: 8,
                conductor: Conductor::awg(24, Grade::G2).unwrap(),
                parallel: 1,
            })
            .collect();
        let st3 = default_stackup(&core, &ws, &Pattern::Sequential, &DefaultOptions::default()).unwrap();
        let fr3 = fit(&core, &st3).unwrap();
        assert!(LossModel::from_fit(&st, &fr3, 80.0).is_err());
        assert!(LossModel::from_fit(&st, &fr, f64::NAN).is_err());
    }

    /// Zero currents give zero loss and finite factors; an idle winding in
    /// the other's field still has proximity loss; DC through a layer
    /// costs exactly Rdc·I².
    #[test]
    fn idle_zero_and_dc_cases() {
        let (core, st) = two_winding();
        let m = LossModel::new(&core, &st, 25.0).unwrap();
        let zero = Pwl::new(1e-5, vec![(0.0, 0.0), (1e-5, 0.0)]).unwrap();
        let sq = Pwl::new(1e-5, vec![(0.0, 1.0), (5e-6, 1.0), (5e-6, -1.0), (1e-5, -1.0)]).unwrap();
        let dc = Pwl::new(1e-5, vec![(0.0, 2.0), (1e-5, 2.0)]).unwrap();
        let opts = LossOptions::default();
        let r = m
            .evaluate(
                &[
                    WindingCurrent::new("p", zero.clone()),
                    WindingCurrent::new("s", zero.clone()),
                ],
                &opts,
            )
            .unwrap();
        assert_eq!(r.total, 0.0);
        assert!(r.windings.iter().all(|w| w.fr == 1.0 && w.total_loss == 0.0));
        let r = m
            .evaluate(
                &[WindingCurrent::new("p", sq), WindingCurrent::new("s", zero.clone())],
                &opts,
            )
            .unwrap();
        assert!(r.windings[1].total_loss > 0.0 && r.windings[1].fr == 1.0);
        assert!(r.total.is_finite() && r.tail_share > 0.0 && r.tail_share < 1.0);
        let r = m
            .evaluate(&[WindingCurrent::new("p", dc), WindingCurrent::new("s", zero)], &opts)
            .unwrap();
        let want = m.rdc()[0] * 4.0;
        assert!((r.total - want).abs() < 1e-12 * want && (r.windings[0].fr - 1.0).abs() < 1e-12);
    }
}
