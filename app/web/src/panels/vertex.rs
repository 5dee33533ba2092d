//! The vertex destination: a full prescription for each eye moved to the
//! cornea (contact lens) or to another vertex distance.

use super::common::{summary, EyeOutcome, EyeResults, Eyes};
use crate::link::{Destination, Query};
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{Card, Cautions, EyeEntryForm, PlaneInputs, Planes, Row};
use lensplane_core::{
    fmt_dioptres, fmt_length, vertex_report, LadderKind, OrderSettings, PowerCross, VertexDistance, VertexInput,
    VertexReport,
};
use leptos::prelude::*;

fn ladder_words(kind: LadderKind) -> &'static str {
    match kind {
        LadderKind::ContactLens => "contact-lens steps",
        LadderKind::Spectacle => "spectacle quarter steps",
    }
}

/// "the cornea (contact lens)" or "14 mm".
pub fn plane_words(d: VertexDistance) -> String {
    if d.is_cornea() {
        "the cornea (contact lens)".into()
    } else {
        format!("{} mm", fmt_length(d.mm()))
    }
}

/// "180: +0.06 D, 90: -0.07 D".
pub fn per_meridian(cross: &PowerCross) -> String {
    cross
        .both()
        .iter()
        .map(|m| format!("{}: {}", m.axis, fmt_dioptres(m.power)))
        .collect::<Vec<_>>()
        .join(", ")
}

/// The vertex result of one eye as a card, in minus- or plus-cylinder form.
pub fn vertex_card(r: &VertexReport, plus: bool) -> Card {
    let form =
        |minus: lensplane_core::Rx, plus_form: lensplane_core::Rx| if plus { plus_form } else { minus }.to_string();
    let input = if plus {
        r.input.to_plus_cyl()
    } else {
        r.input.to_minus_cyl()
    };
    let from = plane_words(r.from);
    let mut rows = vec![
        Row::new(
            format!("Orderable ({})", ladder_words(r.ladder)),
            form(r.ordered_minus_cyl, r.ordered_plus_cyl),
            format!(
                "worth {} back at {from}; residual per meridian {}",
                r.ordered.back_at_origin,
                per_meridian(&r.ordered.residual)
            ),
        ),
        Row::new("Change per meridian", "", per_meridian(&r.change)),
    ];
    if let Some(t) = &r.toric {
        rows.push(Row::new(
            "Toric contact lens",
            t.ordered.to_string(),
            format!(
                "left uncorrected: {} cylinder ({} from the axis step, {} from the cylinder step); spherical equivalent {}",
                fmt_dioptres(t.residual_cylinder),
                fmt_dioptres(t.residual_from_axis),
                fmt_dioptres(t.residual_from_cylinder),
                fmt_dioptres(t.residual_spherical_equivalent)
            ),
        ));
    }
    Card {
        main_label: format!("Exact at {}", plane_words(r.to)),
        main_value: form(r.exact_minus_cyl, r.exact_plus_cyl),
        reason: format!("From {input} at {from}: {}.", r.reason),
        rows,
        warnings: r.warnings.iter().map(|w| w.message.clone()).collect(),
        cross: Some((r.meridians_before, r.meridians_after)),
    }
}

#[component]
pub fn VertexPanel() -> impl IntoView {
    let q = initial_query();
    let planes = Planes::new(q.get("from"), q.get("to"));
    let plus = RwSignal::new(q.get("form") == Some("plus"));
    let eyes = Eyes::new(&q, move |eye, rx| -> Result<EyeOutcome, lensplane_core::Error> {
        let (from, to) = planes.both()?;
        let report = vertex_report(&VertexInput {
            rx,
            from,
            to,
            settings: OrderSettings::default(),
        })?;
        let card = vertex_card(&report, plus.get());
        let line = summary(
            eye,
            &rx,
            report.exact.to_string(),
            Some(report.ordered.ordered.to_string()),
        );
        Ok((card, line))
    });

    let current = Memo::new(move |_| {
        eyes.add_to(Query::default())
            .with("from", &planes.link_from())
            .with("to", &planes.link_to())
            .with("form", if plus.get() { "plus" } else { "" })
    });
    use_link_sync(Destination::Vertex, current, move |q: &Query| {
        eyes.load(q);
        planes.load(q.get("from"), q.get("to"));
        plus.set(q.get("form") == Some("plus"));
    });

    let text =
        Signal::derive(move || eyes.text(&format!("Lensplane vertex compensation to {}", planes.target_words())));
    let request =
        Callback::new(move |label: String| eyes.save_request(Destination::Vertex, current.get_untracked(), label));
    let noop = Callback::new(|_| ());

    view! {
        <h1>"Vertex"</h1>
        <p class="lede">"Move a refraction to the cornea for a contact lens, or to a frame that sits nearer or farther. Each principal meridian is compensated on its own."</p>
        <div class="panel-grid">
            <div class="inputs">
                <PlaneInputs planes=planes id_prefix="vertex" on_edit=noop/>
                <EyeEntryForm entry=eyes.right parsed=eyes.right_parsed id_prefix="vertex" on_edit=noop/>
                <EyeEntryForm entry=eyes.left parsed=eyes.left_parsed id_prefix="vertex" on_edit=noop/>
            </div>
            <div class="results">
                <div class="form-switch" role="group" aria-label="Cylinder form">
                    <button type="button" class="button" aria-pressed=move || if plus.get() { "false" } else { "true" }
                        on:click=move |_| plus.set(false)>"Minus cylinder"</button>
                    <button type="button" class="button" aria-pressed=move || if plus.get() { "true" } else { "false" }
                        on:click=move |_| plus.set(true)>"Plus cylinder"</button>
                </div>
                <EyeResults eyes=eyes id_prefix="vertex" text=text request=request/>
            </div>
        </div>
        <Cautions calculation=lensplane_core::Calculation::Vertex/>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::Rx;

    fn report(rx: Rx) -> VertexReport {
        vertex_report(&VertexInput {
            rx,
            from: VertexDistance::SPECTACLES,
            to: VertexDistance::CORNEA,
            settings: OrderSettings::default(),
        })
        .unwrap()
    }

    #[test]
    fn card_shows_exact_in_either_cylinder_form() {
        // C1 of shared/optics-notes.md [textbook]: −8.00 −2.00 ×180 at 12 mm → −7.30 −1.63 ×180 (plus form −8.93 +1.63 ×090).
        let r = report(Rx::new(-8.0, -2.0, 180).unwrap());
        assert_eq!(vertex_card(&r, false).main_value, "-7.30 -1.63 ×180");
        assert_eq!(vertex_card(&r, true).main_value, "-8.93 +1.63 ×090");
        assert_eq!(vertex_card(&r, false).main_label, "Exact at the cornea (contact lens)");
    }

    #[test]
    fn card_offers_the_toric_choice_only_when_there_is_one() {
        let toric = report(Rx::new(-8.0, -2.0, 180).unwrap());
        assert!(vertex_card(&toric, false)
            .rows
            .iter()
            .any(|r| r.label == "Toric contact lens"));
        // V1 [textbook]: −4.00 DS → −3.8168; spherical, so no toric row.
        let sph = report(Rx::sphere_only(-4.0).unwrap());
        let card = vertex_card(&sph, false);
        assert_eq!(card.main_value, "-3.82 DS");
        assert!(!card.rows.iter().any(|r| r.label == "Toric contact lens"));
    }

    #[test]
    fn meridians_are_listed_with_their_directions() {
        let cross = PowerCross::new(-7.0, -9.0, 180).unwrap();
        assert_eq!(per_meridian(&cross), "180: -7.00 D, 90: -9.00 D");
    }
}
