//! Reference checks: windings (see each test for its source).
//!
//! Every expected value is computed here, independently of the engine,
//! from the named source's equations (Dowell 1966; textbook Fourier series;
//! ASTM B258; the Kelvin-function solution via scipy; the field-energy
//! integral of the leakage field), never copied from the code under test.

use magwright_engine::core::{library, Core};
use magwright_engine::waveform::Pwl;
use magwright_engine::winding::dowell::{fr_dowell, fr_layer};
use magwright_engine::winding::kelvin::{kelvin, round_wire_skin_factor};
use magwright_engine::winding::leakage::{leakage, leakage_with_currents};
use magwright_engine::winding::loss::{LossModel, LossOptions, WindingCurrent};
use magwright_engine::winding::stackup::*;
use magwright_engine::winding::wire::awg_diameter;
use magwright_engine::winding::{Conductor, Grade};
use std::f64::consts::PI;
use std::process::Command;

const MU0: f64 = 4e-7 * PI; // SI definition before 2019; within 1e-9 of CODATA.

/// A core with round numbers (only the window fields matter here).
pub(crate) fn test_core() -> Core {
    let mut c = library::find("ETD 34").unwrap();
    c.winding_breadth = 20e-3;
    c.winding_height = 6e-3;
    c.turn_length_inner = 50e-3;
    c.window_area = 120e-6;
    c
}

/// IEC 60028: ρ(T) = (1/58)·10⁻⁶·(1 + 0.00393·(T − 20)) Ω·m.
fn rho(t: f64) -> f64 {
    1.0 / 58.0e6 * (1.0 + 0.00393 * (t - 20.0))
}

/// Skin depth δ = √(ρ/(π f μ0)).
fn delta_skin(t: f64, f: f64) -> f64 {
    (rho(t) / (PI * f * MU0)).sqrt()
}

/// Dowell (1966), written out here: ψ1, ψ2 and the per-layer factor
/// Fr = Δ[(m² + (m−1)²)ψ1 − 4m(m−1)ψ2] (methods.md, "Windings").
fn dowell_layer(d: f64, m: f64) -> f64 {
    if d > 50.0 {
        // cosh would overflow further out; ψ1 = 1, ψ2 = 0 to 1e−20 here.
        return d * (m * m + (m - 1.0) * (m - 1.0));
    }
    let den = (2.0 * d).cosh() - (2.0 * d).cos();
    let p1 = ((2.0 * d).sinh() + (2.0 * d).sin()) / den;
    let p2 = (d.sinh() * d.cos() + d.cosh() * d.sin()) / den;
    d * ((m * m + (m - 1.0) * (m - 1.0)) * p1 - 4.0 * m * (m - 1.0) * p2)
}

/// Dowell (1966) for m layers: Fr = Δ[ψ1 + (2(m²−1)/3)ψ3].
fn dowell_m(d: f64, m: f64) -> f64 {
    let p1 = ((2.0 * d).sinh() + (2.0 * d).sin()) / ((2.0 * d).cosh() - (2.0 * d).cos());
    let p3 = (d.sinh() - d.sin()) / (d.cosh() + d.cos());
    d * (p1 + 2.0 * (m * m - 1.0) / 3.0 * p3)
}

pub(crate) fn section(winding: &str, turns: u32, c: Conductor, parallel: u32, tpl: Option<u32>) -> Item {
    Item::Section(Section {
        winding: winding.into(),
        turns,
        conductor: c,
        parallel,
        layers: None,
        turns_per_layer: tpl,
        direction: Direction::Clockwise,
        start: Side::Left,
        finish: Side::Right,
        margin_left: 0.0,
        margin_right: 0.0,
        interlayer: None,
    })
}

pub(crate) fn defs(names: &[&str]) -> Vec<WindingDef> {
    names.iter().map(|n| WindingDef { name: n.to_string() }).collect()
}

/// Symmetric triangle of peak `a`, period `t`, zero mean.
fn triangle(t: f64, a: f64) -> Pwl {
    Pwl::new(t, vec![(0.0, -a), (0.5 * t, a), (t, -a)]).unwrap()
}

/// RMS of harmonic n of that triangle: 8a/(π²n²)/√2 for odd n, 0 for even
/// (textbook series, e.g. Kreyszig, Advanced Engineering Mathematics).
fn triangle_harmonic_rms(a: f64, n: u32) -> f64 {
    if n % 2 == 0 {
        0.0
    } else {
        8.0 * a / (PI * PI * (n * n) as f64) / 2f64.sqrt()
    }
}

/// One layer of the test's own model: DC resistance, Δ at 1 Hz (Δ ∝ √f),
/// and the in-phase MMF at its two faces per ampere.
struct TLayer {
    rdc: f64,
    delta_1hz: f64,
    fa: f64,
    fb: f64,
}

/// Σ_layers Rdc·Σ_n Fr_layer(Δ₁√(n f), m)·I_n² with m = Fb/(Fb − Fa), for
/// the triangle current `a` at frequency `f` (all windings in phase).
fn expected_triangle_loss(layers: &[TLayer], f: f64, a: f64) -> f64 {
    let mut p = 0.0;
    for l in layers {
        let m = l.fb / (l.fb - l.fa);
        let mut s = 0.0;
        for n in (1..20001u32).step_by(2) {
            let i = triangle_harmonic_rms(a, n);
            s += dowell_layer(l.delta_1hz * (n as f64 * f).sqrt(), m) * i * i;
        }
        p += l.rdc * s;
    }
    p
}

// ----------------------------------------------------------- Kelvin ------

/// The exact skin effect of one isolated round wire (Kelvin functions ber,
/// bei, ber′, bei′; Ramo, Whinnery & Van Duzer) against scipy.special,
/// which also computes the same Rac/Rdc by the complex-Bessel route
/// (kr/2)·J0(kr)/J1(kr). Brief: within 2 % over 0.1 < d/δ < 10; the
/// Kelvin values themselves to 1e−9. FAILS if python3 or scipy is absent.
#[test]
fn skin_effect_round_wire_vs_scipy() {
    let script = concat!(env!("CARGO_MANIFEST_DIR"), "/reference/kelvin_reference.py");
    let out = Command::new("python3")
        .arg(script)
        .output()
        .unwrap_or_else(|e| panic!("python3 is needed for this reference test and could not run: {e}"));
    assert!(
        out.status.success(),
        "the scipy reference script failed (is scipy installed?): {}",
        String::from_utf8_lossy(&out.stderr)
    );
    let text = String::from_utf8(out.stdout).unwrap();
    let mut lines = 0;
    for line in text.lines() {
        let v: Vec<f64> = line.split_whitespace().map(|x| x.parse().unwrap()).collect();
        assert_eq!(v.len(), 7, "{line}");
        let (a, ber, bei, berp, beip, fr_k, fr_b) = (v[0], v[1], v[2], v[3], v[4], v[5], v[6]);
        assert!(
            (fr_k - fr_b).abs() < 1e-9 * fr_b,
            "scipy's two routes disagree at d/δ = {a}"
        );
        let x = a / 2f64.sqrt();
        let (b, i, bp, ip) = kelvin(x);
        let close = |u: f64, w: f64| (u - w).abs() <= 1e-9 * w.abs().max(1e-3);
        assert!(
            close(b, ber) && close(i, bei) && close(bp, berp) && close(ip, beip),
            "Kelvin functions at x = {x}"
        );
        let fr = round_wire_skin_factor(a * 1e-3, 1e-3);
        assert!((fr - fr_b).abs() < 0.02 * fr_b, "d/δ = {a}: {fr} vs scipy {fr_b}");
        assert!(
            (fr - fr_b).abs() < 1e-8 * fr_b,
            "d/δ = {a}: {fr} vs scipy {fr_b} (tight)"
        );
        lines += 1;
    }
    assert!(lines >= 40, "the reference script printed only {lines} values");
}

// ----------------------------------------------------------- Dowell ------

/// Dowell's limits: Fr → 1 as Δ → 0 (and the low-frequency expansion
/// 1 + (5m² − 1)Δ⁴/45, from ψ1 ≈ 1/Δ + 4Δ³/45 and ψ3 ≈ Δ³/6 in Dowell's
/// formula); one layer: Fr → Δ for large Δ (ψ1 → 1, the foil carries its
/// current in one skin depth).
#[test]
fn dowell_limits() {
    for m in 1..=10 {
        let m = m as f64;
        assert!((fr_dowell(1e-4, m) - 1.0).abs() < 1e-12);
        let d: f64 = 0.05;
        let lf = 1.0 + (5.0 * m * m - 1.0) * d.powi(4) / 45.0;
        assert!((fr_dowell(d, m) - lf).abs() < 1e-9, "m={m}");
    }
    for d in [8.0, 15.0, 30.0, 400.0] {
        let fr = fr_dowell(d, 1.0);
        assert!((fr / d - 1.0).abs() < 1e-3, "Δ={d}: {fr}");
    }
}

/// Fr at chosen (Δ, m) against Dowell's closed form written out in this
/// test, and the per-layer factor against the per-layer formula.
#[test]
fn dowell_closed_form_points() {
    for (d, m) in [(0.5, 1.0), (1.0, 2.0), (1.5, 3.0), (2.0, 5.0), (3.7, 7.0), (0.8, 2.5)] {
        let want = dowell_m(d, m);
        let got = fr_dowell(d, m);
        assert!((got - want).abs() < 1e-9 * want, "Δ={d} m={m}: {got} vs {want}");
        let wl = dowell_layer(d, m);
        assert!((fr_layer(d, m) - wl).abs() < 1e-9 * wl.abs().max(1.0));
    }
}

// ---------------------------------------------------------- Fourier ------

/// Textbook Fourier series (Kreyszig): square ±A → b_n = 4A/(πn) for odd
/// n; rectangular pulse train of height A, duty D → c_n = (A/(πn))·
/// sin(πnD)·e^(−jπnD).
#[test]
fn fourier_textbook_series() {
    let t = 1e-5;
    let sq = Pwl::new(t, vec![(0.0, 3.0), (0.5 * t, 3.0), (0.5 * t, -3.0), (t, -3.0)]).unwrap();
    for n in 1..40u32 {
        let (re, im) = sq.fourier_coefficient(n);
        // y = Σ b_n sin(nωt) ⇒ c_n = −j·b_n/2.
        let b = if n % 2 == 1 { 4.0 * 3.0 / (PI * n as f64) } else { 0.0 };
        assert!(re.abs() < 1e-12 && (im + b / 2.0).abs() < 1e-12, "square n={n}");
    }
    let (a, d) = (2.0, 0.3);
    let pulse = Pwl::new(t, vec![(0.0, a), (d * t, a), (d * t, 0.0), (t, 0.0)]).unwrap();
    let mut spec = pulse.spectrum(0.0);
    for n in 1..60u32 {
        let x = PI * n as f64 * d;
        let mag = a / (PI * n as f64) * x.sin();
        let (wr, wi) = (mag * x.cos(), -mag * x.sin());
        let (re, im) = pulse.fourier_coefficient(n);
        assert!((re - wr).abs() < 1e-12 && (im - wi).abs() < 1e-12, "pulse n={n}");
        let (sr, si) = spec.next().unwrap();
        assert!(
            (sr - wr).abs() < 1e-11 && (si - wi).abs() < 1e-11,
            "pulse spectrum n={n}"
        );
    }
    let tri = triangle(t, 1.5);
    for n in 1..30u32 {
        assert!(
            (tri.harmonic_rms(n) - triangle_harmonic_rms(1.5, n)).abs() < 1e-12,
            "triangle n={n}"
        );
    }
}

/// Parseval: mean² + Σ I_n,rms² = I_rms² (the RMS from the time waveform).
/// With steps the remainder after N harmonics is at most S²/(2π²N), S the
/// sum of |steps| (|c_n| ≤ S/(2πn) + O(n⁻²)); Bessel's inequality keeps
/// the partial sum below.
#[test]
fn parseval_stepped_waveform() {
    let t = 2e-6;
    let w = Pwl::new(
        t,
        vec![
            (0.0, 0.0),
            (0.0, 1.2),
            (0.35 * t, 1.9),
            (0.35 * t, -0.4),
            (0.5 * t, -0.2),
            (0.5 * t, 0.0),
            (t, 0.0),
        ],
    )
    .unwrap();
    let n_max = 200_000usize;
    let mut sum = w.mean().powi(2);
    for (re, im) in w.spectrum(0.0).take(n_max) {
        sum += 2.0 * (re * re + im * im);
    }
    let s: f64 = 1.2 + 2.3 + 0.2 + 0.0;
    let bound = s * s / (2.0 * PI * PI * n_max as f64) * 1.01;
    let rms2 = w.rms().powi(2);
    assert!(sum <= rms2 * (1.0 + 1e-9), "{sum} > {rms2}");
    assert!(rms2 - sum <= bound, "{} > {bound}", rms2 - sum);
}

/// Parseval through the loss model: at 1 Hz every Fr is 1, so the copper
/// loss of any current is Rdc·I²rms; the harmonic sum plus the analytic
/// tail must reproduce it (a stepped current, whose terms fall as n⁻²).
#[test]
fn loss_at_low_frequency_is_rdc_irms2() {
    let core = test_core();
    let st = StackUp {
        windings: defs(&["a"]),
        items: vec![section("a", 30, Conductor::awg(24, Grade::G2).unwrap(), 1, None)],
    };
    let w = Pwl::new(1.0, vec![(0.0, 0.0), (0.0, 2.0), (0.3, 3.0), (0.3, 0.5), (1.0, 0.5)]).unwrap();
    let m = LossModel::new(&core, &st, 60.0).unwrap();
    let r = m
        .evaluate(&[WindingCurrent::new("a", w.clone())], &LossOptions::default())
        .unwrap();
    let want = m.rdc()[0] * w.rms().powi(2);
    assert!(
        (r.total - want).abs() < 1e-3 * want,
        "{} vs {want}; N {} tail {}",
        r.total,
        r.harmonics,
        r.tail_share
    );
    assert!(r.converged);
}

// ------------------------------------------------------ conductors -------

/// ASTM B258 tabulated diameters (inches, 4 decimals, from memory) and the
/// skin depth of copper at 100 °C, 100 kHz computed from its definition.
#[test]
fn awg_and_skin_depth() {
    for (n, inches) in [(12, 0.0808), (16, 0.0508), (26, 0.0159), (28, 0.0126), (32, 0.0080)] {
        let d = awg_diameter(n).unwrap() / 25.4e-3;
        assert!((d - inches).abs() <= 0.00005 + 1e-12, "AWG {n}: {d}");
    }
    let rho100 = magwright_engine::winding::wire::copper_resistivity(100.0).unwrap();
    assert!((rho100 - rho(100.0)).abs() < 1e-15);
    let d = magwright_engine::winding::skin_depth(rho100, 100e3).unwrap();
    assert!((d - delta_skin(100.0, 100e3)).abs() < 1e-9 * d);
    // By hand: √(2.26621e-8 / (π·1e5·4π·1e-7)) = 0.23959 mm.
    assert!((d - 0.23959e-3).abs() < 0.0001e-3, "{d}");
}

// ---------------------------------------------------- loss, end to end ---

/// M foil layers of one winding carrying a triangle: the loss must be
/// Σ_layers Rdc,k·Σ_n Fr_layer(Δ√n, m = k)·I_n² (Dowell 1966 per layer,
/// MMF zero at the bobbin; textbook triangle harmonics), with Rdc,k =
/// ρ·MLT_k/(t·w) and MLT_k = MLT₀ + 2π·(height of layer k's centre).
#[test]
fn foil_winding_triangle_vs_dowell() {
    let core = test_core();
    let (t, w) = (0.2e-3, 18e-3);
    let turns = 5;
    let temp = 80.0;
    let st = StackUp {
        windings: defs(&["p"]),
        items: vec![section("p", turns, Conductor::foil(t, w).unwrap(), 1, None)],
    };
    let f = 100e3;
    let a = 4.0;
    let cur = [WindingCurrent::new("p", triangle(1.0 / f, a))];
    let r = LossModel::new(&core, &st, temp)
        .unwrap()
        .evaluate(&cur, &LossOptions::default())
        .unwrap();
    let d1 = t / delta_skin(temp, 1.0);
    let layers: Vec<TLayer> = (0..turns)
        .map(|k| {
            let mlt = 50e-3 + 2.0 * PI * (k as f64 * t + 0.5 * t);
            TLayer {
                rdc: rho(temp) * mlt / (t * w),
                delta_1hz: d1,
                fa: k as f64,
                fb: k as f64 + 1.0,
            }
        })
        .collect();
    let want = expected_triangle_loss(&layers, f, a);
    assert!((r.total - want).abs() < 2e-3 * want, "{} vs {want}", r.total);
    // Check against Dowell's M-layer formula at the fundamental too: the
    // harmonic-weighted factor must exceed it (harmonics see larger Δ).
    assert!(r.windings[0].fr > dowell_m(d1 * f.sqrt(), turns as f64) * 0.999);
    let rdc: f64 = layers.iter().map(|l| l.rdc).sum();
    assert!((r.windings[0].rdc - rdc).abs() < 1e-12 * rdc);
}

/// Interleaving: P-S-P with the primary split 2 + 2 foil layers around a
/// 4-layer secondary (1:1, in anti-phase). Every layer's m is computed
/// here from the MMF at its faces; the primary's factor is Dowell's for
/// m = 2 per half (interleaving halves the effective layer count) and is
/// lower than in the P-S order, where it is Dowell's for m = 4.
#[test]
fn interleaved_psp_vs_per_layer_dowell() {
    let core = test_core();
    let (t, w) = (0.1e-3, 18e-3);
    let foil = || Conductor::foil(t, w).unwrap();
    let temp = 100.0;
    let f = 200e3;
    let a = 3.0;
    let tape = 50e-6;
    let tp = || {
        Item::Tape(Tape {
            material: "polyester film".into(),
            thickness: tape,
            wraps: 1,
        })
    };
    let psp = StackUp {
        windings: defs(&["p", "s"]),
        items: vec![
            section("p", 2, foil(), 1, None),
            tp(),
            section("s", 4, foil(), 1, None),
            tp(),
            section("p", 2, foil(), 1, None),
        ],
    };
    let ps = StackUp {
        windings: defs(&["p", "s"]),
        items: vec![section("p", 4, foil(), 1, None), tp(), section("s", 4, foil(), 1, None)],
    };
    let cur = [
        WindingCurrent::new("p", triangle(1.0 / f, a)),
        WindingCurrent::new("s", triangle(1.0 / f, -a)),
    ];
    let d1 = t / delta_skin(temp, 1.0);
    // Test's own layer list: (winding sign, height of inner face).
    let build = |order: &[(f64, usize)]| {
        let mut layers = Vec::new();
        let mut h = 0.0;
        let mut fmm = 0.0;
        for (k, &(sign, n)) in order.iter().enumerate() {
            if k > 0 {
                h += tape;
            }
            for _ in 0..n {
                let mlt = 50e-3 + 2.0 * PI * (h + 0.5 * t);
                layers.push(TLayer {
                    rdc: rho(temp) * mlt / (t * w),
                    delta_1hz: d1,
                    fa: fmm,
                    fb: fmm + sign,
                });
                fmm += sign;
                h += t;
            }
        }
        layers
    };
    let l_psp = build(&[(1.0, 2), (-1.0, 4), (1.0, 2)]);
    let l_ps = build(&[(1.0, 4), (-1.0, 4)]);
    for (st, tl) in [(&psp, &l_psp), (&ps, &l_ps)] {
        let r = LossModel::new(&core, st, temp)
            .unwrap()
            .evaluate(&cur, &LossOptions::default())
            .unwrap();
        let want = expected_triangle_loss(tl, f, a);
        assert!((r.total - want).abs() < 2e-3 * want, "{} vs {want}", r.total);
    }
    let r_psp = LossModel::new(&core, &psp, temp)
        .unwrap()
        .evaluate(&cur, &LossOptions::default())
        .unwrap();
    let r_ps = LossModel::new(&core, &ps, temp)
        .unwrap()
        .evaluate(&cur, &LossOptions::default())
        .unwrap();
    assert!(r_psp.windings[0].fr < r_ps.windings[0].fr);
    // At one frequency (a single harmonic's Δ) the P-S-P primary's layers
    // average to Dowell m = 2, the P-S primary's to m = 4.
    let d = 1.7;
    let avg_psp = (dowell_layer(d, 1.0) + dowell_layer(d, 2.0) + dowell_layer(d, -1.0) + dowell_layer(d, 0.0)) / 4.0;
    assert!((avg_psp - dowell_m(d, 2.0)).abs() < 1e-9);
}

/// Round wire as Dowell's equivalent foil: a = (√π/2)·d, porosity
/// η = n·a/b (Dowell 1966), Δ = (a/δ)·√η; three full layers of one
/// winding → per-layer m = 1, 2, 3.
#[test]
fn round_wire_layers_vs_dowell_equivalent_foil() {
    let core = test_core();
    let c = Conductor::awg(22, Grade::G2).unwrap();
    let (d, od) = match &c {
        Conductor::Round(w) => (w.bare_diameter, w.overall_diameter),
        _ => unreachable!(),
    };
    let tpl = 25;
    let temp = 40.0;
    let st = StackUp {
        windings: defs(&["p"]),
        items: vec![section("p", 3 * tpl, c.clone(), 1, Some(tpl))],
    };
    let f = 150e3;
    let a = 1.0;
    let r = LossModel::new(&core, &st, temp)
        .unwrap()
        .evaluate(
            &[WindingCurrent::new("p", triangle(1.0 / f, a))],
            &LossOptions::default(),
        )
        .unwrap();
    let sq = 0.5 * PI.sqrt() * d;
    let eta = tpl as f64 * sq / 20e-3;
    let d1 = sq * eta.sqrt() / delta_skin(temp, 1.0);
    let area = PI * d * d / 4.0;
    let layers: Vec<TLayer> = (0..3)
        .map(|k| {
            let mlt = 50e-3 + 2.0 * PI * (k as f64 * od + 0.5 * od);
            TLayer {
                rdc: rho(temp) * mlt * tpl as f64 / area,
                delta_1hz: d1,
                fa: (k * tpl) as f64,
                fb: ((k + 1) * tpl) as f64,
            }
        })
        .collect();
    let want = expected_triangle_loss(&layers, f, a);
    assert!((r.total - want).abs() < 2e-3 * want, "{} vs {want}", r.total);
}

/// Litz by Dowell's model with the strands as layers (the stated method):
/// 2 layers of 49-strand litz = 2 × 7 strand layers of 7 strands per bundle,
/// per-strand-layer m = 1..14, strand porosity η = (strands across)·a/b.
#[test]
fn litz_strand_layers_vs_dowell() {
    let core = test_core();
    let ds = 0.1e-3;
    let c = Conductor::litz(49, ds, Grade::G1, 0.75, 0.03e-3).unwrap();
    let od = c.outer_height();
    let tpl = 10;
    let temp = 25.0;
    let st = StackUp {
        windings: defs(&["p"]),
        items: vec![section("p", 2 * tpl, c, 1, Some(tpl))],
    };
    let f = 300e3;
    let a = 2.0;
    let r = LossModel::new(&core, &st, temp)
        .unwrap()
        .evaluate(
            &[WindingCurrent::new("p", triangle(1.0 / f, a))],
            &LossOptions::default(),
        )
        .unwrap();
    let sq = 0.5 * PI.sqrt() * ds;
    let eta = (tpl * 7) as f64 * sq / 20e-3;
    let d1 = sq * eta.sqrt() / delta_skin(temp, 1.0);
    let area_layer = tpl as f64 * 49.0 * PI * ds * ds / 4.0;
    let mut layers = Vec::new();
    for k in 0..2 {
        let mlt = 50e-3 + 2.0 * PI * (k as f64 * od + 0.5 * od);
        // Each strand layer: 1/7 of the layer's copper, 1/7 of its MMF step.
        for j in 0..7 {
            let step = tpl as f64 / 7.0;
            let fa = (k * tpl) as f64 + j as f64 * step;
            layers.push(TLayer {
                rdc: rho(temp) * mlt * step * step / (area_layer / 7.0),
                delta_1hz: d1,
                fa,
                fb: fa + step,
            });
        }
    }
    let want = expected_triangle_loss(&layers, f, a);
    assert!((r.total - want).abs() < 2e-3 * want, "{} vs {want}", r.total);
}

// ---------------------------------------------------------- leakage ------

/// Leakage of P-S and P-S-P against an independent numerical integral of
/// the field energy W = ∫ (μ0/2)·H²·dV with H = F(x)/b_w across the window
/// (F built here from the layer positions; 200 000-point midpoint rule),
/// and the P-S case against McLyman's closed form
/// L = μ0·N²·MLT/b_w·(gap + (h_p + h_s)/3) with MLT at mid-build.
#[test]
fn leakage_vs_energy_integral() {
    let core = test_core();
    let wp = Conductor::awg(26, Grade::G2).unwrap();
    let ws = Conductor::awg(20, Grade::G2).unwrap();
    let (odp, ods) = (wp.outer_height(), ws.outer_height());
    let gap = 3.0 * 50e-6;
    let tape = || {
        Item::Tape(Tape {
            material: "polyester film".into(),
            thickness: 50e-6,
            wraps: 3,
        })
    };
    let (np, ns, tpl_p, tpl_s) = (60u32, 15u32, 30u32, 15u32);
    let ps = StackUp {
        windings: defs(&["p", "s"]),
        items: vec![
            section("p", np, wp.clone(), 1, Some(tpl_p)),
            tape(),
            section("s", ns, ws.clone(), 1, Some(tpl_s)),
        ],
    };
    let psp = StackUp {
        windings: defs(&["p", "s"]),
        items: vec![
            section("p", np / 2, wp.clone(), 1, Some(tpl_p)),
            tape(),
            section("s", ns, ws.clone(), 1, Some(tpl_s)),
            tape(),
            section("p", np / 2, wp.clone(), 1, Some(tpl_p)),
        ],
    };
    // Independent profile: list of (height, dF per unit height) blocks.
    let integral = |blocks: &[(f64, f64)]| {
        let total: f64 = blocks.iter().map(|b| b.0).sum();
        let n = 200_000;
        let dx = total / n as f64;
        let mut w = 0.0;
        for i in 0..n {
            let x = (i as f64 + 0.5) * dx;
            // F(x): integrate the blocks up to x.
            let (mut y, mut f) = (0.0, 0.0);
            for &(h, slope) in blocks {
                let take = (x - y).clamp(0.0, h);
                f += slope * take;
                y += h;
            }
            let hfield = f / 20e-3;
            let mlt = 50e-3 + 2.0 * PI * x;
            w += 0.5 * MU0 * hfield * hfield * 20e-3 * mlt * dx;
        }
        2.0 * w // L = 2W/I², I = 1 A in the primary
    };
    // Primary +1 A, secondary −np/ns A: ampere-turns balance.
    let is = np as f64 / ns as f64;
    let blocks_ps = [
        (odp, tpl_p as f64 / odp),
        (odp, tpl_p as f64 / odp),
        (gap, 0.0),
        (ods, -(tpl_s as f64) * is / ods),
    ];
    let blocks_psp = [
        (odp, tpl_p as f64 / odp),
        (gap, 0.0),
        (ods, -(tpl_s as f64) * is / ods),
        (gap, 0.0),
        (odp, tpl_p as f64 / odp),
    ];
    let l_ps = leakage(&core, &ps, "p").unwrap();
    let l_psp = leakage(&core, &psp, "p").unwrap();
    let want_ps = integral(&blocks_ps);
    let want_psp = integral(&blocks_psp);
    assert!((l_ps - want_ps).abs() < 1e-4 * want_ps, "{l_ps} vs {want_ps}");
    assert!((l_psp - want_psp).abs() < 1e-4 * want_psp, "{l_psp} vs {want_psp}");
    // The same with explicit currents.
    let l2 = leakage_with_currents(&core, &ps, "p", &[("p".into(), 2.0), ("s".into(), -2.0 * is)]).unwrap();
    assert!((l2 - want_ps).abs() < 1e-4 * want_ps);
    // McLyman's closed form with MLT at the middle of the build.
    let hp = 2.0 * odp;
    let hs = ods;
    let mlt_mid = 50e-3 + 2.0 * PI * 0.5 * (hp + gap + hs);
    let mcl = MU0 * (np * np) as f64 * mlt_mid / 20e-3 * (gap + (hp + hs) / 3.0);
    assert!((l_ps - mcl).abs() < 0.03 * mcl, "{l_ps} vs McLyman {mcl}");
    // Interleaving cuts leakage (a factor near 4 for P-S-P).
    assert!(l_psp < 0.4 * l_ps, "{l_psp} vs {l_ps}");
}

/// Ideal steps: a ±A square current in 4 foil layers. The engine's
/// explicit sum + analytic tail against this test's own sum of Dowell's
/// per-layer loss over 400 000 harmonics (square wave: I_n = 4A/(πn√2),
/// odd n), closed beyond by Dowell's large-Δ limit Fr_layer → Δ·(m² +
/// (m−1)²) summed as ∫ (Σ over odd n ≈ ½∫dn).
#[test]
fn square_current_tail_vs_long_sum() {
    let core = test_core();
    let (t, w) = (0.15e-3, 18e-3);
    let temp = 100.0;
    let turns = 4;
    let st = StackUp {
        windings: defs(&["p"]),
        items: vec![section("p", turns, Conductor::foil(t, w).unwrap(), 1, None)],
    };
    let f = 50e3;
    let a = 2.0;
    let p = 1.0 / f;
    let sq = Pwl::new(p, vec![(0.0, a), (0.5 * p, a), (0.5 * p, -a), (p, -a)]).unwrap();
    let r = LossModel::new(&core, &st, temp)
        .unwrap()
        .evaluate(&[WindingCurrent::new("p", sq)], &LossOptions::default())
        .unwrap();
    let d1 = t / delta_skin(temp, 1.0) * f.sqrt();
    let n_max = 400_001u32;
    let mut want = 0.0;
    for k in 0..turns {
        let mlt = 50e-3 + 2.0 * PI * (k as f64 * t + 0.5 * t);
        let rdc = rho(temp) * mlt / (t * w);
        let m = k as f64 + 1.0;
        let mut s = 0.0;
        for n in (1..=n_max).step_by(2) {
            let i = 4.0 * a / (PI * n as f64) / 2f64.sqrt();
            s += dowell_layer(d1 * (n as f64).sqrt(), m) * i * i;
        }
        // Remainder: Σ_{odd n > N} Δ1·√n·(m²+(m−1)²)·8a²/(π²n²)
        //          ≈ ½·∫_{N+1}^∞ … dn = Δ1(m²+(m−1)²)·8a²/π²·(1/√(N+1)).
        s += d1 * (m * m + (m - 1.0) * (m - 1.0)) * 8.0 * a * a / (PI * PI) / ((n_max + 1) as f64).sqrt();
        want += rdc * s;
    }
    assert!(
        (r.total - want).abs() < 2e-3 * want,
        "{} vs {want} (N {}, tail {})",
        r.total,
        r.harmonics,
        r.tail_share
    );
    assert!(
        r.tail_share > 0.01,
        "the tail should matter for ideal steps: {}",
        r.tail_share
    );
    assert!(r.harmonics <= 256, "{}", r.harmonics);
}
