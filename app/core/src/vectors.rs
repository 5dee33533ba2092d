//! Power vectors (M, J0, J45) after Thibos, Wheeler & Horner, "Power vectors:
//! an application of Fourier analysis to the description and statistical
//! analysis of refractive error", Optom Vis Sci 1997;74(6):367–375.

use crate::Rx;

/// A prescription as a vector: M = S + C/2, J0 = −(C/2)·cos 2α,
/// J45 = −(C/2)·sin 2α (dioptres). The same in either cylinder form, and
/// additive, so the difference of two vectors is the lens that would turn
/// one into the other (used for residuals, including obliquely crossed
/// cylinders from a rotated toric lens).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PowerVector {
    /// Spherical equivalent, dioptres.
    pub m: f64,
    /// Cross-cylinder at 0° and 90°, dioptres.
    pub j0: f64,
    /// Cross-cylinder at 45° and 135°, dioptres.
    pub j45: f64,
}

impl PowerVector {
    pub(crate) fn from_rx(rx: &Rx) -> PowerVector {
        let half = rx.cylinder() / 2.0;
        let (sin, cos) = sin_cos_degrees(2.0 * f64::from(rx.axis()));
        PowerVector {
            m: rx.sphere() + half,
            j0: -half * cos + 0.0,
            j45: -half * sin + 0.0,
        }
    }

    /// Blur strength B = √(M² + J0² + J45²), dioptres.
    ///
    /// ```
    /// let v = lensplane_core::PowerVector { m: 3.0, j0: 0.0, j45: 4.0 };
    /// assert_eq!(v.blur_strength(), 5.0);
    /// ```
    pub fn blur_strength(&self) -> f64 {
        (self.m * self.m + self.j0 * self.j0 + self.j45 * self.j45).sqrt()
    }

    /// The astigmatic part as a (positive) cylinder size: 2·√(J0² + J45²).
    ///
    /// ```
    /// let v = lensplane_core::Rx::new(-2.0, -1.5, 33)?.power_vector();
    /// assert!((v.cylinder_size() - 1.5).abs() < 1e-12);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn cylinder_size(&self) -> f64 {
        2.0 * (self.j0 * self.j0 + self.j45 * self.j45).sqrt()
    }

    /// Component-wise sum `self + other`: lenses at one plane add as
    /// vectors.
    ///
    /// ```
    /// use lensplane_core::Rx;
    /// // Crossed equal cylinders at one plane: -0.50 ×180 + -0.50 ×090 is -0.50 DS.
    /// let s = Rx::new(0.0, -0.5, 180)?.power_vector().plus(&Rx::new(0.0, -0.5, 90)?.power_vector());
    /// assert_eq!((s.m, s.j0.abs(), s.j45.abs()), (-0.5, 0.0, 0.0));
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn plus(&self, other: &PowerVector) -> PowerVector {
        PowerVector {
            m: self.m + other.m,
            j0: self.j0 + other.j0,
            j45: self.j45 + other.j45,
        }
    }

    /// Component-wise difference `self − other`.
    ///
    /// ```
    /// use lensplane_core::Rx;
    /// let d = Rx::new(-2.0, -1.0, 90)?.power_vector().minus(&Rx::sphere_only(-2.5)?.power_vector());
    /// assert!(d.m.abs() < 1e-12);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn minus(&self, other: &PowerVector) -> PowerVector {
        PowerVector {
            m: self.m - other.m,
            j0: self.j0 - other.j0,
            j45: self.j45 - other.j45,
        }
    }
}

/// sin and cos of an angle in degrees, exact at multiples of 90°.
pub(crate) fn sin_cos_degrees(deg: f64) -> (f64, f64) {
    let d = deg.rem_euclid(360.0);
    if d == 0.0 {
        (0.0, 1.0)
    } else if d == 90.0 {
        (1.0, 0.0)
    } else if d == 180.0 {
        (0.0, -1.0)
    } else if d == 270.0 {
        (-1.0, 0.0)
    } else {
        d.to_radians().sin_cos()
    }
}

#[cfg(test)]
mod tests {
    use super::PowerVector;
    use crate::Rx;

    #[test]
    fn a_sphere_has_no_negative_zero_in_its_vector() {
        // J0 = −C/2·cos 2θ and J45 = −C/2·sin 2θ are exactly zero for a sphere; kept as +0 so
        // an angle taken from them (atan2 tells −0 from +0) never flips.
        let v = PowerVector::from_rx(&Rx::sphere_only(-3.0).unwrap());
        assert!(v.j0.is_sign_positive() && v.j45.is_sign_positive(), "{v:?}");
    }
}
