//! The History destination: saved calculations, newest first and grouped by
//! day, with filter, open, delete and undo, clear all, export and import.
//! Also the storage banner the shell shows on the other destinations.
//!
//! Size: every Leptos view is its own generated code in the wasm, so the
//! static parts switch with `hidden` instead of appearing and disappearing,
//! and the list (one page of up to 50 entries, rebuilt whenever it changes)
//! is written with plain DOM calls, all text as text nodes, never markup.
//! One delegated click handler serves every Delete button.

use crate::history::calendar::{clock, day_words, iso_date, local};
use crate::history::entry::entries_words;
use crate::history::files::{three_digit_axes, to_csv, to_json, unreadable_json, IMPORT_MAX};
use crate::history::search::filter;
use crate::history::{download, Action, Entry, History, StoreError};
use crate::link::{href, Destination, Query};
use crate::sync::{initial_query, use_link_sync, Base};
use crate::widgets::eye_words;
use chrono::{Local, NaiveDate};
use leptos::prelude::*;
use leptos_router::hooks::use_location;
use wasm_bindgen::JsCast;

/// Entries rendered at a time; "Show more" adds as many again.
const PAGE: usize = 50;

fn history() -> History {
    expect_context::<History>()
}

fn base() -> String {
    use_context::<Base>().map(|b| b.0).unwrap_or_default()
}

/// What the user should know about storage (faults, session-only mode, data kept aside).
fn storage_notes(history: History) -> String {
    history.with(|s| {
        s.notices()
            .iter()
            .map(ToString::to_string)
            .collect::<Vec<_>>()
            .join(" ")
    })
}

/// The calculation a stored or linked id names, if it is one.
fn calculation(id: &str) -> Option<Destination> {
    Destination::from_id(id).filter(|d| d.is_calculator())
}

/// Storage problems, shown on every other destination once the page is up.
#[component]
pub fn HistoryBanner() -> impl IntoView {
    let history = history();
    let location = use_location();
    let text = Memo::new(move |_| storage_notes(history));
    let hidden = move || text.with(String::is_empty) || location.pathname.get().ends_with("/history");
    view! {
        <div class="storage-banner" role="status" hidden=hidden>
            <p>{text}</p>
            <a href=format!("{}/history", base())>"Open the history"</a>
        </div>
    }
}

/// A new element with a class and optional text (always as a text node).
fn el(tag: &str, class: &str, text: &str) -> web_sys::Element {
    let e = document().create_element(tag).expect("element");
    if !class.is_empty() {
        e.set_class_name(class);
    }
    if !text.is_empty() {
        e.set_text_content(Some(text));
    }
    e
}

fn add(parent: &web_sys::Element, child: &web_sys::Element) {
    let _ = parent.append_with_node_1(child);
}

/// One saved calculation as a list item.
fn entry_item(e: &Entry, base: &str) -> web_sys::Element {
    let when = local(e.saved_at_ms, &Local);
    let li = el("li", "history-entry", "");
    let head = el("p", "history-head", "");
    let time = el("time", "", &clock(when));
    let _ = time.set_attribute("datetime", &iso_date(when));
    add(&head, &time);
    add(&head, &el("span", "history-calculation", e.destination.title()));
    add(&head, &el("span", "history-label", &e.label));
    add(&li, &head);
    let eyes = el("ul", "history-eyes", "");
    for y in &e.eyes {
        let row = el("li", "", "");
        add(&row, &el("b", "", eye_words(y.eye).1));
        let _ = row.append_with_str_1(&format!(" {} → ", three_digit_axes(&y.input)));
        add(&row, &el("span", "rx", &three_digit_axes(&y.result)));
        if let Some(o) = &y.order {
            let _ = row.append_with_str_1(&format!(" · order {}", three_digit_axes(o)));
        }
        add(&eyes, &row);
    }
    // A calculation without eyes (a conversion chart) says what it was instead.
    if e.eyes.is_empty() {
        add(&li, &el("p", "history-summary", &e.summary));
    } else {
        add(&li, &eyes);
    }
    let actions = el("div", "actions", "");
    let open = el("a", "button", "Open");
    let _ = open.set_attribute(
        "href",
        &format!("{base}{}", href(e.destination, &Query::parse(&e.query))),
    );
    add(&actions, &open);
    if let Some(check) = super::check_link::entry_check_href(e) {
        let link = el("a", "button", "Check lens");
        let _ = link.set_attribute("href", &format!("{base}{check}"));
        add(&actions, &link);
    }
    let delete = el("button", "button quiet", "Delete");
    let _ = delete.set_attribute("type", "button");
    let _ = delete.set_attribute("data-id", &e.id);
    add(&actions, &delete);
    add(&li, &actions);
    li
}

/// Rebuilds the visible page of results, grouped by local day.
fn render_list(container: &web_sys::Element, entries: &[Entry], ids: &[usize], base: &str, today: NaiveDate) {
    container.set_text_content(None);
    let mut day: Option<(NaiveDate, web_sys::Element)> = None;
    for &i in ids {
        let e = &entries[i];
        let date = local(e.saved_at_ms, &Local).date();
        if day.as_ref().is_none_or(|(d, _)| *d != date) {
            let prefix = match today.signed_duration_since(date).num_days() {
                0 => "Today, ",
                1 => "Yesterday, ",
                _ => "",
            };
            let section = el("section", "history-day", "");
            add(&section, &el("h2", "", &format!("{prefix}{}", day_words(date.into()))));
            let list = el("ul", "history-list", "");
            add(&section, &list);
            add(container, &section);
            day = Some((date, list));
        }
        if let Some((_, list)) = &day {
            add(list, &entry_item(e, base));
        }
    }
}

#[component]
pub fn HistoryPanel() -> impl IntoView {
    let history = history();
    let base = base();
    let q = initial_query();
    let text = RwSignal::new(q.get("q").unwrap_or_default().to_string());
    // The link keeps the calculation under `panel`, as links made before do.
    let only = RwSignal::new(q.get("panel").and_then(calculation));
    let shown = RwSignal::new(PAGE);
    let status = RwSignal::new(String::new());
    let undo = RwSignal::new(None::<Entry>);
    let confirming = RwSignal::new(false);
    let exported_aside = RwSignal::new(false);

    let current = Memo::new(move |_| {
        Query::default()
            .with("q", &text.get())
            .with("panel", only.get().map_or("", Destination::id))
    });
    use_link_sync(Destination::History, current);

    let results = Memo::new(move |_| {
        let d = only.get();
        text.with(|t| history.with(|s| filter(s.entries(), t, d)))
    });
    let total = Memo::new(move |_| history.with(|s| s.entries().len()));

    let list_ref = NodeRef::<leptos::html::Div>::new();
    let today = Local::now().date_naive();
    // Rebuilds the list only when the entries on screen change (older months
    // arriving while the history opens do not change the newest page).
    Effect::new(move |before: Option<Vec<String>>| {
        let limit = shown.get();
        let Some(container) = list_ref.get() else {
            return before.unwrap_or_default();
        };
        results.with(|ids| {
            history.with(|s| {
                let page = &ids[..ids.len().min(limit)];
                let on_screen: Vec<String> = page.iter().map(|&i| s.entries()[i].id.clone()).collect();
                if before.as_ref() != Some(&on_screen) {
                    render_list(&container, s.entries(), page, &base, today);
                }
                on_screen
            })
        })
    });

    let on_list_click = move |ev: leptos::ev::MouseEvent| {
        let button = ev
            .target()
            .and_then(|t| t.dyn_into::<web_sys::Element>().ok())
            .and_then(|t| t.closest("button[data-id]").ok().flatten());
        let Some(id) = button.and_then(|b| b.get_attribute("data-id")) else {
            return;
        };
        match history.delete(&id) {
            Ok(entry) => {
                undo.set(Some(entry));
                status.set("Entry deleted.".into());
            }
            Err(e) => status.set(e.message(Action::Delete)),
        }
    };
    let undo_delete = move |_| {
        if let Some(entry) = undo.get_untracked() {
            undo.set(None);
            status.set(match history.restore(entry) {
                Ok(()) => "Entry restored.".into(),
                Err(e) => e.message(Action::Save),
            });
        }
    };
    let clear_all = move |_| {
        confirming.set(false);
        undo.set(None);
        status.set(match history.clear() {
            Ok(n) => format!("Deleted all {}.", entries_words(n)),
            Err(e) => e.message(Action::Clear),
        });
    };
    let reading = Memo::new(move |_| history.is_reading());
    let count = move || {
        let (n, all) = (results.with(Vec::len), total.get());
        let counted = match (n, all) {
            (_, 0) if reading.get() => return "Opening the history…".to_string(),
            (_, 0) => "Nothing saved yet. Save a calculation from any panel: it stays on this device.".to_string(),
            (0, _) => format!("No entry matches (of {all})."),
            (n, all) if n == all => format!("{}.", entries_words(all)),
            (n, all) => format!("{n} of {} match.", entries_words(all)),
        };
        if reading.get() {
            format!("{counted} Still opening older entries…")
        } else {
            counted
        }
    };
    let notes = Memo::new(move |_| storage_notes(history));
    let has_aside = move || history.with(|s| !s.aside().is_empty());
    let export_aside = move |_| {
        download(
            "lensplane-unreadable-history.json",
            "application/json",
            &history.with(|s| unreadable_json(s.aside())),
        );
        exported_aside.set(true);
    };
    let discard_aside = move |_| {
        history.discard_aside();
        status.set("The unreadable data was removed.".into());
    };
    let export = move |csv: bool| {
        let stamp = iso_date(local(chrono::Utc::now().timestamp_millis(), &Local));
        history.finish_reading();
        let (text, mime) = history.with(|s| {
            if csv {
                (to_csv(s.entries(), &Local), "text/csv;charset=utf-8")
            } else {
                (to_json(s.entries()), "application/json")
            }
        });
        download(
            &format!("lensplane-history-{stamp}.{}", if csv { "csv" } else { "json" }),
            mime,
            &text,
        );
    };
    let import = move |ev: leptos::ev::Event| {
        let input: web_sys::HtmlInputElement = event_target(&ev);
        let Some(file) = input.files().and_then(|f| f.get(0)) else {
            return;
        };
        input.set_value("");
        if file.size() > IMPORT_MAX as f64 {
            status.set(StoreError::TooLarge.message(Action::Import));
            return;
        }
        leptos::task::spawn_local(async move {
            let text = wasm_bindgen_futures::JsFuture::from(file.text())
                .await
                .ok()
                .and_then(|t| t.as_string());
            status.set(match text.map(|t| history.import(&t)) {
                None => "The file could not be read. Nothing was changed.".into(),
                Some(Ok(r)) if r.added == 0 => format!(
                    "Nothing new to import: all {} already in the history.",
                    entries_words(r.duplicates)
                ),
                Some(Ok(r)) if r.duplicates == 0 => format!("Imported {}.", entries_words(r.added)),
                Some(Ok(r)) => format!(
                    "Imported {}; {} already in the history skipped.",
                    entries_words(r.added),
                    entries_words(r.duplicates)
                ),
                Some(Err(e)) => e.message(Action::Import),
            });
        });
    };

    view! {
        <h1>{Destination::History.title()}</h1>
        <p class="lede">"Calculations saved on this device. Nothing leaves it unless you export a file."</p>
        <div class="storage-banner" role="alert" hidden=move || notes.with(String::is_empty)>
            <p>{notes}</p>
            <div class="actions" hidden=move || !has_aside()>
                <button type="button" class="button" on:click=export_aside>"Export unreadable data"</button>
                <button type="button" class="button danger" hidden=move || !exported_aside.get() on:click=discard_aside>"Remove unreadable data"</button>
            </div>
        </div>
        <div class="history-tools">
            <div class="field">
                <label for="history-filter">"Filter"</label>
                <input id="history-filter" type="search" autocomplete="off" placeholder="a label or a power"
                    prop:value=move || text.get()
                    on:input=move |ev| { text.set(event_target_value(&ev)); shown.set(PAGE); }/>
            </div>
            <div class="field">
                <label for="history-calculation">"Calculation"</label>
                <select id="history-calculation" prop:value=move || only.get().map_or("", Destination::id)
                    on:change=move |ev| { only.set(calculation(&event_target_value(&ev))); shown.set(PAGE); }>
                    <option value="">"All calculations"</option>
                    {Destination::ALL.into_iter().filter(|d| d.is_calculator())
                        .map(|d| view! { <option value=d.id()>{d.title()}</option> }).collect_view()}
                </select>
            </div>
        </div>
        <p class="history-count">{count}</p>
        <p class="status" role="status">
            {move || status.get()}" "
            <button type="button" class="button" hidden=move || undo.with(Option::is_none) on:click=undo_delete>"Undo"</button>
        </p>
        <div class="history-days" node_ref=list_ref on:click=on_list_click></div>
        <button type="button" class="button" hidden=move || results.with(Vec::len) <= shown.get()
            on:click=move |_| shown.update(|n| *n += PAGE)>"Show more"</button>
        <section class="history-files" aria-label="Files">
            <h2>"Export and import"</h2>
            <div class="actions">
                <button type="button" class="button" on:click=move |_| export(false)>"Export JSON"</button>
                <button type="button" class="button" on:click=move |_| export(true)>"Export CSV"</button>
                <input id="history-import" class="visually-hidden" type="file" accept=".json,application/json" on:change=import/>
                <label class="button" for="history-import">"Import JSON…"</label>
            </div>
            <p class="field-msg hint">"JSON keeps everything and imports back; CSV has one row per eye for spreadsheets. Exported files contain the labels you typed."</p>
            <div class="actions" hidden=move || total.get() == 0>
                <button type="button" class="button danger" hidden=move || confirming.get()
                    on:click=move |_| { history.finish_reading(); confirming.set(true); }>"Clear all…"</button>
                <div class="confirm" role="group" aria-label="Confirm clearing" hidden=move || !confirming.get()>
                    <p>{move || format!("Delete all {} from this device? This cannot be undone: export first to keep a copy.", entries_words(total.get()))}</p>
                    <button type="button" class="button danger" on:click=clear_all>"Delete all entries"</button>" "
                    <button type="button" class="button" on:click=move |_| confirming.set(false)>"Cancel"</button>
                </div>
            </div>
        </section>
    }
}
