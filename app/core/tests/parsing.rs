//! Every accepted form in the notes' input table (section 9), with the
//! value read and the notices given. Inputs are scenarios we invent.

use lensplane_core::*;

#[track_caller]
fn reads(text: &str, shown: &str) -> Vec<NoticeKind> {
    let p = parse_rx(text).unwrap_or_else(|e| panic!("{text:?} should parse, got {e}"));
    assert_eq!(p.value.to_string(), shown, "for {text:?}");
    p.notices.iter().map(|n| n.kind).collect()
}

#[test]
fn minus_look_alikes_are_minus_and_echoed() {
    for text in ["\u{2212}6.00", "\u{2013}6", "\u{FF0D}6", "\u{2014}6.00", "-6"] {
        let kinds = reads(text, "-6.00 DS");
        assert_eq!(kinds.contains(&NoticeKind::MinusRead), text != "-6", "for {text:?}");
    }
    let p = parse_rx("\u{2212}6.00").unwrap();
    assert_eq!(p.notices[0].message, "read the dash as a minus: -6.00");
}

#[test]
fn comma_decimals() {
    assert_eq!(reads("-2,50", "-2.50 DS"), vec![NoticeKind::CommaDecimal]);
    reads("-2,50 -0,75 x 90", "-2.50 -0.75 ×090");
    reads("-2.00, -1.00, 180", "-2.00 -1.00 ×180");
}

#[test]
fn plano_forms() {
    for text in ["pl", "plano", "PLANO", "0", "±0.00", "0.00", "+0.00", "-0.00", "pl DS"] {
        reads(text, "plano");
    }
    reads("pl -0.50 x 90", "plano -0.50 ×090");
    reads("0.00 -0.50 x 90", "plano -0.50 ×090");
}

#[test]
fn spherical_markers() {
    for text in [
        "-3.75 DS",
        "-3.75 sph",
        "-3.75 D.S.",
        "-3.75D",
        "-3.75 ds",
        "-3.75 d",
        "sph -3.75",
    ] {
        reads(text, "-3.75 DS");
    }
}

#[test]
fn axis_markers() {
    for text in [
        "-2.00 -1.00 x180",
        "-2.00 -1.00 X 180",
        "-2.00 -1.00 ×180",
        "-2.00 -1.00 @180",
        "-2.00 -1.00 ax 180",
        "-2.00 -1.00 axis 180",
        "-2.00 -1.00 180°",
        "-2.00/-1.00x180",
        "-2.00 / -1.00 x 180",
        "-2.00D -1.00DC x180",
        "sph -2.00 cyl -1.00 ax 180",
    ] {
        assert!(
            reads(text, "-2.00 -1.00 ×180").is_empty(),
            "no notice expected for {text:?}"
        );
    }
    reads("+1.50 -0.75 x005", "+1.50 -0.75 ×005");
    reads("+1.50 -0.75 x 5", "+1.50 -0.75 ×005");
}

#[test]
fn bare_third_number_is_the_axis_with_a_notice() {
    assert_eq!(reads("-2.00 -1.00 180", "-2.00 -1.00 ×180"), vec![NoticeKind::BareAxis]);
}

#[test]
fn axis_zero_is_stored_as_180_and_said() {
    for text in ["-1.00 -0.50 x0", "-1.00 -0.50 x000", "-1.00 -0.50 @ 0"] {
        assert_eq!(
            reads(text, "-1.00 -0.50 ×180"),
            vec![NoticeKind::AxisZero],
            "for {text:?}"
        );
    }
}

#[test]
fn off_step_is_accepted_with_the_rounded_value() {
    let p = parse_rx("-2.30 -0.80 x 12").unwrap();
    assert_eq!(p.value.to_string(), "-2.30 -0.80 ×012");
    let msgs: Vec<_> = p.notices.iter().map(|n| n.message.as_str()).collect();
    assert_eq!(
        msgs,
        [
            "sphere -2.30 is between quarter steps; nearest -2.25",
            "cylinder -0.80 is between quarter steps; nearest -0.75"
        ]
    );
}

#[test]
fn plus_cylinder_form_is_kept() {
    reads("-3.00 +1.00 x 90", "-3.00 +1.00 ×090");
}

#[test]
fn zero_cylinder_needs_no_axis_and_ignores_one() {
    reads("-2.00 0.00", "-2.00 DS");
    assert_eq!(reads("-2.00 -0.00 x 90", "-2.00 DS"), vec![NoticeKind::AxisIgnored]);
}

#[test]
fn fullwidth_input_from_an_ime() {
    reads(
        "\u{FF0D}\u{FF12}\u{FF0E}\u{FF10}\u{FF10} \u{FF0D}\u{FF11} \u{D7}\u{FF19}\u{FF10}",
        "-2.00 -1.00 ×090",
    );
}

#[test]
fn three_field_entry() {
    let p = Rx::from_fields(" -8.00 ", "-2", "x180").unwrap();
    assert_eq!(p.value, Rx::new(-8.0, -2.0, 180).unwrap());
    let p = Rx::from_fields("+6", "", "").unwrap();
    assert_eq!(p.value.to_string(), "+6.00 DS");
    let p = Rx::from_fields("pl", "+0.50", "90°").unwrap();
    assert_eq!(p.value.to_string(), "plano +0.50 ×090");
    let p = Rx::from_fields("-1", "-0.5", "0").unwrap();
    assert_eq!(p.value.axis(), 180);
    assert_eq!(p.notices[0].kind, NoticeKind::AxisZero);
    assert_eq!(parse_axis_field("@ 45").unwrap().value, Some(45));
    assert_eq!(parse_cylinder_field("DS").unwrap().value, 0.0);
}

#[test]
fn vertex_reading_add_age() {
    assert_eq!(parse_vertex_mm("12 mm").unwrap().value.mm(), 12.0);
    assert_eq!(parse_vertex_mm("0").unwrap().value, VertexDistance::CORNEA);
    let p = parse_vertex_mm("1.2 cm").unwrap();
    assert_eq!(p.value.mm(), 12.0);
    assert_eq!(p.notices[0].message, "1.2 cm read as 12 mm");
    assert_eq!(parse_vertex_mm("0.014 m").unwrap().value.mm(), 14.0);
    assert_eq!(parse_vertex_mm("13,5").unwrap().value.mm(), 13.5);

    assert_eq!(parse_reading_distance("40").unwrap().value.cm(), 40.0);
    assert_eq!(parse_reading_distance("33 cm").unwrap().value.cm(), 33.0);
    assert_eq!(parse_reading_distance("0.4 m").unwrap().value.cm(), 40.0);
    assert_eq!(parse_reading_distance("16\"").unwrap().value.cm(), 16.0 * 2.54);
    assert_eq!(parse_reading_distance("14 inches").unwrap().value.cm(), 14.0 * 2.54);

    assert_eq!(parse_add("+2.50").unwrap().value.dioptres(), 2.5);
    assert_eq!(parse_add("add 1,75").unwrap().value.dioptres(), 1.75);
    assert_eq!(parse_add("2 D").unwrap().value.dioptres(), 2.0);
    assert_eq!(parse_add("2.1").unwrap().notices[0].kind, NoticeKind::OffStep);

    assert_eq!(parse_age("50 years").unwrap().value.years(), 50);
    assert_eq!(parse_age("7 y").unwrap().value.years(), 7);
}
