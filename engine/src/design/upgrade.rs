//! Older design files brought up to the current version, on the JSON value
//! before typed parsing (so the typed schema stays strict: a current file
//! with an old key is refused, an old file is converted once, here).
//!
//! Version 1 → 2:
//!
//! * The loss temperature factor of a custom material: version 1 stored the
//!   expanded quadratic `{"ct2": a, "ct1": b, "ct0": d}` meaning
//!   factor(T) = a·T² − b·T + d. Version 2 stores its own form,
//!   `{"least_loss_c": Tm, "curvature": c}` meaning 1 + c·(T − Tm)². The
//!   conversion is exact algebra (completing the square, no source):
//!   a·T² − b·T + d = m·(1 + (a/m)·(T − Tm)²) with Tm = b/(2a) and
//!   m = d − b²/(4a), the factor's value at its minimum. The scale m folds
//!   into the reference loss: k becomes k·m, so Pv is unchanged at every
//!   temperature. A flat factor (a = b = 0) gives c = 0 and k·d.
//!
//! * `spec.hot_spot_max` is `spec.temperature_max`: the limit is on the
//!   mean surface temperature of McLyman's surface-dissipation model (see
//!   [`crate::thermal`]), not on a hot spot; the value is kept.
//!
//! Version 2 → 3:
//!
//! * `choices.b_max` is `choices.bpk_limit`: the user's limit on the peak
//!   flux density (`b_max` also named the top of a material's fitted flux
//!   range); the value is kept.
//!
//! Every conversion adds a note, which the CLI prints and the page shows.

use crate::error::{Error, Result};
use serde_json::{Map, Value};

/// Converts `value` (a design file of version `from`, already known to be
/// ours and older than [`super::file::VERSION`]) in place to the current
/// version. Returns the notes saying what was converted.
pub fn upgrade(value: &mut Value, from: u64) -> Result<Vec<String>> {
    let mut notes = Vec::new();
    if from < 1 {
        return Err(Error::format(Some("version"), "design file versions start at 1"));
    }
    if from == 1 {
        one_to_two(value, &mut notes)?;
    }
    if from <= 2 {
        two_to_three(value, &mut notes)?;
    }
    if let Some(obj) = value.as_object_mut() {
        obj.insert("version".into(), Value::from(super::file::VERSION));
    }
    notes.insert(
        0,
        format!(
            "This file was written as design-file version {from}; it was converted to version {} \
             (save it to keep the new form).",
            super::file::VERSION
        ),
    );
    Ok(notes)
}

fn one_to_two(value: &mut Value, notes: &mut Vec<String>) -> Result<()> {
    if let Some(spec) = value.get_mut("spec").and_then(Value::as_object_mut) {
        if let Some(t) = spec.remove("hot_spot_max") {
            if spec.contains_key("temperature_max") {
                return Err(Error::format(
                    Some("spec.hot_spot_max"),
                    "a version-1 file holds both hot_spot_max and temperature_max; keep one",
                ));
            }
            spec.insert("temperature_max".into(), t);
            notes.push(
                "spec.hot_spot_max is now spec.temperature_max (the limit on the mean surface temperature), same value."
                    .into(),
            );
        }
    }
    temperature_factor(value, notes)
}

fn two_to_three(value: &mut Value, notes: &mut Vec<String>) -> Result<()> {
    let Some(choices) = value.get_mut("choices").and_then(Value::as_object_mut) else {
        return Ok(());
    };
    if let Some(b) = choices.remove("b_max") {
        if choices.contains_key("bpk_limit") {
            return Err(Error::format(
                Some("choices.b_max"),
                "an older file holds both b_max and bpk_limit; keep one",
            ));
        }
        if !b.is_null() {
            notes.push("choices.b_max is now choices.bpk_limit (the limit on the peak flux density), same value.".into());
        }
        choices.insert("bpk_limit".into(), b);
    }
    Ok(())
}

fn temperature_factor(value: &mut Value, notes: &mut Vec<String>) -> Result<()> {
    let Some(material) = value.pointer_mut("/material/material").and_then(Value::as_object_mut) else {
        return Ok(());
    };
    let field = "material.material.temp_factor";
    let Some(tf) = material.get("temp_factor").and_then(Value::as_object) else {
        return Ok(());
    };
    if !(tf.contains_key("ct2") || tf.contains_key("ct1") || tf.contains_key("ct0")) {
        return Ok(());
    }
    let (tm, c, scale) = convert_quadratic(tf, field)?;
    let mut new_tf = Map::new();
    new_tf.insert("least_loss_c".into(), number(tm, field)?);
    new_tf.insert("curvature".into(), number(c, field)?);
    // Keys beside the three coefficients are kept, so typed parsing
    // refuses them with their own path.
    for (k, v) in tf {
        if !matches!(k.as_str(), "ct2" | "ct1" | "ct0") {
            new_tf.insert(k.clone(), v.clone());
        }
    }
    material.insert("temp_factor".into(), Value::Object(new_tf));
    let mut k_note = String::new();
    if scale != 1.0 {
        if let Some(k) = material.get_mut("steinmetz").and_then(|s| s.get_mut("k")) {
            if let Some(kv) = k.as_f64() {
                let scaled = kv * scale;
                *k = number(scaled, "material.material.steinmetz.k")?;
                k_note = format!("; k scaled by the factor's minimum {scale:.4} to {scaled:.4} (stored exactly)");
            }
        }
    }
    notes.push(if c == 0.0 {
        format!("The material's temperature factor is now flat (curvature 0, recorded at {tm:.1} °C){k_note}.")
    } else {
        format!(
            "The material's temperature factor (ct2, ct1, ct0) is now given as least loss at {tm:.1} °C with curvature \
             {c:.3e} /K² (stored exactly), the same loss at every temperature{k_note}."
        )
    });
    Ok(())
}

/// (Tm, c, m) of a·T² − b·T + d = m·(1 + c·(T − Tm)²); see the module doc.
fn convert_quadratic(tf: &Map<String, Value>, field: &str) -> Result<(f64, f64, f64)> {
    let get = |key: &str| -> Result<f64> {
        match tf.get(key) {
            None => Err(Error::format(Some(&format!("{field}.{key}")), "a version-1 temperature factor needs ct2, ct1 and ct0")),
            Some(v) => v
                .as_f64()
                .filter(|x| x.is_finite())
                .ok_or_else(|| Error::format(Some(&format!("{field}.{key}")), "must be a finite number")),
        }
    };
    let (a, b, d) = (get("ct2")?, get("ct1")?, get("ct0")?);
    if a < 0.0 {
        return Err(Error::input(
            &format!("{field}.ct2"),
            "a parabola opening downwards has no temperature of least loss and cannot be converted",
        ));
    }
    if a == 0.0 {
        if b != 0.0 {
            return Err(Error::input(
                &format!("{field}.ct1"),
                "a straight-line factor (ct2 = 0, ct1 ≠ 0) has no temperature of least loss and cannot be converted",
            ));
        }
        if d <= 0.0 {
            return Err(Error::input(&format!("{field}.ct0"), "a flat factor must be positive"));
        }
        return Ok((25.0, 0.0, d));
    }
    let tm = b / (2.0 * a);
    let m = d - b * b / (4.0 * a);
    if !(m > 0.0 && m.is_finite() && tm.is_finite()) {
        return Err(Error::input(
            &format!("{field}.ct0"),
            format!("the factor reaches {m:.4} at its minimum ({tm:.0} °C): a loss factor must stay positive"),
        ));
    }
    Ok((tm, a / m, m))
}

/// An error found in the converted text: its line numbers are those of the
/// converted text, not of the user's file, so they are left out (the field
/// path still names the value).
pub fn unlined(e: Error, from: u64) -> Error {
    let strip = |m: String| -> String {
        let m = match m.rfind(" (line ") {
            Some(i) if m.ends_with(')') => m[..i].to_string(),
            _ => m,
        };
        format!("{m} (in the file converted from version {from})")
    };
    match e {
        Error::Input { field, message } => Error::Input { field, message: strip(message) },
        Error::Unknown { field, message } => Error::Unknown { field, message: strip(message) },
        Error::Infeasible { field, message } => Error::Infeasible { field, message: strip(message) },
        Error::Format { field, message } => Error::Format { field, message: strip(message) },
    }
}

fn number(x: f64, field: &str) -> Result<Value> {
    serde_json::Number::from_f64(x)
        .map(Value::Number)
        .ok_or_else(|| Error::input(field, "the converted value is not a finite number"))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::Design;
    use crate::material::TempFactor;

    fn old_custom(ct2: f64, ct1: f64, ct0: f64, k: f64) -> Value {
        let mut m = serde_json::to_value(crate::material::library::find("MnZn-200k").unwrap()).unwrap();
        m["temp_factor"] = serde_json::json!({"ct2": ct2, "ct1": ct1, "ct0": ct0});
        m["steinmetz"]["k"] = Value::from(k);
        let mut d = serde_json::to_value(Design::demo_forward()).unwrap();
        d["version"] = Value::from(1);
        d["material"] = serde_json::json!({"from": "custom", "material": m});
        let t = d["spec"].as_object_mut().unwrap().remove("temperature_max").unwrap();
        d["spec"]["hot_spot_max"] = t;
        d
    }

    #[test]
    fn quadratic_converts_exactly() {
        // a·T² − b·T + d against m·(1 + c(T − Tm)²) at many temperatures:
        // completing the square (algebra, no source).
        let (a, b, d, k) = (1.2e-4, 2.4e-2, 2.5, 7.0);
        let mut v = old_custom(a, b, d, k);
        let notes = upgrade(&mut v, 1).unwrap();
        assert_eq!(notes.len(), 3, "{notes:?}");
        assert!(notes[0].contains("version 1") && notes[1].contains("temperature_max"), "{notes:?}");
        assert!(notes[2].contains("least loss at 100"), "{notes:?}");
        let design: Design = serde_json::from_value(v).unwrap();
        let crate::design::MaterialChoice::Custom { material } = &design.material else { panic!() };
        assert_eq!(design.version, crate::design::file::VERSION);
        assert_eq!(design.spec.temperature_max, Design::demo_forward().spec.temperature_max);
        assert!((material.temp_factor.least_loss_c - 100.0).abs() < 1e-12);
        for t in [-40.0, 0.0, 25.0, 100.0, 150.0] {
            let old = k * (a * t * t - b * t + d);
            let new = material.steinmetz.k * material.temp_factor.at(t);
            assert!((new / old - 1.0).abs() < 1e-12, "{t}: {new} vs {old}");
        }
        assert!(material.validate().is_ok());
    }

    #[test]
    fn flat_and_library_files_convert() {
        let mut v = old_custom(0.0, 0.0, 1.0, 5.0);
        upgrade(&mut v, 1).unwrap();
        let design: Design = serde_json::from_value(v).unwrap();
        let crate::design::MaterialChoice::Custom { material } = &design.material else { panic!() };
        assert_eq!(material.temp_factor, TempFactor::flat());
        assert_eq!(material.steinmetz.k, 5.0);
        // A library material: only the version changes, with the note.
        let mut v = serde_json::to_value(Design::demo_flyback()).unwrap();
        v["version"] = Value::from(1);
        assert_eq!(upgrade(&mut v, 1).unwrap().len(), 1);
        assert_eq!(serde_json::from_value::<Design>(v).unwrap(), Design::demo_flyback());
        // Both names in one old file: refused, naming the old key.
        let mut v = old_custom(1e-4, 2e-2, 2.0, 10.0);
        v["spec"]["temperature_max"] = Value::from(90.0);
        assert_eq!(upgrade(&mut v, 1).unwrap_err().field(), Some("spec.hot_spot_max"));
    }

    #[test]
    fn version_two_flux_limit_converts() {
        let mut v = serde_json::to_value(Design::demo_forward()).unwrap();
        v["version"] = Value::from(2);
        let b = v["choices"].as_object_mut().unwrap().remove("bpk_limit").unwrap();
        assert!(b.is_null());
        v["choices"]["b_max"] = Value::from(0.15);
        let (d, notes) = Design::from_json_noted(&v.to_string()).unwrap();
        assert_eq!(d.choices.bpk_limit, Some(0.15));
        assert!(notes.iter().any(|n| n.contains("bpk_limit")), "{notes:?}");
        // The old key in a current file is refused, naming its path.
        v["version"] = Value::from(crate::design::file::VERSION);
        let e = Design::from_json(&v.to_string()).unwrap_err();
        assert_eq!(e.field(), Some("choices.b_max"), "{e}");
        // Both keys in an old file: refused.
        v["version"] = Value::from(2);
        v["choices"]["bpk_limit"] = Value::from(0.1);
        assert_eq!(upgrade(&mut v, 2).unwrap_err().field(), Some("choices.b_max"));
    }

    #[test]
    fn reading_converts_old_files_and_refuses_old_keys_in_new_ones() {
        let old = old_custom(1e-4, 2e-2, 2.0, 10.0);
        let (d, notes) = Design::from_json_noted(&old.to_string()).unwrap();
        assert_eq!(d.version, crate::design::file::VERSION);
        assert!(notes.iter().any(|n| n.contains("converted")), "{notes:?}");
        assert!(crate::design::evaluate(&d).is_ok());
        // The same keys in a current file are refused, naming the path.
        let mut new = old.clone();
        new["version"] = Value::from(crate::design::file::VERSION);
        let e = Design::from_json(&new.to_string()).unwrap_err();
        assert!(e.field().is_some_and(|f| f.starts_with("material")), "{e}");
        assert!(e.message().contains("ct2") || e.message().contains("unknown"), "{e}");
        // An error in an old file names its field, not a line of the converted text.
        let mut bad = old_custom(1e-4, 2e-2, 2.0, 10.0);
        bad["spec"].as_object_mut().unwrap().remove("frequency");
        let e = Design::from_json(&bad.to_string()).unwrap_err();
        assert_eq!(e.field(), Some("spec.frequency"), "{e}");
        assert!(!e.message().contains("(line ") && e.message().contains("converted from version 1"), "{e}");
        // A current file reads with no notes.
        let (_, notes) = Design::from_json_noted(&Design::demo_forward().to_json()).unwrap();
        assert!(notes.is_empty());
    }

    #[test]
    fn unconvertible_factors_name_the_key() {
        for ((a, b, d), key) in [
            ((-1e-4, 0.0, 1.0), "ct2"),
            ((0.0, 0.01, 1.0), "ct1"),
            ((1e-4, 0.02, 0.5), "ct0"),
        ] {
            let mut v = old_custom(a, b, d, 5.0);
            let e = upgrade(&mut v, 1).unwrap_err();
            assert_eq!(e.field(), Some(format!("material.material.temp_factor.{key}").as_str()), "{e}");
        }
        let mut v = old_custom(1e-4, 0.02, 2.0, 5.0);
        v["material"]["material"]["temp_factor"].as_object_mut().unwrap().remove("ct0");
        assert_eq!(upgrade(&mut v, 1).unwrap_err().field(), Some("material.material.temp_factor.ct0"));
    }
}
