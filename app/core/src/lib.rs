//! # Lensplane core
//!
//! The computation core of Lensplane: moving spectacle and contact-lens
//! prescriptions between optical planes (vertex compensation), spherical
//! equivalents and spherical substitutes, rounding to orderable powers, toric
//! contact-lens mapping, and near (add) effectivity. Pure functions, no I/O,
//! no web dependencies.
//!
//! Results are starting points, never a prescription: confirm by
//! over-refraction and acuity, and defer to local regulations and licensed
//! practice.
//!
//! (The full model description is being written; see the module list.)
#![forbid(unsafe_code)]
#![warn(missing_docs)]

mod amplitude;
mod equivalent;
mod error;
mod format;
mod lex;
mod limits;
mod meridians;
mod near;
mod parse;
mod report_equivalent;
mod report_near;
mod report_vertex;
mod rounding;
mod rx;
mod toric;
mod units;
mod vectors;
mod vertex;
mod warnings;

pub use amplitude::{amplitude_reliable, hofstetter, tentative_add, Amplitude, TentativeAdd};
pub use equivalent::{
    assess_substitute, spherical_equivalent_at, Orientation, SubstituteAssessment,
    SubstituteSettings, Verdict,
};
pub use error::{Error, Field};
pub use format::{fmt_dioptres, fmt_number, fmt_power, fmt_sphere};
pub use meridians::{Meridian, PowerCross};
pub use parse::{
    parse_add, parse_age, parse_axis_field, parse_cylinder_field, parse_reading_distance,
    parse_rx, parse_sphere_field, parse_vertex_mm, LengthUnit, Notice, NoticeKind, Parsed,
};
pub use near::{near_figures, NearFigures, NearGeometry};
pub use report_equivalent::{equivalent_report, EquivalentInput, EquivalentReport};
pub use report_near::{near_report, AmplitudeReport, NearInput, NearReport};
pub use report_vertex::{vertex_report, LadderKind, VertexInput, VertexReport};
pub use rounding::{
    is_on_step, order_lens, round_meridians, round_separately, round_to_step, Ladder,
    OrderSettings, OrderedLens, StockRange, TieRule,
};
pub use rx::Rx;
pub use toric::{choose_toric, round_axis, ToricChoice, ToricSettings};
pub use units::{Add, Age, Eye, EyePair, Measured, ReadingDistance, VertexDistance};
pub use vectors::PowerVector;
pub use vertex::{compensate, compensate_meridians, compensate_power, effective_power};
pub use warnings::{rx_warnings, vertex_warnings, Warning, WarningKind, CAUTIONS};
