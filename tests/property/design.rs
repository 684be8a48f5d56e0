//! Random designs at `design::evaluate` and the sweeps.
//!
//! Every numeric field is drawn mostly from a plausible range (so a good
//! share of designs is accepted and the accepted-report invariants are
//! exercised), sometimes from the wild: NaN, ±∞, zero, negative, 1e300,
//! subnormal. Cores come from the library (or an unknown name, or
//! effective parameters scaled at random), materials from the library (or
//! a copy with one parameter made wild).

use crate::finite::non_finite;
use crate::{check_error, config};
use magwright_engine::core::{library as cores, Effective};
use magwright_engine::design::file::{
    Construction, CoreChoice, Design, Insulation, Interleave, MaterialChoice, TurnsRule, WireChoice, WireOverride,
};
use magwright_engine::design::{evaluate, sweep, Report};
use magwright_engine::gap::GapPlacement;
use magwright_engine::material::library as materials;
use magwright_engine::topology::{
    Bulk, FlybackOptions, FlybackRatio, Input, Isolation, Output, Spec, Topology,
};
use proptest::prelude::*;

/// Mostly `lo..hi`, sometimes a value no input should survive unchecked.
pub fn wild(lo: f64, hi: f64) -> BoxedStrategy<f64> {
    prop_oneof![
        150 => lo..hi,
        1 => Just(f64::NAN),
        1 => Just(f64::INFINITY),
        1 => Just(f64::NEG_INFINITY),
        1 => Just(0.0),
        1 => -1e3..0.0,
        1 => Just(1e300),
        1 => Just(5e-324),
        1 => 0.0..lo.max(1e-12),
        1 => hi..hi * 100.0 + 1.0,
    ]
    .boxed()
}

fn topology() -> impl Strategy<Value = Topology> {
    prop_oneof![
        Just(Topology::Flyback),
        Just(Topology::Forward),
        Just(Topology::TwoSwitchForward),
        Just(Topology::PushPull),
        Just(Topology::HalfBridge),
        Just(Topology::FullBridge),
    ]
}

fn input() -> impl Strategy<Value = Input> {
    let dc = (wild(5.0, 400.0), 1.0..1.6f64, 1.0..1.6f64, 0..8u8).prop_map(|(min, a, b, k)| {
        // Usually ordered; one case in eight given as drawn (nominal below min).
        if k == 0 {
            Input::Dc {
                min,
                nominal: min * 0.8,
                max: min * a,
            }
        } else {
            Input::Dc {
                min,
                nominal: min * a,
                max: min * a * b,
            }
        }
    });
    let bulk = prop_oneof![
        wild(10e-6, 400e-6).prop_map(|farads| Bulk::Capacitance { farads }),
        wild(0.05, 0.6).prop_map(|ratio| Bulk::RippleRatio { ratio }),
    ];
    let ac = (
        wild(80.0, 240.0),
        1.0..1.5f64,
        1.0..1.3f64,
        wild(45.0, 65.0),
        bulk,
        wild(0.5, 2.5),
    )
        .prop_map(
            |(vac_min, a, b, line_frequency, bulk, bridge_drop)| Input::Ac {
                vac_min,
                vac_nominal: vac_min * a,
                vac_max: vac_min * a * b,
                line_frequency,
                bulk,
                bridge_drop,
            },
        );
    prop_oneof![3 => dc, 2 => ac]
}

fn output() -> impl Strategy<Value = Output> {
    (wild(1.0, 60.0), wild(0.05, 15.0), wild(0.0, 1.2)).prop_map(
        |(voltage, current, rectifier_drop)| Output {
            voltage,
            current,
            rectifier_drop,
        },
    )
}

fn spec() -> impl Strategy<Value = Spec> {
    let outputs = prop_oneof![20 => prop::collection::vec(output(), 1..=4), 1 => prop::collection::vec(output(), 0..=6)];
    let ratio = prop_oneof![
        Just(FlybackRatio::FromDutyMax),
        wild(20.0, 200.0).prop_map(FlybackRatio::ReflectedVoltage),
        wild(0.5, 20.0).prop_map(FlybackRatio::TurnsRatio),
    ];
    (
        (
            topology(),
            input(),
            outputs,
            wild(20e3, 500e3),
            wild(0.2, 0.7),
        ),
        (wild(0.6, 0.95), wild(0.0, 60.0), wild(80.0, 150.0)),
        (
            prop_oneof![
                Just(Isolation::Functional),
                Just(Isolation::Basic),
                Just(Isolation::Reinforced)
            ],
            ratio,
            wild(0.2, 3.0),
            wild(0.0, 1.0),
        ),
    )
        .prop_map(
            |(
                (topology, input, outputs, frequency, duty_max),
                (efficiency, ambient, temperature_max),
                (isolation, ratio, ripple_ratio, choke_ripple_ratio),
            )| Spec {
                topology,
                input,
                outputs,
                frequency,
                duty_max,
                efficiency,
                ambient,
                temperature_max,
                isolation,
                flyback: FlybackOptions {
                    ratio,
                    ripple_ratio,
                },
                choke_ripple_ratio,
                inductor: None,
            },
        )
}

fn wire() -> impl Strategy<Value = WireOverride> {
    let names = prop_oneof![
        Just("primary"),
        Just("secondary 1"),
        Just("secondary 2"),
        Just("reset"),
        Just("primary A"),
        Just("secondary 1 B"),
        Just("nonsense"),
    ];
    let choice = prop_oneof![
        (0..60i32, 0..6u32).prop_map(|(awg, parallel)| WireChoice::Round {
            awg: awg - 5,
            parallel
        }),
        (0..400u32, 20..50i32).prop_map(|(strands, strand_awg)| WireChoice::Litz {
            strands,
            strand_awg
        }),
        wild(0.02e-3, 0.5e-3).prop_map(|thickness| WireChoice::Foil { thickness }),
        (10..50i32, 0..4u32)
            .prop_map(|(awg, parallel)| WireChoice::TripleInsulated { awg, parallel }),
    ];
    (names, choice).prop_map(|(n, wire)| WireOverride {
        winding: n.to_string(),
        wire,
    })
}

fn small_wraps() -> impl Strategy<Value = u32> {
    prop_oneof![10 => 0..4u32, 1 => 0..30u32]
}

fn choices() -> impl Strategy<Value = magwright_engine::design::Choices> {
    let turns = prop_oneof![
        2 => Just(TurnsRule::FewestTurns),
        3 => Just(TurnsRule::LeastLoss),
        1 => prop_oneof![9 => 1..200u32, 1 => 0..20_000u32].prop_map(|turns| TurnsRule::Primary { turns }),
    ];
    let interleave = prop_oneof![
        Just(Interleave::Auto),
        Just(Interleave::Sequential),
        Just(Interleave::SplitPrimary),
        Just(Interleave::SplitSecondaries),
        Just(Interleave::MirroredHalves),
    ];
    let construction = prop_oneof![
        Just(Construction::Auto),
        Just(Construction::TripleInsulated),
        Just(Construction::MarginWound),
    ];
    let insulation = (
        small_wraps(),
        small_wraps(),
        small_wraps(),
        wild(10e-6, 100e-6),
        prop::option::of(wild(0.0, 5e-3)),
        construction,
    )
        .prop_map(
            |(section_wraps, outer_wraps, interlayer_wraps, tape_thickness, margin, construction)| Insulation {
                section_wraps,
                outer_wraps,
                interlayer_wraps,
                tape_thickness,
                margin,
                construction,
            },
        );
    (
        (
            prop::option::weighted(0.3, wild(0.05, 0.4)),
            wild(0.0, 0.5),
            turns,
        ),
        (
            prop_oneof![Just(GapPlacement::CentreLeg), Just(GapPlacement::Spacer)],
            interleave,
            wild(0.1, 0.6),
        ),
        (
            prop_oneof![6 => Just(Vec::new()), 1 => prop::collection::vec(wire(), 1..3)],
            insulation,
        ),
        (
            prop_oneof![4 => Just(0.0), 1 => wild(0.0, 200e-9)],
            prop::option::weighted(0.2, wild(50.0, 1000.0)),
        ),
    )
        .prop_map(
            |(
                (bpk_limit, saturation_margin, turns),
                (gap_placement, interleave, window_utilisation),
                (wires, insulation),
                (edge_time, switch_voltage_rating),
            )| magwright_engine::design::Choices {
                bpk_limit,
                saturation_margin,
                turns,
                gap_placement,
                interleave,
                section_order: Vec::new(),
                window_utilisation,
                wires,
                insulation,
                edge_time,
                switch_voltage_rating,
                ..Default::default()
            },
        )
}

fn core() -> impl Strategy<Value = CoreChoice> {
    let n = cores::all().len();
    let lib = (0..n).prop_map(|i| CoreChoice::Library {
        designation: cores::all()[i].designation.clone(),
    });
    // Effective parameters of a library core, each scaled (or made wild).
    let eff = (
        0..n,
        wild(0.5, 2.0),
        wild(0.5, 2.0),
        wild(0.5, 2.0),
        wild(0.5, 2.0),
    )
        .prop_map(|(i, a, b, c, d)| {
            let k = &cores::all()[i];
            CoreChoice::Effective {
                designation: "user core".into(),
                parameters: Effective {
                    family: k.family.clone(),
                    ae: k.ae * a,
                    le: k.le * b,
                    ve: None,
                    amin: None,
                    window_area: k.window_area * c,
                    window_height: Some(k.window_height),
                    winding_breadth: k.winding_breadth,
                    winding_height: k.winding_height * d,
                    turn_length_inner: k.turn_length_inner,
                    surface_area: k.surface_area * a,
                    mass: None,
                },
            }
        });
    prop_oneof![12 => lib, 3 => eff, 1 => Just(CoreChoice::Library { designation: "XQ 99/9".into() })]
}

fn material() -> impl Strategy<Value = MaterialChoice> {
    let n = materials::materials().len();
    let lib = (0..n).prop_map(|i| MaterialChoice::Library {
        name: materials::materials()[i].name.clone(),
    });
    let custom = (0..n, 0..8usize, wild(0.0, 1.0)).prop_map(|(i, which, x)| {
        let mut m = materials::materials()[i].clone();
        m.name = "user material".into();
        match which {
            0 => m.mu_i *= x * 2.0,
            1 => m.bsat_25 *= x * 2.0,
            2 => m.bsat_100 *= x * 2.0,
            3 => m.curie_c *= x * 2.0,
            4 => m.steinmetz.k *= x * 2.0,
            5 => m.steinmetz.alpha *= x * 2.0,
            6 => m.steinmetz.beta *= x * 2.0,
            _ => m.temp_factor.curvature *= x * 2.0,
        }
        MaterialChoice::Custom { material: m }
    });
    prop_oneof![8 => lib, 2 => custom, 1 => Just(MaterialChoice::Library { name: "unobtainium".into() })]
}

pub fn design() -> impl Strategy<Value = Design> {
    (spec(), core(), material(), choices()).prop_map(|(spec, core, material, choices)| Design {
        schema: "magwright-design".into(),
        version: magwright_engine::design::file::VERSION,
        name: "random".into(),
        spec,
        core,
        material,
        choices,
    })
}

/// The invariants of an accepted report.
pub fn check_report(d: &Design, r: &Report) -> Result<(), String> {
    let (bad, floats) = non_finite(r);
    if !bad.is_empty() {
        return Err(format!("non-finite values in the report: {bad:?}"));
    }
    if floats < 50 {
        return Err(format!("only {floats} numbers in a report"));
    }
    let l = &r.losses;
    for (k, v) in [
        ("core", l.core),
        ("copper_dc", l.copper_dc),
        ("copper_ac_extra", l.copper_ac_extra),
        ("copper", l.copper),
    ] {
        if v < 0.0 {
            return Err(format!("losses.{k} = {v} < 0"));
        }
    }
    if (l.total - (l.core + l.copper)).abs() > 1e-9 * l.total.max(1e-12) {
        return Err(format!(
            "total {} ≠ core {} + copper {}",
            l.total, l.core, l.copper
        ));
    }
    for c in r.corners.iter().chain(std::iter::once(&r.operating)) {
        if c.core.watts < 0.0 || c.copper.total < 0.0 {
            return Err(format!("negative loss at {:?}", c.corner));
        }
        for w in &c.copper.windings {
            // Dowell 1966: Fr ≥ 1 for any layer, with ideal steps or finite edges.
            if w.fr < 1.0 - 1e-9 {
                return Err(format!("{}: Fr = {} < 1", w.name, w.fr));
            }
            if w.dc_loss < 0.0 || w.total_loss < 0.0 {
                return Err(format!("{}: negative winding loss", w.name));
            }
        }
    }
    // Power balance: Pin = Pout/η; the magnetic's loss is core + copper.
    let pout: f64 = d.spec.outputs.iter().map(|o| o.voltage * o.current).sum();
    let p = &r.power;
    if (p.input - pout / d.spec.efficiency).abs() > 1e-9 * p.input {
        return Err(format!(
            "power.input {} ≠ Pout/η {}",
            p.input,
            pout / d.spec.efficiency
        ));
    }
    if (p.magnetic_loss - l.total).abs() > 1e-9 * l.total.max(1e-12) {
        return Err("power.magnetic_loss ≠ losses.total".into());
    }
    if !(p.magnetic_efficiency > 0.0 && p.magnetic_efficiency <= 1.0) {
        return Err(format!("magnetic efficiency {}", p.magnetic_efficiency));
    }
    if r.thermal.temperature < d.spec.ambient - 1e-9 {
        return Err(format!(
            "operating temperature {} below ambient {}",
            r.thermal.temperature, d.spec.ambient
        ));
    }
    Ok(())
}

fn run(d: &Design) -> Result<bool, String> {
    match evaluate(d) {
        Ok(r) => check_report(d, &r).map(|_| true),
        Err(e) => {
            if std::env::var_os("MAGWRIGHT_PROPERTY_VERBOSE").is_some() {
                eprintln!("rejected: {e}");
            }
            check_error(&e).map(|_| false)
        }
    }
}

#[test]
fn evaluate_never_panics_and_reports_are_sound() {
    let mut runner = proptest::test_runner::TestRunner::new(config(256));
    let accepted = std::cell::Cell::new(0u32);
    let t0 = std::time::Instant::now();
    runner
        .run(&design(), |d| {
            let ok = run(&d).map_err(TestCaseError::fail)?;
            accepted.set(accepted.get() + ok as u32);
            Ok(())
        })
        .unwrap();
    eprintln!(
        "evaluate: 256 random designs, {} accepted, {:.2} s",
        accepted.get(),
        t0.elapsed().as_secs_f64()
    );
    // The property must also exercise accepted designs, not only errors.
    assert!(
        accepted.get() >= 10,
        "only {} of 256 random designs accepted",
        accepted.get()
    );
}

/// Plausible designs only (no wild values): most must be accepted.
#[test]
fn plausible_designs_are_mostly_accepted() {
    let mut runner = proptest::test_runner::TestRunner::new(config(64));
    let d0 = Design::demo_forward();
    let strat = (
        topology(),
        0..cores::all().len(),
        1.0..3.0f64,
        0.5..2.0f64,
        50e3..300e3f64,
    );
    let accepted = std::cell::Cell::new(0u32);
    runner
        .run(&strat, |(topo, ci, vscale, iscale, f)| {
            let mut d = d0.clone();
            d.spec.topology = topo;
            d.spec.frequency = f;
            d.spec.outputs[0].voltage *= vscale;
            d.spec.outputs[0].current *= iscale;
            d.core = CoreChoice::Library {
                designation: cores::all()[ci].designation.clone(),
            };
            let ok = run(&d).map_err(TestCaseError::fail)?;
            accepted.set(accepted.get() + ok as u32);
            Ok(())
        })
        .unwrap();
    eprintln!("plausible: {} of 64 accepted", accepted.get());
    assert!(accepted.get() >= 16, "{}", accepted.get());
}

/// The minimum's limits say what lies beside it: a side is listed when a
/// point of the infeasible run next to it has less loss (the nearest one
/// says why: outside the data, or a failing check), when the point next to
/// it has no design, or when there is no point beyond it (an end).
fn limits_agree(s: &sweep::Sweep, i: usize) -> Result<(), TestCaseError> {
    use sweep::{LimitKind, Side};
    let total = s.points[i].values.map(|v| v.total).unwrap_or(f64::NAN);
    for side in [Side::Below, Side::Above] {
        let beyond: Vec<&sweep::SweepPoint> = match side {
            Side::Below => s.points[..i].iter().rev().collect(),
            Side::Above => s.points[i + 1..].iter().collect(),
        };
        let got = s.minimum_limits.iter().find(|l| l.side == side).map(|l| (l.by, l.x));
        let mut want = None;
        if beyond.is_empty() {
            let end = if s.curve == sweep::Curve::Flux && side == Side::Above {
                LimitKind::Checks
            } else {
                LimitKind::SweepRange
            };
            want = Some((end, s.points[i].x));
        }
        for p in beyond.iter().take_while(|p| !p.feasible) {
            if p.values.is_some_and(|v| v.total < total) {
                want = Some((if p.in_data { LimitKind::Checks } else { LimitKind::Data }, p.x));
                break;
            }
        }
        if want.is_none() && beyond.first().is_some_and(|p| !p.feasible && p.values.is_none()) {
            want = Some((LimitKind::NoDesign, beyond[0].x));
        }
        prop_assert_eq!(got, want, "{:?} side of point {}", side, i);
    }
    Ok(())
}

#[test]
fn sweeps_never_panic_and_points_are_sound() {
    let mut runner = proptest::test_runner::TestRunner::new(config(256));
    let t0 = std::time::Instant::now();
    runner
        .run(
            &(design(), wild(5e3, 300e3), 1.5..20.0f64, 2..4usize),
            |(d, f0, span, n)| {
                match sweep::frequency(&d, f0, f0 * span, n) {
                    Ok(s) => {
                        let (bad, _) = non_finite(&s);
                        prop_assert!(bad.is_empty(), "non-finite in sweep: {:?}", bad);
                        prop_assert_eq!(s.points.len(), n);
                        for p in &s.points {
                            prop_assert!(
                                p.feasible == p.reason.is_empty(),
                                "reason {:?} feasible {}",
                                p.reason,
                                p.feasible
                            );
                            if let Some(v) = p.values {
                                prop_assert!(v.total >= 0.0 && v.core >= 0.0 && v.copper >= 0.0);
                            }
                        }
                        if let Some(i) = s.minimum {
                            prop_assert!(s.points[i].feasible);
                            limits_agree(&s, i)?;
                        } else {
                            prop_assert!(s.minimum_limits.is_empty());
                        }
                    }
                    Err(e) => check_error(&e).map_err(TestCaseError::fail)?,
                }
                match sweep::flux(&d, n) {
                    Ok(s) => {
                        let (bad, _) = non_finite(&s);
                        prop_assert!(bad.is_empty(), "non-finite in flux sweep: {:?}", bad);
                        prop_assert!(s.ratio_at_minimum.is_none_or(|x| x >= 0.0));
                        if let Some(i) = s.minimum {
                            limits_agree(&s, i)?;
                        }
                    }
                    Err(e) => check_error(&e).map_err(TestCaseError::fail)?,
                }
                Ok(())
            },
        )
        .unwrap();
    eprintln!(
        "sweeps: 256 random designs, {:.2} s",
        t0.elapsed().as_secs_f64()
    );
}

/// Regression: with a finite `choices.edge_time` the harmonic sum describes
/// the ramped current, so the DC loss must use the ramped waveform's RMS
/// too; before that fix this case gave Fr 0.83 (144 ns edges at 278 kHz,
/// D ≤ 0.2). Dowell 1966: Fr ≥ 1 for any layer.
#[test]
fn fr_at_least_one_with_long_edges() {
    let mut d = Design::demo_forward();
    d.spec.topology = Topology::HalfBridge;
    d.spec.input = Input::Dc {
        min: 224.0,
        nominal: 224.0,
        max: 289.0,
    };
    d.spec.outputs = vec![
        Output {
            voltage: 1.0,
            current: 0.05,
            rectifier_drop: 0.0,
        },
        Output {
            voltage: 43.9,
            current: 0.05,
            rectifier_drop: 0.0,
        },
    ];
    d.spec.frequency = 277.8e3;
    d.spec.duty_max = 0.2;
    d.spec.efficiency = 0.6;
    d.spec.ambient = 0.0;
    d.spec.temperature_max = 80.0;
    d.spec.choke_ripple_ratio = 0.576;
    d.core = CoreChoice::Library {
        designation: "PQ 20/16".into(),
    };
    d.choices.saturation_margin = 0.0;
    d.choices.turns = TurnsRule::FewestTurns;
    d.choices.interleave = Interleave::SplitPrimary;
    d.choices.window_utilisation = 0.1;
    d.choices.insulation = Insulation {
        section_wraps: 0,
        outer_wraps: 0,
        interlayer_wraps: 0,
        tape_thickness: 1e-5,
        margin: None,
        construction: Construction::Auto,
    };
    d.choices.edge_time = 144e-9;
    let r = evaluate(&d).unwrap();
    for w in &r.operating.copper.windings {
        assert!(w.fr >= 1.0 - 1e-9, "{}: Fr {}", w.name, w.fr);
    }
}

/// Regression (found by `evaluate_never_panics_and_reports_are_sound`):
/// errors about a user core named the field "le", "winding_height"…
/// instead of its design-file path.
#[test]
fn user_core_errors_name_their_design_file_path() {
    let k = &cores::all()[0];
    let mut p = Effective {
        family: k.family.clone(),
        ae: k.ae,
        le: f64::NAN,
        ve: None,
        amin: None,
        window_area: k.window_area,
        window_height: Some(k.window_height),
        winding_breadth: k.winding_breadth,
        winding_height: k.winding_height,
        turn_length_inner: k.turn_length_inner,
        surface_area: k.surface_area,
        mass: None,
    };
    let mut d = Design::demo_forward();
    d.core = CoreChoice::Effective { designation: "mine".into(), parameters: p.clone() };
    assert_eq!(evaluate(&d).unwrap_err().field(), Some("core.parameters.le"));
    p.le = k.le;
    d.core = CoreChoice::Effective { designation: " ".into(), parameters: p };
    assert_eq!(evaluate(&d).unwrap_err().field(), Some("core.designation"));
}
