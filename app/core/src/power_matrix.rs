//! Dioptric power matrices (Harris; Keating, *Geometric, Physical and
//! Visual Optics*): a thin sphero-cylinder as a symmetric 2×2 matrix, so
//! lenses at one plane add as matrices and obliquely crossed cylinders need
//! no special case.

use crate::error::{Error, ErrorKind, Field};
use crate::limits::RESULT_LIMIT;
use crate::rx::clean;
use crate::vectors::sin_cos_degrees;
use crate::{PowerVector, Rx};

/// A cylinder smaller than this (dioptres) is taken as none: below it the
/// axis is rounding noise, not a direction.
const NO_CYLINDER: f64 = 1e-9;

/// The dioptric power matrix of a thin lens (or a vergence),
/// F = [[S + C·sin²α, −C·sinα·cosα], [−C·sinα·cosα, S + C·cos²α]], in
/// dioptres, α the axis in ISO 8429 degrees. Symmetric, so three entries
/// are held. The same as the power vector in another layout:
/// F = [[M + J0, J45], [J45, M − J0]].
///
/// ```
/// use lensplane_core::{PowerMatrix, Rx};
/// let f = PowerMatrix::from_rx(&Rx::new(-2.0, -1.0, 90)?);
/// // α = 90°: sin α = 1, cos α = 0 → [[S + C, 0], [0, S]].
/// assert_eq!(f.entries(), [[-3.0, 0.0], [0.0, -2.0]]);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PowerMatrix {
    xx: f64,
    xy: f64,
    yy: f64,
}

/// A power matrix taken apart: its two principal powers and the direction
/// of the more plus one (the minus-cylinder axis), unrounded.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PrincipalPowers {
    /// The more plus principal power (the sphere in minus-cylinder form), D.
    pub most_plus: f64,
    /// The more minus principal power (sphere + cylinder), D.
    pub most_minus: f64,
    /// Direction of the `most_plus` meridian, degrees in (0, 180]; 180 when
    /// the two powers are equal (no cylinder).
    pub axis: f64,
}

impl PrincipalPowers {
    /// The cylinder in minus-cylinder form (≤ 0).
    ///
    /// ```
    /// let p = lensplane_core::PrincipalPowers { most_plus: -1.0, most_minus: -3.5, axis: 20.0 };
    /// assert_eq!(p.cylinder(), -2.5);
    /// ```
    pub fn cylinder(&self) -> f64 {
        clean(self.most_minus - self.most_plus)
    }

    /// The axis to the nearest whole degree, 1–180 (180, never 0); half
    /// degrees round up (172.5 → 173, 0.4 → 180).
    ///
    /// ```
    /// use lensplane_core::PrincipalPowers;
    /// let p = |axis| PrincipalPowers { most_plus: 0.0, most_minus: -1.0, axis };
    /// assert_eq!(p(172.5).whole_axis(), 173);
    /// assert_eq!(p(0.4).whole_axis(), 180);
    /// assert_eq!(p(179.6).whole_axis(), 180);
    /// assert_eq!(p(0.6).whole_axis(), 1);
    /// ```
    pub fn whole_axis(&self) -> u16 {
        whole_degrees(self.axis)
    }
}

/// An angle in degrees as a whole-degree axis 1–180 (half up, 0 → 180).
pub(crate) fn whole_degrees(axis: f64) -> u16 {
    let a = (axis.rem_euclid(180.0) + 0.5).floor();
    // `a` lies in 0..=180 (exactly 180 only for angles just below 180).
    match a as u16 {
        0 | 180.. => 180,
        r => r,
    }
}

impl PowerMatrix {
    /// The zero matrix: plano.
    pub const ZERO: PowerMatrix = PowerMatrix {
        xx: 0.0,
        xy: 0.0,
        yy: 0.0,
    };

    /// The matrix of a prescription (either cylinder form gives the same
    /// matrix).
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, Rx};
    /// let minus = PowerMatrix::from_rx(&Rx::new(-2.0, -1.0, 30)?);
    /// let plus = PowerMatrix::from_rx(&Rx::new(-3.0, 1.0, 120)?);
    /// let (a, b) = (minus.entries(), plus.entries());
    /// for i in 0..2 { for j in 0..2 { assert!((a[i][j] - b[i][j]).abs() < 1e-12); } }
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn from_rx(rx: &Rx) -> PowerMatrix {
        PowerMatrix::from_power_vector(&rx.power_vector())
    }

    /// The matrix of a power vector: [[M + J0, J45], [J45, M − J0]].
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, PowerVector};
    /// let f = PowerMatrix::from_power_vector(&PowerVector { m: -2.5, j0: 0.5, j45: 0.0 });
    /// assert_eq!(f.entries(), [[-2.0, 0.0], [0.0, -3.0]]);
    /// ```
    pub fn from_power_vector(v: &PowerVector) -> PowerMatrix {
        PowerMatrix {
            xx: clean(v.m + v.j0),
            xy: clean(v.j45),
            yy: clean(v.m - v.j0),
        }
    }

    /// A matrix from its entries (`xy` is both off-diagonal entries).
    /// Every entry must be a finite number.
    ///
    /// ```
    /// use lensplane_core::PowerMatrix;
    /// assert!(PowerMatrix::new(-2.0, 0.5, -3.0).is_ok());
    /// assert_eq!(PowerMatrix::new(f64::NAN, 0.0, 0.0).unwrap_err().to_string(), "result is not a number");
    /// ```
    pub fn new(xx: f64, xy: f64, yy: f64) -> Result<PowerMatrix, Error> {
        if [xx, xy, yy].iter().all(|x| x.is_finite()) {
            Ok(PowerMatrix {
                xx: clean(xx),
                xy: clean(xy),
                yy: clean(yy),
            })
        } else {
            Err(Error::new(ErrorKind::NotANumber, Field::Result, None))
        }
    }

    /// The entries, row by row: `[[xx, xy], [xy, yy]]`.
    ///
    /// ```
    /// let f = lensplane_core::PowerMatrix::new(1.0, 2.0, 3.0)?;
    /// assert_eq!(f.entries(), [[1.0, 2.0], [2.0, 3.0]]);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn entries(&self) -> [[f64; 2]; 2] {
        [[self.xx, self.xy], [self.xy, self.yy]]
    }

    /// The sum: two thin lenses at one plane.
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, Rx};
    /// // O1 [derived]: -1.00 -0.50 ×180 and +0.25 -0.50 ×090 at one plane make -1.25 DS.
    /// let sum = PowerMatrix::from_rx(&Rx::new(-1.0, -0.5, 180)?).plus(&PowerMatrix::from_rx(&Rx::new(0.25, -0.5, 90)?));
    /// assert_eq!(sum.to_rx().to_string(), "-1.25 DS");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn plus(&self, other: &PowerMatrix) -> PowerMatrix {
        PowerMatrix {
            xx: clean(self.xx + other.xx),
            xy: clean(self.xy + other.xy),
            yy: clean(self.yy + other.yy),
        }
    }

    /// The difference `self − other`.
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, Rx};
    /// let a = PowerMatrix::from_rx(&Rx::new(-2.0, -1.0, 45)?);
    /// assert_eq!(a.minus(&a), PowerMatrix::ZERO);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn minus(&self, other: &PowerMatrix) -> PowerMatrix {
        PowerMatrix {
            xx: clean(self.xx - other.xx),
            xy: clean(self.xy - other.xy),
            yy: clean(self.yy - other.yy),
        }
    }

    /// The same lens turned `degrees` counter-clockwise as seen facing the
    /// patient (the direction ISO 8429 angles increase): R·F·Rᵀ. Its axis
    /// grows by `degrees`; a negative angle turns it clockwise.
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, Rx};
    /// let f = PowerMatrix::from_rx(&Rx::new(-2.0, -1.0, 180)?);
    /// assert_eq!(f.rotated(-10.0).to_rx().to_string(), "-2.00 -1.00 ×170");
    /// assert_eq!(f.rotated(25.0).to_rx().to_string(), "-2.00 -1.00 ×025");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn rotated(&self, degrees: f64) -> PowerMatrix {
        let v = self.power_vector();
        let (sin, cos) = sin_cos_degrees(2.0 * degrees);
        PowerMatrix::from_power_vector(&PowerVector {
            m: v.m,
            j0: v.j0 * cos - v.j45 * sin,
            j45: v.j0 * sin + v.j45 * cos,
        })
    }

    /// The vergence after travelling `metres` toward the eye (negative:
    /// away): L·(I − d·L)⁻¹, the matrix form of F / (1 − dF). Moving a lens
    /// toward the eye with the same far point is the same operation.
    ///
    /// An error, never Infinity or NaN, when (I − dL) is singular or a
    /// principal power of the result would exceed ±100 D (the far point at,
    /// or practically at, the new plane), as for a single power.
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, Rx};
    /// // C1 [textbook]: -8.00 -2.00 ×180 at 12 mm is -7.30 -1.63 ×180 at the cornea.
    /// let f = PowerMatrix::from_rx(&Rx::new(-8.0, -2.0, 180)?);
    /// assert_eq!(f.moved(0.012)?.to_rx().to_string(), "-7.30 -1.63 ×180");
    /// let singular = PowerMatrix::from_rx(&Rx::sphere_only(25.0)?);
    /// assert_eq!(singular.moved(0.04).unwrap_err().to_string(),
    ///            "no finite lens: the far point of +25.00 lies at the new lens plane");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn moved(&self, metres: f64) -> Result<PowerMatrix, Error> {
        if metres == 0.0 {
            return Ok(*self);
        }
        let d = metres;
        let p = self.principal_powers();
        for power in [p.most_plus, p.most_minus] {
            let denominator = 1.0 - d * power;
            let result = power / denominator;
            if denominator.abs() < 1e-12 || !result.is_finite() || result.abs() > RESULT_LIMIT {
                return Err(Error::new(ErrorKind::Singular { power }, Field::Result, None));
            }
        }
        // (L − d·det(L)·I) / det(I − dL): the closed form of L·(I − dL)⁻¹.
        let (a, b, c) = (self.xx, self.xy, self.yy);
        let det_l = a * c - b * b;
        let det = (1.0 - d * a) * (1.0 - d * c) - d * d * b * b;
        PowerMatrix::new((a - d * det_l) / det, b / det, (c - d * det_l) / det)
    }

    /// The principal powers and the exact axis of the more plus one, from
    /// the closed-form eigen-decomposition of a symmetric 2×2 matrix:
    /// λ = M ± √(J0² + J45²), axis = ½·atan2(J45, J0).
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, Rx};
    /// // Obliquely crossed cylinders [derived]: -3.00 -1.00 ×030 + +0.25 -0.75 ×075.
    /// let sum = PowerMatrix::from_rx(&Rx::new(-3.0, -1.0, 30)?).plus(&PowerMatrix::from_rx(&Rx::new(0.25, -0.75, 75)?));
    /// let p = sum.principal_powers();
    /// assert!((p.most_plus - -3.0).abs() < 1e-12 && (p.most_minus - -4.25).abs() < 1e-12);
    /// assert!((p.axis - 48.4349).abs() < 1e-4);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn principal_powers(&self) -> PrincipalPowers {
        let v = self.power_vector();
        let r = (v.j0 * v.j0 + v.j45 * v.j45).sqrt();
        if r < NO_CYLINDER / 2.0 {
            return PrincipalPowers {
                most_plus: v.m + 0.0,
                most_minus: v.m + 0.0,
                axis: 180.0,
            };
        }
        let mut axis = v.j45.atan2(v.j0).to_degrees() / 2.0;
        // (0, 180]; an axis a rounding error above 0 is 180 as well.
        if axis <= 1e-9 {
            axis += 180.0;
        }
        PrincipalPowers {
            most_plus: clean(v.m + r),
            most_minus: clean(v.m - r),
            axis,
        }
    }

    /// Back to a prescription in minus-cylinder form, the axis to the
    /// nearest whole degree (1–180). The exact axis is
    /// [`PowerMatrix::principal_powers`]'s.
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, Rx};
    /// let rx = Rx::new(1.5, 0.75, 15)?;
    /// assert_eq!(PowerMatrix::from_rx(&rx).to_rx().to_string(), "+2.25 -0.75 ×105");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn to_rx(&self) -> Rx {
        let p = self.principal_powers();
        Rx::raw(p.most_plus, p.cylinder(), p.whole_axis())
    }

    /// The power vector (M, J0, J45) of the matrix.
    ///
    /// ```
    /// use lensplane_core::PowerMatrix;
    /// let v = PowerMatrix::new(-2.0, 0.25, -3.0)?.power_vector();
    /// assert_eq!((v.m, v.j0, v.j45), (-2.5, 0.5, 0.25));
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn power_vector(&self) -> PowerVector {
        PowerVector {
            m: clean((self.xx + self.yy) / 2.0),
            j0: clean((self.xx - self.yy) / 2.0),
            j45: self.xy,
        }
    }

    /// The power in the meridian at `degrees` (ISO 8429): uᵀ·F·u with
    /// u = (cos θ, sin θ), which is S + C·sin²(θ − α). Along a principal
    /// meridian it is that meridian's power.
    ///
    /// ```
    /// use lensplane_core::{PowerMatrix, Rx};
    /// let f = PowerMatrix::from_rx(&Rx::new(-2.0, -1.0, 30)?);
    /// assert!((f.power_in_meridian(30.0) - -2.0).abs() < 1e-12);
    /// assert!((f.power_in_meridian(120.0) - -3.0).abs() < 1e-12);
    /// assert!((f.power_in_meridian(75.0) - -2.5).abs() < 1e-12);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn power_in_meridian(&self, degrees: f64) -> f64 {
        let v = self.power_vector();
        let (sin, cos) = sin_cos_degrees(2.0 * degrees);
        clean(v.m + v.j0 * cos + v.j45 * sin)
    }
}
