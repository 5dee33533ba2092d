//! The Conversion chart destination: a printable vertex table for the
//! fitting-room wall. Every power from `min` to `max` (both signs) moved
//! from one plane to another, exact and orderable, as the core's
//! [`Chart`] computes it; rows of a carried prescription highlighted; the
//! chart as CSV, as text, in the history and on paper.

use crate::history::calendar::{iso_date, local};
use crate::history::{download, SaveRequest};
use crate::link::{Destination, Query};
use crate::shell::build_meta;
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{Cautions, Message, PlaneInputs, Planes, SaveBar, TextField};
use lensplane_core::{parse_chart, parse_rx, Chart, ChartQuery, ChartSection, Error, Field, LadderKind, Parsed, Rx};
use leptos::prelude::*;

/// The ladder choice as the select offers it: by the target plane (the
/// link leaves `ladder` out), or one of the core's ladders.
const BY_TARGET: (&str, &str) = ("", "By the target plane");

/// One row as shown: its cells and whether a carried prescription of the
/// right or left eye falls on it.
#[derive(Clone, Debug, PartialEq)]
struct ShownRow {
    cells: [String; 3],
    right: bool,
    left: bool,
}

impl ShownRow {
    /// Everything the row shows, so a keyed list rebuilds a row exactly when it changes.
    fn key(&self) -> String {
        format!(
            "{}|{}|{}|{}{}",
            self.cells[0], self.cells[1], self.cells[2], self.right, self.left
        )
    }

    /// "right eye", "left eye" or "right and left eyes" for a carried row.
    fn eyes_words(&self) -> Option<(&'static str, &'static str)> {
        match (self.right, self.left) {
            (true, true) => Some(("R L", "right and left eyes")),
            (true, false) => Some(("R", "right eye")),
            (false, true) => Some(("L", "left eye")),
            (false, false) => None,
        }
    }
}

/// A carried prescription as typed: `None` when empty.
fn read_carried(text: &str) -> Option<Result<Parsed<Rx>, Error>> {
    (!text.trim().is_empty()).then(|| parse_rx(text))
}

/// The CSV's file name, from the chart's link values:
/// `lensplane-chart-12mm-to-cornea-4-20-0.25-cl.csv`.
fn csv_name(chart: &Chart) -> String {
    let [from, to, min, max, step, ladder] = chart.settings.link_values().map(|(_, v)| v);
    let to = if chart.settings.to().is_cornea() {
        "cornea".to_string()
    } else {
        format!("{to}mm")
    };
    format!("lensplane-chart-{from}mm-to-{to}-{min}-{max}-{step}-{ladder}.csv")
}

/// One row of a block: the power as the row's header; a carried row is
/// marked, and says whose prescription it is in words as well.
fn row_view(row: ShownRow) -> impl IntoView {
    let [power, exact, order] = row.cells.clone();
    let carried = row.eyes_words();
    let head = match carried {
        Some((tag, words)) => view! {
            <mark>{power}</mark>
            <span class="carried-tag" aria-hidden="true">{tag}</span>
            <span class="visually-hidden">{format!(", your prescription, {words}")}</span>
        }
        .into_any(),
        None => power.into_any(),
    };
    view! {
        <tr class:carried=carried.is_some()>
            <th scope="row">{head}</th>
            <td>{exact}</td>
            <td>{order}</td>
        </tr>
    }
}

/// One block of the chart (minus powers, plus powers) as a table.
#[component]
fn ChartBlock(
    #[prop(into)] caption: Signal<&'static str>,
    header: Memo<[String; 3]>,
    rows: Memo<Vec<ShownRow>>,
) -> impl IntoView {
    // On a narrow screen with large text the table scrolls in its own box, never the page.
    view! {
        <div class="chart-scroll" role="region" aria-label=move || caption.get() tabindex="0">
        <table class="chart-table">
            <caption>{move || caption.get()}</caption>
            <thead>
                <tr>{move || header.get().map(|h| view! { <th scope="col">{h}</th> }).into_iter().collect_view()}</tr>
            </thead>
            <tbody>
                <For each=move || rows.get() key=ShownRow::key children=row_view/>
            </tbody>
        </table>
        </div>
    }
}

/// The messages of one chart setting: the error when it is this field's,
/// else the notices about it.
fn field_messages(
    parsed: Memo<Result<Parsed<lensplane_core::ChartSettings>, Error>>,
    field: Field,
) -> Signal<Vec<Message>> {
    Signal::derive(move || {
        parsed.with(|p| match p {
            Err(e) if e.field() == field => vec![Message::error(e)],
            Err(_) => vec![],
            Ok(p) => p
                .notices
                .iter()
                .filter(|n| n.field == field)
                .map(Message::notice)
                .collect(),
        })
    })
}

#[component]
pub fn ChartPanel() -> impl IntoView {
    let q = initial_query();
    let planes = Planes::new(q.get("from"), q.get("to"));
    let text = |key: &str, default: &str| RwSignal::new(q.get(key).unwrap_or(default).to_string());
    let (min, max, step) = (text("min", "4"), text("max", "20"), text("step", "0.25"));
    let ladder = text("ladder", "");
    let (right, left) = (text("r", ""), text("l", ""));

    let parsed = Memo::new(move |_| {
        let (from, to) = (planes.link_from(), planes.link_to());
        let (mn, mx, st, ld) = (min.get(), max.get(), step.get(), ladder.get());
        parse_chart(&ChartQuery {
            from: Some(&from),
            to: Some(&to),
            min: Some(&mn),
            max: Some(&mx),
            step: Some(&st),
            ladder: Some(&ld),
        })
    });
    let chart = Memo::new(move |_| parsed.with(|p| p.as_ref().ok().map(|p| Chart::new(&p.value))));
    let carried_right = Memo::new(move |_| right.with(|t| read_carried(t)));
    let carried_left = Memo::new(move |_| left.with(|t| read_carried(t)));
    let carried_rx = move |which: Memo<Option<Result<Parsed<Rx>, Error>>>| {
        which.with(|c| c.as_ref().and_then(|r| r.as_ref().ok()).map(|p| p.value))
    };
    // The rows each carried prescription falls on.
    let highlighted = Memo::new(move |_| {
        chart.with(|c| {
            let Some(c) = c else { return (vec![], vec![]) };
            let rows = |rx: Option<Rx>| rx.map(|rx| c.rows_for(&rx)).unwrap_or_default();
            (rows(carried_rx(carried_right)), rows(carried_rx(carried_left)))
        })
    });
    let block = move |plus: bool| {
        Memo::new(move |_| {
            chart.with(|c| {
                let Some(c) = c else { return vec![] };
                highlighted.with(|(r, l)| {
                    c.rows
                        .iter()
                        .enumerate()
                        .filter(|(_, row)| (row.section == ChartSection::Plus) == plus)
                        .map(|(i, row)| ShownRow {
                            cells: row.cells.clone(),
                            right: r.contains(&i),
                            left: l.contains(&i),
                        })
                        .collect()
                })
            })
        })
    };
    let (minus_rows, plus_rows) = (block(false), block(true));
    let header = Memo::new(move |_| chart.with(|c| c.as_ref().map(|c| c.header.clone()).unwrap_or_default()));
    let titles = Memo::new(move |_| {
        chart.with(|c| {
            c.as_ref()
                .map(|c| (c.title.clone(), c.subtitle.clone()))
                .unwrap_or_default()
        })
    });
    let has_plano = Memo::new(move |_| {
        chart.with(|c| {
            c.as_ref()
                .is_some_and(|c| c.rows.iter().any(|r| r.section == ChartSection::Plano))
        })
    });

    let current = Memo::new(move |_| {
        Query::default()
            .with("from", &planes.link_from())
            .with("to", &planes.link_to())
            .with("min", &min.get())
            .with("max", &max.get())
            .with("step", &step.get())
            .with("ladder", &ladder.get())
            .with("r", &right.get())
            .with("l", &left.get())
    });
    use_link_sync(Destination::Chart, current);

    // What a carried prescription says at its field: its error or notices,
    // and which rows it falls on.
    let carried_messages = move |which: Memo<Option<Result<Parsed<Rx>, Error>>>, index: usize| {
        Signal::derive(move || {
            let Some(result) = which.get() else { return vec![] };
            match result {
                Err(e) => vec![Message::error(&e)],
                Ok(p) => {
                    let mut out: Vec<Message> = p.notices.iter().map(Message::notice).collect();
                    let words = chart.with(|c| {
                        let c = c.as_ref()?;
                        let rows = highlighted.with(|h| if index == 0 { h.0.clone() } else { h.1.clone() });
                        Some(if rows.is_empty() {
                            "No row of this chart has its principal powers (sphere, and sphere + cylinder).".to_string()
                        } else {
                            let powers: Vec<&str> = rows.iter().map(|&i| c.rows[i].cells[0].as_str()).collect();
                            format!("Highlighted in the chart: {}.", powers.join(" and "))
                        })
                    });
                    out.extend(words.map(Message::Notice));
                    out
                }
            }
        })
    };

    let version = build_meta("lensplane-version");
    let today = iso_date(local(chrono::Utc::now().timestamp_millis(), &chrono::Local));
    let stamp = format!("Lensplane {version} · {today}");

    let copy_text = Signal::derive(move || {
        chart.with(|c| {
            let c = c.as_ref()?;
            let mut lines = vec![
                format!("Lensplane · {}", Destination::Chart.title()),
                c.title.clone(),
                c.subtitle.clone(),
                c.header.join("\t"),
            ];
            lines.extend(c.rows.iter().map(|r| r.cells.join("\t")));
            lines.push("A starting point, not a prescription: confirm by over-refraction and acuity.".into());
            Some(lines.join("\n"))
        })
    });
    let request = Callback::new(move |label: String| {
        let c = chart.get_untracked()?;
        let mut summary = c.settings.summary();
        for (letter, rx) in [("R", carried_rx(carried_right)), ("L", carried_rx(carried_left))] {
            if let Some(rx) = rx {
                summary.push_str(&format!("; {letter} {rx} highlighted"));
            }
        }
        Some(SaveRequest {
            destination: Destination::Chart,
            query: current.get_untracked(),
            label,
            eyes: vec![],
            summary,
        })
    });
    let status = RwSignal::new(String::new());
    let download_csv = move |_| {
        let Some(c) = chart.get_untracked() else {
            status.set("No chart to download: correct the setting that has a message.".into());
            return;
        };
        let name = csv_name(&c);
        status.set(if download(&name, "text/csv;charset=utf-8", &c.csv()) {
            format!("Downloaded {name}.")
        } else {
            "The browser did not allow the download.".into()
        });
    };
    let print = move |_| {
        let _ = window().print();
    };

    let ladder_msgs = field_messages(parsed, Field::Ladder);
    let ladder_invalid = move || ladder_msgs.with(|m| m.iter().any(Message::is_error));
    // A ladder from a link that is not one of ours stays selected, as typed, with its message.
    let unknown_ladder = move || {
        let l = ladder.get();
        let known = l.is_empty() || LadderKind::ALL.iter().any(|k| k.link_value() == l);
        (!known).then_some(l)
    };
    let no_planes = Memo::new(|_| Vec::new());

    view! {
        <h1>{Destination::Chart.title()}</h1>
        <p class="lede">"A vertex conversion table to print for the fitting room: each power and what it becomes at another plane, exact and to order."</p>
        <div class="chart-layout">
            <form class="chart-settings" on:submit=|ev| ev.prevent_default()>
                <PlaneInputs planes=planes id_prefix="chart" from_label="Vertex distance of the listed powers" shared=no_planes/>
                <fieldset>
                    <legend>"Powers"</legend>
                    <p class="field-msg hint">"Sizes in dioptres: both signs are listed."</p>
                    <TextField id="chart-min" label="Lowest power" value=min messages=field_messages(parsed, Field::ChartMin) unit="D" placeholder="4"/>
                    <TextField id="chart-max" label="Highest power" value=max messages=field_messages(parsed, Field::ChartMax) unit="D" placeholder="20"/>
                    <TextField id="chart-step" label="Step" value=step messages=field_messages(parsed, Field::ChartStep) unit="D" placeholder="0.25"/>
                    <div class="field" class:has-error=ladder_invalid>
                        <label for="chart-ladder">"Round to"</label>
                        <select id="chart-ladder" aria-describedby="chart-ladder-hint chart-ladder-msg"
                            aria-invalid=move || if ladder_invalid() { "true" } else { "false" }
                            prop:value=move || ladder.get()
                            on:change=move |ev| ladder.set(event_target_value(&ev))>
                            <option value=BY_TARGET.0>{BY_TARGET.1}</option>
                            {LadderKind::ALL.map(|k| view! { <option value=k.link_value()>{super::vertex::capitalised(k.words())}</option> }).into_iter().collect_view()}
                            {move || unknown_ladder().map(|l| view! { <option value=l.clone()>{format!("{l} (not a ladder)")}</option> })}
                        </select>
                        <p id="chart-ladder-hint" class="field-msg hint">"By the target plane: contact-lens steps at the cornea, spectacle quarter steps at a spectacle plane."</p>
                        <p id="chart-ladder-msg" class="field-msg" aria-live="polite">
                            {move || ladder_msgs.get().into_iter().map(|m| view! { <span class=m.class()>{m.text().to_string()}</span> }).collect_view()}
                        </p>
                    </div>
                </fieldset>
                <fieldset>
                    <legend>"Prescription to find"</legend>
                    <p class="field-msg hint">"Its rows are highlighted: the sphere, and sphere + cylinder."</p>
                    <TextField id="chart-r" label="Right (R)" name="Right prescription to find" value=right
                        messages=carried_messages(carried_right, 0) inputmode="text" placeholder="-6.00 -2.00 x180"/>
                    <TextField id="chart-l" label="Left (L)" name="Left prescription to find" value=left
                        messages=carried_messages(carried_left, 1) inputmode="text" placeholder="-5.50"/>
                </fieldset>
            </form>
            <div class="chart-results">
                <Show when=move || chart.with(Option::is_some) fallback=|| view! {
                    <p class="chart-none" role="status">"No chart: correct the setting that has a message."</p>
                }>
                    <section class="chart-sheet" aria-labelledby="chart-title">
                        <h2 id="chart-title">{move || titles.get().0}</h2>
                        <p class="chart-subtitle">{move || titles.get().1}</p>
                        <p class="chart-stamp">{stamp.clone()}</p>
                        <div class="chart-blocks">
                            <ChartBlock caption=Signal::derive(move || if has_plano.get() { "Plano and minus powers" } else { "Minus powers" })
                                header=header rows=minus_rows/>
                            <ChartBlock caption="Plus powers" header=header rows=plus_rows/>
                        </div>
                    </section>
                </Show>
                <div class="chart-actions">
                    <div class="actions">
                        <button type="button" class="button" on:click=download_csv>"Download CSV"</button>
                        <button type="button" class="button" on:click=print>"Print"</button>
                    </div>
                    <p class="status" role="status">{move || status.get()}</p>
                </div>
                <SaveBar id_prefix="chart" text=copy_text request=request nothing="Nothing to save yet: correct the setting that has a message."/>
            </div>
        </div>
        <Cautions calculation=lensplane_core::Calculation::Chart/>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::{ChartSettings, VertexDistance};

    #[test]
    fn the_csv_is_named_for_its_planes_powers_and_ladder() {
        assert_eq!(
            csv_name(&Chart::new(&ChartSettings::default())),
            "lensplane-chart-12mm-to-cornea-4-20-0.25-cl.csv"
        );
        let s = ChartSettings::new(
            VertexDistance::from_mm(10.0).unwrap(),
            VertexDistance::from_mm(14.0).unwrap(),
            4.0,
            8.0,
            0.5,
            None,
        )
        .unwrap();
        assert_eq!(
            csv_name(&Chart::new(&s)),
            "lensplane-chart-10mm-to-14mm-4-8-0.5-spec.csv"
        );
    }

    #[test]
    fn a_carried_row_says_whose_it_is() {
        let row = |right, left| ShownRow {
            cells: ["-6.00", "-5.60", "-5.50"].map(String::from),
            right,
            left,
        };
        assert_eq!(row(true, false).eyes_words(), Some(("R", "right eye")));
        assert_eq!(row(true, true).eyes_words(), Some(("R L", "right and left eyes")));
        assert_eq!(row(false, false).eyes_words(), None);
        assert_ne!(row(true, false).key(), row(false, true).key());
        assert!(read_carried("  ").is_none());
        assert!(read_carried("-6.00").is_some_and(|r| r.is_ok()));
    }
}
