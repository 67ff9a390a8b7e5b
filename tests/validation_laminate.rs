//! Classical laminate theory and lamina failure against published worked examples.
//!
//! Source throughout: A. K. Kaw, *Mechanics of Composite Materials*, 2nd ed., CRC Press, 2006.
//! Material: T300/5208 graphite/epoxy, Kaw Table 2.1 (after Tsai & Hahn 1980): E1 181 GPa,
//! E2 10.3 GPa, G12 7.17 GPa, nu12 0.28; Xt = Xc = 1500 MPa, Yt 40 MPa, Yc 246 MPa,
//! S12 68 MPa. Tolerances are set by the number of digits the book prints (four significant
//! figures: 0.05 % to 0.2 % relative).

use approx::assert_relative_eq;
use layloft::failure::{self, FailureMode};
use layloft::laminate::{self, Laminate, LayupCode, Ply};
use layloft::material::Lamina;
use layloft::units::Angle;
use nalgebra::Vector3;
use std::sync::Arc;

fn t300(ply_mm: f64) -> Lamina {
    Lamina::builder("T300/5208")
        .elastic(181e9, 10.3e9, 7.17e9, 0.28)
        .ply_thickness(ply_mm * 1e-3)
        .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
        .build()
        .unwrap()
}

#[test]
fn reduced_stiffness_matches_kaw_example_2_6() {
    // Kaw Example 2.6: Q11 181.8, Q12 2.897, Q22 10.35, Q66 7.17 GPa.
    let q = laminate::reduced_stiffness(&t300(0.125)) / 1e9;
    assert_relative_eq!(q[(0, 0)], 181.8, max_relative = 5e-4);
    assert_relative_eq!(q[(0, 1)], 2.897, max_relative = 5e-4);
    assert_relative_eq!(q[(1, 1)], 10.35, max_relative = 5e-4);
    assert_relative_eq!(q[(2, 2)], 7.17, max_relative = 5e-4);
}

#[test]
fn transformed_stiffness_at_60_degrees_matches_kaw_example_2_7() {
    // Kaw Example 2.7, 60° ply: Q-bar 11 23.65, 12 32.46, 16 20.05, 22 109.4, 26 54.19,
    // 66 36.74 GPa.
    let qb = laminate::transformed_stiffness(&t300(0.125), Angle::from_deg(60.0)) / 1e9;
    assert_relative_eq!(qb[(0, 0)], 23.65, max_relative = 1e-3);
    assert_relative_eq!(qb[(0, 1)], 32.46, max_relative = 1e-3);
    assert_relative_eq!(qb[(0, 2)], 20.05, max_relative = 1e-3);
    assert_relative_eq!(qb[(1, 1)], 109.4, max_relative = 1e-3);
    assert_relative_eq!(qb[(1, 2)], 54.19, max_relative = 1e-3);
    assert_relative_eq!(qb[(2, 2)], 36.74, max_relative = 1e-3);
}

/// Kaw Examples 2.16 and 2.19: a 60° lamina under sigma_x = 2S, sigma_y = -3S, tau_xy = 4S.
/// The largest S is 16.33 MPa by maximum stress and 22.39 MPa by Tsai–Wu (F12* = -1/2).
/// With S = 1 Pa the strength ratio is that largest S in Pa.
#[test]
fn off_axis_lamina_strength_matches_kaw_examples_2_16_and_2_19() {
    let l = t300(0.125);
    let ts = laminate::stress_to_material(Angle::from_deg(60.0));
    let s12 = ts * Vector3::new(2.0, -3.0, 4.0);
    // Kaw: sigma1 = 1.714 S, sigma2 = -2.714 S, tau12 = -4.165 S.
    assert_relative_eq!(s12.x, 1.714, max_relative = 5e-4);
    assert_relative_eq!(s12.y, -2.714, max_relative = 5e-4);
    assert_relative_eq!(s12.z, -4.165, max_relative = 5e-4);
    let zero = Vector3::zeros();
    let ms = failure::max_stress(&l, &s12, &zero).unwrap();
    assert_relative_eq!(ms.ratio / 1e6, 16.33, max_relative = 5e-4);
    assert_eq!(ms.mode, FailureMode::Shear);
    let tw = failure::tsai_wu(&l, &s12, &zero).unwrap();
    assert_relative_eq!(tw.ratio / 1e6, 22.39, max_relative = 5e-4);
}

#[test]
fn abd_of_kaw_example_4_2() {
    // Kaw Example 4.2: [0/30/-45], 5 mm plies. Kaw's z runs downward from the top ply, ours
    // along the outward normal from the first (outer) ply, so B changes sign (REFERENCES.md).
    let m = Arc::new(t300(5.0));
    let lam = Laminate::new(
        [0.0, 30.0, -45.0].iter().map(|&a| Ply::new(m.clone(), Angle::from_deg(a))).collect(),
    );
    let abd = lam.abd();
    let a =
        [[1.739e9, 3.884e8, 5.663e7], [3.884e8, 4.533e8, -1.141e8], [5.663e7, -1.141e8, 4.525e8]];
    let b: [[f64; 3]; 3] = [
        [-3.129e6, 9.855e5, -1.072e6],
        [9.855e5, 1.158e6, -1.072e6],
        [-1.072e6, -1.072e6, 9.855e5],
    ];
    let d =
        [[3.343e4, 6.461e3, -5.240e3], [6.461e3, 9.320e3, -5.596e3], [-5.240e3, -5.596e3, 7.663e3]];
    for i in 0..3 {
        for j in 0..3 {
            assert_relative_eq!(abd.a[(i, j)], a[i][j], max_relative = 2e-3);
            assert_relative_eq!(abd.b[(i, j)].abs(), b[i][j].abs(), max_relative = 2e-3);
            assert_relative_eq!(abd.d[(i, j)], d[i][j], max_relative = 2e-3);
        }
    }
    // Sign of B in our convention: Kaw's B11 is -3.129e6 with z running from the top ply
    // downward; our z runs the other way, which negates B.
    for (i, row) in b.iter().enumerate() {
        for (j, kaw) in row.iter().enumerate() {
            assert_relative_eq!(abd.b[(i, j)], -kaw, max_relative = 2e-3);
        }
    }
}

#[test]
fn engineering_constants_of_textbook_layups() {
    // Values recomputed for T300/5208 by CLT (REFERENCES.md, mark C) and matching Kaw's
    // quasi-isotropic discussion in §4.6: [0/±45/90]s E 69.68 GPa, nu 0.2960, G 26.88 GPa;
    // [0/90]s Ex = Ey 95.99 GPa, nuxy 0.03015, Gxy 7.17 GPa; [±45]s Ex 25.05 GPa,
    // Gxy 46.59 GPa, nuxy 0.7469.
    let l = t300(0.125);
    let c = |code: &str| {
        Laminate::from_code(&code.parse::<LayupCode>().unwrap(), &l).membrane_constants().unwrap()
    };
    let qi = c("[0/±45/90]s");
    assert_relative_eq!(qi.ex / 1e9, 69.68, max_relative = 5e-4);
    assert_relative_eq!(qi.ey / 1e9, 69.68, max_relative = 5e-4);
    assert_relative_eq!(qi.nuxy, 0.2960, max_relative = 5e-4);
    assert_relative_eq!(qi.gxy / 1e9, 26.88, max_relative = 5e-4);
    let cp = c("[0/90]s");
    assert_relative_eq!(cp.ex / 1e9, 95.99, max_relative = 5e-4);
    assert_relative_eq!(cp.nuxy, 0.03015, max_relative = 1e-3);
    assert_relative_eq!(cp.gxy / 1e9, 7.17, max_relative = 5e-4);
    let ap = c("[±45]s");
    assert_relative_eq!(ap.ex / 1e9, 25.05, max_relative = 5e-4);
    assert_relative_eq!(ap.gxy / 1e9, 46.59, max_relative = 5e-4);
    assert_relative_eq!(ap.nuxy, 0.7469, max_relative = 5e-4);
}

/// A quasi-isotropic laminate has A = h [[U1, U4, 0], [U4, U1, 0], [0, 0, U5]] with the
/// stiffness invariants U1 = (3 Q11 + 3 Q22 + 2 Q12 + 4 Q66)/8, U4 = (Q11 + Q22 + 6 Q12 -
/// 4 Q66)/8, U5 = (U1 - U4)/2 (Tsai & Pagano, "Invariant properties of composite materials",
/// 1968; Jones, *Mechanics of Composite Materials*, 2nd ed., 1999, §2.8 and §4.5), and its
/// in-plane modulus is E = (U1² - U4²)/U1. Closed form against CLT sums: round-off (1e-9).
#[test]
fn quasi_isotropic_extensional_stiffness_matches_the_stiffness_invariants() {
    let l = t300(0.125);
    let q = laminate::reduced_stiffness(&l);
    let (q11, q12, q22, q66) = (q[(0, 0)], q[(0, 1)], q[(1, 1)], q[(2, 2)]);
    let u1 = (3.0 * q11 + 3.0 * q22 + 2.0 * q12 + 4.0 * q66) / 8.0;
    let u4 = (q11 + q22 + 6.0 * q12 - 4.0 * q66) / 8.0;
    let u5 = (u1 - u4) / 2.0;
    for code in ["[0/±45/90]s", "[0/±60]s", "[±60/0]2s"] {
        let lam = Laminate::from_code(&code.parse::<LayupCode>().unwrap(), &l);
        let h = lam.thickness();
        let a = lam.abd().a;
        assert_relative_eq!(a[(0, 0)], u1 * h, max_relative = 1e-9);
        assert_relative_eq!(a[(1, 1)], u1 * h, max_relative = 1e-9);
        assert_relative_eq!(a[(0, 1)], u4 * h, max_relative = 1e-9);
        assert_relative_eq!(a[(2, 2)], u5 * h, max_relative = 1e-9);
        assert!(a[(0, 2)].abs() < 1e-9 * u1 * h && a[(1, 2)].abs() < 1e-9 * u1 * h, "{code}");
        let c = lam.membrane_constants().unwrap();
        assert_relative_eq!(c.ex, (u1 * u1 - u4 * u4) / u1, max_relative = 1e-9);
    }
}

/// Antisymmetric angle-ply [+60/-60]T of two plies of thickness t: A16 = A26 = 0 and only the
/// shear-extension couplings survive in B: B16 = Q-bar16(60°) t², B26 = Q-bar26(60°) t², the
/// other terms zero (Jones 1999, §4.3.4, with our z along the outward normal so that the first
/// ply, +60°, lies on the positive side). Q-bar16 = 20.05 GPa and Q-bar26 = 54.19 GPa at 60° are
/// Kaw's Example 2.7 values, printed to four figures: 1e-3.
#[test]
fn antisymmetric_angle_ply_coupling_matches_closed_form_with_kaw_example_2_7() {
    let t = 1e-3;
    let m = Arc::new(t300(1.0));
    let lam = Laminate::new(vec![
        Ply::new(m.clone(), Angle::from_deg(60.0)),
        Ply::new(m, Angle::from_deg(-60.0)),
    ]);
    let abd = lam.abd();
    assert_relative_eq!(abd.b[(0, 2)], 20.05e9 * t * t, max_relative = 1e-3);
    assert_relative_eq!(abd.b[(1, 2)], 54.19e9 * t * t, max_relative = 1e-3);
    for (i, j) in [(0, 0), (0, 1), (1, 1), (2, 2)] {
        assert!(abd.b[(i, j)].abs() < 1e-6 * 20.05e9 * t * t, "B{i}{j} = {}", abd.b[(i, j)]);
    }
    assert!(abd.a[(0, 2)].abs() < 1e-6 * abd.a[(0, 0)]);
    assert!(abd.d[(0, 2)].abs() < 1e-6 * abd.d[(0, 0)]);
}

/// Antisymmetric cross-ply [0/90]T, plies of thickness t: B11 = -B22 = (Q11 - Q22) t²/2,
/// B12 = B66 = 0, D11 = D22 = (Q11 + Q22) t³/3 (Jones 1999, §4.3.3, our z convention). With
/// Kaw's Q (Example 2.6: Q11 181.8, Q22 10.35 GPa, four figures): 1e-3.
#[test]
fn antisymmetric_cross_ply_matches_closed_form() {
    let t = 0.5e-3;
    let lam = Laminate::from_code(&"[0/90]T".parse::<LayupCode>().unwrap(), &t300(0.5));
    let abd = lam.abd();
    let (q11, q22) = (181.8e9, 10.35e9);
    assert_relative_eq!(abd.b[(0, 0)], (q11 - q22) * t * t / 2.0, max_relative = 1e-3);
    assert_relative_eq!(abd.b[(1, 1)], -(q11 - q22) * t * t / 2.0, max_relative = 1e-3);
    assert!(abd.b[(0, 1)].abs() < 1e-9 * abd.b[(0, 0)].abs());
    assert!(abd.b[(2, 2)].abs() < 1e-9 * abd.b[(0, 0)].abs());
    assert_relative_eq!(abd.d[(0, 0)], (q11 + q22) * t.powi(3) / 3.0, max_relative = 1e-3);
    assert_relative_eq!(abd.d[(1, 1)], (q11 + q22) * t.powi(3) / 3.0, max_relative = 1e-3);
}

/// A unidirectional laminate is the lamina itself: D = Q h³/12, so its membrane and flexural
/// constants are E1, E2, G12, nu12 (Kaw 2006, Eq. 4.32–4.38 with a single orientation).
#[test]
fn unidirectional_laminate_constants_are_the_lamina_constants() {
    let lam = Laminate::from_code(&"[0_8]T".parse::<LayupCode>().unwrap(), &t300(0.125));
    for c in [lam.membrane_constants().unwrap(), lam.flexural_constants().unwrap()] {
        assert_relative_eq!(c.ex, 181e9, max_relative = 1e-9);
        assert_relative_eq!(c.ey, 10.3e9, max_relative = 1e-9);
        assert_relative_eq!(c.gxy, 7.17e9, max_relative = 1e-9);
        assert_relative_eq!(c.nuxy, 0.28, max_relative = 1e-9);
    }
}
