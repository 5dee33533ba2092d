//! Building blocks the panels share: fields with ± and steppers, the eye
//! entry, plane inputs, result pieces and the save/copy bar.

mod card;
mod cross;
mod entry;
mod field;
mod messages;
mod planes;
mod save;
mod shown;

pub use card::{Alternative, Card, EyeCard, Headline, Row};
pub use cross::PowerCrossDiagram;
pub use entry::{eye_words, EyeEntry, EyeEntryForm};
pub use field::TextField;
pub use messages::{field_warnings, result_warnings, Cautions, Message};
pub use planes::{PlaneInputs, Planes};
pub use save::SaveBar;
pub use shown::{shown_memo, Shown, ShownNote};
