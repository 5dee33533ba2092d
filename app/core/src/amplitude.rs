//! Amplitude of accommodation by age (Hofstetter 1950) and the tentative
//! add that keeps part of it in reserve.
//!
//! Hofstetter, H. W. "Useful age-amplitude formula", Optometry World 1950
//! (citation details from memory; formulas verified): minimum 15 − 0.25·age,
//! average 18.5 − 0.30·age, maximum 25 − 0.40·age, clamped at 0.

use crate::rounding::{round_to_step, TieRule};
use crate::Age;

/// Hofstetter's minimum, average and maximum amplitude for an age, D.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Amplitude {
    /// 15 − 0.25·age.
    pub minimum: f64,
    /// 18.5 − 0.30·age.
    pub average: f64,
    /// 25 − 0.40·age.
    pub maximum: f64,
}

/// Hofstetter's amplitudes for `age` (clamped at 0).
///
/// ```
/// use lensplane_core::{hofstetter, Age};
/// let a = hofstetter(Age::new(40)?);
/// assert_eq!((a.minimum, a.average, a.maximum), (5.0, 6.5, 9.0));
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn hofstetter(age: Age) -> Amplitude {
    let y = f64::from(age.years());
    let clamp = |x: f64| x.max(0.0);
    Amplitude {
        minimum: clamp(15.0 - 0.25 * y),
        average: clamp(18.5 - 0.30 * y),
        maximum: clamp(25.0 - 0.40 * y),
    }
}

/// True where Hofstetter's population figures are least reliable: age 60
/// and over, and children under 10 (a decision; the notes say "children").
///
/// ```
/// use lensplane_core::{amplitude_reliable, Age};
/// assert!(amplitude_reliable(Age::new(45)?));
/// assert!(!amplitude_reliable(Age::new(60)?));
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn amplitude_reliable(age: Age) -> bool {
    (10..60).contains(&age.years())
}

/// A tentative add: the demand less the part of the amplitude the patient
/// can use comfortably.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TentativeAdd {
    /// demand − amplitude/2 (half kept in reserve), clamped at 0.
    pub half_reserve: f64,
    /// demand − (2/3)·amplitude (one-third kept in reserve), clamped at 0.
    pub third_reserve: f64,
    /// `half_reserve` on quarter steps.
    pub half_reserve_rounded: f64,
    /// `third_reserve` on quarter steps.
    pub third_reserve_rounded: f64,
}

/// The tentative add for a dioptric `demand` and an `amplitude`.
///
/// ```
/// use lensplane_core::{tentative_add, TieRule};
/// let t = tentative_add(2.5, 2.5, TieRule::TowardPlus);
/// assert_eq!((t.half_reserve, t.half_reserve_rounded), (1.25, 1.25));
/// assert_eq!(t.third_reserve_rounded, 0.75);
/// ```
pub fn tentative_add(demand: f64, amplitude: f64, tie: TieRule) -> TentativeAdd {
    let half = (demand - amplitude / 2.0).max(0.0);
    let third = (demand - amplitude * 2.0 / 3.0).max(0.0);
    TentativeAdd {
        half_reserve: half,
        third_reserve: third,
        half_reserve_rounded: round_to_step(half, 0.25, tie),
        third_reserve_rounded: round_to_step(third, 0.25, tie),
    }
}
