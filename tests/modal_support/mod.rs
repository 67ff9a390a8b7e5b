//! Beams, rotors and an independent reference solver shared by the modal tests and benchmarks.
//! Every blade here is invented for the tests.

#![allow(dead_code)]

use layloft::modal::BeamSection;
use layloft::project::{ModalSpec, RootSprings, Rotor};
use layloft::section::{MassInertia, SectionProperties};
use layloft::units::{Angle, rpm_to_rad_s};

/// A rotor with the given speeds and blade count; radii from the sections.
pub fn rotor(blades: u32, rpm_nominal: f64, rpm_max: f64, pitch_deg: f64) -> Rotor {
    Rotor {
        blades,
        hub_radius: 0.0,
        tip_radius: 1.0,
        omega_nominal: rpm_to_rad_s(rpm_nominal),
        omega_max: rpm_to_rad_s(rpm_max),
        omega_min: rpm_to_rad_s(rpm_nominal),
        pitch: Angle::from_deg(pitch_deg),
        pitch_range: (Angle::from_deg(-10.0), Angle::from_deg(30.0)),
        root_clearance: 0.0,
        tip_clearance: 0.0,
    }
}

/// Modal settings with `elements` elements and a clamped root.
pub fn spec(elements: usize) -> ModalSpec {
    ModalSpec { elements, modes: 8, omega_step: None, root_springs: None }
}

/// Modal settings with root springs.
pub fn spec_with_springs(elements: usize, springs: RootSprings) -> ModalSpec {
    ModalSpec { elements, modes: 8, omega_step: None, root_springs: Some(springs) }
}

/// A uniform beam from `r0` to `r0 + length` as two identical sections.
pub fn uniform(section: &BeamSection, r0: f64, length: f64) -> Vec<SectionProperties> {
    vec![section.at(r0).to_section(), section.at(r0 + length).to_section()]
}

/// rad/s of one rpm.
pub const RAD_S_PER_RPM: f64 = std::f64::consts::PI / 30.0;

/// An invented twisted, tapered composite blade of 0.5 m from r = 0.2 m, with elastic couplings
/// and offsets of the elastic and mass centres, as `stations` sections.
pub fn twisted_blade(stations: usize) -> Vec<SectionProperties> {
    (0..stations)
        .map(|i| {
            let t = i as f64 / (stations - 1) as f64;
            let chord = 0.12 - 0.05 * t;
            let scale = (chord / 0.12).powi(3);
            let mut s = BeamSection::uniform(
                0.2 + 0.5 * t,
                4.0e6 * chord / 0.12,
                150.0 * scale,
                220.0 * scale,
                6000.0 * scale,
                0.9 * chord / 0.12,
            );
            s.chord = chord;
            s.twist = Angle::from_deg(35.0 - 30.0 * t);
            s.ei_cross = 30.0 * scale;
            s.extension_twist = 600.0 * scale;
            s.flap_twist = 40.0 * scale;
            s.edge_twist = -25.0 * scale;
            s.elastic_centre = [0.004 * chord / 0.12, 0.001];
            s.mass_centre = [0.008 * chord / 0.12, -0.0015];
            s.inertia = MassInertia {
                flap: 0.9 * 4e-4 * (chord / 0.12).powi(3),
                edge: 0.9 * 1.1e-3 * (chord / 0.12).powi(3),
                polar: 0.0,
                product: 0.9 * 5e-5 * (chord / 0.12).powi(3),
            };
            s.to_section()
        })
        .collect()
}

/// Roots `omega` of a uniform Euler–Bernoulli beam in bending under tension
/// `N(x) = Omega² m [R (L - x) + (L² - x²) / 2]` (hub radius `R`), clamped or on a root
/// rotational spring `k_root` (N·m/rad) at `x = 0`, free at `x = L`:
/// `EI w'''' - (N w')' - m omega² w = 0`, `w(0) = 0`, `EI w''(0) = k_root w'(0)`,
/// `w''(L) = w'''(L) = 0`. An independent method: classical RK4 shooting over 4000 steps, the
/// 2x2 boundary determinant scanned and bisected in `omega`.
pub fn shooting_frequencies(
    ei: f64,
    m: f64,
    length: f64,
    hub: f64,
    omega_rot: f64,
    k_root: Option<f64>,
    count: usize,
) -> Vec<f64> {
    let tension =
        |x: f64| omega_rot.powi(2) * m * (hub * (length - x) + 0.5 * (length * length - x * x));
    let dtension = |x: f64| -omega_rot.powi(2) * m * (hub + x);
    let det = |omega: f64| {
        let rhs = |x: f64, y: [f64; 4]| {
            let w4 = (dtension(x) * y[1] + tension(x) * y[2] + m * omega * omega * y[0]) / ei;
            [y[1], y[2], y[3], w4]
        };
        let steps = 4000;
        let h = length / steps as f64;
        let mut ends = [[0.0; 4]; 2];
        for (k, end) in ends.iter_mut().enumerate() {
            let mut y = match (k, k_root) {
                (0, None) => [0.0, 0.0, 1.0, 0.0],
                (1, None) => [0.0, 0.0, 0.0, 1.0],
                (0, Some(kr)) => [0.0, 1.0, kr / ei, 0.0],
                _ => [0.0, 0.0, 0.0, 1.0],
            };
            for s in 0..steps {
                let x = s as f64 * h;
                let k1 = rhs(x, y);
                let k2 = rhs(x + h / 2.0, add(y, k1, h / 2.0));
                let k3 = rhs(x + h / 2.0, add(y, k2, h / 2.0));
                let k4 = rhs(x + h, add(y, k3, h));
                for i in 0..4 {
                    y[i] += h / 6.0 * (k1[i] + 2.0 * k2[i] + 2.0 * k3[i] + k4[i]);
                }
            }
            *end = y;
        }
        ends[0][2] * ends[1][3] - ends[1][2] * ends[0][3]
    };
    let scale = (ei / (m * length.powi(4))).sqrt();
    let mut roots = Vec::new();
    let mut a = 0.05 * scale;
    let mut da = det(a);
    let step = 0.05 * scale;
    while roots.len() < count {
        let b = a + step;
        let db = det(b);
        if da.signum() != db.signum() {
            let (mut lo, mut hi, mut dlo) = (a, b, da);
            for _ in 0..60 {
                let mid = 0.5 * (lo + hi);
                let dm = det(mid);
                if dm.signum() == dlo.signum() {
                    lo = mid;
                    dlo = dm;
                } else {
                    hi = mid;
                }
            }
            roots.push(0.5 * (lo + hi));
        }
        a = b;
        da = db;
    }
    roots
}

fn add(y: [f64; 4], k: [f64; 4], h: f64) -> [f64; 4] {
    [y[0] + h * k[0], y[1] + h * k[1], y[2] + h * k[2], y[3] + h * k[3]]
}

/// Roots `omega` of uniform torsion under centrifugal tension (hub radius zero):
/// `[(GJ + N(x) k²) theta']' + (I_p omega² - Omega² dj) theta = 0`, `theta(0) = 0`, torque free
/// at `x = L`, with `N = Omega² m (L² - x²) / 2`; `m_k2` is `m k²`. RK4 shooting over 4000
/// steps, bisection.
pub fn shooting_torsion(
    gj: f64,
    ip: f64,
    dj: f64,
    m_k2: f64,
    length: f64,
    omega_rot: f64,
    count: usize,
) -> Vec<f64> {
    let stiff = |x: f64| gj + omega_rot.powi(2) * 0.5 * (length * length - x * x) * m_k2;
    let end_torque = |omega: f64| {
        let q = ip * omega * omega - omega_rot.powi(2) * dj;
        let rhs = |x: f64, y: [f64; 2]| [y[1] / stiff(x), -q * y[0]];
        let steps = 4000;
        let h = length / steps as f64;
        let mut y = [0.0, 1.0];
        for s in 0..steps {
            let x = s as f64 * h;
            let k1 = rhs(x, y);
            let k2 = rhs(x + h / 2.0, [y[0] + h / 2.0 * k1[0], y[1] + h / 2.0 * k1[1]]);
            let k3 = rhs(x + h / 2.0, [y[0] + h / 2.0 * k2[0], y[1] + h / 2.0 * k2[1]]);
            let k4 = rhs(x + h, [y[0] + h * k3[0], y[1] + h * k3[1]]);
            y[0] += h / 6.0 * (k1[0] + 2.0 * k2[0] + 2.0 * k3[0] + k4[0]);
            y[1] += h / 6.0 * (k1[1] + 2.0 * k2[1] + 2.0 * k3[1] + k4[1]);
        }
        y[1]
    };
    let step = 0.02 * (gj / (ip * length * length)).sqrt();
    let mut roots = Vec::new();
    let (mut a, mut fa) = (step, end_torque(step));
    while roots.len() < count {
        let b = a + step;
        let fb = end_torque(b);
        if fa.signum() != fb.signum() {
            let (mut lo, mut hi, mut flo) = (a, b, fa);
            for _ in 0..60 {
                let mid = 0.5 * (lo + hi);
                let fm = end_torque(mid);
                if fm.signum() == flo.signum() {
                    lo = mid;
                    flo = fm;
                } else {
                    hi = mid;
                }
            }
            roots.push(0.5 * (lo + hi));
        }
        a = b;
        fa = fb;
    }
    roots
}
