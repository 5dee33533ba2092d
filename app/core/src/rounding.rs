//! Rounding to orderable powers: quarter steps with an explicit tie rule,
//! and availability ladders (finer steps near zero, coarser beyond).

use crate::error::{Error, ErrorKind, Field};
use crate::limits::{LADDER_FINE, LADDER_STEP};
use crate::{compensate_meridians, Meridian, PowerCross, PowerVector, Rx, ToricSettings, VertexDistance};

/// How to round a value that lies exactly halfway between two steps.
/// Language defaults (banker's rounding, half away from zero) would decide
/// silently; here the choice is explicit.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default)]
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

impl TieRule {
    /// Of two candidates exactly as near (`lo` < `hi`), the one this rule keeps.
    fn pick(self, lo: f64, hi: f64) -> f64 {
        let nearer_zero = if hi.abs() <= lo.abs() { hi } else { lo };
        let farther = if hi.abs() >= lo.abs() { hi } else { lo };
        match self {
            TieRule::TowardPlus => hi,
            TieRule::TowardMinus => lo,
            TieRule::AwayFromZero => farther,
            TieRule::TowardZero => nearer_zero,
        }
    }
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
        tie.pick(lo, hi)
    } else {
        q.round()
    };
    units * step + 0.0
}

/// Which powers can be ordered: `fine_step` up to ±`fine_limit`, then
/// `coarse_step` beyond (points at ±(fine_limit + k·coarse_step)).
///
/// Defaults, common practice (varies by maker): spectacle lenses in quarter
/// steps throughout; soft contact lenses in 0.25 D steps to ±6.00 D and
/// 0.50 D beyond.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Ladder {
    /// Step near zero, dioptres.
    pub fine_step: f64,
    /// Largest magnitude reached in fine steps, dioptres (a multiple of
    /// `fine_step`).
    pub fine_limit: f64,
    /// Step beyond `fine_limit`, dioptres.
    pub coarse_step: f64,
}

impl Ladder {
    /// Spectacle lenses: 0.25 D steps at every power.
    pub const SPECTACLE: Ladder = Ladder {
        fine_step: 0.25,
        fine_limit: 6.0,
        coarse_step: 0.25,
    };
    /// Soft contact lenses: 0.25 D to ±6.00, then 0.50 D.
    pub const CONTACT_LENS: Ladder = Ladder {
        fine_step: 0.25,
        fine_limit: 6.0,
        coarse_step: 0.5,
    };

    /// Check a (user-edited) ladder: steps positive and at most 1 D, the
    /// fine limit a whole number of fine steps within 0–30 D.
    ///
    /// ```
    /// use lensplane_core::Ladder;
    /// assert!(Ladder::CONTACT_LENS.validate().is_ok());
    /// let bad = Ladder { fine_step: 0.0, ..Ladder::CONTACT_LENS };
    /// assert_eq!(bad.validate().unwrap_err().to_string(), "setting: ladder steps must be within 0.01–1 D");
    /// ```
    pub fn validate(&self) -> Result<(), Error> {
        if !LADDER_STEP.contains(self.fine_step) || !LADDER_STEP.contains(self.coarse_step) {
            return Err(bad_setting(format!("ladder steps must be within {LADDER_STEP}")));
        }
        if !LADDER_FINE.contains(self.fine_limit) || !is_on_step(self.fine_limit, self.fine_step) {
            return Err(bad_setting(format!(
                "the fine-step limit must be a whole number of fine steps within {LADDER_FINE}"
            )));
        }
        Ok(())
    }

    fn floor(&self, x: f64) -> f64 {
        let l = self.fine_limit;
        if x > l {
            l + ((x - l) / self.coarse_step + 1e-9).floor() * self.coarse_step
        } else if x < -l {
            -l - ((-l - x) / self.coarse_step - 1e-9).ceil() * self.coarse_step
        } else {
            (x / self.fine_step + 1e-9).floor() * self.fine_step
        }
    }

    /// True when `x` is a ladder point.
    ///
    /// ```
    /// use lensplane_core::Ladder;
    /// assert!(Ladder::CONTACT_LENS.contains(-6.5));
    /// assert!(!Ladder::CONTACT_LENS.contains(-6.25));
    /// assert!(Ladder::SPECTACLE.contains(-6.25));
    /// ```
    pub fn contains(&self, x: f64) -> bool {
        (self.floor(x) - x).abs() < 1e-9
    }

    /// The nearest ladder point, ties by `tie`.
    ///
    /// ```
    /// use lensplane_core::{Ladder, TieRule};
    /// assert_eq!(Ladder::CONTACT_LENS.round(-7.0906, TieRule::TowardPlus), -7.0);
    /// assert_eq!(Ladder::CONTACT_LENS.round(-6.25, TieRule::TowardPlus), -6.0);
    /// assert_eq!(Ladder::SPECTACLE.round(-6.25, TieRule::TowardPlus), -6.25);
    /// ```
    pub fn round(&self, x: f64, tie: TieRule) -> f64 {
        if !x.is_finite() {
            return x;
        }
        let lo = self.floor(x);
        if (x - lo).abs() < 1e-9 {
            return lo + 0.0;
        }
        let hi = -self.floor(-x);
        let (d_lo, d_hi) = (x - lo, hi - x);
        let picked = if (d_lo - d_hi).abs() < 1e-9 {
            tie.pick(lo, hi)
        } else if d_lo < d_hi {
            lo
        } else {
            hi
        };
        picked + 0.0
    }
}

fn bad_setting(what: String) -> Error {
    Error::new(ErrorKind::BadSetting { what }, Field::Setting, None)
}

/// The usual stock range of a contact lens; powers outside it draw a
/// warning (custom order). Common practice, roughly −12 to +8 D.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct StockRange {
    /// Most minus stock power, dioptres.
    pub min: f64,
    /// Most plus stock power, dioptres.
    pub max: f64,
}

impl Default for StockRange {
    fn default() -> StockRange {
        StockRange { min: -12.0, max: 8.0 }
    }
}

/// How results are rounded to what can be ordered.
#[derive(Clone, Debug, PartialEq)]
pub struct OrderSettings {
    /// Tie rule for every rounding (default toward plus).
    pub tie: TieRule,
    /// Ladder for spectacle targets.
    pub spectacle: Ladder,
    /// Ladder for contact lenses (target at the cornea).
    pub contact_lens: Ladder,
    /// Contact-lens stock range (`None`: no stock warning).
    pub stock: Option<StockRange>,
    /// Toric contact-lens availability.
    pub toric: ToricSettings,
}

impl Default for OrderSettings {
    fn default() -> OrderSettings {
        OrderSettings {
            tie: TieRule::TowardPlus,
            spectacle: Ladder::SPECTACLE,
            contact_lens: Ladder::CONTACT_LENS,
            stock: Some(StockRange::default()),
            toric: ToricSettings::default(),
        }
    }
}

impl OrderSettings {
    /// Check every part.
    ///
    /// ```
    /// assert!(lensplane_core::OrderSettings::default().validate().is_ok());
    /// ```
    pub fn validate(&self) -> Result<(), Error> {
        self.spectacle.validate()?;
        self.contact_lens.validate()?;
        if let Some(s) = self.stock {
            if !(s.min.is_finite() && s.max.is_finite() && s.min < s.max) {
                return Err(bad_setting("the stock range needs min below max".into()));
            }
        }
        self.toric.validate()
    }

    /// The ladder for a lens at `to`: contact lens at the cornea, spectacle
    /// otherwise.
    ///
    /// ```
    /// use lensplane_core::{Ladder, OrderSettings, VertexDistance};
    /// assert_eq!(OrderSettings::default().ladder_for(VertexDistance::CORNEA), Ladder::CONTACT_LENS);
    /// ```
    pub fn ladder_for(&self, to: VertexDistance) -> Ladder {
        if to.is_cornea() {
            self.contact_lens
        } else {
            self.spectacle
        }
    }
}

/// Round each principal meridian to the ladder (directions kept).
///
/// ```
/// use lensplane_core::{round_meridians, Ladder, PowerCross, TieRule};
/// let c = round_meridians(&PowerCross::new(-5.1595, -7.0906, 180)?, &Ladder::CONTACT_LENS, TieRule::TowardPlus);
/// assert_eq!(c.to_rx().to_string(), "-5.25 -1.75 ×180");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn round_meridians(cross: &PowerCross, ladder: &Ladder, tie: TieRule) -> PowerCross {
    cross.map_powers(|p| ladder.round(p, tie))
}

/// Round sphere and cylinder separately (sphere to the ladder, cylinder to
/// quarter steps), in minus-cylinder form. Shown only for comparison: the
/// reports round per meridian, which keeps each meridian within half a
/// step of its exact power.
///
/// ```
/// use lensplane_core::{round_separately, Ladder, Rx, TieRule};
/// let exact = lensplane_core::PowerCross::new(-5.1595, -7.0906, 180)?.to_rx();
/// assert_eq!(round_separately(&exact, &Ladder::CONTACT_LENS, TieRule::TowardPlus).to_string(), "-5.25 -2.00 ×180");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn round_separately(rx: &Rx, ladder: &Ladder, tie: TieRule) -> Rx {
    let m = rx.to_minus_cyl();
    Rx::raw(
        ladder.round(m.sphere(), tie),
        round_to_step(m.cylinder(), 0.25, tie),
        m.axis(),
    )
}

/// A rounded (orderable) lens and what it is worth.
#[derive(Clone, Debug, PartialEq)]
pub struct OrderedLens {
    /// The exact power at the target plane.
    pub exact: Rx,
    /// The orderable power at the target plane (each meridian rounded).
    pub ordered: Rx,
    /// Both meridians of `ordered`, in the directions of the prescription.
    pub ordered_meridians: PowerCross,
    /// The ordered lens moved back to the original plane.
    pub back_at_origin: Rx,
    /// Per meridian: (ordered lens back at the original plane) − (the
    /// prescription). Positive: the ordered lens is more plus.
    pub residual: PowerCross,
    /// The same residual as a power vector (its M is the spherical-equivalent
    /// error, its cylinder size the astigmatic error).
    pub residual_vector: PowerVector,
}

/// Round `rx` moved from `from` to `to` per meridian on `ladder`, and what
/// the rounded lens is worth back at `from`.
///
/// ```
/// use lensplane_core::{order_lens, Ladder, Rx, TieRule, VertexDistance};
/// let o = order_lens(&Rx::sphere_only(-4.0)?, VertexDistance::SPECTACLES, VertexDistance::CORNEA,
///                    &Ladder::CONTACT_LENS, TieRule::TowardPlus)?;
/// assert_eq!(o.ordered.to_string(), "-3.75 DS");
/// // -3.75 at the cornea is worth -3.9267 at 12 mm: 0.0733 D less minus than -4.00.
/// assert!((o.residual.first().power - 0.0733).abs() < 1e-4);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn order_lens(
    rx: &Rx,
    from: VertexDistance,
    to: VertexDistance,
    ladder: &Ladder,
    tie: TieRule,
) -> Result<OrderedLens, Error> {
    ladder.validate()?;
    let original = rx.meridians();
    let exact = compensate_meridians(&original, from, to)?;
    let ordered = round_meridians(&exact, ladder, tie);
    let back = compensate_meridians(&ordered, to, from)?;
    let residual = PowerCross::raw(
        Meridian {
            power: back.first().power - original.first().power,
            axis: original.first().axis,
        },
        Meridian {
            power: back.second().power - original.second().power,
            axis: original.second().axis,
        },
    );
    let back_rx = back.to_rx();
    Ok(OrderedLens {
        exact: exact.to_rx(),
        ordered: ordered.to_rx(),
        ordered_meridians: ordered,
        back_at_origin: back_rx,
        residual,
        residual_vector: back_rx.power_vector().minus(&rx.power_vector()),
    })
}
