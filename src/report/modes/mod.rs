//! The modal report: natural frequencies as text, JSON and CSV, the Campbell diagram (SVG) and
//! mode shapes (the matrix export is written by `crate::output`).

mod campbell;
mod csv;
mod json;
mod text;

pub use campbell::{campbell_svg, kind_colour};
pub use csv::{campbell_csv, mode_shapes_csv};
pub use json::{modal_analysis_json, modal_json};
pub use text::{coverage_statement, crossings_table, dry_table, modal_text, model_statement};
