//! The span-wise mass integration against closed forms: on a prismatic blade whose mass per
//! length is constant on each side of a ply drop-off, the midpoint rule with the drop-off on a
//! node is exact for the mass and for its first moment (a piecewise linear integrand), so the
//! blade's laminate mass and static moment follow from the mass per length at two radii.

use layloft::analysis::BladeModel;
use layloft::blade::Blade;
use layloft::input::read_project;
use layloft::tooling::schedule_content;

#[test]
fn a_prismatic_blade_with_one_drop_off_integrates_exactly() {
    // Fixture (invented): NACA 0015, chord 0.4 m from r = 0.5 m to 2.5 m, a skin and a web over
    // the whole span, a cap that ends at r = 1.5 m (a node of the 400 intervals of 5 mm).
    let p = read_project("tests/data/blade-basic/blade.toml".as_ref()).unwrap();
    let blade = Blade::from_project(&p).unwrap();
    let inboard = blade.ply_mass_per_length(1.0, 120).unwrap();
    let outboard = blade.ply_mass_per_length(2.0, 120).unwrap();
    assert!(inboard > outboard, "the cap adds mass inboard: {inboard} vs {outboard}");
    // Closed form of the table's integral: M = m_in·1 m + m_out·1 m (the tooling's schedule
    // content, below).
    let mass = inboard + outboard;
    // The blade's mass brings that table to the sections' own mass per length (each ply at its
    // depth) by a factor taken at the project's analysis radii: the same mass, to the bit,
    // whatever radii a model is solved at (here one station only), and within the sections'
    // own difference from the table (the plies' depth and the web's ends; within 0.5 %).
    let full = BladeModel::build(p.clone()).unwrap().mass();
    let one = BladeModel::build_at(p.clone(), &[1.0]).unwrap().mass();
    assert_eq!(full.total_kg.to_bits(), one.total_kg.to_bits());
    assert_eq!(full.static_moment_kg_m.to_bits(), one.static_moment_kg_m.to_bits());
    assert!((full.laminate_kg / mass - 1.0).abs() < 5e-3, "{} vs {mass}", full.laminate_kg);
    let model = BladeModel::build(p).unwrap();
    // The tooling's schedule content integrates the same table: the same laminate mass.
    let schedule = schedule_content(&model.blade);
    assert!((schedule.mass - mass).abs() <= 1e-12 * mass, "{} vs {mass}", schedule.mass);
}

#[test]
fn a_tube_blade_weighs_its_ring_not_its_outer_surface() {
    // Fixture (invented): a round aluminium tube, 100 mm outside, two 1 mm plies all round,
    // from r = 0.20 m to 1.20 m. Its laminate is a ring: ρ π (R_o² − R_i²) L (geometry), where
    // the outer surface times the wall would give ρ 2π R_o t L, 2 % more.
    let dir = tempfile::tempdir().unwrap();
    let plies = "p1,al,0,0.20,1.20,both,0,1\np2,al,0,0.20,1.20,both,0,1\n";
    let project = crate::common::tube_project(dir.path(), plies, "");
    let model = BladeModel::build(read_project(&project).unwrap()).unwrap();
    let (ro, ri, length) = (0.05_f64, 0.048_f64, 1.0);
    let ring = 2700.0 * std::f64::consts::PI * (ro * ro - ri * ri) * length;
    let m = model.mass().laminate_kg;
    // The 400-point polygon's area and perimeter stand within about 1e-4 of the circle's.
    assert!((m - ring).abs() / ring < 2e-4, "{m} against the ring's {ring}");
    // Its centre is the middle of the span (a uniform bar).
    assert!((model.mass().centre_radius_m - 0.70).abs() < 1e-9);
}
