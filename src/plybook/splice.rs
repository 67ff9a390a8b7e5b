//! Splices of a ply cut in pieces: where to cut a region in two, staggered from the splices of
//! the plies laid before it, and the note that tells the laminator how the pieces join.

use super::book::PlyBookParams;
use super::pattern::FlatPattern;
use super::regions::{At, PlyRegion, skin_region, web_region};
use crate::blade::{Blade, Surface};
use crate::project::PlySpec;

/// A splice line of a ply cut in pieces: across the span at a radius (over a range of chord
/// fractions, or of heights on a web), or along the span at a chord fraction (over a range of
/// radii).
#[derive(Debug, Clone)]
pub(super) struct Splice {
    /// Index of the ply in the schedule.
    ply: usize,
    /// The skin or web (`upper`, `lower`, `web:NAME`).
    surface: String,
    /// Across the span (at a radius) rather than along it (at a chord fraction).
    across_span: bool,
    /// The radius (m) or the chord fraction of the line.
    at: f64,
    /// The chord fractions (heights) or radii the line runs over.
    extent: [f64; 2],
}

/// The splices between the pieces of a region (each the lower edge of a piece inside the
/// region).
pub(super) fn splices_of(
    span: [f64; 2],
    chord: [f64; 2],
    pieces: &[(PlyRegion, FlatPattern)],
) -> Vec<Splice> {
    let mut out = Vec::new();
    for (piece, _) in pieces {
        if piece.span[0] > span[0] + 1e-9 {
            out.push(Splice {
                ply: piece.ply,
                surface: piece.surface_name.clone(),
                across_span: true,
                at: piece.span[0],
                extent: piece.chord,
            });
        }
        if piece.chord[0] > chord[0] + 1e-9 {
            out.push(Splice {
                ply: piece.ply,
                surface: piece.surface_name.clone(),
                across_span: false,
                at: piece.chord[0],
                extent: piece.span,
            });
        }
    }
    out
}

/// Where to cut `[lo, hi]` in two: the middle, or where the middle lies within `clear` of a
/// splice of an earlier ply (`lines`: the ply and the line's place), the nearest place that
/// keeps `clear` from them all while each half keeps at least a quarter of the range. When no
/// place is clear of them all, the splices of the earliest plies are given up first, the
/// latest ply's kept as long as any; the plies whose splices could not be kept clear are
/// returned with the place.
fn stagger_cut(lo: f64, hi: f64, clear: f64, lines: &[(usize, f64)]) -> (f64, Vec<usize>) {
    let mid = 0.5 * (lo + hi);
    let window = [lo + 0.25 * (hi - lo), hi - 0.25 * (hi - lo)];
    let mut plies: Vec<usize> = lines.iter().map(|l| l.0).collect();
    plies.sort_unstable();
    plies.dedup();
    // The latest plies first; `keep` of them respected.
    plies.reverse();
    for keep in (1..=plies.len()).rev() {
        let kept = &plies[..keep];
        let near: Vec<f64> = lines.iter().filter(|l| kept.contains(&l.0)).map(|l| l.1).collect();
        let clear_of = |c: f64| near.iter().all(|&a| (c - a).abs() >= clear * (1.0 - 1e-9));
        let mut best: Option<f64> = None;
        let candidates =
            std::iter::once(mid).chain(near.iter().flat_map(|&a| [a - clear, a + clear]));
        for c in candidates {
            if c < window[0] || c > window[1] || !clear_of(c) {
                continue;
            }
            if best.is_none_or(|b| (c - mid).abs() < (b - mid).abs()) {
                best = Some(c);
            }
        }
        if let Some(c) = best {
            return (c, plies[keep..].to_vec());
        }
    }
    (mid, plies)
}

/// The two halves of a region: across the span where the region is at least as long as it is
/// wide on the surface (always on a web), else across the chord; at the middle, or off it to
/// keep [`PlyBookParams::stagger`] from the parallel splices of earlier plies on the same skin
/// or web (see [`stagger_cut`]; on a skin a chordwise distance is taken at the least chord of
/// the region's span, less than the distance on the surface). Also the earlier plies whose
/// splices the cut could not keep clear of.
pub(super) fn halves<'a>(
    blade: &'a Blade,
    region: &PlyRegion<'a>,
    params: &PlyBookParams,
    earlier: &[Splice],
) -> ([PlyRegion<'a>; 2], Vec<usize>) {
    let (a, c) = (region.span, region.chord);
    let mid = 0.5 * (a[0] + a[1]);
    let k = region.ply;
    let across_span = match region.at {
        At::Web(_) => true,
        At::Skin(_) => a[1] - a[0] >= blade.chord(mid) * (c[1] - c[0]),
    };
    let overlaps = |e: [f64; 2], f: [f64; 2]| e[1].min(f[1]) - e[0].max(f[0]) > 1e-9;
    let lines: Vec<(usize, f64)> = earlier
        .iter()
        .filter(|s| s.surface == region.surface_name && s.across_span == across_span)
        .filter(|s| overlaps(s.extent, if across_span { c } else { a }))
        .map(|s| (s.ply, s.at))
        .collect();
    if across_span {
        let (m, missed) = stagger_cut(a[0], a[1], params.stagger, &lines);
        let pair = match region.at {
            At::Web(w) => [
                web_region(blade, k, w, [a[0], m], params),
                web_region(blade, k, w, [m, a[1]], params),
            ],
            At::Skin(side) => [
                skin_region(blade, k, side, [a[0], m], c, params),
                skin_region(blade, k, side, [m, a[1]], c, params),
            ],
        };
        return (pair, missed);
    }
    let least_chord = (0..=16)
        .map(|i| blade.chord(a[0] + (a[1] - a[0]) * i as f64 / 16.0))
        .fold(f64::INFINITY, f64::min);
    let (m, missed) = stagger_cut(c[0], c[1], params.stagger / least_chord, &lines);
    let side = match region.at {
        At::Skin(side) => side,
        At::Web(_) => Surface::Upper,
    };
    (
        [
            skin_region(blade, k, side, a, [c[0], m], params),
            skin_region(blade, k, side, a, [m, c[1]], params),
        ],
        missed,
    )
}

/// The label of piece `n` (from 0) of a pattern cut in pieces: a letter after the name.
pub(super) fn piece_name(name: &str, n: usize) -> String {
    let letter = char::from(b'a' + (n % 26) as u8);
    format!("{name}-{letter}")
}

/// The note on a ply region cut in pieces: each piece with its range, and how they join.
pub(super) fn splice_note(
    p: &PlySpec,
    name: &str,
    pieces: &[(PlyRegion, FlatPattern)],
    stagger: f64,
) -> String {
    let list: Vec<String> = pieces
        .iter()
        .enumerate()
        .map(|(n, (r, _))| {
            let mut s = format!("{} r {:.3}–{:.3} m", piece_name(name, n), r.span[0], r.span[1]);
            if matches!(r.at, At::Skin(_)) {
                s.push_str(&format!(", x/c {:.3}–{:.3}", r.chord[0], r.chord[1]));
            }
            s
        })
        .collect();
    format!(
        "ply '{}' ({name}) will not drape in one piece and is cut in {} pieces that do: {}; butt the pieces edge to edge along the splice lines (no overlap, so the kit's mass is the ply's) ; the cuts are placed at least {:.0} mm from the parallel splices of the plies laid before on the same surface (common practice)",
        p.id,
        pieces.len(),
        list.join("; "),
        stagger * 1e3
    )
}
