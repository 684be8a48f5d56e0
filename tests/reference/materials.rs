//! Reference checks: materials, core loss and gapped cores (see each test
//! for its source).
//!
//! Values marked "scipy" were computed with scipy 1.17.1 by this script
//! (kept here so anyone can re-run it):
//!
//! ```python
//! import math
//! from scipy.special import gamma
//! from scipy.integrate import quad
//! from scipy.optimize import brentq
//! # ∫|cos|^a over a period, numerically, and ki (Venkatachalam et al. 2002)
//! I = quad(lambda t: abs(math.cos(t))**a, 0, 2*math.pi, points=[math.pi/2, 3*math.pi/2],
//!          epsabs=1e-14, epsrel=1e-14)[0]
//! ki = k / ((2*math.pi)**(a-1) * 2**(b-a) * I)
//! closed = 2*math.sqrt(math.pi)*gamma((a+1)/2)/gamma(a/2+1)
//! # gap with McLyman's fringing, solved by Brent's method
//! mu0 = 4e-7*math.pi; ae, le, G, mu = 60e-6, 67e-3, 19.5e-3, 2300.0
//! al = lambda g: (1 + g/math.sqrt(ae)*math.log(2*G/g)) * mu0*ae/(g + le/mu)
//! gap = brentq(lambda g: al(g) - target, 1e-9, G*0.999, xtol=1e-16, rtol=1e-15)
//! ```

use magwright_engine::gap::{self, GapCore, GapPlacement, MU_0};
use magwright_engine::loss::{self, cos_power_integral, IgseCoefficients};
use magwright_engine::material::fit::{fit, LossPoint};
use magwright_engine::material::library;
use magwright_engine::material::TempFactor;
use magwright_engine::waveform::Pwl;
use std::f64::consts::PI;

/// ∫₀^2π |cos θ|^α dθ = 2√π·Γ((α+1)/2)/Γ(α/2 + 1) (Wallis/Beta-function
/// closed form, e.g. Abramowitz & Stegun 6.2.1–6.2.2), values by scipy.
#[test]
fn cos_integral_against_scipy_gamma() {
    let table = [
        (1.0, 4.0),
        (1.25, 3.7234962278984614),
        (1.5, 3.4960767390561602),
        (1.75, 3.304977079372722),
        (2.0, 3.1415926535897927),
        (2.25, 2.9998975503375513),
        (2.5, 2.8755365633654204),
        (3.0, 2.6666666666666665),
    ];
    for (a, closed) in table {
        let got = cos_power_integral(a);
        assert!((got / closed - 1.0).abs() < 1e-13, "α = {a}: {got} vs {closed}");
    }
}

/// ki of four library grades against scipy (quad for the integral,
/// Venkatachalam et al. 2002 for the formula).
#[test]
fn ki_against_scipy_quad() {
    for (name, ki_scipy) in [
        ("MnZn-200k", 0.6367959498433341),
        ("MnZn-500k", 0.00522859801577472),
        ("MnZn-1M", 5.731591682507563e-05),
        ("NiZn-5M", 0.013639843460216107),
    ] {
        let m = library::find(name).unwrap();
        let ki = loss::ki(&m.steinmetz).unwrap();
        assert!((ki / ki_scipy - 1.0).abs() < 1e-10, "{name}: {ki} vs {ki_scipy}");
    }
}

fn sine(f: f64, b_pk: f64, n: usize) -> Pwl {
    let t = 1.0 / f;
    let pts = (0..=n).map(|i| (i as f64 / n as f64 * t, b_pk * (2.0 * PI * i as f64 / n as f64).sin())).collect();
    Pwl::new(t, pts).unwrap()
}

/// Venkatachalam et al. 2002: the iGSE reduces to the Steinmetz equation
/// for a sinusoid. A sinusoid of 360 linear segments, every library grade,
/// mid-range f and B: within 0.5 %.
#[test]
fn igse_of_sinusoid_equals_steinmetz_for_every_grade() {
    for m in library::materials() {
        let s = &m.steinmetz;
        let f = (s.f_min * s.f_max).sqrt();
        let b = 0.5 * (s.b_min + s.b_max);
        let c = IgseCoefficients::from_material(&m).unwrap();
        let got = c.pv(&sine(f, b, 360)).unwrap();
        let want = loss::steinmetz(s, f, b).unwrap();
        assert!((got / want - 1.0).abs() < 0.005, "{}: {got} vs {want}", m.name);
        // And through the full entry point at the reference temperature.
        let t_ref = m.reference_temperature().unwrap();
        let r = loss::core_loss(&m, &sine(f, b, 360), t_ref, 1e-6).unwrap();
        assert!((r.pv / want - 1.0).abs() < 0.005 && (r.temp_factor - 1.0).abs() < 1e-9);
    }
}

/// Triangle of duty D, swing ΔB: Pv = ki·ΔB^β·f^α·(D^(1−α) + (1−D)^(1−α))
/// (Venkatachalam et al. 2002, from memory), ki from the scipy table.
#[test]
fn igse_triangle_equals_closed_form() {
    let m = library::find("MnZn-500k").unwrap();
    let (a, b) = (m.steinmetz.alpha, m.steinmetz.beta);
    let ki = 0.00522859801577472; // scipy, above
    let c = IgseCoefficients::from_material(&m).unwrap();
    let f = 300e3;
    for d in [0.05, 0.25, 0.5, 0.7, 0.95] {
        for db in [0.02, 0.1, 0.3] {
            let t = 1.0 / f;
            let w = Pwl::new(t, vec![(0.0, 0.0), (d * t, db), (t, 0.0)]).unwrap();
            let closed = ki * f64::powf(db, b) * f64::powf(f, a) * (f64::powf(d, 1.0 - a) + f64::powf(1.0 - d, 1.0 - a));
            assert!((c.pv(&w).unwrap() / closed - 1.0).abs() < 1e-9, "D {d} ΔB {db}");
        }
    }
}

/// Fit recovery: points generated from known k, α, β and a temperature
/// factor 1 + c(T − T0)² (the model's equation, evaluated here) on an
/// irregular grid; the fit recovers them to 1e-6.
#[test]
fn fit_recovers_generating_coefficients() {
    let (k, alpha, beta, t0, c) = (0.118, 1.7, 2.6, 90.0, 1.2e-4);
    let mut pts = Vec::new();
    let fs = [150e3, 220e3, 300e3, 470e3, 600e3];
    let bs = [0.012, 0.03, 0.05, 0.1, 0.18];
    for (i, &t) in [25.0, 50.0, 80.0, 100.0, 120.0].iter().enumerate() {
        for (j, &f) in fs.iter().enumerate() {
            // Not a full grid: a different B subset at each temperature.
            for &b in bs.iter().skip((i + j) % 2) {
                let pv = k * f64::powf(f, alpha) * f64::powf(b, beta) * (1.0 + c * (t - t0) * (t - t0));
                pts.push(LossPoint { f, b, temp_c: t, pv });
            }
        }
    }
    let r = fit(&pts).unwrap();
    assert!((r.steinmetz.k / k - 1.0).abs() < 1e-6);
    assert!((r.steinmetz.alpha - alpha).abs() < 1e-6);
    assert!((r.steinmetz.beta - beta).abs() < 1e-6);
    assert!((r.reference_temperature - t0).abs() < 1e-6);
    let want = TempFactor::with_minimum(t0, c);
    assert!((r.temp_factor.least_loss_c - want.least_loss_c).abs() < 1e-6);
    assert!((r.temp_factor.curvature / want.curvature - 1.0).abs() < 1e-6);
    assert!(r.max_error_pct < 1e-6);
    let m = r.apply_to(&library::find("MnZn-500k").unwrap()).unwrap();
    assert_eq!(m.temp_factor, r.temp_factor);
}

fn test_core() -> GapCore {
    // Round numbers of an E-core about 30 mm wide; not a catalogue part.
    GapCore::new(60e-6, 67e-3, 19.5e-3).unwrap()
}

/// Magnetic-circuit law computed as a reluctance network (core and gap
/// reluctances in series, L = N²/ΣR; Erickson & Maksimovic, Fundamentals
/// of Power Electronics, magnetics chapter): equals μ0·N²·Ae/(lg + le/μr);
/// the ungapped limit is μ0·μr·N²·Ae/le; AL = L/N².
#[test]
fn gap_inductance_against_reluctance_network() {
    let c = test_core();
    let (mu, n) = (2300.0, 40.0);
    for lg in [0.0, 0.1e-3, 0.5e-3, 2e-3] {
        let r_core = c.le / (MU_0 * mu * c.ae);
        let r_gap = lg / (MU_0 * c.ae);
        let l_net = n * n / (r_core + r_gap);
        let l = gap::inductance(&c, mu, n, lg, GapPlacement::CentreLeg, false).unwrap();
        assert!((l / l_net - 1.0).abs() < 1e-12, "lg {lg}");
        let al = gap::al_value(&c, mu, lg, GapPlacement::CentreLeg, false).unwrap();
        assert!((al.al - l / (n * n)).abs() < 1e-18);
    }
    let l0 = gap::inductance(&c, mu, n, 0.0, GapPlacement::CentreLeg, true).unwrap();
    assert!((l0 / (MU_0 * mu * n * n * c.ae / c.le) - 1.0).abs() < 1e-12);
    // μ0 itself: 4π·10⁻⁷ H/m ≈ 1.25663706e-6 (CODATA, from memory).
    assert!((MU_0 - 1.25663706e-6).abs() < 1e-14);
}

/// McLyman's fringing factor F = 1 + (lg/√Ae)·ln(2G/lg): greater than 1
/// inside 0 < lg < 2G, tends to 1 at both ends; a gap solved with it
/// matches scipy's brentq on the same equation.
#[test]
fn fringing_and_gap_solve_against_scipy() {
    let c = test_core();
    for lg in [1e-7, 1e-5, 1e-3, 1e-2, 3e-2] {
        let f = gap::fringing_factor(c.ae, lg, c.window_height).unwrap();
        assert!(f > 1.0, "lg {lg}");
    }
    assert!((gap::fringing_factor(c.ae, 1e-12, c.window_height).unwrap() - 1.0).abs() < 1e-6);
    assert!((gap::fringing_factor(c.ae, 2.0 * c.window_height * (1.0 - 1e-9), c.window_height).unwrap() - 1.0).abs() < 1e-6);
    for (target, gap_scipy) in [(400e-9, 0.0001832714816064402), (100e-9, 0.0011092130342335693)] {
        let s = gap::solve_gap(&c, 2300.0, target, GapPlacement::CentreLeg, true).unwrap();
        assert!((s.gap / gap_scipy - 1.0).abs() < 1e-9, "{} vs {gap_scipy}", s.gap);
        // Spacer: round trip, and the path gap is twice the spacer.
        let sp = gap::solve_gap(&c, 2300.0, target, GapPlacement::Spacer, true).unwrap();
        let back = gap::al_value(&c, 2300.0, sp.gap, GapPlacement::Spacer, true).unwrap();
        assert!((back.al / target - 1.0).abs() < 1e-9);
        assert!((sp.path_gap - 2.0 * sp.gap).abs() < 1e-18);
    }
}

/// Energy ½·L·I² and Bpk = L·I/(N·Ae) from Faraday's law, checked by
/// Ampère's law on the magnetic circuit (B0 = μ0·N·I/(lg + le/μr)) times
/// the fringing factor.
#[test]
fn energy_and_peak_flux() {
    let c = test_core();
    let m = library::find("MnZn-hiBsat").unwrap();
    let (n, lg, i) = (30.0, 0.6e-3, 2.5);
    let r = gap::evaluate(&c, &m, n, lg, GapPlacement::CentreLeg, i, 100.0, 0.15).unwrap();
    let f = 1.0 + lg / c.ae.sqrt() * (2.0 * c.window_height / lg).ln();
    let b0 = MU_0 * n * i / (lg + c.le / m.mu_i);
    assert!((r.b_peak / (f * b0) - 1.0).abs() < 1e-12);
    let l = f * MU_0 * n * n * c.ae / (lg + c.le / m.mu_i);
    assert!((r.energy - 0.5 * l * i * i).abs() < 1e-12 * r.energy);
    assert!(r.saturation.ok);
    assert!((r.saturation.b_sat - m.bsat_100).abs() < 1e-12);
}
