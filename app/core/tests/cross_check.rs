//! Independent cross-check over a grid of powers and distances.
//!
//! The core works in vergences (F / (1 − δF), the vergence chain). Here the
//! same questions are answered by another route: paraxial rays traced as
//! (height, angle) vectors through 2×2 ray-transfer (ABCD) matrices, built
//! with the general-purpose linear-algebra library nalgebra (no usable
//! paraxial-optics crate was available). Thin lens R(F) = [[1, 0], [−F, 1]],
//! free space T(t) = [[1, t], [0, 1]] (reduced, in air); the vergence of a
//! ray state is −u/y. Method: standard matrix optics, e.g. Keating,
//! Geometric, Physical and Visual Optics, 2nd ed., ch. on matrix optics
//! [textbook].

use lensplane_core::*;
use nalgebra::{Matrix2, Vector2};

fn lens(f: f64) -> Matrix2<f64> {
    Matrix2::new(1.0, 0.0, -f, 1.0)
}
fn gap(t: f64) -> Matrix2<f64> {
    Matrix2::new(1.0, t, 0.0, 1.0)
}
fn vergence(state: Vector2<f64>) -> f64 {
    -state[1] / state[0]
}

/// Far-point vergence at the cornea of a lens `f` at `d` metres in front:
/// trace a ray from infinity.
fn ocular_refraction(f: f64, d: f64) -> f64 {
    vergence(gap(d) * lens(f) * Vector2::new(1.0, 0.0))
}

/// The lens at `d2` in front of the cornea with the same far point: start
/// at the cornea on the far-point ray and trace backwards with the inverse
/// matrix; the lens must bend a ray from infinity (u = 0) onto it.
fn lens_for(k: f64, d2: f64) -> f64 {
    let at_lens = gap(d2).try_inverse().unwrap() * Vector2::new(1.0, -k);
    -at_lens[1] / at_lens[0]
}

/// Vergence at the cornea of light from an axial object `s` metres in front
/// of a lens `p` that is `d` metres in front of the cornea.
fn vergence_at_eye(s: f64, p: f64, d: f64) -> f64 {
    vergence(gap(d) * lens(p) * gap(s) * Vector2::new(0.0, 1.0))
}

/// The lens at `d2` (object `s2` in front of it) that delivers vergence `le`
/// at the cornea: back-trace from the cornea, then bend the object's ray.
fn near_lens_for(le: f64, s2: f64, d2: f64) -> f64 {
    let after = gap(d2).try_inverse().unwrap() * Vector2::new(1.0, -le);
    let (y, u_after) = (after[0], after[1]);
    let u_before = y / s2;
    (u_before - u_after) / y
}

fn powers() -> impl Iterator<Item = f64> {
    (-80..=80).map(|q| f64::from(q) * 0.25)
}

fn distances_mm() -> impl Iterator<Item = f64> {
    (8..=20).map(f64::from)
}

fn agree(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-9 * a.abs().max(1.0)
}

#[test]
fn vertex_compensation_matches_ray_tracing() {
    let mut checked = 0;
    for f in powers() {
        for d in distances_mm() {
            let from = VertexDistance::from_mm(d).unwrap();
            for d2 in [0.0, 8.0, 10.0, 12.0, 14.0, 16.0, 20.0] {
                let to = VertexDistance::from_mm(d2).unwrap();
                let core = compensate_power(f, from, to).unwrap();
                let k = ocular_refraction(f, d / 1000.0);
                let traced = lens_for(k, d2 / 1000.0);
                assert!(
                    agree(core, traced),
                    "{f} from {d} to {d2} mm: core {core}, traced {traced}"
                );
                checked += 1;
            }
        }
    }
    assert_eq!(checked, 161 * 13 * 7);
}

#[test]
fn near_figures_match_ray_tracing() {
    let mut checked = 0;
    for f in powers() {
        for d in distances_mm() {
            for target in [0.0, 10.0, 16.0] {
                for cm in [25.0, 33.33, 40.0, 50.0, 100.0] {
                    for measured in [Measured::FromLens, Measured::FromEye] {
                        for add in [0.0, 1.25, 2.5, 4.0] {
                            let g = NearGeometry {
                                spectacle_vertex: VertexDistance::from_mm(d).unwrap(),
                                target: VertexDistance::from_mm(target).unwrap(),
                                reading: ReadingDistance::from_cm(cm).unwrap(),
                                measured,
                            };
                            let n = near_figures(f, add, &g, None).unwrap();
                            let (dm, tm) = (d / 1000.0, target / 1000.0);
                            let s = match measured {
                                Measured::FromLens => cm / 100.0,
                                Measured::FromEye => cm / 100.0 - dm,
                            };
                            let k = ocular_refraction(f, dm);
                            let le_plain = vergence_at_eye(s, f, dm);
                            let le_add = vergence_at_eye(s, f + add, dm);
                            let f2 = lens_for(k, tm);
                            let s2 = s + dm - tm;
                            let p2 = near_lens_for(le_add, s2, tm);
                            let target_plain = vergence_at_eye(s2, f2, tm);
                            let pairs = [
                                ("K", n.ocular_refraction, k),
                                ("A spectacles", n.accommodation_spectacles, k - le_plain),
                                ("A with add", n.accommodation_spectacles_with_add, k - le_add),
                                ("A target", n.accommodation_target, k - target_plain),
                                ("relief", n.relief_at_eye, le_add - le_plain),
                                ("F2", n.distance_power_at_target, f2),
                                ("near power", n.near_power_at_target, p2),
                                ("add at target", n.add_at_target, p2 - f2),
                            ];
                            for (what, core, traced) in pairs {
                                assert!(
                                    (core - traced).abs() < 1e-9,
                                    "{what}: F {f}, d {d}, target {target}, {cm} cm {measured:?}, add {add}: core {core}, traced {traced}"
                                );
                            }
                            checked += 1;
                        }
                    }
                }
            }
        }
    }
    assert_eq!(checked, 161 * 13 * 3 * 5 * 2 * 4);
}

#[test]
fn contact_lens_accommodation_is_one_over_the_distance_from_the_eye() {
    // Notes 6.3 [textbook]: with a contact lens, A = 1 / (|l| + d) for an
    // object |l| from the spectacle plane, whatever the ametropia.
    for f in powers() {
        let g = NearGeometry {
            spectacle_vertex: VertexDistance::SPECTACLES,
            target: VertexDistance::CORNEA,
            reading: ReadingDistance::from_cm(40.0).unwrap(),
            measured: Measured::FromLens,
        };
        let n = near_figures(f, 0.0, &g, None).unwrap();
        assert!((n.accommodation_target - 1.0 / 0.412).abs() < 1e-9);
    }
}

#[test]
fn cylinders_match_ray_tracing_per_meridian() {
    // A sphero-cylinder is two thin lenses in its two principal meridians;
    // trace each and compare with the recombined prescription.
    for (s, c, axis) in [
        (-8.0, -2.0, 180),
        (6.0, -2.0, 90),
        (-5.5, -2.25, 180),
        (2.0, -4.5, 33),
        (-3.0, 1.5, 120),
    ] {
        let rx = Rx::new(s, c, axis).unwrap();
        let cl = compensate(&rx, VertexDistance::SPECTACLES, VertexDistance::CORNEA).unwrap();
        let m1 = ocular_refraction(s, 0.012);
        let m2 = ocular_refraction(s + c, 0.012);
        assert!(agree(cl.sphere(), m1));
        assert!(agree(cl.cylinder(), m2 - m1));
        assert_eq!(cl.axis(), axis);
    }
}
