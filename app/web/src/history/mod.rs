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

pub mod export;
pub mod json;
pub mod schema;
pub mod store;
mod browser;

pub use browser::download;
use browser::Browser;
use crate::link::{Destination, Query};
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
        History { store: StoredValue::new_local(None), rev: RwSignal::new(0) }
    }

    /// Opens the store if it is not open yet.
    pub fn open(&self) {
        if self.store.with_value(Option::is_some) {
            return;
        }
        let started = js_sys::Date::now();
        let store = Store::open(Browser::open());
        // Read by the benchmark script.
        let _ = js_sys::Reflect::set(&js_sys::global(), &"lensplaneHistoryLoadMs".into(), &(js_sys::Date::now() - started).into());
        // No notification: every reader opens through `with` before reading.
        self.store.set_value(Some(store));
    }

    /// Reads the store (opening it if needed); tracks changes.
    pub fn with<R>(&self, f: impl FnOnce(&Store<Browser>) -> R) -> R {
        self.open();
        self.rev.track();
        self.store.with_value(|s| f(s.as_ref().expect("opened")))
    }

    fn update<R>(&self, f: impl FnOnce(&mut Store<Browser>) -> R) -> R {
        self.open();
        let out = self.store.try_update_value(|s| f(s.as_mut().expect("opened"))).expect("the store lives as long as the app");
        self.rev.update(|r| *r += 1);
        out
    }

    /// Saves a calculation; the message says what happened, for the panel to show.
    pub fn save(&self, request: SaveRequest) -> Result<String, String> {
        let t = chrono::Utc::now().timestamp_millis();
        let id = format!("{t:x}-{:x}", (js_sys::Math::random() * 4_294_967_296.0) as u32);
        let label: String = request.label.trim().chars().take(schema::LABEL_MAX).collect();
        let query = request.query.encode(request.panel.keys());
        let entry = Entry::new(id, t, schema::panel_name(request.panel).into(), query, label, request.eyes);
        self.update(|s| {
            s.add(entry)?;
            match &s.mode {
                Mode::SessionOnly(_) => Ok("Saved for this session only: this browser is not keeping stored data.".into()),
                Mode::Durable => {
                    // Ask once, ever, for storage the browser will not evict.
                    if matches!(s.backend().read(PERSIST_ASKED_KEY), Ok(None)) && s.backend_mut().write(PERSIST_ASKED_KEY, "1").is_ok() {
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

    /// How many entries are held.
    pub fn len(&self) -> usize {
        self.with(|s| s.entries().len())
    }
}

impl Default for History {
    fn default() -> Self {
        History::new()
    }
}
