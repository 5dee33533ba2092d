//! Near vision through a correction: accommodation, the relief an add gives,
//! and the equivalent add at another plane, by the vergence chain.
//!
//! Textbook method (6.1–6.3): object vergence at the spectacle plane
//! L = 1/l (l < 0); leaving the lens L' = L + F (+ add); at the eye
//! L_e = L' / (1 − d·L'); ocular refraction K = F / (1 − d·F); ocular
//! accommodation A = K − L_e. Derived here (6.4–6.5): the add at another
//! plane d2 that leaves the same vergence at the eye, P2 = L_e/(1 + d2·L_e)
//! − L2 with L2 = −1/(l_e − d2), add2 = P2 − F2.
//!
//! Not the shortcut V(F + A) − V(F), which treats the near prescription as
//! if the object were at infinity (wrong by up to ~0.6 D at ±6 D).

use crate::error::Error;
use crate::vertex::effective_power;
use crate::{Measured, ReadingDistance, VertexDistance};

/// The geometry of a near task: where the object is, where the spectacles
/// are, and where the new lens will be.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct NearGeometry {
    /// Vertex distance of the spectacles the add was found in.
    pub spectacle_vertex: VertexDistance,
    /// Vertex distance of the new lens (0: contact lens).
    pub target: VertexDistance,
    /// Reading distance as entered.
    pub reading: ReadingDistance,
    /// Whether the reading distance is from the spectacle plane or the eye.
    pub measured: Measured,
}

impl NearGeometry {
    /// Object distance from the spectacle lens, metres (positive).
    ///
    /// ```
    /// use lensplane_core::*;
    /// let g = NearGeometry { spectacle_vertex: VertexDistance::SPECTACLES, target: VertexDistance::CORNEA,
    ///                        reading: ReadingDistance::from_cm(40.0)?, measured: Measured::FromEye };
    /// assert!((g.from_lens_m() - 0.388).abs() < 1e-12);
    /// # Ok::<(), Error>(())
    /// ```
    pub fn from_lens_m(&self) -> f64 {
        match self.measured {
            Measured::FromLens => self.reading.metres(),
            Measured::FromEye => self.reading.metres() - self.spectacle_vertex.metres(),
        }
    }

    /// Object distance from the eye (corneal vertex), metres (positive).
    ///
    /// ```
    /// use lensplane_core::*;
    /// let g = NearGeometry { spectacle_vertex: VertexDistance::SPECTACLES, target: VertexDistance::CORNEA,
    ///                        reading: ReadingDistance::from_cm(40.0)?, measured: Measured::FromLens };
    /// assert!((g.from_eye_m() - 0.412).abs() < 1e-12);
    /// # Ok::<(), Error>(())
    /// ```
    pub fn from_eye_m(&self) -> f64 {
        self.from_lens_m() + self.spectacle_vertex.metres()
    }

    /// Object vergence at the spectacle plane, L = −1/distance (negative).
    ///
    /// ```
    /// use lensplane_core::*;
    /// let g = NearGeometry { spectacle_vertex: VertexDistance::SPECTACLES, target: VertexDistance::CORNEA,
    ///                        reading: ReadingDistance::from_cm(40.0)?, measured: Measured::FromLens };
    /// assert_eq!(g.object_vergence_at_spectacles(), -2.5);
    /// # Ok::<(), Error>(())
    /// ```
    pub fn object_vergence_at_spectacles(&self) -> f64 {
        -1.0 / self.from_lens_m()
    }

    /// Object vergence at the target lens plane.
    ///
    /// ```
    /// use lensplane_core::*;
    /// let g = NearGeometry { spectacle_vertex: VertexDistance::SPECTACLES, target: VertexDistance::CORNEA,
    ///                        reading: ReadingDistance::from_cm(40.0)?, measured: Measured::FromLens };
    /// assert!((g.object_vergence_at_target() - -2.4272).abs() < 1e-4);
    /// # Ok::<(), Error>(())
    /// ```
    pub fn object_vergence_at_target(&self) -> f64 {
        -1.0 / (self.from_eye_m() - self.target.metres())
    }
}

/// Near figures for one power (a principal meridian, or the spherical
/// equivalent), dioptres.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct NearFigures {
    /// Meridian direction in degrees; `None` for the spherical-equivalent
    /// summary.
    pub meridian: Option<u16>,
    /// Distance power at the spectacle plane.
    pub distance_power: f64,
    /// Ocular refraction K (the distance power at the cornea).
    pub ocular_refraction: f64,
    /// Distance power at the target plane.
    pub distance_power_at_target: f64,
    /// Ocular accommodation through the spectacles without the add.
    pub accommodation_spectacles: f64,
    /// Ocular accommodation through the spectacles with the add.
    pub accommodation_spectacles_with_add: f64,
    /// Ocular accommodation through the target lens without an add (with a
    /// contact lens: 1 / distance from the eye).
    pub accommodation_target: f64,
    /// Relief the spectacle add gives at the eye (accommodation saved).
    pub relief_at_eye: f64,
    /// The add at the target plane that gives the same near effect (exact).
    pub add_at_target: f64,
    /// Near power at the target plane (distance power there + that add).
    pub near_power_at_target: f64,
    /// Ocular accommodation through the target lens with the orderable add
    /// (`add_at_target` rounded); what the patient will actually need.
    pub accommodation_target_with_rounded_add: f64,
}

/// Work out the near figures for one distance power `power` (at the
/// spectacle plane) with spectacle `add`, and the add rounded for ordering
/// (`rounded_add`; pass the result of rounding `add_at_target` — computed
/// here first if `None`, then the exact add is used).
///
/// ```
/// use lensplane_core::*;
/// let g = NearGeometry { spectacle_vertex: VertexDistance::SPECTACLES, target: VertexDistance::CORNEA,
///                        reading: ReadingDistance::from_cm(40.0)?, measured: Measured::FromLens };
/// let n = near_figures(-6.0, 2.5, &g, None)?;
/// assert!((n.accommodation_spectacles - 2.1162).abs() < 1e-4);
/// assert!((n.accommodation_target - 2.4272).abs() < 1e-4);
/// assert!((n.add_at_target - 2.4272).abs() < 1e-4);
/// # Ok::<(), Error>(())
/// ```
pub fn near_figures(power: f64, add: f64, g: &NearGeometry, rounded_add: Option<f64>) -> Result<NearFigures, Error> {
    let d = g.spectacle_vertex.metres();
    let d2 = g.target.metres();
    let l = g.object_vergence_at_spectacles();
    let k = effective_power(power, d)?;
    let at_eye = |leaving: f64| effective_power(leaving, d);
    let le_plain = at_eye(l + power)?;
    let le_add = at_eye(l + power + add)?;
    let f2 = effective_power(k, -d2)?;
    let l2 = g.object_vergence_at_target();
    let at_eye_from_target = |leaving: f64| effective_power(leaving, d2);
    let target_plain = at_eye_from_target(l2 + f2)?;
    let p2 = effective_power(le_add, -d2)? - l2;
    let add2 = p2 - f2;
    let used = rounded_add.unwrap_or(add2);
    let target_rounded = at_eye_from_target(l2 + f2 + used)?;
    Ok(NearFigures {
        meridian: None,
        distance_power: power,
        ocular_refraction: k,
        distance_power_at_target: f2,
        accommodation_spectacles: k - le_plain,
        accommodation_spectacles_with_add: k - le_add,
        accommodation_target: k - target_plain,
        relief_at_eye: le_add - le_plain,
        add_at_target: add2,
        near_power_at_target: p2,
        accommodation_target_with_rounded_add: k - target_rounded,
    })
}
