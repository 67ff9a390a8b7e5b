//! The kinematic (pin-jointed net) drape of Mack & Taylor (1956): two generator threads from the
//! seed, then every cell of the net closed from its two known sides.

mod net;
mod wanted;

pub use net::{DrapedNet, NetNode};

use super::vec3::{add, cross, dot, norm, scale, sub, unit};
use wanted::Wanted;

/// A surface to drape on: a smooth map from a parameter plane into space (m). It should be
/// defined (and smooth) a few net spacings beyond the region draped, since the net is grown
/// there too.
pub trait DrapeSurface {
    /// The point at parameters `p`.
    fn point(&self, p: [f64; 2]) -> [f64; 3];

    /// Parameter step for finite-difference derivatives.
    fn step(&self) -> [f64; 2] {
        [1e-6, 1e-6]
    }

    /// Surface point, unit normal and the tangent vectors (the derivatives along the two
    /// parameters) at `p`. By default from central differences of [`DrapeSurface::point`]
    /// (`central_frame`); a surface that knows its derivatives gives them here, so that
    /// a Newton step of the drape costs one evaluation instead of five.
    fn frame(&self, p: [f64; 2]) -> ([f64; 3], [f64; 3], [[f64; 3]; 2]) {
        central_frame(self, p)
    }
}

/// How to drape: seed, warp direction and net spacing.
#[derive(Debug, Clone)]
pub struct DrapeSpec {
    /// Seed point in parameters.
    pub seed: [f64; 2],
    /// The warp (fibre) direction at the seed; projected onto the tangent plane there.
    pub warp: [f64; 3],
    /// Length of a net link (the fabric's cell size), m.
    pub spacing: f64,
    /// Nodes are grown while their parameters stay inside this box (`[[a0, a1], [b0, b1]]`).
    pub bounds: [[f64; 2]; 2],
    /// The region to cover, when the net should grow only the nodes it needs: those within
    /// the margin of the region, or from which such a node is reached outwards from the seed.
    pub region: Option<Prune>,
}

/// The region a net must cover, to grow only the nodes it needs.
#[derive(Debug, Clone)]
pub enum Prune {
    /// A closed polygon in parameters and a margin (m); the polygon is carried to net
    /// coordinates by the surface's first derivatives at the seed, so the margin should cover
    /// the surface's departure from that linear map.
    Param(Vec<[f64; 2]>, f64),
    /// A closed polygon in net coordinates (links along the warp and the weft from the seed)
    /// and a margin in links.
    Net(Vec<[f64; 2]>, f64),
}

/// Surface point, unit normal and the tangent vectors at `p` (see [`DrapeSurface::frame`]).
pub(crate) fn frame(s: &dyn DrapeSurface, p: [f64; 2]) -> ([f64; 3], [f64; 3], [[f64; 3]; 2]) {
    s.frame(p)
}

/// [`DrapeSurface::frame`] by central differences of the surface's points over its
/// [`DrapeSurface::step`] (a one-sided normal would lean by half a step, and the generators
/// would turn by it at every link).
pub(crate) fn central_frame<S: DrapeSurface + ?Sized>(
    s: &S,
    p: [f64; 2],
) -> ([f64; 3], [f64; 3], [[f64; 3]; 2]) {
    let h = s.step();
    // The points of one radius first (a surface may share the work of a radius between them).
    let x = s.point(p);
    let sb = scale(sub(s.point([p[0], p[1] + h[1]]), s.point([p[0], p[1] - h[1]])), 0.5 / h[1]);
    let sa = scale(sub(s.point([p[0] + h[0], p[1]]), s.point([p[0] - h[0], p[1]])), 0.5 / h[0]);
    (x, unit(cross(sa, sb)), [sa, sb])
}

/// The arc length of a fibre between two net nodes from its chord `c`, with the normal curvature
/// along the chord estimated from the normals at its ends (Rodrigues: `dn·t = -κ_n ds`): the
/// circular-arc length `(2/κ) asin(cκ/2)`. On a cylinder this is exact to O(c⁵).
fn arc_length(chord: [f64; 3], na: [f64; 3], nb: [f64; 3]) -> f64 {
    let c = norm(chord);
    if c == 0.0 {
        return 0.0;
    }
    let kappa = (-dot(sub(nb, na), chord) / (c * c)).abs();
    let x = 0.5 * c * kappa;
    if x < 1e-8 { c } else { c * x.min(1.0).asin() / x }
}

/// Solves two equations `f(p) = 0` near `p0` by Newton steps with the Jacobian from the surface
/// tangents (`jac(frame) -> 2x2`), at most 30 steps.
fn solve2(
    s: &dyn DrapeSurface,
    p0: [f64; 2],
    tol: f64,
    f: &dyn Fn([f64; 3], [f64; 3]) -> [f64; 2],
    jac: &dyn Fn([f64; 3], [[f64; 3]; 2]) -> [[f64; 2]; 2],
) -> Option<NetNode> {
    let mut p = p0;
    let mut best: Option<(f64, NetNode)> = None;
    let mut last: Option<f64> = None;
    for _ in 0..30 {
        let (x, n, t) = frame(s, p);
        let r = f(x, n);
        if !(r[0].is_finite() && r[1].is_finite()) {
            return None;
        }
        let size = r[0].abs().max(r[1].abs());
        if best.as_ref().is_none_or(|(b, _)| size < *b) {
            best = Some((size, NetNode { param: p, point: x, normal: n }));
        }
        if size < tol {
            break;
        }
        // Round-off: once near the tolerance, a step that no longer halves the residual
        // will not settle the last digits either.
        if let Some(prev) = last
            && size < 1e4 * tol
            && size > 0.5 * prev
        {
            break;
        }
        last = Some(size);
        let j = jac(x, t);
        let det = j[0][0] * j[1][1] - j[0][1] * j[1][0];
        if det.abs() < 1e-300 || !det.is_finite() {
            break;
        }
        let da = (r[0] * j[1][1] - r[1] * j[0][1]) / det;
        let db = (j[0][0] * r[1] - j[1][0] * r[0]) / det;
        p = [p[0] - da, p[1] - db];
    }
    // Round-off (a blade surface point carries some 1e-12 m of it) may keep the last digits
    // from settling, and a kink of the parametrisation (the speed of the arc-length parameter
    // jumps where the two skins meet at the leading edge; stations are blended linearly) makes
    // the finite-difference Jacobian inconsistent there, so that Newton's method creeps: a
    // residual of 1e-7 of a link, far below any cloth tolerance, is accepted.
    best.filter(|(size, _)| *size < 1e6 * tol).map(|(_, node)| node)
}

fn inside(b: &[[f64; 2]; 2], p: [f64; 2]) -> bool {
    p[0] >= b[0][0] && p[0] <= b[0][1] && p[1] >= b[1][0] && p[1] <= b[1][1]
}

/// The next node of a generator thread: a link `d` long from `cur`, continuing the thread
/// without turning in the tangent plane (the discrete geodesic: the link lies in the plane of
/// the surface normal at `cur` and the incoming direction `dir`).
fn geodesic_step(
    s: &dyn DrapeSurface,
    cur: &NetNode,
    dir: [f64; 3],
    guess: [f64; 2],
    d: f64,
    sideways: f64,
) -> Option<NetNode> {
    let b = unit(cross(cur.normal, dir));
    let f = |x: [f64; 3], n: [f64; 3]| {
        let v = sub(x, cur.point);
        [arc_length(v, cur.normal, n) - d, dot(v, b) - sideways]
    };
    let jac = |x: [f64; 3], t: [[f64; 3]; 2]| {
        let v = unit(sub(x, cur.point));
        [[dot(v, t[0]), dot(v, t[1])], [dot(b, t[0]), dot(b, t[1])]]
    };
    let node = solve2(s, guess, 1e-13 * d, &f, &jac)?;
    // The solution must continue forwards.
    (dot(sub(node.point, cur.point), dir) > 0.0).then_some(node)
}

/// The node closing a cell: a link `d` from both `a` (same weft index) and `b` (same warp
/// index), on the far side from their common neighbour `c`.
fn close_cell(
    s: &dyn DrapeSurface,
    a: &NetNode,
    b: &NetNode,
    c: &NetNode,
    d: f64,
) -> Option<NetNode> {
    let guess = [a.param[0] + b.param[0] - c.param[0], a.param[1] + b.param[1] - c.param[1]];
    let f = |x: [f64; 3], n: [f64; 3]| {
        [arc_length(sub(x, a.point), a.normal, n) - d, arc_length(sub(x, b.point), b.normal, n) - d]
    };
    let jac = |x: [f64; 3], t: [[f64; 3]; 2]| {
        let (u, v) = (unit(sub(x, a.point)), unit(sub(x, b.point)));
        [[dot(u, t[0]), dot(u, t[1])], [dot(v, t[0]), dot(v, t[1])]]
    };
    let mid = scale(add(a.point, b.point), 0.5);
    let ok = |n: &NetNode| dot(sub(n.point, c.point), sub(mid, c.point)) > 0.0;
    if let Some(node) = solve2(s, guess, 1e-13 * d, &f, &jac).filter(ok) {
        return Some(node);
    }
    // A second start: the parallelogram completed in space, carried to parameters by the
    // tangents at the middle of the two known nodes.
    let target = sub(add(a.point, b.point), c.point);
    let pm = [0.5 * (a.param[0] + b.param[0]), 0.5 * (a.param[1] + b.param[1])];
    let (xm, _, t) = frame(s, pm);
    let v = sub(target, xm);
    let (e, f2, g) = (dot(t[0], t[0]), dot(t[0], t[1]), dot(t[1], t[1]));
    let (r1, r2) = (dot(v, t[0]), dot(v, t[1]));
    let det = e * g - f2 * f2;
    if !(det.abs() > 0.0) {
        return None;
    }
    let guess = [pm[0] + (g * r1 - f2 * r2) / det, pm[1] + (e * r2 - f2 * r1) / det];
    solve2(s, guess, 1e-13 * d, &f, &jac).filter(ok)
}

/// Drapes the net over `surface` (see the module docs). Nodes whose parameters leave
/// `spec.bounds`, or that cannot be placed (the cloth would have to fold), are left out, and so
/// is every node that depends on them.
pub fn drape(surface: &dyn DrapeSurface, spec: &DrapeSpec) -> Option<DrapedNet> {
    drape_over(surface, spec, None)
}

/// [`drape`], taking the nodes a `prior` net was grown for from it instead of closing their
/// cells again. `prior` must have been draped on the same surface with the same seed, warp,
/// spacing and bounds (only its region differs): a node depends only on the nodes between it
/// and the seed, which a net grown for that node grows too (see [`DrapedNet::grown`]), so the
/// net is the one [`drape`] grows, bit for bit.
pub(crate) fn drape_over(
    surface: &dyn DrapeSurface,
    spec: &DrapeSpec,
    prior: Option<&DrapedNet>,
) -> Option<DrapedNet> {
    let d = spec.spacing;
    let (x0, n0, t0) = frame(surface, spec.seed);
    let seed = NetNode { param: spec.seed, point: x0, normal: n0 };
    let w = sub(spec.warp, scale(n0, dot(spec.warp, n0)));
    if norm(w) < 1e-12 * norm(spec.warp) || !(d > 0.0) {
        return None;
    }
    let warp = unit(w);
    let weft = cross(n0, warp);
    // Parameter span of the bounds in links, to size the net.
    let la = norm(t0[0]) * (spec.bounds[0][1] - spec.bounds[0][0]);
    let lb = norm(t0[1]) * (spec.bounds[1][1] - spec.bounds[1][0]);
    let half = ((la.hypot(lb) / d).ceil() as i32 + 2).min(4000);
    let wanted = spec.region.as_ref().map(|prune| {
        let (poly, margin) = match prune {
            Prune::Net(poly, margin) => return Wanted::new(poly, *margin, half),
            Prune::Param(poly, margin) => (poly, margin),
        };
        // The region in net coordinates (links along the warp and the weft) by the tangent map.
        let local: Vec<[f64; 2]> = poly
            .iter()
            .map(|p| {
                let v = add(scale(t0[0], p[0] - spec.seed[0]), scale(t0[1], p[1] - spec.seed[1]));
                [dot(v, warp) / d, dot(v, weft) / d]
            })
            .collect();
        Wanted::new(&local, margin / d, half)
    });
    // The net fills the box of the nodes wanted (all of it without a region).
    let (lo, dims) = match &wanted {
        Some(w) => (w.lo, w.dims),
        None => ([-half, -half], [2 * half + 1, 2 * half + 1]),
    };
    let mut net = DrapedNet {
        spacing: d,
        half,
        lo,
        dims,
        nodes: vec![None; (dims[0] * dims[1]) as usize],
        wanted: None,
    };
    net.set(0, 0, Some(seed));
    let want = |i: i32, j: i32| wanted.as_ref().is_none_or(|w| w.get(i, j));
    // Parameter step of a link along a tangent direction, for the first guesses.
    let to_param = |v: [f64; 3]| -> [f64; 2] {
        let (a, b) = (t0[0], t0[1]);
        let (e, f, g) = (dot(a, a), dot(a, b), dot(b, b));
        let (r1, r2) = (dot(v, a), dot(v, b));
        let det = e * g - f * f;
        [(g * r1 - f * r2) / det, (e * r2 - f * r1) / det]
    };
    // Generators along ±warp (index i) and ±weft (index j).
    for (dir, di, dj) in
        [(warp, 1, 0), (scale(warp, -1.0), -1, 0), (weft, 0, 1), (scale(weft, -1.0), 0, -1)]
    {
        // Each link of a generator is traced in GENERATOR_STEPS sub-links: a discrete geodesic
        // step from a chord's direction leaves the true geodesic by O(h⁴) sideways, so the
        // thread's direction drifts at O(h²) over a given length; a quarter of the link cuts
        // that sixteenfold (on a cone, from 4.5e-6 to below 1e-6 of the development's lengths at
        // a 2.5 mm net).
        let h = d / GENERATOR_STEPS as f64;
        let mut prev_param = sub2(spec.seed, to_param(scale(dir, h)));
        let mut cur = seed;
        let mut heading = dir;
        // The first link starts from a tangent, not from a link: it leaves the normal plane of
        // the tangent by the geodesic's third-order term. In the Darboux frame (t, b = n x t, n)
        // of a geodesic, n' = -k_n t - tau_g b and the third derivative has the sideways part
        // -k_n tau_g, so the link's sideways offset is -(h^3/6) (n'.t)(n'.b).
        let first = {
            let e = 1e-4 * d;
            let tp = to_param(scale(dir, e));
            let (_, np, _) = frame(surface, [spec.seed[0] + tp[0], spec.seed[1] + tp[1]]);
            let (_, nm, _) = frame(surface, [spec.seed[0] - tp[0], spec.seed[1] - tp[1]]);
            let dn = scale(sub(np, nm), 0.5 / e);
            let b = unit(cross(n0, dir));
            -h * h * h / 6.0 * dot(dn, dir) * dot(dn, b)
        };
        'thread: for k in 1..=half {
            if !want(k * di, k * dj) {
                break;
            }
            for sub_step in 0..GENERATOR_STEPS {
                let guess =
                    [2.0 * cur.param[0] - prev_param[0], 2.0 * cur.param[1] - prev_param[1]];
                let side = if k == 1 && sub_step == 0 { first } else { 0.0 };
                let Some(next) = geodesic_step(surface, &cur, heading, guess, h, side) else {
                    break 'thread;
                };
                heading = unit(sub(next.point, cur.point));
                prev_param = cur.param;
                cur = next;
            }
            if !inside(&spec.bounds, cur.param) {
                break;
            }
            net.set(k * di, k * dj, Some(cur));
        }
    }
    // The four quadrants, cell by cell outwards.
    let (wr, fr) = (net.warp_range(), net.weft_range());
    for (si, sj) in [(1, 1), (-1, 1), (-1, -1), (1, -1)] {
        let ni = if si > 0 { wr[1] } else { -wr[0] };
        let nj = if sj > 0 { fr[1] } else { -fr[0] };
        for i in 1..=ni {
            for j in 1..=nj {
                let (ii, jj) = (si * i, sj * j);
                if !want(ii, jj) {
                    continue;
                }
                if let Some(prior) = prior.filter(|p| p.grown(ii, jj)) {
                    net.set(ii, jj, prior.node(ii, jj).copied());
                    continue;
                }
                let a = net.node(ii - si, jj).copied();
                let b = net.node(ii, jj - sj).copied();
                let c = net.node(ii - si, jj - sj).copied();
                let node = match (a, b, c) {
                    (Some(a), Some(b), Some(c)) => {
                        close_cell(surface, &a, &b, &c, d).filter(|n| inside(&spec.bounds, n.param))
                    }
                    _ => None,
                };
                net.set(ii, jj, node);
            }
        }
    }
    net.wanted = wanted;
    Some(net)
}

/// Sub-links per link of a generator thread.
const GENERATOR_STEPS: usize = 4;

fn sub2(a: [f64; 2], b: [f64; 2]) -> [f64; 2] {
    [a[0] - b[0], a[1] - b[1]]
}

#[cfg(test)]
mod tests;
