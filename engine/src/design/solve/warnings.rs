//! The core-loss warnings of every line corner, each naming its corner.
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
use crate::topology::{Corner, OperatingPoint, WorstCase};

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


#[cfg(test)]
mod tests {
    use crate::design::file::Design;
    use crate::design::solve::evaluate;
    use crate::topology::Corner;

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
