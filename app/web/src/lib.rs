//! Lensplane's user interface (Leptos, client-side rendered).
//!
//! The views only read what `lensplane_core` computes: this crate does no
//! arithmetic of its own. Plain logic (the link format, stored history) lives
//! in ordinary types with native tests; components only display them.

pub mod history;
pub mod link;
mod panels;
mod prefs;
mod shell;
mod sync;
mod theme;
mod widgets;

use leptos::prelude::*;

pub use shell::App;

/// Mounts the app into `<div id="app">` (or the body when it is missing).
pub fn start() {
    let target = document().get_element_by_id("app");
    match target.and_then(|el| wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlElement>(el).ok()) {
        Some(el) => leptos::mount::mount_to(el, App).forget(),
        None => leptos::mount::mount_to_body(App),
    }
}
