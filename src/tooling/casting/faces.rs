//! Faces with holes: a plane face re-triangulated round its holes (constrained Delaunay), the
//! slivers of the triangulation turned, a half's facets matched to the cavity's, and the volume
//! of a channel.

use super::*;

/// The facets of a constrained triangulation of a face (in plan) that lie on the face's own
/// facets `polys` and outside every hole, as mesh vertex triples through `ids`; `None` when the
/// triangulation added a point of its own.
pub(super) fn kept_faces(
    cdt: &ConstrainedDelaunayTriangulation<Point2<f64>>,
    ids: &WordMap<usize, u32>,
    polys: &[[[f64; 2]; 3]],
    holes: &[Vec<[f64; 2]>],
) -> Option<Vec<[u32; 3]>> {
    let mut tris = Vec::new();
    for face in cdt.inner_faces() {
        let vs = face.vertices();
        let pts = vs.map(|v| [v.position().x, v.position().y]);
        let mid =
            [(pts[0][0] + pts[1][0] + pts[2][0]) / 3.0, (pts[0][1] + pts[1][1] + pts[2][1]) / 3.0];
        if !taken(polys, pts, mid) || holes.iter().any(|h| crate::tooling::prints::inside(h, mid)) {
            continue;
        }
        let mut tri = [0u32; 3];
        for (k, v) in vs.iter().enumerate() {
            tri[k] = *ids.get(&v.fix().index())?;
        }
        tris.push(tri);
    }
    Some(tris)
}

/// Turns the slivers of a triangulation (a corner on the line of the other two, as round-off
/// leaves the collinear corners of a block face) over with their neighbour across the long
/// edge, or drops one with no neighbour there (it lies outside the outline by a hair); then
/// turns every facet to face up (counter-clockwise in plan). As the ports' caps do.
pub(super) fn settle(mesh: &Mesh, tris: &mut Vec<[u32; 3]>, frame: &Plan) {
    let p = |v: u32| mesh.vertices[v as usize];
    // A turn may leave a sliver where more corners lie on one line: again, a few times.
    for _ in 0..16 {
        if !crate::tooling::prints::unslither(mesh, tris) {
            break;
        }
    }
    for tri in tris.iter_mut() {
        let q = tri.map(|v| frame.plan(p(v)));
        if cross2(q[0], q[1], q[2]) < 0.0 {
            tri.swap(1, 2);
        }
    }
}

/// The facets of `face` (a plane face normal to the pull, facing up) retriangulated round the
/// `holes` (loops of points on it); new vertices are added to `mesh` and `ids`.
pub(super) fn holed_face(
    mesh: &mut Mesh,
    face: &[usize],
    holes: &[Vec<P3>],
    frame: &Plan,
    ids_by_pos: &mut WordMap<[u64; 3], u32>,
) -> Result<Vec<[u32; 3]>, MeshError> {
    let fail =
        |what: &str| MeshError::Geometry(format!("the top face round a sprue or vent: {what}"));
    if face.is_empty() {
        return Err(fail("the upper half has no top face"));
    }
    let mut cdt = ConstrainedDelaunayTriangulation::<Point2<f64>>::new();
    let mut ids: WordMap<usize, u32> = WordMap::default();
    let mut edges: WordMap<(u32, u32), usize> = WordMap::default();
    for &t in face {
        let tri = mesh.triangles[t];
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            *edges.entry((a.min(b), a.max(b))).or_insert(0) += 1;
        }
    }
    let mut corners: Vec<u32> = face.iter().flat_map(|&t| mesh.triangles[t]).collect();
    corners.sort_unstable();
    corners.dedup();
    let mut handle = WordMap::default();
    for &v in &corners {
        let q = frame.plan(mesh.vertices[v as usize]);
        let h = cdt.insert(Point2::new(q[0], q[1])).map_err(|e| fail(&format!("{e:?}")))?;
        if ids.insert(h.index(), v).is_some_and(|o| o != v) {
            return Err(fail("two corners coincide"));
        }
        handle.insert(v, h);
    }
    for (&(a, b), &n) in &edges {
        if n == 1 {
            if !cdt.can_add_constraint(handle[&a], handle[&b]) {
                return Err(fail("its outline crosses itself"));
            }
            cdt.add_constraint(handle[&a], handle[&b]);
        }
    }
    let mut loops2 = Vec::with_capacity(holes.len());
    for hole in holes {
        let mut hs = Vec::with_capacity(hole.len());
        for &p in hole {
            let v = *ids_by_pos.entry(key(p)).or_insert_with(|| mesh.push_vertex(p));
            let q = frame.plan(p);
            let h = cdt.insert(Point2::new(q[0], q[1])).map_err(|e| fail(&format!("{e:?}")))?;
            if ids.insert(h.index(), v).is_some_and(|o| o != v) {
                return Err(fail("a hole meets a corner of the face"));
            }
            hs.push(h);
        }
        for i in 0..hs.len() {
            let (a, b) = (hs[i], hs[(i + 1) % hs.len()]);
            if !cdt.can_add_constraint(a, b) {
                return Err(fail("a hole crosses the face's outline or another hole"));
            }
            cdt.add_constraint(a, b);
        }
        loops2.push(hole.iter().map(|&p| frame.plan(p)).collect::<Vec<_>>());
    }
    let polys: Vec<[[f64; 2]; 3]> = face.iter().map(|&t| tri2(mesh, frame, t)).collect();
    let mut tris =
        kept_faces(&cdt, &ids, &polys, &loops2).ok_or_else(|| fail("a point was added"))?;
    settle(mesh, &mut tris, frame);
    Ok(tris)
}

/// Exact key of a point (the half keeps the cavity's coordinates bit for bit).
pub(super) fn key(p: P3) -> [u64; 3] {
    p.map(f64::to_bits)
}

pub(super) fn position_ids(mesh: &Mesh) -> WordMap<[u64; 3], u32> {
    let mut m = WordMap::with_capacity_and_hasher(mesh.vertices.len(), Default::default());
    for (i, &p) in mesh.vertices.iter().enumerate() {
        m.entry(key(p)).or_insert(i as u32);
    }
    m
}

/// The facets of `half` that are the facets `of` of `cavity` (same corners by position).
pub(super) fn matching_facets(
    half: &Mesh,
    cavity: &Mesh,
    of: &[usize],
) -> Result<Vec<usize>, MeshError> {
    let ids = position_ids(half);
    let mut by_corners: WordMap<[u32; 3], usize> =
        WordMap::with_capacity_and_hasher(half.len(), Default::default());
    for (t, tri) in half.triangles.iter().enumerate() {
        let mut s = *tri;
        s.sort_unstable();
        by_corners.insert(s, t);
    }
    of.iter()
        .map(|&t| {
            let mut s = [0u32; 3];
            for (k, &v) in cavity.triangles[t].iter().enumerate() {
                s[k] = *ids.get(&key(cavity.vertices[v as usize])).ok_or_else(|| {
                    MeshError::Geometry(
                        "a cavity facet under a hole is not in the upper half".into(),
                    )
                })?;
            }
            s.sort_unstable();
            by_corners.get(&s).copied().ok_or_else(|| {
                MeshError::Geometry("a cavity facet under a hole is not in the upper half".into())
            })
        })
        .collect()
}

/// Volume of a channel above the cavity surface: the closed solid of its wall, its top and the
/// circle's corners on the cavity fanned from the first (the cavity surface under the circle is
/// flat to within the tolerance's order).
pub(super) fn channel_volume(ring: &[P3], top: &[P3]) -> f64 {
    let n = ring.len();
    let mut tris: Vec<[P3; 3]> = Vec::with_capacity(4 * n);
    for i in 0..n {
        let j = (i + 1) % n;
        tris.push([ring[i], ring[j], top[j]]);
        tris.push([ring[i], top[j], top[i]]);
    }
    for i in 1..n - 1 {
        tris.push([top[0], top[i], top[i + 1]]);
        tris.push([ring[0], ring[i + 1], ring[i]]);
    }
    tris.iter().map(|[a, b, c]| vec3::dot(*a, vec3::cross(*b, *c)) / 6.0).sum()
}
