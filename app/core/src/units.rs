//! Checked quantities with explicit units at the edges: vertex distances in
//! mm, reading distances in cm (or inches), ages in years, adds in dioptres.
//! Formulas take metres; the conversion happens here and nowhere else.

use crate::error::{Error, ErrorKind, Field};
use crate::format::{fmt_length, fmt_power};
use crate::limits::{self, Limit, CM_PER_INCH};

/// A value outside its hard limit, with no suggested reading.
pub(crate) fn range_error(field: Field, typed: String, limit: Limit) -> Error {
    Error::new(
        ErrorKind::OutOfRange {
            typed,
            limit,
            suggestions: vec![],
        },
        field,
        None,
    )
}

/// A typed figure for a range message: trimmed, or "(not a number)".
fn typed_figure(x: f64, unit: &str) -> String {
    if x.is_finite() {
        format!("{}{unit}", fmt_length(x))
    } else {
        "(not a number)".into()
    }
}

/// Distance from the back of a lens to the corneal vertex, 0–30 mm.
/// 0 means a contact lens on the cornea.
///
/// ```
/// use lensplane_core::VertexDistance;
/// let d = VertexDistance::from_mm(12.0)?;
/// assert_eq!(d.metres(), 0.012);
/// assert!(VertexDistance::CORNEA.is_cornea());
/// assert_eq!(VertexDistance::from_mm(31.0).unwrap_err().to_string(),
///            "vertex distance 31 mm is outside 0–30 mm");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd)]
pub struct VertexDistance {
    mm: f64,
}

impl VertexDistance {
    /// A contact lens: the lens sits on the cornea (0 mm).
    pub const CORNEA: VertexDistance = VertexDistance { mm: 0.0 };
    /// The usual default for spectacles, 12 mm.
    pub const SPECTACLES: VertexDistance = VertexDistance { mm: 12.0 };

    /// Checked: 0 ≤ mm ≤ 30.
    ///
    /// ```
    /// assert!(lensplane_core::VertexDistance::from_mm(-1.0).is_err());
    /// ```
    pub fn from_mm(mm: f64) -> Result<VertexDistance, Error> {
        if limits::VERTEX.contains(mm) {
            Ok(VertexDistance { mm: mm + 0.0 })
        } else {
            Err(range_error(Field::VertexFrom, typed_figure(mm, " mm"), limits::VERTEX))
        }
    }

    /// Millimetres.
    ///
    /// ```
    /// assert_eq!(lensplane_core::VertexDistance::SPECTACLES.mm(), 12.0);
    /// ```
    pub fn mm(&self) -> f64 {
        self.mm
    }

    /// Metres (what the formulas use).
    ///
    /// ```
    /// assert_eq!(lensplane_core::VertexDistance::from_mm(14.0)?.metres(), 0.014);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn metres(&self) -> f64 {
        self.mm / 1000.0
    }

    /// True for 0 mm (a contact lens).
    ///
    /// ```
    /// assert!(!lensplane_core::VertexDistance::SPECTACLES.is_cornea());
    /// ```
    pub fn is_cornea(&self) -> bool {
        self.mm == 0.0
    }
}

/// Reading (near working) distance, 10–100 cm. Typed in cm or inches; held
/// in cm.
///
/// ```
/// use lensplane_core::ReadingDistance;
/// assert_eq!(ReadingDistance::from_cm(40.0)?.metres(), 0.4);
/// assert!((ReadingDistance::from_inches(16.0)?.cm() - 40.64).abs() < 1e-12);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd)]
pub struct ReadingDistance {
    cm: f64,
}

impl ReadingDistance {
    /// Checked: 10 ≤ cm ≤ 100.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ReadingDistance::from_cm(120.0).unwrap_err().to_string(),
    ///            "reading distance 120 cm is outside 10–100 cm");
    /// ```
    pub fn from_cm(cm: f64) -> Result<ReadingDistance, Error> {
        if limits::READING.contains(cm) {
            Ok(ReadingDistance { cm })
        } else {
            Err(range_error(
                Field::ReadingDistance,
                typed_figure(cm, " cm"),
                limits::READING,
            ))
        }
    }

    /// From inches (2.54 cm each), checked the same way.
    ///
    /// ```
    /// assert!(lensplane_core::ReadingDistance::from_inches(16.0).is_ok());
    /// ```
    pub fn from_inches(inches: f64) -> Result<ReadingDistance, Error> {
        ReadingDistance::from_cm(inches * CM_PER_INCH)
    }

    /// Centimetres.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ReadingDistance::from_cm(33.0)?.cm(), 33.0);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn cm(&self) -> f64 {
        self.cm
    }

    /// Inches.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ReadingDistance::from_cm(25.4)?.inches(), 10.0);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn inches(&self) -> f64 {
        self.cm / CM_PER_INCH
    }

    /// Metres (what the formulas use).
    ///
    /// ```
    /// assert_eq!(lensplane_core::ReadingDistance::from_cm(25.0)?.metres(), 0.25);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn metres(&self) -> f64 {
        self.cm / 100.0
    }

    /// Dioptric demand of the distance as typed: 100 / cm.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ReadingDistance::from_cm(40.0)?.demand(), 2.5);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn demand(&self) -> f64 {
        100.0 / self.cm
    }
}

/// Where the reading distance was measured from. At 40 cm and 12 mm the two
/// differ by about 0.07 D at the eye.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default)]
pub enum Measured {
    /// From the spectacle lens plane (the textbook convention; default).
    #[default]
    FromLens,
    /// From the eye (corneal vertex).
    FromEye,
}

/// Age in whole years, 1–110.
///
/// ```
/// use lensplane_core::Age;
/// assert_eq!(Age::new(50)?.years(), 50);
/// assert_eq!(Age::new(0).unwrap_err().to_string(), "age 0 is outside 1–110");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct Age(u8);

impl Age {
    /// Checked: 1 ≤ years ≤ 110.
    ///
    /// ```
    /// assert!(lensplane_core::Age::new(111).is_err());
    /// ```
    pub fn new(years: u8) -> Result<Age, Error> {
        if limits::AGE.contains(f64::from(years)) {
            Ok(Age(years))
        } else {
            Err(range_error(Field::Age, years.to_string(), limits::AGE))
        }
    }

    /// Years.
    ///
    /// ```
    /// assert_eq!(lensplane_core::Age::new(45)?.years(), 45);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn years(&self) -> u8 {
        self.0
    }
}

/// A near addition: always plus, 0.00 to +4.00 D (0 = no add). Adds above
/// +4.00 (low-vision work) are outside this tool's scope.
///
/// ```
/// use lensplane_core::Add;
/// assert_eq!(Add::new(2.5)?.dioptres(), 2.5);
/// assert_eq!(Add::new(-1.0).unwrap_err().to_string(), "an add is always plus");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd)]
pub struct Add(f64);

impl Add {
    /// No add.
    pub const NONE: Add = Add(0.0);

    /// Checked: 0 ≤ add ≤ 4.00.
    ///
    /// ```
    /// assert_eq!(lensplane_core::Add::new(4.5).unwrap_err().to_string(),
    ///            "add +4.50 is outside 0.00 to +4.00");
    /// ```
    pub fn new(dioptres: f64) -> Result<Add, Error> {
        if !dioptres.is_finite() {
            return Err(range_error(Field::Add, typed_figure(dioptres, ""), limits::ADD));
        }
        if dioptres < 0.0 {
            return Err(Error::new(ErrorKind::AddNotPlus, Field::Add, None));
        }
        if !limits::ADD.contains(dioptres) {
            return Err(range_error(Field::Add, fmt_power(dioptres), limits::ADD));
        }
        Ok(Add(dioptres + 0.0))
    }

    /// Dioptres.
    ///
    /// ```
    /// assert_eq!(lensplane_core::Add::NONE.dioptres(), 0.0);
    /// ```
    pub fn dioptres(&self) -> f64 {
        self.0
    }
}

/// Which eye.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Eye {
    /// Right eye (R, OD).
    Right,
    /// Left eye (L, OS).
    Left,
}

/// A value per eye; either may be absent (an eye left empty, a monocular
/// patient).
///
/// ```
/// use lensplane_core::{EyePair, Eye};
/// let pair = EyePair { right: Some(1), left: None };
/// assert_eq!(pair.get(Eye::Right), Some(&1));
/// assert_eq!(pair.map(|x| x * 2).right, Some(2));
/// ```
#[derive(Clone, Debug, Default, PartialEq)]
pub struct EyePair<T> {
    /// Right eye.
    pub right: Option<T>,
    /// Left eye.
    pub left: Option<T>,
}

impl<T> EyePair<T> {
    /// The value for one eye.
    ///
    /// ```
    /// let pair = lensplane_core::EyePair { right: None, left: Some("x") };
    /// assert_eq!(pair.get(lensplane_core::Eye::Left), Some(&"x"));
    /// ```
    pub fn get(&self, eye: Eye) -> Option<&T> {
        match eye {
            Eye::Right => self.right.as_ref(),
            Eye::Left => self.left.as_ref(),
        }
    }

    /// Apply `f` to each present value.
    ///
    /// ```
    /// let pair = lensplane_core::EyePair { right: Some(2), left: Some(3) };
    /// assert_eq!(pair.map(|x| x + 1).left, Some(4));
    /// ```
    pub fn map<U>(self, mut f: impl FnMut(T) -> U) -> EyePair<U> {
        EyePair {
            right: self.right.map(&mut f),
            left: self.left.map(&mut f),
        }
    }
}
