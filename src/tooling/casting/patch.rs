//! A hole in a mould face for a channel: the plan normal to the pull, the patch of cavity facets
//! round the hole, and the facets that fill the patch outside the channel's circle.

use super::*;

/// The plane normal to the pull: `(a, b)` along `e1`, `e2`, height `h` along `up`.
pub(super) struct Plan {
    pub(super) e1: P3,
    pub(super) e2: P3,
    pub(super) up: P3,
}

impl Plan {
    pub(super) fn plan(&self, p: P3) -> [f64; 2] {
        [vec3::dot(p, self.e1), vec3::dot(p, self.e2)]
    }
    pub(super) fn height(&self, p: P3) -> f64 {
        vec3::dot(p, self.up)
    }
    pub(super) fn lift(&self, q: [f64; 2], h: f64) -> P3 {
        vec3::add(
            vec3::add(vec3::scale(self.e1, q[0]), vec3::scale(self.e2, q[1])),
            vec3::scale(self.up, h),
        )
    }
}

/// A hole's place: its axis, radius, the cavity facets it replaces and the circle's corners
/// lifted onto them.
pub(super) struct Patch {
    pub(super) centre: [f64; 2],
    pub(super) radius: f64,
    pub(super) facets: Vec<usize>,
    pub(super) circle: Vec<P3>,
    pub(super) entry_height: f64,
    pub(super) entry: P3,
    /// Radius at the top face (set once the circle is known).
    pub(super) top_radius: f64,
}

pub(super) fn circle(c: [f64; 2], r: f64) -> Vec<[f64; 2]> {
    (0..CIRCLE_SIDES)
        .map(|i| {
            let a = std::f64::consts::TAU * i as f64 / CIRCLE_SIDES as f64;
            [c[0] + r * a.cos(), c[1] + r * a.sin()]
        })
        .collect()
}

pub(super) fn tri2(mesh: &Mesh, frame: &Plan, t: usize) -> [[f64; 2]; 3] {
    mesh.triangles[t].map(|v| frame.plan(mesh.vertices[v as usize]))
}

pub(super) fn cross2(o: [f64; 2], a: [f64; 2], b: [f64; 2]) -> f64 {
    (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
}

/// Barycentric coordinates of `p` in the plan triangle `t`, when inside (to round-off).
pub(super) fn barycentric(t: [[f64; 2]; 3], p: [f64; 2]) -> Option<[f64; 3]> {
    let area = cross2(t[0], t[1], t[2]);
    if area.abs() < f64::MIN_POSITIVE {
        return None;
    }
    let w =
        [cross2(p, t[1], t[2]) / area, cross2(t[0], p, t[2]) / area, cross2(t[0], t[1], p) / area];
    w.iter().all(|&x| x >= -1e-12).then_some(w)
}

/// Whether the facet of a triangulation with corners `pts` and middle `mid` lies in the region
/// covered by the plan triangles `polys`: its middle strictly inside one, or, unless it is a
/// sliver (which round-off may put outside an outline by a hair), on one's edge.
pub(super) fn taken(polys: &[[[f64; 2]; 3]], pts: [[f64; 2]; 3], mid: [f64; 2]) -> bool {
    let longest = (0..3).map(|k| vec3::dist_2d(pts[k], pts[(k + 1) % 3])).fold(0.0, f64::max);
    let sliver = cross2(pts[0], pts[1], pts[2]).abs() <= 1e-9 * longest * longest;
    polys.iter().any(|t| strictly_inside(*t, mid))
        || (!sliver && polys.iter().any(|t| barycentric(*t, mid).is_some()))
}

/// Whether `p` lies strictly inside the plan triangle `t` (a sliver's middle outside an outline
/// by round-off is not taken in).
pub(super) fn strictly_inside(t: [[f64; 2]; 3], p: [f64; 2]) -> bool {
    let s = cross2(t[0], t[1], t[2]).signum();
    s != 0.0 && (0..3).all(|k| s * cross2(t[k], t[(k + 1) % 3], p) > 0.0)
}

/// Distance in plan from `p` to the triangle `t`.
pub(super) fn dist_to_triangle(t: [[f64; 2]; 3], p: [f64; 2]) -> f64 {
    if barycentric(t, p).is_some() {
        return 0.0;
    }
    (0..3).map(|k| vec3::dist_to_segment_2d(p, t[k], t[(k + 1) % 3])).fold(f64::INFINITY, f64::min)
}

/// The patch of cavity facets round a hole of radius `r` about the plan point `c`, or `None`
/// where it would reach a facet that may not be holed.
pub(super) fn patch(
    mesh: &Mesh,
    eligible: &[bool],
    adj: &[[(u32, bool); 3]],
    frame: &Plan,
    c: [f64; 2],
    r: f64,
) -> Option<Patch> {
    // The facet under the axis (the highest one there).
    let seed = (0..mesh.len())
        .filter(|&t| eligible[t] && barycentric(tri2(mesh, frame, t), c).is_some())
        .max_by(|&a, &b| {
            frame
                .height(mesh.triangle_centroid(a))
                .total_cmp(&frame.height(mesh.triangle_centroid(b)))
        })?;
    let mut inside = vec![false; mesh.len()];
    inside[seed] = true;
    let mut stack = vec![seed];
    let mut facets = vec![seed];
    while let Some(t) = stack.pop() {
        for &(nb, _) in &adj[t] {
            if nb == u32::MAX {
                return None;
            }
            let nb = nb as usize;
            if inside[nb] || dist_to_triangle(tri2(mesh, frame, nb), c) >= PATCH_REACH * r {
                continue;
            }
            if !eligible[nb] {
                return None;
            }
            inside[nb] = true;
            facets.push(nb);
            stack.push(nb);
        }
    }
    let height_at = |q: [f64; 2]| -> Option<f64> {
        facets.iter().find_map(|&t| {
            let w = barycentric(tri2(mesh, frame, t), q)?;
            let h = mesh.triangles[t].map(|v| frame.height(mesh.vertices[v as usize]));
            Some(w[0] * h[0] + w[1] * h[1] + w[2] * h[2])
        })
    };
    let mut ring = Vec::with_capacity(CIRCLE_SIDES);
    for q in circle(c, r) {
        ring.push(frame.lift(q, height_at(q)?));
    }
    let entry_height = height_at(c)?;
    Some(Patch {
        centre: c,
        radius: r,
        facets,
        circle: ring,
        entry_height,
        entry: frame.lift(c, entry_height),
        top_radius: r,
    })
}

/// Adds to `mesh` the circle's vertices and returns them with the facets (facing up) that
/// fill the hole's patch outside the circle.
pub(super) fn fill_patch(
    mesh: &mut Mesh,
    hole: &Patch,
    frame: &Plan,
) -> Result<(Vec<u32>, Vec<[u32; 3]>), MeshError> {
    let fail = |what: &str| MeshError::Geometry(format!("a sprue or vent hole: {what}"));
    let mut cdt = ConstrainedDelaunayTriangulation::<Point2<f64>>::new();
    let mut ids: HashMap<usize, u32> = HashMap::new();
    let mut add = |cdt: &mut ConstrainedDelaunayTriangulation<Point2<f64>>, q: [f64; 2], v: u32| {
        let h = cdt.insert(Point2::new(q[0], q[1])).map_err(|e| fail(&format!("{e:?}")))?;
        if ids.insert(h.index(), v).is_some_and(|old| old != v) {
            return Err(fail("two points coincide in plan"));
        }
        Ok(h)
    };
    let mut corners: Vec<u32> = hole.facets.iter().flat_map(|&t| mesh.triangles[t]).collect();
    corners.sort_unstable();
    corners.dedup();
    // The outline: edges of the patch whose other facet is not in it.
    let mut edges: HashMap<(u32, u32), usize> = HashMap::new();
    for &t in &hole.facets {
        let tri = mesh.triangles[t];
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            *edges.entry((a.min(b), a.max(b))).or_insert(0) += 1;
        }
    }
    let outline: Vec<(u32, u32)> = edges.iter().filter(|e| *e.1 == 1).map(|e| *e.0).collect();
    let on_outline: std::collections::HashSet<u32> =
        outline.iter().flat_map(|&(a, b)| [a, b]).collect();
    let mut handle = HashMap::new();
    for &v in &corners {
        let q = frame.plan(mesh.vertices[v as usize]);
        let d = vec3::dist_2d(q, hole.centre);
        if on_outline.contains(&v) || d > 1.08 * hole.radius {
            handle.insert(v, add(&mut cdt, q, v)?);
        }
    }
    let ring: Vec<u32> = hole.circle.iter().map(|&p| mesh.push_vertex(p)).collect();
    let mut ring_h = Vec::with_capacity(ring.len());
    for &v in &ring {
        ring_h.push(add(&mut cdt, frame.plan(mesh.vertices[v as usize]), v)?);
    }
    let mut constrain = |a, b| {
        if a == b || !cdt.can_add_constraint(a, b) {
            return Err(fail("its outline crosses itself in plan"));
        }
        cdt.add_constraint(a, b);
        Ok(())
    };
    for &(a, b) in &outline {
        constrain(handle[&a], handle[&b])?;
    }
    for i in 0..ring_h.len() {
        constrain(ring_h[i], ring_h[(i + 1) % ring_h.len()])?;
    }
    let polys: Vec<[[f64; 2]; 3]> = hole.facets.iter().map(|&t| tri2(mesh, frame, t)).collect();
    let circle2: Vec<[f64; 2]> = hole.circle.iter().map(|&p| frame.plan(p)).collect();
    let mut tris = kept_faces(&cdt, &ids, &polys, std::slice::from_ref(&circle2))
        .ok_or_else(|| fail("a point was added"))?;
    settle(mesh, &mut tris, frame);
    Ok((ring, tris))
}
