//! Laws of the physics and the geometry as property tests, and the library's own error paths.
//!
//! One test binary per purpose: each file named here is a module of it (see DEVELOPERS.md,
//! "Tests"). A new test file must be added to one of these lists; `laws` checks that none is left
//! out.

mod common;
mod modal_support;
mod support;

#[path = "blade_geometry.rs"]
mod blade_geometry;
#[path = "mass_integration.rs"]
mod mass_integration;
#[path = "modal_laws.rs"]
mod modal_laws;
#[path = "module_flow.rs"]
mod module_flow;
#[path = "outline_files.rs"]
mod outline_files;
#[path = "property_equilibrium.rs"]
mod property_equilibrium;
#[path = "property_laminate.rs"]
mod property_laminate;
#[path = "property_nesting.rs"]
mod property_nesting;
#[path = "property_outlines.rs"]
mod property_outlines;
#[path = "property_section.rs"]
mod property_section;
#[path = "property_tooling.rs"]
mod property_tooling;
#[path = "section_errors.rs"]
mod section_errors;
#[path = "test_groups.rs"]
mod test_groups;
