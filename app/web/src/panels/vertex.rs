//! The vertex destination: a full prescription for each eye moved to the
//! cornea (contact lens) or to another vertex distance.

use super::check_link::check_href;
use super::common::{summary, EyeEntries, EyeResults, Eyes};
use crate::link::{Destination, Query};
use crate::prefs::Remembered;
use crate::sync::{initial_query, use_link_sync, Base};
use crate::widgets::{result_warnings, Alternative, Card, Cautions, Headline, PlaneInputs, Planes, Row};
use lensplane_core::{
    fmt_axis, fmt_dioptres, fmt_length, fmt_power, vertex_report, LadderKind, OrderSettings, PowerCross,
    Recommendation, Rx, VertexDistance, VertexInput, VertexReport,
};
use leptos::prelude::*;

pub fn ladder_words(kind: LadderKind) -> &'static str {
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

/// What the order is for, in the copied line: "contact lens" or "spectacles at 14 mm".
pub fn target_words(d: VertexDistance) -> String {
    if d.is_cornea() {
        "contact lens".into()
    } else {
        format!("spectacles at {} mm", fmt_length(d.mm()))
    }
}

/// "180: +0.06 D, 090: -0.07 D" — per principal meridian, by its direction.
pub fn per_meridian(cross: &PowerCross) -> String {
    cross
        .both()
        .iter()
        .map(|m| format!("{}: {}", fmt_axis(m.axis), fmt_dioptres(m.power)))
        .collect::<Vec<_>>()
        .join(", ")
}

/// "Exact at the cornea" / "Exact at 14 mm".
pub fn exact_label(to: VertexDistance) -> String {
    format!("Exact at {}", plane_words(to))
}

/// The alternatives of a recommendation, in the chosen cylinder form.
pub fn alternatives(r: &Recommendation, form: impl Fn(Rx) -> String) -> Vec<Alternative> {
    r.alternatives
        .iter()
        .map(|a| Alternative {
            label: capitalised(a.kind.words()),
            value: form(a.lens),
            leaves: a.leaves.words(),
        })
        .collect()
}

/// "soft toric…" → "Soft toric…".
pub fn capitalised(words: &str) -> String {
    let mut s = words.to_string();
    if let Some(first) = s.get_mut(0..1) {
        first.make_ascii_uppercase();
    }
    s
}

/// The vertex result of one eye as a card, in minus- or plus-cylinder form.
pub fn vertex_card(r: &VertexReport, plus: bool) -> Card {
    let form = |rx: Rx| if plus { rx.to_plus_cyl() } else { rx.to_minus_cyl() }.to_string();
    let rec = &r.recommendation;
    let from = plane_words(r.from);
    let input = form(r.input);
    let mut details = vec![
        Row::new("Change per meridian (+ means more plus)", "", per_meridian(&r.change)),
        Row::new(
            format!("Each meridian on {}", ladder_words(r.ladder)),
            form(r.ordered.ordered),
            format!(
                "equals {} at {from}; left per meridian at {from} (+ means more plus): {}",
                form(r.ordered.back_at_origin),
                per_meridian(&r.ordered.residual)
            ),
        ),
        Row::new("Recommended lens leaves", "", rec.order.leaves.words()),
    ];
    if let Some(t) = &r.toric {
        details.push(Row::new(
            "Stock toric, what its steps leave",
            "",
            format!(
                "{} cylinder in all ({} from the axis step, {} from the cylinder step); spherical equivalent {} (+ means more plus)",
                fmt_dioptres(t.residual_cylinder),
                fmt_dioptres(t.residual_from_axis),
                fmt_dioptres(t.residual_from_cylinder),
                fmt_power(t.residual_spherical_equivalent)
            ),
        ));
    }
    Card {
        headline: Headline {
            label: "Order".into(),
            short: "Order",
            value: form(rec.order.lens),
            note: capitalised(rec.order.kind.words()),
            exact_label: exact_label(r.to),
            exact: form(r.exact),
            exact_short: "exact",
        },
        why: format!("From {input} at {from}: {}; {}.", r.reason, rec.why),
        alternatives: alternatives(rec, form),
        warnings: result_warnings(&r.warnings),
        details,
        cross: Some((r.meridians_before, r.meridians_after)),
        copy: format!(
            "{} ({}, from {input} at {from})",
            form(rec.order.lens),
            target_words(r.to)
        ),
    }
}

#[component]
pub fn VertexPanel() -> impl IntoView {
    let q = initial_query();
    let planes = Planes::new(q.get("from"), q.get("to"));
    let plus = RwSignal::new(q.get("form") == Some("plus"));
    let details = Remembered::new("lensplane.details.vertex");
    let eyes = Eyes::new(
        &q,
        move |_, rx| {
            let (from, to) = planes.both()?;
            vertex_report(&VertexInput {
                rx,
                from,
                to,
                settings: OrderSettings::default(),
            })
        },
        move |r| vertex_card(r, plus.get()),
    );

    let shared = eyes.shared_warnings(|r| &r.warnings);
    let current = Memo::new(move |_| {
        eyes.add_to(Query::default())
            .with("from", &planes.link_from())
            .with("to", &planes.link_to())
            .with("form", if plus.get() { "plus" } else { "" })
    });
    use_link_sync(Destination::Vertex, current);

    let text = Signal::derive(move || {
        eyes.text(&format!(
            "Lensplane · {} · to {}",
            Destination::Vertex.title(),
            planes.target_words()
        ))
    });
    let request = Callback::new(move |label: String| {
        eyes.save_request(Destination::Vertex, current.get_untracked(), label, |eye, r| {
            summary(
                eye,
                &r.input,
                r.exact.to_string(),
                Some(r.recommendation.order.lens.to_string()),
            )
        })
    });

    // A spectacle order can be checked when it comes back: the orderable
    // lens per eye opens the lens check as the lens ordered.
    let base = use_context::<Base>().map(|b| b.0).unwrap_or_default();
    let check = Memo::new(move |_| {
        let order = |r: &Option<Result<VertexReport, lensplane_core::Error>>| match r {
            Some(Ok(r)) if !r.to.is_cornea() => Some(r.recommendation.order.lens.to_minus_cyl().to_string()),
            _ => None,
        };
        check_href(eyes.right.report.with(order), eyes.left.report.with(order), None)
    });
    let check_link = move || {
        check.get().map(|h| {
            view! {
                <p class="check-link"><a class="button" href=format!("{base}{h}")>"Check the received lens"</a></p>
            }
        })
    };

    view! {
        <h1>{Destination::Vertex.title()}</h1>
        <p class="lede">"A refraction moved to the cornea or another frame, each principal meridian on its own."</p>
        <div class="panel-grid">
            <div class="inputs">
                <PlaneInputs planes=planes id_prefix="vertex" from_label="Vertex distance of the refraction" shared=shared/>
                <EyeEntries eyes=eyes id_prefix="vertex"/>
            </div>
            <div class="results">
                <div class="form-switch" role="group" aria-label="Cylinder form">
                    <button type="button" class="button" aria-pressed=move || if plus.get() { "false" } else { "true" }
                        on:click=move |_| plus.set(false)>"Minus cylinder"</button>
                    <button type="button" class="button" aria-pressed=move || if plus.get() { "true" } else { "false" }
                        on:click=move |_| plus.set(true)>"Plus cylinder"</button>
                </div>
                <EyeResults eyes=eyes id_prefix="vertex" details=details text=text request=request/>
                {check_link}
            </div>
        </div>
        <Cautions calculation=lensplane_core::Calculation::Vertex/>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::Rx;

    fn report(rx: Rx, to: VertexDistance) -> VertexReport {
        vertex_report(&VertexInput {
            rx,
            from: VertexDistance::SPECTACLES,
            to,
            settings: OrderSettings::default(),
        })
        .unwrap()
    }

    #[test]
    fn the_card_leads_with_one_order_and_the_exact_value_beside_it() {
        // C1 of shared/optics-notes.md [textbook]: −8.00 −2.00 ×180 at 12 mm → −7.30 −1.63 ×180 (plus form −8.93 +1.63 ×090).
        let r = report(Rx::new(-8.0, -2.0, 180).unwrap(), VertexDistance::CORNEA);
        let c = vertex_card(&r, false);
        assert_eq!(c.headline.exact, "-7.30 -1.63 ×180");
        assert_eq!(vertex_card(&r, true).headline.exact, "-8.93 +1.63 ×090");
        assert_eq!(c.headline.exact_label, "Exact at the cornea (contact lens)");
        // The stock toric (common practice, no source: cylinders -0.75/-1.25/-1.75/-2.25, 10° axes): -1.75 ×180,
        // sphere keeping the spherical equivalent -8.11 on 0.50 D steps beyond 6 D.
        assert_eq!(c.headline.value, "-7.00 -1.75 ×180");
        assert_eq!(c.headline.note, "Soft toric from the usual range");
        assert_eq!(
            c.copy,
            "-7.00 -1.75 ×180 (contact lens, from -8.00 -2.00 ×180 at 12 mm)"
        );
        // Alternatives, each with what it leaves: the spherical lens of the SE leaves the whole cylinder.
        assert_eq!(c.alternatives[0].value, "-8.00 DS");
        assert!(
            c.alternatives[0]
                .leaves
                .starts_with("leaves 1.63 D of cylinder uncorrected"),
            "{:?}",
            c.alternatives
        );
        assert!(c.alternatives.iter().all(|a| a.value != c.headline.value));
    }

    #[test]
    fn a_spectacle_target_orders_quarter_steps_with_no_alternative() {
        // V6 [textbook]: −10.00 from 10 to 14 mm → −10.4167 → −10.50 on spectacle steps.
        let r = vertex_report(&VertexInput {
            rx: Rx::sphere_only(-10.0).unwrap(),
            from: VertexDistance::from_mm(10.0).unwrap(),
            to: VertexDistance::from_mm(14.0).unwrap(),
            settings: OrderSettings::default(),
        })
        .unwrap();
        let c = vertex_card(&r, false);
        assert_eq!(
            (c.headline.value.as_str(), c.headline.exact.as_str()),
            ("-10.50 DS", "-10.42 DS")
        );
        assert!(c.alternatives.is_empty());
        assert_eq!(c.copy, "-10.50 DS (spectacles at 14 mm, from -10.00 DS at 10 mm)");
        assert!(c.why.contains("away from the eye needs less plus"), "{}", c.why);
    }

    #[test]
    fn changes_and_residuals_say_what_their_sign_means() {
        let c = vertex_card(&report(Rx::sphere_only(-4.0).unwrap(), VertexDistance::CORNEA), false);
        let labels: Vec<&str> = c.details.iter().map(|r| r.label.as_str()).collect();
        assert!(
            labels.contains(&"Change per meridian (+ means more plus)"),
            "{labels:?}"
        );
        // V1 [textbook]: −4.00 → −3.8168 → −3.75, which equals −3.9267 at 12 mm (0.0733 D more plus).
        let ladder = c.details.iter().find(|r| r.label.starts_with("Each meridian")).unwrap();
        assert!(
            ladder.detail.starts_with("equals -3.93 DS at 12 mm"),
            "{}",
            ladder.detail
        );
        assert!(!ladder.detail.contains("worth"));
    }

    #[test]
    fn meridians_are_listed_with_their_directions() {
        let cross = PowerCross::new(-7.0, -9.0, 180).unwrap();
        assert_eq!(per_meridian(&cross), "180: -7.00 D, 090: -9.00 D");
    }
}
