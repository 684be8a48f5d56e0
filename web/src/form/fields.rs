//! Every numeric entry of the form: its engine key, label, unit and help,
//! and how its text is read and written (exactly, so a value survives a
//! round trip through the field).

use magwright_engine::notation;

/// Which part of the form a numeric entry belongs to.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Group {
    Dc,
    Ac,
    Converter,
    Flyback,
    Flux,
    Winding,
}

/// A numeric entry: its engine key, label, unit and help.
pub struct NumDef {
    pub key: &'static str,
    pub label: &'static str,
    pub unit: &'static str,
    pub help: &'static str,
    pub group: Group,
    /// Whole numbers only.
    pub whole: bool,
    /// Shown with an SI prefix when loaded ("200k", "150m").
    pub prefixed: bool,
    /// May be left empty (then "automatic").
    pub optional: bool,
    /// Shown units per SI unit: 1000 for a length in mm, 100 for a
    /// fraction in %, 1 when the field holds the SI value itself.
    pub per: f64,
}

const fn num(key: &'static str, label: &'static str, unit: &'static str, group: Group, help: &'static str) -> NumDef {
    NumDef { key, label, unit, help, group, whole: false, prefixed: false, optional: false, per: 1.0 }
}

/// A fraction entered and shown in % (the results show fractions in %).
const fn pct(key: &'static str, label: &'static str, group: Group, help: &'static str) -> NumDef {
    NumDef { per: 100.0, ..num(key, label, "%", group, help) }
}

/// A length entered and shown in mm.
const fn mm(key: &'static str, label: &'static str, group: Group, help: &'static str) -> NumDef {
    NumDef { per: 1000.0, ..num(key, label, "mm", group, help) }
}

impl NumDef {
    /// The field's text for the SI value `v`: exact where a decimal in the
    /// shown unit divides back to `v`, else the nearest (e.g. 1/3 in %).
    pub fn text(&self, v: f64) -> String {
        if self.per == 1.0 {
            return text_of(v, self.prefixed);
        }
        // The shortest text whose value, divided by `per`, is exactly `v`.
        let shown = v * self.per;
        for digits in 1..=17 {
            let t = format!("{:.*}", digits, shown);
            let t = if t.contains('.') { t.trim_end_matches('0').trim_end_matches('.').to_string() } else { t };
            if notation::parse(&t, "").is_ok_and(|x| x / self.per == v) {
                return t;
            }
        }
        format!("{shown}")
    }

    /// The SI value of the field's text (a `per` unit divided out).
    pub fn read(&self, text: &str) -> Result<f64, notation::ParseError> {
        if self.whole {
            return notation::parse_count(text).map(f64::from);
        }
        notation::parse(text, self.unit).map(|x| x / self.per)
    }
}

/// Indices of the entries in [`NUMS`], by name.
pub mod ix {
    pub const DC_MIN: usize = 0;
    pub const DC_NOM: usize = 1;
    pub const DC_MAX: usize = 2;
    pub const VAC_MIN: usize = 3;
    pub const VAC_NOM: usize = 4;
    pub const VAC_MAX: usize = 5;
    pub const LINE_F: usize = 6;
    pub const BULK: usize = 7;
    pub const BRIDGE: usize = 8;
    pub const FREQ: usize = 9;
    pub const DUTY: usize = 10;
    pub const EFF: usize = 11;
    pub const AMBIENT: usize = 12;
    pub const HOT: usize = 13;
    pub const CHOKE: usize = 14;
    pub const FLY_VALUE: usize = 15;
    pub const FLY_RIPPLE: usize = 16;
    pub const BPK_LIMIT: usize = 17;
    pub const MARGIN: usize = 18;
    pub const TURNS: usize = 19;
    pub const KU: usize = 20;
    pub const EDGE: usize = 21;
    pub const SW_RATING: usize = 22;
    pub const WRAPS: usize = 23;
    pub const OUTER_WRAPS: usize = 24;
    pub const LAYER_WRAPS: usize = 25;
    pub const TAPE: usize = 26;
    pub const FLANGE: usize = 27;
    pub const MAX_PARALLEL: usize = 28;
    pub const CLAMP: usize = 29;
    pub const LOSS_SHARE: usize = 30;
    pub const COUNT: usize = 31;
}

/// Every numeric entry except the outputs, in [`ix`] order.
pub const NUMS: [NumDef; ix::COUNT] = [
    num("input.min", "Vin min", "V", Group::Dc, "Lowest DC input voltage"),
    num("input.nominal", "Vin nominal", "V", Group::Dc, "Usual DC input voltage"),
    num("input.max", "Vin max", "V", Group::Dc, "Highest DC input voltage"),
    num("input.vac_min", "Vac min", "V", Group::Ac, "Lowest line voltage, RMS"),
    num("input.vac_nominal", "Vac nominal", "V", Group::Ac, "Usual line voltage, RMS"),
    num("input.vac_max", "Vac max", "V", Group::Ac, "Highest line voltage, RMS"),
    num("input.line_frequency", "Line frequency", "Hz", Group::Ac, "Lowest line frequency the product accepts"),
    NumDef {
        prefixed: true,
        ..num("input.bulk.farads", "Bulk capacitor", "F", Group::Ac, "Capacitance on the rectified line, e.g. 68u")
    },
    num("input.bridge_drop", "Bridge drop", "V", Group::Ac, "Drop of two bridge diodes in series"),
    NumDef { prefixed: true, ..num("frequency", "fsw", "Hz", Group::Converter, "Switching frequency, e.g. 200k") },
    pct("duty_max", "Duty max", Group::Converter, "Largest on-time of one switch over its period, %"),
    pct("efficiency", "Efficiency", Group::Converter, "Estimated Pout/Pin of the converter, %"),
    num("ambient", "Ambient", "°C", Group::Converter, "Air temperature around the magnetic"),
    num("temperature_max", "Core temp. max", "°C", Group::Converter, "Highest mean surface temperature of the magnetic (McLyman's surface-dissipation model); the winding's hottest point runs higher"),
    num("choke_ripple_ratio", "Choke ripple", "", Group::Converter, "Output choke ripple ΔI/Iout at Vin max (forward, push-pull, bridges); inductor: ΔI/IL at its largest"),
    num("flyback.ratio", "Ratio value", "", Group::Flyback, "Reflected voltage (V) or turns ratio Np/Ns, as chosen"),
    num("flyback.ripple_ratio", "Ripple ratio", "", Group::Flyback, "ΔIp/Ip,centre at Vin min: below 2 CCM, 2 boundary, above DCM"),
    NumDef {
        prefixed: true,
        optional: true,
        ..num("choices.bpk_limit", "Bpk limit", "T", Group::Flux, "Highest peak flux density; empty: Bsat at the core temperature limit less the margin")
    },
    pct("choices.saturation_margin", "Bsat margin", Group::Flux, "Share kept below Bsat, e.g. 20 %"),
    NumDef {
        whole: true,
        ..num("choices.turns.turns", "Primary turns", "", Group::Flux, "Used when the turns rule is 'fixed'")
    },
    pct("choices.window_utilisation", "Window use Ku", Group::Winding, "Copper share of the window for automatic wire, %"),
    NumDef {
        prefixed: true,
        ..num("choices.edge_time", "Edge time", "s", Group::Winding, "Switching rise/fall time; 0 takes ideal steps (conservative)")
    },
    NumDef {
        optional: true,
        ..num("choices.switch_voltage_rating", "Switch rating", "V", Group::Converter, "Checked against the switch's off-state voltage; empty: not checked")
    },
    NumDef { whole: true, ..num("choices.insulation.section_wraps", "Tape between sections", "wraps", Group::Winding, "") },
    NumDef { whole: true, ..num("choices.insulation.outer_wraps", "Tape over the top", "wraps", Group::Winding, "") },
    NumDef { whole: true, ..num("choices.insulation.interlayer_wraps", "Tape between layers", "wraps", Group::Winding, "") },
    mm("choices.insulation.tape_thickness", "Tape thickness", Group::Winding, "One wrap, mm, e.g. 0.05"),
    NumDef {
        optional: true,
        ..mm("choices.insulation.margin", "Flange margin", Group::Winding, "Margin tape at each flange, mm; empty: from the isolation class")
    },
    NumDef {
        whole: true,
        ..num("choices.max_parallel", "Most wires in hand", "", Group::Winding, "Round wires in parallel the automatic conductor may use; beyond it litz or foil")
    },
    NumDef {
        optional: true,
        ..num("choices.clamp_voltage", "Clamp voltage", "V", Group::Converter, "Voltage across the leakage clamp; empty: 1.5 × the reflected (flyback) or reset voltage")
    },
    pct(
        "choices.magnetic_loss_share",
        "Loss share",
        Group::Converter,
        "The magnetic's share of the converter's loss budget Pin − Pout, %, e.g. 50",
    ),
];

/// The outputs' keys: voltage, current, rectifier drop, for up to four.
pub const OUT_KEYS: [[&str; 3]; 4] = [
    ["outputs[0].voltage", "outputs[0].current", "outputs[0].rectifier_drop"],
    ["outputs[1].voltage", "outputs[1].current", "outputs[1].rectifier_drop"],
    ["outputs[2].voltage", "outputs[2].current", "outputs[2].rectifier_drop"],
    ["outputs[3].voltage", "outputs[3].current", "outputs[3].rectifier_drop"],
];

/// The label of a field key.
pub fn label_of(key: &str) -> String {
    let key = key.strip_prefix("spec.").unwrap_or(key);
    if let Some(d) = NUMS.iter().find(|d| d.key == key) {
        return d.label.to_string();
    }
    for (i, ks) in OUT_KEYS.iter().enumerate() {
        for (j, k) in ks.iter().enumerate() {
            if *k == key {
                return format!("Output {} {}", i + 1, ["V", "I", "Vf"][j]);
            }
        }
    }
    match key.split(['.', '[']).next().unwrap_or(key) {
        "core" => "Core".into(),
        "material" => "Material".into(),
        "outputs" => "Outputs".into(),
        "topology" => "Topology".into(),
        "turns" => "Turns".into(),
        "gap" => "Gap".into(),
        "choices" if key.starts_with("choices.choke_core") => "Choke core".into(),
        "choices" => "Choices".into(),
        "inductor" => "Inductance".into(),
        _ => "Input".into(),
    }
}

/// The shortest text that reads back as exactly `v`: with an SI prefix
/// when asked and exact ("200k", "150m"), else the plain number.
pub fn text_of(v: f64, prefixed: bool) -> String {
    if prefixed && v != 0.0 && v.is_finite() {
        for digits in 1..=17 {
            let t = notation::format(v, "", digits).replace(' ', "").replace('µ', "u");
            if notation::parse(&t, "") == Ok(v) {
                return t;
            }
        }
    }
    format!("{v}")
}
