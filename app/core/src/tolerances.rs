//! Tolerances for a received lens, as data: the tables of ANSI Z80.1-2015
//! (spectacle lenses) as publicly summarised, one row per band, each row
//! with its source. [`crate::lens_check`] reads them; a page can list them.
//!
//! Every figure is held in whole hundredths of a dioptre (or whole
//! degrees), so band edges and comparisons are exact integer arithmetic:
//! no floating-point edge can move a lens from one side to the other.
//!
//! A band covers ordered sizes above the previous band's `up_to` up to and
//! including its own; the last band has no upper edge. Sizes are magnitudes
//! of the **ordered** value in minus-cylinder form (crate docs, decisions
//! 14–16).

use crate::error::{Error, ErrorKind, Field};
use crate::format::fmt_number;

/// Where every row's figures come from.
pub const SOURCE: &str = "ANSI Z80.1-2015, as publicly summarised: confirm against the standard";

/// Which tolerance tables apply: the standard gives progressive lenses
/// wider power tolerances.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default)]
pub enum LensType {
    /// Single vision and multifocal (bifocal, trifocal) lenses; the default.
    #[default]
    SingleVision,
    /// Progressive addition lenses.
    Progressive,
}

impl LensType {
    /// Both types, in the order a page offers them.
    pub const ALL: [LensType; 2] = [LensType::SingleVision, LensType::Progressive];

    /// The value in a link: `sv` or `pal`.
    ///
    /// ```
    /// assert_eq!(lensplane_core::LensType::Progressive.link_value(), "pal");
    /// ```
    pub fn link_value(self) -> &'static str {
        match self {
            LensType::SingleVision => "sv",
            LensType::Progressive => "pal",
        }
    }

    /// Plain words: "single vision or multifocal", "progressive".
    ///
    /// ```
    /// assert_eq!(lensplane_core::LensType::SingleVision.words(), "single vision or multifocal");
    /// ```
    pub fn words(self) -> &'static str {
        match self {
            LensType::SingleVision => "single vision or multifocal",
            LensType::Progressive => "progressive",
        }
    }

    /// Read a link value: `sv` or `pal` (any case, spaces trimmed); empty
    /// or missing means the default, single vision.
    ///
    /// ```
    /// use lensplane_core::LensType;
    /// assert_eq!(LensType::from_link("PAL")?, LensType::Progressive);
    /// assert_eq!(LensType::from_link("")?, LensType::SingleVision);
    /// assert_eq!(LensType::from_link("bifocal").unwrap_err().to_string(),
    ///            "lens type \"bifocal\" is not one of sv (single vision or multifocal), pal (progressive)");
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn from_link(text: &str) -> Result<LensType, Error> {
        let t = text.trim();
        if t.is_empty() {
            return Ok(LensType::default());
        }
        LensType::ALL
            .into_iter()
            .find(|l| t.eq_ignore_ascii_case(l.link_value()))
            .ok_or_else(|| {
                Error::new(
                    ErrorKind::UnknownChoice {
                        typed: t.to_string(),
                        choices: "sv (single vision or multifocal), pal (progressive)",
                    },
                    Field::LensType,
                    None,
                )
            })
    }
}

/// What a band allows either side of the ordered value.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Allowance {
    /// A fixed amount, in hundredths of a dioptre (13 is ±0.13 D).
    Hundredths(u32),
    /// A percentage of the ordered size; see [`Band::amount`] for rounding.
    Percent(u32),
    /// A fixed number of degrees (axis).
    Degrees(u32),
    /// The standard defines no tolerance here (axis of a very low cylinder).
    NotDefined,
}

/// One row of a tolerance table.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Band {
    /// Largest ordered size in this band, in hundredths of a dioptre
    /// (inclusive); `None` for the last band.
    pub up_to: Option<u32>,
    /// What the band allows.
    pub allowance: Allowance,
    /// The band in words, e.g. "over 2.00 to 4.50 D".
    pub range: &'static str,
    /// Where the row comes from.
    pub source: &'static str,
}

impl Band {
    /// The tolerance for an ordered size (hundredths of a dioptre), in
    /// hundredths of a dioptre or in degrees; `None` where none is defined.
    ///
    /// A percentage is taken of the ordered size and **rounded down to a
    /// whole hundredth**: 2 % of 8.00 is 0.16; 2 % of 6.75 is 0.135, held
    /// as 0.13. For readings in hundredths this judges exactly as the
    /// unrounded percentage would (a deviation of 0.13 is within 0.135,
    /// 0.14 is not), and the figure shown is the figure applied.
    ///
    /// ```
    /// use lensplane_core::tolerances::SPHERE_SV;
    /// assert_eq!(SPHERE_SV.band(800).amount(800), Some(16));
    /// assert_eq!(SPHERE_SV.band(675).amount(675), Some(13));
    /// ```
    pub fn amount(&self, size: u32) -> Option<u32> {
        match self.allowance {
            Allowance::Hundredths(h) => Some(h),
            Allowance::Degrees(d) => Some(d),
            Allowance::Percent(p) => Some(size * p / 100),
            Allowance::NotDefined => None,
        }
    }

    /// The tolerance in words for an ordered size: `±0.13 D`, `±3°`,
    /// `±2 % of 8.00 D = ±0.16 D`, or `no axis tolerance`.
    ///
    /// ```
    /// use lensplane_core::tolerances::{AXIS, SPHERE_SV};
    /// assert_eq!(SPHERE_SV.band(800).words(800), "±2 % of 8.00 D = ±0.16 D");
    /// assert_eq!(SPHERE_SV.band(675).words(675), "±2 % of 6.75 D = ±0.135 D, judged in hundredths as ±0.13 D");
    /// assert_eq!(AXIS.band(100).words(100), "±3°");
    /// ```
    pub fn words(&self, size: u32) -> String {
        match self.allowance {
            Allowance::Hundredths(h) => format!("±{} D", hundredths_text(h)),
            Allowance::Degrees(d) => format!("±{d}°"),
            Allowance::NotDefined => "no axis tolerance".to_string(),
            Allowance::Percent(p) => {
                let exact = size * p; // ten-thousandths of a dioptre
                let applied = exact / 100;
                let head = format!(
                    "±{p} % of {} D = ±{} D",
                    hundredths_text(size),
                    ten_thousandths_text(exact)
                );
                if exact.is_multiple_of(100) {
                    head
                } else {
                    format!("{head}, judged in hundredths as ±{} D", hundredths_text(applied))
                }
            }
        }
    }
}

/// `13` → `0.13`.
pub(crate) fn hundredths_text(h: u32) -> String {
    fmt_number(f64::from(h) / 100.0)
}

/// `1350` → `0.135`, `1600` → `0.16` (at least two decimals).
fn ten_thousandths_text(t: u32) -> String {
    let mut s = format!("{}.{:04}", t / 10_000, t % 10_000);
    while s.ends_with('0') && s.len() > s.find('.').map_or(0, |i| i + 3) {
        s.pop();
    }
    s
}

/// A tolerance table: what it is about and its bands, smallest first.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Table {
    /// What the table is about, leading the words of a tolerance:
    /// "sphere meridian", "cylinder", "axis for a", "add".
    pub subject: &'static str,
    /// The bands, smallest ordered size first; the last has no upper edge.
    pub bands: &'static [Band],
}

impl Table {
    /// The band for an ordered size in hundredths of a dioptre.
    ///
    /// ```
    /// use lensplane_core::tolerances::CYLINDER_SV;
    /// assert_eq!(CYLINDER_SV.band(200).range, "up to 2.00 D");
    /// assert_eq!(CYLINDER_SV.band(201).range, "over 2.00 to 4.50 D");
    /// ```
    pub fn band(&self, size: u32) -> &Band {
        self.bands
            .iter()
            .find(|b| b.up_to.is_none_or(|edge| size <= edge))
            .unwrap_or(&self.bands[self.bands.len() - 1])
    }

    /// Why a tolerance applies, in words: the subject, the band, the
    /// tolerance.
    ///
    /// ```
    /// use lensplane_core::tolerances::{AXIS, CYLINDER_SV};
    /// assert_eq!(CYLINDER_SV.why(300), "cylinder over 2.00 to 4.50 D: ±0.15 D");
    /// assert_eq!(AXIS.why(100), "axis for a cylinder over 0.75 to 1.50 D: ±3°");
    /// ```
    pub fn why(&self, size: u32) -> String {
        let band = self.band(size);
        format!("{} {}: {}", self.subject, band.range, band.words(size))
    }
}

const fn band(up_to: Option<u32>, allowance: Allowance, range: &'static str) -> Band {
    Band {
        up_to,
        allowance,
        range,
        source: SOURCE,
    }
}

use Allowance::{Degrees, Hundredths, NotDefined, Percent};

/// Sphere meridian, single vision and multifocal: ±0.13 D from −6.50 to
/// +6.50, ±2 % stronger.
pub static SPHERE_SV: Table = Table {
    subject: "sphere meridian",
    bands: &[
        band(Some(650), Hundredths(13), "-6.50 to +6.50 D"),
        band(None, Percent(2), "stronger than ±6.50 D"),
    ],
};

/// Sphere meridian, progressive: ±0.16 D from −8.00 to +8.00, ±2 % stronger.
pub static SPHERE_PAL: Table = Table {
    subject: "sphere meridian",
    bands: &[
        band(Some(800), Hundredths(16), "-8.00 to +8.00 D"),
        band(None, Percent(2), "stronger than ±8.00 D"),
    ],
};

/// Cylinder, single vision and multifocal: ±0.13 D up to 2.00, ±0.15 D
/// over 2.00 to 4.50, ±4 % over 4.50.
pub static CYLINDER_SV: Table = Table {
    subject: "cylinder",
    bands: &[
        band(Some(200), Hundredths(13), "up to 2.00 D"),
        band(Some(450), Hundredths(15), "over 2.00 to 4.50 D"),
        band(None, Percent(4), "over 4.50 D"),
    ],
};

/// Cylinder, progressive: ±0.16 D up to 2.00, ±0.18 D over 2.00 to 3.50,
/// ±5 % over 3.50.
pub static CYLINDER_PAL: Table = Table {
    subject: "cylinder",
    bands: &[
        band(Some(200), Hundredths(16), "up to 2.00 D"),
        band(Some(350), Hundredths(18), "over 2.00 to 3.50 D"),
        band(None, Percent(5), "over 3.50 D"),
    ],
};

/// Axis, by the ordered cylinder (either lens type): none under 0.12 D,
/// then ±14°, ±7°, ±5°, ±3°, ±2°.
pub static AXIS: Table = Table {
    subject: "axis for a",
    bands: &[
        band(Some(11), NotDefined, "cylinder under 0.12 D"),
        band(Some(25), Degrees(14), "cylinder 0.12 to 0.25 D"),
        band(Some(50), Degrees(7), "cylinder over 0.25 to 0.50 D"),
        band(Some(75), Degrees(5), "cylinder over 0.50 to 0.75 D"),
        band(Some(150), Degrees(3), "cylinder over 0.75 to 1.50 D"),
        band(None, Degrees(2), "cylinder over 1.50 D"),
    ],
};

/// Add (either lens type): ±0.12 D up to +4.00, ±0.18 D above.
pub static ADD: Table = Table {
    subject: "add",
    bands: &[
        band(Some(400), Hundredths(12), "up to +4.00 D"),
        band(None, Hundredths(18), "over +4.00 D"),
    ],
};

/// The sphere-meridian table for a lens type.
///
/// ```
/// use lensplane_core::{tolerances, LensType};
/// assert_eq!(tolerances::sphere_table(LensType::Progressive).band(800).amount(800), Some(16));
/// ```
pub fn sphere_table(lens: LensType) -> &'static Table {
    match lens {
        LensType::SingleVision => &SPHERE_SV,
        LensType::Progressive => &SPHERE_PAL,
    }
}

/// The cylinder table for a lens type.
///
/// ```
/// use lensplane_core::{tolerances, LensType};
/// assert_eq!(tolerances::cylinder_table(LensType::SingleVision).band(500).amount(500), Some(20));
/// ```
pub fn cylinder_table(lens: LensType) -> &'static Table {
    match lens {
        LensType::SingleVision => &CYLINDER_SV,
        LensType::Progressive => &CYLINDER_PAL,
    }
}

/// Every table that applies to a lens type: sphere, cylinder, axis, add
/// (for a page that lists them).
///
/// ```
/// use lensplane_core::{tolerances, LensType};
/// let t = tolerances::tables(LensType::Progressive);
/// assert_eq!(t.map(|t| t.subject), ["sphere meridian", "cylinder", "axis for a", "add"]);
/// ```
pub fn tables(lens: LensType) -> [&'static Table; 4] {
    [sphere_table(lens), cylinder_table(lens), &AXIS, &ADD]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_table_rises_and_ends_open() {
        for t in [&SPHERE_SV, &SPHERE_PAL, &CYLINDER_SV, &CYLINDER_PAL, &AXIS, &ADD] {
            let edges: Vec<_> = t.bands.iter().map(|b| b.up_to).collect();
            assert_eq!(edges.last(), Some(&None), "{}", t.subject);
            for w in edges[..edges.len() - 1].windows(2) {
                assert!(w[0] < w[1], "{}", t.subject);
            }
            assert!(t.bands.iter().all(|b| b.source == SOURCE));
        }
    }

    #[test]
    fn ten_thousandths_keep_two_decimals() {
        assert_eq!(ten_thousandths_text(1350), "0.135");
        assert_eq!(ten_thousandths_text(1600), "0.16");
        assert_eq!(ten_thousandths_text(2502), "0.2502");
        assert_eq!(ten_thousandths_text(10000), "1.00");
    }
}
