//! The durable store: entries in memory, written through a small storage
//! interface so the same logic runs against localStorage in the browser and
//! an in-memory backend (with fault injection) in native tests.
//!
//! In storage (schema 2):
//!
//! ```text
//! lensplane.history        manifest {"schema":2,"next":N,"chunks":[["2024-05","lensplane.history.2.7"],…]}
//! lensplane.history.2.<n>  one month (UTC) of entries, oldest first: [entry, …] (see codec)
//! lensplane.history.aside  unreadable data kept aside: [["key","text as found"],…]
//! lensplane.history.1      schema 1's single list, migrated when there is no manifest
//! ```
//!
//! Writes never leave a state that loses earlier entries: a changed month is
//! written under a fresh key first, then the manifest (one key, replaced in
//! one step) is switched to it, and only then is the superseded key removed.
//! A failure at any step leaves the previous manifest and every key it names
//! untouched, and the in-memory history is rolled back to match.

use super::calendar::{month_of, month_span};
use super::codec::{read_list, write_entries, MonthReader, SCHEMA};
use super::entry::{entries_words, Entry};
use super::error::StoreError;
use super::json::{pairs, read_pairs, Reader};
use std::fmt;

pub const MANIFEST_KEY: &str = "lensplane.history";
pub const CHUNK_PREFIX: &str = "lensplane.history.2.";
pub const ASIDE_KEY: &str = "lensplane.history.aside";
pub const V1_KEY: &str = "lensplane.history.1";
pub const PERSIST_ASKED_KEY: &str = "lensplane.persist-asked";

/// A key/value text store (localStorage in the browser). A read fails with
/// [`StoreError::Unavailable`], a write with [`StoreError::Full`] or
/// [`StoreError::Refused`].
pub trait Backend {
    fn read(&self, key: &str) -> Result<Option<String>, StoreError>;
    fn write(&mut self, key: &str, value: &str) -> Result<(), StoreError>;
    fn remove(&mut self, key: &str);
    /// Every key present (to recover months when the manifest is unreadable).
    fn keys(&self) -> Vec<String>;
}

/// Whether what is saved outlives the session.
#[derive(Clone, Debug, PartialEq)]
pub enum Mode {
    Durable,
    /// Kept in memory only, for this reason ([`StoreError::Unavailable`],
    /// [`StoreError::Newer`] or [`StoreError::NoRoomAside`]).
    SessionOnly(StoreError),
}

/// Something the user should be told about the stored history, once.
#[derive(Clone, Debug, PartialEq)]
pub enum Notice {
    /// The history is kept for this session only, and why.
    SessionOnly(StoreError),
    /// Unreadable data was found and is kept aside (until the user removes it).
    KeptAside,
    /// Entries found in the months still present when the manifest was unreadable.
    Recovered(usize),
    /// A month the manifest names was missing from storage.
    Missing(String),
    /// Schema 1's entries were read but could not be stored in schema 2 yet.
    NotUpgraded(StoreError),
}

impl fmt::Display for Notice {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Notice::SessionOnly(why) => f.write_str(&why.message(super::error::Action::Save)),
            Notice::KeptAside => f.write_str("Some stored history could not be read. It has been kept aside, untouched: export it below to keep a copy. Everything else works as usual."),
            Notice::Recovered(n) => write!(f, "Recovered {}.", entries_words(*n)),
            Notice::Missing(month) => write!(f, "The saved history of {month} was missing from storage."),
            Notice::NotUpgraded(why) => write!(
                f,
                "The history was upgraded for this session, but could not be stored in the new form yet: {why}."
            ),
        }
    }
}

/// The manifest: which key holds which month, and the number the next key gets.
#[derive(Clone, Debug, Default, PartialEq)]
struct Manifest {
    next: u64,
    chunks: Vec<(String, String)>,
}

impl Manifest {
    fn to_json(&self) -> String {
        format!(
            "{{\"schema\":{SCHEMA},\"next\":{},\"chunks\":{}}}",
            self.next,
            pairs(&self.chunks)
        )
    }

    /// The `schema` a stored manifest names, if its text is JSON at all
    /// (read apart from the rest, so a newer layout is recognised whatever it holds).
    fn schema_of(text: &str) -> Option<i64> {
        let mut schema = None;
        let mut r = Reader::new(text);
        r.object(0, |r, k| match k {
            "schema" if r.at_number() => r.int().map(|s| schema = Some(s)),
            _ => r.skip_value(1),
        })
        .and_then(|()| r.end())
        .ok()?;
        schema
    }

    /// A schema 2 manifest.
    fn read(text: &str) -> Option<Manifest> {
        let (mut next, mut chunks) = (None, None);
        let mut r = Reader::new(text);
        r.object(0, |r, k| {
            match k {
                "next" => next = Some(r.int()?),
                "chunks" => chunks = Some(r.pairs(1)?),
                _ => r.skip_value(1)?,
            }
            Ok(())
        })
        .and_then(|()| r.end())
        .ok()?;
        Some(Manifest {
            next: u64::try_from(next?).ok()?,
            chunks: chunks?,
        })
    }
}

/// Oldest first, by time then id (one sort for the whole store keeps the wasm small).
fn sort(entries: &mut [Entry]) {
    entries.sort_unstable_by(|a, b| (a.saved_at_ms, &a.id).cmp(&(b.saved_at_ms, &b.id)));
}

/// The months (UTC) of `entries`, without repeats.
fn months<'a>(entries: impl Iterator<Item = &'a Entry>) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    for e in entries {
        let m = month_of(e.saved_at_ms);
        if !out.contains(&m) {
            out.push(m);
        }
    }
    out
}

/// What importing did.
#[derive(Debug, PartialEq)]
pub struct ImportReport {
    pub added: usize,
    pub duplicates: usize,
}

pub struct Store<B: Backend> {
    backend: B,
    mode: Mode,
    /// Oldest first, by time then id.
    entries: Vec<Entry>,
    manifest: Manifest,
    /// Unreadable data kept aside: (where it was, the text as found).
    aside: Vec<(String, String)>,
    notices: Vec<Notice>,
    /// Months the manifest names that are not read yet, oldest first (the
    /// newest is read first); see [`Store::read_more`].
    unread: Vec<(String, String)>,
    /// The month being read: (month, key, reader, entries so far).
    reading: Option<(String, String, MonthReader, Vec<Entry>)>,
    /// Months found unreadable while reading, set aside once all are read.
    unreadable: Vec<(String, String)>,
}

impl<B: Backend> Store<B> {
    /// Opens whatever is stored and reads it all. Never fails: problems
    /// become notices and a session-only mode, and unreadable data is kept aside.
    pub fn open(backend: B) -> Store<B> {
        let mut store = Store::open_unread(backend);
        store.finish_reading();
        store
    }

    /// Opens the store reading only the manifest, and leaves the months to
    /// be read in slices by [`Store::read_more`]; until then
    /// [`Store::entries`] holds the newest months read so far. Every change
    /// reads the rest first, so a change never writes a manifest that lacks
    /// a month not yet read.
    pub fn open_unread(backend: B) -> Store<B> {
        let mut store = Store {
            backend,
            mode: Mode::Durable,
            entries: Vec::new(),
            manifest: Manifest::default(),
            aside: Vec::new(),
            notices: Vec::new(),
            unread: Vec::new(),
            reading: None,
            unreadable: Vec::new(),
        };
        store.load();
        store
    }

    /// Whether months remain to be read.
    pub fn is_reading(&self) -> bool {
        !self.unread.is_empty() || self.reading.is_some()
    }

    /// Reads up to `budget` more entries, newest month first. Returns true
    /// when [`Store::entries`] changed (a month was completed, or reading
    /// ended and the months found unreadable were set aside).
    pub fn read_more(&mut self, budget: usize) -> bool {
        if !self.is_reading() {
            return false;
        }
        let mut changed = false;
        let mut left = budget;
        while left > 0 {
            if self.reading.is_none() {
                let Some((month, key)) = self.unread.pop() else { break };
                match self.backend.read(&key) {
                    Ok(Some(text)) => self.reading = Some((month, key, MonthReader::new(text), Vec::new())),
                    // A month the manifest names but storage lost: nothing to keep.
                    Ok(None) | Err(_) => self.notices.push(Notice::Missing(month)),
                }
                continue;
            }
            let (_, _, reader, list) = self.reading.as_mut().expect("a month is being read");
            let before = list.len();
            let done = reader.read(left, list);
            left = left.saturating_sub((list.len() - before).max(1));
            if done == Ok(false) {
                continue;
            }
            let (month, key, reader, mut list) = self.reading.take().expect("a month is being read");
            if done.is_ok() {
                sort(&mut list);
                list.append(&mut self.entries);
                self.entries = list;
                self.manifest.chunks.push((month, key));
                changed = true;
            } else {
                self.unreadable.push((key, reader.into_text()));
            }
        }
        if !self.is_reading() {
            self.manifest.chunks.sort();
            sort(&mut self.entries);
            let unreadable = std::mem::take(&mut self.unreadable);
            if !unreadable.is_empty() {
                self.set_aside(unreadable);
            }
            self.note_aside();
            changed = true;
        }
        changed
    }

    /// Reads every month not read yet.
    pub fn finish_reading(&mut self) {
        while self.is_reading() {
            self.read_more(usize::MAX);
        }
    }

    /// Data kept aside is mentioned until the user removes it.
    fn note_aside(&mut self) {
        let told = |n: &Notice| matches!(n, Notice::KeptAside | Notice::SessionOnly(StoreError::NoRoomAside));
        if !self.aside.is_empty() && !self.notices.iter().any(told) {
            self.notices.push(Notice::KeptAside);
        }
    }

    fn session_only(&mut self, why: StoreError) {
        self.mode = Mode::SessionOnly(why.clone());
        self.notices.push(Notice::SessionOnly(why));
    }

    fn load(&mut self) {
        let manifest = match self.backend.read(MANIFEST_KEY) {
            Err(_) => return self.session_only(StoreError::Unavailable),
            Ok(m) => m,
        };
        if let Ok(Some(text)) = self.backend.read(ASIDE_KEY) {
            // Even the aside key may be damaged: then its text is kept as it is.
            self.aside = read_pairs(&text).unwrap_or_else(|| vec![(ASIDE_KEY.to_string(), text)]);
        }
        let mut unreadable: Vec<(String, String)> = Vec::new();
        match manifest {
            None => self.migrate_v1(&mut unreadable),
            Some(text) => match (Manifest::schema_of(&text), Manifest::read(&text)) {
                (Some(s), _) if s > SCHEMA => return self.session_only(StoreError::Newer),
                (Some(SCHEMA), Some(m)) => {
                    self.manifest.next = m.next;
                    self.unread = m.chunks;
                    self.unread.sort();
                }
                _ => unreadable.push((MANIFEST_KEY.into(), text)),
            },
        }
        let lost_manifest = unreadable.iter().any(|(k, _)| k == MANIFEST_KEY);
        if !unreadable.is_empty() {
            self.set_aside(unreadable);
        }
        if lost_manifest && self.mode == Mode::Durable {
            self.recover();
        }
        sort(&mut self.entries);
        self.note_aside();
    }

    /// With the manifest unreadable (and already kept aside), reads every
    /// month key still present, writes the entries found under a new
    /// manifest, and only then removes the keys they came from.
    fn recover(&mut self) {
        let keys: Vec<String> = self
            .backend
            .keys()
            .into_iter()
            .filter(|k| k.starts_with(CHUNK_PREFIX))
            .collect();
        let mut found: Vec<Entry> = Vec::new();
        let mut unreadable = Vec::new();
        for key in &keys {
            let n: u64 = key[CHUNK_PREFIX.len()..].parse().unwrap_or(0);
            self.manifest.next = self.manifest.next.max(n + 1);
            if let Ok(Some(text)) = self.backend.read(key) {
                match read_list(&text, false) {
                    Ok(list) => found.extend(list),
                    Err(_) => unreadable.push((key.clone(), text)),
                }
            }
        }
        if !unreadable.is_empty() {
            self.set_aside(unreadable);
        }
        if found.is_empty() {
            return;
        }
        sort(&mut found);
        found.dedup_by(|a, b| a.id == b.id);
        self.entries = found;
        if self.mode != Mode::Durable {
            // Nothing may be removed now: show what was found, store nothing.
            return;
        }
        match self.commit(months(self.entries.iter())) {
            Ok(()) => {
                for k in keys
                    .iter()
                    .filter(|k| !self.manifest.chunks.iter().any(|(_, c)| c == *k))
                {
                    self.backend.remove(k);
                }
                self.notices.push(Notice::Recovered(self.entries.len()));
            }
            Err(_) => self.session_only(StoreError::NoRoomAside),
        }
    }

    fn migrate_v1(&mut self, unreadable: &mut Vec<(String, String)>) {
        let Ok(Some(text)) = self.backend.read(V1_KEY) else {
            return;
        };
        let Ok(list) = read_list(&text, true) else {
            return unreadable.push((V1_KEY.into(), text));
        };
        self.entries = list;
        sort(&mut self.entries);
        // The old key goes only once the new layout holds everything.
        match self.commit(months(self.entries.iter())) {
            Ok(()) if self.mode == Mode::Durable => self.backend.remove(V1_KEY),
            Ok(()) => {}
            Err(e) => self.notices.push(Notice::NotUpgraded(e)),
        }
    }

    /// Keeps unreadable data under the aside key before removing it from
    /// where it was; if that cannot be written, nothing is removed and the
    /// history runs for this session only.
    fn set_aside(&mut self, found: Vec<(String, String)>) {
        let mut aside = self.aside.clone();
        aside.extend(found.iter().cloned());
        let written = self.backend.write(ASIDE_KEY, &pairs(&aside));
        self.aside = aside;
        if written.is_err() {
            return self.session_only(StoreError::NoRoomAside);
        }
        for (key, _) in &found {
            if key != MANIFEST_KEY {
                self.backend.remove(key);
            }
        }
        if found.iter().any(|(k, _)| k == MANIFEST_KEY) {
            // A fresh manifest replaces the unreadable one (already copied aside).
            self.manifest.chunks.clear();
            if self.backend.write(MANIFEST_KEY, &self.manifest.to_json()).is_err() {
                return self.session_only(StoreError::NoRoomAside);
            }
        }
        if !self.notices.contains(&Notice::KeptAside) {
            self.notices.push(Notice::KeptAside);
        }
    }

    /// Writes the months in `touched` from the entries in memory, then the
    /// manifest. On failure the stored state is as before and the caller
    /// rolls the memory back.
    fn commit(&mut self, touched: Vec<String>) -> Result<(), StoreError> {
        if self.mode != Mode::Durable {
            return Ok(());
        }
        let mut next = self.manifest.clone();
        let mut fresh: Vec<String> = Vec::new();
        let mut superseded: Vec<String> = Vec::new();
        for month in &touched {
            if let Some(pos) = next.chunks.iter().position(|(m, _)| m == month) {
                superseded.push(next.chunks.remove(pos).1);
            }
            // Entries are in time order: the month is one run of them.
            debug_assert!(self.entries.is_sorted_by_key(|e| e.saved_at_ms));
            let span = month_span(month).unwrap_or(0..0);
            let from = self.entries.partition_point(|e| e.saved_at_ms < span.start);
            let to = self.entries.partition_point(|e| e.saved_at_ms < span.end);
            if from == to {
                continue;
            }
            let key = format!("{CHUNK_PREFIX}{}", next.next);
            next.next += 1;
            let mut text = String::new();
            write_entries(&mut text, &self.entries[from..to]);
            fresh.push(key.clone());
            if let Err(e) = self.backend.write(&key, &text) {
                self.remove_all(&fresh);
                return Err(e);
            }
            next.chunks.push((month.clone(), key));
        }
        next.chunks.sort();
        if let Err(e) = self.backend.write(MANIFEST_KEY, &next.to_json()) {
            self.remove_all(&fresh);
            return Err(e);
        }
        self.remove_all(&superseded);
        self.manifest = next;
        Ok(())
    }

    fn remove_all(&mut self, keys: &[String]) {
        for k in keys {
            self.backend.remove(k);
        }
    }

    pub fn mode(&self) -> &Mode {
        &self.mode
    }

    /// What the user should be told about storage, since opening.
    pub fn notices(&self) -> &[Notice] {
        &self.notices
    }

    /// Every entry read so far, oldest first.
    pub fn entries(&self) -> &[Entry] {
        &self.entries
    }

    pub fn aside(&self) -> &[(String, String)] {
        &self.aside
    }

    pub fn backend(&self) -> &B {
        &self.backend
    }

    pub fn backend_mut(&mut self) -> &mut B {
        &mut self.backend
    }

    /// Adds an entry (its id must be new); on failure nothing changes.
    pub fn add(&mut self, entry: Entry) -> Result<(), StoreError> {
        self.finish_reading();
        let pos = self
            .entries
            .partition_point(|e| (e.saved_at_ms, &e.id) <= (entry.saved_at_ms, &entry.id));
        let month = month_of(entry.saved_at_ms);
        self.entries.insert(pos, entry);
        match self.commit(vec![month]) {
            // Nothing of ours is stored and not even one entry fits: a quota of nothing, as some
            // browsers give private windows. Storage is unusable, not full: keep this session's.
            Err(StoreError::Full)
                if self.entries.len() == 1 && self.manifest.chunks.is_empty() && self.aside.is_empty() =>
            {
                self.session_only(StoreError::Unavailable);
                Ok(())
            }
            Err(e) => {
                self.entries.remove(pos);
                Err(e)
            }
            Ok(()) => Ok(()),
        }
    }

    /// Deletes an entry, returning it (for undo).
    pub fn delete(&mut self, id: &str) -> Result<Entry, StoreError> {
        self.finish_reading();
        let pos = self
            .entries
            .iter()
            .position(|e| e.id == id)
            .ok_or(StoreError::NotFound)?;
        let entry = self.entries.remove(pos);
        match self.commit(vec![month_of(entry.saved_at_ms)]) {
            Ok(()) => Ok(entry),
            Err(e) => {
                self.entries.insert(pos, entry);
                Err(e)
            }
        }
    }

    /// Deletes every entry (the data kept aside stays).
    pub fn clear(&mut self) -> Result<usize, StoreError> {
        self.finish_reading();
        let old = std::mem::take(&mut self.entries);
        match self.commit(months(old.iter())) {
            Ok(()) => Ok(old.len()),
            Err(e) => {
                self.entries = old;
                Err(e)
            }
        }
    }

    /// Imports an exported file: every entry is checked first; a bad file
    /// changes nothing; entries already present (same id) are skipped.
    pub fn import(&mut self, text: &str) -> Result<ImportReport, StoreError> {
        self.finish_reading();
        let incoming = super::files::read_export(text)?;
        let total = incoming.len();
        let mut seen: Vec<&str> = self.entries.iter().map(|e| e.id.as_str()).collect();
        seen.sort_unstable();
        let mut added: Vec<Entry> = incoming
            .into_iter()
            .filter(|e| seen.binary_search(&e.id.as_str()).is_err())
            .collect();
        // Repeats within the file, even with different times: the earliest of each id is kept.
        added.sort_unstable_by(|a, b| (&a.id, a.saved_at_ms).cmp(&(&b.id, b.saved_at_ms)));
        added.dedup_by(|a, b| a.id == b.id);
        let duplicates = total - added.len();
        if added.is_empty() {
            return Ok(ImportReport { added: 0, duplicates });
        }
        let ids: Vec<String> = added.iter().map(|e| e.id.clone()).collect();
        let months = months(added.iter());
        let count = added.len();
        self.entries.extend(added);
        sort(&mut self.entries);
        match self.commit(months) {
            Ok(()) => Ok(ImportReport {
                added: count,
                duplicates,
            }),
            Err(e) => {
                self.entries.retain(|e| !ids.contains(&e.id));
                Err(e)
            }
        }
    }

    /// Removes the data kept aside (after the user exported it).
    pub fn discard_aside(&mut self) {
        self.finish_reading();
        if self.mode == Mode::Durable {
            self.backend.remove(ASIDE_KEY);
        }
        self.aside.clear();
    }
}

/// Test support: storage in memory.
#[cfg(test)]
pub mod memory {
    use super::{Backend, StoreError};
    use std::collections::BTreeMap;

    /// An in-memory backend with injectable faults and a quota, for the native tests.
    #[derive(Clone, Debug, Default)]
    pub struct Memory {
        pub map: BTreeMap<String, String>,
        /// Total characters of keys and values allowed, like the browser's quota.
        pub quota: Option<usize>,
        pub unavailable: bool,
        /// Writes left before every write is refused (None: never).
        pub writes_left: Option<usize>,
    }

    impl Memory {
        pub fn used(&self) -> usize {
            self.map
                .iter()
                .map(|(k, v)| k.chars().count() + v.chars().count())
                .sum()
        }
    }

    impl Backend for Memory {
        fn read(&self, key: &str) -> Result<Option<String>, StoreError> {
            if self.unavailable {
                return Err(StoreError::Unavailable);
            }
            Ok(self.map.get(key).cloned())
        }

        fn write(&mut self, key: &str, value: &str) -> Result<(), StoreError> {
            if self.unavailable {
                return Err(StoreError::Refused);
            }
            if let Some(left) = self.writes_left.as_mut() {
                if *left == 0 {
                    return Err(StoreError::Refused);
                }
                *left -= 1;
            }
            if let Some(quota) = self.quota {
                let old = self.map.get(key).map_or(0, |v| key.chars().count() + v.chars().count());
                if self.used() - old + key.chars().count() + value.chars().count() > quota {
                    return Err(StoreError::Full);
                }
            }
            self.map.insert(key.to_string(), value.to_string());
            Ok(())
        }

        fn remove(&mut self, key: &str) {
            self.map.remove(key);
        }

        fn keys(&self) -> Vec<String> {
            self.map.keys().cloned().collect()
        }
    }
}

#[cfg(test)]
mod tests {
    use super::super::entry::EyeSummary;
    use super::super::error::Action;
    use super::memory::Memory;
    use super::*;
    use crate::link::Destination;
    use lensplane_core::Eye;

    const MAY: i64 = 1_714_745_100_000; // 2024-05-03T14:05:00Z
    const JUNE: i64 = 1_717_423_500_000; // 2024-06-03T14:05:00Z

    fn entry(id: &str, t: i64, label: &str) -> Entry {
        let eye = EyeSummary {
            eye: Eye::Right,
            input: "-8.00 -2.00 ×180".into(),
            result: "-7.30 -1.63 ×180".into(),
            order: Some("-7.25 -1.75 ×180".into()),
        };
        Entry::new(
            id.into(),
            t,
            Destination::Vertex,
            "r=-8.00%20-2.00%20x180&from=12&to=0".into(),
            label.into(),
            vec![eye],
        )
    }

    fn ids<B: Backend>(s: &Store<B>) -> Vec<&str> {
        s.entries().iter().map(|e| e.id.as_str()).collect()
    }

    fn reopen(m: &Memory) -> Store<Memory> {
        Store::open(m.clone())
    }

    fn month_keys(m: &Memory) -> usize {
        m.map.keys().filter(|k| k.starts_with(CHUNK_PREFIX)).count()
    }

    #[test]
    fn saved_entries_survive_reopening_across_months() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "first")).unwrap();
        s.add(entry("b", JUNE, "second")).unwrap();
        s.add(entry("c", MAY + 1, "")).unwrap();
        let again = reopen(s.backend());
        assert_eq!(ids(&again), ["a", "c", "b"]);
        assert_eq!(again.entries()[0], s.entries()[0]);
        assert_eq!(again.entries(), s.entries());
        assert_eq!(again.mode, Mode::Durable);
        assert!(again.notices.is_empty());
        // One manifest and one key per month, nothing else.
        assert_eq!(month_keys(s.backend()), 2);
    }

    #[test]
    fn superseded_month_keys_are_removed_after_the_switch() {
        let mut s = Store::open(Memory::default());
        for i in 0..5 {
            s.add(entry(&format!("e{i}"), MAY + i, "")).unwrap();
        }
        s.delete("e2").unwrap();
        assert_eq!(s.backend().map.len(), 2, "{:?}", s.backend().map.keys());
        assert_eq!(ids(&reopen(s.backend())), ["e0", "e1", "e3", "e4"]);
        assert_eq!(s.delete("e2"), Err(StoreError::NotFound));
    }

    #[test]
    fn quota_exceeded_keeps_everything_already_stored() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "kept")).unwrap();
        let used = s.backend().used();
        s.backend_mut().quota = Some(used + 50);
        let before = s.backend().map.clone();
        let err = s.add(entry("b", MAY + 1, "too much")).unwrap_err();
        assert_eq!(err, StoreError::Full);
        assert_eq!(
            err.message(Action::Save),
            "Not saved: this device's storage is full. Nothing already saved was lost, and the calculation stays on screen. Export the history, then delete old entries to make room."
        );
        assert_eq!(ids(&s), ["a"], "memory rolled back");
        assert_eq!(s.backend().map, before, "storage exactly as before");
        assert_eq!(ids(&reopen(s.backend())), ["a"]);
    }

    #[test]
    fn a_failed_manifest_write_leaves_the_previous_state() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "")).unwrap();
        let before = s.backend().map.clone();
        // The month is written, the manifest switch is refused.
        s.backend_mut().writes_left = Some(1);
        assert_eq!(s.add(entry("b", MAY + 1, "")), Err(StoreError::Refused));
        assert_eq!(s.backend().map, before);
        assert_eq!(s.delete("a"), Err(StoreError::Refused));
        assert_eq!(s.clear(), Err(StoreError::Refused));
        assert_eq!(ids(&s), ["a"]);
        assert_eq!(s.backend().map, before);
        s.backend_mut().writes_left = None;
        assert_eq!(ids(&reopen(s.backend())), ["a"]);
    }

    #[test]
    fn unavailable_storage_gives_a_session_only_history() {
        let mut s = Store::open(Memory {
            unavailable: true,
            ..Memory::default()
        });
        assert_eq!(s.mode, Mode::SessionOnly(StoreError::Unavailable));
        assert_eq!(s.notices, [Notice::SessionOnly(StoreError::Unavailable)]);
        assert!(s.notices[0].to_string().contains("session only"));
        s.add(entry("a", MAY, "")).unwrap();
        s.add(entry("b", MAY + 1, "")).unwrap();
        s.delete("a").unwrap();
        assert_eq!(ids(&s), ["b"]);
    }

    #[test]
    fn a_corrupt_manifest_is_kept_aside_and_never_wiped() {
        let mut m = Memory::default();
        m.map.insert(MANIFEST_KEY.into(), "{\"schema\":2,\"chu".into());
        let s = Store::open(m);
        assert_eq!(s.mode, Mode::Durable);
        assert_eq!(s.notices, [Notice::KeptAside]);
        assert!(s.notices[0].to_string().contains("could not be read"));
        assert_eq!(
            s.aside(),
            [(MANIFEST_KEY.to_string(), "{\"schema\":2,\"chu".to_string())]
        );
        // Kept in storage, and still there after reopening.
        let mut again = reopen(s.backend());
        assert_eq!(again.aside().len(), 1);
        assert_eq!(
            again.notices,
            [Notice::KeptAside],
            "the new manifest is readable; the aside is still mentioned"
        );
        again.discard_aside();
        assert!(reopen(again.backend()).notices.is_empty());
    }

    #[test]
    fn a_manifest_of_the_wrong_shape_is_kept_aside() {
        for text in [
            "{\"schema\":2,\"next\":-1,\"chunks\":[]}",
            "{\"schema\":2,\"next\":1,\"chunks\":[[\"2024-05\"]]}",
            "{\"schema\":\"2\",\"next\":1,\"chunks\":[]}",
            "{\"next\":1,\"chunks\":[]}",
            "[2]",
        ] {
            let mut m = Memory::default();
            m.map.insert(MANIFEST_KEY.into(), text.into());
            let s = Store::open(m);
            assert_eq!(s.aside(), [(MANIFEST_KEY.to_string(), text.to_string())], "{text}");
        }
    }

    #[test]
    fn months_still_present_are_recovered_when_the_manifest_is_corrupt() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "")).unwrap();
        s.add(entry("b", JUNE, "")).unwrap();
        let mut m = s.backend().clone();
        m.map.insert(MANIFEST_KEY.into(), "garbage".into());
        let again = Store::open(m);
        assert_eq!(ids(&again), ["a", "b"]);
        assert_eq!(again.aside(), [(MANIFEST_KEY.to_string(), "garbage".to_string())]);
        assert_eq!(again.notices, [Notice::KeptAside, Notice::Recovered(2)]);
        assert_eq!(again.notices[1].to_string(), "Recovered 2 entries.");
        let third = reopen(again.backend());
        assert_eq!(ids(&third), ["a", "b"]);
        assert_eq!(month_keys(third.backend()), 2);
    }

    #[test]
    fn a_corrupt_month_is_kept_aside_and_the_other_months_load() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "")).unwrap();
        s.add(entry("b", JUNE, "")).unwrap();
        let june_key = s
            .manifest
            .chunks
            .iter()
            .find(|(m, _)| m == "2024-06")
            .unwrap()
            .1
            .clone();
        s.backend_mut().map.insert(june_key.clone(), "[{\"id\":\"b\",".into());
        let mut again = reopen(s.backend());
        assert_eq!(ids(&again), ["a"]);
        assert_eq!(again.aside(), [(june_key.clone(), "[{\"id\":\"b\",".to_string())]);
        assert!(
            !again.backend().map.contains_key(&june_key),
            "moved, after the aside copy was written"
        );
        again.add(entry("c", JUNE, "")).unwrap();
        assert_eq!(ids(&reopen(again.backend())), ["a", "c"]);
        assert_eq!(reopen(again.backend()).aside().len(), 1);
    }

    #[test]
    fn corrupt_data_with_no_room_to_set_aside_is_left_as_found() {
        let mut m = Memory::default();
        m.map.insert(MANIFEST_KEY.into(), "not json".into());
        m.quota = Some(m.used());
        let before = m.map.clone();
        let mut s = Store::open(m);
        assert_eq!(s.mode, Mode::SessionOnly(StoreError::NoRoomAside));
        assert_eq!(s.notices, [Notice::SessionOnly(StoreError::NoRoomAside)]);
        assert_eq!(s.aside().len(), 1, "still offered for export");
        s.add(entry("a", MAY, "")).unwrap();
        assert_eq!(s.backend().map, before);
    }

    #[test]
    fn a_newer_schema_is_left_alone() {
        for text in [
            "{\"schema\":9,\"whatever\":true}",
            "{\"schema\":3,\"next\":\"n\",\"chunks\":{\"2024-05\":[1]}}",
        ] {
            let mut m = Memory::default();
            m.map.insert(MANIFEST_KEY.into(), text.into());
            let before = m.map.clone();
            let mut s = Store::open(m);
            assert_eq!(s.mode, Mode::SessionOnly(StoreError::Newer), "{text}");
            assert!(s.aside().is_empty());
            s.add(entry("a", MAY, "")).unwrap();
            assert_eq!(s.backend().map, before);
        }
    }

    #[test]
    fn schema_one_is_migrated_and_its_key_removed_only_after() {
        let v1 = r#"[{"id":"old1","time":1714745100,"link":"/vertex?r=-4.00&from=12&to=0","label":"Bench A",
            "eyes":[{"eye":"R","input":"-4.00 DS","result":"-3.82 DS","order":"-3.75 DS"}]}]"#;
        let mut m = Memory::default();
        m.map.insert(V1_KEY.into(), v1.into());
        let s = Store::open(m.clone());
        assert_eq!(ids(&s), ["old1"]);
        assert_eq!(s.entries()[0].query, "r=-4.00&from=12&to=0");
        assert!(!s.backend().map.contains_key(V1_KEY));
        assert_eq!(ids(&reopen(s.backend())), ["old1"]);
        // With no room for the new layout, the old key stays and the entries still show.
        m.quota = Some(m.used());
        let tight = Store::open(m.clone());
        assert_eq!(ids(&tight), ["old1"]);
        assert_eq!(tight.backend().map.get(V1_KEY).map(String::as_str), Some(v1));
        assert_eq!(tight.notices, [Notice::NotUpgraded(StoreError::Full)]);
        assert_eq!(
            tight.notices[0].to_string(),
            "The history was upgraded for this session, but could not be stored in the new form yet: this device's storage is full."
        );
        // An unreadable old list is kept aside, never wiped.
        let mut bad = Memory::default();
        bad.map.insert(V1_KEY.into(), "[{\"id\":\"old1\"}]".into());
        let s = Store::open(bad);
        assert_eq!(s.aside(), [(V1_KEY.to_string(), "[{\"id\":\"old1\"}]".to_string())]);
        assert!(s.entries().is_empty());
    }

    /// Storage exactly as the previous version wrote it (a manifest, two
    /// months, data kept aside) opens with every field, and a change writes
    /// the same layout back.
    #[test]
    fn text_stored_by_the_previous_version_opens_with_nothing_lost() {
        let mut m = Memory::default();
        for (k, v) in [
            (
                "lensplane.history",
                r#"{"schema":2,"next":3,"chunks":[["2024-05","lensplane.history.2.1"],["2024-06","lensplane.history.2.2"]]}"#,
            ),
            (
                "lensplane.history.2.1",
                r#"[{"id":"18f3f2c1e40-9a1b2c3d","t":1714745100000,"p":"vertex","q":"r=-8.00%20-2.00%20x180&from=12&to=0","l":"Room 2","e":[{"s":"R","i":"-8.00 -2.00 ×180","r":"-7.30 -1.63 ×180","o":"-7.25 -1.75 ×180"},{"s":"L","i":"-4.00 DS","r":"-3.82 DS","o":"-3.75 DS"}]},{"id":"18f3f2c1e41-1","t":1714745160000,"p":"near","q":"r=%2B1.00&add=2.00&from=12&to=0","e":[{"s":"L","i":"+1.00 DS","r":"+3.00 DS"}]}]"#,
            ),
            (
                "lensplane.history.2.2",
                r#"[{"id":"18fdd35b8e0-2","t":1717423500000,"p":"equivalent","q":"r=-2.00%20-0.50%20x90","l":"Bench \"B\"","e":[{"s":"R","i":"-2.00 -0.50 ×90","r":"-2.25 DS"}]}]"#,
            ),
            ("lensplane.history.aside", r#"[["lensplane.history.2.0","[{\"id\":"]]"#),
            ("lensplane.persist-asked", "1"),
        ] {
            m.map.insert(k.into(), v.into());
        }
        let stored_before = m.map.clone();
        let mut s = Store::open(m);
        assert_eq!(s.mode, Mode::Durable);
        assert_eq!(s.notices, [Notice::KeptAside]);
        assert_eq!(
            s.aside(),
            [("lensplane.history.2.0".to_string(), "[{\"id\":".to_string())]
        );
        assert_eq!(s.backend().map, stored_before, "opening writes nothing");
        let e = s.entries();
        assert_eq!(ids(&s), ["18f3f2c1e40-9a1b2c3d", "18f3f2c1e41-1", "18fdd35b8e0-2"]);
        assert_eq!(
            (e[0].saved_at_ms, e[0].destination, e[0].label.as_str()),
            (1_714_745_100_000, Destination::Vertex, "Room 2")
        );
        assert_eq!(e[0].query, "r=-8.00%20-2.00%20x180&from=12&to=0");
        assert_eq!(
            e[0].eyes[1],
            EyeSummary {
                eye: Eye::Left,
                input: "-4.00 DS".into(),
                result: "-3.82 DS".into(),
                order: Some("-3.75 DS".into())
            }
        );
        assert_eq!(
            (e[1].destination, e[1].label.as_str(), &e[1].eyes[0].order),
            (Destination::Near, "", &None)
        );
        assert_eq!(
            (e[2].destination, e[2].label.as_str()),
            (Destination::Equivalent, "Bench \"B\"")
        );
        // A change rewrites June only, in the same layout, under the next key number.
        s.delete("18fdd35b8e0-2").unwrap();
        s.add(entry("new", JUNE, "")).unwrap();
        let map = &s.backend().map;
        assert_eq!(map["lensplane.history.2.1"], stored_before["lensplane.history.2.1"]);
        assert!(!map.contains_key("lensplane.history.2.2"));
        assert_eq!(
            map["lensplane.history"],
            r#"{"schema":2,"next":4,"chunks":[["2024-05","lensplane.history.2.1"],["2024-06","lensplane.history.2.3"]]}"#
        );
        assert_eq!(
            map["lensplane.history.2.3"],
            r#"[{"id":"new","t":1717423500000,"p":"vertex","q":"r=-8.00%20-2.00%20x180&from=12&to=0","e":[{"s":"R","i":"-8.00 -2.00 ×180","r":"-7.30 -1.63 ×180","o":"-7.25 -1.75 ×180"}]}]"#
        );
        assert_eq!(map["lensplane.history.aside"], stored_before["lensplane.history.aside"]);
    }

    #[test]
    fn a_schema_one_key_as_stored_migrates_into_the_current_layout() {
        let mut m = Memory::default();
        m.map.insert(
            V1_KEY.into(),
            r#"[{"id":"k1","time":1714745100,"link":"/equivalent?r=-2.00%20-0.50%20x90&from=12&to=0","label":"Room 4","eyes":[{"eye":"R","input":"-2.00 -0.50 ×90","result":"-2.25 DS","order":null},{"eye":"L","input":"-1.00 DS","result":"-1.00 DS","order":"-1.00 DS"}]},{"id":"k2","time":1717423500,"link":"/near?r=%2B1.00&add=2.00","label":null,"eyes":[{"eye":"L","input":"+1.00 DS","result":"+3.00 DS"}]}]"#
                .into(),
        );
        let s = Store::open(m);
        assert!(s.notices.is_empty());
        let map = &s.backend().map;
        assert_eq!(map.len(), 3, "{:?}", map.keys());
        assert_eq!(
            map[MANIFEST_KEY],
            r#"{"schema":2,"next":2,"chunks":[["2024-05","lensplane.history.2.0"],["2024-06","lensplane.history.2.1"]]}"#
        );
        assert_eq!(
            map["lensplane.history.2.0"],
            r#"[{"id":"k1","t":1714745100000,"p":"equivalent","q":"r=-2.00%20-0.50%20x90&from=12&to=0","l":"Room 4","e":[{"s":"R","i":"-2.00 -0.50 ×90","r":"-2.25 DS"},{"s":"L","i":"-1.00 DS","r":"-1.00 DS","o":"-1.00 DS"}]}]"#
        );
        assert_eq!(
            map["lensplane.history.2.1"],
            r#"[{"id":"k2","t":1717423500000,"p":"near","q":"r=%2B1.00&add=2.00","e":[{"s":"L","i":"+1.00 DS","r":"+3.00 DS"}]}]"#
        );
    }

    #[test]
    fn clear_removes_every_month_but_not_what_was_kept_aside() {
        let mut m = Memory::default();
        m.map.insert(ASIDE_KEY.into(), "[[\"k\",\"v\"]]".into());
        let mut s = Store::open(m);
        s.add(entry("a", MAY, "")).unwrap();
        s.add(entry("b", JUNE, "")).unwrap();
        assert_eq!(s.clear(), Ok(2));
        let again = reopen(s.backend());
        assert!(again.entries().is_empty());
        assert_eq!(again.aside().len(), 1);
        assert_eq!(month_keys(s.backend()), 0);
    }

    #[test]
    fn undo_puts_a_deleted_entry_back_in_place() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "")).unwrap();
        s.add(entry("b", MAY + 5, "")).unwrap();
        let gone = s.delete("a").unwrap();
        s.add(gone).unwrap();
        assert_eq!(ids(&reopen(s.backend())), ["a", "b"]);
    }

    /// Three readable months (April holds three entries), a damaged May and
    /// a month the manifest names but storage lost.
    fn several_months() -> Memory {
        const APRIL: i64 = 1_712_153_100_000; // 2024-04-03T14:05:00Z
        let mut s = Store::open(Memory::default());
        for (id, t) in [
            ("a1", APRIL),
            ("a2", APRIL + 1),
            ("a3", APRIL + 2),
            ("m", MAY),
            ("j1", JUNE),
            ("j2", JUNE + 1),
        ] {
            s.add(entry(id, t, "")).unwrap();
        }
        s.add(entry("x", 1_719_928_800_000, "")).unwrap(); // 2024-07-02
        let key =
            |s: &Store<Memory>, month: &str| s.manifest.chunks.iter().find(|(m, _)| m == month).unwrap().1.clone();
        let (may, july) = (key(&s, "2024-05"), key(&s, "2024-07"));
        s.backend_mut().map.insert(may, "[{\"id\":\"m\",\"t\":1}]".into());
        s.backend_mut().map.remove(&july);
        s.backend().clone()
    }

    #[test]
    fn reading_in_slices_ends_where_reading_at_once_does_newest_month_first() {
        let at_once = Store::open(several_months());
        assert_eq!(ids(&at_once), ["a1", "a2", "a3", "j1", "j2"]);
        assert_eq!(at_once.aside().len(), 1);
        assert_eq!(
            at_once.notices,
            [Notice::Missing("2024-07".into()), Notice::KeptAside],
            "{:?}",
            at_once.notices
        );
        assert_eq!(
            at_once.notices[0].to_string(),
            "The saved history of 2024-07 was missing from storage."
        );

        let mut sliced = Store::open_unread(several_months());
        assert!(sliced.is_reading() && sliced.entries().is_empty());
        let mut seen: Vec<String> = Vec::new();
        let mut steps = 0;
        while sliced.is_reading() {
            if sliced.read_more(1) {
                seen.push(ids(&sliced).join(" "));
            }
            steps += 1;
        }
        // July is missing, so June shows first; May is unreadable; April completes the reading.
        assert_eq!(seen, ["j1 j2", "a1 a2 a3 j1 j2"]);
        assert!(steps >= 6, "one entry per slice: {steps} slices");
        assert_eq!(ids(&sliced), ids(&at_once));
        assert_eq!(sliced.aside(), at_once.aside());
        assert_eq!(sliced.notices, at_once.notices);
        assert_eq!(sliced.manifest, at_once.manifest);
        assert_eq!(sliced.backend().map, at_once.backend().map);
        assert!(!sliced.read_more(10), "nothing left to read");
    }

    #[test]
    fn a_quota_of_nothing_gives_a_session_history_not_a_full_one() {
        let mut s = Store::open(Memory {
            quota: Some(0),
            ..Memory::default()
        });
        s.add(entry("a", MAY, "")).unwrap();
        assert_eq!(s.mode, Mode::SessionOnly(StoreError::Unavailable));
        assert_eq!(s.notices, [Notice::SessionOnly(StoreError::Unavailable)]);
        s.add(entry("b", JUNE, "")).unwrap();
        assert_eq!(ids(&s), ["a", "b"]);
        assert!(s.backend().map.is_empty());
        // With entries already stored, a full quota is a full quota.
        let mut full = Store::open(Memory::default());
        full.add(entry("a", MAY, "")).unwrap();
        full.backend_mut().quota = Some(full.backend().used());
        assert_eq!(full.add(entry("b", MAY + 1, "")), Err(StoreError::Full));
        assert_eq!(full.mode, Mode::Durable);
    }

    #[test]
    fn a_change_made_while_reading_keeps_the_months_not_yet_read() {
        let mut s = Store::open_unread(several_months());
        s.read_more(1);
        assert!(s.is_reading());
        s.add(entry("new", JUNE + 5, "")).unwrap();
        assert!(!s.is_reading());
        assert_eq!(ids(&reopen(s.backend())), ["a1", "a2", "a3", "j1", "j2", "new"]);
        let mut s = Store::open_unread(several_months());
        s.delete("j1").unwrap();
        assert_eq!(ids(&reopen(s.backend())), ["a1", "a2", "a3", "j2"]);
    }

    #[test]
    fn import_skips_duplicates_and_a_bad_file_changes_nothing() {
        use super::super::files::to_json;
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "")).unwrap();
        let file = to_json(&[entry("a", MAY, ""), entry("b", MAY + 1, ""), entry("b", MAY + 1, "")]);
        assert_eq!(
            s.import(&file),
            Ok(ImportReport {
                added: 1,
                duplicates: 2
            })
        );
        assert_eq!(
            s.import(&file),
            Ok(ImportReport {
                added: 0,
                duplicates: 3
            })
        );
        let before = s.backend().map.clone();
        let mut bad = entry("c", MAY, "");
        bad.label = "x".repeat(61);
        assert!(matches!(
            s.import(&to_json(&[entry("d", MAY, ""), bad])),
            Err(StoreError::BadImport(_))
        ));
        assert_eq!(s.entries().len(), 2);
        assert_eq!(s.backend().map, before);
        // Full storage: nothing imported, nothing lost.
        s.backend_mut().quota = Some(s.backend().used());
        let err = s.import(&to_json(&[entry("e", MAY + 9, "")])).unwrap_err();
        assert_eq!(err, StoreError::Full);
        assert!(err.message(Action::Import).starts_with("Nothing was imported: "));
        assert_eq!(s.entries().len(), 2);
        assert_eq!(s.backend().map, before);
    }

    #[test]
    fn one_id_twice_in_a_file_is_imported_once_even_at_different_times() {
        use super::super::files::to_json;
        let mut s = Store::open(Memory::default());
        let file = to_json(&[
            entry("z", MAY + 7_200_000, "later"),
            entry("m", MAY + 60_000, ""),
            entry("z", MAY, "earlier"),
        ]);
        assert_eq!(
            s.import(&file),
            Ok(ImportReport {
                added: 2,
                duplicates: 1
            })
        );
        let kept: Vec<(&str, &str)> = s.entries().iter().map(|e| (e.id.as_str(), e.label.as_str())).collect();
        assert_eq!(kept, [("z", "earlier"), ("m", "")]);
    }
}
