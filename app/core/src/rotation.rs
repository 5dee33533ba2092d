//! The observed rotation of a toric contact lens on the eye: how far its
//! marks have turned, and which way, as the examiner sees it.
//!
//! Held as a signed number of whole degrees, positive **clockwise as the
//! examiner sees it** (the lens turned to the examiner's left, judged by its
//! lower mark), negative anticlockwise (to the examiner's right). The sign
//! is for links and arithmetic only: the page shows
//! [`Rotation::words`], never a bare sign.

use crate::error::{Error, ErrorKind, Field};
use crate::lex::{lex, Sign, Tok};
use crate::limits::{self, ROTATION};
use crate::parse::{Notice, NoticeKind, Parsed};
use crate::units::range_error;

/// Which way a toric contact lens turned, as the examiner sees it.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum RotationDirection {
    /// To the examiner's left: clockwise as seen facing the patient.
    /// "Left add": the rotation is added to the ordered axis.
    ExaminersLeft,
    /// To the examiner's right: anticlockwise as seen facing the patient.
    /// "Right subtract".
    ExaminersRight,
}

impl RotationDirection {
    /// Plain words for the direction.
    ///
    /// ```
    /// use lensplane_core::RotationDirection;
    /// assert_eq!(RotationDirection::ExaminersLeft.words(),
    ///            "to the examiner's left (clockwise as seen facing the patient)");
    /// ```
    pub fn words(self) -> &'static str {
        match self {
            RotationDirection::ExaminersLeft => "to the examiner's left (clockwise as seen facing the patient)",
            RotationDirection::ExaminersRight => "to the examiner's right (anticlockwise as seen facing the patient)",
        }
    }
}

/// How far a toric contact lens has turned from where it should sit, in
/// whole degrees, 0–90 either way ([`limits::ROTATION`]).
///
/// ```
/// use lensplane_core::{Rotation, RotationDirection};
/// let r = Rotation::new(10, RotationDirection::ExaminersLeft)?;
/// assert_eq!(r.clockwise(), 10);
/// assert_eq!(r.words(), "10° to the examiner's left (clockwise as seen facing the patient)");
/// assert_eq!(Rotation::new(95, RotationDirection::ExaminersRight).unwrap_err().to_string(),
///            "rotation 95° is outside 0–90");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default)]
pub struct Rotation {
    clockwise: i16,
}

impl Rotation {
    /// No rotation.
    pub const NONE: Rotation = Rotation { clockwise: 0 };

    /// From the amount and the direction, as the entry form gives them.
    ///
    /// ```
    /// use lensplane_core::{Rotation, RotationDirection};
    /// assert_eq!(Rotation::new(15, RotationDirection::ExaminersRight)?.clockwise(), -15);
    /// assert_eq!(Rotation::new(0, RotationDirection::ExaminersRight)?, Rotation::NONE);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn new(degrees: u16, direction: RotationDirection) -> Result<Rotation, Error> {
        if !ROTATION.contains(f64::from(degrees)) {
            return Err(range_error(Field::Rotation, format!("{degrees}°"), ROTATION));
        }
        // Within 0–90, so the cast is exact.
        let amount = degrees as i16;
        Ok(Rotation {
            clockwise: match direction {
                RotationDirection::ExaminersLeft => amount,
                RotationDirection::ExaminersRight => -amount,
            },
        })
    }

    /// From signed degrees, positive clockwise as the examiner sees it (to
    /// the examiner's left), as links carry it.
    ///
    /// ```
    /// use lensplane_core::{Rotation, RotationDirection};
    /// let r = Rotation::from_clockwise(-20)?;
    /// assert_eq!((r.amount(), r.direction()), (20, Some(RotationDirection::ExaminersRight)));
    /// assert!(Rotation::from_clockwise(91).is_err());
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn from_clockwise(degrees: i16) -> Result<Rotation, Error> {
        let direction = if degrees < 0 {
            RotationDirection::ExaminersRight
        } else {
            RotationDirection::ExaminersLeft
        };
        Rotation::new(degrees.unsigned_abs(), direction)
    }

    /// Signed degrees, positive clockwise as the examiner sees it. For
    /// links and the computation; never show it bare.
    ///
    /// ```
    /// assert_eq!(lensplane_core::Rotation::NONE.clockwise(), 0);
    /// ```
    pub fn clockwise(&self) -> i16 {
        self.clockwise
    }

    /// The amount in degrees, 0–90.
    ///
    /// ```
    /// assert_eq!(lensplane_core::Rotation::from_clockwise(-12)?.amount(), 12);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn amount(&self) -> u16 {
        self.clockwise.unsigned_abs()
    }

    /// The direction; `None` for no rotation.
    ///
    /// ```
    /// assert_eq!(lensplane_core::Rotation::NONE.direction(), None);
    /// ```
    pub fn direction(&self) -> Option<RotationDirection> {
        match self.clockwise {
            0 => None,
            c if c > 0 => Some(RotationDirection::ExaminersLeft),
            _ => Some(RotationDirection::ExaminersRight),
        }
    }

    /// True for no rotation.
    ///
    /// ```
    /// assert!(lensplane_core::Rotation::NONE.is_none());
    /// ```
    pub fn is_none(&self) -> bool {
        self.clockwise == 0
    }

    /// Plain words, never a bare sign: "10° to the examiner's left
    /// (clockwise as seen facing the patient)", or "no rotation".
    ///
    /// ```
    /// use lensplane_core::Rotation;
    /// assert_eq!(Rotation::from_clockwise(-5)?.words(),
    ///            "5° to the examiner's right (anticlockwise as seen facing the patient)");
    /// assert_eq!(Rotation::NONE.words(), "no rotation");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn words(&self) -> String {
        match self.direction() {
            None => "no rotation".into(),
            Some(d) => format!("{}° {}", self.amount(), d.words()),
        }
    }

    /// The text a link carries: signed whole degrees, `10`, `-10`, `0`.
    ///
    /// ```
    /// use lensplane_core::{parse_rotation, Rotation};
    /// let r = Rotation::from_clockwise(-10)?;
    /// assert_eq!(r.link_text(), "-10");
    /// assert_eq!(parse_rotation(&r.link_text())?.value, r);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn link_text(&self) -> String {
        self.clockwise.to_string()
    }
}

/// Reads a whole number of degrees (an optional `°`), with its sign.
fn degrees(text: &str, signed: bool) -> Result<Parsed<(Sign, u16)>, Error> {
    let field = Field::Rotation;
    let toks = lex(text, field)?;
    let Some(t) = toks.first() else {
        return Ok(Parsed {
            value: (Sign::None, 0),
            notices: vec![],
        });
    };
    let Tok::Num(n) = &t.tok else {
        return Err(Error::new(
            ErrorKind::Unexpected { text: t.raw.clone() },
            field,
            Some(t.start),
        ));
    };
    let mut rest = toks[1..].iter();
    let mut next = rest.next();
    if matches!(next.map(|t| &t.tok), Some(Tok::Degree)) {
        next = rest.next();
    }
    if let Some(extra) = next {
        return Err(Error::new(
            ErrorKind::Unexpected {
                text: extra.raw.clone(),
            },
            field,
            Some(extra.start),
        ));
    }
    if n.frac.is_some() {
        return Err(Error::new(
            ErrorKind::NotWholeDegrees { typed: n.typed() },
            field,
            Some(t.start),
        ));
    }
    if n.sign == Sign::PlusMinus {
        return Err(Error::new(
            ErrorKind::Unexpected { text: t.raw.clone() },
            field,
            Some(t.start),
        ));
    }
    if !signed && n.sign != Sign::None && n.magnitude() != 0.0 {
        return Err(Error::new(ErrorKind::RotationSigned, field, Some(t.start)));
    }
    let amount: u16 = if n.int.len() > 3 {
        u16::MAX
    } else {
        n.int.parse().unwrap_or(u16::MAX)
    };
    if !limits::ROTATION.contains(f64::from(amount)) {
        let shown = if n.int.len() > 3 {
            n.int.clone()
        } else {
            amount.to_string()
        };
        return Err(range_error(field, format!("{shown}°"), ROTATION).at(t.start));
    }
    let mut notices = vec![];
    if n.typographic_minus {
        notices.push(Notice {
            kind: NoticeKind::MinusRead,
            field,
            message: format!("read the dash as a minus: {}", n.typed()),
        });
    }
    Ok(Parsed {
        value: (n.sign, amount),
        notices,
    })
}

/// Parse a rotation from a link: signed whole degrees, positive clockwise as
/// the examiner sees it (to the examiner's left): `10`, `+10`, `-10`, `0`;
/// empty means no rotation.
///
/// ```
/// use lensplane_core::parse_rotation;
/// assert_eq!(parse_rotation("10")?.value.clockwise(), 10);
/// assert_eq!(parse_rotation("-15")?.value.clockwise(), -15);
/// assert!(parse_rotation("")?.value.is_none());
/// assert_eq!(parse_rotation("7.5").unwrap_err().to_string(), "rotation 7.5 must be a whole number of degrees");
/// assert_eq!(parse_rotation("-120").unwrap_err().to_string(), "rotation 120° is outside 0–90");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_rotation(text: &str) -> Result<Parsed<Rotation>, Error> {
    let p = degrees(text, true)?;
    let (sign, amount) = p.value;
    let direction = if sign == Sign::Minus {
        RotationDirection::ExaminersRight
    } else {
        RotationDirection::ExaminersLeft
    };
    Ok(Parsed {
        value: Rotation::new(amount, direction)?,
        notices: p.notices,
    })
}

/// Parse the rotation amount of the entry form (whole degrees, no sign;
/// `°` allowed) with the direction chosen beside it. Empty means no
/// rotation.
///
/// ```
/// use lensplane_core::{parse_rotation_amount, RotationDirection};
/// assert_eq!(parse_rotation_amount("10°", RotationDirection::ExaminersLeft)?.value.clockwise(), 10);
/// assert_eq!(parse_rotation_amount("10", RotationDirection::ExaminersRight)?.value.clockwise(), -10);
/// assert_eq!(parse_rotation_amount("-10", RotationDirection::ExaminersLeft).unwrap_err().to_string(),
///            "rotation takes no sign: give the amount and choose left or right");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_rotation_amount(text: &str, direction: RotationDirection) -> Result<Parsed<Rotation>, Error> {
    let p = degrees(text, false)?;
    Ok(Parsed {
        value: Rotation::new(p.value.1, direction)?,
        notices: p.notices,
    })
}
