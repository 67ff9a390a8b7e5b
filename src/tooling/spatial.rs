//! The broad phase of the self-intersection check: a uniform grid of cells over the bounding
//! box, filled by a counting sort, yields the pairs of triangles whose boxes overlap; the narrow
//! phase ([`super::intersect`]) tests each pair once.

use super::intersect::{Facet, facets_meet};
use super::mesh::Mesh;
use super::vec3::P3;

/// Calls `f` with the dense index of every cell in the index box `r`.
fn for_cells(r: &[[usize; 3]; 2], dims: [usize; 3], mut f: impl FnMut(usize)) {
    for z in r[0][2]..=r[1][2] {
        for y in r[0][1]..=r[1][1] {
            for x in r[0][0]..=r[1][0] {
                f(x + dims[0] * (y + dims[1] * z));
            }
        }
    }
}

/// The first pair of triangles that meet, if any. Candidate pairs come from a uniform grid over
/// the bounding box whose cell, per axis, is twice the mean extent of the triangles (coarsened
/// until there are at most about four cells per triangle), filled by a counting sort; a pair is
/// tested once, in the lowest cell the two share. Triangles that would cover more than `BIG`
/// cells are tested against all others by box overlap instead.
pub(crate) fn find_self_intersection(mesh: &Mesh) -> Option<(usize, usize)> {
    const BIG: usize = 512;
    let n = mesh.len();
    let bbox = mesh.bounding_box()?;
    let boxes: Vec<[P3; 2]> = (0..n)
        .map(|t| {
            let [a, b, c] = mesh.corners(t);
            let lo = [0, 1, 2].map(|k| a[k].min(b[k]).min(c[k]));
            let hi = [0, 1, 2].map(|k| a[k].max(b[k]).max(c[k]));
            [lo, hi]
        })
        .collect();
    let ext = bbox.extent();
    let mut cell = [0.0; 3];
    for k in 0..3 {
        let mean = boxes.iter().map(|b| b[1][k] - b[0][k]).sum::<f64>() / n as f64;
        cell[k] = (2.0 * mean).max(ext[k] * 1e-6).max(f64::MIN_POSITIVE);
    }
    let limit = 4.0 * n as f64 + 64.0;
    let dims = loop {
        let dims = [0, 1, 2].map(|k| (ext[k] / cell[k]).floor() + 1.0);
        let total = dims[0] * dims[1] * dims[2];
        if total <= limit {
            break dims.map(|d| d as usize);
        }
        let grow = (total / limit).cbrt() * 1.01;
        cell = cell.map(|c| c * grow);
    };
    let index = |p: P3| -> [usize; 3] {
        [0, 1, 2].map(|k| (((p[k] - bbox.min[k]) / cell[k]) as usize).min(dims[k] - 1))
    };
    let dense = |c: [usize; 3]| c[0] + dims[0] * (c[1] + dims[1] * c[2]);
    let overlap = |i: usize, j: usize| {
        (0..3).all(|k| boxes[i][0][k] <= boxes[j][1][k] && boxes[j][0][k] <= boxes[i][1][k])
    };
    let ranges: Vec<[[usize; 3]; 2]> = boxes.iter().map(|b| [index(b[0]), index(b[1])]).collect();
    let covers = |r: &[[usize; 3]; 2]| (0..3).map(|k| r[1][k] - r[0][k] + 1).product::<usize>();
    // Counting sort of (cell, triangle) entries.
    let total = dims[0] * dims[1] * dims[2];
    let mut first = vec![0u32; total + 1];
    let mut big = Vec::new();
    for (t, r) in ranges.iter().enumerate() {
        if covers(r) > BIG {
            big.push(t);
        } else {
            for_cells(r, dims, |c| first[c + 1] += 1);
        }
    }
    for c in 0..total {
        first[c + 1] += first[c];
    }
    let mut fill = first.clone();
    let mut entries = vec![0u32; first[total] as usize];
    for (t, r) in ranges.iter().enumerate() {
        if covers(r) <= BIG {
            for_cells(r, dims, |c| {
                entries[fill[c] as usize] = t as u32;
                fill[c] += 1;
            });
        }
    }
    // Each cell's triangles gathered with their boxes and lowest cell indices, so the pair loop
    // reads contiguous memory.
    let mut local: Vec<(usize, [P3; 2], [usize; 3], Facet)> = Vec::new();
    for c in 0..total {
        let list = &entries[first[c] as usize..first[c + 1] as usize];
        if list.len() < 2 {
            continue;
        }
        local.clear();
        local.extend(list.iter().map(|&t| {
            (t as usize, boxes[t as usize], ranges[t as usize][0], Facet::new(mesh, t as usize))
        }));
        for (k, (ta, ba, la, fa)) in local.iter().enumerate() {
            for (tb, bb, lb, fb) in &local[k + 1..] {
                let (ta, tb) = (*ta, *tb);
                let apart = (0..3).any(|k| ba[0][k] > bb[1][k] || bb[0][k] > ba[1][k]);
                // Test the pair only in the lowest cell both cover.
                if apart || dense([0, 1, 2].map(|k| la[k].max(lb[k]))) != c {
                    continue;
                }
                if facets_meet(fa, fb) {
                    return Some((ta.min(tb), ta.max(tb)));
                }
            }
        }
    }
    for (k, &ta) in big.iter().enumerate() {
        for tb in 0..n {
            let earlier_big = big[..k].binary_search(&tb).is_ok();
            if tb != ta
                && !earlier_big
                && overlap(ta, tb)
                && facets_meet(&Facet::new(mesh, ta), &Facet::new(mesh, tb))
            {
                return Some((ta.min(tb), ta.max(tb)));
            }
        }
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::tooling::intersect::pair_meets;

    #[test]
    fn the_grid_finds_what_all_pairs_find() {
        // Seeded random triangle soups: the grid search must agree with testing every pair.
        let mut seed = 0x2545_f491_4f6c_dd1du64;
        let mut rnd = || {
            seed ^= seed << 13;
            seed ^= seed >> 7;
            seed ^= seed << 17;
            (seed >> 11) as f64 / (1u64 << 53) as f64
        };
        let mut meeting = 0;
        for trial in 0..40 {
            let mut m = Mesh::new();
            let size = 0.02 + 0.1 * (trial % 5) as f64 / 5.0;
            for _ in 0..60 {
                let c = [rnd(), rnd(), rnd()];
                let base = m.vertices.len() as u32;
                for _ in 0..3 {
                    m.push_vertex([0, 1, 2].map(|k| c[k] + size * (rnd() - 0.5)));
                }
                m.triangles.push([base, base + 1, base + 2]);
            }
            let brute = (0..m.len())
                .flat_map(|i| (i + 1..m.len()).map(move |j| (i, j)))
                .any(|(i, j)| pair_meets(&m, i, j));
            assert_eq!(find_self_intersection(&m).is_some(), brute, "trial {trial}");
            meeting += usize::from(brute);
        }
        // Both outcomes must occur, or the comparison proves little.
        assert!(meeting > 0 && meeting < 40, "{meeting} of 40 soups intersect");
    }
}
