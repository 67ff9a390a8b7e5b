//! Classical laminate theory kernels: the reduced stiffness Q, its rotation Q-bar, the
//! stress and strain transformations, and the A, B, D matrices.
//!
//! Formulas as in Kaw, *Mechanics of Composite Materials*, 2nd ed., 2006, §2.4 and §4.3, and
//! Jones, *Mechanics of Composite Materials*, 2nd ed., 1999, §2.6 and §4.2. Shear strain is the
//! engineering strain gamma. Laminate `z` runs along the outward normal, so the first ply listed
//! (the outer face) lies at the largest `z`; B therefore has the opposite sign of Kaw's, whose
//! `z` runs the other way.

use nalgebra::{Matrix3, Matrix6, Vector3};

use crate::material::Lamina;
use crate::units::Angle;

/// Reduced (plane-stress) stiffness Q of a lamina in its material axes, Pa (Kaw Eq. 2.93).
pub fn reduced_stiffness(l: &Lamina) -> Matrix3<f64> {
    let nu21 = l.nu21();
    let d = 1.0 - l.nu12 * nu21;
    let q11 = l.e1 / d;
    let q22 = l.e2 / d;
    let q12 = l.nu12 * l.e2 / d;
    Matrix3::new(q11, q12, 0.0, q12, q22, 0.0, 0.0, 0.0, l.g12)
}

/// Stress transformation T from laminate axes (x, y) to material axes (1, 2) for a ply at
/// `angle` (counter-clockwise from x to 1): sigma_12 = T sigma_xy (Kaw Eq. 2.94).
pub fn stress_to_material(angle: Angle) -> Matrix3<f64> {
    let (s, c) = angle.rad().sin_cos();
    Matrix3::new(
        c * c,
        s * s,
        2.0 * s * c,
        s * s,
        c * c,
        -2.0 * s * c,
        -s * c,
        s * c,
        c * c - s * s,
    )
}

/// Strain transformation for engineering strains from laminate to material axes:
/// eps_12 = R T R^-1 eps_xy (Kaw Eq. 2.95).
pub fn strain_to_material(angle: Angle) -> Matrix3<f64> {
    let (s, c) = angle.rad().sin_cos();
    Matrix3::new(
        c * c,
        s * s,
        s * c,
        s * s,
        c * c,
        -s * c,
        -2.0 * s * c,
        2.0 * s * c,
        c * c - s * s,
    )
}

/// Transformed reduced stiffness Q-bar of a ply at `angle`, Pa (Kaw Eq. 2.104):
/// Q-bar = T^-1 Q R T R^-1, which equals the strain transformation's transpose sandwich
/// Tε^T Q Tε.
pub fn transformed_stiffness(l: &Lamina, angle: Angle) -> Matrix3<f64> {
    let te = strain_to_material(angle);
    te.transpose() * reduced_stiffness(l) * te
}

/// Free thermal strains of a ply in laminate axes per kelvin (alpha_x, alpha_y, alpha_xy with
/// engineering shear), from the material CTEs (Kaw Eq. 2.224). Zero when no CTE is given.
pub fn thermal_expansion(l: &Lamina, angle: Angle) -> Vector3<f64> {
    match l.cte {
        Some([a1, a2]) => {
            let (s, c) = angle.rad().sin_cos();
            Vector3::new(a1 * c * c + a2 * s * s, a1 * s * s + a2 * c * c, 2.0 * (a1 - a2) * s * c)
        }
        None => Vector3::zeros(),
    }
}

/// The extensional (A, N/m), coupling (B, N) and bending (D, N·m) stiffness matrices of a
/// laminate, relating resultants to midplane strains and curvatures:
/// `[N; M] = [A B; B D] [eps0; kappa]`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Abd {
    /// Extensional stiffness A, N/m.
    pub a: Matrix3<f64>,
    /// Coupling stiffness B, N.
    pub b: Matrix3<f64>,
    /// Bending stiffness D, N·m.
    pub d: Matrix3<f64>,
}

impl Abd {
    /// The 6x6 matrix `[A B; B D]`.
    pub fn matrix(&self) -> Matrix6<f64> {
        let mut m = Matrix6::zeros();
        m.fixed_view_mut::<3, 3>(0, 0).copy_from(&self.a);
        m.fixed_view_mut::<3, 3>(0, 3).copy_from(&self.b);
        m.fixed_view_mut::<3, 3>(3, 0).copy_from(&self.b);
        m.fixed_view_mut::<3, 3>(3, 3).copy_from(&self.d);
        m
    }

    /// The 6x6 compliance `[A B; B D]^-1` (written `[a b; b^T d]` by Jones), or `None` when the
    /// laminate has no stiffness in some direction.
    pub fn compliance(&self) -> Option<Matrix6<f64>> {
        let m = self.matrix();
        // Scale to unit diagonal before the Cholesky so that N/m and N·m entries of very
        // different size do not trip the positive-definiteness test.
        let scale = m.diagonal().map(|v| if v > 0.0 { 1.0 / v.sqrt() } else { 0.0 });
        if scale.iter().any(|&s| s == 0.0 || !s.is_finite()) {
            return None;
        }
        let sd = Matrix6::from_diagonal(&scale);
        let chol = (sd * m * sd).cholesky()?;
        Some(sd * chol.inverse() * sd)
    }
}
