//! The kit as CSV and the whole ply book as JSON (SI units in every key).

use std::fmt::Write as _;

use serde_json::json;

use super::super::book::PlyBook;

fn opt(v: Option<f64>) -> String {
    v.map(|x| format!("{x:.6}")).unwrap_or_default()
}

/// The kit as CSV: one row per pattern in lay-up order, the unit in every column name.
pub fn plybook_csv(book: &PlyBook) -> String {
    let mut s = String::from(
        "order,ply,pattern,surface,material,kind,angle_deg,r_start_m,r_end_m,chord_from,chord_to,area_m2,thickness_m,mass_kg,cost,max_shear_deg,max_shear_r_m,max_shear_along,locking_angle_deg,locks,max_fibre_deviation_deg,file_dxf,file_svg\n",
    );
    for e in &book.patterns {
        let (cf, ct) = e.chord_range.map_or((String::new(), String::new()), |c| {
            (format!("{:.4}", c[0]), format!("{:.4}", c[1]))
        });
        let _ = writeln!(
            s,
            "{},{},{},{},{},{},{:.2},{:.4},{:.4},{},{},{:.6},{:.6e},{:.6},{},{:.3},{:.4},{:.4},{:.1},{},{:.3},plies/{}.dxf,plies/{}.svg",
            e.order,
            csv_cell(&e.ply),
            e.name,
            csv_cell(&e.surface),
            csv_cell(&e.material),
            e.kind.key(),
            e.angle.deg(),
            e.r_range[0],
            e.r_range[1],
            cf,
            ct,
            e.area_m2,
            e.thickness_m,
            e.mass_kg,
            opt(e.cost),
            e.pattern.max_shear.to_degrees(),
            e.max_shear_place.r,
            e.max_shear_place.along,
            e.locking_angle.to_degrees(),
            e.locks(),
            e.pattern.max_deviation.to_degrees(),
            e.name,
            e.name
        );
    }
    s
}

fn csv_cell(s: &str) -> String {
    if s.contains([',', '"', '\n']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

/// The ply book as one JSON value (SI units in every key); `ply_lines` are the lines of the
/// plies in the plies file by index (`line` of each pattern: 0 where not given), `warnings` the
/// book's warnings in words, one per entry of [`PlyBook::warnings`].
pub fn plybook_json(
    book: &PlyBook,
    laminate_mass_kg: Option<f64>,
    ply_lines: &[usize],
    warnings: &[String],
) -> serde_json::Value {
    let patterns: Vec<_> = book
        .patterns
        .iter()
        .map(|e| {
            json!({
                "name": e.name,
                "ply": e.ply,
                "order": e.order,
                "line": ply_lines.get(e.order.wrapping_sub(1)).copied().unwrap_or(0),
                "surface": e.surface,
                "material": e.material,
                "kind": e.kind.key(),
                "angle_deg": e.angle.deg(),
                "r_start_m": e.r_range[0],
                "r_end_m": e.r_range[1],
                "chord_from": e.chord_range.map(|c| c[0]),
                "chord_to": e.chord_range.map(|c| c[1]),
                "area_m2": e.area_m2,
                "thickness_m": e.thickness_m,
                "mass_kg": e.mass_kg,
                "cost": e.cost,
                "net_spacing_m": e.pattern.spacing,
                "net_nodes": e.pattern.nodes,
                "max_shear_deg": e.pattern.max_shear.to_degrees(),
                "max_shear_at": {"r_m": e.max_shear_place.r, "along": e.max_shear_place.along},
                "locking_angle_deg": e.locking_angle.to_degrees(),
                "locks": e.locks(),
                "max_fibre_deviation_deg": e.pattern.max_deviation.to_degrees(),
                "max_fibre_deviation_at": {"r_m": e.max_deviation_place.r, "along": e.max_deviation_place.along},
                "outline_m": e.pattern.outline,
                "root_mark_m": e.pattern.root_mark,
                "files": {"dxf": format!("plies/{}.dxf", e.name), "svg": format!("plies/{}.svg", e.name)},
            })
        })
        .collect();
    let materials: Vec<_> = book
        .nestings
        .iter()
        .map(|m| {
            let n = &m.nesting;
            json!({
                "material": m.material,
                "roll_width_m": n.width,
                "gap_m": n.gap,
                "roll_length_m": n.length,
                "pattern_area_m2": n.pattern_area,
                "utilisation": n.utilisation(),
                "length_over_area_bound": n.length_over_bound(),
                "areal_mass_kg_m2": m.areal_mass,
                "scrap_kg": m.scrap_kg,
                "roll_cost": m.roll_cost,
                "placements": n.placements.iter().map(|p| json!({
                    "pattern": book.patterns[m.patterns[p.item]].name,
                    "rotation_deg": p.rotation.deg(),
                    "offset_m": p.offset,
                })).collect::<Vec<_>>(),
                "files": {"sheet": format!("sheet-{}.svg", m.material), "nesting": format!("nesting-{}.svg", m.material)},
            })
        })
        .collect();
    json!({
        "project": book.project,
        "cautions": crate::CAUTIONS,
        "units": "SI: m, m2, kg, degrees where the key says _deg; outlines in the flat cloth frame, x along the warp (fibre) direction, seen from the mould side",
        "pattern_mass_kg": book.pattern_mass_kg(),
        "laminate_mass_kg": laminate_mass_kg,
        "pattern_cost": book.pattern_cost(),
        "patterns": patterns,
        "materials": materials,
        "warnings": warnings,
        "splices": book.splices,
    })
}
