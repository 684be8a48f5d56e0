//! Steps 7–8: thermal equilibrium at the loss corner, then the checks.

use super::*;
use crate::core::Core;
use crate::design::file::Design;
use crate::error::{Error, Result};
use crate::loss::{self};
use crate::material::Material;
use crate::thermal::{self};
use crate::topology::Corner;
use crate::winding::leakage::leakage;
use crate::winding::loss::{LossModel, LossOptions};
use crate::winding::wire::copper_resistivity;

/// Steps 7–8.
#[allow(clippy::too_many_arguments)]
pub(super) fn finish(
    design: &Design,
    core: &Core,
    material: &Material,
    prep: &Prepared,
    c: Candidate,
    n_design: f64,
    bpk_limit: f64,
    reason: String,
) -> Result<Report> {
    let spec = &design.spec;
    let ch = &design.choices;
    let loss_corner = c.worst_corner().corner;
    let op = match loss_corner {
        Corner::VinMin => &c.waves.at_vin_min,
        Corner::VinMax => &c.waves.at_vin_max,
    };
    let currents = currents_of(spec.topology, op);
    let opts = LossOptions {
        edge_time: ch.edge_time,
        ..LossOptions::default()
    };
    let sel = c.worst_corner();
    // Re-anchored at the equilibrium until it moves less than 0.5 K (at
    // most three anchors).
    let mut t_k = anchor_temperature(spec, material);
    let mut anchor = sel.copper.clone();
    let mut history = Vec::new();
    let mut iterations = 0;
    let mut thermal = None;
    let mut copper = anchor.clone();
    for pass in 0..3 {
        let e = equilibrium_from(spec, core, material, sel.core.pv_reference, &anchor, t_k)?;
        iterations += e.iterations;
        history.extend_from_slice(&e.history);
        let moved = (e.temperature - t_k).abs();
        let runaway = e.runaway;
        t_k = e.temperature.min(250.0);
        thermal = Some(e);
        copper = LossModel::from_fit(&c.stackup, &c.fit, t_k)?.evaluate(&currents, &opts)?;
        anchor = copper.clone();
        if runaway || moved < 0.5 || pass == 2 {
            break;
        }
    }
    let mut thermal =
        thermal.ok_or_else(|| Error::infeasible(None, "thermal iteration did not run"))?;
    thermal.iterations = iterations;
    thermal.history = history;
    let t_op = thermal.temperature;
    // In runaway the iteration stops at the Curie temperature, where the
    // loss model is undefined: report the loss just below it.
    let t_loss = if thermal.runaway {
        t_op.min(material.curie_c - 1.0)
    } else {
        t_op
    };
    let core_loss = loss::core_loss_with(&prep.igse, material, &op.flux, t_loss, core.ve)?;
    let copper_dc: f64 = copper.windings.iter().map(|w| w.dc_loss).sum();
    let losses = Losses {
        core: core_loss.watts,
        copper_dc,
        copper_ac_extra: (copper.total - copper_dc).max(0.0),
        copper: copper.total,
        total: core_loss.watts + copper.total,
    };
    thermal.loss = losses.total;
    let operating = CornerLosses {
        corner: loss_corner,
        total: losses.total,
        core: core_loss,
        copper,
    };

    let output = spec.output_power();
    let power = Power {
        output,
        input: spec.input_power(),
        magnetic_loss: losses.total,
        magnetic_efficiency: output / (output + losses.total),
    };

    let leakage = if c.stackup.windings.len() >= 2 {
        let reference = c
            .stackup
            .windings
            .first()
            .map(|w| w.name.clone())
            .unwrap_or_default();
        leakage(core, &c.stackup, &reference).ok()
    } else {
        None
    };
    // The leakage spike and its clamp (a converter loss, kept apart).
    let clamp = match leakage {
        Some(l) => Some(crate::design::clamp::clamp(
            spec.topology,
            &c.turns,
            &c.waves,
            l,
            ch.clamp_voltage,
        )?),
        None => None,
    };
    let checks = checks::checks(&checks::CheckInputs {
        clamp: clamp.as_ref(),
        design,
        core,
        material,
        c: &c,
        thermal: &thermal,
        loss_corner,
    });
    let pass = checks.iter().all(|k| k.pass);

    let mut warnings: Vec<String> = Vec::new();
    // Both corners' warnings, once each; the switch node's only from the
    // corner where it is highest (one line, the worst voltage).
    let (lo, hi) = (&c.waves.at_vin_min, &c.waves.at_vin_max);
    let worst_switch = if hi.switch_voltage >= lo.switch_voltage { hi } else { lo };
    for (op, w) in lo.warnings.iter().map(|w| (lo, w)).chain(hi.warnings.iter().map(|w| (hi, w))) {
        if w.starts_with(crate::topology::SWITCH_NODE_WARNING) && !std::ptr::eq(op, worst_switch) {
            continue;
        }
        if !warnings.contains(w) {
            warnings.push(w.clone());
        }
    }
    // Core-loss warnings of both corners, each naming its corner.
    for w in super::warnings::core_loss_warnings(
        prep,
        material,
        core,
        &c.waves,
        loss_corner,
        &operating.core,
        t_loss,
    ) {
        if !warnings.contains(&w) {
            warnings.push(w);
        }
    }
    // Against the saturation check's own limit (Bsat at the operating
    // temperature less the margin).
    let b_allowed = checks.iter().find(|k| k.key == "saturation").map(|k| k.limit);
    if let Some(w) = b_allowed.and_then(|b| {
        super::warnings::transient_flux_warning(spec.topology, spec.duty_max, &c.waves, super::sat_scale(core), b)
    }) {
        warnings.push(w);
    }
    if ch
        .bpk_limit
        .is_some_and(|b| b > material.bsat_at(spec.temperature_max) * (1.0 - ch.saturation_margin))
    {
        warnings.push(
            "the Bpk limit you set is above Bsat at the core temperature limit less the margin".into(),
        );
    }
    if !operating.copper.converged {
        warnings.push(
            "the copper-loss harmonic sum reached its harmonic limit before 0.1 % convergence"
                .into(),
        );
    }
    // Filled in by `evaluate` (sweeps and the optimiser do not need it).
    let stackup_json = String::new();
    let n_actual = match c.turns.secondaries.first() {
        Some(&ns) => c.turns.primary as f64 / ns.max(1) as f64,
        // One winding (the inductor kind): no ratio, 1 by convention.
        None => 1.0,
    };
    let _ = n_design;
    let conduction = super::mode::conduction(design, &c.turns, c.inductance, &c.waves);
    // The switch node counts for the hazardous-voltage cautions too.
    let cautions = spec.cautions_with_switch(c.waves.get("switch_voltage").map(|w| w.value));
    Ok(Report {
        name: design.name.clone(),
        topology: spec.topology,
        dc: c.waves.dc,
        frequency: spec.frequency,
        core: core.clone(),
        material: material.clone(),
        turns: c.turns,
        turns_ratio: n_actual,
        turns_reason: reason,
        bpk_limit,
        inductance: c.inductance,
        al: c.al,
        gap: c.gap,
        gap_placement: ch.gap_placement,
        conduction,
        waveforms: c.waves,
        wires: c.wires,
        winding_choice: c.winding_choice,
        stackup: c.stackup,
        stackup_json,
        fit: c.fit,
        leakage,
        clamp,
        corners: c.corners,
        loss_corner,
        thermal,
        operating,
        losses,
        power,
        checks,
        pass,
        cautions,
        warnings,
        choke: None,
    })
}

/// The temperature the selection evaluates the copper at, °C: the first
/// anchor of the thermal equilibrium.
pub(super) fn anchor_temperature(spec: &crate::topology::Spec, material: &Material) -> f64 {
    spec.temperature_max.min(material.curie_c - 5.0).clamp(-60.0, 250.0)
}

/// Step 7's equilibrium from one anchor: the core loss at its reference
/// `pv_ref` (W/m³ before the temperature factor) following the material's
/// temperature factor, the copper `anchor` evaluated at `t_k` °C scaled
/// between exact evaluations, its DC part with ρ(T) and the part above DC
/// with √ρ(T) (Dowell's large-Δ limit, Rac ∝ ρ/δ ∝ √ρ).
pub(super) fn equilibrium_from(
    spec: &crate::topology::Spec,
    core: &Core,
    material: &Material,
    pv_ref: f64,
    anchor: &crate::winding::loss::LossReport,
    t_k: f64,
) -> Result<thermal::Equilibrium> {
    let ceiling = (material.curie_c).min(250.0).max(spec.ambient + 1.0);
    let dc: f64 = anchor.windings.iter().map(|w| w.dc_loss).sum();
    let extra = (anchor.total - dc).max(0.0);
    let rho_k = copper_resistivity(t_k)?;
    thermal::equilibrium(spec.ambient, core.surface_area, ceiling, |t| {
        let r = copper_resistivity(t.clamp(-60.0, 250.0))? / rho_k;
        Ok(pv_ref * material.temp_factor.at(t) * core.ve + dc * r + extra * r.sqrt())
    })
}
