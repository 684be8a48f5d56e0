//! The design being edited: the engine's [`Design`] file type, its input
//! form, and the one engine call per edit.
//!
//! State is the text of each field as typed (a signal each) plus the
//! choices made in drop-downs; the [`Design`] is derived from them
//! (`Form::parse`, called inside a memo), so typing is never fought by
//! reformatting. Every field's key is the engine's name for it (e.g.
//! `outputs[1].voltage`, `choices.bpk_limit`), so an engine error lands at the
//! field it names.

use crate::field::Field;
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

/// Which part of the form a numeric entry belongs to.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Group {
    Dc,
    Ac,
    Converter,
    Flyback,
    Flux,
    Winding,
}

/// A numeric entry: its engine key, label, unit and help.
pub struct NumDef {
    pub key: &'static str,
    pub label: &'static str,
    pub unit: &'static str,
    pub help: &'static str,
    pub group: Group,
    /// Whole numbers only.
    pub whole: bool,
    /// Shown with an SI prefix when loaded ("200k", "150m").
    pub prefixed: bool,
    /// May be left empty (then "automatic").
    pub optional: bool,
    /// Shown units per SI unit: 1000 for a length in mm, 100 for a
    /// fraction in %, 1 when the field holds the SI value itself.
    pub per: f64,
}

const fn num(key: &'static str, label: &'static str, unit: &'static str, group: Group, help: &'static str) -> NumDef {
    NumDef { key, label, unit, help, group, whole: false, prefixed: false, optional: false, per: 1.0 }
}

/// A fraction entered and shown in % (the results show fractions in %).
const fn pct(key: &'static str, label: &'static str, group: Group, help: &'static str) -> NumDef {
    NumDef { per: 100.0, ..num(key, label, "%", group, help) }
}

/// A length entered and shown in mm.
const fn mm(key: &'static str, label: &'static str, group: Group, help: &'static str) -> NumDef {
    NumDef { per: 1000.0, ..num(key, label, "mm", group, help) }
}

impl NumDef {
    /// The field's text for the SI value `v`: exact where a decimal in the
    /// shown unit divides back to `v`, else the nearest (e.g. 1/3 in %).
    pub fn text(&self, v: f64) -> String {
        if self.per == 1.0 {
            return text_of(v, self.prefixed);
        }
        // The shortest text whose value, divided by `per`, is exactly `v`.
        let shown = v * self.per;
        for digits in 1..=17 {
            let t = format!("{:.*}", digits, shown);
            let t = if t.contains('.') { t.trim_end_matches('0').trim_end_matches('.').to_string() } else { t };
            if notation::parse(&t, "").is_ok_and(|x| x / self.per == v) {
                return t;
            }
        }
        format!("{shown}")
    }

    /// The SI value of the field's text (a `per` unit divided out).
    pub fn read(&self, text: &str) -> Result<f64, notation::ParseError> {
        if self.whole {
            return notation::parse_count(text).map(f64::from);
        }
        notation::parse(text, self.unit).map(|x| x / self.per)
    }
}

/// Indices of the entries in [`NUMS`], by name.
pub mod ix {
    pub const DC_MIN: usize = 0;
    pub const DC_NOM: usize = 1;
    pub const DC_MAX: usize = 2;
    pub const VAC_MIN: usize = 3;
    pub const VAC_NOM: usize = 4;
    pub const VAC_MAX: usize = 5;
    pub const LINE_F: usize = 6;
    pub const BULK: usize = 7;
    pub const BRIDGE: usize = 8;
    pub const FREQ: usize = 9;
    pub const DUTY: usize = 10;
    pub const EFF: usize = 11;
    pub const AMBIENT: usize = 12;
    pub const HOT: usize = 13;
    pub const CHOKE: usize = 14;
    pub const FLY_VALUE: usize = 15;
    pub const FLY_RIPPLE: usize = 16;
    pub const BPK_LIMIT: usize = 17;
    pub const MARGIN: usize = 18;
    pub const TURNS: usize = 19;
    pub const KU: usize = 20;
    pub const EDGE: usize = 21;
    pub const SW_RATING: usize = 22;
    pub const WRAPS: usize = 23;
    pub const OUTER_WRAPS: usize = 24;
    pub const LAYER_WRAPS: usize = 25;
    pub const TAPE: usize = 26;
    pub const FLANGE: usize = 27;
    pub const MAX_PARALLEL: usize = 28;
    pub const CLAMP: usize = 29;
    pub const LOSS_SHARE: usize = 30;
    pub const COUNT: usize = 31;
}

/// Every numeric entry except the outputs, in [`ix`] order.
pub const NUMS: [NumDef; ix::COUNT] = [
    num("input.min", "Vin min", "V", Group::Dc, "Lowest DC input voltage"),
    num("input.nominal", "Vin nominal", "V", Group::Dc, "Usual DC input voltage"),
    num("input.max", "Vin max", "V", Group::Dc, "Highest DC input voltage"),
    num("input.vac_min", "Vac min", "V", Group::Ac, "Lowest line voltage, RMS"),
    num("input.vac_nominal", "Vac nominal", "V", Group::Ac, "Usual line voltage, RMS"),
    num("input.vac_max", "Vac max", "V", Group::Ac, "Highest line voltage, RMS"),
    num("input.line_frequency", "Line frequency", "Hz", Group::Ac, "Lowest line frequency the product accepts"),
    NumDef {
        prefixed: true,
        ..num("input.bulk.farads", "Bulk capacitor", "F", Group::Ac, "Capacitance on the rectified line, e.g. 68u")
    },
    num("input.bridge_drop", "Bridge drop", "V", Group::Ac, "Drop of two bridge diodes in series"),
    NumDef { prefixed: true, ..num("frequency", "fsw", "Hz", Group::Converter, "Switching frequency, e.g. 200k") },
    pct("duty_max", "Duty max", Group::Converter, "Largest on-time of one switch over its period, %"),
    pct("efficiency", "Efficiency", Group::Converter, "Estimated Pout/Pin of the converter, %"),
    num("ambient", "Ambient", "°C", Group::Converter, "Air temperature around the magnetic"),
    num("temperature_max", "Core temp. max", "°C", Group::Converter, "Highest mean surface temperature of the magnetic (McLyman's surface-dissipation model); the winding's hottest point runs higher"),
    num("choke_ripple_ratio", "Choke ripple", "", Group::Converter, "Output choke ripple ΔI/Iout at Vin max (forward, push-pull, bridges); inductor: ΔI/IL at its largest"),
    num("flyback.ratio", "Ratio value", "", Group::Flyback, "Reflected voltage (V) or turns ratio Np/Ns, as chosen"),
    num("flyback.ripple_ratio", "Ripple ratio", "", Group::Flyback, "ΔIp/Ip,centre at Vin min: below 2 CCM, 2 boundary, above DCM"),
    NumDef {
        prefixed: true,
        optional: true,
        ..num("choices.bpk_limit", "Bpk limit", "T", Group::Flux, "Highest peak flux density; empty: Bsat at the core temperature limit less the margin")
    },
    pct("choices.saturation_margin", "Bsat margin", Group::Flux, "Share kept below Bsat, e.g. 20 %"),
    NumDef {
        whole: true,
        ..num("choices.turns.turns", "Primary turns", "", Group::Flux, "Used when the turns rule is 'fixed'")
    },
    pct("choices.window_utilisation", "Window use Ku", Group::Winding, "Copper share of the window for automatic wire, %"),
    NumDef {
        prefixed: true,
        ..num("choices.edge_time", "Edge time", "s", Group::Winding, "Switching rise/fall time; 0 takes ideal steps (conservative)")
    },
    NumDef {
        optional: true,
        ..num("choices.switch_voltage_rating", "Switch rating", "V", Group::Converter, "Checked against the switch's off-state voltage; empty: not checked")
    },
    NumDef { whole: true, ..num("choices.insulation.section_wraps", "Tape between sections", "wraps", Group::Winding, "") },
    NumDef { whole: true, ..num("choices.insulation.outer_wraps", "Tape over the top", "wraps", Group::Winding, "") },
    NumDef { whole: true, ..num("choices.insulation.interlayer_wraps", "Tape between layers", "wraps", Group::Winding, "") },
    mm("choices.insulation.tape_thickness", "Tape thickness", Group::Winding, "One wrap, mm, e.g. 0.05"),
    NumDef {
        optional: true,
        ..mm("choices.insulation.margin", "Flange margin", Group::Winding, "Margin tape at each flange, mm; empty: from the isolation class")
    },
    NumDef {
        whole: true,
        ..num("choices.max_parallel", "Most wires in hand", "", Group::Winding, "Round wires in parallel the automatic conductor may use; beyond it litz or foil")
    },
    NumDef {
        optional: true,
        ..num("choices.clamp_voltage", "Clamp voltage", "V", Group::Converter, "Voltage across the leakage clamp; empty: 1.5 × the reflected (flyback) or reset voltage")
    },
    pct(
        "choices.magnetic_loss_share",
        "Loss share",
        Group::Converter,
        "The magnetic's share of the converter's loss budget Pin − Pout, %, e.g. 50",
    ),
];

/// The outputs' keys: voltage, current, rectifier drop, for up to four.
pub const OUT_KEYS: [[&str; 3]; 4] = [
    ["outputs[0].voltage", "outputs[0].current", "outputs[0].rectifier_drop"],
    ["outputs[1].voltage", "outputs[1].current", "outputs[1].rectifier_drop"],
    ["outputs[2].voltage", "outputs[2].current", "outputs[2].rectifier_drop"],
    ["outputs[3].voltage", "outputs[3].current", "outputs[3].rectifier_drop"],
];

/// The label of a field key.
pub fn label_of(key: &str) -> String {
    let key = key.strip_prefix("spec.").unwrap_or(key);
    if let Some(d) = NUMS.iter().find(|d| d.key == key) {
        return d.label.to_string();
    }
    for (i, ks) in OUT_KEYS.iter().enumerate() {
        for (j, k) in ks.iter().enumerate() {
            if *k == key {
                return format!("Output {} {}", i + 1, ["V", "I", "Vf"][j]);
            }
        }
    }
    match key.split(['.', '[']).next().unwrap_or(key) {
        "core" => "Core".into(),
        "material" => "Material".into(),
        "outputs" => "Outputs".into(),
        "topology" => "Topology".into(),
        "turns" => "Turns".into(),
        "gap" => "Gap".into(),
        "choices" if key.starts_with("choices.choke_core") => "Choke core".into(),
        "choices" => "Choices".into(),
        "inductor" => "Inductance".into(),
        _ => "Input".into(),
    }
}

/// The shortest text that reads back as exactly `v`: with an SI prefix
/// when asked and exact ("200k", "150m"), else the plain number.
pub fn text_of(v: f64, prefixed: bool) -> String {
    if prefixed && v != 0.0 && v.is_finite() {
        for digits in 1..=17 {
            let t = notation::format(v, "", digits).replace(' ', "").replace('µ', "u");
            if notation::parse(&t, "") == Ok(v) {
                return t;
            }
        }
    }
    format!("{v}")
}

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

/// The message for one field, derived from the outcome.
pub fn field_error(outcome: Memo<Outcome>, key: &'static str) -> Signal<Option<String>> {
    Signal::derive(move || outcome.with(|o| o.as_ref().err().and_then(|p| p.about(key))))
}

/// The numeric fields of one group.
pub fn num_fields(form: Form, outcome: Memo<Outcome>, group: Group) -> impl IntoView {
    NUMS.iter()
        .enumerate()
        .filter(|(_, d)| d.group == group)
        .map(|(i, d)| {
            view! { <Field key=d.key label=d.label unit=d.unit text=form.texts[i] error=field_error(outcome, d.key) help=d.help /> }
        })
        .collect_view()
}

/// A drop-down over a small enum: `(value, label)` pairs.
#[component]
pub fn Pick<T>(
    key: &'static str,
    label: &'static str,
    value: RwSignal<T>,
    options: Vec<(T, &'static str)>,
    #[prop(optional)] help: &'static str,
) -> impl IntoView
where
    T: Copy + PartialEq + Send + Sync + 'static,
{
    let id = format!("f-{key}");
    let opts = options.clone();
    view! {
        <div class="field">
            <label for=id.clone() title=help>{label}</label>
            <select
                id=id
                on:change:target=move |ev| {
                    if let Ok(i) = ev.target().value().parse::<usize>() {
                        if let Some((v, _)) = opts.get(i) {
                            value.set(*v);
                        }
                    }
                }
            >
                {options
                    .into_iter()
                    .enumerate()
                    .map(|(i, (v, l))| view! { <option value=i.to_string() prop:selected=move || value.get() == v>{l}</option> })
                    .collect_view()}
            </select>
            <div class="msg"></div>
        </div>
    }
}

/// Topology, input, outputs and the converter's numbers.
#[component]
pub fn SpecFields(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    let topologies = vec![
        (Topology::Forward, "Forward, single switch with reset winding"),
        (Topology::TwoSwitchForward, "Forward, two switch"),
        (Topology::Flyback, "Flyback"),
        (Topology::PushPull, "Push-pull"),
        (Topology::HalfBridge, "Half bridge"),
        (Topology::FullBridge, "Full bridge"),
        (Topology::Inductor, "Inductor with DC bias (buck, boost)"),
    ];
    let is_inductor = move || form.topology.get() == Topology::Inductor;
    let has_choke = move || !matches!(form.topology.get(), Topology::Flyback | Topology::Inductor);
    let is_ac = move || form.input.get() == InputKind::Ac;
    let is_flyback = move || form.topology.get() == Topology::Flyback;
    let needs_value = move || form.ratio.get() != RatioKind::FromDuty;
    view! {
        <div class="fields">
            <Pick key="topology" label="Topology" value=form.topology options=topologies />
            <Pick key="input-kind" label="Input" value=form.input options=vec![(InputKind::Dc, "DC bus"), (InputKind::Ac, "AC line, rectified")] />
        </div>
        <div class="fields" class:hidden=is_ac>{num_fields(form, outcome, Group::Dc)}</div>
        <div class="fields" class:hidden=move || !is_ac()>{num_fields(form, outcome, Group::Ac)}</div>
        <Outputs form=form outcome=outcome />
        <div class="fields">
            {num_fields(form, outcome, Group::Converter)}
            <Pick key="isolation" label="Isolation" value=form.isolation
                options=vec![(Isolation::Functional, "Functional"), (Isolation::Basic, "Basic"), (Isolation::Reinforced, "Reinforced")]
                help="Sets the insulation Magwright suggests and the cautions it shows" />
        </div>
        <div class="fields" class:hidden=move || !is_inductor()>
            <Pick key="inductor-circuit" label="Circuit" value=form.circuit
                options=vec![(Circuit::Buck, "Buck (or output choke)"), (Circuit::Boost, "Boost")]
                help="Where the inductor sits: in series with the output (buck) or the input (boost)" />
            <Field key="inductor.inductance" label="Inductance" unit="H" text=form.inductance
                error=field_error(outcome, "inductor.inductance")
                help="Target inductance, e.g. 22u; empty: from the choke ripple ratio over the input range" />
        </div>
        <div class="fields" class:hidden=move || !has_choke()>
            <ChokeCore form=form />
        </div>
        <div class="fields" class:hidden=move || !is_flyback()>
            <Pick key="flyback-ratio" label="Flyback ratio from" value=form.ratio
                options=vec![(RatioKind::FromDuty, "Duty max at Vin min"), (RatioKind::Reflected, "Reflected voltage"), (RatioKind::Turns, "Turns ratio Np/Ns")] />
            {NUMS.iter().enumerate().filter(|(_, d)| d.group == Group::Flyback).map(|(i, d)| {
                let hide = d.key == "flyback.ratio";
                let plain = d.unit;
                let unit = Signal::derive(move || if hide && form.ratio.get() == RatioKind::Reflected { "V" } else { plain });
                view! {
                    <div class:hidden=move || hide && !needs_value()>
                        <Field key=d.key label=d.label unit=unit text=form.texts[i] error=field_error(outcome, d.key) help=d.help />
                    </div>
                }
            }).collect_view()}
        </div>
    }
}

/// The output choke's core: automatic (least loss among a few library
/// cores), a library core, or the user's own core as loaded from a file.
#[component]
fn ChokeCore(form: Form) -> impl IntoView {
    let names: Vec<String> = magwright_engine::core::library::all().iter().map(|c| c.designation.clone()).collect();
    let own = move || form.choke_core.with(|c| matches!(c, Some(CoreChoice::Shape { .. } | CoreChoice::Effective { .. })));
    let selected = move || {
        form.choke_core.with(|c| match c {
            None => "auto".to_string(),
            Some(CoreChoice::Library { designation }) => designation.clone(),
            Some(_) => "own".to_string(),
        })
    };
    let opts = names.clone();
    view! {
        <div class="field">
            <label for="f-choices.choke_core" title="The output choke's core; automatic: the least-loss passing one of a few library cores near the size it needs">"Choke core"</label>
            <select
                id="f-choices.choke_core"
                on:change:target=move |ev| {
                    let v = ev.target().value();
                    match v.as_str() {
                        "auto" => form.choke_core.set(None),
                        "own" => {}
                        d if opts.iter().any(|n| n == d) => form.choke_core.set(Some(CoreChoice::Library { designation: d.to_string() })),
                        _ => {}
                    }
                }
            >
                <option value="auto" prop:selected=move || selected() == "auto">"Automatic (least loss)"</option>
                {move || own().then(|| view! { <option value="own" prop:selected=true>"Own core (from the file)"</option> })}
                {names
                    .into_iter()
                    .map(|n| {
                        let (value, key) = (n.clone(), n.clone());
                        view! { <option value=value prop:selected=move || selected() == key>{n}</option> }
                    })
                    .collect_view()}
            </select>
            <div class="msg"></div>
        </div>
    }
}

/// One to four outputs, each with V, I and the rectifier drop.
#[component]
fn Outputs(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    let rows = (0..4)
        .map(|i| {
            let keys = OUT_KEYS[i];
            let t = form.out_texts[i];
            view! {
                <div class="output-row" class:hidden=move || { form.outputs.get() <= i } data-testid=format!("output-{i}")>
                    <span class="output-name">{format!("Output {}", i + 1)}</span>
                    <Field key=keys[0] label="V" unit="V" text=t[0] error=field_error(outcome, keys[0]) help="Output voltage" />
                    <Field key=keys[1] label="I" unit="A" text=t[1] error=field_error(outcome, keys[1]) help="Full-load output current" />
                    <Field key=keys[2] label="Vf" unit="V" text=t[2] error=field_error(outcome, keys[2]) help="Rectifier forward drop" />
                </div>
            }
        })
        .collect_view();
    view! {
        <fieldset class="outputs">
            <legend>"Outputs (the first is regulated)"</legend>
            {rows}
            <div class="msg" role="alert">{move || field_error(outcome, "outputs").get().unwrap_or_default()}</div>
            <div class="row-actions">
                <button type="button" data-testid="add-output" disabled=move || { form.outputs.get() >= 4 }
                    on:click=move |_| form.outputs.update(|n| *n = (*n + 1).min(4))>"Add output"</button>
                <button type="button" data-testid="remove-output" disabled=move || { form.outputs.get() <= 1 }
                    on:click=move |_| form.outputs.update(|n| *n = n.saturating_sub(1).max(1))>"Remove last"</button>
            </div>
        </fieldset>
    }
}

/// Flux limit, turns rule and gap.
#[component]
pub fn FluxFields(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    let fixed = move || form.rule.get() == RuleKind::Fixed;
    view! {
        <div class="fields">
            <Pick key="turns-rule" label="Turns" value=form.rule
                options=vec![(RuleKind::LeastLoss, "Least loss"), (RuleKind::Fewest, "Fewest within Bpk"), (RuleKind::Fixed, "Fixed primary turns")]
                help="Least loss balances core and copper loss; fewest uses the flux limit alone" />
            {NUMS.iter().enumerate().filter(|(_, d)| d.group == Group::Flux).map(|(i, d)| {
                let is_turns = d.key == "choices.turns.turns";
                view! {
                    <div class:hidden=move || is_turns && !fixed()>
                        <Field key=d.key label=d.label unit=d.unit text=form.texts[i] error=field_error(outcome, d.key) help=d.help />
                    </div>
                }
            }).collect_view()}
            <Pick key="gap-placement" label="Gap (flyback)" value=form.gap
                options=vec![(GapPlacement::CentreLeg, "Centre leg"), (GapPlacement::Spacer, "Spacer, all legs")] />
        </div>
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
