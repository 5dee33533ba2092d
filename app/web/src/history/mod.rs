//! The on-device history of saved calculations.
//!
//! The shell opens the [`History`] once at start-up and provides it as
//! context; panels save through it, and the history destination lists,
//! filters, restores (through the link format), deletes and exports entries.
//!
//! The modules of this folder: [`entry`] (the typed entry and its checks),
//! [`codec`] (stored text ⇄ entries), [`store`] (the store's logic behind a
//! small storage interface, months and manifest, faults), [`files`] (JSON
//! and CSV export, import), [`search`] (the filter), [`calendar`] (months
//! and local dates), [`error`] (what can go wrong, in words), [`json`] (a
//! small JSON reader/writer) and `browser` (localStorage).

mod browser;
pub mod calendar;
pub mod codec;
pub mod entry;
pub mod error;
pub mod files;
pub mod json;
pub mod search;
pub mod store;

use crate::link::{Destination, Query};
pub use browser::download;
use browser::Browser;
pub use entry::{Entry, EyeSummary};
pub use error::{Action, StoreError};
use leptos::prelude::*;
use store::{Backend, Mode, Store, PERSIST_ASKED_KEY};

/// What a panel hands over when the user saves.
#[derive(Clone, Debug, PartialEq)]
pub struct SaveRequest {
    pub destination: Destination,
    /// The panel's inputs exactly as typed (restores the panel through its link).
    pub query: Query,
    /// Optional short label (no patient identifiers).
    pub label: String,
    pub eyes: Vec<EyeSummary>,
    /// One line saying what was calculated, for a calculation without
    /// eyes (a conversion chart); empty for the others.
    pub summary: String,
}

/// Milliseconds of reading per slice while opening the history (a frame
/// or so: the page stays responsive between slices).
const SLICE_MS: f64 = 12.0;
/// Entries read between looks at the clock (about 2 ms with the CPU slowed 4×).
const STEP: usize = 64;

/// The app's handle on the history: views read it through [`History::with`]
/// (tracked, like a signal), and every change notifies them.
#[derive(Clone, Copy)]
pub struct History {
    store: StoredValue<Store<Browser>, LocalStorage>,
    /// Notified whenever the entries, the notices or the reading state change.
    changed: Trigger,
}

impl History {
    /// Opens the history: reads only the manifest now, then the months in
    /// slices of about 12 ms (`SLICE_MS`), newest first, each in its
    /// own task after the first screen, so a large history never holds the
    /// page still. Views see each month as it completes.
    pub fn open() -> History {
        let history = History {
            store: StoredValue::new_local(Store::open_unread(Browser::open())),
            changed: Trigger::new(),
        };
        set_timeout(move || history.read_slice(0.0, 0.0, 1), std::time::Duration::ZERO);
        history
    }

    /// Reads one slice and schedules the next; `busy` and `longest` are the
    /// milliseconds spent so far and `slices` counts this one; all three are
    /// published for the benchmark and the browser tests when done.
    fn read_slice(self, busy: f64, longest: f64, slices: u32) {
        let started = js_sys::Date::now();
        let step = |s: &mut Store<Browser>| {
            let mut changed = false;
            // Small steps until the slice's time is used, so faster devices read more per slice.
            while s.is_reading() && js_sys::Date::now() - started < SLICE_MS {
                changed |= s.read_more(STEP);
            }
            (changed, s.is_reading())
        };
        let Some((changed, more)) = self.store.try_update_value(step) else {
            return;
        };
        let spent = js_sys::Date::now() - started;
        if changed {
            self.changed.notify();
        }
        let (busy, longest) = (busy + spent, longest.max(spent));
        if more {
            set_timeout(
                move || self.read_slice(busy, longest, slices + 1),
                std::time::Duration::ZERO,
            );
        } else {
            // Read by the benchmark script (tests/bench/history-bench.mjs).
            let global = js_sys::global();
            let _ = js_sys::Reflect::set(&global, &"lensplaneHistoryLongestSliceMs".into(), &longest.into());
            let _ = js_sys::Reflect::set(&global, &"lensplaneHistoryLoadMs".into(), &busy.into());
            let _ = js_sys::Reflect::set(&global, &"lensplaneHistorySlices".into(), &slices.into());
        }
    }

    /// Reads the history as it is now (tracked: a Memo or view that reads
    /// it runs again after every change). Reads no storage.
    pub fn with<R>(&self, f: impl FnOnce(&Store<Browser>) -> R) -> R {
        self.changed.track();
        self.store.with_value(f)
    }

    /// Whether older months are still being read (tracked).
    pub fn is_reading(&self) -> bool {
        self.with(Store::is_reading)
    }

    /// Reads whatever is left at once (before an export, for instance).
    pub fn finish_reading(&self) {
        if self.store.with_value(Store::is_reading) {
            self.update(Store::finish_reading);
        }
    }

    fn update<R>(&self, f: impl FnOnce(&mut Store<Browser>) -> R) -> R {
        let out = self
            .store
            .try_update_value(f)
            .expect("the store lives as long as the app");
        self.changed.notify();
        out
    }

    /// Saves a calculation; `Ok` says where it went, for the panel to show.
    pub fn save(&self, request: SaveRequest) -> Result<&'static str, StoreError> {
        let t = chrono::Utc::now().timestamp_millis();
        let id = format!("{t:x}-{:x}", (js_sys::Math::random() * 4_294_967_296.0) as u32);
        let label: String = request.label.trim().chars().take(entry::LABEL_MAX).collect();
        let query = request.query.encode(request.destination.keys());
        let entry = Entry::new(id, t, request.destination, query, label, request.eyes).with_summary(request.summary);
        self.update(|s| {
            s.add(entry)?;
            if let Mode::SessionOnly(_) = s.mode() {
                return Ok("Saved for this session only: this browser is not keeping stored data.");
            }
            // Ask once, ever, for storage the browser will not evict.
            if matches!(s.backend().read(PERSIST_ASKED_KEY), Ok(None))
                && s.backend_mut().write(PERSIST_ASKED_KEY, "1").is_ok()
            {
                browser::ask_persistence();
            }
            Ok("Saved to this device's history.")
        })
    }

    pub fn delete(&self, id: &str) -> Result<Entry, StoreError> {
        self.update(|s| s.delete(id))
    }

    /// Puts a deleted entry back (undo).
    pub fn restore(&self, entry: Entry) -> Result<(), StoreError> {
        self.update(|s| s.add(entry))
    }

    pub fn clear(&self) -> Result<usize, StoreError> {
        self.update(Store::clear)
    }

    pub fn import(&self, text: &str) -> Result<store::ImportReport, StoreError> {
        self.update(|s| s.import(text))
    }

    pub fn discard_aside(&self) {
        self.update(Store::discard_aside)
    }
}
