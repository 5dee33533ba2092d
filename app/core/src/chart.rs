//! A printable vertex conversion chart: spectacle powers (minus and plus)
//! and what each becomes at another plane, exact and orderable, by exactly
//! the vertex panel's formulas and rounding ([`compensate_power`], the
//! ladders and tie rule of [`OrderSettings::default`]).

use crate::error::{Error, ErrorKind, Field};
use crate::format::{fmt_length, fmt_number, fmt_sphere, hundredths};
use crate::lex::{lex, Sign};
use crate::limits::{self, CHART_POWER, CHART_QUARTER, CHART_ROWS, CHART_STEP};
use crate::parse::{parse_vertex_mm, single_number, unexpected, word, Notice, NoticeKind, Parsed};
use crate::rounding::{is_on_step, Ladder, OrderSettings};
use crate::units::range_error;
use crate::{compensate_power, LadderKind, Rx, VertexDistance};

impl LadderKind {
    /// Both ladders, in the order a page offers them.
    pub const ALL: [LadderKind; 2] = [LadderKind::ContactLens, LadderKind::Spectacle];

    /// The value in a link: `cl` or `spec`.
    ///
    /// ```
    /// assert_eq!(lensplane_core::LadderKind::ContactLens.link_value(), "cl");
    /// ```
    pub fn link_value(self) -> &'static str {
        match self {
            LadderKind::ContactLens => "cl",
            LadderKind::Spectacle => "spec",
        }
    }

    /// Plain words: "contact-lens steps", "spectacle quarter steps".
    ///
    /// ```
    /// assert_eq!(lensplane_core::LadderKind::Spectacle.words(), "spectacle quarter steps");
    /// ```
    pub fn words(self) -> &'static str {
        match self {
            LadderKind::ContactLens => "contact-lens steps",
            LadderKind::Spectacle => "spectacle quarter steps",
        }
    }

    /// Read a link value: `cl` or `spec` (any case, spaces trimmed); empty
    /// or missing is `None` (the default for the target plane).
    ///
    /// ```
    /// use lensplane_core::LadderKind;
    /// assert_eq!(LadderKind::from_link("spec")?, Some(LadderKind::Spectacle));
    /// assert_eq!(LadderKind::from_link(" ")?, None);
    /// assert_eq!(LadderKind::from_link("half").unwrap_err().to_string(),
    ///            "ladder \"half\" is not one of cl (contact-lens steps), spec (spectacle quarter steps)");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn from_link(text: &str) -> Result<Option<LadderKind>, Error> {
        let t = text.trim();
        if t.is_empty() {
            return Ok(None);
        }
        LadderKind::ALL
            .into_iter()
            .find(|l| t.eq_ignore_ascii_case(l.link_value()))
            .map(Some)
            .ok_or_else(|| {
                Error::new(
                    ErrorKind::UnknownChoice {
                        typed: t.to_string(),
                        choices: "cl (contact-lens steps), spec (spectacle quarter steps)",
                    },
                    Field::Ladder,
                    None,
                )
            })
    }

    /// The default ladder for a target plane, as the vertex panel chooses:
    /// contact-lens steps at the cornea, spectacle steps otherwise.
    ///
    /// ```
    /// use lensplane_core::{LadderKind, VertexDistance};
    /// assert_eq!(LadderKind::for_target(VertexDistance::CORNEA), LadderKind::ContactLens);
    /// ```
    pub fn for_target(to: VertexDistance) -> LadderKind {
        if to.is_cornea() {
            LadderKind::ContactLens
        } else {
            LadderKind::Spectacle
        }
    }

    /// The ladder itself, from `settings`.
    ///
    /// ```
    /// use lensplane_core::{Ladder, LadderKind, OrderSettings};
    /// assert_eq!(LadderKind::ContactLens.ladder(&OrderSettings::default()), Ladder::CONTACT_LENS);
    /// ```
    pub fn ladder(self, settings: &OrderSettings) -> Ladder {
        match self {
            LadderKind::ContactLens => settings.contact_lens,
            LadderKind::Spectacle => settings.spectacle,
        }
    }
}

/// The link values of a chart, as text; `None` takes the default
/// (`from` 12, `to` 0, `min` 4, `max` 20, `step` 0.25, `ladder` by the
/// target plane).
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub struct ChartQuery<'a> {
    /// `from`: vertex distance of the listed powers, mm.
    pub from: Option<&'a str>,
    /// `to`: vertex distance they move to, mm (0: cornea).
    pub to: Option<&'a str>,
    /// `min`: smallest power size, D (both signs are listed).
    pub min: Option<&'a str>,
    /// `max`: largest power size, D.
    pub max: Option<&'a str>,
    /// `step`: step between sizes, D.
    pub step: Option<&'a str>,
    /// `ladder`: `cl` or `spec`.
    pub ladder: Option<&'a str>,
}

/// Checked chart settings (build with [`ChartSettings::new`] or
/// [`parse_chart`]).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ChartSettings {
    from: VertexDistance,
    to: VertexDistance,
    min: u32,
    max: u32,
    step: u32,
    ladder: LadderKind,
}

impl Default for ChartSettings {
    /// 12 mm → cornea, sizes 4.00 to 20.00 in 0.25 steps, contact-lens steps.
    fn default() -> ChartSettings {
        ChartSettings {
            from: VertexDistance::SPECTACLES,
            to: VertexDistance::CORNEA,
            min: 400,
            max: 2000,
            step: 25,
            ladder: LadderKind::ContactLens,
        }
    }
}

fn size_text(h: u32) -> String {
    fmt_number(f64::from(h) / 100.0)
}

/// A chart figure (size or step) in whole hundredths, checked: finite,
/// a whole number of quarter dioptres, within `limit`.
fn quarter_hundredths(x: f64, field: Field, limit: limits::Limit) -> Result<u32, Error> {
    if !x.is_finite() {
        return Err(Error::new(ErrorKind::NotANumber, field, None));
    }
    // Off a quarter step first where a neighbour step is allowed (a step of
    // 0.10 is best answered "try 0.25"), then the range.
    if (0.0..=limit.max).contains(&x) && !is_on_step(x, CHART_QUARTER) {
        let below = (x / CHART_QUARTER).floor() * CHART_QUARTER;
        let suggestions = [below, below + CHART_QUARTER]
            .into_iter()
            .filter(|c| limit.contains(*c))
            .map(fmt_number)
            .collect();
        return Err(Error::new(
            ErrorKind::OffQuarter {
                typed: fmt_number(x),
                suggestions,
            },
            field,
            None,
        ));
    }
    if !limit.contains(x) {
        return Err(range_error(field, fmt_number(x), limit));
    }
    Ok(u32::try_from(hundredths(x)).unwrap_or(0))
}

impl ChartSettings {
    /// Checked settings. `min` and `max` are power sizes (0–30 D, both
    /// signs are listed), `step` the step between them; all three whole
    /// numbers of quarter dioptres, `min` ≤ `max`, the step leading from
    /// `min` to `max` exactly, at most 200 rows. `ladder: None` is the
    /// default for `to` ([`LadderKind::for_target`]).
    ///
    /// ```
    /// use lensplane_core::{ChartSettings, VertexDistance as V};
    /// let s = ChartSettings::new(V::SPECTACLES, V::CORNEA, 4.0, 20.0, 0.25, None)?;
    /// assert_eq!(s.rows(), 130);
    /// let e = ChartSettings::new(V::SPECTACLES, V::CORNEA, 4.0, 20.0, 0.0, None).unwrap_err();
    /// assert_eq!(e.to_string(), "step 0.00 must be more than 0");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn new(
        from: VertexDistance,
        to: VertexDistance,
        min: f64,
        max: f64,
        step: f64,
        ladder: Option<LadderKind>,
    ) -> Result<ChartSettings, Error> {
        let min_h = quarter_hundredths(min, Field::ChartMin, CHART_POWER)?;
        let max_h = quarter_hundredths(max, Field::ChartMax, CHART_POWER)?;
        if step.is_finite() && step <= 0.0 {
            return Err(Error::new(
                ErrorKind::StepNotPositive {
                    typed: fmt_number(step),
                },
                Field::ChartStep,
                None,
            ));
        }
        let step_h = quarter_hundredths(step, Field::ChartStep, CHART_STEP)?;
        if min_h > max_h {
            return Err(Error::new(
                ErrorKind::MinAboveMax {
                    min: size_text(min_h),
                    max: size_text(max_h),
                },
                Field::ChartMin,
                None,
            ));
        }
        let span = max_h - min_h;
        if !span.is_multiple_of(step_h) {
            let lower = min_h + span / step_h * step_h;
            let upper = lower + step_h;
            let suggestions = [lower, upper]
                .into_iter()
                .filter(|h| CHART_POWER.contains(f64::from(*h) / 100.0))
                .map(size_text)
                .collect();
            return Err(Error::new(
                ErrorKind::StepDoesNotDivide {
                    step: size_text(step_h),
                    min: size_text(min_h),
                    max: size_text(max_h),
                    suggestions,
                },
                Field::ChartStep,
                None,
            ));
        }
        let settings = ChartSettings {
            from,
            to,
            min: min_h,
            max: max_h,
            step: step_h,
            ladder: ladder.unwrap_or(LadderKind::for_target(to)),
        };
        let rows = settings.rows();
        if !CHART_ROWS.contains(rows as f64) {
            return Err(Error::new(
                ErrorKind::TooManyRows {
                    rows,
                    limit: CHART_ROWS,
                },
                Field::ChartStep,
                None,
            ));
        }
        Ok(settings)
    }

    /// Where the listed powers are worn.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ChartSettings::default().from().mm(), 12.0);
    /// ```
    pub fn from(&self) -> VertexDistance {
        self.from
    }

    /// Where they move to.
    ///
    /// ```
    /// assert!(lensplane_core::ChartSettings::default().to().is_cornea());
    /// ```
    pub fn to(&self) -> VertexDistance {
        self.to
    }

    /// Smallest power size, dioptres.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ChartSettings::default().min(), 4.0);
    /// ```
    pub fn min(&self) -> f64 {
        f64::from(self.min) / 100.0
    }

    /// Largest power size, dioptres.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ChartSettings::default().max(), 20.0);
    /// ```
    pub fn max(&self) -> f64 {
        f64::from(self.max) / 100.0
    }

    /// Step between sizes, dioptres.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ChartSettings::default().step(), 0.25);
    /// ```
    pub fn step(&self) -> f64 {
        f64::from(self.step) / 100.0
    }

    /// Which ladder the orderable column uses.
    ///
    /// ```
    /// use lensplane_core::{ChartSettings, LadderKind};
    /// assert_eq!(ChartSettings::default().ladder(), LadderKind::ContactLens);
    /// ```
    pub fn ladder(&self) -> LadderKind {
        self.ladder
    }

    /// How many rows the chart has: each size minus and plus, plano once.
    ///
    /// ```
    /// assert_eq!(lensplane_core::ChartSettings::default().rows(), 130);
    /// ```
    pub fn rows(&self) -> usize {
        let sizes = ((self.max - self.min) / self.step + 1) as usize;
        2 * sizes - usize::from(self.min == 0)
    }

    /// The settings in one line, as the history lists a saved chart: both
    /// planes, the powers and the ladder.
    ///
    /// ```
    /// assert_eq!(
    ///     lensplane_core::ChartSettings::default().summary(),
    ///     "12 mm → cornea (contact lens), minus and plus 4.00 to 20.00 D in 0.25 D steps, contact-lens steps"
    /// );
    /// ```
    pub fn summary(&self) -> String {
        format!(
            "{} \u{2192} {}, minus and plus {} to {} D in {} D steps, {}",
            plane_words(self.from),
            plane_words(self.to),
            size_text(self.min),
            size_text(self.max),
            size_text(self.step),
            self.ladder.words()
        )
    }

    /// The link values of these settings, in key order
    /// (`from`, `to`, `min`, `max`, `step`, `ladder`).
    ///
    /// ```
    /// let q = lensplane_core::ChartSettings::default().link_values();
    /// assert_eq!(q.map(|(_, v)| v), ["12", "0", "4", "20", "0.25", "cl"].map(String::from));
    /// ```
    pub fn link_values(&self) -> [(&'static str, String); 6] {
        let h = |x: u32| fmt_length(f64::from(x) / 100.0);
        [
            ("from", fmt_length(self.from.mm())),
            ("to", fmt_length(self.to.mm())),
            ("min", h(self.min)),
            ("max", h(self.max)),
            ("step", h(self.step)),
            ("ladder", self.ladder.link_value().to_string()),
        ]
    }
}

/// A chart size or step as typed: a number with an optional `D`. A sign is
/// read as the size with a notice (both signs are listed).
fn read_size(text: &str, field: Field) -> Result<(f64, Vec<Notice>), Error> {
    let toks = lex(text, field)?;
    let (t, n, unit) = single_number(&toks, field)?;
    if let Some(u) = unit {
        if word(Some(u)) != Some("d") {
            return Err(unexpected(u, field));
        }
    }
    let m = n.magnitude();
    let mut notices = vec![];
    if field == Field::ChartStep {
        if n.sign == Sign::Minus {
            return Err(Error::new(
                ErrorKind::StepNotPositive { typed: n.typed() },
                field,
                Some(t.start),
            ));
        }
    } else if matches!(n.sign, Sign::Minus | Sign::PlusMinus) && m != 0.0 {
        notices.push(Notice {
            kind: NoticeKind::SignIgnored,
            field,
            message: format!("the chart lists both signs: {} read as {}", n.typed(), fmt_number(m)),
        });
    }
    if n.comma {
        notices.push(Notice {
            kind: NoticeKind::CommaDecimal,
            field,
            message: format!("read the comma as a decimal point: {}", fmt_number(m)),
        });
    }
    Ok((m, notices))
}

/// Read a chart's link values (or form fields) and check them. Each error
/// is attributed to its own field: [`Field::VertexFrom`],
/// [`Field::VertexTo`], [`Field::ChartMin`], [`Field::ChartMax`],
/// [`Field::ChartStep`], [`Field::Ladder`].
///
/// ```
/// use lensplane_core::{parse_chart, ChartQuery, Field};
/// let p = parse_chart(&ChartQuery::default())?;
/// assert_eq!(p.value, lensplane_core::ChartSettings::default());
/// let e = parse_chart(&ChartQuery { min: Some("20"), max: Some("4"), ..ChartQuery::default() }).unwrap_err();
/// assert_eq!(e.to_string(), "lowest power 20.00 is above the highest power, 4.00");
/// assert_eq!(e.field(), Field::ChartMin);
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_chart(q: &ChartQuery<'_>) -> Result<Parsed<ChartSettings>, Error> {
    let mut notices = vec![];
    let from = parse_vertex_mm(q.from.unwrap_or("12"))?;
    notices.extend(from.notices);
    let to = parse_vertex_mm(q.to.unwrap_or("0")).map_err(|e| e.for_field(Field::VertexTo))?;
    notices.extend(to.notices.into_iter().map(|n| Notice {
        field: Field::VertexTo,
        ..n
    }));
    let mut size = |text: Option<&str>, default: &str, field: Field| -> Result<f64, Error> {
        let (v, n) = read_size(text.unwrap_or(default), field)?;
        notices.extend(n);
        Ok(v)
    };
    let min = size(q.min, "4", Field::ChartMin)?;
    let max = size(q.max, "20", Field::ChartMax)?;
    let step = size(q.step, "0.25", Field::ChartStep)?;
    let ladder = LadderKind::from_link(q.ladder.unwrap_or(""))?;
    let value = ChartSettings::new(from.value, to.value, min, max, step, ladder)?;
    Ok(Parsed { value, notices })
}

/// Which part of the chart a row is in.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum ChartSection {
    /// The plano row (when the chart starts at 0).
    Plano,
    /// Minus powers.
    Minus,
    /// Plus powers.
    Plus,
}

/// The figures of one row.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ChartValue {
    /// The exact power at the target plane (shown with two decimals).
    pub exact: f64,
    /// The orderable power on the chart's ladder.
    pub orderable: f64,
}

/// One row: a power at `from` and what it becomes at `to`, or why there is
/// no finite lens (the far point at, or practically at, the new plane).
#[derive(Clone, Debug, PartialEq)]
pub struct ChartRow {
    /// The power at `from`, dioptres.
    pub power: f64,
    /// Minus, plus or plano.
    pub section: ChartSection,
    /// The figures, or the error for this row.
    pub value: Result<ChartValue, Error>,
    /// The row as shown and exported: power, exact, orderable; a row
    /// without a finite lens shows `no finite lens` and `none`.
    pub cells: [String; 3],
}

/// A conversion chart: its title, column headings and rows.
#[derive(Clone, Debug, PartialEq)]
pub struct Chart {
    /// The settings it was made with.
    pub settings: ChartSettings,
    /// E.g. "Vertex conversion chart: 12 mm → cornea (contact lens),
    /// contact-lens steps".
    pub title: String,
    /// The powers listed and how they are rounded, in one line.
    pub subtitle: String,
    /// Column headings (ASCII): power at `from`, exact at `to`, to order.
    pub header: [String; 3],
    /// Plano (when listed), the minus powers by size, then the plus powers.
    pub rows: Vec<ChartRow>,
}

fn plane_words(d: VertexDistance) -> String {
    if d.is_cornea() {
        "cornea (contact lens)".to_string()
    } else {
        format!("{} mm", fmt_length(d.mm()))
    }
}

fn plane_heading(d: VertexDistance) -> String {
    if d.is_cornea() {
        "the cornea".to_string()
    } else {
        format!("{} mm", fmt_length(d.mm()))
    }
}

fn row(power: f64, section: ChartSection, s: &ChartSettings, order: &OrderSettings) -> ChartRow {
    let ladder = s.ladder.ladder(order);
    let value = compensate_power(power, s.from, s.to).map(|exact| ChartValue {
        exact,
        orderable: ladder.round(exact, order.tie),
    });
    let cells = match &value {
        Ok(v) => [fmt_sphere(power), fmt_sphere(v.exact), fmt_sphere(v.orderable)],
        Err(_) => [fmt_sphere(power), "no finite lens".into(), "none".into()],
    };
    ChartRow {
        power,
        section,
        value,
        cells,
    }
}

impl Chart {
    /// The chart for `settings`, rounded as the vertex panel rounds
    /// ([`OrderSettings::default`]).
    ///
    /// ```
    /// use lensplane_core::{Chart, ChartSettings};
    /// let c = Chart::new(&ChartSettings::default());
    /// assert_eq!(c.title, "Vertex conversion chart: 12 mm → cornea (contact lens), contact-lens steps");
    /// assert_eq!(c.rows.len(), 130);
    /// // Notes §15 [textbook method]: −6.00 at 12 mm is −5.5970 at the cornea.
    /// let r = &c.rows[8];
    /// assert_eq!(r.cells, ["-6.00", "-5.60", "-5.50"].map(String::from));
    /// ```
    pub fn new(settings: &ChartSettings) -> Chart {
        let order = OrderSettings::default();
        let s = settings;
        let sizes = (s.min..=s.max).step_by(s.step as usize);
        let mut rows = Vec::with_capacity(s.rows());
        if s.min == 0 {
            rows.push(row(0.0, ChartSection::Plano, s, &order));
        }
        for h in sizes.clone().filter(|h| *h > 0) {
            rows.push(row(-f64::from(h) / 100.0, ChartSection::Minus, s, &order));
        }
        for h in sizes.filter(|h| *h > 0) {
            rows.push(row(f64::from(h) / 100.0, ChartSection::Plus, s, &order));
        }
        let title = format!(
            "Vertex conversion chart: {} \u{2192} {}, {}",
            plane_words(s.from),
            plane_words(s.to),
            s.ladder.words()
        );
        let subtitle = format!(
            "Minus and plus powers {} to {} D in {} D steps; exact values to two decimals, orderable values on {} (ties toward plus)",
            size_text(s.min),
            size_text(s.max),
            size_text(s.step),
            s.ladder.words()
        );
        let header = [
            format!("Power at {}", plane_heading(s.from)),
            format!("Exact at {}", plane_heading(s.to)),
            format!("To order ({})", s.ladder.words()),
        ];
        Chart {
            settings: *settings,
            title,
            subtitle,
            header,
            rows,
        }
    }

    /// The rows of a carried prescription's principal meridians (sphere,
    /// and sphere + cylinder), taken as powers at the chart's `from` plane:
    /// the indices of the rows whose power equals a meridian to the
    /// hundredth, in meridian order, each once. A meridian between the
    /// chart's powers has no row.
    ///
    /// ```
    /// use lensplane_core::{Chart, ChartSettings, Rx};
    /// let c = Chart::new(&ChartSettings::default());
    /// let rows = c.rows_for(&Rx::new(-6.0, -2.0, 180)?);
    /// assert_eq!(rows.iter().map(|&i| c.rows[i].cells[0].as_str()).collect::<Vec<_>>(), ["-6.00", "-8.00"]);
    /// assert!(c.rows_for(&Rx::sphere_only(-2.0)?).is_empty());
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn rows_for(&self, rx: &Rx) -> Vec<usize> {
        let mut out = Vec::new();
        for m in rx.meridians().both() {
            let h = hundredths(m.power);
            if let Some(i) = self.rows.iter().position(|r| hundredths(r.power) == h) {
                if !out.contains(&i) {
                    out.push(i);
                }
            }
        }
        out
    }

    /// The chart as CSV (RFC 4180: comma-separated, CRLF line ends, ASCII):
    /// the header row, then one row per power, the same cells as shown.
    ///
    /// ```
    /// let csv = lensplane_core::Chart::new(&lensplane_core::ChartSettings::default()).csv();
    /// assert!(csv.starts_with("Power at 12 mm,Exact at the cornea,To order (contact-lens steps)\r\n-4.00,-3.82,-3.75\r\n"));
    /// ```
    pub fn csv(&self) -> String {
        let mut out = String::new();
        let lines = std::iter::once(&self.header).chain(self.rows.iter().map(|r| &r.cells));
        for cells in lines {
            out.push_str(&cells.join(","));
            out.push_str("\r\n");
        }
        out
    }
}
