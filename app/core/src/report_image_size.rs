//! The image-size panel's entry points: one eye ([`image_size_report`]),
//! then both eyes together ([`compare_image_sizes`]).

use crate::error::{Error, Field};
use crate::limits::ANISEIKONIA_TOLERANCE;
use crate::magnification::{meridian_size, MeridianSize, ANTERIOR_FOCAL_POINT_MM};
use crate::percent::tenths_of_percent;
use crate::warnings::{rx_warnings, vertex_warnings, Warning, WarningKind};
use crate::{
    fmt_dioptres, fmt_length, fmt_number, fmt_percent, fmt_percent_size, Eye, LensForm, PowerMatrix, Rx, VertexDistance,
};

/// Rule of thumb for spectacles [common practice]: about 1.5 % of image
/// size difference per dioptre of anisometropia.
pub const SPECTACLE_PERCENT_PER_DIOPTRE: f64 = 1.5;
/// In contact lenses, about a fifth of the spectacle figure [common
/// practice].
pub const CONTACT_LENS_SHARE: f64 = 0.2;

/// Said when no lens form is given.
pub const SHAPE_FACTOR_LEFT_OUT: &str = "shape factor left out: lens form not given";

/// What the image-size panel sends for one eye.
#[derive(Clone, Debug, PartialEq)]
pub struct ImageSizeInput {
    /// The spectacle prescription (link `r` / `l`).
    pub rx: Rx,
    /// Its vertex distance (link `from`); above 0 (these are spectacles).
    pub vertex: VertexDistance,
    /// The spectacle lens form, if known (links `rf`, `rt`, `rn` / `lf`,
    /// `lt`, `ln`).
    pub form: Option<LensForm>,
}

/// Everything the image-size panel shows for one eye. Fractions print with
/// [`fmt_percent`].
#[derive(Clone, Debug, PartialEq)]
pub struct ImageSizeReport {
    /// The prescription as entered.
    pub input: Rx,
    /// The spectacle vertex distance.
    pub vertex: VertexDistance,
    /// The lens form used, if any.
    pub form: Option<LensForm>,
    /// Per principal meridian (the prescription's axis first; one entry
    /// when spherical).
    pub meridians: Vec<MeridianSize>,
    /// In the horizontal (180) meridian, for comparing the eyes.
    pub horizontal: MeridianSize,
    /// In the vertical (090) meridian, for comparing the eyes.
    pub vertical: MeridianSize,
    /// [`SHAPE_FACTOR_LEFT_OUT`] when no lens form was given.
    pub shape_note: Option<&'static str>,
    /// One line in plain words.
    pub summary: String,
    /// Warnings (entry checks, an unusual vertex distance).
    pub warnings: Vec<Warning>,
}

/// "13.6 % larger than uncorrected", "the same size as uncorrected".
fn against_uncorrected(fraction: f64) -> String {
    match tenths_of_percent(fraction).signum() {
        0 => "the same size as uncorrected".into(),
        1 => format!("{} larger than uncorrected", fmt_percent_size(fraction)),
        _ => format!("{} smaller than uncorrected", fmt_percent_size(fraction)),
    }
}

/// "makes them 9.6 % smaller", "leaves them the same size".
fn switching(fraction: f64) -> String {
    match tenths_of_percent(fraction).signum() {
        0 => "leaves them the same size".into(),
        1 => format!("makes them {} larger", fmt_percent_size(fraction)),
        _ => format!("makes them {} smaller", fmt_percent_size(fraction)),
    }
}

/// Compute the image-size panel for one eye.
///
/// ```
/// use lensplane_core::*;
/// let r = image_size_report(&ImageSizeInput { rx: Rx::sphere_only(8.0)?, vertex: VertexDistance::SPECTACLES, form: None })?;
/// assert_eq!(fmt_percent(r.meridians[0].spectacles), "+13.6 %");
/// assert_eq!(r.shape_note, Some("shape factor left out: lens form not given"));
/// assert_eq!(r.summary, "in spectacles images are 13.6 % larger than uncorrected, in contact lenses 2.7 % larger than uncorrected; changing to contact lenses makes them 9.6 % smaller");
/// assert_eq!(image_size_report(&ImageSizeInput { vertex: VertexDistance::CORNEA, ..ImageSizeInput {
///     rx: Rx::sphere_only(8.0)?, vertex: VertexDistance::SPECTACLES, form: None } }).unwrap_err().to_string(),
///     "vertex distance 0 mm is a contact lens: give the spectacle vertex distance");
/// # Ok::<(), Error>(())
/// ```
pub fn image_size_report(input: &ImageSizeInput) -> Result<ImageSizeReport, Error> {
    let ImageSizeInput { rx, vertex, form } = input;
    if vertex.is_cornea() {
        return Err(Error::new(
            crate::error::ErrorKind::SpectacleVertexNeeded,
            Field::VertexFrom,
            None,
        ));
    }
    let cross = rx.meridians();
    let mut meridians = vec![];
    for m in cross.both() {
        meridians.push(meridian_size(m.power, m.axis, *vertex, form.as_ref())?);
    }
    if rx.is_spherical() {
        meridians.truncate(1);
    }
    let matrix = PowerMatrix::from_rx(rx);
    let horizontal = meridian_size(matrix.power_in_meridian(180.0), 180, *vertex, form.as_ref())?;
    let vertical = meridian_size(matrix.power_in_meridian(90.0), 90, *vertex, form.as_ref())?;
    let mut warnings = rx_warnings(rx);
    warnings.extend(
        vertex_warnings(rx, *vertex, VertexDistance::CORNEA)
            .into_iter()
            .filter(|w| w.kind == WarningKind::UnusualVertex),
    );
    let summary = if meridians.len() == 1 {
        let m = &meridians[0];
        format!(
            "in spectacles images are {}, in contact lenses {}; changing to contact lenses {}",
            against_uncorrected(m.spectacles),
            against_uncorrected(m.contact_lens),
            switching(m.change),
        )
    } else {
        let part = |m: &MeridianSize| {
            format!(
                "in the {} meridian {} in spectacles, {} in contact lenses (change {})",
                crate::fmt_axis(m.axis),
                fmt_percent(m.spectacles),
                fmt_percent(m.contact_lens),
                fmt_percent(m.change)
            )
        };
        format!(
            "image size against the uncorrected eye: {}; {}",
            part(&meridians[0]),
            part(&meridians[1])
        )
    };
    Ok(ImageSizeReport {
        input: *rx,
        vertex: *vertex,
        form: *form,
        meridians,
        horizontal,
        vertical,
        shape_note: form.is_none().then_some(SHAPE_FACTOR_LEFT_OUT),
        summary,
        warnings,
    })
}

/// How a difference between the eyes' image sizes usually goes down, by
/// [`ANISEIKONIA_TOLERANCE`] (about 3–5 %, common practice), judged on the
/// figure as shown (one decimal).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Tolerance {
    /// Below about 3 %: usually tolerated.
    Usual,
    /// About 3–5 %: may not be tolerated.
    Borderline,
    /// Above about 5 %: often not tolerated.
    Poor,
}

impl Tolerance {
    fn of(fraction: f64) -> Tolerance {
        let shown = tenths_of_percent(fraction) as f64 / 10.0;
        if shown < ANISEIKONIA_TOLERANCE.min {
            Tolerance::Usual
        } else if shown <= ANISEIKONIA_TOLERANCE.max {
            Tolerance::Borderline
        } else {
            Tolerance::Poor
        }
    }

    /// Plain words, with the thresholds written as every percentage on the
    /// page is (one decimal, [`fmt_percent_size`]).
    ///
    /// ```
    /// use lensplane_core::Tolerance;
    /// assert_eq!(Tolerance::Usual.words(), "below about 3.0 %, usually tolerated");
    /// assert_eq!(Tolerance::Borderline.words(), "between about 3.0 % and 5.0 %, where a difference may not be tolerated");
    /// assert_eq!(Tolerance::Poor.words(), "above about 5.0 %, often not tolerated");
    /// ```
    pub fn words(self) -> String {
        let l = ANISEIKONIA_TOLERANCE;
        let (min, max) = (fmt_percent_size(l.min / 100.0), fmt_percent_size(l.max / 100.0));
        match self {
            Tolerance::Usual => format!("below about {min}, usually tolerated"),
            Tolerance::Borderline => format!("between about {min} and {max}, where a difference may not be tolerated"),
            Tolerance::Poor => format!("above about {max}, often not tolerated"),
        }
    }
}

/// The two eyes compared in one meridian.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct MeridianDifference {
    /// The meridian, degrees (180 or 90).
    pub axis: u16,
    /// Anisometropia in this meridian: |F_R − F_L| at the spectacle plane, D.
    pub anisometropia: f64,
    /// Difference in spectacles: larger magnification / smaller − 1 (a
    /// fraction, ≥ 0).
    pub spectacles: f64,
    /// The same in contact lenses.
    pub contact_lenses: f64,
    /// Which eye's image is larger in spectacles (`None`: equal as shown).
    pub larger_in_spectacles: Option<Eye>,
    /// Which eye's image is larger in contact lenses.
    pub larger_in_contact_lenses: Option<Eye>,
    /// The rule of thumb for spectacles: 1.5 % per dioptre (a fraction).
    pub rule_of_thumb_spectacles: f64,
    /// The rule of thumb for contact lenses: a fifth of that (a fraction).
    pub rule_of_thumb_contact_lenses: f64,
}

/// An outline to draw one eye's image size: an ellipse with semi-axes
/// `along` (in the meridian `axis`) and `across` (90° away), scaled so that
/// the largest semi-axis of the four outlines of a comparison is 1.0.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Outline {
    /// Semi-axis in the meridian `axis`.
    pub along: f64,
    /// Semi-axis 90° away.
    pub across: f64,
    /// Direction of `along`, ISO 8429 degrees (counter-clockwise as seen
    /// facing the patient).
    pub axis: u16,
}

impl Outline {
    /// The SVG transform that turns an ellipse drawn with `rx = along`,
    /// `ry = across` to its axis (SVG's y axis points down, so the ISO
    /// angle turns the other way).
    ///
    /// ```
    /// let o = lensplane_core::Outline { along: 1.0, across: 0.9, axis: 30 };
    /// assert_eq!(o.svg_rotate(), "rotate(-30)");
    /// ```
    pub fn svg_rotate(&self) -> String {
        format!("rotate(-{})", self.axis % 180)
    }

    /// The SVG `rx` and `ry` of this outline drawn at `radius` drawing units
    /// for a semi-axis of 1.0 (the largest of a comparison), two decimals,
    /// so the view draws to scale without computing.
    ///
    /// ```
    /// let o = lensplane_core::Outline { along: 1.0, across: 0.9, axis: 30 };
    /// assert_eq!(o.svg_radii(40.0), ("40.00".to_string(), "36.00".to_string()));
    /// ```
    pub fn svg_radii(&self, radius: f64) -> (String, String) {
        (fmt_number(self.along * radius), fmt_number(self.across * radius))
    }
}

/// The two eyes' outlines for one kind of correction.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct OutlinePair {
    /// Right eye.
    pub right: Outline,
    /// Left eye.
    pub left: Outline,
}

/// The two eyes compared.
#[derive(Clone, Debug, PartialEq)]
pub struct ImageSizeComparison {
    /// In the horizontal (180) meridian.
    pub horizontal: MeridianDifference,
    /// In the vertical (090) meridian.
    pub vertical: MeridianDifference,
    /// The larger spectacle difference of the two meridians, judged.
    pub spectacles: Tolerance,
    /// The larger contact-lens difference, judged.
    pub contact_lenses: Tolerance,
    /// Outlines in spectacles, to scale.
    pub spectacle_outlines: OutlinePair,
    /// Outlines in contact lenses, to scale with the spectacle ones.
    pub contact_lens_outlines: OutlinePair,
    /// The reading in plain words (figures, rule of thumb, tolerance).
    pub reading: String,
    /// Knapp's law, in plain words: the tool informs, it does not decide.
    pub knapp: String,
}

fn ratio_difference(right: f64, left: f64) -> (f64, Option<Eye>) {
    let (large, small, eye) = if right >= left {
        (right, left, Eye::Right)
    } else {
        (left, right, Eye::Left)
    };
    let d = large / small - 1.0 + 0.0;
    (d, (tenths_of_percent(d) != 0).then_some(eye))
}

fn difference(axis: u16, r: &MeridianSize, l: &MeridianSize) -> MeridianDifference {
    let (spectacles, larger_in_spectacles) = ratio_difference(r.spectacle_magnification, l.spectacle_magnification);
    let (contact_lenses, larger_in_contact_lenses) =
        ratio_difference(r.contact_lens_magnification, l.contact_lens_magnification);
    let anisometropia = (r.spectacle_power - l.spectacle_power).abs();
    let rule = anisometropia * SPECTACLE_PERCENT_PER_DIOPTRE / 100.0;
    MeridianDifference {
        axis,
        anisometropia,
        spectacles,
        contact_lenses,
        larger_in_spectacles,
        larger_in_contact_lenses,
        rule_of_thumb_spectacles: rule,
        rule_of_thumb_contact_lenses: rule * CONTACT_LENS_SHARE,
    }
}

fn outline(report: &ImageSizeReport, contact_lens: bool) -> Outline {
    let size = |m: &MeridianSize| {
        if contact_lens {
            m.contact_lens_magnification
        } else {
            m.spectacle_magnification
        }
    };
    let first = &report.meridians[0];
    let across = report.meridians.get(1).map_or(size(first), size);
    Outline {
        along: size(first),
        across,
        axis: first.axis,
    }
}

fn eye_words(eye: Option<Eye>) -> &'static str {
    match eye {
        Some(Eye::Right) => ", the right larger",
        Some(Eye::Left) => ", the left larger",
        None => "",
    }
}

/// Compare the two eyes' image sizes in the horizontal and vertical
/// meridians. The difference is the ratio of the two magnifications − 1
/// (larger over smaller), as the notes compute it: R −1.00 / L −5.00 at
/// 12 mm gives 5.9 % (plain subtraction of the percentages would give
/// 5.5 %).
///
/// ```
/// use lensplane_core::*;
/// let eye = |s| image_size_report(&ImageSizeInput { rx: Rx::sphere_only(s)?, vertex: VertexDistance::SPECTACLES, form: None });
/// let c = compare_image_sizes(&eye(-1.0)?, &eye(-5.0)?);
/// assert_eq!(fmt_percent_size(c.horizontal.spectacles), "5.9 %");
/// assert_eq!(fmt_percent_size(c.horizontal.contact_lenses), "1.1 %");
/// assert_eq!(c.horizontal.larger_in_spectacles, Some(Eye::Right));
/// assert_eq!(c.spectacles, Tolerance::Poor);
/// # Ok::<(), Error>(())
/// ```
pub fn compare_image_sizes(right: &ImageSizeReport, left: &ImageSizeReport) -> ImageSizeComparison {
    let horizontal = difference(180, &right.horizontal, &left.horizontal);
    let vertical = difference(90, &right.vertical, &left.vertical);
    let worse = |f: fn(&MeridianDifference) -> f64| {
        if f(&vertical) > f(&horizontal) {
            vertical
        } else {
            horizontal
        }
    };
    let sp = worse(|d| d.spectacles);
    let cl = worse(|d| d.contact_lenses);
    let spectacles = Tolerance::of(sp.spectacles);
    let contact_lenses = Tolerance::of(cl.contact_lenses);
    let both_alike = fmt_percent_size(horizontal.spectacles) == fmt_percent_size(vertical.spectacles);
    let where_sp = if both_alike {
        String::new()
    } else {
        format!(" (in the {} meridian)", crate::fmt_axis(sp.axis))
    };
    let reading = format!(
        "In spectacles the two images differ by about {}{where_sp}{}: {}. In contact lenses by about {}{}: {}. Rule of thumb (common practice): about {} % per dioptre of anisometropia in spectacles ({} here, about {}), a fifth of that in contact lenses.",
        fmt_percent_size(sp.spectacles),
        eye_words(sp.larger_in_spectacles),
        spectacles.words(),
        fmt_percent_size(cl.contact_lenses),
        eye_words(cl.larger_in_contact_lenses),
        contact_lenses.words(),
        fmt_length(SPECTACLE_PERCENT_PER_DIOPTRE),
        fmt_dioptres(sp.anisometropia),
        fmt_percent_size(sp.rule_of_thumb_spectacles),
    );
    let knapp = format!(
        "Knapp's law: in axial anisometropia a spectacle lens near the eye's anterior focal point (about {} mm) gives nearly equal retinal images, so contact lenses are not automatically better. Whether the anisometropia is axial or refractive is a clinical judgement; this page does not make it.",
        fmt_length(ANTERIOR_FOCAL_POINT_MM)
    );
    let mut outlines = [
        outline(right, false),
        outline(left, false),
        outline(right, true),
        outline(left, true),
    ];
    let largest = outlines.iter().map(|o| o.along.max(o.across)).fold(0.0, f64::max);
    if largest > 0.0 && largest.is_finite() {
        for o in &mut outlines {
            o.along /= largest;
            o.across /= largest;
        }
    }
    ImageSizeComparison {
        horizontal,
        vertical,
        spectacles,
        contact_lenses,
        spectacle_outlines: OutlinePair {
            right: outlines[0],
            left: outlines[1],
        },
        contact_lens_outlines: OutlinePair {
            right: outlines[2],
            left: outlines[3],
        },
        reading,
        knapp,
    }
}
