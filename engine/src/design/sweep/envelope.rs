//! The best material at each frequency: an envelope over the library.
//!
//! At each frequency of a redesign sweep ([`super::frequency`]) the design
//! is redone with every library material (and the design's own, when it is
//! a custom one), and, as an option, every library core of the design's
//! core family; the envelope keeps the least total loss among the points
//! that pass every check inside their material's data, and names the
//! material (and core) that gives it. Where the winner changes from one
//! frequency to the next, the index is listed in `changes` (the plot marks
//! them). Each point is a full design, so the envelope answers "which
//! material should this converter use at this frequency", not a
//! comparison of Steinmetz curves at one flux density.

use super::{log_space, Curve, FrequencySweep, PointValues};
use crate::core::library as cores;
use crate::design::file::{CoreChoice, Design, MaterialChoice};
use crate::error::Result;
use crate::material::library as materials;
use serde::Serialize;

/// One frequency of the envelope.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct EnvelopePoint {
    pub x: f64,
    /// Some design passes every check inside its material's data here.
    pub feasible: bool,
    /// Some material's data hold here (its point's `in_data`), whether or
    /// not its design passes the other checks.
    pub in_data: bool,
    /// The winner's material and core (`None` where nothing is feasible).
    pub material: Option<String>,
    pub core: Option<String>,
    pub values: Option<PointValues>,
    /// Why nothing is feasible (empty when something is).
    pub reason: String,
}

/// The envelope and its landmarks.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Envelope {
    /// The swept variable's name and unit (switching frequency, Hz).
    pub x_axis: super::XAxis,
    pub points: Vec<EnvelopePoint>,
    /// Indices of the points whose winner (material, core) differs from the
    /// previous feasible point's.
    pub changes: Vec<usize>,
    /// Index of the feasible point with the least total loss.
    pub minimum: Option<usize>,
    /// What holds the minimum where it is ([`super::Sweep::minimum_limits`];
    /// a point where nothing is feasible has no loss to compare, so it
    /// counts as one where no design can be built).
    pub minimum_limits: Vec<super::MinimumLimit>,
    /// Every material and core tried.
    pub materials: Vec<String>,
    pub cores: Vec<String>,
}

/// The envelope over every library material (and the design's own custom
/// one), on the design's core or, with `every_core`, on every library core
/// of its family; `n` log-spaced frequencies from `f_min` to `f_max`: an
/// [`EnvelopeSweep`] run to the end.
pub fn envelope(design: &Design, f_min: f64, f_max: f64, n: usize, every_core: bool) -> Result<Envelope> {
    Ok(EnvelopeSweep::new(design, f_min, f_max, n, every_core)?.finish())
}

/// The envelope being computed, point by point (as [`FrequencySweep`]):
/// one redesign sweep per (core, material), in order, each merged into the
/// envelope when it ends. [`EnvelopeSweep::step`] computes the next points
/// of the sweep in progress (starting the next one as needed);
/// [`EnvelopeSweep::finish`] the rest and the landmarks. Each sweep is
/// [`super::frequency`]'s, so the envelope is the same, to the bit, however
/// it is sliced.
#[derive(Debug, Clone)]
pub struct EnvelopeSweep {
    design: Design,
    range: (f64, f64, usize),
    materials: Vec<MaterialChoice>,
    cores: Vec<CoreChoice>,
    /// The next (core, material) to sweep.
    next: (usize, usize),
    /// The current core's designation, once resolved (`None`: not yet, or
    /// it cannot be).
    core: Option<String>,
    /// The sweep in progress.
    sweep: Option<FrequencySweep>,
    points: Vec<EnvelopePoint>,
    mat_names: Vec<String>,
    core_names: Vec<String>,
}

impl EnvelopeSweep {
    /// The envelope of [`envelope`], no point computed yet.
    pub fn new(design: &Design, f_min: f64, f_max: f64, n: usize, every_core: bool) -> Result<EnvelopeSweep> {
        design.check_envelope()?;
        let fs = log_space(f_min, f_max, n)?;
        let own_core = design.resolve_core()?;
        let mut mats: Vec<MaterialChoice> =
            materials::materials().into_iter().map(|m| MaterialChoice::Library { name: m.name }).collect();
        if let MaterialChoice::Custom { .. } = &design.material {
            mats.push(design.material.clone());
        }
        let core_choices: Vec<CoreChoice> = if every_core {
            let mut v: Vec<CoreChoice> = cores::all()
                .iter()
                .filter(|c| c.family == own_core.family)
                .map(|c| CoreChoice::Library { designation: c.designation.clone() })
                .collect();
            if !matches!(design.core, CoreChoice::Library { .. }) || v.is_empty() {
                v.push(design.core.clone());
            }
            v
        } else {
            vec![design.core.clone()]
        };
        let points = fs
            .iter()
            .map(|&x| EnvelopePoint {
                x,
                feasible: false,
                in_data: false,
                material: None,
                core: None,
                values: None,
                reason: "no material passes every check inside its data here".into(),
            })
            .collect();
        Ok(EnvelopeSweep {
            design: design.clone(),
            range: (f_min, f_max, n),
            materials: mats,
            cores: core_choices,
            next: (0, 0),
            core: None,
            sweep: None,
            points,
            mat_names: Vec::new(),
            core_names: Vec::new(),
        })
    }

    /// Sweeps (core × material) done and in all (the progress of a run).
    pub fn progress(&self) -> (usize, usize) {
        let (c, m) = self.next;
        (c * self.materials.len() + m, self.cores.len() * self.materials.len())
    }

    /// Starts the next sweep that can be built; `false` when none is left.
    fn start_next(&mut self) -> bool {
        let (f_min, f_max, n) = self.range;
        loop {
            let (ci, mi) = self.next;
            if ci >= self.cores.len() {
                return false;
            }
            if mi == 0 && self.core.is_none() {
                self.design.core = self.cores[ci].clone();
                match self.design.resolve_core() {
                    Ok(c) => {
                        self.core_names.push(c.designation.clone());
                        self.core = Some(c.designation);
                    }
                    Err(_) => {
                        self.next = (ci + 1, 0);
                        continue;
                    }
                }
            }
            if mi >= self.materials.len() {
                self.next = (ci + 1, 0);
                self.core = None;
                continue;
            }
            self.next = (ci, mi + 1);
            self.design.material = self.materials[mi].clone();
            if let Ok(s) = FrequencySweep::new(&self.design, f_min, f_max, n, Curve::Redesigned) {
                self.sweep = Some(s);
                return true;
            }
        }
    }

    /// Computes up to `points` more points; returns whether every sweep
    /// is done.
    pub fn step(&mut self, points: usize) -> bool {
        let mut left = points;
        while left > 0 {
            let Some(s) = self.sweep.as_mut() else {
                if self.start_next() {
                    continue;
                }
                return true;
            };
            let k = left.min(s.total() - s.done());
            s.step(k);
            left -= k;
            if s.is_finished() {
                if let Some(s) = self.sweep.take() {
                    self.merge(s.finish());
                }
            }
        }
        self.sweep.is_none() && self.progress().0 >= self.progress().1
    }

    /// One material's sweep into the envelope: the least total loss among
    /// the points feasible so far.
    fn merge(&mut self, s: super::Sweep) {
        let core = self.core.clone().unwrap_or_default();
        if !self.mat_names.contains(&s.material) {
            self.mat_names.push(s.material.clone());
        }
        for (e, p) in self.points.iter_mut().zip(&s.points) {
            e.in_data |= p.in_data;
            let Some(v) = p.values.filter(|_| p.feasible) else { continue };
            if e.values.is_none_or(|w| v.total < w.total) {
                *e = EnvelopePoint {
                    x: e.x,
                    feasible: true,
                    in_data: true,
                    material: Some(s.material.clone()),
                    core: Some(core.clone()),
                    values: Some(v),
                    reason: String::new(),
                };
            }
        }
    }

    /// Computes what is left, then the landmarks: the envelope.
    pub fn finish(mut self) -> Envelope {
        while !self.step(usize::MAX) {}
        let points = self.points;
        let mut changes = Vec::new();
        let mut last: Option<(&Option<String>, &Option<String>)> = None;
        for (i, p) in points.iter().enumerate().filter(|(_, p)| p.feasible) {
            if last.is_some_and(|l| l != (&p.material, &p.core)) {
                changes.push(i);
            }
            last = Some((&p.material, &p.core));
        }
        let minimum = points
            .iter()
            .enumerate()
            .filter_map(|(i, p)| p.values.filter(|_| p.feasible).map(|v| (i, v.total)))
            .min_by(|a, b| a.1.total_cmp(&b.1))
            .map(|(i, _)| i);
        let minimum_limits = limits_of(&points, minimum);
        Envelope {
            x_axis: super::FREQUENCY_AXIS,
            points,
            changes,
            minimum,
            minimum_limits,
            materials: self.mat_names,
            cores: self.core_names,
        }
    }
}

/// [`super::limit::minimum_limits`] of the envelope's points (an infeasible
/// one has no values: nothing passes there).
fn limits_of(points: &[EnvelopePoint], minimum: Option<usize>) -> Vec<super::MinimumLimit> {
    let probes: Vec<super::limit::Probe> = points.iter().map(super::limit::Probe::from).collect();
    super::limit::minimum_limits(&probes, minimum, super::FREQUENCY_AXIS, &super::limit::FREQUENCY_ENDS)
}

/// The envelope as CSV: one row per frequency, SI units in the header.
pub fn envelope_csv(e: &Envelope) -> String {
    let mut out = String::from(
        "frequency_Hz,feasible,in_data,material,core,primary_turns,b_peak_T,core_W,copper_W,total_W,temperature_C,reason\n",
    );
    let q = |s: &str| format!("\"{}\"", s.replace('"', "'"));
    for p in &e.points {
        let (m, c) = (p.material.as_deref().unwrap_or(""), p.core.as_deref().unwrap_or(""));
        match p.values {
            Some(v) => out.push_str(&format!(
                "{},{},{},{},{},{},{},{},{},{},{},{}\n",
                p.x,
                p.feasible,
                p.in_data,
                q(m),
                q(c),
                v.primary_turns,
                v.b_peak,
                v.core,
                v.copper,
                v.total,
                v.temperature,
                q(&p.reason)
            )),
            None => out.push_str(&format!("{},false,{},,,,,,,,,{}\n", p.x, p.in_data, q(&p.reason))),
        }
    }
    out
}

#[cfg(test)]
mod tests {
    //! The sliced envelope against the straightforward loop it replaced
    //! (the code of `envelope` before it, kept here as the reference: one
    //! whole redesign sweep per core and material, in order), serialised
    //! and compared byte for byte.
    use super::*;
    use crate::design::sweep::frequency;

    fn straightforward(design: &Design, f_min: f64, f_max: f64, n: usize, every_core: bool) -> Result<Envelope> {
        design.check_envelope()?;
        let fs = log_space(f_min, f_max, n)?;
        let own_core = design.resolve_core()?;
        let mut mats: Vec<MaterialChoice> =
            materials::materials().into_iter().map(|m| MaterialChoice::Library { name: m.name }).collect();
        if let MaterialChoice::Custom { .. } = &design.material {
            mats.push(design.material.clone());
        }
        let core_choices: Vec<CoreChoice> = if every_core {
            let mut v: Vec<CoreChoice> = cores::all()
                .iter()
                .filter(|c| c.family == own_core.family)
                .map(|c| CoreChoice::Library { designation: c.designation.clone() })
                .collect();
            if !matches!(design.core, CoreChoice::Library { .. }) || v.is_empty() {
                v.push(design.core.clone());
            }
            v
        } else {
            vec![design.core.clone()]
        };
        let mut points: Vec<EnvelopePoint> = fs
            .iter()
            .map(|&x| EnvelopePoint {
                x,
                feasible: false,
                in_data: false,
                material: None,
                core: None,
                values: None,
                reason: "no material passes every check inside its data here".into(),
            })
            .collect();
        let (mut mat_names, mut core_names) = (Vec::new(), Vec::new());
        for cc in &core_choices {
            let mut d = design.clone();
            d.core = cc.clone();
            let Ok(core) = d.resolve_core() else { continue };
            core_names.push(core.designation.clone());
            for mc in &mats {
                d.material = mc.clone();
                let Ok(s) = frequency(&d, f_min, f_max, n) else { continue };
                if !mat_names.contains(&s.material) {
                    mat_names.push(s.material.clone());
                }
                for (e, p) in points.iter_mut().zip(&s.points) {
                    e.in_data |= p.in_data;
                    let Some(v) = p.values.filter(|_| p.feasible) else { continue };
                    if e.values.is_none_or(|w| v.total < w.total) {
                        *e = EnvelopePoint {
                            x: e.x,
                            feasible: true,
                            in_data: true,
                            material: Some(s.material.clone()),
                            core: Some(core.designation.clone()),
                            values: Some(v),
                            reason: String::new(),
                        };
                    }
                }
            }
        }
        let mut changes = Vec::new();
        let mut last: Option<(&Option<String>, &Option<String>)> = None;
        for (i, p) in points.iter().enumerate().filter(|(_, p)| p.feasible) {
            if last.is_some_and(|l| l != (&p.material, &p.core)) {
                changes.push(i);
            }
            last = Some((&p.material, &p.core));
        }
        let minimum = points
            .iter()
            .enumerate()
            .filter_map(|(i, p)| p.values.filter(|_| p.feasible).map(|v| (i, v.total)))
            .min_by(|a, b| a.1.total_cmp(&b.1))
            .map(|(i, _)| i);
        let minimum_limits = limits_of(&points, minimum);
        Ok(Envelope {
            x_axis: crate::design::sweep::FREQUENCY_AXIS,
            points,
            changes,
            minimum,
            minimum_limits,
            materials: mat_names,
            cores: core_names,
        })
    }


    #[test]
    fn sliced_equals_the_straightforward_loop() {
        let json = |e: &Envelope| serde_json::to_string(e).unwrap();
        for (d, every) in [(Design::demo_forward(), false), (Design::demo_flyback(), false), (Design::demo_inductor(), true)] {
            let f0 = d.spec.frequency;
            let (lo, hi, n) = (f0 / 4.0, f0 * 4.0, 5);
            let want = json(&straightforward(&d, lo, hi, n, every).unwrap());
            for slice in [1, 3, 7, 1000] {
                let mut e = EnvelopeSweep::new(&d, lo, hi, n, every).unwrap();
                let mut steps = 0;
                while !e.step(slice) {
                    steps += 1;
                    assert!(steps < 100_000);
                }
                let (done, all) = e.progress();
                assert_eq!(done, all);
                assert_eq!(json(&e.finish()), want, "{}, slices of {slice}", d.name);
            }
            assert_eq!(json(&envelope(&d, lo, hi, n, every).unwrap()), want, "{}, wrapper", d.name);
        }
    }
}
