//! The Near add destination.

use leptos::prelude::*;

#[component]
pub fn NearPanel() -> impl IntoView {
    view! { <h1>"Near add"</h1> }
}
