//! A print's section: points lifted onto the end trim along the pitch axis, the extent of a
//! polygon on a vertical line, the print's section scaled from the end contour, and the
//! even-odd test of a point in a polygon.

use super::*;

/// The point of `trim` over `q = (y, z)`, along the pitch axis.
pub(crate) fn lift_x(trim: EndTrim, q: [f64; 2]) -> Result<P3, MeshError> {
    match trim {
        EndTrim::Plane { x } => Ok([x, q[0], q[1]]),
        EndTrim::Sphere { radius } => {
            let h = radius * radius - q[0] * q[0] - q[1] * q[1];
            if h > 0.0 {
                Ok([h.sqrt(), q[0], q[1]])
            } else {
                Err(MeshError::Geometry(format!(
                    "a print's section reaches ({:.6}, {:.6}) m, beyond the end sphere of radius \
                     {radius:.6} m",
                    q[0], q[1]
                )))
            }
        }
    }
}

/// The extent `[lo, hi]` of the closed polygon `poly` on the vertical line at `t`.
pub(super) fn interval_at(poly: &[[f64; 2]], t: f64) -> Option<(f64, f64)> {
    let n = poly.len();
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    for i in 0..n {
        let (a, b) = (poly[i], poly[(i + 1) % n]);
        let (y0, y1) = (a[0].min(b[0]), a[0].max(b[0]));
        if t < y0 || t > y1 {
            continue;
        }
        if y1 - y0 <= 1e-15 {
            lo = lo.min(a[1].min(b[1]));
            hi = hi.max(a[1].max(b[1]));
        } else {
            let s = (t - a[0]) / (b[0] - a[0]);
            let z = a[1] + s * (b[1] - a[1]);
            lo = lo.min(z);
            hi = hi.max(z);
        }
    }
    (lo <= hi).then_some((lo, hi))
}

/// The print's section (chord frame) for the end `contour` (a chord-frame polygon that every
/// vertical line meets in one interval): the contour scaled by `fraction` about the `anchor`,
/// chordwise and, at each chordwise place, in relative depth (see the module docs); the anchor
/// is first moved `inset` inside the contour. `n` intervals a side.
pub(crate) fn print_section(
    contour: &[[f64; 2]],
    anchor: [f64; 2],
    fraction: f64,
    inset: f64,
    n: usize,
) -> Result<Vec<[f64; 2]>, MeshError> {
    let small = || MeshError::Geometry("a core's end is too small for a print".into());
    let (y0, y1) = contour
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| (a.min(p[0]), b.max(p[0])));
    let room = y1 - y0 - 2.0 * inset;
    if room.is_nan() || room <= 0.0 {
        return Err(small());
    }
    let ya = anchor[0].clamp(y0 + inset, y1 - inset);
    let (lo, hi) = interval_at(contour, ya).ok_or_else(small)?;
    if (hi - lo).is_nan() || hi - lo <= 0.0 {
        return Err(small());
    }
    let delta = (inset / (hi - lo)).min(0.25);
    let ta = ((anchor[1] - lo) / (hi - lo)).clamp(delta, 1.0 - delta);
    let (ys, ye) = (ya + fraction * (y0 - ya), ya + fraction * (y1 - ya));
    let mut upper = Vec::with_capacity(n + 1);
    let mut lower = Vec::with_capacity(n + 1);
    for k in 0..=n {
        let y = ys + (ye - ys) * k as f64 / n as f64;
        let (lo, hi) = interval_at(contour, y).ok_or_else(small)?;
        upper.push([y, lo + (hi - lo) * (ta + fraction * (1.0 - ta))]);
        lower.push([y, lo + (hi - lo) * ta * (1.0 - fraction)]);
    }
    lower.reverse();
    upper.extend(lower);
    let area = polygon_area(&upper).abs();
    if area.is_nan() || area <= 0.0 {
        return Err(small());
    }
    Ok(upper)
}

/// Whether `p` lies inside the closed polygon `poly` (even-odd rule).
pub(crate) fn inside(poly: &[[f64; 2]], p: [f64; 2]) -> bool {
    let n = poly.len();
    let mut c = false;
    for i in 0..n {
        let (a, b) = (poly[i], poly[(i + n - 1) % n]);
        if (a[1] > p[1]) != (b[1] > p[1])
            && p[0] < (b[0] - a[0]) * (p[1] - a[1]) / (b[1] - a[1]) + a[0]
        {
            c = !c;
        }
    }
    c
}

/// The inward miter vector at each corner of the closed polygon `poly`: the vector whose dot
/// product with the inward unit normal of either edge at the corner is 1, so that moving every
/// corner by `d` times its miter moves every edge inward parallel to itself by `d`.
pub(crate) fn inward_miters(poly: &[[f64; 2]]) -> Result<Vec<[f64; 2]>, MeshError> {
    let n = poly.len();
    let turn = if polygon_area(poly) > 0.0 { 1.0 } else { -1.0 };
    let normal = |i: usize| -> Option<[f64; 2]> {
        let (a, b) = (poly[i], poly[(i + 1) % n]);
        let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
        let len = dx.hypot(dy);
        // Counter-clockwise: the inside lies to the left, (−dy, dx).
        (len > 0.0).then(|| [-turn * dy / len, turn * dx / len])
    };
    let mut out = Vec::with_capacity(n);
    for i in 0..n {
        let bad = || MeshError::Geometry("a print's section has a repeated corner".into());
        let (a, b) = (normal((i + n - 1) % n).ok_or_else(bad)?, normal(i).ok_or_else(bad)?);
        let c = 1.0 + a[0] * b[0] + a[1] * b[1];
        if c < 0.1 {
            return Err(MeshError::Geometry(
                "a print's section turns back on itself at a corner".into(),
            ));
        }
        out.push([(a[0] + b[0]) / c, (a[1] + b[1]) / c]);
    }
    Ok(out)
}

/// Whether `moved` keeps the shape of `poly`: every edge still points the way it did and the
/// winding is kept (a taper or a clearance that does not fold the outline).
pub(crate) fn keeps_shape(poly: &[[f64; 2]], moved: &[[f64; 2]]) -> bool {
    let n = poly.len();
    let same_edges = (0..n).all(|i| {
        let j = (i + 1) % n;
        let e = [poly[j][0] - poly[i][0], poly[j][1] - poly[i][1]];
        let f = [moved[j][0] - moved[i][0], moved[j][1] - moved[i][1]];
        e[0] * f[0] + e[1] * f[1] > 0.0
    });
    let (a, b) = (polygon_area(poly), polygon_area(moved));
    same_edges && a * b > 0.0 && b.abs() > 0.05 * a.abs() && simple(moved)
}

/// Whether no two edges of the closed polygon `poly` cross, other than neighbours at their
/// shared corner.
pub(crate) fn simple(poly: &[[f64; 2]]) -> bool {
    let n = poly.len();
    let orient = |a: [f64; 2], b: [f64; 2], c: [f64; 2]| {
        (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
    };
    for i in 0..n {
        let (a, b) = (poly[i], poly[(i + 1) % n]);
        for j in i + 2..n {
            if (j + 1) % n == i {
                continue;
            }
            let (c, d) = (poly[j], poly[(j + 1) % n]);
            let (o1, o2) = (orient(a, b, c), orient(a, b, d));
            let (o3, o4) = (orient(c, d, a), orient(c, d, b));
            if o1 * o2 < 0.0 && o3 * o4 < 0.0 {
                return false;
            }
        }
    }
    true
}
