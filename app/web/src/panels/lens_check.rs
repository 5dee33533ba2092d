//! The lens-check destination: is the lens that came back from the lab the
//! lens that was ordered? Per eye the order and the focimeter reading (and
//! the add read), one verdict per eye and one row per item, all from the
//! core's `lens_check` against the tolerances of ANSI Z80.1-2015 as publicly
//! summarised. Prism and centration are not checked, and the page says so.

use super::check_card::{band_rows, check_card, glance_card, CheckCard, CheckRow};
use crate::history::{EyeSummary, SaveRequest};
use crate::link::{Destination, Query};
use crate::prefs::{on_toggle, Remembered};
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{
    eye_words, shown_memo, Card, Cautions, EyeEntry, EyeEntryForm, Message, SaveBar, Shown, ShownNote, TextField,
};
use lensplane_core::{
    lens_check, parse_add, parse_measured_add, tolerances, Add, Error, Eye, Field, LensCheckInput, LensCheckReport,
    LensType, NoticeKind, Parsed, Rx, StepKind, PRISM_NOT_CHECKED,
};
use leptos::prelude::*;

type ParsedMemo<T> = Memo<Option<Result<Parsed<T>, Error>>>;

/// What both eyes share: the add ordered and the lens type, as typed.
#[derive(Clone, Copy)]
struct Order {
    add: RwSignal<String>,
    add_parsed: ParsedMemo<Add>,
    /// The lens type's link text (`sv`, `pal`; kept as typed when unknown).
    lens: RwSignal<String>,
    lens_type: Memo<Result<LensType, Error>>,
}

impl Order {
    fn new(q: &Query) -> Order {
        let add = RwSignal::new(q.get("add").unwrap_or("").to_string());
        let lens = RwSignal::new(q.get("type").unwrap_or("").to_string());
        Order {
            add,
            add_parsed: Memo::new(move |_| add.with(|a| (!a.trim().is_empty()).then(|| parse_add(a)))),
            lens,
            lens_type: Memo::new(move |_| lens.with(|t| LensType::from_link(t))),
        }
    }
}

/// One eye: the lens ordered, the reading, the add read, and the check.
#[derive(Clone, Copy)]
struct CheckEye {
    eye: Eye,
    ordered: EyeEntry,
    ordered_parsed: ParsedMemo<Rx>,
    measured: EyeEntry,
    measured_parsed: ParsedMemo<Rx>,
    add: RwSignal<String>,
    add_parsed: ParsedMemo<f64>,
    report: Memo<Option<Result<LensCheckReport, Error>>>,
    /// What is still to be entered when only one of the two lenses is.
    missing: Memo<Option<&'static str>>,
    card: Memo<Shown<CheckCard>>,
    glance: Memo<Shown<Card>>,
}

fn map_shown<T: Clone, U>(s: &Shown<T>, f: impl Fn(&T) -> U) -> Shown<U> {
    match s {
        Shown::Empty => Shown::Empty,
        Shown::Fresh(t) => Shown::Fresh(f(t)),
        Shown::Stale(t, e) => Shown::Stale(f(t), e.clone()),
        Shown::Failed(e) => Shown::Failed(e.clone()),
    }
}

impl CheckEye {
    fn new(eye: Eye, q: &Query, order: Order) -> CheckEye {
        let (ordered_key, measured_key, add_key) = match eye {
            Eye::Right => ("r", "rm", "radd"),
            Eye::Left => ("l", "lm", "ladd"),
        };
        let ordered = EyeEntry::new(eye, q.get(ordered_key));
        let measured = EyeEntry::new(eye, q.get(measured_key));
        let add = RwSignal::new(q.get(add_key).unwrap_or("").to_string());
        let ordered_parsed = Memo::new(move |_| ordered.parsed());
        // A focimeter reading is the notation of an order, read without the
        // quarter-step notice (the core's `parse_measured_rx`).
        let measured_parsed = Memo::new(move |_| {
            measured.parsed().map(|r| {
                r.map(|mut p| {
                    p.notices.retain(|n| n.kind != NoticeKind::OffStep);
                    p
                })
            })
        });
        let add_parsed = Memo::new(move |_| add.with(|a| (!a.trim().is_empty()).then(|| parse_measured_add(a))));
        let report = Memo::new(move |_| {
            let (o, m) = (ordered_parsed.get(), measured_parsed.get());
            match (o, m) {
                (Some(o), Some(m)) => Some((|| {
                    let input = LensCheckInput {
                        eye,
                        lens_type: order.lens_type.get()?,
                        ordered: o?.value,
                        measured: m?.value,
                        ordered_add: order.add_parsed.get().transpose()?.map_or(Add::NONE, |p| p.value),
                        measured_add: add_parsed.get().transpose()?.map(|p| p.value),
                    };
                    lens_check(&input)
                })()),
                (Some(Err(e)), None) | (None, Some(Err(e))) => Some(Err(e)),
                _ => None,
            }
        });
        let missing = Memo::new(move |_| {
            match (
                ordered_parsed.with(Option::is_some),
                measured_parsed.with(Option::is_some),
            ) {
                (true, false) => Some("Enter the focimeter reading of the received lens for this eye."),
                (false, true) => Some("Enter the lens ordered for this eye."),
                _ => None,
            }
        });
        let shown = shown_memo(move || report.get());
        CheckEye {
            eye,
            ordered,
            ordered_parsed,
            measured,
            measured_parsed,
            add,
            add_parsed,
            report,
            missing,
            card: Memo::new(move |_| shown.with(|s| map_shown(s, check_card))),
            glance: Memo::new(move |_| shown.with(|s| map_shown(s, glance_card))),
        }
    }

    /// The add read's messages: its own parse, or the check's "measured add
    /// is empty" when an add was ordered and none was read.
    fn add_messages(self) -> Signal<Vec<Message>> {
        Signal::derive(move || match self.add_parsed.get() {
            Some(Err(e)) => vec![Message::error(&e)],
            Some(Ok(p)) => p.notices.iter().map(Message::notice).collect(),
            None => match self.report.get() {
                Some(Err(e)) if e.field() == Field::MeasuredAdd => vec![Message::error(&e)],
                _ => vec![],
            },
        })
    }

    /// The history's line for this eye: the order, and what was read with its verdict.
    fn summary(r: &LensCheckReport) -> EyeSummary {
        let outside: Vec<&str> = r.outside.iter().map(|i| i.words()).collect();
        let verdict = if outside.is_empty() {
            r.verdict.words().to_string()
        } else {
            format!("{} ({})", r.verdict.words(), outside.join(", "))
        };
        EyeSummary {
            eye: r.eye,
            input: r.ordered.to_string(),
            result: format!("read {}: {verdict}", r.measured),
            order: None,
        }
    }
}

/// The two lens types as radio buttons, with the message of an unknown type
/// from a link.
fn lens_type_choice(order: Order) -> impl IntoView {
    let radio = move |lens: LensType| {
        let value = lens.link_value();
        view! {
            <label class="choice">
                <input type="radio" name="lens-check-type" value=value
                    prop:checked=move || order.lens_type.get() == Ok(lens)
                    on:change=move |_| order.lens.set(value.to_string())/>
                {lens.words()}
            </label>
        }
    };
    let msg = move || order.lens_type.get().err().map(|e| e.to_string());
    view! {
        <div class="target" role="radiogroup" aria-labelledby="lens-check-type-label" aria-describedby="lens-check-type-msg">
            <span id="lens-check-type-label" class="group-label">"Lens type"</span>
            {LensType::ALL.map(radio).to_vec()}
        </div>
        <p id="lens-check-type-msg" class="field-msg">
            {move || msg().map(|m| view! { <span class="error">{m}</span> })}
        </p>
    }
}

/// One eye's entries: the lens ordered, the reading, the add read.
#[component]
fn CheckEntries(eye: CheckEye) -> impl IntoView {
    let (word, _) = eye_words(eye.eye);
    let lower = word.to_ascii_lowercase();
    view! {
        <EyeEntryForm entry=eye.ordered parsed=eye.ordered_parsed result=eye.glance
            id_prefix="lens-check-ordered" subject="lens ordered"/>
        <EyeEntryForm entry=eye.measured parsed=eye.measured_parsed result=eye.glance
            id_prefix="lens-check-read" subject="focimeter reading"/>
        <div class="field-short check-add-read">
            <TextField id=format!("lens-check-{lower}-add-read") label=format!("{word} add read")
                value=eye.add messages=eye.add_messages() step=StepKind::Add unit="D" placeholder="+2.00"/>
        </div>
    }
}

fn row_view(row: CheckRow) -> impl IntoView {
    let figures = match row.judged {
        Some(j) => view! {
            <span class="check-figures">
                "deviation "<span class="rx check-deviation">{j.deviation}</span>
                ", tolerance "<span class="rx check-tolerance">{j.tolerance}</span>
            </span>
            <strong class="check-verdict" class:outside=j.outside>{j.verdict}</strong>
        }
        .into_any(),
        None => view! { <span class="check-verdict none">"not checked"</span> }.into_any(),
    };
    view! {
        <div class="result-row check-row" data-item=row.key>
            <dt>{row.label}</dt>
            <dd>
                <span class="check-figures">
                    "read "<span class="rx check-measured">{row.measured}</span>
                    ", ordered "<span class="rx check-ordered">{row.ordered}</span>
                </span>
                {figures}
                <span class="detail check-why">{row.why}</span>
            </dd>
        </div>
    }
}

/// One eye's result: the overall verdict, then one row per item.
#[component]
fn CheckResult(eye: CheckEye) -> impl IntoView {
    let (word, letter) = eye_words(eye.eye);
    let shown = eye.card;
    let body = move || {
        let c = shown.get().result()?.clone();
        Some(view! {
            <div class="headline">
                <p class="result-main">
                    <span class="result-label">"Lens"</span>
                    <output class="rx big check-overall" class:outside=c.outside>{c.verdict}</output>
                </p>
                <p class="result-note check-summary">{c.summary}</p>
            </div>
            <p class="reason">{c.compared}</p>
            <dl class="result-list check-items">{c.rows.into_iter().map(row_view).collect_view()}</dl>
        })
    };
    let empty = move || {
        matches!(shown.get(), Shown::Empty).then(|| {
            let text = eye.missing.get().unwrap_or("Nothing entered for this eye.");
            view! { <p class="empty-note">{text}</p> }
        })
    };
    view! {
        <section class="eye-result check-result" aria-label=format!("{word} eye check")
            class:stale=move || matches!(shown.get(), Shown::Stale(..))>
            <h2>{format!("{word} eye ({letter})")}</h2>
            <ShownNote shown=shown/>
            {empty}
            {body}
        </section>
    }
}

/// The tolerance tables that apply to the chosen lens type.
#[component]
fn ToleranceTables(order: Order, details: Remembered) -> impl IntoView {
    let tables = move || {
        let lens = order.lens_type.get().unwrap_or_default();
        band_rows(lens)
            .into_iter()
            .map(|(subject, rows)| {
                let rows = rows
                    .into_iter()
                    .map(|(range, allows)| view! { <tr><th scope="row">{range}</th><td>{allows}</td></tr> })
                    .collect_view();
                view! {
                    <table class="figures check-table">
                        <caption>{subject.to_string()}</caption>
                        <tbody>{rows}</tbody>
                    </table>
                }
            })
            .collect_view()
    };
    let heading = move || {
        format!(
            "Tolerances for {} lenses",
            order.lens_type.get().unwrap_or_default().words()
        )
    };
    view! {
        <details class="settings check-tables" prop:open=move || details.is_open() on:toggle=on_toggle(details)>
            <summary>{heading}</summary>
            <p class="field-msg hint">{tolerances::SOURCE}". Bands are chosen by the ordered value; the axis band by the ordered cylinder."</p>
            {tables}
        </details>
    }
}

#[component]
pub fn LensCheckPanel() -> impl IntoView {
    let q = initial_query();
    let order = Order::new(&q);
    let right = CheckEye::new(Eye::Right, &q, order);
    let left = CheckEye::new(Eye::Left, &q, order);
    let details = Remembered::new("lensplane.details.lens-check");

    let current = Memo::new(move |_| {
        let t = |s: RwSignal<String>| s.get().trim().to_string();
        Query::default()
            .with("r", &right.ordered.link_text())
            .with("l", &left.ordered.link_text())
            .with("rm", &right.measured.link_text())
            .with("lm", &left.measured.link_text())
            .with("add", &t(order.add))
            .with("radd", &t(right.add))
            .with("ladd", &t(left.add))
            .with("type", &t(order.lens))
    });
    use_link_sync(Destination::LensCheck, current);

    let text = Signal::derive(move || {
        let mut lines = vec![format!("Lensplane · {}", Destination::LensCheck.title())];
        let before = lines.len();
        for e in [right, left] {
            e.card.with(|s| {
                if let Some(c) = s.fresh() {
                    lines.extend(c.lines.iter().cloned());
                }
            });
        }
        (lines.len() > before).then(|| {
            lines.push(PRISM_NOT_CHECKED.to_string());
            lines.join("\n")
        })
    });
    let request = Callback::new(move |label: String| {
        let eyes: Vec<EyeSummary> = [right, left]
            .into_iter()
            .filter_map(|e| {
                e.report
                    .with_untracked(|r| r.as_ref()?.as_ref().ok().map(CheckEye::summary))
            })
            .collect();
        (!eyes.is_empty()).then(|| SaveRequest {
            destination: Destination::LensCheck,
            query: current.get_untracked(),
            label,
            eyes,
            summary: String::new(),
        })
    });
    let announcement = move || {
        [right, left]
            .into_iter()
            .filter_map(|e| e.card.with(|s| s.fresh().map(|c| c.summary.clone())))
            .collect::<Vec<_>>()
            .join(". ")
    };
    let add_msgs = Signal::derive(move || match order.add_parsed.get() {
        Some(Ok(p)) => p.notices.iter().map(Message::notice).collect(),
        Some(Err(e)) => vec![Message::error(&e)],
        None => vec![],
    });

    view! {
        <h1>{Destination::LensCheck.title()}</h1>
        <p class="lede">"The received lens read on the focimeter, item by item against the tolerances for its order."</p>
        <p class="check-scope">
            "Tolerances of ANSI Z80.1-2015 as publicly summarised: confirm against the standard; local regulation or a lab agreement may set others. "
            {PRISM_NOT_CHECKED}
        </p>
        <div class="panel-grid">
            <div class="inputs">
                <fieldset class="check-order">
                    <legend>"Both eyes"</legend>
                    {lens_type_choice(order)}
                    <div class="field-short">
                        <TextField id="lens-check-add" label="Add ordered" value=order.add messages=add_msgs
                            step=StepKind::Add unit="D" placeholder="none"/>
                    </div>
                </fieldset>
                <CheckEntries eye=right/>
                <CheckEntries eye=left/>
            </div>
            <div class="results">
                <CheckResult eye=right/>
                <CheckResult eye=left/>
                <p class="visually-hidden" aria-live="polite">{announcement}</p>
                <SaveBar id_prefix="lens-check" text=text request=request/>
                <ToleranceTables order=order details=details/>
            </div>
        </div>
        <Cautions calculation=lensplane_core::Calculation::LensCheck/>
    }
}
