//! One eye's prescription: three fields (sphere, cylinder, axis) or one line
//! typed or pasted. Whichever the user edited last is the source; the other
//! follows when it can without losing anything typed.

use super::{Card, Message, Shown, TextField};
use crate::prefs::{on_toggle, FieldsShown, Remembered};
use lensplane_core::{fmt_power, fmt_sphere, parse_rx, Error, Eye, Field, Parsed, Rx, StepKind};
use leptos::prelude::*;

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Source {
    Fields,
    Line,
}

/// The typed state of one eye.
#[derive(Clone, Copy)]
pub struct EyeEntry {
    pub eye: Eye,
    sphere: RwSignal<String>,
    cylinder: RwSignal<String>,
    axis: RwSignal<String>,
    line: RwSignal<String>,
    source: RwSignal<Source>,
}

/// "Right"/"Left" and "R"/"L".
pub fn eye_words(eye: Eye) -> (&'static str, &'static str) {
    match eye {
        Eye::Right => ("Right", "R"),
        Eye::Left => ("Left", "L"),
    }
}

/// The three fields' texts joined as one prescription line, as typed.
fn compose(sphere: &str, cylinder: &str, axis: &str) -> String {
    let (s, c, a) = (sphere.trim(), cylinder.trim(), axis.trim());
    if c.is_empty() && a.is_empty() {
        return s.to_string();
    }
    let a = if a.starts_with(|ch: char| ch.is_ascii_digit()) {
        format!("x{a}")
    } else {
        a.to_string()
    };
    // A missing sphere stays visibly missing; the cylinder must never be
    // read as the sphere.
    let s = if s.is_empty() { "?" } else { s };
    [s, c, a.as_str()]
        .iter()
        .filter(|t| !t.is_empty())
        .copied()
        .collect::<Vec<_>>()
        .join(" ")
}

impl EyeEntry {
    pub fn new(eye: Eye, text: Option<&str>) -> EyeEntry {
        let entry = EyeEntry {
            eye,
            sphere: RwSignal::new(String::new()),
            cylinder: RwSignal::new(String::new()),
            axis: RwSignal::new(String::new()),
            line: RwSignal::new(String::new()),
            source: RwSignal::new(Source::Line),
        };
        entry.load(text);
        entry
    }

    /// Loads a prescription from a link: the line holds it exactly; the
    /// fields show what it was read as.
    pub fn load(&self, text: Option<&str>) {
        let text = text.unwrap_or("").to_string();
        self.source.set(Source::Line);
        self.line.set(text.clone());
        self.fill_fields_from_line(&text);
    }

    fn fill_fields_from_line(&self, text: &str) {
        if text.trim().is_empty() {
            self.sphere.set(String::new());
            self.cylinder.set(String::new());
            self.axis.set(String::new());
        } else if let Ok(p) = parse_rx(text) {
            let rx = p.value;
            self.sphere.set(fmt_sphere(rx.sphere()));
            if rx.is_spherical() {
                self.cylinder.set(String::new());
                self.axis.set(String::new());
            } else {
                self.cylinder.set(fmt_power(rx.cylinder()));
                self.axis.set(rx.axis().to_string());
            }
        }
    }

    fn fields_text(&self) -> String {
        compose(&self.sphere.get(), &self.cylinder.get(), &self.axis.get())
    }

    fn on_field_edit(&self) {
        self.source.set(Source::Fields);
        // The line follows the fields unless it holds text that did not parse
        // (that text is kept, not overwritten).
        let line = self.line.get_untracked();
        if line.trim().is_empty() || parse_rx(&line).is_ok() {
            self.line.set(compose(
                &self.sphere.get_untracked(),
                &self.cylinder.get_untracked(),
                &self.axis.get_untracked(),
            ));
        }
    }

    fn on_line_edit(&self) {
        self.source.set(Source::Line);
        let line = self.line.get_untracked();
        self.fill_fields_from_line(&line);
    }

    /// The text the link carries for this eye (empty: no prescription).
    pub fn link_text(&self) -> String {
        match self.source.get() {
            Source::Line => self.line.get().trim().to_string(),
            Source::Fields => self.fields_text(),
        }
    }

    /// The prescription as read, `None` when the eye is left empty.
    pub fn parsed(&self) -> Option<Result<Parsed<Rx>, Error>> {
        match self.source.get() {
            Source::Line => {
                let line = self.line.get();
                (!line.trim().is_empty()).then(|| parse_rx(&line))
            }
            Source::Fields => {
                let (s, c, a) = (self.sphere.get(), self.cylinder.get(), self.axis.get());
                (!(s.trim().is_empty() && c.trim().is_empty() && a.trim().is_empty()))
                    .then(|| Rx::from_fields(&s, &c, &a))
            }
        }
    }

    pub fn clear(&self) {
        self.load(None);
    }
}

/// Which of the entry's inputs a message from the core belongs to.
#[derive(Clone, Copy, PartialEq)]
enum Slot {
    Line,
    Sphere,
    Cylinder,
    Axis,
}

fn slot_for(field: Field, source: Source) -> Slot {
    match (source, field) {
        (Source::Fields, Field::Sphere) => Slot::Sphere,
        (Source::Fields, Field::Cylinder) => Slot::Cylinder,
        (Source::Fields, Field::Axis) => Slot::Axis,
        (Source::Fields, _) => Slot::Sphere,
        (Source::Line, _) => Slot::Line,
    }
}

/// The compact result the entry shows while it is being typed into (sticky
/// on a phone, so the answer stays in view above the keyboard).
/// Its place is kept when there is nothing to show, so the field never moves
/// under the thumb when the first result appears.
fn glance_text(shown: &Shown<Card>) -> (String, &'static str) {
    match shown {
        Shown::Fresh(c) => (c.headline.glance(), "glance"),
        Shown::Stale(c, _) => (format!("Last complete entry: {}", c.headline.glance()), "glance stale"),
        Shown::Failed(_) => ("No result: see the message at the field".into(), "glance empty"),
        Shown::Empty => ("No prescription entered".into(), "glance empty"),
    }
}

/// The entry form for one eye: the one-line prescription (the fast path),
/// the eye's answer at a glance, and the separate fields one tap away.
#[component]
pub fn EyeEntryForm(
    entry: EyeEntry,
    /// The parse result the panel computes from `entry` (shared, so it parses once).
    parsed: Memo<Option<Result<Parsed<Rx>, Error>>>,
    /// This eye's result, shown compactly beside the entry.
    result: Memo<Shown<Card>>,
    /// Prefix for element ids (the panel's name).
    id_prefix: &'static str,
    /// More inputs of this eye, shown under its prescription (the image
    /// size's lens form); none on most panels.
    #[prop(optional)]
    children: Option<Children>,
    /// What this entry holds when a panel has two per eye ("lens ordered",
    /// "focimeter reading", "lens worn", "over-refraction"): named in the legend, the labels and the clear
    /// button. Without it the entry is the eye's prescription.
    #[prop(optional)]
    subject: Option<&'static str>,
) -> impl IntoView {
    let (word, letter) = eye_words(entry.eye);
    let lower = word.to_ascii_lowercase();
    let (legend, line_label, clear) = match subject {
        Some(s) => (
            format!("{word} eye ({letter}): {s}"),
            format!("{word} {s}"),
            format!("Clear {lower} {s}"),
        ),
        None => (
            format!("{word} eye ({letter})"),
            format!("{word} prescription"),
            format!("Clear {lower} eye"),
        ),
    };
    let named = move |what: &str| match subject {
        Some(s) => format!("{word} {s} {what}"),
        None => format!("{word} {what}"),
    };
    let fields = use_context::<FieldsShown>()
        .map(|f| f.0)
        .unwrap_or_else(|| Remembered::new("lensplane.fields"));
    let messages = move |slot: Slot| {
        Signal::derive(move || {
            let source = entry.source.get();
            match parsed.get() {
                Some(Err(e)) if slot_for(e.field(), source) == slot => vec![Message::error(&e)],
                Some(Ok(p)) => p
                    .notices
                    .iter()
                    .filter(|n| slot_for(n.field, source) == slot)
                    .map(Message::notice)
                    .collect(),
                _ => vec![],
            }
        })
    };
    let field_edit = Callback::new(move |_| entry.on_field_edit());
    let line_edit = Callback::new(move |_| entry.on_line_edit());
    let glance = Memo::new(move |_| result.with(glance_text));
    let id = |what: &str| format!("{id_prefix}-{lower}-{what}");
    view! {
        <fieldset class="eye-entry">
            <legend>{legend}</legend>
            <p class=move || glance.with(|g| g.1)>{move || glance.with(|g| g.0.clone())}</p>
            <TextField id=id("line") label=line_label label_hidden=true
                value=entry.line messages=messages(Slot::Line) inputmode="text"
                placeholder="-8.00 -2.00 x180" on_edit=line_edit/>
            <div class="entry-tools">
            <details class="rx-fields-toggle" prop:open=move || fields.is_open() on:toggle=on_toggle(fields)>
                <summary>"Separate fields"</summary>
                <div class="rx-fields">
                    <TextField id=id("sphere") label="Sphere" name=named("sphere") value=entry.sphere
                        messages=messages(Slot::Sphere) signed=true step=StepKind::Sphere unit="D"
                        placeholder="-2.00" on_edit=field_edit/>
                    <TextField id=id("cylinder") label="Cylinder" name=named("cylinder") value=entry.cylinder
                        messages=messages(Slot::Cylinder) signed=true step=StepKind::Cylinder unit="D"
                        placeholder="-0.75" on_edit=field_edit/>
                    <TextField id=id("axis") label="Axis" name=named("axis") value=entry.axis
                        messages=messages(Slot::Axis) step=StepKind::Axis(5) unit="°" inputmode="numeric"
                        placeholder="180" on_edit=field_edit/>
                </div>
            </details>
            <button type="button" class="button quiet" on:click=move |_| entry.clear()>
                {clear}
            </button>
            </div>
            {children.map(|c| c())}
        </fieldset>
    }
}

#[cfg(test)]
mod tests {
    use super::compose;

    #[test]
    fn fields_join_into_one_line_as_typed() {
        assert_eq!(compose("-8", "-2", "180"), "-8 -2 x180");
        assert_eq!(compose("-8", "-2", "x005"), "-8 -2 x005");
        assert_eq!(compose("+1.00", "", ""), "+1.00");
        assert_eq!(compose("", "-2", "90"), "? -2 x90");
        assert_eq!(compose("", "", ""), "");
    }
}
