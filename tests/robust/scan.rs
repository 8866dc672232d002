//! Every floating-point number anywhere in a serialisable value, with its
//! path, so a test can say "no NaN or infinity reaches a user" of a whole
//! report, not only of the fields someone remembered to check.
//!
//! `serde_json` writes a non-finite `f64` as `null`, which a reader cannot
//! tell from a missing value; this walks the value through a serde
//! `Serializer` of its own that only records the non-finite floats it meets
//! and the field path leading to each.

use serde::ser::{self, Serialize};
use std::fmt;

/// Paths (`figures.3.value`, `history.17.speed`) of every non-finite `f32`
/// or `f64` in `value`. Empty when all numbers are finite.
pub fn non_finite_paths<T: Serialize + ?Sized>(value: &T) -> Vec<String> {
    let mut scan = Scan {
        path: Vec::new(),
        found: Vec::new(),
    };
    // The scanner itself never fails; a custom `Serialize` that fails is
    // reported as a finding so it cannot hide numbers.
    if let Err(e) = value.serialize(&mut scan) {
        scan.found.push(format!("(serialisation failed: {e})"));
    }
    scan.found
}

struct Scan {
    path: Vec<String>,
    found: Vec<String>,
}

impl Scan {
    fn float(&mut self, v: f64) {
        if !v.is_finite() {
            self.found.push(format!("{} = {v}", self.path.join(".")));
        }
    }
}

/// The scanner's error type (never produced by the scanner itself).
#[derive(Debug)]
pub struct ScanError(String);

impl fmt::Display for ScanError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}

impl std::error::Error for ScanError {}

impl ser::Error for ScanError {
    fn custom<T: fmt::Display>(msg: T) -> Self {
        ScanError(msg.to_string())
    }
}

type R = Result<(), ScanError>;

/// A sequence, tuple or map being walked: counts its elements for the path.
pub struct Compound<'a> {
    scan: &'a mut Scan,
    index: usize,
    key: Option<String>,
}

impl Compound<'_> {
    fn element<T: Serialize + ?Sized>(&mut self, value: &T) -> R {
        self.scan.path.push(self.index.to_string());
        self.index += 1;
        let r = value.serialize(&mut *self.scan);
        self.scan.path.pop();
        r
    }

    fn field<T: Serialize + ?Sized>(&mut self, name: &str, value: &T) -> R {
        self.scan.path.push(name.to_string());
        let r = value.serialize(&mut *self.scan);
        self.scan.path.pop();
        r
    }
}

/// Map keys are read as text for the path; they are never floats here.
struct KeyText;

macro_rules! key_as_text {
    ($($m:ident: $t:ty),*) => {
        $(fn $m(self, v: $t) -> Result<Self::Ok, Self::Error> {
            Ok(Some(v.to_string()))
        })*
    };
}

impl ser::Serializer for &mut KeyText {
    type Ok = Option<String>;
    type Error = ScanError;
    type SerializeSeq = ser::Impossible<Option<String>, ScanError>;
    type SerializeTuple = ser::Impossible<Option<String>, ScanError>;
    type SerializeTupleStruct = ser::Impossible<Option<String>, ScanError>;
    type SerializeTupleVariant = ser::Impossible<Option<String>, ScanError>;
    type SerializeMap = ser::Impossible<Option<String>, ScanError>;
    type SerializeStruct = ser::Impossible<Option<String>, ScanError>;
    type SerializeStructVariant = ser::Impossible<Option<String>, ScanError>;
    key_as_text!(serialize_bool: bool, serialize_i8: i8, serialize_i16: i16, serialize_i32: i32,
        serialize_i64: i64, serialize_u8: u8, serialize_u16: u16, serialize_u32: u32,
        serialize_u64: u64, serialize_f32: f32, serialize_f64: f64, serialize_char: char,
        serialize_str: &str);
    fn serialize_bytes(self, _: &[u8]) -> Result<Self::Ok, Self::Error> {
        Ok(None)
    }
    fn serialize_none(self) -> Result<Self::Ok, Self::Error> {
        Ok(None)
    }
    fn serialize_some<T: Serialize + ?Sized>(self, v: &T) -> Result<Self::Ok, Self::Error> {
        v.serialize(self)
    }
    fn serialize_unit(self) -> Result<Self::Ok, Self::Error> {
        Ok(None)
    }
    fn serialize_unit_struct(self, _: &'static str) -> Result<Self::Ok, Self::Error> {
        Ok(None)
    }
    fn serialize_unit_variant(
        self,
        _: &'static str,
        _: u32,
        variant: &'static str,
    ) -> Result<Self::Ok, Self::Error> {
        Ok(Some(variant.to_string()))
    }
    fn serialize_newtype_struct<T: Serialize + ?Sized>(
        self,
        _: &'static str,
        v: &T,
    ) -> Result<Self::Ok, Self::Error> {
        v.serialize(self)
    }
    fn serialize_newtype_variant<T: Serialize + ?Sized>(
        self,
        _: &'static str,
        _: u32,
        variant: &'static str,
        _: &T,
    ) -> Result<Self::Ok, Self::Error> {
        Ok(Some(variant.to_string()))
    }
    fn serialize_seq(self, _: Option<usize>) -> Result<Self::SerializeSeq, Self::Error> {
        Err(ser::Error::custom("composite map key"))
    }
    fn serialize_tuple(self, _: usize) -> Result<Self::SerializeTuple, Self::Error> {
        Err(ser::Error::custom("composite map key"))
    }
    fn serialize_tuple_struct(
        self,
        _: &'static str,
        _: usize,
    ) -> Result<Self::SerializeTupleStruct, Self::Error> {
        Err(ser::Error::custom("composite map key"))
    }
    fn serialize_tuple_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Self::SerializeTupleVariant, Self::Error> {
        Err(ser::Error::custom("composite map key"))
    }
    fn serialize_map(self, _: Option<usize>) -> Result<Self::SerializeMap, Self::Error> {
        Err(ser::Error::custom("composite map key"))
    }
    fn serialize_struct(
        self,
        _: &'static str,
        _: usize,
    ) -> Result<Self::SerializeStruct, Self::Error> {
        Err(ser::Error::custom("composite map key"))
    }
    fn serialize_struct_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Self::SerializeStructVariant, Self::Error> {
        Err(ser::Error::custom("composite map key"))
    }
}

impl<'a> ser::Serializer for &'a mut Scan {
    type Ok = ();
    type Error = ScanError;
    type SerializeSeq = Compound<'a>;
    type SerializeTuple = Compound<'a>;
    type SerializeTupleStruct = Compound<'a>;
    type SerializeTupleVariant = Compound<'a>;
    type SerializeMap = Compound<'a>;
    type SerializeStruct = Compound<'a>;
    type SerializeStructVariant = Compound<'a>;

    fn serialize_f32(self, v: f32) -> R {
        self.float(f64::from(v));
        Ok(())
    }
    fn serialize_f64(self, v: f64) -> R {
        self.float(v);
        Ok(())
    }
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
    fn serialize_some<T: Serialize + ?Sized>(self, v: &T) -> R {
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
    fn serialize_newtype_struct<T: Serialize + ?Sized>(self, _: &'static str, v: &T) -> R {
        v.serialize(self)
    }
    fn serialize_newtype_variant<T: Serialize + ?Sized>(
        self,
        _: &'static str,
        _: u32,
        variant: &'static str,
        v: &T,
    ) -> R {
        self.path.push(variant.to_string());
        let r = v.serialize(&mut *self);
        self.path.pop();
        r
    }
    fn serialize_seq(self, _: Option<usize>) -> Result<Compound<'a>, ScanError> {
        Ok(Compound {
            scan: self,
            index: 0,
            key: None,
        })
    }
    fn serialize_tuple(self, _: usize) -> Result<Compound<'a>, ScanError> {
        self.serialize_seq(None)
    }
    fn serialize_tuple_struct(self, _: &'static str, _: usize) -> Result<Compound<'a>, ScanError> {
        self.serialize_seq(None)
    }
    fn serialize_tuple_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Compound<'a>, ScanError> {
        self.serialize_seq(None)
    }
    fn serialize_map(self, _: Option<usize>) -> Result<Compound<'a>, ScanError> {
        self.serialize_seq(None)
    }
    fn serialize_struct(self, _: &'static str, _: usize) -> Result<Compound<'a>, ScanError> {
        self.serialize_seq(None)
    }
    fn serialize_struct_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Compound<'a>, ScanError> {
        self.serialize_seq(None)
    }
}

impl ser::SerializeSeq for Compound<'_> {
    type Ok = ();
    type Error = ScanError;
    fn serialize_element<T: Serialize + ?Sized>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeTuple for Compound<'_> {
    type Ok = ();
    type Error = ScanError;
    fn serialize_element<T: Serialize + ?Sized>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeTupleStruct for Compound<'_> {
    type Ok = ();
    type Error = ScanError;
    fn serialize_field<T: Serialize + ?Sized>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeTupleVariant for Compound<'_> {
    type Ok = ();
    type Error = ScanError;
    fn serialize_field<T: Serialize + ?Sized>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeMap for Compound<'_> {
    type Ok = ();
    type Error = ScanError;
    fn serialize_key<T: Serialize + ?Sized>(&mut self, k: &T) -> R {
        // A key that is not text-like still gets a position in the path.
        self.key = k.serialize(&mut KeyText).ok().flatten();
        Ok(())
    }
    fn serialize_value<T: Serialize + ?Sized>(&mut self, v: &T) -> R {
        match self.key.take() {
            Some(k) => self.field(&k, v),
            None => self.element(v),
        }
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeStruct for Compound<'_> {
    type Ok = ();
    type Error = ScanError;
    fn serialize_field<T: Serialize + ?Sized>(&mut self, name: &'static str, v: &T) -> R {
        self.field(name, v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeStructVariant for Compound<'_> {
    type Ok = ();
    type Error = ScanError;
    fn serialize_field<T: Serialize + ?Sized>(&mut self, name: &'static str, v: &T) -> R {
        self.field(name, v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[derive(serde::Serialize)]
    struct Inner {
        a: f64,
        b: Option<f64>,
    }

    #[derive(serde::Serialize)]
    struct Outer {
        items: Vec<Inner>,
        pair: (f64, f32),
        map: std::collections::BTreeMap<String, f64>,
    }

    #[test]
    fn finds_each_non_finite_number_with_its_path() {
        let v = Outer {
            items: vec![
                Inner { a: 1.0, b: None },
                Inner {
                    a: f64::NAN,
                    b: Some(f64::INFINITY),
                },
            ],
            pair: (2.0, f32::NEG_INFINITY),
            map: [("x".to_string(), f64::NAN), ("y".to_string(), 0.0)]
                .into_iter()
                .collect(),
        };
        let found = non_finite_paths(&v);
        assert_eq!(
            found,
            vec![
                "items.1.a = NaN",
                "items.1.b = inf",
                "pair.1 = -inf",
                "map.x = NaN"
            ]
        );
        assert!(non_finite_paths(&Inner {
            a: 0.5,
            b: Some(-3.0)
        })
        .is_empty());
    }
}
