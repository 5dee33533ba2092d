//! The spherical-equivalent destination: the spherical lens for a low
//! cylinder, at the spectacle plane or the cornea, and whether it will do.

use super::common::{summary, EyeEntries, EyeResults, Eyes};
use super::vertex::{ladder_words, plane_words, target_words};
use crate::link::{Destination, Query};
use crate::prefs::Remembered;
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{
    result_warnings, Alternative, Card, Cautions, Headline, Message, PlaneInputs, Planes, Row, TextField,
};
use lensplane_core::{
    equivalent_report, fmt_dioptres, fmt_power, EquivalentInput, EquivalentReport, OrderSettings, SubstituteSettings,
    Verdict, VertexDistance,
};
use leptos::prelude::*;

fn verdict_words(v: Verdict) -> &'static str {
    match v {
        Verdict::Suitable => "Reasonable substitute",
        Verdict::Borderline => "Borderline: trial it and check acuity",
        Verdict::Unsuitable => "Not advised: prefer a toric lens",
    }
}

/// The spherical-equivalent result of one eye as a card: the spherical lens
/// to order, whether it will do, and the lens that keeps the cylinder.
pub fn equivalent_card(r: &EquivalentReport, from: VertexDistance, to: VertexDistance) -> Card {
    let a = &r.assessment;
    let full = &r.full_correction;
    let mut alternatives = vec![Alternative {
        label: format!("Keep the cylinder: {}", full.order.kind.words()),
        value: full.order.lens.to_string(),
        leaves: full.order.leaves.words(),
    }];
    alternatives.extend(
        super::vertex::alternatives(full, |rx| rx.to_string())
            .into_iter()
            .filter(|alt| alt.value != r.ordered.to_string()),
    );
    Card {
        headline: Headline {
            label: "Order".into(),
            short: "Order",
            value: r.ordered.to_string(),
            note: format!("Spherical lens on {}", ladder_words(r.ladder)),
            exact_label: format!("Spherical equivalent at {}", plane_words(to)),
            exact: fmt_power(r.spherical_equivalent),
            exact_short: "exact",
        },
        why: format!("{}: {}; it {}.", verdict_words(a.verdict), a.reason, r.leaves.words()),
        alternatives,
        warnings: result_warnings(&r.warnings),
        details: vec![
            Row::new(
                "Spherical equivalent as measured",
                fmt_power(r.spherical_equivalent_at_origin),
                format!("of {}", r.input),
            ),
            Row::new("Full prescription at the target plane", r.at_target.to_string(), ""),
            Row::new(
                "The ordered lens at the original plane",
                fmt_power(r.ordered_back_at_origin),
                "what the spherical lens equals where the prescription was measured",
            ),
            Row::new(
                "Left uncorrected by a spherical lens",
                fmt_dioptres(a.residual_astigmatism),
                format!(
                    "astigmatism; focus error of the ordered lens {} (+ means more plus), blur strength {}",
                    fmt_power(r.residual.m),
                    fmt_dioptres(r.residual_blur)
                ),
            ),
        ],
        cross: None,
        copy: format!(
            "{} ({}, from {} at {})",
            r.ordered,
            target_words(to),
            r.input,
            plane_words(from)
        ),
    }
}

#[component]
pub fn EquivalentPanel() -> impl IntoView {
    let q = initial_query();
    let planes = Planes::new(q.get("from"), q.get("to"));
    let defaults = ("0.75", "0.50", "1:4");
    let cyl_max = RwSignal::new(q.get("cylmax").unwrap_or(defaults.0).to_string());
    let obl_max = RwSignal::new(q.get("oblmax").unwrap_or(defaults.1).to_string());
    let ratio = RwSignal::new(q.get("ratio").unwrap_or(defaults.2).to_string());
    let settings = Memo::new(move |_| SubstituteSettings::from_texts(&cyl_max.get(), &obl_max.get(), &ratio.get()));
    let details = Remembered::new("lensplane.details.equivalent");

    let eyes = Eyes::new(
        &q,
        move |_, rx| {
            let (from, to) = planes.both()?;
            let substitute = settings.get()?;
            let report = equivalent_report(&EquivalentInput {
                rx,
                from,
                to,
                settings: OrderSettings::default(),
                substitute,
            })?;
            Ok((report, from, to))
        },
        |(r, from, to)| equivalent_card(r, *from, *to),
    );

    let shared = eyes.shared_warnings(|(r, _, _)| &r.warnings);
    let current = Memo::new(move |_| {
        let keep = |v: String, d: &str| if v.trim() == d { String::new() } else { v };
        eyes.add_to(Query::default())
            .with("from", &planes.link_from())
            .with("to", &planes.link_to())
            .with("cylmax", &keep(cyl_max.get(), defaults.0))
            .with("oblmax", &keep(obl_max.get(), defaults.1))
            .with("ratio", &keep(ratio.get(), defaults.2))
    });
    use_link_sync(Destination::Equivalent, current);

    let setting_msgs = move |which: usize| {
        Signal::derive(move || {
            let result = match which {
                0 => lensplane_core::parse_cylinder_limit(&cyl_max.get()).map(|_| ()),
                1 => lensplane_core::parse_cylinder_limit(&obl_max.get()).map(|_| ()),
                _ => lensplane_core::parse_ratio_limit(&ratio.get()).map(|_| ()),
            };
            result.err().map(|e| vec![Message::error(&e)]).unwrap_or_default()
        })
    };
    let text = Signal::derive(move || {
        eyes.text(&format!(
            "Lensplane · {} · {}",
            Destination::Equivalent.title(),
            planes.target_words()
        ))
    });
    let request = Callback::new(move |label: String| {
        eyes.save_request(
            Destination::Equivalent,
            current.get_untracked(),
            label,
            |eye, (r, _, _)| {
                summary(
                    eye,
                    &r.input,
                    format!("SE {}", fmt_power(r.spherical_equivalent)),
                    Some(r.ordered.to_string()),
                )
            },
        )
    });

    view! {
        <h1>{Destination::Equivalent.title()}</h1>
        <p class="lede">"A spherical lens for a low cylinder, and whether it will do."</p>
        <div class="panel-grid">
            <div class="inputs">
                <PlaneInputs planes=planes id_prefix="equivalent" from_label="Vertex distance of the refraction" shared=shared/>
                <EyeEntries eyes=eyes id_prefix="equivalent"/>
                <details class="settings">
                    <summary>"Substitute limits"</summary>
                    <p class="field-msg hint">"Common practice, not law: adjust to your own practice."</p>
                    <TextField id="equivalent-cylmax" label="Largest cylinder, with the rule" value=cyl_max
                        messages=setting_msgs(0) unit="D"/>
                    <TextField id="equivalent-oblmax" label="Largest cylinder, oblique or against the rule" value=obl_max
                        messages=setting_msgs(1) unit="D"/>
                    <TextField id="equivalent-ratio" label="Largest cylinder : sphere" value=ratio
                        messages=setting_msgs(2) inputmode="text" placeholder="1:4"/>
                </details>
            </div>
            <div class="results">
                <EyeResults eyes=eyes id_prefix="equivalent" details=details text=text request=request/>
            </div>
        </div>
        <Cautions calculation=lensplane_core::Calculation::Equivalent/>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::Rx;

    fn report(rx: Rx, to: VertexDistance) -> EquivalentReport {
        equivalent_report(&EquivalentInput {
            rx,
            from: VertexDistance::SPECTACLES,
            to,
            settings: OrderSettings::default(),
            substitute: SubstituteSettings::default(),
        })
        .unwrap()
    }

    #[test]
    fn card_orders_the_spherical_lens_and_says_what_it_leaves() {
        // S1 of shared/optics-notes.md [definition]: SE of −2.00 −0.50 ×090 is −2.25 (same plane, 12 → 12 mm).
        let card = equivalent_card(
            &report(Rx::new(-2.0, -0.5, 90).unwrap(), VertexDistance::SPECTACLES),
            VertexDistance::SPECTACLES,
            VertexDistance::SPECTACLES,
        );
        assert_eq!(
            (card.headline.value.as_str(), card.headline.exact.as_str()),
            ("-2.25 DS", "-2.25")
        );
        assert!(
            card.why.contains("leaves 0.50 D of cylinder uncorrected"),
            "{}",
            card.why
        );
        assert_eq!(card.alternatives[0].value, "-2.00 -0.50 ×090");
        assert_eq!(
            card.copy,
            "-2.25 DS (spectacles at 12 mm, from -2.00 -0.50 ×090 at 12 mm)"
        );
        // +1.50 −1.00 ×180 → SE +1.00 [definition]; cylinder 1.00 D is over the 0.75 D limit
        // (common practice, no source): not "Reasonable".
        let card = equivalent_card(
            &report(Rx::new(1.5, -1.0, 180).unwrap(), VertexDistance::SPECTACLES),
            VertexDistance::SPECTACLES,
            VertexDistance::SPECTACLES,
        );
        assert_eq!(card.headline.exact, "+1.00");
        assert!(!card.why.starts_with("Reasonable"), "{}", card.why);
    }
}
