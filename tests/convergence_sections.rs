//! Convergence of the section solver on the two invented demo blades: doubling the contour points
//! of every analysis station changes EA, EI flap, EI edge and GJ by less than 0.5 %.
//!
//! The acceptance figure of 0.5 % is the sections issue's requirement (a common-practice mesh
//! convergence criterion, no published source). The reference is the same solver at twice the
//! points, so this checks discretisation error, not the theory (the theory is checked against
//! published cases in `tests/validation_section.rs`). The tolerance needs no round-off allowance:
//! the solver's own round-off is near 1e-12. A second check asks that the next doubling changes
//! the results by less than half as much: the discretisation converges rather than drifts.

use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::section::SectionProperties;

const LIMIT_PCT: f64 = 0.5;

/// The project's properties at `points` contour points per section.
fn solved(project: &str, points: usize) -> Vec<SectionProperties> {
    let mut p = read_project(project.as_ref()).expect("demo project reads");
    p.sections.contour_points = points;
    BladeModel::build(p).expect("demo blade solves").properties()
}

fn pct(coarse: f64, fine: f64) -> f64 {
    100.0 * (coarse - fine).abs() / fine.abs()
}

/// The largest change in percent of EA, EI flap, EI edge or GJ over the analysis stations of
/// `project` between `coarse` and `fine` points, with where it occurs; and every change at or
/// above the limit, described.
fn changes(project: &str, coarse: usize, fine: usize) -> ((f64, String), Vec<String>) {
    let (a, b) = (solved(project, coarse), solved(project, fine));
    assert_eq!(a.len(), b.len());
    assert!(a.len() >= 20, "{project}: {} analysis stations", a.len());
    let mut faults = Vec::new();
    let mut worst = (0.0, String::new());
    for (a, b) in a.iter().zip(&b) {
        assert!((a.r - b.r).abs() < 1e-12, "stations differ: {} vs {}", a.r, b.r);
        for (name, x, y) in [
            ("EA", a.ea, b.ea),
            ("EI_flap", a.ei_flap, b.ei_flap),
            ("EI_edge", a.ei_edge, b.ei_edge),
            ("GJ", a.gj, b.gj),
        ] {
            let d = pct(x, y);
            if d > worst.0 {
                worst = (d, format!("{name} at r = {:.4} m", a.r));
            }
            if d >= LIMIT_PCT {
                faults.push(format!(
                    "r = {:.4} m {name}: {x:.6e} at {coarse} points, {y:.6e} at {fine}: {d:.3} %",
                    a.r
                ));
            }
        }
    }
    (worst, faults)
}

fn check(project: &str) {
    let n = read_project(project.as_ref()).expect("demo project reads").sections.contour_points;
    let (worst, faults) = changes(project, n, 2 * n);
    assert!(faults.is_empty(), "{project}:\n{}", faults.join("\n"));
    // The comparison is not empty: the coarse and fine sections are distinct solutions.
    assert!(worst.0 > 0.0, "{project}: coarse and fine results are identical");
    // And the results converge rather than drift: the next doubling changes them by less than
    // half as much (a second-order discretisation gives about a quarter; a first-order one,
    // such as a midline ramp at a ply drop that follows the outline spacing, about a half).
    let (next, _) = changes(project, 2 * n, 4 * n);
    assert!(
        next.0 < 0.5 * worst.0,
        "{project}: {n} -> {} points changes by {:.4} % ({}), {} -> {} by {:.4} % ({})",
        2 * n,
        worst.0,
        worst.1,
        2 * n,
        4 * n,
        next.0,
        next.1
    );
    eprintln!(
        "{project}: worst change {:.4} % ({}) from {n} to {} points, {:.4} % ({}) from {} to {}",
        worst.0,
        worst.1,
        2 * n,
        next.0,
        next.1,
        2 * n,
        4 * n
    );
}

#[test]
fn mine_fan_stiffness_converges_within_half_a_percent() {
    check("layups/mine-fan/blade.toml");
}

#[test]
fn small_wind_stiffness_converges_within_half_a_percent() {
    check("layups/small-wind/blade.toml");
}
