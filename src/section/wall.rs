//! Beam-wall reduction of a laminate: the membrane stiffness a thin wall offers to the beam when
//! its hoop force and all its wall moments are free.
//!
//! From the full compliance `[A B; B D]^-1` (the laminate is free to curl), the rows and columns
//! of `N_x` and `N_xs` are kept with `N_s = 0` and `M = 0`:
//!
//! ```text
//! [eps_x; gamma_xs] = [a11 a16; a16 a66] [N_x; N_xs]   =>   [N_x; N_xs] = K [eps_x; gamma_xs]
//! ```
//!
//! `K` is the 2x2 wall membrane stiffness (N/m). For an isotropic wall `K = diag(E t, G t)`: the
//! hoop stress is free, so `K11` is `E t` and not `E t / (1 - nu²)`. Wall axes: 1 = beam `x`,
//! 2 = the contour direction `s`, 3 = the outward normal.

use nalgebra::{Matrix2, Matrix6, Vector6};

use crate::laminate::{Deformation, Laminate, LaminateError, Resultants};

/// A laminate reduced for a beam wall, with its mass moments through the thickness.
#[derive(Debug, Clone, PartialEq)]
pub struct WallStiffness {
    /// Membrane stiffness relating `(N_x, N_xs)` to `(eps_x, gamma_xs)` with `N_s = 0` and the
    /// wall moments zero, N/m.
    pub membrane: Matrix2<f64>,
    /// Laminate thickness, m.
    pub thickness: f64,
    /// Mass per unit area, kg/m².
    pub areal_mass: f64,
    /// First moment of density through the thickness about the midplane, `∫ rho ζ dζ`, kg/m
    /// (ζ along the outward normal).
    pub mass_moment1: f64,
    /// Second moment of density through the thickness about the midplane, `∫ rho ζ² dζ`, kg.
    pub mass_moment2: f64,
    compliance: Matrix6<f64>,
}

impl WallStiffness {
    /// Reduces `laminate` for a beam wall. Fails for an empty laminate or one whose stiffness
    /// matrix is singular.
    pub fn from_laminate(laminate: &Laminate) -> Result<Self, LaminateError> {
        if laminate.is_empty() {
            return Err(LaminateError::Empty);
        }
        let compliance = laminate.abd().compliance().ok_or(LaminateError::Singular)?;
        let c = Matrix2::new(
            compliance[(0, 0)],
            compliance[(0, 2)],
            compliance[(2, 0)],
            compliance[(2, 2)],
        );
        let membrane = c.try_inverse().ok_or(LaminateError::Singular)?;
        let (mut m1, mut m2) = (0.0, 0.0);
        for (p, (zt, zb)) in laminate.plies().iter().zip(laminate.ply_bounds()) {
            let rho = p.material.density;
            m1 += rho * (zt * zt - zb * zb) / 2.0;
            m2 += rho * (zt * zt * zt - zb * zb * zb) / 3.0;
        }
        Ok(WallStiffness {
            membrane: (membrane + membrane.transpose()) / 2.0,
            thickness: laminate.thickness(),
            areal_mass: laminate.areal_mass(),
            mass_moment1: m1,
            mass_moment2: m2,
            compliance,
        })
    }

    /// Axial stiffness with the shear flow held fixed, `K11 - K12²/K22`, N/m.
    pub fn axial(&self) -> f64 {
        let k = &self.membrane;
        k[(0, 0)] - k[(0, 1)] * k[(0, 1)] / k[(1, 1)]
    }

    /// Axial–shear coupling with the shear flow held fixed, `K12/K22` (dimensionless): at a given
    /// shear flow `q`, `N_x = axial() eps_x + coupling() q` and `gamma_xs = q / K22 - coupling()
    /// eps_x`.
    pub fn coupling(&self) -> f64 {
        self.membrane[(0, 1)] / self.membrane[(1, 1)]
    }

    /// Shear compliance `1/K22`, m/N.
    pub fn shear_compliance(&self) -> f64 {
        1.0 / self.membrane[(1, 1)]
    }

    /// The wall's midplane strains and curvatures under `N_x`, `N_xs` with `N_s = 0` and zero
    /// wall moments (an unsymmetric laminate curls freely).
    pub fn deformation(&self, n_x: f64, n_xs: f64) -> Deformation {
        let v = self.compliance * Vector6::new(n_x, 0.0, n_xs, 0.0, 0.0, 0.0);
        let mut d = Deformation::default();
        d.strain.copy_from(&v.fixed_rows::<3>(0));
        d.curvature.copy_from(&v.fixed_rows::<3>(3));
        d
    }

    /// The resultants of that state: `(N_x, 0, N_xs)` and zero moments.
    pub fn resultants(n_x: f64, n_xs: f64) -> Resultants {
        let mut r = Resultants::default();
        r.n.x = n_x;
        r.n.z = n_xs;
        r
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::laminate::{LaminateLoad, LayupCode};
    use crate::material::Lamina;

    fn t300() -> Lamina {
        // Kaw, Mechanics of Composite Materials, 2nd ed., 2006, Table 2.1 (T300/5208).
        Lamina::builder("T300/5208")
            .elastic(181e9, 10.3e9, 7.17e9, 0.28)
            .ply_thickness(0.125e-3)
            .density(1600.0)
            .build()
            .unwrap()
    }

    #[test]
    fn isotropic_wall_gives_e_t_and_g_t() {
        // Hoop stress free: K11 = E t, K22 = G t, no coupling (elementary plane stress).
        let al = Lamina::builder("al")
            .elastic(70e9, 70e9, 70e9 / 2.66, 0.33)
            .ply_thickness(1e-3)
            .build()
            .unwrap();
        let lam = Laminate::from_code(&"[0]".parse::<LayupCode>().unwrap(), &al);
        let w = WallStiffness::from_laminate(&lam).unwrap();
        assert!((w.membrane[(0, 0)] / (70e9 * 1e-3) - 1.0).abs() < 1e-12);
        assert!((w.membrane[(1, 1)] / (70e9 / 2.66 * 1e-3) - 1.0).abs() < 1e-12);
        assert!(w.membrane[(0, 1)].abs() < 1e-3);
        assert!((w.axial() - 70e6).abs() < 1e-3);
    }

    #[test]
    fn wall_state_reproduces_its_resultants_through_laminate_response() {
        // The recovered deformation, fed back through CLT, must give N_s = 0 and zero moments.
        let lam = Laminate::from_code(&"[0/30/-60/45]T".parse::<LayupCode>().unwrap(), &t300());
        let w = WallStiffness::from_laminate(&lam).unwrap();
        let d = w.deformation(1.2e5, -3.0e4);
        let abd = lam.abd().matrix();
        let v = Vector6::new(
            d.strain.x,
            d.strain.y,
            d.strain.z,
            d.curvature.x,
            d.curvature.y,
            d.curvature.z,
        );
        let nm = abd * v;
        assert!((nm[0] - 1.2e5).abs() < 1e-4 * 1.2e5);
        assert!((nm[2] + 3.0e4).abs() < 1e-4 * 1.2e5);
        assert!(nm[1].abs() < 1e-6 * 1.2e5);
        assert!(nm.fixed_rows::<3>(3).norm() < 1e-9 * 1.2e5);
        // And the 2x2 stiffness maps the midplane (eps_x, gamma_xs) back to (N_x, N_xs).
        let n = w.membrane * nalgebra::Vector2::new(d.strain.x, d.strain.z);
        assert!((n[0] - 1.2e5).abs() < 1e-6 * 1.2e5);
        assert!((n[1] + 3.0e4).abs() < 1e-6 * 1.2e5);
        let r = lam.response(&LaminateLoad::Deformation(d), 0.0).unwrap();
        assert_eq!(r.plies.len(), 4);
    }

    #[test]
    fn density_moments_of_a_two_density_laminate() {
        // Outer 1 mm at 2000 kg/m³, inner 1 mm at 1000 kg/m³; midplane between them:
        // m0 = 3, m1 = 2000·(1e-6/2) − 1000·(1e-6/2) = 5e-4, m2 = 3000·(1e-9/3) = 1e-6.
        let a = Lamina::builder("a")
            .elastic(10e9, 10e9, 4e9, 0.25)
            .ply_thickness(1e-3)
            .density(2000.0)
            .build()
            .unwrap();
        let b = Lamina { density: 1000.0, ..a.clone() };
        let lam = Laminate::new(vec![
            crate::laminate::Ply::new(std::sync::Arc::new(a), crate::units::Angle::ZERO),
            crate::laminate::Ply::new(std::sync::Arc::new(b), crate::units::Angle::ZERO),
        ]);
        let w = WallStiffness::from_laminate(&lam).unwrap();
        assert!((w.areal_mass - 3.0).abs() < 1e-12);
        assert!((w.mass_moment1 - 5e-4).abs() < 1e-15);
        assert!((w.mass_moment2 - 1e-6).abs() < 1e-18);
    }
}
