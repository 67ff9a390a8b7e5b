//! Outputs: JSON, CSV, SVG plots, the HTML report and terminal tables. Files are written through
//! the output edge (`crate::output`, re-exported here for the report's callers).
//!
//! The calculations return values; this module puts them into words, numbers with units and
//! drawings. One folder per subject, with its text, JSON, CSV and SVG side by side:
//!
//! - `laminate/`: the laminate report of `layloft laminate` (ABD, engineering constants, ply
//!   stresses, first-ply failure).
//! - `sections/`: the section properties of `layloft sections` (text, JSON, CSV rows) and
//!   `sections/drawing/`, the to-scale SVG drawing of one section.
//! - `stress/`: ply stresses and buckling of `layloft stress`: JSON, CSV, text tables and the
//!   warnings, the reserve-factor map and the buckling map.
//! - `modes/`: the modal results of `layloft modes`: text, JSON, CSV, the Campbell diagram and
//!   the matrix export.
//! - `check/`: the design check of `layloft check` put into words: demand, value found, place,
//!   verdict line, the table and the JSON.
//! - `tooling/`: the tooling summary of `layloft tooling`: tables, text, JSON, the block of the
//!   HTML report and the exploded drawing of the moulds.
//! - `blade/`: the plots along the span (planform, twist, mass, stiffness, pitching moment, mode
//!   shapes).
//! - `materials.rs`: the listing of `layloft materials`.
//!
//! The kits the subjects share: `plot/` (SVG figures: axes, labels, styles), `html/` (the
//! self-contained HTML document), `table.rs` (terminal tables, the number formats and the
//! cautions); `document.rs` assembles the engineering report of `layloft report` from the
//! subjects' blocks.
mod blade;
pub mod check;
mod document;
pub mod html;
mod laminate;
mod materials;
mod modes;
pub mod plot;
mod plybook;
mod sections;
mod stress;
/// The plotting kit under its first name (`report::svg`), kept for callers of the library.
pub use plot as svg;
mod table;
mod tooling;
mod warnings;

pub use crate::output::{
    FileSet, SET_LIST, SetOutcome, ensure_folder, remove_leftovers, write_atomic, write_atomic_with,
};
pub use crate::text::json_pretty;
pub use blade::{
    mass_svg, mode_shapes_svg, pitch_moment_svg, planform_svg, stiffness_svg, twist_svg,
};
pub use document::{ReportBlock, ReportInputs, SectionDrawing, blade_report};
pub use html::HtmlReport;
pub use laminate::LaminateReport;
pub use materials::materials_text;
pub use modes::{
    campbell_csv, campbell_svg, coverage_statement, kind_colour, modal_analysis_json, modal_json,
    modal_text, mode_shapes_csv, model_statement,
};
pub use plybook::{plybook_block, plybook_error_text, plybook_links};
pub use sections::{SectionsReport, laminate_label};
pub use sections::{section_svg, section_svg_names, section_svg_screen};
pub use stress::{
    buckling_svg, buckling_table, buckling_warning, not_covered_text, panel_place,
    ply_failure_warning, stress_csv, stress_json, stress_svg, stress_text,
};
pub use table::{Align, Table, cautions_text, fixed, rpm_text, sig4};
pub use tooling::ToolingReport;
pub use warnings::plybook_warnings;
