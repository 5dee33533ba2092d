//! The app shell: masthead, compact navigation, the four destinations,
//! the connection indicator and the footer.

use crate::history::History;
use crate::link::{Destination, Query};
use crate::panels::{AboutPanel, EquivalentPanel, HistoryBanner, HistoryPanel, NearPanel, VertexPanel};
use crate::sync::{carried_href, Base, Carry};
use crate::theme::ThemeButton;
use leptos::prelude::*;
use leptos_router::components::{Redirect, Router, A};
use leptos_router::hooks::use_location;

/// Where the app is deployed ("" or "/sub"), as recorded by boot.js.
fn deploy_base() -> String {
    let root = js_sys::Reflect::get(&js_sys::global(), &wasm_bindgen::JsValue::from_str("LENSPLANE_ROOT"))
        .ok()
        .and_then(|v| v.as_string())
        .unwrap_or_else(|| "/".into());
    root.trim_end_matches('/').to_string()
}

/// The build id and version written into the page by the build.
pub fn build_meta(name: &str) -> String {
    document()
        .query_selector(&format!("meta[name=\"{name}\"]"))
        .ok()
        .flatten()
        .and_then(|m| m.get_attribute("content"))
        .unwrap_or_else(|| "unknown".into())
}


/// Online/offline, from the browser's own events.
#[component]
fn ConnectionBadge() -> impl IntoView {
    let online = RwSignal::new(window().navigator().on_line());
    let on = window_event_listener(leptos::ev::online, move |_| online.set(true));
    let off = window_event_listener(leptos::ev::offline, move |_| online.set(false));
    on_cleanup(move || {
        on.remove();
        off.remove();
    });
    view! {
        <span class="connection" class:offline=move || !online.get() role="status">
            {move || if online.get() { "Online" } else { "Offline: everything still works" }}
        </span>
    }
}

/// The page the router's location names. Lensplane's destinations are five
/// fixed paths with no nesting and no route data, so the location is matched
/// here with [`Destination::route`] instead of through `<Routes>`, whose
/// general machinery (nested matching, async route data) cost about 40 KB
/// gzip of the shell. A panel is rebuilt only when the destination changes.
#[component]
fn Page(base: String) -> impl IntoView {
    let location = use_location();
    let route = Memo::new(move |_| location.pathname.with(|p| Destination::route(p, &base)));
    move || match route.get() {
        None => view! { <Redirect path="vertex"/> }.into_any(),
        Some(Some(d)) => match d {
            Destination::Vertex => view! { <VertexPanel/> }.into_any(),
            Destination::Equivalent => view! { <EquivalentPanel/> }.into_any(),
            Destination::Near => view! { <NearPanel/> }.into_any(),
            Destination::History => view! { <HistoryPanel/> }.into_any(),
            Destination::About => view! { <AboutPanel/> }.into_any(),
        },
        Some(None) => view! { <h1>"Not found"</h1><p>"This page does not exist in Lensplane."</p> }.into_any(),
    }
}

#[component]
pub fn App() -> impl IntoView {
    let base = deploy_base();
    provide_context(Base(base.clone()));
    provide_context(History::new());
    let carry = RwSignal::new(Query::default());
    provide_context(Carry(carry));
    let link_base = base.clone();
    let about_base = base.clone();
    let page_base = base.clone();
    let links = move || {
        Destination::NAV
            .into_iter()
            .map(|d| {
                // The router does not add its base to absolute links.
                let b = link_base.clone();
                let href = move || format!("{b}{}", carried_href(d, &carry.get()));
                view! { <A href=href>{d.label()}</A> }
            })
            .collect_view()
    };
    view! {
        <Router base=base>
            <a class="skip-link" href="#main">"Skip to the calculator"</a>
            <header class="masthead">
                <span class="brand">
                    <img src="icons/icon.svg" alt="" width="28" height="28"/>
                    "Lensplane"
                </span>
                <span class="masthead-tools">
                    <ConnectionBadge/>
                    <ThemeButton/>
                    <A href=format!("{about_base}/about")>"About"</A>
                </span>
            </header>
            <nav class="destinations" aria-label="Calculators">{links}</nav>
            <HistoryBanner/>
            <main id="main" tabindex="-1">
                <Page base=page_base/>
            </main>
            <footer class="colophon">
                <p>"Lensplane computes starting points, not prescriptions. Follow local regulations and licensed practice. Everything stays on this device."</p>
                <p class="build">{format!("Version {} · build {}", build_meta("lensplane-version"), build_meta("lensplane-build"))}</p>
            </footer>
        </Router>
    }
}
