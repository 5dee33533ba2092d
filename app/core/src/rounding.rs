//! Rounding to orderable powers: quarter steps with an explicit tie rule,
//! and availability ladders (finer steps near zero, coarser beyond).

use serde::{Deserialize, Serialize};

/// How to round a value that lies exactly halfway between two steps.
/// Language defaults (banker's rounding, half away from zero) would decide
/// silently; here the choice is explicit.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default, Serialize, Deserialize)]
pub enum TieRule {
    /// To the algebraically more plus value (avoids over-minusing; default,
    /// common practice).
    #[default]
    TowardPlus,
    /// To the algebraically more minus value.
    TowardMinus,
    /// To the larger magnitude.
    AwayFromZero,
    /// To the smaller magnitude.
    TowardZero,
}

/// Tolerance for "exactly on a step" / "exactly halfway" in step units.
const EPS: f64 = 1e-9;

/// True when `x` is a whole number of `step`s (within 1e-9 of a step).
///
/// ```
/// assert!(lensplane_core::is_on_step(-2.25, 0.25));
/// assert!(!lensplane_core::is_on_step(-2.30, 0.25));
/// ```
pub fn is_on_step(x: f64, step: f64) -> bool {
    let q = x / step;
    (q - q.round()).abs() < EPS * q.abs().max(1.0)
}

/// Round `x` to a whole number of `step`s, ties by `tie`.
///
/// ```
/// use lensplane_core::{round_to_step, TieRule};
/// assert_eq!(round_to_step(-3.875, 0.25, TieRule::TowardPlus), -3.75);
/// assert_eq!(round_to_step(-3.875, 0.25, TieRule::TowardMinus), -4.0);
/// assert_eq!(round_to_step(4.2017, 0.25, TieRule::TowardPlus), 4.25);
/// ```
pub fn round_to_step(x: f64, step: f64, tie: TieRule) -> f64 {
    let q = x / step;
    let lo = q.floor();
    let frac = q - lo;
    let units = if (frac - 0.5).abs() < EPS * q.abs().max(1.0) {
        let hi = lo + 1.0;
        match tie {
            TieRule::TowardPlus => hi,
            TieRule::TowardMinus => lo,
            TieRule::AwayFromZero => if hi.abs() >= lo.abs() { hi } else { lo },
            TieRule::TowardZero => if hi.abs() <= lo.abs() { hi } else { lo },
        }
    } else {
        q.round()
    };
    units * step + 0.0
}
