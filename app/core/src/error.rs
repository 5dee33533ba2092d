//! The crate's one error type.
//!
//! An [`Error`] says which input it concerns ([`Field`]), where in the typed
//! text it starts (a character index, when it came from parsing) and a short
//! message a practitioner can act on. The kinds are private so messages can be
//! improved without breaking callers; tests pin the exact text.

use core::fmt;

use crate::format::fmt_power;
use crate::limits::Limit;

/// Which input (or which part of a result) an [`Error`], [`crate::Notice`] or
/// [`crate::Warning`] concerns, so the UI can show it beside that field.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Field {
    /// A whole prescription typed or pasted as one string.
    Rx,
    /// The sphere (field or part of a prescription).
    Sphere,
    /// The cylinder.
    Cylinder,
    /// The cylinder axis.
    Axis,
    /// The vertex distance the correction is worn at now.
    VertexFrom,
    /// The vertex distance (or cornea) it moves to.
    VertexTo,
    /// The reading distance.
    ReadingDistance,
    /// The near addition.
    Add,
    /// The patient's age.
    Age,
    /// A setting (ladder, thresholds).
    Setting,
    /// The exact computed result.
    Result,
    /// The orderable (rounded) result.
    Ordered,
    /// The toric contact-lens choice.
    Toric,
    /// The spherical-substitute assessment.
    Substitute,
    /// The near figures.
    Near,
    /// The amplitude-by-age figures.
    Amplitude,
    /// The over-refraction found over the worn lens.
    OverRefraction,
    /// Where the over-refraction was found (trial frame or refractor).
    OverRefractionVertex,
    /// The observed rotation of a toric contact lens.
    Rotation,
    /// The kind of lens: soft or rigid (over-refraction), single vision or progressive (lens check).
    LensType,
    /// The front surface power (base curve) of a spectacle lens.
    FrontSurface,
    /// The centre thickness of a spectacle lens.
    Thickness,
    /// The refractive index of a spectacle lens.
    Index,
    /// The add read on a received lens.
    MeasuredAdd,
    /// The smallest power size of a conversion chart.
    ChartMin,
    /// The largest power size of a conversion chart.
    ChartMax,
    /// The step between the powers of a conversion chart.
    ChartStep,
    /// The ladder a conversion chart rounds to.
    Ladder,
}

impl Field {
    pub(crate) fn noun(self) -> &'static str {
        match self {
            Field::Rx => "prescription",
            Field::Sphere => "sphere",
            Field::Cylinder => "cylinder",
            Field::Axis => "axis",
            Field::VertexFrom | Field::VertexTo => "vertex distance",
            Field::ReadingDistance => "reading distance",
            Field::Add => "add",
            Field::Age => "age",
            Field::Setting => "setting",
            Field::Result | Field::Ordered => "result",
            Field::Toric => "toric choice",
            Field::Substitute => "spherical substitute",
            Field::Near => "near result",
            Field::Amplitude => "amplitude",
            Field::OverRefraction => "over-refraction",
            Field::OverRefractionVertex => "vertex distance",
            Field::Rotation => "rotation",
            Field::LensType => "lens type",
            Field::FrontSurface => "front surface",
            Field::Thickness => "centre thickness",
            Field::Index => "refractive index",
            Field::MeasuredAdd => "measured add",
            Field::ChartMin => "lowest power",
            Field::ChartMax => "highest power",
            Field::ChartStep => "step",
            Field::Ladder => "ladder",
        }
    }
}

/// Everything that can go wrong: a value outside its hard limit, text that
/// does not read as a prescription, or a move with no finite answer.
///
/// `Display` prints the short message only (no field, no position); use
/// [`Error::field`] and [`Error::position`] to place it in the UI.
///
/// ```
/// let err = lensplane_core::parse_rx("-2.00 -1.00 x181").unwrap_err();
/// assert_eq!(err.to_string(), "axis 181 is outside 1–180");
/// assert_eq!(err.field(), lensplane_core::Field::Axis);
/// assert_eq!(err.position(), Some(13));
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Error {
    kind: ErrorKind,
    field: Field,
    position: Option<usize>,
}

#[derive(Clone, Debug, PartialEq)]
pub(crate) enum ErrorKind {
    /// Nothing was typed where something is needed.
    Empty,
    /// A non-zero power typed without a sign.
    NeedsSign { magnitude: f64 },
    /// A value beyond the hard limit; `suggestions` are readings with the
    /// decimal point restored (never applied automatically).
    OutOfRange {
        typed: String,
        limit: Limit,
        suggestions: Vec<String>,
    },
    /// A value that is not a finite number.
    NotANumber,
    /// A cylinder without an axis.
    CylinderNeedsAxis,
    /// An axis without a cylinder.
    AxisNeedsCylinder,
    /// An axis with a decimal point.
    AxisNotWhole { typed: String },
    /// Text that is not part of any accepted notation.
    Unexpected { text: String },
    /// A number with two decimal separators, like "2,5,90".
    Ambiguous { text: String },
    /// A vertex distance under 3 mm (but not 0).
    VertexTooShort { typed: String, suggestion: Option<String> },
    /// A reading distance with no unit where the unit matters.
    NeedsUnit { typed: String, suggestion: Option<String> },
    /// A negative add.
    AddNotPlus,
    /// An age with a fraction.
    AgeNotWhole { typed: String },
    /// The far point lies at (or too near) the new lens plane.
    Singular { power: f64 },
    /// A setting that cannot work.
    BadSetting { what: String },
    /// Degrees with a decimal point where whole degrees are needed.
    NotWholeDegrees { typed: String },
    /// A sign typed in the rotation amount (the direction is chosen apart).
    RotationSigned,
    /// The over-refraction placed behind the worn spectacle lens (mm).
    BehindWornLens { at: String, worn: String },
    /// A rigid contact lens: the tear lens is not modelled.
    RigidLens,
    /// A spectacle vertex distance of 0 mm where spectacles are needed.
    SpectacleVertexNeeded,
    /// A link value that is not one of the offered choices.
    UnknownChoice { typed: String, choices: &'static str },
    /// A chart's lowest power above its highest.
    MinAboveMax { min: String, max: String },
    /// A chart step of zero or less.
    StepNotPositive { typed: String },
    /// A chart figure that is not a whole number of quarter dioptres.
    OffQuarter { typed: String, suggestions: Vec<String> },
    /// A chart step that does not lead from the lowest to the highest power.
    StepDoesNotDivide {
        step: String,
        min: String,
        max: String,
        suggestions: Vec<String>,
    },
    /// A chart with more rows than it prints.
    TooManyRows { rows: usize, limit: Limit },
}

impl Error {
    pub(crate) fn new(kind: ErrorKind, field: Field, position: Option<usize>) -> Error {
        Error { kind, field, position }
    }

    /// The input (or result) this error concerns.
    ///
    /// ```
    /// let err = lensplane_core::parse_vertex_mm("45").unwrap_err();
    /// assert_eq!(err.field(), lensplane_core::Field::VertexFrom);
    /// ```
    pub fn field(&self) -> Field {
        self.field
    }

    /// Where the problem starts in the parsed text, as a character (not byte)
    /// index from 0; `None` for errors that are not about typed text.
    ///
    /// ```
    /// let err = lensplane_core::parse_rx("2.00 -1.00 x90").unwrap_err();
    /// assert_eq!(err.position(), Some(0));
    /// ```
    pub fn position(&self) -> Option<usize> {
        self.position
    }

    /// The same error attributed to another field (for example a vertex
    /// distance parsed for the "to" input).
    ///
    /// ```
    /// use lensplane_core::{parse_vertex_mm, Field};
    /// let err = parse_vertex_mm("40").unwrap_err().for_field(Field::VertexTo);
    /// assert_eq!(err.field(), Field::VertexTo);
    /// ```
    pub fn for_field(mut self, field: Field) -> Error {
        self.field = field;
        self
    }

    pub(crate) fn at(mut self, position: usize) -> Error {
        self.position = Some(position);
        self
    }
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let noun = self.field.noun();
        match &self.kind {
            ErrorKind::Empty => write!(f, "{noun} is empty"),
            ErrorKind::NeedsSign { magnitude } => {
                let m = fmt_power(magnitude.abs());
                let m = m.trim_start_matches('+');
                write!(f, "{noun} needs a sign: +{m} or -{m}?")
            }
            ErrorKind::OutOfRange {
                typed,
                limit,
                suggestions,
            } => {
                write!(f, "{noun} {typed} is outside {limit}")?;
                if !suggestions.is_empty() {
                    write!(f, ": did you mean {}?", suggestions.join(" or "))?;
                }
                Ok(())
            }
            ErrorKind::NotANumber => write!(f, "{noun} is not a number"),
            ErrorKind::CylinderNeedsAxis => f.write_str("cylinder needs an axis"),
            ErrorKind::AxisNeedsCylinder => f.write_str("axis needs a cylinder"),
            ErrorKind::AxisNotWhole { typed } => {
                write!(f, "axis {typed} must be a whole number of degrees")
            }
            ErrorKind::Unexpected { text } => write!(f, "unexpected \"{text}\""),
            ErrorKind::Ambiguous { text } => {
                write!(f, "\"{text}\" is ambiguous: use one decimal point per number")
            }
            ErrorKind::VertexTooShort { typed, suggestion } => {
                write!(f, "vertex distance {typed} mm is under 3 mm")?;
                match suggestion {
                    Some(s) => write!(f, ": did you mean {s} mm?"),
                    None => Ok(()),
                }
            }
            ErrorKind::NeedsUnit { typed, suggestion } => {
                write!(f, "reading distance {typed} needs a unit: ")?;
                match suggestion {
                    Some(s) => write!(f, "{s}?"),
                    None => f.write_str("cm or in?"),
                }
            }
            ErrorKind::AddNotPlus => f.write_str("an add is always plus"),
            ErrorKind::AgeNotWhole { typed } => write!(f, "age {typed} must be whole years"),
            ErrorKind::Singular { power } => write!(
                f,
                "no finite lens: the far point of {} lies at the new lens plane",
                fmt_power(*power)
            ),
            ErrorKind::BadSetting { what } => write!(f, "setting: {what}"),
            ErrorKind::NotWholeDegrees { typed } => write!(f, "{noun} {typed} must be a whole number of degrees"),
            ErrorKind::RotationSigned => {
                f.write_str("rotation takes no sign: give the amount and choose left or right")
            }
            ErrorKind::BehindWornLens { at, worn } => write!(
                f,
                "vertex distance {at} mm puts the over-refraction behind the worn lens at {worn} mm"
            ),
            ErrorKind::RigidLens => {
                f.write_str("rigid lens: this thin-lens model leaves out the tear lens, so it computes no order")
            }
            ErrorKind::SpectacleVertexNeeded => {
                f.write_str("vertex distance 0 mm is a contact lens: give the spectacle vertex distance")
            }
            ErrorKind::UnknownChoice { typed, choices } => write!(f, "{noun} \"{typed}\" is not one of {choices}"),
            ErrorKind::MinAboveMax { min, max } => write!(f, "{noun} {min} is above the highest power, {max}"),
            ErrorKind::StepNotPositive { typed } => write!(f, "{noun} {typed} must be more than 0"),
            ErrorKind::OffQuarter { typed, suggestions } => {
                write!(f, "{noun} {typed} is not a whole number of quarter dioptres")?;
                if !suggestions.is_empty() {
                    write!(f, ": try {}", suggestions.join(" or "))?;
                }
                Ok(())
            }
            ErrorKind::StepDoesNotDivide {
                step,
                min,
                max,
                suggestions,
            } => {
                write!(f, "{noun} {step} does not lead from {min} to {max} in whole steps")?;
                if !suggestions.is_empty() {
                    write!(f, ": try a highest power of {}", suggestions.join(" or "))?;
                }
                Ok(())
            }
            ErrorKind::TooManyRows { rows, limit } => write!(
                f,
                "the chart would have {rows} rows, more than {limit}: use a larger step or a narrower range"
            ),
        }
    }
}

impl std::error::Error for Error {}
