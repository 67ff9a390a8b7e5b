//! Draping a region whole, or in pieces where one will not drape: each attempt checked (a
//! pattern that crosses itself or loses the region's area is not one to cut), the halves draped
//! side by side, and the regions' first attempts shared out over the cores.

use super::PlyBookError;
use super::book::PlyBookParams;
use super::drape::frame;
use super::kit::region_name;
use super::pattern::{DrapeFailure, FlatPattern, drape_region};
use super::regions::PlyRegion;
use super::splice::{Splice, halves};
use super::vec3::{add, cross, dot, scale, unit};
use crate::blade::Blade;
use crate::project::PlySpec;

/// The largest relative difference between a pattern's area and its region's area on the
/// surface for a pattern the net covers whole (the drape keeps every link's length, so the two
/// agree to the shear's second-order area change and the outline's sampling).
const AREA_CHECK: f64 = 0.03;

/// The first outline vertex whose following edge crosses a later, non-adjacent edge.
fn self_crossing(p: &[[f64; 2]]) -> Option<usize> {
    let n = p.len();
    let orient = |a: [f64; 2], b: [f64; 2], c: [f64; 2]| {
        (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
    };
    for i in 0..n {
        let (a, b) = (p[i], p[(i + 1) % n]);
        for j in i + 2..n {
            if (j + 1) % n == i {
                continue;
            }
            let (c, d) = (p[j], p[(j + 1) % n]);
            let (d1, d2) = (orient(a, b, c), orient(a, b, d));
            let (d3, d4) = (orient(c, d, a), orient(c, d, b));
            if d1 * d2 < 0.0 && d3 * d4 < 0.0 {
                return Some(i);
            }
        }
    }
    None
}

/// Most halvings of a region that cannot be draped in one piece (at most `2^5` pieces).
const MAX_SPLITS: usize = 5;

/// One attempt at draping and flattening a region: the flat pattern, or why it is not one to
/// cut. A net that folds over itself, or a flat pattern whose area departs from the region's
/// area on its surface, is not a pattern to cut.
fn attempt(region: &PlyRegion, p: &PlySpec, name: &str) -> Result<FlatPattern, PlyBookError> {
    let err = |what: String| PlyBookError::Drape {
        ply_index: region.ply,
        ply: p.id.clone(),
        pattern: name.to_string(),
        what,
    };
    let along = if region.surface_name.starts_with("web") { "height" } else { "x/c" };
    let flat = drape_region(region.surface(), &region.spec).map_err(|e| match e {
        DrapeFailure::Seed => err("the seed or the fibre direction is degenerate".to_string()),
        DrapeFailure::Unreached(q) => {
            let at = region.place(q);
            err(format!(
                "the net does not reach r = {:.4} m, {along} = {:.3} (the cloth would fold)",
                at.r, at.along
            ))
        }
    })?;
    let surface_area = region.surface_area();
    let mismatch = (flat.area - surface_area).abs() / surface_area;
    let crossing = self_crossing(&flat.outline);
    if crossing.is_some() || (flat.cut_short.is_empty() && mismatch > AREA_CHECK) {
        let at = crossing
            .map(|k| region.place(region.spec.boundary[k]))
            .or_else(|| flat.extrapolated.first().map(|&q| region.place(q)))
            .unwrap_or_else(|| region.place(region.spec.seed));
        return Err(err(format!(
            "the flat pattern {} ({:.4} m² against {:.4} m² of the region on its surface) near r = {:.3} m, {along} = {:.3}; left out of the book",
            if crossing.is_some() { "crosses itself" } else { "does not keep the region's area" },
            flat.area,
            surface_area,
            at.r,
            at.along
        )));
    }
    Ok(flat)
}

/// The pieces of a region, each with its flat pattern.
pub(super) type Pieces<'a> = Vec<(PlyRegion<'a>, FlatPattern)>;

/// A drape attempt's outcome (see [`attempt`]).
pub(super) type Attempt = Result<FlatPattern, PlyBookError>;

/// A region draped whole, or, where it cannot be draped in one piece (the net does not reach
/// it, folds over itself, loses area or ends short of it), split in halves (see [`halves`],
/// which staggers the cut from the `earlier` plies' splices) and each half draped the same way,
/// at most [`MAX_SPLITS`] times deep. When no split drapes whole the region's own result stands
/// (a pattern cut short, with its warning, or the failure). With the pieces, the earlier plies
/// a cut could not be staggered from. `whole` is the region's own attempt when it was already
/// made (see [`first_attempts`]). The two halves are draped side by side on two threads; their
/// results are taken in order, so the pieces are those of draping them one after the other.
#[allow(clippy::too_many_arguments)]
pub(super) fn drape_pieces<'a>(
    blade: &'a Blade,
    region: PlyRegion<'a>,
    whole: Option<Attempt>,
    p: &PlySpec,
    name: &str,
    params: &PlyBookParams,
    earlier: &[Splice],
    depth: usize,
) -> Result<(Pieces<'a>, Vec<usize>), PlyBookError> {
    let whole = whole.unwrap_or_else(|| attempt(&region, p, name));
    if matches!(&whole, Ok(f) if f.cut_short.is_empty()) || depth >= MAX_SPLITS {
        return whole.map(|f| (vec![(region, f)], Vec::new()));
    }
    let mut pieces = Vec::new();
    let ([first, second], mut missed) = halves(blade, &region, params, earlier);
    let drape_half = |half| drape_pieces(blade, half, None, p, name, params, earlier, depth + 1);
    let results = std::thread::scope(|scope| {
        let other = scope.spawn(|| drape_half(first));
        let second = drape_half(second);
        let first = other.join().unwrap_or_else(|e| std::panic::resume_unwind(e));
        [first, second]
    });
    for result in results {
        match result {
            Ok((v, m)) if v.iter().all(|(_, f)| f.cut_short.is_empty()) => {
                pieces.extend(v);
                missed.extend(m);
            }
            _ => return whole.map(|f| (vec![(region, f)], Vec::new())),
        }
    }
    missed.sort_unstable();
    missed.dedup();
    Ok((pieces, missed))
}

/// Every region's first attempt, draped whole (see [`attempt`]), the regions shared out over
/// the machine's cores (at most [`THREADS`]); the attempts do not depend on each other, so the
/// results are those of one thread, in the regions' order. `None` for a region of a ply
/// without a material (left out of the book).
pub(super) fn first_attempts<'a>(
    blade: &'a Blade,
    regions: Vec<PlyRegion<'a>>,
) -> Vec<(PlyRegion<'a>, Option<Attempt>)> {
    let count = regions.len();
    let threads = crate::parallel::threads().clamp(1, THREADS);
    // The longest first, so that no long region starts last while the other threads idle.
    let mut order: Vec<(usize, PlyRegion<'a>)> = regions.into_iter().enumerate().collect();
    if threads > 1 {
        let work: Vec<f64> = order.iter().map(|(_, r)| net_size(r)).collect();
        order.sort_by(|a, b| work[b.0].total_cmp(&work[a.0]));
    }
    let queue = std::sync::Mutex::new(order.into_iter());
    let work = || {
        let mut done = Vec::new();
        loop {
            let next = match queue.lock() {
                Ok(mut q) => q.next(),
                Err(poisoned) => poisoned.into_inner().next(),
            };
            let Some((k, region)) = next else { break };
            let tried = match (blade.ply(region.ply), blade.ply_material(region.ply)) {
                (Some(p), Some(_)) => Some(attempt(&region, p, &region_name(p, &region))),
                _ => None,
            };
            done.push((k, region, tried));
        }
        done
    };
    let mut all: Vec<(usize, PlyRegion<'a>, Option<Attempt>)> = std::thread::scope(|scope| {
        let helpers: Vec<_> = (1..threads).map(|_| scope.spawn(work)).collect();
        let mut all = work();
        for h in helpers {
            all.extend(h.join().unwrap_or_else(|e| std::panic::resume_unwind(e)));
        }
        all
    });
    all.sort_by_key(|(k, _, _)| *k);
    debug_assert_eq!(all.len(), count);
    all.into_iter().map(|(_, region, tried)| (region, tried)).collect()
}

/// An estimate of the nodes a region's net grows, to share the work out: the box of the
/// region's boundary about the seed in the tangent plane there, taken along the fibres and
/// across them (the quadrant closure of the net fills it), over the cell's area.
fn net_size(region: &PlyRegion) -> f64 {
    let spec = &region.spec;
    let (_, n, t) = frame(region.surface(), spec.seed);
    let a = unit(t[0]);
    let b = cross(n, a);
    let (s, c) = spec.angle.sin_cos();
    let (mut lo, mut hi) = ([0.0_f64; 2], [0.0_f64; 2]);
    for q in &spec.boundary {
        let v = add(scale(t[0], q[0] - spec.seed[0]), scale(t[1], q[1] - spec.seed[1]));
        let (x, y) = (dot(v, a), dot(v, b));
        let along = [c * x + s * y, c * y - s * x];
        for k in 0..2 {
            lo[k] = lo[k].min(along[k]);
            hi[k] = hi[k].max(along[k]);
        }
    }
    let size = (hi[0] - lo[0]) * (hi[1] - lo[1]) / (spec.spacing * spec.spacing);
    if size.is_finite() { size } else { 0.0 }
}

/// Most threads the first attempts are shared over.
const THREADS: usize = 8;

/// Where a region lay before it was cut in pieces, and its pattern name.
pub(super) struct Extent {
    pub(super) span: [f64; 2],
    pub(super) chord: [f64; 2],
    pub(super) surface: String,
    pub(super) name: String,
}

/// A region cut in pieces (see [`drape_pieces`]), or `None` for a ply without a material.
pub(super) type Draped<'a> = Option<Result<(Pieces<'a>, Vec<usize>), PlyBookError>>;

/// The regions of one ply (a `both` ply's two skins), each with its first attempt, draped in
/// pieces (see [`drape_pieces`]) side by side on their own threads. A region's cuts keep clear
/// only of the `earlier` splices on its own surface, so regions on different surfaces do not
/// depend on each other and the results, taken in order, are those of draping them one after
/// the other (regions that share a surface, or all regions on one thread, are draped one after
/// the other).
pub(super) fn drape_ply<'a>(
    blade: &'a Blade,
    group: Vec<(PlyRegion<'a>, Option<Attempt>)>,
    params: &PlyBookParams,
    earlier: &[Splice],
) -> Vec<(Extent, Draped<'a>)> {
    let one = |(region, whole): (PlyRegion<'a>, Option<Attempt>)| -> (Extent, Draped<'a>) {
        let p = blade.ply(region.ply);
        let extent = Extent {
            span: region.span,
            chord: region.chord,
            surface: region.surface_name.clone(),
            name: p.map(|p| region_name(p, &region)).unwrap_or_default(),
        };
        let draped = match (p, blade.ply_material(region.ply)) {
            (Some(p), Some(_)) => {
                let name = extent.name.clone();
                Some(drape_pieces(blade, region, whole, p, &name, params, earlier, 0))
            }
            _ => None,
        };
        (extent, draped)
    };
    let surfaces: Vec<&str> = group.iter().map(|(r, _)| r.surface_name.as_str()).collect();
    let apart = surfaces.iter().enumerate().all(|(k, s)| !surfaces[..k].contains(s));
    if group.len() < 2 || !apart || crate::parallel::threads() < 2 {
        return group.into_iter().map(one).collect();
    }
    std::thread::scope(|scope| {
        let mut group = group.into_iter();
        let first = group.next();
        let others: Vec<_> = group.map(|g| scope.spawn(move || one(g))).collect();
        let mut out: Vec<(Extent, Draped<'a>)> = first.into_iter().map(one).collect();
        for h in others {
            out.push(h.join().unwrap_or_else(|e| std::panic::resume_unwind(e)));
        }
        out
    })
}
