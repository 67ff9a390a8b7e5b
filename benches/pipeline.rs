//! The analysis chain of each invented demo project: `BladeModel::build` (loft the blade, lay out
//! and solve the section at every analysis station: 21 stations for the mine fan, 25 for the
//! small wind blade, 240 contour points each). The project is read outside the timed loop; each
//! iteration builds from a fresh copy of it.
//!
//! And the blade's mass integrated on a fresh copy of the built model (the span-wise table: the
//! outline blended at 400 radii from the stations' outlines, which the build already resampled at
//! the same count; 240 wall segments and the webs at each). Floor, by arithmetic: 400 × 240
//! segments, each a blend of two points, a length and the few plies of its radius summed (about
//! 20 ns): about 2 ms.

use std::path::Path;

#[path = "kit/mod.rs"]
mod kit;
use kit::{BatchSize, Runner};
use layloft::analysis::BladeModel;
use layloft::input::read_project;

fn bench_pipeline(c: &mut Runner) {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    for (name, file) in
        [("mine-fan", "layups/mine-fan/blade.toml"), ("small-wind", "layups/small-wind/blade.toml")]
    {
        let project = match read_project(&root.join(file)) {
            Ok(p) => p,
            Err(e) => panic!("demo project {file} does not read: {e}"),
        };
        c.bench_function(format!("BladeModel::build {name}"), |b| {
            b.iter_batched(
                || project.clone(),
                |p| BladeModel::build(std::hint::black_box(p)).map(|m| m.stations.len()),
                BatchSize::SmallInput,
            )
        });
        let model = match BladeModel::build(project.clone()) {
            Ok(m) => m,
            Err(e) => panic!("demo project {file} does not build: {e}"),
        };
        c.bench_function(format!("blade mass {name}"), |b| {
            b.iter_batched(|| model.clone(), |m| m.mass().total_kg, BatchSize::SmallInput)
        });
    }
}

bench_main!(bench_pipeline);
