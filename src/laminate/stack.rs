//! A laminate as an ordered stack of plies, outer face first, and its stiffness.

use std::sync::Arc;

use nalgebra::{Matrix3, Vector3};

use super::LaminateError;
use super::clt::{self, Abd};
use super::code::LayupCode;
use crate::material::{Lamina, MaterialLibrary};
use crate::units::Angle;

/// One ply in a laminate.
#[derive(Debug, Clone, PartialEq)]
pub struct Ply {
    /// The ply's material, shared between the many laminates of a blade.
    pub material: Arc<Lamina>,
    /// Fibre angle from the laminate x axis, counter-clockwise seen from outside (from +z).
    pub angle: Angle,
    /// Cured thickness, m.
    pub thickness: f64,
    /// The ply's place in a blade's ply schedule (0 = first row of the plies file), when the
    /// laminate was built from one: its identity, which travels with it into every result that
    /// names plies. `None` for a laminate given by code or by hand.
    pub schedule_ply: Option<usize>,
}

impl Ply {
    /// A ply of the material's cured ply thickness.
    pub fn new(material: Arc<Lamina>, angle: Angle) -> Self {
        let thickness = material.ply_thickness;
        Ply { material, angle, thickness, schedule_ply: None }
    }

    /// A ply of the material's cured ply thickness that is ply `index` of a blade's schedule.
    pub fn of_schedule(material: Arc<Lamina>, angle: Angle, index: usize) -> Self {
        Ply { schedule_ply: Some(index), ..Ply::new(material, angle) }
    }
}

/// Engineering constants of a laminate as an equivalent homogeneous plate.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct EngineeringConstants {
    /// Modulus along x, Pa.
    pub ex: f64,
    /// Modulus along y, Pa.
    pub ey: f64,
    /// In-plane shear modulus, Pa.
    pub gxy: f64,
    /// Poisson's ratio nu_xy (strain in y from stress in x).
    pub nuxy: f64,
}

/// An ordered stack of plies. The first ply is the outer face (largest `z`); `z` runs along
/// the outward normal and its origin is the geometric midplane.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Laminate {
    plies: Vec<Ply>,
}

impl Laminate {
    /// A laminate of the given plies, outer face first.
    pub fn new(plies: Vec<Ply>) -> Self {
        Laminate { plies }
    }

    /// Every ply of the code in one material.
    pub fn from_code(code: &LayupCode, material: &Lamina) -> Self {
        let m = Arc::new(material.clone());
        Laminate::new(code.plies().iter().map(|p| Ply::new(m.clone(), p.angle)).collect())
    }

    /// The code's plies, each in the material its code names or else in `default` (a hybrid
    /// laminate when the code names several).
    pub fn from_code_in(
        code: &LayupCode,
        library: &MaterialLibrary,
        default: Option<&str>,
    ) -> Result<Self, LaminateError> {
        let mut cache: Vec<Arc<Lamina>> = Vec::new();
        let mut plies = Vec::with_capacity(code.plies().len());
        for p in code.plies() {
            let name = match (&p.material, default) {
                (Some(n), _) => n.as_str(),
                (None, Some(d)) => d,
                (None, None) => {
                    return Err(LaminateError::NoMaterial { code: code.to_string() });
                }
            };
            let m = match cache.iter().find(|m| m.name == name) {
                Some(m) => m.clone(),
                None => {
                    let m = Arc::new(library.ply_material(name)?);
                    cache.push(m.clone());
                    m
                }
            };
            plies.push(Ply::new(m, p.angle));
        }
        Ok(Laminate::new(plies))
    }

    /// The same plies, every one `thickness` thick (m), overriding the materials' cured ply
    /// thickness (a different areal weight or compaction).
    pub fn with_ply_thickness(mut self, thickness: f64) -> Self {
        for p in &mut self.plies {
            p.thickness = thickness;
        }
        self
    }

    /// The plies, outer face first.
    pub fn plies(&self) -> &[Ply] {
        &self.plies
    }

    /// Whether there is no ply.
    pub fn is_empty(&self) -> bool {
        self.plies.is_empty()
    }

    /// Total thickness, m.
    pub fn thickness(&self) -> f64 {
        self.plies.iter().map(|p| p.thickness).sum()
    }

    /// Mass per unit area, kg/m².
    pub fn areal_mass(&self) -> f64 {
        self.plies.iter().map(|p| p.thickness * p.material.density).sum()
    }

    /// `(z_top, z_bottom)` of every ply, m, from the midplane; `z_top` is the outer side.
    pub fn ply_bounds(&self) -> Vec<(f64, f64)> {
        let mut z = self.thickness() / 2.0;
        self.plies
            .iter()
            .map(|p| {
                let top = z;
                z -= p.thickness;
                (top, z)
            })
            .collect()
    }

    /// A, B and D (Kaw Eq. 4.28–4.30 with `z` along the outward normal).
    pub fn abd(&self) -> Abd {
        let mut a = Matrix3::zeros();
        let mut b = Matrix3::zeros();
        let mut d = Matrix3::zeros();
        for (p, (zt, zb)) in self.plies.iter().zip(self.ply_bounds()) {
            let qb = clt::transformed_stiffness(&p.material, p.angle);
            a += qb * (zt - zb);
            b += qb * ((zt * zt - zb * zb) / 2.0);
            d += qb * ((zt * zt * zt - zb * zb * zb) / 3.0);
        }
        Abd { a, b, d }
    }

    /// Thermal force (N/m) and moment (N·m/m) resultants of a uniform temperature change
    /// `delta_t` (K): N_T = sum Q-bar alpha dT (z_t - z_b), M_T = sum Q-bar alpha dT (z_t² - z_b²)/2
    /// (Kaw Eq. 4.39).
    pub fn thermal_resultants(&self, delta_t: f64) -> (Vector3<f64>, Vector3<f64>) {
        let mut n = Vector3::zeros();
        let mut m = Vector3::zeros();
        for (p, (zt, zb)) in self.plies.iter().zip(self.ply_bounds()) {
            let qa = clt::transformed_stiffness(&p.material, p.angle)
                * clt::thermal_expansion(&p.material, p.angle)
                * delta_t;
            n += qa * (zt - zb);
            m += qa * ((zt * zt - zb * zb) / 2.0);
        }
        (n, m)
    }

    /// Membrane engineering constants from the laminate compliance with curvatures free:
    /// Ex = 1/(h a11), Ey = 1/(h a22), Gxy = 1/(h a66), nuxy = -a12/a11 (Kaw Eq. 4.32–4.35,
    /// which for a symmetric laminate use A^-1; here the upper block of [A B; B D]^-1 so that an
    /// unsymmetric laminate is free to bend).
    pub fn membrane_constants(&self) -> Result<EngineeringConstants, LaminateError> {
        let h = self.thickness();
        let c = self.abd().compliance().ok_or(LaminateError::Singular)?;
        Ok(EngineeringConstants {
            ex: 1.0 / (h * c[(0, 0)]),
            ey: 1.0 / (h * c[(1, 1)]),
            gxy: 1.0 / (h * c[(2, 2)]),
            nuxy: -c[(0, 1)] / c[(0, 0)],
        })
    }

    /// Flexural engineering constants: Ex_f = 12/(h³ d11), Ey_f = 12/(h³ d22),
    /// Gxy_f = 12/(h³ d66), nuxy_f = -d12/d11 (Kaw Eq. 4.36–4.38), from the lower block of
    /// [A B; B D]^-1.
    pub fn flexural_constants(&self) -> Result<EngineeringConstants, LaminateError> {
        let h = self.thickness();
        let h3 = h * h * h;
        let c = self.abd().compliance().ok_or(LaminateError::Singular)?;
        Ok(EngineeringConstants {
            ex: 12.0 / (h3 * c[(3, 3)]),
            ey: 12.0 / (h3 * c[(4, 4)]),
            gxy: 12.0 / (h3 * c[(5, 5)]),
            nuxy: -c[(3, 4)] / c[(3, 3)],
        })
    }

    /// The laminate, or an error when it is empty or its stiffness matrix is singular.
    pub fn checked(self) -> Result<Self, LaminateError> {
        if self.plies.is_empty() {
            return Err(LaminateError::Empty);
        }
        if self.abd().compliance().is_none() {
            return Err(LaminateError::Singular);
        }
        Ok(self)
    }
}
