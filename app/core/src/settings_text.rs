//! Reading the panels' adjustable thresholds from typed text (the spherical
//! substitute limits), with the same tolerance as the prescription fields:
//! comma decimals, a trailing `D`, `1:4`, `1/4` or just `4` for a ratio.

use crate::equivalent::SubstituteSettings;
use crate::error::{Error, ErrorKind, Field};
use crate::limits::SUBSTITUTE_CYLINDER;
use crate::parse::Parsed;

fn bad(what: String) -> Error {
    Error::new(ErrorKind::BadSetting { what }, Field::Setting, None)
}

fn number(text: &str) -> Option<f64> {
    let t = text.trim().trim_end_matches(['D', 'd']).trim().replace(',', ".");
    if t.is_empty() || t.starts_with(['-', '\u{2212}', '\u{2013}']) {
        return None;
    }
    crate::decimal::read_decimal(t.trim_start_matches('+')).filter(|x| x.is_finite())
}

/// A cylinder limit in dioptres, 0 to 10 (`0.75`, `0,75 D`).
///
/// ```
/// use lensplane_core::parse_cylinder_limit;
/// assert_eq!(parse_cylinder_limit("0,75 D")?.value, 0.75);
/// assert_eq!(parse_cylinder_limit("-1").unwrap_err().to_string(),
///            "setting: a cylinder limit must be within 0–10 D");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_cylinder_limit(text: &str) -> Result<Parsed<f64>, Error> {
    match number(text) {
        Some(x) if SUBSTITUTE_CYLINDER.contains(x) => Ok(Parsed {
            value: x,
            notices: vec![],
        }),
        _ => Err(bad(format!("a cylinder limit must be within {SUBSTITUTE_CYLINDER}"))),
    }
}

/// A cylinder : sphere limit as `1:4`, `1/4`, `4` (meaning 1 : 4) or `0.25`.
///
/// ```
/// use lensplane_core::parse_ratio_limit;
/// assert_eq!(parse_ratio_limit("1:4")?.value, 0.25);
/// assert_eq!(parse_ratio_limit("3")?.value, 1.0 / 3.0);
/// assert_eq!(parse_ratio_limit("0.25")?.value, 0.25);
/// assert_eq!(parse_ratio_limit("x").unwrap_err().to_string(),
///            "setting: write the cylinder : sphere limit as 1:4");
/// # Ok::<(), lensplane_core::Error>(())
/// ```
pub fn parse_ratio_limit(text: &str) -> Result<Parsed<f64>, Error> {
    let err = || bad("write the cylinder : sphere limit as 1:4".into());
    let t = text.trim();
    let ratio = match t.split_once([':', '/']) {
        Some((a, b)) => {
            let (a, b) = (number(a).ok_or_else(err)?, number(b).ok_or_else(err)?);
            if b == 0.0 {
                return Err(err());
            }
            a / b
        }
        None => {
            let x = number(t).ok_or_else(err)?;
            if x > 1.0 {
                1.0 / x
            } else {
                x
            }
        }
    };
    if (0.0..=1.0).contains(&ratio) && ratio > 0.0 {
        Ok(Parsed {
            value: ratio,
            notices: vec![],
        })
    } else {
        Err(err())
    }
}

impl SubstituteSettings {
    /// The settings from the three typed limits (with-the-rule cylinder,
    /// oblique or against-the-rule cylinder, cylinder : sphere).
    ///
    /// ```
    /// use lensplane_core::SubstituteSettings;
    /// let s = SubstituteSettings::from_texts("0.75", "0.50", "1:4")?;
    /// assert_eq!(s, SubstituteSettings::default());
    /// # Ok::<(), lensplane_core::Error>(())
    /// ```
    pub fn from_texts(cylinder: &str, oblique_or_against: &str, ratio: &str) -> Result<SubstituteSettings, Error> {
        Ok(SubstituteSettings {
            max_cylinder: parse_cylinder_limit(cylinder)?.value,
            max_cylinder_oblique_or_against: parse_cylinder_limit(oblique_or_against)?.value,
            max_ratio: parse_ratio_limit(ratio)?.value,
        })
    }
}
