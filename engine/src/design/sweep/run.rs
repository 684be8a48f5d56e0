//! The frequency sweeps, point by point: [`FrequencySweep`].
//!
//! A sweep of `n` frequencies is `n` independent designs, so it can be
//! computed in slices: [`FrequencySweep::step`] computes the next few
//! points and returns, [`FrequencySweep::finish`] computes what is left
//! and adds the landmarks (the minimum, the material's band). A caller
//! with a time budget (the page, one slice per animation frame) steps it
//! as far as its budget allows and can drop it at any time; a caller
//! without one takes [`FrequencySweep::finish`] at once. Both frequency
//! sweeps, [`super::frequency`] (redesigned at each point) and
//! [`super::as_wound`] (this transformer as wound), are this type run to
//! the end, so a sweep computed in slices is the same sweep, to the bit,
//! as one computed at once: each point depends on its frequency alone,
//! never on the slicing or on the points before it.

use super::{landmarks, log_space, point, range, Curve, Sweep, SweepPoint};
use crate::core::Core;
use crate::design::file::Design;
use crate::design::solve::{evaluate_with, Prepared};
use crate::error::{Error, Result};
use crate::material::Material;
use crate::topology::Topology;

/// A frequency sweep being computed: the design, its core and material
/// resolved once, the frequencies, and the points computed so far.
#[derive(Debug, Clone)]
pub struct FrequencySweep {
    curve: Curve,
    /// The design the points are built from (for the as-wound curve, the
    /// design with its turns and conductors fixed); its frequency (and a
    /// flyback's ripple ratio) is set at each point.
    design: Design,
    core: Core,
    material: Material,
    prep: Prepared,
    frequencies: Vec<f64>,
    points: Vec<SweepPoint>,
    /// As wound, a flyback: its own frequency and ripple ratio (the ripple
    /// ratio is scaled by f₀/f to hold Lp, module docs of `as_wound`).
    wound_flyback: Option<(f64, f64)>,
}

impl FrequencySweep {
    /// A sweep of `design` at `n` log-spaced frequencies from `f_min` to
    /// `f_max` ([`log_space`]), no point computed yet. `curve` is
    /// [`Curve::Redesigned`] or [`Curve::AsWound`]; the as-wound curve
    /// solves the design once here, at its own frequency, and is an error
    /// where that design cannot be built. The flux sweep is not a
    /// frequency sweep (an error naming `sweep.curve`).
    pub fn new(design: &Design, f_min: f64, f_max: f64, n: usize, curve: Curve) -> Result<FrequencySweep> {
        design.check_envelope()?;
        let frequencies = log_space(f_min, f_max, n)?;
        let core = design.resolve_core()?;
        let material = design.resolve_material()?;
        let prep = Prepared::new(&material)?;
        let (design, wound_flyback) = match curve {
            Curve::Redesigned => (design.clone(), None),
            Curve::AsWound => {
                let wound = evaluate_with(design, &core, &material, &prep)?;
                let fixed = super::as_wound_design(design, &wound)?;
                let fly = (design.spec.topology == Topology::Flyback)
                    .then_some((design.spec.frequency, design.spec.flyback.ripple_ratio));
                (fixed, fly)
            }
            Curve::Flux => return Err(Error::input("sweep.curve", "the flux sweep is not a frequency sweep")),
        };
        Ok(FrequencySweep { curve, design, core, material, prep, points: Vec::with_capacity(n), frequencies, wound_flyback })
    }

    /// Which curve this is.
    pub fn curve(&self) -> Curve {
        self.curve
    }

    /// Points computed so far.
    pub fn done(&self) -> usize {
        self.points.len()
    }

    /// Points in the sweep.
    pub fn total(&self) -> usize {
        self.frequencies.len()
    }

    /// Whether every point is computed.
    pub fn is_finished(&self) -> bool {
        self.done() >= self.total()
    }

    /// Computes up to `points` more points (fewer at the end); returns
    /// whether every point is now computed.
    pub fn step(&mut self, points: usize) -> bool {
        let end = self.done().saturating_add(points).min(self.total());
        for i in self.done()..end {
            let p = self.point_at(self.frequencies[i]);
            self.points.push(p);
        }
        self.is_finished()
    }

    /// Computes the points left, then the landmarks: the sweep.
    pub fn finish(mut self) -> Sweep {
        self.step(usize::MAX);
        landmarks(self.curve, self.points, &self.material)
    }

    /// The point at frequency `f`.
    fn point_at(&mut self, f: f64) -> SweepPoint {
        self.design.spec.frequency = f;
        if let Some((f0, r0)) = self.wound_flyback {
            let r = r0 * f0 / f;
            if !(0.01..=20.0).contains(&r) {
                return SweepPoint {
                    x: f,
                    feasible: false,
                    in_data: range::frequency_in_data(&self.material, f),
                    values: None,
                    reason: format!(
                        "the wound Lp means a ripple ratio of {r:.3} here, outside the 0.01 to 20 the flyback model takes"
                    ),
                };
            }
            self.design.spec.flyback.ripple_ratio = r;
        }
        point(f, evaluate_with(&self.design, &self.core, &self.material, &self.prep), &self.material, Some(f))
    }
}

#[cfg(test)]
mod tests {
    //! The sliced sweep against the straightforward loop it replaced (the
    //! code of `sweep::frequency` and `sweep::as_wound` before it, kept
    //! here as the reference: one `evaluate_with` per frequency, in order),
    //! on the demos, serialised and compared byte for byte.
    use super::*;
    use crate::design::file::Design;

    fn straightforward(design: &Design, f_min: f64, f_max: f64, n: usize, curve: Curve) -> Result<Sweep> {
        design.check_envelope()?;
        let fs = log_space(f_min, f_max, n)?;
        let core = design.resolve_core()?;
        let material = design.resolve_material()?;
        let prep = Prepared::new(&material)?;
        let mut d = match curve {
            Curve::Redesigned => design.clone(),
            _ => {
                let wound = evaluate_with(design, &core, &material, &prep)?;
                super::super::as_wound_design(design, &wound)?
            }
        };
        let (f0, r0) = (design.spec.frequency, design.spec.flyback.ripple_ratio);
        let points = fs
            .into_iter()
            .map(|f| {
                d.spec.frequency = f;
                if curve == Curve::AsWound && design.spec.topology == Topology::Flyback {
                    let r = r0 * f0 / f;
                    if !(0.01..=20.0).contains(&r) {
                        return SweepPoint {
                            x: f,
                            feasible: false,
                            in_data: range::frequency_in_data(&material, f),
                            values: None,
                            reason: format!(
                                "the wound Lp means a ripple ratio of {r:.3} here, outside the 0.01 to 20 the flyback model takes"
                            ),
                        };
                    }
                    d.spec.flyback.ripple_ratio = r;
                }
                point(f, evaluate_with(&d, &core, &material, &prep), &material, Some(f))
            })
            .collect();
        Ok(landmarks(curve, points, &material))
    }

    fn json(s: &Sweep) -> String {
        serde_json::to_string(s).unwrap()
    }

    #[test]
    fn sliced_equals_the_straightforward_loop_on_the_demos() {
        let demos = [Design::demo_forward(), Design::demo_flyback(), Design::demo_push_pull(), Design::demo_inductor()];
        for d in demos {
            let f0 = d.spec.frequency;
            // A wide range, so the flyback's as-wound ends leave its model.
            let (lo, hi, n) = ((f0 / 30.0).max(1e3), (f0 * 30.0).min(20e6), 37);
            for curve in [Curve::Redesigned, Curve::AsWound] {
                let want = json(&straightforward(&d, lo, hi, n, curve).unwrap());
                for slice in [1, 2, 5, 36, 37, 1000] {
                    let mut s = FrequencySweep::new(&d, lo, hi, n, curve).unwrap();
                    let mut steps = 0;
                    while !s.step(slice) {
                        steps += 1;
                        assert!(s.done() == steps * slice && !s.is_finished());
                    }
                    assert_eq!(s.done(), n);
                    assert_eq!(json(&s.finish()), want, "{} {curve:?}, slices of {slice}", d.name);
                }
                // Finished part-way: the rest is computed by `finish`.
                let mut s = FrequencySweep::new(&d, lo, hi, n, curve).unwrap();
                s.step(10);
                assert_eq!(json(&s.finish()), want, "{} {curve:?}, finished after 10", d.name);
                // The public wrappers are the same sweep.
                let public = match curve {
                    Curve::Redesigned => super::super::frequency(&d, lo, hi, n),
                    _ => super::super::as_wound(&d, lo, hi, n),
                };
                assert_eq!(json(&public.unwrap()), want, "{} {curve:?}, wrapper", d.name);
            }
        }
    }

    #[test]
    fn errors_are_the_straightforward_ones() {
        let d = Design::demo_forward();
        for (lo, hi, n) in [(1e2, 1e6, 10), (1e5, 1e4, 10), (1e4, 1e6, 1)] {
            let a = FrequencySweep::new(&d, lo, hi, n, Curve::Redesigned).unwrap_err();
            let b = straightforward(&d, lo, hi, n, Curve::Redesigned).unwrap_err();
            assert_eq!((a.field(), a.message()), (b.field(), b.message()));
        }
        let e = FrequencySweep::new(&d, 1e4, 1e6, 10, Curve::Flux).unwrap_err();
        assert_eq!(e.field(), Some("sweep.curve"));
    }
}
