//! The one way in for a design file: read, then check every value, with
//! each error naming the value by its full path in the file
//! (`spec.input.min`, `core.parameters.ae`, `material.material.bsat_100`,
//! `choices.wires[1].wire.awg`). The CLI and the page both call
//! [`Design::load`], so they accept and refuse exactly the same files with
//! the same words.
//!
//! The checks themselves live with their types (`Spec::validate`,
//! `Material::validate`, the core constructors, the choices check); those
//! name fields relative to their type, and this file puts the prefix on.

use super::file::{CoreChoice, Design, MaterialChoice};
use super::solve::{check_choices, fixed_conductor};
use crate::error::{Error, Result};

/// The same error with `field` replaced by `to(field)`.
fn renamed(e: Error, to: impl Fn(&str) -> String) -> Error {
    match e {
        Error::Input { field, message } => Error::Input { field: to(&field), message },
        Error::Unknown { field, message } => Error::Unknown { field: to(&field), message },
        Error::Infeasible { field, message } => Error::Infeasible { field: field.map(|f| to(&f)), message },
        Error::Format { field, message } => Error::Format { field: field.map(|f| to(&f)), message },
    }
}

/// `field` under `prefix`, unless it already starts with it.
fn under(prefix: &str, field: &str) -> String {
    if field == prefix || field.starts_with(&format!("{prefix}.")) {
        field.to_string()
    } else {
        format!("{prefix}.{field}")
    }
}

/// A breadth that lets a fixed foil's own thickness be checked before the
/// bobbin is known, m (the fit checks the real breadth later).
const CHECK_BREADTH: f64 = 10e-3;

impl Design {
    /// Reads a design file and checks every value: what the CLI and the
    /// page accept. Errors name the full path of the value in the file.
    pub fn load(text: &str) -> Result<Design> {
        Design::load_noted(text).map(|(d, _)| d)
    }

    /// [`Design::load`], also returning the notes of converting an older
    /// file (`design::upgrade`; empty for a current file).
    pub fn load_noted(text: &str) -> Result<(Design, Vec<String>)> {
        let (d, notes) = Design::from_json_noted(text)?;
        d.validate()?;
        Ok((d, notes))
    }

    /// Checks every value of the design, errors named by full path.
    pub fn validate(&self) -> Result<()> {
        self.check_envelope()?;
        self.spec.validate().map_err(|e| renamed(e, |f| under("spec", f)))?;
        self.resolve_core().map_err(|e| renamed(e, |f| if f == "core" { "core.designation".into() } else { f.to_string() }))?;
        let material = self.resolve_material().map_err(|e| match &self.material {
            MaterialChoice::Custom { .. } => renamed(e, |f| under("material.material", f.strip_prefix("material.").unwrap_or(f))),
            MaterialChoice::Library { .. } => renamed(e, |f| if f == "name" || f == "material" { "material.name".into() } else { f.to_string() }),
        })?;
        check_choices(&self.choices)?;
        for (i, o) in self.choices.wires.iter().enumerate() {
            let at = format!("choices.wires[{i}]");
            if o.winding.trim().is_empty() {
                return Err(Error::input(&format!("{at}.winding"), "name the winding this wire is for (e.g. \"primary\")"));
            }
            fixed_conductor(&o.wire, CHECK_BREADTH).map_err(|e| {
                renamed(e, |f| {
                    let leaf = f.rsplit('.').next().unwrap_or(f);
                    let leaf = match (&o.wire, leaf) {
                        (crate::design::file::WireChoice::Litz { .. }, "awg") => "strand_awg",
                        _ => leaf,
                    };
                    format!("{at}.wire.{leaf}")
                })
            })?;
        }
        // With no flux limit of its own, the design takes Bsat at the
        // core temperature limit less the margin; a material with no Bsat there
        // leaves nothing to design with: name the material's value.
        if self.choices.bpk_limit.is_none() && material.bsat_at(self.spec.temperature_max) <= 0.0 {
            let field = match self.material {
                MaterialChoice::Custom { .. } => "material.material.bsat_100",
                MaterialChoice::Library { .. } => "material.name",
            };
            return Err(Error::input(
                field,
                format!(
                    "Bsat at the core temperature limit ({} °C) comes out at zero; give Bsat at 100 °C above zero, or set choices.bpk_limit",
                    self.spec.temperature_max
                ),
            ));
        }
        if let CoreChoice::Library { designation } = &self.core {
            if designation.trim().is_empty() {
                return Err(Error::input("core.designation", "choose a core"));
            }
        }
        Ok(())
    }
}
