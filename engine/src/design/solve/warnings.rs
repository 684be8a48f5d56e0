//! The core-loss warnings of every line corner, each naming its corner,
//! and the transient-flux warning ([`transient_flux_warning`]).
//!
//! The operating losses are evaluated at the loss corner only, but a
//! warning about the core-loss model (DC bias, flux or frequency outside
//! the fitted range, fast edges, minor loops, saturation) can belong to the
//! other corner alone: a flyback in CCM at Vin min carries a DC bias that
//! is gone in DCM at Vin max. So the core loss of each corner's B(t) is
//! evaluated at the operating temperature for its warnings.

use super::Prepared;
use crate::core::Core;
use crate::loss::{self, CoreLoss};
use crate::material::Material;
use crate::topology::{Corner, OperatingPoint, Topology, WorstCase};

fn corner_name(c: Corner, op: &OperatingPoint) -> String {
    match c {
        Corner::VinMin => format!("at Vin min ({:.1} V)", op.vin),
        Corner::VinMax => format!("at Vin max ({:.1} V)", op.vin),
    }
}

/// The core-loss warnings of both corners, each prefixed with its corner
/// ("at Vin min (85.0 V): ..."). `operating` is the loss corner's core loss
/// (already evaluated); the other corner's is evaluated here at `temp_c`.
pub(super) fn core_loss_warnings(
    prep: &Prepared,
    material: &Material,
    core: &Core,
    waves: &WorstCase,
    loss_corner: Corner,
    operating: &CoreLoss,
    temp_c: f64,
) -> Vec<String> {
    let mut out = Vec::new();
    for (corner, op) in [
        (Corner::VinMin, &waves.at_vin_min),
        (Corner::VinMax, &waves.at_vin_max),
    ] {
        let own;
        let cl = if corner == loss_corner {
            operating
        } else {
            match loss::core_loss_with(&prep.igse, material, &op.flux, temp_c, core.ve) {
                Ok(c) => {
                    own = c;
                    &own
                }
                Err(e) => {
                    out.push(format!("{}: core loss not evaluated: {}", corner_name(corner, op), e.message()));
                    continue;
                }
            }
        };
        for w in &cl.warnings {
            let m = format!("{}: {}", corner_name(corner, op), w.message());
            if !out.contains(&m) {
                out.push(m);
            }
        }
    }
    out
}

/// Bpk of one on-time at Vin max and the controller's largest duty, T (in
/// Ae; the caller scales to Amin), for the transformer topologies whose
/// steady-state flux does not depend on the line: the on-time volt-seconds
/// scale as Vin·D (Faraday's law, ΔB = V·t/(N·Ae); Erickson & Maksimovic
/// 2nd ed. §6.3), so a pulse at Vin max and `duty_max` (a load step, or a
/// start-up without soft start, where the controller runs into its duty
/// limit) carries r = Vin max·Dmax/(Vin min·D(Vin min)) times the steady
/// volt-seconds. A forward's flux rises from zero each period: r·Bpk. A
/// push-pull's or bridge's starts at −Bpk: (2r − 1)·Bpk. `None` for the
/// flyback (its peak is set by the current limit) and the inductor kind.
pub(super) fn transient_b_peak(topology: Topology, duty_max: f64, waves: &WorstCase) -> Option<f64> {
    let lo = &waves.at_vin_min;
    let vs_lo = lo.vin * lo.duty;
    if vs_lo.is_nan() || vs_lo <= 0.0 {
        return None;
    }
    let r = (waves.at_vin_max.vin * duty_max / vs_lo).max(1.0);
    let b = lo.b_peak.max(waves.at_vin_max.b_peak);
    match topology {
        Topology::Forward | Topology::TwoSwitchForward => Some(r * b),
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge => Some((2.0 * r - 1.0) * b),
        _ => None,
    }
}

/// A warning where a transient at Vin max and the controller's largest
/// duty ([`transient_b_peak`], scaled to Amin by `sat_scale`) would take
/// Bpk above the saturation check's limit `b_allowed` (Bsat at the
/// operating temperature less the margin). The checks are of the steady
/// state at both line corners; whether the controller can command
/// `duty_max` at high line is the converter's (a volt-second clamp, duty
/// falling as 1/Vin, soft start), so this warns and does not fail (common
/// practice, no source).
pub(super) fn transient_flux_warning(
    topology: Topology,
    duty_max: f64,
    waves: &WorstCase,
    sat_scale: f64,
    b_allowed: f64,
) -> Option<String> {
    let b = transient_b_peak(topology, duty_max, waves)? * sat_scale;
    (b > b_allowed).then(|| {
        format!(
            "a transient at Vin max ({:.1} V) with the largest duty ({:.2}), a load step or a start-up without soft \
             start, would take Bpk to {:.0} mT, above the saturation limit of {:.0} mT: the checks are of the steady \
             state. Use a controller that limits the volt-seconds (duty falling as 1/Vin) and soft start, or more \
             primary turns",
            waves.at_vin_max.vin,
            duty_max,
            b * 1e3,
            b_allowed * 1e3
        )
    })
}

#[cfg(test)]
mod tests {
    use crate::design::file::Design;
    use crate::design::solve::evaluate;
    use crate::topology::Corner;

    /// Faraday's law by hand (ΔB = V·t/(N·Ae), Erickson & Maksimovic 2nd
    /// ed. §6.3): a pulse of Vin max for duty_max of the period on Np turns.
    fn hand_delta_b(r: &crate::design::solve::Report, d: &Design) -> f64 {
        let s = &d.spec;
        r.waveforms.at_vin_max.vin * s.duty_max / s.frequency / (r.turns.primary as f64 * r.core.ae)
    }

    #[test]
    fn the_transient_flux_is_faradays_law_at_vin_max_and_the_duty_limit() {
        use super::transient_b_peak;
        // The forward demo: its flux rises from zero each period, so the
        // transient's Bpk is the pulse's ΔB; well under the limit (no warning).
        let d = Design::demo_forward();
        let r = evaluate(&d).unwrap();
        let b = transient_b_peak(d.spec.topology, d.spec.duty_max, &r.waveforms).unwrap();
        assert!((b - hand_delta_b(&r, &d)).abs() < 1e-9 * b, "{b} vs {}", hand_delta_b(&r, &d));
        assert!(!r.warnings.iter().any(|w| w.contains("transient")), "{:#?}", r.warnings);
        // The push-pull demo: bipolar flux, the pulse starts at −Bpk.
        let d = Design::demo_push_pull();
        let r = evaluate(&d).unwrap();
        let b = transient_b_peak(d.spec.topology, d.spec.duty_max, &r.waveforms).unwrap();
        let hand = hand_delta_b(&r, &d) - r.waveforms.at_vin_min.b_peak;
        assert!((b - hand).abs() < 1e-9 * b, "{b} vs {hand}");
        // The flyback's peak is its current limit's: not this rule.
        let d = Design::demo_flyback();
        let r = evaluate(&d).unwrap();
        assert_eq!(transient_b_peak(d.spec.topology, d.spec.duty_max, &r.waveforms), None);
    }

    #[test]
    fn a_forward_at_its_flux_limit_warns_of_the_transient() {
        use crate::design::file::TurnsRule;
        // The forward demo at 50 kHz on the fewest turns: the steady Bpk
        // is near the saturation limit, and a pulse at Vin max (60 V) and
        // the duty limit (0.45) carries 1.8 times its volt-seconds.
        let mut d = Design::demo_forward();
        d.spec.frequency = 50e3;
        d.choices.turns = TurnsRule::FewestTurns;
        let r = evaluate(&d).unwrap();
        let sat = r.checks.iter().find(|c| c.key == "saturation").unwrap();
        assert!(sat.pass);
        let b = hand_delta_b(&r, &d) * r.core.ae / r.core.amin;
        assert!(b > sat.limit, "{b} against {}", sat.limit);
        let w = r.warnings.iter().find(|w| w.contains("transient")).expect("the transient warning");
        assert!(w.contains(&format!("{:.0} mT", b * 1e3)) && w.contains(&format!("{:.0} mT", sat.limit * 1e3)), "{w}");
    }

    #[test]
    fn the_switch_node_is_warned_of_once_at_its_worst_corner() {
        // The forward demo: the switch sees Vin·(1 + Np/Nr) (Erickson &
        // Maksimovic 2nd ed. §6.3.2), 72 V at Vin min and 120 V at Vin max,
        // both above ES1; one warning, with the higher.
        let r = evaluate(&Design::demo_forward()).unwrap();
        let (np, nr) = (r.turns.primary as f64, r.turns.reset.unwrap() as f64);
        let hi = r.waveforms.at_vin_max.vin * (1.0 + np / nr);
        let lines: Vec<&String> =
            r.warnings.iter().filter(|w| w.starts_with(crate::topology::SWITCH_NODE_WARNING)).collect();
        assert_eq!(lines.len(), 1, "{lines:?}");
        assert!(lines[0].contains(&format!("{hi:.0} V")), "{} against {hi}", lines[0]);
    }

    /// The demo flyback's loss corner is Vin max (DCM-leaning, larger swing)
    /// while at Vin min, in CCM, B(t) never comes within 25 mT of zero: the
    /// DC-bias warning (the rule of `loss::dc_bias_warning`, common practice,
    /// no source) belongs to Vin min only and must still reach the report,
    /// naming its corner.
    #[test]
    fn warnings_of_the_other_corner_reach_the_report() {
        let r = evaluate(&Design::demo_flyback()).unwrap();
        assert_eq!(r.loss_corner, Corner::VinMax);
        let f = &r.waveforms.at_vin_min.flux;
        let (b_dc, b_ac) = (0.5 * (f.max() + f.min()), 0.5 * (f.max() - f.min()));
        assert!(b_dc - b_ac > 0.025, "Vin min is biased: {b_dc} {b_ac}");
        assert!(
            r.warnings
                .iter()
                .any(|w| w.starts_with("at Vin min") && w.contains("DC bias")),
            "{:#?}",
            r.warnings
        );
        // Every core-loss warning names its corner.
        for w in r.warnings.iter().filter(|w| w.contains("core loss")) {
            assert!(w.starts_with("at Vin m"), "{w}");
        }
    }
}
