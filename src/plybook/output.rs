//! The ply book's files: a DXF and an SVG per pattern (true scale, mm), a sheet and a nesting
//! drawing per material, the kit as CSV and the whole book as JSON, written as one set.

use std::fmt::Write as _;
use std::path::Path;

use serde_json::json;

use super::book::{MaterialNesting, PatternEntry, PlyBook};
use super::nest::bbox;
use crate::Error;

/// Escapes text for XML.
fn esc(s: &str) -> String {
    s.replace('&', "&amp;").replace('<', "&lt;").replace('>', "&gt;").replace('"', "&quot;")
}

fn centroid(p: &[[f64; 2]]) -> [f64; 2] {
    let n = p.len() as f64;
    [p.iter().map(|q| q[0]).sum::<f64>() / n, p.iter().map(|q| q[1]).sum::<f64>() / n]
}

/// The notch at the root end: a small V pointing from the root mark into the pattern, mm.
fn notch(e: &PatternEntry) -> [[f64; 2]; 3] {
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

fn label(e: &PatternEntry) -> String {
    format!(
        "{} {} | {} {:+.0}° | lay-up {} | {:.4} m²",
        e.ply, e.surface, e.material, e.angle_deg, e.order, e.area_m2
    )
}

/// Draws one pattern into an SVG group at an offset (mm, y up in pattern coordinates, flipped
/// by the caller's transform).
fn pattern_group(
    e: &PatternEntry,
    outline_mm: &[[f64; 2]],
    notch_mm: Option<[[f64; 2]; 3]>,
    out: &mut String,
) {
    let pts: Vec<String> = outline_mm.iter().map(|q| format!("{:.2},{:.2}", q[0], q[1])).collect();
    let _ = write!(
        out,
        r##"<polygon points="{}" fill="#e8eef6" stroke="#1f3b63" stroke-width="0.6"/>"##,
        pts.join(" ")
    );
    if let Some(n) = notch_mm {
        let _ = write!(
            out,
            r##"<polyline points="{:.2},{:.2} {:.2},{:.2} {:.2},{:.2}" fill="none" stroke="#b3261e" stroke-width="0.8"/>"##,
            n[0][0], n[0][1], n[1][0], n[1][1], n[2][0], n[2][1]
        );
    }
    let _ = e;
}

/// One pattern as SVG, true scale (1 user unit = 1 mm): outline, fibre arrow along the warp,
/// label, notch at the root end.
pub fn pattern_svg(e: &PatternEntry) -> String {
    let outline: Vec<[f64; 2]> =
        e.pattern.outline.iter().map(|q| [q[0] * 1e3, q[1] * 1e3]).collect();
    let (lo, hi) = bbox(&outline);
    let margin = 20.0;
    let text_h = 30.0;
    let (w, h) = (hi[0] - lo[0] + 2.0 * margin, hi[1] - lo[1] + 2.0 * margin + text_h);
    let mut s = String::new();
    let _ = write!(
        s,
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="{w:.1}mm" height="{h:.1}mm" viewBox="0 0 {w:.2} {h:.2}">"##
    );
    let _ = write!(s, "<title>{}</title>", esc(&label(e)));
    // Pattern coordinates (y up) into the drawing (y down).
    let _ = write!(
        s,
        r#"<g transform="translate({:.2},{:.2}) scale(1,-1)">"#,
        margin - lo[0],
        hi[1] + margin
    );
    pattern_group(e, &outline, Some(notch(e)), &mut s);
    // Fibre arrow along the warp (+x) through the centroid.
    let c = centroid(&outline);
    let len = ((hi[0] - lo[0]) * 0.3).clamp(20.0, 200.0);
    let _ = write!(
        s,
        r##"<line x1="{:.2}" y1="{:.2}" x2="{:.2}" y2="{:.2}" stroke="#1b7a3a" stroke-width="1"/><polygon points="{:.2},{:.2} {:.2},{:.2} {:.2},{:.2}" fill="#1b7a3a"/>"##,
        c[0] - 0.5 * len,
        c[1],
        c[0] + 0.5 * len,
        c[1],
        c[0] + 0.5 * len,
        c[1],
        c[0] + 0.5 * len - 6.0,
        c[1] + 2.5,
        c[0] + 0.5 * len - 6.0,
        c[1] - 2.5
    );
    s.push_str("</g>");
    let _ = write!(
        s,
        r##"<text x="{margin:.1}" y="{:.1}" font-family="sans-serif" font-size="7" fill="#111">{}</text>"##,
        h - 0.5 * text_h,
        esc(&label(e))
    );
    let _ = write!(
        s,
        r##"<text x="{margin:.1}" y="{:.1}" font-family="sans-serif" font-size="5" fill="#555">fibre (warp) along the green arrow; red notch: root end; true scale, mm; seen from the mould side</text>"##,
        h - 0.5 * text_h + 9.0
    );
    s.push_str("</svg>\n");
    s
}

/// The header's dates and ids, which the `dxf` crate takes from the clock and a random source,
/// set to fixed values so that the same ply book gives the same bytes (outputs are compared by
/// checksum, and a report set must be reproducible). The local dates are given as local wall
/// time, so they do not depend on the machine's time zone.
fn fixed_header(h: &mut dxf::Header) {
    use chrono::{Local, NaiveDate, TimeZone, Utc};
    if let Some(noon) = NaiveDate::from_ymd_opt(2000, 1, 1).and_then(|d| d.and_hms_opt(12, 0, 0)) {
        if let Some(local) = Local.from_local_datetime(&noon).earliest() {
            h.creation_date = local;
            h.update_date = local;
        }
        let utc = Utc.from_utc_datetime(&noon);
        h.creation_date_universal = utc;
        h.update_date_universal = utc;
    }
    h.fingerprint_guid = uuid::Uuid::nil();
    h.version_guid = uuid::Uuid::nil();
}

/// One pattern as DXF (R2000, millimetres): layer `OUTLINE` the closed outline, `FIBRE` the
/// fibre direction line, `NOTCH` the root notch, `LABEL` the label.
pub fn pattern_dxf(e: &PatternEntry) -> Result<Vec<u8>, String> {
    use dxf::entities::{Entity, EntityType, Line, LwPolyline, Text};
    use dxf::{Drawing, LwPolylineVertex, Point};
    let mut d = Drawing::new();
    d.header.version = dxf::enums::AcadVersion::R2000;
    d.header.default_drawing_units = dxf::enums::Units::Millimeters;
    fixed_header(&mut d.header);
    let outline: Vec<[f64; 2]> =
        e.pattern.outline.iter().map(|q| [q[0] * 1e3, q[1] * 1e3]).collect();
    let mut poly = LwPolyline::default();
    poly.vertices = outline
        .iter()
        .map(|q| LwPolylineVertex { x: q[0], y: q[1], ..Default::default() })
        .collect();
    poly.set_is_closed(true);
    let mut ent = Entity::new(EntityType::LwPolyline(poly));
    ent.common.layer = "OUTLINE".to_string();
    d.add_entity(ent);
    let (lo, hi) = bbox(&outline);
    let c = centroid(&outline);
    let len = ((hi[0] - lo[0]) * 0.3).clamp(20.0, 200.0);
    let mut ent = Entity::new(EntityType::Line(Line::new(
        Point::new(c[0] - 0.5 * len, c[1], 0.0),
        Point::new(c[0] + 0.5 * len, c[1], 0.0),
    )));
    ent.common.layer = "FIBRE".to_string();
    d.add_entity(ent);
    let n = notch(e);
    let mut notch_poly = LwPolyline::default();
    notch_poly.vertices =
        n.iter().map(|q| LwPolylineVertex { x: q[0], y: q[1], ..Default::default() }).collect();
    let mut ent = Entity::new(EntityType::LwPolyline(notch_poly));
    ent.common.layer = "NOTCH".to_string();
    d.add_entity(ent);
    let mut text = Text::default();
    text.location = Point::new(lo[0], lo[1] - 12.0, 0.0);
    text.text_height = 6.0;
    text.value = label(e).replace('²', "2").replace('°', " deg");
    let mut ent = Entity::new(EntityType::Text(text));
    ent.common.layer = "LABEL".to_string();
    d.add_entity(ent);
    let mut buf = Vec::new();
    d.save(&mut buf).map_err(|err| err.to_string())?;
    Ok(buf)
}

/// All patterns of one material stacked on one sheet, true scale, mm.
fn sheet_svg(book: &PlyBook, m: &MaterialNesting) -> String {
    let gap = 30.0;
    let mut y = gap;
    let mut width: f64 = 0.0;
    let mut body = String::new();
    for &k in &m.patterns {
        let e = &book.patterns[k];
        let outline: Vec<[f64; 2]> =
            e.pattern.outline.iter().map(|q| [q[0] * 1e3, q[1] * 1e3]).collect();
        let (lo, hi) = bbox(&outline);
        width = width.max(hi[0] - lo[0]);
        let _ = write!(
            body,
            r#"<g transform="translate({:.2},{:.2}) scale(1,-1)">"#,
            gap - lo[0],
            y + hi[1]
        );
        pattern_group(e, &outline, Some(notch(e)), &mut body);
        body.push_str("</g>");
        y += hi[1] - lo[1] + 8.0;
        let _ = write!(
            body,
            r##"<text x="{gap:.1}" y="{:.1}" font-family="sans-serif" font-size="7" fill="#111">{}</text>"##,
            y + 4.0,
            esc(&label(e))
        );
        y += gap;
    }
    let (w, h) = (width + 2.0 * gap, y);
    format!(
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="{w:.1}mm" height="{h:.1}mm" viewBox="0 0 {w:.2} {h:.2}"><title>{} patterns</title>{body}</svg>
"##,
        esc(&m.material)
    )
}

/// The nesting of one material on its roll, true scale, mm (roll length to the right).
pub fn nesting_svg(book: &PlyBook, m: &MaterialNesting) -> String {
    let n = &m.nesting;
    let (len, wid) = (n.length.max(0.01) * 1e3, n.width * 1e3);
    let margin = 20.0;
    let caption = format!(
        "{}: roll {:.0} mm wide, {:.3} m used, utilisation {:.1} %, {:.2} times the area bound; \
         warp along the roll; true scale, mm",
        m.material,
        wid,
        n.length,
        100.0 * n.utilisation(),
        n.length_over_bound()
    );
    // The drawing is at least as wide as its caption (10-unit sans-serif, at most about 0.62 of
    // the size per character), so that a short roll's caption stays inside the figure; the
    // blank space added keeps the true scale.
    let caption_width = 0.62 * 10.0 * caption.chars().count() as f64;
    let (w, h) =
        ((len + 2.0 * margin).max(caption_width + 2.0 * margin), wid + 2.0 * margin + 30.0);
    let mut s = format!(
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="{w:.1}mm" height="{h:.1}mm" viewBox="0 0 {w:.2} {h:.2}"><title>{} nesting</title>"##,
        esc(&m.material)
    );
    let _ = write!(
        s,
        r##"<g transform="translate({margin:.2},{:.2}) scale(1,-1)"><rect x="0" y="0" width="{len:.2}" height="{wid:.2}" fill="#fbf7ee" stroke="#7a6a3a" stroke-width="0.8"/>"##,
        margin + wid
    );
    for p in &n.placements {
        let e = &book.patterns[m.patterns[p.item]];
        let outline: Vec<[f64; 2]> = p.outline.iter().map(|q| [q[0] * 1e3, q[1] * 1e3]).collect();
        pattern_group(e, &outline, None, &mut s);
    }
    s.push_str("</g>");
    for p in &n.placements {
        let e = &book.patterns[m.patterns[p.item]];
        let c = centroid(&p.outline);
        let _ = write!(
            s,
            r##"<text x="{:.1}" y="{:.1}" font-family="sans-serif" font-size="9" text-anchor="middle" fill="#111">{}</text>"##,
            margin + c[0] * 1e3,
            margin + wid - c[1] * 1e3,
            esc(&e.name)
        );
    }
    let _ = write!(
        s,
        r##"<text x="{margin:.1}" y="{:.1}" font-family="sans-serif" font-size="10" fill="#111">{}</text></svg>
"##,
        h - 10.0,
        esc(&caption)
    );
    s
}

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
            e.angle_deg,
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

/// The ply book as one JSON value (SI units in every key).
pub fn plybook_json(book: &PlyBook, laminate_mass_kg: Option<f64>) -> serde_json::Value {
    let patterns: Vec<_> = book
        .patterns
        .iter()
        .map(|e| {
            json!({
                "name": e.name,
                "ply": e.ply,
                "order": e.order,
                "line": e.line,
                "surface": e.surface,
                "material": e.material,
                "kind": e.kind.key(),
                "angle_deg": e.angle_deg,
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
                    "rotation_deg": p.rotation_deg,
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
        "warnings": book.warnings,
        "splices": book.splices,
    })
}

/// Every file of the ply book with its path relative to the output folder.
pub fn plybook_files(
    book: &PlyBook,
    laminate_mass_kg: Option<f64>,
) -> Result<Vec<(String, Vec<u8>)>, Error> {
    let mut files = Vec::new();
    for e in &book.patterns {
        files.push((format!("plies/{}.svg", e.name), pattern_svg(e).into_bytes()));
        let dxf = pattern_dxf(e).map_err(|m| Error::Write {
            path: format!("plies/{}.dxf", e.name),
            source: std::io::Error::other(m),
        })?;
        files.push((format!("plies/{}.dxf", e.name), dxf));
    }
    for m in &book.nestings {
        files.push((format!("sheet-{}.svg", m.material), sheet_svg(book, m).into_bytes()));
        files.push((format!("nesting-{}.svg", m.material), nesting_svg(book, m).into_bytes()));
    }
    files.push(("kit.csv".to_string(), plybook_csv(book).into_bytes()));
    let json =
        serde_json::to_string_pretty(&plybook_json(book, laminate_mass_kg)).unwrap_or_default();
    files.push(("plybook.json".to_string(), json.into_bytes()));
    Ok(files)
}

/// Writes the set into `dir` as one: every file goes first into a fresh folder beside `dir`,
/// which then replaces `dir` when `dir` does not exist, or whose files are renamed into `dir`
/// (each rename atomic) when it does. A failure while writing leaves `dir` as it was.
pub fn write_files(dir: &Path, files: &[(String, Vec<u8>)]) -> Result<(), Error> {
    let err =
        |p: &Path, source: std::io::Error| Error::Write { path: p.display().to_string(), source };
    let parent = match dir.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => Path::new(".").to_path_buf(),
    };
    std::fs::create_dir_all(&parent).map_err(|e| err(&parent, e))?;
    let staging = tempfile::Builder::new()
        .prefix(".layloft-plybook-")
        .tempdir_in(&parent)
        .map_err(|e| err(&parent, e))?;
    for (rel, bytes) in files {
        let path = staging.path().join(rel);
        if let Some(p) = path.parent() {
            std::fs::create_dir_all(p).map_err(|e| err(p, e))?;
        }
        std::fs::write(&path, bytes).map_err(|e| err(&path, e))?;
        #[cfg(unix)]
        {
            use std::os::unix::fs::PermissionsExt;
            let _ = std::fs::set_permissions(&path, std::fs::Permissions::from_mode(0o644));
        }
    }
    if !dir.exists() {
        let kept = staging.keep();
        #[cfg(unix)]
        {
            use std::os::unix::fs::PermissionsExt;
            let _ = std::fs::set_permissions(&kept, std::fs::Permissions::from_mode(0o755));
        }
        std::fs::rename(&kept, dir).map_err(|e| {
            let _ = std::fs::remove_dir_all(&kept);
            err(dir, e)
        })?;
        return Ok(());
    }
    for (rel, _) in files {
        let to = dir.join(rel);
        if let Some(p) = to.parent() {
            std::fs::create_dir_all(p).map_err(|e| err(p, e))?;
        }
        std::fs::rename(staging.path().join(rel), &to).map_err(|e| err(&to, e))?;
    }
    Ok(())
}
