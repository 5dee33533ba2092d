//! The vertex conversion chart.
//!
//! Provenance: [textbook method] = F / (1 − δF) as taught in Bennett &
//! Rabbetts' Clinical Visual Optics and Keating (the notes' §15 values,
//! recomputed); [common practice] = the contact-lens ladder (0.25 D to
//! ±6.00, 0.50 D beyond) and ties toward plus, the notes' §5.

use lensplane_core::*;
use proptest::prelude::*;

fn mm(x: f64) -> VertexDistance {
    VertexDistance::from_mm(x).unwrap()
}

fn default_chart() -> Chart {
    Chart::new(&ChartSettings::default())
}

fn row_for(c: &Chart, power: f64) -> &ChartRow {
    c.rows.iter().find(|r| r.power == power).unwrap()
}

fn value(r: &ChartRow) -> ChartValue {
    r.value.clone().unwrap()
}

#[track_caller]
fn close(actual: f64, expected: f64) {
    assert!((actual - expected).abs() < 5e-5, "got {actual:.6}, expected {expected}");
}

// ---- Check values of the notes, §15 ----

#[test]
fn n15_check_values_on_the_contact_lens_ladder() {
    let c = default_chart();
    // [textbook method] −6.00 @ 12 → −5.5970; [common practice] → −5.50 (0.25 D steps to 6.00).
    let v = value(row_for(&c, -6.0));
    close(v.exact, -5.5970);
    assert_eq!(v.orderable, -5.5);
    // [textbook method] +7.50 @ 12 → +8.2418; [common practice] 0.50 D steps beyond 6.00 → +8.00.
    let v = value(row_for(&c, 7.5));
    close(v.exact, 8.2418);
    assert_eq!(v.orderable, 8.0);
    // [textbook method] −20.00 @ 12 → −16.1290; [common practice] → −16.00.
    let v = value(row_for(&c, -20.0));
    close(v.exact, -16.1290);
    assert_eq!(v.orderable, -16.0);
    assert_eq!(
        row_for(&c, -20.0).cells,
        ["-20.00", "-16.13", "-16.00"].map(String::from)
    );
    assert_eq!(row_for(&c, 7.5).cells, ["+7.50", "+8.24", "+8.00"].map(String::from));
}

#[test]
fn n15_check_values_on_spectacle_quarter_steps() {
    let s = ChartSettings::new(
        mm(12.0),
        VertexDistance::CORNEA,
        4.0,
        20.0,
        0.25,
        Some(LadderKind::Spectacle),
    )
    .unwrap();
    let c = Chart::new(&s);
    // Same exact values [textbook method]; quarter steps: −5.50, +8.25, −16.25 (−16.1290 is 0.121 from −16.25).
    assert_eq!(value(row_for(&c, -6.0)).orderable, -5.5);
    assert_eq!(value(row_for(&c, 7.5)).orderable, 8.25);
    assert_eq!(value(row_for(&c, -20.0)).orderable, -16.25);
    assert_eq!(
        c.title,
        "Vertex conversion chart: 12 mm → cornea (contact lens), spectacle quarter steps"
    );
}

#[test]
fn the_contact_lens_rows_match_the_recommended_spherical_lens() {
    let c = default_chart();
    for r in &c.rows {
        let v = value(r);
        let rec = recommend(
            &Rx::sphere_only(v.exact).unwrap(),
            VertexDistance::CORNEA,
            &OrderSettings::default(),
        )
        .unwrap();
        assert_eq!(rec.order.lens.sphere(), v.orderable, "{:?}", r.cells);
    }
}

// ---- The default chart ----

#[test]
fn the_default_chart_has_130_rows_from_minus_4_to_plus_20() {
    let c = default_chart();
    // 4.00 to 20.00 in 0.25 steps is 65 sizes, each minus and plus.
    assert_eq!(c.rows.len(), 130);
    let first = &c.rows[0];
    // V1 [textbook]: −4.00 @ 12 mm → −3.8168 → −3.75.
    assert_eq!(first.cells, ["-4.00", "-3.82", "-3.75"].map(String::from));
    assert_eq!(first.section, ChartSection::Minus);
    assert_eq!(c.rows[64].cells[0], "-20.00");
    // V2 [textbook]: +4.00 @ 12 mm → +4.2017 → +4.25.
    assert_eq!(c.rows[65].cells, ["+4.00", "+4.20", "+4.25"].map(String::from));
    assert_eq!(c.rows[65].section, ChartSection::Plus);
    // [derived] +20.00 / (1 − 0.012 × 20) = +26.3158 → +26.50 on 0.50 D steps.
    let last = c.rows.last().unwrap();
    close(value(last).exact, 26.3158);
    assert_eq!(last.cells, ["+20.00", "+26.32", "+26.50"].map(String::from));
    assert_eq!(
        c.title,
        "Vertex conversion chart: 12 mm → cornea (contact lens), contact-lens steps"
    );
    assert_eq!(
        c.subtitle,
        "Minus and plus powers 4.00 to 20.00 D in 0.25 D steps; exact values to two decimals, orderable values on contact-lens steps (ties toward plus)"
    );
    assert_eq!(
        c.header,
        ["Power at 12 mm", "Exact at the cornea", "To order (contact-lens steps)"].map(String::from)
    );
}

#[test]
fn titles_name_both_planes_and_the_ladder() {
    let c = Chart::new(&ChartSettings::new(mm(10.0), mm(14.0), 4.0, 8.0, 0.5, None).unwrap());
    assert_eq!(
        c.title,
        "Vertex conversion chart: 10 mm → 14 mm, spectacle quarter steps"
    );
    assert_eq!(c.header[1], "Exact at 14 mm");
    // V6 [textbook]: −10.00 from 10 to 14 mm → −10.4167 → −10.50 in quarter steps.
    let c = Chart::new(&ChartSettings::new(mm(10.0), mm(14.0), 10.0, 10.0, 0.25, None).unwrap());
    assert_eq!(c.rows[0].cells, ["-10.00", "-10.42", "-10.50"].map(String::from));
    let c = Chart::new(&ChartSettings::new(VertexDistance::CORNEA, mm(12.0), 4.0, 8.0, 1.0, None).unwrap());
    assert_eq!(
        c.title,
        "Vertex conversion chart: cornea (contact lens) → 12 mm, spectacle quarter steps"
    );
    assert_eq!(c.header[0], "Power at the cornea");
    // The one-line summary the history lists names the same planes, powers and ladder.
    assert_eq!(
        c.settings.summary(),
        "cornea (contact lens) → 12 mm, minus and plus 4.00 to 8.00 D in 1.00 D steps, spectacle quarter steps"
    );
}

#[test]
fn a_chart_from_zero_lists_plano_once() {
    let c = Chart::new(&ChartSettings::new(mm(12.0), VertexDistance::CORNEA, 0.0, 1.0, 0.25, None).unwrap());
    assert_eq!(c.rows.len(), 9);
    assert_eq!(c.rows[0].section, ChartSection::Plano);
    assert_eq!(c.rows[0].cells, ["plano", "plano", "plano"].map(String::from));
    assert_eq!(c.rows[1].cells[0], "-0.25");
    assert_eq!(c.rows[5].cells[0], "+0.25");
}

#[test]
fn a_move_with_no_finite_lens_is_an_error_row_never_infinity() {
    // [derived] +26.00 from 30 mm to the cornea: 26 / (1 − 0.78) = 118 D, beyond the 100 D limit;
    // +24.00: 24 / 0.28 = 85.71 D.
    let s = ChartSettings::new(mm(30.0), VertexDistance::CORNEA, 24.0, 30.0, 2.0, None).unwrap();
    let c = Chart::new(&s);
    let ok = row_for(&c, 24.0);
    close(value(ok).exact, 85.7143);
    let bad = row_for(&c, 26.0);
    assert_eq!(
        bad.value.as_ref().unwrap_err().to_string(),
        "no finite lens: the far point of +26.00 lies at the new lens plane"
    );
    assert_eq!(bad.cells, ["+26.00", "no finite lens", "none"].map(String::from));
    let csv = c.csv();
    assert!(!csv.contains("inf") && !csv.contains("NaN"), "{csv}");
    // Moving away from the eye, the minus side has none: −30.00 from the cornea to 30 mm.
    let s = ChartSettings::new(VertexDistance::CORNEA, mm(30.0), 30.0, 30.0, 0.25, None).unwrap();
    assert!(Chart::new(&s).rows[0].value.is_err());
}

// ---- Carried prescriptions ----

#[test]
fn rows_for_a_carried_prescription_are_its_meridians() {
    let c = default_chart();
    let names = |rows: Vec<usize>| rows.into_iter().map(|i| c.rows[i].cells[0].clone()).collect::<Vec<_>>();
    assert_eq!(
        names(c.rows_for(&Rx::new(-6.0, -2.0, 180).unwrap())),
        ["-6.00", "-8.00"]
    );
    // Either cylinder form gives the same rows (in meridian order).
    assert_eq!(names(c.rows_for(&Rx::new(-8.0, 2.0, 90).unwrap())), ["-8.00", "-6.00"]);
    assert_eq!(names(c.rows_for(&Rx::new(7.5, 0.0, 180).unwrap())), ["+7.50"]);
    // A meridian between the chart's powers, or outside its range, has no row.
    assert!(c.rows_for(&Rx::new(-6.1, -2.0, 180).unwrap()).is_empty());
    assert!(c.rows_for(&Rx::sphere_only(-2.0).unwrap()).is_empty());
    assert_eq!(names(c.rows_for(&Rx::new(-2.0, -3.0, 90).unwrap())), ["-5.00"]);
}

// ---- CSV ----

#[test]
fn csv_is_a_header_and_one_row_per_power() {
    let c = default_chart();
    let csv = c.csv();
    assert!(csv.is_ascii());
    assert!(csv.ends_with("\r\n"));
    let lines: Vec<&str> = csv.split("\r\n").filter(|l| !l.is_empty()).collect();
    assert_eq!(lines.len(), 131);
    assert_eq!(
        lines[0],
        "Power at 12 mm,Exact at the cornea,To order (contact-lens steps)"
    );
    assert_eq!(lines[1], "-4.00,-3.82,-3.75");
    assert_eq!(lines[130], "+20.00,+26.32,+26.50");
    for (line, row) in lines[1..].iter().zip(&c.rows) {
        assert_eq!(
            line.split(',').collect::<Vec<_>>(),
            row.cells.iter().map(String::as_str).collect::<Vec<_>>()
        );
    }
    assert!(!csv.contains('\n') || csv.matches('\n').count() == csv.matches("\r\n").count());
}

// ---- Parameters: defaults, link values and every error ----

#[test]
fn the_default_link_reads_as_the_default_chart() {
    let p = parse_chart(&ChartQuery::default()).unwrap();
    assert_eq!(p.value, ChartSettings::default());
    assert!(p.notices.is_empty());
    // The ladder defaults by the target plane, as the vertex panel chooses.
    let p = parse_chart(&ChartQuery {
        to: Some("14"),
        ..ChartQuery::default()
    })
    .unwrap();
    assert_eq!(p.value.ladder(), LadderKind::Spectacle);
    let p = parse_chart(&ChartQuery {
        ladder: Some("SPEC"),
        ..ChartQuery::default()
    })
    .unwrap();
    assert_eq!(p.value.ladder(), LadderKind::Spectacle);
    let p = parse_chart(&ChartQuery {
        from: Some("10"),
        to: Some("1.4 cm"),
        min: Some("-4"),
        max: Some("8,5 D"),
        step: Some("0.5"),
        ladder: Some("cl"),
    })
    .unwrap();
    assert_eq!(
        p.value.link_values().map(|(_, v)| v),
        ["10", "14", "4", "8.5", "0.5", "cl"].map(String::from)
    );
    let words: Vec<_> = p.notices.iter().map(|n| (n.field, n.message.as_str())).collect();
    assert_eq!(
        words,
        [
            (Field::VertexTo, "1.4 cm read as 14 mm"),
            (Field::ChartMin, "the chart lists both signs: -4 read as 4.00"),
            (Field::ChartMax, "read the comma as a decimal point: 8.50"),
        ]
    );
}

#[track_caller]
fn bad(q: ChartQuery<'_>, message: &str, field: Field) {
    let e = parse_chart(&q).unwrap_err();
    assert_eq!(e.to_string(), message);
    assert_eq!(e.field(), field, "{message}");
}

#[test]
fn every_bad_parameter_has_its_own_message_at_its_own_field() {
    let q = ChartQuery::default;
    bad(
        ChartQuery {
            min: Some("20"),
            max: Some("4"),
            ..q()
        },
        "lowest power 20.00 is above the highest power, 4.00",
        Field::ChartMin,
    );
    bad(
        ChartQuery { step: Some("0"), ..q() },
        "step 0.00 must be more than 0",
        Field::ChartStep,
    );
    bad(
        ChartQuery {
            step: Some("-0.25"),
            ..q()
        },
        "step -0.25 must be more than 0",
        Field::ChartStep,
    );
    bad(
        ChartQuery {
            step: Some("0.3"),
            ..q()
        },
        "step 0.30 is not a whole number of quarter dioptres: try 0.25 or 0.50",
        Field::ChartStep,
    );
    bad(
        ChartQuery {
            step: Some("0.1"),
            ..q()
        },
        "step 0.10 is not a whole number of quarter dioptres: try 0.25",
        Field::ChartStep,
    );
    bad(
        ChartQuery {
            min: Some("4.1"),
            ..q()
        },
        "lowest power 4.10 is not a whole number of quarter dioptres: try 4.00 or 4.25",
        Field::ChartMin,
    );
    bad(
        ChartQuery {
            max: Some("19.9"),
            ..q()
        },
        "highest power 19.90 is not a whole number of quarter dioptres: try 19.75 or 20.00",
        Field::ChartMax,
    );
    bad(
        ChartQuery {
            step: Some("0.75"),
            ..q()
        },
        "step 0.75 does not lead from 4.00 to 20.00 in whole steps: try a highest power of 19.75 or 20.50",
        Field::ChartStep,
    );
    bad(
        ChartQuery {
            max: Some("30"),
            step: Some("4"),
            ..q()
        },
        "step 4.00 does not lead from 4.00 to 30.00 in whole steps: try a highest power of 28.00",
        Field::ChartStep,
    );
    bad(
        ChartQuery { max: Some("31"), ..q() },
        "highest power 31.00 is outside 0–30 D",
        Field::ChartMax,
    );
    bad(
        ChartQuery {
            min: Some("-31"),
            ..q()
        },
        "lowest power 31.00 is outside 0–30 D",
        Field::ChartMin,
    );
    bad(
        ChartQuery {
            step: Some("40"),
            ..q()
        },
        "step 40.00 is outside 0.25–30 D",
        Field::ChartStep,
    );
    bad(
        ChartQuery {
            min: Some("0"),
            max: Some("30"),
            ..q()
        },
        "the chart would have 241 rows, more than 200 rows: use a larger step or a narrower range",
        Field::ChartStep,
    );
    bad(
        ChartQuery {
            ladder: Some("half"),
            ..q()
        },
        "ladder \"half\" is not one of cl (contact-lens steps), spec (spectacle quarter steps)",
        Field::Ladder,
    );
    bad(
        ChartQuery { min: Some(""), ..q() },
        "lowest power is empty",
        Field::ChartMin,
    );
    bad(
        ChartQuery {
            max: Some("twenty"),
            ..q()
        },
        "unexpected \"twenty\"",
        Field::ChartMax,
    );
    bad(
        ChartQuery {
            max: Some("20 mm"),
            ..q()
        },
        "unexpected \"mm\"",
        Field::ChartMax,
    );
    bad(
        ChartQuery {
            step: Some("0,2,5"),
            ..q()
        },
        "\"0,2,5\" is ambiguous: use one decimal point per number",
        Field::ChartStep,
    );
    bad(
        ChartQuery {
            from: Some("45"),
            ..q()
        },
        "vertex distance 45 mm is outside 0–30 mm",
        Field::VertexFrom,
    );
    bad(
        ChartQuery { to: Some("1.2"), ..q() },
        "vertex distance 1.2 mm is under 3 mm: did you mean 12 mm?",
        Field::VertexTo,
    );
}

#[test]
fn the_row_cap_is_reachable_and_its_edge_is_inside() {
    // 4.00 to 28.75 in quarter steps: 100 sizes, 200 rows: allowed; to 29.00: 202 rows.
    assert_eq!(
        ChartSettings::new(mm(12.0), mm(0.0), 4.0, 28.75, 0.25, None)
            .unwrap()
            .rows(),
        200
    );
    let e = ChartSettings::new(mm(12.0), mm(0.0), 4.0, 29.0, 0.25, None).unwrap_err();
    assert_eq!(
        e.to_string(),
        "the chart would have 202 rows, more than 200 rows: use a larger step or a narrower range"
    );
    // Not-a-number from the API side is refused, never charted.
    let e = ChartSettings::new(mm(12.0), mm(0.0), f64::NAN, 20.0, 0.25, None).unwrap_err();
    assert_eq!(e.to_string(), "lowest power is not a number");
    let e = ChartSettings::new(mm(12.0), mm(0.0), 4.0, 20.0, f64::INFINITY, None).unwrap_err();
    assert_eq!(e.to_string(), "step is not a number");
}

// ---- Every row is what the vertex panel gives ----

fn plane() -> impl Strategy<Value = VertexDistance> {
    prop_oneof![
        Just(VertexDistance::CORNEA),
        Just(VertexDistance::SPECTACLES),
        // What a link can carry: 0, or 3 to 30 mm (shorter ones are questioned).
        (6u32..=60).prop_map(|h| mm(f64::from(h) / 2.0)),
    ]
}

fn settings() -> impl Strategy<Value = ChartSettings> {
    // Sizes in quarter dioptres: min 0–120 (0–30 D), n further steps that
    // stay within 30 D and 200 rows.
    (0u32..=120, 1u32..=8)
        .prop_flat_map(|(min_q, step_q)| {
            let most = ((120 - min_q) / step_q).min(99);
            (
                plane(),
                plane(),
                Just(min_q),
                Just(step_q),
                0..=most,
                prop_oneof![
                    Just(None),
                    Just(Some(LadderKind::ContactLens)),
                    Just(Some(LadderKind::Spectacle))
                ],
            )
        })
        .prop_map(|(from, to, min_q, step_q, n, ladder)| {
            let max_q = min_q + n * step_q;
            ChartSettings::new(
                from,
                to,
                f64::from(min_q) / 4.0,
                f64::from(max_q) / 4.0,
                f64::from(step_q) / 4.0,
                ladder,
            )
            .unwrap()
        })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    #[test]
    fn each_row_equals_the_vertex_panel(s in settings()) {
        let c = Chart::new(&s);
        prop_assert_eq!(c.rows.len(), s.rows());
        // The vertex panel with the chart's ladder for either target.
        let defaults = OrderSettings::default();
        let ladder = s.ladder().ladder(&defaults);
        let panel = OrderSettings { spectacle: ladder, contact_lens: ladder, ..defaults };
        for r in &c.rows {
            let report = vertex_report(&VertexInput {
                rx: Rx::sphere_only(r.power).unwrap(),
                from: s.from(),
                to: s.to(),
                settings: panel.clone(),
            });
            match (&r.value, report) {
                (Ok(v), Ok(rep)) => {
                    prop_assert_eq!(v.exact, rep.exact.sphere());
                    prop_assert_eq!(v.orderable, rep.ordered.ordered.sphere());
                    prop_assert_eq!(&r.cells[1], &fmt_sphere(rep.exact.sphere()));
                }
                (Err(e), Err(rep)) => prop_assert_eq!(e, &rep),
                (row, rep) => prop_assert!(false, "row {:?} but panel {:?}", row, rep.map(|r| r.exact)),
            }
            for cell in &r.cells {
                prop_assert!(cell.is_ascii() && !cell.contains(',') && !cell.contains("inf") && !cell.contains("NaN"));
            }
        }
        prop_assert_eq!(c.csv().matches("\r\n").count(), c.rows.len() + 1);
    }

    #[test]
    fn the_settings_survive_their_link_values(s in settings()) {
        let v = s.link_values();
        let q = ChartQuery {
            from: Some(&v[0].1),
            to: Some(&v[1].1),
            min: Some(&v[2].1),
            max: Some(&v[3].1),
            step: Some(&v[4].1),
            ladder: Some(&v[5].1),
        };
        prop_assert_eq!(parse_chart(&q).unwrap().value, s);
    }
}

// The settings read back as given (the chart's title and CSV are written from them).
#[test]
fn settings_read_back_as_given() {
    let s = ChartSettings::new(mm(14.0), mm(10.0), 2.5, 12.0, 0.5, Some(LadderKind::Spectacle)).unwrap();
    assert_eq!((s.from().mm(), s.to().mm()), (14.0, 10.0));
    assert_eq!((s.min(), s.max(), s.step()), (2.5, 12.0, 0.5));
    assert_eq!(s.ladder(), LadderKind::Spectacle);
    assert_eq!(s.rows(), 2 * 20);
}
