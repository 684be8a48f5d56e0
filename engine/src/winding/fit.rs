//! Fitting the stack-up into the bobbin: turns per layer, layers, build
//! height, and the layer geometry the loss and leakage models use.
//!
//! The model (common practice, no source):
//! * a section's usable breadth is the bobbin's winding breadth minus its
//!   two margin tapes;
//! * round, litz and triple-insulated conductors lie side by side, `parallel`
//!   of them per turn, at their overall width: turns per layer =
//!   ⌊breadth / (parallel · overall width)⌋;
//! * a foil is one turn per layer (parallel foils stack as extra layers)
//!   and must not be wider than the usable breadth;
//! * layers do not nest: each adds its conductor's overall height (round
//!   wire that beds into the layer below would build about 13 % less;
//!   ignoring that is conservative);
//! * a section with `n` layers adds `n − 1` inter-layer tapes; tapes and
//!   screens add thickness × wraps;
//! * the total build must not exceed the bobbin's winding height
//!   ([`Core::winding_height`]); the first item that does not fit is an
//!   error saying how much it needs and how much is left;
//! * the mean turn length of each layer is [`Core::turn_length_at`] at the
//!   height of the layer's centre;
//! * fill factor = copper cross-section of all turns / window area.
//!
//! Turns are laid full layers first (the last layer takes the rest), unless
//! the section fixes only its number of layers, in which case they are
//! spread evenly (the first layers take one extra turn each).

use super::conductor::Conductor;
use super::stackup::{Item, Section, StackUp};
use crate::core::Core;
use crate::error::{positive, Error, Result};
use serde::Serialize;

/// One physical layer of conductor.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LayerFit {
    /// Index of the section's item in [`StackUp::items`].
    pub item: usize,
    /// Index of the winding in [`StackUp::windings`].
    pub winding: usize,
    /// Turns in this layer (1 for a foil sheet).
    pub turns: u32,
    /// Height of the layer's inner face above the bobbin, m.
    pub h_bottom: f64,
    /// Radial height of the layer (conductor overall height), m.
    pub height: f64,
    /// Mean turn length at the layer's centre, m.
    pub turn_length: f64,
    /// Usable breadth of the section (bobbin breadth minus margins), m.
    pub breadth: f64,
    /// Ampere-turns this layer adds to the MMF per ampere of its winding:
    /// its turns, or 1/parallel for one of several stacked foils.
    pub mmf_per_amp: f64,
    /// Copper cross-section of the whole layer (all turns, all conductors
    /// in hand, or one foil sheet), m².
    pub copper_area: f64,
}

/// One section after fitting.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SectionFit {
    pub item: usize,
    pub winding: String,
    pub turns_per_layer: u32,
    pub layers: u32,
    /// Usable breadth, m.
    pub breadth: f64,
    /// Height of the section's inner face, m.
    pub h_bottom: f64,
    /// Radial build of the section, m.
    pub build: f64,
    /// Copper cross-section of all its turns, m².
    pub copper_area: f64,
}

/// The fit of a whole stack-up.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct FitReport {
    pub sections: Vec<SectionFit>,
    /// Every layer, from the bobbin outward.
    pub layers: Vec<LayerFit>,
    /// Height of each item's inner face, m (same order as the items).
    pub item_bottoms: Vec<f64>,
    /// Total radial build, m.
    pub total_build: f64,
    /// The bobbin's winding height, m.
    pub available_build: f64,
    /// Build used / available.
    pub build_fraction: f64,
    /// Copper of all turns, m².
    pub copper_area: f64,
    /// Copper area / window area.
    pub fill_factor: f64,
}

/// Most layers a stack-up may have (a guard against absurd input).
pub const MAX_LAYERS: u64 = 10_000;

fn mm(x: f64) -> String {
    format!("{:.2} mm", x * 1e3)
}

/// [`layout`] of a section the fit lays out itself (no turns per layer or
/// layer count given, no margins): `turns` of `c`, `parallel` in hand, in
/// `breadth`; `None` where [`layout`] would refuse it. What the conductor
/// search calls for each candidate, without building a section or the
/// refusal's message.
pub fn free_layout(c: &Conductor, turns: u32, parallel: u32, breadth: f64) -> Option<(u32, u32)> {
    if !(breadth.is_finite() && breadth > 0.0) || turns == 0 || parallel == 0 {
        return None;
    }
    if c.is_foil() {
        return (c.outer_width() <= breadth * (1.0 + 1e-12)).then(|| (1, turns.saturating_mul(parallel)));
    }
    let pitch = c.outer_width() * parallel as f64;
    let max = (breadth / pitch * (1.0 + 1e-12)).floor().min(u32::MAX as f64) as u32;
    if max == 0 {
        return None;
    }
    let tpl = turns.min(max);
    Some((tpl, turns.div_ceil(tpl)))
}

/// Turns per layer and layers of one section in a usable `breadth`; errors
/// carry `field`.
pub fn layout(sec: &Section, breadth: f64, field: &str) -> Result<(u32, u32)> {
    if !(breadth.is_finite() && breadth > 0.0) {
        return Err(Error::infeasible(
            Some(field),
            format!(
                "the margin tapes leave no winding breadth ({} left)",
                mm(breadth.max(0.0))
            ),
        ));
    }
    if sec.turns == 0 || sec.parallel == 0 || sec.layers == Some(0) || sec.turns_per_layer == Some(0) {
        return Err(Error::input(
            field,
            "turns, conductors in hand, layers and turns per layer must be at least 1",
        ));
    }
    let n = sec.turns;
    let p = sec.parallel;
    if sec.conductor.is_foil() {
        let w = sec.conductor.outer_width();
        if w > breadth * (1.0 + 1e-12) {
            return Err(Error::infeasible(
                Some(field),
                format!(
                    "the foil is {} wide but only {} of breadth is left between the margins",
                    mm(w),
                    mm(breadth)
                ),
            ));
        }
        let layers = n.saturating_mul(p);
        if let Some(t) = sec.turns_per_layer {
            if t != 1 {
                return Err(Error::input(
                    &format!("{field}.turns_per_layer"),
                    "a foil has one turn per layer",
                ));
            }
        }
        if let Some(l) = sec.layers {
            if l != layers {
                return Err(Error::input(
                    &format!("{field}.layers"),
                    format!("a foil of {n} turns × {p} in parallel has {layers} layers, not {l}"),
                ));
            }
        }
        return Ok((1, layers));
    }
    let pitch = sec.conductor.outer_width() * p as f64;
    let max = (breadth / pitch * (1.0 + 1e-12)).floor().min(u32::MAX as f64) as u32;
    if max == 0 {
        return Err(Error::infeasible(
            Some(field),
            format!(
                "one turn ({} × {p} in hand) is wider than the {} of breadth left between the margins",
                mm(sec.conductor.outer_width()),
                mm(breadth)
            ),
        ));
    }
    let too_many = |tpl: u32| {
        Error::infeasible(
            Some(&format!("{field}.turns_per_layer")),
            format!(
                "{tpl} turns per layer need {} of breadth; only {} is left (at most {max})",
                mm(tpl as f64 * pitch),
                mm(breadth)
            ),
        )
    };
    match (sec.turns_per_layer, sec.layers) {
        (Some(tpl), Some(l)) => {
            if tpl > max {
                return Err(too_many(tpl));
            }
            if (l as u64) * (tpl as u64) < n as u64 || ((l.saturating_sub(1)) as u64) * (tpl as u64) >= n as u64 {
                return Err(Error::input(
                    &format!("{field}.layers"),
                    format!("{n} turns at {tpl} per layer make {} layers, not {l}", n.div_ceil(tpl)),
                ));
            }
            Ok((tpl, l))
        }
        (Some(tpl), None) => {
            if tpl > max {
                return Err(too_many(tpl));
            }
            Ok((tpl, n.div_ceil(tpl)))
        }
        (None, Some(l)) => {
            if l > n {
                return Err(Error::input(
                    &format!("{field}.layers"),
                    format!("{l} layers for only {n} turns"),
                ));
            }
            let tpl = n.div_ceil(l);
            if tpl > max {
                return Err(too_many(tpl));
            }
            Ok((tpl, l))
        }
        (None, None) => {
            let tpl = n.min(max);
            Ok((tpl, n.div_ceil(tpl)))
        }
    }
}

/// Turns in layer `k` (0-based) of a section laid out as (tpl, layers).
fn layer_turns(sec: &Section, tpl: u32, layers: u32, k: u32) -> u32 {
    if sec.conductor.is_foil() {
        return 1;
    }
    let n = sec.turns;
    if sec.turns_per_layer.is_none() && sec.layers.is_some() {
        let base = n / layers;
        let extra = n % layers;
        base + u32::from(k < extra)
    } else {
        let before = tpl.saturating_mul(k);
        n.saturating_sub(before).min(tpl)
    }
}

fn check_core(core: &Core) -> Result<()> {
    positive("core.winding_breadth", core.winding_breadth, "m")?;
    positive("core.winding_height", core.winding_height, "m")?;
    positive("core.window_area", core.window_area, "m²")?;
    positive("core.turn_length_inner", core.turn_length_inner, "m")?;
    Ok(())
}

/// Fits the stack-up into the core's bobbin (see the module docs).
pub fn fit(core: &Core, st: &StackUp) -> Result<FitReport> {
    check_core(core)?;
    st.validate()?;
    let avail = core.winding_height;
    let mut h = 0.0_f64;
    let mut sections = Vec::new();
    let mut layers = Vec::new();
    let mut bottoms = Vec::with_capacity(st.items.len());
    let mut copper = 0.0;
    // `what` names the item in the message, formatted only for an error.
    let room = |h: f64, need: f64, i: usize, what: &dyn Fn() -> String| -> Result<()> {
        if h + need > avail * (1.0 + 1e-9) {
            return Err(Error::infeasible(
                Some(&format!("items[{i}]")),
                format!("{} needs {} of build, {} left", what(), mm(need), mm((avail - h).max(0.0))),
            ));
        }
        Ok(())
    };
    for (i, it) in st.items.iter().enumerate() {
        bottoms.push(h);
        match it {
            Item::Tape(t) => {
                room(h, t.build(), i, &|| "the tape".into())?;
                h += t.build();
            }
            Item::Screen(s) => {
                room(h, s.thickness, i, &|| "the screen".into())?;
                h += s.thickness;
            }
            Item::Section(sec) => {
                let field = || format!("items[{i}]");
                let breadth = core.winding_breadth - sec.margin_left - sec.margin_right;
                // The field path is formatted only for a refusal (the same
                // layout again, with it).
                let (tpl, nl) = layout(sec, breadth, "").or_else(|_| layout(sec, breadth, &field()))?;
                if layers.len() as u64 + nl as u64 > MAX_LAYERS {
                    return Err(Error::input(
                        &field(),
                        format!("more than {MAX_LAYERS} layers in the stack-up"),
                    ));
                }
                let lh = sec.conductor.outer_height();
                let tape = sec.interlayer.as_ref().map_or(0.0, |t| t.build());
                let build = nl as f64 * lh + (nl.saturating_sub(1)) as f64 * tape;
                room(h, build, i, &|| format!("the {} section", sec.winding))?;
                let w = st.winding_index(&sec.winding).unwrap_or(0);
                let p = sec.parallel.max(1) as f64;
                let a1 = sec.conductor.copper_area();
                let foil = sec.conductor.is_foil();
                let mut y = h;
                for k in 0..nl {
                    let turns = layer_turns(sec, tpl, nl, k);
                    let (mmf, area) = if foil {
                        (1.0 / p, a1)
                    } else {
                        (turns as f64, turns as f64 * p * a1)
                    };
                    layers.push(LayerFit {
                        item: i,
                        winding: w,
                        turns,
                        h_bottom: y,
                        height: lh,
                        turn_length: core.turn_length_at(y + 0.5 * lh),
                        breadth,
                        mmf_per_amp: mmf,
                        copper_area: area,
                    });
                    y += lh + if k + 1 < nl { tape } else { 0.0 };
                }
                let sec_cu = sec.turns as f64 * p * a1;
                copper += sec_cu;
                sections.push(SectionFit {
                    item: i,
                    winding: sec.winding.clone(),
                    turns_per_layer: tpl,
                    layers: nl,
                    breadth,
                    h_bottom: h,
                    build,
                    copper_area: sec_cu,
                });
                h += build;
            }
        }
    }
    Ok(FitReport {
        sections,
        layers,
        item_bottoms: bottoms,
        total_build: h,
        available_build: avail,
        build_fraction: h / avail,
        copper_area: copper,
        fill_factor: copper / core.window_area,
    })
}

/// Conductor facts the loss model needs, by layer (kept here so the loss
/// model and the fit agree on the conductor's geometry).
pub(crate) fn conductor_of<'a>(st: &'a StackUp, layer: &LayerFit) -> Option<(&'a Conductor, u32)> {
    match st.items.get(layer.item) {
        Some(Item::Section(s)) => Some((&s.conductor, s.parallel.max(1))),
        _ => None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::winding::conductor::{table_litz, Grade};
    use crate::winding::stackup::{Direction, Side};

    /// [`free_layout`] is [`layout`] of the section the fit lays out itself,
    /// refusals included, over round, triple-insulated, litz and foil
    /// conductors, 1 to 4 in hand, 1 to 90 turns and breadths from below
    /// one turn's width to 40 mm.
    #[test]
    fn free_layout_is_layout_of_a_free_section() {
        let conductors = [
            Conductor::awg(20, Grade::G2).unwrap(),
            Conductor::awg(34, Grade::G1).unwrap(),
            Conductor::triple_insulated(0.5e-3, 0.7e-3).unwrap(),
            table_litz(60, 38).unwrap(),
            Conductor::foil(0.1e-3, 12e-3).unwrap(),
        ];
        let mut checked = 0;
        for c in &conductors {
            for parallel in 1..=4 {
                for turns in [1, 2, 3, 7, 13, 40, 90] {
                    for breadth in [0.0, 0.3e-3, 0.72e-3, 1.5e-3, 5e-3, 12e-3, 12.5e-3, 40e-3] {
                        let sec = Section {
                            winding: "w".into(),
                            turns,
                            conductor: c.clone(),
                            parallel,
                            layers: None,
                            turns_per_layer: None,
                            direction: Direction::Clockwise,
                            start: Side::Left,
                            finish: Side::Left,
                            margin_left: 0.0,
                            margin_right: 0.0,
                            interlayer: None,
                        };
                        assert_eq!(
                            free_layout(c, turns, parallel, breadth),
                            layout(&sec, breadth, "w").ok(),
                            "{c:?} × {parallel}, {turns} turns, {breadth} m"
                        );
                        checked += 1;
                    }
                }
            }
        }
        assert_eq!(checked, 5 * 4 * 7 * 8);
    }
}
