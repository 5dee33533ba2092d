//! The app shell: masthead, the navigation to every destination,
//! the connection indicator and the footer.

use crate::history::History;
use crate::link::Destination;
use crate::panels::{
    AboutPanel, ChartPanel, EquivalentPanel, HistoryBanner, HistoryPanel, ImageSizePanel, LensCheckPanel, NearPanel,
    OverRefractionPanel, VertexPanel,
};
use crate::prefs::{FieldsShown, Remembered};
use crate::sync::{carried_href, ActiveQuery, Base, Carry};
use crate::theme::ThemeButton;
use leptos::prelude::*;
use leptos::wasm_split::{wasm_split, SplitLoaderError};
use leptos_router::components::Router;
use leptos_router::hooks::use_location;
use leptos_router::location::{BrowserUrl, LocationProvider};
use send_wrapper::SendWrapper;
use std::future::Future;
use std::pin::Pin;

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

/// The page the router's location names. Lensplane's destinations are
/// fixed paths with no nesting and no route data, so the location is matched
/// here with [`Destination::route`] instead of through `<Routes>`, whose
/// general machinery (nested matching, async route data) cost about 27 KB
/// gzip of the shell. The page is rebuilt when the destination or its link
/// changes by a real navigation (a link, back, forward): a panel is always
/// built from the link it shows. The app's root shows the vertex panel,
/// whose link then replaces the root in the address bar.
#[component]
fn Page(base: String) -> impl IntoView {
    let location = use_location();
    let provider = use_context::<BrowserUrl>();
    let page = Memo::new(move |_| {
        let d = location.pathname.with(|p| Destination::route(p, &base));
        (d.unwrap_or(Some(Destination::Vertex)), location.search.get())
    });
    // The router writes a new path into the address bar only once the page
    // for it is ready, as `<Routes>` would tell it; the title follows.
    Effect::new(move |_| {
        let (d, _) = page.get();
        if let Some(p) = &provider {
            p.ready_to_complete();
        }
        let title = d.map_or("Not found", Destination::title);
        document().set_title(&format!("{title} · Lensplane"));
    });
    move || match page.get().0 {
        Some(Destination::Vertex) => view! { <VertexPanel/> }.into_any(),
        Some(d @ Destination::Equivalent) => lazy_page(d, || Box::pin(equivalent_page())),
        Some(d @ Destination::Near) => lazy_page(d, || Box::pin(near_page())),
        Some(d @ Destination::OverRefraction) => lazy_page(d, || Box::pin(over_refraction_page())),
        Some(d @ Destination::ImageSize) => lazy_page(d, || Box::pin(image_size_page())),
        Some(d @ Destination::Chart) => lazy_page(d, || Box::pin(chart_page())),
        Some(d @ Destination::LensCheck) => lazy_page(d, || Box::pin(lens_check_page())),
        Some(d @ Destination::History) => lazy_page(d, || Box::pin(history_page())),
        Some(d @ Destination::About) => lazy_page(d, || Box::pin(about_page())),
        None => view! { <h1>"Not found"</h1><p>"This page does not exist in Lensplane."</p> }.into_any(),
    }
}

// Every destination but the landing one (vertex) is its own wasm chunk: each
// function below is a split point (`wasm_split`, the macro behind Leptos'
// `#[lazy]`, in its `fallible` form, so that a chunk that cannot be fetched is
// an `Err` the page shows instead of a trap). The build splits the module at
// these functions (app/tool/src/split.rs); the name before the options is the
// chunk's name, which boot.js and the build's size report use too: the
// destination's id with `_` for `-`. To make another destination lazy, add one
// such function and call it from `Page` through `lazy_page`.

#[wasm_split(equivalent, fallible, wasm_split_path = ::leptos::wasm_split)]
fn equivalent_page() -> Result<AnyView, SplitLoaderError> {
    Ok(view! { <EquivalentPanel/> }.into_any())
}

#[wasm_split(near, fallible, wasm_split_path = ::leptos::wasm_split)]
fn near_page() -> Result<AnyView, SplitLoaderError> {
    Ok(view! { <NearPanel/> }.into_any())
}

#[wasm_split(over_refraction, fallible, wasm_split_path = ::leptos::wasm_split)]
fn over_refraction_page() -> Result<AnyView, SplitLoaderError> {
    Ok(view! { <OverRefractionPanel/> }.into_any())
}

#[wasm_split(image_size, fallible, wasm_split_path = ::leptos::wasm_split)]
fn image_size_page() -> Result<AnyView, SplitLoaderError> {
    Ok(view! { <ImageSizePanel/> }.into_any())
}

#[wasm_split(chart, fallible, wasm_split_path = ::leptos::wasm_split)]
fn chart_page() -> Result<AnyView, SplitLoaderError> {
    Ok(view! { <ChartPanel/> }.into_any())
}

#[wasm_split(lens_check, fallible, wasm_split_path = ::leptos::wasm_split)]
fn lens_check_page() -> Result<AnyView, SplitLoaderError> {
    Ok(view! { <LensCheckPanel/> }.into_any())
}

#[wasm_split(history, fallible, wasm_split_path = ::leptos::wasm_split)]
fn history_page() -> Result<AnyView, SplitLoaderError> {
    Ok(view! { <HistoryPanel/> }.into_any())
}

#[wasm_split(about, fallible, wasm_split_path = ::leptos::wasm_split)]
fn about_page() -> Result<AnyView, SplitLoaderError> {
    Ok(view! { <AboutPanel/> }.into_any())
}

/// A lazy destination's view while its chunk loads.
type Opening = Pin<Box<dyn Future<Output = Result<AnyView, SplitLoaderError>>>>;

/// A lazy destination: nothing while its chunk arrives (from the worker's
/// cache that is one task), then the panel; if the chunk cannot be had, a
/// message at the page and a retry, which starts a fresh load (a failed load
/// is not remembered, in the loader or here).
fn lazy_page(d: Destination, open: fn() -> Opening) -> AnyView {
    let retry = Trigger::new();
    let page = move || {
        retry.track();
        // The load is not Send, the view is only ever polled on the page's one thread.
        let opening = SendWrapper::new(open());
        Suspend::new(async move { opening.await.unwrap_or_else(|_| not_loaded(d, retry)) })
    };
    // The lazy destinations' styles (panels.css) load with their code, not with the landing page.
    view! { <link rel="stylesheet" href=build_meta("lensplane-panels-css")/> {page} }.into_any()
}

/// The page shown when a destination's chunk could not be loaded.
fn not_loaded(d: Destination, retry: Trigger) -> AnyView {
    view! {
        <h1>{d.title()}</h1>
        <div class="load-failed" role="alert">
            <p>"This page of Lensplane could not be loaded: it is not stored on this device yet and the network did not deliver it. Check the connection, then try again. Nothing you typed is lost: it is kept in the link."</p>
            <button type="button" class="button primary" on:click=move |_| retry.notify()>"Retry"</button>
        </div>
    }
    .into_any()
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

/// Every destination under its one name, the current one marked. The links
/// wrap onto as many rows as the width needs, so any destination is one tap
/// away at any width without sideways scrolling.
#[component]
fn Destinations(base: String, carry: Carry) -> impl IntoView {
    let here = use_location();
    let route_base = base.clone();
    let current = Memo::new(move |_| here.pathname.with(|p| Destination::route(p, &route_base)));
    let links = Destination::ALL
        .into_iter()
        .map(|d| {
            // Plain links: the router follows them in place; the base is ours to add.
            let b = base.clone();
            let href = move || format!("{b}{}", carry.0.with(|c| carried_href(d, c)));
            // The root shows the vertex panel.
            let is_current = move || (current.get().unwrap_or(Some(Destination::Vertex)) == Some(d)).then_some("page");
            view! { <li><a href=href aria-current=is_current>{d.title()}</a></li> }
        })
        .collect_view();
    view! {
        <nav class="destinations" aria-label="Calculators">
            <ul>{links}</ul>
        </nav>
    }
}

/// The app's mark, drawn in the page from the icon file itself (sized by
/// the stylesheet): no request at start-up, and no separate SVG document to
/// parse, which an `<img>` of the file needs.
#[component]
fn BrandMark() -> impl IntoView {
    view! { <span class="brand-mark" aria-hidden="true" inner_html=include_str!("../../../public/icons/icon.svg")></span> }
}

#[component]
pub fn App() -> impl IntoView {
    let base = deploy_base();
    provide_context(Base(base.clone()));
    // Opened once, here: the manifest now, the months in slices after the first screen.
    provide_context(History::open());
    provide_context(FieldsShown(Remembered::new("lensplane.fields")));
    let active = ActiveQuery(RwSignal::new(None));
    provide_context(active);
    let carry = Carry::new(active);
    let nav_base = base.clone();
    let page_base = base.clone();
    view! {
        <Router base=base>
            <a class="skip-link" href="#main" on:click=skip_to_main>"Skip to the calculator"</a>
            <header class="masthead">
                <span class="brand">
                    <BrandMark/>
                    "Lensplane"
                </span>
                <span class="masthead-tools">
                    <ConnectionBadge/>
                    <ThemeButton/>
                </span>
            </header>
            <Destinations base=nav_base carry=carry/>
            <HistoryBanner/>
            <main id="main" tabindex="-1">
                <Page base=page_base/>
            </main>
            <footer class="colophon">
                <p>"Starting points, not prescriptions: follow local regulations and licensed practice. Everything stays on this device."
                    " "<span class="build">{format!("Version {} · build {}", build_meta("lensplane-version"), build_meta("lensplane-build"))}</span></p>
            </footer>
        </Router>
    }
}
