//! The broad phase of the self-intersection check: a grid of cells sized to the triangles, kept
//! sparse by hashing the occupied cells into a table that a counting sort fills, yields the pairs
//! of triangles whose boxes overlap; the narrow phase ([`super::intersect`]) tests each pair.
//!
//! A grid over the bounding box of a thin shell (a blade skin, a mould cavity) is almost all
//! empty: sized to its box, its cells must grow until each holds many triangles, and the pairs
//! grow faster than the triangles. Hashed, the cells stay the size of the triangles whatever the
//! shape, and the work grows with the count of triangles.

use std::sync::atomic::{AtomicBool, Ordering};

use super::intersect::{Facet, facets_meet};
use super::triangles::Mesh;
use super::vec3::P3;
use crate::parallel::filled;

/// Meshes of at least this many triangles are swept on all cores (below it, a thread costs more
/// than it saves).
const PARALLEL_FROM: usize = 50_000;

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

/// Calls `f` with every cell of the index box `r`, in the reverse of [`for_cells`]' order.
#[inline]
fn for_cells_rev(r: &[Cell; 2], mut f: impl FnMut(Cell)) {
    for z in (r[0][2]..=r[1][2]).rev() {
        for y in (r[0][1]..=r[1][1]).rev() {
            for x in (r[0][0]..=r[1][0]).rev() {
                f([x, y, z]);
            }
        }
    }
}

fn covers(r: &[Cell; 2]) -> usize {
    (0..3).map(|k| (r[1][k] - r[0][k]) as usize + 1).product()
}

/// What the sweep of a slot reads of a triangle, in one cache line: its box, its lowest cell
/// and its index (gathered from one place, with no cell recomputed).
#[derive(Debug, Clone, Copy)]
#[repr(align(64))]
struct Entry {
    b: [P3; 2],
    low: Cell,
    t: u32,
}

/// The axis along which the boxes' least coordinates spread most against the boxes' own mean
/// extent: sorted along it, the fewest boxes overlap.
fn sweep_axis(local: &[Entry]) -> usize {
    let mut best = (0, f64::NEG_INFINITY);
    for k in 0..3 {
        let (mut lo, mut hi, mut extent) = (f64::INFINITY, f64::NEG_INFINITY, 0.0);
        for e in local {
            lo = lo.min(e.b[0][k]);
            hi = hi.max(e.b[0][k]);
            extent += e.b[1][k] - e.b[0][k];
        }
        let ratio = (hi - lo) / (extent / local.len() as f64).max(f64::MIN_POSITIVE);
        if ratio > best.1 {
            best = (k, ratio);
        }
    }
    best.0
}

#[inline]
fn overlap(a: &[P3; 2], b: &[P3; 2]) -> bool {
    a[0][0] <= b[1][0]
        && b[0][0] <= a[1][0]
        && a[0][1] <= b[1][1]
        && b[0][1] <= a[1][1]
        && a[0][2] <= b[1][2]
        && b[0][2] <= a[1][2]
}

/// A hashed grid: each triangle's cells, and the triangles of each slot (a counting sort).
struct Grid {
    bits: u32,
    /// Each triangle's index box of cells.
    ranges: Vec<[Cell; 2]>,
    /// Start of each slot's triangles in `entry`, and the end.
    first: Vec<u32>,
    entry: Vec<u32>,
}

impl Grid {
    /// The triangles whose boxes cover at most `BIG` cells hashed into slots; the others listed
    /// apart. A counting sort: the counts summed into each slot's end, then the triangles placed
    /// from the last backwards, so that each slot lists its triangles in increasing order.
    fn new(boxes: &[[P3; 2]], origin: P3, cell: [f64; 3], threads: usize) -> (Grid, Vec<usize>) {
        let inverse = cell.map(|c| 1.0 / c);
        let ranges: Vec<[Cell; 2]> =
            filled(boxes.len(), threads, |t| range_of(&boxes[t], origin, inverse));
        let entries: usize = ranges.iter().map(covers).filter(|&c| c <= BIG).sum();
        let bits = (entries.max(16).next_power_of_two().trailing_zeros() + 1).min(40);
        let slots = 1usize << bits;
        let mut first = vec![0u32; slots + 1];
        let mut big = Vec::new();
        for (t, r) in ranges.iter().enumerate() {
            if covers(r) > BIG {
                big.push(t);
            } else {
                for_cells(r, |c| first[slot(c, bits)] += 1);
            }
        }
        let mut end = 0;
        for f in &mut first {
            end += *f;
            *f = end;
        }
        let mut entry = vec![0u32; end as usize];
        for (t, r) in ranges.iter().enumerate().rev() {
            if covers(r) <= BIG {
                for_cells_rev(r, |c| {
                    let s = slot(c, bits);
                    first[s] -= 1;
                    entry[first[s] as usize] = t as u32;
                });
            }
        }
        (Grid { bits, ranges, first, entry }, big)
    }

    fn slots(&self) -> usize {
        1 << self.bits
    }

    /// The slots that hold two triangles or more, in the order of their lowest triangle, and
    /// of the slot's index among slots with the same lowest triangle, each with its list of
    /// triangles copied out in that order: a counting sort from one pass over the table in its
    /// own order, where finding each triangle's slots from its cells would hash every cell again
    /// and read the table at random; and the sweep then reads the lists one after the other,
    /// where reading them in place would fetch each from a random place in the table.
    fn slots_by_lowest_triangle(&self) -> SweepOrder {
        let n = self.ranges.len();
        let mut start = vec![0u32; n + 1];
        let mut at = vec![0u32; n + 1];
        let lowest = |s: usize| -> Option<usize> {
            let (a, b) = (self.first[s] as usize, self.first[s + 1] as usize);
            (b - a >= 2).then(|| self.entry[a] as usize)
        };
        for s in 0..self.slots() {
            if let Some(t) = lowest(s) {
                start[t + 1] += 1;
                at[t + 1] += self.first[s + 1] - self.first[s];
            }
        }
        for t in 0..n {
            start[t + 1] += start[t];
            at[t + 1] += at[t];
        }
        let count = start[n] as usize;
        let mut slots = vec![0u32; count];
        let mut first = vec![0u32; count + 1];
        let mut entry = vec![0u32; at[n] as usize];
        first[count] = at[n];
        for s in 0..self.slots() {
            if let Some(t) = lowest(s) {
                let list = self.list(s);
                let (k, e) = (start[t] as usize, at[t] as usize);
                slots[k] = s as u32;
                first[k] = e as u32;
                entry[e..e + list.len()].copy_from_slice(list);
                start[t] += 1;
                at[t] += list.len() as u32;
            }
        }
        SweepOrder { slots, first, entry }
    }

    fn list(&self, s: usize) -> &[u32] {
        &self.entry[self.first[s] as usize..self.first[s + 1] as usize]
    }

    /// Whether slot `s` is where the pair is tested: that of the lowest cell both cover.
    fn home(&self, a: usize, b: usize, s: usize) -> bool {
        self.home_of(self.ranges[a][0], self.ranges[b][0], s)
    }

    /// [`Grid::home`] from the two triangles' lowest cells.
    #[inline]
    fn home_of(&self, la: Cell, lb: Cell, s: usize) -> bool {
        slot([la[0].max(lb[0]), la[1].max(lb[1]), la[2].max(lb[2])], self.bits) == s
    }
}

/// The slots to sweep, in the order to sweep them, and each one's triangles (as
/// [`Grid::list`]) stored in that order.
struct SweepOrder {
    slots: Vec<u32>,
    first: Vec<u32>,
    entry: Vec<u32>,
}

impl SweepOrder {
    /// The slot at place `k` of the order and its triangles.
    fn slot(&self, k: usize) -> (usize, &[u32]) {
        (self.slots[k] as usize, &self.entry[self.first[k] as usize..self.first[k + 1] as usize])
    }
}

/// The cell that holds the point `p`, from the inverse cell sizes. A negative index (round-off
/// below the origin) is cut to zero by the clamp and truncation alike, so no `floor` is taken.
#[inline]
fn cell_of(p: P3, origin: P3, inverse: [f64; 3]) -> Cell {
    let index = |k: usize| {
        let i = (p[k] - origin[k]) * inverse[k];
        i.clamp(0.0, f64::from((1u32 << 21) - 1)) as u32
    };
    [index(0), index(1), index(2)]
}

/// The index box of cells that a box covers.
#[inline]
fn range_of(b: &[P3; 2], origin: P3, inverse: [f64; 3]) -> [Cell; 2] {
    [cell_of(b[0], origin, inverse), cell_of(b[1], origin, inverse)]
}

/// The first pair of triangles of slot `s` that meet (by `test`), if any: the slot's triangles
/// gathered from `table` into `local`, sorted along the axis they spread most along and swept,
/// each pair whose boxes overlap tested in its home slot only.
fn sweep_slot(
    grid: &Grid,
    (s, list): (usize, &[u32]),
    table: &[Entry],
    local: &mut Vec<Entry>,
    test: &impl Fn(usize, usize) -> Option<(usize, usize)>,
) -> Option<(usize, usize)> {
    if list.len() < 2 {
        return None;
    }
    local.clear();
    local.extend(list.iter().map(|&t| table[t as usize]));
    let axis = sweep_axis(local);
    local.sort_unstable_by(|a, b| a.b[0][axis].total_cmp(&b.b[0][axis]));
    for k in 0..local.len() {
        let ea = &local[k];
        let end = ea.b[1][axis];
        for eb in &local[k + 1..] {
            if eb.b[0][axis] > end {
                break;
            }
            // A triangle can fall in one slot by two cells.
            if eb.t == ea.t || !overlap(&ea.b, &eb.b) {
                continue;
            }
            if grid.home_of(ea.low, eb.low, s)
                && let Some(pair) = test(ea.t as usize, eb.t as usize)
            {
                return Some(pair);
            }
        }
    }
    None
}

/// The first pair of triangles that meet, if any. Each triangle's data are computed once.
///
/// Candidate pairs come from a grid whose cell, per axis, is four times the median extent of the
/// triangles along it, or half the mean if that is more (made larger only if the triangles would
/// cover more than eight cells each on average, or more than one in 64 would be large), its occupied cells hashed into a table of slots filled by a counting sort. A pair
/// whose boxes overlap shares its lowest common cell, so it is tested in that cell's slot and no
/// other (two cells in one slot cost only candidates rejected by their boxes). In each slot the
/// boxes are swept along the axis they spread most along, so triangles of different sizes and
/// shapes in one slot are not all paired. Triangles that would cover more than `BIG` cells (the
/// long facets of a mould block's faces) are paired in a second grid of cells eight times as
/// large, with every triangle; those too large for it are tested against all others by box
/// overlap.
pub(crate) fn find_self_intersection(mesh: &Mesh) -> Option<(usize, usize)> {
    let threads = if mesh.len() >= PARALLEL_FROM { crate::parallel::threads() } else { 1 };
    find_self_intersection_on(mesh, threads)
}

/// [`find_self_intersection`] on `threads` threads (the same pair for any number).
fn find_self_intersection_on(mesh: &Mesh, threads: usize) -> Option<(usize, usize)> {
    let n = mesh.len();
    let bbox = mesh.bounding_box()?;
    // A large mesh's per-triangle tables are filled, and its slots swept, on all cores.
    let facets: Vec<Facet> = filled(n, threads, |t| Facet::new(mesh, t));
    let boxes: Vec<[P3; 2]> = filled(n, threads, |t| facets[t].bounds());
    let ext = bbox.extent();
    let mut cell = [0.0; 3];
    let mut extent: Vec<f64> = vec![0.0; n];
    for k in 0..3 {
        for (e, b) in extent.iter_mut().zip(&boxes) {
            *e = b[1][k] - b[0][k];
        }
        let mean = extent.iter().sum::<f64>() / n as f64;
        let median = *extent.select_nth_unstable_by(n / 2, f64::total_cmp).1;
        // Half the mean at least, for the many flat facets of a face normal to an axis; at most
        // about a million cells along an axis, so that indices fit their 21 bits.
        cell[k] = (4.0 * median).max(0.5 * mean).max(ext[k] * 1e-6).max(f64::MIN_POSITIVE);
    }
    drop(extent);
    loop {
        let (mut entries, mut large) = (0usize, 0usize);
        let inverse = cell.map(|c| 1.0 / c);
        for b in &boxes {
            match covers(&range_of(b, bbox.min, inverse)) {
                c if c > BIG => large += 1,
                c => entries += c,
            }
        }
        let crowded = entries as f64 / (MEAN_COVER * n as f64);
        if crowded <= 1.0 && large <= n / 64 + 16 {
            break;
        }
        let grow = if crowded > 1.0 { crowded.cbrt() * 1.01 } else { 2.0 };
        cell = cell.map(|c| c * grow);
    }
    let (grid, big) = Grid::new(&boxes, bbox.min, cell, threads);
    let test =
        |a: usize, b: usize| facets_meet(&facets[a], &facets[b]).then_some((a.min(b), a.max(b)));
    // Each slot's triangles gathered with their boxes and lowest cells from one line each, so
    // the pair loop reads contiguous memory, and sorted along the sweep axis.
    let table: Vec<Entry> =
        filled(n, threads, |t| Entry { b: boxes[t], low: grid.ranges[t][0], t: t as u32 });
    let mut local: Vec<Entry> = Vec::new();
    // Slots are swept in the order of their lowest triangle, so that the triangles (and facets)
    // of the slots swept one after the other are near in the mesh's own order, which for a loft
    // or a part built from one is near in space: they are read from cache, where sweeping the
    // slots in the hash's order would fetch every one from memory. Which pair is reported when
    // surfaces meet is that of the sweep in the hash's order, run again then.
    // On all cores, each a contiguous share of that order (the first to find a meeting pair
    // stops the others); which pair is reported does not depend on it.
    let order = grid.slots_by_lowest_triangle();
    let found = AtomicBool::new(false);
    let sweep = |share: std::ops::Range<usize>| {
        let mut local: Vec<Entry> = Vec::new();
        for k in share {
            if k % 256 == 0 && found.load(Ordering::Relaxed) {
                return;
            }
            if sweep_slot(&grid, order.slot(k), &table, &mut local, &test).is_some() {
                found.store(true, Ordering::Relaxed);
                return;
            }
        }
    };
    let swept = order.slots.len();
    if threads > 1 {
        let ranges = crate::parallel::blocks(swept, threads);
        std::thread::scope(|scope| {
            for r in ranges {
                let sweep = &sweep;
                scope.spawn(move || sweep(r));
            }
        });
    } else {
        sweep(0..swept);
    }
    drop(order);
    if found.into_inner() {
        for s in 0..grid.slots() {
            if let Some(pair) = sweep_slot(&grid, (s, grid.list(s)), &table, &mut local, &test) {
                return Some(pair);
            }
        }
    }
    drop(table);
    if big.is_empty() {
        return None;
    }
    // The large triangles against every triangle, in a coarser grid.
    let (coarse, huge) = Grid::new(&boxes, bbox.min, cell.map(|c| 8.0 * c), threads);
    let mut is_big = vec![false; n];
    big.iter().for_each(|&t| is_big[t] = true);
    for s in 0..coarse.slots() {
        let list = coarse.list(s);
        for &ta in list.iter().filter(|&&t| is_big[t as usize]) {
            let ta = ta as usize;
            for &tb in list {
                let tb = tb as usize;
                // Two large triangles are paired once, from the lower index.
                if tb == ta || (is_big[tb] && tb < ta) || !overlap(&boxes[ta], &boxes[tb]) {
                    continue;
                }
                if coarse.home(ta, tb, s)
                    && let Some(pair) = test(ta, tb)
                {
                    return Some(pair);
                }
            }
        }
    }
    for (k, &ta) in huge.iter().enumerate() {
        for tb in 0..n {
            let earlier = huge[..k].binary_search(&tb).is_ok();
            if tb != ta
                && !earlier
                && overlap(&boxes[ta], &boxes[tb])
                && let Some(pair) = test(ta, tb)
            {
                return Some(pair);
            }
        }
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::mesh::intersect::pair_meets;

    #[test]
    fn the_grid_finds_what_all_pairs_find() {
        // Seeded random triangle soups: the grid search must agree with testing every pair.
        let mut rnd = crate::mesh::test_rng::uniform(0x2545_f491_4f6c_dd1d);
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

    #[test]
    fn a_large_shell_gives_the_same_answer_on_any_number_of_threads() {
        // 120,000 facets, above the size swept on all cores: two parallel sheets 1 mm apart
        // cannot meet; with a vertex pushed through the other sheet near the start, the middle
        // or the end of the mesh's order, each count of threads reports the same meeting pair.
        let plain = slab(600, 50);
        assert!(plain.len() >= PARALLEL_FROM);
        for threads in [1, 2, 3] {
            assert_eq!(find_self_intersection_on(&plain, threads), None, "{threads} threads");
        }
        for v in [3 + 2 * 601, 300 + 25 * 601, 597 + 48 * 601] {
            let mut dented = plain.clone();
            dented.vertices[v][2] = -0.002;
            let one = find_self_intersection_on(&dented, 1);
            assert!(one.is_some_and(|(a, b)| pair_meets(&dented, a, b)), "{one:?}");
            for threads in [2, 3] {
                assert_eq!(find_self_intersection_on(&dented, threads), one, "vertex {v}");
            }
        }
    }
}
