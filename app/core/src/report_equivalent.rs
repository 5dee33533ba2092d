//! The spherical-equivalent panel's entry point.

use crate::equivalent::{assess_substitute, SubstituteAssessment, SubstituteSettings};
use crate::error::Error;
use crate::report_vertex::LadderKind;
use crate::rounding::OrderSettings;
use crate::warnings::{rx_warnings, vertex_warnings, Warning};
use crate::{compensate, compensate_power, recommend, Leftover, PowerVector, Recommendation, Rx, VertexDistance};

/// What the spherical-equivalent panel sends for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct EquivalentInput {
    /// The prescription at `from`.
    pub rx: Rx,
    /// Where it is worn now.
    pub from: VertexDistance,
    /// The plane of the spherical lens (0: contact lens).
    pub to: VertexDistance,
    /// Ladders and tie rule.
    pub settings: OrderSettings,
    /// Substitute thresholds.
    pub substitute: SubstituteSettings,
}

/// Everything the spherical-equivalent panel shows for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct EquivalentReport {
    /// The prescription as entered.
    pub input: Rx,
    /// The spherical equivalent at `from` (S + C/2 of the input).
    pub spherical_equivalent_at_origin: f64,
    /// The exact prescription at the target plane (meridians compensated).
    pub at_target: Rx,
    /// The spherical equivalent at the target plane, exact (taken after
    /// compensating the meridians).
    pub spherical_equivalent: f64,
    /// Which ladder the orderable sphere is on.
    pub ladder: LadderKind,
    /// The orderable spherical power at the target plane.
    pub ordered_sphere: f64,
    /// The orderable sphere as a prescription (`-3.75 DS`).
    pub ordered: Rx,
    /// The ordered sphere moved back to the original plane.
    pub ordered_back_at_origin: f64,
    /// (ordered sphere − exact prescription) at the target plane as a
    /// power vector: M is the focus error, J0/J45 the astigmatism left.
    pub residual: PowerVector,
    /// Blur strength of that residual, D.
    pub residual_blur: f64,
    /// What the ordered spherical lens leaves uncorrected.
    pub leaves: Leftover,
    /// The lens that keeps the cylinder (the alternative to a spherical lens).
    pub full_correction: Recommendation,
    /// The substitute assessment at the target plane.
    pub assessment: SubstituteAssessment,
    /// Warnings.
    pub warnings: Vec<Warning>,
}

/// Compute the spherical-equivalent panel for one eye.
///
/// ```
/// use lensplane_core::*;
/// let r = equivalent_report(&EquivalentInput {
///     rx: Rx::new(-2.0, -0.5, 90)?,
///     from: VertexDistance::SPECTACLES,
///     to: VertexDistance::CORNEA,
///     settings: OrderSettings::default(),
///     substitute: SubstituteSettings::default(),
/// })?;
/// assert_eq!(r.spherical_equivalent_at_origin, -2.25);
/// assert_eq!(r.ordered.to_string(), "-2.25 DS");
/// assert_eq!(r.assessment.verdict, Verdict::Suitable);
/// // Meridians -2.00 and -2.50 at 12 mm are -1.9531 and -2.4272 at the cornea [derived, notes §2]:
/// assert_eq!(fmt_dioptres(r.leaves.cylinder), "0.47 D");
/// assert_eq!(r.full_correction.order.lens.to_string(), "-2.25 DS"); // below the smallest toric

/// # Ok::<(), Error>(())
/// ```
pub fn equivalent_report(input: &EquivalentInput) -> Result<EquivalentReport, Error> {
    let EquivalentInput {
        rx,
        from,
        to,
        settings,
        substitute,
    } = input;
    settings.validate()?;
    substitute.validate()?;
    let at_target = compensate(rx, *from, *to)?;
    let se = at_target.spherical_equivalent();
    let ladder = settings.ladder_for(*to);
    let ordered_sphere = ladder.round(se, settings.tie);
    let ordered = Rx::raw(ordered_sphere, 0.0, 180);
    let residual = ordered.power_vector().minus(&at_target.power_vector());
    let mut warnings = rx_warnings(rx);
    warnings.extend(vertex_warnings(rx, *from, *to));
    Ok(EquivalentReport {
        input: *rx,
        spherical_equivalent_at_origin: rx.spherical_equivalent(),
        at_target,
        spherical_equivalent: se,
        ladder: if to.is_cornea() {
            LadderKind::ContactLens
        } else {
            LadderKind::Spectacle
        },
        ordered_sphere,
        ordered,
        ordered_back_at_origin: compensate_power(ordered_sphere, *to, *from)?,
        residual,
        residual_blur: residual.blur_strength(),
        leaves: Leftover::between(&ordered, &at_target),
        full_correction: recommend(&at_target, *to, settings)?,
        assessment: assess_substitute(&at_target, substitute),
        warnings,
    })
}
