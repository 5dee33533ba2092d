//! The Vertex destination.

use leptos::prelude::*;

#[component]
pub fn VertexPanel() -> impl IntoView {
    view! { <h1>"Vertex"</h1> }
}
