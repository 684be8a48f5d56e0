//! "This transformer as wound, at other frequencies": the design is solved
//! once at its own frequency, then its turns, conductors and stack-up are
//! held (and a flyback's Lp, so its gap) while the frequency moves. Each
//! point is what a bench measurement of the built part would show: the
//! flux swing grows as the frequency falls (volt-seconds per turn, Erickson
//! & Maksimovic 2nd ed. §15.1), the copper's AC resistance grows with it
//! (Dowell 1966), so saturation and loss checks fail at the ends. The other
//! curve, [`super::frequency`], redesigns at every point.
//!
//! How it holds the build: the solver is run with the wound primary turns
//! (`TurnsRule::Primary`; the secondaries follow from the same ratio) and
//! every winding's conductor fixed (`choices.wires`) and the interleaving
//! and insulation construction chosen held (`choices.interleave`,
//! `choices.insulation.construction`), so the default stack-up builder
//! lays the same sections again; a flyback's Lp is
//! Vin²·D²/(r·f·Pin) (`topology::sizing::flyback_lp_from_ripple`), so the
//! ripple ratio r is scaled by f₀/f to keep Lp, and with it the gap, as
//! wound (the ripple itself then changes with f, as on the bench). An
//! inductor (buck or boost) is given its wound inductance outright.

use super::{Curve, Sweep};
use crate::design::file::{Design, Interleave, TurnsRule, WireChoice, WireOverride};
use crate::design::solve::Report;
use crate::error::{Error, Result};
use crate::topology::Topology;
use crate::winding::stackup::StackUp;
use crate::winding::wire::awg_diameter;
use crate::winding::Conductor;

/// The AWG whose ASTM B258 diameter is exactly `d` (the automatic wire is
/// always an AWG size), `None` for other sizes.
fn awg_of(d: f64) -> Option<i32> {
    let n = (36.0 - 39.0 * (d / 0.127e-3).ln() / 92f64.ln()).round();
    let n = n as i32;
    (awg_diameter(n).ok()? - d).abs().le(&(1e-12 * d)).then_some(n)
}

/// The conductor of `c` as a design-file wire choice (`None` where it has
/// no such form).
fn wire_choice(c: &Conductor, parallel: u32) -> Option<WireChoice> {
    Some(match c {
        Conductor::Round(w) => WireChoice::Round { awg: awg_of(w.bare_diameter)?, parallel },
        Conductor::TripleInsulated(w) => WireChoice::TripleInsulated { awg: awg_of(w.bare_diameter)?, parallel },
        Conductor::Litz(z) => WireChoice::Litz { strands: z.strands, strand_awg: awg_of(z.strand_diameter)? },
        Conductor::Foil(f) => WireChoice::Foil { thickness: f.thickness },
    })
}

/// Every winding's conductor in `st`, as fixed wire choices.
fn fixed_wires(st: &StackUp) -> Result<Vec<WireOverride>> {
    let mut out: Vec<WireOverride> = Vec::new();
    for (_, s) in st.sections() {
        if out.iter().any(|o| o.winding == s.winding) {
            continue;
        }
        let wire = wire_choice(&s.conductor, s.parallel).ok_or_else(|| {
            Error::infeasible(
                Some("choices.wires"),
                format!("the conductor of \"{}\" cannot be held fixed for the as-wound sweep", s.winding),
            )
        })?;
        out.push(WireOverride { winding: s.winding.clone(), wire });
    }
    Ok(out)
}

/// The design file that builds `report`'s transformer again: its primary
/// turns and every conductor fixed, an inductor's inductance given (the
/// rest of the file as given).
pub fn as_wound_design(design: &Design, report: &Report) -> Result<Design> {
    let mut d = design.clone();
    d.choices.turns = TurnsRule::Primary { turns: report.turns.primary };
    d.choices.wires = fixed_wires(&report.stackup)?;
    // The interleaving chosen (by loss where automatic) is held too: with
    // "auto" the solver would weigh the interleavings again with the fixed
    // conductors, and at another frequency might wind another. A custom
    // order is kept as the file gives it.
    d.choices.interleave = serde_json::from_value::<Interleave>(serde_json::Value::String(
        report.winding_choice.interleave.clone(),
    ))
    .map_err(|_| {
        Error::infeasible(
            Some("choices.interleave"),
            format!("the interleaving \"{}\" cannot be held for the as-wound sweep", report.winding_choice.interleave),
        )
    })?;
    // And the reinforced insulation's construction (margins and tapes).
    if let Some(c) = report.winding_choice.construction {
        d.choices.insulation.construction = c;
    }
    if design.spec.topology == Topology::Inductor {
        // The inductor as wound keeps its inductance (so its gap), not its
        // ripple ratio: L is given, the ripple then follows f.
        let mut o = crate::topology::inductor::options(&d.spec);
        o.inductance = Some(report.inductance);
        d.spec.inductor = Some(o);
    }
    Ok(d)
}

/// Loss and temperature of the design as wound at `n` log-spaced
/// frequencies from `f_min` to `f_max` (see the module docs): a
/// [`super::FrequencySweep`] of the as-wound curve, run to the end. An
/// error only where the design itself cannot be built at its own frequency.
pub fn as_wound(design: &Design, f_min: f64, f_max: f64, n: usize) -> Result<Sweep> {
    Ok(super::FrequencySweep::new(design, f_min, f_max, n, Curve::AsWound)?.finish())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn awg_round_trips() {
        for n in [10, 22, 30, 38, 44] {
            assert_eq!(awg_of(awg_diameter(n).unwrap()), Some(n));
        }
        assert_eq!(awg_of(0.5e-3), None);
    }
}
