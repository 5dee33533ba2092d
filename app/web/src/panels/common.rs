//! What the calculator panels share: both eyes' entries, their parse, one
//! result card per eye, the spoken summary and the save/copy payloads.

use crate::history::{EyeSummary, SaveRequest};
use crate::link::{Destination, Query};
use crate::widgets::{eye_words, shown_memo, Card, EyeCard, EyeEntry, SaveBar, Shown};
use lensplane_core::{Error, Eye, Parsed, Rx};
use leptos::prelude::*;

/// Both eyes: what was typed, what it parses to, and the result cards.
#[derive(Clone, Copy)]
pub struct Eyes {
    pub right: EyeEntry,
    pub left: EyeEntry,
    pub right_parsed: Memo<Option<Result<Parsed<Rx>, Error>>>,
    pub left_parsed: Memo<Option<Result<Parsed<Rx>, Error>>>,
    pub right_card: Memo<Shown<Card>>,
    pub left_card: Memo<Shown<Card>>,
    /// One-line trade-notation summaries per eye, for the history.
    right_summary: Memo<Option<EyeSummary>>,
    left_summary: Memo<Option<EyeSummary>>,
}

/// What a panel computes for one eye: its card and its history summary.
pub type EyeOutcome = (Card, EyeSummary);

impl Eyes {
    /// `compute` turns one eye's prescription into its card and summary (or an error).
    pub fn new(
        query: &Query,
        compute: impl Fn(Eye, Rx) -> Result<EyeOutcome, Error> + Copy + Send + Sync + 'static,
    ) -> Eyes {
        let right = EyeEntry::new(Eye::Right, query.get("r"));
        let left = EyeEntry::new(Eye::Left, query.get("l"));
        let right_parsed = Memo::new(move |_| right.parsed());
        let left_parsed = Memo::new(move |_| left.parsed());
        let outcome = move |eye: Eye, parsed: Memo<Option<Result<Parsed<Rx>, Error>>>| {
            Memo::new(move |_| parsed.get().map(|p| p.and_then(|p| compute(eye, p.value))))
        };
        let right_outcome = outcome(Eye::Right, right_parsed);
        let left_outcome = outcome(Eye::Left, left_parsed);
        let card =
            move |o: Memo<Option<Result<EyeOutcome, Error>>>| shown_memo(move || o.get().map(|r| r.map(|(c, _)| c)));
        let summary = move |o: Memo<Option<Result<EyeOutcome, Error>>>| {
            Memo::new(move |_| o.get().and_then(|r| r.ok()).map(|(_, s)| s))
        };
        Eyes {
            right,
            left,
            right_parsed,
            left_parsed,
            right_card: card(right_outcome),
            left_card: card(left_outcome),
            right_summary: summary(right_outcome),
            left_summary: summary(left_outcome),
        }
    }

    pub fn load(&self, query: &Query) {
        self.right.load(query.get("r"));
        self.left.load(query.get("l"));
    }

    /// The link values of both eyes.
    pub fn add_to(&self, query: Query) -> Query {
        query
            .with("r", &self.right.link_text())
            .with("l", &self.left.link_text())
    }

    /// A short polite announcement of the current results.
    pub fn announcement(&self) -> String {
        [(Eye::Right, self.right_card.get()), (Eye::Left, self.left_card.get())]
            .into_iter()
            .filter_map(|(eye, s)| {
                s.fresh()
                    .map(|c| format!("{} eye: {} {}", eye_words(eye).0, c.main_label, c.main_value))
            })
            .collect::<Vec<_>>()
            .join(". ")
    }

    /// The panel as plain text for the clipboard.
    pub fn text(&self, heading: &str) -> Option<String> {
        let mut lines = vec![heading.to_string()];
        for (eye, shown) in [(Eye::Right, self.right_card.get()), (Eye::Left, self.left_card.get())] {
            if let Some(card) = shown.fresh() {
                let (_, letter) = eye_words(eye);
                lines.extend(card.text_lines().into_iter().map(|l| format!("{letter}  {l}")));
            }
        }
        if lines.len() == 1 {
            return None;
        }
        lines.push("A starting point, not a prescription: confirm by over-refraction and acuity.".into());
        Some(lines.join("\n"))
    }

    /// What to save, or `None` when neither eye has a current result.
    pub fn save_request(&self, destination: Destination, query: Query, label: String) -> Option<SaveRequest> {
        let eyes: Vec<EyeSummary> = [self.right_summary.get_untracked(), self.left_summary.get_untracked()]
            .into_iter()
            .flatten()
            .collect();
        (!eyes.is_empty()).then(|| SaveRequest {
            destination,
            query,
            label,
            eyes,
        })
    }
}

/// The summary line of one eye for the history.
pub fn summary(eye: Eye, input: &Rx, result: String, order: Option<String>) -> EyeSummary {
    EyeSummary {
        eye,
        input: input.to_string(),
        result,
        order,
    }
}

/// Both eyes' result cards, the polite announcement of them, and the
/// copy/save bar: the results column of every calculator panel.
#[component]
pub fn EyeResults(
    eyes: Eyes,
    id_prefix: &'static str,
    text: Signal<Option<String>>,
    request: Callback<String, Option<SaveRequest>>,
) -> impl IntoView {
    view! {
        <EyeCard eye=Eye::Right shown=eyes.right_card/>
        <EyeCard eye=Eye::Left shown=eyes.left_card/>
        <p class="visually-hidden" aria-live="polite">{move || eyes.announcement()}</p>
        <SaveBar id_prefix=id_prefix text=text request=request/>
    }
}
