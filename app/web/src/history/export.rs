//! Export (JSON that re-imports, CSV for spreadsheets), import validation,
//! and the local date and time shown for an entry.

use super::json::{self, pairs, Value};
use super::schema::{panel_of, panel_words, Entry, SCHEMA};
use super::store::{Problem, IMPORT_MAX};
use chrono::{DateTime, Datelike, NaiveDateTime, TimeZone, Timelike};

const FORMAT: &str = "lensplane-history";

/// The whole history as a re-importable JSON file.
pub fn to_json(entries: &[Entry]) -> String {
    let mut out = format!("{{\"format\":\"{FORMAT}\",\"schema\":{SCHEMA},\"entries\":[");
    for (i, e) in entries.iter().enumerate() {
        if i > 0 {
            out.push(',');
        }
        e.write(&mut out);
    }
    out.push_str("]}");
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

/// What an import larger than [`IMPORT_MAX`] is told.
pub const TOO_LARGE: &str = "The file was not imported: it is larger than 6 MB. Nothing was changed.";

/// "1 entry", "2 entries".
pub fn entries_words(n: usize) -> String {
    if n == 1 {
        "1 entry".into()
    } else {
        format!("{n} entries")
    }
}

/// Reads an exported file; every entry is checked before anything is used.
pub fn parse_import(text: &str) -> Result<Vec<Entry>, Problem> {
    let refuse = |why: String| Err(format!("The file was not imported: {why}. Nothing was changed."));
    if text.len() > IMPORT_MAX {
        return Err(TOO_LARGE.into());
    }
    let file = match json::parse(text) {
        Ok(v) => v,
        Err(_) => return refuse("it is not a Lensplane history export (JSON)".into()),
    };
    if file.get("format").and_then(Value::str) != Some(FORMAT) {
        return refuse("it is not a Lensplane history export".into());
    }
    match file.get("schema").and_then(Value::int) {
        Some(SCHEMA) => {}
        Some(s) if s > SCHEMA => return refuse("it was made by a newer version of Lensplane; update first".into()),
        _ => return refuse("its format version is not supported".into()),
    }
    let Some(Value::Arr(list)) = file.take("entries") else {
        return refuse("it is damaged (no entries)".into());
    };
    let mut entries = Vec::with_capacity(list.len());
    for (n, v) in list.into_iter().enumerate() {
        let Some(e) = Entry::read(v) else {
            return refuse(format!("it is damaged (entry {} is incomplete)", n + 1));
        };
        if let Some(p) = e.problem() {
            return refuse(p);
        }
        entries.push(e);
    }
    Ok(entries)
}

/// The local date and time of a stored UTC time.
pub fn local<Tz: TimeZone>(t: i64, tz: &Tz) -> NaiveDateTime {
    DateTime::from_timestamp_millis(t)
        .unwrap_or_default()
        .with_timezone(tz)
        .naive_local()
}

const MONTHS: [&str; 12] = [
    "Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec",
];
const DAYS: [&str; 7] = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"];

/// "Fri 3 May 2024".
pub fn day_words(d: NaiveDateTime) -> String {
    format!(
        "{} {} {} {}",
        DAYS[d.weekday().num_days_from_monday() as usize],
        d.day(),
        MONTHS[d.month0() as usize],
        d.year()
    )
}

/// "2024-05-03".
pub fn iso_date(d: NaiveDateTime) -> String {
    format!("{:04}-{:02}-{:02}", d.year(), d.month(), d.day())
}

/// "14:05".
pub fn clock(d: NaiveDateTime) -> String {
    format!("{:02}:{:02}", d.hour(), d.minute())
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

/// One row per eye per calculation, newest first, local times, trade notation.
/// Starts with a byte-order mark so spreadsheets read the × sign.
pub fn to_csv<Tz: TimeZone>(entries: &[Entry], tz: &Tz) -> String {
    let mut out = String::from("\u{feff}date,time,panel,label,eye,entered,result,orderable\r\n");
    for e in entries.iter().rev() {
        let when = local(e.t, tz);
        let panel = panel_of(&e.p).map(panel_words).unwrap_or("");
        for eye in &e.e {
            let cells = [
                iso_date(when),
                clock(when),
                field(panel, false),
                field(&e.l, true),
                field(&eye.eye, false),
                field(&eye.input, false),
                field(&eye.result, false),
                field(eye.order.as_deref().unwrap_or(""), false),
            ];
            out.push_str(&cells.join(","));
            out.push_str("\r\n");
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::super::store::{Memory, Store};
    use super::super::EyeSummary;
    use super::*;
    use chrono::FixedOffset;

    const MAY: i64 = 1_714_745_100_000; // 2024-05-03T14:05:00Z

    fn entry(id: &str, t: i64, label: &str, eyes: usize) -> Entry {
        let r = EyeSummary {
            eye: "R".into(),
            input: "-8.00 -2.00 ×180".into(),
            result: "-7.30 -1.63 ×180".into(),
            order: Some("-7.25 -1.75 ×180".into()),
        };
        let l = EyeSummary {
            eye: "L".into(),
            input: "-4.00 DS".into(),
            result: "-3.82 DS".into(),
            order: None,
        };
        Entry::new(
            id.into(),
            t,
            "vertex".into(),
            "r=-8.00".into(),
            label.into(),
            [r, l].into_iter().take(eyes).collect(),
        )
    }

    #[test]
    fn csv_has_one_row_per_eye_in_local_time_and_trade_notation() {
        let entries = [
            entry("a", MAY, "Room 2, bench", 2),
            entry("b", MAY + 3_600_000, "=SUM(A1)", 1),
        ];
        let two_hours_east = FixedOffset::east_opt(2 * 3600).unwrap();
        let csv = to_csv(&entries, &two_hours_east);
        assert_eq!(
            csv,
            "\u{feff}date,time,panel,label,eye,entered,result,orderable\r\n\
             2024-05-03,17:05,Vertex,'=SUM(A1),R,-8.00 -2.00 ×180,-7.30 -1.63 ×180,-7.25 -1.75 ×180\r\n\
             2024-05-03,16:05,Vertex,\"Room 2, bench\",R,-8.00 -2.00 ×180,-7.30 -1.63 ×180,-7.25 -1.75 ×180\r\n\
             2024-05-03,16:05,Vertex,\"Room 2, bench\",L,-4.00 DS,-3.82 DS,\r\n"
        );
    }

    #[test]
    fn local_dates_cross_midnight_by_the_offset() {
        let west = FixedOffset::west_opt(15 * 3600).unwrap();
        let d = local(MAY, &west);
        assert_eq!(
            (iso_date(d), clock(d), day_words(d)),
            ("2024-05-02".into(), "23:05".into(), "Thu 2 May 2024".into())
        );
    }

    #[test]
    fn json_export_reimports_completely() {
        let entries = vec![entry("a", MAY, "Room <b>2</b>", 2), entry("b", MAY + 1, "", 1)];
        let back = parse_import(&to_json(&entries)).unwrap();
        assert_eq!(back, entries);
        assert!(to_json(&entries).starts_with("{\"format\":\"lensplane-history\",\"schema\":2,"));
    }

    #[test]
    fn bad_files_are_refused_with_a_reason() {
        let refused = |text: &str| parse_import(text).unwrap_err();
        assert!(refused("<html>").contains("not a Lensplane history export (JSON)"));
        assert!(refused("{\"entries\":[]}").contains("not a Lensplane history export"));
        assert!(refused("{\"format\":\"lensplane-history\",\"schema\":7,\"entries\":[]}").contains("newer version"));
        assert!(
            refused("{\"format\":\"lensplane-history\",\"schema\":2,\"entries\":[{\"id\":1}]}")
                .contains("entry 1 is incomplete")
        );
        let mut bad = entry("x", MAY, "", 1);
        bad.p = "elsewhere".into();
        assert!(refused(&to_json(&[bad])).contains("unknown panel"));
        let huge = format!(
            "{{\"format\":\"lensplane-history\",\"schema\":2,\"pad\":\"{}\"}}",
            "x".repeat(IMPORT_MAX)
        );
        assert!(refused(&huge).contains("larger than 6 MB"));
        for t in ["<html>", &huge] {
            assert!(refused(t).ends_with("Nothing was changed."));
        }
    }

    #[test]
    fn import_skips_duplicates_and_a_bad_file_changes_nothing() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "", 1)).unwrap();
        let file = to_json(&[
            entry("a", MAY, "", 1),
            entry("b", MAY + 1, "", 1),
            entry("b", MAY + 1, "", 1),
        ]);
        let report = s.import(&file).unwrap();
        assert_eq!((report.added, report.duplicates), (1, 2));
        let again = s.import(&file).unwrap();
        assert_eq!((again.added, again.duplicates), (0, 3));
        let before = s.backend().map.clone();
        let mut bad = entry("c", MAY, "", 1);
        bad.l = "x".repeat(61);
        assert!(s.import(&to_json(&[entry("d", MAY, "", 1), bad])).is_err());
        assert_eq!(s.entries().len(), 2);
        assert_eq!(s.backend().map, before);
        // Full storage: nothing imported, nothing lost.
        s.backend_mut().quota = Some(s.backend().used());
        let err = s.import(&to_json(&[entry("e", MAY + 9, "", 1)])).unwrap_err();
        assert!(err.starts_with("Nothing was imported"), "{err}");
        assert_eq!(s.entries().len(), 2);
        assert_eq!(s.backend().map, before);
    }

    #[test]
    fn counts_read_as_words_and_the_size_limit_matches_its_message() {
        assert_eq!(
            [entries_words(0), entries_words(1), entries_words(2)],
            ["0 entries", "1 entry", "2 entries"]
        );
        assert_eq!(IMPORT_MAX, 6_000_000);
        assert!(TOO_LARGE.contains("larger than 6 MB"));
    }

    #[test]
    fn one_id_twice_in_a_file_is_imported_once_even_at_different_times() {
        let mut s = Store::open(Memory::default());
        let file = to_json(&[
            entry("z", MAY + 7_200_000, "later", 1),
            entry("m", MAY + 60_000, "", 1),
            entry("z", MAY, "earlier", 1),
        ]);
        let report = s.import(&file).unwrap();
        assert_eq!((report.added, report.duplicates), (2, 1));
        let kept: Vec<(&str, &str)> = s.entries().iter().map(|e| (e.id.as_str(), e.l.as_str())).collect();
        assert_eq!(kept, [("z", "earlier"), ("m", "")]);
    }

    #[test]
    fn unreadable_data_exports_exactly_as_found() {
        let kept = vec![("lensplane.history".to_string(), "{\"sch".to_string())];
        let text = unreadable_json(&kept);
        let back: serde_json::Value = serde_json::from_str(&text).unwrap();
        assert_eq!(back["kept"][0][1], "{\"sch");
    }
}
