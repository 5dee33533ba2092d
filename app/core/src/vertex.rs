//! Vertex compensation: the same correction at another distance from the
//! eye. F' = F / (1 − δ·F), δ = d_from − d_to in metres (positive when the
//! correction moves toward the eye). Cylinders: each principal meridian on
//! its own, then recombined (never the cylinder by itself).

use crate::error::{Error, ErrorKind, Field};
use crate::limits::RESULT_LIMIT;
use crate::{PowerCross, Rx, VertexDistance};

/// The power that has the same far point after moving the lens by
/// `shift_m` metres toward the eye (negative: away): F / (1 − δF).
///
/// An error when the far point lies at the new lens plane (1 − δF = 0) or
/// so close to it that the answer exceeds ±100 D, which with the input
/// limits also covers every case where the far point falls between the old
/// and the new plane.
///
/// ```
/// let f = lensplane_core::effective_power(-4.0, 0.012)?;
/// assert!((f - -3.8168).abs() < 5e-5);
/// assert!(lensplane_core::effective_power(1000.0 / 12.0, 0.012).is_err());
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn effective_power(power: f64, shift_m: f64) -> Result<f64, Error> {
    if shift_m == 0.0 {
        return Ok(power);
    }
    let result = power / (1.0 - shift_m * power);
    // A far point at the new plane divides by zero (an infinite result);
    // near it the result passes the limit.
    if !result.is_finite() || result.abs() > RESULT_LIMIT {
        return Err(Error::new(ErrorKind::Singular { power }, Field::Result, None));
    }
    Ok(result + 0.0)
}

/// One power moved from one vertex distance to another.
///
/// ```
/// use lensplane_core::{compensate_power, VertexDistance};
/// let f = compensate_power(-10.0, VertexDistance::from_mm(10.0)?, VertexDistance::from_mm(14.0)?)?;
/// assert!((f - -10.4167).abs() < 5e-5);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn compensate_power(power: f64, from: VertexDistance, to: VertexDistance) -> Result<f64, Error> {
    effective_power(power, from.metres() - to.metres())
}

/// Both principal meridians moved.
///
/// ```
/// use lensplane_core::{compensate_meridians, Rx, VertexDistance};
/// let c = compensate_meridians(&Rx::new(-8.0, -2.0, 180)?.meridians(),
///                              VertexDistance::SPECTACLES, VertexDistance::CORNEA)?;
/// assert!((c.second().power - -8.9286).abs() < 5e-5);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn compensate_meridians(cross: &PowerCross, from: VertexDistance, to: VertexDistance) -> Result<PowerCross, Error> {
    cross.try_map_powers(|p| compensate_power(p, from, to))
}

/// A prescription moved from one vertex distance to another, per principal
/// meridian, in the same cylinder form as given.
///
/// ```
/// use lensplane_core::{compensate, Rx, VertexDistance};
/// let rx = Rx::new(-8.0, -2.0, 180)?;
/// let cl = compensate(&rx, VertexDistance::SPECTACLES, VertexDistance::CORNEA)?;
/// assert_eq!(cl.to_string(), "-7.30 -1.63 ×180");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn compensate(rx: &Rx, from: VertexDistance, to: VertexDistance) -> Result<Rx, Error> {
    if from == to {
        return Ok(*rx);
    }
    Ok(compensate_meridians(&rx.meridians(), from, to)?.to_rx())
}

#[cfg(test)]
mod tests {
    use super::effective_power;

    #[test]
    fn the_result_limit_holds_exactly_at_its_edge() {
        // 50 D moved 10 mm toward the eye: 50 / (1 − 0.5) = 100 D exactly (F / (1 − dF), as in
        // shared/optics-notes.md §2), the largest result given; a hair more is refused.
        assert_eq!(effective_power(50.0, 0.01).unwrap(), 100.0);
        assert!(effective_power(50.0001, 0.01).is_err());
        // Far from singular (1 − dF = 0.1) yet past the limit: 30 D moved 30 mm gives 300 D.
        assert!(effective_power(30.0, 0.03).is_err());
        // At the singular point itself.
        assert!(effective_power(100.0, 0.01).is_err());
    }

    #[test]
    fn plano_stays_plano_never_a_negative_zero() {
        // A typed "-0" moved anywhere is plano; a negative zero would print with a minus sign
        // wherever a caller formats the sign from the bits.
        assert!(effective_power(-0.0, 0.012).unwrap().is_sign_positive());
    }
}
