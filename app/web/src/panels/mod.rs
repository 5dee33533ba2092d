//! One module per destination.

mod about;
mod common;
mod equivalent;
mod history;
mod near;
mod vertex;

pub use about::AboutPanel;
pub use equivalent::EquivalentPanel;
pub use history::{HistoryBanner, HistoryPanel};
pub use near::NearPanel;
pub use vertex::VertexPanel;
