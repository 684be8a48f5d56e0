//! Steps 4–6 for one primary turn count: secondaries, gap, waveforms at both
//! corners, conductors and stack-up, losses at the selection temperature.

use super::*;
use crate::core::Core;
use crate::design::file::Design;
use crate::error::{Error, Result};
use crate::gap::{self, GapAl, GapCore};
use crate::loss::{self};
use crate::material::Material;
use crate::topology::{self, sizing, Corner, Topology, Turns, WorstCase};
use crate::winding::dowell::MU0;
use crate::winding::fit::FitReport;
use crate::winding::loss::{LossModel, LossOptions, LossReport, WindingCurrent};
use crate::winding::stackup::StackUp;
use crate::winding::wire::copper_resistivity;

/// A design built with given primary turns, losses at the selection temperature.
#[derive(Debug, Clone)]
pub(super) struct Candidate {
    pub(super) turns: Turns,
    pub(super) inductance: f64,
    pub(super) al: f64,
    pub(super) gap: Option<GapAl>,
    pub(super) waves: WorstCase,
    pub(super) stackup: StackUp,
    pub(super) fit: FitReport,
    pub(super) wires: Vec<WireSummary>,
    pub(super) winding_choice: WindingChoice,
    pub(super) corners: Vec<CornerLosses>,
    /// The corners' copper loss is not evaluated yet (each `copper` is a
    /// placeholder of zero loss): set by [`build_for_search`], whose
    /// allocation by area the search usually replaces; [`ensure_copper`]
    /// evaluates it where it stands.
    pub(super) copper_pending: bool,
}

impl Candidate {
    pub(super) fn worst_corner(&self) -> &CornerLosses {
        // `corners` holds one or two entries (see `build_corners`).
        let mut w = &self.corners[0];
        for c in &self.corners[1..] {
            if c.total > w.total {
                w = c;
            }
        }
        w
    }
    pub(super) fn selection_total(&self) -> f64 {
        self.worst_corner().total
    }
    pub(super) fn selection_core(&self) -> f64 {
        self.worst_corner().core.watts
    }
    pub(super) fn selection_copper(&self) -> f64 {
        self.worst_corner().copper.total
    }
}

/// What every candidate of one design shares.
pub(super) struct Ctx<'a> {
    pub(super) design: &'a Design,
    pub(super) core: &'a Core,
    pub(super) material: &'a Material,
    pub(super) prep: &'a Prepared,
    /// The design ratio Np/Ns1.
    pub(super) n: f64,
    /// The flyback's Lp estimate at the design ratio (each candidate then
    /// derives its own from its turns as wound).
    pub(super) lp: Option<f64>,
}

/// Builds at `np` or, where the gap cannot reach Lp (too little AL), at the
/// fewest turns above `np` that can.
pub(super) fn build_at_least(cx: &Ctx, np: u32, reason: &mut String) -> Result<Candidate> {
    match build(cx, np) {
        Err(e) if cx.lp.is_some() && e.field() == Some("gap.al") => {
            // AL ungapped = μ0·μi·Ae/le bounds the inductance per turn².
            let al_max = MU0 * cx.material.mu_i * cx.core.ae / cx.core.le;
            let np2 = ((cx.lp.unwrap_or(0.0) / al_max).sqrt() * 1.05).ceil() as u32;
            *reason = format!("turns raised to {np2} so the core's AL can give Lp");
            build(cx, np2.max(np + 1))
        }
        other => other,
    }
}

/// Step 4–6 for one primary turn count.
pub(super) fn build(cx: &Ctx, np: u32) -> Result<Candidate> {
    build_corners(cx, np, None)
}

/// [`build`] evaluating the losses at one corner only (`Some`) or both.
pub(super) fn build_corners(cx: &Ctx, np: u32, only: Option<Corner>) -> Result<Candidate> {
    build_with(cx, np, only, true)
}

/// [`build`] without the copper loss of the allocation by area, for a
/// candidate that goes straight to the least-loss search (which replaces
/// the allocation and evaluates its own): the same candidate as [`build`]
/// once [`ensure_copper`] has run, which the search does where it keeps
/// the allocation.
pub(super) fn build_for_search(cx: &Ctx, np: u32) -> Result<Candidate> {
    build_with(cx, np, None, false)
}

/// Evaluates the copper loss [`build_for_search`] left out, at each corner
/// the candidate holds, exactly as [`build`] would have.
pub(super) fn ensure_copper(cx: &Ctx, c: &mut Candidate) -> Result<()> {
    if c.copper_pending {
        corner_copper(cx, c)?;
    }
    Ok(())
}

/// The copper loss of the candidate's stack-up at each corner it holds, at
/// the selection temperature (the core loss does not depend on it).
fn corner_copper(cx: &Ctx, c: &mut Candidate) -> Result<()> {
    let spec = &cx.design.spec;
    let (t_sel, _, _) = selection_copper(spec, cx.material)?;
    let model = LossModel::from_fit(&c.stackup, &c.fit, t_sel)?;
    let opts = LossOptions {
        edge_time: cx.design.choices.edge_time,
        ..LossOptions::default()
    };
    for corner in &mut c.corners {
        let op = match corner.corner {
            Corner::VinMin => &c.waves.at_vin_min,
            Corner::VinMax => &c.waves.at_vin_max,
        };
        corner.copper = model.evaluate(&currents_of(spec.topology, op), &opts)?;
        corner.total = corner.copper.total + corner.core.watts;
    }
    c.copper_pending = false;
    Ok(())
}

fn build_with(cx: &Ctx, np: u32, only: Option<Corner>, copper: bool) -> Result<Candidate> {
    let (design, core, material, prep, n, lp) =
        (cx.design, cx.core, cx.material, cx.prep, cx.n, cx.lp);
    let spec = &design.spec;
    let ch = &design.choices;
    let secondaries = sizing::secondary_turns(spec, np, n)?;
    let reset = match spec.topology {
        Topology::Forward => Some(np.min(sizing::max_reset_turns(np, spec.duty_max)?)),
        _ => None,
    };
    let turns = Turns {
        primary: np,
        secondaries,
        reset,
    };
    let gcore = GapCore::from_core(core)?;
    // The flyback's Lp is taken from the turns as wound, so the ripple ratio
    // (and with it the mode) asked for holds at Vin min and full load after
    // rounding (`sizing::flyback_lp_as_wound`); `lp` was the estimate that
    // chose the turns. The inductor kind's target L does not depend on
    // turns and is kept.
    let lp = match lp {
        Some(_) if spec.topology == Topology::Flyback => Some(sizing::flyback_lp_as_wound(spec, &turns)?),
        other => other,
    };
    let (inductance, al, gap) = match lp {
        Some(l) => {
            let g = gap::solve_gap_for_inductance(
                &gcore,
                material.mu_i,
                l,
                np as f64,
                ch.gap_placement,
                true,
            )
            .map_err(|e| match e.field() {
                Some("al") | Some("inductance") => {
                    Error::infeasible(Some("gap.al"), e.message().to_string())
                }
                _ => e,
            })?;
            (g.inductance(np as f64), g.al, Some(g))
        }
        None => {
            let al = gap::al_value(
                &gcore,
                material.mu_i,
                core.residual_gap(),
                gap::GapPlacement::CentreLeg,
                false,
            )?;
            (al.inductance(np as f64), al.al, None)
        }
    };
    let waves = topology::worst_case(spec, &turns, Some(inductance), core.ae)?;
    let names = winding_names(&waves);
    let (t_sel, _, delta) = selection_copper(spec, material)?;
    let (stackup, fit, wires, winding_choice) = choose_stackup(design, core, &names, delta)?;
    let model = if copper { Some(LossModel::from_fit(&stackup, &fit, t_sel)?) } else { None };
    let opts = LossOptions {
        edge_time: ch.edge_time,
        ..LossOptions::default()
    };
    let mut corners = Vec::with_capacity(2);
    for (corner, op) in [
        (Corner::VinMin, &waves.at_vin_min),
        (Corner::VinMax, &waves.at_vin_max),
    ] {
        if only.is_some_and(|c| c != corner) {
            continue;
        }
        let copper = match &model {
            Some(m) => m.evaluate(&currents_of(spec.topology, op), &opts)?,
            None => LossReport {
                windings: Vec::new(),
                total: 0.0,
                harmonics: 0,
                tail_share: 0.0,
                converged: true,
                temperature: t_sel,
            },
        };
        let core_loss = loss::core_loss_with(&prep.igse, material, &op.flux, t_sel, core.ve)?;
        let total = copper.total + core_loss.watts;
        corners.push(CornerLosses {
            corner,
            core: core_loss,
            copper,
            total,
        });
    }
    Ok(Candidate {
        turns,
        inductance,
        al,
        gap,
        waves,
        stackup,
        fit,
        wires,
        winding_choice,
        corners,
        copper_pending: !copper,
    })
}

/// Each winding's name, turns and larger RMS current of the two corners.
fn winding_names(waves: &WorstCase) -> Vec<(String, u32, f64)> {
    waves
        .at_vin_min
        .windings
        .iter()
        .map(|w| {
            let other = waves
                .at_vin_max
                .windings
                .iter()
                .find(|x| x.name == w.name)
                .map_or(0.0, |x| x.rms);
            (w.name.clone(), w.turns, w.rms.max(other))
        })
        .collect()
}

/// The selection temperature, copper resistivity there and the skin depth
/// at the switching frequency. Losses for choosing are taken at the core
/// temperature limit, kept below the Curie temperature where the loss
/// model ends (the Curie check reports it).
fn selection_copper(spec: &topology::Spec, material: &Material) -> Result<(f64, f64, f64)> {
    let t_sel = spec.temperature_max.min(material.curie_c - 5.0);
    let rho = copper_resistivity(t_sel)?;
    let delta = (rho / (std::f64::consts::PI * spec.frequency * MU0)).sqrt();
    Ok((t_sel, rho, delta))
}

/// Step 5 once on the chosen turns: the least-loss conductor search
/// (`conductors::search_stackup`) replaces the trials' allocation by area,
/// and the copper loss of each corner the candidate holds is evaluated
/// again with it (the core loss does not depend on the conductors). The
/// conductors are chosen by their loss at the corner with the larger
/// primary RMS current. A candidate whose every conductor is fixed with no
/// interleaving or construction left to choose, or for which no set fits,
/// is returned as it is. `keep`: a winding
/// choice made by loss on other turns, whose automatic interleaving and
/// construction are kept.
pub(super) fn with_least_loss_conductors(cx: &Ctx, mut c: Candidate, keep: Option<&WindingChoice>) -> Result<Candidate> {
    let spec = &cx.design.spec;
    let (t_sel, rho, delta) = selection_copper(spec, cx.material)?;
    let waves = &c.waves;
    let (sel_op, sel_corner) = if waves.at_vin_max.windings.first().map_or(0.0, |w| w.rms)
        > waves.at_vin_min.windings.first().map_or(0.0, |w| w.rms)
    {
        (&waves.at_vin_max, Corner::VinMax)
    } else {
        (&waves.at_vin_min, Corner::VinMin)
    };
    let sel_currents = currents_of(spec.topology, sel_op);
    // The core loss of the corner the currents are taken at (the corners
    // are evaluated at the selection temperature).
    let other = c.corners.iter().find(|k| k.corner == sel_corner).map_or(0.0, |k| k.core.watts);
    let setting = LossSetting {
        currents: &sel_currents,
        temperature: t_sel,
        rho,
        other,
    };
    let names = winding_names(waves);
    let Some((stackup, fit, wires, winding_choice)) =
        search_stackup(cx.design, cx.core, &names, delta, &setting, keep, c.turns.primary)?
    else {
        ensure_copper(cx, &mut c)?;
        return Ok(c);
    };
    c.stackup = stackup;
    c.fit = fit;
    c.wires = wires;
    c.winding_choice = winding_choice;
    corner_copper(cx, &mut c)?;
    Ok(c)
}

/// The windings' currents in the loss model's dot convention: positive
/// where the winding's ampere-turns drive flux in the core's positive sense.
/// Forward-type secondaries oppose the primary; flyback secondaries carry
/// the stored MMF on in the same sense; a push-pull's B halves drive the
/// opposite sense of the A halves.
pub fn currents_of(topo: Topology, op: &topology::OperatingPoint) -> Vec<WindingCurrent> {
    op.windings
        .iter()
        .map(|w| {
            let sign = core_sense(topo, &w.name);
            WindingCurrent::new(&w.name, w.current.scaled(sign))
        })
        .collect()
}

/// +1 or −1: the sense in which winding `name` drives the core's flux
/// (see [`currents_of`]).
pub fn core_sense(topo: Topology, name: &str) -> f64 {
    let secondary = name.starts_with("secondary");
    let b_half = name.ends_with(" B");
    match topo {
        Topology::Flyback | Topology::Inductor => 1.0,
        Topology::Forward | Topology::TwoSwitchForward => {
            if secondary {
                -1.0
            } else {
                1.0
            }
        }
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge => {
            match (secondary, b_half) {
                (false, false) => 1.0,
                (false, true) => -1.0,
                (true, false) => -1.0,
                (true, true) => 1.0,
            }
        }
    }
}

#[cfg(test)]
mod tests {
    //! The shortcut of [`build_for_search`] (copper evaluated only where the
    //! search keeps the allocation by area) against the straightforward
    //! [`build`]: the same candidate, to the bit, once [`ensure_copper`] has
    //! run, and the same search result.
    use super::*;
    use crate::design::file::{WireChoice, WireOverride};

    fn designs() -> Vec<Design> {
        let mut fixed = Design::demo_forward();
        fixed.choices.wires = vec![
            WireOverride { winding: "primary".into(), wire: WireChoice::Round { awg: 22, parallel: 2 } },
            WireOverride { winding: "secondary 1".into(), wire: WireChoice::Round { awg: 24, parallel: 3 } },
            WireOverride { winding: "reset".into(), wire: WireChoice::Round { awg: 30, parallel: 1 } },
        ];
        let mut hot = Design::demo_push_pull();
        hot.spec.frequency *= 2.0;
        hot.choices.edge_time = 50e-9;
        vec![Design::demo_forward(), Design::demo_flyback(), Design::demo_push_pull(), fixed, hot]
    }

    #[test]
    fn deferred_copper_is_the_straightforward_build() {
        for d in designs() {
            let core = d.resolve_core().unwrap();
            let material = d.resolve_material().unwrap();
            let prep = Prepared::new(&material).unwrap();
            let n = sizing::turns_ratio(&d.spec).unwrap();
            let lp = match d.spec.topology {
                Topology::Flyback => Some(sizing::flyback_lp(&d.spec, n).unwrap()),
                _ => None,
            };
            let cx = Ctx { design: &d, core: &core, material: &material, prep: &prep, n, lp };
            let mut compared = 0;
            for np in 4..40 {
                let Ok(straight) = build(&cx, np) else { continue };
                let mut deferred = build_for_search(&cx, np).unwrap();
                assert!(deferred.copper_pending);
                ensure_copper(&cx, &mut deferred).unwrap();
                assert_eq!(format!("{straight:?}"), format!("{deferred:?}"), "{} at {np} turns", d.name);
                let a = with_least_loss_conductors(&cx, straight, None).unwrap();
                let b = with_least_loss_conductors(&cx, build_for_search(&cx, np).unwrap(), None).unwrap();
                assert_eq!(format!("{a:?}"), format!("{b:?}"), "{} at {np} turns, searched", d.name);
                compared += 1;
            }
            assert!(compared >= 5, "{}: only {compared} turn counts built", d.name);
        }
    }
}
