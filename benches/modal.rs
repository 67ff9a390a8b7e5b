//! Campbell sweep speed: 61 speeds, 100 elements, the lowest 10 modes (band shift-invert
//! Lanczos), against a dense full solve of the same matrices (nalgebra `SymmetricEigen` on the
//! Cholesky-reduced problem). The blade is the invented twisted, coupled blade of the tests.

#[path = "../tests/modal_support/mod.rs"]
mod modal_support;

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use layloft::modal::{BeamModel, LanczosParams, SpeedRange, solve_dense, solve_lowest};
use modal_support::{rotor, spec, twisted_blade};

fn model() -> BeamModel {
    BeamModel::new(&twisted_blade(11), &rotor(5, 3000.0, 3600.0, 8.0), &spec(100))
        .expect("the benchmark blade is valid")
}

fn sweep(c: &mut Criterion) {
    let model = model();
    let r = model.rotor().clone();
    let speeds =
        SpeedRange::new(0.0, r.rpm_max, r.rpm_max / 60.0).expect("valid range").speeds(&[]);
    assert_eq!(speeds.len(), 61);
    let mut group = c.benchmark_group("modal");
    group.sample_size(10);
    group.bench_function("campbell_61_speeds_100_elements_10_modes", |b| {
        b.iter(|| black_box(model.campbell(&speeds, 10, &mut |_, _| {}).expect("converges")))
    });
    let sys = model.system_matrices(r.rpm_nominal).expect("valid speed");
    group.bench_function("lanczos_one_speed_10_modes", |b| {
        b.iter(|| {
            black_box(
                solve_lowest(&sys.stiffness, &sys.mass, 10, &LanczosParams::default())
                    .expect("converges"),
            )
        })
    });
    let (k, m) = (sys.stiffness.to_dense(), sys.mass.to_dense());
    group.bench_function("dense_full_solve_one_speed", |b| {
        b.iter(|| black_box(solve_dense(&k, &m).expect("positive definite")))
    });
    group.finish();
}

criterion_group!(benches, sweep);
criterion_main!(benches);
