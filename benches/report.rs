//! `layloft report` on the mine-fan demo end to end (release binary): sections, stresses for
//! every load case, the Campbell sweep, the design check, the tooling parts built, checked and
//! written as STL, and the HTML report with its data files. The goal is under 2 s.

use std::process::Command;

use criterion::{Criterion, criterion_group, criterion_main};

fn bench(c: &mut Criterion) {
    let out = tempfile::tempdir().expect("temporary folder");
    let exe = env!("CARGO_BIN_EXE_layloft");
    let mut g = c.benchmark_group("report");
    g.sample_size(10);
    g.bench_function("mine-fan demo, everything including STL", |b| {
        b.iter(|| {
            let status = Command::new(exe)
                .args(["report", "layups/mine-fan/blade.toml", "--quiet", "--out"])
                .arg(out.path())
                .status()
                .expect("layloft runs");
            assert!(status.success());
        })
    });
    g.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
