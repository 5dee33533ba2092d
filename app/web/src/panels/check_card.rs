//! One eye's lens check as plain data for the page: the overall verdict,
//! one row per checked item (the deviation, the tolerance, the band that
//! sets it, the verdict) and the copied lines. Every figure and word comes
//! from the core's [`LensCheckReport`]; this only arranges it.

use crate::widgets::{eye_words, Card, Headline};
use lensplane_core::{tolerances, CheckItem, CheckVerdict, ItemResult, LensCheckReport, LensType};

/// One item of the check as a row.
#[derive(Clone, Debug, PartialEq)]
pub struct CheckRow {
    /// Which item (for the page's `data-item`): "sphere", "cylinder", "axis", "add".
    pub key: &'static str,
    /// Its label: "Sphere meridian", "Cylinder", "Axis", "Add".
    pub label: &'static str,
    /// The ordered value as the core shows it.
    pub ordered: String,
    /// The measured value as the core shows it.
    pub measured: String,
    /// Deviation, tolerance and verdict when judged; `None` when not checked.
    pub judged: Option<JudgedRow>,
    /// Why this tolerance (the band), or why the item is not checked.
    pub why: String,
}

/// The figures of a judged item.
#[derive(Clone, Debug, PartialEq)]
pub struct JudgedRow {
    /// Measured − ordered: "-0.10", "+3°".
    pub deviation: String,
    /// "±0.13 D", "±3°".
    pub tolerance: String,
    /// Exactly "within tolerance" or "outside tolerance".
    pub verdict: &'static str,
    pub outside: bool,
}

/// Everything the page shows for one eye's check.
#[derive(Clone, Debug, PartialEq)]
pub struct CheckCard {
    /// Exactly "within tolerance" or "outside tolerance".
    pub verdict: &'static str,
    pub outside: bool,
    /// "R overall: outside tolerance (sphere, axis)".
    pub summary: String,
    /// What was compared: "Ordered -2.00 -1.00 ×090, read -2.10 -1.12 ×093 (both in minus-cylinder form)".
    pub compared: String,
    pub rows: Vec<CheckRow>,
    /// The copied lines of this eye.
    pub lines: Vec<String>,
}

fn label(item: CheckItem) -> &'static str {
    match item {
        CheckItem::Sphere => "Sphere meridian",
        CheckItem::Cylinder => "Cylinder",
        CheckItem::Axis => "Axis",
        CheckItem::Add => "Add",
    }
}

fn is_outside(v: CheckVerdict) -> bool {
    v == CheckVerdict::Outside
}

/// The card of one eye's check.
pub fn check_card(r: &LensCheckReport) -> CheckCard {
    let rows = r
        .items
        .iter()
        .map(|i| {
            let (judged, why) = match &i.result {
                ItemResult::Judged(j) => (
                    Some(JudgedRow {
                        deviation: j.deviation_text.clone(),
                        tolerance: j.tolerance_text.clone(),
                        verdict: j.verdict.words(),
                        outside: is_outside(j.verdict),
                    }),
                    j.why.clone(),
                ),
                ItemResult::NotApplicable(why) => (None, format!("Not checked: {why}")),
            };
            CheckRow {
                key: i.item.words(),
                label: label(i.item),
                ordered: i.ordered.clone(),
                measured: i.measured.clone(),
                judged,
                why,
            }
        })
        .collect();
    CheckCard {
        verdict: r.verdict.words(),
        outside: is_outside(r.verdict),
        summary: r.summary.clone(),
        compared: format!(
            "Ordered {}, read {} (both in minus-cylinder form)",
            r.ordered, r.measured
        ),
        rows,
        lines: r.lines.clone(),
    }
}

/// The compact line beside the entries while typing: "Lens within
/// tolerance · checked sphere, cylinder, axis" or "Lens outside tolerance ·
/// outside sphere, axis".
pub fn glance_card(r: &LensCheckReport) -> Card {
    let names = |items: Vec<CheckItem>| items.iter().map(|i| i.words()).collect::<Vec<_>>().join(", ");
    let checked: Vec<CheckItem> = r
        .items
        .iter()
        .filter(|i| i.verdict().is_some())
        .map(|i| i.item)
        .collect();
    let (exact_short, exact) = if r.outside.is_empty() {
        ("checked", names(checked))
    } else {
        ("outside", names(r.outside.clone()))
    };
    Card {
        headline: Headline {
            label: format!("{} lens", eye_words(r.eye).0),
            short: "Lens",
            value: r.verdict.words().to_string(),
            note: String::new(),
            exact_label: String::new(),
            exact,
            exact_short,
        },
        why: r.summary.clone(),
        alternatives: vec![],
        warnings: vec![],
        details: vec![],
        cross: None,
        copy: r.copy_text(),
    }
}

/// The tolerance tables of a lens type as the page lists them: a caption per
/// table, then each band and what it allows ("±2 % of the ordered size" for
/// a percentage band).
pub fn band_rows(lens: LensType) -> Vec<(&'static str, Vec<(&'static str, String)>)> {
    tolerances::tables(lens)
        .into_iter()
        .zip(CheckItem::ALL)
        .map(|(t, item)| {
            let rows = t
                .bands
                .iter()
                .map(|b| {
                    let allows = match b.allowance {
                        tolerances::Allowance::Percent(p) => format!("±{p} % of the ordered size"),
                        _ => b.words(0),
                    };
                    (b.range, allows)
                })
                .collect();
            let caption = match item {
                CheckItem::Axis => "Axis, by the ordered cylinder",
                other => label(other),
            };
            (caption, rows)
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use lensplane_core::{lens_check, Eye, LensCheckInput, Rx};

    fn card(ordered: Rx, measured: Rx) -> CheckCard {
        check_card(&lens_check(&LensCheckInput::new(Eye::Right, ordered, measured)).unwrap())
    }

    #[test]
    fn the_notes_first_check_value_is_within_with_the_axis_at_its_limit() {
        // Notes §14 [derived from the table, ANSI Z80.1-2015 as publicly summarised]:
        // −2.00 −1.00 ×90 → −2.10 −1.12 ×93: all within (axis at the ±3° limit).
        let c = card(Rx::new(-2.0, -1.0, 90).unwrap(), Rx::new(-2.1, -1.12, 93).unwrap());
        assert_eq!((c.verdict, c.outside), ("within tolerance", false));
        let axis = &c.rows[2];
        assert_eq!(axis.label, "Axis");
        let j = axis.judged.as_ref().unwrap();
        assert_eq!(
            (j.deviation.as_str(), j.tolerance.as_str(), j.verdict),
            ("+3°", "±3°", "within tolerance")
        );
        assert_eq!(axis.why, "axis for a cylinder over 0.75 to 1.50 D: ±3°");
        assert_eq!(c.rows[3].judged, None);
        assert_eq!(c.rows[3].why, "Not checked: no add ordered");
        assert_eq!(
            c.compared,
            "Ordered -2.00 -1.00 ×090, read -2.10 -1.12 ×093 (both in minus-cylinder form)"
        );
    }

    #[test]
    fn the_notes_second_check_value_is_outside_for_sphere_and_axis() {
        // Notes §14 [derived from the table]: −8.00 −0.25 ×45 → −8.20 −0.25 ×60: sphere out (±0.16), axis out (±14°).
        let c = card(Rx::new(-8.0, -0.25, 45).unwrap(), Rx::new(-8.2, -0.25, 60).unwrap());
        assert_eq!(c.verdict, "outside tolerance");
        assert_eq!(c.summary, "R overall: outside tolerance (sphere, axis)");
        let outside: Vec<_> = c
            .rows
            .iter()
            .filter(|r| r.judged.as_ref().is_some_and(|j| j.outside))
            .map(|r| r.key)
            .collect();
        assert_eq!(outside, ["sphere", "axis"]);
        assert_eq!(c.rows[0].judged.as_ref().unwrap().tolerance, "±0.16 D");
        let g = glance_card(
            &lens_check(&LensCheckInput::new(
                Eye::Right,
                Rx::new(-8.0, -0.25, 45).unwrap(),
                Rx::new(-8.2, -0.25, 60).unwrap(),
            ))
            .unwrap(),
        );
        assert_eq!(g.headline.glance(), "Lens outside tolerance · outside sphere, axis");
    }

    #[test]
    fn tables_list_every_band_with_what_it_allows() {
        // ANSI Z80.1-2015 as publicly summarised (notes §14): cylinder ±0.13 up to 2.00, ±0.15 to 4.50, ±4 % over.
        let t = band_rows(LensType::SingleVision);
        assert_eq!(t[1].0, "Cylinder");
        assert_eq!(t[2].0, "Axis, by the ordered cylinder");
        assert_eq!(
            t[1].1,
            vec![
                ("up to 2.00 D", "±0.13 D".to_string()),
                ("over 2.00 to 4.50 D", "±0.15 D".to_string()),
                ("over 4.50 D", "±4 % of the ordered size".to_string()),
            ]
        );
        assert_eq!(t[2].1[0].1, "no axis tolerance");
    }
}
