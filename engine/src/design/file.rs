//! The design file: everything a user decides, in one serde type.
//!
//! The page saves it, the CLI evaluates it, and the browser tests compare the
//! two through it. It is our own schema: `{"schema": "magwright-design",
//! "version": 2, ...}`. Older versions are converted on reading
//! ([`super::upgrade`], with notes); newer versions and foreign files are
//! refused with a message naming the field; documented with examples in
//! `docs/design-file.md`.

use crate::core::{library as cores, Core, Effective, Shape};
use crate::error::{Error, Result};
use crate::gap::GapPlacement;
use crate::material::{library as materials, Material};
use crate::topology::Spec;
use serde::{Deserialize, Serialize};

/// The `schema` field's value.
pub const SCHEMA: &str = "magwright-design";
/// The version this engine writes and reads (older ones are converted).
pub const VERSION: u32 = 3;

/// One design: specification, core, material and the designer's choices.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Design {
    pub schema: String,
    pub version: u32,
    /// A free name for the design.
    #[serde(default)]
    pub name: String,
    pub spec: Spec,
    pub core: CoreChoice,
    pub material: MaterialChoice,
    #[serde(default)]
    pub choices: Choices,
}

/// Which core: from the library, or the user's own.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "from", rename_all = "snake_case", deny_unknown_fields)]
pub enum CoreChoice {
    /// A library core by designation, e.g. "ETD 34".
    Library { designation: String },
    /// A core given by its shape's dimensions (any family).
    Shape { designation: String, shape: Shape },
    /// A core given directly by effective parameters.
    Effective { designation: String, parameters: Effective },
}

/// Which material: from the library, or the user's own (e.g. fitted).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "from", rename_all = "snake_case", deny_unknown_fields)]
pub enum MaterialChoice {
    Library { name: String },
    Custom { material: Material },
}

/// How the turns are chosen.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "rule", rename_all = "snake_case", deny_unknown_fields)]
pub enum TurnsRule {
    /// The fewest primary turns that keep Bpk within the limit.
    FewestTurns,
    /// Fewer core loss against more copper: from the flux swing where
    /// Pcore/Pcu = 2/β, the turn count whose searched design loses least at
    /// its operating temperature (see `design::solve`), never above the Bpk
    /// limit.
    LeastLoss,
    /// Exactly these primary turns (secondaries and reset follow).
    Primary { turns: u32 },
}

/// Winding order from the bobbin outward.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Interleave {
    /// Chosen by loss: sequential, P-S-P or S-P-S for a single primary;
    /// sequential or mirrored halves where windings are centre-tapped.
    Auto,
    /// Primary, then each other winding.
    Sequential,
    /// P-S-P: half the primary, the others, the other half.
    SplitPrimary,
    /// S-P-S: half of each other winding, the primary, the other halves.
    SplitSecondaries,
    /// Centre-tapped halves mirrored about the primary: the secondaries'
    /// A halves, the primary (A then B), the secondaries' B halves.
    MirroredHalves,
    /// The sections in `Choices::section_order`, bobbin outward.
    Custom,
}

/// One section of a custom winding order.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SectionTurns {
    /// The winding's name, e.g. "primary", "secondary 1", "primary A".
    pub winding: String,
    /// Turns in this section; `None` shares the winding's remaining turns
    /// equally with its other `None` sections (so P-S-P stays P-S-P when
    /// the turns change).
    #[serde(default)]
    pub turns: Option<u32>,
}

/// A conductor the user fixes for one winding (others stay automatic).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case", deny_unknown_fields)]
pub enum WireChoice {
    /// Enamelled round wire, AWG, `parallel` in hand.
    Round { awg: i32, parallel: u32 },
    /// Litz: `strands` of AWG `strand_awg`.
    Litz { strands: u32, strand_awg: i32 },
    /// Copper foil of this thickness (m), as wide as the bobbin allows.
    Foil { thickness: f64 },
    /// Triple-insulated round wire of this AWG, `parallel` in hand.
    TripleInsulated { awg: i32, parallel: u32 },
}

/// A fixed conductor for the winding called `winding` (e.g. "secondary 1").
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct WireOverride {
    pub winding: String,
    pub wire: WireChoice,
}

/// Insulation between sections and at the flanges.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Insulation {
    /// Wraps of tape between sections.
    pub section_wraps: u32,
    /// Wraps over the last section.
    pub outer_wraps: u32,
    /// Wraps between layers inside a section (0: none).
    pub interlayer_wraps: u32,
    /// Tape thickness, m.
    pub tape_thickness: f64,
    /// Margin tape width at each flange, m (`None`: chosen from the
    /// isolation class, the input and the construction).
    pub margin: Option<f64>,
    /// How reinforced insulation between the primary and the secondaries is
    /// built on a design with hazardous voltage (ignored otherwise).
    #[serde(default)]
    pub construction: Construction,
}

impl Default for Insulation {
    fn default() -> Self {
        Insulation {
            section_wraps: 2,
            outer_wraps: 3,
            interlayer_wraps: 0,
            tape_thickness: 0.05e-3,
            margin: None,
            construction: Construction::Auto,
        }
    }
}

/// The two usual ways to build reinforced insulation between the primary
/// and the secondaries of a transformer with hazardous voltage (common
/// practice, no source; the safety standard, IEC 62368-1 or IEC 61558,
/// and the wire's and tape's approvals decide).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Construction {
    /// The one of the two below whose conductors lose least.
    #[default]
    Auto,
    /// Triple-insulated wire on every secondary: its three layers are the
    /// insulation, so no margin tapes (unless `margin` is given).
    TripleInsulated,
    /// Margin tapes at both flanges (3 mm unless `margin` is given) and at
    /// least three wraps of tape between sections: any conductor.
    MarginWound,
}


/// The designer's decisions; every one has a sensible default.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(default, deny_unknown_fields)]
pub struct Choices {
    /// Highest peak flux density allowed, T (`None`: Bsat at the core temperature
    /// limit less the saturation margin).
    pub bpk_limit: Option<f64>,
    /// Fraction kept below Bsat (0.2: stay 20 % below).
    pub saturation_margin: f64,
    pub turns: TurnsRule,
    /// Where a flyback's gap goes.
    pub gap_placement: GapPlacement,
    pub interleave: Interleave,
    /// The sections bobbin outward when `interleave` is `custom` (left out
    /// of the file when empty).
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub section_order: Vec<SectionTurns>,
    /// Fraction of the window area the copper may fill when the wire is
    /// chosen automatically (Ku of Erickson & Maksimovic ch. 15).
    pub window_utilisation: f64,
    pub wires: Vec<WireOverride>,
    pub insulation: Insulation,
    /// Rise and fall time of the switching edges, s. 0 (the default) takes
    /// ideal steps, closed by the analytic tail: the conservative choice.
    pub edge_time: f64,
    /// The switch's voltage rating to check against, V (`None`: not checked).
    pub switch_voltage_rating: Option<f64>,
    /// Most round wires in hand the automatic conductor may use; beyond it
    /// the search uses litz or foil. Default 6 (common practice, no source).
    pub max_parallel: u32,
    /// Voltage across the leakage clamp, V (`None`: the default of
    /// `design::clamp`, 1.5 × the reflected or reset voltage).
    pub clamp_voltage: Option<f64>,
    /// The magnetic's share of the converter's loss budget Pin − Pout (Pin
    /// = Pout/η from the spec's efficiency): the `loss_budget` check fails
    /// a design whose magnetic loses more. 0.01 to 1; default
    /// [`DEFAULT_MAGNETIC_LOSS_SHARE`] (also when absent from a file).
    pub magnetic_loss_share: f64,
    /// Forward, push-pull and bridges: the output choke's core (`None`:
    /// chosen from the library by least loss, `design::solve::choke`).
    /// Left out of the file when absent.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub choke_core: Option<CoreChoice>,
}

/// Default share of the converter's loss budget for the magnetic: one half
/// (common practice, no source: in a switch-mode converter the magnetics
/// commonly take a third to a half of the losses, the switches, rectifiers
/// and capacitors the rest; a half is the lenient end, so a design only
/// fails when its magnetic alone leaves too little for everything else).
pub const DEFAULT_MAGNETIC_LOSS_SHARE: f64 = 0.5;

impl Default for Choices {
    fn default() -> Self {
        Choices {
            bpk_limit: None,
            saturation_margin: 0.2,
            turns: TurnsRule::LeastLoss,
            gap_placement: GapPlacement::CentreLeg,
            interleave: Interleave::Auto,
            section_order: Vec::new(),
            window_utilisation: 0.3,
            wires: Vec::new(),
            insulation: Insulation::default(),
            edge_time: 0.0,
            switch_voltage_rating: None,
            max_parallel: 6,
            clamp_voltage: None,
            magnetic_loss_share: DEFAULT_MAGNETIC_LOSS_SHARE,
            choke_core: None,
        }
    }
}

fn foreign(why: &str) -> Error {
    Error::format(
        Some("schema"),
        format!("this is not a Magwright design file: {why}; a design file starts with \"schema\": \"{SCHEMA}\""),
    )
}

impl Design {
    fn new(name: &str, spec: Spec, core: &str, material: &str) -> Design {
        Design {
            schema: SCHEMA.into(),
            version: VERSION,
            name: name.into(),
            spec,
            core: CoreChoice::Library { designation: core.into() },
            material: MaterialChoice::Library { name: material.into() },
            choices: Choices::default(),
        }
    }

    /// The 48 V bus forward demo (a scenario of our own).
    pub fn demo_forward() -> Design {
        Design::new("48 V bus forward, 12 V 10 A", Spec::demo_forward(), "ETD 34", "MnZn-200k")
    }

    /// The offline 24 W flyback demo (a scenario of our own).
    pub fn demo_flyback() -> Design {
        Design::new("Offline 24 W flyback", Spec::demo_flyback(), "E 25/13/7", "MnZn-200k")
    }

    /// The 24 V push-pull demo (a scenario of our own).
    pub fn demo_push_pull() -> Design {
        Design::new("24 V push-pull", Spec::demo_push_pull(), "ETD 34", "MnZn-200k")
    }

    /// The 24 V buck inductor demo (a scenario of our own).
    pub fn demo_inductor() -> Design {
        Design::new("24 V to 5 V buck inductor", Spec::demo_inductor(), "E 20/10/6", "MnZn-200k")
    }

    /// Reads a design file, refusing foreign and future files with a
    /// message that says which: not JSON, not ours (no or another
    /// `schema`), a newer `version`, or a design that does not fit the
    /// schema (the error names the field, e.g. `spec.outputs[0].voltage`).
    pub fn from_json(text: &str) -> Result<Design> {
        Design::from_json_noted(text).map(|(d, _)| d)
    }

    /// [`Design::from_json`], also returning the notes of converting an
    /// older file ([`super::upgrade`]; empty for a current file).
    pub fn from_json_noted(text: &str) -> Result<(Design, Vec<String>)> {
        let mut value: serde_json::Value = crate::json::from_str(text)?;
        let Some(obj) = value.as_object() else {
            return Err(foreign("the file holds no JSON object"));
        };
        match obj.get("schema") {
            Some(serde_json::Value::String(s)) if s == SCHEMA => {}
            Some(serde_json::Value::String(s)) => return Err(foreign(&format!("its \"schema\" is \"{s}\""))),
            Some(_) => return Err(foreign("its \"schema\" is not a string")),
            None => return Err(foreign("it has no \"schema\" key")),
        }
        match obj.get("version").and_then(serde_json::Value::as_u64) {
            Some(v) if v == u64::from(VERSION) => Ok((crate::json::from_str_checked(text)?, Vec::new())),
            Some(v) if v > u64::from(VERSION) => Err(Error::format(
                Some("version"),
                format!("the file was written by a newer Magwright (file version {v}); this one reads version {VERSION}"),
            )),
            Some(v) if v >= 1 => {
                let notes = super::upgrade::upgrade(&mut value, v)?;
                let converted = crate::json::from_str_checked(&crate::json::to_string_pretty(&value));
                Ok((converted.map_err(|e| super::upgrade::unlined(e, v))?, notes))
            }
            _ => Err(Error::format(Some("version"), format!("the file's \"version\" must be 1 to {VERSION}"))),
        }
    }

    /// Writes the design file (pretty JSON).
    pub fn to_json(&self) -> String {
        crate::json::to_string_pretty(self)
    }

    /// Checks the envelope (schema and version).
    pub fn check_envelope(&self) -> Result<()> {
        if self.schema != SCHEMA {
            return Err(Error::format(Some("schema"), format!("not a Magwright design (schema \"{}\")", self.schema)));
        }
        if self.version != VERSION {
            return Err(Error::format(
                Some("version"),
                format!("design file version {} is not supported (this Magwright reads version {VERSION})", self.version),
            ));
        }
        Ok(())
    }

    /// The core this design uses. Errors about the user's own core name
    /// the field by its path in the design file (`core.parameters.le`,
    /// `core.shape.a`, `core.designation`): the core module names them
    /// relative to the core.
    pub fn resolve_core(&self) -> Result<Core> {
        let under = |prefix: &str, e: Error| -> Error {
            let field = match e.field() {
                Some("designation") => "core.designation".to_string(),
                Some(f) => format!("{prefix}.{f}"),
                None => return e,
            };
            match e {
                Error::Input { message, .. } => Error::Input { field, message },
                Error::Unknown { message, .. } => Error::Unknown { field, message },
                Error::Infeasible { message, .. } => Error::Infeasible { field: Some(field), message },
                Error::Format { message, .. } => Error::Format { field: Some(field), message },
            }
        };
        match &self.core {
            CoreChoice::Library { designation } => cores::find(designation),
            CoreChoice::Shape { designation, shape } => {
                Core::from_shape(designation, *shape).map_err(|e| under("core", e))
            }
            CoreChoice::Effective { designation, parameters } => {
                Core::from_effective(designation, parameters).map_err(|e| under("core.parameters", e))
            }
        }
    }

    /// The material this design uses (validated).
    pub fn resolve_material(&self) -> Result<Material> {
        let m = match &self.material {
            MaterialChoice::Library { name } => materials::find(name)?,
            MaterialChoice::Custom { material } => material.clone(),
        };
        m.validate()?;
        Ok(m)
    }
}
