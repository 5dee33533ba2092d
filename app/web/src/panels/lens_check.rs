//! The LensCheck destination (being built).

use crate::link::Destination;
use leptos::prelude::*;

#[component]
pub fn LensCheckPanel() -> impl IntoView {
    view! {
        <h1>{Destination::LensCheck.title()}</h1>
    }
}
