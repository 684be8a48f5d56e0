//! The built-in core library.
//!
//! First cut: a handful of sizes with effective parameters recalled from
//! memory (typical of published data for these IEC 62317 shapes). To be
//! replaced by parameters computed from IEC 62317 dimensions.

use super::Core;
use crate::error::{Error, Result};

fn seed(
    designation: &str,
    family: &str,
    ae_mm2: f64,
    le_mm: f64,
    amin_mm2: f64,
    wa_mm2: f64,
    breadth_mm: f64,
    height_mm: f64,
    mlt0_mm: f64,
    surface_mm2: f64,
) -> Core {
    Core {
        designation: designation.into(),
        family: family.into(),
        ae: ae_mm2 * 1e-6,
        le: le_mm * 1e-3,
        ve: ae_mm2 * le_mm * 1e-9,
        amin: amin_mm2 * 1e-6,
        window_area: wa_mm2 * 1e-6,
        window_height: (breadth_mm + 1.6) * 1e-3,
        winding_breadth: breadth_mm * 1e-3,
        winding_height: height_mm * 1e-3,
        turn_length_inner: mlt0_mm * 1e-3,
        surface_area: surface_mm2 * 1e-6,
        provenance: "effective parameters from memory; use your supplier's data".into(),
    }
}

/// Every built-in core.
pub fn cores() -> Vec<Core> {
    vec![
        seed("E 25/13/7", "E", 52.5, 57.5, 52.5, 87.0, 15.0, 5.0, 38.0, 2700.0),
        seed("ETD 29", "ETD", 76.0, 72.0, 71.0, 95.0, 19.4, 5.6, 42.0, 4200.0),
        seed("ETD 34", "ETD", 97.1, 78.6, 91.6, 123.0, 20.9, 6.3, 47.0, 5300.0),
        seed("ETD 39", "ETD", 125.0, 92.2, 123.0, 177.0, 25.7, 7.6, 53.0, 6900.0),
        seed("PQ 26/25", "PQ", 120.0, 54.3, 109.0, 62.0, 10.0, 5.2, 47.0, 3400.0),
    ]
}

/// Looks a core up by designation (spaces and case ignored).
pub fn find(designation: &str) -> Result<Core> {
    let key = normalise(designation);
    cores()
        .into_iter()
        .find(|c| normalise(&c.designation) == key)
        .ok_or_else(|| Error::unknown("core", format!("no core \"{designation}\" in the library")))
}

fn normalise(s: &str) -> String {
    s.chars().filter(|c| !c.is_whitespace()).flat_map(char::to_uppercase).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn find_ignores_spacing_and_case() {
        assert_eq!(find("etd34").unwrap().designation, "ETD 34");
        assert!(find("XYZ 1").is_err());
    }

    // IEC 60205 identities: Ve = le·Ae and Ae ≥ Amin.
    #[test]
    fn iec60205_identities() {
        for c in cores() {
            assert!((c.ve - c.le * c.ae).abs() <= 1e-12 * c.ve, "{}", c.designation);
            assert!(c.ae >= c.amin, "{}", c.designation);
        }
    }
}
