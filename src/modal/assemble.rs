//! The beam model: a uniform mesh along the pitch axis, element matrices assembled into band
//! matrices, root constraints or root springs.
//!
//! Global numbering, node by node: node `i` carries `(u, v, w, theta, v', w')` at `8 i .. 8 i + 6`
//! and element `i`'s interior node `(u_m, theta_m)` at `8 i + 6, 8 i + 7`, so element `i`'s 14
//! local degrees of freedom are the global `8 i .. 8 i + 14` and the half-bandwidth is 13. The
//! root node is clamped (all six removed); with root springs only `v` and `w` are removed and
//! springs act on `u`, `w'` (flap), `v'` (edge) and `theta` (torsion), in the rotor frame.
//!
//! The nodes' `u, v, w` are those of the shear centre (see `element.rs`), except at a root on
//! springs: there the bearing holds the pitch axis, so the root node's `u, v, w` are the pitch
//! axis's (`u_s = u_p - eta_s v' - zeta_s w'`, `v_s = v_p - zeta_s theta`,
//! `w_s = w_p + eta_s theta`, the shear centre at `(eta_s, zeta_s)` in the rotor frame) and the
//! root turns about the pitch axis on its torsion spring. A clamped root holds all six, which
//! is the same at either point.

use super::ModalError;
use super::attached::Attachments;
use super::band::BandMatrix;
use super::element::{NE, element_matrices};
use super::span::Span;
use crate::project::{ModalSpec, RootSprings, Rotor};
use crate::section::SectionProperties;
use crate::units::RotorSpeed;

/// Most elements a model may have.
pub const MAX_ELEMENTS: usize = 10_000;

/// What a degree of freedom is, rotor frame (`x` radial along the pitch axis, `y` in the plane
/// of rotation, `z` along the rotor axis).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum DofKind {
    /// Radial (axial) displacement `u`, m.
    Axial,
    /// Displacement in the plane of rotation `v` (y), m.
    InPlane,
    /// Displacement out of the plane of rotation `w` (z), m.
    OutOfPlane,
    /// Twist `theta` about the pitch axis, rad.
    Twist,
    /// In-plane slope `dv/dx`.
    InPlaneSlope,
    /// Out-of-plane slope `dw/dx`.
    OutOfPlaneSlope,
}

impl DofKind {
    /// A short name with its unit, for files: `u_m`, `v_m`, `w_m`, `theta_rad`, `dv_dx`, `dw_dx`.
    pub fn key(self) -> &'static str {
        match self {
            DofKind::Axial => "u_m",
            DofKind::InPlane => "v_m",
            DofKind::OutOfPlane => "w_m",
            DofKind::Twist => "theta_rad",
            DofKind::InPlaneSlope => "dv_dx",
            DofKind::OutOfPlaneSlope => "dw_dx",
        }
    }
}

const NODE_KINDS: [DofKind; 6] = [
    DofKind::Axial,
    DofKind::InPlane,
    DofKind::OutOfPlane,
    DofKind::Twist,
    DofKind::InPlaneSlope,
    DofKind::OutOfPlaneSlope,
];

/// One unconstrained degree of freedom of the model.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Dof {
    /// Radius of its node, m.
    pub r: f64,
    /// What it is.
    pub kind: DofKind,
    /// Its mesh node (0 at the root), or `None` for an element's interior node.
    pub node: Option<usize>,
}

/// The constrained stiffness and mass matrices at one speed.
#[derive(Debug, Clone)]
pub struct SystemMatrices {
    /// Rotor speed.
    pub speed: RotorSpeed,
    /// Stiffness `K = K_elastic + Omega² K_spin`, N/m, N, N·m per unit of the degrees of freedom.
    pub stiffness: BandMatrix,
    /// Mass, kg, kg·m, kg·m².
    pub mass: BandMatrix,
    /// The degree of freedom of every row.
    pub dofs: Vec<Dof>,
}

/// A rotating blade as a beam of finite elements along its pitch axis (see the module docs of
/// [`crate::modal`]).
#[derive(Debug, Clone)]
pub struct BeamModel {
    span: Span,
    attachments: Attachments,
    root_springs: Option<RootSprings>,
    rotor: Rotor,
    nodes: Vec<f64>,
    node_phi: Vec<f64>,
    /// The shear centre from the pitch axis at each node, rotor frame `(eta, zeta)`, m (zero at
    /// a root on springs, whose dofs are the pitch axis's).
    node_shear_centre: Vec<[f64; 2]>,
    node_chord: Vec<f64>,
    dofs: Vec<Dof>,
    elastic: BandMatrix,
    spin: BandMatrix,
    mass: BandMatrix,
    /// Mass entries `(i, j, value, family)` coupling two dofs of one family (flap 0, edge 1,
    /// torsion 2, axial 3), off-diagonal ones doubled: `Σ v x_i x_j` is that family's energy.
    family_mass: Vec<(usize, usize, f64, usize)>,
}

/// The energy family of a degree of freedom: 0 out of plane, 1 in plane, 2 twist, 3 radial.
fn family(kind: DofKind) -> usize {
    match kind {
        DofKind::OutOfPlane | DofKind::OutOfPlaneSlope => 0,
        DofKind::InPlane | DofKind::InPlaneSlope => 1,
        DofKind::Twist => 2,
        DofKind::Axial => 3,
    }
}

impl BeamModel {
    /// Builds the model from sections ordered root to tip (the first is the clamp; hub radius
    /// zero is allowed), the rotor (its pitch setting turns every section) and the modal settings
    /// (`elements` equal elements from the first to the last section; optional root springs).
    pub fn new(
        sections: &[SectionProperties],
        rotor: &Rotor,
        spec: &ModalSpec,
    ) -> Result<BeamModel, ModalError> {
        Self::with_attachments(sections, rotor, spec, &Attachments::default())
    }

    /// [`BeamModel::new`] with point bodies and the fluid's added mass.
    pub fn with_attachments(
        sections: &[SectionProperties],
        rotor: &Rotor,
        spec: &ModalSpec,
        attachments: &Attachments,
    ) -> Result<BeamModel, ModalError> {
        if spec.elements == 0 || spec.elements > MAX_ELEMENTS {
            return Err(ModalError::ElementCount { elements: spec.elements });
        }
        if let Some(springs) = &spec.root_springs {
            check_springs(springs)?;
        }
        let mut span = Span::new(sections, rotor.pitch.rad())?.with_bodies(&attachments.bodies)?;
        if let Some((density, fluid)) = &attachments.fluid {
            span = span.with_fluid(*density, fluid)?;
        }
        let n_el = spec.elements;
        let (root, tip) = (span.root(), span.tip());
        let nodes: Vec<f64> =
            (0..=n_el).map(|i| root + (tip - root) * i as f64 / n_el as f64).collect();
        let total = 8 * n_el + 6;
        let clamped: &[usize] =
            if spec.root_springs.is_some() { &[1, 2] } else { &[0, 1, 2, 3, 4, 5] };
        let mut free = vec![None; total];
        let mut dofs = Vec::with_capacity(total);
        for (g, slot) in free.iter_mut().enumerate() {
            if g < 6 && clamped.contains(&g) {
                continue;
            }
            *slot = Some(dofs.len());
            let (e, l) = (g / 8, g % 8);
            dofs.push(match l {
                6 => Dof { r: 0.5 * (nodes[e] + nodes[e + 1]), kind: DofKind::Axial, node: None },
                7 => Dof { r: 0.5 * (nodes[e] + nodes[e + 1]), kind: DofKind::Twist, node: None },
                _ => Dof { r: nodes[e], kind: NODE_KINDS[l], node: Some(e) },
            });
        }
        let n = dofs.len();
        let mut elastic = BandMatrix::zeros(n, 13);
        let mut spin = BandMatrix::zeros(n, 13);
        let mut mass = BandMatrix::zeros(n, 13);
        // At a root on springs, the root node's dofs taken at the pitch axis: d_s = T d_p.
        let root_turn = spec.root_springs.as_ref().map(|_| {
            let [eta_s, zeta_s] = span.at(root).shear_centre_rotor();
            let mut t = super::element::ElementMatrix::identity();
            t[(0, 4)] = -eta_s;
            t[(0, 5)] = -zeta_s;
            t[(1, 3)] = -zeta_s;
            t[(2, 3)] = eta_s;
            t
        });
        for e in 0..n_el {
            let mut em = element_matrices(&span, nodes[e], nodes[e + 1], e + 1 == n_el);
            if let (0, Some(t)) = (e, &root_turn) {
                em.elastic = t.transpose() * em.elastic * t;
                em.spin = t.transpose() * em.spin * t;
                em.mass = t.transpose() * em.mass * t;
            }
            for a in 0..NE {
                let Some(fa) = free[8 * e + a] else { continue };
                for b in 0..=a {
                    let Some(fb) = free[8 * e + b] else { continue };
                    elastic.add(fa, fb, em.elastic[(a, b)]);
                    spin.add(fa, fb, em.spin[(a, b)]);
                    mass.add(fa, fb, em.mass[(a, b)]);
                }
            }
        }
        if let Some(k) = &spec.root_springs {
            // Free root dofs in order: u, theta, v', w'.
            elastic.add(0, 0, k.axial);
            elastic.add(1, 1, k.torsion);
            elastic.add(2, 2, k.edge);
            elastic.add(3, 3, k.flap);
        }
        let node_phi = nodes.iter().map(|&r| span.at(r).phi).collect();
        // Where the shear centre lies from the pitch axis at each node (rotor frame), to give
        // mode shapes at the pitch axis; the root on springs has its dofs there already.
        let node_shear_centre = nodes
            .iter()
            .enumerate()
            .map(|(i, &r)| {
                if i == 0 && spec.root_springs.is_some() {
                    [0.0, 0.0]
                } else {
                    span.at(r).shear_centre_rotor()
                }
            })
            .collect();
        let node_chord = nodes.iter().map(|&r| span.at(r).chord).collect();
        let family_mass = mass
            .lower_entries()
            .filter(|&(i, j, _)| family(dofs[i].kind) == family(dofs[j].kind))
            .map(|(i, j, v)| (i, j, if i == j { v } else { 2.0 * v }, family(dofs[i].kind)))
            .collect();
        Ok(BeamModel {
            span,
            attachments: attachments.clone(),
            root_springs: spec.root_springs,
            rotor: rotor.clone(),
            nodes,
            node_phi,
            node_shear_centre,
            node_chord,
            dofs,
            elastic,
            spin,
            mass,
            family_mass,
        })
    }

    /// The point bodies and fluid the model carries.
    pub fn attachments(&self) -> &Attachments {
        &self.attachments
    }

    /// The root springs, `None` for a clamped root.
    pub fn root_springs(&self) -> Option<RootSprings> {
        self.root_springs
    }

    /// Number of unconstrained degrees of freedom.
    pub fn dof_count(&self) -> usize {
        self.dofs.len()
    }

    /// The unconstrained degrees of freedom in matrix order.
    pub fn dofs(&self) -> &[Dof] {
        &self.dofs
    }

    /// Radii of the mesh nodes, root to tip, m.
    pub fn node_radii(&self) -> &[f64] {
        &self.nodes
    }

    /// Chord angle (twist + pitch) at each node, rad from the plane of rotation.
    pub fn node_chord_angles(&self) -> &[f64] {
        &self.node_phi
    }

    /// Where each node's `u, v, w` are taken: the shear centre from the pitch axis, rotor frame
    /// `(eta, zeta)`, m (zero at a root on springs).
    pub(crate) fn node_shear_centres(&self) -> &[[f64; 2]] {
        &self.node_shear_centre
    }

    /// Chord at each node, m.
    pub(crate) fn node_chords(&self) -> &[f64] {
        &self.node_chord
    }

    /// The number of beam elements.
    pub fn elements(&self) -> usize {
        self.nodes.len() - 1
    }

    /// The rotor the model was built for.
    pub fn rotor(&self) -> &Rotor {
        &self.rotor
    }

    /// Radius of the clamp (first station) and of the tip, m.
    pub fn span(&self) -> (f64, f64) {
        (self.span.root(), self.span.tip())
    }

    /// The constrained stiffness (at `speed`) and mass matrices.
    pub fn system_matrices(&self, speed: RotorSpeed) -> Result<SystemMatrices, ModalError> {
        check_speed(speed)?;
        Ok(SystemMatrices {
            speed,
            stiffness: self.stiffness_at(speed),
            mass: self.mass.clone(),
            dofs: self.dofs.clone(),
        })
    }

    /// `K(Omega) = K_elastic + Omega² K_spin` at `speed`.
    pub(crate) fn stiffness_at(&self, speed: RotorSpeed) -> BandMatrix {
        let omega = speed.rad_s();
        self.elastic.plus_scaled(omega * omega, &self.spin)
    }

    /// The mass matrix.
    pub(crate) fn mass(&self) -> &BandMatrix {
        &self.mass
    }

    /// Same-family mass entries for energy shares.
    pub(crate) fn family_mass(&self) -> &[(usize, usize, f64, usize)] {
        &self.family_mass
    }
}

/// A rotor speed must be finite and not negative.
pub(crate) fn check_speed(speed: RotorSpeed) -> Result<(), ModalError> {
    if speed.is_finite() && speed >= RotorSpeed::ZERO {
        Ok(())
    } else {
        Err(ModalError::Speed { speed })
    }
}

fn check_springs(k: &RootSprings) -> Result<(), ModalError> {
    for (field, v) in
        [("axial", k.axial), ("flap", k.flap), ("edge", k.edge), ("torsion", k.torsion)]
    {
        if !(v.is_finite() && v > 0.0) {
            return Err(ModalError::RootSpring { field, value: v });
        }
    }
    Ok(())
}
