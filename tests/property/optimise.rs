//! The optimiser (`design::optimise`) against a brute-force evaluation of
//! every candidate, on a small library, over random specifications.
//!
//! For each drawn spec (one of the three demos with its input voltage,
//! output load and frequency scaled at random) and a random small library
//! (a handful of library cores, one or two library materials):
//! * the passing set equals the brute force's: each core × material
//!   designed on its own with `design::evaluate` (the public entry point,
//!   the core and material chosen by name as a design file would), kept
//!   when the report's own checks pass (the output choke's verdict, a
//!   separate magnetic, is not part of the ranking);
//! * the rankings are those candidates sorted by volume (ties by loss) and
//!   by loss, with the same losses, volumes and turns;
//! * a candidate is on the Pareto front exactly when no other passing
//!   candidate is at least as good in both loss and volume and strictly
//!   better in one (the definition, checked pairwise here, not the
//!   optimiser's sweep).

use crate::config;
use magwright_engine::core::library as cores;
use magwright_engine::design::file::{CoreChoice, Design, MaterialChoice};
use magwright_engine::design::optimise::{optimise, Ranked};
use magwright_engine::design::evaluate;
use magwright_engine::material::library as materials;
use proptest::prelude::*;

fn demo(k: u8) -> Design {
    match k % 3 {
        0 => Design::demo_forward(),
        1 => Design::demo_flyback(),
        _ => Design::demo_push_pull(),
    }
}

/// Dominance as defined: at least as good in both, strictly better in one.
fn dominates(a: &Ranked, b: &Ranked) -> bool {
    a.total_loss <= b.total_loss
        && a.volume <= b.volume
        && (a.total_loss < b.total_loss || a.volume < b.volume)
}

/// (core, material, total loss, volume, primary turns) of one candidate.
type Row = (String, String, f64, f64, u32);

fn brute_force(design: &Design, core_names: &[String], mat_names: &[String]) -> Vec<Row> {
    let mut out = Vec::new();
    for c in core_names {
        for m in mat_names {
            let mut d = design.clone();
            d.core = CoreChoice::Library { designation: c.clone() };
            d.material = MaterialChoice::Library { name: m.clone() };
            if let Ok(r) = evaluate(&d) {
                // The optimiser ranks the transformer; the output choke is a
                // magnetic of its own, designed for the design picked, with
                // its own verdict (the `choke` check and member).
                if r.checks.iter().filter(|k| k.key != "choke").all(|k| k.pass) {
                    let volume = cores::find(c).unwrap().volume;
                    out.push((c.clone(), m.clone(), r.losses.total, volume, r.turns.primary));
                }
            }
        }
    }
    out
}

fn row(r: &Ranked) -> Row {
    (r.core.clone(), r.material.clone(), r.total_loss, r.volume, r.primary_turns)
}

proptest! {
    #![proptest_config(config(24))]

    #[test]
    fn ranking_equals_brute_force_and_pareto_is_the_definition(
        k in 0u8..3,
        vin in 0.8f64..1.25,
        load in 0.3f64..1.5,
        freq in 0.6f64..1.6,
        picks in proptest::collection::vec(0usize..1000, 4..8),
        mat_pick in 0usize..1000,
        two_materials in any::<bool>(),
    ) {
        let mut design = demo(k);
        design.spec.frequency *= freq;
        for o in &mut design.spec.outputs {
            o.current *= load;
        }
        scale_input(&mut design, vin);
        let lib = cores::all();
        let mut core_names: Vec<String> = picks.iter().map(|i| lib[i % lib.len()].designation.clone()).collect();
        core_names.sort();
        core_names.dedup();
        let mats = materials::materials();
        let mut mat_names = vec![mats[mat_pick % mats.len()].name.clone()];
        if two_materials {
            let other = mats[(mat_pick + 1) % mats.len()].name.clone();
            if other != mat_names[0] {
                mat_names.push(other);
            }
        }
        let small_cores: Vec<_> = core_names.iter().map(|n| cores::find(n).unwrap()).collect();
        let small_mats: Vec<_> = mat_names.iter().map(|n| materials::find(n).unwrap()).collect();
        let Ok(ranking) = optimise(&design, small_cores, small_mats, &[]) else {
            // A spec the scaling made invalid: evaluate must refuse it too.
            prop_assert!(evaluate(&design).is_err());
            return Ok(());
        };
        prop_assert_eq!(ranking.evaluated, core_names.len() * mat_names.len());

        let mut want = brute_force(&design, &core_names, &mat_names);
        prop_assert_eq!(ranking.passed, want.len());
        // By volume (ties: lower loss), then by loss.
        want.sort_by(|a, b| a.3.total_cmp(&b.3).then(a.2.total_cmp(&b.2)));
        let got: Vec<Row> = ranking.by_volume.iter().map(row).collect();
        prop_assert_eq!(&got, &want);
        let mut want_loss = want.clone();
        want_loss.sort_by(|a, b| a.2.total_cmp(&b.2));
        let got_loss: Vec<f64> = ranking.by_loss.iter().map(|r| r.total_loss).collect();
        let want_loss: Vec<f64> = want_loss.iter().map(|r| r.2).collect();
        prop_assert_eq!(got_loss, want_loss);

        // Pareto front: exactly the candidates no other dominates.
        for r in &ranking.by_volume {
            let dominated = ranking.by_volume.iter().any(|o| dominates(o, r));
            prop_assert_eq!(r.pareto, !dominated, "{} {}: pareto flag", &r.core, &r.material);
        }
        let front: Vec<Row> = ranking.pareto.iter().map(row).collect();
        let want_front: Vec<Row> = ranking.by_volume.iter().filter(|r| r.pareto).map(row).collect();
        prop_assert_eq!(front, want_front);
    }
}

fn scale_input(d: &mut Design, s: f64) {
    use magwright_engine::topology::Input;
    match &mut d.spec.input {
        Input::Dc { min, nominal, max } => {
            *min *= s;
            *nominal *= s;
            *max *= s;
        }
        Input::Ac { vac_min, vac_nominal, vac_max, .. } => {
            *vac_min *= s;
            *vac_nominal *= s;
            *vac_max *= s;
        }
    }
}

/// Not vacuous: the forward demo over the ETD family and its own material
/// has several passing candidates and a front; the brute force agrees.
#[test]
fn forward_demo_over_etd_family_has_a_front() {
    let design = Design::demo_forward();
    let etd: Vec<_> = cores::by_family("ETD").unwrap();
    let names: Vec<String> = etd.iter().map(|c| c.designation.clone()).collect();
    let mat = design.resolve_material().unwrap();
    let r = optimise(&design, etd, vec![mat.clone()], &[]).unwrap();
    assert!(r.passed >= 3, "{} passed", r.passed);
    assert!(!r.pareto.is_empty());
    assert_eq!(brute_force(&design, &names, std::slice::from_ref(&mat.name)).len(), r.passed);
}
