//! Rotating-blade modes against published values, closed forms and an independent numerical
//! method. Each check names its source beside the assertion; tolerances are justified where
//! they are set. The finite-element model converges as h⁴, so with 40 elements its own error is
//! far below every tolerance here (see `frequencies_converge_with_element_doubling` in
//! `modal_laws.rs`).

use std::f64::consts::PI;

use crate::modal_support::*;
use layloft::modal::{BeamModel, BeamSection, ModeKind, excitation_orders};
use layloft::section::MassInertia;
use layloft::units::RotorSpeed;

/// Clamped–free beta_n L (Thomson, *Theory of Vibration with Applications*, App. D; the same in
/// Blevins, *Formulas for Natural Frequency and Mode Shape*, 1979, table 8-1).
const BETA_L: [f64; 4] = [1.875_104_069, 4.694_091_133, 7.854_757_438, 10.995_540_73];

/// Wright, Smith, Thompson & Green, J. Appl. Mech. 49 (1982) 197–202, and Hodges & Rutkowski,
/// AIAA J. 19 (1981) 1459–1466: uniform rotating cantilever, hub radius zero, flapwise,
/// omega sqrt(m L⁴ / EI) at lambda = Omega sqrt(m L⁴ / EI). Table values from memory; digits
/// recomputed by a Frobenius series (six significant figures).
const LAMBDA: [f64; 8] = [0.0, 1.0, 2.0, 4.0, 6.0, 8.0, 10.0, 12.0];
const ROTATING_FLAP: [[f64; 8]; 3] = [
    [3.51602, 3.68165, 4.13732, 5.58500, 7.36037, 9.25684, 11.20233, 13.17015],
    [22.03449, 22.18101, 22.61492, 24.27335, 26.80908, 29.99538, 33.64037, 37.60311],
    [61.69721, 61.84176, 62.27318, 63.96676, 66.68391, 70.29296, 74.64929, 79.61448],
];

/// A unit beam (EI = m = L = 1) with stiff edge, torsion and axial directions, so that its
/// lowest modes are flapwise. Edge bending 1e4 times stiffer, EA and GJ large.
fn unit_flap_beam() -> BeamSection {
    BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1e4, 1.0)
}

/// Rotor speed for a nondimensional speed lambda of the unit beam (lambda rad/s).
fn speed_of(lambda: f64) -> RotorSpeed {
    RotorSpeed::from_rad_s(lambda)
}

fn omegas(model: &BeamModel, speed: RotorSpeed, count: usize, kind: ModeKind) -> Vec<f64> {
    let set = model.modes(speed, count).unwrap();
    set.modes.iter().filter(|m| m.kind == kind).map(|m| 2.0 * PI * m.frequency_hz).collect()
}

#[test]
fn non_rotating_cantilever_matches_the_clamped_free_roots() {
    // omega_n = (beta_n L)² sqrt(EI / (m L⁴)) (Blevins 1979, table 8-1; Thomson App. D).
    // An invented beam: EI 250 N·m², m 1.5 kg/m, L 0.8 m, from a hub at r = 0.3 m.
    let (ei, m, l) = (250.0, 1.5, 0.8);
    let beam = BeamSection::uniform(0.3, 1e9, 1e5, ei, 40.0 * ei, m);
    let model =
        BeamModel::new(&uniform(&beam, 0.3, l), &rotor(3, 1000.0, 1200.0, 0.0), &spec(40)).unwrap();
    let flap = omegas(&model, RotorSpeed::ZERO, 5, ModeKind::Flap);
    for (n, bl) in BETA_L.iter().enumerate() {
        let exact = bl * bl * (ei / (m * l.powi(4))).sqrt();
        // The roots are printed to 10 digits; the FE error of mode 4 with 40 elements is about
        // 4e-6 (h⁴ convergence), so 1e-5.
        let rel = (flap[n] / exact - 1.0).abs();
        assert!(rel < 1e-5, "flap mode {}: {} vs {exact} rad/s ({rel:e})", n + 1, flap[n]);
    }
}

#[test]
fn rotating_flap_frequencies_match_the_published_table() {
    // Wright et al. 1982 / Hodges & Rutkowski 1981 (see ROTATING_FLAP): within 0.5 % is the
    // requirement; the table has six figures, so 2e-5 is asserted.
    let beam = unit_flap_beam();
    let model =
        BeamModel::new(&uniform(&beam, 0.0, 1.0), &rotor(2, 100.0, 200.0, 0.0), &spec(40)).unwrap();
    for (j, &lambda) in LAMBDA.iter().enumerate() {
        let flap = omegas(&model, speed_of(lambda), 3, ModeKind::Flap);
        assert_eq!(flap.len(), 3, "three flap modes at lambda {lambda}");
        for n in 0..3 {
            let table = ROTATING_FLAP[n][j];
            let rel = (flap[n] / table - 1.0).abs();
            assert!(
                rel < 2e-5,
                "lambda {lambda}, mode {}: {} vs {table} ({rel:e})",
                n + 1,
                flap[n]
            );
        }
    }
}

#[test]
fn in_plane_modes_soften_by_the_square_of_the_rotor_speed() {
    // Uniform beam, hub radius zero, equal stiffness in both planes: the in-plane equation is the
    // flapwise one with -m Omega² v added, so omega_lag² = omega_flap² - Omega² (the relation
    // quoted with the Wright et al. 1982 table; e.g. Bielawa 2006, ch. 4, from memory).
    let beam = BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1.0, 1.0);
    let model =
        BeamModel::new(&uniform(&beam, 0.0, 1.0), &rotor(2, 100.0, 200.0, 0.0), &spec(40)).unwrap();
    for (j, &lambda) in LAMBDA.iter().enumerate().skip(1) {
        let edge = omegas(&model, speed_of(lambda), 6, ModeKind::Edge);
        for n in 0..3 {
            let expected = (ROTATING_FLAP[n][j].powi(2) - lambda * lambda).sqrt();
            let rel = (edge[n] / expected - 1.0).abs();
            assert!(rel < 2e-5, "lambda {lambda}, lag mode {}: {} vs {expected}", n + 1, edge[n]);
        }
    }
}

#[test]
fn a_non_zero_hub_radius_agrees_with_an_independent_shooting_solution() {
    // Hub radius R = 0.5 L: the tension gains Omega² m R (L - x). Reference: RK4 shooting on the
    // beam equation (tests/modal_support), itself checked against the table at R = 0 below.
    let beam = unit_flap_beam();
    let lambda = 6.0;
    let zero_hub = shooting_frequencies(1.0, 1.0, 1.0, 0.0, lambda, None, 2);
    assert!((zero_hub[0] / ROTATING_FLAP[0][4] - 1.0).abs() < 1e-5, "{zero_hub:?}");
    assert!((zero_hub[1] / ROTATING_FLAP[1][4] - 1.0).abs() < 1e-5, "{zero_hub:?}");
    let reference = shooting_frequencies(1.0, 1.0, 1.0, 0.5, lambda, None, 3);
    let model =
        BeamModel::new(&uniform(&beam, 0.5, 1.0), &rotor(2, 100.0, 200.0, 0.0), &spec(40)).unwrap();
    let flap = omegas(&model, speed_of(lambda), 3, ModeKind::Flap);
    for n in 0..3 {
        // RK4 with 4000 steps and 60 bisections: better than 1e-8; 1e-6 allows for both.
        let rel = (flap[n] / reference[n] - 1.0).abs();
        assert!(rel < 1e-6, "mode {}: {} vs {} ({rel:e})", n + 1, flap[n], reference[n]);
    }
}

#[test]
fn a_root_spring_agrees_with_an_independent_shooting_solution() {
    // Flexible hub: rotational spring k = 5 EI / L at the root, non-rotating and at lambda 4.
    // Reference: RK4 shooting with EI w''(0) = k w'(0) (tests/modal_support).
    let beam = unit_flap_beam();
    let springs = layloft::project::RootSprings { axial: 1e9, flap: 5.0, edge: 1e6, torsion: 1e6 };
    let model = BeamModel::new(
        &uniform(&beam, 0.0, 1.0),
        &rotor(2, 100.0, 200.0, 0.0),
        &spec_with_springs(40, springs),
    )
    .unwrap();
    for lambda in [0.0, 4.0] {
        let reference = shooting_frequencies(1.0, 1.0, 1.0, 0.0, lambda, Some(5.0), 3);
        let flap = omegas(&model, speed_of(lambda), 3, ModeKind::Flap);
        for n in 0..3 {
            let rel = (flap[n] / reference[n] - 1.0).abs();
            assert!(rel < 1e-6, "lambda {lambda} mode {}: {} vs {}", n + 1, flap[n], reference[n]);
        }
    }
    // A clamped root is the limit of a stiff spring (the same beam, table at lambda 4).
    let stiff = layloft::project::RootSprings { flap: 1e9, ..springs };
    let model = BeamModel::new(
        &uniform(&beam, 0.0, 1.0),
        &rotor(2, 100.0, 200.0, 0.0),
        &spec_with_springs(40, stiff),
    )
    .unwrap();
    let flap = omegas(&model, speed_of(4.0), 1, ModeKind::Flap);
    assert!((flap[0] / ROTATING_FLAP[0][3] - 1.0).abs() < 1e-5, "{flap:?}");
}

#[test]
fn torsion_and_axial_frequencies_of_a_uniform_cantilever() {
    // Fixed–free rod and shaft: omega_n = (2n - 1)(pi/2) sqrt(EA / (m L²)) and
    // (2n - 1)(pi/2) sqrt(GJ / (I_p L²)) (Rao, Mechanical Vibrations, §8.2, from memory).
    // Invented data: EA 2e5 N, GJ 40 N·m², m 2 kg/m, I_p 3e-3 kg·m, L 1.2 m; bending very stiff.
    let (ea, gj, m, ip, l) = (2e5, 40.0, 2.0, 3e-3, 1.2);
    let mut beam = BeamSection::uniform(0.1, ea, gj, 1e7, 2e7, m);
    beam.inertia = MassInertia { flap: ip / 3.0, edge: 2.0 * ip / 3.0, polar: ip, product: 0.0 };
    let model =
        BeamModel::new(&uniform(&beam, 0.1, l), &rotor(2, 100.0, 200.0, 0.0), &spec(40)).unwrap();
    let set = model.modes(RotorSpeed::ZERO, 10).unwrap();
    let of = |kind| -> Vec<f64> {
        set.modes.iter().filter(|m| m.kind == kind).map(|m| 2.0 * PI * m.frequency_hz).collect()
    };
    let (torsion, axial) = (of(ModeKind::Torsion), of(ModeKind::Axial));
    assert!(torsion.len() >= 3 && axial.len() >= 3, "{torsion:?} {axial:?}");
    for n in 0..3 {
        let k = (2 * n + 1) as f64 * PI / 2.0;
        let t = k * (gj / (ip * l * l)).sqrt();
        let a = k * (ea / (m * l * l)).sqrt();
        // Quadratic elements, 40 of them: the h⁴ error of mode 3 is about 1e-6, so 1e-5.
        assert!((torsion[n] / t - 1.0).abs() < 1e-5, "torsion {}: {} vs {t}", n + 1, torsion[n]);
        assert!((axial[n] / a - 1.0).abs() < 1e-5, "axial {}: {} vs {a}", n + 1, axial[n]);
    }
}

#[test]
fn the_propeller_moment_shifts_torsion_by_the_inertia_difference() {
    // Uniform blade with its mass centre on the pitch axis: the propeller moment adds the
    // constant Omega² (J_yy - J_zz) per length in rotor axes, so every torsion mode obeys
    // omega² = omega_0² + Omega² [(I_edge - I_flap) cos 2phi - 2 I_yz sin 2phi] / I_p
    // (Bielawa 2006, ch. 4, from memory; derived for this uniform case). EA is made so large
    // that the tension term N k_A² theta'² is negligible (k_A² = (EI_f + EI_e) / EA = 2e-8 m²).
    let (gj, ip, l) = (40.0, 3e-3, 1.0);
    let mut beam = BeamSection::uniform(0.0, 1e12, gj, 1e4, 1e4, 2.0);
    beam.inertia = MassInertia { flap: 0.5e-3, edge: 2.5e-3, polar: ip, product: 0.2e-3 };
    let omega_rot = 60.0;
    for pitch_deg in [0.0, 30.0, 90.0] {
        let model =
            BeamModel::new(&uniform(&beam, 0.0, l), &rotor(2, 100.0, 1000.0, pitch_deg), &spec(30))
                .unwrap();
        let set = model.modes(RotorSpeed::from_rad_s(omega_rot), 12).unwrap();
        let torsion: Vec<f64> = set
            .modes
            .iter()
            .filter(|m| m.kind == ModeKind::Torsion)
            .map(|m| 2.0 * PI * m.frequency_hz)
            .collect();
        let phi = pitch_deg.to_radians();
        let dj = (2.5e-3 - 0.5e-3) * (2.0 * phi).cos() - 2.0 * 0.2e-3 * (2.0 * phi).sin();
        assert!(torsion.len() >= 2, "{torsion:?}");
        for (n, &found) in torsion.iter().take(2).enumerate() {
            let w0 = (2 * n + 1) as f64 * PI / 2.0 * (gj / (ip * l * l)).sqrt();
            let expected = (w0 * w0 + omega_rot * omega_rot * dj / ip).sqrt();
            let rel = (found / expected - 1.0).abs();
            assert!(rel < 1e-5, "pitch {pitch_deg}, torsion {}: {found} vs {expected}", n + 1);
        }
    }
}

#[test]
fn coupled_bending_torsion_matches_banerjee() {
    // Banerjee, "Coupled bending–torsional dynamic stiffness matrix for beam elements",
    // Int. J. Numer. Meth. Eng. 28 (1989) 1283–1298: cantilever, L 6 m, EI 9.75e6 N·m²,
    // GJ 9.88e5 N·m², m 35.75 kg/m, I_alpha 8.64 kg·m about the elastic axis, mass axis 0.18 m
    // behind the elastic axis (inputs from memory). Exact-determinant frequencies (recomputed;
    // the paper's agree to about 0.1 %): 49.615, 97.098, 248.970, 355.688, 451.703, 610.646 rad/s.
    // Elastic axis = pitch axis; in-plane bending and extension made stiff enough to stay above.
    let (m, x_alpha, i_alpha) = (35.75, 0.18, 8.64);
    let mut beam = BeamSection::uniform(0.0, 1e12, 9.88e5, 9.75e6, 9.75e10, m);
    beam.mass_centre = [x_alpha, 0.0];
    // About the mass centre: I_alpha - m x_alpha², all as "edge" (no flapwise rotary inertia,
    // as in Banerjee's Euler–Bernoulli model).
    beam.inertia =
        MassInertia { flap: 0.0, edge: i_alpha - m * x_alpha * x_alpha, polar: 0.0, product: 0.0 };
    let model =
        BeamModel::new(&uniform(&beam, 0.0, 6.0), &rotor(2, 100.0, 200.0, 0.0), &spec(60)).unwrap();
    let set = model.modes(RotorSpeed::ZERO, 6).unwrap();
    let expected = [49.615, 97.098, 248.970, 355.688, 451.703, 610.646];
    for (mode, e) in set.modes.iter().zip(expected) {
        let w = 2.0 * PI * mode.frequency_hz;
        // Reference printed to 5–6 figures: 2e-5.
        assert!((w / e - 1.0).abs() < 2e-5, "{w} vs {e} rad/s");
        assert!(mode.shares.flap + mode.shares.torsion > 0.999, "{:?}", mode.shares);
    }
    // The modes really are coupled: each of the first three has both flap and twist in it.
    for mode in &set.modes[..3] {
        assert!(mode.shares.flap > 0.01 && mode.shares.torsion > 0.01, "{:?}", mode.shares);
    }
}

/// The Banerjee beam of `coupled_bending_torsion_matches_banerjee` with its elastic axis at
/// `at` (m, chord frame) from the pitch axis: the elastic and shear centres (one point for
/// `BeamSection`) and the mass centre all move by `at`.
fn banerjee_beam_at(at: [f64; 2]) -> BeamSection {
    let (m, x_alpha, i_alpha) = (35.75, 0.18, 8.64);
    let mut beam = BeamSection::uniform(0.0, 1e12, 9.88e5, 9.75e6, 9.75e10, m);
    beam.elastic_centre = at;
    beam.mass_centre = [at[0] + x_alpha, at[1]];
    beam.inertia =
        MassInertia { flap: 0.0, edge: i_alpha - m * x_alpha * x_alpha, polar: 0.0, product: 0.0 };
    beam
}

#[test]
fn coupled_bending_torsion_does_not_depend_on_where_the_pitch_axis_lies() {
    // The same beam as Banerjee's (Int. J. Numer. Meth. Eng. 28 (1989) 1283–1298, values as in
    // `coupled_bending_torsion_matches_banerjee`) described from a pitch axis 0.25 m ahead of
    // its elastic axis, 0.4 m behind it, and 0.1 m ahead and 0.05 m above (the edgewise
    // direction, 1e4 times stiffer, then couples too): a beam does not know where a drawing puts its
    // reference line, so the non-rotating frequencies are Banerjee's. The section twists about
    // its shear centre; bending the pitch-axis line instead (which moves by e theta as the
    // section twists) stores a bending energy EI (e theta'')² that is not there.
    let expected = [49.615, 97.098, 248.970, 355.688, 451.703, 610.646];
    for at in [[0.25, 0.0], [-0.4, 0.0], [0.1, 0.05]] {
        let ahead = at[0];
        let beam = banerjee_beam_at(at);
        let model =
            BeamModel::new(&uniform(&beam, 0.0, 6.0), &rotor(2, 100.0, 200.0, 0.0), &spec(60))
                .unwrap();
        let set = model.modes(RotorSpeed::ZERO, 6).unwrap();
        for (mode, e) in set.modes.iter().zip(expected) {
            let w = 2.0 * PI * mode.frequency_hz;
            // As in the Banerjee test: 2e-5.
            assert!((w / e - 1.0).abs() < 2e-5, "elastic axis at {at:?} m: {w} vs {e} rad/s");
        }
        // The mode shapes are the pitch axis's: in the first mode the pitch axis moves by the
        // shear centre's deflection less `ahead` times the twist (rigid section).
        let first = &set.modes[0].shape;
        let reference = BeamModel::new(
            &uniform(&banerjee_beam_at([0.0, 0.0]), 0.0, 6.0),
            &rotor(2, 100.0, 200.0, 0.0),
            &spec(60),
        )
        .unwrap();
        let own = &reference.modes(RotorSpeed::ZERO, 1).unwrap().modes[0].shape;
        let tip = own.r.len() - 1;
        // Scale the reference so its twist at the tip matches (shapes are scaled to their own
        // largest value, which differs between the two descriptions).
        let k = first.twist[tip] / own.twist[tip];
        for i in [tip / 2, tip] {
            let moved = k * (own.out_of_plane[i] - ahead * own.twist[i]);
            let scale = first.out_of_plane[tip].abs();
            assert!(
                (first.out_of_plane[i] - moved).abs() < 1e-6 * scale,
                "elastic axis at {at:?} m, node {i}: {} vs {moved}",
                first.out_of_plane[i]
            );
        }
    }
}

#[test]
fn a_stiff_blade_on_its_pitch_spring_turns_about_the_pitch_axis() {
    // A blade far stiffer than its root's pitch spring turns as a rigid body about the pitch
    // axis, where the bearing holds it: omega² = k / (L (I_own + m d²)), d the mass centre's
    // distance from the pitch axis (rigid-body rotation; Thomson, *Theory of Vibration with
    // Applications*, ch. 2, from memory). Invented: 2 kg/m over 1.5 m, own polar inertia
    // 0.01 kg·m²/m, mass and shear centre 0.12 m behind the pitch axis, k 800 N·m/rad. Taken
    // about the shear centre instead the blade would turn about it: 0.01 against 0.0388 kg·m.
    let (m, length, own, d, k) = (2.0, 1.5, 0.01, 0.12, 800.0);
    let mut beam = BeamSection::uniform(0.2, 1e9, 1e9, 1e9, 1e9, m);
    beam.elastic_centre = [d, 0.0];
    beam.mass_centre = [d, 0.0];
    beam.inertia = MassInertia { flap: 0.0, edge: own, polar: 0.0, product: 0.0 };
    let springs = layloft::project::RootSprings { axial: 1e9, flap: 1e9, edge: 1e9, torsion: k };
    let model = BeamModel::new(
        &uniform(&beam, 0.2, length),
        &rotor(2, 100.0, 200.0, 0.0),
        &spec_with_springs(20, springs),
    )
    .unwrap();
    let set = model.modes(RotorSpeed::ZERO, 1).unwrap();
    let w = 2.0 * PI * set.modes[0].frequency_hz;
    let exact = (k / (length * (own + m * d * d))).sqrt();
    // The blade is not quite rigid: the offset mass's inertia bends it flapwise. That lowers the
    // frequency in proportion to its compliance (by 1.1e-3, 1.1e-4 and 1.1e-5 with every
    // stiffness at 1e7, 1e8 and 1e9, measured), so 2e-5 at 1e9.
    assert!((w / exact - 1.0).abs() < 2e-5, "{w} vs {exact} rad/s");
}

#[test]
fn fifteen_blades_at_1500_rpm_give_25_hz_and_375_hz() {
    // Fact of the trade: 1P = rpm / 60; blade passing = B × 1P.
    let orders = excitation_orders(12, 15, 2);
    let one = orders.iter().find(|e| e.order == 1).unwrap();
    assert!(!one.blade_passing);
    assert!((one.frequency_hz(RotorSpeed::from_rpm(1500.0)) - 25.0).abs() < 1e-12);
    let bpf = orders.iter().find(|e| e.blade_passing).unwrap();
    assert_eq!(bpf.order, 15);
    assert!((bpf.frequency_hz(RotorSpeed::from_rpm(1500.0)) - 375.0).abs() < 1e-12);
    assert!(orders.iter().any(|e| e.order == 30 && e.blade_passing));
    assert_eq!(orders.len(), 14);
}

#[test]
fn a_blade_pitched_to_90_degrees_bends_its_weak_axis_in_the_plane_of_rotation() {
    // Frame check: at phi = 90° the chord normal (the weak, flapwise section axis) lies in the
    // plane of rotation, so the weak-axis modes soften: omega² = omega_table² - Omega²
    // (Wright et al. 1982 table with the spin-softening relation, as above), and are classed
    // as in-plane (edge) in the rotor frame.
    let beam = unit_flap_beam();
    let model = BeamModel::new(&uniform(&beam, 0.0, 1.0), &rotor(2, 100.0, 200.0, 90.0), &spec(40))
        .unwrap();
    let lambda = 4.0;
    let edge = omegas(&model, speed_of(lambda), 3, ModeKind::Edge);
    assert_eq!(edge.len(), 3);
    for (n, &found) in edge.iter().enumerate() {
        let expected = (ROTATING_FLAP[n][3].powi(2) - lambda * lambda).sqrt();
        assert!((found / expected - 1.0).abs() < 2e-5, "mode {}: {found} vs {expected}", n + 1);
    }
    // At rest the pitch changes nothing (a rigid turn of the whole beam).
    let still = omegas(&model, RotorSpeed::ZERO, 3, ModeKind::Edge);
    for (n, &found) in still.iter().enumerate() {
        assert!((found / ROTATING_FLAP[n][0] - 1.0).abs() < 2e-5, "mode {}: {found}", n + 1);
    }
}

#[test]
fn torsion_under_centrifugal_tension_agrees_with_an_independent_shooting_solution() {
    // The tension term N k_A² theta'² (Hodges & Dowell, NASA TN D-7818, 1974, from memory) and
    // the propeller moment together, checked against RK4 shooting of
    // [(GJ + N k²) theta']' + (I_p omega² - Omega² dJ) theta = 0 (tests/modal_support).
    // Invented data chosen so that N k² is about half of GJ at the root.
    let (gj, m, l, omega_rot) = (1.0, 1.0, 1.0, 10.0);
    let mut beam = BeamSection::uniform(0.0, 1000.0, gj, 1.0, 10.0, m);
    beam.inertia = MassInertia { flap: 0.002, edge: 0.008, polar: 0.01, product: 0.0 };
    let k2 = (1.0 + 10.0) / 1000.0;
    let model =
        BeamModel::new(&uniform(&beam, 0.0, l), &rotor(2, 10.0, 200.0, 0.0), &spec(40)).unwrap();
    let set = model.modes(RotorSpeed::from_rad_s(omega_rot), 12).unwrap();
    let torsion: Vec<f64> = set
        .modes
        .iter()
        .filter(|m| m.kind == ModeKind::Torsion)
        .map(|m| 2.0 * PI * m.frequency_hz)
        .collect();
    let reference = shooting_torsion(gj, 0.01, 0.008 - 0.002, m * k2, l, omega_rot, 2);
    assert!(torsion.len() >= 2, "{torsion:?}");
    for n in 0..2 {
        // RK4 (4000 steps) and quadratic elements (40): both better than 1e-6.
        let rel = (torsion[n] / reference[n] - 1.0).abs();
        assert!(
            rel < 1e-5,
            "torsion {}: {} vs {} rad/s ({rel:e})",
            n + 1,
            torsion[n],
            reference[n]
        );
    }
    // The tension term matters here: without it the first frequency would be far lower.
    let without = shooting_torsion(gj, 0.01, 0.006, 0.0, l, omega_rot, 1);
    assert!(torsion[0] > 1.1 * without[0]);
}

/// The frequencies at standstill of an invented untwisted blade of constant chord (a cambered
/// NACA 4418, 0.2 m chord from 0.3 to 1.3 m, glass skin, carbon cap and one web), its stations
/// given with the pitch axis at `pitch_axis_frac` of the chord. `attached`: in sea water, with a
/// 0.3 kg point mass at 1.1 m radius, 0.6 of the chord from the leading edge, 5 mm above the
/// chord line (the same place whatever the axis).
fn untwisted_blade_frequencies(pitch_axis_frac: f64, attached: bool) -> Vec<f64> {
    let dir = tempfile::tempdir().unwrap();
    let write = |name: &str, text: &str| std::fs::write(dir.path().join(name), text).unwrap();
    let extra = if attached {
        format!(
            "[fluid]\ndensity_kg_m3 = 1025\n[[point_mass]]\nname = \"balance\"\nr_m = 1.1\n\
             mass_kg = 0.3\ny_m = {}\nz_m = 0.005\n",
            (0.6 - pitch_axis_frac) * 0.2
        )
    } else {
        String::new()
    };
    write(
        "blade.toml",
        &format!(
            "name = \"untwisted (invented)\"\n[rotor]\nblades = 3\nhub_radius_m = 0.30\n\
             tip_radius_m = 1.30\nrpm_nominal = 300\nrpm_max = 400\n[[web]]\nname = \"spar\"\n\
             chord_frac = 0.30\nr_start_m = 0.30\nr_end_m = 1.30\n[modal]\nmodes = 8\n{extra}"
        ),
    );
    let mut stations = String::from("r_m,chord_m,twist_deg,pitch_axis_frac,airfoil\n");
    for k in 0..6 {
        let r = 0.3 + 0.2 * k as f64;
        stations += &format!("{r},0.200,0,{pitch_axis_frac},naca4418\n");
    }
    write("stations.csv", &stations);
    write(
        "plies.csv",
        "ply,material,angle_deg,r_start_m,r_end_m,region,from,to\n\
         skin,glass-biax,45,0.3,1.3,both,0,1\n\
         cap,carbon-ud,0,0.3,1.3,both,0.15,0.45\n\
         web,glass-biax,45,0.3,1.3,web:spar,,\n",
    );
    let materials = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/layups/small-wind/materials.toml"
    ))
    .unwrap();
    write("materials.toml", &materials);
    let project = layloft::input::read_project(&dir.path().join("blade.toml")).unwrap();
    let model = layloft::analysis::BladeModel::build(project).unwrap();
    let p = &model.project;
    let beam = BeamModel::with_attachments(
        &model.properties(),
        &p.rotor,
        &p.modal,
        &model.modal_attachments(),
    )
    .unwrap();
    beam.modes(RotorSpeed::ZERO, 8).unwrap().modes.iter().map(|m| m.frequency_hz).collect()
}

#[test]
fn an_untwisted_blade_has_the_same_frequencies_wherever_its_pitch_axis_is_drawn() {
    // One physical blade (no twist, constant chord: moving the pitch axis along the chord moves
    // no material), so at standstill the frequencies cannot depend on where the axis is drawn
    // (a law of the beam: the reference line is a choice of description). The shear centre of
    // this section lies near 0.3 of the chord and the elastic centre elsewhere; bending the
    // pitch-axis line instead of the shear centre's gave 183.9 against 198.5 Hz for the third
    // mode of this blade. The sections are solved afresh for each axis (measured agreement
    // 4e-6): 2e-5. The same in sea water with an offset point mass, which the model takes from
    // the shear centre too: the water's added mass acts at the outline's middle and the mass
    // where it was put, both fixed to the blade.
    let dry = untwisted_blade_frequencies(0.25, false);
    for attached in [false, true] {
        let quarter = untwisted_blade_frequencies(0.25, attached);
        let aft = untwisted_blade_frequencies(0.45, attached);
        // The water and the mass are really there: the first mode drops by more than 10 %.
        assert!(!attached || quarter[0] < 0.9 * dry[0], "{quarter:?} against dry {dry:?}");
        for (k, (a, b)) in quarter.iter().zip(&aft).enumerate() {
            assert!(
                (a / b - 1.0).abs() < 2e-5,
                "attached {attached}, mode {}: {a} Hz against {b} Hz",
                k + 1
            );
        }
    }
}
