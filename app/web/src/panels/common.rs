//! What the calculator panels share: both eyes' entries, their parse, one
//! core report per eye, the card built from it, the spoken summary and the
//! save/copy payloads.
//!
//! The chain per eye is three memos: the typed text parsed, the report the
//! core computes from it (and the panel's other inputs), and the card built
//! from the report and the display options. A display option (cylinder
//! form, inches) therefore rebuilds cards without recomputing any report,
//! and typing in one eye never touches the other.

use crate::history::{EyeSummary, SaveRequest};
use crate::link::{Destination, Query};
use crate::prefs::Remembered;
use crate::widgets::{eye_words, shown_memo, Card, EyeCard, EyeEntry, EyeEntryForm, SaveBar, Shown};
use lensplane_core::{Error, Eye, Parsed, Place, Rx, Warning};
use leptos::prelude::*;

type ParsedRx = Memo<Option<Result<Parsed<Rx>, Error>>>;

/// One eye: what was typed, what it parses to, the report and the card.
pub struct EyeState<R: Send + Sync + 'static> {
    pub entry: EyeEntry,
    pub parsed: ParsedRx,
    pub report: Memo<Option<Result<R, Error>>>,
    pub card: Memo<Shown<Card>>,
}

impl<R: Send + Sync + 'static> Clone for EyeState<R> {
    fn clone(&self) -> Self {
        *self
    }
}
impl<R: Send + Sync + 'static> Copy for EyeState<R> {}

/// Both eyes of a calculator panel.
pub struct Eyes<R: Send + Sync + 'static> {
    pub right: EyeState<R>,
    pub left: EyeState<R>,
}

impl<R: Send + Sync + 'static> Clone for Eyes<R> {
    fn clone(&self) -> Self {
        *self
    }
}
impl<R: Send + Sync + 'static> Copy for Eyes<R> {}

impl<R: Clone + PartialEq + Send + Sync + 'static> Eyes<R> {
    /// `compute` turns one eye's prescription into its report (reading the
    /// panel's other inputs); `card` turns a report into what is shown
    /// (reading only display options).
    pub fn new(
        query: &Query,
        compute: impl Fn(Eye, Rx) -> Result<R, Error> + Copy + Send + Sync + 'static,
        card: impl Fn(&R) -> Card + Copy + Send + Sync + 'static,
    ) -> Eyes<R> {
        let one = move |eye: Eye, key: &str| {
            let entry = EyeEntry::new(eye, query.get(key));
            let parsed = Memo::new(move |_| entry.parsed());
            let report = Memo::new(move |_| parsed.get().map(|p| p.and_then(|p| compute(eye, p.value))));
            let card =
                shown_memo(move || report.with(|r| r.as_ref().map(|r| r.as_ref().map(card).map_err(Clone::clone))));
            EyeState {
                entry,
                parsed,
                report,
                card,
            }
        };
        Eyes {
            right: one(Eye::Right, "r"),
            left: one(Eye::Left, "l"),
        }
    }
}

impl<R: Send + Sync + 'static> Eyes<R> {
    /// The warnings about inputs both eyes share (vertex distances, add,
    /// age), once: shown at those inputs, not in each card.
    pub fn shared_warnings(&self, of: impl Fn(&R) -> &[Warning] + Copy + Send + Sync + 'static) -> Memo<Vec<Warning>> {
        let eyes = *self;
        Memo::new(move |_| {
            let mut out: Vec<Warning> = Vec::new();
            for (_, s) in eyes.both() {
                s.report.with(|r| {
                    if let Some(Ok(r)) = r {
                        for w in of(r).iter().filter(|w| w.place() == Place::SharedInput) {
                            if !out.contains(w) {
                                out.push(w.clone());
                            }
                        }
                    }
                });
            }
            out
        })
    }

    fn both(&self) -> [(Eye, EyeState<R>); 2] {
        [(Eye::Right, self.right), (Eye::Left, self.left)]
    }

    /// The link values of both eyes.
    pub fn add_to(&self, query: Query) -> Query {
        query
            .with("r", &self.right.entry.link_text())
            .with("l", &self.left.entry.link_text())
    }

    /// A short polite announcement of the current results.
    pub fn announcement(&self) -> String {
        self.both()
            .into_iter()
            .filter_map(|(eye, s)| {
                s.card.with(|c| {
                    c.fresh()
                        .map(|c| format!("{} eye: {}", eye_words(eye).0, c.headline.glance()))
                })
            })
            .collect::<Vec<_>>()
            .join(". ")
    }

    /// The panel as plain text for the clipboard: a heading, one compact
    /// order line per eye ("R -7.00 -1.75 ×180 (contact lens, from … at 12 mm)"),
    /// the exact values, and the standing reminder.
    pub fn text(&self, heading: &str) -> Option<String> {
        let mut lines = vec![heading.to_string()];
        let mut exact = vec![];
        for (eye, s) in self.both() {
            s.card.with(|shown| {
                if let Some(card) = shown.fresh() {
                    let (_, letter) = eye_words(eye);
                    lines.push(format!("{letter} {}", card.copy));
                    exact.push(format!(
                        "{letter} {} {}",
                        card.headline.exact_short, card.headline.exact
                    ));
                }
            });
        }
        if exact.is_empty() {
            return None;
        }
        lines.push(exact.join("; "));
        lines.push("A starting point, not a prescription: confirm by over-refraction and acuity.".into());
        Some(lines.join("\n"))
    }

    /// What to save, or `None` when neither eye has a current result.
    pub fn save_request(
        &self,
        destination: Destination,
        query: Query,
        label: String,
        summary: impl Fn(Eye, &R) -> EyeSummary,
    ) -> Option<SaveRequest> {
        let eyes: Vec<EyeSummary> = self
            .both()
            .into_iter()
            .filter_map(|(eye, s)| {
                s.report
                    .with_untracked(|r| r.as_ref()?.as_ref().ok().map(|r| summary(eye, r)))
            })
            .collect();
        (!eyes.is_empty()).then(|| SaveRequest {
            destination,
            query,
            label,
            eyes,
            summary: String::new(),
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

/// Both eyes' entry forms, each with its answer at a glance.
#[component]
pub fn EyeEntries<R: Send + Sync + 'static>(eyes: Eyes<R>, id_prefix: &'static str) -> impl IntoView {
    view! {
        <EyeEntryForm entry=eyes.right.entry parsed=eyes.right.parsed result=eyes.right.card id_prefix=id_prefix/>
        <EyeEntryForm entry=eyes.left.entry parsed=eyes.left.parsed result=eyes.left.card id_prefix=id_prefix/>
    }
}

/// Both eyes' result cards, the polite announcement of them, and the
/// copy/save bar: the results column of every calculator panel.
#[component]
pub fn EyeResults<R: Send + Sync + 'static>(
    eyes: Eyes<R>,
    id_prefix: &'static str,
    /// Whether the cards' details are open, remembered for this panel.
    details: Remembered,
    text: Signal<Option<String>>,
    request: Callback<String, Option<SaveRequest>>,
) -> impl IntoView {
    view! {
        <EyeCard eye=Eye::Right shown=eyes.right.card details=details/>
        <EyeCard eye=Eye::Left shown=eyes.left.card details=details/>
        <p class="visually-hidden" aria-live="polite">{move || eyes.announcement()}</p>
        <SaveBar id_prefix=id_prefix text=text request=request/>
    }
}
