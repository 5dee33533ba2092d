//! One eye's result as plain data, and the one component that shows any of
//! them. Panels turn a core report into a [`Card`] (ordinary code with native
//! tests); the view only lays it out: the one recommendation with the exact
//! value beside it, why in one line, the alternatives with what each leaves,
//! the warnings (never hidden), and everything else behind one disclosure.
//! Keeping one result view for every panel also keeps the wasm small.

use super::{eye_words, PowerCrossDiagram, Shown, ShownNote};
use crate::prefs::{on_toggle, Remembered};
use lensplane_core::{Eye, PowerCross};
use leptos::prelude::*;

/// A labelled figure in the details.
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

/// What to order (or the one figure that answers the question), with the
/// exact value beside it.
#[derive(Clone, Debug, PartialEq)]
pub struct Headline {
    /// "Order", "Equivalent add", "Accommodation".
    pub label: String,
    /// The label in the compact line ("Add").
    pub short: &'static str,
    /// The recommendation in trade notation.
    pub value: String,
    /// What kind of lens or figure it is ("soft toric from the usual range").
    pub note: String,
    /// "Exact at the cornea".
    pub exact_label: String,
    /// The exact value in trade notation, two decimals.
    pub exact: String,
    /// The exact value's label in the compact line ("exact").
    pub exact_short: &'static str,
}

impl Headline {
    /// The compact line the entry shows while typing: "Order -7.00 -1.75 ×180 · exact -7.30 -1.63 ×180".
    pub fn glance(&self) -> String {
        format!("{} {} · {} {}", self.short, self.value, self.exact_short, self.exact)
    }
}

/// Another lens that could be ordered, and what it leaves uncorrected.
#[derive(Clone, Debug, PartialEq)]
pub struct Alternative {
    /// What kind of lens ("spherical contact lens").
    pub label: String,
    /// The lens in trade notation.
    pub value: String,
    /// What it leaves uncorrected, in words.
    pub leaves: String,
}

/// Everything shown for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct Card {
    pub headline: Headline,
    /// Why, in one line.
    pub why: String,
    pub alternatives: Vec<Alternative>,
    /// Warnings about this eye's figures: always shown.
    pub warnings: Vec<String>,
    /// Everything else, behind the disclosure.
    pub details: Vec<Row>,
    /// Power cross before and after, when the panel draws one (in the details).
    pub cross: Option<(PowerCross, PowerCross)>,
    /// The compact order line copied as text, without the eye letter:
    /// "-7.00 -1.75 ×180 (contact lens, from -8.00 -2.00 ×180 at 12 mm)".
    pub copy: String,
}

#[component]
pub fn EyeCard(
    eye: Eye,
    shown: Memo<Shown<Card>>,
    details: Remembered,
    /// A small figure shown under the one-line reason (the image-size
    /// outlines); none on most panels.
    #[prop(optional, into)]
    figure: Option<ViewFn>,
) -> impl IntoView {
    let (word, letter) = eye_words(eye);
    let body = move || {
        let card = shown.get().result()?.clone();
        let h = card.headline;
        let alternatives = (!card.alternatives.is_empty()).then(|| {
            let items = card
                .alternatives
                .into_iter()
                .map(|a| {
                    view! {
                        <li><span class="alt-kind">{a.label}</span>" "<span class="rx">{a.value}</span>
                            <span class="detail">{a.leaves}</span></li>
                    }
                })
                .collect_view();
            view! {
                <div class="alternatives">
                    <h3>"Alternatives"</h3>
                    <ul>{items}</ul>
                </div>
            }
        });
        let warnings = (!card.warnings.is_empty()).then(|| {
            view! { <ul class="warnings">{card.warnings.into_iter().map(|w| view! { <li>{w}</li> }).collect_view()}</ul> }
        });
        let rows = card
            .details
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
        let cross = card.cross.map(|(before, after)| {
            view! { <PowerCrossDiagram before=before after=after label=format!("{word} eye power cross: before and after")/> }
        });
        let figure = figure.clone().map(|f| f.run());
        Some(view! {
            <div class="headline">
                <p class="result-main">
                    <span class="result-label">{h.label}</span>
                    <output class="rx big">{h.value}</output>
                </p>
                <p class="result-exact">
                    <span class="result-label">{h.exact_label}</span>
                    <span class="rx">{h.exact}</span>
                </p>
                <p class="result-note">{h.note}</p>
            </div>
            <p class="reason">{card.why}</p>
            {figure}
            {alternatives}
            {warnings}
            <details class="card-details" prop:open=move || details.is_open() on:toggle=on_toggle(details)>
                <summary>"Details"</summary>
                <dl class="result-list">{rows}</dl>
                {cross}
            </details>
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_glance_reads_as_one_line() {
        let h = Headline {
            label: "Order".into(),
            short: "Order",
            value: "-7.00 -1.75 ×180".into(),
            note: "soft toric from the usual range".into(),
            exact_label: "Exact at the cornea".into(),
            exact: "-7.30 -1.63 ×180".into(),
            exact_short: "exact",
        };
        assert_eq!(h.glance(), "Order -7.00 -1.75 ×180 · exact -7.30 -1.63 ×180");
    }
}
