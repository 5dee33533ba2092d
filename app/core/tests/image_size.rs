//! Image size: check values of the project's optics notes (section 13) with
//! their provenance labels, the thin-lens identity (change = −d·F), the
//! shape factor, the comparison of the eyes, lens-form parsing with exact
//! error text, and that nothing is NaN or infinite within the limits.
//!
//! Provenance labels: [textbook] = Bennett & Rabbetts, Clinical Visual
//! Optics (4th ed.), method as taught; [derived] = worked here from the
//! formulas, no printed example; [common practice] = a trade fact with no
//! single source; [from memory] = recalled, not verified (the 3 mm entrance
//! pupil depth).

use lensplane_core::*;
use proptest::prelude::*;

const TOL: f64 = 5e-5; // fractions to 4 decimal places (0.01 %)

fn mm(x: f64) -> VertexDistance {
    VertexDistance::from_mm(x).unwrap()
}

fn eye(s: f64, c: f64, a: u16) -> ImageSizeReport {
    image_size_report(&ImageSizeInput {
        rx: Rx::new(s, c, a).unwrap(),
        vertex: VertexDistance::SPECTACLES,
        form: None,
    })
    .unwrap()
}

#[track_caller]
fn close(actual: f64, expected: f64, what: &str) {
    assert!(
        (actual - expected).abs() < TOL,
        "{what}: got {actual:.6}, expected {expected}"
    );
}

#[test]
fn plus_8_at_12_mm() {
    // [derived] +8.00 at 12 mm (h = 15 mm, entrance pupil 3 mm [from memory]):
    // spectacles +13.64 %, contact lens +2.73 %, change -9.60 %.
    let r = eye(8.0, 0.0, 180);
    assert_eq!(r.meridians.len(), 1);
    let m = r.meridians[0];
    close(m.spectacles, 0.1364, "spectacles");
    close(m.contact_lens, 0.0273, "contact lens");
    close(m.change, -0.0960, "change");
    close(m.contact_lens_power, 8.8496, "contact-lens power");
    assert_eq!(m.shape_factor, None);
    assert_eq!(
        (
            fmt_percent(m.spectacles),
            fmt_percent(m.contact_lens),
            fmt_percent(m.change)
        ),
        ("+13.6 %".to_string(), "+2.7 %".to_string(), "-9.6 %".to_string())
    );
    assert_eq!(r.shape_note, Some("shape factor left out: lens form not given"));
    assert_eq!(
        r.horizontal,
        MeridianSize {
            axis: 180,
            ..r.vertical
        }
    );
}

#[test]
fn ten_dioptres_change_by_twelve_per_cent() {
    // Notes §13 [textbook]: +10 D at 12 mm → 12 % smaller in contact lenses; -10 D → 12 % larger.
    close(eye(10.0, 0.0, 180).meridians[0].change, -0.12, "+10");
    close(eye(-10.0, 0.0, 180).meridians[0].change, 0.12, "-10");
}

#[test]
fn right_minus_1_left_minus_5_at_12_mm() {
    // [derived] R -1.00 / L -5.00 at 12 mm: spectacles -1.48 % / -6.98 %
    // (difference 5.9 %), contact lenses -0.30 % / -1.40 %.
    let (r, l) = (eye(-1.0, 0.0, 180), eye(-5.0, 0.0, 180));
    close(r.meridians[0].spectacles, -0.0148, "R spectacles");
    close(l.meridians[0].spectacles, -0.0698, "L spectacles");
    close(r.meridians[0].contact_lens, -0.0030, "R contact lens");
    close(l.meridians[0].contact_lens, -0.0140, "L contact lens");
    let c = compare_image_sizes(&r, &l);
    // The notes' 5.9 % is the ratio of the magnifications − 1 (0.985222 / 0.930233 − 1 = 0.0591);
    // plain subtraction of the percentages would give 5.50 %.
    close(c.horizontal.spectacles, 0.0591, "difference in spectacles");
    assert!((c.horizontal.spectacles - 0.0550).abs() > 0.003);
    assert_eq!(fmt_percent_size(c.horizontal.spectacles), "5.9 %");
    // [derived] contact lenses: 0.997044 / 0.986047 − 1 = 1.12 %.
    close(c.horizontal.contact_lenses, 0.0112, "difference in contact lenses");
    assert_eq!(c.horizontal, c.vertical.clone_with_axis(180));
    assert_eq!(c.horizontal.larger_in_spectacles, Some(Eye::Right));
    // Rule of thumb [common practice]: 1.5 % per dioptre → 6.0 % for 4.00 D; a fifth in contact lenses.
    close(c.horizontal.anisometropia, 4.0, "anisometropia");
    close(c.horizontal.rule_of_thumb_spectacles, 0.06, "rule of thumb");
    close(
        c.horizontal.rule_of_thumb_contact_lenses,
        0.012,
        "rule of thumb, contact lenses",
    );
    assert_eq!(c.spectacles, Tolerance::Poor);
    assert_eq!(c.contact_lenses, Tolerance::Usual);
    assert_eq!(
        c.reading,
        "In spectacles the two images differ by about 5.9 %, the right larger: above about 5.0 %, often not tolerated. \
         In contact lenses by about 1.1 %, the right larger: below about 3.0 %, usually tolerated. \
         Rule of thumb (common practice): about 1.5 % per dioptre of anisometropia in spectacles (4.00 D here, about 6.0 %), a fifth of that in contact lenses."
    );
    assert!(c.knapp.starts_with(
        "Knapp's law: in axial anisometropia a spectacle lens near the eye's anterior focal point (about 15.7 mm)"
    ));
    assert!(c.knapp.contains("contact lenses are not automatically better"));
    // Outlines to scale [derived]: the largest of the four is the right contact lens (0.997044);
    // the right spectacle outline is 0.985222 / 0.997044 = 1 / 1.012.
    assert_eq!(c.contact_lens_outlines.right.along, 1.0);
    close(c.spectacle_outlines.right.along, 1.0 / 1.012, "right spectacle outline");
    close(
        c.spectacle_outlines.left.along,
        0.930233 / 0.997044,
        "left spectacle outline",
    );
}

trait WithAxis {
    fn clone_with_axis(&self, axis: u16) -> Self;
}
impl WithAxis for MeridianDifference {
    fn clone_with_axis(&self, axis: u16) -> Self {
        MeridianDifference { axis, ..*self }
    }
}

#[test]
fn tolerance_thresholds_as_shown() {
    // Right plano, left -F at 12 mm: the difference is exactly 1.5 % per dioptre
    // (1 + 0.015·F) [derived]; about 3–5 % may not be tolerated [common practice].
    let plano = eye(0.0, 0.0, 180);
    for (f, shown, tolerance) in [
        (-1.75, "2.6 %", Tolerance::Usual),
        (-2.0, "3.0 %", Tolerance::Borderline),
        (-3.25, "4.9 %", Tolerance::Borderline),
        (-3.5, "5.3 %", Tolerance::Poor),
    ] {
        let c = compare_image_sizes(&plano, &eye(f, 0.0, 180));
        assert_eq!(fmt_percent_size(c.horizontal.spectacles), shown, "{f}");
        assert_eq!(c.spectacles, tolerance, "{f}");
        assert_eq!(c.horizontal.larger_in_spectacles, Some(Eye::Right));
    }
    let same = compare_image_sizes(&plano, &plano);
    assert_eq!(same.horizontal.larger_in_spectacles, None);
    assert_eq!(limits::ANISEIKONIA_TOLERANCE.to_string(), "3–5 %");
    assert_eq!(
        Tolerance::Borderline.words(),
        "between about 3.0 % and 5.0 %, where a difference may not be tolerated"
    );
}

#[test]
fn an_astigmatic_eye_has_two_meridians_and_is_compared_in_180_and_090() {
    // [derived] -2.00 -2.00 ×180 at 12 mm: 180 meridian -2.00 → -2.9 %, 090 meridian -4.00 → -5.7 %.
    let r = eye(-2.0, -2.0, 180);
    assert_eq!(r.meridians.len(), 2);
    assert_eq!((r.meridians[0].axis, r.meridians[1].axis), (180, 90));
    close(r.meridians[0].spectacles, 1.0 / 1.03 - 1.0, "180");
    close(r.meridians[1].spectacles, 1.0 / 1.06 - 1.0, "090");
    assert_eq!(r.horizontal, r.meridians[0]);
    assert_eq!(r.vertical, r.meridians[1]);
    assert_eq!(
        r.summary,
        "image size against the uncorrected eye: in the 180 meridian -2.9 % in spectacles, -0.6 % in contact lenses (change +2.4 %); in the 090 meridian -5.7 % in spectacles, -1.1 % in contact lenses (change +4.8 %)"
    );
    // An oblique axis: the power in the 180 meridian is S + C·sin²(θ − α) [textbook]:
    // -2.00 -2.00 ×045 → -3.00 in both 180 and 090.
    let o = eye(-2.0, -2.0, 45);
    close(o.horizontal.spectacle_power, -3.0, "oblique 180");
    close(o.vertical.spectacle_power, -3.0, "oblique 090");
    let c = compare_image_sizes(&eye(-3.0, 0.0, 180), &o);
    close(c.horizontal.spectacles, 0.0, "same power in 180");
    assert_eq!(c.spectacle_outlines.left.axis, 45);
    assert_eq!(c.spectacle_outlines.left.svg_rotate(), "rotate(-45)");
}

#[test]
fn the_shape_factor() {
    // [derived] +6.00 front, 2 mm, n 1.5: 1 / (1 − 0.002 / 1.5 · 6) = 1.008065.
    let form = LensForm::new(6.0, 2.0, 1.5).unwrap();
    close(form.shape_factor(), 1.008065, "shape factor");
    let r = image_size_report(&ImageSizeInput {
        rx: Rx::sphere_only(8.0).unwrap(),
        vertex: VertexDistance::SPECTACLES,
        form: Some(form),
    })
    .unwrap();
    let m = r.meridians[0];
    assert_eq!(m.shape_factor, Some(form.shape_factor()));
    close(m.spectacle_magnification, 1.136364 * 1.008065, "with shape factor");
    assert_eq!(r.shape_note, None);
    // It reduces to 1 at zero thickness (or a plano front).
    assert_eq!(shape_factor(6.0, 0.0, 1.5).unwrap(), 1.0);
    assert_eq!(shape_factor(0.0, 0.005, 1.5).unwrap(), 1.0);
}

#[test]
fn d20_the_change_includes_the_spectacle_shape_factor() {
    // Decision 20: +8.00 at 12 mm with a +6.00 / 2 mm / 1.5 form [derived]:
    // (1 − 0.096) / 1.008065 − 1 = -0.10323, no longer −d·F = -0.096.
    let r = image_size_report(&ImageSizeInput {
        rx: Rx::sphere_only(8.0).unwrap(),
        vertex: VertexDistance::SPECTACLES,
        form: Some(LensForm::new(6.0, 2.0, 1.5).unwrap()),
    })
    .unwrap();
    close(r.meridians[0].change, -0.10323, "change with the shape factor");
    // The entrance pupil depth [from memory] and the anterior focal point [textbook].
    assert_eq!((ENTRANCE_PUPIL_MM, ANTERIOR_FOCAL_POINT_MM), (3.0, 15.7));
}

#[test]
fn lens_form_errors_at_their_fields() {
    for (f, t, n, message, field) in [
        (
            "30",
            "2",
            "1.5",
            "front surface 30 is outside 0.00 to +25.00",
            Field::FrontSurface,
        ),
        (
            "-1",
            "2",
            "1.5",
            "front surface -1 is outside 0.00 to +25.00",
            Field::FrontSurface,
        ),
        (
            "6",
            "0.3",
            "1.5",
            "centre thickness 0.3 mm is outside 0.5–20 mm",
            Field::Thickness,
        ),
        (
            "6",
            "21 mm",
            "1.5",
            "centre thickness 21 mm is outside 0.5–20 mm",
            Field::Thickness,
        ),
        ("6", "2 cm", "1.5", "unexpected \"cm\"", Field::Thickness),
        (
            "6",
            "2",
            "1.3",
            "refractive index 1.3 is outside 1.40–2.00",
            Field::Index,
        ),
        (
            "6",
            "2",
            "16",
            "refractive index 16 is outside 1.40–2.00: did you mean 1.6?",
            Field::Index,
        ),
        ("", "2", "1.5", "front surface is empty", Field::FrontSurface),
        ("6", "2", "", "refractive index is empty", Field::Index),
        (
            "6",
            "2",
            "1.5.2",
            "\"1.5.2\" is ambiguous: use one decimal point per number",
            Field::Index,
        ),
    ] {
        let e = LensForm::from_texts(f, t, n).unwrap_err();
        assert_eq!(e.to_string(), message, "{f} / {t} / {n}");
        assert_eq!(e.field(), field, "{f} / {t} / {n}");
    }
    assert_eq!(limits::FRONT_SURFACE.to_string(), "0.00 to +25.00");
    assert_eq!(limits::THICKNESS.to_string(), "0.5–20 mm");
    assert_eq!(limits::INDEX.to_string(), "1.40–2.00");
    // The edges are inside.
    assert!(LensForm::new(0.0, 0.5, 1.4).is_ok() && LensForm::new(25.0, 20.0, 2.0).is_ok());
}

#[test]
fn a_spectacle_vertex_is_needed() {
    let e = image_size_report(&ImageSizeInput {
        rx: Rx::sphere_only(-3.0).unwrap(),
        vertex: VertexDistance::CORNEA,
        form: None,
    })
    .unwrap_err();
    assert_eq!(
        e.to_string(),
        "vertex distance 0 mm is a contact lens: give the spectacle vertex distance"
    );
    assert_eq!(e.field(), Field::VertexFrom);
}

#[test]
fn percentages_have_one_decimal_a_sign_and_an_ascii_minus() {
    assert_eq!(fmt_percent(0.13636), "+13.6 %");
    assert_eq!(fmt_percent(-0.0148), "-1.5 %");
    assert_eq!(fmt_percent(0.00049), "0.0 %");
    assert_eq!(fmt_percent(0.00051), "+0.1 %");
    assert_eq!(fmt_percent(-0.1), "-10.0 %");
    assert_eq!(fmt_percent_size(-0.0591), "5.9 %");
    assert_eq!(fmt_percent(f64::INFINITY), "\u{2014}");
}

#[test]
fn standing_cautions_of_the_page() {
    let kinds: Vec<_> = cautions_for(Calculation::ImageSize).map(|c| c.kind).collect();
    for k in [
        CautionKind::StartingPoint,
        CautionKind::ImageSizeEstimate,
        CautionKind::AniseikoniaSymptoms,
        CautionKind::ThinLens,
    ] {
        assert!(kinds.contains(&k), "{k:?}");
    }
    assert!(cautions_for(Calculation::ImageSize).any(|c| c.to_string()
        == "Image sizes are thin-lens estimates of spectacle magnification, not a measurement of aniseikonia."));
}

fn any_rx() -> impl Strategy<Value = Rx> {
    (-30.0..=30.0f64, -10.0..=10.0f64, 1u16..=180).prop_map(|(s, c, a)| Rx::new(s, c, a).unwrap())
}
fn spectacle_vertex() -> impl Strategy<Value = VertexDistance> {
    (0.5..=30.0f64).prop_map(mm)
}
fn lens_form() -> impl Strategy<Value = Option<LensForm>> {
    prop_oneof![
        Just(None),
        (0.0..=25.0f64, 0.5..=20.0f64, 1.4..=2.0f64).prop_map(|(f, t, n)| Some(LensForm::new(f, t, n).unwrap()))
    ]
}

fn no_nan_or_infinity(debug: &str) -> bool {
    !debug.contains("NaN") && !debug.contains("inf,") && !debug.contains("inf }") && !debug.contains("inf)")
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(512))]

    #[test]
    fn the_change_is_minus_d_f_for_thin_lenses(rx in any_rx(), vertex in spectacle_vertex()) {
        // Notes §13 [textbook]: PF_cl / PF_sp − 1 = −d·F exactly (d in metres), without a shape factor.
        let Ok(r) = image_size_report(&ImageSizeInput { rx, vertex, form: None }) else { return Ok(()); };
        for m in r.meridians.iter().chain([&r.horizontal, &r.vertical]) {
            let expected = -vertex.metres() * m.spectacle_power;
            prop_assert!((m.change - expected).abs() < 1e-12 * expected.abs().max(1.0), "{m:?}");
        }
    }

    #[test]
    fn nothing_is_nan_or_infinite_within_the_limits(
        right in any_rx(), left in any_rx(), vertex in spectacle_vertex(), rf in lens_form(), lf in lens_form(),
    ) {
        let r = image_size_report(&ImageSizeInput { rx: right, vertex, form: rf });
        let l = image_size_report(&ImageSizeInput { rx: left, vertex, form: lf });
        for report in [&r, &l].into_iter().flatten() {
            let d = format!("{report:?}");
            prop_assert!(no_nan_or_infinity(&d), "{d}");
        }
        if let (Ok(r), Ok(l)) = (r, l) {
            let c = compare_image_sizes(&r, &l);
            let d = format!("{c:?}");
            prop_assert!(no_nan_or_infinity(&d), "{d}");
            prop_assert!(c.horizontal.spectacles >= 0.0 && c.vertical.contact_lenses >= 0.0);
            for o in [c.spectacle_outlines.right, c.spectacle_outlines.left, c.contact_lens_outlines.right, c.contact_lens_outlines.left] {
                prop_assert!(o.along <= 1.0 + 1e-12 && o.across <= 1.0 + 1e-12);
            }
        }
    }

    #[test]
    fn the_shape_factor_grows_from_one_with_thickness(f in 0.0..=25.0f64, t in 0.0..=0.02f64, n in 1.4..=2.0f64) {
        let s = shape_factor(f, t, n).unwrap();
        prop_assert!(s >= 1.0 && s.is_finite());
        prop_assert!(shape_factor(f, t + 0.001, n).unwrap() >= s);
        prop_assert_eq!(shape_factor(f, 0.0, n).unwrap(), 1.0);
    }
}

#[test]
fn factors_print_as_percentages_and_outlines_as_svg_radii() {
    // [derived] +8.00 at 12 mm: power factor 1 / 0.88 = 1.1364 → +13.6 %; no shape factor → 0.0 %.
    let r = eye(8.0, 0.0, 180);
    assert_eq!(fmt_factor(r.meridians[0].power_factor), "+13.6 %");
    assert_eq!(fmt_factor(1.0), "0.0 %");
    // [derived] R -1.00 / L -5.00: the left spectacle outline is 0.930233 / 0.997044 = 0.9330 of the largest.
    let c = compare_image_sizes(&eye(-1.0, 0.0, 180), &eye(-5.0, 0.0, 180));
    assert_eq!(
        c.contact_lens_outlines.right.svg_radii(40.0),
        ("40.00".into(), "40.00".into())
    );
    assert_eq!(
        c.spectacle_outlines.left.svg_radii(40.0),
        ("37.32".into(), "37.32".into())
    );
}
