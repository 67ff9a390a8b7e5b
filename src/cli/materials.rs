//! `layloft materials FILE`: read and check a materials file and list its records.

use std::fmt::Write as _;
use std::path::PathBuf;

use layloft::input::read_materials;
use layloft::material::Material;

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
    let mut text = String::new();
    let _ =
        writeln!(text, "{}: {} materials, all values valid", args.file.display(), library.len());
    for m in library.iter() {
        let _ = match m {
            Material::Lamina(l) => writeln!(
                text,
                "  lamina     {:<20} E1 {:>7.1} GPa  E2 {:>6.2} GPa  G12 {:>5.2} GPa  t {:.3} mm  {:.0} kg/m3",
                l.name,
                l.e1 / 1e9,
                l.e2 / 1e9,
                l.g12 / 1e9,
                l.ply_thickness * 1e3,
                l.density
            ),
            Material::Isotropic(i) => writeln!(
                text,
                "  isotropic  {:<20} E {:>8.2} GPa  nu {:.2}  {:.0} kg/m3{}",
                i.name,
                i.e / 1e9,
                i.nu,
                i.density,
                i.melting_range_c
                    .map(|[s, l]| format!("  melts {s:.0}..{l:.0} C"))
                    .unwrap_or_default()
            ),
        };
        if let Material::Isotropic(i) = m {
            if let Some(note) = &i.safety_note {
                let _ = writeln!(text, "             safety: {note}");
            }
        }
    }
    out.data(&text);
    Ok(Outcome::Success)
}
