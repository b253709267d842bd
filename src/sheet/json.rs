//! JSON in: the one parser for sheet files, links and storage, on both
//! targets.
//!
//! The text is parsed once into a tree ([`Node`]) by one small,
//! non-generic parser (RFC 8259: no comments, no trailing commas, no NaN),
//! and each record is read from the tree by hand (`sheet::records`).
//! serde_json's reader is generic over each type it reads, so the page's
//! module held a copy of its parser per list and struct type (about 36 KB
//! of code), and serde's derived readers a copy of every field's checks
//! (51 KB). A reading error says where in the file it is: a line and
//! column for text that is not JSON, a path (`line 4, fluid`) for JSON of
//! the wrong shape.

use std::fmt;

use serde::de;

/// Lists and objects nested this deep are refused (serde_json's own limit:
/// 127 deep is read), so a hostile file cannot exhaust the stack.
const MAX_DEPTH: usize = 128;

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

    /// The same error, for a value under `key` of an object.
    #[inline(never)]
    #[cold]
    pub fn under_key(self, key: &str) -> Error {
        self.within(Step::Key(key.to_owned()))
    }

    /// The same error, for the item at `index` (from 0) of a list.
    #[inline(never)]
    #[cold]
    pub fn under_index(self, index: usize) -> Error {
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
        match crate::sheet::number::float(text) {
            Some(x) if x.is_finite() => Ok(Node::Float(x)),
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
