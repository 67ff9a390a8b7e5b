//! The ply book of the invented small-wind demo (`layups/small-wind/`): every ply region draped
//! (the kinematic net), flattened, checked and nested on its material's roll, as
//! `layloft plybook` builds it before writing (`whole_book`); and the pattern files encoded
//! (DXF and SVG, the kit and the JSON) from the built book (`files`).
//!
//! Run with `cargo bench --bench plybook`. The input is the demo as committed (no randomness).

#[path = "kit/mod.rs"]
mod kit;
use kit::Runner;
use layloft::blade::Blade;
use layloft::input::read_project_sourced;
use layloft::plybook::{PlyBookParams, build_ply_book, plybook_files};

fn small_wind(c: &mut Runner) {
    let root = concat!(env!("CARGO_MANIFEST_DIR"), "/layups/small-wind/blade.toml");
    let Ok((project, sources)) = read_project_sourced(root.as_ref()) else { return };
    let Ok(blade) = Blade::from_project(&project) else { return };
    let params = PlyBookParams::default();
    let mut group = c.benchmark_group("small_wind");
    group.sample_size(10);
    group.bench_function("whole_book", |b| {
        b.iter(|| build_ply_book(&blade, &project, &params).map(|book| book.patterns.len()))
    });
    if let Ok(book) = build_ply_book(&blade, &project, &params) {
        let lines = &sources.ply_lines;
        let words = layloft::report::plybook_warnings(&book);
        group.bench_function("files", |b| {
            b.iter(|| plybook_files(&book, None, lines, &words).map(|f| f.len()))
        });
    }
    group.finish();
}

bench_main!(small_wind);
