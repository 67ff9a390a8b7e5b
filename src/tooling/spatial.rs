//! The broad phase of the self-intersection check: a grid of cells sized to the triangles, kept
//! sparse by hashing the occupied cells into a table that a counting sort fills, yields the pairs
//! of triangles whose boxes overlap; the narrow phase ([`super::intersect`]) tests each pair.
//!
//! A grid over the bounding box of a thin shell (a blade skin, a mould cavity) is almost all
//! empty: sized to its box, its cells must grow until each holds many triangles, and the pairs
//! grow faster than the triangles. Hashed, the cells stay the size of the triangles whatever the
//! shape, and the work grows with the count of triangles.

use super::intersect::{Facet, facets_meet};
use super::mesh::Mesh;
use super::vec3::P3;

/// Triangles that would cover more cells than this are tested against all others by box overlap.
const BIG: usize = 512;

/// Cell entries per triangle on average beyond which the cells are made larger.
const MEAN_COVER: f64 = 8.0;

/// A cell's indices along x, y and z.
type Cell = [u32; 3];

/// The slot of a cell in a hash table of `1 << bits` slots (multiplicative hashing).
#[inline]
fn slot(c: Cell, bits: u32) -> usize {
    let key = u64::from(c[0]) | (u64::from(c[1]) << 21) | (u64::from(c[2]) << 42);
    (key.wrapping_mul(0x9e37_79b9_7f4a_7c15) >> (64 - bits)) as usize
}

/// Calls `f` with every cell of the index box `r`.
#[inline]
fn for_cells(r: &[Cell; 2], mut f: impl FnMut(Cell)) {
    for z in r[0][2]..=r[1][2] {
        for y in r[0][1]..=r[1][1] {
            for x in r[0][0]..=r[1][0] {
                f([x, y, z]);
            }
        }
    }
}

fn covers(r: &[Cell; 2]) -> usize {
    (0..3).map(|k| (r[1][k] - r[0][k]) as usize + 1).product()
}

fn overlap(a: &[P3; 2], b: &[P3; 2]) -> bool {
    (0..3).all(|k| a[0][k] <= b[1][k] && b[0][k] <= a[1][k])
}

/// The first pair of triangles that meet, if any. Each triangle's data are computed once.
/// Candidate pairs come from a grid whose cell, per axis, is twice the mean extent of the
/// triangles along it (made larger only if the triangles would cover more than eight cells each
/// on average), its occupied cells hashed into a table of slots filled by a counting sort. A pair
/// whose boxes overlap shares its lowest common cell, so it is tested in that cell's slot and no
/// other (two cells in one slot cost only candidates rejected by their boxes). Triangles that
/// would cover more than `BIG` cells are tested against all others by box overlap instead.
pub(crate) fn find_self_intersection(mesh: &Mesh) -> Option<(usize, usize)> {
    let n = mesh.len();
    let bbox = mesh.bounding_box()?;
    let facets: Vec<Facet> = (0..n).map(|t| Facet::new(mesh, t)).collect();
    let boxes: Vec<[P3; 2]> = facets.iter().map(Facet::bounds).collect();
    let ext = bbox.extent();
    let mut cell = [0.0; 3];
    for k in 0..3 {
        let mean = boxes.iter().map(|b| b[1][k] - b[0][k]).sum::<f64>() / n as f64;
        // At most about a million cells along an axis, so that indices fit their 21 bits.
        cell[k] = (2.0 * mean).max(ext[k] * 1e-6).max(f64::MIN_POSITIVE);
    }
    let range_of = |b: &[P3; 2], cell: &[f64; 3]| -> [Cell; 2] {
        let index = |p: P3| {
            [0, 1, 2].map(|k| {
                let i = ((p[k] - bbox.min[k]) / cell[k]).floor();
                i.clamp(0.0, f64::from((1u32 << 21) - 1)) as u32
            })
        };
        [index(b[0]), index(b[1])]
    };
    let mut ranges: Vec<[Cell; 2]>;
    loop {
        ranges = boxes.iter().map(|b| range_of(b, &cell)).collect();
        let entries: usize = ranges.iter().map(covers).filter(|&c| c <= BIG).sum();
        if entries as f64 <= MEAN_COVER * n as f64 {
            break;
        }
        let grow = (entries as f64 / (MEAN_COVER * n as f64)).cbrt() * 1.01;
        cell = cell.map(|c| c * grow);
    }
    // Counting sort of (slot, triangle) entries.
    let entries: usize = ranges.iter().map(covers).filter(|&c| c <= BIG).sum();
    let bits = (entries.max(16).next_power_of_two().trailing_zeros() + 1).min(40);
    let slots = 1usize << bits;
    let mut first = vec![0u32; slots + 1];
    let mut big = Vec::new();
    for (t, r) in ranges.iter().enumerate() {
        if covers(r) > BIG {
            big.push(t);
        } else {
            for_cells(r, |c| first[slot(c, bits) + 1] += 1);
        }
    }
    for s in 0..slots {
        first[s + 1] += first[s];
    }
    let mut fill = first.clone();
    let mut entry = vec![0u32; first[slots] as usize];
    for (t, r) in ranges.iter().enumerate() {
        if covers(r) <= BIG {
            for_cells(r, |c| {
                let s = slot(c, bits);
                entry[fill[s] as usize] = t as u32;
                fill[s] += 1;
            });
        }
    }
    drop(fill);
    for s in 0..slots {
        let list = &entry[first[s] as usize..first[s + 1] as usize];
        if list.len() < 2 {
            continue;
        }
        for (k, &ta) in list.iter().enumerate() {
            let ta = ta as usize;
            let (ba, la) = (&boxes[ta], ranges[ta][0]);
            for &tb in &list[k + 1..] {
                let tb = tb as usize;
                // A triangle can fall in one slot by two cells.
                if tb == ta || !overlap(ba, &boxes[tb]) {
                    continue;
                }
                // Test the pair only in the slot of the lowest cell both cover.
                let lb = ranges[tb][0];
                if slot([0, 1, 2].map(|i| la[i].max(lb[i])), bits) != s {
                    continue;
                }
                if facets_meet(&facets[ta], &facets[tb]) {
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
                && overlap(&boxes[ta], &boxes[tb])
                && facets_meet(&facets[ta], &facets[tb])
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

    /// Two parallel sheets 1 m by 0.1 m, 1 mm apart, of `nx` by `ny` squares each split in two:
    /// a thin shell whose bounding box is almost all empty.
    fn slab(nx: usize, ny: usize) -> Mesh {
        let mut m = Mesh::new();
        for z in [0.0005, -0.0005] {
            let base = m.vertices.len() as u32;
            for j in 0..=ny {
                for i in 0..=nx {
                    m.push_vertex([i as f64 / nx as f64, 0.1 * j as f64 / ny as f64, z]);
                }
            }
            let at = |i: usize, j: usize| base + (i + j * (nx + 1)) as u32;
            for j in 0..ny {
                for i in 0..nx {
                    m.triangles.push([at(i, j), at(i + 1, j), at(i + 1, j + 1)]);
                    m.triangles.push([at(i, j), at(i + 1, j + 1), at(i, j + 1)]);
                }
            }
        }
        m
    }

    fn brute(m: &Mesh) -> bool {
        (0..m.len())
            .flat_map(|i| (i + 1..m.len()).map(move |j| (i, j)))
            .any(|(i, j)| pair_meets(m, i, j))
    }

    #[test]
    fn a_thin_shell_with_a_dent_and_large_facets_agrees_with_all_pairs() {
        // Apart as built; a vertex of the upper sheet pushed through the lower one; a facet that
        // covers the whole slab just above it (apart) and one that cuts through it (meets): the
        // grid search agrees with testing every pair in each case.
        let plain = slab(40, 6);
        assert!(!brute(&plain));
        assert_eq!(find_self_intersection(&plain), None);

        let mut dented = slab(40, 6);
        dented.vertices[20 + 3 * 41][2] = -0.002;
        assert!(brute(&dented));
        let found = find_self_intersection(&dented);
        assert!(found.is_some_and(|(a, b)| pair_meets(&dented, a, b)), "{found:?}");

        let mut over = slab(40, 6);
        let base = over.vertices.len() as u32;
        for p in [[-0.1, -0.1, 0.001], [1.1, -0.1, 0.001], [0.5, 0.3, 0.001]] {
            over.push_vertex(p);
        }
        over.triangles.push([base, base + 1, base + 2]);
        assert!(!brute(&over));
        assert_eq!(find_self_intersection(&over), None);

        let mut cut = over.clone();
        let b = base as usize;
        cut.vertices[b][2] = 0.01;
        cut.vertices[b + 1][2] = 0.01;
        cut.vertices[b + 2] = [0.5, 0.2, -0.01];
        assert!(brute(&cut));
        let found = find_self_intersection(&cut);
        assert!(found.is_some_and(|(a, b)| pair_meets(&cut, a, b)), "{found:?}");
    }
}
