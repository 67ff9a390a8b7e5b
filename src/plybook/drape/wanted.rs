//! The nodes a net needs to cover a region: those within a margin of it, and every node from
//! which one of them is reached outwards from the seed.

/// Which nodes the net needs (see [`DrapeSpec::region`]), over the box of indices they fill
/// (the seed included).
#[derive(Debug, Clone)]
pub(super) struct Wanted {
    pub(super) lo: [i32; 2],
    pub(super) dims: [i32; 2],
    need: Vec<bool>,
}

impl Wanted {
    pub(super) fn new(poly: &[[f64; 2]], margin: f64, half: i32) -> Self {
        let (mut a, mut b) = ([0.0_f64; 2], [0.0_f64; 2]);
        for q in poly {
            for k in 0..2 {
                a[k] = a[k].min(q[k]);
                b[k] = b[k].max(q[k]);
            }
        }
        let lo = [0, 1].map(|k| ((a[k] - margin).floor() as i32 - 1).clamp(-half, 0));
        let hi = [0, 1].map(|k| ((b[k] + margin).ceil() as i32 + 1).clamp(0, half));
        let dims = [hi[0] - lo[0] + 1, hi[1] - lo[1] + 1];
        let mut w = Wanted { lo, dims, need: vec![false; (dims[0] * dims[1]) as usize] };
        w.mark_inside(poly);
        let m = poly.len();
        // Within the margin of an edge.
        for k in 0..m {
            let (p, q) = (poly[k], poly[(k + 1) % m]);
            let (dx, dy) = (q[0] - p[0], q[1] - p[1]);
            let l2 = dx * dx + dy * dy;
            let i0 = ((p[0].min(q[0]) - margin).floor() as i32).max(lo[0]);
            let i1 = ((p[0].max(q[0]) + margin).ceil() as i32).min(hi[0]);
            let j0 = ((p[1].min(q[1]) - margin).floor() as i32).max(lo[1]);
            let j1 = ((p[1].max(q[1]) + margin).ceil() as i32).min(hi[1]);
            for i in i0..=i1 {
                for j in j0..=j1 {
                    // Marking is idempotent: a node already wanted needs no distance.
                    if w.get(i, j) {
                        continue;
                    }
                    let (x, y) = (i as f64, j as f64);
                    let t = if l2 > 0.0 {
                        (((x - p[0]) * dx + (y - p[1]) * dy) / l2).clamp(0.0, 1.0)
                    } else {
                        0.0
                    };
                    let (ex, ey) = (x - p[0] - t * dx, y - p[1] - t * dy);
                    // The square against the margin's square decides but within round-off of
                    // the margin, where `hypot` decides as before.
                    let e2 = ex * ex + ey * ey;
                    let m2 = margin * margin;
                    let near = if e2 < m2 * (1.0 - 1e-9) {
                        true
                    } else if e2 > m2 * (1.0 + 1e-9) {
                        false
                    } else {
                        ex.hypot(ey) <= margin
                    };
                    if near {
                        w.mark(i, j);
                    }
                }
            }
        }
        // And every node from which a wanted node is reached outwards from the seed.
        for (si, sj) in [(1, 1), (-1, 1), (-1, -1), (1, -1)] {
            let ni = if si > 0 { hi[0] } else { -lo[0] };
            let nj = if sj > 0 { hi[1] } else { -lo[1] };
            for i in (0..=ni).rev() {
                for j in (0..=nj).rev() {
                    let (ii, jj) = (si * i, sj * j);
                    if w.get(ii + si, jj) || w.get(ii, jj + sj) {
                        w.mark(ii, jj);
                    }
                }
            }
        }
        w
    }

    /// Marks the nodes inside the polygon: its crossings with each warp line `x = i`, each
    /// edge's crossings put on the lines it spans (the lines `x` with `min ≤ x < max` of its
    /// ends), so that every line does not go through every edge.
    fn mark_inside(&mut self, poly: &[[f64; 2]]) {
        let (lo, hi) = (self.lo, [self.lo[0] + self.dims[0] - 1, self.lo[1] + self.dims[1] - 1]);
        let m = poly.len();
        // Inside: crossings of the polygon with each warp line `x = i`, each edge's crossings
        // put on the lines it spans (the lines `x` with `min ≤ x < max` of its ends), so that
        // every line does not go through every edge.
        let mut lines: Vec<Vec<f64>> = vec![Vec::new(); self.dims[0] as usize];
        for k in 0..m {
            let (p, q) = (poly[k], poly[(k + 1) % m]);
            let (first, last) = if p[0].is_nan() || q[0].is_nan() {
                // (Every line, as the test below decides for a NaN end.)
                (lo[0], hi[0])
            } else {
                let (from, to) = (p[0].min(q[0]), p[0].max(q[0]));
                let first = from.ceil().max(f64::from(lo[0])) as i32;
                (first, (to.ceil() - 1.0).min(f64::from(hi[0])) as i32)
            };
            for i in first..=last {
                let x = f64::from(i);
                if (p[0] > x) != (q[0] > x) {
                    lines[(i - lo[0]) as usize]
                        .push(p[1] + (q[1] - p[1]) * (x - p[0]) / (q[0] - p[0]));
                }
            }
        }
        for (i, cuts) in (lo[0]..=hi[0]).zip(&mut lines) {
            self.mark_between(i, cuts);
        }
    }

    /// Marks the nodes of warp line `i` between each pair of its crossings `cuts` (sorted here).
    fn mark_between(&mut self, i: i32, cuts: &mut [f64]) {
        let (lo, hi) = (self.lo[1], self.lo[1] + self.dims[1] - 1);
        cuts.sort_by(f64::total_cmp);
        for pair in cuts.chunks_exact(2) {
            let (j0, j1) = ((pair[0].ceil() as i32).max(lo), (pair[1].floor() as i32).min(hi));
            for j in j0..=j1 {
                self.mark(i, j);
            }
        }
    }

    /// [`Wanted::mark_inside`] as first written: every line through every edge.
    #[cfg(test)]
    fn mark_inside_by_lines(&mut self, poly: &[[f64; 2]]) {
        let (lo, hi) = (self.lo, [self.lo[0] + self.dims[0] - 1, self.lo[1] + self.dims[1] - 1]);
        let m = poly.len();
        let mut cuts = Vec::new();
        for i in lo[0]..=hi[0] {
            let x = i as f64;
            cuts.clear();
            for k in 0..m {
                let (p, q) = (poly[k], poly[(k + 1) % m]);
                if (p[0] > x) != (q[0] > x) {
                    cuts.push(p[1] + (q[1] - p[1]) * (x - p[0]) / (q[0] - p[0]));
                }
            }
            self.mark_between(i, &mut cuts);
        }
    }

    fn index(&self, i: i32, j: i32) -> Option<usize> {
        let (a, b) = (i - self.lo[0], j - self.lo[1]);
        (a >= 0 && b >= 0 && a < self.dims[0] && b < self.dims[1])
            .then(|| (a * self.dims[1] + b) as usize)
    }

    fn mark(&mut self, i: i32, j: i32) {
        if let Some(k) = self.index(i, j) {
            self.need[k] = true;
        }
    }

    pub(super) fn get(&self, i: i32, j: i32) -> bool {
        self.index(i, j).is_some_and(|k| self.need[k])
    }

    /// The nodes wanted, by their indices.
    pub(super) fn marked(&self) -> impl Iterator<Item = (i32, i32)> + '_ {
        let n = self.dims[1];
        self.need
            .iter()
            .enumerate()
            .filter(|(_, v)| **v)
            .map(move |(k, _)| (k as i32 / n + self.lo[0], k as i32 % n + self.lo[1]))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The crossings put on the lines each edge spans mark the nodes that every line through
    /// every edge marks: seeded random polygons (star-shaped, concave), many corners on whole
    /// net coordinates and edges along the lines, so that the half-open rule meets its ends, some
    /// reaching past the box of nodes.
    #[test]
    fn crossings_by_edge_mark_what_crossings_by_line_mark() {
        let mut rnd = crate::mesh::test_rng::uniform(0x5851_f42d_4c95_7f2d);
        let mut marked = 0;
        for trial in 0..300 {
            let n = 3 + trial % 17;
            let poly: Vec<[f64; 2]> = (0..n)
                .map(|k| {
                    let a = std::f64::consts::TAU * (k as f64 + 0.3 * rnd()) / n as f64;
                    let r = 3.0 + 22.0 * rnd();
                    let p = [r * a.cos() + 2.0 * rnd(), r * a.sin()];
                    // Every third trial on whole coordinates.
                    if trial % 3 == 0 { p.map(f64::round) } else { p }
                })
                .collect();
            let (lo, dims) = ([-20, -20], [41, 41]);
            let mut by_edge = Wanted { lo, dims, need: vec![false; 41 * 41] };
            let mut by_line = by_edge.clone();
            by_edge.mark_inside(&poly);
            by_line.mark_inside_by_lines(&poly);
            assert_eq!(by_edge.need, by_line.need, "trial {trial}: {poly:?}");
            marked += by_edge.marked().count();
        }
        assert!(marked > 10_000, "{marked}");
    }
}
