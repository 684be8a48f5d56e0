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

mod core_pick;
mod material_pick;
use core_pick::*;
use material_pick::*;

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
