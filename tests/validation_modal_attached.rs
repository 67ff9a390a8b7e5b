//! Point masses, fluid added mass and the machine's own excitations in the modal model, against
//! published frequency equations, closed forms and an independent Rayleigh–Ritz model written
//! here. Each check names its source beside the assertion. Every beam is invented.

use std::f64::consts::PI;

use crate::modal_support::*;
use layloft::modal::{
    Attachments, BeamModel, BeamSection, FluidSection, ModeKind, PointBody, ellipse_added_mass,
    machine_excitations,
};
use layloft::project::{ExcitationSpec, FixedExcitation};
use layloft::section::SectionProperties;
use layloft::units::RotorSpeed;
use nalgebra::{DMatrix, SymmetricEigen};

/// A unit flap beam (EI = m = L = 1) with stiff edge, torsion and axial directions.
fn unit_flap_beam() -> BeamSection {
    BeamSection::uniform(0.0, 1e8, 1e6, 1.0, 1e4, 1.0)
}

fn body(r: f64, mass: f64) -> PointBody {
    PointBody { r, mass, offset: [0.0, 0.0], inertia: [0.0; 3] }
}

fn with_bodies(bodies: Vec<PointBody>) -> Attachments {
    Attachments { bodies, fluid: None }
}

fn flap_omegas(model: &BeamModel, speed: RotorSpeed, count: usize) -> Vec<f64> {
    let set = model.modes(speed, count).unwrap();
    set.modes
        .iter()
        .filter(|m| m.kind == ModeKind::Flap)
        .map(|m| 2.0 * PI * m.frequency_hz)
        .collect()
}

/// First root `beta L` of the clamped–free beam with a tip mass `mu = M / (m L)`:
/// `1 + cos bL cosh bL + mu bL (cos bL sinh bL - sin bL cosh bL) = 0` (Karnovsky & Lebed,
/// *Formulas for Structural Dynamics*, McGraw-Hill 2004, §7.5.3; Blevins, *Formulas for Natural
/// Frequency and Mode Shape*, 1979, table 8-?, from memory), solved here by bisection.
fn tip_mass_root(mu: f64) -> f64 {
    let f = |b: f64| 1.0 + b.cos() * b.cosh() + mu * b * (b.cos() * b.sinh() - b.sin() * b.cosh());
    let (mut lo, mut hi) = (1e-3, 1.875_104_07);
    assert!(f(lo) * f(hi) < 0.0);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if f(lo) * f(mid) <= 0.0 {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    0.5 * (lo + hi)
}

#[test]
fn a_tip_mass_lowers_flap_as_the_frequency_equation_says() {
    // First eigenvalue beta L against mu = M / (m L): Blevins 1979, table 8-? for a cantilever
    // with an end mass (four figures, from memory; the same values as Laura, Pombo & Susemihl,
    // J. Sound Vib. 37 (1974) 161–168, from memory).
    let table =
        [(0.1, 1.7227), (0.2, 1.6164), (0.5, 1.4200), (1.0, 1.2479), (2.0, 1.0762), (5.0, 0.8700)];
    let sections = uniform(&unit_flap_beam(), 0.0, 1.0);
    for (mu, printed) in table {
        let model = BeamModel::with_attachments(
            &sections,
            &rotor(2, 100.0, 200.0, 0.0),
            &spec(40),
            &with_bodies(vec![body(1.0, mu)]),
        )
        .unwrap();
        let w = flap_omegas(&model, RotorSpeed::ZERO, 3)[0];
        let exact = tip_mass_root(mu).powi(2);
        // The frequency equation solved to 1e-15; the FE error with 40 elements is about 1e-8.
        assert!((w / exact - 1.0).abs() < 1e-6, "mu {mu}: {w} vs {exact}");
        // The printed table (4 figures in beta L): within 0.5 % in frequency, as asked.
        assert!((w / (printed * printed) - 1.0).abs() < 5e-3, "mu {mu}: {w} vs table {printed}");
        assert!((tip_mass_root(mu) / printed - 1.0).abs() < 1e-4, "mu {mu}: root vs table");
    }
}

/// Independent model: Rayleigh–Ritz on `w = Σ a_k (x/L)^(k+1)`, k = 1..=n, for a uniform flap
/// beam (EI, m, L) from hub radius R, rotating at `omega_rot`, with a tip body of mass M and
/// flapwise rotary inertia J (about the chord axis), and the centrifugal moment of a tilted body
/// `½ Omega² (I_z - I_x) w'(L)²`: a body tilted by alpha about the chord axis moves its radial
/// second moment by `(P_zz - P_xx) alpha²` and `P_xx - P_zz = I_z - I_x` (derived here from
/// `-½ Omega² ∫rho X² dV`). Energies: `½∫EI w''² + ½∫N w'²`,
/// `N(x) = Omega² [m (R (L - x) + (L² - x²)/2) + M (R + L)]`; kinetic `½ω² [∫m w² + M w(L)² +
/// J w'(L)²]`. Gauss–Legendre with 24 points integrates every polynomial term exactly.
#[allow(clippy::too_many_arguments)]
fn ritz_flap(
    ei: f64,
    m: f64,
    l: f64,
    hub: f64,
    omega_rot: f64,
    tip_mass: f64,
    j_flap: f64,
    dz_minus_dx: f64,
) -> Vec<f64> {
    let n = 10;
    let (gx, gw) = gauss_legendre(24);
    let mut k: DMatrix<f64> = DMatrix::zeros(n, n);
    let mut mm: DMatrix<f64> = DMatrix::zeros(n, n);
    let basis = |x: f64, i: usize| {
        let p = (i + 2) as f64;
        let s = x / l;
        (s.powf(p), p * s.powf(p - 1.0) / l, p * (p - 1.0) * s.powf(p - 2.0) / (l * l))
    };
    let w2 = omega_rot * omega_rot;
    for (xi, wi) in gx.iter().zip(&gw) {
        let x = 0.5 * l * (xi + 1.0);
        let w = 0.5 * l * wi;
        let tension = w2 * (m * (hub * (l - x) + 0.5 * (l * l - x * x)) + tip_mass * (hub + l));
        for i in 0..n {
            let (fi, di, ddi) = basis(x, i);
            for j in 0..n {
                let (fj, dj, ddj) = basis(x, j);
                k[(i, j)] += w * (ei * ddi * ddj + tension * di * dj);
                mm[(i, j)] += w * m * fi * fj;
            }
        }
    }
    for i in 0..n {
        let (fi, di, _) = basis(l, i);
        for j in 0..n {
            let (fj, dj, _) = basis(l, j);
            mm[(i, j)] += tip_mass * fi * fj + j_flap * di * dj;
            k[(i, j)] += w2 * dz_minus_dx * di * dj;
        }
    }
    // Reduce to a standard problem with the Cholesky factor of the mass.
    let chol = mm.cholesky().expect("mass positive definite");
    let linv = chol.l().try_inverse().expect("invertible");
    let a: DMatrix<f64> = &linv * k * linv.transpose();
    let a = (&a + a.transpose()) * 0.5;
    let mut values: Vec<f64> =
        SymmetricEigen::new(a).eigenvalues.iter().map(|v| v.sqrt()).collect();
    values.sort_by(f64::total_cmp);
    values
}

/// Nodes and weights of Gauss–Legendre on [-1, 1] by Newton on the Legendre polynomial.
fn gauss_legendre(n: usize) -> (Vec<f64>, Vec<f64>) {
    let mut x = vec![0.0; n];
    let mut w = vec![0.0; n];
    for i in 0..n {
        let mut z = (PI * (i as f64 + 0.75) / (n as f64 + 0.5)).cos();
        let mut dp = 0.0;
        for _ in 0..100 {
            let (mut p0, mut p1) = (1.0, z);
            for k in 2..=n {
                let p2 = ((2 * k - 1) as f64 * z * p1 - (k - 1) as f64 * p0) / k as f64;
                p0 = p1;
                p1 = p2;
            }
            dp = n as f64 * (z * p1 - p0) / (z * z - 1.0);
            let dz = p1 / dp;
            z -= dz;
            if dz.abs() < 1e-16 {
                break;
            }
        }
        x[i] = z;
        w[i] = 2.0 / ((1.0 - z * z) * dp * dp);
    }
    (x, w)
}

#[test]
fn a_rotating_beam_with_a_tip_body_agrees_with_an_independent_ritz_model() {
    // Unit beam from a hub at R = 0.25, tip body M = 0.4 m L with rotary inertia: I_y (flap
    // rotation) 0.02, I_x 0.004, I_z 0.018 (kg·m², a possible body: each at most the sum of the
    // others). Nondimensional speeds 0, 3 and 8.
    let hub = 0.25;
    let tip =
        PointBody { r: hub + 1.0, mass: 0.4, offset: [0.0, 0.0], inertia: [0.004, 0.02, 0.018] };
    let model = BeamModel::with_attachments(
        &uniform(&unit_flap_beam(), hub, 1.0),
        &rotor(2, 100.0, 200.0, 0.0),
        &spec(40),
        &with_bodies(vec![tip]),
    )
    .unwrap();
    // The Ritz check of the Ritz model itself: without the body it gives Blevins' 1.875104².
    let bare = ritz_flap(1.0, 1.0, 1.0, 0.0, 0.0, 0.0, 0.0, 0.0);
    assert!((bare[0] / 1.875_104_068_711_961_f64.powi(2) - 1.0).abs() < 1e-9, "{}", bare[0]);
    for lambda in [0.0, 3.0, 8.0] {
        let fe = flap_omegas(&model, RotorSpeed::from_rad_s(lambda), 4);
        let ritz = ritz_flap(1.0, 1.0, 1.0, hub, lambda, 0.4, 0.02, 0.018 - 0.004);
        for n in 0..2 {
            // Ritz with ten polynomials converges to about 1e-9 on the first mode and 1e-6 on
            // the second; FE with 40 elements to 1e-7: 1e-5 leaves room for both.
            let rel = (fe[n] / ritz[n] - 1.0).abs();
            assert!(
                rel < 1e-5,
                "lambda {lambda}, mode {}: FE {} vs Ritz {} ({rel:e})",
                n + 1,
                fe[n],
                ritz[n]
            );
        }
    }
}

#[test]
fn moving_a_point_mass_outward_lowers_the_first_flap_frequency_monotonically() {
    // A twisted, coupled, tapered blade (invented): a 50 g mass with offsets and rotary inertia
    // moved from the root to the tip; at standstill the kinetic energy of the first mode grows
    // with radius, so the frequency falls (Rayleigh's principle; common practice).
    let sections = twisted_blade(6);
    let r = rotor(5, 3000.0, 3600.0, 8.0);
    let bare = BeamModel::new(&sections, &r, &spec(24)).unwrap();
    let f_bare = bare.modes(RotorSpeed::ZERO, 1).unwrap().modes[0].frequency_hz;
    let mut last = f_bare;
    for k in 0..=10 {
        let radius = 0.2 + 0.05 * k as f64;
        let b = PointBody {
            r: radius,
            mass: 0.05,
            offset: [0.01, -0.002],
            inertia: [2e-6, 1e-6, 1.5e-6],
        };
        let model =
            BeamModel::with_attachments(&sections, &r, &spec(24), &with_bodies(vec![b])).unwrap();
        let f = model.modes(RotorSpeed::ZERO, 1).unwrap().modes[0].frequency_hz;
        assert!(f <= last * (1.0 + 1e-12), "r = {radius}: {f} Hz after {last} Hz");
        last = f;
    }
    assert!(
        last < 0.95 * f_bare,
        "a tip mass of 11 % of the blade lowers flap 1: {last} vs {f_bare}"
    );
}

fn rayleigh_quotient(model: &BeamModel, speed: RotorSpeed, x: &[f64]) -> f64 {
    let m = model.system_matrices(speed).unwrap();
    let mut kx = vec![0.0; x.len()];
    let mut mx = vec![0.0; x.len()];
    m.stiffness.mul_vec(x, &mut kx);
    m.mass.mul_vec(x, &mut mx);
    let dot = |a: &[f64], b: &[f64]| a.iter().zip(b).map(|(p, q)| p * q).sum::<f64>();
    dot(x, &kx) / dot(x, &mx)
}

#[test]
fn the_rayleigh_quotient_of_each_mode_is_its_eigenvalue_and_the_mass_is_where_it_was_put() {
    let sections = twisted_blade(6);
    let r = rotor(5, 3000.0, 3600.0, 8.0);
    let spec = spec(20);
    let node_r = 0.2 + 0.5 * 15.0 / 20.0;
    let mass = 0.08;
    // The node's u, v, w are the shear centre's (the modal model bends the shear-centre line):
    // the mass is put there, the sections' shear centre interpolated linearly as the model does.
    let k = sections.partition_point(|s| s.r <= node_r).clamp(1, sections.len() - 1);
    let (a, b) = (&sections[k - 1], &sections[k]);
    let t = (node_r - a.r) / (b.r - a.r);
    let offset = [0, 1].map(|i| a.shear_centre[i] + t * (b.shear_centre[i] - a.shear_centre[i]));
    assert!(offset[0].abs() > 1e-3, "the check needs the shear centre off the pitch axis");
    let att = with_bodies(vec![PointBody { r: node_r, mass, offset, inertia: [0.0; 3] }]);
    let with = BeamModel::with_attachments(&sections, &r, &spec, &att).unwrap();
    let without = BeamModel::new(&sections, &r, &spec).unwrap();
    let speed = RotorSpeed::from_rpm(3000.0);
    let set = with.modes(speed, 4).unwrap();
    let (mw, mo) = (with.system_matrices(speed).unwrap(), without.system_matrices(speed).unwrap());
    for mode in &set.modes {
        let x = mode.vector.as_slice();
        let lambda = (2.0 * PI * mode.frequency_hz).powi(2);
        let rq = rayleigh_quotient(&with, speed, x);
        assert!((rq / lambda - 1.0).abs() < 1e-9, "{rq} vs {lambda}");
        // x'(M_with - M_without)x is the point mass's m |(u, v, w)|² at its node.
        let (mut a, mut b) = (vec![0.0; x.len()], vec![0.0; x.len()]);
        mw.mass.mul_vec(x, &mut a);
        mo.mass.mul_vec(x, &mut b);
        let extra: f64 = x.iter().zip(a.iter().zip(&b)).map(|(xi, (p, q))| xi * (p - q)).sum();
        let node = with
            .dofs()
            .iter()
            .enumerate()
            .filter(|(_, d)| d.node.is_some() && (d.r - node_r).abs() < 1e-12);
        let mut t2 = 0.0;
        for (i, d) in node {
            if matches!(
                d.kind,
                layloft::modal::DofKind::Axial
                    | layloft::modal::DofKind::InPlane
                    | layloft::modal::DofKind::OutOfPlane
            ) {
                t2 += x[i] * x[i];
            }
        }
        assert!(
            (extra - mass * t2).abs() < 1e-12 * extra.abs().max(1e-30) + 1e-14,
            "{extra} vs {}",
            mass * t2
        );
    }
}

#[test]
fn an_offset_point_mass_couples_flap_and_twist_as_a_rigid_body() {
    // A chordwise offset d of a tip mass M on a stiff-in-twist beam: at standstill the first
    // flap frequency lies between that of the mass at the axis and that of the mass with its
    // torsional inertia M d² added, and the mode carries twist (both from the rigid-body
    // kinematics w + d theta; a check of sign and coupling, not of a number).
    let mut beam = unit_flap_beam();
    beam.gj = 5.0;
    beam.inertia.edge = 0.01;
    let sections = uniform(&beam, 0.0, 1.0);
    let r = rotor(2, 100.0, 200.0, 0.0);
    let at_axis =
        BeamModel::with_attachments(&sections, &r, &spec(30), &with_bodies(vec![body(1.0, 0.5)]))
            .unwrap();
    let offset = PointBody { r: 1.0, mass: 0.5, offset: [0.0, 0.0], inertia: [0.0; 3] };
    let mut shifted = offset;
    shifted.offset = [0.1, 0.0];
    let off =
        BeamModel::with_attachments(&sections, &r, &spec(30), &with_bodies(vec![shifted])).unwrap();
    let f0 = at_axis.modes(RotorSpeed::ZERO, 1).unwrap().modes[0].frequency_hz;
    let m1 = &off.modes(RotorSpeed::ZERO, 1).unwrap().modes[0];
    assert!(m1.frequency_hz < f0, "{} vs {f0}", m1.frequency_hz);
    assert!(m1.shares.torsion > 1e-6 && m1.shares.flap > 0.5, "{:?}", m1.shares);
}

/// A uniform beam of chord c and thickness t with the fluid section of an ellipse, centred on
/// the pitch axis.
fn fluid_sections(sections: &[SectionProperties], chord: f64, thick: f64) -> Vec<FluidSection> {
    sections
        .iter()
        .map(|s| FluidSection { r: s.r, chord, thickness: thick, centre: [0.0, 0.0] })
        .collect()
}

#[test]
fn the_ellipse_of_an_outline_gives_the_potential_flow_added_mass() {
    // Potential flow round an ellipse of semi-axes a, b (Newman, Marine Hydrodynamics, 1977,
    // §4.13, from memory; Blevins 1979, table 14-?, from memory): m_normal = rho π a²,
    // m_along = rho π b², m_rotation = rho π (a² - b²)² / 8. The outline is a polygon of 720
    // points on the ellipse, whose box is the ellipse's to 1e-5.
    let (a, b, rho) = (0.06, 0.009, 1025.0);
    let outline: Vec<[f64; 2]> = (0..720)
        .map(|k| {
            let t = 2.0 * PI * k as f64 / 720.0;
            [-0.02 + a * t.cos(), 0.003 + b * t.sin()]
        })
        .collect();
    let f = FluidSection::of_outline(0.5, &outline).unwrap();
    assert!((f.chord - 2.0 * a).abs() < 1e-9);
    assert!((f.thickness / (2.0 * b) - 1.0).abs() < 1e-4, "{}", f.thickness);
    assert!((f.centre[0] + 0.02).abs() < 1e-9 && (f.centre[1] - 0.003).abs() < 1e-6);
    let [flap, edge, torsion] = ellipse_added_mass(rho, 0.5 * f.chord, 0.5 * f.thickness);
    assert!((flap / (rho * PI * a * a) - 1.0).abs() < 1e-12);
    assert!((edge / (rho * PI * b * b) - 1.0).abs() < 2e-4);
    assert!((torsion / (rho * PI * (a * a - b * b).powi(2) / 8.0) - 1.0).abs() < 1e-4);
    // A circle has no added inertia in rotation; a flat plate has rho π a⁴ / 8.
    assert_eq!(ellipse_added_mass(rho, a, a)[2], 0.0);
    assert!((ellipse_added_mass(rho, a, 0.0)[2] - rho * PI * a.powi(4) / 8.0).abs() < 1e-15);
}

#[test]
fn a_submerged_uniform_plate_keeps_the_strip_theory_frequency_ratio() {
    // A steel strip 40 mm × 3 mm, 0.4 m long, in sea water (invented): with a uniform added mass
    // m_a per length the mode shapes stay and omega_wet / omega_dry = (1 + m_a / m)^(-1/2)
    // (strip theory with the potential-flow added mass; Blevins 1979, ch. 14, from memory).
    // Flap m_a = rho π (c/2)², edge rho π (t/2)², torsion I_a = rho π (a² - b²)² / 8.
    // Lindholm et al. (1965, J. Ship Res. 9) measured cantilever plates in water; strip theory
    // overstates the added mass of short plates (flow round the tip), so the wet frequency of a
    // low-aspect-ratio blade will be somewhat higher than this model gives (no data at hand to
    // put a figure on it).
    let (c, t, rho, l) = (0.04, 0.003, 1025.0, 0.4);
    let e = 200e9;
    let m = 7850.0 * c * t;
    let ip = 7850.0 * (c * t) * (c * c + t * t) / 12.0;
    let mut beam = BeamSection::uniform(
        0.0,
        e * c * t,
        80e9 * c * t.powi(3) / 3.0,
        e * c * t.powi(3) / 12.0,
        e * t * c.powi(3) / 12.0,
        m,
    );
    beam.chord = c;
    // No flapwise rotary inertia (t²/12 is negligible and the fluid does not scale it); the
    // section's polar inertia all as "edge", which edge bending also sees as rotary inertia.
    beam.inertia.flap = 0.0;
    beam.inertia.edge = ip;
    let sections = uniform(&beam, 0.0, l);
    let r = rotor(3, 100.0, 200.0, 0.0);
    let dry = BeamModel::new(&sections, &r, &spec(30)).unwrap();
    let wet_att =
        Attachments { bodies: vec![], fluid: Some((rho, fluid_sections(&sections, c, t))) };
    let wet = BeamModel::with_attachments(&sections, &r, &spec(30), &wet_att).unwrap();
    let [ma_flap, ma_edge, ia] = ellipse_added_mass(rho, c / 2.0, t / 2.0);
    let first = |model: &BeamModel, kind: ModeKind| {
        model
            .modes(RotorSpeed::ZERO, 8)
            .unwrap()
            .modes
            .iter()
            .find(|m| m.kind == kind)
            .unwrap()
            .frequency_hz
    };
    // Flap and torsion: exact up to the FE error (1e-7). Edge: the section's rotary inertia in
    // edge bending (about m c²/12 per length, 0.3 % of the kinetic energy of edge 1) is not
    // scaled by the fluid, so the ratio is off by about that much: 5e-3.
    for (kind, ratio, tol) in [
        (ModeKind::Flap, (1.0 + ma_flap / m).powf(-0.5), 1e-6),
        (ModeKind::Edge, (1.0 + ma_edge / m).powf(-0.5), 5e-3),
        (ModeKind::Torsion, (1.0 + ia / ip).powf(-0.5), 1e-6),
    ] {
        let found = first(&wet, kind) / first(&dry, kind);
        assert!((found / ratio - 1.0).abs() < tol, "{kind:?}: {found} vs {ratio}");
    }
    // In sea water the first flap frequency of this strip falls to 65 % of its dry value.
    assert!(((1.0 + ma_flap / m).powf(-0.5) - 0.65).abs() < 0.01);
}

#[test]
fn nine_blades_behind_eleven_vanes_cross_where_the_orders_say() {
    // A rotor of 9 blades passing 11 stationary vanes: a blade meets 11 wakes per turn, so the
    // vane orders are 11P, 22P; blade passing 9P, 18P (Tyler & Sofrin, "Axial flow compressor
    // noise studies", SAE Trans. 70, 1962, for the rotor–stator orders; from memory). A torsion
    // mode with equal flap and edge inertia and a huge EA has a speed-independent frequency f_t,
    // so it crosses order n at exactly 60 f_t / n rpm.
    let (gj, ip) = (40.0, 3e-3);
    let mut beam = BeamSection::uniform(0.0, 1e14, gj, 1e5, 1e5, 2.0);
    beam.inertia.flap = 0.5 * ip;
    beam.inertia.edge = 0.5 * ip;
    let sections = uniform(&beam, 0.0, 1.0);
    let r = rotor(9, 4000.0, 6000.0, 0.0);
    let model = BeamModel::new(&sections, &r, &spec(20)).unwrap();
    let f_t = (PI / 2.0) * (gj / ip).sqrt() / (2.0 * PI);
    let spec_x = ExcitationSpec {
        vanes: vec![11],
        vane_multiples: 2,
        orders: vec![],
        fixed: vec![FixedExcitation {
            name: "gear mesh".into(),
            from_hz: 0.9 * f_t,
            to_hz: 0.9 * f_t,
        }],
    };
    let orders = machine_excitations(12, 9, 2, &spec_x);
    let listed: Vec<u32> = orders.iter().map(|e| e.order).collect();
    assert_eq!(listed, [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 18, 22, 0]);
    let eleven = orders.iter().find(|e| e.order == 11).unwrap();
    assert_eq!(eleven.vanes, [11]);
    assert_eq!(eleven.label(), "11P (11 vanes)");
    assert_eq!(orders.iter().find(|e| e.order == 9).unwrap().label(), "9P (blade passing)");
    let speeds: Vec<RotorSpeed> =
        (0..=120).map(|k| RotorSpeed::from_rpm(50.0 * k as f64)).collect();
    let campbell = model.campbell(&speeds, 6, &mut |_, _| {}).unwrap();
    let torsion = campbell.tracks.iter().find(|t| t.kind == ModeKind::Torsion).unwrap();
    let crossings = campbell.crossings(&orders);
    for order in [11_u32, 22, 18, 9] {
        let c = crossings
            .iter()
            .find(|c| c.track == torsion.id && c.order == order)
            .unwrap_or_else(|| panic!("no crossing of torsion with {order}P"));
        let expected = 60.0 * f_t / order as f64;
        // The frequency is constant to 1e-10; the linear interpolation is then exact: 1e-6.
        let rpm = c.speed.rpm();
        assert!((rpm / expected - 1.0).abs() < 1e-6, "{order}P at {rpm} vs {expected} rpm");
    }
    // The fixed line never meets a constant frequency; the margin to it is |f_t - f_g| / f_g.
    assert!(!crossings.iter().any(|c| c.track == torsion.id && c.order == 0));
    let check = campbell.margins(&orders, "test", RotorSpeed::from_rpm(1000.0), None).unwrap();
    let m = check.modes.iter().find(|m| m.track == torsion.id).unwrap();
    // At 1000 rpm the orders lie at most at 22 × 16.7 = 367 Hz; f_t = 28.7 Hz is nearest to 2P
    // (33.3 Hz, 16.2 %) and to the gear mesh 0.9 f_t (11.1 %): the mesh wins.
    assert!(m.excitation.fixed.is_some(), "{:?}", m.excitation);
    // The tension term N k_A² theta'² moves f_t by 3e-7 at 1000 rpm: 1e-4 percentage points.
    assert!(
        ((m.margin * 100.0) - (1.0 / 0.9 - 1.0) * 100.0).abs() < 1e-4,
        "{}",
        (m.margin * 100.0)
    );
}

#[test]
fn a_stiff_blade_on_a_flap_root_spring_flaps_as_a_rigid_hinged_blade() {
    // The README's worked example: a 1.2 m blade of 2 kg/m from a hub at e = 0.3 m, far stiffer
    // than its flap root spring k = 5000 N·m/rad, flaps as a rigid body on the spring:
    // omega² = k / I + Omega² (1 + 3 e / (2 L)), I = m L³ / 3 (rigid flapping blade with hinge
    // offset and spring; Johnson, *Helicopter Theory*, 1980, §9.2, from memory; the Omega² term
    // is the centrifugal moment Omega² ∫ m (e + x) x dx over I, derived here).
    let (m, l, e, k) = (2.0, 1.2, 0.3, 5000.0);
    let beam = BeamSection::uniform(0.0, 1e12, 1e9, 1e9, 1e11, m);
    let springs = layloft::project::RootSprings { axial: 1e12, flap: k, edge: 1e12, torsion: 1e12 };
    let model = BeamModel::new(
        &uniform(&beam, e, l),
        &rotor(3, 300.0, 400.0, 0.0),
        &spec_with_springs(20, springs),
    )
    .unwrap();
    let inertia = m * l.powi(3) / 3.0;
    for rpm in [0.0, 300.0] {
        let w_rot = rpm * RAD_S_PER_RPM;
        let f = model.modes(RotorSpeed::from_rpm(rpm), 1).unwrap().modes[0].frequency_hz;
        let expected = (k / inertia + w_rot * w_rot * (1.0 + 1.5 * e / l)).sqrt() / (2.0 * PI);
        // Blade flexibility k L / EI = 6e-6 lowers the frequency by about that: 1e-4.
        assert!((f / expected - 1.0).abs() < 1e-4, "{rpm} rpm: {f} Hz vs {expected} Hz");
    }
    // Standstill 10.49 Hz; at 300 rpm 12.01 Hz (the numbers quoted in the README).
    assert!((model.modes(RotorSpeed::ZERO, 1).unwrap().modes[0].frequency_hz - 10.49).abs() < 0.01);
}
