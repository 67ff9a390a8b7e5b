//! The binary as a user meets it: every command, its outputs and its messages on bad input.
//!
//! One test binary per purpose: each file named here is a module of it (see DEVELOPERS.md,
//! "Tests"). A new test file must be added to one of these lists; `laws` checks that none is left
//! out.

mod modal_support;
mod support_cli;
mod support_run;
mod support_stl;

#[path = "bad_blade_inputs.rs"]
mod bad_blade_inputs;
#[path = "cli_analysis.rs"]
mod cli_analysis;
#[path = "cli_bad_inputs.rs"]
mod cli_bad_inputs;
#[path = "cli_buckling.rs"]
mod cli_buckling;
#[path = "cli_feel.rs"]
mod cli_feel;
#[path = "cli_laminate.rs"]
mod cli_laminate;
#[path = "cli_modes_attached.rs"]
mod cli_modes_attached;
#[path = "cli_sections.rs"]
mod cli_sections;
#[path = "cli_tooling.rs"]
mod cli_tooling;
#[path = "cli_tooling_files.rs"]
mod cli_tooling_files;
#[path = "modal_report.rs"]
mod modal_report;
#[path = "mutation_gate.rs"]
mod mutation_gate;
#[path = "placed_errors.rs"]
mod placed_errors;
#[path = "snapshot_commands.rs"]
mod snapshot_commands;
