//! Beam-wall reduction of a laminate: the stiffness a thin wall offers to a closed thin-walled
//! beam, with its hoop force free and its curvatures following the beam.
//!
//! # The wall state
//!
//! Wall axes: 1 = beam `x`, 2 = the contour direction `s`, 3 = the outward normal (laminate
//! `z`, first ply outermost). Of the six midplane strains and curvatures of the laminate
//! `(eps_x, eps_s, gamma_xs, kappa_x, kappa_s, kappa_xs)`:
//!
//! - `N_s = 0`: the hoop force is free (no pressure, no hoop load path), so `eps_s` follows from
//!   the other five (the condensation of the closed-section theories of Rehfield 1985, NASA
//!   CP-2362, and Berdichevsky, Armanios & Badir 1992, Composites Engineering 2(5) 411–432).
//! - `kappa_x` and `kappa_xs` are not free: the wall of a closed beam bends and twists with the
//!   beam. Euler–Bernoulli kinematics through the wall thickness give `kappa_x = n_z kappa_f +
//!   n_y kappa_e` (the beam's bending curvatures projected on the wall normal) and a rigid
//!   rotation of the section with the Kirchhoff normal gives `kappa_xs = -2 kappa_t` (the
//!   twisting curvature of a plate strip turned about a distant axis, the open-section torsion
//!   term of Rehfield 1985 and of Librescu & Song, Thin-Walled Composite Beams, 2006).
//!   [`WallCurvature`] sets whether the section uses them: with [`WallCurvature::Held`] both
//!   are held at zero, the leading order of the thin-wall theory in `t/h` (the wall still cannot
//!   curl).
//! - `kappa_s = 0` and the hoop moment `M_s` is a reaction. Decision and reason: the beam theory
//!   keeps the shape of the cross-section, so the wall's hoop curvature cannot change by itself.
//!   On a closed ring a uniform change of hoop curvature `dk` needs a change of radius `-dk R²`,
//!   that is a hoop strain `-dk R`, which the free hoop force does not supply; the hoop curvature
//!   is therefore of the order of the beam strains over the section size, the same order as
//!   `kappa_x`, and vanishes at the wall's scale. This is the axisymmetric state of a long
//!   cylinder with `kappa_theta = 0` (Timoshenko & Woinowsky-Krieger, Theory of Plates and
//!   Shells, 1959, §114, from memory). Rehfield and Librescu & Song instead take the hoop moment
//!   as zero (`M_s = 0`, from memory); for a symmetric wall the two differ only in the wall's
//!   own bending terms, but for an unsymmetric wall `M_s = 0` lets the wall curl round the hoop
//!   through `B_12`, `B_22`, `B_26`, which a closed ring cannot do, and changes the membrane
//!   law by terms that are not small in `t/h` (for the cross-ply `[0_3/90_3]` wall of a long
//!   tube it gives an axial stiffness below the cylinder's axisymmetric value).
//!
//! Dropping the `kappa_s` row and column of `[A B; B D]` and condensing `eps_s` with `N_s = 0`
//! leaves the 4x4 beam-wall stiffness `K` relating `(N_x, N_xs, M_x, M_xs)` to
//! `(eps_x, gamma_xs, kappa_x, kappa_xs)`. Its membrane block is the Schur complement of `A_22`
//! in `A`, which for a symmetric wall equals the reduction with every wall moment free (the
//! inverse of the `(x, xs)` block of `A⁻¹`): symmetric walls keep their membrane law exactly.
//!
//! The section theory takes the kinematic quantities `k = (eps_x, kappa_x, kappa_xs)` and the
//! shear flow `N_xs` (an unknown of the cell equations) as given, so `K` is used in mixed form
//!
//! ```text
//! (N_x, M_x, M_xs) = Ā k + c N_xs,     gamma_xs = f N_xs - c·k,
//! Ā = K_kk - K_kq K_qk / K_qq,   c = K_kq / K_qq,   f = 1 / K_qq     (q = the N_xs row).
//! ```
//!
//! For an isotropic wall `Ā_11 = E t` (hoop stress free, not `E t / (1 - nu²)`), `f = 1/(G t)`,
//! `Ā_22 = E t³/(12 (1 - nu²))` (hoop curvature held), `Ā_33 = G t³/12`. Holding `kappa_s`
//! also against the beam's own anticlastic hoop curvature (Saint-Venant's `-nu kappa_x` in an
//! isotropic wall) changes only the wall bending terms, by a factor `1/(1 - nu²)` at most on a
//! term of order `(t/h)²` in stiffness and `t/h` in face stress.

use nalgebra::{Matrix2, Matrix3, Matrix4, Matrix6, Vector3, Vector6};

use crate::laminate::{Deformation, Laminate, LaminateError, Resultants};

/// How the wall curvatures follow the beam (see the module documentation).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum WallCurvature {
    /// `kappa_x` and `kappa_xs` held at zero: the walls neither curl nor take the beam's
    /// curvature through their thickness. The leading order of thin-wall theory: the section
    /// stiffness is the membrane theory, and ply strains are uniform through each wall.
    Held,
    /// `kappa_x = n_z kappa_f + n_y kappa_e` and `kappa_xs = -2 kappa_t`: the walls bend and
    /// twist with the beam. Adds the wall's own bending and coupling terms (`B`, order `t/h`;
    /// `D`, order `(t/h)²`) to the section stiffness and the strain gradient through the wall
    /// thickness to the ply stresses. The default.
    #[default]
    Beam,
}

/// A laminate reduced for a beam wall, with its mass moments through the thickness.
#[derive(Debug, Clone, PartialEq)]
pub struct WallStiffness {
    /// Membrane stiffness relating `(N_x, N_xs)` to `(eps_x, gamma_xs)` with `N_s = 0` and the
    /// wall curvatures held at zero, N/m (for a symmetric wall the same as with the wall
    /// moments free).
    pub membrane: Matrix2<f64>,
    /// Beam-wall stiffness relating `(N_x, N_xs, M_x, M_xs)` to `(eps_x, gamma_xs, kappa_x,
    /// kappa_xs)` with `N_s = 0` and `kappa_s = 0` (units N/m, N, N·m by block).
    pub beam_wall: Matrix4<f64>,
    /// Laminate thickness, m.
    pub thickness: f64,
    /// Mass per unit area, kg/m².
    pub areal_mass: f64,
    /// First moment of density through the thickness about the midplane, `∫ rho ζ dζ`, kg/m
    /// (ζ along the outward normal).
    pub mass_moment1: f64,
    /// Second moment of density through the thickness about the midplane, `∫ rho ζ² dζ`, kg.
    pub mass_moment2: f64,
    abd: Matrix6<f64>,
    mixed: Matrix3<f64>,
    mixed_coupling: Vector3<f64>,
    compliance_q: f64,
}

/// Positions of `(eps_x, gamma_xs, kappa_x, kappa_xs)` in the laminate's 6-vector
/// `(eps_x, eps_s, gamma_xs, kappa_x, kappa_s, kappa_xs)`.
const KEPT: [usize; 4] = [0, 2, 3, 5];

impl WallStiffness {
    /// Reduces `laminate` for a beam wall. Fails for an empty laminate or one whose stiffness
    /// matrix is singular.
    pub fn from_laminate(laminate: &Laminate) -> Result<Self, LaminateError> {
        if laminate.is_empty() {
            return Err(LaminateError::Empty);
        }
        // The full compliance exists only for a laminate stiff in every direction.
        laminate.abd().compliance().ok_or(LaminateError::Singular)?;
        let abd = laminate.abd().matrix();
        let a22 = abd[(1, 1)];
        if !(a22 > 0.0 && a22.is_finite()) {
            return Err(LaminateError::Singular);
        }
        let k = Matrix4::from_fn(|i, j| {
            let (a, b) = (KEPT[i], KEPT[j]);
            abd[(a, b)] - abd[(a, 1)] * abd[(1, b)] / a22
        });
        let k = (k + k.transpose()) / 2.0;
        let kqq = k[(1, 1)];
        if !(kqq > 0.0 && kqq.is_finite()) {
            return Err(LaminateError::Singular);
        }
        // Kinematic entries (eps_x, kappa_x, kappa_xs) are rows 0, 2, 3 of K.
        const KIN: [usize; 3] = [0, 2, 3];
        let mixed =
            Matrix3::from_fn(|i, j| k[(KIN[i], KIN[j])] - k[(KIN[i], 1)] * k[(1, KIN[j])] / kqq);
        let mixed_coupling = Vector3::from_fn(|i, _| k[(KIN[i], 1)] / kqq);
        let membrane = Matrix2::new(k[(0, 0)], k[(0, 1)], k[(1, 0)], k[(1, 1)]);
        let (mut m1, mut m2) = (0.0, 0.0);
        for (p, (zt, zb)) in laminate.plies().iter().zip(laminate.ply_bounds()) {
            let rho = p.material.density;
            m1 += rho * (zt * zt - zb * zb) / 2.0;
            m2 += rho * (zt * zt * zt - zb * zb * zb) / 3.0;
        }
        Ok(WallStiffness {
            membrane,
            beam_wall: k,
            thickness: laminate.thickness(),
            areal_mass: laminate.areal_mass(),
            mass_moment1: m1,
            mass_moment2: m2,
            abd,
            mixed,
            mixed_coupling,
            compliance_q: 1.0 / kqq,
        })
    }

    /// Axial stiffness with the shear flow held fixed and the curvatures at zero, `Ā_11`, N/m.
    pub fn axial(&self) -> f64 {
        self.mixed[(0, 0)]
    }

    /// Axial–shear coupling with the shear flow held fixed, `c_1` (dimensionless): at a given
    /// shear flow `q` and zero curvatures, `N_x = axial() eps_x + coupling() q` and
    /// `gamma_xs = shear_compliance() q - coupling() eps_x`.
    pub fn coupling(&self) -> f64 {
        self.mixed_coupling[0]
    }

    /// Shear compliance `f = 1/K_qq`, m/N.
    pub fn shear_compliance(&self) -> f64 {
        self.compliance_q
    }

    /// The mixed stiffness `Ā` relating `(N_x, M_x, M_xs)` to `(eps_x, kappa_x, kappa_xs)` at a
    /// fixed shear flow.
    pub fn mixed_stiffness(&self) -> &Matrix3<f64> {
        &self.mixed
    }

    /// The mixed coupling `c`: `(N_x, M_x, M_xs)` per unit shear flow, and minus `gamma_xs` per
    /// unit `(eps_x, kappa_x, kappa_xs)`.
    pub fn mixed_coupling(&self) -> &Vector3<f64> {
        &self.mixed_coupling
    }

    /// The wall's midplane strains and curvatures for given `k = (eps_x, kappa_x, kappa_xs)` and
    /// shear flow `n_xs`, with `N_s = 0` and `kappa_s = 0`.
    pub fn deformation(&self, k: &Vector3<f64>, n_xs: f64) -> Deformation {
        let gamma = self.compliance_q * n_xs - self.mixed_coupling.dot(k);
        let m = &self.abd;
        let (ex, kx, kxs) = (k[0], k[1], k[2]);
        let es =
            -(m[(1, 0)] * ex + m[(1, 2)] * gamma + m[(1, 3)] * kx + m[(1, 5)] * kxs) / m[(1, 1)];
        Deformation { strain: Vector3::new(ex, es, gamma), curvature: Vector3::new(kx, 0.0, kxs) }
    }

    /// The resultants `[A B; B D]` times a deformation: for a beam-wall deformation `N_s = 0`
    /// (to rounding) and `M_s` is the reaction that keeps the hoop curvature.
    pub fn resultants(&self, d: &Deformation) -> Resultants {
        let v = self.abd
            * Vector6::new(
                d.strain.x,
                d.strain.y,
                d.strain.z,
                d.curvature.x,
                d.curvature.y,
                d.curvature.z,
            );
        Resultants { n: Vector3::new(v[0], v[1], v[2]), m: Vector3::new(v[3], v[4], v[5]) }
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
        // Hoop stress free: K11 = E t, K22 = G t, no coupling (elementary plane stress); wall
        // bending with the hoop curvature held: D11 = E t³/(12 (1 - nu²)), twisting
        // D66 = G t³/12 (Kirchhoff plate, Timoshenko & Woinowsky-Krieger, §10 and §2).
        let (e, nu, t) = (70e9, 0.33, 1e-3);
        let g = e / 2.66;
        let al = Lamina::builder("al").elastic(e, e, g, nu).ply_thickness(t).build().unwrap();
        let lam = Laminate::from_code(&"[0]".parse::<LayupCode>().unwrap(), &al);
        let w = WallStiffness::from_laminate(&lam).unwrap();
        assert!((w.membrane[(0, 0)] / (e * t) - 1.0).abs() < 1e-12);
        assert!((w.membrane[(1, 1)] / (g * t) - 1.0).abs() < 1e-12);
        assert!(w.membrane[(0, 1)].abs() < 1e-3);
        assert!((w.axial() - 70e6).abs() < 1e-3);
        let a = w.mixed_stiffness();
        assert!((a[(1, 1)] / (e * t.powi(3) / (12.0 * (1.0 - nu * nu))) - 1.0).abs() < 1e-12);
        assert!((a[(2, 2)] / (g * t.powi(3) / 12.0) - 1.0).abs() < 1e-12);
        assert!(a[(0, 1)].abs() < 1e-9 && w.mixed_coupling().norm() < 1e-12);
    }

    #[test]
    fn wall_state_reproduces_its_resultants_through_the_full_abd() {
        // The deformation for given (eps_x, kappa_x, kappa_xs) and N_xs, fed back through the
        // full [A B; B D], must give N_s = 0, the given N_xs, and (N_x, M_x, M_xs) of the mixed
        // law; its hoop curvature is zero.
        let lam = Laminate::from_code(&"[0/30/-60/45]T".parse::<LayupCode>().unwrap(), &t300());
        let w = WallStiffness::from_laminate(&lam).unwrap();
        let k = Vector3::new(1.0e-3, 0.8, -1.5);
        let q = -3.0e4;
        let d = w.deformation(&k, q);
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
        let scale = 1.0e5;
        assert!(nm[1].abs() < 1e-9 * scale, "N_s = {}", nm[1]);
        assert!((nm[2] - q).abs() < 1e-9 * scale);
        assert_eq!(d.curvature.y, 0.0);
        let mixed = w.mixed_stiffness() * k + w.mixed_coupling() * q;
        assert!((nm[0] - mixed[0]).abs() < 1e-9 * scale);
        assert!((nm[3] - mixed[1]).abs() < 1e-9 * scale * 1e-3);
        assert!((nm[5] - mixed[2]).abs() < 1e-9 * scale * 1e-3);
        let r = w.resultants(&d);
        assert!((r.n.x - nm[0]).abs() < 1e-9 * scale && (r.m.y - nm[4]).abs() < 1e-6);
        let resp = lam.response(&LaminateLoad::Deformation(d), 0.0).unwrap();
        assert_eq!(resp.plies.len(), 4);
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
