//! The page's frequency sweep, run in slices (see [`super::pictures`],
//! picture 4).
//!
//! Every edit that changes the design starts a new run at once: both
//! curves of the design (redesigned at each frequency, and as wound) as
//! engine [`FrequencySweep`]s. A run computes points one at a time inside
//! an animation frame until that frame's share of time ([`BUDGET_MS`]) is
//! used up, then hands the thread back to the browser (input, painting)
//! and asks for the next frame, as the optimiser does
//! ([`super::optimiser`]). When every point is computed the run's sweeps
//! are finished (the engine's landmarks) and shown, with the design they
//! are for.
//!
//! Each run carries a number (`generation`); a new edit bumps it, so a
//! frame of the old run still queued sees the change and stops, and its
//! points are dropped: a run in progress is never shown. The invariant
//! the figure keeps: the sweep drawn is the one for the design shown, or
//! it is marked as being recomputed (`ready` false: the figure dimmed and
//! `data-sweep-ready="false"`) until the run for the design shown ends.
//!
//! Nothing here computes a loss: the run only schedules the engine's
//! sweep and keeps its result.

use super::pictures::{sweep_range, SWEEP_POINTS};
use leptos::prelude::*;
use magwright_engine::design::sweep::{Curve, FrequencySweep, Sweep};
use magwright_engine::design::Design;

/// Time a frame may spend on the sweep before yielding, ms: well inside a
/// 16 ms frame, so typing and drawing stay smooth.
pub const BUDGET_MS: f64 = 6.0;

/// A finished run: the design swept, both curves, and the engine time the
/// run took (its slices added up, not the frames between them), ms.
#[derive(Debug, Clone, PartialEq)]
pub struct Swept {
    pub design: Design,
    /// `None` where the design cannot be swept.
    pub sweep: Option<Sweep>,
    pub wound: Option<Sweep>,
    pub ms: f64,
}

/// A run in progress.
struct Job {
    design: Design,
    redesigned: Option<FrequencySweep>,
    wound: Option<FrequencySweep>,
    ms: f64,
}

impl Job {
    /// The sweep with points left to compute, redesigned first.
    fn next(&mut self) -> Option<&mut FrequencySweep> {
        [self.redesigned.as_mut(), self.wound.as_mut()].into_iter().flatten().find(|s| !s.is_finished())
    }

    fn finish(self) -> Swept {
        let sweep = self.redesigned.map(FrequencySweep::finish);
        // Without the redesigned curve the figure shows nothing.
        let wound = sweep.as_ref().and(self.wound).map(FrequencySweep::finish);
        Swept { design: self.design, sweep, wound, ms: self.ms }
    }
}

/// The sweep's state: `Copy` handles, so frame callbacks can carry it.
#[derive(Clone, Copy)]
pub struct SweepRun {
    job: StoredValue<Option<Job>, LocalStorage>,
    generation: StoredValue<u64>,
    /// The last finished run (what the figure shows).
    pub shown: RwSignal<Option<Swept>>,
    /// Runs dropped unfinished because the design changed (a count, shown
    /// as `data-sweep-dropped` for the tests).
    pub dropped: RwSignal<u64>,
}

impl SweepRun {
    pub fn new() -> Self {
        SweepRun {
            job: StoredValue::new_local(None),
            generation: StoredValue::new(0),
            shown: RwSignal::new(None),
            dropped: RwSignal::new(0),
        }
    }

    /// Starts the run for `design` (dropping any run in progress); with no
    /// design, nothing is shown.
    pub fn start(self, design: Option<Design>) {
        let generation = self.generation.get_value() + 1;
        self.generation.set_value(generation);
        if self.job.with_value(|j| j.is_some()) {
            self.dropped.update(|n| *n += 1);
        }
        self.job.set_value(None);
        let Some(design) = design else {
            self.shown.set(None);
            return;
        };
        if self.shown.with_untracked(|s| s.as_ref().is_some_and(|s| s.design == design)) {
            return;
        }
        let t0 = js_sys::Date::now();
        let (lo, hi) = sweep_range(design.spec.frequency);
        let redesigned = FrequencySweep::new(&design, lo, hi, SWEEP_POINTS, Curve::Redesigned).ok();
        let wound = FrequencySweep::new(&design, lo, hi, SWEEP_POINTS, Curve::AsWound).ok();
        let ms = js_sys::Date::now() - t0;
        self.job.set_value(Some(Job { design, redesigned, wound, ms }));
        request_animation_frame(move || self.frame(generation));
    }

    /// One slice of the run, then the next frame (unless finished or
    /// superseded); when finished, the run is shown.
    fn frame(self, generation: u64) {
        if self.generation.get_value() != generation {
            return;
        }
        let t0 = js_sys::Date::now();
        let mut finished = false;
        self.job.update_value(|j| {
            let Some(j) = j else {
                finished = true;
                return;
            };
            while let Some(s) = j.next() {
                s.step(1);
                if js_sys::Date::now() - t0 > BUDGET_MS {
                    break;
                }
            }
            finished = j.next().is_none();
            j.ms += js_sys::Date::now() - t0;
        });
        if !finished {
            request_animation_frame(move || self.frame(generation));
            return;
        }
        let mut job = None;
        self.job.update_value(|j| job = j.take());
        if let Some(job) = job {
            self.shown.set(Some(job.finish()));
        }
    }
}
