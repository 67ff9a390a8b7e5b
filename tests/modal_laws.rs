//! The modal solver by laws: agreement with a dense solve (nalgebra `SymmetricEigen` on the
//! Cholesky-reduced problem), residuals and M-orthonormality, convergence under mesh doubling,
//! symmetric pairs found twice, tracking, crossings, margins, export, and bad input.

use crate::modal_support::*;
use layloft::modal::{
    Attachments, BeamModel, BeamSection, LanczosParams, ModalAnalysis, ModalError, ModalInputs,
    ModeKind, SpeedRange, excitation_orders, mac, solve_dense, solve_lowest,
};
use layloft::output::export_matrix_market;
use layloft::project::{Criteria, ExcitationSpec, FixedExcitation};
use layloft::section::MassInertia;
use layloft::units::{RotorSpeed, rpm_of, rpm_to_rad_s};

fn blade_model(elements: usize, springs: bool) -> BeamModel {
    let spec = if springs {
        spec_with_springs(
            elements,
            layloft::project::RootSprings { axial: 5e7, flap: 2e3, edge: 4e4, torsion: 800.0 },
        )
    } else {
        spec(elements)
    };
    BeamModel::new(&twisted_blade(6), &rotor(5, 3000.0, 3600.0, 8.0), &spec).unwrap()
}

#[test]
fn lanczos_agrees_with_the_dense_solution() {
    // Independent method: nalgebra's dense SymmetricEigen of L⁻¹ M L⁻ᵀ (K = L Lᵀ). Required
    // agreement 1e-6 relative; both are accurate to near round-off for the lowest modes.
    for springs in [false, true] {
        let model = blade_model(20, springs);
        let sys = model.system_matrices(RotorSpeed::from_rpm(3600.0)).unwrap();
        let sparse =
            solve_lowest(&sys.stiffness, &sys.mass, 10, &LanczosParams::default()).unwrap();
        let dense = solve_dense(&sys.stiffness.to_dense(), &sys.mass.to_dense()).unwrap();
        for i in 0..10 {
            let (a, b) = (sparse.eigenvalues[i].sqrt(), dense.eigenvalues[i].sqrt());
            assert!((a / b - 1.0).abs() < 1e-9, "mode {i}: {a} vs {b} rad/s (springs {springs})");
            let m =
                mac(&sys.mass, &sparse.vectors.column(i).into(), &dense.vectors.column(i).into());
            assert!(m > 1.0 - 1e-8, "mode {i}: MAC {m}");
        }
    }
}

#[test]
fn modes_solve_the_eigenproblem_and_are_mass_orthonormal() {
    let model = blade_model(30, false);
    let sys = model.system_matrices(RotorSpeed::from_rpm(3000.0)).unwrap();
    let sol = solve_lowest(&sys.stiffness, &sys.mass, 10, &LanczosParams::default()).unwrap();
    let k = sys.stiffness.to_dense();
    let m = sys.mass.to_dense();
    let x = &sol.vectors;
    let gram = x.transpose() * &m * x;
    for i in 0..10 {
        for j in 0..10 {
            let expect = if i == j { 1.0 } else { 0.0 };
            assert!((gram[(i, j)] - expect).abs() < 1e-9, "xᵀMx ({i},{j}) = {}", gram[(i, j)]);
        }
        let xi = x.column(i);
        let residual = &k * xi - sol.eigenvalues[i] * (&m * xi);
        let scale = (&k * xi).norm();
        assert!(residual.norm() < 1e-8 * scale, "mode {i}: residual {}", residual.norm() / scale);
    }
    assert!(sol.eigenvalues.windows(2).all(|w| w[0] <= w[1]));
}

#[test]
fn frequencies_converge_with_element_doubling() {
    // Requirement: less than 0.2 % change when the element count doubles. The element converges
    // as h⁴, so from 20 to 40 elements the change is far smaller.
    for rpm in [0.0, 3600.0] {
        let speed = RotorSpeed::from_rpm(rpm);
        let coarse = blade_model(20, false).modes(speed, 10).unwrap();
        let fine = blade_model(40, false).modes(speed, 10).unwrap();
        for (a, b) in coarse.modes.iter().zip(&fine.modes) {
            let change = (a.frequency_hz / b.frequency_hz - 1.0).abs();
            assert!(change < 2e-3, "{rpm} rpm: {} vs {} Hz", a.frequency_hz, b.frequency_hz);
            assert!(change < 1e-4, "h⁴ convergence: {change:e} at {} Hz", b.frequency_hz);
        }
    }
}

#[test]
fn both_modes_of_a_symmetric_pair_are_found() {
    // A square beam at rest has equal flap and edge frequencies: single-vector Lanczos alone can
    // miss one of each pair; the Sturm count must catch it. Reference: the clamped–free roots
    // (Blevins 1979, table 8-1): 1.8751², 4.6941², 7.8548² for EI = m = L = 1.
    let beam = BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1.0, 1.0);
    let model =
        BeamModel::new(&uniform(&beam, 0.0, 1.0), &rotor(2, 10.0, 20.0, 0.0), &spec(30)).unwrap();
    let set = model.modes(RotorSpeed::ZERO, 6).unwrap();
    let expected = [1.875_104_069_f64, 4.694_091_133, 7.854_757_438];
    for (i, mode) in set.modes.iter().enumerate() {
        let omega = 2.0 * std::f64::consts::PI * mode.frequency_hz;
        let e = expected[i / 2].powi(2);
        assert!((omega / e - 1.0).abs() < 1e-5, "mode {i}: {omega} vs {e}");
    }
    let flap = set.modes.iter().filter(|m| m.kind == ModeKind::Flap).count();
    assert_eq!(flap, 3);
}

/// The speed (rpm) below `max` where the lowest mode meets 2P: bisection on
/// `g(rpm) = f1(rpm) - 2 rpm / 60` with directly solved modes.
fn flap_1_on_2p(model: &BeamModel, max: f64) -> f64 {
    let g = |rpm: f64| {
        model.modes(RotorSpeed::from_rpm(rpm), 1).unwrap().modes[0].frequency_hz - 2.0 * rpm / 60.0
    };
    let (mut lo, mut hi) = (0.0, max);
    for _ in 0..50 {
        let mid = 0.5 * (lo + hi);
        if g(mid) > 0.0 { lo = mid } else { hi = mid }
    }
    lo
}

#[test]
fn tracks_follow_modes_through_the_sweep_and_crossings_are_found() {
    // Uniform unit beam, flap only (edge stiff): each track must keep its kind, and the crossing
    // of flap 1 with 2P must lie where a bisection on directly solved modes puts it.
    let beam = BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1e4, 1.0);
    let r = rotor(2, 20.0 / RAD_S_PER_RPM, 24.0 / RAD_S_PER_RPM, 0.0);
    let model = BeamModel::new(&uniform(&beam, 0.0, 1.0), &r, &spec(30)).unwrap();
    let range = SpeedRange::for_rotor(&r, None).unwrap();
    let speeds = range.speeds(&[RotorSpeed::from_rad_s(r.omega_nominal)]);
    let mut calls = 0;
    let campbell = model
        .campbell(&speeds, 4, &mut |done, total| {
            calls += 1;
            assert!(done <= total);
        })
        .unwrap();
    assert_eq!(calls, speeds.len());
    for track in &campbell.tracks {
        let points = campbell.track_points(track.id);
        assert_eq!(points.len(), speeds.len(), "{} runs the whole sweep", track.label);
        assert!(points.windows(2).all(|w| w[1].1 >= w[0].1), "{} stiffens", track.label);
    }
    assert_eq!(campbell.tracks[0].label, "flap 1");
    let orders = excitation_orders(4, 2, 1);
    let crossings = campbell.crossings(&orders);
    let c = crossings.iter().find(|c| c.track == 0 && c.order == 2).expect("flap 1 meets 2P");
    let lo = flap_1_on_2p(&model, rpm_of(r.omega_max));
    // Linear interpolation over a step of rpm_max / 60: error of order step² f'' / 8, < 0.1 %.
    let rpm = c.speed.rpm();
    assert!((rpm / lo - 1.0).abs() < 1e-3, "{rpm} vs {lo} rpm");
    assert!((c.frequency_hz - 2.0 * rpm / 60.0).abs() < 1e-9);
}

#[test]
fn margins_are_the_separation_from_the_nearest_excitation() {
    let model = blade_model(20, false);
    let r = model.rotor().clone();
    let (nominal, max) =
        (RotorSpeed::from_rad_s(r.omega_nominal), RotorSpeed::from_rad_s(r.omega_max));
    let speeds = SpeedRange::for_rotor(&r, Some(RotorSpeed::from_rpm(600.0)))
        .unwrap()
        .speeds(&[nominal, max]);
    let campbell = model.campbell(&speeds, 6, &mut |_, _| {}).unwrap();
    let orders = excitation_orders(12, r.blades, 2);
    let checks = campbell.rotor_margins(&r, &orders, Some(0.05)).unwrap();
    assert_eq!(checks[0].speed.rpm(), rpm_of(r.omega_nominal));
    let direct = model.modes(nominal, 6).unwrap();
    for (m, d) in checks[0].modes.iter().zip(&direct.modes) {
        assert!((m.frequency_hz / d.frequency_hz - 1.0).abs() < 1e-9);
        // The least separation over all orders, by hand.
        let least = orders
            .iter()
            .map(|e| (d.frequency_hz - e.frequency_hz(nominal)).abs() / e.frequency_hz(nominal))
            .fold(f64::INFINITY, f64::min)
            * 100.0;
        assert!((m.margin * 100.0 - least).abs() < 1e-9, "{} vs {least}", m.margin * 100.0);
        assert_eq!(m.pass, Some(m.margin >= 0.05));
    }
    assert_eq!(checks[0].pass, Some(checks[0].modes.iter().all(|m| m.margin >= 0.05)));
    let unchecked = campbell.rotor_margins(&r, &orders, None).unwrap();
    assert!(unchecked.iter().all(|c| c.pass.is_none()));
    // Between sweep speeds the frequencies are interpolated along the tracks.
    let between = campbell.margins(&orders, "between", RotorSpeed::from_rpm(900.0), None).unwrap();
    assert_eq!(between.modes.len(), 6);
    assert!(matches!(
        campbell.margins(&orders, "beyond", RotorSpeed::from_rpm(5000.0), None),
        Err(ModalError::MarginSpeed { .. })
    ));
}

#[test]
fn matrix_market_files_hold_the_constrained_matrices() {
    let model = blade_model(8, true);
    let sys = model.system_matrices(RotorSpeed::from_rpm(3000.0)).unwrap();
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("matrices");
    let written = export_matrix_market(&out, &sys).unwrap();
    assert_eq!(written.len(), 3);
    for (name, matrix) in [("stiffness.mtx", &sys.stiffness), ("mass.mtx", &sys.mass)] {
        let text = std::fs::read_to_string(out.join(name)).unwrap();
        let mut lines = text.lines().filter(|l| !l.starts_with('%') || l.starts_with("%%"));
        assert_eq!(lines.next(), Some("%%MatrixMarket matrix coordinate real symmetric"));
        let size: Vec<usize> =
            lines.next().unwrap().split(' ').map(|v| v.parse().unwrap()).collect();
        assert_eq!(&size[..2], &[sys.dofs.len(), sys.dofs.len()]);
        let mut count = 0;
        for line in lines {
            let f: Vec<&str> = line.split(' ').collect();
            let (i, j): (usize, usize) = (f[0].parse().unwrap(), f[1].parse().unwrap());
            let v: f64 = f[2].parse().unwrap();
            assert_eq!(v, matrix.get(i - 1, j - 1));
            count += 1;
        }
        assert_eq!(count, size[2]);
    }
    let dofs = std::fs::read_to_string(out.join("dofs.csv")).unwrap();
    assert_eq!(dofs.lines().next(), Some("dof,node,r_m,quantity"));
    assert_eq!(dofs.lines().count(), sys.dofs.len() + 1);
    assert_eq!(std::fs::read_dir(&out).unwrap().count(), 3, "no temporary files left");
}

fn message(e: ModalError) -> String {
    e.to_string()
}

#[test]
fn bad_input_gets_a_clear_message() {
    let beam = BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1e4, 1.0);
    let r = rotor(2, 100.0, 200.0, 0.0);
    // Empty, reversed and negative speed ranges.
    let range = |from: f64, to: f64, step: f64| {
        SpeedRange::new(
            RotorSpeed::from_rpm(from),
            RotorSpeed::from_rpm(to),
            RotorSpeed::from_rpm(step),
        )
    };
    let m = message(range(0.0, 0.0, 10.0).unwrap_err());
    assert!(m.contains("speed range 0:0:10 rpm") && m.contains("empty"), "{m}");
    let m = message(range(-100.0, 1000.0, 10.0).unwrap_err());
    assert!(m.contains("negative"), "{m}");
    let m = message(range(0.0, 1000.0, 0.0).unwrap_err());
    assert!(m.contains("step must be positive"), "{m}");
    let m = message(range(0.0, f64::NAN, 1.0).unwrap_err());
    assert!(m.contains("finite"), "{m}");
    // More modes than degrees of freedom (2 elements: 16 free dofs).
    let model = BeamModel::new(&uniform(&beam, 0.0, 1.0), &r, &spec(2)).unwrap();
    let m = message(model.modes(RotorSpeed::ZERO, 40).unwrap_err());
    assert!(m.contains("40 modes asked for: expected 1 to 16"), "{m}");
    let m = message(model.modes(RotorSpeed::from_rpm(-5.0), 2).unwrap_err());
    assert!(m.contains("-5 rpm"), "{m}");
    // A section with zero stiffness names its radius and the term.
    let mut weak = beam.at(0.6);
    weak.ei_edge = 0.0;
    let sections = vec![beam.at(0.0).to_section(), weak.to_section(), beam.at(1.0).to_section()];
    let m = message(BeamModel::new(&sections, &r, &spec(10)).unwrap_err());
    assert_eq!(m, "section at r = 0.6 m has no stiffness: EI_edge = 0 (expected a positive value)");
    // Zero mass, radii out of order, too few sections, a NaN, a bad spring, no elements.
    let mut light = beam.at(1.0);
    light.mass_per_length = 0.0;
    let m = message(
        BeamModel::new(&[beam.to_section(), light.to_section()], &r, &spec(4)).unwrap_err(),
    );
    assert!(m.contains("r = 1 m has mass per length 0 kg/m"), "{m}");
    let back = vec![beam.at(0.5).to_section(), beam.at(0.2).to_section()];
    let m = message(BeamModel::new(&back, &r, &spec(4)).unwrap_err());
    assert!(m.contains("section 1 at r = 0.2 m does not lie beyond"), "{m}");
    let m = message(BeamModel::new(&[beam.to_section()], &r, &spec(4)).unwrap_err());
    assert!(m.contains("at least two sections"), "{m}");
    let mut nan = beam.at(1.0);
    nan.inertia = MassInertia { flap: f64::NAN, ..MassInertia::default() };
    let m =
        message(BeamModel::new(&[beam.to_section(), nan.to_section()], &r, &spec(4)).unwrap_err());
    assert!(m.contains("r = 1 m: inertia.flap is not a finite number"), "{m}");
    let springs = layloft::project::RootSprings { axial: 1.0, flap: -2.0, edge: 1.0, torsion: 1.0 };
    let m = message(
        BeamModel::new(&uniform(&beam, 0.0, 1.0), &r, &spec_with_springs(4, springs)).unwrap_err(),
    );
    assert!(m.contains("root spring flap = -2"), "{m}");
    let m = message(BeamModel::new(&uniform(&beam, 0.0, 1.0), &r, &spec(0)).unwrap_err());
    assert!(m.contains("elements = 0"), "{m}");
    // A coupling larger than the diagonal allows.
    let mut coupled = beam.clone();
    coupled.flap_twist = 2000.0;
    let m = message(BeamModel::new(&uniform(&coupled, 0.0, 1.0), &r, &spec(4)).unwrap_err());
    assert!(m.contains("not positive definite"), "{m}");
    assert!(ModalError::TooFewSections { found: 1 }.is_input());
}

#[test]
fn a_statically_unstable_blade_is_a_computation_error() {
    // Spin softening beyond the stiffness: a very soft in-plane beam spun fast enough that
    // Omega² m exceeds what bending and tension restore (omega_lag² = omega_flap² - Omega² < 0
    // cannot happen for a uniform beam at zero hub, so soften the axial direction instead:
    // EA / (m L²) < Omega² drives the radial mode through zero).
    let beam = BeamSection::uniform(0.0, 10.0, 1e6, 1.0, 1.0, 1.0);
    let model =
        BeamModel::new(&uniform(&beam, 0.0, 1.0), &rotor(2, 10.0, 20.0, 0.0), &spec(8)).unwrap();
    let e = model.modes(RotorSpeed::from_rad_s(60.0), 2).unwrap_err();
    assert!(!e.is_input());
    assert!(e.to_string().contains("not positive definite"), "{e}");
}

#[test]
fn massless_degrees_of_freedom_give_no_modes() {
    // No mass moment of inertia: twist carries no kinetic energy, so the 4-element model
    // (32 free dofs, 8 of them twist) has 24 finite modes; asking for more is an error, not
    // a hang or a mode at infinite frequency.
    let beam = BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1e4, 1.0);
    let model =
        BeamModel::new(&uniform(&beam, 0.0, 1.0), &rotor(2, 10.0, 20.0, 0.0), &spec(4)).unwrap();
    assert_eq!(model.dof_count(), 32);
    let set = model.modes(RotorSpeed::ZERO, 24).unwrap();
    assert!(set.modes.iter().all(|m| m.frequency_hz.is_finite() && m.shares.torsion < 1e-9));
    let e = model.modes(RotorSpeed::ZERO, 25).unwrap_err();
    assert!(
        e.to_string().contains("25 modes asked for, but the model has only 24 with mass"),
        "{e}"
    );
    assert!(e.is_input());
}

/// The modes solved cover the excitations: a mode may lie within the margin of an excitation
/// only if it lies below the highest excitation times `1 + margin`, so the count asked for is
/// raised until the highest mode solved lies above that. The uniform unit cantilever (EI = 1,
/// m = 1, L = 1, edge and torsion far above) turning at 0.1 rpm (the spin shifts the
/// frequencies by about 1e-8): its third flap mode stands at (7.8548²/2π) sqrt(EI/(m L⁴)) =
/// 9.8195 Hz (Blevins, Formulas for Natural Frequency and Mode Shape, table 8-1, clamped-free,
/// from memory). A fixed excitation there, with two modes asked for, was cleared by the two
/// modes solved; now four are solved (the fourth lies above 1.1 × 9.8195 Hz) and the third
/// fails the margin.
#[test]
fn the_modes_solved_reach_past_the_highest_excitation() {
    let beam = BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1e4, 1.0);
    let sections = uniform(&beam, 0.0, 1.0);
    let r = rotor(2, 0.1, 0.12, 0.0);
    let f3 = 7.8548_f64.powi(2) / (2.0 * std::f64::consts::PI);
    let excitation = ExcitationSpec {
        fixed: vec![FixedExcitation { name: "shaker".into(), from_hz: f3, to_hz: f3 }],
        ..ExcitationSpec::default()
    };
    let criteria = Criteria { frequency_margin: Some(0.1), harmonics: 2, ..Criteria::default() };
    let attachments = Attachments::default();
    let inputs = ModalInputs {
        sections: &sections,
        rotor: &r,
        spec: &spec(30),
        criteria: &criteria,
        attachments: &attachments,
        excitation: &excitation,
    };
    let run = ModalAnalysis::run_inputs(&inputs, None, Some(2), &mut |_, _| {}).unwrap();
    let c = run.coverage;
    assert_eq!((c.asked, c.solved), (2, 4), "{c:?}");
    assert!(c.covered() && (c.needed_hz / (1.1 * f3) - 1.0).abs() < 1e-12, "{c:?}");
    // Flap 4 at (10.9955²/2π) Hz (the same table).
    let f4 = 10.9955_f64.powi(2) / (2.0 * std::f64::consts::PI);
    assert!((c.highest_hz / f4 - 1.0).abs() < 1e-3, "{c:?}");
    let third = run.margins[0].modes.iter().find(|m| m.track == 2).expect("flap 3 is checked");
    assert!((third.frequency_hz / f3 - 1.0).abs() < 1e-4, "{third:?}");
    assert!(third.margin < 1e-4 && third.pass == Some(false), "{third:?}");
    assert_eq!(run.pass(), Some(false));
    // Without the fixed excitation the two modes asked for reach past 1.1 × 2P: none is added.
    let plain =
        ModalAnalysis::run(&sections, &r, &spec(30), &criteria, None, Some(2), &mut |_, _| {})
            .unwrap();
    assert_eq!((plain.coverage.solved, plain.pass()), (2, Some(true)));
}

/// With a least operating speed (`rpm_min`, a variable-speed drive) the band over which the
/// margin is demanded starts there: the uniform unit beam's flap 1 on 2P (placed by bisection
/// on directly solved modes, as in the crossing test) between the least and the nominal speed
/// fails the margin, though the margins at the least, nominal and maximum speed all clear 10 %;
/// the same rotor without a least speed (the band nominal to maximum) passes.
#[test]
fn a_crossing_between_the_least_and_the_nominal_speed_fails_the_margin() {
    let beam = BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1e4, 1.0);
    let probe = rotor(2, 20.0 / RAD_S_PER_RPM, 24.0 / RAD_S_PER_RPM, 0.0);
    let model = BeamModel::new(&uniform(&beam, 0.0, 1.0), &probe, &spec(30)).unwrap();
    let crossing = flap_1_on_2p(&model, rpm_of(probe.omega_max));
    let criteria = Criteria { frequency_margin: Some(0.1), harmonics: 2, ..Criteria::default() };
    let sections = uniform(&beam, 0.0, 1.0);
    let least = |m: &layloft::modal::MarginCheck| {
        m.modes.iter().map(|x| x.margin).fold(f64::INFINITY, f64::min)
    };
    // Least 30 % below the crossing, nominal 25 % and maximum 30 % above it.
    let fixed = rotor(2, 1.25 * crossing, 1.3 * crossing, 0.0);
    let run = |r: &layloft::project::Rotor| {
        ModalAnalysis::run(&sections, r, &spec(30), &criteria, None, Some(4), &mut |_, _| {})
            .unwrap()
    };
    let without = run(&fixed);
    let names: Vec<&str> = without.margins.iter().map(|m| m.name.as_str()).collect();
    assert_eq!(names, ["nominal", "maximum"]);
    assert_eq!(without.pass(), Some(true));
    let variable = layloft::project::Rotor { omega_min: rpm_to_rad_s(0.7 * crossing), ..fixed };
    let with = run(&variable);
    let names: Vec<&str> = with.margins.iter().map(|m| m.name.as_str()).collect();
    assert_eq!(names, ["minimum", "nominal", "maximum", "running"]);
    assert!(with.margins[..3].iter().all(|m| least(m) > 0.1 && m.pass == Some(true)));
    assert!((with.margins[0].speed.rpm() / (0.7 * crossing) - 1.0).abs() < 1e-9);
    let running = &with.margins[3];
    assert!((running.speed.rpm() / crossing - 1.0).abs() < 1e-3, "{:?}", running.speed);
    assert!(least(running) < 1e-9, "{running:?}");
    assert_eq!(with.pass(), Some(false));
}

/// A crossing between the nominal and the maximum speed fails the margin check: the rotor runs
/// at every speed from the one to the other (a margin is demanded at the maximum). The uniform
/// unit beam of the crossing test: flap 1 meets 2P where a bisection on directly solved modes
/// puts it (as there); a rotor with that speed between its nominal and maximum has a least
/// margin of 0 there, though the margins at both ends clear 10 %. Before, only the two ends were
/// checked and the rotor passed.
#[test]
fn a_crossing_between_the_nominal_and_the_maximum_speed_fails_the_margin() {
    let beam = BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1e4, 1.0);
    let probe = rotor(2, 20.0 / RAD_S_PER_RPM, 24.0 / RAD_S_PER_RPM, 0.0);
    let model = BeamModel::new(&uniform(&beam, 0.0, 1.0), &probe, &spec(30)).unwrap();
    let crossing = flap_1_on_2p(&model, rpm_of(probe.omega_max));
    // Nominal 30 % below the crossing, maximum 30 % above: flap 1 stands well off 2P at both.
    let r = rotor(2, 0.7 * crossing, 1.3 * crossing, 0.0);
    let criteria = Criteria { frequency_margin: Some(0.1), harmonics: 2, ..Criteria::default() };
    let sections = uniform(&beam, 0.0, 1.0);
    let run =
        ModalAnalysis::run(&sections, &r, &spec(30), &criteria, None, Some(4), &mut |_, _| {})
            .unwrap();
    let least = |m: &layloft::modal::MarginCheck| {
        m.modes.iter().map(|x| x.margin).fold(f64::INFINITY, f64::min)
    };
    let ends: Vec<_> = run.margins.iter().filter(|m| m.name != "running").collect();
    assert_eq!(ends.len(), 2);
    assert!(ends.iter().all(|m| least(m) > 0.1 && m.pass == Some(true)), "{ends:?}");
    let running = run.margins.iter().find(|m| m.name == "running").expect("the running check");
    // The crossing's speed, found by linear interpolation along the sweep (< 0.1 %, as in the
    // crossing test), with the margin of a mode on its excitation line.
    assert!((running.speed.rpm() / crossing - 1.0).abs() < 1e-3, "{:?}", running.speed);
    assert!(least(running) < 1e-9, "{running:?}");
    assert_eq!(running.pass, Some(false));
    assert_eq!(run.pass(), Some(false));
}
