//! A small JSON reader and writer for the stored history and its files.
//!
//! serde_json with derived (de)serialisers cost 28.5 KB of gzip in the wasm
//! (73 KB raw, measured), more than the shell's remaining size budget; this
//! covers exactly what the history needs: objects, arrays, strings (every
//! escape, including surrogate pairs), integers, booleans and null. Numbers
//! with a fraction or exponent are refused (the history stores none).
//! There is no value tree: readers build their own types straight from the
//! text, a field at a time. Native tests cross-check it against serde_json.

use std::borrow::Cow;

/// The text is not JSON, or not the JSON the reader expected there.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Malformed;

pub type Result<T> = std::result::Result<T, Malformed>;

/// Nesting deeper than this is refused (a file cannot exhaust the stack).
const DEPTH: usize = 32;

/// A reader over JSON text that can stop and resume at a byte position.
pub struct Reader<'a> {
    text: &'a str,
    at: usize,
}

impl<'a> Reader<'a> {
    pub fn new(text: &'a str) -> Reader<'a> {
        Reader::starting_at(text, 0)
    }

    /// A reader resuming at byte `at` (a position an earlier reader reported).
    pub fn starting_at(text: &'a str, at: usize) -> Reader<'a> {
        Reader { text, at }
    }

    /// Where the reader is, in bytes.
    pub fn position(&self) -> usize {
        self.at
    }

    /// The next byte that is not whitespace, not consumed.
    pub fn peek(&mut self) -> Option<u8> {
        while matches!(self.text.as_bytes().get(self.at), Some(b' ' | b'\n' | b'\r' | b'\t')) {
            self.at += 1;
        }
        self.text.as_bytes().get(self.at).copied()
    }

    /// Consumes `byte` if it comes next (after whitespace).
    pub fn skip(&mut self, byte: u8) -> bool {
        let next = self.peek() == Some(byte);
        self.at += usize::from(next);
        next
    }

    /// Succeeds when only whitespace is left.
    pub fn end(&mut self) -> Result<()> {
        if self.peek().is_none() {
            Ok(())
        } else {
            Err(Malformed)
        }
    }

    fn eat(&mut self, word: &str) -> bool {
        let ok = self.text.as_bytes()[self.at..].starts_with(word.as_bytes());
        if ok {
            self.at += word.len();
        }
        ok
    }

    /// Reads `[…]`, calling `item` with the reader at each element.
    pub fn array(&mut self, depth: usize, mut item: impl FnMut(&mut Self) -> Result<()>) -> Result<()> {
        self.seq(depth, b'[', b']', |r| item(r))
    }

    /// Reads `{…}`, calling `field` with each key and the reader at its value.
    pub fn object(&mut self, depth: usize, mut field: impl FnMut(&mut Self, &str) -> Result<()>) -> Result<()> {
        self.seq(depth, b'{', b'}', |r| {
            let key = r.string()?;
            if !r.skip(b':') {
                return Err(Malformed);
            }
            field(r, &key)
        })
    }

    fn seq(&mut self, depth: usize, open: u8, close: u8, mut each: impl FnMut(&mut Self) -> Result<()>) -> Result<()> {
        if depth > DEPTH || !self.skip(open) {
            return Err(Malformed);
        }
        if self.skip(close) {
            return Ok(());
        }
        loop {
            each(self)?;
            if self.skip(close) {
                return Ok(());
            }
            if !self.skip(b',') {
                return Err(Malformed);
            }
        }
    }

    /// Consumes `null` if it comes next.
    pub fn null(&mut self) -> bool {
        self.peek() == Some(b'n') && self.eat("null")
    }

    /// Whether a number comes next.
    pub fn at_number(&mut self) -> bool {
        matches!(self.peek(), Some(b'-' | b'0'..=b'9'))
    }

    /// An integer (no fraction, no exponent, no leading zero).
    pub fn int(&mut self) -> Result<i64> {
        if !self.at_number() {
            return Err(Malformed);
        }
        let bytes = self.text.as_bytes();
        let start = self.at;
        self.at += 1;
        while matches!(bytes.get(self.at), Some(b'0'..=b'9')) {
            self.at += 1;
        }
        let digits = self.text[start..self.at].trim_start_matches('-');
        if (digits.len() > 1 && digits.starts_with('0')) || matches!(bytes.get(self.at), Some(b'.' | b'e' | b'E')) {
            return Err(Malformed);
        }
        self.text[start..self.at].parse().map_err(|_| Malformed)
    }

    /// Any value, checked and discarded; `depth` is the nesting so far.
    pub fn skip_value(&mut self, depth: usize) -> Result<()> {
        match self.peek() {
            Some(b'{') => self.object(depth, |r, _| r.skip_value(depth + 1)),
            Some(b'[') => self.array(depth, |r| r.skip_value(depth + 1)),
            Some(b'"') => self.string().map(drop),
            Some(b't') if self.eat("true") => Ok(()),
            Some(b'f') if self.eat("false") => Ok(()),
            _ if self.null() => Ok(()),
            _ => self.int().map(drop),
        }
    }

    /// A string, owned.
    pub fn text(&mut self) -> Result<String> {
        self.string().map(Cow::into_owned)
    }

    fn hex4(&mut self) -> Result<u32> {
        let h = self
            .text
            .get(self.at..self.at + 4)
            .and_then(|h| u32::from_str_radix(h, 16).ok());
        self.at += 4;
        h.ok_or(Malformed)
    }

    /// A string; borrowed from the text when it has no escapes.
    pub fn string(&mut self) -> Result<Cow<'a, str>> {
        if !self.skip(b'"') {
            return Err(Malformed);
        }
        let run = self.plain_run()?;
        if self.skip_raw(b'"') {
            return Ok(Cow::Borrowed(run));
        }
        let mut out = String::with_capacity(run.len() + 16);
        out.push_str(run);
        loop {
            if self.skip_raw(b'"') {
                return Ok(Cow::Owned(out));
            }
            if !self.skip_raw(b'\\') {
                return Err(Malformed);
            }
            let e = self.text.as_bytes().get(self.at).copied();
            self.at += 1;
            let c = match e {
                Some(b'"') => '"',
                Some(b'\\') => '\\',
                Some(b'/') => '/',
                Some(b'b') => '\u{8}',
                Some(b'f') => '\u{c}',
                Some(b'n') => '\n',
                Some(b'r') => '\r',
                Some(b't') => '\t',
                Some(b'u') => {
                    let mut code = self.hex4()?;
                    if (0xD800..0xDC00).contains(&code) && self.eat("\\u") {
                        let low = self.hex4()?;
                        if !(0xDC00..0xE000).contains(&low) {
                            return Err(Malformed);
                        }
                        code = 0x10000 + ((code - 0xD800) << 10) + (low - 0xDC00);
                    }
                    char::from_u32(code).ok_or(Malformed)?
                }
                _ => return Err(Malformed),
            };
            out.push(c);
            out.push_str(self.plain_run()?);
        }
    }

    /// Consumes `byte` if it is the very next byte (inside a string).
    fn skip_raw(&mut self, byte: u8) -> bool {
        let next = self.text.as_bytes().get(self.at) == Some(&byte);
        self.at += usize::from(next);
        next
    }

    /// The text up to the next quote or backslash (control characters refused).
    fn plain_run(&mut self) -> Result<&'a str> {
        let start = self.at;
        while let Some(&b) = self.text.as_bytes().get(self.at) {
            match b {
                b'"' | b'\\' => break,
                0..=0x1f => return Err(Malformed),
                _ => self.at += 1,
            }
        }
        // The stops are ASCII, so the slice is whole characters of the &str.
        Ok(&self.text[start..self.at])
    }

    /// `[["a","b"],…]`.
    pub fn pairs(&mut self, depth: usize) -> Result<Vec<(String, String)>> {
        let mut out = Vec::new();
        self.array(depth, |r| {
            let mut pair = Vec::with_capacity(2);
            r.array(depth + 1, |r| r.text().map(|t| pair.push(t)))?;
            let [a, b] = <[String; 2]>::try_from(pair).map_err(|_| Malformed)?;
            out.push((a, b));
            Ok(())
        })?;
        Ok(out)
    }
}

/// Reads a whole text that is `[["a","b"],…]`.
pub fn read_pairs(text: &str) -> Option<Vec<(String, String)>> {
    let mut r = Reader::new(text);
    let pairs = r.pairs(0).ok()?;
    r.end().ok().map(|()| pairs)
}

/// Appends `s` as a JSON string.
pub fn quote(out: &mut String, s: &str) {
    out.push('"');
    for c in s.chars() {
        match c {
            '"' => out.push_str("\\\""),
            '\\' => out.push_str("\\\\"),
            '\n' => out.push_str("\\n"),
            '\r' => out.push_str("\\r"),
            '\t' => out.push_str("\\t"),
            c if (c as u32) < 0x20 => out.push_str(&format!("\\u{:04x}", c as u32)),
            c => out.push(c),
        }
    }
    out.push('"');
}

/// Appends `"key":` (after a comma unless it is the first field).
pub fn key(out: &mut String, k: &str) {
    if !out.ends_with('{') {
        out.push(',');
    }
    quote(out, k);
    out.push(':');
}

/// `[["a","b"],…]`.
pub fn pairs(pairs: &[(String, String)]) -> String {
    let mut out = String::from("[");
    for (i, (a, b)) in pairs.iter().enumerate() {
        if i > 0 {
            out.push(',');
        }
        out.push('[');
        quote(&mut out, a);
        out.push(',');
        quote(&mut out, b);
        out.push(']');
    }
    out.push(']');
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde_json::Value;

    /// Reads any value with the reader's own calls, as serde_json's value.
    fn value(r: &mut Reader, depth: usize) -> Result<Value> {
        Ok(match r.peek() {
            Some(b'{') => {
                let mut map = serde_json::Map::new();
                r.object(depth, |r, k| {
                    // A repeated key's last value wins, as in serde_json.
                    map.insert(k.to_string(), value(r, depth + 1)?);
                    Ok(())
                })?;
                Value::Object(map)
            }
            Some(b'[') => {
                let mut items = Vec::new();
                r.array(depth, |r| value(r, depth + 1).map(|v| items.push(v)))?;
                Value::Array(items)
            }
            Some(b'"') => Value::String(r.text()?),
            Some(b't' | b'f') => {
                let at = r.position();
                r.skip_value(depth)?;
                Value::Bool(r.text[at..r.position()].trim_start() == "true")
            }
            _ if r.null() => Value::Null,
            _ => Value::from(r.int()?),
        })
    }

    fn parse(text: &str) -> Result<Value> {
        let mut r = Reader::new(text);
        let v = value(&mut r, 0)?;
        r.end()?;
        // `skip_value` accepts exactly what `value` reads.
        let mut again = Reader::new(text);
        again
            .skip_value(0)
            .and_then(|()| again.end())
            .expect("skip_value agrees");
        Ok(v)
    }

    #[test]
    fn reads_what_serde_json_reads() {
        let texts = [
            r#"{"a":[1,-2,0,true,false,null],"b":{"c":"d"},"e":""}"#,
            r#" [ "\" \\ \/ \b \f \n \r \t \u00e9 \u00D7 \ud83d\ude00 x" ] "#,
            r#"{"schema":2,"next":9223372036854775807,"chunks":[["2024-05","lensplane.history.2.0"]]}"#,
            "\"−8.00 −2.00 ×180 °\"",
            r#"{"k":1,"k":2}"#,
            "[]",
            "{}",
        ];
        for t in texts {
            let ours = parse(t).unwrap_or_else(|_| panic!("{t}"));
            let theirs: Value = serde_json::from_str(t).unwrap();
            assert_eq!(ours, theirs, "{t}");
        }
    }

    #[test]
    fn refuses_what_is_not_json_or_not_ours() {
        for bad in [
            "",
            "{",
            "[1,]",
            "{\"a\" 1}",
            "{a:1}",
            "01",
            "-01",
            "1.5",
            "1e3",
            "-",
            "\"\u{1}\"",
            "\"\\x\"",
            "tru",
            "nul",
            "[1] x",
            "\"open",
            "\"\\ud800\\u0041\"",
            "\"\\u12\"",
        ] {
            assert!(parse(bad).is_err(), "{bad:?}");
            let mut r = Reader::new(bad);
            assert!(r.skip_value(0).and_then(|()| r.end()).is_err(), "{bad:?}");
        }
        let deep = "[".repeat(100) + &"]".repeat(100);
        assert!(parse(&deep).is_err());
        assert!(Reader::new(&deep).skip_value(0).is_err());
    }

    #[test]
    fn what_it_writes_serde_json_reads_back() {
        let tricky = [
            "plain",
            "quote \" backslash \\ slash /",
            "line\nfeed\ttab\r",
            "\u{1}\u{1f}",
            "×−° é 😀",
            "</script><b>",
        ];
        for s in tricky {
            let mut out = String::new();
            quote(&mut out, s);
            assert_eq!(serde_json::from_str::<String>(&out).unwrap(), s);
            assert_eq!(Reader::new(&out).text(), Ok(s.to_string()));
        }
        let p = vec![("k".to_string(), "v\"".to_string())];
        assert_eq!(read_pairs(&pairs(&p)), Some(p));
        assert_eq!(read_pairs("[[\"a\"]]"), None);
        assert_eq!(read_pairs("[[\"a\",\"b\",\"c\"]]"), None);
        assert_eq!(read_pairs("[[\"a\",1]]"), None);
        assert_eq!(read_pairs("[] x"), None);
    }
}
