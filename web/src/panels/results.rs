//! Results at a glance: a verdict line, the safety cautions, the checks
//! that decide the design (failing first, tight ones marked, each with
//! its margin and worst line corner), then the key figures, why the turns
//! are what they are, the leakage clamp (switch peak and clamp loss, a
//! converter loss shown apart), the thermal iteration, and the engine's
//! warnings.
//!
//! Every number is a report field;
//! nothing is computed here beyond unit changes for display.

use super::Missing;
use crate::form::{Outcome, Report};
use leptos::prelude::*;
use magwright_engine::design::solve::{Check, RESIDUAL_GAP};
use magwright_engine::gap::GapPlacement;
use magwright_engine::notation;
use magwright_engine::topology::{Corner, Mode, Topology};

const CSS: &str = r#"
.results .verdict-line { margin:0 0 .45rem; padding:.35rem .6rem; border-radius:4px; font-weight:600; background:#eaf5ee; color:#14532d; border-left:4px solid #1e6b34; }
.results .verdict-line.fail { background:#fdecea; color:#8a1c14; border-left-color:#b3261e; }
.results .verdict-line .sub { font-weight:normal; color:inherit; opacity:.9; }
.results .cautions { border:1px solid #e0b252; border-left:5px solid #b36b00; background:#fff8e8; border-radius:4px; padding:.35rem .6rem .4rem; margin:0 0 .55rem; font-size:.88em; }
.results .cautions strong { color:#6b3d00; }
.results .cautions ul { margin:.15rem 0 0; padding-left:1.1rem; }
.results table.checks { font-size:.9em; margin-bottom:.5rem; }
.results table.checks thead th { color:var(--ink); font-weight:600; border-bottom:1px solid var(--line); font-size:.9em; }
.results table.checks thead th + th { text-align:right; }
.results table.checks td { padding-left:.45rem; }
.results table.checks tr.fail th, .results table.checks tr.fail td { color:#a3211a; font-weight:600; }
.results table.checks tr.fail { background:#fff1f0; }
.results table.checks .tag { display:inline-block; font-size:.75em; padding:0 .3rem; border-radius:3px; margin-left:.3rem; vertical-align:1px; }
.results table.checks .tag.tight { background:#e8eefc; color:#1f4a8a; border:1px solid #b8c8ea; }
.results table.checks .tag.failing { background:#b3261e; color:#fff; }
.results table.checks .note { display:block; color:var(--muted); font-size:.82em; font-weight:normal; }
.results table.checks td.ok { color:#1e6b34; }
.results table.checks td.corner { color:var(--muted); font-size:.88em; }
.results h3 { font-size:.9rem; margin:.55rem 0 .15rem; }
.results table.key { font-size:.92em; }
.results table.key td.extra { color:var(--muted); font-size:.88em; text-align:right; padding-left:.5rem; }
.results .turns-line { margin:.1rem 0 .3rem; display:flex; flex-wrap:wrap; gap:.2rem .9rem; font-variant-numeric:tabular-nums; }
.results .turns-line .lbl { color:var(--muted); }
.results .tiles { display:grid; grid-template-columns:repeat(auto-fill, minmax(7.6rem, 1fr)); gap:.3rem; margin:.2rem 0 .3rem; }
.results .tile { border:1px solid #e3e7ec; border-radius:4px; padding:.2rem .4rem; display:flex; flex-direction:column; min-width:0; }
.results .tile .k { color:var(--muted); font-size:.78em; line-height:1.2; }
.results .tile .v { font-weight:600; font-variant-numeric:tabular-nums; font-size:1.02em; }
.results .tile .s { color:var(--muted); font-size:.74em; line-height:1.2; min-height:1.2em; }
.results .thermal-note { color:var(--muted); margin:.3rem 0 0; font-size:.86em; }
"#;

/// "at Vin min" / "at Vin max" / "".
pub fn corner_name(c: Option<Corner>) -> &'static str {
    match c {
        Some(Corner::VinMin) => "at Vin min",
        Some(Corner::VinMax) => "at Vin max",
        None => "",
    }
}

/// Value and limit of a check, in the units an engineer reads them in.
fn check_texts(c: &Check) -> (String, String) {
    if let Some(t) = ratio_check_texts(c) {
        return t;
    }
    match c.unit.as_str() {
        "m" => (format!("{:.2} mm", c.value * 1e3), format!("{:.2} mm", c.limit * 1e3)),
        "T" => (format!("{:.0} mT", c.value * 1e3), format!("{:.0} mT", c.limit * 1e3)),
        "" => (format!("{:.1} %", c.value * 100.0), format!("{:.1} %", c.limit * 100.0)),
        "°C" => (format!("{:.1} °C", c.value), format!("{:.0} °C", c.limit)),
        "×" => (format!("×{:.2}", c.value), format!("×{:.2}", c.limit)),
        u => (notation::format(c.value, u, 3), notation::format(c.limit, u, 3)),
    }
}

/// The flyback's mode check reads as a ripple ratio against the boundary
/// (r = 2), the magnetising check as a plain ratio; `None` for the others.
fn ratio_check_texts(c: &Check) -> Option<(String, String)> {
    match c.key.as_str() {
        "mode" => Some((format!("r = {:.3}", c.value), "boundary r = 2".into())),
        "magnetising" => Some((format!("{:.2}", c.value), format!("{:.2}", c.limit))),
        _ => None,
    }
}

fn mode_text(m: Mode) -> &'static str {
    match m {
        Mode::Ccm => "CCM",
        Mode::Boundary => "boundary",
        Mode::Dcm => "DCM",
    }
}

/// The flyback's conduction mode at both corners, as wound (a report field).
fn mode_tile(r: &Report) -> Option<impl IntoView> {
    let c = r.conduction.as_ref()?;
    let lo = c.corners.iter().find(|k| k.corner == Corner::VinMin)?;
    let hi = c.corners.iter().find(|k| k.corner == Corner::VinMax)?;
    Some(tile(
        "mode",
        "Mode at Vin min / max",
        format!("{} / {}", mode_text(lo.mode), mode_text(hi.mode)),
        lo.ripple_ratio,
        format!(
            "ripple ratio {:.2} / {:.2} (asked {:.2} {})",
            lo.ripple_ratio,
            hi.ripple_ratio,
            c.requested_ripple_ratio,
            mode_text(c.requested)
        ),
    ))
}

/// Failing checks first (worst margin first), then tight, then the rest.
fn ordered(checks: &[Check]) -> Vec<&Check> {
    let mut v: Vec<&Check> = checks.iter().collect();
    v.sort_by(|a, b| {
        let rank = |c: &Check| {
            if !c.pass {
                0
            } else if c.tight {
                1
            } else {
                2
            }
        };
        rank(a).cmp(&rank(b)).then(a.margin.total_cmp(&b.margin))
    });
    v
}

/// A check's margin as a reader takes it: for a temperature the kelvin
/// left to the limit (a percentage of a Celsius value means nothing), for
/// anything else the share of the limit left, in %.
pub fn margin_text(c: &Check) -> String {
    if c.unit == "°C" {
        format!("{:+.1} K", c.limit - c.value)
    } else {
        format!("{:+.0} %", c.margin * 100.0)
    }
}

/// The one line a reader takes in first.
fn verdict(r: &Report) -> (String, String) {
    let failing: Vec<&Check> = r.checks.iter().filter(|c| !c.pass).collect();
    if failing.is_empty() {
        let tight = r.checks.iter().min_by(|a, b| a.margin.total_cmp(&b.margin));
        let sub = tight
            .map(|c| {
                let at = corner_name(c.corner);
                format!(
                    " — tightest: {}, {} margin{}{}",
                    short_label(c),
                    margin_text(c).trim_start_matches('+'),
                    if at.is_empty() { "" } else { " " },
                    at
                )
            })
            .unwrap_or_default();
        ("Passes every check".into(), sub)
    } else {
        let names: Vec<String> = failing
            .iter()
            .map(|c| format!("{} ({})", short_label(c), margin_text(c)))
            .collect();
        let n = failing.len();
        (
            format!("Fails {n} check{}", if n == 1 { "" } else { "s" }),
            format!(" — {}", names.join(", ")),
        )
    }
}

/// A short name for a check, read at a glance (the engine's label is the tooltip).
fn short_label(c: &Check) -> String {
    match c.key.as_str() {
        "saturation" => "Bpk in Amin vs Bsat at core temp.".into(),
        "temperature" => "Core temperature".into(),
        "window" => "Window build".into(),
        "duty" => "Duty".into(),
        "switch_voltage" => "Switch voltage".into(),
        "curie" => "Curie − 20 K".into(),
        "mode" => "Mode as wound".into(),
        "magnetising" => "Magnetising in dead time".into(),
        "loss_budget" => "Loss budget share".into(),
        "material_range" => "Material data range".into(),
        "choke" => "Output choke".into(),
        _ => c.label.clone(),
    }
}

fn check_row(c: &Check) -> impl IntoView {
    let (v, l) = check_texts(c);
    let at = corner_name(c.corner);
    let note = if c.note.is_empty() {
        c.label.clone()
    } else {
        format!("{}: {}", c.label, c.note)
    };
    let inline = c.note.clone();
    let show_note = !c.pass && !inline.is_empty();
    view! {
        <tr class:fail=!c.pass class:tight=c.tight data-testid=format!("check-{}", c.key)
            data-pass=c.pass.to_string() data-tight=c.tight.to_string() title=note.clone()>
            <th scope="row">
                {short_label(c)}
                {(!c.pass).then(|| view! { <span class="tag failing">"FAIL"</span> })}
                {(c.pass && c.tight).then(|| view! { <span class="tag tight" title="Tight: under 10 % margin (for a temperature, 10 % of the allowed rise over ambient), or the tightest check: this check limits the design">"tight"</span> })}
                {show_note.then(|| view! { <span class="note">{inline}</span> })}
            </th>
            <td data-si=format!("{:e}", c.value)>{v}</td>
            <td>{l}</td>
            <td class:ok=c.pass data-testid=format!("margin-{}", c.key) data-si=format!("{:e}", c.margin)>
                {margin_text(c)}
            </td>
            <td class="corner">{at}</td>
        </tr>
    }
}

/// The gap as a builder reads it.
pub fn gap_text(r: &Report) -> String {
    match &r.gap {
        Some(g) => match r.gap_placement {
            GapPlacement::CentreLeg => format!("{:.3} mm ground in the centre leg", g.gap * 1e3),
            GapPlacement::Spacer => {
                format!(
                    "{:.3} mm spacer in every leg ({:.3} mm in the path)",
                    g.gap * 1e3,
                    g.path_gap * 1e3
                )
            }
        },
        None if r.core.is_one_piece() => "none: one-piece core, no residual gap".into(),
        None => format!("none: mated halves ({:.0} µm residual assumed)", RESIDUAL_GAP * 1e6),
    }
}

/// One key figure: label, value (with its SI value), a line under it.
fn tile(id: &'static str, label: &'static str, value: String, si: f64, sub: String) -> impl IntoView {
    view! {
        <div class="tile">
            <span class="k">{label}</span>
            <span class="v" data-testid=id data-si=format!("{si:e}")>{value}</span>
            <span class="s">{sub}</span>
        </div>
    }
}

fn mm(x: f64) -> String {
    format!("{:.2} mm", x * 1e3)
}

/// Where the gap is (the tile's second line).
fn gap_place(r: &Report) -> String {
    match (&r.gap, r.gap_placement) {
        (None, _) if r.core.is_one_piece() => "one-piece core, no residual gap".into(),
        (None, _) => format!("mated halves, {:.0} µm residual", RESIDUAL_GAP * 1e6),
        (Some(_), GapPlacement::CentreLeg) => "ground in the centre leg".into(),
        (Some(g), GapPlacement::Spacer) => format!("spacer in every leg ({:.3} mm in the path)", g.path_gap * 1e3),
    }
}

/// Every winding's turns: "Np 6 · Ns1 5 · Nr 6" (push-pull: per half).
fn turns_line(r: &Report) -> Vec<(String, String, u32)> {
    let half = matches!(
        r.topology,
        Topology::PushPull | Topology::HalfBridge | Topology::FullBridge
    );
    let mut v = vec![(
        "np".to_string(),
        match r.topology {
            Topology::PushPull => "Np (each half)",
            Topology::Inductor => "N",
            _ => "Np",
        }
        .to_string(),
        r.turns.primary,
    )];
    for (i, n) in r.turns.secondaries.iter().enumerate() {
        let id = if i == 0 {
            "ns".to_string()
        } else {
            format!("ns-{}", i + 1)
        };
        v.push((id, format!("Ns{}{}", i + 1, if half { " (each half)" } else { "" }), *n));
    }
    if let Some(nr) = r.turns.reset {
        v.push(("nreset".into(), "Nreset".into(), nr));
    }
    v
}

/// The deciding figures, or why there are none.
#[component]
pub fn Results(outcome: Memo<Outcome>) -> impl IntoView {
    let body = move || match outcome.get() {
        Err(p) => view! { <Missing lines=p.lines() /> }.into_any(),
        Ok(r) => {
            let (head, sub) = verdict(&r);
            let checks = ordered(&r.checks).into_iter().map(check_row).collect_view();
            let turns = turns_line(&r)
                .into_iter()
                .map(|(id, label, n)| {
                    view! { <span class="turn"><span class="lbl">{label}" "</span><strong data-testid=id data-si=n.to_string()>{n}</strong></span> }
                })
                .collect_view();
            let w = &r.waveforms;
            let worst = |q: &str| w.get(q).map(|x| (x.value, x.corner));
            let sw_v = worst("switch_voltage");
            let sw_i = worst("switch_peak_current");
            let is_flyback = r.topology == Topology::Flyback;
            let is_inductor = r.topology == Topology::Inductor;
            let l_label = if is_flyback {
                "Primary inductance Lp"
            } else if is_inductor {
                "Inductance as wound"
            } else {
                "Magnetising inductance"
            };
            let t = &r.thermal;
            let thermal_note = if t.runaway {
                format!(
                    "Thermal runaway: no equilibrium below the Curie limit after {} iterations.",
                    t.iterations
                )
            } else {
                let first = t.history.first().copied().unwrap_or(t.temperature);
                format!(
                    "Thermal equilibrium after {} iterations ({:.1} → {:.1} °C), losses taken at {}.",
                    t.iterations,
                    first,
                    t.temperature,
                    corner_name(Some(r.loss_corner)).trim_start_matches("at ")
                )
            };
            let fit = &r.fit;
            let b_pk = worst("b_peak");
            view! {
                <p class="verdict-line" class:fail=!r.pass data-testid="verdict" data-pass=r.pass.to_string()>
                    {head}<span class="sub">{sub}</span>
                </p>
                <Cautions cautions=r.cautions.clone() />
                <table class="figures checks" data-testid="checks">
                    <thead><tr><th scope="col">"Check"</th><th scope="col">"Value"</th><th scope="col">"Limit"</th><th scope="col">"Margin"</th><th scope="col">"Worst"</th></tr></thead>
                    <tbody>{checks}</tbody>
                </table>
                <p class="turns-line" data-testid="turns">{turns}</p>
                <div class="tiles" data-testid="key-figures">
                    {(!is_inductor).then(|| tile("ratio", "Turns ratio Np/Ns1", format!("{:.4}", r.turns_ratio), r.turns_ratio, String::new()))}
                    {mode_tile(&r)}
                    {tile("inductance", l_label, notation::format(r.inductance, "H", 3), r.inductance, format!("AL {} /turn²", notation::format(r.al, "H", 3)))}
                    {r.leakage.map(|l| tile("leakage", "Leakage (primary)", notation::format(l, "H", 3), l, format!("{:.2} % of L", 100.0 * l / r.inductance.max(1e-30))))}
                    {tile("gap", "Gap", r.gap.as_ref().map_or("none".to_string(), |g| format!("{:.3} mm", g.gap * 1e3)), r.gap.as_ref().map_or(0.0, |g| g.gap), gap_place(&r))}
                    {tile("b-peak", "Bpk over Ae", b_pk.map_or(String::new(), |(b, _)| format!("{:.0} mT", b * 1e3)), b_pk.map_or(0.0, |x| x.0), b_pk.map_or(String::new(), |(_, c)| corner_name(Some(c)).to_string()))}
                    {tile("core-loss", "Core loss", notation::format(r.losses.core, "W", 3), r.losses.core, String::new())}
                    {tile("cu-loss", "Copper loss", notation::format(r.losses.copper, "W", 3), r.losses.copper, format!("DC {} + AC {}", notation::format(r.losses.copper_dc, "W", 2), notation::format(r.losses.copper_ac_extra, "W", 2)))}
                    {tile("total-loss", "Total loss", notation::format(r.losses.total, "W", 3), r.losses.total, corner_name(Some(r.loss_corner)).to_string())}
                    {tile("efficiency", "Efficiency of the magnetic", format!("{:.2} %", r.power.magnetic_efficiency * 100.0), r.power.magnetic_efficiency * 100.0, String::new())}
                    {tile("temperature", "Core temperature", format!("{:.1} °C", t.temperature), t.temperature, format!("rise {:.1} K", t.rise))}
                    {tile("fill", "Window build / copper fill", format!("{:.0} % / {:.0} %", fit.build_fraction * 100.0, fit.fill_factor * 100.0), fit.fill_factor, format!("{} of {}", mm(fit.total_build), mm(fit.available_build)))}
                    {sw_v.map(|(v, c)| tile("switch-voltage", "Switch off-state voltage", notation::format(v, "V", 3), v, format!("flat top, {}", corner_name(Some(c)))))}
                    {sw_i.map(|(i, c)| tile("switch-peak", "Switch peak current", notation::format(i, "A", 3), i, corner_name(Some(c)).to_string()))}
                    {clamp_tiles(&r)}
                </div>
                <p class="core-note" data-testid="turns-reason">{format!("Turns: {}.", r.turns_reason)}</p>
                <p class="thermal-note" data-testid="thermal-note">{thermal_note}</p>
                {r.choke.as_deref().map(choke_section)}
                <Warnings warnings=r.warnings.clone() />
            }
            .into_any()
        }
    };
    view! {
        <style>{CSS}</style>
        <div class="results-body">{body}</div>
    }
}

/// The leakage spike under its clamp and the clamp's loss (a converter
/// loss, apart from the magnetic's): `report.clamp`.
fn clamp_tiles(r: &Report) -> Option<impl IntoView> {
    use magwright_engine::design::clamp::ClampKind;
    let c = r.clamp.as_ref()?;
    let at_v = c.corners.iter().find(|p| p.corner == c.voltage_corner)?;
    let at_p = c.corners.iter().find(|p| p.corner == c.dissipation_corner)?;
    let v_sub = match c.kind {
        ClampKind::Dissipative => format!(
            "Vin + Vc, Vc {}{}, {}",
            notation::format(at_v.clamp_voltage, "V", 3),
            if c.default_voltage { " (1.5·Vr)" } else { "" },
            corner_name(Some(c.voltage_corner))
        ),
        ClampKind::Rail => format!("clamped to the rail, {}", corner_name(Some(c.voltage_corner))),
    };
    let (p_label, p, p_sub) = match c.kind {
        ClampKind::Dissipative => (
            "Clamp dissipation (converter)",
            c.dissipation,
            format!("½·Llk·Ipk²·f·Vc/(Vc − Vr), {}", corner_name(Some(c.dissipation_corner))),
        ),
        ClampKind::Rail => (
            "Leakage energy returned",
            at_p.returned,
            format!("½·Llk·Ipk² per turn-off, {}", corner_name(Some(c.dissipation_corner))),
        ),
    };
    Some(view! {
        {tile("clamp-switch-peak", "Switch peak with the leakage clamp", notation::format(c.switch_peak_voltage, "V", 3), c.switch_peak_voltage, v_sub)}
        {tile("clamp-loss", p_label, notation::format(p, "W", 3), p, p_sub)}
    })
}

/// The output choke's design (forward, push-pull, bridges): its own
/// report's key figures and verdict.
fn choke_section(c: &Report) -> impl IntoView {
    let b_pk = c.waveforms.get("b_peak").map(|x| (x.value, x.corner));
    let wire = c.wires.first().map(|w| {
        if w.parallel > 1 {
            format!("{} × {}", w.parallel, w.conductor)
        } else {
            w.conductor.clone()
        }
    });
    let (head, sub) = verdict(c);
    view! {
        <section class="choke" data-testid="choke" data-pass=c.pass.to_string()>
            <h3>"Output choke (output 1)"</h3>
            <p class="verdict-line" class:fail=!c.pass data-testid="choke-verdict">{head}<span class="sub">{sub}</span></p>
            <div class="tiles">
                {tile("choke-core", "Core", c.core.designation.clone(), c.core.ae, c.material.name.clone())}
                {tile("choke-turns", "Turns N", c.turns.primary.to_string(), f64::from(c.turns.primary), wire.unwrap_or_default())}
                {tile("choke-inductance", "Inductance as wound", notation::format(c.inductance, "H", 3), c.inductance, format!("ripple at {}", notation::format(c.frequency, "Hz", 3)))}
                {tile("choke-gap", "Gap", c.gap.as_ref().map_or("none".to_string(), |g| format!("{:.3} mm", g.gap * 1e3)), c.gap.as_ref().map_or(0.0, |g| g.gap), gap_place(c))}
                {tile("choke-b-peak", "Bpk at peak current", b_pk.map_or(String::new(), |(b, _)| format!("{:.0} mT", b * 1e3)), b_pk.map_or(0.0, |x| x.0), b_pk.map_or(String::new(), |(_, k)| corner_name(Some(k)).to_string()))}
                {tile("choke-core-loss", "Core loss (ripple)", notation::format(c.losses.core, "W", 3), c.losses.core, String::new())}
                {tile("choke-cu-loss", "Copper loss", notation::format(c.losses.copper, "W", 3), c.losses.copper, format!("DC {} + AC {}", notation::format(c.losses.copper_dc, "W", 2), notation::format(c.losses.copper_ac_extra, "W", 2)))}
                {tile("choke-total-loss", "Total loss", notation::format(c.losses.total, "W", 3), c.losses.total, String::new())}
                {tile("choke-temperature", "Core temperature", format!("{:.1} °C", c.thermal.temperature), c.thermal.temperature, format!("rise {:.1} K", c.thermal.rise))}
            </div>
        </section>
    }
}

/// The safety cautions, in a box that cannot be missed.
#[component]
fn Cautions(cautions: Vec<String>) -> impl IntoView {
    let none = cautions.is_empty();
    view! {
        <div class="cautions" class:hidden=none data-testid="cautions" role="note" aria-label="Safety cautions">
            <strong>"Safety: hazardous voltages"</strong>
            <ul>{cautions.into_iter().map(|w| view! { <li>{w}</li> }).collect_view()}</ul>
        </div>
    }
}

/// The engine's warnings, after everything else.
#[component]
fn Warnings(warnings: Vec<String>) -> impl IntoView {
    view! {
        <ul class="warnings" data-testid="warnings">
            {warnings.into_iter().map(|w| view! { <li>{w}</li> }).collect_view()}
        </ul>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use magwright_engine::design::Design;

    #[test]
    fn failing_checks_come_first_then_tight() {
        let mut r = magwright_engine::design::evaluate(&Design::demo_forward()).expect("demo evaluates");
        if let Some(c) = r.checks.last_mut() {
            c.pass = false;
            c.margin = -0.1;
        }
        let o = ordered(&r.checks);
        assert!(!o[0].pass);
        let first_plain = o.iter().position(|c| c.pass && !c.tight).unwrap_or(o.len());
        assert!(o[first_plain..].iter().all(|c| c.pass && !c.tight));
        let (head, _) = verdict(&r);
        assert_eq!(head, "Fails 1 check");
    }

    /// The flyback's mode check and figures read as ripple ratios, not as
    /// percentages (the engine's report fields, shown as they are).
    #[test]
    fn mode_check_reads_as_a_ripple_ratio() {
        let r = magwright_engine::design::evaluate(&Design::demo_flyback()).expect("demo evaluates");
        let k = r.checks.iter().find(|k| k.key == "mode").expect("a mode check");
        let (v, l) = check_texts(k);
        assert_eq!(v, format!("r = {:.3}", k.value));
        assert_eq!(l, "boundary r = 2");
        assert_eq!(short_label(k), "Mode as wound");
        let c = r.conduction.as_ref().expect("flyback conduction");
        assert_eq!(mode_text(c.corners[0].mode), "CCM");
    }
}
