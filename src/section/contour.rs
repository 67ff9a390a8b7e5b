//! The wall midline of a section: the outer mould line offset inward by half the local laminate
//! thickness, cleaned where the walls of a thin trailing edge meet, webs joined to the upper and
//! lower midlines, and the closed wall split into cells.
//!
//! Offset: each outer edge moves inward by half its laminate thickness; neighbouring offset edges
//! meet at their crossing (exact at corners), or, where the thickness changes along a nearly
//! straight wall, at the mean offset along the mitre (see `outline::offset_vertex`). An offset
//! edge that then runs backwards (an edge shorter than the offset beside a convex corner, where
//! points cluster) is taken out and its neighbours meet at the crossing of their own offset lines,
//! as a polygon offset with mitre joins does (`collapse_folds`); only the edges of a knife-edge
//! trailing edge or of a short blunt base are left for the swallowtail cut below.
//!
//! Walls thicker than the local depth are refused where the inner surface (the outer line offset
//! by the whole laminate thickness, folds taken out alike) crosses itself away from the trailing
//! edge, or where it no longer encloses any area.
//!
//! Thin trailing edge: where the offset upper and lower midlines cross ahead of the trailing edge,
//! the loop is closed at that crossing and the walls aft of it become open branches lying on the
//! line from the crossing to the trailing-edge point (the solid, bonded trailing edge). They carry
//! mass, axial and bending stiffness and transverse shear, but no torsional shear flow.
//!
//! Cells: cell 0 lies ahead of the first web, cell `k` between webs `k-1` and `k` (sorted by
//! chordwise position), the last one behind the last web. Cell shear flows are positive
//! counter-clockwise seen from the tip (right-handed about +x); the outer wall runs clockwise,
//! a web runs from its lower end up.

use std::ops::Range;

use super::error::SectionError;
use super::outline::{
    Crossing, Point, add, cross, dot, lerp, norm, offset_vertex, outward_normal, scale,
    self_crossings, sub, twice_signed_area,
};
use crate::layout::SectionLayout;

/// Which part of the section a wall element models.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum WallPart {
    /// A piece of the closed outer wall, from outer segment `segment` of the layout.
    Skin {
        /// Index of the outer segment (`SectionLayout::outer`, `segment_laminate`).
        segment: usize,
    },
    /// A piece of a shear web.
    Web {
        /// Index into `SectionLayout::webs`.
        web: usize,
    },
    /// Outer segment `segment` aft of the place where the trailing-edge walls meet: an open
    /// branch of solid laminate without torsional shear flow.
    TrailingEdge {
        /// Index of the outer segment.
        segment: usize,
    },
}

/// One straight wall element of the solved section: a piece of midline with one laminate.
///
/// The element runs from `start` to `end` along the wall's axis 2 (`s`): clockwise round the
/// outer wall seen from the tip, upward (+z) on a web. Its outward normal is `s` turned a quarter
/// turn counter-clockwise; for a web that is towards the leading edge, where the web laminate's
/// first ply lies.
#[derive(Debug, Clone, PartialEq)]
pub struct WallElement {
    /// Start of the midline piece (y, z), m, chord frame from the pitch axis.
    pub start: [f64; 2],
    /// End of the midline piece (y, z), m.
    pub end: [f64; 2],
    /// Index into `SectionLayout::laminates`.
    pub laminate: usize,
    /// What the element models.
    pub part: WallPart,
    pub(crate) cells: [Option<(usize, f64)>; 2],
}

impl WallElement {
    /// Length, m.
    pub fn length(&self) -> f64 {
        norm(sub(self.end, self.start))
    }

    /// Midpoint (y, z), m.
    pub fn midpoint(&self) -> [f64; 2] {
        lerp(self.start, self.end, 0.5)
    }

    /// Unit tangent (direction of wall axis 2), zero for a zero-length element.
    pub fn tangent(&self) -> [f64; 2] {
        let d = sub(self.end, self.start);
        let l = norm(d);
        if l > 0.0 { scale(d, 1.0 / l) } else { [0.0, 0.0] }
    }

    /// Unit outward normal (wall axis 3).
    pub fn normal(&self) -> [f64; 2] {
        let t = self.tangent();
        [-t[1], t[0]]
    }

    /// The cells this element bounds, with the sign of the element direction against the
    /// counter-clockwise sense of each cell.
    pub fn cells(&self) -> impl Iterator<Item = (usize, f64)> + '_ {
        self.cells.iter().flatten().copied()
    }
}

/// A node of the closed midline loop.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Node {
    Plain,
    /// Upper end of the web with this sorted index.
    WebTop(usize),
    /// Lower end of the web with this sorted index.
    WebBottom(usize),
    /// The trailing-edge vertex of a loop that closes there.
    TrailingEdge,
    /// The place where the trailing-edge walls meet; the open branches start here.
    Merge,
}

/// The solved geometry of a section.
#[derive(Debug, Clone)]
pub(crate) struct Contour {
    pub elements: Vec<WallElement>,
    /// `elements[..loop_len]` is the closed outer loop, element `k` starting at node `k`.
    pub loop_len: usize,
    pub loop_nodes: Vec<Node>,
    /// Element ranges of each web in sorted order, lower end first.
    pub webs: Vec<Range<usize>>,
    /// Upper trailing-edge branch, from the meeting point aft; lower branch, towards it.
    pub tail_upper: Range<usize>,
    pub tail_lower: Range<usize>,
    pub cell_areas: Vec<f64>,
    /// Vertex corrections for the mass of an offset wall: (vertex, 2 tan(turn/2), laminates).
    pub corners: Vec<(Point, f64, usize, usize)>,
    /// Where the trailing-edge walls meet, if they do.
    pub merge: Option<Point>,
}

pub(crate) fn y_c(layout: &SectionLayout, y: f64) -> f64 {
    y / layout.chord + layout.pitch_axis_frac
}

/// Builds the midline, cells and elements. `thickness[k]` is the thickness of laminate `k`.
pub(crate) fn build_contour(
    layout: &SectionLayout,
    thickness: &[f64],
    web_elements: usize,
    max_mitre: f64,
) -> Result<Contour, SectionError> {
    let r = layout.r;
    let pts = &layout.outer;
    let n = pts.len();
    let tiny = 1e-9 * layout.chord;
    let degenerate = |reason: String| SectionError::Degenerate { r, reason };
    let (mut tang, mut len) = (Vec::with_capacity(n), Vec::with_capacity(n));
    for i in 0..n {
        let d = sub(pts[(i + 1) % n], pts[i]);
        let l = norm(d);
        if l.is_nan() || l <= tiny {
            return Err(degenerate(format!(
                "edge {i} at y/c = {} has no length (repeated point)",
                crate::text::fixed(y_c(layout, pts[i][0]), 4)
            )));
        }
        tang.push(scale(d, 1.0 / l));
        len.push(l);
    }
    let area2 = twice_signed_area(pts);
    if area2.abs() <= tiny * layout.chord {
        return Err(degenerate("the outline encloses no area".into()));
    }
    if area2 > 0.0 {
        return Err(SectionError::Orientation { r });
    }
    if let Some(c) = self_crossings(pts).first() {
        return Err(SectionError::SelfCrossing { r, y_c: y_c(layout, c.point[0]) });
    }
    let half: Vec<f64> = layout.segment_laminate.iter().map(|&k| thickness[k] / 2.0).collect();
    let i_te = (0..n).fold(0, |b, i| if pts[i][0] > pts[b][0] { i } else { b });
    if i_te == 0 {
        return Err(degenerate("the leading-edge point is also the trailing-edge point".into()));
    }
    let v0: Vec<Point> = (0..n)
        .map(|i| {
            let a = (i + n - 1) % n;
            offset_vertex(pts[i], (tang[a], len[a], half[a]), (tang[i], len[i], half[i]), max_mitre)
        })
        .collect();
    // Offset edges that fold back (shorter than the offset where points cluster at a corner) are
    // taken out; the trailing edge is left to the swallowtail cut below.
    // The trailing edge keeps its base (an edge beside the aftmost point standing more across the
    // chord than along it), or, at a knife edge (turning by more than 150°, a thin airfoil's),
    // its two edges, so that walls meeting ahead of it leave a swallowtail to cut below; a
    // blunter corner is offset like any other.
    let before = (i_te + n - 1) % n;
    // A base: steep, and short (its straight run under 6 % of the chord, as an airfoil's).
    let steep = |e: usize| {
        let along =
            |k: usize| (tang[k][0] - tang[e][0]).abs() + (tang[k][1] - tang[e][1]).abs() < 1e-9;
        let mut run = len[e];
        let (mut a, mut b) = ((e + n - 1) % n, (e + 1) % n);
        while along(a) && a != e {
            run += len[a];
            a = (a + n - 1) % n;
        }
        while along(b) && b != e {
            run += len[b];
            b = (b + 1) % n;
        }
        tang[e][0].abs() < 0.5 && run <= 0.06 * layout.chord
    };
    let te_turn = cross(tang[before], tang[i_te]).atan2(dot(tang[before], tang[i_te])).abs();
    let keep: Vec<usize> = if steep(i_te) {
        vec![i_te]
    } else if steep(before) {
        vec![before]
    } else if te_turn > 150f64.to_radians() {
        vec![before, i_te]
    } else {
        vec![]
    };
    let (idx, v) = collapse_folds(pts, &tang, &half, v0, &keep, max_mitre);
    let m0 = idx.len();

    // Where the midline crosses itself: a swallowtail behind a thin trailing edge is cut off;
    // any other crossing means walls thicker than the section is deep. Crossings are in the
    // indices of the kept vertices (`idx` maps them to outer segments).
    let te_pos = te_position(&idx, i_te);
    let crossings = self_crossings(&v);
    let merge =
        crossings.iter().filter(|c| c.i < te_pos && te_pos <= c.j).max_by_key(|c| c.j - c.i);
    if let Some(c) = merge {
        let mut cut = vec![c.point];
        cut.extend_from_slice(&v[c.i + 1..=c.j]);
        if twice_signed_area(&cut) < -0.01 * area2.abs() {
            return Err(SectionError::WallsMeet { r, y_c: y_c(layout, c.point[0]) });
        }
    }
    if let Some(c) = crossings.iter().find(|c| !merge.is_some_and(|m| m.i <= c.i && c.j <= m.j)) {
        return Err(SectionError::WallsMeet { r, y_c: y_c(layout, c.point[0]) });
    }

    check_inner_surface(layout, &tang, &half, &keep, i_te, area2, max_mitre)?;

    // Loop nodes: (point, kind, outer segment of the element starting there).
    let mut nodes: Vec<(Point, Node, usize)> = Vec::with_capacity(m0 + 2 * layout.webs.len() + 1);
    match merge {
        None => nodes.extend((0..m0).map(|q| {
            let k = idx[q];
            (v[q], if q == te_pos { Node::TrailingEdge } else { Node::Plain }, k)
        })),
        Some(c) => {
            nodes.extend((0..=c.i).map(|q| (v[q], Node::Plain, idx[q])));
            nodes.push((c.point, Node::Merge, idx[c.j]));
            nodes.extend((c.j + 1..m0).map(|q| (v[q], Node::Plain, idx[q])));
        }
    }
    // The merge in outer segment indices, for the trailing-edge branches.
    let merge = merge.map(|c| Crossing { i: idx[c.i], j: idx[c.j], ..*c });
    let merge_point = merge.map(|c| c.point);
    let order = web_order(layout, merge_point)?;
    insert_web_nodes(layout, &order, &mut nodes)?;

    // Cells along the loop.
    let ncells = order.len() + 1;
    let m = nodes.len();
    let mut elements = Vec::with_capacity(m + order.len() * web_elements + 16);
    let (mut cell, mut upper) = (0usize, true);
    let order_err = |w: usize, reason: &str| SectionError::WebPlacement {
        r,
        web: layout.webs[order[w]].name.clone(),
        y_c: y_c(layout, layout.webs[order[w]].y),
        reason: reason.to_string(),
    };
    for k in 0..m {
        match nodes[k].1 {
            Node::TrailingEdge | Node::Merge => {
                upper = false;
                cell = ncells - 1;
            }
            Node::WebTop(w) if upper && w == cell => cell += 1,
            Node::WebBottom(w) if !upper && w + 1 == cell => cell -= 1,
            Node::WebTop(w) | Node::WebBottom(w) => {
                return Err(order_err(w, "the web meets the walls out of chordwise order"));
            }
            Node::Plain => {}
        }
        let seg = nodes[k].2;
        elements.push(WallElement {
            start: nodes[k].0,
            end: nodes[(k + 1) % m].0,
            laminate: layout.segment_laminate[seg],
            part: WallPart::Skin { segment: seg },
            cells: [Some((cell, -1.0)), None],
        });
    }
    let loop_nodes: Vec<Node> = nodes.iter().map(|n| n.1).collect();

    // Webs, lower end first.
    let mut webs = Vec::with_capacity(order.len());
    for (k, &w) in order.iter().enumerate() {
        let find = |kind: Node| nodes.iter().find(|n| n.1 == kind).map(|n| n.0);
        let (Some(bottom), Some(top)) = (find(Node::WebBottom(k)), find(Node::WebTop(k))) else {
            return Err(order_err(k, "the web ends were lost"));
        };
        let first = elements.len();
        let pieces = web_elements.max(1);
        for p in 0..pieces {
            elements.push(WallElement {
                start: lerp(bottom, top, p as f64 / pieces as f64),
                end: lerp(bottom, top, (p + 1) as f64 / pieces as f64),
                laminate: layout.webs[w].laminate,
                part: WallPart::Web { web: w },
                cells: [Some((k, 1.0)), Some((k + 1, -1.0))],
            });
        }
        webs.push(first..elements.len());
    }

    // Trailing-edge branches on the line from the meeting point to the trailing-edge point.
    let (mut tail_upper, mut tail_lower) = (elements.len()..elements.len(), 0..0);
    if let Some(c) = merge {
        let ymax = pts[i_te][0];
        let tips: Vec<Point> =
            pts.iter().copied().filter(|p| p[0] >= ymax - 1e-6 * layout.chord).collect();
        let tip = scale(tips.iter().fold([0.0, 0.0], |a, &p| add(a, p)), 1.0 / tips.len() as f64);
        let axis = sub(tip, c.point);
        let l = norm(axis);
        let u = if l > tiny { scale(axis, 1.0 / l) } else { [1.0, 0.0] };
        let proj = |p: Point| add(c.point, scale(u, dot(sub(p, c.point), u)));
        let push = |start: Point, end: Point, seg: usize, elements: &mut Vec<WallElement>| {
            if norm(sub(end, start)) > tiny {
                elements.push(WallElement {
                    start,
                    end,
                    laminate: layout.segment_laminate[seg],
                    part: WallPart::TrailingEdge { segment: seg },
                    cells: [None, None],
                });
            }
        };
        for k in c.i..i_te {
            let start = if k == c.i { c.point } else { proj(pts[k]) };
            push(start, proj(pts[k + 1]), k, &mut elements);
        }
        tail_upper = tail_upper.start..elements.len();
        for k in i_te..=c.j {
            let end = if k == c.j { c.point } else { proj(pts[(k + 1) % n]) };
            push(proj(pts[k]), end, k, &mut elements);
        }
        tail_lower = tail_upper.end..elements.len();
    }

    let mut cell_areas = vec![0.0; ncells];
    for e in &elements {
        for (c, sign) in e.cells() {
            cell_areas[c] += 0.5 * sign * cross(e.start, e.end);
        }
    }
    if let Some(j) = cell_areas.iter().position(|&a| a.is_nan() || a <= tiny * layout.chord) {
        return Err(degenerate(format!("cell {j} of the wall midline encloses no area")));
    }

    let mut corners = Vec::new();
    for k in 0..m {
        if !matches!(loop_nodes[k], Node::Plain | Node::TrailingEdge) {
            continue;
        }
        let (a, b) = (&elements[(k + m - 1) % m], &elements[k]);
        let (ta, tb) = (a.tangent(), b.tangent());
        let turn = -cross(ta, tb).atan2(dot(ta, tb));
        if turn.abs() <= 150f64.to_radians() && turn != 0.0 {
            corners.push((b.start, 2.0 * (turn / 2.0).tan(), a.laminate, b.laminate));
        }
    }

    Ok(Contour {
        elements,
        loop_len: m,
        loop_nodes,
        webs,
        tail_upper,
        tail_lower,
        cell_areas,
        corners,
        merge: merge_point,
    })
}

/// Walls thicker than the local depth, where they really are: the inner surface (the outer line
/// offset inward by the whole laminate thickness, folds taken out as for the midline) must still
/// run the same way round as the outer line and cross itself only where the walls of a thin
/// trailing edge meet.
fn check_inner_surface(
    layout: &SectionLayout,
    tang: &[Point],
    half: &[f64],
    keep: &[usize],
    i_te: usize,
    area2: f64,
    max_mitre: f64,
) -> Result<(), SectionError> {
    let pts = &layout.outer;
    let n = pts.len();
    let full: Vec<f64> = half.iter().map(|h| 2.0 * h).collect();
    let len: Vec<f64> = (0..n).map(|i| norm(sub(pts[(i + 1) % n], pts[i]))).collect();
    let w0: Vec<Point> = (0..n)
        .map(|i| {
            let a = (i + n - 1) % n;
            offset_vertex(pts[i], (tang[a], len[a], full[a]), (tang[i], len[i], full[i]), max_mitre)
        })
        .collect();
    let (idx, w) = collapse_folds(pts, tang, &full, w0, keep, max_mitre);
    let err = |p: Point| SectionError::WallsMeet { r: layout.r, y_c: y_c(layout, p[0]) };
    let te_pos = te_position(&idx, i_te);
    let crossings = self_crossings(&w);
    let tail = crossings.iter().filter(|c| c.i < te_pos && te_pos <= c.j).max_by_key(|c| c.j - c.i);
    if let Some(c) = crossings.iter().find(|c| !tail.is_some_and(|m| m.i <= c.i && c.j <= m.j)) {
        return Err(err(c.point));
    }
    // The inner loop ahead of the trailing-edge meeting point must enclose some area the same
    // way round as the outer line.
    let mut inner: Vec<Point> = match tail {
        Some(c) => {
            let mut v = w[..=c.i].to_vec();
            v.push(c.point);
            v.extend_from_slice(&w[c.j + 1..]);
            v
        }
        None => w.clone(),
    };
    if inner.len() < 3 {
        inner = w;
    }
    if twice_signed_area(&inner) >= -1e-6 * area2.abs() {
        let (sy, sz) = pts.iter().fold((0.0, 0.0), |a, p| (a.0 + p[0], a.1 + p[1]));
        return Err(err([sy / n as f64, sz / n as f64]));
    }
    Ok(())
}

/// The place among the kept offset vertices (`idx`, ascending outer indices) of the trailing
/// edge `i_te`: its own vertex, or, when a fold took that vertex out (a thick closed trailing
/// edge, whose offset corner is the crossing of its neighbours' offset lines), the next vertex
/// kept, which took the corner's place.
fn te_position(idx: &[usize], i_te: usize) -> usize {
    idx.iter().position(|&k| k >= i_te).unwrap_or(0)
}

/// Takes out the offset edges that run backwards against their outer edge (an edge shorter than
/// the inward offset next to a convex corner, where the offset lines of its neighbours cross
/// before it begins): the neighbours then meet at the crossing of their own offset lines, as a
/// polygon offset with mitre joins does (the edges `keep` stay). Returns the outer segment of
/// each vertex kept, and the vertices.
fn collapse_folds(
    pts: &[Point],
    tang: &[Point],
    half: &[f64],
    mut v: Vec<Point>,
    keep: &[usize],
    max_mitre: f64,
) -> (Vec<usize>, Vec<Point>) {
    let n = pts.len();
    let mut next: Vec<usize> = (0..n).map(|k| (k + 1) % n).collect();
    let mut prev: Vec<usize> = (0..n).map(|k| (k + n - 1) % n).collect();
    let mut alive = vec![true; n];
    let mut count = n;
    // The crossing of the offset lines of outer segments a and b, if they are not parallel.
    let meet = |a: usize, b: usize| -> Option<Point> {
        let (na, nb) = (outward_normal(tang[a]), outward_normal(tang[b]));
        let det = cross(na, nb);
        if det.abs() < 1e-6 {
            return None;
        }
        let ca = dot(na, pts[a]) - half[a];
        let cb = dot(nb, pts[b]) - half[b];
        Some([(ca * nb[1] - cb * na[1]) / det, (cb * na[0] - ca * nb[0]) / det])
    };
    let reversed =
        |k: usize, v: &[Point], next: &[usize]| dot(sub(v[next[k]], v[k]), tang[k]) < 0.0;
    let mut todo: Vec<usize> = (0..n).rev().collect();
    while let Some(k) = todo.pop() {
        if !alive[k] || keep.contains(&k) || count <= 4 || !reversed(k, &v, &next) {
            continue;
        }
        let (p, q) = (prev[k], next[k]);
        let limit = max_mitre * half[p].max(half[q]);
        let at = match meet(p, q) {
            Some(x) if norm(sub(x, v[q])) <= limit && norm(sub(x, v[k])) <= limit => x,
            _ => lerp(v[k], v[q], 0.5),
        };
        v[q] = at;
        alive[k] = false;
        count -= 1;
        next[p] = q;
        prev[q] = p;
        // The neighbours may now fold.
        todo.push(q);
        todo.push(p);
    }
    let idx: Vec<usize> = (0..n).filter(|&k| alive[k]).collect();
    let kept = idx.iter().map(|&k| v[k]).collect();
    (idx, kept)
}

/// Webs sorted by chordwise position, checked for place.
fn web_order(layout: &SectionLayout, merge: Option<Point>) -> Result<Vec<usize>, SectionError> {
    let r = layout.r;
    let place = |w: usize, reason: String| SectionError::WebPlacement {
        r,
        web: layout.webs[w].name.clone(),
        y_c: y_c(layout, layout.webs[w].y),
        reason,
    };
    if let Some(w) = layout.webs.iter().position(|w| !w.y.is_finite()) {
        return Err(place(w, "the position is not a finite number".into()));
    }
    let mut order: Vec<usize> = (0..layout.webs.len()).collect();
    order.sort_by(|a, b| layout.webs[*a].y.total_cmp(&layout.webs[*b].y));
    let thickness = |w: usize| layout.laminates[layout.webs[w].laminate].thickness();
    for pair in order.windows(2) {
        let gap = layout.webs[pair[1]].y - layout.webs[pair[0]].y;
        let other = &layout.webs[pair[0]].name;
        if gap <= 1e-6 * layout.chord {
            return Err(place(pair[1], format!("it stands at the same place as web '{other}'")));
        }
        // Two laminates cannot fill one space: each web's faces stand half its thickness
        // either side of its midplane.
        let (ta, tb) = (thickness(pair[0]), thickness(pair[1]));
        if gap < 0.5 * (ta + tb) {
            return Err(place(
                pair[1],
                format!(
                    "its laminate ({:.2} mm thick) overlaps that of web '{other}' ({:.2} mm \
                     thick): their midplanes stand {:.2} mm apart, expected at least {:.2} mm",
                    tb * 1e3,
                    ta * 1e3,
                    gap * 1e3,
                    0.5 * (ta + tb) * 1e3
                ),
            ));
        }
    }
    if let (Some(x), Some(&w)) = (merge, order.last())
        && layout.webs[w].y >= x[0]
    {
        let reason = format!(
            "it stands behind y/c = {}, where the trailing-edge walls meet",
            crate::text::fixed(y_c(layout, x[0]), 4)
        );
        return Err(place(w, reason));
    }
    Ok(order)
}

/// Splits the loop where each web line crosses the upper and lower midlines.
fn insert_web_nodes(
    layout: &SectionLayout,
    order: &[usize],
    nodes: &mut Vec<(Point, Node, usize)>,
) -> Result<(), SectionError> {
    let m = nodes.len();
    let te =
        nodes.iter().position(|n| matches!(n.1, Node::TrailingEdge | Node::Merge)).unwrap_or(m);
    let mut splits: Vec<(usize, f64, Node, usize)> = Vec::with_capacity(2 * order.len());
    for (k, &w) in order.iter().enumerate() {
        let y = layout.webs[w].y;
        let hit = |range: Range<usize>, better: fn(f64, f64) -> bool| {
            let mut best: Option<(usize, f64, f64)> = None;
            for p in range {
                let (a, b) = (nodes[p].0, nodes[(p + 1) % m].0);
                let (da, db) = (a[0] - y, b[0] - y);
                if da == db || da * db > 0.0 {
                    continue;
                }
                let t = da / (da - db);
                let z = a[1] + (b[1] - a[1]) * t;
                if best.is_none_or(|(_, _, zb)| better(z, zb)) {
                    best = Some((p, t, z));
                }
            }
            best
        };
        let miss = |side| SectionError::WebMissesWall {
            r: layout.r,
            web: layout.webs[w].name.clone(),
            y_c: y_c(layout, y),
            side,
        };
        let top = hit(0..te, |z, zb| z > zb).ok_or_else(|| miss("upper"))?;
        let bottom = hit(te..m, |z, zb| z < zb).ok_or_else(|| miss("lower"))?;
        if top.2 <= bottom.2 {
            return Err(miss("upper"));
        }
        splits.push((top.0, top.1, Node::WebTop(k), k));
        splits.push((bottom.0, bottom.1, Node::WebBottom(k), k));
    }
    // A crossing at the very end of an element is a crossing at the start of the next one.
    for s in &mut splits {
        if s.1 > 1.0 - 1e-9 {
            *s = ((s.0 + 1) % m, 0.0, s.2, s.3);
        }
    }
    // From the back, so that inserting a node never moves one still to be visited.
    splits.sort_by(|a, b| b.0.cmp(&a.0).then(b.1.total_cmp(&a.1)));
    for (p, t, kind, k) in splits {
        if t >= 1e-9 {
            let point = lerp(nodes[p].0, nodes[(p + 1) % m].0, t);
            nodes.insert(p + 1, (point, kind, nodes[p].2));
        } else if nodes[p].1 == Node::Plain {
            nodes[p].1 = kind;
        } else {
            let w = &layout.webs[order[k]];
            return Err(SectionError::WebPlacement {
                r: layout.r,
                web: w.name.clone(),
                y_c: y_c(layout, w.y),
                reason: "it meets the wall at the trailing edge or at another web".into(),
            });
        }
    }
    Ok(())
}
