//! Reference checks: cores (see each test for its source).
//!
//! Sources used here:
//! * IEC 60205 (calculation of the effective parameters of magnetic piece
//!   parts): C1 = Σ l/A, C2 = Σ l/A², le = C1²/C2, Ae = C1/C2, Ve = le·Ae, and
//!   the ring closed form. The physical basis of C1 and C2 as recalled (from
//!   memory): the equivalent ring must store the same energy for a given flux
//!   (∫B² dV = Φ²·C1) and have the same hysteresis loss, ∝ ∫B³ dV = Φ³·C2.
//! * Published effective parameters of standard sizes, **from memory**
//!   (typical of datasheets for these IEC 62317 shapes), compared within the
//!   tolerance stated at each family. They check the model and the recalled
//!   dimensions together, so the tolerance is wide where either is coarse.

use magwright_engine::core::{library, shape::ring_constants, Core, Effective, Shape};
use std::f64::consts::PI;

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}

/// IEC 60205 ring closed form against a numeric sum over many thin rings.
/// Each thin ring (radius r, width dr, height h) sees the same mmf, so
/// B(r) ∝ 1/r; then C1 = ∫B² dV / Φ² and C2 = ∫B³ dV / Φ³ (IEC 60205 basis,
/// module docs), and C1 is also the reluctance of the rings in parallel:
/// 1/C1 = Σ h·dr/(2π·r).
#[test]
fn ring_closed_form_matches_thin_ring_sum() {
    for (od, id, h) in [
        (25e-3, 15e-3, 10e-3),
        (10e-3, 6e-3, 4e-3),
        (40e-3, 10e-3, 5e-3),
    ] {
        let (r1, r2) = (0.5 * id, 0.5 * od);
        let n = 200_000;
        let dr = (r2 - r1) / n as f64;
        let (mut flux, mut b2, mut b3, mut permeance) = (0.0, 0.0, 0.0, 0.0);
        for i in 0..n {
            let r = r1 + (i as f64 + 0.5) * dr;
            let b = 1.0 / r;
            let dv = 2.0 * PI * r * h * dr;
            flux += b * h * dr;
            b2 += b * b * dv;
            b3 += b * b * b * dv;
            permeance += h * dr / (2.0 * PI * r);
        }
        let k = ring_constants(r1, r2, h);
        assert!(rel(k.c1, b2 / (flux * flux)) < 1e-8, "C1 energy");
        assert!(rel(k.c1, 1.0 / permeance) < 1e-8, "C1 permeance");
        assert!(rel(k.c2, b3 / (flux * flux * flux)) < 1e-8, "C2");
        // The library core uses the same constants.
        let c = Core::from_shape(
            "ring",
            Shape::Ring {
                outer_diameter: od,
                inner_diameter: id,
                height: h,
            },
        )
        .unwrap();
        assert!(rel(c.ae, k.ae()) < 1e-12 && rel(c.le, k.le()) < 1e-12);
    }
}

/// An E core's C1 against a hand summation of its IEC 60205 pieces, written
/// out here (E 42/21/15 dimensions of the library, mm). Pieces: centre legs
/// 2D long, F·C; outer legs 2D, (A − E)·C; yokes (E − F)/2 each, top and
/// bottom, 2·C·(B − D) for left and right together; four corners, each a
/// quarter circle of radius (w/2 + h/2)/2 with the mean adjoining area
/// (corner treatment of the engine, see core::shape docs).
#[test]
fn e_core_c1_by_hand() {
    let (a, b, c, d, e, f) = (42.0, 21.0, 15.2, 14.8, 29.5, 12.2);
    let a_centre = f * c; // 185.44 mm²
    let a_outer = (a - e) * c; // 190.0 mm²
    let a_yoke = 2.0 * c * (b - d); // 188.48 mm²
    let h = b - d; // 6.2 mm
    let l_corner_outer = 2.0 * PI / 8.0 * ((a - e) / 2.0 + h); // two corners
    let l_corner_centre = 2.0 * PI / 8.0 * (f / 2.0 + h);
    let pieces = [
        (2.0 * d, a_centre),
        (2.0 * d, a_outer),
        (e - f, a_yoke),
        (l_corner_outer, 0.5 * (a_outer + a_yoke)),
        (l_corner_centre, 0.5 * (a_centre + a_yoke)),
    ];
    let c1_mm: f64 = pieces.iter().map(|(l, ar)| l / ar).sum();
    let c2_mm: f64 = pieces.iter().map(|(l, ar)| l / (ar * ar)).sum();
    let shape = library::find("E 42/21/15").unwrap().shape.unwrap();
    let k = shape.constants().unwrap();
    assert!(
        rel(k.c1, c1_mm * 1e3) < 1e-12,
        "C1 {} vs {}",
        k.c1,
        c1_mm * 1e3
    );
    assert!(rel(k.c2, c2_mm * 1e9) < 1e-12, "C2");
    assert!(
        rel(k.amin, a_centre * 1e-6) < 1e-12,
        "Amin is the centre leg here"
    );
    // Window: (E − F)/2 × 2D.
    let core = library::find("E 42/21/15").unwrap();
    assert!(rel(core.window_area, (e - f) / 2.0 * 2.0 * d * 1e-6) < 1e-12);
    // Ferrite volume of the pair: two halves, each the block A·B·C less its
    // two windows (E − F)/2 × D × C (elementary geometry); mass at
    // 4800 kg/m³ (typical MnZn, from memory).
    let vol_mm3 = 2.0 * (a * b * c - 2.0 * (e - f) / 2.0 * d * c);
    assert!(rel(core.volume, vol_mm3 * 1e-9) < 1e-12, "volume");
    assert!(rel(core.mass, vol_mm3 * 1e-9 * 4800.0) < 1e-12, "mass");
    // Surface: the box A × 2B × C.
    let s_mm2 = 2.0 * (a * 2.0 * b + a * c + 2.0 * b * c);
    assert!(rel(core.surface_area, s_mm2 * 1e-6) < 1e-12, "surface");
}

/// Every library core against the published effective parameters of its
/// designation (`core::library::PUBLISHED`: the makers' IEC 60205 values of
/// the IEC 62317 size, **from memory**, no maker named). Prints the table
/// (run with `--nocapture`), then:
/// * each core in `CHECKED` has Ae, le and Ve within 3 % (the brief's bound);
/// * every other core is one whose computed values miss by more than 3 %,
///   and it says "unconfirmed" at the start of its provenance (shown by the
///   page's library browser). They are left out of the 3 % assertion for the
///   stated reason: their recalled dimensions are tolerance limits (the
///   maximum of A, C and F) rather than the tolerance means IEC 60205 uses;
///   where a published drawing gave the tolerances (ETD 29, E 13/7/4) the
///   means bring the core within 0.3 %. The fix is the means of the IEC 62317
///   tables, not a nudge of the dimensions towards the number.
#[test]
fn every_core_against_published_effective_parameters() {
    const CHECKED: [&str; 26] = [
        "R 10/6/4",
        "R 12.5/7.5/5",
        "R 16/9.6/6.3",
        "R 20/10/7",
        "R 25/15/10",
        "R 29.5/19/14.9",
        "R 36/23/15",
        "R 40/24/16",
        "E 13/7/4",
        "E 55/28/21",
        "EFD 15/8/5",
        "EFD 20/10/7",
        "EFD 25/13/9",
        "EFD 30/15/9",
        "ETD 29",
        "ETD 54",
        "E 18/4/10",
        "E 18/4/10 + PLT 18/10/2",
        "E 22/6/16",
        "E 22/6/16 + PLT 22/16/2.5",
        "E 32/6/20",
        "E 32/6/20 + PLT 32/20/3.2",
        "E 38/8/25",
        "E 38/8/25 + PLT 38/25/3.8",
        "E 43/10/28",
        "E 43/10/28 + PLT 43/28/4.1",
    ];
    println!(
        "{:28} {:>8} {:>8} {:>6} | {:>7} {:>7} {:>6} | {:>8} {:>8} {:>6}",
        "core", "Ae mm²", "publ.", "diff", "le mm", "publ.", "diff", "Ve mm³", "publ.", "diff"
    );
    let mut unconfirmed = Vec::new();
    let mut wrong = Vec::new();
    for lib in library::all() {
        let p = library::published(&lib.designation)
            .unwrap_or_else(|| panic!("{}: no published values in the table", lib.designation));
        // What the dimensions give (IEC 60205 method), before an unconfirmed
        // core adopts the published values.
        let shape = lib.shape.clone().unwrap_or_else(|| panic!("{}: a library core has a shape", lib.designation));
        let c = &Core::from_shape(&lib.designation, shape).unwrap();
        let d = [rel_signed(c.ae, p.ae), rel_signed(c.le, p.le), rel_signed(c.ve, p.ve)];
        println!(
            "{:28} {:8.2} {:8.2} {:+5.1}% | {:7.2} {:7.2} {:+5.1}% | {:8.0} {:8.0} {:+5.1}%",
            c.designation,
            c.ae * 1e6,
            p.ae * 1e6,
            d[0] * 100.0,
            c.le * 1e3,
            p.le * 1e3,
            d[1] * 100.0,
            c.ve * 1e9,
            p.ve * 1e9,
            d[2] * 100.0
        );
        let within = d.iter().all(|x| x.abs() <= 0.03);
        let a = library::agreement(&c.designation).unwrap();
        assert_eq!(a.confirmed, within, "{}", c.designation);
        if CHECKED.contains(&c.designation.as_str()) {
            if !within {
                wrong.push(format!("{}: {d:?} beyond 3 %", c.designation));
            }
            assert!(!within || lib.provenance.starts_with("checked"), "{}", lib.provenance);
        } else {
            if within {
                wrong.push(format!("{} now agrees: add it to CHECKED", c.designation));
            }
            assert!(within || lib.provenance.starts_with("unconfirmed"), "{}", lib.provenance);
            // An unconfirmed core designs with the published Ae and le
            // (Ve = le·Ae, IEC 60205), Amin scaled with Ae: the flux density
            // and core loss never rest on dimensions in doubt.
            assert!((lib.ae - p.ae).abs() <= 1e-12 * p.ae && (lib.le - p.le).abs() <= 1e-12 * p.le, "{}", lib.designation);
            assert!((lib.ve - p.ae * p.le).abs() <= 1e-12 * lib.ve, "{}", lib.designation);
            assert!((lib.amin / lib.ae - c.amin / c.ae).abs() <= 1e-12, "{}", lib.designation);
            unconfirmed.push(c.designation.clone());
        }
    }
    println!("unconfirmed ({}): {}", unconfirmed.len(), unconfirmed.join(", "));
    assert!(wrong.is_empty(), "{}", wrong.join("; "));
}

fn rel_signed(got: f64, want: f64) -> f64 {
    got / want - 1.0
}

/// Where a published drawing gave the tolerance limits, IEC 60205 on the
/// tolerance means reproduces the published values closely: ETD 29 (round
/// leg, the per-family corner) and E 13/7/4 (rectangular legs), both within
/// 1 %, and C1 = Σ l/A of ETD 29 within 1 % of the published 0.947 mm⁻¹
/// (from memory, seen again in a published table while writing this).
#[test]
fn tolerance_means_reproduce_published_values() {
    for (name, ae, le, ve) in [("ETD 29", 76.0, 72.0, 5470.0), ("E 13/7/4", 12.4, 29.7, 369.0)] {
        let c = library::find(name).unwrap();
        assert!(rel(c.ae * 1e6, ae) < 0.01, "{name} Ae {}", c.ae * 1e6);
        assert!(rel(c.le * 1e3, le) < 0.01, "{name} le {}", c.le * 1e3);
        assert!(rel(c.ve * 1e9, ve) < 0.01, "{name} Ve {}", c.ve * 1e9);
    }
    let k = library::find("ETD 29").unwrap().shape.unwrap().constants().unwrap();
    assert!(rel(k.c1 * 1e-3, 0.947) < 0.01, "C1 {}", k.c1 * 1e-3);
}

/// IEC 60205 identities on every library core: Ve = le·Ae; Ae ≥ Amin for a
/// series chain of pieces (Ae is a mean of the piece areas weighted by
/// l/A²). A ring is not a series chain: its IEC Ae lies below its section
/// h·(r2 − r1), and above h·r1·ln(r2/r1) (the flux over the inner-edge B).
#[test]
fn iec60205_identities_hold_for_every_core() {
    for c in library::all() {
        assert!(
            c.ae.is_finite() && c.ae > 0.0 && c.le.is_finite() && c.le > 0.0,
            "{}",
            c.designation
        );
        assert!(rel(c.ve, c.le * c.ae) < 1e-12, "{}", c.designation);
        match c.shape {
            Some(Shape::Ring {
                inner_diameter,
                outer_diameter,
                height,
            }) => {
                let (r1, r2) = (0.5 * inner_diameter, 0.5 * outer_diameter);
                assert!(c.ae < c.amin, "{}", c.designation);
                assert!(c.ae > height * r1 * (r2 / r1).ln(), "{}", c.designation);
            }
            _ => assert!(
                c.ae >= c.amin * (1.0 - 1e-12),
                "{}: Ae < Amin",
                c.designation
            ),
        }
    }
}

/// No NaN, infinity, zero or negative value in any library core; bobbin
/// inside the window (common practice: the bobbin takes part of the window).
#[test]
fn every_library_core_is_finite_and_consistent() {
    let lib = library::all();
    assert!(lib.len() >= 40);
    for c in lib {
        let v = [
            c.ae,
            c.le,
            c.ve,
            c.amin,
            c.window_area,
            c.window_height,
            c.winding_breadth,
            c.winding_height,
            c.turn_length_inner,
            c.surface_area,
            c.volume,
            c.mass,
            c.mlt_mid(),
        ];
        assert!(
            v.iter().all(|x| x.is_finite() && *x > 0.0),
            "{}: {v:?}",
            c.designation
        );
        assert!(
            c.winding_breadth * c.winding_height <= c.window_area * (1.0 + 1e-12),
            "{}",
            c.designation
        );
        assert!(!c.provenance.is_empty() && c.provenance.contains("memory") || c.family == "Ring");
        if c.family != "Ring" {
            assert!(c.winding_breadth < c.window_height, "{}", c.designation);
            // Isoperimetric inequality: a turn around a leg of section A is
            // at least 2·√(π·A) long.
            assert!(
                c.turn_length_inner >= 2.0 * (PI * c.amin).sqrt(),
                "{}",
                c.designation
            );
        }
    }
}

/// Dimensions of a shape by name (serde field names), for comparisons.
fn dims(s: &Shape) -> Vec<(String, f64)> {
    let v = serde_json::to_value(s).unwrap();
    v.as_object()
        .unwrap()
        .iter()
        .filter_map(|(k, x)| x.as_f64().map(|f| (k.clone(), f)))
        .collect()
}

/// Monotonic sanity: in a family, a core with every dimension at least as
/// large (one strictly larger) has a larger Ve, mass and window; and the ETD
/// and E series grow in Ae with size.
#[test]
fn bigger_core_bigger_parameters() {
    let lib = library::all();
    let mut pairs = 0;
    for a in lib {
        for b in lib {
            let (Some(sa), Some(sb)) = (a.shape, b.shape) else {
                continue;
            };
            if a.family != b.family || std::mem::discriminant(&sa) != std::mem::discriminant(&sb) {
                continue;
            }
            if matches!((sa, sb), (Shape::PlanarE { plate: p, .. }, Shape::PlanarE { plate: q, .. }) if p.is_some() != q.is_some())
            {
                continue;
            }
            let (da, db) = (dims(&sa), dims(&sb));
            let ge = da
                .iter()
                .zip(&db)
                .all(|((ka, x), (kb, y))| ka == kb && x >= y);
            let gt = da.iter().zip(&db).any(|((_, x), (_, y))| x > y);
            if ge && gt {
                pairs += 1;
                assert!(a.ve > b.ve, "{} vs {}", a.designation, b.designation);
                assert!(a.mass > b.mass, "{} vs {}", a.designation, b.designation);
                assert!(
                    a.window_area >= b.window_area,
                    "{} vs {}",
                    a.designation,
                    b.designation
                );
            }
        }
    }
    assert!(pairs > 30, "only {pairs} comparable pairs");
    for fam in ["ETD", "E", "Pot", "EFD"] {
        let list = library::by_family(fam).unwrap();
        for w in list.windows(2) {
            assert!(
                w[1].ae > w[0].ae,
                "{} vs {}",
                w[1].designation,
                w[0].designation
            );
        }
    }
}

/// `from_shape` rejects bad dimensions and names the field.
#[test]
fn from_shape_rejects_bad_dimensions() {
    let good = Shape::Etd {
        a: 34.2e-3,
        b: 17.3e-3,
        c: 11.1e-3,
        d: 11.8e-3,
        e: 25.6e-3,
        f: 10.8e-3,
    };
    assert!(Core::from_shape("ETD 34", good).is_ok());
    let cases = [
        (
            Shape::Etd {
                a: 34.2e-3,
                b: 17.3e-3,
                c: 11.1e-3,
                d: 11.8e-3,
                e: 25.6e-3,
                f: 26.0e-3,
            },
            "shape.f",
        ),
        (
            Shape::Etd {
                a: 20.0e-3,
                b: 17.3e-3,
                c: 11.1e-3,
                d: 11.8e-3,
                e: 25.6e-3,
                f: 10.8e-3,
            },
            "shape.e",
        ),
        (
            Shape::Etd {
                a: 34.2e-3,
                b: 17.3e-3,
                c: 9.0e-3,
                d: 11.8e-3,
                e: 25.6e-3,
                f: 10.8e-3,
            },
            "shape.f",
        ),
        (
            Shape::Etd {
                a: 34.2e-3,
                b: -1.0,
                c: 11.1e-3,
                d: 11.8e-3,
                e: 25.6e-3,
                f: 10.8e-3,
            },
            "shape.b",
        ),
        (
            Shape::E {
                a: 25e-3,
                b: 12.8e-3,
                c: 7.5e-3,
                d: 13e-3,
                e: 17.5e-3,
                f: 7.5e-3,
            },
            "shape.d",
        ),
        (
            Shape::Ring {
                outer_diameter: 25e-3,
                inner_diameter: 25e-3,
                height: 10e-3,
            },
            "shape.inner_diameter",
        ),
        (
            Shape::Ring {
                outer_diameter: 25e-3,
                inner_diameter: 15e-3,
                height: f64::INFINITY,
            },
            "shape.height",
        ),
        (
            Shape::Pot {
                d1: 18e-3,
                d2: 14.9e-3,
                d3: 15e-3,
                d4: 3e-3,
                h1: 10.6e-3,
                h2: 7.2e-3,
                slot_width: 2e-3,
            },
            "shape.d3",
        ),
        (
            Shape::Pot {
                d1: 18e-3,
                d2: 14.9e-3,
                d3: 7.5e-3,
                d4: 3e-3,
                h1: 7e-3,
                h2: 7.2e-3,
                slot_width: 2e-3,
            },
            "shape.h2",
        ),
        (
            Shape::Rm {
                a: 27.8e-3,
                b: 9.3e-3,
                c: 18e-3,
                d: 6.35e-3,
                e: 21.2e-3,
                f: 10.9e-3,
                g: 12e-3,
                hole: 11e-3,
            },
            "shape.hole",
        ),
    ];
    for (s, field) in cases {
        let e = Core::from_shape("x", s).unwrap_err();
        assert_eq!(e.field(), Some(field), "{s:?}: {e}");
        assert!(!e.message().is_empty());
    }
    assert_eq!(
        Core::from_shape(" ", good).unwrap_err().field(),
        Some("designation")
    );
}

fn datasheet() -> Effective {
    // A plausible mid-size E-type core, values of our own.
    Effective {
        family: "E".into(),
        ae: 97e-6,
        le: 79e-3,
        ve: None,
        amin: Some(92e-6),
        window_area: 170e-6,
        window_height: Some(23.6e-3),
        winding_breadth: 21e-3,
        winding_height: 6.2e-3,
        turn_length_inner: 42e-3,
        surface_area: 3900e-6,
        mass: None,
    }
}

/// `from_effective` keeps the given values, fills Ve = le·Ae (IEC 60205) and
/// rejects inconsistent data naming the field.
#[test]
fn from_effective_validates() {
    let c = Core::from_effective("my core", &datasheet()).unwrap();
    assert!(rel(c.ve, 97e-6 * 79e-3) < 1e-12 && c.amin == 92e-6 && c.shape.is_none());
    assert!(rel(c.mass, c.ve * 4800.0) < 1e-12);
    let bad = |f: fn(&mut Effective), field: &str| {
        let mut p = datasheet();
        f(&mut p);
        let e = Core::from_effective("x", &p).unwrap_err();
        assert_eq!(e.field(), Some(field), "{e}");
    };
    bad(|p| p.ae = 0.0, "ae");
    bad(|p| p.le = f64::NAN, "le");
    bad(|p| p.ve = Some(2.0 * 97e-6 * 79e-3), "ve");
    bad(|p| p.amin = Some(200e-6), "amin");
    bad(|p| p.winding_height = 20e-3, "winding_height");
    bad(|p| p.window_height = Some(10e-3), "window_height");
    bad(|p| p.turn_length_inner = 20e-3, "turn_length_inner");
    bad(|p| p.surface_area = -1.0, "surface_area");
    bad(|p| p.mass = Some(0.0), "mass");
}

/// The Core (with its shape) survives JSON, so a design file can carry it.
#[test]
fn core_json_round_trip() {
    let c = library::find("PQ 26/25").unwrap();
    let j = serde_json::to_string(&c).unwrap();
    let back: Core = serde_json::from_str(&j).unwrap();
    // serde_json may round the last bit of a float: compare within 1e-12.
    assert_eq!(back.designation, c.designation);
    assert_eq!(back.shape.is_some(), c.shape.is_some());
    for (x, y) in [
        (back.ae, c.ae),
        (back.le, c.le),
        (back.amin, c.amin),
        (back.mass, c.mass),
    ] {
        assert!(rel(x, y) < 1e-12);
    }
}

/// The bobbin rule (common practice, no source: flanges 0.055 × window
/// height, wall 0.15 × window width, clamped) against a typical ETD 34
/// bobbin, breadth ≈ 20.9 mm and height ≈ 6.3 mm (from memory, 10 %); and
/// the mass at 4800 kg/m³ against a typical ETD 34 set of ≈ 40 g (from
/// memory, 15 %).
#[test]
fn etd34_bobbin_and_mass_near_typical() {
    let c = library::find("ETD 34").unwrap();
    assert!(
        rel(c.winding_breadth * 1e3, 20.9) < 0.10,
        "{}",
        c.winding_breadth
    );
    assert!(
        rel(c.winding_height * 1e3, 6.3) < 0.10,
        "{}",
        c.winding_height
    );
    assert!(rel(c.mass * 1e3, 40.0) < 0.15, "{}", c.mass);
    // MLT grows by 2π per metre of build (core::Core::turn_length_at).
    assert!(
        rel(
            c.turn_length_at(1e-3) - c.turn_length_at(0.0),
            2.0 * PI * 1e-3
        ) < 1e-12
    );
}
