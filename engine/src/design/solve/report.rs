//! The report's types: what the solver found, every intermediate quantity included.

use crate::design::file::Construction;
use crate::core::Core;
use crate::gap::{self, GapAl};
use crate::loss::CoreLoss;
use crate::material::Material;
use crate::thermal::Equilibrium;
use crate::topology::{Corner, DcRange, Mode, Topology, Turns, WorstCase};
use crate::winding::fit::FitReport;
use crate::winding::loss::LossReport;
use crate::winding::stackup::StackUp;
use serde::Serialize;

/// One pass/fail figure.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Check {
    /// Key: "saturation", "temperature", "window", "duty", "switch_voltage",
    /// "curie", "loss_budget", "material_range", "mode" (flyback),
    /// "magnetising" (push-pull and bridges).
    pub key: String,
    pub label: String,
    pub value: f64,
    pub limit: f64,
    pub unit: String,
    /// (limit − value)/limit: positive passes, negative fails by that
    /// fraction. For a temperature (unit °C) the share of the allowed rise
    /// left, (limit − T)/(limit − ambient).
    pub margin: f64,
    pub pass: bool,
    /// Tight: failing, the tightest passing check, or passing with under
    /// 10 % margin (for a temperature, 10 % of the allowed rise; see `margin`).
    pub tight: bool,
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
    /// The conductors the least-loss search weighed for this winding, the
    /// chosen one first (empty when fixed or allocated by area).
    pub trials: Vec<super::ConductorTrial>,
    /// Why this conductor.
    pub reason: String,
}

/// One interleaving the search evaluated.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PatternTrial {
    /// As in `choices.interleave`: "sequential", "split_primary", ...
    pub interleave: String,
    /// As in `choices.insulation.construction` where reinforced insulation
    /// is built ("triple_insulated", "margin_wound"), else `None`.
    pub construction: Option<Construction>,
    /// Copper loss with its least-loss conductors, W (selection temperature
    /// and corner; where weighed again at the least-loss turns, the copper
    /// of the design it gave, at its worse corner).
    pub copper_loss: f64,
    /// The primary turns it was weighed at: the design's, or the flux
    /// limit's where the least-loss turns are more (solver step 3: the
    /// interleavings are weighed there first, then those within
    /// `REWEIGH_BAND` of the least again at the design's turns).
    pub primary_turns: u32,
}

/// How the windings were ordered.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct WindingChoice {
    /// The interleaving used, as in `choices.interleave`.
    pub interleave: String,
    /// Chosen by loss (`choices.interleave` = auto).
    pub automatic: bool,
    /// The reinforced insulation's construction where it is built
    /// ("triple_insulated", "margin_wound"; chosen by loss when
    /// `choices.insulation.construction` = auto), else `None`.
    pub construction: Option<Construction>,
    /// The interleavings (and constructions) evaluated, each at the primary
    /// turns it was weighed at (first those of the flux-limited turns where
    /// the design has more).
    pub tried: Vec<PatternTrial>,
}

/// The flyback's conduction mode at one line corner, full load, as wound.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ConductionCorner {
    pub corner: Corner,
    /// DC input at the corner, V.
    pub vin: f64,
    pub mode: Mode,
    /// Ripple ratio in the sense of `spec.flyback.ripple_ratio`: ΔIp/Ic in
    /// CCM, 2 at the boundary, 2·Lb/Lp above it (DCM).
    pub ripple_ratio: f64,
}

/// The flyback's conduction mode: asked for and as wound at each corner.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Conduction {
    /// The mode the spec's ripple ratio asks for at Vin min, full load.
    pub requested: Mode,
    pub requested_ripple_ratio: f64,
    /// Vin min, then Vin max.
    pub corners: Vec<ConductionCorner>,
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
    pub bpk_limit: f64,
    /// Primary (flyback) or magnetising inductance, H.
    pub inductance: f64,
    /// AL of the core as wound, H/turn²: the gap's for a flyback, else the
    /// mated halves' with the residual gap.
    pub al: f64,
    /// The flyback's gap; `None` for an ungapped core.
    pub gap: Option<GapAl>,
    pub gap_placement: gap::GapPlacement,
    pub waveforms: WorstCase,
    /// Flyback: the conduction mode asked for and as wound at each corner
    /// (`None` for the other topologies).
    pub conduction: Option<Conduction>,
    pub wires: Vec<WireSummary>,
    /// The interleaving and how it was chosen.
    pub winding_choice: WindingChoice,
    pub stackup: StackUp,
    /// The stack-up in its JSON schema (what the page exports); filled by
    /// [`evaluate`], empty from [`evaluate_with`].
    pub stackup_json: String,
    pub fit: FitReport,
    /// Leakage inductance referred to the primary, H (`None` with one winding).
    pub leakage: Option<f64>,
    /// The leakage spike and its clamp (`None` with one winding): a
    /// converter loss, not part of `losses`.
    pub clamp: Option<crate::design::clamp::Clamp>,
    /// Losses at both corners at the core temperature limit (selection), and the
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
    /// Forward, push-pull and bridges: the first output's choke, designed
    /// as a report of the inductor kind (`design::solve::choke`); filled by
    /// [`evaluate`] only. Left out when absent.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub choke: Option<Box<Report>>,
}
