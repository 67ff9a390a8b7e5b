//! Classical laminate theory (CLT): Q and Q-bar per ply, the A, B, D matrices and their inverse,
//! membrane and flexural engineering constants, thermal resultants, and ply strains and stresses
//! at the top and bottom of every ply in laminate and material axes.
//!
//! Method: Kirchhoff plate kinematics through the thickness, plane stress in every ply
//! (Kaw, *Mechanics of Composite Materials*, 2nd ed., 2006, ch. 4; Jones, *Mechanics of
//! Composite Materials*, 2nd ed., 1999, ch. 4).
//!
//! Conventions: plies are listed from the outer face inward; laminate `z` runs along the outward
//! normal, from the midplane, so the first ply lies at the largest `z`. A positive ply angle turns
//! from the laminate x axis towards y, counter-clockwise seen from outside. Shear strains are
//! engineering strains.
//!
//! ```
//! use layloft::laminate::{Laminate, LaminateLoad, LayupCode, Resultants};
//! use layloft::material::Lamina;
//! use nalgebra::Vector3;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let tape = Lamina::builder("T300/5208")
//!     .elastic(181e9, 10.3e9, 7.17e9, 0.28)
//!     .ply_thickness(0.125e-3)
//!     .strengths(1500e6, 1500e6, 40e6, 246e6, 68e6)
//!     .build()?;
//! let laminate = Laminate::from_code(&"[0/90]s".parse::<LayupCode>()?, &tape).checked()?;
//! let load = LaminateLoad::Resultants(Resultants {
//!     n: Vector3::new(100e3, 0.0, 0.0),
//!     m: Vector3::zeros(),
//! });
//! let response = laminate.response(&load, 0.0)?;
//! // The outer 0° ply carries most of the load along the fibres.
//! assert!(response.plies[0].top.stress_12.x > response.plies[1].top.stress_12.x);
//! # Ok(())
//! # }
//! ```

mod clt;
mod code;
mod response;
mod stack;

pub use clt::{
    Abd, reduced_stiffness, strain_to_material, stress_to_material, thermal_expansion,
    transformed_stiffness,
};
pub use code::{CodePly, LayupCode};
pub use response::{Deformation, LaminateLoad, LaminateResponse, PlyState, PointState, Resultants};
pub use stack::{EngineeringConstants, Laminate, Ply};

use crate::material::MaterialError;

/// What can go wrong when building or loading a laminate.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum LaminateError {
    /// A laminate code that does not parse; `position` counts characters from 1.
    #[error("laminate code '{code}', character {position}: {message}\n  {code}\n  {marker}^", marker = " ".repeat(position.saturating_sub(1)))]
    Code {
        /// The code as written.
        code: String,
        /// 1-based character position of the fault.
        position: usize,
        /// What was expected and found.
        message: String,
    },
    /// A ply whose material is not named, with no default material.
    #[error(
        "laminate code '{code}' leaves some plies without a material: give a default material or name one per ply ('0:carbon-ud')"
    )]
    NoMaterial {
        /// The code.
        code: String,
    },
    /// A laminate without plies.
    #[error("the laminate has no plies")]
    Empty,
    /// A laminate whose [A B; B D] matrix cannot be inverted.
    #[error(
        "the laminate's stiffness matrix [A B; B D] is singular: it has no stiffness in some direction"
    )]
    Singular,
    /// A material could not be resolved.
    #[error(transparent)]
    Material(#[from] MaterialError),
}
