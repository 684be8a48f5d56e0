//! Step 4 of the conductor search ([`super::search`]): where a winding's
//! least-loss conductor saves next to nothing, the simplest one is wound.
//! A forward's reset winding outside the load current's field, for one,
//! would otherwise get the thinnest foil that saves a few milliwatts.

use super::search::{evaluate_set, group_loss, Kind, Need, Option1, Setting};
use crate::winding::conductor::Conductor;
use crate::winding::fit::FitReport;
use crate::winding::loss::LossReport;
use crate::winding::stackup::{Pattern, StackUp};
use std::cmp::Ordering;

/// A simpler conductor (round before foil before litz, fewer in hand) is
/// wound where it adds at most this share to the set's copper loss, or
/// [`SIMPLER_TOTAL_SHARE`] of the design's whole loss where that is more:
/// a winding whose least-loss conductor buys a negligible saving (a
/// forward's reset winding, say) gets plain round wire (our choice).
pub const SIMPLER_SHARE: f64 = 0.02;
/// The simplicity allowance as a share of the design's whole loss (copper
/// and core at the selection corner and temperature): a saving of under
/// half a per cent of what the magnetic loses is far inside what the loss
/// models can tell apart (core-loss data and the one-dimensional copper
/// model are good to several per cent), not worth a harder build (our
/// choice). Where the core loss dominates, a few milliwatts of copper are
/// not bought with a foil winding.
pub const SIMPLER_TOTAL_SHARE: f64 = 0.005;
/// Simpler candidates of one winding the harmonic model weighs at most.
pub const SIMPLER_TRIES: usize = 1;

/// A set decided on: its conductors, stack-up, fit and copper loss.
pub(super) type Decided = (Vec<(Conductor, u32)>, StackUp, FitReport, LossReport);

/// How simple a conductor is to wind and to buy, least first (common
/// practice, no source): round wire (enamelled or triple-insulated) before
/// foil before litz, fewer in hand before more. Conductors of one kind and
/// count in hand are equally simple to wind (a thinner foil is not a
/// simplification of a thicker one: the least-loss search already chose
/// among them); of those, the one with less copper is preferred (cheaper,
/// a smaller build: [`simplify`]'s order).
fn simplicity(a: &Option1, b: &Option1) -> Ordering {
    let rank = |o: &Option1| match Kind::of(&o.conductor) {
        Kind::Round | Kind::TripleInsulated => 0,
        Kind::Foil => 1,
        Kind::Litz => 2,
    };
    (rank(a), a.parallel).cmp(&(rank(b), b.parallel))
}

/// Step 4 (module docs): per winding group, the simplest conductor (by
/// [`simplicity`]) whose set loses at most the allowance ([`SIMPLER_SHARE`]
/// of the copper loss of the least-loss set `decided` holds, or
/// [`SIMPLER_TOTAL_SHARE`] of the whole loss) more, in the budget left by the
/// groups before it. A candidate goes to the harmonic model only if its
/// estimate is within the budget of the chosen one's, simplest first, at
/// most [`SIMPLER_TRIES`] per group: of the simplest kind and count in hand
/// admitted, the one with the least copper. Updates `chosen`, `evaluated` and
/// `decided`; returns per group whether a simpler conductor was taken at
/// the cost of some loss, and the allowance, W.
#[allow(clippy::too_many_arguments)]
pub(super) fn simplify(
    s: &Setting,
    needs: &[Need],
    gr: &[Vec<usize>],
    lists: &[Vec<Option1>],
    pattern: &Pattern,
    limit: f64,
    chosen: &mut [usize],
    evaluated: &mut [Vec<(usize, f64)>],
    decided: &mut Decided,
) -> (Vec<bool>, f64) {
    let least = decided.3.total;
    let ceiling = least + (SIMPLER_SHARE * least).max(SIMPLER_TOTAL_SHARE * (least + s.other_loss));
    let mut taken = vec![false; gr.len()];
    // The windings that lose least first: their simplification costs least
    // and a forward's reset winding is not left without budget by the
    // main windings before it.
    let mut order: Vec<usize> = (0..gr.len()).collect();
    order.sort_by(|&a, &b| lists[a][chosen[a]].loss.total_cmp(&lists[b][chosen[b]].loss));
    for g in order {
        if needs[gr[g][0]].fixed.is_some() {
            continue;
        }
        let cur = &lists[g][chosen[g]];
        let others: f64 = (0..gr.len()).filter(|&x| x != g).map(|x| lists[x][chosen[x]].build).sum();
        let room = ceiling - decided.3.total;
        let mut js: Vec<usize> = (0..lists[g].len())
            .filter(|&j| {
                let o = &lists[g][j];
                simplicity(o, cur).is_lt() && others + o.build <= limit && o.loss <= cur.loss + room
            })
            .collect();
        let copper = |o: &Option1| o.conductor.copper_area() * o.parallel as f64;
        js.sort_by(|&a, &b| {
            let (x, y) = (&lists[g][a], &lists[g][b]);
            simplicity(x, y).then(copper(x).total_cmp(&copper(y)))
        });
        for j in js.into_iter().take(SIMPLER_TRIES) {
            let mut set = decided.0.clone();
            for &m in &gr[g] {
                set[m] = (lists[g][j].conductor.clone(), lists[g][j].parallel);
            }
            let Ok((st, f, r)) = evaluate_set(s, needs, &set, pattern) else { continue };
            if !evaluated[g].iter().any(|e| e.0 == j) {
                evaluated[g].push((j, group_loss(&r, gr, needs, g)));
            }
            if r.total <= ceiling {
                // Simpler and no worse by the harmonic model (the estimate
                // ranked it below) is simply the least loss.
                taken[g] = r.total > decided.3.total;
                chosen[g] = j;
                *decided = (set, st, f, r);
                break;
            }
        }
    }
    (taken, ceiling - least)
}

/// The rule on whole designs: which conductor the solver winds where the
/// least-loss one buys little.
#[cfg(test)]
mod tests {
    use crate::design::file::{CoreChoice, Design, TurnsRule};
    use crate::design::solve::{evaluate, ConductorKind, Report};

    /// The reset winding of `r` is one round wire, wound by the simplicity
    /// rule: a lower-loss conductor was weighed, and the round wire costs at
    /// most the allowance more (SIMPLER_SHARE of the copper loss or
    /// SIMPLER_TOTAL_SHARE of the whole, the larger).
    fn reset_simplified_to_one_round_wire(r: &Report) {
        use super::{SIMPLER_SHARE, SIMPLER_TOTAL_SHARE};
        let reset = r.wires.iter().find(|w| w.winding == "reset").unwrap();
        let chosen = reset.trials.iter().find(|t| t.chosen).unwrap();
        assert_eq!((chosen.kind, chosen.parallel), (ConductorKind::Round, 1), "{}", reset.reason);
        let least = reset.trials.iter().filter(|t| t.evaluated).map(|t| t.loss).fold(f64::INFINITY, f64::min);
        assert!(least < chosen.loss, "a lower-loss conductor was weighed: {}", reset.reason);
        let copper: f64 = r.corners.iter().map(|c| c.copper.total).fold(0.0, f64::max);
        let whole: f64 = r.corners.iter().map(|c| c.copper.total + c.core.watts).fold(0.0, f64::max);
        let allowance = (SIMPLER_SHARE * copper).max(SIMPLER_TOTAL_SHARE * whole);
        assert!(chosen.loss - least <= allowance, "{} {least} {allowance}", chosen.loss);
        assert!(reset.reason.starts_with("the simplest of"), "{}", reset.reason);
    }

    #[test]
    fn a_winding_that_saves_next_to_nothing_gets_plain_round_wire() {
        // The forward demo's reset winding carries only the magnetising
        // current, outside the load current's field: its least-loss
        // conductor (a thin foil) saves a few mW over one round wire, far
        // below SIMPLER_SHARE of the copper loss, so one round wire is wound.
        let r = evaluate(&Design::demo_forward()).unwrap();
        reset_simplified_to_one_round_wire(&r);
        // The main windings keep their least-loss conductors.
        for w in r.wires.iter().filter(|w| w.winding != "reset") {
            assert!(w.reason.starts_with("least copper loss"), "{}: {}", w.winding, w.reason);
        }
    }

    #[test]
    fn a_thinner_foil_is_not_a_simplification() {
        // The forward demo at half load: the reset winding's least-loss
        // conductor is a 35 µm foil; one round wire costs under
        // SIMPLER_SHARE of the copper more. The rule used to count a thinner
        // foil (less copper) as simpler, spent its one try on 20 µm foil and
        // wound that; a simplification is now a simpler kind or fewer in
        // hand, and the round wire is wound.
        let mut d = Design::demo_forward();
        for o in &mut d.spec.outputs {
            o.current *= 0.5;
        }
        let r = evaluate(&d).unwrap();
        reset_simplified_to_one_round_wire(&r);
        // Its foils are its least-loss conductors: none is there by the
        // simplicity rule (which took a thinner foil for a simpler one).
        for w in r.wires.iter().filter(|w| w.automatic) {
            let chosen = w.trials.iter().find(|t| t.chosen).unwrap();
            if chosen.kind == ConductorKind::Foil {
                assert!(!w.reason.starts_with("the simplest of"), "{}: {}", w.winding, w.reason);
            }
        }
    }

    /// A single-output forward of our own on a library core and material,
    /// the fewest turns, functional isolation (the simplicity scenarios).
    /// `input` is (min, nominal, max) V, `output` (V, A, rectifier drop V),
    /// `converter` (frequency Hz, duty max, efficiency, ambient °C).
    fn forward_scenario(
        input: (f64, f64, f64),
        output: (f64, f64, f64),
        converter: (f64, f64, f64, f64),
        core: &str,
        material: &str,
    ) -> Design {
        use crate::design::file::MaterialChoice;
        use crate::topology::spec::{Input, Isolation};
        let mut d = Design::demo_forward();
        d.spec.input = Input::Dc { min: input.0, nominal: input.1, max: input.2 };
        for o in &mut d.spec.outputs {
            (o.voltage, o.current, o.rectifier_drop) = output;
        }
        (d.spec.frequency, d.spec.duty_max, d.spec.efficiency, d.spec.ambient) = converter;
        d.spec.isolation = Isolation::Functional;
        d.core = CoreChoice::Library { designation: core.into() };
        d.material = MaterialChoice::Library { name: material.into() };
        d.choices.turns = TurnsRule::FewestTurns;
        d
    }

    #[test]
    fn a_foil_that_saves_a_fraction_of_the_core_loss_is_not_wound() {
        // An offline forward (our own scenario) on ETD 39 at 94 kHz whose
        // core loses some 3 W and whose copper 0.2 W: the reset winding's
        // least-loss conductor, a 30 µm foil of 24 turns, saves about 10 mW
        // over one round wire, more than 2 % of the copper but 0.3 % of the
        // whole loss. Such a saving is inside what the loss models can tell
        // apart; one round wire is wound (the allowance is also
        // SIMPLER_TOTAL_SHARE of the whole loss). Under the copper-only
        // allowance it was the foil.
        use crate::design::file::Interleave;
        let mut d = forward_scenario((190.0, 270.0, 370.0), (39.0, 2.0, 0.7), (94e3, 0.44, 0.8, 30.0), "ETD 39", "MnZn-200k-flat");
        d.choices.interleave = Interleave::SplitPrimary;
        let r = evaluate(&d).unwrap();
        assert!(r.pass, "{:?}", r.checks.iter().filter(|c| !c.pass).collect::<Vec<_>>());
        let copper: f64 = r.corners.iter().map(|c| c.copper.total).fold(0.0, f64::max);
        let core: f64 = r.corners.iter().map(|c| c.core.watts).fold(0.0, f64::max);
        assert!(core > 10.0 * copper, "the core loss dominates: {core} W against {copper} W");
        reset_simplified_to_one_round_wire(&r);
        let reset = r.wires.iter().find(|w| w.winding == "reset").unwrap();
        let chosen = reset.trials.iter().find(|t| t.chosen).unwrap();
        let least = reset.trials.iter().filter(|t| t.evaluated).map(|t| t.loss).fold(f64::INFINITY, f64::min);
        assert!(
            chosen.loss - least > super::SIMPLER_SHARE * copper,
            "beyond the copper-only allowance: {} − {least} against {copper}",
            chosen.loss
        );
    }

    #[test]
    fn a_reset_winding_is_simplified_to_a_moderate_wire() {
        // A 58-83 V forward (our own scenario) on E 30/15/7 at 150 kHz: the
        // reset winding (10 turns, 0.27 A) saves a few mW in foil, within
        // the allowance of one round wire. Of the round wires in the
        // allowance the least copper is wound; the candidates used to be
        // Hurley's gauge (beyond the allowance) and the gauges that fill one
        // or two layers (1.45 mm here), so the reset went to 1.45 mm wire.
        // The gauge midway is a candidate too.
        let d = forward_scenario((58.0, 76.0, 83.0), (33.0, 2.0, 0.45), (150e3, 0.4, 0.9, 25.0), "E 30/15/7", "MnZn-200k-flat");
        let r = evaluate(&d).unwrap();
        assert!(r.pass, "{:?}", r.checks.iter().filter(|c| !c.pass).collect::<Vec<_>>());
        reset_simplified_to_one_round_wire(&r);
        let (_, sec) = r.stackup.sections().find(|(_, s)| s.winding == "reset").unwrap();
        let crate::winding::conductor::Conductor::Round(w) = &sec.conductor else { panic!("{:?}", sec.conductor) };
        assert!(w.bare_diameter < 1.0e-3, "reset in {:.3} mm wire", w.bare_diameter * 1e3);
    }
}
