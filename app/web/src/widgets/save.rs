//! Copy the calculation as plain text or as its link, or save it (with an optional label)
//! to the on-device history.

use crate::history::{Action, History, SaveRequest};
use leptos::prelude::*;

/// Writes text to the clipboard; the future resolves with whether it worked.
async fn copy_to_clipboard(text: String) -> bool {
    let Some(window) = web_sys::window() else { return false };
    let promise = window.navigator().clipboard().write_text(&text);
    wasm_bindgen_futures::JsFuture::from(promise).await.is_ok()
}

#[component]
pub fn SaveBar(
    id_prefix: &'static str,
    /// The calculation as plain text in trade notation, or `None` when there is nothing to copy.
    text: Signal<Option<String>>,
    /// What to save for a label, or `None` when there is nothing to save.
    request: Callback<String, Option<SaveRequest>>,
    /// What saving says when there is nothing to save (by default: enter a prescription).
    #[prop(optional)]
    nothing: Option<&'static str>,
) -> impl IntoView {
    let history = expect_context::<History>();
    let label = RwSignal::new(String::new());
    let status = RwSignal::new(String::new());
    let save = move || match request.run(label.get_untracked()) {
        Some(req) => match history.save(req) {
            Ok(msg) => {
                status.set(msg.into());
                label.set(String::new());
            }
            Err(e) => status.set(e.message(Action::Save)),
        },
        None => status.set(
            nothing
                .unwrap_or("Nothing to save yet: enter a prescription for at least one eye.")
                .into(),
        ),
    };
    let copy = move |_| {
        let Some(t) = text.get_untracked() else {
            status.set("Nothing to copy yet.".into());
            return;
        };
        leptos::task::spawn_local(async move {
            let ok = copy_to_clipboard(t).await;
            status.set(if ok {
                "Copied as text.".into()
            } else {
                "The browser did not allow copying; select the result text instead.".into()
            });
        });
    };
    // An installed app has no address bar: the link to this calculation is copied from here.
    let copy_link = move |_| {
        let Some(href) = web_sys::window().and_then(|w| w.location().href().ok()) else {
            return;
        };
        leptos::task::spawn_local(async move {
            let ok = copy_to_clipboard(href).await;
            status.set(if ok {
                "Copied the link to this calculation.".into()
            } else {
                "The browser did not allow copying.".into()
            });
        });
    };
    let label_id = format!("{id_prefix}-label");
    let hint_id = format!("{id_prefix}-label-hint");
    view! {
        <form class="save-bar" on:submit=move |ev| { ev.prevent_default(); save(); }>
            <div class="field">
                <label for=label_id.clone()>"Label (optional)"</label>
                <div class="field-row">
                    <input id=label_id type="text" maxlength="60" autocomplete="off" enterkeyhint="done"
                        aria-describedby=hint_id.clone()
                        prop:value=move || label.get() on:input=move |ev| label.set(event_target_value(&ev))/>
                    <button type="submit" class="button primary">"Save to history"</button>
                </div>
                <p id=hint_id class="field-msg hint">"No names or patient identifiers."</p>
            </div>
            <div class="actions">
                <button type="button" class="button" on:click=copy>"Copy as text"</button>
                <button type="button" class="button" on:click=copy_link>"Copy link"</button>
            </div>
            <p class="status" role="status">{move || status.get()}</p>
        </form>
    }
}
