//! Core and material: the built-in libraries, their data, and the user's own.
//!
//! What this panel does, top to bottom:
//!
//! * **Core**: a drop-down of every library core, a browser over the whole
//!   library (filter by family, search the designation, sort by size, every
//!   core's effective parameters and window in one table), and the data of
//!   the core in use. The core in use can also be the user's own, defined by
//!   effective parameters (IEC 60205 Ae, le, Amin) and window: the engine's
//!   [`Core::from_effective`] checks it, and its messages land at the field
//!   they name.
//! * **Material**: a drop-down of the library grades and the data of the
//!   grade in use (permeability, saturation, Curie point, Steinmetz
//!   coefficients with the ranges they were fitted over, the reference
//!   temperature of k, where the numbers come from). The material can also
//!   be the user's own, fitted by the engine ([`fit::fit`]) to measured loss
//!   points pasted as text; the fit takes μi, Bsat and the rest from the
//!   grade in use ([`fit::LossFit::apply_to`]). Or it can be entered field
//!   by field from a datasheet (every field of [`Material`], the
//!   temperature factor as its loss minimum and curvature,
//!   [`TempFactor::with_minimum`]), checked by [`Material::validate`] on
//!   every keystroke with its message at the field it names.
//!
//! Nothing here computes physics: every number shown is a field of an
//! engine value (a library [`Core`] or [`Material`], a [`fit::LossFit`]).
//! What the panel does itself is text handling at the edge: reading
//! "52.6 mm" or "1.2 cm²" into SI, reading pasted measurement rows, and
//! showing SI values in the units a datasheet uses (mm, mm², cm³, g).

use crate::form::{field_error, Form, Outcome};
use leptos::html::{Button, Input};
use leptos::prelude::*;
use magwright_engine::core::{library as cores, Core, Effective};
use magwright_engine::design::{CoreChoice, MaterialChoice};
use magwright_engine::material::fit::{self, LossFit, LossPoint};
use magwright_engine::material::{library as materials, Material, Steinmetz, TempFactor};
use magwright_engine::{notation, Error};

const CSS: &str = r#"
.lib .row-buttons { display:flex; flex-wrap:wrap; gap:.3rem; margin:.1rem 0 .4rem; }
.lib table.data { border-collapse:collapse; width:100%; font-size:.86em; margin-bottom:.5rem; }
.lib table.data th { text-align:left; font-weight:normal; color:var(--muted); padding:.1rem .5rem .1rem 0; vertical-align:top; }
.lib table.data td { text-align:right; font-variant-numeric:tabular-nums; padding:.1rem 0; }
.lib table.data tr + tr { border-top:1px solid #eef0f3; }
.lib table.data td.text { text-align:left; white-space:normal; }
.lib .prov { font-size:.8em; color:var(--muted); margin:.1rem 0 .5rem; }
.lib .mark { font-size:.82em; margin:.2rem 0 .1rem; padding:.15rem .4rem; border-radius:3px; }
.lib .mark.checked { background:#eef7ee; }
.lib .mark.unconfirmed { background:#fff4e0; color:var(--warn); font-weight:600; }
.lib details { border:1px solid var(--line); border-radius:4px; padding:.3rem .5rem; margin:.4rem 0; }
.lib details > summary { cursor:pointer; font-weight:600; font-size:.92em; }
.lib details[open] > summary { margin-bottom:.3rem; }
.lib .entry-echo { font-size:.76em; color:var(--muted); min-height:0; }
.lib textarea { width:100%; box-sizing:border-box; min-height:8em; font:.85em/1.35 ui-monospace, SFMono-Regular, Menlo, Consolas, monospace; border:1px solid #9aa4b1; border-radius:4px; padding:.3rem; color:var(--ink); }
.lib .bad { color:var(--bad); font-size:.85em; }
.lib .check { display:flex; gap:.4rem; align-items:center; font-size:.88em; margin:.3rem 0 .2rem; }
.lib .check input { width:auto; margin:0; }
.lib .note { font-size:.82em; color:var(--muted); margin:.2rem 0; }
.lib ul.notes { font-size:.82em; margin:.2rem 0 .4rem 1.1rem; padding:0; color:var(--warn); }
.lib-overlay { position:fixed; inset:0; background:rgba(20,28,38,.45); z-index:20; display:flex; align-items:flex-start; justify-content:center; padding:3vh 1rem; }
.lib-overlay.hidden { display:none; }
.lib-dialog { background:#fff; border-radius:6px; box-shadow:0 8px 30px rgba(0,0,0,.3); width:min(1180px, 100%); max-height:94vh; display:flex; flex-direction:column; padding:.7rem .9rem; box-sizing:border-box; }
.lib-dialog h3 { margin:0 0 .4rem; font-size:1.05em; }
.lib-dialog .filters { display:flex; flex-wrap:wrap; gap:.6rem; align-items:end; margin-bottom:.4rem; }
.lib-dialog .filters label { display:block; font-weight:600; font-size:.84em; }
.lib-dialog .filters input, .lib-dialog .filters select { font:inherit; padding:.25rem .4rem; border:1px solid #9aa4b1; border-radius:4px; }
.lib-dialog .scroll { overflow:auto; border:1px solid var(--line); border-radius:4px; }
.lib-dialog table { border-collapse:collapse; font-size:.84em; width:100%; }
.lib-dialog thead th { position:sticky; top:0; background:#f3f5f7; font-weight:600; text-align:right; padding:.25rem .45rem; border-bottom:1px solid var(--line); vertical-align:bottom; }
.lib-dialog thead th.text, .lib-dialog td.text { text-align:left; }
.lib-dialog tbody th { white-space:nowrap; font-weight:600; padding:.16rem .45rem; }
.lib-dialog td { text-align:right; font-variant-numeric:tabular-nums; padding:.16rem .45rem; white-space:nowrap; }
.lib-dialog td.src { white-space:normal; min-width:14em; color:var(--muted); font-size:.92em; }
.lib-dialog td.src.unconfirmed { color:var(--warn); font-weight:600; }
.lib-dialog tbody tr:nth-child(even) { background:#fafbfc; }
.lib-dialog tbody tr.current { background:#e6effa; }
.lib-dialog .count { font-size:.85em; color:var(--muted); }
"#;

// ---------------------------------------------------------------------------
// Text at the edge: numbers in datasheet units, pasted measurement rows.

/// The display unit of a custom-core entry, and the units a user may type.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Dim {
    /// Millimetres unless a unit is typed.
    Length,
    /// Square millimetres unless a unit is typed.
    Area,
    /// Square centimetres unless a unit is typed (outer surfaces).
    Surface,
    /// Grams unless a unit is typed.
    Mass,
}

impl Dim {
    /// The unit a plain number is in.
    fn unit(self) -> &'static str {
        match self {
            Dim::Length => "mm",
            Dim::Area => "mm²",
            Dim::Surface => "cm²",
            Dim::Mass => "g",
        }
    }
    /// SI value of one display unit.
    fn scale(self) -> f64 {
        match self {
            Dim::Length => 1e-3,
            Dim::Area => 1e-6,
            Dim::Surface => 1e-4,
            Dim::Mass => 1e-3,
        }
    }
    /// Units that may follow the number, with their SI value (longer
    /// suffixes first, so "mm" is not read as "m").
    fn suffixes(self) -> &'static [(&'static str, f64)] {
        match self {
            Dim::Length => &[("mm", 1e-3), ("cm", 1e-2), ("µm", 1e-6), ("um", 1e-6), ("m", 1.0)],
            Dim::Area | Dim::Surface => &[
                ("mm²", 1e-6),
                ("mm2", 1e-6),
                ("cm²", 1e-4),
                ("cm2", 1e-4),
                ("m²", 1.0),
                ("m2", 1.0),
            ],
            Dim::Mass => &[("kg", 1.0), ("mg", 1e-6), ("g", 1e-3)],
        }
    }
}

/// Reads a custom-core entry into SI: a number (SI multiplier prefixes
/// allowed, "1.2k") in the field's display unit, or followed by an explicit
/// unit ("52.6 mm", "5.2 cm", "0.0526 m", "173 mm²", "1.7 cm2"). Returns the
/// value and whether a unit was typed. An empty text is `Ok(None)`.
fn parse_dim(text: &str, dim: Dim) -> Result<Option<(f64, bool)>, String> {
    let t = text.trim();
    if t.is_empty() {
        return Ok(None);
    }
    for (suffix, scale) in dim.suffixes() {
        if let Some(rest) = t.strip_suffix(suffix) {
            let rest = rest.trim_end();
            if !rest.is_empty() {
                if let Ok(v) = notation::parse(rest, "") {
                    return Ok(Some((v * scale, true)));
                }
            }
        }
    }
    notation::parse(t, "")
        .map(|v| Some((v * dim.scale(), false)))
        .map_err(|e| e.to_string())
}

/// One line of pasted measurements, split into its four values. Tabs and
/// semicolons separate (spaces may then sit inside a value, "100 kHz");
/// else whitespace (a trailing comma dropped, "100k, 0.1, ..."; a comma
/// inside a value is a decimal comma, "0,1"); else commas too.
fn split_row(line: &str) -> Vec<&str> {
    let by = |sep: &dyn Fn(char) -> bool| -> Vec<&str> {
        line.split(|c: char| sep(c))
            .map(|s| s.trim().trim_end_matches(',').trim_end())
            .filter(|s| !s.is_empty())
            .collect()
    };
    let strong = by(&|c| c == '\t' || c == ';');
    if strong.len() == 4 {
        return strong;
    }
    let loose = by(&|c| c.is_whitespace() || c == ';');
    if loose.len() == 4 {
        return loose;
    }
    let commas = by(&|c| c == '\t' || c == ';' || c == ',');
    if commas.len() == 4 {
        return commas;
    }
    by(&|c| c.is_whitespace() || c == ';' || c == ',')
}

/// Measured points read from pasted text, with the line each came from.
#[derive(Debug, Clone, PartialEq)]
struct Pasted {
    points: Vec<LossPoint>,
    /// 1-based line number of each point.
    lines: Vec<usize>,
    /// A header line was skipped.
    header: bool,
}

/// Column names and the unit symbol each value may carry.
const COLUMNS: [(&str, &str); 4] = [("f", "Hz"), ("B", "T"), ("T", "°C"), ("Pv", "W/m³")];

/// Reads rows "f B T Pv" (Hz, T peak, °C, W/m³; SI prefixes allowed, e.g.
/// "100k 0.1 100 80k" or "100 kHz, 100 mT, 100, 80 kW/m³"). Empty lines and
/// text after `#` are ignored; a first line that is not numbers is taken
/// as a header. Errors name the line.
fn parse_points(text: &str) -> Result<Pasted, String> {
    let mut out = Pasted {
        points: Vec::new(),
        lines: Vec::new(),
        header: false,
    };
    for (i, raw) in text.lines().enumerate() {
        let line_no = i + 1;
        let line = raw.split('#').next().unwrap_or("").trim();
        if line.is_empty() {
            continue;
        }
        let cells = split_row(line);
        let mut vals = [0.0; 4];
        let mut bad = None;
        if cells.len() == 4 {
            for (j, (cell, (_, unit))) in cells.iter().zip(COLUMNS).enumerate() {
                let v = notation::parse(cell, unit)
                    .or_else(|_| notation::parse(cell.trim_end_matches("W/m3"), ""))
                    .or_else(|_| notation::parse(cell.trim_end_matches('C').trim_end_matches('°'), ""));
                match v {
                    Ok(v) => vals[j] = v,
                    Err(e) => {
                        bad = Some(format!("line {line_no}, {}: {e}", COLUMNS[j].0));
                        break;
                    }
                }
            }
        }
        let first = out.points.is_empty() && !out.header;
        match (cells.len(), bad) {
            (4, None) => {
                out.points.push(LossPoint {
                    f: vals[0],
                    b: vals[1],
                    temp_c: vals[2],
                    pv: vals[3],
                });
                out.lines.push(line_no);
            }
            // A first line that is not all numbers: a header ("f B T Pv").
            _ if first && cells.iter().all(|c| notation::parse(c, "").is_err()) => out.header = true,
            (4, Some(msg)) => return Err(msg),
            (n, _) => {
                return Err(format!(
                    "line {line_no} has {n} value{}; each line needs four: f (Hz), B peak (T), T (°C), Pv (W/m³)",
                    if n == 1 { "" } else { "s" }
                ))
            }
        }
    }
    Ok(out)
}

/// An engine error about `points[i].x`, told by the pasted line it came from.
fn point_error(e: &Error, lines: &[usize]) -> String {
    let Some(rest) = e.field().and_then(|f| f.strip_prefix("points[")) else {
        return e.message().to_string();
    };
    let Some((index, name)) = rest.split_once("].") else {
        return e.message().to_string();
    };
    let column = match name {
        "f" => "f",
        "b" => "B",
        "temp_c" => "T",
        "pv" => "Pv",
        other => other,
    };
    match index.parse::<usize>().ok().and_then(|i| lines.get(i)) {
        Some(l) => format!("line {l}, {column}: {}", e.message()),
        None => e.message().to_string(),
    }
}

// ---------------------------------------------------------------------------
// Showing SI values in datasheet units.

/// `x` with `n` significant figures, without an exponent.
fn sig(x: f64, n: i32) -> String {
    if !x.is_finite() {
        return "—".into();
    }
    if x == 0.0 {
        return "0".into();
    }
    let mag = x.abs().log10().floor() as i32;
    let dec = (n - 1 - mag).max(0) as usize;
    format!("{x:.dec$}")
}

/// A coefficient that may span many decades (Steinmetz k): plain when
/// between 0.01 and 10 000, else "1.234e-3".
fn coef(x: f64) -> String {
    if x.is_finite() && x != 0.0 && !(0.01..1e4).contains(&x.abs()) {
        format!("{x:.4e}")
    } else {
        sig(x, 4)
    }
}

/// A percentage: three figures, or an exponent below 0.01 %.
fn pct(v: f64) -> String {
    if v.is_finite() && v != 0.0 && v.abs() < 0.01 {
        format!("{v:.1e} %")
    } else {
        format!("{} %", sig(v, 3))
    }
}

fn si_attr(v: f64) -> String {
    format!("{v:e}")
}

/// One labelled figure: SI value in `data-si`, shown as `v/scale unit`.
fn figure(id: &'static str, label: &'static str, v: f64, scale: f64, unit: &'static str) -> impl IntoView {
    figure_n(id, label, v, scale, unit, 4)
}

/// [`figure`] with `n` significant figures.
fn figure_n(id: &'static str, label: &'static str, v: f64, scale: f64, unit: &'static str, n: i32) -> impl IntoView {
    view! {
        <tr>
            <th scope="row">{label}</th>
            <td data-testid=id data-si=si_attr(v)>{format!("{} {unit}", sig(v / scale, n))}</td>
        </tr>
    }
}

/// Whether the engine marked a library core unconfirmed (its provenance
/// starts so; the engine's `core::library` docs say when).
fn is_unconfirmed(c: &Core) -> bool {
    c.provenance.starts_with("unconfirmed")
}

/// The library core's computed values against its published effective
/// parameters, as the engine's `core::library::agreement` reports them: a
/// visible mark above the provenance note. Nothing for the user's own core.
fn agreement_note(c: &Core) -> Option<impl IntoView> {
    c.shape?;
    let a = cores::agreement(&c.designation)?;
    let diffs = format!(
        "Ae {}, le {}, Ve {}",
        signed_pct(a.ae),
        signed_pct(a.le),
        signed_pct(a.ve)
    );
    let (class, text) = if a.confirmed {
        ("mark checked", format!("Checked: computed {diffs} from the published effective parameters (from memory)."))
    } else {
        (
            "mark unconfirmed",
            format!("Unconfirmed: computed {diffs} from the published effective parameters (from memory); the dimensions are in doubt, use your supplier's data."),
        )
    };
    Some(view! { <p class=class data-testid="core-check">{text}</p> })
}

fn signed_pct(d: f64) -> String {
    // Rounded to 0.1 %; a value that rounds to zero is shown unsigned.
    let p = (d * 1000.0).round() / 10.0;
    if p == 0.0 {
        "0.0 %".to_string()
    } else {
        format!("{p:+.1} %").replace('-', "−")
    }
}

/// The first clause of a provenance note (the rest goes in a tooltip).
fn short_source(p: &str) -> &str {
    p.split(';').next().unwrap_or(p).trim()
}

// ---------------------------------------------------------------------------
// What the form's choices resolve to (engine calls only).

fn core_of(c: &CoreChoice) -> Result<Core, Error> {
    match c {
        CoreChoice::Library { designation } => cores::find(designation),
        CoreChoice::Shape { designation, shape } => Core::from_shape(designation, shape.clone()),
        CoreChoice::Effective {
            designation,
            parameters,
        } => Core::from_effective(designation, parameters),
    }
}

fn material_of(m: &MaterialChoice) -> Result<Material, Error> {
    match m {
        MaterialChoice::Library { name } => materials::find(name),
        MaterialChoice::Custom { material } => Ok(material.clone()),
    }
}

/// The effective parameters of a core, as a starting point for the user's own.
fn effective_of(c: &Core) -> Effective {
    Effective {
        family: c.family.clone(),
        ae: c.ae,
        le: c.le,
        ve: None,
        amin: Some(c.amin),
        window_area: c.window_area,
        window_height: Some(c.window_height),
        winding_breadth: c.winding_breadth,
        winding_height: c.winding_height,
        turn_length_inner: c.turn_length_inner,
        surface_area: c.surface_area,
        mass: (c.mass > 0.0).then_some(c.mass),
    }
}

// ---------------------------------------------------------------------------
// The panel.

/// The core and material: choose, browse, inspect, or define your own.
#[component]
pub fn Library(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    let browsing = RwSignal::new(false);
    view! {
        <style>{CSS}</style>
        <div class="lib">
            <CorePick form=form outcome=outcome browsing=browsing />
            <CoreData form=form />
            <CustomCore form=form />
            <MaterialPick form=form outcome=outcome />
            <MaterialData form=form />
            <OwnMaterial form=form />
            <FittedMaterial form=form />
        </div>
        <CoreBrowser form=form open=browsing />
    }
}

/// The core drop-down and the library browser's button.
#[component]
fn CorePick(form: Form, outcome: Memo<Outcome>, browsing: RwSignal<bool>) -> impl IntoView {
    let core_err = field_error(outcome, "core");
    let library_now = move || match form.core.get() {
        CoreChoice::Library { designation } => Some(designation),
        _ => None,
    };
    let own = move || match form.core.get() {
        CoreChoice::Library { .. } => None,
        CoreChoice::Shape { designation, .. } | CoreChoice::Effective { designation, .. } => Some(designation),
    };
    let options = cores::all()
        .iter()
        .map(|c| {
            let d = c.designation.as_str();
            view! { <option value=d prop:selected=move || library_now().as_deref() == Some(d)>{d}</option> }
        })
        .collect_view();
    let browse_button = NodeRef::<Button>::new();
    // Focus back on the button when the browser closes.
    Effect::new(move |was_open: Option<bool>| {
        let open = browsing.get();
        if was_open == Some(true) && !open {
            if let Some(b) = browse_button.get() {
                let _ = b.focus();
            }
        }
        open
    });
    view! {
        <div class="field" class:invalid=move || core_err.get().is_some()>
            <label for="f-core">"Core"</label>
            <select
                id="f-core"
                on:change:target=move |ev| {
                    let v = ev.target().value();
                    if !v.is_empty() {
                        form.core.set(CoreChoice::Library { designation: v });
                    }
                }
            >
                {move || own().map(|d| view! { <option value="" selected>{format!("Your own: {d}")}</option> })}
                {options}
            </select>
            <div class="msg" id="e-core" role="alert">{move || core_err.get().unwrap_or_default()}</div>
        </div>
        <div class="row-buttons">
            <button type="button" class="small" data-testid="browse-cores" node_ref=browse_button
                aria-haspopup="dialog" on:click=move |_| browsing.set(true)>"Browse the core library…"</button>
        </div>
    }
}

/// The data of the core in use.
#[component]
fn CoreData(form: Form) -> impl IntoView {
    let core = Memo::new(move |_| core_of(&form.core.get()));
    move || match core.get() {
        Err(e) => view! { <p class="bad" data-testid="core-data-error">{e.message().to_string()}</p> }.into_any(),
        Ok(c) => {
            let title = if c.family.is_empty() {
                c.designation.clone()
            } else {
                format!("{} ({})", c.designation, c.family)
            };
            view! {
                <table class="data" data-testid="core-data" aria-label="Data of the core in use">
                    <tr><th scope="row">"Core"</th><td class="text" data-testid="core-designation">{title}</td></tr>
                    {figure("core-ae", "Ae", c.ae, 1e-6, "mm²")}
                    {figure("core-le", "le", c.le, 1e-3, "mm")}
                    {figure("core-ve", "Ve", c.ve, 1e-6, "cm³")}
                    {figure("core-amin", "Amin", c.amin, 1e-6, "mm²")}
                    {figure("core-wa", "Window area Wa", c.window_area, 1e-6, "mm²")}
                    {figure("core-g", "Window height", c.window_height, 1e-3, "mm")}
                    <tr>
                        <th scope="row">"Bobbin breadth × height"</th>
                        <td>
                            <span data-testid="core-breadth" data-si=si_attr(c.winding_breadth)>{sig(c.winding_breadth * 1e3, 3)}</span>
                            " × "
                            <span data-testid="core-height" data-si=si_attr(c.winding_height)>{sig(c.winding_height * 1e3, 3)}</span>
                            " mm"
                        </td>
                    </tr>
                    {figure("core-mlt", "Mean turn length on the bobbin", c.turn_length_inner, 1e-3, "mm")}
                    {figure("core-surface", "Outer surface", c.surface_area, 1e-4, "cm²")}
                    {figure("core-mass", "Mass (set)", c.mass, 1e-3, "g")}
                </table>
                {agreement_note(&c)}
                <p class="prov" data-testid="core-provenance">{c.provenance.clone()}</p>
            }
            .into_any()
        }
    }
}

/// How the browser orders the cores.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Order {
    Library,
    VeUp,
    VeDown,
    AeUp,
    WaUp,
}

const ORDERS: [(Order, &str); 5] = [
    (Order::Library, "Library order (family, size)"),
    (Order::VeUp, "Ve, smallest first"),
    (Order::VeDown, "Ve, largest first"),
    (Order::AeUp, "Ae, smallest first"),
    (Order::WaUp, "Window area, smallest first"),
];

/// Designation contains the search text (case and spaces ignored).
fn matches(designation: &str, search: &str) -> bool {
    let norm = |s: &str| {
        s.chars()
            .filter(|c| !c.is_whitespace())
            .flat_map(char::to_lowercase)
            .collect::<String>()
    };
    norm(designation).contains(&norm(search))
}

/// The library cores that pass the filters, in the chosen order (indices
/// into [`cores::all`]).
fn select(family: &str, search: &str, order: Order) -> Vec<usize> {
    let all = cores::all();
    let mut v: Vec<usize> = (0..all.len())
        .filter(|&i| family.is_empty() || all[i].family == family)
        .filter(|&i| matches(&all[i].designation, search))
        .collect();
    let key = |i: &usize| -> f64 {
        let c = &all[*i];
        match order {
            Order::Library => *i as f64,
            Order::VeUp => c.ve,
            Order::VeDown => -c.ve,
            Order::AeUp => c.ae,
            Order::WaUp => c.window_area,
        }
    };
    v.sort_by(|a, b| key(a).total_cmp(&key(b)));
    v
}

/// The whole library in one table, over the page; picking a core uses it.
#[component]
fn CoreBrowser(form: Form, open: RwSignal<bool>) -> impl IntoView {
    let family = RwSignal::new(String::new());
    let search = RwSignal::new(String::new());
    let order = RwSignal::new(Order::Library);
    let shown = Memo::new(move |_| select(&family.get(), &search.get(), order.get()));
    let search_box = NodeRef::<Input>::new();
    Effect::new(move |_| {
        if open.get() {
            if let Some(i) = search_box.get() {
                let _ = i.focus();
            }
        }
    });
    let current = move || match form.core.get() {
        CoreChoice::Library { designation } => Some(designation),
        _ => None,
    };
    let pick = move |d: &str| {
        form.core.set(CoreChoice::Library {
            designation: d.to_string(),
        });
        open.set(false);
    };
    let rows = move || {
        let all = cores::all();
        shown
            .get()
            .into_iter()
            .filter_map(|i| all.get(i))
            .map(|c| {
                let d = c.designation.as_str();
                let is_current = move || current().as_deref() == Some(d);
                let cell = |v: f64, scale: f64, n: i32| view! { <td data-si=si_attr(v)>{sig(v / scale, n)}</td> };
                view! {
                    <tr data-designation=d class:current=is_current aria-current=move || is_current().then_some("true")>
                        <td class="text"><button type="button" class="small" data-testid="use-core"
                            aria-label=format!("Use {d}") on:click=move |_| pick(d)>"Use"</button></td>
                        <th scope="row" class="text" title=c.provenance.clone()>{d}</th>
                        <td class="text">{c.family.clone()}</td>
                        {cell(c.ae, 1e-6, 3)}
                        {cell(c.le, 1e-3, 3)}
                        {cell(c.ve, 1e-6, 3)}
                        {cell(c.amin, 1e-6, 3)}
                        {cell(c.window_area, 1e-6, 3)}
                        {cell(c.window_height, 1e-3, 3)}
                        <td data-si=si_attr(c.winding_breadth)>{format!("{} × {}", sig(c.winding_breadth * 1e3, 3), sig(c.winding_height * 1e3, 3))}</td>
                        {cell(c.turn_length_inner, 1e-3, 3)}
                        {cell(c.surface_area, 1e-4, 3)}
                        {cell(c.mass, 1e-3, 3)}
                        <td class="src text" class:unconfirmed=is_unconfirmed(c) title=c.provenance.clone()>{short_source(&c.provenance).to_string()}</td>
                    </tr>
                }
            })
            .collect_view()
    };
    let families = cores::families();
    view! {
        <div class="lib-overlay" class:hidden=move || !open.get() data-testid="core-browser"
            on:keydown=move |ev: leptos::ev::KeyboardEvent| if ev.key() == "Escape" { open.set(false) }
            on:click=move |ev: leptos::ev::MouseEvent| {
                // A click on the shade outside the dialog closes it.
                let outside = ev.target().zip(ev.current_target()).is_some_and(|(t, c)| t == c);
                if outside { open.set(false) }
            }>
            <div class="lib-dialog" role="dialog" aria-modal="true" aria-labelledby="core-browser-h">
                <h3 id="core-browser-h">"Core library"</h3>
                <div class="filters">
                    <div>
                        <label for="lib-family">"Family"</label>
                        <select id="lib-family" on:change:target=move |ev| family.set(ev.target().value())>
                            <option value="">"All families"</option>
                            {families.into_iter().map(|f| view! { <option value=f>{f}</option> }).collect_view()}
                        </select>
                    </div>
                    <div>
                        <label for="lib-search">"Designation contains"</label>
                        <input id="lib-search" type="search" autocomplete="off" spellcheck="false" node_ref=search_box
                            placeholder="e.g. 34 or PQ 26" prop:value=move || search.get()
                            on:input:target=move |ev| search.set(ev.target().value()) />
                    </div>
                    <div>
                        <label for="lib-order">"Order"</label>
                        <select id="lib-order" on:change:target=move |ev| {
                            if let Some((o, _)) = ev.target().value().parse::<usize>().ok().and_then(|i| ORDERS.get(i)) {
                                order.set(*o);
                            }
                        }>
                            {ORDERS.iter().enumerate().map(|(i, (_, l))| view! { <option value=i.to_string()>{*l}</option> }).collect_view()}
                        </select>
                    </div>
                    <span class="count" data-testid="browser-count" role="status">
                        {move || { let n = shown.with(Vec::len); format!("{n} core{}", if n == 1 { "" } else { "s" }) }}
                    </span>
                    <button type="button" data-testid="close-browser" on:click=move |_| open.set(false)>"Close"</button>
                </div>
                <div class="scroll">
                    <table data-testid="core-table">
                        <thead>
                            <tr>
                                <th scope="col" class="text"><span class="hidden">"Pick"</span></th>
                                <th scope="col" class="text">"Core"</th>
                                <th scope="col" class="text">"Family"</th>
                                <th scope="col">"Ae mm²"</th>
                                <th scope="col">"le mm"</th>
                                <th scope="col">"Ve cm³"</th>
                                <th scope="col">"Amin mm²"</th>
                                <th scope="col">"Wa mm²"</th>
                                <th scope="col">"Window height mm"</th>
                                <th scope="col">"Bobbin b × h mm"</th>
                                <th scope="col">"Turn on bobbin mm"</th>
                                <th scope="col">"Surface cm²"</th>
                                <th scope="col">"Mass g"</th>
                                <th scope="col" class="text">"Source"</th>
                            </tr>
                        </thead>
                        <tbody>{rows}</tbody>
                    </table>
                </div>
                <p class="note">"Every value is computed by the engine from nominal dimensions recalled from memory (IEC 60205 method); use your supplier's data for a real design."</p>
            </div>
        </div>
    }
}

/// One entry of the custom core.
struct Def {
    /// Element key: the input's id is `f-<key>`.
    key: &'static str,
    /// The engine's name for the field ([`Core::from_effective`] errors).
    engine: &'static str,
    label: &'static str,
    dim: Dim,
    optional: bool,
    help: &'static str,
}

const CUSTOM: [Def; 10] = [
    Def {
        key: "cc-ae",
        engine: "ae",
        label: "Ae",
        dim: Dim::Area,
        optional: false,
        help: "Effective area (IEC 60205)",
    },
    Def {
        key: "cc-le",
        engine: "le",
        label: "le",
        dim: Dim::Length,
        optional: false,
        help: "Effective magnetic path length (IEC 60205)",
    },
    Def {
        key: "cc-amin",
        engine: "amin",
        label: "Amin",
        dim: Dim::Area,
        optional: true,
        help: "Smallest section; empty: Ae",
    },
    Def {
        key: "cc-wa",
        engine: "window_area",
        label: "Window area",
        dim: Dim::Area,
        optional: false,
        help: "Core window area, one side",
    },
    Def {
        key: "cc-g",
        engine: "window_height",
        label: "Window height",
        dim: Dim::Length,
        optional: true,
        help: "Core window height along the centre leg; empty: the bobbin breadth",
    },
    Def {
        key: "cc-breadth",
        engine: "winding_breadth",
        label: "Bobbin breadth",
        dim: Dim::Length,
        optional: false,
        help: "Winding breadth of the bobbin, along the centre leg",
    },
    Def {
        key: "cc-height",
        engine: "winding_height",
        label: "Bobbin height",
        dim: Dim::Length,
        optional: false,
        help: "Radial build the bobbin allows",
    },
    Def {
        key: "cc-mlt",
        engine: "turn_length_inner",
        label: "Mean turn length on the bobbin",
        dim: Dim::Length,
        optional: false,
        help: "Mean turn length (MLT) of a turn laid on the bare bobbin",
    },
    Def {
        key: "cc-surface",
        engine: "surface_area",
        label: "Outer surface",
        dim: Dim::Surface,
        optional: false,
        help: "Outer surface of the assembled set (cooling)",
    },
    Def {
        key: "cc-mass",
        engine: "mass",
        label: "Mass (set)",
        dim: Dim::Mass,
        optional: true,
        help: "Empty: Ve × a typical ferrite density",
    },
];

/// The custom core's texts in display units, from a core.
fn texts_of(c: &Core) -> [String; 10] {
    let e = effective_of(c);
    let vals = [
        Some(e.ae),
        Some(e.le),
        e.amin,
        Some(e.window_area),
        e.window_height,
        Some(e.winding_breadth),
        Some(e.winding_height),
        Some(e.turn_length_inner),
        Some(e.surface_area),
        e.mass,
    ];
    std::array::from_fn(|i| vals[i].map(|v| sig(v / CUSTOM[i].dim.scale(), 4)).unwrap_or_default())
}

/// What the custom-core entries say: messages per entry, or the core.
#[derive(Debug, Clone, PartialEq)]
struct CoreCheck {
    /// (entry key, message).
    errors: Vec<(&'static str, String)>,
    /// A message about no single entry.
    general: Option<String>,
    /// The designation and parameters the engine accepted.
    ok: Option<(String, Effective)>,
}

/// Reads the custom-core entries and has the engine check them.
fn check_core(name: &str, family: &str, texts: &[String; 10]) -> CoreCheck {
    let mut errors = Vec::new();
    let mut vals = [None; 10];
    for (i, d) in CUSTOM.iter().enumerate() {
        match parse_dim(&texts[i], d.dim) {
            Ok(Some((v, _))) => vals[i] = Some(v),
            Ok(None) if d.optional => {}
            Ok(None) => errors.push((d.key, "enter a value".to_string())),
            Err(m) => errors.push((d.key, m)),
        }
    }
    if name.trim().is_empty() {
        errors.push(("cc-name", "give the core a name".to_string()));
    }
    if !errors.is_empty() {
        return CoreCheck {
            errors,
            general: None,
            ok: None,
        };
    }
    let req = |i: usize| vals[i].unwrap_or(0.0);
    let p = Effective {
        family: family.trim().to_string(),
        ae: req(0),
        le: req(1),
        ve: None,
        amin: vals[2],
        window_area: req(3),
        window_height: vals[4],
        winding_breadth: req(5),
        winding_height: req(6),
        turn_length_inner: req(7),
        surface_area: req(8),
        mass: vals[9],
    };
    match Core::from_effective(name, &p) {
        Ok(_) => CoreCheck {
            errors,
            general: None,
            ok: Some((name.trim().to_string(), p)),
        },
        Err(e) => {
            let at = e.field().and_then(|f| {
                if f == "designation" {
                    Some("cc-name")
                } else {
                    CUSTOM.iter().find(|d| d.engine == f).map(|d| d.key)
                }
            });
            match at {
                Some(k) => CoreCheck {
                    errors: vec![(k, e.message().to_string())],
                    general: None,
                    ok: None,
                },
                None => CoreCheck {
                    errors,
                    general: Some(e.message().to_string()),
                    ok: None,
                },
            }
        }
    }
}

/// No message (for entries the engine never names).
fn none() -> Signal<Option<String>> {
    Signal::derive(|| None)
}

/// A text entry with a unit, a message, and an echo of what was read.
#[component]
fn Entry(
    key: &'static str,
    #[prop(into)] label: String,
    unit: &'static str,
    text: RwSignal<String>,
    #[prop(into)] error: Signal<Option<String>>,
    #[prop(into)] echo: Signal<Option<String>>,
    #[prop(optional)] help: &'static str,
) -> impl IntoView {
    let id = format!("f-{key}");
    let err_id = format!("e-{key}");
    let invalid = move || error.get().is_some();
    view! {
        <div class="field" class:invalid=invalid>
            <label for=id.clone() title=help>{label}</label>
            <div class="entry">
                <input id=id type="text" autocomplete="off" spellcheck="false"
                    aria-invalid=move || if invalid() { "true" } else { "false" }
                    aria-describedby=err_id.clone()
                    prop:value=move || text.get()
                    on:input:target=move |ev| text.set(ev.target().value()) />
                <span class="unit">{unit}</span>
            </div>
            <div class="entry-echo">{move || echo.get().unwrap_or_default()}</div>
            <div class="msg" id=err_id role="alert">{move || error.get().unwrap_or_default()}</div>
        </div>
    }
}

/// The user's own core by effective parameters.
#[component]
fn CustomCore(form: Form) -> impl IntoView {
    let start = core_of(&form.core.get_untracked()).ok();
    let name = RwSignal::new(match form.core.get_untracked() {
        CoreChoice::Effective { designation, .. } => designation,
        _ => "My core".to_string(),
    });
    let family = RwSignal::new(start.as_ref().map(|c| c.family.clone()).unwrap_or_default());
    let texts: [RwSignal<String>; 10] = {
        let t = start.as_ref().map(texts_of).unwrap_or_default();
        std::array::from_fn(|i| RwSignal::new(t[i].clone()))
    };
    let check = Memo::new(move |_| {
        let t: [String; 10] = std::array::from_fn(|i| texts[i].get());
        check_core(&name.get(), &family.get(), &t)
    });
    let error_at = move |key: &'static str| {
        Signal::derive(move || check.with(|c| c.errors.iter().find(|e| e.0 == key).map(|e| e.1.clone())))
    };
    let copy_current = move |_| {
        if let Ok(c) = core_of(&form.core.get_untracked()) {
            let t = texts_of(&c);
            for (s, v) in texts.iter().zip(t) {
                s.set(v);
            }
            family.set(c.family.clone());
            name.set(format!("{} (edited)", c.designation));
        }
    };
    let applied = RwSignal::new(false);
    let use_it = move |_| {
        if let Some((designation, parameters)) = check.get_untracked().ok {
            form.core.set(CoreChoice::Effective {
                designation,
                parameters,
            });
            applied.set(true);
        }
    };
    let in_use = move || {
        check.with(|c| match (&c.ok, form.core.get()) {
            (
                Some((d, p)),
                CoreChoice::Effective {
                    designation,
                    parameters,
                },
            ) => *d == designation && *p == parameters,
            _ => false,
        })
    };
    let fields = CUSTOM
        .iter()
        .enumerate()
        .map(|(i, d)| {
            let text = texts[i];
            let dim = d.dim;
            let echo = Signal::derive(move || match parse_dim(&text.get(), dim) {
                Ok(Some((v, true))) => Some(format!("= {} {}", sig(v / dim.scale(), 4), dim.unit())),
                _ => None,
            });
            let unit = d.dim.unit();
            let label = if d.optional {
                format!("{} (optional)", d.label)
            } else {
                d.label.to_string()
            };
            view! { <Entry key=d.key label=label unit=unit text=text error=error_at(d.key) echo=echo help=d.help /> }
        })
        .collect_view();
    view! {
        <details data-testid="custom-core">
            <summary>"Your own core, by effective parameters"</summary>
            <p class="note">"Numbers are in the unit shown unless you type one (mm, cm, m; mm², cm², m²; g, kg). SI prefixes work (1.2k)."</p>
            <div class="row-buttons">
                <button type="button" class="small" data-testid="copy-core" on:click=copy_current>"Start from the core in use"</button>
            </div>
            <div class="fields">
                <Entry key="cc-name" label="Name" unit="" text=name error=error_at("cc-name") echo=none() />
                <Entry key="cc-family" label="Family (optional)" unit="" text=family error=none() echo=none() />
                {fields}
            </div>
            <p class="bad" role="alert" data-testid="custom-core-error">{move || check.with(|c| c.general.clone()).unwrap_or_default()}</p>
            <button type="button" data-testid="use-custom-core" disabled=move || check.with(|c| c.ok.is_none())
                on:click=use_it>"Use this core"</button>
            <span class="note" role="status" data-testid="custom-core-state">
                {move || if in_use() { " In use." } else if applied.get() { " Changed since used: press again to use." } else { "" }}
            </span>
        </details>
    }
}

/// The material drop-down.
#[component]
fn MaterialPick(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    let mat_err = field_error(outcome, "material");
    let library_now = move || match form.material.get() {
        MaterialChoice::Library { name } => Some(name),
        MaterialChoice::Custom { .. } => None,
    };
    let own = move || match form.material.get() {
        MaterialChoice::Custom { material } => Some(material.name),
        MaterialChoice::Library { .. } => None,
    };
    let options = materials::materials()
        .into_iter()
        .map(|m| {
            let n = m.name;
            let v = n.clone();
            let s = n.clone();
            view! { <option value=v prop:selected=move || library_now().as_deref() == Some(s.as_str())>{n}</option> }
        })
        .collect_view();
    view! {
        <div class="field" class:invalid=move || mat_err.get().is_some()>
            <label for="f-material">"Material"</label>
            <select
                id="f-material"
                on:change:target=move |ev| {
                    let v = ev.target().value();
                    if !v.is_empty() {
                        form.material.set(MaterialChoice::Library { name: v });
                    }
                }
            >
                {move || own().map(|n| view! { <option value="" selected>{format!("Your own: {n}")}</option> })}
                {options}
            </select>
            <div class="msg" id="e-material" role="alert">{move || mat_err.get().unwrap_or_default()}</div>
        </div>
    }
}

/// The loss coefficients of a material (or a fit), as table rows.
fn steinmetz_rows(prefix: &'static str, m: &magwright_engine::material::Steinmetz) -> impl IntoView {
    let id = |s: &str| format!("{prefix}-{s}");
    view! {
        <tr>
            <th scope="row" title="Pv = k·f^α·B^β, W/m³ with f in Hz and B peak in T (sinusoid)">"Steinmetz k"</th>
            <td data-testid=id("k") data-si=si_attr(m.k)>{coef(m.k)}</td>
        </tr>
        <tr><th scope="row">"α (frequency)"</th><td data-testid=id("alpha") data-si=si_attr(m.alpha)>{sig(m.alpha, 4)}</td></tr>
        <tr><th scope="row">"β (flux)"</th><td data-testid=id("beta") data-si=si_attr(m.beta)>{sig(m.beta, 4)}</td></tr>
        <tr>
            <th scope="row">"Fitted over f"</th>
            <td data-testid=id("f-range")>{format!("{} – {}", notation::format(m.f_min, "Hz", 3), notation::format(m.f_max, "Hz", 3))}</td>
        </tr>
        <tr>
            <th scope="row">"Fitted over B peak"</th>
            <td data-testid=id("b-range")>{format!("{} – {}", notation::format(m.b_min, "T", 3), notation::format(m.b_max, "T", 3))}</td>
        </tr>
    }
}

/// The data of the material in use.
#[component]
fn MaterialData(form: Form) -> impl IntoView {
    let material = Memo::new(move |_| material_of(&form.material.get()));
    move || match material.get() {
        Err(e) => view! { <p class="bad" data-testid="material-data-error">{e.message().to_string()}</p> }.into_any(),
        Ok(m) => {
            let t_ref = m.reference_temperature();
            view! {
                <table class="data" data-testid="material-data" aria-label="Data of the material in use">
                    <tr><th scope="row">"Material"</th><td class="text" data-testid="mat-name">{m.name.clone()}</td></tr>
                    <tr><td class="text" colspan="2">{m.description.clone()}</td></tr>
                    <tr><th scope="row">"μi"</th><td data-testid="mat-mu" data-si=si_attr(m.mu_i)>{sig(m.mu_i, 4)}</td></tr>
                    {figure_n("mat-bsat25", "Bsat at 25 °C", m.bsat_25, 1e-3, "mT", 3)}
                    {figure_n("mat-bsat100", "Bsat at 100 °C", m.bsat_100, 1e-3, "mT", 3)}
                    {figure_n("mat-curie", "Curie temperature", m.curie_c, 1.0, "°C", 3)}
                    {steinmetz_rows("mat", &m.steinmetz)}
                    <tr>
                        <th scope="row" title="The temperature of least loss Tm: k holds here; Pv(T) = Pv(Tm)·(1 + c·(T − Tm)²)">"Least loss at (k holds)"</th>
                        <td data-testid="mat-tref" data-si=t_ref.map(si_attr).unwrap_or_default()>
                            {match t_ref { Some(t) => format!("{} °C", sig(t, 3)), None => "any temperature (flat)".into() }}
                        </td>
                    </tr>
                    <tr>
                        <th scope="row" title="The loss rises as 1 + c·(T − Tm)² either side of Tm (1e-4 /K²: +25 % at 50 K away)">"Curvature c"</th>
                        <td data-testid="mat-curvature" data-si=si_attr(m.temp_factor.curvature)>
                            {if m.temp_factor.is_flat() { "0 (flat)".to_string() } else { format!("{} /K²", coef(m.temp_factor.curvature)) }}
                        </td>
                    </tr>
                    {figure_n("mat-resistivity", "Resistivity", m.resistivity, 1.0, "Ω·m", 3)}
                    {figure_n("mat-density", "Density", m.density, 1.0, "kg/m³", 3)}
                </table>
                <p class="prov" data-testid="mat-provenance">{m.provenance.clone()}</p>
            }
            .into_any()
        }
    }
}

/// One entry of the user's own material.
struct MatDef {
    /// Element key: the input's id is `f-<key>`.
    key: &'static str,
    /// The field [`Material::validate`] names in its errors.
    engine: &'static [&'static str],
    label: &'static str,
    /// Unit symbol that may follow the number (and is shown beside it).
    unit: &'static str,
    help: &'static str,
}

/// Index of the loss-minimum temperature and of the curvature in [`OWN`]
/// (skipped when the temperature factor is flat).
const T_REF: usize = 11;
const CURVE: usize = 12;

const OWN: [MatDef; 15] = [
    MatDef { key: "cm-mu", engine: &["material.mu_i"], label: "μi", unit: "", help: "Initial relative permeability" },
    MatDef { key: "cm-bsat25", engine: &["material.bsat_25"], label: "Bsat at 25 °C", unit: "T", help: "Saturation flux density at 25 °C, tesla (490m = 490 mT)" },
    MatDef { key: "cm-bsat100", engine: &["material.bsat_100"], label: "Bsat at 100 °C", unit: "T", help: "Saturation flux density at 100 °C, tesla (390m = 390 mT)" },
    MatDef { key: "cm-curie", engine: &["material.curie_c"], label: "Curie temperature", unit: "°C", help: "Where the ferrite stops being magnetic" },
    MatDef { key: "cm-k", engine: &["material.steinmetz.k"], label: "Steinmetz k", unit: "", help: "Pv = k·f^α·B^β in W/m³ with f in Hz and B peak in T (sinusoid), at the loss minimum" },
    MatDef { key: "cm-alpha", engine: &["material.steinmetz.alpha"], label: "α (frequency)", unit: "", help: "Frequency exponent of the Steinmetz law" },
    MatDef { key: "cm-beta", engine: &["material.steinmetz.beta"], label: "β (flux)", unit: "", help: "Flux exponent of the Steinmetz law" },
    MatDef { key: "cm-fmin", engine: &["material.steinmetz.f_min"], label: "Fitted from f", unit: "Hz", help: "Lowest frequency k, α, β hold at" },
    MatDef { key: "cm-fmax", engine: &["material.steinmetz.f_max"], label: "Fitted to f", unit: "Hz", help: "Highest frequency k, α, β hold at" },
    MatDef { key: "cm-bmin", engine: &["material.steinmetz.b_min"], label: "Fitted from B peak", unit: "T", help: "Lowest peak flux density k, α, β hold at" },
    MatDef { key: "cm-bmax", engine: &["material.steinmetz.b_max"], label: "Fitted to B peak", unit: "T", help: "Highest peak flux density k, α, β hold at" },
    MatDef { key: "cm-tref", engine: &["material.temp_factor.least_loss_c"], label: "Loss minimum at", unit: "°C", help: "The temperature where the loss is least; k holds there" },
    MatDef { key: "cm-curve", engine: &["material.temp_factor.curvature"], label: "Curvature c", unit: "/K²", help: "The loss rises as 1 + c·(T − Tm)² either side of the minimum (1e-4: +25 % at 50 °C away)" },
    MatDef { key: "cm-rho", engine: &["material.resistivity"], label: "Resistivity", unit: "Ω·m", help: "Bulk DC resistivity" },
    MatDef { key: "cm-density", engine: &["material.density"], label: "Density", unit: "kg/m³", help: "For the core mass" },
];

/// `v` as short text that reads back exactly: with an SI prefix where the
/// unit takes one ("490m" T, "20k" Hz), else plain or with an exponent.
fn exact_text(v: f64, prefixed: bool) -> String {
    if !v.is_finite() {
        return String::new();
    }
    let reads_back = |t: &str| notation::parse(t, "").is_ok_and(|r| r == v);
    if prefixed && v != 0.0 {
        // Shortest digits of v, the decimal point moved by the prefix.
        let e = format!("{v:e}");
        if let Some((digits, exp)) = e.split_once('e').and_then(|(d, x)| x.parse::<i32>().ok().map(|x| (d, x))) {
            for (p, shift) in [("m", -3), ("", 0), ("k", 3), ("M", 6)] {
                if let Ok(m) = format!("{digits}e{}", exp - shift).parse::<f64>() {
                    let t = format!("{m}{p}");
                    if (1.0..1000.0).contains(&m.abs()) && reads_back(&t) {
                        return t;
                    }
                }
            }
        }
    }
    let plain = format!("{v}");
    if plain.len() <= 10 && reads_back(&plain) {
        plain
    } else {
        format!("{v:e}")
    }
}

/// The own-material entries' texts from a material, and whether its
/// temperature factor is flat.
fn material_texts(m: &Material) -> ([String; 15], bool) {
    let s = &m.steinmetz;
    let t_ref = m.reference_temperature();
    let vals = [
        m.mu_i,
        m.bsat_25,
        m.bsat_100,
        m.curie_c,
        s.k,
        s.alpha,
        s.beta,
        s.f_min,
        s.f_max,
        s.b_min,
        s.b_max,
        t_ref.unwrap_or(100.0),
        if t_ref.is_some() { m.temp_factor.curvature } else { 1e-4 },
        m.resistivity,
        m.density,
    ];
    let texts = std::array::from_fn(|i| exact_text(vals[i], matches!(OWN[i].unit, "T" | "Hz")));
    (texts, t_ref.is_none())
}

/// What the own-material entries say: messages per entry, or the material.
#[derive(Debug, Clone, PartialEq)]
struct MatCheck {
    /// (entry key, message).
    errors: Vec<(&'static str, String)>,
    /// A message about no single entry.
    general: Option<String>,
    ok: Option<Material>,
}

/// Reads the own-material entries into a [`Material`] and has the engine
/// check it ([`Material::validate`]); its message lands at the entry of
/// the field it names.
fn check_material(name: &str, texts: &[String; 15], flat: bool) -> MatCheck {
    let mut errors = Vec::new();
    let mut v = [0.0; 15];
    for (i, d) in OWN.iter().enumerate() {
        if flat && (i == T_REF || i == CURVE) {
            continue;
        }
        match notation::parse(&texts[i], d.unit) {
            Ok(x) => v[i] = x,
            Err(e) => errors.push((d.key, e.to_string())),
        }
    }
    if !errors.is_empty() {
        return MatCheck { errors, general: None, ok: None };
    }
    let m = Material {
        name: name.trim().to_string(),
        description: "Your own material, entered from its data".into(),
        mu_i: v[0],
        bsat_25: v[1],
        bsat_100: v[2],
        curie_c: v[3],
        steinmetz: Steinmetz { k: v[4], alpha: v[5], beta: v[6], f_min: v[7], f_max: v[8], b_min: v[9], b_max: v[10] },
        temp_factor: if flat { TempFactor::flat() } else { TempFactor::with_minimum(v[T_REF], v[CURVE]) },
        resistivity: v[13],
        density: v[14],
        provenance: "your own data".into(),
        bsat_rise_intended: false,
    };
    match m.validate() {
        Ok(()) => MatCheck { errors, general: None, ok: Some(m) },
        Err(e) => {
            let at = e.field().and_then(|f| {
                if f == "material.name" {
                    Some("cm-name")
                } else {
                    OWN.iter().find(|d| d.engine.contains(&f)).map(|d| d.key)
                }
            });
            match at {
                Some(k) => MatCheck { errors: vec![(k, e.message().to_string())], general: None, ok: None },
                None => MatCheck { errors, general: Some(e.message().to_string()), ok: None },
            }
        }
    }
}

/// The user's own material, entered field by field from its data.
#[component]
fn OwnMaterial(form: Form) -> impl IntoView {
    let start = material_of(&form.material.get_untracked()).ok();
    let (t0, flat0) = start.as_ref().map(material_texts).unwrap_or_default();
    let name = RwSignal::new(match form.material.get_untracked() {
        MaterialChoice::Custom { material } => material.name,
        MaterialChoice::Library { .. } => "My material".to_string(),
    });
    let texts: [RwSignal<String>; 15] = std::array::from_fn(|i| RwSignal::new(t0[i].clone()));
    let flat = RwSignal::new(flat0);
    let check = Memo::new(move |_| {
        let t: [String; 15] = std::array::from_fn(|i| texts[i].get());
        check_material(&name.get(), &t, flat.get())
    });
    let error_at = move |key: &'static str| {
        Signal::derive(move || check.with(|c| c.errors.iter().find(|e| e.0 == key).map(|e| e.1.clone())))
    };
    let copy_current = move |_| {
        if let Ok(m) = material_of(&form.material.get_untracked()) {
            let (t, f) = material_texts(&m);
            for (s, v) in texts.iter().zip(t) {
                s.set(v);
            }
            flat.set(f);
            name.set(format!("{} (edited)", m.name));
        }
    };
    let applied = RwSignal::new(false);
    let use_it = move |_| {
        if let Some(material) = check.get_untracked().ok {
            form.material.set(MaterialChoice::Custom { material });
            applied.set(true);
        }
    };
    let in_use = move || {
        check.with(|c| match (&c.ok, form.material.get()) {
            (Some(m), MaterialChoice::Custom { material }) => *m == material,
            _ => false,
        })
    };
    let entry = move |i: usize| {
        let d = &OWN[i];
        let text = texts[i];
        let unit = d.unit;
        // What a typed prefix or unit was read as.
        let echo = Signal::derive(move || {
            let t = text.get();
            let plain = t.trim().parse::<f64>().is_ok();
            match notation::parse(&t, unit) {
                Ok(v) if !plain => Some(format!("= {} {unit}", exact_text(v, false)).trim_end().to_string()),
                _ => None,
            }
        });
        view! { <Entry key=d.key label=d.label unit=unit text=text error=error_at(d.key) echo=echo help=d.help /> }
    };
    view! {
        <details data-testid="own-material">
            <summary>"Your own material, by its data"</summary>
            <p class="note">"Numbers in the unit shown; SI prefixes work (490m T = 490 mT, 20k Hz, 1e-4). Steinmetz k, α, β for a sinusoid, at the loss minimum."</p>
            <div class="row-buttons">
                <button type="button" class="small" data-testid="copy-material" on:click=copy_current>"Start from the material in use"</button>
            </div>
            <div class="fields">
                <Entry key="cm-name" label="Name" unit="" text=name error=error_at("cm-name") echo=none() />
                {(0..T_REF).map(entry).collect_view()}
            </div>
            <div class="check">
                <input type="checkbox" id="f-cm-flat" prop:checked=move || flat.get()
                    on:change:target=move |ev| flat.set(ev.target().checked()) />
                <label for="f-cm-flat">"Loss does not depend on temperature (flat)"</label>
            </div>
            <div class="fields">
                <Show when=move || !flat.get()>{move || (T_REF..=CURVE).map(entry).collect_view()}</Show>
                {(CURVE + 1..OWN.len()).map(entry).collect_view()}
            </div>
            <p class="bad" role="alert" data-testid="own-material-error">{move || check.with(|c| c.general.clone()).unwrap_or_default()}</p>
            <button type="button" data-testid="use-own-material" disabled=move || check.with(|c| c.ok.is_none())
                on:click=use_it>"Use this material"</button>
            <span class="note" role="status" data-testid="own-material-state">
                {move || if in_use() { " In use." } else if applied.get() { " Changed since used: press again to use." } else { "" }}
            </span>
        </details>
    }
}

/// The example shown in the empty text box.
const PLACEHOLDER: &str = "f  B  T  Pv\n100k 0.1 100 80k\n200k 0.1 100 195k\n100k 0.2 100 480k";

/// The user's own material: loss fitted to pasted measurements.
#[component]
fn FittedMaterial(form: Form) -> impl IntoView {
    let text = RwSignal::new(String::new());
    let name = RwSignal::new("My fitted material".to_string());
    let pasted = Memo::new(move |_| parse_points(&text.get()));
    let result: Memo<Option<Result<(LossFit, usize), String>>> = Memo::new(move |_| {
        pasted.with(|p| match p {
            Err(m) => Some(Err(m.clone())),
            Ok(p) if p.points.is_empty() => None,
            Ok(p) => Some(
                fit::fit(&p.points)
                    .map(|f| (f, p.points.len()))
                    .map_err(|e| point_error(&e, &p.lines)),
            ),
        })
    });
    let base = Memo::new(move |_| material_of(&form.material.get()));
    let status = RwSignal::new(None::<Result<String, String>>);
    // A new fit or a new base clears the last message.
    Effect::new(move |_| {
        result.track();
        status.set(None);
    });
    let use_it = move |_| {
        let Some(Ok((lf, n))) = result.get_untracked() else {
            return;
        };
        let base = match base.get_untracked() {
            Ok(b) => b,
            Err(e) => return status.set(Some(Err(e.message().to_string()))),
        };
        let s = &lf.steinmetz;
        let outcome = lf.apply_to(&base).map(|mut m| {
            m.name = if name.get_untracked().trim().is_empty() { "Fitted material".into() } else { name.get_untracked().trim().to_string() };
            m.description = format!(
                "Loss fitted to {n} measured points ({} – {}, {} – {}); μi, saturation, Curie point, resistivity and density from {}",
                notation::format(s.f_min, "Hz", 3),
                notation::format(s.f_max, "Hz", 3),
                notation::format(s.b_min, "T", 3),
                notation::format(s.b_max, "T", 3),
                base.name
            );
            m.provenance = format!("loss from your measurements; other values from {}: {}", base.name, base.provenance);
            m
        });
        match outcome {
            Ok(m) => {
                let msg = format!("Using {} (based on {}).", m.name, base.name);
                form.material.set(MaterialChoice::Custom { material: m });
                status.set(Some(Ok(msg)));
            }
            Err(e) => status.set(Some(Err(format!("This fit cannot be used: {}", e.message())))),
        }
    };
    let shown = move || match result.get() {
        None => view! { <p class="note">"Paste measured points to fit k, α and β."</p> }.into_any(),
        Some(Err(m)) => view! { <p class="bad" role="alert" data-testid="fit-error">{m}</p> }.into_any(),
        Some(Ok((lf, n))) => {
            let temps = lf
                .temperatures
                .iter()
                .map(|t| format!("{} °C", sig(*t, 3)))
                .collect::<Vec<_>>()
                .join(", ");
            view! {
                <table class="data" data-testid="fit-result" aria-label="The fitted loss model">
                    <tr><th scope="row">"Points"</th><td data-testid="fit-n" data-si=n.to_string()>{n}</td></tr>
                    {steinmetz_rows("fit", &lf.steinmetz)}
                    {figure_n("fit-tref", "k holds at", lf.reference_temperature, 1.0, "°C", 3)}
                    <tr><th scope="row">"Temperatures"</th><td class="text">{temps}</td></tr>
                    <tr><th scope="row">"Largest error"</th><td data-testid="fit-max-err" data-si=si_attr(lf.max_error_pct)>{pct(lf.max_error_pct)}</td></tr>
                    <tr><th scope="row">"RMS error"</th><td data-testid="fit-rms-err" data-si=si_attr(lf.rms_error_pct)>{pct(lf.rms_error_pct)}</td></tr>
                </table>
                <ul class="notes" data-testid="fit-notes">{lf.notes.iter().map(|n| view! { <li>{n.clone()}</li> }).collect_view()}</ul>
            }
            .into_any()
        }
    };
    let base_name = move || base.get().map(|b| b.name).unwrap_or_else(|e| e.message().to_string());
    view! {
        <details data-testid="fit-material">
            <summary>"Your own material, fitted to measured loss"</summary>
            <label for="f-fit-points" class="note">
                "One measured point per line: f (Hz), B peak (T), temperature (°C), Pv (W/m³), sinusoidal flux. "
                "SI prefixes work (100k 0.1 100 80k); spaces, tabs, commas or semicolons separate; a header line is skipped."
            </label>
            <textarea id="f-fit-points" data-testid="fit-points" spellcheck="false" placeholder=PLACEHOLDER
                prop:value=move || text.get() on:input:target=move |ev| text.set(ev.target().value())></textarea>
            {shown}
            <div class="fields">
                <Entry key="fit-name" label="Name" unit="" text=name error=none() echo=none() />
            </div>
            <p class="note">"μi, saturation, Curie point, resistivity and density come from "<strong>{base_name}</strong>", the material in use."</p>
            <button type="button" data-testid="fit-use" disabled=move || !matches!(result.get(), Some(Ok(_)))
                on:click=use_it>"Use this material"</button>
            <p role="status" data-testid="fit-status" class:bad=move || matches!(status.get(), Some(Err(_)))>
                {move || match status.get() { Some(Ok(m)) | Some(Err(m)) => m, None => String::new() }}
            </p>
        </details>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn dims_read_units_and_prefixes() {
        // Unit conversions by definition (SI brochure): 1 mm = 1e-3 m, 1 mm² = 1e-6 m², 1 cm² = 1e-4 m².
        let close = |a: f64, b: f64| (a - b).abs() <= 1e-12 * b.abs();
        let v = |t: &str, d: Dim| parse_dim(t, d).unwrap().unwrap();
        assert!(close(v("78.6", Dim::Length).0, 78.6e-3));
        assert!(close(v("78.6 mm", Dim::Length).0, 78.6e-3));
        assert!(close(v("7.86cm", Dim::Length).0, 78.6e-3));
        assert!(close(v("0.0786 m", Dim::Length).0, 78.6e-3));
        assert!(v("78.6 mm", Dim::Length).1 && !v("78.6", Dim::Length).1);
        assert!(close(v("173", Dim::Area).0, 173e-6));
        assert!(close(v("1.73 cm²", Dim::Area).0, 173e-6));
        assert!(close(v("173mm2", Dim::Area).0, 173e-6));
        assert!(close(v("1.2k", Dim::Area).0, 1.2e-3));
        assert!(close(v("70", Dim::Surface).0, 70e-4));
        assert!(close(v("40", Dim::Mass).0, 0.04));
        assert!(close(v("0.04 kg", Dim::Mass).0, 0.04));
        assert_eq!(parse_dim("  ", Dim::Length), Ok(None));
        assert!(parse_dim("abc", Dim::Length).is_err());
        assert!(parse_dim("mm", Dim::Length).is_err());
    }

    #[test]
    fn rows_split_on_any_separator() {
        assert_eq!(split_row("100k 0.1\t100 80k"), vec!["100k", "0.1", "100", "80k"]);
        assert_eq!(split_row("100k,0.1,100,80k"), vec!["100k", "0.1", "100", "80k"]);
        assert_eq!(split_row("100k, 0.1, 100, 80k"), vec!["100k", "0.1", "100", "80k"]);
        assert_eq!(split_row("100k;0,1;100;80k"), vec!["100k", "0,1", "100", "80k"]);
    }

    #[test]
    fn points_read_with_header_prefixes_and_units() {
        let p = parse_points("f B T Pv\n\n100k 0.1 100 80k  # first\n200 kHz, 100 mT, 25 °C, 195 kW/m³\n").unwrap();
        assert!(p.header);
        assert_eq!(p.lines, vec![3, 4]);
        assert_eq!(
            p.points[0],
            LossPoint {
                f: 100e3,
                b: 0.1,
                temp_c: 100.0,
                pv: 80e3
            }
        );
        let q = p.points[1];
        assert!(
            (q.f - 200e3).abs() < 1e-9 && (q.b - 0.1).abs() < 1e-15 && q.temp_c == 25.0 && (q.pv - 195e3).abs() < 1e-9
        );
        let e = parse_points("100k 0.1 100 80k\n100k 0.1 100").unwrap_err();
        assert!(e.contains("line 2") && e.contains("four"), "{e}");
        let e = parse_points("100k 0.1 100 80k\n100k x 100 5").unwrap_err();
        assert!(e.starts_with("line 2, B"), "{e}");
        assert_eq!(parse_points("").unwrap().points.len(), 0);
    }

    #[test]
    fn engine_point_errors_name_the_line() {
        let p = parse_points("# header comment\n100k 0.1 100 80k\n100k 0 100 80k\n").unwrap();
        let e = fit::fit(&p.points).unwrap_err();
        assert_eq!(point_error(&e, &p.lines), format!("line 3, B: {}", e.message()));
    }

    #[test]
    fn custom_core_messages_land_at_the_entry() {
        let c = cores::find("ETD 34").unwrap();
        let t = texts_of(&c);
        let ok = check_core("Mine", "ETD", &t);
        assert!(ok.errors.is_empty() && ok.ok.is_some(), "{ok:?}");
        let mut bad = t.clone();
        bad[7] = "1".into(); // a 1 mm turn around a leg of ~97 mm²: the engine refuses it
        let r = check_core("Mine", "", &bad);
        assert_eq!(r.errors.first().map(|e| e.0), Some("cc-mlt"), "{r:?}");
        let mut bad = t;
        bad[0] = "-5".into();
        assert_eq!(check_core("Mine", "", &bad).errors.first().map(|e| e.0), Some("cc-ae"));
        assert_eq!(
            check_core(" ", "", &texts_of(&c)).errors.first().map(|e| e.0),
            Some("cc-name")
        );
    }

    #[test]
    fn browser_filters_and_orders() {
        let etd = select("ETD", "", Order::Library);
        assert!(!etd.is_empty() && etd.iter().all(|&i| cores::all()[i].family == "ETD"));
        let by_ve = select("", "", Order::VeUp);
        assert!(by_ve.windows(2).all(|w| cores::all()[w[0]].ve <= cores::all()[w[1]].ve));
        assert!(select("", "etd34", Order::Library)
            .iter()
            .any(|&i| cores::all()[i].designation == "ETD 34"));
    }

    #[test]
    fn own_material_reads_back_and_messages_land_at_the_entry() {
        // Round trip: a library grade's data as text give the same material
        // back (the temperature factor rebuilt by TempFactor::with_minimum).
        let m = materials::find("MnZn-200k").unwrap();
        let (t, flat) = material_texts(&m);
        assert!(!flat);
        assert_eq!(t[1], "490m");
        assert_eq!(t[7], "20k");
        let c = check_material("Mine", &t, false);
        let got = c.ok.expect("valid");
        assert_eq!((got.mu_i, got.bsat_25, got.steinmetz.clone()), (m.mu_i, m.bsat_25, m.steinmetz.clone()));
        assert_eq!(got.reference_temperature(), m.reference_temperature());
        assert_eq!(got.provenance, "your own data");
        let mut bad = t.clone();
        bad[5] = "5".into();
        assert_eq!(check_material("Mine", &bad, false).errors.first().map(|e| e.0), Some("cm-alpha"));
        let mut bad = t.clone();
        bad[CURVE] = "-1e-4".into();
        assert_eq!(check_material("Mine", &bad, false).errors.first().map(|e| e.0), Some("cm-curve"));
        // Flat: the curvature entry is not read at all.
        assert!(check_material("Mine", &bad, true).ok.is_some_and(|m| m.temp_factor == TempFactor::flat()));
        bad[2] = "x".into();
        assert_eq!(check_material("Mine", &bad, true).errors.first().map(|e| e.0), Some("cm-bsat100"));
        assert_eq!(check_material(" ", &t, false).errors.first().map(|e| e.0), Some("cm-name"));
        for v in [0.39, 1.6e-3, 2.3e3, 4800.0, 1e5, 1.2e-4, 300e3] {
            assert_eq!(notation::parse(&exact_text(v, true), "").unwrap(), v);
            assert_eq!(notation::parse(&exact_text(v, false), "").unwrap(), v);
        }
    }

    #[test]
    fn figures_read_plainly() {
        assert_eq!(sig(97.1234, 4), "97.12");
        assert_eq!(sig(0.0012345, 3), "0.00123");
        assert_eq!(sig(12345.0, 3), "12345");
        assert_eq!(coef(1.6e-3), "1.6000e-3");
        assert_eq!(coef(10.0), "10.00");
    }

    #[test]
    fn agreement_percent_is_signed_and_never_minus_zero() {
        assert_eq!(signed_pct(-0.0004), "0.0 %");
        assert_eq!(signed_pct(0.044), "+4.4 %");
        assert_eq!(signed_pct(-0.0123), "−1.2 %");
        assert!(is_unconfirmed(&cores::find("ETD 34").unwrap()));
        assert!(!is_unconfirmed(&cores::find("ETD 29").unwrap()));
    }
}
