//! Trade notation out: two decimals, a sign on every non-zero power,
//! "plano", and `×` before the axis.
//!
//! Figures use the ASCII hyphen-minus `-` everywhere, in results and in prose
//! (errors, notices, reasons) alike, so text copied into other software, or
//! searched for on the page, matches, and one minus style is read throughout.

use core::fmt;

use crate::Rx;

/// A value in hundredths, rounded half away from zero after a tiny nudge
/// (1e-7) so that decimal ties stored inexactly in binary (2.675 is
/// 2.67499…) round as a person reading the decimal would expect.
pub(crate) fn hundredths(x: f64) -> i64 {
    if !x.is_finite() {
        return 0;
    }
    let s = x * 100.0;
    (s + s.signum() * 1e-7).round() as i64
}

fn digits(h: i64) -> String {
    let a = h.unsigned_abs();
    format!("{}.{:02}", a / 100, a % 100)
}

/// Shown instead of a figure that is not finite. The core never produces
/// one within the input limits; this guards against showing `0.00` for a
/// value that is not a number.
const NOT_A_FIGURE: &str = "\u{2014}";

/// A power in dioptres with two decimals and its sign: `+4.25`, `-3.82`.
/// Zero (anything that shows as 0.00) is `0.00`, never `+0.00` or `-0.00`.
/// A non-finite value shows as `—`, never as a number.
///
/// ```
/// use lensplane_core::fmt_power;
/// assert_eq!(fmt_power(4.2017), "+4.20");
/// assert_eq!(fmt_power(-3.8168), "-3.82");
/// assert_eq!(fmt_power(-0.001), "0.00");
/// ```
pub fn fmt_power(x: f64) -> String {
    if !x.is_finite() {
        return NOT_A_FIGURE.to_string();
    }
    let h = hundredths(x);
    match h.signum() {
        0 => "0.00".to_string(),
        1 => format!("+{}", digits(h)),
        _ => format!("-{}", digits(h)),
    }
}

/// A sphere: like [`fmt_power`] but zero is `plano`.
///
/// ```
/// use lensplane_core::fmt_sphere;
/// assert_eq!(fmt_sphere(0.0), "plano");
/// assert_eq!(fmt_sphere(-7.2993), "-7.30");
/// ```
pub fn fmt_sphere(x: f64) -> String {
    if x.is_finite() && hundredths(x) == 0 {
        "plano".to_string()
    } else {
        fmt_power(x)
    }
}

/// A figure that is not a lens power (accommodation, demand, blur,
/// a difference in size): two decimals, a sign only when negative.
///
/// ```
/// use lensplane_core::fmt_number;
/// assert_eq!(fmt_number(2.1162), "2.12");
/// assert_eq!(fmt_number(-0.004), "0.00");
/// ```
pub fn fmt_number(x: f64) -> String {
    if !x.is_finite() {
        return NOT_A_FIGURE.to_string();
    }
    let h = hundredths(x);
    if h < 0 {
        format!("-{}", digits(h))
    } else {
        digits(h)
    }
}

/// [`fmt_number`] followed by ` D`: `2.12 D`.
///
/// ```
/// assert_eq!(lensplane_core::fmt_dioptres(2.4272), "2.43 D");
/// ```
pub fn fmt_dioptres(x: f64) -> String {
    format!("{} D", fmt_number(x))
}

/// A distance in millimetres or centimetres, without needless decimals:
/// `12`, `13.5`, `40.64`.
///
/// ```
/// use lensplane_core::fmt_length;
/// assert_eq!(fmt_length(12.0), "12");
/// assert_eq!(fmt_length(13.5), "13.5");
/// assert_eq!(fmt_length(40.64), "40.64");
/// ```
pub fn fmt_length(x: f64) -> String {
    let s = fmt_number(x);
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// An axis with three digits, `005`, `090`, `180`, as orders are written so
/// that 5 cannot be misread as 50 (common practice, no source).
///
/// ```
/// assert_eq!(lensplane_core::fmt_axis(5), "005");
/// assert_eq!(lensplane_core::fmt_axis(90), "090");
/// assert_eq!(lensplane_core::fmt_axis(180), "180");
/// ```
pub fn fmt_axis(axis: u16) -> String {
    format!("{axis:03}")
}

/// Prints `-7.30 -1.63 ×180`, `+6.47 -2.26 ×090`, `plano -0.50 ×090`,
/// `-3.75 DS`, or `plano`. A cylinder that shows as 0.00 prints as
/// spherical. The cylinder form is the one the value is in; call
/// [`Rx::to_minus_cyl`] or [`Rx::to_plus_cyl`] first to choose.
///
/// ```
/// let rx = lensplane_core::Rx::new(-2.0, -1.0, 180).unwrap();
/// assert_eq!(rx.to_string(), "-2.00 -1.00 ×180");
/// assert_eq!(rx.transpose().to_string(), "-3.00 +1.00 ×090");
/// ```
impl fmt::Display for Rx {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let sphere = fmt_sphere(self.sphere());
        if hundredths(self.cylinder()) == 0 {
            if sphere == "plano" {
                f.write_str("plano")
            } else {
                write!(f, "{sphere} DS")
            }
        } else {
            write!(
                f,
                "{sphere} {} \u{d7}{}",
                fmt_power(self.cylinder()),
                fmt_axis(self.axis())
            )
        }
    }
}
