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

    /// Multiplies every value by `k`.
    pub fn scaled(&self, k: f64) -> Pwl {
        Pwl { period: self.period, points: self.points.iter().map(|&(t, y)| (t, y * k)).collect() }
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
}
