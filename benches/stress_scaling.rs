//! Growth of the cost of `stress` and `check` with the size of the blade: contour points, plies
//! in the schedule and analysis stations, each doubled with the others held, on a generated
//! blade (see `large_blade`). Prints the time of each size and the growth exponent `p` of
//! `time ~ n^p` fitted by least squares on the logarithms; a linear cost gives `p = 1`.
//!
//! Timed: the stress recovery of every load case with the panel checks, keeping the summaries
//! only (what `check` computes after the model is built), and, apart, the model build (sections solved).
//! Medians of three runs (one for the largest sizes).
//!
//! `LAYLOFT_LARGE_BLADE=DIR cargo bench --bench stress_scaling` writes the large blade of the
//! cost target (400 stations, 2,000 plies, 2,000 contour points) into DIR and exits, so that the
//! release binary can be timed on it (`/usr/bin/time -v layloft check DIR`).

#[path = "large_blade/mod.rs"]
mod large_blade;

use std::time::Instant;

use large_blade::Size;
use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::stress::Detail;

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    v[v.len() / 2]
}

/// (model build, stress and check) in seconds.
fn time(size: Size, runs: usize) -> (f64, f64) {
    let dir = tempfile::tempdir().expect("temporary folder");
    let file = large_blade::write(dir.path(), size).expect("write the generated blade");
    let project = read_project(&file).expect("generated project reads");
    let t0 = Instant::now();
    let model = BladeModel::build(project).expect("generated model builds");
    let build = t0.elapsed().as_secs_f64();
    let mut stress = Vec::new();
    for _ in 0..runs {
        let t = Instant::now();
        let cases =
            layloft::stress::analyse_cases_detail(&model, None, Detail::Summary).expect("stress");
        let check = layloft::check::evaluate(&model, &cases, None);
        std::hint::black_box(check);
        stress.push(t.elapsed().as_secs_f64());
    }
    (build, median(stress))
}

fn exponent(xs: &[f64], ys: &[f64]) -> f64 {
    let n = xs.len() as f64;
    let lx: Vec<f64> = xs.iter().map(|x| x.ln()).collect();
    let ly: Vec<f64> = ys.iter().map(|y| y.ln()).collect();
    let (mx, my) = (lx.iter().sum::<f64>() / n, ly.iter().sum::<f64>() / n);
    let sxy: f64 = lx.iter().zip(&ly).map(|(x, y)| (x - mx) * (y - my)).sum();
    let sxx: f64 = lx.iter().map(|x| (x - mx).powi(2)).sum();
    sxy / sxx
}

fn sweep(name: &str, values: &[usize], size: impl Fn(usize) -> Size) {
    let mut times = Vec::new();
    let mut builds = Vec::new();
    for &v in values {
        let runs = if v == *values.last().unwrap_or(&v) { 1 } else { 3 };
        let (b, s) = time(size(v), runs);
        println!(
            "{name:>15} {v:>6}: stress+check {:>9.1} ms, model build {:>9.1} ms",
            s * 1e3,
            b * 1e3
        );
        times.push(s);
        builds.push(b);
    }
    let xs: Vec<f64> = values.iter().map(|&v| v as f64).collect();
    println!(
        "{name:>15}: growth exponent of stress+check {:.2}, of the model build {:.2}",
        exponent(&xs, &times),
        exponent(&xs, &builds)
    );
}

fn main() {
    if let Ok(dir) = std::env::var("LAYLOFT_LARGE_BLADE") {
        let dir = std::path::PathBuf::from(dir);
        std::fs::create_dir_all(&dir).expect("create the folder");
        let file = large_blade::write(&dir, Size { stations: 400, plies: 2000, points: 2000 })
            .expect("write the large blade");
        println!("wrote {}", file.display());
        return;
    }
    // `cargo bench` passes `--bench`; any other argument is a filter on the sweep name.
    let filter: Vec<String> = std::env::args().skip(1).filter(|a| !a.starts_with("--")).collect();
    let wanted = |name: &str| filter.is_empty() || filter.iter().any(|f| name.contains(f.as_str()));
    if wanted("contour points") {
        sweep("contour points", &[250, 500, 1000, 2000], |points| Size {
            stations: 20,
            plies: 400,
            points,
        });
    }
    if wanted("plies") {
        sweep("plies", &[250, 500, 1000, 2000], |plies| Size { stations: 20, plies, points: 500 });
    }
    if wanted("stations") {
        sweep("stations", &[50, 100, 200, 400], |stations| Size {
            stations,
            plies: 400,
            points: 500,
        });
    }
}
