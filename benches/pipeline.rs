//! The analysis chain of each invented demo project: `BladeModel::build` (loft the blade, lay out
//! and solve the section at every analysis station: 21 stations for the mine fan, 25 for the
//! small wind blade, 240 contour points each). The project is read outside the timed loop; each
//! iteration builds from a fresh copy of it.

use std::path::Path;

use criterion::{BatchSize, Criterion, criterion_group, criterion_main};
use layloft::analysis::BladeModel;
use layloft::input::read_project;

fn bench_pipeline(c: &mut Criterion) {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    for (name, file) in
        [("mine-fan", "layups/mine-fan/blade.toml"), ("small-wind", "layups/small-wind/blade.toml")]
    {
        let project = match read_project(&root.join(file)) {
            Ok(p) => p,
            Err(e) => panic!("demo project {file} does not read: {e}"),
        };
        c.bench_function(&format!("BladeModel::build {name}"), |b| {
            b.iter_batched(
                || project.clone(),
                |p| BladeModel::build(std::hint::black_box(p)).map(|m| m.stations.len()),
                BatchSize::SmallInput,
            )
        });
    }
}

criterion_group!(benches, bench_pipeline);
criterion_main!(benches);
