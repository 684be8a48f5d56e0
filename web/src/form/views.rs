//! The form's components: the numeric fields of a group, the drop-downs,
//! the converter's specification, the outputs and the flux choices. They
//! only gather input into the [`Form`]'s signals and show the outcome's
//! messages at the fields they name.

use super::{Form, Group, InputKind, Outcome, RatioKind, RuleKind, NUMS, OUT_KEYS};
use crate::field::Field;
use leptos::prelude::*;
use magwright_engine::design::CoreChoice;
use magwright_engine::gap::GapPlacement;
use magwright_engine::topology::inductor::Circuit;
use magwright_engine::topology::{Isolation, Topology};

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

