//! The form of a spectacle lens, for the shape factor of its magnification:
//! front surface power, centre thickness and refractive index, each
//! checked against its [`crate::limits`] entry.

use crate::error::{Error, ErrorKind, Field};
use crate::lex::{lex, Num, Sign, Tok, Token};
use crate::limits::{Limit, FRONT_SURFACE, INDEX, THICKNESS};
use crate::parse::{Notice, NoticeKind, Parsed};
use crate::units::range_error;

/// A spectacle lens's front surface power (D), centre thickness (mm) and
/// refractive index, within [`FRONT_SURFACE`] (0.00 to +25.00),
/// [`THICKNESS`] (0.5–20 mm) and [`INDEX`] (1.40–2.00).
///
/// ```
/// use lensplane_core::LensForm;
/// let form = LensForm::new(6.0, 2.0, 1.5)?;
/// assert_eq!((form.front_surface(), form.thickness_mm(), form.index()), (6.0, 2.0, 1.5));
/// assert_eq!(LensForm::new(6.0, 25.0, 1.5).unwrap_err().to_string(), "centre thickness 25 mm is outside 0.5–20 mm");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LensForm {
    front_surface: f64,
    thickness_mm: f64,
    index: f64,
}

/// A figure as given (shortest form that reads back the same: `1.523`,
/// `25`), for a range message.
fn figure(x: f64, unit: &str) -> String {
    if x.is_finite() {
        format!("{}{unit}", x + 0.0)
    } else {
        "(not a number)".into()
    }
}

impl LensForm {
    /// Checked against the three limits.
    ///
    /// ```
    /// use lensplane_core::LensForm;
    /// assert_eq!(LensForm::new(-1.0, 2.0, 1.5).unwrap_err().to_string(), "front surface -1 is outside 0.00 to +25.00");
    /// assert_eq!(LensForm::new(6.0, 2.0, 2.5).unwrap_err().to_string(), "refractive index 2.5 is outside 1.40–2.00");
    /// ```
    pub fn new(front_surface: f64, thickness_mm: f64, index: f64) -> Result<LensForm, Error> {
        let checks = [
            (front_surface, FRONT_SURFACE, Field::FrontSurface, ""),
            (thickness_mm, THICKNESS, Field::Thickness, " mm"),
            (index, INDEX, Field::Index, ""),
        ];
        for (x, limit, field, unit) in checks {
            if !limit.contains(x) {
                return Err(range_error(field, figure(x, unit), limit));
            }
        }
        Ok(LensForm {
            front_surface: front_surface + 0.0,
            thickness_mm,
            index,
        })
    }

    /// Front surface power (base curve), dioptres.
    ///
    /// ```
    /// assert_eq!(lensplane_core::LensForm::new(8.0, 5.0, 1.6)?.front_surface(), 8.0);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn front_surface(&self) -> f64 {
        self.front_surface
    }

    /// Centre thickness, mm.
    ///
    /// ```
    /// assert_eq!(lensplane_core::LensForm::new(8.0, 5.0, 1.6)?.thickness_mm(), 5.0);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn thickness_mm(&self) -> f64 {
        self.thickness_mm
    }

    /// Refractive index.
    ///
    /// ```
    /// assert_eq!(lensplane_core::LensForm::new(8.0, 5.0, 1.6)?.index(), 1.6);
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn index(&self) -> f64 {
        self.index
    }

    /// The three fields of the entry form (or link parameters). All three
    /// empty: no lens form (`None`). Some empty: an error at the first
    /// empty one.
    ///
    /// ```
    /// use lensplane_core::LensForm;
    /// let form = LensForm::from_texts("+6.00", "2.2 mm", "1,5")?.unwrap();
    /// assert_eq!(form.value, LensForm::new(6.0, 2.2, 1.5)?);
    /// assert_eq!(form.notices[0].message, "read the comma as a decimal point: 1.5");
    /// assert!(LensForm::from_texts("", " ", "")?.is_none());
    /// assert_eq!(LensForm::from_texts("6", "", "1.5").unwrap_err().to_string(), "centre thickness is empty");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn from_texts(front_surface: &str, thickness: &str, index: &str) -> Result<Option<Parsed<LensForm>>, Error> {
        if [front_surface, thickness, index].iter().all(|t| t.trim().is_empty()) {
            return Ok(None);
        }
        let f = parse_front_surface(front_surface)?;
        let t = parse_thickness_mm(thickness)?;
        let n = parse_index(index)?;
        let mut notices = f.notices;
        notices.extend(t.notices);
        notices.extend(n.notices);
        Ok(Some(Parsed {
            value: LensForm::new(f.value, t.value, n.value)?,
            notices,
        }))
    }
}

fn unexpected(t: &Token, field: Field) -> Error {
    Error::new(ErrorKind::Unexpected { text: t.raw.clone() }, field, Some(t.start))
}

/// One number and an optional unit word from `allowed`.
fn number<'a>(toks: &'a [Token], field: Field, allowed: &[&str]) -> Result<(&'a Token, &'a Num), Error> {
    let Some(t) = toks.first() else {
        return Err(Error::new(ErrorKind::Empty, field, None));
    };
    let Tok::Num(n) = &t.tok else {
        return Err(unexpected(t, field));
    };
    let mut rest = toks[1..].iter();
    if let Some(u) = rest.next() {
        let ok = matches!(&u.tok, Tok::Word(w) if allowed.contains(&w.as_str()));
        if !ok {
            return Err(unexpected(u, field));
        }
    }
    if let Some(extra) = rest.next() {
        return Err(unexpected(extra, field));
    }
    if n.sign == Sign::PlusMinus {
        return Err(unexpected(t, field));
    }
    Ok((t, n))
}

fn comma_notice(n: &Num, field: Field, shown: String) -> Vec<Notice> {
    if n.comma {
        vec![Notice {
            kind: NoticeKind::CommaDecimal,
            field,
            message: format!("read the comma as a decimal point: {shown}"),
        }]
    } else {
        vec![]
    }
}

fn checked(t: &Token, n: &Num, field: Field, limit: Limit, unit: &str, suggestions: Vec<String>) -> Result<f64, Error> {
    let value = n.value() + 0.0;
    if limit.contains(value) {
        return Ok(value);
    }
    Err(Error::new(
        ErrorKind::OutOfRange {
            typed: format!("{}{unit}", n.typed()),
            limit,
            suggestions,
        },
        field,
        Some(t.start),
    ))
}

/// Parse a front surface power (base curve) in dioptres: `+6.00`, `6`,
/// `6 D`. Always plus (a plano front is 0), so no sign is needed.
///
/// ```
/// use lensplane_core::parse_front_surface;
/// assert_eq!(parse_front_surface("6")?.value, 6.0);
/// assert_eq!(parse_front_surface("+8.25 D")?.value, 8.25);
/// assert_eq!(parse_front_surface("-2").unwrap_err().to_string(), "front surface -2 is outside 0.00 to +25.00");
/// assert_eq!(parse_front_surface("").unwrap_err().to_string(), "front surface is empty");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_front_surface(text: &str) -> Result<Parsed<f64>, Error> {
    let field = Field::FrontSurface;
    let toks = lex(text, field)?;
    let (t, n) = number(&toks, field, &["d"])?;
    let value = checked(t, n, field, FRONT_SURFACE, "", vec![])?;
    Ok(Parsed {
        value,
        notices: comma_notice(n, field, n.typed()),
    })
}

/// Parse a centre thickness in mm: `2.2`, `2.2 mm`.
///
/// ```
/// use lensplane_core::parse_thickness_mm;
/// assert_eq!(parse_thickness_mm("2.2 mm")?.value, 2.2);
/// assert_eq!(parse_thickness_mm("0.2").unwrap_err().to_string(), "centre thickness 0.2 mm is outside 0.5–20 mm");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_thickness_mm(text: &str) -> Result<Parsed<f64>, Error> {
    let field = Field::Thickness;
    let toks = lex(text, field)?;
    let (t, n) = number(&toks, field, &["mm"])?;
    let value = checked(t, n, field, THICKNESS, " mm", vec![])?;
    Ok(Parsed {
        value,
        notices: comma_notice(n, field, format!("{} mm", n.typed())),
    })
}

/// Parse a refractive index: `1.5`, `1.523`, `1,6`. A number that looks
/// like it lost its decimal point (`15`, `1523`) is refused with the
/// reading it may mean, never corrected.
///
/// ```
/// use lensplane_core::parse_index;
/// assert_eq!(parse_index("1.523")?.value, 1.523);
/// assert_eq!(parse_index("1523").unwrap_err().to_string(), "refractive index 1523 is outside 1.40–2.00: did you mean 1.523?");
/// assert_eq!(parse_index("2.5").unwrap_err().to_string(), "refractive index 2.5 is outside 1.40–2.00");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_index(text: &str) -> Result<Parsed<f64>, Error> {
    let field = Field::Index;
    let toks = lex(text, field)?;
    let (t, n) = number(&toks, field, &[])?;
    let mut suggestions = vec![];
    if n.frac.is_none() && n.sign == Sign::None && n.int.len() >= 2 && n.int.len() <= 4 && n.int.starts_with('1') {
        let restored = format!("1.{}", &n.int[1..]);
        if crate::read_decimal(&restored).is_some_and(|x| INDEX.contains(x)) {
            suggestions.push(restored);
        }
    }
    let value = checked(t, n, field, INDEX, "", suggestions)?;
    Ok(Parsed {
        value,
        notices: comma_notice(n, field, n.typed()),
    })
}
