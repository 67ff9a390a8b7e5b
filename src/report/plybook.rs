//! The ply book as a block of the HTML report: the kit in lay-up order (outer mould line
//! first), the rolls with their nesting figures and drawings (the same SVG as the ply book's
//! `nesting-MATERIAL.svg`, inline), the plies cut in pieces, and the draping warnings. The
//! pattern drawings are the ply book's own files, linked from the report's list of data files.

use super::document::ReportBlock;
use super::table::{Align, Table, fixed, sig4};
use crate::input::Sources;
use crate::plybook::{PlyBook, PlyBookError, nesting_svg};

/// A ply book error in the words of the project's files: the plies file and the ply's line, or
/// the materials file that gives a roll's width (`sources` from the reader).
pub fn plybook_error_text(e: &PlyBookError, sources: &Sources) -> String {
    let plies = &sources.files.plies;
    match e {
        PlyBookError::ZeroArea { ply_index, ply, key, found } => format!(
            "{plies} line {}, ply '{ply}': the region has no area ({key}: {found})",
            sources.ply_line(*ply_index)
        ),
        PlyBookError::Drape { ply_index, ply, pattern, what } => format!(
            "{plies} line {}, ply '{ply}' ({pattern}): the cloth cannot be draped over the \
             region: {what}",
            sources.ply_line(*ply_index)
        ),
        PlyBookError::RollTooNarrow { ply, pattern, material, least_mm, roll_mm } => format!(
            "ply '{ply}' ({pattern}): the pattern is {least_mm:.0} mm wide at its narrowest \
             allowed turn, wider than the roll of '{material}' (roll_width_mm = {roll_mm:.0} in \
             {}); give a wider roll or split the ply",
            sources.files.materials
        ),
        other => other.to_string(),
    }
}

/// The ply book as a report block; `laminate_kg` is the laminate mass from the sections;
/// `sources` place the regions that could not be draped in the plies file.
pub fn plybook_block(book: &PlyBook, laminate_kg: Option<f64>, sources: &Sources) -> ReportBlock {
    let mut block = ReportBlock::default();
    block.paragraphs.push(
        "Every ply region draped over its own level of the mould by a pin-jointed net \
         (Mack & Taylor, 1956) from its centroid along its fibre direction, flattened, and \
         nested on its material's roll (bottom-left fill, 180° turns always, 90° turns for \
         balanced fabrics and sheets). The patterns are true scale in millimetres, seen from \
         the mould side, with a notch at the root end."
            .to_string(),
    );
    let has_cost = book.patterns.iter().any(|p| p.cost.is_some());
    let mut headers = vec![
        ("order", Align::Right),
        ("pattern", Align::Left),
        ("material", Align::Left),
        ("angle (°)", Align::Right),
        ("r from (m)", Align::Right),
        ("r to (m)", Align::Right),
        ("area (m²)", Align::Right),
        ("mass (kg)", Align::Right),
        ("greatest shear (°)", Align::Right),
    ];
    if has_cost {
        headers.push(("cost", Align::Right));
    }
    let mut kit = Table::new(&headers);
    for e in &book.patterns {
        let mut row = vec![
            e.order.to_string(),
            e.name.clone(),
            e.material.clone(),
            fixed(e.angle.deg(), 1),
            fixed(e.r_range[0], 3),
            fixed(e.r_range[1], 3),
            sig4(e.area_m2),
            sig4(e.mass_kg),
            format!(
                "{}{}",
                fixed(e.pattern.max_shear.to_degrees(), 1),
                if e.locks() { " (past locking)" } else { "" }
            ),
        ];
        if has_cost {
            row.push(e.cost.map(|c| fixed(c, 2)).unwrap_or_default());
        }
        kit.row(row);
    }
    block.tables.push((
        "The kit in lay-up order, outer mould line first (order = the ply's place in the schedule).".into(),
        kit,
    ));
    let mut rolls = Table::new(&[
        ("material", Align::Left),
        ("roll width (mm)", Align::Right),
        ("roll length (m)", Align::Right),
        ("utilisation (%)", Align::Right),
        ("length / area bound", Align::Right),
        ("scrap (kg)", Align::Right),
        ("roll cost", Align::Right),
    ]);
    for m in &book.nestings {
        let n = &m.nesting;
        rolls.row(vec![
            m.material.clone(),
            fixed(n.width * 1e3, 0),
            fixed(n.length, 3),
            fixed(100.0 * n.utilisation(), 1),
            fixed(n.length_over_bound(), 2),
            sig4(m.scrap_kg),
            m.roll_cost.map(|c| fixed(c, 2)).unwrap_or_default(),
        ]);
    }
    block.tables.push((
        "The rolls: length used, pattern area over roll area, length over the area bound (total pattern area over the width), scrap.".into(),
        rolls,
    ));
    for m in &book.nestings {
        block.figures.push((
            format!("plybook-nesting-{}", m.material),
            format!(
                "Nesting of {} on its roll, {:.0} mm wide: the patterns as cut, labelled, warp along the roll (true scale, mm).",
                m.material,
                m.nesting.width * 1e3
            ),
            nesting_svg(book, m),
        ));
    }
    for s in &book.splices {
        block.paragraphs.push(format!("Cut in pieces: {s}."));
    }
    let mass = book.pattern_mass_kg();
    block.paragraphs.push(match laminate_kg {
        Some(l) => format!(
            "Patterns {} kg in all; the sections give {} kg of laminate. Patterns left out (below) are not counted.",
            sig4(mass),
            sig4(l)
        ),
        None => format!("Patterns {} kg in all.", sig4(mass)),
    });
    if let Some(c) = book.pattern_cost() {
        block
            .paragraphs
            .push(format!("Cost of the patterns: {} (unit of cost_per_kg).", fixed(c, 2)));
    }
    block.warnings.extend(super::warnings::plybook_warnings(book));
    block.warnings.extend(book.failed.iter().map(|e| plybook_error_text(e, sources)));
    block.notes.push(
        "A woven or stitched fabric shearing past its locking angle (locking_angle_deg, 40° by default) will wrinkle there: split the ply or add darts. A draped net is a model of the cloth, not the cloth: confirm by a trial lay-up."
            .into(),
    );
    block
}

/// The ply book's files as (path, label) for the report's list, under `folder`.
pub fn plybook_links(book: &PlyBook, folder: &str) -> Vec<(String, String)> {
    let mut out = vec![
        (format!("{folder}/kit.csv"), "the ply-book kit in lay-up order (CSV)".to_string()),
        (format!("{folder}/plybook.json"), "the ply book (JSON)".to_string()),
    ];
    for m in &book.nestings {
        out.push((
            format!("{folder}/nesting-{}.svg", m.material),
            format!("nesting of {} on its roll (SVG, true scale)", m.material),
        ));
    }
    for e in &book.patterns {
        out.push((format!("{folder}/plies/{}.svg", e.name), format!("pattern {} (SVG)", e.name)));
        out.push((format!("{folder}/plies/{}.dxf", e.name), format!("pattern {} (DXF)", e.name)));
    }
    out
}
