//! One module per destination.

use leptos::prelude::*;

#[component]
pub fn VertexPanel() -> impl IntoView {
    view! { <h1>"Vertex"</h1> }
}

#[component]
pub fn EquivalentPanel() -> impl IntoView {
    view! { <h1>"Spherical equivalent"</h1> }
}

#[component]
pub fn NearPanel() -> impl IntoView {
    view! { <h1>"Near"</h1> }
}

#[component]
pub fn HistoryPanel() -> impl IntoView {
    view! { <h1>"History"</h1> }
}
