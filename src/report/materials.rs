//! The listing of `layloft materials`: each record of a materials file with its key values.

use std::fmt::Write as _;

use crate::material::{Material, MaterialLibrary};
use crate::report::sig4;

/// One line per record (lamina: moduli to four significant digits, ply thickness, density; isotropic: modulus, Poisson's
/// ratio, density, melting range and safety note), after a first line naming the file.
pub fn materials_text(file: &str, library: &MaterialLibrary) -> String {
    let mut text = String::new();
    let _ = writeln!(text, "{file}: {} materials, all values valid", library.len());
    for m in library.iter() {
        let _ = match m {
            Material::Lamina(l) => writeln!(
                text,
                "  lamina     {:<20} E1 {:>7} GPa  E2 {:>7} GPa  G12 {:>7} GPa  t {:.3} mm  {:.0} kg/m3",
                l.name,
                sig4(l.e1 / 1e9),
                sig4(l.e2 / 1e9),
                sig4(l.g12 / 1e9),
                l.ply_thickness * 1e3,
                l.density
            ),
            Material::Isotropic(i) => writeln!(
                text,
                "  isotropic  {:<20} E {:>8} GPa  nu {:.2}  {:.0} kg/m3{}",
                i.name,
                sig4(i.e / 1e9),
                i.nu,
                i.density,
                i.melting_range
                    .map(|[s, l]| format!("  melts {:.0}..{:.0} C", s.celsius(), l.celsius()))
                    .unwrap_or_default()
            ),
        };
        if let Material::Isotropic(i) = m
            && let Some(note) = &i.safety_note
        {
            let _ = writeln!(text, "             safety: {note}");
        }
    }
    text
}
