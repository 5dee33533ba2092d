//! What Lensplane computes, the model behind it, the cautions, the version,
//! and where the data lives.

use crate::shell::build_meta;
use leptos::prelude::*;

#[component]
pub fn AboutPanel() -> impl IntoView {
    view! {
        <h1>{crate::link::Destination::About.title()}</h1>
        <section class="prose" aria-labelledby="about-what">
            <h2 id="about-what">"What Lensplane computes"</h2>
            <ul>
                <li>"Vertex compensation: a prescription moved to the cornea (contact lens) or to another vertex distance, for each principal meridian, with orderable powers and what the rounded lens is worth back at the original plane."</li>
                <li>"Spherical equivalent: the spherical lens for a low cylinder at either plane, and whether it is a reasonable substitute (limits you can adjust)."</li>
                <li>"Near: accommodation at the reading distance through spectacles and through contact lenses, the relief the add gives at the eye, and the equivalent add at another plane by the vergence chain; amplitude by age after Hofstetter (1950)."</li>
            </ul>
        </section>
        <section class="prose" aria-labelledby="about-model">
            <h2 id="about-model">"The model"</h2>
            <p>"Thin lenses in air. The eye's reference plane is the corneal vertex, where a contact lens sits. Powers in dioptres; vertex distances in millimetres; reading distances in centimetres or inches. Light travels left to right; a near object has negative vergence. Cylinders are worked per principal meridian, never as a cylinder on its own; astigmatic residuals are power-vector differences (Thibos, Wheeler and Horner, 1997). Not modelled: the tear lens, rigid-lens astigmatism, flexure, toric rotation."</p>
        </section>
        <section class="prose" aria-labelledby="about-cautions">
            <h2 id="about-cautions">"Cautions"</h2>
            <p class="important">"Lensplane's results are not a prescription. They are starting points for a licensed practitioner, to be confirmed by over-refraction, acuity and trial. Practice follows local regulations."</p>
            <ul>
                {lensplane_core::cautions().map(|c| view! { <li>{c.to_string()}</li> }).collect_view()}
            </ul>
        </section>
        <section class="prose" aria-labelledby="about-data">
            <h2 id="about-data">"Your data"</h2>
            <p>"Everything stays on this device: Lensplane has no server, no account and sends nothing anywhere. The history lives in this browser's storage; export it from the history page to keep a copy. Store no names or patient identifiers."</p>
        </section>
        <section class="prose" aria-labelledby="about-version">
            <h2 id="about-version">"Version"</h2>
            <p>{format!("Lensplane {} · build {}", build_meta("lensplane-version"), build_meta("lensplane-build"))}</p>
        </section>
    }
}
