//! Sweeps: total loss against switching frequency, and against peak flux
//! density at a fixed frequency.
//!
//! The frequency sweep redesigns at every point (turns, gap, wire and
//! stack-up, thermal equilibrium) exactly as [`super::evaluate`] does, so
//! each point is a design the user could build. Points whose design fails
//! a check, or cannot be built at all, are marked infeasible with the reason.
//!
//! The flux sweep holds the frequency and steps the primary turns, which
//! steps ΔB ∝ 1/N; with the window filled, copper loss ∝ N², so the total
//! loss has its minimum near Pcore/Pcu = 2/β (Erickson & Maksimovic 2nd ed.
//! §15.3). The report gives that ratio at the minimum found.

mod as_wound;
mod envelope;
mod limit;
pub mod range;
mod run;

pub use as_wound::{as_wound, as_wound_design};
pub use envelope::{envelope, envelope_csv, Envelope, EnvelopePoint, EnvelopeSweep};
pub use limit::{LimitKind, MinimumLimit, Side};
pub use range::{frequency_band, Band};
pub use run::FrequencySweep;

use super::file::{Design, TurnsRule};
use super::solve::{evaluate_with, Prepared, Report};
use crate::error::{in_range, Error, Result};
use crate::material::Material;
use serde::Serialize;

/// Which question a sweep answers.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Curve {
    /// Redesigned at each frequency: turns, gap, wire and stack-up redone.
    Redesigned,
    /// This transformer as wound, at other frequencies: turns, conductors,
    /// stack-up (and a flyback's Lp) fixed, what a bench measurement shows.
    AsWound,
    /// Loss against peak flux density at the design's frequency.
    Flux,
}

/// What the swept variable is, and its unit (the x axis of a plot).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct XAxis {
    pub quantity: &'static str,
    pub unit: &'static str,
}

/// The frequency sweeps' x axis.
pub const FREQUENCY_AXIS: XAxis = XAxis { quantity: "switching frequency", unit: "Hz" };
/// The flux sweep's x axis.
pub const FLUX_AXIS: XAxis = XAxis { quantity: "peak flux density", unit: "T" };

/// Loss figures of one swept design, at its operating temperature.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PointValues {
    pub core: f64,
    pub copper_dc: f64,
    pub copper_ac_extra: f64,
    pub copper: f64,
    pub total: f64,
    pub temperature: f64,
    pub b_peak: f64,
    pub primary_turns: u32,
}

/// One point of a sweep.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SweepPoint {
    /// The swept variable (Hz for frequency, T for flux density).
    pub x: f64,
    /// Every check passes and the material's loss data hold here.
    pub feasible: bool,
    /// The material's loss data hold at this point: its `material_range`
    /// check passes (frequency and ΔB/2 within the band of
    /// [`crate::loss::range`]); where no design could be built, the
    /// frequency alone decides ([`range`]).
    pub in_data: bool,
    /// `None` where no design could be built.
    pub values: Option<PointValues>,
    /// Why the point is infeasible (empty when feasible).
    pub reason: String,
}

/// A sweep and its landmarks.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Sweep {
    pub curve: Curve,
    /// The swept variable's name and unit.
    pub x_axis: XAxis,
    /// The material's name and the frequency band of its loss data (the
    /// plot shades it; frequency sweeps only).
    pub material: String,
    pub band: Option<Band>,
    pub points: Vec<SweepPoint>,
    /// Index of the feasible point (checks pass, inside the material's
    /// data) with the least total loss.
    pub minimum: Option<usize>,
    /// What holds the minimum where it is, side by side: the next point has
    /// less loss but lies outside the data or fails a check, no design can
    /// be built there, or the minimum is an end of the sweep (empty where
    /// the loss rises on both sides; [`limit`]).
    pub minimum_limits: Vec<MinimumLimit>,
    /// Pcore/Pcu at the minimum, and 2/β for comparison (flux sweep).
    pub ratio_at_minimum: Option<f64>,
    pub two_over_beta: f64,
}

fn values_of(r: &Report) -> PointValues {
    PointValues {
        core: r.losses.core,
        copper_dc: r.losses.copper_dc,
        copper_ac_extra: r.losses.copper_ac_extra,
        copper: r.losses.copper,
        total: r.losses.total,
        temperature: r.thermal.temperature,
        b_peak: r.waveforms.get("b_peak").map_or(0.0, |w| w.value),
        primary_turns: r.turns.primary,
    }
}

/// One point from a design's report (or the error that stopped it): the
/// failed checks' labels and, where the material's data do not hold,
/// why, as the reason.
/// `frequency_x`: the point's frequency where `x` is one (the frequency
/// sweeps), so that a point with no design still says whether the data
/// would hold there.
fn point(x: f64, r: Result<Report>, material: &Material, frequency_x: Option<f64>) -> SweepPoint {
    match r {
        Ok(r) => {
            let failed: Vec<&str> = r.checks.iter().filter(|c| !c.pass).map(|c| c.label.as_str()).collect();
            let in_data = range::report_in_data(&r);
            SweepPoint { x, feasible: r.pass && in_data, in_data, values: Some(values_of(&r)), reason: failed.join("; ") }
        }
        Err(e) => SweepPoint {
            x,
            feasible: false,
            in_data: frequency_x.is_some_and(|f| range::frequency_in_data(material, f)),
            values: None,
            reason: e.message().to_string(),
        },
    }
}

fn landmarks(curve: Curve, points: Vec<SweepPoint>, material: &Material) -> Sweep {
    let beta = material.steinmetz.beta;
    let band = (curve != Curve::Flux).then(|| frequency_band(material));
    let minimum = points
        .iter()
        .enumerate()
        .filter(|(_, p)| p.feasible)
        .filter_map(|(i, p)| p.values.map(|v| (i, v.total)))
        .min_by(|a, b| a.1.total_cmp(&b.1))
        .map(|(i, _)| i);
    let ratio_at_minimum = minimum
        .and_then(|i| points[i].values)
        .filter(|v| v.copper > 0.0)
        .map(|v| v.core / v.copper);
    let x_axis = if curve == Curve::Flux { FLUX_AXIS } else { FREQUENCY_AXIS };
    let probes: Vec<limit::Probe> = points.iter().map(limit::Probe::from).collect();
    let minimum_limits = limit::minimum_limits(&probes, minimum, x_axis, if curve == Curve::Flux { &FLUX_ENDS } else { &limit::FREQUENCY_ENDS });
    Sweep {
        curve,
        x_axis,
        material: material.name.clone(),
        band,
        points,
        minimum,
        minimum_limits,
        ratio_at_minimum,
        two_over_beta: 2.0 / beta,
    }
}

/// The flux sweep's ends ([`flux`]): the most turns it tries below, and
/// above the flux-limited count, where the Bpk limit stops it.
const FLUX_ENDS: limit::Ends = [
    (
        LimitKind::SweepRange,
        "the least loss is at the most turns swept (four times the flux-limited count, {x}): it may lie at still more",
    ),
    (
        LimitKind::Checks,
        "the least loss is at the fewest turns within the Bpk limit ({x}): the saturation limit sets it, not the loss",
    ),
];

/// Log-spaced frequencies from `f_min` to `f_max`, `n` ≥ 2 points.
pub fn log_space(f_min: f64, f_max: f64, n: usize) -> Result<Vec<f64>> {
    in_range("sweep.f_min", f_min, 1e3, 20e6, "Hz")?;
    in_range("sweep.f_max", f_max, 1e3, 20e6, "Hz")?;
    if f_max <= f_min {
        return Err(Error::input("sweep.f_max", "must be above the lowest frequency"));
    }
    if !(2..=2000).contains(&n) {
        return Err(Error::input("sweep.points", "2 to 2000 points"));
    }
    let r = (f_max / f_min).ln();
    Ok((0..n).map(|i| f_min * (r * i as f64 / (n - 1) as f64).exp()).collect())
}

/// Total, core, DC and AC copper loss and temperature against switching
/// frequency, `n` log-spaced points from `f_min` to `f_max`: a
/// [`FrequencySweep`] of the redesigned curve, run to the end.
pub fn frequency(design: &Design, f_min: f64, f_max: f64, n: usize) -> Result<Sweep> {
    Ok(FrequencySweep::new(design, f_min, f_max, n, Curve::Redesigned)?.finish())
}

/// Loss against peak flux density at the design's frequency: primary turns
/// from the flux-limited count up to four times it (at most `n` distinct
/// integers), each a full design.
pub fn flux(design: &Design, n: usize) -> Result<Sweep> {
    design.check_envelope()?;
    if !(2..=400).contains(&n) {
        return Err(Error::input("sweep.points", "2 to 400 points"));
    }
    let core = design.resolve_core()?;
    let material = design.resolve_material()?;
    let prep = Prepared::new(&material)?;
    let mut d = design.clone();
    d.choices.turns = TurnsRule::FewestTurns;
    let base = evaluate_with(&d, &core, &material, &prep)?;
    let np0 = base.turns.primary.max(1);
    let mut turns: Vec<u32> = (0..n)
        .map(|i| (np0 as f64 * 4f64.powf(i as f64 / (n - 1) as f64)).round() as u32)
        .collect();
    turns.dedup();
    let mut points: Vec<SweepPoint> = turns
        .into_iter()
        .map(|np| {
            d.choices.turns = TurnsRule::Primary { turns: np };
            let r = evaluate_with(&d, &core, &material, &prep);
            let b = r.as_ref().ok().and_then(|r| r.waveforms.get("b_peak").map(|w| w.value)).unwrap_or(0.0);
            point(b, r, &material, None)
        })
        .collect();
    points.sort_by(|a, b| a.x.total_cmp(&b.x));
    Ok(landmarks(Curve::Flux, points, &material))
}

/// The sweep as CSV: one row per point, SI units in the header.
pub fn to_csv(s: &Sweep, x_name: &str) -> String {
    let mut out = format!(
        "{x_name},feasible,in_data,primary_turns,b_peak_T,core_W,copper_dc_W,copper_ac_extra_W,copper_W,total_W,temperature_C,reason\n"
    );
    for p in &s.points {
        match p.values {
            Some(v) => out.push_str(&format!(
                "{},{},{},{},{},{},{},{},{},{},{},\"{}\"\n",
                p.x,
                p.feasible,
                p.in_data,
                v.primary_turns,
                v.b_peak,
                v.core,
                v.copper_dc,
                v.copper_ac_extra,
                v.copper,
                v.total,
                v.temperature,
                p.reason.replace('"', "'")
            )),
            None => out.push_str(&format!("{},false,false,,,,,,,,,\"{}\"\n", p.x, p.reason.replace('"', "'"))),
        }
    }
    out
}
