//! The OverRefraction destination (being built).

use crate::link::Destination;
use leptos::prelude::*;

#[component]
pub fn OverRefractionPanel() -> impl IntoView {
    view! {
        <h1>{Destination::OverRefraction.title()}</h1>
    }
}
