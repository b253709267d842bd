//! serde's derived readers driven over the sheet's parsed tree: the
//! reference the hand-written record readers (`sheet::records`) are held
//! to. With this, a record's derived `Deserialize` (serde's own code)
//! reads the very tree the page reads, so the two can be asked for the
//! same value or the same refusal, word for word. (The page read this way
//! until the records were read by hand; it lives here now, for the tests.)
#![allow(dead_code)]

use headroom::sheet::json::{self, Error, Node};
use serde::de::{self, DeserializeOwned, DeserializeSeed, IntoDeserializer, Visitor};

/// Reads a `T` from JSON text through serde's derived reader.
pub fn from_str<T: DeserializeOwned>(text: &str) -> Result<T, Error> {
    T::deserialize(Reader(&json::parse(text)?))
}

/// serde's reader over a parsed tree.
#[derive(Clone, Copy)]
pub struct Reader<'a>(pub &'a Node);

impl<'de> de::Deserializer<'de> for Reader<'_> {
    type Error = Error;

    fn deserialize_any<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Node::Null => visitor.visit_unit(),
            Node::Bool(b) => visitor.visit_bool(*b),
            Node::Unsigned(n) => visitor.visit_u64(*n),
            Node::Signed(n) => visitor.visit_i64(*n),
            Node::Float(x) => visitor.visit_f64(*x),
            Node::Text(s) => visitor.visit_str(s),
            Node::List(_) => self.deserialize_seq(visitor),
            Node::Object(_) => self.deserialize_map(visitor),
        }
    }

    fn deserialize_option<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Node::Null => visitor.visit_none(),
            _ => visitor.visit_some(self),
        }
    }

    fn deserialize_newtype_struct<V: Visitor<'de>>(self, _name: &'static str, visitor: V) -> Result<V::Value, Error> {
        visitor.visit_newtype_struct(self)
    }

    fn deserialize_enum<V: Visitor<'de>>(
        self,
        _name: &'static str,
        _variants: &'static [&'static str],
        visitor: V,
    ) -> Result<V::Value, Error> {
        match self.0 {
            Node::Text(s) => visitor.visit_enum(s.as_str().into_deserializer()),
            Node::Object(members) if members.len() == 1 => {
                let (key, value) = &members[0];
                visitor.visit_enum(Variant { key, value }).map_err(|e| e.under_key(key))
            }
            _ => Err(self.refused(&"a string or an object with one key")),
        }
    }

    fn deserialize_ignored_any<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        visitor.visit_unit()
    }

    // Each kind of value asked for is read by its own short path, so a
    // type's reader holds only the visits it can take (a visitor's other
    // visits are its refusals, one copy each per type).
    fn deserialize_bool<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Node::Bool(b) => visitor.visit_bool(*b),
            _ => Err(self.refused(&visitor)),
        }
    }

    fn deserialize_str<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Node::Text(s) => visitor.visit_str(s),
            _ => Err(self.refused(&visitor)),
        }
    }

    fn deserialize_seq<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Node::List(items) => {
                let mut seq = Items { items: items.iter(), index: 0 };
                let value = visitor.visit_seq(&mut seq)?;
                match seq.items.len() {
                    0 => Ok(value),
                    _ => Err(de::Error::invalid_length(items.len(), &"fewer elements in the list")),
                }
            }
            _ => Err(self.refused(&visitor)),
        }
    }

    fn deserialize_map<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Node::Object(members) => visitor.visit_map(Members { members: members.iter(), value: None }),
            _ => Err(self.refused(&visitor)),
        }
    }

    fn deserialize_struct<V: Visitor<'de>>(
        self,
        _name: &'static str,
        _fields: &'static [&'static str],
        visitor: V,
    ) -> Result<V::Value, Error> {
        self.deserialize_map(visitor)
    }

    fn deserialize_string<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_str(visitor)
    }

    fn deserialize_identifier<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_str(visitor)
    }

    fn deserialize_tuple<V: Visitor<'de>>(self, _len: usize, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_seq(visitor)
    }

    fn deserialize_unit<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Node::Null => visitor.visit_unit(),
            _ => Err(self.refused(&visitor)),
        }
    }

    serde::forward_to_deserialize_any! {
        i8 i16 i32 i64 i128 u8 u16 u32 u64 u128 f32 f64 char
        bytes byte_buf unit_struct tuple_struct
    }
}

impl Reader<'_> {
    fn refused(&self, expected: &dyn de::Expected) -> Error {
        de::Error::invalid_type(self.unexpected(), expected)
    }

    fn unexpected(&self) -> de::Unexpected<'_> {
        match self.0 {
            Node::Null => de::Unexpected::Unit,
            Node::Bool(b) => de::Unexpected::Bool(*b),
            Node::Unsigned(n) => de::Unexpected::Unsigned(*n),
            Node::Signed(n) => de::Unexpected::Signed(*n),
            Node::Float(x) => de::Unexpected::Float(*x),
            Node::Text(s) => de::Unexpected::Str(s),
            Node::List(_) => de::Unexpected::Seq,
            Node::Object(_) => de::Unexpected::Map,
        }
    }
}

struct Items<'a> {
    items: std::slice::Iter<'a, Node>,
    index: usize,
}

impl<'de> de::SeqAccess<'de> for Items<'_> {
    type Error = Error;

    fn next_element_seed<T: DeserializeSeed<'de>>(&mut self, seed: T) -> Result<Option<T::Value>, Error> {
        let Some(item) = self.items.next() else { return Ok(None) };
        let index = self.index;
        self.index += 1;
        seed.deserialize(Reader(item)).map(Some).map_err(|e| e.under_index(index))
    }

    fn size_hint(&self) -> Option<usize> {
        Some(self.items.len())
    }
}

struct Members<'a> {
    members: std::slice::Iter<'a, (String, Node)>,
    value: Option<(&'a str, &'a Node)>,
}

impl<'de> de::MapAccess<'de> for Members<'_> {
    type Error = Error;

    fn next_key_seed<K: DeserializeSeed<'de>>(&mut self, seed: K) -> Result<Option<K::Value>, Error> {
        let Some((key, value)) = self.members.next() else { return Ok(None) };
        self.value = Some((key, value));
        seed.deserialize(key.as_str().into_deserializer()).map(Some)
    }

    fn next_value_seed<V: DeserializeSeed<'de>>(&mut self, seed: V) -> Result<V::Value, Error> {
        match self.value.take() {
            Some((key, value)) => seed.deserialize(Reader(value)).map_err(|e| e.under_key(key)),
            None => Err(de::Error::custom("a value asked for before its key")),
        }
    }

    fn size_hint(&self) -> Option<usize> {
        Some(self.members.len())
    }
}

/// An enum written as an object of one key: the variant and its content.
struct Variant<'a> {
    key: &'a str,
    value: &'a Node,
}

impl<'de, 'a> de::EnumAccess<'de> for Variant<'a> {
    type Error = Error;
    type Variant = Reader<'a>;

    fn variant_seed<V: DeserializeSeed<'de>>(self, seed: V) -> Result<(V::Value, Reader<'a>), Error> {
        let variant = seed.deserialize(self.key.into_deserializer())?;
        Ok((variant, Reader(self.value)))
    }
}

impl<'de> de::VariantAccess<'de> for Reader<'_> {
    type Error = Error;

    fn unit_variant(self) -> Result<(), Error> {
        match self.0 {
            Node::Null => Ok(()),
            _ => Err(de::Error::invalid_type(self.unexpected(), &"unit variant")),
        }
    }

    fn newtype_variant_seed<T: DeserializeSeed<'de>>(self, seed: T) -> Result<T::Value, Error> {
        seed.deserialize(self)
    }

    // As a list and an object are read elsewhere: by their own paths.
    fn tuple_variant<V: Visitor<'de>>(self, _len: usize, visitor: V) -> Result<V::Value, Error> {
        de::Deserializer::deserialize_seq(self, visitor)
    }

    fn struct_variant<V: Visitor<'de>>(self, _fields: &'static [&'static str], visitor: V) -> Result<V::Value, Error> {
        de::Deserializer::deserialize_map(self, visitor)
    }
}
