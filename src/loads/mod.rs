//! Load cases and the resultants they produce along the span: centrifugal tension from the mass
//! distribution, shear forces, flapwise and edgewise bending moments and the torque about the
//! pitch axis, integrated from the tip inward; root reactions for the attachment and the pitch
//! bearing, including the centrifugal twisting moment, across the pitch range.
//!
//! Method: statics of the blade cut at each radius. The loads per unit length are piecewise linear
//! in radius between the grid points (section radii, load-file radii and point masses), and the
//! integrals over each interval are taken by Simpson's rule, which is exact for the products of
//! linear distributions and lever arms that occur (cubic at most); the closed forms of a uniform
//! bar and a cantilever are therefore reproduced to rounding.
//!
//! Frames and signs. Rotor frame as in [`crate::blade`]: `X` along the pitch axis (radial), `Y`
//! in the plane of rotation (against the direction of motion at zero chord angle), `Z` along the
//! rotor axis, downstream. A mass element at `(X, Y, Z)` feels the centrifugal force
//! `dm Omega² (X, Y, 0)`. Distributed external loads act on the pitch axis: `f_flap` along `+Z`,
//! `f_edge` along `+Y`, `m_pitch` about `+X`. The resultants at a cut are the force and moment
//! that the part outboard of the cut exerts on the part inboard (the stress resultants on the
//! face whose normal is `+X`), moments about the pitch axis. In a section's chord frame
//! (turned about `X` by the chord angle `phi = twist + pitch`) they are given as beam resultants
//! `(N, T, M_f, M_e)` in the sign convention of [`crate::section`]: `M_f = M_y`, `M_e = −M_z`,
//! and shears `V_edge = F_y`, `V_flap = F_z`.
//!
//! The centrifugal twisting moment per unit length about the pitch axis is
//! `−Omega² ∫ rho Y Z dA = −Omega² [ (I_yy − I_zz) sin 2phi / 2 + I_yz cos 2phi ]` with the
//! section's mass moments about the pitch axis in its chord frame; it turns the chord towards the
//! plane of rotation (for a thin flat plate this is the classical propeller result, e.g.
//! Rosen & Friedmann, or the textbook form `M = Omega² sin(2 beta) ∫ (I_1 − I_2) dr / 2`).

mod deflection;
mod distribution;
mod integrate;
mod pitch;

pub use deflection::{TipDeflection, tip_deflection, tip_deflection_carrying};
pub use distribution::LoadDistribution;
pub use integrate::{BeamResultants, Resultant, SpanLoads, span_loads};
pub use pitch::{PitchReaction, root_reactions_over_pitch};

/// What can go wrong when building load cases.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum LoadsError {
    /// Too few sections to span the blade.
    #[error("loads need at least two sections along the span, found {0}")]
    TooFewSections(usize),
    /// Sections not in increasing radius.
    #[error("sections must be ordered root to tip: r = {r} m follows r = {previous} m")]
    Unordered {
        /// The radius out of order.
        r: f64,
        /// The radius before it.
        previous: f64,
    },
    /// A load case that the project does not have.
    #[error("no load case named '{name}'{}", hint.as_ref().map(|h| format!("; did you mean '{h}'?")).unwrap_or_else(|| format!("; the project has {}", known.join(", "))))]
    UnknownCase {
        /// The name asked for.
        name: String,
        /// The closest case name.
        hint: Option<String>,
        /// Every case name.
        known: Vec<String>,
    },
    /// A section whose stiffness cannot be inverted (for deflections).
    #[error("the section at r = {r} m has no usable stiffness")]
    SingularSection {
        /// Radius, m.
        r: f64,
    },
}

/// The load case of a project with that name, or an error with the closest name as a hint.
pub fn find_case<'a>(
    project: &'a crate::project::Project,
    name: &str,
) -> Result<&'a crate::project::LoadCaseSpec, LoadsError> {
    project.load_cases.iter().find(|c| c.name == name).ok_or_else(|| LoadsError::UnknownCase {
        name: name.to_string(),
        hint: crate::text::closest(name, project.load_cases.iter().map(|c| c.name.as_str())),
        known: project.load_cases.iter().map(|c| c.name.clone()).collect(),
    })
}
