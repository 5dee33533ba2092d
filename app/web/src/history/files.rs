//! Files: the JSON export (re-imports), the CSV export (spreadsheets), the
//! export of unreadable data kept aside, and reading an export back.
//!
//! The export is `{"format":"lensplane-history","schema":2,"entries":[…]}`
//! with the entries exactly as stored (see [`super::codec`]).

use super::calendar::{clock, iso_date, local};
use super::codec::{read_file_entries, write_entries, SCHEMA};
use super::entry::Entry;
use super::error::{BadFile, StoreError};
use super::json::{pairs, Reader};
use chrono::TimeZone;

const FORMAT: &str = "lensplane-history";

/// Largest import accepted, in bytes.
pub const IMPORT_MAX: usize = 6_000_000;

/// The whole history as a re-importable JSON file.
pub fn to_json(entries: &[Entry]) -> String {
    let mut out = format!("{{\"format\":\"{FORMAT}\",\"schema\":{SCHEMA},\"entries\":");
    write_entries(&mut out, entries);
    out.push('}');
    out
}

/// The unreadable data kept aside, exactly as found, for the user to keep.
pub fn unreadable_json(kept: &[(String, String)]) -> String {
    let note = "Stored data Lensplane could not read, kept exactly as found (storage key, then the text).";
    format!(
        "{{\"format\":\"lensplane-unreadable\",\"note\":\"{note}\",\"kept\":{}}}",
        pairs(kept)
    )
}

/// Reads an exported file; every entry is checked before anything is used.
/// The fields may come in any order (Lensplane writes the format and the
/// version first); a wrong format or version is reported before a problem
/// with an entry read after them.
pub fn read_export(text: &str) -> Result<Vec<Entry>, StoreError> {
    if text.len() > IMPORT_MAX {
        return Err(StoreError::TooLarge);
    }
    let (mut format, mut schema, mut entries, mut stopped) = (None, None, None, None);
    let mut r = Reader::new(text);
    let whole = r
        .object(0, |r, key| {
            match key {
                "format" if r.peek() == Some(b'"') => format = Some(r.string()? == FORMAT),
                "schema" if r.at_number() => schema = Some(r.int()?),
                "entries" if r.peek() == Some(b'[') => entries = Some(read_file_entries(r, &mut stopped)?),
                _ => r.skip_value(1)?,
            }
            Ok(())
        })
        .and_then(|()| r.end());
    let version = match (format, schema) {
        (Some(true), Some(SCHEMA)) => None,
        (Some(true), Some(s)) if s > SCHEMA => Some(BadFile::Newer),
        (Some(true), _) => Some(BadFile::Unsupported),
        _ => Some(BadFile::NotExport),
    };
    let why = match (whole, stopped) {
        (Err(_), None) => Some(BadFile::NotJson),
        // Reading stopped at an entry before the file said what it is.
        (Err(_), Some(entry)) if format != Some(false) && schema.is_none() => Some(entry),
        (_, stopped) => version.or(stopped).or(entries.is_none().then_some(BadFile::NoEntries)),
    };
    match why {
        Some(why) => Err(StoreError::BadImport(why)),
        None => Ok(entries.unwrap_or_default()),
    }
}

/// One CSV field: quoted when needed; text a spreadsheet would run as a
/// formula (a label starting with `=`, `+`, `-` or `@`) gets a leading apostrophe.
fn field(text: &str, guard: bool) -> String {
    let guarded = if guard && text.starts_with(['=', '+', '-', '@']) {
        format!("'{text}")
    } else {
        text.to_string()
    };
    if guarded.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", guarded.replace('"', "\"\""))
    } else {
        guarded
    }
}

/// Trade notation with every axis after `×` written with three digits
/// (`×10` → `×010`), as orders are written: entries saved by earlier
/// versions printed `×10`, and the export shows them as today's do.
pub fn three_digit_axes(text: &str) -> String {
    let mut out = String::with_capacity(text.len() + 4);
    let mut rest = text;
    while let Some(at) = rest.find('×') {
        let (before, after) = rest.split_at(at + '×'.len_utf8());
        out.push_str(before);
        let digits = after.bytes().take_while(u8::is_ascii_digit).count();
        if (1..3).contains(&digits) {
            out.push_str(&"00"[..3 - digits]);
        }
        rest = after;
    }
    out.push_str(rest);
    out
}

/// One row per eye per calculation, newest first, local times, trade
/// notation; the calculation as its stable id. A calculation without eyes
/// (a conversion chart) has one row, its summary as the result. Starts
/// with a byte-order mark so spreadsheets read the × sign.
pub fn to_csv<Tz: TimeZone>(entries: &[Entry], tz: &Tz) -> String {
    let mut out = String::from("\u{feff}date,time,calculation,label,eye,entered,result,orderable\r\n");
    for e in entries.iter().rev() {
        let when = local(e.saved_at_ms, tz);
        if e.eyes.is_empty() {
            let cells = [
                iso_date(when),
                clock(when),
                e.destination.id().into(),
                field(&e.label, true),
                String::new(),
                String::new(),
                field(&e.summary, true),
                String::new(),
            ];
            out.push_str(&cells.join(","));
            out.push_str("\r\n");
        }
        for eye in &e.eyes {
            let cells = [
                iso_date(when),
                clock(when),
                e.destination.id().into(),
                field(&e.label, true),
                crate::widgets::eye_words(eye.eye).1.into(),
                field(&three_digit_axes(&eye.input), false),
                field(&three_digit_axes(&eye.result), false),
                field(&three_digit_axes(eye.order.as_deref().unwrap_or("")), false),
            ];
            out.push_str(&cells.join(","));
            out.push_str("\r\n");
        }
    }
    out
}

#[cfg(test)]
mod tests {
    #[test]
    fn axes_print_with_three_digits_in_the_export() {
        assert_eq!(super::three_digit_axes("-0.50 -0.50 ×10"), "-0.50 -0.50 ×010");
        assert_eq!(
            super::three_digit_axes("-1.00 -0.25 ×5 add +2.00"),
            "-1.00 -0.25 ×005 add +2.00"
        );
        assert_eq!(super::three_digit_axes("+1.00 -2.00 ×180"), "+1.00 -2.00 ×180");
        assert_eq!(super::three_digit_axes("-4.00 DS"), "-4.00 DS");
    }

    use super::super::entry::{EyeSummary, Invalid};
    use super::*;
    use crate::link::Destination;
    use chrono::FixedOffset;
    use lensplane_core::Eye;

    const MAY: i64 = 1_714_745_100_000; // 2024-05-03T14:05:00Z

    pub fn entry(id: &str, t: i64, label: &str, eyes: usize) -> Entry {
        let r = EyeSummary {
            eye: Eye::Right,
            input: "-8.00 -2.00 ×180".into(),
            result: "-7.30 -1.63 ×180".into(),
            order: Some("-7.25 -1.75 ×180".into()),
        };
        let l = EyeSummary {
            eye: Eye::Left,
            input: "-4.00 DS".into(),
            result: "-3.82 DS".into(),
            order: None,
        };
        let eyes = [r, l].into_iter().take(eyes).collect();
        Entry::new(id.into(), t, Destination::Vertex, "r=-8.00".into(), label.into(), eyes)
    }

    #[test]
    fn csv_has_one_row_per_eye_in_local_time_and_trade_notation() {
        let mut equivalent = entry("c", MAY + 7_200_000, "", 1);
        equivalent.destination = Destination::Equivalent;
        let entries = [
            entry("a", MAY, "Room 2, bench", 2),
            entry("b", MAY + 3_600_000, "=SUM(A1)", 1),
            equivalent,
        ];
        let two_hours_east = FixedOffset::east_opt(2 * 3600).unwrap();
        let csv = to_csv(&entries, &two_hours_east);
        assert_eq!(
            csv,
            "\u{feff}date,time,calculation,label,eye,entered,result,orderable\r\n\
             2024-05-03,18:05,equivalent,,R,-8.00 -2.00 ×180,-7.30 -1.63 ×180,-7.25 -1.75 ×180\r\n\
             2024-05-03,17:05,vertex,'=SUM(A1),R,-8.00 -2.00 ×180,-7.30 -1.63 ×180,-7.25 -1.75 ×180\r\n\
             2024-05-03,16:05,vertex,\"Room 2, bench\",R,-8.00 -2.00 ×180,-7.30 -1.63 ×180,-7.25 -1.75 ×180\r\n\
             2024-05-03,16:05,vertex,\"Room 2, bench\",L,-4.00 DS,-3.82 DS,\r\n"
        );
    }

    #[test]
    fn a_chart_has_one_csv_row_with_its_summary_and_reimports_from_json() {
        let chart = Entry::new(
            "k".into(),
            MAY,
            Destination::Chart,
            "from=12&to=0".into(),
            "Wall".into(),
            vec![],
        )
        .with_summary("12 mm → cornea (contact lens), contact-lens steps, 4.00 to 20.00 D".into());
        let entries = [entry("a", MAY - 60_000, "", 1), chart.clone()];
        let csv = to_csv(&entries, &FixedOffset::east_opt(0).unwrap());
        let lines: Vec<&str> = csv.split("\r\n").collect();
        // Newest last in the list, first in the file.
        assert_eq!(
            lines[1],
            "2024-05-03,14:05,chart,Wall,,,\"12 mm → cornea (contact lens), contact-lens steps, 4.00 to 20.00 D\","
        );
        assert_eq!(lines.len(), 4, "{csv}");
        assert_eq!(read_export(&to_json(&entries)), Ok(entries.to_vec()));
        assert_eq!(read_export(&to_json(&entries)).unwrap()[1].summary, chart.summary);
    }

    #[test]
    fn json_export_reimports_completely() {
        let entries = vec![entry("a", MAY, "Room <b>2</b>", 2), entry("b", MAY + 1, "", 1)];
        let text = to_json(&entries);
        assert_eq!(read_export(&text), Ok(entries));
        assert!(text.starts_with("{\"format\":\"lensplane-history\",\"schema\":2,\"entries\":[{\"id\":\"a\","));
        let checked: serde_json::Value = serde_json::from_str(&text).unwrap();
        assert_eq!(checked["entries"][1]["id"], "b");
        assert_eq!(read_export(&to_json(&[])), Ok(vec![]));
    }

    #[test]
    fn an_export_is_read_whatever_the_order_of_its_fields() {
        let e = entry("a", MAY, "", 1);
        let entries = to_json(std::slice::from_ref(&e));
        let list = &entries[entries.find('[').unwrap()..entries.len() - 1];
        let sorted = format!("{{\"entries\":{list},\"format\":\"lensplane-history\",\"note\":[1],\"schema\":2}}");
        assert_eq!(read_export(&sorted), Ok(vec![e]));
    }

    #[test]
    fn bad_files_are_refused_with_a_reason() {
        let refused = |text: &str| match read_export(text) {
            Err(StoreError::BadImport(why)) => why,
            other => panic!("{text}: {other:?}"),
        };
        let file = |schema: &str, entries: &str| {
            format!("{{\"format\":\"lensplane-history\",\"schema\":{schema},\"entries\":{entries}}}")
        };
        assert_eq!(refused("<html>"), BadFile::NotJson);
        assert_eq!(refused("these are not the droids"), BadFile::NotJson);
        assert_eq!(refused(&(to_json(&[]) + " x")), BadFile::NotJson);
        assert_eq!(refused("{\"entries\":[]}"), BadFile::NotExport);
        assert_eq!(refused("[1,2]"), BadFile::NotJson);
        assert_eq!(
            refused("{\"format\":\"other\",\"schema\":2,\"entries\":[]}"),
            BadFile::NotExport
        );
        assert_eq!(
            refused("{\"format\":7,\"schema\":2,\"entries\":[]}"),
            BadFile::NotExport
        );
        assert_eq!(refused(&file("7", "[]")), BadFile::Newer);
        // A newer version's entries may be shaped differently: the version is what the user hears.
        assert_eq!(refused(&file("7", "[{\"id\":1}]")), BadFile::Newer);
        assert_eq!(refused(&file("1", "[]")), BadFile::Unsupported);
        assert_eq!(refused(&file("\"2\"", "[]")), BadFile::Unsupported);
        assert_eq!(refused(&file("2", "{}")), BadFile::NoEntries);
        assert_eq!(refused(&file("2", "[{\"id\":1}]")), BadFile::Incomplete(1));
        let good = to_json(&[entry("a", MAY, "", 1)]);
        let second_broken = good.replace("}]}]}", "}]},{\"id\":\"b\"}]}");
        assert_eq!(refused(&second_broken), BadFile::Incomplete(2));
        let mut bad = entry("x", MAY, "", 1);
        bad.label = "x".repeat(61);
        let unknown = to_json(&[entry("a", MAY, "", 1)]).replace("\"p\":\"vertex\"", "\"p\":\"elsewhere\"");
        assert_eq!(refused(&unknown), BadFile::Invalid(Invalid::Destination("a".into())));
        assert_eq!(
            refused(&to_json(&[entry("ok", MAY, "", 1), bad])),
            BadFile::Invalid(Invalid::Label("x".into()))
        );
        let huge = format!(
            "{{\"format\":\"lensplane-history\",\"schema\":2,\"pad\":\"{}\"}}",
            "x".repeat(IMPORT_MAX)
        );
        assert_eq!(read_export(&huge), Err(StoreError::TooLarge));
    }

    #[test]
    fn unreadable_data_exports_exactly_as_found() {
        let kept = vec![("lensplane.history".to_string(), "{\"sch".to_string())];
        let text = unreadable_json(&kept);
        let back: serde_json::Value = serde_json::from_str(&text).unwrap();
        assert_eq!(back["kept"][0][1], "{\"sch");
        assert_eq!(back["format"], "lensplane-unreadable");
    }
}
