//! Section properties given directly as beam data (no section solver): for blades whose beam
//! properties are known from elsewhere, for checks against textbook beams, and for examples.

use nalgebra::Matrix4;

use crate::section::{MassInertia, SectionProperties};
use crate::units::Angle;

/// Beam properties of one section, chord frame (see `section::SectionProperties`). Builds a
/// [`SectionProperties`] with its stiffness about the elastic centre and about the pitch axis.
#[derive(Debug, Clone, PartialEq)]
pub struct BeamSection {
    /// Radius, m.
    pub r: f64,
    /// Chord, m.
    pub chord: f64,
    /// Station twist.
    pub twist: Angle,
    /// Axial stiffness EA, N.
    pub ea: f64,
    /// Torsional stiffness GJ, N·m².
    pub gj: f64,
    /// Flapwise bending stiffness about the elastic centre (curvature normal to the chord), N·m².
    pub ei_flap: f64,
    /// Edgewise bending stiffness about the elastic centre, N·m².
    pub ei_edge: f64,
    /// Flap–edge cross stiffness, N·m².
    pub ei_cross: f64,
    /// Extension–twist coupling, N·m.
    pub extension_twist: f64,
    /// Flap–twist coupling, N·m².
    pub flap_twist: f64,
    /// Edge–twist coupling, N·m².
    pub edge_twist: f64,
    /// Elastic centre (y, z) from the pitch axis, m.
    pub elastic_centre: [f64; 2],
    /// Mass per length, kg/m.
    pub mass_per_length: f64,
    /// Mass centre (y, z) from the pitch axis, m.
    pub mass_centre: [f64; 2],
    /// Mass moments of inertia per length about the mass centre, kg·m.
    pub inertia: MassInertia,
}

impl BeamSection {
    /// A section with the given stiffnesses and mass, everything centred on the pitch axis,
    /// no couplings, no rotary inertia, chord 1 m and no twist.
    pub fn uniform(r: f64, ea: f64, gj: f64, ei_flap: f64, ei_edge: f64, mass: f64) -> Self {
        BeamSection {
            r,
            chord: 1.0,
            twist: Angle::ZERO,
            ea,
            gj,
            ei_flap,
            ei_edge,
            ei_cross: 0.0,
            extension_twist: 0.0,
            flap_twist: 0.0,
            edge_twist: 0.0,
            elastic_centre: [0.0, 0.0],
            mass_per_length: mass,
            mass_centre: [0.0, 0.0],
            inertia: MassInertia::default(),
        }
    }

    /// The same section at another radius.
    pub fn at(&self, r: f64) -> Self {
        BeamSection { r, ..self.clone() }
    }

    /// The section properties, with the stiffness about the pitch axis
    /// `Tᵀ S T`, `T` taking pitch-axis strains to elastic-centre strains
    /// (`eps_c = eps + z_c kappa_f + y_c kappa_e`).
    pub fn to_section(&self) -> SectionProperties {
        let s = Matrix4::new(
            self.ea,
            self.extension_twist,
            0.0,
            0.0,
            self.extension_twist,
            self.gj,
            self.flap_twist,
            self.edge_twist,
            0.0,
            self.flap_twist,
            self.ei_flap,
            self.ei_cross,
            0.0,
            self.edge_twist,
            self.ei_cross,
            self.ei_edge,
        );
        let [yc, zc] = self.elastic_centre;
        let mut t = Matrix4::identity();
        t[(0, 2)] = zc;
        t[(0, 3)] = yc;
        let pitch = t.transpose() * s * t;
        let mean = 0.5 * (self.ei_flap + self.ei_edge);
        let half = (0.25 * (self.ei_flap - self.ei_edge).powi(2) + self.ei_cross.powi(2)).sqrt();
        let angle = 0.5 * (2.0 * self.ei_cross).atan2(self.ei_edge - self.ei_flap);
        let mut inertia = self.inertia;
        inertia.polar = inertia.flap + inertia.edge;
        SectionProperties {
            r: self.r,
            chord: self.chord,
            twist: self.twist,
            stiffness: s,
            stiffness_pitch_axis: pitch,
            ea: self.ea,
            ei_flap: self.ei_flap,
            ei_edge: self.ei_edge,
            ei_cross: self.ei_cross,
            gj: self.gj,
            extension_twist: self.extension_twist,
            flap_twist: self.flap_twist,
            edge_twist: self.edge_twist,
            ei_principal: [mean + half, mean - half],
            principal_angle: Angle::from_rad(angle),
            elastic_centre: self.elastic_centre,
            shear_centre: self.elastic_centre,
            mass_centre: self.mass_centre,
            mass_per_length: self.mass_per_length,
            inertia,
            wall_thickness: [0.0, 0.0],
            enclosed_area: 0.0,
            warnings: Vec::new(),
        }
    }
}
