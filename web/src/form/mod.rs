//! The design being edited: the engine's [`Design`] file type, its input
//! form, and the one engine call per edit.
//!
//! State is the text of each field as typed (a signal each) plus the
//! choices made in drop-downs; the [`Design`] is derived from them
//! (`Form::parse`, called inside a memo), so typing is never fought by
//! reformatting. Every field's key is the engine's name for it (e.g.
//! `outputs[1].voltage`, `choices.bpk_limit`), so an engine error lands at the
//! field it names.
//!
//! Files: `fields` (every numeric entry: key, label, unit, help, how its
//! text reads and is written), `views` (the form's components), this one
//! (the state, the design derived from it, the engine call).

mod fields;
mod views;

pub use fields::*;
pub use views::*;

use leptos::prelude::*;
use magwright_engine::design::file::{Construction, Insulation, Interleave, SectionTurns, TurnsRule, WireOverride};
use magwright_engine::design::{self, Choices, CoreChoice, Design, MaterialChoice};
use magwright_engine::gap::GapPlacement;
use magwright_engine::notation;
use magwright_engine::topology::inductor::{Circuit, InductorOptions};
use magwright_engine::topology::{Bulk, FlybackOptions, FlybackRatio, Input, Isolation, Output, Spec, Topology};
use magwright_engine::Error;

/// What the engine says about a design.
pub type Report = design::Report;

/// What the page designs, shown under its name.
pub const TITLE: &str =
    "Transformers for flyback, forward (one and two switch), push-pull, half-bridge and full-bridge converters, and DC-biased inductors";

/// The design shown to a first-time visitor: the forward demo, which passes.
pub fn demo() -> Design {
    Design::demo_forward()
}

/// The one engine call per edit.
pub fn compute(d: &Design) -> Result<Report, Error> {
    design::evaluate(d)
}

/// Parse errors, per field key.
pub type FieldErrors = Vec<(&'static str, String)>;

/// Why there is no report.
#[derive(Debug, Clone, PartialEq)]
pub enum Problem {
    /// Entries that are not numbers (or not whole where they must be).
    Fields(FieldErrors),
    /// The engine refused the design.
    Engine(Error),
}

impl Problem {
    /// The message for one field, if this problem is about it.
    pub fn about(&self, key: &str) -> Option<String> {
        match self {
            Problem::Fields(errs) => errs.iter().find(|e| e.0 == key).map(|e| e.1.clone()),
            Problem::Engine(e) => {
                let f = e.field()?;
                (f == key || f.strip_prefix("spec.") == Some(key)).then(|| e.message().to_string())
            }
        }
    }
    /// One line per problem, each naming its field by label.
    pub fn lines(&self) -> Vec<String> {
        match self {
            Problem::Fields(errs) => errs.iter().map(|(k, m)| format!("{}: {m}", label_of(k))).collect(),
            Problem::Engine(e) => vec![match e.field() {
                Some(k) => format!("{}: {}", label_of(k), e.message()),
                None => e.message().to_string(),
            }],
        }
    }
}

/// The result of one edit: the engine's report or why there is none.
pub type Outcome = Result<Report, Problem>;

/// DC bus or rectified AC line.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum InputKind {
    Dc,
    Ac,
}

/// How the flyback's turns ratio is set.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RatioKind {
    FromDuty,
    Reflected,
    Turns,
}

/// How the primary turns are chosen.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RuleKind {
    LeastLoss,
    Fewest,
    Fixed,
}

/// The form's state: the text of every field as typed, and every choice.
#[derive(Clone, Copy)]
pub struct Form {
    pub name: RwSignal<String>,
    pub topology: RwSignal<Topology>,
    pub input: RwSignal<InputKind>,
    pub isolation: RwSignal<Isolation>,
    pub ratio: RwSignal<RatioKind>,
    pub rule: RwSignal<RuleKind>,
    pub gap: RwSignal<GapPlacement>,
    pub interleave: RwSignal<Interleave>,
    /// Reinforced insulation's construction (kept as loaded; the windings
    /// panel sets it).
    pub construction: RwSignal<Construction>,
    pub texts: [RwSignal<String>; ix::COUNT],
    /// How many outputs are in use (1 to 4).
    pub outputs: RwSignal<usize>,
    pub out_texts: [[RwSignal<String>; 3]; 4],
    /// The core: a library designation or the user's own.
    pub core: RwSignal<CoreChoice>,
    pub material: RwSignal<MaterialChoice>,
    /// Conductors the user fixed per winding (the stack-up editor).
    pub wires: RwSignal<Vec<WireOverride>>,
    /// The sections bobbin outward when the interleaving is custom.
    pub section_order: RwSignal<Vec<SectionTurns>>,
    /// Inductor kind: buck or boost.
    pub circuit: RwSignal<Circuit>,
    /// Inductor kind: the target inductance as typed (empty: from the ripple ratio).
    pub inductance: RwSignal<String>,
    /// The output choke's core, kept as loaded (`None`: automatic).
    pub choke_core: RwSignal<Option<CoreChoice>>,
}

/// The inductor options of a design (defaults when it has none).
fn inductor_of(d: &Design) -> InductorOptions {
    d.spec.inductor.unwrap_or_default()
}

fn inductance_text(d: &Design) -> String {
    inductor_of(d).inductance.map(|l| text_of(l, true)).unwrap_or_default()
}

/// The numeric values of a design, in [`NUMS`] order (entries the design
/// does not use keep the demo's values, so switching input kind or
/// topology shows sensible numbers).
fn values(d: &Design) -> [Option<f64>; ix::COUNT] {
    let fly = Design::demo_flyback().spec;
    let ac_demo = match fly.input {
        Input::Ac { vac_min, vac_nominal, vac_max, line_frequency, bulk, bridge_drop } => {
            (vac_min, vac_nominal, vac_max, line_frequency, bulk, bridge_drop)
        }
        Input::Dc { .. } => (85.0, 230.0, 265.0, 50.0, Bulk::Capacitance { farads: 68e-6 }, 1.6),
    };
    let s = &d.spec;
    let (dc_min, dc_nom, dc_max) = match s.input {
        Input::Dc { min, nominal, max } => (min, nominal, max),
        Input::Ac { .. } => (36.0, 48.0, 60.0),
    };
    let (vmin, vnom, vmax, lf, bulk, bridge) = match s.input {
        Input::Ac { vac_min, vac_nominal, vac_max, line_frequency, bulk, bridge_drop } => {
            (vac_min, vac_nominal, vac_max, line_frequency, bulk, bridge_drop)
        }
        Input::Dc { .. } => ac_demo,
    };
    let farads = match bulk {
        Bulk::Capacitance { farads } => farads,
        Bulk::RippleRatio { .. } => 68e-6,
    };
    let fly_value = match s.flyback.ratio {
        FlybackRatio::FromDutyMax => 100.0,
        FlybackRatio::ReflectedVoltage(v) => v,
        FlybackRatio::TurnsRatio(n) => n,
    };
    let ch = &d.choices;
    let fixed = match ch.turns {
        TurnsRule::Primary { turns } => turns,
        _ => 10,
    };
    [
        Some(dc_min),
        Some(dc_nom),
        Some(dc_max),
        Some(vmin),
        Some(vnom),
        Some(vmax),
        Some(lf),
        Some(farads),
        Some(bridge),
        Some(s.frequency),
        Some(s.duty_max),
        Some(s.efficiency),
        Some(s.ambient),
        Some(s.temperature_max),
        Some(s.choke_ripple_ratio),
        Some(fly_value),
        Some(s.flyback.ripple_ratio),
        ch.bpk_limit,
        Some(ch.saturation_margin),
        Some(f64::from(fixed)),
        Some(ch.window_utilisation),
        Some(ch.edge_time),
        ch.switch_voltage_rating,
        Some(f64::from(ch.insulation.section_wraps)),
        Some(f64::from(ch.insulation.outer_wraps)),
        Some(f64::from(ch.insulation.interlayer_wraps)),
        Some(ch.insulation.tape_thickness),
        ch.insulation.margin,
        Some(f64::from(ch.max_parallel)),
        ch.clamp_voltage,
        Some(ch.magnetic_loss_share),
    ]
}

fn out_values(d: &Design) -> [[f64; 3]; 4] {
    let demo = [[12.0, 1.0, 0.5], [5.0, 0.5, 0.4], [15.0, 0.2, 0.7], [3.3, 0.5, 0.4]];
    std::array::from_fn(|i| match d.spec.outputs.get(i) {
        Some(o) => [o.voltage, o.current, o.rectifier_drop],
        None => demo[i],
    })
}

impl Form {
    pub fn new(d: &Design) -> Self {
        let vals = values(d);
        let outs = out_values(d);
        let f = Form {
            name: RwSignal::new(String::new()),
            topology: RwSignal::new(d.spec.topology),
            input: RwSignal::new(InputKind::Dc),
            isolation: RwSignal::new(d.spec.isolation),
            ratio: RwSignal::new(RatioKind::FromDuty),
            rule: RwSignal::new(RuleKind::LeastLoss),
            gap: RwSignal::new(d.choices.gap_placement),
            interleave: RwSignal::new(d.choices.interleave),
            construction: RwSignal::new(d.choices.insulation.construction),
            texts: std::array::from_fn(|i| RwSignal::new(vals[i].map(|v| NUMS[i].text(v)).unwrap_or_default())),
            outputs: RwSignal::new(d.spec.outputs.len().clamp(1, 4)),
            out_texts: std::array::from_fn(|i| std::array::from_fn(|j| RwSignal::new(text_of(outs[i][j], false)))),
            core: RwSignal::new(d.core.clone()),
            material: RwSignal::new(d.material.clone()),
            wires: RwSignal::new(d.choices.wires.clone()),
            section_order: RwSignal::new(d.choices.section_order.clone()),
            circuit: RwSignal::new(inductor_of(d).circuit),
            inductance: RwSignal::new(inductance_text(d)),
            choke_core: RwSignal::new(d.choices.choke_core.clone()),
        };
        f.set_choices(d);
        f
    }

    fn set_choices(&self, d: &Design) {
        self.name.set(d.name.clone());
        self.topology.set(d.spec.topology);
        self.input.set(match d.spec.input {
            Input::Dc { .. } => InputKind::Dc,
            Input::Ac { .. } => InputKind::Ac,
        });
        self.isolation.set(d.spec.isolation);
        self.ratio.set(match d.spec.flyback.ratio {
            FlybackRatio::FromDutyMax => RatioKind::FromDuty,
            FlybackRatio::ReflectedVoltage(_) => RatioKind::Reflected,
            FlybackRatio::TurnsRatio(_) => RatioKind::Turns,
        });
        self.rule.set(match d.choices.turns {
            TurnsRule::LeastLoss => RuleKind::LeastLoss,
            TurnsRule::FewestTurns => RuleKind::Fewest,
            TurnsRule::Primary { .. } => RuleKind::Fixed,
        });
        self.gap.set(d.choices.gap_placement);
        self.interleave.set(d.choices.interleave);
        self.construction.set(d.choices.insulation.construction);
        self.outputs.set(d.spec.outputs.len().clamp(1, 4));
        self.core.set(d.core.clone());
        self.material.set(d.material.clone());
        self.wires.set(d.choices.wires.clone());
        self.section_order.set(d.choices.section_order.clone());
        self.circuit.set(inductor_of(d).circuit);
        self.inductance.set(inductance_text(d));
        self.choke_core.set(d.choices.choke_core.clone());
    }

    /// Replaces every field with the values of `d` (opening a file).
    pub fn set(&self, d: &Design) {
        for ((sig, v), def) in self.texts.iter().zip(values(d)).zip(&NUMS) {
            sig.set(v.map(|v| def.text(v)).unwrap_or_default());
        }
        for (row, vals) in self.out_texts.iter().zip(out_values(d)) {
            for (sig, v) in row.iter().zip(vals) {
                sig.set(text_of(v, false));
            }
        }
        self.set_choices(d);
    }

    /// The design the form describes, or every field that does not read.
    /// Reactive: call inside a memo.
    pub fn parse(&self) -> Result<Design, FieldErrors> {
        let mut errs: FieldErrors = Vec::new();
        let topology = self.topology.get();
        let input_kind = self.input.get();
        let ratio = self.ratio.get();
        let rule = self.rule.get();
        let used = |d: &NumDef| match d.group {
            Group::Dc => input_kind == InputKind::Dc,
            Group::Ac => input_kind == InputKind::Ac,
            Group::Flyback => topology == Topology::Flyback && (d.key != "flyback.ratio" || ratio != RatioKind::FromDuty),
            _ => d.key != "choices.turns.turns" || rule == RuleKind::Fixed,
        };
        let mut vals: [Option<f64>; ix::COUNT] = [None; ix::COUNT];
        for (i, d) in NUMS.iter().enumerate() {
            if !used(d) {
                vals[i] = self.texts[i].with_untracked(|t| d.read(t).ok());
                continue;
            }
            let text = self.texts[i].get();
            if d.optional && text.trim().is_empty() {
                continue;
            }
            // Counts are read as counts: "-1" or "2.5" is refused, never made 0.
            // A reflected voltage may carry its V.
            let read = if d.key == "flyback.ratio" && ratio == RatioKind::Reflected {
                notation::parse(&text, "V")
            } else {
                d.read(&text)
            };
            match read {
                Ok(v) => vals[i] = Some(v),
                Err(e) => errs.push((d.key, e.to_string())),
            }
        }
        let n_out = self.outputs.get().clamp(1, 4);
        let mut outputs = Vec::with_capacity(n_out);
        for (row, keys) in self.out_texts.iter().zip(&OUT_KEYS).take(n_out) {
            let mut v = [0.0; 3];
            for j in 0..3 {
                match notation::parse(&row[j].get(), ["V", "A", "V"][j]) {
                    Ok(x) => v[j] = x,
                    Err(e) => errs.push((keys[j], e.to_string())),
                }
            }
            outputs.push(Output { voltage: v[0], current: v[1], rectifier_drop: v[2] });
        }
        let inductor = if topology == Topology::Inductor {
            let text = self.inductance.get();
            let inductance = if text.trim().is_empty() {
                None
            } else {
                match notation::parse(&text, "H") {
                    Ok(l) => Some(l),
                    Err(e) => {
                        errs.push(("inductor.inductance", e.to_string()));
                        None
                    }
                }
            };
            Some(InductorOptions { circuit: self.circuit.get(), inductance })
        } else {
            None
        };
        if !errs.is_empty() {
            return Err(errs);
        }
        let g = |i: usize| vals[i].unwrap_or(0.0);
        let whole = |i: usize| g(i).clamp(0.0, 1e6) as u32;
        let input = match input_kind {
            InputKind::Dc => Input::Dc { min: g(ix::DC_MIN), nominal: g(ix::DC_NOM), max: g(ix::DC_MAX) },
            InputKind::Ac => Input::Ac {
                vac_min: g(ix::VAC_MIN),
                vac_nominal: g(ix::VAC_NOM),
                vac_max: g(ix::VAC_MAX),
                line_frequency: g(ix::LINE_F),
                bulk: Bulk::Capacitance { farads: g(ix::BULK) },
                bridge_drop: g(ix::BRIDGE),
            },
        };
        let spec = Spec {
            topology,
            input,
            outputs,
            frequency: g(ix::FREQ),
            duty_max: g(ix::DUTY),
            efficiency: g(ix::EFF),
            ambient: g(ix::AMBIENT),
            temperature_max: g(ix::HOT),
            isolation: self.isolation.get(),
            flyback: FlybackOptions {
                ratio: match ratio {
                    RatioKind::FromDuty => FlybackRatio::FromDutyMax,
                    RatioKind::Reflected => FlybackRatio::ReflectedVoltage(g(ix::FLY_VALUE)),
                    RatioKind::Turns => FlybackRatio::TurnsRatio(g(ix::FLY_VALUE)),
                },
                ripple_ratio: g(ix::FLY_RIPPLE),
            },
            choke_ripple_ratio: g(ix::CHOKE),
            inductor,
        };
        let choices = Choices {
            bpk_limit: vals[ix::BPK_LIMIT],
            saturation_margin: g(ix::MARGIN),
            turns: match rule {
                RuleKind::LeastLoss => TurnsRule::LeastLoss,
                RuleKind::Fewest => TurnsRule::FewestTurns,
                RuleKind::Fixed => TurnsRule::Primary { turns: whole(ix::TURNS) },
            },
            gap_placement: self.gap.get(),
            interleave: self.interleave.get(),
            section_order: self.section_order.get(),
            window_utilisation: g(ix::KU),
            wires: self.wires.get(),
            insulation: Insulation {
                section_wraps: whole(ix::WRAPS),
                outer_wraps: whole(ix::OUTER_WRAPS),
                interlayer_wraps: whole(ix::LAYER_WRAPS),
                tape_thickness: g(ix::TAPE),
                margin: vals[ix::FLANGE],
                construction: self.construction.get(),
            },
            edge_time: g(ix::EDGE),
            switch_voltage_rating: vals[ix::SW_RATING],
            max_parallel: whole(ix::MAX_PARALLEL),
            clamp_voltage: vals[ix::CLAMP],
            magnetic_loss_share: g(ix::LOSS_SHARE),
            choke_core: self.choke_core.get(),
        };
        Ok(Design {
            schema: design::file::SCHEMA.into(),
            version: design::file::VERSION,
            name: self.name.get(),
            spec,
            core: self.core.get(),
            material: self.material.get(),
            choices,
        })
    }
}


#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn texts_read_back_exactly() {
        for p in [false, true] {
            for v in [200e3, 150e-3, 36.0, 0.45, 123456.0, 1.0 / 3.0, 0.0, -40.0, 22.0, 4.7e-6, 99999.9] {
                assert_eq!(notation::parse(&text_of(v, p), ""), Ok(v), "{v} -> {}", text_of(v, p));
            }
        }
        assert_eq!(text_of(200e3, true), "200k");
        assert_eq!(text_of(0.15, true), "150m");
    }

    #[test]
    fn mm_and_percent_fields_read_back_exactly() {
        let duty = &NUMS[ix::DUTY];
        let tape = &NUMS[ix::TAPE];
        assert_eq!((duty.unit, tape.unit), ("%", "mm"));
        assert_eq!(duty.text(0.45), "45");
        assert_eq!(duty.read("45"), Ok(0.45));
        assert_eq!(duty.read("45 %"), Ok(0.45));
        assert_eq!(tape.text(0.05e-3), "0.05");
        assert_eq!(tape.read("0.05"), Ok(0.05e-3));
        assert_eq!(tape.read("0.05 mm"), Ok(0.05e-3));
        for d in [duty, tape, &NUMS[ix::MARGIN], &NUMS[ix::FLANGE], &NUMS[ix::KU]] {
            for v in [0.45, 0.2, 0.3, 0.42, 0.9, 1.6e-3, 0.05e-3, 2.5e-3, 0.123456789] {
                assert_eq!(d.read(&d.text(v)), Ok(v), "{} {v} -> {}", d.key, d.text(v));
            }
            // No decimal divided by 100 is exactly 1/3: the nearest is kept.
            let third = d.read(&d.text(1.0 / 3.0)).unwrap();
            assert!((third * 3.0 - 1.0).abs() < 1e-15, "{third}");
        }
    }

    #[test]
    fn every_key_has_a_label() {
        for d in &NUMS {
            assert_eq!(label_of(d.key), d.label);
        }
        assert_eq!(label_of("outputs[1].current"), "Output 2 I");
        assert_eq!(label_of("spec.frequency"), "fsw");
    }
}
