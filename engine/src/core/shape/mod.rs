//! Core shapes: dimensions in, IEC 60205 effective parameters and window out.
//!
//! # The method (IEC 60205)
//!
//! IEC 60205 reduces a core of non-uniform section to an equivalent ring of
//! uniform section. The magnetic path is cut into pieces of length lᵢ and
//! area Aᵢ carrying the same flux in series, and two core constants are summed:
//!
//! * C1 = Σ lᵢ/Aᵢ (it sets the reluctance: the B² energy integral),
//! * C2 = Σ lᵢ/Aᵢ² (it sets the B³ hysteresis-loss integral).
//!
//! The equivalent ring then has le = C1²/C2, Ae = C1/C2, Ve = le·Ae.
//! Amin is the smallest section the flux must pass. Because Ae is a weighted
//! mean of the piece areas (weights lᵢ/Aᵢ²), Ae ≥ Amin for any series chain.
//!
//! # Conventions used here (read before changing a formula)
//!
//! * All areas are *total* areas carried by the whole flux: an E core's two
//!   outer legs are one piece of area 2·(outer-leg area); its left and right
//!   yokes are one piece of area 2·C·h. Left and right halves of the window
//!   are magnetically in parallel and symmetric, so this is exact for the
//!   sums.
//! * Legs are counted between the inner faces of the yokes (length = window
//!   height), yokes between the faces of the legs (length (E − F)/2 each).
//! * **Corners, one rule per family kind.** Where a leg meets a yoke of
//!   height h the flux turns along a quarter circle whose radius is the mean
//!   of the middle of the flux in the leg (depth s below the leg face the
//!   flux crosses) and the middle of the yoke (h/2): l = (π/8)·(2s + h)
//!   (`etype::corner_length`), with the mean of the two adjoining areas.
//!   IEC 60205 measures s per family (as recalled, from memory); so do we:
//!   - rectangular legs (E, EFD, planar E and E + PLT, module `etype`):
//!     s = w/2 for a leg of width w, i.e. the standard's E-core corner
//!     l = (π/8)·(w + h). The centre leg's w is F/2 (half the flux turns
//!     each way), also for the flat EFD leg whatever its thickness K: its
//!     width along the yoke is F. (An earlier equivalent width F·K/(2·C)
//!     shrank the EFD corners and left EFD le 4–5 % short of the published
//!     values; with F/2 all four sizes agree within 2 %.) The outer legs' w
//!     is one leg's area over C, exactly (A − E)/2 for a plain E core;
//!   - round centre legs (ETD, ER, PQ, RM, EP, module `round`): s is the
//!     depth of the chord that halves the half-leg feeding each side
//!     (`round::half_area_depth`, ≈ 0.596·F/2 for a solid leg), the
//!     round-leg counterpart of the pot core's half-area radius; the earlier
//!     equivalent-width corner put the turn too close to the surface (ETD le
//!     2–3 % short);
//!   - pot cores (module `pot`): s from the radii that halve the post's and
//!     the wall's areas, √((r3² + r4²)/2) and √((r1² + r2²)/2).
//! * **Pot cores:** centre post and outer wall as legs, the base plates as a
//!   radial yoke of thickness h from the post radius r3 to the wall radius r2
//!   in closed form (C1 += ln(r2/r3)/(2π·h), C2 += (1/r3 − 1/r2)/(4π²·h²) per
//!   plate: the series sum of thin cylindrical shells).
//! * **Ring:** closed form of IEC 60205 (see [`ring_constants`]).
//!
//! Approximations stated per family on each [`Shape`] variant.
//!
//! # Window, bobbin and the rest (common practice, no source)
//!
//! The window area is the core's: (E − F)/2 × window height for E types,
//! (r2 − r3) × H2 for pot cores, π·r1² for a ring. The bobbin is not in
//! IEC 62317; we subtract typical wall and flange thicknesses, scaled with
//! the window and clamped (common practice, no source):
//!
//! * flange (each end) t_f = 0.055 × window height, clamped to 0.4 … 2.0 mm;
//! * tube wall at the centre leg t_w = 0.15 × window width, clamped to
//!   0.2 … 1.5 mm (it also stands for the clearance at the outer leg).
//!
//! Winding breadth = window height − 2·t_f, winding height = window width −
//! t_w, and the first turn lies at t_w from the centre leg: for a round leg
//! of diameter F the turn is π·(F + 2·t_w), for a rectangular leg X × Y it
//! is the rounded rectangle 2·(X + Y) + 2π·t_w. At ETD 34 these rules give
//! about 1.3 mm flanges and 1.1 mm wall, close to typical bobbins (from memory).
//!
//! Outer surface (thermal model): the bounding box of the assembled set for
//! E types (the window openings on the faces count as filled by the
//! winding), the cylinder for pot cores, the exact surface for a ring.
//! Physical volume: yoke plates plus legs. Mass = volume × 4800 kg/m³, a
//! typical MnZn ferrite density (typical, from memory; use your supplier's
//! data).

use crate::error::{non_negative, positive, Error, Result};
use serde::{Deserialize, Serialize};
use std::f64::consts::PI;

mod etype;
mod pot;
mod ring;
mod round;

pub use ring::ring_constants;
use etype::rect_e;
use pot::pot;
use round::{block_outer_area, round_e};

/// Density of a typical MnZn ferrite, kg/m³ (typical, from memory).
pub const FERRITE_DENSITY: f64 = 4800.0;

/// The dimensions of a core set, metres.
///
/// Serialised with a `family` tag, e.g.
/// `{"family": "etd", "a": 0.0342, "b": 0.0173, ...}`. Single letters are the
/// IEC 62317 dimension letters of that family (as recalled, from memory);
/// each field says what it measures. "Half" means one core half: a set is
/// two halves (or one half and a plate).
///
/// Common letters of the E-type families:
/// A overall width across the outer legs, B height of one half, C depth
/// (the core's thickness, perpendicular to the window), D window height in
/// one half (from the yoke's inner face to the leg's end), E window span
/// (distance between the inner faces of the outer legs, or the diameter of a
/// round window), F centre-leg width (or diameter, if round).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "family", rename_all = "snake_case", deny_unknown_fields)]
pub enum Shape {
    /// Ring (toroid), rectangular section, no chamfer.
    /// Exact IEC 60205 closed form; the edge chamfer of real rings (which
    /// lowers Ae by a few percent) is ignored.
    Ring {
        /// Outer diameter (IEC 62317 style "D1"), m.
        outer_diameter: f64,
        /// Inner diameter ("D2"), m.
        inner_diameter: f64,
        /// Height ("H"), m.
        height: f64,
    },
    /// E core pair (E, EE, EF): rectangular centre leg F × C, rectangular
    /// outer legs (A − E)/2 × C. Model: the IEC 60205 E-core pieces (from
    /// memory) with the corner treatment of the module docs.
    E {
        a: f64,
        b: f64,
        c: f64,
        d: f64,
        e: f64,
        f: f64,
    },
    /// EFD pair: flat rectangular centre leg F (width) × K (thickness, along
    /// the depth, K ≤ C). Simplification: the centre leg is taken centred in
    /// the depth (in the real core it is offset); the corner at the centre
    /// leg uses its width along the yoke, F/2 (module docs).
    Efd {
        a: f64,
        b: f64,
        c: f64,
        d: f64,
        e: f64,
        f: f64,
        k: f64,
    },
    /// ETD pair: round centre leg of diameter F; the outer legs' inner faces
    /// are cylinders of diameter E concentric with it, so each outer leg's
    /// section is the A × C rectangle outside that circle (exact area).
    /// Yoke taken as a rectangle of depth C and height B − D.
    Etd {
        a: f64,
        b: f64,
        c: f64,
        d: f64,
        e: f64,
        f: f64,
    },
    /// ER pair: same model and letters as ETD (round centre leg, outer legs
    /// with cylindrical inner faces of diameter E).
    Er {
        a: f64,
        b: f64,
        c: f64,
        d: f64,
        e: f64,
        f: f64,
    },
    /// PQ pair. Plan: an A × C block; the window is a circle of diameter E
    /// around the round centre leg F, opened to both faces by a slot of
    /// width G (measured along A). Outer-leg area is exact for that plan.
    /// Simplification: the yoke (in the real core a shaped plate in which the
    /// flux spreads radially) is taken as a rectangle of depth C and height
    /// B − D, i.e. an equivalent rectangular section.
    Pq {
        a: f64,
        b: f64,
        c: f64,
        d: f64,
        e: f64,
        f: f64,
        g: f64,
    },
    /// RM pair. Simplification: treated with the PQ plan (A × C block, round
    /// window E, two slots G, round centre leg F with an optional hole), i.e.
    /// the RM outer legs and the squarish yoke become equivalent rectangular
    /// sections; the chamfered corners of the real RM plan are not modelled,
    /// so C should be taken as the effective depth of the legs. Coarse.
    Rm {
        a: f64,
        b: f64,
        c: f64,
        d: f64,
        e: f64,
        f: f64,
        g: f64,
        /// Diameter of the hole through the centre leg (0 if none), m.
        #[serde(default)]
        hole: f64,
    },
    /// Pot core pair. `d1` outer diameter, `d2` inner diameter of the outer
    /// wall, `d3` centre-post diameter, `d4` centre-hole diameter (0 if
    /// none), `h1` height of the pair, `h2` window height of the pair,
    /// `slot_width` width of each of the two wire slots in the wall.
    /// Model: radial yoke in closed form (module docs); the slots remove
    /// their share of the wall; the slots' effect on the plates is ignored.
    Pot {
        d1: f64,
        d2: f64,
        d3: f64,
        d4: f64,
        h1: f64,
        h2: f64,
        slot_width: f64,
    },
    /// EP pair. Simplification: the PQ plan with one slot of width G (the
    /// window opens to one face only); the centre leg is taken centred in the
    /// block (in the real core it is offset towards the back).
    Ep {
        a: f64,
        b: f64,
        c: f64,
        d: f64,
        e: f64,
        f: f64,
        g: f64,
    },
    /// Planar E: low E halves, rectangular centre leg F × C. With
    /// `plate: None` two E halves (E + E); with `plate: Some(t)` one E half
    /// and a flat plate of thickness t (E + PLT), whose window is D high.
    /// Same pieces and corner treatment as [`Shape::E`].
    PlanarE {
        a: f64,
        b: f64,
        c: f64,
        d: f64,
        e: f64,
        f: f64,
        #[serde(default)]
        plate: Option<f64>,
    },
}

/// IEC 60205 core constants of one shape.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Constants {
    /// C1 = Σ l/A, 1/m.
    pub c1: f64,
    /// C2 = Σ l/A², 1/m³.
    pub c2: f64,
    /// Smallest section along the path, m².
    pub amin: f64,
}

impl Constants {
    /// le = C1²/C2 (IEC 60205).
    pub fn le(&self) -> f64 {
        self.c1 * self.c1 / self.c2
    }
    /// Ae = C1/C2 (IEC 60205).
    pub fn ae(&self) -> f64 {
        self.c1 / self.c2
    }
    /// Ve = le·Ae = C1³/C2² (IEC 60205).
    pub fn ve(&self) -> f64 {
        self.le() * self.ae()
    }
}

/// Everything [`super::Core::from_shape`] needs besides the constants.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Geometry {
    pub constants: Constants,
    pub window_area: f64,
    pub window_height: f64,
    pub winding_breadth: f64,
    pub winding_height: f64,
    pub turn_length_inner: f64,
    pub surface_area: f64,
    pub volume: f64,
}

/// Sums of IEC 60205 pieces.
struct Chain {
    c1: f64,
    c2: f64,
    amin: f64,
}

impl Chain {
    fn new() -> Self {
        Chain {
            c1: 0.0,
            c2: 0.0,
            amin: f64::INFINITY,
        }
    }
    /// A leg or yoke piece: counts towards Amin.
    fn piece(&mut self, l: f64, a: f64) {
        self.corner(l, a);
        self.amin = self.amin.min(a);
    }
    /// A corner piece (mean area): not a physical section, no Amin.
    fn corner(&mut self, l: f64, a: f64) {
        self.c1 += l / a;
        self.c2 += l / (a * a);
    }
    fn done(self) -> Constants {
        Constants {
            c1: self.c1,
            c2: self.c2,
            amin: self.amin,
        }
    }
}

/// Typical bobbin: (winding breadth, winding height, wall t_w) for a window
/// of height `hw` and width `ww` (common practice, no source; module docs).
fn bobbin(hw: f64, ww: f64) -> (f64, f64, f64) {
    let t_f = (0.055 * hw).clamp(0.4e-3, 2.0e-3);
    let t_w = (0.15 * ww).clamp(0.2e-3, 1.5e-3);
    (hw - 2.0 * t_f, ww - t_w, t_w)
}

/// Named-field check helpers: errors say `shape.<field>`.
fn pos(field: &str, v: f64) -> Result<f64> {
    // Check first: the field name is only formatted on error (no allocation
    // on the good path).
    if v.is_finite() && v > 0.0 {
        Ok(v)
    } else {
        positive(&format!("shape.{field}"), v, "m")
    }
}

fn less(small: (&str, f64), big: (&str, f64), what: &str) -> Result<()> {
    if small.1 < big.1 {
        Ok(())
    } else {
        Err(Error::input(
            &format!("shape.{}", small.0),
            format!(
                "{} ({} mm) must be smaller than {} ({} mm): {what}",
                small.0,
                small.1 * 1e3,
                big.0,
                big.1 * 1e3
            ),
        ))
    }
}

fn not_more(small: (&str, f64), big: (&str, f64), what: &str) -> Result<()> {
    if small.1 <= big.1 {
        Ok(())
    } else {
        Err(Error::input(
            &format!("shape.{}", small.0),
            format!(
                "{} ({} mm) must not exceed {} ({} mm): {what}",
                small.0,
                small.1 * 1e3,
                big.0,
                big.1 * 1e3
            ),
        ))
    }
}

/// Common checks of the E-type letters A > E > F, B > D, all positive.
fn check_etype(a: f64, b: f64, c: f64, d: f64, e: f64, f: f64) -> Result<()> {
    for (n, v) in [("a", a), ("b", b), ("c", c), ("d", d), ("e", e), ("f", f)] {
        pos(n, v)?;
    }
    less(
        ("e", e),
        ("a", a),
        "the window span lies inside the overall width",
    )?;
    less(
        ("f", f),
        ("e", e),
        "the centre leg must be narrower than the window span",
    )?;
    less(
        ("d", d),
        ("b", b),
        "the window height of a half must leave a yoke",
    )?;
    Ok(())
}

/// Rejects a yoke or outer leg that the dimensions make non-positive.
fn check_area(field: &str, area: f64, what: &str) -> Result<()> {
    if area.is_finite() && area > 0.0 {
        Ok(())
    } else {
        Err(Error::input(
            &format!("shape.{field}"),
            format!("these dimensions leave no {what}"),
        ))
    }
}

impl Shape {
    /// The family's one name: the file's `family` tag, written as the
    /// library and the page show it (the same name with case, spaces and
    /// underscores ignored: "Ring" is `ring`, "Planar E" is `planar_e`).
    pub fn family(&self) -> &'static str {
        match self {
            Shape::Ring { .. } => "Ring",
            Shape::E { .. } => "E",
            Shape::Efd { .. } => "EFD",
            Shape::Etd { .. } => "ETD",
            Shape::Er { .. } => "ER",
            Shape::Pq { .. } => "PQ",
            Shape::Rm { .. } => "RM",
            Shape::Pot { .. } => "Pot",
            Shape::Ep { .. } => "EP",
            Shape::PlanarE { .. } => "Planar E",
        }
    }

    /// IEC 60205 constants (validates the dimensions first).
    pub fn constants(&self) -> Result<Constants> {
        Ok(self.geometry()?.constants)
    }

    /// Validates the dimensions and computes constants, window, bobbin,
    /// mean turn length, surface and volume. Errors name the field (`shape.f`).
    pub fn geometry(&self) -> Result<Geometry> {
        let g = match *self {
            Shape::Ring {
                outer_diameter,
                inner_diameter,
                height,
            } => {
                pos("outer_diameter", outer_diameter)?;
                pos("inner_diameter", inner_diameter)?;
                pos("height", height)?;
                less(
                    ("inner_diameter", inner_diameter),
                    ("outer_diameter", outer_diameter),
                    "a ring needs a hole",
                )?;
                let (r1, r2, h) = (0.5 * inner_diameter, 0.5 * outer_diameter, height);
                Geometry {
                    constants: ring_constants(r1, r2, h),
                    window_area: PI * r1 * r1,
                    // A ring has no window height; its height stands in.
                    window_height: h,
                    // One layer along the inner circumference; radial build
                    // up to half the hole radius, leaving the centre open for
                    // the winding shuttle (common practice, no source).
                    winding_breadth: 2.0 * PI * r1,
                    winding_height: 0.5 * r1,
                    // A turn on the bare core: perimeter of the section.
                    turn_length_inner: 2.0 * (r2 - r1) + 2.0 * h,
                    surface_area: 2.0 * PI * (r1 + r2) * h + 2.0 * PI * (r2 * r2 - r1 * r1),
                    volume: PI * (r2 * r2 - r1 * r1) * h,
                }
            }
            Shape::E { a, b, c, d, e, f } => {
                check_etype(a, b, c, d, e, f)?;
                rect_e(a, b, c, d, e, f, f * c, 2.0 * (f + c), Some(d), b - d)?
            }
            Shape::PlanarE {
                a,
                b,
                c,
                d,
                e,
                f,
                plate,
            } => {
                check_etype(a, b, c, d, e, f)?;
                match plate {
                    None => rect_e(a, b, c, d, e, f, f * c, 2.0 * (f + c), Some(d), b - d)?,
                    Some(t) => {
                        pos("plate", t)?;
                        rect_e(a, b, c, d, e, f, f * c, 2.0 * (f + c), None, t)?
                    }
                }
            }
            Shape::Efd {
                a,
                b,
                c,
                d,
                e,
                f,
                k,
            } => {
                check_etype(a, b, c, d, e, f)?;
                pos("k", k)?;
                not_more(
                    ("k", k),
                    ("c", c),
                    "the flat centre leg lies inside the depth",
                )?;
                rect_e(a, b, c, d, e, f, f * k, 2.0 * (f + k), Some(d), b - d)?
            }
            Shape::Etd { a, b, c, d, e, f } | Shape::Er { a, b, c, d, e, f } => {
                check_etype(a, b, c, d, e, f)?;
                not_more(
                    ("f", f),
                    ("c", c),
                    "the round centre leg must fit in the depth",
                )?;
                let a_outer = block_outer_area(a, c, e, 0.0, 0);
                round_e(a, b, c, d, e, f, 0.0, a_outer)?
            }
            Shape::Pq {
                a,
                b,
                c,
                d,
                e,
                f,
                g,
            }
            | Shape::Ep {
                a,
                b,
                c,
                d,
                e,
                f,
                g,
            } => {
                check_etype(a, b, c, d, e, f)?;
                not_more(
                    ("f", f),
                    ("c", c),
                    "the round centre leg must fit in the depth",
                )?;
                non_negative("shape.g", g, "m")?;
                less(
                    ("g", g),
                    ("e", e),
                    "the slot must be narrower than the window",
                )?;
                let slots = if matches!(self, Shape::Pq { .. }) {
                    2
                } else {
                    1
                };
                let a_outer = block_outer_area(a, c, e, g, slots);
                round_e(a, b, c, d, e, f, 0.0, a_outer)?
            }
            Shape::Rm {
                a,
                b,
                c,
                d,
                e,
                f,
                g,
                hole,
            } => {
                check_etype(a, b, c, d, e, f)?;
                not_more(
                    ("f", f),
                    ("c", c),
                    "the round centre leg must fit in the depth",
                )?;
                non_negative("shape.g", g, "m")?;
                less(
                    ("g", g),
                    ("e", e),
                    "the slot must be narrower than the window",
                )?;
                non_negative("shape.hole", hole, "m")?;
                less(
                    ("hole", hole),
                    ("f", f),
                    "the hole must be narrower than the centre leg",
                )?;
                let a_outer = block_outer_area(a, c, e, g, 2);
                round_e(a, b, c, d, e, f, hole, a_outer)?
            }
            Shape::Pot {
                d1,
                d2,
                d3,
                d4,
                h1,
                h2,
                slot_width,
            } => pot(d1, d2, d3, d4, h1, h2, slot_width)?,
        };
        // Defensive: the formulas above cannot give NaN for validated input,
        // but nothing non-finite may leave the engine.
        let c = g.constants;
        let all = [
            c.c1,
            c.c2,
            c.amin,
            g.window_area,
            g.window_height,
            g.winding_breadth,
            g.winding_height,
            g.turn_length_inner,
            g.surface_area,
            g.volume,
        ];
        if all.iter().any(|v| !v.is_finite() || *v <= 0.0) {
            return Err(Error::input(
                "shape",
                "these dimensions give no usable core; check them",
            ));
        }
        Ok(g)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn mm(v: f64) -> f64 {
        v * 1e-3
    }
    // IEC 60205: a chain of equal pieces is a uniform core, Ae = A, le = Σl.
    #[test]
    fn uniform_chain_is_itself() {
        let mut ch = Chain::new();
        ch.piece(0.01, 2e-5);
        ch.piece(0.03, 2e-5);
        let k = ch.done();
        assert!((k.ae() - 2e-5).abs() < 1e-18);
        assert!((k.le() - 0.04).abs() < 1e-15);
    }

    #[test]
    fn validation_names_fields() {
        let e = Shape::E {
            a: mm(25.0),
            b: mm(12.8),
            c: mm(7.5),
            d: mm(8.7),
            e: mm(17.5),
            f: mm(18.0),
        };
        assert_eq!(e.geometry().unwrap_err().field(), Some("shape.f"));
        let e = Shape::E {
            a: mm(25.0),
            b: mm(8.0),
            c: mm(7.5),
            d: mm(8.7),
            e: mm(17.5),
            f: mm(7.5),
        };
        assert_eq!(e.geometry().unwrap_err().field(), Some("shape.d"));
        let e = Shape::E {
            a: mm(25.0),
            b: mm(12.8),
            c: f64::NAN,
            d: mm(8.7),
            e: mm(17.5),
            f: mm(7.5),
        };
        assert_eq!(e.geometry().unwrap_err().field(), Some("shape.c"));
        let r = Shape::Ring {
            outer_diameter: mm(10.0),
            inner_diameter: mm(12.0),
            height: mm(4.0),
        };
        assert_eq!(
            r.geometry().unwrap_err().field(),
            Some("shape.inner_diameter")
        );
        let p = Shape::Pot {
            d1: mm(18.0),
            d2: mm(14.9),
            d3: mm(7.5),
            d4: mm(3.0),
            h1: mm(10.6),
            h2: mm(7.2),
            slot_width: mm(40.0),
        };
        assert_eq!(p.geometry().unwrap_err().field(), Some("shape.slot_width"));
        let q = Shape::Pq {
            a: mm(27.3),
            b: mm(12.4),
            c: mm(19.0),
            d: mm(8.05),
            e: mm(22.5),
            f: mm(20.0),
            g: mm(15.5),
        };
        assert_eq!(q.geometry().unwrap_err().field(), Some("shape.f"));
        let q = Shape::Pq {
            a: mm(27.3),
            b: mm(12.4),
            c: mm(19.0),
            d: mm(8.05),
            e: mm(22.5),
            f: mm(12.0),
            g: mm(23.0),
        };
        assert_eq!(q.geometry().unwrap_err().field(), Some("shape.g"));
        let k = Shape::Efd {
            a: mm(20.0),
            b: mm(10.0),
            c: mm(6.65),
            d: mm(7.7),
            e: mm(15.4),
            f: mm(8.9),
            k: mm(7.0),
        };
        assert_eq!(k.geometry().unwrap_err().field(), Some("shape.k"));
        let pl = Shape::PlanarE {
            a: mm(14.0),
            b: mm(3.5),
            c: mm(5.0),
            d: mm(2.0),
            e: mm(11.0),
            f: mm(3.0),
            plate: Some(0.0),
        };
        assert_eq!(pl.geometry().unwrap_err().field(), Some("shape.plate"));
    }

    #[test]
    fn serde_tagged_round_trip() {
        let s = Shape::Etd {
            a: 0.0342,
            b: 0.0173,
            c: 0.0111,
            d: 0.0118,
            e: 0.0256,
            f: 0.0111,
        };
        let j = serde_json::to_string(&s).unwrap();
        assert!(j.contains("\"family\":\"etd\""), "{j}");
        assert_eq!(serde_json::from_str::<Shape>(&j).unwrap(), s);
        let typo = r#"{"family":"ring","outer_diameter":0.02,"inner_diameter":0.01,"height":0.007,"hieght":1}"#;
        assert!(serde_json::from_str::<Shape>(typo).is_err());
        let plate =
            r#"{"family":"planar_e","a":0.014,"b":0.0035,"c":0.005,"d":0.002,"e":0.011,"f":0.003}"#;
        assert!(matches!(
            serde_json::from_str::<Shape>(plate).unwrap(),
            Shape::PlanarE { plate: None, .. }
        ));
    }
}
