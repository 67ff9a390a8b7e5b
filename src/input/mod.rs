//! Reading and validating layloft's input files: `materials.toml`, the blade project
//! (`blade.toml`, `stations.csv`, `plies.csv`, load files) and airfoil coordinate files. The
//! reader turns the files into the records of [`crate::project`] (the domain model); only the
//! command line and the library's entry points call it. `project_reader/` holds one file per
//! group of `blade.toml` tables.
//!
//! Every error names the file, the line and the key or column, says what was expected and what
//! was found, and, for a misspelt key or name, suggests the closest valid one. Units are
//! converted to SI here, once, from the unit each key carries in its name.
//!
//! ```
//! use layloft::input::read_materials_str;
//!
//! # fn main() -> Result<(), layloft::Error> {
//! let text = r#"
//! [lamina.carbon-ud]
//! E1_GPa = 135
//! E2_GPa = 9.0
//! G12_GPa = 5.0
//! nu12 = 0.3
//! density_kg_m3 = 1550
//! ply_thickness_mm = 0.2
//! Xt_MPa = 2000
//! Xc_MPa = 1200
//! Yt_MPa = 50
//! Yc_MPa = 200
//! S12_MPa = 80
//! "#;
//! let library = read_materials_str(text, "materials.toml")?;
//! assert_eq!(library.ply_material("carbon-ud")?.e1, 135e9);
//! # Ok(())
//! # }
//! ```

mod coordinates;
mod csv_table;
mod location;
mod materials;
mod project_reader;
mod sources;
mod toml_table;

pub use crate::text::{closest, excerpt};
pub use coordinates::{read_coordinates, read_coordinates_noted};
pub use csv_table::{CsvRecord, CsvTable};
pub use location::{
    InputError, Location, MAX_INPUT_BYTES, SourceText, project_path, read_bytes, read_text,
};
pub use materials::{read_materials, read_materials_str};
pub use project_reader::{
    limits, read_project, read_project_sourced, tolerance_message, tolerance_range,
};
pub use sources::{InputWarning, ProjectFiles, Sources};
pub use toml_table::TableReader;
