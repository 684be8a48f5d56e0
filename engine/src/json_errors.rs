//! From serde's data error to one that names the full path, the line and,
//! for a misspelt key or name, the nearest valid one.
//!
//! Where `serde_path_to_error` knows the whole path (plain structs and
//! sequences) it is used as is. Inside an internally tagged enum it knows
//! only the prefix up to the enum; below it, the offending value is found
//! by probing: each candidate value under the prefix (of the kind serde
//! complained about, in document order) is replaced by a probe in the text
//! and the document read again. The first candidate whose probe changes the
//! error in the way only the offending value can is the one. Generic over
//! the type read; costs a few extra reads, only when a file is refused.

use crate::error::Error;
use crate::json::known_prefix;
use crate::json_spans::{join, line_of, scan, Kind, Node};

/// Candidates probed at most (a refused file costs at most this many reads).
const MAX_PROBES: usize = 32;

/// What serde said, sorted.
enum Says<'a> {
    UnknownField(&'a str),
    MissingField(&'a str),
    /// A value of this kind is wrong (invalid type or value, unknown variant, length).
    BadValue(Kind),
    Other,
}

fn backticked(s: &str) -> Option<&str> {
    let a = s.find('`')? + 1;
    let b = a + s[a..].find('`')?;
    Some(&s[a..b])
}

fn says(msg: &str) -> Says<'_> {
    if let Some(rest) = msg.strip_prefix("unknown field ") {
        return backticked(rest).map_or(Says::Other, Says::UnknownField);
    }
    if let Some(rest) = msg.strip_prefix("missing field ") {
        return backticked(rest).map_or(Says::Other, Says::MissingField);
    }
    if msg.starts_with("unknown variant ") {
        return Says::BadValue(Kind::String);
    }
    if msg.starts_with("invalid length ") {
        return Says::BadValue(Kind::Array);
    }
    let what = msg.strip_prefix("invalid type: ").or_else(|| msg.strip_prefix("invalid value: "));
    let Some(what) = what else { return Says::Other };
    let kind = [
        ("string", Kind::String),
        ("integer", Kind::Integer),
        ("floating point", Kind::Float),
        ("boolean", Kind::Bool),
        ("null", Kind::Null),
        ("unit", Kind::Null),
        ("map", Kind::Object),
        ("sequence", Kind::Array),
    ]
    .into_iter()
    .find(|(w, _)| what.starts_with(w));
    kind.map_or(Says::Other, |(_, k)| Says::BadValue(k))
}

/// The part of a message from ", expected" on (what the field takes).
fn tail(msg: &str) -> &str {
    msg.find(", expected").map_or("", |i| &msg[i..])
}

/// The names serde lists after "expected" (`a`, `b` or `c`).
fn expected_names(msg: &str) -> Vec<&str> {
    let Some(i) = msg.find("expected") else { return Vec::new() };
    let quote = if msg[i..].contains('`') { '`' } else { '"' };
    msg[i..].split(quote).skip(1).step_by(2).collect()
}

/// Edit distance with adjacent transpositions (the "optimal string
/// alignment" form of Damerau 1964 / Levenshtein 1966), on chars: each
/// substitution, insertion, deletion or swap of neighbours costs 1.
pub fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.chars().collect();
    let b: Vec<char> = b.chars().collect();
    let w = b.len() + 1;
    let mut d = vec![0usize; (a.len() + 1) * w];
    for i in 0..=a.len() {
        d[i * w] = i;
    }
    for (j, x) in d.iter_mut().enumerate().take(w) {
        *x = j;
    }
    for i in 1..=a.len() {
        for j in 1..=b.len() {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            let mut v = (d[(i - 1) * w + j - 1] + cost).min(d[(i - 1) * w + j] + 1).min(d[i * w + j - 1] + 1);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                v = v.min(d[(i - 2) * w + j - 2] + 1);
            }
            d[i * w + j] = v;
        }
    }
    d[a.len() * w + b.len()]
}

/// The valid name nearest to `given`, when it is near enough to be a slip
/// (at most a third of its letters wrong, or one contains the other).
pub fn nearest<'a>(given: &str, valid: &[&'a str]) -> Option<&'a str> {
    let g = given.to_lowercase();
    valid
        .iter()
        .map(|v| (edit_distance(&g, &v.to_lowercase()), *v))
        .filter(|(d, v)| *d <= (v.chars().count().max(3) / 3).max(1) || (g.len() >= 3 && v.contains(g.as_str())))
        .min_by_key(|(d, _)| *d)
        .map(|(_, v)| v)
}

/// The message for people: serde's words made plain, with a suggestion.
fn plain(msg: &str) -> String {
    let valid = expected_names(msg);
    let list = if valid.is_empty() { "none".to_string() } else { valid.join(", ") };
    match says(msg) {
        Says::UnknownField(k) => match nearest(k, &valid) {
            Some(n) => format!("unknown key \"{k}\"; did you mean \"{n}\"? (valid keys here: {list})"),
            None => format!("unknown key \"{k}\" (valid keys here: {list})"),
        },
        Says::MissingField(k) => format!("the key \"{k}\" is missing"),
        _ if msg.starts_with("unknown variant ") => {
            let given = backticked(msg).unwrap_or("");
            match nearest(given, &valid) {
                Some(n) => format!("unknown name \"{given}\"; did you mean \"{n}\"? (one of: {list})"),
                None => format!("unknown name \"{given}\" (one of: {list})"),
            }
        }
        _ if msg.starts_with("invalid value: string \"") && !valid.is_empty() => {
            let given = msg.split('"').nth(1).unwrap_or("");
            match nearest(given, &valid) {
                Some(n) => format!("\"{given}\" is not valid here; did you mean \"{n}\"? (one of: {list})"),
                None => format!("\"{given}\" is not valid here (one of: {list})"),
            }
        }
        _ => msg.to_string(),
    }
}

/// Replaces `span` of `text` by `with`.
fn splice(text: &str, span: (usize, usize), with: &str) -> String {
    format!("{}{with}{}", &text[..span.0], &text[span.1..])
}

/// The probe text for a value of this node, and the rule for "it is the one".
fn value_probe(text: &str, n: &Node) -> Option<String> {
    let lit = &text[n.span.0..n.span.1];
    Some(match n.kind {
        Kind::String => "\"\\u0001\"".to_string(),
        Kind::Integer if lit.trim_start_matches('-') != "0" => format!("{lit}0"),
        Kind::Integer => return None,
        Kind::Float => format!("{lit}1"),
        Kind::Bool => if lit == "true" { "false" } else { "true" }.to_string(),
        Kind::Null => "[{}]".to_string(),
        Kind::Object => "{}".to_string(),
        Kind::Array => "[{}]".to_string(),
    })
}

/// Finds the node the error is about under `prefix` (index into `nodes`),
/// and the path to report (a missing key's path ends in the key).
fn locate(text: &str, nodes: &[Node], prefix: usize, msg: &str, read: &dyn Fn(&str) -> Option<String>) -> Option<(usize, String)> {
    let root = &nodes[prefix];
    let under = |i: usize| i >= prefix && nodes[i].span.0 >= root.span.0 && nodes[i].span.1 <= root.span.1;
    let inside: Vec<usize> = (prefix..nodes.len()).take_while(|&i| under(i)).collect();
    let changed = |t: String| read(&t).filter(|m| m != msg);
    // Where the tracker reached the value itself (a plain struct), it is
    // the one: no probing.
    match says(msg) {
        Says::BadValue(kind) if root.kind == kind && !matches!(kind, Kind::Object | Kind::Array) => {
            return Some((prefix, root.path.clone()));
        }
        Says::UnknownField(k) => {
            if let Some(i) = inside.iter().copied().find(|&i| nodes[i].parent == Some(prefix) && nodes[i].key.as_deref() == Some(k)) {
                return Some((i, nodes[i].path.clone()));
            }
        }
        _ => {}
    }
    match says(msg) {
        Says::UnknownField(k) => inside.iter().filter(|&&i| nodes[i].key.as_deref() == Some(k)).take(MAX_PROBES).find_map(|&i| {
            let m = changed(splice(text, nodes[i].key_span?, "\"\\u0001\""))?;
            (m.starts_with("unknown field") && tail(&m) == tail(msg)).then(|| (i, nodes[i].path.clone()))
        }),
        Says::MissingField(k) => {
            let objects = inside.iter().filter(|&&i| {
                nodes[i].kind == Kind::Object && !nodes.iter().any(|c| c.parent == Some(i) && c.key.as_deref() == Some(k))
            });
            objects.take(MAX_PROBES).find_map(|&i| {
                let empty = !nodes.iter().any(|c| c.parent == Some(i));
                let at = nodes[i].span.0 + 1;
                let ins = format!("\"{k}\": null{}", if empty { "" } else { "," });
                let m = read(&splice(text, (at, at), &ins));
                let same = m.as_deref() == Some(msg);
                let wrong = m.as_deref().is_some_and(|m| m.starts_with("unknown field"));
                (!same && !wrong).then(|| (i, join(&nodes[i].path, k)))
            })
        }
        Says::BadValue(kind) => inside.iter().filter(|&&i| nodes[i].kind == kind).take(MAX_PROBES).find_map(|&i| {
            let p = value_probe(text, &nodes[i])?;
            let m = read(&splice(text, nodes[i].span, &p));
            let hit = match kind {
                // An empty map or [{}] leaves a wrong-kind error as it was.
                Kind::Object | Kind::Array => m.as_deref() == Some(msg),
                _ => m.as_deref().is_some_and(|m| m != msg && tail(m) == tail(msg)),
            };
            hit.then(|| (i, nodes[i].path.clone()))
        }),
        Says::Other => None,
    }
}

/// The error for people: full path, plain words, line.
pub fn refine(text: &str, raw_path: &str, msg: &str, serde_line: usize, read: &dyn Fn(&str) -> Option<String>) -> Error {
    let prefix = known_prefix(raw_path);
    let nodes = scan(text).unwrap_or_default();
    let at = |p: &str| nodes.iter().position(|n| n.path == p);
    let mut path = prefix.clone();
    let mut line = (serde_line > 0).then_some(serde_line);
    // serde buffers an internally tagged enum and the tracker then names
    // the enum, or writes "?": look under the known prefix in every case.
    let found = at(&prefix).and_then(|i| locate(text, &nodes, i, msg, read));
    if let Some((i, p)) = found {
        path = p;
        let n = &nodes[i];
        line = Some(line_of(text, n.key_span.map_or(n.span.0, |k| k.0)));
    } else {
        // The tracker names the parent of a missing key, and (for an
        // unknown key) sometimes the key itself: name the key.
        let key = match says(msg) {
            Says::UnknownField(k) | Says::MissingField(k) => Some(k),
            _ => None,
        };
        if let Some(k) = key {
            if !(path == k || path.ends_with(&format!(".{k}"))) {
                path = join(&path, k);
            }
        }
        if let Some(n) = at(&path).map(|i| &nodes[i]) {
            line = Some(line_of(text, n.key_span.map_or(n.span.0, |k| k.0)));
        } else if let Some(n) = path.rsplit_once('.').and_then(|(parent, _)| at(parent)).map(|i| &nodes[i]) {
            line = Some(line_of(text, n.span.0));
        }
    }
    let mut m = plain(msg);
    if let Some(l) = line {
        m.push_str(&format!(" (line {l})"));
    }
    Error::format((!path.is_empty()).then_some(path.as_str()), m)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Levenshtein (1966) distances; Damerau (1964) counts a swap of neighbours as one.
    #[test]
    fn edit_distance_and_nearest() {
        assert_eq!(edit_distance("kitten", "sitting"), 3);
        assert_eq!(edit_distance("", "abc"), 3);
        assert_eq!(edit_distance("ratio", "ratio"), 0);
        assert_eq!(edit_distance("ratoi", "ratio"), 1);
        assert_eq!(edit_distance("ca", "abc"), 3);
        assert_eq!(nearest("ripple_ratoi", &["ratio", "ripple_ratio"]), Some("ripple_ratio"));
        assert_eq!(nearest("frequncy", &["frequency", "duty_max"]), Some("frequency"));
        assert_eq!(nearest("zzzz", &["frequency", "duty_max"]), None);
    }
}
