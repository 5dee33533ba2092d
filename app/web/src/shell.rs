//! The app shell: header, compact navigation, the four destinations.

use crate::panels::{EquivalentPanel, HistoryPanel, NearPanel, VertexPanel};
use leptos::prelude::*;
use leptos_router::components::{Redirect, Route, Router, Routes, A};
use leptos_router::path;

/// Where the app is deployed ("/" or "/sub/"), as recorded by boot.js.
fn deploy_base() -> String {
    let root = js_sys::Reflect::get(&js_sys::global(), &wasm_bindgen::JsValue::from_str("LENSPLANE_ROOT"))
        .ok()
        .and_then(|v| v.as_string())
        .unwrap_or_else(|| "/".into());
    root.trim_end_matches('/').to_string()
}

#[component]
pub fn App() -> impl IntoView {
    provide_context(crate::history::History::new());
    view! {
        <Router base=deploy_base()>
            <header class="masthead">
                <span class="brand">"Lensplane"</span>
            </header>
            <nav class="destinations" aria-label="Calculators">
                <A href="/vertex">"Vertex"</A>
                <A href="/equivalent">"Sph. equivalent"</A>
                <A href="/near">"Near"</A>
                <A href="/history">"History"</A>
            </nav>
            <main id="main">
                <Routes fallback=|| view! { <p>"This page does not exist in Lensplane."</p> }>
                    <Route path=path!("/") view=|| view! { <Redirect path="vertex"/> }/>
                    <Route path=path!("/vertex") view=VertexPanel/>
                    <Route path=path!("/equivalent") view=EquivalentPanel/>
                    <Route path=path!("/near") view=NearPanel/>
                    <Route path=path!("/history") view=HistoryPanel/>
                </Routes>
            </main>
        </Router>
    }
}
