//! Over-refraction: the worn lens combined with what is found over it, by
//! dioptric power matrices (Harris; Keating) so that crossed axes combine as
//! they do optically. Never sphere to sphere and cylinder to cylinder.
//!
//! The chain: the over-refraction at its vertex distance travels to the
//! worn lens plane, L·(I − dL)⁻¹ → the two add as matrices → the sum
//! travels to the cornea (the ocular refraction K) → the lens at the target
//! plane t is K·(I + tK)⁻¹.
//!
//! Toric rotation, "left add, right subtract" (LARS, common practice): a
//! lens that turned θ clockwise as the examiner sees it sits at
//! (nominal axis − θ) in ISO 8429 angles; the chain uses that axis, and the
//! lens to order gets θ added back, so that it sits where it must once it
//! has turned the same way.

use crate::error::{Error, ErrorKind, Field};
use crate::format::fmt_length;
use crate::{PowerMatrix, Rotation, Rx, VertexDistance};

/// The three planes of an over-refraction, each a distance in front of the
/// cornea (0: a contact lens at the cornea).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct OverRefractionPlanes {
    /// Where the worn lens sits.
    pub worn: VertexDistance,
    /// Where the over-refraction was found (trial frame or refractor);
    /// at or in front of the worn lens.
    pub over_refraction: VertexDistance,
    /// Where the lens to order will sit.
    pub target: VertexDistance,
}

/// Every step of the chain as a power matrix, in the eye's frame (axes as
/// the lenses sit).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct OverRefractionChain {
    /// The over-refraction carried to the worn lens plane.
    pub over_refraction_at_worn: PowerMatrix,
    /// Worn lens + over-refraction at the worn lens plane.
    pub combined_at_worn: PowerMatrix,
    /// The ocular refraction K at the cornea.
    pub ocular_refraction: PowerMatrix,
    /// The lens needed at the target plane.
    pub at_target: PowerMatrix,
}

/// Work the chain for one eye. `worn` is the worn lens as it sits on the
/// eye (see [`worn_on_eye`]). An error when the over-refraction is placed
/// behind the worn lens, or when a step has no finite answer.
///
/// ```
/// use lensplane_core::*;
/// // O2 [derived]: -5.00 -0.75 ×090 contact lens, over-refraction -0.75 -0.50 ×180 at 12 mm.
/// let planes = OverRefractionPlanes {
///     worn: VertexDistance::CORNEA,
///     over_refraction: VertexDistance::SPECTACLES,
///     target: VertexDistance::CORNEA,
/// };
/// let chain = combine_over_refraction(
///     &PowerMatrix::from_rx(&Rx::new(-5.0, -0.75, 90)?),
///     &PowerMatrix::from_rx(&Rx::new(-0.75, -0.5, 180)?),
///     &planes,
/// )?;
/// let p = chain.at_target.principal_powers();
/// assert!((p.most_plus - -6.2315).abs() < 5e-5 && (p.cylinder() - -0.2618).abs() < 5e-5);
/// assert_eq!(p.whole_axis(), 90);
///
/// let behind = OverRefractionPlanes { worn: VertexDistance::SPECTACLES, over_refraction: VertexDistance::from_mm(10.0)?, ..planes };
/// assert_eq!(combine_over_refraction(&PowerMatrix::ZERO, &PowerMatrix::ZERO, &behind).unwrap_err().to_string(),
///            "vertex distance 10 mm puts the over-refraction behind the worn lens at 12 mm");
/// # Ok::<(), Error>(())
/// ```
pub fn combine_over_refraction(
    worn: &PowerMatrix,
    over_refraction: &PowerMatrix,
    planes: &OverRefractionPlanes,
) -> Result<OverRefractionChain, Error> {
    let (worn_mm, at_mm) = (planes.worn.mm(), planes.over_refraction.mm());
    if at_mm < worn_mm {
        return Err(Error::new(
            ErrorKind::BehindWornLens {
                at: fmt_length(at_mm),
                worn: fmt_length(worn_mm),
            },
            Field::OverRefractionVertex,
            None,
        ));
    }
    let over_refraction_at_worn = over_refraction.moved(planes.over_refraction.metres() - planes.worn.metres())?;
    let combined_at_worn = worn.plus(&over_refraction_at_worn);
    let ocular_refraction = combined_at_worn.moved(planes.worn.metres())?;
    let at_target = ocular_refraction.moved(-planes.target.metres())?;
    Ok(OverRefractionChain {
        over_refraction_at_worn,
        combined_at_worn,
        ocular_refraction,
        at_target,
    })
}

/// The worn lens as it sits on the eye: a lens that turned θ clockwise as
/// the examiner sees it (to the examiner's left) sits at (nominal axis − θ)
/// in ISO 8429 angles.
///
/// ```
/// use lensplane_core::*;
/// // LARS [common practice]: ×180 turned 10° to the examiner's left sits at ×170.
/// let on_eye = worn_on_eye(&Rx::new(-2.0, -1.0, 180)?, Rotation::from_clockwise(10)?);
/// assert_eq!(on_eye.to_rx().to_string(), "-2.00 -1.00 ×170");
/// # Ok::<(), Error>(())
/// ```
pub fn worn_on_eye(nominal: &Rx, rotation: Rotation) -> PowerMatrix {
    PowerMatrix::from_rx(nominal).rotated(-f64::from(rotation.clockwise()))
}

/// The lens to order for one that must sit as `needed`, when the lens will
/// turn by `rotation` as the worn one did: "left add, right subtract" —
/// the clockwise rotation is added to the axis.
///
/// ```
/// use lensplane_core::*;
/// let needed = PowerMatrix::from_rx(&Rx::new(-2.0, -1.0, 180)?);
/// // Turns 10° to the examiner's left: left add, order ×010.
/// assert_eq!(lars_order(&needed, Rotation::from_clockwise(10)?).to_rx().to_string(), "-2.00 -1.00 ×010");
/// // Turns 10° to the examiner's right: right subtract, order ×170.
/// assert_eq!(lars_order(&needed, Rotation::from_clockwise(-10)?).to_rx().to_string(), "-2.00 -1.00 ×170");
/// # Ok::<(), Error>(())
/// ```
pub fn lars_order(needed: &PowerMatrix, rotation: Rotation) -> PowerMatrix {
    needed.rotated(f64::from(rotation.clockwise()))
}
