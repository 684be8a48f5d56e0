//! The design solver: a [`Design`] in, a worst-case-checked [`Report`] out.
//!
//! Steps, each from the module named:
//!
//! 1. **Turns ratio** from the output and the duty limit at Vin min
//!    (`topology::sizing::turns_ratio`, Erickson & Maksimovic 2nd ed. §6.3).
//! 2. **Primary turns from the flux limit** N = λ/(ΔB·Ae), λ the worst-corner
//!    volt-seconds (forward: unipolar, ΔB = Bpk; push-pull and bridges:
//!    bipolar, ΔB = 2·Bpk); flyback Np = Lp·Ipk/(Bpk·Ae), Lp from the ripple
//!    ratio. The Bpk limit is Bsat at the hot-spot limit less the
//!    saturation margin unless the user sets one, and it applies to the flux
//!    density in the smallest section Amin (Bpk·Ae/Amin where Amin < Ae).
//! 3. **Least loss** (the default rule): with the window filled, copper loss
//!    goes as N² ∝ ΔB⁻² and core loss as ΔB^β, so total loss is least where
//!    Pcore/Pcu = 2/β (Erickson & Maksimovic 2nd ed. §15.3, the ΔB that
//!    minimises total loss). From a first design at the flux limit the swing
//!    is scaled by (2·Pcu/(β·Pcore))^(1/(β+2)); the nearest integer turns at
//!    or above the flux-limited count are evaluated and the lower loss kept.
//! 4. **Gap** (flyback): the gap that gives Lp with Np turns, fringing by
//!    McLyman's factor (`gap::solve_gap_for_inductance`). Forward and
//!    push-pull cores are ungapped: their magnetising inductance uses a
//!    residual gap of 10 µm per mated pair (common practice, from memory).
//! 5. **Wire**: window area shared between windings in proportion to their
//!    ampere-turns N·Irms, A_k = α_k·Ku·Wa/N_k (Erickson & Maksimovic 2nd ed.
//!    §15.1.4, optimal allocation of window area); each area realised as one
//!    round wire if its diameter is at most 2δ, else parallel wires of ≤ 2δ,
//!    foil for windings of three turns or fewer, litz of strands ≤ δ beyond
//!    (common practice, no source). If the stack-up does not fit, Ku is
//!    lowered by 20 % and the wire chosen again, up to six times.
//! 6. **Losses** at both line corners: iGSE core loss of the real B(t)
//!    (`loss`), harmonic Dowell copper loss of the real currents (`winding`).
//! 7. **Thermal equilibrium** at the corner with the larger total loss
//!    (`thermal`): core loss follows its temperature factor, copper its
//!    resistivity; the copper model is rebuilt at each outer step.
//! 8. **Checks**: saturation at the equilibrium temperature, hot-spot
//!    temperature, window build, duty, switch voltage; each with its margin,
//!    the ones that bind marked.

use super::file::{Choices, Design, Interleave, TurnsRule, WireChoice};
use crate::core::Core;
use crate::error::{Error, Result};
use crate::gap::{self, GapAl, GapCore};
use crate::loss::{self, CoreLoss, IgseCoefficients};
use crate::material::Material;
use crate::thermal::{self, Equilibrium};
use crate::topology::{self, sizing, Corner, DcRange, Isolation, Spec, Topology, Turns, WorstCase};
use crate::winding::conductor::{Conductor, Grade};
use crate::winding::dowell::MU0;
use crate::winding::fit::{fit, FitReport};
use crate::winding::leakage::leakage;
use crate::winding::loss::{LossModel, LossOptions, LossReport, WindingCurrent};
use crate::winding::stackup::{default_stackup, to_json, DefaultOptions, Item, Pattern, StackUp, Tape, WindingSpec};
use crate::winding::wire::{awg_diameter, copper_resistivity};
use serde::Serialize;

/// Residual gap of a mated, ungapped core pair, m (common practice, from memory).
pub const RESIDUAL_GAP: f64 = 10e-6;

/// One pass/fail figure.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Check {
    /// Key: "saturation", "temperature", "window", "duty", "switch_voltage", "curie".
    pub key: String,
    pub label: String,
    pub value: f64,
    pub limit: f64,
    pub unit: String,
    /// (limit − value)/limit: positive passes, negative fails by that fraction.
    pub margin: f64,
    pub pass: bool,
    /// The tightest passing checks and every failing one.
    pub binding: bool,
    /// Line corner the value belongs to, where it depends on the line.
    pub corner: Option<Corner>,
    pub note: String,
}

/// The conductor chosen for one winding.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct WireSummary {
    pub winding: String,
    pub turns: u32,
    pub conductor: String,
    pub parallel: u32,
    /// Copper area per turn, m².
    pub copper_area: f64,
    /// Worst-corner RMS current, A, and its current density, A/m².
    pub rms_current: f64,
    pub current_density: f64,
    /// Chosen automatically (false: the user fixed it).
    pub automatic: bool,
}

/// Losses at one corner and one temperature.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CornerLosses {
    pub corner: Corner,
    pub core: CoreLoss,
    pub copper: LossReport,
    pub total: f64,
}

/// Loss totals at the operating (equilibrium) temperature, W.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Losses {
    pub core: f64,
    pub copper_dc: f64,
    /// Copper loss above the DC part (skin and proximity), W.
    pub copper_ac_extra: f64,
    pub copper: f64,
    pub total: f64,
}

/// Power flow, W.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Power {
    pub output: f64,
    /// Pout/η as the spec estimates it.
    pub input: f64,
    /// The magnetic's share of the input power lost.
    pub magnetic_loss: f64,
    /// Pout/(Pout + magnetic loss).
    pub magnetic_efficiency: f64,
}

/// Everything the solver found, every intermediate quantity included.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Report {
    pub name: String,
    pub topology: Topology,
    pub dc: DcRange,
    pub frequency: f64,
    pub core: Core,
    pub material: Material,
    pub turns: Turns,
    /// Np/Ns1 as wound.
    pub turns_ratio: f64,
    /// Why Np is what it is.
    pub turns_reason: String,
    /// The Bpk limit used for the turns, T.
    pub b_limit: f64,
    /// Primary (flyback) or magnetising inductance, H.
    pub inductance: f64,
    /// AL of the core as wound, H/turn²: the gap's for a flyback, else the
    /// mated halves' with the residual gap.
    pub al: f64,
    /// The flyback's gap; `None` for an ungapped core.
    pub gap: Option<GapAl>,
    pub gap_placement: gap::GapPlacement,
    pub waveforms: WorstCase,
    pub wires: Vec<WireSummary>,
    pub stackup: StackUp,
    /// The stack-up in its JSON schema (what the page exports); filled by
    /// [`evaluate`], empty from [`evaluate_with`].
    pub stackup_json: String,
    pub fit: FitReport,
    /// Leakage inductance referred to the primary, H (`None` with one winding).
    pub leakage: Option<f64>,
    /// Losses at both corners at the hot-spot limit (selection), and the
    /// corner whose total is larger.
    pub corners: Vec<CornerLosses>,
    pub loss_corner: Corner,
    pub thermal: Equilibrium,
    /// Losses at the equilibrium temperature, at the loss corner.
    pub operating: CornerLosses,
    pub losses: Losses,
    pub power: Power,
    pub checks: Vec<Check>,
    /// Every check passes.
    pub pass: bool,
    pub cautions: Vec<String>,
    pub warnings: Vec<String>,
}

/// Evaluates a design file.
pub fn evaluate(design: &Design) -> Result<Report> {
    design.check_envelope()?;
    let core = design.resolve_core()?;
    let material = design.resolve_material()?;
    let mut r = evaluate_with(design, &core, &material, &Prepared::new(&material)?)?;
    r.stackup_json = to_json(&r.stackup);
    Ok(r)
}

/// What depends only on the material and is reused across a sweep.
#[derive(Debug, Clone)]
pub struct Prepared {
    pub igse: IgseCoefficients,
}

impl Prepared {
    pub fn new(material: &Material) -> Result<Prepared> {
        Ok(Prepared { igse: IgseCoefficients::from_material(material)? })
    }
}

/// [`evaluate`] with the core, material and iGSE coefficients already
/// resolved (sweeps and the optimiser call this).
pub fn evaluate_with(design: &Design, core: &Core, material: &Material, prep: &Prepared) -> Result<Report> {
    let spec = &design.spec;
    spec.validate()?;
    check_choices(&design.choices)?;
    let ch = &design.choices;
    let n = sizing::turns_ratio(spec)?;
    let b_auto = material.bsat_at(spec.hot_spot_max) * (1.0 - ch.saturation_margin);
    let b_limit = ch.b_max.unwrap_or(b_auto);
    let lp_target = if spec.topology == Topology::Flyback { Some(sizing::flyback_lp(spec, n)?) } else { None };
    let cx = Ctx { design, core, material, prep, n, lp: lp_target };

    // Saturation is decided where the flux crowds most: the smallest
    // section Amin (IEC 60205 defines it for this), not the effective Ae,
    // whenever Amin < Ae (common practice, no source). Core loss uses Ae, Ve.
    let sat_scale = sat_scale(core);
    let np_flux = flux_limited_turns(spec, n, lp_target, b_limit, core.ae / sat_scale)?;
    let mut reason = format!("fewest turns within Bpk ≤ {:.0} mT", b_limit * 1e3);
    let first = match &ch.turns {
        TurnsRule::Primary { turns } => {
            reason = "primary turns fixed by the user".into();
            build(&cx, *turns)?
        }
        _ => {
            let mut c = build_at_least(&cx, np_flux, &mut reason)?;
            // Rounding the secondaries up lowers the ratio as wound, which for a
            // flyback raises the peak current: add turns until Bpk as wound is
            // within the limit.
            for _ in 0..8 {
                let b = c.waves.get("b_peak").map_or(0.0, |w| w.value) * sat_scale;
                if b <= b_limit * (1.0 + 1e-9) || c.turns.primary >= topology::MAX_TURNS {
                    break;
                }
                let np = c.turns.primary + 1;
                c = build(&cx, np)?;
                reason = format!("fewest turns within Bpk ≤ {:.0} mT as wound", b_limit * 1e3);
            }
            c
        }
    };
    let mut best = first;
    if ch.turns == TurnsRule::LeastLoss {
        let (pc, pcu) = (best.selection_core(), best.selection_copper());
        let beta = material.steinmetz.beta;
        if pc > 0.0 && pcu > 0.0 {
            // ΔB ∝ 1/N: N* = N·(β·Pcore/(2·Pcu))^(1/(β+2)).
            let scale = (beta * pc / (2.0 * pcu)).powf(1.0 / (beta + 2.0));
            let np0 = best.turns.primary;
            let target = np0 as f64 * scale;
            if target > np0 as f64 + 0.5 {
                let lo = (target.floor() as u32).max(np0 + 1);
                let mut tried = Vec::with_capacity(2);
                for np in [lo, lo + 1] {
                    if np > topology::MAX_TURNS {
                        continue;
                    }
                    let corner = Some(best.worst_corner().corner);
                    if let Ok(c) = build_corners(&cx, np, corner) {
                        tried.push(c);
                    }
                }
                for c in tried {
                    if c.selection_total() < best.selection_total() {
                        best = c;
                        reason = format!(
                            "least loss: more turns than the flux limit's {np0} so Pcore/Pcu ≈ 2/β (β = {beta:.2})"
                        );
                    }
                }
            }
        }
    }
    finish(design, core, material, prep, best, n, b_limit, reason)
}

/// Ae/Amin where the smallest section is narrower than Ae (1 otherwise, as
/// for a ring, whose IEC Ae is below its physical section).
pub fn sat_scale(core: &Core) -> f64 {
    if core.amin > 0.0 && core.amin < core.ae {
        core.ae / core.amin
    } else {
        1.0
    }
}

fn check_choices(ch: &Choices) -> Result<()> {
    crate::error::in_range("choices.saturation_margin", ch.saturation_margin, 0.0, 0.9, "")?;
    if let Some(b) = ch.b_max {
        crate::error::in_range("choices.b_max", b, 0.001, 2.0, "T")?;
    }
    crate::error::in_range("choices.window_utilisation", ch.window_utilisation, 0.02, 0.8, "")?;
    crate::error::in_range("choices.edge_time", ch.edge_time, 0.0, 10e-6, "s")?;
    let ins = &ch.insulation;
    crate::error::in_range("choices.insulation.tape_thickness", ins.tape_thickness, 1e-6, 1e-3, "m")?;
    for (f, w) in [("section_wraps", ins.section_wraps), ("outer_wraps", ins.outer_wraps), ("interlayer_wraps", ins.interlayer_wraps)] {
        if w > 20 {
            return Err(Error::input(&format!("choices.insulation.{f}"), "at most 20 wraps"));
        }
    }
    if let Some(m) = ins.margin {
        crate::error::in_range("choices.insulation.margin", m, 0.0, 20e-3, "m")?;
    }
    if let Some(v) = ch.switch_voltage_rating {
        crate::error::in_range("choices.switch_voltage_rating", v, 1.0, 10e3, "V")?;
    }
    if let TurnsRule::Primary { turns } = ch.turns {
        if turns == 0 || turns > topology::MAX_TURNS {
            return Err(Error::input("choices.turns.turns", format!("must be 1 to {} turns", topology::MAX_TURNS)));
        }
    }
    Ok(())
}

/// Primary turns from the flux limit (step 2 of the module docs).
fn flux_limited_turns(spec: &Spec, n: f64, lp: Option<f64>, b_limit: f64, ae: f64) -> Result<u32> {
    match spec.topology {
        Topology::Flyback => {
            let lp = lp.ok_or_else(|| Error::input("lp", "the flyback needs Lp"))?;
            let dc = spec.dc_range()?;
            let ipk = sizing::flyback_peak_current(spec, n, lp, dc.min)?.max(sizing::flyback_peak_current(spec, n, lp, dc.max)?);
            sizing::flyback_primary_turns(lp, ipk, b_limit, ae)
        }
        Topology::Forward | Topology::TwoSwitchForward => {
            sizing::primary_turns_for_flux(sizing::volt_seconds(spec, n, None)?.worst, b_limit, ae)
        }
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge => {
            sizing::primary_turns_for_flux(sizing::volt_seconds(spec, n, None)?.worst, 2.0 * b_limit, ae)
        }
    }
}

/// A design built with given primary turns, losses at the selection temperature.
#[derive(Debug, Clone)]
struct Candidate {
    turns: Turns,
    inductance: f64,
    al: f64,
    gap: Option<GapAl>,
    waves: WorstCase,
    stackup: StackUp,
    fit: FitReport,
    wires: Vec<WireSummary>,
    corners: Vec<CornerLosses>,
}

impl Candidate {
    fn worst_corner(&self) -> &CornerLosses {
        // `corners` holds one or two entries (see `build_corners`).
        let mut w = &self.corners[0];
        for c in &self.corners[1..] {
            if c.total > w.total {
                w = c;
            }
        }
        w
    }
    fn selection_total(&self) -> f64 {
        self.worst_corner().total
    }
    fn selection_core(&self) -> f64 {
        self.worst_corner().core.watts
    }
    fn selection_copper(&self) -> f64 {
        self.worst_corner().copper.total
    }
}

/// What every candidate of one design shares.
struct Ctx<'a> {
    design: &'a Design,
    core: &'a Core,
    material: &'a Material,
    prep: &'a Prepared,
    /// The design ratio Np/Ns1.
    n: f64,
    /// The flyback's target Lp.
    lp: Option<f64>,
}

/// Builds at `np` or, where the gap cannot reach Lp (too little AL), at the
/// fewest turns above `np` that can.
fn build_at_least(cx: &Ctx, np: u32, reason: &mut String) -> Result<Candidate> {
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
fn build(cx: &Ctx, np: u32) -> Result<Candidate> {
    build_corners(cx, np, None)
}

/// [`build`] evaluating the losses at one corner only (`Some`) or both.
fn build_corners(cx: &Ctx, np: u32, only: Option<Corner>) -> Result<Candidate> {
    let (design, core, material, prep, n, lp) = (cx.design, cx.core, cx.material, cx.prep, cx.n, cx.lp);
    let spec = &design.spec;
    let ch = &design.choices;
    let secondaries = sizing::secondary_turns(spec, np, n)?;
    let reset = match spec.topology {
        Topology::Forward => Some(np.min(sizing::max_reset_turns(np, spec.duty_max)?)),
        _ => None,
    };
    let turns = Turns { primary: np, secondaries, reset };
    let gcore = GapCore::from_core(core)?;
    let (inductance, al, gap) = match lp {
        Some(l) => {
            let g = gap::solve_gap_for_inductance(&gcore, material.mu_i, l, np as f64, ch.gap_placement, true)
                .map_err(|e| match e.field() {
                    Some("al") | Some("inductance") => Error::infeasible(Some("gap.al"), e.message().to_string()),
                    _ => e,
                })?;
            (g.inductance(np as f64), g.al, Some(g))
        }
        None => {
            let al = gap::al_value(&gcore, material.mu_i, RESIDUAL_GAP, gap::GapPlacement::CentreLeg, false)?;
            (al.inductance(np as f64), al.al, None)
        }
    };
    let waves = topology::worst_case(spec, &turns, Some(inductance), core.ae)?;
    let names: Vec<(String, u32, f64)> = waves
        .at_vin_min
        .windings
        .iter()
        .map(|w| {
            let other = waves.at_vin_max.windings.iter().find(|x| x.name == w.name).map_or(0.0, |x| x.rms);
            (w.name.clone(), w.turns, w.rms.max(other))
        })
        .collect();
    // Losses for choosing are taken at the hot-spot limit, kept below the
    // Curie temperature where the loss model ends (the Curie check reports it).
    let t_sel = spec.hot_spot_max.min(material.curie_c - 5.0);
    let rho = copper_resistivity(t_sel)?;
    let delta = (rho / (std::f64::consts::PI * spec.frequency * MU0)).sqrt();
    let (stackup, fit, wires) = choose_stackup(design, core, &names, delta)?;
    let model = LossModel::from_fit(&stackup, &fit, t_sel)?;
    let opts = LossOptions { edge_time: ch.edge_time, ..LossOptions::default() };
    let mut corners = Vec::with_capacity(2);
    for (corner, op) in [(Corner::VinMin, &waves.at_vin_min), (Corner::VinMax, &waves.at_vin_max)] {
        if only.is_some_and(|c| c != corner) {
            continue;
        }
        let currents = currents_of(spec.topology, op);
        let copper = model.evaluate(&currents, &opts)?;
        let core_loss = loss::core_loss_with(&prep.igse, material, &op.flux, t_sel, core.ve)?;
        let total = copper.total + core_loss.watts;
        corners.push(CornerLosses { corner, core: core_loss, copper, total });
    }
    Ok(Candidate { turns, inductance, al, gap, waves, stackup, fit, wires, corners })
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
        Topology::Flyback => 1.0,
        Topology::Forward | Topology::TwoSwitchForward => {
            if secondary {
                -1.0
            } else {
                1.0
            }
        }
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge => match (secondary, b_half) {
            (false, false) => 1.0,
            (false, true) => -1.0,
            (true, false) => -1.0,
            (true, true) => 1.0,
        },
    }
}

/// Step 5: conductors and the stack-up.
fn choose_stackup(
    design: &Design,
    core: &Core,
    windings: &[(String, u32, f64)],
    delta: f64,
) -> Result<(StackUp, FitReport, Vec<WireSummary>)> {
    let spec = &design.spec;
    let ch = &design.choices;
    for o in &ch.wires {
        if !windings.iter().any(|w| w.0 == o.winding) {
            let names: Vec<&str> = windings.iter().map(|w| w.0.as_str()).collect();
            return Err(Error::input(
                "choices.wires",
                format!("no winding \"{}\" in this design (windings: {})", o.winding, names.join(", ")),
            ));
        }
    }
    let hazardous = !spec.safety_cautions().is_empty();
    let ins = &ch.insulation;
    let margin = ins.margin.unwrap_or(match (spec.isolation, hazardous) {
        // Margin tape at each flange so the creepage path between primary
        // and secondary crosses two margins (common practice, from memory;
        // the standard's creepage table for the working voltage decides).
        (Isolation::Basic, true) => 2.0e-3,
        (Isolation::Reinforced, true) => 3.0e-3,
        _ => 0.0,
    });
    let tape = |wraps: u32| Tape { material: "polyester film".into(), thickness: ins.tape_thickness, wraps };
    let section_wraps = if spec.isolation == Isolation::Reinforced && hazardous { ins.section_wraps.max(3) } else { ins.section_wraps };
    let opts = DefaultOptions {
        section_tape: tape(section_wraps.max(1)),
        outer_tape: tape(ins.outer_wraps.max(1)),
        interlayer: (ins.interlayer_wraps > 0).then(|| tape(ins.interlayer_wraps)),
        margin,
    };
    if core.winding_breadth - 2.0 * margin <= 0.5e-3 {
        return Err(Error::infeasible(
            Some("choices.insulation.margin"),
            format!("{:.1} mm margins leave no winding breadth on this bobbin", margin * 1e3),
        ));
    }
    let pattern = match ch.interleave {
        Interleave::Sequential => Pattern::Sequential,
        Interleave::SplitPrimary => Pattern::SplitPrimary,
        Interleave::SplitSecondaries => Pattern::SplitSecondaries,
        Interleave::Custom => Pattern::Custom(custom_order(&ch.section_order, windings)?),
        Interleave::Auto => {
            let centre_tapped = windings.iter().any(|w| w.0.ends_with(" A"));
            if windings.len() >= 2 && !centre_tapped && windings[0].1 >= 2 {
                Pattern::SplitPrimary
            } else {
                Pattern::Sequential
            }
        }
    };
    let at_sum: f64 = windings.iter().map(|w| w.1 as f64 * w.2).sum();
    let breadth = core.winding_breadth - 2.0 * margin;
    let tiw_secondaries = spec.isolation == Isolation::Reinforced && hazardous;
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
                    let share = if at_sum > 0.0 { *turns as f64 * rms / at_sum } else { 1.0 / windings.len() as f64 };
                    let area = (share * ku * core.window_area / *turns as f64).max(1e-9);
                    let tiw = tiw_secondaries && name.starts_with("secondary");
                    auto_conductor(area, *turns, delta, breadth, tiw, share < 0.05)?
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
            });
            specs.push(WindingSpec { name: name.clone(), turns: *turns, conductor, parallel });
        }
        let built = default_stackup(core, &specs, &pattern, &opts).and_then(|mut st| {
            // Foil turns need a film between them.
            for it in &mut st.items {
                if let Item::Section(sec) = it {
                    if sec.conductor.is_foil() && sec.interlayer.is_none() {
                        sec.interlayer = Some(Tape { material: "polyester film".into(), thickness: FOIL_FILM, wraps: 1 });
                    }
                }
            }
            fit(core, &st).map(|f| (st, f))
        });
        match built {
            Ok((st, f)) => return Ok((st, f, wires)),
            Err(e) if e.field() == Some("pattern") => {
                return Err(Error::infeasible(Some("choices.section_order"), e.message().to_string()))
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
    Err(Error::infeasible(Some("core"), format!("the windings do not fit this core's window: {}", e.message())))
}

/// A custom section order as (winding index, turns), bobbin outward:
/// sections without turns share their winding's remaining turns equally
/// (the first ones take the odd turns).
fn custom_order(order: &[super::file::SectionTurns], windings: &[(String, u32, f64)]) -> Result<Vec<(usize, u32)>> {
    if order.is_empty() {
        return Err(Error::input("choices.section_order", "a custom order needs its sections, bobbin outward"));
    }
    let mut out = Vec::with_capacity(order.len());
    for (k, s) in order.iter().enumerate() {
        let i = windings.iter().position(|w| w.0 == s.winding).ok_or_else(|| {
            let names: Vec<&str> = windings.iter().map(|w| w.0.as_str()).collect();
            Error::input(
                &format!("choices.section_order[{k}].winding"),
                format!("no winding \"{}\" in this design (windings: {})", s.winding, names.join(", ")),
            )
        })?;
        out.push((i, s.turns.unwrap_or(0)));
    }
    for (i, (name, total, _)) in windings.iter().enumerate() {
        let fixed: u64 = order.iter().zip(&out).filter(|(_, o)| o.0 == i).filter_map(|(s, _)| s.turns).map(u64::from).sum();
        let shared: Vec<usize> = (0..order.len()).filter(|&k| out[k].0 == i && order[k].turns.is_none()).collect();
        let has_any = out.iter().any(|o| o.0 == i);
        if !has_any {
            return Err(Error::input("choices.section_order", format!("the winding \"{name}\" has no section in the order")));
        }
        let total = u64::from(*total);
        if fixed > total || (shared.is_empty() && fixed != total) {
            return Err(Error::infeasible(
                Some("choices.section_order"),
                format!("the sections of \"{name}\" hold {fixed} turns but the design gives it {total}"),
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
fn awg_not_above(d: f64) -> i32 {
    let n = 36.0 - 39.0 * (d / 0.127e-3).ln() / 92f64.ln();
    (n - 1e-9).ceil().clamp(8.0, 46.0) as i32
}

/// Realises a copper area (step 5 of the module docs): one round wire when
/// its diameter is at most 2δ; otherwise the candidate with the least radial
/// build among parallel round wires of at most 2δ, foil (eight turns or
/// fewer) and litz of strands at most δ; one wire of at most 2δ for a
/// `minor` winding (under 5 % of the ampere-turns). Common practice, no source.
fn auto_conductor(area: f64, turns: u32, delta: f64, breadth: f64, tiw: bool, minor: bool) -> Result<(Conductor, u32)> {
    let d_need = (4.0 * area / std::f64::consts::PI).sqrt();
    let d_max = (2.0 * delta).max(0.1e-3);
    let round_of = |d: f64| -> Result<Conductor> {
        let bare = awg_diameter(awg_not_above(d))?;
        if tiw {
            // Triple-insulated: about 0.2 mm over the bare diameter (from memory).
            Conductor::triple_insulated(bare, bare + 0.2e-3)
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
    let par = (area / a_strand).ceil().clamp(1.0, 40.0) as u32;
    let d_par = (4.0 * area / (std::f64::consts::PI * par as f64)).sqrt().min(d_max);
    options.push((round_of(d_par)?, par));
    if !tiw {
        if turns <= 8 {
            let t = ((area / breadth).clamp(0.03e-3, d_max) * 1e5).round() / 1e5;
            options.push((Conductor::foil(t.max(0.03e-3), breadth)?, 1));
        }
        // Litz of strands no thicker than δ (AWG 30..46).
        let g = awg_not_above(delta).max(30);
        let ds = awg_diameter(g)?;
        let strands = (area / (std::f64::consts::PI * ds * ds / 4.0)).ceil().clamp(2.0, 2000.0) as u32;
        options.push((Conductor::litz(strands, ds, Grade::G1, 0.65, 0.03e-3)?, 1));
    }
    options
        .into_iter()
        .min_by(|a, b| build(&a.0, a.1).total_cmp(&build(&b.0, b.1)))
        .ok_or_else(|| Error::infeasible(None, "no conductor realises the copper area"))
}

/// Insulating film wound between foil turns, m (common practice, no source).
const FOIL_FILM: f64 = 0.025e-3;

fn fixed_conductor(w: &WireChoice, breadth: f64) -> Result<(Conductor, u32)> {
    let par = |p: u32| -> Result<u32> {
        if p == 0 || p > 100 {
            return Err(Error::input("choices.wires.parallel", "1 to 100 conductors in hand"));
        }
        Ok(p)
    };
    Ok(match *w {
        WireChoice::Round { awg, parallel } => (Conductor::awg(awg, Grade::G2)?, par(parallel)?),
        WireChoice::Litz { strands, strand_awg } => {
            if strands == 0 || strands > 10_000 {
                return Err(Error::input("choices.wires.strands", "1 to 10000 strands"));
            }
            (Conductor::litz(strands, awg_diameter(strand_awg)?, Grade::G1, 0.65, 0.03e-3)?, 1)
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

/// Steps 7–8.
#[allow(clippy::too_many_arguments)]
fn finish(
    design: &Design,
    core: &Core,
    material: &Material,
    prep: &Prepared,
    c: Candidate,
    n_design: f64,
    b_limit: f64,
    reason: String,
) -> Result<Report> {
    let spec = &design.spec;
    let ch = &design.choices;
    let loss_corner = c.worst_corner().corner;
    let op = match loss_corner {
        Corner::VinMin => &c.waves.at_vin_min,
        Corner::VinMax => &c.waves.at_vin_max,
    };
    let currents = currents_of(spec.topology, op);
    let opts = LossOptions { edge_time: ch.edge_time, ..LossOptions::default() };
    let sel = c.worst_corner();
    let core_pv_ref = sel.core.pv_reference;
    let core_at = |t: f64| core_pv_ref * material.temp_factor.at(t) * core.ve;
    // Copper between exact evaluations: the DC part scales with ρ(T), the
    // part above DC with √ρ(T) (Dowell's large-Δ limit, Rac ∝ ρ/δ ∝ √ρ).
    // Anchored at an exact evaluation; re-anchored at the equilibrium until
    // it moves less than 0.5 K (at most three anchors).
    let ceiling = (material.curie_c).min(250.0).max(spec.ambient + 1.0);
    let mut t_k = spec.hot_spot_max.min(material.curie_c - 5.0).clamp(-60.0, 250.0);
    let mut anchor = sel.copper.clone();
    let mut history = Vec::new();
    let mut iterations = 0;
    let mut thermal = None;
    let mut copper = anchor.clone();
    for pass in 0..3 {
        let dc: f64 = anchor.windings.iter().map(|w| w.dc_loss).sum();
        let extra = (anchor.total - dc).max(0.0);
        let rho_k = copper_resistivity(t_k)?;
        let e = thermal::equilibrium(spec.ambient, core.surface_area, ceiling, |t| {
            let r = copper_resistivity(t.clamp(-60.0, 250.0))? / rho_k;
            Ok(core_at(t) + dc * r + extra * r.sqrt())
        })?;
        iterations += e.iterations;
        history.extend_from_slice(&e.history);
        let moved = (e.temperature - t_k).abs();
        let runaway = e.runaway;
        t_k = e.temperature.min(250.0);
        thermal = Some(e);
        copper = LossModel::from_fit(&c.stackup, &c.fit, t_k)?.evaluate(&currents, &opts)?;
        anchor = copper.clone();
        if runaway || moved < 0.5 || pass == 2 {
            break;
        }
    }
    let mut thermal = thermal.ok_or_else(|| Error::infeasible(None, "thermal iteration did not run"))?;
    thermal.iterations = iterations;
    thermal.history = history;
    let t_op = thermal.temperature;
    // In runaway the iteration stops at the Curie temperature, where the
    // loss model is undefined: report the loss just below it.
    let t_loss = if thermal.runaway { t_op.min(material.curie_c - 1.0) } else { t_op };
    let core_loss = loss::core_loss_with(&prep.igse, material, &op.flux, t_loss, core.ve)?;
    let copper_dc: f64 = copper.windings.iter().map(|w| w.dc_loss).sum();
    let losses = Losses {
        core: core_loss.watts,
        copper_dc,
        copper_ac_extra: (copper.total - copper_dc).max(0.0),
        copper: copper.total,
        total: core_loss.watts + copper.total,
    };
    thermal.loss = losses.total;
    let operating = CornerLosses { corner: loss_corner, total: losses.total, core: core_loss, copper };

    let output = spec.output_power();
    let power = Power {
        output,
        input: spec.input_power(),
        magnetic_loss: losses.total,
        magnetic_efficiency: output / (output + losses.total),
    };

    // Checks.
    let mut checks = Vec::new();
    let b_pk = c.waves.get("b_peak").map_or(0.0, |w| w.value) * sat_scale(core);
    let b_corner = c.waves.get("b_peak").map(|w| w.corner);
    let b_sat = material.bsat_at(t_op);
    let b_allowed = b_sat * (1.0 - ch.saturation_margin);
    checks.push(check(
        "saturation",
        "Bpk (in Amin) against Bsat at temperature",
        b_pk,
        b_allowed,
        "T",
        b_corner,
        format!("Bsat {:.0} mT at {:.0} °C less {:.0} % margin", b_sat * 1e3, t_op, ch.saturation_margin * 100.0),
    ));
    let mut t_check = check(
        "temperature",
        "Hot-spot temperature",
        t_op,
        spec.hot_spot_max,
        "°C",
        Some(loss_corner),
        format!("rise {:.1} K over {:.0} °C ambient", thermal.rise, spec.ambient),
    );
    if thermal.runaway {
        t_check.pass = false;
        t_check.margin = t_check.margin.min(-0.01);
        t_check.note = "thermal runaway: no equilibrium below the Curie temperature".into();
    }
    checks.push(t_check);
    checks.push(check(
        "window",
        "Winding build against bobbin height",
        c.fit.total_build,
        c.fit.available_build,
        "m",
        None,
        format!("copper fill {:.0} % of the window", c.fit.fill_factor * 100.0),
    ));
    let duty = c.waves.get("duty").map_or(0.0, |w| w.value);
    let mut duty_limit = spec.duty_max;
    if let Some(nr) = c.turns.reset {
        duty_limit = duty_limit.min(sizing::forward_duty_limit(c.turns.primary, nr));
    }
    checks.push(check("duty", "Duty", duty, duty_limit, "", c.waves.get("duty").map(|w| w.corner), String::new()));
    let v_sw = c.waves.get("switch_voltage").map_or(0.0, |w| w.value);
    if let Some(rating) = ch.switch_voltage_rating {
        checks.push(check(
            "switch_voltage",
            "Switch off-state voltage",
            v_sw,
            rating,
            "V",
            c.waves.get("switch_voltage").map(|w| w.corner),
            "flat top only: add the leakage spike".into(),
        ));
    }
    checks.push(check("curie", "Temperature below Curie", t_op, material.curie_c - 20.0, "°C", None, "20 K below the Curie temperature".into()));
    let min_margin = checks.iter().filter(|k| k.pass).map(|k| k.margin).fold(f64::INFINITY, f64::min);
    for k in &mut checks {
        k.binding = !k.pass || (k.margin - min_margin).abs() < 1e-12 || k.margin < 0.1;
    }
    let pass = checks.iter().all(|k| k.pass);

    let mut warnings: Vec<String> = Vec::new();
    for w in c.waves.at_vin_min.warnings.iter().chain(c.waves.at_vin_max.warnings.iter()) {
        if !warnings.contains(w) {
            warnings.push(w.clone());
        }
    }
    for w in operating.core.warnings.iter().map(|w| w.message()) {
        if !warnings.contains(&w) {
            warnings.push(w);
        }
    }
    if ch.b_max.is_some_and(|b| b > material.bsat_at(spec.hot_spot_max) * (1.0 - ch.saturation_margin)) {
        warnings.push("the Bpk limit you set is above Bsat at the hot-spot limit less the margin".into());
    }
    if !operating.copper.converged {
        warnings.push("the copper-loss harmonic sum reached its harmonic limit before 0.1 % convergence".into());
    }
    let leakage = if c.stackup.windings.len() >= 2 {
        let reference = c.stackup.windings.first().map(|w| w.name.clone()).unwrap_or_default();
        leakage(core, &c.stackup, &reference).ok()
    } else {
        None
    };
    // Filled in by `evaluate` (sweeps and the optimiser do not need it).
    let stackup_json = String::new();
    let n_actual = c.turns.primary as f64 / c.turns.secondaries.first().copied().unwrap_or(1).max(1) as f64;
    let _ = n_design;
    Ok(Report {
        name: design.name.clone(),
        topology: spec.topology,
        dc: c.waves.dc,
        frequency: spec.frequency,
        core: core.clone(),
        material: material.clone(),
        turns: c.turns,
        turns_ratio: n_actual,
        turns_reason: reason,
        b_limit,
        inductance: c.inductance,
        al: c.al,
        gap: c.gap,
        gap_placement: ch.gap_placement,
        waveforms: c.waves,
        wires: c.wires,
        stackup: c.stackup,
        stackup_json,
        fit: c.fit,
        leakage,
        corners: c.corners,
        loss_corner,
        thermal,
        operating,
        losses,
        power,
        checks,
        pass,
        cautions: spec.safety_cautions(),
        warnings,
    })
}

fn check(key: &str, label: &str, value: f64, limit: f64, unit: &str, corner: Option<Corner>, note: String) -> Check {
    let margin = if limit != 0.0 { (limit - value) / limit.abs() } else { -value.signum() };
    Check {
        key: key.into(),
        label: label.into(),
        value,
        limit,
        unit: unit.into(),
        margin,
        pass: value <= limit,
        binding: false,
        corner,
        note,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::file::{CoreChoice, TurnsRule};

    fn finite(r: &Report) {
        let v = serde_json::to_value(r).expect("report serialises");
        fn walk(v: &serde_json::Value, path: &str) {
            match v {
                serde_json::Value::Number(n) => assert!(n.as_f64().is_some_and(f64::is_finite), "{path}"),
                serde_json::Value::Array(a) => a.iter().enumerate().for_each(|(i, x)| walk(x, &format!("{path}[{i}]"))),
                serde_json::Value::Object(o) => o.iter().for_each(|(k, x)| walk(x, &format!("{path}.{k}"))),
                serde_json::Value::Null => {}
                _ => {}
            }
        }
        walk(&v, "report");
    }

    #[test]
    fn the_three_demos_pass_with_finite_reports() {
        for d in [Design::demo_forward(), Design::demo_flyback(), Design::demo_push_pull()] {
            let r = evaluate(&d).unwrap_or_else(|e| panic!("{}: {e}", d.name));
            assert!(r.pass, "{}: {:?}", d.name, r.checks.iter().filter(|c| !c.pass).collect::<Vec<_>>());
            finite(&r);
            assert!(r.losses.total > 0.0 && r.losses.core > 0.0 && r.losses.copper > 0.0);
            assert!(r.operating.copper.windings.iter().all(|w| w.fr >= 1.0 - 1e-9));
            // The operating temperature is the thermal fixed point of the
            // reported loss (McLyman's relation) within the iteration's 0.5 K.
            let rise = thermal::rise(r.losses.total, r.core.surface_area).unwrap();
            assert!((d.spec.ambient + rise - r.thermal.temperature).abs() < 1.0, "{}", d.name);
        }
    }

    #[test]
    fn least_loss_is_not_worse_than_fewest_turns() {
        for d in [Design::demo_forward(), Design::demo_flyback(), Design::demo_push_pull()] {
            let mut few = d.clone();
            few.choices.turns = TurnsRule::FewestTurns;
            let a = evaluate(&d).unwrap();
            let b = evaluate(&few).unwrap();
            assert!(a.turns.primary >= b.turns.primary);
            assert!(a.corners.iter().map(|c| c.total).fold(0.0, f64::max) <= b.corners.iter().map(|c| c.total).fold(0.0, f64::max) * 1.0001);
        }
    }

    #[test]
    fn flyback_gap_gives_the_inductance() {
        let r = evaluate(&Design::demo_flyback()).unwrap();
        let g = r.gap.as_ref().expect("a flyback is gapped");
        // L = AL·N² (AL definition) with the solved gap.
        assert!((g.al * (r.turns.primary as f64).powi(2) - r.inductance).abs() < 1e-9 * r.inductance);
        assert!(g.gap > 0.0 && g.gap < r.core.window_height);
        assert_eq!(r.al, g.al);
        // Ungapped: L = AL·N² with the residual gap's AL (AL definition).
        let f = evaluate(&Design::demo_forward()).unwrap();
        assert!((f.al * (f.turns.primary as f64).powi(2) - f.inductance).abs() < 1e-12 * f.inductance);
    }

    #[test]
    fn errors_name_their_field() {
        let mut d = Design::demo_forward();
        d.core = CoreChoice::Library { designation: "nope".into() };
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("core"));
        let mut d = Design::demo_forward();
        d.choices.saturation_margin = 2.0;
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("choices.saturation_margin"));
        let mut d = Design::demo_forward();
        d.version = 7;
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("version"));
        let mut d = Design::demo_forward();
        d.spec.frequency = f64::NAN;
        assert!(evaluate(&d).unwrap_err().field().is_some());
    }

    #[test]
    fn custom_order_shares_turns_and_names_errors() {
        use crate::design::file::{Interleave, SectionTurns};
        let st = |w: &str, t: Option<u32>| SectionTurns { winding: w.into(), turns: t };
        let mut d = Design::demo_forward();
        d.choices.interleave = Interleave::Custom;
        d.choices.section_order =
            vec![st("primary", None), st("secondary 1", None), st("reset", None), st("primary", None)];
        let r = evaluate(&d).unwrap();
        let secs: Vec<(String, u32)> = r.stackup.sections().map(|(_, s)| (s.winding.clone(), s.turns)).collect();
        let np = r.turns.primary;
        assert_eq!(secs.first().unwrap(), &("primary".to_string(), np.div_ceil(2)));
        assert_eq!(secs.last().unwrap(), &("primary".to_string(), np / 2));
        assert_eq!(secs.len(), 4);
        // The same as the built-in P-S-P order.
        let mut psp = Design::demo_forward();
        psp.choices.interleave = Interleave::SplitPrimary;
        assert!((evaluate(&psp).unwrap().losses.total - r.losses.total).abs() < 1e-12);
        d.choices.section_order = vec![st("primary", None), st("secondary 9", None)];
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("choices.section_order[1].winding"));
        d.choices.section_order = vec![st("primary", None), st("secondary 1", None)];
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("choices.section_order"), "reset has no section");
        d.choices.section_order = vec![st("primary", Some(1)), st("secondary 1", None), st("reset", None)];
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("choices.section_order"));
    }

    #[test]
    fn design_file_round_trips_exactly() {
        for d in [Design::demo_forward(), Design::demo_flyback(), Design::demo_push_pull()] {
            let back = Design::from_json(&d.to_json()).unwrap();
            assert_eq!(back, d);
        }
        let e = Design::from_json(r#"{"schema":"magwright-design","version":1,"spec":{}}"#).unwrap_err();
        assert!(e.field().is_some_and(|f| f.starts_with("spec")), "{e}");
        assert!(Design::from_json("{\"hello\": 1}").is_err());
    }
}
