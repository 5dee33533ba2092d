//! Over-refraction: check values O1–O4 of the project's optics notes
//! (section 12) with their provenance labels, the "left add, right
//! subtract" rule, warnings and exact error text, property tests, and an
//! independent cross-check with nalgebra's symmetric eigen-decomposition.
//!
//! Provenance labels: [textbook] = Keating, Geometric, Physical and Visual
//! Optics (2nd ed.) and Harris's dioptric power matrices, method as taught;
//! [derived] = worked here from the vergence chain, no printed example;
//! [common practice] = a trade fact with no single source.

use lensplane_core::*;
use nalgebra::{Matrix2, SymmetricEigen};
use proptest::prelude::*;

const TOL: f64 = 5e-5; // the notes give 4 decimal places

fn mm(x: f64) -> VertexDistance {
    VertexDistance::from_mm(x).unwrap()
}

fn rx(s: f64, c: f64, a: u16) -> Rx {
    Rx::new(s, c, a).unwrap()
}

fn input(worn: Rx, worn_at: f64, or: Rx, at: f64, to: f64) -> OverRefractionInput {
    OverRefractionInput {
        worn,
        worn_at: mm(worn_at),
        over_refraction: or,
        over_refraction_at: mm(at),
        target: mm(to),
        rotation: Rotation::NONE,
        unstable: false,
        rigid: false,
        settings: OrderSettings::default(),
    }
}

fn report(i: &OverRefractionInput) -> OverRefractionReport {
    over_refraction_report(i).unwrap()
}

#[track_caller]
fn close(actual: f64, expected: f64, what: &str) {
    assert!(
        (actual - expected).abs() < TOL,
        "{what}: got {actual:.6}, expected {expected}"
    );
}

fn kinds(r: &OverRefractionReport) -> Vec<WarningKind> {
    r.warnings.iter().map(|w| w.kind).collect()
}

#[test]
fn o1_crossed_cylinders_at_one_plane_cancel() {
    // O1 [derived]: -1.00 -0.50 ×180 spectacles at 12 mm, over-refraction
    // +0.25 -0.50 ×090 at 12 mm, target 12 mm → -1.25 DS (cylinders cancel).
    let r = report(&input(rx(-1.0, -0.5, 180), 12.0, rx(0.25, -0.5, 90), 12.0, 12.0));
    close(r.exact.sphere(), -1.25, "O1 sphere");
    close(r.exact.cylinder(), 0.0, "O1 cylinder");
    assert_eq!(r.exact.to_string(), "-1.25 DS");
    // The trap [textbook]: sphere + sphere and cylinder + cylinder would give -0.75 -1.00.
    assert!((r.exact.sphere() - -0.75).abs() > 0.4 && (r.exact.cylinder() - -1.0).abs() > 0.9);
    assert_eq!(r.recommendation.order.lens.to_string(), "-1.25 DS");
    assert!(
        r.reason.starts_with(
            "the over-refraction was found at the plane of the spectacle lens at 12 mm: the two add as power matrices"
        ),
        "{}",
        r.reason
    );
    // What changed [derived]: -0.25 in the 180 meridian (-1.00 → -1.25), +0.25 in the 090 (-1.50 → -1.25).
    let m = r.change.meridians;
    assert_eq!((m.first().axis, m.second().axis), (180, 90));
    close(m.first().power, -0.25, "O1 change 180");
    close(m.second().power, 0.25, "O1 change 090");
    close(r.change.vector.m, 0.0, "O1 change M");
    close(r.change.astigmatic, 0.5, "O1 astigmatic change");
    assert_eq!(
        r.change.words,
        "against the worn lens at 12 mm: -0.25 in the 180 meridian, +0.25 in the 090 meridian; spherical equivalent 0.00 (+ means more plus)"
    );
}

#[test]
fn o2_contact_lens_with_an_over_refraction_at_12_mm() {
    // O2 [derived]: -5.00 -0.75 ×090 contact lens, over-refraction
    // -0.75 -0.50 ×180 at 12 mm, target the cornea → -6.2315 -0.2618 ×090.
    let r = report(&input(rx(-5.0, -0.75, 90), 0.0, rx(-0.75, -0.5, 180), 12.0, 0.0));
    close(r.exact.sphere(), -6.2315, "O2 sphere");
    close(r.exact.cylinder(), -0.2618, "O2 cylinder");
    assert_eq!(r.exact.axis(), 90);
    close(r.exact_axis, 90.0, "O2 exact axis");
    assert_eq!(r.exact_plus_cyl.to_string(), "-6.49 +0.26 ×180");
    // The ocular refraction is the lens at the cornea here.
    assert_eq!(r.ocular_refraction, r.exact);
    // The over-refraction at the cornea [textbook vertex]: -0.75 → -0.7433, -1.25 → -1.2315.
    let p = r.over_refraction_at_worn.meridians();
    close(p.first().power, -0.7433, "O2 OR 180 at the cornea");
    close(p.second().power, -1.2315, "O2 OR 090 at the cornea");
    // [common practice] -0.26 is below the smallest stock toric (-0.75): the spherical
    // equivalent -6.3624, on 0.50 D steps beyond 6.00 → -6.50.
    assert_eq!(r.recommendation.order.kind, LensKind::SphericalContactLens);
    assert_eq!(r.recommendation.order.lens.to_string(), "-6.50 DS");
}

#[test]
fn o3_a_rotated_toric_with_a_plano_over_refraction_is_reordered_as_it_was() {
    // O3 [common practice]: -2.00 -1.00 ×180 contact lens turned 10° clockwise
    // (to the examiner's left), plano over-refraction → order -2.00 -1.00 ×180:
    // the lens works as it sits.
    let mut i = input(rx(-2.0, -1.0, 180), 0.0, Rx::sphere_only(0.0).unwrap(), 12.0, 0.0);
    i.rotation = Rotation::new(10, RotationDirection::ExaminersLeft).unwrap();
    let r = report(&i);
    assert_eq!(r.rotation_handling, RotationHandling::Compensated);
    // LARS: it sits at nominal − clockwise rotation = 170.
    assert_eq!(r.worn_on_eye.to_string(), "-2.00 -1.00 ×170");
    assert_eq!(r.needed_at_target.to_string(), "-2.00 -1.00 ×170");
    close(r.exact.sphere(), -2.0, "O3 sphere");
    close(r.exact.cylinder(), -1.0, "O3 cylinder");
    assert_eq!(r.exact.axis(), 180);
    close(r.exact_axis, 180.0, "O3 exact axis");
    assert_eq!(
        r.change.words,
        "no change from the worn lens at the cornea at two decimals"
    );
    assert!(
        r.reason
            .ends_with("left add: the lens settles 10° to the examiner's left, so its axis is ordered 10° more"),
        "{}",
        r.reason
    );
}

#[test]
fn o4_spectacles_and_over_refraction_to_the_cornea() {
    // O4 [derived]: -7.00 -1.50 ×170 spectacles at 12 mm, over-refraction
    // -0.50 -0.25 ×080 at 12 mm, target the cornea → -7.0906 -1.0322 ×170.
    let r = report(&input(rx(-7.0, -1.5, 170), 12.0, rx(-0.5, -0.25, 80), 12.0, 0.0));
    close(r.exact.sphere(), -7.0906, "O4 sphere");
    close(r.exact.cylinder(), -1.0322, "O4 cylinder");
    assert_eq!(r.exact.axis(), 170);
    // At the spectacle plane [derived]: -7.75 -1.25 ×170.
    close(r.combined_at_worn.sphere(), -7.75, "O4 sum sphere");
    close(r.combined_at_worn.cylinder(), -1.25, "O4 sum cylinder");
    // [common practice] stock toric: nearest cylinder -1.25, axis 170, sphere keeps the SE → -7.00.
    assert_eq!(r.recommendation.order.kind, LensKind::StockToric);
    assert_eq!(r.recommendation.order.lens.to_string(), "-7.00 -1.25 ×170");
    // A meridian beyond ±4 D moved 12 mm: measure the vertex distance.
    assert!(kinds(&r).contains(&WarningKind::MeasureVertex));
}

#[test]
fn obliquely_crossed_cylinders_give_a_new_axis() {
    // [derived] -3.00 -1.00 ×030 with +0.25 -0.75 ×075 at one plane:
    // M = -3.875, J0 = 0.1875, J45 = 0.5950 → -3.00 -1.25 ×048.43.
    let r = report(&input(rx(-3.0, -1.0, 30), 12.0, rx(0.25, -0.75, 75), 12.0, 12.0));
    close(r.exact.sphere(), -3.0, "sphere");
    close(r.exact.cylinder(), -1.25, "cylinder");
    close(r.exact_axis, 48.4349, "exact axis");
    assert_eq!(r.exact.axis(), 48);
    assert_eq!(r.recommendation.order.lens.to_string(), "-3.00 -1.25 ×048");
}

/// An over-refraction that turns a lens at `sits` into one at 180 (same
/// -1.00 cylinder), worked by hand [derived]: the difference of two equal
/// cylinders 10° apart is a crossed cylinder of 2·sin 10° at 45° to their
/// mean axis, sphere +sin 10° in minus-cylinder form.
fn residual_for_rotation(axis: u16) -> Rx {
    let s = 10f64.to_radians().sin();
    Rx::new(s, -2.0 * s, axis).unwrap()
}

#[test]
fn lars_left_add_right_subtract() {
    // The eye needs -2.00 -1.00 ×180 at the cornea; the worn lens of that
    // power turned 10° and the over-refraction (at the cornea) shows the
    // residual. [common practice] Left add: ordered ×180 + 10 = ×010.
    let mut i = input(rx(-2.0, -1.0, 180), 0.0, residual_for_rotation(40), 0.0, 0.0);
    i.rotation = Rotation::from_clockwise(10).unwrap();
    let r = report(&i);
    close(r.needed_at_target.sphere(), -2.0, "left: needed sphere");
    close(r.needed_at_target.cylinder(), -1.0, "left: needed cylinder");
    assert!(
        axis_gap(r.needed_axis_exact, 180.0) < TOL,
        "left: needed axis {}",
        r.needed_axis_exact
    );
    assert_eq!(r.exact.to_string(), "-2.00 -1.00 ×010");
    close(r.exact_axis, 10.0, "left: ordered axis");
    // Right subtract: turned 10° the other way, ordered ×180 − 10 = ×170.
    let mut i = input(rx(-2.0, -1.0, 180), 0.0, residual_for_rotation(140), 0.0, 0.0);
    i.rotation = Rotation::from_clockwise(-10).unwrap();
    let r = report(&i);
    assert_eq!(r.worn_on_eye.to_string(), "-2.00 -1.00 ×010");
    assert!(
        axis_gap(r.needed_axis_exact, 180.0) < TOL,
        "right: needed axis {}",
        r.needed_axis_exact
    );
    assert_eq!(r.exact.to_string(), "-2.00 -1.00 ×170");
    assert!(r.reason.contains("right subtract"), "{}", r.reason);
}

#[test]
fn the_rotation_correction_reaches_what_is_ordered_on_the_toric_step() {
    // [common practice] A -2.00 -1.25 ×170 toric turned 20° to the examiner's left
    // with a plano over-refraction: it works at ×150 on the eye, so the same
    // lens is ordered, ×170 as labelled — and on the 10° toric axis step the
    // order keeps ×170 (the eye-frame axis 150 would have been ordered wrongly).
    let mut i = input(rx(-2.0, -1.25, 170), 0.0, Rx::sphere_only(0.0).unwrap(), 12.0, 0.0);
    i.rotation = Rotation::from_clockwise(20).unwrap();
    let r = report(&i);
    assert_eq!(r.needed_at_target.axis(), 150);
    assert_eq!(r.recommendation.order.kind, LensKind::StockToric);
    assert_eq!(r.recommendation.order.lens.to_string(), "-2.00 -1.25 ×170");
    // An axis off the step: need ×180 at the cornea with a lens that turns 15°
    // to the left → ×015 as labelled → ×020 on the 10° step (half steps up).
    // A worn ×015 turned 15° to the left sits at ×180 and, with a plano
    // over-refraction, is what the eye needs.
    let mut i = input(rx(-2.0, -1.25, 15), 0.0, Rx::sphere_only(0.0).unwrap(), 12.0, 0.0);
    i.rotation = Rotation::from_clockwise(15).unwrap();
    let r = report(&i);
    assert_eq!(r.needed_at_target.axis(), 180);
    assert_eq!(r.exact.axis(), 15);
    assert_eq!(r.recommendation.order.lens.axis(), 20);
    // What the ordered lens leaves is the same on the eye (both turn 15°):
    // the ordered lens turned back, against the need in the eye's frame.
    let ordered = r.recommendation.order.lens;
    let on_eye = worn_on_eye(&ordered, i.rotation).to_rx();
    let left_on_eye = on_eye.power_vector().minus(&r.needed_at_target.power_vector());
    assert!((left_on_eye.cylinder_size() - r.recommendation.order.leaves.cylinder).abs() < 1e-9);
    assert!((left_on_eye.m - r.recommendation.order.leaves.spherical_equivalent).abs() < 1e-9);
}

#[test]
fn a_rotated_contact_lens_replaced_by_spectacles_is_taken_as_it_sits() {
    // -2.00 -1.00 ×180 contact lens turned 10° left, plano over-refraction,
    // spectacles at 12 mm: the lens acts at ×170; a spectacle lens does not
    // turn. [textbook vertex, derived] -2 / (1 − 0.024) = -2.0492,
    // -3 / (1 − 0.036) = -3.1120 → -2.0492 -1.0629 ×170.
    let mut i = input(rx(-2.0, -1.0, 180), 0.0, Rx::sphere_only(0.0).unwrap(), 12.0, 12.0);
    i.rotation = Rotation::from_clockwise(10).unwrap();
    let r = report(&i);
    assert_eq!(r.rotation_handling, RotationHandling::PlacedOnly);
    close(r.exact.sphere(), -2.0492, "sphere");
    close(r.exact.cylinder(), -1.0629, "cylinder");
    assert_eq!(r.exact.axis(), 170);
    assert_eq!(r.recommendation.order.lens.to_string(), "-2.00 -1.00 ×170");
    assert!(
        r.reason.ends_with("; the worn lens was taken as it sits, turned 10° to the examiner's left (clockwise as seen facing the patient), and a spectacle lens does not turn"),
        "{}",
        r.reason
    );
    // What changed is reported on its own: no "below a quarter step" vertex warning.
    assert!(!kinds(&r).contains(&WarningKind::BelowQuarterStep));
}

#[test]
fn rotation_for_spectacles_or_a_spherical_lens_is_not_used() {
    let mut i = input(rx(-2.0, -1.0, 180), 12.0, Rx::sphere_only(0.0).unwrap(), 12.0, 12.0);
    i.rotation = Rotation::from_clockwise(10).unwrap();
    let r = report(&i);
    assert_eq!(r.rotation_handling, RotationHandling::Ignored);
    assert_eq!(r.exact.to_string(), "-2.00 -1.00 ×180");
    let w = r
        .warnings
        .iter()
        .find(|w| w.kind == WarningKind::RotationIgnored)
        .unwrap();
    assert_eq!(w.field, Field::Rotation);
    assert_eq!(
        w.message,
        "a rotation applies only to a toric contact lens, not to spectacles: not used"
    );
    let mut i = input(
        Rx::sphere_only(-3.0).unwrap(),
        0.0,
        Rx::sphere_only(0.0).unwrap(),
        12.0,
        0.0,
    );
    i.rotation = Rotation::from_clockwise(-20).unwrap();
    let r = report(&i);
    assert_eq!(r.rotation_handling, RotationHandling::Ignored);
    assert_eq!(
        r.warnings[0].message,
        "the worn lens has no cylinder, so its rotation changes nothing: not used"
    );
}

#[test]
fn warnings_refit_and_check_the_fit() {
    // Rotation above 30° and an unstable lens [common practice]: a refit is usually better.
    let mut i = input(rx(-2.0, -1.0, 180), 0.0, Rx::sphere_only(0.0).unwrap(), 12.0, 0.0);
    i.rotation = Rotation::new(35, RotationDirection::ExaminersRight).unwrap();
    i.unstable = true;
    let r = report(&i);
    let msgs: Vec<_> = r
        .warnings
        .iter()
        .map(|w| (w.kind, w.field, w.message.as_str()))
        .collect();
    assert!(msgs.contains(&(
        WarningKind::RotationLarge,
        Field::Rotation,
        "a rotation of 35° is above 30°: a refit is usually better than compensating"
    )));
    assert!(msgs.contains(&(
        WarningKind::RotationUnstable,
        Field::Rotation,
        "the lens is described as unstable: a refit is usually better than compensating its rotation"
    )));
    // 30° exactly: no refit warning.
    i.rotation = Rotation::from_clockwise(30).unwrap();
    i.unstable = false;
    assert!(!kinds(&report(&i)).contains(&WarningKind::RotationLarge));
    // More cylinder over the lens than in it, and a meridian beyond ±4 D.
    let r = report(&input(rx(-2.0, -0.75, 180), 0.0, rx(-3.5, -1.0, 90), 12.0, 0.0));
    let msgs: Vec<_> = r
        .warnings
        .iter()
        .map(|w| (w.kind, w.field, w.message.as_str()))
        .collect();
    assert!(msgs.contains(&(
        WarningKind::OverRefractionCylinder,
        Field::OverRefraction,
        "the over-refraction has more cylinder (-1.00) than the worn lens (-0.75): check the fit and the refraction"
    )));
    assert!(msgs.contains(&(
        WarningKind::OverRefractionHigh,
        Field::OverRefraction,
        "an over-refraction meridian of -4.50 is beyond ±4 D: check the fit and the refraction"
    )));
    // Equal cylinders, ±4.00 exactly: neither.
    let r = report(&input(rx(-2.0, -1.0, 180), 0.0, rx(-3.0, -1.0, 90), 12.0, 0.0));
    assert!(!kinds(&r).contains(&WarningKind::OverRefractionCylinder));
    assert!(!kinds(&r).contains(&WarningKind::OverRefractionHigh));
    // Over a spherical lens any cylinder is more than none.
    let r = report(&input(
        Rx::sphere_only(-2.0).unwrap(),
        0.0,
        rx(0.0, -0.5, 90),
        12.0,
        0.0,
    ));
    assert!(r.warnings.iter().any(|w| {
        w.message
        == "the over-refraction has more cylinder (-0.50) than the worn lens (none): check the fit and the refraction"
    }));
}

#[test]
fn errors_rigid_lens_and_an_over_refraction_behind_the_spectacles() {
    let mut i = input(rx(-2.0, -1.0, 180), 0.0, Rx::sphere_only(-0.5).unwrap(), 12.0, 0.0);
    i.rigid = true;
    let e = over_refraction_report(&i).unwrap_err();
    assert_eq!(
        e.to_string(),
        "rigid lens: this thin-lens model leaves out the tear lens, so it computes no order"
    );
    assert_eq!(e.field(), Field::LensType);
    let e = over_refraction_report(&input(
        rx(-2.0, -1.0, 180),
        14.0,
        Rx::sphere_only(-0.5).unwrap(),
        12.0,
        14.0,
    ))
    .unwrap_err();
    assert_eq!(
        e.to_string(),
        "vertex distance 12 mm puts the over-refraction behind the worn lens at 14 mm"
    );
    assert_eq!(e.field(), Field::OverRefractionVertex);
    // No finite lens: +25.00 worn at 30 mm brought to the cornea (25 / 0.25 = 100, +0.25 more is beyond).
    let e = over_refraction_report(&input(
        Rx::sphere_only(25.0).unwrap(),
        30.0,
        Rx::sphere_only(0.25).unwrap(),
        30.0,
        0.0,
    ))
    .unwrap_err();
    assert_eq!(
        e.to_string(),
        "no finite lens: the far point of +25.25 lies at the new lens plane"
    );
}

#[test]
fn rotation_parsing_and_words() {
    // Links carry signed whole degrees, positive to the examiner's left.
    assert_eq!(parse_rotation("+10").unwrap().value.clockwise(), 10);
    assert_eq!(
        parse_rotation("\u{2212}10").unwrap().value.direction(),
        Some(RotationDirection::ExaminersRight)
    );
    assert_eq!(parse_rotation("90").unwrap().value.amount(), 90);
    for (text, message) in [
        ("91", "rotation 91° is outside 0–90"),
        ("-1000", "rotation 1000° is outside 0–90"),
        ("10.5", "rotation 10.5 must be a whole number of degrees"),
        ("10 left", "unexpected \"left\""),
        ("±10", "unexpected \"±10\""),
    ] {
        let e = parse_rotation(text).unwrap_err();
        assert_eq!(e.to_string(), message, "{text}");
        assert_eq!(e.field(), Field::Rotation);
    }
    // The form: the amount without a sign, the direction chosen apart.
    let r = parse_rotation_amount("15°", RotationDirection::ExaminersRight)
        .unwrap()
        .value;
    assert_eq!(r.link_text(), "-15");
    assert_eq!(
        r.words(),
        "15° to the examiner's right (anticlockwise as seen facing the patient)"
    );
    assert!(parse_rotation_amount("", RotationDirection::ExaminersLeft)
        .unwrap()
        .value
        .is_none());
    assert_eq!(
        parse_rotation_amount("+5", RotationDirection::ExaminersLeft)
            .unwrap_err()
            .to_string(),
        "rotation takes no sign: give the amount and choose left or right"
    );
    // The limits as words come from the Limit constants.
    assert_eq!(limits::ROTATION.to_string(), "0–90");
    assert_eq!(limits::ROTATION_WARN.to_string(), "30");
    assert_eq!(limits::OVER_REFRACTION_WARN.to_string(), "±4 D");
}

#[test]
fn standing_cautions_of_the_page() {
    let kinds: Vec<_> = cautions_for(Calculation::OverRefraction).map(|c| c.kind).collect();
    for k in [
        CautionKind::StartingPoint,
        CautionKind::ConfirmSettled,
        CautionKind::StableRotation,
        CautionKind::OverRefractionModel,
        CautionKind::MeasureVertex,
        CautionKind::ScreeningRefer,
    ] {
        assert!(kinds.contains(&k), "{k:?}");
    }
    // The general thin-lens caution says "no toric rotation", which this page handles as entered.
    assert!(!kinds.contains(&CautionKind::ThinLens));
    assert!(!cautions_for(Calculation::Vertex).any(|c| c.kind == CautionKind::StableRotation));
}

#[test]
fn d14_the_chain_passes_the_cornea_even_when_the_target_is_the_worn_plane() {
    // Decision 14: +30.00 +10.00 ×180 worn at 20 mm has a +40.00 meridian whose ocular
    // refraction, 40 / (1 − 0.8) = 200 D, is beyond ±100 D [derived]: an error, not a number.
    let e = over_refraction_report(&input(
        rx(30.0, 10.0, 180),
        20.0,
        Rx::sphere_only(0.0).unwrap(),
        20.0,
        20.0,
    ))
    .unwrap_err();
    assert_eq!(
        e.to_string(),
        "no finite lens: the far point of +40.00 lies at the new lens plane"
    );
    assert_eq!(e.field(), Field::Result);
}

#[test]
fn d18_back_from_a_matrix() {
    // Decision 18: half degrees round up, 0 is 180, a cylinder under 1e-9 D is none.
    let p = |axis| PrincipalPowers {
        most_plus: -1.0,
        most_minus: -2.0,
        axis,
    };
    assert_eq!(
        (
            p(172.5).whole_axis(),
            p(172.4).whole_axis(),
            p(0.49).whole_axis(),
            p(180.0).whole_axis()
        ),
        (173, 172, 180, 180)
    );
    let tiny = PowerMatrix::new(-2.0, 1e-10, -2.0).unwrap().to_rx();
    assert_eq!((tiny.cylinder(), tiny.axis()), (0.0, 180));
    assert_eq!(tiny.to_string(), "-2.00 DS");
}

// ---------------------------------------------------------------- properties

fn sphere() -> impl Strategy<Value = f64> {
    -30.0..=30.0f64
}
fn cylinder() -> impl Strategy<Value = f64> {
    -10.0..=10.0f64
}
fn any_rx() -> impl Strategy<Value = Rx> {
    (sphere(), cylinder(), 1u16..=180).prop_map(|(s, c, a)| Rx::new(s, c, a).unwrap())
}
/// Over-refractions as found clinically (and a little beyond).
fn or_rx() -> impl Strategy<Value = Rx> {
    (-6.0..=6.0f64, -4.0..=4.0f64, 1u16..=180).prop_map(|(s, c, a)| Rx::new(s, c, a).unwrap())
}
fn worn_plane() -> impl Strategy<Value = f64> {
    prop_oneof![Just(0.0), 8.0..=20.0f64]
}
fn plane() -> impl Strategy<Value = f64> {
    prop_oneof![Just(0.0), 0.0..=30.0f64]
}
fn rotation() -> impl Strategy<Value = Rotation> {
    (-90i16..=90).prop_map(|r| Rotation::from_clockwise(r).unwrap())
}

/// Power vector of the exact result: sphere, cylinder and the exact axis.
fn exact_vector(s: f64, c: f64, axis_deg: f64) -> PowerVector {
    let a = (2.0 * axis_deg).to_radians();
    PowerVector {
        m: s + c / 2.0,
        j0: -(c / 2.0) * a.cos(),
        j45: -(c / 2.0) * a.sin(),
    }
}

fn vectors_agree(a: &PowerVector, b: &PowerVector, tol: f64) -> bool {
    (a.m - b.m).abs() <= tol && (a.j0 - b.j0).abs() <= tol && (a.j45 - b.j45).abs() <= tol
}

fn no_nan_or_infinity(debug: &str) -> bool {
    !debug.contains("NaN") && !debug.contains("inf,") && !debug.contains("inf }") && !debug.contains("inf)")
}

/// The notes' formula, built with nalgebra: F = [[S + C sin²α, −C sinα cosα], [−C sinα cosα, S + C cos²α]].
fn na_matrix(rx: &Rx) -> Matrix2<f64> {
    let a = f64::from(rx.axis()).to_radians();
    let (s, c) = (rx.sphere(), rx.cylinder());
    let off = -c * a.sin() * a.cos();
    Matrix2::new(s + c * a.sin().powi(2), off, off, s + c * a.cos().powi(2))
}

/// L·(I − dL)⁻¹ with nalgebra's general inverse.
fn na_moved(l: Matrix2<f64>, d: f64) -> Option<Matrix2<f64>> {
    (Matrix2::identity() - l * d).try_inverse().map(|inv| l * inv)
}

/// Principal powers and the axis of the more plus one, from nalgebra's
/// symmetric eigen-decomposition.
fn na_principal(f: Matrix2<f64>) -> (f64, f64, f64) {
    let e = SymmetricEigen::new(f);
    let (i, j) = if e.eigenvalues[0] >= e.eigenvalues[1] {
        (0, 1)
    } else {
        (1, 0)
    };
    let v = e.eigenvectors.column(i);
    let axis = v[1].atan2(v[0]).to_degrees().rem_euclid(180.0);
    (e.eigenvalues[i], e.eigenvalues[j], axis)
}

fn axis_gap(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(180.0);
    d.min(180.0 - d)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(512))]

    #[test]
    fn a_plano_over_refraction_returns_the_worn_lens_at_its_own_plane(
        worn in any_rx(), worn_at in worn_plane(), extra in 0.0..=10.0f64,
    ) {
        let at = (worn_at + extra).min(30.0);
        let i = input(worn, worn_at, Rx::sphere_only(0.0).unwrap(), at, worn_at);
        let r = match over_refraction_report(&i) {
            Ok(r) => r,
            // The chain passes the cornea: an error only where the worn lens has no finite ocular refraction.
            Err(_) => {
                prop_assert!(PowerMatrix::from_rx(&worn).moved(worn_at / 1000.0).is_err());
                return Ok(());
            }
        };
        let got = exact_vector(r.exact.sphere(), r.exact.cylinder(), r.exact_axis);
        prop_assert!(vectors_agree(&got, &worn.power_vector(), 1e-9), "{worn} → {}", r.exact);
        if worn.cylinder().abs() > 1e-6 {
            prop_assert_eq!(r.exact.axis(), worn.to_minus_cyl().axis());
        }
    }

    #[test]
    fn zero_rotation_changes_nothing(
        worn in any_rx(), or in or_rx(), worn_at in worn_plane(), extra in 0.0..=10.0f64, to in plane(),
    ) {
        let at = (worn_at + extra).min(30.0);
        let i = input(worn, worn_at, or, at, to);
        if let Ok(r) = over_refraction_report(&i) {
            prop_assert_eq!(r.rotation_handling, RotationHandling::NotGiven);
            let (w, on_eye) = (worn.power_vector(), r.worn_on_eye.power_vector());
            prop_assert!(vectors_agree(&w, &on_eye, 1e-9));
            prop_assert_eq!(r.exact, r.needed_at_target);
            prop_assert_eq!(r.exact_axis, r.needed_axis_exact);
            let direct = recommend(&r.needed_at_target, i.target, &i.settings).unwrap();
            prop_assert_eq!(&r.recommendation, &direct);
        }
    }

    #[test]
    fn rotating_and_compensating_by_the_same_amount_is_the_identity(
        s in -20.0..=20.0f64, c in -6.0..=-0.25f64, axis in 1u16..=180, rot in rotation(), at in 0.0..=30.0f64,
    ) {
        let worn = rx(s, c, axis);
        let mut i = input(worn, 0.0, Rx::sphere_only(0.0).unwrap(), at, 0.0);
        i.rotation = rot;
        let r = over_refraction_report(&i).unwrap();
        if !rot.is_none() {
            prop_assert_eq!(r.rotation_handling, RotationHandling::Compensated);
        }
        prop_assert!((r.exact.sphere() - s).abs() < 1e-9 && (r.exact.cylinder() - c).abs() < 1e-9, "{}", r.exact);
        prop_assert_eq!(r.exact.axis(), axis);
        prop_assert!(axis_gap(r.exact_axis, f64::from(axis)) < 1e-9);
        // And the lens on the eye sits at the nominal axis − the clockwise rotation.
        let sits = (i32::from(axis) - i32::from(rot.clockwise())).rem_euclid(180);
        prop_assert_eq!(i32::from(r.worn_on_eye.axis()) % 180, sits);
    }

    #[test]
    fn matrix_sum_equals_power_vector_sum_at_one_plane(worn in any_rx(), or in any_rx(), plane in worn_plane()) {
        let (a, b) = (worn.power_vector(), or.power_vector());
        let r = match over_refraction_report(&input(worn, plane, or, plane, plane)) {
            Ok(r) => r,
            // The chain passes the cornea: an error only where the sum has no finite ocular refraction.
            Err(_) => {
                let sum = PowerMatrix::from_rx(&worn).plus(&PowerMatrix::from_rx(&or));
                prop_assert!(sum.moved(plane / 1000.0).is_err());
                return Ok(());
            }
        };
        let sum = PowerVector { m: a.m + b.m, j0: a.j0 + b.j0, j45: a.j45 + b.j45 };
        let got = exact_vector(r.exact.sphere(), r.exact.cylinder(), r.exact_axis);
        prop_assert!(vectors_agree(&got, &sum, 1e-9), "{worn} + {or}: {} ×{}", r.exact, r.exact_axis);
    }

    #[test]
    fn the_reported_vector_check_agrees_wherever_there_is_a_result(
        worn in any_rx(), or in or_rx(), worn_at in worn_plane(), extra in 0.0..=10.0f64, to in plane(),
        rot in rotation(),
    ) {
        let at = (worn_at + extra).min(30.0);
        let mut i = input(worn, worn_at, or, at, to);
        i.rotation = rot;
        if let Ok(r) = over_refraction_report(&i) {
            let v = r.vector_check;
            prop_assert!(v.agrees(), "{worn} + {or}: difference {}", v.difference);
            // Independent of the report's own sum: the worn lens as it sits, by its own vector.
            prop_assert!(vectors_agree(&v.worn, &r.worn_on_eye.power_vector(), 1e-12));
        }
    }

    #[test]
    fn the_matrix_move_is_the_per_meridian_move(rx in any_rx(), from in plane(), to in plane()) {
        let core = compensate(&rx, mm(from), mm(to));
        let matrix = PowerMatrix::from_rx(&rx).moved((from - to) / 1000.0);
        prop_assert_eq!(core.is_ok(), matrix.is_ok());
        if let (Ok(a), Ok(b)) = (core, matrix) {
            let p = b.principal_powers();
            let got = exact_vector(p.most_plus, p.cylinder(), p.axis);
            let tol = 1e-9 * a.sphere().abs().max((a.sphere() + a.cylinder()).abs()).max(1.0);
            prop_assert!(vectors_agree(&got, &a.power_vector(), tol), "{a} vs {}", b.to_rx());
        }
    }

    #[test]
    fn never_nan_or_infinite_within_the_limits(
        worn in any_rx(), or in any_rx(), worn_at in worn_plane(), at in plane(), to in plane(),
        rot in rotation(), unstable in any::<bool>(),
    ) {
        let mut i = input(worn, worn_at, or, at, to);
        i.rotation = rot;
        i.unstable = unstable;
        match over_refraction_report(&i) {
            Ok(r) => {
                let d = format!("{r:?}");
                prop_assert!(no_nan_or_infinity(&d), "{d}");
            }
            Err(e) => prop_assert!(!e.to_string().is_empty()),
        }
    }

    #[test]
    fn nalgebra_eigen_decomposition_agrees(
        worn in any_rx(), or in or_rx(), worn_at in worn_plane(), extra in 0.0..=10.0f64, to in plane(),
    ) {
        let at = (worn_at + extra).min(30.0);
        let Ok(r) = over_refraction_report(&input(worn, worn_at, or, at, to)) else { return Ok(()); };
        // The same chain with nalgebra: OR to the worn plane, sum, to the cornea, to the target.
        let m = |x: f64| x / 1000.0;
        let or_at_worn = na_moved(na_matrix(&or), m(at - worn_at)).unwrap();
        let k = na_moved(na_matrix(&worn) + or_at_worn, m(worn_at)).unwrap();
        let t = na_moved(k, -m(to)).unwrap();
        let (plus, minus, axis) = na_principal(t);
        let scale = plus.abs().max(minus.abs()).max(1.0);
        prop_assert!((r.exact.sphere() - plus).abs() < 1e-8 * scale, "sphere {} vs {plus}", r.exact.sphere());
        prop_assert!((r.exact.cylinder() - (minus - plus)).abs() < 1e-8 * scale, "cylinder {} vs {}", r.exact.cylinder(), minus - plus);
        if plus - minus > 0.01 {
            prop_assert!(axis_gap(r.exact_axis, axis) < 1e-5, "axis {} vs {axis}", r.exact_axis);
        }
    }
}
