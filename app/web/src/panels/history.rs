//! The History destination.

use leptos::prelude::*;

#[component]
pub fn HistoryPanel() -> impl IntoView {
    view! { <h1>"History"</h1> }
}
