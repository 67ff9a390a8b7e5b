//! Modes at one speed: frequencies, shapes at the nodes, kinetic energy shares and the kind.
//!
//! Energy shares are kinetic energy shares by family of degrees of freedom in the rotor frame:
//! out of the plane of rotation (`w`, `w'`: flap), in it (`v`, `v'`: edge), twist (`theta`) and
//! radial (`u`: axial). Each share is `x_fᵀ M_ff x_f` over the sum of the four, with `M_ff` the
//! diagonal block of the mass matrix of family `f` (the coupling blocks from mass offsets are left
//! out, so the shares are non-negative and add up to one). A mode whose largest share reaches
//! [`DOMINANT_SHARE`] is of that kind; otherwise it is mixed.

use nalgebra::DVector;
use serde::Serialize;

use super::ModalError;
use super::assemble::{BeamModel, DofKind, check_speed};
use super::solve::{LanczosParams, solve_lowest};
use crate::units::RotorSpeed;

/// The least kinetic energy share for a mode to be named after one family (common practice for
/// automatic mode labels; 0.6 keeps strongly coupled modes "mixed").
pub const DOMINANT_SHARE: f64 = 0.6;

/// What kind of motion dominates a mode.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum ModeKind {
    /// Bending out of the plane of rotation.
    Flap,
    /// Bending in the plane of rotation (lead–lag).
    Edge,
    /// Twist about the pitch axis.
    Torsion,
    /// Radial extension.
    Axial,
    /// No family reaches [`DOMINANT_SHARE`].
    Mixed,
}

impl ModeKind {
    /// Lower-case name: `flap`, `edge`, `torsion`, `axial`, `mixed`.
    pub fn name(self) -> &'static str {
        match self {
            ModeKind::Flap => "flap",
            ModeKind::Edge => "edge",
            ModeKind::Torsion => "torsion",
            ModeKind::Axial => "axial",
            ModeKind::Mixed => "mixed",
        }
    }
}

/// Kinetic energy shares of a mode by family (rotor frame); they add up to one.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
pub struct EnergyShares {
    /// Out of the plane of rotation.
    pub flap: f64,
    /// In the plane of rotation.
    pub edge: f64,
    /// Twist.
    pub torsion: f64,
    /// Radial.
    pub axial: f64,
}

impl EnergyShares {
    /// The kind these shares make.
    pub fn kind(&self) -> ModeKind {
        let all = [
            (self.flap, ModeKind::Flap),
            (self.edge, ModeKind::Edge),
            (self.torsion, ModeKind::Torsion),
            (self.axial, ModeKind::Axial),
        ];
        let (share, kind) =
            all.into_iter().fold((f64::MIN, ModeKind::Mixed), |a, b| if b.0 > a.0 { b } else { a });
        if share >= DOMINANT_SHARE { kind } else { ModeKind::Mixed }
    }
}

/// A mode shape at the mesh nodes, rotor frame, root to tip. Scaled so that the largest of the
/// translations and of the twist times the half chord is 1 m; the sign makes the largest entry
/// positive.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct ModeShape {
    /// Node radii, m.
    pub r: Vec<f64>,
    /// Radial displacement `u`, m.
    pub axial: Vec<f64>,
    /// Displacement in the plane of rotation `v`, m.
    pub in_plane: Vec<f64>,
    /// Displacement out of the plane of rotation `w`, m.
    pub out_of_plane: Vec<f64>,
    /// Twist about the pitch axis, rad.
    pub twist: Vec<f64>,
}

/// One mode at one speed.
#[derive(Debug, Clone)]
pub struct Mode {
    /// Natural frequency, Hz.
    pub frequency_hz: f64,
    /// Kind by the largest energy share.
    pub kind: ModeKind,
    /// Kinetic energy shares.
    pub shares: EnergyShares,
    /// Shape at the nodes.
    pub shape: ModeShape,
    /// Track (curve of the Campbell diagram) the mode belongs to; `None` outside a sweep.
    pub track: Option<usize>,
    /// Eigenvector over the unconstrained degrees of freedom, `xᵀ M x = 1`.
    pub vector: DVector<f64>,
}

/// The lowest modes at one speed, lowest first.
#[derive(Debug, Clone)]
pub struct ModeSet {
    /// Rotor speed.
    pub speed: RotorSpeed,
    /// Modes, by increasing frequency.
    pub modes: Vec<Mode>,
}

impl BeamModel {
    /// The `count` lowest modes at `speed`.
    pub fn modes(&self, speed: RotorSpeed, count: usize) -> Result<ModeSet, ModalError> {
        check_speed(speed)?;
        if count == 0 || count > self.dof_count() {
            return Err(ModalError::TooManyModes { asked: count, dofs: self.dof_count() });
        }
        let k = self.stiffness_at(speed);
        let solution = solve_lowest(&k, self.mass(), count, &LanczosParams::default())
            .map_err(|source| ModalError::Eigen { speed, source })?;
        let modes = solution
            .eigenvalues
            .iter()
            .enumerate()
            .map(|(i, &lambda)| {
                let vector = solution.vectors.column(i).into_owned();
                let shares = energy_shares(self, &vector);
                Mode {
                    frequency_hz: lambda.max(0.0).sqrt() / (2.0 * std::f64::consts::PI),
                    kind: shares.kind(),
                    shares,
                    shape: shape(self, &vector),
                    track: None,
                    vector,
                }
            })
            .collect();
        Ok(ModeSet { speed, modes })
    }
}

/// Kinetic energy shares of `x` by family, from the diagonal blocks of the mass matrix.
fn energy_shares(model: &BeamModel, x: &DVector<f64>) -> EnergyShares {
    let mut e = [0.0; 4];
    for &(i, j, v, family) in model.family_mass() {
        e[family] += v * x[i] * x[j];
    }
    let e = e.map(|v: f64| v.max(0.0));
    let total: f64 = e.iter().sum();
    let total = if total > 0.0 { total } else { 1.0 };
    EnergyShares {
        flap: e[0] / total,
        edge: e[1] / total,
        torsion: e[2] / total,
        axial: e[3] / total,
    }
}

/// The node values of `x`, scaled as [`ModeShape`] says.
fn shape(model: &BeamModel, x: &DVector<f64>) -> ModeShape {
    let nodes = model.node_radii();
    let n = nodes.len();
    let mut s = ModeShape {
        r: nodes.to_vec(),
        axial: vec![0.0; n],
        in_plane: vec![0.0; n],
        out_of_plane: vec![0.0; n],
        twist: vec![0.0; n],
    };
    let (mut in_slope, mut out_slope) = (vec![0.0; n], vec![0.0; n]);
    for (i, d) in model.dofs().iter().enumerate() {
        let Some(node) = d.node else { continue };
        match d.kind {
            DofKind::Axial => s.axial[node] = x[i],
            DofKind::InPlane => s.in_plane[node] = x[i],
            DofKind::OutOfPlane => s.out_of_plane[node] = x[i],
            DofKind::Twist => s.twist[node] = x[i],
            DofKind::InPlaneSlope => in_slope[node] = x[i],
            DofKind::OutOfPlaneSlope => out_slope[node] = x[i],
        }
    }
    // The dofs are the shear centre's (see `element.rs`); the shape is the pitch axis's.
    for (i, &[eta_s, zeta_s]) in model.node_shear_centres().iter().enumerate() {
        let twist = s.twist[i];
        s.axial[i] += eta_s * in_slope[i] + zeta_s * out_slope[i];
        s.in_plane[i] += zeta_s * twist;
        s.out_of_plane[i] -= eta_s * twist;
    }
    let chords = model.node_chords();
    let mut largest = 0.0_f64;
    let mut signed = 0.0;
    for (i, chord) in chords.iter().enumerate().take(n) {
        for v in [s.axial[i], s.in_plane[i], s.out_of_plane[i], s.twist[i] * 0.5 * chord] {
            if v.abs() > largest {
                largest = v.abs();
                signed = v;
            }
        }
    }
    if largest > 0.0 {
        let f = 1.0 / signed;
        for v in [&mut s.axial, &mut s.in_plane, &mut s.out_of_plane, &mut s.twist] {
            v.iter_mut().for_each(|x| *x *= f);
        }
    }
    s
}
