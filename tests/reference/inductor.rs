//! The inductor kind against the filter-inductor design equations of
//! Erickson & Maksimovic, Fundamentals of Power Electronics, 2nd ed.,
//! ch. 14 (inductor design, §14.1 constraints and §14.3 the step-by-step
//! Kg procedure; equations from memory), with McLyman's fringing factor
//! (Transformer and Inductor Design Handbook, gapped inductors), on our own
//! buck scenario (`Design::demo_inductor`). The book's worked example's
//! figures were not at hand, so no book number is quoted here: the checks
//! are the book's equations evaluated by the test itself.

use magwright_engine::design::{evaluate, Design};
use magwright_engine::design::file::TurnsRule;
use magwright_engine::gap::fringing_factor;
use magwright_engine::winding::dowell::MU0;
use magwright_engine::winding::wire::copper_resistivity;

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs().max(1e-300)
}

#[test]
fn buck_inductor_follows_the_kg_procedure_equations() {
    let mut d = Design::demo_inductor();
    d.choices.turns = TurnsRule::FewestTurns;
    let r = evaluate(&d).unwrap();
    let s = &d.spec;
    let o = s.outputs[0];
    let (vin, f) = (32.0, s.frequency);
    // Buck CCM, E&M §2.2–2.3: D = (Vo + Vf)/(Vin + Vf), ΔI = (Vin − Vo)·D/(f·L).
    let dmax = (o.voltage + o.rectifier_drop) / (vin + o.rectifier_drop);
    // L from the ripple ratio r at Vin max (its largest ripple): ΔI = r·Io.
    let l = (vin - o.voltage) * dmax / (f * s.choke_ripple_ratio * o.current);
    // The inductance as wound meets the target (a continuous gap with integer turns).
    assert!(rel(r.inductance, l) < 1e-6, "{} vs {l}", r.inductance);
    let imax = o.current + 0.5 * s.choke_ripple_ratio * o.current;
    // E&M §14.1: n = L·Imax/(Bmax·Ac), the fewest whole turns (Ac the
    // smallest section where it is narrower than Ae).
    let ac = r.core.ae.min(r.core.amin);
    let n = (l * imax / (r.bpk_limit * ac)).ceil() as u32;
    assert_eq!(r.turns.primary, n);
    assert!(l * imax / ((n - 1) as f64 * ac) > r.bpk_limit, "one turn fewer would exceed Bmax");
    // Bpk = L·Imax/(n·Ae) (Faraday, E&M §14.1), worst at Vin max.
    let bpk = r.waveforms.get("b_peak").unwrap();
    assert!(rel(bpk.value, l * imax / (n as f64 * r.core.ae)) < 1e-9);
    // Gap: L = μ0·n²·Ae/(lg + le/μr) (E&M eq. for the gapped core's
    // reluctance) raised by McLyman's F = 1 + (lg/√Ae)·ln(2G/lg).
    let g = r.gap.as_ref().unwrap();
    let nf = n as f64;
    let lg = g.path_gap;
    let ff = fringing_factor(r.core.ae, lg, r.core.window_height).unwrap();
    let l_back = ff * MU0 * nf * nf * r.core.ae / (lg + r.core.le / r.material.mu_i);
    assert!(rel(l_back, l) < 1e-6, "{l_back} vs {l}");
    // Without fringing the gap would be smaller (E&M lg = μ0·n²·Ae/L − le/μr).
    let lg0 = MU0 * nf * nf * r.core.ae / l - r.core.le / r.material.mu_i;
    assert!(lg > lg0 && lg0 > 0.0);
    // Copper DC loss (E&M §14.1: R = ρ·n·MLT/Aw): Rdc·I²rms with
    // I²rms = Io² + ΔI²/12 at the loss corner, ρ at the operating temperature
    // (IEC 60028 copper).
    let w = &r.operating.copper.windings[0];
    let aw = r.wires[0].copper_area;
    let mlt: f64 = r.fit.layers.iter().map(|x| x.turn_length * x.turns as f64).sum::<f64>() / nf;
    let rho = copper_resistivity(r.thermal.temperature.min(250.0)).unwrap();
    let rdc = rho * nf * mlt / aw;
    assert!(rel(w.rdc, rdc) < 0.02, "Rdc {} vs {rdc}", w.rdc);
    let op = match r.loss_corner {
        magwright_engine::topology::Corner::VinMin => &r.waveforms.at_vin_min,
        magwright_engine::topology::Corner::VinMax => &r.waveforms.at_vin_max,
    };
    let di = op.windings[0].peak - op.windings[0].current.min();
    let irms2 = o.current * o.current + di * di / 12.0;
    assert!(rel(w.dc_loss, w.rdc * irms2) < 1e-6);
    assert!(r.pass);
}
