//! `layloft materials FILE`: read and check a materials file and list its records.

use std::path::PathBuf;

use layloft::input::read_materials;

use super::{Failure, Outcome, Output};

const EXAMPLES: &str = "\
Examples:
  layloft materials layups/mine-fan/materials.toml

Exit status: 0 when every record is valid, 2 when the file is invalid.";

/// Check a materials file and list its records with their key values.
#[derive(Debug, clap::Args)]
#[command(after_help = EXAMPLES)]
pub struct Args {
    /// The materials file (TOML, `[lamina.NAME]` and `[isotropic.NAME]` tables).
    pub file: PathBuf,
}

pub fn run(args: Args, out: &Output) -> Result<Outcome, Failure> {
    let library = read_materials(&args.file).map_err(layloft::Error::from)?;
    let text = layloft::report::materials_text(&args.file.display().to_string(), &library);
    out.data(&text);
    Ok(Outcome::Success)
}
