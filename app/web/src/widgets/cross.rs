//! The power cross: both principal meridians at their true angles (ISO 8429:
//! counter-clockwise from the right as seen facing the patient), each
//! labelled with its power before and after the move. The browser rotates
//! the lines; nothing is computed here.

use lensplane_core::{fmt_power, Meridian, PowerCross};
use leptos::prelude::*;

fn meridian_view(before: Meridian, after: Meridian, class: &'static str) -> impl IntoView {
    let angle = before.axis;
    let rotate = format!("rotate(-{angle} 150 110)");
    let unrotate = format!("rotate({angle} 245 110)");
    view! {
        <g class=class transform=rotate>
            <line x1="60" y1="110" x2="240" y2="110"/>
            <text x="245" y="110" transform=unrotate text-anchor="middle">
                <tspan class="before" x="245" dy="-0.2em">{fmt_power(before.power)}</tspan>
                <tspan class="after" x="245" dy="1.15em">{fmt_power(after.power)}</tspan>
            </text>
        </g>
    }
}

#[component]
pub fn PowerCrossDiagram(before: PowerCross, after: PowerCross, #[prop(into)] label: String) -> impl IntoView {
    let [b1, b2] = before.both();
    let [a1, a2] = after.both();
    view! {
        <figure class="power-cross">
            <svg viewBox="0 0 300 220" role="img" aria-label=label>
                <circle cx="150" cy="110" r="3" class="centre"/>
                {meridian_view(b1, a1, "meridian first")}
                {meridian_view(b2, a2, "meridian second")}
            </svg>
            <figcaption>
                <span class="before">"before"</span>" / "<span class="after">"after"</span>
                ", per principal meridian (D)"
            </figcaption>
        </figure>
    }
}
