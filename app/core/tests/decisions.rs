//! One test per decision the crate documents where the notes were silent
//! (crate docs, "Decisions where the notes were silent"). Expected figures
//! are [derived] by hand from the formulas in the notes unless labelled.

use lensplane_core::*;

fn mm(x: f64) -> VertexDistance {
    VertexDistance::from_mm(x).unwrap()
}

#[test]
fn d1_results_beyond_100_d_are_errors() {
    // +30 D moved 20 mm toward the eye: 30 / (1 − 0.6) = 75 D, kept.
    assert!((effective_power(30.0, 0.02).unwrap() - 75.0).abs() < 1e-9);
    // 25 mm: 30 / 0.25 = 120 D: error.
    assert!(effective_power(30.0, 0.025).is_err());
    // Far point between the old and new planes (sign flip): error.
    assert!(effective_power(40.0, 0.03).is_err());
    assert!(effective_power(-40.0, -0.03).is_err());
}

#[test]
fn d2_spherical_equivalent_after_compensating_meridians() {
    let rx = Rx::new(-8.0, -2.0, 180).unwrap();
    let ours = spherical_equivalent_at(&rx, VertexDistance::SPECTACLES, VertexDistance::CORNEA).unwrap();
    // [derived] (−7.2993 + −8.9286) / 2 = −8.1139
    assert!((ours - -8.11395).abs() < 1e-4);
    let other_order = compensate_power(-9.0, VertexDistance::SPECTACLES, VertexDistance::CORNEA).unwrap();
    let gap = (ours - other_order).abs();
    assert!(gap > 0.0 && gap < 0.01, "the two orders differ by {gap}");
}

#[test]
fn d3_display_rounding_and_notation() {
    assert_eq!(fmt_number(2.675), "2.68");
    assert_eq!(fmt_number(-2.675), "-2.68");
    assert_eq!(fmt_power(-0.004), "0.00");
    assert_eq!(fmt_power(0.005), "+0.01");
    // Never a misleading 0.00 for something that is not a number.
    assert_eq!(fmt_power(f64::NAN), "\u{2014}");
    assert_eq!(fmt_number(f64::INFINITY), "\u{2014}");
    assert_eq!(fmt_sphere(f64::NAN), "\u{2014}");
    assert_eq!(fmt_sphere(0.004), "plano");
    assert_eq!(
        PowerCross::new(-2.0, -2.004, 90).unwrap().to_rx().to_string(),
        "-2.00 DS"
    );
    assert_eq!(Rx::sphere_only(0.0).unwrap().to_string(), "plano");
    // Axes with three digits (common practice, no source): 5 cannot be misread as 50.
    assert_eq!(Rx::new(1.0, -0.25, 5).unwrap().to_string(), "+1.00 -0.25 ×005");
    assert_eq!(Rx::new(1.0, -0.25, 90).unwrap().to_string(), "+1.00 -0.25 ×090");
    // One minus style everywhere, figures and prose: the ASCII hyphen-minus.
    assert!(!Rx::new(-1.0, -0.25, 5).unwrap().to_string().contains('\u{2212}'));
    assert_eq!(
        parse_rx("2 -1 x 9").unwrap_err().to_string(),
        "sphere needs a sign: +2.00 or -2.00?"
    );
    assert_eq!(
        parse_rx("\u{2212}250").unwrap_err().to_string(),
        "sphere -250 is outside ±30 D: did you mean -2.50?"
    );
}

#[test]
fn d4_reports_round_per_meridian() {
    let r = vertex_report(&VertexInput {
        rx: Rx::new(-5.5, -2.25, 180).unwrap(),
        from: VertexDistance::SPECTACLES,
        to: VertexDistance::CORNEA,
        settings: OrderSettings::default(),
    })
    .unwrap();
    assert_eq!(r.ordered.ordered.to_string(), "-5.25 -1.75 ×180");
}

fn report_to_cornea(rx: Rx) -> VertexReport {
    vertex_report(&VertexInput {
        rx,
        from: VertexDistance::SPECTACLES,
        to: VertexDistance::CORNEA,
        settings: OrderSettings::default(),
    })
    .unwrap()
}

#[test]
fn d5_toric_offer_threshold_and_axis_ties() {
    // −0.62 cylinder at the cornea rounds to −0.50 (tie to smaller): no toric.
    // Spectacle −1.00 −0.62 ×180 → cornea cylinder ≈ −0.59.
    assert!(report_to_cornea(Rx::new(-1.0, -0.62, 180).unwrap()).toric.is_none());
    // −0.75 at the spectacle plane, low power: about −0.74 at the cornea → offered.
    let t = report_to_cornea(Rx::new(-1.0, -0.75, 180).unwrap())
        .toric
        .expect("toric offered");
    assert_eq!(t.ordered.cylinder(), -0.75);
    // Spectacle target: never a toric contact lens.
    let r = vertex_report(&VertexInput {
        rx: Rx::new(-1.0, -2.0, 180).unwrap(),
        from: mm(12.0),
        to: mm(14.0),
        settings: OrderSettings::default(),
    })
    .unwrap();
    assert!(r.toric.is_none());
    // Axis ties go up; 0 is 180.
    assert_eq!(round_axis(15, 10), 20);
    assert_eq!(round_axis(5, 10), 10);
    assert_eq!(round_axis(4, 10), 180);
    // Cylinder ties go to the smaller: exactly −1.00 between −0.75 and −1.25.
    let t = choose_toric(
        &Rx::new(-2.0, -1.0, 90).unwrap(),
        &ToricSettings::default(),
        &Ladder::CONTACT_LENS,
        TieRule::TowardPlus,
    )
    .unwrap()
    .unwrap();
    assert_eq!(t.ordered.cylinder(), -0.75);
    // Sphere keeps the SE: −2.50 − (−0.75/2) = −2.125 → tie toward plus → −2.00.
    assert_eq!(t.ordered.sphere(), -2.0);
    // The same choices whatever order the stock list is in.
    let reversed = ToricSettings {
        cylinders: vec![-2.25, -1.75, -1.25, -0.75],
        ..ToricSettings::default()
    };
    let cyl = |c: f64, settings: &ToricSettings| {
        choose_toric(
            &Rx::new(-2.0, c, 90).unwrap(),
            settings,
            &Ladder::CONTACT_LENS,
            TieRule::TowardPlus,
        )
        .unwrap()
        .unwrap()
    };
    for settings in [&ToricSettings::default(), &reversed] {
        assert_eq!(cyl(-1.0, settings).ordered.cylinder(), -0.75, "tie");
        assert_eq!(cyl(-1.1, settings).ordered.cylinder(), -1.25, "nearest");
        assert_eq!(cyl(-1.5, settings).ordered.cylinder(), -1.25, "tie");
    }
    // In the stock range up to a quarter dioptre past the largest stock cylinder (−2.25).
    assert!(cyl(-2.5, &ToricSettings::default()).within_range);
    assert!(!cyl(-2.75, &ToricSettings::default()).within_range);
}

#[test]
fn d6_substitute_verdicts() {
    let s = SubstituteSettings::default();
    // Both met.
    assert_eq!(
        assess_substitute(&Rx::new(-4.0, -0.75, 180).unwrap(), &s).verdict,
        Verdict::Suitable
    );
    // Both exactly at their limits (0.75 D; 0.50 : 2.00 = 1:4) still count as met.
    assert_eq!(
        assess_substitute(&Rx::new(-3.0, -0.75, 180).unwrap(), &s).verdict,
        Verdict::Suitable
    );
    assert_eq!(
        assess_substitute(&Rx::new(-2.0, -0.5, 180).unwrap(), &s).verdict,
        Verdict::Suitable
    );
    // Just past the ratio limit (0.50 : 1.75) is no longer suitable.
    assert_eq!(
        assess_substitute(&Rx::new(-1.75, -0.5, 180).unwrap(), &s).verdict,
        Verdict::Borderline
    );
    // Cylinder met, ratio not (0.50 : 1.00).
    let a = assess_substitute(&Rx::new(-1.0, -0.5, 180).unwrap(), &s);
    assert_eq!(a.verdict, Verdict::Borderline);
    assert_eq!(
        a.reason,
        "with-the-rule cylinder 0.50 D is within the 0.75 D limit, but cylinder:sphere 1:2 is over 1:4: a spherical lens may do; check acuity with it"
    );
    // Same 0.75 cylinder, oblique: lower limit (0.50) → only the ratio is met.
    let a = assess_substitute(&Rx::new(-4.0, -0.75, 45).unwrap(), &s);
    assert_eq!((a.verdict, a.cylinder_limit), (Verdict::Borderline, 0.5));
    // Against the rule (minus-cylinder axis 90).
    assert_eq!(
        Orientation::of(&Rx::new(-4.0, -0.75, 90).unwrap()),
        Some(Orientation::AgainstTheRule)
    );
    // Neither.
    assert_eq!(
        assess_substitute(&Rx::new(-2.0, -2.0, 180).unwrap(), &s).verdict,
        Verdict::Unsuitable
    );
    // Mixed astigmatism.
    let a = assess_substitute(&Rx::new(0.25, -0.75, 180).unwrap(), &s);
    assert!(a.mixed);
    assert_eq!(a.verdict, Verdict::Unsuitable);
    // A meridian within 0.125 D of zero is not "mixed".
    assert!(!assess_substitute(&Rx::new(0.12, -0.75, 180).unwrap(), &s).mixed);
}

fn near(rx: Rx, add: f64, target: VertexDistance, age: Option<u8>, measured: Measured) -> NearReport {
    near_report(&NearInput {
        rx,
        add: Add::new(add).unwrap(),
        spectacle_vertex: VertexDistance::SPECTACLES,
        reading: ReadingDistance::from_cm(40.0).unwrap(),
        measured,
        target,
        age: age.map(|a| Age::new(a).unwrap()),
        settings: OrderSettings::default(),
    })
    .unwrap()
}

#[test]
fn d7_near_summary_is_the_spherical_equivalent_and_ordered_near_adds_the_rounded_add() {
    let rx = Rx::new(-5.0, -2.0, 180).unwrap();
    let r = near(rx, 2.0, VertexDistance::CORNEA, None, Measured::FromLens);
    let se = near_figures(
        -6.0,
        2.0,
        &NearGeometry {
            spectacle_vertex: VertexDistance::SPECTACLES,
            target: VertexDistance::CORNEA,
            reading: ReadingDistance::from_cm(40.0).unwrap(),
            measured: Measured::FromLens,
        },
        None,
    )
    .unwrap();
    assert_eq!(r.add_at_target, se.add_at_target);
    assert_eq!(r.meridians.len(), 2);
    // Per-meridian adds differ for a cylinder.
    assert!((r.meridians[0].add_at_target - r.meridians[1].add_at_target).abs() > 0.01);
    let ordered = r.distance_at_target_ordered.meridians();
    let near_ordered = r.near_at_target_ordered.meridians();
    assert_eq!(
        near_ordered.first().power,
        ordered.first().power + r.add_at_target_rounded
    );
    assert_eq!(
        near_ordered.second().power,
        ordered.second().power + r.add_at_target_rounded
    );
}

#[test]
fn d8_tentative_add_sources_and_reliability() {
    let r = near(
        Rx::sphere_only(-1.0).unwrap(),
        1.5,
        VertexDistance::CORNEA,
        Some(50),
        Measured::FromLens,
    );
    let a = r.amplitude.unwrap();
    assert_eq!(a.tentative_from_minimum.half_reserve, 2.5 - 2.5 / 2.0);
    assert_eq!(a.tentative_from_average.half_reserve, 2.5 - 3.5 / 2.0);
    assert!(a.reliable);
    assert!(amplitude_reliable(Age::new(59).unwrap()));
    assert!(!amplitude_reliable(Age::new(60).unwrap()));
    assert!(amplitude_reliable(Age::new(10).unwrap()));
    assert!(!amplitude_reliable(Age::new(9).unwrap()));
}

#[test]
fn d9_typed_input_rules() {
    assert_eq!(
        parse_rx("-2.00 -1.00 90").unwrap().notices[0].kind,
        NoticeKind::BareAxis
    );
    assert_eq!(parse_rx("-2.00 -1.00 x90 ").unwrap().notices, vec![]);
    assert!(parse_reading_distance("19").is_err());
    assert_eq!(parse_reading_distance("20").unwrap().value.cm(), 20.0);
    // −25 is within ±30 D: accepted as typed (a warning follows in reports).
    assert_eq!(parse_rx("-25").unwrap().value.sphere(), -25.0);
    assert_eq!(
        rx_warnings(&Rx::sphere_only(-25.0).unwrap())[0].kind,
        WarningKind::HighPower
    );
}

#[test]
fn d10_add_limit() {
    assert!(Add::new(4.0).is_ok());
    assert!(Add::new(4.01).is_err());
    assert!(Add::new(0.0).is_ok());
}

#[test]
fn d11_reading_distance_from_the_eye() {
    let from_eye = near(
        Rx::sphere_only(-6.0).unwrap(),
        0.0,
        VertexDistance::CORNEA,
        None,
        Measured::FromEye,
    );
    // [derived] 40 cm from the eye = 38.8 cm from a lens at 12 mm; with a
    // contact lens the accommodation is then exactly 1/0.40 = 2.50 D.
    assert!((from_eye.equivalent.accommodation_target - 2.5).abs() < 1e-12);
    let from_lens = near(
        Rx::sphere_only(-6.0).unwrap(),
        0.0,
        VertexDistance::CORNEA,
        None,
        Measured::FromLens,
    );
    // The notes: about 0.07 D difference at 40 cm.
    let gap = from_eye.equivalent.accommodation_target - from_lens.equivalent.accommodation_target;
    assert!((gap - 0.0728).abs() < 1e-3, "gap {gap}");
}

#[test]
fn d12_measure_vertex_warning_states_the_sensitivity() {
    let w = vertex_warnings(
        &Rx::sphere_only(12.0).unwrap(),
        VertexDistance::SPECTACLES,
        VertexDistance::CORNEA,
    );
    let m = w.iter().find(|w| w.kind == WarningKind::MeasureVertex).unwrap();
    // [derived] +12.00 at 12 mm → +14.0187; at 14 mm → +14.4231; 0.40 D
    // (the notes: 2 mm error at +12 D ≈ 0.4 D).
    assert_eq!(
        m.message,
        "+12.00 is beyond ±4 D: measure the vertex distance (2 mm changes this by 0.40 D)"
    );
    assert_eq!(m.field, Field::VertexFrom);
}

#[test]
fn d13_results_may_exceed_the_input_limits_and_are_not_typed_back() {
    // [derived] +20.00 at 20 mm moved to the cornea: 20 / 0.6 = +33.33.
    let cl = compensate(&Rx::sphere_only(20.0).unwrap(), mm(20.0), VertexDistance::CORNEA).unwrap();
    assert_eq!(cl.to_string(), "+33.33 DS");
    assert_eq!(
        parse_rx(&cl.to_string()).unwrap_err().to_string(),
        "sphere +33.33 is outside ±30 D"
    );
}
