//! Root reactions across the pitch range: what the attachment and the pitch bearing carry, and
//! the pitching moment that sizes the pitch actuator.

use super::LoadsError;
use super::distribution::LoadDistribution;
use super::integrate::span_loads;
use crate::project::{LoadCaseSpec, PointMass, Rotor};
use crate::section::SectionProperties;
use crate::units::Angle;

/// Root reactions of one load case at one pitch setting, rotor frame.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PitchReaction {
    /// Pitch setting.
    pub pitch: Angle,
    /// Radial (centrifugal) force, N.
    pub radial_force: f64,
    /// In-plane shear force (Y), N.
    pub shear_in_plane: f64,
    /// Out-of-plane shear force (Z), N.
    pub shear_out_of_plane: f64,
    /// Flapwise bending moment (about Y), N·m.
    pub flap_moment: f64,
    /// Edgewise bending moment (about Z), N·m.
    pub edge_moment: f64,
    /// Pitching moment about the pitch axis, N·m: all loads.
    pub pitch_moment: f64,
    /// The part of the pitching moment due to rotation alone (centrifugal twisting moment,
    /// including the centrifugal force on offset masses), N·m.
    pub centrifugal_twisting_moment: f64,
}

/// Root reactions of `case` at `steps` pitch settings evenly spaced over the rotor's pitch range
/// (one setting when the range is a single angle).
pub fn root_reactions_over_pitch(
    sections: &[SectionProperties],
    rotor: &Rotor,
    point_masses: &[PointMass],
    case: &LoadCaseSpec,
    steps: usize,
) -> Result<Vec<PitchReaction>, LoadsError> {
    let (lo, hi) = (rotor.pitch_range.0.deg(), rotor.pitch_range.1.deg());
    let n = if hi > lo { steps.max(2) } else { 1 };
    let spin_only = LoadCaseSpec { distributed: Vec::new(), gravity: None, ..case.clone() };
    (0..n)
        .map(|i| {
            let deg = if n == 1 { lo } else { lo + (hi - lo) * i as f64 / (n - 1) as f64 };
            let pitch = Angle::from_deg(deg);
            let all =
                span_loads(&LoadDistribution::new(sections, point_masses, case, pitch)?).root();
            let spin =
                span_loads(&LoadDistribution::new(sections, point_masses, &spin_only, pitch)?)
                    .root();
            Ok(PitchReaction {
                pitch,
                radial_force: all.force[0],
                shear_in_plane: all.force[1],
                shear_out_of_plane: all.force[2],
                flap_moment: all.moment[1],
                edge_moment: all.moment[2],
                pitch_moment: all.moment[0],
                centrifugal_twisting_moment: spin.moment[0],
            })
        })
        .collect()
}
