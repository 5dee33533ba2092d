//! What a result area shows: nothing, a fresh result, the last good result
//! marked stale while an input has an error, or an error.

use lensplane_core::Error;
use leptos::prelude::*;

#[derive(Clone, Debug, PartialEq)]
pub enum Shown<T> {
    /// The eye is left empty.
    Empty,
    Fresh(T),
    /// The last good result, with the error that stops a new one.
    Stale(T, String),
    /// An error and no earlier result.
    Failed(String),
}

impl<T: Clone> Shown<T> {
    pub fn result(&self) -> Option<&T> {
        match self {
            Shown::Fresh(t) | Shown::Stale(t, _) => Some(t),
            _ => None,
        }
    }

    pub fn fresh(&self) -> Option<&T> {
        match self {
            Shown::Fresh(t) => Some(t),
            _ => None,
        }
    }
}

/// A memo that keeps the last good result when `compute` fails.
pub fn shown_memo<T>(compute: impl Fn() -> Option<Result<T, Error>> + Send + Sync + 'static) -> Memo<Shown<T>>
where
    T: Clone + PartialEq + Send + Sync + 'static,
{
    Memo::new(move |previous: Option<&Shown<T>>| match compute() {
        None => Shown::Empty,
        Some(Ok(t)) => Shown::Fresh(t),
        Some(Err(e)) => match previous.and_then(Shown::result) {
            Some(t) => Shown::Stale(t.clone(), e.to_string()),
            None => Shown::Failed(e.to_string()),
        },
    })
}

/// The note shown over a stale or failed result.
#[component]
pub fn ShownNote<T: Clone + PartialEq + Send + Sync + 'static>(shown: Memo<Shown<T>>) -> impl IntoView {
    move || match shown.get() {
        Shown::Stale(_, e) => Some(
            view! {
                <p class="stale-note">"Not updated: " {e} ". The figures below are from the last complete entry."</p>
            }
            .into_any(),
        ),
        Shown::Failed(e) => Some(view! { <p class="stale-note">{e}</p> }.into_any()),
        _ => None,
    }
}
