//! The indexed triangle mesh and its integral properties.
//!
//! Volume by the divergence theorem: for a closed surface whose triangles wind counter-clockwise
//! seen from outside, `V = (1/6) Σ (a − o) · ((b − o) × (c − o))`, the sum of the signed volumes
//! of the tetrahedra joining each facet to a reference point `o` (the centre of the bounding box,
//! which keeps the terms small and the sum accurate).

use super::word_hash::WordMap;

use super::error::MeshError;
use super::vec3::{self, P3};
use crate::units::Angle;

/// An indexed triangle mesh: shared vertices and triangles of vertex indices.
///
/// Coordinates are in the rotor frame (x along the pitch axis from root to tip, origin on the
/// rotor axis), metres. A triangle `[a, b, c]` faces the side from which `a → b → c` runs
/// counter-clockwise: its normal is `(b − a) × (c − a)`. A closed solid's triangles face outward.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Mesh {
    /// Vertex positions, rotor frame, m.
    pub vertices: Vec<[f64; 3]>,
    /// Triangles as indices into `vertices`.
    pub triangles: Vec<[u32; 3]>,
}

/// An axis-aligned bounding box, rotor frame, m.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BoundingBox {
    /// Least x, y, z, m.
    pub min: [f64; 3],
    /// Greatest x, y, z, m.
    pub max: [f64; 3],
}

impl BoundingBox {
    /// Extent along x, y, z, m.
    pub fn extent(&self) -> [f64; 3] {
        vec3::sub(self.max, self.min)
    }

    /// Length of the diagonal, m.
    pub fn diagonal(&self) -> f64 {
        vec3::norm(self.extent())
    }

    /// Centre, m.
    pub fn centre(&self) -> [f64; 3] {
        vec3::scale(vec3::add(self.min, self.max), 0.5)
    }
}

impl Mesh {
    /// An empty mesh.
    pub fn new() -> Self {
        Mesh::default()
    }

    /// Whether `other` is this mesh to the bit: the same triangles, and vertices whose
    /// coordinates have the same bits (so `-0.0` differs from `0.0`, and a NaN equals itself).
    pub fn same_bits(&self, other: &Mesh) -> bool {
        let bits = |v: &[f64; 3]| v.map(f64::to_bits);
        self.triangles == other.triangles
            && self.vertices.len() == other.vertices.len()
            && self.vertices.iter().zip(&other.vertices).all(|(a, b)| bits(a) == bits(b))
    }

    /// Number of triangles.
    pub fn len(&self) -> usize {
        self.triangles.len()
    }

    /// Whether the mesh has no triangles.
    pub fn is_empty(&self) -> bool {
        self.triangles.is_empty()
    }

    /// Adds a vertex and returns its index.
    pub fn push_vertex(&mut self, p: [f64; 3]) -> u32 {
        self.vertices.push(p);
        (self.vertices.len() - 1) as u32
    }

    /// The three corners of triangle `t`, m.
    pub fn corners(&self, t: usize) -> [[f64; 3]; 3] {
        let [a, b, c] = self.triangles[t];
        [self.vertices[a as usize], self.vertices[b as usize], self.vertices[c as usize]]
    }

    /// Centroid of triangle `t`, m.
    pub fn triangle_centroid(&self, t: usize) -> [f64; 3] {
        let [a, b, c] = self.corners(t);
        vec3::scale(vec3::add(vec3::add(a, b), c), 1.0 / 3.0)
    }

    /// Unit normal of triangle `t` (zero for a degenerate triangle).
    pub fn triangle_normal(&self, t: usize) -> [f64; 3] {
        let [a, b, c] = self.corners(t);
        let n = vec3::area_vector(a, b, c);
        let len = vec3::norm(n);
        if len > 0.0 { vec3::scale(n, 1.0 / len) } else { [0.0; 3] }
    }

    /// Area of triangle `t`, m².
    pub fn triangle_area(&self, t: usize) -> f64 {
        let [a, b, c] = self.corners(t);
        0.5 * vec3::norm(vec3::area_vector(a, b, c))
    }

    /// Signed volume enclosed, m³ (divergence theorem). Positive for a closed surface facing
    /// outward; meaningless for an open one.
    pub fn signed_volume(&self) -> f64 {
        let o = self.bounding_box().map(|b| b.centre()).unwrap_or([0.0; 3]);
        self.signed_volume_about(o)
    }

    fn signed_volume_about(&self, o: P3) -> f64 {
        let mut v = 0.0;
        for t in 0..self.triangles.len() {
            let [a, b, c] = self.corners(t);
            let (a, b, c) = (vec3::sub(a, o), vec3::sub(b, o), vec3::sub(c, o));
            v += vec3::dot(a, vec3::cross(b, c));
        }
        v / 6.0
    }

    /// Surface area, m².
    pub fn area(&self) -> f64 {
        (0..self.triangles.len()).map(|t| self.triangle_area(t)).sum()
    }

    /// The bounding box of the vertices that triangles use; `None` for a mesh without
    /// triangles.
    pub fn bounding_box(&self) -> Option<BoundingBox> {
        let mut it = self.triangles.iter().flatten().map(|&i| self.vertices[i as usize]);
        let first = it.next()?;
        let (mut min, mut max) = (first, first);
        for p in it {
            for k in 0..3 {
                min[k] = min[k].min(p[k]);
                max[k] = max[k].max(p[k]);
            }
        }
        Some(BoundingBox { min, max })
    }

    /// Centroid of the enclosed volume, m (closed meshes); `None` when the volume is zero.
    pub fn centroid(&self) -> Option<[f64; 3]> {
        let o = self.bounding_box()?.centre();
        let mut v = 0.0;
        let mut m = [0.0; 3];
        for t in 0..self.triangles.len() {
            let [a, b, c] = self.corners(t);
            let (a, b, c) = (vec3::sub(a, o), vec3::sub(b, o), vec3::sub(c, o));
            let vt = vec3::dot(a, vec3::cross(b, c)) / 6.0;
            v += vt;
            // Centroid of the tetrahedron (o, a, b, c) relative to o is (a + b + c) / 4.
            m = vec3::add(m, vec3::scale(vec3::add(vec3::add(a, b), c), vt / 4.0));
        }
        (v != 0.0).then(|| vec3::add(o, vec3::scale(m, 1.0 / v)))
    }

    /// Appends `other`'s vertices and triangles (renumbered) to this mesh.
    pub fn merge(&mut self, other: &Mesh) {
        let offset = self.vertices.len() as u32;
        self.vertices.extend_from_slice(&other.vertices);
        self.triangles.extend(other.triangles.iter().map(|t| t.map(|i| i + offset)));
    }

    /// Turns every triangle over (a closed surface then faces the other way).
    pub fn flip(&mut self) {
        for t in &mut self.triangles {
            t.swap(1, 2);
        }
    }

    /// Moves every vertex by `f`. A map that reverses handedness (a mirror) turns the facets
    /// inside out; follow it by [`Mesh::flip`].
    pub fn transform(&mut self, mut f: impl FnMut([f64; 3]) -> [f64; 3]) {
        for p in &mut self.vertices {
            *p = f(*p);
        }
    }

    /// Turns the mesh about the x axis (the pitch axis) by `angle`, right-handed: +y towards +z.
    pub fn rotate_x(&mut self, angle: Angle) {
        let (s, c) = angle.rad().sin_cos();
        self.transform(|[x, y, z]| [x, c * y - s * z, s * y + c * z]);
    }

    /// Scales about the origin by `factor` (positive).
    pub fn scale(&mut self, factor: f64) {
        self.transform(|p| vec3::scale(p, factor));
    }

    /// Moves the mesh by `d`, m.
    pub fn translate(&mut self, d: [f64; 3]) {
        self.transform(|p| vec3::add(p, d));
    }

    /// Merges vertices closer than `tolerance` (m) into one, drops triangles that collapse and
    /// vertices no triangle uses, and returns how many vertices were removed. Vertices are
    /// bucketed in a uniform grid of cell `tolerance`, so the cost is linear.
    pub fn weld(&mut self, tolerance: f64) -> Result<usize, MeshError> {
        if !(tolerance.is_finite() && tolerance >= 0.0) {
            return Err(MeshError::Parameter {
                name: "weld tolerance".into(),
                value: tolerance,
                expected: "a finite length of zero or more",
            });
        }
        let cell = if tolerance > 0.0 { tolerance } else { f64::MIN_POSITIVE };
        let key = |p: P3| p.map(|c| (c / cell).floor() as i64);
        let mut buckets: WordMap<[i64; 3], Vec<u32>> = WordMap::default();
        let mut kept: Vec<[f64; 3]> = Vec::new();
        let mut map = vec![0u32; self.vertices.len()];
        for (i, &p) in self.vertices.iter().enumerate() {
            let k = key(p);
            let mut found = None;
            'search: for dx in -1..=1 {
                for dy in -1..=1 {
                    for dz in -1..=1 {
                        if let Some(list) = buckets.get(&[k[0] + dx, k[1] + dy, k[2] + dz]) {
                            for &j in list {
                                if vec3::dist(kept[j as usize], p) <= tolerance {
                                    found = Some(j);
                                    break 'search;
                                }
                            }
                        }
                    }
                }
            }
            map[i] = found.unwrap_or_else(|| {
                kept.push(p);
                let j = (kept.len() - 1) as u32;
                buckets.entry(k).or_default().push(j);
                j
            });
        }
        let triangles: Vec<[u32; 3]> = self
            .triangles
            .iter()
            .map(|t| t.map(|i| map[i as usize]))
            .filter(|[a, b, c]| a != b && b != c && c != a)
            .collect();
        // Drop vertices that no remaining triangle uses.
        let mut used = vec![u32::MAX; kept.len()];
        let mut vertices = Vec::with_capacity(kept.len());
        for &i in triangles.iter().flatten() {
            if used[i as usize] == u32::MAX {
                used[i as usize] = vertices.len() as u32;
                vertices.push(kept[i as usize]);
            }
        }
        let removed = self.vertices.len() - vertices.len();
        self.triangles = triangles.into_iter().map(|t| t.map(|i| used[i as usize])).collect();
        self.vertices = vertices;
        Ok(removed)
    }
}

/// The half-edges of `mesh` bucketed by their lower vertex (a counting sort over `nv` vertices,
/// which must exceed every index used): `slots[first[v]..first[v + 1]]` holds `(other vertex,
/// half-edge 3 t + k)` for each edge from corner `k` to corner `k + 1` of triangle `t` whose lower
/// vertex is `v`. No hashing and no allocation per edge.
pub(crate) fn half_edges_by_lower_vertex(mesh: &Mesh, nv: usize) -> (Vec<u32>, Vec<(u32, u32)>) {
    let mut first = vec![0u32; nv + 1];
    for tri in &mesh.triangles {
        for k in 0..3 {
            first[tri[k].min(tri[(k + 1) % 3]) as usize + 1] += 1;
        }
    }
    for v in 0..nv {
        first[v + 1] += first[v];
    }
    let mut fill = first.clone();
    let mut slots = vec![(0u32, 0u32); 3 * mesh.len()];
    for (t, tri) in mesh.triangles.iter().enumerate() {
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            let lo = a.min(b) as usize;
            slots[fill[lo] as usize] = (a.max(b), (3 * t + k) as u32);
            fill[lo] += 1;
        }
    }
    (first, slots)
}

/// A closed axis-aligned box as a mesh of 12 outward-facing triangles, m.
pub fn box_mesh(min: [f64; 3], max: [f64; 3]) -> Mesh {
    let v = |i: usize| {
        [
            if i & 1 == 0 { min[0] } else { max[0] },
            if i & 2 == 0 { min[1] } else { max[1] },
            if i & 4 == 0 { min[2] } else { max[2] },
        ]
    };
    let vertices = (0..8).map(v).collect();
    // Faces as quads (counter-clockwise seen from outside), split into two triangles each.
    let quads: [[u32; 4]; 6] =
        [[0, 4, 6, 2], [1, 3, 7, 5], [0, 1, 5, 4], [2, 6, 7, 3], [0, 2, 3, 1], [4, 5, 7, 6]];
    let triangles = quads.iter().flat_map(|&[a, b, c, d]| [[a, b, c], [a, c, d]]).collect();
    Mesh { vertices, triangles }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn same_bits_tells_apart_what_equality_of_values_would_not() {
        let a = box_mesh([0.0; 3], [1.0; 3]);
        assert!(a.same_bits(&a.clone()));
        // -0.0 == 0.0 as values, but not as bits.
        let mut b = a.clone();
        let k = b.vertices.iter().position(|v| v[0] == 0.0).expect("a corner at x = 0");
        b.vertices[k][0] = -0.0;
        assert!(b.vertices[k][0] == 0.0 && !a.same_bits(&b));
        // The same corners in another triangle order, or one vertex more, differ.
        let mut c = a.clone();
        c.triangles.swap(0, 1);
        assert!(!a.same_bits(&c));
        let mut d = a.clone();
        d.vertices.push([9.0; 3]);
        assert!(!a.same_bits(&d));
    }

    #[test]
    fn box_volume_area_and_centroid_are_exact() {
        // A box a x b x c: volume abc, area 2(ab + bc + ca), centroid at its centre.
        let m = box_mesh([1.0, -2.0, 0.5], [3.0, 1.0, 1.5]);
        assert!((m.signed_volume() - 6.0).abs() < 1e-12);
        assert!((m.area() - 2.0 * (6.0 + 3.0 + 2.0)).abs() < 1e-12);
        let c = m.centroid().unwrap();
        for (got, want) in c.iter().zip([2.0, -0.5, 1.0]) {
            assert!((got - want).abs() < 1e-12);
        }
    }

    #[test]
    fn flipping_negates_the_volume_and_rotation_keeps_it() {
        let mut m = box_mesh([0.0; 3], [1.0, 2.0, 3.0]);
        m.rotate_x(Angle::from_deg(37.0));
        assert!((m.signed_volume() - 6.0).abs() < 1e-12);
        m.flip();
        assert!((m.signed_volume() + 6.0).abs() < 1e-12);
    }

    #[test]
    fn welding_joins_coincident_corners() {
        let a = box_mesh([0.0; 3], [1.0; 3]);
        let mut soup = Mesh::new();
        for t in 0..a.len() {
            let base = soup.vertices.len() as u32;
            for p in a.corners(t) {
                soup.push_vertex(vec3::add(p, [1e-12, 0.0, 0.0]));
            }
            soup.triangles.push([base, base + 1, base + 2]);
        }
        let removed = soup.weld(1e-9).unwrap();
        assert_eq!(removed, 36 - 8);
        assert_eq!(soup.vertices.len(), 8);
        assert!((soup.signed_volume() - 1.0).abs() < 1e-9);
        assert!(soup.weld(f64::NAN).is_err());
    }
}
