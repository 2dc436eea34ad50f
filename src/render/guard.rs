//! The guard at the renderers: no non-finite number may reach an output.
//! [`non_finite_fields`] walks any serialisable report and names every
//! floating-point field that is NaN or infinite (by its path, e.g.
//! `values[3].dissipation_w`); the callers turn those into a failing
//! diagnostic — a defect to report, not a number to print.

use serde::ser::{self, Serialize};

/// The paths of every non-finite float in `value`.
pub fn non_finite_fields<T: Serialize>(value: &T) -> Vec<String> {
    let mut w = Walker {
        path: Vec::new(),
        found: Vec::new(),
    };
    let _ = value.serialize(&mut w);
    w.found
}

struct Walker {
    path: Vec<String>,
    found: Vec<String>,
}

impl Walker {
    fn here(&self) -> String {
        let mut s = String::new();
        for p in &self.path {
            if p.starts_with('[') || s.is_empty() {
                s.push_str(p);
            } else {
                s.push('.');
                s.push_str(p);
            }
        }
        s
    }
    fn float(&mut self, x: f64) {
        if !x.is_finite() {
            let h = self.here();
            self.found.push(h);
        }
    }
}

/// Never raised: the walk cannot fail.
#[derive(Debug)]
struct Never;

impl std::fmt::Display for Never {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("unreachable")
    }
}

impl std::error::Error for Never {}

impl ser::Error for Never {
    fn custom<T: std::fmt::Display>(_: T) -> Self {
        Never
    }
}

type R = Result<(), Never>;

impl<'a> ser::Serializer for &'a mut Walker {
    type Ok = ();
    type Error = Never;
    type SerializeSeq = Seq<'a>;
    type SerializeTuple = Seq<'a>;
    type SerializeTupleStruct = Seq<'a>;
    type SerializeTupleVariant = Seq<'a>;
    type SerializeMap = Seq<'a>;
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
        self.float(f64::from(v));
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
        _: &'static str,
        v: &T,
    ) -> R {
        v.serialize(self)
    }
    fn serialize_seq(self, _: Option<usize>) -> Result<Seq<'a>, Never> {
        Ok(Seq { w: self, i: 0 })
    }
    fn serialize_tuple(self, _: usize) -> Result<Seq<'a>, Never> {
        Ok(Seq { w: self, i: 0 })
    }
    fn serialize_tuple_struct(self, _: &'static str, _: usize) -> Result<Seq<'a>, Never> {
        Ok(Seq { w: self, i: 0 })
    }
    fn serialize_tuple_variant(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: usize,
    ) -> Result<Seq<'a>, Never> {
        Ok(Seq { w: self, i: 0 })
    }
    fn serialize_map(self, _: Option<usize>) -> Result<Seq<'a>, Never> {
        Ok(Seq { w: self, i: 0 })
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

/// A sequence (or map) being walked: elements are named by index.
struct Seq<'a> {
    w: &'a mut Walker,
    i: usize,
}

impl Seq<'_> {
    fn element<T: ?Sized + Serialize>(&mut self, v: &T) -> R {
        self.w.path.push(format!("[{}]", self.i));
        self.i += 1;
        let r = v.serialize(&mut *self.w);
        self.w.path.pop();
        r
    }
}

impl ser::SerializeSeq for Seq<'_> {
    type Ok = ();
    type Error = Never;
    fn serialize_element<T: ?Sized + Serialize>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeTuple for Seq<'_> {
    type Ok = ();
    type Error = Never;
    fn serialize_element<T: ?Sized + Serialize>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeTupleStruct for Seq<'_> {
    type Ok = ();
    type Error = Never;
    fn serialize_field<T: ?Sized + Serialize>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeTupleVariant for Seq<'_> {
    type Ok = ();
    type Error = Never;
    fn serialize_field<T: ?Sized + Serialize>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeMap for Seq<'_> {
    type Ok = ();
    type Error = Never;
    fn serialize_key<T: ?Sized + Serialize>(&mut self, _: &T) -> R {
        Ok(())
    }
    fn serialize_value<T: ?Sized + Serialize>(&mut self, v: &T) -> R {
        self.element(v)
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeStruct for &mut Walker {
    type Ok = ();
    type Error = Never;
    fn serialize_field<T: ?Sized + Serialize>(&mut self, key: &'static str, v: &T) -> R {
        self.path.push(key.to_string());
        let r = v.serialize(&mut **self);
        self.path.pop();
        r
    }
    fn end(self) -> R {
        Ok(())
    }
}

impl ser::SerializeStructVariant for &mut Walker {
    type Ok = ();
    type Error = Never;
    fn serialize_field<T: ?Sized + Serialize>(&mut self, key: &'static str, v: &T) -> R {
        ser::SerializeStruct::serialize_field(self, key, v)
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
        ok: f64,
        bad: Option<f64>,
    }

    #[derive(serde::Serialize)]
    struct Outer {
        name: String,
        rows: Vec<Inner>,
        pair: [f64; 2],
    }

    #[test]
    fn names_every_non_finite_field() {
        let o = Outer {
            name: "x".into(),
            rows: vec![
                Inner { ok: 1.0, bad: None },
                Inner {
                    ok: f64::NAN,
                    bad: Some(f64::INFINITY),
                },
            ],
            pair: [0.0, f64::NEG_INFINITY],
        };
        assert_eq!(
            non_finite_fields(&o),
            vec!["rows[1].ok", "rows[1].bad", "pair[1]"]
        );
        let clean = Inner { ok: 2.0, bad: None };
        assert!(non_finite_fields(&clean).is_empty());
    }
}
