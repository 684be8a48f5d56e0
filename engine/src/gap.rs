//! Gapped cores: inductance, fringing, gap for a target inductance, saturation check.
//!
//! # The model
//!
//! A core of effective area Ae and path length le, relative permeability
//! μr, with an air gap of total length lg in the magnetic path, wound with
//! N turns (magnetic-circuit law: the MMF N·I drives the flux through the
//! reluctances of core and gap in series; e.g. Erickson & Maksimovic,
//! Fundamentals of Power Electronics, chapter on magnetics):
//!
//! L = μ0·N²·Ae / (lg + le/μr),  AL = L/N² (inductance per turn squared).
//!
//! Fringing flux around the gap raises the inductance. McLyman
//! (Transformer and Inductor Design Handbook; the fringing-flux factor,
//! from memory, edition and chapter not checked):
//!
//! F = 1 + (lg/√Ae)·ln(2G/lg), G the window height, valid for 0 < lg < 2G,
//!
//! applied as McLyman does, to the whole inductance: L′ = F·L. (Applying F
//! to the gap's reluctance only, lg/F + le/μr, differs where the core's own
//! reluctance matters, i.e. at small gaps where F ≈ 1 anyway.)
//!
//! # Choices stated
//!
//! * Placement ([`GapPlacement`]): a gap ground into the centre leg is one
//!   gap of length g in the path; a spacer of thickness g between the
//!   halves puts a gap in every leg, and the flux crosses two of them (the
//!   centre leg and the outer legs): the path gap is 2·g.
//! * F is evaluated with the length of ONE gap (the centre-leg gap, or the
//!   spacer thickness), because fringing is local to each gap, and applied
//!   to the whole inductance. For a spacer this treats the outer legs' gap
//!   like the centre leg's (their smaller areas fringe slightly more, so F
//!   is slightly low there).
//! * Limits: a centre-leg gap must be shorter than the window height G
//!   (the centre leg is only that long); a spacer must be thinner than 2G
//!   (the validity of F).
//! * Peak flux density: Bpk = L′·Ipk/(N·Ae) with the fringing-corrected L′.
//!   The fringing flux leaves and re-enters the core only near the gap; in
//!   the legs and yokes the core carries the whole flux linked by the
//!   winding, N·Φ = L′·I. The un-fringed value μ0·N·I/(lg + le/μr) is the
//!   flux density in the middle of the gap, F times lower. Using L′ is also
//!   the conservative side for the saturation check.
//! * μ0 = 4π·10⁻⁷ H/m (exact before the 2019 SI revision; the present
//!   value differs by about 1e-9, far below any core tolerance).

use crate::core::Core;
use crate::error::{in_range, non_negative, positive, Error, Result};
use crate::material::Material;
use serde::{Deserialize, Serialize};

/// Permeability of free space, H/m.
pub const MU_0: f64 = 4.0e-7 * std::f64::consts::PI;

/// The three numbers of a core the gap model needs (SI).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct GapCore {
    /// Effective area Ae, m².
    pub ae: f64,
    /// Effective path length le, m.
    pub le: f64,
    /// Window height G along the centre leg, m.
    pub window_height: f64,
}

impl GapCore {
    pub fn new(ae: f64, le: f64, window_height: f64) -> Result<Self> {
        positive("core.ae", ae, "m²")?;
        positive("core.le", le, "m")?;
        positive("core.window_height", window_height, "m")?;
        Ok(GapCore { ae, le, window_height })
    }

    /// From a library or user core.
    pub fn from_core(core: &Core) -> Result<Self> {
        Self::new(core.ae, core.le, core.window_height)
    }
}

/// Where the gap is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum GapPlacement {
    /// Ground into the centre leg only: path gap = gap.
    CentreLeg,
    /// A spacer between the core halves, in all legs: path gap = 2·gap.
    Spacer,
}

impl GapPlacement {
    /// The gap length in the magnetic path for a physical gap (centre-leg
    /// gap or spacer thickness) `gap`, m.
    pub fn path_gap(self, gap: f64) -> f64 {
        match self {
            GapPlacement::CentreLeg => gap,
            GapPlacement::Spacer => 2.0 * gap,
        }
    }

    /// The largest physical gap allowed, m (exclusive): G for a centre-leg
    /// gap, 2G for a spacer (see the module documentation).
    pub fn max_gap(self, window_height: f64) -> f64 {
        match self {
            GapPlacement::CentreLeg => window_height,
            GapPlacement::Spacer => 2.0 * window_height,
        }
    }

    fn describe(self) -> &'static str {
        match self {
            GapPlacement::CentreLeg => "a centre-leg gap must be shorter than the window height",
            GapPlacement::Spacer => {
                "a spacer must be thinner than twice the window height (the fringing formula's range)"
            }
        }
    }
}

/// McLyman's fringing factor F = 1 + (lg/√Ae)·ln(2G/lg) for one gap of
/// length `gap` (m), area `ae` (m²), window height `window_height` (m).
/// F = 1 at lg = 0 (the limit of lg·ln(1/lg)); refused for lg ≥ 2G.
pub fn fringing_factor(ae: f64, gap: f64, window_height: f64) -> Result<f64> {
    positive("core.ae", ae, "m²")?;
    positive("core.window_height", window_height, "m")?;
    non_negative("gap", gap, "m")?;
    if gap == 0.0 {
        return Ok(1.0);
    }
    if gap >= 2.0 * window_height {
        return Err(Error::input(
            "gap",
            format!(
                "the fringing factor holds for gaps shorter than twice the window height ({:.2} mm); got {:.2} mm",
                2e3 * window_height,
                gap * 1e3
            ),
        ));
    }
    Ok(1.0 + gap / ae.sqrt() * (2.0 * window_height / gap).ln())
}

/// AL of a gapped core, before and after fringing.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct GapAl {
    /// Physical gap (centre-leg gap or spacer thickness), m.
    pub gap: f64,
    /// Gap in the magnetic path, m.
    pub path_gap: f64,
    /// μ0·Ae/(lg + le/μr), H per turn².
    pub al_unfringed: f64,
    /// McLyman's F (1 without fringing).
    pub fringing_factor: f64,
    /// F·al_unfringed, H per turn².
    pub al: f64,
}

impl GapAl {
    /// L′ = AL·N², H.
    pub fn inductance(&self, turns: f64) -> f64 {
        self.al * turns * turns
    }
}

/// AL of `core` with relative permeability `mu_r` and physical gap `gap`
/// (m) at `placement`; `fringing` selects L′ = F·L or plain L.
pub fn al_value(core: &GapCore, mu_r: f64, gap: f64, placement: GapPlacement, fringing: bool) -> Result<GapAl> {
    check_core(core)?;
    in_range("mu_r", mu_r, 1.0, 1.0e6, "")?;
    non_negative("gap", gap, "m")?;
    let max = placement.max_gap(core.window_height);
    if gap >= max {
        return Err(Error::input(
            "gap",
            format!("{}: {:.2} mm is too long (limit {:.2} mm)", placement.describe(), gap * 1e3, max * 1e3),
        ));
    }
    Ok(al_unchecked(core, mu_r, gap, placement, fringing))
}

fn check_core(core: &GapCore) -> Result<()> {
    positive("core.ae", core.ae, "m²")?;
    positive("core.le", core.le, "m")?;
    positive("core.window_height", core.window_height, "m")?;
    Ok(())
}

fn al_unchecked(core: &GapCore, mu_r: f64, gap: f64, placement: GapPlacement, fringing: bool) -> GapAl {
    let path_gap = placement.path_gap(gap);
    let al_unfringed = MU_0 * core.ae / (path_gap + core.le / mu_r);
    let f =
        if fringing && gap > 0.0 { 1.0 + gap / core.ae.sqrt() * (2.0 * core.window_height / gap).ln() } else { 1.0 };
    GapAl { gap, path_gap, al_unfringed, fringing_factor: f, al: f * al_unfringed }
}

/// Inductance of `turns` turns on the gapped core, H (L′ = F·L with
/// fringing). See [`al_value`].
pub fn inductance(
    core: &GapCore,
    mu_r: f64,
    turns: f64,
    gap: f64,
    placement: GapPlacement,
    fringing: bool,
) -> Result<f64> {
    positive("turns", turns, "")?;
    Ok(al_value(core, mu_r, gap, placement, fringing)?.inductance(turns))
}

/// The gap that gives AL = `al_target` (H per turn²). Without fringing,
/// closed form: lg = μ0·Ae/AL − le/μr. With fringing, AL′(g) is solved by
/// bisection on [0, max_gap): AL′ falls with the gap (F grows more slowly
/// than 1/(lg + le/μr) falls, for any realistic core), and bisection on a
/// bracket with a sign change converges regardless. Errors: the target is
/// above the ungapped AL (no gap can raise AL), or it needs a gap beyond
/// the limit of the placement.
pub fn solve_gap(core: &GapCore, mu_r: f64, al_target: f64, placement: GapPlacement, fringing: bool) -> Result<GapAl> {
    check_core(core)?;
    in_range("mu_r", mu_r, 1.0, 1.0e6, "")?;
    positive("al", al_target, "H per turn²")?;
    let al0 = MU_0 * mu_r * core.ae / core.le;
    if al_target > al0 * (1.0 + 1e-12) {
        return Err(Error::infeasible(
            Some("al"),
            format!(
                "even without a gap the core gives only AL = {:.0} nH per turn², below the {:.0} nH needed: use more turns, a larger core or a higher-permeability material",
                al0 * 1e9,
                al_target * 1e9
            ),
        ));
    }
    let max = placement.max_gap(core.window_height);
    let hi_limit = max * (1.0 - 1e-9);
    let at_limit = al_unchecked(core, mu_r, hi_limit, placement, fringing);
    if at_limit.al > al_target {
        return Err(Error::infeasible(
            Some("al"),
            format!(
                "the target AL = {:.1} nH needs a gap beyond the limit ({}; limit {:.2} mm gives {:.1} nH): use fewer turns, or a smaller core",
                al_target * 1e9,
                placement.describe(),
                max * 1e3,
                at_limit.al * 1e9
            ),
        ));
    }
    if !fringing {
        let path_gap = (MU_0 * core.ae / al_target - core.le / mu_r).max(0.0);
        let gap = match placement {
            GapPlacement::CentreLeg => path_gap,
            GapPlacement::Spacer => 0.5 * path_gap,
        };
        return Ok(al_unchecked(core, mu_r, gap, placement, false));
    }
    // Bisection: AL′(lo) ≥ target > AL′(hi).
    let (mut lo, mut hi) = (0.0_f64, hi_limit);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if al_unchecked(core, mu_r, mid, placement, true).al > al_target {
            lo = mid;
        } else {
            hi = mid;
        }
        if hi - lo <= 1e-14 * hi {
            break;
        }
    }
    Ok(al_unchecked(core, mu_r, 0.5 * (lo + hi), placement, true))
}

/// The gap for inductance `l` (H) with `turns` turns: [`solve_gap`] with
/// AL = L/N². Errors name `inductance` instead of `al`.
pub fn solve_gap_for_inductance(
    core: &GapCore,
    mu_r: f64,
    l: f64,
    turns: f64,
    placement: GapPlacement,
    fringing: bool,
) -> Result<GapAl> {
    positive("inductance", l, "H")?;
    positive("turns", turns, "")?;
    solve_gap(core, mu_r, l / (turns * turns), placement, fringing).map_err(|e| match e {
        Error::Infeasible { message, .. } => Error::infeasible(Some("inductance"), message),
        other => other,
    })
}

/// Energy stored in an inductance `l` (H) at current `i` (A): ½·L·I², J.
pub fn energy(l: f64, i: f64) -> f64 {
    0.5 * l * i * i
}

/// Peak flux density in the core, T: Bpk = L·Ipk/(N·Ae) (Faraday: N·Φ =
/// L·I). Give the fringing-corrected L′ (see the module documentation).
pub fn peak_flux_density(l: f64, i_pk: f64, turns: f64, ae: f64) -> Result<f64> {
    positive("inductance", l, "H")?;
    non_negative("i_pk", i_pk.abs(), "A")?;
    positive("turns", turns, "")?;
    positive("core.ae", ae, "m²")?;
    Ok(l * i_pk.abs() / (turns * ae))
}

/// The saturation check of a peak flux density.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SaturationCheck {
    /// The peak flux density checked, T.
    pub b_peak: f64,
    /// Bsat at the temperature, T.
    pub b_sat: f64,
    /// Bsat·(1 − margin), T.
    pub b_limit: f64,
    /// The margin asked for (0.2 = stay 20 % below Bsat).
    pub margin: f64,
    /// b_peak ≤ b_limit.
    pub ok: bool,
    /// A sentence for the user when not ok.
    pub message: Option<String>,
}

/// Checks `b_peak` (T) against the material's Bsat at `temp_c` °C with a
/// relative `margin` (0 ≤ margin < 1).
pub fn saturation_check(material: &Material, temp_c: f64, b_peak: f64, margin: f64) -> Result<SaturationCheck> {
    let temp = in_range("temperature", temp_c, -60.0, 250.0, "°C")?;
    non_negative("b_peak", b_peak, "T")?;
    in_range("margin", margin, 0.0, 0.9, "")?;
    let b_sat = material.bsat_at(temp);
    let b_limit = b_sat * (1.0 - margin);
    let ok = b_peak <= b_limit && temp < material.curie_c;
    let message = (!ok).then(|| {
        if temp >= material.curie_c {
            format!("{temp:.0} °C is above the Curie temperature ({:.0} °C): the core is not magnetic", material.curie_c)
        } else {
            format!(
                "Bpk {:.0} mT exceeds {:.0} mT (Bsat {:.0} mT at {temp:.0} °C less a {:.0} % margin): more turns on a larger gap, or a larger core",
                b_peak * 1e3,
                b_limit * 1e3,
                b_sat * 1e3,
                margin * 100.0
            )
        }
    });
    Ok(SaturationCheck { b_peak, b_sat, b_limit, margin, ok, message })
}

/// A gapped inductor at one operating point.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct GappedInductor {
    pub al: GapAl,
    /// L′ = F·L, H.
    pub inductance: f64,
    /// ½·L′·Ipk², J.
    pub energy: f64,
    /// L′·Ipk/(N·Ae), T.
    pub b_peak: f64,
    /// The current at which B reaches the limit Bsat·(1 − margin), A.
    pub i_limit: f64,
    pub saturation: SaturationCheck,
}

/// Everything about `turns` turns on `core` of `material` with a physical
/// gap `gap` at `placement`, carrying the peak current `i_pk` at `temp_c`,
/// with fringing, checked against Bsat with `margin`.
#[allow(clippy::too_many_arguments)]
pub fn evaluate(
    core: &GapCore,
    material: &Material,
    turns: f64,
    gap: f64,
    placement: GapPlacement,
    i_pk: f64,
    temp_c: f64,
    margin: f64,
) -> Result<GappedInductor> {
    positive("turns", turns, "")?;
    let al = al_value(core, material.mu_i, gap, placement, true)?;
    let l = al.inductance(turns);
    let b_peak = peak_flux_density(l, i_pk, turns, core.ae)?;
    let saturation = saturation_check(material, temp_c, b_peak, margin)?;
    let i_limit = saturation.b_limit * turns * core.ae / l;
    Ok(GappedInductor { al, inductance: l, energy: energy(l, i_pk), b_peak, i_limit, saturation })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::material::library;

    // A core of roughly E 30/15/7 size (made-up round numbers, not a catalogue part).
    fn core() -> GapCore {
        GapCore::new(60e-6, 67e-3, 19.5e-3).unwrap()
    }

    #[test]
    fn ungapped_limit_and_al_definition() {
        let c = core();
        let mu = 2300.0;
        // lg → 0: L = μ0·μr·N²·Ae/le (magnetic-circuit law with no gap).
        let l0 = inductance(&c, mu, 20.0, 0.0, GapPlacement::CentreLeg, true).unwrap();
        let want = 4.0e-7 * std::f64::consts::PI * mu * 400.0 * 60e-6 / 67e-3;
        assert!((l0 / want - 1.0).abs() < 1e-12);
        let tiny = inductance(&c, mu, 20.0, 1e-12, GapPlacement::CentreLeg, true).unwrap();
        assert!((tiny / want - 1.0).abs() < 1e-6);
        // AL = L/N² for any N.
        let a = al_value(&c, mu, 0.5e-3, GapPlacement::CentreLeg, true).unwrap();
        for n in [1.0, 7.0, 33.0] {
            let l = inductance(&c, mu, n, 0.5e-3, GapPlacement::CentreLeg, true).unwrap();
            assert!((l / (n * n) - a.al).abs() < 1e-15);
        }
        // Gapped, no fringing: μ0·N²·Ae/(lg + le/μr) by hand.
        let lg = 0.4e-3;
        let hand = 4.0e-7 * std::f64::consts::PI * 400.0 * 60e-6 / (lg + 67e-3 / mu);
        let l = inductance(&c, mu, 20.0, lg, GapPlacement::CentreLeg, false).unwrap();
        assert!((l / hand - 1.0).abs() < 1e-12);
        // Spacer of g: same as a centre-leg gap of 2g (without fringing).
        let s = inductance(&c, mu, 20.0, lg / 2.0, GapPlacement::Spacer, false).unwrap();
        assert!((s / l - 1.0).abs() < 1e-12);
    }

    #[test]
    fn fringing_factor_above_one_and_its_limits() {
        let (ae, g) = (60e-6, 19.5e-3);
        assert_eq!(fringing_factor(ae, 0.0, g).unwrap(), 1.0);
        // By hand: lg = 1 mm, √Ae = 7.746 mm, ln(39) = 3.6636 → F = 1.473.
        let f = fringing_factor(ae, 1e-3, g).unwrap();
        assert!((f - (1.0 + 1e-3 / ae.sqrt() * (39.0f64).ln())).abs() < 1e-12);
        assert!((f - 1.473).abs() < 1e-3);
        let mut prev = 1.0;
        for lg in [1e-6, 1e-5, 1e-4, 1e-3, 5e-3] {
            let f = fringing_factor(ae, lg, g).unwrap();
            assert!(f > 1.0 && f > prev, "F({lg}) = {f}");
            prev = f;
        }
        // At lg = 2G, ln(1) = 0 → F = 1; the formula's range ends there.
        let near = fringing_factor(ae, 2.0 * g * (1.0 - 1e-9), g).unwrap();
        assert!((near - 1.0).abs() < 1e-6);
        assert!(fringing_factor(ae, 2.0 * g, g).is_err());
        // F·L is larger than L.
        let a = al_value(&core(), 2300.0, 1e-3, GapPlacement::CentreLeg, true).unwrap();
        assert!((a.al / a.al_unfringed - a.fringing_factor).abs() < 1e-12 && a.al > a.al_unfringed);
    }

    #[test]
    fn gap_solve_round_trip() {
        let c = core();
        for placement in [GapPlacement::CentreLeg, GapPlacement::Spacer] {
            for fringing in [false, true] {
                for al in [1000e-9, 250e-9, 100e-9, 40e-9] {
                    let s = solve_gap(&c, 2300.0, al, placement, fringing).unwrap();
                    let back = al_value(&c, 2300.0, s.gap, placement, fringing).unwrap();
                    assert!((back.al / al - 1.0).abs() < 1e-9, "{placement:?} {fringing} {al}");
                    assert_eq!(back.path_gap, placement.path_gap(s.gap));
                }
            }
        }
        // Inductance target: 200 µH with 30 turns.
        let s = solve_gap_for_inductance(&c, 2300.0, 200e-6, 30.0, GapPlacement::CentreLeg, true).unwrap();
        let l = inductance(&c, 2300.0, 30.0, s.gap, GapPlacement::CentreLeg, true).unwrap();
        assert!((l / 200e-6 - 1.0).abs() < 1e-9);
        // Fringing makes the required gap larger.
        let plain = solve_gap_for_inductance(&c, 2300.0, 200e-6, 30.0, GapPlacement::CentreLeg, false).unwrap();
        assert!(s.gap > plain.gap);
    }

    #[test]
    fn gap_solve_errors() {
        let c = core();
        // Ungapped AL = μ0·2300·60e-6/67e-3 ≈ 2588 nH: 3000 nH is out of reach.
        let e = solve_gap(&c, 2300.0, 3000e-9, GapPlacement::CentreLeg, true).unwrap_err();
        assert_eq!(e.field(), Some("al"));
        assert!(e.message().contains("without a gap"));
        // 1 nH needs far more than the window height.
        let e = solve_gap(&c, 2300.0, 1e-9, GapPlacement::CentreLeg, true).unwrap_err();
        assert!(e.message().contains("beyond the limit"), "{e}");
        let e = solve_gap_for_inductance(&c, 2300.0, 1.0, 10.0, GapPlacement::CentreLeg, true).unwrap_err();
        assert_eq!(e.field(), Some("inductance"));
        assert!(al_value(&c, 2300.0, 20e-3, GapPlacement::CentreLeg, true).is_err());
        assert!(al_value(&c, 2300.0, 20e-3, GapPlacement::Spacer, true).is_ok());
        assert!(GapCore::new(0.0, 1.0, 1.0).is_err());
    }

    #[test]
    fn peak_flux_uses_fringed_inductance() {
        // Independent: Ampère's law H_core·le + H_gap·lg = N·I with B
        // continuous gives B0 = μ0·N·I/(lg + le/μr); with fringing the core
        // carries F times that flux (N·Φ = L′·I).
        let c = core();
        let m = library::find("MnZn-200k").unwrap();
        let (n, lg, i) = (25.0, 0.8e-3, 3.0);
        let r = evaluate(&c, &m, n, lg, GapPlacement::CentreLeg, i, 100.0, 0.2).unwrap();
        let b0 = MU_0 * n * i / (lg + c.le / m.mu_i);
        assert!((r.b_peak / (r.al.fringing_factor * b0) - 1.0).abs() < 1e-12);
        assert!((r.energy - 0.5 * r.inductance * i * i).abs() < 1e-15);
        // i_limit drives B exactly to the limit.
        let b_at_limit = peak_flux_density(r.inductance, r.i_limit, n, c.ae).unwrap();
        assert!((b_at_limit / r.saturation.b_limit - 1.0).abs() < 1e-12);
        assert!((r.saturation.b_limit - 0.8 * m.bsat_at(100.0)).abs() < 1e-12);
        assert_eq!(r.saturation.ok, r.b_peak <= r.saturation.b_limit);
        // Large current saturates, with a message.
        let hot = evaluate(&c, &m, n, lg, GapPlacement::CentreLeg, 30.0, 100.0, 0.2).unwrap();
        assert!(!hot.saturation.ok && hot.saturation.message.is_some());
        assert!(saturation_check(&m, 100.0, 0.1, 1.5).is_err());
    }
}
