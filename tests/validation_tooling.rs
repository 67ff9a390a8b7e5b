//! The tooling geometry kernel against closed forms and independent integration.
//!
//! Sources:
//! - NACA 0012 thickness: Abbott & von Doenhoff, *Theory of Wing Sections*, Dover 1959, §6.4
//!   (after NACA Report 824, 1945): `y_t = 5t(0.2969√x − 0.1260x − 0.3516x² + 0.2843x³ −
//!   0.1015x⁴)`, open trailing edge. Its area is integrated here, independently of the mesh code,
//!   both term by term and by composite Simpson's rule.
//! - Cavalieri's principle: a solid whose sections at every x are congruent (a twisted prism) has
//!   the volume of the untwisted prism.
//! - Solids between two spheres about the origin: the volume over a section S is
//!   `∫_S (√(R_t² − ρ²) − √(R_r² − ρ²)) dA` (integration in cylindrical coordinates; the twist
//!   map has unit Jacobian), closed form for an annulus, Gauss–Legendre × Simpson for the
//!   NACA section.
//!
//! - Mould halves: a rigid turn of a section by ψ turns its surface normals by ψ (geometry);
//!   the halves, the part and the socket clearances fill the block (volume of a box).
//!
//! Tolerances: a facet lies within the chordal tolerance `tol` of the surface, so the volume can
//! differ by at most about `tol` times the surface area; the assertions use that bound.

use std::f64::consts::PI;

use crate::support_stl::closed_outward;

use layloft::mesh::{
    CheckParams, LengthUnit, Mesh, MeshError, StlFormat, StlOptions, box_mesh, check_solid,
    encode_part_set_knowing,
};
use layloft::output::write_parts;
use layloft::tooling::{
    ChainEnds, EndKind, FnSurface, LoftParams, MouldParams, SilhouetteSurface, SpanSurface, Trims,
    build_mould_parts, build_moulds, loft_annulus, loft_hollow, loft_solid, split_cells,
};
use layloft::units::Angle;

/// NACA 00xx half-thickness per chord, open trailing edge (Abbott & von Doenhoff §6.4).
fn yt(t: f64, x: f64) -> f64 {
    5.0 * t
        * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3)
            - 0.1015 * x.powi(4))
}

/// Composite Simpson's rule on [a, b] with n (even) intervals.
fn simpson(f: impl Fn(f64) -> f64, a: f64, b: f64, n: usize) -> f64 {
    let h = (b - a) / n as f64;
    let inner: f64 = (1..n).map(|i| f(a + h * i as f64) * if i % 2 == 1 { 4.0 } else { 2.0 }).sum();
    (f(a) + f(b) + inner) * h / 3.0
}

/// Section area per c² between chord fractions a and b, by Simpson in s = √x (which removes the
/// square-root singularity at the leading edge).
fn naca_area_between(t: f64, a: f64, b: f64) -> f64 {
    simpson(|s| 2.0 * yt(t, s * s) * 2.0 * s, a.sqrt(), b.sqrt(), 4000)
}

/// A straight NACA 0012 blade: chord c, pitch axis at a quarter chord, chord angle `phi(x)`.
fn naca_blade(c: f64, span: [f64; 2], phi: impl Fn(f64) -> Angle) -> impl SpanSurface {
    FnSurface {
        span,
        upper: move |_x: f64, u: f64| [(u - 0.25) * c, yt(0.12, u) * c],
        lower: move |_x: f64, u: f64| [(u - 0.25) * c, -yt(0.12, u) * c],
        chord_angle: phi,
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Segment },
    }
}

fn circle(r: f64) -> impl SpanSurface {
    FnSurface {
        span: [0.0, 2.0],
        upper: move |_x: f64, u: f64| [-r * (PI * u).cos(), r * (PI * u).sin()],
        lower: move |_x: f64, u: f64| [-r * (PI * u).cos(), -r * (PI * u).sin()],
        chord_angle: |_x: f64| Angle::ZERO,
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
    }
}

fn params(tol: f64) -> LoftParams {
    LoftParams { tolerance: tol, ..LoftParams::default() }
}

fn check(mesh: &Mesh, part: &str) -> layloft::mesh::MeshSummary {
    match check_solid(mesh, part, &CheckParams::default()) {
        Ok(s) => s,
        Err(e) => panic!("{e}"),
    }
}

#[test]
fn naca_0012_area_by_two_independent_integrations() {
    // Term by term: 2·5t(0.2969·2/3 − 0.1260/2 − 0.3516/3 + 0.2843/4 − 0.1015/5).
    let exact = 10.0
        * 0.12
        * (0.2969 * 2.0 / 3.0 - 0.1260 / 2.0 - 0.3516 / 3.0 + 0.2843 / 4.0 - 0.1015 / 5.0);
    let numeric = naca_area_between(0.12, 0.0, 1.0);
    assert!((numeric - exact).abs() < 1e-12, "{numeric} {exact}");
    // REFERENCES.md: 0.082210 c² (open trailing edge, recomputed); six digits.
    assert!((exact - 0.082210).abs() < 5e-7, "{exact}");
}

#[test]
fn prismatic_naca_0012_volume_is_area_times_length_and_converges() {
    let c = 0.2;
    let (x0, x1) = (0.2, 1.0);
    let blade = naca_blade(c, [0.1, 1.1], |_x| Angle::ZERO);
    let exact = naca_area_between(0.12, 0.0, 1.0) * c * c * (x1 - x0);
    let mut last = f64::INFINITY;
    for tol in [2e-4, 2e-5, 2e-6] {
        let solid = loft_solid(&blade, &Trims::planes(x0, x1), &params(tol)).unwrap();
        let s = check(&solid.mesh, "prism");
        let err = (s.volume - exact).abs();
        // Bound: tolerance times the surface area.
        assert!(
            err <= tol * s.area,
            "tol {tol}: volume error {err:e} m³, bound {:e}",
            tol * s.area
        );
        assert!(err < 0.5 * last, "tol {tol}: error {err:e} did not fall from {last:e}");
        eprintln!(
            "prism tol {tol:e} m: {} triangles, relative volume error {:.3e}",
            s.triangles,
            err / exact
        );
        last = err;
    }
}

#[test]
fn twisted_naca_0012_with_planar_ends_keeps_the_prism_volume() {
    // Cavalieri: sections x = const are congruent whatever the twist (here 40° over 0.8 m).
    let c = 0.15;
    let blade = naca_blade(c, [0.1, 1.1], |x| Angle::from_deg(50.0 * (x - 0.2)));
    let tol = 1e-5;
    let solid = loft_solid(&blade, &Trims::planes(0.2, 1.0), &params(tol)).unwrap();
    let s = check(&solid.mesh, "twisted prism");
    let exact = naca_area_between(0.12, 0.0, 1.0) * c * c * 0.8;
    assert!((s.volume - exact).abs() <= tol * s.area, "{} vs {exact}", s.volume);
}

/// Closed form for an annulus ri..ro between spheres Rr < Rt about the origin.
fn annulus_between_spheres(ri: f64, ro: f64, rr: f64, rt: f64) -> f64 {
    let g = |r: f64, rho: f64| (r * r - rho * rho).powf(1.5);
    2.0 * PI / 3.0 * (g(rt, ri) - g(rt, ro) - g(rr, ri) + g(rr, ro))
}

#[test]
fn circular_tube_has_the_annular_volume() {
    let (ro, ri) = (0.05, 0.04);
    let (outer, inner) = (circle(ro), circle(ri));
    let mut last = f64::INFINITY;
    for tol in [1e-4, 1e-5, 1e-6] {
        // Planar ends: pi (R² − r²) L.
        let tube = loft_annulus(&outer, &inner, &Trims::planes(0.5, 1.5), &params(tol)).unwrap();
        let s = check(&tube.mesh, "tube");
        assert_eq!(s.shells, 1);
        let exact = PI * (ro * ro - ri * ri) * 1.0;
        let err = (s.volume - exact).abs();
        assert!(err <= tol * s.area, "tol {tol}: {err:e}");
        assert!(err < 0.5 * last, "tol {tol}: {err:e} after {last:e}");
        eprintln!(
            "tube tol {tol:e} m: {} triangles, relative volume error {:.3e}",
            s.triangles,
            err / exact
        );
        last = err;
    }
    // Spherical ends: the closed form from cylindrical coordinates.
    let tol = 1e-5;
    let tube = loft_annulus(&outer, &inner, &Trims::spheres(0.6, 1.4), &params(tol)).unwrap();
    let s = check(&tube.mesh, "tube");
    let exact = annulus_between_spheres(ri, ro, 0.6, 1.4);
    assert!((s.volume - exact).abs() <= tol * s.area, "{} vs {exact}", s.volume);
}

/// ∫ over the NACA 0012 section (chord c) of f(ρ), ρ² = y² + z² in the chord frame.
fn integrate_over_naca(c: f64, f: impl Fn(f64) -> f64) -> f64 {
    // 8-point Gauss–Legendre across the thickness, Simpson in s = √(x/c) along the chord.
    const GL: [(f64, f64); 4] = [
        (0.183_434_642_495_649_8, 0.362_683_783_378_362),
        (0.525_532_409_916_329, 0.313_706_645_877_887_3),
        (0.796_666_477_413_626_7, 0.222_381_034_453_374_5),
        (0.960_289_856_497_536_3, 0.101_228_536_290_376_3),
    ];
    simpson(
        |s| {
            let u = s * s;
            let (y, h) = ((u - 0.25) * c, yt(0.12, u) * c);
            let across: f64 =
                GL.iter().map(|&(z, w)| w * (f(y.hypot(h * z)) + f(y.hypot(-h * z)))).sum::<f64>()
                    * h;
            across * 2.0 * s * c
        },
        0.0,
        1.0,
        4000,
    )
}

#[test]
fn sphere_trimmed_blade_ends_on_its_spheres_at_every_pitch() {
    // An invented fan: hub 0.40 m, tip 0.90 m, clearances 1.0 mm and 1.5 mm; chord 0.10 m.
    let (r_hub, r_tip, root_gap, tip_gap) = (0.40, 0.90, 1.0e-3, 1.5e-3);
    let (rr, rt) = (r_hub + root_gap, r_tip - tip_gap);
    let c = 0.1;
    let tol = 1e-5;
    let exact =
        integrate_over_naca(c, |rho| (rt * rt - rho * rho).sqrt() - (rr * rr - rho * rho).sqrt());
    let mut clearances = Vec::new();
    for pitch in [-15.0, 0.0, 12.5, 30.0] {
        let blade = naca_blade(c, [0.3, 0.95], move |x| Angle::from_deg(pitch + 30.0 * (0.9 - x)));
        let solid = loft_solid(&blade, &Trims::spheres(rr, rt), &params(tol)).unwrap();
        let m = &solid.mesh;
        let s = check(m, "blade");
        // Volume against the independent integration (twist and pitch do not change it).
        assert!((s.volume - exact).abs() <= tol * s.area, "pitch {pitch}: {} vs {exact}", s.volume);
        // Tip vertices, found from the facets that face along the radius: on the sphere.
        let r = |p: [f64; 3]| (p[0] * p[0] + p[1] * p[1] + p[2] * p[2]).sqrt();
        let mut tip = 0;
        for t in 0..m.len() {
            let n = m.triangle_normal(t);
            let ctr = m.triangle_centroid(t);
            let radial = (n[0] * ctr[0] + n[1] * ctr[1] + n[2] * ctr[2]) / r(ctr);
            if radial > 0.9 {
                for p in m.corners(t) {
                    assert!((r(p) / rt - 1.0).abs() < 1e-9, "tip vertex at {} m", r(p));
                    tip += 1;
                }
            }
        }
        assert!(tip > 100, "{tip}");
        for &v in &solid.tip_ring {
            assert!((r(m.vertices[v as usize]) / rt - 1.0).abs() < 1e-9);
        }
        for &v in &solid.root_ring {
            assert!((r(m.vertices[v as usize]) / rr - 1.0).abs() < 1e-9);
        }
        // Least clearance to the duct sphere of radius r_tip.
        let reach = m.vertices.iter().map(|&p| r(p)).fold(0.0, f64::max);
        clearances.push(r_tip - reach);
    }
    for gap in &clearances {
        assert!((gap - tip_gap).abs() < 1e-9 * r_tip, "clearance {gap} m");
    }
}

#[test]
fn a_planar_tip_leaves_an_uneven_gap_that_the_sphere_removes() {
    // Contrast: trimmed by the plane x = R, the tip's distance from the rotor centre spreads
    // across the chord by about (c/2)²/2R; by the sphere it does not spread at all.
    let blade = naca_blade(0.1, [0.3, 0.95], |_x| Angle::from_deg(20.0));
    let spread = |trims: Trims| {
        let solid = loft_solid(&blade, &trims, &params(1e-5)).unwrap();
        let r: Vec<f64> = solid
            .tip_ring
            .iter()
            .map(|&v| {
                let p = solid.mesh.vertices[v as usize];
                (p[0] * p[0] + p[1] * p[1] + p[2] * p[2]).sqrt()
            })
            .collect();
        r.iter().fold(0.0f64, |a, &b| a.max(b)) - r.iter().fold(f64::INFINITY, |a, &b| a.min(b))
    };
    assert!(spread(Trims::planes(0.41, 0.8985)) > 1e-3);
    assert!(spread(Trims::spheres(0.41, 0.8985)) < 1e-9);
}

#[test]
fn cells_between_webs_add_up_and_match_their_strips() {
    // Webs at 30 % and 60 % chord; each cell's volume is the section strip between them times
    // the length (planar ends), the strips integrated independently by Simpson's rule.
    let c = 0.2;
    let blade = naca_blade(c, [0.1, 1.1], |x| Angle::from_deg(10.0 * x));
    let w1 = |_x: f64| (0.30 - 0.25) * 0.2;
    let w2 = |_x: f64| (0.60 - 0.25) * 0.2;
    let cells = split_cells(&blade, &[&w1, &w2]).unwrap();
    assert_eq!(cells.len(), 3);
    let bounds = [(0.0, 0.3), (0.3, 0.6), (0.6, 1.0)];
    let tol = 1e-5;
    for (cell, (a, b)) in cells.iter().zip(bounds) {
        let solid = loft_solid(cell, &Trims::planes(0.2, 1.0), &params(tol)).unwrap();
        let s = check(&solid.mesh, "core");
        let exact = naca_area_between(0.12, a, b) * c * c * 0.8;
        assert!((s.volume - exact).abs() <= tol * s.area, "cell {a}..{b}: {} vs {exact}", s.volume);
    }
    assert_eq!(cells[1].ends(), ChainEnds { front: EndKind::Segment, back: EndKind::Segment });
}

#[test]
fn hollow_shell_has_outer_less_inner_volume_and_two_shells() {
    // Tube walls with closed ends: the inner trims sit 2 mm inside the outer ones.
    let (outer, inner) = (circle(0.05), circle(0.045));
    let tol = 1e-5;
    let solid = loft_hollow(
        &outer,
        &Trims::spheres(0.5, 1.2),
        &inner,
        &Trims::spheres(0.502, 1.198),
        &params(tol),
    )
    .unwrap();
    let s = check(&solid.mesh, "shell");
    assert_eq!(s.shells, 2);
    let disc = |r: f64, rr: f64, rt: f64| annulus_between_spheres(0.0, r, rr, rt);
    let exact = disc(0.05, 0.5, 1.2) - disc(0.045, 0.502, 1.198);
    assert!((s.volume - exact).abs() <= tol * s.area, "{} vs {exact}", s.volume);
    // The same shell with its cavity turned outward is refused.
    let cavity = loft_solid(&inner, &Trims::spheres(0.502, 1.198), &params(tol)).unwrap().mesh;
    let mut bad = loft_solid(&outer, &Trims::spheres(0.5, 1.2), &params(tol)).unwrap().mesh;
    bad.merge(&cavity);
    let e = check_solid(&bad, "shell", &CheckParams::default()).unwrap_err();
    assert!(matches!(e, MeshError::Facing { role: "cavity surface", .. }), "{e}");
}

#[test]
fn written_stl_reads_back_closed_manifold_and_outward() {
    let blade = naca_blade(0.1, [0.3, 0.95], |x| Angle::from_deg(30.0 * (0.9 - x)));
    let solid = loft_solid(&blade, &Trims::spheres(0.401, 0.8985), &params(2e-5)).unwrap();
    let tube = loft_annulus(&circle(0.05), &circle(0.04), &Trims::spheres(0.6, 1.4), &params(2e-5))
        .unwrap();
    let dir = tempfile::tempdir().unwrap();
    for format in [StlFormat::Binary, StlFormat::Ascii] {
        let options = StlOptions { unit: LengthUnit::Millimetre, format };
        let out = dir.path().join(format!("{format:?}"));
        let parts = [("blade", &solid.mesh), ("tube", &tube.mesh)];
        let written = write_parts(&out, &parts, &options, &CheckParams::default()).unwrap();
        for (w, (_, mesh)) in written.iter().zip(parts) {
            let mut file = std::fs::File::open(&w.path).unwrap();
            let read = stl_io::read_stl(&mut file).unwrap();
            assert_eq!(read.faces.len(), mesh.len());
            let (manifold, vol_mm3) = closed_outward(&read);
            assert!(manifold, "{}: not a closed 2-manifold", w.path.display());
            // mm³ against m³ × 1e9; single precision leaves about 1e-6 relative.
            let want = mesh.signed_volume() * 1e9;
            assert!(vol_mm3 > 0.0 && (vol_mm3 / want - 1.0).abs() < 1e-5, "{vol_mm3} vs {want}");
        }
        if format == StlFormat::Ascii {
            let text = std::fs::read_to_string(out.join("blade.stl")).unwrap();
            assert!(text.starts_with("solid layloft-blade\n"), "{}", &text[..40]);
            assert!(text.trim_end().ends_with("endsolid layloft-blade"));
        }
    }
}

fn tube_mesh() -> Mesh {
    loft_solid(&circle(0.05), &Trims::planes(0.5, 1.0), &params(1e-4)).unwrap().mesh
}

#[test]
fn broken_meshes_are_refused_naming_the_place() {
    let good = tube_mesh();
    check(&good, "core");
    // A hole: the open edge is an edge of the removed triangle.
    let mut hole = good.clone();
    let gone = hole.triangles.remove(10);
    let e = check_solid(&hole, "core", &CheckParams::default()).unwrap_err();
    let msg = e.to_string();
    assert!(msg.starts_with("core: the surface is open") && msg.contains(") mm"), "{msg}");
    if let MeshError::OpenEdge { a, b, .. } = e {
        let corners: Vec<[f64; 3]> = gone.iter().map(|&i| good.vertices[i as usize]).collect();
        assert!(corners.contains(&a.point) && corners.contains(&b.point));
    } else {
        panic!("{msg}");
    }
    // A triangle turned over is named.
    let mut flipped = good.clone();
    flipped.triangles[7].swap(0, 1);
    let e = check_solid(&flipped, "core", &CheckParams::default()).unwrap_err();
    assert!(matches!(e, MeshError::Orientation { triangle: 7, .. }), "{e}");
    // A duplicated triangle makes edges with three triangles.
    let mut dup = good.clone();
    dup.triangles.push(dup.triangles[3]);
    let e = check_solid(&dup, "core", &CheckParams::default()).unwrap_err();
    assert!(matches!(e, MeshError::NonManifoldEdge { count: 3, .. }), "{e}");
    // Inside out.
    let mut inside_out = good.clone();
    inside_out.flip();
    let e = check_solid(&inside_out, "core", &CheckParams::default()).unwrap_err();
    assert!(matches!(e, MeshError::Facing { role: "outer surface", .. }), "{e}");
    // Two closed boxes that overlap: each is fine, together they intersect.
    let mut boxes = box_mesh([0.0; 3], [1.0; 3]);
    boxes.merge(&box_mesh([0.5, 0.5, 0.5], [1.5, 1.5, 1.5]));
    let e = check_solid(&boxes, "mould", &CheckParams::default()).unwrap_err();
    assert!(matches!(e, MeshError::SelfIntersection { .. }), "{e}");
    assert!(e.to_string().contains("mould: the surface intersects itself: triangles"), "{e}");
    // Two boxes sharing one corner vertex: not a 2-manifold there.
    let mut touching = box_mesh([0.0; 3], [1.0; 3]);
    touching.merge(&box_mesh([1.0; 3], [2.0; 3]));
    touching.weld(1e-12).unwrap();
    let e = check_solid(&touching, "core", &CheckParams::default()).unwrap_err();
    assert!(matches!(e, MeshError::NonManifoldVertex { fans: 2, .. }), "{e}");
    assert!(e.to_string().contains("(1000.000, 1000.000, 1000.000) mm"), "{e}");
}

#[test]
fn a_part_known_clear_skips_the_self_intersection_test_alone() {
    // Two overlapping closed boxes intersect (found by the test); flagged as known clear, the
    // test is not repeated for that part only, and every other check still is.
    let mut boxes = box_mesh([0.0; 3], [1.0; 3]);
    boxes.merge(&box_mesh([0.5, 0.5, 0.5], [1.5, 1.5, 1.5]));
    let good = box_mesh([3.0; 3], [4.0; 3]);
    let options = StlOptions { unit: LengthUnit::Millimetre, format: StlFormat::Binary };
    let run = |parts: &[(&str, &Mesh)], clear: &[bool]| {
        encode_part_set_knowing(
            parts,
            &[],
            clear,
            &options,
            &CheckParams::default(),
            &mut |_, _, _| {},
        )
    };
    let e = run(&[("a", &good), ("b", &boxes)], &[]).unwrap_err();
    assert!(matches!(e, MeshError::SelfIntersection { .. }), "{e}");
    let e = run(&[("a", &good), ("b", &boxes)], &[true]).unwrap_err();
    assert!(matches!(e, MeshError::SelfIntersection { .. }), "only part a was flagged: {e}");
    let e = run(&[("a", &good), ("b", &boxes)], &[false, false]).unwrap_err();
    assert!(matches!(e, MeshError::SelfIntersection { .. }), "{e}");
    let encoded = run(&[("a", &good), ("b", &boxes)], &[false, true]).expect("b flagged");
    assert_eq!(encoded.len(), 2);
    // A hole is still found in a part flagged clear.
    let mut open = good.clone();
    open.triangles.pop();
    let e = run(&[("a", &open)], &[true]).unwrap_err();
    assert!(matches!(e, MeshError::OpenEdge { .. }), "{e}");
}

#[test]
fn an_inner_surface_whose_chains_cross_is_found_self_intersecting() {
    // Like an inner surface offset past a thin trailing edge: the chains cross at 70 % chord.
    let h = |u: f64| 0.03 * u.sqrt() * (0.7 - u) * (1.0 - u).max(0.05);
    let crossed = FnSurface {
        span: [0.0, 1.0],
        upper: move |_x: f64, u: f64| [0.1 * u, h(u)],
        lower: move |_x: f64, u: f64| [0.1 * u, -h(u)],
        chord_angle: |_x: f64| Angle::ZERO,
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
    };
    let solid = loft_solid(&crossed, &Trims::planes(0.2, 0.8), &params(1e-5)).unwrap();
    let e = check_solid(&solid.mesh, "core-1", &CheckParams::default()).unwrap_err();
    assert!(matches!(e, MeshError::SelfIntersection { .. }), "{e}");
}

#[test]
fn bad_parameters_get_clear_messages() {
    let blade = naca_blade(0.1, [0.3, 0.95], |_x| Angle::ZERO);
    let trims = Trims::spheres(0.401, 0.8985);
    for tol in [0.0, -1e-5, f64::NAN] {
        let e = loft_solid(&blade, &trims, &params(tol)).unwrap_err();
        assert!(
            e.to_string().starts_with("chordal tolerance (m) must be a positive length"),
            "{e}"
        );
    }
    // A tip clearance larger than the blade puts the tip trim below the root trim.
    let e = loft_solid(&blade, &Trims::spheres(0.401, 0.38), &params(1e-4)).unwrap_err();
    assert!(
        e.to_string()
            .starts_with("root trim (sphere of radius 0.401000 m) lies beyond the tip trim"),
        "{e}"
    );
    // A root clearance so large that the root sphere misses the blade.
    let e = loft_solid(&blade, &Trims::spheres(0.96, 0.97), &params(1e-4)).unwrap_err();
    assert!(
        e.to_string()
            .starts_with("root trim (sphere of radius 0.960000 m) does not cut the surface"),
        "{e}"
    );
    // A negative tip clearance puts the trim past the end of the surface.
    let e = loft_solid(&blade, &Trims::spheres(0.401, 0.97), &params(1e-4)).unwrap_err();
    assert!(
        e.to_string()
            .starts_with("tip trim (sphere of radius 0.970000 m) does not cut the surface"),
        "{e}"
    );
    let e = loft_solid(&blade, &Trims::spheres(-0.1, 0.9), &params(1e-4)).unwrap_err();
    assert!(
        e.to_string().starts_with("root trim radius (m) must be a positive length; found -0.1"),
        "{e}"
    );
    let e = "inch".parse::<LengthUnit>().unwrap_err();
    assert_eq!(e.to_string(), "unknown length unit 'inch': expected \"mm\" or \"m\"");
}

#[test]
fn a_folder_that_cannot_be_written_or_a_failed_check_writes_nothing() {
    let good = tube_mesh();
    let dir = tempfile::tempdir().unwrap();
    // The output folder would be inside a regular file.
    let file = dir.path().join("not-a-folder");
    std::fs::write(&file, b"x").unwrap();
    let out = file.join("stl");
    let e = write_parts(&out, &[("core", &good)], &StlOptions::default(), &CheckParams::default())
        .unwrap_err();
    assert!(e.to_string().starts_with(&format!("cannot write {}", out.display())), "{e}");
    // One bad part among good ones: nothing at all is written.
    let mut bad = good.clone();
    bad.triangles.pop();
    let out = dir.path().join("parts");
    let e = write_parts(
        &out,
        &[("core", &good), ("shell", &bad)],
        &StlOptions::default(),
        &CheckParams::default(),
    )
    .unwrap_err();
    assert!(e.to_string().starts_with("shell: the surface is open"), "{e}");
    assert!(!out.exists());
}

#[test]
fn parts_that_single_precision_cannot_hold_or_that_share_a_name_are_refused() {
    // A box 1 µm long at 10 km: its ends are 1e-3 mm apart at 1e7 mm, where single precision
    // steps by 1 mm (IEEE 754 binary32: 24-bit significand), so they would merge in the file.
    let sliver = box_mesh([1e4, 0.0, 0.0], [1e4 + 1e-6, 1.0, 1.0]);
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("parts");
    let e =
        write_parts(&out, &[("core", &sliver)], &StlOptions::default(), &CheckParams::default())
            .unwrap_err();
    assert!(
        e.to_string().contains("coincide") && e.to_string().starts_with("core: vertices"),
        "{e}"
    );
    let good = tube_mesh();
    let e = write_parts(
        &out,
        &[("core", &good), ("core", &good)],
        &StlOptions::default(),
        &CheckParams::default(),
    )
    .unwrap_err();
    assert_eq!(e.to_string(), "two parts are named 'core'; each part needs its own file name");
    assert!(!out.exists());
}

/// NACA 4-digit camber line and slope (Abbott & von Doenhoff §6.4): maximum camber m at p.
fn camber(m: f64, p: f64, x: f64) -> (f64, f64) {
    if x < p {
        (m / (p * p) * (2.0 * p * x - x * x), 2.0 * m / (p * p) * (p - x))
    } else {
        (
            m / ((1.0 - p) * (1.0 - p)) * (1.0 - 2.0 * p + 2.0 * p * x - x * x),
            2.0 * m / ((1.0 - p) * (1.0 - p)) * (p - x),
        )
    }
}

#[test]
fn a_cambered_twisted_blade_with_webs_meshes_into_clean_solids() {
    // NACA 4412 (thickness applied normal to the camber line, Abbott & von Doenhoff §6.4),
    // chord tapering from 0.12 to 0.07 m, 35° of twist: every part passes every check, the
    // cells add up to the whole blade, and every end vertex lies on its sphere.
    let chord = |x: f64| 0.12 - 0.05 * (x - 0.35) / 0.6;
    let side = move |sign: f64| {
        move |x: f64, u: f64| {
            let (yc, slope) = camber(0.04, 0.4, u);
            let th = slope.atan();
            let t = yt(0.12, u);
            let c = chord(x);
            [(u - sign * t * th.sin() - 0.3) * c, (yc + sign * t * th.cos()) * c]
        }
    };
    let blade = FnSurface {
        span: [0.35, 0.95],
        upper: side(1.0),
        lower: side(-1.0),
        chord_angle: |x: f64| Angle::from_deg(10.0 + 35.0 * (0.95 - x) / 0.6),
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Segment },
    };
    let trims = Trims::spheres(0.401, 0.8985);
    let tol = 2e-5;
    let whole = loft_solid(&blade, &trims, &params(tol)).unwrap();
    let s = check(&whole.mesh, "blade");
    let web = move |x: f64| (0.35 - 0.3) * chord(x);
    let cells = split_cells(&blade, &[&web]).unwrap();
    let mut sum = 0.0;
    for (i, cell) in cells.iter().enumerate() {
        let solid = loft_solid(cell, &trims, &params(tol)).unwrap();
        sum += check(&solid.mesh, &format!("core-{i}")).volume;
        for &v in solid.tip_ring.iter() {
            let p = solid.mesh.vertices[v as usize];
            assert!(((p[0] * p[0] + p[1] * p[1] + p[2] * p[2]).sqrt() / 0.8985 - 1.0).abs() < 1e-9);
        }
    }
    assert!((sum - s.volume).abs() <= tol * s.area, "{sum} vs {}", s.volume);
}

fn mould_params() -> MouldParams {
    MouldParams {
        pull: [0.0, 0.0, 1.0],
        margin: 0.02,
        tolerance: 1e-4,
        min_draft: Angle::from_deg(1.0),
        unit: LengthUnit::Millimetre,
    }
}

#[test]
fn an_untwisted_symmetric_blade_draws_without_undercut_from_a_mould_parted_at_its_chord() {
    // NACA 0012 prism, pull normal to its chord: every upper facet faces up or along the chord
    // (the open trailing edge's base and the planar ends face along the parting plane, draft 0),
    // so neither half has an undercut (geometry of a section symmetric about its chord).
    let blade = naca_blade(0.1, [0.2, 0.8], |_x| Angle::ZERO);
    let solid = loft_solid(&blade, &Trims::planes(0.3, 0.7), &params(2e-5)).unwrap();
    let (meshes, halves) = build_moulds(&solid, &|_x| Angle::ZERO, &mould_params()).unwrap();
    for (mesh, half) in meshes.iter().zip(&halves) {
        assert!(half.undercuts.is_empty(), "{}: {:?}", half.side, half.undercuts);
        assert!(
            half.draft.min_draft.deg().abs() < 1e-6,
            "{}: {}",
            half.side,
            half.draft.min_draft.deg()
        );
        check(mesh, half.side);
    }
    // The halves and the part fill the block but for the sockets' clearance (0.1 mm round pins
    // of base radius m/6 and height m/3: at most 3 · 0.1 mm · (π (r_b + r_t) s + π r_t²)).
    let v: f64 = meshes.iter().map(|m| m.signed_volume()).sum::<f64>() + solid.mesh.signed_volume();
    let [x, y, z] = halves[0].block_size;
    let gap = x * y * z - v;
    let (rb, h) = (0.02 / 6.0, 0.02 / 3.0);
    let rt = rb - h * 10f64.to_radians().tan();
    let bound = 3.0 * 1e-4 * PI * ((rb + rt) * h * 1.1 + rt * rt) * 1.1;
    assert!(gap > 0.0 && gap < bound, "{gap:e} vs {bound:e}");
}

#[test]
fn a_twisted_blade_has_undercuts_of_its_twist_from_a_mould_parted_at_its_middle_chord() {
    // NACA 0012 twisted from -10° to +10° over its span, pulled normal to the middle chord: a
    // rigid turn of a section by ψ turns its normals by ψ, so the blunt trailing edge's base
    // (normal along the chord) draws at −|ψ| on one half at each end, and the end sections' noses
    // at up to −|ψ| (geometry): the worst draft of each half is −10° (facets on the first station
    // interval turn a little less) and the two halves mirror each other.
    let twist = |x: f64| Angle::from_deg(50.0 * (x - 0.5));
    let blade = naca_blade(0.1, [0.2, 0.8], twist);
    let solid = loft_solid(&blade, &Trims::planes(0.3, 0.7), &params(2e-5)).unwrap();
    let (meshes, halves) = build_moulds(&solid, &twist, &mould_params()).unwrap();
    for (mesh, half) in meshes.iter().zip(&halves) {
        check(mesh, half.side);
        let worst = half.draft.min_draft.deg();
        assert!((-10.0 - 1e-9..-9.5).contains(&worst), "{}: {worst}", half.side);
        // The regions partition the undercut facets: their areas add up and the worst of them
        // is the worst of all.
        let area: f64 = half.undercuts.iter().map(|r| r.area).sum();
        assert!((area / half.draft.undercut_area - 1.0).abs() < 1e-12 && area > 0.0);
        let least = half.undercuts.iter().map(|r| r.worst.deg()).fold(f64::INFINITY, f64::min);
        assert!((least - worst).abs() < 1e-9, "{least} vs {worst}");
    }
    let (a, b) = (halves[0].draft.undercut_area, halves[1].draft.undercut_area);
    assert!((a / b - 1.0).abs() < 1e-6, "upper {a} vs lower {b} m²");
}

#[test]
fn a_prism_with_square_ends_needs_two_parts_and_with_spherical_ends_end_pieces() {
    // NACA 0012 prism pulled normal to its chord. Square ends face along the parting plane (draft
    // 0, no undercut): two parts. Ends on spheres about the rotor centre: the concave root end
    // faces the rotor centre, n = −p/|p|, so n · (+z) = −z/|p| < 0 on the upper half's share
    // (z > 0) and likewise below: each half undercuts it, and an end piece pulled along −x takes
    // it, where its cap draws at asin(x/|p|). The convex tip end, n = p/|p|, draws on both halves
    // (n · (±z) = |z|/|p| ≥ 0): no piece there (geometry).
    let blade = naca_blade(0.1, [0.2, 0.8], |_x| Angle::ZERO);
    let square = loft_solid(&blade, &Trims::planes(0.3, 0.7), &params(1e-4)).unwrap();
    let set = build_mould_parts(&square, &|_x| Angle::ZERO, &mould_params()).unwrap();
    assert!(set.end_pieces.is_empty());
    for (mesh, half) in set.half_meshes.iter().zip(&set.halves) {
        check(mesh, half.side);
    }
    let round = loft_solid(&blade, &Trims::spheres(0.3, 0.7), &params(1e-4)).unwrap();
    let set = build_mould_parts(&round, &|_x| Angle::ZERO, &mould_params()).unwrap();
    let sides: Vec<&str> = set.end_pieces.iter().map(|(_, h)| h.side).collect();
    assert_eq!(sides, ["root end"]);
    for (mesh, half) in set.half_meshes.iter().zip(&set.halves) {
        check(mesh, half.side);
        assert!(half.undercuts.is_empty(), "{}: {:?}", half.side, half.undercuts);
    }
    for (mesh, piece) in &set.end_pieces {
        check(mesh, piece.side);
        // The least |p| over the cap is the sphere radius and x ≥ 0.3 · cos of the half chord's
        // angle: asin(x/|p|) stays above 75°.
        assert!(
            piece.draft.min_draft.deg() > 75.0,
            "{}: {}",
            piece.side,
            piece.draft.min_draft.deg()
        );
        assert!(piece.undercuts.is_empty());
    }
    // The parts fill the block but for the sockets' clearance, as for two halves.
    let v: f64 = set.half_meshes.iter().map(|m| m.signed_volume()).sum::<f64>()
        + set.end_pieces.iter().map(|(m, _)| m.signed_volume()).sum::<f64>()
        + round.mesh.signed_volume();
    let [x, y, z] = set.halves[0].block_size;
    let gap = x * y * z - v;
    let (rb, h) = (0.02 / 6.0, 0.02 / 3.0);
    let rt = rb - h * 10f64.to_radians().tan();
    let bound = 3.0 * 1e-4 * PI * ((rb + rt) * h * 1.1 + rt * rt) * 1.1
        + end_key_clearance(set.end_pieces.len(), 0.02);
    assert!(gap > 0.0 && gap < bound, "{gap:e} vs {bound:e}");
}

/// A bound on the clearance round the end pieces' keys (two keys per piece): each socket stands
/// c = 0.1 mm off a key of width w ≤ m/4, depth 0.4 w and length 1.5 w, whose faces off the wall
/// have less than 1.8 w² of area (a trapezoid 0.4 w², two flanks 0.6 w², the outer face 0.78 w²),
/// taken as 0.15 m² with the socket's scale (geometry of the key, src/tooling/mould/keys.rs).
fn end_key_clearance(pieces: usize, m: f64) -> f64 {
    2.0 * pieces as f64 * 1e-4 * 0.15 * m * m
}

/// NACA 00xx half-thickness per chord with the closed trailing edge: the last coefficient
/// −0.1036 in place of −0.1015, which brings y_t(1) to zero (common practice).
fn yt_closed(t: f64, x: f64) -> f64 {
    5.0 * t
        * (0.2969 * x.sqrt() - 0.1260 * x - 0.3516 * x * x + 0.2843 * x.powi(3)
            - 0.1036 * x.powi(4))
}

#[test]
fn a_twisted_blade_parted_at_its_silhouette_draws_on_both_halves() {
    // NACA 0012 with a closed trailing edge, twisted from -25° to +25° over its span, pulled
    // normal to the middle chord. Parted at the leading and trailing edges its end sections'
    // noses undercut by about their turn (see the test above); parted at each section's extremes
    // across the pull, every side of a convex section is a graph across the pull, so no facet of
    // either half faces away from its pull (geometry of convex sections), whatever the twist.
    let twist = |x: f64| Angle::from_deg(125.0 * (x - 0.5));
    let blade = FnSurface {
        span: [0.2, 0.8],
        upper: |_x: f64, u: f64| [(u - 0.25) * 0.1, yt_closed(0.12, u) * 0.1],
        lower: |_x: f64, u: f64| [(u - 0.25) * 0.1, -yt_closed(0.12, u) * 0.1],
        chord_angle: twist,
        ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
    };
    let pull = Angle::ZERO;
    let parted = SilhouetteSurface::new(&blade, pull);
    for x in [0.3, 0.5, 0.7] {
        // The extremes: a rigid turn by ψ − φ of the section puts its front extreme on the lower
        // chain when the chord is turned nose up against the pull (φ > ψ), on the upper otherwise.
        let [f, b] = parted.extremes(x);
        let turn = twist(x).deg();
        assert!(f * turn >= -1e-6, "x {x}: front {f}, turn {turn}");
        assert!((b - 1.0).abs() < 1e-6, "x {x}: the sharp trailing edge stays the back, {b}");
    }
    let trims = Trims::spheres(0.3, 0.7);
    let solid = loft_solid(&parted, &trims, &params(1e-4)).unwrap();
    let plain = loft_solid(&blade, &trims, &params(1e-4)).unwrap();
    // The same surface: the volumes agree within the chordal tolerance times the area.
    let (v, w) = (check(&solid.mesh, "parted").volume, check(&plain.mesh, "plain").volume);
    assert!((v - w).abs() <= 1e-4 * solid.mesh.area(), "{v} vs {w}");
    let set = build_mould_parts(&solid, &|_x| pull, &mould_params()).unwrap();
    for (mesh, half) in set.half_meshes.iter().zip(&set.halves) {
        check(mesh, half.side);
        assert!(half.undercuts.is_empty(), "{}: {:?}", half.side, half.undercuts);
        assert!(half.draft.min_draft.deg() >= 0.0, "{}", half.side);
    }
    // The concave root end still goes to an end piece; the parts fill the block but for the
    // sockets' clearance.
    let sides: Vec<&str> = set.end_pieces.iter().map(|(_, h)| h.side).collect();
    assert!(sides.contains(&"root end"), "{sides:?}");
    let v: f64 = set.half_meshes.iter().map(|m| m.signed_volume()).sum::<f64>()
        + set.end_pieces.iter().map(|(m, _)| m.signed_volume()).sum::<f64>()
        + solid.mesh.signed_volume();
    let [x, y, z] = set.halves[0].block_size;
    let gap = x * y * z - v;
    let (rb, h) = (0.02 / 6.0, 0.02 / 3.0);
    let rt = rb - h * 10f64.to_radians().tan();
    let bound = 3.0 * 1e-4 * PI * ((rb + rt) * h * 1.1 + rt * rt) * 1.1
        + end_key_clearance(set.end_pieces.len(), 0.02);
    assert!(gap > 0.0 && gap < bound, "{gap:e} vs {bound:e}");
}

#[test]
fn a_blunt_trailing_edge_draws_when_the_pull_lies_beyond_its_chord_angles() {
    // NACA 0012 with its open trailing edge, twisted from -10° to +10°. Pulled normal to a
    // chord at 10.5°, beyond every section's chord angle, the base's upper corner is the extreme
    // across the pull at every radius (the section is turned by 0.5° to 20.5°, less than 90°
    // less the surface's slope there), so the flat base goes whole to the lower half and faces
    // away from the upper pull: no undercut on either half (geometry of a turned section).
    let twist = |x: f64| Angle::from_deg(50.0 * (x - 0.5));
    let blade = naca_blade(0.1, [0.2, 0.8], twist);
    let pull = Angle::from_deg(10.5);
    let parted = SilhouetteSurface::new(&blade, pull);
    for x in [0.3, 0.5, 0.7] {
        let [_, b] = parted.extremes(x);
        assert!((b - 1.0).abs() < 1e-6, "x {x}: the back extreme is the upper corner, {b}");
    }
    let solid = loft_solid(&parted, &Trims::planes(0.3, 0.7), &params(1e-4)).unwrap();
    let (s, c) = pull.rad().sin_cos();
    let mould = MouldParams { pull: [0.0, -s, c], ..mould_params() };
    let set = build_mould_parts(&solid, &|_x| pull, &mould).unwrap();
    assert!(set.end_pieces.is_empty(), "square ends need no end piece");
    for (mesh, half) in set.half_meshes.iter().zip(&set.halves) {
        check(mesh, half.side);
        assert!(half.undercuts.is_empty(), "{}: {:?}", half.side, half.undercuts);
    }
}

#[test]
fn a_part_set_encoded_in_memory_is_byte_for_byte_the_set_written_to_files() {
    // The same parts through the two ways out: written file by file, and checked and encoded in
    // memory for a caller that puts the set in place itself. Same bytes, sizes and SHA-256
    // (FIPS 180-4, the manifest's own digest, recomputed on the file read back).
    let a = box_mesh([0.0; 3], [0.1, 0.2, 0.3]);
    let b = box_mesh([0.2, 0.0, 0.0], [0.3, 0.1, 0.1]);
    let parts = [("block-a", &a)];
    let copies = [("block-b", &b)];
    let dir = tempfile::tempdir().unwrap();
    let options = StlOptions { unit: LengthUnit::Millimetre, format: StlFormat::Binary };
    let written = layloft::output::write_part_set_with_progress(
        dir.path(),
        &parts,
        &copies,
        &options,
        &CheckParams::default(),
        &mut |_, _, _| {},
    )
    .unwrap();
    let encoded = layloft::mesh::encode_part_set_with_progress(
        &parts,
        &copies,
        &options,
        &CheckParams::default(),
        &mut |_, _, _| {},
    )
    .unwrap();
    assert_eq!(written.len(), 2);
    for (w, (e, bytes)) in written.iter().zip(&encoded) {
        let file = std::fs::read(&w.path).unwrap();
        assert_eq!(&file, bytes, "{}", w.name);
        assert_eq!(e.path, std::path::PathBuf::from(format!("{}.stl", w.name)));
        assert_eq!((e.size_bytes, &e.sha256), (w.size_bytes, &w.sha256));
        assert_eq!(e.sha256, layloft::mesh::sha256_hex(&file));
        assert_eq!(file.len(), 84 + 50 * 12);
    }
    // A part that fails its check encodes nothing.
    let mut open = a.clone();
    open.triangles.pop();
    let bad = [("open", &open)];
    assert!(
        layloft::mesh::encode_part_set_with_progress(
            &bad,
            &[],
            &options,
            &CheckParams::default(),
            &mut |_, _, _| {},
        )
        .is_err()
    );
}
