//! A library user who builds a `BladeModel` of a blade in water gets the buoyancy on every load
//! case with gravity, as the commands do. The fixture is the invented prismatic NACA 0015 blade
//! of `tests/data/blade-basic` (chord 0.4 m from r = 0.5 m to 2.5 m, untwisted), with thinner
//! plies, gravity and sea water added for the test.

use approx::assert_relative_eq;
use layloft::analysis::BladeModel;
use std::fs;
use std::path::Path;

use layloft::input::read_project;
use layloft::loads::{LoadDistribution, span_loads};
use layloft::project::{LoadCaseSpec, Project};

const RHO: f64 = 1025.0;
const G: f64 = 9.81;

/// The fixture copied into `dir` with thinner plies (0.1 mm glass, 0.2 mm carbon: the 1 mm
/// skins of the fixture are thicker than its 1.3 mm open trailing edge is deep), gravity along
/// -Z (rotor axis) on its case, a second case without gravity, and sea water when `fluid`.
fn fixture(dir: &Path, fluid: bool) -> Project {
    for entry in fs::read_dir("tests/data/blade-basic").unwrap() {
        let entry = entry.unwrap();
        fs::copy(entry.path(), dir.join(entry.file_name())).unwrap();
    }
    let materials = fs::read_to_string(dir.join("materials.toml")).unwrap();
    let materials = materials
        .replace("ply_thickness_mm = 1.0", "ply_thickness_mm = 0.1")
        .replace("ply_thickness_mm = 2.0", "ply_thickness_mm = 0.2");
    fs::write(dir.join("materials.toml"), materials).unwrap();
    let mut toml = fs::read_to_string(dir.join("blade.toml")).unwrap();
    toml.push_str(&format!(
        "gravity_m_s2 = [0, 0, {}]\n\n[[load_case]]\nname = \"spin without gravity\"\nrpm = 330\n",
        -G
    ));
    if fluid {
        toml.push_str(&format!("\n[fluid]\ndensity_kg_m3 = {RHO}\n"));
    }
    fs::write(dir.join("blade.toml"), toml).unwrap();
    read_project(&dir.join("blade.toml")).unwrap()
}

/// Root force of `case` along the rotor axis, N.
fn root_force_z(model: &BladeModel, case: &LoadCaseSpec) -> f64 {
    let props = model.properties();
    let p = &model.project;
    let dist = LoadDistribution::new(&props, &p.point_masses, case, p.rotor.pitch).unwrap();
    span_loads(&dist).root().force[2]
}

#[test]
fn the_build_gives_a_blade_in_water_its_buoyancy() {
    let dir = tempfile::tempdir().unwrap();
    let model = BladeModel::build(fixture(dir.path(), true)).unwrap();
    let cases = &model.project.load_cases;
    let b = cases[0].buoyancy.as_ref().expect("the case with gravity carries the buoyancy");
    assert_eq!(b.density, RHO);
    assert_eq!(b.sections.len(), model.stations.len());
    assert!(cases[1].buoyancy.is_none(), "a case without gravity has no buoyancy");

    // Archimedes: the buoyancy lifts by the weight of the water displaced. The area inside a
    // NACA 4-digit section (open trailing edge) is the integral of the thickness formula of
    // Abbott & von Doenhoff, Theory of Wing Sections, 1959, eq. 6.2:
    // A = 10 t c² (0.2969·2/3 − 0.1260/2 − 0.3516/3 + 0.2843/4 − 0.1015/5) = 0.685083 t c².
    let (t, c, length) = (0.15, 0.4, 2.0);
    let area = 10.0
        * t
        * c
        * c
        * (0.2969 * 2.0 / 3.0 - 0.1260 / 2.0 - 0.3516 / 3.0 + 0.2843 / 4.0 - 0.1015 / 5.0);
    for s in &b.sections {
        // The outline is a polygon of the project's contour points: within 0.05 % (measured
        // 0.012 %).
        assert_relative_eq!(s.area, area, max_relative = 5e-4);
    }
    let mut dry = cases[0].clone();
    dry.buoyancy = None;
    let lift = root_force_z(&model, &cases[0]) - root_force_z(&model, &dry);
    assert_relative_eq!(lift, RHO * G * area * length, max_relative = 5e-4);

    // The same blade in air: the build adds nothing.
    let air_dir = tempfile::tempdir().unwrap();
    let air = BladeModel::build(fixture(air_dir.path(), false)).unwrap();
    assert!(air.project.load_cases.iter().all(|c| c.buoyancy.is_none()));
    assert_relative_eq!(root_force_z(&air, &air.project.load_cases[0]), root_force_z(&model, &dry));
}

#[test]
fn build_at_and_the_modal_attachments_follow_the_fluid() {
    let radii = [0.5, 1.0, 1.5, 2.0, 2.5];
    let (dir, air_dir) = (tempfile::tempdir().unwrap(), tempfile::tempdir().unwrap());
    let model = BladeModel::build_at(fixture(dir.path(), true), &radii).unwrap();
    let b = model.project.load_cases[0].buoyancy.as_ref().unwrap();
    let r: Vec<f64> = b.sections.iter().map(|s| s.r).collect();
    assert_eq!(r, radii);
    let a = model.modal_attachments();
    let (rho, sections) = a.fluid.expect("the fluid's added mass");
    assert_eq!(rho, RHO);
    assert_eq!(sections.len(), radii.len());
    // The ellipse standing for the section: the chord, and the greatest thickness t c of the
    // NACA section (Abbott & von Doenhoff 1959, §6.4: the 4-digit maximum thickness is t c at
    // 30 % chord), within the sampling of the outline.
    for s in &sections {
        assert_relative_eq!(s.chord, 0.4, max_relative = 1e-9);
        assert_relative_eq!(s.thickness, 0.15 * 0.4, max_relative = 1e-3);
    }
    let air = BladeModel::build_at(fixture(air_dir.path(), false), &radii).unwrap();
    assert!(air.modal_attachments().fluid.is_none());
}
