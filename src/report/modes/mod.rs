//! The modal report: natural frequencies as text, JSON and CSV, the Campbell diagram (SVG) and
//! the matrix export.

mod campbell;
mod csv;
mod json;
mod matrices;
mod text;

pub use campbell::{campbell_svg, kind_colour};
pub use csv::{campbell_csv, mode_shapes_csv};
pub use json::{modal_analysis_json, modal_json};
pub use matrices::export_matrix_market;
pub use text::{crossings_table, dry_table, modal_text, model_statement};
