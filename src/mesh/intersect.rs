//! Self-intersection of a triangle surface: candidate pairs from a uniform grid of cells,
//! exact-in-structure tests by orientation predicates.
//!
//! Two triangles that do not lie in one plane intersect exactly when an edge of one crosses the
//! other (the segment where they meet ends on their edges). A segment `pq` crosses the triangle
//! `abc` when `p` and `q` are not strictly on one side of its plane and the point where it meets
//! the plane (by interpolation of their signed distances) lies in the triangle. Coplanar pairs are
//! tested in the plane (edge crossings and containment), and so is a triangle that touches the
//! other's plane without crossing it (at its corners there). Neighbours are tested for what sharing
//! allows: a pair that shares a vertex intersects only if the edge of one opposite that vertex
//! meets the other; a pair that shares an edge only if it is folded flat onto itself. An
//! orientation counts as zero when the point lies within `1e-12` of (its distance plus its distance
//! from the origin) of the plane or line: computed coordinates carry round-off in proportion to
//! their size, so a flat strip far from the origin is not told apart from a fold by noise (touching
//! counts as meeting).

use super::triangles::Mesh;
use super::vec3::{self, P3};

const COPLANAR: f64 = 1e-12;

/// `(x + y)² ≤ 2 (x² + y²)`, with a margin far above round-off: an orientation whose square
/// exceeds the tolerance band squared by this bound (sums of squares only) is off the plane or
/// line for certain, and no square root is taken; only within it is the band itself computed.
/// The outcome is that of the band as stated, not an approximation of it.
const SQUARE_BOUND: f64 = 2.000_001;

/// `(x + y)² ≥ x² + y²` for `x, y ≥ 0`, with the same margin the other way: an orientation whose
/// square is below the tolerance band squared by this bound (exactly zero included, as for the
/// many collinear corners of a flat face) is within the band for certain, again with no square
/// root.
const SQUARE_FLOOR: f64 = 0.999_999;

/// A triangle with what the tests reuse: vertex indices, corners, area vector, the squared
/// product of its two edge lengths from corner 0 times the tolerance squared, and the squared
/// distance of corner 0 from the origin. Two cache lines: the pair loop reads facets in the
/// order the grid pairs them, so their size is what it pays for (the bound and floor products
/// and the distance itself are formed where [`Facet::side`] needs them, to the same bits).
#[derive(Debug, Clone, Copy)]
#[repr(C, align(64))]
pub(crate) struct Facet {
    pub v: [u32; 3],
    pub p: [P3; 3],
    n: P3,
    tol2: f64,
    reach2: f64,
}

impl Facet {
    pub fn new(mesh: &Mesh, t: usize) -> Self {
        let p = mesh.corners(t);
        let (u, v) = (vec3::sub(p[1], p[0]), vec3::sub(p[2], p[0]));
        let reach2 = vec3::dot(p[0], p[0]);
        let uv2 = vec3::dot(u, u) * vec3::dot(v, v);
        let tol2 = COPLANAR * COPLANAR * uv2;
        Facet { v: mesh.triangles[t], p, n: vec3::cross(u, v), tol2, reach2 }
    }

    /// The distance of corner 0 from the origin.
    #[inline]
    fn reach(&self) -> f64 {
        self.reach2.sqrt()
    }

    /// The facet's axis-aligned box, `[least, greatest]`.
    pub fn bounds(&self) -> [P3; 2] {
        let [a, b, c] = self.p;
        let lo = |k: usize| a[k].min(b[k]).min(c[k]);
        let hi = |k: usize| a[k].max(b[k]).max(c[k]);
        [[lo(0), lo(1), lo(2)], [hi(0), hi(1), hi(2)]]
    }

    /// `orient(p0, p1, p2, q)` from the stored area vector; zero when `q` lies within
    /// `COPLANAR` times (its distance from corner 0 plus the corner's distance from the origin)
    /// of the plane: computed coordinates carry round-off in proportion to their size, so
    /// near-coplanar facets far from the origin are not told apart by noise.
    #[inline]
    fn side(&self, q: P3) -> f64 {
        let w = vec3::sub(q, self.p[0]);
        let det = vec3::dot(self.n, w);
        let ww = vec3::dot(w, w);
        // The products in the order the band's inequality is written, so that each decides
        // alike to the bit: `tol2 · bound · (ww + reach²)`.
        if det * det > self.tol2 * SQUARE_BOUND * (ww + self.reach2) {
            return det;
        }
        if det * det <= self.tol2 * SQUARE_FLOOR * (ww + self.reach2) {
            return 0.0;
        }
        let band = ww.sqrt() + self.reach();
        if det * det <= self.tol2 * band * band { 0.0 } else { det }
    }

    /// The two axes to keep when projecting the facet's plane: the dominant normal component
    /// dropped.
    fn axes(&self) -> [usize; 2] {
        let n = self.n.map(f64::abs);
        if n[0] >= n[1] && n[0] >= n[2] {
            [1, 2]
        } else if n[1] >= n[2] {
            [2, 0]
        } else {
            [0, 1]
        }
    }
}

/// Orientation of `c` against the line `ab` in the plane; zero within `COPLANAR` times `c`'s
/// distance from `a` plus `a`'s distance from the origin (as [`Facet::side`]).
#[inline]
fn orient_2d(a: [f64; 2], b: [f64; 2], c: [f64; 2]) -> f64 {
    let (ab, ac) = ([b[0] - a[0], b[1] - a[1]], [c[0] - a[0], c[1] - a[1]]);
    let det = ab[0] * ac[1] - ab[1] * ac[0];
    let ab2 = ab[0] * ab[0] + ab[1] * ab[1];
    let bound = ac[0] * ac[0] + ac[1] * ac[1] + a[0] * a[0] + a[1] * a[1];
    if det * det > COPLANAR * COPLANAR * ab2 * SQUARE_BOUND * bound {
        return det;
    }
    if det * det <= COPLANAR * COPLANAR * ab2 * SQUARE_FLOOR * bound {
        return 0.0;
    }
    let scale = vec3::dist_2d(a, b) * (vec3::dist_2d(a, c) + a[0].hypot(a[1]));
    if det.abs() <= COPLANAR * scale { 0.0 } else { det }
}

fn same_strict_sign(a: f64, b: f64) -> bool {
    (a > 0.0 && b > 0.0) || (a < 0.0 && b < 0.0)
}

/// Whether the segment `pq` meets the triangle, given the orientations of `p` and `q` against
/// the triangle's plane: in the plane when both lie in it; else where it meets the plane (an end
/// in the plane, or the crossing point found by interpolation), tested inside the triangle in the
/// plane. Interpolating keeps a segment that grazes the plane well conditioned, where signs of
/// orientations against the triangle's edges would be noise.
fn segment_meets(p: P3, q: P3, f: &Facet, op: f64, oq: f64) -> bool {
    if same_strict_sign(op, oq) {
        return false;
    }
    let axes = f.axes();
    let t2 = [project(f.p[0], axes), project(f.p[1], axes), project(f.p[2], axes)];
    match (op == 0.0, oq == 0.0) {
        (true, true) => segment_meets_triangle_2d(project(p, axes), project(q, axes), &t2),
        (true, false) => inside_triangle_2d(project(p, axes), &t2),
        (false, true) => inside_triangle_2d(project(q, axes), &t2),
        (false, false) => {
            let x = vec3::lerp(p, q, op / (op - oq));
            inside_triangle_2d(project(x, axes), &t2)
        }
    }
}

#[inline]
fn project(p: P3, [i, j]: [usize; 2]) -> [f64; 2] {
    [p[i], p[j]]
}

/// Whether `c`, on the line through `a` and `b`, lies on the segment (within its box).
fn on_segment(a: [f64; 2], b: [f64; 2], c: [f64; 2]) -> bool {
    (0..2).all(|k| a[k].min(b[k]) <= c[k] && c[k] <= a[k].max(b[k]))
}

/// Whether the segments `pq` and `ab` meet: they cross properly, or an end of one lies on the
/// other (Cormen, Leiserson, Rivest & Stein, *Introduction to Algorithms*, 3rd ed., 2009, §33.1).
fn segments_meet_2d(p: [f64; 2], q: [f64; 2], a: [f64; 2], b: [f64; 2]) -> bool {
    let (d1, d2) = (orient_2d(a, b, p), orient_2d(a, b, q));
    let (d3, d4) = (orient_2d(p, q, a), orient_2d(p, q, b));
    let opposite = |x: f64, y: f64| (x > 0.0 && y < 0.0) || (x < 0.0 && y > 0.0);
    if opposite(d1, d2) && opposite(d3, d4) {
        return true;
    }
    (d1 == 0.0 && on_segment(a, b, p))
        || (d2 == 0.0 && on_segment(a, b, q))
        || (d3 == 0.0 && on_segment(p, q, a))
        || (d4 == 0.0 && on_segment(p, q, b))
}

fn inside_triangle_2d(p: [f64; 2], t: &[[f64; 2]; 3]) -> bool {
    let s = [orient_2d(t[0], t[1], p), orient_2d(t[1], t[2], p), orient_2d(t[2], t[0], p)];
    (s[0] >= 0.0 && s[1] >= 0.0 && s[2] >= 0.0) || (s[0] <= 0.0 && s[1] <= 0.0 && s[2] <= 0.0)
}

fn segment_meets_triangle_2d(p: [f64; 2], q: [f64; 2], t: &[[f64; 2]; 3]) -> bool {
    inside_triangle_2d(p, t)
        || inside_triangle_2d(q, t)
        || (0..3).any(|k| segments_meet_2d(p, q, t[k], t[(k + 1) % 3]))
}

/// Whether triangle `t` meets the corners of the other triangle `q` that lie in its plane
/// (`dq[i] == 0`: one corner or one edge), tested in that plane.
fn touches_in_plane(t: &Facet, q: &[P3; 3], dq: [f64; 3]) -> bool {
    let axes = t.axes();
    let t2 = [project(t.p[0], axes), project(t.p[1], axes), project(t.p[2], axes)];
    let mut on = [[0.0; 2]; 3];
    let mut count = 0;
    for i in (0..3).filter(|&i| dq[i] == 0.0) {
        on[count] = project(q[i], axes);
        count += 1;
    }
    match &on[..count] {
        [p] => inside_triangle_2d(*p, &t2),
        [p, r] => segment_meets_triangle_2d(*p, *r, &t2),
        _ => false,
    }
}

/// Whether two triangles with no vertex in common meet.
fn triangles_meet(fa: &Facet, fb: &Facet) -> bool {
    let (a, b) = (&fa.p, &fb.p);
    let da = [fa.side(b[0]), fa.side(b[1]), fa.side(b[2])];
    if (da.iter().all(|&x| x > 0.0)) || da.iter().all(|&x| x < 0.0) {
        return false;
    }
    let db = [fb.side(a[0]), fb.side(a[1]), fb.side(a[2])];
    if (db.iter().all(|&x| x > 0.0)) || db.iter().all(|&x| x < 0.0) {
        return false;
    }
    if da.iter().all(|&x| x == 0.0) || db.iter().all(|&x| x == 0.0) {
        let axes = fa.axes();
        let (a2, b2) = (a.map(|v| project(v, axes)), b.map(|v| project(v, axes)));
        return (0..3).any(|k| segment_meets_triangle_2d(a2[k], a2[(k + 1) % 3], &b2))
            || inside_triangle_2d(b2[0], &a2)
            || inside_triangle_2d(a2[0], &b2);
    }
    // A triangle that touches the other's plane without crossing it can meet the other only at
    // its corners in that plane.
    let crosses = |d: &[f64; 3]| d.iter().any(|&x| x > 0.0) && d.iter().any(|&x| x < 0.0);
    if !crosses(&da) {
        return touches_in_plane(fa, b, da);
    }
    if !crosses(&db) {
        return touches_in_plane(fb, a, db);
    }
    (0..3).any(|k| segment_meets(a[k], a[(k + 1) % 3], fb, db[k], db[(k + 1) % 3]))
        || (0..3).any(|k| segment_meets(b[k], b[(k + 1) % 3], fa, da[k], da[(k + 1) % 3]))
}

/// Whether two triangles sharing exactly the corner `a[ia] == b[ib]` meet anywhere else.
fn triangles_meet_at_corner(a: &Facet, ia: usize, b: &Facet, ib: usize) -> bool {
    let opposite = |t: &[P3; 3], i: usize| (t[(i + 1) % 3], t[(i + 2) % 3]);
    let (p, q) = opposite(&a.p, ia);
    let (r, s) = opposite(&b.p, ib);
    segment_meets(p, q, b, b.side(p), b.side(q)) || segment_meets(r, s, a, a.side(r), a.side(s))
}

/// Whether two triangles sharing an edge are folded flat onto each other.
fn folded(a: &Facet, b: &Facet) -> bool {
    let (na, nb) = (a.n, b.n);
    let d = vec3::dot(na, nb);
    d < 0.0 && d * d >= (1.0 - 1e-12) * vec3::dot(na, na) * vec3::dot(nb, nb)
}

/// Tests a pair of facets by what they share.
pub(crate) fn facets_meet(a: &Facet, b: &Facet) -> bool {
    let mut shared = [(0, 0); 3];
    let mut count = 0;
    for (ia, vi) in a.v.iter().enumerate() {
        if let Some(ib) = b.v.iter().position(|vj| vj == vi) {
            shared[count] = (ia, ib);
            count += 1;
        }
    }
    match count {
        0 => triangles_meet(a, b),
        1 => triangles_meet_at_corner(a, shared[0].0, b, shared[0].1),
        2 => folded(a, b),
        _ => true,
    }
}

/// Tests triangles `i` and `j` of `mesh` by what they share.
#[cfg(test)]
pub(crate) fn pair_meets(mesh: &Mesh, i: usize, j: usize) -> bool {
    facets_meet(&Facet::new(mesh, i), &Facet::new(mesh, j))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn tri(p: [[f64; 3]; 3]) -> Facet {
        let mut m = Mesh::new();
        for q in p {
            m.push_vertex(q);
        }
        m.triangles.push([0, 1, 2]);
        Facet::new(&m, 0)
    }

    /// The band with its square roots, as first written: the reference that the bounds which
    /// spare them must decide alike.
    fn orient_2d_plain(a: [f64; 2], b: [f64; 2], c: [f64; 2]) -> f64 {
        let det = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
        let scale = vec3::dist_2d(a, b) * (vec3::dist_2d(a, c) + a[0].hypot(a[1]));
        if det.abs() <= COPLANAR * scale { 0.0 } else { det }
    }

    /// The squared product of the facet's two edge lengths from corner 0.
    fn uv2(f: &Facet) -> f64 {
        let (u, v) = (vec3::sub(f.p[1], f.p[0]), vec3::sub(f.p[2], f.p[0]));
        vec3::dot(u, u) * vec3::dot(v, v)
    }

    fn side_plain(f: &Facet, q: P3) -> f64 {
        let w = vec3::sub(q, f.p[0]);
        let det = vec3::dot(f.n, w);
        let band = vec3::norm(w) + f.reach();
        if det * det <= COPLANAR * COPLANAR * uv2(f) * band * band { 0.0 } else { det }
    }

    #[test]
    fn the_square_root_free_bounds_decide_as_the_band_does() {
        // Points placed off a line or plane by multiples of the band (0.3 to 3 times it, both
        // sides of the threshold), at distances from the origin of a micrometre to a kilometre:
        // every orientation equals the plain band's, bit for bit.
        let mut uniform = crate::mesh::test_rng::uniform(0x9e37_79b9_7f4a_7c15);
        let mut rnd = || uniform() - 0.5;
        let (mut zeros, mut signs) = (0, 0);
        for trial in 0..20_000 {
            let scale = 10f64.powf(-6.0 + 9.0 * (rnd() + 0.5));
            let size = scale * 10f64.powf(-3.0 * (rnd() + 0.5));
            let k = [0.3, 0.9, 0.999, 1.001, 1.1, 3.0][trial % 6];
            // In the plane: c on the line ab, moved across it by k times the band.
            let a = [scale * rnd(), scale * rnd()];
            let b = [a[0] + size * rnd(), a[1] + size * rnd()];
            let t = 2.0 * rnd();
            let on = [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
            let ab = vec3::dist_2d(a, b);
            let band = COPLANAR * (vec3::dist_2d(a, on) + a[0].hypot(a[1]));
            let off = k * band * rnd().signum();
            let c = [on[0] - off * (b[1] - a[1]) / ab, on[1] + off * (b[0] - a[0]) / ab];
            let (fast, plain) = (orient_2d(a, b, c), orient_2d_plain(a, b, c));
            assert_eq!(fast.to_bits(), plain.to_bits(), "trial {trial}: {a:?} {b:?} {c:?}");
            // In space: q moved off the facet's plane by k times the band.
            let p0 = [scale * rnd(), scale * rnd(), scale * rnd()];
            let p1 = [0, 1, 2].map(|i| p0[i] + size * rnd());
            let p2 = [0, 1, 2].map(|i| p0[i] + size * rnd());
            let f = tri([p0, p1, p2]);
            let (s, t) = (2.0 * rnd(), 2.0 * rnd());
            let inplane = [0, 1, 2].map(|i| p0[i] + s * (p1[i] - p0[i]) + t * (p2[i] - p0[i]));
            let unit = vec3::scale(f.n, 1.0 / vec3::norm(f.n));
            let w = vec3::dist(inplane, p0);
            let band = COPLANAR * uv2(&f).sqrt() / vec3::norm(f.n) * (w + f.reach());
            let q = vec3::add(inplane, vec3::scale(unit, k * band * rnd().signum()));
            let (fast, plain) = (f.side(q), side_plain(&f, q));
            assert_eq!(fast.to_bits(), plain.to_bits(), "trial {trial}: {:?} {q:?}", f.p);
            for v in [plain, orient_2d_plain(a, b, c)] {
                if v == 0.0 {
                    zeros += 1;
                } else {
                    signs += 1;
                }
            }
        }
        // Both outcomes must occur often, or the comparison proves little.
        assert!(zeros > 4_000 && signs > 4_000, "{zeros} zero, {signs} signed");
    }

    #[test]
    fn crossing_and_separate_triangles() {
        // Closed-form cases: a triangle in z = 0 and one piercing it along z.
        let a = tri([[0.0, 0.0, 0.0], [1.0, 0.0, 0.0], [0.0, 1.0, 0.0]]);
        let pierce = tri([[0.2, 0.2, -1.0], [0.2, 0.2, 1.0], [0.3, 0.25, 1.0]]);
        assert!(triangles_meet(&a, &pierce));
        let beside = tri([[2.0, 2.0, -1.0], [2.0, 2.0, 1.0], [2.1, 2.05, 1.0]]);
        assert!(!triangles_meet(&a, &beside));
        let above = tri([[0.0, 0.0, 1e-3], [1.0, 0.0, 1e-3], [0.0, 1.0, 2e-3]]);
        assert!(!triangles_meet(&a, &above));
        // Coplanar: overlapping and apart.
        let over = tri([[0.2, 0.2, 0.0], [1.2, 0.2, 0.0], [0.2, 1.2, 0.0]]);
        assert!(triangles_meet(&a, &over));
        let apart = tri([[1.0, 1.0, 0.0], [2.0, 1.0, 0.0], [1.0, 2.0, 0.0]]);
        assert!(!triangles_meet(&a, &apart));
        // Touching the plane at an edge: inside the triangle, and outside it.
        let standing = tri([[0.2, 0.1, 0.0], [0.3, 0.2, 0.0], [0.25, 0.15, 1.0]]);
        assert!(triangles_meet(&a, &standing));
        let off = tri([[2.0, 0.1, 0.0], [2.3, 0.2, 0.0], [2.25, 0.15, 1.0]]);
        assert!(!triangles_meet(&a, &off));
    }

    #[test]
    fn a_strip_one_millimetre_along_with_a_picometre_of_twist_is_apart() {
        // Neighbours two stations apart in a strip 1.5 m from the origin whose lines are straight
        // within 1e-12 m: collinear bottom edges a millimetre apart do not meet.
        let a = tri([
            [1.476_187_635_734_169_2, 0.212_957_445_574_536_72, 0.010_276_255_173_613_434],
            [1.477_179_480_541_553, 0.212_957_445_574_536_72, 0.010_276_255_173_613_427],
            [1.474_812_368_541_124_3, 0.221_408_004_612_545_53, 0.009_044_785_667_020_449],
        ]);
        let b = tri([
            [1.478_171_325_348_936_8, 0.212_957_445_574_536_75, 0.010_276_255_173_613_438],
            [1.479_163_170_156_320_6, 0.212_957_445_573_569_4, 0.010_276_255_173_752_656],
            [1.476_799_267_948_597_7, 0.221_408_004_612_545_53, 0.009_044_785_667_020_449],
        ]);
        assert!(!triangles_meet(&a, &b));
        assert!(!triangles_meet(&b, &a));
        // Segments: crossing, touching at an end, collinear apart and overlapping.
        assert!(segments_meet_2d([0.0, 0.0], [1.0, 1.0], [0.0, 1.0], [1.0, 0.0]));
        assert!(segments_meet_2d([0.0, 0.0], [1.0, 0.0], [1.0, 0.0], [1.0, 1.0]));
        assert!(!segments_meet_2d([0.0, 0.0], [1.0, 0.0], [2.0, 0.0], [3.0, 0.0]));
        assert!(segments_meet_2d([0.0, 0.0], [2.0, 0.0], [1.0, 0.0], [3.0, 0.0]));
        assert!(!segments_meet_2d([0.0, 0.0], [1.0, 0.0], [2.0, -1.0], [2.0, 1.0]));
    }

    #[test]
    fn collinear_edges_far_from_the_origin_with_round_off_are_apart() {
        // Two needles of a flat strip 0.27 m from the origin whose top edges are collinear
        // within 4e-16 m (round-off), 0.27 mm apart along the strip: they do not meet.
        let a = tri([
            [0.243_972_238_125_187_17, 0.116_995_789_145_880_09, 0.038_273_274_897_839_45],
            [0.244_237_894_153_052_3, 0.116_995_789_145_880_09, 0.038_273_274_897_839_45],
            [0.248_149_041_474_492_63, 0.110_428_433_763_845_74, 0.032_768_973_119_133_286],
        ]);
        let b = tri([
            [0.244_503_550_180_917_46, 0.116_995_789_145_879_92, 0.038_273_274_897_839_32],
            [0.244_769_206_208_782_6, 0.116_995_789_145_880_05, 0.038_273_274_897_839_396],
            [0.248_679_322_984_121_43, 0.110_428_433_763_845_74, 0.032_768_973_119_133_286],
        ]);
        assert!(!triangles_meet(&a, &b));
        assert!(!triangles_meet(&b, &a));
    }

    #[test]
    fn neighbours_in_a_flat_strip_far_from_the_origin_are_apart() {
        // Two needles of one planar strip between parallel lines at 0.4 m from the origin, a
        // millimetre apart along the strip, with round-off of 1e-14 m on one corner (as a
        // computed surface has): they do not meet.
        let a = tri([
            [0.392_912_927_766_805_86, 0.070_998_740_913_924_39, 0.061_315_812_573_667_9],
            [0.393_896_589_061_876_75, 0.070_998_740_913_924_39, 0.061_315_812_573_667_9],
            [0.395_298_561_278_485_56, 0.063_905_645_650_306_8, 0.053_270_858_003_337_52],
        ]);
        let b = tri([
            [0.394_880_250_356_947_7, 0.070_998_740_913_924_39, 0.061_315_812_573_667_9],
            [0.395_863_911_652_018_56, 0.070_998_740_913_924_33, 0.061_315_812_573_667_85],
            [0.397_258_164_713_759_24, 0.063_905_645_574_384_62, 0.053_270_857_917_198_586],
        ]);
        assert!(!triangles_meet(&a, &b));
        assert!(!triangles_meet(&b, &a));
    }
}
