//! Reference checks: what a passing design must satisfy physically, and the
//! inputs that must be refused. Each check names its source:
//!
//! * energy conservation: Pin = Pout + losses, so the magnetic's loss can be
//!   at most the converter's loss budget Pin − Pout = Pout·(1/η − 1), and at
//!   most the share the user gives it (the default share of one half is
//!   common practice, no source);
//! * a loss figure outside the material's fitted ranges is extrapolation
//!   (Steinmetz 1892 form; the band ×1.25 is common practice, no source);
//! * a ferrite stops being magnetic at its Curie temperature, and its Bsat
//!   falls as it warms (common practice, no source);
//! * a one-piece ring has no mated faces: L = μ0·μi·N²·Ae/le with the
//!   IEC 60205 effective parameters Ae, le, no residual gap;
//! * isoperimetric inequality (a closed curve around an area A is at least
//!   2·√(π·A) long; a body of volume V has at least (36π)^(1/3)·V^(2/3) of
//!   surface) for the consistency of an own core's parameters.

use magwright_engine::core::{library as cores, Core, Effective};
use magwright_engine::design::file::{CoreChoice, Design, MaterialChoice};
use magwright_engine::design::{evaluate, optimise, sweep, Report};
use magwright_engine::material::library as materials;
use magwright_engine::topology::{Input, Output};

/// μ0, H/m (CODATA 2018: 4π·10⁻⁷ to 10 digits).
const MU0: f64 = 4.0e-7 * std::f64::consts::PI;

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs().max(1e-300)
}

fn check<'a>(r: &'a Report, key: &str) -> &'a magwright_engine::design::solve::Check {
    r.checks
        .iter()
        .find(|c| c.key == key)
        .unwrap_or_else(|| panic!("no check {key}"))
}

fn demos() -> [Design; 3] {
    [
        Design::demo_forward(),
        Design::demo_flyback(),
        Design::demo_push_pull(),
    ]
}

// ------------------------------------------------------------ loss budget

/// A 1 mW output cannot carry a transformer losing milliwatts:
/// Pin − Pout = Pout·(1/η − 1) is the whole budget (energy conservation),
/// the magnetic may take its share of it.
#[test]
fn a_milliwatt_output_with_a_lossy_magnetic_fails_the_loss_budget() {
    for mut d in [Design::demo_forward(), Design::demo_push_pull()] {
        d.spec.outputs = vec![Output {
            voltage: 12.0,
            current: 1e-3 / 12.0,
            rectifier_drop: 0.0,
        }];
        let r = evaluate(&d).unwrap();
        let k = check(&r, "loss_budget");
        // By hand: budget = Pout/η − Pout, limit = share·budget.
        let p_out = 1e-3;
        let budget = p_out / d.spec.efficiency - p_out;
        assert!(rel(k.limit, 0.5 * budget) < 1e-9, "{} vs {}", k.limit, budget);
        assert!(rel(k.value, r.losses.core + r.losses.copper) < 1e-12);
        assert!(k.value > 10.0 * k.limit, "{}: the magnetic loses {} W of {} W", d.name, k.value, k.limit);
        assert!(!k.pass && k.margin < 0.0 && !r.pass, "{}", d.name);
        assert_eq!(k.unit, "W");
    }
}

/// Every demo passes the budget, and on every passing design the energy
/// balance Pout + magnetic loss ≤ Pin holds; the share is the user's.
#[test]
fn loss_budget_share_is_the_users_and_demos_keep_the_energy_balance() {
    for d in demos() {
        let r = evaluate(&d).unwrap();
        assert!(r.pass, "{}", d.name);
        let k = check(&r, "loss_budget");
        assert!(k.pass);
        assert!(r.power.output + r.losses.total <= r.power.input, "{}", d.name);
        // A share below the magnetic's actual share of the budget fails it.
        let budget = r.power.input - r.power.output;
        let actual = r.losses.total / budget;
        let mut tight = d.clone();
        tight.choices.magnetic_loss_share = 0.9 * actual;
        let t = evaluate(&tight).unwrap();
        assert!(!check(&t, "loss_budget").pass && !t.pass, "{}", d.name);
        assert!(rel(check(&t, "loss_budget").limit, 0.9 * actual * budget) < 1e-9);
    }
    let mut d = Design::demo_forward();
    for bad in [0.0, -0.2, 1.5, f64::NAN] {
        d.choices.magnetic_loss_share = bad;
        assert_eq!(
            evaluate(&d).unwrap_err().field(),
            Some("choices.magnetic_loss_share")
        );
    }
    // The field round-trips through the design file; absent, the default.
    let mut d = Design::demo_forward();
    d.choices.magnetic_loss_share = 0.3;
    assert_eq!(Design::from_json(&d.to_json()).unwrap(), d);
    assert!(d.to_json().contains("\"magnetic_loss_share\": 0.3"));
    // Absent from a file: the default.
    let text: String = Design::demo_forward()
        .to_json()
        .lines()
        .filter(|l| !l.contains("magnetic_loss_share"))
        .collect::<Vec<_>>()
        .join("\n")
        .replace(",\n  }", "\n  }");
    assert!(!text.contains("magnetic_loss_share"));
    assert_eq!(
        Design::from_json(&text).unwrap().choices.magnetic_loss_share,
        0.5
    );
}

// ---------------------------------------------------------- material range

/// 17 × the top of the fitted frequency range fails; inside ×1.25 of it
/// warns and passes that check (the band of `loss::range`).
#[test]
fn far_outside_the_fitted_frequency_fails_near_it_warns() {
    let m = materials::find("MnZn-200k").unwrap();
    let mut d = Design::demo_forward();
    d.spec.frequency = 17.0 * m.steinmetz.f_max;
    let r = evaluate(&d).unwrap();
    let k = check(&r, "material_range");
    assert!(rel(k.value, 17.0) < 1e-9, "{}", k.value);
    assert!((k.limit - 1.25).abs() < 1e-12);
    assert!(!k.pass && !r.pass);
    d.spec.frequency = 1.2 * m.steinmetz.f_max;
    let r = evaluate(&d).unwrap();
    let k = check(&r, "material_range");
    assert!(k.pass && rel(k.value, 1.2) < 1e-9, "{}", k.value);
    assert!(
        r.warnings.iter().any(|w| w.contains("extrapolated")),
        "{:?}",
        r.warnings
    );
    // Below the range too: f_min/1.3 is beyond the band.
    d.spec.frequency = m.steinmetz.f_min / 1.3;
    let r = evaluate(&d).unwrap();
    assert!(!check(&r, "material_range").pass);
    // Inside: the demo's factor is at most 1.
    let r = evaluate(&Design::demo_forward()).unwrap();
    assert!(check(&r, "material_range").value <= 1.0);
}

/// The sweep and the optimiser apply the same rule: no point beyond the
/// band is feasible, no candidate beyond it is ranked.
#[test]
fn sweep_and_optimiser_hold_the_data_range() {
    let d = Design::demo_forward();
    let m = d.resolve_material().unwrap();
    let s = sweep::frequency(&d, 100e3, 3e6, 12).unwrap();
    let mut beyond = 0;
    for p in &s.points {
        if p.x > 1.25 * m.steinmetz.f_max {
            beyond += 1;
            assert!(!p.feasible, "{} Hz", p.x);
            if p.values.is_some() {
                assert!(p.reason.contains("material's data"), "{}", p.reason);
            }
        }
    }
    assert!(beyond >= 6);
    let f_hi = [100e3, 17.0 * 300e3];
    let ranking = optimise::optimise(&d, cores::cores(), materials::materials(), &f_hi).unwrap();
    assert!(ranking.passed > 0);
    for c in &ranking.by_loss {
        let s = materials::find(&c.material).unwrap().steinmetz;
        assert!(
            c.frequency <= 1.25 * s.f_max && c.frequency >= s.f_min / 1.25,
            "{} {} at {} Hz ranked",
            c.core,
            c.material,
            c.frequency
        );
    }
}

// ---------------------------------------------------------- temperatures

/// A core temperature limit at or above the Curie temperature is refused, naming
/// the field; a rising Bsat is refused at entry unless marked deliberate.
#[test]
fn curie_and_rising_bsat_are_refused() {
    let mut d = Design::demo_forward();
    d.material = MaterialChoice::Library {
        name: "MnZn-hiperm".into(),
    };
    let curie = materials::find("MnZn-hiperm").unwrap().curie_c;
    d.spec.temperature_max = curie + 5.0;
    let e = evaluate(&d).unwrap_err();
    assert_eq!(e.field(), Some("spec.temperature_max"), "{e}");
    assert!(e.message().contains("Curie"));
    d.spec.temperature_max = curie;
    assert_eq!(evaluate(&d).unwrap_err().field(), Some("spec.temperature_max"));

    let mut m = materials::find("MnZn-200k").unwrap();
    m.name = "swapped".into();
    std::mem::swap(&mut m.bsat_25, &mut m.bsat_100);
    let mut d = Design::demo_forward();
    d.material = MaterialChoice::Custom { material: m.clone() };
    assert_eq!(evaluate(&d).unwrap_err().field(), Some("material.bsat_100"));
    m.bsat_rise_intended = true;
    d.material = MaterialChoice::Custom { material: m };
    assert!(evaluate(&d).is_ok());
}

// ------------------------------------------------------------ residual gap

/// A ring is one piece: ungapped, L = μ0·μi·N²·Ae/le exactly (IEC 60205
/// effective parameters), for a library ring and an own core of family "Ring";
/// mated pairs keep the 10 µm residual gap. Every core's provenance says which.
#[test]
fn rings_have_no_residual_gap() {
    for ring in ["R 29.5/19/14.9", "R 36/23/15"] {
        let mut d = Design::demo_forward();
        d.core = CoreChoice::Library {
            designation: ring.into(),
        };
        let r = evaluate(&d).unwrap();
        let n = r.turns.primary as f64;
        let want = MU0 * r.material.mu_i * n * n * r.core.ae / r.core.le;
        assert!(rel(r.inductance, want) < 1e-12, "{ring}: {} vs {want}", r.inductance);
        assert!(rel(r.al, want / (n * n)) < 1e-12);
        assert!(r.core.provenance.contains("no residual gap"), "{}", r.core.provenance);
        // The same ring as an own core by its effective parameters.
        let c = cores::find(ring).unwrap();
        let mut own = d.clone();
        own.core = CoreChoice::Effective {
            designation: "my ring".into(),
            parameters: effective_of(&c, "Ring"),
        };
        let o = evaluate(&own).unwrap();
        let n = o.turns.primary as f64;
        let want = MU0 * o.material.mu_i * n * n * c.ae / c.le;
        assert!(rel(o.inductance, want) < 1e-12);
    }
    for c in cores::all() {
        let ring = c.family == "Ring";
        assert_eq!(c.is_one_piece(), ring, "{}", c.designation);
        let note = if ring { "no residual gap" } else { "residual gap is assumed" };
        assert!(c.provenance.contains(note), "{}: {}", c.designation, c.provenance);
    }
    // A mated pair: L = μ0·N²·Ae/(10 µm + le/μi).
    let r = evaluate(&Design::demo_forward()).unwrap();
    let n = r.turns.primary as f64;
    let want = MU0 * n * n * r.core.ae / (10e-6 + r.core.le / r.material.mu_i);
    assert!(rel(r.inductance, want) < 1e-12);
}

// ------------------------------------------------------- own-core bounds

fn effective_of(c: &Core, family: &str) -> Effective {
    Effective {
        family: family.into(),
        ae: c.ae,
        le: c.le,
        ve: Some(c.ve),
        amin: Some(c.amin),
        window_area: c.window_area,
        // A ring's window height stands in for its height (shorter than the
        // winding breadth around the hole): left to the default.
        window_height: (!c.is_one_piece()).then_some(c.window_height),
        winding_breadth: c.winding_breadth,
        winding_height: c.winding_height,
        turn_length_inner: c.turn_length_inner,
        surface_area: c.surface_area,
        mass: Some(c.mass),
    }
}

fn own_core_error(edit: impl Fn(&mut Effective)) -> String {
    let mut p = effective_of(&cores::find("ETD 34").unwrap(), "ETD");
    edit(&mut p);
    let mut d = Design::demo_forward();
    d.core = CoreChoice::Effective {
        designation: "own".into(),
        parameters: p,
    };
    match evaluate(&d) {
        Ok(r) => panic!("accepted, rise {} K", r.thermal.rise),
        Err(e) => e.field().unwrap_or("").to_string(),
    }
}

/// Absurd sizes and inconsistent parameters of an own core are refused,
/// each naming its field by its path in the design file.
#[test]
fn own_core_bounds_and_consistency() {
    // Every library core, given back as effective parameters, is accepted.
    for c in cores::all() {
        let p = effective_of(c, &c.family);
        Core::from_effective(&c.designation, &p)
            .unwrap_or_else(|e| panic!("{}: {e}", c.designation));
    }
    type Edit = Box<dyn Fn(&mut Effective)>;
    let cases: Vec<(&str, Edit)> = vec![
        // 1e308 m of core.
        ("core.parameters.le", Box::new(|p| {
            p.le = 1e308;
            p.ve = None;
        })),
        // A 1e8 m² surface (the sizes' upper bound).
        ("core.parameters.surface_area", Box::new(|p| p.surface_area = 1e8)),
        // 1 m² on a 7.6 cm³ core: within the bound, inconsistent with Ve
        // (at most 40·Ve^(2/3) ≈ 156 cm²).
        ("core.parameters.surface_area", Box::new(|p| p.surface_area = 1.0)),
        // Less surface than a sphere of the same volume.
        ("core.parameters.surface_area", Box::new(|p| p.surface_area = 3e-4)),
        ("core.parameters.ae", Box::new(|p| {
            p.ae = 1.0;
            p.ve = None;
        })),
        ("core.parameters.mass", Box::new(|p| p.mass = Some(10.0))),
        ("core.parameters.mass", Box::new(|p| p.mass = Some(1e-3))),
        ("core.parameters.window_area", Box::new(|p| p.window_area = 1.0)),
        // A path shorter than any closed curve around the window.
        ("core.parameters.le", Box::new(|p| {
            p.le = 0.02;
            p.ve = None;
        })),
        ("core.parameters.ve", Box::new(|p| p.ve = Some(2.0 * p.ae * p.le))),
    ];
    for (field, edit) in cases {
        assert_eq!(own_core_error(edit), field);
    }
    // A shape's dimensions: metres, at most 1 m.
    let mut d = Design::demo_forward();
    let Some(shape) = cores::find("ETD 34").unwrap().shape else {
        panic!("the library core has its shape");
    };
    let mut v = serde_json::to_value(shape).unwrap();
    v["a"] = serde_json::json!(34.2);
    d.core = CoreChoice::Shape {
        designation: "in mm by mistake".into(),
        shape: serde_json::from_value(v).unwrap(),
    };
    assert_eq!(evaluate(&d).unwrap_err().field(), Some("core.shape.a"));
}

// -------------------------------------------------------------- input order

/// A swapped input range says so, not that the nominal is outside it.
#[test]
fn swapped_input_range_is_named_as_such() {
    let mut d = Design::demo_forward();
    d.spec.input = Input::Dc {
        min: 60.0,
        nominal: 48.0,
        max: 36.0,
    };
    let e = evaluate(&d).unwrap_err();
    assert_eq!(e.field(), Some("input.max"), "{e}");
    assert!(e.message().contains("Vin min (60 V) is above Vin max (36 V)"), "{e}");
    let mut d = Design::demo_flyback();
    if let Input::Ac {
        ref mut vac_min,
        ref mut vac_max,
        ..
    } = d.spec.input
    {
        std::mem::swap(vac_min, vac_max);
    }
    let e = evaluate(&d).unwrap_err();
    assert_eq!(e.field(), Some("input.vac_max"), "{e}");
    assert!(e.message().contains("above Vac max"), "{e}");
}
