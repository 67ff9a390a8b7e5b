//! Sandwich walls: a laminate that holds a core ply (a material marked `core = true`) between two
//! faces. Their own failure modes under the wall's membrane resultants, each as a reserve factor
//! (the multiplier on the load at which the mode occurs):
//!
//! - **transverse shear stiffness** `S = G_c d² / t_c`, `d` the distance between the face
//!   centroids, `t_c` the core thickness (Allen, *Analysis and Design of Structural Sandwich
//!   Panels*, 1969, ch. 2, thin faces; Zenkert, *An Introduction to Sandwich Construction*,
//!   1995, ch. 4), which lowers the panel buckling load (see [`super::plate`]);
//! - **shear crimping**: the short-wave limit of panel buckling, `N_crimp = S` (Allen 1969,
//!   ch. 8; Zenkert 1995, ch. 9), against the most compressive principal membrane resultant;
//! - **face wrinkling**: `sigma_wr = 0.5 (E_f E_c G_c)^(1/3)` (Hoff & Mautner, J. Aeronaut.
//!   Sci. 12, 1945, as given by Zenkert 1995, ch. 9, with its conservative coefficient 0.5),
//!   `E_f` the face modulus along the span, `E_c` the core's through-thickness modulus, against
//!   the most compressive principal stress of each face;
//! - **core shear**: the core's in-plane shear stress under the wall's shear strain,
//!   `tau_c = G_c gamma_xs`, against the core shear strength (Zenkert 1995, ch. 9, core shear
//!   failure `tau_c = tau_c,allow`). Transverse loads on the panel (pressure) are not modelled.
//!
//! Face and core strains come from the wall's compliance `[A B; B D]^-1` under `(N_x, 0, N_xs)`
//! with the wall moments free, as the ply stresses do; face stress resultants are the face
//! sub-laminate's `A` times its centroid's strain.

use nalgebra::{Matrix3, Vector3};

use crate::laminate::Laminate;
use crate::material::{CoreProperties, Material, MaterialLibrary};

/// A sandwich wall: where its core lies and what the sandwich checks need, per unit load.
#[derive(Debug, Clone, PartialEq)]
pub struct SandwichWall {
    /// Name of the core material.
    pub core_material: String,
    /// Core thickness, m.
    pub core_thickness: f64,
    /// Thickness of the outer and inner face, m.
    pub face_thickness: [f64; 2],
    /// Distance between the face centroids, m.
    pub face_distance: f64,
    /// Transverse shear stiffness `S = G_c d²/t_c`, N/m.
    pub shear_stiffness: f64,
    /// Face wrinkling stress of the outer and inner face, Pa (positive, a compression).
    pub wrinkling_stress: [f64; 2],
    /// The core's properties.
    pub core: CoreProperties,
    /// Face stresses `(sigma_x, sigma_s, tau_xs)` (Pa) of each face per unit `N_x` and per unit
    /// `N_xs` (N/m).
    face_unit: [[Vector3<f64>; 2]; 2],
    /// Core shear strain per unit `N_x` and `N_xs`.
    core_gamma_unit: [f64; 2],
}

/// Reserve factors of the sandwich modes under one `(N_x, N_xs)`; infinite where the load does
/// not drive the mode.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SandwichFactors {
    /// Face wrinkling (the worse face).
    pub wrinkling: f64,
    /// Shear crimping.
    pub crimping: f64,
    /// Core shear.
    pub core_shear: f64,
}

fn core_of(library: &MaterialLibrary, name: &str) -> Option<CoreProperties> {
    match library.get(name) {
        Ok(Material::Isotropic(i)) => i.core,
        _ => None,
    }
}

/// Most compressive principal value of a plane state `(x, y, xy)`.
fn least_principal(v: &Vector3<f64>) -> f64 {
    let c = 0.5 * (v.x + v.y);
    let r = (0.25 * (v.x - v.y).powi(2) + v.z * v.z).sqrt();
    c - r
}

/// Multiplier that brings a compressive value `v` (negative) to `limit` (positive magnitude).
fn factor(limit: f64, v: f64) -> f64 {
    if v < 0.0 { limit / -v } else { f64::INFINITY }
}

impl SandwichWall {
    /// The sandwich description of a laminate, or `None` when it holds no core ply with a face
    /// on either side. Several core plies must lie together; the thickest run of core plies is
    /// the core.
    pub fn of(laminate: &Laminate, library: &MaterialLibrary) -> Option<SandwichWall> {
        let plies = laminate.plies();
        let cores: Vec<Option<CoreProperties>> =
            plies.iter().map(|p| core_of(library, &p.material.name)).collect();
        // The thickest contiguous run of core plies.
        let mut best: Option<(usize, usize, f64)> = None;
        let mut k = 0;
        while k < plies.len() {
            if cores[k].is_none() {
                k += 1;
                continue;
            }
            let start = k;
            while k < plies.len() && cores[k].is_some() {
                k += 1;
            }
            let t: f64 = plies[start..k].iter().map(|p| p.thickness).sum();
            if best.is_none_or(|b| t > b.2) {
                best = Some((start, k, t));
            }
        }
        let (first, end, t_c) = best?;
        if first == 0 || end == plies.len() {
            return None;
        }
        let core = cores[first]?;
        let core_material = plies[first].material.name.clone();
        let bounds = laminate.ply_bounds();
        let abd = laminate.abd();
        let compliance = abd.compliance()?;
        // Face sub-laminates: A and centroid z of each.
        let face = |range: std::ops::Range<usize>| {
            let mut a = Matrix3::zeros();
            let (mut t, mut zt) = (0.0, 0.0);
            for i in range {
                let (top, bottom) = bounds[i];
                let p = &plies[i];
                a += crate::laminate::transformed_stiffness(&p.material, p.angle) * (top - bottom);
                t += top - bottom;
                zt += 0.5 * (top + bottom) * (top - bottom);
            }
            (a, t, zt / t)
        };
        let faces = [face(0..first), face(end..plies.len())];
        let face_thickness = [faces[0].1, faces[1].1];
        let face_distance = faces[0].2 - faces[1].2;
        let shear_stiffness = core.shear_modulus * face_distance * face_distance / t_c;
        let unit = |n: Vector3<f64>| {
            let mut load = nalgebra::Vector6::zeros();
            load.fixed_rows_mut::<3>(0).copy_from(&n);
            let def = compliance * load;
            let (eps, kappa) = (def.fixed_rows::<3>(0).into_owned(), def.fixed_rows::<3>(3));
            let stress = |f: &(Matrix3<f64>, f64, f64)| f.0 * (eps + kappa * f.2) / f.1;
            let z_core = 0.5 * (bounds[first].0 + bounds[end - 1].1);
            ([stress(&faces[0]), stress(&faces[1])], eps.z + kappa.z * z_core)
        };
        let (fx, gx) = unit(Vector3::new(1.0, 0.0, 0.0));
        let (fs, gs) = unit(Vector3::new(0.0, 0.0, 1.0));
        let wrinkling_stress = [0, 1].map(|i| {
            let a_inv = faces[i].0.try_inverse().unwrap_or(Matrix3::zeros());
            let e_f = if a_inv[(0, 0)] > 0.0 { 1.0 / (faces[i].1 * a_inv[(0, 0)]) } else { 0.0 };
            0.5 * (e_f * core.compression_modulus * core.shear_modulus).cbrt()
        });
        Some(SandwichWall {
            core_material,
            core_thickness: t_c,
            face_thickness,
            face_distance,
            shear_stiffness,
            wrinkling_stress,
            core,
            face_unit: [[fx[0], fs[0]], [fx[1], fs[1]]],
            core_gamma_unit: [gx, gs],
        })
    }

    /// Face stresses `(sigma_x, sigma_s, tau_xs)` (Pa) of the outer (0) and inner (1) face under
    /// `(N_x, N_xs)`.
    pub fn face_stress(&self, n_x: f64, n_xs: f64) -> [Vector3<f64>; 2] {
        [0, 1].map(|i| self.face_unit[i][0] * n_x + self.face_unit[i][1] * n_xs)
    }

    /// Reserve factors of the sandwich modes under `(N_x, N_xs)`, N/m.
    pub fn factors(&self, n_x: f64, n_xs: f64) -> SandwichFactors {
        let faces = self.face_stress(n_x, n_xs);
        let wrinkling = (0..2)
            .map(|i| factor(self.wrinkling_stress[i], least_principal(&faces[i])))
            .fold(f64::INFINITY, f64::min);
        let crimping = factor(self.shear_stiffness, least_principal(&Vector3::new(n_x, 0.0, n_xs)));
        let gamma = self.core_gamma_unit[0] * n_x + self.core_gamma_unit[1] * n_xs;
        let tau = self.core.shear_modulus * gamma.abs();
        let core_shear = if tau > 0.0 { self.core.shear_strength / tau } else { f64::INFINITY };
        SandwichFactors { wrinkling, crimping, core_shear }
    }
}
