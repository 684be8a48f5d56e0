//! The design being edited: its type, its input form, and the engine calls.
//!
//! This module and [`crate::report_view`] are the only ones that know the
//! design is a forward-converter transformer. Everything else (files,
//! storage, links, the panic overlay, plots, layout) works on whatever
//! [`Spec`] and [`Report`] are. To move the page to another design type:
//!
//! 1. point [`Spec`] and [`Report`] at the new types (serde, `Clone`,
//!    `PartialEq`), [`demo`] and [`compute`] at the engine's functions;
//! 2. rewrite the field table [`NUMS`], [`Form`]'s `values`/`parse` and the
//!    two input panels below for the new fields;
//! 3. rewrite the result panels in `report_view`.
//!
//! State is the text of each field as typed (a signal each); the parsed
//! spec is derived from it (`Form::parse`, called inside a memo), so typing
//! is never fought by reformatting.

use crate::field::Field;
use leptos::prelude::*;
use magwright_engine::core::library as cores;
use magwright_engine::design::forward::{self, ForwardReport, ForwardSpec};
use magwright_engine::material::library as materials;
use magwright_engine::notation;
use magwright_engine::Error;

/// The design the page edits, saves and shares.
pub type Spec = ForwardSpec;
/// What the engine says about it.
pub type Report = ForwardReport;

/// What the page designs, shown under its name.
pub const TITLE: &str = "Forward converter transformer · single switch, 1:1 reset";

/// The design shown to a first-time visitor.
pub fn demo() -> Spec {
    ForwardSpec::demo()
}

/// The one engine call per edit.
pub fn compute(spec: &Spec) -> Result<Report, Error> {
    forward::design(spec)
}

/// Parse errors, per field key.
pub type FieldErrors = Vec<(&'static str, String)>;

/// Why there is no report.
#[derive(Debug, Clone, PartialEq)]
pub enum Problem {
    /// Entries that are not numbers (or not whole where they must be).
    Fields(FieldErrors),
    /// The engine refused the spec.
    Engine(Error),
}

impl Problem {
    /// The message for one field, if this problem is about it.
    pub fn about(&self, key: &str) -> Option<String> {
        match self {
            Problem::Fields(errs) => errs.iter().find(|e| e.0 == key).map(|e| e.1.clone()),
            Problem::Engine(e) if e.field() == Some(key) => Some(e.message().to_string()),
            _ => None,
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

/// A numeric entry: its spec key, label, unit and help.
pub struct NumDef {
    pub key: &'static str,
    pub label: &'static str,
    pub unit: &'static str,
    pub help: &'static str,
    /// Whole numbers only (wire gauges).
    pub whole: bool,
    /// Shown with an SI prefix when loaded ("200k", "150m").
    pub prefixed: bool,
}

const fn num(key: &'static str, label: &'static str, unit: &'static str, help: &'static str) -> NumDef {
    NumDef { key, label, unit, help, whole: false, prefixed: false }
}

/// The numeric fields, in form order.
pub const NUMS: [NumDef; 11] = [
    num("vin_min", "Vin min", "V", "Lowest DC input voltage"),
    num("vin_max", "Vin max", "V", "Highest DC input voltage"),
    num("vout", "Vout", "V", "Output voltage"),
    num("iout", "Iout", "A", "Full-load output current"),
    num("rectifier_drop", "Vf rectifier", "V", "Forward drop of the output rectifier"),
    NumDef { prefixed: true, ..num("frequency", "fsw", "Hz", "Switching frequency, e.g. 200k") },
    num("duty_max", "Duty max", "", "Largest duty the controller allows (≤ 0.5 with a 1:1 reset winding)"),
    NumDef { prefixed: true, ..num("b_max", "Bpk max", "T", "Peak flux density the design may reach, e.g. 150m") },
    num("temperature", "Temperature", "°C", "Core and winding temperature for the loss figures"),
    NumDef { whole: true, ..num("awg_primary", "Primary wire", "AWG", "Primary wire gauge") },
    NumDef { whole: true, ..num("awg_secondary", "Secondary wire", "AWG", "Secondary wire gauge") },
];

/// Indices into [`NUMS`] of the fields shown in the "Core and material"
/// panel (the rest are the electrical specification).
const CORE_PANEL: [usize; 4] = [7, 8, 9, 10];

/// The label of a field key.
pub fn label_of(key: &str) -> &'static str {
    NUMS.iter().find(|d| d.key == key).map(|d| d.label).unwrap_or(match key {
        "core" => "Core",
        "material" => "Material",
        _ => "Input",
    })
}

/// The numeric values of a spec, in [`NUMS`] order.
pub fn values(s: &Spec) -> [f64; 11] {
    [
        s.vin_min,
        s.vin_max,
        s.vout,
        s.iout,
        s.rectifier_drop,
        s.frequency,
        s.duty_max,
        s.b_max,
        s.temperature,
        f64::from(s.awg_primary),
        f64::from(s.awg_secondary),
    ]
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

/// The form's state: the text of every field as typed.
#[derive(Clone, Copy)]
pub struct Form {
    pub texts: [RwSignal<String>; 11],
    pub core: RwSignal<String>,
    pub material: RwSignal<String>,
}

impl Form {
    pub fn new(s: &Spec) -> Self {
        Form {
            texts: std::array::from_fn(|i| RwSignal::new(text_of(values(s)[i], NUMS[i].prefixed))),
            core: RwSignal::new(s.core.clone()),
            material: RwSignal::new(s.material.clone()),
        }
    }

    /// Replaces every field's text with the values of `s` (opening a file).
    pub fn set(&self, s: &Spec) {
        for ((sig, v), d) in self.texts.iter().zip(values(s)).zip(&NUMS) {
            sig.set(text_of(v, d.prefixed));
        }
        self.core.set(s.core.clone());
        self.material.set(s.material.clone());
    }

    /// The spec the texts describe, or every field that does not read.
    /// Reactive: call inside a memo.
    pub fn parse(&self) -> Result<Spec, FieldErrors> {
        let mut errs = Vec::new();
        let mut vals = [0.0; 11];
        for (i, d) in NUMS.iter().enumerate() {
            match self.texts[i].with(|t| notation::parse(t, d.unit)) {
                Ok(v) if d.whole && v.fract() != 0.0 => {
                    errs.push((d.key, "a wire gauge is a whole number".to_string()))
                }
                Ok(v) => vals[i] = v,
                Err(e) => errs.push((d.key, e.to_string())),
            }
        }
        if !errs.is_empty() {
            return Err(errs);
        }
        // Out-of-range gauges stay out of range after the clamp, so the
        // engine still names the field.
        let awg = |v: f64| v.clamp(-100.0, 100.0) as i32;
        Ok(ForwardSpec {
            vin_min: vals[0],
            vin_max: vals[1],
            vout: vals[2],
            iout: vals[3],
            rectifier_drop: vals[4],
            frequency: vals[5],
            duty_max: vals[6],
            b_max: vals[7],
            temperature: vals[8],
            awg_primary: awg(vals[9]),
            awg_secondary: awg(vals[10]),
            core: self.core.get(),
            material: self.material.get(),
        })
    }
}

/// The message for one field, derived from the outcome.
fn field_error(outcome: Memo<Outcome>, key: &'static str) -> Signal<Option<String>> {
    Signal::derive(move || outcome.with(|o| o.as_ref().err().and_then(|p| p.about(key))))
}

fn num_fields(form: Form, outcome: Memo<Outcome>, which: impl Fn(usize) -> bool) -> impl IntoView {
    NUMS.iter()
        .enumerate()
        .filter(|(i, _)| which(*i))
        .map(|(i, d)| {
            view! { <Field key=d.key label=d.label unit=d.unit text=form.texts[i] error=field_error(outcome, d.key) help=d.help /> }
        })
        .collect_view()
}

/// The electrical specification: voltages, current, frequency, duty.
#[component]
pub fn SpecFields(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    view! { <div class="fields">{num_fields(form, outcome, |i| !CORE_PANEL.contains(&i))}</div> }
}

/// Core, material, flux limit, temperature and wire.
#[component]
pub fn CoreFields(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    let core_names: Vec<String> = cores::cores().into_iter().map(|c| c.designation).collect();
    let material_names: Vec<String> = materials::materials().into_iter().map(|m| m.name).collect();
    view! {
        <div class="fields">
            <Choice key="core" label="Core" value=form.core options=core_names error=field_error(outcome, "core") />
            <Choice key="material" label="Material" value=form.material options=material_names error=field_error(outcome, "material") />
            {num_fields(form, outcome, |i| CORE_PANEL.contains(&i))}
        </div>
    }
}

/// A drop-down choice from a library. A value the library does not know
/// (from an opened file) is kept and shown as such, so the engine's message
/// about it stays visible.
#[component]
fn Choice(
    key: &'static str,
    label: &'static str,
    value: RwSignal<String>,
    options: Vec<String>,
    #[prop(into)] error: Signal<Option<String>>,
) -> impl IntoView {
    let id = format!("f-{key}");
    let err_id = format!("e-{key}");
    let known = options.clone();
    let stray = move || {
        let v = value.get();
        (!known.contains(&v)).then(|| {
            let text = format!("{v} (not in the library)");
            view! { <option value=v.clone() prop:selected=true>{text}</option> }
        })
    };
    view! {
        <div class="field" class:invalid=move || error.get().is_some()>
            <label for=id.clone()>{label}</label>
            <select
                id=id
                aria-describedby=err_id.clone()
                aria-invalid=move || if error.get().is_some() { "true" } else { "false" }
                on:change:target=move |ev| value.set(ev.target().value())
            >
                {stray}
                {options
                    .into_iter()
                    .map(|o| {
                        let me = o.clone();
                        view! { <option value=o.clone() prop:selected=move || value.get() == me>{o.clone()}</option> }
                    })
                    .collect_view()}
            </select>
            <div class="msg" id=err_id role="alert">{move || error.get().unwrap_or_default()}</div>
        </div>
    }
}

/// One point of a frequency sweep: the engine's design at that frequency,
/// or None where it finds none.
#[derive(Debug, Clone, PartialEq)]
pub struct SweepPoint {
    pub frequency: f64,
    pub core_loss: f64,
    pub copper_loss: f64,
    pub total_loss: f64,
    pub secondary_turns: f64,
    /// Peak flux density, T.
    pub b_peak: f64,
    pub ok: bool,
}

/// The engine's design at `n` frequencies from a tenth to ten times the
/// spec's (within the engine's 1 kHz–10 MHz), log-spaced. Only orchestration:
/// every number is the engine's. (The lead's full solver will provide its
/// own sweep; this one goes then.)
pub fn sweep(spec: &Spec, n: usize) -> Vec<SweepPoint> {
    let f0 = spec.frequency;
    if !(f0.is_finite() && f0 > 0.0) || n < 2 {
        return Vec::new();
    }
    let (lo, hi) = ((f0 / 10.0).max(1e3), (f0 * 10.0).min(10e6));
    if hi <= lo {
        return Vec::new();
    }
    let mut s = spec.clone();
    (0..n)
        .map(|i| {
            let f = lo * (hi / lo).powf(i as f64 / (n - 1) as f64);
            s.frequency = f;
            match compute(&s) {
                Ok(r) => SweepPoint {
                    frequency: f,
                    core_loss: r.core_loss,
                    copper_loss: r.copper_loss,
                    total_loss: r.total_loss,
                    secondary_turns: f64::from(r.secondary_turns),
                    b_peak: r.b_peak,
                    ok: true,
                },
                Err(_) => SweepPoint {
                    frequency: f,
                    core_loss: 0.0,
                    copper_loss: 0.0,
                    total_loss: 0.0,
                    secondary_turns: 0.0,
                    b_peak: 0.0,
                    ok: false,
                },
            }
        })
        .collect()
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
        assert_eq!(text_of(0.45, false), "0.45");
    }
}
