//! The image-size destination: what changing between spectacles and contact
//! lenses does to the size of the image, per principal meridian and between
//! the eyes. The core computes every figure (`image_size_report`,
//! `compare_image_sizes`); this module lays them out.

use super::common::{summary, Eyes};
use super::vertex::capitalised;
use crate::link::{Destination, Query};
use crate::prefs::Remembered;
use crate::sync::{initial_query, use_link_sync};
use crate::widgets::{
    eye_words, field_warnings, result_warnings, Card, Cautions, EyeCard, EyeEntryForm, Headline, Message, Row, SaveBar,
    TextField,
};
use lensplane_core::{
    compare_image_sizes, fmt_axis, fmt_factor, fmt_length, fmt_percent, fmt_percent_size, fmt_power, image_size_report,
    parse_front_surface, parse_index, parse_thickness_mm, parse_vertex_mm, Calculation, Error, Eye, Field,
    ImageSizeComparison, ImageSizeInput, ImageSizeReport, LensForm, MeridianDifference, MeridianSize, Outline, Parsed,
    ENTRANCE_PUPIL_MM,
};
use leptos::prelude::*;

/// The link keys of one eye's lens form: front surface, centre thickness, index.
const RIGHT_FORM_KEYS: [&str; 3] = ["rf", "rt", "rn"];
const LEFT_FORM_KEYS: [&str; 3] = ["lf", "lt", "ln"];

/// One eye's spectacle lens form, as typed (all three fields or none).
#[derive(Clone, Copy)]
struct FormEntry {
    texts: [RwSignal<String>; 3],
    keys: [&'static str; 3],
}

impl FormEntry {
    fn new(query: &Query, keys: [&'static str; 3]) -> FormEntry {
        FormEntry {
            texts: keys.map(|k| RwSignal::new(query.get(k).unwrap_or("").to_string())),
            keys,
        }
    }

    fn typed(&self) -> [String; 3] {
        self.texts.map(|t| t.get())
    }

    fn parsed(&self) -> Result<Option<Parsed<LensForm>>, Error> {
        let [f, t, n] = self.typed();
        LensForm::from_texts(&f, &t, &n)
    }

    fn add_to(&self, query: Query) -> Query {
        let [f, t, n] = self.typed();
        query
            .with(self.keys[0], f.trim())
            .with(self.keys[1], t.trim())
            .with(self.keys[2], n.trim())
    }
}

/// The message at one lens-form field (0 front surface, 1 centre thickness,
/// 2 index): each field is read by itself, so every mistake shows at once;
/// nothing when all three are empty (no lens form).
fn form_messages(texts: &[String; 3], which: usize) -> Vec<Message> {
    if texts.iter().all(|t| t.trim().is_empty()) {
        return vec![];
    }
    let text = &texts[which];
    let read = match which {
        0 => parse_front_surface(text),
        1 => parse_thickness_mm(text),
        _ => parse_index(text),
    };
    match read {
        Ok(p) => p.notices.iter().map(Message::notice).collect(),
        Err(e) => vec![Message::error(&e)],
    }
}

/// A figure per principal meridian: "+13.6 %" for a sphere,
/// "180: -3.0 %, 090: -4.4 %" with a cylinder.
fn per_meridian(r: &ImageSizeReport, of: impl Fn(&MeridianSize) -> f64) -> String {
    match r.meridians.as_slice() {
        [only] => fmt_percent(of(only)),
        all => all
            .iter()
            .map(|m| format!("{}: {}", fmt_axis(m.axis), fmt_percent(of(m))))
            .collect::<Vec<_>>()
            .join(", "),
    }
}

fn shape_words(r: &ImageSizeReport) -> String {
    match r.shape_note {
        Some(note) => capitalised(note),
        None => "Includes the shape factor of the lens form given".into(),
    }
}

fn meridian_rows(r: &ImageSizeReport, m: &MeridianSize) -> Vec<Row> {
    let vertex = fmt_length(r.vertex.mm());
    let within = if r.meridians.len() > 1 {
        format!(", {} meridian", fmt_axis(m.axis))
    } else {
        String::new()
    };
    let shape = match m.shape_factor {
        Some(sf) => Row::new(
            format!("Shape factor{within}"),
            fmt_factor(sf),
            "1 / (1 − (t/n)·F1) of the lens form given",
        ),
        None => Row::new(format!("Shape factor{within}"), "", r.shape_note.unwrap_or_default()),
    };
    vec![
        Row::new(
            format!("Spectacle lens{within}"),
            format!("{} D", fmt_power(m.spectacle_power)),
            format!("at {vertex} mm"),
        ),
        Row::new(
            format!("Contact lens{within}"),
            format!("{} D", fmt_power(m.contact_lens_power)),
            "the spectacle power compensated to the cornea",
        ),
        Row::new(
            format!("Power factor{within}"),
            fmt_factor(m.power_factor),
            format!(
                "1 / (1 − h·F), h = {vertex} mm vertex distance + {} mm to the entrance pupil",
                fmt_length(ENTRANCE_PUPIL_MM)
            ),
        ),
        shape,
        Row::new(
            format!("In spectacles{within}"),
            fmt_percent(m.spectacles),
            "image size against the uncorrected eye (+ means larger)",
        ),
        Row::new(
            format!("In contact lenses{within}"),
            fmt_percent(m.contact_lens),
            format!(
                "image size against the uncorrected eye; the contact lens acts {} mm in front of the entrance pupil",
                fmt_length(ENTRANCE_PUPIL_MM)
            ),
        ),
        Row::new(
            format!("Spectacles → contact lenses{within}"),
            fmt_percent(m.change),
            "the contact-lens image against the spectacle image (− means smaller)",
        ),
    ]
}

/// One eye's image sizes as a card: the change with contact lenses leads,
/// the spectacle figure beside it, every factor per meridian in the details.
pub fn image_size_card(r: &ImageSizeReport) -> Card {
    let shape = if r.shape_note.is_some() {
        "shape factor left out"
    } else {
        "with the shape factor"
    };
    Card {
        headline: Headline {
            label: "Change with contact lenses".into(),
            short: "Change",
            value: per_meridian(r, |m| m.change),
            note: shape_words(r),
            exact_label: "In spectacles, against the uncorrected eye".into(),
            exact: per_meridian(r, |m| m.spectacles),
            exact_short: "spectacles",
        },
        why: format!("{}.", capitalised(&r.summary)),
        alternatives: vec![],
        warnings: result_warnings(&r.warnings),
        details: r.meridians.iter().flat_map(|m| meridian_rows(r, m)).collect(),
        cross: None,
        copy: format!(
            "{} at {} mm: spectacles {}, contact lenses {}, change {} ({shape})",
            r.input,
            fmt_length(r.vertex.mm()),
            per_meridian(r, |m| m.spectacles),
            per_meridian(r, |m| m.contact_lens),
            per_meridian(r, |m| m.change),
        ),
    }
}

/// One outline as SVG attributes: `rx`, `ry` and its rotation.
#[derive(Clone, Debug, PartialEq)]
struct Ellipse {
    rx: String,
    ry: String,
    rotate: String,
}

/// Drawing units for the largest outline (the picture is 100 units wide).
const OUTLINE_RADIUS: f64 = 44.0;

impl Ellipse {
    fn of(o: &Outline) -> Ellipse {
        let (rx, ry) = o.svg_radii(OUTLINE_RADIUS);
        Ellipse {
            rx,
            ry,
            rotate: o.svg_rotate(),
        }
    }
}

/// One eye's picture: the spectacle and contact-lens outlines to scale, and
/// what they show in words.
#[derive(Clone, Debug, PartialEq)]
struct Picture {
    spectacles: Ellipse,
    contact_lens: Ellipse,
    label: String,
}

fn picture(eye: Eye, r: &ImageSizeReport, spectacles: &Outline, contact_lens: &Outline) -> Picture {
    Picture {
        spectacles: Ellipse::of(spectacles),
        contact_lens: Ellipse::of(contact_lens),
        label: format!(
            "{} eye image size against the uncorrected eye: in spectacles {} (solid outline), in contact lenses {} (dashed outline)",
            eye_words(eye).0,
            per_meridian(r, |m| m.spectacles),
            per_meridian(r, |m| m.contact_lens),
        ),
    }
}

/// This eye's outlines: from the comparison of both eyes (so the two
/// pictures share one scale), or from the eye against itself when it is
/// the only one entered.
fn outlines_of(eye: Eye, own: &ImageSizeReport, both: Option<&ImageSizeComparison>) -> (Outline, Outline) {
    let alone;
    let c = match both {
        Some(c) => c,
        None => {
            alone = compare_image_sizes(own, own);
            &alone
        }
    };
    match eye {
        Eye::Right => (c.spectacle_outlines.right, c.contact_lens_outlines.right),
        Eye::Left => (c.spectacle_outlines.left, c.contact_lens_outlines.left),
    }
}

#[component]
fn OutlineFigure(picture: Memo<Option<Picture>>) -> impl IntoView {
    move || {
        picture.get().map(|p| {
            view! {
                <figure class="image-outlines">
                    <svg viewBox="0 0 100 100" role="img" aria-label=p.label>
                        <g transform="translate(50 50)">
                            <ellipse class="outline spectacles" cx="0" cy="0" rx=p.spectacles.rx
                                ry=p.spectacles.ry transform=p.spectacles.rotate/>
                            <ellipse class="outline contact-lens" cx="0" cy="0" rx=p.contact_lens.rx
                                ry=p.contact_lens.ry transform=p.contact_lens.rotate/>
                        </g>
                    </svg>
                    <figcaption aria-hidden="true">
                        <span class="key spectacles">"solid: spectacles"</span>
                        " · "
                        <span class="key contact-lens">"dashed: contact lenses"</span>
                    </figcaption>
                </figure>
            }
        })
    }
}

/// "5.9 %, R larger" / "0.0 %".
fn difference_words(fraction: f64, larger: Option<Eye>) -> String {
    match larger {
        Some(eye) => format!("{}, {} larger", fmt_percent_size(fraction), eye_words(eye).1),
        None => fmt_percent_size(fraction),
    }
}

/// The table rows between the eyes: meridian, spectacles, contact lenses.
fn comparison_rows(c: &ImageSizeComparison) -> Vec<[String; 3]> {
    [&c.horizontal, &c.vertical]
        .into_iter()
        .map(|d: &MeridianDifference| {
            [
                fmt_axis(d.axis),
                difference_words(d.spectacles, d.larger_in_spectacles),
                difference_words(d.contact_lenses, d.larger_in_contact_lenses),
            ]
        })
        .collect()
}

/// The comparison in the copied text.
fn comparison_text(c: &ImageSizeComparison) -> String {
    let rows = comparison_rows(c)
        .into_iter()
        .map(|[m, s, cl]| format!("{m}: spectacles {s}; contact lenses {cl}"))
        .collect::<Vec<_>>()
        .join(" | ");
    format!("Between the eyes: {rows}\n{}\n{}", c.reading, c.knapp)
}

#[component]
fn Comparison(comparison: Memo<Option<ImageSizeComparison>>) -> impl IntoView {
    let rows = Memo::new(move |_| comparison.with(|c| c.as_ref().map(comparison_rows).unwrap_or_default()));
    view! {
        <section class="image-compare" aria-labelledby="image-size-compare-heading">
            <h2 id="image-size-compare-heading">"Between the eyes"</h2>
            <Show when=move || comparison.with(Option::is_some)
                fallback=|| view! { <p class="empty-note">"Enter a complete prescription for both eyes to compare their image sizes."</p> }>
                <table class="figures compare-table">
                    <caption>"Difference in image size, per meridian"</caption>
                    <thead>
                        <tr><th scope="col">"Meridian"</th><th scope="col">"Spectacles"</th><th scope="col">"Contact lenses"</th></tr>
                    </thead>
                    <tbody>
                        <For each=move || rows.get() key=|row| row.clone() let:row>
                            <tr><th scope="row">{row[0].clone()}</th><td>{row[1].clone()}</td><td>{row[2].clone()}</td></tr>
                        </For>
                    </tbody>
                </table>
                <p class="reading">{move || comparison.with(|c| c.as_ref().map(|c| c.reading.clone()))}</p>
                <p class="knapp">{move || comparison.with(|c| c.as_ref().map(|c| c.knapp.clone()))}</p>
            </Show>
        </section>
    }
}

/// One eye's lens-form fields, behind their own disclosure (open when the
/// link brings any of them).
#[component]
fn LensFormFields(eye: Eye, form: FormEntry) -> impl IntoView {
    let (word, _) = eye_words(eye);
    let lower = word.to_ascii_lowercase();
    let open = form.texts.iter().any(|t| !t.get_untracked().trim().is_empty());
    let msgs = move |which: usize| Signal::derive(move || form_messages(&form.typed(), which));
    let id = |what: &str| format!("image-size-{lower}-{what}");
    view! {
        <details class="lens-form" open=open>
            <summary>"Spectacle lens form (optional)"</summary>
            <p class="field-msg hint">"All three, or none: they add the shape factor."</p>
            <TextField id=id("front") label="Front surface" name=format!("{word} front surface")
                value=form.texts[0] messages=msgs(0) unit="D" placeholder="+6.00"/>
            <TextField id=id("thickness") label="Centre thickness" name=format!("{word} centre thickness")
                value=form.texts[1] messages=msgs(1) unit="mm" placeholder="2.0"/>
            <TextField id=id("index") label="Refractive index" name=format!("{word} refractive index")
                value=form.texts[2] messages=msgs(2) placeholder="1.50"/>
        </details>
    }
}

#[component]
pub fn ImageSizePanel() -> impl IntoView {
    let q = initial_query();
    let from = RwSignal::new(q.get("from").unwrap_or("12").to_string());
    let forms = [FormEntry::new(&q, RIGHT_FORM_KEYS), FormEntry::new(&q, LEFT_FORM_KEYS)];
    let form_of = move |eye: Eye| match eye {
        Eye::Right => forms[0],
        Eye::Left => forms[1],
    };
    let details = Remembered::new("lensplane.details.image-size");

    let eyes = Eyes::new(
        &q,
        move |eye, rx| {
            let vertex = parse_vertex_mm(&from.get())?.value;
            let form = form_of(eye).parsed()?.map(|p| p.value);
            image_size_report(&ImageSizeInput { rx, vertex, form })
        },
        image_size_card,
    );

    let fresh = move |eye: Eye| {
        let s = match eye {
            Eye::Right => eyes.right,
            Eye::Left => eyes.left,
        };
        s.report.with(|r| r.as_ref().and_then(|r| r.as_ref().ok().cloned()))
    };
    let comparison = Memo::new(move |_| Some(compare_image_sizes(&fresh(Eye::Right)?, &fresh(Eye::Left)?)));
    let picture_of = move |eye: Eye| {
        let s = match eye {
            Eye::Right => eyes.right,
            Eye::Left => eyes.left,
        };
        Memo::new(
            move |previous: Option<&Option<Picture>>| match s.report.with(|r| r.as_ref().map(Result::is_ok)) {
                None => None,
                // An input with an error: the last picture stays, as the card's figures do.
                Some(false) => previous.cloned().flatten(),
                Some(true) => {
                    let own = fresh(eye)?;
                    let (spectacles, contact_lens) = comparison.with(|c| outlines_of(eye, &own, c.as_ref()));
                    Some(picture(eye, &own, &spectacles, &contact_lens))
                }
            },
        )
    };
    let pictures = [picture_of(Eye::Right), picture_of(Eye::Left)];

    let shared = eyes.shared_warnings(|r| &r.warnings);
    let from_msgs = Signal::derive(move || {
        let mut m: Vec<Message> = match parse_vertex_mm(&from.get()) {
            Ok(p) => p.notices.iter().map(Message::notice).collect(),
            Err(e) => vec![Message::error(&e)],
        };
        // A contact-lens distance (0 mm) reads, but the report refuses it.
        for s in [eyes.right, eyes.left] {
            s.report.with(|r| {
                if let Some(Err(e)) = r {
                    let msg = Message::error(e);
                    if e.field() == Field::VertexFrom && !m.contains(&msg) {
                        m.push(msg);
                    }
                }
            });
        }
        shared.with(|w| m.extend(field_warnings(w, Field::VertexFrom)));
        m
    });

    let current = Memo::new(move |_| {
        let q = eyes.add_to(Query::default()).with("from", from.get().trim());
        forms[1].add_to(forms[0].add_to(q))
    });
    use_link_sync(Destination::ImageSize, current);

    let text = Signal::derive(move || {
        let text = eyes.text(&format!(
            "Lensplane · {} · spectacles at {} mm against contact lenses",
            Destination::ImageSize.title(),
            from.get().trim()
        ))?;
        Some(match comparison.with(|c| c.as_ref().map(comparison_text)) {
            Some(between) => match text.rsplit_once('\n') {
                Some((body, last)) => format!("{body}\n{between}\n{last}"),
                None => format!("{text}\n{between}"),
            },
            None => text,
        })
    });
    let request = Callback::new(move |label: String| {
        eyes.save_request(Destination::ImageSize, current.get_untracked(), label, |eye, r| {
            summary(
                eye,
                &r.input,
                format!("contact lenses {}", per_meridian(r, |m| m.change)),
                None,
            )
        })
    });
    let figure = move |i: usize| ViewFn::from(move || view! { <OutlineFigure picture=pictures[i]/> });

    view! {
        <h1>{Destination::ImageSize.title()}</h1>
        <p class="lede">"What changing between spectacles and contact lenses does to the size of the image, per principal meridian and between the eyes."</p>
        <div class="panel-grid">
            <div class="inputs">
                <fieldset class="planes">
                    <legend>"Spectacles"</legend>
                    <TextField id="image-size-from" label="Vertex distance of the spectacles" value=from
                        messages=from_msgs unit="mm" placeholder="12"/>
                </fieldset>
                <EyeEntryForm entry=eyes.right.entry parsed=eyes.right.parsed result=eyes.right.card id_prefix="image-size">
                    <LensFormFields eye=Eye::Right form=forms[0]/>
                </EyeEntryForm>
                <EyeEntryForm entry=eyes.left.entry parsed=eyes.left.parsed result=eyes.left.card id_prefix="image-size">
                    <LensFormFields eye=Eye::Left form=forms[1]/>
                </EyeEntryForm>
            </div>
            <div class="results">
                <EyeCard eye=Eye::Right shown=eyes.right.card details=details figure=figure(0)/>
                <EyeCard eye=Eye::Left shown=eyes.left.card details=details figure=figure(1)/>
                <p class="visually-hidden" aria-live="polite">{move || eyes.announcement()}</p>
                <Comparison comparison=comparison/>
                <SaveBar id_prefix="image-size" text=text request=request/>
            </div>
        </div>
        <Cautions calculation=Calculation::ImageSize/>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::{Rx, VertexDistance};

    fn report(rx: Rx, form: Option<LensForm>) -> ImageSizeReport {
        image_size_report(&ImageSizeInput {
            rx,
            vertex: VertexDistance::SPECTACLES,
            form,
        })
        .unwrap()
    }

    #[test]
    fn the_card_leads_with_the_change_and_says_the_shape_factor_is_left_out() {
        // Notes §13 [derived]: +8.00 at 12 mm → spectacles +13.64 %, contact lens +2.73 %, change −9.60 %.
        let c = image_size_card(&report(Rx::sphere_only(8.0).unwrap(), None));
        assert_eq!(c.headline.value, "-9.6 %");
        assert_eq!(c.headline.exact, "+13.6 %");
        assert_eq!(c.headline.note, "Shape factor left out: lens form not given");
        assert!(c.why.starts_with("In spectacles images are 13.6 % larger"), "{}", c.why);
        assert_eq!(
            c.copy,
            "+8.00 DS at 12 mm: spectacles +13.6 %, contact lenses +2.7 %, change -9.6 % (shape factor left out)"
        );
        let power = c.details.iter().find(|r| r.label == "Power factor").unwrap();
        assert_eq!(power.value, "+13.6 %");
        assert_eq!(c.headline.glance(), "Change -9.6 % · spectacles +13.6 %");
    }

    #[test]
    fn a_cylinder_gives_a_figure_per_meridian_and_a_lens_form_its_shape_factor() {
        // −1.00 −4.00 ×180: meridians −1.00 (180) and −5.00 (090); notes §13 [derived]: −1.48 % / −6.98 % in spectacles.
        let form = LensForm::new(6.0, 2.0, 1.5).unwrap();
        let c = image_size_card(&report(Rx::new(-1.0, -4.0, 180).unwrap(), Some(form)));
        assert!(c.headline.value.starts_with("180: "), "{}", c.headline.value);
        assert!(c.headline.value.contains(", 090: "), "{}", c.headline.value);
        assert_eq!(c.headline.note, "Includes the shape factor of the lens form given");
        // Shape factor [derived]: +6.00 front, 2 mm, n 1.5 → 1 / (1 − 0.008) = 1.0081 → +0.8 %.
        let shape = c
            .details
            .iter()
            .find(|r| r.label == "Shape factor, 180 meridian")
            .unwrap();
        assert_eq!(shape.value, "+0.8 %");
    }

    #[test]
    fn the_picture_says_both_sizes_and_the_eyes_share_one_scale() {
        // Notes §13 [derived]: R −1.00 / L −5.00 at 12 mm; contact lenses −0.30 % / −1.40 %.
        let (r, l) = (
            report(Rx::sphere_only(-1.0).unwrap(), None),
            report(Rx::sphere_only(-5.0).unwrap(), None),
        );
        let c = compare_image_sizes(&r, &l);
        let (s, cl) = outlines_of(Eye::Left, &l, Some(&c));
        let p = picture(Eye::Left, &l, &s, &cl);
        assert_eq!(
            p.label,
            "Left eye image size against the uncorrected eye: in spectacles -7.0 % (solid outline), in contact lenses -1.4 % (dashed outline)"
        );
        // The right contact-lens image is the largest of the four: drawn at the full radius.
        let (_, right_cl) = outlines_of(Eye::Right, &r, Some(&c));
        assert_eq!(Ellipse::of(&right_cl).rx, "44.00");
        assert_eq!(
            comparison_rows(&c)[0],
            ["180".to_string(), "5.9 %, R larger".into(), "1.1 %, R larger".into()]
        );
    }

    #[test]
    fn lens_form_fields_are_all_or_none_and_each_says_its_own_mistake() {
        let texts = |a: &str, b: &str, c: &str| [a.to_string(), b.to_string(), c.to_string()];
        assert!(form_messages(&texts("", " ", ""), 0).is_empty());
        assert_eq!(
            form_messages(&texts("6", "2", "16"), 2),
            vec![Message::Error(
                "refractive index 16 is outside 1.40–2.00: did you mean 1.6?".into()
            )]
        );
        assert_eq!(
            form_messages(&texts("6", "", "1.5"), 1),
            vec![Message::Error("centre thickness is empty".into())]
        );
        assert!(form_messages(&texts("6", "", "1.5"), 0).is_empty());
    }
}
