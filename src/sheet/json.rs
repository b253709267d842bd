//! JSON in: the one reader for sheet files, links and storage, on both
//! targets.
//!
//! The text is parsed once into a tree by one small, non-generic parser
//! (RFC 8259: no comments, no trailing commas, no NaN), and serde reads the
//! tree through [`Reader`], by the kind of value each type asks for (a
//! string, a list, an object; any value where a type takes any).
//! serde_json's reader is generic over each type
//! it reads, so the page's module held a copy of its parser per list and
//! struct type (about 36 KB of code); this keeps one copy of the parser and
//! a small dispatch per type. Every key of an object reaches the visitor,
//! so `deny_unknown_fields` and "duplicate field" work as with serde_json.
//! A reading error says where in the file it is: a line and column for
//! text that is not JSON, a path (`line 4, fluid`) for JSON of the wrong
//! shape.

use std::fmt;

use serde::de::{self, DeserializeOwned, DeserializeSeed, IntoDeserializer, Visitor};

/// Lists and objects nested this deep are refused (serde_json's own limit:
/// 127 deep is read), so a hostile file cannot exhaust the stack.
const MAX_DEPTH: usize = 128;

/// Reads a value from JSON text.
///
/// # Errors
/// [`Error`] when the text is not JSON or not the shape of `T`; never
/// panics, whatever the text.
pub fn from_str<T: DeserializeOwned>(text: &str) -> Result<T, Error> {
    from_tree(&parse(text)?)
}

/// Reads a value from an already parsed tree (a text read once for two
/// looks).
///
/// # Errors
/// [`Error`] when the tree is not the shape of `T`.
pub fn from_tree<T: DeserializeOwned>(tree: &Node) -> Result<T, Error> {
    T::deserialize(Reader(tree))
}

/// A JSON value, as parsed. Object members keep their order and any
/// repeated key, so the reader can refuse a repeated field.
#[derive(Debug, Clone, PartialEq)]
pub enum Node {
    /// `null`
    Null,
    /// `true`, `false`
    Bool(bool),
    /// A whole number that fits in 64 bits, not negative.
    Unsigned(u64),
    /// A negative whole number that fits in 64 bits.
    Signed(i64),
    /// Any other number (a fraction or exponent, or past 64 bits).
    Float(f64),
    /// A string, escapes resolved.
    Text(String),
    /// An array.
    List(Vec<Node>),
    /// An object's members in order.
    Object(Vec<(String, Node)>),
}

/// Why a text could not be read, and where.
#[derive(Debug, Clone, PartialEq)]
pub struct Error {
    message: String,
    /// Line and column (from 1) of text that is not JSON.
    at: Option<(usize, usize)>,
    /// The path to the value that is of the wrong shape, innermost last.
    path: Vec<Step>,
}

#[derive(Debug, Clone, PartialEq)]
enum Step {
    Key(String),
    Index(usize),
}

impl Error {
    fn within(mut self, step: Step) -> Error {
        self.path.insert(0, step);
        self
    }

    // One copy of each, called from every field and item a type reads
    // (inlined, each was a copy per field).
    #[inline(never)]
    #[cold]
    fn under_key(self, key: &str) -> Error {
        self.within(Step::Key(key.to_owned()))
    }

    #[inline(never)]
    #[cold]
    fn under_index(self, index: usize) -> Error {
        self.within(Step::Index(index))
    }
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)?;
        if let Some((line, column)) = self.at {
            write!(f, " at line {line} column {column}")?;
        }
        // The path as a person reads it, items counted from 1 as the page
        // numbers its lines: "(at line 6, fluid)", "(at line 2, fittings
        // item 3, count)".
        let mut steps = self.path.iter().peekable();
        let mut first = true;
        while let Some(step) = steps.next() {
            f.write_str(if first { " (at " } else { ", " })?;
            first = false;
            match (step, steps.peek()) {
                (Step::Key(k), Some(Step::Index(n))) => {
                    match k.as_str() {
                        "lines" => write!(f, "line {}", n + 1)?,
                        _ => write!(f, "{k} item {}", n + 1)?,
                    }
                    steps.next();
                }
                (Step::Key(k), _) => f.write_str(k)?,
                (Step::Index(n), _) => write!(f, "item {}", n + 1)?,
            }
        }
        if !first {
            f.write_str(")")?;
        }
        Ok(())
    }
}

impl std::error::Error for Error {}

impl de::Error for Error {
    fn custom<T: fmt::Display>(message: T) -> Error {
        Error { message: message.to_string(), at: None, path: Vec::new() }
    }
}

/// Parses JSON text into a tree.
///
/// # Errors
/// [`Error`] with the line and column where the text stops being JSON.
pub fn parse(text: &str) -> Result<Node, Error> {
    let mut p = Parser { s: text.as_bytes(), i: 0 };
    let node = p.value(0)?;
    p.space();
    if p.i < p.s.len() {
        return Err(p.fail("trailing characters"));
    }
    Ok(node)
}

struct Parser<'a> {
    s: &'a [u8],
    i: usize,
}

impl Parser<'_> {
    fn fail(&self, message: &str) -> Error {
        // Line and column of the byte where reading stopped, counted in
        // characters as an editor counts them.
        let upto = &self.s[..self.i.min(self.s.len())];
        let line = upto.iter().filter(|&&b| b == b'\n').count() + 1;
        let start = upto.iter().rposition(|&b| b == b'\n').map_or(0, |n| n + 1);
        let column = upto[start..].iter().filter(|&&b| b & 0xC0 != 0x80).count() + 1;
        Error { message: message.to_owned(), at: Some((line, column)), path: Vec::new() }
    }

    fn peek(&self) -> Option<u8> {
        self.s.get(self.i).copied()
    }

    fn space(&mut self) {
        while let Some(b' ' | b'\t' | b'\n' | b'\r') = self.peek() {
            self.i += 1;
        }
    }

    fn word(&mut self, word: &[u8], node: Node) -> Result<Node, Error> {
        if self.s[self.i..].starts_with(word) {
            self.i += word.len();
            Ok(node)
        } else {
            Err(self.fail("expected value"))
        }
    }

    fn value(&mut self, depth: usize) -> Result<Node, Error> {
        self.space();
        if let Some(b'[' | b'{') = self.peek() {
            if depth + 1 >= MAX_DEPTH {
                return Err(self.fail("recursion limit exceeded"));
            }
        }
        match self.peek() {
            None => Err(self.fail("EOF while parsing a value")),
            Some(b'n') => self.word(b"null", Node::Null),
            Some(b't') => self.word(b"true", Node::Bool(true)),
            Some(b'f') => self.word(b"false", Node::Bool(false)),
            Some(b'"') => self.string().map(Node::Text),
            Some(b'-' | b'0'..=b'9') => self.number(),
            Some(b'[') => {
                let mut items = Vec::new();
                self.members(b']', |p| {
                    items.push(p.value(depth + 1)?);
                    Ok(())
                })?;
                Ok(Node::List(items))
            }
            Some(b'{') => {
                let mut members = Vec::new();
                self.members(b'}', |p| {
                    p.space();
                    if p.peek() != Some(b'"') {
                        return Err(p.fail("key must be a string"));
                    }
                    let key = p.string()?;
                    p.space();
                    if p.peek() != Some(b':') {
                        return Err(p.fail("expected `:`"));
                    }
                    p.i += 1;
                    members.push((key, p.value(depth + 1)?));
                    Ok(())
                })?;
                Ok(Node::Object(members))
            }
            Some(_) => Err(self.fail("expected value")),
        }
    }

    /// The members of a list or an object, from its opening bracket to
    /// `close`, each read by `member`, with commas between.
    fn members(&mut self, close: u8, mut member: impl FnMut(&mut Self) -> Result<(), Error>) -> Result<(), Error> {
        self.i += 1;
        self.space();
        if self.peek() == Some(close) {
            self.i += 1;
            return Ok(());
        }
        loop {
            member(self)?;
            self.space();
            match self.peek() {
                Some(b',') => self.i += 1,
                Some(c) if c == close => {
                    self.i += 1;
                    return Ok(());
                }
                None => return Err(self.fail("EOF while parsing a list or object")),
                Some(_) => {
                    return Err(self.fail(if close == b']' { "expected `,` or `]`" } else { "expected `,` or `}`" }))
                }
            }
        }
    }

    fn digits(&mut self) -> usize {
        let from = self.i;
        while let Some(b'0'..=b'9') = self.peek() {
            self.i += 1;
        }
        self.i - from
    }

    fn number(&mut self) -> Result<Node, Error> {
        let from = self.i;
        let negative = self.peek() == Some(b'-');
        if negative {
            self.i += 1;
        }
        let leading_zero = self.peek() == Some(b'0');
        match self.digits() {
            0 => return Err(self.fail("invalid number")),
            n if leading_zero && n > 1 => return Err(self.fail("invalid number")),
            _ => {}
        }
        let mut whole = true;
        if self.peek() == Some(b'.') {
            self.i += 1;
            whole = false;
            if self.digits() == 0 {
                return Err(self.fail("invalid number"));
            }
        }
        if let Some(b'e' | b'E') = self.peek() {
            self.i += 1;
            whole = false;
            if let Some(b'+' | b'-') = self.peek() {
                self.i += 1;
            }
            if self.digits() == 0 {
                return Err(self.fail("invalid number"));
            }
        }
        // The bytes checked above are ASCII, so this slice is text.
        let text = std::str::from_utf8(&self.s[from..self.i]).unwrap_or_default();
        if whole {
            if let Ok(n) = text.parse::<u64>() {
                return Ok(Node::Unsigned(n));
            }
            // "-0" is the float -0.0, as serde_json reads it.
            if let Ok(n) = text.parse::<i64>() {
                return Ok(if n == 0 { Node::Float(-0.0) } else { Node::Signed(n) });
            }
        }
        match text.parse::<f64>() {
            Ok(x) if x.is_finite() => Ok(Node::Float(x)),
            _ => Err(self.fail("number out of range")),
        }
    }

    fn hex4(&mut self) -> Result<u32, Error> {
        let mut n = 0;
        for _ in 0..4 {
            let d = match self.peek() {
                Some(b @ b'0'..=b'9') => b - b'0',
                Some(b @ b'a'..=b'f') => b - b'a' + 10,
                Some(b @ b'A'..=b'F') => b - b'A' + 10,
                _ => return Err(self.fail("invalid escape")),
            };
            n = n * 16 + u32::from(d);
            self.i += 1;
        }
        Ok(n)
    }

    fn string(&mut self) -> Result<String, Error> {
        self.i += 1; // the opening quote
        let mut out = String::new();
        loop {
            // Copy the run up to the next quote, backslash or control
            // character whole: it is valid UTF-8, cut at ASCII bytes.
            let from = self.i;
            while let Some(b) = self.peek() {
                if b == b'"' || b == b'\\' || b < 0x20 {
                    break;
                }
                self.i += 1;
            }
            out.push_str(std::str::from_utf8(&self.s[from..self.i]).unwrap_or_default());
            match self.peek() {
                None => return Err(self.fail("EOF while parsing a string")),
                Some(b'"') => {
                    self.i += 1;
                    return Ok(out);
                }
                Some(b'\\') => {
                    self.i += 1;
                    let escape = self.peek();
                    self.i += 1;
                    match escape {
                        Some(b'"') => out.push('"'),
                        Some(b'\\') => out.push('\\'),
                        Some(b'/') => out.push('/'),
                        Some(b'b') => out.push('\u{8}'),
                        Some(b'f') => out.push('\u{c}'),
                        Some(b'n') => out.push('\n'),
                        Some(b'r') => out.push('\r'),
                        Some(b't') => out.push('\t'),
                        Some(b'u') => out.push(self.unicode_escape()?),
                        _ => {
                            self.i -= 1;
                            return Err(self.fail("invalid escape"));
                        }
                    }
                }
                Some(_) => return Err(self.fail("control character (\\u0000-\\u001F) found while parsing a string")),
            }
        }
    }

    /// The character of a `\uXXXX` escape (the `\u` read), joining a
    /// surrogate pair; a lone surrogate is refused, as serde_json does.
    fn unicode_escape(&mut self) -> Result<char, Error> {
        let first = self.hex4()?;
        let code = match first {
            0xD800..=0xDBFF => {
                if !self.s[self.i..].starts_with(b"\\u") {
                    return Err(self.fail("lone leading surrogate in hex escape"));
                }
                self.i += 2;
                let second = self.hex4()?;
                if !(0xDC00..=0xDFFF).contains(&second) {
                    return Err(self.fail("lone leading surrogate in hex escape"));
                }
                0x10000 + ((first - 0xD800) << 10) + (second - 0xDC00)
            }
            0xDC00..=0xDFFF => return Err(self.fail("unexpected end of hex escape")),
            n => n,
        };
        char::from_u32(code).ok_or_else(|| self.fail("invalid unicode code point"))
    }
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
