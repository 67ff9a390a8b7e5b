//! The stress report: JSON, the station-by-ply CSV, the terminal summary and the maps of
//! [`crate::stress::CaseStress`] results.

mod buckling_map;
mod csv;
mod json;
mod map;
mod text;

pub use buckling_map::buckling_svg;
pub use csv::stress_csv;
pub use json::stress_json;
pub use map::stress_svg;
pub use text::{
    buckling_table, buckling_warning, critical_table, not_covered_text, panel_place,
    ply_failure_warning, stress_text,
};
