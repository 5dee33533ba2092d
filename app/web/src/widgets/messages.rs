//! Messages at fields, warning lists and the standing cautions.

use lensplane_core::{Error, Field, Notice, Place, Warning};
use leptos::prelude::*;

/// Something to show under a field.
#[derive(Clone, Debug, PartialEq)]
pub enum Message {
    /// The input cannot be used as typed.
    Error(String),
    /// The input was read, with something worth knowing.
    Notice(String),
    /// The input stands, but the practitioner should look again.
    Warning(String),
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

    /// The class it is shown with.
    pub fn class(&self) -> &'static str {
        match self {
            Message::Error(_) => "error",
            Message::Notice(_) => "notice",
            Message::Warning(_) => "warning",
        }
    }

    pub fn text(&self) -> &str {
        match self {
            Message::Error(t) | Message::Notice(t) | Message::Warning(t) => t,
        }
    }
}

/// The warnings shown beside one eye's result (the others are at the
/// shared inputs or at the entry already).
pub fn result_warnings(warnings: &[Warning]) -> Vec<String> {
    warnings
        .iter()
        .filter(|w| w.place() == Place::Result)
        .map(|w| w.message.clone())
        .collect()
}

/// The warnings about shared inputs in `warnings` that belong at `field`.
pub fn field_warnings(warnings: &[Warning], field: Field) -> Vec<Message> {
    warnings
        .iter()
        .filter(|w| w.place() == Place::SharedInput && w.field == field)
        .map(|w| Message::Warning(w.message.clone()))
        .collect()
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
