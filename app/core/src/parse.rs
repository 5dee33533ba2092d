//! Reading what practitioners type: whole prescriptions, single fields,
//! vertex and reading distances, adds and ages.
//!
//! Tolerant of notation (dashes for minus, comma decimals, `x`/`×`/`@`/`ax`,
//! `/` separators, `DS`/`sph`, three-digit axes), strict about meaning: a
//! missing sign, a missing axis, an axis outside 1–180 or a number that looks
//! like it lost its decimal point is an error that asks, never a guess.

use crate::cursor::Cursor;
pub(crate) use crate::cursor::{unexpected, word};
use crate::error::{Error, ErrorKind, Field};
use crate::format::{fmt_length, fmt_power};
use crate::lex::{lex, Num, Sign, Tok, Token};
use crate::limits::{self, Limit, CM_PER_INCH, VERTEX_SHORT_MM};
use crate::rounding::is_on_step;
use crate::units::range_error;
use crate::warnings::off_step;
use crate::{Add, Age, ReadingDistance, Rx, VertexDistance};

/// A parsed value and what the parser wants the user to know about how it
/// read the text (nothing here is an error).
#[derive(Clone, Debug, PartialEq)]
pub struct Parsed<T> {
    /// The value read.
    pub value: T,
    /// Things worth telling the user (axis 0 stored as 180, a dash read as
    /// a minus, an off-step power…).
    pub notices: Vec<Notice>,
}

/// Something the parser did that the user should see.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Notice {
    /// What kind of notice.
    pub kind: NoticeKind,
    /// The input it concerns.
    pub field: Field,
    /// Plain words, with the value echoed.
    pub message: String,
}

/// The kinds of [`Notice`].
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum NoticeKind {
    /// A dash or other non-ASCII minus was read as a minus sign.
    MinusRead,
    /// A comma was read as a decimal point.
    CommaDecimal,
    /// Axis 0 (or 000) stored as 180.
    AxisZero,
    /// A power between quarter-dioptre steps (autorefractor output).
    OffStep,
    /// An axis given without `x`, `@` or `ax`.
    BareAxis,
    /// An axis given for a zero cylinder, ignored.
    AxisIgnored,
    /// A value typed in another unit and converted.
    UnitConverted,
    /// A bare number read in the unit it can only be.
    UnitAssumed,
    /// A sign typed where only a size counts (a chart lists both signs).
    SignIgnored,
}

fn notice(kind: NoticeKind, field: Field, message: String) -> Notice {
    Notice { kind, field, message }
}

fn is_plano(w: &str) -> bool {
    matches!(w, "pl" | "plano" | "pln")
}
fn is_spherical_mark(w: &str) -> bool {
    matches!(w, "ds" | "sph" | "sphere" | "dsph")
}
fn is_cyl_label(w: &str) -> bool {
    matches!(w, "cyl" | "cylinder" | "dc" | "dcyl")
}
fn is_sphere_label(w: &str) -> bool {
    matches!(w, "sph" | "sphere")
}
fn is_axis_mark(t: &Tok) -> bool {
    match t {
        Tok::At => true,
        Tok::Word(w) => matches!(w.as_str(), "x" | "ax" | "axis"),
        _ => false,
    }
}

#[derive(Clone, Copy)]
enum Role {
    Sphere,
    Cylinder,
}

impl Role {
    fn field(self) -> Field {
        match self {
            Role::Sphere => Field::Sphere,
            Role::Cylinder => Field::Cylinder,
        }
    }
    /// The hard limit, and the range within which a restored decimal
    /// point is plausible (the warning threshold).
    fn limits(self) -> (Limit, Limit) {
        match self {
            Role::Sphere => (limits::SPHERE, limits::SPHERE_WARN),
            Role::Cylinder => (limits::CYLINDER, limits::CYLINDER_WARN),
        }
    }
}

/// Readings of an integer with its decimal point restored, that land on a
/// quarter step within `plausible`: 250 → 2.50; 80 → 8.00; 75 → 0.75, 7.50.
fn restored(num: &Num, plausible: f64) -> Vec<f64> {
    if num.frac.is_some() || num.int.len() < 2 {
        return vec![];
    }
    let m = num.magnitude();
    // Already ascending and distinct (m / 100 < m / 10 for m > 0), so no
    // sort: each sort instantiation costs ~1.5 KB gzip in the wasm.
    [m / 100.0, m / 10.0]
        .into_iter()
        .filter(|c| *c > 0.0 && *c <= plausible && is_on_step(*c, 0.25))
        .collect()
}

fn signed_suggestions(sign: Sign, candidates: &[f64]) -> Vec<String> {
    let p = fmt_power;
    candidates
        .iter()
        .map(|&c| match sign {
            Sign::Minus => p(-c),
            Sign::Plus => p(c),
            _ => format!("{} or {}", p(c), p(-c)),
        })
        .collect()
}

fn reading_notices(num: &Num, field: Field, value: f64) -> Vec<Notice> {
    let mut out = vec![];
    if num.typographic_minus {
        out.push(notice(
            NoticeKind::MinusRead,
            field,
            format!("read the dash as a minus: {}", fmt_power(value)),
        ));
    }
    if num.comma {
        out.push(notice(
            NoticeKind::CommaDecimal,
            field,
            format!("read the comma as a decimal point: {}", fmt_power(value)),
        ));
    }
    out
}

/// A sphere or cylinder number: sign required unless zero, hard limit,
/// implied-decimal suggestions, off-step notice.
fn power(t: &Token, num: &Num, role: Role) -> Result<(f64, Vec<Notice>), Error> {
    let field = role.field();
    let (limit, plausible) = role.limits();
    let m = num.magnitude();
    if !limit.contains(m) {
        let suggestions = signed_suggestions(num.sign, &restored(num, plausible.max));
        return Err(Error::new(
            ErrorKind::OutOfRange {
                typed: num.typed(),
                limit,
                suggestions,
            },
            field,
            Some(t.start),
        ));
    }
    if m != 0.0 && matches!(num.sign, Sign::None | Sign::PlusMinus) {
        return Err(Error::new(ErrorKind::NeedsSign { magnitude: m }, field, Some(t.start)));
    }
    let value = num.value() + 0.0;
    let mut notices = reading_notices(num, field, value);
    if let Some(message) = off_step(field, value) {
        notices.push(notice(NoticeKind::OffStep, field, message));
    }
    Ok((value, notices))
}

/// An axis number: whole degrees 0–180, 0 stored as 180.
fn axis(t: &Token, num: &Num) -> Result<(u16, Vec<Notice>), Error> {
    let out_of_range = |typed: String| range_error(Field::Axis, typed, limits::AXIS).at(t.start);
    if num.frac.is_some() {
        return Err(Error::new(
            ErrorKind::AxisNotWhole { typed: num.typed() },
            Field::Axis,
            Some(t.start),
        ));
    }
    match num.sign {
        Sign::Minus => return Err(out_of_range(num.typed())),
        Sign::PlusMinus => return Err(unexpected(t, Field::Axis)),
        _ => {}
    }
    if num.int.len() > 3 {
        return Err(out_of_range(num.int.clone()));
    }
    let value: u16 = num.int.parse().unwrap_or(u16::MAX);
    match value {
        0 => Ok((
            180,
            vec![notice(
                NoticeKind::AxisZero,
                Field::Axis,
                format!("axis {} is written 180: stored as 180", num.int),
            )],
        )),
        1..=180 => Ok((value, vec![])),
        _ => Err(out_of_range(value.to_string())),
    }
}

/// Parse a whole prescription for one eye.
///
/// Accepts, among others: `-2.00 -1.00 x180`, `−2.00/−1.00×180`,
/// `-2,50 DS`, `pl -0.50 x 90`, `+1.50 -0.75 @ 5`, `-2.00 -1.00 ax 180`,
/// `-2.00 -1.00 180°`, `-3.75 sph`, `-6 D`, `±0.00`.
///
/// ```
/// use lensplane_core::parse_rx;
/// let p = parse_rx("\u{2212}2.00/\u{2212}1.00×180")?;
/// assert_eq!(p.value.to_string(), "-2.00 -1.00 ×180");
///
/// let p = parse_rx("-1.00 -0.50 x000")?;
/// assert_eq!(p.value.axis(), 180);
/// assert_eq!(p.notices[0].message, "axis 000 is written 180: stored as 180");
///
/// assert_eq!(parse_rx("2.00 -1.00 x90").unwrap_err().to_string(),
///            "sphere needs a sign: +2.00 or -2.00?");
/// assert_eq!(parse_rx("-2.00 -1.00").unwrap_err().to_string(), "cylinder needs an axis");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_rx(text: &str) -> Result<Parsed<Rx>, Error> {
    let toks = lex(text, Field::Rx)?;
    let mut c = Cursor::new(&toks);
    let mut notices = Vec::new();
    if c.at_end() {
        return Err(Error::new(ErrorKind::Empty, Field::Rx, None));
    }
    c.eat_label(is_sphere_label); // "sph -2.00 …"
    if let Some(t) = c.eat(|t| matches!(t, Tok::At)) {
        return Err(Error::new(ErrorKind::AxisNeedsCylinder, Field::Axis, Some(t.start)));
        // "@90"
    }
    let sphere = sphere_part(&mut c, &mut notices)?; // "-2.00", "pl"
    if c.eat_word(is_spherical_mark) {
        c.expect_end(Field::Rx)?; // "-2.00 DS", "-3.75 sph"
        return spherical(sphere, notices);
    }
    c.eat_word(|w| w == "d"); // "-6 D"
    c.eat_separator(); // "-2.00/-1.00…", "-2.00, -1.00…"
    c.eat_label(is_cyl_label); // "… cyl -1.00"
    if c.at_end() {
        return spherical(sphere, notices); // "-2.00"
    }
    if let Some(t) = c.peek().filter(|t| is_axis_mark(&t.tok)) {
        return Err(Error::new(ErrorKind::AxisNeedsCylinder, Field::Axis, Some(t.start)));
        // "-2.00 x90"
    }
    let cyl_start = c.peek().map(|t| t.start);
    let cylinder = match c.eat_number() {
        Some((t, n)) => power(t, n, Role::Cylinder).map(|(v, n)| {
            notices.extend(n);
            v
        })?,
        None => {
            return Err(c
                .peek()
                .map(|t| unexpected(t, Field::Cylinder))
                .unwrap_or_else(empty_rx))
        }
    };
    c.eat_word(|w| w == "d" || is_cyl_label(w)); // "-1.00 D", "-1.00 DC"
    c.eat_separator(); // "…/-1.00/180"
    let axis = axis_part(&mut c, &mut notices)?; // "x180", "@ 5", "ax 180", "180°", bare "180"
    c.expect_end(Field::Rx)?;
    finish(sphere, cylinder, axis, notices, cyl_start)
}

fn empty_rx() -> Error {
    Error::new(ErrorKind::Empty, Field::Rx, None)
}

fn spherical(sphere: f64, notices: Vec<Notice>) -> Result<Parsed<Rx>, Error> {
    Ok(Parsed {
        value: Rx::new(sphere, 0.0, 180)?,
        notices,
    })
}

/// The sphere of a prescription: a signed power or a word for plano.
fn sphere_part(c: &mut Cursor, notices: &mut Vec<Notice>) -> Result<f64, Error> {
    if let Some((t, n)) = c.eat_number() {
        let (v, n) = power(t, n, Role::Sphere)?;
        notices.extend(n);
        return Ok(v);
    }
    if c.eat_word(is_plano) {
        return Ok(0.0);
    }
    Err(c.peek().map(|t| unexpected(t, Field::Sphere)).unwrap_or_else(empty_rx))
}

/// The axis after a cylinder: marked (`x`, `@`, `ax`), or a bare number
/// (read with a notice unless a degree sign follows); `None` when nothing
/// is left.
fn axis_part(c: &mut Cursor, notices: &mut Vec<Notice>) -> Result<Option<u16>, Error> {
    let Some(first) = c.peek() else { return Ok(None) };
    let value = if c.eat(is_axis_mark).is_some() {
        match c.next() {
            Some(at @ Token { tok: Tok::Num(n), .. }) => {
                let (a, more) = axis(at, n)?;
                notices.extend(more);
                a
            }
            Some(other) => return Err(unexpected(other, Field::Axis)),
            None => return Err(Error::new(ErrorKind::CylinderNeedsAxis, Field::Axis, Some(first.start))),
        }
    } else if let Some((t, n)) = c.eat_number() {
        let signed_fraction = n.sign == Sign::Minus && n.frac.is_some();
        if !matches!(n.sign, Sign::None | Sign::Minus) || signed_fraction {
            return Err(unexpected(t, Field::Axis));
        }
        let (a, more) = axis(t, n)?;
        if !matches!(c.peek().map(|t| &t.tok), Some(Tok::Degree)) {
            notices.push(notice(
                NoticeKind::BareAxis,
                Field::Axis,
                format!("read {} as the axis", n.int),
            ));
        }
        notices.extend(more);
        a
    } else {
        return Err(unexpected(first, Field::Axis));
    };
    c.eat(|t| matches!(t, Tok::Degree));
    Ok(Some(value))
}

fn finish(
    sphere: f64,
    cylinder: f64,
    axis: Option<u16>,
    mut notices: Vec<Notice>,
    cyl_position: Option<usize>,
) -> Result<Parsed<Rx>, Error> {
    match (cylinder == 0.0, axis) {
        (true, Some(a)) => {
            notices.push(notice(
                NoticeKind::AxisIgnored,
                Field::Axis,
                format!("axis {a} ignored: the cylinder is zero"),
            ));
            Ok(Parsed {
                value: Rx::new(sphere, 0.0, 180)?,
                notices,
            })
        }
        (true, None) => Ok(Parsed {
            value: Rx::new(sphere, 0.0, 180)?,
            notices,
        }),
        (false, None) => Err(Error::new(ErrorKind::CylinderNeedsAxis, Field::Axis, cyl_position)),
        (false, Some(a)) => Ok(Parsed {
            value: Rx::new(sphere, cylinder, a)?,
            notices,
        }),
    }
}

/// Parse the sphere field of a three-field entry. Accepts a signed power,
/// `0`, `pl`/`plano`, with an optional `D`/`DS`/`sph`.
///
/// ```
/// use lensplane_core::parse_sphere_field;
/// assert_eq!(parse_sphere_field("–6")?.value, -6.0);
/// assert_eq!(parse_sphere_field("plano")?.value, 0.0);
/// assert_eq!(parse_sphere_field("-250").unwrap_err().to_string(),
///            "sphere -250 is outside ±30 D: did you mean -2.50?");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_sphere_field(text: &str) -> Result<Parsed<f64>, Error> {
    let toks = lex(text, Field::Sphere)?;
    let mut c = Cursor::new(&toks);
    if c.peek_second().is_some() {
        c.eat_word(is_sphere_label); // "sph -2.00"
    }
    let Some(t) = c.next() else {
        return Err(Error::new(ErrorKind::Empty, Field::Sphere, None));
    };
    let (value, notices) = match &t.tok {
        Tok::Num(n) => power(t, n, Role::Sphere)?,    // "-2.00"
        Tok::Word(w) if is_plano(w) => (0.0, vec![]), // "plano"
        _ => return Err(unexpected(t, Field::Sphere)),
    };
    c.eat_word(|w| w == "d" || is_spherical_mark(w)); // "-2.00 D", "-2.00 DS"
    c.expect_end(Field::Sphere)?;
    Ok(Parsed { value, notices })
}

/// Parse the cylinder field. Empty means no cylinder (0). Either sign
/// (minus- or plus-cylinder form); a non-zero cylinder needs its sign.
///
/// ```
/// use lensplane_core::parse_cylinder_field;
/// assert_eq!(parse_cylinder_field("-1,25")?.value, -1.25);
/// assert_eq!(parse_cylinder_field("")?.value, 0.0);
/// assert_eq!(parse_cylinder_field("1.00").unwrap_err().to_string(),
///            "cylinder needs a sign: +1.00 or -1.00?");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_cylinder_field(text: &str) -> Result<Parsed<f64>, Error> {
    let toks = lex(text, Field::Cylinder)?;
    let mut c = Cursor::new(&toks);
    if c.peek_second().is_some() {
        c.eat_word(is_cyl_label); // "cyl -1.00"
    }
    let Some(t) = c.next() else {
        return Ok(Parsed {
            value: 0.0,
            notices: vec![],
        });
    };
    let (value, notices) = match &t.tok {
        Tok::Num(n) => power(t, n, Role::Cylinder)?, // "-1.00", "+1.00"
        Tok::Word(w) if is_spherical_mark(w) || is_plano(w) => (0.0, vec![]), // "DS"
        _ => return Err(unexpected(t, Field::Cylinder)),
    };
    c.eat_word(|w| w == "d" || is_cyl_label(w)); // "-1.00 D", "-1.00 DC"
    c.expect_end(Field::Cylinder)?;
    Ok(Parsed { value, notices })
}

/// Parse the axis field. Empty means no axis (`None`). Accepts `180`, `x180`,
/// `×005`, `@90`, `ax 90`, `90°`; `0` is stored as 180 with a notice.
///
/// ```
/// use lensplane_core::parse_axis_field;
/// assert_eq!(parse_axis_field("x005")?.value, Some(5));
/// assert_eq!(parse_axis_field("")?.value, None);
/// assert_eq!(parse_axis_field("181").unwrap_err().to_string(), "axis 181 is outside 1–180");
/// assert_eq!(parse_axis_field("-10").unwrap_err().to_string(), "axis -10 is outside 1–180");
/// assert_eq!(parse_axis_field("90.5").unwrap_err().to_string(),
///            "axis 90.5 must be a whole number of degrees");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_axis_field(text: &str) -> Result<Parsed<Option<u16>>, Error> {
    let toks = lex(text, Field::Axis)?;
    let mut c = Cursor::new(&toks);
    if c.at_end() {
        return Ok(Parsed {
            value: None,
            notices: vec![],
        });
    }
    c.eat(is_axis_mark); // "x180", "@90", "ax 90"
    let Some(t) = c.next() else {
        return Err(Error::new(ErrorKind::Empty, Field::Axis, None)); // "x"
    };
    let (value, notices) = match &t.tok {
        Tok::Num(n) => axis(t, n)?,
        _ => return Err(unexpected(t, Field::Axis)),
    };
    c.eat(|t| matches!(t, Tok::Degree)); // "90°"
    c.expect_end(Field::Axis)?;
    Ok(Parsed {
        value: Some(value),
        notices,
    })
}

impl Rx {
    /// A prescription from the three fields of the entry form. An empty
    /// cylinder means spherical; a non-zero cylinder needs an axis; an axis
    /// with a zero cylinder is ignored with a notice.
    ///
    /// ```
    /// use lensplane_core::Rx;
    /// let p = Rx::from_fields("-8.00", "-2.00", "180")?;
    /// assert_eq!(p.value, Rx::new(-8.0, -2.0, 180)?);
    /// assert_eq!(Rx::from_fields("-8", "-2", "").unwrap_err().to_string(), "cylinder needs an axis");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn from_fields(sphere: &str, cylinder: &str, axis: &str) -> Result<Parsed<Rx>, Error> {
        let s = parse_sphere_field(sphere)?;
        let c = parse_cylinder_field(cylinder)?;
        let a = parse_axis_field(axis)?;
        let mut notices = s.notices;
        notices.extend(c.notices);
        notices.extend(a.notices);
        finish(s.value, c.value, a.value, notices, None)
    }
}

pub(crate) type NumberAndUnit<'a> = (&'a Token, &'a Num, Option<&'a Token>);

pub(crate) fn single_number(toks: &[Token], field: Field) -> Result<NumberAndUnit<'_>, Error> {
    let Some(t) = toks.first() else {
        return Err(Error::new(ErrorKind::Empty, field, None));
    };
    let Tok::Num(n) = &t.tok else {
        return Err(unexpected(t, field));
    };
    let unit = toks.get(1);
    if let Some(extra) = toks.get(2) {
        return Err(unexpected(extra, field));
    }
    Ok((t, n, unit))
}

/// Parse a vertex distance in mm (`12`, `12 mm`, `1.2 cm`, `0.012 m`).
/// `0` is a contact lens on the cornea. A bare number under 3 mm (but not
/// 0) is questioned, since it is usually cm or m typed in a mm field; over
/// 30 mm is rejected. The error is attributed to [`Field::VertexFrom`]; use
/// [`Error::for_field`] for the other input.
///
/// ```
/// use lensplane_core::parse_vertex_mm;
/// assert_eq!(parse_vertex_mm("12")?.value.mm(), 12.0);
/// assert_eq!(parse_vertex_mm("1.2").unwrap_err().to_string(),
///            "vertex distance 1.2 mm is under 3 mm: did you mean 12 mm?");
/// assert_eq!(parse_vertex_mm("0.012").unwrap_err().to_string(),
///            "vertex distance 0.012 mm is under 3 mm: did you mean 12 mm?");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_vertex_mm(text: &str) -> Result<Parsed<VertexDistance>, Error> {
    let field = Field::VertexFrom;
    let toks = lex(text, field)?;
    let (t, n, unit) = single_number(&toks, field)?;
    if n.sign == Sign::Minus {
        return Err(range_error(field, format!("{} mm", n.typed()), limits::VERTEX).at(t.start));
    }
    if n.sign == Sign::PlusMinus {
        return Err(unexpected(t, field));
    }
    let m = n.magnitude();
    let mut notices = vec![];
    let mm = match word(unit) {
        None if unit.is_some() => return Err(unexpected(unit.unwrap_or(t), field)),
        None | Some("mm") => m,
        Some("cm") => {
            notices.push(notice(
                NoticeKind::UnitConverted,
                field,
                format!("{} cm read as {} mm", fmt_length(m), fmt_length(m * 10.0)),
            ));
            m * 10.0
        }
        Some("m") => {
            notices.push(notice(
                NoticeKind::UnitConverted,
                field,
                format!("{} m read as {} mm", fmt_length(m), fmt_length(m * 1000.0)),
            ));
            m * 1000.0
        }
        Some(_) => return Err(unexpected(unit.unwrap_or(t), field)),
    };
    if mm > 0.0 && mm < VERTEX_SHORT_MM {
        let candidate = if mm < 0.1 { mm * 1000.0 } else { mm * 10.0 };
        let suggestion = (VERTEX_SHORT_MM..=limits::VERTEX.max)
            .contains(&candidate)
            .then(|| fmt_length(candidate));
        return Err(Error::new(
            ErrorKind::VertexTooShort {
                typed: n.typed(),
                suggestion,
            },
            field,
            Some(t.start),
        ));
    }
    let value = VertexDistance::from_mm(mm).map_err(|e| e.at(t.start))?;
    Ok(Parsed { value, notices })
}

/// Parse a reading distance: `40 cm`, `40cm`, `16 in`, `16"`, `0.4 m`,
/// `400 mm`. A bare number is read as cm only where it cannot be anything
/// else (20–100); `16` (cm or inches?) and `0.4` (metres?) ask for the unit.
///
/// ```
/// use lensplane_core::parse_reading_distance;
/// assert_eq!(parse_reading_distance("40 cm")?.value.cm(), 40.0);
/// assert!((parse_reading_distance("16 in")?.value.cm() - 40.64).abs() < 1e-9);
/// assert_eq!(parse_reading_distance("16").unwrap_err().to_string(),
///            "reading distance 16 needs a unit: cm or in?");
/// assert_eq!(parse_reading_distance("0.4").unwrap_err().to_string(),
///            "reading distance 0.4 needs a unit: 40 cm?");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_reading_distance(text: &str) -> Result<Parsed<ReadingDistance>, Error> {
    reading_distance(text, false)
}

/// Parse a reading distance when the user has chosen inches: a bare number
/// is inches (`16` is 40.64 cm); a typed unit still wins (`40 cm`).
///
/// ```
/// use lensplane_core::parse_reading_inches;
/// assert!((parse_reading_inches("16")?.value.cm() - 40.64).abs() < 1e-9);
/// assert_eq!(parse_reading_inches("40 cm")?.value.cm(), 40.0);
/// assert_eq!(parse_reading_inches("3").unwrap_err().to_string(),
///            "reading distance 7.62 cm is outside 10–100 cm");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_reading_inches(text: &str) -> Result<Parsed<ReadingDistance>, Error> {
    reading_distance(text, true)
}

fn reading_distance(text: &str, bare_inches: bool) -> Result<Parsed<ReadingDistance>, Error> {
    let field = Field::ReadingDistance;
    let toks = lex(text, field)?;
    let (t, n, unit) = single_number(&toks, field)?;
    if n.sign == Sign::Minus || n.sign == Sign::PlusMinus {
        return Err(unexpected(t, field));
    }
    let m = n.magnitude();
    let mut notices = vec![];
    let cm = match (unit.map(|u| &u.tok), word(unit)) {
        (None, _) if bare_inches => m * CM_PER_INCH,
        (None, _) => {
            if (20.0..=limits::READING.max).contains(&m) {
                notices.push(notice(
                    NoticeKind::UnitAssumed,
                    field,
                    format!("{} read as cm", fmt_length(m)),
                ));
                m
            } else if m <= limits::READING.max {
                let suggestion = (m > 0.0 && m <= 1.0).then(|| format!("{} cm", fmt_length(m * 100.0)));
                return Err(Error::new(
                    ErrorKind::NeedsUnit {
                        typed: n.typed(),
                        suggestion,
                    },
                    field,
                    Some(t.start),
                ));
            } else {
                m
            }
        }
        (Some(Tok::Inches), _) | (_, Some("in" | "inch" | "inches")) => m * CM_PER_INCH,
        (_, Some("cm")) => m,
        (_, Some("m")) => m * 100.0,
        (_, Some("mm")) => m / 10.0,
        _ => return Err(unexpected(unit.unwrap_or(t), field)),
    };
    let value = ReadingDistance::from_cm(cm).map_err(|e| e.at(t.start))?;
    Ok(Parsed { value, notices })
}

/// Parse an add. Always plus, so no sign is needed (`2.50`, `+2.50`,
/// `add +2.50`, `2,5`); a minus is an error, as is a number that looks like
/// it lost its decimal point (`250`).
///
/// ```
/// use lensplane_core::parse_add;
/// assert_eq!(parse_add("2.50")?.value.dioptres(), 2.5);
/// assert_eq!(parse_add("-2.50").unwrap_err().to_string(), "an add is always plus");
/// assert_eq!(parse_add("250").unwrap_err().to_string(),
///            "add 250 is outside 0.00 to +4.00: did you mean +2.50?");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_add(text: &str) -> Result<Parsed<Add>, Error> {
    let (Parsed { value, notices }, start) = read_add(text, Field::Add, limits::ADD)?;
    let value = Add::new(value).map_err(|e| e.at(start))?;
    Ok(Parsed { value, notices })
}

/// An add in the notation of [`parse_add`], attributed to `field` and
/// checked against `limit`; also returns where the number starts.
pub(crate) fn read_add(text: &str, field: Field, limit: Limit) -> Result<(Parsed<f64>, usize), Error> {
    let all = lex(text, field)?;
    let toks = if word(all.first()) == Some("add") {
        &all[1..]
    } else {
        &all[..]
    };
    let (t, n, unit) = single_number(toks, field)?;
    if let Some(u) = unit {
        if word(Some(u)) != Some("d") {
            return Err(unexpected(u, field));
        }
    }
    match n.sign {
        Sign::Minus => return Err(Error::new(ErrorKind::AddNotPlus, field, Some(t.start))),
        Sign::PlusMinus if n.magnitude() != 0.0 => return Err(unexpected(t, field)),
        _ => {}
    }
    let m = n.magnitude();
    if !limit.contains(m) {
        let suggestions = restored(n, limit.max).into_iter().map(fmt_power).collect();
        return Err(Error::new(
            ErrorKind::OutOfRange {
                typed: n.typed(),
                limit,
                suggestions,
            },
            field,
            Some(t.start),
        ));
    }
    let mut notices = vec![];
    if n.comma {
        notices.push(notice(
            NoticeKind::CommaDecimal,
            field,
            format!("read the comma as a decimal point: {}", fmt_power(m)),
        ));
    }
    if let Some(message) = off_step(field, m) {
        notices.push(notice(NoticeKind::OffStep, field, message));
    }
    Ok((
        Parsed {
            value: m + 0.0,
            notices,
        },
        t.start,
    ))
}

/// Parse an age in whole years (`50`, `50 y`, `50 years`).
///
/// ```
/// use lensplane_core::parse_age;
/// assert_eq!(parse_age("50")?.value.years(), 50);
/// assert_eq!(parse_age("150").unwrap_err().to_string(), "age 150 is outside 1–110");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_age(text: &str) -> Result<Parsed<Age>, Error> {
    let field = Field::Age;
    let toks = lex(text, field)?;
    let (t, n, unit) = single_number(&toks, field)?;
    if let Some(u) = unit {
        if !matches!(word(Some(u)), Some("y" | "yr" | "yrs" | "year" | "years" | "yo")) {
            return Err(unexpected(u, field));
        }
    }
    if n.frac.is_some() {
        return Err(Error::new(
            ErrorKind::AgeNotWhole { typed: n.typed() },
            field,
            Some(t.start),
        ));
    }
    if n.sign == Sign::Minus || n.sign == Sign::PlusMinus || n.int.len() > 3 {
        return Err(range_error(field, n.typed(), limits::AGE).at(t.start));
    }
    let years: u16 = n.int.parse().unwrap_or(u16::MAX);
    let Ok(years) = u8::try_from(years) else {
        return Err(range_error(field, n.int.clone(), limits::AGE).at(t.start));
    };
    let value = Age::new(years).map_err(|e| e.at(t.start))?;
    Ok(Parsed { value, notices: vec![] })
}
