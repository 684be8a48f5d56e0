//! Conductor facts against their standards.

use magwright_engine::winding::wire::{awg_diameter, copper_resistivity};

/// ASTM B258, table of standard AWG diameters, tabulated in inches rounded
/// to 0.0001 in: the formula must round to the tabulated value.
#[test]
fn awg_diameters_astm_b258() {
    let table = [
        (0, 0.3249),
        (10, 0.1019),
        (14, 0.0641),
        (18, 0.0403),
        (20, 0.0320),
        (22, 0.0253),
        (24, 0.0201),
        (30, 0.0100),
        (36, 0.0050),
        (40, 0.0031),
    ];
    for (n, inches) in table {
        let d_in = awg_diameter(n).unwrap() / 25.4e-3;
        assert!((d_in - inches).abs() <= 0.00005 + 1e-12, "AWG {n}: {d_in:.5} in vs ASTM B258 {inches} in");
    }
}

/// IEC 60028: ρ20 = 1/58 Ω·mm²/m (0.017241), α20 = 0.00393 /K.
#[test]
fn copper_resistivity_iec60028() {
    let rho20 = copper_resistivity(20.0).unwrap() * 1e6; // Ω·mm²/m
    assert!((rho20 - 0.017241).abs() < 1e-6);
    let rho75 = copper_resistivity(75.0).unwrap() * 1e6;
    assert!((rho75 - 0.017241 * (1.0 + 0.00393 * 55.0)).abs() < 1e-6);
}
