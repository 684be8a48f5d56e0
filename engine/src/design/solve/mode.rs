//! The flyback's conduction mode as wound: the mode and ripple ratio at
//! each line corner, and the "mode" check against the mode asked for.
//!
//! The ripple ratio is the one `spec.flyback.ripple_ratio` sets,
//! r = Vin²·D²/(Lp·f·P) with the CCM duty D = Vor/(Vin + Vor) and P the
//! rectified power as wound (`sizing::flyback_ripple_ratio`): ΔIp/Ic in CCM,
//! 2 at the CCM/DCM boundary, above 2 in DCM (energy balance of Lp; the
//! CCM ratio from Erickson & Maksimovic 2nd ed. §6.3.4). The design corner
//! is full load at Vin min, where the spec's ratio is asked for; at Vin max
//! the same Lp gives a larger r (a CCM design may enter DCM there, as
//! intended by the usual practice of sizing at Vin min).

use super::{Check, Conduction, ConductionCorner};
use crate::design::file::Design;
use crate::topology::{sizing, Corner, Mode, Topology, Turns, WorstCase};

/// How far from the boundary (relative) a design asked for at the boundary
/// may come out as wound and still pass: 1 % (common practice, no source:
/// the boundary is a design aim, load and Lp tolerances move it more).
pub const BOUNDARY_TOLERANCE: f64 = 0.01;

/// The conduction report of a flyback (`None` for the other topologies,
/// whose output chokes are always in CCM).
pub fn conduction(
    design: &Design,
    turns: &Turns,
    inductance: f64,
    waves: &WorstCase,
) -> Option<Conduction> {
    let spec = &design.spec;
    if spec.topology != Topology::Flyback {
        return None;
    }
    let (vor, p_sec) = sizing::flyback_as_wound(spec, turns).ok()?;
    let corners = [
        (Corner::VinMin, &waves.at_vin_min),
        (Corner::VinMax, &waves.at_vin_max),
    ]
    .iter()
    .map(|&(corner, op)| ConductionCorner {
        corner,
        vin: op.vin,
        mode: op.mode,
        ripple_ratio: sizing::flyback_ripple_ratio(op.vin, vor, inductance, p_sec, spec.frequency),
    })
    .filter(|c| c.ripple_ratio.is_finite())
    .collect();
    Some(Conduction {
        requested: sizing::mode_of_ripple(spec.flyback.ripple_ratio),
        requested_ripple_ratio: spec.flyback.ripple_ratio,
        corners,
    })
}

fn mode_name(m: Mode) -> &'static str {
    match m {
        Mode::Ccm => "CCM",
        Mode::Boundary => "boundary",
        Mode::Dcm => "DCM",
    }
}

/// The "mode" check: the mode as wound at the design corner (Vin min, full
/// load) is the one asked for. Value: the ripple ratio as wound; limit: 2
/// (the boundary). Margin: how far r may move before the mode changes,
/// (2 − r)/2 for CCM, (r − 2)/2 for DCM; for a boundary request
/// (tol − |r/2 − 1|)/tol with tol = [`BOUNDARY_TOLERANCE`].
pub fn mode_check(c: &Conduction) -> Option<Check> {
    let at = c.corners.iter().find(|k| k.corner == Corner::VinMin)?;
    let r = at.ripple_ratio;
    let dev = (r / 2.0 - 1.0).abs();
    let (margin, pass) = match c.requested {
        Mode::Ccm => ((2.0 - r) / 2.0, at.mode == Mode::Ccm && r < 2.0),
        Mode::Dcm => ((r - 2.0) / 2.0, at.mode == Mode::Dcm && r > 2.0),
        Mode::Boundary => (
            (BOUNDARY_TOLERANCE - dev) / BOUNDARY_TOLERANCE,
            dev <= BOUNDARY_TOLERANCE,
        ),
    };
    let note = if pass {
        format!(
            "{} as asked: ripple ratio {:.3} as wound at Vin min, full load (asked {:.3})",
            mode_name(at.mode),
            r,
            c.requested_ripple_ratio
        )
    } else {
        format!(
            "asked for {} (ripple ratio {:.3}) but the turns as wound give {} (ripple ratio {:.3}) \
             at Vin min, full load: change the ripple ratio or the turns",
            mode_name(c.requested),
            c.requested_ripple_ratio,
            mode_name(at.mode),
            r
        )
    };
    Some(Check {
        key: "mode".into(),
        label: "Conduction mode as wound (Vin min, full load)".into(),
        value: r,
        limit: 2.0,
        unit: String::new(),
        margin: if pass { margin.max(0.0) } else { margin.min(-1e-6) },
        pass,
        tight: false,
        corner: Some(Corner::VinMin),
        note,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn cond(requested: Mode, asked: f64, mode: Mode, r: f64) -> Conduction {
        Conduction {
            requested,
            requested_ripple_ratio: asked,
            corners: vec![ConductionCorner {
                corner: Corner::VinMin,
                vin: 100.0,
                mode,
                ripple_ratio: r,
            }],
        }
    }

    /// The check fails, with its reason, whenever the mode as wound differs
    /// from the one asked for (r = 2 the boundary: E&M 2nd ed. §5.2, the
    /// DCM boundary of the ripple ratio; common practice).
    #[test]
    fn mode_check_compares_the_mode_classes() {
        let k = mode_check(&cond(Mode::Boundary, 2.0, Mode::Ccm, 1.6)).unwrap();
        assert!(!k.pass && k.margin < 0.0, "{k:?}");
        assert!(k.note.contains("asked for boundary") && k.note.contains("CCM"), "{}", k.note);
        let k = mode_check(&cond(Mode::Boundary, 2.0, Mode::Boundary, 2.0)).unwrap();
        assert!(k.pass && (k.margin - 1.0).abs() < 1e-12);
        let k = mode_check(&cond(Mode::Ccm, 0.6, Mode::Ccm, 0.6)).unwrap();
        assert!(k.pass && (k.margin - 0.7).abs() < 1e-12);
        let k = mode_check(&cond(Mode::Ccm, 1.9, Mode::Dcm, 2.2)).unwrap();
        assert!(!k.pass);
        let k = mode_check(&cond(Mode::Dcm, 3.0, Mode::Ccm, 1.8)).unwrap();
        assert!(!k.pass);
        assert_eq!(sizing::mode_of_ripple(2.0), Mode::Boundary);
        assert_eq!(sizing::mode_of_ripple(1.99), Mode::Ccm);
        assert_eq!(sizing::mode_of_ripple(2.01), Mode::Dcm);
    }
}
