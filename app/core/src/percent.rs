//! Fractions written as percentages: one decimal, a space before `%` (as
//! the notes and SI write it, and as `fmt_dioptres` writes `D`), the ASCII
//! `-` for a minus, `—` for a figure that is not finite.

/// A fraction in tenths of a per cent, rounded half away from zero after a
/// tiny nudge (as `fmt_number` rounds hundredths), so a decimal tie stored
/// inexactly in binary rounds as a reader of the decimal would expect.
pub(crate) fn tenths_of_percent(fraction: f64) -> i64 {
    let s = fraction * 1000.0;
    (s + s.signum() * 1e-7).round() as i64
}

fn digits(t: i64) -> String {
    let a = t.unsigned_abs();
    format!("{}.{}", a / 10, a % 10)
}

/// A signed change as a percentage with one decimal: `+13.6 %`, `-9.6 %`;
/// anything that shows as zero is `0.0 %`.
///
/// ```
/// use lensplane_core::fmt_percent;
/// assert_eq!(fmt_percent(0.13636), "+13.6 %");
/// assert_eq!(fmt_percent(-0.096), "-9.6 %");
/// assert_eq!(fmt_percent(-0.0004), "0.0 %");
/// assert_eq!(fmt_percent(f64::NAN), "\u{2014}");
/// ```
pub fn fmt_percent(fraction: f64) -> String {
    if !fraction.is_finite() {
        return "\u{2014}".into();
    }
    let t = tenths_of_percent(fraction);
    match t.signum() {
        0 => "0.0 %".into(),
        1 => format!("+{} %", digits(t)),
        _ => format!("-{} %", digits(t)),
    }
}

/// A size (a difference that has no direction) as a percentage with one
/// decimal and no sign: `5.9 %`.
///
/// ```
/// use lensplane_core::fmt_percent_size;
/// assert_eq!(fmt_percent_size(0.05911), "5.9 %");
/// assert_eq!(fmt_percent_size(0.0), "0.0 %");
/// ```
pub fn fmt_percent_size(fraction: f64) -> String {
    if !fraction.is_finite() {
        return "\u{2014}".into();
    }
    format!("{} %", digits(tenths_of_percent(fraction.abs())))
}

/// A magnification factor (a ratio such as a power or shape factor) as the
/// percentage it changes a size by, one decimal with its sign, as
/// [`fmt_percent`] prints: `1.13636` is `+13.6 %`, `1.0` is `0.0 %`.
///
/// ```
/// use lensplane_core::fmt_factor;
/// // +8.00 at 12 mm, h = 15 mm [derived]: power factor 1 / 0.88 = 1.1364.
/// assert_eq!(fmt_factor(1.0 / 0.88), "+13.6 %");
/// assert_eq!(fmt_factor(1.0), "0.0 %");
/// assert_eq!(fmt_factor(0.9346), "-6.5 %");
/// assert_eq!(fmt_factor(f64::INFINITY), "\u{2014}");
/// ```
pub fn fmt_factor(ratio: f64) -> String {
    fmt_percent(ratio - 1.0)
}
