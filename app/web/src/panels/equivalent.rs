//! The spherical-equivalent destination: the spherical lens for a low
//! cylinder, at the spectacle plane or the cornea, and whether it will do.

use super::common::{summary, EyeOutcome, EyeResults, Eyes};
use super::vertex::plane_words;
use crate::link::{Destination, Query};
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{Card, Cautions, EyeEntryForm, Message, PlaneInputs, Planes, Row, TextField};
use lensplane_core::{
    equivalent_report, fmt_dioptres, fmt_power, EquivalentInput, EquivalentReport, LadderKind, OrderSettings,
    SubstituteSettings, Verdict,
};
use leptos::prelude::*;

fn verdict_words(v: Verdict) -> &'static str {
    match v {
        Verdict::Suitable => "Reasonable substitute",
        Verdict::Borderline => "Borderline: trial it and check acuity",
        Verdict::Unsuitable => "Not advised: prefer a toric lens",
    }
}

/// The spherical-equivalent result of one eye as a card.
pub fn equivalent_card(r: &EquivalentReport) -> Card {
    let ladder = match r.ladder {
        LadderKind::ContactLens => "contact-lens steps",
        LadderKind::Spectacle => "spectacle quarter steps",
    };
    let a = &r.assessment;
    Card {
        main_label: "Spherical equivalent at the target plane".into(),
        main_value: fmt_power(r.spherical_equivalent),
        reason: format!("{}: {}.", verdict_words(a.verdict), a.reason),
        rows: vec![
            Row::new(
                format!("Orderable spherical lens ({ladder})"),
                r.ordered.to_string(),
                format!(
                    "worth {} back at the original plane",
                    fmt_power(r.ordered_back_at_origin)
                ),
            ),
            Row::new(
                "Spherical equivalent as measured",
                fmt_power(r.spherical_equivalent_at_origin),
                format!("of {}", r.input),
            ),
            Row::new("Full prescription at the target plane", r.at_target.to_string(), ""),
            Row::new(
                "Left uncorrected by a spherical lens",
                fmt_dioptres(a.residual_astigmatism),
                format!(
                    "astigmatism; focus error of the ordered lens {}, blur strength {}",
                    fmt_dioptres(r.residual.m),
                    fmt_dioptres(r.residual_blur)
                ),
            ),
        ],
        warnings: r.warnings.iter().map(|w| w.message.clone()).collect(),
        cross: None,
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

    let eyes = Eyes::new(&q, move |eye, rx| -> Result<EyeOutcome, lensplane_core::Error> {
        let (from, to) = planes.both()?;
        let substitute = settings.get()?;
        let r = equivalent_report(&EquivalentInput {
            rx,
            from,
            to,
            settings: OrderSettings::default(),
            substitute,
        })?;
        let line = summary(
            eye,
            &rx,
            format!("SE {}", fmt_power(r.spherical_equivalent)),
            Some(r.ordered.to_string()),
        );
        Ok((equivalent_card(&r), line))
    });

    let current = Memo::new(move |_| {
        let keep = |v: String, d: &str| if v.trim() == d { String::new() } else { v };
        eyes.add_to(Query::default())
            .with("from", &planes.link_from())
            .with("to", &planes.link_to())
            .with("cylmax", &keep(cyl_max.get(), defaults.0))
            .with("oblmax", &keep(obl_max.get(), defaults.1))
            .with("ratio", &keep(ratio.get(), defaults.2))
    });
    use_link_sync(Destination::Equivalent, current, move |q: &Query| {
        eyes.load(q);
        planes.load(q.get("from"), q.get("to"));
        cyl_max.set(q.get("cylmax").unwrap_or(defaults.0).to_string());
        obl_max.set(q.get("oblmax").unwrap_or(defaults.1).to_string());
        ratio.set(q.get("ratio").unwrap_or(defaults.2).to_string());
    });

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
        let heading = match planes.to_parsed() {
            Ok(p) => format!("Lensplane spherical equivalent at {}", plane_words(p.value)),
            Err(_) => "Lensplane spherical equivalent".into(),
        };
        eyes.text(&heading)
    });
    let request =
        Callback::new(move |label: String| eyes.save_request(Destination::Equivalent, current.get_untracked(), label));
    let noop = Callback::new(|_| ());

    view! {
        <h1>"Spherical equivalent"</h1>
        <p class="lede">"A spherical lens of the spherical equivalent for a low cylinder: the power at the chosen plane, the orderable lens, and whether it is a reasonable substitute."</p>
        <div class="panel-grid">
            <div class="inputs">
                <PlaneInputs planes=planes id_prefix="equivalent" on_edit=noop/>
                <EyeEntryForm entry=eyes.right parsed=eyes.right_parsed id_prefix="equivalent" on_edit=noop/>
                <EyeEntryForm entry=eyes.left parsed=eyes.left_parsed id_prefix="equivalent" on_edit=noop/>
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
                <EyeResults eyes=eyes id_prefix="equivalent" text=text request=request/>
            </div>
        </div>
        <Cautions calculation=lensplane_core::Calculation::Equivalent/>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::{Rx, VertexDistance};

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
    fn card_shows_the_equivalent_and_the_verdict() {
        // S1 of shared/optics-notes.md [definition]: SE of −2.00 −0.50 ×090 is −2.25 (same plane, 12 → 12 mm).
        let card = equivalent_card(&report(Rx::new(-2.0, -0.5, 90).unwrap(), VertexDistance::SPECTACLES));
        assert_eq!(card.main_value, "-2.25");
        assert!(card.rows.iter().any(|r| r.value == "-2.25 DS"));
        // +1.50 −1.00 ×180 → SE +1.00 [definition]; cylinder 1.00 D is over the 0.75 D limit
        // (common practice, no source): not "Reasonable".
        let card = equivalent_card(&report(Rx::new(1.5, -1.0, 180).unwrap(), VertexDistance::SPECTACLES));
        assert_eq!(card.main_value, "+1.00");
        assert!(!card.reason.starts_with("Reasonable"), "{}", card.reason);
    }
}
