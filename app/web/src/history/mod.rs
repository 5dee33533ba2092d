//! The on-device history of saved calculations.
//!
//! Panels save through the [`History`] handle provided as context by the app
//! shell; the history destination lists, filters, restores (through the link
//! format), deletes and exports entries.
//!
//! This is the contract the panels rely on. The durable store behind it
//! lives in the modules of this folder: [`schema`] (what is stored, versions,
//! migration), [`store`] (the store's logic behind a small storage interface,
//! with an in-memory backend for tests), [`export`] (JSON/CSV, import checks,
//! local times) and `browser` (localStorage through gloo-storage).

mod browser;
pub mod export;
pub mod json;
pub mod schema;
pub mod store;

use crate::link::{Destination, Query};
pub use browser::download;
use browser::Browser;
use leptos::prelude::*;
use schema::{Entry, PERSIST_ASKED_KEY};
use store::{Backend, Mode, Store};

/// One eye of a saved calculation, as the practitioner reads it.
#[derive(Clone, Debug, PartialEq)]
pub struct EyeSummary {
    /// "R" or "L".
    pub eye: String,
    /// The prescription entered, in trade notation.
    pub input: String,
    /// The main result, in trade notation (e.g. the compensated prescription).
    pub result: String,
    /// The orderable value, when the panel has one.
    pub order: Option<String>,
}

/// What a panel hands over when the user saves.
#[derive(Clone, Debug, PartialEq)]
pub struct SaveRequest {
    pub panel: Destination,
    /// The panel's inputs exactly as typed (restores the panel through its link).
    pub query: Query,
    /// Optional short label (no patient identifiers).
    pub label: String,
    pub eyes: Vec<EyeSummary>,
}

/// Milliseconds of reading per slice while opening the history (a frame
/// or so: the page stays responsive between slices).
const SLICE_MS: f64 = 12.0;
/// Entries read between looks at the clock (about 2 ms with the CPU slowed 4×).
const STEP: usize = 64;

/// The handle panels use to save, and the history destination uses for
/// everything else; provided as context by the app shell. The store is
/// opened on first use, so a large history never delays the first screen.
#[derive(Clone, Copy)]
pub struct History {
    store: StoredValue<Option<Store<Browser>>, LocalStorage>,
    /// Bumped on every change, so views re-read.
    rev: RwSignal<u32>,
}

impl History {
    pub fn new() -> History {
        History {
            store: StoredValue::new_local(None),
            rev: RwSignal::new(0),
        }
    }

    /// Opens the store if it is not open yet. The months are then read in
    /// slices of about [`SLICE_MS`] milliseconds, newest first, each in its own task, so a
    /// large history never holds the page still; views see each month as it
    /// completes.
    pub fn open(&self) {
        if self.store.with_value(Option::is_some) {
            return;
        }
        self.store.set_value(Some(Store::open_unread(Browser::open())));
        // No notification for the first slice: `open` runs as a view starts
        // reading, which then sees what it read.
        self.read_slice(0.0, 0.0, 1, false);
    }

    /// Reads one slice and schedules the next; `busy` and `longest` are the
    /// milliseconds spent so far and `slices` counts this one; all three are
    /// published for the benchmark and the browser tests when done.
    fn read_slice(self, busy: f64, longest: f64, slices: u32, notify: bool) {
        let started = js_sys::Date::now();
        let step = |s: &mut Store<Browser>| {
            let mut changed = false;
            // Small steps until the slice's time is used, so faster devices read more per slice.
            while s.is_reading() && js_sys::Date::now() - started < SLICE_MS {
                changed |= s.read_more(STEP);
            }
            (changed, s.is_reading())
        };
        let Some((changed, more)) = self.store.try_update_value(|s| s.as_mut().map(step)).flatten() else {
            return;
        };
        let spent = js_sys::Date::now() - started;
        if changed && notify {
            self.rev.update(|r| *r += 1);
        }
        let (busy, longest) = (busy + spent, longest.max(spent));
        if more {
            set_timeout(
                move || self.read_slice(busy, longest, slices + 1, true),
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

    /// Whether older months are still being read (tracked).
    pub fn is_reading(&self) -> bool {
        self.with(Store::is_reading)
    }

    /// Reads whatever is left at once (before an export, for instance).
    pub fn finish_reading(&self) {
        if self.store.with_value(|s| s.as_ref().is_some_and(Store::is_reading)) {
            self.update(Store::finish_reading);
        }
    }

    /// Reads the store (opening it if needed); tracks changes.
    pub fn with<R>(&self, f: impl FnOnce(&Store<Browser>) -> R) -> R {
        self.open();
        self.rev.track();
        self.store.with_value(|s| f(s.as_ref().expect("opened")))
    }

    fn update<R>(&self, f: impl FnOnce(&mut Store<Browser>) -> R) -> R {
        self.open();
        let out = self
            .store
            .try_update_value(|s| f(s.as_mut().expect("opened")))
            .expect("the store lives as long as the app");
        self.rev.update(|r| *r += 1);
        out
    }

    /// Saves a calculation; the message says what happened, for the panel to show.
    pub fn save(&self, request: SaveRequest) -> Result<String, String> {
        let t = chrono::Utc::now().timestamp_millis();
        let id = format!("{t:x}-{:x}", (js_sys::Math::random() * 4_294_967_296.0) as u32);
        let label: String = request.label.trim().chars().take(schema::LABEL_MAX).collect();
        let query = request.query.encode(request.panel.keys());
        let entry = Entry::new(
            id,
            t,
            schema::panel_name(request.panel).into(),
            query,
            label,
            request.eyes,
        );
        self.update(|s| {
            s.add(entry)?;
            match &s.mode {
                Mode::SessionOnly(_) => {
                    Ok("Saved for this session only: this browser is not keeping stored data.".into())
                }
                Mode::Durable => {
                    // Ask once, ever, for storage the browser will not evict.
                    if matches!(s.backend().read(PERSIST_ASKED_KEY), Ok(None))
                        && s.backend_mut().write(PERSIST_ASKED_KEY, "1").is_ok()
                    {
                        browser::ask_persistence();
                    }
                    Ok("Saved to this device's history.".into())
                }
            }
        })
    }

    pub fn delete(&self, id: &str) -> Result<Entry, String> {
        self.update(|s| s.delete(id))
    }

    /// Puts a deleted entry back (undo).
    pub fn restore(&self, entry: Entry) -> Result<(), String> {
        self.update(|s| s.add(entry))
    }

    pub fn clear(&self) -> Result<usize, String> {
        self.update(|s| s.clear())
    }

    pub fn import(&self, text: &str) -> Result<store::ImportReport, String> {
        self.update(|s| s.import(text))
    }

    pub fn discard_aside(&self) -> Result<(), String> {
        self.update(|s| s.discard_aside())
    }
}

impl Default for History {
    fn default() -> Self {
        History::new()
    }
}
