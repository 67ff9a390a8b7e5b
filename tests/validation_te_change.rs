//! Tooling for blades whose trailing edge changes kind along the span: a round (elliptic) closed
//! root turning into a flat-backed section and a sharp tip, and a blunt root turning sharp
//! outboard. The loft keeps one grid: a blunt base whose length goes to zero at the sharp
//! stations, the edges it leaves there contracted.
//!
//! Test blades (invented): copies of the round-root demo (`layups/round-root/`, an invented
//! scenario) with other stations.
//!
//! Sources and methods:
//! - Closed, outward meshes without degenerate facets or self-intersection: the library's mesh
//!   check (`check_solid`).
//! - Outer volume: Cavalieri's principle, V = ∫ A(r) dr between planar ends, with the section
//!   areas A(r) from the section solver's own outline ([`Blade::outline`], shoelace formula on
//!   4000 points) integrated by composite Simpson's rule station interval by station interval,
//!   independently of the mesh code. A facet lies within the chordal tolerance `tol` of the
//!   surface, so the volume may differ by up to `tol` times the surface area.
//! - Draft: a facet of outward normal `n` leaves a part pulled along `d` when `n · d ≥ 0` (the
//!   library's draft evaluator; the rule is common practice of mould design).
//! - A formula surface whose blunt base closes up along the span: section area
//!   A(x) = c (4h/π + g(x)/2) for chains z = ±(h sin πu + u g/2), y = c u (integrals of sin and
//!   of u over [0, 1]), g(x) piecewise linear, so V = c (4h/π L + ½ ∫ g dx), the trapezoid of g
//!   exact.
//! - Volume balance: disjoint solids that fill a box add up to its volume (Cavalieri); the
//!   sockets' clearance is the only intended gap, well under 0.1 % of the block.

use std::path::{Path, PathBuf};

use layloft::blade::Blade;
use layloft::input::read_project;
use layloft::mesh::{CheckParams, check_solid};
use layloft::tooling::{
    BladeTooling, ChainEnds, EndKind, EndShape, FnSurface, LoftParams, PartKind, ToolingParams,
    Trims, build_tooling, loft_solid, trailing_edge_kind,
};
use layloft::units::Angle;
use std::f64::consts::PI;

use crate::validation_blade_tooling::outer_volume_by_slices;

/// An elliptic root (closed, so its trailing edge is a point), a flat-backed section (blunt) and
/// sharp NACA sections outboard.
const ROUND_BLUNT_SHARP: &str = "\
# INVENTED TEST DATA: an elliptic root turning into a flat-backed section, sharp outboard.
r_m,chord_m,twist_deg,pitch_axis_frac,airfoil
0.20,0.110,28.0,0.50,ellipse:0.8
0.26,0.110,28.0,0.50,ellipse:0.8
0.40,0.200,24.0,0.35,flatback-25.dat
0.60,0.190,19.0,0.33,naca4418-closed
0.90,0.160,15.0,0.33,naca4415-closed
1.20,0.120,12.0,0.33,naca4412-closed
";

/// A blunt root (the flat-backed section and the open NACA section) turning sharp outboard.
const BLUNT_SHARP: &str = "\
# INVENTED TEST DATA: blunt trailing edges at the root, sharp outboard.
r_m,chord_m,twist_deg,pitch_axis_frac,airfoil
0.20,0.200,26.0,0.35,flatback-25.dat
0.40,0.200,24.0,0.35,flatback-25.dat
0.60,0.190,19.0,0.33,naca4418
0.90,0.160,15.0,0.33,naca4415-closed
1.20,0.120,12.0,0.33,naca4412-closed
";

/// A copy of the round-root demo in `dir` with the stations `stations`.
fn copy_demo(dir: &Path, stations: &str) -> PathBuf {
    crate::support_run::copy_demo("round-root", dir);
    std::fs::write(dir.join("stations.csv"), stations).unwrap();
    dir.join("blade.toml")
}

fn blade(dir: &Path, stations: &str) -> Blade {
    let project = read_project(&copy_demo(dir, stations)).expect("the project reads");
    Blade::from_project(&project).expect("the blade lofts")
}

/// The tooling without casting moulds (not what is tested here), at `tol`, with `ends`.
fn build(blade: &Blade, tol: f64, ends: EndShape, print_fraction: f64) -> BladeTooling {
    let params = ToolingParams {
        tolerance: tol,
        ends,
        print_fraction,
        casting: None,
        ..ToolingParams::default()
    };
    build_tooling(blade, &params, &mut |_, _, _| {}).unwrap_or_else(|e| panic!("{e}"))
}

/// Every part closed, outward, without degenerate facets or self-intersection.
fn every_part_checks(t: &BladeTooling) {
    for p in &t.parts {
        check_solid(&p.mesh, &p.name, &CheckParams::default())
            .unwrap_or_else(|e| panic!("{}: {e}", p.name));
    }
}

/// The outer solid (shell with its cores filled back in, planar ends, no prints) has the volume
/// of the section solver's outline integrated along the span.
fn outer_volume_matches_slices(stations: &str) {
    let dir = tempfile::tempdir().unwrap();
    let blade = blade(dir.path(), stations);
    let exact = outer_volume_by_slices(&blade, 40);
    let coarse = outer_volume_by_slices(&blade, 20);
    assert!((coarse / exact - 1.0).abs() < 1e-6, "Simpson: {coarse} vs {exact}");
    let tol = 0.2e-3;
    let t = build(&blade, tol, EndShape::Planes, 0.0);
    every_part_checks(&t);
    let v: f64 = t
        .parts
        .iter()
        .filter(|p| matches!(p.kind, PartKind::Core | PartKind::Shell))
        .map(|p| p.nominal_volume)
        .sum();
    let shell = t.parts.iter().find(|p| p.name == "shell").expect("a shell");
    let s = check_solid(&shell.mesh, "shell", &CheckParams::default()).expect("checked");
    let err = (v - exact).abs();
    eprintln!("outer volume {v:.6e} m³, slices {exact:.6e}, rel {:.2e}", err / exact);
    assert!(err <= tol * s.area, "{v} vs {exact}");
}

/// The whole set with spherical ends and prints: every part checks, every mould part draws
/// along its pull, and the mould parts, shell and cores fill the block within 0.1 %.
fn mould_draws_and_fills_the_block(stations: &str) {
    let dir = tempfile::tempdir().unwrap();
    let blade = blade(dir.path(), stations);
    let t = build(&blade, 0.3e-3, EndShape::Spheres, ToolingParams::default().print_fraction);
    every_part_checks(&t);
    let moulds: Vec<_> = t.parts.iter().filter(|p| p.kind.is_mould()).collect();
    let halves = t.mould_halves();
    assert_eq!(moulds.len(), halves.len());
    for (p, h) in moulds.iter().zip(&halves) {
        eprintln!(
            "{}: least draft {:.4}°, below the least {:.3e} m², undercut {:.3e} m²",
            p.name,
            h.draft.min_draft.deg(),
            h.draft.below_min_area,
            h.draft.undercut_area
        );
        assert!(h.draft.undercut_area == 0.0, "{}: {:?}", p.name, h.undercuts);
        // Below the least draft only beside the parting lines, where the silhouette is
        // parallel to the pull: a small share of the cavity.
        assert!(h.draft.below_min_area < 0.02 * h.cavity_area, "{}", p.name);
    }
    let volume = |mould: bool| -> f64 {
        t.parts.iter().filter(|p| p.kind.is_mould() == mould).map(|p| p.mesh.signed_volume()).sum()
    };
    let [x, y, z] = match &t.modular {
        Some(m) => m.block_size,
        None => t.moulds[0].block_size,
    };
    let block = x * y * z;
    let gap = block - (volume(true) + volume(false));
    eprintln!("block {block:.6e} m³, gap {gap:.4e} m³ ({:.3e})", gap / block);
    assert!(gap >= 0.0 && gap < 1e-3 * block, "gap {gap:e} m³ of {block:e}");
}

#[test]
fn a_trailing_edge_that_changes_kind_is_lofted_with_a_base_of_no_length() {
    for stations in [ROUND_BLUNT_SHARP, BLUNT_SHARP] {
        let dir = tempfile::tempdir().unwrap();
        let blade = blade(dir.path(), stations);
        let blunt = blade.surfaces().blunt_trailing_edges();
        assert!(blunt.contains(&true) && blunt.contains(&false), "{blunt:?}");
        assert_eq!(trailing_edge_kind(&blade).expect("a kind"), EndKind::Segment);
    }
}

#[test]
fn round_to_blunt_to_sharp_outer_volume_matches_the_outline_by_slices() {
    outer_volume_matches_slices(ROUND_BLUNT_SHARP);
}

#[test]
fn blunt_to_sharp_outer_volume_matches_the_outline_by_slices() {
    outer_volume_matches_slices(BLUNT_SHARP);
}

#[test]
fn round_to_blunt_to_sharp_mould_draws_and_fills_the_block() {
    mould_draws_and_fills_the_block(ROUND_BLUNT_SHARP);
}

#[test]
fn blunt_to_sharp_mould_draws_and_fills_the_block() {
    mould_draws_and_fills_the_block(BLUNT_SHARP);
}

#[test]
fn a_formula_blade_whose_base_closes_up_lofts_closed_with_the_exact_volume() {
    // An invented twisted section of chord c with a blunt base g(x): none inboard of x1, growing
    // linearly to g0 at x2, held beyond, so both ways of closing up occur (a sharp stretch, then
    // blunt) and the first one twice (the loft also runs the other way round, see below).
    let (c, h, g0, x1, x2) = (0.08, 0.012, 0.006, 0.35, 0.55);
    let g = move |x: f64| g0 * ((x - x1) / (x2 - x1)).clamp(0.0, 1.0);
    let chain = move |sign: f64| {
        move |x: f64, u: f64| [c * u - 0.3 * c, sign * (h * (PI * u).sin() + 0.5 * u * g(x))]
    };
    for reversed in [false, true] {
        let flip = move |x: f64| if reversed { 0.9 - x } else { x };
        let surface = FnSurface {
            span: [0.15, 0.75],
            upper: move |x: f64, u: f64| chain(1.0)(flip(x), u),
            lower: move |x: f64, u: f64| chain(-1.0)(flip(x), u),
            chord_angle: |x: f64| Angle::from_deg(40.0 * x),
            ends: ChainEnds { front: EndKind::Point, back: EndKind::Segment },
        };
        let (a, b) = (0.2, 0.7);
        let tol = 0.02e-3;
        let params = LoftParams { tolerance: tol, ..LoftParams::default() };
        let solid = loft_solid(&surface, &Trims::planes(a, b), &params).expect("the loft");
        let s = check_solid(&solid.mesh, "formula", &CheckParams::default()).expect("checked");
        assert_eq!(s.shells, 1);
        // ∫ g dx over [a, b] (trapezoid of a piecewise linear function, exact): nothing to x1,
        // a ramp of g0 (x2 − x1) / 2, then g0 to the end; the reversed blade, g(0.9 − x) over
        // [0.2, 0.7], has the same integral.
        let int_g = 0.5 * g0 * (x2 - x1) + g0 * (b - x2);
        let exact = c * (4.0 * h / PI * (b - a) + 0.5 * int_g);
        let err = (s.volume - exact).abs();
        eprintln!(
            "reversed {reversed}: {:.6e} m³ against {exact:.6e}, rel {:.2e}",
            s.volume,
            err / exact
        );
        assert!(err <= tol * s.area, "{} vs {exact}", s.volume);
        // No edge shorter than the collapse length is left (a fiftieth of the tolerance).
        for t in &solid.mesh.triangles {
            for k in 0..3 {
                let (p, q) = (
                    solid.mesh.vertices[t[k] as usize],
                    solid.mesh.vertices[t[(k + 1) % 3] as usize],
                );
                let d =
                    ((p[0] - q[0]).powi(2) + (p[1] - q[1]).powi(2) + (p[2] - q[2]).powi(2)).sqrt();
                assert!(d >= 0.02 * tol, "an edge of {d:e} m at {p:?}");
            }
        }
    }
}
