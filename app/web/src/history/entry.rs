//! A saved calculation as the app holds it, and the checks an entry read
//! from storage or from a file must pass before it is kept.

use crate::link::Destination;
use lensplane_core::Eye;
use std::fmt;

/// Longest label kept (the field allows 60 characters).
pub const LABEL_MAX: usize = 60;
/// Longest text of any other stored field.
const FIELD_MAX: usize = 400;
/// Longest id, in bytes.
const ID_MAX: usize = 40;

/// One eye of a saved calculation, as the practitioner reads it.
#[derive(Clone, Debug, PartialEq)]
pub struct EyeSummary {
    pub eye: Eye,
    /// The prescription entered, in trade notation.
    pub input: String,
    /// The main result, in trade notation (e.g. the compensated prescription).
    pub result: String,
    /// The orderable value, when the calculation has one.
    pub order: Option<String>,
}

/// One saved calculation. Build it with [`Entry::new`], which also indexes
/// it for the filter (so a changed entry is built anew, not edited).
#[derive(Clone, Debug, PartialEq)]
pub struct Entry {
    /// Unique in the history.
    pub id: String,
    /// When it was saved: milliseconds since 1970-01-01 UTC.
    pub saved_at_ms: i64,
    /// The calculation (always a calculator: see [`Destination::is_calculator`]).
    pub destination: Destination,
    /// The calculation's inputs in the link format, without `?`: opens it again.
    pub query: String,
    /// Optional label (no patient identifiers).
    pub label: String,
    /// One or two eyes; none for a calculation without eyes
    /// ([`Destination::has_eyes`]: the conversion chart).
    pub eyes: Vec<EyeSummary>,
    /// What an entry without eyes shows instead, in one line (a chart's
    /// planes, powers and ladder); empty for the others.
    pub summary: String,
    /// What the filter searches (never stored): see [`super::search::index`].
    search: String,
}

/// Why an entry read from storage or from a file cannot be kept. Its text
/// finishes the sentence "The file was not imported: …".
#[derive(Clone, Debug, PartialEq)]
pub enum Invalid {
    /// The id is empty or longer than 40 bytes.
    Id,
    /// A time outside 2000–2199 (the entry's id).
    Date(String),
    /// A calculation Lensplane does not know.
    Destination(String),
    /// A label longer than [`LABEL_MAX`] characters.
    Label(String),
    /// No eye, more than two, or an overlong query.
    Calculation(String),
    /// An eye that is neither R nor L, or an overlong text.
    Eye(String),
}

impl fmt::Display for Invalid {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let (id, what) = match self {
            Invalid::Id => return f.write_str("an entry has no usable id"),
            Invalid::Date(id) => (id, "has an impossible date"),
            Invalid::Destination(id) => (id, "names an unknown panel"),
            Invalid::Label(id) => (id, "has a label longer than 60 characters"),
            Invalid::Calculation(id) => (id, "has no usable calculation"),
            Invalid::Eye(id) => (id, "has an unreadable eye"),
        };
        write!(f, "entry {id} {what}")
    }
}

/// A text of at most `max` characters (one of at most `max` bytes is).
fn fits(s: &str, max: usize) -> bool {
    s.len() <= max || s.chars().count() <= max
}

impl Entry {
    pub fn new(
        id: String,
        saved_at_ms: i64,
        destination: Destination,
        query: String,
        label: String,
        eyes: Vec<EyeSummary>,
    ) -> Entry {
        let search = super::search::index(&label, destination, &eyes);
        Entry {
            id,
            saved_at_ms,
            destination,
            query,
            label,
            eyes,
            summary: String::new(),
            search,
        }
    }

    /// The same entry with `summary` (indexed for the filter too); an
    /// empty one leaves it as it was.
    pub fn with_summary(mut self, summary: String) -> Entry {
        if !summary.is_empty() {
            super::search::index_summary(&mut self.search, &summary);
            self.summary = summary;
        }
        self
    }

    /// The filter's search text.
    pub fn search_text(&self) -> &str {
        &self.search
    }

    /// Whether `id` can be an entry's id.
    pub fn check_id(id: &str) -> Result<(), Invalid> {
        if id.is_empty() || id.len() > ID_MAX {
            Err(Invalid::Id)
        } else {
            Ok(())
        }
    }

    /// Checks what the types do not: the id, the date (2000–2199), one or
    /// two eyes (none for a calculation without eyes), and the length of
    /// every text.
    pub fn check(&self) -> Result<(), Invalid> {
        Entry::check_id(&self.id)?;
        let id = || self.id.clone();
        if !(946_684_800_000..7_258_032_000_000).contains(&self.saved_at_ms) {
            return Err(Invalid::Date(id()));
        }
        if !fits(&self.label, LABEL_MAX) {
            return Err(Invalid::Label(id()));
        }
        let eyes_fit = if self.destination.has_eyes() {
            (1..=2).contains(&self.eyes.len())
        } else {
            self.eyes.is_empty()
        };
        if !fits(&self.query, FIELD_MAX) || !fits(&self.summary, FIELD_MAX) || !eyes_fit {
            return Err(Invalid::Calculation(id()));
        }
        let texts = |e: &EyeSummary| {
            [&e.input, &e.result]
                .into_iter()
                .chain(&e.order)
                .all(|s| fits(s, FIELD_MAX))
        };
        if !self.eyes.iter().all(texts) {
            return Err(Invalid::Eye(id()));
        }
        Ok(())
    }
}

/// "1 entry", "2 entries".
pub fn entries_words(n: usize) -> String {
    if n == 1 {
        "1 entry".into()
    } else {
        format!("{n} entries")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    pub fn eye(eye: Eye) -> EyeSummary {
        EyeSummary {
            eye,
            input: "-8.00 -2.00 ×180".into(),
            result: "-7.30 -1.63 ×180".into(),
            order: None,
        }
    }

    #[test]
    fn entries_are_checked_field_by_field() {
        let ok = Entry::new(
            "x".into(),
            1_714_745_100_000,
            Destination::Vertex,
            String::new(),
            String::new(),
            vec![eye(Eye::Right)],
        );
        assert_eq!(ok.check(), Ok(()));
        let refused = |f: &dyn Fn(&mut Entry)| {
            let mut e = ok.clone();
            f(&mut e);
            e.check().expect_err("should be refused").to_string()
        };
        assert_eq!(refused(&|e| e.id.clear()), "an entry has no usable id");
        assert_eq!(refused(&|e| e.id = "i".repeat(41)), "an entry has no usable id");
        assert_eq!(refused(&|e| e.saved_at_ms = 0), "entry x has an impossible date");
        assert_eq!(
            refused(&|e| e.saved_at_ms = 7_258_032_000_000),
            "entry x has an impossible date"
        );
        assert_eq!(
            refused(&|e| e.label = "x".repeat(61)),
            "entry x has a label longer than 60 characters"
        );
        assert_eq!(refused(&|e| e.eyes.clear()), "entry x has no usable calculation");
        assert_eq!(
            refused(&|e| e.eyes = vec![eye(Eye::Right); 3]),
            "entry x has no usable calculation"
        );
        assert_eq!(
            refused(&|e| e.query = "q".repeat(401)),
            "entry x has no usable calculation"
        );
        assert_eq!(
            refused(&|e| e.eyes[0].order = Some("o".repeat(401))),
            "entry x has an unreadable eye"
        );
        assert_eq!(
            Invalid::Destination("x".into()).to_string(),
            "entry x names an unknown panel"
        );
        // Limits are characters, not bytes: 60 multi-byte characters fit.
        let mut long = ok.clone();
        long.label = "é".repeat(60);
        assert_eq!(long.check(), Ok(()));
    }

    #[test]
    fn a_chart_is_kept_without_eyes_and_the_others_need_one_or_two() {
        let chart = Entry::new(
            "c".into(),
            1_714_745_100_000,
            Destination::Chart,
            "from=12&to=0".into(),
            String::new(),
            vec![],
        )
        .with_summary("12 mm → cornea (contact lens)".into());
        assert_eq!(chart.check(), Ok(()));
        assert!(
            chart.search_text().contains("12 mm → cornea"),
            "{}",
            chart.search_text()
        );
        let mut with_eye = chart.clone();
        with_eye.eyes = vec![eye(Eye::Right)];
        assert_eq!(with_eye.check(), Err(Invalid::Calculation("c".into())));
        let mut long = chart.clone();
        long.summary = "s".repeat(401);
        assert_eq!(long.check(), Err(Invalid::Calculation("c".into())));
        let mut vertex = chart.clone();
        vertex.destination = Destination::Vertex;
        assert_eq!(vertex.check(), Err(Invalid::Calculation("c".into())));
    }

    #[test]
    fn counts_read_as_words() {
        assert_eq!(
            [entries_words(0), entries_words(1), entries_words(2)],
            ["0 entries", "1 entry", "2 entries"]
        );
    }
}
