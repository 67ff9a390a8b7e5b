//! Outputs: JSON, CSV, SVG plots, the HTML report and terminal tables, and the one way files are
//! written (atomically: a temporary file in the same folder, then a rename, so that a reader never
//! sees half a file and a failed run leaves what was there before).

pub mod html;
mod table;
mod tooling;
mod write;

pub use html::HtmlReport;
pub use table::{Align, Table, fixed, sig4};
pub use tooling::ToolingReport;
pub use write::{write_atomic, write_atomic_with};
mod laminate;

pub use laminate::LaminateReport;
