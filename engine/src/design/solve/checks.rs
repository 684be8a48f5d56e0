//! Step 8: the pass/fail checks, each with its margin; the tight ones marked.

use super::*;
use crate::core::Core;
use crate::design::file::Design;
use crate::material::Material;
use crate::thermal::Equilibrium;
use crate::topology::{sizing, Corner};

/// What the checks read: the design, the candidate as built and its
/// equilibrium.
pub(super) struct CheckInputs<'a> {
    pub design: &'a Design,
    pub core: &'a Core,
    pub material: &'a Material,
    pub c: &'a Candidate,
    pub thermal: &'a Equilibrium,
    pub loss_corner: Corner,
}

/// Every check of a finished design.
pub(super) fn checks(x: &CheckInputs) -> Vec<Check> {
    let (design, core, material, c, thermal, loss_corner) =
        (x.design, x.core, x.material, x.c, x.thermal, x.loss_corner);
    let spec = &design.spec;
    let ch = &design.choices;
    let t_op = thermal.temperature;
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
        format!(
            "Bsat {:.0} mT at {:.0} °C less {:.0} % margin",
            b_sat * 1e3,
            t_op,
            ch.saturation_margin * 100.0
        ),
    ));
    let mut t_check = check(
        "temperature",
        "Hot-spot temperature",
        t_op,
        spec.hot_spot_max,
        "°C",
        Some(loss_corner),
        format!(
            "rise {:.1} K over {:.0} °C ambient",
            thermal.rise, spec.ambient
        ),
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
        format!(
            "copper fill {:.0} % of the window",
            c.fit.fill_factor * 100.0
        ),
    ));
    let duty = c.waves.get("duty").map_or(0.0, |w| w.value);
    let mut duty_limit = spec.duty_max;
    if let Some(nr) = c.turns.reset {
        duty_limit = duty_limit.min(sizing::forward_duty_limit(c.turns.primary, nr));
    }
    checks.push(check(
        "duty",
        "Duty",
        duty,
        duty_limit,
        "",
        c.waves.get("duty").map(|w| w.corner),
        String::new(),
    ));
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
    checks.push(check(
        "curie",
        "Temperature below Curie",
        t_op,
        material.curie_c - 20.0,
        "°C",
        None,
        "20 K below the Curie temperature".into(),
    ));
    checks.extend(mode_check_of(design, c));
    checks.extend(super::balance::magnetising_check(design, c.turns.primary, &c.waves));
    let min_margin = checks
        .iter()
        .filter(|k| k.pass)
        .map(|k| k.margin)
        .fold(f64::INFINITY, f64::min);
    for k in &mut checks {
        k.binding = !k.pass || (k.margin - min_margin).abs() < 1e-12 || k.margin < 0.1;
    }
    checks
}

/// The flyback's "mode" check (see [`super::mode`]); none for the others.
fn mode_check_of(design: &Design, c: &Candidate) -> Option<Check> {
    let cond = super::mode::conduction(design, &c.turns, c.inductance, &c.waves)?;
    super::mode::mode_check(&cond)
}

pub(super) fn check(
    key: &str,
    label: &str,
    value: f64,
    limit: f64,
    unit: &str,
    corner: Option<Corner>,
    note: String,
) -> Check {
    let margin = if limit != 0.0 {
        (limit - value) / limit.abs()
    } else {
        -value.signum()
    };
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
