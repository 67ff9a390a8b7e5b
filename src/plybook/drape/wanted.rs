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
        // Inside: crossings of the polygon with each warp line `x = i`.
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
            cuts.sort_by(f64::total_cmp);
            for pair in cuts.chunks_exact(2) {
                let (j0, j1) =
                    ((pair[0].ceil() as i32).max(lo[1]), (pair[1].floor() as i32).min(hi[1]));
                for j in j0..=j1 {
                    w.mark(i, j);
                }
            }
        }
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
