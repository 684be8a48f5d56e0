//! Periodic piecewise-linear waveforms: the common language between the
//! converter topologies (which produce winding currents and flux density
//! over one switching period), the core-loss model (iGSE needs dB/dt on each
//! segment) and the winding model (Fourier harmonics of each current).
//!
//! A waveform is a list of breakpoints `(t, y)` over one period, `t` from 0
//! to the period `T`, non-decreasing. Between two breakpoints the value is
//! linear. Two breakpoints at the same time make an ideal step. The last
//! breakpoint is at `t = T`; periodicity means its value is followed by the
//! first one's (a step at the period boundary is allowed).
//!
//! Every statistic here is exact for such a waveform (closed-form integrals
//! of linear pieces); nothing is sampled.

use crate::error::{Error, Result};
use serde::{Deserialize, Serialize};

/// One period of a piecewise-linear waveform.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Pwl {
    /// Period in seconds.
    pub period: f64,
    /// Breakpoints `(t [s], value)`: first at t = 0, last at t = period.
    pub points: Vec<(f64, f64)>,
}

impl Pwl {
    /// Builds and checks a waveform.
    pub fn new(period: f64, points: Vec<(f64, f64)>) -> Result<Self> {
        let w = Pwl { period, points };
        w.validate()?;
        Ok(w)
    }

    /// Builds from segment durations and the value at each breakpoint:
    /// `values.len() == durations.len() + 1`. A zero duration is a step.
    pub fn from_segments(start: f64, segments: &[(f64, f64)]) -> Result<Self> {
        let mut t = 0.0;
        let mut pts = Vec::with_capacity(segments.len() + 1);
        pts.push((0.0, start));
        for &(dt, y) in segments {
            t += dt;
            pts.push((t, y));
        }
        Pwl::new(t, pts)
    }

    pub fn validate(&self) -> Result<()> {
        if !(self.period.is_finite() && self.period > 0.0) {
            return Err(Error::input("waveform.period", "the period must be a positive number of seconds"));
        }
        if self.points.len() < 2 {
            return Err(Error::input("waveform.points", "a waveform needs at least two breakpoints"));
        }
        let first = self.points[0].0;
        let last = self.points[self.points.len() - 1].0;
        if first != 0.0 {
            return Err(Error::input("waveform.points", "the first breakpoint must be at t = 0"));
        }
        let tol = 1e-9 * self.period;
        if (last - self.period).abs() > tol {
            return Err(Error::input("waveform.points", "the last breakpoint must be at t = period"));
        }
        for w in self.points.windows(2) {
            if !(w[0].0.is_finite() && w[1].0.is_finite() && w[0].1.is_finite() && w[1].1.is_finite()) {
                return Err(Error::input("waveform.points", "breakpoints must be finite numbers"));
            }
            if w[1].0 < w[0].0 {
                return Err(Error::input("waveform.points", "breakpoint times must not decrease"));
            }
        }
        Ok(())
    }

    /// Linear segments `(t0, y0, t1, y1)` of non-zero duration.
    pub fn segments(&self) -> impl Iterator<Item = (f64, f64, f64, f64)> + '_ {
        self.points
            .windows(2)
            .filter(|w| w[1].0 > w[0].0)
            .map(|w| (w[0].0, w[0].1, w[1].0, w[1].1))
    }

    /// Mean value: (1/T)∫y dt, trapezoids are exact for linear pieces.
    pub fn mean(&self) -> f64 {
        self.segments().map(|(t0, y0, t1, y1)| 0.5 * (y0 + y1) * (t1 - t0)).sum::<f64>() / self.period
    }

    /// RMS value: √((1/T)∫y² dt). For a linear piece from a to b over Δt,
    /// ∫y² = Δt·(a² + a·b + b²)/3 (exact integral of a square of a line).
    pub fn rms(&self) -> f64 {
        let s: f64 = self
            .segments()
            .map(|(t0, a, t1, b)| (t1 - t0) * (a * a + a * b + b * b) / 3.0)
            .sum();
        (s / self.period).max(0.0).sqrt()
    }

    /// Largest absolute value.
    pub fn peak_abs(&self) -> f64 {
        self.points.iter().fold(0.0_f64, |m, p| m.max(p.1.abs()))
    }

    pub fn max(&self) -> f64 {
        self.points.iter().fold(f64::NEG_INFINITY, |m, p| m.max(p.1))
    }

    pub fn min(&self) -> f64 {
        self.points.iter().fold(f64::INFINITY, |m, p| m.min(p.1))
    }

    /// Peak-to-peak swing.
    pub fn peak_to_peak(&self) -> f64 {
        self.max() - self.min()
    }

    /// The events of the waveform for its Fourier series: at each time where
    /// the value steps or the slope changes, `(t, Δy, Δs)` with Δy the step
    /// (value after minus value before) and Δs the slope change. The wrap
    /// from `t = T` back to `t = 0` is the event at `t = 0`. Events with
    /// neither a step nor a kink are dropped.
    pub fn events(&self) -> Vec<Event> {
        let mut out = Vec::with_capacity(self.points.len());
        self.for_each_event(|e| out.push(e));
        out
    }

    /// [`Pwl::events`] without collecting them.
    fn for_each_event(&self, mut f: impl FnMut(Event)) {
        // Positive-duration segments: (t0, y0, y1, slope).
        let seg = |(t0, y0, t1, y1): (f64, f64, f64, f64)| (t0, y0, y1, (y1 - y0) / (t1 - t0));
        // Event at the start of each segment, after the previous one
        // (the first one after the last: the wrap at t = T).
        let Some(mut prev) = self.segments().last().map(seg) else {
            return;
        };
        for (i, next) in self.segments().map(seg).enumerate() {
            let t = if i == 0 { 0.0 } else { next.0 };
            let dy = next.1 - prev.2;
            let ds = next.3 - prev.3;
            if dy != 0.0 || ds != 0.0 {
                f(Event { t, dy, ds });
            }
            prev = next;
        }
    }

    /// Complex Fourier coefficient c_n = (1/T)∫₀ᵀ y(t)·e^(−jnωt) dt, ω = 2π/T,
    /// returned as `(re, im)`, so that y(t) = Σₙ cₙ·e^(jnωt) over all integer n.
    ///
    /// Exact, not sampled: integrating each linear piece by parts leaves only
    /// the events (steps Δy and slope changes Δs at times tₖ):
    /// cₙ = −(1/T)·Σₖ e^(−jnωtₖ)·(j·Δyₖ/(nω) + Δsₖ/(nω)²) for n ≠ 0,
    /// and c₀ is the mean. (Standard result for piecewise-polynomial
    /// signals; e.g. Bracewell, The Fourier Transform and Its Applications,
    /// the derivative theorem applied twice.)
    pub fn fourier_coefficient(&self, n: u32) -> (f64, f64) {
        if n == 0 {
            return (self.mean(), 0.0);
        }
        let w = 2.0 * std::f64::consts::PI * n as f64 / self.period;
        let (mut re, mut im) = (0.0, 0.0);
        for e in self.events() {
            let (s, c) = (w * e.t).sin_cos();
            // e^(−jwt) = c − j·s; multiply by (ds/w² + j·dy/w).
            let a = e.ds / (w * w);
            let b = e.dy / w;
            re += c * a + s * b;
            im += c * b - s * a;
        }
        (-re / self.period, -im / self.period)
    }

    /// RMS value of harmonic n (n ≥ 1): √2·|cₙ|; for n = 0 the mean's magnitude.
    pub fn harmonic_rms(&self, n: u32) -> f64 {
        let (re, im) = self.fourier_coefficient(n);
        if n == 0 {
            re.abs()
        } else {
            std::f64::consts::SQRT_2 * re.hypot(im)
        }
    }

    /// A fast iterator over c₁, c₂, c₃, … (see [`Pwl::fourier_coefficient`]):
    /// the phasors e^(−jnωtₖ) advance by one complex multiplication per
    /// event and harmonic, so no sine or cosine is evaluated in the loop.
    ///
    /// `edge_time` (s, ≥ 0) replaces every ideal step by a linear ramp of that
    /// duration centred on the step: its coefficient is multiplied by
    /// sinc(nω·t_r/2) = sin(x)/x (the Fourier transform of a rectangular
    /// pulse of the ramp's slope). Zero keeps ideal steps.
    pub fn spectrum(&self, edge_time: f64) -> Spectrum {
        let w1 = 2.0 * std::f64::consts::PI / self.period;
        let mut events = Vec::with_capacity(self.points.len());
        // cₙ = (1/n)·Σ e^(−jnω₁t)·(−j·Δy/(ω₁T)) + (1/n²)·Σ e^(−jnω₁t)·(−Δs/(ω₁²T)).
        let (ky, ks) = (-1.0 / (w1 * self.period), -1.0 / (w1 * w1 * self.period));
        self.for_each_event(|e| {
            let (s, c) = (w1 * e.t).sin_cos();
            events.push(SpectrumEvent { t: e.t, dy: e.dy, y: e.dy * ky, s: e.ds * ks, base: (c, -s), cur: (1.0, 0.0) });
        });
        let half_edge = if edge_time.is_finite() && edge_time > 0.0 { 0.5 * edge_time } else { 0.0 };
        let theta = w1 * half_edge;
        let (s, c) = theta.sin_cos();
        Spectrum {
            events,
            n: 0,
            theta,
            inv_theta: if theta > 0.0 { 1.0 / theta } else { 0.0 },
            edge_base: (c, s),
            edge_cur: (1.0, 0.0),
        }
    }

    /// Multiplies every value by `k`.
    pub fn scaled(&self, k: f64) -> Pwl {
        Pwl { period: self.period, points: self.points.iter().map(|&(t, y)| (t, y * k)).collect() }
    }
}

/// A step and/or slope change of a [`Pwl`] at time `t` (see [`Pwl::events`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Event {
    pub t: f64,
    /// Value after minus value before.
    pub dy: f64,
    /// Slope after minus slope before, per second.
    pub ds: f64,
}

#[derive(Debug, Clone)]
struct SpectrumEvent {
    t: f64,
    dy: f64,
    /// −Δy/(ω₁T) and −Δs/(ω₁²T): the step's and the kink's weights.
    y: f64,
    s: f64,
    /// e^(−jω₁t).
    base: (f64, f64),
    /// e^(−jnω₁t) for the current n.
    cur: (f64, f64),
}

/// Iterator over the complex Fourier coefficients c₁, c₂, … of a [`Pwl`];
/// made by [`Pwl::spectrum`]. Each item is `(re, im)` of cₙ.
///
/// Speed: per harmonic one complex multiplication per event (the phasor
/// e^(−jnω₁tₖ) by recurrence), one division, and with a finite edge time
/// one more complex multiplication for sin(nθ) of the sinc (θ = ω₁·t_r/2):
/// no sine, cosine or exponential after construction. The recurrences
/// lose about one rounding (1e−16) per harmonic in absolute terms, far
/// below the loss tolerance at any harmonic count the winding model uses.
#[derive(Debug, Clone)]
pub struct Spectrum {
    events: Vec<SpectrumEvent>,
    n: u32,
    /// ω₁·t_r/2 (0: ideal steps) and its inverse (0 if θ = 0).
    theta: f64,
    inv_theta: f64,
    /// e^(jθ) and e^(jnθ) for the current n.
    edge_base: (f64, f64),
    edge_cur: (f64, f64),
}

impl Spectrum {
    /// Harmonic number of the coefficient the last `next()` returned.
    pub fn harmonic(&self) -> u32 {
        self.n
    }

    /// The steps of the waveform, `(t, Δy)` (every event, Δy = 0 for a
    /// pure slope change), as [`Pwl::events`] gives them.
    pub fn steps(&self) -> impl Iterator<Item = (f64, f64)> + '_ {
        self.events.iter().map(|e| (e.t, e.dy))
    }
}

impl Iterator for Spectrum {
    type Item = (f64, f64);

    fn next(&mut self) -> Option<(f64, f64)> {
        self.n = self.n.checked_add(1)?;
        let nf = self.n as f64;
        let inv_n = 1.0 / nf;
        let sinc = if self.theta > 0.0 {
            // sin(nθ) by rotation: e^(j(n+1)θ) = e^(jnθ)·e^(jθ).
            let (cr, ci) = self.edge_cur;
            let (br, bi) = self.edge_base;
            self.edge_cur = (cr * br - ci * bi, cr * bi + ci * br);
            if nf * self.theta < 1e-8 { 1.0 } else { self.edge_cur.1 * inv_n * self.inv_theta }
        } else {
            1.0
        };
        // cₙ = Σₖ e^(−jnω₁tₖ)·(sₖ/n² + j·sinc·yₖ/n): the sums of the
        // phasors weighted by y and by s, then the factors.
        let (mut yr, mut yi, mut sr, mut si) = (0.0, 0.0, 0.0, 0.0);
        for e in &mut self.events {
            // Advance the phasor: cur ← cur·base.
            let (cr, ci) = e.cur;
            let (br, bi) = e.base;
            let (c, ms) = (cr * br - ci * bi, cr * bi + ci * br); // cos − j·sin
            e.cur = (c, ms);
            yr += c * e.y;
            yi += ms * e.y;
            sr += c * e.s;
            si += ms * e.s;
        }
        let (ky, ks) = (sinc * inv_n, inv_n * inv_n);
        Some((ks * sr - ky * yi, ks * si + ky * yr))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Textbook RMS values (common practice, no source): square wave of
    // amplitude A has RMS A; symmetric triangle of peak A has RMS A/√3;
    // a pulse of height I and duty D has RMS I·√D.
    #[test]
    fn rms_of_standard_shapes() {
        let sq = Pwl::new(1.0, vec![(0.0, 1.0), (0.5, 1.0), (0.5, -1.0), (1.0, -1.0)]).unwrap();
        assert!((sq.rms() - 1.0).abs() < 1e-12);
        assert!(sq.mean().abs() < 1e-12);
        let tri = Pwl::new(2.0, vec![(0.0, -1.0), (1.0, 1.0), (2.0, -1.0)]).unwrap();
        assert!((tri.rms() - 1.0 / 3f64.sqrt()).abs() < 1e-12);
        let d = 0.3;
        let pulse = Pwl::new(1.0, vec![(0.0, 2.0), (d, 2.0), (d, 0.0), (1.0, 0.0)]).unwrap();
        assert!((pulse.rms() - 2.0 * d.sqrt()).abs() < 1e-12);
        assert!((pulse.mean() - 2.0 * d).abs() < 1e-12);
        assert_eq!(pulse.peak_to_peak(), 2.0);
    }

    #[test]
    fn rejects_bad_breakpoints() {
        assert!(Pwl::new(1.0, vec![(0.0, 1.0)]).is_err());
        assert!(Pwl::new(1.0, vec![(0.1, 1.0), (1.0, 1.0)]).is_err());
        assert!(Pwl::new(1.0, vec![(0.0, 1.0), (0.7, 1.0), (0.5, 1.0), (1.0, 0.0)]).is_err());
        assert!(Pwl::new(1.0, vec![(0.0, f64::NAN), (1.0, 1.0)]).is_err());
        assert!(Pwl::new(0.0, vec![(0.0, 1.0), (0.0, 1.0)]).is_err());
    }
    // Textbook Fourier series (e.g. Kreyszig, Advanced Engineering
    // Mathematics, Fourier series chapter): a square wave ±A has sine
    // amplitudes 4A/(πn) for odd n, none for even n; a symmetric triangle of
    // peak A has cosine amplitudes 8A/(π²n²) for odd n.
    #[test]
    fn fourier_of_square_and_triangle() {
        let pi = std::f64::consts::PI;
        let sq = Pwl::new(1.0, vec![(0.0, 1.0), (0.5, 1.0), (0.5, -1.0), (1.0, -1.0)]).unwrap();
        let tri = Pwl::new(1.0, vec![(0.0, -1.0), (0.5, 1.0), (1.0, -1.0)]).unwrap();
        let mut s_sq = sq.spectrum(0.0);
        let mut s_tri = tri.spectrum(0.0);
        for n in 1..=25u32 {
            let (re, im) = sq.fourier_coefficient(n);
            let amp = 2.0 * re.hypot(im);
            let want = if n % 2 == 1 { 4.0 / (pi * n as f64) } else { 0.0 };
            assert!((amp - want).abs() < 1e-12, "square n={n}: {amp} vs {want}");
            let (r2, i2) = s_sq.next().unwrap();
            assert!((r2 - re).abs() < 1e-12 && (i2 - im).abs() < 1e-12);
            let (re, im) = tri.fourier_coefficient(n);
            let amp = 2.0 * re.hypot(im);
            let want = if n % 2 == 1 { 8.0 / (pi * pi * (n * n) as f64) } else { 0.0 };
            assert!((amp - want).abs() < 1e-12, "triangle n={n}: {amp} vs {want}");
            let (r2, i2) = s_tri.next().unwrap();
            assert!((r2 - re).abs() < 1e-12 && (i2 - im).abs() < 1e-12);
        }
    }

    // A step smoothed into a linear ramp of duration t_r centred on it is
    // the step convolved with a unit-area rectangle of width t_r, so its
    // coefficients are the step's times sinc(nω·t_r/2) (convolution
    // theorem; Bracewell, The Fourier Transform and Its Applications). The
    // ramped waveform is itself piecewise linear: its exact coefficients
    // check the spectrum's sinc recurrence over thousands of harmonics.
    #[test]
    fn edge_time_is_a_ramp() {
        let tr = 0.02;
        let stepped =
            Pwl::new(1.0, vec![(0.0, -1.0), (0.25, -1.0), (0.25, 1.0), (0.75, 1.0), (0.75, -1.0), (1.0, -1.0)]).unwrap();
        let h = 0.5 * tr;
        let ramped = Pwl::new(
            1.0,
            vec![(0.0, -1.0), (0.25 - h, -1.0), (0.25 + h, 1.0), (0.75 - h, 1.0), (0.75 + h, -1.0), (1.0, -1.0)],
        )
        .unwrap();
        let mut worst = 0.0_f64;
        for (i, (re, im)) in stepped.spectrum(tr).take(5000).enumerate() {
            let (r0, i0) = ramped.fourier_coefficient(i as u32 + 1);
            worst = worst.max((re - r0).abs()).max((im - i0).abs());
        }
        assert!(worst < 1e-13, "{worst}");
    }

    // Parseval: mean² + Σ harmonic RMS² = RMS², for a continuous
    // (kinks only) waveform whose terms fall as n⁻⁴.
    #[test]
    fn parseval_continuous() {
        let w = Pwl::new(1e-5, vec![(0.0, 0.5), (3e-6, 2.0), (4e-6, 1.5), (1e-5, 0.5)]).unwrap();
        let mut sum = w.mean().powi(2);
        for (re, im) in w.spectrum(0.0).take(4000) {
            sum += 2.0 * (re * re + im * im);
        }
        assert!((sum.sqrt() - w.rms()).abs() < 1e-9 * w.rms(), "{} vs {}", sum.sqrt(), w.rms());
    }
}
