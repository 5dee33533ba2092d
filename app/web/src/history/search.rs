//! The filter: lower case without Unicode's tables, trade notation read as
//! typed (× as x, − as -, no °), each entry's search text, and the search.

use super::entry::{Entry, EyeSummary};
use crate::link::Destination;
use std::borrow::Cow;

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

/// Appends `text` folded: lower case, × as x, − and – as -, no degree
/// sign, and each run of spaces as one space (none at the start).
fn fold_into(out: &mut String, text: &str) {
    let start = out.len();
    let mut space = false;
    for c in lowercase(text).chars() {
        match c {
            '°' => {}
            c if c.is_whitespace() => space = out.len() > start,
            c => {
                if space {
                    out.push(' ');
                    space = false;
                }
                out.push(match c {
                    '×' => 'x',
                    '−' | '–' => '-',
                    c => c,
                });
            }
        }
    }
}

/// `text` folded as the filter reads it (see [`index`]).
pub fn fold(text: &str) -> String {
    let mut out = String::new();
    fold_into(&mut out, text);
    out
}

/// An entry's search text: one folded line per field (label, calculation,
/// then each eye's letter, entered, result and orderable value), so a
/// phrase never matches across two fields.
pub fn index(label: &str, destination: Destination, eyes: &[EyeSummary]) -> String {
    let mut s = String::with_capacity(96);
    let mut line = |text: &str| {
        fold_into(&mut s, text);
        s.push('\n');
    };
    line(label);
    line(destination.title());
    for eye in eyes {
        line(crate::widgets::eye_words(eye.eye).1);
        line(&eye.input);
        line(&eye.result);
        line(eye.order.as_deref().unwrap_or(""));
    }
    s
}

/// Adds an entry's one-line summary (an entry without eyes) to its search
/// text, as one more line.
pub fn index_summary(search: &mut String, summary: &str) {
    fold_into(search, summary);
    search.push('\n');
}

/// Indices of the entries whose label, calculation or one of whose powers
/// contains `text` (case, spacing, × and − as typed do not matter), of the
/// calculation `only` if one is given, newest first. The text is one
/// phrase: "room 2" does not match a label "room 3" with a power of -2.00.
pub fn filter(entries: &[Entry], text: &str, only: Option<Destination>) -> Vec<usize> {
    let needle = fold(text);
    (0..entries.len())
        .rev()
        .filter(|&i| {
            let e = &entries[i];
            only.is_none_or(|d| e.destination == d) && e.search_text().contains(needle.as_str())
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::Eye;

    fn eye(eye: Eye, input: &str, order: Option<&str>) -> EyeSummary {
        EyeSummary {
            eye,
            input: input.into(),
            result: "-7.30 -1.63 ×180".into(),
            order: order.map(Into::into),
        }
    }

    #[test]
    fn search_text_reads_typographic_signs_as_typed_ones() {
        let e = index(
            "Bench B",
            Destination::Vertex,
            &[eye(Eye::Right, "-8.00 -2.00 ×180", None)],
        );
        assert!(e.contains("-8.00 -2.00 x180"), "{e}");
        assert!(e.contains("bench b") && e.contains("vertex"));
        let spaced = index(
            "  Room\t 2 ",
            Destination::Near,
            &[eye(Eye::Left, "−8.00 –2.00 × 180°", None)],
        );
        assert_eq!(spaced, "room 2\nnear\nl\n-8.00 -2.00 x 180\n-7.30 -1.63 x180\n\n");
        assert_eq!(fold("−2.00 × 90°"), "-2.00 x 90");
        assert_eq!(fold("  room   2 "), "room 2");
    }

    #[test]
    fn lowercase_keeps_trade_notation_and_lowers_any_script() {
        assert!(matches!(lowercase("-8.00 -2.00 ×180 → 90°"), Cow::Borrowed(_)));
        assert_eq!(lowercase("Room B −2.00 DS"), "room b −2.00 ds");
        assert_eq!(lowercase("Salle É, ΘΑΛΑΜΟΣ 2, Кабинет"), "salle é, θαλαμος 2, кабинет");
        assert_eq!(fold("Bench É × 90°"), "bench é x 90");
    }

    #[test]
    fn filter_matches_one_phrase_newest_first_and_by_calculation() {
        let at = |id: &str, d: Destination, label: &str| {
            let eyes = vec![eye(Eye::Right, "-8.00 -2.00 ×180", Some("-7.25 -1.75 ×180"))];
            Entry::new(id.into(), 1_714_745_100_000, d, String::new(), label.into(), eyes)
        };
        let entries = [
            at("a", Destination::Vertex, "Room 2"),
            at("b", Destination::Vertex, "room 3"),
            at("c", Destination::Near, "Room 2 near"),
        ];
        let found = |t: &str, d: Option<Destination>| {
            filter(&entries, t, d)
                .into_iter()
                .map(|i| entries[i].id.as_str())
                .collect::<Vec<_>>()
        };
        assert_eq!(found("", None), ["c", "b", "a"]);
        assert_eq!(found("ROOM 2", None), ["c", "a"]);
        assert_eq!(found("room", Some(Destination::Vertex)), ["b", "a"]);
        assert_eq!(found("-2.00 x180", None), ["c", "b", "a"]);
        assert_eq!(found("-7.25", Some(Destination::Near)), ["c"]);
        assert_eq!(found("  room   2 ", None), ["c", "a"]);
        assert_eq!(found("sph. equivalent", None), Vec::<&str>::new());
        assert!(found("room 2 -8.00", None).is_empty(), "one phrase, not words anywhere");
        assert!(found("+5.00", None).is_empty());
    }
}
