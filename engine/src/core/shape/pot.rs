//! Pot cores: centre post, wall and radial base plates.

use super::etype::corner_length;
use super::{bobbin, check_area, less, pos, Chain, Geometry};
use crate::error::{non_negative, Result};
use std::f64::consts::PI;

/// Pot core pair (module docs: radial yoke in closed form).
pub(super) fn pot(d1: f64, d2: f64, d3: f64, d4: f64, h1: f64, h2: f64, slot: f64) -> Result<Geometry> {
    for (n, v) in [("d1", d1), ("d2", d2), ("d3", d3), ("h1", h1), ("h2", h2)] {
        pos(n, v)?;
    }
    non_negative("shape.d4", d4, "m")?;
    non_negative("shape.slot_width", slot, "m")?;
    less(("d2", d2), ("d1", d1), "the outer wall needs a thickness")?;
    less(
        ("d3", d3),
        ("d2", d2),
        "the centre post must be narrower than the window",
    )?;
    less(
        ("d4", d4),
        ("d3", d3),
        "the hole must be narrower than the centre post",
    )?;
    less(
        ("h2", h2),
        ("h1", h1),
        "the window height must leave base plates",
    )?;
    let (r1, r2, r3, r4) = (0.5 * d1, 0.5 * d2, 0.5 * d3, 0.5 * d4);
    let h = 0.5 * (h1 - h2);
    let a_centre = PI * (r3 * r3 - r4 * r4);
    let a_wall = PI * (r1 * r1 - r2 * r2) - 2.0 * slot * (r1 - r2);
    check_area("slot_width", a_wall, "outer wall (the slots are too wide)")?;
    let mut ch = Chain::new();
    ch.piece(h2, a_centre);
    ch.piece(h2, a_wall);
    // Two base plates: radial flux through cylinders of area 2π·r·h, in
    // series from r3 to r2: ∫dr/(2πrh) and ∫dr/(2πrh)².
    let ln = (r2 / r3).ln();
    ch.c1 += 2.0 * ln / (2.0 * PI * h);
    ch.c2 += 2.0 * (1.0 / r3 - 1.0 / r2) / (4.0 * PI * PI * h * h);
    ch.amin = ch.amin.min(2.0 * PI * r3 * h);
    // Corners (IEC 60205 pot-core corners as recalled, from memory): the
    // flux's middle in the post is the radius that halves the post's area,
    // √((r3² + r4²)/2), and in the wall the one that halves the wall's,
    // √((r1² + r2²)/2); s is its depth below the surface the flux crosses.
    let s_post = r3 - ((r3 * r3 + r4 * r4) / 2.0).sqrt();
    let s_wall = ((r1 * r1 + r2 * r2) / 2.0).sqrt() - r2;
    for _ in 0..2 {
        ch.corner(corner_length(s_post, h), 0.5 * (a_centre + 2.0 * PI * r3 * h));
        ch.corner(corner_length(s_wall, h), 0.5 * (a_wall + 2.0 * PI * r2 * h));
    }
    let ww = r2 - r3;
    let (breadth, height, t_w) = bobbin(h2, ww);
    Ok(Geometry {
        constants: ch.done(),
        window_area: ww * h2,
        window_height: h2,
        winding_breadth: breadth,
        winding_height: height,
        turn_length_inner: 2.0 * PI * (r3 + t_w),
        surface_area: 2.0 * PI * r1 * h1 + 2.0 * PI * r1 * r1,
        volume: 2.0 * h * PI * (r1 * r1 - r4 * r4) + h2 * (a_centre + a_wall),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn radial_yoke_closed_form_matches_shell_sum() {
        let (r3, r2, h) = (3.0e-3, 7.5e-3, 1.7e-3);
        let n = 200_000;
        let dr = (r2 - r3) / n as f64;
        let (mut c1, mut c2) = (0.0, 0.0);
        for i in 0..n {
            let r = r3 + (i as f64 + 0.5) * dr;
            let a = 2.0 * PI * r * h;
            c1 += dr / a;
            c2 += dr / (a * a);
        }
        let c1_closed = (r2 / r3).ln() / (2.0 * PI * h);
        let c2_closed = (1.0 / r3 - 1.0 / r2) / (4.0 * PI * PI * h * h);
        assert!((c1 - c1_closed).abs() < 1e-8 * c1_closed);
        assert!((c2 - c2_closed).abs() < 1e-8 * c2_closed);
    }

}
