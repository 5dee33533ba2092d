//! The vertex panel's entry point: everything the UI shows for one eye.

use crate::error::{Error, Field};
use crate::format::fmt_power;
use crate::rounding::{order_lens, round_to_step, OrderSettings, OrderedLens};
use crate::warnings::{rx_warnings, vertex_warnings, warn, Warning, WarningKind};
use crate::{
    choose_toric, compensate_meridians, recommend, PowerCross, Recommendation, Rx, ToricChoice, VertexDistance,
};

/// Which ladder the orderable values are on.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum LadderKind {
    /// Spectacle quarter steps (target is a vertex distance).
    Spectacle,
    /// Contact-lens ladder (target is the cornea).
    ContactLens,
}

/// What the vertex panel sends for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct VertexInput {
    /// The prescription at `from`.
    pub rx: Rx,
    /// Where it is worn now (default 12 mm).
    pub from: VertexDistance,
    /// Where it moves to (0: contact lens at the cornea).
    pub to: VertexDistance,
    /// Ladders, tie rule, toric availability.
    pub settings: OrderSettings,
}

/// Everything the vertex panel shows for one eye. The UI formats these with
/// `Display`/[`crate::fmt_power`] and does no arithmetic.
#[derive(Clone, Debug, PartialEq)]
pub struct VertexReport {
    /// The prescription as entered.
    pub input: Rx,
    /// From which vertex distance.
    pub from: VertexDistance,
    /// To which vertex distance.
    pub to: VertexDistance,
    /// The exact compensated prescription, in the input's cylinder form.
    pub exact: Rx,
    /// The same, minus-cylinder form.
    pub exact_minus_cyl: Rx,
    /// The same, plus-cylinder form.
    pub exact_plus_cyl: Rx,
    /// Principal meridians before the move (for the power-cross diagram).
    pub meridians_before: PowerCross,
    /// Principal meridians after the move (same directions).
    pub meridians_after: PowerCross,
    /// Per meridian: after − before.
    pub change: PowerCross,
    /// Which ladder `ordered` uses.
    pub ladder: LadderKind,
    /// The orderable lens (each meridian rounded), its worth back at the
    /// original plane and the residual per meridian.
    pub ordered: OrderedLens,
    /// `ordered.ordered` in minus-cylinder form.
    pub ordered_minus_cyl: Rx,
    /// `ordered.ordered` in plus-cylinder form.
    pub ordered_plus_cyl: Rx,
    /// The toric contact-lens choice, when the target is the cornea and the
    /// cylinder there rounds to at least the smallest available toric
    /// cylinder.
    pub toric: Option<ToricChoice>,
    /// The one lens to order at `to`, why, and the alternatives.
    pub recommendation: Recommendation,
    /// One line in plain words.
    pub reason: String,
    /// Warnings, each tied to a field or result.
    pub warnings: Vec<Warning>,
}

/// The plain-words reason for a move of `shift_m` metres toward the eye.
pub(crate) fn vertex_reason(rx: &Rx, shift_m: f64) -> String {
    if rx.meridians().both().iter().all(|m| m.power == 0.0) {
        "plano stays plano at any vertex distance".to_string()
    } else if shift_m > 0.0 {
        "moving a correction toward the eye needs more plus (less minus)".to_string()
    } else if shift_m < 0.0 {
        "moving a correction away from the eye needs less plus (more minus)".to_string()
    } else {
        "same vertex distance: no change".to_string()
    }
}

/// Compute the vertex panel for one eye.
///
/// ```
/// use lensplane_core::*;
/// let report = vertex_report(&VertexInput {
///     rx: Rx::new(-8.0, -2.0, 180)?,
///     from: VertexDistance::SPECTACLES,
///     to: VertexDistance::CORNEA,
///     settings: OrderSettings::default(),
/// })?;
/// assert_eq!(report.exact.to_string(), "-7.30 -1.63 ×180");
/// assert_eq!(report.exact_plus_cyl.to_string(), "-8.93 +1.63 ×090");
/// assert_eq!(report.ordered.ordered.to_string(), "-7.50 -1.50 ×180");
/// assert_eq!(report.reason, "moving a correction toward the eye needs more plus (less minus)");
/// assert_eq!(report.toric.unwrap().ordered.to_string(), "-7.00 -1.75 ×180");
/// assert_eq!(report.recommendation.order.lens.to_string(), "-7.00 -1.75 ×180");
/// # Ok::<(), Error>(())
/// ```
pub fn vertex_report(input: &VertexInput) -> Result<VertexReport, Error> {
    let VertexInput { rx, from, to, settings } = input;
    settings.validate()?;
    let before = rx.meridians();
    let after = compensate_meridians(&before, *from, *to)?;
    let exact = after.to_rx();
    let change = PowerCross::raw(
        crate::Meridian {
            power: after.first().power - before.first().power,
            axis: before.first().axis,
        },
        crate::Meridian {
            power: after.second().power - before.second().power,
            axis: before.second().axis,
        },
    );
    let ladder = settings.ladder_for(*to);
    let ordered = order_lens(rx, *from, *to, &ladder, settings.tie)?;
    let mut warnings = rx_warnings(rx);
    warnings.extend(vertex_warnings(rx, *from, *to));
    let mut toric = None;
    if to.is_cornea() {
        if let Some(stock) = settings.stock {
            for m in ordered.ordered_meridians.both() {
                if m.power < stock.min || m.power > stock.max {
                    warnings.push(warn(
                        WarningKind::OutsideStock,
                        Field::Ordered,
                        format!(
                            "{} is outside the usual stock range ({} to {}): may need a special order",
                            fmt_power(m.power),
                            fmt_power(stock.min),
                            fmt_power(stock.max)
                        ),
                    ));
                    break;
                }
            }
        }
        let cyl = round_to_step(exact.cylinder().abs(), 0.25, crate::TieRule::TowardZero);
        if cyl >= settings.toric.smallest() - 1e-9 {
            toric = choose_toric(&exact, &settings.toric, &settings.contact_lens, settings.tie)?;
            if let Some(t) = &toric {
                if !t.within_range {
                    warnings.push(warn(
                        WarningKind::BeyondToricRange,
                        Field::Toric,
                        format!(
                            "cylinder {} is beyond the available toric cylinders (to {}): consider a custom toric or a rigid lens",
                            fmt_power(t.exact.cylinder()),
                            fmt_power(-settings.toric.largest())
                        ),
                    ));
                }
            }
        }
    }
    Ok(VertexReport {
        input: *rx,
        from: *from,
        to: *to,
        exact,
        exact_minus_cyl: exact.to_minus_cyl(),
        exact_plus_cyl: exact.to_plus_cyl(),
        meridians_before: before,
        meridians_after: after,
        change,
        ladder: if to.is_cornea() {
            LadderKind::ContactLens
        } else {
            LadderKind::Spectacle
        },
        ordered_minus_cyl: ordered.ordered.to_minus_cyl(),
        ordered_plus_cyl: ordered.ordered.to_plus_cyl(),
        ordered,
        toric,
        recommendation: recommend(&exact, *to, settings)?,
        reason: vertex_reason(rx, from.metres() - to.metres()),
        warnings,
    })
}
