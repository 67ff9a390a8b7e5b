//! Plane helpers for outlines read from files: distances, turns, straight runs and a crossing
//! test with a tolerance that treats points along a straight face as collinear.

pub(crate) type P = [f64; 2];

pub(crate) fn dist(a: P, b: P) -> f64 {
    (a[0] - b[0]).hypot(a[1] - b[1])
}

fn sub(a: P, b: P) -> P {
    [a[0] - b[0], a[1] - b[1]]
}

fn cross(a: P, b: P) -> f64 {
    a[0] * b[1] - a[1] * b[0]
}

fn dot(a: P, b: P) -> f64 {
    a[0] * b[0] + a[1] * b[1]
}

/// Relative tolerance on the sine of the angle between two directions for them to count as one
/// straight line (points written with 15 significant digits along a face stay within it).
pub(crate) const COLLINEAR: f64 = 1e-7;

/// Whether `b` lies on the straight line through `a` and `c`, between them.
pub(crate) fn straight_through(a: P, b: P, c: P) -> bool {
    let (u, v) = (sub(b, a), sub(c, b));
    let (lu, lv) = (u[0].hypot(u[1]), v[0].hypot(v[1]));
    lu > 0.0 && lv > 0.0 && cross(u, v).abs() <= COLLINEAR * lu * lv && dot(u, v) > 0.0
}

/// The turn at `b` between the directions `a → b` and `b → c`, radians in 0..=pi.
pub(crate) fn turn(a: P, b: P, c: P) -> f64 {
    let (u, v) = (sub(b, a), sub(c, b));
    cross(u, v).atan2(dot(u, v)).abs()
}

/// Twice the signed area of a closed polygon (positive counter-clockwise).
pub(crate) fn twice_area(pts: &[P]) -> f64 {
    let n = pts.len();
    (0..n).map(|i| cross(pts[i], pts[(i + 1) % n])).sum()
}

/// Whether the closed segments `ab` and `cd` share a point. `eps` is a length below which
/// points count as touching (a tolerance for round-off in the file's digits); segments lying
/// along one straight line meet only where they overlap.
pub(crate) fn segments_meet(a: P, b: P, c: P, d: P, eps: f64) -> bool {
    let lo = |p: f64, q: f64| p.min(q) - eps;
    let hi = |p: f64, q: f64| p.max(q) + eps;
    if hi(a[0], b[0]) < lo(c[0], d[0])
        || hi(c[0], d[0]) < lo(a[0], b[0])
        || hi(a[1], b[1]) < lo(c[1], d[1])
        || hi(c[1], d[1]) < lo(a[1], b[1])
    {
        return false;
    }
    // Signed distances of each end from the other segment's line.
    let side = |p: P, q: P, r: P| {
        let l = dist(p, q);
        if l > 0.0 { cross(sub(q, p), sub(r, p)) / l } else { dist(p, r) }
    };
    let (d1, d2) = (side(c, d, a), side(c, d, b));
    let (d3, d4) = (side(a, b, c), side(a, b, d));
    let apart = |x: f64, y: f64| (x > eps && y > eps) || (x < -eps && y < -eps);
    if apart(d1, d2) || apart(d3, d4) {
        return false;
    }
    let all_on_line = d1.abs() <= eps && d2.abs() <= eps && d3.abs() <= eps && d4.abs() <= eps;
    if all_on_line {
        // Overlap of the projections on the longer segment's direction.
        let (p, q) = if dist(a, b) >= dist(c, d) { (a, b) } else { (c, d) };
        let l = dist(p, q);
        if l == 0.0 {
            return dist(a, c) <= eps;
        }
        let u = [(q[0] - p[0]) / l, (q[1] - p[1]) / l];
        let t = |r: P| dot(sub(r, p), u);
        let (s0, s1) = (t(a).min(t(b)), t(a).max(t(b)));
        let (t0, t1) = (t(c).min(t(d)), t(c).max(t(d)));
        return s0 <= t1 + eps && t0 <= s1 + eps;
    }
    // A touch of an end on the other segment, or a proper crossing.
    let on = |r: P, p: P, q: P, dr: f64| {
        dr.abs() <= eps && {
            let l2 = dot(sub(q, p), sub(q, p));
            let t = if l2 > 0.0 { dot(sub(r, p), sub(q, p)) / l2 } else { 0.0 };
            let tol = if l2 > 0.0 { eps / l2.sqrt() } else { 0.0 };
            (-tol..=1.0 + tol).contains(&t)
        }
    };
    if on(a, c, d, d1) || on(b, c, d, d2) || on(c, a, b, d3) || on(d, a, b, d4) {
        return true;
    }
    d1 * d2 < 0.0 && d3 * d4 < 0.0
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn collinear_pieces_of_one_face_do_not_meet() {
        // Three pieces of a diamond face with round-off in the last digit.
        let a = [0.0, 0.0];
        let b = [0.1, 0.020000000000000004];
        let c = [0.2, 0.04];
        let d = [0.30000000000000004, 0.06];
        assert!(!segments_meet(a, b, c, d, 1e-12));
        assert!(segments_meet([0.0, 0.0], [1.0, 1.0], [0.0, 1.0], [1.0, 0.0], 1e-12));
        // Touching at an end counts.
        assert!(segments_meet([0.0, 0.0], [1.0, 0.0], [0.5, 0.0], [0.5, 1.0], 1e-12));
        // Overlapping along one line counts.
        assert!(segments_meet([0.0, 0.0], [1.0, 0.0], [0.5, 0.0], [2.0, 0.0], 1e-12));
    }

    #[test]
    fn straight_and_turns() {
        assert!(straight_through([0.0, 0.0], [1.0, 1.0], [2.0, 2.0 + 1e-12]));
        assert!(!straight_through([0.0, 0.0], [1.0, 1.0], [0.5, 0.5]));
        assert!(
            (turn([0.0, 0.0], [1.0, 0.0], [1.0, 1.0]) - std::f64::consts::FRAC_PI_2).abs() < 1e-12
        );
    }
}
