//! Edits the entry form offers besides typing: the ± control (phone decimal
//! keypads often have no minus key) and the steppers (quarter dioptres for
//! powers, 5° or 1° for axes). They work on the typed text, so the UI does no
//! arithmetic; a text that does not parse is left alone.

use crate::format::{fmt_power, fmt_sphere};
use crate::limits;
use crate::parse::{parse_add, parse_axis_field, parse_cylinder_field, parse_sphere_field};
use crate::rounding::{round_to_step, TieRule};

/// What a stepper steps.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum StepKind {
    /// A sphere field: quarter dioptres within [`limits::SPHERE`], zero shown as `plano`.
    Sphere,
    /// A cylinder: quarter dioptres within [`limits::CYLINDER`].
    Cylinder,
    /// An add: quarter dioptres within [`limits::ADD`] (never minus).
    Add,
    /// An axis: this many degrees, going round 180 → 5 (a deliberate press,
    /// never a typed value wrapped silently).
    Axis(u16),
}

const MINUSES: [char; 5] = ['-', '\u{2212}', '\u{2013}', '\u{2014}', '\u{FF0D}'];

/// The text with its leading sign flipped: `-2.00` ↔ `+2.00`, a sign-less
/// `2.00` becomes `-2.00`, an empty field becomes `-` (ready for digits).
/// Words such as `plano` are returned unchanged.
///
/// ```
/// use lensplane_core::toggle_sign;
/// assert_eq!(toggle_sign("-2.00"), "+2.00");
/// assert_eq!(toggle_sign("+2.00"), "-2.00");
/// assert_eq!(toggle_sign("\u{2212}6"), "+6");
/// assert_eq!(toggle_sign("2.5"), "-2.5");
/// assert_eq!(toggle_sign(""), "-");
/// assert_eq!(toggle_sign("plano"), "plano");
/// ```
pub fn toggle_sign(text: &str) -> String {
    let t = text.trim();
    if let Some(rest) = t.strip_prefix('+') {
        return format!("-{rest}");
    }
    if let Some(first) = t.chars().next().filter(|c| MINUSES.contains(c)) {
        return format!("+{}", &t[first.len_utf8()..]);
    }
    match t.chars().next() {
        None => "-".to_string(),
        Some(c) if c.is_ascii_digit() || c == '.' || c == ',' => format!("-{t}"),
        Some(_) => text.to_string(),
    }
}

/// One press of a stepper: the next step up (`up`) or down from the typed
/// value, formatted for the field. An off-step value moves to the next step
/// in that direction (−2.30 up → −2.25). `None` when the text does not parse
/// or the limit is reached.
///
/// ```
/// use lensplane_core::{step_text, StepKind};
/// assert_eq!(step_text("-2.00", StepKind::Sphere, true).as_deref(), Some("-1.75"));
/// assert_eq!(step_text("-2.30", StepKind::Sphere, true).as_deref(), Some("-2.25"));
/// assert_eq!(step_text("+0.25", StepKind::Sphere, false).as_deref(), Some("plano"));
/// assert_eq!(step_text("", StepKind::Cylinder, false).as_deref(), Some("-0.25"));
/// assert_eq!(step_text("180", StepKind::Axis(5), true).as_deref(), Some("5"));
/// assert_eq!(step_text("", StepKind::Axis(5), false).as_deref(), Some("175"));
/// assert_eq!(step_text("2.00", StepKind::Sphere, true), None); // no sign: not guessed
/// assert_eq!(step_text("2.5", StepKind::Add, true).as_deref(), Some("+2.75"));
/// assert_eq!(step_text("", StepKind::Add, true).as_deref(), Some("+0.25"));
/// assert_eq!(step_text("+0.25", StepKind::Add, false).as_deref(), Some("0.00"));
/// assert_eq!(step_text("0.00", StepKind::Add, false), None); // an add is never minus
/// assert_eq!(step_text("+4.00", StepKind::Add, true), None);
/// ```
pub fn step_text(text: &str, kind: StepKind, up: bool) -> Option<String> {
    match kind {
        StepKind::Axis(step) => {
            let step = step.clamp(1, 90);
            let axis = parse_axis_field(text).ok()?.value.unwrap_or(180);
            let next = if up {
                (axis / step + 1) * step
            } else if axis % step == 0 {
                axis - step
            } else {
                axis / step * step
            };
            let next = if next > 180 {
                next - 180
            } else if next == 0 {
                180
            } else {
                next
            };
            Some(next.to_string())
        }
        StepKind::Sphere | StepKind::Cylinder | StepKind::Add => {
            let limit = match kind {
                StepKind::Sphere => limits::SPHERE,
                StepKind::Add => limits::ADD,
                _ => limits::CYLINDER,
            };
            let value = if text.trim().is_empty() {
                0.0
            } else if kind == StepKind::Sphere {
                parse_sphere_field(text).ok()?.value
            } else if kind == StepKind::Add {
                parse_add(text).ok()?.value.dioptres()
            } else {
                parse_cylinder_field(text).ok()?.value
            };
            let tie = if up { TieRule::TowardMinus } else { TieRule::TowardPlus };
            // Snap to the step below/above first, then take one step.
            let snapped = round_to_step(value, 0.25, tie);
            let next = match (up, snapped > value + 1e-9, snapped < value - 1e-9) {
                (true, true, _) | (false, _, true) => snapped,
                (true, _, _) => snapped + 0.25,
                (false, _, _) => snapped - 0.25,
            };
            // Quarter dioptres are exact in binary: no tolerance needed at the limit.
            if !limit.contains(next) {
                return None;
            }
            Some(if kind == StepKind::Sphere {
                fmt_sphere(next)
            } else {
                fmt_power(next)
            })
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn steps_walk_the_quarter_ladder_both_ways() {
        let mut t = String::from("-0.50");
        for expected in ["-0.25", "plano", "+0.25", "+0.50"] {
            t = step_text(&t, StepKind::Sphere, true).unwrap();
            assert_eq!(t, expected);
        }
        assert_eq!(step_text("-2.30", StepKind::Sphere, false).as_deref(), Some("-2.50"));
        assert_eq!(step_text("+30.00", StepKind::Sphere, true), None);
        assert_eq!(step_text("-10.00", StepKind::Cylinder, false), None);
    }

    #[test]
    fn axis_steps_go_round_and_snap() {
        assert_eq!(step_text("5", StepKind::Axis(5), false).as_deref(), Some("180"));
        assert_eq!(step_text("92", StepKind::Axis(5), true).as_deref(), Some("95"));
        assert_eq!(step_text("92", StepKind::Axis(5), false).as_deref(), Some("90"));
        assert_eq!(step_text("92", StepKind::Axis(1), true).as_deref(), Some("93"));
        assert_eq!(step_text("181", StepKind::Axis(5), true), None);
    }

    #[test]
    fn toggling_twice_restores_the_sign() {
        for t in ["-2.00", "+0.75", "-12"] {
            assert_eq!(toggle_sign(&toggle_sign(t)), t);
        }
    }
}
