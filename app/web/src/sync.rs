//! Keeps the address bar and a panel's inputs in step, both ways, and
//! carries the prescriptions along when the user moves between panels.

use crate::link::{href, Destination, Query};
use leptos::prelude::*;
use leptos_router::hooks::use_location;

/// Where the app is deployed, without a trailing slash ("" at the root).
#[derive(Clone, Debug)]
pub struct Base(pub String);

/// The inputs the panels share (r, l, from, to, add, reading…), so the
/// navigation opens the next panel with the same prescription.
#[derive(Clone, Copy)]
pub struct Carry(pub RwSignal<Query>);

/// The link of `dest` with whatever the panels currently carry.
pub fn carried_href(dest: Destination, carry: &Query) -> String {
    let mut q = Query::default();
    for key in dest.keys() {
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

/// Writes `current` into the address bar whenever it changes, and calls
/// `load` when the address changes from outside (a link opened within the
/// same panel, back/forward).
pub fn use_link_sync(dest: Destination, current: Memo<Query>, load: impl Fn(&Query) + 'static) {
    let location = use_location();
    let base = use_context::<Base>().map(|b| b.0).unwrap_or_default();
    let carry = use_context::<Carry>();
    let written = StoredValue::new(String::new());

    Effect::new(move |previous: Option<()>| {
        let raw = location.search.get();
        // The panel was built from the link it opened with; only later
        // changes need loading.
        if previous.is_some() {
            let q = Query::parse(&raw);
            if q.encode(dest.keys()) != written.get_value() {
                load(&q);
            }
        }
    });

    Effect::new(move |_| {
        let q = current.get();
        written.set_value(q.encode(dest.keys()));
        replace_address(&format!("{base}{}", href(dest, &q)));
        if let Some(Carry(carry)) = carry {
            carry.update(|c| {
                for key in dest.keys() {
                    c.set(key, q.get(key).unwrap_or(""));
                }
            });
        }
    });
}

/// The query the panel was opened with.
pub fn initial_query() -> Query {
    Query::parse(&use_location().search.get_untracked())
}
