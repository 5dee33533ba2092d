//! The over-refraction destination: the lens worn by each eye combined with
//! what is found over it (crossed cylinders by power matrices, a turned toric
//! contact lens allowed for), carried to the plane of the lens to order.
//!
//! Per eye two entries (the lens worn; the over-refraction found over it),
//! and for a contact lens its rotation as an amount with a direction in
//! words. The planes are shared: where the worn lens sits (`worn`), where
//! the over-refraction was found (`at`), and the lens to order (`to`, the
//! worn lens's plane unless chosen).

use super::common::{EyeResults, Eyes};
use super::vertex::{alternatives, capitalised, exact_label, target_words};
use crate::history::EyeSummary;
use crate::link::{Destination, Query};
use crate::prefs::Remembered;
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{
    eye_words, field_warnings, result_warnings, Card, Cautions, EyeEntry, EyeEntryForm, Headline, Message, Row,
    TextField,
};
use lensplane_core::{
    fmt_length, fmt_power, over_refraction_report, parse_rotation_amount, parse_vertex_mm, ContactLensKind, Error, Eye,
    Field, OrderSettings, OverRefractionInput, OverRefractionReport, Parsed, PowerVector, Rotation, RotationDirection,
    RotationHandling, Rx, VertexDistance, Warning,
};
use leptos::prelude::*;

type Result<T> = std::result::Result<T, Error>;

/// One eye's inputs besides the lens worn: the over-refraction found over
/// it, and the rotation of a toric contact lens.
#[derive(Clone, Copy)]
struct Found {
    over: EyeEntry,
    over_parsed: Memo<Option<Result<Parsed<Rx>>>>,
    /// The rotation amount as typed (whole degrees, no sign).
    amount: RwSignal<String>,
    /// True: to the examiner's right (anticlockwise); false: to the left.
    to_right: RwSignal<bool>,
    unstable: RwSignal<bool>,
    rotation: Memo<Result<Parsed<Rotation>>>,
}

/// The link text of a rotation: the amount as typed, with `-` in front for
/// the examiner's right (the link's sign); an amount that itself starts
/// with a sign gets `+` in front for the left, so it reopens as typed.
fn rotation_link(amount: &str, to_right: bool) -> String {
    let a = amount.trim();
    if a.is_empty() {
        String::new()
    } else if to_right {
        format!("-{a}")
    } else if a.starts_with(['+', '-', '−', '–', '—']) {
        format!("+{a}")
    } else {
        a.to_string()
    }
}

/// The amount and direction a rotation link value holds (the inverse of
/// [`rotation_link`]): a leading minus means the examiner's right.
fn rotation_from_link(text: &str) -> (String, bool) {
    let t = text.trim();
    for minus in ['-', '−', '–', '—'] {
        if let Some(rest) = t.strip_prefix(minus) {
            return (rest.trim().to_string(), true);
        }
    }
    match t.strip_prefix('+') {
        Some(rest) => (rest.trim().to_string(), false),
        None => (t.to_string(), false),
    }
}

fn flag(text: Option<&str>) -> bool {
    text.is_some_and(|t| matches!(t.trim().to_ascii_lowercase().as_str(), "1" | "yes" | "true" | "on"))
}

impl Found {
    fn new(eye: Eye, q: &Query) -> Found {
        let (or_key, rot_key, unstable_key) = match eye {
            Eye::Right => ("ror", "rrot", "runstable"),
            Eye::Left => ("lor", "lrot", "lunstable"),
        };
        let over = EyeEntry::new(eye, q.get(or_key));
        let (amount, to_right) = rotation_from_link(q.get(rot_key).unwrap_or(""));
        let amount = RwSignal::new(amount);
        let to_right = RwSignal::new(to_right);
        let rotation = Memo::new(move |_| {
            let direction = if to_right.get() {
                RotationDirection::ExaminersRight
            } else {
                RotationDirection::ExaminersLeft
            };
            parse_rotation_amount(&amount.get(), direction)
        });
        Found {
            over,
            over_parsed: Memo::new(move |_| over.parsed()),
            amount,
            to_right,
            unstable: RwSignal::new(flag(q.get(unstable_key))),
            rotation,
        }
    }

    /// The over-refraction: left empty, plano (nothing found over the lens).
    fn over_refraction(&self) -> Result<Rx> {
        match self.over_parsed.get() {
            None => Ok(Rx::sphere_only(0.0)?),
            Some(p) => Ok(p?.value),
        }
    }
}

/// A plane given as "contact lens" or a spectacle vertex distance as typed.
#[derive(Clone, Copy)]
struct Plane {
    cornea: RwSignal<bool>,
    /// The spectacle distance as typed (kept while the cornea is chosen).
    frame: RwSignal<String>,
    field: Field,
}

impl Plane {
    fn new(text: Option<&str>, field: Field) -> Plane {
        let text = text.unwrap_or("").trim();
        let cornea = text.is_empty() || parse_vertex_mm(text).is_ok_and(|p| p.value.is_cornea());
        Plane {
            cornea: RwSignal::new(cornea),
            frame: RwSignal::new(if cornea { String::new() } else { text.to_string() }),
            field,
        }
    }

    fn parsed(&self) -> Result<Parsed<VertexDistance>> {
        if self.cornea.get() {
            Ok(Parsed {
                value: VertexDistance::CORNEA,
                notices: vec![],
            })
        } else {
            parse_vertex_mm(&self.frame.get()).map_err(|e| e.for_field(self.field))
        }
    }

    fn link(&self) -> String {
        if self.cornea.get() {
            "0".into()
        } else {
            self.frame.get().trim().to_string()
        }
    }

    /// Choose spectacles; an empty distance starts at the usual 12 mm.
    fn choose_spectacles(&self) {
        if self.frame.get_untracked().trim().is_empty() {
            self.frame.set("12".into());
        }
        self.cornea.set(false);
    }
}

/// The three planes and the kind of contact lens worn, as typed.
#[derive(Clone, Copy)]
struct Setup {
    worn: Plane,
    /// The vertex distance of the trial lens or refractor, as typed.
    at: RwSignal<String>,
    /// True while the lens to order goes where the worn lens sits (no `to` in the link).
    to_same: RwSignal<bool>,
    to: Plane,
    /// The `lens` link value as typed ("soft", "rigid").
    lens: RwSignal<String>,
}

struct Planes3 {
    worn: VertexDistance,
    at: VertexDistance,
    to: VertexDistance,
}

impl Setup {
    fn new(q: &Query) -> Setup {
        Setup {
            worn: Plane::new(q.get("worn"), Field::VertexFrom),
            at: RwSignal::new(q.get("at").unwrap_or("12").to_string()),
            to_same: RwSignal::new(q.get("to").is_none_or(|t| t.trim().is_empty())),
            to: Plane::new(q.get("to"), Field::VertexTo),
            lens: RwSignal::new(q.get("lens").unwrap_or("").to_string()),
        }
    }

    fn at_parsed(&self) -> Result<Parsed<VertexDistance>> {
        parse_vertex_mm(&self.at.get()).map_err(|e| e.for_field(Field::OverRefractionVertex))
    }

    fn to_parsed(&self) -> Result<Parsed<VertexDistance>> {
        if self.to_same.get() {
            self.worn.parsed().map_err(|e| e.for_field(Field::VertexTo))
        } else {
            self.to.parsed()
        }
    }

    fn lens_kind(&self) -> Result<ContactLensKind> {
        ContactLensKind::from_link(&self.lens.get())
    }

    fn planes(&self) -> Result<Planes3> {
        Ok(Planes3 {
            worn: self.worn.parsed()?.value,
            at: self.at_parsed()?.value,
            to: self.to_parsed()?.value,
        })
    }

    fn add_to(&self, q: Query) -> Query {
        q.with("worn", &self.worn.link())
            .with("at", self.at.get().trim())
            .with(
                "to",
                &if self.to_same.get() {
                    String::new()
                } else {
                    self.to.link()
                },
            )
            .with(
                "lens",
                if self.worn.cornea.get() {
                    self.lens.get()
                } else {
                    String::new()
                }
                .trim(),
            )
    }

    fn target_words(&self) -> String {
        match self.to_parsed() {
            Ok(p) => target_words(p.value),
            Err(_) => "the lens to order".into(),
        }
    }
}

/// "a contact lens" or "spectacles at 12 mm".
fn worn_words(d: VertexDistance) -> String {
    if d.is_cornea() {
        "contact lens".into()
    } else {
        format!("spectacles at {} mm", fmt_length(d.mm()))
    }
}

/// "the cornea" or "12 mm".
fn at_words(d: VertexDistance) -> String {
    if d.is_cornea() {
        "the cornea".into()
    } else {
        format!("{} mm", fmt_length(d.mm()))
    }
}

/// "M -8.38, J0 +0.12, J45 -0.22" (dioptres).
fn vector_words(v: &PowerVector) -> String {
    format!("M {}, J0 {}, J45 {}", fmt_power(v.m), fmt_power(v.j0), fmt_power(v.j45))
}

/// The over-refraction result of one eye as a card.
fn over_refraction_card(r: &OverRefractionReport) -> Card {
    let rec = &r.recommendation;
    let p = &r.planes;
    let v = &r.vector_check;
    let mut details = vec![
        Row::new(
            "What changed from the worn lens (+ means more plus)",
            "",
            r.change.words.clone(),
        ),
        Row::new(
            "Worn lens moved to the target",
            r.change.worn_at_target.to_string(),
            format!("{} as {}, equal at {}", r.worn, worn_words(p.worn), at_words(p.target)),
        ),
    ];
    if r.rotation_handling != RotationHandling::NotGiven {
        details.push(Row::new(
            "Worn lens as it sits",
            r.worn_on_eye.to_string(),
            format!("{}; {}", r.rotation.words(), r.rotation_handling.words()),
        ));
    }
    details.extend([
        Row::new(
            "Over-refraction carried to the worn lens",
            r.over_refraction_at_worn.to_string(),
            format!("{} found at {}", r.over_refraction, at_words(p.over_refraction)),
        ),
        Row::new(
            "Sum at the worn lens (power matrices)",
            r.combined_at_worn.to_string(),
            format!("at {}", at_words(p.worn)),
        ),
        Row::new("At the cornea (ocular refraction)", r.ocular_refraction.to_string(), ""),
        Row::new(
            "Needed at the target, as it will sit",
            r.needed_at_target.to_string(),
            format!("at {}", at_words(p.target)),
        ),
        Row::new(
            "The same exact lens, plus-cylinder form",
            r.exact_plus_cyl.to_string(),
            "",
        ),
        Row::new(
            "Power-vector cross-check at the worn lens",
            vector_words(&v.sum),
            format!(
                "worn lens {} plus over-refraction {}; the matrix sum gives {}: {}",
                vector_words(&v.worn),
                vector_words(&v.over_refraction),
                vector_words(&v.matrices),
                if v.agrees() {
                    "they agree"
                } else {
                    "they differ: do not rely on this result"
                }
            ),
        ),
        Row::new("Recommended lens leaves", "", rec.order.leaves.words()),
    ]);
    Card {
        headline: Headline {
            label: "Order".into(),
            short: "Order",
            value: rec.order.lens.to_string(),
            note: capitalised(rec.order.kind.words()),
            exact_label: exact_label(p.target),
            exact: r.exact.to_string(),
            exact_short: "exact",
        },
        why: format!("{}; {}.", capitalised(&r.reason), rec.why),
        alternatives: alternatives(rec, |rx| rx.to_string()),
        warnings: result_warnings(&r.warnings),
        details,
        cross: Some((r.change.worn_at_target.meridians(), r.exact.meridians())),
        copy: format!(
            "{} ({}, from {} worn as {} with {} over it at {})",
            rec.order.lens,
            target_words(p.target),
            r.worn,
            worn_words(p.worn),
            r.over_refraction,
            at_words(p.over_refraction)
        ),
    }
}

fn messages_of<T>(result: Result<Parsed<T>>) -> Vec<Message> {
    match result {
        Ok(p) => p.notices.iter().map(Message::notice).collect(),
        Err(e) => vec![Message::error(&e)],
    }
}

/// The rotation inputs of one eye's contact lens: amount, direction in
/// words, and "unstable".
#[component]
fn RotationInputs(found: Found) -> impl IntoView {
    let (word, _) = eye_words(found.over.eye);
    let lower = word.to_ascii_lowercase();
    let messages = Signal::derive(move || messages_of(found.rotation.get()));
    let group = format!("over-refraction-{lower}-turn");
    let label_id = format!("{group}-label");
    let labelled_by = label_id.clone();
    let radio = move |right: bool, text: &'static str| {
        view! {
            <label class="choice">
                <input type="radio" name=group.clone() prop:checked=move || found.to_right.get() == right
                    on:change=move |_| found.to_right.set(right)/>
                {text}
            </label>
        }
    };
    view! {
        <div class="rotation">
            <div class="field-short">
                <TextField id=format!("over-refraction-{lower}-rotation") label="Toric lens rotation"
                    name=format!("{word} rotation") value=found.amount messages=messages unit="°"
                    inputmode="numeric" placeholder="0"/>
            </div>
            <div class="target turn" role="radiogroup" aria-labelledby=labelled_by>
                <span id=label_id class="group-label">{format!("{word} lens turned")}</span>
                {radio(false, "to the examiner's left (clockwise)")}
                {radio(true, "to the examiner's right (anticlockwise)")}
            </div>
            <label class="choice">
                <input type="checkbox" prop:checked=move || found.unstable.get()
                    on:change=move |ev| found.unstable.set(event_target_checked(&ev))/>
                {format!("{word} lens described as unstable")}
            </label>
        </div>
    }
}

/// Both lenses of one eye and, for a contact lens, its rotation.
#[component]
fn EyeLenses(
    eye: crate::panels::common::EyeState<OverRefractionReport>,
    found: Found,
    worn_cornea: RwSignal<bool>,
) -> impl IntoView {
    view! {
        <EyeEntryForm entry=eye.entry parsed=eye.parsed result=eye.card id_prefix="over-refraction-worn"
            subject="lens worn">
            <Show when=move || worn_cornea.get()>
                <RotationInputs found=found/>
            </Show>
        </EyeEntryForm>
        <EyeEntryForm entry=found.over parsed=found.over_parsed result=eye.card id_prefix="over-refraction-found"
            subject="over-refraction">
            <p class="field-msg hint" hidden=move || found.over_parsed.with(Option::is_some)>
                "Left empty, the over-refraction is taken as plano."
            </p>
        </EyeEntryForm>
    }
}

#[component]
pub fn OverRefractionPanel() -> impl IntoView {
    let q = initial_query();
    let setup = Setup::new(&q);
    let right = Found::new(Eye::Right, &q);
    let left = Found::new(Eye::Left, &q);
    let found = move |eye: Eye| match eye {
        Eye::Right => right,
        Eye::Left => left,
    };
    let details = Remembered::new("lensplane.details.over-refraction");
    let eyes = Eyes::new(
        &q,
        move |eye, worn| {
            let f = found(eye);
            let planes = setup.planes()?;
            let rigid = planes.worn.is_cornea() && setup.lens_kind()?.is_rigid();
            over_refraction_report(&OverRefractionInput {
                worn,
                worn_at: planes.worn,
                over_refraction: f.over_refraction()?,
                over_refraction_at: planes.at,
                target: planes.to,
                rotation: f.rotation.get()?.value,
                unstable: f.unstable.get(),
                rigid,
                settings: OrderSettings::default(),
            })
        },
        over_refraction_card,
    );

    // What the reports say about the shared inputs: warnings (an unusual
    // vertex distance) and errors (the over-refraction behind the worn lens,
    // a rigid lens), once each, at the input they belong to.
    let shared = eyes.shared_warnings(|r| &r.warnings);
    let report_errors = Memo::new(move |_| {
        let mut out: Vec<Error> = vec![];
        for s in [eyes.right, eyes.left] {
            s.report.with(|r| {
                if let Some(Err(e)) = r {
                    if !out.iter().any(|o| o.to_string() == e.to_string()) {
                        out.push(e.clone());
                    }
                }
            });
        }
        out
    });
    let at_field = move |field: Field, mut m: Vec<Message>, shared: &[Warning]| {
        if !m.iter().any(Message::is_error) {
            report_errors.with(|errs| m.extend(errs.iter().filter(|e| e.field() == field).map(Message::error)));
        }
        m.extend(field_warnings(shared, field));
        m
    };
    let worn_msgs =
        Signal::derive(move || shared.with(|w| at_field(Field::VertexFrom, messages_of(setup.worn.parsed()), w)));
    let at_msgs = Signal::derive(move || {
        shared.with(|w| at_field(Field::OverRefractionVertex, messages_of(setup.at_parsed()), w))
    });
    let to_msgs = Signal::derive(move || shared.with(|w| at_field(Field::VertexTo, messages_of(setup.to.parsed()), w)));
    let lens_msgs = Signal::derive(move || {
        let m = match setup.lens_kind() {
            Ok(_) => vec![],
            Err(e) => vec![Message::error(&e)],
        };
        shared.with(|w| at_field(Field::LensType, m, w))
    });

    let current = Memo::new(move |_| {
        let mut q = setup.add_to(eyes.add_to(Query::default()));
        for (eye, (or, rot, unstable)) in [
            (Eye::Right, ("ror", "rrot", "runstable")),
            (Eye::Left, ("lor", "lrot", "lunstable")),
        ] {
            let f = found(eye);
            q = q
                .with(or, &f.over.link_text())
                .with(rot, &rotation_link(&f.amount.get(), f.to_right.get()))
                .with(unstable, if f.unstable.get() { "1" } else { "" });
        }
        q
    });
    use_link_sync(Destination::OverRefraction, current);

    let text = Signal::derive(move || {
        eyes.text(&format!(
            "Lensplane · {} · {}",
            Destination::OverRefraction.title(),
            setup.target_words()
        ))
    });
    let request = Callback::new(move |label: String| {
        eyes.save_request(Destination::OverRefraction, current.get_untracked(), label, |eye, r| {
            EyeSummary {
                eye,
                input: format!("{} with {} over it", r.worn, r.over_refraction),
                result: format!("exact {}", r.exact),
                order: Some(r.recommendation.order.lens.to_string()),
            }
        })
    });

    let lens_group = "over-refraction-lens";
    let lens_radio = move |kind: ContactLensKind| {
        view! {
            <label class="choice">
                <input type="radio" name=lens_group
                    prop:checked=move || setup.lens_kind().ok() == Some(kind)
                    on:change=move |_| setup.lens.set(kind.link_value().into())/>
                {kind.words()}
            </label>
        }
    };
    let to_choice = move |value: u8, text: &'static str| {
        let checked = move || match value {
            0 => setup.to_same.get(),
            1 => !setup.to_same.get() && setup.to.cornea.get(),
            _ => !setup.to_same.get() && !setup.to.cornea.get(),
        };
        view! {
            <label class="choice">
                <input type="radio" name="over-refraction-to" prop:checked=checked
                    on:change=move |_| match value {
                        0 => setup.to_same.set(true),
                        1 => { setup.to.cornea.set(true); setup.to_same.set(false); }
                        _ => { setup.to.choose_spectacles(); setup.to_same.set(false); }
                    }/>
                {text}
            </label>
        }
    };
    let lens_note = move || {
        lens_msgs
            .get()
            .into_iter()
            .map(|m| view! { <span class=m.class()>{m.text().to_string()}</span> })
            .collect_view()
    };

    view! {
        <h1>{Destination::OverRefraction.title()}</h1>
        <p class="lede">"A new lens from the one worn and what is found over it: crossed cylinders combined as they act, a turned toric lens allowed for."</p>
        <div class="panel-grid">
            <div class="inputs">
                <fieldset class="planes">
                    <legend>"Planes"</legend>
                    <div class="target row" role="radiogroup" aria-labelledby="over-refraction-worn-label">
                        <span id="over-refraction-worn-label" class="group-label">"Lens worn"</span>
                        <label class="choice">
                            <input type="radio" name="over-refraction-worn" prop:checked=move || setup.worn.cornea.get()
                                on:change=move |_| setup.worn.cornea.set(true)/>
                            "Contact lens"
                        </label>
                        <label class="choice">
                            <input type="radio" name="over-refraction-worn" prop:checked=move || !setup.worn.cornea.get()
                                on:change=move |_| setup.worn.choose_spectacles()/>
                            "Spectacles"
                        </label>
                    </div>
                    <Show when=move || !setup.worn.cornea.get()>
                        <TextField id="over-refraction-worn-at" label="Vertex distance of the spectacles worn"
                            value=setup.worn.frame messages=worn_msgs unit="mm" placeholder="12"/>
                    </Show>
                    <Show when=move || setup.worn.cornea.get()>
                        <div class="target row" role="radiogroup" aria-labelledby="over-refraction-lens-label"
                            aria-describedby="over-refraction-lens-msg">
                            <span id="over-refraction-lens-label" class="group-label">"Contact lens worn"</span>
                            {lens_radio(ContactLensKind::Soft)}
                            {lens_radio(ContactLensKind::Rigid)}
                        </div>
                        <p id="over-refraction-lens-msg" class="field-msg" aria-live="polite">{lens_note}</p>
                    </Show>
                    <TextField id="over-refraction-at" label="Vertex distance of the over-refraction"
                        value=setup.at messages=at_msgs unit="mm" placeholder="12"/>
                    <div class="target row" role="radiogroup" aria-labelledby="over-refraction-to-label">
                        <span id="over-refraction-to-label" class="group-label">"Lens to order"</span>
                        {to_choice(0, "Same as worn")}
                        {to_choice(1, "Contact lens")}
                        {to_choice(2, "Spectacles")}
                    </div>
                    <Show when=move || !setup.to_same.get() && !setup.to.cornea.get()>
                        <TextField id="over-refraction-to" label="Vertex distance of the spectacles to order"
                            value=setup.to.frame messages=to_msgs unit="mm" placeholder="12"/>
                    </Show>
                </fieldset>
                <EyeLenses eye=eyes.right found=right worn_cornea=setup.worn.cornea/>
                <EyeLenses eye=eyes.left found=left worn_cornea=setup.worn.cornea/>
            </div>
            <div class="results">
                <EyeResults eyes=eyes id_prefix="over-refraction" details=details text=text request=request/>
            </div>
        </div>
        <Cautions calculation=lensplane_core::Calculation::OverRefraction/>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn mm(x: f64) -> VertexDistance {
        VertexDistance::from_mm(x).unwrap()
    }

    fn card(worn: Rx, worn_at: f64, or: Rx, at: f64, to: f64, clockwise: i16) -> Card {
        let r = over_refraction_report(&OverRefractionInput {
            worn,
            worn_at: mm(worn_at),
            over_refraction: or,
            over_refraction_at: mm(at),
            target: mm(to),
            rotation: Rotation::from_clockwise(clockwise).unwrap(),
            unstable: false,
            rigid: false,
            settings: OrderSettings::default(),
        })
        .unwrap();
        over_refraction_card(&r)
    }

    #[test]
    fn o4_card_orders_one_lens_with_the_exact_value_beside_it() {
        // O4 of shared/optics-notes.md §12 [derived]: -7.00 -1.50 ×170 spectacles at 12 mm, over-refraction
        // -0.50 -0.25 ×080 at 12 mm, to the cornea → -7.0906 -1.0322 ×170; stock toric (common practice, no
        // source) -7.00 -1.25 ×170.
        let c = card(
            Rx::new(-7.0, -1.5, 170).unwrap(),
            12.0,
            Rx::new(-0.5, -0.25, 80).unwrap(),
            12.0,
            0.0,
            0,
        );
        assert_eq!(c.headline.exact, "-7.09 -1.03 ×170");
        assert_eq!(c.headline.value, "-7.00 -1.25 ×170");
        assert_eq!(
            c.copy,
            "-7.00 -1.25 ×170 (contact lens, from -7.00 -1.50 ×170 worn as spectacles at 12 mm with -0.50 -0.25 ×080 over it at 12 mm)"
        );
        let sum = c
            .details
            .iter()
            .find(|r| r.label.starts_with("Sum at the worn lens"))
            .unwrap();
        assert_eq!(sum.value, "-7.75 -1.25 ×170");
        let check = c.details.iter().find(|r| r.label.starts_with("Power-vector")).unwrap();
        assert!(check.detail.ends_with("they agree"), "{}", check.detail);
    }

    #[test]
    fn o3_a_turned_lens_with_plano_over_it_is_ordered_as_worn() {
        // O3 [common practice]: -2.00 -1.00 ×180 turned 10° to the examiner's left, plano over it.
        let c = card(
            Rx::new(-2.0, -1.0, 180).unwrap(),
            0.0,
            Rx::sphere_only(0.0).unwrap(),
            12.0,
            0.0,
            10,
        );
        assert_eq!(c.headline.exact, "-2.00 -1.00 ×180");
        let sits = c.details.iter().find(|r| r.label == "Worn lens as it sits").unwrap();
        assert_eq!(sits.value, "-2.00 -1.00 ×170");
        assert!(c.why.contains("left add"), "{}", c.why);
    }

    #[test]
    fn a_rotation_link_keeps_the_amount_as_typed_and_the_direction() {
        for (amount, right) in [("10", false), ("10°", true), ("-10", false), ("−5", true), ("", false)] {
            let link = rotation_link(amount, right);
            assert_eq!(
                rotation_from_link(&link),
                (amount.to_string(), right && !amount.is_empty()),
                "{link}"
            );
        }
        assert_eq!(rotation_link("10", true), "-10");
        assert_eq!(rotation_link("-10", false), "+-10");
    }
}
