//! Flattening: a point of the draped region is carried to the flat cloth through the net. The
//! node parameters are interpolated over net indices by a bicubic (Lagrange, 4×4 nodes) where
//! the neighbours exist, bilinear elsewhere; the indices `(ξ, η)` at which the interpolant meets
//! the point are found by Newton steps, and the flat point is `(ξ d, η d)`, since the cloth is
//! unsheared on the cutting table.

use super::drape::DrapedNet;

/// The farthest a point may lie outside the net, in cells, to be extrapolated to; beyond one
/// cell the pattern says so (the cloth does not follow the surface there).
pub(crate) const FAR_OUT: f64 = 4.0;

/// A spatial index of the net's complete cells by their parameter boxes.
pub(crate) struct NetLocator<'a> {
    net: &'a DrapedNet,
    origin: [f64; 2],
    size: [f64; 2],
    dims: [usize; 2],
    /// The cells whose boxes reach each bucket, as indices into `cells`, bucket after bucket
    /// (each in the cells' order); bucket `k`'s are `in_buckets[first[k]..first[k + 1]]`.
    first: Vec<u32>,
    in_buckets: Vec<u32>,
    /// Every complete cell in the net's order, with its corners and the lengths [`beyond_reach`]
    /// bounds it by, for the extrapolation's scan.
    cells: Vec<Reach>,
}

/// A complete cell's indices, corners and the lengths `|e1| + |e3|` and `|e2|` of [`beyond_reach`].
struct Reach {
    at: (i32, i32),
    corners: [[f64; 2]; 4],
    sides: f64,
    twist: f64,
}

impl<'a> NetLocator<'a> {
    pub(crate) fn new(net: &'a DrapedNet) -> Self {
        let mut cells = Vec::new();
        let (mut lo, mut hi) = ([f64::INFINITY; 2], [f64::NEG_INFINITY; 2]);
        for (i, j, _) in net.nodes() {
            if let Some(c) = cell_params(net, i, j) {
                for p in c {
                    for k in 0..2 {
                        lo[k] = lo[k].min(p[k]);
                        hi[k] = hi[k].max(p[k]);
                    }
                }
                cells.push((i, j, c));
            }
        }
        let nb = ((cells.len() as f64).sqrt().ceil() as usize).max(1);
        let dims = [nb, nb];
        let size =
            [((hi[0] - lo[0]) / nb as f64).max(1e-300), ((hi[1] - lo[1]) / nb as f64).max(1e-300)];
        // The buckets each cell's box reaches, as ranges of bucket rows and columns.
        let spans: Vec<[[usize; 2]; 2]> = cells
            .iter()
            .map(|(_, _, c)| {
                let (mut a, mut b) = ([f64::INFINITY; 2], [f64::NEG_INFINITY; 2]);
                for p in c {
                    for k in 0..2 {
                        a[k] = a[k].min(p[k]);
                        b[k] = b[k].max(p[k]);
                    }
                }
                let ka = |v: f64, k: usize| {
                    (((v - lo[k]) / size[k]).floor().max(0.0) as usize).min(dims[k] - 1)
                };
                [[ka(a[0], 0), ka(b[0], 0)], [ka(a[1], 1), ka(b[1], 1)]]
            })
            .collect();
        let each = |f: &mut dyn FnMut(usize, usize)| {
            for (n, [[x0, x1], [y0, y1]]) in spans.iter().enumerate() {
                for x in *x0..=*x1 {
                    for y in *y0..=*y1 {
                        f(x * nb + y, n);
                    }
                }
            }
        };
        // Counted, summed, then filled in the cells' order.
        let mut first = vec![0u32; nb * nb + 1];
        each(&mut |k, _| first[k + 1] += 1);
        for k in 0..nb * nb {
            first[k + 1] += first[k];
        }
        let mut next = first.clone();
        let mut in_buckets = vec![0u32; first[nb * nb] as usize];
        each(&mut |k, n| {
            in_buckets[next[k] as usize] = n as u32;
            next[k] += 1;
        });
        let cells = cells
            .into_iter()
            .map(|(i, j, c)| {
                let (sides, twist) = reach_lengths(&c);
                Reach { at: (i, j), corners: c, sides, twist }
            })
            .collect();
        NetLocator { net, origin: lo, size, dims, first, in_buckets, cells }
    }

    /// Net indices `(ξ, η)` of the parameter point `q`, or `None` outside the net (or more
    /// than [`FAR_OUT`] cells outside it when `extrapolate`).
    pub(crate) fn indices(&self, q: [f64; 2], extrapolate: bool) -> Option<[f64; 2]> {
        self.indices_with_distance(q, extrapolate).map(|(x, _)| x)
    }

    /// [`NetLocator::indices`] and how far outside the nearest complete cell `q` lies, in cells.
    pub(crate) fn indices_with_distance(
        &self,
        q: [f64; 2],
        extrapolate: bool,
    ) -> Option<([f64; 2], f64)> {
        let k = |v: f64, k: usize| {
            let f = ((v - self.origin[k]) / self.size[k]).floor();
            (f >= -1e-9 && f <= self.dims[k] as f64 + 1e-9)
                .then(|| (f.max(0.0) as usize).min(self.dims[k] - 1))
        };
        let (x, y) = (k(q[0], 0)?, k(q[1], 1)?);
        let mut best: Option<([f64; 2], f64)> = None;
        let b = x * self.dims[1] + y;
        let (from, to) = (self.first[b] as usize, self.first[b + 1] as usize);
        for &n in &self.in_buckets[from..to] {
            let Reach { at: (i, j), corners: c, .. } = &self.cells[n as usize];
            let (i, j) = (*i, *j);
            let Some(st) = inverse_bilinear(c, q) else { continue };
            // Distance outside the unit square (0 inside).
            let out = (-st[0]).max(st[0] - 1.0).max(-st[1]).max(st[1] - 1.0).max(0.0);
            if best.is_none_or(|(_, o)| out < o) {
                best = Some(([i as f64 + st[0], j as f64 + st[1]], out));
            }
            if out == 0.0 {
                break;
            }
        }
        if let Some((start, out)) = best
            && out <= 1e-6
        {
            return Some((self.refine(start, q), 0.0));
        }
        if !extrapolate {
            return None;
        }
        // Outside every complete cell: extrapolated from the nearest one, up to one cell out
        // (the net may stop short of an edge where the surface turns sharply, as round a nose).
        // Only a cell that `q` may lie within `limit` cells of can be the nearest one (or the
        // nearest within `FAR_OUT`): the others are passed over without inverting their map.
        let limit = best.map_or(FAR_OUT, |(_, o)| o.min(FAR_OUT));
        let mut near: Option<([f64; 2], f64)> = None;
        for cell in &self.cells {
            let c = &cell.corners;
            if beyond_reach(c, cell.sides, cell.twist, q, limit) {
                continue;
            }
            let (i, j) = cell.at;
            let Some(st) = inverse_bilinear(c, q) else { continue };
            let out = (-st[0]).max(st[0] - 1.0).max(-st[1]).max(st[1] - 1.0).max(0.0);
            if near.is_none_or(|(_, o)| out < o) {
                near = Some(([i as f64 + st[0], j as f64 + st[1]], out));
            }
        }
        let (start, out) = near?;
        (out <= FAR_OUT).then(|| (self.refine(start, q), out))
    }

    /// Newton steps on the bicubic interpolant from the bilinear estimate.
    fn refine(&self, start: [f64; 2], q: [f64; 2]) -> [f64; 2] {
        let mut xi = start;
        for _ in 0..8 {
            let Some((p, j)) = bicubic(self.net, xi) else { return xi };
            let r = [p[0] - q[0], p[1] - q[1]];
            let det = j[0][0] * j[1][1] - j[0][1] * j[1][0];
            if det.abs() < 1e-300 {
                return xi;
            }
            let dx = (r[0] * j[1][1] - r[1] * j[0][1]) / det;
            let dy = (j[0][0] * r[1] - j[1][0] * r[0]) / det;
            let next = [xi[0] - dx, xi[1] - dy];
            if (next[0] - start[0]).abs() > 1.5 || (next[1] - start[1]).abs() > 1.5 {
                return xi;
            }
            xi = next;
            if dx.abs() < 1e-14 && dy.abs() < 1e-14 {
                break;
            }
        }
        xi
    }

    /// The flat point (m, warp along x) of the parameter point `q`, and how many cells outside
    /// the net it was extrapolated (0 inside).
    pub(crate) fn flat(&self, q: [f64; 2]) -> Option<([f64; 2], f64)> {
        let (xi, out) = self.indices_with_distance(q, true)?;
        Some(([xi[0] * self.net.spacing, xi[1] * self.net.spacing], out))
    }
}

/// The parameters of the four corners of cell `(i, j)..(i+1, j+1)`, counter-clockwise.
fn cell_params(net: &DrapedNet, i: i32, j: i32) -> Option<[[f64; 2]; 4]> {
    Some([
        net.node(i, j)?.param,
        net.node(i + 1, j)?.param,
        net.node(i + 1, j + 1)?.param,
        net.node(i, j + 1)?.param,
    ])
}

/// The lengths `|e1| + |e3|` and `|e2|` of cell `c` (see [`beyond_reach`]).
fn reach_lengths(c: &[[f64; 2]; 4]) -> (f64, f64) {
    let len = |v: [f64; 2]| (v[0] * v[0] + v[1] * v[1]).sqrt();
    let e1 = [c[1][0] - c[0][0], c[1][1] - c[0][1]];
    let e3 = [c[3][0] - c[0][0], c[3][1] - c[0][1]];
    let e2 = [c[2][0] - c[1][0] - c[3][0] + c[0][0], c[2][1] - c[1][1] - c[3][1] + c[0][1]];
    (len(e1) + len(e3), len(e2))
}

/// Whether `q` lies more than `limit` cells outside the bilinear cell `c`: the map
/// `c0 + s e1 + t e3 + s t e2` over `s, t ∈ [-limit, 1 + limit]` stays within
/// `m (|e1| + |e3|) + m² |e2|` of the corner `c0`, with `m = 1 + limit`; a point farther than
/// that (with a margin for round-off) has no local coordinates within `limit` of the cell. The
/// cell's lengths `sides` and `twist` from [`reach_lengths`]; the squared distance decides
/// but within round-off of the bound, where the distance itself decides.
fn beyond_reach(c: &[[f64; 2]; 4], sides: f64, twist: f64, q: [f64; 2], limit: f64) -> bool {
    let m = 1.0 + limit;
    let bound = 1.01 * (m * sides + m * m * twist) + 1e-12;
    let v = [q[0] - c[0][0], q[1] - c[0][1]];
    let d2 = v[0] * v[0] + v[1] * v[1];
    let b2 = bound * bound;
    if d2 > b2 * (1.0 + 1e-9) {
        true
    } else if d2 < b2 * (1.0 - 1e-9) {
        false
    } else {
        d2.sqrt() > bound
    }
}

/// Local coordinates `(s, t)` of `q` in the bilinear cell `c` (corners 00, 10, 11, 01).
fn inverse_bilinear(c: &[[f64; 2]; 4], q: [f64; 2]) -> Option<[f64; 2]> {
    let mut st = [0.5, 0.5];
    for _ in 0..20 {
        let (s, t) = (st[0], st[1]);
        let mut p = [0.0; 2];
        let mut ds = [0.0; 2];
        let mut dt = [0.0; 2];
        for k in 0..2 {
            p[k] = (1.0 - s) * (1.0 - t) * c[0][k]
                + s * (1.0 - t) * c[1][k]
                + s * t * c[2][k]
                + (1.0 - s) * t * c[3][k];
            ds[k] = (1.0 - t) * (c[1][k] - c[0][k]) + t * (c[2][k] - c[3][k]);
            dt[k] = (1.0 - s) * (c[3][k] - c[0][k]) + s * (c[2][k] - c[1][k]);
        }
        let r = [p[0] - q[0], p[1] - q[1]];
        let det = ds[0] * dt[1] - ds[1] * dt[0];
        if det.abs() < 1e-300 {
            return None;
        }
        let a = (r[0] * dt[1] - r[1] * dt[0]) / det;
        let b = (ds[0] * r[1] - ds[1] * r[0]) / det;
        st = [s - a, t - b];
        if a.abs() < 1e-15 && b.abs() < 1e-15 {
            break;
        }
    }
    (st[0].is_finite() && st[1].is_finite()).then_some(st)
}

/// Cubic Lagrange weights and their derivatives at offset `x` for nodes at -1, 0, 1, 2.
fn lagrange(x: f64) -> ([f64; 4], [f64; 4]) {
    let w = [
        -x * (x - 1.0) * (x - 2.0) / 6.0,
        (x + 1.0) * (x - 1.0) * (x - 2.0) / 2.0,
        -(x + 1.0) * x * (x - 2.0) / 2.0,
        (x + 1.0) * x * (x - 1.0) / 6.0,
    ];
    let d = [
        -(3.0 * x * x - 6.0 * x + 2.0) / 6.0,
        (3.0 * x * x - 4.0 * x - 1.0) / 2.0,
        -(3.0 * x * x - 2.0 * x - 2.0) / 2.0,
        (3.0 * x * x - 1.0) / 6.0,
    ];
    (w, d)
}

/// The bicubic interpolant of the node parameters at net indices `xi` and its Jacobian
/// (`[[dp0/dξ, dp0/dη], [dp1/dξ, dp1/dη]]`); `None` where the 4×4 stencil is incomplete.
fn bicubic(net: &DrapedNet, xi: [f64; 2]) -> Option<([f64; 2], [[f64; 2]; 2])> {
    let (i0, j0) = (xi[0].floor() as i32, xi[1].floor() as i32);
    let (wa, da) = lagrange(xi[0] - i0 as f64);
    let (wb, db) = lagrange(xi[1] - j0 as f64);
    let mut p = [0.0; 2];
    let mut jac = [[0.0; 2]; 2];
    for a in 0..4 {
        for b in 0..4 {
            let n = net.node(i0 - 1 + a as i32, j0 - 1 + b as i32)?;
            for k in 0..2 {
                p[k] += wa[a] * wb[b] * n.param[k];
                jac[k][0] += da[a] * wb[b] * n.param[k];
                jac[k][1] += wa[a] * db[b] * n.param[k];
            }
        }
    }
    Some((p, jac))
}
