//! Stored text ⇄ entries: the one entry reader (stored months, exported
//! files, and schema 1's old layout for its migration) and the one writer.
//!
//! An entry, schema 2: `{"id":"…","t":<ms since 1970 UTC>,"p":"vertex","q":"<link query>","l":"label","e":[eye…]}`,
//! an eye: `{"s":"R","i":"entered","r":"result","o":"orderable"}`; `l` and
//! `o` are left out when empty, unknown keys are skipped. A calculation
//! without eyes (the conversion chart) has `"e":[]` and a one-line summary
//! `"d":"…"` instead (left out when empty; entries saved before have none
//! and read as before). Keys are short
//! because 10,000 entries must fit beside everything else in a few
//! megabytes. `p` is the calculation's [`Destination::id`].
//!
//! Schema 1 kept one array with long keys, the time in seconds and the whole
//! link: `{"id","time","link":"/vertex?r=…","label","eyes":[{"eye","input","result","order"}]}`.

use super::entry::{Entry, EyeSummary, Invalid};
use super::error::BadFile;
use super::json::{key, quote, Malformed, Reader};
use crate::link::Destination;
use lensplane_core::Eye;

/// The stored layout's version (the manifest's and the export file's `schema`).
pub const SCHEMA: i64 = 2;

/// Why text could not be read as entries.
#[derive(Clone, Debug, PartialEq)]
pub enum Unreadable {
    /// Not JSON, or not shaped as entries (a field missing or of the wrong kind).
    Shape,
    /// A well-formed entry that cannot be kept.
    Invalid(Invalid),
}

impl From<Malformed> for Unreadable {
    fn from(_: Malformed) -> Unreadable {
        Unreadable::Shape
    }
}

/// The stored letter of an eye.
fn letter(eye: Eye) -> &'static str {
    match eye {
        Eye::Right => "R",
        Eye::Left => "L",
    }
}

/// A string, or `""` for `null`.
fn text_or_null(r: &mut Reader) -> Result<String, Malformed> {
    if r.null() {
        Ok(String::new())
    } else {
        r.text()
    }
}

/// One eye; `None` for an eye letter other than R or L.
fn read_eye(r: &mut Reader, v1: bool) -> Result<Option<EyeSummary>, Malformed> {
    let (mut eye, mut input, mut result, mut order) = (None, None, None, String::new());
    r.object(2, |r, k| {
        match (k, v1) {
            ("s", false) | ("eye", true) => eye = Some(r.text()?),
            ("i", false) | ("input", true) => input = Some(r.text()?),
            ("r", false) | ("result", true) => result = Some(r.text()?),
            ("o", false) | ("order", true) => order = text_or_null(r)?,
            _ => r.skip_value(3)?,
        }
        Ok(())
    })?;
    let (Some(letter), Some(input), Some(result)) = (eye, input, result) else {
        return Err(Malformed);
    };
    let eye = match letter.as_str() {
        "R" => Eye::Right,
        "L" => Eye::Left,
        _ => return Ok(None),
    };
    let order = Some(order).filter(|o| !o.is_empty());
    Ok(Some(EyeSummary {
        eye,
        input,
        result,
        order,
    }))
}

/// One entry at the reader, in schema 2's layout or (`v1`) schema 1's, checked.
fn read_entry(r: &mut Reader, v1: bool) -> Result<Entry, Unreadable> {
    let (mut id, mut t, mut p, mut q, mut label, mut eyes) = (None, None, None, None, String::new(), None);
    let mut summary = String::new();
    r.object(1, |r, k| {
        match (k, v1) {
            ("id", _) => id = Some(r.text()?),
            ("t", false) => t = Some(r.int()?),
            ("time", true) => t = Some(r.int()?.checked_mul(1000).ok_or(Malformed)?),
            ("p", false) => p = Some(r.text()?),
            ("q", false) => q = Some(r.text()?),
            ("link", true) => {
                let link = r.text()?;
                let (path, query) = link.split_once('?').unwrap_or((&link, ""));
                (p, q) = (Some(path.trim_start_matches('/').into()), Some(query.into()));
            }
            ("l", false) | ("label", true) => label = text_or_null(r)?,
            ("d", false) => summary = text_or_null(r)?,
            ("e", false) | ("eyes", true) => {
                let mut list = Vec::with_capacity(2);
                r.array(2, |r| read_eye(r, v1).map(|e| list.push(e)))?;
                eyes = Some(list);
            }
            _ => r.skip_value(2)?,
        }
        Ok(())
    })?;
    let (Some(id), Some(t), Some(p), Some(q), Some(eyes)) = (id, t, p, q, eyes) else {
        return Err(Unreadable::Shape);
    };
    Entry::check_id(&id).map_err(Unreadable::Invalid)?;
    let Some(destination) = Destination::from_id(&p).filter(|d| d.is_calculator()) else {
        return Err(Unreadable::Invalid(Invalid::Destination(id)));
    };
    let Some(eyes) = eyes.into_iter().collect() else {
        return Err(Unreadable::Invalid(Invalid::Eye(id)));
    };
    let entry = Entry::new(id, t, destination, q, label, eyes).with_summary(summary);
    entry.check().map_err(Unreadable::Invalid)?;
    Ok(entry)
}

/// Reads the `[` of a list of entries: true if the list is empty.
fn open_list(r: &mut Reader) -> Result<bool, Unreadable> {
    if !r.skip(b'[') {
        return Err(Unreadable::Shape);
    }
    Ok(r.skip(b']'))
}

/// Reads up to `max` entries of a list already opened into `out`: true
/// once its `]` has been read.
fn read_entries(r: &mut Reader, v1: bool, max: usize, out: &mut Vec<Entry>) -> Result<bool, Unreadable> {
    for _ in 0..max {
        out.push(read_entry(r, v1)?);
        if r.skip(b']') {
            return Ok(true);
        }
        if !r.skip(b',') {
            return Err(Unreadable::Shape);
        }
    }
    Ok(false)
}

/// Reads a stored month's entries (`[entry, …]`) a few at a time, so a
/// large history is opened in slices that leave the page responsive.
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
    /// list has been read, `Err` if the text is not a list of valid entries.
    pub fn read(&mut self, max: usize, out: &mut Vec<Entry>) -> Result<bool, Unreadable> {
        let mut r = Reader::starting_at(&self.text, self.at);
        let done = (self.at == 0 && open_list(&mut r)?) || read_entries(&mut r, false, max, out)?;
        if done {
            r.end()?;
        }
        self.at = r.position();
        Ok(done)
    }

    /// The text as found (to keep aside when it cannot be read).
    pub fn into_text(self) -> String {
        self.text
    }
}

/// A whole list of entries: a stored month, or (`v1`) schema 1's list.
pub fn read_list(text: &str, v1: bool) -> Result<Vec<Entry>, Unreadable> {
    let mut r = Reader::new(text);
    let mut list = Vec::new();
    if !open_list(&mut r)? {
        read_entries(&mut r, v1, usize::MAX, &mut list)?;
    }
    r.end()?;
    Ok(list)
}

/// Reads an exported file's list of entries at the reader, stopping at the
/// first one that is not an entry or cannot be kept, with why in `stopped`.
pub fn read_file_entries(r: &mut Reader, stopped: &mut Option<BadFile>) -> Result<Vec<Entry>, Malformed> {
    let mut list = Vec::new();
    r.array(1, |r| {
        let why = match read_entry(r, false) {
            Ok(e) => {
                list.push(e);
                return Ok(());
            }
            Err(Unreadable::Shape) => BadFile::Incomplete(list.len() + 1),
            Err(Unreadable::Invalid(why)) => BadFile::Invalid(why),
        };
        *stopped = Some(why);
        Err(Malformed)
    })?;
    Ok(list)
}

/// Appends the entry as stored.
pub fn write_entry(out: &mut String, e: &Entry) {
    out.push('{');
    key(out, "id");
    quote(out, &e.id);
    key(out, "t");
    out.push_str(&e.saved_at_ms.to_string());
    key(out, "p");
    quote(out, e.destination.id());
    key(out, "q");
    quote(out, &e.query);
    if !e.label.is_empty() {
        key(out, "l");
        quote(out, &e.label);
    }
    if !e.summary.is_empty() {
        key(out, "d");
        quote(out, &e.summary);
    }
    key(out, "e");
    out.push('[');
    for (i, eye) in e.eyes.iter().enumerate() {
        if i > 0 {
            out.push(',');
        }
        out.push('{');
        for (k, v) in [
            ("s", Some(letter(eye.eye))),
            ("i", Some(eye.input.as_str())),
            ("r", Some(eye.result.as_str())),
            ("o", eye.order.as_deref()),
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

/// Appends `[entry, …]`: a stored month, or an exported file's entries.
pub fn write_entries(out: &mut String, entries: &[Entry]) {
    out.push('[');
    for (i, e) in entries.iter().enumerate() {
        if i > 0 {
            out.push(',');
        }
        write_entry(out, e);
    }
    out.push(']');
}

#[cfg(test)]
mod tests {
    use super::*;

    fn month(text: &str) -> Result<Vec<Entry>, Unreadable> {
        read_list(text, false)
    }

    fn schema_one(text: &str) -> Result<Vec<Entry>, Unreadable> {
        read_list(text, true)
    }

    const EYE: &str = r#"{"s":"R","i":"-8.00 -2.00 ×180","r":"-7.30 -1.63 ×180"}"#;

    fn eye(e: Eye) -> EyeSummary {
        EyeSummary {
            eye: e,
            input: "-8.00 -2.00 ×180".into(),
            result: "-7.30 -1.63 ×180".into(),
            order: None,
        }
    }

    #[test]
    fn entries_written_read_back_identically_and_serde_json_agrees() {
        let mut right_and_left = vec![eye(Eye::Right), eye(Eye::Left)];
        right_and_left[1].order = Some("-7.25 -1.75 ×180".into());
        let e = Entry::new(
            "a\"1".into(),
            1_714_745_100_000,
            Destination::Vertex,
            "r=-8.00".into(),
            "Room <2>".into(),
            right_and_left,
        );
        let mut out = String::new();
        write_entries(&mut out, std::slice::from_ref(&e));
        assert_eq!(month(&out), Ok(vec![e.clone()]));
        let checked: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(checked[0]["e"][1]["o"], "-7.25 -1.75 ×180");
        assert!(checked[0]["e"][0].get("o").is_none());
        assert_eq!(
            out,
            r#"[{"id":"a\"1","t":1714745100000,"p":"vertex","q":"r=-8.00","l":"Room <2>","e":[{"s":"R","i":"-8.00 -2.00 ×180","r":"-7.30 -1.63 ×180"},{"s":"L","i":"-8.00 -2.00 ×180","r":"-7.30 -1.63 ×180","o":"-7.25 -1.75 ×180"}]}]"#
        );
    }

    #[test]
    fn a_month_is_read_whatever_its_spacing_key_order_and_escapes() {
        let texts = [
            format!(r#"[{{"id":"a","t":1714745100000,"p":"vertex","q":"r=-8.00","l":"Room 2","e":[{EYE}]}}]"#),
            format!(r#" [ {{ "t" : 1714745100000 , "id" : "a", "q":"", "p":"near", "e" : [ {EYE} , {EYE} ] }} ] "#),
            format!(
                r#"[{{"id":"a","id":"b","t":1714745100000,"p":"equivalent","q":"","l":null,"zz":{{"n":[1,[true,null]]}},"e":[{EYE}]}}]"#
            ),
            r#"[{"\u0069d":"\"q\" \\ é \ud83d\ude00","t":1714745100000,"p":"vertex","q":"","l":"L\u00e9","e":[{"s":"L","i":"","r":"","o":null,"x":0}]}]"#.to_string(),
            r#"[{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{"s":"L","i":"","r":"","o":""},{"s":"R","i":"1","r":"2","o":"3"}]}]"#.to_string(),
        ];
        let read: Vec<Entry> = texts.iter().map(|t| month(t).unwrap().remove(0)).collect();
        assert_eq!((read[0].label.as_str(), read[0].query.as_str()), ("Room 2", "r=-8.00"));
        assert_eq!((read[1].destination, read[1].eyes.len()), (Destination::Near, 2));
        assert_eq!(
            (read[2].id.as_str(), read[2].label.as_str()),
            ("b", ""),
            "a repeated key: the last wins"
        );
        assert_eq!(read[3].id, "\"q\" \\ é 😀");
        assert_eq!(
            (read[3].label.as_str(), read[3].eyes[0].eye, &read[3].eyes[0].order),
            ("Lé", Eye::Left, &None)
        );
        assert_eq!(read[4].eyes[0].order, None, "an empty orderable value is none");
        assert_eq!(read[4].eyes[1].order.as_deref(), Some("3"));
        assert_eq!(month("[]"), Ok(vec![]));
        assert_eq!(month(" [ ] "), Ok(vec![]));
    }

    #[test]
    fn what_is_not_a_list_of_entries_is_refused() {
        let shape = [
            format!(r#"[{{"id":"a","t":"1","p":"vertex","q":"","e":[{EYE}]}}]"#),
            format!(r#"[{{"id":1,"t":1714745100000,"p":"vertex","q":"","e":[{EYE}]}}]"#),
            format!(r#"[{{"id":"a","t":1714745100000,"p":"vertex","q":"","l":3,"e":[{EYE}]}}]"#),
            r#"[{"id":"a","t":1714745100000,"p":"vertex","q":"","e":{}}]"#.to_string(),
            r#"[{"id":"a","t":1714745100000,"p":"vertex","q":"","e":["R"]}]"#.to_string(),
            r#"[{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{"s":"R","i":""}]}]"#.to_string(),
            r#"[{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{"s":"R","i":"","r":"","o":1}]}]"#.to_string(),
            format!(r#"[{{"t":1714745100000,"p":"vertex","q":"","e":[{EYE}]}}]"#),
            format!(r#"[{{"id":"a","t":1.5,"p":"vertex","q":"","e":[{EYE}]}}]"#),
            format!(r#"[{{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{EYE}]}}] x"#),
            format!(r#"[{{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{EYE}]}},]"#),
            format!(r#"[{{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{EYE}]}}"#),
            format!(r#"{{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{EYE}]}}"#),
            r#"[{"id":"a\x","t":1}]"#.to_string(),
            "[1]".to_string(),
            "[".to_string(),
            String::new(),
        ];
        for t in &shape {
            assert_eq!(month(t), Err(Unreadable::Shape), "{t}");
        }
        let invalid = [
            (
                format!(r#"[{{"id":"a","t":1,"p":"vertex","q":"","e":[{EYE}]}}]"#),
                Invalid::Date("a".into()),
            ),
            (
                format!(r#"[{{"id":"a","t":1714745100000,"p":"history","q":"","e":[{EYE}]}}]"#),
                Invalid::Destination("a".into()),
            ),
            (
                format!(r#"[{{"id":"a","t":1714745100000,"p":"Vertex","q":"","e":[{EYE}]}}]"#),
                Invalid::Destination("a".into()),
            ),
            (
                r#"[{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{"s":"X","i":"","r":""}]}]"#.into(),
                Invalid::Eye("a".into()),
            ),
            (
                r#"[{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[]}]"#.into(),
                Invalid::Calculation("a".into()),
            ),
            (
                format!(r#"[{{"id":"","t":1714745100000,"p":"elsewhere","q":"","e":[{EYE}]}}]"#),
                Invalid::Id,
            ),
        ];
        for (t, why) in invalid {
            assert_eq!(month(&t), Err(Unreadable::Invalid(why)), "{t}");
        }
    }

    #[test]
    fn a_chart_is_stored_without_eyes_with_its_summary_and_read_back() {
        let chart = Entry::new(
            "c1".into(),
            1_714_745_100_000,
            Destination::Chart,
            "from=12&to=0&min=4&max=20&step=0.25".into(),
            "Wall, room 2".into(),
            vec![],
        )
        .with_summary("12 mm → cornea (contact lens), contact-lens steps".into());
        let vertex = Entry::new(
            "v1".into(),
            1_714_745_160_000,
            Destination::Vertex,
            "r=-8.00".into(),
            String::new(),
            vec![eye(Eye::Right)],
        );
        let mut out = String::new();
        write_entries(&mut out, &[chart.clone(), vertex.clone()]);
        assert!(
            out.starts_with(
                r#"[{"id":"c1","t":1714745100000,"p":"chart","q":"from=12&to=0&min=4&max=20&step=0.25","l":"Wall, room 2","d":"12 mm → cornea (contact lens), contact-lens steps","e":[]},"#
            ),
            "{out}"
        );
        // An entry with eyes writes no summary: its layout is as before.
        assert!(out.ends_with(&format!(
            r#"{{"id":"v1","t":1714745160000,"p":"vertex","q":"r=-8.00","e":[{EYE}]}}]"#
        )));
        assert_eq!(month(&out), Ok(vec![chart.clone(), vertex]));
        assert_eq!(month(&out).unwrap()[0].summary, chart.summary);
        let checked: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(checked[0]["e"].as_array().map(Vec::len), Some(0));
        // A chart saved with no summary still reads; one with eyes, or a calculation with eyes
        // saved without any, cannot be kept.
        let bare = month(r#"[{"id":"c","t":1714745100000,"p":"chart","q":"","e":[]}]"#).unwrap();
        assert_eq!(
            (bare[0].destination, bare[0].summary.as_str()),
            (Destination::Chart, "")
        );
        assert_eq!(
            month(&format!(
                r#"[{{"id":"c","t":1714745100000,"p":"chart","q":"","d":"x","e":[{EYE}]}}]"#
            )),
            Err(Unreadable::Invalid(Invalid::Calculation("c".into())))
        );
        assert_eq!(
            month(r#"[{"id":"v","t":1714745100000,"p":"near","q":"","d":"x","e":[]}]"#),
            Err(Unreadable::Invalid(Invalid::Calculation("v".into())))
        );
        assert_eq!(
            month(r#"[{"id":"c","t":1714745100000,"p":"chart","q":"","d":3,"e":[]}]"#),
            Err(Unreadable::Shape)
        );
    }

    #[test]
    fn a_month_read_in_slices_gives_what_reading_it_at_once_gives() {
        let entries: Vec<Entry> = (0..7)
            .map(|i| {
                let d = if i % 2 == 0 {
                    Destination::Vertex
                } else {
                    Destination::Near
                };
                Entry::new(
                    format!("e{i}"),
                    1_714_745_100_000 + i,
                    d,
                    "r=1".into(),
                    format!("L{i}"),
                    vec![eye(Eye::Left)],
                )
            })
            .collect();
        let mut text = String::new();
        write_entries(&mut text, &entries);
        for step in [1, 2, 3, 7, 100] {
            let mut reader = MonthReader::new(text.clone());
            let mut out = Vec::new();
            let mut calls = 0;
            while !reader.read(step, &mut out).unwrap() {
                calls += 1;
                assert_eq!(out.len(), calls * step);
            }
            assert_eq!(out, entries, "{step} at a time");
        }
        let mut broken = MonthReader::new(text[..text.len() - 1].to_string());
        let mut out = Vec::new();
        assert_eq!(broken.read(3, &mut out), Ok(false));
        assert_eq!(broken.read(usize::MAX, &mut out), Err(Unreadable::Shape));
        assert_eq!(broken.into_text(), text[..text.len() - 1]);
    }

    #[test]
    fn schema_one_entries_read_with_their_time_calculation_and_inputs() {
        let old = r#"[{"id":"a1","time":1714745100,"link":"/near?r=%2B1.00&add=2.00","label":"Room 2",
            "eyes":[{"eye":"R","input":"+1.00 DS","result":"+3.00 DS","order":null}]},
            {"id":"a2","time":1714745160,"link":"/vertex","label":null,"extra":[1],
            "eyes":[{"eye":"L","input":"-4.00 DS","result":"-3.82 DS","order":"-3.75 DS"}]}]"#;
        let list = schema_one(old).unwrap();
        assert_eq!(list[0].saved_at_ms, 1_714_745_100_000);
        assert_eq!(list[0].destination, Destination::Near);
        assert_eq!(list[0].query, "r=%2B1.00&add=2.00");
        assert_eq!(list[0].label, "Room 2");
        assert_eq!(
            list[0].eyes,
            [EyeSummary {
                eye: Eye::Right,
                input: "+1.00 DS".into(),
                result: "+3.00 DS".into(),
                order: None
            }]
        );
        assert!(list[0].search_text().contains("room 2") && list[0].search_text().contains("+3.00 ds"));
        assert_eq!(
            (list[1].destination, list[1].query.as_str(), list[1].label.as_str()),
            (Destination::Vertex, "", "")
        );
        assert_eq!(list[1].eyes[0].order.as_deref(), Some("-3.75 DS"));
        // Schema 1's keys are not schema 2's.
        assert_eq!(
            schema_one(&format!(
                r#"[{{"id":"a","t":1714745100000,"p":"vertex","q":"","e":[{EYE}]}}]"#
            )),
            Err(Unreadable::Shape)
        );
        assert_eq!(
            schema_one(r#"[{"id":"a","time":9223372036854776,"link":"/vertex","eyes":[]}]"#),
            Err(Unreadable::Shape)
        );
    }
}
