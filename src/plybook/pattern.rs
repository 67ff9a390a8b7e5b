//! One region draped and flattened into a flat pattern.

use super::drape::{DrapeSpec, DrapeSurface, DrapedNet, Prune, drape, drape_over, frame};
use super::flatten::{FAR_OUT, NetLocator};
use super::vec3::{cross, dot, norm, point_in_polygon, polygon_area, scale, sub, unit};

/// A region of a surface to drape, in the surface's parameters.
#[derive(Debug, Clone)]
pub struct RegionSpec {
    /// The region's boundary, a closed polygon in parameters, counter-clockwise.
    pub boundary: Vec<[f64; 2]>,
    /// Seed point in parameters.
    pub seed: [f64; 2],
    /// The reference axis of fibre angles (the blade axis), in space; projected onto the
    /// tangent plane at each point.
    pub axis: [f64; 3],
    /// Fibre angle from the axis about the outward normal `S_a × S_b`, rad.
    pub angle: f64,
    /// Net spacing, m.
    pub spacing: f64,
    /// A parameter point on the root end of the region, marked by a notch.
    pub root_mark: [f64; 2],
}

/// The flat pattern of a draped region. Flat frame: `x` along the warp (fibre) direction, `y`
/// along the weft, seen from the outward normal side (the mould side of the ply).
#[derive(Debug, Clone)]
pub struct FlatPattern {
    /// Outline, counter-clockwise, m.
    pub outline: Vec<[f64; 2]>,
    /// Area of the outline, m².
    pub area: f64,
    /// The root mark on the outline, m.
    pub root_mark: [f64; 2],
    /// Net spacing, m.
    pub spacing: f64,
    /// Net nodes inside the region.
    pub nodes: usize,
    /// Greatest magnitude of the shear angle at a node inside the region, rad.
    pub max_shear: f64,
    /// Where (parameters).
    pub max_shear_at: [f64; 2],
    /// Greatest deviation of the draped warp from the intended fibre direction, rad (signed
    /// about the normal).
    pub max_deviation: f64,
    /// Where (parameters).
    pub max_deviation_at: [f64; 2],
    /// Shear angle at every node inside the region: flat point (m) and shear (rad), for plots.
    pub shear_map: Vec<([f64; 2], f64)>,
    /// Boundary points (parameters) the net did not reach, whose flat places were extrapolated
    /// from the nearest cells (more than one cell out): the cloth does not follow the surface
    /// there without folding or a dart.
    pub extrapolated: Vec<[f64; 2]>,
    /// Boundary points (parameters) the net does not reach at all: the pattern ends short of
    /// them, on the straight parameter line from the seed, where the net stops. Empty when the
    /// whole region is covered.
    pub cut_short: Vec<[f64; 2]>,
}

/// Why a region could not be flattened.
#[derive(Debug, Clone, PartialEq)]
pub enum DrapeFailure {
    /// The seed or the start direction is degenerate.
    Seed,
    /// The net does not reach this point of the region, nor any point between it and the seed
    /// (the cloth would have to fold there).
    Unreached([f64; 2]),
}

/// The intended fibre direction at a point: the axis projected onto the tangent plane, turned
/// by `angle` about the normal.
fn intended(axis: [f64; 3], normal: [f64; 3], angle: f64) -> [f64; 3] {
    let a = unit(sub(axis, scale(normal, dot(axis, normal))));
    let b = cross(normal, a);
    let (s, c) = angle.sin_cos();
    [c * a[0] + s * b[0], c * a[1] + s * b[1], c * a[2] + s * b[2]]
}

/// Links added to the margin of a net grown over a region placed in net coordinates by
/// extrapolation from the coarse net.
const EXTRAPOLATED_MARGIN: f64 = 8.0;

/// Links about the region's outline in net coordinates over which a net must have been grown to
/// flatten the region as a net grown over a larger region does: the flat locator's Newton steps
/// move at most a cell and a half from the cell found and read the 4×4 nodes about the cell they
/// end in, and the shear at a node reads two nodes on either side.
const FLATTEN_REACH: f64 = 5.0;

/// Whether `net` was grown over every node the region's pattern takes: its boundary points all
/// lie in complete cells, or within [`FAR_OUT`] cells of them, and the net was grown within
/// [`FLATTEN_REACH`] links (and [`FAR_OUT`] more) of the polygon of their net coordinates (see
/// [`DrapedNet::covers`]).
fn covered(net: &DrapedNet, boundary: &[[f64; 2]]) -> bool {
    let locator = NetLocator::new(net);
    let mut far = false;
    let poly: Option<Vec<[f64; 2]>> = boundary
        .iter()
        .map(|&q| {
            let (x, out) = locator.indices_with_distance(q, true)?;
            far |= out > 0.0;
            Some(x)
        })
        .collect();
    let reach = if far { FLATTEN_REACH + FAR_OUT } else { FLATTEN_REACH };
    poly.is_some_and(|poly| net.covers(&poly, reach))
}

/// The boundary points `boundary` in the links of a net `step` times finer than the one
/// `locator` finds them in: those it places (extrapolated up to [`FAR_OUT`] cells), and each of
/// the others by the affine map fitted (least squares) to the placed points nearest it in
/// parameters, lengths along the parameters weighed by `metric`; `None` when fewer than three
/// are placed.
fn outline_in_links(
    locator: &NetLocator,
    step: f64,
    boundary: &[[f64; 2]],
    metric: [f64; 2],
) -> Option<Vec<[f64; 2]>> {
    let placed: Vec<([f64; 2], [f64; 2])> = boundary
        .iter()
        .filter_map(|&q| locator.indices(q, true).map(|x| (q, [step * x[0], step * x[1]])))
        .collect();
    if placed.len() < 3 {
        return None;
    }
    boundary
        .iter()
        .map(|&q| {
            if let Some(x) = locator.indices(q, true) {
                return Some([step * x[0], step * x[1]]);
            }
            let dist = |p: [f64; 2]| (metric[0] * (p[0] - q[0])).hypot(metric[1] * (p[1] - q[1]));
            let mut near: Vec<&([f64; 2], [f64; 2])> = placed.iter().collect();
            near.sort_by(|a, b| dist(a.0).total_cmp(&dist(b.0)));
            near.truncate(AFFINE_FIT_POINTS);
            affine_at(&near, q)
        })
        .collect()
}

/// Placed boundary points an unplaced one is extrapolated from.
const AFFINE_FIT_POINTS: usize = 12;

/// The value at `q` of the affine map fitted by least squares to the pairs `(parameters, value)`
/// (coordinates about their mean); `None` when the points lie on a line.
fn affine_at(pairs: &[&([f64; 2], [f64; 2])], q: [f64; 2]) -> Option<[f64; 2]> {
    let n = pairs.len() as f64;
    let mut m = [0.0; 4];
    for (p, x) in pairs.iter().map(|p| (p.0, p.1)) {
        for (k, v) in [p[0], p[1], x[0], x[1]].into_iter().enumerate() {
            m[k] += v / n;
        }
    }
    let [pa, pb, xa, xb] = m;
    let (mut saa, mut sab, mut sbb) = (0.0, 0.0, 0.0);
    let mut rhs = [[0.0; 2]; 2];
    for (p, x) in pairs.iter().map(|p| (p.0, p.1)) {
        let (da, db) = (p[0] - pa, p[1] - pb);
        saa += da * da;
        sab += da * db;
        sbb += db * db;
        for k in 0..2 {
            let dx = x[k] - [xa, xb][k];
            rhs[k][0] += da * dx;
            rhs[k][1] += db * dx;
        }
    }
    let det = saa * sbb - sab * sab;
    if !(det.abs() > 1e-12 * (saa * sbb).max(1e-300)) {
        return None;
    }
    let (qa, qb) = (q[0] - pa, q[1] - pb);
    let at = |k: usize| {
        let ga = (rhs[k][0] * sbb - rhs[k][1] * sab) / det;
        let gb = (saa * rhs[k][1] - sab * rhs[k][0]) / det;
        [xa, xb][k] + ga * qa + gb * qb
    };
    Some([at(0), at(1)])
}

/// Drapes the region from its seed and flattens it (see the module docs of `plybook`).
pub fn drape_region(
    surface: &dyn DrapeSurface,
    spec: &RegionSpec,
) -> Result<FlatPattern, DrapeFailure> {
    let (_, n0, t0) = frame(surface, spec.seed);
    let warp = intended(spec.axis, n0, spec.angle);
    let (mut lo, mut hi) = ([f64::INFINITY; 2], [f64::NEG_INFINITY; 2]);
    for p in &spec.boundary {
        for k in 0..2 {
            lo[k] = lo[k].min(p[k]);
            hi[k] = hi[k].max(p[k]);
        }
    }
    // Nodes may need to stand outside the region on the way to its corners: on a long, narrow
    // region with the fibres at 45° the generators leave it across its short side and run on
    // about as far as the region is long, so the bounds reach the region's greater extent
    // beyond it in every direction.
    let size = [hi[0] - lo[0], hi[1] - lo[1]];
    let extent = (norm(t0[0]) * size[0]).max(norm(t0[1]) * size[1]);
    let reach = [0, 1].map(|k| (extent / norm(t0[k]).max(1e-300)).max(size[k]));
    let bounds = [[lo[0] - reach[0], hi[0] + reach[0]], [lo[1] - reach[1], hi[1] + reach[1]]];
    // A coarse net (four links in one) first, grown over the region mapped linearly with a wide
    // margin; it carries the region into net coordinates for the fine net, which then grows
    // only the nodes it needs.
    let coarse_step = 4.0;
    let coarse = drape(
        surface,
        &DrapeSpec {
            seed: spec.seed,
            warp,
            spacing: coarse_step * spec.spacing,
            bounds,
            region: Some(Prune::Param(
                spec.boundary.clone(),
                3.0 * coarse_step * spec.spacing + 0.25 * extent,
            )),
        },
    )
    .ok_or(DrapeFailure::Seed)?;
    let coarse_locator = NetLocator::new(&coarse);
    let in_links: Option<Vec<[f64; 2]>> = spec
        .boundary
        .iter()
        .map(|&q| {
            coarse_locator.indices(q, false).map(|x| [coarse_step * x[0], coarse_step * x[1]])
        })
        .collect();
    let fine = |prune: Prune, prior: Option<&DrapedNet>| {
        drape_over(
            surface,
            &DrapeSpec {
                seed: spec.seed,
                warp,
                spacing: spec.spacing,
                bounds,
                region: Some(prune),
            },
            prior,
        )
    };
    let margin = 3.0 + 2.0 * coarse_step + 0.02 * extent / spec.spacing;
    let net = match in_links {
        Some(poly) => fine(Prune::Net(poly, margin), None),
        // The coarse net does not reach the whole region (its cells will not close round a
        // small nose, say): the region's net coordinates extrapolated from its nearest cells
        // (within `FAR_OUT` of them) or fitted to the nearest points placed, with a wider margin. That net stands only when it was grown
        // over every node the pattern takes (see `covered`), which are then the nodes of the
        // net grown over the region mapped linearly with a wide margin; else that net is grown.
        None => {
            let metric = [norm(t0[0]), norm(t0[1])];
            let pruned = outline_in_links(&coarse_locator, coarse_step, &spec.boundary, metric)
                .and_then(|poly| fine(Prune::Net(poly, margin + EXTRAPOLATED_MARGIN), None));
            match pruned {
                Some(net) if covered(&net, &spec.boundary) => Some(net),
                // The wide net takes the nodes the pruned one was grown for from it.
                pruned => {
                    let wide =
                        Prune::Param(spec.boundary.clone(), 3.0 * spec.spacing + 0.25 * extent);
                    fine(wide, pruned.as_ref())
                }
            }
        }
    }
    .ok_or(DrapeFailure::Seed)?;
    let locator = NetLocator::new(&net);
    let mut outline = Vec::with_capacity(spec.boundary.len());
    let mut extrapolated = Vec::new();
    let mut cut_short = Vec::new();
    // A boundary point the net does not reach (a cell could not be closed on the way: the cloth
    // would fold there) is moved in along the straight parameter line from the seed to the
    // last place the net covers: the pattern ends there, and says so.
    let reach = |q: [f64; 2]| -> Option<[f64; 2]> {
        if let Some((flat, _)) = locator.flat(q) {
            return Some(flat);
        }
        let at = |t: f64| {
            [spec.seed[0] + t * (q[0] - spec.seed[0]), spec.seed[1] + t * (q[1] - spec.seed[1])]
        };
        let (mut lo, mut hi) = (0.0, 1.0);
        locator.indices(at(lo), false)?;
        for _ in 0..40 {
            let mid = 0.5 * (lo + hi);
            if locator.indices(at(mid), false).is_some() {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        locator.flat(at(lo)).map(|(flat, _)| flat)
    };
    for &q in &spec.boundary {
        match locator.flat(q) {
            Some((flat, out)) => {
                if out > 1.0 {
                    extrapolated.push(q);
                }
                outline.push(flat);
            }
            None => {
                outline.push(reach(q).ok_or(DrapeFailure::Unreached(q))?);
                cut_short.push(q);
            }
        }
    }
    let root_mark = reach(spec.root_mark).ok_or(DrapeFailure::Unreached(spec.root_mark))?;
    let mut pattern = FlatPattern {
        area: polygon_area(&outline).abs(),
        outline,
        root_mark,
        spacing: spec.spacing,
        nodes: 0,
        max_shear: 0.0,
        max_shear_at: spec.seed,
        max_deviation: 0.0,
        max_deviation_at: spec.seed,
        shear_map: Vec::new(),
        extrapolated,
        cut_short,
    };
    // A node outside the boundary's box (by more than round-off of the crossing test) is
    // outside the boundary: no edge straddles its height, or every edge that does lies on one
    // side of it (an even count).
    let slack = 1e-9 * (lo[0].abs() + hi[0].abs() + 1.0);
    let off_box =
        |q: [f64; 2]| q[1] < lo[1] || q[1] > hi[1] || q[0] > hi[0] + slack || q[0] < lo[0] - slack;
    for (i, j, node) in net.nodes() {
        if off_box(node.param) || !point_in_polygon(&spec.boundary, node.param) {
            continue;
        }
        pattern.nodes += 1;
        if let Some(g) = net.shear(i, j) {
            pattern.shear_map.push(([i as f64 * spec.spacing, j as f64 * spec.spacing], g));
            if g.abs() > pattern.max_shear.abs() {
                pattern.max_shear = g;
                pattern.max_shear_at = node.param;
            }
        }
        if let Some(w) = net.warp_direction(i, j) {
            let want = intended(spec.axis, node.normal, spec.angle);
            let dev = dot(node.normal, cross(want, w)).atan2(dot(want, w));
            if dev.abs() > pattern.max_deviation.abs() {
                pattern.max_deviation = dev;
                pattern.max_deviation_at = node.param;
            }
        }
    }
    Ok(pattern)
}
