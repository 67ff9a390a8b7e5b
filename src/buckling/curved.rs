//! Curvature of a panel across its width: the gain in compressive buckling load over the flat
//! panel, with the knock-down of NASA SP-8007 for the scatter of real shells against the
//! classical value; and the classical buckling load of a long laminated cylinder under axial
//! compression.
//!
//! Shallow-shell (Donnell) equations of a panel of radius `R` across its width, simply supported
//! long edges, sine mode `w = sin(alpha x) sin(beta y)`, `beta = pi/b` (Batdorf, NACA TN 1341,
//! 1947, for isotropic panels; written here for an orthotropic wall with bending stiffness
//! `D11, D12, D22, D66` and membrane compliance `a = A^-1`):
//!
//! `N(alpha) alpha² = D11 alpha⁴ + 2 (D12 + 2 D66) alpha² beta² + D22 beta⁴
//!                   + gamma² alpha⁴ / (R² (a22 alpha⁴ + (2 a12 + a66) alpha² beta² + a11 beta⁴))`
//!
//! with `x` along the span and `y` across the panel. The curvature (membrane) term carries
//! `gamma²`: NASA SP-8007 (1968) applies its knock-down to curved panels through the curvature
//! parameter `Z`, and the membrane term grows as `Z²`, so that a panel wide enough to behave like
//! a cylinder reaches `gamma` times the cylinder's classical load. `D16`, `D26` do not enter the
//! compressive gain.
//!
//! In shear the same membrane term is added to each sine of the flat plate's Ritz solution
//! ([`crate::buckling::LongPlate::curved_shear`]; simply supported edges); a panel that closes on
//! itself (a round root's whole wall) is also taken as a long closed tube in torsion
//! ([`cylinder_torsion`]), and the lower of the two stands. The gain over the flat panel is
//! knocked down by [`SHEAR_KNOCK_DOWN`].
//!
//! Knock-down (SP-8007, from memory): `gamma = 1 - 0.901 (1 - exp(-phi))`, with
//! `phi = (1/16) sqrt(R/t)` for an isotropic wall and `phi = (1/29.8) sqrt(R / t_e)`,
//! `t_e = (D11 D22 / (A11 A22))^(1/4)`, for an orthotropic one (the two agree for an isotropic
//! wall, for which `t_e = t / sqrt(12)`).

use nalgebra::Matrix3;

use super::plate::minimise;

/// The knock-down on the curvature's gain in shear: NASA SP-8007 (1968) recommends 0.67 on the
/// classical torsional buckling load of cylinders for the scatter of tests (from memory).
pub const SHEAR_KNOCK_DOWN: f64 = 0.67;

/// The SP-8007 knock-down factor `gamma` of a wall of radius `r` (m) with extensional stiffness
/// `a` (N/m) and bending stiffness `d` (N·m).
pub fn knock_down(r: f64, a: &Matrix3<f64>, d: &Matrix3<f64>) -> f64 {
    let te = (d[(0, 0)] * d[(1, 1)] / (a[(0, 0)] * a[(1, 1)])).powf(0.25);
    let phi = (r / te).sqrt() / 29.8;
    1.0 - 0.901 * (1.0 - (-phi).exp())
}

/// Compressive critical load (N/m) of a long simply supported orthotropic panel of width `b`,
/// radius `r` (infinite for a flat panel), bending stiffness `d` and membrane compliance
/// `compliance` (m/N), with knock-down `gamma` on the curvature term; minimised over the
/// half-wavelength.
pub fn curved_panel_compression(
    d: &Matrix3<f64>,
    compliance: &Matrix3<f64>,
    b: f64,
    r: f64,
    gamma: f64,
) -> f64 {
    let beta = std::f64::consts::PI / b;
    let base = b * (d[(0, 0)] / d[(1, 1)]).powf(0.25);
    let (b2, b4) = (beta * beta, beta.powi(4));
    let c = compliance;
    minimise(|l| {
        let alpha = std::f64::consts::PI / (base * l);
        let a2 = alpha * alpha;
        let bend =
            d[(0, 0)] * a2 * a2 + 2.0 * (d[(0, 1)] + 2.0 * d[(2, 2)]) * a2 * b2 + d[(1, 1)] * b4;
        let membrane = if r.is_finite() {
            let am = c[(1, 1)] * a2 * a2 + (2.0 * c[(0, 1)] + c[(2, 2)]) * a2 * b2 + c[(0, 0)] * b4;
            gamma * gamma * a2 * a2 / (r * r * am)
        } else {
            0.0
        };
        (bend + membrane) / a2
    })
}

/// The gain of compressive buckling load (N/m) from the panel's curvature: the curved value
/// less the flat value of the same simply supported orthotropic panel. Zero for a flat panel.
pub fn curvature_gain(
    d: &Matrix3<f64>,
    compliance: &Matrix3<f64>,
    b: f64,
    r: f64,
    gamma: f64,
) -> f64 {
    if !r.is_finite() {
        return 0.0;
    }
    let curved = curved_panel_compression(d, compliance, b, r, gamma);
    let flat = curved_panel_compression(d, compliance, b, f64::INFINITY, gamma);
    (curved - flat).max(0.0)
}

/// Classical axial buckling load (N/m) of a long thin orthotropic cylinder of radius `r`
/// (Donnell theory, as the panel above with the circumferential wave number `beta` free): the
/// least over axial and circumferential wave numbers of
/// `[D(alpha, beta) + alpha⁴ / (R² a(alpha, beta))] / alpha²`. For an isotropic wall this is
/// `E t² / (R sqrt(3 (1 - nu²)))` (Timoshenko & Gere, *Theory of Elastic Stability*, 1961,
/// §11.4).
pub fn cylinder_classical(d: &Matrix3<f64>, compliance: &Matrix3<f64>, r: f64) -> f64 {
    // Over alpha and the mode's aspect beta/alpha; the axisymmetric mode is beta = 0.
    let c = compliance;
    let n_at = |alpha: f64, ratio: f64| {
        let a2 = alpha * alpha;
        let b2 = ratio * ratio * a2;
        let bend = d[(0, 0)] * a2 * a2
            + 2.0 * (d[(0, 1)] + 2.0 * d[(2, 2)]) * a2 * b2
            + d[(1, 1)] * b2 * b2;
        let am =
            c[(1, 1)] * a2 * a2 + (2.0 * c[(0, 1)] + c[(2, 2)]) * a2 * b2 + c[(0, 0)] * b2 * b2;
        (bend + a2 * a2 / (r * r * am)) / a2
    };
    // Scale of the wave numbers: the axisymmetric one is of order 1/sqrt(R t_e), t_e the
    // thickness of an isotropic wall of the same D/A.
    let te = (d[(0, 0)] * d[(1, 1)] * c[(0, 0)] * c[(1, 1)]).powf(0.25);
    let scale = 1.0 / (r * te).sqrt();
    let axisymmetric = minimise(|l| n_at(scale / l, 0.0));
    let skewed = minimise(|q| minimise(|l| n_at(scale / l, q)));
    axisymmetric.min(skewed)
}

/// Classical buckling shear flow (N/m) of a long closed orthotropic cylinder of radius `r` in
/// torsion: the least over the circumferential wave number `n >= 2` and the axial wave number
/// `alpha` of a helical mode `w = cos(alpha x + n s / R)`,
///
/// `N = [D(alpha, beta_b) + alpha⁴ / (R² a*(alpha, beta))] / (2 alpha beta (1 - 1/n²))`,
///
/// `beta = n / R`, with the bending taken on `beta_b² = (n² - 1) / R²` (the ring's own rigid
/// motion, `n = 1`, stores none) and the work of the shear flow `(n² - 1) / n²` of Donnell's.
/// Donnell's shallow-shell terms alone overestimate the long tube (`n = 2`) by 2/sqrt(3); with
/// these two corrections a thin isotropic tube gives the long-tube value
/// `tau = E (t/R)^(3/2) / (3 sqrt(2) (1 - nu²)^(3/4))` of Timoshenko & Gere, *Theory of Elastic
/// Stability*, 1961, §11.12 (from memory), and for many waves both tend to Donnell's; the value
/// is never above Donnell's (by `((n² - 1) / n²)^(1/2)` at the optimum). `D16`, `D26` enter with
/// the sign that lowers the load, so the value holds for either sense of the torque; `a16`,
/// `a26` are not used.
pub fn cylinder_torsion(d: &Matrix3<f64>, compliance: &Matrix3<f64>, r: f64) -> f64 {
    let c = compliance;
    let at = |n: f64, alpha: f64| {
        let beta = n / r;
        let bb2 = (n * n - 1.0) / (r * r);
        let bb = bb2.sqrt();
        let a2 = alpha * alpha;
        let bend = d[(0, 0)] * a2 * a2 - 4.0 * d[(0, 2)].abs() * a2 * alpha * bb
            + 2.0 * (d[(0, 1)] + 2.0 * d[(2, 2)]) * a2 * bb2
            - 4.0 * d[(1, 2)].abs() * alpha * bb * bb2
            + d[(1, 1)] * bb2 * bb2;
        let b2 = beta * beta;
        let am =
            c[(1, 1)] * a2 * a2 + (2.0 * c[(0, 1)] + c[(2, 2)]) * a2 * b2 + c[(0, 0)] * b2 * b2;
        let n_cr = (bend + a2 * a2 / (r * r * am)) / (2.0 * alpha * beta * (1.0 - 1.0 / (n * n)));
        if n_cr > 0.0 { n_cr } else { f64::INFINITY }
    };
    // The axial wave of the lowest mode is of order sqrt(t_e / R) of the circumferential one,
    // t_e the thickness of an isotropic wall of the same D/A.
    let te = (d[(0, 0)] * d[(1, 1)] * c[(0, 0)] * c[(1, 1)]).powf(0.25);
    let ratio = (te / r).sqrt();
    let mut best = f64::INFINITY;
    let mut rising = 0;
    for n in 2..=400 {
        let n = n as f64;
        let v = minimise(|l| at(n, n / r * ratio / l));
        if v < best {
            best = v;
            rising = 0;
        } else {
            rising += 1;
            if rising >= 3 {
                break;
            }
        }
    }
    best
}
