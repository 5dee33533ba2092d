//! One module per destination.

mod about;
mod chart;
mod check_card;
pub(crate) mod check_link;
mod common;
mod equivalent;
mod history;
mod image_size;
mod lens_check;
mod near;
mod over_refraction;
mod vertex;

pub use about::AboutPanel;
pub use chart::ChartPanel;
pub use equivalent::EquivalentPanel;
pub use history::{HistoryBanner, HistoryPanel};
pub use image_size::ImageSizePanel;
pub use lens_check::LensCheckPanel;
pub use near::NearPanel;
pub use over_refraction::OverRefractionPanel;
pub use vertex::VertexPanel;
