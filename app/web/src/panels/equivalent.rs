//! The Spherical equivalent destination.

use leptos::prelude::*;

#[component]
pub fn EquivalentPanel() -> impl IntoView {
    view! { <h1>"Spherical equivalent"</h1> }
}
