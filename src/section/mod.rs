//! The thin-walled section solver: from the wall layout of one blade section to its 4x4
//! stiffness matrix, centres, principal axes and mass properties.
//!
//! The solver itself is filled in by the section issue; the types below are the contract between
//! the blade module (which builds a [`SectionLayout`]) and the loads, stress and modal stages
//! (which read [`SectionProperties`]).

mod layout;

pub use layout::{MassInertia, SectionLayout, SectionProperties, WebLayout};
