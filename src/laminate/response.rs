//! Laminate response: midplane strains and curvatures from resultants, then strains and stresses
//! at the top and bottom of every ply in laminate and material axes (Kaw 2006, §4.3–4.4).
//!
//! A uniform temperature change `delta_t` adds the thermal resultants to the mechanical ones and
//! the free thermal strain is taken off each ply's total strain before Q-bar is applied
//! (Kaw Eq. 4.40–4.41). The ply state is split into a part that scales with the mechanical load
//! and a fixed part (the residual thermal state), so that strength ratios multiply the load only.

use nalgebra::{Vector3, Vector6};

use super::LaminateError;
use super::clt;
use super::stack::Laminate;

/// Force (N/m) and moment (N·m/m) resultants per unit width in laminate axes.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Resultants {
    /// Nx, Ny, Nxy, N/m.
    pub n: Vector3<f64>,
    /// Mx, My, Mxy, N·m/m.
    pub m: Vector3<f64>,
}

/// Midplane strains (engineering shear) and curvatures (1/m).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Deformation {
    /// eps_x, eps_y, gamma_xy of the midplane.
    pub strain: Vector3<f64>,
    /// kappa_x, kappa_y, kappa_xy, 1/m.
    pub curvature: Vector3<f64>,
}

impl Deformation {
    fn stacked(&self) -> Vector6<f64> {
        Vector6::new(
            self.strain.x,
            self.strain.y,
            self.strain.z,
            self.curvature.x,
            self.curvature.y,
            self.curvature.z,
        )
    }

    fn from_stacked(v: Vector6<f64>) -> Self {
        Deformation {
            strain: Vector3::new(v[0], v[1], v[2]),
            curvature: Vector3::new(v[3], v[4], v[5]),
        }
    }
}

/// What loads a laminate.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum LaminateLoad {
    /// Given mechanical resultants.
    Resultants(Resultants),
    /// Given midplane strains and curvatures (total, including any thermal part).
    Deformation(Deformation),
}

/// Stress and strain at one point through the thickness.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct PointState {
    /// Height above the midplane, m.
    pub z: f64,
    /// Total strain in laminate axes (eps_x, eps_y, gamma_xy).
    pub strain_xy: Vector3<f64>,
    /// Stress in laminate axes (sigma_x, sigma_y, tau_xy), Pa.
    pub stress_xy: Vector3<f64>,
    /// Mechanical strain (total less free thermal) in material axes (eps1, eps2, gamma12).
    pub strain_12: Vector3<f64>,
    /// Stress in material axes (sigma1, sigma2, tau12), Pa.
    pub stress_12: Vector3<f64>,
}

/// The state of one ply: its top (outer) and bottom faces, each split into the part that scales
/// with the mechanical load and the fixed residual thermal part.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct PlyState {
    /// Outer face (larger z), load part.
    pub top: PointState,
    /// Inner face, load part.
    pub bottom: PointState,
    /// Outer face, residual thermal part (zero without a temperature change).
    pub top_thermal: PointState,
    /// Inner face, residual thermal part.
    pub bottom_thermal: PointState,
}

/// The laminate's response to one load.
#[derive(Debug, Clone, PartialEq)]
pub struct LaminateResponse {
    /// Midplane deformation from the mechanical load.
    pub mechanical: Deformation,
    /// Midplane deformation from the temperature change alone (free laminate).
    pub thermal: Deformation,
    /// Per ply, outer face first.
    pub plies: Vec<PlyState>,
}

impl Laminate {
    /// Midplane strains and curvatures under mechanical resultants, from [A B; B D]^-1.
    pub fn deformation(&self, load: &Resultants) -> Result<Deformation, LaminateError> {
        let c = self.abd().compliance().ok_or(LaminateError::Singular)?;
        let nm = Vector6::new(load.n.x, load.n.y, load.n.z, load.m.x, load.m.y, load.m.z);
        Ok(Deformation::from_stacked(c * nm))
    }

    /// Ply strains and stresses under `load` and a uniform temperature change `delta_t` (K,
    /// cure to service is negative). A given deformation is taken as the total one; given
    /// resultants are mechanical and the thermal resultants are added.
    pub fn response(
        &self,
        load: &LaminateLoad,
        delta_t: f64,
    ) -> Result<LaminateResponse, LaminateError> {
        let mut out = self.responses(std::slice::from_ref(load), delta_t)?;
        out.pop().ok_or(LaminateError::Singular)
    }

    /// [`Laminate::response`] to each of `loads` at one temperature change, with the work they
    /// share (the compliance, the thermal state, each ply's stiffness and transformations) done
    /// once: every number is the one [`Laminate::response`] gives for that load alone.
    pub fn responses(
        &self,
        loads: &[LaminateLoad],
        delta_t: f64,
    ) -> Result<Vec<LaminateResponse>, LaminateError> {
        let c = self.abd().compliance().ok_or(LaminateError::Singular)?;
        let (nt, mt) = self.thermal_resultants(delta_t);
        let thermal =
            Deformation::from_stacked(c * Vector6::new(nt.x, nt.y, nt.z, mt.x, mt.y, mt.z));
        let mechanical: Vec<Deformation> = loads
            .iter()
            .map(|load| match load {
                LaminateLoad::Resultants(r) => Deformation::from_stacked(
                    c * Vector6::new(r.n.x, r.n.y, r.n.z, r.m.x, r.m.y, r.m.z),
                ),
                LaminateLoad::Deformation(d) => {
                    Deformation::from_stacked(d.stacked() - thermal.stacked())
                }
            })
            .collect();
        let mut plies: Vec<Vec<PlyState>> =
            loads.iter().map(|_| Vec::with_capacity(self.plies().len())).collect();
        for (p, (zt, zb)) in self.plies().iter().zip(self.ply_bounds()) {
            let qb = clt::transformed_stiffness(&p.material, p.angle);
            let ts = clt::stress_to_material(p.angle);
            let te = clt::strain_to_material(p.angle);
            let alpha = clt::thermal_expansion(&p.material, p.angle) * delta_t;
            let point = |d: &Deformation, z: f64, free: Vector3<f64>| {
                let strain_xy = d.strain + d.curvature * z;
                let mech = strain_xy - free;
                let stress_xy = qb * mech;
                PointState {
                    z,
                    strain_xy,
                    stress_xy,
                    strain_12: te * mech,
                    stress_12: ts * stress_xy,
                }
            };
            let top_thermal = point(&thermal, zt, alpha);
            let bottom_thermal = point(&thermal, zb, alpha);
            for (m, out) in mechanical.iter().zip(plies.iter_mut()) {
                out.push(PlyState {
                    top: point(m, zt, Vector3::zeros()),
                    bottom: point(m, zb, Vector3::zeros()),
                    top_thermal,
                    bottom_thermal,
                });
            }
        }
        Ok(mechanical
            .into_iter()
            .zip(plies)
            .map(|(mechanical, plies)| LaminateResponse { mechanical, thermal, plies })
            .collect())
    }
}

#[cfg(test)]
mod tests {
    use std::sync::Arc;

    use super::*;
    use crate::laminate::Ply;
    use crate::units::Angle;

    /// The shared work of [`Laminate::responses`] changes no number: each response is, bit for
    /// bit, the one [`Laminate::response`] gives alone, on an unsymmetric, coupled stack of two
    /// materials under resultants and deformations with a temperature change.
    #[test]
    fn responses_together_equal_responses_alone_to_the_bit() {
        // T300/5208 and an E-glass/epoxy (`material::kaw`, a published table).
        let carbon = Arc::new(crate::material::kaw::t300().build().expect("lamina"));
        let glass = Arc::new(crate::material::kaw::e_glass().build().expect("lamina"));
        let lam = Laminate::new(vec![
            Ply::new(carbon.clone(), Angle::from_deg(0.0)),
            Ply::new(glass.clone(), Angle::from_deg(30.0)),
            Ply::new(carbon, Angle::from_deg(-45.0)),
            Ply::new(glass, Angle::from_deg(90.0)),
        ]);
        let loads = [
            LaminateLoad::Resultants(Resultants {
                n: Vector3::new(1e5, -2e4, 3e3),
                m: Vector3::new(5.0, -1.0, 0.5),
            }),
            LaminateLoad::Deformation(Deformation {
                strain: Vector3::new(1e-3, 0.0, -2e-4),
                curvature: Vector3::new(0.0, 0.3, 0.0),
            }),
            LaminateLoad::Deformation(Deformation::default()),
        ];
        for delta_t in [0.0, -100.0] {
            let together = lam.responses(&loads, delta_t).expect("responses");
            assert_eq!(together.len(), loads.len());
            for (load, t) in loads.iter().zip(&together) {
                let alone = lam.response(load, delta_t).expect("response");
                assert_eq!(format!("{alone:?}"), format!("{t:?}"));
            }
        }
    }
}
