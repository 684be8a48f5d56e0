//! Views: the numbers behind the page's pictures, derived from a finished
//! [`Report`] and nothing else.
//!
//! The report already holds every result; a picture sometimes needs them in
//! another shape. These functions only rearrange and evaluate what the
//! solver found, so a picture can never disagree with the numbers in the
//! results panel, and the web client stays free of physics.
//!
//! * [`mmf_profile`]: the magnetomotive force (ampere-turns) across the
//!   winding window, from the bobbin outward, at one instant of one line
//!   corner: the MMF diagram of the chosen interleaving.
//! * [`saturation`]: Bsat of the material against temperature, the limit
//!   Bsat·(1 − margin) the saturation check uses, and where the design
//!   operates (Bpk and the flux swing at the equilibrium core
//!   temperature).
//! * [`value_at`] and [`peak_instant`]: a [`Pwl`] evaluated at an instant,
//!   from the left or the right of an ideal step.
//!
//! ## The MMF diagram
//!
//! In the one-dimensional model of a layered winding (Dowell 1966; the MMF
//! diagrams of Erickson & Maksimovic, Fundamentals of Power Electronics,
//! 2nd ed., §13.4) the field in the window runs along the winding breadth
//! and depends only on the position x across the build. By Ampère's law
//! around a path enclosing everything between the bobbin and x, the MMF
//! F(x) = H(x)·b is the sum of the ampere-turns inside x:
//!
//! * F = 0 at the bobbin (no current enclosed; the 1-D assumption, which
//!   ignores the 2-D field near an air gap);
//! * across a layer of N turns carrying i, F rises by N·i, linearly for a
//!   current spread evenly through the layer's height (low frequency: the
//!   picture shows where the field is, not its skin-depth detail);
//! * across tape, screens and gaps between layers F is constant.
//!
//! The currents are taken in the loss model's dot convention (positive
//! where the winding's ampere-turns drive flux in the core's positive
//! sense; see [`core_sense`]). For a transformer the ampere-turns balance
//! except for the magnetising MMF, so F returns near zero after the last
//! layer; whatever is left ([`MmfProfile::residual`]) is the net
//! ampere-turns: the magnetising current, plus the share of the primary
//! current the topology model adds for the losses (it refers the primary
//! current from Pin = Pout/η, conservatively). A flyback at its primary
//! peak carries only the primary: F rises to Np·Ipk and stays there.
//!
//! The instant shown is the primary's current peak (the first winding whose
//! name starts with "primary"), the moment of the largest field in a
//! forward or bridge transformer's window. At an ideal step the side of the
//! step where the peak lies is used for every winding ([`peak_instant`]).

use super::solve::Report;
use crate::error::{Error, Result};
use crate::topology::{Corner, OperatingPoint};
use crate::waveform::Pwl;
use crate::winding::fit::LayerFit;
use serde::Serialize;

/// Which side of an instant a waveform is read at (matters at ideal steps).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Approach {
    /// The left limit y(t⁻): the value just before the instant.
    Before,
    /// The right limit y(t⁺): the value just after.
    After,
}

/// The value of a periodic piecewise-linear waveform at `t` (s), reduced
/// into one period, as the left or right limit. Between breakpoints this
/// is linear interpolation; at a step (two breakpoints at one time) the
/// left limit is the first breakpoint's value and the right limit the
/// last's. Periodicity: the left limit at 0 is the one at T, the right
/// limit at T the one at 0.
pub fn value_at(w: &Pwl, t: f64, side: Approach) -> f64 {
    let pts = &w.points;
    let (Some(&(_, first)), Some(&(_, last))) = (pts.first(), pts.last()) else {
        return 0.0;
    };
    let p = w.period;
    if !(p.is_finite() && p > 0.0 && t.is_finite()) {
        return first;
    }
    let mut t = t.rem_euclid(p);
    // Reduce t = 0 approached from the left to t = T, and t = T from the
    // right to t = 0.
    if side == Approach::Before && t == 0.0 {
        t = p;
    }
    if side == Approach::After && t >= p {
        t = 0.0;
    }
    match side {
        Approach::Before => {
            // First breakpoint at or after t.
            let i = pts.partition_point(|q| q.0 < t);
            match (i.checked_sub(1).and_then(|j| pts.get(j)), pts.get(i)) {
                (_, Some(&(ti, yi))) if ti == t => yi,
                (Some(&(t0, y0)), Some(&(t1, y1))) => lerp(t0, y0, t1, y1, t),
                (None, Some(&(_, y))) => y,
                _ => last,
            }
        }
        Approach::After => {
            // Last breakpoint at or before t.
            let i = pts.partition_point(|q| q.0 <= t);
            match (i.checked_sub(1).and_then(|j| pts.get(j)), pts.get(i)) {
                (Some(&(ti, yi)), _) if ti == t => yi,
                (Some(&(t0, y0)), Some(&(t1, y1))) => lerp(t0, y0, t1, y1, t),
                (Some(&(_, y)), None) => y,
                _ => first,
            }
        }
    }
}

fn lerp(t0: f64, y0: f64, t1: f64, y1: f64, t: f64) -> f64 {
    if t1 > t0 {
        y0 + (y1 - y0) * (t - t0) / (t1 - t0)
    } else {
        y1
    }
}

/// The instant of a waveform's largest |y| (the first, if several tie) and
/// the side of it where that value lies: before a step down (`Before`),
/// after a step up (`After`), `Before` where the waveform is continuous.
pub fn peak_instant(w: &Pwl) -> (f64, Approach) {
    let pts = &w.points;
    let mut k = 0;
    for (i, q) in pts.iter().enumerate() {
        if q.1.abs() > pts.get(k).map_or(0.0, |p| p.1.abs()) {
            k = i;
        }
    }
    let Some(&(t, _)) = pts.get(k) else {
        return (0.0, Approach::Before);
    };
    let step_after = pts.get(k + 1).is_some_and(|q| q.0 == t);
    let step_before = k.checked_sub(1).and_then(|j| pts.get(j)).is_some_and(|q| q.0 == t);
    let side = if step_before && !step_after {
        Approach::After
    } else {
        Approach::Before
    };
    (t, side)
}

pub use super::solve::core_sense;

/// One layer of the MMF diagram.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MmfLayer {
    /// The winding it belongs to.
    pub winding: String,
    /// Inner face above the bobbin and radial height, m.
    pub h_bottom: f64,
    pub height: f64,
    /// Ampere-turns per ampere (turns of the layer; 1/parallel for one of
    /// several stacked foils).
    pub mmf_per_amp: f64,
    /// The winding's current at the instant, dot convention, A.
    pub current: f64,
    /// MMF at the layer's inner and outer face, A (ampere-turns).
    pub mmf_inner: f64,
    pub mmf_outer: f64,
}

/// The MMF across the winding window at one instant.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MmfProfile {
    pub corner: Corner,
    /// The instant, s from the start of the period, and the side of it.
    pub time: f64,
    pub approach: Approach,
    /// The winding whose current peak sets the instant.
    pub reference: String,
    /// Each stack-up winding's current at the instant, dot convention, A.
    pub currents: Vec<(String, f64)>,
    pub layers: Vec<MmfLayer>,
    /// The diagram's breakpoints (position above the bobbin m, MMF A):
    /// from (0, 0) to the outer face of the last layer, then to the total
    /// build. Linear between them.
    pub points: Vec<(f64, f64)>,
    /// Largest |MMF| across the window, A.
    pub peak: f64,
    /// MMF after the last layer: the net ampere-turns, A.
    pub residual: f64,
}

/// The MMF diagram's breakpoints for layers (in stack-up order, from the
/// bobbin out) and each winding's current (indexed by `LayerFit::winding`;
/// a missing entry counts as no current): F = 0 at h = 0, flat up to each
/// layer's inner face, rising by `mmf_per_amp·i` across its height (see
/// the module docs). The last point is at the outer face of the last layer.
pub fn mmf_points(layers: &[LayerFit], amps: &[f64]) -> Vec<(f64, f64)> {
    let mut pts = Vec::with_capacity(2 * layers.len() + 1);
    pts.push((0.0, 0.0));
    let mut f = 0.0;
    for l in layers {
        let i = amps.get(l.winding).copied().unwrap_or(0.0);
        if l.h_bottom > pts.last().map_or(0.0, |p| p.0) {
            pts.push((l.h_bottom, f));
        }
        f += l.mmf_per_amp * i;
        pts.push((l.h_bottom + l.height, f));
    }
    pts
}

fn corner_point(r: &Report, corner: Corner) -> &OperatingPoint {
    match corner {
        Corner::VinMin => &r.waveforms.at_vin_min,
        Corner::VinMax => &r.waveforms.at_vin_max,
    }
}

/// The MMF across the window at the primary's current peak of `corner`
/// (module docs). Errors when the report has no windings or no layers.
pub fn mmf_profile(report: &Report, corner: Corner) -> Result<MmfProfile> {
    let op = corner_point(report, corner);
    let reference = op
        .windings
        .iter()
        .find(|w| w.name.starts_with("primary"))
        .or_else(|| op.windings.first())
        .ok_or_else(|| Error::infeasible(None, "the design has no windings to draw"))?;
    if report.fit.layers.is_empty() {
        return Err(Error::infeasible(None, "the stack-up has no layers to draw"));
    }
    let (time, approach) = peak_instant(&reference.current);
    let currents: Vec<(String, f64)> = report
        .stackup
        .windings
        .iter()
        .map(|def| {
            let i = op.windings.iter().find(|w| w.name == def.name).map_or(0.0, |w| {
                value_at(&w.current, time, approach) * core_sense(report.topology, &w.name)
            });
            (def.name.clone(), i)
        })
        .collect();
    let amps: Vec<f64> = currents.iter().map(|c| c.1).collect();
    let mut points = mmf_points(&report.fit.layers, &amps);
    let residual = points.last().map_or(0.0, |p| p.1);
    let outer = points.last().map_or(0.0, |p| p.0);
    if report.fit.total_build > outer {
        points.push((report.fit.total_build, residual));
    }
    let mut f = 0.0;
    let layers = report
        .fit
        .layers
        .iter()
        .map(|l| {
            let current = amps.get(l.winding).copied().unwrap_or(0.0);
            let inner = f;
            f += l.mmf_per_amp * current;
            MmfLayer {
                winding: currents.get(l.winding).map(|c| c.0.clone()).unwrap_or_default(),
                h_bottom: l.h_bottom,
                height: l.height,
                mmf_per_amp: l.mmf_per_amp,
                current,
                mmf_inner: inner,
                mmf_outer: f,
            }
        })
        .collect();
    let peak = points.iter().map(|p| p.1.abs()).fold(0.0, f64::max);
    Ok(MmfProfile {
        corner,
        time,
        approach,
        reference: reference.name.clone(),
        currents,
        layers,
        points,
        peak,
        residual,
    })
}

/// Where the design operates against saturation.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SaturationView {
    /// (temperature °C, Bsat T) from [`crate::material::Material::bsat_at`].
    pub bsat: Vec<(f64, f64)>,
    /// (temperature °C, Bsat·(1 − margin) T): the saturation check's limit.
    pub limit: Vec<(f64, f64)>,
    /// The saturation margin the check uses (0.2 = 20 %).
    pub margin: f64,
    /// Equilibrium core temperature, °C.
    pub temperature: f64,
    /// The core temperature limit of the spec and the ambient, °C.
    pub temperature_max: f64,
    pub ambient: f64,
    /// Worst-corner Bpk in the smallest section (Bpk·Ae/Amin where
    /// Amin < Ae), T, and that corner.
    pub b_peak: f64,
    pub corner: Corner,
    /// Lowest and highest B over the period at that corner, in the same
    /// section, T (the swing).
    pub b_min: f64,
    pub b_max: f64,
    /// Bsat and the limit at the operating temperature, T.
    pub bsat_at_operating: f64,
    pub limit_at_operating: f64,
}

/// Bsat against temperature from `t_from` to `t_to` °C (`n` ≥ 2 evenly
/// spaced samples; the range is swapped if given backwards), and the
/// design's operating point (module docs). The margin is read back from
/// the report's saturation check, whose limit is Bsat(T)·(1 − margin);
/// it is 0 if the check is missing.
pub fn saturation(report: &Report, t_from: f64, t_to: f64, n: usize) -> Result<SaturationView> {
    crate::error::in_range("views.t_from", t_from, -60.0, 400.0, "°C")?;
    crate::error::in_range("views.t_to", t_to, -60.0, 400.0, "°C")?;
    if !(2..=1000).contains(&n) {
        return Err(Error::input("views.points", "2 to 1000 points"));
    }
    let (lo, hi) = if t_to >= t_from { (t_from, t_to) } else { (t_to, t_from) };
    let m = &report.material;
    let t_op = report.thermal.temperature;
    let bsat_op = m.bsat_at(t_op);
    let check = report.checks.iter().find(|c| c.key == "saturation");
    let margin = match check {
        Some(c) if bsat_op > 0.0 => (1.0 - c.limit / bsat_op).clamp(0.0, 1.0),
        _ => 0.0,
    };
    let temperature_max = report
        .checks
        .iter()
        .find(|c| c.key == "temperature")
        .map_or(t_op, |c| c.limit);
    let bsat: Vec<(f64, f64)> = (0..n)
        .map(|i| lo + (hi - lo) * i as f64 / (n - 1) as f64)
        .map(|t| (t, m.bsat_at(t)))
        .collect();
    let limit = bsat.iter().map(|&(t, b)| (t, b * (1.0 - margin))).collect();
    let worst = report.waveforms.get("b_peak");
    let corner = worst.map_or(report.loss_corner, |w| w.corner);
    let flux = &corner_point(report, corner).flux;
    // Saturation is judged in the smallest section (see `solve::sat_scale`).
    let k = super::solve::sat_scale(&report.core);
    Ok(SaturationView {
        bsat,
        limit,
        margin,
        temperature: t_op,
        temperature_max,
        ambient: t_op - report.thermal.rise,
        b_peak: worst.map_or(flux.peak_abs(), |w| w.value) * k,
        corner,
        b_min: flux.min() * k,
        b_max: flux.max() * k,
        bsat_at_operating: bsat_op,
        limit_at_operating: bsat_op * (1.0 - margin),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::{evaluate, Design};

    fn layer(winding: usize, turns: u32, h_bottom: f64, height: f64) -> LayerFit {
        LayerFit {
            item: 0,
            winding,
            turns,
            h_bottom,
            height,
            turn_length: 0.05,
            breadth: 0.01,
            mmf_per_amp: turns as f64,
            copper_area: 1e-6,
        }
    }

    #[test]
    fn interleaved_mmf_halves_the_peak_and_returns_to_zero() {
        // Hand-computed MMF diagrams (Erickson & Maksimovic 2nd ed. §13.4,
        // interleaving): 20 primary turns at 1 A against 10 secondary turns
        // at 2 A (ampere-turns balance). Sequential P P S S: 0 → 10 → 20 →
        // 10 → 0; interleaved P S S P: 0 → 10 → 0 → −10 → 0.
        let (p, s) = (1.0, -2.0);
        let h = 0.3e-3;
        let gap = 0.05e-3;
        let at = |k: usize| k as f64 * (h + gap);
        let seq = [
            layer(0, 10, at(0), h),
            layer(0, 10, at(1), h),
            layer(1, 5, at(2), h),
            layer(1, 5, at(3), h),
        ];
        let f = mmf_points(&seq, &[p, s]);
        assert_eq!(f[0], (0.0, 0.0));
        let ends: Vec<f64> = seq
            .iter()
            .map(|l| f.iter().find(|q| q.0 == l.h_bottom + l.height).unwrap().1)
            .collect();
        assert_eq!(ends, vec![10.0, 20.0, 10.0, 0.0]);
        let inter = [
            layer(0, 10, at(0), h),
            layer(1, 5, at(1), h),
            layer(1, 5, at(2), h),
            layer(0, 10, at(3), h),
        ];
        let g = mmf_points(&inter, &[p, s]);
        let ends: Vec<f64> = inter
            .iter()
            .map(|l| g.iter().find(|q| q.0 == l.h_bottom + l.height).unwrap().1)
            .collect();
        assert_eq!(ends, vec![10.0, 0.0, -10.0, 0.0]);
        // Flat across the insulation between layers: the inner face of
        // layer 2 carries layer 1's outer value.
        assert!(g.contains(&(at(1), 10.0)));
        let peak = |v: &[(f64, f64)]| v.iter().map(|q| q.1.abs()).fold(0.0, f64::max);
        assert_eq!(peak(&f), 20.0);
        assert_eq!(peak(&g), 10.0);
    }

    #[test]
    fn values_at_steps_and_between() {
        // A forward-like primary current: 0, step to 1 A, ramp to 3 A at
        // 4 µs, step to 0, zero to 10 µs.
        let w = Pwl::new(
            10e-6,
            vec![(0.0, 0.0), (0.0, 1.0), (4e-6, 3.0), (4e-6, 0.0), (10e-6, 0.0)],
        )
        .unwrap();
        assert_eq!(value_at(&w, 4e-6, Approach::Before), 3.0);
        assert_eq!(value_at(&w, 4e-6, Approach::After), 0.0);
        assert!((value_at(&w, 2e-6, Approach::Before) - 2.0).abs() < 1e-12);
        assert!((value_at(&w, 2e-6, Approach::After) - 2.0).abs() < 1e-12);
        // Periodic: just before 0 is the end of the period, 0 after the step is 1 A.
        assert_eq!(value_at(&w, 0.0, Approach::Before), 0.0);
        assert_eq!(value_at(&w, 0.0, Approach::After), 1.0);
        assert!((value_at(&w, 12e-6, Approach::After) - 2.0).abs() < 1e-12);
        assert_eq!(peak_instant(&w), (4e-6, Approach::Before));
        // A peak right after a step up is read from the right.
        let v = Pwl::new(1.0, vec![(0.0, 0.0), (0.5, 0.0), (0.5, -2.0), (1.0, -1.0)]).unwrap();
        assert_eq!(peak_instant(&v), (0.5, Approach::After));
    }

    #[test]
    fn forward_demo_mmf_steps_by_turns_times_current_and_nearly_balances() {
        let r = evaluate(&Design::demo_forward()).unwrap();
        for corner in [Corner::VinMin, Corner::VinMax] {
            let m = mmf_profile(&r, corner).unwrap();
            assert_eq!(m.points[0], (0.0, 0.0));
            let op = corner_point(&r, corner);
            let prim = op.windings.iter().find(|w| w.name == "primary").unwrap();
            // The instant is the primary's peak: its current there is its peak.
            let ip = m.currents.iter().find(|c| c.0 == "primary").unwrap().1;
            assert!((ip - prim.peak).abs() < 1e-9 * prim.peak, "{ip} vs {}", prim.peak);
            // Ampère's law: the MMF after the last layer is the sum of every
            // winding's turns × current, taken from the turn counts (not the
            // layers): Np·ip − Σ Ns·is (forward secondaries oppose), reset idle.
            let sum: f64 = op
                .windings
                .iter()
                .map(|w| {
                    let i = m.currents.iter().find(|c| c.0 == w.name).map_or(0.0, |c| c.1);
                    w.turns as f64 * i
                })
                .sum();
            assert!(
                (m.residual - sum).abs() < 1e-9 * m.peak.max(1.0),
                "{} vs {sum}",
                m.residual
            );
            let sec = op.windings.iter().find(|w| w.name == "secondary 1").unwrap();
            let is = m.currents.iter().find(|c| c.0 == "secondary 1").unwrap().1;
            assert!(is < 0.0 && (is.abs() - sec.peak).abs() < 1e-9 * sec.peak);
            // A transformer's ampere-turns balance up to the magnetising and
            // loss share: the residual is a small part of Np·Ip.
            let np_ip = r.turns.primary as f64 * ip;
            assert!(
                m.residual.abs() < 0.25 * np_ip,
                "residual {} of Np·Ip {np_ip}",
                m.residual
            );
            // Each layer steps by its turns × its winding's current.
            for l in &m.layers {
                let i = m.currents.iter().find(|c| c.0 == l.winding).unwrap().1;
                assert!((l.mmf_outer - l.mmf_inner - l.mmf_per_amp * i).abs() < 1e-9 * m.peak.max(1.0));
            }
            assert!(m.points.windows(2).all(|w| w[1].0 >= w[0].0));
            assert!(m.points.iter().all(|p| p.0.is_finite() && p.1.is_finite()));
        }
    }

    #[test]
    fn flyback_primary_peak_leaves_its_full_ampere_turns() {
        // At the end of the on-time only the primary conducts (the
        // secondaries start just after), so the window ends at Np·Ipk.
        let r = evaluate(&Design::demo_flyback()).unwrap();
        let m = mmf_profile(&r, Corner::VinMin).unwrap();
        let prim = r
            .waveforms
            .at_vin_min
            .windings
            .iter()
            .find(|w| w.name == "primary")
            .unwrap();
        let want = r.turns.primary as f64 * prim.peak;
        assert!((m.residual - want).abs() < 1e-6 * want, "{} vs {want}", m.residual);
        assert_eq!(m.approach, Approach::Before);
    }

    #[test]
    fn saturation_view_matches_the_check() {
        let d = Design::demo_forward();
        let r = evaluate(&d).unwrap();
        let v = saturation(&r, 25.0, 150.0, 26).unwrap();
        assert_eq!(v.bsat.len(), 26);
        assert_eq!(v.bsat.first().unwrap().0, 25.0);
        assert_eq!(v.bsat.last().unwrap().0, 150.0);
        // The margin read back equals the design file's.
        assert!((v.margin - d.choices.saturation_margin).abs() < 1e-9);
        for (a, b) in v.bsat.iter().zip(&v.limit) {
            assert!((b.1 - a.1 * (1.0 - d.choices.saturation_margin)).abs() < 1e-12);
        }
        // At 25 °C the curve is the material's 25 °C value (its data).
        assert!((v.bsat[0].1 - r.material.bsat_25).abs() < 1e-12);
        // The swing bar spans the corner's ΔB (the topology's own figure),
        // taken in the smallest section like the check.
        let op = corner_point(&r, v.corner);
        let k = crate::design::solve::sat_scale(&r.core);
        assert!((v.b_max - v.b_min - op.delta_b * k).abs() < 1e-9);
        let check = r.checks.iter().find(|c| c.key == "saturation").unwrap();
        assert!((v.b_peak - check.value).abs() < 1e-12, "the figure shows the check's Bpk");
        assert!((v.temperature - r.thermal.temperature).abs() < 1e-12);
        assert!(v.b_peak < v.limit_at_operating, "the demo passes the saturation check");
        assert!(saturation(&r, 25.0, 150.0, 1).is_err());
        assert!(saturation(&r, f64::NAN, 150.0, 10).is_err());
    }
}
