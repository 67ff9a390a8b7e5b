//! Collapsing the edges a loft makes where its surface closes up: a blunt trailing edge whose
//! base shrinks to nothing along the span (a round root turning into a flat-backed section, or a
//! blunt section turning sharp). The loft keeps one grid for the whole span, so at a station
//! where the base has no length the lines of the base meet: their ring points coincide and the
//! quads between them have no area.
//!
//! Every edge shorter than the collapse length (a fiftieth of the chordal tolerance, so the
//! shape moves by far less than the tolerance, and long enough that the points left stay apart
//! when written in single precision) is contracted: its end points become one vertex (the one
//! made first, so ring points stay exactly on their trim surface), triangles left with a repeated
//! vertex are dropped, and vertices no triangle uses any more are removed. Contracting an edge
//! of a closed surface keeps it closed; where a whole closing segment collapses, the strip
//! between two collapsed rings vanishes and its neighbours meet along the single line left, and
//! between a collapsed ring and an open one the base becomes a fan.

use crate::mesh::Mesh;
use crate::mesh::vec3;

/// Fraction of the chordal tolerance below which an edge is contracted.
pub(crate) const COLLAPSE_FRACTION: f64 = 0.02;

/// What [`collapse_short_edges`] did, for the caller's index lists.
pub(crate) struct Collapse {
    /// New index of every old vertex (of the vertex it was joined to).
    pub vertex: Vec<u32>,
    /// Whether each old triangle was kept.
    pub kept: Vec<bool>,
}

impl Collapse {
    /// The old index list `v` in new indices.
    pub(crate) fn map(&self, v: &[u32]) -> Vec<u32> {
        v.iter().map(|&i| self.vertex[i as usize]).collect()
    }

    /// The new range of the triangles that were in the old range `r`.
    pub(crate) fn range(&self, r: &std::ops::Range<usize>) -> std::ops::Range<usize> {
        let count =
            |end: usize| self.kept[..end.min(self.kept.len())].iter().filter(|&&k| k).count();
        count(r.start)..count(r.end)
    }
}

fn find(parent: &mut [u32], mut i: u32) -> u32 {
    while parent[i as usize] != i {
        let up = parent[parent[i as usize] as usize];
        parent[i as usize] = up;
        i = up;
    }
    i
}

/// Contracts every edge of `mesh` shorter than `length` (see the module docs). Returns `None`,
/// leaving the mesh untouched, when there is none.
pub(crate) fn collapse_short_edges(mesh: &mut Mesh, length: f64) -> Option<Collapse> {
    let n = mesh.vertices.len();
    let mut parent: Vec<u32> = (0..n as u32).collect();
    let mut any = false;
    for t in &mesh.triangles {
        for k in 0..3 {
            let (a, b) = (t[k], t[(k + 1) % 3]);
            if a != b && vec3::dist(mesh.vertices[a as usize], mesh.vertices[b as usize]) < length {
                let (ra, rb) = (find(&mut parent, a), find(&mut parent, b));
                if ra != rb {
                    // The earlier vertex stands for the group.
                    let (lo, hi) = if ra < rb { (ra, rb) } else { (rb, ra) };
                    parent[hi as usize] = lo;
                    any = true;
                }
            }
        }
    }
    if !any {
        return None;
    }
    let root: Vec<u32> = (0..n as u32).map(|i| find(&mut parent, i)).collect();
    let mut kept = Vec::with_capacity(mesh.triangles.len());
    let mut triangles = Vec::with_capacity(mesh.triangles.len());
    for t in &mesh.triangles {
        let m = t.map(|i| root[i as usize]);
        let keep = m[0] != m[1] && m[1] != m[2] && m[2] != m[0];
        kept.push(keep);
        if keep {
            triangles.push(m);
        }
    }
    // Keep the vertex standing for each group (every vertex not joined to an earlier one), in
    // order, so that index lists of the caller stay valid.
    let mut new_index = vec![u32::MAX; n];
    let mut vertices = Vec::with_capacity(n);
    for i in 0..n {
        if root[i] == i as u32 {
            new_index[i] = vertices.len() as u32;
            vertices.push(mesh.vertices[i]);
        }
    }
    let vertex: Vec<u32> = (0..n).map(|i| new_index[root[i] as usize]).collect();
    mesh.triangles = triangles.into_iter().map(|t| t.map(|i| new_index[i as usize])).collect();
    mesh.vertices = vertices;
    Some(Collapse { vertex, kept })
}
