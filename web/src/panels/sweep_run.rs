//! The page's frequency sweep, run in slices (see [`super::pictures`],
//! picture 4).
//!
//! Every edit that changes the design starts a new run at once: both
//! curves of the design (redesigned at each frequency, and as wound) as
//! engine [`FrequencySweep`]s. Its first slice waits for the keystroke's
//! own frame to be painted; from then on a run computes points one at a
//! time until a slice's share of time ([`BUDGET_MS`]) is used up, then
//! hands the thread back to the browser (input, painting) and queues the
//! next slice as a new task ([`crate::tasks::next_task`]), so it also uses
//! the time between frames. When every point is computed the run's sweeps
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
//! The best-material envelope, when asked for, is a run of the same kind
//! (an engine [`EnvelopeSweep`], one sweep per library material) for the
//! design of the last finished sweep.
//!
//! Nothing here computes a loss: the run only schedules the engine's
//! sweep and keeps its result.

use super::pictures::{sweep_range, ENVELOPE_POINTS, SWEEP_POINTS};
use leptos::prelude::*;
use magwright_engine::design::sweep::{Curve, Envelope, EnvelopeSweep, FrequencySweep, Sweep};
use magwright_engine::design::Design;

/// Time a slice may spend on the sweep before yielding, ms: well inside a
/// 16 ms frame, so a keystroke waits at most this long and drawing stays
/// smooth.
pub const BUDGET_MS: f64 = 6.0;

/// Work that can be done a point at a time: a run's job.
pub trait Sliced: 'static {
    type Out: Clone + PartialEq + 'static;
    /// The job for `design` (`None`: nothing to compute, [`Sliced::empty`] shown).
    fn start(design: &Design) -> Option<Self>
    where
        Self: Sized;
    /// Computes one more point; whether everything is computed.
    fn step(&mut self) -> bool;
    fn finish(self) -> Self::Out;
    /// What is shown for a design that cannot be computed at all.
    fn empty() -> Self::Out;
}

/// Both curves of the page's sweep: the redesigned one first.
pub struct Curves {
    redesigned: Option<FrequencySweep>,
    wound: Option<FrequencySweep>,
}

impl Sliced for Curves {
    /// The redesigned curve and the as-wound one (`None` where the design
    /// cannot be swept; without the redesigned curve, neither is shown).
    type Out = (Option<Sweep>, Option<Sweep>);

    fn start(design: &Design) -> Option<Curves> {
        let (lo, hi) = sweep_range(design.spec.frequency);
        Some(Curves {
            redesigned: FrequencySweep::new(design, lo, hi, SWEEP_POINTS, Curve::Redesigned).ok(),
            wound: FrequencySweep::new(design, lo, hi, SWEEP_POINTS, Curve::AsWound).ok(),
        })
    }

    fn step(&mut self) -> bool {
        let next = [self.redesigned.as_mut(), self.wound.as_mut()].into_iter().flatten().find(|s| !s.is_finished());
        match next {
            Some(s) => {
                s.step(1);
                [&self.redesigned, &self.wound].into_iter().flatten().all(FrequencySweep::is_finished)
            }
            None => true,
        }
    }

    fn finish(self) -> Self::Out {
        let sweep = self.redesigned.map(FrequencySweep::finish);
        let wound = sweep.as_ref().and(self.wound).map(FrequencySweep::finish);
        (sweep, wound)
    }

    fn empty() -> Self::Out {
        (None, None)
    }
}

/// The best library material at each frequency, over the sweep's range.
pub struct Best(EnvelopeSweep);

impl Sliced for Best {
    type Out = Option<Envelope>;

    fn start(design: &Design) -> Option<Best> {
        let (lo, hi) = sweep_range(design.spec.frequency);
        EnvelopeSweep::new(design, lo, hi, ENVELOPE_POINTS, false).ok().map(Best)
    }

    fn step(&mut self) -> bool {
        self.0.step(1)
    }

    fn finish(self) -> Self::Out {
        Some(self.0.finish())
    }

    fn empty() -> Self::Out {
        None
    }
}

/// A finished run: the design it is for, what was computed, and the engine
/// time the run took (its slices added up, not the frames between them), ms.
#[derive(Debug, Clone, PartialEq)]
pub struct Done<T> {
    pub design: Design,
    pub out: T,
    pub ms: f64,
}

/// A run in progress.
struct Job<J> {
    design: Design,
    work: Work<J>,
    ms: f64,
}

/// A run's work: made in its first slice (not on the keystroke, whose
/// frame is the design's own).
enum Work<J> {
    NotStarted,
    Running(J),
    /// Nothing to compute ([`Sliced::empty`] is shown).
    Nothing,
}

/// A run's state: `Copy` handles, so frame callbacks can carry it.
pub struct SweepRun<J: Sliced> {
    job: StoredValue<Option<Job<J>>, LocalStorage>,
    generation: StoredValue<u64>,
    /// The last finished run (what the figure shows).
    pub shown: RwSignal<Option<Done<J::Out>>, LocalStorage>,
    /// Runs dropped unfinished because the design changed (a count, shown
    /// as `data-sweep-dropped` for the tests).
    pub dropped: RwSignal<u64>,
}

impl<J: Sliced> Clone for SweepRun<J> {
    fn clone(&self) -> Self {
        *self
    }
}
impl<J: Sliced> Copy for SweepRun<J> {}

impl<J: Sliced> SweepRun<J> {
    pub fn new() -> Self {
        SweepRun {
            job: StoredValue::new_local(None),
            generation: StoredValue::new(0),
            shown: RwSignal::new_local(None),
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
        self.job.set_value(Some(Job { design, work: Work::NotStarted, ms: 0.0 }));
        // The first slice waits for the frame after the keystroke's own (two
        // animation-frame callbacks): its results and pictures are painted
        // first, undelayed by the sweep's budget.
        request_animation_frame(move || request_animation_frame(move || self.slice(generation)));
    }

    /// One slice of the run, then the next one queued (unless finished or
    /// superseded); when finished, the run is shown.
    fn slice(self, generation: u64) {
        if self.generation.get_value() != generation {
            return;
        }
        let t0 = js_sys::Date::now();
        let mut finished = true;
        self.job.update_value(|j| {
            let Some(j) = j else { return };
            if let Work::NotStarted = j.work {
                j.work = J::start(&j.design).map_or(Work::Nothing, Work::Running);
            }
            if let Work::Running(w) = &mut j.work {
                finished = false;
                while !finished && js_sys::Date::now() - t0 <= BUDGET_MS {
                    finished = w.step();
                }
            }
            j.ms += js_sys::Date::now() - t0;
        });
        if !finished {
            crate::tasks::next_task(move || self.slice(generation));
            return;
        }
        let mut job = None;
        self.job.update_value(|j| job = j.take());
        if let Some(j) = job {
            let out = match j.work {
                Work::Running(w) => J::finish(w),
                Work::NotStarted | Work::Nothing => J::empty(),
            };
            self.shown.set(Some(Done { design: j.design, out, ms: j.ms }));
        }
    }
}
