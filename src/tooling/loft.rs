//! Closed solids lofted through a span-wise family of contours: a tube of rings between the two
//! end trims, closed by caps on the trim surfaces; annular solids (an outer and an inner surface
//! with annular caps); hollow solids (an outer solid with a closed inner cavity).
//!
//! Every line of constant parameter runs from its root trim to its tip trim; the rings are at
//! common fractions `t` of each line's trimmed length, so the first and last rings lie exactly on
//! the trim surfaces. Edges of no length, left where a closing segment shrinks to nothing along
//! the span, are contracted (see `collapse`).

use super::cap::{annular_cap, column_cap};
use super::collapse::{COLLAPSE_FRACTION, collapse_short_edges};
use super::grid::{Grid, LoftParams, TrimmedLines, build_grid, build_stations, trim_lines};
use super::surface::{EndKind, SpanSurface, contour_polygon};
use super::trim::Trims;
use crate::mesh::Mesh;
use crate::mesh::polygon_area;
use crate::mesh::vec3;
use crate::mesh::vec3::P3;
use crate::mesh::{End, MeshError};

/// A lofted solid and what its construction knows.
#[derive(Debug, Clone)]
pub struct LoftedSolid {
    /// The closed, outward-facing mesh, rotor frame, m.
    pub mesh: Mesh,
    /// Vertex indices of the outer surface's root end contour, in ring order.
    pub root_ring: Vec<u32>,
    /// Vertex indices of the outer surface's tip end contour, in ring order.
    pub tip_ring: Vec<u32>,
    /// The chordwise parameters used on both chains.
    pub u: Vec<f64>,
    /// The spanwise stations, fractions of each line's trimmed length.
    pub stations: Vec<f64>,
    /// The lines a mould parts along (outer surface).
    pub parting: PartingLines,
    /// Which facets of the outer surface are its side and its end caps.
    pub facets: FacetRanges,
}

/// Vertex chains of the outer surface along which a two-part mould can part: together they
/// form a closed loop of mesh edges (front root to tip, across the tip cap, back tip to root,
/// across the root cap) that separates the upper chain's facets from the lower chain's.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct PartingLines {
    /// The line at `u = 0` (the leading edge, or the front closure's middle), root to tip.
    pub front: Vec<u32>,
    /// The line at `u = 1` where the chains meet, else the middle of the back closing segment
    /// (the middle of the base of a blunt trailing edge), root to tip.
    pub back: Vec<u32>,
    /// The middle vertex of every column of the root cap, front to back (empty for an annular
    /// solid, whose caps are bands).
    pub root: Vec<u32>,
    /// The middle vertex of every column of the tip cap, front to back (empty for an annular
    /// solid).
    pub tip: Vec<u32>,
    /// The upper chain's line at the middle chordwise parameter, root to tip: vertices on the
    /// upper side of the loop.
    pub upper: Vec<u32>,
}

/// Index ranges of the facets of the outer surface in [`LoftedSolid::mesh`].
#[derive(Debug, Clone, Default, PartialEq)]
pub struct FacetRanges {
    /// The side surface between the end trims.
    pub side: std::ops::Range<usize>,
    /// The root cap.
    pub root_cap: std::ops::Range<usize>,
    /// The tip cap.
    pub tip_cap: std::ops::Range<usize>,
}

/// Lofts `surface` between `trims` into a closed solid.
///
/// ```
/// use layloft::tooling::{ChainEnds, EndKind, FnSurface, LoftParams, Trims, loft_solid};
/// use layloft::units::Angle;
/// use std::f64::consts::PI;
///
/// # fn main() -> Result<(), layloft::Error> {
/// // A round bar of radius 20 mm between spheres of radius 0.3 m and 0.8 m.
/// let r = 0.02;
/// let bar = FnSurface {
///     span: [0.0, 1.0],
///     upper: |_x: f64, u: f64| [-r * (PI * u).cos(), r * (PI * u).sin()],
///     lower: |_x: f64, u: f64| [-r * (PI * u).cos(), -r * (PI * u).sin()],
///     chord_angle: |_x: f64| Angle::ZERO,
///     ends: ChainEnds { front: EndKind::Point, back: EndKind::Point },
/// };
/// let params = LoftParams { tolerance: 1e-5, ..LoftParams::default() };
/// let solid = loft_solid(&bar, &Trims::spheres(0.3, 0.8), &params)?;
/// let v = solid.mesh.signed_volume();
/// assert!((v / (PI * r * r * 0.5) - 1.0).abs() < 2e-3);
/// # Ok(())
/// # }
/// ```
pub fn loft_solid(
    surface: &dyn SpanSurface,
    trims: &Trims,
    params: &LoftParams,
) -> Result<LoftedSolid, MeshError> {
    params.validate()?;
    trims.validate()?;
    let grid = build_grid(&[surface], trims, params)?;
    let tube = trim_lines(surface, &grid, trims)?;
    let stations = build_stations(&grid, std::slice::from_ref(&tube), params)?;
    let mut mesh = Mesh::new();
    let rings = tube_vertices(&mut mesh, &stations.points[0]);
    tube_triangles(&mut mesh, &rings);
    let side = 0..mesh.len();
    let (root_ring, tip_ring) = (rings[0].clone(), rings[rings.len() - 1].clone());
    let tol = 0.5 * params.tolerance;
    let mut parting = side_lines(&grid, &rings);
    parting.root =
        column_cap(&mut mesh, &grid, &root_ring, trims.root, End::Root, tol, params.max_edge);
    let root_cap = side.end..mesh.len();
    parting.tip =
        column_cap(&mut mesh, &grid, &tip_ring, trims.tip, End::Tip, tol, params.max_edge);
    let tip_cap = root_cap.end..mesh.len();
    if winds_counter_clockwise(surface, &grid, &tube)? {
        mesh.flip();
    }
    Ok(collapsed(
        LoftedSolid {
            mesh,
            root_ring,
            tip_ring,
            u: grid.u,
            stations: stations.t,
            parting,
            facets: FacetRanges { side, root_cap, tip_cap },
        },
        params,
    ))
}

/// `solid` with the edges of a closing segment of no length contracted (see
/// [`super::collapse`]): the same solid when there is none.
fn collapsed(mut solid: LoftedSolid, params: &LoftParams) -> LoftedSolid {
    let Some(c) = collapse_short_edges(&mut solid.mesh, COLLAPSE_FRACTION * params.tolerance)
    else {
        return solid;
    };
    let p = &solid.parting;
    let line = |v: &[u32]| {
        let mut out = c.map(v);
        out.dedup();
        out
    };
    let parting = PartingLines {
        front: line(&p.front),
        back: line(&p.back),
        root: line(&p.root),
        tip: line(&p.tip),
        upper: line(&p.upper),
    };
    let f = &solid.facets;
    LoftedSolid {
        root_ring: ring(c.map(&solid.root_ring)),
        tip_ring: ring(c.map(&solid.tip_ring)),
        parting,
        facets: FacetRanges {
            side: c.range(&f.side),
            root_cap: c.range(&f.root_cap),
            tip_cap: c.range(&f.tip_cap),
        },
        ..solid
    }
}

/// A closed loop of vertices with the repeats a collapse leaves taken out (neighbours joined
/// into one vertex, also across the loop's start).
fn ring(mut v: Vec<u32>) -> Vec<u32> {
    v.dedup();
    while v.len() > 1 && v.first() == v.last() {
        v.pop();
    }
    v
}

/// The front, back and middle upper lines of a tube (see [`PartingLines`]).
fn side_lines(grid: &Grid, rings: &[Vec<u32>]) -> PartingLines {
    let line = |pos: usize| rings.iter().map(|r| r[pos]).collect::<Vec<u32>>();
    let middle = |inner: &[usize], point: usize| match inner.len() {
        0 => point,
        n => inner[n / 2],
    };
    let k = grid.u.len() - 1;
    let front = match grid.ends.front {
        EndKind::Point => grid.upper[0],
        EndKind::Segment => middle(&grid.front, grid.upper[0]),
    };
    let back = match grid.ends.back {
        EndKind::Point => grid.upper[k],
        EndKind::Segment => middle(&grid.back, grid.upper[k]),
    };
    PartingLines {
        front: line(front),
        back: line(back),
        root: Vec::new(),
        tip: Vec::new(),
        upper: line(grid.upper[k / 2]),
    }
}

/// Lofts the solid between an `outer` and an `inner` surface, both ended by the same `trims`:
/// a tube-like shell whose ends are annular caps on the trim surfaces. Both surfaces must join
/// their chains the same way; they are meshed on a common grid.
pub fn loft_annulus(
    outer: &dyn SpanSurface,
    inner: &dyn SpanSurface,
    trims: &Trims,
    params: &LoftParams,
) -> Result<LoftedSolid, MeshError> {
    params.validate()?;
    trims.validate()?;
    let grid = build_grid(&[outer, inner], trims, params)?;
    let tubes = [trim_lines(outer, &grid, trims)?, trim_lines(inner, &grid, trims)?];
    let stations = build_stations(&grid, &tubes, params)?;
    let outer_ccw = winds_counter_clockwise(outer, &grid, &tubes[0])?;
    if winds_counter_clockwise(inner, &grid, &tubes[1])? != outer_ccw {
        return Err(MeshError::Geometry(
            "the outer and inner contours run round in opposite directions".into(),
        ));
    }
    let mut mesh = Mesh::new();
    let outer_rings = tube_vertices(&mut mesh, &stations.points[0]);
    tube_triangles(&mut mesh, &outer_rings);
    let mut inner_mesh = Mesh::new();
    let inner_rings = tube_vertices(&mut inner_mesh, &stations.points[1]);
    tube_triangles(&mut inner_mesh, &inner_rings);
    inner_mesh.flip();
    let offset = mesh.vertices.len() as u32;
    mesh.merge(&inner_mesh);
    let shift = |r: &Vec<u32>| r.iter().map(|i| i + offset).collect::<Vec<_>>();
    let last = outer_rings.len() - 1;
    let tol = 0.5 * params.tolerance;
    let (root_in, tip_in) = (shift(&inner_rings[0]), shift(&inner_rings[last]));
    annular_cap(&mut mesh, &outer_rings[0], &root_in, trims.root, End::Root, tol, params.max_edge);
    annular_cap(&mut mesh, &outer_rings[last], &tip_in, trims.tip, End::Tip, tol, params.max_edge);
    if outer_ccw {
        mesh.flip();
    }
    let (root_ring, tip_ring) = (outer_rings[0].clone(), outer_rings[last].clone());
    let parting = side_lines(&grid, &outer_rings);
    let side = 0..outer_rings.len().saturating_sub(1) * 2 * outer_rings[0].len();
    Ok(collapsed(
        LoftedSolid {
            mesh,
            root_ring,
            tip_ring,
            u: grid.u,
            stations: stations.t,
            parting,
            facets: FacetRanges { side, root_cap: 0..0, tip_cap: 0..0 },
        },
        params,
    ))
}

/// A hollow solid: `outer` between `outer_trims`, less the cavity `inner` between `inner_trims`
/// (a laminate shell round a core: the inner trims are the outer ones moved inward by the end
/// laminate). The cavity must lie inside the outer solid; the mesh check confirms it does not
/// cut through.
pub fn loft_hollow(
    outer: &dyn SpanSurface,
    outer_trims: &Trims,
    inner: &dyn SpanSurface,
    inner_trims: &Trims,
    params: &LoftParams,
) -> Result<LoftedSolid, MeshError> {
    let mut solid = loft_solid(outer, outer_trims, params)?;
    let mut cavity = loft_solid(inner, inner_trims, params)?.mesh;
    cavity.flip();
    solid.mesh.merge(&cavity);
    Ok(solid)
}

/// Vertices of every ring: `rings[j][i]` is line `i` at station `j`.
fn tube_vertices(mesh: &mut Mesh, points: &[Vec<P3>]) -> Vec<Vec<u32>> {
    mesh.vertices.reserve(points.len() * points[0].len());
    points.iter().map(|ring| ring.iter().map(|&p| mesh.push_vertex(p)).collect()).collect()
}

/// Quads between consecutive rings, split along the shorter diagonal, facing outward for a
/// contour that runs clockwise in the chord plane (front → upper → back → lower).
fn tube_triangles(mesh: &mut Mesh, rings: &[Vec<u32>]) {
    mesh.triangles.reserve(2 * (rings.len() - 1) * rings[0].len());
    for pair in rings.windows(2) {
        let (r0, r1) = (&pair[0], &pair[1]);
        let n = r0.len();
        for i in 0..n {
            let i1 = (i + 1) % n;
            let (a, b, c, d) = (r0[i], r1[i], r0[i1], r1[i1]);
            let p = |v: u32| mesh.vertices[v as usize];
            if vec3::dist(p(b), p(c)) <= vec3::dist(p(a), p(d)) {
                mesh.triangles.push([a, b, c]);
                mesh.triangles.push([c, b, d]);
            } else {
                mesh.triangles.push([a, d, c]);
                mesh.triangles.push([a, b, d]);
            }
        }
    }
}

/// Whether the contour runs counter-clockwise in the chord plane (against the convention), from
/// its signed area midway along the front line; a contour of no area is refused.
fn winds_counter_clockwise(
    surface: &dyn SpanSurface,
    grid: &Grid,
    tube: &TrimmedLines<'_>,
) -> Result<bool, MeshError> {
    let x = tube.x(0, 0.5);
    let area = polygon_area(&contour_polygon(surface, x, &grid.u));
    if area == 0.0 || !area.is_finite() {
        return Err(MeshError::Geometry(format!("the contour at x = {x:.6} m encloses no area")));
    }
    Ok(area > 0.0)
}
