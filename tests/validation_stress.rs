//! Stress recovery against closed forms, and against the laminate module fed the same wall
//! resultants.

mod common;

use std::f64::consts::PI;

use assert_cmd::Command;
use layloft::analysis::BladeModel;
use layloft::failure::Criterion;
use layloft::input::read_project;
use layloft::loads::BeamResultants;
use layloft::section::SolvedSection;
use layloft::stress::{analyse_cases, recover_at};

/// Aluminium tube, outer radius 60 mm, wall 2 mm: midline radius R = 59 mm.
fn tube() -> (layloft::section::SectionLayout, SolvedSection, f64, f64) {
    let t = 2e-3;
    let al = common::isotropic("al", 70e9, 0.33, t, 2700.0);
    let layout = common::tube(0.060, 720, common::single(&al));
    let section = SolvedSection::solve(&layout, &Default::default()).unwrap();
    (layout, section, 0.060 - t / 2.0, t)
}

#[test]
fn bending_stress_of_a_tube_is_m_c_over_i() {
    // sigma = M c / I with I = pi R³ t for a thin tube (Gere & Timoshenko, Mechanics of
    // Materials, 4th ed., 1997, §5.5 and Appendix D; thin-ring second moment), c = R at the
    // midline. The 720-gon's midline differs from the circle by (1 - cos(pi/720)) ~ 1e-5.
    let (layout, section, r, t) = tube();
    let m = 1500.0;
    let b = BeamResultants { m_flap: m, ..Default::default() };
    let points = recover_at(&layout, &section, &b, 0.0).unwrap();
    let top = points.iter().max_by(|a, b| a.position[1].total_cmp(&b.position[1])).unwrap();
    let expected = m * r / (PI * r.powi(3) * t);
    let sigma = top.plies[0].stress_12.x;
    assert!((sigma - expected).abs() / expected < 2e-4, "{sigma} vs {expected}");
    // The bottom is in compression by the same amount.
    let bottom = points.iter().min_by(|a, b| a.position[1].total_cmp(&b.position[1])).unwrap();
    assert!((bottom.plies[0].stress_12.x + expected).abs() / expected < 2e-4);
}

#[test]
fn torsion_shear_stress_of_a_tube_is_bredt() {
    // Bredt–Batho: tau = T / (2 A t), A the area inside the midline (Megson, Aircraft
    // Structures for Engineering Students, 4th ed., 2007, §18.1).
    let (layout, section, r, t) = tube();
    let torque = 800.0;
    let b = BeamResultants { t: torque, ..Default::default() };
    let points = recover_at(&layout, &section, &b, 0.0).unwrap();
    let expected = torque / (2.0 * PI * r * r * t);
    for p in points.iter().step_by(45) {
        let tau = p.plies[0].stress_12.z.abs();
        assert!((tau - expected).abs() / expected < 2e-4, "{tau} vs {expected}");
        assert!(p.plies[0].stress_12.x.abs() < 1e-6 * expected);
    }
}

#[test]
fn axial_stress_of_a_tube_is_n_over_a() {
    // sigma = N / (2 pi R t) under pure tension (statics).
    let (layout, section, r, t) = tube();
    let b = BeamResultants { n: 4.0e4, ..Default::default() };
    let points = recover_at(&layout, &section, &b, 0.0).unwrap();
    let expected = 4.0e4 / (2.0 * PI * r * t);
    for p in &points {
        assert!((p.plies[0].stress_12.x - expected).abs() / expected < 2e-4);
    }
}

#[test]
fn wall_ply_stresses_equal_the_laminate_command_on_the_same_resultants() {
    // The beam path (section -> wall resultants -> plies) and `layloft laminate` given the same
    // wall resultants (N_x as Nx, the shear flow as Nxy, hoop force and moments free) must give
    // the same ply strength ratios: one CLT, two routes.
    let model =
        BladeModel::build(read_project("layups/mine-fan/blade.toml".as_ref()).unwrap()).unwrap();
    let cases = analyse_cases(&model, Some("surge")).unwrap();
    let c = cases[0].critical.as_ref().unwrap();
    let point = &cases[0].stations[c.station].points[c.point];
    let laminate = &model.stations[c.station].layout.laminates[point.laminate];
    let code = format!(
        "[{}]T",
        laminate
            .plies()
            .iter()
            .map(|p| format!("{}:{}", p.angle.deg(), p.material.name))
            .collect::<Vec<_>>()
            .join("/")
    );
    let out = Command::cargo_bin("layloft")
        .unwrap()
        .args(["laminate", "--materials", "layups/mine-fan/materials.toml", "--layup", &code])
        .arg(format!("--load=Nx={},Nxy={}", point.n_x, point.n_xs))
        .arg("--json")
        .output()
        .unwrap();
    let json: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let plies = json["plies"].as_array().unwrap();
    assert_eq!(plies.len(), point.plies.len());
    for (ours, theirs) in point.plies.iter().zip(plies) {
        for crit in Criterion::ALL {
            let a = ours.ratios.by(crit).and_then(|r| r.finite());
            let b = theirs["strength_ratio"][crit.key()].as_f64();
            match (a, b) {
                (Some(a), Some(b)) => assert!((a - b).abs() / b < 1e-9, "{crit:?}: {a} vs {b}"),
                (None, None) => {}
                other => panic!("{crit:?}: {other:?}"),
            }
        }
    }
}
