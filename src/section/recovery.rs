//! From beam strains or resultants back to the walls: the state of every wall element for ply
//! stress recovery.
//!
//! Kinematics give the wall axial strain `eps_x = eps + (z - z_ec) kappa_f + (y - y_ec) kappa_e`
//! and, when the walls follow the beam's curvature, `kappa_x` and `kappa_xs` (see `stiffness.rs`);
//! the closed-cell flows of the same strains, plus any transverse shear flow, give `N_xs`; the
//! wall law of `wall.rs` (the same one the stiffness is built from) gives `N_x`, `M_x`, `M_xs`
//! and, with `N_s = 0` and `kappa_s = 0`, the wall's full midplane deformation, which
//! [`Laminate::response`](crate::laminate::Laminate::response) turns into ply stresses.
//! Integrated round the section, the recovered `N_x`, `M_x`, `N_xs` and `M_xs` give back the
//! beam resultants when the strains come from [`SolvedSection::strains_under_shear`] (or from
//! [`SolvedSection::strains`] without shear forces): a wall with membrane–shear coupling turns
//! the transverse shear flow into wall axial forces, whose resultants the beam strains must
//! leave to it.

use nalgebra::{Vector3, Vector4};

use super::outline::lerp;
use super::solve::SolvedSection;
use super::stiffness::{kinematics, shift};

use crate::laminate::{Deformation, LaminateLoad, Resultants};

/// The state of a wall at one point.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WallState {
    /// Index of the wall element ([`SolvedSection::elements`]).
    pub element: usize,
    /// Where on the midline (y, z), m, chord frame.
    pub position: [f64; 2],
    /// Axial force per unit wall width, N/m.
    pub n_x: f64,
    /// Shear flow along the wall's axis 2, N/m.
    pub n_xs: f64,
    /// Wall moments `(M_x, M_s, M_xs)`, N·m/m: `M_x`, `M_xs` from the curvatures the beam
    /// imposes (and the membrane–bending coupling of an unsymmetric wall), `M_s` the reaction
    /// that holds the hoop curvature. With [`WallCurvature::Held`](super::WallCurvature) all three
    /// are reactions that keep the wall flat, outside the beam resultants (order `t/h`).
    pub moments: Vector3<f64>,
    /// Midplane strains `(eps_x, eps_s, gamma_xs)` and curvatures `(kappa_x, 0, kappa_xs)` of
    /// the wall laminate with `N_s = 0` and the hoop curvature held (laminate axes: 1 = beam x,
    /// 2 = wall axis s, 3 = outward normal).
    pub deformation: Deformation,
}

impl WallState {
    /// The wall resultants `(N_x, 0, N_xs)` and moments `(M_x, M_s, M_xs)`.
    pub fn resultants(&self) -> Resultants {
        Resultants { n: Vector3::new(self.n_x, 0.0, self.n_xs), m: self.moments }
    }

    /// The load for [`Laminate::response`](crate::laminate::Laminate::response).
    pub fn load(&self) -> LaminateLoad {
        LaminateLoad::Deformation(self.deformation)
    }
}

impl SolvedSection {
    /// Generalised strains `(eps, kappa_t, kappa_f, kappa_e)` about the elastic centre from
    /// resultants `(N, T, M_f, M_e)` about it, by the section compliance.
    pub fn strains(&self, resultants: &Vector4<f64>) -> Vector4<f64> {
        self.compliance * resultants
    }

    /// Generalised strains `(eps, kappa_t, kappa_f, kappa_e)` about the elastic centre under
    /// resultants `(N, T, M_f, M_e)` about it (the torque about the shear centre) together with
    /// shear forces `shear = [V_flap, V_edge]` (N, along z and y) through the shear centre: the
    /// compliance times the resultants less those the transverse shear flow carries through the
    /// walls' membrane–shear coupling (zero for walls without it). These are the strains for
    /// [`SolvedSection::wall_states`] with the same shear forces.
    pub fn strains_under_shear(&self, resultants: &Vector4<f64>, shear: [f64; 2]) -> Vector4<f64> {
        let [flap, edge] = &self.shear.coupling;
        let carried =
            shift(self.properties.elastic_centre).transpose() * (flap * shear[0] + edge * shear[1]);
        self.compliance * (resultants - carried)
    }

    /// The beam resultants `(N, T, M_f, M_e)` about the pitch axis (the chord frame's origin)
    /// that the walls' membrane–shear coupling makes of a unit shear force `[V_flap, V_edge]`
    /// through the shear centre: the part of the applied resultants the beam strains leave to
    /// the walls (see [`SolvedSection::strains_under_shear`]); zero for walls without coupling.
    pub fn shear_carried(&self) -> [Vector4<f64>; 2] {
        self.shear.coupling
    }

    /// The state of every wall element at its midpoint under generalised strains about the
    /// elastic centre and shear forces `shear = [V_flap, V_edge]` (N, along z and y) acting
    /// through the shear centre (the torque behind `strains` is then the torque about the shear
    /// centre).
    pub fn wall_states(&self, strains: &Vector4<f64>, shear: [f64; 2]) -> Vec<WallState> {
        let cells = self.closed_flows(strains);
        (0..self.contour.elements.len())
            .map(|k| self.state_at(k, 0.5, strains, &cells, shear))
            .collect()
    }

    /// The state of wall element `element` at `fraction` (0 at its start, 1 at its end) of its
    /// length; `None` for an element index out of range.
    pub fn wall_state(
        &self,
        element: usize,
        fraction: f64,
        strains: &Vector4<f64>,
        shear: [f64; 2],
    ) -> Option<WallState> {
        (element < self.contour.elements.len()).then(|| {
            let cells = self.closed_flows(strains);
            self.state_at(element, fraction.clamp(0.0, 1.0), strains, &cells, shear)
        })
    }

    /// Transverse shear flow (N/m, along each element's axis 2) at every element midpoint under
    /// shear forces `[V_flap, V_edge]` through the shear centre, with zero twist.
    pub fn shear_flows(&self, shear: [f64; 2]) -> Vec<f64> {
        self.contour
            .elements
            .iter()
            .enumerate()
            .map(|(k, e)| self.transverse_flow(k, 0.5 * e.length(), shear))
            .collect()
    }

    fn closed_flows(&self, strains: &Vector4<f64>) -> Vec<f64> {
        let e = shift(self.properties.elastic_centre) * strains;
        (0..self.cell_flow.nrows())
            .map(|j| (0..4).map(|c| self.cell_flow[(j, c)] * e[c]).sum())
            .collect()
    }

    fn transverse_flow(&self, k: usize, s: f64, shear: [f64; 2]) -> f64 {
        let l = self.contour.elements[k].length();
        shear[0] * self.shear.flap[k].at(s, l) + shear[1] * self.shear.edge[k].at(s, l)
    }

    fn state_at(
        &self,
        k: usize,
        fraction: f64,
        strains: &Vector4<f64>,
        cells: &[f64],
        shear: [f64; 2],
    ) -> WallState {
        let e = &self.contour.elements[k];
        let w = &self.walls[e.laminate];
        let position = lerp(e.start, e.end, fraction);
        let g = kinematics(position, e.normal(), self.wall_curvature);
        let kin = g * (shift(self.properties.elastic_centre) * strains);
        let closed: f64 = e.cells().map(|(j, s)| s * cells[j]).sum();
        let n_xs = closed + self.transverse_flow(k, fraction * e.length(), shear);
        let deformation = w.deformation(&kin, n_xs);
        let r = w.resultants(&deformation);
        WallState { element: k, position, n_x: r.n.x, n_xs, moments: r.m, deformation }
    }
}
