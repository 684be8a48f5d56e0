//! Where each value of a JSON text sits: its path, its byte span and its line.
//!
//! serde reads a document into values and forgets where they were; the error
//! reporting of [`crate::json`] needs the way back, from a field path such as
//! `spec.input.min` to the line of the file, and needs to edit one value of the
//! text (a probe) without touching the rest (order and spelling of the other
//! keys kept). RFC 8259 grammar, strict; anything malformed gives `None`.

/// The kind of a JSON value.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    Object,
    Array,
    String,
    /// An integer literal (no fraction, no exponent).
    Integer,
    /// A number with a fraction or an exponent.
    Float,
    Bool,
    Null,
}

/// One value of the document, in document order (a parent before its children).
#[derive(Debug, Clone, PartialEq)]
pub struct Node {
    /// Path in the notation of `serde_path_to_error`: `a.b[2].c` ("" for the root).
    pub path: String,
    /// The key this value sits under, if it is a member of an object.
    pub key: Option<String>,
    /// Byte span of the key's string literal, quotes included.
    pub key_span: Option<(usize, usize)>,
    /// Byte span of the value.
    pub span: (usize, usize),
    pub kind: Kind,
    /// Index of the enclosing object or array.
    pub parent: Option<usize>,
}

/// Deepest nesting scanned (as serde_json's own limit).
const MAX_DEPTH: usize = 128;

/// Every value of `text`, or `None` when `text` is not one valid JSON document.
pub fn scan(text: &str) -> Option<Vec<Node>> {
    let mut s = Scanner { b: text.as_bytes(), i: 0, nodes: Vec::new() };
    s.ws();
    s.value(String::new(), None, None, None, 0)?;
    s.ws();
    (s.i == s.b.len()).then_some(s.nodes)
}

/// The 1-based line of byte offset `at`.
pub fn line_of(text: &str, at: usize) -> usize {
    1 + text.as_bytes()[..at.min(text.len())].iter().filter(|&&c| c == b'\n').count()
}

/// Joins a path and a key the way `serde_path_to_error` does.
pub fn join(path: &str, key: &str) -> String {
    if path.is_empty() {
        key.to_string()
    } else {
        format!("{path}.{key}")
    }
}

struct Scanner<'a> {
    b: &'a [u8],
    i: usize,
    nodes: Vec<Node>,
}

impl Scanner<'_> {
    fn ws(&mut self) {
        while matches!(self.b.get(self.i), Some(b' ' | b'\t' | b'\n' | b'\r')) {
            self.i += 1;
        }
    }

    fn eat(&mut self, c: u8) -> Option<()> {
        (self.b.get(self.i) == Some(&c)).then(|| self.i += 1)
    }

    fn value(
        &mut self,
        path: String,
        key: Option<String>,
        key_span: Option<(usize, usize)>,
        parent: Option<usize>,
        depth: usize,
    ) -> Option<()> {
        if depth > MAX_DEPTH {
            return None;
        }
        let start = self.i;
        let idx = self.nodes.len();
        self.nodes.push(Node { path: path.clone(), key, key_span, span: (start, start), kind: Kind::Null, parent });
        let kind = match *self.b.get(self.i)? {
            b'{' => {
                self.i += 1;
                self.ws();
                if self.eat(b'}').is_none() {
                    loop {
                        self.ws();
                        let ks = self.i;
                        let k = self.string()?;
                        let kspan = (ks, self.i);
                        self.ws();
                        self.eat(b':')?;
                        self.ws();
                        self.value(join(&path, &k), Some(k), Some(kspan), Some(idx), depth + 1)?;
                        self.ws();
                        if self.eat(b',').is_none() {
                            self.eat(b'}')?;
                            break;
                        }
                    }
                }
                Kind::Object
            }
            b'[' => {
                self.i += 1;
                self.ws();
                if self.eat(b']').is_none() {
                    let mut n = 0;
                    loop {
                        self.ws();
                        self.value(format!("{path}[{n}]"), None, None, Some(idx), depth + 1)?;
                        n += 1;
                        self.ws();
                        if self.eat(b',').is_none() {
                            self.eat(b']')?;
                            break;
                        }
                    }
                }
                Kind::Array
            }
            b'"' => {
                self.string()?;
                Kind::String
            }
            b't' => self.word("true", Kind::Bool)?,
            b'f' => self.word("false", Kind::Bool)?,
            b'n' => self.word("null", Kind::Null)?,
            _ => self.number()?,
        };
        self.nodes[idx].span = (start, self.i);
        self.nodes[idx].kind = kind;
        Some(())
    }

    fn word(&mut self, w: &str, k: Kind) -> Option<Kind> {
        self.b[self.i..].starts_with(w.as_bytes()).then(|| {
            self.i += w.len();
            k
        })
    }

    fn digits(&mut self) -> usize {
        let s = self.i;
        while self.b.get(self.i).is_some_and(u8::is_ascii_digit) {
            self.i += 1;
        }
        self.i - s
    }

    fn number(&mut self) -> Option<Kind> {
        let _ = self.eat(b'-');
        let first = *self.b.get(self.i)?;
        let n = self.digits();
        if n == 0 || (first == b'0' && n > 1) {
            return None;
        }
        let mut kind = Kind::Integer;
        if self.eat(b'.').is_some() {
            (self.digits() > 0).then_some(())?;
            kind = Kind::Float;
        }
        if matches!(self.b.get(self.i), Some(b'e' | b'E')) {
            self.i += 1;
            if matches!(self.b.get(self.i), Some(b'+' | b'-')) {
                self.i += 1;
            }
            (self.digits() > 0).then_some(())?;
            kind = Kind::Float;
        }
        Some(kind)
    }

    /// A string literal; returns its text (escapes decoded).
    fn string(&mut self) -> Option<String> {
        self.eat(b'"')?;
        let mut out = Vec::new();
        loop {
            let c = *self.b.get(self.i)?;
            self.i += 1;
            match c {
                b'"' => return String::from_utf8(out).ok(),
                b'\\' => {
                    let e = *self.b.get(self.i)?;
                    self.i += 1;
                    let ch = match e {
                        b'"' => '"',
                        b'\\' => '\\',
                        b'/' => '/',
                        b'b' => '\u{8}',
                        b'f' => '\u{c}',
                        b'n' => '\n',
                        b'r' => '\r',
                        b't' => '\t',
                        b'u' => {
                            let hi = self.hex4()?;
                            if (0xD800..0xDC00).contains(&hi) {
                                self.eat(b'\\')?;
                                self.eat(b'u')?;
                                let lo = self.hex4()?;
                                (0xDC00..0xE000).contains(&lo).then_some(())?;
                                char::from_u32(0x10000 + ((hi - 0xD800) << 10) + (lo - 0xDC00))?
                            } else {
                                char::from_u32(hi)?
                            }
                        }
                        _ => return None,
                    };
                    let mut buf = [0u8; 4];
                    out.extend_from_slice(ch.encode_utf8(&mut buf).as_bytes());
                }
                0..=0x1f => return None,
                _ => out.push(c),
            }
        }
    }

    fn hex4(&mut self) -> Option<u32> {
        let h = std::str::from_utf8(self.b.get(self.i..self.i + 4)?).ok()?;
        let v = u32::from_str_radix(h, 16).ok()?;
        self.i += 4;
        Some(v)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_spans_and_lines() {
        let t = "{\n \"a\": {\"b\": [1, 2.5e3, {\"c\": \"x\\u00e9\"}]},\n \"d\": null\n}";
        let n = scan(t).unwrap();
        let paths: Vec<&str> = n.iter().map(|n| n.path.as_str()).collect();
        assert_eq!(paths, ["", "a", "a.b", "a.b[0]", "a.b[1]", "a.b[2]", "a.b[2].c", "d"]);
        assert_eq!(n[3].kind, Kind::Integer);
        assert_eq!(n[4].kind, Kind::Float);
        assert_eq!(&t[n[4].span.0..n[4].span.1], "2.5e3");
        assert_eq!(n[6].key.as_deref(), Some("c"));
        assert_eq!(line_of(t, n[7].span.0), 3);
        assert_eq!(n[7].parent, Some(0));
    }

    /// RFC 8259 §6 number grammar and §7 strings: these are not JSON.
    #[test]
    fn refuses_what_rfc8259_refuses() {
        for bad in ["", "01", "1.", ".5", "1e", "[1,]", "{\"a\" 1}", "\"\u{1}\"", "{} x", "tru", "\"\\x\""] {
            assert!(scan(bad).is_none(), "{bad:?}");
        }
        let deep = "[".repeat(200) + &"]".repeat(200);
        assert!(scan(&deep).is_none());
    }
}
