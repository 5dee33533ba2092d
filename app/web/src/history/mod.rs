//! The on-device history of saved calculations.
//!
//! Panels save through the [`History`] handle provided as context by the app
//! shell; the history destination lists, filters, restores (through the link
//! format), deletes and exports entries.
//!
//! This is the contract the panels rely on. The durable store behind it
//! (gloo-storage, schema versions, fault handling, import/export) lives in
//! the modules of this folder.

use crate::link::{Destination, Query};
use leptos::prelude::*;
use serde::{Deserialize, Serialize};

/// One eye of a saved calculation, as the practitioner reads it.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
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

/// The handle panels use to save; provided as context by the app shell.
#[derive(Clone, Copy)]
pub struct History {
    saved: RwSignal<Vec<SaveRequest>>,
}

impl History {
    pub fn new() -> History {
        History { saved: RwSignal::new(Vec::new()) }
    }

    /// Saves a calculation; the message says what happened, for the panel to show.
    pub fn save(&self, request: SaveRequest) -> Result<String, String> {
        self.saved.update(|v| v.push(request));
        Ok("Saved to this device's history.".into())
    }

    /// How many entries are held (for the history destination's placeholder view).
    pub fn len(&self) -> usize {
        self.saved.with(Vec::len)
    }
}

impl Default for History {
    fn default() -> Self {
        History::new()
    }
}
