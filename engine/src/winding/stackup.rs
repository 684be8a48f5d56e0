//! The winding stack-up: what is wound on the bobbin, in order, from the
//! bobbin outward.
//!
//! A [`StackUp`] declares its windings by name (primary, secondary, aux…)
//! and lists [`Item`]s: winding [`Section`]s, insulation [`Tape`]s and
//! electrostatic [`Screen`]s. A winding may appear in several sections,
//! which is how interleaving is written: P-S-P is a primary section, a
//! secondary section and a second primary section; the sections of one
//! winding are in series and carry the same current.
//!
//! Margin tapes (the creepage tapes at both ends of the bobbin) belong to
//! the section they flank, since they are wound up to that section's build
//! height: each section has `margin_left` and `margin_right`, which reduce
//! the breadth its layers can use. Inter-layer tape inside a section is
//! the section's `interlayer` tape; tape between sections is an [`Item`].
//!
//! The `direction` and the start/finish `side` of a section are
//! manufacturing instructions: the loss and leakage models work with
//! currents in the dot convention (see [`super::loss`]) and do not use
//! them.
//!
//! The stack-up is saved as JSON in a schema of our own, documented in
//! `docs/stackup.md`: [`to_json`] and [`from_json`] (or [`import`], which
//! also checks that the stack-up fits a core), in [`super::stackup_file`].
//! The round trip is exact: `from_json(&to_json(&s)) == Ok(s)`.
//!
//! [`default_stackup`] builds a stack-up from a list of windings and an
//! interleaving [`Pattern`]; the design solver calls it.

use super::conductor::Conductor;
use crate::core::Core;
use crate::error::{non_negative, positive, Error, Result};

pub use super::stackup_file::{from_json, import, to_json, SCHEMA, SCHEMA_1};

/// Winding sense of a section, seen from the bobbin's left flange.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub enum Direction {
    Clockwise,
    CounterClockwise,
}

/// A flange of the bobbin (left / right, looking at the bobbin with its
/// pin row at the bottom).
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub enum Side {
    Left,
    Right,
}

impl Side {
    pub fn other(self) -> Side {
        match self {
            Side::Left => Side::Right,
            Side::Right => Side::Left,
        }
    }
}

/// An insulation tape: `wraps` turns of a film of `thickness`.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Tape {
    /// Material, free text (e.g. "polyester film").
    pub material: String,
    /// Thickness of one wrap, m.
    pub thickness: f64,
    /// Number of wraps (≥ 1).
    pub wraps: u32,
}

impl Tape {
    /// Radial build of the tape, m.
    pub fn build(&self) -> f64 {
        self.thickness * self.wraps as f64
    }

    /// Polyester film 0.05 mm × `wraps` (a common choice; common practice,
    /// no source).
    pub fn polyester(wraps: u32) -> Tape {
        Tape {
            material: "polyester film".into(),
            thickness: 0.05e-3,
            wraps,
        }
    }
}

/// An electrostatic screen: a foil of one open turn across the breadth.
/// Its eddy-current loss and its effect on the field are not modelled
/// (it counts as build and as a gap between windings).
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Screen {
    /// Material, free text (e.g. "copper foil").
    pub material: String,
    /// Thickness, m.
    pub thickness: f64,
    /// Where it connects, free text (e.g. "primary return").
    pub connection: String,
}

/// One section: a contiguous block of layers of one winding.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Section {
    /// Name of the winding (declared in [`StackUp::windings`]).
    pub winding: String,
    /// Turns in this section (≥ 1).
    pub turns: u32,
    pub conductor: Conductor,
    /// Conductors in hand per turn (≥ 1). Round and litz conductors in hand
    /// lie side by side in a layer; parallel foils are stacked radially.
    pub parallel: u32,
    /// Number of layers; `None` lets the fit choose (full layers first).
    pub layers: Option<u32>,
    /// Turns per layer; `None` lets the fit choose (as many as fit).
    pub turns_per_layer: Option<u32>,
    pub direction: Direction,
    pub start: Side,
    pub finish: Side,
    /// Margin tape width at the left flange, m.
    pub margin_left: f64,
    /// Margin tape width at the right flange, m.
    pub margin_right: f64,
    /// Tape between the section's layers, if any.
    pub interlayer: Option<Tape>,
}

/// One thing on the bobbin.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub enum Item {
    Section(Section),
    Tape(Tape),
    Screen(Screen),
}

/// A declared winding.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct WindingDef {
    pub name: String,
}

/// The whole stack-up, from the bobbin outward.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct StackUp {
    pub windings: Vec<WindingDef>,
    pub items: Vec<Item>,
}

impl StackUp {
    /// Index of a declared winding.
    pub fn winding_index(&self, name: &str) -> Option<usize> {
        self.windings.iter().position(|w| w.name == name)
    }

    /// Sections with their item index.
    pub fn sections(&self) -> impl Iterator<Item = (usize, &Section)> {
        self.items.iter().enumerate().filter_map(|(i, it)| match it {
            Item::Section(s) => Some((i, s)),
            _ => None,
        })
    }

    /// Total turns of a winding (sum over its sections).
    pub fn turns_of(&self, name: &str) -> u64 {
        self.sections()
            .filter(|(_, s)| s.winding == name)
            .map(|(_, s)| s.turns as u64)
            .sum()
    }

    /// Checks every value and every reference; errors name the field
    /// (`items[3].turns`, `windings[1].name`, …).
    pub fn validate(&self) -> Result<()> {
        if self.windings.is_empty() {
            return Err(Error::input("windings", "declare at least one winding"));
        }
        for (i, w) in self.windings.iter().enumerate() {
            if w.name.trim().is_empty() {
                return Err(Error::input(&format!("windings[{i}].name"), "a winding needs a name"));
            }
            if self.windings[..i].iter().any(|o| o.name == w.name) {
                return Err(Error::input(
                    &format!("windings[{i}].name"),
                    format!("the winding name \"{}\" is used twice", w.name),
                ));
            }
        }
        for (i, it) in self.items.iter().enumerate() {
            let p = || format!("items[{i}]");
            match it {
                Item::Section(s) => {
                    if self.winding_index(&s.winding).is_none() {
                        return Err(Error::input(
                            &format!("{}.winding", p()),
                            format!("the winding \"{}\" is not declared in \"windings\"", s.winding),
                        ));
                    }
                    if s.turns == 0 {
                        return Err(Error::input(&format!("{}.turns", p()), "a section needs at least one turn"));
                    }
                    if s.turns > 100_000 {
                        return Err(Error::input(
                            &format!("{}.turns", p()),
                            "more than 100000 turns in one section",
                        ));
                    }
                    if s.parallel > 1000 {
                        return Err(Error::input(
                            &format!("{}.parallel", p()),
                            "more than 1000 conductors in hand",
                        ));
                    }
                    if s.parallel == 0 {
                        return Err(Error::input(&format!("{}.parallel", p()), "at least one conductor in hand"));
                    }
                    if s.layers == Some(0) {
                        return Err(Error::input(&format!("{}.layers", p()), "at least one layer"));
                    }
                    if s.turns_per_layer == Some(0) {
                        return Err(Error::input(
                            &format!("{}.turns_per_layer", p()),
                            "at least one turn per layer",
                        ));
                    }
                    if s.conductor.validate("").is_err() {
                        s.conductor.validate(&format!("{}.conductor", p()))?;
                    }
                    if !(s.margin_left.is_finite() && s.margin_left >= 0.0) {
                        non_negative(&format!("{}.margin_left", p()), s.margin_left, "m")?;
                    }
                    if !(s.margin_right.is_finite() && s.margin_right >= 0.0) {
                        non_negative(&format!("{}.margin_right", p()), s.margin_right, "m")?;
                    }
                    if let Some(t) = &s.interlayer {
                        if validate_tape("", t).is_err() {
                            validate_tape(&format!("{}.interlayer_tape", p()), t)?;
                        }
                    }
                }
                Item::Tape(t) => {
                    if validate_tape("", t).is_err() {
                        validate_tape(&p(), t)?;
                    }
                }
                Item::Screen(sc) => {
                    positive(&format!("{}.thickness", p()), sc.thickness, "m")?;
                    if sc.thickness > 0.01 {
                        return Err(Error::input(
                            &format!("{}.thickness", p()),
                            "a screen over 10 mm thick is not a screen",
                        ));
                    }
                }
            }
        }
        for (i, w) in self.windings.iter().enumerate() {
            if self.turns_of(&w.name) == 0 {
                return Err(Error::input(
                    &format!("windings[{i}]"),
                    format!("the winding \"{}\" has no section in \"items\"", w.name),
                ));
            }
        }
        Ok(())
    }
}

fn validate_tape(p: &str, t: &Tape) -> Result<()> {
    if !(t.thickness.is_finite() && t.thickness > 0.0) {
        positive(&format!("{p}.thickness"), t.thickness, "m")?;
    }
    if t.thickness > 0.005 {
        return Err(Error::input(
            &format!("{p}.thickness"),
            "a tape over 5 mm thick is not a tape",
        ));
    }
    if t.wraps > 1000 {
        return Err(Error::input(&format!("{p}.wraps"), "more than 1000 wraps"));
    }
    if t.wraps == 0 {
        return Err(Error::input(&format!("{p}.wraps"), "a tape needs at least one wrap"));
    }
    Ok(())
}

// ------------------------------------------------------ default stack-up --

/// One winding for [`default_stackup`].
#[derive(Debug, Clone, PartialEq)]
pub struct WindingSpec {
    pub name: String,
    pub turns: u32,
    pub conductor: Conductor,
    /// Conductors in hand (≥ 1).
    pub parallel: u32,
}

/// Interleaving order for [`default_stackup`]. Winding 0 is the primary.
#[derive(Debug, Clone, PartialEq)]
pub enum Pattern {
    /// P, S1, S2, … from the bobbin outward.
    Sequential,
    /// Split primary, P-S-P: half the primary, every other winding, the
    /// other half of the primary (the first half gets the odd turn).
    SplitPrimary,
    /// Split secondaries, S-P-S: half of each other winding, the primary,
    /// the other halves.
    SplitSecondaries,
    /// Centre-tapped halves mirrored about the primary: each secondary's
    /// "A" half (the last output innermost), the primary side (its "A" half
    /// then its "B" half, or a bridge's one primary), each secondary's "B"
    /// half (the first output innermost). Each half is then wound next to
    /// the primary half it conducts with, and the idle halves of each half
    /// cycle lie where the field is nil (common practice, no source).
    MirroredHalves,
    /// Explicit order: `(winding index, turns)` per section, inner first.
    /// The turns of each winding must add up to its total.
    Custom(Vec<(usize, u32)>),
}

/// The name of the single-switch forward's reset winding. It carries only
/// the magnetising current, so the split patterns wind it whole and
/// outermost, beside the outer face of the primary and out of the field of
/// the load current, where its proximity loss is nil (common practice, no
/// source).
pub const RESET_WINDING: &str = "reset";

impl Pattern {
    /// The sections `(winding index, turns)` bobbin outward for windings
    /// `(name, turns)`, winding 0 the primary: what [`default_stackup`]
    /// winds (sections of no turns included; a custom order as given).
    pub fn order(&self, windings: &[(&str, u32)]) -> Vec<(usize, u32)> {
        let half = |n: u32| (n.div_ceil(2), n / 2);
        let reset = |i: usize| i > 0 && windings[i].0 == RESET_WINDING;
        let others = || (1..windings.len()).filter(|&i| !reset(i));
        let resets = || (1..windings.len()).filter(|&i| reset(i)).map(|i| (i, windings[i].1));
        let Some(&(_, np)) = windings.first() else { return Vec::new() };
        match self {
            Pattern::Sequential => windings.iter().enumerate().map(|(i, w)| (i, w.1)).collect(),
            Pattern::SplitPrimary => {
                let (a, b) = half(np);
                let mut v = vec![(0, a)];
                v.extend(others().map(|i| (i, windings[i].1)));
                v.push((0, b));
                v.extend(resets());
                v
            }
            Pattern::SplitSecondaries => {
                let mut v: Vec<(usize, u32)> = others().map(|i| (i, half(windings[i].1).0)).collect();
                v.push((0, np));
                v.extend(others().map(|i| (i, half(windings[i].1).1)));
                v.extend(resets());
                v
            }
            Pattern::MirroredHalves => {
                let all = || windings.iter().enumerate();
                let primary = |n: &str| n.starts_with("primary");
                let mut v: Vec<(usize, u32)> =
                    all().rev().filter(|(_, w)| !primary(w.0) && w.0.ends_with(" A")).map(|(i, w)| (i, w.1)).collect();
                v.extend(all().filter(|(_, w)| primary(w.0)).map(|(i, w)| (i, w.1)));
                v.extend(all().filter(|(_, w)| !primary(w.0) && w.0.ends_with(" B")).map(|(i, w)| (i, w.1)));
                v.extend(
                    all()
                        .filter(|(_, w)| !primary(w.0) && !w.0.ends_with(" A") && !w.0.ends_with(" B"))
                        .map(|(i, w)| (i, w.1)),
                );
                v
            }
            Pattern::Custom(v) => v.clone(),
        }
    }
}

/// Insulation choices for [`default_stackup`].
#[derive(Debug, Clone, PartialEq)]
pub struct DefaultOptions {
    /// Tape between sections.
    pub section_tape: Tape,
    /// Tape over the last section.
    pub outer_tape: Tape,
    /// Tape between layers inside a section (None: no tape).
    pub interlayer: Option<Tape>,
    /// Margin tape width at each flange, m.
    pub margin: f64,
}

impl Default for DefaultOptions {
    /// Two wraps of 0.05 mm polyester between sections, three over the top,
    /// no inter-layer tape, no margin (common practice, no source; a mains
    /// transformer needs the margins and wraps its safety standard asks).
    fn default() -> Self {
        DefaultOptions {
            section_tape: Tape::polyester(2),
            outer_tape: Tape::polyester(3),
            interlayer: None,
            margin: 0.0,
        }
    }
}

/// Builds a stack-up for `windings` in the interleaving `pattern`, with
/// turns per layer and layers filled in from `core`'s bobbin (full layers
/// first), all sections wound clockwise from the left flange, and checks
/// that it fits. Errors name the winding (`windings[i]`) or the pattern.
pub fn default_stackup(
    core: &Core,
    windings: &[WindingSpec],
    pattern: &Pattern,
    opts: &DefaultOptions,
) -> Result<StackUp> {
    if windings.is_empty() {
        return Err(Error::input("windings", "give at least one winding"));
    }
    if let Pattern::Custom(v) = pattern {
        for (k, &(i, _)) in v.iter().enumerate() {
            if i >= windings.len() {
                return Err(Error::input(
                    &format!("pattern[{k}]"),
                    format!("winding index {i} but only {} windings", windings.len()),
                ));
            }
        }
        for (i, w) in windings.iter().enumerate() {
            let sum: u64 = v.iter().filter(|(j, _)| *j == i).map(|(_, t)| *t as u64).sum();
            if sum != w.turns as u64 {
                return Err(Error::input(
                    "pattern",
                    format!("the sections of \"{}\" add up to {sum} turns, not {}", w.name, w.turns),
                ));
            }
        }
    }
    let named: Vec<(&str, u32)> = windings.iter().map(|w| (w.name.as_str(), w.turns)).collect();
    let order = pattern.order(&named);
    let mut items = Vec::new();
    let sections: Vec<&(usize, u32)> = order.iter().filter(|(_, t)| *t > 0).collect();
    for (k, &&(i, turns)) in sections.iter().enumerate() {
        let w = &windings[i];
        let mut sec = Section {
            winding: w.name.clone(),
            turns,
            conductor: w.conductor.clone(),
            parallel: w.parallel,
            layers: None,
            turns_per_layer: None,
            direction: Direction::Clockwise,
            start: Side::Left,
            finish: Side::Left,
            margin_left: opts.margin,
            margin_right: opts.margin,
            interlayer: opts.interlayer.clone(),
        };
        let breadth = core.winding_breadth - 2.0 * opts.margin;
        let (tpl, layers) = super::fit::layout(&sec, breadth, &format!("windings[{i}]"))?;
        sec.turns_per_layer = Some(tpl);
        sec.layers = Some(layers);
        sec.finish = if layers % 2 == 1 { Side::Right } else { Side::Left };
        if sec.conductor.is_foil() {
            sec.finish = Side::Left;
        }
        items.push(Item::Section(sec));
        items.push(Item::Tape(if k + 1 == sections.len() {
            opts.outer_tape.clone()
        } else {
            opts.section_tape.clone()
        }));
    }
    let st = StackUp {
        windings: windings.iter().map(|w| WindingDef { name: w.name.clone() }).collect(),
        items,
    };
    st.validate()?;
    super::fit::fit(core, &st)?;
    Ok(st)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn names(order: &[(usize, u32)], w: &[(&str, u32)]) -> Vec<(String, u32)> {
        order.iter().map(|&(i, t)| (w[i].0.to_string(), t)).collect()
    }
    fn v(x: &[(&str, u32)]) -> Vec<(String, u32)> {
        x.iter().map(|(a, b)| (a.to_string(), *b)).collect()
    }

    #[test]
    fn the_split_patterns_wind_the_reset_whole_and_outermost() {
        let w = [("primary", 7), ("secondary 1", 6), ("reset", 7)];
        let o = |p: Pattern| names(&p.order(&w), &w);
        assert_eq!(o(Pattern::Sequential), v(&[("primary", 7), ("secondary 1", 6), ("reset", 7)]));
        assert_eq!(
            o(Pattern::SplitPrimary),
            v(&[("primary", 4), ("secondary 1", 6), ("primary", 3), ("reset", 7)])
        );
        assert_eq!(
            o(Pattern::SplitSecondaries),
            v(&[("secondary 1", 3), ("primary", 7), ("secondary 1", 3), ("reset", 7)])
        );
    }

    #[test]
    fn mirrored_halves_put_each_half_beside_its_primary_half() {
        // Push-pull, two outputs: A halves inside (the last output innermost),
        // the primary A then B, the B halves outside (the first innermost).
        let w = [
            ("primary A", 5),
            ("primary B", 5),
            ("secondary 1 A", 4),
            ("secondary 1 B", 4),
            ("secondary 2 A", 2),
            ("secondary 2 B", 2),
        ];
        assert_eq!(
            names(&Pattern::MirroredHalves.order(&w), &w),
            v(&[
                ("secondary 2 A", 2),
                ("secondary 1 A", 4),
                ("primary A", 5),
                ("primary B", 5),
                ("secondary 1 B", 4),
                ("secondary 2 B", 2),
            ])
        );
        // A bridge: one primary between its secondary's halves.
        let w = [("primary", 9), ("secondary 1 A", 3), ("secondary 1 B", 3)];
        assert_eq!(
            names(&Pattern::MirroredHalves.order(&w), &w),
            v(&[("secondary 1 A", 3), ("primary", 9), ("secondary 1 B", 3)])
        );
    }
}
