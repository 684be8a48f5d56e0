//! Reference checks: the stack-up (see each test for its source): the
//! fit of turns into layers worked by hand, a section that does not fit,
//! the stack-up file's round trip, older schemas and errors, the default
//! stack-up's interleavings and the documented example.
//!
//! Every expected value is computed here from the fit's stated rules and
//! the wire standards, never copied from the code under test.

use super::windings::{defs, section, test_core};
use magwright_engine::winding::fit::fit;
use magwright_engine::winding::leakage::leakage;
use magwright_engine::winding::stackup::*;
use magwright_engine::winding::{Conductor, Grade};
use std::f64::consts::PI;

// ------------------------------------------------------------ fit --------

/// Turns per layer, build and fill factor by hand (the fit's rules):
/// 0.5 mm grade-2 wire, overall d + 0.093·√0.5 = 0.56576 mm; breadth
/// 20 − 2·2 = 16 mm → ⌊16/0.56576⌋ = 28 turns per layer; 60 turns → 3
/// layers; build 3·0.56576 + 2·0.03 (inter-layer tape) mm.
#[test]
fn fit_by_hand() {
    let core = test_core();
    let c = Conductor::metric(0.5e-3, Grade::G2).unwrap();
    let od = 0.5e-3 + 0.093e-3 * 0.5f64.sqrt();
    assert!((c.outer_height() - od).abs() < 1e-12);
    let mut sec = match section("p", 60, c, 1, None) {
        Item::Section(s) => s,
        _ => unreachable!(),
    };
    sec.margin_left = 2e-3;
    sec.margin_right = 2e-3;
    sec.interlayer = Some(Tape {
        material: "polyester film".into(),
        thickness: 30e-6,
        wraps: 1,
    });
    let st = StackUp {
        windings: defs(&["p"]),
        items: vec![
            Item::Section(sec),
            Item::Tape(Tape {
                material: "polyester film".into(),
                thickness: 50e-6,
                wraps: 2,
            }),
        ],
    };
    let r = fit(&core, &st).unwrap();
    assert_eq!(r.sections[0].turns_per_layer, 28);
    assert_eq!(r.sections[0].layers, 3);
    let turns: Vec<u32> = r.layers.iter().map(|l| l.turns).collect();
    assert_eq!(turns, vec![28, 28, 4]);
    let build = 3.0 * od + 2.0 * 30e-6 + 100e-6;
    assert!((r.total_build - build).abs() < 1e-12);
    let fill = 60.0 * PI * 0.25e-6 / 4.0 / 120e-6;
    assert!((r.fill_factor - fill).abs() < 1e-12, "{} vs {fill}", r.fill_factor);
    // MLT of layer 2 (0-based 1): centre at od + 30 µm + od/2.
    let mlt1 = 50e-3 + 2.0 * PI * (1.5 * od + 30e-6);
    assert!((r.layers[1].turn_length - mlt1).abs() < 1e-12);
}

/// A section that does not fit says which item, what it needs and what is
/// left (e.g. "needs 3.40 mm of build, 1.10 mm left").
#[test]
fn section_that_does_not_fit_says_by_how_much() {
    let mut core = test_core();
    core.winding_height = 2.0e-3;
    let st = StackUp {
        windings: defs(&["p", "s"]),
        items: vec![
            section("p", 20, Conductor::foil(0.5e-3, 18e-3).unwrap(), 1, None),
            section("s", 4, Conductor::foil(0.5e-3, 18e-3).unwrap(), 1, None),
        ],
    };
    let e = fit(&core, &st).unwrap_err();
    assert_eq!(e.field(), Some("items[0]"));
    // 20 layers × 0.5 mm = 10 mm needed, 2 mm available.
    assert!(e.message().contains("needs 10.00 mm of build, 2.00 mm left"), "{e}");
    core.winding_height = 10.9e-3;
    let e = fit(&core, &st).unwrap_err();
    assert_eq!(e.field(), Some("items[1]"));
    assert!(
        e.message().contains("secondary") || e.message().contains("s section"),
        "{e}"
    );
    assert!(e.message().contains("needs 2.00 mm of build, 0.90 mm left"), "{e}");
}

// ------------------------------------------------------------ JSON -------

fn rich_stackup() -> StackUp {
    let mut p = match section("primary", 41, Conductor::awg(27, Grade::G1).unwrap(), 2, None) {
        Item::Section(s) => s,
        _ => unreachable!(),
    };
    p.interlayer = Some(Tape {
        material: "polyester film".into(),
        thickness: 1.0 / 3.0 * 1e-4,
        wraps: 1,
    });
    p.margin_left = 0.1 + 0.2e-3;
    p.margin_right = 1.7e-3;
    p.direction = Direction::CounterClockwise;
    StackUp {
        windings: defs(&["primary", "sekundär \"5 V\"", "aux"]),
        items: vec![
            Item::Section(p),
            Item::Tape(Tape {
                material: "polyimide".into(),
                thickness: 25e-6,
                wraps: 3,
            }),
            Item::Screen(Screen {
                material: "copper foil".into(),
                thickness: 35e-6,
                connection: "primary return".into(),
            }),
            section(
                "sekundär \"5 V\"",
                3,
                Conductor::foil(0.15e-3, 17.5e-3).unwrap(),
                2,
                Some(1),
            ),
            section(
                "aux",
                7,
                Conductor::litz(105, 0.071e-3, Grade::G2, 0.7, 0.033e-3).unwrap(),
                1,
                Some(7),
            ),
            section("aux", 2, Conductor::triple_insulated(0.4e-3, 0.6e-3).unwrap(), 1, None),
        ],
    }
}

/// import(export(x)) == x exactly (including values like 1/3·10⁻⁴ and
/// 0.1 + 0.2 that have no short decimal form), and the export is valid
/// JSON for an independent parser (serde_json).
#[test]
fn json_round_trip_exact() {
    let st = rich_stackup();
    st.validate().unwrap();
    let text = to_json(&st);
    let back = from_json(&text).unwrap();
    assert_eq!(back, st);
    assert_eq!(to_json(&back), text);
    let v: serde_json::Value = serde_json::from_str(&text).unwrap();
    assert_eq!(v["schema"], SCHEMA);
    assert_eq!(v["items"][0]["turns"], 41);
}

/// A first-schema file (lengths keyed with a unit suffix, `thickness_m`)
/// reads to the same stack-up as its current form; both names in one object
/// are refused, naming the old key's path.
#[test]
fn schema_1_files_still_read() {
    let good = to_json(&rich_stackup());
    let mut old = good.replace("magwright.stackup/2", "magwright.stackup/1");
    for k in [
        "strand_overall_diameter", "overall_diameter", "bare_diameter", "strand_diameter", "serving",
        "thickness", "width", "margin_left", "margin_right",
    ] {
        old = old.replace(&format!("\"{k}\":"), &format!("\"{k}_m\":"));
    }
    assert!(old.contains("\"thickness_m\":") && old.contains("\"margin_left_m\":"));
    assert_eq!(from_json(&old).unwrap(), from_json(&good).unwrap());
    let both = old.replacen("\"margin_left_m\": 0", "\"margin_left_m\": 0, \"margin_left\": 0", 1);
    assert_ne!(both, old);
    let e = from_json(&both).unwrap_err();
    assert_eq!(e.field(), Some("items[0].margin_left_m"), "{e}");
    // The old keys in a current file are unknown keys.
    assert!(from_json(&old.replace("magwright.stackup/1", "magwright.stackup/2")).is_err());
}

/// Every malformed case is an error naming the field, never a panic.
#[test]
fn json_malformed_cases_name_the_field() {
    let good = to_json(&rich_stackup());
    let case = |from: &str, to: &str| {
        assert!(good.contains(from), "{from}");
        from_json(&good.replacen(from, to, 1)).unwrap_err()
    };
    let e = case("magwright.stackup/2", "magwright.stackup/3");
    assert_eq!(e.field(), Some("schema"));
    assert!(e.message().contains("version \"3\""), "{e}");
    let e = case("\"turns\": 41", "\"turns\": \"forty-one\"");
    assert_eq!(e.field(), Some("items[0].turns"));
    assert!(e.message().contains("found a string"), "{e}");
    let e = case("\"turns\": 41", "\"turns\": -41");
    assert_eq!(e.field(), Some("items[0].turns"));
    assert!(e.message().contains("negative"), "{e}");
    let e = case("\"turns\": 41", "\"turns\": 4.5");
    assert_eq!(e.field(), Some("items[0].turns"));
    let e = case("\"turns\": 41", "\"turns\": 0");
    assert_eq!(e.field(), Some("items[0].turns"));
    let e = case("\"winding\": \"primary\"", "\"winding\": \"tertiary\"");
    assert_eq!(e.field(), Some("items[0].winding"));
    assert!(e.message().contains("tertiary"), "{e}");
    let e = case(
        "{\n      \"name\": \"aux\"\n    }",
        "{\n      \"name\": \"aux\"\n    },\n    {\"name\": \"spare\"}",
    );
    assert_eq!(e.field(), Some("windings[3]"));
    let e = case("\"kind\": \"round\"", "\"kind\": \"square\"");
    assert_eq!(e.field(), Some("items[0].conductor.kind"));
    let e = case("\"thickness\": 2.5e-5", "\"thickness\": -2.5e-5");
    assert_eq!(e.field(), Some("items[1].thickness"));
    let e = case("\"wraps\": 3", "\"wraps\": 3, \"colour\": \"yellow\"");
    assert_eq!(e.field(), Some("items[1].colour"));
    let e = case("\"direction\": \"ccw\"", "\"direction\": \"sideways\"");
    assert_eq!(e.field(), Some("items[0].direction"));
    let e = case("\"direction\": \"ccw\",", "");
    assert_eq!(e.field(), Some("items[0].direction"));
    assert!(e.message().contains("missing"), "{e}");
    let e = case("\"strands\": 105", "\"strands\": 0");
    assert_eq!(e.field(), Some("items[4].conductor.strands"));
    let e = case("\"items\": [", "\"items\": {\"x\": [");
    assert!(e.field().is_none() || e.field() == Some("items"), "{e}");
    assert!(from_json("[]").is_err());
    assert!(from_json("not json").is_err());
    // Truncations and byte damage anywhere: errors, no panic.
    for cut in (0..good.len() - 2).step_by(7) {
        if good.is_char_boundary(cut) {
            assert!(from_json(&good[..cut]).is_err());
        }
    }
    let bytes = good.as_bytes();
    for i in (0..bytes.len()).step_by(11) {
        let mut b = bytes.to_vec();
        b[i] = b'#';
        if let Ok(s) = String::from_utf8(b) {
            let _ = from_json(&s);
        }
    }
}

/// A file that no longer fits the chosen core: import says which section
/// and by how much.
#[test]
fn import_rejects_a_stackup_that_no_longer_fits() {
    let mut core = test_core();
    let st = default_stackup(
        &core,
        &[
            WindingSpec {
                name: "p".into(),
                turns: 80,
                conductor: Conductor::awg(28, Grade::G2).unwrap(),
                parallel: 1,
            },
            WindingSpec {
                name: "s".into(),
                turns: 8,
                conductor: Conductor::awg(18, Grade::G2).unwrap(),
                parallel: 2,
            },
        ],
        &Pattern::SplitPrimary,
        &DefaultOptions::default(),
    )
    .unwrap();
    let text = to_json(&st);
    assert_eq!(import(&text, &core).unwrap(), st);
    core.winding_height = 1.0e-3;
    let e = import(&text, &core).unwrap_err();
    assert!(e.field().unwrap().starts_with("items["), "{e}");
    assert!(e.message().contains("needs") && e.message().contains("left"), "{e}");
}

/// The default builder's interleaving orders (split turns: first half
/// takes the odd turn).
#[test]
fn default_stackup_patterns() {
    let core = test_core();
    let ws = [
        WindingSpec {
            name: "p".into(),
            turns: 41,
            conductor: Conductor::awg(28, Grade::G2).unwrap(),
            parallel: 1,
        },
        WindingSpec {
            name: "s".into(),
            turns: 9,
            conductor: Conductor::awg(20, Grade::G2).unwrap(),
            parallel: 1,
        },
    ];
    let order = |pat: Pattern| -> Vec<(String, u32)> {
        default_stackup(&core, &ws, &pat, &DefaultOptions::default())
            .unwrap()
            .sections()
            .map(|(_, s)| (s.winding.clone(), s.turns))
            .collect()
    };
    let v = |x: &[(&str, u32)]| x.iter().map(|(a, b)| (a.to_string(), *b)).collect::<Vec<_>>();
    assert_eq!(order(Pattern::Sequential), v(&[("p", 41), ("s", 9)]));
    assert_eq!(order(Pattern::SplitPrimary), v(&[("p", 21), ("s", 9), ("p", 20)]));
    assert_eq!(order(Pattern::SplitSecondaries), v(&[("s", 5), ("p", 41), ("s", 4)]));
    assert_eq!(
        order(Pattern::Custom(vec![(1, 3), (0, 41), (1, 6)])),
        v(&[("s", 3), ("p", 41), ("s", 6)])
    );
    assert!(default_stackup(
        &core,
        &ws,
        &Pattern::Custom(vec![(0, 41), (1, 8)]),
        &DefaultOptions::default()
    )
    .is_err());
}

/// The example in docs/stackup.md is a valid file that fits a bobbin of
/// 20 mm × 6 mm, and survives the round trip.
#[test]
fn documented_example_parses() {
    let doc = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/../docs/stackup.md")).unwrap();
    let start = doc.find("```json").expect("docs/stackup.md has a json example") + "```json".len();
    let end = start + doc[start..].find("```").unwrap();
    let st = import(&doc[start..end], &test_core()).unwrap();
    assert_eq!(st.sections().count(), 3);
    assert_eq!(from_json(&to_json(&st)).unwrap(), st);
    assert!(leakage(&test_core(), &st, "primary").unwrap() > 0.0);
    // The error quoted in the document, on a 1.0 mm winding height.
    let mut small = test_core();
    small.winding_height = 1.0e-3;
    let e = import(&doc[start..end], &small).unwrap_err();
    assert_eq!(
        e.to_string(),
        "items[4]: the secondary section needs 0.88 mm of build, 0.30 mm left"
    );
}
