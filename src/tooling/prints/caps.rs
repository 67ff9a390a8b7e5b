//! Caps and bands: an end contour capped with the prints' holes left open, the slivers of a
//! straight closure removed, two loops joined by a band of facets, a lofted solid opened at one
//! end.

use super::*;

/// Caps the end contour `ring` (vertices of `mesh` on `trim`) with `holes` (loops of vertices
/// on `trim`) left open (see the module docs); facets no larger than an equilateral triangle of
/// side `h`. Returns the vertices of the cap.
pub(crate) fn cap_with_holes(
    mesh: &mut Mesh,
    ring: &[u32],
    holes: &[Vec<u32>],
    trim: EndTrim,
    h: f64,
) -> Result<Vec<u32>, MeshError> {
    let fail = |what: &str| MeshError::Geometry(format!("an end cap round a print: {what}"));
    let mut cdt = ConstrainedDelaunayTriangulation::<Point2<f64>>::new();
    let mut ids: HashMap<usize, u32> = HashMap::new();
    let loops: Vec<&[u32]> =
        std::iter::once(ring).chain(holes.iter().map(|l| l.as_slice())).collect();
    let mut handles = Vec::with_capacity(loops.len());
    for lp in &loops {
        let mut hs = Vec::with_capacity(lp.len());
        for &v in lp.iter() {
            let p = mesh.vertices[v as usize];
            let hnd = cdt
                .insert(Point2::new(p[1], p[2]))
                .map_err(|e| fail(&format!("a point cannot be placed ({e:?})")))?;
            if ids.insert(hnd.index(), v).is_some_and(|old| old != v) {
                return Err(fail("two points of its outlines coincide in the section plane"));
            }
            hs.push(hnd);
        }
        handles.push(hs);
    }
    for hs in &handles {
        for i in 0..hs.len() {
            let (a, b) = (hs[i], hs[(i + 1) % hs.len()]);
            if a == b || !cdt.can_add_constraint(a, b) {
                return Err(fail("its outlines cross in the section plane"));
            }
            cdt.add_constraint(a, b);
        }
    }
    let mut params = RefinementParameters::<f64>::new()
        .exclude_outer_faces(true)
        .keep_constraint_edges()
        .with_angle_limit(AngleLimit::from_deg(20.0))
        .with_max_additional_vertices(40 * cdt.num_vertices() + 1000);
    if h.is_finite() {
        params = params.with_max_allowed_area(0.433 * h * h);
    }
    // The faces outside the ring and inside the holes are told by the constraint edges (an
    // even number of them crossed from the outside), not by a test of a face's centroid, which
    // a sliver along a nearly straight stretch of the ring can fail either way.
    let outside: std::collections::HashSet<_> =
        cdt.refine(params).excluded_faces.into_iter().collect();
    let mut tris: Vec<[u32; 3]> = Vec::new();
    for face in cdt.inner_faces() {
        if outside.contains(&face.fix()) {
            continue;
        }
        let vs = face.vertices();
        let pts = vs.map(|v| {
            let p = v.position();
            [p.x, p.y]
        });
        let mut tri = [0u32; 3];
        for (k, v) in vs.iter().enumerate() {
            let key = v.fix().index();
            tri[k] = match ids.get(&key) {
                Some(&id) => id,
                None => {
                    let id = mesh.push_vertex(lift_x(trim, pts[k])?);
                    ids.insert(key, id);
                    id
                }
            };
        }
        tris.push(tri);
    }
    unslither(mesh, &mut tris);
    let mut used: Vec<u32> = tris.iter().flatten().copied().collect();
    used.sort_unstable();
    used.dedup();
    mesh.triangles.extend(tris);
    Ok(used)
}

/// Removes the facets whose middle corner lies on the line of the other two (three points of a
/// straight closure that round-off leaves a hair apart): with a neighbour across the long edge,
/// the two become two facets across the other diagonal; without one (the sliver lies outside
/// the outline, which its middle dents by a hair) it is dropped. Whether it found one.
pub(crate) fn unslither(mesh: &Mesh, tris: &mut Vec<[u32; 3]>) -> bool {
    let mut drop = Vec::new();
    let mut found = false;
    let p = |v: u32| mesh.vertices[v as usize];
    for i in 0..tris.len() {
        let t = tris[i];
        let [a, b, c] = t.map(p);
        let longest = vec3::dist(a, b).max(vec3::dist(b, c)).max(vec3::dist(c, a));
        if vec3::norm(vec3::area_vector(a, b, c)) > 1e-9 * longest * longest {
            continue;
        }
        found = true;
        // The long edge (u, w) and the corner on it (m).
        let k = (0..3)
            .max_by(|&i, &j| {
                let len = |k: usize| vec3::dist(p(t[k]), p(t[(k + 1) % 3]));
                len(i).total_cmp(&len(j))
            })
            .unwrap_or(0);
        let (u, w, m) = (t[k], t[(k + 1) % 3], t[(k + 2) % 3]);
        let other =
            (0..tris.len()).find(|&j| j != i && tris[j].contains(&u) && tris[j].contains(&w));
        match other {
            Some(j) => {
                let d = tris[j].iter().copied().find(|&v| v != u && v != w).unwrap_or(m);
                tris[i] = [u, m, d];
                tris[j] = [m, w, d];
            }
            None => drop.push(i),
        }
    }
    for i in drop.into_iter().rev() {
        tris.swap_remove(i);
    }
    found
}

/// Joins the loops `a` and `b` (same length, corresponding points) by a band of facets.
pub(crate) fn band(mesh: &mut Mesh, a: &[u32], b: &[u32]) {
    let n = a.len();
    for i in 0..n {
        let j = (i + 1) % n;
        mesh.triangles.push([a[i], a[j], b[j]]);
        mesh.triangles.push([a[i], b[j], b[i]]);
    }
}

/// `solid`'s mesh without the cap at `end` (its vertices kept, so the rings stay valid).
pub(crate) fn open_end(solid: &LoftedSolid, end: End) -> Mesh {
    let cap = match end {
        End::Root => solid.facets.root_cap.clone(),
        End::Tip => solid.facets.tip_cap.clone(),
    };
    let mut mesh = solid.mesh.clone();
    mesh.triangles = solid
        .mesh
        .triangles
        .iter()
        .enumerate()
        .filter(|(i, _)| !cap.contains(i))
        .map(|(_, t)| *t)
        .collect();
    mesh
}
