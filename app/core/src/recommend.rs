//! One lens to order for an exact power at the target plane, the reason in
//! one line, and the alternatives with what each leaves uncorrected. Every
//! destination that ends in an order (vertex, over-refraction) leads with
//! this, so the same exact power always gives the same recommendation.
//!
//! The rules (common practice, no source; the ladders and toric range are
//! settings):
//! * **Spectacles**: each principal meridian on quarter steps, the axis to
//!   the degree. No alternative is needed: every quarter step is made.
//! * **Contact lens, spherical**: the contact-lens ladder. A quarter-step
//!   power is the alternative where the ladder is coarser.
//! * **Contact lens, cylinder that reaches the smallest stock toric**
//!   (rounded down to quarter steps): the nearest stock toric, its axis on
//!   the toric step, its sphere keeping the spherical equivalent. Beyond the
//!   stock range by more than a quarter dioptre, a lens made to order leads
//!   instead. Alternatives: the spherical lens of the spherical equivalent,
//!   and each meridian on contact-lens steps (made to order).
//! * **Contact lens, smaller cylinder**: the spherical lens of the spherical
//!   equivalent; each meridian on contact-lens steps is the alternative.

use crate::format::{fmt_dioptres, fmt_power};
use crate::rounding::{round_meridians, round_to_step, Ladder, OrderSettings, TieRule};
use crate::{choose_toric, Error, PowerVector, Rx, VertexDistance};

/// What kind of lens a [`Candidate`] is.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum LensKind {
    /// A spectacle lens, each meridian on quarter steps.
    Spectacle,
    /// A spherical contact lens on the contact-lens ladder.
    SphericalContactLens,
    /// A spherical contact lens in quarter steps (where a range has them).
    QuarterStepContactLens,
    /// A soft toric from the usual stock range.
    StockToric,
    /// A contact lens made to order: each meridian on contact-lens steps.
    MadeToOrder,
}

impl LensKind {
    /// Plain words for the kind, e.g. "soft toric from the usual range".
    ///
    /// ```
    /// assert_eq!(lensplane_core::LensKind::StockToric.words(), "soft toric from the usual range");
    /// ```
    pub fn words(self) -> &'static str {
        match self {
            LensKind::Spectacle => "spectacle lens in quarter steps",
            LensKind::SphericalContactLens => "spherical contact lens",
            LensKind::QuarterStepContactLens => "spherical contact lens in quarter steps, where the range has them",
            LensKind::StockToric => "soft toric from the usual range",
            LensKind::MadeToOrder => "toric made to order, each meridian on contact-lens steps",
        }
    }
}

/// What a lens leaves uncorrected against the exact power: the difference
/// (lens − exact) as a power vector.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Leftover {
    /// Spherical-equivalent difference, dioptres (+ means the lens is more plus).
    pub spherical_equivalent: f64,
    /// Astigmatism left uncorrected, as a cylinder size (dioptres, ≥ 0).
    pub cylinder: f64,
}

impl Leftover {
    pub(crate) fn between(lens: &Rx, exact: &Rx) -> Leftover {
        let d: PowerVector = lens.power_vector().minus(&exact.power_vector());
        Leftover {
            spherical_equivalent: d.m + 0.0,
            cylinder: d.cylinder_size(),
        }
    }

    /// Plain words: what is left, or that nothing shows at two decimals.
    ///
    /// ```
    /// use lensplane_core::Leftover;
    /// let l = Leftover { spherical_equivalent: 0.07, cylinder: 1.63 };
    /// assert_eq!(l.words(), "leaves 1.63 D of cylinder uncorrected; spherical equivalent +0.07 (+ means more plus)");
    /// assert_eq!(Leftover { spherical_equivalent: 0.001, cylinder: 0.0 }.words(), "leaves nothing uncorrected at two decimals");
    /// ```
    pub fn words(&self) -> String {
        let se = fmt_power(self.spherical_equivalent);
        let cyl = fmt_dioptres(self.cylinder);
        match (cyl == "0.00 D", se == "0.00") {
            (true, true) => "leaves nothing uncorrected at two decimals".into(),
            (true, false) => format!("leaves a spherical equivalent of {se} (+ means more plus)"),
            (false, true) => format!("leaves {cyl} of cylinder uncorrected"),
            (false, false) => {
                format!("leaves {cyl} of cylinder uncorrected; spherical equivalent {se} (+ means more plus)")
            }
        }
    }
}

/// A lens that could be ordered, and what it leaves.
#[derive(Clone, Debug, PartialEq)]
pub struct Candidate {
    /// What kind of lens.
    pub kind: LensKind,
    /// The lens, minus-cylinder form.
    pub lens: Rx,
    /// What it leaves uncorrected against the exact power.
    pub leaves: Leftover,
}

/// The lens to order, why, and the alternatives.
#[derive(Clone, Debug, PartialEq)]
pub struct Recommendation {
    /// The exact power at the target plane, minus-cylinder form.
    pub exact: Rx,
    /// The one lens to order.
    pub order: Candidate,
    /// Why this one, in one line.
    pub why: String,
    /// Other lenses that could be ordered, best first, each different from
    /// `order`.
    pub alternatives: Vec<Candidate>,
}

fn candidate(kind: LensKind, lens: Rx, exact: &Rx) -> Candidate {
    let lens = lens.to_minus_cyl();
    Candidate {
        kind,
        lens,
        leaves: Leftover::between(&lens, exact),
    }
}

fn spherical(exact: &Rx, ladder: &Ladder, tie: TieRule) -> Rx {
    Rx::raw(ladder.round(exact.spherical_equivalent(), tie), 0.0, 180)
}

/// The recommendation for `exact` (the power at `target`).
///
/// ```
/// use lensplane_core::*;
/// // C1 [textbook]: −8.00 −2.00 ×180 at 12 mm is −7.30 −1.63 ×180 at the cornea.
/// let exact = Rx::new(-7.2993, -1.6293, 180)?;
/// let r = recommend(&exact, VertexDistance::CORNEA, &OrderSettings::default())?;
/// assert_eq!(r.order.lens.to_string(), "-7.00 -1.75 ×180");
/// assert_eq!(r.order.kind, LensKind::StockToric);
/// assert_eq!(r.alternatives[0].lens.to_string(), "-8.00 DS");
/// # Ok::<(), Error>(())
/// ```
pub fn recommend(exact: &Rx, target: VertexDistance, settings: &OrderSettings) -> Result<Recommendation, Error> {
    settings.validate()?;
    let exact = exact.to_minus_cyl();
    let tie = settings.tie;
    if !target.is_cornea() {
        let lens = round_meridians(&exact.meridians(), &settings.spectacle, tie).to_rx();
        return Ok(Recommendation {
            exact,
            order: candidate(LensKind::Spectacle, lens, &exact),
            why: "spectacle lenses are made in quarter steps: each principal meridian to the nearest (ties toward plus), the axis to the degree".into(),
            alternatives: vec![],
        });
    }
    let ladder = settings.contact_lens;
    let sph = candidate(LensKind::SphericalContactLens, spherical(&exact, &ladder, tie), &exact);
    let made = candidate(
        LensKind::MadeToOrder,
        round_meridians(&exact.meridians(), &ladder, tie).to_rx(),
        &exact,
    );
    let mut alternatives = Vec::new();
    let (order, why) = if exact.is_spherical() {
        let quarter = candidate(
            LensKind::QuarterStepContactLens,
            spherical(&exact, &settings.spectacle, tie),
            &exact,
        );
        if quarter.lens != sph.lens {
            alternatives.push(quarter);
        }
        (
            sph,
            "contact lenses come in 0.25 D steps to ±6.00 and 0.50 D beyond: the nearest step (ties toward plus)"
                .to_string(),
        )
    } else {
        let cylinder = round_to_step(exact.cylinder().abs(), 0.25, TieRule::TowardZero);
        let smallest = settings.toric.smallest();
        let toric = (cylinder >= smallest - 1e-9)
            .then(|| choose_toric(&exact, &settings.toric, &ladder, tie))
            .transpose()?
            .flatten();
        match toric {
            Some(t) if t.within_range => {
                alternatives.push(sph);
                let toric = candidate(LensKind::StockToric, t.ordered, &exact);
                if made.lens != toric.lens {
                    alternatives.push(made);
                }
                (
                    toric,
                    format!(
                        "a cylinder of {} at the cornea: the nearest stock toric cylinder and axis step, the sphere keeping the spherical equivalent",
                        fmt_power(exact.cylinder())
                    ),
                )
            }
            Some(t) => {
                alternatives.push(candidate(LensKind::StockToric, t.ordered, &exact));
                alternatives.push(sph);
                (
                    made,
                    format!(
                        "a cylinder of {} is beyond the usual toric range (to {}): a lens made to order",
                        fmt_power(exact.cylinder()),
                        fmt_power(-settings.toric.largest())
                    ),
                )
            }
            None => {
                if !made.lens.is_spherical() && made.lens != sph.lens {
                    alternatives.push(made);
                }
                (
                    sph,
                    format!(
                        "a cylinder of {} at the cornea is below the smallest stock toric ({}): a spherical lens of the spherical equivalent",
                        fmt_power(exact.cylinder()),
                        fmt_power(-smallest)
                    ),
                )
            }
        }
    };
    Ok(Recommendation {
        exact,
        order,
        why,
        alternatives,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn cornea(s: f64, c: f64, a: u16) -> Recommendation {
        recommend(&Rx::raw(s, c, a), VertexDistance::CORNEA, &OrderSettings::default()).unwrap()
    }

    #[test]
    fn spectacles_round_each_meridian_and_need_no_alternative() {
        let r = recommend(
            &Rx::raw(-5.1595, -1.9311, 180),
            VertexDistance::SPECTACLES,
            &OrderSettings::default(),
        )
        .unwrap();
        // Meridians −5.1595 and −7.0906 [derived, R1] → −5.25 and −7.00.
        assert_eq!(r.order.lens.to_string(), "-5.25 -1.75 ×180");
        assert_eq!(r.order.kind, LensKind::Spectacle);
        assert!(r.alternatives.is_empty());
    }

    #[test]
    fn a_spherical_contact_lens_beyond_six_dioptres_offers_the_quarter_step() {
        // V4 [textbook]: −10.00 at 12 mm is −8.9286 at the cornea → −9.00 on 0.50 D steps; −9.00 also in quarters.
        let r = cornea(-8.9286, 0.0, 180);
        assert_eq!(r.order.lens.to_string(), "-9.00 DS");
        assert!(r.alternatives.is_empty(), "the quarter step is the same lens");
        // −6.6 → −6.50 on the ladder, −6.50 in quarter steps as well; −6.7 → −6.50 vs −6.75.
        let r = cornea(-6.7, 0.0, 180);
        assert_eq!(r.order.lens.to_string(), "-6.50 DS");
        assert_eq!(r.alternatives[0].lens.to_string(), "-6.75 DS");
        assert_eq!(r.alternatives[0].kind, LensKind::QuarterStepContactLens);
    }

    #[test]
    fn a_small_cylinder_is_left_to_the_spherical_equivalent() {
        // −3.00 −0.50 ×90: SE −3.25; the cylinder is under the smallest stock toric (−0.75, common practice).
        let r = cornea(-3.0, -0.5, 90);
        assert_eq!(r.order.lens.to_string(), "-3.25 DS");
        assert_eq!(r.order.leaves.cylinder, 0.5);
        assert_eq!(r.alternatives[0].lens.to_string(), "-3.00 -0.50 ×090");
        assert!(r.why.contains("below the smallest stock toric (-0.75)"), "{}", r.why);
    }

    #[test]
    fn a_cylinder_beyond_the_range_leads_with_a_lens_made_to_order() {
        let r = cornea(-2.0, -3.5, 10);
        assert_eq!(r.order.kind, LensKind::MadeToOrder);
        assert_eq!(r.order.lens.to_string(), "-2.00 -3.50 ×010");
        assert_eq!(r.alternatives[0].kind, LensKind::StockToric);
        assert_eq!(r.alternatives[0].lens.cylinder(), -2.25);
    }

    #[test]
    fn the_toric_leads_and_every_alternative_differs_from_it() {
        let r = cornea(-7.2993, -1.6293, 180);
        assert_eq!(r.order.kind, LensKind::StockToric);
        for a in &r.alternatives {
            assert_ne!(a.lens, r.order.lens);
        }
        // The spherical lens leaves the whole cylinder.
        assert!((r.alternatives[0].leaves.cylinder - 1.6293).abs() < 1e-9);
    }
}
