//! The Chart destination (being built).

use crate::link::Destination;
use leptos::prelude::*;

#[component]
pub fn ChartPanel() -> impl IntoView {
    view! {
        <h1>{Destination::Chart.title()}</h1>
    }
}
