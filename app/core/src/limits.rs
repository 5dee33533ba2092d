//! Hard limits (errors) and sanity thresholds (warnings), in one place.
//! Each is a [`Limit`]: the check and the words of its message come from the
//! same numbers, so a limit cannot say one thing and check another. See the
//! crate documentation, "Limits".

use core::fmt;

use crate::format::{fmt_length, fmt_number, fmt_power};

/// The unit a [`Limit`] is written in.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Unit {
    /// Dioptres, written `D`.
    Dioptres,
    /// Millimetres, written `mm`.
    Millimetres,
    /// Centimetres, written `cm`.
    Centimetres,
    /// Degrees of axis or rotation (written without a sign: `1–180`).
    Degrees,
    /// Whole years (written without a unit: `1–110`).
    Years,
    /// Per cent, written ` %`.
    Percent,
    /// A plain number such as a refractive index (no unit).
    Number,
    /// Rows of a printed table, written `rows`.
    Rows,
}

impl Unit {
    fn suffix(self) -> &'static str {
        match self {
            Unit::Dioptres => " D",
            Unit::Millimetres => " mm",
            Unit::Centimetres => " cm",
            Unit::Percent => " %",
            Unit::Rows => " rows",
            Unit::Degrees | Unit::Years | Unit::Number => "",
        }
    }
}

/// How a [`Limit`] is written in messages.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Form {
    /// `±30 D`: a magnitude, either sign.
    Symmetric,
    /// `0–30 mm`: a span.
    Span,
    /// `0.00 to +4.00`: a span of lens powers, in trade notation.
    Powers,
    /// `6 D`: a threshold on a magnitude.
    Above,
    /// `1.40–2.00`: a span written with two decimals.
    Decimals,
}

/// A range of accepted (or usual) values with its unit.
///
/// ```
/// use lensplane_core::limits;
/// assert_eq!(limits::SPHERE.to_string(), "±30 D");
/// assert!(limits::SPHERE.contains(-30.0) && !limits::SPHERE.contains(30.25));
/// assert_eq!(limits::VERTEX.to_string(), "0–30 mm");
/// assert_eq!(limits::ADD.to_string(), "0.00 to +4.00");
/// assert_eq!(limits::CYLINDER_WARN.to_string(), "6 D");
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Limit {
    /// Smallest value inside the limit.
    pub min: f64,
    /// Largest value inside the limit.
    pub max: f64,
    /// The unit of `min` and `max`.
    pub unit: Unit,
    form: Form,
}

impl Limit {
    const fn symmetric(max: f64, unit: Unit) -> Limit {
        Limit {
            min: -max,
            max,
            unit,
            form: Form::Symmetric,
        }
    }

    const fn span(min: f64, max: f64, unit: Unit) -> Limit {
        Limit {
            min,
            max,
            unit,
            form: Form::Span,
        }
    }

    /// True when `x` is finite and within `min..=max`.
    ///
    /// ```
    /// assert!(lensplane_core::limits::AGE.contains(110.0));
    /// assert!(!lensplane_core::limits::AGE.contains(f64::NAN));
    /// ```
    pub fn contains(&self, x: f64) -> bool {
        x.is_finite() && self.min <= x && x <= self.max
    }

    /// True when `|x|` is above the limit's largest magnitude (for the
    /// thresholds that warn, like [`SPHERE_WARN`]).
    ///
    /// ```
    /// assert!(lensplane_core::limits::MEASURE_VERTEX.exceeded_by(-4.25));
    /// assert!(!lensplane_core::limits::MEASURE_VERTEX.exceeded_by(4.0));
    /// ```
    pub fn exceeded_by(&self, x: f64) -> bool {
        x.abs() > self.max
    }
}

impl fmt::Display for Limit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let unit = self.unit.suffix();
        match self.form {
            Form::Symmetric => write!(f, "±{}{unit}", fmt_length(self.max)),
            Form::Span => write!(f, "{}–{}{unit}", fmt_length(self.min), fmt_length(self.max)),
            Form::Powers => write!(f, "{} to {}", fmt_power(self.min), fmt_power(self.max)),
            Form::Above => write!(f, "{}{unit}", fmt_length(self.max)),
            Form::Decimals => write!(f, "{}–{}{unit}", fmt_number(self.min), fmt_number(self.max)),
        }
    }
}

/// Sphere accepted as input.
pub const SPHERE: Limit = Limit::symmetric(30.0, Unit::Dioptres);
/// Cylinder accepted as input (either sign: minus- or plus-cylinder form).
pub const CYLINDER: Limit = Limit::symmetric(10.0, Unit::Dioptres);
/// Axis, degrees (ISO 8429 notation, 180 written for 0).
pub const AXIS: Limit = Limit::span(1.0, 180.0, Unit::Degrees);
/// Vertex distance, mm (0: a contact lens on the cornea).
pub const VERTEX: Limit = Limit::span(0.0, 30.0, Unit::Millimetres);
/// Reading distance, cm.
pub const READING: Limit = Limit::span(10.0, 100.0, Unit::Centimetres);
/// Age, whole years.
pub const AGE: Limit = Limit::span(1.0, 110.0, Unit::Years);
/// Near addition (always plus; 0 is no add).
pub const ADD: Limit = Limit {
    min: 0.0,
    max: 4.0,
    unit: Unit::Dioptres,
    form: Form::Powers,
};

/// The add read on a received lens. Wider than [`ADD`] (orders stop at
/// +4.00) so that a lens that came back over-strong gets a verdict, not an
/// input error; beyond +5.00 a reading is more likely a typo.
pub const MEASURED_ADD: Limit = Limit {
    min: 0.0,
    max: 5.0,
    unit: Unit::Dioptres,
    form: Form::Powers,
};
/// Power sizes of a conversion chart (both signs are listed): up to the
/// sphere input limit.
pub const CHART_POWER: Limit = Limit::span(0.0, SPHERE.max, Unit::Dioptres);
/// The step between a conversion chart's powers.
pub const CHART_STEP: Limit = Limit::span(CHART_QUARTER, SPHERE.max, Unit::Dioptres);
/// Most rows a conversion chart prints: about four pages at 50 rows. The
/// whole input range in quarter steps (241 rows) is better read on the
/// vertex panel than from a wall; the figures cost nothing to compute, so
/// the cap is about paper, not speed.
pub const CHART_ROWS: Limit = Limit {
    min: 1.0,
    max: 200.0,
    unit: Unit::Rows,
    form: Form::Above,
};
/// Every chart power size and step is a whole number of these (dioptres):
/// the chart lists spectacle powers as they are ordered.
pub const CHART_QUARTER: f64 = 0.25;

/// The steps of a lens ladder (a setting).
pub const LADDER_STEP: Limit = Limit::span(0.01, 1.0, Unit::Dioptres);
/// How far a ladder keeps its fine steps (a setting): at most the sphere limit.
pub const LADDER_FINE: Limit = Limit::span(0.0, SPHERE.max, Unit::Dioptres);
/// A spherical-substitute cylinder limit (a setting): at most the cylinder limit.
pub const SUBSTITUTE_CYLINDER: Limit = Limit::span(0.0, CYLINDER.max, Unit::Dioptres);
/// A spherical-substitute cylinder : sphere limit (a setting), as a fraction.
pub const SUBSTITUTE_RATIO: Limit = Limit::span(0.0, 1.0, Unit::Number);

/// A meridian beyond this draws a warning (check the entry).
pub const SPHERE_WARN: Limit = Limit::symmetric(20.0, Unit::Dioptres);
/// A cylinder above this draws a warning (check the entry).
pub const CYLINDER_WARN: Limit = Limit {
    min: 0.0,
    max: 6.0,
    unit: Unit::Dioptres,
    form: Form::Above,
};
/// Usual spectacle vertex distances; outside them, a warning.
pub const VERTEX_USUAL: Limit = Limit::span(8.0, 20.0, Unit::Millimetres);
/// Any meridian beyond this: measure the vertex distance.
pub const MEASURE_VERTEX: Limit = Limit::symmetric(4.0, Unit::Dioptres);

/// Observed rotation of a toric contact lens, whole degrees either way (the
/// amount; the direction is given apart). Beyond 90° a cylinder turned one
/// way is the same as turned less the other way, so larger amounts are
/// typing errors.
pub const ROTATION: Limit = Limit::span(0.0, 90.0, Unit::Degrees);
/// A rotation above this: a refit is usually better than compensating
/// (common practice, no source).
pub const ROTATION_WARN: Limit = Limit {
    min: 0.0,
    max: 30.0,
    unit: Unit::Degrees,
    form: Form::Above,
};
/// An over-refraction meridian beyond this: check the fit and the
/// refraction (a residual this large is unusual over a fitted lens).
pub const OVER_REFRACTION_WARN: Limit = Limit::symmetric(4.0, Unit::Dioptres);
/// Front surface power (base curve) of a spectacle lens. Meniscus lenses
/// have plus front surfaces; 0 is a plano front; +25 D (a radius near
/// 21 mm at n = 1.523) is beyond any usual base curve, so more is a typing
/// error. Biconcave fronts (negative) are rare and not accepted.
pub const FRONT_SURFACE: Limit = Limit {
    min: 0.0,
    max: 25.0,
    unit: Unit::Dioptres,
    form: Form::Powers,
};
/// Centre thickness of a spectacle lens, mm: thinner than 0.5 mm is not
/// made (high-index minus lenses reach about 1 mm); 20 mm is beyond the
/// thickest high-plus lens.
pub const THICKNESS: Limit = Limit::span(0.5, 20.0, Unit::Millimetres);
/// Refractive index of a spectacle lens material: the usual ones run from
/// 1.498 (CR-39) to about 1.9 (dense glass); 1.40–2.00 leaves a margin.
pub const INDEX: Limit = Limit {
    min: 1.4,
    max: 2.0,
    unit: Unit::Number,
    form: Form::Decimals,
};
/// Difference in image size between the eyes, per cent: above about 3–5 %
/// a difference may not be tolerated (common practice, no source).
pub const ANISEIKONIA_TOLERANCE: Limit = Limit::span(3.0, 5.0, Unit::Percent);

/// Typed vertex distances under this (but not 0) are questioned, mm.
pub const VERTEX_SHORT_MM: f64 = 3.0;
/// A computed meridian beyond this means the far point sits (practically)
/// at the new lens plane: reported as an error, not a number.
pub const RESULT_LIMIT: f64 = 100.0;
/// Centimetres per inch.
pub const CM_PER_INCH: f64 = 2.54;

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_limit_reads_as_its_numbers() {
        let cases = [
            (SPHERE, "±30 D"),
            (CYLINDER, "±10 D"),
            (AXIS, "1–180"),
            (VERTEX, "0–30 mm"),
            (READING, "10–100 cm"),
            (AGE, "1–110"),
            (ADD, "0.00 to +4.00"),
            (SPHERE_WARN, "±20 D"),
            (CYLINDER_WARN, "6 D"),
            (VERTEX_USUAL, "8–20 mm"),
            (MEASURE_VERTEX, "±4 D"),
            (MEASURED_ADD, "0.00 to +5.00"),
            (CHART_POWER, "0–30 D"),
            (CHART_STEP, "0.25–30 D"),
            (CHART_ROWS, "200 rows"),
        ];
        for (limit, words) in cases {
            assert_eq!(limit.to_string(), words);
        }
    }

    #[test]
    fn edges_are_inside() {
        for l in [
            SPHERE,
            CYLINDER,
            AXIS,
            VERTEX,
            READING,
            AGE,
            ADD,
            VERTEX_USUAL,
            MEASURED_ADD,
            CHART_POWER,
            CHART_STEP,
        ] {
            assert!(l.contains(l.min) && l.contains(l.max), "{l}");
            assert!(!l.contains(l.max + 0.01) && !l.contains(l.min - 0.01), "{l}");
        }
        assert!(!SPHERE_WARN.exceeded_by(20.0) && SPHERE_WARN.exceeded_by(-20.01));
        assert!(!CYLINDER_WARN.exceeded_by(-6.0) && CYLINDER_WARN.exceeded_by(-6.25));
    }
}
