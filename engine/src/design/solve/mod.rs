//! The design solver: a [`Design`] in, a worst-case-checked [`Report`] out.
//!
//! Steps, each from the module named:
//!
//! 1. **Turns ratio** from the output and the duty limit at Vin min
//!    (`topology::sizing::turns_ratio`, Erickson & Maksimovic 2nd ed. §6.3).
//! 2. **Primary turns from the flux limit** N = λ/(ΔB·Ae), λ the worst-corner
//!    volt-seconds (forward: unipolar, ΔB = Bpk; push-pull and bridges:
//!    bipolar, ΔB = 2·Bpk); flyback Np = Lp·Ipk/(Bpk·Ae), Lp from the ripple
//!    ratio. The Bpk limit is Bsat at the core temperature limit less the
//!    saturation margin unless the user sets one, and it applies to the flux
//!    density in the smallest section Amin (Bpk·Ae/Amin where Amin < Ae).
//! 3. **Least loss** (the default rule): with the window filled, copper loss
//!    goes as N² ∝ ΔB⁻² and core loss as ΔB^β, so total loss is least where
//!    Pcore/Pcu = 2/β (Erickson & Maksimovic 2nd ed. §15.3, the ΔB that
//!    minimises total loss). From a first design at the flux limit (with its
//!    least-loss conductors, step 5) the swing is scaled by
//!    (2·Pcu/(β·Pcore))^(1/(β+2)) to a start; from there the turns move one
//!    at a time to the neighbour whose searched design loses less, and the
//!    least is kept where it beats the first; its interleavings within 5 %
//!    at the flux limit's turns are weighed again (`least_loss`).
//! 4. **Gap** (flyback): the gap that gives Lp with Np turns, fringing by
//!    McLyman's factor (`gap::solve_gap_for_inductance`). Forward and
//!    push-pull cores are ungapped: their magnetising inductance uses a
//!    residual gap of 10 µm per mated pair (common practice, from memory);
//!    a one-piece core (a ring) has no mating faces and no residual gap.
//! 5. **Wire**: in every turn-count trial of steps 2–3 the window area is
//!    shared between windings in proportion to their ampere-turns N·Irms,
//!    A_k = α_k·Ku·Wa/N_k (Erickson & Maksimovic 2nd ed. §15.1.4, optimal
//!    allocation of window area); each area realised as one round wire if
//!    its diameter is at most 2δ, else at most `choices.max_parallel`
//!    parallel wires of ≤ 2δ, foil for windings of eight turns or fewer,
//!    litz of strands ≤ δ, whichever builds least (common practice, no
//!    source). If the stack-up does not fit, Ku is lowered by 20 % and the
//!    wire chosen again, up to six times. Then, once on the chosen turns,
//!    the least-loss search (`conductors::search`: Hurley, Gath & Breslin
//!    2000 and Sullivan 1999 starting points, a quick screen, the harmonic
//!    model deciding) replaces the automatic conductors and, when
//!    automatic, the interleaving; the window fit and every check judge
//!    the searched stack-up.
//! 6. **Losses** at both line corners: iGSE core loss of the real B(t)
//!    (`loss`), harmonic Dowell copper loss of the real currents (`winding`).
//! 7. **Thermal equilibrium** at the corner with the larger total loss
//!    (`thermal`): core loss follows its temperature factor, copper its
//!    resistivity; the copper model is rebuilt at each outer step.
//! 8. **Checks**: saturation at the equilibrium temperature, core
//!    temperature, window build, duty, switch voltage, Curie, the loss
//!    budget (energy balance against `choices.magnetic_loss_share`) and the
//!    material data range (`loss::range`); each with its margin, the ones
//!    that bind marked.

mod balance;
mod candidate;
mod checks;
mod choke;
mod conductors;
pub(crate) use conductors::fixed_conductor;
mod finish;
mod least_loss;
pub use least_loss::REWEIGH_BAND;
pub mod mode;
mod report;
mod warnings;

use crate::core::Core;
use crate::design::file::{Choices, Design, TurnsRule};
use crate::error::{Error, Result};
use crate::loss::IgseCoefficients;
use crate::material::Material;
use crate::topology::{self, sizing, Spec, Topology};
use crate::winding::stackup::to_json;
use candidate::*;
pub use candidate::{core_sense, currents_of};
pub use choke::{choke_design, choke_spec};
use conductors::*;
pub use conductors::{ConductorKind, ConductorTrial, ROUND_COARSEST_AWG, SIMPLER_SHARE, SIMPLER_TOTAL_SHARE, TIW_COARSEST_AWG};
pub use report::*;

/// Residual gap of a mated, ungapped core pair, m (common practice, from
/// memory); one-piece cores have none ([`Core::residual_gap`]).
pub const RESIDUAL_GAP: f64 = crate::core::RESIDUAL_GAP;

/// Evaluates a design file.
pub fn evaluate(design: &Design) -> Result<Report> {
    design.check_envelope()?;
    let core = design.resolve_core()?;
    let material = design.resolve_material()?;
    let prep = Prepared::new(&material)?;
    let mut r = evaluate_with(design, &core, &material, &prep)?;
    r.stackup_json = to_json(&r.stackup);
    // The output choke is designed once per evaluation (sweeps and the
    // optimiser, which call `evaluate_with`, skip it).
    choke::attach(design, &material, &prep, &mut r)?;
    Ok(r)
}

/// What depends only on the material and is reused across a sweep.
#[derive(Debug, Clone)]
pub struct Prepared {
    pub igse: IgseCoefficients,
}

impl Prepared {
    pub fn new(material: &Material) -> Result<Prepared> {
        Ok(Prepared {
            igse: IgseCoefficients::from_material(material)?,
        })
    }
}

/// [`evaluate`] with the core, material and iGSE coefficients already
/// resolved (sweeps and the optimiser call this).
pub fn evaluate_with(
    design: &Design,
    core: &Core,
    material: &Material,
    prep: &Prepared,
) -> Result<Report> {
    solve(design, core, material, prep, Conductors::LeastLoss)
}

/// How the automatic conductors of the final turns are chosen.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(super) enum Conductors {
    /// The least-loss search (step 5), once on the chosen turns.
    LeastLoss,
    /// The turn-count trials' allocation by area only: a quick comparison
    /// of several cores (the output choke's), the search then run on the
    /// one chosen.
    ByArea,
}

/// Steps 1–8 (module docs).
pub(super) fn solve(
    design: &Design,
    core: &Core,
    material: &Material,
    prep: &Prepared,
    conductors: Conductors,
) -> Result<Report> {
    let spec = &design.spec;
    spec.validate()?;
    check_choices(&design.choices)?;
    check_temperature_limit(spec, material)?;
    let ch = &design.choices;
    let n = sizing::turns_ratio(spec)?;
    let b_auto = material.bsat_at(spec.temperature_max) * (1.0 - ch.saturation_margin);
    let b_limit = ch.bpk_limit.unwrap_or(b_auto);
    let lp_target = match spec.topology {
        Topology::Flyback => Some(sizing::flyback_lp(spec, n)?),
        Topology::Inductor => Some(topology::inductor::target_inductance(spec)?),
        _ => None,
    };
    let cx = Ctx {
        design,
        core,
        material,
        prep,
        n,
        lp: lp_target,
    };

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
    // The least-loss conductors are searched on the flux-limited turns; the
    // turn-count trials below keep the conductors allocated by area, their
    // copper loss scaled by what the search saved here (`k`), and the one
    // they choose is searched in its turn.
    let area_copper = first.selection_copper();
    let search = |c: Candidate, keep: Option<&WindingChoice>| match conductors {
        Conductors::LeastLoss => with_least_loss_conductors(&cx, c, keep),
        Conductors::ByArea => Ok(c),
    };
    let mut best = search(first, None)?;
    let k = if area_copper > 0.0 { best.selection_copper() / area_copper } else { 1.0 };
    if ch.turns == TurnsRule::LeastLoss {
        best = least_loss::least_loss_turns(&cx, best, k, conductors, &mut reason)?;
    }
    finish::finish(design, core, material, prep, best, n, b_limit, reason)
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

pub(crate) fn check_choices(ch: &Choices) -> Result<()> {
    crate::error::in_range(
        "choices.saturation_margin",
        ch.saturation_margin,
        0.0,
        0.9,
        "",
    )?;
    if let Some(b) = ch.bpk_limit {
        crate::error::in_range("choices.bpk_limit", b, 0.001, 2.0, "T")?;
    }
    crate::error::in_range(
        "choices.window_utilisation",
        ch.window_utilisation,
        0.02,
        0.8,
        "",
    )?;
    crate::error::in_range("choices.edge_time", ch.edge_time, 0.0, 10e-6, "s")?;
    let ins = &ch.insulation;
    crate::error::in_range(
        "choices.insulation.tape_thickness",
        ins.tape_thickness,
        1e-6,
        1e-3,
        "m",
    )?;
    for (f, w) in [
        ("section_wraps", ins.section_wraps),
        ("outer_wraps", ins.outer_wraps),
        ("interlayer_wraps", ins.interlayer_wraps),
    ] {
        if w > 20 {
            return Err(Error::input(
                &format!("choices.insulation.{f}"),
                "at most 20 wraps",
            ));
        }
    }
    if let Some(m) = ins.margin {
        crate::error::in_range("choices.insulation.margin", m, 0.0, 20e-3, "m")?;
    }
    if ch.max_parallel == 0 || ch.max_parallel > 20 {
        return Err(Error::input(
            "choices.max_parallel",
            "1 to 20 round wires in hand (beyond it the search uses litz or foil)",
        ));
    }
    if let Some(v) = ch.clamp_voltage {
        crate::error::in_range("choices.clamp_voltage", v, 1.0, 10e3, "V")?;
    }
    crate::error::in_range(
        "choices.magnetic_loss_share",
        ch.magnetic_loss_share,
        0.01,
        1.0,
        "(share of Pin − Pout)",
    )?;
    if let Some(v) = ch.switch_voltage_rating {
        crate::error::in_range("choices.switch_voltage_rating", v, 1.0, 10e3, "V")?;
    }
    if let TurnsRule::Primary { turns } = ch.turns {
        if turns == 0 || turns > topology::MAX_TURNS {
            return Err(Error::input(
                "choices.turns.turns",
                format!("must be 1 to {} turns", topology::MAX_TURNS),
            ));
        }
    }
    Ok(())
}

/// The core temperature limit must lie below the material's Curie temperature:
/// at the Curie point a ferrite stops being ferrimagnetic (μ → 1, Bsat → 0),
/// so no design can be judged there (common practice, no source). The
/// `curie` check then keeps the operating temperature 20 K below it.
fn check_temperature_limit(spec: &Spec, material: &Material) -> Result<()> {
    if spec.temperature_max >= material.curie_c {
        return Err(Error::input(
            "spec.temperature_max",
            format!(
                "{:.0} °C is at or above the Curie temperature of {} ({:.0} °C), where the ferrite stops being magnetic: \
                 lower the core temperature limit below {:.0} °C or choose a material with a higher Curie point",
                spec.temperature_max,
                material.name,
                material.curie_c,
                material.curie_c - 20.0
            ),
        ));
    }
    Ok(())
}

/// Primary turns from the flux limit (step 2 of the module docs).
fn flux_limited_turns(spec: &Spec, n: f64, lp: Option<f64>, b_limit: f64, ae: f64) -> Result<u32> {
    match spec.topology {
        Topology::Flyback => {
            let lp = lp.ok_or_else(|| Error::input("lp", "the flyback needs Lp"))?;
            let dc = spec.dc_range()?;
            let ipk = sizing::flyback_peak_current(spec, n, lp, dc.min)?
                .max(sizing::flyback_peak_current(spec, n, lp, dc.max)?);
            sizing::flyback_primary_turns(lp, ipk, b_limit, ae)
        }
        Topology::Forward | Topology::TwoSwitchForward => {
            sizing::primary_turns_for_flux(sizing::volt_seconds(spec, n, None)?.worst, b_limit, ae)
        }
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge => {
            sizing::primary_turns_for_flux(
                sizing::volt_seconds(spec, n, None)?.worst,
                2.0 * b_limit,
                ae,
            )
        }
        // N = L·Ipk/(Bpk·Ae), the peak current's flux DC bias included.
        Topology::Inductor => {
            let l = lp.ok_or_else(|| Error::input("inductor.inductance", "the inductor needs L"))?;
            let ipk = topology::inductor::peak_current(spec, l)?;
            sizing::flyback_primary_turns(l, ipk, b_limit, ae)
        }
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
                serde_json::Value::Number(n) => {
                    assert!(n.as_f64().is_some_and(f64::is_finite), "{path}")
                }
                serde_json::Value::Array(a) => a
                    .iter()
                    .enumerate()
                    .for_each(|(i, x)| walk(x, &format!("{path}[{i}]"))),
                serde_json::Value::Object(o) => {
                    o.iter().for_each(|(k, x)| walk(x, &format!("{path}.{k}")))
                }
                serde_json::Value::Null => {}
                _ => {}
            }
        }
        walk(&v, "report");
    }

    #[test]
    fn the_three_demos_pass_with_finite_reports() {
        for d in [
            Design::demo_forward(),
            Design::demo_flyback(),
            Design::demo_push_pull(),
            Design::demo_inductor(),
        ] {
            let r = evaluate(&d).unwrap_or_else(|e| panic!("{}: {e}", d.name));
            assert!(
                r.pass,
                "{}: {:?}",
                d.name,
                r.checks.iter().filter(|c| !c.pass).collect::<Vec<_>>()
            );
            finite(&r);
            assert!(r.losses.total > 0.0 && r.losses.core > 0.0 && r.losses.copper > 0.0);
            assert!(r
                .operating
                .copper
                .windings
                .iter()
                .all(|w| w.fr >= 1.0 - 1e-9));
            // The operating temperature is the thermal fixed point of the
            // reported loss (McLyman's relation) within the iteration's 0.5 K.
            let rise = crate::thermal::rise(r.losses.total, r.core.surface_area).unwrap();
            assert!(
                (d.spec.ambient + rise - r.thermal.temperature).abs() < 1.0,
                "{}",
                d.name
            );
        }
    }

    #[test]
    fn temperature_margins_are_shares_of_the_allowed_rise() {
        let d = Design::demo_forward();
        let r = evaluate(&d).unwrap();
        for key in ["temperature", "curie"] {
            let k = r.checks.iter().find(|k| k.key == key).unwrap();
            let want = (k.limit - k.value) / (k.limit - d.spec.ambient);
            assert!((k.margin - want).abs() < 1e-12, "{key}: {} vs {want}", k.margin);
            assert!(k.margin > 0.0 && k.margin < 1.0);
        }
        // Not the share of the Celsius value.
        let t = r.checks.iter().find(|k| k.key == "temperature").unwrap();
        assert!((t.margin - (t.limit - t.value) / t.limit).abs() > 0.05);
    }

    #[test]
    fn least_loss_is_not_worse_than_fewest_turns() {
        for d in [
            Design::demo_forward(),
            Design::demo_flyback(),
            Design::demo_push_pull(),
        ] {
            let mut few = d.clone();
            few.choices.turns = TurnsRule::FewestTurns;
            let a = evaluate(&d).unwrap();
            let b = evaluate(&few).unwrap();
            assert!(a.turns.primary >= b.turns.primary);
            assert!(
                a.corners.iter().map(|c| c.total).fold(0.0, f64::max)
                    <= b.corners.iter().map(|c| c.total).fold(0.0, f64::max) * 1.0001
            );
        }
    }

    #[test]
    fn the_search_leaves_a_fixed_wire_alone() {
        // A winding the user fixed keeps its conductor exactly (three round
        // AWG 24 wires in hand, ASTM B258 0.511 mm bare); the other winding is
        // still chosen by the search, and the stack-up holds both.
        use crate::design::file::{WireChoice, WireOverride};
        let mut d = Design::demo_forward();
        d.choices.wires = vec![WireOverride {
            winding: "secondary 1".into(),
            wire: WireChoice::Round { awg: 24, parallel: 3 },
        }];
        let r = evaluate(&d).unwrap();
        let s = r.wires.iter().find(|w| w.winding == "secondary 1").unwrap();
        assert!(!s.automatic);
        assert_eq!(s.parallel, 3);
        assert!(s.conductor.starts_with("round 0.511 mm"), "{}", s.conductor);
        assert_eq!(s.reason, "fixed by the user");
        let p = r.wires.iter().find(|w| w.winding == "primary").unwrap();
        assert!(p.automatic && !p.trials.is_empty() && p.trials[0].chosen, "{}", p.reason);
        for it in &r.stackup.items {
            if let crate::winding::stackup::Item::Section(sec) = it {
                if sec.winding == "secondary 1" {
                    assert_eq!(sec.parallel, 3);
                    assert!(!sec.conductor.is_foil());
                }
            }
        }
    }

    #[test]
    fn reinforced_insulation_is_built_one_way_or_the_other() {
        // Two constructions of reinforced insulation (common practice, no
        // source): triple-insulated secondaries carry it in the wire, so no
        // margin tapes; margin-wound puts 3 mm margins at both flanges and at
        // least three wraps between sections, any conductor. "auto" builds
        // the one whose conductors lose least, and says which.
        use crate::design::file::Construction;
        use crate::winding::stackup::Item;
        use crate::winding::Conductor;
        let mut d = Design::demo_flyback();
        d.choices.insulation.construction = Construction::TripleInsulated;
        let t = evaluate(&d).unwrap();
        assert_eq!(t.winding_choice.construction, Some(Construction::TripleInsulated));
        for (_, s) in t.stackup.sections() {
            assert_eq!((s.margin_left, s.margin_right), (0.0, 0.0), "{}", s.winding);
            if s.winding.starts_with("secondary") {
                assert!(matches!(s.conductor, Conductor::TripleInsulated(_)), "{}", s.winding);
            }
        }
        d.choices.insulation.construction = Construction::MarginWound;
        let m = evaluate(&d).unwrap();
        assert_eq!(m.winding_choice.construction, Some(Construction::MarginWound));
        for (_, s) in m.stackup.sections() {
            assert_eq!((s.margin_left, s.margin_right), (3e-3, 3e-3), "{}", s.winding);
            assert!(!matches!(s.conductor, Conductor::TripleInsulated(_)), "{}", s.winding);
        }
        let tapes: Vec<u32> = m.stackup.items.iter().filter_map(|i| if let Item::Tape(t) = i { Some(t.wraps) } else { None }).collect();
        assert!(tapes.len() >= 2 && tapes.iter().all(|&w| w >= 3), "{tapes:?}");
        d.choices.insulation.construction = Construction::Auto;
        let a = evaluate(&d).unwrap();
        let same = |x: &Report| (x.losses.total - a.losses.total).abs() <= 1e-12 * a.losses.total;
        assert!(same(&t) || same(&m), "auto is one of the two: {} {} {}", a.losses.total, t.losses.total, m.losses.total);
        assert_eq!(a.winding_choice.construction, Some(if same(&t) { Construction::TripleInsulated } else { Construction::MarginWound }));
        // Not asked where there is no reinforced insulation with hazardous voltage.
        assert_eq!(evaluate(&Design::demo_forward()).unwrap().winding_choice.construction, None);
        // A bobbin too narrow for two 3 mm margins: margin-wound is refused by
        // field, "auto" builds the triple-insulated one (a 6 W flyback on P 18/11).
        let mut small = Design::demo_flyback();
        small.core = CoreChoice::Library { designation: "P 18/11".into() };
        small.spec.outputs[0].current *= 0.25;
        small.choices.insulation.construction = Construction::MarginWound;
        assert_eq!(evaluate(&small).unwrap_err().field(), Some("choices.insulation.margin"));
        small.choices.insulation.construction = Construction::Auto;
        let r = evaluate(&small).unwrap();
        assert_eq!(r.winding_choice.construction, Some(Construction::TripleInsulated));
        assert!(r.pass, "{:?}", r.checks.iter().filter(|c| !c.pass).collect::<Vec<_>>());
    }

    #[test]
    fn mirrored_halves_balance_a_push_pulls_halves() {
        use crate::design::file::Interleave;
        // Each half of a centre-tapped winding conducts for half a period
        // with its primary half. Wound sequentially (PA-PB-SA-SB) the idle
        // halves sit in the field of the conducting pair; mirrored
        // (SA-PA-PB-SB) each pair is adjacent and the idle halves lie where
        // the field is nil: less copper loss and leakage, and the halves of
        // each winding lose about alike (1-D MMF picture, Dowell 1966).
        let loss = |r: &Report, n: &str| r.operating.copper.windings.iter().find(|w| w.name == n).unwrap().total_loss;
        // The same turns for both (each order would otherwise get its own).
        let mut d = Design::demo_push_pull();
        d.choices.turns = TurnsRule::Primary { turns: evaluate(&d).unwrap().turns.primary };
        d.choices.interleave = Interleave::Sequential;
        let seq = evaluate(&d).unwrap();
        d.choices.interleave = Interleave::MirroredHalves;
        let mir = evaluate(&d).unwrap();
        assert!(mir.losses.copper < 0.8 * seq.losses.copper, "{} {}", mir.losses.copper, seq.losses.copper);
        let (lm, ls) = (mir.leakage.unwrap(), seq.leakage.unwrap());
        assert!(lm < ls, "{lm} {ls}");
        let spread = |r: &Report, a: &str, b: &str| (loss(r, a) / loss(r, b)).ln().abs();
        for (a, b) in [("primary A", "primary B"), ("secondary 1 A", "secondary 1 B")] {
            assert!(spread(&mir, a, b) < 0.25, "{a} {b}: {} {}", loss(&mir, a), loss(&mir, b));
            assert!(spread(&seq, a, b) > spread(&mir, a, b), "{a} {b}");
        }
        // Automatic chooses it for the demo, by loss.
        let auto = evaluate(&Design::demo_push_pull()).unwrap();
        assert_eq!(auto.winding_choice.interleave, "mirrored_halves");
        // A design with no centre-tapped winding refuses it, by field.
        let mut f = Design::demo_forward();
        f.choices.interleave = Interleave::MirroredHalves;
        let e = evaluate(&f).unwrap_err();
        assert_eq!(e.field(), Some("choices.interleave"), "{e}");
    }

    #[test]
    fn fixed_wires_still_leave_an_automatic_interleaving_to_loss() {
        // Every conductor fixed (the wires on the shelf), the interleaving
        // left automatic: the interleavings are still weighed by loss with
        // those conductors, not the default order wound unweighed.
        use crate::design::file::Interleave;
        for d in [Design::demo_forward(), Design::demo_push_pull()] {
            let r = evaluate(&d).unwrap();
            let mut f = crate::design::sweep::as_wound_design(&d, &r).unwrap();
            f.choices.interleave = Interleave::Auto;
            let a = evaluate(&f).unwrap();
            let wc = &a.winding_choice;
            assert!(wc.automatic, "{}: {wc:?}", d.name);
            assert!(wc.tried.len() >= 2 || d.name.contains("push-pull"), "{}: {wc:?}", d.name);
            // Weighed at the design's turns (they are fixed here).
            assert!(wc.tried.iter().all(|t| t.primary_turns == a.turns.primary), "{}: {wc:?}", d.name);
            let least = wc.tried.iter().map(|t| t.copper_loss).fold(f64::INFINITY, f64::min);
            let own = wc.tried.iter().find(|t| t.interleave == wc.interleave).unwrap().copper_loss;
            assert_eq!(own, least, "{}: {wc:?}", d.name);
            // The conductors are the ones fixed.
            for w in &f.choices.wires {
                let got = a.wires.iter().find(|x| x.winding == w.winding).unwrap();
                assert!(got.reason.starts_with("fixed by the user"), "{}: {}", w.winding, got.reason);
            }
        }
    }

    #[test]
    fn flyback_gap_gives_the_inductance() {
        let r = evaluate(&Design::demo_flyback()).unwrap();
        let g = r.gap.as_ref().expect("a flyback is gapped");
        // L = AL·N² (AL definition) with the solved gap.
        assert!(
            (g.al * (r.turns.primary as f64).powi(2) - r.inductance).abs() < 1e-9 * r.inductance
        );
        assert!(g.gap > 0.0 && g.gap < r.core.window_height);
        assert_eq!(r.al, g.al);
        // Ungapped: L = AL·N² with the residual gap's AL (AL definition).
        let f = evaluate(&Design::demo_forward()).unwrap();
        assert!(
            (f.al * (f.turns.primary as f64).powi(2) - f.inductance).abs() < 1e-12 * f.inductance
        );
    }

    #[test]
    fn errors_name_their_field() {
        let mut d = Design::demo_forward();
        d.core = CoreChoice::Library {
            designation: "nope".into(),
        };
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("core"));
        let mut d = Design::demo_forward();
        d.choices.saturation_margin = 2.0;
        assert_eq!(
            evaluate(&d).unwrap_err().field(),
            Some("choices.saturation_margin")
        );
        let mut d = Design::demo_forward();
        d.version = 7;
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("version"));
        let mut d = Design::demo_forward();
        d.spec.frequency = f64::NAN;
        assert!(evaluate(&d).unwrap_err().field().is_some());
        // A wire for a winding the design does not have names that entry.
        let mut d = Design::demo_forward();
        let wire = crate::design::file::WireChoice::Round { awg: 24, parallel: 1 };
        d.choices.wires = vec![
            crate::design::file::WireOverride { winding: "primary".into(), wire: wire.clone() },
            crate::design::file::WireOverride { winding: "tertiary".into(), wire },
        ];
        assert_eq!(evaluate(&d).unwrap_err().field(), Some("choices.wires[1].winding"));
    }

    #[test]
    fn custom_order_shares_turns_and_names_errors() {
        use crate::design::file::{Interleave, SectionTurns};
        let st = |w: &str, t: Option<u32>| SectionTurns {
            winding: w.into(),
            turns: t,
        };
        let mut d = Design::demo_forward();
        d.choices.interleave = Interleave::Custom;
        d.choices.section_order = vec![
            st("primary", None),
            st("secondary 1", None),
            st("primary", None),
            st("reset", None),
        ];
        let r = evaluate(&d).unwrap();
        let secs: Vec<(String, u32)> = r
            .stackup
            .sections()
            .map(|(_, s)| (s.winding.clone(), s.turns))
            .collect();
        let np = r.turns.primary;
        assert_eq!(
            secs.first().unwrap(),
            &("primary".to_string(), np.div_ceil(2))
        );
        assert_eq!(secs[2], ("primary".to_string(), np / 2));
        assert_eq!(secs.last().unwrap().0, "reset");
        assert_eq!(secs.len(), 4);
        // The same as the built-in P-S-P order (the reset whole, outside).
        let mut psp = Design::demo_forward();
        psp.choices.interleave = Interleave::SplitPrimary;
        assert!((evaluate(&psp).unwrap().losses.total - r.losses.total).abs() < 1e-12);
        d.choices.section_order = vec![st("primary", None), st("secondary 9", None)];
        assert_eq!(
            evaluate(&d).unwrap_err().field(),
            Some("choices.section_order[1].winding")
        );
        d.choices.section_order = vec![st("primary", None), st("secondary 1", None)];
        assert_eq!(
            evaluate(&d).unwrap_err().field(),
            Some("choices.section_order"),
            "reset has no section"
        );
        d.choices.section_order = vec![
            st("primary", Some(1)),
            st("secondary 1", None),
            st("reset", None),
        ];
        assert_eq!(
            evaluate(&d).unwrap_err().field(),
            Some("choices.section_order")
        );
    }

    #[test]
    fn design_file_round_trips_exactly() {
        for d in [
            Design::demo_forward(),
            Design::demo_flyback(),
            Design::demo_push_pull(),
        ] {
            let back = Design::from_json(&d.to_json()).unwrap();
            assert_eq!(back, d);
        }
        let e = Design::from_json(r#"{"schema":"magwright-design","version":1,"spec":{}}"#)
            .unwrap_err();
        assert!(e.field().is_some_and(|f| f.starts_with("spec")), "{e}");
        assert!(Design::from_json("{\"hello\": 1}").is_err());
    }
}
