//! What is stored, schema versions and the migration from older ones.
//!
//! Schema 2 (current), in localStorage:
//!
//! ```text
//! lensplane.history        manifest {"schema":2,"next":N,"chunks":[["2024-05","lensplane.history.2.7"],…]}
//! lensplane.history.2.<n>  one month (UTC) of entries, oldest first: [entry, …]
//! lensplane.history.aside  unreadable data kept aside: [["key","text as found"],…]
//! ```
//!
//! An entry: `{"id":"…","t":<ms since 1970 UTC>,"p":"vertex","q":"<link query>","l":"label","e":[eye…]}`,
//! an eye: `{"s":"R","i":"entered","r":"result","o":"orderable"}`. Keys are short
//! because 10,000 entries must fit beside everything else in a few megabytes.
//!
//! Schema 1 (the first layout) kept one array under `lensplane.history.1`
//! with long keys, the time in seconds and the whole link:
//! `{"id","time","link":"/vertex?r=…","label","eyes":[{"eye","input","result","order"}]}`.

use super::json::{key, quote, read_pairs, Reader, Value};
use super::EyeSummary;
use crate::link::{Destination, Query};
use std::borrow::Cow;

pub const SCHEMA: i64 = 2;
pub const MANIFEST_KEY: &str = "lensplane.history";
pub const CHUNK_PREFIX: &str = "lensplane.history.2.";
pub const ASIDE_KEY: &str = "lensplane.history.aside";
pub const V1_KEY: &str = "lensplane.history.1";
pub const PERSIST_ASKED_KEY: &str = "lensplane.persist-asked";

/// Longest label kept (the field allows 60 characters).
pub const LABEL_MAX: usize = 60;
/// Longest text of any other stored field.
const FIELD_MAX: usize = 400;

/// One saved calculation.
#[derive(Clone, Debug, PartialEq)]
pub struct Entry {
    pub id: String,
    /// When it was saved: milliseconds since 1970-01-01 UTC.
    pub t: i64,
    /// The panel: "vertex", "equivalent" or "near".
    pub p: String,
    /// The panel's inputs in the link format (without `?`).
    pub q: String,
    /// Optional label.
    pub l: String,
    pub e: Vec<EyeSummary>,
    /// Lowercase text the filter searches (never stored).
    pub search: String,
}

/// The manifest: which key holds which month.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Manifest {
    pub schema: i64,
    pub next: u64,
    pub chunks: Vec<(String, String)>,
}

impl Manifest {
    pub fn to_json(&self) -> String {
        format!(
            "{{\"schema\":{},\"next\":{},\"chunks\":{}}}",
            self.schema,
            self.next,
            super::json::pairs(&self.chunks)
        )
    }

    pub fn read(v: &Value) -> Option<Manifest> {
        let next = v.get("next")?.int().filter(|n| *n >= 0)? as u64;
        Some(Manifest {
            schema: v.get("schema")?.int()?,
            next,
            chunks: read_pairs(v.get("chunks")?)?,
        })
    }
}

fn read_eye(v: Value) -> Option<EyeSummary> {
    let Value::Obj(pairs) = v else { return None };
    let (mut eye, mut input, mut result, mut order) = (None, None, None, None);
    for (k, v) in pairs {
        match (k.as_str(), v) {
            ("s", Value::Str(s)) => eye = Some(s),
            ("i", Value::Str(s)) => input = Some(s),
            ("r", Value::Str(s)) => result = Some(s),
            ("o", Value::Str(s)) => order = Some(s).filter(|o| !o.is_empty()),
            ("o", Value::Null) => {}
            ("s" | "i" | "r" | "o", _) => return None,
            _ => {}
        }
    }
    Some(EyeSummary {
        eye: eye?,
        input: input?,
        result: result?,
        order,
    })
}

/// Reads a stored month's entries a few at a time, so a large history can
/// be opened in slices that leave the page responsive between them.
#[derive(Debug)]
pub struct MonthReader {
    text: String,
    at: usize,
}

impl MonthReader {
    pub fn new(text: String) -> MonthReader {
        MonthReader { text, at: 0 }
    }

    /// Reads up to `max` more entries into `out`: `Ok(true)` once the whole
    /// list has been read, `Err` if the text is not a list of entries.
    pub fn read(&mut self, max: usize, out: &mut Vec<Entry>) -> Result<bool, String> {
        let mut r = Reader::starting_at(&self.text, self.at);
        if self.at == 0 {
            if !r.skip(b'[') {
                return Err(r.fail());
            }
            if r.skip(b']') {
                r.end()?;
                return Ok(true);
            }
        }
        for _ in 0..max {
            out.push(read_streamed(&mut r)?);
            if r.skip(b']') {
                r.end()?;
                return Ok(true);
            }
            if !r.skip(b',') {
                return Err(r.fail());
            }
        }
        self.at = r.position();
        Ok(false)
    }

    /// The text as found (to keep aside when it cannot be read).
    pub fn into_text(self) -> String {
        self.text
    }
}

/// A string where one is required; `Err` for any other value.
fn text_at(r: &mut Reader) -> Result<String, String> {
    match r.peek() {
        Some(b'"') => Ok(r.string_cow()?.into_owned()),
        _ => Err(r.fail()),
    }
}

/// Skips a `null` where one is allowed; `Err` for anything but a string or null.
fn null_or_text(r: &mut Reader) -> Result<Option<String>, String> {
    match r.peek() {
        Some(b'"') => text_at(r).map(Some),
        _ => match r.value(2)? {
            Value::Null => Ok(None),
            _ => Err(r.fail()),
        },
    }
}

/// [`read_eye`] for a reader at an eye object.
fn read_eye_streamed(r: &mut Reader) -> Result<EyeSummary, String> {
    let (mut eye, mut input, mut result, mut order) = (None, None, None, None);
    r.object(2, |r, k| {
        match k {
            "s" => eye = Some(text_at(r)?),
            "i" => input = Some(text_at(r)?),
            "r" => result = Some(text_at(r)?),
            "o" => {
                if let Some(o) = null_or_text(r)? {
                    order = Some(o).filter(|o| !o.is_empty());
                }
            }
            _ => drop(r.value(3)?),
        }
        Ok(())
    })?;
    match (eye, input, result) {
        (Some(eye), Some(input), Some(result)) => Ok(EyeSummary {
            eye,
            input,
            result,
            order,
        }),
        _ => Err(r.fail()),
    }
}

/// [`Entry::read`] for a reader at an entry object.
fn read_streamed(r: &mut Reader) -> Result<Entry, String> {
    let (mut id, mut t, mut p, mut q, mut l, mut e) = (None, None, None, None, String::new(), None);
    r.object(1, |r, k| {
        match k {
            "id" => id = Some(text_at(r)?),
            "t" => match r.peek() {
                Some(b'-' | b'0'..=b'9') => match r.value(2)? {
                    Value::Int(n) => t = Some(n),
                    _ => return Err(r.fail()),
                },
                _ => return Err(r.fail()),
            },
            "p" => p = Some(text_at(r)?),
            "q" => q = Some(text_at(r)?),
            "l" => {
                if let Some(text) = null_or_text(r)? {
                    l = text;
                }
            }
            "e" => {
                let mut eyes = Vec::with_capacity(2);
                r.array(2, |r| {
                    eyes.push(read_eye_streamed(r)?);
                    Ok(())
                })?;
                e = Some(eyes);
            }
            _ => drop(r.value(2)?),
        }
        Ok(())
    })?;
    match (id, t, p, q, e) {
        (Some(id), Some(t), Some(p), Some(q), Some(e)) => Ok(Entry::new(id, t, p, q, l, e)),
        _ => Err(r.fail()),
    }
}

/// An entry as schema 1 stored it, in the current schema.
pub fn read_v1(v: &Value) -> Option<Entry> {
    let link = v.text("link", false)?;
    let (path, query) = link.split_once('?').unwrap_or((link.as_str(), ""));
    let eyes = v
        .get("eyes")?
        .arr()?
        .iter()
        .map(|e| {
            let order = Some(e.text("order", true)?).filter(|o| !o.is_empty());
            Some(EyeSummary {
                eye: e.text("eye", false)?,
                input: e.text("input", false)?,
                result: e.text("result", false)?,
                order,
            })
        })
        .collect::<Option<Vec<_>>>()?;
    let t = v.get("time")?.int()?.checked_mul(1000)?;
    Some(Entry::new(
        v.text("id", false)?,
        t,
        path.trim_start_matches('/').into(),
        query.into(),
        v.text("label", true)?,
        eyes,
    ))
}

/// The panel name stored for a destination.
pub fn panel_name(d: Destination) -> &'static str {
    d.path().trim_start_matches('/')
}

/// The destination of a stored panel name (a calculator: never History or About).
pub fn panel_of(name: &str) -> Option<Destination> {
    Destination::from_path(&format!("/{name}")).filter(|d| !matches!(d, Destination::History | Destination::About))
}

/// Words shown for a panel.
pub fn panel_words(d: Destination) -> &'static str {
    d.title()
}

/// Characters of trade notation and the app's own wording that have no case.
const CASELESS: [char; 6] = ['×', '−', '–', '°', '·', '→'];

/// `text` in lower case. ASCII (with the caseless signs of trade notation)
/// is lowered here; any other text goes through the browser's own
/// `toLowerCase` (natively, the standard library's), so the wasm does not
/// carry Unicode's case tables (11.8 KB, about 4.5 KB gzip).
pub fn lowercase(text: &str) -> Cow<'_, str> {
    if text.chars().all(|c| c.is_ascii() || CASELESS.contains(&c)) {
        if text.bytes().any(|b| b.is_ascii_uppercase()) {
            Cow::Owned(text.to_ascii_lowercase())
        } else {
            Cow::Borrowed(text)
        }
    } else {
        Cow::Owned(unicode_lowercase(text))
    }
}

#[cfg(target_arch = "wasm32")]
fn unicode_lowercase(text: &str) -> String {
    js_sys::JsString::from(text).to_lower_case().into()
}

#[cfg(not(target_arch = "wasm32"))]
fn unicode_lowercase(text: &str) -> String {
    text.to_lowercase()
}

/// Lowercase, with the typographic minus, times sign and degree sign read
/// as the plain characters people type.
pub fn fold(text: &str) -> String {
    lowercase(text)
        .chars()
        .map(|c| match c {
            '×' => 'x',
            '−' | '–' => '-',
            c => c,
        })
        .filter(|c| *c != '°')
        .collect()
}

impl Entry {
    pub fn new(id: String, t: i64, p: String, q: String, l: String, e: Vec<EyeSummary>) -> Entry {
        let mut entry = Entry {
            id,
            t,
            p,
            q,
            l,
            e,
            search: String::new(),
        };
        entry.index();
        entry
    }

    /// Appends the entry as stored JSON.
    pub fn write(&self, out: &mut String) {
        out.push('{');
        key(out, "id");
        quote(out, &self.id);
        key(out, "t");
        out.push_str(&self.t.to_string());
        key(out, "p");
        quote(out, &self.p);
        key(out, "q");
        quote(out, &self.q);
        if !self.l.is_empty() {
            key(out, "l");
            quote(out, &self.l);
        }
        key(out, "e");
        out.push('[');
        for (i, eye) in self.e.iter().enumerate() {
            if i > 0 {
                out.push(',');
            }
            out.push('{');
            for (k, v) in [
                ("s", Some(&eye.eye)),
                ("i", Some(&eye.input)),
                ("r", Some(&eye.result)),
                ("o", eye.order.as_ref()),
            ] {
                if let Some(v) = v {
                    key(out, k);
                    quote(out, v);
                }
            }
            out.push('}');
        }
        out.push_str("]}");
    }

    /// Reads a stored entry, moving its text out of the parsed value (not
    /// yet checked: see [`Entry::problem`]).
    pub fn read(v: Value) -> Option<Entry> {
        let Value::Obj(pairs) = v else { return None };
        let (mut id, mut t, mut p, mut q, mut l, mut e) = (None, None, None, None, String::new(), None);
        for (k, v) in pairs {
            match (k.as_str(), v) {
                ("id", Value::Str(s)) => id = Some(s),
                ("t", Value::Int(n)) => t = Some(n),
                ("p", Value::Str(s)) => p = Some(s),
                ("q", Value::Str(s)) => q = Some(s),
                ("l", Value::Str(s)) => l = s,
                ("l", Value::Null) => {}
                ("e", Value::Arr(a)) => e = Some(a.into_iter().map(read_eye).collect::<Option<Vec<_>>>()?),
                ("id" | "t" | "p" | "q" | "l" | "e", _) => return None,
                _ => {}
            }
        }
        Some(Entry::new(id?, t?, p?, q?, l, e?))
    }

    /// Reads a stored month (`[entry, …]`) straight from its text, with the
    /// same result as [`json::parse`](super::json::parse) followed by
    /// [`Entry::read`] on each element, but without building a [`Value`] per
    /// entry. `None` if the text is not such a list; entries are not yet checked.
    pub fn read_list(text: &str) -> Option<Vec<Entry>> {
        let mut reader = MonthReader::new(text.to_string());
        let mut list = Vec::new();
        reader.read(usize::MAX, &mut list).ok()?;
        Some(list)
    }

    /// Computes the filter's search text: one line per field, folded (see
    /// [`fold`]) and with runs of spaces as one, in a single pass.
    pub fn index(&mut self) {
        let mut s = String::with_capacity(96);
        let mut line = |text: &str| {
            let mut space = false;
            for c in lowercase(text).chars() {
                match c {
                    '°' => {}
                    c if c.is_whitespace() => space = !s.is_empty() && !s.ends_with('\n'),
                    c => {
                        if space {
                            s.push(' ');
                            space = false;
                        }
                        s.push(match c {
                            '×' => 'x',
                            '−' | '–' => '-',
                            c => c,
                        });
                    }
                }
            }
            s.push('\n');
        };
        line(&self.l);
        line(panel_of(&self.p).map(panel_words).unwrap_or(""));
        for eye in &self.e {
            for part in [
                eye.eye.as_str(),
                &eye.input,
                &eye.result,
                eye.order.as_deref().unwrap_or(""),
            ] {
                line(part);
            }
        }
        self.search = s;
    }

    pub fn panel(&self) -> Destination {
        panel_of(&self.p).unwrap_or(Destination::Vertex)
    }

    pub fn query(&self) -> Query {
        Query::parse(&self.q)
    }

    /// The month (UTC) whose chunk holds the entry, "YYYY-MM".
    pub fn month(&self) -> String {
        use chrono::Datelike;
        let d = chrono::DateTime::from_timestamp_millis(self.t).unwrap_or_default();
        format!("{:04}-{:02}", d.year(), d.month())
    }

    /// The times (ms, UTC) from the start of `month` ("YYYY-MM") up to the
    /// start of the next: exactly the entries whose [`Entry::month`] it is.
    pub fn month_span(month: &str) -> Option<std::ops::Range<i64>> {
        use chrono::NaiveDate;
        let (y, m) = month.split_once('-')?;
        let (y, m): (i32, u32) = (y.parse().ok()?, m.parse().ok()?);
        let start = |y, m| {
            NaiveDate::from_ymd_opt(y, m, 1).map(|d| d.and_time(chrono::NaiveTime::MIN).and_utc().timestamp_millis())
        };
        let (ny, nm) = if m == 12 { (y + 1, 1) } else { (y, m + 1) };
        Some(start(y, m)?..start(ny, nm)?)
    }

    /// Why the entry cannot be kept, if it cannot.
    pub fn problem(&self) -> Option<String> {
        // A text of at most FIELD_MAX bytes has at most FIELD_MAX characters.
        let too_long = |s: &str| s.len() > FIELD_MAX && s.chars().count() > FIELD_MAX;
        if self.id.is_empty() || self.id.len() > 40 {
            return Some("an entry has no usable id".into());
        }
        // 2000-01-01 to 2199-12-31.
        if !(946_684_800_000..7_258_032_000_000).contains(&self.t) {
            return Some(format!("entry {} has an impossible date", self.id));
        }
        if panel_of(&self.p).is_none() {
            return Some(format!("entry {} names an unknown panel", self.id));
        }
        if self.l.len() > LABEL_MAX && self.l.chars().count() > LABEL_MAX {
            return Some(format!(
                "entry {} has a label longer than {LABEL_MAX} characters",
                self.id
            ));
        }
        if too_long(&self.q) || self.e.is_empty() || self.e.len() > 2 {
            return Some(format!("entry {} has no usable calculation", self.id));
        }
        for eye in &self.e {
            let parts = [&eye.input, &eye.result];
            if !(eye.eye == "R" || eye.eye == "L")
                || parts.iter().any(|s| too_long(s))
                || eye.order.as_deref().is_some_and(too_long)
            {
                return Some(format!("entry {} has an unreadable eye", self.id));
            }
        }
        None
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn eye(e: &str) -> EyeSummary {
        EyeSummary {
            eye: e.into(),
            input: "-8.00 -2.00 ×180".into(),
            result: "-7.30 -1.63 ×180".into(),
            order: None,
        }
    }

    #[test]
    fn schema_one_entries_migrate_with_their_time_panel_and_inputs() {
        let old = r#"{"id":"a1","time":1714745100,"link":"/near?r=%2B1.00&add=2.00","label":"Room 2",
            "eyes":[{"eye":"R","input":"+1.00 DS","result":"+3.00 DS","order":null}]}"#;
        let e = read_v1(&super::super::json::parse(old).unwrap()).unwrap();
        assert_eq!(e.t, 1_714_745_100_000);
        assert_eq!(e.panel(), Destination::Near);
        assert_eq!(e.query().get("r"), Some("+1.00"));
        assert_eq!(e.query().get("add"), Some("2.00"));
        assert_eq!(e.l, "Room 2");
        assert!(e.search.contains("room 2") && e.search.contains("+3.00 ds"));
        assert_eq!(e.problem(), None);
    }

    #[test]
    fn search_text_reads_typographic_signs_as_typed_ones() {
        let e = Entry::new(
            "x".into(),
            1_714_745_100_000,
            "vertex".into(),
            String::new(),
            "Bench B".into(),
            vec![eye("R")],
        );
        assert!(e.search.contains("-8.00 -2.00 x180"), "{}", e.search);
        let spaced = Entry::new(
            "y".into(),
            1_714_745_100_000,
            "near".into(),
            String::new(),
            "  Room\t 2 ".into(),
            vec![eye("L")],
        );
        assert_eq!(spaced.search, "room 2\nnear\nl\n-8.00 -2.00 x180\n-7.30 -1.63 x180\n\n");
        assert!(e.search.contains("bench b") && e.search.contains("vertex"));
        assert_eq!(fold("−2.00 × 90°"), "-2.00 x 90");
    }

    #[test]
    fn entries_are_checked_field_by_field() {
        let ok = Entry::new(
            "x".into(),
            1_714_745_100_000,
            "vertex".into(),
            String::new(),
            String::new(),
            vec![eye("R")],
        );
        assert_eq!(ok.problem(), None);
        let bad = |f: &dyn Fn(&mut Entry)| {
            let mut e = ok.clone();
            f(&mut e);
            e.problem().expect("should be refused")
        };
        assert!(bad(&|e| e.id.clear()).contains("id"));
        assert!(bad(&|e| e.t = 0).contains("date"));
        assert!(bad(&|e| e.p = "history".into()).contains("unknown panel"));
        assert!(bad(&|e| e.l = "x".repeat(61)).contains("label"));
        assert!(bad(&|e| e.e.clear()).contains("calculation"));
        assert!(bad(&|e| e.e[0].eye = "X".into()).contains("eye"));
    }

    #[test]
    fn entries_written_read_back_identically_and_serde_json_agrees() {
        let mut e = Entry::new(
            "a\"1".into(),
            1_714_745_100_000,
            "vertex".into(),
            "r=-8.00".into(),
            "Room <2>".into(),
            vec![eye("R"), eye("L")],
        );
        e.e[1].order = Some("-7.25 -1.75 ×180".into());
        e.index();
        let mut out = String::new();
        e.write(&mut out);
        assert_eq!(Entry::read(super::super::json::parse(&out).unwrap()), Some(e.clone()));
        let checked: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(checked["e"][1]["o"], "-7.25 -1.75 ×180");
        assert!(checked["e"][0].get("o").is_none());
        assert_eq!(
            out,
            r#"{"id":"a\"1","t":1714745100000,"p":"vertex","q":"r=-8.00","l":"Room <2>","e":[{"s":"R","i":"-8.00 -2.00 ×180","r":"-7.30 -1.63 ×180"},{"s":"L","i":"-8.00 -2.00 ×180","r":"-7.30 -1.63 ×180","o":"-7.25 -1.75 ×180"}]}"#
        );
    }

    #[test]
    fn a_month_read_straight_from_text_matches_the_general_reader() {
        let via_values = |t: &str| -> Option<Vec<Entry>> {
            let Value::Arr(items) = super::super::json::parse(t).ok()? else {
                return None;
            };
            items.into_iter().map(Entry::read).collect()
        };
        let eye = r#"{"s":"R","i":"-8.00 -2.00 ×180","r":"-7.30 -1.63 ×180"}"#;
        let texts = [
            format!(r#"[{{"id":"a","t":1714745100000,"p":"vertex","q":"r=-8.00","l":"Room 2","e":[{eye}]}}]"#),
            format!(r#" [ {{ "t" : 1714745100000 , "id" : "a", "q":"", "p":"near", "e" : [ {eye} , {eye} ] }} ] "#),
            format!(r#"[{{"id":"a","id":"b","t":1,"p":"x","q":"","l":null,"zz":{{"n":[1,[true,null]]}},"e":[]}}]"#),
            format!(r#"[{{"\u0069d":"\"q\" \\ é \ud83d\ude00","t":-5,"p":"v","q":"","l":"L\u00e9","e":[{{"s":"L","i":"","r":"","o":null,"x":0}}]}}]"#),
            r#"[{"id":"a","t":1,"p":"v","q":"","e":[{"s":"L","i":"","r":"","o":""},{"s":"R","i":"1","r":"2","o":"3"}]}]"#.to_string(),
            "[]".to_string(),
            // Each of these is refused by both.
            format!(r#"[{{"id":"a","t":"1","p":"v","q":"","e":[{eye}]}}]"#),
            format!(r#"[{{"id":1,"t":1,"p":"v","q":"","e":[{eye}]}}]"#),
            format!(r#"[{{"id":"a","t":1,"p":"v","q":"","l":3,"e":[{eye}]}}]"#),
            r#"[{"id":"a","t":1,"p":"v","q":"","e":{}}]"#.to_string(),
            r#"[{"id":"a","t":1,"p":"v","q":"","e":["R"]}]"#.to_string(),
            r#"[{"id":"a","t":1,"p":"v","q":"","e":[{"s":"R","i":""}]}]"#.to_string(),
            r#"[{"id":"a","t":1,"p":"v","q":"","e":[{"s":"R","i":"","r":"","o":1}]}]"#.to_string(),
            format!(r#"[{{"t":1,"p":"v","q":"","e":[{eye}]}}]"#),
            format!(r#"[{{"id":"a","t":1.5,"p":"v","q":"","e":[{eye}]}}]"#),
            format!(r#"[{{"id":"a","t":1,"p":"v","q":"","e":[{eye}]}}] x"#),
            format!(r#"{{"id":"a","t":1,"p":"v","q":"","e":[{eye}]}}"#),
            r#"[{"id":"a\x","t":1}]"#.to_string(),
            "[1]".to_string(),
            "[".to_string(),
        ];
        let mut read = 0;
        for t in &texts {
            let ours = Entry::read_list(t);
            assert_eq!(ours, via_values(t), "{t}");
            read += usize::from(ours.is_some());
        }
        assert_eq!(read, 6, "the first six are lists of entries, the rest are not");
    }

    #[test]
    fn a_month_span_holds_exactly_the_entries_of_that_month() {
        let at = |t: i64| {
            Entry::new(
                "x".into(),
                t,
                "vertex".into(),
                String::new(),
                String::new(),
                vec![eye("R")],
            )
        };
        let may = Entry::month_span("2024-05").unwrap();
        assert_eq!(at(may.start).month(), "2024-05");
        assert_eq!(at(may.start - 1).month(), "2024-04");
        assert_eq!(at(may.end - 1).month(), "2024-05");
        assert_eq!(at(may.end).month(), "2024-06");
        let dec = Entry::month_span("2024-12").unwrap();
        assert_eq!(
            (at(dec.start).month(), at(dec.end).month()),
            ("2024-12".to_string(), "2025-01".to_string())
        );
        assert_eq!(Entry::month_span("2024-13"), None);
        assert_eq!(Entry::month_span("May"), None);
    }

    #[test]
    fn lowercase_keeps_trade_notation_and_lowers_any_script() {
        assert!(matches!(lowercase("-8.00 -2.00 ×180 → 90°"), Cow::Borrowed(_)));
        assert_eq!(lowercase("Room B −2.00 DS"), "room b −2.00 ds");
        assert_eq!(lowercase("Salle É, ΘΑΛΑΜΟΣ 2, Кабинет"), "salle é, θαλαμος 2, кабинет");
        assert_eq!(fold("Bench É × 90°"), "bench é x 90");
    }

    #[test]
    fn months_are_taken_in_utc() {
        // 2024-05-31T23:30:00Z is June somewhere east of Greenwich, May in storage.
        let e = Entry::new(
            "x".into(),
            1_717_198_200_000,
            "vertex".into(),
            String::new(),
            String::new(),
            vec![eye("R")],
        );
        assert_eq!(e.month(), "2024-05");
    }
}
