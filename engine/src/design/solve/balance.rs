//! The "magnetising" check of push-pull and bridges: the rectifiers can
//! hold the magnetising current in the dead times.
//!
//! In the dead times of a push-pull or bridge both rectifiers of each
//! output conduct the freewheeling choke current, and the flux is held
//! flat; the magnetising current (±Im) then flows in the secondaries as the
//! difference of the two halves (ampere-turn balance, Erickson &
//! Maksimovic 2nd ed. §6.2.3; see `topology::push_pull`). Output k carries
//! mk = Np·Im·Ik/Σ Nj·Ij of it per half, and a half cannot go below zero:
//! the model holds only while mk ≤ the choke's trough current ak. Beyond
//! that a rectifier turns off, the windings are no longer clamped, and the
//! flux and currents are not those modelled: the design fails.

use super::Check;
use crate::design::file::Design;
use crate::topology::{Corner, OperatingPoint, Topology, WorstCase};

/// Largest mk/ak over the outputs at one corner.
fn ratio(design: &Design, turns_primary: u32, op: &OperatingPoint) -> f64 {
    let spec = &design.spec;
    let nt: f64 = spec
        .outputs
        .iter()
        .zip(op.windings.iter().filter(|w| w.name.ends_with(" A") && w.name.starts_with("secondary")))
        .map(|(o, w)| w.turns as f64 * o.current)
        .sum();
    if nt <= 0.0 {
        return 0.0;
    }
    let mut worst: f64 = 0.0;
    for (k, o) in spec.outputs.iter().enumerate() {
        let name = format!("secondary {} A", k + 1);
        let Some(w) = op.windings.iter().find(|w| w.name == name) else {
            continue;
        };
        // The trough of the choke current: the A half's value at t = 0.
        let a = w.current.points.first().map_or(0.0, |p| p.1);
        let m = turns_primary as f64 * op.magnetising_peak * o.current / nt;
        let r = if a > 0.0 {
            m / a
        } else if m > 0.0 {
            f64::MAX
        } else {
            0.0
        };
        worst = worst.max(r.min(1e6));
    }
    worst
}

/// The check (push-pull and bridges only).
pub(super) fn magnetising_check(design: &Design, turns_primary: u32, waves: &WorstCase) -> Option<Check> {
    if !matches!(
        design.spec.topology,
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge
    ) {
        return None;
    }
    let lo = ratio(design, turns_primary, &waves.at_vin_min);
    let hi = ratio(design, turns_primary, &waves.at_vin_max);
    let (value, corner) = if lo >= hi {
        (lo, Corner::VinMin)
    } else {
        (hi, Corner::VinMax)
    };
    Some(super::checks::check(
        "magnetising",
        "Magnetising current held by the rectifiers in the dead time",
        value,
        1.0,
        "",
        Some(corner),
        "magnetising ampere-turns over the choke's trough current; above 1 a rectifier turns off \
         and the flux is not held: raise the magnetising inductance or the load"
            .into(),
    ))
}

#[cfg(test)]
mod tests {
    use crate::design::file::Design;
    use crate::design::solve::evaluate;

    /// The demo push-pull holds its magnetising current easily; at 1/50 of
    /// its load the choke's trough current (which scales with the load) falls
    /// below the magnetising ampere-turns per secondary turn (which do not)
    /// and the check fails. Value by hand for one output:
    /// Np·Im·Ik/(Ns·Ik)/a = Np·Im/(Ns·a) (ampere-turn balance, E&M §6.2.3).
    #[test]
    fn magnetising_check_fails_at_light_load() {
        let r = evaluate(&Design::demo_push_pull()).unwrap();
        let k = r.checks.iter().find(|k| k.key == "magnetising").unwrap();
        assert!(k.pass && k.value < 1.0, "{k:?}");
        let op = &r.waveforms.at_vin_min;
        let a = op.windings.iter().find(|w| w.name == "secondary 1 A").unwrap().current.points[0].1;
        let hand = r.turns.primary as f64 * op.magnetising_peak / (r.turns.secondaries[0] as f64 * a);
        let hi = &r.waveforms.at_vin_max;
        let a2 = hi.windings.iter().find(|w| w.name == "secondary 1 A").unwrap().current.points[0].1;
        let hand2 = r.turns.primary as f64 * hi.magnetising_peak / (r.turns.secondaries[0] as f64 * a2);
        assert!((k.value - hand.max(hand2)).abs() < 1e-12 * k.value, "{} vs {hand} {hand2}", k.value);
        // The same turns at 1/50 of the load (the least-loss rule would
        // otherwise wind more, and a smaller magnetising current, there).
        let mut light = Design::demo_push_pull();
        light.choices.turns = crate::design::file::TurnsRule::Primary { turns: r.turns.primary };
        light.spec.outputs[0].current /= 50.0;
        let r = evaluate(&light).unwrap();
        let k = r.checks.iter().find(|k| k.key == "magnetising").unwrap();
        assert!(!k.pass && !r.pass, "{k:?}");
    }
}
