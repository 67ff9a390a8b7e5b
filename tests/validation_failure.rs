//! Lamina failure criteria and thermal residual stresses against published examples and
//! closed-form solutions.
//!
//! Lamina: T300/5208 graphite/epoxy of A. K. Kaw, *Mechanics of Composite Materials*, 2nd ed.,
//! CRC Press, 2006, Table 2.1 (after Tsai & Hahn 1980): E1 181 GPa, E2 10.3 GPa, G12 7.17 GPa,
//! nu12 0.28; Xt = Xc = 1500 MPa, Yt 40 MPa, Yc 246 MPa, S12 68 MPa; alpha1 0.02, alpha2 22.5
//! µm/m/°C.
//!
//! Kaw's Examples 2.16–2.19 load a 60° lamina by sigma_x = 2S, sigma_y = -3S, tau_xy = 4S. In
//! material axes (Kaw Eq. 2.94; checked in `validation_laminate.rs`) sigma1 = 1.7141 S,
//! sigma2 = -2.7141 S, tau12 = -4.1651 S. With S = 1 Pa a strength ratio is the largest S in Pa.

use approx::assert_relative_eq;
use layloft::failure::{self, FailureMode};
use layloft::laminate::{self, Laminate, LaminateLoad, LayupCode, Ply, Resultants};
use layloft::material::{Isotropic, Lamina};
use layloft::units::Angle;
use nalgebra::Vector3;
use std::sync::Arc;

fn t300() -> Lamina {
    Lamina::builder("T300/5208")
        .elastic(181e9, 10.3e9, 7.17e9, 0.28)
        .ply_thickness(0.125e-3)
        .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
        .cte(0.02e-6, 22.5e-6)
        .build()
        .unwrap()
}

/// Material-axis stresses of Kaw's 60° lamina per unit S.
fn kaw_60_state() -> Vector3<f64> {
    laminate::stress_to_material(Angle::from_deg(60.0)) * Vector3::new(2.0, -3.0, 4.0)
}

#[test]
fn max_strain_matches_kaw_example_2_17() {
    // Kaw Example 2.17: largest S by maximum strain 16.33 MPa (from memory, REFERENCES.md),
    // governed by the shear strain gamma12 = tau12/G12 reaching S12/G12. Strain limits are
    // derived from strengths over moduli, as Kaw does. The book prints four figures: 5e-4.
    let l = t300();
    let s = kaw_60_state();
    let s_inv = laminate::reduced_stiffness(&l).try_inverse().unwrap();
    let strain = s_inv * s;
    let r = failure::max_strain(&l, &strain, &Vector3::zeros()).unwrap();
    assert_relative_eq!(r.ratio / 1e6, 16.33, max_relative = 5e-4);
    assert_eq!(r.mode, FailureMode::Shear);
}

#[test]
fn tsai_wu_without_interaction_matches_kaw_example_2_19() {
    // Kaw Example 2.19 also gives the largest S with F12 = 0: 22.50 MPa (REFERENCES.md; the
    // quadratic a S² + b S - 1 = 0 with a = F11 s1² + F22 s2² + F66 t12², b = F1 s1 + F2 s2
    // gives 22.497 MPa by hand). Four figures: 5e-4.
    let l = Lamina { f12_star: 0.0, ..t300() };
    let r = failure::tsai_wu(&l, &kaw_60_state(), &Vector3::zeros()).unwrap();
    assert_relative_eq!(r.ratio / 1e6, 22.50, max_relative = 5e-4);
}

/// Hashin's plane-stress modes (Hashin, "Failure criteria for unidirectional fiber composites",
/// J. Appl. Mech. 47 (1980) 329–334, Eq. 23–26). No published worked example with numbers was
/// found, so these are recomputations by hand of Kaw's 60° lamina, each mode solved as a
/// quadratic in S:
///
/// - fibre tension (sigma1 > 0): (1.7141 S/1500)² + (4.1651 S/68)² = 1 →
///   S = 1/sqrt(1.3058e-6 + 3.7517e-3) = 16.323 MPa;
/// - matrix compression (sigma2 < 0) with S23 = Yc/2 (the linear term vanishes):
///   (2.7141 S/246)² + (4.1651 S/68)² = 1 → S = 1/sqrt(1.2173e-4 + 3.7517e-3) = 16.068 MPa.
///
/// The lower, 16.07 MPa in matrix compression, governs. The tolerance 1e-4 covers the five
/// figures carried by hand.
#[test]
fn hashin_recomputed_by_hand_for_kaw_60_degree_lamina() {
    let l = t300();
    let r = failure::hashin(&l, &kaw_60_state(), &Vector3::zeros()).unwrap();
    assert_relative_eq!(r.ratio / 1e6, 16.068, max_relative = 1e-4);
    assert_eq!(r.mode, FailureMode::MatrixCompression);
}

/// With a transverse shear strength S23 = 100 MPa the matrix compression mode reads
/// (sigma2/2S23)² + [(Yc/2S23)² - 1] sigma2/Yc + (tau12/S12)² = 1 (Hashin 1980, Eq. 26).
/// By hand, per S in MPa: a = (2.7141/200)² + (4.1651/68)² = 1.8417e-4 + 3.7517e-3 = 3.9358e-3,
/// b = [(246/200)² - 1](-2.7141/246) = 0.5129 × (-0.011033) = -5.6588e-3, so
/// S = (-b + sqrt(b² + 4a))/(2a) = 16.675 MPa. Fibre tension (16.323 MPa, above) now governs.
#[test]
fn hashin_matrix_compression_with_transverse_shear_strength_recomputed_by_hand() {
    let l = Lamina { s23: Some(100e6), ..t300() };
    let s = kaw_60_state();
    let r = failure::hashin(&l, &s, &Vector3::zeros()).unwrap();
    assert_relative_eq!(r.ratio / 1e6, 16.323, max_relative = 1e-4);
    assert_eq!(r.mode, FailureMode::FibreTension);
    // Reversing sigma1 alone moves the fibre family to compression (|sigma1| = Xc, 875 MPa,
    // no shear term), which lets the matrix compression mode govern.
    let matrix_only = Vector3::new(-s.x, s.y, s.z);
    let m = failure::hashin(&l, &matrix_only, &Vector3::zeros()).unwrap();
    assert_relative_eq!(m.ratio / 1e6, 16.675, max_relative = 1e-4);
    assert_eq!(m.mode, FailureMode::MatrixCompression);
}

/// The reversed load (-2S, 3S, -4S) puts the matrix in tension: (2.7141 S/40)² +
/// (4.1651 S/68)² = 1 → S = 1/sqrt(4.6040e-3 + 3.7517e-3) = 10.940 MPa (by hand; Hashin 1980,
/// Eq. 25); fibre compression |sigma1| = Xc would need S = 1500/1.7141 = 875.1 MPa.
#[test]
fn hashin_matrix_tension_recomputed_by_hand() {
    let r = failure::hashin(&t300(), &(-kaw_60_state()), &Vector3::zeros()).unwrap();
    assert_relative_eq!(r.ratio / 1e6, 10.940, max_relative = 1e-4);
    assert_eq!(r.mode, FailureMode::MatrixTension);
}

/// Residual stresses of a free [0/90]s laminate cooled by 100 K, by a closed-form force balance
/// derived independently of CLT's matrices. By the laminate's square symmetry eps_x = eps_y =
/// eps and there is no curvature. With no load, sum of sigma_x over the plies is zero:
/// (Q11 + Q22 + 2 Q12) eps = [(Q11 + Q12) a1 + (Q22 + Q12) a2] dT. In the 0° ply,
/// sigma1 = (Q11 + Q12) eps - (Q11 a1 + Q12 a2) dT and sigma2 = (Q12 + Q22) eps -
/// (Q12 a1 + Q22 a2) dT (Hooke's law on mechanical strain, Kaw 2006, Eq. 4.40–4.41); the 90°
/// plies carry the same stresses in their own material axes, and sigma1 = -sigma2.
#[test]
fn cross_ply_cure_stresses_match_a_closed_form_force_balance() {
    let l = t300();
    let q = laminate::reduced_stiffness(&l);
    let (q11, q12, q22) = (q[(0, 0)], q[(0, 1)], q[(1, 1)]);
    let (a1, a2, dt) = (0.02e-6, 22.5e-6, -100.0);
    let eps = ((q11 + q12) * a1 + (q22 + q12) * a2) * dt / (q11 + q22 + 2.0 * q12);
    let sigma1 = (q11 + q12) * eps - (q11 * a1 + q12 * a2) * dt;
    let sigma2 = (q12 + q22) * eps - (q12 * a1 + q22 * a2) * dt;
    assert_relative_eq!(sigma1, -sigma2, max_relative = 1e-12);
    let lam = Laminate::from_code(&"[0/90]s".parse::<LayupCode>().unwrap(), &l);
    let resp = lam.response(&LaminateLoad::Resultants(Resultants::default()), dt).unwrap();
    // Both routes are exact linear algebra: agreement to round-off (1e-9).
    assert_relative_eq!(resp.thermal.strain.x, eps, max_relative = 1e-9);
    assert_relative_eq!(resp.thermal.strain.y, eps, max_relative = 1e-9);
    assert!(resp.thermal.curvature.norm() < 1e-9);
    for (i, p) in resp.plies.iter().enumerate() {
        for face in [&p.top_thermal, &p.bottom_thermal] {
            assert_relative_eq!(face.stress_12.x, sigma1, max_relative = 1e-9);
            assert_relative_eq!(face.stress_12.y, sigma2, max_relative = 1e-9);
            assert!(face.stress_12.z.abs() < 1e-6, "ply {i}");
        }
        // No mechanical load: the load part is zero.
        assert!(p.top.stress_12.norm() < 1e-6);
    }
    // Cooling puts the matrix of every ply in transverse tension (about 24 MPa here).
    assert!(sigma2 > 20e6 && sigma2 < 30e6, "{sigma2}");
}

/// A two-layer strip heated uniformly bends by Timoshenko's bimetal formula (S. Timoshenko,
/// "Analysis of bi-metal thermostats", J. Opt. Soc. Am. 11 (1925) 233–255):
/// kappa = 6 (a2 - a1) dT (1 + m)² / (h [3 (1 + m)² + (1 + m n)(m² + 1/(m n))]),
/// m = t1/t2, n = E1/E2, h = t1 + t2, convex on the side of the layer that expands more. With
/// isotropic layers of equal Poisson's ratio the plate's biaxial state replaces E by E/(1 - nu)
/// in both layers, which leaves n, and so the formula, unchanged: kappa_x = kappa_y = kappa.
#[test]
fn bimetal_strip_curvature_matches_timoshenko_1925() {
    let layer = |name: &str, e: f64, t: f64, cte: f64| Isotropic {
        name: name.into(),
        e,
        nu: 0.3,
        density: 5000.0,
        ply_thickness: Some(t),
        tensile_strength: None,
        compressive_strength: None,
        shear_strength: None,
        cte: Some(cte),
        melting_range: None,
        shrinkage: None,
        safety_note: None,
        core: None,
    };
    // Aluminium-like outer layer (expands more) over a steel-like inner layer.
    let (e_al, t_al, a_al) = (70e9, 2e-3, 23e-6);
    let (e_st, t_st, a_st) = (200e9, 1e-3, 12e-6);
    let al = Arc::new(layer("al", e_al, t_al, a_al).as_lamina().unwrap());
    let st = Arc::new(layer("steel", e_st, t_st, a_st).as_lamina().unwrap());
    let lam = Laminate::new(vec![Ply::new(al, Angle::ZERO), Ply::new(st, Angle::ZERO)]);
    let dt = 100.0;
    let resp = lam.response(&LaminateLoad::Resultants(Resultants::default()), dt).unwrap();
    // Timoshenko with layer 1 = steel, layer 2 = aluminium.
    let (m, n, h) = (t_st / t_al, e_st / e_al, t_st + t_al);
    let kappa = 6.0 * (a_al - a_st) * dt * (1.0 + m).powi(2)
        / (h * (3.0 * (1.0 + m).powi(2) + (1.0 + m * n) * (m * m + 1.0 / (m * n))));
    // Exact closed form against exact CLT: round-off only (1e-9).
    assert_relative_eq!(resp.thermal.curvature.x, kappa, max_relative = 1e-9);
    assert_relative_eq!(resp.thermal.curvature.y, kappa, max_relative = 1e-9);
    assert!(kappa > 0.0, "the outer, aluminium side is convex: positive curvature along +z");
}
