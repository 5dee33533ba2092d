//! The durable store: entries in memory, written through a small storage
//! interface so the same logic runs against localStorage in the browser and
//! an in-memory backend (with fault injection) in native tests.
//!
//! Writes never leave a state that loses earlier entries: a changed month is
//! written under a fresh key first, then the manifest (one key, replaced in
//! one step) is switched to it, and only then is the superseded key removed.
//! A failure at any step leaves the previous manifest and every key it names
//! untouched, and the in-memory history is rolled back to match.

use super::json::{self, pairs, read_pairs, Value};
use super::schema::MonthReader;
use super::schema::*;
use std::collections::BTreeMap;

/// Months touched by a change, "YYYY-MM", without repeats.
type Months = Vec<String>;

fn months<'a>(entries: impl Iterator<Item = &'a Entry>) -> Months {
    let mut out: Months = Vec::new();
    for e in entries {
        let m = e.month();
        if !out.contains(&m) {
            out.push(m);
        }
    }
    out
}

/// Oldest first, by time then id (one sort for the whole store keeps the wasm small).
fn sort(entries: &mut [Entry]) {
    entries.sort_unstable_by(|a, b| (a.t, &a.id).cmp(&(b.t, &b.id)));
}

/// A month's entries as stored.
fn entries_json(list: &[&Entry]) -> String {
    let mut out = String::from("[");
    for (i, e) in list.iter().enumerate() {
        if i > 0 {
            out.push(',');
        }
        e.write(&mut out);
    }
    out.push(']');
    out
}

/// What a storage backend can report.
#[derive(Clone, Debug, PartialEq)]
pub enum Fault {
    /// No storage at all (disabled, or throwing as some private modes do).
    Unavailable,
    /// The browser's quota is used up.
    Quota,
    /// Anything else the browser refused.
    Other(String),
}

/// A key/value text store (localStorage in the browser).
pub trait Backend {
    fn read(&self, key: &str) -> Result<Option<String>, Fault>;
    fn write(&mut self, key: &str, value: &str) -> Result<(), Fault>;
    fn remove(&mut self, key: &str);
    /// Every key present (to recover months when the manifest is unreadable).
    fn keys(&self) -> Vec<String>;
}

/// An in-memory backend with injectable faults and a quota, for tests (and
/// the session-only fallback's twin in behaviour).
#[derive(Clone, Debug, Default)]
pub struct Memory {
    pub map: BTreeMap<String, String>,
    /// Total characters of keys and values allowed, like the browser's quota.
    pub quota: Option<usize>,
    pub unavailable: bool,
    /// Writes left before every write fails with `Fault::Other` (None: never).
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
    fn read(&self, key: &str) -> Result<Option<String>, Fault> {
        if self.unavailable {
            return Err(Fault::Unavailable);
        }
        Ok(self.map.get(key).cloned())
    }

    fn write(&mut self, key: &str, value: &str) -> Result<(), Fault> {
        if self.unavailable {
            return Err(Fault::Unavailable);
        }
        if let Some(left) = self.writes_left.as_mut() {
            if *left == 0 {
                return Err(Fault::Other("write refused".into()));
            }
            *left -= 1;
        }
        if let Some(quota) = self.quota {
            let old = self.map.get(key).map_or(0, |v| key.chars().count() + v.chars().count());
            if self.used() - old + key.chars().count() + value.chars().count() > quota {
                return Err(Fault::Quota);
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

/// Whether what is saved outlives the session.
#[derive(Clone, Debug, PartialEq)]
pub enum Mode {
    Durable,
    /// Saved in memory only; the text says why, for the user.
    SessionOnly(String),
}

/// A user-facing reason an operation changed nothing.
pub type Problem = String;

pub const FULL: &str = "Not saved: this device's storage is full. Nothing already saved was lost, and the calculation stays on screen. Export the history, then delete old entries to make room.";
const REFUSED: &str =
    "Not saved: the browser refused to store it. Nothing already saved was lost, and the calculation stays on screen.";
pub const SESSION_ONLY: &str = "This browser is not letting Lensplane store anything (storage is disabled or private browsing blocks it). Calculations work, and the history keeps entries for this session only: they will be gone when the page is closed.";
const ASIDE_NOTE: &str = "Some stored history could not be read. It has been kept aside, untouched: export it below to keep a copy. Everything else works as usual.";
const ASIDE_UNSAVED: &str = "Some stored history could not be read and the device has no room to set it aside, so it was left exactly as found. Until that is resolved, new entries are kept for this session only.";
const NEWER: &str = "The stored history was written by a newer version of Lensplane. It has been left as it is; new entries are kept for this session only. Reload to get the newer version.";

fn fault_problem(f: &Fault) -> Problem {
    match f {
        Fault::Quota => FULL.into(),
        _ => REFUSED.into(),
    }
}

pub struct Store<B: Backend> {
    backend: B,
    pub mode: Mode,
    /// Oldest first, by time then id.
    entries: Vec<Entry>,
    manifest: Manifest,
    /// Unreadable data kept aside: (where it was, the text as found).
    aside: Vec<(String, String)>,
    /// Things the user should be told once, since loading.
    pub notices: Vec<String>,
    /// Months the manifest names that are not read yet, oldest first (the
    /// newest is read first); see [`Store::read_more`].
    unread: Vec<(String, String)>,
    /// The month being read: (month, key, reader, entries so far).
    reading: Option<(String, String, MonthReader, Vec<Entry>)>,
    /// Months found unreadable while reading, set aside once all are read.
    unreadable: Vec<(String, String)>,
}

/// What importing did.
#[derive(Debug, PartialEq)]
pub struct ImportReport {
    pub added: usize,
    pub duplicates: usize,
}

/// Largest import accepted, in bytes.
pub const IMPORT_MAX: usize = 6_000_000;

impl<B: Backend> Store<B> {
    /// Opens whatever is stored. Never fails: problems become notices and a
    /// session-only mode, and unreadable data is kept aside.
    pub fn open(backend: B) -> Store<B> {
        let mut store = Store::open_unread(backend);
        store.finish_reading();
        store
    }

    /// Opens the store but leaves the months to be read in slices by
    /// [`Store::read_more`]; until then [`Store::entries`] holds the newest
    /// months read so far. Every change reads the rest first, so a change
    /// never writes a manifest that lacks a month not yet read.
    pub fn open_unread(backend: B) -> Store<B> {
        let mut store = Store {
            backend,
            mode: Mode::Durable,
            entries: Vec::new(),
            manifest: Manifest {
                schema: SCHEMA,
                ..Manifest::default()
            },
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
                    Ok(None) | Err(_) => self
                        .notices
                        .push(format!("The saved history of {month} was missing from storage.")),
                }
                continue;
            }
            let (_, _, reader, list) = self.reading.as_mut().expect("a month is being read");
            let before = list.len();
            let done = reader.read(left, list);
            left = left.saturating_sub((list.len() - before).max(1));
            let sound = done.is_ok() && list[before..].iter().all(|e| e.problem().is_none());
            if sound && done != Ok(true) {
                continue;
            }
            let (month, key, reader, mut list) = self.reading.take().expect("a month is being read");
            if sound {
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
        if !self.aside.is_empty() && !self.notices.iter().any(|n| n == ASIDE_NOTE || n == ASIDE_UNSAVED) {
            self.notices.push(ASIDE_NOTE.into());
        }
    }

    fn session_only(&mut self, why: &str) {
        self.mode = Mode::SessionOnly(why.into());
        self.notices.push(why.into());
    }

    fn load(&mut self) {
        let manifest = match self.backend.read(MANIFEST_KEY) {
            Err(_) => return self.session_only(SESSION_ONLY),
            Ok(m) => m,
        };
        if let Ok(Some(text)) = self.backend.read(ASIDE_KEY) {
            match json::parse(&text).ok().and_then(|v| read_pairs(&v)) {
                Some(a) => self.aside = a,
                // Even the aside key is damaged: keep its text as it is.
                None => self.aside = vec![(ASIDE_KEY.to_string(), text)],
            }
        }
        let mut unreadable: Vec<(String, String)> = Vec::new();
        match manifest {
            None => self.migrate_v1(&mut unreadable),
            Some(text) => {
                let parsed = json::parse(&text).ok();
                match parsed
                    .as_ref()
                    .map(|v| (v.get("schema").and_then(Value::int), Manifest::read(v)))
                {
                    Some((Some(s), _)) if s > SCHEMA => return self.session_only(NEWER),
                    Some((Some(SCHEMA), Some(m))) => self.load_chunks(m),
                    _ => unreadable.push((MANIFEST_KEY.into(), text)),
                }
            }
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
            match self.backend.read(key) {
                Ok(Some(text)) => match parse_entries(&text) {
                    Some(list) => found.extend(list),
                    None => unreadable.push((key.clone(), text)),
                },
                _ => {}
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
        let months = months(self.entries.iter());
        match self.commit(months) {
            Ok(()) => {
                let stale: Vec<&String> = keys
                    .iter()
                    .filter(|k| !self.manifest.chunks.iter().any(|(_, c)| c == *k))
                    .collect();
                for k in stale {
                    self.backend.remove(k);
                }
                self.notices.push(format!(
                    "Recovered {}.",
                    super::export::entries_words(self.entries.len())
                ));
            }
            Err(_) => self.session_only(ASIDE_UNSAVED),
        }
    }

    /// Queues the manifest's months for [`Store::read_more`].
    fn load_chunks(&mut self, m: Manifest) {
        self.manifest = Manifest {
            schema: SCHEMA,
            next: m.next,
            chunks: Vec::new(),
        };
        self.unread = m.chunks;
        self.unread.sort();
    }

    fn migrate_v1(&mut self, unreadable: &mut Vec<(String, String)>) {
        let Ok(Some(text)) = self.backend.read(V1_KEY) else {
            return;
        };
        let old = json::parse(&text).ok();
        let migrated: Option<Vec<Entry>> = old
            .as_ref()
            .and_then(Value::arr)
            .and_then(|a| a.iter().map(read_v1).collect::<Option<Vec<_>>>())
            .filter(|v| v.iter().all(|e| e.problem().is_none()));
        match migrated {
            None => unreadable.push((V1_KEY.into(), text)),
            Some(list) => {
                self.entries = list;
                sort(&mut self.entries);
                let months = months(self.entries.iter());
                // The old key goes only once the new layout holds everything.
                match self.commit(months) {
                    Ok(()) if self.mode == Mode::Durable => self.backend.remove(V1_KEY),
                    Ok(()) => {}
                    Err(p) => self.notices.push(format!(
                        "The history was upgraded for this session, but could not be stored in the new form yet ({p})"
                    )),
                }
            }
        }
    }

    /// Keeps unreadable data under the aside key before removing it from
    /// where it was; if that cannot be written, nothing is removed and the
    /// history runs for this session only.
    fn set_aside(&mut self, found: Vec<(String, String)>) {
        let mut aside = self.aside.clone();
        aside.extend(found.iter().cloned());
        let text = pairs(&aside);
        match self.backend.write(ASIDE_KEY, &text) {
            Ok(()) => {
                self.aside = aside;
                for (key, _) in &found {
                    if key != MANIFEST_KEY {
                        self.backend.remove(key);
                    }
                }
                if found.iter().any(|(k, _)| k == MANIFEST_KEY) {
                    // A fresh manifest replaces the unreadable one (already copied aside).
                    self.manifest = Manifest {
                        schema: SCHEMA,
                        next: self.manifest.next,
                        chunks: Vec::new(),
                    };
                    if self.write_manifest(&self.manifest.clone()).is_err() {
                        self.session_only(ASIDE_UNSAVED);
                        return;
                    }
                }
                if !self.notices.iter().any(|n| n == ASIDE_NOTE) {
                    self.notices.push(ASIDE_NOTE.into());
                }
            }
            Err(_) => {
                self.aside = aside;
                self.session_only(ASIDE_UNSAVED);
            }
        }
    }

    fn write_manifest(&mut self, m: &Manifest) -> Result<(), Fault> {
        self.backend.write(MANIFEST_KEY, &m.to_json())
    }

    /// Writes the months in `touched` from the entries in memory, then the
    /// manifest. On failure the stored state is as before and the caller
    /// rolls the memory back.
    fn commit(&mut self, touched: Months) -> Result<(), Problem> {
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
            debug_assert!(self.entries.is_sorted_by_key(|e| e.t));
            let span = Entry::month_span(month).unwrap_or(0..0);
            let (from, to) = (
                self.entries.partition_point(|e| e.t < span.start),
                self.entries.partition_point(|e| e.t < span.end),
            );
            let list: Vec<&Entry> = self.entries[from..to].iter().collect();
            if list.is_empty() {
                continue;
            }
            let key = format!("{CHUNK_PREFIX}{}", next.next);
            next.next += 1;
            let text = entries_json(&list);
            if let Err(f) = self.backend.write(&key, &text) {
                self.undo_writes(&fresh, &key);
                return Err(fault_problem(&f));
            }
            fresh.push(key.clone());
            next.chunks.push((month.clone(), key));
        }
        next.chunks.sort();
        if let Err(f) = self.write_manifest(&next) {
            self.undo_writes(&fresh, "");
            return Err(fault_problem(&f));
        }
        for key in superseded {
            self.backend.remove(&key);
        }
        self.manifest = next;
        Ok(())
    }

    fn undo_writes(&mut self, fresh: &[String], failed: &str) {
        for k in fresh
            .iter()
            .map(String::as_str)
            .chain([failed])
            .filter(|k| !k.is_empty())
        {
            self.backend.remove(k);
        }
    }

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
    pub fn add(&mut self, entry: Entry) -> Result<(), Problem> {
        self.finish_reading();
        let pos = self.entries.partition_point(|e| (e.t, &e.id) <= (entry.t, &entry.id));
        let month = entry.month();
        self.entries.insert(pos, entry);
        match self.commit(vec![month]) {
            // Nothing of ours is stored and not even one entry fits: a quota of nothing, as some
            // browsers give private windows. Storage is unusable, not full: keep this session's.
            Err(p)
                if p == FULL && self.entries.len() == 1 && self.manifest.chunks.is_empty() && self.aside.is_empty() =>
            {
                self.session_only(SESSION_ONLY);
                Ok(())
            }
            Err(p) => {
                self.entries.remove(pos);
                Err(p)
            }
            Ok(()) => Ok(()),
        }
    }

    /// Deletes an entry, returning it (for undo).
    pub fn delete(&mut self, id: &str) -> Result<Entry, Problem> {
        self.finish_reading();
        let pos = self
            .entries
            .iter()
            .position(|e| e.id == id)
            .ok_or_else(|| "That entry is no longer in the history.".to_string())?;
        let entry = self.entries.remove(pos);
        match self.commit(vec![entry.month()]) {
            Ok(()) => Ok(entry),
            Err(p) => {
                self.entries.insert(pos, entry);
                Err(p.replace("Not saved", "Not deleted"))
            }
        }
    }

    /// Deletes every entry (the data kept aside stays).
    pub fn clear(&mut self) -> Result<usize, Problem> {
        self.finish_reading();
        let old = std::mem::take(&mut self.entries);
        let months = months(old.iter());
        match self.commit(months) {
            Ok(()) => Ok(old.len()),
            Err(p) => {
                self.entries = old;
                Err(p.replace("Not saved", "Nothing was deleted"))
            }
        }
    }

    /// Imports an exported file: every entry is checked first; a bad file
    /// changes nothing; entries already present (same id) are skipped.
    pub fn import(&mut self, text: &str) -> Result<ImportReport, Problem> {
        self.finish_reading();
        let incoming = super::export::parse_import(text)?;
        let total = incoming.len();
        let mut seen: Vec<&str> = self.entries.iter().map(|e| e.id.as_str()).collect();
        seen.sort_unstable();
        let mut added: Vec<Entry> = incoming
            .into_iter()
            .filter(|e| seen.binary_search(&e.id.as_str()).is_err())
            .collect();
        // Repeats within the file, even with different times: the earliest of each id is kept.
        added.sort_unstable_by(|a, b| (&a.id, a.t).cmp(&(&b.id, b.t)));
        added.dedup_by(|a, b| a.id == b.id);
        sort(&mut added);
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
            Err(p) => {
                self.entries.retain(|e| !ids.contains(&e.id));
                Err(p.replace("Not saved", "Nothing was imported"))
            }
        }
    }

    /// Removes the data kept aside (after the user exported it).
    pub fn discard_aside(&mut self) -> Result<(), Problem> {
        self.finish_reading();
        if self.mode == Mode::Durable {
            self.backend.remove(ASIDE_KEY);
        }
        self.aside.clear();
        Ok(())
    }

    /// Indices of entries whose label, panel or one of whose powers contains
    /// `text` (case, spacing, × and − as typed do not matter), in the panel
    /// if one is given, newest first. The text is one phrase: "room 2" does
    /// not match a label "room 3" with a power of -2.00.
    pub fn filter(&self, text: &str, panel: Option<&str>) -> Vec<usize> {
        let needle = fold(text).split_whitespace().collect::<Vec<_>>().join(" ");
        (0..self.entries.len())
            .rev()
            .filter(|&i| {
                let e = &self.entries[i];
                panel.is_none_or(|p| e.p == p) && e.search.contains(needle.as_str())
            })
            .collect()
    }
}

/// A month's entries, or `None` when the text is not a readable list of valid entries.
pub fn parse_entries(text: &str) -> Option<Vec<Entry>> {
    let list = Entry::read_list(text)?;
    list.iter().all(|e| e.problem().is_none()).then_some(list)
}

#[cfg(test)]
mod tests {
    use super::super::EyeSummary;
    use super::*;

    const MAY: i64 = 1_714_745_100_000; // 2024-05-03T14:05:00Z
    const JUNE: i64 = 1_717_423_500_000; // 2024-06-03T14:05:00Z

    fn entry(id: &str, t: i64, label: &str) -> Entry {
        let eye = EyeSummary {
            eye: "R".into(),
            input: "-8.00 -2.00 ×180".into(),
            result: "-7.30 -1.63 ×180".into(),
            order: Some("-7.25 -1.75 ×180".into()),
        };
        Entry::new(
            id.into(),
            t,
            "vertex".into(),
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

    #[test]
    fn saved_entries_survive_reopening_across_months() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "first")).unwrap();
        s.add(entry("b", JUNE, "second")).unwrap();
        s.add(entry("c", MAY + 1, "")).unwrap();
        let again = reopen(s.backend());
        assert_eq!(ids(&again), ["a", "c", "b"]);
        assert_eq!(again.entries()[0].l, "first");
        assert_eq!(again.mode, Mode::Durable);
        assert!(again.notices.is_empty());
        // One manifest and one key per month, nothing else.
        assert_eq!(
            s.backend().map.keys().filter(|k| k.starts_with(CHUNK_PREFIX)).count(),
            2
        );
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
    }

    #[test]
    fn quota_exceeded_keeps_everything_already_stored() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "kept")).unwrap();
        let used = s.backend().used();
        s.backend_mut().quota = Some(used + 50);
        let before = s.backend().map.clone();
        let err = s.add(entry("b", MAY + 1, "too much")).unwrap_err();
        assert!(
            err.contains("storage is full") && err.contains("Nothing already saved was lost"),
            "{err}"
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
        assert!(s.add(entry("b", MAY + 1, "")).is_err());
        assert_eq!(s.backend().map, before);
        assert!(s.delete("a").is_err());
        assert!(s.clear().is_err());
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
        assert!(matches!(s.mode, Mode::SessionOnly(_)));
        assert!(s.notices[0].contains("session only"));
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
        assert!(
            s.notices.iter().any(|n| n.contains("could not be read")),
            "{:?}",
            s.notices
        );
        assert_eq!(
            s.aside(),
            [(MANIFEST_KEY.to_string(), "{\"schema\":2,\"chu".to_string())]
        );
        // Kept in storage, and still there after reopening.
        let again = reopen(s.backend());
        assert_eq!(again.aside().len(), 1);
        assert_eq!(
            again.notices,
            [ASIDE_NOTE],
            "the new manifest is readable; the aside is still mentioned"
        );
        let mut again = again;
        again.discard_aside().unwrap();
        assert!(reopen(again.backend()).notices.is_empty());
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
        assert!(
            again.notices.iter().any(|n| n == "Recovered 2 entries."),
            "{:?}",
            again.notices
        );
        let third = reopen(again.backend());
        assert_eq!(ids(&third), ["a", "b"]);
        assert_eq!(
            third
                .backend()
                .map
                .keys()
                .filter(|k| k.starts_with(CHUNK_PREFIX))
                .count(),
            2
        );
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
        assert!(matches!(s.mode, Mode::SessionOnly(_)));
        assert_eq!(s.aside().len(), 1, "still offered for export");
        s.add(entry("a", MAY, "")).unwrap();
        assert_eq!(s.backend().map, before);
    }

    #[test]
    fn a_newer_schema_is_left_alone() {
        let mut m = Memory::default();
        m.map
            .insert(MANIFEST_KEY.into(), "{\"schema\":9,\"whatever\":true}".into());
        let before = m.map.clone();
        let mut s = Store::open(m);
        assert!(matches!(s.mode, Mode::SessionOnly(_)));
        s.add(entry("a", MAY, "")).unwrap();
        assert_eq!(s.backend().map, before);
    }

    #[test]
    fn schema_one_is_migrated_and_its_key_removed_only_after() {
        let v1 = r#"[{"id":"old1","time":1714745100,"link":"/vertex?r=-4.00&from=12&to=0","label":"Bench A",
            "eyes":[{"eye":"R","input":"-4.00 DS","result":"-3.82 DS","order":"-3.75 DS"}]}]"#;
        let mut m = Memory::default();
        m.map.insert(V1_KEY.into(), v1.into());
        let s = Store::open(m.clone());
        assert_eq!(ids(&s), ["old1"]);
        assert_eq!(s.entries()[0].query().get("r"), Some("-4.00"));
        assert!(!s.backend().map.contains_key(V1_KEY));
        assert_eq!(ids(&reopen(s.backend())), ["old1"]);
        // With no room for the new layout, the old key stays and the entries still show.
        m.quota = Some(m.used());
        let tight = Store::open(m.clone());
        assert_eq!(ids(&tight), ["old1"]);
        assert_eq!(tight.backend().map.get(V1_KEY).map(String::as_str), Some(v1));
    }

    #[test]
    fn filter_matches_every_word_newest_first_and_by_panel() {
        let mut s = Store::open(Memory::default());
        s.add(entry("a", MAY, "Room 2")).unwrap();
        s.add(entry("b", MAY + 1, "room 3")).unwrap();
        let mut near = entry("c", MAY + 2, "Room 2 near");
        near.p = "near".into();
        near.index();
        s.add(near).unwrap();
        let found = |t: &str, p: Option<&str>| {
            s.filter(t, p)
                .into_iter()
                .map(|i| s.entries()[i].id.clone())
                .collect::<Vec<_>>()
        };
        assert_eq!(found("", None), ["c", "b", "a"]);
        assert_eq!(found("ROOM 2", None), ["c", "a"]);
        assert_eq!(found("room", Some("vertex")), ["b", "a"]);
        assert_eq!(found("-2.00 x180", None), ["c", "b", "a"]);
        assert_eq!(found("-7.25", Some("near")), ["c"]);
        assert_eq!(found("  room   2 ", None), ["c", "a"]);
        assert!(found("room 2 -8.00", None).is_empty(), "one phrase, not words anywhere");
        assert!(found("+5.00", None).is_empty());
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
        assert_eq!(
            s.backend().map.keys().filter(|k| k.starts_with(CHUNK_PREFIX)).count(),
            0
        );
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
        assert_eq!(at_once.notices.len(), 2, "{:?}", at_once.notices);

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
        assert_eq!(s.mode, Mode::SessionOnly(SESSION_ONLY.into()));
        assert_eq!(s.notices, [SESSION_ONLY]);
        s.add(entry("b", JUNE, "")).unwrap();
        assert_eq!(ids(&s), ["a", "b"]);
        assert!(s.backend().map.is_empty());
        // With entries already stored, a full quota is a full quota.
        let mut full = Store::open(Memory::default());
        full.add(entry("a", MAY, "")).unwrap();
        full.backend_mut().quota = Some(full.backend().used());
        assert_eq!(full.add(entry("b", MAY + 1, "")), Err(FULL.to_string()));
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
}
