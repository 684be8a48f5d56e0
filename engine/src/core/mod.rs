//! Ferrite cores: effective parameters, winding window and the library.
//!
//! A [`Core`] is everything the rest of the engine needs to know about a
//! core set: the IEC 60205 effective parameters (Ae, le, Ve, Amin), the
//! winding window and bobbin, the turn length as a function of build
//! height, and the outer surface for the thermal model.

pub mod library;

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
}

impl Core {
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
