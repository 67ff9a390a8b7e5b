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
    // Closed form: M = m_in·1 m + m_out·1 m; S = m_in·1 m·1.0 m + m_out·1 m·2.0 m.
    let (mass, moment) = (inboard + outboard, inboard + 2.0 * outboard);
    let model = BladeModel::build(p).unwrap();
    let m = model.mass();
    assert!((m.laminate_kg - mass).abs() <= 1e-12 * mass, "{} vs {mass}", m.laminate_kg);
    assert!(
        (m.static_moment_kg_m - moment).abs() <= 1e-12 * moment,
        "{} vs {moment}",
        m.static_moment_kg_m
    );
    assert!((m.centre_radius_m - moment / mass).abs() < 1e-12);
    // The tooling's schedule content integrates the same table: the same laminate mass.
    let schedule = schedule_content(&model.blade);
    assert!((schedule.mass - mass).abs() <= 1e-12 * mass, "{} vs {mass}", schedule.mass);
}
