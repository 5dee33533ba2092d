//! The app shell: masthead, compact navigation, the four destinations,
//! the connection indicator and the footer.

use crate::history::History;
use crate::link::{Destination, Query};
use crate::panels::{AboutPanel, EquivalentPanel, HistoryBanner, HistoryPanel, NearPanel, VertexPanel};
use crate::sync::{carried_href, Base, Carry};
use crate::theme::ThemeButton;
use leptos::prelude::*;
use leptos_router::components::Router;
use leptos_router::hooks::{use_location, use_navigate};
use leptos_router::location::{BrowserUrl, LocationProvider};
use leptos_router::NavigateOptions;

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
/// general machinery (nested matching, async route data) cost about 27 KB
/// gzip of the shell. A panel is rebuilt only when the destination changes.
#[component]
fn Page(base: String) -> impl IntoView {
    let location = use_location();
    let provider = use_context::<BrowserUrl>();
    let navigate = use_navigate();
    let root = format!("{base}/vertex");
    let route = Memo::new(move |_| location.pathname.with(|p| Destination::route(p, &base)));
    move || {
        let page = match route.get() {
            None => {
                // The root opens the vertex panel in place of itself (back does not return to it).
                navigate(
                    &root,
                    NavigateOptions {
                        replace: true,
                        resolve: false,
                        ..NavigateOptions::default()
                    },
                );
                ().into_any()
            }
            Some(Some(d)) => match d {
                Destination::Vertex => view! { <VertexPanel/> }.into_any(),
                Destination::Equivalent => view! { <EquivalentPanel/> }.into_any(),
                Destination::Near => view! { <NearPanel/> }.into_any(),
                Destination::History => view! { <HistoryPanel/> }.into_any(),
                Destination::About => view! { <AboutPanel/> }.into_any(),
            },
            Some(None) => view! { <h1>"Not found"</h1><p>"This page does not exist in Lensplane."</p> }.into_any(),
        };
        // The router writes a new path into the address bar only once the
        // page for it is ready, as `<Routes>` would tell it.
        if let Some(p) = &provider {
            p.ready_to_complete();
        }
        page
    }
}

/// The skip link moves focus to the main region itself: the router would
/// otherwise take the click for a navigation and leave the focus where it was.
fn skip_to_main(ev: leptos::ev::MouseEvent) {
    ev.prevent_default();
    if let Some(main) = document()
        .get_element_by_id("main")
        .and_then(|m| wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlElement>(m).ok())
    {
        let _ = main.focus();
        main.scroll_into_view();
    }
}

#[component]
pub fn App() -> impl IntoView {
    let base = deploy_base();
    provide_context(Base(base.clone()));
    // Opened once, here: the manifest now, the months in slices after the first screen.
    provide_context(History::open());
    let carry = RwSignal::new(Query::default());
    provide_context(Carry(carry));
    let link_base = base.clone();
    let about_base = base.clone();
    let page_base = base.clone();
    let links = move || {
        Destination::NAV
            .into_iter()
            .map(|d| {
                // Plain links: the router follows them in place; the base is ours to add.
                let b = link_base.clone();
                let route_base = link_base.clone();
                let href = move || format!("{b}{}", carried_href(d, &carry.get()));
                let here = use_location();
                let current = move || {
                    here.pathname
                        .with(|p| Destination::route(p, &route_base) == Some(Some(d)))
                        .then_some("page")
                };
                view! { <a href=href aria-current=current>{d.label()}</a> }
            })
            .collect_view()
    };
    view! {
        <Router base=base>
            <a class="skip-link" href="#main" on:click=skip_to_main>"Skip to the calculator"</a>
            <header class="masthead">
                <span class="brand">
                    <img src="icons/icon.svg" alt="" width="28" height="28"/>
                    "Lensplane"
                </span>
                <span class="masthead-tools">
                    <ConnectionBadge/>
                    <ThemeButton/>
                    <a href=format!("{about_base}/about")>"About"</a>
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
