//! A serde `Serializer` that serialises nothing and records the path of
//! every non-finite float it meets.
//!
//! Walking a `serde_json::Value` cannot do this: serde_json writes NaN and
//! infinity as `null`, indistinguishable from a legitimate `None`. This
//! serializer sees the `f64` itself, so `non_finite(&report)` lists every
//! NaN or infinity anywhere in a report, by field path.

use serde::ser::{self, Serialize};
use std::fmt;

#[derive(Debug)]
pub struct Never(String);
impl fmt::Display for Never {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}
impl std::error::Error for Never {}
impl ser::Error for Never {
    fn custom<T: fmt::Display>(msg: T) -> Self {
        Never(msg.to_string())
    }
}

#[derive(Default)]
pub struct Checker {
    path: Vec<String>,
    index: Vec<usize>,
    pub bad: Vec<String>,
    /// Number of floats seen (so a test can tell it walked something).
    pub floats: usize,
}

impl Checker {
    fn float(&mut self, v: f64) {
        self.floats += 1;
        if !v.is_finite() {
            self.bad.push(format!("{} = {v}", self.path.join(".")));
        }
    }
}

/// Paths of the non-finite floats in `v`, and the number of floats seen.
pub fn non_finite<T: Serialize>(v: &T) -> (Vec<String>, usize) {
    let mut c = Checker::default();
    v.serialize(&mut c).expect("checker never fails");
    (c.bad, c.floats)
}

type R = Result<(), Never>;

impl<'a> ser::Serializer for &'a mut Checker {
    type Ok = ();
    type Error = Never;
    type SerializeSeq = Self;
    type SerializeTuple = Self;
    type SerializeTupleStruct = Self;
    type SerializeTupleVariant = Self;
    type SerializeMap = Self;
    type SerializeStruct = Self;
    type SerializeStructVariant = Self;

    fn serialize_bool(self, _: bool) -> R {
        Ok(())
    }
    fn serialize_i8(self, _: i8) -> R {
        Ok(())
    }
    fn serialize_i16(self, _: i16) -> R {
        Ok(())
    }
    fn serialize_i32(self, _: i32) -> R {
        Ok(())
    }
    fn serialize_i64(self, _: i64) -> R {
        Ok(())
    }
    fn serialize_u8(self, _: u8) -> R {
        Ok(())
    }
    fn serialize_u16(self, _: u16) -> R {
        Ok(())
    }
    fn serialize_u32(self, _: u32) -> R {
        Ok(())
    }
    fn serialize_u64(self, _: u64) -> R {
        Ok(())
    }
    fn serialize_f32(self, v: f32) -> R {
        self.float(v as f64);
        Ok(())
    }
    fn serialize_f64(self, v: f64) -> R {
        self.float(v);
        Ok(())
    }
    fn serialize_char(self, _: char) -> R {
        Ok(())
    }
    fn serialize_str(self, _: &str) -> R {
        Ok(())
    }
    fn serialize_bytes(self, _: &[u8]) -> R {
        Ok(())
    }
    fn serialize_none(self) -> R {
        Ok(())
    }
    fn serialize_some<T: ?Sized + Serialize>(self, v: &T) -> R {
        v.serialize(self)
    }
    fn serialize_unit(self) -> R {
        Ok(())
    }
    fn serialize_unit_struct(self, _: &'static str) -> R {
        Ok(())
    }
    fn serialize_unit_variant(self, _: &'static str, _: u32, _: &'static str) -> R {
        Ok(())
    }
    fn serialize_newtype_struct<T: ?Sized + Serialize>(self, _: &'static str, v: &T) -> R {
        v.serialize(self)
    }
    fn serialize_newtype_variant<T: ?Sized + Serialize>(
        self,
        _: &'static str,
        _: u32,
        var: &'static str,
        v: &T,
    ) -> R {
        self.path.push(var.to_string());
        let r = v.serialize(&mut *self);
        self.path.pop();
        r
    }
    fn serialize_seq(self, _: Option<usize>) -> Result<Self, Never> {
        self.index.push(0);
        Ok(self)
    }
    fn serialize_tuple(self, _: usize) -> Result<Self, Never> {
        self.index.push(0);
        Ok(self)
    }
    fn serialize_tuple_struct(self, _: &'static str, _: usize) -> Result<Self, Never> {
        self.index.push(0);
        Ok(self)
    }
    fn serialize_tuple_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Self, Never> {
        self.index.push(0);
        Ok(self)
    }
    fn serialize_map(self, _: Option<usize>) -> Result<Self, Never> {
        Ok(self)
    }
    fn serialize_struct(self, _: &'static str, _: usize) -> Result<Self, Never> {
        Ok(self)
    }
    fn serialize_struct_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Self, Never> {
        Ok(self)
    }
}

fn element<T: ?Sized + Serialize>(c: &mut Checker, v: &T) -> R {
    let i = c.index.last().copied().unwrap_or(0);
    c.path.push(format!("[{i}]"));
    let r = v.serialize(&mut *c);
    c.path.pop();
    if let Some(last) = c.index.last_mut() {
        *last += 1;
    }
    r
}

fn field<T: ?Sized + Serialize>(c: &mut Checker, key: &'static str, v: &T) -> R {
    c.path.push(key.to_string());
    let r = v.serialize(&mut *c);
    c.path.pop();
    r
}

macro_rules! seq_like {
    ($($t:ident :: $m:ident),*) => {$(
        impl<'a> ser::$t for &'a mut Checker {
            type Ok = ();
            type Error = Never;
            fn $m<T: ?Sized + Serialize>(&mut self, v: &T) -> R {
                element(self, v)
            }
            fn end(self) -> R {
                self.index.pop();
                Ok(())
            }
        }
    )*};
}
seq_like!(
    SerializeSeq::serialize_element,
    SerializeTuple::serialize_element,
    SerializeTupleStruct::serialize_field,
    SerializeTupleVariant::serialize_field
);

macro_rules! struct_like {
    ($($t:ident),*) => {$(
        impl<'a> ser::$t for &'a mut Checker {
            type Ok = ();
            type Error = Never;
            fn serialize_field<T: ?Sized + Serialize>(&mut self, key: &'static str, v: &T) -> R {
                field(self, key, v)
            }
            fn end(self) -> R {
                Ok(())
            }
        }
    )*};
}
struct_like!(SerializeStruct, SerializeStructVariant);

impl<'a> ser::SerializeMap for &'a mut Checker {
    type Ok = ();
    type Error = Never;
    fn serialize_key<T: ?Sized + Serialize>(&mut self, k: &T) -> R {
        k.serialize(&mut **self)
    }
    fn serialize_value<T: ?Sized + Serialize>(&mut self, v: &T) -> R {
        self.path.push("{value}".into());
        let r = v.serialize(&mut **self);
        self.path.pop();
        r
    }
    fn end(self) -> R {
        Ok(())
    }
}

#[test]
fn checker_finds_nan_and_inf_but_not_none() {
    #[derive(serde::Serialize)]
    struct S {
        a: f64,
        b: Option<f64>,
        c: Vec<f64>,
        d: Option<Inner>,
    }
    #[derive(serde::Serialize)]
    struct Inner {
        x: f64,
    }
    let s = S {
        a: 1.0,
        b: None,
        c: vec![0.0, f64::NAN],
        d: Some(Inner {
            x: f64::NEG_INFINITY,
        }),
    };
    let (bad, n) = non_finite(&s);
    assert_eq!(n, 4);
    assert_eq!(
        bad,
        vec!["c.[1] = NaN".to_string(), "d.x = -inf".to_string()]
    );
}
