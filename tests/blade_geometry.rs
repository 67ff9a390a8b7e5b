//! The blade project reader and the lofted blade: interpolation, ply coverage, section layouts.

use layloft::blade::{Blade, BladeError, Surface};
use layloft::input::read_project;

fn fixture() -> Blade {
    let p = read_project("tests/data/blade-basic/blade.toml".as_ref()).unwrap();
    Blade::from_project(&p).unwrap()
}

#[test]
fn fixture_project_reads_with_defaults() {
    let p = read_project("tests/data/blade-basic/blade.toml".as_ref()).unwrap();
    assert_eq!(p.stations.len(), 3);
    assert_eq!(p.plies.len(), 3);
    assert_eq!(p.webs[0].r_start, 0.5);
    assert_eq!(p.webs[0].r_end, 2.5);
    assert_eq!(p.criteria.harmonics, 12);
    assert!(p.tooling.is_none());
    assert_eq!(p.load_cases[0].load_factor, 1.0);
}

#[test]
fn ply_coverage_follows_the_schedule() {
    let b = fixture();
    // Cap (2 mm carbon) on the upper surface between 20 % and 40 % chord, inboard of r = 1.5.
    assert!((b.surface_thickness(1.0, Surface::Upper, 0.3) - 3e-3).abs() < 1e-12);
    assert!((b.surface_thickness(1.0, Surface::Lower, 0.3) - 1e-3).abs() < 1e-12);
    assert!((b.surface_thickness(1.0, Surface::Upper, 0.5) - 1e-3).abs() < 1e-12);
    // The cap drops off at r = 1.5.
    assert!((b.surface_thickness(1.5, Surface::Upper, 0.3) - 1e-3).abs() < 1e-12);
    // The skin covers the tip.
    assert!((b.surface_thickness(2.5, Surface::Lower, 1.0) - 1e-3).abs() < 1e-12);
    // Outermost first: the skin is ply 1, the cap ply 2.
    let lam = b.surface_laminate(1.0, Surface::Upper, 0.3);
    assert_eq!(lam.plies()[0].material.name, "glass");
    assert_eq!(lam.plies()[1].material.name, "carbon");
}

#[test]
fn section_layout_is_a_closed_contour_with_a_laminate_per_segment() {
    let b = fixture();
    let layout = b.section_layout(1.0, 200).unwrap();
    assert_eq!(layout.outer.len(), layout.segment_laminate.len());
    // The NACA 0015 open trailing edge gives a blunt base: 101 upper + 100 lower points, plus
    // vertices at the cap's edges (x/c = 0.2 and 0.4 on the upper surface) and at the ends of
    // the ramps beside them, less the outline points inside the ramps.
    assert_eq!(layout.outer.len(), 204);
    assert!(layout.outer.iter().any(|p| (p[0] - (0.2 - 0.3) * 0.4).abs() < 1e-12 && p[1] > 0.0));
    // Leading edge at y = -0.3 c on the pitch axis frame, trailing edge at +0.7 c.
    assert!((layout.outer[0][0] + 0.12).abs() < 1e-12 && layout.outer[0][1].abs() < 1e-12);
    assert!((layout.outer[102][0] - 0.28).abs() < 1e-3);
    // Distinct laminates: skin, skin + cap, web.
    assert_eq!(layout.laminates.len(), 3);
    assert_eq!(layout.webs.len(), 1);
    assert!((layout.webs[0].y - 0.0).abs() < 1e-12);
    // Contour runs over the upper surface first (z > 0 at the quarter of the points).
    assert!(layout.outer[50][1] > 0.0 && layout.outer[150][1] < 0.0);
}

#[test]
fn segments_beside_a_ply_drop_are_as_long_as_the_drop_is_thick() {
    // The 2 mm cap ends at x/c = 0.2 and 0.4 on the upper surface: the segments either side of
    // each edge are 2 mm long at every number of points (the midline ramp
    // there is then the same whatever the outline spacing; see `blade/layout.rs`).
    let b = fixture();
    for n in [100, 200, 400, 800] {
        let layout = b.section_layout(1.0, n).unwrap();
        for x in [0.2, 0.4] {
            let y = (x - 0.3) * 0.4;
            let k = layout.outer.iter().position(|p| (p[0] - y).abs() < 1e-9 && p[1] > 0.0);
            let k = k.unwrap_or_else(|| panic!("no vertex at the cap edge x/c = {x}"));
            for (a, b) in [(k - 1, k), (k, k + 1)] {
                let (p, q) = (layout.outer[a], layout.outer[b]);
                let len = (q[0] - p[0]).hypot(q[1] - p[1]);
                // 1e-4 relative: the ramp is measured along the surface, the segment is its
                // chord, shorter by L²/(24 R²) (under 7e-5 for a surface radius above 50 mm).
                assert!((len - 2e-3).abs() < 2e-7, "n = {n}, x/c = {x}: segment {len} m");
            }
        }
    }
}

#[test]
fn section_mass_by_ply_areas() {
    // Outer-line integral of areal mass: skin 2 kg/m² (1 mm glass at 2000 kg/m³) round the
    // NACA 0015 perimeter (2.0493 c by the same outline) plus cap 3.1 kg/m² over 0.2 c of the
    // upper surface plus the web; a hand estimate within 1 %.
    let b = fixture();
    let m = b.ply_mass_per_length(1.0, 200).unwrap();
    let c = 0.4;
    let outline = b.outline(1.0, 200).unwrap();
    let skin = 2.0 * outline.perimeter_without_base() * c;
    let cap_len = c * 0.2 * 1.0012; // arc length over 20..40 % chord, nearly flat there
    let cap = 3.1 * cap_len;
    let web_depth = outline.depth_at(0.3) * c - 3e-3 - 1e-3;
    let web = 2.0 * web_depth;
    let estimate = skin + cap + web;
    assert!((m - estimate).abs() / estimate < 0.01, "{m} vs {estimate}");
}

#[test]
fn radius_outside_the_blade_is_refused() {
    let b = fixture();
    match b.section_layout(2.6, 100) {
        Err(BladeError::OutsideSpan { r, .. }) => assert_eq!(r, 2.6),
        other => panic!("expected OutsideSpan, got {other:?}"),
    }
}

#[test]
fn interpolation_between_stations_is_monotone() {
    let p = read_project("tests/data/blade-basic/blade.toml".as_ref()).unwrap();
    let b = Blade::from_project(&p).unwrap();
    for i in 0..=20 {
        let r = 0.5 + 0.1 * i as f64;
        assert!((b.chord(r) - 0.4).abs() < 1e-12);
        assert!(b.twist(r).deg().abs() < 1e-12);
    }
}

#[test]
fn demo_projects_build_every_section() {
    for demo in ["layups/mine-fan/blade.toml", "layups/small-wind/blade.toml"] {
        let p = read_project(demo.as_ref()).unwrap_or_else(|e| panic!("{demo}: {e}"));
        let b = Blade::from_project(&p).unwrap();
        for r in b.analysis_radii(41) {
            let layout = b
                .section_layout(r, p.sections.contour_points)
                .unwrap_or_else(|e| panic!("{demo}: {e}"));
            assert!(layout.laminates.iter().all(|l| !l.is_empty()));
        }
        if demo.contains("small-wind") {
            assert!(b.warnings().is_empty(), "{:?}", b.warnings());
        }
    }
}

#[test]
fn demo_models_build_and_their_mass_matches_the_sections() {
    use layloft::analysis::BladeModel;
    for demo in ["layups/mine-fan/blade.toml", "layups/small-wind/blade.toml"] {
        let model = BladeModel::build(read_project(demo.as_ref()).unwrap()).unwrap();
        let props = model.properties();
        // The analysis stations and both sides of every ply or web edge inside the span.
        assert_eq!(
            props.len(),
            model.blade.check_radii(model.project.sections.analysis_stations).len()
        );
        assert!(props.len() > model.project.sections.analysis_stations);
        // The fine ply-area integral and a trapezoid over the solved sections' mass per length
        // agree within the coarse grid's error at drop-offs (5 %).
        let trap: f64 = props
            .windows(2)
            .map(|w| 0.5 * (w[0].mass_per_length + w[1].mass_per_length) * (w[1].r - w[0].r))
            .sum();
        let mass = model.mass();
        assert!(
            (mass.laminate_kg - trap).abs() / trap < 0.05,
            "{demo}: {} vs {trap}",
            mass.laminate_kg
        );
        assert!(
            mass.centre_radius_m > model.blade.root_radius()
                && mass.centre_radius_m < model.blade.tip_radius()
        );
        for w in model.warnings() {
            eprintln!("{demo}: {w}");
        }
        eprintln!(
            "{demo}: mass {:.3} kg, centre at r = {:.3} m",
            mass.total_kg, mass.centre_radius_m
        );
    }
}

/// Each ply of a section's laminates carries its place in the schedule: the cap of the fixture's
/// plies file (row 2) is found inside the skin (row 1) where the file puts it, and nowhere it
/// does not reach; every ply's material and angle are those of its schedule row.
#[test]
fn every_laminate_ply_knows_its_schedule_row() {
    let p = read_project("tests/data/blade-basic/blade.toml".as_ref()).unwrap();
    let b = Blade::from_project(&p).unwrap();
    // Upper surface at 30 % chord, r = 1.0: skin then cap (rows 1 and 2 of plies.csv).
    let ids = |lam: &layloft::laminate::Laminate| -> Vec<Option<usize>> {
        lam.plies().iter().map(|q| q.schedule_ply).collect()
    };
    assert_eq!(ids(&b.surface_laminate(1.0, Surface::Upper, 0.3)), [Some(0), Some(1)]);
    // Outboard of the cap's end only the skin.
    assert_eq!(ids(&b.surface_laminate(2.0, Surface::Upper, 0.3)), [Some(0)]);
    for r in [0.6, 1.0, 1.4, 2.4] {
        let (layout, rows) = b.section_layout_with_plies(r, 120).unwrap();
        for (lam, rows) in layout.laminates.iter().zip(&rows) {
            assert_eq!(ids(lam), rows.iter().map(|&i| Some(i)).collect::<Vec<_>>(), "r = {r}");
            for (ply, &i) in lam.plies().iter().zip(rows) {
                assert_eq!(ply.material.name, p.plies[i].material, "r = {r}");
                assert_eq!(ply.angle, p.plies[i].angle, "r = {r}");
            }
        }
    }
    // A laminate from a code has no schedule.
    let m = std::sync::Arc::new(
        b.surface_laminate(1.0, Surface::Upper, 0.3).plies()[0].material.as_ref().clone(),
    );
    assert_eq!(
        layloft::laminate::Ply::new(m, layloft::units::Angle::from_deg(0.0)).schedule_ply,
        None
    );
}
