//! Toric contact-lens mapping: the nearest available cylinder and axis, the
//! sphere that keeps the spherical equivalent, and what the choice leaves
//! uncorrected (a power-vector difference, so a rotated axis counts as the
//! obliquely crossed cylinder it is).

use crate::error::{Error, ErrorKind, Field};
use crate::format::fmt_power;
use crate::limits;
use crate::rounding::{Ladder, TieRule};
use crate::{PowerVector, Rx};

/// Which toric lenses can be ordered. Common practice (varies by maker):
/// cylinders −0.75, −1.25, −1.75, −2.25 D; axes in 10° steps.
#[derive(Clone, Debug, PartialEq)]
pub struct ToricSettings {
    /// Available cylinders, minus-cylinder form (negative), dioptres.
    pub cylinders: Vec<f64>,
    /// Axis step, degrees; must divide 180 (5, 10, 15, 20…).
    pub axis_step: u16,
}

impl Default for ToricSettings {
    fn default() -> ToricSettings {
        ToricSettings {
            cylinders: vec![-0.75, -1.25, -1.75, -2.25],
            axis_step: 10,
        }
    }
}

impl ToricSettings {
    /// Check: at least one cylinder, all negative and at most 10 D; the axis
    /// step divides 180.
    ///
    /// ```
    /// use lensplane_core::ToricSettings;
    /// assert!(ToricSettings::default().validate().is_ok());
    /// let bad = ToricSettings { axis_step: 7, ..ToricSettings::default() };
    /// assert_eq!(bad.validate().unwrap_err().to_string(), "setting: the toric axis step must divide 180");
    /// ```
    pub fn validate(&self) -> Result<(), Error> {
        let bad = |what: String| Err(Error::new(ErrorKind::BadSetting { what }, Field::Setting, None));
        let deepest = -limits::CYLINDER.max;
        if self.cylinders.is_empty()
            || self
                .cylinders
                .iter()
                .any(|c| !c.is_finite() || *c >= 0.0 || *c < deepest)
        {
            return bad(format!(
                "toric cylinders must be negative, down to {} D",
                fmt_power(deepest)
            ));
        }
        if self.axis_step == 0 || self.axis_step > 90 || 180 % self.axis_step != 0 {
            return bad("the toric axis step must divide 180".into());
        }
        Ok(())
    }

    /// The smallest available cylinder magnitude.
    pub(crate) fn smallest(&self) -> f64 {
        self.cylinders.iter().map(|c| c.abs()).fold(f64::INFINITY, f64::min)
    }

    /// The largest available cylinder magnitude.
    pub(crate) fn largest(&self) -> f64 {
        self.cylinders.iter().map(|c| c.abs()).fold(0.0, f64::max)
    }
}

/// Round an axis to a multiple of `step`; an exact half step rounds up to
/// the higher multiple (5° → 10° with 10° steps); 0 is written 180.
///
/// ```
/// use lensplane_core::round_axis;
/// assert_eq!(round_axis(5, 10), 10);
/// assert_eq!(round_axis(4, 10), 180);
/// assert_eq!(round_axis(175, 10), 180);
/// assert_eq!(round_axis(93, 5), 95);
/// ```
pub fn round_axis(axis: u16, step: u16) -> u16 {
    if step == 0 {
        return axis;
    }
    let rounded = (axis + step / 2) / step * step;
    match rounded % 180 {
        0 => 180,
        r => r,
    }
}

/// A toric contact lens chosen from what is available, and what it leaves.
#[derive(Clone, Debug, PartialEq)]
pub struct ToricChoice {
    /// The exact power at the cornea, minus-cylinder form.
    pub exact: Rx,
    /// The lens to order: nearest cylinder, axis on the step, sphere keeping
    /// the spherical equivalent (rounded on the contact-lens ladder).
    pub ordered: Rx,
    /// (ordered − exact) as a power vector.
    pub residual: PowerVector,
    /// The astigmatism left uncorrected in total, as a cylinder size (D).
    pub residual_cylinder: f64,
    /// The part caused by the axis step alone (exact cylinder at the
    /// rounded axis), as a cylinder size (D).
    pub residual_from_axis: f64,
    /// The part caused by the cylinder step alone (available cylinder at the
    /// exact axis), as a cylinder size (D).
    pub residual_from_cylinder: f64,
    /// Spherical-equivalent error of the ordered lens (D).
    pub residual_spherical_equivalent: f64,
    /// Blur strength of the residual (D).
    pub residual_blur: f64,
    /// False when the exact cylinder is beyond the largest available one by
    /// more than a quarter dioptre.
    pub within_range: bool,
}

/// Choose a toric lens for `exact` (the power at the cornea). `None` when
/// `exact` has no cylinder.
///
/// The cylinder is the nearest available (ties toward the smaller
/// cylinder); the axis the nearest step; the sphere SE − C/2 rounded on
/// `ladder` with `tie`.
///
/// ```
/// use lensplane_core::{choose_toric, Ladder, Rx, TieRule, ToricSettings};
/// let exact = Rx::new(-3.0, -1.10, 23)?;
/// let t = choose_toric(&exact, &ToricSettings::default(), &Ladder::CONTACT_LENS, TieRule::TowardPlus)?.unwrap();
/// assert_eq!(t.ordered.to_string(), "-3.00 -1.25 ×020");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn choose_toric(
    exact: &Rx,
    settings: &ToricSettings,
    ladder: &Ladder,
    tie: TieRule,
) -> Result<Option<ToricChoice>, Error> {
    settings.validate()?;
    ladder.validate()?;
    let exact = exact.to_minus_cyl();
    if exact.is_spherical() {
        return Ok(None);
    }
    let c = exact.cylinder();
    let mut cylinder = settings.cylinders[0];
    for &candidate in &settings.cylinders {
        let (d_new, d_old) = ((candidate - c).abs(), (cylinder - c).abs());
        if d_new < d_old - 1e-9 || ((d_new - d_old).abs() <= 1e-9 && candidate > cylinder) {
            cylinder = candidate;
        }
    }
    let axis = round_axis(exact.axis(), settings.axis_step);
    let sphere = ladder.round(exact.spherical_equivalent() - cylinder / 2.0, tie);
    let ordered = Rx::raw(sphere, cylinder, axis);
    let exact_v = exact.power_vector();
    let residual = ordered.power_vector().minus(&exact_v);
    let axis_only = Rx::raw(exact.sphere(), c, axis).power_vector().minus(&exact_v);
    let cyl_only = Rx::raw(exact.sphere(), cylinder, exact.axis())
        .power_vector()
        .minus(&exact_v);
    Ok(Some(ToricChoice {
        exact,
        ordered,
        residual,
        residual_cylinder: residual.cylinder_size(),
        residual_from_axis: axis_only.cylinder_size(),
        residual_from_cylinder: cyl_only.cylinder_size(),
        residual_spherical_equivalent: residual.m,
        residual_blur: residual.blur_strength(),
        within_range: c.abs() <= settings.largest() + 0.25 + 1e-9,
    }))
}
