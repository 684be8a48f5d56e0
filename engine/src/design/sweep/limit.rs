//! What holds a sweep's least-loss point where it is.
//!
//! The minimum of a sweep is the least total loss among its feasible points
//! (every check passes, inside the material's data). That is a true optimum
//! only where the loss rises on both sides of it. Often it does not: on the
//! forward demo the redesigned loss still falls past the frequency where the
//! material's data end, so the point marked is the last one the data allow,
//! and a flux sweep's least loss is often the last point before saturation.
//! An engineer reads the two differently (the first says "a material
//! characterised higher may do better", the second "this check sets the
//! design"), so the sweep says which it is: for each side of the minimum
//! where a point of the infeasible run next to it has less loss (the
//! nearest such point says why it fails), or the minimum is the end of the
//! sweep, or no design can be built next to it, one [`MinimumLimit`]
//! (common practice, no source: the difference between an interior
//! optimum and one on a constraint).
//!
//! Nothing here decides anew: the points' own `feasible`, `in_data`,
//! values and reasons are read as the sweep computed them.

use super::XAxis;
use crate::notation;
use serde::Serialize;

/// Why the least-loss point cannot move further to one side.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum LimitKind {
    /// The next point has less loss, but the material's loss data do not
    /// hold there.
    Data,
    /// The next point has less loss, inside the data, but fails a check.
    Checks,
    /// No design can be built at the next point (its loss is not known).
    NoDesign,
    /// The minimum is the first or last point of the sweep: the least loss
    /// may lie beyond the range swept.
    SweepRange,
}

/// Toward which end of the x axis.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Side {
    Below,
    Above,
}

/// One side of the minimum that is held by something other than the loss
/// itself rising (module docs).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MinimumLimit {
    pub by: LimitKind,
    pub side: Side,
    /// The x of the point that decides: the nearest one beyond the minimum
    /// with less loss, the one with no design, or (an end of the sweep) the
    /// minimum's own.
    pub x: f64,
    /// One sentence for the user.
    pub note: String,
}

/// A point as the limit test reads it.
pub(super) struct Probe<'a> {
    pub x: f64,
    pub feasible: bool,
    pub in_data: bool,
    /// Total loss where a design was built.
    pub total: Option<f64>,
    pub reason: &'a str,
}

impl<'a> From<&'a super::SweepPoint> for Probe<'a> {
    fn from(p: &'a super::SweepPoint) -> Self {
        Probe { x: p.x, feasible: p.feasible, in_data: p.in_data, total: p.values.map(|v| v.total), reason: &p.reason }
    }
}

/// An envelope point has values only where something passes.
impl<'a> From<&'a super::EnvelopePoint> for Probe<'a> {
    fn from(p: &'a super::EnvelopePoint) -> Self {
        Probe { x: p.x, feasible: p.feasible, in_data: p.in_data, total: p.values.map(|v| v.total), reason: &p.reason }
    }
}

/// What the sweep's ends mean: for the point at each end (below, above), the
/// kind of limit it is and the note, `{x}` standing for the point's x.
pub(super) type Ends = [(LimitKind, &'static str); 2];

/// The ends of a frequency sweep: the range swept.
pub(super) const FREQUENCY_ENDS: Ends = [
    (
        LimitKind::SweepRange,
        "the least loss is at the sweep's lowest frequency ({x}): it may lie lower; sweep a wider range",
    ),
    (
        LimitKind::SweepRange,
        "the least loss is at the sweep's highest frequency ({x}): it may lie higher; sweep a wider range",
    ),
];

/// The limits of the minimum at index `min` of `points` (ordered by x),
/// none for an interior minimum or no minimum.
pub(super) fn minimum_limits(points: &[Probe], min: Option<usize>, axis: XAxis, ends: &Ends) -> Vec<MinimumLimit> {
    let Some(i) = min else { return Vec::new() };
    let Some(at) = points.get(i).and_then(|p| p.total.map(|t| (p.x, t))) else { return Vec::new() };
    let x = |v: f64| notation::format(v, axis.unit, 3);
    let mut out = Vec::new();
    for (side, end) in [Side::Below, Side::Above].into_iter().zip(ends) {
        // The points beyond the minimum on this side, nearest first, up to
        // the next feasible one: the infeasible run next to it.
        let beyond: Vec<&Probe> = match side {
            Side::Below => points[..i].iter().rev().collect(),
            Side::Above => points[i + 1..].iter().collect(),
        };
        let Some(adjacent) = beyond.first() else {
            out.push(MinimumLimit { by: end.0, side, x: at.0, note: end.1.replace("{x}", &x(at.0)) });
            continue;
        };
        let run = beyond.iter().take_while(|p| !p.feasible);
        // The nearest point of the run with less loss decides (the turn
        // count steps the loss, so the one next to the minimum may be
        // higher and the next lower again); else no design at the
        // adjacent point; else the loss rises on this side.
        let (by, n, note) = match run.copied().find(|p| p.total.is_some_and(|t| t < at.1)) {
            Some(n) if !n.in_data => (
                LimitKind::Data,
                n,
                format!(
                    "a lower loss is computed at {}, where the material's loss data do not hold: this least loss is \
                     where the data end, not an optimum of the design; a material characterised further may do better",
                    x(n.x)
                ),
            ),
            Some(n) => (
                LimitKind::Checks,
                n,
                format!(
                    "a lower loss is computed at {}, where the design fails ({}): this least loss is set by that \
                     check, not an optimum of the loss",
                    x(n.x),
                    n.reason
                ),
            ),
            None if !adjacent.feasible && adjacent.total.is_none() => (
                LimitKind::NoDesign,
                *adjacent,
                format!(
                    "no design can be built at {} ({}): the least loss is at the edge of where one can",
                    x(adjacent.x),
                    adjacent.reason
                ),
            ),
            None => continue,
        };
        out.push(MinimumLimit { by, side, x: n.x, note });
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::sweep::FREQUENCY_AXIS;

    fn p(x: f64, feasible: bool, in_data: bool, total: Option<f64>) -> Probe<'static> {
        Probe { x, feasible, in_data, total, reason: "saturation" }
    }

    #[test]
    fn an_interior_minimum_has_no_limit() {
        let pts = [p(1e4, true, true, Some(3.0)), p(2e4, true, true, Some(2.0)), p(4e4, true, true, Some(2.5))];
        assert!(minimum_limits(&pts, Some(1), FREQUENCY_AXIS, &FREQUENCY_ENDS).is_empty());
        // A failing neighbour with more loss does not hold the minimum either.
        let pts = [p(1e4, false, true, Some(3.0)), p(2e4, true, true, Some(2.0)), p(4e4, false, false, Some(2.5))];
        assert!(minimum_limits(&pts, Some(1), FREQUENCY_AXIS, &FREQUENCY_ENDS).is_empty());
        assert!(minimum_limits(&pts, None, FREQUENCY_AXIS, &FREQUENCY_ENDS).is_empty());
    }

    #[test]
    fn each_kind_of_limit_is_named_on_its_side() {
        // Lower loss above, outside the data; lower loss below, failing a check.
        let pts = [p(1e4, false, true, Some(1.0)), p(2e4, true, true, Some(2.0)), p(4e4, false, false, Some(1.5))];
        let l = minimum_limits(&pts, Some(1), FREQUENCY_AXIS, &FREQUENCY_ENDS);
        assert_eq!(l.len(), 2);
        assert_eq!((l[0].by, l[0].side, l[0].x), (LimitKind::Checks, Side::Below, 1e4));
        assert!(l[0].note.contains("saturation") && l[0].note.contains("10.0 kHz"), "{}", l[0].note);
        assert_eq!((l[1].by, l[1].side, l[1].x), (LimitKind::Data, Side::Above, 4e4));
        // No design beside it; the end of the sweep on the other side.
        let pts = [p(1e4, true, true, Some(2.0)), p(2e4, false, true, None)];
        let l = minimum_limits(&pts, Some(0), FREQUENCY_AXIS, &FREQUENCY_ENDS);
        assert_eq!(
            l.iter().map(|l| (l.by, l.side)).collect::<Vec<_>>(),
            [(LimitKind::SweepRange, Side::Below), (LimitKind::NoDesign, Side::Above)]
        );
        assert!(l[0].note.contains("lowest frequency (10.0 kHz)"), "{}", l[0].note);
    }

    #[test]
    fn a_step_up_next_to_the_minimum_does_not_hide_the_lower_loss_beyond() {
        // A turn count steps the loss up just past the data's end, then it
        // falls below the minimum again: still held by the data, named at
        // the lower point. A feasible point ends the run.
        let pts = [
            p(1e4, true, true, Some(3.0)),
            p(2e4, true, true, Some(2.0)),
            p(3e4, false, false, Some(2.4)),
            p(4e4, false, false, Some(1.9)),
        ];
        let l = minimum_limits(&pts, Some(1), FREQUENCY_AXIS, &FREQUENCY_ENDS);
        assert_eq!(l.iter().map(|l| (l.by, l.side, l.x)).collect::<Vec<_>>(), [(LimitKind::Data, Side::Above, 4e4)]);
        let pts = [
            p(1e4, true, true, Some(2.0)),
            p(2e4, false, true, Some(2.4)),
            p(3e4, true, true, Some(2.2)),
            p(4e4, false, false, Some(1.0)),
        ];
        let l = minimum_limits(&pts, Some(0), FREQUENCY_AXIS, &FREQUENCY_ENDS);
        assert_eq!(l.iter().map(|l| l.by).collect::<Vec<_>>(), [LimitKind::SweepRange]);
    }
}
