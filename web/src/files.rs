//! Design files: the whole design as one JSON document with a versioned
//! wrapper of our own,
//!
//! ```json
//! { "schema": "magwright-design", "version": 1, "spec": { ... } }
//! ```
//!
//! The same text is what the page keeps in localStorage and puts (base64url)
//! into a share link, so all three ways of keeping a design read and write
//! through [`to_json`] and [`from_json`].
//!
//! Reading is strict about the wrapper and says what is wrong: a file that
//! is not JSON (with its line and column), JSON that is not ours (no or
//! another `schema`), a newer `version`, or a `spec` that does not fit the
//! design type (serde's message, with line and column). Nothing is applied
//! unless the whole file reads.
//!
//! To carry another design type, change `Spec` in [`crate::form`] (this
//! module is generic over any serde type) and, if the old files must still
//! open, bump [`VERSION`] and convert older versions in [`from_json`].

use magwright_engine::Error;
use serde::de::DeserializeOwned;
use serde::{Deserialize, Serialize};

/// The `schema` value that marks a Magwright design file.
pub const SCHEMA: &str = "magwright-design";
/// The file version this page writes and the newest it reads.
pub const VERSION: u64 = 1;
/// Larger files are refused before parsing: a design is a few KB.
pub const MAX_BYTES: usize = 1 << 20;

#[derive(Serialize)]
struct Out<'a, S> {
    schema: &'static str,
    version: u64,
    spec: &'a S,
}

#[derive(Deserialize)]
struct In<S> {
    #[allow(dead_code)]
    schema: String,
    #[allow(dead_code)]
    version: u64,
    spec: S,
}

/// The design file text (pretty-printed, stable key order).
pub fn to_json<S: Serialize>(spec: &S) -> String {
    serde_json::to_string_pretty(&Out { schema: SCHEMA, version: VERSION, spec })
        .unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"))
}

/// Reads a design file; the error message says what is wrong and where.
/// The error's field is `spec.<key>` when serde names the key.
pub fn from_json<S: DeserializeOwned>(text: &str) -> Result<S, Error> {
    if text.len() > MAX_BYTES {
        return Err(Error::format(None, format!("the file is {} KB; a design file is a few KB", text.len() / 1024)));
    }
    let value: serde_json::Value = serde_json::from_str(text)
        .map_err(|e| Error::format(None, format!("this is not valid JSON: {}", serde_msg(&e))))?;
    let Some(obj) = value.as_object() else {
        return Err(foreign("the file holds no JSON object"));
    };
    match obj.get("schema") {
        Some(serde_json::Value::String(s)) if s == SCHEMA => {}
        Some(serde_json::Value::String(s)) => return Err(foreign(&format!("its \"schema\" is \"{s}\""))),
        Some(_) => return Err(foreign("its \"schema\" is not a string")),
        None => return Err(foreign("it has no \"schema\" key")),
    }
    match obj.get("version").and_then(|v| v.as_u64()) {
        Some(v) if (1..=VERSION).contains(&v) => {}
        Some(v) if v > VERSION => {
            return Err(Error::format(
                Some("version"),
                format!(
                    "the file was written by a newer Magwright (file version {v}); this page reads version {VERSION}"
                ),
            ))
        }
        _ => return Err(Error::format(Some("version"), "the file's \"version\" must be a whole number from 1")),
    }
    if !obj.contains_key("spec") {
        return Err(Error::format(Some("spec"), "the file has no \"spec\" (the design itself)"));
    }
    serde_json::from_str::<In<S>>(text).map(|f| f.spec).map_err(|e| {
        let field = named_field(&e.to_string()).map(|k| format!("spec.{k}"));
        Error::format(field.as_deref(), format!("the design in the file does not fit: {}", serde_msg(&e)))
    })
}

fn foreign(why: &str) -> Error {
    Error::format(
        Some("schema"),
        format!("this is not a Magwright design file: {why}; a design file starts with \"schema\": \"{SCHEMA}\""),
    )
}

/// serde_json's message with its position spelt out: "… (line 3, column 17)".
fn serde_msg(e: &serde_json::Error) -> String {
    let s = e.to_string();
    let msg = match s.rfind(" at line ") {
        Some(i) => &s[..i],
        None => &s,
    };
    if e.line() > 0 {
        format!("{msg} (line {}, column {})", e.line(), e.column())
    } else {
        msg.to_string()
    }
}

/// The key in serde messages like "missing field `vout`" or "unknown field `x`".
fn named_field(msg: &str) -> Option<&str> {
    let start = msg.find("field `")? + "field `".len();
    let len = msg[start..].find('`')?;
    Some(&msg[start..start + len])
}

#[cfg(test)]
mod tests {
    use super::*;
    use magwright_engine::design::forward::ForwardSpec;

    #[test]
    fn round_trip() {
        let s = ForwardSpec::demo();
        let text = to_json(&s);
        assert!(text.contains("\"schema\": \"magwright-design\""));
        assert_eq!(from_json::<ForwardSpec>(&text).unwrap(), s);
    }

    #[test]
    fn refuses_with_reasons() {
        let e = from_json::<ForwardSpec>("{ \"schema\": \"magwright-design\",\n \"version\": 1, ").unwrap_err();
        assert!(e.message().contains("not valid JSON") && e.message().contains("line 2"), "{e}");
        let e = from_json::<ForwardSpec>("{\"name\": \"shopping list\"}").unwrap_err();
        assert_eq!(e.field(), Some("schema"));
        let e = from_json::<ForwardSpec>("[1, 2]").unwrap_err();
        assert!(e.message().contains("not a Magwright design file"));
        let e =
            from_json::<ForwardSpec>("{\"schema\": \"magwright-design\", \"version\": 9, \"spec\": {}}").unwrap_err();
        assert!(e.message().contains("newer"));
        let mut v: serde_json::Value = serde_json::from_str(&to_json(&ForwardSpec::demo())).unwrap();
        v["spec"].as_object_mut().unwrap().remove("vout");
        let e = from_json::<ForwardSpec>(&v.to_string()).unwrap_err();
        assert_eq!(e.field(), Some("spec.vout"), "{e}");
        v["spec"]["vout"] = serde_json::json!("twelve");
        let e = from_json::<ForwardSpec>(&serde_json::to_string_pretty(&v).unwrap()).unwrap_err();
        assert!(e.message().contains("line"), "{e}");
    }
}
