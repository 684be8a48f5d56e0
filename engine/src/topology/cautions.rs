//! The safety cautions of a design: when its input, outputs or switch node
//! exceed the ES1 limits of IEC 62368-1 (from memory), what the page and the
//! CLI must say (hazardous voltage, insulation class, creepage and clearance
//! not checked), and the standing one-line caution shown on every screen.
//! Magwright never judges a design safe; these texts defer to the standards,
//! local codes and licensed practice.

use super::spec::{Input, Isolation, Spec};

/// ES1 DC voltage limit of IEC 62368-1 (Table 4, from memory), V.
pub const ES1_DC_LIMIT: f64 = 60.0;
/// ES1 AC peak voltage limit of IEC 62368-1 (Table 4, from memory), V.
pub const ES1_AC_PEAK_LIMIT: f64 = 42.4;
/// The one-line caution every front end shows at all times, whatever the
/// design: the page in its header and on the build sheet, the CLI in its help.
pub const STANDING_CAUTION: &str = "Magwright computes; it does not certify. Defer to IEC 62368-1 / IEC 61558, \
     local codes and licensed practice.";

impl Spec {
    /// Safety cautions for this spec: empty only when the input is DC and
    /// every specified voltage is within the ES1 limits of IEC 62368-1
    /// (60 V DC; 42.4 V peak AC; Table 4, from memory). Internal nodes (the
    /// switch) can still exceed ES1: [`Spec::cautions_with_switch`] adds them.
    pub fn safety_cautions(&self) -> Vec<String> {
        self.cautions_with_switch(None)
    }

    /// The safety cautions of a design whose switch node reaches
    /// `switch_voltage` V (worst corner; `None`: not known): as
    /// [`Spec::safety_cautions`], and a switch node above the ES1 limit of
    /// 60 V DC (IEC 62368-1, from memory) makes the design hazardous too,
    /// with its own caution, even when the input and outputs are within ES1.
    pub fn cautions_with_switch(&self, switch_voltage: Option<f64>) -> Vec<String> {
        let switch_high = switch_voltage.is_some_and(|v| v > ES1_DC_LIMIT || !v.is_finite());
        let mains = matches!(self.input, Input::Ac { .. });
        let input_high = match self.input {
            Input::Dc { max, .. } => max > ES1_DC_LIMIT || !max.is_finite(),
            Input::Ac { .. } => true,
        };
        let out_high = self
            .outputs
            .iter()
            .any(|o| o.voltage > ES1_DC_LIMIT || !o.voltage.is_finite());
        let mut c = Vec::new();
        if !(mains || input_high || out_high || switch_high) {
            return c;
        }
        if mains {
            c.push(
                "Mains input: the primary side, the bulk capacitor and the switch node are hazardous \
                 (well above the ES1 limits of IEC 62368-1: 60 V DC, 42.4 V peak AC, from memory). \
                 The bulk capacitor stays charged after the line is removed."
                    .to_string(),
            );
        } else if input_high {
            c.push(format!(
                "The input exceeds the ES1 limit of {ES1_DC_LIMIT} V DC of IEC 62368-1 (from memory): \
                 treat the primary side as hazardous."
            ));
        }
        if out_high {
            c.push(format!(
                "An output exceeds {ES1_DC_LIMIT} V DC (ES1 limit of IEC 62368-1, from memory): \
                 the secondary side is hazardous too."
            ));
        }
        if let Some(v) = switch_voltage.filter(|_| switch_high && !(mains || input_high)) {
            c.push(format!(
                "The switch node reaches {v:.0} V (plus the leakage spike), above the ES1 limit of \
                 {ES1_DC_LIMIT} V DC of IEC 62368-1 (from memory), although the input is lower: treat the \
                 primary winding, the switch and its heat sink as hazardous."
            ));
        }
        c.push(match self.isolation {
            Isolation::Functional if mains || input_high || switch_high => {
                "Functional isolation is chosen but the input is hazardous: functional insulation is \
                 no protection against electric shock. Outputs that can be touched need basic plus \
                 supplementary, or reinforced, insulation."
                    .to_string()
            }
            Isolation::Functional => "Functional isolation gives no protection against electric shock.".to_string(),
            Isolation::Basic => "Basic insulation is one level of protection; accessible outputs usually \
                 need a second (supplementary) level or an earthed screen."
                .to_string(),
            Isolation::Reinforced => "Reinforced insulation: the creepage, clearance, distance through \
                 insulation, insulation system and dielectric tests required are set by the standard for \
                 the working voltage, pollution degree and overvoltage category."
                .to_string(),
        });
        c.push(
            "Magwright checks no creepage, clearance, insulation material, hi-pot or temperature class \
             and never judges a design safe. Follow IEC 62368-1 / IEC 61558 (or the standard for your \
             product), your local electrical codes, and have the design and prototype assessed by a \
             licensed, qualified engineer and tested by an accredited laboratory."
                .to_string(),
        );
        c
    }
}
