//! Plane geometry of the outer mould line: checks, the inward offset of its edges, and the
//! crossings of a closed polygon with itself.
//!
//! Points are `[y, z]` in the chord frame. The outer line runs clockwise seen from the tip (+x
//! towards the viewer, y to the right, z up): leading edge, upper surface, trailing edge, lower
//! surface. Its outward normal is the contour tangent turned a quarter turn counter-clockwise,
//! `n = (-t_z, t_y)`.

pub(crate) type Point = [f64; 2];

pub(crate) fn sub(a: Point, b: Point) -> Point {
    [a[0] - b[0], a[1] - b[1]]
}

pub(crate) fn add(a: Point, b: Point) -> Point {
    [a[0] + b[0], a[1] + b[1]]
}

pub(crate) fn scale(a: Point, k: f64) -> Point {
    [a[0] * k, a[1] * k]
}

pub(crate) fn dot(a: Point, b: Point) -> f64 {
    a[0] * b[0] + a[1] * b[1]
}

pub(crate) fn cross(a: Point, b: Point) -> f64 {
    a[0] * b[1] - a[1] * b[0]
}

pub(crate) fn norm(a: Point) -> f64 {
    a[0].hypot(a[1])
}

pub(crate) fn lerp(a: Point, b: Point, t: f64) -> Point {
    [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t]
}

/// Outward normal of a clockwise contour whose unit tangent is `t`.
pub(crate) fn outward_normal(t: Point) -> Point {
    [-t[1], t[0]]
}

/// Twice the signed area of a closed polygon (positive counter-clockwise).
pub(crate) fn twice_signed_area(pts: &[Point]) -> f64 {
    let n = pts.len();
    (0..n).map(|i| cross(pts[i], pts[(i + 1) % n])).sum()
}

/// Where two segments of a closed polygon cross: segment `i` at parameter `ti`, segment `j > i`
/// at `tj`, at `point`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Crossing {
    pub i: usize,
    pub j: usize,
    pub ti: f64,
    pub tj: f64,
    pub point: Point,
}

/// Every crossing of two non-adjacent segments of the closed polygon `pts`, found by a sweep
/// over the segments sorted by their least `y` (about n log n for an airfoil-like outline).
/// Parallel overlapping segments are not reported.
pub(crate) fn self_crossings(pts: &[Point]) -> Vec<Crossing> {
    let n = pts.len();
    let seg = |k: usize| (pts[k], pts[(k + 1) % n]);
    let mut order: Vec<(f64, f64, usize)> = (0..n)
        .map(|k| {
            let (a, b) = seg(k);
            (a[0].min(b[0]), a[0].max(b[0]), k)
        })
        .collect();
    order.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut found = Vec::new();
    for (ia, &(_, ymax_a, a)) in order.iter().enumerate() {
        let (pa, qa) = seg(a);
        let (zlo_a, zhi_a) = (pa[1].min(qa[1]), pa[1].max(qa[1]));
        for &(ymin_b, _, b) in &order[ia + 1..] {
            if ymin_b > ymax_a {
                break;
            }
            let (i, j) = if a < b { (a, b) } else { (b, a) };
            if j == i + 1 || (i == 0 && j == n - 1) {
                continue;
            }
            let (pb, qb) = seg(b);
            if pb[1].max(qb[1]) < zlo_a || pb[1].min(qb[1]) > zhi_a {
                continue;
            }
            let (p, r) = (pts[i], sub(pts[(i + 1) % n], pts[i]));
            let (q, s) = (pts[j], sub(pts[(j + 1) % n], pts[j]));
            let denom = cross(r, s);
            if denom.abs() <= 1e-14 * norm(r) * norm(s) {
                continue;
            }
            let qp = sub(q, p);
            let ti = cross(qp, s) / denom;
            let tj = cross(qp, r) / denom;
            let eps = 1e-12;
            if (-eps..=1.0 + eps).contains(&ti) && (-eps..=1.0 + eps).contains(&tj) {
                found.push(Crossing { i, j, ti, tj, point: add(p, scale(r, ti)) });
            }
        }
    }
    found
}

/// The wall midline vertex at outer vertex `p`, where the edge before it (unit tangent `ta`,
/// length `la`, half thickness `da`) meets the edge after it (`tb`, `lb`, `db`): the crossing of
/// the two edges offset inward by their half thicknesses. Where the thickness changes on a nearly
/// straight wall that crossing runs far along the wall; the offset by the mean half thickness
/// along the mitre is taken instead (see `EXACT_JOIN`). The mitre is limited to `max_mitre` times the larger half
/// thickness (a knife-edge corner; such corners lie where walls meet and are cut away later).
pub(crate) fn offset_vertex(
    p: Point,
    (ta, la, da): (Point, f64, f64),
    (tb, lb, db): (Point, f64, f64),
    max_mitre: f64,
) -> Point {
    let (na, nb) = (outward_normal(ta), outward_normal(tb));
    let dmean = 0.5 * (da + db);
    let c = 1.0 + dot(na, nb);
    let mitre = if c > 1e-9 {
        scale(add(na, nb), -dmean / c)
    } else {
        // A full reversal (knife edge): step back along the arriving edge.
        scale(ta, -max_mitre * da.max(db))
    };
    let mut v = mitre;
    let det = cross(na, nb);
    if (da - db).abs() > 1e-12 * da.max(db) && det.abs() > 1e-9 {
        // Solve na·v = -da, nb·v = -db.
        let exact = [(-da * nb[1] + db * na[1]) / det, (-db * na[0] + da * nb[0]) / det];
        // Near the mitre (a corner): the exact crossing, whatever the lengths of the edges, so
        // that splitting a straight face into more points changes nothing.
        let near = norm(sub(exact, mitre));
        let corner = dot(ta, tb) < CORNER_TURN.cos();
        if (corner && near <= EXACT_JOIN * da.max(db)) || (!corner && near <= 0.5 * la.min(lb)) {
            v = exact;
        }
    }
    let limit = max_mitre * da.max(db);
    let len = norm(v);
    if len > limit {
        v = scale(v, limit / len);
    }
    add(p, v)
}

/// At a corner (a turn of more than `CORNER_TURN`) where the thickness changes, the crossing of
/// the two offset edges is the midline vertex when it lies within this many times the larger
/// half thickness of the mitre point, whatever the lengths of the edges (so splitting a straight
/// face changes nothing). At a smaller turn (a thickness step on a nearly straight wall, whose
/// ramp the blade module sets) the crossing is taken only within half the shorter edge.
const EXACT_JOIN: f64 = 6.0;

/// The least turn between two edges that makes a corner for [`EXACT_JOIN`].
const CORNER_TURN: f64 = 10.0 * std::f64::consts::PI / 180.0;

/// `z` where the polyline `chain`, whose `y` does not decrease, crosses the line at `y`; `None`
/// outside its range. Vertical pieces are skipped.
pub(crate) fn chain_z_at(chain: &[Point], y: f64) -> Option<f64> {
    if chain.len() < 2 || y < chain[0][0] || y > chain[chain.len() - 1][0] {
        return None;
    }
    let k = chain.partition_point(|p| p[0] < y).clamp(1, chain.len() - 1);
    let try_seg = |k: usize| {
        let (a, b) = (chain[k - 1], chain[k]);
        let dy = b[0] - a[0];
        (dy > 0.0 && (a[0]..=b[0]).contains(&y)).then(|| a[1] + (b[1] - a[1]) * (y - a[0]) / dy)
    };
    try_seg(k).or_else(|| (1..chain.len()).find_map(try_seg))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn square_offset_corner_is_the_crossing_of_offset_edges() {
        // Clockwise square corner at the origin: edge along +y (top), then down along -z.
        let v = offset_vertex([0.0, 0.0], ([1.0, 0.0], 1.0, 0.1), ([0.0, -1.0], 1.0, 0.2), 20.0);
        // Top edge offset down by 0.1, right edge offset left by 0.2.
        assert!((v[0] + 0.2).abs() < 1e-12 && (v[1] + 0.1).abs() < 1e-12, "{v:?}");
    }

    #[test]
    fn crossing_of_a_bow_tie_is_found_once() {
        let pts = [[0.0, 0.0], [1.0, 1.0], [1.0, 0.0], [0.0, 1.0]];
        let c = self_crossings(&pts);
        assert_eq!(c.len(), 1);
        assert!((c[0].point[0] - 0.5).abs() < 1e-12 && (c[0].point[1] - 0.5).abs() < 1e-12);
        assert!(self_crossings(&[[0.0, 0.0], [0.0, 1.0], [1.0, 1.0], [1.0, 0.0]]).is_empty());
    }

    #[test]
    fn chain_interpolates_and_refuses_outside() {
        let chain = [[0.0, 0.0], [1.0, 1.0], [1.0, 2.0], [2.0, 2.0]];
        assert_eq!(chain_z_at(&chain, 0.5), Some(0.5));
        assert_eq!(chain_z_at(&chain, 1.5), Some(2.0));
        assert_eq!(chain_z_at(&chain, 2.5), None);
    }
}
