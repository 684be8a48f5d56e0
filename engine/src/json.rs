//! JSON at the edges: serde_json, with errors that name the field.
//!
//! A malformed file must never panic and must say where it went wrong:
//! `serde_path_to_error` tracks the path (e.g. `spec.outputs[0].voltage`)
//! and we turn serde's message into an [`Error::Format`] carrying it.

use crate::error::{Error, Result};
use serde::de::DeserializeOwned;
use serde::Serialize;

/// Largest document accepted, bytes (a design file is a few kB).
pub const MAX_LEN: usize = 4 << 20;

/// Parses `text` into `T`; the error names the field path and line.
pub fn from_str<T: DeserializeOwned>(text: &str) -> Result<T> {
    if text.len() > MAX_LEN {
        return Err(Error::format(None, format!("the file is too large ({} kB); a design is a few kB", text.len() / 1024)));
    }
    if text.trim().is_empty() {
        return Err(Error::format(None, "the file is empty"));
    }
    let mut de = serde_json::Deserializer::from_str(text);
    let value: std::result::Result<T, _> = serde_path_to_error::deserialize(&mut de);
    match value {
        Ok(v) => {
            de.end().map_err(|e| Error::format(None, format!("text after the end of the JSON document: {e}")))?;
            Ok(v)
        }
        Err(e) => {
            // Inside an internally tagged enum the path tracker cannot see
            // the key and writes "?": keep the known prefix only.
            let full = e.path().to_string();
            let path = match full.find('?') {
                Some(i) => full[..i].trim_end_matches('.').to_string(),
                None => full,
            };
            let inner = e.into_inner();
            let msg = match inner.classify() {
                serde_json::error::Category::Syntax | serde_json::error::Category::Eof => {
                    format!("not valid JSON: {inner}")
                }
                _ => inner.to_string(),
            };
            let field = if path == "." || path.is_empty() { None } else { Some(path.as_str()) };
            Err(Error::format(field, msg))
        }
    }
}

/// Pretty JSON. Serialising our own types cannot fail (no maps with
/// non-string keys, no non-finite floats reach here); should it, the
/// error text is returned as a JSON string rather than a panic.
pub fn to_string_pretty<T: Serialize>(v: &T) -> String {
    serde_json::to_string_pretty(v).unwrap_or_else(|e| format!("\"serialisation failed: {e}\""))
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde::Deserialize;

    #[derive(Debug, Deserialize)]
    #[allow(dead_code)]
    struct Outer {
        inner: Vec<Inner>,
    }
    #[derive(Debug, Deserialize)]
    #[allow(dead_code)]
    struct Inner {
        x: f64,
    }

    #[test]
    fn errors_name_the_path() {
        let e = from_str::<Outer>(r#"{"inner":[{"x":1},{"x":"a"}]}"#).unwrap_err();
        assert_eq!(e.field(), Some("inner[1].x"), "{e}");
        let e = from_str::<Outer>(r#"{"inner":[{"x":1}"#).unwrap_err();
        assert!(e.message().contains("not valid JSON"), "{e}");
        assert!(from_str::<Outer>("").is_err());
        // Regression (fuzz): a syntax error inside a tagged enum gave the
        // field "spec.?"; now the known prefix.
        #[derive(Debug, Deserialize)]
        #[allow(dead_code)]
        struct Tagged {
            spec: Kind,
        }
        #[derive(Debug, Deserialize)]
        #[serde(tag = "kind")]
        #[allow(dead_code)]
        enum Kind {
            A { x: f64 },
        }
        let e = from_str::<Tagged>(r#"{"spec": {"kind": "A", "x": 1,"#).unwrap_err();
        assert!(e.field().is_none_or(|f| !f.contains('?')), "{e:?}");
        assert!(from_str::<Outer>(r#"{"inner":[]} x"#).is_err());
    }
}
