//! Keeps the address bar in step with the panel on screen, and carries the
//! prescriptions along when the user moves between panels.
//!
//! A panel is built from the link it opens with ([`initial_query`]) and
//! provides its inputs as a `Memo<Query>` ([`use_link_sync`]). Typing
//! replaces the address (`history.replaceState`: no history entries, and the
//! router's location does not change); a real navigation — a link, back or
//! forward — changes the router's location, and the shell then builds the
//! panel afresh from the new link. So nothing ever loads a link into a
//! panel that already exists.

use crate::link::{href, Destination, Query};
use leptos::prelude::*;
use leptos_router::hooks::use_location;

/// Where the app is deployed, without a trailing slash ("" at the root).
#[derive(Clone, Debug)]
pub struct Base(pub String);

/// The inputs of the panel on screen, as it provides them (set when the
/// panel is built; the shell derives the carried values from it).
#[derive(Clone, Copy)]
pub struct ActiveQuery(pub RwSignal<Option<(Destination, Memo<Query>)>>);

/// The inputs the calculators share (r, l, from, to, add, reading…),
/// gathered from every calculator opened so far, so the navigation opens
/// the next one with the same prescription.
#[derive(Clone, Copy)]
pub struct Carry(pub Memo<Query>);

impl Carry {
    /// The carried values: the panel on screen's inputs over what earlier
    /// calculators carried (a Memo that keeps its previous value, so the
    /// history or about page carries on what the last calculator had).
    pub fn new(active: ActiveQuery) -> Carry {
        Carry(Memo::new(move |previous: Option<&Query>| {
            let mut carried = previous.cloned().unwrap_or_default();
            // A panel that was replaced is gone: its memo reads as nothing.
            if let Some((dest, q)) = active.0.get().and_then(|(d, m)| Some((d, m.try_get()?))) {
                // Only what the panel would also take: the lens check's `r`
                // (a lens ordered) is not a refraction for the next panel.
                for key in dest.keys().iter().filter(|k| dest.carries(k)) {
                    carried.set(key, q.get(key).unwrap_or(""));
                }
            }
            carried
        }))
    }
}

/// The link of `dest` with whatever the panels currently carry.
pub fn carried_href(dest: Destination, carry: &Query) -> String {
    let mut q = Query::default();
    for key in dest.keys().iter().filter(|k| dest.carries(k)) {
        if let Some(v) = carry.get(key) {
            q.set(key, v);
        }
    }
    href(dest, &q)
}

fn replace_address(url: &str) {
    if let Some(history) = web_sys::window().and_then(|w| w.history().ok()) {
        let current = web_sys::window()
            .and_then(|w| w.location().href().ok())
            .unwrap_or_default();
        if !current.ends_with(url) {
            let _ = history.replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(url));
        }
    }
}

/// Provides the panel's inputs to the shell and writes them into the
/// address bar whenever they change.
pub fn use_link_sync(dest: Destination, current: Memo<Query>) {
    let base = use_context::<Base>().map(|b| b.0).unwrap_or_default();
    if let Some(ActiveQuery(active)) = use_context::<ActiveQuery>() {
        active.set(Some((dest, current)));
    }
    // The address bar is the outside world: an Effect is the place to write it.
    Effect::new(move |_| {
        let q = current.get();
        replace_address(&format!("{base}{}", href(dest, &q)));
    });
}

/// The query the panel was opened with.
pub fn initial_query() -> Query {
    Query::parse(&use_location().search.get_untracked())
}
