//! Mesh convergence of the demo blades' modes: doubling the beam elements from 40 to 80 changes
//! the lowest six frequencies at the nominal and maximum speeds by less than 0.2 % (the
//! acceptance figure of the modal issue; Hermite beam elements converge as h⁴, Cook et al.,
//! Concepts and Applications of Finite Element Analysis, 4th ed., 2002, §4.9 — from memory).

use layloft::analysis::BladeModel;
use layloft::input::read_project;
use layloft::modal::BeamModel;
use layloft::units::{RotorSpeed, rpm_of};

#[test]
fn doubling_the_elements_moves_the_demo_frequencies_by_less_than_a_fifth_of_a_percent() {
    for demo in ["layups/mine-fan/blade.toml", "layups/small-wind/blade.toml"] {
        let model = BladeModel::build(read_project(demo.as_ref()).unwrap()).unwrap();
        let p = &model.project;
        let sections = model.properties();
        let mut coarse = p.modal.clone();
        coarse.elements = 40;
        let mut fine = p.modal.clone();
        fine.elements = 80;
        let a = BeamModel::new(&sections, &p.rotor, &coarse).unwrap();
        let b = BeamModel::new(&sections, &p.rotor, &fine).unwrap();
        let mut worst: f64 = 0.0;
        for rpm in [rpm_of(p.rotor.omega_nominal), rpm_of(p.rotor.omega_max)] {
            let fa = a.modes(RotorSpeed::from_rpm(rpm), 6).unwrap();
            let fb = b.modes(RotorSpeed::from_rpm(rpm), 6).unwrap();
            for (ma, mb) in fa.modes.iter().zip(&fb.modes) {
                let change = (ma.frequency_hz - mb.frequency_hz).abs() / mb.frequency_hz;
                worst = worst.max(change);
                assert!(
                    change < 2e-3,
                    "{demo} at {rpm} rpm: {:.4} Hz -> {:.4} Hz ({:.3} %)",
                    ma.frequency_hz,
                    mb.frequency_hz,
                    100.0 * change
                );
            }
        }
        eprintln!("{demo}: largest change {:.2e} %", 100.0 * worst);
    }
}
