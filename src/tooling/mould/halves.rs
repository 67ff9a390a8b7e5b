//! The mould set round one part: the block, the two halves cut by the parting surface, and the
//! end pieces where a spherical end undercuts the halves.

use super::*;

/// What the span-wise modules of one mould share: the block's frame, its extent across the
/// span (`[Y_a, Y_b, Z_bottom, Z_top]`, mould frame) and, per end (root, tip), the radius where
/// the module meets its neighbour (its block ends there, flush, and the part runs on through).
#[derive(Debug, Clone, Copy)]
pub(super) struct Block {
    pub(super) frame: Frame,
    pub(super) yz: Option<[f64; 4]>,
    pub(super) flush: [Option<f64>; 2],
}

pub(super) fn build_mould_set(
    part: &LoftedSolid,
    chord_angle: &dyn Fn(f64) -> Angle,
    params: &MouldParams,
    force: Option<[bool; 2]>,
    block: Option<&Block>,
) -> Result<MouldParts, MeshError> {
    let ez = unit_pull(params)?;
    let frame = block.map_or_else(|| frame_of(ez), |b| b.frame);
    let flush = block.map_or([None; 2], |b| b.flush);
    let (sides, loop0) = parting_loop(part)?;
    let seed = part.parting.upper[part.parting.upper.len() / 2];
    let faces = split_faces(&part.mesh, &loop0, seed)?;
    let pulls = [ez, vec3::scale(ez, -1.0)];
    // An end piece where a cap undercuts either half's pull (a facet turned away from it); a
    // flush end is open to the next module.
    let caps = [part.facets.root_cap.clone(), part.facets.tip_cap.clone()];
    let bored = force.unwrap_or_else(|| {
        [0, 1].map(|e| {
            (0..2).any(|k| {
                faces[k]
                    .iter()
                    .filter(|t| caps[e].contains(t))
                    .any(|&t| vec3::dot(part.mesh.triangle_normal(t), pulls[k]) < -DRAFT_ROUND_OFF)
            })
        })
    });
    let bored = [0, 1].map(|e| bored[e] || flush[e].is_some());
    let layout = layout(part, sides, &frame, chord_angle, params, block, bored, ez)?;
    let mut meshes = [Mesh::new(), Mesh::new()];
    let mut halves = Vec::with_capacity(2);
    // The keys of each end piece (root, tip), one on each half's share of its ring.
    let mut end_keys: [Vec<WallKey>; 2] = [Vec::new(), Vec::new()];
    let mut module_keys = Vec::new();
    for (k, upper) in [true, false].into_iter().enumerate() {
        let cavity: Vec<usize> = faces[k]
            .iter()
            .copied()
            .filter(|t| !(0..2).any(|e| bored[e] && caps[e].contains(t)))
            .collect();
        let mut lay = layout.clone();
        lay.bored = bored;
        for e in (0..2).filter(|&e| bored[e]) {
            // The half's share of the end ring replaces the cap's middle line: side 3 runs
            // back → front at the root, side 1 front → back at the tip.
            let s = if e == 0 { 3 } else { 1 };
            let ring = if e == 0 { &part.root_ring } else { &part.tip_ring };
            let (from, to) = (lay.sides[s][0], lay.sides[s][lay.sides[s].len() - 1]);
            let arc = ring_arc(&part.mesh, ring, from, to, &faces[k])?;
            let x_end = lay.ends[s][0][0];
            lay.ends[s] = arc
                .iter()
                .map(|&v| {
                    let q = frame.to_mould(part.mesh.vertices[v as usize]);
                    [x_end, q[1], q[2]]
                })
                .collect();
            if flush[e].is_none() {
                let key = wall_key(
                    &part.mesh,
                    ring,
                    &arc,
                    KEY_WINDOWS[k],
                    x_end,
                    &frame,
                    params.margin,
                    LOCATOR_CLEARANCE,
                )?;
                lay.keys.push((s, key.clone()));
                end_keys[e].push(key);
            }
            lay.sides[s] = arc;
            if flush[e].is_some() {
                // A key across the face to the next module (tip end) or its socket (root end).
                let (k0, k1) = ((s + 3) % 4, s);
                let (c0, c1) = (lay.corners[k0], lay.corners[k1]);
                let zf = if upper { lay.z_top } else { lay.z_bottom };
                let y = [c0[1].min(c1[1]), c0[1].max(c1[1])];
                let fk = flush_key(c0[0], y, zf, upper, params.margin, LOCATOR_CLEARANCE, e == 0)
                    .ok_or_else(|| {
                    MeshError::Geometry(
                        "no room for a locating key across a module's flush face".into(),
                    )
                })?;
                module_keys.push(ModuleKey {
                    upper,
                    socket: fk.socket,
                    corners: fk.shape.map(|q| frame.to_rotor(q)),
                });
                lay.flush_keys.push((s, fk));
            }
        }
        let mut mesh = build_half(&part.mesh, &cavity, &lay, &frame, upper)?;
        if flush.iter().any(Option::is_some) {
            // A flush end's rulings have no length and its corner patches no area: their
            // vertices are merged into the ring's and the collapsed facets dropped.
            mesh.weld(WELD)?;
        }
        orient_outward(&mut mesh);
        compact(&mut mesh);
        meshes[k] = mesh;
        let pull = pulls[k];
        let draft = evaluate_draft(&part.mesh, Some(&cavity), pull, params.min_draft, params.unit)?;
        let undercuts = undercut_regions(part, &draft, pull, params.unit);
        let cavity_area = cavity.iter().map(|&t| part.mesh.triangle_area(t)).sum();
        let c = &layout.corners;
        halves.push(MouldHalf {
            side: if upper { "upper" } else { "lower" },
            pull,
            draft,
            cavity_area,
            undercuts,
            block_size: [c[0][0] - c[3][0], c[1][1] - c[0][1], layout.z_top - layout.z_bottom],
            locators: layout.locators.iter().map(|l| frame.to_rotor(l.centre)).collect(),
        });
    }
    let [upper, lower]: [MouldHalf; 2] =
        halves.try_into().map_err(|_| MeshError::Geometry("two mould halves expected".into()))?;
    let mut end_pieces = Vec::new();
    let mut piece_keys = Vec::new();
    for e in (0..2).filter(|&e| bored[e] && flush[e].is_none()) {
        let s = if e == 0 { 3 } else { 1 };
        let x_end = layout.ends[s][0][0];
        end_pieces.push(end_piece_part(part, e == 0, x_end, &frame, &end_keys[e], params)?);
        piece_keys.push(end_keys[e].clone());
    }
    Ok(MouldParts {
        half_meshes: meshes,
        halves: [upper, lower],
        end_pieces,
        end_keys: piece_keys,
        frame,
        module_keys,
    })
}

/// The end piece round the root cap of `part` (`root`) or its tip cap, pulled along the span
/// away from the blade, its block face at `x_end` (mould frame), with `keys` into the halves;
/// and what it is (draft and undercuts of its cavity, the cap).
pub(super) fn end_piece_part(
    part: &LoftedSolid,
    root: bool,
    x_end: f64,
    frame: &Frame,
    keys: &[WallKey],
    params: &MouldParams,
) -> Result<(Mesh, MouldHalf), MeshError> {
    let (cap, ring) = if root {
        (part.facets.root_cap.clone(), &part.root_ring)
    } else {
        (part.facets.tip_cap.clone(), &part.tip_ring)
    };
    let cap: Vec<usize> = cap.collect();
    let mesh = end_piece(&part.mesh, &cap, ring, x_end, frame, keys)?;
    let pull = if root { vec3::scale(frame.ex, -1.0) } else { frame.ex };
    let draft = evaluate_draft(&part.mesh, Some(&cap), pull, params.min_draft, params.unit)?;
    let undercuts = undercut_regions(part, &draft, pull, params.unit);
    let cavity_area = cap.iter().map(|&t| part.mesh.triangle_area(t)).sum();
    let b = mesh.bounding_box().map(|b| b.extent()).unwrap_or_default();
    let half = MouldHalf {
        side: if root { "root end" } else { "tip end" },
        pull,
        draft,
        cavity_area,
        undercuts,
        block_size: [b[0], b[1], b[2]],
        locators: keys.iter().map(|k| k.place(frame)).collect(),
    };
    Ok((mesh, half))
}

/// The vertices of the closed `ring` from `from` to `to` along the arc whose first edge borders
/// one of `faces` (the half's side facets).
pub(super) fn ring_arc(
    mesh: &Mesh,
    ring: &[u32],
    from: u32,
    to: u32,
    faces: &[usize],
) -> Result<Vec<u32>, MeshError> {
    let n = ring.len();
    let missing = || MeshError::Geometry("the parting line does not meet the end ring".into());
    let i0 = ring.iter().position(|&v| v == from).ok_or_else(missing)?;
    ring.iter().position(|&v| v == to).ok_or_else(missing)?;
    let walk = |step: usize| -> Vec<u32> {
        let mut out = vec![from];
        let mut i = i0;
        loop {
            i = (i + step) % n;
            out.push(ring[i]);
            if ring[i] == to || out.len() > n {
                break;
            }
        }
        out
    };
    let borders = |a: u32, b: u32| {
        faces.iter().any(|&t| {
            let tri = mesh.triangles[t];
            (0..3).any(|k| {
                let (p, q) = (tri[k], tri[(k + 1) % 3]);
                (p == a && q == b) || (p == b && q == a)
            })
        })
    };
    let forward = walk(1);
    if borders(forward[0], forward[1]) {
        return Ok(forward);
    }
    let backward = walk(n - 1);
    if borders(backward[0], backward[1]) {
        return Ok(backward);
    }
    Err(MeshError::Geometry("no side of the end ring borders the mould half".into()))
}

/// An end piece: the cap's facets, the end ring carried along X to the block's end face `x_end`
/// (mould frame) with the `keys` on its wall, and that face, closed and outward.
pub(super) fn end_piece(
    part: &Mesh,
    cap: &[usize],
    ring: &[u32],
    x_end: f64,
    frame: &Frame,
    keys: &[WallKey],
) -> Result<Mesh, MeshError> {
    let mut mesh = Mesh { vertices: part.vertices.clone(), triangles: Vec::new() };
    mesh.triangles.extend(cap.iter().map(|&t| part.triangles[t]));
    let far: Vec<u32> = ring
        .iter()
        .map(|&v| {
            let q = frame.to_mould(part.vertices[v as usize]);
            mesh.push_vertex(frame.to_rotor([x_end, q[1], q[2]]))
        })
        .collect();
    let n = ring.len();
    let p = |m: &Mesh, v: u32| m.vertices[v as usize];
    // The end face's outline: the far ring with each key's base spliced in after its edge.
    let mut outline: Vec<u32> = Vec::with_capacity(n + 4 * keys.len());
    for i in 0..n {
        let j = (i + 1) % n;
        let [a, b, c, d] = [ring[i], ring[j], far[j], far[i]];
        outline.push(d);
        if let Some(k) = keys.iter().find(|k| k.edge == [a, b]) {
            outline.extend(k.add(&mut mesh, frame, [a, b, c, d], false)?);
            continue;
        }
        if let Some(k) = keys.iter().find(|k| k.edge == [b, a]) {
            let mut ids = k.add(&mut mesh, frame, [b, a, d, c], false)?;
            ids.reverse();
            outline.extend(ids);
            continue;
        }
        if vec3::dist(p(&mesh, a), p(&mesh, c)) <= vec3::dist(p(&mesh, b), p(&mesh, d)) {
            mesh.triangles.extend([[a, b, c], [a, c, d]]);
        } else {
            mesh.triangles.extend([[a, b, d], [b, c, d]]);
        }
    }
    // The end face: a constrained Delaunay triangulation of the outline with the keys' bases
    // (straight runs of the ring, a web's face, give no sliver as ear clipping can).
    let face = EndTrim::Plane { x: frame.to_rotor([x_end, 0.0, 0.0])[0] };
    crate::tooling::prints::cap_with_holes(&mut mesh, &outline, &[], face, f64::INFINITY)?;
    orient_outward(&mut mesh);
    compact(&mut mesh);
    Ok(mesh)
}
