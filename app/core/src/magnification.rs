//! Spectacle magnification of thin lenses (Bennett & Rabbetts, *Clinical
//! Visual Optics* [textbook]): the image size with a correction against the
//! uncorrected eye, per meridian, for spectacles and for a contact lens.
//!
//! * Power factor 1 / (1 − h·F), h = vertex distance + [`ENTRANCE_PUPIL_MM`].
//! * Shape factor 1 / (1 − (t/n)·F1) when the lens form is known.
//! * A contact lens sits at the cornea (h = the entrance pupil depth) with
//!   its compensated power F / (1 − dF), and no shape factor (a thin lens).
//! * Switching spectacles → contact lenses changes image size by
//!   SM_cl / SM_sp − 1, which for thin lenses without a shape factor is
//!   exactly −d·F (d in metres).

use crate::error::{Error, ErrorKind, Field};
use crate::{compensate_power, LensForm, VertexDistance};

/// Depth of the eye's entrance pupil behind the corneal vertex, mm: about
/// 3 mm (the value from memory; confirm against the printed source).
pub const ENTRANCE_PUPIL_MM: f64 = 3.0;

/// Distance of the eye's anterior focal point in front of the cornea, mm:
/// about 15.7 mm for a schematic eye (Knapp's law, textbook; the value as
/// given in the notes).
pub const ANTERIOR_FOCAL_POINT_MM: f64 = 15.7;

/// The power factor 1 / (1 − h·F) of a thin lens of `power` dioptres at
/// `h_m` metres in front of the entrance pupil. An error (never Infinity)
/// when 1 − hF is not positive: the image would be at or beyond infinity.
///
/// ```
/// use lensplane_core::power_factor;
/// // +8.00 at 12 mm, h = 15 mm [derived]: 1 / 0.88 = 1.1364.
/// assert!((power_factor(8.0, 0.015)? - 1.136364).abs() < 1e-6);
/// assert!(power_factor(70.0, 0.015).is_err());
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn power_factor(power: f64, h_m: f64) -> Result<f64, Error> {
    let denominator = 1.0 - h_m * power;
    if !(denominator.is_finite() && denominator > 1e-9) {
        return Err(Error::new(ErrorKind::Singular { power }, Field::Result, None));
    }
    Ok(1.0 / denominator)
}

/// The shape factor 1 / (1 − (t/n)·F1): front surface power `front` (D),
/// centre thickness `thickness_m` (metres), refractive index `index`. It is
/// exactly 1 at zero thickness. An error (never Infinity) when the
/// denominator is not positive or an input is not finite; within the
/// [`LensForm`] limits it is never below 1 nor above about 1.56.
///
/// ```
/// use lensplane_core::shape_factor;
/// // +6.00 front, 2 mm, n = 1.5 [derived]: 1 / (1 − 0.008) = 1.0081.
/// assert!((shape_factor(6.0, 0.002, 1.5)? - 1.008065).abs() < 1e-6);
/// assert_eq!(shape_factor(6.0, 0.0, 1.5)?, 1.0);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn shape_factor(front: f64, thickness_m: f64, index: f64) -> Result<f64, Error> {
    let denominator = 1.0 - thickness_m / index * front;
    if !(denominator.is_finite() && denominator > 1e-9 && index > 0.0) {
        return Err(Error::new(
            ErrorKind::Singular { power: front },
            Field::FrontSurface,
            None,
        ));
    }
    Ok(1.0 / denominator)
}

impl LensForm {
    /// The shape factor of this lens form.
    ///
    /// ```
    /// let form = lensplane_core::LensForm::new(6.0, 2.0, 1.5)?;
    /// assert!((form.shape_factor() - 1.008065).abs() < 1e-6);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn shape_factor(&self) -> f64 {
        // Within the limits (t/n)·F1 ≤ 0.02 / 1.4 · 25 < 0.36: never singular.
        shape_factor(self.front_surface(), self.thickness_mm() / 1000.0, self.index()).unwrap_or(1.0)
    }
}

/// The image size in one meridian, spectacles against a contact lens. The
/// fractions are relative to the uncorrected eye (+0.136 is 13.6 % larger);
/// print them with [`crate::fmt_percent`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct MeridianSize {
    /// Direction of the meridian, degrees 1–180.
    pub axis: u16,
    /// The spectacle power in this meridian, D.
    pub spectacle_power: f64,
    /// The contact-lens power in this meridian (compensated to the
    /// cornea), D.
    pub contact_lens_power: f64,
    /// Power factor of the spectacle lens (a ratio).
    pub power_factor: f64,
    /// Shape factor of the spectacle lens (a ratio); `None` when the lens
    /// form was not given (then left out).
    pub shape_factor: Option<f64>,
    /// Spectacle magnification, power × shape factor (a ratio).
    pub spectacle_magnification: f64,
    /// Contact-lens magnification, its power factor at the entrance pupil
    /// depth (a ratio).
    pub contact_lens_magnification: f64,
    /// Spectacle magnification − 1 (a fraction).
    pub spectacles: f64,
    /// Contact-lens magnification − 1 (a fraction).
    pub contact_lens: f64,
    /// Switching from spectacles to the contact lens: SM_cl / SM_sp − 1
    /// (a fraction; negative means the image gets smaller).
    pub change: f64,
}

/// The image size in the meridian at `axis` for a spectacle `power` at
/// `vertex`, with the lens form if known.
///
/// ```
/// use lensplane_core::*;
/// // [derived] +8.00 at 12 mm: spectacles +13.64 %, contact lens +2.73 %, change -9.60 %.
/// let m = meridian_size(8.0, 180, VertexDistance::SPECTACLES, None)?;
/// assert_eq!((fmt_percent(m.spectacles), fmt_percent(m.contact_lens), fmt_percent(m.change)),
///            ("+13.6 %".into(), "+2.7 %".into(), "-9.6 %".into()));
/// # Ok::<(), Error>(())
/// ```
pub fn meridian_size(
    power: f64,
    axis: u16,
    vertex: VertexDistance,
    form: Option<&LensForm>,
) -> Result<MeridianSize, Error> {
    let pupil_m = ENTRANCE_PUPIL_MM / 1000.0;
    let pf = power_factor(power, vertex.metres() + pupil_m)?;
    let sf = form.map(LensForm::shape_factor);
    let spectacle = pf * sf.unwrap_or(1.0);
    let cl_power = compensate_power(power, vertex, VertexDistance::CORNEA)?;
    let cl = power_factor(cl_power, pupil_m)?;
    Ok(MeridianSize {
        axis,
        spectacle_power: power,
        contact_lens_power: cl_power,
        power_factor: pf,
        shape_factor: sf,
        spectacle_magnification: spectacle,
        contact_lens_magnification: cl,
        spectacles: spectacle - 1.0,
        contact_lens: cl - 1.0,
        change: cl / spectacle - 1.0,
    })
}

#[cfg(test)]
mod tests {
    use super::{power_factor, shape_factor};

    #[test]
    fn a_power_factor_past_infinity_is_an_error_not_a_negative_size() {
        // 1 − hF below zero: +70.00 at h = 15 mm gives 1 − 1.05 = −0.05 [derived from the
        // power factor 1 / (1 − hF), shared/optics-notes.md §13].
        assert!(power_factor(70.0, 0.015).is_err());
        // At the singular point, and just inside it (a large but finite factor).
        assert!(power_factor(1.0 / 0.015, 0.015).is_err());
        assert!(power_factor(66.0, 0.015).unwrap() > 1.0);
        assert!(power_factor(f64::NAN, 0.015).is_err());
    }

    #[test]
    fn a_shape_factor_needs_a_positive_denominator_and_index() {
        // 1 − (t/n)F1 below zero: +100.00 front, 20 mm, n = 1.5 gives 1 − 1.333 < 0 [derived from
        // the shape factor 1 / (1 − (t/n)F1), shared/optics-notes.md §13].
        assert!(shape_factor(100.0, 0.02, 1.5).is_err());
        // A negative index would give a positive denominator (1 + 0.008) and a factor below 1.
        assert!(shape_factor(6.0, 0.002, -1.5).is_err());
        assert!(shape_factor(6.0, 0.002, 0.0).is_err());
        assert!((shape_factor(6.0, 0.002, 1.5).unwrap() - 1.0 / 0.992).abs() < 1e-12);
    }
}
