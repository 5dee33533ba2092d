//! The near destination: what the reading distance asks of the eye through
//! the spectacles, with the add, and with the lens moved to the cornea (or
//! another vertex distance); the add that gives the same near effect there;
//! and, with an age, Hofstetter's amplitudes and tentative adds. Every
//! figure comes from the core's `near_report`.

use super::common::{summary, EyeEntries, EyeResults, Eyes};
use super::vertex::{plane_words, target_words};
use crate::link::{Destination, Query};
use crate::prefs::Remembered;
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{
    field_warnings, result_warnings, Card, Cautions, Headline, Message, PlaneInputs, Planes, Row, TextField,
};
use lensplane_core::{
    fmt_axis, fmt_dioptres, fmt_length, fmt_number, fmt_power, near_report, parse_add, parse_age,
    parse_reading_distance, parse_reading_inches, Add, Age, Error, Field, Measured, NearFigures, NearInput, NearReport,
    Notice, OrderSettings, Parsed, ReadingDistance, StepKind, TentativeAdd,
};
use leptos::prelude::*;

/// The near inputs both eyes share, as typed.
#[derive(Clone, Copy)]
struct NearFields {
    add: RwSignal<String>,
    reading: RwSignal<String>,
    inches: RwSignal<bool>,
    from_eye: RwSignal<bool>,
    age: RwSignal<String>,
}

/// What the near panel needs besides the prescription and the planes.
struct NearValues {
    add: Add,
    reading: ReadingDistance,
    measured: Measured,
    age: Option<Age>,
}

fn optional<T>(text: String, parse: fn(&str) -> Result<Parsed<T>, Error>) -> Option<Result<Parsed<T>, Error>> {
    (!text.trim().is_empty()).then(|| parse(&text))
}

/// A field's messages: its notices, or its error (`None`: left empty).
fn messages(notices: Option<Result<Vec<Notice>, Error>>) -> Vec<Message> {
    match notices {
        Some(Ok(n)) => n.iter().map(Message::notice).collect(),
        Some(Err(e)) => vec![Message::error(&e)],
        None => vec![],
    }
}

impl NearFields {
    fn new(q: &Query) -> NearFields {
        let s = || RwSignal::new(String::new());
        let fields = NearFields {
            add: s(),
            reading: s(),
            inches: RwSignal::new(false),
            from_eye: RwSignal::new(false),
            age: s(),
        };
        fields.load(q);
        fields
    }

    /// From link values; a missing reading distance is 40 cm (16 in).
    fn load(&self, q: &Query) {
        let inches = q.get("unit").is_some_and(|u| u.trim().eq_ignore_ascii_case("in"));
        self.inches.set(inches);
        self.from_eye
            .set(q.get("measured").is_some_and(|m| m.trim().eq_ignore_ascii_case("eye")));
        self.add.set(q.get("add").unwrap_or("").to_string());
        self.reading
            .set(q.get("reading").unwrap_or(if inches { "16" } else { "40" }).to_string());
        self.age.set(q.get("age").unwrap_or("").to_string());
    }

    fn add_to(&self, q: Query) -> Query {
        q.with("add", self.add.get().trim())
            .with("reading", self.reading.get().trim())
            .with("unit", if self.inches.get() { "in" } else { "" })
            .with("measured", if self.from_eye.get() { "eye" } else { "lens" })
            .with("age", self.age.get().trim())
    }

    fn add_parsed(&self) -> Option<Result<Parsed<Add>, Error>> {
        optional(self.add.get(), parse_add)
    }

    fn reading_parsed(&self) -> Option<Result<Parsed<ReadingDistance>, Error>> {
        Some(if self.inches.get() {
            parse_reading_inches(&self.reading.get())
        } else {
            parse_reading_distance(&self.reading.get())
        })
    }

    fn age_parsed(&self) -> Option<Result<Parsed<Age>, Error>> {
        optional(self.age.get(), parse_age)
    }

    /// All of them, or the first error. An empty add is no add; an empty age is no age.
    fn values(&self) -> Result<NearValues, Error> {
        let reading = self
            .reading_parsed()
            .unwrap_or_else(|| parse_reading_distance(""))?
            .value;
        Ok(NearValues {
            add: self.add_parsed().transpose()?.map_or(Add::NONE, |p| p.value),
            reading,
            measured: if self.from_eye.get() {
                Measured::FromEye
            } else {
                Measured::FromLens
            },
            age: self.age_parsed().transpose()?.map(|p| p.value),
        })
    }
}

/// "40 cm" or "16 in (40.64 cm)".
fn reading_words(r: ReadingDistance, inches: bool) -> String {
    if inches {
        format!("{} in ({} cm)", fmt_length(r.inches()), fmt_length(r.cm()))
    } else {
        format!("{} cm", fmt_length(r.cm()))
    }
}

/// One line of per-meridian (or summary) figures; without an add, only the accommodation.
fn figures_line(f: &NearFigures, at_target: &str, no_add: bool) -> String {
    if no_add {
        return format!(
            "accommodation through the spectacles {}; {at_target} {}",
            fmt_dioptres(f.accommodation_spectacles),
            fmt_dioptres(f.accommodation_target)
        );
    }
    format!(
        "accommodation through the spectacles {} without the add, {} with it; {at_target} {}; relief at the eye {}; equivalent add {}",
        fmt_dioptres(f.accommodation_spectacles),
        fmt_dioptres(f.accommodation_spectacles_with_add),
        fmt_dioptres(f.accommodation_target),
        fmt_dioptres(f.relief_at_eye),
        fmt_power(f.add_at_target)
    )
}

fn tentative_row(label: &str, t: &TentativeAdd, entered: f64) -> Row {
    Row::new(
        label,
        fmt_power(t.half_reserve),
        format!(
            "half in reserve {} (orderable {}); one-third in reserve {} (orderable {}); add entered {}",
            fmt_power(t.half_reserve),
            fmt_power(t.half_reserve_rounded),
            fmt_power(t.third_reserve),
            fmt_power(t.third_reserve_rounded),
            fmt_power(entered)
        ),
    )
}

/// The near result of one eye as a card: the add (at the cornea, the
/// equivalent add in quarter steps) with its exact value; without an add,
/// the accommodation the reading distance asks in the new correction.
pub fn near_card(input: &NearInput, r: &NearReport, inches: bool) -> Card {
    let target = plane_words(input.target);
    let in_target = if input.target.is_cornea() {
        "in contact lenses".to_string()
    } else {
        format!("with the lens at {target}")
    };
    let e = &r.equivalent;
    let from = if input.measured == Measured::FromEye {
        "the eye"
    } else {
        "the spectacle plane"
    };
    let add = fmt_power(r.add);
    let reading = reading_words(input.reading, inches);
    // No add entered (or plano): what the reading distance asks, and tentative adds with an age.
    let no_add = input.add == Add::NONE;
    let mut details = vec![];
    if r.meridians.len() > 1 {
        details.push(Row::new(
            "Spherical equivalent",
            fmt_power(e.distance_power),
            "the figures below are for it; each principal meridian follows",
        ));
    }
    details.extend([
        Row::new(
            format!("Demand at {reading}"),
            fmt_dioptres(r.demand),
            format!(
                "measured from {from}; spectacle accommodation (at the lens plane) {}",
                fmt_dioptres(r.spectacle_accommodation)
            ),
        ),
        Row::new(
            "Accommodation through the spectacles, no add",
            fmt_dioptres(e.accommodation_spectacles),
            "ocular accommodation, at the corneal vertex",
        ),
    ]);
    if !no_add {
        details.push(Row::new(
            format!("Accommodation through the spectacles with the add {add}"),
            fmt_dioptres(e.accommodation_spectacles_with_add),
            "",
        ));
    }
    details.push(Row::new(
        format!("Accommodation {in_target}, no add"),
        fmt_dioptres(e.accommodation_target),
        "",
    ));
    if !no_add {
        add_rows(&mut details, r, &add, &target);
    }
    if r.meridians.len() > 1 {
        for m in &r.meridians {
            details.push(Row::new(
                format!("Meridian {}°", m.meridian.map(fmt_axis).unwrap_or_default()),
                fmt_power(m.distance_power),
                figures_line(m, &in_target, no_add),
            ));
        }
    }
    if let Some(a) = &r.amplitude {
        let amp = a.amplitude;
        details.push(Row::new(
            format!("Amplitude at age {} (Hofstetter)", a.age.years()),
            format!(
                "{} / {} / {} D",
                fmt_number(amp.minimum),
                fmt_number(amp.average),
                fmt_number(amp.maximum)
            ),
            "minimum / average / maximum: a population estimate",
        ));
        details.push(tentative_row(
            "Tentative add, minimum amplitude",
            &a.tentative_from_minimum,
            r.add,
        ));
        details.push(tentative_row(
            "Tentative add, average amplitude",
            &a.tentative_from_average,
            r.add,
        ));
    }
    let spectacle_from = format!("at {}", plane_words(input.spectacle_vertex));
    let (headline, copy) = if no_add {
        let value = fmt_dioptres(e.accommodation_target);
        let spectacles = fmt_dioptres(e.accommodation_spectacles);
        (
            Headline {
                label: "Accommodation".into(),
                short: "Accommodation",
                value: value.clone(),
                note: format!("What {reading} asks {in_target}, at the cornea"),
                exact_label: "Through the spectacles".into(),
                exact: spectacles.clone(),
                exact_short: "spectacles",
            },
            format!(
                "accommodation {value} {in_target}, {spectacles} through the spectacles (from {} {spectacle_from}, reading at {reading})",
                r.input
            ),
        )
    } else {
        let rounded = fmt_power(r.add_at_target_rounded);
        let note = if input.target.is_cornea() {
            "Not a multifocal lens's add label".to_string()
        } else {
            format!("Equivalent add for the lens at {target}, in quarter steps")
        };
        (
            Headline {
                label: "Equivalent add".into(),
                short: "Add",
                value: rounded.clone(),
                note,
                exact_label: "exact".into(),
                exact: fmt_power(r.add_at_target),
                exact_short: "exact",
            },
            format!(
                "add {rounded} ({}, from {} with add {add} {spectacle_from}, reading at {reading})",
                target_words(input.target),
                r.input
            ),
        )
    };
    Card {
        headline,
        why: format!("{}.", super::vertex::capitalised(&r.summary)),
        alternatives: vec![],
        warnings: result_warnings(&r.warnings),
        details,
        cross: None,
        copy,
    }
}

/// The rows about the add: relief, the equivalent add and the near prescription.
fn add_rows(rows: &mut Vec<Row>, r: &NearReport, add: &str, target: &str) {
    let e = &r.equivalent;
    rows.extend([
        Row::new("Relief the spectacle add gives at the eye", fmt_dioptres(e.relief_at_eye), ""),
        Row::new(
            "Equivalent add in quarter steps",
            fmt_power(r.add_at_target_rounded),
            format!(
                "exact {}; change from the spectacle add {add} (+ means more add): {}; with it the eye accommodates {} at this distance",
                fmt_power(r.add_at_target),
                fmt_power(r.add_change),
                fmt_dioptres(e.accommodation_target_with_rounded_add)
            ),
        ),
        Row::new(
            format!("Near prescription at {target}, exact"),
            r.near_at_target.to_string(),
            format!("distance prescription there {}", r.distance_at_target),
        ),
        Row::new(
            "Near prescription in steps",
            r.near_at_target_ordered.to_string(),
            format!(
                "distance {} on the lens steps, with the add {}",
                r.distance_at_target_ordered,
                fmt_power(r.add_at_target_rounded)
            ),
        ),
    ]);
}

/// Two radio buttons for a yes/no choice: `first` when `signal` is false,
/// `second` when it is true; `inline` keeps them in the row of a field.
fn choice_pair(
    group: &'static str,
    legend: &'static str,
    first: &'static str,
    second: &'static str,
    signal: RwSignal<bool>,
    inline: bool,
) -> impl IntoView {
    let radio = move |value: bool, text: &'static str| {
        view! {
            <label class="choice">
                <input type="radio" name=group prop:checked=move || signal.get() == value on:change=move |_| signal.set(value)/>
                {text}
            </label>
        }
    };
    let label_id = format!("{group}-label");
    let labelled_by = label_id.clone();
    view! {
        <div class="target" class:inline=inline class:row=!inline role="radiogroup" aria-labelledby=labelled_by>
            <span id=label_id class="group-label" class:visually-hidden=inline>{legend}</span>
            {radio(false, first)}
            {radio(true, second)}
        </div>
    }
}

#[component]
pub fn NearPanel() -> impl IntoView {
    let q = initial_query();
    let planes = Planes::new(q.get("from"), q.get("to"));
    let near = NearFields::new(&q);
    let details = Remembered::new("lensplane.details.near");
    let eyes = Eyes::new(
        &q,
        move |_, rx| {
            let (spectacle_vertex, target) = planes.both()?;
            let v = near.values()?;
            let input = NearInput {
                rx,
                add: v.add,
                spectacle_vertex,
                reading: v.reading,
                measured: v.measured,
                target,
                age: v.age,
                settings: OrderSettings::default(),
            };
            let report = near_report(&input)?;
            Ok((input, report))
        },
        move |(input, report)| near_card(input, report, near.inches.get()),
    );

    let shared = eyes.shared_warnings(|(_, r)| &r.warnings);
    let current = Memo::new(move |_| {
        near.add_to(
            eyes.add_to(Query::default())
                .with("from", &planes.link_from())
                .with("to", &planes.link_to()),
        )
    });
    use_link_sync(Destination::Near, current);

    let text = Signal::derive(move || {
        eyes.text(&format!(
            "Lensplane · {} · equivalent add {}",
            Destination::Near.title(),
            planes.target_words()
        ))
    });
    let request = Callback::new(move |label: String| {
        eyes.save_request(
            Destination::Near,
            current.get_untracked(),
            label,
            |eye, (input, report)| {
                let target = plane_words(input.target);
                let (result, order) = if input.add == Add::NONE {
                    let accommodation = fmt_dioptres(report.equivalent.accommodation_target);
                    (
                        format!("no add; accommodation {accommodation} at {target}"),
                        report.distance_at_target_ordered.to_string(),
                    )
                } else {
                    (
                        format!(
                            "add {} at {target} (near {})",
                            fmt_power(report.add_at_target),
                            report.near_at_target
                        ),
                        format!(
                            "{} add {}",
                            report.distance_at_target_ordered,
                            fmt_power(report.add_at_target_rounded)
                        ),
                    )
                };
                summary(eye, &input.rx, result, Some(order))
            },
        )
    });
    let add_msgs = Signal::derive(move || messages(near.add_parsed().map(|r| r.map(|p| p.notices))));
    // What the add and age say together is shown once, under both fields.
    let shared_near = Memo::new(move |_| {
        shared.with(|w| {
            let mut m = field_warnings(w, Field::Add);
            m.extend(field_warnings(w, Field::Age));
            m
        })
    });
    let reading_msgs = Signal::derive(move || messages(near.reading_parsed().map(|r| r.map(|p| p.notices))));
    let age_msgs = Signal::derive(move || messages(near.age_parsed().map(|r| r.map(|p| p.notices))));

    view! {
        <h1>{Destination::Near.title()}</h1>
        <p class="lede">"The add that keeps the same near effect with contact lenses or another frame."</p>
        <div class="panel-grid">
            <div class="inputs">
                <PlaneInputs planes=planes id_prefix="near" from_label="Vertex distance of the spectacles worn" shared=shared/>
                <fieldset class="near-task">
                    <legend>"Near task"</legend>
                    <TextField id="near-add" label="Spectacle add" value=near.add messages=add_msgs
                        step=StepKind::Add unit="D" placeholder="+2.00"/>
                    <TextField id="near-reading" label="Reading distance" value=near.reading messages=reading_msgs
                        placeholder="40">
                        {choice_pair("near-unit", "Reading distance in", "cm", "in", near.inches, true)}
                    </TextField>
                    {choice_pair("near-measured", "Measured from", "Spectacles", "Eye", near.from_eye, false)}
                    <div class="field-short">
                        <TextField id="near-age" label="Age" placeholder="optional" value=near.age messages=age_msgs
                            inputmode="numeric" unit="years" />
                    </div>
                    <ul class="warnings" hidden=move || shared_near.with(Vec::is_empty)>
                        {move || shared_near.get().into_iter().map(|m| view! { <li>{m.text().to_string()}</li> }).collect_view()}
                    </ul>
                </fieldset>
                <EyeEntries eyes=eyes id_prefix="near"/>
            </div>
            <div class="results">
                <EyeResults eyes=eyes id_prefix="near" details=details text=text request=request/>
            </div>
        </div>
        <Cautions calculation=lensplane_core::Calculation::Near/>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::{Rx, VertexDistance};

    fn input(rx: Rx, add: f64, age: Option<u8>) -> NearInput {
        NearInput {
            rx,
            add: Add::new(add).unwrap(),
            spectacle_vertex: VertexDistance::SPECTACLES,
            reading: ReadingDistance::from_cm(40.0).unwrap(),
            measured: Measured::FromLens,
            target: VertexDistance::CORNEA,
            age: age.map(|a| Age::new(a).unwrap()),
            settings: OrderSettings::default(),
        }
    }

    fn card(rx: Rx, add: f64, age: Option<u8>) -> Card {
        let i = input(rx, add, age);
        near_card(&i, &near_report(&i).unwrap(), false)
    }

    fn value<'a>(card: &'a Card, label: &str) -> &'a str {
        &card
            .details
            .iter()
            .find(|r| r.label == label)
            .unwrap_or_else(|| panic!("no row {label}: {:?}", card.details))
            .value
    }

    #[test]
    fn without_an_add_the_card_leads_with_accommodation_and_leaves_out_the_add_rows() {
        // N1 [textbook] of shared/optics-notes.md: −6.00 @ 12 mm, 40 cm from the lens: 2.4272 D in contact lenses,
        // 2.1162 D through the spectacles.
        let c = card(Rx::sphere_only(-6.0).unwrap(), 0.0, Some(50));
        assert_eq!(
            (
                c.headline.label.as_str(),
                c.headline.value.as_str(),
                c.headline.exact.as_str()
            ),
            ("Accommodation", "2.43 D", "2.12 D")
        );
        assert!(
            c.why.starts_with("A myope needs more accommodation in contact lenses"),
            "{}",
            c.why
        );
        for gone in [
            "Equivalent add in quarter steps",
            "Relief the spectacle add gives at the eye",
            "Near prescription in steps",
        ] {
            assert!(
                c.details.iter().all(|r| r.label != gone),
                "{gone} should not be shown without an add"
            );
        }
        assert!(
            c.details.iter().any(|r| r.label == "Tentative add, average amplitude"),
            "an age still gives tentative adds"
        );
        let with = card(Rx::sphere_only(-6.0).unwrap(), 2.5, None);
        assert_eq!(with.headline.label, "Equivalent add");
        assert!(with
            .details
            .iter()
            .any(|r| r.label == "Equivalent add in quarter steps"));
    }

    #[test]
    fn n1_and_n3_figures_are_on_the_card() {
        // N1 [textbook] and N3 [derived] of shared/optics-notes.md: −6.00 @ 12 mm, 40 cm from the lens,
        // add +2.50: through the spectacles 2.1162, contact lens 2.4272, relief 2.1162, contact-lens add 2.4272.
        let c = card(Rx::sphere_only(-6.0).unwrap(), 2.5, None);
        // At the cornea: the equivalent add in quarter steps, not an "orderable add".
        assert_eq!(
            (c.headline.value.as_str(), c.headline.exact.as_str()),
            ("+2.50", "+2.43")
        );
        assert_eq!(c.headline.note, "Not a multifocal lens's add label");
        assert!(c.details.iter().all(|r| !r.label.contains("Orderable")));
        assert_eq!(value(&c, "Demand at 40 cm"), "2.50 D");
        assert_eq!(value(&c, "Accommodation through the spectacles, no add"), "2.12 D");
        assert_eq!(value(&c, "Accommodation in contact lenses, no add"), "2.43 D");
        assert_eq!(value(&c, "Relief the spectacle add gives at the eye"), "2.12 D");
        assert_eq!(value(&c, "Equivalent add in quarter steps"), "+2.50");
        assert!(
            c.why
                .starts_with("A myope needs more accommodation in contact lenses: 2.43 D against 2.12 D in spectacles"),
            "{}",
            c.why
        );
        assert_eq!(
            c.copy,
            "add +2.50 (contact lens, from -6.00 DS with add +2.50 at 12 mm, reading at 40 cm)"
        );
    }

    #[test]
    fn n4_is_not_the_shortcut() {
        // N4 [derived]: +6.00, add +2.50 → 2.4272 at the cornea; the shortcut V(F + A) − V(F) gives 3.0000.
        let c = card(Rx::sphere_only(6.0).unwrap(), 2.5, None);
        assert_eq!(c.headline.exact, "+2.43");
        assert_eq!(value(&c, "Relief the spectacle add gives at the eye"), "2.81 D");
    }

    #[test]
    fn amplitude_rows_with_an_age() {
        // H1 [published] age 50: 2.50 / 3.50 / 5.00; A1 [textbook]: half reserve 1.25, one-third 0.8333 → 0.75.
        let c = card(Rx::sphere_only(0.0).unwrap(), 2.0, Some(50));
        assert_eq!(value(&c, "Amplitude at age 50 (Hofstetter)"), "2.50 / 3.50 / 5.00 D");
        let t = c
            .details
            .iter()
            .find(|r| r.label == "Tentative add, minimum amplitude")
            .unwrap();
        assert_eq!(t.value, "+1.25");
        assert!(
            t.detail.contains("one-third in reserve +0.83 (orderable +0.75)"),
            "{}",
            t.detail
        );
        assert!(card(Rx::sphere_only(0.0).unwrap(), 2.0, None)
            .details
            .iter()
            .all(|r| !r.label.starts_with("Amplitude")));
    }

    #[test]
    fn meridian_rows_only_when_there_is_a_cylinder() {
        let sph = card(Rx::sphere_only(-6.0).unwrap(), 2.5, None);
        assert!(!sph
            .details
            .iter()
            .any(|r| r.label.starts_with("Meridian") || r.label == "Spherical equivalent"));
        let cyl = card(Rx::new(-6.0, -2.0, 180).unwrap(), 2.5, None);
        assert_eq!(value(&cyl, "Spherical equivalent"), "-7.00");
        // The −6.00 meridian carries N1's figures [textbook].
        let m = cyl.details.iter().find(|r| r.label == "Meridian 180°").unwrap();
        assert_eq!(m.value, "-6.00");
        assert!(
            m.detail
                .starts_with("accommodation through the spectacles 2.12 D without the add"),
            "{}",
            m.detail
        );
        assert_eq!(value(&cyl, "Meridian 090°"), "-8.00");
    }

    #[test]
    fn standing_cautions_are_not_repeated_in_every_card() {
        let c = card(Rx::sphere_only(-6.0).unwrap(), 2.5, Some(50));
        assert!(
            c.warnings
                .iter()
                .all(|w| !w.contains("not optical adds") && !w.contains("population estimate")),
            "{:?}",
            c.warnings
        );
    }

    #[test]
    fn reading_in_inches_is_described_in_both_units() {
        // [definition] 1 in = 2.54 cm.
        assert_eq!(
            reading_words(ReadingDistance::from_inches(16.0).unwrap(), true),
            "16 in (40.64 cm)"
        );
        assert_eq!(
            reading_words(ReadingDistance::from_cm(33.33).unwrap(), false),
            "33.33 cm"
        );
    }
}
