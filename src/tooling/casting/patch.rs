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

/// The facets that may be holed, listed by the cells of a uniform grid in plan that their plan
/// boxes cover (each box widened by a millionth of its size and a nanometre, more than the
/// round-off that [`barycentric`] forgives): the facets under a plan point are among those of
/// its cell, in increasing order, so the search for the facet under a hole's axis reads a
/// handful of facets instead of the whole cavity.
pub(super) struct PlanIndex {
    origin: [f64; 2],
    inverse: [f64; 2],
    dims: [usize; 2],
    /// Start of each cell's facets in `entry`, and the end.
    first: Vec<u32>,
    entry: Vec<u32>,
}

impl PlanIndex {
    pub(super) fn new(mesh: &Mesh, eligible: &[bool], frame: &Plan) -> Self {
        let boxes: Vec<(usize, [[f64; 2]; 2])> = (0..mesh.len())
            .filter(|&t| eligible[t])
            .map(|t| {
                let p = tri2(mesh, frame, t);
                let lo = [0, 1].map(|k| p[0][k].min(p[1][k]).min(p[2][k]));
                let hi = [0, 1].map(|k| p[0][k].max(p[1][k]).max(p[2][k]));
                let pad = 1e-6 * ((hi[0] - lo[0]) + (hi[1] - lo[1])) + 1e-9;
                (t, [lo.map(|x| x - pad), hi.map(|x| x + pad)])
            })
            .collect();
        let mut lo = [f64::INFINITY; 2];
        let mut hi = [f64::NEG_INFINITY; 2];
        let mut mean = [0.0; 2];
        for (_, b) in &boxes {
            for k in 0..2 {
                lo[k] = lo[k].min(b[0][k]);
                hi[k] = hi[k].max(b[1][k]);
                mean[k] += (b[1][k] - b[0][k]) / boxes.len() as f64;
            }
        }
        // Cells of twice the mean box, at most 2048 along a side.
        let dims = [0, 1].map(|k| {
            if boxes.is_empty() {
                return 1;
            }
            (((hi[k] - lo[k]) / (2.0 * mean[k]).max(f64::MIN_POSITIVE)).ceil() as usize)
                .clamp(1, 2048)
        });
        let inverse = [0, 1].map(|k| dims[k] as f64 / (hi[k] - lo[k]).max(f64::MIN_POSITIVE));
        let mut index =
            PlanIndex { origin: lo, inverse, dims, first: Vec::new(), entry: Vec::new() };
        let ranges: Vec<[[usize; 2]; 2]> =
            boxes.iter().map(|(_, b)| [index.cell(b[0]), index.cell(b[1])]).collect();
        let mut first = vec![0u32; dims[0] * dims[1] + 1];
        for r in &ranges {
            for y in r[0][1]..=r[1][1] {
                for x in r[0][0]..=r[1][0] {
                    first[y * dims[0] + x + 1] += 1;
                }
            }
        }
        for i in 1..first.len() {
            first[i] += first[i - 1];
        }
        let mut fill = first.clone();
        let mut entry = vec![0u32; first[first.len() - 1] as usize];
        for ((t, _), r) in boxes.iter().zip(&ranges) {
            for y in r[0][1]..=r[1][1] {
                for x in r[0][0]..=r[1][0] {
                    let c = y * dims[0] + x;
                    entry[fill[c] as usize] = *t as u32;
                    fill[c] += 1;
                }
            }
        }
        index.first = first;
        index.entry = entry;
        index
    }

    /// The cell of a plan point, clamped to the grid.
    fn cell(&self, q: [f64; 2]) -> [usize; 2] {
        [0, 1].map(|k| {
            let i =
                ((q[k] - self.origin[k]) * self.inverse[k]).clamp(0.0, (self.dims[k] - 1) as f64);
            i as usize
        })
    }

    /// The facets whose widened plan boxes cover the cell of `q`, in increasing order (none
    /// when `q` lies off the grid).
    fn under(&self, q: [f64; 2]) -> &[u32] {
        let inside = (0..2).all(|k| {
            let i = (q[k] - self.origin[k]) * self.inverse[k];
            (0.0..=self.dims[k] as f64).contains(&i)
        });
        if !inside || self.entry.is_empty() {
            return &[];
        }
        let [x, y] = self.cell(q);
        let c = y * self.dims[0] + x;
        &self.entry[self.first[c] as usize..self.first[c + 1] as usize]
    }
}

/// The patch of cavity facets round a hole of radius `r` about the plan point `c`, or `None`
/// where it would reach a facet that may not be holed.
pub(super) fn patch(
    mesh: &Mesh,
    eligible: &[bool],
    index: &PlanIndex,
    adj: &[[(u32, bool); 3]],
    frame: &Plan,
    c: [f64; 2],
    r: f64,
) -> Option<Patch> {
    // The facet under the axis (the highest one there; of equals, the last in the mesh).
    let seed = index
        .under(c)
        .iter()
        .map(|&t| t as usize)
        .filter(|&t| barycentric(tri2(mesh, frame, t), c).is_some())
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
    let mut ids: WordMap<usize, u32> = WordMap::default();
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
    let mut edges: WordMap<(u32, u32), usize> = WordMap::default();
    for &t in &hole.facets {
        let tri = mesh.triangles[t];
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            *edges.entry((a.min(b), a.max(b))).or_insert(0) += 1;
        }
    }
    let outline: Vec<(u32, u32)> = edges.iter().filter(|e| *e.1 == 1).map(|e| *e.0).collect();
    let on_outline: WordSet<u32> = outline.iter().flat_map(|&(a, b)| [a, b]).collect();
    let mut handle = WordMap::default();
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_plan_index_finds_every_facet_a_pass_over_the_mesh_finds() {
        // Random facets of all sizes and slants (some steep, some needles) and random points,
        // some on the facets' corners and edges: the facets under each point by the index are
        // those of a pass over every eligible facet, in the same order.
        let mut rnd = crate::mesh::test_rng::uniform(0x2545_f491_4f6c_dd1d);
        let mut mesh = Mesh::new();
        let mut eligible = Vec::new();
        for t in 0..3000 {
            let c = [rnd() * 0.4 - 0.2, rnd() * 0.3 + 0.5, rnd() * 0.1];
            let size = 10f64.powf(-4.0 + 3.0 * rnd());
            let needle = if t % 7 == 0 { 1e-6 } else { 1.0 };
            let p = [
                c,
                [c[0] + size, c[1] + size * rnd(), c[2] + size * rnd()],
                [c[0] + size * needle * rnd(), c[1] + size * needle, c[2] - size * rnd()],
            ];
            let v = p.map(|q| mesh.push_vertex(q));
            mesh.triangles.push(v);
            eligible.push(t % 5 != 0);
        }
        let up = [0.3f64, -0.2, 0.9];
        let up = vec3::scale(up, 1.0 / vec3::norm(up));
        let e1 = vec3::sub([1.0, 0.0, 0.0], vec3::scale(up, up[0]));
        let e1 = vec3::scale(e1, 1.0 / vec3::norm(e1));
        let frame = Plan { e1, e2: vec3::cross(up, e1), up };
        let index = PlanIndex::new(&mesh, &eligible, &frame);
        let mut found = 0;
        for k in 0..4000 {
            let q = match k % 3 {
                0 => frame.plan(mesh.vertices[(k * 7) % mesh.vertices.len()]),
                1 => {
                    let t = mesh.triangles[k % mesh.len()];
                    let (a, b) = (mesh.vertices[t[0] as usize], mesh.vertices[t[1] as usize]);
                    frame.plan(vec3::lerp(a, b, rnd()))
                }
                _ => {
                    let lo = frame.plan([-0.25, 0.45, 0.0]);
                    [lo[0] + 0.5 * rnd(), lo[1] + 0.5 * rnd()]
                }
            };
            let brute: Vec<usize> = (0..mesh.len())
                .filter(|&t| eligible[t] && barycentric(tri2(&mesh, &frame, t), q).is_some())
                .collect();
            let fast: Vec<usize> = index
                .under(q)
                .iter()
                .map(|&t| t as usize)
                .filter(|&t| barycentric(tri2(&mesh, &frame, t), q).is_some())
                .collect();
            assert_eq!(fast, brute, "point {k}: {q:?}");
            found += brute.len();
        }
        // Most points lie on some facet, or the comparison proves little.
        assert!(found > 3000, "{found} facets found under the points");
    }
}
