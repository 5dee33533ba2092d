//! Exact error text, field and position for every bad input in the notes'
//! input table (section 9), and for the other hard limits.
//! Positions are character indices into the typed text.

use lensplane_core::*;

fn err(r: Result<impl std::fmt::Debug, Error>) -> Error {
    match r {
        Ok(v) => panic!("expected an error, got {v:?}"),
        Err(e) => e,
    }
}

#[track_caller]
fn rx_error(text: &str, message: &str, field: Field, position: Option<usize>) {
    let e = err(parse_rx(text));
    assert_eq!(e.to_string(), message, "message for {text:?}");
    assert_eq!(e.field(), field, "field for {text:?}");
    assert_eq!(e.position(), position, "position for {text:?}");
}

#[test]
fn axis_out_of_range_is_rejected_never_wrapped() {
    rx_error("-2.00 -1.00 x181", "axis 181 is outside 1–180", Field::Axis, Some(13));
    rx_error("-2.00 -1.00 x270", "axis 270 is outside 1–180", Field::Axis, Some(13));
    rx_error("-2.00 -1.00 x360", "axis 360 is outside 1–180", Field::Axis, Some(13));
    rx_error(
        "-2.00 -1.00 x 1800",
        "axis 1800 is outside 1–180",
        Field::Axis,
        Some(14),
    );
}

#[test]
fn negative_and_decimal_axes_are_rejected() {
    rx_error("-2.00 -1.00 x-10", "axis -10 is outside 1–180", Field::Axis, Some(13));
    rx_error(
        "-2.00 -1.00 x90.5",
        "axis 90.5 must be a whole number of degrees",
        Field::Axis,
        Some(13),
    );
    rx_error(
        "-2.00 -1.00 x 90.0",
        "axis 90.0 must be a whole number of degrees",
        Field::Axis,
        Some(14),
    );
}

#[test]
fn sphere_without_sign_asks() {
    rx_error(
        "2.00 -1.00 x90",
        "sphere needs a sign: +2.00 or -2.00?",
        Field::Sphere,
        Some(0),
    );
    rx_error("2 DS", "sphere needs a sign: +2.00 or -2.00?", Field::Sphere, Some(0));
    rx_error("±2.00", "sphere needs a sign: +2.00 or -2.00?", Field::Sphere, Some(0));
}

#[test]
fn cylinder_without_sign_asks() {
    rx_error(
        "-2.00 1.00 x90",
        "cylinder needs a sign: +1.00 or -1.00?",
        Field::Cylinder,
        Some(6),
    );
}

#[test]
fn cylinder_without_axis_blocks() {
    rx_error("-2.00 -1.00", "cylinder needs an axis", Field::Axis, Some(6));
    rx_error("-2.00/-1.00", "cylinder needs an axis", Field::Axis, Some(6));
    rx_error("-2.00 -1.00 x", "cylinder needs an axis", Field::Axis, Some(12));
}

#[test]
fn implied_decimals_offer_never_correct() {
    rx_error(
        "-250",
        "sphere -250 is outside ±30 D: did you mean -2.50?",
        Field::Sphere,
        Some(0),
    );
    rx_error(
        "-80",
        "sphere -80 is outside ±30 D: did you mean -8.00?",
        Field::Sphere,
        Some(0),
    );
    rx_error(
        "-75 -1.00 x90",
        "sphere -75 is outside ±30 D: did you mean -0.75 or -7.50?",
        Field::Sphere,
        Some(0),
    );
    rx_error(
        "-2.00 -125 x90",
        "cylinder -125 is outside ±10 D: did you mean -1.25?",
        Field::Cylinder,
        Some(6),
    );
    rx_error("-31.00", "sphere -31.00 is outside ±30 D", Field::Sphere, Some(0));
    rx_error(
        "250",
        "sphere 250 is outside ±30 D: did you mean +2.50 or -2.50?",
        Field::Sphere,
        Some(0),
    );
}

#[test]
fn ambiguous_commas_are_rejected() {
    rx_error(
        "2,5,90",
        "\"2,5,90\" is ambiguous: use one decimal point per number",
        Field::Rx,
        Some(0),
    );
    rx_error(
        "-1.2.3",
        "\"-1.2.3\" is ambiguous: use one decimal point per number",
        Field::Rx,
        Some(0),
    );
}

#[test]
fn other_bad_prescriptions() {
    rx_error("", "prescription is empty", Field::Rx, None);
    rx_error("   ", "prescription is empty", Field::Rx, None);
    rx_error("-2.00 x90", "axis needs a cylinder", Field::Axis, Some(6));
    rx_error("-2.00 -1.00 x90 q", "unexpected \"q\"", Field::Rx, Some(16));
    rx_error("abc", "unexpected \"abc\"", Field::Sphere, Some(0));
    rx_error("-2.00 DS -1.00", "unexpected \"-1.00\"", Field::Rx, Some(9));
    rx_error("R -2.00", "unexpected \"R\"", Field::Sphere, Some(0));
}

#[test]
fn positions_count_characters_not_bytes() {
    // "−" (U+2212) is three bytes but one character.
    rx_error(
        "\u{2212}2.00 \u{2212}1.00 ×181",
        "axis 181 is outside 1–180",
        Field::Axis,
        Some(13),
    );
}

#[test]
fn field_parsers() {
    let e = err(parse_sphere_field(""));
    assert_eq!(
        (e.to_string(), e.field()),
        ("sphere is empty".to_string(), Field::Sphere)
    );
    let e = err(parse_sphere_field("3.5"));
    assert_eq!(e.to_string(), "sphere needs a sign: +3.50 or -3.50?");
    let e = err(parse_cylinder_field("0.75"));
    assert_eq!(e.to_string(), "cylinder needs a sign: +0.75 or -0.75?");
    assert_eq!(e.field(), Field::Cylinder);
    let e = err(parse_cylinder_field("-12"));
    assert_eq!(e.to_string(), "cylinder -12 is outside ±10 D");
    let e = err(parse_axis_field("181"));
    assert_eq!(
        (e.to_string(), e.position()),
        ("axis 181 is outside 1–180".to_string(), Some(0))
    );
    let e = err(parse_axis_field("x"));
    assert_eq!(e.to_string(), "axis is empty");
    let e = err(Rx::from_fields("-2.00", "-1.00", ""));
    assert_eq!(
        (e.to_string(), e.field()),
        ("cylinder needs an axis".to_string(), Field::Axis)
    );
    let e = err(Rx::from_fields("-2.00", "-1.00", "0.5"));
    assert_eq!(e.to_string(), "axis 0.5 must be a whole number of degrees");
}

#[test]
fn vertex_distances() {
    let cases = [
        ("1.2", "vertex distance 1.2 mm is under 3 mm: did you mean 12 mm?"),
        ("0.012", "vertex distance 0.012 mm is under 3 mm: did you mean 12 mm?"),
        ("1.4", "vertex distance 1.4 mm is under 3 mm: did you mean 14 mm?"),
        ("0.1", "vertex distance 0.1 mm is under 3 mm"),
        ("45", "vertex distance 45 mm is outside 0–30 mm"),
        ("-5", "vertex distance -5 mm is outside 0–30 mm"),
        ("4 cm", "vertex distance 40 mm is outside 0–30 mm"),
        ("", "vertex distance is empty"),
        ("12 ft", "unexpected \"ft\""),
    ];
    for (text, message) in cases {
        let e = err(parse_vertex_mm(text));
        assert_eq!(e.to_string(), message, "for {text:?}");
        assert_eq!(e.field(), Field::VertexFrom);
    }
}

#[test]
fn reading_distances() {
    let cases = [
        ("16", "reading distance 16 needs a unit: cm or in?"),
        ("0.4", "reading distance 0.4 needs a unit: 40 cm?"),
        ("5", "reading distance 5 needs a unit: cm or in?"),
        ("120", "reading distance 120 cm is outside 10–100 cm"),
        ("5 cm", "reading distance 5 cm is outside 10–100 cm"),
        ("50 in", "reading distance 127 cm is outside 10–100 cm"),
        ("-40 cm", "unexpected \"-40\""),
        ("", "reading distance is empty"),
    ];
    for (text, message) in cases {
        let e = err(parse_reading_distance(text));
        assert_eq!(e.to_string(), message, "for {text:?}");
        assert_eq!(e.field(), Field::ReadingDistance);
    }
}

#[test]
fn adds_and_ages() {
    let cases: [(Result<(), Error>, &str); 8] = [
        (parse_add("-2.50").map(|_| ()), "an add is always plus"),
        (parse_add("\u{2212}1").map(|_| ()), "an add is always plus"),
        (
            parse_add("250").map(|_| ()),
            "add 250 is outside 0.00 to +4.00: did you mean +2.50?",
        ),
        (parse_add("+4.50").map(|_| ()), "add +4.50 is outside 0.00 to +4.00"),
        (parse_age("150").map(|_| ()), "age 150 is outside 1–110"),
        (parse_age("0").map(|_| ()), "age 0 is outside 1–110"),
        (parse_age("45.5").map(|_| ()), "age 45.5 must be whole years"),
        (parse_age("1000").map(|_| ()), "age 1000 is outside 1–110"),
    ];
    for (r, message) in cases {
        assert_eq!(err(r).to_string(), message);
    }
}

#[test]
fn constructors_reject_nonsense() {
    assert_eq!(
        err(Rx::new(f64::NAN, 0.0, 180)).to_string(),
        "sphere (not a number) is outside ±30 D"
    );
    assert_eq!(
        err(Rx::new(-2.0, -10.5, 180)).to_string(),
        "cylinder -10.50 is outside ±10 D"
    );
    assert_eq!(err(Rx::new(-2.0, -1.0, 181)).to_string(), "axis 181 is outside 1–180");
    assert_eq!(
        err(VertexDistance::from_mm(f64::INFINITY)).to_string(),
        "vertex distance (not a number) is outside 0–30 mm"
    );
    assert_eq!(
        err(ReadingDistance::from_cm(9.0)).to_string(),
        "reading distance 9 cm is outside 10–100 cm"
    );
    assert_eq!(err(Age::new(111)).to_string(), "age 111 is outside 1–110");
    assert_eq!(
        err(Add::new(f64::NAN)).to_string(),
        "add (not a number) is outside 0.00 to +4.00"
    );
}

#[test]
fn singular_move_is_an_error_not_infinity() {
    // 1 − δF = 0 at δ = 12 mm for F = 1000/12 D: the far point is at the new plane.
    let e = err(effective_power(1000.0 / 12.0, 0.012));
    assert_eq!(
        e.to_string(),
        "no finite lens: the far point of +83.33 lies at the new lens plane"
    );
    assert_eq!(e.field(), Field::Result);
    // Inside the input limits: +30.00 D at 30 mm moved to the cornea.
    let rx = Rx::sphere_only(30.0).unwrap();
    let e = err(compensate(
        &rx,
        VertexDistance::from_mm(30.0).unwrap(),
        VertexDistance::CORNEA,
    ));
    assert_eq!(
        e.to_string(),
        "no finite lens: the far point of +30.00 lies at the new lens plane"
    );
}

#[test]
fn settings_errors() {
    let bad = OrderSettings {
        toric: ToricSettings {
            cylinders: vec![],
            axis_step: 10,
        },
        ..OrderSettings::default()
    };
    assert_eq!(
        err(bad.validate()).to_string(),
        "setting: toric cylinders must be negative, down to -10.00 D"
    );
    // Each wrong toric cylinder on its own (common practice, no source: stock torics are minus
    // cylinders); the deepest allowed is the cylinder input limit, −10.00 D.
    let toric = |cylinders: Vec<f64>, axis_step: u16| ToricSettings { cylinders, axis_step };
    for c in [0.0, 0.75, f64::NAN, -10.25] {
        assert_eq!(
            err(toric(vec![-0.75, c], 10).validate()).to_string(),
            "setting: toric cylinders must be negative, down to -10.00 D",
            "{c}"
        );
    }
    assert!(toric(vec![-0.75, -10.0], 10).validate().is_ok());
    for step in [0, 7, 180] {
        assert_eq!(
            err(toric(vec![-0.75], step).validate()).to_string(),
            "setting: the toric axis step must divide 180",
            "{step}"
        );
    }
    assert!(toric(vec![-0.75], 90).validate().is_ok());
    let bad = Ladder {
        fine_limit: 6.1,
        ..Ladder::CONTACT_LENS
    };
    assert_eq!(
        err(bad.validate()).to_string(),
        "setting: the fine-step limit must be a whole number of fine steps within 0–30 D"
    );
    let bad = SubstituteSettings {
        max_ratio: 2.0,
        ..SubstituteSettings::default()
    };
    assert_eq!(
        err(bad.validate()).to_string(),
        "setting: substitute thresholds must be within 0–10 D and a ratio within 0–1"
    );
    assert_eq!(err(bad.validate()).field(), Field::Setting);
}

#[test]
fn for_field_reattributes() {
    let e = err(parse_vertex_mm("45")).for_field(Field::VertexTo);
    assert_eq!(e.field(), Field::VertexTo);
    assert_eq!(e.to_string(), "vertex distance 45 mm is outside 0–30 mm");
}
