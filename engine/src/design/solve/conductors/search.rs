//! The conductor search: for each winding the buildable conductor with the
//! least loss, subject to the window; the interleaving too when automatic.
//!
//! 1. **Candidates** per winding, from the published optima
//!    ([`super::optima`]): foil at Hurley's optimum thickness and four
//!    neighbours (×0.5 … ×2); round wire (triple-insulated where the
//!    isolation asks for it) with 1 to `max_parallel` in hand, each at the
//!    gauge of Hurley's optimum diameter for its layer count and at the
//!    thickest gauges that wind the largest section in one and in two
//!    layers (one in hand: and the gauge midway between Hurley's and the
//!    finer of those two where they are more than four gauges apart), none coarser
//!    than AWG 14 (AWG 18 triple-insulated; [`ROUND_COARSEST_AWG`],
//!    [`TIW_COARSEST_AWG`]); litz of the table's two coarsest strand gauges not above δ,
//!    each at the count where the low-frequency loss is least (Sullivan's
//!    trade) and its two neighbours in the table. Buildable only: no foil
//!    on ring cores or in triple-insulated windings, foil for at most
//!    [`FOIL_MAX_TURNS`] turns and as wide as the breadth between the
//!    margins, at most `max_parallel` round wires in hand.
//! 2. **Ranking** by the quick estimate ([`super::screen`]); the least-loss
//!    set that leaves the stack-up within [`BUILD_SHARE`] of the bobbin
//!    height is found by giving up loss where it buys the most build
//!    (least added loss per metre saved).
//! 3. **Decision** by the harmonic model (`winding::loss`) on the real
//!    stack-up at the selection temperature: each interleaving the user
//!    left open whose estimate is within [`SCREEN_BAND`] of the least is
//!    evaluated with its ranked set, the least-loss one kept; then each
//!    winding's best candidate of every other kind (within [`KIND_BAND`]) is
//!    tried in its place and kept where the total copper loss falls.
//! 4. **Simplicity.** Per winding, those that lose least first, the
//!    simplest candidate (round before foil before litz, fewer in hand;
//!    common practice, no source) whose set loses at most the allowance
//!    more copper than the least-loss set (`SIMPLER_SHARE` of its copper
//!    loss, or `SIMPLER_TOTAL_SHARE` of the design's whole loss where that
//!    is more) is wound instead: where the least-loss conductor saves next
//!    to nothing (a reset winding outside the load current's field), plain
//!    round wire.

use super::optima::{litz_low_frequency_loss, optimum_delta, waveform_factor};
use super::screen::{estimate, phasors, portions, DowellMemo, Window};
use super::simplify::{simplify, SIMPLER_SHARE, SIMPLER_TOTAL_SHARE};
use super::{awg_not_above, FOIL_FILM, ROUND_COARSEST_AWG, TIW_COARSEST_AWG};
use crate::core::Core;
use crate::error::Result;
use crate::waveform::Pwl;
use crate::winding::conductor::{table_litz, Conductor, Grade, LITZ_STRAND_AWG, LITZ_STRAND_COUNTS};
use crate::winding::fit::{fit, free_layout, FitReport};
use crate::winding::loss::{LossModel, LossOptions, LossReport, WindingCurrent};
use crate::winding::stackup::{
    default_stackup, DefaultOptions, Item, Pattern, StackUp, Tape, WindingSpec,
};
use crate::winding::wire::awg_diameter;
use serde::Serialize;

/// Most turns the search winds in foil (common practice, no source).
pub const FOIL_MAX_TURNS: u32 = 30;
/// Share of the bobbin height the automatic stack-up may fill, leaving room
/// for winding tolerance (common practice, no source).
pub const BUILD_SHARE: f64 = 0.9;

/// Interleavings whose estimate is within this factor of the least go on to
/// the harmonic model (our choice).
pub const SCREEN_BAND: f64 = 1.05;
/// A winding's best candidate of another kind goes on to the harmonic model
/// when its estimate is within this factor of the chosen one's: the
/// estimate leaves out how a conductor's build moves the other windings
/// (our choice).
pub const KIND_BAND: f64 = 1.15;

/// Kind of conductor.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Kind {
    Round,
    TripleInsulated,
    Foil,
    Litz,
}

impl Kind {
    pub fn of(c: &Conductor) -> Kind {
        match c {
            Conductor::Round(_) => Kind::Round,
            Conductor::TripleInsulated(_) => Kind::TripleInsulated,
            Conductor::Foil(_) => Kind::Foil,
            Conductor::Litz(_) => Kind::Litz,
        }
    }
    pub fn name(self) -> &'static str {
        match self {
            Kind::Round => "round",
            Kind::TripleInsulated => "triple-insulated",
            Kind::Foil => "foil",
            Kind::Litz => "litz",
        }
    }
}

/// One conductor the search weighed for a winding.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ConductorTrial {
    pub kind: Kind,
    /// As in the stack-up, e.g. "foil 0.150 × 20.00 mm".
    pub conductor: String,
    pub parallel: u32,
    /// The winding's copper loss with it, W, at the selection temperature
    /// and line corner: the harmonic model's where `evaluated`, else the
    /// quick estimate.
    pub loss: f64,
    /// Radial build of the winding's sections, m.
    pub build: f64,
    pub evaluated: bool,
    /// The stack-up with it fits within the build share of the bobbin.
    pub fits: bool,
    pub chosen: bool,
}

/// A winding as the search sees it.
pub struct Need<'a> {
    pub name: &'a str,
    pub turns: u32,
    /// Its current in the loss model's dot convention.
    pub current: &'a Pwl,
    pub tiw: bool,
    /// Fixed by the user.
    pub fixed: Option<(Conductor, u32)>,
}

/// The search's fixed inputs.
pub struct Setting<'a> {
    pub core: &'a Core,
    pub opts: &'a DefaultOptions,
    pub breadth: f64,
    pub delta1: f64,
    pub rho: f64,
    pub temperature: f64,
    pub edge_time: f64,
    pub ring: bool,
    pub max_parallel: u32,
    pub currents: &'a [WindingCurrent],
    /// The design's loss the conductors do not change (its core loss at the
    /// selection corner and temperature), W.
    pub other_loss: f64,
}

/// What the search found.
pub struct Found {
    pub pattern: Pattern,
    pub stackup: StackUp,
    pub fit: FitReport,
    pub conductors: Vec<(Conductor, u32)>,
    /// Per winding, the trials (the chosen one marked) and why it won.
    pub trials: Vec<Vec<ConductorTrial>>,
    pub reasons: Vec<String>,
    /// Each pattern tried and its copper loss, W.
    pub patterns: Vec<(Pattern, f64)>,
    /// The chosen set's copper loss at the selection corner, W.
    pub copper: f64,
}

/// One candidate conductor of a winding group, with its estimate.
#[derive(Debug, Clone)]
pub(super) struct Option1 {
    pub(super) conductor: Conductor,
    pub(super) parallel: u32,
    /// Estimated loss, W, and radial build, m.
    pub(super) loss: f64,
    pub(super) build: f64,
}

/// The section order `(winding, turns)` bobbin outward under `pattern`,
/// as `default_stackup` builds it, without its empty sections.
fn order_of(pattern: &Pattern, names: &[&str], turns: &[u32]) -> Vec<(usize, u32)> {
    let named: Vec<(&str, u32)> = names.iter().copied().zip(turns.iter().copied()).collect();
    pattern.order(&named).into_iter().filter(|s| s.1 > 0).collect()
}

/// Each winding's sections (turns, layer factor) for the starting points:
/// the factor is ½ for a winding wound whole between two sections of
/// another (its MMF falls back towards zero inside it; common practice,
/// no source), else 1.
fn sections_of(order: &[(usize, u32)], n: usize) -> Vec<Vec<(u32, f64)>> {
    (0..n)
        .map(|w| {
            let pos: Vec<usize> = (0..order.len()).filter(|&k| order[k].0 == w).collect();
            let between = pos.len() == 1
                && (0..n).any(|o| {
                    o != w
                        && order[..pos[0]].iter().any(|s| s.0 == o)
                        && order[pos[0] + 1..].iter().any(|s| s.0 == o)
                });
            let f = if between { 0.5 } else { 1.0 };
            pos.iter().map(|&k| (order[k].1, f)).collect()
        })
        .collect()
}

/// The candidates of one winding (module docs, step 1), unranked.
fn candidates(need: &Need, secs: &[(u32, f64)], s: &Setting) -> Vec<(Conductor, u32)> {
    if let Some(f) = &need.fixed {
        return vec![f.clone()];
    }
    let k = waveform_factor(need.current, s.edge_time);
    let (big, factor) = secs.iter().copied().fold((0, 1.0), |a, b| if b.0 > a.0 { b } else { a });
    let big = big.max(1);
    let mut out: Vec<(Conductor, u32)> = Vec::with_capacity(24);
    let sqrt_pi_2 = 0.5 * std::f64::consts::PI.sqrt();
    // Foil: Hurley's Δopt for a portion of `big·factor` layers.
    if !s.ring && !need.tiw && need.turns <= FOIL_MAX_TURNS {
        let t0 = optimum_delta(big as f64 * factor, k) * s.delta1;
        let mut last = 0.0;
        for m in [0.5, 0.7, 1.0, 1.4, 2.0] {
            let t = ((t0 * m).clamp(0.02e-3, 1.0e-3) * 2e5).round() / 2e5;
            if t != last {
                if let Ok(c) = Conductor::foil(t, s.breadth) {
                    out.push((c, 1));
                }
                last = t;
            }
        }
    }
    // Round or triple-insulated: Hurley's optimum diameter for the layers
    // the wire itself makes, found by three fixed-point steps.
    let round_of = |g: i32| -> Option<Conductor> {
        if need.tiw {
            // No coarser than the stock range: several in hand instead.
            super::automatic_tiw(g).ok()
        } else {
            Conductor::awg(g, Grade::G2).ok()
        }
    };
    let coarsest = if need.tiw { TIW_COARSEST_AWG } else { ROUND_COARSEST_AWG };
    let (d_min, d_max) = (awg_diameter(46).unwrap_or(0.04e-3), awg_diameter(coarsest).unwrap_or(1.628e-3));
    for par in 1..=s.max_parallel.max(1) {
        let mut d = (2.0 * s.delta1).clamp(d_min, d_max);
        for _ in 0..3 {
            let Some(c) = round_of(awg_not_above(d)) else { break };
            let Some((tpl, nl)) = free_layout(&c, big, par, s.breadth) else {
                d *= 0.7;
                continue;
            };
            let eta = (tpl as f64 * par as f64 * sqrt_pi_2 * d / s.breadth).clamp(0.05, 1.0);
            let dopt = optimum_delta(nl as f64 * factor, k) * s.delta1 / (sqrt_pi_2 * eta.sqrt());
            d = dopt.clamp(d_min, d_max);
        }
        let g = awg_not_above(d);
        // And the thickest wire that winds the largest section in one or
        // two full layers (least proximity effect for its copper).
        let mut gauges = vec![g];
        for layers in [1, 2] {
            let tpl = big.div_ceil(layers).max(1) * par;
            let room = s.breadth / tpl as f64;
            // From the gauge whose bare diameter fits, thinner until the
            // insulated wire does (one or two steps).
            let mut gg = awg_not_above(room).max(coarsest);
            while gg < 46 && !round_of(gg).is_some_and(|c| c.outer_width() <= room) {
                gg += 1;
            }
            if round_of(gg).is_some_and(|c| c.outer_width() <= room) {
                gauges.push(gg);
            }
        }
        // One in hand: also the gauge midway (in AWG, the geometric mean
        // of the diameters) between Hurley's and the finer of the one- and
        // two-layer gauges where they are more than four gauges apart, so
        // that a winding whose loss barely depends on its wire (a reset
        // winding) can be simplified to a wire of moderate size, not only to
        // one that fills a layer (our choice).
        if let Some(&thick) = gauges[1..].iter().max() {
            if par == 1 && g - thick > 4 {
                gauges.push((g + thick) / 2);
            }
        }
        for gg in gauges {
            if let Some(c) = round_of(gg.clamp(coarsest, 46)) {
                if !out.iter().any(|(x, p)| *p == par && x == &c) {
                    out.push((c, par));
                }
            }
        }
    }
    // Litz: the two coarsest table gauges not above δ, each at the count of
    // least low-frequency loss and its neighbours.
    if !need.tiw {
        let mut gauges: Vec<i32> = LITZ_STRAND_AWG
            .iter()
            .copied()
            .filter(|&g| awg_diameter(g).is_ok_and(|d| d <= s.delta1))
            .take(2)
            .collect();
        if gauges.is_empty() {
            gauges.push(LITZ_STRAND_AWG[LITZ_STRAND_AWG.len() - 1]);
        }
        for g in gauges {
            let Ok(ds) = awg_diameter(g) else { continue };
            let mut best: Option<(usize, f64)> = None;
            for (j, &n) in LITZ_STRAND_COUNTS.iter().enumerate() {
                let Ok(c) = table_litz(n, g) else { continue };
                let Some((tpl, nl)) = free_layout(&c, big, 1, s.breadth) else { break };
                let sk = (n as f64).sqrt();
                let eta = (tpl as f64 * sk * sqrt_pi_2 * ds / s.breadth).min(1.0);
                let delta_s = sqrt_pi_2 * ds / s.delta1 * eta.sqrt();
                let l = litz_low_frequency_loss(n, ds, nl as f64 * sk * factor, delta_s, k);
                match best {
                    Some(b) if l >= b.1 => {
                        // Past the least (the loss has one minimum in n,
                        // Sullivan 1999): the larger counts lose more.
                        if l > 1.5 * b.1 {
                            break;
                        }
                    }
                    _ => best = Some((j, l)),
                }
            }
            if let Some((j, _)) = best {
                for jj in j.saturating_sub(1)..=(j + 1).min(LITZ_STRAND_COUNTS.len() - 1) {
                    if let Ok(c) = table_litz(LITZ_STRAND_COUNTS[jj], g) {
                        out.push((c, 1));
                    }
                }
            }
        }
    }
    out
}

fn tape_build(opts: &DefaultOptions, sections: usize) -> f64 {
    let t = |x: &Tape| x.build();
    sections.saturating_sub(1) as f64 * t(&opts.section_tape) + t(&opts.outer_tape)
}

/// Step 2: per winding the ranked options and the chosen index, or `None`
/// when no set fits.
fn rank(lists: &[Vec<Option1>], limit: f64) -> Option<Vec<usize>> {
    let mut pick: Vec<usize> = Vec::with_capacity(lists.len());
    for l in lists {
        if l.is_empty() {
            return None;
        }
        pick.push(0);
    }
    let total = |p: &[usize]| -> f64 { p.iter().zip(lists).map(|(&j, l)| l[j].build).sum() };
    let mut guard = 0;
    while total(&pick) > limit {
        guard += 1;
        if guard > 400 {
            return None;
        }
        let mut best: Option<(usize, usize, f64)> = None;
        for (i, l) in lists.iter().enumerate() {
            let cur = &l[pick[i]];
            for (j, o) in l.iter().enumerate() {
                if o.build < cur.build {
                    let r = (o.loss - cur.loss) / (cur.build - o.build);
                    if best.is_none_or(|b| r < b.2) {
                        best = Some((i, j, r));
                    }
                }
            }
        }
        let (i, j, _) = best?;
        pick[i] = j;
    }
    Some(pick)
}

/// The stack-up of a set of conductors under `pattern`, its fit and the
/// harmonic model's copper loss.
pub fn evaluate_set(
    s: &Setting,
    needs: &[Need],
    set: &[(Conductor, u32)],
    pattern: &Pattern,
) -> Result<(StackUp, FitReport, LossReport)> {
    let specs: Vec<WindingSpec> = needs
        .iter()
        .zip(set)
        .map(|(n, (c, p))| WindingSpec {
            name: n.name.to_string(),
            turns: n.turns,
            conductor: c.clone(),
            parallel: *p,
        })
        .collect();
    let mut st = default_stackup(s.core, &specs, pattern, s.opts)?;
    foil_films(&mut st);
    let f = fit(s.core, &st)?;
    let model = LossModel::from_fit(&st, &f, s.temperature)?;
    let opts = LossOptions {
        edge_time: s.edge_time,
        tolerance: 1e-2,
        ..LossOptions::default()
    };
    let r = model.evaluate(s.currents, &opts)?;
    Ok((st, f, r))
}

/// Foil turns need a film between them.
pub fn foil_films(st: &mut StackUp) {
    for it in &mut st.items {
        if let Item::Section(sec) = it {
            if sec.conductor.is_foil() && sec.interlayer.is_none() {
                sec.interlayer = Some(Tape {
                    material: "polyester film".into(),
                    thickness: FOIL_FILM,
                    wraps: 1,
                });
            }
        }
    }
}

fn winding_loss(r: &LossReport, name: &str) -> f64 {
    r.windings.iter().find(|w| w.name == name).map_or(0.0, |w| w.total_loss)
}

/// The copper loss of winding group `g` (its members' sum) in `r`.
pub(super) fn group_loss(r: &LossReport, gr: &[Vec<usize>], needs: &[Need], g: usize) -> f64 {
    gr[g].iter().map(|&m| winding_loss(r, needs[m].name)).sum()
}

/// The windings that share one conductor: the two halves "X A" and "X B"
/// of a centre-tapped winding are wound alike (bifilar or mirrored; common
/// practice, no source). Leaders first, by first appearance.
fn groups(needs: &[Need]) -> Vec<Vec<usize>> {
    let base = |n: &str| n.strip_suffix(" A").or_else(|| n.strip_suffix(" B")).unwrap_or(n).to_string();
    let mut out: Vec<(String, Vec<usize>)> = Vec::new();
    for (i, n) in needs.iter().enumerate() {
        let b = base(n.name);
        let same_turns = |g: &Vec<usize>| g.iter().all(|&k| needs[k].turns == n.turns && needs[k].fixed == n.fixed);
        match out.iter_mut().find(|(k, g)| *k == b && same_turns(g)) {
            Some((_, g)) => g.push(i),
            None => out.push((b, vec![i])),
        }
    }
    out.into_iter().map(|(_, g)| g).collect()
}

/// Steps 1–2 over every interleaving left open (see [`screen`]).
pub struct Screened {
    rows: Vec<(f64, Pattern, Vec<Vec<Option1>>, Vec<usize>)>,
}

impl Screened {
    /// The least estimated copper loss of any interleaving's pick, W.
    pub fn least(&self) -> Option<f64> {
        self.rows.iter().map(|x| x.0).min_by(f64::total_cmp)
    }
}

/// Steps 1–2 (module docs) over the `patterns` left open: what
/// [`decide`] then weighs with the harmonic model.
pub fn screen(s: &Setting, needs: &[Need], patterns: &[Pattern]) -> Screened {
    let win = window(s);
    let gr = groups(needs);
    Screened {
        rows: screen_patterns(s, needs, patterns, &gr, &win, BUILD_SHARE * s.core.winding_height),
    }
}

fn window(s: &Setting) -> Window {
    Window {
        breadth: s.breadth,
        delta1: s.delta1,
        rho: s.rho,
        mlt: s.core.mlt_mid(),
        interlayer: s.opts.interlayer.clone(),
    }
}

/// Step 1 over every interleaving: per group of windings wound alike, the
/// candidate conductors with their estimated loss and build (sorted by
/// loss), and the least-loss pick that fits the build `limit_all` less the
/// pattern's tapes. Patterns with no fitting pick are dropped.
fn screen_patterns(
    s: &Setting,
    needs: &[Need],
    patterns: &[Pattern],
    gr: &[Vec<usize>],
    win: &Window,
    limit_all: f64,
) -> Vec<(f64, Pattern, Vec<Vec<Option1>>, Vec<usize>)> {
    let turns: Vec<u32> = needs.iter().map(|n| n.turns).collect();
    let names: Vec<&str> = needs.iter().map(|n| n.name).collect();
    let own: Vec<(f64, Vec<(f64, f64)>)> = needs.iter().map(|n| (n.current.mean(), phasors(n.current))).collect();
    let mut screened = Vec::with_capacity(patterns.len());
    let mut memo = DowellMemo::default();
    for pattern in patterns {
        let order = order_of(pattern, &names, &turns);
        let secs = sections_of(&order, needs.len());
        let nsec = order.len();
        let all = portions(&order, &names, &turns, &own);
        let limit = limit_all - tape_build(s.opts, nsec);
        let lists: Vec<Vec<Option1>> = gr
            .iter()
            .map(|members| {
                let lead = members[0];
                let portions: Vec<&_> = members.iter().map(|&m| &all[m]).collect();
                let mut l: Vec<Option1> = candidates(&needs[lead], &secs[lead], s)
                    .into_iter()
                    .filter_map(|(c, p)| {
                        let mut loss = 0.0;
                        let mut build = 0.0;
                        for portion in portions.iter().copied() {
                            let (a, b) = estimate(portion, &c, p, win, &mut memo)?;
                            loss += a;
                            build += b;
                        }
                        Some(Option1 {
                            conductor: c,
                            parallel: p,
                            loss,
                            build,
                        })
                    })
                    .collect();
                l.sort_by(|a, b| a.loss.total_cmp(&b.loss));
                l
            })
            .collect();
        let Some(pick) = rank(&lists, limit) else { continue };
        let estimated: f64 = pick.iter().zip(&lists).map(|(&j, l)| l[j].loss).sum();
        screened.push((estimated, pattern.clone(), lists, pick));
    }
    screened
}

/// What the report says per winding: every conductor evaluated by the
/// harmonic model (its loss and build, the chosen one marked), each other
/// kind's best estimate (marked as not fitting where that is why), and the
/// reason the winner won.
fn trial_report(
    needs: &[Need],
    gr: &[Vec<usize>],
    lists: &[Vec<Option1>],
    chosen: &[usize],
    evaluated: &[Vec<(usize, f64)>],
    simpler: &[Option<f64>],
    r: &LossReport,
    limit: f64,
) -> (Vec<Vec<ConductorTrial>>, Vec<String>) {
    let mut trials = vec![Vec::new(); needs.len()];
    let mut reasons = vec![String::new(); needs.len()];
    for (g, members) in gr.iter().enumerate() {
        let others: f64 = (0..gr.len()).filter(|&x| x != g).map(|x| lists[x][chosen[x]].build).sum();
        let mut t: Vec<ConductorTrial> = Vec::new();
        let share = 1.0 / members.len() as f64;
        for &(j, loss) in &evaluated[g] {
            let o = &lists[g][j];
            t.push(ConductorTrial {
                kind: Kind::of(&o.conductor),
                conductor: o.conductor.describe(),
                parallel: o.parallel,
                loss: loss * share,
                build: o.build * share,
                evaluated: true,
                fits: true,
                chosen: j == chosen[g],
            });
        }
        // Kinds not evaluated: their best estimate, marked as not fitting
        // where that is why.
        for kind in [Kind::Round, Kind::TripleInsulated, Kind::Foil, Kind::Litz] {
            if t.iter().any(|x| x.kind == kind) {
                continue;
            }
            if let Some(o) = lists[g].iter().find(|o| Kind::of(&o.conductor) == kind) {
                t.push(ConductorTrial {
                    kind,
                    conductor: o.conductor.describe(),
                    parallel: o.parallel,
                    loss: o.loss * share,
                    build: o.build * share,
                    evaluated: false,
                    fits: others + o.build <= limit,
                    chosen: false,
                });
            }
        }
        t.sort_by(|a, b| b.chosen.cmp(&a.chosen).then(a.loss.total_cmp(&b.loss)));
        for &m in members {
            // Each member's own loss for the chosen conductor.
            let mut tm = t.clone();
            if let Some(c) = tm.iter_mut().find(|x| x.chosen) {
                c.loss = winding_loss(r, needs[m].name);
            }
            reasons[m] = reason(&needs[m], &tm, lists[g].len(), simpler[g]);
            if members.len() > 1 {
                reasons[m].push_str("; both halves wound alike");
            }
            trials[m] = tm;
        }
    }
    (trials, reasons)
}

type Best = (f64, Pattern, Vec<Vec<Option1>>, Vec<usize>, StackUp, FitReport, LossReport);


/// Steps 3–4 (module docs) on what [`screen`] found with the same
/// setting and windings.
pub fn decide(s: &Setting, needs: &[Need], screened: Screened) -> Option<Found> {
    let turns: Vec<u32> = needs.iter().map(|n| n.turns).collect();
    let gr = groups(needs);
    let expand = |pick: &[usize], lists: &[Vec<Option1>]| -> Vec<(Conductor, u32)> {
        let mut set = vec![(lists[0][pick[0]].conductor.clone(), 1); needs.len()];
        for (g, members) in gr.iter().enumerate() {
            for &m in members {
                set[m] = (lists[g][pick[g]].conductor.clone(), lists[g][pick[g]].parallel);
            }
        }
        set
    };
    let limit_all = BUILD_SHARE * s.core.winding_height;
    let mut best: Option<Best> = None;
    let mut tried = Vec::with_capacity(screened.rows.len());
    // The harmonic model decides between the interleavings whose estimate is
    // within SCREEN_BAND of the least.
    let least = screened.least().unwrap_or(f64::INFINITY);
    for (estimated, pattern, lists, pick) in screened.rows {
        if estimated > least * SCREEN_BAND {
            continue;
        }
        let set = expand(&pick, &lists);
        let Ok((st, f, r)) = evaluate_set(s, needs, &set, &pattern) else { continue };
        tried.push((pattern.clone(), r.total));
        if best.as_ref().is_none_or(|b| r.total < b.0) {
            best = Some((r.total, pattern, lists, pick, st, f, r));
        }
    }
    let (_, pattern, lists, pick, mut st, mut f, mut r) = best?;
    let mut set = expand(&pick, &lists);
    let names: Vec<&str> = needs.iter().map(|n| n.name).collect();
    let nsec = order_of(&pattern, &names, &turns).len();
    let limit = limit_all - tape_build(s.opts, nsec);
    let group_loss = |r: &LossReport, g: usize| group_loss(r, &gr, needs, g);
    // Per group: (option index, the group's evaluated loss).
    let mut evaluated: Vec<Vec<(usize, f64)>> = (0..gr.len()).map(|g| vec![(pick[g], group_loss(&r, g))]).collect();
    let mut chosen = pick.clone();
    for g in 0..gr.len() {
        if needs[gr[g][0]].fixed.is_some() {
            continue;
        }
        for kind in [Kind::Round, Kind::TripleInsulated, Kind::Foil, Kind::Litz] {
            if Kind::of(&lists[g][chosen[g]].conductor) == kind {
                continue;
            }
            let others: f64 = (0..gr.len()).filter(|&x| x != g).map(|x| lists[x][chosen[x]].build).sum();
            // The kind's best (the lists are sorted by estimated loss) that
            // fits, if its estimate is within KIND_BAND of the chosen one's.
            // Against the larger of the chosen one's estimate and its loss by
            // the harmonic model: where the estimate flatters the chosen
            // conductor, the other kinds still get their turn.
            let chosen_loss = evaluated[g].iter().find(|e| e.0 == chosen[g]).map_or(0.0, |e| e.1);
            let ceiling = lists[g][chosen[g]].loss.max(chosen_loss) * KIND_BAND;
            let js: Vec<usize> = (0..lists[g].len())
                .filter(|&j| Kind::of(&lists[g][j].conductor) == kind && others + lists[g][j].build <= limit)
                .take(1)
                .filter(|&j| lists[g][j].loss <= ceiling)
                .collect();
            for j in js {
            if evaluated[g].iter().any(|e| e.0 == j) {
                continue;
            }
            let mut trial = chosen.clone();
            trial[g] = j;
            let trial_set = expand(&trial, &lists);
            let Ok((st2, f2, r2)) = evaluate_set(s, needs, &trial_set, &pattern) else { continue };
            evaluated[g].push((j, group_loss(&r2, g)));
            if r2.total < r.total {
                set = trial_set;
                chosen = trial;
                st = st2;
                f = f2;
                r = r2;
            }
            }
        }
    }
    // Step 4: the simplest conductor where the least-loss one buys little.
    let mut decided = (set, st, f, r);
    let (simpler, allowance) = simplify(s, needs, &gr, &lists, &pattern, limit, &mut chosen, &mut evaluated, &mut decided);
    let (set, st, f, r) = decided;
    // The chosen conductors' losses as finally evaluated.
    for g in 0..gr.len() {
        let l = group_loss(&r, g);
        if let Some(e) = evaluated[g].iter_mut().find(|e| e.0 == chosen[g]) {
            e.1 = l;
        }
    }
    let simpler: Vec<Option<f64>> = simpler.iter().map(|&t| t.then_some(allowance)).collect();
    let (trials, reasons) = trial_report(needs, &gr, &lists, &chosen, &evaluated, &simpler, &r, limit);
    Some(Found {
        pattern,
        stackup: st,
        fit: f,
        conductors: set,
        trials,
        reasons,
        patterns: tried,
        copper: r.total,
    })
}

/// Why the chosen conductor won; `simpler` is the simplicity allowance, W,
/// where step 4 took a simpler conductor at some cost.
fn reason(n: &Need, t: &[ConductorTrial], screened: usize, simpler: Option<f64>) -> String {
    if n.fixed.is_some() {
        return "fixed by the user".into();
    }
    let Some(w) = t.iter().find(|x| x.chosen) else {
        return String::new();
    };
    if let Some(allowance) = simpler {
        let least = t.iter().filter(|x| x.evaluated && !x.chosen).min_by(|a, b| a.loss.total_cmp(&b.loss));
        let than = least.map_or(String::new(), |x| format!("; {} would lose {:.3} W", x.conductor, x.loss));
        return format!(
            "the simplest of {screened} buildable conductors ranked whose set loses at most {:.3} W more copper than \
             the least-loss set (the larger of {:.0} % of its copper loss and {:.1} % of the design's whole loss; \
             {:.3} W here{than})",
            allowance,
            SIMPLER_SHARE * 100.0,
            SIMPLER_TOTAL_SHARE * 100.0,
            w.loss
        );
    }
    let lower: Vec<&ConductorTrial> = t.iter().filter(|x| !x.chosen && x.loss < w.loss).collect();
    let mut s = format!(
        "least copper loss ({:.3} W) of {screened} buildable conductors ranked, {} checked by the harmonic model",
        w.loss,
        t.iter().filter(|x| x.evaluated).count()
    );
    // Each kind of "why not": one that would lose less but does not fit,
    // and one the harmonic model weighed that loses less itself.
    if let Some(x) = lower.iter().find(|x| !x.fits) {
        s.push_str(&format!(
            "; {} would lose less ({:.3} W estimated) but does not fit the window",
            x.conductor,
            x.loss
        ));
    }
    if let Some(x) = lower.iter().find(|x| x.evaluated) {
        s.push_str(&format!(
            "; {} alone loses less ({:.3} W) but raises the others' loss more",
            x.conductor, x.loss
        ));
    }
    s
}

