//! The panel reports: what the UI shows and warnings tied to fields.
//! Scenarios are invented;
//! expected figures are [textbook]/[derived] as labelled.

use lensplane_core::*;

fn mm(x: f64) -> VertexDistance {
    VertexDistance::from_mm(x).unwrap()
}

fn vertex(rx: Rx, from: f64, to: f64) -> VertexReport {
    vertex_report(&VertexInput {
        rx,
        from: mm(from),
        to: mm(to),
        settings: OrderSettings::default(),
    })
    .unwrap()
}

fn kinds(w: &[Warning]) -> Vec<WarningKind> {
    w.iter().map(|w| w.kind).collect()
}

#[test]
fn vertex_report_c1_everything_the_panel_shows() {
    // C1 [textbook] −8.00 −2.00 ×180 from 12 mm to the cornea.
    let r = vertex(Rx::new(-8.0, -2.0, 180).unwrap(), 12.0, 0.0);
    assert_eq!(r.exact.to_string(), "-7.30 -1.63 ×180");
    assert_eq!(r.exact_minus_cyl.to_string(), "-7.30 -1.63 ×180");
    assert_eq!(r.exact_plus_cyl.to_string(), "-8.93 +1.63 ×090");
    assert_eq!(r.meridians_before.first().axis, 180);
    assert_eq!(fmt_power(r.meridians_after.first().power), "-7.30");
    assert_eq!(fmt_power(r.meridians_after.second().power), "-8.93");
    assert_eq!(r.meridians_after.second().axis, 90);
    assert_eq!(fmt_power(r.change.first().power), "+0.70");
    assert_eq!(fmt_power(r.change.second().power), "+1.07");
    assert_eq!(r.ladder, LadderKind::ContactLens);
    // Contact-lens ladder: −7.2993 → −7.50, −8.9286 → −9.00.
    assert_eq!(r.ordered.ordered.to_string(), "-7.50 -1.50 ×180");
    assert_eq!(r.ordered_plus_cyl.to_string(), "-9.00 +1.50 ×090");
    // [derived] −7.50 at the cornea is −8.2418 at 12 mm; −9.00 is −10.0897.
    assert_eq!(r.ordered.back_at_origin.to_string(), "-8.24 -1.85 ×180");
    assert_eq!(fmt_power(r.ordered.residual.first().power), "-0.24");
    assert_eq!(fmt_power(r.ordered.residual.second().power), "-0.09");
    assert_eq!(
        r.reason,
        "moving a correction toward the eye needs more plus (less minus)"
    );
    assert_eq!(kinds(&r.warnings), vec![WarningKind::MeasureVertex]);
    let t = r.toric.unwrap();
    assert_eq!(t.ordered.to_string(), "-7.00 -1.75 ×180");
    assert!(t.residual_from_axis.abs() < 1e-12);
    assert!((t.residual_from_cylinder - (1.75 - 1.6293)).abs() < 1e-3);
}

#[test]
fn vertex_report_v6_spectacles_moving_away() {
    // V6 [textbook] −10.00 from 10 to 14 mm: −10.4167 → −10.50.
    let r = vertex(Rx::sphere_only(-10.0).unwrap(), 10.0, 14.0);
    assert_eq!(r.exact.to_string(), "-10.42 DS");
    assert_eq!(r.ordered.ordered.to_string(), "-10.50 DS");
    assert_eq!(r.ladder, LadderKind::Spectacle);
    assert_eq!(
        r.reason,
        "moving a correction away from the eye needs less plus (more minus)"
    );
    assert!(r.toric.is_none());
}

#[test]
fn vertex_report_warnings() {
    // Low power: change below a quarter step [derived: −1.00 → −0.9881].
    let r = vertex(Rx::sphere_only(-1.0).unwrap(), 12.0, 0.0);
    assert_eq!(kinds(&r.warnings), vec![WarningKind::BelowQuarterStep]);
    assert_eq!(
        r.warnings[0].message,
        "the change is below a quarter step (0.01 D at most): vertex makes little difference here"
    );
    assert_eq!(r.warnings[0].field, Field::Result);
    // Unusual spectacle vertex.
    let r = vertex(Rx::sphere_only(-1.0).unwrap(), 25.0, 12.0);
    assert_eq!(r.warnings[0].kind, WarningKind::UnusualVertex);
    assert_eq!(r.warnings[0].field, Field::VertexFrom);
    assert_eq!(
        r.warnings[0].message,
        "vertex distance 25 mm is unusual for spectacles (usually 8–20 mm): check it"
    );
    // Off-step input.
    let r = vertex(Rx::new(-2.3, -1.0, 90).unwrap(), 12.0, 0.0);
    assert_eq!(r.warnings[0].kind, WarningKind::OffStep);
    // Outside the contact-lens stock range, and beyond the toric range.
    let r = vertex(Rx::new(-16.0, -4.0, 180).unwrap(), 12.0, 0.0);
    let k = kinds(&r.warnings);
    assert!(k.contains(&WarningKind::OutsideStock), "{k:?}");
    assert!(k.contains(&WarningKind::BeyondToricRange), "{k:?}");
    assert!(!r.toric.as_ref().unwrap().within_range);
    // High power and high cylinder.
    let r = vertex(Rx::new(-22.0, -7.0, 180).unwrap(), 12.0, 12.0);
    let k = kinds(&r.warnings);
    assert_eq!(k, vec![WarningKind::HighPower, WarningKind::HighCylinder]);
    assert_eq!(r.reason, "same vertex distance: no change");
    // Plano.
    assert_eq!(
        vertex(Rx::sphere_only(0.0).unwrap(), 12.0, 0.0).reason,
        "plano stays plano at any vertex distance"
    );
}

#[test]
fn equivalent_report_contents() {
    // S1 [definition] +1.50 −1.00 ×180 has SE +1.00 at the spectacle plane.
    let r = equivalent_report(&EquivalentInput {
        rx: Rx::new(1.5, -1.0, 180).unwrap(),
        from: VertexDistance::SPECTACLES,
        to: VertexDistance::CORNEA,
        settings: OrderSettings::default(),
        substitute: SubstituteSettings::default(),
    })
    .unwrap();
    assert_eq!(r.spherical_equivalent_at_origin, 1.0);
    // [derived] meridians +1.5271 / +0.5030 → SE +1.0150 → +1.00.
    assert_eq!(fmt_power(r.spherical_equivalent), "+1.02");
    assert_eq!(r.ordered.to_string(), "+1.00 DS");
    assert_eq!(r.assessment.verdict, Verdict::Unsuitable);
    assert!((r.assessment.residual_astigmatism - 1.0241).abs() < 1e-3);
    assert!((r.residual.cylinder_size() - r.assessment.residual_astigmatism).abs() < 1e-12);
    assert!(r.residual_blur > 0.5);
}

fn near(rx: Rx, add: f64, target: VertexDistance, age: Option<u8>) -> NearReport {
    near_report(&NearInput {
        rx,
        add: Add::new(add).unwrap(),
        spectacle_vertex: VertexDistance::SPECTACLES,
        reading: ReadingDistance::from_cm(40.0).unwrap(),
        measured: Measured::FromLens,
        target,
        age: age.map(|a| Age::new(a).unwrap()),
        settings: OrderSettings::default(),
    })
    .unwrap()
}

#[test]
fn near_report_summary_lines() {
    // N3 [derived]: myope, add fully neutralising 40 cm.
    let r = near(Rx::sphere_only(-6.0).unwrap(), 2.5, VertexDistance::CORNEA, None);
    assert_eq!(
        r.summary,
        "a myope needs more accommodation in contact lenses: 2.43 D against 2.12 D in spectacles; within a quarter step of the spectacle add +2.50"
    );
    // [derived] hyperope +6.00 with add +2.00: equivalent add +1.8504.
    let r = near(Rx::sphere_only(6.0).unwrap(), 2.0, VertexDistance::CORNEA, None);
    assert!((r.add_at_target - 1.8504).abs() < 1e-4);
    assert_eq!(
        r.summary,
        "a hyperope needs less accommodation in contact lenses: 2.43 D against 2.81 D in spectacles; the add may need to fall by about 0.15 D from +2.00"
    );
    // Another spectacle distance.
    let r = near(Rx::sphere_only(-6.0).unwrap(), 0.0, mm(16.0), None);
    assert!(
        r.summary
            .starts_with("a myope needs less accommodation with the lens at 16 mm"),
        "{}",
        r.summary
    );
}

#[test]
fn near_report_warnings_and_amplitude() {
    let r = near(Rx::sphere_only(-3.0).unwrap(), 2.5, VertexDistance::CORNEA, Some(62));
    let k = kinds(&r.warnings);
    assert!(k.contains(&WarningKind::AmplitudeUnreliable), "{k:?}");
    // The near page's standing cautions are shown once for the page, not per eye.
    assert!(k.iter().all(|w| !matches!(w, WarningKind::OffStep)), "{k:?}");
    let page: Vec<CautionKind> = cautions_for(Calculation::Near).map(|c| c.kind).collect();
    for want in [
        CautionKind::MultifocalLabels,
        CautionKind::TrialAtDistance,
        CautionKind::PopulationEstimate,
    ] {
        assert!(page.contains(&want), "{want:?} missing from {page:?}");
    }
    let a = r.amplitude.unwrap();
    assert_eq!(a.amplitude.minimum, 0.0);
    assert_eq!(a.tentative_from_minimum.half_reserve, 2.5);
    // Age 45, add +2.50 at 40 cm: far above the age estimate [published,
    // Hofstetter: minimum 3.75 → 2.50 − 1.875 = 0.625; maximum 7.00 → 0].
    let r = near(Rx::sphere_only(-3.0).unwrap(), 2.5, mm(12.0), Some(45));
    let w = r
        .warnings
        .iter()
        .find(|w| w.kind == WarningKind::AddDiffersFromAge)
        .unwrap();
    assert_eq!(
        w.message,
        "the add +2.50 is outside the age estimate (0.00 to +0.63, half in reserve): check the amplitude"
    );
    // Same plane: the add does not change.
    assert!((r.add_at_target - 2.5).abs() < 1e-12);
}
