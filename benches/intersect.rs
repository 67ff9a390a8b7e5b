//! How the self-intersection check grows with the count of triangles, and its time per triangle.
//!
//! Run with `cargo bench --bench intersect`. The input is fixed: an invented straight NACA 0012
//! blade (0.10 m chord, 30° of twist per metre, trimmed by spheres of 0.401 m and 0.8985 m, as
//! `benches/tooling.rs`), lofted at chordal tolerances from 40 µm down to 0.2 µm, which gives
//! from a few thousand to about a million triangles; a thin closed shell, the shape that defeats
//! a grid sized to the bounding box. Each mesh is checked whole (`check_solid`) with and without
//! the self-intersection test; the difference is the test's time. Medians of several runs.
//!
//! Printed: triangles, the test's time and its time per triangle at each size, wall clock and
//! CPU time of the process, all threads (the kernel's count, Linux; the check runs on all
//! cores for a large mesh), and the exponents `b` of `time ∝ n^b`
//! fitted by least squares on the logarithms (1 is linear growth).
//! Floor, by arithmetic: per triangle the test must at least read its corners and place it in
//! the cells (about 20 ns), and test its neighbours sharing a vertex or an edge (about 6 pairs,
//! each a few dot products: about 40 ns), so about 0.06–0.1 µs per triangle.

use std::time::Instant;

use layloft::mesh::{CheckParams, check_solid};
use layloft::tooling::{ChainEnds, EndKind, EndTrim, FnSurface, LoftParams, Trims, loft_solid};
use layloft::units::Angle;

fn yt(x: f64) -> f64 {
    0.6 * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3)
        - 0.1015 * x.powi(4))
}

/// CPU time of this process so far, s, all its threads (those that have ended included): user
/// and system time from `/proc/self/stat`, in clock ticks of USER_HZ, which Linux fixes at 100
/// a second for this interface (from memory), so 10 ms is the resolution; `None` elsewhere. On a
/// shared machine the wall clock includes the time spent waiting for a core; this does not,
/// and it counts the work of every core the check runs on.
fn process_cpu() -> Option<f64> {
    let text = std::fs::read_to_string("/proc/self/stat").ok()?;
    // The fields after the command name, which is in parentheses and may hold spaces.
    let rest = &text[text.rfind(')')? + 1..];
    let fields: Vec<&str> = rest.split_whitespace().collect();
    // utime and stime are the 14th and 15th fields; `rest` starts at the 3rd.
    let ticks = |k: usize| fields.get(k - 3)?.parse::<f64>().ok();
    Some((ticks(14)? + ticks(15)?) / 100.0)
}

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    v[v.len() / 2]
}

fn main() {
    // `cargo test --benches` runs bench targets with `--bench`-less arguments: skip the work.
    if !std::env::args().any(|a| a == "--bench") {
        return;
    }
    let c = 0.1;
    let surface = FnSurface {
        span: [0.3, 0.95],
        upper: move |_x: f64, u: f64| [(u - 0.25) * c, yt(u) * c],
        lower: move |_x: f64, u: f64| [(u - 0.25) * c, -yt(u) * c],
        chord_angle: |x: f64| Angle::from_deg(30.0 * (0.9 - x)),
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Segment },
    };
    let trims =
        Trims { root: EndTrim::Sphere { radius: 0.401 }, tip: EndTrim::Sphere { radius: 0.8985 } };
    let with = CheckParams::default();
    let without = CheckParams { self_intersection: false, ..CheckParams::default() };
    let mut points = Vec::new();
    println!(
        "{:>10} {:>12} {:>12} {:>10} {:>14} {:>10}",
        "triangles", "check_ms", "intersect_ms", "us/tri", "cpu_intersect", "cpu_us/tri"
    );
    let mut cpu_points = Vec::new();
    for tolerance in [40e-6, 10e-6, 2.5e-6, 0.8e-6, 0.2e-6] {
        let params = LoftParams { tolerance, ..LoftParams::default() };
        let solid = match loft_solid(&surface, &trims, &params) {
            Ok(s) => s,
            Err(e) => panic!("the benchmark blade lofts at {tolerance} m: {e}"),
        };
        let n = solid.mesh.len();
        let runs = if n < 100_000 { 15 } else { 5 };
        // Median wall time of `runs` checks, and their mean CPU time (the process's count is
        // too coarse for one check of a small mesh).
        let time = |p: &CheckParams| {
            let start = process_cpu();
            let wall: Vec<f64> = (0..runs)
                .map(|_| {
                    let t = Instant::now();
                    let s = check_solid(&solid.mesh, "blade", p);
                    assert!(s.is_ok(), "the benchmark blade checks: {s:?}");
                    t.elapsed().as_secs_f64()
                })
                .collect();
            let cpu = process_cpu().zip(start).map(|(b, a)| (b - a) / runs as f64);
            let wall_median = median(wall);
            (wall_median, cpu.unwrap_or(wall_median))
        };
        let ((full, full_cpu), (rest, rest_cpu)) = (time(&with), time(&without));
        let test = (full - rest).max(1e-9);
        let test_cpu = (full_cpu - rest_cpu).max(1e-9);
        println!(
            "{n:>10} {:>12.2} {:>12.2} {:>10.3} {:>14.2} {:>10.3}",
            full * 1e3,
            test * 1e3,
            test * 1e6 / n as f64,
            test_cpu * 1e3,
            test_cpu * 1e6 / n as f64
        );
        points.push(((n as f64).ln(), test.ln()));
        cpu_points.push(((n as f64).ln(), test_cpu.ln()));
    }
    println!("self-intersection time grows as n^{:.3}", slope(&points));
    println!("self-intersection CPU time grows as n^{:.3}", slope(&cpu_points));
}

/// The slope of a least-squares line through `points`.
fn slope(points: &[(f64, f64)]) -> f64 {
    let m = points.len() as f64;
    let (sx, sy) = points.iter().fold((0.0, 0.0), |(a, b), p| (a + p.0, b + p.1));
    let (mx, my) = (sx / m, sy / m);
    let sxy: f64 = points.iter().map(|p| (p.0 - mx) * (p.1 - my)).sum();
    let sxx: f64 = points.iter().map(|p| (p.0 - mx) * (p.0 - mx)).sum();
    sxy / sxx
}
