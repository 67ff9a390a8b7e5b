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
/// is first moved `inset` inside the contour. A column shallower than `min_depth` is deepened
/// to it about its middle where the contour leaves `wide_inset` either side (the inset and how
/// far the cell's contour moves across the end's span), and the section keeps
/// the longest chordwise run of columns at least `min_depth` deep (a thin trailing end cannot
/// take the print's taper). `n` intervals a side.
pub(crate) fn print_section(
    contour: &[[f64; 2]],
    anchor: [f64; 2],
    fraction: f64,
    inset: f64,
    wide_inset: f64,
    min_depth: f64,
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
    // The section's column at `y`, `[lower, upper]`.
    let column = |y: f64| -> Result<(f64, f64), MeshError> {
        let (lo, hi) = interval_at(contour, y).ok_or_else(small)?;
        let (mut a, mut b) =
            (lo + (hi - lo) * ta * (1.0 - fraction), lo + (hi - lo) * (ta + fraction * (1.0 - ta)));
        let room = hi - lo - 2.0 * wide_inset;
        if b - a < min_depth && room > b - a {
            let grow = 0.5 * (min_depth.min(room) - (b - a));
            (a, b) = (a - grow, b + grow);
            let shift = (lo + wide_inset - a).max(0.0) - (b - (hi - wide_inset)).max(0.0);
            (a, b) = (a + shift, b + shift);
        }
        Ok((a, b))
    };
    // The longest run of columns deep enough (on a grid eight times finer than the section's).
    let (ys, ye) = if min_depth > 0.0 {
        let m = 8 * n.max(1);
        let at = |k: usize| ys + (ye - ys) * k as f64 / m as f64;
        let mut best: Option<(usize, usize)> = None;
        let mut start = None;
        for k in 0..=m {
            let (a, b) = column(at(k))?;
            let deep = b - a >= min_depth * (1.0 - 1e-9);
            match (deep, start) {
                (true, None) => start = Some(k),
                (false, Some(s)) => {
                    if best.is_none_or(|(p, q)| k - 1 - s > q - p) {
                        best = Some((s, k - 1));
                    }
                    start = None;
                }
                _ => {}
            }
        }
        if let Some(s) = start {
            if best.is_none_or(|(p, q)| m - s > q - p) {
                best = Some((s, m));
            }
        }
        match best {
            Some((p, q)) if q > p => (at(p), at(q)),
            _ => {
                return Err(MeshError::Geometry(format!(
                    "a core's end is nowhere {:.3} mm deep inside {:.3} mm of its sides, too \
                     thin for a tapered print",
                    min_depth * 1e3,
                    wide_inset * 1e3
                )));
            }
        }
    } else {
        (ys, ye)
    };
    let mut upper = Vec::with_capacity(n + 1);
    let mut lower = Vec::with_capacity(n + 1);
    for k in 0..=n {
        let y = ys + (ye - ys) * k as f64 / n as f64;
        let (a, b) = column(y)?;
        upper.push([y, b]);
        lower.push([y, a]);
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

#[cfg(test)]
mod tests {
    use super::*;

    /// A wedge cell's end in the chord frame: depth 14 mm at the front (y = 0) falling linearly
    /// to 2 mm at the back (y = 60 mm), symmetric about z = 0 (an invented trailing-edge cell).
    fn wedge() -> Vec<[f64; 2]> {
        let h = |y: f64| 0.012 * (1.0 - y / 0.06) + 0.002;
        let n = 60;
        let mut c: Vec<[f64; 2]> = (0..=n)
            .map(|i| {
                let y = 0.06 * i as f64 / n as f64;
                [y, 0.5 * h(y)]
            })
            .collect();
        c.extend((0..=n).rev().map(|i| {
            let y = 0.06 * i as f64 / n as f64;
            [y, -0.5 * h(y)]
        }));
        c
    }

    #[test]
    fn a_thin_trailing_end_is_cut_where_the_section_is_too_shallow_to_taper() {
        // Anchored at the thin back corner, scaled by a half: the columns run from y = 29.75 mm
        // back; deepened to 4 mm where the contour leaves 0.5 mm either side (depth h − 1 mm ≥
        // 4 mm for y ≤ 45 mm, geometry of the wedge), and cut there.
        let (f, inset, need) = (0.5, 0.5e-3, 4e-3);
        let s = print_section(&wedge(), [0.06, -0.001], f, inset, inset, need, 8).unwrap();
        let n = s.len() / 2;
        for k in 0..n {
            let (top, bottom) = (s[k], s[s.len() - 1 - k]);
            assert!((top[0] - bottom[0]).abs() < 1e-15);
            assert!(top[1] - bottom[1] >= need * (1.0 - 1e-9), "{k}: {top:?} {bottom:?}");
            let (lo, hi) = interval_at(&wedge(), top[0]).unwrap();
            assert!(bottom[1] >= lo + inset * (1.0 - 1e-9) || f * (hi - lo) >= need, "{k}");
            assert!(top[1] <= hi - inset * (1.0 - 1e-9) || f * (hi - lo) >= need, "{k}");
        }
        let back = s.iter().map(|q| q[0]).fold(f64::NEG_INFINITY, f64::max);
        let front = s.iter().map(|q| q[0]).fold(f64::INFINITY, f64::min);
        // The cut lies within one step of the finer grid (30 mm / 64) of y = 45 mm.
        assert!((back - 0.045).abs() < 0.03 / 64.0 + 1e-12, "{back}");
        assert!((front - 0.02975).abs() < 1e-12, "{front}");
        // Every side moved in by a quarter of the least depth (the taper over the longest
        // wall) keeps the section's shape (sides here longer than the move; the print drops
        // shorter ones next to a corner first).
        let m = inward_miters(&s).unwrap();
        let moved: Vec<[f64; 2]> = s
            .iter()
            .zip(&m)
            .map(|(q, m)| [q[0] + 0.25 * need * m[0], q[1] + 0.25 * need * m[1]])
            .collect();
        assert!(keeps_shape(&s, &moved));
        // Without a least depth the thin end is kept, and the same move folds it.
        let thin = print_section(&wedge(), [0.06, -0.001], f, inset, inset, 0.0, 8).unwrap();
        let m = inward_miters(&thin).unwrap();
        let moved: Vec<[f64; 2]> = thin
            .iter()
            .zip(&m)
            .map(|(q, m)| [q[0] + 0.25 * need * m[0], q[1] + 0.25 * need * m[1]])
            .collect();
        assert!(!keeps_shape(&thin, &moved));
    }

    #[test]
    fn a_cell_nowhere_deep_enough_gets_a_clear_error() {
        // A 40 × 4 mm end with 0.5 mm kept either side leaves 3 mm, less than 4 mm.
        let outline = [[-0.02, 0.002], [0.02, 0.002], [0.02, -0.002], [-0.02, -0.002]];
        let e = print_section(&outline, [0.0, 0.0], 0.5, 0.5e-3, 0.5e-3, 4e-3, 16).unwrap_err();
        assert!(e.to_string().contains("too thin for a tapered print"), "{e}");
        assert!(print_section(&outline, [0.0, 0.0], 0.5, 0.5e-3, 0.5e-3, 2.9e-3, 16).is_ok());
    }
}
