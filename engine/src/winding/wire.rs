//! Conductor facts: AWG diameters and copper resistivity.

use crate::error::{in_range, Result};

/// Resistivity of annealed copper at 20 °C, Ω·m.
///
/// IEC 60028 (International Annealed Copper Standard): 1/58 Ω·mm²/m at
/// 20 °C, i.e. 1/58 × 10⁻⁶ Ω·m.
pub const RHO_CU_20: f64 = 1.0 / 58.0e6;

/// Temperature coefficient of copper resistance at 20 °C, 1/K (IEC 60028).
pub const ALPHA_CU_20: f64 = 0.00393;

/// Copper resistivity at `temp_c` °C, Ω·m: ρ(T) = ρ20·(1 + α20·(T − 20 °C)),
/// the linear law of IEC 60028 (valid over the range of winding
/// temperatures, about −40 to 200 °C).
pub fn copper_resistivity(temp_c: f64) -> Result<f64> {
    let t = in_range("temperature", temp_c, -60.0, 250.0, "°C")?;
    Ok(RHO_CU_20 * (1.0 + ALPHA_CU_20 * (t - 20.0)))
}

/// Bare diameter of an AWG size, m.
///
/// ASTM B258: d = 0.127 mm × 92^((36 − n)/39); sizes 0000, 000, 00 are
/// n = −3, −2, −1. Accepts −3 ≤ n ≤ 56.
pub fn awg_diameter(n: i32) -> Result<f64> {
    in_range("awg", n as f64, -3.0, 56.0, "AWG")?;
    Ok(awg_table()[(n + 3) as usize])
}

/// The diameters of AWG −3 to 56 by the formula of [`awg_diameter`],
/// computed once: the conductor search asks for them thousands of times
/// a design, and a table lookup is the same value without the power.
fn awg_table() -> &'static [f64; 60] {
    static TABLE: std::sync::OnceLock<[f64; 60]> = std::sync::OnceLock::new();
    TABLE.get_or_init(|| std::array::from_fn(|i| 0.127e-3 * 92f64.powf((36.0 - (i as f64 - 3.0)) / 39.0)))
}

/// Copper cross-section of a round wire of bare diameter `d` (m), m².
pub fn round_area(d: f64) -> f64 {
    std::f64::consts::PI * d * d / 4.0
}

/// DC resistance of `length` metres of conductor of copper area `area` at
/// `temp_c`: R = ρ(T)·l/A.
pub fn dc_resistance(length: f64, area: f64, temp_c: f64) -> Result<f64> {
    Ok(copper_resistivity(temp_c)? * length / area)
}

#[cfg(test)]
mod tests {
    #[test]
    fn the_awg_table_is_the_formula() {
        // ASTM B258: d = 0.127 mm · 92^((36 − n)/39); the table holds it bit for bit.
        for n in -3..=56 {
            let want = 0.127e-3 * 92f64.powf((36.0 - n as f64) / 39.0);
            assert_eq!(awg_diameter(n).unwrap().to_bits(), want.to_bits(), "AWG {n}");
        }
        assert!(awg_diameter(-4).is_err() && awg_diameter(57).is_err());
    }

    use super::*;

    #[test]
    fn awg_36_is_five_mils() {
        // ASTM B258 defines AWG 36 as 0.0050 in = 0.127 mm exactly.
        assert!((awg_diameter(36).unwrap() - 0.127e-3).abs() < 1e-15);
        // AWG 0000 is 0.4600 in = 11.684 mm (ASTM B258).
        assert!((awg_diameter(-3).unwrap() - 11.684e-3).abs() < 1e-6);
    }

    #[test]
    fn resistivity_at_20_and_100() {
        // IEC 60028: 1/58 Ω·mm²/m at 20 °C.
        assert!((copper_resistivity(20.0).unwrap() * 1e6 - 1.0 / 58.0).abs() < 1e-15);
        // 1/58 × (1 + 0.00393 × 80) = 0.022662 Ω·mm²/m at 100 °C.
        let r100 = copper_resistivity(100.0).unwrap() * 1e6;
        assert!((r100 - 0.0226621).abs() < 1e-6, "{r100}");
        assert!(copper_resistivity(f64::NAN).is_err());
    }
}
