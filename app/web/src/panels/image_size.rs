//! The ImageSize destination (being built).

use crate::link::Destination;
use leptos::prelude::*;

#[component]
pub fn ImageSizePanel() -> impl IntoView {
    view! {
        <h1>{Destination::ImageSize.title()}</h1>
    }
}
