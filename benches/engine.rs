//! Speed of the engine: one full evaluation, a 200-point sweep over height, and a whole plan.
//! Goals (issues 3 and 10): a full evaluation with the imaging chain under 20 µs, a sweep under 2 ms
//! natively. Run with `cargo bench --bench engine`.

use criterion::{criterion_group, criterion_main, Criterion};
use sharpfield::core::contract::plan::Plan;
use sharpfield::core::physics::engine::{evaluate, quality};
use sharpfield::core::planning::solve::{Axis, Sweep};
use sharpfield::core::presets::demo;
use std::hint::black_box;

fn engine(c: &mut Criterion) {
    let scenario = demo::pasture_survey();
    let setup = scenario.setup();
    c.bench_function("evaluate (power-law air)", |b| b.iter(|| evaluate(black_box(&setup))));
    c.bench_function("evaluate with the image quality (power-law air)", |b| {
        b.iter(|| {
            let e = evaluate(black_box(&setup));
            quality(&setup, &e)
        })
    });

    let mut hv = demo::pasture_survey();
    hv.air = sharpfield::core::contract::scenario::AirModel::Hv57;
    let hv_setup = hv.setup();
    c.bench_function("evaluate (Hufnagel-Valley air)", |b| {
        b.iter(|| evaluate(black_box(&hv_setup)))
    });

    c.bench_function("sweep of 200 heights", |b| {
        b.iter(|| Sweep::new(black_box(setup), Axis::Height))
    });

    let mast = demo::fence_mast();
    c.bench_function("whole plan (fence-line mast demo)", |b| {
        b.iter(|| Plan::build(black_box(mast.clone()), Vec::new()))
    });
}

criterion_group!(benches, engine);
criterion_main!(benches);
