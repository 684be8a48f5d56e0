//! Ferrite cores: effective parameters, winding window and the library.
//!
//! A [`Core`] is everything the rest of the engine needs to know about a
//! core set: the IEC 60205 effective parameters (Ae, le, Ve, Amin), the
//! winding window and bobbin, the turn length as a function of build
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
    /// parameters, window, bobbin, turn length, surface, volume and mass
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
        let g = shape.geometry()?;
        let k = g.constants;
        let (ae, le) = (k.ae(), k.le());
        Ok(Core {
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
        })
    }

    /// A core from datasheet effective parameters. Checks (each error names
    /// its field): every value finite and positive; Ve, if given, within 5 %
    /// of le·Ae (IEC 60205: Ve = le·Ae); Amin ≤ 1.2·Ae (only a ring has
    /// Amin > Ae, by a few percent); the bobbin's winding area
    /// breadth × height within the window area; window height ≥ winding
    /// breadth; and the turn at least 2·√(π·Amin) long, since a closed curve
    /// around a section of area Amin has at least that perimeter (the
    /// isoperimetric inequality).
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
        Ok(Core {
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
        })
    }

    /// Mean length of a turn whose centre sits `h` metres above the bobbin
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
