//! The lens check: is the lens that came back from the lab the lens that
//! was ordered? The focimeter reading (back vertex power) is compared with
//! the order, item by item, against the tolerance tables in
//! [`crate::tolerances`].
//!
//! Both prescriptions are compared in **minus-cylinder form**, in whole
//! hundredths of a dioptre as shown (two decimals) and whole degrees, so
//! the figures on the page are the figures judged. Bands are chosen by the
//! ordered value. Prism and centration are not checked
//! ([`PRISM_NOT_CHECKED`]).

use core::fmt;

use crate::error::{Error, ErrorKind, Field};
use crate::format::{fmt_axis, fmt_power, fmt_sphere, hundredths};
use crate::limits;
use crate::parse::{parse_rx, read_add, NoticeKind, Parsed};
use crate::tolerances::{self, LensType, Table};
use crate::{Add, Eye, Rx};

/// The sentence the lens-check page shows about what it leaves out.
pub const PRISM_NOT_CHECKED: &str = "Prism and centration are not checked: measure them on the focimeter against the ordered pupillary distances and fitting heights.";

/// One thing that is checked on a received lens.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum CheckItem {
    /// The sphere meridian (the sphere in minus-cylinder form).
    Sphere,
    /// The cylinder (minus-cylinder form).
    Cylinder,
    /// The cylinder axis.
    Axis,
    /// The near addition.
    Add,
}

impl CheckItem {
    /// The items in the order a page lists them.
    pub const ALL: [CheckItem; 4] = [CheckItem::Sphere, CheckItem::Cylinder, CheckItem::Axis, CheckItem::Add];

    /// The item's name: "sphere", "cylinder", "axis", "add".
    ///
    /// ```
    /// assert_eq!(lensplane_core::CheckItem::Cylinder.words(), "cylinder");
    /// ```
    pub fn words(self) -> &'static str {
        match self {
            CheckItem::Sphere => "sphere",
            CheckItem::Cylinder => "cylinder",
            CheckItem::Axis => "axis",
            CheckItem::Add => "add",
        }
    }
}

/// Whether a received lens (or one item of it) meets its tolerance.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum CheckVerdict {
    /// The deviation is no larger than the tolerance.
    Within,
    /// The deviation is larger than the tolerance.
    Outside,
}

impl CheckVerdict {
    /// Exactly "within tolerance" or "outside tolerance".
    ///
    /// ```
    /// assert_eq!(lensplane_core::CheckVerdict::Outside.words(), "outside tolerance");
    /// ```
    pub fn words(self) -> &'static str {
        match self {
            CheckVerdict::Within => "within tolerance",
            CheckVerdict::Outside => "outside tolerance",
        }
    }
}

impl fmt::Display for CheckVerdict {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.words())
    }
}

/// The judgement of one checked item.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Judgement {
    /// Measured − ordered: hundredths of a dioptre for powers, whole degrees
    /// for the axis (taken the short way round, −89 to +90; + means the
    /// measured axis lies counter-clockwise of the ordered one in ISO 8429
    /// angles, i.e. at a larger angle, wrapping through 180).
    pub deviation: i32,
    /// The deviation as shown: `-0.10`, `0.00`, `+3°`, `0°`.
    pub deviation_text: String,
    /// The tolerance, in the deviation's unit (always positive: ±).
    pub tolerance: u32,
    /// The tolerance as shown: `±0.13 D`, `±3°`.
    pub tolerance_text: String,
    /// The table row that applies.
    pub band: tolerances::Band,
    /// Why this tolerance, e.g. "cylinder over 2.00 to 4.50 D: ±0.15 D".
    pub why: String,
    /// Within or outside tolerance.
    pub verdict: CheckVerdict,
}

/// What became of one item.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum ItemResult {
    /// Compared with its tolerance.
    Judged(Judgement),
    /// Not checked, and why ("no add ordered", "spherical order: no axis").
    NotApplicable(String),
}

/// One item of a lens check, with every figure and word the page shows.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct ItemCheck {
    /// Which item.
    pub item: CheckItem,
    /// The ordered value as shown: `-2.00`, `plano`, `×090`, `+2.00`, `none`.
    pub ordered: String,
    /// The measured value as shown, the same way.
    pub measured: String,
    /// The judgement, or why there is none.
    pub result: ItemResult,
    /// The line for the copied text, e.g. "R sphere -2.10 (ordered -2.00):
    /// -0.10, tolerance ±0.13 D (-6.50 to +6.50 D): within tolerance".
    pub line: String,
}

impl ItemCheck {
    /// The verdict, when the item was judged.
    ///
    /// ```
    /// use lensplane_core::*;
    /// let r = lens_check(&LensCheckInput::new(Eye::Right, Rx::sphere_only(-2.0)?, Rx::sphere_only(-2.25)?))?;
    /// assert_eq!(r.items[0].verdict(), Some(CheckVerdict::Outside));
    /// assert_eq!(r.items[2].verdict(), None);
    /// # Ok::<(), Error>(())
    /// ```
    pub fn verdict(&self) -> Option<CheckVerdict> {
        match &self.result {
            ItemResult::Judged(j) => Some(j.verdict),
            ItemResult::NotApplicable(_) => None,
        }
    }
}

/// What the lens-check page sends for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct LensCheckInput {
    /// Which eye (for the copied lines: R or L).
    pub eye: Eye,
    /// Which tolerance tables apply.
    pub lens_type: LensType,
    /// The prescription ordered, either cylinder form.
    pub ordered: Rx,
    /// The focimeter reading of the received lens, either cylinder form.
    pub measured: Rx,
    /// The add ordered ([`Add::NONE`]: none).
    pub ordered_add: Add,
    /// The add read on the received lens (up to [`limits::MEASURED_ADD`]);
    /// needed when an add was ordered, ignored otherwise.
    pub measured_add: Option<f64>,
}

impl LensCheckInput {
    /// A single-vision check with no add.
    ///
    /// ```
    /// use lensplane_core::*;
    /// let input = LensCheckInput::new(Eye::Left, Rx::sphere_only(-2.0)?, Rx::sphere_only(-2.1)?);
    /// assert_eq!(input.lens_type, LensType::SingleVision);
    /// # Ok::<(), Error>(())
    /// ```
    pub fn new(eye: Eye, ordered: Rx, measured: Rx) -> LensCheckInput {
        LensCheckInput {
            eye,
            lens_type: LensType::SingleVision,
            ordered,
            measured,
            ordered_add: Add::NONE,
            measured_add: None,
        }
    }
}

/// Everything the lens-check page shows for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct LensCheckReport {
    /// Which eye.
    pub eye: Eye,
    /// Which tolerance tables were used.
    pub lens_type: LensType,
    /// The order, minus-cylinder form (as compared).
    pub ordered: Rx,
    /// The reading, minus-cylinder form (as compared).
    pub measured: Rx,
    /// Sphere, cylinder, axis, add, in that order.
    pub items: Vec<ItemCheck>,
    /// Outside tolerance when any judged item is; within otherwise.
    pub verdict: CheckVerdict,
    /// The judged items outside tolerance, in item order.
    pub outside: Vec<CheckItem>,
    /// "R overall: within tolerance" or "R overall: outside tolerance
    /// (sphere, axis)".
    pub summary: String,
    /// The copied text, line by line: what was compared, one line per item,
    /// the summary.
    pub lines: Vec<String>,
    /// What is not checked ([`PRISM_NOT_CHECKED`]).
    pub not_checked: &'static str,
}

impl LensCheckReport {
    /// The copied text: [`LensCheckReport::lines`] joined by newlines.
    ///
    /// ```
    /// use lensplane_core::*;
    /// let r = lens_check(&LensCheckInput::new(Eye::Right, Rx::sphere_only(-2.0)?, Rx::sphere_only(-2.1)?))?;
    /// assert!(r.copy_text().ends_with("R overall: within tolerance"));
    /// # Ok::<(), Error>(())
    /// ```
    pub fn copy_text(&self) -> String {
        self.lines.join("\n")
    }
}

/// Parse a focimeter reading: the notation of [`parse_rx`], either
/// cylinder form. Readings are rarely on a quarter step, so the off-step
/// notice is dropped; the others are kept.
///
/// ```
/// let p = lensplane_core::parse_measured_rx("-2.10 -1.12 x93")?;
/// assert_eq!(p.value.to_string(), "-2.10 -1.12 ×093");
/// assert!(p.notices.is_empty());
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_measured_rx(text: &str) -> Result<Parsed<Rx>, Error> {
    let mut p = parse_rx(text)?;
    p.notices.retain(|n| n.kind != NoticeKind::OffStep);
    Ok(p)
}

/// Parse the add read on a received lens: the notation of
/// [`crate::parse_add`] (always plus, no sign needed), up to +5.00
/// ([`limits::MEASURED_ADD`]) so that an over-strong add gets a verdict.
/// No off-step notice.
///
/// ```
/// use lensplane_core::parse_measured_add;
/// assert_eq!(parse_measured_add("2.10")?.value, 2.1);
/// assert_eq!(parse_measured_add("4.25")?.value, 4.25);
/// assert_eq!(parse_measured_add("5.25").unwrap_err().to_string(), "measured add 5.25 is outside 0.00 to +5.00");
/// assert_eq!(parse_measured_add("").unwrap_err().to_string(), "measured add is empty");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_measured_add(text: &str) -> Result<Parsed<f64>, Error> {
    let (mut p, _) = read_add(text, Field::MeasuredAdd, limits::MEASURED_ADD)?;
    p.notices.retain(|n| n.kind != NoticeKind::OffStep);
    Ok(p)
}

/// The axis deviation measured − ordered, taken the short way round:
/// −89 to +90 degrees (+ is a larger angle in ISO 8429 notation, wrapping
/// through 180).
///
/// ```
/// use lensplane_core::axis_deviation;
/// assert_eq!(axis_deviation(2, 179), -3);
/// assert_eq!(axis_deviation(179, 2), 3);
/// assert_eq!(axis_deviation(90, 93), 3);
/// assert_eq!(axis_deviation(180, 90), 90);
/// ```
pub fn axis_deviation(ordered: u16, measured: u16) -> i32 {
    let d = (i32::from(measured) - i32::from(ordered)).rem_euclid(180);
    if d > 90 {
        d - 180
    } else {
        d
    }
}

fn eye_letter(eye: Eye) -> &'static str {
    match eye {
        Eye::Right => "R",
        Eye::Left => "L",
    }
}

fn size(h: i64) -> u32 {
    u32::try_from(h.unsigned_abs()).unwrap_or(u32::MAX)
}

fn deviation_power_text(d: i32) -> String {
    fmt_power(f64::from(d) / 100.0)
}

fn deviation_degrees_text(d: i32) -> String {
    match d {
        0 => "0°".to_string(),
        d if d > 0 => format!("+{d}°"),
        d => format!("-{}°", d.unsigned_abs()),
    }
}

/// Judge `deviation` against the band of `table` for the ordered `size`.
fn judge(table: &Table, ordered_size: u32, deviation: i32, degrees: bool) -> Option<Judgement> {
    let band = *table.band(ordered_size);
    let tolerance = band.amount(ordered_size)?;
    let verdict = if deviation.unsigned_abs() <= tolerance {
        CheckVerdict::Within
    } else {
        CheckVerdict::Outside
    };
    let (deviation_text, tolerance_text) = if degrees {
        (deviation_degrees_text(deviation), format!("±{tolerance}°"))
    } else {
        (
            deviation_power_text(deviation),
            format!("±{} D", tolerances::hundredths_text(tolerance)),
        )
    };
    Some(Judgement {
        deviation,
        deviation_text,
        tolerance,
        tolerance_text,
        band,
        why: table.why(ordered_size),
        verdict,
    })
}

fn item(eye: Eye, item: CheckItem, ordered: String, measured: String, result: ItemResult) -> ItemCheck {
    let e = eye_letter(eye);
    let name = item.words();
    let line = match &result {
        ItemResult::Judged(j) => {
            let percent = match j.band.allowance {
                tolerances::Allowance::Percent(p) => format!(": {p} %"),
                _ => String::new(),
            };
            format!(
                "{e} {name} {measured} (ordered {ordered}): {}, tolerance {} ({}{percent}): {}",
                j.deviation_text, j.tolerance_text, j.band.range, j.verdict
            )
        }
        ItemResult::NotApplicable(why) => format!("{e} {name}: not checked ({why})"),
    };
    ItemCheck {
        item,
        ordered,
        measured,
        result,
        line,
    }
}

fn judged_or(j: Option<Judgement>, why: impl FnOnce() -> String) -> ItemResult {
    match j {
        Some(j) => ItemResult::Judged(j),
        None => ItemResult::NotApplicable(why()),
    }
}

/// Check one received lens against its order.
///
/// An error only when an add was ordered and no measured add is given
/// ("measured add is empty", at [`Field::MeasuredAdd`]).
///
/// ```
/// use lensplane_core::*;
/// // Notes §14 [derived from the table]: −2.00 −1.00 ×90 read as −2.10 −1.12 ×93.
/// let r = lens_check(&LensCheckInput::new(Eye::Right, Rx::new(-2.0, -1.0, 90)?, Rx::new(-2.1, -1.12, 93)?))?;
/// assert_eq!(r.verdict, CheckVerdict::Within);
/// assert_eq!(r.items[0].line, "R sphere -2.10 (ordered -2.00): -0.10, tolerance ±0.13 D (-6.50 to +6.50 D): within tolerance");
/// assert_eq!(r.items[2].line, "R axis ×093 (ordered ×090): +3°, tolerance ±3° (cylinder over 0.75 to 1.50 D): within tolerance");
/// assert_eq!(r.items[3].line, "R add: not checked (no add ordered)");
/// # Ok::<(), Error>(())
/// ```
pub fn lens_check(input: &LensCheckInput) -> Result<LensCheckReport, Error> {
    let eye = input.eye;
    let lens = input.lens_type;
    let ordered = input.ordered.to_minus_cyl();
    let measured = input.measured.to_minus_cyl();
    let add_ordered = hundredths(input.ordered_add.dioptres());
    let measured_add = if add_ordered > 0 {
        let Some(m) = input.measured_add else {
            return Err(Error::new(ErrorKind::Empty, Field::MeasuredAdd, None));
        };
        if !limits::MEASURED_ADD.contains(m) {
            return Err(crate::units::range_error(
                Field::MeasuredAdd,
                fmt_power(m),
                limits::MEASURED_ADD,
            ));
        }
        Some(m)
    } else {
        None
    };

    let (os, ms) = (hundredths(ordered.sphere()), hundredths(measured.sphere()));
    let (oc, mc) = (hundredths(ordered.cylinder()), hundredths(measured.cylinder()));
    let dev = |m: i64, o: i64| i32::try_from(m - o).unwrap_or(i32::MAX);

    let sphere = judge(tolerances::sphere_table(lens), size(os), dev(ms, os), false);
    let sphere = item(
        eye,
        CheckItem::Sphere,
        fmt_sphere(ordered.sphere()),
        fmt_sphere(measured.sphere()),
        judged_or(sphere, String::new),
    );

    let cylinder = judge(tolerances::cylinder_table(lens), size(oc), dev(mc, oc), false);
    let cylinder = item(
        eye,
        CheckItem::Cylinder,
        fmt_power(ordered.cylinder()),
        fmt_power(measured.cylinder()),
        judged_or(cylinder, String::new),
    );

    let axis_text = |rx: &Rx, c: i64| {
        if c == 0 {
            "none".to_string()
        } else {
            format!("\u{d7}{}", fmt_axis(rx.axis()))
        }
    };
    let axis_result = if oc == 0 {
        ItemResult::NotApplicable("spherical order: no axis".into())
    } else {
        let band = tolerances::AXIS.band(size(oc));
        if band.amount(size(oc)).is_none() {
            ItemResult::NotApplicable(tolerances::AXIS.why(size(oc)))
        } else if mc == 0 {
            ItemResult::NotApplicable("no cylinder measured: no axis to read".into())
        } else {
            let d = axis_deviation(ordered.axis(), measured.axis());
            judged_or(judge(&tolerances::AXIS, size(oc), d, true), String::new)
        }
    };
    let axis = item(
        eye,
        CheckItem::Axis,
        axis_text(&ordered, oc),
        axis_text(&measured, mc),
        axis_result,
    );

    let add = match measured_add {
        Some(m) => {
            let mh = hundredths(m);
            let j = judge(&tolerances::ADD, size(add_ordered), dev(mh, add_ordered), false);
            item(
                eye,
                CheckItem::Add,
                fmt_power(input.ordered_add.dioptres()),
                fmt_power(m),
                judged_or(j, String::new),
            )
        }
        None => item(
            eye,
            CheckItem::Add,
            "none".into(),
            input.measured_add.map_or("none".into(), fmt_power),
            ItemResult::NotApplicable("no add ordered".into()),
        ),
    };

    let items = vec![sphere, cylinder, axis, add];
    let outside: Vec<CheckItem> = items
        .iter()
        .filter(|i| i.verdict() == Some(CheckVerdict::Outside))
        .map(|i| i.item)
        .collect();
    let verdict = if outside.is_empty() {
        CheckVerdict::Within
    } else {
        CheckVerdict::Outside
    };
    let e = eye_letter(eye);
    let summary = if outside.is_empty() {
        format!("{e} overall: {verdict}")
    } else {
        let names: Vec<_> = outside.iter().map(|i| i.words()).collect();
        format!("{e} overall: {verdict} ({})", names.join(", "))
    };
    let add_words = |a: Option<f64>| a.map_or(String::new(), |a| format!(" add {}", fmt_power(a)));
    let header = format!(
        "{e} ordered {ordered}{}, measured {measured}{}; {} tolerances of ANSI Z80.1-2015 (as publicly summarised)",
        add_words((add_ordered > 0).then(|| input.ordered_add.dioptres())),
        add_words(measured_add),
        lens.words()
    );
    let mut lines = vec![header];
    lines.extend(items.iter().map(|i| i.line.clone()));
    lines.push(summary.clone());
    Ok(LensCheckReport {
        eye,
        lens_type: lens,
        ordered,
        measured,
        items,
        verdict,
        outside,
        summary,
        lines,
        not_checked: PRISM_NOT_CHECKED,
    })
}
