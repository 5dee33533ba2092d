//! Where the prescription was measured or worn (`from`) and where it goes
//! (`to`: the cornea for a contact lens, or another vertex distance).

use super::{field_warnings, Message, TextField};
use lensplane_core::{parse_vertex_mm, Error, Field, Parsed, VertexDistance, Warning};
use leptos::prelude::*;

/// The two planes of a calculation, as typed.
#[derive(Clone, Copy)]
pub struct Planes {
    pub from: RwSignal<String>,
    /// The typed spectacle distance for the target (kept while the cornea is chosen).
    to_frame: RwSignal<String>,
    pub to_cornea: RwSignal<bool>,
}

impl Planes {
    /// From link values; missing ones take the defaults (from 12 mm, to the cornea).
    pub fn new(from: Option<&str>, to: Option<&str>) -> Planes {
        let planes = Planes {
            from: RwSignal::new(String::new()),
            to_frame: RwSignal::new(String::new()),
            to_cornea: RwSignal::new(true),
        };
        planes.load(from, to);
        planes
    }

    pub fn load(&self, from: Option<&str>, to: Option<&str>) {
        self.from.set(from.unwrap_or("12").to_string());
        let to = to.unwrap_or("0").trim();
        let cornea = parse_vertex_mm(to).map(|p| p.value.is_cornea()).unwrap_or(false);
        self.to_cornea.set(cornea);
        self.to_frame.set(if cornea { String::new() } else { to.to_string() });
    }

    pub fn from_parsed(&self) -> Result<Parsed<VertexDistance>, Error> {
        parse_vertex_mm(&self.from.get())
    }

    pub fn to_parsed(&self) -> Result<Parsed<VertexDistance>, Error> {
        if self.to_cornea.get() {
            Ok(Parsed {
                value: VertexDistance::CORNEA,
                notices: vec![],
            })
        } else {
            parse_vertex_mm(&self.to_frame.get()).map_err(|e| e.for_field(Field::VertexTo))
        }
    }

    /// Both planes, or the first error.
    pub fn both(&self) -> Result<(VertexDistance, VertexDistance), Error> {
        Ok((self.from_parsed()?.value, self.to_parsed()?.value))
    }

    pub fn link_from(&self) -> String {
        self.from.get().trim().to_string()
    }

    pub fn link_to(&self) -> String {
        if self.to_cornea.get() {
            "0".into()
        } else {
            self.to_frame.get().trim().to_string()
        }
    }

    /// Words for the target plane, e.g. "at the cornea (contact lens)" or "at 14 mm".
    pub fn target_words(&self) -> String {
        match self.to_parsed() {
            Ok(p) if p.value.is_cornea() => "at the cornea (contact lens)".into(),
            Ok(p) => format!("at {} mm", lensplane_core::fmt_length(p.value.mm())),
            Err(_) => "at the target plane".into(),
        }
    }
}

fn messages_of(result: Result<Vec<lensplane_core::Notice>, Error>) -> Vec<Message> {
    match result {
        Ok(notices) => notices.iter().map(Message::notice).collect(),
        Err(e) => vec![Message::error(&e)],
    }
}

/// The plane inputs of the vertex-type panels. `from_label` says whose
/// vertex distance it is ("Vertex distance of the refraction").
#[component]
pub fn PlaneInputs(
    planes: Planes,
    id_prefix: &'static str,
    from_label: &'static str,
    /// Warnings about the planes from the eyes' reports (an unusual spectacle distance).
    shared: Memo<Vec<Warning>>,
) -> impl IntoView {
    let with_warnings = move |mut m: Vec<Message>, field: Field| {
        shared.with(|w| m.extend(field_warnings(w, field)));
        m
    };
    let from_msgs =
        Signal::derive(move || with_warnings(messages_of(planes.from_parsed().map(|p| p.notices)), Field::VertexFrom));
    let to_msgs =
        Signal::derive(move || with_warnings(messages_of(planes.to_parsed().map(|p| p.notices)), Field::VertexTo));
    let group = format!("{id_prefix}-target");
    view! {
        <fieldset class="planes">
            <legend>"Planes"</legend>
            <TextField id=format!("{id_prefix}-from") label=from_label
                value=planes.from messages=from_msgs unit="mm" placeholder="12"/>
            <div class="target row" role="radiogroup" aria-labelledby=format!("{group}-label")>
                <span id=format!("{group}-label") class="group-label">"Move to"</span>
                <label class="choice">
                    <input type="radio" name=group.clone() prop:checked=move || planes.to_cornea.get()
                        on:change=move |_| planes.to_cornea.set(true)/>
                    "Contact lens"
                </label>
                <label class="choice">
                    <input type="radio" name=group.clone() prop:checked=move || !planes.to_cornea.get()
                        on:change=move |_| planes.to_cornea.set(false)/>
                    "Spectacles"
                </label>
            </div>
            <Show when=move || !planes.to_cornea.get()>
                <TextField id=format!("{id_prefix}-to") label="Spectacle vertex distance" value=planes.to_frame
                    messages=to_msgs unit="mm" placeholder="14"/>
            </Show>
        </fieldset>
    }
}
