//! JSON at the edges: serde_json, with errors that name the field.
//!
//! A malformed file must never panic and must say where it went wrong, by
//! the full path of the offending value (`spec.input.min`,
//! `choices.wires[1].wire.awg`) and its line. `serde_path_to_error` tracks
//! the path while serde reads; inside an internally tagged enum serde
//! buffers the object first and the tracker loses the way (it writes `?`).
//! There [`crate::json_errors`] finds the offending value itself: it scans the
//! text ([`crate::json_spans`]), changes one candidate value at a time and
//! reads again, so the rule holds for any type, not a list of names.
//!
//! Unknown keys: the input types carry `#[serde(deny_unknown_fields)]`; the
//! message suggests the nearest valid name (edit distance to the names serde
//! lists as expected).

use crate::error::{Error, Result};
use serde::de::DeserializeOwned;
use serde::Serialize;

/// Largest document accepted, bytes (a design file is a few kB). The CLI
/// reads at most this much and the page opens at most this much, so both
/// refuse the same files.
pub const MAX_LEN: usize = 16 << 20;

/// Parses `text` into `T`; the error names the field path and line.
/// A leading UTF-8 byte-order mark is skipped (editors on some systems
/// write one); it is not part of the JSON text (RFC 8259 §8.1).
pub fn from_str<T: DeserializeOwned>(text: &str) -> Result<T> {
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    if text.len() > MAX_LEN {
        return Err(Error::format(None, format!("the file is too large ({} kB, at most {} MB); a design is a few kB", text.len() / 1024, MAX_LEN >> 20)));
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
            let raw_path = e.path().to_string();
            let inner = e.into_inner();
            Err(match inner.classify() {
                serde_json::error::Category::Syntax | serde_json::error::Category::Eof | serde_json::error::Category::Io => {
                    // The known prefix of the path only ("?" marks where the tracker lost it).
                    let path = known_prefix(&raw_path);
                    let field = (!path.is_empty()).then_some(path.as_str());
                    Error::format(field, format!("not valid JSON: {inner}"))
                }
                serde_json::error::Category::Data => {
                    crate::json_errors::refine(text, &raw_path, &message_of(&inner), inner.line(), &probe::<T>)
                }
            })
        }
    }
}

/// [`from_str`], then refuses any key the reading passed over in silence.
///
/// serde ignores the other keys of an internally tagged unit variant
/// (`{"rule": "least_loss", "turn": 9}`) even under `deny_unknown_fields`,
/// and so does `#[serde(flatten)]`. Writing the value back shows which keys
/// it holds: a key of the file that is not in the value written back (at the
/// same path) was not read. Empty values (null, [], {}) are let pass, since a
/// type may leave an empty member out when it writes.
pub fn from_str_checked<T: DeserializeOwned + Serialize>(text: &str) -> Result<T> {
    let v: T = from_str(text)?;
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    let Ok(back) = serde_json::to_value(&v) else { return Ok(v) };
    let Some(nodes) = crate::json_spans::scan(text) else { return Ok(v) };
    for n in &nodes {
        let (Some(key), Some(p)) = (&n.key, n.parent) else { continue };
        let lit = &text[n.span.0..n.span.1];
        if matches!(lit, "null" | "[]" | "{}") || lit.starts_with('[') && lit[1..].trim() == "]" || lit.starts_with('{') && lit[1..].trim() == "}" {
            continue;
        }
        let Some(obj) = pointer(&back, &nodes[p].path) .and_then(serde_json::Value::as_object) else { continue };
        if !obj.contains_key(key) {
            let valid: Vec<&str> = obj.keys().map(String::as_str).collect();
            let hint = crate::json_errors::nearest(key, &valid).map(|k| format!("; did you mean \"{k}\"?")).unwrap_or_default();
            let line = crate::json_spans::line_of(text, n.key_span.map_or(n.span.0, |k| k.0));
            return Err(Error::format(
                Some(&n.path),
                format!("unknown key \"{key}\"{hint} (valid keys here: {}) (line {line})", valid.join(", ")),
            ));
        }
    }
    Ok(v)
}

/// The value at a path of the `serde_path_to_error` notation (`a.b[2].c`).
fn pointer<'a>(v: &'a serde_json::Value, path: &str) -> Option<&'a serde_json::Value> {
    let mut cur = v;
    for seg in path.split('.').filter(|s| !s.is_empty()) {
        let (key, rest) = seg.split_once('[').map_or((seg, ""), |(k, r)| (k, r));
        if !key.is_empty() {
            cur = cur.get(key)?;
        }
        for idx in rest.split('[').filter(|s| !s.is_empty()) {
            cur = cur.get(idx.trim_end_matches(']').parse::<usize>().ok()?)?;
        }
    }
    Some(cur)
}

/// The path before the first unknown segment, without a trailing dot.
pub(crate) fn known_prefix(raw: &str) -> String {
    let p = match raw.find('?') {
        Some(i) => &raw[..i],
        None => raw,
    };
    let p = p.trim_end_matches('.');
    if p == "." { String::new() } else { p.to_string() }
}

/// serde_json's message without its " at line L column C" (we give our own line).
fn message_of(e: &serde_json::Error) -> String {
    let s = e.to_string();
    match s.rfind(" at line ") {
        Some(i) if e.line() > 0 => s[..i].to_string(),
        _ => s,
    }
}

/// Reads `text` as `T` again; the message when it fails (None when it reads).
fn probe<T: DeserializeOwned>(text: &str) -> Option<String> {
    serde_json::from_str::<T>(text).err().map(|e| message_of(&e))
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
    #[serde(deny_unknown_fields)]
    #[allow(dead_code)]
    struct Outer {
        inner: Vec<Inner>,
        #[serde(default)]
        spec: Option<Kind>,
    }
    #[derive(Debug, Deserialize)]
    #[serde(deny_unknown_fields)]
    #[allow(dead_code)]
    struct Inner {
        x: f64,
    }
    #[derive(Debug, Deserialize)]
    #[serde(tag = "kind", deny_unknown_fields)]
    #[allow(dead_code)]
    enum Kind {
        A { x: f64, n: u32, y: Option<f64>, sub: Option<Sub> },
    }
    #[derive(Debug, Deserialize)]
    #[serde(tag = "kind", deny_unknown_fields)]
    #[allow(dead_code)]
    enum Sub {
        B { ratio: f64 },
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
        let e = from_str::<Outer>(r#"{"inner": [], "spec": {"kind": "A", "x": 1,"#).unwrap_err();
        assert!(e.field().is_none_or(|f| !f.contains('?')), "{e:?}");
        assert!(from_str::<Outer>(r#"{"inner":[]} x"#).is_err());
    }

    /// Inside internally tagged enums (where serde buffers and the path
    /// tracker is blind) the path still reaches the value, and the line is
    /// that of the value.
    #[test]
    fn paths_inside_tagged_enums() {
        let cases = [
            (r#"{"inner": [], "spec": {"kind": "A", "x": "a", "n": 1}}"#, "spec.x"),
            (r#"{"inner": [], "spec": {"kind": "A", "x": 1, "n": -1}}"#, "spec.n"),
            (r#"{"inner": [], "spec": {"kind": "A", "x": 1, "n": 1.5}}"#, "spec.n"),
            (r#"{"inner": [], "spec": {"kind": "A", "x": 1, "n": 1, "y": 1, "yy": 2}}"#, "spec.yy"),
            (r#"{"inner": [], "spec": {"kind": "A", "n": 1}}"#, "spec.x"),
            (r#"{"inner": [], "spec": {"kind": "A", "x": 1, "n": 2, "sub": {"kind": "B", "ratoi": 1}}}"#, "spec.sub.ratoi"),
            (r#"{"inner": [], "spec": {"kind": "A", "x": 1, "n": 2, "sub": {"kind": "B", "ratio": null}}}"#, "spec.sub.ratio"),
            (r#"{"inner": [], "spec": {"kind": "A", "x": 1, "n": 2, "sub": {"kind": "B"}}}"#, "spec.sub.ratio"),
            (r#"{"inner": [], "spec": {"kind": "A", "x": true, "n": 2}}"#, "spec.x"),
            (r#"{"inner": [], "spec": {"kind": "A", "x": 1, "n": {}}}"#, "spec.n"),
            (r#"{"inner": [], "spec": {"kind": "C"}}"#, "spec.kind"),
            (r#"{"inner": [{"x": 1, "z": 2}]}"#, "inner[0].z"),
            (r#"{"inner": [{}]}"#, "inner[0].x"),
            (r#"{"inner": [], "sepc": 1}"#, "sepc"),
        ];
        for (text, path) in cases {
            let e = from_str::<Outer>(text).unwrap_err();
            assert_eq!(e.field(), Some(path), "{text}: {e}");
        }
        let e = from_str::<Outer>("{\"inner\": [],\n \"spec\": {\"kind\": \"A\",\n \"x\": 1,\n \"n\": 2, \"sub\": {\"kind\": \"B\", \"ratoi\": 1}}}").unwrap_err();
        assert!(e.message().contains("line 4"), "{e}");
        assert!(e.message().contains("did you mean \"ratio\""), "{e}");
    }

    #[test]
    fn byte_order_mark_is_skipped() {
        assert!(from_str::<Outer>("\u{feff}{\"inner\": []}").is_ok());
    }
}
