//! The stack-up file: [`to_json`], [`from_json`] and [`import`], in the
//! schema of our own documented in `docs/stackup.md`. The round trip is
//! exact, `from_json(&to_json(&s)) == Ok(s)`: lengths are stored in metres,
//! numbers written in Rust's shortest round-trip form and read with its
//! correctly rounded parser ([`super::json`]), so no conversion can perturb
//! a value. Every malformed case is an error naming the field's path.

use super::conductor::{Conductor, Foil, Litz, RoundWire};
use super::json::{self, Json};
use super::stackup::{Direction, Item, Screen, Section, Side, StackUp, Tape, WindingDef};
use crate::core::Core;
use crate::error::{Error, Result};
/// Schema identifier written in every file; the number is the version.
pub const SCHEMA: &str = "magwright.stackup/2";

/// The first schema, still read: it named its lengths with a unit suffix
/// (`thickness_m`, `margin_left_m`, ...). Schema 2 names them as every other
/// file of ours does: SI units, no suffix, the unit stated in the schema's
/// documentation (docs/stackup.md). Reading converts the keys, nothing else.
pub const SCHEMA_1: &str = "magwright.stackup/1";

/// Schema-1 keys and their schema-2 names.
const SUFFIXED: [(&str, &str); 9] = [
    ("thickness_m", "thickness"),
    ("width_m", "width"),
    ("bare_diameter_m", "bare_diameter"),
    ("overall_diameter_m", "overall_diameter"),
    ("strand_diameter_m", "strand_diameter"),
    ("strand_overall_diameter_m", "strand_overall_diameter"),
    ("serving_m", "serving"),
    ("margin_left_m", "margin_left"),
    ("margin_right_m", "margin_right"),
];

/// Renames schema-1 keys in place, at every depth. An object that holds a
/// key under both names is refused, naming the path of the old one.
fn upgrade_schema_1(v: &mut Json, path: &str) -> Result<()> {
    match v {
        Json::Obj(kv) => {
            let names: Vec<String> = kv.iter().map(|(k, _)| k.clone()).collect();
            for (k, x) in kv.iter_mut() {
                let here = if path.is_empty() { k.clone() } else { format!("{path}.{k}") };
                if let Some(&(_, new)) = SUFFIXED.iter().find(|(old, _)| old == k) {
                    if names.iter().any(|n| n == new) {
                        return Err(Error::format(
                            Some(&here),
                            format!("holds both \"{k}\" and \"{new}\"; keep one"),
                        ));
                    }
                    *k = new.to_string();
                }
                upgrade_schema_1(x, &here)?;
            }
            Ok(())
        }
        Json::Arr(a) => {
            for (i, x) in a.iter_mut().enumerate() {
                upgrade_schema_1(x, &format!("{path}[{i}]"))?;
            }
            Ok(())
        }
        _ => Ok(()),
    }
}


fn num(x: f64) -> Json {
    Json::Num(x)
}
fn int(x: u32) -> Json {
    Json::Num(x as f64)
}
fn s(x: &str) -> Json {
    Json::Str(x.to_string())
}
fn obj(kv: Vec<(&str, Json)>) -> Json {
    Json::Obj(kv.into_iter().map(|(k, v)| (k.to_string(), v)).collect())
}

fn tape_json(t: &Tape) -> Vec<(&'static str, Json)> {
    vec![
        ("material", s(&t.material)),
        ("thickness", num(t.thickness)),
        ("wraps", int(t.wraps)),
    ]
}

fn conductor_json(c: &Conductor) -> Json {
    match c {
        Conductor::Round(w) | Conductor::TripleInsulated(w) => obj(vec![
            (
                "kind",
                s(if matches!(c, Conductor::Round(_)) {
                    "round"
                } else {
                    "triple_insulated"
                }),
            ),
            ("bare_diameter", num(w.bare_diameter)),
            ("overall_diameter", num(w.overall_diameter)),
        ]),
        Conductor::Litz(l) => obj(vec![
            ("kind", s("litz")),
            ("strands", int(l.strands)),
            ("strand_diameter", num(l.strand_diameter)),
            ("strand_overall_diameter", num(l.strand_overall_diameter)),
            ("packing", num(l.packing)),
            ("serving", num(l.serving)),
        ]),
        Conductor::Foil(f) => obj(vec![
            ("kind", s("foil")),
            ("thickness", num(f.thickness)),
            ("width", num(f.width)),
        ]),
    }
}

fn side_str(x: Side) -> &'static str {
    match x {
        Side::Left => "left",
        Side::Right => "right",
    }
}

/// Writes the stack-up as JSON (schema [`SCHEMA`], see docs/stackup.md).
pub fn to_json(st: &StackUp) -> String {
    let windings = Json::Arr(st.windings.iter().map(|w| obj(vec![("name", s(&w.name))])).collect());
    let items = Json::Arr(
        st.items
            .iter()
            .map(|it| match it {
                Item::Section(x) => obj(vec![
                    ("item", s("section")),
                    ("winding", s(&x.winding)),
                    ("turns", int(x.turns)),
                    ("parallel", int(x.parallel)),
                    ("conductor", conductor_json(&x.conductor)),
                    ("layers", x.layers.map_or(Json::Null, int)),
                    ("turns_per_layer", x.turns_per_layer.map_or(Json::Null, int)),
                    (
                        "direction",
                        s(match x.direction {
                            Direction::Clockwise => "cw",
                            Direction::CounterClockwise => "ccw",
                        }),
                    ),
                    ("start_side", s(side_str(x.start))),
                    ("finish_side", s(side_str(x.finish))),
                    ("margin_left", num(x.margin_left)),
                    ("margin_right", num(x.margin_right)),
                    (
                        "interlayer_tape",
                        x.interlayer.as_ref().map_or(Json::Null, |t| obj(tape_json(t))),
                    ),
                ]),
                Item::Tape(t) => {
                    let mut kv = vec![("item", s("tape"))];
                    kv.extend(tape_json(t));
                    obj(kv)
                }
                Item::Screen(sc) => obj(vec![
                    ("item", s("screen")),
                    ("material", s(&sc.material)),
                    ("thickness", num(sc.thickness)),
                    ("connection", s(&sc.connection)),
                ]),
            })
            .collect(),
    );
    json::write(&obj(vec![
        ("schema", s(SCHEMA)),
        ("windings", windings),
        ("items", items),
    ]))
}

/// Field access with errors that name the field.
struct Ctx<'a> {
    v: &'a Json,
    path: String,
}

impl<'a> Ctx<'a> {
    fn field(&self, key: &str) -> String {
        if self.path.is_empty() {
            key.to_string()
        } else {
            format!("{}.{key}", self.path)
        }
    }

    fn check_keys(&self, allowed: &[&str]) -> Result<()> {
        if let Json::Obj(kv) = self.v {
            for (k, _) in kv {
                if !allowed.contains(&k.as_str()) {
                    let hint = crate::json_errors::nearest(k, allowed).map(|n| format!("; did you mean \"{n}\"?")).unwrap_or_default();
                    return Err(Error::format(
                        Some(&self.field(k)),
                        format!("unknown key \"{k}\"{hint} (expected one of: {})", allowed.join(", ")),
                    ));
                }
            }
        }
        Ok(())
    }

    fn req(&self, key: &str) -> Result<&'a Json> {
        self.v
            .get(key)
            .ok_or_else(|| Error::format(Some(&self.field(key)), format!("the key \"{key}\" is missing")))
    }

    fn string(&self, key: &str) -> Result<String> {
        match self.req(key)? {
            Json::Str(x) => Ok(x.clone()),
            other => Err(Error::format(
                Some(&self.field(key)),
                format!("must be a string (found {})", other.type_name()),
            )),
        }
    }

    fn number(&self, key: &str) -> Result<f64> {
        match self.req(key)? {
            Json::Num(x) => Ok(*x),
            other => Err(Error::format(
                Some(&self.field(key)),
                format!("must be a number (found {})", other.type_name()),
            )),
        }
    }

    fn count_of(&self, key: &str, v: &Json, what: &str) -> Result<u32> {
        match v {
            Json::Num(x) if x.fract() == 0.0 && *x >= 0.0 && *x <= u32::MAX as f64 => Ok(*x as u32),
            Json::Num(x) if *x < 0.0 => Err(Error::input(
                &self.field(key),
                format!("must not be negative (got {x} {what})"),
            )),
            Json::Num(x) => Err(Error::input(
                &self.field(key),
                format!("must be a whole number of {what} (got {x})"),
            )),
            other => Err(Error::format(
                Some(&self.field(key)),
                format!("must be a whole number of {what} (found {})", other.type_name()),
            )),
        }
    }

    fn count(&self, key: &str, what: &str) -> Result<u32> {
        let v = self.req(key)?;
        self.count_of(key, v, what)
    }

    fn opt_count(&self, key: &str, what: &str) -> Result<Option<u32>> {
        match self.v.get(key) {
            None | Some(Json::Null) => Ok(None),
            Some(v) => self.count_of(key, v, what).map(Some),
        }
    }

    fn child(&self, key: &str) -> Result<Ctx<'a>> {
        let v = self.req(key)?;
        if !matches!(v, Json::Obj(_)) {
            return Err(Error::format(
                Some(&self.field(key)),
                format!("must be an object (found {})", v.type_name()),
            ));
        }
        Ok(Ctx {
            v,
            path: self.field(key),
        })
    }

    fn array(&self, key: &str) -> Result<&'a [Json]> {
        match self.req(key)? {
            Json::Arr(a) => Ok(a),
            other => Err(Error::format(
                Some(&self.field(key)),
                format!("must be an array (found {})", other.type_name()),
            )),
        }
    }

    fn element(&self, key: &str, i: usize, v: &'a Json) -> Result<Ctx<'a>> {
        let path = format!("{}[{i}]", self.field(key));
        if !matches!(v, Json::Obj(_)) {
            return Err(Error::format(
                Some(&path),
                format!("must be an object (found {})", v.type_name()),
            ));
        }
        Ok(Ctx { v, path })
    }

    fn choice<T: Copy>(&self, key: &str, options: &[(&str, T)]) -> Result<T> {
        let x = self.string(key)?;
        options.iter().find(|(n, _)| *n == x).map(|(_, t)| *t).ok_or_else(|| {
            let names: Vec<&str> = options.iter().map(|(n, _)| *n).collect();
            Error::format(
                Some(&self.field(key)),
                format!("\"{x}\" is not one of: {}", names.join(", ")),
            )
        })
    }
}

fn read_tape(c: &Ctx, extra: &[&str]) -> Result<Tape> {
    let mut keys = vec!["material", "thickness", "wraps"];
    keys.extend_from_slice(extra);
    c.check_keys(&keys)?;
    Ok(Tape {
        material: c.string("material")?,
        thickness: c.number("thickness")?,
        wraps: c.count("wraps", "wraps")?,
    })
}

fn read_conductor(c: &Ctx) -> Result<Conductor> {
    let kind = c.string("kind")?;
    let round = |c: &Ctx| -> Result<RoundWire> {
        c.check_keys(&["kind", "bare_diameter", "overall_diameter"])?;
        Ok(RoundWire {
            bare_diameter: c.number("bare_diameter")?,
            overall_diameter: c.number("overall_diameter")?,
        })
    };
    Ok(match kind.as_str() {
        "round" => Conductor::Round(round(c)?),
        "triple_insulated" => Conductor::TripleInsulated(round(c)?),
        "litz" => {
            c.check_keys(&[
                "kind",
                "strands",
                "strand_diameter",
                "strand_overall_diameter",
                "packing",
                "serving",
            ])?;
            Conductor::Litz(Litz {
                strands: c.count("strands", "strands")?,
                strand_diameter: c.number("strand_diameter")?,
                strand_overall_diameter: c.number("strand_overall_diameter")?,
                packing: c.number("packing")?,
                serving: c.number("serving")?,
            })
        }
        "foil" => {
            c.check_keys(&["kind", "thickness", "width"])?;
            Conductor::Foil(Foil {
                thickness: c.number("thickness")?,
                width: c.number("width")?,
            })
        }
        other => {
            return Err(Error::format(
                Some(&c.field("kind")),
                format!("\"{other}\" is not one of: round, litz, foil, triple_insulated"),
            ))
        }
    })
}

/// Reads a stack-up from JSON and validates it ([`StackUp::validate`]).
/// Every malformed case is an error naming the field; nothing panics.
pub fn from_json(text: &str) -> Result<StackUp> {
    let mut doc = json::parse(text).map_err(|m| Error::format(None, format!("not valid JSON: {m}")))?;
    if !matches!(doc, Json::Obj(_)) {
        return Err(Error::format(
            None,
            format!("the document must be an object (found {})", doc.type_name()),
        ));
    }
    let root = Ctx {
        v: &doc,
        path: String::new(),
    };
    let mut schema = root.string("schema")?;
    if schema == SCHEMA_1 {
        upgrade_schema_1(&mut doc, "")?;
        schema = SCHEMA.to_string();
    }
    let root = Ctx {
        v: &doc,
        path: String::new(),
    };
    if schema != SCHEMA {
        let msg = match schema.strip_prefix("magwright.stackup/") {
            Some(v) => format!("schema version \"{v}\" is not supported; this version reads \"{SCHEMA}\""),
            None => format!("\"{schema}\" is not a stack-up file; expected \"{SCHEMA}\""),
        };
        return Err(Error::format(Some("schema"), msg));
    }
    root.check_keys(&["schema", "windings", "items"])?;
    let mut windings = Vec::new();
    for (i, w) in root.array("windings")?.iter().enumerate() {
        let c = root.element("windings", i, w)?;
        c.check_keys(&["name"])?;
        windings.push(WindingDef {
            name: c.string("name")?,
        });
    }
    let mut items = Vec::new();
    for (i, v) in root.array("items")?.iter().enumerate() {
        let c = root.element("items", i, v)?;
        let kind = c.string("item")?;
        let item = match kind.as_str() {
            "section" => {
                c.check_keys(&[
                    "item",
                    "winding",
                    "turns",
                    "parallel",
                    "conductor",
                    "layers",
                    "turns_per_layer",
                    "direction",
                    "start_side",
                    "finish_side",
                    "margin_left",
                    "margin_right",
                    "interlayer_tape",
                ])?;
                let sides = [("left", Side::Left), ("right", Side::Right)];
                let interlayer = match c.v.get("interlayer_tape") {
                    None | Some(Json::Null) => None,
                    Some(_) => Some(read_tape(&c.child("interlayer_tape")?, &[])?),
                };
                Item::Section(Section {
                    winding: c.string("winding")?,
                    turns: c.count("turns", "turns")?,
                    parallel: c.count("parallel", "conductors in hand")?,
                    conductor: read_conductor(&c.child("conductor")?)?,
                    layers: c.opt_count("layers", "layers")?,
                    turns_per_layer: c.opt_count("turns_per_layer", "turns")?,
                    direction: c.choice(
                        "direction",
                        &[("cw", Direction::Clockwise), ("ccw", Direction::CounterClockwise)],
                    )?,
                    start: c.choice("start_side", &sides)?,
                    finish: c.choice("finish_side", &sides)?,
                    margin_left: c.number("margin_left")?,
                    margin_right: c.number("margin_right")?,
                    interlayer,
                })
            }
            "tape" => Item::Tape(read_tape(&c, &["item"])?),
            "screen" => {
                c.check_keys(&["item", "material", "thickness", "connection"])?;
                Item::Screen(Screen {
                    material: c.string("material")?,
                    thickness: c.number("thickness")?,
                    connection: c.string("connection")?,
                })
            }
            other => {
                return Err(Error::format(
                    Some(&c.field("item")),
                    format!("\"{other}\" is not one of: section, tape, screen"),
                ))
            }
        };
        items.push(item);
    }
    let st = StackUp { windings, items };
    st.validate()?;
    Ok(st)
}

/// [`from_json`], then checks that the stack-up still fits `core`
/// ([`super::fit::fit`]); a section that no longer fits is an error naming
/// its item and saying by how much.
pub fn import(text: &str, core: &Core) -> Result<StackUp> {
    let st = from_json(text)?;
    super::fit::fit(core, &st)?;
    Ok(st)
}
