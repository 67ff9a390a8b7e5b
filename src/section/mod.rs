//! The thin-walled section solver: from the wall layout of one blade section to its 4x4
//! stiffness matrix, centres, principal axes and mass properties, and back from beam strains to
//! the state of every wall for ply stress recovery.
//!
//! # Method
//!
//! Closed-section theory of anisotropic thin-walled beams in the form of Berdichevsky,
//! Armanios & Badir, "Theory of anisotropic thin-walled closed-cross-section beams", Composites
//! Engineering 2 (1992) 411–432, generalised to several cells by an equal twist rate in every
//! cell, optionally with the wall bending terms of Rehfield (1985, NASA CP-2362). For isotropic
//! walls it is Bredt–Batho torsion with Euler–Bernoulli bending.
//!
//! 1. *Wall* (`wall.rs`): each laminate is reduced for a beam wall: hoop force free, hoop
//!    curvature held, span-wise and twisting curvatures set by the beam (not free to curl): the
//!    4x4 stiffness of `(N_x, N_xs, M_x, M_xs)` on `(eps_x, gamma_xs, kappa_x, kappa_xs)`.
//!    [`SectionParams::wall_curvature`] says whether the walls take the beam's curvatures
//!    through their thickness ([`WallCurvature::Beam`], the default) or are held flat at leading
//!    order ([`WallCurvature::Held`], the membrane theory).
//! 2. *Contour* (`contour.rs`): the wall midline is the outer mould line offset inward by half the
//!    local laminate thickness; where the walls of a thin trailing edge meet, the cell closes
//!    there and the rest becomes an open solid branch; webs run between the upper and lower
//!    midlines at their chordwise positions and split the wall into cells.
//! 3. *Stiffness* (`stiffness.rs`): axial, bending and wall-curvature integrals over straight
//!    elements; constant cell shear flows from warping compatibility with one twist rate;
//!    couplings from the wall's mixed coupling terms.
//! 4. *Shear flow* (`shear_flow.rs`): transverse shear flow with zero twist, and the shear centre.
//! 5. *Mass* (`mass.rs`), and *recovery* (`recovery.rs`) of wall strains from beam strains.
//!
//! # Conventions
//!
//! Chord frame and beam sign conventions as in [`SectionLayout`]'s module: generalised strains
//! `(eps, kappa_t, kappa_f, kappa_e)` with axial strain `eps + z kappa_f + y kappa_e`,
//! resultants `(N, T, M_f, M_e)`. [`SectionProperties::stiffness`] is about the elastic centre,
//! defined as the point where an axial force causes no bending curvature (with couplings this
//! differs slightly from the stiffness-weighted centroid); `GJ` and the coupling terms are
//! entries of that matrix. Wall axis 2 runs clockwise seen from the tip (towards +x): along the
//! upper surface from the leading edge to the trailing edge; on a web from the lower end up.
//!
//! # Neglected
//!
//! Warping restraint (free warping, Saint-Venant), transverse shear deformation (the 4x4 is
//! Euler–Bernoulli), cross-section distortion, the curvature of a wall in its own law (a curved
//! wall is treated as a flat laminate: relative error of order `t/(2 R)` through the thickness),
//! and the thickness of the wall in the stiffness integrals beyond the midline (webs run between
//! skin midlines). With [`WallCurvature::Held`] also the wall's own bending and twisting
//! stiffness (so no open-section torsion of the trailing-edge branches) and the strain gradient
//! through the wall thickness from the beam's curvature: terms of order `t/h` in ply stress and
//! `(t/h)²` in stiffness for symmetric walls, `t/h` in stiffness for unsymmetric ones. With
//! [`WallCurvature::Beam`] the two walls of a solid trailing edge bend each about the mean line,
//! not as one solid. The mass keeps the ply positions through the thickness.
//!
//! # Example
//!
//! ```
//! use layloft::laminate::{Laminate, LayupCode};
//! use layloft::material::Lamina;
//! use layloft::section::{SectionLayout, SectionParams, solve_section};
//! use layloft::units::Angle;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! // An aluminium tube, midline radius 50 mm, wall 2 mm (an invented test case).
//! let al = Lamina::builder("aluminium")
//!     .elastic(70e9, 70e9, 70e9 / 2.66, 0.33)
//!     .ply_thickness(2e-3)
//!     .density(2700.0)
//!     .build()?;
//! let wall = Laminate::from_code(&"[0]".parse::<LayupCode>()?, &al);
//! let n = 360;
//! let outer: Vec<[f64; 2]> = (0..n)
//!     .map(|i| {
//!         // From the leading edge (y = -R) over the top: clockwise seen from the tip.
//!         let a = std::f64::consts::PI - 2.0 * std::f64::consts::PI * i as f64 / n as f64;
//!         [0.051 * a.cos(), 0.051 * a.sin()]
//!     })
//!     .collect();
//! let layout = SectionLayout {
//!     r: 0.5,
//!     chord: 0.102,
//!     twist: Angle::ZERO,
//!     pitch_axis_frac: 0.5,
//!     segment_laminate: vec![0; n],
//!     outer,
//!     laminates: vec![wall],
//!     webs: vec![],
//! };
//! let section = solve_section(&layout, &SectionParams::default())?;
//! let ea = 2.0 * std::f64::consts::PI * 0.05 * 2e-3 * 70e9; // EA = 2 pi R t E
//! assert!((section.ea / ea - 1.0).abs() < 1e-3);
//! # Ok(())
//! # }
//! ```

mod contour;
mod error;
mod mass;
mod outline;
mod properties;
mod recovery;
mod shear_flow;
mod solve;
mod stiffness;
mod wall;
mod warning;

pub use crate::layout::{SectionLayout, WebLayout};
pub use contour::{WallElement, WallPart};
pub use error::SectionError;
pub use properties::{MassInertia, SectionProperties};
pub use recovery::WallState;
pub use solve::{SectionParams, SolvedSection, solve_section};
pub use wall::{WallCurvature, WallStiffness};
pub use warning::SectionWarning;
