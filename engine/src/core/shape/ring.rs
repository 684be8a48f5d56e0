//! Ring (toroid): the IEC 60205 closed form.

use super::Constants;
use std::f64::consts::PI;

/// IEC 60205 constants of a ring of radii r1 < r2 and height h (closed form):
/// C1 = 2π / (h·ln(r2/r1)), C2 = 2π·(1/r1 − 1/r2) / (h²·ln³(r2/r1)).
/// Amin is the physical section h·(r2 − r1). Note that for a ring the IEC
/// Ae is *smaller* than that section (the flux crowds at the inner radius),
/// the one family where Ae < Amin.
pub fn ring_constants(r1: f64, r2: f64, h: f64) -> Constants {
    let ln = (r2 / r1).ln();
    Constants {
        c1: 2.0 * PI / (h * ln),
        c2: 2.0 * PI * (1.0 / r1 - 1.0 / r2) / (h * h * ln * ln * ln),
        amin: h * (r2 - r1),
    }
}
