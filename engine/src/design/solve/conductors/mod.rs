//! Step 5: the conductors and the stack-up: the least-loss search
//! ([`search`], starting from the optima of [`optima`], ranked by the
//! estimate of [`screen`]), the window allocation it falls back on, the
//! user's fixed conductors and custom orders.

pub mod optima;
pub mod screen;
pub mod search;
mod simplify;

pub use search::{ConductorTrial, Kind as ConductorKind};
pub use simplify::{SIMPLER_SHARE, SIMPLER_TOTAL_SHARE};

/// What the search needs to evaluate copper loss: the currents at the
/// selection corner (dot convention), the temperature and ρ there.
pub(super) struct LossSetting<'a> {
    pub currents: &'a [crate::winding::loss::WindingCurrent],
    pub temperature: f64,
    pub rho: f64,
    /// The loss the conductors do not change (the core's at the selection
    /// corner and temperature), W: the simplicity allowance's base with the
    /// copper ([`simplify`]).
    pub other: f64,
}

use super::*;
use crate::core::Core;
use crate::design::file::{Construction, Design, Interleave, WireChoice};
use crate::error::{Error, Result};
use crate::topology::Isolation;
use crate::winding::conductor::{Conductor, Grade};
use crate::winding::fit::{fit, FitReport};
use crate::winding::stackup::{
    default_stackup, DefaultOptions, Pattern, StackUp, Tape, WindingSpec,
};
use crate::winding::wire::awg_diameter;

/// A stack-up with its fit, the wire table and how the windings were ordered.
pub(super) type Chosen = (StackUp, FitReport, Vec<WireSummary>, WindingChoice);

/// What every conductor choice of one design shares: the insulation, the
/// breadth between the margins and where triple-insulated wire is needed.
struct Frame {
    opts: DefaultOptions,
    breadth: f64,
    tiw_secondaries: bool,
    /// The reinforced construction built, if any.
    built: Option<Construction>,
}

/// The reinforced constructions to weigh: none where the design asks for
/// no reinforced insulation or has no hazardous voltage; else the one the
/// file names, or both for "auto".
fn constructions(design: &Design) -> Vec<Option<Construction>> {
    let reinforced = design.spec.isolation == Isolation::Reinforced && !design.spec.safety_cautions().is_empty();
    match design.choices.insulation.construction {
        _ if !reinforced => vec![None],
        Construction::Auto => vec![Some(Construction::TripleInsulated), Some(Construction::MarginWound)],
        c => vec![Some(c)],
    }
}

/// The constructions the turn-count trials' allocation by area tries, in
/// turn: the one asked, or for "auto" the margin-wound one, which takes any
/// conductor, then (where its margins leave no room) the triple-insulated
/// one. The search then weighs both.
fn trial_constructions(design: &Design) -> Vec<Option<Construction>> {
    let all = constructions(design);
    if all.len() == 1 {
        all
    } else {
        vec![Some(Construction::MarginWound), Some(Construction::TripleInsulated)]
    }
}

fn frame(design: &Design, core: &Core, windings: &[(String, u32, f64)], built: Option<Construction>) -> Result<Frame> {
    let spec = &design.spec;
    let ch = &design.choices;
    for (i, o) in ch.wires.iter().enumerate() {
        if !windings.iter().any(|w| w.0 == o.winding) {
            let names: Vec<&str> = windings.iter().map(|w| w.0.as_str()).collect();
            return Err(Error::input(
                &format!("choices.wires[{i}].winding"),
                format!(
                    "no winding \"{}\" in this design (windings: {})",
                    o.winding,
                    names.join(", ")
                ),
            ));
        }
    }
    let hazardous = !spec.safety_cautions().is_empty();
    let ins = &ch.insulation;
    let margin = ins.margin.unwrap_or(match (spec.isolation, hazardous, built) {
        // Margin tape at each flange so the creepage path between primary
        // and secondary crosses two margins (common practice, from memory;
        // the standard's creepage table for the working voltage decides).
        // Triple-insulated secondaries need none: the wire is the insulation.
        (Isolation::Basic, true, _) => 2.0e-3,
        (Isolation::Reinforced, true, Some(Construction::TripleInsulated)) => 0.0,
        (Isolation::Reinforced, true, _) => 3.0e-3,
        _ => 0.0,
    });
    let tape = |wraps: u32| Tape {
        material: "polyester film".into(),
        thickness: ins.tape_thickness,
        wraps,
    };
    // Margin-wound reinforced insulation: at least three wraps between
    // sections (common practice, from memory: three layers of which any
    // two pass the electric strength test).
    let section_wraps = if built == Some(Construction::MarginWound) {
        ins.section_wraps.max(3)
    } else {
        ins.section_wraps
    };
    let opts = DefaultOptions {
        section_tape: tape(section_wraps.max(1)),
        outer_tape: tape(ins.outer_wraps.max(1)),
        interlayer: (ins.interlayer_wraps > 0).then(|| tape(ins.interlayer_wraps)),
        margin,
    };
    if core.winding_breadth - 2.0 * margin <= 0.5e-3 {
        return Err(Error::infeasible(
            Some("choices.insulation.margin"),
            format!(
                "{:.1} mm margins leave no winding breadth on this bobbin",
                margin * 1e3
            ),
        ));
    }
    Ok(Frame {
        opts,
        breadth: core.winding_breadth - 2.0 * margin,
        tiw_secondaries: built == Some(Construction::TripleInsulated),
        built,
    })
}

/// Some winding is a centre-tapped half ("X A" with its "X B").
fn centre_tapped(windings: &[(String, u32, f64)]) -> bool {
    windings.iter().any(|w| w.0.ends_with(" A"))
}

/// Splitting the primary or the secondaries can be chosen for two or more
/// windings, none of them a centre-tapped half, with a primary of at least
/// two turns; centre-tapped windings are mirrored instead
/// ([`Pattern::MirroredHalves`]).
fn can_interleave(windings: &[(String, u32, f64)]) -> bool {
    windings.len() >= 2 && !centre_tapped(windings) && windings[0].1 >= 2
}

/// `choices.interleave = "mirrored_halves"`, refused where no winding is
/// centre-tapped.
fn mirrored_halves(windings: &[(String, u32, f64)]) -> Result<Pattern> {
    if centre_tapped(windings) {
        Ok(Pattern::MirroredHalves)
    } else {
        Err(Error::input(
            "choices.interleave",
            "\"mirrored_halves\" mirrors centre-tapped halves (push-pull, or a bridge's centre-tapped secondaries) \
             and this design has none: choose \"sequential\", \"split_primary\", \"split_secondaries\" or \"custom\"",
        ))
    }
}

/// Step 5 in every turn-count trial: the conductors by window allocation
/// (quick); an automatic interleaving splits the primary where it can.
/// The least-loss search ([`search_stackup`]) then runs once, on the
/// chosen turns.
pub(super) fn choose_stackup(
    design: &Design,
    core: &Core,
    windings: &[(String, u32, f64)],
    delta: f64,
) -> Result<Chosen> {
    let mut first_error = None;
    for built in trial_constructions(design) {
        match choose_stackup_built(design, core, windings, delta, built) {
            Ok(c) => return Ok(c),
            Err(e) => {
                first_error.get_or_insert(e);
            }
        }
    }
    Err(first_error.unwrap_or_else(|| Error::infeasible(None, "no construction to build")))
}

fn choose_stackup_built(
    design: &Design,
    core: &Core,
    windings: &[(String, u32, f64)],
    delta: f64,
    built: Option<Construction>,
) -> Result<Chosen> {
    let ch = &design.choices;
    let fr = frame(design, core, windings, built)?;
    let pattern = match ch.interleave {
        Interleave::Sequential => Pattern::Sequential,
        Interleave::SplitPrimary => Pattern::SplitPrimary,
        Interleave::SplitSecondaries => Pattern::SplitSecondaries,
        Interleave::Custom => Pattern::Custom(custom_order(&ch.section_order, windings)?),
        Interleave::MirroredHalves => mirrored_halves(windings)?,
        Interleave::Auto if can_interleave(windings) => Pattern::SplitPrimary,
        Interleave::Auto if centre_tapped(windings) => Pattern::MirroredHalves,
        Interleave::Auto => Pattern::Sequential,
    };
    let (st, f, wires) = by_area(design, core, windings, delta, &pattern, &fr.opts, fr.breadth, fr.tiw_secondaries)?;
    let choice = WindingChoice {
        interleave: pattern_name(&pattern).into(),
        automatic: false,
        construction: fr.built,
        tried: Vec::new(),
    };
    Ok((st, f, wires, choice))
}

/// Step 5, once on the chosen turns: the least-loss conductors
/// ([`search`]) for every winding the user left automatic, and the
/// interleaving by loss when it is automatic, and where reinforced
/// insulation is built its construction by loss when it is automatic.
/// With every conductor fixed the search still runs where something is
/// left to choose (an automatic interleaving or construction): it weighs
/// them with the fixed conductors. `None` when nothing is left to choose
/// or no set fits the window (the trials' allocation by area then stands).
/// `keep`: a choice already made by loss on other turns of the same
/// design, whose automatic interleaving and construction are kept;
/// `primary_turns`: the design's, which the report gives each trial.
pub(super) fn search_stackup(
    design: &Design,
    core: &Core,
    windings: &[(String, u32, f64)],
    delta: f64,
    loss: &LossSetting,
    keep: Option<&WindingChoice>,
    primary_turns: u32,
) -> Result<Option<Chosen>> {
    let ch = &design.choices;
    let mut builts = constructions(design);
    if let Some(k) = keep.and_then(|k| k.construction) {
        let kept: Vec<Option<Construction>> = builts.iter().copied().filter(|&b| b == Some(k)).collect();
        if !kept.is_empty() {
            builts = kept;
        }
    }
    let interleave_as = keep.filter(|k| k.automatic).map(|k| k.interleave.as_str());
    let patterns = patterns_of(ch, windings, interleave_as)?;
    let all_fixed = windings.iter().all(|w| ch.wires.iter().any(|o| o.winding == w.0));
    if all_fixed && patterns.len() <= 1 && builts.len() <= 1 {
        return Ok(None);
    }
    // Each construction's frame and windings; one that cannot be built
    // (margins leaving no breadth, say) is left out unless none can.
    let mut first_error = None;
    let mut preps: Vec<Prep> = Vec::with_capacity(builts.len());
    for built in builts {
        match prepare(design, core, windings, loss, built) {
            Ok(Some(p)) => preps.push(p),
            Ok(None) => return Ok(None),
            Err(e) => {
                first_error.get_or_insert(e);
            }
        }
    }
    if preps.is_empty() {
        return first_error.map_or(Ok(None), Err);
    }
    let setting = |p| setting(p, design, core, delta, loss);
    // The quick screen of every construction; the harmonic model then
    // weighs those whose estimate is within SCREEN_BAND of the least.
    let screens: Vec<search::Screened> = preps.iter().map(|p| search::screen(&setting(p), &p.needs, &patterns)).collect();
    let least = screens.iter().filter_map(|x| x.least()).fold(f64::INFINITY, f64::min);
    let mut best: Option<(f64, Chosen)> = None;
    let mut tried = Vec::new();
    for (p, sc) in preps.iter().zip(screens) {
        if !sc.least().is_some_and(|l| l <= least * search::SCREEN_BAND) {
            continue;
        }
        let Some(found) = search::decide(&setting(p), &p.needs, sc) else { continue };
        let copper = found.copper;
        let chosen = summarise(design, windings, p.frame.built, primary_turns, found);
        tried.extend(chosen.3.tried.iter().cloned());
        if best.as_ref().is_none_or(|b| copper < b.0) {
            best = Some((copper, chosen));
        }
    }
    Ok(best.map(|(_, mut chosen)| {
        chosen.3.tried = tried;
        chosen
    }))
}

/// The interleavings the search weighs: the one asked, or for "auto" those
/// that suit the windings, less `interleave_as` where it names one of them.
fn patterns_of(ch: &Choices, windings: &[(String, u32, f64)], interleave_as: Option<&str>) -> Result<Vec<Pattern>> {
    let patterns: Vec<Pattern> = match ch.interleave {
        Interleave::Sequential => vec![Pattern::Sequential],
        Interleave::SplitPrimary => vec![Pattern::SplitPrimary],
        Interleave::SplitSecondaries => vec![Pattern::SplitSecondaries],
        Interleave::Custom => vec![Pattern::Custom(custom_order(&ch.section_order, windings)?)],
        Interleave::MirroredHalves => vec![mirrored_halves(windings)?],
        Interleave::Auto if can_interleave(windings) => {
            vec![Pattern::Sequential, Pattern::SplitPrimary, Pattern::SplitSecondaries]
        }
        Interleave::Auto if centre_tapped(windings) => vec![Pattern::Sequential, Pattern::MirroredHalves],
        Interleave::Auto => vec![Pattern::Sequential],
    };
    // An automatic interleaving already chosen by loss on other turns of
    // the same design is kept (the search then weighs conductors only).
    Ok(match interleave_as {
        Some(name) if patterns.len() > 1 => {
            let kept: Vec<Pattern> = patterns.iter().filter(|p| pattern_name(p) == name).cloned().collect();
            if kept.is_empty() { patterns } else { kept }
        }
        _ => patterns,
    })
}

/// The search's fixed inputs for one construction.
fn setting<'s>(p: &'s Prep, design: &Design, core: &'s Core, delta: f64, loss: &LossSetting<'s>) -> search::Setting<'s> {
    let ch = &design.choices;
    search::Setting {
        core,
        opts: &p.frame.opts,
        breadth: p.frame.breadth,
        delta1: delta,
        rho: loss.rho,
        temperature: loss.temperature,
        edge_time: ch.edge_time,
        ring: core.family.eq_ignore_ascii_case("R") || matches!(core.shape, Some(crate::core::Shape::Ring { .. })),
        max_parallel: ch.max_parallel,
        currents: loss.currents,
        other_loss: loss.other,
    }
}

/// One construction as the search sees it: its frame and the windings.
struct Prep<'a> {
    frame: Frame,
    needs: Vec<search::Need<'a>>,
}

/// The frame and the windings for `built`; `None` where a winding has no
/// current at the selection corner.
fn prepare<'a>(
    design: &Design,
    core: &Core,
    windings: &'a [(String, u32, f64)],
    loss: &LossSetting<'a>,
    built: Option<Construction>,
) -> Result<Option<Prep<'a>>> {
    let ch = &design.choices;
    let frame = frame(design, core, windings, built)?;
    let mut needs = Vec::with_capacity(windings.len());
    for (name, turns, _) in windings {
        let Some(current) = loss.currents.iter().find(|c| &c.name == name).map(|c| &c.current) else {
            return Ok(None);
        };
        let fixed = match ch.wires.iter().find(|o| &o.winding == name) {
            Some(o) => Some(fixed_conductor(&o.wire, frame.breadth)?),
            None => None,
        };
        needs.push(search::Need {
            name,
            turns: *turns,
            current,
            tiw: frame.tiw_secondaries && name.starts_with("secondary"),
            fixed,
        });
    }
    Ok(Some(Prep { frame, needs }))
}

/// What the search found, as the report's stack-up, wire table and
/// winding choice (its trials weighed at `primary_turns`).
fn summarise(
    design: &Design,
    windings: &[(String, u32, f64)],
    built: Option<Construction>,
    primary_turns: u32,
    found: search::Found,
) -> Chosen {
    let ch = &design.choices;
    let automatic = |name: &str| !ch.wires.iter().any(|o| o.winding == name);
    let wires = windings
        .iter()
        .zip(&found.conductors)
        .zip(found.trials.into_iter().zip(found.reasons))
        .map(|(((name, turns, rms), (c, p)), (trials, reason))| {
            let copper = c.copper_area() * *p as f64;
            WireSummary {
                winding: name.clone(),
                turns: *turns,
                conductor: c.describe(),
                parallel: *p,
                copper_area: copper,
                rms_current: *rms,
                current_density: rms / copper,
                automatic: automatic(name),
                trials,
                reason,
            }
        })
        .collect();
    let choice = WindingChoice {
        interleave: pattern_name(&found.pattern).into(),
        automatic: ch.interleave == Interleave::Auto,
        construction: built,
        tried: found
            .patterns
            .iter()
            .map(|(p, w)| PatternTrial {
                interleave: pattern_name(p).into(),
                construction: built,
                copper_loss: *w,
                primary_turns,
            })
            .collect(),
    };
    (found.stackup, found.fit, wires, choice)
}

/// The name of a pattern as in `choices.interleave`.
pub(super) fn pattern_name(p: &Pattern) -> &'static str {
    match p {
        Pattern::Sequential => "sequential",
        Pattern::SplitPrimary => "split_primary",
        Pattern::SplitSecondaries => "split_secondaries",
        Pattern::MirroredHalves => "mirrored_halves",
        Pattern::Custom(_) => "custom",
    }
}

/// The conductors by window allocation (step 5 of the solver's module
/// docs): every turn-count trial's, and the design's when every conductor
/// is fixed with nothing else left to choose, or no least-loss set fits.
#[allow(clippy::too_many_arguments)]
fn by_area(
    design: &Design,
    core: &Core,
    windings: &[(String, u32, f64)],
    delta: f64,
    pattern: &Pattern,
    opts: &DefaultOptions,
    breadth: f64,
    tiw_secondaries: bool,
) -> Result<(StackUp, FitReport, Vec<WireSummary>)> {
    let ch = &design.choices;
    let at_sum: f64 = windings.iter().map(|w| w.1 as f64 * w.2).sum();
    let mut ku = ch.window_utilisation;
    let mut last_err = None;
    for _ in 0..7 {
        let mut specs = Vec::with_capacity(windings.len());
        let mut wires = Vec::with_capacity(windings.len());
        for (name, turns, rms) in windings {
            let fixed = ch.wires.iter().find(|o| &o.winding == name);
            let (conductor, parallel) = match fixed {
                Some(o) => fixed_conductor(&o.wire, breadth)?,
                None => {
                    // E&M §15.1.4: α_k = N_k·I_k/Σ N_j·I_j; A_k = α_k·Ku·Wa/N_k.
                    let share = if at_sum > 0.0 {
                        *turns as f64 * rms / at_sum
                    } else {
                        1.0 / windings.len() as f64
                    };
                    let area = (share * ku * core.window_area / *turns as f64).max(1e-9);
                    let tiw = tiw_secondaries && name.starts_with("secondary");
                    auto_conductor(area, *turns, delta, breadth, tiw, share < 0.05, ch.max_parallel)?
                }
            };
            let copper = conductor.copper_area() * parallel as f64;
            wires.push(WireSummary {
                winding: name.clone(),
                turns: *turns,
                conductor: conductor.describe(),
                parallel,
                copper_area: copper,
                rms_current: *rms,
                current_density: rms / copper,
                automatic: fixed.is_none(),
                trials: Vec::new(),
                reason: if fixed.is_some() {
                    "fixed by the user".into()
                } else {
                    "window shared by ampere-turns (no least-loss set fits)".into()
                },
            });
            specs.push(WindingSpec {
                name: name.clone(),
                turns: *turns,
                conductor,
                parallel,
            });
        }
        let built = default_stackup(core, &specs, pattern, opts).and_then(|mut st| {
            search::foil_films(&mut st);
            fit(core, &st).map(|f| (st, f))
        });
        match built {
            Ok((st, f)) => return Ok((st, f, wires)),
            Err(e) if e.field() == Some("pattern") => {
                return Err(Error::infeasible(
                    Some("choices.section_order"),
                    e.message().to_string(),
                ))
            }
            Err(e) => {
                last_err = Some(e);
                if ch.wires.len() == windings.len() {
                    break;
                }
                ku *= 0.8;
            }
        }
    }
    let e = last_err.unwrap_or_else(|| Error::infeasible(Some("core"), "the windings do not fit"));
    Err(Error::infeasible(
        Some("core"),
        format!(
            "the windings do not fit this core's window: {}",
            e.message()
        ),
    ))
}

/// A custom section order as (winding index, turns), bobbin outward:
/// sections without turns share their winding's remaining turns equally
/// (the first ones take the odd turns).
pub(super) fn custom_order(
    order: &[crate::design::file::SectionTurns],
    windings: &[(String, u32, f64)],
) -> Result<Vec<(usize, u32)>> {
    if order.is_empty() {
        return Err(Error::input(
            "choices.section_order",
            "a custom order needs its sections, bobbin outward",
        ));
    }
    let mut out = Vec::with_capacity(order.len());
    for (k, s) in order.iter().enumerate() {
        let i = windings
            .iter()
            .position(|w| w.0 == s.winding)
            .ok_or_else(|| {
                let names: Vec<&str> = windings.iter().map(|w| w.0.as_str()).collect();
                Error::input(
                    &format!("choices.section_order[{k}].winding"),
                    format!(
                        "no winding \"{}\" in this design (windings: {})",
                        s.winding,
                        names.join(", ")
                    ),
                )
            })?;
        out.push((i, s.turns.unwrap_or(0)));
    }
    for (i, (name, total, _)) in windings.iter().enumerate() {
        let fixed: u64 = order
            .iter()
            .zip(&out)
            .filter(|(_, o)| o.0 == i)
            .filter_map(|(s, _)| s.turns)
            .map(u64::from)
            .sum();
        let shared: Vec<usize> = (0..order.len())
            .filter(|&k| out[k].0 == i && order[k].turns.is_none())
            .collect();
        let has_any = out.iter().any(|o| o.0 == i);
        if !has_any {
            return Err(Error::input(
                "choices.section_order",
                format!("the winding \"{name}\" has no section in the order"),
            ));
        }
        let total = u64::from(*total);
        if fixed > total || (shared.is_empty() && fixed != total) {
            return Err(Error::infeasible(
                Some("choices.section_order"),
                format!(
                    "the sections of \"{name}\" hold {fixed} turns but the design gives it {total}"
                ),
            ));
        }
        let rest = total - fixed;
        let n = shared.len() as u64;
        for (j, &k) in shared.iter().enumerate() {
            out[k].1 = (rest / n.max(1) + u64::from((j as u64) < rest % n.max(1))) as u32;
        }
    }
    Ok(out)
}

/// AWG whose bare diameter is the largest not above `d` (ASTM B258 inverse),
/// limited to 8..=46.
pub(super) fn awg_not_above(d: f64) -> i32 {
    let n = 36.0 - 39.0 * (d / 0.127e-3).ln() / 92f64.ln();
    (n - 1e-9).ceil().clamp(8.0, 46.0) as i32
}

/// Realises a copper area (step 5 of the module docs): one round wire when
/// its diameter is at most 2δ; otherwise the candidate with the least radial
/// build among parallel round wires of at most 2δ, foil (eight turns or
/// fewer) and litz of strands at most δ; one wire of at most 2δ for a
/// `minor` winding (under 5 % of the ampere-turns). Common practice, no source.
pub(super) fn auto_conductor(
    area: f64,
    turns: u32,
    delta: f64,
    breadth: f64,
    tiw: bool,
    minor: bool,
    max_parallel: u32,
) -> Result<(Conductor, u32)> {
    let d_need = (4.0 * area / std::f64::consts::PI).sqrt();
    // Beyond the coarsest automatic gauge (stock range, or what winds and
    // terminates) more copper is wound as several in hand.
    let coarsest = if tiw { TIW_COARSEST_AWG } else { ROUND_COARSEST_AWG };
    let d_max = (2.0 * delta).max(0.1e-3).min(awg_diameter(coarsest)?);
    let round_of = |d: f64| -> Result<Conductor> {
        if tiw {
            automatic_tiw(awg_not_above(d))
        } else {
            Conductor::awg(awg_not_above(d), Grade::G2)
        }
    };
    // A winding with a small share of the ampere-turns (a reset winding)
    // gets one round wire of at most 2δ: its loss is small either way, and
    // a sheet or a row of wires across the breadth would sit in the full
    // field of its neighbours.
    if d_need <= d_max || minor {
        return Ok((round_of(d_need.min(d_max))?, 1));
    }
    // Radial build of `turns` turns of `c` with `par` in hand across `breadth`.
    let build = |c: &Conductor, par: u32| -> f64 {
        if c.is_foil() {
            return turns as f64 * par as f64 * (c.outer_height() + FOIL_FILM);
        }
        let per_layer = (breadth / c.outer_width()).floor().max(1.0);
        let layers = ((turns as f64 * par as f64) / per_layer).ceil();
        layers * c.outer_height()
    };
    let mut options: Vec<(Conductor, u32)> = Vec::with_capacity(3);
    let a_strand = std::f64::consts::PI * d_max * d_max / 4.0;
    let par = (area / a_strand).ceil().clamp(1.0, max_parallel.max(1) as f64) as u32;
    let d_par = (4.0 * area / (std::f64::consts::PI * par as f64))
        .sqrt()
        .min(d_max);
    options.push((round_of(d_par)?, par));
    if !tiw {
        if turns <= 8 {
            let t = ((area / breadth).clamp(0.03e-3, d_max) * 1e5).round() / 1e5;
            options.push((Conductor::foil(t.max(0.03e-3), breadth)?, 1));
        }
        // Litz of strands no thicker than δ (AWG 30..46).
        let g = awg_not_above(delta).max(30);
        let ds = awg_diameter(g)?;
        let strands = (area / (std::f64::consts::PI * ds * ds / 4.0))
            .ceil()
            .clamp(2.0, 2000.0) as u32;
        options.push((Conductor::litz(strands, ds, Grade::G1, 0.65, 0.03e-3)?, 1));
    }
    options
        .into_iter()
        .min_by(|a, b| build(&a.0, a.1).total_cmp(&build(&b.0, b.1)))
        .ok_or_else(|| Error::infeasible(None, "no conductor realises the copper area"))
}

/// The coarsest enamelled round wire the automatic conductors use: AWG 14,
/// 1.63 mm bare. Thicker solid wire is too stiff to wind tightly round a
/// small bobbin or a ring's edges and too thick to terminate on a bobbin's
/// pins (common practice, no source); more copper is wound as several in
/// hand, as foil or as litz. A wire the user fixes is wound as given.
pub const ROUND_COARSEST_AWG: i32 = 14;

/// The coarsest triple-insulated gauge the automatic conductors use: AWG 18,
/// 1.02 mm bare (from memory: stock triple-insulated wire ends near 1 mm
/// bare; use your supplier's data). More copper is wound as several in
/// hand. A wire the user fixes is wound as given.
pub const TIW_COARSEST_AWG: i32 = 18;

/// Triple-insulated wire of AWG `g`, or of [`TIW_COARSEST_AWG`] where `g`
/// is coarser: about 0.2 mm over the bare diameter (from memory).
pub(super) fn automatic_tiw(g: i32) -> Result<Conductor> {
    let d = awg_diameter(g.max(TIW_COARSEST_AWG))?;
    Conductor::triple_insulated(d, d + 0.2e-3)
}

/// Insulating film wound between foil turns, m (common practice, no source).
pub(super) const FOIL_FILM: f64 = 0.025e-3;

pub(crate) fn fixed_conductor(w: &WireChoice, breadth: f64) -> Result<(Conductor, u32)> {
    let par = |p: u32| -> Result<u32> {
        if p == 0 || p > 100 {
            return Err(Error::input(
                "choices.wires.parallel",
                "1 to 100 conductors in hand",
            ));
        }
        Ok(p)
    };
    Ok(match *w {
        WireChoice::Round { awg, parallel } => (Conductor::awg(awg, Grade::G2)?, par(parallel)?),
        WireChoice::Litz {
            strands,
            strand_awg,
        } => {
            if strands == 0 || strands > 10_000 {
                return Err(Error::input("choices.wires.strands", "1 to 10000 strands"));
            }
            (
                Conductor::litz(strands, awg_diameter(strand_awg)?, Grade::G1, 0.65, 0.03e-3)?,
                1,
            )
        }
        WireChoice::Foil { thickness } => {
            crate::error::in_range("choices.wires.thickness", thickness, 5e-6, 3e-3, "m")?;
            (Conductor::foil(thickness, breadth)?, 1)
        }
        WireChoice::TripleInsulated { awg, parallel } => {
            let d = awg_diameter(awg)?;
            (Conductor::triple_insulated(d, d + 0.2e-3)?, par(parallel)?)
        }
    })
}
