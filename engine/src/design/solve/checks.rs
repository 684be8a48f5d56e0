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
    /// The leakage clamp, where the design has one.
    pub clamp: Option<&'a crate::design::clamp::Clamp>,
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
    let mut t_check = temperature_check(
        "temperature",
        "Core temperature (mean surface)",
        t_op,
        spec.temperature_max,
        spec.ambient,
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
    if let Some(rating) = ch.switch_voltage_rating {
        checks.push(switch_voltage_check(c, x.clamp, rating));
    }
    checks.push(temperature_check(
        "curie",
        "Temperature below Curie",
        t_op,
        material.curie_c - 20.0,
        spec.ambient,
        None,
        "20 K below the Curie temperature".into(),
    ));
    checks.extend(mode_check_of(design, c));
    checks.extend(super::balance::magnetising_check(design, c.turns.primary, &c.waves));
    checks.push(loss_budget(x));
    checks.push(material_range(x));
    let min_margin = checks
        .iter()
        .filter(|k| k.pass)
        .map(|k| k.margin)
        .fold(f64::INFINITY, f64::min);
    for k in &mut checks {
        k.tight = !k.pass || (k.margin - min_margin).abs() < 1e-12 || k.margin < 0.1;
    }
    checks
}

/// The switch's peak off-state voltage against its rating: the clamped
/// peak (`design::clamp`) where the design has a clamp, else the flat top.
fn switch_voltage_check(c: &Candidate, clamp: Option<&crate::design::clamp::Clamp>, rating: f64) -> Check {
    match clamp {
        Some(k) => check(
            "switch_voltage",
            "Switch peak voltage with the leakage clamp",
            k.switch_peak_voltage,
            rating,
            "V",
            Some(k.voltage_corner),
            match k.kind {
                crate::design::clamp::ClampKind::Dissipative => format!(
                    "Vin + Vc, Vc = {:.0} V{}",
                    k.corners.iter().find(|p| p.corner == k.voltage_corner).map_or(0.0, |p| p.clamp_voltage),
                    if k.default_voltage { " (1.5 × Vr)" } else { "" }
                ),
                crate::design::clamp::ClampKind::Rail => "clamped to the input rail by diodes".into(),
            },
        ),
        None => check(
            "switch_voltage",
            "Switch off-state voltage",
            c.waves.get("switch_voltage").map_or(0.0, |w| w.value),
            rating,
            "V",
            c.waves.get("switch_voltage").map(|w| w.corner),
            "flat top: one winding, no leakage".into(),
        ),
    }
}

/// The flyback's "mode" check (see [`super::mode`]); none for the others.
fn mode_check_of(design: &Design, c: &Candidate) -> Option<Check> {
    let cond = super::mode::conduction(design, &c.turns, c.inductance, &c.waves)?;
    super::mode::mode_check(&cond)
}

/// Energy balance: the magnetic's loss at its operating temperature (the
/// loss corner) against its share of the converter's loss budget,
/// `choices.magnetic_loss_share`·(Pin − Pout) with Pin = Pout/η from the
/// spec's efficiency. With a share of at most 1 a passing design keeps
/// Pout + magnetic loss ≤ Pin (conservation of energy; the share and its
/// default are common practice, no source: see `DEFAULT_MAGNETIC_LOSS_SHARE`).
pub(super) fn loss_budget(x: &CheckInputs) -> Check {
    let spec = &x.design.spec;
    let share = x.design.choices.magnetic_loss_share;
    let (p_out, p_in) = (spec.output_power(), spec.input_power());
    let budget = (p_in - p_out).max(0.0);
    check(
        "loss_budget",
        "Magnetic loss against its share of the loss budget",
        x.thermal.loss,
        share * budget,
        "W",
        Some(x.loss_corner),
        format!(
            "{:.0} % of Pin − Pout = {:.3} W (Pout {:.3} W at η {:.3})",
            share * 100.0,
            budget,
            p_out,
            spec.efficiency
        ),
    )
}

/// Material data range: the core-loss point (frequency, ΔB/2) of each line
/// corner against the material's fitted ranges, by the one rule of
/// [`crate::loss::range`] (within ×1.25 of the range: extrapolated, passes
/// with a warning; beyond: fails). Value: the larger outside factor of
/// the two corners (at most 1 inside the data); limit: the band.
pub(super) fn material_range(x: &CheckInputs) -> Check {
    let s = &x.material.steinmetz;
    let waves = &x.c.waves;
    let mut worst: Option<(Corner, crate::loss::DataRange)> = None;
    for (corner, op) in [(Corner::VinMin, &waves.at_vin_min), (Corner::VinMax, &waves.at_vin_max)] {
        let r = crate::loss::data_range_of(s, &op.flux);
        if worst.as_ref().is_none_or(|w| r.factor > w.1.factor) {
            worst = Some((corner, r));
        }
    }
    let (corner, r) = match worst {
        Some((c, r)) => (Some(c), r),
        None => (None, crate::loss::data_range(s, x.design.spec.frequency, 0.0)),
    };
    let what = if r.f_factor >= r.b_factor { "frequency" } else { "flux amplitude" };
    let fit = format!(
        "{:.0}–{:.0} kHz, {:.0}–{:.0} mT",
        s.f_min / 1e3,
        s.f_max / 1e3,
        s.b_min * 1e3,
        s.b_max * 1e3
    );
    let note = match r.verdict {
        crate::loss::RangeVerdict::Extrapolated if r.factor <= 1.0 => format!(
            "ΔB/2 {:.1} mT below the fit's {:.0} mT at {:.1} kHz: core loss taken as its upper bound (∝ B² below the fit)",
            r.b_amplitude * 1e3,
            s.b_min * 1e3,
            r.frequency / 1e3
        ),
        crate::loss::RangeVerdict::Inside => format!(
            "{:.1} kHz, ΔB/2 {:.1} mT inside the fit ({fit})",
            r.frequency / 1e3,
            r.b_amplitude * 1e3
        ),
        _ => format!(
            "{what} ×{:.2} outside the fit ({:.1} kHz, ΔB/2 {:.1} mT against {fit}): core loss extrapolated",
            r.factor,
            r.frequency / 1e3,
            r.b_amplitude * 1e3
        ),
    };
    check(
        "material_range",
        "Core-loss point within the material's data",
        r.factor,
        crate::loss::DATA_RANGE_BAND,
        "×",
        corner,
        note,
    )
}

/// A check on a temperature, whose margin is the share of the allowed rise
/// left, (limit − T)/(limit − ambient): a share of a Celsius value would
/// depend on where the scale puts its zero, while the rise is what the loss
/// drives (rise ∝ loss in the surface-dissipation model, so a 10 % margin
/// is about 10 % more loss). The allowed rise is taken as at least 1 K.
/// (Common practice, no source.)
pub(super) fn temperature_check(
    key: &str,
    label: &str,
    value: f64,
    limit: f64,
    ambient: f64,
    corner: Option<Corner>,
    note: String,
) -> Check {
    let mut k = check(key, label, value, limit, "°C", corner, note);
    k.margin = (limit - value) / (limit - ambient).max(1.0);
    k
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
        tight: false,
        corner,
        note,
    }
}
