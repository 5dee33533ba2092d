//! The standing cautions: true of a whole calculation whatever is entered,
//! so they are shown once per page (never per eye) and never hidden. Each
//! has a scope; the UI shows a page's cautions by filtering this one list
//! ([`cautions_for`]) and the about page shows all of them ([`cautions`]),
//! so no caution is ever typed twice. What depends on an eye's figures is a
//! [`crate::Warning`] instead.

use core::fmt;

use crate::lens_check::PRISM_NOT_CHECKED;
use crate::limits::MEASURE_VERTEX;

/// The calculations Lensplane offers (what a caution can be scoped to).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Calculation {
    /// Vertex compensation.
    Vertex,
    /// Spherical equivalent and spherical substitutes.
    Equivalent,
    /// Near: accommodation and the add through another plane.
    Near,
    /// A worn lens combined with the over-refraction found over it.
    OverRefraction,
    /// Spectacle and contact-lens magnification.
    ImageSize,
    /// A printable vertex conversion chart.
    Chart,
    /// A received lens checked against its order.
    LensCheck,
}

/// Where a caution applies.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Scope {
    /// Every calculation.
    Everywhere,
    /// Only these calculations.
    Only(&'static [Calculation]),
}

impl Scope {
    /// True when the caution belongs on `calc`'s page.
    ///
    /// ```
    /// use lensplane_core::{Calculation, Scope};
    /// assert!(Scope::Everywhere.covers(Calculation::Chart));
    /// assert!(!Scope::Only(&[Calculation::Near]).covers(Calculation::Vertex));
    /// ```
    pub fn covers(self, calc: Calculation) -> bool {
        match self {
            Scope::Everywhere => true,
            Scope::Only(list) => list.contains(&calc),
        }
    }
}

/// The kinds of [`Caution`] (stable codes for the UI and tests).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum CautionKind {
    /// Results are starting points, not a prescription; local regulations
    /// and licensed practice decide.
    StartingPoint,
    /// The thin-lens model and the corneal reference plane.
    ThinLens,
    /// Measure the vertex distance at higher powers.
    MeasureVertex,
    /// Presbyopes moving to contact lenses accommodate differently.
    PresbyopeAccommodation,
    /// Screening staff refer; no patient identifiers.
    ScreeningRefer,
    /// A spherical lens leaves the astigmatism uncorrected.
    SphericalLeavesAstigmatism,
    /// Multifocal contact-lens "add" labels are not optical adds.
    MultifocalLabels,
    /// Amplitude by age is a population estimate.
    PopulationEstimate,
    /// Trial the add at the real reading distance.
    TrialAtDistance,
    /// The over-refraction model: thin lenses, rotation only as entered.
    OverRefractionModel,
    /// Confirm the new lens by over-refraction and acuity once it settles.
    ConfirmSettled,
    /// Rotation compensation assumes a lens that settles the same way.
    StableRotation,
    /// Image sizes are thin-lens estimates, not a measurement.
    ImageSizeEstimate,
    /// Refer when symptoms suggest aniseikonia.
    AniseikoniaSymptoms,
    /// Whose tolerances a lens check applies, and that others may apply.
    ToleranceSource,
    /// A lens check leaves prism and centration out.
    PrismNotChecked,
    /// A chart lists spheres: read each principal meridian of a cylinder.
    ChartPerMeridian,
}

impl CautionKind {
    /// Every kind, in the order a page lists them.
    pub const ALL: [CautionKind; 17] = [
        CautionKind::StartingPoint,
        CautionKind::ConfirmSettled,
        CautionKind::StableRotation,
        CautionKind::OverRefractionModel,
        CautionKind::ImageSizeEstimate,
        CautionKind::AniseikoniaSymptoms,
        CautionKind::SphericalLeavesAstigmatism,
        CautionKind::MultifocalLabels,
        CautionKind::PopulationEstimate,
        CautionKind::TrialAtDistance,
        CautionKind::ToleranceSource,
        CautionKind::PrismNotChecked,
        CautionKind::ChartPerMeridian,
        CautionKind::ThinLens,
        CautionKind::MeasureVertex,
        CautionKind::PresbyopeAccommodation,
        CautionKind::ScreeningRefer,
    ];

    /// Where this caution applies.
    pub fn scope(self) -> Scope {
        use Calculation::*;
        match self {
            CautionKind::StartingPoint | CautionKind::ScreeningRefer => Scope::Everywhere,
            // The over-refraction page has its own model caution: it handles toric rotation as entered.
            CautionKind::ThinLens => Scope::Only(&[Vertex, Equivalent, Near, ImageSize, Chart]),
            CautionKind::MeasureVertex => Scope::Only(&[Vertex, Equivalent, OverRefraction, Chart]),
            CautionKind::PresbyopeAccommodation => Scope::Only(&[Vertex, Near]),
            CautionKind::SphericalLeavesAstigmatism => Scope::Only(&[Equivalent]),
            CautionKind::MultifocalLabels | CautionKind::PopulationEstimate | CautionKind::TrialAtDistance => {
                Scope::Only(&[Near])
            }
            CautionKind::OverRefractionModel | CautionKind::ConfirmSettled | CautionKind::StableRotation => {
                Scope::Only(&[OverRefraction])
            }
            CautionKind::ImageSizeEstimate | CautionKind::AniseikoniaSymptoms => Scope::Only(&[ImageSize]),
            CautionKind::ToleranceSource | CautionKind::PrismNotChecked => Scope::Only(&[LensCheck]),
            CautionKind::ChartPerMeridian => Scope::Only(&[Chart]),
        }
    }
}

impl fmt::Display for CautionKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            CautionKind::StartingPoint => {
                f.write_str("Results are starting points, not a prescription: confirm by over-refraction and acuity, and defer to local regulations and licensed practice.")
            }
            CautionKind::ThinLens => f.write_str(
                "Powers are referred to the corneal vertex (thin-lens model): no tear lens, rigid-lens astigmatism, flexure or toric rotation.",
            ),
            CautionKind::MeasureVertex => write!(
                f,
                "Measure the vertex distance when any meridian exceeds about {MEASURE_VERTEX}."
            ),
            CautionKind::PresbyopeAccommodation => f.write_str(
                "Myopic presbyopes moving to contact lenses need more accommodation and convergence; hyperopes less.",
            ),
            CautionKind::ScreeningRefer => f.write_str("Screening staff refer, not diagnose. Store no patient identifiers."),
            CautionKind::SphericalLeavesAstigmatism => f.write_str(
                "A spherical lens leaves the astigmatism shown uncorrected: check acuity with the lens on the eye.",
            ),
            CautionKind::MultifocalLabels => f.write_str(
                "Multifocal contact-lens \"add\" labels are not optical adds: fit by the maker's guide and trial.",
            ),
            CautionKind::PopulationEstimate => f.write_str(
                "Amplitude by age (Hofstetter) is a population estimate: refine with the patient's measured amplitude.",
            ),
            CautionKind::TrialAtDistance => {
                f.write_str("Trial the add at the patient's real reading distance before ordering.")
            }
            CautionKind::OverRefractionModel => f.write_str(
                "Thin lenses referred to the corneal vertex: no tear lens, rigid-lens astigmatism or flexure; toric rotation only as observed and entered.",
            ),
            CautionKind::ConfirmSettled => f.write_str(
                "Confirm the new lens by over-refraction and acuity with it in place; a contact lens once it has settled.",
            ),
            CautionKind::StableRotation => f.write_str(
                "Compensating a toric lens's rotation assumes it settles the same way each time: check the marks again on the new lens.",
            ),
            CautionKind::ImageSizeEstimate => f.write_str(
                "Image sizes are thin-lens estimates of spectacle magnification, not a measurement of aniseikonia.",
            ),
            CautionKind::AniseikoniaSymptoms => f.write_str(
                "Where symptoms (eyestrain, headache, unequal or double images) suggest aniseikonia, measure or refer.",
            ),
            CautionKind::ToleranceSource => f.write_str(
                "Tolerances are those of ANSI Z80.1-2015 as publicly summarised: confirm against the standard. Local regulation or a lab agreement may set others.",
            ),
            CautionKind::PrismNotChecked => f.write_str(PRISM_NOT_CHECKED),
            CautionKind::ChartPerMeridian => f.write_str(
                "The chart lists spheres: for a cylinder, look up each principal meridian (sphere, and sphere + cylinder); never convert the cylinder by itself.",
            ),
        }
    }
}

/// A standing caution: its kind (with its words, through `Display`) and
/// where it applies.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Caution {
    /// What it says.
    pub kind: CautionKind,
    /// Where it applies.
    pub scope: Scope,
}

impl fmt::Display for Caution {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        self.kind.fmt(f)
    }
}

/// Every standing caution, in the order pages list them.
///
/// ```
/// let all: Vec<_> = lensplane_core::cautions().collect();
/// assert!(all[0].to_string().starts_with("Results are starting points, not a prescription"));
/// ```
pub fn cautions() -> impl Iterator<Item = Caution> {
    CautionKind::ALL.into_iter().map(|kind| Caution {
        kind,
        scope: kind.scope(),
    })
}

/// The standing cautions of one calculation's page.
///
/// ```
/// use lensplane_core::{cautions_for, Calculation, CautionKind};
/// let near: Vec<_> = cautions_for(Calculation::Near).map(|c| c.kind).collect();
/// assert!(near.contains(&CautionKind::MultifocalLabels));
/// assert!(!cautions_for(Calculation::Vertex).any(|c| c.kind == CautionKind::MultifocalLabels));
/// assert!(cautions_for(Calculation::Vertex).any(|c| c.to_string().contains("about ±4 D")));
/// ```
pub fn cautions_for(calc: Calculation) -> impl Iterator<Item = Caution> {
    cautions().filter(move |c| c.scope.covers(calc))
}

#[cfg(test)]
mod tests {
    use super::*;

    const ALL: &[Calculation] = &[
        Calculation::Vertex,
        Calculation::Equivalent,
        Calculation::Near,
        Calculation::OverRefraction,
        Calculation::ImageSize,
        Calculation::Chart,
        Calculation::LensCheck,
    ];

    #[test]
    fn every_calculation_carries_the_cautions_that_apply_everywhere() {
        for calc in ALL.iter().copied() {
            let kinds: Vec<_> = cautions_for(calc).map(|c| c.kind).collect();
            for k in [CautionKind::StartingPoint, CautionKind::ScreeningRefer] {
                assert!(kinds.contains(&k), "{calc:?} lacks {k:?}");
            }
        }
    }

    #[test]
    fn each_caution_is_listed_once() {
        let all: Vec<_> = cautions().map(|c| c.kind).collect();
        for (i, k) in all.iter().enumerate() {
            assert!(!all[i + 1..].contains(k), "{k:?} twice");
        }
        assert_eq!(all.len(), CautionKind::ALL.len());
    }
}
