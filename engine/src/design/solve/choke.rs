//! The output choke of forward, push-pull and bridge designs, designed as
//! a report of the inductor kind (`topology::inductor`) from the converter
//! as wound.
//!
//! * **What it sees.** The first output's choke is a buck whose input is
//!   the rectified secondary voltage less the rectifier drop:
//!   Vs = k·Vin·Ns1/Np (k = ½ for the half bridge, whose primary sees
//!   Vin/2; else 1) at the transformer's turns as wound, so its duty is
//!   the converter's (forward) or twice one switch's (push-pull and
//!   bridges). Its ripple frequency is fsw (forward) or 2·fsw (push-pull,
//!   bridges: two pulses per period). DC current = the output current.
//! * **Its inductance** follows the spec's `choke_ripple_ratio` at Vin
//!   max, the same ripple the transformer's secondary currents assume, so
//!   both designs describe one circuit.
//! * **Its core**: `choices.choke_core` when the user picks one; else a
//!   handful of library cores near the size the area product asks,
//!   Ap = Wa·Ae ≥ L·Ipk·Irms/(Bmax·J·Ku) (McLyman, Transformer and
//!   Inductor Design Handbook, inductor design with the area product;
//!   from memory), with J = 4 A/mm² a starting current density (common
//!   practice, no source) and Ku the design's window utilisation. From
//!   one size below that Ap, the next [`CANDIDATES`] cores (rings left
//!   out: a gapped ring is not the usual build) are designed in the
//!   converter's material and the passing one with the least total loss
//!   kept (if none passes, the next few sizes are tried).
//! * The converter report gets a `choke` check that passes only when the
//!   choke passes all of its own.

use super::checks::check;
use super::*;
use crate::core::library as cores;
use crate::design::file::{CoreChoice, Insulation};
use crate::topology::inductor::{self, Circuit, InductorOptions};
use crate::topology::{Input, Isolation};

/// Library cores designed per round of the automatic choice.
pub const CANDIDATES: usize = 5;
/// Rounds of [`CANDIDATES`] before giving up on a passing core.
const ROUNDS: usize = 3;
/// Starting current density of the area-product estimate, A/m² (common
/// practice, no source).
pub const J_START: f64 = 4e6;

/// The first output's choke as an inductor-kind spec, for a converter
/// `spec` wound with `turns` (`None` for the flyback and the inductor
/// kind, which have no output choke).
pub fn choke_spec(spec: &Spec, turns: &topology::Turns) -> Result<Option<Spec>> {
    let (k, f_mult, duty_mult) = match spec.topology {
        Topology::Forward | Topology::TwoSwitchForward => (1.0, 1.0, 1.0),
        Topology::PushPull | Topology::FullBridge => (1.0, 2.0, 2.0),
        Topology::HalfBridge => (0.5, 2.0, 2.0),
        Topology::Flyback | Topology::Inductor => return Ok(None),
    };
    let (Some(o), Some(&ns)) = (spec.outputs.first(), turns.secondaries.first()) else {
        return Ok(None);
    };
    let dc = spec.dc_range()?;
    let ratio = k * ns as f64 / turns.primary.max(1) as f64;
    let vs = |v: f64| ratio * v - o.rectifier_drop;
    let v1 = o.voltage + o.rectifier_drop;
    Ok(Some(Spec {
        topology: Topology::Inductor,
        input: Input::Dc {
            min: vs(dc.min),
            nominal: vs(dc.nominal),
            max: vs(dc.max),
        },
        outputs: vec![*o],
        frequency: f_mult * spec.frequency,
        duty_max: (duty_mult * spec.duty_max).min(1.0),
        // One output alone bounds the estimate by its own rectifier drop.
        efficiency: spec.efficiency.min(o.voltage / v1),
        ambient: spec.ambient,
        temperature_max: spec.temperature_max,
        isolation: Isolation::Functional,
        flyback: Default::default(),
        choke_ripple_ratio: spec.choke_ripple_ratio,
        inductor: Some(InductorOptions {
            circuit: Circuit::Buck,
            inductance: None,
        }),
    }))
}

/// The choke's design file for converter `design` wound with `turns`, on
/// `core` (the design's `choices.choke_core`, else the caller's pick).
pub fn choke_design(
    design: &Design,
    turns: &topology::Turns,
    core: CoreChoice,
) -> Result<Option<Design>> {
    let Some(spec) = choke_spec(&design.spec, turns)? else {
        return Ok(None);
    };
    let ch = &design.choices;
    let choices = Choices {
        saturation_margin: ch.saturation_margin,
        window_utilisation: ch.window_utilisation,
        edge_time: ch.edge_time,
        insulation: Insulation {
            margin: None,
            ..ch.insulation.clone()
        },
        ..Choices::default()
    };
    Ok(Some(Design {
        schema: design.schema.clone(),
        version: design.version,
        name: format!("{}: output choke", design.name),
        spec,
        core: ch.choke_core.clone().unwrap_or(core),
        material: design.material.clone(),
        choices,
    }))
}

/// Designs the choke of `r` (a converter report of `design`) and attaches
/// it with its `choke` check. Bad `choices.choke_core` input is an error
/// naming it; a choke that cannot be designed is a failing check.
pub(super) fn attach(
    design: &Design,
    material: &Material,
    prep: &Prepared,
    r: &mut Report,
) -> Result<()> {
    let placeholder = CoreChoice::Library {
        designation: String::new(),
    };
    let Some(d) = choke_design(design, &r.turns, placeholder)? else {
        return Ok(());
    };
    if design.spec.choke_ripple_ratio < 0.01 {
        r.warnings.push(
            "choke_ripple_ratio is below 0.01: the output choke is not designed".into(),
        );
        return Ok(());
    }
    let outcome = match &design.choices.choke_core {
        Some(_) => {
            let core = d.resolve_core().map_err(under_choke_core)?;
            evaluate_with(&d, &core, material, prep)
        }
        None => automatic(d, material, prep),
    };
    let choke = match outcome {
        Ok(c) => c,
        Err(e) => {
            let mut k = check(
                "choke",
                "Output choke",
                1.0,
                0.0,
                "",
                None,
                format!("the output choke could not be designed: {e}"),
            );
            k.tight = true;
            r.checks.push(k);
            r.pass = false;
            return Ok(());
        }
    };
    let tight = choke
        .checks
        .iter()
        .min_by(|a, b| a.margin.total_cmp(&b.margin));
    let m = tight.map_or(1.0, |k| k.margin);
    let mut k = check(
        "choke",
        "Output choke passes its own checks",
        1.0 - m,
        1.0,
        "",
        None,
        format!(
            "{}, {} turns, {:.1} µH; tightest: {} (margin {:.0} %)",
            choke.core.designation,
            choke.turns.primary,
            choke.inductance * 1e6,
            tight.map_or("none", |k| k.label.as_str()),
            m * 100.0
        ),
    );
    k.margin = m;
    k.pass = choke.pass;
    k.tight = !choke.pass || m < 0.1;
    r.checks.push(k);
    r.pass = r.pass && choke.pass;
    if design.spec.outputs.len() > 1 {
        r.warnings.push(
            "only the first output's choke is designed; size the other outputs' chokes likewise"
                .into(),
        );
    }
    r.choke = Some(Box::new(choke));
    Ok(())
}

/// Errors about the user's choke core, named by their path in the file.
fn under_choke_core(e: Error) -> Error {
    let rename = |f: &str| match f.strip_prefix("core") {
        Some(rest) => format!("choices.choke_core{rest}"),
        None => format!("choices.choke_core.{f}"),
    };
    match e {
        Error::Input { field, message } => Error::Input {
            field: rename(&field),
            message,
        },
        Error::Unknown { field, message } => Error::Unknown {
            field: rename(&field),
            message,
        },
        Error::Infeasible { field, message } => Error::Infeasible {
            field: Some(rename(field.as_deref().unwrap_or("core"))),
            message,
        },
        Error::Format { field, message } => Error::Format {
            field: Some(rename(field.as_deref().unwrap_or("core"))),
            message,
        },
    }
}

/// The library cores in order of area product Wa·Ae, rings left out.
fn by_area_product() -> Vec<&'static Core> {
    let mut v: Vec<&Core> = cores::all().iter().filter(|c| !c.is_one_piece()).collect();
    v.sort_by(|a, b| (a.ae * a.window_area).total_cmp(&(b.ae * b.window_area)));
    v
}

/// The area product the choke asks, m⁴ (module docs).
pub fn area_product(spec: &Spec, material: &Material, ch: &Choices) -> Result<f64> {
    let l = inductor::target_inductance(spec)?;
    let ipk = inductor::peak_current(spec, l)?;
    let dc = spec.dc_range()?;
    let s = inductor::state(spec, dc.max);
    let di = inductor::ripple(spec, dc.max, l);
    // RMS of DC plus a triangle of peak-to-peak ΔI: √(I² + ΔI²/12).
    let irms = (s.i_dc * s.i_dc + di * di / 12.0).sqrt();
    let b = material.bsat_at(spec.temperature_max) * (1.0 - ch.saturation_margin);
    Ok(l * ipk * irms / (b * J_START * ch.window_utilisation))
}

/// The automatic choice (module docs).
fn automatic(mut d: Design, material: &Material, prep: &Prepared) -> Result<Report> {
    let ap = area_product(&d.spec, material, &d.choices)?;
    let list = by_area_product();
    let start = list
        .iter()
        .position(|c| c.ae * c.window_area >= ap)
        .unwrap_or(list.len().saturating_sub(CANDIDATES))
        .saturating_sub(1);
    // The cores are compared with the conductors allocated by area (quick);
    // the least-loss conductor search then runs once, on the core chosen.
    let mut best: Option<(Report, &Core)> = None;
    let mut fallback: Option<(Report, &Core)> = None;
    let mut last_err = None;
    for round in 0..ROUNDS {
        let from = start + round * CANDIDATES;
        for &core in list.iter().skip(from).take(CANDIDATES) {
            d.core = CoreChoice::Library {
                designation: core.designation.clone(),
            };
            match solve(&d, core, material, prep, Conductors::ByArea) {
                Ok(r) if r.pass => {
                    if best.as_ref().is_none_or(|b| r.losses.total < b.0.losses.total) {
                        best = Some((r, core));
                    }
                }
                Ok(r) => {
                    if fallback.as_ref().is_none_or(|b| r.losses.total < b.0.losses.total) {
                        fallback = Some((r, core));
                    }
                }
                Err(e) => last_err = Some(e),
            }
        }
        if best.is_some() {
            break;
        }
    }
    let mut searched = |(quick, core): (Report, &Core)| -> Report {
        d.core = CoreChoice::Library {
            designation: core.designation.clone(),
        };
        match evaluate_with(&d, core, material, prep) {
            Ok(r) if r.pass || !quick.pass => r,
            _ => quick,
        }
    };
    let best = best.map(&mut searched);
    let fallback = if best.is_none() { fallback.map(&mut searched) } else { None };
    match (best, fallback) {
        (Some(r), _) => Ok(r),
        (None, Some(mut r)) => {
            r.warnings.push(
                "no library core near the area product passes every check: this is the least-loss one tried; \
                 pick a larger core in choices.choke_core"
                    .into(),
            );
            Ok(r)
        }
        (None, None) => Err(last_err.unwrap_or_else(|| {
            Error::infeasible(Some("choices.choke_core"), "no library core could be tried")
        })),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The choke's spec reproduces the converter's own choke ripple: at Vin
    /// max ΔI = r·Io with L from the ratio, and the choke's duty at Vin min
    /// is the converter's (forward) or twice one switch's (push-pull).
    #[test]
    fn choke_sees_the_converter_as_wound() {
        for d in [Design::demo_forward(), Design::demo_push_pull()] {
            let r = evaluate(&d).unwrap();
            let c = r.choke.as_ref().expect("a choke");
            assert_eq!(c.topology, Topology::Inductor);
            let io = d.spec.outputs[0].current;
            let di = |op: &topology::OperatingPoint| op.windings[0].peak - op.windings[0].current.min();
            assert!((di(&c.waveforms.at_vin_max) - d.spec.choke_ripple_ratio * io).abs() < 1e-6 * io);
            let mult = if d.spec.topology == Topology::PushPull { 2.0 } else { 1.0 };
            assert!((c.waveforms.at_vin_min.duty - mult * r.waveforms.at_vin_min.duty).abs() < 1e-9);
            assert!((c.waveforms.at_vin_min.windings[0].mean - io).abs() < 1e-9);
            assert_eq!(c.frequency, mult * d.spec.frequency);
            // The choke's on-time current ripple equals the secondary's.
            let sec = r.waveforms.at_vin_max.windings.iter().find(|w| w.name.starts_with("secondary")).unwrap();
            assert!((sec.peak - c.waveforms.at_vin_max.windings[0].peak).abs() < 1e-6 * io);
            assert!(r.checks.iter().any(|k| k.key == "choke"));
            assert_eq!(r.pass, r.pass && c.pass);
        }
        let f = evaluate(&Design::demo_flyback()).unwrap();
        assert!(f.choke.is_none() && !f.checks.iter().any(|k| k.key == "choke"));
    }

    #[test]
    fn a_picked_choke_core_is_used_and_errors_name_it() {
        let mut d = Design::demo_forward();
        d.choices.choke_core = Some(CoreChoice::Library {
            designation: "ETD 39".into(),
        });
        let r = evaluate(&d).unwrap();
        assert_eq!(r.choke.as_ref().unwrap().core.designation, "ETD 39");
        d.choices.choke_core = Some(CoreChoice::Library {
            designation: "nope".into(),
        });
        assert_eq!(
            evaluate(&d).unwrap_err().field(),
            Some("choices.choke_core")
        );
    }
}
