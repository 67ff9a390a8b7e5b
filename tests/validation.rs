//! Checks against the outside world: published worked examples, handbook values and closed forms, each source named beside its assertion; and convergence studies.
//!
//! One test binary per purpose: each file named here is a module of it (see DEVELOPERS.md,
//! "Tests"). A new test file must be added to one of these lists; `laws` checks that none is left
//! out.

mod common;
mod modal_support;
mod support;
mod support_run;
mod support_stl;

#[path = "convergence_modes.rs"]
mod convergence_modes;
#[path = "convergence_sections.rs"]
mod convergence_sections;
#[path = "validation_airfoil.rs"]
mod validation_airfoil;
#[path = "validation_beam_wall.rs"]
mod validation_beam_wall;
#[path = "validation_blade_tooling.rs"]
mod validation_blade_tooling;
#[path = "validation_buckling.rs"]
mod validation_buckling;
#[path = "validation_buoyancy_build.rs"]
mod validation_buoyancy_build;
#[path = "validation_casting.rs"]
mod validation_casting;
#[path = "validation_core_prints.rs"]
mod validation_core_prints;
#[path = "validation_failure.rs"]
mod validation_failure;
#[path = "validation_laminate.rs"]
mod validation_laminate;
#[path = "validation_loads.rs"]
mod validation_loads;
#[path = "validation_modal.rs"]
mod validation_modal;
#[path = "validation_modal_attached.rs"]
mod validation_modal_attached;
#[path = "validation_module_keys.rs"]
mod validation_module_keys;
#[path = "validation_mould_keys.rs"]
mod validation_mould_keys;
#[path = "validation_mould_modules.rs"]
mod validation_mould_modules;
#[path = "validation_mould_split.rs"]
mod validation_mould_split;
#[path = "validation_outlines.rs"]
mod validation_outlines;
#[path = "validation_plybook.rs"]
mod validation_plybook;
#[path = "validation_plybook_book.rs"]
mod validation_plybook_book;
#[path = "validation_plybook_pieces.rs"]
mod validation_plybook_pieces;
#[path = "validation_print_fall.rs"]
mod validation_print_fall;
#[path = "validation_print_seats.rs"]
mod validation_print_seats;
#[path = "validation_section.rs"]
mod validation_section;
#[path = "validation_stress.rs"]
mod validation_stress;
#[path = "validation_te_change.rs"]
mod validation_te_change;
#[path = "validation_tooling.rs"]
mod validation_tooling;
