//! Mesh housekeeping for assembled parts: facet adjacency across shared edges, consistent
//! orientation of each connected shell (breadth-first, turning a neighbour that runs a shared
//! edge the same way), outward facing by the sign of the enclosed volume, and dropping unused
//! vertices. An assembled surface that is not a closed 2-manifold is left for [`check_solid`]
//! to refuse with its place.
//!
//! [`check_solid`]: super::check_solid

use super::triangles::{Mesh, half_edges_by_lower_vertex};
use super::vec3;

/// For every facet, its neighbours across its three edges (`u32::MAX` where an edge does not
/// have exactly two facets), with whether the neighbour runs the shared edge the same way.
///
/// Half-edges are bucketed by their lower vertex (a counting sort) and grouped by the other
/// within each bucket: no hashing and no allocation per edge.
pub(crate) fn neighbours(mesh: &Mesh) -> Vec<[(u32, bool); 3]> {
    let nv = mesh.triangles.iter().flatten().map(|&i| i as usize + 1).max().unwrap_or(0);
    // (other vertex, half-edge `3 t + k`) in the bucket of the lower vertex.
    let (first, mut uses) = half_edges_by_lower_vertex(mesh, nv);
    let runs_up = |h: u32| {
        let tri = mesh.triangles[h as usize / 3];
        let k = h as usize % 3;
        tri[k] < tri[(k + 1) % 3]
    };
    let mut out = vec![[(u32::MAX, false); 3]; mesh.len()];
    for lo in 0..nv {
        let bucket = &mut uses[first[lo] as usize..first[lo + 1] as usize];
        bucket.sort_unstable();
        let mut i = 0;
        while i < bucket.len() {
            let mut j = i + 1;
            while j < bucket.len() && bucket[j].0 == bucket[i].0 {
                j += 1;
            }
            if j - i == 2 {
                let (h0, h1) = (bucket[i].1, bucket[i + 1].1);
                let same = runs_up(h0) == runs_up(h1);
                out[h0 as usize / 3][h0 as usize % 3] = (h1 / 3, same);
                out[h1 as usize / 3][h1 as usize % 3] = (h0 / 3, same);
            }
            i = j;
        }
    }
    out
}

/// Turns facets so that each connected shell is consistently oriented and encloses a positive
/// volume (faces outward).
pub(crate) fn orient_outward(mesh: &mut Mesh) {
    let adj = neighbours(mesh);
    let n = mesh.len();
    let mut shell = vec![u32::MAX; n];
    let mut flip = vec![false; n];
    let mut count = 0u32;
    let mut stack = Vec::new();
    for seed in 0..n {
        if shell[seed] != u32::MAX {
            continue;
        }
        shell[seed] = count;
        stack.push(seed);
        while let Some(t) = stack.pop() {
            for &(nb, same) in &adj[t] {
                if nb == u32::MAX || shell[nb as usize] != u32::MAX {
                    continue;
                }
                let nb = nb as usize;
                shell[nb] = count;
                // Consistent neighbours run a shared edge in opposite directions.
                flip[nb] = flip[t] ^ same;
                stack.push(nb);
            }
        }
        count += 1;
    }
    for (t, tri) in mesh.triangles.iter_mut().enumerate() {
        if flip[t] {
            tri.swap(1, 2);
        }
    }
    let o = mesh.bounding_box().map(|b| b.centre()).unwrap_or([0.0; 3]);
    let mut volume = vec![0.0; count as usize];
    for t in 0..n {
        let [a, b, c] = mesh.corners(t).map(|p| vec3::sub(p, o));
        volume[shell[t] as usize] += vec3::dot(a, vec3::cross(b, c));
    }
    for (t, tri) in mesh.triangles.iter_mut().enumerate() {
        if volume[shell[t] as usize] < 0.0 {
            tri.swap(1, 2);
        }
    }
}

/// Drops the vertices no facet uses, renumbering the facets.
pub(crate) fn compact(mesh: &mut Mesh) {
    let mut map = vec![u32::MAX; mesh.vertices.len()];
    let mut vertices = Vec::with_capacity(mesh.vertices.len());
    for tri in &mut mesh.triangles {
        for i in tri.iter_mut() {
            if map[*i as usize] == u32::MAX {
                map[*i as usize] = vertices.len() as u32;
                vertices.push(mesh.vertices[*i as usize]);
            }
            *i = map[*i as usize];
        }
    }
    mesh.vertices = vertices;
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::mesh::box_mesh;

    #[test]
    fn a_box_with_scrambled_facets_is_turned_outward() {
        // A closed box, every other facet turned over and the whole inside out: orientation
        // restores the volume abc of the box (and the check passes).
        let mut m = box_mesh([0.0; 3], [1.0, 2.0, 3.0]);
        for (i, t) in m.triangles.iter_mut().enumerate() {
            if i % 2 == 0 {
                t.swap(0, 1);
            }
        }
        m.vertices.push([9.0; 3]);
        orient_outward(&mut m);
        compact(&mut m);
        assert_eq!(m.vertices.len(), 8);
        assert!((m.signed_volume() - 6.0).abs() < 1e-12);
        crate::mesh::check_solid(&m, "box", &crate::mesh::CheckParams::default()).unwrap();
    }
}
