//! Conductors: what one turn is made of.
//!
//! Four kinds cover ferrite transformers for switch-mode converters:
//!
//! * **Round enamelled wire**, by AWG (bare diameter from ASTM B258, see
//!   [`super::wire::awg_diameter`]) or by metric nominal diameter, with the
//!   overall (insulated) diameter of enamel grade 1, 2 or 3.
//! * **Litz**: `n` enamelled strands of one gauge, bundled with a packing
//!   factor and wrapped in a serving.
//! * **Copper foil**: thickness × width, one turn per layer.
//! * **Triple-insulated wire** (TIW): a round conductor with three extruded
//!   insulation layers, used where the winding itself must provide
//!   reinforced insulation.
//!
//! Every conductor answers three questions the rest of the module asks:
//! its copper cross-section (resistance), its outer width along a layer
//! (turns per layer) and its outer height (build).
//!
//! ## Enamel build (from memory)
//!
//! IEC 60317-0-1 tabulates, for each nominal diameter, the maximum overall
//! diameter of grades 1, 2 and 3. We do not carry that table; we use a fit
//! of the increase in diameter recalled from it, `Δd = c·√(d / 1 mm)` with
//! c = 0.062, 0.093 and 0.124 mm for grades 1, 2 and 3 (about 1.06 mm
//! overall for a 1.0 mm grade-1 wire, 0.566 mm for 0.5 mm grade 2).
//! Values are *from memory, an approximation of the IEC 60317 maxima; use
//! your wire supplier's data* for a final design.

use super::wire::{awg_diameter, round_area};
use crate::error::{in_range, positive, Error, Result};

/// Enamel grade of a round magnet wire (IEC 60317 style: 1 thin, 2 medium,
/// 3 thick).
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub enum Grade {
    G1,
    G2,
    G3,
}

impl Grade {
    /// From the grade number 1, 2 or 3.
    pub fn from_number(g: u32) -> Result<Grade> {
        match g {
            1 => Ok(Grade::G1),
            2 => Ok(Grade::G2),
            3 => Ok(Grade::G3),
            _ => Err(Error::input(
                "grade",
                format!("enamel grade must be 1, 2 or 3 (got {g})"),
            )),
        }
    }
}

/// Overall diameter of enamelled round wire of bare diameter `d` (m) and
/// grade `g`: d + c·√(d/1 mm), c = 0.062/0.093/0.124 mm (fit to IEC 60317
/// maximum overall diameters, from memory; see the module docs).
pub fn enamel_overall_diameter(d: f64, g: Grade) -> f64 {
    let c = match g {
        Grade::G1 => 0.062e-3,
        Grade::G2 => 0.093e-3,
        Grade::G3 => 0.124e-3,
    };
    d + c * (d / 1e-3).max(0.0).sqrt()
}

/// A round solid conductor (enamelled or triple-insulated).
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct RoundWire {
    /// Copper diameter, m.
    pub bare_diameter: f64,
    /// Overall diameter over the insulation, m.
    pub overall_diameter: f64,
}

/// A litz bundle.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Litz {
    /// Number of strands.
    pub strands: u32,
    /// Copper diameter of one strand, m.
    pub strand_diameter: f64,
    /// Overall diameter of one enamelled strand, m.
    pub strand_overall_diameter: f64,
    /// Fraction of the bundle's circle (inside the serving) filled by the
    /// insulated strands' cross-sections, 0 < p ≤ 0.907 (hexagonal packing).
    pub packing: f64,
    /// Radial thickness of the serving (textile or film wrap), m.
    pub serving: f64,
}

/// A copper foil, one turn per layer.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct Foil {
    /// Copper thickness (radial), m.
    pub thickness: f64,
    /// Foil width (along the winding breadth), m.
    pub width: f64,
}

/// What one conductor of a turn is made of.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub enum Conductor {
    /// Enamelled round magnet wire.
    Round(RoundWire),
    /// Litz wire.
    Litz(Litz),
    /// Copper foil.
    Foil(Foil),
    /// Triple-insulated round wire.
    TripleInsulated(RoundWire),
}

/// Densest packing of equal circles in a plane (hexagonal): π/(2√3).
pub const HEX_PACKING: f64 = 0.906_899_682_117_108_9;

impl Conductor {
    /// Enamelled round wire of AWG size `n` (ASTM B258 bare diameter) and
    /// enamel grade.
    pub fn awg(n: i32, grade: Grade) -> Result<Conductor> {
        let d = awg_diameter(n)?;
        Ok(Conductor::Round(RoundWire {
            bare_diameter: d,
            overall_diameter: enamel_overall_diameter(d, grade),
        }))
    }

    /// Enamelled round wire of metric nominal bare diameter `d` (m,
    /// 0.01 mm to 5 mm, the IEC 60317 range) and enamel grade.
    pub fn metric(d: f64, grade: Grade) -> Result<Conductor> {
        in_range("bare_diameter", d * 1e3, 0.01, 5.0, "mm")?;
        Ok(Conductor::Round(RoundWire {
            bare_diameter: d,
            overall_diameter: enamel_overall_diameter(d, grade),
        }))
    }

    /// Litz of `strands` enamelled strands of bare diameter `strand_d` (m)
    /// and `grade`, with packing factor and serving thickness. Typical
    /// values (common practice, no source): packing 0.75, serving 0.03 mm.
    pub fn litz(strands: u32, strand_d: f64, grade: Grade, packing: f64, serving: f64) -> Result<Conductor> {
        let c = Conductor::Litz(Litz {
            strands,
            strand_diameter: strand_d,
            strand_overall_diameter: enamel_overall_diameter(strand_d, grade),
            packing,
            serving,
        });
        c.validate("conductor")?;
        Ok(c)
    }

    /// Litz of `strands` enamelled strands of AWG size `strand_awg`
    /// (ASTM B258 bare diameter); see [`Conductor::litz`].
    pub fn litz_awg(strands: u32, strand_awg: i32, grade: Grade, packing: f64, serving: f64) -> Result<Conductor> {
        Conductor::litz(strands, awg_diameter(strand_awg)?, grade, packing, serving)
    }

    /// Copper foil `thickness` × `width` (m).
    pub fn foil(thickness: f64, width: f64) -> Result<Conductor> {
        let c = Conductor::Foil(Foil { thickness, width });
        c.validate("conductor")?;
        Ok(c)
    }

    /// Triple-insulated wire of bare diameter `d` (m) and overall diameter
    /// `overall` (m). For a typical product the overall diameter is about
    /// d + 0.2 mm (from memory; use the supplier's data).
    pub fn triple_insulated(d: f64, overall: f64) -> Result<Conductor> {
        let c = Conductor::TripleInsulated(RoundWire {
            bare_diameter: d,
            overall_diameter: overall,
        });
        c.validate("conductor")?;
        Ok(c)
    }

    /// Checks every dimension; `field` prefixes the error's field name.
    pub fn validate(&self, field: &str) -> Result<()> {
        // Field names are built only on the error path: this runs on every
        // fit of every design the solver tries.
        let f = |k: &str| format!("{field}.{k}");
        let at_least_1um = |k: &str, v: f64| -> Result<()> {
            if v.is_finite() && v >= 1e-6 {
                return Ok(());
            }
            let k = f(k);
            positive(&k, v, "m")?;
            Err(Error::input(&k, format!("{v} m is under 1 µm; lengths are in metres")))
        };
        let pos = |k: &str, v: f64| -> Result<()> {
            if v.is_finite() && v > 0.0 {
                Ok(())
            } else {
                positive(&f(k), v, "m").map(|_| ())
            }
        };
        match self {
            Conductor::Round(w) | Conductor::TripleInsulated(w) => {
                at_least_1um("bare_diameter", w.bare_diameter)?;
                pos("overall_diameter", w.overall_diameter)?;
                if w.overall_diameter < w.bare_diameter {
                    return Err(Error::input(
                        &f("overall_diameter"),
                        "the overall diameter must not be smaller than the bare diameter",
                    ));
                }
                if w.bare_diameter > 0.05 {
                    return Err(Error::input(
                        &f("bare_diameter"),
                        "a round conductor over 50 mm is not a winding wire",
                    ));
                }
            }
            Conductor::Litz(l) => {
                if l.strands == 0 {
                    return Err(Error::input(&f("strands"), "a litz bundle needs at least one strand"));
                }
                if l.strands > 100_000 {
                    return Err(Error::input(
                        &f("strands"),
                        "more than 100000 strands is not a litz bundle",
                    ));
                }
                at_least_1um("strand_diameter", l.strand_diameter)?;
                pos("strand_overall_diameter", l.strand_overall_diameter)?;
                if l.strand_overall_diameter < l.strand_diameter {
                    return Err(Error::input(
                        &f("strand_overall_diameter"),
                        "the strand's overall diameter must not be smaller than its bare diameter",
                    ));
                }
                if l.strand_diameter > 0.005 {
                    return Err(Error::input(
                        &f("strand_diameter"),
                        "a litz strand over 5 mm is not a strand",
                    ));
                }
                if !(l.packing.is_finite() && l.packing > 0.0 && l.packing <= HEX_PACKING) {
                    return Err(Error::input(
                        &f("packing"),
                        format!(
                            "the packing factor must lie in (0, {HEX_PACKING:.3}] (got {})",
                            l.packing
                        ),
                    ));
                }
                if !(l.serving.is_finite() && l.serving >= 0.0) {
                    crate::error::non_negative(&f("serving"), l.serving, "m")?;
                }
            }
            Conductor::Foil(fo) => {
                at_least_1um("thickness", fo.thickness)?;
                at_least_1um("width", fo.width)?;
                if fo.thickness > 0.01 {
                    return Err(Error::input(
                        &f("thickness"),
                        "a foil over 10 mm thick is not a winding foil",
                    ));
                }
                if fo.width > 1.0 {
                    return Err(Error::input(
                        &f("width"),
                        "a foil over 1 m wide is not a winding foil",
                    ));
                }
            }
        }
        Ok(())
    }

    /// Copper cross-section of one conductor, m².
    pub fn copper_area(&self) -> f64 {
        match self {
            Conductor::Round(w) | Conductor::TripleInsulated(w) => round_area(w.bare_diameter),
            Conductor::Litz(l) => l.strands as f64 * round_area(l.strand_diameter),
            Conductor::Foil(f) => f.thickness * f.width,
        }
    }

    /// Outer width of one conductor along a layer (winding breadth), m.
    pub fn outer_width(&self) -> f64 {
        match self {
            Conductor::Foil(f) => f.width,
            _ => self.outer_height(),
        }
    }

    /// Outer height of one conductor across the build (radial), m. For a
    /// litz bundle: d_strand,overall·√(n/packing) + 2·serving (the circle
    /// whose area is the strands' area over the packing factor).
    pub fn outer_height(&self) -> f64 {
        match self {
            Conductor::Round(w) | Conductor::TripleInsulated(w) => w.overall_diameter,
            Conductor::Litz(l) => l.strand_overall_diameter * (l.strands as f64 / l.packing).sqrt() + 2.0 * l.serving,
            Conductor::Foil(f) => f.thickness,
        }
    }

    /// True for foil (one turn per layer; parallel foils stack radially).
    pub fn is_foil(&self) -> bool {
        matches!(self, Conductor::Foil(_))
    }

    /// Short human description, e.g. "round 0.500 mm (0.566 mm overall)".
    pub fn describe(&self) -> String {
        match self {
            Conductor::Round(w) => {
                format!(
                    "round {:.3} mm ({:.3} mm overall)",
                    w.bare_diameter * 1e3,
                    w.overall_diameter * 1e3
                )
            }
            Conductor::TripleInsulated(w) => format!(
                "triple-insulated {:.3} mm ({:.3} mm overall)",
                w.bare_diameter * 1e3,
                w.overall_diameter * 1e3
            ),
            Conductor::Litz(l) => format!("litz {} × {:.3} mm", l.strands, l.strand_diameter * 1e3),
            Conductor::Foil(f) => format!("foil {:.3} × {:.2} mm", f.thickness * 1e3, f.width * 1e3),
        }
    }
}

/// Strand gauges (AWG) of the litz constructions the automatic choice may
/// use, coarsest first. Common practice, no source: the gauges litz is
/// commonly made of.
pub const LITZ_STRAND_AWG: [i32; 9] = [30, 32, 33, 36, 38, 40, 42, 44, 46];

/// Strand counts of the litz constructions the automatic choice may use,
/// fewest first. Common practice, no source: typical counts of stock litz.
pub const LITZ_STRAND_COUNTS: [u32; 24] = [
    7, 10, 16, 20, 25, 30, 40, 50, 60, 75, 100, 120, 150, 175, 200, 250, 300, 400, 500, 600, 800,
    1000, 1200, 1500,
];

/// Packing factor and serving of the automatic litz constructions
/// (common practice, no source; see [`Conductor::litz`]).
pub const LITZ_PACKING: f64 = 0.65;
pub const LITZ_SERVING: f64 = 0.03e-3;

/// Litz of the table ([`LITZ_STRAND_AWG`] × [`LITZ_STRAND_COUNTS`]), grade 1
/// strands with the table's packing and serving.
pub fn table_litz(strands: u32, strand_awg: i32) -> Result<Conductor> {
    Conductor::litz_awg(strands, strand_awg, Grade::G1, LITZ_PACKING, LITZ_SERVING)
}

#[cfg(test)]
mod tests {
    use super::*;

    // IEC 60317-0-1 maximum overall diameters, from memory: 0.500 mm grade 1
    // ≈ 0.544 mm, grade 2 ≈ 0.566 mm; 1.000 mm grade 1 ≈ 1.062 mm, grade 2
    // ≈ 1.093 mm, grade 3 ≈ 1.124 mm. The fit must land within 0.01 mm.
    #[test]
    fn enamel_fit_near_recalled_table() {
        let cases = [
            (0.5e-3, Grade::G1, 0.544e-3),
            (0.5e-3, Grade::G2, 0.566e-3),
            (1.0e-3, Grade::G1, 1.062e-3),
            (1.0e-3, Grade::G2, 1.093e-3),
            (1.0e-3, Grade::G3, 1.124e-3),
        ];
        for (d, g, want) in cases {
            let got = enamel_overall_diameter(d, g);
            assert!((got - want).abs() < 0.01e-3, "{d} {g:?}: {got} vs {want}");
        }
    }

    #[test]
    fn areas_and_sizes() {
        let c = Conductor::awg(24, Grade::G2).unwrap();
        // ASTM B258: AWG 24 = 0.0201 in = 0.511 mm.
        assert!((c.copper_area() - round_area(0.0201 * 25.4e-3)).abs() < 0.01 * c.copper_area());
        let l = Conductor::litz(100, 0.1e-3, Grade::G1, 0.75, 0.03e-3).unwrap();
        assert!((l.copper_area() - 100.0 * round_area(0.1e-3)).abs() < 1e-15);
        // 100 strands of ≈0.1196 mm over packing 0.75: 0.1196·√133.3 + 0.06 ≈ 1.44 mm.
        assert!((l.outer_height() - 1.441e-3).abs() < 0.01e-3, "{}", l.outer_height());
        let l38 = Conductor::litz_awg(60, 38, Grade::G1, 0.75, 0.0).unwrap();
        // ASTM B258 tabulates AWG 38 as 0.0040 in (rounded to 0.0001 in).
        let ds_in = (l38.copper_area() / 60.0 * 4.0 / std::f64::consts::PI).sqrt() / 25.4e-3;
        assert!((ds_in - 0.0040).abs() <= 0.00005, "{ds_in}");
        let f = Conductor::foil(0.1e-3, 10e-3).unwrap();
        assert_eq!(f.outer_width(), 10e-3);
        assert!(Conductor::foil(-0.1e-3, 10e-3).is_err());
        assert!(Conductor::litz(0, 0.1e-3, Grade::G1, 0.75, 0.0).is_err());
        assert!(Conductor::litz(10, 0.1e-3, Grade::G1, 0.95, 0.0).is_err());
        assert!(Conductor::triple_insulated(0.5e-3, 0.4e-3).is_err());
        assert!(Conductor::metric(0.0, Grade::G1).is_err());
    }

    #[test]
    fn litz_table_is_ordered_and_buildable() {
        // Common practice, no source: coarsest gauge first, fewest strands first,
        // every entry a valid conductor.
        assert!(LITZ_STRAND_AWG.windows(2).all(|w| w[0] < w[1]));
        assert!(LITZ_STRAND_COUNTS.windows(2).all(|w| w[0] < w[1]));
        for g in LITZ_STRAND_AWG {
            for n in LITZ_STRAND_COUNTS {
                let c = table_litz(n, g).unwrap();
                // Copper area n·π·d²/4 with d from ASTM B258.
                let d = awg_diameter(g).unwrap();
                assert!((c.copper_area() - n as f64 * round_area(d)).abs() < 1e-12 * c.copper_area().max(1e-12));
            }
        }
    }
}
