//! Load resultants and deflections against closed-form statics.

use crate::support::{beam_section, uniform_blade};
use approx::assert_relative_eq;
use layloft::loads::{LoadDistribution, span_loads, tip_deflection};
use layloft::project::{DistributedLoadRow, LoadCaseSpec, PointMass};
use layloft::section::MassInertia;
use layloft::units::{Angle, rpm_to_rad_s};

fn case(rpm: f64) -> LoadCaseSpec {
    LoadCaseSpec {
        name: "test".into(),
        omega: rpm_to_rad_s(rpm),
        pitch: None,
        distributed: Vec::new(),
        distributed_file: None,
        gravity: None,
        load_factor: 1.0,
        delta_t: 0.0,
        buoyancy: None,
    }
}

fn plain(r: f64, m: f64) -> layloft::section::SectionProperties {
    beam_section(r, 1e8, 1e4, 1e5, 1e6, m, [0.0, 0.0], MassInertia::default(), 0.0)
}

#[test]
fn centrifugal_tension_of_a_uniform_bar() {
    // N(r) = m Omega² (R² - r²) / 2 with r from the rotor axis: direct integration of the
    // centrifugal force density m Omega² rho (e.g. Timoshenko, Strength of Materials, Part II,
    // rotating bar; from memory). Simpson's rule on a linear density is exact.
    let (m, r0, r1) = (3.0, 0.4, 2.0);
    let sections = uniform_blade(r0, r1, 9, |r| plain(r, m));
    let c = case(600.0);
    let loads = span_loads(&LoadDistribution::new(&sections, &[], &c, Angle::ZERO).unwrap());
    let w = rpm_to_rad_s(600.0);
    for (r, res) in loads.r.iter().zip(&loads.rotor) {
        let exact = m * w * w * (r1 * r1 - r * r) / 2.0;
        assert_relative_eq!(res.force[0], exact, max_relative = 1e-12, epsilon = 1e-9);
        assert_relative_eq!(loads.chord_at(*r).n, exact, max_relative = 1e-12, epsilon = 1e-9);
    }
}

#[test]
fn cantilever_under_uniform_and_tip_loads() {
    // Cantilever of length L under uniform load w: V(x) = w (L - x), M(x) = w (L - x)² / 2; tip
    // load P: V = P, M = P (L - x) (Roark's Formulas for Stress and Strain, 7th ed., 2002,
    // Table 8.1 cases 1a and 2a; from memory). Tip deflections P L³ / (3 EI) and
    // w L⁴ / (8 EI) (same table).
    let (r0, r1, ei) = (1.0, 3.0, 2.0e5);
    let len = r1 - r0;
    let sections = uniform_blade(r0, r1, 5, |r| {
        beam_section(r, 1e9, 1e5, ei, 1e9, 1e-9, [0.0, 0.0], MassInertia::default(), 0.0)
    });
    let w = 120.0;
    let mut c = case(0.0);
    c.distributed = vec![
        DistributedLoadRow { r: r0, f_flap: w, f_edge: 0.0, m_pitch: 0.0 },
        DistributedLoadRow { r: r1, f_flap: w, f_edge: 0.0, m_pitch: 0.0 },
    ];
    let loads = span_loads(&LoadDistribution::new(&sections, &[], &c, Angle::ZERO).unwrap());
    for (r, res) in loads.r.iter().zip(&loads.rotor) {
        let x = r - r0;
        assert_relative_eq!(res.force[2], w * (len - x), max_relative = 1e-12, epsilon = 1e-9);
        // Force along +Z outboard: the moment about +Y of (rho - r) x f_Z is -(rho - r) f_Z.
        assert_relative_eq!(
            res.moment[1],
            -w * (len - x).powi(2) / 2.0,
            max_relative = 1e-12,
            epsilon = 1e-9
        );
    }
    let fine =
        span_loads(&LoadDistribution::new(&sections, &[], &c, Angle::ZERO).unwrap().refine(64));
    let d = tip_deflection(&sections, &fine).unwrap();
    assert_relative_eq!(d.out_of_plane, w * len.powi(4) / (8.0 * ei), max_relative = 1e-3);

    // Tip load: a point mass under gravity along +Z at the tip.
    let mut c = case(0.0);
    c.gravity = Some([0.0, 0.0, 9.81]);
    let pm = PointMass { name: "tip".into(), r: r1, mass: 10.0, y: 0.0, z: 0.0, inertia: [0.0; 3] };
    let loads = span_loads(
        &LoadDistribution::new(&sections, std::slice::from_ref(&pm), &c, Angle::ZERO).unwrap(),
    );
    let p = 98.1;
    for (r, res) in loads.r.iter().zip(&loads.rotor) {
        assert_relative_eq!(res.force[2], p, max_relative = 1e-9);
        assert_relative_eq!(res.moment[1], -p * (r1 - r), max_relative = 1e-9, epsilon = 1e-9);
    }
    let fine =
        span_loads(&LoadDistribution::new(&sections, &[pm], &c, Angle::ZERO).unwrap().refine(64));
    let d = tip_deflection(&sections, &fine).unwrap();
    assert_relative_eq!(d.out_of_plane, p * len.powi(3) / (3.0 * ei), max_relative = 1e-3);
}

#[test]
fn centrifugal_twisting_moment_of_a_flat_plate() {
    // A thin flat plate of chord c and thickness t at angle beta to the plane of rotation feels
    // a moment about its spanwise axis M = -(Omega² / 2) (I_c - I_t) sin 2 beta per unit length,
    // with I_c = rho t c³ / 12 and I_t = rho c t³ / 12 the mass moments about the chord and
    // thickness axes: the steady propeller moment of the torsion equation of Houbolt & Brooks,
    // NACA Report 1346 (1958) (from memory). It turns the chord towards the plane of rotation.
    let (rho, c, t): (f64, f64, f64) = (1600.0, 0.2, 0.004);
    let m = rho * c * t;
    let i_c = rho * t * c.powi(3) / 12.0;
    let i_t = rho * c * t.powi(3) / 12.0;
    let inertia = MassInertia { flap: i_t, edge: i_c, polar: i_c + i_t, product: 0.0 };
    let (r0, r1) = (0.3, 1.1);
    let sections = uniform_blade(r0, r1, 5, |r| {
        beam_section(r, 1e8, 1e4, 1e5, 1e6, m, [0.0, 0.0], inertia, 0.0)
    });
    let c_spin = case(1200.0);
    let w = rpm_to_rad_s(1200.0);
    for beta in [10.0f64, 30.0, 45.0, 70.0] {
        let loads = span_loads(
            &LoadDistribution::new(&sections, &[], &c_spin, Angle::from_deg(beta)).unwrap(),
        );
        let exact = -0.5 * w * w * (i_c - i_t) * (2.0 * beta.to_radians()).sin() * (r1 - r0);
        assert_relative_eq!(loads.root().moment[0], exact, max_relative = 1e-10);
    }
}

#[test]
fn root_reaction_matches_the_total_applied_load() {
    // Statics: the root force equals the integral of the applied loads (here checked by a fine
    // independent midpoint sum) and the point loads.
    let (r0, r1) = (0.5, 2.5);
    let sections = uniform_blade(r0, r1, 11, |r| {
        beam_section(
            r,
            1e8,
            1e4,
            1e5,
            1e6,
            2.0 + r,
            [0.01 * r, -0.005],
            MassInertia::default(),
            20.0 - 5.0 * r,
        )
    });
    let mut c = case(300.0);
    c.gravity = Some([0.0, -9.81, 0.0]);
    c.load_factor = 1.5;
    c.distributed = vec![
        DistributedLoadRow { r: 0.5, f_flap: 100.0, f_edge: 20.0, m_pitch: 1.0 },
        DistributedLoadRow { r: 1.7, f_flap: 300.0, f_edge: 50.0, m_pitch: 2.0 },
        DistributedLoadRow { r: 2.5, f_flap: 400.0, f_edge: 60.0, m_pitch: 0.5 },
    ];
    let loads =
        span_loads(&LoadDistribution::new(&sections, &[], &c, Angle::from_deg(3.0)).unwrap());
    let w = rpm_to_rad_s(300.0);
    let n = 20_000;
    let h = (r1 - r0) / n as f64;
    let (mut fx, mut fz) = (0.0, 0.0);
    for i in 0..n {
        let r = r0 + (i as f64 + 0.5) * h;
        fx += 1.5 * (2.0 + r) * w * w * r * h;
        let flap =
            if r < 1.7 { 100.0 + (r - 0.5) / 1.2 * 200.0 } else { 300.0 + (r - 1.7) / 0.8 * 100.0 };
        fz += 1.5 * flap * h;
    }
    assert_relative_eq!(loads.root().force[0], fx, max_relative = 1e-6);
    assert_relative_eq!(loads.root().force[2], fz, max_relative = 1e-6);
}

#[test]
fn buoyancy_takes_the_displaced_weight_off_the_gravity_load() {
    // Archimedes: a submerged body is pushed up by the weight of the fluid it displaces, acting
    // at the centroid of the displaced volume. A uniform blade of 4 kg/m with 0.0025 m² inside
    // its outer mould line, centroid 0.05 m behind the pitch axis (its mass centre on it), in sea
    // water (1025 kg/m³) under gravity along -Z at standstill: root force Z = -(m - rho A) g L,
    // root torque about X = y_b rho A g L. The displaced area comes from the outline (shoelace
    // formula) of a 0.1 m × 0.025 m rectangle.
    use layloft::project::{Buoyancy, BuoyantSection};
    let (r0, r1, m, rho, g) = (0.5, 2.0, 4.0, 1025.0, 9.81);
    let sections = uniform_blade(r0, r1, 4, |r| plain(r, m));
    let rect = [[0.0, -0.0125], [0.1, -0.0125], [0.1, 0.0125], [0.0, 0.0125]];
    let b = BuoyantSection::of_outline(0.0, &rect).unwrap();
    assert_relative_eq!(b.area, 0.0025, max_relative = 1e-12);
    assert_relative_eq!(b.centroid[0], 0.05, max_relative = 1e-12);
    let mut c = case(0.0);
    c.gravity = Some([0.0, 0.0, -g]);
    c.buoyancy = Some(Buoyancy {
        density: rho,
        sections: [r0, r1].iter().map(|&r| BuoyantSection { r, ..b }).collect(),
    });
    let loads = span_loads(&LoadDistribution::new(&sections, &[], &c, Angle::ZERO).unwrap());
    let len = r1 - r0;
    assert_relative_eq!(loads.root().force[2], -(m - rho * 0.0025) * g * len, max_relative = 1e-10);
    assert_relative_eq!(
        loads.root().moment[0],
        0.05 * rho * 0.0025 * g * len,
        max_relative = 1e-10
    );
    // Without gravity there is no buoyancy.
    c.gravity = None;
    let loads = span_loads(&LoadDistribution::new(&sections, &[], &c, Angle::ZERO).unwrap());
    assert_eq!(loads.root().force[2], 0.0);
}

#[test]
fn a_load_over_part_of_the_span_with_steps_at_its_ends() {
    // A uniform load w from r_a to r_b (steps from zero at both ends, between the sections):
    // statics gives at a cut r <= r_a the shear V = w (r_b - r_a) and the moment
    // M = w (r_b - r_a) ((r_a + r_b) / 2 - r) (the resultant at the load's centroid); a
    // self-balancing couple (+w on one half of a stretch, -w on the other) gives no shear and
    // the moment w (d/2)² at any cut inboard of it (d the stretch's length). Before, each step at
    // a table's end added a force of w h / 24 (h the grid interval there): shear 1208.3 N
    // against 1200 N for the first, and -416.7 N for the couple.
    let (r0, r1) = (0.2, 1.2);
    let sections = uniform_blade(r0, r1, 11, |r| plain(r, 1e-9));
    let (w, ra, rb) = (2000.0, 0.6, 1.2);
    let mut c = case(0.0);
    c.distributed = vec![
        DistributedLoadRow { r: ra, f_flap: w, f_edge: 0.0, m_pitch: 0.0 },
        DistributedLoadRow { r: rb, f_flap: w, f_edge: 0.0, m_pitch: 0.0 },
    ];
    let loads = span_loads(&LoadDistribution::new(&sections, &[], &c, Angle::ZERO).unwrap());
    for (r, res) in loads.r.iter().zip(&loads.rotor).filter(|(r, _)| **r <= ra + 1e-12) {
        let v = w * (rb - ra);
        assert_relative_eq!(res.force[2], v, max_relative = 1e-12);
        assert_relative_eq!(res.moment[1].abs(), v * (0.5 * (ra + rb) - r), max_relative = 1e-12);
    }
    // The couple: +w over [1.0, 1.1], -w over [1.1, 1.2] (a step inside the table, on its own
    // rows 0.2 mm apart, and steps from zero at both ends).
    c.distributed = vec![
        DistributedLoadRow { r: 1.0, f_flap: -w, f_edge: 0.0, m_pitch: 0.0 },
        DistributedLoadRow { r: 1.0999, f_flap: -w, f_edge: 0.0, m_pitch: 0.0 },
        DistributedLoadRow { r: 1.1001, f_flap: w, f_edge: 0.0, m_pitch: 0.0 },
        DistributedLoadRow { r: 1.2, f_flap: w, f_edge: 0.0, m_pitch: 0.0 },
    ];
    let loads = span_loads(&LoadDistribution::new(&sections, &[], &c, Angle::ZERO).unwrap());
    // Exact couple of the table as given (the linear ramp over 0.2 mm included): the moment of
    // each part about the cut, summed; the lever arms cancel the cut's position.
    let part = |a: f64, b: f64, fa: f64, fb: f64| {
        // ∫ f(x) (x - r) dx for linear f, at r = 0 (the net force is zero, so r drops out).
        let (h, s) = (b - a, fb - fa);
        fa * (b * b - a * a) / 2.0
            + s / h * ((b.powi(3) - a.powi(3)) / 3.0 - a * (b * b - a * a) / 2.0)
    };
    let couple = part(1.0, 1.0999, -w, -w) + part(1.0999, 1.1001, -w, w) + part(1.1001, 1.2, w, w);
    for (_, res) in loads.r.iter().zip(&loads.rotor).filter(|(r, _)| **r <= 1.0 + 1e-12) {
        assert!(res.force[2].abs() < 1e-9, "no shear inboard of a couple: {}", res.force[2]);
        assert_relative_eq!(res.moment[1].abs(), couple.abs(), max_relative = 1e-9);
    }
}

/// Walls whose membrane–shear coupling carries part of the resultants under a shear force
/// (`SolvedSection::shear_carried`) bend by what is left: a cantilever of uniform sections whose
/// walls carry an edgewise moment `k V` per flapwise shear force `V`, under a tip load `P` along
/// the flapwise axis, has the edgewise curvature `k P / EI_e` along its whole length, so its
/// in-plane tip deflection is `k P L² / (2 EI_e)` (a constant curvature integrated twice from
/// a clamped root, as under an end couple: Roark's Formulas for Stress and Strain, 7th ed.,
/// Table 8.1; from memory), besides the flapwise `P L³ / (3 EI_f)`. Without the carried part (the old reading)
/// the in-plane deflection was zero.
#[test]
fn a_cantilever_whose_walls_carry_an_edgewise_moment_under_shear_bends_in_plane() {
    use nalgebra::Vector4;
    let (r0, r1, ei_f, ei_e, k) = (1.0, 3.0, 2.0e5, 5.0e5, 0.02);
    let len = r1 - r0;
    let sections = uniform_blade(r0, r1, 5, |r| {
        beam_section(r, 1e9, 1e5, ei_f, ei_e, 1e-9, [0.0, 0.0], MassInertia::default(), 0.0)
    });
    let carried = vec![[Vector4::new(0.0, 0.0, 0.0, k), Vector4::zeros()]; sections.len()];
    let mut c = case(0.0);
    c.gravity = Some([0.0, 0.0, 9.81]);
    let pm = PointMass { name: "tip".into(), r: r1, mass: 10.0, y: 0.0, z: 0.0, inertia: [0.0; 3] };
    let fine =
        span_loads(&LoadDistribution::new(&sections, &[pm], &c, Angle::ZERO).unwrap().refine(64));
    let p = 98.1;
    let d = layloft::loads::tip_deflection_carrying(&sections, &carried, &fine).unwrap();
    assert_relative_eq!(d.out_of_plane, p * len.powi(3) / (3.0 * ei_f), max_relative = 1e-3);
    assert_relative_eq!(d.in_plane, k * p * len * len / (2.0 * ei_e), max_relative = 1e-3);
    let plain = tip_deflection(&sections, &fine).unwrap();
    assert!(plain.in_plane.abs() < 1e-12, "{plain:?}");
}
