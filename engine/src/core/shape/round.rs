//! Round-centre-leg E types (ETD, ER, PQ, RM, EP).

use super::{bobbin, check_area, Chain, Constants, Geometry};
use super::etype::corner_length;
use crate::error::Result;
use std::f64::consts::PI;


/// ∫₀ˣ min(√(R² − t²), c) dt for 0 ≤ x ≤ R: a quarter of a disk of radius
/// R clipped to the band |y| ≤ c, up to abscissa x. Elementary calculus:
/// ∫√(R² − t²) dt = ½·(t·√(R² − t²) + R²·asin(t/R)).
pub(super) fn clipped_disk_quarter(r: f64, c: f64, x: f64) -> f64 {
    let x = x.clamp(0.0, r);
    let prim = |t: f64| {
        0.5 * (t * (r * r - t * t).max(0.0).sqrt() + r * r * (t / r).clamp(-1.0, 1.0).asin())
    };
    if c >= r {
        return prim(x);
    }
    let x0 = (r * r - c * c).sqrt();
    if x <= x0 {
        c * x
    } else {
        c * x0 + prim(x) - prim(x0)
    }
}

/// Total outer-leg section of a block A × C (A along x, C along y) with a
/// round window of diameter E centred in it, clipped by the block's faces,
/// and `slots` slots of width G from the window to the faces (G < E).
/// Area = A·C − (disk ∩ block) − slots × (slot strip outside the disk).
pub(super) fn block_outer_area(a: f64, c: f64, e: f64, g: f64, slots: u32) -> f64 {
    let r = 0.5 * e;
    let half_c = 0.5 * c;
    let disk = 4.0 * clipped_disk_quarter(r, half_c, r);
    let slot = g * half_c - 2.0 * clipped_disk_quarter(r, half_c, 0.5 * g);
    a * c - disk - f64::from(slots) * slot
}

/// Round-centre-leg E types (ETD, ER, PQ, RM, EP): pair of equal halves.
/// `a_outer` is the total outer-leg section from the plan.
#[allow(clippy::too_many_arguments)]
pub(super) fn round_e(
    a: f64,
    b: f64,
    c: f64,
    d: f64,
    e: f64,
    f: f64,
    hole: f64,
    a_outer: f64,
) -> Result<Geometry> {
    check_area(
        "a",
        a_outer,
        "outer legs (the window takes the whole block)",
    )?;
    let a_centre = 0.25 * PI * (f * f - hole * hole);
    let hw = 2.0 * d;
    let ww = 0.5 * (e - f);
    let h = b - d;
    let constants = round_leg_constants(c, f, hole, a_centre, a_outer, hw, h, ww);
    let (breadth, height, t_w) = bobbin(hw, ww);
    Ok(Geometry {
        constants,
        window_area: ww * hw,
        window_height: hw,
        winding_breadth: breadth,
        winding_height: height,
        turn_length_inner: PI * (f + 2.0 * t_w),
        surface_area: 2.0 * (a * 2.0 * b + a * c + 2.0 * b * c),
        volume: 2.0 * (a * c * h + (a_outer + a_centre) * d),
    })
}

/// Segment of a disk of radius `r` beyond the chord at distance `x` from
/// its centre (0 ≤ x ≤ r): r²·acos(x/r) − x·√(r² − x²) (elementary geometry).
fn segment(r: f64, x: f64) -> f64 {
    if x >= r {
        return 0.0;
    }
    let x = x.max(0.0);
    r * r * (x / r).acos() - x * (r * r - x * x).max(0.0).sqrt()
}

/// Where the flux of a round centre leg turns into one yoke side: the
/// distance s from the leg's surface to the chord that halves the area of
/// the half-leg (radius `r`, coaxial hole radius `hole_r`) feeding that
/// side. The same rule as IEC 60205's pot-core corners, where s is measured
/// from the post surface to the radius that halves the post's area (as
/// recalled, from memory): the corner's mean path runs through the middle
/// of the flux. For a solid leg s ≈ 0.596·r; for a rectangular half-leg of
/// width w the same rule gives w/2, the E-core convention. Solved by
/// bisection (60 halvings: far below any dimension's tolerance).
pub(super) fn half_area_depth(r: f64, hole_r: f64) -> f64 {
    let half_leg = 0.5 * (segment(r, 0.0) - segment(hole_r, 0.0));
    let beyond = |x: f64| segment(r, x) - segment(hole_r, x);
    let (mut lo, mut hi) = (0.0, r);
    for _ in 0..60 {
        let mid = 0.5 * (lo + hi);
        if beyond(mid) > half_leg {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    r - 0.5 * (lo + hi)
}

/// IEC 60205 pieces of a round-centre-leg pair (areas total, module docs):
/// centre leg (length: the window height, area π(F² − hole²)/4), outer
/// legs, the two yokes (length (E − F)/2, area 2·C·h), and four corner
/// pieces. Corners (module docs): a quarter circle whose radius is the
/// mean of the flux's two half-depths, l = (π/8)·(2s + h), with the mean of
/// the two adjoining areas; at the round leg s is [`half_area_depth`] (not
/// the equivalent width of a rectangular leg of the same area, which put
/// the corner too near the surface), at the outer legs s is half the
/// outer leg's equivalent width a_outer/(2C).
#[allow(clippy::too_many_arguments)]
pub(super) fn round_leg_constants(
    c: f64,
    f: f64,
    hole: f64,
    a_centre: f64,
    a_outer: f64,
    hw: f64,
    h: f64,
    ww: f64,
) -> Constants {
    let mut ch = Chain::new();
    ch.piece(hw, a_centre);
    ch.piece(hw, a_outer);
    let s_outer = 0.5 * a_outer / (2.0 * c);
    let s_centre = half_area_depth(0.5 * f, 0.5 * hole);
    let a_yoke = 2.0 * c * h;
    for _ in 0..2 {
        ch.piece(ww, a_yoke);
        ch.corner(corner_length(s_outer, h), 0.5 * (a_outer + a_yoke));
        ch.corner(corner_length(s_centre, h), 0.5 * (a_centre + a_yoke));
    }
    ch.done()
}

#[cfg(test)]
mod tests {
    use super::*;

    // Elementary geometry: the clipped-disk integral against a brute-force
    // grid count (midpoint rule on a fine grid), for a disk wider and
    // narrower than the band.
    #[test]
    fn clipped_disk_matches_grid_count() {
        for (r, c, x) in [
            (1.0, 0.6, 0.8),
            (1.0, 0.6, 0.3),
            (1.0, 1.5, 0.9),
            (1.0, 0.2, 1.0),
        ] {
            let n = 2000;
            let mut area = 0.0;
            for i in 0..n {
                let t = (i as f64 + 0.5) * x / n as f64;
                for j in 0..n {
                    let y = (j as f64 + 0.5) * c / n as f64;
                    if t * t + y * y <= r * r {
                        area += (x / n as f64) * (c / n as f64);
                    }
                }
            }
            let got = clipped_disk_quarter(r, c, x);
            assert!(
                (got - area).abs() < 2e-3 * area.max(1e-3),
                "r {r} c {c} x {x}: {got} vs {area}"
            );
        }
    }

    // Elementary geometry: a block with a window that fits inside (no
    // clipping, no slot) keeps A·C − π·E²/4.
    #[test]
    fn block_without_clipping_is_rectangle_minus_disk() {
        let got = block_outer_area(4.0, 3.0, 2.0, 0.0, 0);
        assert!((got - (12.0 - PI)).abs() < 1e-12);
    }

    // Pot yoke closed form against a series sum of thin cylindrical shells
    // (IEC 60205 series chain, each shell l = dr, A = 2π·r·h).

    // Elementary geometry: the half-area depth of a solid disk solves
    // acos(u) − u·√(1 − u²) = π/4 (u = 1 − s/r), u ≈ 0.4040 (checked by
    // substitution here); with a hole, s stays inside the wall.
    #[test]
    fn half_area_depth_of_disk_and_tube() {
        let s = half_area_depth(1.0, 0.0);
        let u: f64 = 1.0 - s;
        let lhs = u.acos() - u * (1.0 - u * u).sqrt();
        assert!((lhs - PI / 4.0).abs() < 1e-9, "{s}");
        assert!((s - 0.596).abs() < 1e-3);
        let t = half_area_depth(1.0, 0.9);
        assert!(t > 0.0 && t < 1.0, "{t}");
        // The half of the half-leg beyond the chord holds a quarter of the
        // whole section (grid count, midpoint rule).
        let (r, rho) = (1.0, 0.4);
        let x0 = r - half_area_depth(r, rho);
        let n = 1500;
        let (mut beyond, mut total) = (0.0_f64, 0.0_f64);
        for i in 0..n {
            let x = -r + (i as f64 + 0.5) * 2.0 * r / n as f64;
            for j in 0..n {
                let y = -r + (j as f64 + 0.5) * 2.0 * r / n as f64;
                let q = x * x + y * y;
                if q <= r * r && q >= rho * rho {
                    total += 1.0;
                    if x >= x0 {
                        beyond += 1.0;
                    }
                }
            }
        }
        assert!((beyond / total - 0.25).abs() < 2e-3, "{}", beyond / total);
    }
}
