//! Campbell sweep speed: 61 speeds, 100 elements, the lowest 10 modes (band shift-invert
//! Lanczos), against a dense full solve of the same matrices (nalgebra `SymmetricEigen` on the
//! Cholesky-reduced problem). The blade is the invented twisted, coupled blade of the tests.
//! Group `demo_sweep`: the whole modal stage of the mine-fan demo (its own sweep and modes)
//! bare, and with point masses (its balance screw and an invented 30 g tip weight with rotary
//! inertia) and sea water round it (added mass, plus the dry modes at three speeds). On the
//! shared machine wall time drifts between runs: compare the three within one run, or count
//! instructions (callgrind). The wet run's extra cost is the dry model and its modes at three
//! speeds (about 5 % of the sweep's instructions); the wet sweep takes as many Lanczos steps as
//! the dry one.

#[path = "../tests/modal_support/mod.rs"]
mod modal_support;

use std::hint::black_box;

#[path = "kit/mod.rs"]
mod kit;
use kit::Runner;
use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::modal::{
    Attachments, BeamModel, FluidSection, LanczosParams, ModalAnalysis, ModalInputs, SpeedRange,
    solve_dense, solve_lowest,
};
use layloft::project::{ExcitationSpec, PointMass};
use layloft::units::RotorSpeed;
use modal_support::{rotor, spec, twisted_blade};

fn model() -> BeamModel {
    BeamModel::new(&twisted_blade(11), &rotor(5, 3000.0, 3600.0, 8.0), &spec(100))
        .expect("the benchmark blade is valid")
}

fn sweep(c: &mut Runner) {
    let model = model();
    let r = model.rotor().clone();
    let max = RotorSpeed::from_rad_s(r.omega_max);
    let speeds =
        SpeedRange::new(RotorSpeed::ZERO, max, max / 60.0).expect("valid range").speeds(&[]);
    assert_eq!(speeds.len(), 61);
    let mut group = c.benchmark_group("modal");
    group.sample_size(10);
    group.bench_function("campbell_61_speeds_100_elements_10_modes", |b| {
        b.iter(|| black_box(model.campbell(&speeds, 10, &mut |_, _| {}).expect("converges")))
    });
    let sys = model.system_matrices(RotorSpeed::from_rad_s(r.omega_nominal)).expect("valid speed");
    group.bench_function("lanczos_one_speed_10_modes", |b| {
        b.iter(|| {
            black_box(
                solve_lowest(&sys.stiffness, &sys.mass, 10, &LanczosParams::default())
                    .expect("converges"),
            )
        })
    });
    let (k, m) = (sys.stiffness.to_dense(), sys.mass.to_dense());
    group.bench_function("dense_full_solve_one_speed", |b| {
        b.iter(|| black_box(solve_dense(&k, &m).expect("positive definite")))
    });
    group.finish();
}

fn demo_sweep(c: &mut Runner) {
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/layups/mine-fan/blade.toml");
    let project = read_project(path.as_ref()).expect("the demo reads");
    let model = BladeModel::build(project).expect("the demo builds");
    let p = &model.project;
    let sections = model.properties();
    let bare = Attachments::default();
    let mut masses = p.point_masses.clone();
    masses.push(PointMass {
        name: "tip-weight".into(),
        r: 0.88,
        mass: 0.03,
        y: 0.01,
        z: 0.0,
        inertia: [2e-6, 1e-6, 1.5e-6],
    });
    let mut wet = Attachments::of_point_masses(&masses);
    let fluid: Vec<FluidSection> = model
        .stations
        .iter()
        .filter_map(|s| FluidSection::of_outline(s.layout.r, &s.layout.outer))
        .collect();
    wet.fluid = Some((1025.0, fluid));
    let excitation = ExcitationSpec { vanes: vec![11], vane_multiples: 2, ..Default::default() };
    let run = |attachments: &Attachments| {
        let inputs = ModalInputs {
            sections: &sections,
            rotor: &p.rotor,
            spec: &p.modal,
            criteria: &p.criteria,
            attachments,
            excitation: &excitation,
        };
        ModalAnalysis::run_inputs(&inputs, None, None, &mut |_, _| {}).expect("the demo solves")
    };
    let mut group = c.benchmark_group("demo_sweep");
    group.sample_size(10);
    group.bench_function("mine_fan_bare", |b| b.iter(|| black_box(run(&bare))));
    let dry = wet.dry();
    group.bench_function("mine_fan_point_masses", |b| b.iter(|| black_box(run(&dry))));
    group.bench_function("mine_fan_point_masses_and_water", |b| b.iter(|| black_box(run(&wet))));
    group.finish();
}

bench_main!(sweep, demo_sweep);
