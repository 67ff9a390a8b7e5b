//! Outputs: JSON, CSV, SVG plots, the HTML report and terminal tables, and the one way files are
//! written (atomically: a temporary file in the same folder, then a rename, so that a reader never
//! sees half a file and a failed run leaves what was there before).

mod table;
mod write;

pub use table::{Align, Table, fixed, sig4};
pub use write::{write_atomic, write_atomic_with};
mod laminate;

pub use laminate::LaminateReport;
mod section_svg;
mod sections;

pub use section_svg::{section_svg, section_svg_names};
pub use sections::{SectionsReport, laminate_label};
