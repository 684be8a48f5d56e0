//! Ferrite cores: effective parameters, winding window and the library.
//!
//! A [`Core`] is everything the rest of the engine needs to know about a
//! core set: the IEC 60205 effective parameters (Ae, le, Ve, Amin), the
//! winding window and bobbin, the mean turn length as a function of build
//! height, the outer surface for the thermal model, and the ferrite's
//! volume and mass.
//!
//! There are two ways to get one:
//!
//! * [`Core::from_shape`]: from the dimensions of a standard shape
//!   ([`Shape`], IEC 62317 letters). The effective parameters are computed
//!   by the IEC 60205 method in [`shape`] (pieces of the magnetic path summed
//!   into C1 = Σ l/A and C2 = Σ l/A²); that module's docs state the corner
//!   treatment and the simplifications of each family. The built-in
//!   [`library`] is a table of dimensions run through this function: no
//!   effective parameter in it is typed in.
//! * [`Core::from_effective`]: from a datasheet's effective parameters
//!   ([`Effective`]), for a core the shapes do not cover.

pub mod library;
pub mod shape;

pub use shape::{Constants, Shape, FERRITE_DENSITY};

use crate::error::{positive, Error, Result};
use serde::{Deserialize, Serialize};

/// Residual gap of a mated, ungapped core pair, m: the two halves' ground
/// faces never meet perfectly, which acts like a small air gap in the path
/// (common practice, from memory). A one-piece core (a ring) has no mating
/// faces and no residual gap; see [`Core::residual_gap`].
pub const RESIDUAL_GAP: f64 = 10e-6;

/// Effective parameters and window of one core set (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Core {
    /// Designation in the IEC 62317 style, e.g. "ETD 34".
    pub designation: String,
    /// Shape family, e.g. "ETD".
    pub family: String,
    /// Effective area Ae, m².
    pub ae: f64,
    /// Effective magnetic path length le, m.
    pub le: f64,
    /// Effective volume Ve = le·Ae, m³.
    pub ve: f64,
    /// Smallest cross-section Amin, m².
    pub amin: f64,
    /// Core window area Wa (one side, the space the winding can fill), m².
    pub window_area: f64,
    /// Window height G along the centre leg (the core's, not the bobbin's), m:
    /// McLyman's G in the fringing-flux factor.
    pub window_height: f64,
    /// Bobbin winding breadth (along the centre leg), m.
    pub winding_breadth: f64,
    /// Bobbin winding height (radial build available), m.
    pub winding_height: f64,
    /// Length of one turn laid directly on the bobbin, m.
    pub turn_length_inner: f64,
    /// Outer surface of the assembled core set, m² (thermal model).
    pub surface_area: f64,
    /// Where the numbers come from.
    pub provenance: String,
    /// Volume of ferrite in the set, m³ (the physical volume, not Ve).
    /// Zero when read from an older file that lacks it.
    #[serde(default)]
    pub volume: f64,
    /// Mass of the set, kg (volume × a typical density unless given).
    #[serde(default)]
    pub mass: f64,
    /// The dimensions the core was computed from, if any.
    #[serde(default)]
    pub shape: Option<Shape>,
}

/// Datasheet parameters for [`Core::from_effective`] (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Effective {
    /// Shape family for display, e.g. "E" (free text).
    #[serde(default)]
    pub family: String,
    /// Effective area Ae, m².
    pub ae: f64,
    /// Effective path length le, m.
    pub le: f64,
    /// Effective volume Ve, m³; if absent, le·Ae. If given it must agree
    /// with le·Ae within 5 % (datasheet rounding).
    #[serde(default)]
    pub ve: Option<f64>,
    /// Smallest section Amin, m²; if absent, Ae.
    #[serde(default)]
    pub amin: Option<f64>,
    /// Window area, m².
    pub window_area: f64,
    /// Core window height along the centre leg (fringing model), m; if
    /// absent, the winding breadth.
    #[serde(default)]
    pub window_height: Option<f64>,
    /// Bobbin winding breadth, m.
    pub winding_breadth: f64,
    /// Bobbin winding height, m.
    pub winding_height: f64,
    /// Length of a turn on the bobbin surface, m.
    pub turn_length_inner: f64,
    /// Outer surface of the set, m².
    pub surface_area: f64,
    /// Mass, kg; if absent, Ve × [`FERRITE_DENSITY`]. The core's physical
    /// `volume` is then taken as mass / [`FERRITE_DENSITY`].
    #[serde(default)]
    pub mass: Option<f64>,
}

impl Core {
    /// A core from the dimensions of a standard shape: IEC 60205 effective
    /// parameters, window, bobbin, mean turn length, surface, volume and mass
    /// (see [`shape`] for the model of each family). Errors name the bad
    /// dimension as `shape.<letter>`.
    pub fn from_shape(designation: &str, shape: Shape) -> Result<Core> {
        let designation = designation.trim();
        if designation.is_empty() {
            return Err(Error::input(
                "designation",
                "give the core a name, e.g. \"ETD 34\"",
            ));
        }
        check_shape_bounds(&shape)?;
        let g = shape.geometry()?;
        let k = g.constants;
        let (ae, le) = (k.ae(), k.le());
        let mut core = Core {
            designation: designation.to_string(),
            family: shape.family().to_string(),
            ae,
            le,
            ve: le * ae,
            amin: k.amin,
            window_area: g.window_area,
            window_height: g.window_height,
            winding_breadth: g.winding_breadth,
            winding_height: g.winding_height,
            turn_length_inner: g.turn_length_inner,
            surface_area: g.surface_area,
            provenance:
                "effective parameters computed from the dimensions given (IEC 60205 method); \
                         bobbin from typical wall and flange thicknesses"
                    .into(),
            volume: g.volume,
            mass: g.volume * FERRITE_DENSITY,
            shape: Some(shape),
        };
        core.provenance = format!("{}; {}", core.provenance, core.residual_gap_note());
        Ok(core)
    }

    /// A core from datasheet effective parameters. Checks (each error names
    /// its field): every value finite and positive; Ve, if given, within 5 %
    /// of le·Ae (IEC 60205: Ve = le·Ae); Amin ≤ 1.2·Ae (only a ring has
    /// Amin > Ae, by a few percent); the bobbin's winding area
    /// breadth × height within the window area; window height ≥ winding
    /// breadth; and the turn at least 2·√(π·Amin) long, since a closed curve
    /// around a section of area Amin has at least that perimeter (the
    /// isoperimetric inequality). Then the bounds and consistency of
    /// [`check_effective_bounds`]: upper limits on every size, le around
    /// the window, surface against Ve^(2/3), mass against density × Ve.
    pub fn from_effective(designation: &str, p: &Effective) -> Result<Core> {
        let designation = designation.trim();
        if designation.is_empty() {
            return Err(Error::input("designation", "give the core a name"));
        }
        let ae = positive("ae", p.ae, "m²")?;
        let le = positive("le", p.le, "m")?;
        let ve = match p.ve {
            Some(v) => {
                positive("ve", v, "m³")?;
                if (v / (le * ae) - 1.0).abs() > 0.05 {
                    return Err(Error::input(
                        "ve",
                        format!(
                            "Ve ({:.4} cm³) should equal le·Ae ({:.4} cm³) within 5 %: check ae, le and ve",
                            v * 1e6,
                            le * ae * 1e6
                        ),
                    ));
                }
                v
            }
            None => le * ae,
        };
        let amin = match p.amin {
            Some(a) => positive("amin", a, "m²")?,
            None => ae,
        };
        if amin > 1.2 * ae {
            return Err(Error::input(
                "amin",
                "Amin should not exceed Ae (by more than 20 %): check amin and ae",
            ));
        }
        let window_area = positive("window_area", p.window_area, "m²")?;
        let breadth = positive("winding_breadth", p.winding_breadth, "m")?;
        let height = positive("winding_height", p.winding_height, "m")?;
        if breadth * height > 1.05 * window_area {
            return Err(Error::input(
                "winding_height",
                "the bobbin's winding area (breadth × height) exceeds the core window area",
            ));
        }
        let window_height = match p.window_height {
            Some(g) => positive("window_height", g, "m")?,
            None => breadth,
        };
        if window_height < breadth {
            return Err(Error::input(
                "window_height",
                "the core window cannot be shorter than the bobbin's breadth",
            ));
        }
        let mlt0 = positive("turn_length_inner", p.turn_length_inner, "m")?;
        let shortest = 2.0 * (std::f64::consts::PI * amin).sqrt();
        if mlt0 < shortest {
            return Err(Error::input(
                "turn_length_inner",
                format!(
                    "a turn around a leg of {:.1} mm² is at least {:.1} mm long",
                    amin * 1e6,
                    shortest * 1e3
                ),
            ));
        }
        let surface = positive("surface_area", p.surface_area, "m²")?;
        let mass = match p.mass {
            Some(m) => positive("mass", m, "kg")?,
            None => ve * FERRITE_DENSITY,
        };
        check_effective_bounds(p, ae, le, ve, window_area, surface, mass)?;
        let mut core = Core {
            designation: designation.to_string(),
            family: p.family.trim().to_string(),
            ae,
            le,
            ve,
            amin,
            window_area,
            window_height,
            winding_breadth: breadth,
            winding_height: height,
            turn_length_inner: mlt0,
            surface_area: surface,
            provenance: "effective parameters given by the user".into(),
            volume: mass / FERRITE_DENSITY,
            mass,
            shape: None,
        };
        core.provenance = format!("{}; {}", core.provenance, core.residual_gap_note());
        Ok(core)
    }

    /// A one-piece core: a ring (toroid) from its shape, or an own core whose
    /// family is given as "Ring" (the library's name), "R", "T" or "toroid"
    /// (case ignored).
    /// Every other core is a mated pair of halves.
    pub fn is_one_piece(&self) -> bool {
        if matches!(self.shape, Some(Shape::Ring { .. })) {
            return true;
        }
        let f = self.family.trim().to_ascii_lowercase();
        matches!(f.as_str(), "r" | "t" | "ring" | "toroid")
    }

    /// The residual gap the magnetising inductance of this core, ungapped,
    /// is computed with: [`RESIDUAL_GAP`] for a mated pair, zero for a
    /// one-piece core, whose AL is then μ0·μi·Ae/le exactly (IEC 60205
    /// effective parameters).
    pub fn residual_gap(&self) -> f64 {
        if self.is_one_piece() {
            0.0
        } else {
            RESIDUAL_GAP
        }
    }

    /// The provenance sentence on the residual gap (every core states it).
    pub fn residual_gap_note(&self) -> String {
        if self.is_one_piece() {
            "one-piece core: no residual gap when ungapped".into()
        } else {
            format!(
                "mated pair: ungapped, a {:.0} µm residual gap is assumed",
                RESIDUAL_GAP * 1e6
            )
        }
    }

    /// Mean turn length of a turn whose centre sits `h` metres above the bobbin
    /// surface: MLT(h) = MLT(0) + 2π·h. Exact for a round centre leg and
    /// for a rectangular leg whose turns have rounded corners (each added
    /// layer adds a quarter circle at four corners). Common practice, no source.
    pub fn turn_length_at(&self, h: f64) -> f64 {
        self.turn_length_inner + 2.0 * std::f64::consts::PI * h.max(0.0)
    }

    /// Mean turn length at half the bobbin's winding height.
    pub fn mlt_mid(&self) -> f64 {
        self.turn_length_at(0.5 * self.winding_height)
    }
}

/// Largest dimension of a shape, m: far above any ferrite core made (the
/// largest are some 0.1–0.2 m across, from memory; common practice, no
/// source). Catches values typed in the wrong unit and absurd numbers.
pub const MAX_DIMENSION: f64 = 1.0;

/// Upper bounds on an own core's effective parameters, each about ten
/// times the largest ferrite cores in trade (Ae about 10 cm², le about
/// 30 cm, a set of about 1 kg, from memory; common practice, no source):
/// (field, bound, unit).
pub const EFFECTIVE_MAX: [(&str, f64, &str); 9] = [
    ("ae", 0.01, "m² (100 cm²)"),
    ("le", 2.0, "m"),
    ("window_area", 0.05, "m² (500 cm²)"),
    ("window_height", MAX_DIMENSION, "m"),
    ("winding_breadth", MAX_DIMENSION, "m"),
    ("winding_height", MAX_DIMENSION, "m"),
    ("turn_length_inner", 2.0, "m"),
    ("surface_area", 2.0, "m²"),
    ("mass", 50.0, "kg"),
];

/// The exposed surface of a core set, as a multiple of Ve^(2/3): at least
/// 4 and at most 40. No body has less surface for its volume than a sphere,
/// S = (36π)^(1/3)·V^(2/3) ≈ 4.84·V^(2/3) (the isoperimetric inequality in
/// space); 4 leaves room for a physical volume a little below Ve. The
/// library's cores lie between 8 (planar E) and 14 (small EP); 40 allows
/// far flatter shapes (our choice, common practice, no source).
pub const SURFACE_FACTOR: (f64, f64) = (4.0, 40.0);

/// Mass against [`FERRITE_DENSITY`]·Ve: between 0.5 and 4. The ferrite of a
/// set is at least its effective volume, more where corners and flanges
/// carry little flux (the library's cores: 1.05 for a ring to 2.2 for an
/// EP); the band leaves room for other densities and rounding (our choice,
/// common practice, no source).
pub const MASS_FACTOR: (f64, f64) = (0.5, 4.0);

/// Every dimension of a shape at most [`MAX_DIMENSION`] (errors name
/// `shape.<letter>`). Finite, positive and ordered dimensions are the
/// shape's own checks.
fn check_shape_bounds(shape: &Shape) -> Result<()> {
    let Ok(serde_json::Value::Object(map)) = serde_json::to_value(shape) else {
        return Ok(());
    };
    for (key, v) in &map {
        if let Some(x) = v.as_f64() {
            if x > MAX_DIMENSION {
                return Err(Error::input(
                    &format!("shape.{key}"),
                    format!(
                        "{x} m is larger than any ferrite core (at most {MAX_DIMENSION} m): give the dimension in metres"
                    ),
                ));
            }
        }
    }
    Ok(())
}

/// Upper bounds ([`EFFECTIVE_MAX`]) and consistency of an own core's
/// effective parameters, each error naming its field:
/// * le ≥ 2·√(π·Wa): the magnetic path closes around the window, and a
///   closed curve around an area Wa is at least that long (isoperimetric
///   inequality in the plane);
/// * surface within [`SURFACE_FACTOR`] × Ve^(2/3);
/// * mass within [`MASS_FACTOR`] × [`FERRITE_DENSITY`]·Ve.
///
/// (Ve against le·Ae is checked where Ve is read.)
fn check_effective_bounds(
    p: &Effective,
    ae: f64,
    le: f64,
    ve: f64,
    window_area: f64,
    surface: f64,
    mass: f64,
) -> Result<()> {
    let given = |name: &str| -> Option<f64> {
        match name {
            "ae" => Some(ae),
            "le" => Some(le),
            "window_area" => Some(window_area),
            "window_height" => p.window_height,
            "winding_breadth" => Some(p.winding_breadth),
            "winding_height" => Some(p.winding_height),
            "turn_length_inner" => Some(p.turn_length_inner),
            "surface_area" => Some(surface),
            "mass" => p.mass,
            _ => None,
        }
    };
    for (name, max, unit) in EFFECTIVE_MAX {
        if let Some(v) = given(name) {
            if v > max {
                return Err(Error::input(
                    name,
                    format!("{v} is larger than any ferrite core has (at most {max} {unit}): check the value and its unit (SI)"),
                ));
            }
        }
    }
    let le_min = 2.0 * (std::f64::consts::PI * window_area).sqrt();
    if le < le_min {
        return Err(Error::input(
            "le",
            format!(
                "the magnetic path closes around the window of {:.1} mm², so le is at least {:.1} mm (got {:.1} mm): check le and window_area",
                window_area * 1e6,
                le_min * 1e3,
                le * 1e3
            ),
        ));
    }
    let v23 = ve.powf(2.0 / 3.0);
    let (s_lo, s_hi) = (SURFACE_FACTOR.0 * v23, SURFACE_FACTOR.1 * v23);
    if surface < s_lo || surface > s_hi {
        return Err(Error::input(
            "surface_area",
            format!(
                "a core of Ve {:.3} cm³ has an outer surface of {:.1} to {:.0} cm² ({}–{} × Ve^(2/3)); got {:.1} cm²: check surface_area (m²)",
                ve * 1e6,
                s_lo * 1e4,
                s_hi * 1e4,
                SURFACE_FACTOR.0,
                SURFACE_FACTOR.1,
                surface * 1e4
            ),
        ));
    }
    let m0 = FERRITE_DENSITY * ve;
    let (m_lo, m_hi) = (MASS_FACTOR.0 * m0, MASS_FACTOR.1 * m0);
    if mass < m_lo || mass > m_hi {
        return Err(Error::input(
            "mass",
            format!(
                "ferrite of Ve {:.3} cm³ weighs {:.1} to {:.1} g ({}–{} × {:.0} kg/m³ × Ve); got {:.1} g: check mass (kg)",
                ve * 1e6,
                m_lo * 1e3,
                m_hi * 1e3,
                MASS_FACTOR.0,
                MASS_FACTOR.1,
                FERRITE_DENSITY,
                mass * 1e3
            ),
        ));
    }
    Ok(())
}
