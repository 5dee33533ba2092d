//! Benchmarks: a full conversion table (−20 to +20 D in 0.25 D steps, from
//! each vertex distance 8–20 mm in 1 mm steps to the cornea), with and
//! without the full panel report, and parsing 10,000 realistic
//! prescriptions typed in the notations practitioners use.
//!
//! Run: `cargo bench -p lensplane-core` (criterion prints the times).

use std::hint::black_box;

use criterion::{criterion_group, criterion_main, Criterion};
use lensplane_core::*;

fn table_entries() -> Vec<(f64, VertexDistance)> {
    let mut out = Vec::new();
    for q in -80..=80 {
        for mm in 8..=20 {
            out.push((f64::from(q) * 0.25, VertexDistance::from_mm(f64::from(mm)).unwrap()));
        }
    }
    out
}

/// 10,000 prescriptions in mixed notations, from a fixed pseudo-random
/// sequence (an invented population, mostly low myopia).
fn prescriptions() -> Vec<String> {
    let mut state: u64 = 0x9E37_79B9_7F4A_7C15;
    let mut next = move |n: u64| {
        state = state
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (state >> 33) % n
    };
    let mut out = Vec::with_capacity(10_000);
    for _ in 0..10_000 {
        let sphere = (next(61) as f64 - 40.0) * 0.25;
        let cyl = -(next(13) as f64) * 0.25;
        let axis = 1 + next(180);
        let s = if sphere == 0.0 {
            "pl".to_string()
        } else {
            format!("{sphere:+.2}")
        };
        let text = match (cyl == 0.0, next(6)) {
            (true, 0) => format!("{s} DS"),
            (true, _) => s,
            (false, 0) => format!("{s} {cyl:.2} x{axis:03}"),
            (false, 1) => format!("{s}/{cyl:.2}×{axis}").replace('-', "\u{2212}"),
            (false, 2) => format!("{s} {cyl:.2} @ {axis}").replace('.', ","),
            (false, 3) => format!("{s} {cyl:.2} ax {axis}"),
            (false, 4) => format!("{s} {cyl:.2} {axis}°"),
            (false, _) => format!("{s} {cyl:.2} X {axis}"),
        };
        out.push(text);
    }
    out
}

fn bench(c: &mut Criterion) {
    let entries = table_entries();
    let ladder = Ladder::CONTACT_LENS;
    c.bench_function("conversion table: 2093 entries, compensate + ladder", |b| {
        b.iter(|| {
            let mut sum = 0.0;
            for &(f, from) in &entries {
                let exact = compensate_power(black_box(f), from, VertexDistance::CORNEA).unwrap();
                sum += exact + ladder.round(exact, TieRule::TowardPlus);
            }
            sum
        })
    });
    let settings = OrderSettings::default();
    c.bench_function("conversion table: 2093 entries, full vertex_report", |b| {
        b.iter(|| {
            let mut n = 0;
            for &(f, from) in &entries {
                let input = VertexInput {
                    rx: Rx::sphere_only(black_box(f)).unwrap(),
                    from,
                    to: VertexDistance::CORNEA,
                    settings: settings.clone(),
                };
                n += vertex_report(&input).unwrap().warnings.len();
            }
            n
        })
    });
    let texts = prescriptions();
    assert!(
        texts.iter().all(|t| parse_rx(t).is_ok()),
        "the benchmark inputs must all parse"
    );
    c.bench_function("parse 10,000 prescriptions", |b| {
        b.iter(|| {
            let mut ok = 0;
            for t in &texts {
                ok += usize::from(parse_rx(black_box(t)).is_ok());
            }
            ok
        })
    });
}

criterion_group!(benches, bench);
criterion_main!(benches);
