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
