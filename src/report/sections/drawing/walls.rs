//! The walls of the drawing: bands inward of the outer line as thick as their laminate, webs,
//! and the solver's wall midline.

use std::fmt::Write as _;

use super::shapes::{Frame, INK, colour, n};
use crate::analysis::AnalysisStation;
use crate::section::WallPart;

/// Unit outward normals of the outer segments (segment `i` from point `i` to `i + 1`), and the
/// mitre vector per unit thickness at every vertex (limited to 4 at sharp corners).
fn normals_and_mitres(pts: &[[f64; 2]]) -> (Vec<[f64; 2]>, Vec<[f64; 2]>) {
    let m = pts.len();
    let normals: Vec<[f64; 2]> = (0..m)
        .map(|i| {
            let (a, b) = (pts[i], pts[(i + 1) % m]);
            let (dy, dz) = (b[0] - a[0], b[1] - a[1]);
            let l = dy.hypot(dz);
            if l > 0.0 { [-dz / l, dy / l] } else { [0.0, 0.0] }
        })
        .collect();
    let mitres = (0..m)
        .map(|i| {
            let (na, nb) = (normals[(i + m - 1) % m], normals[i]);
            let c = 1.0 + na[0] * nb[0] + na[1] * nb[1];
            let sum = [na[0] + nb[0], na[1] + nb[1]];
            let len = sum[0].hypot(sum[1]);
            if c > 1.0 / 16.0 {
                [sum[0] / c, sum[1] / c]
            } else if len > 1e-9 {
                [4.0 * sum[0] / len, 4.0 * sum[1] / len]
            } else {
                na
            }
        })
        .collect();
    (normals, mitres)
}

/// The wall bands: one closed path per run of outer segments with one laminate, its laminate,
/// and whether it is a ring (one laminate all round: outer and inner loop, filled even-odd).
/// A run round a thin trailing edge overlaps itself where the walls meet; filled non-zero, the
/// overlap stays filled.
fn wall_bands(st: &AnalysisStation, frame: &Frame) -> Vec<(usize, String, bool)> {
    let pts = &st.layout.outer;
    let lam = &st.layout.segment_laminate;
    let m = pts.len();
    let (_, mitre) = normals_and_mitres(pts);
    let t = |k: usize| st.layout.laminates[k].thickness();
    let inner = |i: usize, k: usize| {
        let v = mitre[i % m];
        [pts[i % m][0] - t(k) * v[0], pts[i % m][1] - t(k) * v[1]]
    };
    let Some(start) = (0..m).find(|&i| lam[i] != lam[(i + m - 1) % m]) else {
        // One laminate all round: a ring.
        let k = lam[0];
        let outer = frame.path(pts.iter().copied(), true);
        let inside = frame.path((0..m).rev().map(|i| inner(i, k)), true);
        return vec![(k, format!("{outer} {inside}"), true)];
    };
    let mut bands = Vec::new();
    let mut i = start;
    while i < start + m {
        let k = lam[i % m];
        let mut j = i;
        while j + 1 < start + m && lam[(j + 1) % m] == k {
            j += 1;
        }
        let outer = (i..=j + 1).map(|v| pts[v % m]);
        let back = (i..=j + 1).rev().map(|v| inner(v, k));
        bands.push((k, frame.path(outer.chain(back), true), false));
        i = j + 1;
    }
    bands
}

/// Polylines of the solver's wall midline (skins, trailing-edge branches and webs).
fn midline(st: &AnalysisStation, frame: &Frame) -> String {
    let mut d = String::new();
    let mut last: Option<[f64; 2]> = None;
    for e in st.section.elements() {
        let joined = last.is_some_and(|p| (p[0] - e.start[0]).hypot(p[1] - e.start[1]) < 1e-12);
        let (x, y) = frame.at(e.start);
        if !joined {
            let _ = write!(d, "M{} {} ", n(x), n(y));
        }
        let (x, y) = frame.at(e.end);
        let _ = write!(d, "L{} {} ", n(x), n(y));
        last = Some(e.end);
    }
    d.trim_end().to_string()
}

/// Writes the webs and wall bands (clipped to the outer line `outer`, clip path `id`), the outer
/// line and the dashed midline; `f` is the font size, which sets the line widths.
pub(super) fn draw(
    s: &mut String,
    st: &AnalysisStation,
    frame: &Frame,
    f: f64,
    id: &str,
    outer: &str,
) {
    let layout = &st.layout;
    // Webs, then wall bands over their ends, all inside the outer line.
    let _ = writeln!(s, "<g clip-path=\"url(#{id})\">");
    for (w, web) in layout.webs.iter().enumerate() {
        let zs: Vec<f64> = st
            .section
            .elements()
            .iter()
            .filter(|e| e.part == WallPart::Web { web: w })
            .flat_map(|e| [e.start[1], e.end[1]])
            .collect();
        if zs.is_empty() {
            continue;
        }
        let (lo, hi) = zs.iter().fold((f64::MAX, f64::MIN), |(a, b), &z| (a.min(z), b.max(z)));
        let t = layout.laminates[web.laminate].thickness();
        let (x, y) = frame.at([web.y - t / 2.0, hi]);
        let _ = writeln!(
            s,
            "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\"/>",
            n(x),
            n(y),
            n(t * 1e3),
            n((hi - lo) * 1e3),
            colour(web.laminate)
        );
    }
    for (k, d, ring) in wall_bands(st, frame) {
        let (c, rule) = (colour(k), if ring { "evenodd" } else { "nonzero" });
        let _ = writeln!(
            s,
            "<path d=\"{d}\" fill=\"{c}\" fill-rule=\"{rule}\" stroke=\"{c}\" stroke-width=\"{}\"/>",
            n(0.02 * f)
        );
    }
    let _ = writeln!(s, "</g>");
    let line_w = n((0.06 * f).max(0.1));
    let _ = writeln!(
        s,
        "<path d=\"{outer}\" fill=\"none\" stroke=\"{INK}\" stroke-width=\"{line_w}\"/>"
    );
    let _ = writeln!(
        s,
        "<path d=\"{}\" fill=\"none\" stroke=\"{INK}\" stroke-opacity=\"0.7\" stroke-width=\"{}\" \
         stroke-dasharray=\"{} {}\"/>",
        midline(st, frame),
        n(0.03 * f),
        n(0.4 * f),
        n(0.25 * f)
    );
}
