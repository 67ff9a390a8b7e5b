//! Outputs: JSON, CSV, SVG plots, the HTML report and terminal tables. Files are written through
//! the output edge (`crate::output`, re-exported here for the report's callers).

mod blade_plots;
mod buckling_map;
mod campbell;
mod document;
pub mod html;
mod laminate;
mod modal;
mod modal_text;
pub mod plot;
mod plybook;
mod section_svg;
mod sections;
mod stress;
mod stress_map;
/// The plotting kit under its first name (`report::svg`), kept for callers of the library.
pub use plot as svg;
mod table;
mod tooling;
mod warnings;

pub use crate::output::{
    FileSet, SET_LIST, SetOutcome, ensure_folder, remove_leftovers, write_atomic, write_atomic_with,
};
pub use blade_plots::{
    mass_svg, mode_shapes_svg, pitch_moment_svg, planform_svg, stiffness_svg, twist_svg,
};
pub use buckling_map::buckling_svg;
pub use campbell::{campbell_svg, kind_colour};
pub use document::{ReportBlock, ReportInputs, SectionDrawing, blade_report};
pub use html::HtmlReport;
pub use laminate::LaminateReport;
pub use modal::{campbell_csv, modal_analysis_json, modal_json, mode_shapes_csv};
pub use modal_text::{modal_text, model_statement};
pub use plybook::{plybook_block, plybook_links};
pub use section_svg::{section_svg, section_svg_names, section_svg_screen};
pub use sections::{SectionsReport, laminate_label};
pub use stress::{
    buckling_table, not_covered_text, panel_place, stress_csv, stress_json, stress_text,
};
pub use stress_map::stress_svg;
pub use table::{Align, Table, cautions_text, fixed, sig4};
pub use tooling::ToolingReport;
