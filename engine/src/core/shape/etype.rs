//! Rectangular-leg E types (E, EFD, planar E and E + PLT): IEC 60205 pieces.

use super::{bobbin, Chain, Constants, Geometry};
use crate::error::Result;
use std::f64::consts::PI;

/// The pieces of a general E-type pair (all areas total, see module docs).
#[derive(Debug, Clone, Copy)]
struct ETypePieces {
    /// Depth of the yokes (C).
    depth: f64,
    /// Centre-leg section.
    a_centre: f64,
    /// Half the centre leg's width along the yoke (F/2): half the flux
    /// turns each way, so this is the width of the leg the corner sees.
    /// For the flat EFD leg it is F/2 too, whatever its thickness K (the
    /// equivalent width F·K/(2·C) would shrink the corner with K).
    w_centre: f64,
    /// Total outer-leg section.
    a_outer: f64,
    /// Window height (centre-leg length between the yokes).
    window_height: f64,
    /// Yoke heights of the two halves (or half and plate).
    h_top: f64,
    h_bottom: f64,
    /// Yoke length from centre-leg face to outer-leg face, (E − F)/2.
    yoke_length: f64,
}

/// Length of one corner piece: a quarter circle whose radius is the mean of
/// `s` (the depth of the flux's middle in the leg, from the leg's face: half
/// the leg's width for a rectangular leg) and h/2 (the middle of a yoke of
/// height h): l = (π/2)·(s + h/2)/2 = (π/8)·(2s + h). For a rectangular leg
/// of width w this is IEC 60205's E-core corner, l = (π/8)·(w + h) (as
/// recalled, from memory).
pub(super) fn corner_length(s: f64, h: f64) -> f64 {
    PI * (2.0 * s + h) / 8.0
}

fn etype_constants(p: &ETypePieces) -> Constants {
    let mut ch = Chain::new();
    ch.piece(p.window_height, p.a_centre);
    ch.piece(p.window_height, p.a_outer);
    let w_outer = p.a_outer / (2.0 * p.depth);
    let w_centre = p.w_centre;
    for h in [p.h_top, p.h_bottom] {
        let a_yoke = 2.0 * p.depth * h;
        ch.piece(p.yoke_length, a_yoke);
        ch.corner(corner_length(0.5 * w_outer, h), 0.5 * (p.a_outer + a_yoke));
        ch.corner(corner_length(0.5 * w_centre, h), 0.5 * (p.a_centre + a_yoke));
    }
    ch.done()
}

/// Rectangular-centre-leg E types (E, EF, EFD, planar). `d_bottom` is the
/// window height of the second half (None: a plate), `h_bottom` its yoke
/// (or plate) height. `a_centre` and `turn0` (turn perimeter on the bare leg)
/// describe the centre leg.
#[allow(clippy::too_many_arguments)]
pub(super) fn rect_e(
    a: f64,
    b: f64,
    c: f64,
    d: f64,
    e: f64,
    f: f64,
    a_centre: f64,
    turn0: f64,
    d_bottom: Option<f64>,
    h_bottom: f64,
) -> Result<Geometry> {
    let hw = d + d_bottom.unwrap_or(0.0);
    let ww = 0.5 * (e - f);
    let a_outer = (a - e) * c;
    let h_top = b - d;
    let pieces = ETypePieces {
        depth: c,
        a_centre,
        w_centre: 0.5 * f,
        a_outer,
        window_height: hw,
        h_top,
        h_bottom,
        yoke_length: ww,
    };
    let (breadth, height, t_w) = bobbin(hw, ww);
    let total_height = b + d_bottom.map_or(h_bottom, |_| b);
    let half_volume = a * c * h_top + (a_outer + a_centre) * d;
    let volume = match d_bottom {
        Some(_) => 2.0 * half_volume,
        None => half_volume + a * c * h_bottom,
    };
    Ok(Geometry {
        constants: etype_constants(&pieces),
        window_area: ww * hw,
        window_height: hw,
        winding_breadth: breadth,
        winding_height: height,
        turn_length_inner: turn0 + 2.0 * PI * t_w,
        surface_area: 2.0 * (a * total_height + a * c + total_height * c),
        volume,
    })
}
