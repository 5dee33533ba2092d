//! The vertex destination: a full prescription for each eye moved to the
//! cornea (contact lens) or to another vertex distance.

use crate::history::{EyeSummary, SaveRequest};
use crate::link::{Destination, Query};
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{
    eye_words, shown_memo, Cautions, EyeEntry, EyeEntryForm, PlaneInputs, Planes, PowerCrossDiagram, SaveBar, Shown,
    ShownNote, WarningList,
};
use lensplane_core::{
    fmt_dioptres, vertex_report, Eye, LadderKind, OrderSettings, Rx, VertexInput, VertexReport,
};
use leptos::prelude::*;

fn form_of(report: &VertexReport, plus: bool, which: fn(&VertexReport) -> (Rx, Rx)) -> String {
    let (minus_form, plus_form) = which(report);
    if plus { plus_form } else { minus_form }.to_string()
}

fn ladder_words(kind: LadderKind) -> &'static str {
    match kind {
        LadderKind::ContactLens => "contact-lens steps",
        LadderKind::Spectacle => "spectacle quarter steps",
    }
}

/// One line per meridian: "180: +0.06 D".
fn per_meridian(cross: &lensplane_core::PowerCross) -> String {
    cross.both().iter().map(|m| format!("{}: {}", m.axis, fmt_dioptres(m.power))).collect::<Vec<_>>().join(", ")
}

#[component]
fn EyeResult(eye: Eye, shown: Memo<Shown<VertexReport>>, plus: RwSignal<bool>, planes: Planes) -> impl IntoView {
    let (word, letter) = eye_words(eye);
    let region = format!("{word} eye result");
    let body = move || {
        let report = shown.get().result()?.clone();
        let plus = plus.get();
        let exact = form_of(&report, plus, |r| (r.exact_minus_cyl, r.exact_plus_cyl));
        let ordered = form_of(&report, plus, |r| (r.ordered_minus_cyl, r.ordered_plus_cyl));
        let input = if plus { report.input.to_plus_cyl() } else { report.input.to_minus_cyl() }.to_string();
        let from_mm = fmt_number_mm(&report);
        let toric = report.toric.clone().map(|t| {
            view! {
                <div class="result-row">
                    <dt>"Toric contact lens"</dt>
                    <dd>
                        <span class="rx">{t.ordered.to_string()}</span>
                        <span class="detail">{format!(
                            "left uncorrected: {} cylinder ({} from the axis step, {} from the cylinder step); spherical equivalent {}",
                            fmt_dioptres(t.residual_cylinder), fmt_dioptres(t.residual_from_axis),
                            fmt_dioptres(t.residual_from_cylinder), fmt_dioptres(t.residual_spherical_equivalent))}</span>
                    </dd>
                </div>
            }
        });
        let label = format!("{word} eye power cross: before and after the move");
        Some(view! {
            <p class="result-main">
                <span class="result-label">{format!("Exact {}", planes.target_words())}</span>
                <output class="rx big">{exact}</output>
            </p>
            <p class="reason">{format!("From {input} at {from_mm}: {}.", report.reason)}</p>
            <dl class="result-list">
                <div class="result-row">
                    <dt>{format!("Orderable ({})", ladder_words(report.ladder))}</dt>
                    <dd>
                        <span class="rx">{ordered}</span>
                        <span class="detail">{format!(
                            "worth {} back at {}; residual per meridian {}",
                            report.ordered.back_at_origin, from_mm, per_meridian(&report.ordered.residual))}</span>
                    </dd>
                </div>
                <div class="result-row">
                    <dt>"Change per meridian"</dt>
                    <dd><span class="detail">{per_meridian(&report.change)}</span></dd>
                </div>
                {toric}
            </dl>
            <WarningList warnings=Signal::derive(move || shown.get().result().map(|r| r.warnings.clone()).unwrap_or_default())/>
            <PowerCrossDiagram before=report.meridians_before after=report.meridians_after label=label/>
        })
    };
    view! {
        <section class="eye-result" aria-label=region class:stale=move || matches!(shown.get(), Shown::Stale(..))>
            <h2>{format!("{word} eye ({letter})")}</h2>
            <ShownNote shown=shown/>
            {move || matches!(shown.get(), Shown::Empty).then(|| view! { <p class="empty-note">"No prescription entered for this eye."</p> })}
            {body}
        </section>
    }
}

fn fmt_number_mm(report: &VertexReport) -> String {
    if report.from.is_cornea() { "the cornea".into() } else { format!("{} mm", lensplane_core::fmt_number(report.from.mm())) }
}

/// Plain-text summary of the panel, for the clipboard.
fn summary_text(planes: &Planes, eyes: &[(Eye, Shown<VertexReport>)]) -> Option<String> {
    let mut lines = vec![format!("Lensplane vertex compensation, {}", planes.target_words())];
    for (eye, shown) in eyes {
        if let Some(r) = shown.fresh() {
            lines.push(format!(
                "{}: {} at {} -> exact {} ; order {} ({})",
                eye_words(*eye).1,
                r.input,
                fmt_number_mm(r),
                r.exact,
                r.ordered.ordered,
                ladder_words(r.ladder)
            ));
            if let Some(t) = &r.toric {
                lines.push(format!("   toric contact lens {}", t.ordered));
            }
        }
    }
    lines.push("A starting point, not a prescription: confirm by over-refraction and acuity.".into());
    (lines.len() > 2).then(|| lines.join("\n"))
}

#[component]
pub fn VertexPanel() -> impl IntoView {
    let q = initial_query();
    let right = EyeEntry::new(Eye::Right, q.get("r"));
    let left = EyeEntry::new(Eye::Left, q.get("l"));
    let planes = Planes::new(q.get("from"), q.get("to"));
    let plus = RwSignal::new(q.get("form") == Some("plus"));
    let right_parsed = Memo::new(move |_| right.parsed());
    let left_parsed = Memo::new(move |_| left.parsed());
    let report_for = move |parsed: Memo<_>| {
        shown_memo(move || {
            let p: Result<lensplane_core::Parsed<Rx>, lensplane_core::Error> = parsed.get()?;
            Some(p.and_then(|p| {
                let (from, to) = planes.both()?;
                vertex_report(&VertexInput { rx: p.value, from, to, settings: OrderSettings::default() })
            }))
        })
    };
    let right_shown = report_for(right_parsed);
    let left_shown = report_for(left_parsed);

    let current = Memo::new(move |_| {
        Query::default()
            .with("r", &right.link_text())
            .with("l", &left.link_text())
            .with("from", &planes.link_from())
            .with("to", &planes.link_to())
            .with("form", if plus.get() { "plus" } else { "" })
    });
    use_link_sync(Destination::Vertex, current, move |q: &Query| {
        right.load(q.get("r"));
        left.load(q.get("l"));
        planes.load(q.get("from"), q.get("to"));
        plus.set(q.get("form") == Some("plus"));
    });

    let announce = move || {
        [(Eye::Right, right_shown.get()), (Eye::Left, left_shown.get())]
            .into_iter()
            .filter_map(|(eye, s)| s.fresh().map(|r| format!("{} eye: {}", eye_words(eye).0, r.exact)))
            .collect::<Vec<_>>()
            .join(". ")
    };
    let text = Signal::derive(move || {
        summary_text(&planes, &[(Eye::Right, right_shown.get()), (Eye::Left, left_shown.get())])
    });
    let request = Callback::new(move |label: String| {
        let eyes: Vec<EyeSummary> = [(Eye::Right, right_shown.get_untracked()), (Eye::Left, left_shown.get_untracked())]
            .into_iter()
            .filter_map(|(eye, s)| {
                s.fresh().map(|r| EyeSummary {
                    eye: eye_words(eye).1.into(),
                    input: r.input.to_string(),
                    result: r.exact.to_string(),
                    order: Some(r.ordered.ordered.to_string()),
                })
            })
            .collect();
        (!eyes.is_empty()).then(|| SaveRequest { panel: Destination::Vertex, query: current.get_untracked(), label, eyes })
    });
    let noop = Callback::new(|_| ());

    view! {
        <h1>"Vertex"</h1>
        <p class="lede">"Move a refraction to the cornea for a contact lens, or to a frame that sits nearer or farther. Each principal meridian is compensated on its own."</p>
        <div class="panel-grid">
            <div class="inputs">
                <PlaneInputs planes=planes id_prefix="vertex" on_edit=noop/>
                <EyeEntryForm entry=right parsed=right_parsed id_prefix="vertex" on_edit=noop/>
                <EyeEntryForm entry=left parsed=left_parsed id_prefix="vertex" on_edit=noop/>
            </div>
            <div class="results">
                <div class="form-switch" role="group" aria-label="Cylinder form">
                    <button type="button" class="button toggle" aria-pressed=move || if plus.get() { "false" } else { "true" }
                        on:click=move |_| plus.set(false)>"Minus cylinder"</button>
                    <button type="button" class="button toggle" aria-pressed=move || if plus.get() { "true" } else { "false" }
                        on:click=move |_| plus.set(true)>"Plus cylinder"</button>
                </div>
                <EyeResult eye=Eye::Right shown=right_shown plus=plus planes=planes/>
                <EyeResult eye=Eye::Left shown=left_shown plus=plus planes=planes/>
                <p class="visually-hidden" aria-live="polite">{announce}</p>
                <SaveBar id_prefix="vertex" text=text request=request/>
            </div>
        </div>
        <Cautions extra=vec!["Reference plane: the corneal vertex (thin-lens model)."]/>
    }
}
