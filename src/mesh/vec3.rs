//! Small fixed-size vector helpers for the mesh kernels (plain arrays, no allocation).

pub(crate) type P3 = [f64; 3];

#[inline]
pub(crate) fn sub(a: P3, b: P3) -> P3 {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}

#[inline]
pub(crate) fn add(a: P3, b: P3) -> P3 {
    [a[0] + b[0], a[1] + b[1], a[2] + b[2]]
}

#[inline]
pub(crate) fn scale(a: P3, s: f64) -> P3 {
    [a[0] * s, a[1] * s, a[2] * s]
}

#[inline]
pub(crate) fn dot(a: P3, b: P3) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

#[inline]
pub(crate) fn cross(a: P3, b: P3) -> P3 {
    [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]
}

#[inline]
pub(crate) fn norm(a: P3) -> f64 {
    dot(a, a).sqrt()
}

#[inline]
pub(crate) fn dist(a: P3, b: P3) -> f64 {
    norm(sub(a, b))
}

/// `a + (b - a) t`.
#[inline]
pub(crate) fn lerp(a: P3, b: P3, t: f64) -> P3 {
    [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t, a[2] + (b[2] - a[2]) * t]
}

/// Twice the area vector of the triangle `abc` (right-hand rule).
#[inline]
pub(crate) fn area_vector(a: P3, b: P3, c: P3) -> P3 {
    cross(sub(b, a), sub(c, a))
}

/// Distance from `p` to the segment `ab`.
pub(crate) fn dist_to_segment(p: P3, a: P3, b: P3) -> f64 {
    let ab = sub(b, a);
    let len2 = dot(ab, ab);
    let t = if len2 > 0.0 { (dot(sub(p, a), ab) / len2).clamp(0.0, 1.0) } else { 0.0 };
    dist(p, lerp(a, b, t))
}

/// Distance from `p` to the segment `ab` in the plane.
pub(crate) fn dist_to_segment_2d(p: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    dist_to_segment([p[0], p[1], 0.0], [a[0], a[1], 0.0], [b[0], b[1], 0.0])
}

/// Distance between two points in the plane.
pub(crate) fn dist_2d(a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - b[0]).hypot(a[1] - b[1])
}
