//! Messages at fields, warning lists and the standing cautions.

use lensplane_core::{Error, Notice};
use leptos::prelude::*;

/// Something to show under a field.
#[derive(Clone, Debug, PartialEq)]
pub enum Message {
    /// The input cannot be used as typed.
    Error(String),
    /// The input was read, with something worth knowing.
    Notice(String),
}

impl Message {
    pub fn error(e: &Error) -> Message {
        Message::Error(e.to_string())
    }

    pub fn notice(n: &Notice) -> Message {
        Message::Notice(n.message.clone())
    }

    pub fn is_error(&self) -> bool {
        matches!(self, Message::Error(_))
    }

    pub fn text(&self) -> &str {
        match self {
            Message::Error(t) | Message::Notice(t) => t,
        }
    }
}

/// The standing cautions of a panel, with the core's cautions.
#[component]
pub fn Cautions(#[prop(optional)] extra: Vec<&'static str>) -> impl IntoView {
    view! {
        <aside class="cautions" aria-label="Cautions">
            <h2>"Before you order"</h2>
            <ul>
                {extra.into_iter().map(|c| view! { <li>{c}</li> }).collect_view()}
                {lensplane_core::CAUTIONS.iter().map(|c| view! { <li>{*c}</li> }).collect_view()}
            </ul>
        </aside>
    }
}
