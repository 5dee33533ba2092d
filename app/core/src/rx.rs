//! The sphero-cylindrical prescription and its two cylinder forms.

use crate::error::{Error, Field};
use crate::format::fmt_power;
use crate::limits::{self, Limit};
use crate::units::range_error;
use crate::{Meridian, PowerCross, PowerVector};

/// A sphero-cylindrical prescription: sphere and cylinder in dioptres, axis
/// 1–180 in degrees (ISO 8429 notation, 180 written for 0).
///
/// Either cylinder form is held as given; [`Rx::transpose`] switches.
/// A spherical prescription has cylinder 0 and axis 180. `-0.0` is stored as
/// `0.0`.
///
/// [`Rx::new`] enforces the input hard limits (sphere ±30 D, cylinder up to
/// 10 D, axis 1–180). Computed results (e.g. +30.00 moved 20 mm toward the
/// eye) may lie beyond them; they are still finite and have a valid axis.
///
/// ```
/// use lensplane_core::Rx;
/// let rx = Rx::new(-8.0, -2.0, 180)?;
/// assert_eq!((rx.sphere(), rx.cylinder(), rx.axis()), (-8.0, -2.0, 180));
/// # Ok::<(), lensplane_core::Error>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Rx {
    sphere: f64,
    cylinder: f64,
    axis: u16,
}

fn out_of_range(field: Field, value: f64, limit: Limit) -> Error {
    let typed = if value.is_finite() {
        fmt_power(value)
    } else {
        "(not a number)".into()
    };
    range_error(field, typed, limit)
}

pub(crate) fn check_axis(axis: u16) -> Result<(), Error> {
    if limits::AXIS.contains(f64::from(axis)) {
        Ok(())
    } else {
        Err(range_error(Field::Axis, axis.to_string(), limits::AXIS))
    }
}

/// Clean `-0.0` to `0.0`.
pub(crate) fn clean(x: f64) -> f64 {
    x + 0.0
}

impl Rx {
    /// A checked prescription. Sphere within ±30 D, cylinder within ±10 D
    /// (either sign: minus- or plus-cylinder form), axis 1–180.
    ///
    /// ```
    /// use lensplane_core::Rx;
    /// assert!(Rx::new(-2.0, -1.0, 90).is_ok());
    /// assert_eq!(Rx::new(-2.0, -1.0, 0).unwrap_err().to_string(), "axis 0 is outside 1–180");
    /// assert_eq!(Rx::new(-31.0, 0.0, 180).unwrap_err().to_string(), "sphere -31.00 is outside ±30 D");
    /// ```
    pub fn new(sphere: f64, cylinder: f64, axis: u16) -> Result<Rx, Error> {
        if !limits::SPHERE.contains(sphere) {
            return Err(out_of_range(Field::Sphere, sphere, limits::SPHERE));
        }
        if !limits::CYLINDER.contains(cylinder) {
            return Err(out_of_range(Field::Cylinder, cylinder, limits::CYLINDER));
        }
        check_axis(axis)?;
        Ok(Rx::raw(sphere, cylinder, axis))
    }

    /// A spherical prescription (cylinder 0).
    ///
    /// ```
    /// let rx = lensplane_core::Rx::sphere_only(-3.75)?;
    /// assert_eq!(rx.to_string(), "-3.75 DS");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn sphere_only(sphere: f64) -> Result<Rx, Error> {
        Rx::new(sphere, 0.0, 180)
    }

    /// Unchecked limits, for computed results; callers guarantee finite
    /// values and an axis in 1–180.
    pub(crate) fn raw(sphere: f64, cylinder: f64, axis: u16) -> Rx {
        let cylinder = clean(cylinder);
        let axis = if cylinder == 0.0 { 180 } else { axis };
        Rx {
            sphere: clean(sphere),
            cylinder,
            axis,
        }
    }

    /// Sphere in dioptres.
    ///
    /// ```
    /// assert_eq!(lensplane_core::Rx::new(1.5, -1.0, 180)?.sphere(), 1.5);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn sphere(&self) -> f64 {
        self.sphere
    }

    /// Cylinder in dioptres (negative in minus-cylinder form).
    ///
    /// ```
    /// assert_eq!(lensplane_core::Rx::new(1.5, -1.0, 180)?.cylinder(), -1.0);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn cylinder(&self) -> f64 {
        self.cylinder
    }

    /// Cylinder axis in degrees, 1–180 (180 for a spherical prescription).
    ///
    /// ```
    /// assert_eq!(lensplane_core::Rx::new(1.5, -1.0, 5)?.axis(), 5);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn axis(&self) -> u16 {
        self.axis
    }

    /// True when the cylinder is exactly zero.
    ///
    /// ```
    /// assert!(lensplane_core::Rx::sphere_only(2.0)?.is_spherical());
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn is_spherical(&self) -> bool {
        self.cylinder == 0.0
    }

    /// The other cylinder form: S' = S + C, C' = −C, axis ± 90 kept in 1–180.
    /// A spherical prescription is returned unchanged.
    ///
    /// ```
    /// let rx = lensplane_core::Rx::new(2.0, 1.0, 170)?;
    /// assert_eq!(rx.transpose().to_string(), "+3.00 -1.00 ×080");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn transpose(&self) -> Rx {
        if self.is_spherical() {
            return *self;
        }
        Rx::raw(self.sphere + self.cylinder, -self.cylinder, perpendicular(self.axis))
    }

    /// Minus-cylinder form (unchanged when already minus or spherical).
    ///
    /// ```
    /// let rx = lensplane_core::Rx::new(-3.0, 1.0, 90)?;
    /// assert_eq!(rx.to_minus_cyl().to_string(), "-2.00 -1.00 ×180");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn to_minus_cyl(&self) -> Rx {
        if self.cylinder > 0.0 {
            self.transpose()
        } else {
            *self
        }
    }

    /// Plus-cylinder form (unchanged when already plus or spherical).
    ///
    /// ```
    /// let rx = lensplane_core::Rx::new(-2.0, -1.0, 180)?;
    /// assert_eq!(rx.to_plus_cyl().to_string(), "-3.00 +1.00 ×090");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn to_plus_cyl(&self) -> Rx {
        if self.cylinder < 0.0 {
            self.transpose()
        } else {
            *self
        }
    }

    /// Spherical equivalent S + C/2 (the same in either cylinder form).
    ///
    /// ```
    /// assert_eq!(lensplane_core::Rx::new(-2.0, -0.5, 90)?.spherical_equivalent(), -2.25);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn spherical_equivalent(&self) -> f64 {
        self.sphere + self.cylinder / 2.0
    }

    /// The two principal meridians: the sphere acts in the meridian along the
    /// axis, sphere + cylinder in the meridian 90° away.
    ///
    /// ```
    /// let cross = lensplane_core::Rx::new(-8.0, -2.0, 180)?.meridians();
    /// assert_eq!((cross.first().power, cross.first().axis), (-8.0, 180));
    /// assert_eq!((cross.second().power, cross.second().axis), (-10.0, 90));
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn meridians(&self) -> PowerCross {
        PowerCross::raw(
            Meridian {
                power: self.sphere,
                axis: self.axis,
            },
            Meridian {
                power: self.sphere + self.cylinder,
                axis: perpendicular(self.axis),
            },
        )
    }

    /// Power vector (M, J0, J45) after Thibos, Wheeler & Horner (1997).
    ///
    /// ```
    /// let v = lensplane_core::Rx::new(-2.0, -1.0, 180)?.power_vector();
    /// assert_eq!((v.m, v.j0, v.j45), (-2.5, 0.5, 0.0));
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn power_vector(&self) -> PowerVector {
        PowerVector::from_rx(self)
    }
}

/// The meridian 90° away, kept in 1–180.
pub(crate) fn perpendicular(axis: u16) -> u16 {
    if axis > 90 {
        axis - 90
    } else {
        axis + 90
    }
}
