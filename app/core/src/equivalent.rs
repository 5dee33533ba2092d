//! Spherical equivalent at any plane, and whether a spherical lens is a
//! reasonable substitute for a sphero-cylinder.

use crate::error::{Error, ErrorKind, Field};
use crate::format::fmt_number;
use crate::limits;
use crate::{compensate, Rx, VertexDistance};

/// The spherical equivalent of `rx` once moved from `from` to `to`.
///
/// Order (a decision; the notes leave it open): each principal meridian is
/// compensated first and the spherical equivalent taken at the new plane.
/// The other order (compensating S + C/2 as one power) differs by less than
/// 0.01 D at −8.00 −2.00.
///
/// ```
/// use lensplane_core::{spherical_equivalent_at, Rx, VertexDistance};
/// let se = spherical_equivalent_at(&Rx::new(-8.0, -2.0, 180)?, VertexDistance::SPECTACLES, VertexDistance::CORNEA)?;
/// assert!((se - -8.1139).abs() < 1e-4);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn spherical_equivalent_at(rx: &Rx, from: VertexDistance, to: VertexDistance) -> Result<f64, Error> {
    Ok(compensate(rx, from, to)?.spherical_equivalent())
}

/// Thresholds for a spherical substitute. Defaults are common practice
/// (from memory, no single source): cylinder ≤ 0.75 D, cylinder : sphere
/// ≤ 1 : 4, and less tolerance (≤ 0.50 D) for oblique and against-the-rule
/// cylinders. They are settings, not laws.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SubstituteSettings {
    /// Largest with-the-rule cylinder for a spherical lens, dioptres.
    pub max_cylinder: f64,
    /// Largest oblique or against-the-rule cylinder, dioptres.
    pub max_cylinder_oblique_or_against: f64,
    /// Largest cylinder : sphere ratio (0.25 = 1 : 4).
    pub max_ratio: f64,
}

impl Default for SubstituteSettings {
    fn default() -> SubstituteSettings {
        SubstituteSettings {
            max_cylinder: 0.75,
            max_cylinder_oblique_or_against: 0.5,
            max_ratio: 0.25,
        }
    }
}

impl SubstituteSettings {
    /// Check: the cylinder limits within [`limits::SUBSTITUTE_CYLINDER`],
    /// the ratio within [`limits::SUBSTITUTE_RATIO`].
    ///
    /// ```
    /// assert!(lensplane_core::SubstituteSettings::default().validate().is_ok());
    /// ```
    pub fn validate(&self) -> Result<(), Error> {
        let (cyl, ratio) = (limits::SUBSTITUTE_CYLINDER, limits::SUBSTITUTE_RATIO);
        if cyl.contains(self.max_cylinder)
            && cyl.contains(self.max_cylinder_oblique_or_against)
            && ratio.contains(self.max_ratio)
        {
            Ok(())
        } else {
            Err(Error::new(
                ErrorKind::BadSetting {
                    what: format!("substitute thresholds must be within {cyl} and a ratio within {ratio}"),
                },
                Field::Setting,
                None,
            ))
        }
    }
}

/// Orientation of a cylinder (minus-cylinder axis): with the rule 1–30 and
/// 150–180, against the rule 60–120, oblique otherwise (common practice).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Orientation {
    /// Minus-cylinder axis within 30° of 180.
    WithTheRule,
    /// Minus-cylinder axis within 30° of 90.
    AgainstTheRule,
    /// Anything else.
    Oblique,
}

impl Orientation {
    /// The orientation of a prescription's cylinder (`None` if spherical).
    ///
    /// ```
    /// use lensplane_core::{Orientation, Rx};
    /// assert_eq!(Orientation::of(&Rx::new(-1.0, -1.0, 175)?), Some(Orientation::WithTheRule));
    /// assert_eq!(Orientation::of(&Rx::new(-2.0, 1.0, 175)?), Some(Orientation::AgainstTheRule));
    /// assert_eq!(Orientation::of(&Rx::new(-1.0, -1.0, 45)?), Some(Orientation::Oblique));
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn of(rx: &Rx) -> Option<Orientation> {
        if rx.is_spherical() {
            return None;
        }
        let a = rx.to_minus_cyl().axis();
        Some(if a <= 30 || a >= 150 {
            Orientation::WithTheRule
        } else if (60..=120).contains(&a) {
            Orientation::AgainstTheRule
        } else {
            Orientation::Oblique
        })
    }

    fn words(self) -> &'static str {
        match self {
            Orientation::WithTheRule => "with-the-rule",
            Orientation::AgainstTheRule => "against-the-rule",
            Orientation::Oblique => "oblique",
        }
    }
}

/// How good a spherical substitute is.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Verdict {
    /// Both thresholds met.
    Suitable,
    /// One threshold met: try it, check acuity.
    Borderline,
    /// Neither met, or mixed astigmatism: prefer a toric lens.
    Unsuitable,
}

/// The spherical-substitute assessment.
#[derive(Clone, Debug, PartialEq)]
pub struct SubstituteAssessment {
    /// The verdict.
    pub verdict: Verdict,
    /// Cylinder orientation (`None` when spherical).
    pub orientation: Option<Orientation>,
    /// One meridian myopic and the other hyperopic.
    pub mixed: bool,
    /// Astigmatism a spherical lens leaves uncorrected: the cylinder size, D.
    pub residual_astigmatism: f64,
    /// Cylinder : sphere as a fraction (cylinder / |sphere|, minus-cylinder
    /// form); `None` when the sphere is plano.
    pub ratio: Option<f64>,
    /// The threshold that applied to this cylinder, D.
    pub cylinder_limit: f64,
    /// Plain words.
    pub reason: String,
}

/// Judge a spherical lens for `rx` (the power at the plane where the lens
/// will sit).
///
/// Decision (the notes say "and/or"): both thresholds met → suitable; one →
/// borderline; neither → unsuitable. Mixed astigmatism (meridians of
/// opposite sign, each at least 0.125 D from zero) → unsuitable.
///
/// ```
/// use lensplane_core::{assess_substitute, Rx, SubstituteSettings, Verdict};
/// let a = assess_substitute(&Rx::new(-3.0, -0.5, 180)?, &SubstituteSettings::default());
/// assert_eq!(a.verdict, Verdict::Suitable);
/// let a = assess_substitute(&Rx::new(0.5, -1.0, 90)?, &SubstituteSettings::default());
/// assert_eq!(a.verdict, Verdict::Unsuitable);
/// assert!(a.mixed);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn assess_substitute(rx: &Rx, settings: &SubstituteSettings) -> SubstituteAssessment {
    let m = rx.to_minus_cyl();
    let cyl = m.cylinder().abs();
    let orientation = Orientation::of(&m);
    let cross = m.meridians();
    let (a, b) = (cross.first().power, cross.second().power);
    // In minus-cylinder form the first meridian (the sphere) is the more
    // plus one, so mixed means: the first hyperopic, the second myopic.
    let mixed = a >= 0.125 && b <= -0.125;
    let ratio = (m.sphere() != 0.0).then(|| cyl / m.sphere().abs());
    let limit = match orientation {
        Some(Orientation::WithTheRule) | None => settings.max_cylinder,
        _ => settings.max_cylinder_oblique_or_against,
    };
    let cyl_ok = cyl <= limit + 1e-9;
    let ratio_ok = ratio.is_some_and(|r| r <= settings.max_ratio + 1e-9);
    let ratio_words = |r: Option<f64>| match r {
        Some(r) if r > 0.0 => format!("1:{}", crate::format::fmt_length(1.0 / r)),
        _ => "undefined (plano sphere)".to_string(),
    };
    let limit_ratio = if settings.max_ratio > 0.0 {
        format!("1:{}", crate::format::fmt_length(1.0 / settings.max_ratio))
    } else {
        "0".into()
    };
    let (verdict, reason) = if cyl == 0.0 {
        (
            Verdict::Suitable,
            "no cylinder: the spherical lens is the full correction".to_string(),
        )
    } else if mixed {
        (
            Verdict::Unsuitable,
            format!(
                "mixed astigmatism: one meridian is myopic and the other hyperopic, so a spherical lens leaves {} D of astigmatism; prefer a toric lens",
                fmt_number(cyl)
            ),
        )
    } else {
        let o = orientation.map_or("", |o| o.words());
        let cyl_part = format!(
            "{o} cylinder {} D is {} the {} D limit",
            fmt_number(cyl),
            if cyl_ok { "within" } else { "over" },
            fmt_number(limit)
        );
        let ratio_part = format!(
            "cylinder:sphere {} is {} {}",
            ratio_words(ratio),
            if ratio_ok { "within" } else { "over" },
            limit_ratio
        );
        match (cyl_ok, ratio_ok) {
            (true, true) => (
                Verdict::Suitable,
                format!(
                    "{cyl_part} and {ratio_part}: a spherical lens should do; {} D of astigmatism stays uncorrected",
                    fmt_number(cyl)
                ),
            ),
            (false, false) => (
                Verdict::Unsuitable,
                format!(
                    "{cyl_part} and {ratio_part}: a spherical lens leaves {} D of astigmatism; prefer a toric lens",
                    fmt_number(cyl)
                ),
            ),
            _ => (
                Verdict::Borderline,
                format!("{cyl_part}, but {ratio_part}: a spherical lens may do; check acuity with it",),
            ),
        }
    };
    SubstituteAssessment {
        verdict,
        orientation,
        mixed,
        residual_astigmatism: cyl,
        ratio,
        cylinder_limit: limit,
        reason,
    }
}
