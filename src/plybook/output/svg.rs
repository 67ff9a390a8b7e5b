//! The ply book's drawings: one pattern, the sheet of a material's patterns, the nesting on the
//! roll; true scale, 1 user unit = 1 mm.

use std::fmt::Write as _;

use super::super::book::{MaterialNesting, PatternEntry, PlyBook};
use super::super::nest::bbox;
use super::{centroid, esc, label, notch};

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

/// All patterns of one material stacked on one sheet, true scale, mm.
pub(super) fn sheet_svg(book: &PlyBook, m: &MaterialNesting) -> String {
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
