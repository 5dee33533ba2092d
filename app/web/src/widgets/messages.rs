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

/// The standing cautions of a calculation's page, as the core scopes them.
#[component]
pub fn Cautions(calculation: lensplane_core::Calculation) -> impl IntoView {
    view! {
        <aside class="cautions" aria-label="Cautions">
            <h2>"Before you order"</h2>
            <ul>
                {lensplane_core::cautions_for(calculation).map(|c| view! { <li>{c.to_string()}</li> }).collect_view()}
            </ul>
        </aside>
    }
}
