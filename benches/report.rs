//! The commands end to end (release binary, output written to a temporary folder):
//!
//! - `layloft report` on each invented demo: sections, stresses for every load case, the
//!   Campbell sweep, the design check, the tooling parts built, checked and written as STL, and
//!   the HTML report with its data files. Goals: under 0.4 s on the mine fan, under 0.8 s on the
//!   small wind blade.
//! - `layloft sections` on each demo: the blade lofted, the analysis stations solved, the blade
//!   mass integrated, the summary printed. Goal: under 25 ms.
//! - `layloft tooling` on the mine fan at a chordal tolerance of 0.025 mm (a quarter of the
//!   demo's): the self-intersection check of the fine meshes is the largest part. Goal: under 2 s.
//!
//! Floors, estimated by what each must at least do: `sections` must start a process and read the
//! project (about 2 ms measured with `layloft --version` and a bad-project run), loft the blade
//! (about 1 ms: two 1,601-point outlines resampled per station) and solve 21 or 25 sections of
//! 240 points (about 1.5 ms, `benches/section.rs` per section), so about 5 ms; `report` at least
//! the sum of its stages (see `benches/pipeline.rs`, `benches/stress.rs`, `benches/modal.rs`,
//! `benches/tooling.rs`) plus writing its files.

use std::path::Path;
use std::process::Command;

#[path = "kit/mod.rs"]
mod kit;
use kit::Runner;

fn run(args: &[&str], out: &Path) {
    let exe = env!("CARGO_BIN_EXE_layloft");
    let output = Command::new(exe).args(args).arg(out).output().expect("layloft runs");
    // Exit status 1 is a failed design check, which still writes everything.
    assert!(
        matches!(output.status.code(), Some(0 | 1)),
        "layloft {args:?} failed: {}",
        String::from_utf8_lossy(&output.stderr)
    );
}

fn bench(c: &mut Runner) {
    let out = tempfile::tempdir().expect("temporary folder");
    let mut g = c.benchmark_group("report");
    g.sample_size(10);
    for (name, file) in
        [("mine-fan", "layups/mine-fan/blade.toml"), ("small-wind", "layups/small-wind/blade.toml")]
    {
        g.bench_function(format!("{name} demo, everything including STL"), |b| {
            b.iter(|| run(&["report", file, "--quiet", "--out"], out.path()))
        });
    }
    g.finish();

    let mut g = c.benchmark_group("sections");
    g.sample_size(20);
    for (name, file) in
        [("mine-fan", "layups/mine-fan/blade.toml"), ("small-wind", "layups/small-wind/blade.toml")]
    {
        g.bench_function(format!("{name} demo"), |b| {
            b.iter(|| {
                let exe = env!("CARGO_BIN_EXE_layloft");
                let status = Command::new(exe)
                    .args(["sections", file, "--quiet"])
                    .stdout(std::process::Stdio::null())
                    .status()
                    .expect("layloft runs");
                assert!(status.success());
            })
        });
    }
    g.finish();

    let mut g = c.benchmark_group("tooling");
    g.sample_size(10);
    g.bench_function("mine-fan demo at 0.025 mm", |b| {
        b.iter(|| {
            run(
                &[
                    "tooling",
                    "layups/mine-fan/blade.toml",
                    "--quiet",
                    "--tolerance-mm",
                    "0.025",
                    "--out",
                ],
                out.path(),
            )
        })
    });
    g.finish();
}

bench_main!(bench);
