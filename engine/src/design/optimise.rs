//! The optimiser: every library core × material (optionally × a frequency
//! grid) designed for one specification, ranked by volume and by loss, with
//! the Pareto front between them.
//!
//! It is a plain exhaustive search (the library is small: tens of cores and
//! a handful of materials, each design well under a millisecond), so the
//! ranking is exact over the candidates, and the report counts how many
//! were evaluated and why the rest failed. [`Optimiser`] exposes it one
//! candidate at a time so a front end can show progress and cancel.
//!
//! It ranks the transformer (or inductor) itself: a forward-type design's
//! output choke is a magnetic of its own, designed by `evaluate` for the
//! design the user picks, with its own verdict (the report's `choke`).

use super::file::{CoreChoice, Design, MaterialChoice};
use super::solve::{evaluate_with, Prepared};
use crate::core::Core;
use crate::error::Result;
use crate::material::Material;
use serde::Serialize;

/// One passing candidate.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Ranked {
    pub core: String,
    pub family: String,
    pub material: String,
    pub frequency: f64,
    /// Physical volume of the core set, m³.
    pub volume: f64,
    pub total_loss: f64,
    pub temperature: f64,
    pub primary_turns: u32,
    /// On the loss–volume Pareto front.
    pub pareto: bool,
}

/// How many failed, and why.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct FailureCount {
    pub reason: String,
    pub count: usize,
}

/// The optimiser's result.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Ranking {
    pub evaluated: usize,
    pub passed: usize,
    pub failures: Vec<FailureCount>,
    /// Passing candidates, smallest volume first (ties: lower loss).
    pub by_volume: Vec<Ranked>,
    /// Passing candidates, lowest loss first.
    pub by_loss: Vec<Ranked>,
    /// The Pareto front, by volume.
    pub pareto: Vec<Ranked>,
}

/// An exhaustive search, one candidate per [`Optimiser::step`].
pub struct Optimiser {
    design: Design,
    grid: Vec<(usize, usize, f64)>,
    cores: Vec<Core>,
    materials: Vec<(Material, Prepared)>,
    next: usize,
    passed: Vec<Ranked>,
    failures: Vec<FailureCount>,
}

impl Optimiser {
    /// Candidates: `cores` × `materials` × `frequencies` (the design's own
    /// frequency when empty).
    pub fn new(design: &Design, cores: Vec<Core>, materials: Vec<Material>, frequencies: &[f64]) -> Result<Optimiser> {
        design.spec.validate()?;
        let fs: Vec<f64> = if frequencies.is_empty() { vec![design.spec.frequency] } else { frequencies.to_vec() };
        for &f in &fs {
            crate::error::in_range("frequencies", f, 1e3, 20e6, "Hz")?;
        }
        let mut mats = Vec::with_capacity(materials.len());
        for m in materials {
            let p = Prepared::new(&m)?;
            mats.push((m, p));
        }
        let mut grid = Vec::with_capacity(cores.len() * mats.len() * fs.len());
        for c in 0..cores.len() {
            for m in 0..mats.len() {
                for &f in &fs {
                    grid.push((c, m, f));
                }
            }
        }
        Ok(Optimiser { design: design.clone(), grid, cores, materials: mats, next: 0, passed: Vec::new(), failures: Vec::new() })
    }

    /// The library's cores and materials at the design's frequency.
    pub fn over_library(design: &Design) -> Result<Optimiser> {
        Optimiser::new(design, crate::core::library::cores(), crate::material::library::materials(), &[])
    }

    pub fn total(&self) -> usize {
        self.grid.len()
    }

    pub fn done(&self) -> usize {
        self.next
    }

    /// Evaluates up to `count` more candidates; returns true when finished.
    pub fn step(&mut self, count: usize) -> bool {
        let end = (self.next + count).min(self.grid.len());
        while self.next < end {
            let (ci, mi, f) = self.grid[self.next];
            self.next += 1;
            let core = &self.cores[ci];
            let (material, prep) = &self.materials[mi];
            let mut d = self.design.clone();
            d.spec.frequency = f;
            d.core = CoreChoice::Library { designation: core.designation.clone() };
            d.material = MaterialChoice::Library { name: material.name.clone() };
            match evaluate_with(&d, core, material, prep) {
                Ok(r) if r.pass => self.passed.push(Ranked {
                    core: core.designation.clone(),
                    family: core.family.clone(),
                    material: material.name.clone(),
                    frequency: f,
                    volume: core.volume,
                    total_loss: r.losses.total,
                    temperature: r.thermal.temperature,
                    primary_turns: r.turns.primary,
                    pareto: false,
                }),
                Ok(r) => {
                    let reasons: Vec<&str> = r.checks.iter().filter(|c| !c.pass).map(|c| c.label.as_str()).collect();
                    self.fail(reasons.join(" and "));
                }
                Err(e) => self.fail(classify(e.message())),
            }
        }
        self.next >= self.grid.len()
    }

    fn fail(&mut self, reason: String) {
        match self.failures.iter_mut().find(|f| f.reason == reason) {
            Some(f) => f.count += 1,
            None => self.failures.push(FailureCount { reason, count: 1 }),
        }
    }

    /// The ranking over the candidates evaluated so far.
    pub fn ranking(&self) -> Ranking {
        let mut by_volume = self.passed.clone();
        by_volume.sort_by(|a, b| a.volume.total_cmp(&b.volume).then(a.total_loss.total_cmp(&b.total_loss)));
        // Pareto: walking up in volume, keep each that lowers the best loss so far.
        let mut best = f64::INFINITY;
        for r in &mut by_volume {
            if r.total_loss < best {
                r.pareto = true;
                best = r.total_loss;
            }
        }
        let pareto: Vec<Ranked> = by_volume.iter().filter(|r| r.pareto).cloned().collect();
        let mut by_loss = by_volume.clone();
        by_loss.sort_by(|a, b| a.total_loss.total_cmp(&b.total_loss));
        let mut failures = self.failures.clone();
        failures.sort_by_key(|f| std::cmp::Reverse(f.count));
        Ranking { evaluated: self.next, passed: self.passed.len(), failures, by_volume, by_loss, pareto }
    }
}

/// Groups error messages into a few reasons a user recognises.
fn classify(msg: &str) -> String {
    let m = msg.to_lowercase();
    if m.contains("do not fit") || m.contains("window") || m.contains("build") {
        "windings do not fit the window".into()
    } else if m.contains("gap") || m.contains(" al") {
        "no gap gives the inductance".into()
    } else if m.contains("curie") {
        "the ferrite reaches its Curie temperature".into()
    } else if m.contains("turns") {
        "turn count out of range".into()
    } else {
        msg.to_string()
    }
}

/// Runs the whole search at once.
pub fn optimise(design: &Design, cores: Vec<Core>, materials: Vec<Material>, frequencies: &[f64]) -> Result<Ranking> {
    let mut o = Optimiser::new(design, cores, materials, frequencies)?;
    o.step(usize::MAX);
    Ok(o.ranking())
}
