//! Property tests over the whole input domain (hard limits: sphere ±30 D,
//! cylinder to 10 D, axis 1–180, vertex 0–30 mm, reading 10–100 cm, age
//! 1–110).

use lensplane_core::*;
use proptest::prelude::*;

fn sphere() -> impl Strategy<Value = f64> {
    -30.0..=30.0f64
}
fn cylinder() -> impl Strategy<Value = f64> {
    -10.0..=10.0f64
}
fn axis() -> impl Strategy<Value = u16> {
    1u16..=180
}
fn rx() -> impl Strategy<Value = Rx> {
    (sphere(), cylinder(), axis()).prop_map(|(s, c, a)| Rx::new(s, c, a).unwrap())
}
fn vertex() -> impl Strategy<Value = VertexDistance> {
    prop_oneof![
        Just(VertexDistance::CORNEA),
        (0.0..=30.0f64).prop_map(|mm| VertexDistance::from_mm(mm).unwrap())
    ]
}
/// Clinically common prescriptions (where no move is singular).
fn common_rx() -> impl Strategy<Value = Rx> {
    (-20.0..=20.0f64, -6.0..=0.0f64, axis()).prop_map(|(s, c, a)| Rx::new(s, c, a).unwrap())
}
fn spectacle_vertex() -> impl Strategy<Value = VertexDistance> {
    (8.0..=20.0f64).prop_map(|mm| VertexDistance::from_mm(mm).unwrap())
}

fn no_nan_or_infinity(debug: &str) -> bool {
    !debug.contains("NaN")
        && !debug.contains(": inf")
        && !debug.contains(": -inf")
        && !debug.contains("(inf")
        && !debug.contains("(-inf")
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(512))]

    #[test]
    fn vertex_there_and_back_returns_the_input(rx in rx(), a in vertex(), b in vertex()) {
        if let Ok(there) = compensate(&rx, a, b) {
            if let Ok(back) = compensate(&there, b, a) {
                let (m0, m1) = (rx.meridians(), back.meridians());
                for (x, y) in m0.both().iter().zip(m1.both()) {
                    prop_assert!((x.power - y.power).abs() <= 1e-9 * x.power.abs().max(1.0), "{x:?} vs {y:?}");
                }
            }
        }
    }

    #[test]
    fn common_prescriptions_always_have_an_answer(rx in common_rx(), from in spectacle_vertex()) {
        prop_assert!(compensate(&rx, from, VertexDistance::CORNEA).is_ok());
        prop_assert!(compensate(&rx, VertexDistance::CORNEA, from).is_ok());
    }

    #[test]
    fn transposing_twice_is_identity_and_keeps_se_and_vectors(rx in rx()) {
        let t = rx.transpose();
        let tt = t.transpose();
        prop_assert_eq!(tt.axis(), rx.axis());
        prop_assert!((tt.sphere() - rx.sphere()).abs() < 1e-12);
        prop_assert!((tt.cylinder() - rx.cylinder()).abs() < 1e-12);
        prop_assert!((t.spherical_equivalent() - rx.spherical_equivalent()).abs() < 1e-12);
        let (v, w) = (rx.power_vector(), t.power_vector());
        prop_assert!((v.m - w.m).abs() < 1e-12 && (v.j0 - w.j0).abs() < 1e-12 && (v.j45 - w.j45).abs() < 1e-12);
        prop_assert!(rx.to_minus_cyl().cylinder() <= 0.0);
        prop_assert!(rx.to_plus_cyl().cylinder() >= 0.0);
    }

    #[test]
    fn compensation_is_monotonic(f1 in sphere(), f2 in sphere(), a in vertex(), b in vertex()) {
        let (lo, hi) = if f1 < f2 { (f1, f2) } else { (f2, f1) };
        prop_assume!(hi - lo > 1e-9);
        if let (Ok(x), Ok(y)) = (compensate_power(lo, a, b), compensate_power(hi, a, b)) {
            prop_assert!(x < y, "{lo} → {x}, {hi} → {y}");
        }
    }

    #[test]
    fn moving_toward_the_eye_never_loses_plus(f in sphere(), a in vertex(), b in vertex()) {
        let (far, near) = if a.mm() >= b.mm() { (a, b) } else { (b, a) };
        if let Ok(g) = compensate_power(f, far, near) {
            prop_assert!(g >= f, "{f} moved toward the eye became {g}");
        }
        if let Ok(g) = compensate_power(f, near, far) {
            prop_assert!(g <= f, "{f} moved away became {g}");
        }
    }

    #[test]
    fn no_nan_or_infinity_inside_the_hard_limits(
        rx in rx(), from in vertex(), to in vertex(),
        add in 0.0..=4.0f64, reading in 10.0..=100.0f64, age in 1u8..=110,
        measured in prop_oneof![Just(Measured::FromLens), Just(Measured::FromEye)],
    ) {
        let settings = OrderSettings::default();
        if let Ok(r) = vertex_report(&VertexInput { rx, from, to, settings: settings.clone() }) {
            let d = format!("{r:?}");
            prop_assert!(no_nan_or_infinity(&d), "{d}");
        }
        if let Ok(r) = equivalent_report(&EquivalentInput { rx, from, to, settings: settings.clone(), substitute: SubstituteSettings::default() }) {
            let d = format!("{r:?}");
            prop_assert!(no_nan_or_infinity(&d), "{d}");
        }
        let input = NearInput {
            rx, add: Add::new(add).unwrap(), spectacle_vertex: from,
            reading: ReadingDistance::from_cm(reading).unwrap(), measured, target: to,
            age: Some(Age::new(age).unwrap()), settings,
        };
        if let Ok(r) = near_report(&input) {
            let d = format!("{r:?}");
            prop_assert!(no_nan_or_infinity(&d), "{d}");
        }
        for f in [rx.sphere(), rx.sphere() + rx.cylinder()] {
            for p in [compensate_power(f, from, to), effective_power(f, from.metres() - to.metres())].into_iter().flatten() {
                prop_assert!(p.is_finite());
            }
        }
    }

    #[test]
    fn common_cases_give_reports(rx in common_rx(), from in spectacle_vertex(), add in 0.0..=4.0f64, reading in 25.0..=100.0f64) {
        let settings = OrderSettings::default();
        let vertex_input = VertexInput { rx, from, to: VertexDistance::CORNEA, settings: settings.clone() };
        prop_assert!(vertex_report(&vertex_input).is_ok());
        let input = NearInput {
            rx, add: Add::new(add).unwrap(), spectacle_vertex: from,
            reading: ReadingDistance::from_cm(reading).unwrap(), measured: Measured::FromLens,
            target: VertexDistance::CORNEA, age: None, settings,
        };
        prop_assert!(near_report(&input).is_ok());
    }

    #[test]
    fn parser_never_panics(text in ".{0,40}") {
        let _ = parse_rx(&text);
        let _ = parse_sphere_field(&text);
        let _ = parse_cylinder_field(&text);
        let _ = parse_axis_field(&text);
        let _ = parse_vertex_mm(&text);
        let _ = parse_reading_distance(&text);
        let _ = parse_add(&text);
        let _ = parse_age(&text);
    }

    #[test]
    fn parser_never_panics_on_near_misses(
        parts in proptest::collection::vec(
            prop_oneof![
                Just("-"), Just("+"), Just("±"), Just("\u{2212}"), Just("–"), Just("."), Just(","), Just("/"),
                Just("x"), Just("×"), Just("@"), Just("ax"), Just("°"), Just(" "), Just("DS"), Just("D.S."),
                Just("pl"), Just("0"), Just("00"), Just("1"), Just("25"), Just("180"), Just("181"), Just("999999999999999999999"),
                Just("cm"), Just("in"), Just("\""), Just("mm"), Just("add"), Just("sph"), Just("cyl"),
            ],
            0..12,
        )
    ) {
        let text: String = parts.concat();
        let _ = parse_rx(&text);
        let _ = Rx::from_fields(&text, &text, &text);
        let _ = parse_vertex_mm(&text);
        let _ = parse_reading_distance(&text);
        let _ = parse_add(&text);
        let _ = parse_age(&text);
    }

    #[test]
    fn formatted_output_parses_back_to_the_same_value(s in -3000i32..=3000, c in -1000i32..=1000, a in axis()) {
        let rx = Rx::new(f64::from(s) / 100.0, f64::from(c) / 100.0, a).unwrap();
        let text = rx.to_string();
        let back = parse_rx(&text).unwrap_or_else(|e| panic!("{text:?}: {e}")).value;
        prop_assert_eq!(back, rx, "{}", text);
        prop_assert_eq!(back.to_string(), text);
        // Either cylinder form (when the other form's sphere is itself
        // within the ±30 D input limit).
        let plus = rx.to_plus_cyl();
        if plus.sphere().abs() <= 30.0 {
            let plus = plus.to_string();
            prop_assert_eq!(parse_rx(&plus).unwrap().value.to_string(), plus);
        }
    }

    #[test]
    fn formatted_exact_results_parse_back_within_half_a_hundredth(rx in common_rx(), from in spectacle_vertex()) {
        let exact = compensate(&rx, from, VertexDistance::CORNEA).unwrap();
        // Results beyond the input limits print but are not accepted back
        // as input (decision 13 in the crate docs).
        prop_assume!(exact.sphere().abs() <= 30.0 && exact.cylinder().abs() <= 10.0);
        let text = exact.to_string();
        let back = parse_rx(&text).unwrap().value;
        prop_assert!((back.sphere() - exact.sphere()).abs() <= 0.005 + 1e-9, "{}", text);
        prop_assert!((back.cylinder() - exact.cylinder()).abs() <= 0.005 + 1e-9 || exact.cylinder().abs() < 0.005, "{}", text);
    }

    #[test]
    fn field_formatting_round_trips(h in -3000i32..=3000) {
        let x = f64::from(h) / 100.0;
        prop_assert_eq!(parse_sphere_field(&fmt_sphere(x)).unwrap().value, x);
        if h.abs() <= 1000 {
            prop_assert_eq!(parse_cylinder_field(&fmt_power(x)).unwrap().value, x);
        }
    }

    #[test]
    fn ordered_meridians_are_within_half_a_step(rx in common_rx(), from in spectacle_vertex(), to_cornea in any::<bool>()) {
        let to = if to_cornea { VertexDistance::CORNEA } else { VertexDistance::from_mm(14.0).unwrap() };
        let settings = OrderSettings::default();
        let ladder = settings.ladder_for(to);
        let o = order_lens(&rx, from, to, &ladder, settings.tie).unwrap();
        for (e, r) in o.exact.meridians().both().iter().zip(o.ordered_meridians.both()) {
            prop_assert!(ladder.contains(r.power), "{} not on the ladder", r.power);
            let step = if e.power.abs() > ladder.fine_limit { ladder.coarse_step } else { ladder.fine_step };
            prop_assert!((e.power - r.power).abs() <= step / 2.0 + 1e-9, "{} → {}", e.power, r.power);
        }
    }

    #[test]
    fn toric_keeps_the_spherical_equivalent(s in -12.0..=4.0f64, c in -2.5..=-0.5f64, a in axis()) {
        let exact = Rx::new(s, c, a).unwrap();
        let t = choose_toric(&exact, &ToricSettings::default(), &Ladder::CONTACT_LENS, TieRule::TowardPlus).unwrap().unwrap();
        prop_assert!(t.residual_spherical_equivalent.abs() <= 0.25 + 1e-9, "{t:?}");
        prop_assert!(t.ordered.axis().is_multiple_of(10));
        prop_assert!(ToricSettings::default().cylinders.contains(&t.ordered.cylinder()));
        // The axis part alone: 2·|C|·sin(rotation) (obliquely crossed cylinders).
        let rot = (f64::from(t.ordered.axis()) - f64::from(exact.axis())).to_radians();
        prop_assert!((t.residual_from_axis - 2.0 * c.abs() * rot.sin().abs()).abs() < 1e-9);
    }

    #[test]
    fn near_at_the_same_plane_keeps_the_add(f in -20.0..=20.0f64, add in 0.0..=4.0f64, d in 8.0..=20.0f64, reading in 25.0..=100.0f64) {
        let v = VertexDistance::from_mm(d).unwrap();
        let g = NearGeometry { spectacle_vertex: v, target: v, reading: ReadingDistance::from_cm(reading).unwrap(), measured: Measured::FromLens };
        let n = near_figures(f, add, &g, None).unwrap();
        prop_assert!((n.add_at_target - add).abs() < 1e-9);
        prop_assert!((n.accommodation_target - n.accommodation_spectacles).abs() < 1e-9);
    }

    #[test]
    fn equivalent_add_gives_the_same_accommodation(f in -20.0..=20.0f64, add in 0.0..=4.0f64, d in 8.0..=20.0f64, target in prop_oneof![Just(0.0), 8.0..=20.0f64]) {
        let g = NearGeometry {
            spectacle_vertex: VertexDistance::from_mm(d).unwrap(),
            target: VertexDistance::from_mm(target).unwrap(),
            reading: ReadingDistance::from_cm(40.0).unwrap(),
            measured: Measured::FromLens,
        };
        let n = near_figures(f, add, &g, None).unwrap();
        // With the exact add (rounded_add = None) the patient accommodates
        // exactly as through the spectacles with their add.
        prop_assert!((n.accommodation_target_with_rounded_add - n.accommodation_spectacles_with_add).abs() < 1e-9);
    }
}

// `read_decimal` against the standard library's parser (the reference for
// correctly rounded decimal-to-binary conversion, IEEE 754 §5.12).
proptest! {
    #![proptest_config(ProptestConfig::with_cases(2048))]

    #[test]
    fn decimals_of_up_to_15_digits_read_exactly_as_the_standard_parser(
        sign in prop_oneof![Just(""), Just("-"), Just("+")],
        int in "[0-9]{0,8}",
        frac in proptest::option::of("[0-9]{0,7}"),
        exp in proptest::option::of(-8i32..=8),
    ) {
        prop_assume!(!int.is_empty() || frac.as_deref().is_some_and(|f| !f.is_empty()));
        let mut text = format!("{sign}{int}");
        if let Some(f) = &frac {
            text.push('.');
            text.push_str(f);
        }
        if let Some(e) = exp {
            text.push_str(&format!("e{e}"));
        }
        let std: f64 = text.parse().unwrap();
        prop_assert_eq!(read_decimal(&text).map(f64::to_bits), Some(std.to_bits()), "{}", text);
    }

    #[test]
    fn long_decimals_read_within_a_few_units_in_the_last_place(
        int in "[1-9][0-9]{0,30}",
        frac in "[0-9]{0,30}",
        exp in -250i32..=250,
    ) {
        let text = format!("{int}.{frac}e{exp}");
        let std: f64 = text.parse().unwrap();
        let ours = read_decimal(&text).unwrap();
        prop_assert!(ours.to_bits().abs_diff(std.to_bits()) <= 8, "{}: {:e} vs {:e}", text, ours, std);
    }

    #[test]
    fn anything_the_standard_parser_refuses_is_refused(text in "[-+.eE0-9x ]{0,8}") {
        // Acceptance only: the values are compared by the two tests above.
        let std = text.parse::<f64>().ok().filter(|x| x.is_finite());
        prop_assert_eq!(read_decimal(&text).filter(|x| x.is_finite()).is_some(), std.is_some(), "{}", text);
    }
}
