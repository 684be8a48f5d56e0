//! The page: specification on the left, results and pictures on the right.
//!
//! State lives in signals (the text of each field); everything else is
//! derived in memos: the parsed specification, then the engine's report.
//! An edit re-runs the whole chain.

use crate::field::Field;
use crate::plot;
use leptos::html::Canvas;
use leptos::prelude::*;
use magwright_engine::core::library as cores;
use magwright_engine::design::forward::{self, ForwardReport, ForwardSpec};
use magwright_engine::material::library as materials;
use magwright_engine::notation;
use magwright_engine::Error;

/// A numeric entry: its spec key, label, unit and help.
struct NumDef {
    key: &'static str,
    label: &'static str,
    unit: &'static str,
    help: &'static str,
}

const NUMS: [NumDef; 11] = [
    NumDef { key: "vin_min", label: "Vin min", unit: "V", help: "Lowest DC input voltage" },
    NumDef { key: "vin_max", label: "Vin max", unit: "V", help: "Highest DC input voltage" },
    NumDef { key: "vout", label: "Vout", unit: "V", help: "Output voltage" },
    NumDef { key: "iout", label: "Iout", unit: "A", help: "Full-load output current" },
    NumDef { key: "rectifier_drop", label: "Vf rectifier", unit: "V", help: "Forward drop of the output rectifier" },
    NumDef { key: "frequency", label: "fsw", unit: "Hz", help: "Switching frequency, e.g. 200k" },
    NumDef { key: "duty_max", label: "Duty max", unit: "", help: "Largest duty the controller allows (≤ 0.5 with a 1:1 reset winding)" },
    NumDef { key: "b_max", label: "Bpk max", unit: "T", help: "Peak flux density the design may reach, e.g. 150m" },
    NumDef { key: "temperature", label: "Temperature", unit: "°C", help: "Core and winding temperature for the loss figures" },
    NumDef { key: "awg_primary", label: "Primary wire", unit: "AWG", help: "Primary wire gauge" },
    NumDef { key: "awg_secondary", label: "Secondary wire", unit: "AWG", help: "Secondary wire gauge" },
];

/// The texts of the numeric fields, in `NUMS` order.
fn demo_texts(s: &ForwardSpec) -> [String; 11] {
    let g = |v: f64| format!("{v}");
    [
        g(s.vin_min),
        g(s.vin_max),
        g(s.vout),
        g(s.iout),
        g(s.rectifier_drop),
        notation::format(s.frequency, "", 3).replace(' ', ""),
        g(s.duty_max),
        notation::format(s.b_max, "", 3).replace(' ', ""),
        g(s.temperature),
        s.awg_primary.to_string(),
        s.awg_secondary.to_string(),
    ]
}

/// Parse errors, per field key.
type FieldErrors = Vec<(&'static str, String)>;

fn parse_spec(texts: &[String; 11], core: &str, material: &str) -> Result<ForwardSpec, FieldErrors> {
    let mut errs = Vec::new();
    let mut vals = [0.0; 11];
    for (i, d) in NUMS.iter().enumerate() {
        match notation::parse(&texts[i], d.unit) {
            Ok(v) => vals[i] = v,
            Err(e) => errs.push((d.key, e.to_string())),
        }
    }
    let awg = |i: usize, errs: &mut FieldErrors| -> i32 {
        let v = vals[i];
        if v.fract() != 0.0 && !errs.iter().any(|e| e.0 == NUMS[i].key) {
            errs.push((NUMS[i].key, "a wire gauge is a whole number".into()));
        }
        v.clamp(-100.0, 100.0) as i32
    };
    let awg_p = awg(9, &mut errs);
    let awg_s = awg(10, &mut errs);
    if !errs.is_empty() {
        return Err(errs);
    }
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
        awg_primary: awg_p,
        awg_secondary: awg_s,
        core: core.to_string(),
        material: material.to_string(),
    })
}

#[component]
pub fn App() -> impl IntoView {
    let demo = ForwardSpec::demo();
    let texts: [RwSignal<String>; 11] = demo_texts(&demo).map(RwSignal::new);
    let core = RwSignal::new(demo.core.clone());
    let material = RwSignal::new(demo.material.clone());

    let spec = Memo::new(move |_| {
        let t = texts.map(|s| s.get());
        parse_spec(&t, &core.get(), &material.get())
    });
    let report: Memo<Result<ForwardReport, Problem>> = Memo::new(move |_| match spec.get() {
        Err(errs) => Err(Problem::Fields(errs)),
        Ok(s) => forward::design(&s).map_err(Problem::Engine),
    });

    let field_error = move |key: &'static str| {
        Signal::derive(move || match report.get() {
            Err(Problem::Fields(errs)) => errs.iter().find(|e| e.0 == key).map(|e| e.1.clone()),
            Err(Problem::Engine(e)) if e.field() == Some(key) => Some(e.message().to_string()),
            _ => None,
        })
    };

    let fields = NUMS
        .iter()
        .enumerate()
        .map(|(i, d)| {
            view! { <Field key=d.key label=d.label unit=d.unit text=texts[i] error=field_error(d.key) help=d.help /> }
        })
        .collect_view();

    view! {
        <header class="top">
            <h1>"Magwright"</h1>
            <span class="sub">"Forward converter transformer · single switch, 1:1 reset"</span>
        </header>
        <main class="layout">
            <section class="panel spec" aria-labelledby="spec-h">
                <h2 id="spec-h">"Specification"</h2>
                <p class="help">"Values accept SI prefixes: 200k, 4.7u, 150m. Every edit recomputes the design."</p>
                <div class="fields">{fields}</div>
                <Choice key="core" label="Core" value=core options=cores::cores().into_iter().map(|c| c.designation).collect() error=field_error("core") />
                <Choice key="material" label="Material" value=material options=materials::materials().into_iter().map(|m| m.name).collect() error=field_error("material") />
            </section>
            <section class="panel results" aria-labelledby="res-h">
                <h2 id="res-h">"Design"</h2>
                <Results report=report />
            </section>
        </main>
    }
}

/// Why there is no report.
#[derive(Debug, Clone, PartialEq)]
enum Problem {
    Fields(FieldErrors),
    Engine(Error),
}

/// A drop-down choice from a library.
#[component]
fn Choice(
    key: &'static str,
    label: &'static str,
    value: RwSignal<String>,
    options: Vec<String>,
    #[prop(into)] error: Signal<Option<String>>,
) -> impl IntoView {
    let id = format!("f-{key}");
    view! {
        <div class="field" class:invalid=move || error.get().is_some()>
            <label for=id.clone()>{label}</label>
            <select id=id on:change:target=move |ev| value.set(ev.target().value())>
                {options
                    .into_iter()
                    .map(|o| {
                        let selected = o == value.get_untracked();
                        view! { <option value=o.clone() selected=selected>{o.clone()}</option> }
                    })
                    .collect_view()}
            </select>
            <div class="msg" role="alert">{move || error.get().unwrap_or_default()}</div>
        </div>
    }
}

/// One result line: label, formatted value, and the SI value for checks.
fn row(id: &'static str, label: &'static str, v: f64, unit: &'static str, digits: usize) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=format!("{v:e}")>{notation::format(v, unit, digits)}</td>
        </tr>
    }
}

/// A ratio shown in per cent; `data-si` keeps the plain ratio.
fn pct(id: &'static str, label: &'static str, v: f64) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=format!("{v:e}")>{format!("{:.1} %", v * 100.0)}</td>
        </tr>
    }
}

fn count(id: &'static str, label: &'static str, n: u32) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=n.to_string()>{n.to_string()}</td>
        </tr>
    }
}

#[component]
fn Results(report: Memo<Result<ForwardReport, Problem>>) -> impl IntoView {
    let canvas = NodeRef::<Canvas>::new();
    Effect::new(move |_| {
        if let (Some(c), Ok(r)) = (canvas.get(), report.get()) {
            if let Err(e) = plot::flux(&c, &r.flux_at_vin_min, &r.flux_at_vin_max, r.b_sat) {
                leptos::logging::warn!("flux plot: {e}");
            }
        }
    });
    let body = move || match report.get() {
        Err(p) => {
            let lines = match p {
                Problem::Fields(errs) => errs
                    .iter()
                    .map(|(k, m)| format!("{}: {m}", label_of(k)))
                    .collect::<Vec<_>>(),
                Problem::Engine(e) => vec![match e.field() {
                    Some(k) => format!("{}: {}", label_of(k), e.message()),
                    None => e.message().to_string(),
                }],
            };
            view! {
                <div class="missing" data-testid="missing">
                    <p><strong>"No design yet."</strong>" Fix these entries:"</p>
                    <ul>{lines.into_iter().map(|l| view! { <li>{l}</li> }).collect_view()}</ul>
                </div>
            }
            .into_any()
        }
        Ok(r) => view! {
            <table class="figures">
                <tbody>
                    {count("np", "Np (primary turns)", r.primary_turns)}
                    {count("ns", "Ns (secondary turns)", r.secondary_turns)}
                    {row("ratio", "Turns ratio Np/Ns", r.turns_ratio, "", 4)}
                    {pct("duty-min", "Duty at Vin min", r.duty_at_vin_min)}
                    {pct("duty-max", "Duty at Vin max", r.duty_at_vin_max)}
                    {row("delta-b", "ΔB (= Bpk, unipolar)", r.delta_b, "T", 3)}
                    {row("bsat", "Bsat at temperature", r.b_sat, "T", 3)}
                    {row("pv", "Core loss density", r.core_loss_density, "W/m³", 3)}
                    {row("core-loss", "Core loss", r.core_loss, "W", 3)}
                    {row("ip", "Primary RMS current", r.primary_rms, "A", 3)}
                    {row("is", "Secondary RMS current", r.secondary_rms, "A", 3)}
                    {row("rp", "Primary Rdc", r.primary_rdc, "Ω", 3)}
                    {row("rs", "Secondary Rdc", r.secondary_rdc, "Ω", 3)}
                    {row("cu-loss", "Copper loss (DC)", r.copper_loss, "W", 3)}
                    {row("total-loss", "Total loss", r.total_loss, "W", 3)}
                    {pct("fill", "Window fill (copper)", r.window_fill)}
                </tbody>
            </table>
            <p class="core-note" data-testid="core-params">
                {format!(
                    "{}: Ae {:.1} mm², le {:.1} mm, Ve {:.0} mm³, Wa {:.0} mm²",
                    r.core.designation, r.core.ae * 1e6, r.core.le * 1e3, r.core.ve * 1e9, r.core.window_area * 1e6
                )}
            </p>
            <ul class="warnings" data-testid="warnings">
                {r.warnings.iter().map(|w| view! { <li>{w.clone()}</li> }).collect_view()}
            </ul>
        }
        .into_any(),
    };
    view! {
        <div class="result-body">{body}</div>
        <figure class="plot" class:hidden=move || report.get().is_err()>
            <canvas node_ref=canvas width="560" height="260" data-testid="flux-plot" aria-label="Flux density over one period"></canvas>
            <figcaption>"Flux density over one switching period, at Vin min and Vin max"</figcaption>
        </figure>
    }
}

fn label_of(key: &str) -> &'static str {
    NUMS.iter().find(|d| d.key == key).map(|d| d.label).unwrap_or(match key {
        "core" => "Core",
        "material" => "Material",
        _ => "Input",
    })
}
