//! Validation as data: sanity warnings returned with results, each tied to
//! a field, so the UI shows them without logic of its own. The standing
//! cautions of a page are in `cautions.rs`.

use crate::error::Field;
use crate::format::{fmt_length, fmt_number, fmt_power};
use crate::limits::{self, CYLINDER_WARN, MEASURE_VERTEX, SPHERE_WARN, VERTEX_USUAL};
use crate::rounding::{is_on_step, round_to_step, TieRule};
use crate::{compensate_power, Rx, VertexDistance};

/// A warning: the result stands, but the practitioner should look again.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Warning {
    /// What kind (a stable code for the UI and tests).
    pub kind: WarningKind,
    /// The input or result it belongs beside.
    pub field: Field,
    /// Plain words, with the figures concerned.
    pub message: String,
}

/// Where a [`Warning`] belongs on the page.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Place {
    /// Beside this eye's result: it depends on this eye's figures.
    Result,
    /// At the input it concerns, once for both eyes: it depends only on
    /// inputs the eyes share (vertex distances, add, age).
    SharedInput,
    /// At the prescription field, where the parser already said it as a
    /// notice (an off-step power): not repeated beside the result.
    Entry,
}

impl Warning {
    /// Where the page shows it.
    ///
    /// ```
    /// use lensplane_core::{rx_warnings, Place, Rx};
    /// let w = rx_warnings(&Rx::new(-2.30, -1.0, 180)?);
    /// assert_eq!(w[0].place(), Place::Entry);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn place(&self) -> Place {
        match self.kind {
            WarningKind::OffStep => Place::Entry,
            WarningKind::UnusualVertex | WarningKind::AmplitudeUnreliable | WarningKind::AddDiffersFromAge => {
                Place::SharedInput
            }
            _ => Place::Result,
        }
    }
}

/// The kinds of [`Warning`].
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum WarningKind {
    /// The vertex change moves every meridian by less than a quarter step.
    BelowQuarterStep,
    /// A meridian beyond ±4 D: the vertex distance should be measured.
    MeasureVertex,
    /// A spectacle vertex distance outside 8–20 mm.
    UnusualVertex,
    /// An input power between quarter steps.
    OffStep,
    /// A meridian beyond ±20 D.
    HighPower,
    /// A cylinder above 6 D.
    HighCylinder,
    /// A contact-lens power outside the usual stock range.
    OutsideStock,
    /// A cylinder beyond the largest available toric cylinder.
    BeyondToricRange,
    /// Age where the age formulas are least reliable.
    AmplitudeUnreliable,
    /// The spectacle add is far from the tentative add for the age.
    AddDiffersFromAge,
    /// A toric contact lens rotated more than about 30°: consider a refit.
    RotationLarge,
    /// A toric contact lens described as unstable: consider a refit.
    RotationUnstable,
    /// A rotation given where it has no meaning (spectacles, a spherical
    /// lens): not used.
    RotationIgnored,
    /// The over-refraction has more cylinder than the worn lens.
    OverRefractionCylinder,
    /// An over-refraction meridian beyond ±4 D.
    OverRefractionHigh,
}

pub(crate) fn warn(kind: WarningKind, field: Field, message: String) -> Warning {
    Warning { kind, field, message }
}

/// The one wording for a power between quarter steps, for a notice at the
/// field or a warning beside a result: `None` when `value` is on a step.
///
/// ```text
/// sphere -2.30 is between quarter steps; nearest -2.25
/// ```
pub(crate) fn off_step(field: Field, value: f64) -> Option<String> {
    (!is_on_step(value, 0.25)).then(|| {
        format!(
            "{} {} is between quarter steps; nearest {}",
            field.noun(),
            fmt_power(value),
            fmt_power(round_to_step(value, 0.25, TieRule::default()))
        )
    })
}

/// Warnings about a prescription as entered: off-step, very high powers.
///
/// ```
/// use lensplane_core::{rx_warnings, Rx, WarningKind};
/// let w = rx_warnings(&Rx::new(-2.30, -1.0, 180)?);
/// assert_eq!(w[0].kind, WarningKind::OffStep);
/// assert_eq!(w[0].message, "sphere -2.30 is between quarter steps; nearest -2.25");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn rx_warnings(rx: &Rx) -> Vec<Warning> {
    let mut out = vec![];
    for (value, field) in [(rx.sphere(), Field::Sphere), (rx.cylinder(), Field::Cylinder)] {
        if let Some(message) = off_step(field, value) {
            out.push(warn(WarningKind::OffStep, field, message));
        }
    }
    let strongest = strongest_meridian(rx);
    if SPHERE_WARN.exceeded_by(strongest) {
        out.push(warn(
            WarningKind::HighPower,
            Field::Sphere,
            format!(
                "a meridian of {} is beyond {SPHERE_WARN}: check the entry",
                fmt_power(strongest)
            ),
        ));
    }
    if CYLINDER_WARN.exceeded_by(rx.cylinder()) {
        out.push(warn(
            WarningKind::HighCylinder,
            Field::Cylinder,
            format!(
                "cylinder {} is above {CYLINDER_WARN}: check the entry",
                fmt_power(rx.cylinder())
            ),
        ));
    }
    out
}

pub(crate) fn strongest_meridian(rx: &Rx) -> f64 {
    let c = rx.meridians();
    let (a, b) = (c.first().power, c.second().power);
    if a.abs() >= b.abs() {
        a
    } else {
        b
    }
}

/// Warnings about a move between vertex distances: unusual spectacle
/// distances, high powers whose vertex distance should be measured (with
/// what a 2 mm error would change), and changes below a quarter step.
///
/// ```
/// use lensplane_core::{vertex_warnings, Rx, VertexDistance, WarningKind};
/// let w = vertex_warnings(&Rx::sphere_only(-8.0)?, VertexDistance::SPECTACLES, VertexDistance::CORNEA);
/// assert_eq!(w[0].kind, WarningKind::MeasureVertex);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn vertex_warnings(rx: &Rx, from: VertexDistance, to: VertexDistance) -> Vec<Warning> {
    let mut out = vec![];
    for (d, field) in [(from, Field::VertexFrom), (to, Field::VertexTo)] {
        if !d.is_cornea() && !VERTEX_USUAL.contains(d.mm()) {
            out.push(warn(
                WarningKind::UnusualVertex,
                field,
                format!(
                    "vertex distance {} mm is unusual for spectacles (usually {VERTEX_USUAL}): check it",
                    fmt_length(d.mm())
                ),
            ));
        }
    }
    if from == to {
        return out;
    }
    let strongest = strongest_meridian(rx);
    if MEASURE_VERTEX.exceeded_by(strongest) {
        // What a 2 mm error in the spectacle vertex distance would change.
        let spectacle = if from.is_cornea() { to } else { from };
        let shifted_mm = if spectacle.mm() + 2.0 <= limits::VERTEX.max {
            spectacle.mm() + 2.0
        } else {
            spectacle.mm() - 2.0
        };
        let shifted = VertexDistance::from_mm(shifted_mm).unwrap_or(spectacle);
        let (f2, t2) = if from.is_cornea() {
            (from, shifted)
        } else {
            (shifted, to)
        };
        let sensitivity = match (
            compensate_power(strongest, from, to),
            compensate_power(strongest, f2, t2),
        ) {
            (Ok(a), Ok(b)) => Some((a - b).abs()),
            _ => None,
        };
        let tail = sensitivity.map_or(String::new(), |s| {
            format!(" (2 mm changes this by {} D)", fmt_number(s))
        });
        out.push(warn(
            WarningKind::MeasureVertex,
            if from.is_cornea() {
                Field::VertexTo
            } else {
                Field::VertexFrom
            },
            format!(
                "{} is beyond {MEASURE_VERTEX}: measure the vertex distance{tail}",
                fmt_power(strongest)
            ),
        ));
    }
    let cross = rx.meridians();
    let changes: Vec<f64> = cross
        .both()
        .iter()
        .filter_map(|m| compensate_power(m.power, from, to).ok().map(|p| (p - m.power).abs()))
        .collect();
    let largest = changes.iter().copied().fold(0.0, f64::max);
    if changes.len() == 2 && largest > 0.0 && largest < 0.25 {
        out.push(warn(
            WarningKind::BelowQuarterStep,
            Field::Result,
            format!(
                "the change is below a quarter step ({} D at most): vertex makes little difference here",
                fmt_number(largest)
            ),
        ));
    }
    out
}
