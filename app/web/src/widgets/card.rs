//! One eye's result as plain data, and the one component that shows any of
//! them. Panels turn a core report into a [`Card`] (ordinary code with native
//! tests); the view only lays it out. Keeping one result view for every
//! panel also keeps the wasm small.

use super::{eye_words, PowerCrossDiagram, Shown, ShownNote};
use lensplane_core::{Eye, PowerCross};
use leptos::prelude::*;

/// A labelled figure under the main result.
#[derive(Clone, Debug, PartialEq)]
pub struct Row {
    pub label: String,
    pub value: String,
    pub detail: String,
}

impl Row {
    pub fn new(label: impl Into<String>, value: impl Into<String>, detail: impl Into<String>) -> Row {
        Row {
            label: label.into(),
            value: value.into(),
            detail: detail.into(),
        }
    }
}

/// Everything shown for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct Card {
    pub main_label: String,
    pub main_value: String,
    pub reason: String,
    pub rows: Vec<Row>,
    pub warnings: Vec<String>,
    /// Power cross before and after, when the panel draws one.
    pub cross: Option<(PowerCross, PowerCross)>,
}

impl Card {
    /// The card as plain text lines (for copying).
    pub fn text_lines(&self) -> Vec<String> {
        let mut lines = vec![format!("{}: {}", self.main_label, self.main_value)];
        lines.extend(self.rows.iter().map(|r| {
            if r.detail.is_empty() {
                format!("{}: {}", r.label, r.value)
            } else {
                format!("{}: {} ({})", r.label, r.value, r.detail)
            }
        }));
        lines
    }
}

#[component]
pub fn EyeCard(eye: Eye, shown: Memo<Shown<Card>>) -> impl IntoView {
    let (word, letter) = eye_words(eye);
    let body = move || {
        let card = shown.get().result()?.clone();
        let rows = card
            .rows
            .into_iter()
            .map(|r| {
                view! {
                    <div class="result-row">
                        <dt>{r.label}</dt>
                        <dd>
                            {(!r.value.is_empty()).then(|| view! { <span class="rx">{r.value}</span> })}
                            {(!r.detail.is_empty()).then(|| view! { <span class="detail">{r.detail}</span> })}
                        </dd>
                    </div>
                }
            })
            .collect_view();
        let warnings = (!card.warnings.is_empty()).then(|| {
            view! { <ul class="warnings">{card.warnings.into_iter().map(|w| view! { <li>{w}</li> }).collect_view()}</ul> }
        });
        let cross = card.cross.map(|(before, after)| {
            view! { <PowerCrossDiagram before=before after=after label=format!("{word} eye power cross: before and after")/> }
        });
        Some(view! {
            <p class="result-main">
                <span class="result-label">{card.main_label}</span>
                <output class="rx big">{card.main_value}</output>
            </p>
            <p class="reason">{card.reason}</p>
            <dl class="result-list">{rows}</dl>
            {warnings}
            {cross}
        })
    };
    view! {
        <section class="eye-result" aria-label=format!("{word} eye result") class:stale=move || matches!(shown.get(), Shown::Stale(..))>
            <h2>{format!("{word} eye ({letter})")}</h2>
            <ShownNote shown=shown/>
            {move || matches!(shown.get(), Shown::Empty).then(|| view! { <p class="empty-note">"No prescription entered for this eye."</p> })}
            {body}
        </section>
    }
}
