//! The ply book's files: a DXF and an SVG per pattern (true scale, mm), a sheet and a nesting
//! drawing per material, the kit as CSV and the whole book as JSON. The ply book returns them as
//! (relative path, bytes); the command line and the report write them as one set.

mod dxf;
mod kit;
mod svg;

pub use dxf::pattern_dxf;
pub use kit::{plybook_csv, plybook_json};
pub use svg::{nesting_svg, pattern_svg};

use super::PlyBookError;
use super::book::{PatternEntry, PlyBook};

/// Escapes text for XML.
pub(super) fn esc(s: &str) -> String {
    s.replace('&', "&amp;").replace('<', "&lt;").replace('>', "&gt;").replace('"', "&quot;")
}

pub(super) fn centroid(p: &[[f64; 2]]) -> [f64; 2] {
    let n = p.len() as f64;
    [p.iter().map(|q| q[0]).sum::<f64>() / n, p.iter().map(|q| q[1]).sum::<f64>() / n]
}

/// The notch at the root end: a small V pointing from the root mark into the pattern, mm.
pub(super) fn notch(e: &PatternEntry) -> [[f64; 2]; 3] {
    let m = [e.pattern.root_mark[0] * 1e3, e.pattern.root_mark[1] * 1e3];
    let c = centroid(&e.pattern.outline);
    let c = [c[0] * 1e3, c[1] * 1e3];
    let (dx, dy) = (c[0] - m[0], c[1] - m[1]);
    let l = dx.hypot(dy).max(1e-9);
    let (ux, uy) = (dx / l, dy / l);
    let s = 8.0;
    [
        [m[0] - uy * s * 0.5, m[1] + ux * s * 0.5],
        [m[0] + ux * s, m[1] + uy * s],
        [m[0] + uy * s * 0.5, m[1] - ux * s * 0.5],
    ]
}

pub(super) fn label(e: &PatternEntry) -> String {
    format!(
        "{} {} | {} {:+.0}° | lay-up {} | {:.4} m²",
        e.ply,
        e.surface,
        e.material,
        e.angle.deg(),
        e.order,
        e.area_m2
    )
}

/// Every file of the ply book with its path relative to the output folder; `ply_lines` as for
/// [`plybook_json`]. `warnings` are the book's warnings in words, one per entry of
/// [`PlyBook::warnings`]: the ply book keeps them as values and the caller (the command line,
/// the report) words them.
pub fn plybook_files(
    book: &PlyBook,
    laminate_mass_kg: Option<f64>,
    ply_lines: &[usize],
    warnings: &[String],
) -> Result<Vec<(String, Vec<u8>)>, PlyBookError> {
    let mut files = Vec::new();
    for e in &book.patterns {
        files.push((format!("plies/{}.svg", e.name), pattern_svg(e).into_bytes()));
        let dxf = pattern_dxf(e)
            .map_err(|what| PlyBookError::Output { file: format!("plies/{}.dxf", e.name), what })?;
        files.push((format!("plies/{}.dxf", e.name), dxf));
    }
    for m in &book.nestings {
        files.push((format!("sheet-{}.svg", m.material), svg::sheet_svg(book, m).into_bytes()));
        files.push((format!("nesting-{}.svg", m.material), nesting_svg(book, m).into_bytes()));
    }
    files.push(("kit.csv".to_string(), plybook_csv(book).into_bytes()));
    let json = crate::text::json_pretty(plybook_json(book, laminate_mass_kg, ply_lines, warnings))
        .unwrap_or_default();
    files.push(("plybook.json".to_string(), json.into_bytes()));
    Ok(files)
}
