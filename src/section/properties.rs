//! What the section solver gives: the section's stiffness, centres and mass properties (it
//! takes a [`crate::layout::SectionLayout`]).
//!
//! Frame: the chord frame of docs/conventions.md. `y` along the chord from the leading edge towards the
//! trailing edge, `z` normal to the chord towards the upper surface, origin on the pitch axis,
//! metres. `x = y × z` runs along the pitch axis from root to tip.
//!
//! Beam sign conventions (used by every stage downstream):
//! - generalised strains `(eps, kappa_t, kappa_f, kappa_e)`: axial strain of the reference
//!   point, twist rate (rad/m, right-handed about +x), flapwise and edgewise curvature, defined
//!   so that the axial strain at `(y, z)` is `eps + z kappa_f + y kappa_e` (for a beam deflecting
//!   `w(x)` along `z` and `v(x)` along `y`: `kappa_f = -w''`, `kappa_e = -v''`);
//! - conjugate stress resultants `(N, T, M_f, M_e)`: axial force, torque about +x,
//!   `M_f = ∫ sigma_xx z dA` (positive puts the upper surface in tension) and
//!   `M_e = ∫ sigma_xx y dA` (positive puts the trailing edge in tension).

use nalgebra::Matrix4;

use super::warning::SectionWarning;
use crate::units::Angle;

/// Stiffness, centres and mass properties of one section.
#[derive(Debug, Clone, PartialEq)]
pub struct SectionProperties {
    /// Radius, m.
    pub r: f64,
    /// Chord, m.
    pub chord: f64,
    /// Station twist (chord angle before the pitch setting).
    pub twist: Angle,
    /// 4x4 stiffness relating `(eps, kappa_t, kappa_f, kappa_e)` to `(N, T, M_f, M_e)` about the
    /// elastic centre, chord-frame axes. Units: N, N·m, N·m²; symmetric positive definite.
    pub stiffness: Matrix4<f64>,
    /// The same stiffness referred to the pitch axis (the origin of the chord frame).
    pub stiffness_pitch_axis: Matrix4<f64>,
    /// Axial stiffness EA, N.
    pub ea: f64,
    /// Flapwise bending stiffness about the elastic centre, N·m².
    pub ei_flap: f64,
    /// Edgewise bending stiffness about the elastic centre, N·m².
    pub ei_edge: f64,
    /// Flap-edge cross term, N·m².
    pub ei_cross: f64,
    /// Torsional stiffness GJ, N·m².
    pub gj: f64,
    /// Extension–twist coupling (stiffness entry (0,1)), N·m.
    pub extension_twist: f64,
    /// Flap–twist (bend–twist) coupling (entry (1,2)), N·m².
    pub flap_twist: f64,
    /// Edge–twist coupling (entry (1,3)), N·m².
    pub edge_twist: f64,
    /// Principal bending stiffnesses (greater, lesser), N·m².
    pub ei_principal: [f64; 2],
    /// Angle from the chord-frame y axis to the principal axis of the lesser bending stiffness
    /// (the axis the section bends about most easily is turned by this angle).
    pub principal_angle: Angle,
    /// Elastic (tension) centre (y, z), m, chord frame from the pitch axis.
    pub elastic_centre: [f64; 2],
    /// Shear centre (y, z), m.
    pub shear_centre: [f64; 2],
    /// Mass centre (y, z), m.
    pub mass_centre: [f64; 2],
    /// Mass per unit length, kg/m.
    pub mass_per_length: f64,
    /// Mass moments of inertia per unit length about the mass centre, kg·m:
    /// flap `∫ rho (z - z_m)² dA`, edge `∫ rho (y - y_m)² dA`, polar (their sum), and the
    /// product `∫ rho (y - y_m)(z - z_m) dA`.
    pub inertia: MassInertia,
    /// Least and greatest wall laminate thickness, m.
    pub wall_thickness: [f64; 2],
    /// Area enclosed by the wall midline, m² (all cells).
    pub enclosed_area: f64,
    /// Where the thin-wall idealisation is strained.
    pub warnings: Vec<SectionWarning>,
}

/// Mass moments of inertia per unit length about the mass centre, kg·m.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct MassInertia {
    /// About the chordwise axis (motion normal to the chord), `∫ rho (z - z_m)² dA`.
    pub flap: f64,
    /// About the normal axis, `∫ rho (y - y_m)² dA`.
    pub edge: f64,
    /// Polar, flap + edge.
    pub polar: f64,
    /// Product `∫ rho (y - y_m)(z - z_m) dA`.
    pub product: f64,
}
