//! A small JSON reader and writer for the stack-up file.
//!
//! Why not serde_json: the stack-up must survive import(export(x)) == x
//! bit for bit, and serde_json's default float parser may be off by one
//! unit in the last place (its exact parser is an opt-in feature). Here a
//! number token is handed to Rust's `str::parse::<f64>`, which rounds
//! correctly, and numbers are written with Rust's shortest round-trip
//! formatting. The reader also keeps the line of every value so errors can
//! say where, limits nesting depth (no stack overflow on hostile input) and
//! never panics.

use std::fmt::Write as _;

/// A JSON value. Objects keep their key order.
#[derive(Debug, Clone, PartialEq)]
pub enum Json {
    Null,
    Bool(bool),
    Num(f64),
    Str(String),
    Arr(Vec<Json>),
    Obj(Vec<(String, Json)>),
}

impl Json {
    pub fn get(&self, key: &str) -> Option<&Json> {
        match self {
            Json::Obj(kv) => kv.iter().find(|(k, _)| k == key).map(|(_, v)| v),
            _ => None,
        }
    }

    /// The JSON type name, for error messages.
    pub fn type_name(&self) -> &'static str {
        match self {
            Json::Null => "null",
            Json::Bool(_) => "a boolean",
            Json::Num(_) => "a number",
            Json::Str(_) => "a string",
            Json::Arr(_) => "an array",
            Json::Obj(_) => "an object",
        }
    }
}

const MAX_DEPTH: usize = 64;

/// Parses a JSON document. The error is a message with line and column.
pub fn parse(text: &str) -> Result<Json, String> {
    let mut p = Parser {
        s: text.as_bytes(),
        i: 0,
    };
    p.ws();
    let v = p.value(0)?;
    p.ws();
    if p.i < p.s.len() {
        return Err(p.err("unexpected text after the end of the document"));
    }
    Ok(v)
}

struct Parser<'a> {
    s: &'a [u8],
    i: usize,
}

impl Parser<'_> {
    fn err(&self, msg: &str) -> String {
        let upto = &self.s[..self.i.min(self.s.len())];
        let line = upto.iter().filter(|&&b| b == b'\n').count() + 1;
        let col = upto.iter().rev().take_while(|&&b| b != b'\n').count() + 1;
        format!("{msg} (line {line}, column {col})")
    }

    fn peek(&self) -> Option<u8> {
        self.s.get(self.i).copied()
    }

    fn ws(&mut self) {
        while let Some(b' ' | b'\t' | b'\n' | b'\r') = self.peek() {
            self.i += 1;
        }
    }

    fn lit(&mut self, word: &str, v: Json) -> Result<Json, String> {
        if self.s.get(self.i..self.i + word.len()) == Some(word.as_bytes()) {
            self.i += word.len();
            Ok(v)
        } else {
            Err(self.err("invalid value"))
        }
    }

    fn value(&mut self, depth: usize) -> Result<Json, String> {
        if depth > MAX_DEPTH {
            return Err(self.err("nesting too deep"));
        }
        match self.peek() {
            None => Err(self.err("unexpected end of the document")),
            Some(b'{') => {
                self.i += 1;
                let mut kv = Vec::new();
                self.ws();
                if self.peek() == Some(b'}') {
                    self.i += 1;
                    return Ok(Json::Obj(kv));
                }
                loop {
                    self.ws();
                    if self.peek() != Some(b'"') {
                        return Err(self.err("expected a key in double quotes"));
                    }
                    let k = self.string()?;
                    if kv.iter().any(|(old, _): &(String, Json)| *old == k) {
                        return Err(self.err(&format!("key \"{k}\" appears twice")));
                    }
                    self.ws();
                    if self.peek() != Some(b':') {
                        return Err(self.err("expected ':' after a key"));
                    }
                    self.i += 1;
                    self.ws();
                    let v = self.value(depth + 1)?;
                    kv.push((k, v));
                    self.ws();
                    match self.peek() {
                        Some(b',') => self.i += 1,
                        Some(b'}') => {
                            self.i += 1;
                            return Ok(Json::Obj(kv));
                        }
                        _ => return Err(self.err("expected ',' or '}' in an object")),
                    }
                }
            }
            Some(b'[') => {
                self.i += 1;
                let mut a = Vec::new();
                self.ws();
                if self.peek() == Some(b']') {
                    self.i += 1;
                    return Ok(Json::Arr(a));
                }
                loop {
                    self.ws();
                    a.push(self.value(depth + 1)?);
                    self.ws();
                    match self.peek() {
                        Some(b',') => self.i += 1,
                        Some(b']') => {
                            self.i += 1;
                            return Ok(Json::Arr(a));
                        }
                        _ => return Err(self.err("expected ',' or ']' in an array")),
                    }
                }
            }
            Some(b'"') => Ok(Json::Str(self.string()?)),
            Some(b't') => self.lit("true", Json::Bool(true)),
            Some(b'f') => self.lit("false", Json::Bool(false)),
            Some(b'n') => self.lit("null", Json::Null),
            Some(b'-' | b'0'..=b'9') => self.number(),
            Some(_) => Err(self.err("invalid value")),
        }
    }

    fn number(&mut self) -> Result<Json, String> {
        let start = self.i;
        if self.peek() == Some(b'-') {
            self.i += 1;
        }
        let digits = |p: &mut Self| {
            let s = p.i;
            while let Some(b'0'..=b'9') = p.peek() {
                p.i += 1;
            }
            p.i > s
        };
        if !digits(self) {
            return Err(self.err("invalid number"));
        }
        if self.peek() == Some(b'.') {
            self.i += 1;
            if !digits(self) {
                return Err(self.err("invalid number"));
            }
        }
        if let Some(b'e' | b'E') = self.peek() {
            self.i += 1;
            if let Some(b'+' | b'-') = self.peek() {
                self.i += 1;
            }
            if !digits(self) {
                return Err(self.err("invalid number"));
            }
        }
        let tok = std::str::from_utf8(&self.s[start..self.i]).map_err(|_| self.err("invalid number"))?;
        match tok.parse::<f64>() {
            Ok(v) if v.is_finite() => Ok(Json::Num(v)),
            _ => Err(self.err("number out of range")),
        }
    }

    fn hex4(&mut self) -> Result<u32, String> {
        let h = self
            .s
            .get(self.i..self.i + 4)
            .ok_or_else(|| self.err("bad \\u escape"))?;
        let h = std::str::from_utf8(h).map_err(|_| self.err("bad \\u escape"))?;
        let v = u32::from_str_radix(h, 16).map_err(|_| self.err("bad \\u escape"))?;
        self.i += 4;
        Ok(v)
    }

    fn string(&mut self) -> Result<String, String> {
        self.i += 1; // opening quote
        let mut out: Vec<u8> = Vec::new();
        loop {
            match self.peek() {
                None => return Err(self.err("unterminated string")),
                Some(b'"') => {
                    self.i += 1;
                    return String::from_utf8(out).map_err(|_| self.err("invalid UTF-8 in a string"));
                }
                Some(b'\\') => {
                    self.i += 1;
                    let c = self.peek().ok_or_else(|| self.err("unterminated string"))?;
                    self.i += 1;
                    let ch = match c {
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
                            let code = if (0xD800..0xDC00).contains(&hi) {
                                if self.s.get(self.i..self.i + 2) != Some(b"\\u") {
                                    return Err(self.err("lone surrogate in \\u escape"));
                                }
                                self.i += 2;
                                let lo = self.hex4()?;
                                if !(0xDC00..0xE000).contains(&lo) {
                                    return Err(self.err("bad surrogate pair"));
                                }
                                0x10000 + ((hi - 0xD800) << 10) + (lo - 0xDC00)
                            } else {
                                hi
                            };
                            char::from_u32(code).ok_or_else(|| self.err("bad \\u escape"))?
                        }
                        _ => return Err(self.err("unknown escape in a string")),
                    };
                    let mut buf = [0u8; 4];
                    out.extend_from_slice(ch.encode_utf8(&mut buf).as_bytes());
                }
                Some(b) if b < 0x20 => return Err(self.err("control character in a string")),
                Some(b) => {
                    out.push(b);
                    self.i += 1;
                }
            }
        }
    }
}

/// Writes `v` as indented JSON (two spaces). Numbers use Rust's shortest
/// representation that parses back to the same f64; non-finite numbers
/// (which the stack-up never holds) are written as null.
pub fn write(v: &Json) -> String {
    let mut s = String::new();
    write_into(&mut s, v, 0);
    s.push('\n');
    s
}

fn write_into(s: &mut String, v: &Json, ind: usize) {
    match v {
        Json::Null => s.push_str("null"),
        Json::Bool(b) => s.push_str(if *b { "true" } else { "false" }),
        Json::Num(x) => {
            if x.is_finite() && x.fract() == 0.0 && x.abs() < 1e15 && !(*x == 0.0 && x.is_sign_negative()) {
                // Whole numbers (counts) without a decimal point.
                let _ = write!(s, "{}", *x as i64);
            } else if x.is_finite() {
                let _ = write!(s, "{x:?}");
            } else {
                s.push_str("null");
            }
        }
        Json::Str(t) => write_str(s, t),
        Json::Arr(a) => {
            if a.is_empty() {
                s.push_str("[]");
                return;
            }
            s.push_str("[\n");
            for (i, x) in a.iter().enumerate() {
                pad(s, ind + 1);
                write_into(s, x, ind + 1);
                s.push_str(if i + 1 < a.len() { ",\n" } else { "\n" });
            }
            pad(s, ind);
            s.push(']');
        }
        Json::Obj(kv) => {
            if kv.is_empty() {
                s.push_str("{}");
                return;
            }
            s.push_str("{\n");
            for (i, (k, x)) in kv.iter().enumerate() {
                pad(s, ind + 1);
                write_str(s, k);
                s.push_str(": ");
                write_into(s, x, ind + 1);
                s.push_str(if i + 1 < kv.len() { ",\n" } else { "\n" });
            }
            pad(s, ind);
            s.push('}');
        }
    }
}

fn pad(s: &mut String, ind: usize) {
    for _ in 0..ind {
        s.push_str("  ");
    }
}

fn write_str(s: &mut String, t: &str) {
    s.push('"');
    for c in t.chars() {
        match c {
            '"' => s.push_str("\\\""),
            '\\' => s.push_str("\\\\"),
            '\n' => s.push_str("\\n"),
            '\r' => s.push_str("\\r"),
            '\t' => s.push_str("\\t"),
            c if (c as u32) < 0x20 => {
                let _ = write!(s, "\\u{:04x}", c as u32);
            }
            c => s.push(c),
        }
    }
    s.push('"');
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_and_writes() {
        let v = parse(r#"{"a": [1, -2.5e-3, true, null], "b": "x\"\u00e9\ud83d\ude00"}"#).unwrap();
        assert_eq!(v.get("b"), Some(&Json::Str("x\"é😀".into())));
        assert_eq!(parse(&write(&v)).unwrap(), v);
        for bad in [
            "",
            "{",
            "[1,]",
            "{\"a\" 1}",
            "01x",
            "\"\\q\"",
            "1e999",
            "{\"a\":1,\"a\":2}",
            "[1] 2",
        ] {
            assert!(parse(bad).is_err(), "{bad}");
        }
        let deep = "[".repeat(1000);
        assert!(parse(&deep).is_err());
    }

    #[test]
    fn numbers_round_trip_exactly() {
        for x in [
            3.0,
            -7.0,
            1e15,
            0.1 + 0.2,
            1.0 / 3.0 * 1e-3,
            5e-324,
            1.7976931348623157e308,
            -0.0,
            0.000566,
            123456789.123,
        ] {
            let s = write(&Json::Num(x));
            match parse(&s).unwrap() {
                Json::Num(y) => assert_eq!(x.to_bits(), y.to_bits(), "{s}"),
                _ => panic!(),
            }
        }
    }
}
