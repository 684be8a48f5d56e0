//! Leakage inductance from the winding geometry.
//!
//! The leakage field of a transformer whose windings balance each other's
//! ampere-turns lives in the window, between and inside the windings. In
//! the one-dimensional picture (field parallel to the layers, across the
//! winding breadth b_w) the field at height x is H(x) = F(x)/b_w, with F the
//! MMF enclosed, and the stored energy is
//!
//! W = (μ0/2)·∫ H²·dV = (μ0/(2·b_w))·∫ F(x)²·MLT(x)·dx,
//!
//! over the whole build; the leakage inductance referred to the reference
//! winding is L = 2W/I² with I its current. For two blocks of layers and a
//! constant MLT this reduces to McLyman's expression (Transformer and
//! Inductor Design Handbook, leakage inductance chapter):
//! L = μ0·N²·MLT/b_w·(Σ gaps + (h_p + h_s)/3). Here the integral is done
//! exactly for any interleaving order: F is linear across each layer and
//! constant across tapes, screens and the gaps between layers, MLT(x) is
//! the core's [`Core::turn_length_at`] (linear in x), so each region's
//! integrand is a cubic and Simpson's rule is exact on it.
//!
//! Choices (common practice, no source): b_w is the bobbin's winding
//! breadth (no Rogowski correction for the field's fringing at the ends of
//! the window); the MMF is zero at the bobbin; the other windings share
//! the returning ampere-turns in proportion to their copper cross-section
//! (equal current density), which is exact for two windings and the usual
//! assumption for several; use [`leakage_with_currents`] for any other
//! distribution.

use super::dowell::MU0;
use super::fit::{fit, FitReport};
use super::stackup::StackUp;
use crate::core::Core;
use crate::error::{Error, Result};

/// Leakage inductance referred to `reference` (H), with the other windings
/// carrying the balancing ampere-turns in proportion to their copper area.
pub fn leakage(core: &Core, st: &StackUp, reference: &str) -> Result<f64> {
    let fr = fit(core, st)?;
    let r = st.winding_index(reference).ok_or_else(|| {
        Error::input(
            "reference_winding",
            format!("no winding \"{reference}\" in the stack-up"),
        )
    })?;
    if st.windings.len() < 2 {
        return Err(Error::input("windings", "leakage needs at least two windings"));
    }
    let nw = st.windings.len();
    let mut turns = vec![0.0; nw];
    let mut copper = vec![0.0; nw];
    for (_, s) in st.sections() {
        if let Some(w) = st.winding_index(&s.winding) {
            turns[w] += s.turns as f64;
            copper[w] += s.turns as f64 * s.parallel.max(1) as f64 * s.conductor.copper_area();
        }
    }
    let others: f64 = (0..nw).filter(|&w| w != r).map(|w| copper[w]).sum();
    let mut amps = vec![0.0; nw];
    amps[r] = 1.0;
    for w in (0..nw).filter(|&w| w != r) {
        let share = if others > 0.0 { copper[w] / others } else { 0.0 };
        amps[w] = if turns[w] > 0.0 {
            -turns[r] * share / turns[w]
        } else {
            0.0
        };
    }
    Ok(energy_inductance(core, &fr, &amps, 1.0))
}

/// Leakage inductance referred to `reference` (H) for given winding
/// currents (A, dot convention, one per winding name); L = 2W/I_ref².
pub fn leakage_with_currents(core: &Core, st: &StackUp, reference: &str, currents: &[(String, f64)]) -> Result<f64> {
    let fr = fit(core, st)?;
    let r = st.winding_index(reference).ok_or_else(|| {
        Error::input(
            "reference_winding",
            format!("no winding \"{reference}\" in the stack-up"),
        )
    })?;
    let mut amps = vec![0.0; st.windings.len()];
    for (i, (name, a)) in currents.iter().enumerate() {
        let w = st
            .winding_index(name)
            .ok_or_else(|| Error::input(&format!("currents[{i}].name"), format!("no winding \"{name}\"")))?;
        if !a.is_finite() {
            return Err(Error::input(
                &format!("currents[{i}].current"),
                "must be a finite number of A",
            ));
        }
        amps[w] = *a;
    }
    let iref = amps[r];
    if iref == 0.0 {
        return Err(Error::input(
            "currents",
            format!("the reference winding \"{reference}\" carries no current"),
        ));
    }
    Ok(energy_inductance(core, &fr, &amps, iref))
}

/// 2W/I² for the MMF profile of `amps` (A per winding) over the fitted
/// layers (see the module docs).
fn energy_inductance(core: &Core, fr: &FitReport, amps: &[f64], iref: f64) -> f64 {
    let bw = core.winding_breadth;
    // ∫ F² MLT dx over [x0, x1], F linear from fa to fb: Simpson (exact).
    let seg = |x0: f64, x1: f64, fa: f64, fb: f64| {
        let xm = 0.5 * (x0 + x1);
        let fm = 0.5 * (fa + fb);
        (x1 - x0) / 6.0
            * (fa * fa * core.turn_length_at(x0)
                + 4.0 * fm * fm * core.turn_length_at(xm)
                + fb * fb * core.turn_length_at(x1))
    };
    let mut f = 0.0;
    let mut x = 0.0;
    let mut integral = 0.0;
    for l in &fr.layers {
        integral += seg(x, l.h_bottom, f, f);
        let fb = f + amps.get(l.winding).copied().unwrap_or(0.0) * l.mmf_per_amp;
        integral += seg(l.h_bottom, l.h_bottom + l.height, f, fb);
        f = fb;
        x = l.h_bottom + l.height;
    }
    integral += seg(x, fr.total_build.max(x), f, f);
    let l = MU0 / bw * integral / (iref * iref);
    if l.is_finite() {
        l
    } else {
        0.0
    }
}
